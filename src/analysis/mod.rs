//! Summaries of priors, posteriors and predictive distributions.

pub mod summary;
