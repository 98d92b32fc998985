//! The streaming reader behind [`super::Mapping`].

use super::Mapping;
use super::plain::{self, Blocks, Next};
use super::reduce::Reducer;
use crate::family::{Data, Prior};
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

/// Feeds the csv crate: refuses a line longer than the limit before the
/// parser buffers it, and turns `\r\n` and a bare `\r` into `\n`. The csv
/// crate counts only `\n` and, after a `\r\n`, reports a record one line early;
/// with one kind of line end its line numbers are the file's.
struct LineGuard<R> {
    inner: R,
    since_newline: usize,
    after_return: bool,
    limit: usize,
    /// Bytes handed on, the last of them, and whether the input has ended:
    /// enough to tell a last record cut by the end of the file from one ended
    /// by a `\n`.
    emitted: u64,
    last: u8,
    ended: bool,
    /// `\n`s handed on, to name the line that is too long.
    newlines: u64,
    /// A line found too long, reported once the bytes before it are parsed,
    /// so that errors come in the file's order.
    too_long: Option<u64>,
}

impl<R> LineGuard<R> {
    fn new(inner: R, limit: usize) -> Self {
        Self {
            inner,
            since_newline: 0,
            after_return: false,
            limit,
            emitted: 0,
            last: b'\n',
            ended: false,
            newlines: 0,
            too_long: None,
        }
    }
}

/// The guard's error: line `line` (of what the guard read) is longer than `limit` bytes.
#[derive(Debug)]
struct LongLine {
    limit: usize,
    line: u64,
}

impl std::fmt::Display for LongLine {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "longer than {} bytes", self.limit)
    }
}

impl std::error::Error for LongLine {}

impl<R: Read> Read for LineGuard<R> {
    fn read(&mut self, buf: &mut [u8]) -> std::io::Result<usize> {
        loop {
            if let Some(line) = self.too_long {
                return Err(std::io::Error::other(LongLine {
                    limit: self.limit,
                    line,
                }));
            }
            let n = self.inner.read(buf)?;
            if n == 0 {
                self.ended = true;
                return Ok(0);
            }
            let mut w = 0;
            for r in 0..n {
                let b = buf[r];
                if self.after_return && b == b'\n' {
                    self.after_return = false;
                    continue;
                }
                self.after_return = b == b'\r';
                if b == b'\r' || b == b'\n' {
                    self.since_newline = 0;
                    self.newlines += 1;
                    buf[w] = b'\n';
                } else {
                    self.since_newline += 1;
                    if self.since_newline > self.limit {
                        self.too_long = Some(self.newlines + 1);
                        break;
                    }
                    buf[w] = b;
                }
                w += 1;
            }
            // A read that was only the `\n` of a `\r\n` must not look like
            // the end: read again.
            if w > 0 {
                self.emitted += w as u64;
                self.last = buf[w - 1];
                return Ok(w);
            }
        }
    }
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
///
/// Plain blocks of lines go through [`plain::scan`]; from the first block with
/// a quote or a bare `\r` on, the csv crate reads the rest. Both feed one
/// [`Reducer`], so the statistics and messages do not depend on the path.
pub fn read_from(
    input: impl Read,
    name: &str,
    delimiter: u8,
    mapping: &Mapping,
    prior: &Prior,
    opts: ReadOptions,
) -> Result<Reduced, DataError> {
    let mut blocks = Blocks::new(input, opts.max_line_bytes);
    let mut line = 0u64;
    let Some(header) = plain_header(&mut blocks, name, delimiter, opts, &mut line)? else {
        return read_csv(
            blocks.into_rest(),
            name,
            delimiter,
            mapping,
            prior,
            opts,
            line,
            None,
        );
    };
    let mut reducer = Reducer::new(name, &header, mapping, prior, opts.missing)?;
    let mut cells = Vec::with_capacity(header.len() + 1);
    loop {
        let (start, end) = match blocks
            .next_block()
            .map_err(|e| io_error(name, line + 1, e))?
        {
            Next::Lines(start, end) if plain::is_plain(&blocks.bytes()[start..end]) => (start, end),
            Next::End => break,
            Next::LongLine if plain::is_plain(blocks.pending()) => {
                return Err(long_line(name, line + 1, opts));
            }
            // A quote or a bare \r from here on: the csv crate reads the rest.
            Next::Lines(..) | Next::LongLine => {
                return read_csv(
                    blocks.into_rest(),
                    name,
                    delimiter,
                    mapping,
                    prior,
                    opts,
                    line,
                    Some(reducer),
                );
            }
        };
        let block = &blocks.bytes()[start..end];
        let shape = plain::Shape {
            delimiter,
            width: header.len(),
            limit: opts.max_line_bytes,
        };
        plain::scan(
            block,
            shape,
            &mut line,
            &mut cells,
            |l| long_line(name, l, opts),
            |l, count, cells| {
                reducer.row(l, count, |i| {
                    let c = cells[i];
                    (&block[c.start..c.end], c.value)
                })
            },
        )?;
        blocks.consume(end);
    }
    finish(reducer, prior)
}

fn finish(reducer: Reducer<'_>, prior: &Prior) -> Result<Reduced, DataError> {
    let (rows, missing) = (reducer.rows, reducer.missing);
    Ok(Reduced {
        data: reducer.finish(prior)?,
        rows,
        missing,
    })
}

/// The header: the first non-empty line, split by the csv crate (headers are
/// often quoted even when the data are not). None when the csv crate must read
/// the whole file: a quoted newline in the header, or bare `\r` line ends.
fn plain_header<R: Read>(
    blocks: &mut Blocks<R>,
    name: &str,
    delimiter: u8,
    opts: ReadOptions,
    line: &mut u64,
) -> Result<Option<Vec<String>>, DataError> {
    loop {
        let (start, end) = match blocks
            .next_block()
            .map_err(|e| io_error(name, *line + 1, e))?
        {
            Next::Lines(start, end) => (start, end),
            Next::End => return Err(empty_file(name)),
            // Only a plain line is surely too long: the csv crate splits the rest.
            Next::LongLine if !plain::is_plain(blocks.pending()) => return Ok(None),
            Next::LongLine => return Err(long_line(name, *line + 1, opts)),
        };
        let bytes = &blocks.bytes()[start..end];
        let first = memchr::memchr(b'\n', bytes).map_or(bytes.len(), |p| p + 1);
        let text = &bytes[..first];
        if plain::has_bare_return(text) {
            return Ok(None);
        }
        let body = text.strip_suffix(b"\n").unwrap_or(text);
        if body.strip_suffix(b"\r").unwrap_or(body).len() > opts.max_line_bytes {
            return Err(long_line(name, *line + 1, opts));
        }
        if text == b"\n" || text == b"\r\n" {
            *line += 1;
            blocks.consume(start + first);
            continue;
        }
        let mut rdr = csv::ReaderBuilder::new()
            .delimiter(delimiter)
            .has_headers(false)
            .from_reader(text);
        let mut rec = csv::ByteRecord::new();
        let whole_line = matches!(rdr.read_byte_record(&mut rec), Ok(true))
            && !rec.iter().any(|f| f.contains(&b'\n') || f.contains(&b'\r'));
        if !whole_line {
            return Ok(None);
        }
        *line += 1;
        blocks.consume(start + first);
        let names = header_names(&rec);
        if names.len() == 1 && names[0].is_empty() {
            return Err(empty_file(name));
        }
        return Ok(Some(names));
    }
}

fn io_error(name: &str, line: u64, e: std::io::Error) -> DataError {
    DataError {
        file: name.to_owned(),
        line: Some(line),
        column: None,
        message: e.to_string(),
    }
}

fn long_line(name: &str, line: u64, opts: ReadOptions) -> DataError {
    DataError {
        file: name.to_owned(),
        line: Some(line),
        column: None,
        message: format!("this line is longer than {} bytes", opts.max_line_bytes),
    }
}

fn empty_file(name: &str) -> DataError {
    DataError {
        file: name.to_owned(),
        line: Some(1),
        column: None,
        message: "the file is empty: a header row is needed".to_owned(),
    }
}

/// Header names, trimmed; a UTF-8 byte-order mark before the first is dropped.
fn header_names(rec: &csv::ByteRecord) -> Vec<String> {
    rec.iter()
        .enumerate()
        .map(|(i, h)| {
            let s = String::from_utf8_lossy(h).trim().to_owned();
            if i == 0 {
                s.trim_start_matches('\u{feff}').to_owned()
            } else {
                s
            }
        })
        .collect()
}

/// The csv crate's path, from `input` on: the whole file (header included)
/// when `started` is None, else the rest after `skipped` lines already read
/// into `started`.
#[allow(clippy::too_many_arguments)]
fn read_csv<'a>(
    input: impl Read,
    name: &'a str,
    delimiter: u8,
    mapping: &'a Mapping,
    prior: &Prior,
    opts: ReadOptions,
    skipped: u64,
    started: Option<Reducer<'a>>,
) -> Result<Reduced, DataError> {
    let mut rdr = csv::ReaderBuilder::new()
        .delimiter(delimiter)
        .has_headers(false)
        .flexible(true)
        .buffer_capacity(1 << 16)
        .from_reader(LineGuard::new(input, opts.max_line_bytes));
    let mut rec = csv::ByteRecord::new();
    // The csv crate's record positions count skipped blank lines into the next
    // record; where a record ends is exact, so its first line is found from
    // there, less the newlines inside its quoted fields.
    let next = |rdr: &mut csv::Reader<LineGuard<_>>,
                rec: &mut csv::ByteRecord|
     -> Result<Option<u64>, DataError> {
        match rdr.read_byte_record(rec) {
            Ok(false) => Ok(None),
            Ok(true) => {
                let end = rdr.position();
                let inside: u64 = rec
                    .iter()
                    .map(|f| memchr::memchr_iter(b'\n', f).count() as u64)
                    .sum();
                let g = rdr.get_ref();
                let cut = g.ended && end.byte() == g.emitted && g.last != b'\n';
                Ok(Some(end.line() - inside - u64::from(!cut) + skipped))
            }
            Err(e) => {
                let mut d = csv_error(name, &e);
                d.line = d.line.map(|l| l + skipped);
                if let csv::ErrorKind::Io(io) = e.kind()
                    && let Some(long) = io.get_ref().and_then(|i| i.downcast_ref::<LongLine>())
                {
                    d.line = Some(long.line + skipped);
                    d.message = format!("this line is {long}");
                }
                Err(d)
            }
        }
    };
    let mut reducer = match started {
        Some(reducer) => reducer,
        None => {
            if next(&mut rdr, &mut rec)?.is_none() {
                return Err(empty_file(name));
            }
            let header = header_names(&rec);
            if header.len() == 1 && header[0].is_empty() {
                return Err(empty_file(name));
            }
            Reducer::new(name, &header, mapping, prior, opts.missing)?
        }
    };
    while let Some(line) = next(&mut rdr, &mut rec)? {
        reducer.row(line, rec.len(), |i| (rec.get(i).unwrap_or(b""), f64::NAN))?;
    }
    finish(reducer, prior)
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

#[cfg(test)]
mod tests {
    //! The plain-row path must agree with the csv crate's on every input: same
    //! statistics, same counts, same message (the csv crate is the reference).
    use super::*;
    use proptest::prelude::*;

    fn both(text: &[u8], mapping: &Mapping, prior: &Prior) -> [Result<Reduced, DataError>; 2] {
        let opts = ReadOptions {
            max_line_bytes: 64,
            ..ReadOptions::default()
        };
        [
            read_from(text, "t.csv", b',', mapping, prior, opts),
            read_csv(text, "t.csv", b',', mapping, prior, opts, 0, None),
        ]
    }

    fn cases() -> Vec<(Mapping, Prior)> {
        vec![
            (
                Mapping::Counts {
                    count: "a".into(),
                    exposure: Some("b".into()),
                },
                Prior::parse("gamma-poisson", "alpha=2,beta=1").unwrap(),
            ),
            (
                Mapping::Values { column: "b".into() },
                Prior::parse("normal-inverse-gamma", "mu0=0,kappa0=1,alpha0=2,beta0=1").unwrap(),
            ),
            (
                Mapping::Category {
                    column: "a".into(),
                    labels: vec!["1".into(), "x".into()],
                },
                Prior::parse("dirichlet-multinomial", "alpha=1;1").unwrap(),
            ),
        ]
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(1000))]
        #[test]
        fn plain_rows_read_as_the_csv_crate_reads_them(
            header in prop_oneof![
                prop::sample::select(vec!["a,b\n", "\"a\",b\r\n", "\u{feff}a,b\n", "\na,b\n", "a,b", " \n"])
                    .prop_map(str::to_owned),
                "[ab,\" \r\n]{0,8}",
            ],
            body in prop_oneof![
                "[0-9.,\n\r\" xNA-]{0,80}",
                // Lines around the 64-byte limit of these tests.
                "([0-9,]{60,70}\r?\n){0,3}[0-9,\"]{0,70}",
            ],
        ) {
            let text = format!("{header}{body}");
            for (mapping, prior) in cases() {
                let [fast, reference] = both(text.as_bytes(), &mapping, &prior);
                prop_assert_eq!(fast, reference, "{:?}", text);
            }
        }
    }

    #[test]
    fn a_quote_deep_in_the_file_hands_over_with_the_right_line() {
        // 50 000 plain rows (several blocks), then a quoted row and a bad cell.
        let mut text = String::from("a,b\n");
        text.push_str(&"3,2.5\n".repeat(50_000));
        text.push_str("\"4\",1\n5,x\n");
        let (mapping, prior) = cases().swap_remove(0);
        let [fast, reference] = both(text.as_bytes(), &mapping, &prior);
        assert_eq!(fast, reference);
        assert_eq!(
            fast.unwrap_err().to_string(),
            "t.csv, line 50003, column 'b': 'x' is not a number"
        );
        let good = text.replace("5,x", "5,1");
        let [fast, reference] = both(good.as_bytes(), &mapping, &prior);
        assert_eq!(fast, reference);
        assert_eq!(fast.unwrap().rows, 50_002);
    }
}
