//! Per-row checks and running sums, shared by the plain-row scanner and the
//! csv-crate path so both give the same statistics and the same messages.

use super::{DataError, Mapping, Missing};
use crate::family::{
    Counts, Data, EventCounts, LifeTest, MeanStats, NormalSample, Prior, SquaresAboutMean, Trials,
};

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

/// Turns rows of cells into the family's sufficient statistics.
pub(super) struct Reducer<'a> {
    name: &'a str,
    mapping: &'a Mapping,
    missing_policy: Missing,
    /// False for category labels, which are text even when they look like numbers.
    numeric: bool,
    cols: Vec<&'a str>,
    /// Position in the row of each mapped column.
    index: Vec<usize>,
    /// Fields in the header.
    width: usize,
    acc: Acc,
    fields: Vec<f64>,
    pub(super) rows: u64,
    pub(super) missing: u64,
}

impl<'a> Reducer<'a> {
    /// Matches the mapping to the header and the family, or says what does not fit.
    pub(super) fn new(
        name: &'a str,
        header: &[String],
        mapping: &'a Mapping,
        prior: &Prior,
        missing_policy: Missing,
    ) -> Result<Self, DataError> {
        let err = |line, column: Option<&str>, message| DataError {
            file: name.to_owned(),
            line,
            column: column.map(str::to_owned),
            message,
        };
        let cols = mapping.columns();
        let mut index = Vec::with_capacity(cols.len());
        for col in &cols {
            let Some(i) = header.iter().position(|h| h == col) else {
                return Err(err(
                    Some(1),
                    Some(col),
                    format!("no such column; the header has {}", header.join(", ")),
                ));
            };
            index.push(i);
        }
        let values = |mu| Acc::Values {
            n: 0.0,
            mean: 0.0,
            m2: 0.0,
            ss_known: 0.0,
            mu,
        };
        let acc = match (mapping, prior) {
            (Mapping::Binary { .. } | Mapping::SuccessesTrials { .. }, Prior::BetaBinomial(_)) => {
                Acc::Trials { s: 0.0, n: 0.0 }
            }
            (Mapping::Counts { .. }, Prior::GammaPoisson(_)) => Acc::Events { y: 0.0, t: 0.0 },
            (Mapping::Times { .. }, Prior::GammaExponential(_)) => Acc::Life { d: 0.0, t: 0.0 },
            (
                Mapping::Values { .. },
                Prior::NormalKnownVariance(_) | Prior::NormalInverseGamma(_),
            ) => values(0.0),
            (Mapping::Values { .. }, Prior::InverseGammaVariance(p)) => {
                let Some(mu) = p.mu else {
                    return Err(err(
                        None,
                        None,
                        "inverse-gamma-variance data need the known mean mu in the prior"
                            .to_owned(),
                    ));
                };
                values(mu)
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
        Ok(Self {
            name,
            mapping,
            missing_policy,
            numeric: !matches!(mapping, Mapping::Category { .. }),
            fields: Vec::with_capacity(cols.len()),
            cols,
            index,
            width: header.len(),
            acc,
            rows: 0,
            missing: 0,
        })
    }

    fn err(&self, line: Option<u64>, column: Option<&str>, message: String) -> DataError {
        DataError {
            file: self.name.to_owned(),
            line,
            column: column.map(str::to_owned),
            message,
        }
    }

    /// One data row of `count` fields. `cell(i)` gives field `i`'s bytes and,
    /// where the scanner already read it as a plain decimal, its value (NaN if not).
    pub(super) fn row<'b>(
        &mut self,
        line: u64,
        count: usize,
        cell: impl Fn(usize) -> (&'b [u8], f64),
    ) -> Result<(), DataError> {
        if count != self.width {
            return Err(self.err(
                Some(line),
                None,
                format!(
                    "this row has {count} fields but the header has {}",
                    self.width
                ),
            ));
        }
        self.fields.clear();
        for k in 0..self.index.len() {
            let (raw, plain) = cell(self.index[k]);
            if !plain.is_nan() && self.numeric {
                self.fields.push(plain);
                continue;
            }
            let t = raw.trim_ascii();
            if t.is_empty() || t.eq_ignore_ascii_case(b"na") {
                if self.missing_policy == Missing::Error {
                    return Err(self.err(
                        Some(line),
                        Some(self.cols[k]),
                        "empty cell (missing values were asked to be errors)".to_owned(),
                    ));
                }
                self.missing += 1;
                return Ok(());
            }
            let shown = || String::from_utf8_lossy(t).into_owned();
            if let Mapping::Category { labels, .. } = self.mapping {
                let Some(pos) = labels.iter().position(|l| l.as_bytes() == t) else {
                    return Err(self.err(
                        Some(line),
                        Some(self.cols[k]),
                        format!(
                            "'{}' is not one of the categories {}",
                            shown(),
                            labels.join(", ")
                        ),
                    ));
                };
                self.fields.push(pos as f64);
                continue;
            }
            let Some(v) = parse_number(t) else {
                return Err(self.err(
                    Some(line),
                    Some(self.cols[k]),
                    format!("'{}' is not a number", shown()),
                ));
            };
            if !v.is_finite() {
                return Err(self.err(
                    Some(line),
                    Some(self.cols[k]),
                    format!("'{}' is not a finite number", shown()),
                ));
            }
            self.fields.push(v);
        }
        self.rows += 1;
        self.add(line)
    }

    /// Adds the row just read to the running sums, after the family's checks.
    fn add(&mut self, line: u64) -> Result<(), DataError> {
        let f = &self.fields;
        let cols = &self.cols;
        let bad = |k: usize, message: String| DataError {
            file: self.name.to_owned(),
            line: Some(line),
            column: cols.get(k).map(|c| (*c).to_owned()),
            message,
        };
        let whole = |v: f64, k: usize| -> Result<f64, DataError> {
            if v >= 0.0 && v.fract() == 0.0 {
                Ok(v)
            } else {
                Err(bad(k, format!("'{v}' is not a whole count (0 or more)")))
            }
        };
        match (&mut self.acc, self.mapping) {
            (Acc::Trials { s, n }, Mapping::Binary { .. }) => {
                if f[0] != 0.0 && f[0] != 1.0 {
                    return Err(bad(0, format!("'{}' is not 0 or 1", f[0])));
                }
                *s += f[0];
                *n += 1.0;
            }
            (Acc::Trials { s, n }, _) => {
                let (k, m) = (whole(f[0], 0)?, whole(f[1], 1)?);
                if k > m {
                    return Err(bad(0, format!("{k} successes is more than the {m} trials")));
                }
                *s += k;
                *n += m;
            }
            (Acc::Events { y, t }, _) => {
                *y += whole(f[0], 0)?;
                let e = f.get(1).copied().unwrap_or(1.0);
                if e <= 0.0 {
                    return Err(bad(1, format!("exposure '{e}' must be positive")));
                }
                *t += e;
            }
            (Acc::Life { d, t }, _) => {
                if f[0] < 0.0 {
                    return Err(bad(0, format!("time '{}' must be 0 or more", f[0])));
                }
                let flag = f.get(1).copied().unwrap_or(1.0);
                if flag != 0.0 && flag != 1.0 {
                    return Err(bad(
                        1,
                        format!("event flag '{flag}' must be 1 (failure) or 0 (censored)"),
                    ));
                }
                *d += flag;
                *t += f[0];
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
                let y = f[0];
                *n += 1.0;
                let delta = y - *mean;
                *mean += delta / *n;
                *m2 += delta * (y - *mean);
                *ss_known += (y - *mu) * (y - *mu);
            }
            (Acc::Cats { counts }, Mapping::Category { .. }) => counts[f[0] as usize] += 1.0,
            (Acc::Cats { counts }, _) => {
                for (k, c) in counts.iter_mut().enumerate() {
                    *c += whole(f[k], k)?;
                }
            }
        }
        Ok(())
    }

    /// The statistics, once every row is in.
    pub(super) fn finish(self, prior: &Prior) -> Result<Data, DataError> {
        let err = |message: String| DataError {
            file: self.name.to_owned(),
            line: None,
            column: None,
            message,
        };
        if self.rows == 0 {
            return Err(err(if self.missing > 0 {
                "every row has a missing value".to_owned()
            } else {
                "a header row but no data".to_owned()
            }));
        }
        let bad = |e: crate::error::Error| err(e.to_string());
        Ok(match (self.acc, prior) {
            (Acc::Trials { s, n }, _) => Data::BetaBinomial(Trials::observed(s, n).map_err(bad)?),
            (Acc::Events { y, t }, _) => {
                Data::GammaPoisson(EventCounts::observed(y, t).map_err(bad)?)
            }
            (Acc::Life { d, t }, _) => {
                Data::GammaExponential(LifeTest::observed(d, t).map_err(bad)?)
            }
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
        })
    }
}

/// A cell's number: plain digits without a float parser (counts are the
/// common case), else fast-float2, which parses bytes directly and is
/// correctly rounded.
pub(super) fn parse_number(t: &[u8]) -> Option<f64> {
    whole_number(t).or_else(|| fast_float2::parse(t).ok())
}

/// Plain digits (up to 15, so exact in a double).
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
