//! Gamma prior for a Poisson rate λ per unit exposure.

use super::words::short;
use super::{Conflict, Conjugate, Future, Marginal, Predictive, Value, weighted};
use crate::distribution::{Continuous, Discrete};
use crate::error::{self, Error, Result};

/// λ ~ Gamma(shape alpha, rate beta).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct GammaPoisson {
    /// Shape: the prior's pseudo-events.
    pub alpha: f64,
    /// Rate: the prior's pseudo-exposure.
    pub beta: f64,
}

/// Events in an exposure: the data and the prior's pseudo-data.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct EventCounts {
    /// Total number of events.
    pub events: f64,
    /// Total exposure (time, area, person-years, …).
    pub exposure: f64,
}

impl EventCounts {
    /// Observed data: a whole number of events in a positive exposure.
    pub fn observed(events: f64, exposure: f64) -> Result<Self> {
        Ok(Self {
            events: error::count("events", events)?,
            exposure: error::positive("exposure", exposure)?,
        })
    }
}

impl GammaPoisson {
    /// Gamma(alpha, beta), both positive and finite.
    pub fn new(alpha: f64, beta: f64) -> Result<Self> {
        Ok(Self {
            alpha: error::positive("alpha", alpha)?,
            beta: error::positive("beta", beta)?,
        })
    }

    /// From the prior mean rate and the ESS in units of exposure.
    pub fn from_mean_ess(mean: f64, ess: f64) -> Result<Self> {
        error::positive("mean", mean)?;
        error::positive("ess", ess)?;
        Self::new(mean * ess, ess)
    }

    fn negative_binomial(&self, exposure: f64) -> Discrete {
        Discrete::gamma_poisson(self.alpha, self.beta, exposure)
    }
}

impl Conjugate for GammaPoisson {
    type Stats = EventCounts;
    type Data = EventCounts;
    const ID: &'static str = "gamma-poisson";

    fn stats(&self) -> EventCounts {
        EventCounts {
            events: self.alpha,
            exposure: self.beta,
        }
    }

    fn with_stats(&self, s: &EventCounts) -> Result<Self> {
        Self::new(s.events, s.exposure)
    }

    fn combine(terms: &[(f64, &EventCounts)]) -> EventCounts {
        EventCounts {
            events: weighted(terms, |s| s.events),
            exposure: weighted(terms, |s| s.exposure),
        }
    }

    fn data_stats(data: &EventCounts) -> EventCounts {
        data.clone()
    }

    fn marginals(&self) -> Vec<Marginal> {
        vec![Marginal::new(
            "lambda",
            Continuous::Gamma {
                shape: self.alpha,
                rate: self.beta,
            },
        )]
    }

    fn ln_marginal_likelihood(&self, data: &EventCounts) -> f64 {
        // The total count in the total exposure: negative binomial.
        self.negative_binomial(data.exposure)
            .ln_pmf(data.events as u64)
    }

    fn predictive(&self, future: &Future) -> Result<Predictive> {
        match *future {
            Future::Exposure(t) => {
                error::positive("exposure", t)?;
                Ok(Predictive::Count(self.negative_binomial(t)))
            }
            _ => Err(Error::Rule(
                "gamma-poisson predicts events in exposure=t".to_owned(),
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
        vec![
            ("mean", Value::Number(self.alpha / self.beta)),
            ("ess", Value::Number(self.beta)),
            ("events", Value::Number(self.alpha)),
            ("exposure", Value::Number(self.beta)),
        ]
    }

    fn as_if(&self) -> String {
        format!(
            "as if you had already seen {} events in {} units of exposure",
            short(self.alpha),
            short(self.beta)
        )
    }

    fn prior_share(&self, data: &EventCounts) -> f64 {
        self.beta / (self.beta + data.exposure)
    }

    fn conflict(&self, data: &EventCounts) -> Option<Conflict> {
        let pred = self.negative_binomial(data.exposure);
        Some(Conflict::count(
            "events in the observed exposure",
            data.events as u64,
            &pred,
        ))
    }
}
