//! How much the posterior depends on the prior: sweeps of the ESS and of the
//! prior's centre, and the posterior under stated alternative priors.
//!
//! Every sweep point is an ordinary conjugate update of a modified prior, so
//! the ×1 point and the unshifted point are the plain posterior exactly.

use crate::distribution::Law;
use crate::elicit::dials::{self, Dial};
use crate::elicit::{Belief, Mixture};
use crate::error::{Error, Result};
use crate::family::{Data, Prior};

/// The smallest and largest ESS factor of the default sweep.
pub const ESS_FACTORS: (f64, f64) = (0.1, 10.0);

/// One point of a sweep: the knob's value and the posterior of the unknown.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Point {
    /// The ESS factor, or the prior centre.
    pub x: f64,
    /// Posterior mean (None where it does not exist).
    pub mean: Option<f64>,
    /// Lower end of the posterior central interval.
    pub lower: f64,
    /// Upper end.
    pub upper: f64,
}

/// A sweep over one knob for one unknown.
#[derive(Clone, Debug, PartialEq)]
pub struct Sweep {
    /// The unknown summarised.
    pub parameter: String,
    /// Central interval level.
    pub level: f64,
    /// The knob's value for the elicited prior (ESS factor 1, or its centre).
    pub elicited: f64,
    /// The points, in increasing x.
    pub points: Vec<Point>,
}

/// `n` factors from ×0.1 to ×10, evenly spaced on a log axis; with `n` odd
/// the middle one is exactly 1.
pub fn log_factors(n: usize) -> Vec<f64> {
    let (lo, hi) = (ESS_FACTORS.0.ln(), ESS_FACTORS.1.ln());
    match n {
        0 => Vec::new(),
        1 => vec![1.0],
        _ => (0..n)
            .map(|i| {
                if 2 * i + 1 == n {
                    1.0
                } else {
                    (lo + (hi - lo) * i as f64 / (n - 1) as f64).exp()
                }
            })
            .collect(),
    }
}

/// The belief with every component's ESS multiplied by `factor` (centres and
/// mixture weights kept).
pub fn scale_belief(belief: &Belief, factor: f64) -> Result<Belief> {
    if factor == 1.0 {
        // Exactly the belief: rebuilding a mixture would renormalise its
        // weights and move them in the last bit.
        return Ok(belief.clone());
    }
    Ok(match belief {
        Belief::One(p) => Belief::One(dials::scaled(p, factor)?),
        Belief::Mix(m) => Belief::Mix(Mixture::new(
            m.components()
                .iter()
                .map(|(w, p)| Ok((*w, dials::scaled(p, factor)?)))
                .collect::<Result<Vec<_>>>()?,
        )?),
    })
}

/// The belief with its centre on `dial` moved to `centre`, ESS kept. A
/// mixture moves every component by the same amount on the centre's open
/// scale (logit for a share, log for a rate or variance, as is for a mean),
/// so no component leaves its range; the amount is solved for so that the
/// weighted centre lands on `centre`.
pub fn shift_belief(belief: &Belief, dial: Dial, centre: f64) -> Result<Belief> {
    let (lo, hi) = dials::centre_range(belief.representative(), dial);
    if !(centre.is_finite() && centre > lo && centre < hi) {
        return Err(Error::invalid(
            "prior centre",
            centre,
            "it lies outside the range the unknown can take",
        ));
    }
    let move_one = |p: &Prior, c: f64| {
        let s = dials::setting(p, dial);
        dials::with_setting(
            p,
            dial,
            dials::Setting {
                centre: c,
                ess: s.ess,
            },
        )
    };
    Ok(match belief {
        Belief::One(p) => Belief::One(move_one(p, centre)?),
        Belief::Mix(m) => {
            let (to, from) = open_scale(lo, hi);
            let centres: Vec<(f64, f64)> = m
                .components()
                .iter()
                .map(|(w, p)| (*w, to(dials::setting(p, dial).centre)))
                .collect();
            let at = |d: f64| -> f64 { centres.iter().map(|(w, u)| w * from(u + d)).sum() };
            // The weighted centre increases with the shift: bisect for it.
            let (mut a, mut b) = (-1.0, 1.0);
            while at(a) > centre && a > -1e6 {
                a *= 2.0;
            }
            while at(b) < centre && b < 1e6 {
                b *= 2.0;
            }
            for _ in 0..200 {
                let mid = 0.5 * (a + b);
                if mid == a || mid == b {
                    break;
                }
                if at(mid) < centre {
                    a = mid;
                } else {
                    b = mid;
                }
            }
            let d = 0.5 * (a + b);
            Belief::Mix(Mixture::new(
                m.components()
                    .iter()
                    .zip(&centres)
                    .map(|((w, p), (_, u))| Ok((*w, move_one(p, from(u + d))?)))
                    .collect::<Result<Vec<_>>>()?,
            )?)
        }
    })
}

/// A map of the real line.
type Map = fn(f64) -> f64;

/// Maps a centre's open range to the whole line and back.
fn open_scale(lo: f64, hi: f64) -> (Map, Map) {
    if lo == 0.0 && hi == 1.0 {
        (|x| (x / (1.0 - x)).ln(), |u| 1.0 / (1.0 + (-u).exp()))
    } else if lo == 0.0 {
        (f64::ln, f64::exp)
    } else {
        (|x| x, |u| u)
    }
}

/// The belief's centre on a dial (a mixture's: the weighted centre).
pub fn centre_of(belief: &Belief, dial: Dial) -> f64 {
    match belief {
        Belief::One(p) => dials::setting(p, dial).centre,
        Belief::Mix(m) => weighted_centre(m, dial),
    }
}

fn weighted_centre(m: &Mixture, dial: Dial) -> f64 {
    m.components()
        .iter()
        .map(|(w, p)| w * dials::setting(p, dial).centre)
        .sum()
}

/// The posterior central interval and mean of one marginal.
fn posterior_point(
    belief: &Belief,
    data: &[Data],
    index: usize,
    level: f64,
    x: f64,
    hint: Option<(f64, f64)>,
) -> Result<Point> {
    let mut post = belief.clone();
    for d in data {
        post = post.update(d)?;
    }
    let law = marginal(&post, index)?;
    let a = 0.5 * (1.0 - level);
    // A neighbouring point's ends start the search (the sweep's cost is
    // mostly these two quantiles); the elicited point gets no hint, so it
    // is found exactly as the plain posterior's summary finds it.
    let lower = law.quantile_near(a, hint.map(|h| h.0));
    let upper = law.quantile_near(1.0 - a, hint.map(|h| h.1));
    Ok(Point {
        x,
        mean: law.mean(),
        lower,
        upper,
    })
}

fn marginal(belief: &Belief, index: usize) -> Result<Law> {
    belief
        .marginals()
        .into_iter()
        .nth(index)
        .map(|(_, l)| l)
        .ok_or_else(|| Error::Rule(format!("the prior has no unknown number {}", index + 1)))
}

fn check_level(level: f64) -> Result<()> {
    if level > 0.0 && level < 1.0 {
        Ok(())
    } else {
        Err(Error::invalid(
            "interval level",
            level,
            "it must lie strictly between 0 and 1",
        ))
    }
}

/// The posterior of the dial's unknown as the ESS of the belief is scaled by
/// each factor.
pub fn ess_sweep(
    belief: &Belief,
    data: &[Data],
    dial: Dial,
    factors: &[f64],
    level: f64,
) -> Result<Sweep> {
    check_level(level)?;
    let index = dials::marginal_index(belief.representative(), dial);
    let mut points = Vec::with_capacity(factors.len());
    let mut hint = None;
    for &f in factors {
        let h = if f == 1.0 { None } else { hint };
        let p = posterior_point(&scale_belief(belief, f)?, data, index, level, f, h)?;
        hint = Some((p.lower, p.upper));
        points.push(p);
    }
    Ok(Sweep {
        parameter: name_of(belief, index),
        level,
        elicited: 1.0,
        points,
    })
}

/// The posterior of the dial's unknown as the prior centre moves across the
/// prior's own central `level` interval of that unknown (its plausible
/// range), ESS kept, at `n` evenly spaced centres; the unshifted centre is
/// always one of the points. Centres a component cannot take are left out.
pub fn centre_sweep(
    belief: &Belief,
    data: &[Data],
    dial: Dial,
    n: usize,
    level: f64,
) -> Result<Sweep> {
    check_level(level)?;
    let index = dials::marginal_index(belief.representative(), dial);
    let law = marginal(belief, index)?;
    let a = 0.5 * (1.0 - level);
    let (lo, hi) = (law.quantile_near(a, None), law.quantile_near(1.0 - a, None));
    let here = centre_of(belief, dial);
    let mut xs: Vec<f64> = (0..n.max(2))
        .map(|i| lo + (hi - lo) * i as f64 / (n.max(2) - 1) as f64)
        .collect();
    xs.push(here);
    xs.sort_by(f64::total_cmp);
    xs.dedup();
    let mut points = Vec::with_capacity(xs.len());
    let mut hint = None;
    for x in xs {
        let shifted = if x == here {
            belief.clone()
        } else {
            match shift_belief(belief, dial, x) {
                Ok(b) => b,
                Err(_) => continue,
            }
        };
        let h = if x == here { None } else { hint };
        let p = posterior_point(&shifted, data, index, level, x, h)?;
        hint = Some((p.lower, p.upper));
        points.push(p);
    }
    Ok(Sweep {
        parameter: name_of(belief, index),
        level,
        elicited: here,
        points,
    })
}

fn name_of(belief: &Belief, index: usize) -> String {
    belief
        .marginals()
        .into_iter()
        .nth(index)
        .map_or_else(String::new, |(n, _)| n)
}

/// A prior to compare the elicited one with.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Alternative {
    /// Short name ("vague", "sceptical" …).
    pub name: String,
    /// How it was built, in words, for the record.
    pub how: String,
    /// The prior.
    pub prior: Prior,
}

/// The defaults: vague, sceptical and enthusiastic, built from one
/// conjugate prior `base` (the elicited prior, or for several experts their
/// logarithmic pool) on the dial's unknown.
///
/// - vague: the same centre, worth one observation
///   ([`Prior::unit_information`]);
/// - sceptical: the same ESS, centred at the base prior's 10% point on the
///   side away from the data's estimate (without data, below);
/// - enthusiastic: the same ESS, centred at its 10% point on the side of the
///   data (without data, above).
///
/// Centring the sceptical and enthusiastic priors off the elicited centre in
/// opposite directions follows the idea of Spiegelhalter, Freedman and
/// Parmar (JRSS A 157, 1994) of priors that doubt or favour what the data
/// show; the 10% points are our own default and can be edited.
pub fn default_alternatives(
    base: &Prior,
    data: Option<&[Data]>,
    dial: Dial,
) -> Result<Vec<Alternative>> {
    let index = dials::marginal_index(base, dial);
    let law = base.marginals()[index].distribution;
    let s = dials::setting(base, dial);
    let (q10, q90) = (law.quantile_near(0.1, None), law.quantile_near(0.9, None));
    // The data's direction: where the posterior moved the centre.
    let up = match data {
        Some(ds) if !ds.is_empty() => {
            let mut post = base.clone();
            for d in ds {
                post = post.update(d)?;
            }
            dials::setting(&post, dial).centre >= s.centre
        }
        _ => true,
    };
    let (sceptic, enthusiast) = if up { (q10, q90) } else { (q90, q10) };
    let centred = |c: f64| {
        dials::with_setting(
            base,
            dial,
            dials::Setting {
                centre: c,
                ess: s.ess,
            },
        )
    };
    let side = |c: f64| if c < s.centre { "lower" } else { "upper" };
    let what = if data.is_some() {
        "the data"
    } else {
        "no data yet"
    };
    Ok(vec![
        Alternative {
            name: "vague".to_owned(),
            how: "same centre, worth one observation (unit information)".to_owned(),
            prior: base.unit_information()?,
        },
        Alternative {
            name: "sceptical".to_owned(),
            how: format!(
                "same ESS, centred at the elicited prior's {} 10% point (away from {what})",
                side(sceptic)
            ),
            prior: centred(sceptic)?,
        },
        Alternative {
            name: "enthusiastic".to_owned(),
            how: format!(
                "same ESS, centred at the elicited prior's {} 10% point (towards {what})",
                side(enthusiast)
            ),
            prior: centred(enthusiast)?,
        },
    ])
}

/// The prior's share of the posterior information over several data sets:
/// with information adding up, each set's share s_i = I₀/(I₀ + I_i) gives
/// I_i/I₀ = 1/s_i − 1, so the whole share is 1/(1 + Σ(1/s_i − 1)).
pub fn prior_share(belief: &Belief, data: &[Data]) -> Result<f64> {
    let mut rest = 0.0;
    for d in data {
        let s = belief.prior_share(d)?;
        if s <= 0.0 {
            return Ok(0.0);
        }
        rest += 1.0 / s - 1.0;
    }
    Ok(1.0 / (1.0 + rest))
}

/// One row of the side-by-side table.
#[derive(Clone, Debug, PartialEq)]
pub struct Compared {
    /// The prior's name.
    pub name: String,
    /// How it was built.
    pub how: String,
    /// Prior mean of the unknown.
    pub prior_mean: Option<f64>,
    /// The posterior of the unknown.
    pub posterior: Point,
    /// The prior's share of the posterior information.
    pub prior_share: f64,
}

/// The posterior of the dial's unknown under the elicited belief (first row)
/// and under each alternative.
pub fn compare(
    belief: &Belief,
    alternatives: &[Alternative],
    data: &[Data],
    dial: Dial,
    level: f64,
) -> Result<Vec<Compared>> {
    check_level(level)?;
    let index = dials::marginal_index(belief.representative(), dial);
    let row = |name: &str, how: &str, b: &Belief| -> Result<Compared> {
        Ok(Compared {
            name: name.to_owned(),
            how: how.to_owned(),
            prior_mean: marginal(b, index)?.mean(),
            posterior: posterior_point(b, data, index, level, f64::NAN, None)?,
            prior_share: prior_share(b, data)?,
        })
    };
    let mut out = vec![row("elicited", "the project's prior", belief)?];
    for a in alternatives {
        if a.prior.id() != belief.id() {
            return Err(Error::Rule(format!(
                "alternative '{}' is a {} prior in a {} project",
                a.name,
                a.prior.id(),
                belief.id()
            )));
        }
        out.push(row(&a.name, &a.how, &Belief::One(a.prior.clone()))?);
    }
    Ok(out)
}

/// Points in the ESS sweep shown and reported (odd: ×1 is one of them).
pub const ESS_POINTS: usize = 201;
/// Points in the centre sweep.
pub const CENTRE_POINTS: usize = 41;

/// The whole sensitivity check of one belief against the data.
#[derive(Clone, Debug, PartialEq)]
pub struct Sensitivity {
    /// Posterior as the ESS is scaled.
    pub ess: Sweep,
    /// Posterior as the prior centre moves.
    pub centre: Sweep,
    /// The alternatives compared (the project's own, or the defaults).
    pub alternatives: Vec<Alternative>,
    /// Whether the alternatives are the defaults.
    pub default_alternatives: bool,
    /// Elicited prior first, then each alternative.
    pub table: Vec<Compared>,
}

/// Runs the sweeps and the comparison. `base` is the one conjugate prior the
/// default alternatives are built from; `stated` are the project's own
/// alternatives (empty: the defaults).
pub fn run(
    belief: &Belief,
    base: &Prior,
    stated: &[Alternative],
    data: &[Data],
    dial: Dial,
    level: f64,
) -> Result<Sensitivity> {
    let (alternatives, default_alternatives) = if stated.is_empty() {
        (default_alternatives(base, Some(data), dial)?, true)
    } else {
        (stated.to_vec(), false)
    };
    Ok(Sensitivity {
        ess: ess_sweep(belief, data, dial, &log_factors(ESS_POINTS), level)?,
        centre: centre_sweep(belief, data, dial, CENTRE_POINTS, level)?,
        table: compare(belief, &alternatives, data, dial, level)?,
        alternatives,
        default_alternatives,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn log_factors_span_a_hundredfold_with_one_in_the_middle() {
        let f = log_factors(201);
        assert_eq!(f.len(), 201);
        assert_eq!(f[100], 1.0);
        assert!((f[0] - 0.1).abs() < 1e-15 && (f[200] - 10.0).abs() < 1e-12);
        assert!(f.windows(2).all(|w| w[0] < w[1]));
    }

    #[test]
    fn a_mixture_shift_moves_every_component_alike_on_the_logit_scale() {
        let m = Belief::Mix(
            Mixture::new(vec![
                (
                    0.5,
                    Prior::parse("beta-binomial", "alpha=2,beta=8").unwrap(),
                ),
                (
                    0.5,
                    Prior::parse("beta-binomial", "alpha=3,beta=7").unwrap(),
                ),
            ])
            .unwrap(),
        );
        for target in [0.02, 0.2, 0.97] {
            let Belief::Mix(s) = shift_belief(&m, Dial::Main, target).unwrap() else {
                panic!()
            };
            let c: Vec<f64> = s
                .components()
                .iter()
                .map(|(_, p)| dials::setting(p, Dial::Main).centre)
                .collect();
            let logit = |x: f64| (x / (1.0 - x)).ln();
            // Same logit shift for both: logit(c) − logit(c0) agrees.
            let (d0, d1) = (logit(c[0]) - logit(0.2), logit(c[1]) - logit(0.3));
            assert!((d0 - d1).abs() < 1e-9, "{target}: {d0} {d1}");
            assert!(
                (0.5 * (c[0] + c[1]) - target).abs() < 1e-12,
                "{target}: {c:?}"
            );
        }
        assert!(shift_belief(&m, Dial::Main, 1.2).is_err());
    }

    #[test]
    fn the_alternatives_lean_away_from_and_towards_the_data() {
        let b = Prior::parse("beta-binomial", "alpha=5,beta=15").unwrap();
        let data = b.parse_data("successes=20,trials=40").unwrap();
        let alts = default_alternatives(&b, Some(&[data]), Dial::Main).unwrap();
        let c = |i: usize| dials::setting(&alts[i].prior, Dial::Main).centre;
        assert!((c(0) - 0.25).abs() < 1e-12, "vague keeps the centre");
        assert!(
            c(1) < 0.25 && c(2) > 0.25,
            "data above the prior: {} {}",
            c(1),
            c(2)
        );
    }
}
