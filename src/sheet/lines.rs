//! Line numbers as an editor shows them. The CSV reader counts only `\n`,
//! and counts a record's CRLF after the record starts, so its numbers are
//! one early in CRLF files and wrong in files ended by a lone `\r` (old
//! Mac) or with mixed endings. [`Lines`] sits under the reader, keeps the
//! bytes the reader has taken but not yet numbered, and counts `\n`,
//! `\r\n` and a lone `\r` as one line end each, everywhere (a line break
//! inside a quoted cell is a line in the editor too).

use std::io::Read;

/// A reader that numbers the lines of what passes through it.
pub(crate) struct Lines<R> {
    inner: R,
    /// Bytes read but not yet numbered, from `start` on.
    pending: Vec<u8>,
    start: usize,
    /// The offset in the input of `pending[start]`.
    offset: u64,
    /// The line `pending[start]` is on (from 1).
    line: u64,
    /// The byte before `pending[start]` was a `\r`.
    after_cr: bool,
}

/// The line ends in `bytes`, given whether the byte before was `\r`; the
/// new `after_cr`.
pub(crate) fn count_line_ends(bytes: &[u8], mut after_cr: bool) -> (u64, bool) {
    let mut n = 0;
    for &b in bytes {
        match b {
            b'\r' => {
                n += 1;
                after_cr = true;
            }
            b'\n' => {
                n += u64::from(!after_cr);
                after_cr = false;
            }
            _ => after_cr = false,
        }
    }
    (n, after_cr)
}

impl<R: Read> Lines<R> {
    pub(crate) fn new(inner: R) -> Self {
        Lines {
            inner,
            pending: Vec::new(),
            start: 0,
            offset: 0,
            line: 1,
            after_cr: false,
        }
    }

    /// The line of the record that starts at byte `at` of the input. The
    /// CSV reader may place a record's start on the line end before it (the
    /// `\n` of a CRLF) or before blank lines it skipped; a record never
    /// starts with a line end, so those are counted too. Offsets must not
    /// go back.
    pub(crate) fn record_line(&mut self, at: u64) -> u64 {
        self.advance(at);
        let mut line = self.line;
        let mut after_cr = self.after_cr;
        for &b in &self.pending[self.start..] {
            match b {
                b'\r' => {
                    line += 1;
                    after_cr = true;
                }
                b'\n' => {
                    line += u64::from(!after_cr);
                    after_cr = false;
                }
                _ => break,
            }
        }
        line
    }

    /// The line the byte `at` of the input is on, as far as read.
    pub(crate) fn line_at(&mut self, at: u64) -> u64 {
        self.advance(at);
        self.line
    }

    /// Numbers the bytes before `at` and lets them go.
    fn advance(&mut self, at: u64) {
        let available = (self.pending.len() - self.start) as u64;
        let n = at.saturating_sub(self.offset).min(available) as usize;
        let (ends, after_cr) =
            count_line_ends(&self.pending[self.start..self.start + n], self.after_cr);
        self.line += ends;
        self.after_cr = after_cr;
        self.start += n;
        self.offset += n as u64;
        // Let the numbered bytes go once they are most of the buffer, so
        // that it stays about as large as the reader's own.
        if self.start > 64 * 1024 && self.start * 2 > self.pending.len() {
            self.pending.drain(..self.start);
            self.start = 0;
        }
    }
}

impl<R: Read> Read for Lines<R> {
    fn read(&mut self, buf: &mut [u8]) -> std::io::Result<usize> {
        let n = self.inner.read(buf)?;
        self.pending.extend_from_slice(&buf[..n]);
        Ok(n)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The line of each record as the CSV reader reads `text`.
    fn record_lines(text: &[u8]) -> Vec<u64> {
        let mut csv = csv::ReaderBuilder::new()
            .has_headers(false)
            .flexible(true)
            .buffer_capacity(16)
            .from_reader(Lines::new(text));
        let mut record = csv::ByteRecord::new();
        let mut lines = Vec::new();
        while csv.read_byte_record(&mut record).unwrap() {
            let at = record.position().unwrap().byte();
            lines.push(csv.get_mut().record_line(at));
        }
        lines
    }

    // Expected lines counted by hand from the texts (as an editor numbers
    // them).
    #[test]
    fn every_kind_of_line_end_counts_once() {
        assert_eq!(record_lines(b"h\na\nb\n"), vec![1, 2, 3]);
        assert_eq!(record_lines(b"h\r\na\r\nb\r\n"), vec![1, 2, 3]);
        assert_eq!(record_lines(b"h\ra\rb\r"), vec![1, 2, 3]);
        assert_eq!(record_lines(b"h\r\na\rb\nc"), vec![1, 2, 3, 4]);
    }

    #[test]
    fn blank_lines_and_quoted_breaks_are_lines() {
        assert_eq!(record_lines(b"h\n\n\na\r\n\r\nb\n"), vec![1, 4, 6]);
        assert_eq!(record_lines(b"h\n\"x\r\ny\",1\nb\n"), vec![1, 2, 4]);
    }

    #[test]
    fn long_inputs_are_numbered_through_the_buffer() {
        let mut text = Vec::new();
        for i in 0..50_000 {
            text.extend_from_slice(if i % 3 == 0 { b"abc\r\n" } else { b"de\n" });
        }
        let lines = record_lines(&text);
        assert_eq!(lines.len(), 50_000);
        assert!(lines.iter().enumerate().all(|(i, l)| *l == i as u64 + 1));
    }
}
