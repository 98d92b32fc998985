//! Regularised incomplete gamma and beta functions, both tails at once.
//!
//! Both use the classical split (series or continued fraction on the side where
//! each converges fast, evaluated with the modified Lentz method) as in Press et
//! al., *Numerical Recipes*, 3rd ed., §6.2 and §6.4, but with the prefactor taken
//! from Loader's deviance form ([`super::gamma::poisson_kernel`],
//! [`super::gamma::beta_kernel`]) so that shapes up to 1e7 keep full relative
//! accuracy. Each function returns the lower and the upper tail, the smaller one
//! computed directly, so a tail probability of 1e-300 keeps its digits.

use super::double_double::Dd;
use super::gamma::{beta_kernel, poisson_kernel};

const EPS: f64 = 1e-16;
const FPMIN: f64 = 1e-300;

/// Iteration cap: both expansions need about √a terms near the centre.
fn max_terms(scale: f64) -> usize {
    // Bounded for any finite input; 60·√(1e7) ≈ 190 000 at the extreme end.
    let extra = 60.0 * scale.max(1.0).sqrt();
    1000 + extra.min(1e7) as usize
}

/// (P(a, x), Q(a, x)): the regularised lower and upper incomplete gamma, a > 0.
pub fn gamma_pq(a: f64, x: f64) -> (f64, f64) {
    if x <= 0.0 || x == f64::INFINITY {
        return if x <= 0.0 { (0.0, 1.0) } else { (1.0, 0.0) };
    }
    gamma_pq_with(a, x, poisson_kernel(a, x))
}

/// [`gamma_pq`] given its kernel x^a e^{−x}/Γ(a+1) (solvers reuse it for the density).
pub fn gamma_pq_with(a: f64, x: f64, kernel: f64) -> (f64, f64) {
    if x <= 0.0 {
        return (0.0, 1.0);
    }
    if x == f64::INFINITY {
        return (1.0, 0.0);
    }
    if kernel == 0.0 {
        // Far in one tail: the density term underflowed.
        return if x < a { (0.0, 1.0) } else { (1.0, 0.0) };
    }
    let cap = max_terms(a.max(x));
    if x < a + 1.0 {
        // P = x^a e^{-x}/Γ(a+1) · Σ_{n≥0} x^n / ((a+1)…(a+n)).
        let mut term = 1.0;
        let mut sum = 1.0;
        let mut ap = a;
        for _ in 0..cap {
            ap += 1.0;
            term *= x / ap;
            sum += term;
            if term < sum * EPS {
                break;
            }
        }
        let p = (kernel * sum).min(1.0);
        (p, 1.0 - p)
    } else {
        // Q = x^a e^{-x}/Γ(a) · 1/(x+1-a- 1(1-a)/(x+3-a- …)), Lentz.
        let mut b = x + 1.0 - a;
        let mut c = 1.0 / FPMIN;
        let mut d = 1.0 / b;
        let mut h = d;
        for i in 1..cap {
            let i = i as f64;
            let an = -i * (i - a);
            b += 2.0;
            d = an * d + b;
            if d.abs() < FPMIN {
                d = FPMIN;
            }
            c = b + an / c;
            if c.abs() < FPMIN {
                c = FPMIN;
            }
            d = 1.0 / d;
            let del = d * c;
            h *= del;
            if (del - 1.0).abs() < EPS {
                break;
            }
        }
        let q = (kernel * a * h).min(1.0);
        (1.0 - q, q)
    }
}

/// Continued fraction for I_x(a, b) (Numerical Recipes `betacf`), modified Lentz.
fn beta_cf(a: f64, b: f64, x: f64, y: f64) -> f64 {
    let qab = a + b;
    let qap = a + 1.0;
    let qam = a - 1.0;
    let mut c = 1.0;
    // 1 − (a+b)x/(a+1) = (1 − b + (a+b)y)/(a+1): no cancellation for x near 1.
    let mut d = if x > 0.5 {
        (1.0 - b + qab * y) / qap
    } else {
        1.0 - qab * x / qap
    };
    if d.abs() < FPMIN {
        d = FPMIN;
    }
    d = 1.0 / d;
    let mut h = d;
    let cap = max_terms(a.max(b));
    for m in 1..cap {
        let m = m as f64;
        let m2 = 2.0 * m;
        let aa = m * (b - m) * x / ((qam + m2) * (a + m2));
        d = 1.0 + aa * d;
        if d.abs() < FPMIN {
            d = FPMIN;
        }
        c = 1.0 + aa / c;
        if c.abs() < FPMIN {
            c = FPMIN;
        }
        d = 1.0 / d;
        h *= d * c;
        let aa = -(a + m) * (qab + m) * x / ((a + m2) * (qap + m2));
        d = 1.0 + aa * d;
        if d.abs() < FPMIN {
            d = FPMIN;
        }
        c = 1.0 + aa / c;
        if c.abs() < FPMIN {
            c = FPMIN;
        }
        d = 1.0 / d;
        let del = d * c;
        h *= del;
        if (del - 1.0).abs() < EPS {
            break;
        }
    }
    h
}

/// Terms the positive series of [`beta_series`] needs for I_x(a, b) (a rough
/// count: it decides between the series and the continued fraction).
fn beta_series_terms(a: f64, b: f64, x: f64) -> f64 {
    let r0 = (a + b) * x / (a + 1.0);
    if r0 < 1.0 {
        40.0 / (1.0 - r0.max(x))
    } else {
        // Terms grow up to j*, then fall off over a few widths.
        let peak = ((a + b) * x - a - 1.0) / (1.0 - x);
        peak + 10.0 * ((a + 1.0 + peak) / (1.0 - x)).sqrt() + 40.0
    }
}

/// Σ_j (a+b)_j / (a+1)_j x^j, the hypergeometric series 2F1(a+b, 1; a+1; x) of
/// Abramowitz & Stegun 26.5.23: I_x(a, b) = x^a y^b / (a B(a, b)) times this.
/// All terms are positive, so a long series loses nothing to cancellation.
fn beta_series(a: f64, b: f64, x: f64, cap: usize) -> f64 {
    let mut term = 1.0;
    let mut sum = 1.0;
    for j in 0..cap {
        let j = j as f64;
        term *= (a + b + j) * x / (a + 1.0 + j);
        sum += term;
        if term < EPS * sum && (a + b + j) * x < a + 1.0 + j {
            break;
        }
    }
    sum
}

/// Largest series value whose complement is still taken from it.
const SERIES_KEEP: f64 = 0.999;

/// Longest series worth summing before the continued fraction is cheaper.
const SERIES_LIMIT: f64 = 5000.0;

/// [`beta_cf`] in double-double arithmetic. With a shape of 1e4 or more the
/// steps d ← 1 + aa·d cancel to a few parts in 1e6, and double-precision
/// rounding then shows up as spurious factors of 1 + 3e-11 (seen against a
/// 40-digit evaluation of the same fraction); 32 digits leave nothing visible.
fn beta_cf_dd(a: f64, b: f64, x: f64, y: f64) -> f64 {
    let one = Dd::new(1.0);
    let (ad, bd, xd) = (Dd::new(a), Dd::new(b), Dd::new(x));
    let qab = ad + bd;
    let qap = ad + one;
    let qam = ad - one;
    let fix = |v: Dd| {
        if v.abs_f64() < FPMIN {
            Dd::new(FPMIN)
        } else {
            v
        }
    };
    let mut c = one;
    let mut d = if x > 0.5 {
        (one - bd + qab * Dd::new(y)) / qap
    } else {
        one - qab * xd / qap
    };
    d = one / fix(d);
    let mut h = d;
    let cap = max_terms(a.max(b));
    for m in 1..cap {
        let md = Dd::new(m as f64);
        let m2 = Dd::new(2.0 * m as f64);
        let aa = md * (bd - md) * xd / ((qam + m2) * (ad + m2));
        d = one / fix(one + aa * d);
        c = fix(one + aa / c);
        h = h * d * c;
        let aa = Dd::new(0.0) - (ad + md) * (qab + md) * xd / ((ad + m2) * (qap + m2));
        d = one / fix(one + aa * d);
        c = fix(one + aa / c);
        let del = d * c;
        h = h * del;
        if (del - one).abs_f64() < 1e-30 {
            break;
        }
    }
    h.to_f64()
}

/// Shapes from which the continued fraction runs in double-double.
const DD_FROM: f64 = 1e4;

/// (I_x(a, b), 1 − I_x(a, b)) with y = 1 − x passed separately, a, b > 0.
///
/// The smaller tail is computed directly: by the positive series where it
/// converges in a few thousand terms (one shape huge and the other small, the
/// case where the continued fraction drifts), else by the continued fraction.
pub fn beta_i(a: f64, b: f64, x: f64, y: f64) -> (f64, f64) {
    if x <= 0.0 {
        return (0.0, 1.0);
    }
    if y <= 0.0 {
        return (1.0, 0.0);
    }
    beta_i_with(a, b, x, y, beta_kernel(a, b, x, y))
}

/// [`beta_i`] given its kernel x^a y^b / B(a, b) (solvers reuse it for the density).
pub fn beta_i_with(a: f64, b: f64, x: f64, y: f64, front: f64) -> (f64, f64) {
    if x <= 0.0 {
        return (0.0, 1.0);
    }
    if y <= 0.0 {
        return (1.0, 0.0);
    }
    if front == 0.0 {
        // Far in one tail: the density term underflowed.
        return if x * (a + b) < a {
            (0.0, 1.0)
        } else {
            (1.0, 0.0)
        };
    }
    // A series value v is kept if v ≤ 0.999: its complement then loses at
    // most three digits. Otherwise the other side, or the continued fraction.
    // Only with a huge shape: elsewhere the continued fraction is both accurate
    // and faster.
    let (n_lower, n_upper) = if a.max(b) >= DD_FROM {
        (beta_series_terms(a, b, x), beta_series_terms(b, a, y))
    } else {
        (f64::INFINITY, f64::INFINITY)
    };
    if n_lower < SERIES_LIMIT {
        let lower = (front * beta_series(a, b, x, 3 * n_lower as usize + 100) / a).min(1.0);
        if lower <= SERIES_KEEP {
            return (lower, 1.0 - lower);
        }
    }
    if n_upper < SERIES_LIMIT {
        let upper = (front * beta_series(b, a, y, 3 * n_upper as usize + 100) / b).min(1.0);
        if upper <= SERIES_KEEP {
            return (1.0 - upper, upper);
        }
    }
    let cf = if a.max(b) >= DD_FROM {
        beta_cf_dd
    } else {
        beta_cf
    };
    if x < (a + 1.0) / (a + b + 2.0) {
        let lower = (front * cf(a, b, x, y) / a).min(1.0);
        (lower, 1.0 - lower)
    } else {
        let upper = (front * cf(b, a, y, x) / b).min(1.0);
        (1.0 - upper, upper)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rel(a: f64, b: f64) -> f64 {
        ((a - b) / b).abs()
    }

    #[test]
    fn gamma_closed_forms() {
        // a = 1: P = 1 − e^{−x}.
        for &x in &[1e-8, 0.3, 1.0, 5.0, 40.0] {
            let (p, q) = gamma_pq(1.0, x);
            assert!(rel(q, (-x).exp()) < 1e-14, "x={x}");
            assert!(rel(p, -(-x).exp_m1()) < 1e-14, "x={x}");
        }
    }

    #[test]
    fn beta_closed_forms() {
        // I_x(1, b) = 1 − (1−x)^b; I_x(a, 1) = x^a.
        for &x in &[1e-9, 0.1, 0.5, 0.9] {
            let (lo, _) = beta_i(1.0, 3.5, x, 1.0 - x);
            assert!(rel(lo, -(3.5 * (-x).ln_1p()).exp_m1()) < 1e-13, "x={x}");
            let (lo, _) = beta_i(2.5, 1.0, x, 1.0 - x);
            assert!(rel(lo, x.powf(2.5)) < 1e-13, "x={x}");
        }
    }
}
