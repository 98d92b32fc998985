//! Gamma prior for the event rate λ of exponential lifetimes, with
//! right-censored times.

use super::words::short;
use super::{Conflict, Conjugate, Future, Marginal, Predictive, Value, weighted};
use crate::distribution::{Continuous, Discrete};
use crate::error::{self, Error, Result};
use crate::numeric::gamma::ln_gamma_ratio;

/// λ ~ Gamma(shape alpha, rate beta); the mean time 1/λ is InvGamma(alpha, beta).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct GammaExponential {
    /// Shape: the prior's pseudo-failures.
    pub alpha: f64,
    /// Rate: the prior's pseudo time on test.
    pub beta: f64,
}

/// Failures and total time on test (failed and censored units together).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct LifeTest {
    /// Number of observed failures (uncensored times).
    pub failures: f64,
    /// Total time on test.
    pub time: f64,
}

impl LifeTest {
    /// Observed data: whole failures; time ≥ 0, and positive if anything failed.
    pub fn observed(failures: f64, time: f64) -> Result<Self> {
        error::count("failures", failures)?;
        error::non_negative("time", time)?;
        if failures > 0.0 && time == 0.0 {
            return Err(Error::Rule(format!(
                "failures = {failures} need a positive time on test"
            )));
        }
        Ok(Self { failures, time })
    }
}

impl GammaExponential {
    /// Gamma(alpha, beta), both positive and finite.
    pub fn new(alpha: f64, beta: f64) -> Result<Self> {
        Ok(Self {
            alpha: error::positive("alpha", alpha)?,
            beta: error::positive("beta", beta)?,
        })
    }

    /// From the prior pseudo mean time between failures and the ESS in failures.
    pub fn from_mean_ess(mean_time: f64, ess: f64) -> Result<Self> {
        error::positive("mean", mean_time)?;
        error::positive("ess", ess)?;
        Self::new(ess, mean_time * ess)
    }
}

impl Conjugate for GammaExponential {
    type Stats = LifeTest;
    type Data = LifeTest;
    const ID: &'static str = "gamma-exponential";

    fn stats(&self) -> LifeTest {
        LifeTest {
            failures: self.alpha,
            time: self.beta,
        }
    }

    fn with_stats(&self, s: &LifeTest) -> Result<Self> {
        Self::new(s.failures, s.time)
    }

    fn combine(terms: &[(f64, &LifeTest)]) -> LifeTest {
        LifeTest {
            failures: weighted(terms, |s| s.failures),
            time: weighted(terms, |s| s.time),
        }
    }

    fn data_stats(data: &LifeTest) -> LifeTest {
        data.clone()
    }

    fn marginals(&self) -> Vec<Marginal> {
        vec![
            Marginal::new(
                "lambda",
                Continuous::Gamma {
                    shape: self.alpha,
                    rate: self.beta,
                },
            ),
            Marginal::new(
                "mean_time",
                Continuous::InvGamma {
                    shape: self.alpha,
                    scale: self.beta,
                },
            ),
        ]
    }

    fn ln_marginal_likelihood(&self, data: &LifeTest) -> f64 {
        // ∫ λ^d e^{−λT} Gamma(λ | α, β) dλ = β^α Γ(α+d) / (Γ(α) (β+T)^{α+d}).
        let (d, t) = (data.failures, data.time);
        ln_gamma_ratio(self.alpha, d)
            - self.alpha * (t / self.beta).ln_1p()
            - d * (self.beta + t).ln()
    }

    fn predictive(&self, future: &Future) -> Result<Predictive> {
        match *future {
            Future::Values(1) => {
                Ok(Predictive::Value(Continuous::Lomax { shape: self.alpha, scale: self.beta }))
            }
            Future::Time(t) => {
                error::positive("time", t)?;
                Ok(Predictive::Count(Discrete::gamma_poisson(self.alpha, self.beta, t)))
            }
            _ => Err(Error::Rule(
                "gamma-exponential predicts the next waiting time (n=1) or the failures in a future time (time=T)"
                    .to_owned(),
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
            ("mean", Value::Number(self.beta / self.alpha)),
            ("ess", Value::Number(self.alpha)),
            ("failures", Value::Number(self.alpha)),
            ("time", Value::Number(self.beta)),
        ]
    }

    fn as_if(&self) -> String {
        format!(
            "as if you had already seen {} failures in {} time on test",
            short(self.alpha),
            short(self.beta)
        )
    }

    fn prior_share(&self, data: &LifeTest) -> f64 {
        self.alpha / (self.alpha + data.failures)
    }

    fn conflict(&self, data: &LifeTest) -> Option<Conflict> {
        // With the time on test taken as fixed, failures ~ Poisson(λT): under the
        // prior, negative binomial (a time-terminated test, common practice).
        let pred = Discrete::gamma_poisson(self.alpha, self.beta, data.time.max(f64::MIN_POSITIVE));
        Some(Conflict::count(
            "failures in the observed time on test",
            data.failures as u64,
            &pred,
        ))
    }
}
