//! Dirichlet prior for category shares with multinomial counts.

use super::words::short;
use super::{Conflict, Conjugate, Future, Marginal, Predictive, Value};
use crate::distribution::{Continuous, Discrete};
use crate::error::{self, Error, Result};
use crate::numeric::gamma::{ln_gamma, ln_gamma_ratio};

/// (θ1 … θK) ~ Dirichlet(alpha).
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct DirichletMultinomial {
    /// Concentrations: the prior's pseudo-counts per category.
    pub alpha: Vec<f64>,
    /// Category names; theta1 … thetaK when absent.
    #[serde(default)]
    pub names: Option<Vec<String>>,
}

/// Counts per category: the data and the prior's pseudo-data.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Counts {
    /// One count per category.
    pub counts: Vec<f64>,
}

impl Counts {
    /// Observed data: whole counts.
    pub fn observed(counts: Vec<f64>) -> Result<Self> {
        for (k, c) in counts.iter().enumerate() {
            error::count(&format!("counts[{}]", k + 1), *c)?;
        }
        Ok(Self { counts })
    }
}

impl DirichletMultinomial {
    /// Dirichlet(alpha) with K ≥ 2 positive concentrations.
    pub fn new(alpha: Vec<f64>, names: Option<Vec<String>>) -> Result<Self> {
        if alpha.len() < 2 {
            return Err(Error::Rule(format!(
                "a dirichlet-multinomial prior needs at least 2 categories; alpha has {}",
                alpha.len()
            )));
        }
        for (k, a) in alpha.iter().enumerate() {
            error::positive(&format!("alpha[{}]", k + 1), *a)?;
        }
        if let Some(n) = &names
            && n.len() != alpha.len()
        {
            return Err(Error::Rule(format!(
                "{} category names given for {} categories",
                n.len(),
                alpha.len()
            )));
        }
        Ok(Self { alpha, names })
    }

    /// From mean shares (summing to 1) and the total ESS.
    pub fn from_mean_ess(shares: &[f64], ess: f64, names: Option<Vec<String>>) -> Result<Self> {
        error::positive("ess", ess)?;
        let total: f64 = shares.iter().sum();
        if (total - 1.0).abs() > 1e-9 {
            return Err(Error::Rule(format!(
                "mean shares must sum to 1; they sum to {total}"
            )));
        }
        Self::new(shares.iter().map(|s| s * ess).collect(), names)
    }

    /// Total concentration A = Σ α_k.
    pub fn total(&self) -> f64 {
        self.alpha.iter().sum()
    }

    /// Name of category k (0-based).
    pub fn category(&self, k: usize) -> String {
        self.names
            .as_ref()
            .and_then(|n| n.get(k).cloned())
            .unwrap_or_else(|| format!("theta{}", k + 1))
    }

    /// Whether `data` has one count per category.
    pub fn check_data(&self, data: &Counts) -> Result<()> {
        if data.counts.len() == self.alpha.len() {
            Ok(())
        } else {
            Err(Error::Rule(format!(
                "the data have {} counts but the prior has {} categories",
                data.counts.len(),
                self.alpha.len()
            )))
        }
    }
}

impl Conjugate for DirichletMultinomial {
    type Stats = Counts;
    type Data = Counts;
    const ID: &'static str = "dirichlet-multinomial";

    fn stats(&self) -> Counts {
        Counts {
            counts: self.alpha.clone(),
        }
    }

    fn with_stats(&self, s: &Counts) -> Result<Self> {
        Self::new(s.counts.clone(), self.names.clone())
    }

    fn combine(terms: &[(f64, &Counts)]) -> Counts {
        let k = terms.iter().map(|(_, s)| s.counts.len()).max().unwrap_or(0);
        let mut counts = vec![0.0; k];
        for (w, s) in terms {
            for (c, x) in counts.iter_mut().zip(&s.counts) {
                *c += w * x;
            }
        }
        Counts { counts }
    }

    fn data_stats(data: &Counts) -> Counts {
        data.clone()
    }

    fn marginals(&self) -> Vec<Marginal> {
        let total = self.total();
        self.alpha
            .iter()
            .enumerate()
            .map(|(k, a)| {
                Marginal::new(
                    self.category(k),
                    Continuous::Beta {
                        a: *a,
                        b: total - a,
                    },
                )
            })
            .collect()
    }

    fn ln_marginal_likelihood(&self, data: &Counts) -> f64 {
        // Multinomial coefficient × Dirichlet normalising-constant ratio.
        let n: f64 = data.counts.iter().sum();
        let mut ln = ln_gamma(n + 1.0) - ln_gamma_ratio(self.total(), n);
        for (a, c) in self.alpha.iter().zip(&data.counts) {
            ln += ln_gamma_ratio(*a, *c) - ln_gamma(c + 1.0);
        }
        ln
    }

    fn predictive(&self, future: &Future) -> Result<Predictive> {
        let Future::Trials(m) = *future else {
            return Err(Error::Rule(
                "dirichlet-multinomial predicts counts among n=m draws".to_owned(),
            ));
        };
        let total = self.total();
        Ok(Predictive::Categories(
            self.alpha
                .iter()
                .enumerate()
                .map(|(k, a)| {
                    (
                        self.category(k),
                        Discrete::BetaBinomial {
                            n: m,
                            a: *a,
                            b: total - a,
                        },
                    )
                })
                .collect(),
        ))
    }

    fn hyperparameters(&self) -> Vec<(&'static str, Value)> {
        vec![("alpha", Value::List(self.alpha.clone()))]
    }

    fn pseudo_observations(&self) -> Vec<(&'static str, Value)> {
        let total = self.total();
        vec![
            (
                "mean",
                Value::List(self.alpha.iter().map(|a| a / total).collect()),
            ),
            ("ess", Value::Number(total)),
        ]
    }

    fn as_if(&self) -> String {
        let parts: Vec<String> = self.alpha.iter().map(|a| short(*a)).collect();
        format!(
            "as if you had already seen {} draws split {} across the categories",
            short(self.total()),
            parts.join(" / ")
        )
    }

    fn prior_share(&self, data: &Counts) -> f64 {
        let total = self.total();
        total / (total + data.counts.iter().sum::<f64>())
    }

    /// Not yet: category counts need a chi-square-type statistic whose prior
    /// predictive has no closed form (planned with the sensitivity work).
    fn conflict(&self, data: &Counts) -> Option<Conflict> {
        if data.counts.len() != self.alpha.len() {
            return None;
        }
        let counts: Vec<u64> = data.counts.iter().map(|c| *c as u64).collect();
        Some(Conflict::categories(&self.alpha, &counts))
    }
}
