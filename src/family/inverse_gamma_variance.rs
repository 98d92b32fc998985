//! Inverse-gamma prior for a normal variance σ² when the mean μ is known.

use super::words::short;
use super::{Conflict, Conjugate, Future, Marginal, Predictive, Value, weighted};
use crate::distribution::Continuous;
use crate::error::{self, Error, Result};
use crate::numeric::gamma::ln_gamma_ratio;
use crate::numeric::incomplete::beta_i;
use std::f64::consts::PI;

/// σ² ~ InvGamma(shape alpha, scale beta); the known mean mu is optional
/// (only the predictive needs it).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct InverseGammaVariance {
    /// Shape: 2·alpha pseudo-observations.
    pub alpha: f64,
    /// Scale: beta/alpha is the spread guess.
    pub beta: f64,
    /// The data's known mean.
    #[serde(default)]
    pub mu: Option<f64>,
}

/// n values and their sum of squares about the known mean.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct SquaresAboutMean {
    /// Number of values.
    pub n: f64,
    /// Σ (y − μ)².
    pub ss: f64,
}

impl SquaresAboutMean {
    /// Observed data: n ≥ 1 whole, ss ≥ 0.
    pub fn observed(n: f64, ss: f64) -> Result<Self> {
        error::count("n", n)?;
        if n < 1.0 {
            return Err(Error::invalid(
                "n",
                n,
                "it must be a whole number, 1 or more",
            ));
        }
        Ok(Self {
            n,
            ss: error::non_negative("ss", ss)?,
        })
    }
}

impl InverseGammaVariance {
    /// InvGamma(alpha, beta), both positive; mu finite if given.
    pub fn new(alpha: f64, beta: f64, mu: Option<f64>) -> Result<Self> {
        if let Some(m) = mu {
            error::finite("mu", m)?;
        }
        Ok(Self {
            alpha: error::positive("alpha", alpha)?,
            beta: error::positive("beta", beta)?,
            mu,
        })
    }

    /// From a variance guess and its ESS (2·alpha).
    pub fn from_mean_ess(variance: f64, ess: f64, mu: Option<f64>) -> Result<Self> {
        error::positive("mean", variance)?;
        error::positive("ess", ess)?;
        Self::new(0.5 * ess, 0.5 * ess * variance, mu)
    }
}

impl Conjugate for InverseGammaVariance {
    type Stats = SquaresAboutMean;
    type Data = SquaresAboutMean;
    const ID: &'static str = "inverse-gamma-variance";

    fn stats(&self) -> SquaresAboutMean {
        SquaresAboutMean {
            n: 2.0 * self.alpha,
            ss: 2.0 * self.beta,
        }
    }

    fn with_stats(&self, s: &SquaresAboutMean) -> Result<Self> {
        Self::new(0.5 * s.n, 0.5 * s.ss, self.mu)
    }

    fn combine(terms: &[(f64, &SquaresAboutMean)]) -> SquaresAboutMean {
        SquaresAboutMean {
            n: weighted(terms, |s| s.n),
            ss: weighted(terms, |s| s.ss),
        }
    }

    fn data_stats(data: &SquaresAboutMean) -> SquaresAboutMean {
        data.clone()
    }

    fn marginals(&self) -> Vec<Marginal> {
        vec![
            Marginal::new(
                "sigma2",
                Continuous::InvGamma {
                    shape: self.alpha,
                    scale: self.beta,
                },
            ),
            Marginal::new(
                "sigma",
                Continuous::SqrtInvGamma {
                    shape: self.alpha,
                    scale: self.beta,
                },
            ),
        ]
    }

    /// Joint density of n values about the known mean:
    /// (2π)^(−n/2) β^α Γ(α + n/2) / (Γ(α) (β + ss/2)^(α + n/2)).
    fn ln_marginal_likelihood(&self, data: &SquaresAboutMean) -> f64 {
        let (n, ss) = (data.n, data.ss);
        -0.5 * n * (2.0 * PI).ln() + ln_gamma_ratio(self.alpha, 0.5 * n)
            - self.alpha * (0.5 * ss / self.beta).ln_1p()
            - 0.5 * n * (self.beta + 0.5 * ss).ln()
    }

    fn predictive(&self, future: &Future) -> Result<Predictive> {
        let Some(mu) = self.mu else {
            return Err(Error::Rule(
                "predict for inverse-gamma-variance needs the known mean: add mu=… to --prior"
                    .to_owned(),
            ));
        };
        match *future {
            Future::Values(1) => Ok(Predictive::Value(Continuous::StudentT {
                df: 2.0 * self.alpha,
                loc: mu,
                scale: (self.beta / self.alpha).sqrt(),
            })),
            _ => Err(Error::Rule(
                "inverse-gamma-variance predicts a single future value (n=1)".to_owned(),
            )),
        }
    }

    fn hyperparameters(&self) -> Vec<(&'static str, Value)> {
        let mut h = vec![
            ("alpha", Value::Number(self.alpha)),
            ("beta", Value::Number(self.beta)),
        ];
        if let Some(mu) = self.mu {
            h.push(("mu", Value::Number(mu)));
        }
        h
    }

    fn pseudo_observations(&self) -> Vec<(&'static str, Value)> {
        vec![
            ("mean", Value::Number(self.beta / self.alpha)),
            ("ess", Value::Number(2.0 * self.alpha)),
        ]
    }

    fn as_if(&self) -> String {
        format!(
            "as if you had already seen {} values whose mean square about the known mean was {}",
            short(2.0 * self.alpha),
            short(self.beta / self.alpha)
        )
    }

    fn prior_share(&self, data: &SquaresAboutMean) -> f64 {
        2.0 * self.alpha / (2.0 * self.alpha + data.n)
    }

    /// T = (ss/n)·(α/β) is F(n, 2α) under the prior predictive: ss/σ² ~ χ²_n
    /// and 2β/σ² ~ χ²_{2α}.
    fn conflict(&self, data: &SquaresAboutMean) -> Option<Conflict> {
        let (d1, d2) = (data.n, 2.0 * self.alpha);
        let f = data.ss / data.n * self.alpha / self.beta;
        // P(F ≤ f) = I_{d1 f/(d1 f + d2)}(d1/2, d2/2).
        let (x, y) = (d1 * f / (d1 * f + d2), d2 / (d1 * f + d2));
        let (lower, upper) = beta_i(0.5 * d1, 0.5 * d2, x, y);
        Some(Conflict::from_tails(
            "mean square about the known mean",
            data.ss / data.n,
            lower,
            upper,
            false,
        ))
    }
}
