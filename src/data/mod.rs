//! Data files to sufficient statistics.
//!
//! CSV and TSV files with a header row are read in reused blocks, so memory
//! stays constant whatever the file's size: plain rows by a one-pass scanner,
//! anything quoted by the `csv` crate.
//! The user maps columns to what the family needs; the result is the family's
//! [`crate::family::Data`] (its sufficient statistics), with the rows read and the rows
//! skipped for missing values. Every error names the file, the line and the
//! column and shows the offending text.

mod plain;
mod read;
mod reduce;

pub use read::{DataError, Missing, ReadOptions, Reduced, read_file, read_from};

/// Which columns carry what the family needs.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub enum Mapping {
    /// One 0/1 column (beta-binomial).
    Binary {
        /// Column name.
        column: String,
    },
    /// Successes and trials per row (beta-binomial).
    SuccessesTrials {
        /// Successes column.
        successes: String,
        /// Trials column.
        trials: String,
    },
    /// Event counts, with an optional exposure column (gamma-poisson; 1 per row if absent).
    Counts {
        /// Counts column.
        count: String,
        /// Exposure column.
        #[serde(default)]
        exposure: Option<String>,
    },
    /// Times with an event flag, 1 = failure and 0 = censored (gamma-exponential;
    /// every time is a failure if the flag is absent).
    Times {
        /// Time column.
        time: String,
        /// Event flag column.
        #[serde(default)]
        event: Option<String>,
    },
    /// Numeric values (normal families; inverse-gamma-variance uses the known mean).
    Values {
        /// Column name.
        column: String,
    },
    /// One category label per row (dirichlet-multinomial), in the prior's category order.
    Category {
        /// Column name.
        column: String,
        /// Labels, one per category of the prior.
        labels: Vec<String>,
    },
    /// One count column per category (dirichlet-multinomial).
    CountColumns {
        /// Column names in category order.
        columns: Vec<String>,
    },
}

impl Mapping {
    /// The columns this mapping reads.
    pub fn columns(&self) -> Vec<&str> {
        match self {
            Self::Binary { column } | Self::Values { column } | Self::Category { column, .. } => {
                vec![column]
            }
            Self::SuccessesTrials { successes, trials } => vec![successes, trials],
            Self::Counts { count, exposure } => std::iter::once(count.as_str())
                .chain(exposure.as_deref())
                .collect(),
            Self::Times { time, event } => std::iter::once(time.as_str())
                .chain(event.as_deref())
                .collect(),
            Self::CountColumns { columns } => columns.iter().map(String::as_str).collect(),
        }
    }
}
