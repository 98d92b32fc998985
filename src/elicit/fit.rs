//! Priors from stated probabilities: "P(unknown ≤ value) = p" judgments on an
//! unknown, or on a future observable through the prior predictive.
//!
//! Every family is fitted in unconstrained coordinates (logs of positive
//! hyperparameters) by minimising Σ (F(x_i) − p_i)², the plain unweighted sum.
//! The start is moment matching: the judgments' values are regressed on the
//! normal scores of their probabilities (on the log or logit scale where the
//! unknown is positive or a share), giving a mean and an sd that the family's
//! moment equations turn into hyperparameters; the spread is then tried at a few
//! multiples and the best kept. From there Levenberg–Marquardt only accepts
//! improving steps. With exactly as many judgments as free hyperparameters the
//! same iteration is Newton's method on the square system and the stated
//! probabilities are met exactly (reported as `exact`).

use super::lsq;
use crate::distribution::{Continuous, Discrete, guess_normal_quantile};
use crate::error::{Error, Result};
use crate::family::{
    BetaBinomial, DirichletMultinomial, Future, GammaExponential, GammaPoisson,
    InverseGammaVariance, NormalInverseGamma, NormalKnownVariance, Predictive, Prior,
};

/// One stated probability: P(target ≤ value) = p.
#[derive(Clone, Debug, PartialEq)]
pub struct Judgment {
    /// The unknown it is about (None: the family's first unknown).
    pub parameter: Option<String>,
    /// Cumulative probability.
    pub p: f64,
    /// Value.
    pub value: f64,
}

/// A judgment with the probability the fitted prior gives it.
#[derive(Clone, Debug, PartialEq)]
pub struct Fitted {
    /// What it is about: an unknown's name, or "predictive".
    pub target: String,
    /// Stated probability.
    pub p: f64,
    /// Value.
    pub value: f64,
    /// P(target ≤ value) under the fitted prior.
    pub fitted_p: f64,
}

/// How a fit was reached.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Method {
    /// As many judgments as free hyperparameters, met exactly.
    Exact,
    /// Least squares on the probability scale.
    LeastSquares,
}

impl Method {
    /// Name for output.
    pub fn name(self) -> &'static str {
        match self {
            Self::Exact => "exact",
            Self::LeastSquares => "least-squares",
        }
    }
}

/// A fitted prior with its account of the judgments.
#[derive(Clone, Debug, PartialEq)]
pub struct Fit {
    /// The prior.
    pub prior: Prior,
    /// Each judgment, stated and fitted.
    pub judgments: Vec<Fitted>,
    /// Σ (F(x_i) − p_i)².
    pub objective: f64,
    /// max |F(x_i) − p_i|.
    pub max_abs_error: f64,
    /// How it was reached.
    pub method: Method,
}

/// Known quantities and fixed parts of the prior.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Fixed {
    /// The data's known sd (normal-known-variance).
    pub sigma: Option<f64>,
    /// The data's known mean (inverse-gamma-variance).
    pub mu: Option<f64>,
    /// Mean shares (dirichlet-multinomial): only the total ESS is fitted.
    pub shares: Option<Vec<f64>>,
    /// Category names (dirichlet-multinomial).
    pub names: Option<Vec<String>>,
}

/// What the judgments are about.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Scale {
    /// The unknowns (each judgment names one, or the first).
    Unknowns,
    /// A future observable: the prior predictive of this future sample.
    Observable(Future),
}

/// Makes a prior from unconstrained coordinates.
type Builder = Box<dyn Fn(&[f64]) -> Result<Prior>>;

/// Free hyperparameters of a family, and how they make a prior.
struct Model {
    free: usize,
    build: Builder,
}

fn model(family: &str, fixed: &Fixed) -> Result<Model> {
    let fx = fixed.clone();
    let m = |free: usize, f: Builder| Ok(Model { free, build: f });
    match family {
        "beta-binomial" => m(
            2,
            Box::new(|t| Ok(BetaBinomial::new(t[0].exp(), t[1].exp())?.into())),
        ),
        "gamma-poisson" => m(
            2,
            Box::new(|t| Ok(GammaPoisson::new(t[0].exp(), t[1].exp())?.into())),
        ),
        "gamma-exponential" => m(
            2,
            Box::new(|t| Ok(GammaExponential::new(t[0].exp(), t[1].exp())?.into())),
        ),
        "normal-known-variance" => {
            let Some(sigma) = fx.sigma else {
                return Err(Error::Rule(
                    "fitting normal-known-variance needs the known sd: --fixed sigma=…".to_owned(),
                ));
            };
            m(
                2,
                Box::new(move |t| Ok(NormalKnownVariance::new(t[0], t[1].exp(), sigma)?.into())),
            )
        }
        "normal-inverse-gamma" => m(
            4,
            Box::new(|t| {
                Ok(NormalInverseGamma::new(t[0], t[1].exp(), t[2].exp(), t[3].exp())?.into())
            }),
        ),
        "inverse-gamma-variance" => {
            let mu = fx.mu;
            m(
                2,
                Box::new(
                    move |t| Ok(InverseGammaVariance::new(t[0].exp(), t[1].exp(), mu)?.into()),
                ),
            )
        }
        "dirichlet-multinomial" => {
            let Some(shares) = fx.shares.clone() else {
                return Err(Error::Rule(
                    "fitting dirichlet-multinomial needs the mean share of every category: --shares s1;s2;…".to_owned(),
                ));
            };
            // Validates the shares once, up front.
            DirichletMultinomial::from_mean_ess(&shares, 1.0, fx.names.clone())?;
            let names = fx.names.clone();
            m(
                1,
                Box::new(move |t| {
                    Ok(
                        DirichletMultinomial::from_mean_ess(&shares, t[0].exp(), names.clone())?
                            .into(),
                    )
                }),
            )
        }
        other => Err(Error::UnknownFamily {
            given: other.to_owned(),
            known: crate::family::FAMILY_IDS.join(", "),
        }),
    }
}

/// P(target ≤ value) under `prior` for one judgment.
fn judged_cdf(prior: &Prior, scale: Scale, target: &str, value: f64) -> Result<f64> {
    match scale {
        Scale::Observable(future) => Ok(match prior.predictive(&future)? {
            Predictive::Count(d) => d.cdf(value as u64),
            Predictive::Value(d) => d.cdf(value),
            Predictive::Categories(_) => {
                return Err(Error::Rule(
                    "observable-scale judgments need a single future count".to_owned(),
                ));
            }
        }),
        Scale::Unknowns => {
            let m = prior.marginals().into_iter().find(|m| m.name == target);
            Ok(m.map_or(f64::NAN, |m| m.distribution.cdf(value)))
        }
    }
}

/// Checks the judgments and resolves each one's target name.
fn check(prior: &Prior, scale: Scale, judgments: &[Judgment], strict: bool) -> Result<Vec<String>> {
    let marginals = prior.marginals();
    let names: Vec<String> = marginals.iter().map(|m| m.name.clone()).collect();
    let mut targets = Vec::new();
    for (i, j) in judgments.iter().enumerate() {
        let n = i + 1;
        if !(j.p > 0.0 && j.p < 1.0) {
            return Err(Error::Rule(format!(
                "judgment {n}: probability {} must lie strictly between 0 and 1",
                j.p
            )));
        }
        if !j.value.is_finite() {
            return Err(Error::Rule(format!(
                "judgment {n}: value {} is not a finite number",
                j.value
            )));
        }
        let target = match (scale, &j.parameter) {
            (Scale::Observable(_), None) => "predictive".to_owned(),
            (Scale::Observable(_), Some(p)) => {
                return Err(Error::Rule(format!(
                    "judgment {n} names '{p}', but with --observable every judgment is about the future observable"
                )));
            }
            (Scale::Unknowns, None) => names[0].clone(),
            (Scale::Unknowns, Some(p)) if names.contains(p) => p.clone(),
            (Scale::Unknowns, Some(p)) => {
                return Err(Error::Rule(format!(
                    "judgment {n} names '{p}', which is not an unknown of {}; they are {}",
                    prior.id(),
                    names.join(", ")
                )));
            }
        };
        // Inside the support.
        let (lo, hi, what, count) = match scale {
            Scale::Observable(f) => match prior.predictive(&f)? {
                Predictive::Count(Discrete::BetaBinomial { n, .. }) => (
                    0.0,
                    n as f64,
                    "a whole count from 0 to the future trials",
                    true,
                ),
                Predictive::Count(_) => (0.0, f64::INFINITY, "a whole count, 0 or more", true),
                Predictive::Value(d) => {
                    let (lo, hi) = d.support();
                    (lo, hi, "inside the observable's range", false)
                }
                Predictive::Categories(_) => {
                    return Err(Error::Rule(
                        "observable-scale judgments need a single future count".to_owned(),
                    ));
                }
            },
            Scale::Unknowns => {
                let (lo, hi) = marginals
                    .iter()
                    .find(|m| m.name == target)
                    .map_or((0.0, 0.0), |m| m.distribution.support());
                (lo, hi, "inside the unknown's range", false)
            }
        };
        let outside = if count {
            j.value < lo || j.value > hi || j.value.fract() != 0.0
        } else {
            j.value <= lo || j.value >= hi
        };
        if outside {
            return Err(Error::Rule(format!(
                "judgment {n}: value {} for {target} must be {what}",
                j.value
            )));
        }
        targets.push(target);
    }
    // Per target, probabilities must rise with values.
    for (a, ja) in judgments.iter().enumerate() {
        for (b, jb) in judgments.iter().enumerate().skip(a + 1) {
            if targets[a] != targets[b] {
                continue;
            }
            let (lo, hi) = if ja.value <= jb.value {
                ((a, ja), (b, jb))
            } else {
                ((b, jb), (a, ja))
            };
            let bad = if strict {
                (lo.1.value == hi.1.value && lo.1.p != hi.1.p)
                    || (lo.1.value < hi.1.value && lo.1.p >= hi.1.p)
            } else {
                lo.1.p > hi.1.p
            };
            if bad {
                return Err(Error::Rule(format!(
                    "judgments {} and {} are not increasing: P({} ≤ {}) = {} but P({} ≤ {}) = {}",
                    lo.0 + 1,
                    hi.0 + 1,
                    targets[lo.0],
                    lo.1.value,
                    lo.1.p,
                    targets[hi.0],
                    hi.1.value,
                    hi.1.p
                )));
            }
        }
    }
    Ok(targets)
}

/// Location and scale of the values on the normal-score scale: x ≈ a + b z_p.
fn normal_scores(points: &[(f64, f64)]) -> (f64, f64) {
    let n = points.len() as f64;
    let zs: Vec<(f64, f64)> = points
        .iter()
        .map(|(p, x)| (guess_normal_quantile(*p), *x))
        .collect();
    let zbar = zs.iter().map(|z| z.0).sum::<f64>() / n;
    let xbar = zs.iter().map(|z| z.1).sum::<f64>() / n;
    let szz: f64 = zs.iter().map(|z| (z.0 - zbar).powi(2)).sum();
    let szx: f64 = zs.iter().map(|z| (z.0 - zbar) * (z.1 - xbar)).sum();
    let b = if szz > 0.0 { (szx / szz).abs() } else { 0.0 };
    let b = if b > 0.0 {
        b
    } else {
        0.5 * xbar.abs().max(1.0)
    };
    (xbar - b * zbar, b)
}

/// Mean and sd of an unknown from judgments on it, on the scale that suits it.
fn moments(points: &[(f64, f64)], positive: bool, unit: bool) -> (f64, f64) {
    if unit {
        let logit: Vec<(f64, f64)> = points
            .iter()
            .map(|(p, x)| (*p, (x / (1.0 - x)).ln()))
            .collect();
        let (a, b) = normal_scores(&logit);
        let m = 1.0 / (1.0 + (-a).exp());
        (m, (b * m * (1.0 - m)).max(1e-9))
    } else if positive {
        let logs: Vec<(f64, f64)> = points.iter().map(|(p, x)| (*p, x.ln())).collect();
        let (a, b) = normal_scores(&logs);
        let m = (a + 0.5 * b * b).exp();
        (m, m * (b * b).exp_m1().sqrt())
    } else {
        normal_scores(points)
    }
}

/// Judgments on an unknown re-expressed on another: (p, x) on σ is (p, x²) on
/// σ², and (p, x) on the mean time 1/λ is (1 − p, 1/x) on λ.
fn points_on(judgments: &[Judgment], targets: &[String], want: &str) -> Vec<(f64, f64)> {
    judgments
        .iter()
        .zip(targets)
        .filter_map(|(j, t)| match (t.as_str(), want) {
            (a, b) if a == b => Some((j.p, j.value)),
            ("sigma", "sigma2") => Some((j.p, j.value * j.value)),
            ("mean_time", "lambda") => Some((1.0 - j.p, 1.0 / j.value)),
            _ => None,
        })
        .collect()
}

/// Moment-matched starting coordinates for each family.
fn start(
    family: &str,
    fixed: &Fixed,
    scale: Scale,
    judgments: &[Judgment],
    targets: &[String],
) -> Result<Vec<f64>> {
    // Observable judgments are carried onto the unknown's scale for the start.
    let observed: Vec<(f64, f64)> = match scale {
        Scale::Observable(Future::Trials(m)) => judgments
            .iter()
            .map(|j| {
                (
                    j.p,
                    ((j.value + 0.5) / (m as f64 + 1.0)).clamp(1e-6, 1.0 - 1e-6),
                )
            })
            .collect(),
        Scale::Observable(Future::Exposure(t) | Future::Time(t)) => judgments
            .iter()
            .map(|j| (j.p, (j.value + 0.5) / t))
            .collect(),
        Scale::Observable(Future::Values(_)) => judgments.iter().map(|j| (j.p, j.value)).collect(),
        Scale::Unknowns => Vec::new(),
    };
    let on = |want: &str| {
        if observed.is_empty() {
            points_on(judgments, targets, want)
        } else {
            observed.clone()
        }
    };
    let need = |pts: &[(f64, f64)], what: &str| {
        if pts.is_empty() {
            Err(Error::Rule(format!("{family} needs judgments on {what}")))
        } else {
            Ok(())
        }
    };
    Ok(match family {
        "beta-binomial" => {
            let pts = on("theta");
            let (m, s) = moments(&pts, true, true);
            let nu = (m * (1.0 - m) / (s * s) - 1.0).max(1e-3);
            vec![(m * nu).ln(), ((1.0 - m) * nu).ln()]
        }
        "gamma-poisson" | "gamma-exponential" => {
            let pts = on("lambda");
            let pts = if matches!(scale, Scale::Observable(Future::Values(_))) {
                // Waiting times: the rate is about 1/time.
                pts.iter()
                    .map(|(p, x)| (1.0 - p, 1.0 / x.abs().max(1e-300)))
                    .collect()
            } else {
                pts
            };
            let (m, s) = moments(&pts, true, false);
            vec![(m * m / (s * s)).ln(), (m / (s * s)).ln()]
        }
        "normal-known-variance" => {
            let (m, s) = moments(&on("mu"), false, false);
            let sigma = fixed.sigma.unwrap_or(1.0);
            vec![m, (sigma * sigma / (s * s)).ln()]
        }
        "inverse-gamma-variance" => {
            let pts = if observed.is_empty() {
                points_on(judgments, targets, "sigma2")
            } else {
                observed.iter().map(|(p, x)| (*p, x * x)).collect()
            };
            let (m, s) = moments(&pts, true, false);
            let a = m * m / (s * s) + 2.0;
            vec![a.ln(), (m * (a - 1.0)).ln()]
        }
        "normal-inverse-gamma" => {
            if !observed.is_empty() {
                let (m, s) = moments(&observed, false, false);
                vec![m, 0.0, 1.0f64.ln(), (s * s).ln()]
            } else {
                let mu = points_on(judgments, targets, "mu");
                let s2 = points_on(judgments, targets, "sigma2");
                need(&mu, "mu (its mean)")?;
                need(&s2, "sigma or sigma2 (its spread)")?;
                let (m1, sd1) = moments(&mu, false, false);
                let (m2, sd2) = moments(&s2, true, false);
                let a = m2 * m2 / (sd2 * sd2) + 2.0;
                let b = m2 * (a - 1.0);
                vec![m1, (b / ((a - 1.0) * sd1 * sd1)).ln(), a.ln(), b.ln()]
            }
        }
        "dirichlet-multinomial" => {
            let shares = fixed.shares.clone().unwrap_or_default();
            // ESS from the first judged share's spread: Var θk = m(1−m)/(A+1).
            let first = targets.first().cloned().unwrap_or_default();
            let k = judged_category(&first, fixed);
            let pts = points_on(judgments, targets, &first);
            let m = shares.get(k).copied().unwrap_or(0.5);
            let (_, s) = moments(&pts, true, true);
            vec![(m * (1.0 - m) / (s * s) - 1.0).max(1e-2).ln()]
        }
        _ => vec![0.0, 0.0],
    })
}

/// Shape grid with the scale fitted to one judgment, for gamma and inverse-gamma
/// laws on their unknown's own scale; returns the best (coordinates, objective).
fn profile_start(
    family: &str,
    scale: Scale,
    judgments: &[Judgment],
    targets: &[String],
    objective: &dyn Fn(&[f64]) -> f64,
) -> Option<(Vec<f64>, f64)> {
    if scale != Scale::Unknowns {
        return None;
    }
    let (k, j) = judgments
        .iter()
        .enumerate()
        .min_by(|a, b| (a.1.p - 0.5).abs().total_cmp(&(b.1.p - 0.5).abs()))?;
    let target = targets.get(k)?.as_str();
    let mut best: Option<(Vec<f64>, f64)> = None;
    for step in 0..25 {
        let ln_a = -7.0 + 0.7 * f64::from(step);
        let a = ln_a.exp();
        let unit = Continuous::Gamma {
            shape: a,
            rate: 1.0,
        };
        // ln β that puts `j` exactly on the law's p-quantile.
        let ln_b = match (family, target) {
            ("gamma-poisson" | "gamma-exponential", "lambda") => {
                (unit.quantile(j.p) / j.value).ln()
            }
            ("gamma-exponential", "mean_time") | ("inverse-gamma-variance", "sigma2") => {
                (j.value * unit.quantile(1.0 - j.p)).ln()
            }
            ("inverse-gamma-variance", "sigma") => {
                (j.value * j.value * unit.quantile(1.0 - j.p)).ln()
            }
            _ => return None,
        };
        let t = vec![ln_a, ln_b];
        let v = objective(&t);
        if v.is_finite() && best.as_ref().is_none_or(|b| v < b.1) {
            best = Some((t, v));
        }
    }
    best
}

/// Index of a dirichlet category from its output name.
fn judged_category(name: &str, fixed: &Fixed) -> usize {
    if let Some(names) = &fixed.names
        && let Some(k) = names.iter().position(|n| n == name)
    {
        return k;
    }
    name.strip_prefix("theta")
        .and_then(|k| k.parse::<usize>().ok())
        .map_or(0, |k| k.saturating_sub(1))
}

/// Fits a prior of `family` to `judgments` on `scale`.
pub fn fit(family: &str, fixed: &Fixed, scale: Scale, judgments: &[Judgment]) -> Result<Fit> {
    fit_with(family, fixed, scale, judgments, true)
}

/// [`fit`]; `strict` requires strictly increasing judgments (typed ones) rather
/// than non-decreasing (chips in bins, where empty bins give flat stretches).
pub fn fit_with(
    family: &str,
    fixed: &Fixed,
    scale: Scale,
    judgments: &[Judgment],
    strict: bool,
) -> Result<Fit> {
    let model = model(family, fixed)?;
    if judgments.len() < model.free {
        return Err(Error::Rule(format!(
            "{family} has {} free hyperparameters: give at least {} judgments (got {})",
            model.free,
            model.free,
            judgments.len()
        )));
    }
    // Any valid prior of the family serves to check names and supports.
    let probe = (model.build)(&vec![0.0; model.free])?;
    let targets = check(&probe, scale, judgments, strict)?;
    // Where each judgment's law sits among the marginals (no per-call lookups).
    let names: Vec<String> = probe.marginals().into_iter().map(|m| m.name).collect();
    let index: Vec<usize> = targets
        .iter()
        .map(|t| names.iter().position(|n| n == t).unwrap_or(0))
        .collect();
    let residuals = |t: &[f64]| -> Option<Vec<f64>> {
        let prior = (model.build)(t).ok()?;
        match scale {
            Scale::Unknowns => {
                let marginals = prior.marginals();
                judgments
                    .iter()
                    .zip(&index)
                    .map(|(j, k)| {
                        let f = marginals.get(*k)?.distribution.cdf(j.value);
                        f.is_finite().then_some(f - j.p)
                    })
                    .collect()
            }
            Scale::Observable(_) => judgments
                .iter()
                .zip(&targets)
                .map(|(j, tg)| {
                    judged_cdf(&prior, scale, tg, j.value)
                        .ok()
                        .filter(|f| f.is_finite())
                        .map(|f| f - j.p)
                })
                .collect(),
        }
    };
    let objective =
        |t: &[f64]| residuals(t).map_or(f64::INFINITY, |r| r.iter().map(|x| x * x).sum::<f64>());
    // Moment matching, then its concentration scanned over e^-6 … e^6 times:
    // the best is the start (moment matching alone misleads for J-shaped laws).
    let base = start(family, fixed, scale, judgments, &targets)?;
    let mut best = base.clone();
    let mut best_value = objective(&base);
    for shift in [
        -6.0, -4.5, -3.0, -2.0, -1.0, -0.5, 0.5, 1.0, 2.0, 3.0, 4.5, 6.0,
    ] {
        let mut t = base.clone();
        // Scaling every count-like coordinate together changes the concentration.
        for (i, v) in t.iter_mut().enumerate() {
            if !(family.starts_with("normal") && i == 0) {
                *v += shift;
            }
        }
        let value = objective(&t);
        if value < best_value {
            best = t;
            best_value = value;
        }
    }
    // Then each coordinate alone (location and scale), greedily: wide
    // judgments make moment-matched locations unreliable.
    let spread = {
        let vals: Vec<f64> = judgments.iter().map(|j| j.value).collect();
        let (lo, hi) = vals
            .iter()
            .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
                (a.min(*v), b.max(*v))
            });
        (hi - lo).max(1e-12)
    };
    for i in 0..best.len() {
        let additive = family.starts_with("normal") && i == 0;
        for step in [-8.0, -4.0, -2.0, -1.0, -0.5, 0.5, 1.0, 2.0, 4.0, 8.0] {
            let mut t = best.clone();
            t[i] += if additive { 0.25 * step * spread } else { step };
            let value = objective(&t);
            if value < best_value {
                best = t;
                best_value = value;
            }
        }
    }
    // A poor start (judgments far from what moments suggest, as for very heavy
    // tails): profile over the shape, the scale then set so that the judgment
    // nearest the median is met exactly.
    if best_value > 1e-2
        && let Some(profile) = profile_start(family, scale, judgments, &targets, &objective)
        && profile.1 < best_value
    {
        (best, best_value) = profile;
    }
    if !best_value.is_finite() {
        return Err(Error::Rule(
            "the judgments could not be matched by any prior tried as a start".to_owned(),
        ));
    }
    let (theta, value) = lsq::minimize(&residuals, &best);
    let prior = (model.build)(&theta)?;
    let fitted: Vec<Fitted> = judgments
        .iter()
        .zip(&targets)
        .map(|(j, t)| {
            Ok(Fitted {
                target: t.clone(),
                p: j.p,
                value: j.value,
                fitted_p: judged_cdf(&prior, scale, t, j.value)?,
            })
        })
        .collect::<Result<_>>()?;
    let max_abs_error = fitted
        .iter()
        .map(|f| (f.fitted_p - f.p).abs())
        .fold(0.0, f64::max);
    let method = if judgments.len() == model.free && max_abs_error < 1e-12 {
        Method::Exact
    } else {
        Method::LeastSquares
    };
    Ok(Fit {
        prior,
        judgments: fitted,
        objective: value,
        max_abs_error,
        method,
    })
}
