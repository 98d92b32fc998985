//! Credible intervals: equal-tailed and highest-density (shortest).
//!
//! The highest-density set {x : f(x) ≥ k} of a unimodal density is the interval
//! [L, U] with F(U) − F(L) = level and f(L) = f(U) (Box & Tiao, *Bayesian
//! Inference in Statistical Analysis*, 1973, §2.8). We solve for the lower tail
//! mass p_L, with L = Q(p_L) and U = Q(p_L + level), by safeguarded Newton on
//! ln p_L using h(p_L) = ln f(L) − ln f(U) and h′ = (ln f)′(L)/f(L) − (ln f)′(U)/f(U).
//! A U-shaped density gives two pieces, [lo, L] ∪ [U, hi], found the same way.

use super::Continuous;
use crate::numeric::solve::increasing_root;
use std::cell::Cell;

/// How a density is shaped, which decides its mode and its highest-density set.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Shape {
    /// Single interior peak.
    Unimodal,
    /// Symmetric about an interior centre: highest density equals central.
    Symmetric,
    /// Non-increasing on its support: the set starts at the lower end.
    Decreasing,
    /// Non-decreasing: the set ends at the upper end.
    Increasing,
    /// Unbounded at both ends with an interior minimum: two pieces.
    UShaped,
    /// Constant: every interval of the right mass is shortest; central is used.
    Flat,
}

/// A credible set: overall ends, and its pieces when it is not one interval.
#[derive(Clone, Debug, PartialEq)]
pub struct Interval {
    /// Probability mass the set holds.
    pub level: f64,
    /// Lowest point of the set.
    pub lower: f64,
    /// Highest point of the set.
    pub upper: f64,
    /// Disjoint pieces in increasing order; empty when the set is one interval.
    pub pieces: Vec<(f64, f64)>,
}

impl Interval {
    /// A set made of one interval.
    pub fn single(level: f64, lower: f64, upper: f64) -> Self {
        Self {
            level,
            lower,
            upper,
            pieces: Vec::new(),
        }
    }
}

/// Solves an increasing h(p_L) = 0 over p_L in (0, p_max), on ln p_L.
fn solve_lower_mass(h: impl Fn(f64) -> (f64, f64), p_max: f64) -> f64 {
    let g = |u: f64| {
        let p = u.exp();
        let (v, d) = h(p);
        (v, d * p)
    };
    let start = (0.5 * p_max).ln();
    increasing_root(g, -690.0, p_max.ln(), start, 1e-13)
        .exp()
        .min(p_max)
}

/// Newton's method on both ends at once, from a nearby interval [l, u]:
/// e1 = S(L)·… written as 1 − S(U) − F(L) − level and e2 = ln f(L) − ln f(U).
/// The Jacobian [[−f(L), f(U)], [s(L), −s(U)]] (s = (ln f)′) has a negative
/// determinant on either side of the mode. Returns None if a step leaves the
/// sides of the mode or it does not settle, and the caller falls back.
fn newton_ends(d: &Continuous, level: f64, mut l: f64, mut u: f64) -> Option<(f64, f64)> {
    let mode = d.mode()?;
    let (lo, hi) = d.support();
    if !(l > lo && l < mode && u > mode && u < hi) {
        return None;
    }
    for _ in 0..40 {
        let ((fl_lo, _), (_, su_up)) = (d.tails(l), d.tails(u));
        let e1 = 1.0 - su_up - fl_lo - level;
        let (fl, fu) = (d.pdf(l), d.pdf(u));
        let e2 = fl.ln() - fu.ln();
        let (sl, su) = (d.ln_pdf_slope(l), d.ln_pdf_slope(u));
        let det = fl * su - fu * sl;
        if !(det < 0.0 && det.is_finite() && e1.is_finite() && e2.is_finite()) {
            return None;
        }
        // (ΔL, ΔU) = −J⁻¹e.
        let dl = (su * e1 + fu * e2) / det;
        let du = (sl * e1 + fl * e2) / det;
        let (mut nl, mut nu) = (l + dl, u + du);
        // Damp a step that would cross the mode or leave the support.
        let mut shrink = 0;
        while !(nl > lo && nl < mode && nu > mode && nu < hi) {
            shrink += 1;
            if shrink > 30 {
                return None;
            }
            nl = l + dl * 0.5f64.powi(shrink);
            nu = u + du * 0.5f64.powi(shrink);
        }
        let done = (nl - l).abs() <= 1e-14 * l.abs() && (nu - u).abs() <= 1e-14 * u.abs();
        l = nl;
        u = nu;
        if done {
            return Some((l, u));
        }
    }
    None
}

/// The highest-density set of `d` at `level`; `start`, if given, are the ends
/// of a nearby interval (the central one) to begin the searches from.
pub fn highest_density(d: &Continuous, level: f64, start: Option<(f64, f64)>) -> Interval {
    let (lo, hi) = d.support();
    match d.shape() {
        Shape::Symmetric | Shape::Flat => d.central_interval(level),
        Shape::Decreasing => Interval::single(level, lo, d.quantile(level)),
        Shape::Increasing => Interval::single(level, d.quantile(1.0 - level), hi),
        Shape::Unimodal => {
            if let Some((l0, u0)) = start
                && let Some((l, u)) = newton_ends(d, level, l0, u0)
            {
                return Interval::single(level, l, u);
            }
            // Each step starts both quantile searches from the previous ends.
            let ends = Cell::new(start);
            let h = |pl: f64| {
                let prev = ends.get();
                let l = d.quantile_near(pl, prev.map(|e| e.0));
                let u = d.quantile_near(pl + level, prev.map(|e| e.1));
                ends.set(Some((l, u)));
                let (fl, fu) = (d.pdf(l), d.pdf(u));
                let v = fl.ln() - fu.ln();
                let slope = d.ln_pdf_slope(l) / fl - d.ln_pdf_slope(u) / fu;
                (v, slope)
            };
            let pl = solve_lower_mass(h, 1.0 - level);
            let prev = ends.get();
            let l = d.quantile_near(pl, prev.map(|e| e.0));
            let u = d.quantile_near(pl + level, prev.map(|e| e.1));
            Interval::single(level, l, u)
        }
        Shape::UShaped => {
            // Mass level = F(L) + 1 − F(U), so F(U) = p_L + 1 − level; h decreases in p_L.
            let h = |pl: f64| {
                let l = d.quantile(pl);
                let u = d.quantile(pl + 1.0 - level);
                let (fl, fu) = (d.pdf(l), d.pdf(u));
                let v = fu.ln() - fl.ln();
                let slope = d.ln_pdf_slope(u) / fu - d.ln_pdf_slope(l) / fl;
                (v, slope)
            };
            let pl = solve_lower_mass(h, level);
            let l = d.quantile(pl);
            let u = d.quantile(pl + 1.0 - level);
            Interval {
                level,
                lower: lo,
                upper: hi,
                pieces: vec![(lo, l), (u, hi)],
            }
        }
    }
}
