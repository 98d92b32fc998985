//! Readable aligned tables for people at a terminal.

use super::json::UpdateReport;
use crate::analysis::summary::{ParameterSummary, PredictiveSummary};
use crate::distribution::Interval;
use crate::elicit::Belief;
use crate::family::Value;
use std::fmt::Write as _;

/// Six significant digits, plain where that reads well; "none" where absent.
pub fn fmt(x: Option<f64>) -> String {
    let Some(x) = x else { return "none".to_owned() };
    if !x.is_finite() {
        return if x.is_nan() {
            "none".to_owned()
        } else if x > 0.0 {
            "inf".to_owned()
        } else {
            "-inf".to_owned()
        };
    }
    if x == 0.0 {
        return "0".to_owned();
    }
    let mag = x.abs().log10().floor() as i32;
    if (-4..7).contains(&mag) {
        let decimals = (5 - mag).max(0) as usize;
        let s = format!("{x:.decimals$}");
        if s.contains('.') {
            s.trim_end_matches('0').trim_end_matches('.').to_owned()
        } else {
            s
        }
    } else {
        format!("{x:.5e}")
    }
}

fn f(x: f64) -> String {
    fmt(Some(x))
}

fn values(v: &[(&'static str, Value)]) -> String {
    v.iter()
        .map(|(k, v)| match v {
            Value::Number(x) => format!("{k} = {}", f(*x)),
            Value::List(xs) => format!(
                "{k} = {}",
                xs.iter().map(|x| f(*x)).collect::<Vec<_>>().join("; ")
            ),
        })
        .collect::<Vec<_>>()
        .join(", ")
}

fn rows(out: &mut String, rows: &[(String, String)]) {
    let w = rows
        .iter()
        .map(|(k, _)| k.chars().count())
        .max()
        .unwrap_or(0);
    for (k, v) in rows {
        let pad = w - k.chars().count();
        let _ = writeln!(out, "  {k}{}  {v}", " ".repeat(pad));
    }
}

fn interval(i: &Interval) -> String {
    if i.pieces.is_empty() {
        format!("[{}, {}]", f(i.lower), f(i.upper))
    } else {
        i.pieces
            .iter()
            .map(|(a, b)| format!("[{}, {}]", f(*a), f(*b)))
            .collect::<Vec<_>>()
            .join(" ∪ ")
    }
}

fn pct(level: f64) -> String {
    format!("{}%", fmt(Some(level * 100.0)))
}

fn header(out: &mut String, belief: &Belief, what: &str) {
    match belief {
        Belief::One(prior) => {
            let _ = writeln!(
                out,
                "{} {what}: {}",
                prior.id(),
                values(&prior.hyperparameters())
            );
            let _ = writeln!(out, "  {}", prior.as_if());
            let _ = writeln!(
                out,
                "  pseudo-observations: {}",
                values(&prior.pseudo_observations())
            );
        }
        Belief::Mix(m) => {
            let _ = writeln!(
                out,
                "{} {what}: a mixture of {} components",
                m.id(),
                m.components().len()
            );
            for (w, p) in m.components() {
                let _ = writeln!(
                    out,
                    "  weight {}: {}  ({})",
                    f(*w),
                    values(&p.hyperparameters()),
                    p.as_if()
                );
            }
        }
    }
}

fn parameters(out: &mut String, params: &[ParameterSummary]) {
    for p in params {
        let _ = writeln!(out, "\n{} ({})", p.name, p.distribution.name());
        let mut r = vec![
            ("mean".to_owned(), fmt(p.mean)),
            ("sd".to_owned(), fmt(p.sd)),
            ("mode".to_owned(), fmt(p.mode)),
            ("median".to_owned(), f(p.median)),
        ];
        for (pr, v) in &p.quantiles {
            r.push((format!("quantile {pr}"), f(*v)));
        }
        r.push((
            format!("{} central interval", pct(p.central.level)),
            interval(&p.central),
        ));
        r.push((
            format!("{} highest density", pct(p.hpd.level)),
            interval(&p.hpd),
        ));
        for c in &p.cdf {
            r.push((format!("P({} <= {})", p.name, f(c.x)), f(c.cdf)));
            r.push((format!("P({} > {})", p.name, f(c.x)), f(c.sf)));
        }
        rows(out, &r);
    }
}

const CAUTION: &str = "\nCaution: a prior can decide a clinical, safety or financial decision; record the\nreasoning, follow the applicable guidance and have it reviewed by someone qualified.\n";

/// `describe`.
pub fn describe(prior: &Belief, params: &[ParameterSummary], what: &str) -> String {
    let mut out = String::new();
    header(&mut out, prior, what);
    parameters(&mut out, params);
    out.push_str(CAUTION);
    out
}

/// `update`.
pub fn update(r: &UpdateReport<'_>) -> String {
    let mut out = String::new();
    header(&mut out, r.prior, "prior");
    let _ = writeln!(out);
    header(&mut out, r.posterior, "posterior");
    let mut rows_ = vec![
        ("log marginal likelihood".to_owned(), f(r.ln_ml)),
        ("prior's share of the information".to_owned(), f(r.share)),
    ];
    if let Some(c) = &r.conflict {
        rows_.push((
            "conflict statistic".to_owned(),
            format!("{} = {}", c.statistic, f(c.observed)),
        ));
        let mid = if c.mid_p { " (mid-p)" } else { "" };
        rows_.push((
            "prior-predictive tails".to_owned(),
            format!("lower {}, upper {}{mid}", f(c.lower_tail), f(c.upper_tail)),
        ));
        rows_.push(("two-sided p".to_owned(), f(c.p_value)));
    }
    let _ = writeln!(out);
    rows(&mut out, &rows_);
    if let Some(c) = &r.conflict
        && c.p_value < 0.05
    {
        let _ = writeln!(
            out,
            "\nWarning: the data fall in the tail of what the prior predicted (p = {}). The prior and\nthe data disagree; check both before relying on the posterior.",
            f(c.p_value)
        );
    }
    parameters(&mut out, r.params);
    out.push_str(CAUTION);
    out
}

/// `predict`.
pub fn predict(used: &Belief, summaries: &[PredictiveSummary], posterior: bool) -> String {
    let mut out = String::new();
    header(
        &mut out,
        used,
        if posterior { "posterior" } else { "prior" },
    );
    for s in summaries {
        let params: Vec<String> = s
            .parameters
            .iter()
            .map(|(k, v)| format!("{k} = {}", f(*v)))
            .collect();
        let title = match &s.category {
            Some(c) => format!(
                "\n{c}: {} predictive, {}",
                s.distribution,
                params.join(", ")
            ),
            None => format!("\n{} predictive, {}", s.distribution, params.join(", ")),
        };
        let _ = writeln!(out, "{title}");
        let mut r = vec![
            ("mean".to_owned(), fmt(s.mean)),
            ("sd".to_owned(), fmt(s.sd)),
        ];
        for (p, v) in &s.quantiles {
            r.push((format!("quantile {p}"), f(*v)));
        }
        rows(&mut out, &r);
        if !s.at.is_empty() {
            let dens = if s.discrete { "probability" } else { "density" };
            let mut r = vec![("x".to_owned(), format!("{dens:>14}  {:>14}", "P(X <= x)"))];
            for a in &s.at {
                r.push((f(a.x), format!("{:>14}  {:>14}", f(a.density), f(a.cdf))));
            }
            rows(&mut out, &r);
        }
    }
    out.push_str(CAUTION);
    out
}

/// `fit`: the prior as --prior text, and stated against fitted probabilities.
pub fn fit(prior: &crate::family::Prior, fit: &serde_json::Value) -> String {
    let mut out = String::new();
    header(&mut out, &Belief::One(prior.clone()), "fitted prior");
    let keys: Vec<String> = prior
        .hyperparameters()
        .iter()
        .map(|(k, v)| match v {
            Value::Number(x) => format!("{k}={x}"),
            Value::List(xs) => format!(
                "{k}={}",
                xs.iter()
                    .map(|x| x.to_string())
                    .collect::<Vec<_>>()
                    .join(";")
            ),
        })
        .collect();
    let _ = writeln!(out, "  as --prior: {}", keys.join(","));
    let get = |k: &str| fit[k].as_f64();
    let _ = writeln!(out, "\nfit: {}", fit["method"].as_str().unwrap_or(""));
    let mut r = Vec::new();
    if let Some(js) = fit["judgments"].as_array()
        && !js.is_empty()
    {
        r.push((
            "judgment".to_owned(),
            format!("{:>12}  {:>12}  {:>12}", "value", "stated p", "fitted p"),
        ));
        for j in js {
            r.push((
                j["parameter"].as_str().unwrap_or("").to_owned(),
                format!(
                    "{:>12}  {:>12}  {:>12}",
                    fmt(j["value"].as_f64()),
                    fmt(j["p"].as_f64()),
                    fmt(j["fitted_p"].as_f64())
                ),
            ));
        }
    }
    if let Some(i) = fit.get("interval") {
        r.push((
            format!(
                "P({} <= {} <= {})",
                fmt(i["lower"].as_f64()),
                fit["parameter"].as_str().unwrap_or(""),
                fmt(i["upper"].as_f64())
            ),
            format!(
                "stated {}, fitted {}",
                fmt(i["p"].as_f64()),
                fmt(i["fitted_p"].as_f64())
            ),
        ));
    }
    r.push(("objective".to_owned(), fmt(get("objective"))));
    r.push((
        "largest probability error".to_owned(),
        fmt(get("max_abs_probability_error")),
    ));
    rows(&mut out, &r);
    out.push_str(CAUTION);
    out
}
