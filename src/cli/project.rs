//! `priorwright check`, `export` and `report` on a project file.

use super::args::{CheckArgs, ExportArgs, ReportArgs};
use crate::analysis::sensitivity::{self, Sensitivity};
use crate::analysis::summary::{self, SummaryOptions};
use crate::data::{ReadOptions, read_file};
use crate::elicit::Belief;
use crate::elicit::dials::Dial;
use crate::error::{Error, Result};
use crate::export::{self, TARGETS, Target};
use crate::project::{self, Project};
use serde_json::{Value, json};

fn load(path: &std::path::Path) -> Result<Project> {
    project::load(path).map_err(|e| Error::Rule(e.to_string()))
}

/// Summary JSON of one belief (as `describe --json` prints it).
fn belief_json(b: &Belief) -> Result<Value> {
    let params = summary::summarize_laws(&b.marginals(), &SummaryOptions::default())?;
    let text = super::json::describe(b, None, &params);
    serde_json::from_str(&text).map_err(|e| Error::Rule(e.to_string()))
}

/// `check`.
pub fn check(a: &CheckArgs) -> Result<String> {
    let (p, out, _) = check_value(&a.project, a.data.as_deref())?;
    if a.json {
        return Ok(serde_json::to_string_pretty(&out).unwrap_or_default() + "\n");
    }
    Ok(check_table(&p, &out))
}

/// `report`: the check's numbers and the project's curves as one HTML file.
pub fn report(a: &ReportArgs) -> Result<String> {
    let html = report_html(&a.project, a.data.as_deref())?;
    project::write_atomic(&a.out, &html).map_err(|e| Error::Rule(e.to_string()))?;
    Ok(format!("wrote {}\n", a.out.display()))
}

/// The report's HTML for a project (and a data file read with its mapping).
pub fn report_html(
    project_path: &std::path::Path,
    data_file: Option<&std::path::Path>,
) -> Result<String> {
    let (p, check, data) = check_value(project_path, data_file)?;
    let stats: Vec<_> = data.into_iter().map(|d| d.1).collect();
    crate::export::report::html(&p, &check, &stats, &project::now_utc())
}

/// One data set: name, statistics, rows read, rows skipped.
type DataSet = (String, crate::family::Data, u64, u64);

/// The project, the `check --json` document and the data it used.
fn check_value(
    project_path: &std::path::Path,
    data_file: Option<&std::path::Path>,
) -> Result<(Project, Value, Vec<DataSet>)> {
    let p = load(project_path)?;
    check_of(p, project_path, data_file)
}

/// The report's HTML for a project in memory (the desktop app's button).
/// `path` is where the project lives or will live: data files are looked
/// for beside it.
pub fn report_of(p: &Project, path: &std::path::Path) -> Result<String> {
    let (p, check, data) = check_of(p.clone(), path, None)?;
    let stats: Vec<_> = data.into_iter().map(|d| d.1).collect();
    crate::export::report::html(&p, &check, &stats, &project::now_utc())
}

/// [`check_value`] for a project already loaded.
fn check_of(
    p: Project,
    project_path: &std::path::Path,
    data_file: Option<&std::path::Path>,
) -> Result<(Project, Value, Vec<DataSet>)> {
    let belief = p.belief()?;
    // The data: a file read with the project's mapping, or the stored statistics.
    let data = match data_file {
        Some(file) => {
            let mapping = p
                .data
                .iter()
                .find_map(|d| d.mapping.clone())
                .ok_or_else(|| {
                    Error::Rule(format!(
                        "{}: the project has no column mapping to read {} with",
                        project_path.display(),
                        file.display()
                    ))
                })?;
            let first = &p.experts[0].prior;
            let policy = p.data.first().map(|d| d.missing_policy).unwrap_or_default();
            let r = read_file(
                file,
                &mapping,
                first,
                ReadOptions {
                    missing: policy,
                    ..ReadOptions::default()
                },
            )
            .map_err(|e| Error::Rule(e.to_string()))?;
            vec![(file.display().to_string(), r.data, r.rows, r.missing)]
        }
        None => p
            .data
            .iter()
            .map(|d| (d.name.clone(), d.statistics.clone(), d.rows, d.missing))
            .collect(),
    };
    let mut experts = Vec::new();
    for e in &p.experts {
        let mut v = belief_json(&Belief::One(e.prior.clone()))?;
        v["name"] = json!(e.name);
        v["weight"] = json!(e.weight);
        experts.push(v);
    }
    // Data files that have moved: the stored statistics are used, and we say so.
    let folder = project_path
        .parent()
        .map(std::path::Path::to_path_buf)
        .unwrap_or_default();
    let notes: Vec<String> = p
        .data
        .iter()
        .filter_map(|d| d.path.as_ref())
        .filter(|f| !folder.join(f).exists())
        .map(|f| {
            format!(
                "data file {} is missing; the statistics stored in the project are used",
                folder.join(f).display()
            )
        })
        .collect();
    let mut out = json!({
        "project": p.scenario.title,
        "family": p.scenario.family,
        "high_stakes": p.scenario.high_stakes,
        "experts": experts,
        "pooled": belief_json(&belief)?,
        "notes": notes,
        "pooling": { "method": match p.pooling.method { crate::elicit::PoolMethod::Linear => "linear", crate::elicit::PoolMethod::Log => "log" }, "robust_weight": p.pooling.robust_weight },
    });
    if !data.is_empty() {
        let mut post = belief.clone();
        let mut sources = Vec::new();
        let mut ln_ml = 0.0;
        let mut conflict = None;
        let mut share = None;
        for (name, d, rows, missing) in &data {
            ln_ml += post.ln_marginal_likelihood(d)?;
            if conflict.is_none() {
                conflict = belief.conflict(d)?;
                share = Some(belief.prior_share(d)?);
            }
            post = post.update(d)?;
            sources.push(json!({ "name": name, "rows": rows, "missing": missing }));
        }
        out["data"] = Value::Array(sources);
        out["posterior"] = belief_json(&post)?;
        out["log_marginal_likelihood"] = json!(ln_ml);
        out["prior_share"] = json!(share);
        if let Some(c) = conflict {
            let t = p.checks.conflict_threshold;
            out["conflict"] = json!({
                "statistic": c.statistic, "observed": c.observed, "lower_tail": c.lower_tail,
                "upper_tail": c.upper_tail, "p_value": c.p_value, "mid_p": c.mid_p,
                "threshold": t, "warning": c.warning(t),
            });
        }
        let stats: Vec<_> = data.iter().map(|d| d.1.clone()).collect();
        let s = sensitivity::run(
            &belief,
            &p.log_pool()?,
            &p.checks.alternatives,
            &stats,
            Dial::Main,
            0.95,
        )?;
        out["sensitivity"] = sensitivity_json(&s)?;
    }
    out["checks"] = json!({ "conflict_threshold": p.checks.conflict_threshold });
    Ok((p, out, data))
}

/// The sensitivity check as JSON: both sweeps and the comparison table.
fn sensitivity_json(s: &Sensitivity) -> Result<Value> {
    let sweep = |w: &sensitivity::Sweep, key: &str| -> Vec<Value> {
        w.points
            .iter()
            .map(|pt| json!({ key: pt.x, "mean": pt.mean, "lower": pt.lower, "upper": pt.upper }))
            .collect()
    };
    let mut rows = Vec::new();
    for (i, r) in s.table.iter().enumerate() {
        let hyper = if i == 0 {
            Value::Null
        } else {
            belief_json(&Belief::One(s.alternatives[i - 1].prior.clone()))?["hyperparameters"]
                .clone()
        };
        rows.push(json!({
            "name": r.name, "how": r.how, "hyperparameters": hyper,
            "prior_mean": r.prior_mean, "prior_share": r.prior_share,
            "posterior": { "mean": r.posterior.mean, "lower": r.posterior.lower, "upper": r.posterior.upper },
        }));
    }
    Ok(json!({
        "parameter": s.ess.parameter,
        "level": s.ess.level,
        "ess_sweep": sweep(&s.ess, "factor"),
        "centre_sweep": sweep(&s.centre, "centre"),
        "centre_elicited": s.centre.elicited,
        "default_alternatives": s.default_alternatives,
        "alternatives": rows,
    }))
}

/// The sensitivity part of the table: a few sweep points and the alternatives.
fn sensitivity_table(s: &mut String, v: &Value) {
    use std::fmt::Write as _;
    let f = |x: &Value| super::table::fmt(x.as_f64());
    let _ = writeln!(
        s,
        "\nsensitivity ({}, posterior mean and {} interval)",
        v["parameter"].as_str().unwrap_or(""),
        f(&v["level"])
    );
    let sweep = v["ess_sweep"].as_array().cloned().unwrap_or_default();
    let n = sweep.len();
    for i in [0, n / 4, n / 2, 3 * n / 4, n.saturating_sub(1)] {
        if let Some(pt) = sweep.get(i) {
            let _ = writeln!(
                s,
                "  ESS x{:<25} {} [{}, {}]",
                f(&pt["factor"]),
                f(&pt["mean"]),
                f(&pt["lower"]),
                f(&pt["upper"])
            );
        }
    }
    for r in v["alternatives"].as_array().into_iter().flatten() {
        let post = &r["posterior"];
        let _ = writeln!(
            s,
            "  {:<28} {} [{}, {}]  ({})",
            r["name"].as_str().unwrap_or(""),
            f(&post["mean"]),
            f(&post["lower"]),
            f(&post["upper"]),
            r["how"].as_str().unwrap_or("")
        );
    }
}

fn check_table(p: &Project, v: &Value) -> String {
    use std::fmt::Write as _;
    let f = |x: &Value| super::table::fmt(x.as_f64());
    let mut s = String::new();
    let _ = writeln!(s, "{} ({})", p.scenario.title, p.scenario.family);
    if !p.scenario.description.is_empty() {
        let _ = writeln!(s, "  {}", p.scenario.description);
    }
    let line = |s: &mut String, label: &str, b: &Value| {
        let par = &b["parameters"][0];
        let _ = writeln!(
            s,
            "  {label:<28} {} mean {}, sd {}, 95% interval [{}, {}]",
            par["name"].as_str().unwrap_or(""),
            f(&par["mean"]),
            f(&par["sd"]),
            f(&par["central_interval"]["lower"]),
            f(&par["central_interval"]["upper"])
        );
    };
    for n in v["notes"].as_array().into_iter().flatten() {
        let _ = writeln!(s, "  note: {}", n.as_str().unwrap_or(""));
    }
    let _ = writeln!(s, "\nexperts");
    for e in v["experts"].as_array().into_iter().flatten() {
        line(
            &mut s,
            &format!(
                "{} (weight {})",
                e["name"].as_str().unwrap_or(""),
                f(&e["weight"])
            ),
            e,
        );
    }
    let _ = writeln!(
        s,
        "\npooled ({})",
        v["pooling"]["method"].as_str().unwrap_or("")
    );
    line(&mut s, "prior", &v["pooled"]);
    if let Some(post) = v.get("posterior") {
        line(&mut s, "posterior", post);
        let _ = writeln!(
            s,
            "  {:<28} {}",
            "log marginal likelihood",
            f(&v["log_marginal_likelihood"])
        );
        let _ = writeln!(
            s,
            "  {:<28} {}",
            "prior's share of information",
            f(&v["prior_share"])
        );
        if let Some(c) = v.get("conflict") {
            let _ = writeln!(
                s,
                "  {:<28} {} (p = {})",
                "prior-data conflict check",
                c["statistic"].as_str().unwrap_or(""),
                f(&c["p_value"])
            );
            if let Some(w) = c["warning"].as_str() {
                let _ = writeln!(s, "  Warning: {w}");
            }
        }
    }
    if let Some(sens) = v.get("sensitivity") {
        sensitivity_table(&mut s, sens);
    }
    if p.scenario.high_stakes {
        let _ = writeln!(
            s,
            "\nThis project feeds a safety, clinical or financial decision: follow the applicable guidance and have the elicitation reviewed by someone qualified."
        );
    }
    s
}

/// `export`.
pub fn export(a: &ExportArgs) -> Result<String> {
    let Some(target) = Target::parse(&a.to) else {
        let names: Vec<&str> = TARGETS.iter().map(|(n, _)| *n).collect();
        return Err(Error::Rule(format!(
            "--to = '{}' is not an export target; use one of {}",
            a.to,
            names.join(", ")
        )));
    };
    let p = load(&a.project)?;
    let text = export::export(&p.belief()?, target)?;
    match &a.out {
        Some(path) => {
            project::write_atomic(path, &text).map_err(|e| Error::Rule(e.to_string()))?;
            Ok(String::new())
        }
        None => Ok(text),
    }
}
