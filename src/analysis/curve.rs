//! Density curves for plots, sampled where they bend.
//!
//! A fixed grid wastes points on flat stretches and still cuts the peak of a
//! tight prior; here a coarse grid is refined where the midpoint of a segment
//! is far from the straight line through its ends, so a few hundred points
//! draw any of our densities to well under a pixel.

/// Samples `f` on `[lo, hi]`: points where `f` bends, at most `max_points`.
/// Non-finite values (a density's pole at an end) are left out.
pub fn sample(f: impl Fn(f64) -> f64, lo: f64, hi: f64, max_points: usize) -> Vec<[f64; 2]> {
    if !(lo.is_finite() && hi.is_finite() && lo < hi) {
        return Vec::new();
    }
    const START: usize = 48;
    let mut pts: Vec<[f64; 2]> = (0..=START)
        .map(|i| {
            let x = lo + (hi - lo) * i as f64 / START as f64;
            [x, f(x)]
        })
        .collect();
    let top = pts
        .iter()
        .map(|p| p[1])
        .filter(|y| y.is_finite())
        .fold(0.0f64, f64::max);
    // A tolerance of 1/500 of the curve's height is below a pixel on any plot
    // we draw; the x-resolution limit stops refining a jump forever.
    let tol = top.max(f64::MIN_POSITIVE) / 500.0;
    let min_dx = (hi - lo) / 20_000.0;
    for _ in 0..8 {
        let mut next = Vec::with_capacity(pts.len() * 2);
        let mut added = false;
        for w in pts.windows(2) {
            let ([x0, y0], [x1, y1]) = (w[0], w[1]);
            next.push(w[0]);
            if x1 - x0 <= min_dx || pts.len() + next.len() > 2 * max_points {
                continue;
            }
            let xm = 0.5 * (x0 + x1);
            let ym = f(xm);
            let line = 0.5 * (y0 + y1);
            let off = if ym.is_finite() && line.is_finite() {
                (ym - line).abs()
            } else {
                f64::INFINITY
            };
            if off > tol {
                next.push([xm, ym]);
                added = true;
            }
        }
        if let Some(last) = pts.last() {
            next.push(*last);
        }
        pts = next;
        if !added || pts.len() >= max_points {
            break;
        }
    }
    pts.retain(|p| p[1].is_finite());
    pts
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_tight_peak_is_refined_and_a_flat_line_is_not() {
        // A normal density with sd 1/1000 of the range: its peak must be drawn.
        let sd = 0.001;
        let f = |x: f64| (-0.5 * ((x - 0.5) / sd).powi(2)).exp();
        let pts = sample(f, 0.0, 1.0, 600);
        let top = pts.iter().map(|p| p[1]).fold(0.0, f64::max);
        assert!(top > 0.99, "peak drawn at {top}");
        assert!(pts.len() <= 1200);
        assert!(pts.windows(2).all(|w| w[0][0] < w[1][0]));
        let flat = sample(|_| 1.0, 0.0, 1.0, 600);
        assert_eq!(flat.len(), 49);
        assert!(sample(f, 1.0, 0.0, 600).is_empty());
    }
}
