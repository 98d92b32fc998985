//! Rough starting points for the quantile solvers. Accuracy here only saves
//! iterations; the solvers themselves are bracketed and always converge.

/// Upper-tail standard normal point z with Q(z) ≈ p for 0 < p ≤ ½ (Abramowitz &
/// Stegun 26.2.23, |error| < 4.5e-4).
pub fn normal_upper_point(p: f64) -> f64 {
    let p = p.clamp(1e-300, 0.5);
    let t = (-2.0 * p.ln()).sqrt();
    t - (2.515_517 + 0.802_853 * t + 0.010_328 * t * t)
        / (1.0 + 1.432_788 * t + 0.189_269 * t * t + 0.001_308 * t * t * t)
}

/// Signed standard normal quantile guess for any 0 < p < 1.
pub fn normal_quantile(p: f64) -> f64 {
    if p <= 0.5 {
        -normal_upper_point(p)
    } else {
        normal_upper_point(1.0 - p)
    }
}
