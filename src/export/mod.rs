//! Priors into downstream model code, each target in its own
//! parameterisation (see the table in the project's shared ecosystem notes:
//! Stan and brms take gamma rates and inverse-gamma scales, JAGS takes normal
//! precisions and has no inverse gamma, scipy takes scales, NumPyro's
//! InverseGamma second argument is a scale, …). A normal-inverse-gamma prior
//! is written as its two lines, σ² then μ | σ². Mixtures are written where the
//! target can express them and refused with a reason where it cannot.

pub mod report;
pub mod svg;
mod targets;

pub use targets::{TARGETS, Target};

use crate::elicit::Belief;
use crate::error::{Error, Result};

/// The export text of `belief` for `target`.
pub fn export(belief: &Belief, target: Target) -> Result<String> {
    match belief {
        Belief::One(p) => Ok(targets::single(p, target)),
        Belief::Mix(m) => targets::mixture(m, target).ok_or_else(|| {
            Error::Rule(format!(
                "{} cannot state a mixture prior directly ({}); export a logarithmic pool, or write the mixture by hand",
                target.name(),
                target.mixture_note()
            ))
        }),
    }
}
