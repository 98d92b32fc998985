//! Finite mixtures of continuous laws: the marginal of each unknown under a
//! linear pool of experts, or under a robust prior.
//!
//! Quantiles are bracketed by the components' own quantiles at the same
//! probability (the mixture's lies between the smallest and the largest) and
//! solved there. The highest-density region {x : f(x) ≥ k} may be several
//! intervals: its pieces are found from a fine grid of the density, each end
//! refined by bisection, and k is solved so that the pieces hold `level`.

use super::Continuous;
use super::interval::Interval;
use crate::numeric::solve::increasing_root;

/// Σ w_i F_i: weights positive and summing to 1.
#[derive(Clone, Debug, PartialEq)]
pub struct MixtureLaw {
    /// (weight, component) pairs.
    pub parts: Vec<(f64, Continuous)>,
}

/// Grid points used to locate the pieces of a highest-density region.
const GRID: usize = 800;

impl MixtureLaw {
    /// A mixture of the given parts (weights are taken as given).
    pub fn new(parts: Vec<(f64, Continuous)>) -> Self {
        Self { parts }
    }

    /// Support: the parts share one family, hence one support.
    pub fn support(&self) -> (f64, f64) {
        self.parts
            .first()
            .map_or((f64::NEG_INFINITY, f64::INFINITY), |(_, d)| d.support())
    }

    /// (P(X ≤ x), P(X > x)).
    pub fn tails(&self, x: f64) -> (f64, f64) {
        self.parts.iter().fold((0.0, 0.0), |(lo, up), (w, d)| {
            let (a, b) = d.tails(x);
            (lo + w * a, up + w * b)
        })
    }

    /// Density.
    pub fn pdf(&self, x: f64) -> f64 {
        self.parts.iter().map(|(w, d)| w * d.pdf(x)).sum()
    }

    /// Mean, if every part has one.
    pub fn mean(&self) -> Option<f64> {
        self.parts
            .iter()
            .map(|(w, d)| d.mean().map(|m| w * m))
            .sum()
    }

    /// Standard deviation, if every part has one: √Σ w (sd_i² + (m_i − m)²).
    pub fn sd(&self) -> Option<f64> {
        let m = self.mean()?;
        let v: Option<f64> = self
            .parts
            .iter()
            .map(|(w, d)| Some(w * (d.sd()?.powi(2) + (d.mean()? - m).powi(2))))
            .sum();
        v.map(f64::sqrt)
    }

    /// Whether the solver works on ln x (positive support).
    fn positive(&self) -> bool {
        self.support().0 == 0.0
    }

    /// The p-quantile, optionally starting near `hint`.
    pub fn quantile_near(&self, p: f64, hint: Option<f64>) -> f64 {
        let (lo, hi) = self.support();
        if p <= 0.0 {
            return lo;
        }
        if p >= 1.0 {
            return hi;
        }
        if self.parts.len() == 1 {
            return self.parts[0].1.quantile_near(p, hint);
        }
        if let Some(x) = hint.and_then(|h| self.quantile_from_hint(p, h)) {
            return x;
        }
        let qs: Vec<f64> = self.parts.iter().map(|(_, d)| d.quantile(p)).collect();
        let (mut a, mut b) = qs
            .iter()
            .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), q| {
                (a.min(*q), b.max(*q))
            });
        if a == b {
            return a;
        }
        let positive = self.positive();
        if positive {
            if a <= 0.0 {
                a = f64::MIN_POSITIVE;
            }
            if !b.is_finite() {
                b = f64::MAX;
            }
        }
        let to_x = |u: f64| if positive { u.exp() } else { u };
        let g = |u: f64| self.tail_gap(u, p, positive);
        let (ua, ub) = if positive { (a.ln(), b.ln()) } else { (a, b) };
        let start = hint
            .filter(|h| *h > a && *h < b)
            .map_or(0.5 * (ua + ub), |h| if positive { h.ln() } else { h });
        to_x(increasing_root(g, ua, ub, start, 1e-14))
    }

    /// The quantile searches' function of u (x = e^u on a positive support,
    /// else x = u): ln of the smaller-side tail at x against ln of its target,
    /// signed to increase with u, and its slope.
    fn tail_gap(&self, u: f64, p: f64, positive: bool) -> (f64, f64) {
        let upper = p > 0.5;
        let target = if upper { 1.0 - p } else { p };
        let x = if positive { u.exp() } else { u };
        let (lo, up) = self.tails(x);
        let t = if upper { up } else { lo };
        let dxdu = if positive { x } else { 1.0 };
        let slope = self.pdf(x) * dxdu / t;
        if upper {
            (target.ln() - t.ln(), slope)
        } else {
            (t.ln() - target.ln(), slope)
        }
    }

    /// The p-quantile found by bracketing outward from a nearby value (a
    /// sweep's previous point): a few tail evaluations instead of one
    /// quantile per component. None when no bracket is found close by; the
    /// caller then brackets with the components' quantiles.
    fn quantile_from_hint(&self, p: f64, hint: f64) -> Option<f64> {
        let (lo, hi) = self.support();
        if !(hint.is_finite() && hint > lo && hint < hi) {
            return None;
        }
        let positive = self.positive();
        let to_x = |u: f64| if positive { u.exp() } else { u };
        let g = |u: f64| self.tail_gap(u, p, positive);
        let u0 = if positive { hint.ln() } else { hint };
        let g0 = g(u0).0;
        if !g0.is_finite() {
            return None;
        }
        if g0 == 0.0 {
            return Some(hint);
        }
        let mut step = if positive {
            0.01
        } else {
            0.01 * self.sd().filter(|s| s.is_finite() && *s > 0.0)?
        };
        let dir = if g0 < 0.0 { 1.0 } else { -1.0 };
        let mut near = u0;
        for _ in 0..12 {
            let far = near + dir * step;
            if to_x(far) <= lo || to_x(far) >= hi {
                return None;
            }
            let gf = g(far).0;
            if !gf.is_finite() {
                return None;
            }
            if (gf < 0.0) != (g0 < 0.0) || gf == 0.0 {
                let (ua, ub) = if dir > 0.0 { (near, far) } else { (far, near) };
                return Some(to_x(increasing_root(g, ua, ub, 0.5 * (ua + ub), 1e-14)));
            }
            near = far;
            step *= 2.0;
        }
        None
    }

    /// The p-quantile.
    pub fn quantile(&self, p: f64) -> f64 {
        self.quantile_near(p, None)
    }

    /// A grid over where the mass is, uniform in ln x for positive support.
    fn grid(&self) -> Vec<f64> {
        let lo = self
            .parts
            .iter()
            .map(|(_, d)| d.quantile(1e-9))
            .fold(f64::INFINITY, f64::min);
        let hi = self
            .parts
            .iter()
            .map(|(_, d)| d.quantile(1.0 - 1e-9))
            .fold(f64::NEG_INFINITY, f64::max);
        let positive = self.positive() && lo > 0.0;
        let (a, b) = if positive {
            (lo.ln(), hi.ln())
        } else {
            (lo, hi)
        };
        (0..=GRID)
            .map(|i| {
                let u = a + (b - a) * i as f64 / GRID as f64;
                if positive { u.exp() } else { u }
            })
            .filter(|x| x.is_finite())
            .collect()
    }

    /// The mode: the highest grid point, refined by golden-section search;
    /// None if some part's density is unbounded.
    pub fn mode(&self) -> Option<f64> {
        if self.parts.iter().any(|(_, d)| d.mode().is_none()) {
            return None;
        }
        let grid = self.grid();
        let mut best = 0;
        for (i, x) in grid.iter().enumerate() {
            if self.pdf(*x) > self.pdf(grid[best]) {
                best = i;
            }
        }
        let (mut a, mut b) = (
            grid[best.saturating_sub(1)],
            grid[(best + 1).min(grid.len() - 1)],
        );
        let r = 0.5 * (5f64.sqrt() - 1.0);
        for _ in 0..200 {
            let c = b - r * (b - a);
            let d = a + r * (b - a);
            if self.pdf(c) >= self.pdf(d) {
                b = d;
            } else {
                a = c;
            }
            if (b - a).abs() <= 1e-13 * a.abs().max(b.abs()) {
                break;
            }
        }
        Some(0.5 * (a + b))
    }

    /// The point between a (f ≥ k) and b (f < k) where f crosses k.
    fn crossing(&self, mut inside: f64, mut outside: f64, k: f64) -> f64 {
        for _ in 0..200 {
            let mid = 0.5 * (inside + outside);
            if mid == inside || mid == outside {
                break;
            }
            if self.pdf(mid) >= k {
                inside = mid;
            } else {
                outside = mid;
            }
        }
        0.5 * (inside + outside)
    }

    /// Pieces of {x : f(x) ≥ k}, with the mass they hold.
    fn region(&self, grid: &[f64], dens: &[f64], k: f64) -> (Vec<(f64, f64)>, f64) {
        let (lo, hi) = self.support();
        let mut pieces = Vec::new();
        let mut start: Option<f64> = None;
        for i in 0..grid.len() {
            let inside = dens[i] >= k;
            match (inside, start) {
                (true, None) => {
                    start = Some(if i > 0 {
                        self.crossing(grid[i], grid[i - 1], k)
                    } else if lo.is_finite() {
                        // Dense already at the grid's first point: from the support's end.
                        lo
                    } else {
                        grid[0]
                    });
                }
                (false, Some(s)) => {
                    pieces.push((s, self.crossing(grid[i - 1], grid[i], k)));
                    start = None;
                }
                _ => {}
            }
        }
        if let Some(s) = start {
            pieces.push((
                s,
                if hi.is_finite() {
                    hi
                } else {
                    grid[grid.len() - 1]
                },
            ));
        }
        let mass = pieces
            .iter()
            .map(|(a, b)| self.tails(*b).0 - self.tails(*a).0)
            .sum();
        (pieces, mass)
    }

    /// The highest-density region at `level`, in one or more pieces.
    pub fn hpd_interval(&self, level: f64) -> Interval {
        if self.parts.len() == 1 {
            return self.parts[0].1.hpd_interval(level);
        }
        let grid = self.grid();
        let dens: Vec<f64> = grid.iter().map(|x| self.pdf(*x)).collect();
        let top = dens
            .iter()
            .copied()
            .filter(|d| d.is_finite())
            .fold(0.0, f64::max);
        // Mass held decreases in k: bisection on ln k between tiny and the peak.
        let (mut lk_in, mut lk_out) = ((top * 1e-300).max(f64::MIN_POSITIVE).ln(), top.ln());
        let mut best = self.region(&grid, &dens, lk_in.exp());
        for _ in 0..100 {
            let mid = 0.5 * (lk_in + lk_out);
            let r = self.region(&grid, &dens, mid.exp());
            if r.1 >= level {
                lk_in = mid;
                best = r;
            } else {
                lk_out = mid;
            }
            if (lk_out - lk_in).abs() < 1e-10 {
                break;
            }
        }
        let pieces = best.0;
        let lower = pieces.first().map_or(f64::NAN, |p| p.0);
        let upper = pieces.last().map_or(f64::NAN, |p| p.1);
        Interval {
            level,
            lower,
            upper,
            pieces: if pieces.len() > 1 { pieces } else { Vec::new() },
        }
    }
}
