//! Numbers as they read in the one-sentence descriptions of priors.

/// A number for a sentence: up to 4 significant digits, no trailing zeros.
pub(crate) fn short(x: f64) -> String {
    if x == 0.0 || !x.is_finite() {
        return format!("{x}");
    }
    if x.abs() >= 1e6 || x.abs() < 1e-3 {
        return format!("{x:.3e}");
    }
    let digits = (4 - (x.abs().log10().floor() as i32 + 1)).clamp(0, 10) as usize;
    let s = format!("{x:.digits$}");
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_owned()
    } else {
        s
    }
}
