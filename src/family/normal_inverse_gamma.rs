//! Normal-inverse-gamma prior for a mean μ and variance σ² together.

use super::words::short;
use super::{Conflict, Conjugate, Future, Marginal, Predictive, Value, weighted};
use crate::distribution::Continuous;
use crate::error::{self, Error, Result};
use crate::numeric::gamma::ln_gamma;
use std::f64::consts::PI;

/// σ² ~ InvGamma(alpha0, beta0), μ | σ² ~ N(mu0, σ²/kappa0).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct NormalInverseGamma {
    /// Prior mean of μ.
    pub mu0: f64,
    /// Pseudo-observations behind mu0.
    pub kappa0: f64,
    /// Inverse-gamma shape (2·alpha0 pseudo-observations for the spread).
    pub alpha0: f64,
    /// Inverse-gamma scale (beta0/alpha0 is the spread guess).
    pub beta0: f64,
}

/// Natural hyperparameters as pseudo-data: two counts (mean and spread) and
/// the sum of squares about the mean.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct NormalStats {
    /// Observations behind the mean.
    pub n_mean: f64,
    /// Their mean.
    pub mean: f64,
    /// Observations behind the spread.
    pub n_spread: f64,
    /// Sum of squares about the mean.
    pub ss: f64,
}

/// A normal sample: n values, mean, sample variance (n − 1 divisor).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct NormalSample {
    /// Number of values.
    pub n: f64,
    /// Their mean.
    pub mean: f64,
    /// Sample variance (0 when n = 1).
    pub variance: f64,
}

impl NormalSample {
    /// Observed data: n ≥ 1 whole; variance ≥ 0, and required when n ≥ 2.
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
        let variance = match variance {
            Some(v) => error::non_negative("variance", v)?,
            None if n == 1.0 => 0.0,
            None => {
                return Err(Error::Rule(format!(
                    "normal-inverse-gamma data with n = {n} need the sample variance (variance=…)"
                )));
            }
        };
        Ok(Self { n, mean, variance })
    }
}

impl NormalInverseGamma {
    /// The prior, all of kappa0, alpha0, beta0 positive.
    pub fn new(mu0: f64, kappa0: f64, alpha0: f64, beta0: f64) -> Result<Self> {
        Ok(Self {
            mu0: error::finite("mu0", mu0)?,
            kappa0: error::positive("kappa0", kappa0)?,
            alpha0: error::positive("alpha0", alpha0)?,
            beta0: error::positive("beta0", beta0)?,
        })
    }

    /// From pseudo-observations: mean and its ESS, a variance guess and its ESS.
    pub fn from_pseudo(mean: f64, ess: f64, variance: f64, variance_ess: f64) -> Result<Self> {
        error::positive("variance", variance)?;
        error::positive("variance_ess", variance_ess)?;
        let alpha0 = 0.5 * variance_ess;
        Self::new(mean, ess, alpha0, alpha0 * variance)
    }

    /// Student-t law of the mean of m future values.
    fn mean_predictive(&self, m: f64) -> Continuous {
        let scale = (self.beta0 * (self.kappa0 + m) / (self.alpha0 * self.kappa0 * m)).sqrt();
        Continuous::StudentT {
            df: 2.0 * self.alpha0,
            loc: self.mu0,
            scale,
        }
    }
}

impl Conjugate for NormalInverseGamma {
    type Stats = NormalStats;
    type Data = NormalSample;
    const ID: &'static str = "normal-inverse-gamma";

    fn stats(&self) -> NormalStats {
        NormalStats {
            n_mean: self.kappa0,
            mean: self.mu0,
            n_spread: 2.0 * self.alpha0,
            ss: 2.0 * self.beta0,
        }
    }

    fn with_stats(&self, s: &NormalStats) -> Result<Self> {
        Self::new(s.mean, s.n_mean, 0.5 * s.n_spread, 0.5 * s.ss)
    }

    /// Pooled mean, then squares about it: Σ w ss_i + Σ w n_i (m_i − m)², which
    /// is the weighted natural-parameter sum without its cancellation.
    fn combine(terms: &[(f64, &NormalStats)]) -> NormalStats {
        let n_mean = weighted(terms, |s| s.n_mean);
        let mean = weighted(terms, |s| s.n_mean * s.mean) / n_mean;
        let between = weighted(terms, |s| s.n_mean * (s.mean - mean).powi(2));
        NormalStats {
            n_mean,
            mean,
            n_spread: weighted(terms, |s| s.n_spread),
            ss: weighted(terms, |s| s.ss) + between,
        }
    }

    fn data_stats(data: &NormalSample) -> NormalStats {
        NormalStats {
            n_mean: data.n,
            mean: data.mean,
            n_spread: data.n,
            ss: (data.n - 1.0) * data.variance,
        }
    }

    fn marginals(&self) -> Vec<Marginal> {
        let (a, b) = (self.alpha0, self.beta0);
        vec![
            Marginal::new(
                "mu",
                Continuous::StudentT {
                    df: 2.0 * a,
                    loc: self.mu0,
                    scale: (b / (a * self.kappa0)).sqrt(),
                },
            ),
            Marginal::new("sigma2", Continuous::InvGamma { shape: a, scale: b }),
            Marginal::new("sigma", Continuous::SqrtInvGamma { shape: a, scale: b }),
        ]
    }

    /// Joint density of the n values: Γ(αn)/Γ(α0) · β0^α0/βn^αn · √(κ0/κn) ·
    /// (2π)^(−n/2) (Murphy, "Conjugate Bayesian analysis of the Gaussian
    /// distribution", 2007, eq. 95).
    fn ln_marginal_likelihood(&self, data: &NormalSample) -> f64 {
        let Ok(post) = self.update(data) else {
            return f64::NEG_INFINITY;
        };
        ln_gamma(post.alpha0) - ln_gamma(self.alpha0) + self.alpha0 * self.beta0.ln()
            - post.alpha0 * post.beta0.ln()
            + 0.5 * (self.kappa0 / post.kappa0).ln()
            - 0.5 * data.n * (2.0 * PI).ln()
    }

    fn predictive(&self, future: &Future) -> Result<Predictive> {
        match *future {
            Future::Values(m) if m >= 1 => Ok(Predictive::Value(self.mean_predictive(m as f64))),
            _ => Err(Error::Rule(
                "normal-inverse-gamma predicts the mean of n=m future values (m ≥ 1)".to_owned(),
            )),
        }
    }

    fn hyperparameters(&self) -> Vec<(&'static str, Value)> {
        vec![
            ("mu0", Value::Number(self.mu0)),
            ("kappa0", Value::Number(self.kappa0)),
            ("alpha0", Value::Number(self.alpha0)),
            ("beta0", Value::Number(self.beta0)),
        ]
    }

    fn pseudo_observations(&self) -> Vec<(&'static str, Value)> {
        vec![
            ("mean", Value::Number(self.mu0)),
            ("ess", Value::Number(self.kappa0)),
            ("variance", Value::Number(self.beta0 / self.alpha0)),
            ("variance_ess", Value::Number(2.0 * self.alpha0)),
        ]
    }

    fn as_if(&self) -> String {
        format!(
            "as if you had already seen {} values averaging {}, and {} values whose variance was about {}",
            short(self.kappa0),
            short(self.mu0),
            short(2.0 * self.alpha0),
            short(self.beta0 / self.alpha0)
        )
    }

    fn prior_share(&self, data: &NormalSample) -> f64 {
        self.kappa0 / (self.kappa0 + data.n)
    }

    fn conflict(&self, data: &NormalSample) -> Option<Conflict> {
        Some(Conflict::value(
            "sample mean",
            data.mean,
            &self.mean_predictive(data.n),
        ))
    }
}
