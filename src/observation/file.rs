//! Observation files: one report per line, as received.
//!
//! An optional leading `METAR`/`SPECI` and trailing `=` are allowed; blank lines and `#`
//! comments are skipped; a line that starts with a space or tab continues the report
//! above it (unless that report already ended with `=`). [`ObservationFile`] remembers
//! how far it has read, so reading again after lines were appended yields only the new
//! reports. A writer should append whole reports: a continuation line appended in a
//! later write than its first line is read as a report of its own.

use std::borrow::Cow;
use std::fs::File;
use std::io::{self, Read, Seek, SeekFrom};
use std::path::{Path, PathBuf};

use chrono::{DateTime, NaiveDate, Utc};

use super::Report;
use super::metar::decode;

/// A decoded report and the line it started on (1-based).
#[derive(Debug, Clone)]
pub struct FileReport {
    /// Line of the file where the report starts.
    pub line: usize,
    /// The decoded report.
    pub report: Report,
}

/// Splits text into reports: `(first line number, report text)` pairs.
pub fn split_reports(text: &str) -> Vec<(usize, String)> {
    split_from(text, 1)
        .into_iter()
        .map(|(line, t)| (line, t.into_owned()))
        .collect()
}

/// Like [`split_reports`], borrowing single-line reports from `text`.
fn split_from(text: &str, first_line: usize) -> Vec<(usize, Cow<'_, str>)> {
    let mut out: Vec<(usize, Cow<'_, str>)> = Vec::new();
    let mut open = false;
    for (k, raw) in text.lines().enumerate() {
        let line = raw.strip_suffix('\r').unwrap_or(raw);
        let trimmed = line.trim();
        if trimmed.is_empty() || trimmed.starts_with('#') {
            open = false;
            continue;
        }
        let continues = line.starts_with([' ', '\t']);
        match out.last_mut() {
            Some((_, prev)) if continues && open => {
                let joined = prev.to_mut();
                joined.push(' ');
                joined.push_str(trimmed);
            }
            _ => out.push((first_line + k, Cow::Borrowed(trimmed))),
        }
        open = !trimmed.ends_with('=');
    }
    out
}

/// Decodes every report in `text`.
pub fn decode_all(text: &str, reference: DateTime<Utc>) -> Vec<FileReport> {
    split_from(text, 1)
        .into_iter()
        .map(|(line, t)| FileReport {
            line,
            report: decode(&t, reference),
        })
        .collect()
}

/// Reads and decodes every report in the file at `path`.
pub fn read_reports(path: &Path, reference: DateTime<Utc>) -> io::Result<Vec<FileReport>> {
    let mut f = ObservationFile::new(path);
    f.read_new(reference)
}

/// An observation file read incrementally.
#[derive(Debug, Clone)]
pub struct ObservationFile {
    path: PathBuf,
    /// Bytes consumed so far (up to the end of the last complete line).
    offset: u64,
    /// Lines consumed so far.
    lines: usize,
}

impl ObservationFile {
    /// A file not yet read.
    pub fn new(path: impl Into<PathBuf>) -> Self {
        Self {
            path: path.into(),
            offset: 0,
            lines: 0,
        }
    }

    /// A file whose text `read` has been read already (the operator folder's load): the
    /// next [`ObservationFile::read_new`] starts after its last complete line, so the
    /// reports loaded are not read, stored and listed a second time. An unterminated
    /// last line is read again (the store keeps one copy).
    pub fn read_already(path: impl Into<PathBuf>, read: &str) -> Self {
        let complete = read.rfind('\n').map_or(0, |p| p + 1);
        Self {
            path: path.into(),
            offset: complete as u64,
            lines: read[..complete].lines().count(),
        }
    }

    /// The file's path.
    pub fn path(&self) -> &Path {
        &self.path
    }

    /// Reads what was appended since the last call and decodes it. A last line without a
    /// newline is read too, but read again (and deduplicated by the store) if the writer
    /// was still writing it. A file that shrank is read again from the start.
    pub fn read_new(&mut self, reference: DateTime<Utc>) -> io::Result<Vec<FileReport>> {
        let mut f = File::open(&self.path)?;
        let len = f.metadata()?.len();
        if len < self.offset {
            self.offset = 0;
            self.lines = 0;
        }
        f.seek(SeekFrom::Start(self.offset))?;
        let mut bytes = Vec::new();
        f.read_to_end(&mut bytes)?;
        let text = String::from_utf8_lossy(&bytes);
        // Consume only complete lines; an unterminated tail is decoded but not consumed.
        let complete = text.rfind('\n').map_or(0, |p| p + 1);
        let (done, tail) = text.split_at(complete);
        let mut out: Vec<FileReport> = split_from(done, self.lines + 1)
            .into_iter()
            .map(|(line, t)| FileReport {
                line,
                report: decode(&t, reference),
            })
            .collect();
        let done_lines = done.lines().count();
        for (line, t) in split_from(tail, self.lines + done_lines + 1) {
            out.push(FileReport {
                line,
                report: decode(&t, reference),
            });
        }
        // Byte count of `done` in the original bytes: lossy decoding may change lengths,
        // so count the raw bytes up to the last newline instead.
        let consumed = bytes.iter().rposition(|b| *b == b'\n').map_or(0, |p| p + 1);
        self.offset += consumed as u64;
        self.lines += done_lines;
        Ok(out)
    }
}

/// Noon UTC on the date a day file is named for (`…/2026-06-14.txt`), if it is so named:
/// the reference its reports' day-of-month is read against, so a file for another day
/// never takes today's month.
pub fn day_of_file(path: impl AsRef<Path>) -> Option<DateTime<Utc>> {
    let stem = path.as_ref().file_stem()?.to_str()?;
    NaiveDate::parse_from_str(stem, "%Y-%m-%d")
        .ok()?
        .and_hms_opt(12, 0, 0)
        .map(|t| t.and_utc())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn splits_comments_blanks_prefixes_and_wrapped_lines() {
        let text = "# day file\n\nMETAR XQAB 141250Z 27012KT 9999\n   FEW040 21/09 Q1015=\nSPECI XQAB 141310Z 27020G30KT 3000 TSRA=\n  XHA1 141250Z 00000KT CAVOK 20/10 Q1020\r\n";
        let r = split_reports(text);
        assert_eq!(
            r,
            vec![
                (
                    3,
                    "METAR XQAB 141250Z 27012KT 9999 FEW040 21/09 Q1015=".to_string()
                ),
                (5, "SPECI XQAB 141310Z 27020G30KT 3000 TSRA=".to_string()),
                (6, "XHA1 141250Z 00000KT CAVOK 20/10 Q1020".to_string()),
            ]
        );
    }
}
