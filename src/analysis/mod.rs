//! Summaries of priors, posteriors and predictive distributions.

pub mod curve;
pub mod sensitivity;
pub mod summary;
