//! Log-gamma and the pieces that keep large-argument terms free of cancellation.
//!
//! The Stirling-error function `stirlerr` and the deviance term `bd0` follow
//! C. Loader, "Fast and accurate computation of binomial probabilities" (2000),
//! the method behind R's `dbinom`/`dpois`. The Stirling series coefficients are
//! the Bernoulli-number series of Abramowitz & Stegun 6.1.40.

use std::f64::consts::PI;

/// ½·ln(2π).
pub const LN_SQRT_2PI: f64 = 0.918_938_533_204_672_8;

/// Stirling series coefficients B_{2k} / (2k (2k-1)), A&S 6.1.40.
const STIRLING: [f64; 8] = [
    1.0 / 12.0,
    -1.0 / 360.0,
    1.0 / 1260.0,
    -1.0 / 1680.0,
    1.0 / 1188.0,
    -691.0 / 360_360.0,
    1.0 / 156.0,
    -3617.0 / 122_400.0,
];

/// Below this argument the Stirling series is not used directly.
const SERIES_FROM: f64 = 15.0;

/// `ln Γ(x) − [(x − ½) ln x − x + ½ ln 2π]`, the Stirling correction, for x ≥ 15.
pub fn stirling_correction_series(x: f64) -> f64 {
    let x2 = 1.0 / (x * x);
    let mut sum = 0.0;
    let mut pow = 1.0 / x;
    for c in STIRLING {
        sum += c * pow;
        pow *= x2;
    }
    sum
}

/// Natural log of the gamma function for x > 0 (NaN-free: returns +∞ at 0).
pub fn ln_gamma(x: f64) -> f64 {
    if x <= 0.0 {
        return f64::INFINITY;
    }
    if x >= SERIES_FROM {
        return (x - 0.5) * x.ln() - x + LN_SQRT_2PI + stirling_correction_series(x);
    }
    // Shift up with Γ(x) = Γ(x + n) / (x (x+1) … (x+n-1)).
    let mut prod = 1.0;
    let mut z = x;
    while z < SERIES_FROM {
        prod *= z;
        z += 1.0;
    }
    ln_gamma(z) - prod.ln()
}

/// Stirling error δ(x) = ln Γ(x + 1) − [(x + ½) ln x − x + ½ ln 2π], x > 0.
pub fn stirlerr(x: f64) -> f64 {
    if x >= SERIES_FROM {
        stirling_correction_series(x)
    } else {
        ln_gamma(x + 1.0) - (x + 0.5) * x.ln() + x - LN_SQRT_2PI
    }
}

/// Loader's deviance term `x ln(x / m) + m − x`, accurate when x ≈ m.
pub fn bd0(x: f64, m: f64) -> f64 {
    if x == 0.0 {
        return m;
    }
    if m == 0.0 {
        return f64::INFINITY;
    }
    bd0_diff(x, m, x - m)
}

/// [`bd0`] given the difference d = x − m computed by the caller, which can
/// often form it exactly where `x - m` would cancel.
pub fn bd0_diff(x: f64, m: f64, d: f64) -> f64 {
    if d.abs() < 0.1 * (x + m) {
        let v = d / (x + m);
        let mut s = d * v;
        let mut ej = 2.0 * x * v;
        let v2 = v * v;
        for j in 1..1000 {
            ej *= v2;
            let s1 = s + ej / f64::from(2 * j + 1);
            if s1 == s {
                return s1;
            }
            s = s1;
        }
        s
    } else if (d / m).abs() < 0.5 {
        x * (d / m).ln_1p() - d
    } else {
        x * (x / m).ln() - d
    }
}

/// `ln Γ(x + d) − ln Γ(x)` without the cancellation of two large log-gammas.
pub fn ln_gamma_ratio(x: f64, d: f64) -> f64 {
    if d == 0.0 {
        return 0.0;
    }
    let y = x + d;
    if x >= SERIES_FROM && y >= SERIES_FROM {
        // (y-½)ln y − (x-½)ln x − d + corrections, with ln y = ln x + log1p(d/x).
        let l = (d / x).ln_1p();
        (y - 0.5) * l + d * x.ln() - d + stirling_correction_series(y)
            - stirling_correction_series(x)
    } else {
        ln_gamma(y) - ln_gamma(x)
    }
}

/// ln B(a, b), written so that a tiny a beside a huge b keeps its digits.
pub fn ln_beta(a: f64, b: f64) -> f64 {
    let (small, large) = if a < b { (a, b) } else { (b, a) };
    // ln B = ln Γ(small) − [ln Γ(large + small) − ln Γ(large)].
    ln_gamma(small) - ln_gamma_ratio(large, small)
}

/// x^a e^{−x} / Γ(a + 1), the Poisson-like kernel used by the incomplete gamma.
///
/// Through Loader's form `exp(−δ(a) − bd0(a, x)) / √(2πa)` it keeps full
/// relative accuracy for a up to 1e7 and beyond.
pub fn poisson_kernel(a: f64, x: f64) -> f64 {
    if x == 0.0 {
        return 0.0;
    }
    if a < 1.0 {
        return (a * x.ln() - x - ln_gamma(a + 1.0)).exp();
    }
    (-stirlerr(a) - bd0(a, x)).exp() / (2.0 * PI * a).sqrt()
}

/// x^a y^b / B(a, b) for y = 1 − x.
///
/// The smaller of x and y is taken as exact and the other as its complement:
/// callers pass (x, 1 − x) with 1 − x exact for x ≥ ½, or both computed
/// accurately. The log of the larger one is then log1p(−smaller), and no 1e7-fold
/// amplification of its rounding reaches the result.
///
/// For shapes ≥ 1, Γ(z) = √(2π/z)(z/e)^z e^{δ(z)} turns the large powers into
/// Loader deviance terms: √(ab / (2π n)) · exp(δ(n) − δ(a) − δ(b) − bd0(a, n x)
/// − bd0(b, n y)), n = a + b, with both differences a − n x and b − n y formed
/// from the exact smaller variable and the rounding of n = a + b carried along.
pub fn beta_kernel(a: f64, b: f64, x: f64, y: f64) -> f64 {
    if x <= 0.0 || y <= 0.0 {
        return 0.0;
    }
    let x_small = x <= y;
    let (ln_x, ln_y) = if x_small {
        (x.ln(), (-x).ln_1p())
    } else {
        ((-y).ln_1p(), y.ln())
    };
    if a < 1.0 || b < 1.0 {
        // Small shapes: the logs are moderate, take them directly.
        return (a * ln_x + b * ln_y - ln_beta(a, b)).exp();
    }
    // n + err = a + b exactly (Knuth's two-sum).
    let n = a + b;
    let bb = n - a;
    let err = (a - (n - bb)) + (b - bb);
    let (mx, my) = if x_small {
        (n * x, n - n * x)
    } else {
        (n - n * y, n * y)
    };
    // a − n x and b − n y, with n x + n y = n = a + b − err.
    let (da, db) = if x_small {
        let da = a - n * x;
        (da, err - da)
    } else {
        let db = b - n * y;
        (err - db, db)
    };
    // Using n for a + b inside both deviance terms is exact to first order:
    // the −err it adds to the deviances cancels the +err of (a+b) ln((a+b)/n).
    let e = stirlerr(n) - stirlerr(a) - stirlerr(b) - bd0_diff(a, mx, da) - bd0_diff(b, my, db);
    (a * b / (2.0 * PI * n)).sqrt() * e.exp()
}

/// Shapes up to which a kernel may use the direct log form with a
/// precomputed normaliser: the logs there stay below ~1e3, so the result keeps
/// about 1e-13 relative accuracy.
const DIRECT_UP_TO: f64 = 1000.0;

/// [`beta_kernel`] for one (a, b) evaluated at many points (inside solvers):
/// ln B(a, b) is computed once where the direct form is accurate.
#[derive(Clone, Copy, Debug)]
pub struct BetaKernel {
    a: f64,
    b: f64,
    ln_beta: Option<f64>,
}

impl BetaKernel {
    /// Prepares the kernel of Beta(a, b).
    pub fn new(a: f64, b: f64) -> Self {
        Self {
            a,
            b,
            ln_beta: (a + b <= DIRECT_UP_TO).then(|| ln_beta(a, b)),
        }
    }

    /// x^a y^b / B(a, b), as [`beta_kernel`].
    pub fn eval(&self, x: f64, y: f64) -> f64 {
        let Some(lb) = self.ln_beta else {
            return beta_kernel(self.a, self.b, x, y);
        };
        if x <= 0.0 || y <= 0.0 {
            return 0.0;
        }
        let (ln_x, ln_y) = if x <= y {
            (x.ln(), (-x).ln_1p())
        } else {
            ((-y).ln_1p(), y.ln())
        };
        (self.a * ln_x + self.b * ln_y - lb).exp()
    }
}

/// [`poisson_kernel`] for one shape at many points.
#[derive(Clone, Copy, Debug)]
pub struct PoissonKernel {
    a: f64,
    ln_gamma_a1: Option<f64>,
}

impl PoissonKernel {
    /// Prepares x^a e^{−x} / Γ(a + 1).
    pub fn new(a: f64) -> Self {
        Self {
            a,
            ln_gamma_a1: (a <= DIRECT_UP_TO).then(|| ln_gamma(a + 1.0)),
        }
    }

    /// x^a e^{−x} / Γ(a + 1), as [`poisson_kernel`].
    pub fn eval(&self, x: f64) -> f64 {
        match self.ln_gamma_a1 {
            Some(lg) if x > 0.0 && x < 1e6 => (self.a * x.ln() - x - lg).exp(),
            _ => poisson_kernel(self.a, x),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn rel(a: f64, b: f64) -> f64 {
        ((a - b) / b).abs()
    }

    #[test]
    fn ln_gamma_known_values() {
        // Γ(1/2) = √π, Γ(5) = 24, Γ(0.001) from A&S 6.1.35-style series (mpmath value).
        assert!(rel(ln_gamma(0.5), PI.sqrt().ln()) < 1e-14);
        assert!(rel(ln_gamma(5.0), 24f64.ln()) < 1e-14);
        assert!((ln_gamma(1.0)).abs() < 1e-14);
        assert!((ln_gamma(2.0)).abs() < 1e-14);
        // mpmath.loggamma(1e7) at 30 digits.
        assert!(rel(ln_gamma(1e7), 151_180_949.369_473_9) < 1e-15);
    }

    #[test]
    fn ratio_matches_difference_for_moderate_arguments() {
        for &(x, d) in &[(20.0, 0.5), (3.0, 2.5), (100.0, 7.0), (0.2, 40.0)] {
            let direct = ln_gamma(x + d) - ln_gamma(x);
            assert!((ln_gamma_ratio(x, d) - direct).abs() < 1e-12, "{x} {d}");
        }
    }

    #[test]
    fn prepared_kernels_match_the_general_ones() {
        for &(a, b, x) in &[
            (2.0, 8.0, 0.1),
            (0.5, 0.5, 0.999),
            (300.0, 600.0, 0.34),
            (1e-3, 2.0, 1e-9),
        ] {
            let k = BetaKernel::new(a, b);
            assert!(
                rel(k.eval(x, 1.0 - x), beta_kernel(a, b, x, 1.0 - x)) < 1e-12,
                "{a} {b} {x}"
            );
        }
        for &(a, x) in &[(2.5, 1.0), (0.3, 1e-5), (900.0, 870.0)] {
            assert!(
                rel(PoissonKernel::new(a).eval(x), poisson_kernel(a, x)) < 1e-12,
                "{a} {x}"
            );
        }
    }

    #[test]
    fn kernels_agree_with_direct_logs() {
        let direct = (3.5 * 2.0f64.ln() - 2.0 - ln_gamma(4.5)).exp();
        assert!(rel(poisson_kernel(3.5, 2.0), direct) < 1e-13);
        let direct = (2.5 * 0.3f64.ln() + 4.0 * 0.7f64.ln() - ln_beta(2.5, 4.0)).exp();
        assert!(rel(beta_kernel(2.5, 4.0, 0.3, 0.7), direct) < 1e-13);
    }
}
