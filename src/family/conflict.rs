//! Prior–data conflict: where the observed statistic falls in its prior
//! predictive distribution (Box, "Sampling and Bayes' inference in scientific
//! modelling and robustness", JRSS A 143, 1980).

use crate::distribution::{Continuous, Discrete};
use crate::numeric::gamma::ln_gamma;

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

    /// A plain-words warning when the p-value is below `threshold`; None
    /// when the data sit comfortably inside what the prior predicted.
    pub fn warning(&self, threshold: f64) -> Option<String> {
        if self.p_value >= threshold {
            return None;
        }
        let side = if self.lower_tail < self.upper_tail {
            "lower"
        } else {
            "upper"
        };
        Some(format!(
            "Prior and data disagree: the observed {} ({}) lies in the {side} tail of what the prior predicted (p {}, below the threshold {}). Check the prior's reasoning and the data before relying on the posterior.",
            self.statistic,
            crate::family::words::short(self.observed),
            p_words(self.p_value),
            threshold
        ))
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

/// A p-value for a sentence: "= 0.012", or "< 0.001" when smaller.
pub fn p_words(p: f64) -> String {
    if p < 0.001 {
        "< 0.001".to_owned()
    } else {
        format!("= {p:.3}")
    }
}

/// Largest number of count vectors enumerated for the exact category check;
/// beyond it the scaled chi-square approximation is used (a few ms at most).
pub const EXACT_CATEGORY_LIMIT: f64 = 2.0e6;

impl Conflict {
    /// Category counts under a Dirichlet-multinomial prior predictive, with
    /// the Pearson-type statistic T = Σ (n_k − n m_k)² / (n m_k), m_k = α_k/α₀
    /// (the prior's mean shares).
    ///
    /// Exact with mid-p when the count vectors that sum to n are few enough
    /// to enumerate (C(n+K−1, K−1) ≤ [`EXACT_CATEGORY_LIMIT`]); otherwise T is
    /// referred to a chi-square with K − 1 degrees of freedom after dividing
    /// by the Dirichlet-multinomial inflation (n + α₀)/(1 + α₀) (Brier,
    /// Biometrika 67, 1980, 591–596, from memory). Under that predictive
    /// E T = (K − 1)(n + α₀)/(1 + α₀) exactly, so the scaling matches the mean.
    pub fn categories(alpha: &[f64], counts: &[u64]) -> Self {
        let k = alpha.len();
        let n: u64 = counts.iter().sum();
        let a0: f64 = alpha.iter().sum();
        let m: Vec<f64> = alpha.iter().map(|a| a / a0).collect();
        let nf = n as f64;
        let stat = |c: &[u64]| -> f64 {
            c.iter()
                .zip(&m)
                .map(|(&x, &mk)| {
                    let e = nf * mk;
                    (x as f64 - e).powi(2) / e
                })
                .sum()
        };
        let t = stat(counts);
        let name = "Pearson-type distance of the counts from the prior's mean shares";
        if n == 0 {
            return Self::from_tails(name, 0.0, 1.0, 1.0, true);
        }
        if compositions(n, k) <= EXACT_CATEGORY_LIMIT {
            let (below, at, above) = exact_tails(alpha, &m, n, t);
            return Self::from_tails(
                &format!("{name} (exact)"),
                t,
                (below + 0.5 * at).min(1.0),
                (above + 0.5 * at).min(1.0),
                true,
            );
        }
        let scale = (1.0 + a0) / (nf + a0);
        let chi = Continuous::Gamma {
            shape: 0.5 * (k as f64 - 1.0),
            rate: 0.5,
        };
        let (lo, up) = chi.tails(t * scale);
        Self::from_tails(
            &format!("{name} (scaled chi-square, {} df)", k - 1),
            t,
            lo,
            up,
            false,
        )
    }
}

/// C(n + k − 1, k − 1) as a float (the number of count vectors).
fn compositions(n: u64, k: usize) -> f64 {
    let r = (k - 1) as f64;
    (ln_gamma(n as f64 + r + 1.0) - ln_gamma(r + 1.0) - ln_gamma(n as f64 + 1.0)).exp()
}

/// P(T < t), P(T = t), P(T > t) under the Dirichlet-multinomial, by
/// walking every count vector. Ties are judged with a relative tolerance, as
/// T is a sum of floating-point terms.
fn exact_tails(alpha: &[f64], m: &[f64], n: u64, t: f64) -> (f64, f64, f64) {
    let k = alpha.len();
    let a0: f64 = alpha.iter().sum();
    let nf = n as f64;
    // ln of n!/Γ(n+α₀)·Γ(α₀) and, per category and count j, lnΓ(j+α_k) − lnΓ(α_k) − ln j!.
    let base = ln_gamma(nf + 1.0) + ln_gamma(a0) - ln_gamma(nf + a0);
    let terms: Vec<Vec<f64>> = alpha
        .iter()
        .map(|&a| {
            let la = ln_gamma(a);
            (0..=n)
                .map(|j| ln_gamma(j as f64 + a) - la - ln_gamma(j as f64 + 1.0))
                .collect()
        })
        .collect();
    let parts: Vec<Vec<f64>> = m
        .iter()
        .map(|&mk| {
            let e = nf * mk;
            (0..=n).map(|j| (j as f64 - e).powi(2) / e).collect()
        })
        .collect();
    let tol = 1e-9 * t.abs().max(1.0);
    let mut acc = (0.0, 0.0, 0.0);
    let mut walk = Walk {
        terms: &terms,
        parts: &parts,
        base,
        t,
        tol,
        acc: &mut acc,
    };
    walk.go(0, n, 0.0, 0.0, k);
    let total = acc.0 + acc.1 + acc.2;
    (acc.0 / total, acc.1 / total, acc.2 / total)
}

/// The recursion's fixed pieces.
struct Walk<'a> {
    terms: &'a [Vec<f64>],
    parts: &'a [Vec<f64>],
    base: f64,
    t: f64,
    tol: f64,
    acc: &'a mut (f64, f64, f64),
}

impl Walk<'_> {
    /// Category `c` onwards share `left` counts; `ln` and `s` are the log
    /// probability and the statistic so far.
    fn go(&mut self, c: usize, left: u64, ln: f64, s: f64, k: usize) {
        if c == k - 1 {
            let j = left as usize;
            let p = (self.base + ln + self.terms[c][j]).exp();
            let s = s + self.parts[c][j];
            if (s - self.t).abs() <= self.tol {
                self.acc.1 += p;
            } else if s < self.t {
                self.acc.0 += p;
            } else {
                self.acc.2 += p;
            }
            return;
        }
        for j in 0..=left {
            let ju = j as usize;
            self.go(
                c + 1,
                left - j,
                ln + self.terms[c][ju],
                s + self.parts[c][ju],
                k,
            );
        }
    }
}
