//! What `describe`, `update` and `predict` report, computed once here so the
//! CLI and the GUI show the same numbers.

use crate::distribution::{Continuous, Discrete, Interval, Law, MixtureLaw};
use crate::elicit::CountMixture;
use crate::error::{self, Error, Result};
use crate::family::{Marginal, Predictive};

/// What to report for each unknown.
#[derive(Clone, Debug, PartialEq)]
pub struct SummaryOptions {
    /// Quantile probabilities, each in (0, 1).
    pub probs: Vec<f64>,
    /// Credible level for the central and highest-density intervals.
    pub level: f64,
    /// Points for P(X ≤ x) and P(X > x), each for a named parameter (None: the first).
    pub cdf_points: Vec<(Option<String>, f64)>,
}

impl Default for SummaryOptions {
    fn default() -> Self {
        Self {
            probs: vec![0.025, 0.25, 0.5, 0.75, 0.975],
            level: 0.95,
            cdf_points: Vec::new(),
        }
    }
}

impl SummaryOptions {
    /// Checks every probability and the level.
    pub fn validate(&self) -> Result<()> {
        for p in &self.probs {
            error::probability("--prob", *p)?;
        }
        error::probability("--level", self.level)?;
        for (_, x) in &self.cdf_points {
            error::finite("--cdf", *x)?;
        }
        Ok(())
    }
}

/// P(X ≤ x) and P(X > x) at one point.
#[derive(Clone, Debug, PartialEq)]
pub struct CdfPoint {
    /// The point.
    pub x: f64,
    /// P(X ≤ x).
    pub cdf: f64,
    /// P(X > x).
    pub sf: f64,
}

/// Everything reported for one unknown.
#[derive(Clone, Debug, PartialEq)]
pub struct ParameterSummary {
    /// Parameter name.
    pub name: String,
    /// Its distribution.
    pub distribution: Law,
    /// Mean, where it exists.
    pub mean: Option<f64>,
    /// Standard deviation, where it exists.
    pub sd: Option<f64>,
    /// Mode, or None where the density is unbounded there or has no single peak.
    pub mode: Option<f64>,
    /// Median.
    pub median: f64,
    /// (p, quantile) pairs.
    pub quantiles: Vec<(f64, f64)>,
    /// Equal-tailed interval.
    pub central: Interval,
    /// Highest-density set.
    pub hpd: Interval,
    /// Requested cdf points.
    pub cdf: Vec<CdfPoint>,
}

/// Summarises each marginal; cdf points go to the parameter they name.
pub fn summarize(marginals: &[Marginal], opts: &SummaryOptions) -> Result<Vec<ParameterSummary>> {
    let laws: Vec<(String, Law)> = marginals
        .iter()
        .map(|m| (m.name.clone(), Law::One(m.distribution)))
        .collect();
    summarize_laws(&laws, opts)
}

/// [`summarize`] for named laws, single or mixed.
pub fn summarize_laws(
    laws: &[(String, Law)],
    opts: &SummaryOptions,
) -> Result<Vec<ParameterSummary>> {
    let marginals: Vec<Named<'_>> = laws
        .iter()
        .map(|(n, l)| Named { name: n, law: l })
        .collect();
    opts.validate()?;
    for (name, _) in &opts.cdf_points {
        if let Some(n) = name
            && !marginals.iter().any(|m| m.name == n)
        {
            let names: Vec<&str> = marginals.iter().map(|m| m.name).collect();
            return Err(Error::Rule(format!(
                "--cdf names '{n}', which is not a parameter here; the parameters are {}",
                names.join(", ")
            )));
        }
    }
    Ok(marginals
        .iter()
        .enumerate()
        .map(|(i, m)| {
            let d = m.law;
            let cdf = opts
                .cdf_points
                .iter()
                .filter(|(name, _)| match name {
                    Some(n) => n == m.name,
                    None => i == 0,
                })
                .map(|(_, x)| {
                    let (cdf, sf) = d.tails(*x);
                    CdfPoint { x: *x, cdf, sf }
                })
                .collect();
            // Each search starts from the nearest quantile already found.
            let mut known: Vec<(f64, f64)> = Vec::new();
            let mut find = |p: f64| {
                let hint = known
                    .iter()
                    .min_by(|a, b| (a.0 - p).abs().total_cmp(&(b.0 - p).abs()))
                    .map(|k| k.1);
                let x = d.quantile_near(p, hint);
                known.push((p, x));
                x
            };
            let median = find(0.5);
            let quantiles = opts.probs.iter().map(|p| (*p, find(*p))).collect();
            let tail = 0.5 * (1.0 - opts.level);
            let central = Interval::single(opts.level, find(tail), find(1.0 - tail));
            let hpd = d.hpd_interval(opts.level, &central);
            ParameterSummary {
                name: m.name.to_owned(),
                distribution: d.clone(),
                mean: d.mean(),
                sd: d.sd(),
                mode: d.mode(),
                median,
                quantiles,
                central,
                hpd,
                cdf,
            }
        })
        .collect())
}

/// Density (pmf for counts) and cdf at one point of a predictive.
#[derive(Clone, Debug, PartialEq)]
pub struct AtPoint {
    /// The point.
    pub x: f64,
    /// pmf or pdf at x.
    pub density: f64,
    /// P(X ≤ x).
    pub cdf: f64,
}

/// A law with its parameter name, for the summary loop.
struct Named<'a> {
    name: &'a str,
    law: &'a Law,
}

/// Summary of one predictive distribution (or one category's).
#[derive(Clone, Debug, PartialEq)]
pub struct PredictiveSummary {
    /// Category name, for the per-category dirichlet-multinomial predictive.
    pub category: Option<String>,
    /// Distribution name.
    pub distribution: &'static str,
    /// Its parameters.
    pub parameters: Vec<(&'static str, f64)>,
    /// Whether it is a count.
    pub discrete: bool,
    /// Mean, where it exists.
    pub mean: Option<f64>,
    /// Standard deviation, where it exists.
    pub sd: Option<f64>,
    /// (p, quantile).
    pub quantiles: Vec<(f64, f64)>,
    /// Requested points.
    pub at: Vec<AtPoint>,
}

fn summarize_count(
    d: &CountMixture,
    category: Option<String>,
    probs: &[f64],
    at: &[f64],
) -> Result<PredictiveSummary> {
    let mut points = Vec::new();
    for &x in at {
        if x.fract() != 0.0 {
            return Err(Error::invalid(
                "--at",
                x,
                "the predictive is a count; use whole numbers",
            ));
        }
        points.push(if x < 0.0 {
            AtPoint {
                x,
                density: 0.0,
                cdf: 0.0,
            }
        } else {
            AtPoint {
                x,
                density: d.pmf(x as u64),
                cdf: d.tails(x as u64).0,
            }
        });
    }
    let (distribution, parameters) = match d.parts.as_slice() {
        [(_, one)] => (one.name(), one.parameters()),
        _ => ("mixture", Vec::new()),
    };
    Ok(PredictiveSummary {
        category,
        distribution,
        parameters,
        discrete: true,
        mean: Some(d.mean()),
        sd: Some(d.sd()),
        quantiles: probs.iter().map(|p| (*p, d.quantile(*p) as f64)).collect(),
        at: points,
    })
}

/// Summarises a predictive: quantiles at `probs`, density and cdf at `at`.
pub fn summarize_predictive(
    pred: &Predictive,
    probs: &[f64],
    at: &[f64],
) -> Result<Vec<PredictiveSummary>> {
    summarize_mixed_predictive(&[(1.0, pred.clone())], probs, at)
}

/// [`summarize_predictive`] for a weighted mixture of predictives of one kind.
pub fn summarize_mixed_predictive(
    parts: &[(f64, Predictive)],
    probs: &[f64],
    at: &[f64],
) -> Result<Vec<PredictiveSummary>> {
    for p in probs {
        error::probability("--prob", *p)?;
    }
    for x in at {
        error::finite("--at", *x)?;
    }
    let counts: Option<Vec<(f64, Discrete)>> = parts
        .iter()
        .map(|(w, p)| match p {
            Predictive::Count(d) => Some((*w, *d)),
            _ => None,
        })
        .collect();
    if let Some(parts) = counts {
        return Ok(vec![summarize_count(
            &CountMixture { parts },
            None,
            probs,
            at,
        )?]);
    }
    let values: Option<Vec<(f64, Continuous)>> = parts
        .iter()
        .map(|(w, p)| match p {
            Predictive::Value(d) => Some((*w, *d)),
            _ => None,
        })
        .collect();
    if let Some(vs) = values {
        let law = if vs.len() == 1 {
            Law::One(vs[0].1)
        } else {
            Law::Mix(MixtureLaw::new(vs.clone()))
        };
        let (distribution, parameters) = match &law {
            Law::One(d) => (d.name(), d.parameters()),
            Law::Mix(_) => ("mixture", Vec::new()),
        };
        let mut known: Vec<(f64, f64)> = Vec::new();
        let quantiles = probs
            .iter()
            .map(|p| {
                let hint = known
                    .iter()
                    .min_by(|a, b| (a.0 - p).abs().total_cmp(&(b.0 - p).abs()))
                    .map(|k| k.1);
                let x = law.quantile_near(*p, hint);
                known.push((*p, x));
                (*p, x)
            })
            .collect();
        return Ok(vec![PredictiveSummary {
            category: None,
            distribution,
            parameters,
            discrete: false,
            mean: law.mean(),
            sd: law.sd(),
            quantiles,
            at: at
                .iter()
                .map(|&x| AtPoint {
                    x,
                    density: law.pdf(x),
                    cdf: law.tails(x).0,
                })
                .collect(),
        }]);
    }
    // One count per category: mix each category's law across the parts.
    let mut cats: Vec<(String, Vec<(f64, Discrete)>)> = Vec::new();
    for (w, p) in parts {
        let Predictive::Categories(cs) = p else {
            return Err(Error::Rule(
                "the parts of a mixed predictive are of different kinds".to_owned(),
            ));
        };
        for (k, (name, d)) in cs.iter().enumerate() {
            if cats.len() <= k {
                cats.push((name.clone(), Vec::new()));
            }
            cats[k].1.push((*w, *d));
        }
    }
    cats.into_iter()
        .map(|(name, parts)| summarize_count(&CountMixture { parts }, Some(name), probs, at))
        .collect()
}
