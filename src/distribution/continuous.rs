//! Continuous distributions of unknowns (and of continuous future data).
//!
//! Every quantile is found by inverting the tail on the side of the requested
//! probability (lower tail for p ≤ ½, upper tail otherwise), on the log scale of
//! the variable and of the tail probability, so tail quantiles keep relative
//! accuracy. Symmetric distributions are reduced to their positive half.

use super::guess;
use super::interval::{self, Interval, Shape};
use crate::numeric::gamma::{
    beta_kernel, ln_beta, ln_gamma, ln_gamma_ratio, poisson_kernel, stirling_correction_series,
};
use crate::numeric::incomplete::{beta_i, gamma_pq};
use crate::numeric::solve::increasing_root;
use std::f64::consts::PI;

/// Relative tolerance on log x in the quantile solvers.
const QUANTILE_TOL: f64 = 1e-14;
/// ln of the smallest normal double: the solvers' lower end on the log scale.
const LN_MIN: f64 = -708.0;
/// ln of (nearly) the largest double.
const LN_MAX: f64 = 709.0;

/// A continuous distribution with its parameters in conventional form.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Continuous {
    /// Beta(a, b) on (0, 1).
    Beta { a: f64, b: f64 },
    /// Gamma with shape and rate.
    Gamma { shape: f64, rate: f64 },
    /// Inverse gamma with shape and scale: density ∝ x^(−shape−1) e^(−scale/x).
    InvGamma { shape: f64, scale: f64 },
    /// √X for X ~ InvGamma(shape, scale): the standard deviation when the
    /// variance has an inverse-gamma law.
    SqrtInvGamma { shape: f64, scale: f64 },
    /// Normal with mean and standard deviation.
    Normal { mean: f64, sd: f64 },
    /// Student-t with `df` degrees of freedom, location and scale (sd-like).
    StudentT { df: f64, loc: f64, scale: f64 },
    /// Lomax (Pareto type II) with shape and scale: survival (1 + x/scale)^(−shape).
    Lomax { shape: f64, scale: f64 },
}

/// Solves tail(x) = target for x > 0, where `tail` returns (tail probability,
/// density) and the tail is the lower one (`upper == false`) or the upper one.
fn invert_positive(
    tail: impl Fn(f64) -> (f64, f64),
    upper: bool,
    target: f64,
    guess: f64,
    ln_hi: f64,
) -> f64 {
    let ln_target = target.ln();
    let g = |u: f64| {
        let x = u.exp();
        let (t, f) = tail(x);
        let lt = t.ln();
        let slope = f * x / t;
        if upper {
            (ln_target - lt, slope)
        } else {
            (lt - ln_target, slope)
        }
    };
    let start = if guess > 0.0 && guess.is_finite() {
        guess.ln()
    } else {
        0.0_f64.min(ln_hi)
    };
    let u = increasing_root(g, LN_MIN, ln_hi, start, QUANTILE_TOL);
    if u <= LN_MIN + 1e-6 {
        // The root lies below the smallest double.
        0.0
    } else if ln_hi >= LN_MAX && u >= LN_MAX - 1e-6 {
        // The root lies beyond the largest double.
        f64::INFINITY
    } else {
        u.exp()
    }
}

/// Incomplete gamma at z given also as ln z: below 1e-300, where z itself may
/// underflow, P(a, z) = z^a / Γ(a+1) to double precision.
fn gamma_pq_ln(a: f64, ln_z: f64, z: f64) -> (f64, f64) {
    if z < 1e-300 {
        let p = (a * ln_z - ln_gamma(a + 1.0)).exp();
        (p, 1.0 - p)
    } else {
        gamma_pq(a, z)
    }
}

/// ln of the unit-rate gamma quantile on the given tail.
///
/// Where the quantile is below the smallest double (tiny shapes), the lower
/// tail is exactly x^a/Γ(a+1) to double precision, so its log is solved in
/// closed form: that keeps 1/x and √(1/x) (inverse-gamma laws) representable.
fn gamma_unit_ln_quantile(shape: f64, prob: f64, upper: bool) -> f64 {
    let z = if upper {
        guess::normal_upper_point(prob)
    } else {
        -guess::normal_upper_point(prob)
    };
    // Wilson–Hilferty, or the small-x power law when it fails.
    let wh = {
        let c = 1.0 - 1.0 / (9.0 * shape) + z / (3.0 * shape.sqrt());
        shape * c * c * c
    };
    let start = if wh > 0.0 && shape >= 1.0 {
        wh
    } else if !upper {
        ((prob.ln() + ln_gamma(shape + 1.0)) / shape).exp()
    } else {
        shape.max(1.0) - prob.ln()
    };
    let tail = |x: f64| {
        let (p, q) = gamma_pq(shape, x);
        let f = shape * poisson_kernel(shape, x) / x;
        (if upper { q } else { p }, f)
    };
    let x = invert_positive(tail, upper, prob, start, LN_MAX);
    if x > 1e-300 {
        return x.ln();
    }
    let ln_lower = if upper { (-prob).ln_1p() } else { prob.ln() };
    (ln_lower + ln_gamma(shape + 1.0)) / shape
}

/// Beta(a, b) quantile at p, with q = 1 − p.
///
/// Solved for x when the answer lies in (0, ½] and for y = 1 − x under
/// Beta(b, a) otherwise, so the small variable is always the one solved for.
fn beta_quantile(a: f64, b: f64, p: f64, q: f64) -> f64 {
    let (below_half, _) = beta_i(a, b, 0.5, 0.5);
    if p <= below_half {
        beta_small_quantile(a, b, p, q)
    } else {
        1.0 - beta_small_quantile(b, a, q, p)
    }
}

/// Beta(a, b) quantile known to lie in (0, ½]: p = P(X ≤ x), q = 1 − p; the
/// tail solved is the smaller of the two.
fn beta_small_quantile(a: f64, b: f64, p: f64, q: f64) -> f64 {
    let upper = p > 0.5;
    let prob = if upper { q } else { p };
    let mean = a / (a + b);
    let sd = (a * b / (a + b + 1.0)).sqrt() / (a + b);
    let normal = mean + guess::normal_quantile(p) * sd;
    let power = ((p.ln() + a.ln() + ln_beta(a, b)) / a).exp();
    let start = if a >= 1.0 && b >= 1.0 && normal > 0.0 && normal < 0.5 {
        normal
    } else {
        power.min(0.25)
    };
    let tail = |x: f64| {
        let y = 1.0 - x;
        let (lo, up) = beta_i(a, b, x, y);
        (
            if upper { up } else { lo },
            beta_kernel(a, b, x, y) / (x * y),
        )
    };
    invert_positive(tail, upper, prob, start, 0.5f64.ln()).min(0.5)
}

/// Standard Student-t upper-tail probability at t ≥ 0 and the density there.
fn student_upper(df: f64, t: f64) -> (f64, f64) {
    if t > 1e150 {
        // x = ν/(ν+t²) < 1e-290: I_x(ν/2, ½) is its leading series term
        // x^(ν/2) / ((ν/2) B(ν/2, ½)) to double precision; taken in logs.
        let a = 0.5 * df;
        let ln_x = df.ln() - 2.0 * t.ln();
        let tail = 0.5 * (a * ln_x - a.ln() - ln_beta(a, 0.5)).exp();
        return (tail, student_density(df, t));
    }
    let (x, y) = {
        let t2 = t * t;
        (df / (df + t2), t2 / (df + t2))
    };
    let (tail, _) = beta_i(0.5 * df, 0.5, x, y);
    (0.5 * tail, student_density(df, t))
}

fn student_density(df: f64, t: f64) -> f64 {
    let ln = ln_gamma_ratio(0.5 * df, 0.5)
        - 0.5 * (df * PI).ln()
        - 0.5 * (df + 1.0) * (t / df.sqrt()).powi(2).ln_1p();
    ln.exp()
}

/// Standard normal upper tail at z ≥ 0 (through Q(½, z²/2) = erfc(z/√2)) and density.
fn normal_upper(z: f64) -> (f64, f64) {
    let (_, q) = gamma_pq(0.5, 0.5 * z * z);
    (0.5 * q, (-0.5 * z * z).exp() / (2.0 * PI).sqrt())
}

/// Quantile of a distribution symmetric about 0, from its upper tail on [0, ∞).
fn symmetric_quantile(upper: impl Fn(f64) -> (f64, f64), p: f64, guess: f64) -> f64 {
    if p == 0.5 {
        return 0.0;
    }
    let (tail_p, sign) = if p < 0.5 { (p, -1.0) } else { (1.0 - p, 1.0) };
    sign * invert_positive(upper, true, tail_p, guess.abs(), LN_MAX)
}

impl Continuous {
    /// Lower and upper end of the support.
    pub fn support(&self) -> (f64, f64) {
        match self {
            Self::Beta { .. } => (0.0, 1.0),
            Self::Normal { .. } | Self::StudentT { .. } => (f64::NEG_INFINITY, f64::INFINITY),
            _ => (0.0, f64::INFINITY),
        }
    }

    /// (P(X ≤ x), P(X > x)), each computed directly where it is the small one.
    pub fn tails(&self, x: f64) -> (f64, f64) {
        match *self {
            Self::Beta { a, b } => {
                if x <= 0.0 {
                    (0.0, 1.0)
                } else if x >= 1.0 {
                    (1.0, 0.0)
                } else {
                    beta_i(a, b, x, 1.0 - x)
                }
            }
            Self::Gamma { shape, rate } => gamma_pq(shape, rate * x),
            Self::InvGamma { shape, scale } => {
                if x <= 0.0 {
                    return (0.0, 1.0);
                }
                let (p, q) = gamma_pq_ln(shape, scale.ln() - x.ln(), scale / x);
                (q, p)
            }
            Self::SqrtInvGamma { shape, scale } => {
                if x <= 0.0 {
                    return (0.0, 1.0);
                }
                let (p, q) = gamma_pq_ln(shape, scale.ln() - 2.0 * x.ln(), scale / x / x);
                (q, p)
            }
            Self::Normal { mean, sd } => {
                let z = (x - mean) / sd;
                let (up, _) = normal_upper(z.abs());
                if z < 0.0 {
                    (up, 1.0 - up)
                } else {
                    (1.0 - up, up)
                }
            }
            Self::StudentT { df, loc, scale } => {
                let t = (x - loc) / scale;
                let (up, _) = student_upper(df, t.abs());
                if t < 0.0 {
                    (up, 1.0 - up)
                } else {
                    (1.0 - up, up)
                }
            }
            Self::Lomax { shape, scale } => {
                if x <= 0.0 {
                    return (0.0, 1.0);
                }
                let l = -shape * (x / scale).ln_1p();
                (-l.exp_m1(), l.exp())
            }
        }
    }

    /// P(X ≤ x).
    pub fn cdf(&self, x: f64) -> f64 {
        self.tails(x).0
    }

    /// P(X > x).
    pub fn sf(&self, x: f64) -> f64 {
        self.tails(x).1
    }

    /// Density at x (+∞ where it is unbounded, at a support end).
    pub fn pdf(&self, x: f64) -> f64 {
        let (lo, hi) = self.support();
        if x < lo || x > hi {
            return 0.0;
        }
        match *self {
            Self::Beta { a, b } => {
                if x == 0.0 {
                    return edge_density(a, b);
                }
                if x == 1.0 {
                    return edge_density(b, a);
                }
                let y = 1.0 - x;
                beta_kernel(a, b, x, y) / (x * y)
            }
            Self::Gamma { shape, rate } => {
                if x == 0.0 {
                    return edge_density(shape, rate);
                }
                let z = rate * x;
                rate * shape * poisson_kernel(shape, z) / z
            }
            Self::InvGamma { shape, scale } => {
                if x == 0.0 {
                    return 0.0;
                }
                shape * poisson_kernel(shape, scale / x) / x
            }
            Self::SqrtInvGamma { shape, scale } => {
                if x == 0.0 {
                    return 0.0;
                }
                2.0 * shape * poisson_kernel(shape, scale / x / x) / x
            }
            Self::Normal { mean, sd } => normal_upper((x - mean) / sd).1 / sd,
            Self::StudentT { df, loc, scale } => student_density(df, (x - loc) / scale) / scale,
            Self::Lomax { shape, scale } => {
                shape / scale * (-(shape + 1.0) * (x / scale).ln_1p()).exp()
            }
        }
    }

    /// d ln f / dx, used to place the ends of highest-density intervals.
    pub fn ln_pdf_slope(&self, x: f64) -> f64 {
        match *self {
            Self::Beta { a, b } => (a - 1.0) / x - (b - 1.0) / (1.0 - x),
            Self::Gamma { shape, rate } => (shape - 1.0) / x - rate,
            Self::InvGamma { shape, scale } => -(shape + 1.0) / x + scale / (x * x),
            Self::SqrtInvGamma { shape, scale } => {
                -(2.0 * shape + 1.0) / x + 2.0 * scale / (x * x * x)
            }
            Self::Normal { mean, sd } => -(x - mean) / (sd * sd),
            Self::StudentT { df, loc, scale } => {
                let d = x - loc;
                -(df + 1.0) * d / (df * scale * scale + d * d)
            }
            Self::Lomax { shape, scale } => -(shape + 1.0) / (scale + x),
        }
    }

    /// The p-quantile, 0 ≤ p ≤ 1 (support ends at 0 and 1).
    pub fn quantile(&self, p: f64) -> f64 {
        let (lo, hi) = self.support();
        if p <= 0.0 {
            return lo;
        }
        if p >= 1.0 {
            return hi;
        }
        let q = 1.0 - p;
        match *self {
            Self::Beta { a, b } => beta_quantile(a, b, p, q),
            Self::Gamma { shape, rate } => {
                let ln_z = if p <= 0.5 {
                    gamma_unit_ln_quantile(shape, p, false)
                } else {
                    gamma_unit_ln_quantile(shape, q, true)
                };
                ln_z.exp() / rate
            }
            Self::InvGamma { shape, scale } => scale * (-inv_gamma_unit_ln(shape, p)).exp(),
            Self::SqrtInvGamma { shape, scale } => {
                scale.sqrt() * (-0.5 * inv_gamma_unit_ln(shape, p)).exp()
            }
            Self::Normal { mean, sd } => {
                mean + sd * symmetric_quantile(normal_upper, p, guess::normal_quantile(p))
            }
            Self::StudentT { df, loc, scale } => {
                let z = guess::normal_quantile(p);
                let start = z * (1.0 + (z * z + 1.0) / (4.0 * df));
                loc + scale * symmetric_quantile(|t| student_upper(df, t), p, start)
            }
            Self::Lomax { shape, scale } => {
                // Closed form: x = scale · (q^(−1/shape) − 1).
                let ln_q = if p <= 0.5 { (-p).ln_1p() } else { q.ln() };
                scale * (-ln_q / shape).exp_m1()
            }
        }
    }

    /// The mean, where it exists.
    pub fn mean(&self) -> Option<f64> {
        match *self {
            Self::Beta { a, b } => Some(a / (a + b)),
            Self::Gamma { shape, rate } => Some(shape / rate),
            Self::InvGamma { shape, scale } => (shape > 1.0).then(|| scale / (shape - 1.0)),
            Self::SqrtInvGamma { shape, scale } => {
                (shape > 0.5).then(|| scale.sqrt() * ln_gamma_ratio(shape, -0.5).exp())
            }
            Self::Normal { mean, .. } => Some(mean),
            Self::StudentT { df, loc, .. } => (df > 1.0).then_some(loc),
            Self::Lomax { shape, scale } => (shape > 1.0).then(|| scale / (shape - 1.0)),
        }
    }

    /// The standard deviation, where it exists.
    pub fn sd(&self) -> Option<f64> {
        match *self {
            Self::Beta { a, b } => Some((a * b / (a + b + 1.0)).sqrt() / (a + b)),
            Self::Gamma { shape, rate } => Some(shape.sqrt() / rate),
            Self::InvGamma { shape, scale } => {
                (shape > 2.0).then(|| scale / ((shape - 1.0) * (shape - 2.0).sqrt()))
            }
            Self::SqrtInvGamma { shape, scale } => (shape > 1.0)
                .then(|| (scale / (shape - 1.0) * sqrt_inv_gamma_var_factor(shape)).sqrt()),
            Self::Normal { sd, .. } => Some(sd),
            Self::StudentT { df, scale, .. } => {
                (df > 2.0).then(|| scale * (df / (df - 2.0)).sqrt())
            }
            Self::Lomax { shape, scale } => {
                (shape > 2.0).then(|| scale * (shape / (shape - 2.0)).sqrt() / (shape - 1.0))
            }
        }
    }

    /// The median.
    pub fn median(&self) -> f64 {
        self.quantile(0.5)
    }

    /// How the density behaves: decides the mode and the highest-density set.
    pub fn shape(&self) -> Shape {
        match *self {
            Self::Beta { a, b } => {
                if a < 1.0 && b < 1.0 {
                    Shape::UShaped
                } else if a == 1.0 && b == 1.0 {
                    Shape::Flat
                } else if a <= 1.0 && b >= 1.0 {
                    Shape::Decreasing
                } else if a >= 1.0 && b <= 1.0 {
                    Shape::Increasing
                } else {
                    Shape::Unimodal
                }
            }
            Self::Gamma { shape, .. } => {
                if shape <= 1.0 {
                    Shape::Decreasing
                } else {
                    Shape::Unimodal
                }
            }
            Self::InvGamma { .. } | Self::SqrtInvGamma { .. } => Shape::Unimodal,
            Self::Normal { .. } | Self::StudentT { .. } => Shape::Symmetric,
            Self::Lomax { .. } => Shape::Decreasing,
        }
    }

    /// The mode, or `None` where the density is unbounded or has no single peak.
    pub fn mode(&self) -> Option<f64> {
        match *self {
            Self::Beta { a, b } => match self.shape() {
                Shape::Unimodal => Some((a - 1.0) / (a + b - 2.0)),
                Shape::Decreasing if a == 1.0 => Some(0.0),
                Shape::Increasing if b == 1.0 => Some(1.0),
                _ => None,
            },
            Self::Gamma { shape, rate } => (shape >= 1.0).then(|| (shape - 1.0) / rate),
            Self::InvGamma { shape, scale } => Some(scale / (shape + 1.0)),
            Self::SqrtInvGamma { shape, scale } => Some((2.0 * scale / (2.0 * shape + 1.0)).sqrt()),
            Self::Normal { mean, .. } => Some(mean),
            Self::StudentT { loc, .. } => Some(loc),
            Self::Lomax { .. } => Some(0.0),
        }
    }

    /// Equal-tailed interval holding `level` of the mass.
    pub fn central_interval(&self, level: f64) -> Interval {
        let tail = 0.5 * (1.0 - level);
        Interval::single(level, self.quantile(tail), self.quantile(1.0 - tail))
    }

    /// Shortest set holding `level` of the mass (one or two pieces).
    pub fn hpd_interval(&self, level: f64) -> Interval {
        interval::highest_density(self, level)
    }

    /// The distribution's name as used in output.
    pub fn name(&self) -> &'static str {
        match self {
            Self::Beta { .. } => "beta",
            Self::Gamma { .. } => "gamma",
            Self::InvGamma { .. } => "inverse-gamma",
            Self::SqrtInvGamma { .. } => "square-root-inverse-gamma",
            Self::Normal { .. } => "normal",
            Self::StudentT { .. } => "student-t",
            Self::Lomax { .. } => "lomax",
        }
    }

    /// Named parameters, for output.
    pub fn parameters(&self) -> Vec<(&'static str, f64)> {
        match *self {
            Self::Beta { a, b } => vec![("alpha", a), ("beta", b)],
            Self::Gamma { shape, rate } => vec![("shape", shape), ("rate", rate)],
            Self::InvGamma { shape, scale } | Self::SqrtInvGamma { shape, scale } => {
                vec![("shape", shape), ("scale", scale)]
            }
            Self::Normal { mean, sd } => vec![("mean", mean), ("sd", sd)],
            Self::StudentT { df, loc, scale } => {
                vec![("df", df), ("location", loc), ("scale", scale)]
            }
            Self::Lomax { shape, scale } => vec![("shape", shape), ("scale", scale)],
        }
    }
}

/// Density at the left end of a law whose density there behaves like x^(a−1):
/// +∞, the finite `at_one` value for a = 1, or 0.
fn edge_density(a: f64, at_one: f64) -> f64 {
    if a < 1.0 {
        f64::INFINITY
    } else if a == 1.0 {
        at_one
    } else {
        0.0
    }
}

/// ln z of the gamma point z with x = scale / z for the inverse-gamma
/// p-quantile: the p-quantile of 1/Z is 1 over the upper-p point of Z.
fn inv_gamma_unit_ln(shape: f64, p: f64) -> f64 {
    if p <= 0.5 {
        gamma_unit_ln_quantile(shape, p, true)
    } else {
        gamma_unit_ln_quantile(shape, 1.0 - p, false)
    }
}

/// 1 − (α−1)·r², r = Γ(α−½)/Γ(α): Var(σ) = scale/(α−1) times this factor.
///
/// For large α the factor is about 1/(4α) and a direct evaluation would lose
/// about log10(α) digits; there the exponent is expanded so that the O(1) terms
/// cancel analytically (h = 1/(2α), ln((1−2h)/(1−h)²) = log1p(−(h/(1−h))²)).
fn sqrt_inv_gamma_var_factor(alpha: f64) -> f64 {
    let e = if alpha < 50.0 {
        (alpha - 1.0).ln() + 2.0 * ln_gamma_ratio(alpha, -0.5)
    } else {
        let h = 0.5 / alpha;
        let r = h / (1.0 - h);
        let mut series = 0.0;
        let mut pow = h;
        for k in 2..60 {
            let term = pow / f64::from(k);
            series += term;
            if term < 1e-18 * series {
                break;
            }
            pow *= h;
        }
        // Stirling corrections of ln Γ(α − ½) − ln Γ(α), which are O(1/α²).
        let dc = stirling_correction_series(alpha - 0.5) - stirling_correction_series(alpha);
        (-r * r).ln_1p() - series + 2.0 * dc
    };
    -e.exp_m1()
}
