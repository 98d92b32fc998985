//! The command-line front end: parse, compute through the core, print.

mod args;
mod help;
mod json;
mod table;

pub use args::Cli;
use args::{Command, PredictArgs, SummaryArgs};

use crate::analysis::summary::{self, SummaryOptions};
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

/// Runs one command and returns what it prints.
fn run(command: &Command) -> Result<String> {
    match command {
        Command::Describe(a) => {
            let prior = Prior::parse(&a.prior.family, &a.prior.prior)?;
            let opts = summary_options(&a.summary)?;
            let params = summary::summarize(&prior.marginals(), &opts)?;
            Ok(if a.summary.json {
                json::describe(&prior, &params)
            } else {
                table::describe(&prior, &params, "prior")
            })
        }
        Command::Update(a) => {
            let prior = Prior::parse(&a.prior.family, &a.prior.prior)?;
            let data = prior.parse_data(&a.data)?;
            let opts = summary_options(&a.summary)?;
            let post = prior.update(&data)?;
            let params = summary::summarize(&post.marginals(), &opts)?;
            let report = json::UpdateReport {
                prior: &prior,
                posterior: &post,
                params: &params,
                ln_ml: prior.ln_marginal_likelihood(&data)?,
                share: prior.prior_share(&data)?,
                conflict: prior.conflict(&data)?,
            };
            Ok(if a.summary.json {
                json::update(&report)
            } else {
                table::update(&report)
            })
        }
        Command::Predict(a) => predict(a),
    }
}

fn predict(a: &PredictArgs) -> Result<String> {
    let prior = Prior::parse(&a.prior.family, &a.prior.prior)?;
    let used = match &a.data {
        Some(d) => prior.update(&prior.parse_data(d)?)?,
        None => prior.clone(),
    };
    let future = used.parse_future(&a.future)?;
    let probs = probabilities(&a.prob)?;
    let at = numbers("--at", &a.at)?;
    let pred = used.predictive(&future)?;
    let summaries = summary::summarize_predictive(&pred, &probs, &at)?;
    let posterior = a.data.is_some();
    Ok(if a.json {
        json::predict(&used, &summaries, posterior)
    } else {
        table::predict(&used, &summaries, posterior)
    })
}

/// A comma-separated, repeatable list of numbers.
fn numbers(option: &str, items: &[String]) -> Result<Vec<f64>> {
    items
        .iter()
        .flat_map(|s| s.split(','))
        .map(str::trim)
        .filter(|s| !s.is_empty())
        .map(|t| parse_number(option, t))
        .collect()
}

fn parse_number(option: &str, text: &str) -> Result<f64> {
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
