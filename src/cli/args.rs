//! Command-line arguments as typed (clap); numbers stay text here so that
//! parsing errors can name the option and the text.

use super::help::FAMILIES;
use clap::{Args, Parser, Subcommand};

/// Priorwright: elicit conjugate priors, see what they imply, update them.
#[derive(Debug, Parser)]
#[command(name = "priorwright", version, after_long_help = FAMILIES, after_help = "Run 'priorwright describe --help' for every family's keys.")]
pub struct Cli {
    /// What to do; with none, the help is shown.
    #[command(subcommand)]
    pub command: Option<Command>,
}

/// Subcommands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Summarise a prior: mean, sd, mode, median, quantiles, intervals, cdf.
    #[command(after_help = FAMILIES)]
    Describe(DescribeArgs),
    /// Update a prior with data and summarise the posterior.
    #[command(after_help = FAMILIES)]
    Update(UpdateArgs),
    /// The prior (or, with --data, posterior) predictive of a future sample.
    #[command(after_help = FAMILIES)]
    Predict(PredictArgs),
}

/// Which prior.
#[derive(Debug, Args)]
pub struct PriorArgs {
    /// Family id (see the list below).
    #[arg(long)]
    pub family: String,
    /// The prior's hyperparameters as key=value pairs, e.g. alpha=2,beta=8.
    #[arg(long, allow_hyphen_values = true)]
    pub prior: Option<String>,
    /// One component of a mixture as WEIGHT:key=value,... (repeat once per
    /// component; the weights sum to 1), instead of --prior.
    #[arg(long = "component", allow_hyphen_values = true)]
    pub components: Vec<String>,
    /// How --component priors combine: linear (the mixture itself; default) or
    /// log (the logarithmic pool, again one conjugate prior).
    #[arg(long)]
    pub pool: Option<String>,
    /// Robust prior: mix in a unit-information component (same prior mean,
    /// effective sample size 1) at this weight, e.g. --robust 0.2.
    #[arg(long)]
    pub robust: Option<String>,
}

/// What to report for each unknown.
#[derive(Debug, Args)]
pub struct SummaryArgs {
    /// Quantile probabilities, comma-separated (repeatable); default 0.025,0.25,0.5,0.75,0.975.
    #[arg(long, allow_hyphen_values = true)]
    pub prob: Vec<String>,
    /// Level of the central and highest-density intervals; default 0.95.
    #[arg(long, allow_hyphen_values = true)]
    pub level: Option<String>,
    /// Points for P(X <= x) and P(X > x): [NAME:]x,... (a NAME: prefix applies
    /// to its point and those after it; default the first parameter).
    #[arg(long, allow_hyphen_values = true)]
    pub cdf: Vec<String>,
    /// Print JSON instead of a table.
    #[arg(long)]
    pub json: bool,
}

/// `describe`.
#[derive(Debug, Args)]
pub struct DescribeArgs {
    /// The prior.
    #[command(flatten)]
    pub prior: PriorArgs,
    /// What to report.
    #[command(flatten)]
    pub summary: SummaryArgs,
}

/// `update`.
#[derive(Debug, Args)]
pub struct UpdateArgs {
    /// The prior.
    #[command(flatten)]
    pub prior: PriorArgs,
    /// The data's sufficient statistics as key=value pairs, e.g. successes=3,trials=20.
    #[arg(long, allow_hyphen_values = true)]
    pub data: String,
    /// What to report.
    #[command(flatten)]
    pub summary: SummaryArgs,
}

/// `predict`.
#[derive(Debug, Args)]
pub struct PredictArgs {
    /// The prior.
    #[command(flatten)]
    pub prior: PriorArgs,
    /// The future sample, e.g. trials=20 or exposure=500.
    #[arg(long)]
    pub future: String,
    /// Data to update with first (posterior predictive).
    #[arg(long, allow_hyphen_values = true)]
    pub data: Option<String>,
    /// Quantile probabilities, comma-separated (repeatable); default 0.025,0.25,0.5,0.75,0.975.
    #[arg(long, allow_hyphen_values = true)]
    pub prob: Vec<String>,
    /// Points for the density (pmf for counts) and cdf, comma-separated (repeatable).
    #[arg(long, allow_hyphen_values = true)]
    pub at: Vec<String>,
    /// Print JSON instead of a table.
    #[arg(long)]
    pub json: bool,
}
