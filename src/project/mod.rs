//! The saved project: what a workshop elicited, in one RON file.
//!
//! The schema is versioned by `format_version`. Fields added later carry
//! serde defaults, so older files still load; a file from a newer version is
//! refused by name; files from older versions go through [`file::migrate`].

pub mod file;
mod time;

pub use file::{ProjectError, from_text, load, save, to_text, write_atomic};
pub use time::now_utc;

use crate::data::{Mapping, Missing};
use crate::elicit::{Belief, Mixture, PoolMethod};
use crate::error::{Error, Result};
use crate::family::{Data, FAMILY_IDS, Prior};

/// The schema version this build writes (and the newest it reads).
pub const FORMAT_VERSION: u32 = 1;

/// A whole project.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Project {
    /// Schema version.
    pub format_version: u32,
    /// What is being elicited.
    pub scenario: Scenario,
    /// Each expert's judgments and prior.
    #[serde(default)]
    pub experts: Vec<Expert>,
    /// How the experts are combined.
    #[serde(default)]
    pub pooling: Pooling,
    /// Observed data (references and the statistics read from them).
    #[serde(default)]
    pub data: Vec<DataSource>,
    /// Historical data used as a discounted prior.
    #[serde(default)]
    pub history: Option<History>,
    /// How the prior is checked (conflict threshold, alternative priors).
    #[serde(default, skip_serializing_if = "Checks::is_default")]
    pub checks: Checks,
    /// Free-form notes for the record.
    #[serde(default)]
    pub notes: String,
    /// When the project was created (UTC, RFC 3339).
    #[serde(default)]
    pub created: String,
    /// When it was last changed.
    #[serde(default)]
    pub changed: String,
}

/// Settings of the checks that make a prior defensible, kept with the
/// project so the report and a reviewer see the same ones.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Checks {
    /// A conflict p-value below this is reported as a warning.
    #[serde(default = "default_threshold")]
    pub conflict_threshold: f64,
    /// Priors to compare the elicited one with; empty: the defaults
    /// (vague, sceptical, enthusiastic), rebuilt from the current prior.
    #[serde(default)]
    pub alternatives: Vec<crate::analysis::sensitivity::Alternative>,
}

/// The usual 5% (common practice).
pub const DEFAULT_CONFLICT_THRESHOLD: f64 = 0.05;

fn default_threshold() -> f64 {
    DEFAULT_CONFLICT_THRESHOLD
}

impl Default for Checks {
    fn default() -> Self {
        Self {
            conflict_threshold: DEFAULT_CONFLICT_THRESHOLD,
            alternatives: Vec::new(),
        }
    }
}

impl Checks {
    /// Whether nothing differs from the defaults (then nothing is written).
    pub fn is_default(&self) -> bool {
        self == &Self::default()
    }

    /// The threshold lies in (0, 0.5]; each alternative is a valid prior of
    /// the project's family.
    pub fn validate(&self, family: &str) -> Result<()> {
        let t = self.conflict_threshold;
        if !(t > 0.0 && t <= 0.5) {
            return Err(Error::invalid(
                "conflict threshold",
                t,
                "it must lie in (0, 0.5]",
            ));
        }
        for a in &self.alternatives {
            if a.prior.id() != family {
                return Err(Error::Rule(format!(
                    "alternative prior '{}' is {} in a {family} project",
                    a.name,
                    a.prior.id()
                )));
            }
            a.prior
                .validate()
                .map_err(|e| Error::Rule(format!("alternative prior '{}': {e}", a.name)))?;
        }
        Ok(())
    }
}

/// The question being answered.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Scenario {
    /// Short title.
    pub title: String,
    /// What the unknown is and why it matters.
    #[serde(default)]
    pub description: String,
    /// The unknown's name in words (e.g. "leak rate per valve-year").
    #[serde(default)]
    pub unknown: String,
    /// Its unit.
    #[serde(default)]
    pub unit: String,
    /// Family id.
    pub family: String,
    /// Whether a safety, clinical or financial decision rests on it.
    #[serde(default)]
    pub high_stakes: bool,
}

/// One expert.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Expert {
    /// Name or role.
    pub name: String,
    /// Weight in the pool.
    pub weight: f64,
    /// Stated probabilities behind the prior, if it was fitted.
    #[serde(default)]
    pub judgments: Vec<StoredJudgment>,
    /// The expert's prior.
    pub prior: Prior,
    /// How the judgments were given, when not as typed probabilities: kept
    /// so a reviewer sees what the expert actually said.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub method: Option<MethodRecord>,
    /// Last change.
    #[serde(default)]
    pub changed: String,
}

/// What an expert said through one of the other judgment forms.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub enum MethodRecord {
    /// Chips placed in bins over the unknown.
    Chips {
        /// The unknown the bins are on (None: the first).
        #[serde(default)]
        parameter: Option<String>,
        /// Bin edges, increasing.
        edges: Vec<f64>,
        /// Chips per bin.
        chips: Vec<f64>,
    },
    /// An imagined future sample and where the estimate would move.
    Imagined {
        /// The sample as key=value pairs.
        text: String,
    },
    /// Probabilities about a future observation.
    Observable {
        /// The future sample as key=value pairs.
        future: String,
        /// (p, value): P(future observation <= value) = p.
        judgments: Vec<(f64, f64)>,
    },
}

/// A stated probability P(parameter ≤ value) = p.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct StoredJudgment {
    /// The unknown (None: the first).
    #[serde(default)]
    pub parameter: Option<String>,
    /// Probability.
    pub p: f64,
    /// Value.
    pub value: f64,
}

impl MethodRecord {
    /// A chips grid must have increasing finite edges, one more than its
    /// bins, and no negative chip count; probabilities lie in [0, 1].
    pub fn validate(&self) -> std::result::Result<(), String> {
        match self {
            Self::Chips { edges, chips, .. } => {
                if edges.len() != chips.len() + 1 {
                    return Err(format!(
                        "the chips grid has {} bins but {} edges (it needs one edge more than bins)",
                        chips.len(),
                        edges.len()
                    ));
                }
                if edges.iter().any(|e| !e.is_finite()) || edges.windows(2).any(|w| w[0] >= w[1]) {
                    return Err("the chips grid's edges must be finite and increasing".to_owned());
                }
                if chips.iter().any(|c| !(c.is_finite() && *c >= 0.0)) {
                    return Err("a chip count must be 0 or more".to_owned());
                }
            }
            Self::Imagined { .. } => {}
            Self::Observable { judgments, .. } => {
                if let Some((p, v)) = judgments
                    .iter()
                    .find(|(p, v)| !(p.is_finite() && (0.0..=1.0).contains(p) && v.is_finite()))
                {
                    return Err(format!(
                        "future-observation judgment p={p}, value={v} is not a probability and a number"
                    ));
                }
            }
        }
        Ok(())
    }
}

impl StoredJudgment {
    /// The unknown the judgment is about (its named one, else the first)
    /// and P(unknown ≤ value) under `prior`: the "fitted" beside "stated".
    pub fn fitted(&self, prior: &Prior) -> Option<(String, f64)> {
        let laws = prior.marginals();
        let law = self
            .parameter
            .as_ref()
            .and_then(|n| laws.iter().find(|m| &m.name == n))
            .or(laws.first())?;
        Some((law.name.clone(), law.distribution.tails(self.value).0))
    }
}

/// Pooling choice and its result.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Pooling {
    /// Linear (mixture) or logarithmic (conjugate).
    pub method: PoolMethod,
    /// Weight of a unit-information component, if a robust prior is wanted.
    #[serde(default)]
    pub robust_weight: Option<f64>,
    /// The logarithmic pool as last computed (for the record; recomputed on use).
    #[serde(default)]
    pub pooled: Option<Prior>,
}

impl Default for Pooling {
    fn default() -> Self {
        Self {
            method: PoolMethod::Linear,
            robust_weight: None,
            pooled: None,
        }
    }
}

/// Observed data: where from, how mapped, and what was read.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct DataSource {
    /// Label.
    pub name: String,
    /// File, relative to the project file's folder (None: typed in).
    #[serde(default)]
    pub path: Option<String>,
    /// Column mapping used to read it.
    #[serde(default)]
    pub mapping: Option<Mapping>,
    /// Missing-value policy used.
    #[serde(default)]
    pub missing_policy: Missing,
    /// The sufficient statistics, so the project reopens without the file.
    pub statistics: Data,
    /// Rows read.
    #[serde(default)]
    pub rows: u64,
    /// Rows skipped for missing values.
    #[serde(default)]
    pub missing: u64,
}

/// Historical data as a power prior.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct History {
    /// The earlier data.
    pub source: DataSource,
    /// Discount a0 ∈ (0, 1].
    pub discount: f64,
}

impl Project {
    /// Checks what serde cannot: one family throughout, weights, discount.
    pub fn validate(&self) -> Result<()> {
        let fam = self.scenario.family.as_str();
        if !FAMILY_IDS.contains(&fam) {
            return Err(Error::UnknownFamily {
                given: fam.to_owned(),
                known: FAMILY_IDS.join(", "),
            });
        }
        if self.experts.is_empty() {
            return Err(Error::Rule("the project has no expert priors".to_owned()));
        }
        for e in &self.experts {
            if e.prior.id() != fam {
                return Err(Error::Rule(format!(
                    "expert '{}' has a {} prior in a {fam} project",
                    e.name,
                    e.prior.id()
                )));
            }
            e.prior
                .validate()
                .map_err(|err| Error::Rule(format!("expert '{}': {err}", e.name)))?;
            if let Some(m) = &e.method {
                m.validate()
                    .map_err(|err| Error::Rule(format!("expert '{}': {err}", e.name)))?;
            }
        }
        let sources = self
            .data
            .iter()
            .chain(self.history.as_ref().map(|h| &h.source));
        for d in sources {
            d.statistics
                .validate()
                .map_err(|err| Error::Rule(format!("data '{}': {err}", d.name)))?;
            // A data set of another family.
            e_family(&d.statistics, fam)
                .map_err(|err| Error::Rule(format!("data '{}': {err}", d.name)))?;
        }
        self.checks.validate(fam)?;
        let total: f64 = self.experts.iter().map(|e| e.weight).sum();
        if self
            .experts
            .iter()
            .any(|e| !(e.weight.is_finite() && e.weight >= 0.0))
            || (total - 1.0).abs() > 1e-9
        {
            return Err(Error::Rule(format!(
                "expert weights must be 0 or more and sum to 1; they sum to {total}"
            )));
        }
        if let Some(h) = &self.history
            && !(h.discount > 0.0 && h.discount <= 1.0)
        {
            return Err(Error::invalid(
                "history discount",
                h.discount,
                "it must lie in (0, 1]",
            ));
        }
        Ok(())
    }

    /// The experts' priors with their weights, history applied.
    fn components(&self) -> Result<Vec<(f64, Prior)>> {
        self.experts
            .iter()
            .map(|e| {
                let prior = match &self.history {
                    Some(h) => e.prior.with_history(&h.source.statistics, h.discount)?,
                    None => e.prior.clone(),
                };
                Ok((e.weight, prior))
            })
            .collect()
    }

    /// The pooled prior the analysis starts from.
    pub fn belief(&self) -> Result<Belief> {
        self.validate()?;
        let mix = Mixture::new(self.components()?)?;
        let base = match self.pooling.method {
            PoolMethod::Log => Belief::One(mix.log_pool()?),
            PoolMethod::Linear if mix.components().len() == 1 => {
                Belief::One(mix.components()[0].1.clone())
            }
            PoolMethod::Linear => Belief::Mix(mix),
        };
        Ok(match self.pooling.robust_weight {
            Some(w) => Belief::Mix(crate::elicit::mixture::robust(&base, w)?),
            None => base,
        })
    }

    /// The logarithmic pool of the experts (stored in `pooling.pooled`).
    pub fn log_pool(&self) -> Result<Prior> {
        Mixture::new(self.components()?)?.log_pool()
    }

    /// The posterior after every data source, if there are any.
    pub fn posterior(&self) -> Result<Option<Belief>> {
        let mut b = self.belief()?;
        if self.data.is_empty() {
            return Ok(None);
        }
        for d in &self.data {
            b = b.update(&d.statistics)?;
        }
        Ok(Some(b))
    }
}

/// Errors if `data` are not for family `fam`.
fn e_family(data: &Data, fam: &str) -> Result<()> {
    let id = match data {
        Data::BetaBinomial(_) => "beta-binomial",
        Data::GammaPoisson(_) => "gamma-poisson",
        Data::GammaExponential(_) => "gamma-exponential",
        Data::NormalKnownVariance(_) => "normal-known-variance",
        Data::NormalInverseGamma(_) => "normal-inverse-gamma",
        Data::DirichletMultinomial(_) => "dirichlet-multinomial",
        Data::InverseGammaVariance(_) => "inverse-gamma-variance",
    };
    if id == fam {
        Ok(())
    } else {
        Err(Error::Rule(format!("{id} data in a {fam} project")))
    }
}
