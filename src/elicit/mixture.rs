//! Linear pools of experts and robust priors: finite mixtures of conjugate
//! priors of one family. Updating keeps each component conjugate and
//! re-weights them by their marginal likelihoods, w_i' ∝ w_i p(data | prior_i)
//! (Diaconis & Ylvisaker, "Quantifying prior opinion", 1985, §3).

use crate::distribution::{Discrete, Law, MixtureLaw};
use crate::error::{Error, Result};
use crate::family::{Conflict, Data, Future, Predictive, Prior};

/// How several experts' priors are combined.
#[derive(Clone, Copy, Debug, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum PoolMethod {
    /// The mixture Σ w_i p_i (keeps every expert's modes; not conjugate).
    Linear,
    /// ∝ Π p_i^{w_i}: again one conjugate prior.
    Log,
}

/// Σ w_i p_i over priors of one family.
#[derive(Clone, Debug, PartialEq)]
pub struct Mixture {
    components: Vec<(f64, Prior)>,
}

/// Tolerance on Σ w = 1 for weights as typed.
const WEIGHT_SUM_TOL: f64 = 1e-9;

impl Mixture {
    /// A mixture; weights must be ≥ 0 and sum to 1, priors of one family.
    pub fn new(components: Vec<(f64, Prior)>) -> Result<Self> {
        let Some((_, first)) = components.first() else {
            return Err(Error::Rule(
                "a mixture needs at least one component".to_owned(),
            ));
        };
        for (i, (w, p)) in components.iter().enumerate() {
            if !(w.is_finite() && *w >= 0.0) {
                return Err(Error::invalid(
                    &format!("weight of component {}", i + 1),
                    *w,
                    "it must be 0 or more",
                ));
            }
            if p.id() != first.id() {
                return Err(Error::Rule(format!(
                    "component {} is {} but component 1 is {}: a mixture needs one family",
                    i + 1,
                    p.id(),
                    first.id()
                )));
            }
        }
        let total: f64 = components.iter().map(|(w, _)| w).sum();
        if (total - 1.0).abs() > WEIGHT_SUM_TOL {
            return Err(Error::Rule(format!(
                "mixture weights must sum to 1; they sum to {total}"
            )));
        }
        Ok(Self {
            components: components
                .into_iter()
                .map(|(w, p)| (w / total, p))
                .collect(),
        })
    }

    /// The components with their weights.
    pub fn components(&self) -> &[(f64, Prior)] {
        &self.components
    }

    /// The family id.
    pub fn id(&self) -> &'static str {
        self.components[0].1.id()
    }

    /// The logarithmic pool of the components, with the mixture weights.
    pub fn log_pool(&self) -> Result<Prior> {
        Prior::log_pool(&self.components)
    }

    /// Named marginal laws: each parameter's mixture over components.
    pub fn marginals(&self) -> Vec<(String, Law)> {
        let per: Vec<_> = self
            .components
            .iter()
            .map(|(w, p)| (*w, p.marginals()))
            .collect();
        let names: Vec<String> = per[0].1.iter().map(|m| m.name.clone()).collect();
        names
            .into_iter()
            .enumerate()
            .map(|(k, name)| {
                let parts = per
                    .iter()
                    .filter(|(w, _)| *w > 0.0)
                    .map(|(w, ms)| (*w, ms[k].distribution))
                    .collect();
                (name, Law::Mix(MixtureLaw::new(parts)))
            })
            .collect()
    }

    /// ln Σ w_i p(data | prior_i).
    pub fn ln_marginal_likelihood(&self, data: &Data) -> Result<f64> {
        let lns = self.component_lns(data)?;
        let top = lns.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        let sum: f64 = self
            .components
            .iter()
            .zip(&lns)
            .map(|((w, _), l)| w * (l - top).exp())
            .sum();
        Ok(top + sum.ln())
    }

    fn component_lns(&self, data: &Data) -> Result<Vec<f64>> {
        self.components
            .iter()
            .map(|(_, p)| p.ln_marginal_likelihood(data))
            .collect()
    }

    /// The posterior: each component updated, weights ∝ w_i p(data | prior_i).
    pub fn update(&self, data: &Data) -> Result<Mixture> {
        let lns = self.component_lns(data)?;
        let top = lns.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        let raw: Vec<f64> = self
            .components
            .iter()
            .zip(&lns)
            .map(|((w, _), l)| w * (l - top).exp())
            .collect();
        let total: f64 = raw.iter().sum();
        let components = self
            .components
            .iter()
            .zip(raw)
            .map(|((_, p), r)| Ok((r / total, p.update(data)?)))
            .collect::<Result<Vec<_>>>()?;
        Ok(Self { components })
    }

    /// Weighted share of the posterior information that came from the priors.
    pub fn prior_share(&self, data: &Data) -> Result<f64> {
        let post = self.update(data)?;
        post.components
            .iter()
            .zip(&self.components)
            .map(|((w, _), (_, p))| Ok(w * p.prior_share(data)?))
            .sum()
    }

    /// Conflict check under the mixture's prior predictive (tails mix linearly).
    pub fn conflict(&self, data: &Data) -> Result<Option<Conflict>> {
        let mut out: Option<Conflict> = None;
        for (w, p) in &self.components {
            let Some(c) = p.conflict(data)? else {
                return Ok(None);
            };
            out = Some(match out {
                None => Conflict {
                    lower_tail: w * c.lower_tail,
                    upper_tail: w * c.upper_tail,
                    ..c
                },
                Some(acc) => Conflict {
                    lower_tail: acc.lower_tail + w * c.lower_tail,
                    upper_tail: acc.upper_tail + w * c.upper_tail,
                    ..acc
                },
            });
        }
        Ok(out.map(|c| Conflict {
            p_value: (2.0 * c.lower_tail.min(c.upper_tail)).min(1.0),
            ..c
        }))
    }

    /// The mixture's predictive: components' predictives with the same weights.
    pub fn predictive(&self, future: &Future) -> Result<Vec<(f64, Predictive)>> {
        self.components
            .iter()
            .map(|(w, p)| Ok((*w, p.predictive(future)?)))
            .collect()
    }
}

/// A weighted mixture of count laws (the predictive of a mixture prior).
#[derive(Clone, Debug, PartialEq)]
pub struct CountMixture {
    /// (weight, law).
    pub parts: Vec<(f64, Discrete)>,
}

impl CountMixture {
    /// P(X = k).
    pub fn pmf(&self, k: u64) -> f64 {
        self.parts.iter().map(|(w, d)| w * d.pmf(k)).sum()
    }

    /// (P(X ≤ k), P(X > k)).
    pub fn tails(&self, k: u64) -> (f64, f64) {
        self.parts.iter().fold((0.0, 0.0), |(a, b), (w, d)| {
            let (x, y) = d.tails(k);
            (a + w * x, b + w * y)
        })
    }

    /// Mean.
    pub fn mean(&self) -> f64 {
        self.parts.iter().map(|(w, d)| w * d.mean()).sum()
    }

    /// Standard deviation.
    pub fn sd(&self) -> f64 {
        let m = self.mean();
        self.parts
            .iter()
            .map(|(w, d)| w * (d.sd().powi(2) + (d.mean() - m).powi(2)))
            .sum::<f64>()
            .sqrt()
    }

    /// Smallest k with P(X ≤ k) ≥ p: it lies between the parts' own quantiles.
    pub fn quantile(&self, p: f64) -> u64 {
        let qs: Vec<u64> = self.parts.iter().map(|(_, d)| d.quantile(p)).collect();
        let (lo, hi) = (
            qs.iter().copied().min().unwrap_or(0),
            qs.iter().copied().max().unwrap_or(0),
        );
        let q = 1.0 - p;
        crate::numeric::solve::first_true(
            |k| {
                if p <= 0.5 {
                    self.tails(k).0 >= p
                } else {
                    self.tails(k).1 <= q
                }
            },
            lo,
            hi,
            lo,
        )
    }
}

/// The belief mixed with a unit-information component at weight `w` (a
/// robust prior): the elicited part keeps 1 − w, split as before.
pub fn robust(belief: &super::Belief, w: f64) -> Result<Mixture> {
    crate::error::probability("robust weight", w)?;
    let (mut parts, centre): (Vec<(f64, Prior)>, Prior) = match belief {
        super::Belief::One(p) => (vec![(1.0 - w, p.clone())], p.clone()),
        super::Belief::Mix(m) => (
            m.components()
                .iter()
                .map(|(v, p)| ((1.0 - w) * v, p.clone()))
                .collect(),
            m.log_pool()?,
        ),
    };
    parts.push((w, centre.unit_information()?));
    Mixture::new(parts)
}
