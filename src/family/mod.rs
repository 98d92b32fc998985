//! The conjugate pairs, behind one trait that carries the exponential-family
//! structure once.
//!
//! Every prior is written as pseudo-data: the sufficient statistics of the
//! imaginary sample it stands for (its natural hyperparameters, as a
//! pseudo-statistic and a pseudo-count). Updating adds the data's statistics,
//! discounting historical data scales them, and the logarithmic pool of priors
//! of one family is their weighted sum — all three are [`Conjugate::combine`].

mod beta_binomial;
mod conflict;
mod dirichlet_multinomial;
mod gamma_exponential;
mod gamma_poisson;
mod inverse_gamma_variance;
pub mod keys;
mod normal_inverse_gamma;
mod normal_known_variance;
mod prior;
pub mod words;

pub use beta_binomial::{BetaBinomial, Trials};
pub use conflict::{Conflict, p_words};
pub use dirichlet_multinomial::{Counts, DirichletMultinomial};
pub use gamma_exponential::{GammaExponential, LifeTest};
pub use gamma_poisson::{EventCounts, GammaPoisson};
pub use inverse_gamma_variance::{InverseGammaVariance, SquaresAboutMean};
pub use normal_inverse_gamma::{NormalInverseGamma, NormalSample, NormalStats};
pub use normal_known_variance::{MeanStats, NormalKnownVariance};
pub use prior::{Data, FAMILY_IDS, Prior};

use crate::distribution::{Continuous, Discrete};
use crate::error::{Error, Result};

/// A hyperparameter or pseudo-observation value: one number or one per category.
#[derive(Clone, Debug, PartialEq)]
pub enum Value {
    /// A single number.
    Number(f64),
    /// One number per category.
    List(Vec<f64>),
}

/// The future sample a predictive distribution is for.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Future {
    /// Successes in m trials, or counts among m draws.
    Trials(u64),
    /// Events in a future exposure t.
    Exposure(f64),
    /// Events in a future observation time T (exponential lifetimes).
    Time(f64),
    /// The mean of m future values (m = 1: one value), or the next waiting time.
    Values(u64),
}

/// The predictive distribution of a future observable.
#[derive(Clone, Debug, PartialEq)]
pub enum Predictive {
    /// A count.
    Count(Discrete),
    /// A continuous value.
    Value(Continuous),
    /// One count per category (its marginal), in category order.
    Categories(Vec<(String, Discrete)>),
}

/// A marginal distribution of one unknown (or a quantity derived from it).
#[derive(Clone, Debug, PartialEq)]
pub struct Marginal {
    /// Output name, e.g. "theta", "mean_time".
    pub name: String,
    /// Its distribution.
    pub distribution: Continuous,
}

impl Marginal {
    fn new(name: impl Into<String>, distribution: Continuous) -> Self {
        Self {
            name: name.into(),
            distribution,
        }
    }
}

/// A conjugate prior family.
pub trait Conjugate: Sized + Clone + PartialEq + std::fmt::Debug {
    /// Sufficient statistics; a prior's natural hyperparameters are the
    /// statistics of its imaginary sample.
    type Stats: Clone + PartialEq + std::fmt::Debug;
    /// Observed data, validated (whole counts, successes ≤ trials, …).
    type Data: Clone + PartialEq + std::fmt::Debug;

    /// The family id used in files and on the command line.
    const ID: &'static str;

    /// The prior as pseudo-data.
    fn stats(&self) -> Self::Stats;

    /// The prior with these natural hyperparameters (fixed known quantities,
    /// such as a known σ, are kept from `self`).
    fn with_stats(&self, stats: &Self::Stats) -> Result<Self>;

    /// Σ w_i s_i in natural coordinates, written so that it stays accurate.
    fn combine(terms: &[(f64, &Self::Stats)]) -> Self::Stats;

    /// The data's contribution in natural coordinates.
    fn data_stats(data: &Self::Data) -> Self::Stats;

    /// Marginal distributions of the unknowns and derived quantities.
    fn marginals(&self) -> Vec<Marginal>;

    /// ln p(data | prior) under the family's sampling model.
    fn ln_marginal_likelihood(&self, data: &Self::Data) -> f64;

    /// The predictive distribution for a future sample.
    fn predictive(&self, future: &Future) -> Result<Predictive>;

    /// Hyperparameters in conventional form, named as on the command line.
    fn hyperparameters(&self) -> Vec<(&'static str, Value)>;

    /// The pseudo-observation view: prior mean of the data-scale quantity, ESS, …
    fn pseudo_observations(&self) -> Vec<(&'static str, Value)>;

    /// One sentence saying what the prior amounts to in imaginary data.
    fn as_if(&self) -> String;

    /// Share of the posterior's information that came from the prior
    /// (prior ESS over posterior ESS).
    fn prior_share(&self, data: &Self::Data) -> f64;

    /// Prior-predictive tail probability of the observed statistic.
    fn conflict(&self, data: &Self::Data) -> Option<Conflict>;

    /// Posterior after `data`.
    fn update(&self, data: &Self::Data) -> Result<Self> {
        let (prior, seen) = (self.stats(), Self::data_stats(data));
        self.with_stats(&Self::combine(&[(1.0, &prior), (1.0, &seen)]))
    }

    /// Power prior: `self` updated by historical data whose statistics are
    /// scaled by a0 ∈ (0, 1] (a0 = 1 takes them at face value).
    fn with_history(&self, history: &Self::Data, a0: f64) -> Result<Self> {
        if !(a0 > 0.0 && a0 <= 1.0) {
            return Err(Error::invalid("a0", a0, "the discount must lie in (0, 1]"));
        }
        let (prior, seen) = (self.stats(), Self::data_stats(history));
        self.with_stats(&Self::combine(&[(1.0, &prior), (a0, &seen)]))
    }

    /// Logarithmic pool ∝ Π p_i^{w_i}, weights summing to 1: in one conjugate
    /// family it is again a member, with natural hyperparameters Σ w_i η_i.
    fn log_pool(priors: &[(f64, Self)]) -> Result<Self> {
        let Some((_, first)) = priors.first() else {
            return Err(Error::Rule("a pool needs at least one prior".to_owned()));
        };
        let total: f64 = priors.iter().map(|(w, _)| *w).sum();
        if priors.iter().any(|(w, _)| !(w.is_finite() && *w >= 0.0)) || (total - 1.0).abs() > 1e-9 {
            return Err(Error::Rule(format!(
                "pool weights must be 0 or more and sum to 1; they sum to {total}"
            )));
        }
        let stats: Vec<_> = priors.iter().map(|(w, p)| (*w, p.stats())).collect();
        let terms: Vec<_> = stats.iter().map(|(w, s)| (*w, s)).collect();
        first.with_stats(&Self::combine(&terms))
    }
}

/// Σ w_i x_i over the terms' field `f`.
fn weighted<S>(terms: &[(f64, &S)], f: impl Fn(&S) -> f64) -> f64 {
    terms.iter().map(|(w, s)| w * f(s)).sum()
}
