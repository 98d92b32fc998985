//! The command-line front end: parse, compute through the core, print.

mod args;
mod fitting;
mod help;
pub(crate) mod json;
mod project;

pub use project::{report_html, report_of};
pub(crate) mod table;

pub use args::Cli;
use args::{Command, PredictArgs, PriorArgs, SummaryArgs};

use crate::analysis::summary::{self, SummaryOptions};
use crate::elicit::{Belief, Mixture};
use crate::error::{Error, Result};
use crate::family::Prior;
use clap::Parser as _;

/// Parses `args` (the program name first) and runs; returns the exit code.
/// Everything printed goes to `out` / `err`; errors are one line, exit code 2.
pub fn main_with(
    args: Vec<String>,
    out: &mut dyn std::io::Write,
    err: &mut dyn std::io::Write,
) -> i32 {
    let cli = match Cli::try_parse_from(args) {
        Ok(cli) => cli,
        Err(e) => {
            use clap::error::ErrorKind;
            return match e.kind() {
                ErrorKind::DisplayHelp | ErrorKind::DisplayVersion => {
                    let _ = write!(out, "{}", e.render());
                    0
                }
                _ => {
                    let _ = writeln!(err, "{}", one_line(&e.render().to_string()));
                    2
                }
            };
        }
    };
    let Some(command) = cli.command else {
        let mut cmd = <Cli as clap::CommandFactory>::command();
        let _ = write!(out, "{}", cmd.render_help());
        return 0;
    };
    let text = match run(&command) {
        Ok(text) => text,
        Err(e) => {
            let _ = writeln!(err, "error: {e}");
            return 2;
        }
    };
    match out.write_all(text.as_bytes()) {
        // A closed pipe (`| head`) is not an error.
        Ok(()) | Err(_) => 0,
    }
}

/// What the arguments ask for: the desktop window (on a project file, or on
/// the bundled example), or a command-line run.
#[derive(Debug, PartialEq)]
pub enum Invocation {
    /// Open the window; `Some` names the project file.
    Window(Option<std::path::PathBuf>),
    /// Anything else, for [`main_with`] (including bad arguments and help).
    Command,
}

/// Reads the arguments without running anything.
pub fn invocation(args: &[String]) -> Invocation {
    match Cli::try_parse_from(args) {
        Ok(Cli { command: None }) => Invocation::Window(None),
        Ok(Cli {
            command: Some(args::Command::Open(a)),
        }) => Invocation::Window(Some(a.project)),
        _ => Invocation::Command,
    }
}

/// clap's multi-line message folded to one line, usage dropped.
fn one_line(rendered: &str) -> String {
    let body = rendered.split("\n\nUsage:").next().unwrap_or(rendered);
    let joined: Vec<&str> = body
        .lines()
        .map(str::trim)
        .filter(|l| !l.is_empty())
        .collect();
    format!("{} (see --help)", joined.join(" "))
}

/// The prior a command starts from, and the components of a logarithmic pool.
struct Start {
    belief: Belief,
    pooled: Option<Mixture>,
}

/// Resolves --prior / --component / --pool / --robust into a belief.
fn start(a: &PriorArgs) -> Result<Start> {
    let (mut belief, pooled) = match (&a.prior, a.components.is_empty()) {
        (Some(_), false) => {
            return Err(Error::Rule(
                "give either --prior or --component, not both".to_owned(),
            ));
        }
        (None, true) => {
            return Err(Error::Rule(
                "give the prior with --prior key=value,… or --component WEIGHT:key=value,…"
                    .to_owned(),
            ));
        }
        (Some(text), true) => {
            if a.pool.is_some() {
                return Err(Error::Rule(
                    "--pool combines --component priors; with one --prior there is nothing to pool"
                        .to_owned(),
                ));
            }
            (Belief::One(Prior::parse(&a.family, text)?), None)
        }
        (None, false) => {
            let parts = a
                .components
                .iter()
                .enumerate()
                .map(|(i, c)| component(&a.family, i, c))
                .collect::<Result<Vec<_>>>()?;
            let mix = Mixture::new(parts)?;
            match a.pool.as_deref().unwrap_or("linear") {
                "linear" => (Belief::Mix(mix), None),
                "log" => (Belief::One(mix.log_pool()?), Some(mix)),
                other => {
                    return Err(Error::Rule(format!(
                        "--pool = '{other}' is not a pooling method; use linear or log"
                    )));
                }
            }
        }
    };
    if let Some(text) = &a.robust {
        let w = crate::error::probability("--robust", parse_number("--robust", text)?)?;
        belief = Belief::Mix(crate::elicit::mixture::robust(&belief, w)?);
    }
    Ok(Start { belief, pooled })
}

/// One `WEIGHT:key=value,...` component.
fn component(family: &str, i: usize, text: &str) -> Result<(f64, Prior)> {
    let Some((w, rest)) = text.split_once(':') else {
        return Err(Error::Rule(format!(
            "--component {}: '{text}' is not of the form WEIGHT:key=value,…",
            i + 1
        )));
    };
    let weight = parse_number(&format!("--component {} weight", i + 1), w.trim())?;
    Ok((weight, Prior::parse(family, rest)?))
}

/// Runs one command and returns what it prints.
fn run(command: &Command) -> Result<String> {
    match command {
        Command::Open(a) => Err(Error::Rule(format!(
            "cannot open {}: this build has no desktop window (it was built without the gui feature); use check, export or the other commands",
            a.project.display()
        ))),
        Command::Describe(a) => {
            let s = start(&a.prior)?;
            let opts = summary_options(&a.summary)?;
            let params = summary::summarize_laws(&s.belief.marginals(), &opts)?;
            Ok(if a.summary.json {
                json::describe(&s.belief, s.pooled.as_ref(), &params)
            } else {
                table::describe(&s.belief, &params, "prior")
            })
        }
        Command::Update(a) => {
            let s = start(&a.prior)?;
            let data = s.belief.representative().parse_data(&a.data)?;
            let opts = summary_options(&a.summary)?;
            let post = s.belief.update(&data)?;
            let params = summary::summarize_laws(&post.marginals(), &opts)?;
            let report = json::UpdateReport {
                prior: &s.belief,
                pooled: s.pooled.as_ref(),
                posterior: &post,
                params: &params,
                ln_ml: s.belief.ln_marginal_likelihood(&data)?,
                share: s.belief.prior_share(&data)?,
                conflict: s.belief.conflict(&data)?,
            };
            Ok(if a.summary.json {
                json::update(&report)
            } else {
                table::update(&report)
            })
        }
        Command::Predict(a) => predict(a),
        Command::Check(a) => project::check(a),
        Command::Export(a) => project::export(a),
        Command::Report(a) => project::report(a),
        Command::Fit(a) => {
            let out = fitting::run(a)?;
            Ok(if a.json {
                json::fit(&out.prior, &out.fit)
            } else {
                table::fit(&out.prior, &out.fit)
            })
        }
    }
}

fn predict(a: &PredictArgs) -> Result<String> {
    let s = start(&a.prior)?;
    let used = match &a.data {
        Some(d) => s.belief.update(&s.belief.representative().parse_data(d)?)?,
        None => s.belief.clone(),
    };
    let future = used.representative().parse_future(&a.future)?;
    let probs = probabilities(&a.prob)?;
    let at = numbers("--at", &a.at)?;
    let summaries = summary::summarize_mixed_predictive(&used.predictive(&future)?, &probs, &at)?;
    let posterior = a.data.is_some();
    Ok(if a.json {
        json::predict(&used, s.pooled.as_ref(), &summaries, posterior)
    } else {
        table::predict(&used, &summaries, posterior)
    })
}

/// A comma-separated, repeatable list of numbers.
pub(crate) fn numbers(option: &str, items: &[String]) -> Result<Vec<f64>> {
    items
        .iter()
        .flat_map(|s| s.split(','))
        .map(str::trim)
        .filter(|s| !s.is_empty())
        .map(|t| parse_number(option, t))
        .collect()
}

pub(crate) fn parse_number(option: &str, text: &str) -> Result<f64> {
    let v: f64 = text.parse().map_err(|_| Error::NotANumber {
        context: option.to_owned(),
        key: option.to_owned(),
        text: text.to_owned(),
    })?;
    crate::error::finite(option, v)
}

fn probabilities(items: &[String]) -> Result<Vec<f64>> {
    let probs = numbers("--prob", items)?;
    if probs.is_empty() {
        return Ok(SummaryOptions::default().probs);
    }
    for p in &probs {
        crate::error::probability("--prob", *p)?;
    }
    Ok(probs)
}

fn summary_options(a: &SummaryArgs) -> Result<SummaryOptions> {
    let level = match &a.level {
        Some(t) => parse_number("--level", t)?,
        None => SummaryOptions::default().level,
    };
    let mut cdf_points = Vec::new();
    let mut name: Option<String> = None;
    for item in a
        .cdf
        .iter()
        .flat_map(|s| s.split(','))
        .map(str::trim)
        .filter(|s| !s.is_empty())
    {
        let value = match item.rsplit_once(':') {
            Some((n, v)) => {
                name = Some(n.trim().to_owned());
                v
            }
            None => item,
        };
        cdf_points.push((name.clone(), parse_number("--cdf", value.trim())?));
    }
    let opts = SummaryOptions {
        probs: probabilities(&a.prob)?,
        level,
        cdf_points,
    };
    opts.validate()?;
    Ok(opts)
}
