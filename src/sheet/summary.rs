//! The summary of a sheet: rows read, ok, warning and error, and the most
//! common messages with their counts and first lines.

use super::plan::Plan;
use super::row::{Scratch, Status};
use std::collections::HashMap;
use std::fmt;

/// Distinct messages counted one by one; the rest are counted together.
const MAX_KINDS: usize = 1000;
/// Lines remembered per message.
const MAX_LINES: usize = 5;
/// Messages shown by the summary's text.
const SHOWN: usize = 10;

/// One kind of message, counted.
#[derive(Debug, Clone, PartialEq, Eq)]
#[non_exhaustive]
pub struct MessageCount {
    /// The message without the row's values, for example
    /// "column `pH (NBS)`: not a number".
    pub message: String,
    /// Rows with it.
    pub count: u64,
    /// The first lines of the input with it (at most five).
    pub lines: Vec<u64>,
    /// Whether it is an error (the row was not computed) or a warning.
    pub error: bool,
    /// Whether it is only a note (an optional input not given; the rows
    /// stay `ok`).
    pub note: bool,
}

/// What a sheet run did.
///
/// # Example
/// ```
/// use travertine::sheet::{process, SheetOptions};
/// let input = "site,temperature_c,salinity,alkalinity_umol_kg,ph_total\n\
///              a,25,35,2300,8.0\n\
///              b,25,35,2300,abc\n";
/// let mut out = Vec::new();
/// let summary = process(&SheetOptions::default(), input.as_bytes(), &mut out)?;
/// assert_eq!((summary.rows, summary.ok, summary.error), (2, 1, 1));
/// assert_eq!(summary.messages[0].message, "column `ph_total`: not a number");
/// assert_eq!(summary.messages[0].lines, vec![3]);
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
#[derive(Debug, Clone, Default, PartialEq, Eq)]
#[non_exhaustive]
pub struct Summary {
    /// Data rows read (and written).
    pub rows: u64,
    /// Rows computed without a caution.
    pub ok: u64,
    /// Rows computed with a caution.
    pub warning: u64,
    /// Rows that could not be computed.
    pub error: u64,
    /// Messages, the most common first.
    pub messages: Vec<MessageCount>,
    /// Headers passed through without being read.
    pub passed_through: Vec<String>,
    /// Notes on header units read only approximately as written, such as
    /// `ppm` read as mg/L or `ppt` read as practical salinity.
    pub unit_notes: Vec<String>,
    // issue 11: quality flags
    /// The profile of the `flags` column, where the sheet writes one.
    pub profile: Option<String>,
    /// Each quality flag raised, with the number of rows that raised it, in
    /// the order the flags are listed (see [`mod@crate::decisions::flags`]).
    pub flags: Vec<(&'static str, u64)>,
}

#[derive(Debug, Default)]
struct Entry {
    count: u64,
    lines: Vec<u64>,
    error: bool,
    /// Some row had it as a warning (not an error, not a note).
    warned: bool,
    order: usize,
}

/// Counts, merged from the parts of a sheet.
#[derive(Debug, Default)]
pub(crate) struct Tally {
    rows: u64,
    ok: u64,
    warning: u64,
    error: u64,
    kinds: HashMap<String, Entry>,
    other: Entry,
    /// Rows raising each flag code (issue 11).
    flags: Vec<(&'static str, u64)>,
}

impl Tally {
    /// Counts one row.
    pub(crate) fn add(&mut self, s: &Scratch, line: u64) {
        self.rows += 1;
        match s.status {
            Status::Ok => self.ok += 1,
            Status::Warning => self.warning += 1,
            Status::Error => self.error += 1,
        }
        let mut seen: Vec<&'static str> = Vec::new();
        for code in &s.flags {
            // A code raised twice on one row (two plausibility checks) counts once.
            if !seen.contains(code) {
                seen.push(code);
                self.count_flag(code, 1);
            }
        }
        for issue in &s.issues {
            let warned = !issue.error && !issue.note;
            self.count(
                &issue.key,
                1,
                std::slice::from_ref(&line),
                issue.error,
                warned,
            );
        }
    }

    fn count_flag(&mut self, code: &'static str, n: u64) {
        match self.flags.iter_mut().find(|(c, _)| *c == code) {
            Some((_, count)) => *count += n,
            None => self.flags.push((code, n)),
        }
    }

    fn count(&mut self, key: &str, n: u64, lines: &[u64], error: bool, warned: bool) {
        let order = self.kinds.len();
        let entry = if self.kinds.contains_key(key) || order < MAX_KINDS {
            self.kinds.entry(key.to_string()).or_insert(Entry {
                order,
                ..Entry::default()
            })
        } else {
            &mut self.other
        };
        entry.count += n;
        entry.error |= error;
        entry.warned |= warned;
        for l in lines {
            if entry.lines.len() < MAX_LINES {
                entry.lines.push(*l);
            }
        }
    }

    /// Adds the counts of a later part.
    pub(crate) fn merge(&mut self, other: Tally) {
        self.rows += other.rows;
        self.ok += other.ok;
        self.warning += other.warning;
        self.error += other.error;
        let mut kinds: Vec<(String, Entry)> = other.kinds.into_iter().collect();
        kinds.sort_by_key(|(_, e)| e.order);
        for (k, e) in kinds {
            self.count(&k, e.count, &e.lines, e.error, e.warned);
        }
        for (code, n) in other.flags {
            self.count_flag(code, n);
        }
        if other.other.count > 0 {
            let o = other.other;
            self.other.count += o.count;
            self.other.error |= o.error;
            self.other.warned |= o.warned;
        }
    }

    /// The summary.
    pub(crate) fn summary(self, plan: &Plan) -> Summary {
        let mut kinds: Vec<(String, Entry)> = self.kinds.into_iter().collect();
        kinds.sort_by(|a, b| b.1.count.cmp(&a.1.count).then(a.1.order.cmp(&b.1.order)));
        let mut messages: Vec<MessageCount> = kinds
            .into_iter()
            .map(|(message, e)| MessageCount {
                message,
                count: e.count,
                lines: e.lines,
                error: e.error,
                note: !e.error && !e.warned,
            })
            .collect();
        if self.other.count > 0 {
            messages.push(MessageCount {
                message: "other messages".into(),
                count: self.other.count,
                lines: self.other.lines,
                error: self.other.error,
                note: !self.other.error && !self.other.warned,
            });
        }
        Summary {
            rows: self.rows,
            ok: self.ok,
            warning: self.warning,
            error: self.error,
            messages,
            passed_through: plan.passed.clone(),
            unit_notes: plan.unit_notes.clone(),
            profile: plan.flags.as_ref().map(|p| p.name().to_string()),
            flags: {
                // In the order of the flags' codes.
                let order = crate::decisions::Profile::flag_codes();
                let mut flags = self.flags;
                flags.sort_by_key(|(c, _)| order.iter().position(|o| o == c));
                flags
            },
        }
    }
}

impl fmt::Display for Summary {
    /// The text printed on stderr at the end of a run.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        writeln!(
            f,
            "rows read: {}; ok: {}; warning: {}; error: {}",
            self.rows, self.ok, self.warning, self.error
        )?;
        if self.rows == 0 {
            writeln!(f, "the sheet has a header but no data rows")?;
        }
        if !self.passed_through.is_empty() {
            let names: Vec<String> = self
                .passed_through
                .iter()
                .map(|h| format!("`{h}`"))
                .collect();
            writeln!(f, "passed through unread: {}", names.join(", "))?;
        }
        for n in &self.unit_notes {
            writeln!(f, "note: {n}")?;
        }
        if let Some(profile) = &self.profile {
            let raised: Vec<String> = self
                .flags
                .iter()
                .map(|(code, n)| format!("{code} {n} {}", if *n == 1 { "row" } else { "rows" }))
                .collect();
            writeln!(
                f,
                "flags (profile {profile}): {}",
                if raised.is_empty() {
                    "none raised".to_string()
                } else {
                    raised.join(", ")
                }
            )?;
        }
        if !self.messages.is_empty() {
            writeln!(f, "most common messages:")?;
            let width = self.messages[0].count.to_string().len();
            for m in self.messages.iter().take(SHOWN) {
                let lines: Vec<String> = m.lines.iter().map(u64::to_string).collect();
                let more = if m.count > m.lines.len() as u64 {
                    ", ..."
                } else {
                    ""
                };
                let word = if m.lines.len() == 1 { "line" } else { "lines" };
                writeln!(
                    f,
                    "  {:>width$}  {} {} ({word} {}{more})",
                    m.count,
                    if m.error {
                        "error:"
                    } else if m.note {
                        "note:"
                    } else {
                        "warning:"
                    },
                    m.message,
                    lines.join(", ")
                )?;
            }
            if self.messages.len() > SHOWN {
                writeln!(f, "  ... and {} more kinds", self.messages.len() - SHOWN)?;
            }
        }
        Ok(())
    }
}
