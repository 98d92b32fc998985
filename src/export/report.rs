//! The workshop report: one self-contained HTML file (inline styles and SVG
//! plots, no scripts, no external address) that records what was elicited,
//! from whom, how it was checked, and the cautions.
//!
//! Every number printed comes from the `check --json` document passed in, so
//! the report and the command line cannot disagree; the curves are drawn
//! from the same project and data.

use super::svg::{Band, Plot, Series, escape};
use super::{TARGETS, export};
use crate::analysis::curve;
use crate::distribution::Law;
use crate::elicit::Belief;
use crate::error::Result;
use crate::family::{Data, Predictive};
use crate::project::{MethodRecord, Project};
use serde_json::Value;
use std::fmt::Write as _;

/// The cautions every report carries.
pub const CAUTIONS: [&str; 4] = [
    "A prior can decide a clinical, safety or financial decision. It records expert judgment; it is not data, and it can be wrong.",
    "Record the reasoning behind each judgment, and keep this report with the analysis it feeds.",
    "Follow the guidance that applies to the decision (a regulator's, a standard's, your organisation's) on the use of prior information.",
    "Have the elicitation and its use reviewed by someone qualified who was not part of it before the result is relied on.",
];

/// A number as the report prints it: six significant digits, no trailing
/// zeros; a missing value is a dash. Tests use this to compare with JSON.
pub fn num(v: &Value) -> String {
    match v.as_f64() {
        Some(x) => num_f64(x),
        None => "–".to_owned(),
    }
}

/// [`num`] for a plain float.
pub fn num_f64(x: f64) -> String {
    if !x.is_finite() {
        return "–".to_owned();
    }
    if x == 0.0 {
        return "0".to_owned();
    }
    if x.abs() >= 1e6 || x.abs() < 1e-4 {
        return format!("{x:.5e}");
    }
    let digits = (5 - x.abs().log10().floor() as i32).clamp(0, 12) as usize;
    let s = format!("{x:.digits$}");
    if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_owned()
    } else {
        s
    }
}

const STYLE: &str = r#"
body{font-family:"DejaVu Sans",Helvetica,Arial,sans-serif;font-size:11pt;line-height:1.4;color:#1a1a1a;max-width:46em;margin:2em auto;padding:0 1em}
h1{font-size:20pt;margin:0 0 .2em}h2{font-size:14pt;margin:1.6em 0 .4em;border-bottom:1px solid #999;break-after:avoid}
h3{font-size:12pt;margin:1.2em 0 .3em;break-after:avoid}
table{border-collapse:collapse;margin:.4em 0 .8em;break-inside:avoid}th,td{padding:.15em .6em;text-align:left;border-bottom:1px solid #ddd;vertical-align:top}
td.n{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
.caution{border:2px solid #D55E00;padding:.5em 1em;margin:1em 0;break-inside:avoid}
.warn{color:#8a2e00;font-weight:bold}
.meta{color:#444}.keep{break-inside:avoid}table.wide{width:100%}small{color:#444}
figure{margin:.6em 0;break-inside:avoid}svg.plot{width:100%;height:auto;max-width:640px;display:block}
figcaption.legend span{margin-right:1.2em;white-space:nowrap}figcaption.legend i{display:inline-block;width:18px;height:10px;margin-right:4px}
svg .grid{stroke:#e3e3e3;stroke-width:1}svg .frame{fill:none;stroke:#777}svg .mark{stroke:#333;stroke-dasharray:4 3}
svg .tick{font-size:11px;fill:#333}svg .axis{font-size:12px;fill:#111}
pre{background:#f4f4f4;padding:.5em;white-space:pre-wrap;font-size:9pt;break-inside:avoid}
@page{margin:18mm 16mm}
@media print{body{margin:0;max-width:none}a{color:inherit}}
"#;

fn h(s: &str) -> String {
    escape(s)
}

/// The report as HTML. `check` is the `check --json` document for the
/// same project and `data`; `generated` is the time stamp to print.
pub fn html(project: &Project, check: &Value, data: &[Data], generated: &str) -> Result<String> {
    let belief = project.belief()?;
    let sc = &project.scenario;
    let mut s = String::new();
    let _ = write!(
        s,
        "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><title>{}: prior elicitation report</title><style>{STYLE}</style></head><body>",
        h(&sc.title)
    );
    let _ = write!(s, "<h1>{}</h1>", h(&sc.title));
    let _ = write!(
        s,
        "<p class=\"meta\">Prior elicitation report · model {} · project created {} · last changed {} · report written {}</p>",
        h(&sc.family),
        h(or_dash(&project.created)),
        h(or_dash(&project.changed)),
        h(generated)
    );
    if sc.high_stakes {
        s.push_str("<p class=\"caution warn\">This project feeds a safety, clinical or financial decision. Follow the applicable guidance and have the elicitation reviewed by someone qualified before it is relied on.</p>");
    }
    cautions(&mut s);

    s.push_str("<h2 id=\"scenario\">Scenario</h2>");
    if !sc.description.is_empty() {
        let _ = write!(s, "<p>{}</p>", h(&sc.description));
    }
    let _ = write!(
        s,
        "<table><tr><th>Unknown</th><td>{}</td></tr><tr><th>Unit</th><td>{}</td></tr><tr><th>Model</th><td>{}</td></tr></table>",
        h(or_dash(&sc.unknown)),
        h(or_dash(&sc.unit)),
        h(&sc.family)
    );

    s.push_str("<h2 id=\"people\">People</h2><table><tr><th>Expert</th><th>Weight</th><th>Last change</th></tr>");
    for e in &project.experts {
        let _ = write!(
            s,
            "<tr><td>{}</td><td class=\"n\">{}</td><td>{}</td></tr>",
            h(&e.name),
            num_f64(e.weight),
            h(or_dash(&e.changed))
        );
    }
    s.push_str("</table>");

    experts(&mut s, project, check);
    priors_plot(&mut s, project, &belief, check);
    predictive(&mut s, &belief);
    posterior(&mut s, check, &belief, data);
    sensitivity(&mut s, check);
    conflict(&mut s, check);
    exports(&mut s, project, &belief);

    s.push_str("<h2 id=\"notes\">Notes</h2>");
    if project.notes.trim().is_empty() {
        s.push_str("<p>(no notes were recorded)</p>");
    } else {
        for para in project.notes.split("\n\n") {
            let _ = write!(s, "<p>{}</p>", h(para.trim()).replace('\n', "<br>"));
        }
    }
    for n in check["notes"].as_array().into_iter().flatten() {
        let _ = write!(s, "<p class=\"warn\">{}</p>", h(n.as_str().unwrap_or("")));
    }
    s.push_str("<h2 id=\"cautions\">Cautions</h2>");
    cautions(&mut s);
    s.push_str("<p class=\"meta\">Written by Priorwright. Demo projects shipped with it are invented scenarios.</p></body></html>\n");
    Ok(s)
}

fn or_dash(s: &str) -> &str {
    if s.trim().is_empty() { "–" } else { s }
}

fn cautions(s: &mut String) {
    s.push_str("<div class=\"caution\"><strong>Responsible use.</strong><ul>");
    for c in CAUTIONS {
        let _ = write!(s, "<li>{}</li>", h(c));
    }
    s.push_str("</ul></div>");
}

/// One row per summary of the first unknown.
fn summary_row(s: &mut String, label: &str, b: &Value) {
    let p = &b["parameters"][0];
    let _ = write!(
        s,
        "<tr><td>{}</td><td>{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{} to {}</td></tr>",
        h(label),
        h(p["name"].as_str().unwrap_or("")),
        num(&p["mean"]),
        num(&p["sd"]),
        num(&p["median"]),
        num(&p["central_interval"]["lower"]),
        num(&p["central_interval"]["upper"])
    );
}

const SUMMARY_HEAD: &str = "<tr><th>Prior</th><th>Unknown</th><th>Mean</th><th>SD</th><th>Median</th><th>95% central interval</th></tr>";

fn experts(s: &mut String, project: &Project, check: &Value) {
    s.push_str("<h2 id=\"judgments\">Each expert's judgments and prior</h2>");
    for (i, e) in project.experts.iter().enumerate() {
        let _ = write!(s, "<h3>{}</h3>", h(&e.name));
        let _ = write!(s, "<p>{}</p>", h(&e.prior.as_if()));
        match &e.method {
            Some(MethodRecord::Chips { edges, chips, .. }) => {
                s.push_str("<p>Judgments given as chips in bins:</p><table><tr><th>Bin</th><th>Chips</th></tr>");
                for (k, c) in chips.iter().enumerate() {
                    let _ = write!(
                        s,
                        "<tr><td>{} to {}</td><td class=\"n\">{}</td></tr>",
                        num_f64(edges[k]),
                        num_f64(edges[k + 1]),
                        num_f64(*c)
                    );
                }
                s.push_str("</table>");
            }
            Some(MethodRecord::Imagined { text }) => {
                let _ = write!(
                    s,
                    "<p>The ESS was set from an imagined future sample: <code>{}</code>.</p>",
                    h(text)
                );
            }
            Some(MethodRecord::Observable { future, judgments }) => {
                let _ = write!(
                    s,
                    "<p>Judgments about a future observation (<code>{}</code>), fitted through the prior predictive:</p><table><tr><th>P(future ≤ value)</th><th>Value</th></tr>",
                    h(future)
                );
                for (p, v) in judgments {
                    let _ = write!(
                        s,
                        "<tr><td class=\"n\">{}</td><td class=\"n\">{}</td></tr>",
                        num_f64(*p),
                        num_f64(*v)
                    );
                }
                s.push_str("</table>");
            }
            None => {}
        }
        if e.judgments.is_empty() {
            s.push_str("<p>No stated probabilities are recorded: the prior was set by hand.</p>");
        } else {
            s.push_str("<table><tr><th>Unknown</th><th>Value</th><th>Stated P(≤ value)</th><th>Fitted</th></tr>");
            for j in &e.judgments {
                let (unknown, fitted) = j.fitted(&e.prior).unwrap_or((String::new(), f64::NAN));
                let _ = write!(
                    s,
                    "<tr><td>{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td></tr>",
                    h(&unknown),
                    num_f64(j.value),
                    num_f64(j.p),
                    num_f64(fitted)
                );
            }
            s.push_str("</table>");
        }
        let _ = write!(s, "<table>{SUMMARY_HEAD}");
        summary_row(s, &e.name, &check["experts"][i]);
        s.push_str("</table>");
    }
}

/// An x-range holding all but `tail` of each law's mass at either end.
fn law_range_with(laws: &[&Law], tail: f64) -> (f64, f64) {
    let mut lo = f64::INFINITY;
    let mut hi = f64::NEG_INFINITY;
    for l in laws {
        let (a, b) = (
            l.quantile_near(tail, None),
            l.quantile_near(1.0 - tail, None),
        );
        if a.is_finite() && b.is_finite() {
            lo = lo.min(a);
            hi = hi.max(b);
        }
    }
    if hi > lo { (lo, hi) } else { (0.0, 1.0) }
}

fn law_range(laws: &[&Law]) -> (f64, f64) {
    law_range_with(laws, 0.002)
}

fn density(name: &str, law: &Law, range: (f64, f64), bold: bool) -> Series {
    Series {
        name: name.to_owned(),
        points: curve::sample(|x| law.pdf(x), range.0, range.1, 300),
        bold,
    }
}

fn priors_plot(s: &mut String, project: &Project, belief: &Belief, check: &Value) {
    s.push_str("<h2 id=\"priors\">Priors and the pooled prior</h2>");
    let method = check["pooling"]["method"].as_str().unwrap_or("linear");
    let _ = write!(
        s,
        "<p>Pooling: {} pool{}.</p>",
        if method == "log" {
            "logarithmic"
        } else {
            "linear"
        },
        match project.pooling.robust_weight {
            Some(w) => format!(
                ", mixed with a vague prior of weight {} (robust mixture)",
                num_f64(w)
            ),
            None => String::new(),
        }
    );
    let own: Vec<(String, Law)> = project
        .experts
        .iter()
        .map(|e| {
            (
                e.name.clone(),
                Law::One(e.prior.marginals()[0].distribution),
            )
        })
        .collect();
    let pooled = belief.marginals().into_iter().next();
    let mut laws: Vec<&Law> = own.iter().map(|(_, l)| l).collect();
    let range = law_range(&laws);
    let mut series: Vec<Series> = own
        .iter()
        .map(|(n, l)| density(n, l, range, false))
        .collect();
    if let Some((name, l)) = &pooled {
        laws.push(l);
        series.insert(0, density("pooled prior", l, range, true));
        let plot = Plot {
            title: format!("Prior densities of {name}"),
            x_label: name.clone(),
            y_label: "density".into(),
            series,
            ..Plot::default()
        };
        s.push_str(&plot.svg());
    }
    let _ = write!(s, "<table>{SUMMARY_HEAD}");
    summary_row(s, "pooled prior", &check["pooled"]);
    s.push_str("</table>");
}

fn predictive(s: &mut String, belief: &Belief) {
    s.push_str("<h2 id=\"predictive\">Prior predictive</h2>");
    let rep = belief.representative();
    let key = match rep.id() {
        "beta-binomial" => "trials=20",
        "gamma-poisson" => "exposure=1",
        "dirichlet-multinomial" => "n=20",
        _ => "n=1",
    };
    let Ok(future) = rep.parse_future(key) else {
        return;
    };
    let Ok(parts) = belief.predictive(&future) else {
        s.push_str("<p>(the prior predictive could not be computed)</p>");
        return;
    };
    let _ = write!(
        s,
        "<p>What the data may look like before they are seen, for a future sample <code>{key}</code>, with the prior's uncertainty included.</p>"
    );
    let mut bars = Vec::new();
    let mut lines = Vec::new();
    let mut mean = 0.0;
    match &parts[0].1 {
        Predictive::Count(_) => {
            let pmf = |k: u64| -> f64 {
                parts
                    .iter()
                    .map(|(w, p)| match p {
                        Predictive::Count(d) => w * d.pmf(k),
                        _ => 0.0,
                    })
                    .sum()
            };
            let mut cum = 0.0;
            for k in 0..100_000u64 {
                let p = pmf(k);
                bars.push([k as f64, p]);
                mean += k as f64 * p;
                cum += p;
                if cum > 0.9995 {
                    break;
                }
            }
        }
        Predictive::Value(_) => {
            let laws: Vec<(f64, Law)> = parts
                .iter()
                .filter_map(|(w, p)| match p {
                    Predictive::Value(d) => Some((*w, Law::One(*d))),
                    _ => None,
                })
                .collect();
            let refs: Vec<&Law> = laws.iter().map(|(_, l)| l).collect();
            // Waiting times have long tails: the central 98% keeps the bulk readable.
            let range = law_range_with(&refs, 0.01);
            let pdf = |x: f64| laws.iter().map(|(w, l)| w * l.pdf(x)).sum::<f64>();
            lines.push(Series {
                name: "prior predictive".into(),
                points: curve::sample(pdf, range.0, range.1, 300),
                bold: true,
            });
            mean = f64::NAN;
        }
        Predictive::Categories(cats) => {
            s.push_str("<table><tr><th>Category</th><th>Mean count</th></tr>");
            for (k, (name, _)) in cats.iter().enumerate() {
                let m: f64 = parts
                    .iter()
                    .map(|(w, p)| match p {
                        Predictive::Categories(c) => w * c[k].1.mean(),
                        _ => 0.0,
                    })
                    .sum();
                let _ = write!(
                    s,
                    "<tr><td>{}</td><td class=\"n\">{}</td></tr>",
                    h(name),
                    num_f64(m)
                );
            }
            s.push_str("</table>");
            return;
        }
    }
    let plot = Plot {
        title: "Prior predictive".into(),
        x_label: if bars.is_empty() {
            "future value".into()
        } else {
            "future count".into()
        },
        y_label: if bars.is_empty() {
            "density".into()
        } else {
            "probability".into()
        },
        series: lines,
        bars,
        ..Plot::default()
    };
    s.push_str(&plot.svg());
    if mean.is_finite() {
        let _ = write!(s, "<p>Predicted mean count: {}.</p>", num_f64(mean));
    }
}

fn posterior(s: &mut String, check: &Value, belief: &Belief, data: &[Data]) {
    s.push_str("<h2 id=\"data\">Data and posterior</h2>");
    let Some(sources) = check["data"].as_array() else {
        s.push_str("<p>No data are loaded: this report records the prior only.</p>");
        return;
    };
    s.push_str("<table><tr><th>Data</th><th>Rows</th><th>Skipped (missing)</th></tr>");
    for d in sources {
        let _ = write!(
            s,
            "<tr><td>{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td></tr>",
            h(d["name"].as_str().unwrap_or("")),
            num(&d["rows"]),
            num(&d["missing"])
        );
    }
    s.push_str("</table>");
    let mut post = belief.clone();
    for d in data {
        match post.update(d) {
            Ok(p) => post = p,
            Err(_) => return,
        }
    }
    if let (Some((name, prior)), Some((_, postl))) = (
        belief.marginals().into_iter().next(),
        post.marginals().into_iter().next(),
    ) {
        // The posterior fully, the prior's central 98%: a vague robust part
        // would otherwise stretch the axis over the whole support.
        let (a, b) = law_range(&[&postl]);
        let (c, d) = law_range_with(&[&prior], 0.01);
        let range = (a.min(c), b.max(d));
        let ratio = |x: f64| {
            let (a, b) = (postl.pdf(x), prior.pdf(x));
            if b > 0.0 && a.is_finite() {
                a / b
            } else {
                f64::NAN
            }
        };
        let mut lik = curve::sample(ratio, range.0, range.1, 300);
        let area: f64 = lik
            .windows(2)
            .map(|w| 0.5 * (w[0][1] + w[1][1]) * (w[1][0] - w[0][0]))
            .filter(|a| a.is_finite())
            .sum();
        if area > 0.0 {
            lik.iter_mut().for_each(|p| p[1] /= area);
        }
        let plot = Plot {
            title: format!("Prior, scaled likelihood and posterior of {name}"),
            x_label: name,
            y_label: "density".into(),
            series: vec![
                density("posterior", &postl, range, true),
                density("prior", &prior, range, false),
                Series {
                    name: "scaled likelihood".into(),
                    points: lik,
                    bold: false,
                },
            ],
            ..Plot::default()
        };
        s.push_str(&plot.svg());
    }
    let _ = write!(s, "<table>{SUMMARY_HEAD}");
    summary_row(s, "prior", &check["pooled"]);
    summary_row(s, "posterior", &check["posterior"]);
    s.push_str("</table>");
    let _ = write!(
        s,
        "<p>The prior's share of the posterior's information: {}. Log marginal likelihood of the data: {}.</p>",
        num(&check["prior_share"]),
        num(&check["log_marginal_likelihood"])
    );
}

fn sensitivity(s: &mut String, check: &Value) {
    let Some(v) = check.get("sensitivity") else {
        return;
    };
    s.push_str("<h2 id=\"sensitivity\">Sensitivity to the prior</h2>");
    let param = v["parameter"].as_str().unwrap_or("");
    // One pass over a sweep: (x, mean) for the line, (x, lower, upper) for the band.
    let read = |key: &str, field: &str, log: bool| -> (Vec<[f64; 2]>, Vec<[f64; 3]>) {
        let mut line = Vec::new();
        let mut band = Vec::new();
        for p in v[key].as_array().into_iter().flatten() {
            let (Some(x), Some(lo), Some(hi)) =
                (p[field].as_f64(), p["lower"].as_f64(), p["upper"].as_f64())
            else {
                continue;
            };
            let x = if log { x.log10() } else { x };
            band.push([x, lo, hi]);
            if let Some(m) = p["mean"].as_f64() {
                line.push([x, m]);
            }
        }
        (line, band)
    };
    let _ = write!(
        s,
        "<p>Posterior mean and 95% central interval of {} as the prior's effective sample size is scaled from ×0.1 to ×10 (centre kept), and as the prior's centre moves across its own 95% interval (ESS kept).</p>",
        h(param)
    );
    for (key, field, log, xl) in [
        (
            "ess_sweep",
            "factor",
            true,
            "ESS factor (log scale)".to_owned(),
        ),
        (
            "centre_sweep",
            "centre",
            false,
            format!("prior centre of {param}"),
        ),
    ] {
        let (line, band) = read(key, field, log);
        let plot = Plot {
            title: format!("Posterior of {param} against the {xl}"),
            x_label: xl,
            y_label: param.to_owned(),
            series: vec![Series {
                name: "posterior mean".into(),
                points: line,
                bold: true,
            }],
            bands: vec![Band {
                name: "95% interval".into(),
                points: band,
            }],
            marks: match (log, v["centre_elicited"].as_f64()) {
                (true, _) => vec![(0.0, "elicited".into())],
                (false, Some(c)) => vec![(c, "elicited".into())],
                (false, None) => Vec::new(),
            },
            log_x: log,
            ..Plot::default()
        };
        s.push_str(&plot.svg());
    }
    let _ = write!(
        s,
        "<div class=\"keep\"><h3>Alternative priors</h3><p>{}</p><table class=\"wide\"><tr><th>Prior (how it is built)</th><th>Prior mean</th><th>Posterior mean</th><th>95% interval</th><th>Prior's share</th></tr>",
        if v["default_alternatives"].as_bool() == Some(true) {
            "The three alternatives are the defaults, built from the elicited prior (one conjugate prior: for several experts, their logarithmic pool)."
        } else {
            "The alternatives are the ones stated in the project."
        }
    );
    for r in v["alternatives"].as_array().into_iter().flatten() {
        let p = &r["posterior"];
        let _ = write!(
            s,
            "<tr><td>{}<br><small>{}</small></td><td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{} to {}</td><td class=\"n\">{}</td></tr>",
            h(r["name"].as_str().unwrap_or("")),
            h(r["how"].as_str().unwrap_or("")),
            num(&r["prior_mean"]),
            num(&p["mean"]),
            num(&p["lower"]),
            num(&p["upper"]),
            num(&r["prior_share"])
        );
    }
    s.push_str("</table></div>");
}

fn conflict(s: &mut String, check: &Value) {
    let Some(c) = check.get("conflict") else {
        return;
    };
    s.push_str("<h2 id=\"conflict\">Prior–data conflict</h2>");
    let _ = write!(
        s,
        "<p>Where the observed statistic falls in its prior predictive distribution (two-sided{}).</p><table><tr><th>Statistic</th><td>{}</td></tr><tr><th>Observed</th><td class=\"n\">{}</td></tr><tr><th>P(T ≤ observed)</th><td class=\"n\">{}</td></tr><tr><th>P(T ≥ observed)</th><td class=\"n\">{}</td></tr><tr><th>p-value</th><td class=\"n\">{}</td></tr><tr><th>Warning threshold</th><td class=\"n\">{}</td></tr><tr><th>Prior's share of the information</th><td class=\"n\">{}</td></tr></table>",
        if c["mid_p"].as_bool() == Some(true) {
            "; mid-p for a discrete statistic"
        } else {
            ""
        },
        h(c["statistic"].as_str().unwrap_or("")),
        num(&c["observed"]),
        num(&c["lower_tail"]),
        num(&c["upper_tail"]),
        num(&c["p_value"]),
        num(&c["threshold"]),
        num(&check["prior_share"])
    );
    match c["warning"].as_str() {
        Some(w) => {
            let _ = write!(s, "<p class=\"warn\">{}</p>", h(w));
        }
        None => s.push_str("<p>No conflict is flagged at this threshold: the data sit inside what the prior predicted.</p>"),
    }
}

fn exports(s: &mut String, project: &Project, belief: &Belief) {
    s.push_str("<h2 id=\"export\">The prior for model code</h2><p>The pooled prior in each target's own parameterisation, ready to paste.</p>");
    // Where a target cannot state the mixture, the experts' logarithmic pool
    // (one conjugate prior) is given instead, and said so.
    let fallback = project.log_pool().ok().map(Belief::One);
    for (_, t) in TARGETS {
        let _ = write!(s, "<h3>{}</h3>", h(t.title()));
        match export(belief, t) {
            Ok(text) => {
                let _ = write!(s, "<pre>{}</pre>", h(&text));
            }
            Err(e) => {
                let _ = write!(s, "<p>{}</p>", h(&e.to_string()));
                if let Some(Ok(text)) = fallback.as_ref().map(|b| export(b, t)) {
                    let _ = write!(
                        s,
                        "<p>The experts' logarithmic pool instead (one conjugate prior, not the mixture above):</p><pre>{}</pre>",
                        h(&text)
                    );
                }
            }
        }
    }
}
