//! What `describe`, `update` and `predict` report, computed once here so the
//! CLI and the GUI show the same numbers.

use crate::distribution::interval::Shape;
use crate::distribution::{Continuous, Discrete, Interval};
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
    pub distribution: Continuous,
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
    opts.validate()?;
    for (name, _) in &opts.cdf_points {
        if let Some(n) = name
            && !marginals.iter().any(|m| &m.name == n)
        {
            let names: Vec<&str> = marginals.iter().map(|m| m.name.as_str()).collect();
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
            let d = &m.distribution;
            let cdf = opts
                .cdf_points
                .iter()
                .filter(|(name, _)| match name {
                    Some(n) => n == &m.name,
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
            let hpd = if d.shape() == Shape::Symmetric {
                central.clone()
            } else {
                d.hpd_interval_near(opts.level, &central)
            };
            ParameterSummary {
                name: m.name.clone(),
                distribution: *d,
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
    d: &Discrete,
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
                cdf: d.cdf(x as u64),
            }
        });
    }
    Ok(PredictiveSummary {
        category,
        distribution: d.name(),
        parameters: d.parameters(),
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
    for p in probs {
        error::probability("--prob", *p)?;
    }
    for x in at {
        error::finite("--at", *x)?;
    }
    match pred {
        Predictive::Count(d) => Ok(vec![summarize_count(d, None, probs, at)?]),
        Predictive::Categories(cats) => cats
            .iter()
            .map(|(name, d)| summarize_count(d, Some(name.clone()), probs, at))
            .collect(),
        Predictive::Value(d) => Ok(vec![PredictiveSummary {
            category: None,
            distribution: d.name(),
            parameters: d.parameters(),
            discrete: false,
            mean: d.mean(),
            sd: d.sd(),
            quantiles: probs.iter().map(|p| (*p, d.quantile(*p))).collect(),
            at: at
                .iter()
                .map(|&x| AtPoint {
                    x,
                    density: d.pdf(x),
                    cdf: d.cdf(x),
                })
                .collect(),
        }]),
    }
}
