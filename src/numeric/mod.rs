//! Special functions and root finding, written for this crate.
//!
//! Why not `statrs`: its incomplete beta and gamma compute the prefactor
//! `x^a (1-x)^b / B(a, b)` from plain log-gamma values, which cancel to about
//! 1e-8 relative once the shapes reach 1e7; the accuracy target here is 1e-10
//! relative over hyperparameters 1e-3 … 1e7 and tails down to 1e-10. The methods
//! used instead are named in each file.

pub mod double_double;
pub mod gamma;
pub mod incomplete;
pub mod solve;
