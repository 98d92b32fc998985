//! One unknown's distribution as the summaries see it: a single conjugate
//! marginal, or a mixture of them (linear pools, robust priors).

use super::interval::{Interval, Shape};
use super::{Continuous, MixtureLaw};

/// A single law or a mixture.
#[derive(Clone, Debug, PartialEq)]
pub enum Law {
    /// One conjugate marginal.
    One(Continuous),
    /// A weighted mixture of marginals of one family.
    Mix(MixtureLaw),
}

impl Law {
    /// Name for output.
    pub fn name(&self) -> &'static str {
        match self {
            Self::One(d) => d.name(),
            Self::Mix(_) => "mixture",
        }
    }

    /// (P(X ≤ x), P(X > x)).
    pub fn tails(&self, x: f64) -> (f64, f64) {
        match self {
            Self::One(d) => d.tails(x),
            Self::Mix(m) => m.tails(x),
        }
    }

    /// Density.
    pub fn pdf(&self, x: f64) -> f64 {
        match self {
            Self::One(d) => d.pdf(x),
            Self::Mix(m) => m.pdf(x),
        }
    }

    /// p-quantile started near `hint`.
    pub fn quantile_near(&self, p: f64, hint: Option<f64>) -> f64 {
        match self {
            Self::One(d) => d.quantile_near(p, hint),
            Self::Mix(m) => m.quantile_near(p, hint),
        }
    }

    /// Mean, where it exists.
    pub fn mean(&self) -> Option<f64> {
        match self {
            Self::One(d) => d.mean(),
            Self::Mix(m) => m.mean(),
        }
    }

    /// Standard deviation, where it exists.
    pub fn sd(&self) -> Option<f64> {
        match self {
            Self::One(d) => d.sd(),
            Self::Mix(m) => m.sd(),
        }
    }

    /// Mode, where the density has a bounded highest point.
    pub fn mode(&self) -> Option<f64> {
        match self {
            Self::One(d) => d.mode(),
            Self::Mix(m) => m.mode(),
        }
    }

    /// Highest-density set, started from the central interval where that helps.
    pub fn hpd_interval(&self, level: f64, central: &Interval) -> Interval {
        match self {
            Self::One(d) if d.shape() == Shape::Symmetric => central.clone(),
            Self::One(d) => d.hpd_interval_near(level, central),
            Self::Mix(m) => m.hpd_interval(level),
        }
    }
}
