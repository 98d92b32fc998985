//! Prior–data conflict: where the observed statistic falls in its prior
//! predictive distribution (Box, "Sampling and Bayes' inference in scientific
//! modelling and robustness", JRSS A 143, 1980).

use crate::distribution::{Continuous, Discrete};

/// Two-sided prior-predictive tail check of one statistic.
#[derive(Clone, Debug, PartialEq)]
pub struct Conflict {
    /// What the statistic is, in words.
    pub statistic: String,
    /// Its observed value.
    pub observed: f64,
    /// P(T ≤ t_obs) (mid-p: half the point mass left out, for counts).
    pub lower_tail: f64,
    /// P(T ≥ t_obs) (mid-p likewise).
    pub upper_tail: f64,
    /// min(1, 2 · min(lower, upper)).
    pub p_value: f64,
    /// Whether the tails are mid-p.
    pub mid_p: bool,
}

impl Conflict {
    pub(crate) fn from_tails(
        statistic: &str,
        observed: f64,
        lower: f64,
        upper: f64,
        mid_p: bool,
    ) -> Self {
        Self {
            statistic: statistic.to_owned(),
            observed,
            lower_tail: lower,
            upper_tail: upper,
            p_value: (2.0 * lower.min(upper)).min(1.0),
            mid_p,
        }
    }

    /// Mid-p tails of a count k under a discrete prior predictive.
    pub fn count(statistic: &str, k: u64, predictive: &Discrete) -> Self {
        let half = 0.5 * predictive.pmf(k);
        let (le, gt) = predictive.tails(k);
        // P(T ≤ k) − ½P(T = k) and P(T ≥ k) − ½P(T = k) = P(T > k) + ½P(T = k).
        Self::from_tails(statistic, k as f64, (le - half).max(0.0), gt + half, true)
    }

    /// Tails of a continuous statistic t.
    pub fn value(statistic: &str, t: f64, predictive: &Continuous) -> Self {
        let (lo, up) = predictive.tails(t);
        Self::from_tails(statistic, t, lo, up, false)
    }
}
