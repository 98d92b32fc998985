//! The streaming reader behind [`super::Mapping`].

use super::Mapping;
use crate::family::{
    Counts, Data, EventCounts, LifeTest, MeanStats, NormalSample, Prior, SquaresAboutMean, Trials,
};
use std::io::Read;
use std::path::Path;

/// What to do with an empty or NA cell in a mapped column.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum Missing {
    /// Skip the row and count it.
    #[default]
    Skip,
    /// Refuse the file.
    Error,
}

/// Reading options.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct ReadOptions {
    /// Missing-value policy.
    pub missing: Missing,
    /// Longest line accepted, in bytes (a guard against a runaway line).
    pub max_line_bytes: usize,
}

impl Default for ReadOptions {
    fn default() -> Self {
        Self {
            missing: Missing::Skip,
            max_line_bytes: 1 << 20,
        }
    }
}

/// Sufficient statistics read from a file.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct Reduced {
    /// The statistics.
    pub data: Data,
    /// Data rows read.
    pub rows: u64,
    /// Rows skipped for a missing value.
    pub missing: u64,
}

/// A problem with a data file: where, and what.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[error("{file}{}{}: {message}", .line.map(|l| format!(", line {l}")).unwrap_or_default(), .column.as_ref().map(|c| format!(", column '{c}'")).unwrap_or_default())]
pub struct DataError {
    /// File name as given.
    pub file: String,
    /// 1-based line, where known.
    pub line: Option<u64>,
    /// Column name, where known.
    pub column: Option<String>,
    /// What is wrong, with the offending text.
    pub message: String,
}

/// Refuses a line longer than the limit before the CSV parser buffers it.
struct LineGuard<R> {
    inner: R,
    since_newline: usize,
    limit: usize,
}

/// The guard's error: a line longer than this many bytes.
#[derive(Debug)]
struct LongLine(usize);

impl std::fmt::Display for LongLine {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "longer than {} bytes", self.0)
    }
}

impl std::error::Error for LongLine {}

impl<R: Read> Read for LineGuard<R> {
    fn read(&mut self, buf: &mut [u8]) -> std::io::Result<usize> {
        let n = self.inner.read(buf)?;
        let chunk = &buf[..n];
        // Only a run crossing chunk boundaries can exceed the limit (reads are
        // far smaller than it), so the first and last newline suffice.
        let run = match chunk.iter().position(|b| *b == b'\n') {
            Some(first) => {
                let head = self.since_newline + first;
                self.since_newline =
                    n - 1 - chunk.iter().rposition(|b| *b == b'\n').unwrap_or(first);
                head.max(self.since_newline)
            }
            None => {
                self.since_newline += n;
                self.since_newline
            }
        };
        if run > self.limit {
            return Err(std::io::Error::other(LongLine(self.limit)));
        }
        Ok(n)
    }
}

/// Running sums for each kind of mapping.
enum Acc {
    Trials {
        s: f64,
        n: f64,
    },
    Events {
        y: f64,
        t: f64,
    },
    Life {
        d: f64,
        t: f64,
    },
    /// Welford's running mean and sum of squared deviations, and Σ(y − μ)² for a known μ.
    Values {
        n: f64,
        mean: f64,
        m2: f64,
        ss_known: f64,
        mu: f64,
    },
    Cats {
        counts: Vec<f64>,
    },
}

/// Reads `path` (TSV if it ends in .tsv or .tab, else CSV) for `prior`'s family.
pub fn read_file(
    path: &Path,
    mapping: &Mapping,
    prior: &Prior,
    opts: ReadOptions,
) -> Result<Reduced, DataError> {
    let name = path.display().to_string();
    let file = std::fs::File::open(path).map_err(|e| DataError {
        file: name.clone(),
        line: None,
        column: None,
        message: format!("cannot be opened: {e}"),
    })?;
    let ext = path
        .extension()
        .and_then(|e| e.to_str())
        .unwrap_or("")
        .to_ascii_lowercase();
    let delimiter = if ext == "tsv" || ext == "tab" {
        b'\t'
    } else {
        b','
    };
    read_from(file, &name, delimiter, mapping, prior, opts)
}

/// [`read_file`] from any reader; `name` is used in messages.
pub fn read_from(
    input: impl Read,
    name: &str,
    delimiter: u8,
    mapping: &Mapping,
    prior: &Prior,
    opts: ReadOptions,
) -> Result<Reduced, DataError> {
    let err = |line: Option<u64>, column: Option<&str>, message: String| DataError {
        file: name.to_owned(),
        line,
        column: column.map(str::to_owned),
        message,
    };
    let guard = LineGuard {
        inner: input,
        since_newline: 0,
        limit: opts.max_line_bytes,
    };
    let mut rdr = csv::ReaderBuilder::new()
        .delimiter(delimiter)
        .has_headers(true)
        .flexible(false)
        .buffer_capacity(1 << 16)
        .from_reader(guard);
    let headers = rdr.byte_headers().map_err(|e| csv_error(name, &e))?.clone();
    if headers.is_empty() || (headers.len() == 1 && headers[0].is_empty()) {
        return Err(err(
            Some(1),
            None,
            "the file is empty: a header row is needed".to_owned(),
        ));
    }
    let header_names: Vec<String> = headers
        .iter()
        .enumerate()
        .map(|(i, h)| {
            let s = String::from_utf8_lossy(h).trim().to_owned();
            // A UTF-8 byte-order mark before the first name is accepted and dropped.
            if i == 0 {
                s.trim_start_matches('\u{feff}').to_owned()
            } else {
                s
            }
        })
        .collect();
    let mut index = Vec::new();
    for col in mapping.columns() {
        let Some(i) = header_names.iter().position(|h| h == col) else {
            return Err(err(
                Some(1),
                Some(col),
                format!("no such column; the header has {}", header_names.join(", ")),
            ));
        };
        index.push(i);
    }
    let mut acc = match (mapping, prior) {
        (Mapping::Binary { .. } | Mapping::SuccessesTrials { .. }, Prior::BetaBinomial(_)) => {
            Acc::Trials { s: 0.0, n: 0.0 }
        }
        (Mapping::Counts { .. }, Prior::GammaPoisson(_)) => Acc::Events { y: 0.0, t: 0.0 },
        (Mapping::Times { .. }, Prior::GammaExponential(_)) => Acc::Life { d: 0.0, t: 0.0 },
        (Mapping::Values { .. }, Prior::NormalKnownVariance(_) | Prior::NormalInverseGamma(_)) => {
            Acc::Values {
                n: 0.0,
                mean: 0.0,
                m2: 0.0,
                ss_known: 0.0,
                mu: 0.0,
            }
        }
        (Mapping::Values { .. }, Prior::InverseGammaVariance(p)) => {
            let Some(mu) = p.mu else {
                return Err(err(
                    None,
                    None,
                    "inverse-gamma-variance data need the known mean mu in the prior".to_owned(),
                ));
            };
            Acc::Values {
                n: 0.0,
                mean: 0.0,
                m2: 0.0,
                ss_known: 0.0,
                mu,
            }
        }
        (Mapping::Category { labels, .. }, Prior::DirichletMultinomial(p))
            if labels.len() == p.alpha.len() =>
        {
            Acc::Cats {
                counts: vec![0.0; labels.len()],
            }
        }
        (Mapping::CountColumns { columns }, Prior::DirichletMultinomial(p))
            if columns.len() == p.alpha.len() =>
        {
            Acc::Cats {
                counts: vec![0.0; columns.len()],
            }
        }
        (
            Mapping::Category { .. } | Mapping::CountColumns { .. },
            Prior::DirichletMultinomial(p),
        ) => {
            return Err(err(
                None,
                None,
                format!(
                    "the mapping must name {} categories, one per category of the prior",
                    p.alpha.len()
                ),
            ));
        }
        (m, p) => {
            return Err(err(
                None,
                None,
                format!("a {} mapping does not fit the {} family", kind(m), p.id()),
            ));
        }
    };
    let cols: Vec<&str> = mapping.columns();
    let mut rec = csv::ByteRecord::new();
    let (mut rows, mut missing) = (0u64, 0u64);
    let mut fields: Vec<f64> = Vec::with_capacity(index.len());
    let mut last_line = 1;
    'rows: loop {
        match rdr.read_byte_record(&mut rec) {
            Ok(true) => {}
            Ok(false) => break,
            Err(e) => {
                let mut d = csv_error(name, &e);
                if let csv::ErrorKind::Io(io) = e.kind()
                    && io.get_ref().is_some_and(|inner| inner.is::<LongLine>())
                {
                    // The long line is the one after the last complete record.
                    d.line = Some(last_line + 1);
                    d.message = format!("this line is {io}");
                }
                return Err(d);
            }
        }
        let line = rec.position().map_or(0, csv::Position::line);
        last_line = line;
        fields.clear();
        for (k, &i) in index.iter().enumerate() {
            let t = rec.get(i).unwrap_or(b"").trim_ascii();
            if t.is_empty() || t.eq_ignore_ascii_case(b"na") {
                if opts.missing == Missing::Error {
                    return Err(err(
                        Some(line),
                        Some(cols[k]),
                        "empty cell (missing values were asked to be errors)".to_owned(),
                    ));
                }
                missing += 1;
                continue 'rows;
            }
            let shown = || String::from_utf8_lossy(t).into_owned();
            if let Mapping::Category { labels, .. } = mapping {
                let Some(pos) = labels.iter().position(|l| l.as_bytes() == t) else {
                    return Err(err(
                        Some(line),
                        Some(cols[k]),
                        format!(
                            "'{}' is not one of the categories {}",
                            shown(),
                            labels.join(", ")
                        ),
                    ));
                };
                fields.push(pos as f64);
                continue;
            }
            // fast-float2 parses the bytes directly, correctly rounded, about
            // twice as fast as going through &str and the standard parser.
            let v: f64 = match whole_number(t) {
                Some(v) => v,
                None => fast_float2::parse(t).map_err(|_| {
                    err(
                        Some(line),
                        Some(cols[k]),
                        format!("'{}' is not a number", shown()),
                    )
                })?,
            };
            if !v.is_finite() {
                return Err(err(
                    Some(line),
                    Some(cols[k]),
                    format!("'{}' is not a finite number", shown()),
                ));
            }
            fields.push(v);
        }
        rows += 1;
        let whole = |v: f64, k: usize| -> Result<f64, DataError> {
            if v >= 0.0 && v.fract() == 0.0 {
                Ok(v)
            } else {
                Err(err(
                    Some(line),
                    Some(cols[k]),
                    format!("'{v}' is not a whole count (0 or more)"),
                ))
            }
        };
        match (&mut acc, mapping) {
            (Acc::Trials { s, n }, Mapping::Binary { .. }) => {
                if fields[0] != 0.0 && fields[0] != 1.0 {
                    return Err(err(
                        Some(line),
                        Some(cols[0]),
                        format!("'{}' is not 0 or 1", fields[0]),
                    ));
                }
                *s += fields[0];
                *n += 1.0;
            }
            (Acc::Trials { s, n }, _) => {
                let (k, m) = (whole(fields[0], 0)?, whole(fields[1], 1)?);
                if k > m {
                    return Err(err(
                        Some(line),
                        Some(cols[0]),
                        format!("{k} successes is more than the {m} trials"),
                    ));
                }
                *s += k;
                *n += m;
            }
            (Acc::Events { y, t }, _) => {
                *y += whole(fields[0], 0)?;
                let e = fields.get(1).copied().unwrap_or(1.0);
                if e <= 0.0 {
                    return Err(err(
                        Some(line),
                        cols.get(1).copied(),
                        format!("exposure '{e}' must be positive"),
                    ));
                }
                *t += e;
            }
            (Acc::Life { d, t }, _) => {
                if fields[0] < 0.0 {
                    return Err(err(
                        Some(line),
                        Some(cols[0]),
                        format!("time '{}' must be 0 or more", fields[0]),
                    ));
                }
                let flag = fields.get(1).copied().unwrap_or(1.0);
                if flag != 0.0 && flag != 1.0 {
                    return Err(err(
                        Some(line),
                        cols.get(1).copied(),
                        format!("event flag '{flag}' must be 1 (failure) or 0 (censored)"),
                    ));
                }
                *d += flag;
                *t += fields[0];
            }
            (
                Acc::Values {
                    n,
                    mean,
                    m2,
                    ss_known,
                    mu,
                },
                _,
            ) => {
                let y = fields[0];
                *n += 1.0;
                let delta = y - *mean;
                *mean += delta / *n;
                *m2 += delta * (y - *mean);
                *ss_known += (y - *mu) * (y - *mu);
            }
            (Acc::Cats { counts }, Mapping::Category { .. }) => counts[fields[0] as usize] += 1.0,
            (Acc::Cats { counts }, _) => {
                for (k, c) in counts.iter_mut().enumerate() {
                    *c += whole(fields[k], k)?;
                }
            }
        }
    }
    if rows == 0 {
        return Err(err(
            None,
            None,
            if missing > 0 {
                "every row has a missing value".to_owned()
            } else {
                "a header row but no data".to_owned()
            },
        ));
    }
    let bad = |e: crate::error::Error| err(None, None, e.to_string());
    let data = match (acc, prior) {
        (Acc::Trials { s, n }, _) => Data::BetaBinomial(Trials::observed(s, n).map_err(bad)?),
        (Acc::Events { y, t }, _) => Data::GammaPoisson(EventCounts::observed(y, t).map_err(bad)?),
        (Acc::Life { d, t }, _) => Data::GammaExponential(LifeTest::observed(d, t).map_err(bad)?),
        (Acc::Values { n, mean, m2, .. }, Prior::NormalKnownVariance(_)) => {
            let var = (n > 1.0).then(|| m2 / (n - 1.0));
            Data::NormalKnownVariance(MeanStats::observed(n, mean, var).map_err(bad)?)
        }
        (Acc::Values { n, mean, m2, .. }, Prior::NormalInverseGamma(_)) => {
            let var = if n > 1.0 { m2 / (n - 1.0) } else { 0.0 };
            Data::NormalInverseGamma(NormalSample::observed(n, mean, Some(var)).map_err(bad)?)
        }
        (Acc::Values { n, ss_known, .. }, _) => {
            Data::InverseGammaVariance(SquaresAboutMean::observed(n, ss_known).map_err(bad)?)
        }
        (Acc::Cats { counts }, _) => {
            Data::DirichletMultinomial(Counts::observed(counts).map_err(bad)?)
        }
    };
    Ok(Reduced {
        data,
        rows,
        missing,
    })
}

/// Plain digits (up to 15, so exact in a double) read without a float parser:
/// counts are the common case.
fn whole_number(t: &[u8]) -> Option<f64> {
    if t.is_empty() || t.len() > 15 {
        return None;
    }
    let mut v: u64 = 0;
    for &b in t {
        let d = b.wrapping_sub(b'0');
        if d > 9 {
            return None;
        }
        v = v * 10 + u64::from(d);
    }
    Some(v as f64)
}

fn kind(m: &Mapping) -> &'static str {
    match m {
        Mapping::Binary { .. } => "0/1 column",
        Mapping::SuccessesTrials { .. } => "successes-and-trials",
        Mapping::Counts { .. } => "counts",
        Mapping::Times { .. } => "times",
        Mapping::Values { .. } => "values",
        Mapping::Category { .. } => "category",
        Mapping::CountColumns { .. } => "count-columns",
    }
}

/// The csv crate's errors, as file, line and what happened.
fn csv_error(name: &str, e: &csv::Error) -> DataError {
    let line = e.position().map(csv::Position::line);
    let message = match e.kind() {
        csv::ErrorKind::UnequalLengths {
            expected_len, len, ..
        } => {
            format!("this row has {len} fields but the header has {expected_len}")
        }
        csv::ErrorKind::Io(io) => io.to_string(),
        csv::ErrorKind::Utf8 { .. } => "text that is not valid UTF-8".to_owned(),
        _ => e.to_string(),
    };
    DataError {
        file: name.to_owned(),
        line,
        column: None,
        message,
    }
}
