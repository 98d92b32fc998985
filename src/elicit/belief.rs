//! What an analysis starts from: one conjugate prior, or a mixture of them.

use super::Mixture;
use crate::distribution::Law;
use crate::error::Result;
use crate::family::{Conflict, Data, Future, Predictive, Prior};

/// One conjugate prior or a mixture of same-family priors.
#[derive(Clone, Debug, PartialEq)]
pub enum Belief {
    /// A single conjugate prior (also the result of a logarithmic pool).
    One(Prior),
    /// A linear pool or robust mixture.
    Mix(Mixture),
}

impl Belief {
    /// The family id.
    pub fn id(&self) -> &'static str {
        match self {
            Self::One(p) => p.id(),
            Self::Mix(m) => m.id(),
        }
    }

    /// Named marginal laws of the unknowns.
    pub fn marginals(&self) -> Vec<(String, Law)> {
        match self {
            Self::One(p) => p
                .marginals()
                .into_iter()
                .map(|m| (m.name, Law::One(m.distribution)))
                .collect(),
            Self::Mix(m) => m.marginals(),
        }
    }

    /// Any one prior of the belief, for parsing data and future keys.
    pub fn representative(&self) -> &Prior {
        match self {
            Self::One(p) => p,
            Self::Mix(m) => &m.components()[0].1,
        }
    }

    /// The posterior.
    pub fn update(&self, data: &Data) -> Result<Belief> {
        Ok(match self {
            Self::One(p) => Self::One(p.update(data)?),
            Self::Mix(m) => Self::Mix(m.update(data)?),
        })
    }

    /// ln p(data).
    pub fn ln_marginal_likelihood(&self, data: &Data) -> Result<f64> {
        match self {
            Self::One(p) => p.ln_marginal_likelihood(data),
            Self::Mix(m) => m.ln_marginal_likelihood(data),
        }
    }

    /// Prior's share of the posterior information.
    pub fn prior_share(&self, data: &Data) -> Result<f64> {
        match self {
            Self::One(p) => p.prior_share(data),
            Self::Mix(m) => m.prior_share(data),
        }
    }

    /// Prior–data conflict.
    pub fn conflict(&self, data: &Data) -> Result<Option<Conflict>> {
        match self {
            Self::One(p) => p.conflict(data),
            Self::Mix(m) => m.conflict(data),
        }
    }

    /// The predictive as weighted parts (one part for a single prior).
    pub fn predictive(&self, future: &Future) -> Result<Vec<(f64, Predictive)>> {
        match self {
            Self::One(p) => Ok(vec![(1.0, p.predictive(future)?)]),
            Self::Mix(m) => m.predictive(future),
        }
    }
}
