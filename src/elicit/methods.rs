//! Elicitation methods other than typed quantiles, each reduced to a prior:
//! a mode with an interval, chips in bins, and imagined future data.

use super::fit::{self, Fit, Fixed, Judgment, Scale};
use crate::error::{self, Error, Result};
use crate::family::keys::Keys;
use crate::family::{
    BetaBinomial, GammaExponential, GammaPoisson, InverseGammaVariance, NormalKnownVariance, Prior,
};
use crate::numeric::solve::increasing_root;

/// Result of a mode-and-interval judgment.
#[derive(Clone, Debug, PartialEq)]
pub struct ModeFit {
    /// The prior: its mode is the stated one.
    pub prior: Prior,
    /// Unknown the judgment is about.
    pub parameter: String,
    /// Stated mode.
    pub mode: f64,
    /// Interval ends.
    pub interval: (f64, f64),
    /// Stated probability of the interval.
    pub stated: f64,
    /// Probability the prior gives it.
    pub fitted: f64,
}

/// A prior with mode `mode` and concentration c > 0 (family-specific), or None
/// where the family has no one-parameter path through priors with that mode.
fn with_mode(family: &str, parameter: &str, mode: f64, c: f64, fixed: &Fixed) -> Result<Prior> {
    Ok(match (family, parameter) {
        ("beta-binomial", "theta") => {
            BetaBinomial::new(1.0 + mode * c, 1.0 + (1.0 - mode) * c)?.into()
        }
        ("gamma-poisson", "lambda") => GammaPoisson::new(1.0 + mode * c, c)?.into(),
        ("gamma-exponential", "lambda") => GammaExponential::new(1.0 + mode * c, c)?.into(),
        ("gamma-exponential", "mean_time") => GammaExponential::new(c, mode * (c + 1.0))?.into(),
        ("normal-known-variance", "mu") => {
            let sigma = fixed.sigma.ok_or_else(|| {
                Error::Rule("normal-known-variance needs the known sd: --fixed sigma=…".to_owned())
            })?;
            NormalKnownVariance::new(mode, c, sigma)?.into()
        }
        ("inverse-gamma-variance", "sigma2") => {
            InverseGammaVariance::new(c, mode * (c + 1.0), fixed.mu)?.into()
        }
        ("inverse-gamma-variance", "sigma") => {
            InverseGammaVariance::new(c, 0.5 * mode * mode * (2.0 * c + 1.0), fixed.mu)?.into()
        }
        _ => {
            return Err(Error::Rule(format!(
                "a mode with an interval is not available for {parameter} of {family}; state quantiles instead"
            )));
        }
    })
}

/// The first unknown's name, or the named one.
fn parameter_of(family: &str, parameter: Option<&str>) -> &'static str {
    let first = match family {
        "beta-binomial" => "theta",
        "gamma-poisson" | "gamma-exponential" => "lambda",
        "normal-known-variance" | "normal-inverse-gamma" => "mu",
        "inverse-gamma-variance" => "sigma2",
        _ => "theta1",
    };
    match parameter {
        Some("mean_time") => "mean_time",
        Some("sigma") => "sigma",
        Some("sigma2") => "sigma2",
        Some("lambda") => "lambda",
        _ => first,
    }
}

/// "Most likely `mode`, and `prob` sure the unknown lies in [lo, hi]": the
/// prior with that mode whose interval probability is `prob`, found by
/// bisection on the log of its concentration (the interval's probability rises
/// as the prior concentrates on a mode inside it).
pub fn mode_interval(
    family: &str,
    parameter: Option<&str>,
    fixed: &Fixed,
    mode: f64,
    (lo, hi): (f64, f64),
    prob: f64,
) -> Result<ModeFit> {
    error::probability("interval probability", prob)?;
    if !(lo < mode && mode < hi) {
        return Err(Error::Rule(format!(
            "the mode {mode} must lie inside the interval [{lo}, {hi}]"
        )));
    }
    let name = parameter_of(family, parameter);
    if let Some(p) = parameter
        && p != name
    {
        return Err(Error::Rule(format!(
            "a mode with an interval is not available for {p} of {family}"
        )));
    }
    let mass = |lc: f64| -> Result<f64> {
        let prior = with_mode(family, name, mode, lc.exp(), fixed)?;
        let m = prior
            .marginals()
            .into_iter()
            .find(|m| m.name == name)
            .ok_or_else(|| Error::Rule(format!("{family} has no unknown called {name}")))?;
        Ok(m.distribution.cdf(hi) - m.distribution.cdf(lo))
    };
    let (a, b) = (-20.0, 30.0);
    let (ma, mb) = (mass(a)?, mass(b)?);
    if prob <= ma {
        return Err(Error::Rule(format!(
            "even the flattest prior with mode {mode} gives [{lo}, {hi}] probability {ma:.4}; a stated {prob} is too low"
        )));
    }
    if prob >= mb {
        return Err(Error::Rule(format!(
            "no prior with mode {mode} puts probability {prob} on [{lo}, {hi}]; the most it reaches is {mb:.6}"
        )));
    }
    let g = |lc: f64| (mass(lc).unwrap_or(f64::NAN) - prob, f64::NAN);
    let lc = increasing_root(g, a, b, 0.0, 1e-13);
    let prior = with_mode(family, name, mode, lc.exp(), fixed)?;
    let fitted = mass(lc)?;
    Ok(ModeFit {
        prior,
        parameter: name.to_owned(),
        mode,
        interval: (lo, hi),
        stated: prob,
        fitted,
    })
}

/// Chips in bins: `edges` e0 < e1 < … < eK, `chips[k]` in bin [e_k, e_{k+1}).
///
/// Each edge becomes the judgment P(X ≤ e_j) = (chips left of e_j + ½)/(N + 1):
/// the half-chip keeps every probability strictly inside (0, 1), so an empty
/// end bin or a bin holding every chip still gives usable judgments. Runs of
/// edges with no chips between them at either end are reduced to the edge next
/// to the chips (an empty end bin says "hardly any mass out there", once), and
/// edges on the edge of the unknown's range are left out. The judgments are
/// then fitted as stated quantiles (non-decreasing rather than strictly
/// increasing, since empty interior bins give flat stretches).
pub fn chips(
    family: &str,
    parameter: Option<&str>,
    fixed: &Fixed,
    edges: &[f64],
    chips: &[f64],
) -> Result<Fit> {
    if edges.len() < 2 || chips.len() + 1 != edges.len() {
        return Err(Error::Rule(format!(
            "{} bin edges need {} chip counts; got {}",
            edges.len(),
            edges.len().saturating_sub(1),
            chips.len()
        )));
    }
    for w in edges.windows(2) {
        if w[0].partial_cmp(&w[1]) != Some(std::cmp::Ordering::Less) {
            return Err(Error::Rule(format!(
                "bin edges must increase: {} then {}",
                w[0], w[1]
            )));
        }
    }
    for (k, c) in chips.iter().enumerate() {
        error::count(&format!("chips in bin {}", k + 1), *c)?;
    }
    let total: f64 = chips.iter().sum();
    if total == 0.0 {
        return Err(Error::Rule("no chips were placed".to_owned()));
    }
    let mut cum = vec![0.0];
    for c in chips {
        cum.push(cum.last().copied().unwrap_or(0.0) + c);
    }
    let first_full = cum.iter().rposition(|c| *c == 0.0).unwrap_or(0);
    let last_empty = cum
        .iter()
        .position(|c| *c == total)
        .unwrap_or(cum.len() - 1);
    let name = parameter.map(str::to_owned);
    let mut judgments = Vec::new();
    for j in first_full..=last_empty {
        judgments.push(Judgment {
            parameter: name.clone(),
            p: (cum[j] + 0.5) / (total + 1.0),
            value: edges[j],
        });
    }
    // Leave out edges at the ends of the unknown's range (0 and 1 for a share, 0 for a rate).
    let range = match (family, parameter.unwrap_or("")) {
        ("beta-binomial" | "dirichlet-multinomial", _) => (0.0, 1.0),
        ("normal-known-variance", _) | ("normal-inverse-gamma", "mu" | "") => {
            (f64::NEG_INFINITY, f64::INFINITY)
        }
        _ => (0.0, f64::INFINITY),
    };
    judgments.retain(|j| j.value > range.0 && j.value < range.1);
    fit::fit_with(family, fixed, Scale::Unknowns, &judgments, false)
}

/// Imagined future data: holding the prior mean `mean` of the data-scale
/// quantity, "if the next sample showed this, my estimate would become
/// `estimate`" fixes the ESS through the posterior-mean update
/// estimate = (ESS·mean + S)/(ESS + n), i.e. ESS = (S − estimate·n)/(estimate − mean).
pub fn imagined(family: &str, fixed: &Fixed, mean: f64, keys: &Keys) -> Result<Prior> {
    let all = keys.expected().join(",");
    let need = |k: &str| keys.required(k, &all);
    let (stat, n, estimate, data_mean) = match family {
        "beta-binomial" => {
            let (k, n) = (need("successes")?, need("trials")?);
            (k, n, need("estimate")?, k / n)
        }
        "gamma-poisson" => {
            let (k, t) = (need("events")?, need("exposure")?);
            (k, t, need("estimate")?, k / t)
        }
        "gamma-exponential" => {
            // Mean time between failures: pseudo-count is failures, statistic the time.
            let (d, t) = (need("failures")?, need("time")?);
            (t, d, need("estimate")?, t / d)
        }
        "normal-known-variance" | "normal-inverse-gamma" => {
            let (n, m) = (need("n")?, need("mean")?);
            (n * m, n, need("estimate")?, m)
        }
        "inverse-gamma-variance" => {
            let (n, ss) = (need("n")?, need("ss")?);
            (ss, n, need("estimate")?, ss / n)
        }
        other => {
            return Err(Error::Rule(format!(
                "imagined data are not available for {other}"
            )));
        }
    };
    if estimate == mean {
        return Err(Error::Rule(format!(
            "the estimate {estimate} equals the prior mean: an estimate that does not move cannot fix the sample size"
        )));
    }
    if (estimate - mean) * (data_mean - mean) <= 0.0 {
        return Err(Error::Rule(format!(
            "the estimate moves from {mean} to {estimate}, away from the imagined data's {data_mean}: updating can only move it towards them"
        )));
    }
    if (data_mean - estimate) * (data_mean - mean) <= 0.0 {
        return Err(Error::Rule(format!(
            "the estimate {estimate} moves past the imagined data's own {data_mean}: no prior would move that far"
        )));
    }
    let ess = (stat - estimate * n) / (estimate - mean);
    error::positive("effective sample size", ess)?;
    Ok(match family {
        "beta-binomial" => BetaBinomial::from_mean_ess(mean, ess)?.into(),
        "gamma-poisson" => GammaPoisson::from_mean_ess(mean, ess)?.into(),
        "gamma-exponential" => GammaExponential::from_mean_ess(mean, ess)?.into(),
        "normal-known-variance" => {
            let sigma = fixed.sigma.ok_or_else(|| {
                Error::Rule("normal-known-variance needs --fixed sigma=…".to_owned())
            })?;
            NormalKnownVariance::new(mean, ess, sigma)?.into()
        }
        "inverse-gamma-variance" => {
            InverseGammaVariance::from_mean_ess(mean, ess, fixed.mu)?.into()
        }
        _ => {
            return Err(Error::Rule(
                "for normal-inverse-gamma, imagined data fix only the mean's ESS; state quantiles for the spread".to_owned(),
            ));
        }
    })
}

/// The keys `--imagined` takes for a family.
pub fn imagined_keys(family: &str) -> &'static [&'static str] {
    match family {
        "beta-binomial" => &["successes", "trials", "estimate"],
        "gamma-poisson" => &["events", "exposure", "estimate"],
        "gamma-exponential" => &["failures", "time", "estimate"],
        "inverse-gamma-variance" => &["n", "ss", "estimate"],
        _ => &["n", "mean", "estimate"],
    }
}
