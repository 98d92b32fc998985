//! The fast path for plain rows: unquoted fields, `\n` or `\r\n` line ends.
//!
//! The csv crate's byte-at-a-time state machine reads a file of short numeric
//! rows at well under 200 MB/s here; most data files hold no quote at all, and
//! for them one pass that splits fields and reads plain decimals together is
//! several times faster. Each block of whole lines is checked first: a block
//! holding a quote or a bare `\r` goes, with the rest of the file, to the csv
//! crate, so quoting is never interpreted here. A test compares both paths on
//! random files.

use std::io::Read;

/// One field of the current row: its byte range in the block and, when it is
/// a plain decimal (digits with at most one point, at most 15 digits), its
/// value; NaN otherwise.
#[derive(Clone, Copy, Debug)]
pub(super) struct Cell {
    pub(super) start: usize,
    pub(super) end: usize,
    pub(super) value: f64,
}

/// Exact powers of ten: `m / 10^k` with `m < 2^53` and `k ≤ 22` is a single
/// correctly rounded division (Clinger, "How to read floating point numbers
/// accurately", PLDI 1990: the fast path).
const POW10: [f64; 16] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
];

/// Scans one field from `pos` to the next delimiter, `\r`, `\n` or the end.
#[inline(always)]
fn field(b: &[u8], mut pos: usize, delim: u8) -> (f64, usize) {
    let (mut m, mut digits, mut dot) = (0u64, 0usize, usize::MAX);
    let mut plain = true;
    while pos < b.len() {
        let c = b[pos];
        let d = c.wrapping_sub(b'0');
        if d <= 9 {
            m = m.wrapping_mul(10).wrapping_add(u64::from(d));
            digits += 1;
        } else if c == delim || c == b'\n' || c == b'\r' {
            break;
        } else if c == b'.' && dot == usize::MAX {
            dot = pos;
        } else {
            plain = false;
        }
        pos += 1;
    }
    let value = if plain && (1..=15).contains(&digits) {
        let k = if dot == usize::MAX { 0 } else { pos - 1 - dot };
        m as f64 / POW10[k]
    } else {
        f64::NAN
    };
    (value, pos)
}

/// What the rows look like.
#[derive(Clone, Copy, Debug)]
pub(super) struct Shape {
    pub(super) delimiter: u8,
    /// Fields in the header (at most one more is kept per row, to report a ragged row).
    pub(super) width: usize,
    /// Longest line accepted, line end excluded.
    pub(super) limit: usize,
}

/// Calls `row(line, field count, cells)` for each non-empty line of `block`,
/// which holds whole lines (the last may lack its `\n` at the file's end), no
/// quote, and no `\r` but before `\n`. `line` is the last line number read
/// and is advanced past the block; a line over the limit gives `too_long(line)`.
pub(super) fn scan<E>(
    block: &[u8],
    shape: Shape,
    line: &mut u64,
    cells: &mut Vec<Cell>,
    too_long: impl Fn(u64) -> E,
    mut row: impl FnMut(u64, usize, &[Cell]) -> Result<(), E>,
) -> Result<(), E> {
    let Shape {
        delimiter: delim,
        width,
        limit,
    } = shape;
    let mut pos = 0;
    while pos < block.len() {
        *line += 1;
        let line_start = pos;
        match block[pos] {
            b'\n' => {
                pos += 1;
                continue;
            }
            b'\r' => {
                pos += 2;
                continue;
            }
            _ => {}
        }
        cells.clear();
        let mut count = 0;
        loop {
            let (value, end) = field(block, pos, delim);
            if count <= width {
                cells.push(Cell {
                    start: pos,
                    end,
                    value,
                });
            }
            count += 1;
            if end - line_start > limit {
                return Err(too_long(*line));
            }
            match block.get(end) {
                Some(&c) if c == delim => pos = end + 1,
                Some(b'\r') => {
                    pos = end + 2;
                    break;
                }
                Some(_) => {
                    pos = end + 1;
                    break;
                }
                None => {
                    pos = end;
                    break;
                }
            }
        }
        row(*line, count, cells)?;
    }
    Ok(())
}

/// True if the block can be scanned here: no quote, every `\r` before a `\n`.
pub(super) fn is_plain(block: &[u8]) -> bool {
    memchr::memchr(b'"', block).is_none() && !has_bare_return(block)
}

/// True if some `\r` is not followed by `\n` (old Mac line ends, which only
/// the csv crate reads).
pub(super) fn has_bare_return(block: &[u8]) -> bool {
    memchr::memchr_iter(b'\r', block).any(|i| block.get(i + 1) != Some(&b'\n'))
}

/// What [`Blocks::next_block`] found.
pub(super) enum Next {
    /// Whole lines at `start..end` of the buffer.
    Lines(usize, usize),
    /// The file has ended.
    End,
    /// A line longer than the limit.
    LongLine,
}

/// A reused buffer that hands out whole lines, in constant memory.
pub(super) struct Blocks<R> {
    input: R,
    buf: Vec<u8>,
    start: usize,
    filled: usize,
    eof: bool,
    /// Longest line accepted, without its `\n`.
    limit: usize,
}

/// Bytes read at a time; a block holds many lines, so per-block checks are cheap.
const BLOCK: usize = 1 << 18;

impl<R: Read> Blocks<R> {
    pub(super) fn new(input: R, limit: usize) -> Self {
        Self {
            input,
            buf: vec![0; BLOCK.min(limit.saturating_add(2))],
            start: 0,
            filled: 0,
            eof: false,
            limit,
        }
    }

    /// The buffer, to read the lines [`Self::next_block`] pointed at.
    pub(super) fn bytes(&self) -> &[u8] {
        &self.buf
    }

    /// What has been read and not consumed.
    pub(super) fn pending(&self) -> &[u8] {
        &self.buf[self.start..self.filled]
    }

    /// Marks the buffer consumed up to `end`.
    pub(super) fn consume(&mut self, end: usize) {
        self.start = end;
    }

    /// The next run of whole lines; at the file's end, the rest.
    pub(super) fn next_block(&mut self) -> std::io::Result<Next> {
        loop {
            let pending = &self.buf[self.start..self.filled];
            if let Some(p) = memchr::memrchr(b'\n', pending) {
                return Ok(Next::Lines(self.start, self.start + p + 1));
            }
            if self.eof {
                return Ok(if pending.is_empty() {
                    Next::End
                } else {
                    Next::Lines(self.start, self.filled)
                });
            }
            // Room for the longest line and its `\r\n`.
            if pending.len() > self.limit.saturating_add(1) {
                return Ok(Next::LongLine);
            }
            self.buf.copy_within(self.start..self.filled, 0);
            self.filled -= self.start;
            self.start = 0;
            if self.filled == self.buf.len() {
                // One line longer than the buffer: grow up to the limit (plus
                // its newline), no further.
                let size = (self.buf.len() * 2).min(self.limit.saturating_add(2).max(BLOCK));
                self.buf.resize(size, 0);
            }
            match self.input.read(&mut self.buf[self.filled..]) {
                Ok(0) => self.eof = true,
                Ok(n) => self.filled += n,
                Err(e) if e.kind() == std::io::ErrorKind::Interrupted => {}
                Err(e) => return Err(e),
            }
        }
    }

    /// What is left, unread lines first, as one reader (for the csv crate).
    pub(super) fn into_rest(self) -> impl Read {
        std::io::Cursor::new(self.buf[self.start..self.filled].to_vec()).chain(self.input)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn plain_decimals_equal_the_correctly_rounded_parse() {
        // Reference: Rust's standard parser is correctly rounded (IEEE 754-2008 §5.12).
        for t in [
            "0",
            "7",
            "2.45",
            "1001.234567890",
            "0.1",
            "123456789012345",
            "5.",
            ".5",
        ] {
            let (v, end) = field(t.as_bytes(), 0, b',');
            assert_eq!(end, t.len());
            assert_eq!(v, t.parse::<f64>().unwrap(), "{t}");
        }
        for t in ["-1", "1e3", "1.2.3", "1234567890123456", "", ".", " 3"] {
            assert!(field(t.as_bytes(), 0, b',').0.is_nan(), "{t}");
        }
    }

    #[test]
    fn blocks_with_quotes_or_bare_returns_are_not_plain() {
        assert!(is_plain(b"a,b\r\n1,2\r\n"));
        assert!(!is_plain(b"a,b\n\"1\",2\n"));
        assert!(!is_plain(b"a,b\r1,2\r"));
    }
}
