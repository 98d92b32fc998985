//! Everything the plots and tables show, computed from the project and the
//! view settings, and recomputed only when those change.
//!
//! Nothing here is drawn: these are plain numbers from the core, so a panel
//! shows exactly what the command line would report.

use crate::analysis::curve;
use crate::analysis::sensitivity::{self, Sensitivity};
use crate::analysis::summary::{self, ParameterSummary, SummaryOptions};
use crate::distribution::Law;
use crate::elicit::{Belief, dials};
use crate::family::{Conflict, Future, Predictive, Prior};
use crate::project::Project;

/// Curve points kept per density (adaptive; see [`curve::sample`]).
const CURVE_POINTS: usize = 400;

/// What the numbers depend on.
#[derive(Clone, Debug, PartialEq)]
pub struct Inputs {
    /// The project.
    pub project: Project,
    /// Selected expert.
    pub expert: usize,
    /// Selected dial.
    pub dial: dials::Dial,
    /// Future sample size, exposure or time for the predictive.
    pub future: f64,
    /// Threshold c for P(> c).
    pub threshold: f64,
    /// x-range held still while a handle is dragged.
    pub frozen_range: Option<(f64, f64)>,
}

/// One curve for a plot.
#[derive(Clone, Debug, PartialEq)]
pub struct Curve {
    /// Legend name.
    pub name: String,
    /// Points.
    pub points: Vec<[f64; 2]>,
}

/// The prior panel: the selected expert's marginal, with the others and the pool.
#[derive(Clone, Debug, PartialEq)]
pub struct PriorView {
    /// The unknown's name.
    pub unknown: String,
    /// Plotted x-range.
    pub range: (f64, f64),
    /// The selected expert's density.
    pub density: Curve,
    /// The other experts' densities.
    pub others: Vec<(usize, Curve)>,
    /// The pooled density, when there is more than one expert.
    pub pooled: Option<Curve>,
    /// The selected expert's cumulative curve.
    pub cdf: Curve,
    /// Centre handle (x, density there).
    pub centre: [f64; 2],
    /// Spread handle at the 95% point (x, density there).
    pub spread: [f64; 2],
    /// The dials' values.
    pub setting: dials::Setting,
    /// The selected expert's summary of that unknown.
    pub summary: Option<ParameterSummary>,
    /// "as if you had already seen …".
    pub as_if: String,
}

/// The prior predictive.
#[derive(Clone, Debug, PartialEq)]
pub enum PredictiveView {
    /// Counts: (k, probability) bars.
    Bars(Vec<(f64, f64)>),
    /// A continuous value: its density.
    Density(Curve),
    /// Per category: (name, mean count, 5% and 95% points).
    Categories(Vec<(String, f64, f64, f64)>),
}

/// The predictive with its summaries.
#[derive(Clone, Debug, PartialEq)]
pub struct Predicted {
    /// What is predicted, in words.
    pub what: String,
    /// The plot.
    pub view: PredictiveView,
    /// Mean, sd, 5%, 50%, 95% (of the first predictive for categories).
    pub lines: Vec<(String, String)>,
}

/// Prior, likelihood and posterior once data are in.
#[derive(Clone, Debug, PartialEq)]
pub struct PosteriorView {
    /// The unknown's name.
    pub unknown: String,
    /// The pooled prior's density.
    pub prior: Curve,
    /// The likelihood, scaled to unit area over the plotted range.
    pub likelihood: Curve,
    /// The posterior density.
    pub posterior: Curve,
    /// The posterior summary of the unknown (with P(> c)).
    pub summary: ParameterSummary,
    /// Share of the posterior's information from the prior.
    pub prior_share: Option<f64>,
    /// Prior–data conflict check (one data set against the prior).
    pub conflict: Option<Conflict>,
    /// ESS and centre sweeps and the alternatives, or why they failed.
    pub sensitivity: Result<Sensitivity, String>,
}

/// All derived numbers.
#[derive(Clone, Debug, PartialEq)]
pub struct Derived {
    /// The pooled belief, or why there is none.
    pub belief: Result<Belief, String>,
    /// The prior panel.
    pub prior: Option<PriorView>,
    /// The predictive.
    pub predictive: Result<Predicted, String>,
    /// The posterior, when there are data.
    pub posterior: Option<Result<PosteriorView, String>>,
}

/// Derived numbers with the inputs they came from.
#[derive(Debug, Default)]
pub struct Cache {
    inputs: Option<Inputs>,
    derived: Option<Derived>,
    /// How many times the numbers were computed (the frame bench and tests
    /// check that an unchanged frame computes nothing).
    pub computed: u64,
}

impl Cache {
    /// The numbers for `inputs`, recomputed only if they changed.
    pub fn get(&mut self, inputs: &Inputs) -> &Derived {
        if self.inputs.as_ref() != Some(inputs) || self.derived.is_none() {
            self.derived = Some(compute(inputs));
            self.inputs = Some(inputs.clone());
            self.computed += 1;
        }
        self.derived.get_or_insert_with(|| compute(inputs))
    }
}

fn law_support(law: &Law) -> (f64, f64) {
    match law {
        Law::One(d) => d.support(),
        Law::Mix(m) => m.support(),
    }
}

/// A plotting range holding nearly all of each law's mass.
fn range_of(laws: &[&Law]) -> (f64, f64) {
    let mut lo = f64::INFINITY;
    let mut hi = f64::NEG_INFINITY;
    for l in laws {
        let (a, b) = (l.quantile_near(0.002, None), l.quantile_near(0.998, None));
        if a.is_finite() && b.is_finite() {
            lo = lo.min(a);
            hi = hi.max(b);
        }
    }
    if !(lo.is_finite() && hi.is_finite() && hi > lo) {
        return (0.0, 1.0);
    }
    let pad = 0.06 * (hi - lo);
    let (s0, s1) = laws
        .first()
        .map_or((f64::NEG_INFINITY, f64::INFINITY), |l| law_support(l));
    ((lo - pad).max(s0), (hi + pad).min(s1))
}

fn density(name: &str, law: &Law, range: (f64, f64)) -> Curve {
    Curve {
        name: name.to_owned(),
        points: curve::sample(|x| law.pdf(x), range.0, range.1, CURVE_POINTS),
    }
}

fn compute(inputs: &Inputs) -> Derived {
    let p = &inputs.project;
    let belief = p.belief().map_err(|e| e.to_string());
    let expert = p.experts.get(inputs.expert).or_else(|| p.experts.first());
    let prior = expert.map(|e| prior_view(inputs, &e.prior, belief.as_ref().ok()));
    let predictive = match &belief {
        Ok(b) => predictive(b, inputs.future),
        Err(e) => Err(e.clone()),
    };
    let posterior = (!p.data.is_empty()).then(|| match &belief {
        Ok(b) => posterior_view(inputs, b),
        Err(e) => Err(e.clone()),
    });
    Derived {
        belief,
        prior,
        predictive,
        posterior,
    }
}

fn prior_view(inputs: &Inputs, prior: &Prior, pooled: Option<&Belief>) -> PriorView {
    let p = &inputs.project;
    let dial = if dials::available(prior).contains(&inputs.dial) {
        inputs.dial
    } else {
        dials::first(prior)
    };
    let m = dials::marginal_index(prior, dial);
    let marginals = prior.marginals();
    let own = Law::One(marginals[m].distribution);
    let pooled_law = pooled
        .filter(|_| p.experts.len() > 1 || p.pooling.robust_weight.is_some())
        .and_then(|b| b.marginals().get(m).map(|(_, l)| l.clone()));
    // The range follows the experts' own priors: a robust mixture's vague
    // component would stretch it over the whole support.
    let expert_laws: Vec<Law> = p
        .experts
        .iter()
        .filter_map(|e| e.prior.marginals().get(m).map(|x| Law::One(x.distribution)))
        .collect();
    let range = inputs.frozen_range.unwrap_or_else(|| {
        let mut laws = vec![&own];
        laws.extend(expert_laws.iter());
        range_of(&laws)
    });
    let others = p
        .experts
        .iter()
        .enumerate()
        .filter(|(i, _)| *i != inputs.expert)
        .filter_map(|(i, e)| {
            let law = Law::One(e.prior.marginals().get(m)?.distribution);
            Some((i, density(&e.name, &law, range)))
        })
        .collect();
    let setting = dials::setting(prior, dial);
    let spread_x = dials::spread_point(prior, dial);
    let summary = summary::summarize(&marginals[m..=m], &SummaryOptions::default())
        .ok()
        .and_then(|mut v| v.pop());
    let cdf = Curve {
        name: "cumulative".to_owned(),
        points: curve::sample(|x| own.tails(x).0, range.0, range.1, CURVE_POINTS),
    };
    PriorView {
        unknown: marginals[m].name.clone(),
        range,
        density: density("this expert", &own, range),
        others,
        pooled: pooled_law.map(|l| density("pooled", &l, range)),
        cdf,
        centre: [setting.centre, own.pdf(setting.centre)],
        spread: [spread_x, own.pdf(spread_x)],
        setting,
        summary,
        as_if: prior.as_if(),
    }
}

/// The future sample the predictive is for, and its words.
pub fn future_of(prior: &Prior, size: f64) -> (Future, String) {
    let whole = size.round().max(1.0) as u64;
    match prior {
        Prior::BetaBinomial(_) => (
            Future::Trials(whole),
            format!("successes in {whole} future trials"),
        ),
        Prior::GammaPoisson(_) => (
            Future::Exposure(size.max(1e-9)),
            format!(
                "events in {} units of exposure",
                crate::family::words::short(size)
            ),
        ),
        Prior::GammaExponential(_) => (Future::Values(1), "the next waiting time".to_owned()),
        Prior::DirichletMultinomial(_) => (
            Future::Trials(whole),
            format!("counts per category in {whole} future draws"),
        ),
        Prior::InverseGammaVariance(_) => (Future::Values(1), "the next value".to_owned()),
        _ => (
            Future::Values(whole),
            if whole == 1 {
                "the next value".to_owned()
            } else {
                format!("the mean of {whole} future values")
            },
        ),
    }
}

/// What the future-size field means for a family (None: it has none).
pub fn future_words(prior: &Prior) -> Option<&'static str> {
    match prior {
        Prior::BetaBinomial(_) => Some("future trials"),
        Prior::GammaPoisson(_) => Some("future exposure"),
        Prior::DirichletMultinomial(_) => Some("future draws"),
        Prior::NormalKnownVariance(_) | Prior::NormalInverseGamma(_) => Some("future values"),
        _ => None,
    }
}

fn predictive(belief: &Belief, size: f64) -> Result<Predicted, String> {
    let (future, what) = future_of(belief.representative(), size);
    let parts = belief.predictive(&future).map_err(|e| e.to_string())?;
    let probs = [0.05, 0.5, 0.95];
    let sums =
        summary::summarize_mixed_predictive(&parts, &probs, &[]).map_err(|e| e.to_string())?;
    let num = |v: Option<f64>| v.map_or("–".to_owned(), crate::family::words::short);
    let lines = sums
        .first()
        .map(|s| {
            let mut l = vec![
                ("mean".to_owned(), num(s.mean)),
                ("sd".to_owned(), num(s.sd)),
            ];
            for (p, q) in &s.quantiles {
                l.push((format!("{}% point", p * 100.0), num(Some(*q))));
            }
            l
        })
        .unwrap_or_default();
    let view = match parts.first().map(|(_, p)| p) {
        Some(Predictive::Count(_)) => {
            let s = &sums[0];
            let hi = s.quantiles.last().map_or(10.0, |q| q.1);
            let top = (hi * 1.6 + 5.0).min(hi + 400.0).max(1.0) as u64;
            let bars = (0..=top)
                .map(|k| {
                    let pk: f64 = parts
                        .iter()
                        .map(|(w, p)| match p {
                            Predictive::Count(d) => w * d.pmf(k),
                            _ => 0.0,
                        })
                        .sum();
                    (k as f64, pk)
                })
                .collect();
            PredictiveView::Bars(bars)
        }
        Some(Predictive::Value(_)) => {
            let laws: Vec<(f64, crate::distribution::Continuous)> = parts
                .iter()
                .filter_map(|(w, p)| match p {
                    Predictive::Value(d) => Some((*w, *d)),
                    _ => None,
                })
                .collect();
            let law = if laws.len() == 1 {
                Law::One(laws[0].1)
            } else {
                Law::Mix(crate::distribution::MixtureLaw::new(laws))
            };
            let range = range_of(&[&law]);
            PredictiveView::Density(density("prior predictive", &law, range))
        }
        Some(Predictive::Categories(_)) => PredictiveView::Categories(
            sums.iter()
                .map(|s| {
                    let q = |i: usize| s.quantiles.get(i).map_or(f64::NAN, |q| q.1);
                    (
                        s.category.clone().unwrap_or_default(),
                        s.mean.unwrap_or(f64::NAN),
                        q(0),
                        q(2),
                    )
                })
                .collect(),
        ),
        None => return Err("no predictive".to_owned()),
    };
    Ok(Predicted { what, view, lines })
}

fn posterior_view(inputs: &Inputs, belief: &Belief) -> Result<PosteriorView, String> {
    let p = &inputs.project;
    let post = p
        .posterior()
        .map_err(|e| e.to_string())?
        .ok_or_else(|| "no data".to_owned())?;
    let prior_rep = belief.representative();
    let dial = if dials::available(prior_rep).contains(&inputs.dial) {
        inputs.dial
    } else {
        dials::first(prior_rep)
    };
    let m = dials::marginal_index(prior_rep, dial);
    let prior_laws = belief.marginals();
    let post_laws = post.marginals();
    let (Some((name, prior_law)), Some((_, post_law))) = (prior_laws.get(m), post_laws.get(m))
    else {
        return Err("no marginal to plot".to_owned());
    };
    let range = range_of(&[post_law, prior_law]);
    let prior_curve = density("prior", prior_law, range);
    let post_curve = density("posterior", post_law, range);
    // Posterior ∝ prior × likelihood, so their ratio is the likelihood up to
    // a constant (for μ of normal-inverse-gamma, the ratio of marginals).
    let ratio = |x: f64| {
        let (a, b) = (post_law.pdf(x), prior_law.pdf(x));
        if b > 0.0 && a.is_finite() {
            a / b
        } else {
            f64::NAN
        }
    };
    let mut lik = curve::sample(ratio, range.0, range.1, CURVE_POINTS);
    let area: f64 = lik
        .windows(2)
        .map(|w| 0.5 * (w[0][1] + w[1][1]) * (w[1][0] - w[0][0]))
        .sum();
    if area > 0.0 && area.is_finite() {
        for pt in &mut lik {
            pt[1] /= area;
        }
    } else {
        lik.clear();
    }
    let opts = SummaryOptions {
        cdf_points: vec![(Some(name.clone()), inputs.threshold)],
        ..SummaryOptions::default()
    };
    let summary = summary::summarize_laws(&post_laws[m..=m], &opts)
        .map_err(|e| e.to_string())?
        .pop()
        .ok_or_else(|| "no summary".to_owned())?;
    let data: Vec<_> = p.data.iter().map(|d| d.statistics.clone()).collect();
    let prior_share = sensitivity::prior_share(belief, &data)
        .ok()
        .filter(|s| *s > 0.0 && *s <= 1.0);
    // The conflict check is for one data set against the prior.
    let conflict = match p.data.as_slice() {
        [d] => belief.conflict(&d.statistics).ok().flatten(),
        _ => None,
    };
    let sensitivity = p
        .log_pool()
        .and_then(|base| sensitivity::run(belief, &base, &p.checks.alternatives, &data, dial, 0.95))
        .map_err(|e| e.to_string());
    Ok(PosteriorView {
        unknown: name.clone(),
        prior: prior_curve,
        likelihood: Curve {
            name: "scaled likelihood".to_owned(),
            points: lik,
        },
        posterior: post_curve,
        summary,
        prior_share,
        conflict,
        sensitivity,
    })
}
