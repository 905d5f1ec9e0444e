//! The sign-off log: append-only JSON lines in `signoffs/YYYY-MM.jsonl`, one chain
//! across the monthly files. Each line is a [`Record`] followed by its own SHA-256
//! (`…,"sha256":"<hex>"}`, the hash of the line's JSON without that field), and each
//! record carries its sequence number and the hash of the record before it.
//!
//! Durability: an append takes an exclusive advisory lock on `signoffs/.lock`
//! (`std::fs::File::lock`, `flock` on Unix), sets aside a torn last line into
//! `<file>.torn`, refuses to extend a chain that does not verify, writes the whole line
//! with one `write` on a file opened for append, then `fsync`s the file — and the
//! folder when a file or folder was created — before it reports success.

use std::fs::{File, OpenOptions};
use std::io::{Read as _, Write as _};
use std::path::{Path, PathBuf};
use std::time::Duration;

use chrono::NaiveDate;

use super::{GENESIS_SHA256, Kind, Record, Refusal, sha256_hex};

/// Why the log could not be read or written.
#[derive(Debug, thiserror::Error)]
pub enum LogError {
    /// A file-system operation failed.
    #[error("{what} {path}: {source}")]
    Io {
        /// What was being done.
        what: &'static str,
        /// The path.
        path: PathBuf,
        /// The cause.
        source: std::io::Error,
    },
    /// The write was shorter than the line (the rest is a torn line, set aside next time).
    #[error("{path}: wrote {written} of {len} bytes; the record is not in the log")]
    ShortWrite {
        /// The file.
        path: PathBuf,
        /// Bytes written.
        written: usize,
        /// Bytes of the line.
        len: usize,
    },
    /// The record was refused (nothing was written).
    #[error(transparent)]
    Refused(#[from] Refusal),
    /// A record could not be serialised (a bug).
    #[error("serialising the record: {0}")]
    Json(#[from] serde_json::Error),
}

/// The largest monthly file read: far beyond any school's month of sign-offs.
const MAX_LOG_FILE_BYTES: u64 = 256 * 1024 * 1024;

/// Reads a monthly file whole: a regular file of bounded size only (a device, a pipe or
/// a runaway file is an error, never an endless read).
fn read_log_file(path: &Path) -> Result<Vec<u8>, LogError> {
    let f = File::open(path).map_err(io("reading", path))?;
    let meta = f.metadata().map_err(io("reading", path))?;
    let refuse = |why: String| LogError::Io {
        what: "reading",
        path: path.to_path_buf(),
        source: std::io::Error::new(std::io::ErrorKind::InvalidData, why),
    };
    if !meta.is_file() {
        return Err(refuse("not a regular file".to_string()));
    }
    if meta.len() > MAX_LOG_FILE_BYTES {
        return Err(refuse(format!(
            "{} MB, more than a monthly log can hold ({} MB)",
            meta.len() / 1_000_000,
            MAX_LOG_FILE_BYTES / 1_000_000
        )));
    }
    let mut bytes = Vec::with_capacity(meta.len() as usize);
    f.take(MAX_LOG_FILE_BYTES + 1)
        .read_to_end(&mut bytes)
        .map_err(io("reading", path))?;
    Ok(bytes)
}

fn io<'p>(what: &'static str, path: &'p Path) -> impl FnOnce(std::io::Error) -> LogError + 'p {
    move |source| LogError::Io {
        what,
        path: path.to_path_buf(),
        source,
    }
}

/// One record as found in the log.
#[derive(Debug, Clone, PartialEq)]
pub struct Entry {
    /// The monthly file, e.g. `2026-06.jsonl`.
    pub file: String,
    /// Line number in it, from 1.
    pub line: usize,
    /// The record's own SHA-256, as the line carries it.
    pub sha256: String,
    /// The record.
    pub record: Record,
}

/// The chain's last record: what a briefing sheet prints and `log verify --head` takes.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Head {
    /// Sequence number.
    pub seq: u64,
    /// SHA-256 (a given head may carry only a prefix of at least 8 hex digits).
    pub sha256: String,
}

impl std::fmt::Display for Head {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}:{}", self.seq, self.sha256)
    }
}

impl std::str::FromStr for Head {
    type Err = String;

    fn from_str(s: &str) -> Result<Self, Self::Err> {
        let (seq, hash) = s
            .split_once(':')
            .ok_or_else(|| format!("head '{s}': expected SEQ:HASH, e.g. 12:3f9a0c…"))?;
        let seq: u64 = seq
            .trim()
            .parse()
            .map_err(|_| format!("head '{s}': sequence '{seq}' is not a whole number"))?;
        let hash = hash.trim().to_ascii_lowercase();
        if hash.len() < 8 || hash.len() > 64 || !hash.bytes().all(|b| b.is_ascii_hexdigit()) {
            return Err(format!(
                "head '{s}': hash '{hash}' must be 8 to 64 hex digits (as printed on the sheet)"
            ));
        }
        Ok(Head { seq, sha256: hash })
    }
}

/// A last line without its end of line: a write that did not finish.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Torn {
    /// The file.
    pub file: String,
    /// Its line number.
    pub line: usize,
    /// Its length, bytes.
    pub bytes: usize,
    /// Where it starts in the file.
    pub offset: u64,
}

impl std::fmt::Display for Torn {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "{} line {}: torn last line ({} bytes without an end of line: a write that did not finish, never reported as signed); the next sign-off sets it aside into {}.torn",
            self.file, self.line, self.bytes, self.file
        )
    }
}

/// Something wrong with the log, naming the file and line.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Problem {
    /// The file (relative to `signoffs/`).
    pub file: String,
    /// The line, where one is to blame.
    pub line: Option<usize>,
    /// What is wrong.
    pub message: String,
}

impl std::fmt::Display for Problem {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self.line {
            Some(l) => write!(f, "{} line {l}: {}", self.file, self.message),
            None => write!(f, "{}: {}", self.file, self.message),
        }
    }
}

/// The log as read: its records in order and everything wrong with it.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Chain {
    /// The monthly files, in order.
    pub files: Vec<String>,
    /// Every record that could be read, in file and line order.
    pub entries: Vec<Entry>,
    /// Breaks in the chain.
    pub problems: Vec<Problem>,
    /// A torn last line.
    pub torn: Option<Torn>,
    /// `.torn` files holding lines set aside earlier.
    pub set_aside: Vec<String>,
}

impl Chain {
    /// The last record, if any.
    pub fn head(&self) -> Option<Head> {
        self.entries.last().map(|e| Head {
            seq: e.record.seq,
            sha256: e.sha256.clone(),
        })
    }

    /// Sound: no problem and no torn line.
    pub fn is_sound(&self) -> bool {
        self.problems.is_empty() && self.torn.is_none()
    }

    /// The sign-off in force for a leg: its latest sign-off, unless revoked since.
    pub fn in_force(&self, leg: &str, date: NaiveDate) -> Option<&Entry> {
        let mut current: Option<&Entry> = None;
        for e in &self.entries {
            if e.record.leg != leg || e.record.leg_date != date {
                continue;
            }
            match e.record.kind {
                Kind::SignOff => current = Some(e),
                Kind::Revocation => {
                    if current.is_some_and(|c| Some(c.record.seq) == e.record.revokes_seq) {
                        current = None;
                    }
                }
            }
        }
        current
    }

    /// Compares the chain with a head printed earlier (a sheet, the board). A hash that
    /// matches no record is said so plainly — a typo and a rewritten log look alike
    /// from here — and a hash that belongs to another record names that record.
    pub fn check_head(&self, given: &Head) -> Option<Problem> {
        let last = self.entries.last();
        let (file, line) = last.map_or(("(log)".to_string(), None), |e| {
            (e.file.clone(), Some(e.line))
        });
        let owner = self
            .entries
            .iter()
            .find(|e| e.sha256.starts_with(&given.sha256));
        let no_match = format!(
            "the given head {given} does not match any record (mistyped, or the log was rewritten since that head was printed)"
        );
        match self.entries.iter().find(|e| e.record.seq == given.seq) {
            Some(e) if e.sha256.starts_with(&given.sha256) => None,
            Some(e) => Some(Problem {
                file: e.file.clone(),
                line: Some(e.line),
                message: match owner {
                    Some(o) => format!(
                        "the given head {given} does not match record {}: its hash is that of record {} at {} line {} (is the sequence number mistyped?)",
                        e.record.seq, o.record.seq, o.file, o.line
                    ),
                    None => format!(
                        "{no_match}: record {} has sha256 {}",
                        e.record.seq, e.sha256
                    ),
                },
            }),
            None => Some(Problem {
                file,
                line,
                message: match (last, owner) {
                    (_, Some(o)) => format!(
                        "the given head {given} names record {}, which the log does not hold; its hash is that of record {} at {} line {} (is the sequence number mistyped?)",
                        given.seq, o.record.seq, o.file, o.line
                    ),
                    (Some(e), None) if e.record.seq < given.seq => format!(
                        "the log ends at record {}, but the given head is record {}: {} from the end, or the head is mistyped",
                        e.record.seq,
                        given.seq,
                        if e.record.seq + 1 == given.seq {
                            format!("record {} is missing", given.seq)
                        } else {
                            format!("records {}–{} are missing", e.record.seq + 1, given.seq)
                        }
                    ),
                    (Some(_), None) => format!("{no_match}: no record {} in the log", given.seq),
                    (None, None) => format!(
                        "the log is empty, but the given head is record {}",
                        given.seq
                    ),
                },
            }),
        }
    }
}

/// Splits a line into its record JSON (without the hash) and the hash it carries.
fn split_line(line: &[u8]) -> Option<(Vec<u8>, String)> {
    const KEY: &[u8] = b",\"sha256\":\"";
    let n = line.len();
    if n < KEY.len() + 64 + 2 || &line[n - 2..] != b"\"}" {
        return None;
    }
    let hex = &line[n - 66..n - 2];
    if &line[n - 66 - KEY.len()..n - 66] != KEY || !hex.iter().all(|b| b.is_ascii_hexdigit()) {
        return None;
    }
    let mut body = line[..n - 66 - KEY.len()].to_vec();
    body.push(b'}');
    Some((body, String::from_utf8_lossy(hex).into_owned()))
}

/// The log line (with its end of line) for a record whose seq and prev are set.
pub fn line_of(record: &Record) -> Result<(Vec<u8>, String), serde_json::Error> {
    let body = serde_json::to_string(record)?;
    let hash = sha256_hex(body.as_bytes());
    let mut line = body.into_bytes();
    line.pop();
    line.extend_from_slice(b",\"sha256\":\"");
    line.extend_from_slice(hash.as_bytes());
    line.extend_from_slice(b"\"}\n");
    Ok((line, hash))
}

fn month_of(file: &str) -> Option<(i32, u32)> {
    let stem = file.strip_suffix(".jsonl")?;
    let (y, m) = stem.split_once('-')?;
    if y.len() != 4 || m.len() != 2 {
        return None;
    }
    let (y, m): (i32, u32) = (y.parse().ok()?, m.parse().ok()?);
    (1..=12).contains(&m).then_some((y, m))
}

fn months_between(a: (i32, u32), b: (i32, u32)) -> Vec<String> {
    let mut out = Vec::new();
    let (mut y, mut m) = a;
    loop {
        m += 1;
        if m > 12 {
            m = 1;
            y += 1;
        }
        if (y, m) >= b || out.len() > 1200 {
            break;
        }
        out.push(format!("{y:04}-{m:02}.jsonl"));
    }
    out
}

/// The operator's sign-off log, in its `signoffs/` folder.
#[derive(Debug, Clone)]
pub struct Log {
    dir: PathBuf,
}

/// Options for [`Log::append`].
#[derive(Debug, Clone, Default)]
pub struct AppendOptions {
    /// Test hook: write the line in two halves with this pause between them, so a
    /// crash test can kill a writer mid-line (`RHOBOARD_TEST_SPLIT_WRITE_MS`).
    pub split_write_pause: Option<Duration>,
}

/// What an append did.
#[derive(Debug, Clone, PartialEq)]
pub struct Appended {
    /// The record as written.
    pub entry: Entry,
    /// A torn last line found and set aside before writing.
    pub set_aside: Option<Torn>,
}

/// Makes a new entry in a folder durable: `fsync` of the folder on Unix; other platforms
/// have no such call on a folder, and this is a no-op there.
fn sync_dir(dir: &Path) -> Result<(), LogError> {
    #[cfg(unix)]
    {
        File::open(dir)
            .and_then(|d| d.sync_all())
            .map_err(io("syncing folder", dir))
    }
    #[cfg(not(unix))]
    {
        let _ = dir;
        Ok(())
    }
}

impl Log {
    /// The log in the folder `dir` (the operator folder's `signoffs/`).
    pub fn new(dir: impl Into<PathBuf>) -> Log {
        Log { dir: dir.into() }
    }

    /// The log of an operator folder.
    pub fn of_operator(ops_dir: &Path) -> Log {
        Log::new(ops_dir.join("signoffs"))
    }

    /// Its folder.
    pub fn dir(&self) -> &Path {
        &self.dir
    }

    /// Reads and checks the chain, read-only (under a shared lock when one exists).
    pub fn read(&self) -> Result<Chain, LogError> {
        let lock_path = self.dir.join(".lock");
        let _lock = match File::open(&lock_path) {
            Ok(f) => {
                f.lock_shared().map_err(io("locking", &lock_path))?;
                Some(f)
            }
            Err(_) => None,
        };
        self.read_unlocked()
    }

    fn read_unlocked(&self) -> Result<Chain, LogError> {
        let mut chain = Chain::default();
        let entries = match std::fs::read_dir(&self.dir) {
            Ok(e) => e,
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => return Ok(chain),
            Err(e) => return Err(io("reading folder", &self.dir)(e)),
        };
        let mut names: Vec<String> = entries
            .filter_map(|e| e.ok())
            .map(|e| e.file_name().to_string_lossy().into_owned())
            .collect();
        names.sort();
        for n in &names {
            if month_of(n).is_some() {
                chain.files.push(n.clone());
            } else if n.ends_with(".jsonl.torn") {
                chain.set_aside.push(n.clone());
            } else if n.ends_with(".jsonl") {
                chain.problems.push(Problem {
                    file: n.clone(),
                    line: None,
                    message: "not a monthly file name (expected YYYY-MM.jsonl); its records are not part of the chain".to_string(),
                });
            }
        }
        let last_file = chain.files.len().saturating_sub(1);
        let files = chain.files.clone();
        for (fi, file) in files.iter().enumerate() {
            let path = self.dir.join(file);
            let bytes = read_log_file(&path)?;
            let mut offset = 0usize;
            let mut line_no = 0usize;
            while offset < bytes.len() {
                line_no += 1;
                let rest = &bytes[offset..];
                let Some(nl) = rest.iter().position(|&b| b == b'\n') else {
                    let torn = Torn {
                        file: file.clone(),
                        line: line_no,
                        bytes: rest.len(),
                        offset: offset as u64,
                    };
                    if fi == last_file {
                        chain.torn = Some(torn);
                    } else {
                        chain.problems.push(Problem {
                            file: file.clone(),
                            line: Some(line_no),
                            message: format!(
                                "line without an end of line ({} bytes) in a monthly file that is not the last: the file was cut",
                                rest.len()
                            ),
                        });
                    }
                    break;
                };
                let line = &rest[..nl];
                offset += nl + 1;
                let problem = |message: String| Problem {
                    file: file.clone(),
                    line: Some(line_no),
                    message,
                };
                if line.is_empty() {
                    chain.problems.push(problem("empty line".to_string()));
                    continue;
                }
                let Some((body, sha256)) = split_line(line) else {
                    chain.problems.push(problem(
                        "not a sign-off record line (it must end with its \"sha256\")".to_string(),
                    ));
                    continue;
                };
                let edited = sha256_hex(&body) != sha256;
                match serde_json::from_slice::<Record>(&body) {
                    Ok(record) => {
                        if edited {
                            chain.problems.push(problem(format!(
                                "record {} was edited: its content no longer matches its sha256",
                                record.seq
                            )));
                        }
                        chain.entries.push(Entry {
                            file: file.clone(),
                            line: line_no,
                            sha256,
                            record,
                        });
                    }
                    Err(e) => chain.problems.push(problem(if edited {
                        format!("edited: its content no longer matches its sha256 and is not a record ({e})")
                    } else {
                        format!("not a record this build reads ({e})")
                    })),
                }
            }
        }
        let links = link_problems(&chain.entries);
        chain.problems.extend(links);
        Ok(chain)
    }

    /// Appends a record: under the lock, sets aside a torn last line, refuses a broken
    /// chain, lets `finish` complete the record against the chain (supersession,
    /// revocation, or a refusal), numbers and links it, writes it in one `write`,
    /// `fsync`s, and only then returns.
    pub fn append(
        &self,
        record: Record,
        opts: &AppendOptions,
        finish: impl FnOnce(&Chain, Record) -> Result<Record, Refusal>,
    ) -> Result<Appended, LogError> {
        self.create_dir()?;
        let lock_path = self.dir.join(".lock");
        let lock = OpenOptions::new()
            .create(true)
            .truncate(false)
            .write(true)
            .open(&lock_path)
            .map_err(io("opening", &lock_path))?;
        lock.lock().map_err(io("locking", &lock_path))?;
        let mut chain = self.read_unlocked()?;
        // A broken chain is left exactly as found (torn tail included) for `log verify`.
        if let Some(p) = chain.problems.first() {
            return Err(Refusal::LogBroken(p.to_string()).into());
        }
        let set_aside = match chain.torn.take() {
            Some(t) => {
                self.set_aside(&t)?;
                Some(t)
            }
            None => None,
        };
        let mut record = finish(&chain, record)?;
        let last = chain.entries.last();
        record.seq = last.map_or(1, |e| e.record.seq + 1);
        record.prev_sha256 = last.map_or(GENESIS_SHA256.to_string(), |e| e.sha256.clone());
        let (line, sha256) = line_of(&record)?;
        // Never write into a month before the chain's last file, so file order stays
        // chain order even if the clock steps back.
        let mut file = record.signed_at.format("%Y-%m.jsonl").to_string();
        if let Some(l) = chain.files.last()
            && *l > file
        {
            file = l.clone();
        }
        let path = self.dir.join(&file);
        let created = !path.exists();
        let mut f = OpenOptions::new()
            .append(true)
            .create(true)
            .open(&path)
            .map_err(io("opening", &path))?;
        let written = match opts.split_write_pause {
            None => f.write(&line).map_err(io("writing", &path))?,
            Some(pause) => {
                let half = line.len() / 2;
                let a = f.write(&line[..half]).map_err(io("writing", &path))?;
                std::thread::sleep(pause);
                a + f.write(&line[half..]).map_err(io("writing", &path))?
            }
        };
        if written != line.len() {
            return Err(LogError::ShortWrite {
                path,
                written,
                len: line.len(),
            });
        }
        f.sync_all().map_err(io("syncing", &path))?;
        if created {
            sync_dir(&self.dir)?;
        }
        drop(lock);
        let line_no = chain
            .entries
            .iter()
            .filter(|e| e.file == file)
            .map(|e| e.line)
            .max()
            .unwrap_or(0)
            + 1;
        Ok(Appended {
            entry: Entry {
                file,
                line: line_no,
                sha256,
                record,
            },
            set_aside,
        })
    }

    fn create_dir(&self) -> Result<(), LogError> {
        if self.dir.is_dir() {
            return Ok(());
        }
        let mut missing = Vec::new();
        let mut p = self.dir.as_path();
        while !p.exists() {
            missing.push(p.to_path_buf());
            match p.parent() {
                Some(parent) if !parent.as_os_str().is_empty() => p = parent,
                _ => break,
            }
        }
        std::fs::create_dir_all(&self.dir).map_err(io("creating folder", &self.dir))?;
        for m in missing.iter().rev() {
            if let Some(parent) = m.parent().filter(|p| !p.as_os_str().is_empty()) {
                sync_dir(parent)?;
            }
        }
        Ok(())
    }

    /// Moves a torn last line into `<file>.torn` and cuts it from the monthly file.
    fn set_aside(&self, t: &Torn) -> Result<(), LogError> {
        let path = self.dir.join(&t.file);
        let bytes = read_log_file(&path)?;
        let start = (t.offset as usize).min(bytes.len());
        let mut torn = bytes[start..].to_vec();
        torn.push(b'\n');
        let aside = self.dir.join(format!("{}.torn", t.file));
        let created = !aside.exists();
        let mut f = OpenOptions::new()
            .append(true)
            .create(true)
            .open(&aside)
            .map_err(io("opening", &aside))?;
        f.write_all(&torn).map_err(io("writing", &aside))?;
        f.sync_all().map_err(io("syncing", &aside))?;
        if created {
            sync_dir(&self.dir)?;
        }
        let f = OpenOptions::new()
            .write(true)
            .open(&path)
            .map_err(io("opening", &path))?;
        f.set_len(t.offset)
            .map_err(io("cutting the torn line from", &path))?;
        f.sync_all().map_err(io("syncing", &path))
    }
}

/// The breaks in the links between records: sequence gaps, reordering, insertion, a
/// missing monthly file, a `prev_sha256` that does not match.
fn link_problems(entries: &[Entry]) -> Vec<Problem> {
    let mut out = Vec::new();
    let mut expected = 1u64;
    let mut prev = GENESIS_SHA256.to_string();
    let mut prev_at: Option<&Entry> = None;
    let mut i = 0;
    while i < entries.len() {
        let e = &entries[i];
        let seq = e.record.seq;
        let here = |message: String| Problem {
            file: e.file.clone(),
            line: Some(e.line),
            message,
        };
        if seq != expected {
            let next = entries.get(i + 1);
            if seq == expected + 1 && next.is_some_and(|n| n.record.seq == expected) {
                let n = next.map_or(0, |n| n.line);
                out.push(here(format!(
                    "records {} and {} are out of order (lines {} and {} swapped)",
                    seq, expected, e.line, n
                )));
                // Both are accounted for; carry on after them.
                expected += 2;
                prev = e.sha256.clone();
                prev_at = Some(e);
                i += 2;
                continue;
            }
            let first_of_file = prev_at.is_none_or(|p| p.file != e.file);
            let message = if seq > expected {
                let gap = if expected + 1 == seq {
                    format!("record {expected} is")
                } else {
                    format!("records {expected}–{} are", seq - 1)
                };
                match (first_of_file, prev_at) {
                    (true, None) => format!(
                        "the chain starts at record {seq}: {gap} missing (an earlier monthly file, or the first lines of this one, removed)"
                    ),
                    (true, Some(p)) => {
                        let lost = match (month_of(&p.file), month_of(&e.file)) {
                            (Some(a), Some(b)) => months_between(a, b),
                            _ => Vec::new(),
                        };
                        if lost.is_empty() {
                            format!(
                                "{gap} missing between {} line {} and here (lines removed at the end of {} or the start of {})",
                                p.file, p.line, p.file, e.file
                            )
                        } else {
                            format!(
                                "{gap} missing: monthly file {} missing (the chain jumps from {} to {})",
                                lost.join(", "),
                                p.file,
                                e.file
                            )
                        }
                    }
                    (false, _) => format!("{gap} missing before this line (deleted)"),
                }
            } else {
                format!(
                    "record {seq} where record {expected} was expected: a record repeated, inserted or out of order"
                )
            };
            out.push(here(message));
        } else if e.record.prev_sha256 != prev {
            out.push(here(match prev_at {
                Some(p) => format!(
                    "record {seq}'s prev_sha256 does not match record {} at {} line {}: a record was inserted, removed or rewritten here",
                    p.record.seq, p.file, p.line
                ),
                None => format!(
                    "record {seq} is first but its prev_sha256 is not the genesis value: records before it were removed"
                ),
            }));
        }
        expected = seq + 1;
        prev = e.sha256.clone();
        prev_at = Some(e);
        i += 1;
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_line_carries_the_hash_of_its_own_json() {
        let body = br#"{"seq":1,"leg":"L01"}"#;
        let mut line = body[..body.len() - 1].to_vec();
        let hash = sha256_hex(body);
        line.extend_from_slice(format!(",\"sha256\":\"{hash}\"}}").as_bytes());
        let (back, h) = split_line(&line).expect("splits");
        assert_eq!((back.as_slice(), h.as_str()), (&body[..], hash.as_str()));
        // A line without the trailing hash is not a record line.
        assert!(split_line(body).is_none());
        assert!(split_line(&line[..line.len() - 1]).is_none());
    }

    #[test]
    fn heads_parse_and_say_what_is_wrong() {
        let h: Head = "12:3F9A0C11".parse().expect("head");
        assert_eq!(h.to_string(), "12:3f9a0c11");
        insta::assert_snapshot!("seven".parse::<Head>().unwrap_err(), @"head 'seven': expected SEQ:HASH, e.g. 12:3f9a0c…");
        insta::assert_snapshot!("x:3f9a0c11".parse::<Head>().unwrap_err(), @"head 'x:3f9a0c11': sequence 'x' is not a whole number");
        insta::assert_snapshot!("3:3f9a".parse::<Head>().unwrap_err(), @"head '3:3f9a': hash '3f9a' must be 8 to 64 hex digits (as printed on the sheet)");
    }

    #[test]
    fn months_between_names_the_missing_files() {
        assert_eq!(
            months_between((2026, 11), (2027, 2)),
            ["2026-12.jsonl", "2027-01.jsonl"]
        );
        assert!(months_between((2026, 6), (2026, 7)).is_empty());
        assert_eq!(month_of("2026-06.jsonl"), Some((2026, 6)));
        assert_eq!(month_of("2026-13.jsonl"), None);
        assert_eq!(month_of("june.jsonl"), None);
    }
}
