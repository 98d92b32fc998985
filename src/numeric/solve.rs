//! Root finding for monotone functions: Newton steps kept inside a bracket that
//! shrinks at every evaluation, with bisection whenever Newton would leave it
//! (the safeguarded Newton method of Press et al., *Numerical Recipes*, 3rd ed.,
//! §9.4, `rtsafe`).

/// Finds u in [lo, hi] with g(u) = 0 for an increasing g.
///
/// `g` returns the value and the derivative at u; values may be ±∞ (for instance
/// the log of a tail probability that underflowed), in which case only the sign
/// is used. `guess` need not lie in the bracket. Relative tolerance `tol` on u.
pub fn increasing_root(
    mut g: impl FnMut(f64) -> (f64, f64),
    lo: f64,
    hi: f64,
    guess: f64,
    tol: f64,
) -> f64 {
    increasing_root_halley(
        |u| {
            let (v, d) = g(u);
            (v, d, f64::NAN)
        },
        lo,
        hi,
        guess,
        tol,
    )
}

/// [`increasing_root`] with the second derivative as well: Halley's step
/// (cubic convergence) wherever g″ is finite and the step is well posed.
pub fn increasing_root_halley(
    mut g: impl FnMut(f64) -> (f64, f64, f64),
    mut lo: f64,
    mut hi: f64,
    guess: f64,
    tol: f64,
) -> f64 {
    let mut u = if guess.is_finite() {
        guess.clamp(lo, hi)
    } else {
        0.5 * (lo + hi)
    };
    for _ in 0..400 {
        let (value, slope, curve) = g(u);
        if value == 0.0 {
            return u;
        }
        if value.is_nan() {
            // Only reachable at the very edge of the range; shrink towards the middle.
            lo = lo.max(u.min(0.5 * (lo + hi)));
        } else if value < 0.0 {
            lo = u;
        } else {
            hi = u;
        }
        let newton = if value.is_finite() && slope.is_finite() && slope > 0.0 {
            let step = value / slope;
            let denom = 1.0 - 0.5 * step * curve / slope;
            if curve.is_finite() && denom > 0.5 && denom < 2.0 {
                u - step / denom
            } else {
                u - step
            }
        } else {
            f64::NAN
        };
        let scale = u.abs().max(1.0);
        if (newton - u).abs() <= tol * scale {
            // Converged: the step is below the tolerance (possibly zero).
            return newton;
        }
        let next = if newton > lo && newton < hi {
            newton
        } else {
            0.5 * (lo + hi)
        };
        if (next - u).abs() <= tol * scale || hi - lo <= tol * scale {
            return next;
        }
        u = next;
    }
    u
}

/// Smallest integer k in [lo, hi] with `pred(k)` true, for a predicate that is
/// false below some point and true from there on. Returns `hi` if none is.
pub fn first_true(mut pred: impl FnMut(u64) -> bool, lo: u64, hi: u64, guess: u64) -> u64 {
    let guess = guess.clamp(lo, hi);
    // Bracket by doubling steps away from the guess.
    let (mut a, mut b);
    if pred(guess) {
        b = guess;
        let mut step = 1u64;
        loop {
            let cand = b.saturating_sub(step).max(lo);
            if cand == b {
                return b;
            }
            if pred(cand) {
                b = cand;
                step = step.saturating_mul(2);
            } else {
                a = cand;
                break;
            }
        }
    } else {
        a = guess;
        let mut step = 1u64;
        loop {
            let cand = a.saturating_add(step).min(hi);
            if cand == a {
                return hi;
            }
            if pred(cand) {
                b = cand;
                break;
            }
            a = cand;
            step = step.saturating_mul(2);
        }
    }
    // Invariant: pred(a) false, pred(b) true.
    while b - a > 1 {
        let mid = a + (b - a) / 2;
        if pred(mid) {
            b = mid;
        } else {
            a = mid;
        }
    }
    b
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_cube_root() {
        let r = increasing_root(|u| (u * u * u - 2.0, 3.0 * u * u), -10.0, 10.0, 5.0, 1e-15);
        assert!((r - 2f64.cbrt()).abs() < 1e-14);
    }

    #[test]
    fn survives_infinite_values() {
        let g = |u: f64| {
            if u < -1.0 {
                (f64::NEG_INFINITY, 0.0)
            } else {
                (u - 0.25, 1.0)
            }
        };
        assert!((increasing_root(g, -700.0, 700.0, -600.0, 1e-15) - 0.25).abs() < 1e-14);
    }

    #[test]
    fn first_true_finds_threshold() {
        for t in [0u64, 1, 7, 1000, 123_456] {
            assert_eq!(first_true(|k| k >= t, 0, 1_000_000, 50), t);
        }
        assert_eq!(first_true(|_| false, 0, 30, 3), 30);
    }
}
