//! Beta prior for a success probability θ with binomial data.

use super::words::short;
use super::{Conflict, Conjugate, Future, Marginal, Predictive, Value, weighted};
use crate::distribution::{Continuous, Discrete};
use crate::error::{self, Error, Result};

/// θ ~ Beta(alpha, beta).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct BetaBinomial {
    /// First shape: the prior's pseudo-successes.
    pub alpha: f64,
    /// Second shape: the prior's pseudo-failures.
    pub beta: f64,
}

/// Successes in trials: both the data and the prior's pseudo-data.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Trials {
    /// Number of successes.
    pub successes: f64,
    /// Number of trials.
    pub trials: f64,
}

impl Trials {
    /// Observed data: whole numbers with successes ≤ trials.
    pub fn observed(successes: f64, trials: f64) -> Result<Self> {
        error::count("successes", successes)?;
        error::count("trials", trials)?;
        if successes > trials {
            return Err(Error::Rule(format!(
                "successes = {successes} is more than trials = {trials}"
            )));
        }
        Ok(Self { successes, trials })
    }
}

impl BetaBinomial {
    /// Beta(alpha, beta), both positive and finite.
    pub fn new(alpha: f64, beta: f64) -> Result<Self> {
        Ok(Self {
            alpha: error::positive("alpha", alpha)?,
            beta: error::positive("beta", beta)?,
        })
    }

    /// From the prior mean of θ and the effective sample size (trials).
    pub fn from_mean_ess(mean: f64, ess: f64) -> Result<Self> {
        error::probability("mean", mean)?;
        error::positive("ess", ess)?;
        Self::new(mean * ess, (1.0 - mean) * ess)
    }
}

impl Conjugate for BetaBinomial {
    type Stats = Trials;
    type Data = Trials;
    const ID: &'static str = "beta-binomial";

    fn stats(&self) -> Trials {
        Trials {
            successes: self.alpha,
            trials: self.alpha + self.beta,
        }
    }

    fn with_stats(&self, s: &Trials) -> Result<Self> {
        Self::new(s.successes, s.trials - s.successes)
    }

    fn combine(terms: &[(f64, &Trials)]) -> Trials {
        Trials {
            successes: weighted(terms, |s| s.successes),
            trials: weighted(terms, |s| s.trials),
        }
    }

    fn data_stats(data: &Trials) -> Trials {
        data.clone()
    }

    fn marginals(&self) -> Vec<Marginal> {
        vec![Marginal::new(
            "theta",
            Continuous::Beta {
                a: self.alpha,
                b: self.beta,
            },
        )]
    }

    fn ln_marginal_likelihood(&self, data: &Trials) -> f64 {
        // Binomial likelihood with its coefficient: the beta-binomial pmf.
        Discrete::BetaBinomial {
            n: data.trials as u64,
            a: self.alpha,
            b: self.beta,
        }
        .ln_pmf(data.successes as u64)
    }

    fn predictive(&self, future: &Future) -> Result<Predictive> {
        match *future {
            Future::Trials(m) => Ok(Predictive::Count(Discrete::BetaBinomial {
                n: m,
                a: self.alpha,
                b: self.beta,
            })),
            _ => Err(Error::Rule(
                "beta-binomial predicts successes in trials=m".to_owned(),
            )),
        }
    }

    fn hyperparameters(&self) -> Vec<(&'static str, Value)> {
        vec![
            ("alpha", Value::Number(self.alpha)),
            ("beta", Value::Number(self.beta)),
        ]
    }

    fn pseudo_observations(&self) -> Vec<(&'static str, Value)> {
        let ess = self.alpha + self.beta;
        vec![
            ("mean", Value::Number(self.alpha / ess)),
            ("ess", Value::Number(ess)),
            ("successes", Value::Number(self.alpha)),
            ("trials", Value::Number(ess)),
        ]
    }

    fn as_if(&self) -> String {
        format!(
            "as if you had already seen {} successes in {} trials",
            short(self.alpha),
            short(self.alpha + self.beta)
        )
    }

    fn prior_share(&self, data: &Trials) -> f64 {
        let ess = self.alpha + self.beta;
        ess / (ess + data.trials)
    }

    fn conflict(&self, data: &Trials) -> Option<Conflict> {
        let pred = Discrete::BetaBinomial {
            n: data.trials as u64,
            a: self.alpha,
            b: self.beta,
        };
        Some(Conflict::count(
            "successes in the observed trials",
            data.successes as u64,
            &pred,
        ))
    }
}
