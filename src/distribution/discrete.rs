//! Count distributions of future data: beta-binomial and negative binomial.

use super::guess;
use crate::numeric::gamma::{beta_kernel, ln_gamma, ln_gamma_ratio};
use crate::numeric::incomplete::beta_i;
use crate::numeric::solve::first_true;

/// A distribution on 0, 1, 2, … (up to `n` for the beta-binomial).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Discrete {
    /// Successes in `n` trials with a Beta(a, b) success probability.
    BetaBinomial { n: u64, a: f64, b: f64 },
    /// Failures before the r-th success with success probability p; q = 1 − p
    /// is kept separately so a p near 1 loses nothing.
    NegBinomial { r: f64, p: f64, q: f64 },
}

/// Largest count the negative-binomial quantile search will report.
const COUNT_CAP: u64 = 1 << 53;

impl Discrete {
    /// Negative binomial from a gamma(shape α, rate β) rate and exposure t:
    /// r = α, p = β/(β + t).
    pub fn gamma_poisson(alpha: f64, beta: f64, exposure: f64) -> Self {
        let s = beta + exposure;
        Self::NegBinomial {
            r: alpha,
            p: beta / s,
            q: exposure / s,
        }
    }

    /// Natural log of P(X = k).
    pub fn ln_pmf(&self, k: u64) -> f64 {
        match *self {
            Self::BetaBinomial { n, a, b } => {
                if k > n {
                    return f64::NEG_INFINITY;
                }
                let (kf, nf) = (k as f64, n as f64);
                let lchoose = ln_gamma(nf + 1.0) - ln_gamma(kf + 1.0) - ln_gamma(nf - kf + 1.0);
                lchoose + ln_gamma_ratio(a, kf) + ln_gamma_ratio(b, nf - kf)
                    - ln_gamma_ratio(a + b, nf)
            }
            Self::NegBinomial { .. } => self.pmf(k).ln(),
        }
    }

    /// P(X = k).
    pub fn pmf(&self, k: u64) -> f64 {
        match *self {
            Self::BetaBinomial { .. } => self.ln_pmf(k).exp(),
            Self::NegBinomial { r, p, q } => {
                if k == 0 {
                    let ln_p = if p > 0.5 { (-q).ln_1p() } else { p.ln() };
                    (r * ln_p).exp()
                } else {
                    // Γ(r+k)/(Γ(r) k!) p^r q^k = [p^r q^k / B(r, k)] / k.
                    beta_kernel(r, k as f64, p, q) / k as f64
                }
            }
        }
    }

    /// (P(X ≤ k), P(X > k)), the smaller one summed or computed directly.
    pub fn tails(&self, k: u64) -> (f64, f64) {
        match *self {
            Self::NegBinomial { r, p, q } => beta_i(r, k as f64 + 1.0, p, q),
            Self::BetaBinomial { n, a, b } => {
                if k >= n {
                    return (1.0, 0.0);
                }
                let nf = n as f64;
                let mean = nf * a / (a + b);
                if (k as f64) <= mean {
                    // Sum P(X = j) for j = k, k−1, …, 0 by the pmf ratio.
                    let mut term = self.pmf(k);
                    let mut sum = term;
                    let mut j = k;
                    let mut prev = term;
                    while j > 0 {
                        let jf = j as f64;
                        term *= jf * (nf - jf + b) / ((nf - jf + 1.0) * (jf - 1.0 + a));
                        sum += term;
                        j -= 1;
                        if term <= prev && term < 1e-18 * sum {
                            break;
                        }
                        prev = term;
                    }
                    let lower = sum.min(1.0);
                    (lower, 1.0 - lower)
                } else {
                    // Sum P(X = j) for j = k+1, …, n.
                    let mut j = k + 1;
                    let mut term = self.pmf(j);
                    let mut sum = term;
                    let mut prev = term;
                    while j < n {
                        let jf = j as f64;
                        term *= (nf - jf) * (jf + a) / ((jf + 1.0) * (nf - jf - 1.0 + b));
                        sum += term;
                        j += 1;
                        if term <= prev && term < 1e-18 * sum {
                            break;
                        }
                        prev = term;
                    }
                    let upper = sum.min(1.0);
                    (1.0 - upper, upper)
                }
            }
        }
    }

    /// P(X ≤ k).
    pub fn cdf(&self, k: u64) -> f64 {
        self.tails(k).0
    }

    /// Mean.
    pub fn mean(&self) -> f64 {
        match *self {
            Self::BetaBinomial { n, a, b } => n as f64 * a / (a + b),
            Self::NegBinomial { r, p, q } => r * q / p,
        }
    }

    /// Standard deviation.
    pub fn sd(&self) -> f64 {
        match *self {
            Self::BetaBinomial { n, a, b } => {
                let nf = n as f64;
                let s = a + b;
                (nf * a * b * (s + nf) / (s + 1.0)).sqrt() / s
            }
            Self::NegBinomial { r, p, q } => (r * q).sqrt() / p,
        }
    }

    /// Smallest k with P(X ≤ k) ≥ p, for 0 < p < 1.
    pub fn quantile(&self, p: f64) -> u64 {
        let hi = match *self {
            Self::BetaBinomial { n, .. } => n,
            Self::NegBinomial { .. } => COUNT_CAP,
        };
        let z = guess::normal_quantile(p.clamp(1e-300, 1.0 - 1e-16));
        let g = (self.mean() + z * self.sd()).max(0.0).min(hi as f64);
        let start = g as u64;
        if p <= 0.5 {
            first_true(|k| self.tails(k).0 >= p, 0, hi, start)
        } else {
            // P(X ≤ k) ≥ p  ⟺  P(X > k) ≤ 1 − p, compared on the small tail.
            let q = 1.0 - p;
            first_true(|k| self.tails(k).1 <= q, 0, hi, start)
        }
    }

    /// The distribution's name as used in output.
    pub fn name(&self) -> &'static str {
        match self {
            Self::BetaBinomial { .. } => "beta-binomial",
            Self::NegBinomial { .. } => "negative-binomial",
        }
    }

    /// Named parameters, for output.
    pub fn parameters(&self) -> Vec<(&'static str, f64)> {
        match *self {
            Self::BetaBinomial { n, a, b } => vec![("n", n as f64), ("alpha", a), ("beta", b)],
            Self::NegBinomial { r, p, .. } => vec![("r", r), ("p", p)],
        }
    }
}
