//! Normal prior for a mean μ when the data's standard deviation σ is known.

use super::words::short;
use super::{Conflict, Conjugate, Future, Marginal, Predictive, Value, weighted};
use crate::distribution::Continuous;
use crate::error::{self, Error, Result};
use std::f64::consts::PI;

/// μ ~ N(mu0, σ²/kappa0), σ known.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct NormalKnownVariance {
    /// Prior mean: where the pseudo-observations average.
    pub mu0: f64,
    /// Number of pseudo-observations.
    pub kappa0: f64,
    /// The data's known standard deviation.
    pub sigma: f64,
}

/// n values and their mean (pseudo-data or data).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct MeanStats {
    /// Number of values.
    pub n: f64,
    /// Their mean.
    pub mean: f64,
    /// Sample variance (n − 1 divisor), if known: only the marginal
    /// likelihood of the individual values needs it.
    pub variance: Option<f64>,
}

impl MeanStats {
    /// Observed data: n ≥ 1 whole, finite mean, variance ≥ 0 if given.
    pub fn observed(n: f64, mean: f64, variance: Option<f64>) -> Result<Self> {
        error::count("n", n)?;
        if n < 1.0 {
            return Err(Error::invalid(
                "n",
                n,
                "it must be a whole number, 1 or more",
            ));
        }
        error::finite("mean", mean)?;
        if let Some(v) = variance {
            error::non_negative("variance", v)?;
        }
        Ok(Self { n, mean, variance })
    }
}

impl NormalKnownVariance {
    /// N(mu0, sigma²/kappa0) with kappa0, sigma positive.
    pub fn new(mu0: f64, kappa0: f64, sigma: f64) -> Result<Self> {
        Ok(Self {
            mu0: error::finite("mu0", mu0)?,
            kappa0: error::positive("kappa0", kappa0)?,
            sigma: error::positive("sigma", sigma)?,
        })
    }

    fn mean_predictive(&self, m: f64) -> Continuous {
        Continuous::Normal {
            mean: self.mu0,
            sd: self.sigma * (1.0 / m + 1.0 / self.kappa0).sqrt(),
        }
    }
}

impl Conjugate for NormalKnownVariance {
    type Stats = MeanStats;
    type Data = MeanStats;
    const ID: &'static str = "normal-known-variance";

    fn stats(&self) -> MeanStats {
        MeanStats {
            n: self.kappa0,
            mean: self.mu0,
            variance: None,
        }
    }

    fn with_stats(&self, s: &MeanStats) -> Result<Self> {
        Self::new(s.mean, s.n, self.sigma)
    }

    fn combine(terms: &[(f64, &MeanStats)]) -> MeanStats {
        let n = weighted(terms, |s| s.n);
        MeanStats {
            n,
            mean: weighted(terms, |s| s.n * s.mean) / n,
            variance: None,
        }
    }

    fn data_stats(data: &MeanStats) -> MeanStats {
        MeanStats {
            variance: None,
            ..data.clone()
        }
    }

    fn marginals(&self) -> Vec<Marginal> {
        vec![Marginal::new(
            "mu",
            Continuous::Normal {
                mean: self.mu0,
                sd: self.sigma / self.kappa0.sqrt(),
            },
        )]
    }

    /// With the sample variance: the joint density of the n values. Without it:
    /// the density of their mean ȳ, which differs from the joint density by a
    /// factor free of the prior (Bayes factors are the same either way).
    fn ln_marginal_likelihood(&self, data: &MeanStats) -> f64 {
        let mean_density = self.mean_predictive(data.n).pdf(data.mean).ln();
        match data.variance {
            None => mean_density,
            Some(s2) => {
                let (n, s2g) = (data.n, self.sigma * self.sigma);
                // p(y) = p(ȳ) · p(y | ȳ), the latter free of μ.
                mean_density
                    - 0.5 * (n - 1.0) * (2.0 * PI * s2g).ln()
                    - 0.5 * n.ln()
                    - 0.5 * (n - 1.0) * s2 / s2g
            }
        }
    }

    fn predictive(&self, future: &Future) -> Result<Predictive> {
        match *future {
            Future::Values(m) if m >= 1 => Ok(Predictive::Value(self.mean_predictive(m as f64))),
            _ => Err(Error::Rule(
                "normal-known-variance predicts the mean of n=m future values (m ≥ 1)".to_owned(),
            )),
        }
    }

    fn hyperparameters(&self) -> Vec<(&'static str, Value)> {
        vec![
            ("mu0", Value::Number(self.mu0)),
            ("kappa0", Value::Number(self.kappa0)),
            ("sigma", Value::Number(self.sigma)),
        ]
    }

    fn pseudo_observations(&self) -> Vec<(&'static str, Value)> {
        vec![
            ("mean", Value::Number(self.mu0)),
            ("ess", Value::Number(self.kappa0)),
        ]
    }

    fn as_if(&self) -> String {
        format!(
            "as if you had already seen {} values averaging {}",
            short(self.kappa0),
            short(self.mu0)
        )
    }

    fn prior_share(&self, data: &MeanStats) -> f64 {
        self.kappa0 / (self.kappa0 + data.n)
    }

    fn conflict(&self, data: &MeanStats) -> Option<Conflict> {
        Some(Conflict::value(
            "sample mean",
            data.mean,
            &self.mean_predictive(data.n),
        ))
    }
}
