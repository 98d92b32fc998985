//! Command-line arguments as typed (clap); numbers stay text here so that
//! parsing errors can name the option and the text.

use super::help::FAMILIES;
use clap::{Args, Parser, Subcommand};

/// Priorwright: elicit conjugate priors, see what they imply, update them.
#[derive(Debug, Parser)]
#[command(name = "priorwright", version, after_long_help = FAMILIES, after_help = "Run 'priorwright describe --help' for every family's keys.")]
pub struct Cli {
    /// What to do; with none, the desktop workbench opens on a bundled example.
    #[command(subcommand)]
    pub command: Option<Command>,
}

/// Subcommands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Open the desktop workbench on a project file (with no subcommand at
    /// all it opens on a bundled example).
    Open(OpenArgs),
    /// Summarise a prior: mean, sd, mode, median, quantiles, intervals, cdf.
    #[command(after_help = FAMILIES)]
    Describe(DescribeArgs),
    /// Update a prior with data and summarise the posterior.
    #[command(after_help = FAMILIES)]
    Update(UpdateArgs),
    /// The prior (or, with --data, posterior) predictive of a future sample.
    #[command(after_help = FAMILIES)]
    Predict(PredictArgs),
    /// Fit a prior to judgments: stated quantiles (of an unknown or of a
    /// future observable), a mode with an interval, chips in bins, or
    /// imagined future data.
    #[command(after_help = FIT_HELP)]
    Fit(FitArgs),
    /// Summaries of every expert's prior and the pooled prior of a project,
    /// and the posterior with its data (the project's own, or --data FILE).
    Check(CheckArgs),
    /// Write a project's pooled prior as model code: stan, pymc, numpyro,
    /// jags, r, brms, scipy or json.
    Export(ExportArgs),
    /// Write a self-contained HTML report of a project's elicitation:
    /// judgments, priors, predictive, posterior, sensitivity, conflict,
    /// export lines, notes and cautions.
    Report(ReportArgs),
}

/// `report`.
#[derive(Debug, Args)]
pub struct ReportArgs {
    /// The project file.
    pub project: std::path::PathBuf,
    /// A data file to read with the project's column mapping (instead of its stored statistics).
    #[arg(long)]
    pub data: Option<std::path::PathBuf>,
    /// The HTML file to write (atomically).
    #[arg(long)]
    pub out: std::path::PathBuf,
}

/// `open`.
#[derive(Debug, Args)]
pub struct OpenArgs {
    /// The project file.
    pub project: std::path::PathBuf,
}

/// `check`.
#[derive(Debug, Args)]
pub struct CheckArgs {
    /// The project file.
    pub project: std::path::PathBuf,
    /// A data file to read with the project's column mapping (instead of its stored statistics).
    #[arg(long)]
    pub data: Option<std::path::PathBuf>,
    /// Print JSON instead of a table.
    #[arg(long)]
    pub json: bool,
}

/// `export`.
#[derive(Debug, Args)]
pub struct ExportArgs {
    /// The project file.
    pub project: std::path::PathBuf,
    /// Target: stan, pymc, numpyro, jags, r, brms, scipy or json.
    #[arg(long)]
    pub to: String,
    /// Write to this file (atomically) instead of standard output.
    #[arg(long)]
    pub out: Option<std::path::PathBuf>,
}

/// How the fitting methods are stated.
const FIT_HELP: &str = "\
METHODS (one per call)

  --quantile [NAME:]P:VALUE ...   P(NAME <= VALUE) = P, repeated once per judgment;
                                  NAME defaults to the family's first unknown
                                  (e.g. mean_time:0.5:600, sigma:0.9:2.5).
                                  Two judgments on a two-hyperparameter family are
                                  solved exactly; more are fitted by least squares.
  --observable FUTURE             with --quantile: the judgments are about a future
                                  observable (e.g. --observable trials=20: the
                                  successes in the next 20 trials), fitted through
                                  the prior predictive; a count k reads P(X <= k) = P.
  --mode M --interval LO:HI:PROB  most likely M, and PROB sure it lies in [LO, HI].
  --bins E0,E1,...,EK --chips C1,...,CK
                                  chips spread over bins; each edge becomes the
                                  judgment P(X <= edge) = (chips left of it + 1/2)/(N + 1).
  --mean M --imagined KEYS        with the prior mean M held, 'if the next sample
                                  showed this, my estimate would be ...':
                                  beta-binomial successes=K,trials=N,estimate=E;
                                  gamma-poisson events=K,exposure=T,estimate=E;
                                  gamma-exponential failures=D,time=T,estimate=MEAN_TIME;
                                  normal-known-variance n=N,mean=YBAR,estimate=E;
                                  inverse-gamma-variance n=N,ss=SS,estimate=VARIANCE.

Known quantities go in --fixed: sigma=S (normal-known-variance), mu=M
(inverse-gamma-variance). dirichlet-multinomial takes the mean shares in
--shares S1;S2;... and fits the total ESS to quantiles of named shares
(--quantile theta1:0.05:0.2 --quantile theta1:0.95:0.6).";

/// `fit`.
#[derive(Debug, Args)]
pub struct FitArgs {
    /// Family id.
    #[arg(long)]
    pub family: String,
    /// Known quantities that are not hyperparameters: sigma=…, mu=….
    #[arg(long, allow_hyphen_values = true)]
    pub fixed: Option<String>,
    /// Mean shares for dirichlet-multinomial, S1;S2;….
    #[arg(long)]
    pub shares: Option<String>,
    /// Category names for dirichlet-multinomial, N1;N2;….
    #[arg(long)]
    pub names: Option<String>,
    /// A judgment [NAME:]P:VALUE, meaning P(NAME <= VALUE) = P (repeatable).
    #[arg(long = "quantile", allow_hyphen_values = true)]
    pub quantiles: Vec<String>,
    /// The future sample the --quantile judgments are about (e.g. trials=20).
    #[arg(long)]
    pub observable: Option<String>,
    /// The most likely value (with --interval).
    #[arg(long, allow_hyphen_values = true)]
    pub mode: Option<String>,
    /// LO:HI:PROB, the probability of lying in [LO, HI] (with --mode).
    #[arg(long, allow_hyphen_values = true)]
    pub interval: Option<String>,
    /// Bin edges E0,E1,…,EK (with --chips).
    #[arg(long, allow_hyphen_values = true)]
    pub bins: Option<String>,
    /// Chips per bin C1,…,CK (with --bins).
    #[arg(long)]
    pub chips: Option<String>,
    /// The prior mean held fixed (with --imagined).
    #[arg(long, allow_hyphen_values = true)]
    pub mean: Option<String>,
    /// The imagined sample and the estimate it would lead to (with --mean).
    #[arg(long)]
    pub imagined: Option<String>,
    /// The unknown a mode/interval or chips judgment is about (default: the first).
    #[arg(long)]
    pub parameter: Option<String>,
    /// Print JSON instead of a table.
    #[arg(long)]
    pub json: bool,
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
