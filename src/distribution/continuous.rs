//! Continuous distributions of unknowns (and of continuous future data).
//!
//! Every quantile is found by inverting the tail on the side of the requested
//! probability (lower tail for p ≤ ½, upper tail otherwise), on the log scale of
//! the variable and of the tail probability, so tail quantiles keep relative
//! accuracy. Symmetric distributions are reduced to their positive half.

use super::guess;
use super::interval::{self, Interval, Shape};
use crate::numeric::gamma::{
    BetaKernel, PoissonKernel, beta_kernel, ln_beta, ln_gamma, ln_gamma_ratio, poisson_kernel,
    stirling_correction_series,
};
use crate::numeric::incomplete::{beta_i, beta_i_with, gamma_pq, gamma_pq_with};
use crate::numeric::solve::increasing_root_halley;
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

/// What a tail solver needs at x: the tail probability, the density and the
/// slope of the log-density, d ln f / dx.
type TailPoint = (f64, f64, f64);

/// Solves tail(x) = target for x > 0; the tail is the lower one (`upper ==
/// false`) or the upper one. Halley steps on g(u) = ±(ln tail(e^u) − ln target):
/// with r = f x / tail, g′ = r and g″ = r (1 + x (ln f)′) ∓ r².
fn invert_positive(
    tail: impl Fn(f64) -> TailPoint,
    upper: bool,
    target: f64,
    guess: f64,
    ln_hi: f64,
) -> f64 {
    let ln_target = target.ln();
    let g = |u: f64| {
        let x = u.exp();
        let (t, f, s) = tail(x);
        let lt = t.ln();
        let r = f * x / t;
        let curve = r * (1.0 + x * s);
        if upper {
            (ln_target - lt, r, curve + r * r)
        } else {
            (lt - ln_target, r, curve - r * r)
        }
    };
    let start = if guess > 0.0 && guess.is_finite() {
        guess.ln()
    } else {
        0.0_f64.min(ln_hi)
    };
    let u = increasing_root_halley(g, LN_MIN, ln_hi, start, QUANTILE_TOL);
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
fn gamma_unit_ln_quantile(shape: f64, prob: f64, upper: bool, hint: Option<f64>) -> f64 {
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
    let start = if let Some(h) = hint.filter(|h| *h > 0.0 && h.is_finite()) {
        h
    } else if wh > 0.0 && shape >= 1.0 {
        wh
    } else if !upper {
        ((prob.ln() + ln_gamma(shape + 1.0)) / shape).exp()
    } else {
        shape.max(1.0) - prob.ln()
    };
    let kernel = PoissonKernel::new(shape);
    let tail = |x: f64| {
        let k = kernel.eval(x);
        let (p, q) = gamma_pq_with(shape, x, k);
        (
            if upper { q } else { p },
            shape * k / x,
            (shape - 1.0) / x - 1.0,
        )
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
fn beta_quantile(a: f64, b: f64, p: f64, q: f64, hint: Option<f64>) -> f64 {
    // A hint well away from ½ tells the side without evaluating F(½).
    let small_side = match hint {
        Some(h) if h < 0.4 => true,
        Some(h) if h > 0.6 => false,
        _ => p <= beta_i(a, b, 0.5, 0.5).0,
    };
    if small_side {
        beta_small_quantile(a, b, p, q, hint)
    } else {
        1.0 - beta_small_quantile(b, a, q, p, hint.map(|h| 1.0 - h))
    }
}

/// Beta(a, b) quantile known to lie in (0, ½]: p = P(X ≤ x), q = 1 − p; the
/// tail solved is the smaller of the two.
fn beta_small_quantile(a: f64, b: f64, p: f64, q: f64, hint: Option<f64>) -> f64 {
    let upper = p > 0.5;
    let prob = if upper { q } else { p };
    let mean = a / (a + b);
    let sd = (a * b / (a + b + 1.0)).sqrt() / (a + b);
    let normal = mean + guess::normal_quantile(p) * sd;
    let power = ((p.ln() + a.ln() + ln_beta(a, b)) / a).exp();
    let start = match hint {
        Some(h) if h > 0.0 && h < 0.5 => h,
        _ if a >= 1.0 && b >= 1.0 && normal > 0.0 && normal < 0.5 => normal,
        _ => power.min(0.25),
    };
    let kernel = BetaKernel::new(a, b);
    let tail = |x: f64| {
        let y = 1.0 - x;
        let k = kernel.eval(x, y);
        let (lo, up) = beta_i_with(a, b, x, y, k);
        (
            if upper { up } else { lo },
            k / (x * y),
            (a - 1.0) / x - (b - 1.0) / y,
        )
    };
    invert_positive(tail, upper, prob, start, 0.5f64.ln()).min(0.5)
}

/// Constants of a standard Student-t with `df` degrees of freedom, computed
/// once per quantile search.
#[derive(Clone, Copy)]
struct Student {
    df: f64,
    kernel: BetaKernel,
    ln_beta: f64,
    ln_density_const: f64,
}

impl Student {
    fn new(df: f64) -> Self {
        let a = 0.5 * df;
        Self {
            df,
            kernel: BetaKernel::new(a, 0.5),
            ln_beta: ln_beta(a, 0.5),
            ln_density_const: ln_gamma_ratio(a, 0.5) - 0.5 * (df * PI).ln(),
        }
    }

    /// Upper-tail probability at t ≥ 0, density, and slope of the log-density.
    fn upper(&self, t: f64) -> TailPoint {
        let df = self.df;
        let slope = -(df + 1.0) * t / (df + t * t);
        let a = 0.5 * df;
        if t > 1e150 {
            // x = ν/(ν+t²) < 1e-290: I_x(ν/2, ½) is its leading series term
            // x^(ν/2) / ((ν/2) B(ν/2, ½)) to double precision; taken in logs.
            let ln_x = df.ln() - 2.0 * t.ln();
            let tail = 0.5 * (a * ln_x - a.ln() - self.ln_beta).exp();
            return (tail, self.density(t), slope);
        }
        let t2 = t * t;
        let (x, y) = (df / (df + t2), t2 / (df + t2));
        let (tail, _) = beta_i_with(a, 0.5, x, y, self.kernel.eval(x, y));
        (0.5 * tail, self.density(t), slope)
    }

    fn density(&self, t: f64) -> f64 {
        (self.ln_density_const - 0.5 * (self.df + 1.0) * (t / self.df.sqrt()).powi(2).ln_1p()).exp()
    }
}

/// Standard normal upper tail at z ≥ 0 (through Q(½, z²/2) = erfc(z/√2)),
/// density, and slope of the log-density.
fn normal_upper(z: f64) -> TailPoint {
    let w = 0.5 * z * z;
    // Poisson kernel w^½ e^{−w} / Γ(3/2), Γ(3/2) = √π / 2.
    let kernel = 2.0 * (w.sqrt() * (-w).exp()) / PI.sqrt();
    let (_, q) = gamma_pq_with(0.5, w, kernel);
    (0.5 * q, (-w).exp() / (2.0 * PI).sqrt(), -z)
}

/// Quantile of a distribution symmetric about 0, from its upper tail on [0, ∞).
fn symmetric_quantile(upper: impl Fn(f64) -> TailPoint, p: f64, guess: f64) -> f64 {
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
                let (up, _, _) = normal_upper(z.abs());
                if z < 0.0 {
                    (up, 1.0 - up)
                } else {
                    (1.0 - up, up)
                }
            }
            Self::StudentT { df, loc, scale } => {
                let t = (x - loc) / scale;
                let (up, _, _) = Student::new(df).upper(t.abs());
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
            Self::StudentT { df, loc, scale } => {
                Student::new(df).density((x - loc) / scale) / scale
            }
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
        self.quantile_near(p, None)
    }

    /// The p-quantile, starting the search at `hint` (a nearby quantile):
    /// the same answer as [`Self::quantile`], in fewer steps.
    pub fn quantile_near(&self, p: f64, hint: Option<f64>) -> f64 {
        let hint = hint.filter(|h| h.is_finite());
        let (lo, hi) = self.support();
        if p <= 0.0 {
            return lo;
        }
        if p >= 1.0 {
            return hi;
        }
        let q = 1.0 - p;
        match *self {
            Self::Beta { a, b } => beta_quantile(a, b, p, q, hint),
            Self::Gamma { shape, rate } => {
                let h = hint.map(|x| x * rate);
                let ln_z = if p <= 0.5 {
                    gamma_unit_ln_quantile(shape, p, false, h)
                } else {
                    gamma_unit_ln_quantile(shape, q, true, h)
                };
                ln_z.exp() / rate
            }
            Self::InvGamma { shape, scale } => {
                scale * (-inv_gamma_unit_ln(shape, p, hint.map(|x| scale / x))).exp()
            }
            Self::SqrtInvGamma { shape, scale } => {
                let h = hint.map(|x| scale / x / x);
                scale.sqrt() * (-0.5 * inv_gamma_unit_ln(shape, p, h)).exp()
            }
            Self::Normal { mean, sd } => {
                let start = hint.map_or_else(|| guess::normal_quantile(p), |x| (x - mean) / sd);
                mean + sd * symmetric_quantile(normal_upper, p, start)
            }
            Self::StudentT { df, loc, scale } => {
                let z = guess::normal_quantile(p);
                let start = hint.map_or(z * (1.0 + (z * z + 1.0) / (4.0 * df)), |x| {
                    (x - loc) / scale
                });
                let student = Student::new(df);
                loc + scale * symmetric_quantile(|t| student.upper(t), p, start)
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
        self.hpd_interval_near(level, &self.central_interval(level))
    }

    /// [`Self::hpd_interval`], its searches started from `central`'s ends.
    pub fn hpd_interval_near(&self, level: f64, central: &Interval) -> Interval {
        interval::highest_density(self, level, Some((central.lower, central.upper)))
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
fn inv_gamma_unit_ln(shape: f64, p: f64, hint: Option<f64>) -> f64 {
    if p <= 0.5 {
        gamma_unit_ln_quantile(shape, p, true, hint)
    } else {
        gamma_unit_ln_quantile(shape, 1.0 - p, false, hint)
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
