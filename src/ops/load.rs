//! Reading an operator folder (or the built-in demo) into [`Ops`], collecting every
//! problem as a [`Diagnostic`] with file, field path, line and column.

use std::collections::{BTreeMap, HashMap};
use std::fmt;
use std::path::Path;

use serde::de::DeserializeOwned;

use super::Ops;
use super::actype::{AircraftType, AircraftTypeFile, Performance};
use super::airfield::Airfield;
use super::fleet::AircraftFile;
use super::legs::LegsFile;
use super::operator::OperatorFile;
use super::pilots::PilotsFile;
use super::spans::Spans;

/// The file format version this build reads.
pub const SCHEMA_VERSION: u32 = 1;

/// Problems listed per file; past this a file gets one "… and N more" line.
pub const MAX_PER_FILE: usize = 200;

/// Largest file read, bytes; anything bigger is refused with a message.
pub const MAX_FILE_BYTES: u64 = 256 * 1024 * 1024;

/// Error or warning.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Severity {
    /// The data cannot be used as it is.
    Error,
    /// Worth a look; the data can be used.
    Warning,
}

/// One problem found in the operator's data.
#[derive(Debug, Clone, PartialEq, Eq, Hash, serde::Serialize)]
pub struct Diagnostic {
    /// Error or warning.
    pub severity: Severity,
    /// File, relative to the operator folder, with `/` separators.
    pub file: String,
    /// Field path inside the file (`runway_ends[1].tora_m`); empty for the whole file.
    pub path: String,
    /// 1-based line.
    pub line: usize,
    /// 1-based column.
    pub column: usize,
    /// What is wrong and how to fix it.
    pub message: String,
}

impl fmt::Display for Diagnostic {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}:{}:{}", self.file, self.line, self.column)?;
        if !self.path.is_empty() {
            write!(f, ": {}", self.path)?;
        }
        write!(f, ": {}", self.message)
    }
}

/// Every problem found, errors and warnings apart.
#[derive(Debug, Clone, Default, PartialEq, Eq, serde::Serialize)]
pub struct Report {
    /// Errors, in file order.
    pub errors: Vec<Diagnostic>,
    /// Warnings, in file order.
    pub warnings: Vec<Diagnostic>,
}

/// The raw files of an operator folder: relative path (with `/`) → text.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub struct OpsFiles {
    /// The files.
    pub files: BTreeMap<String, String>,
}

impl OpsFiles {
    /// Reads the files of the operator-folder layout under `dir`. Files that cannot be
    /// read are reported, not fatal; a missing `dir` is an error.
    pub fn read_dir(dir: &Path) -> anyhow::Result<(OpsFiles, Vec<Diagnostic>)> {
        use anyhow::Context as _;
        let meta = std::fs::metadata(dir)
            .with_context(|| format!("reading operator folder {}", dir.display()))?;
        anyhow::ensure!(meta.is_dir(), "{} is not a folder", dir.display());
        let mut files = BTreeMap::new();
        let mut problems = Vec::new();
        let mut ignored: Vec<(String, &str)> = Vec::new();
        // Anything else at the top level or in fleet/ is not read: say so, since a
        // misspelt folder (`airfield/`) would otherwise be silently ignored.
        for (sub, known) in [
            (
                "",
                &[
                    "operator.json",
                    "pilots.json",
                    "fleet",
                    "airfields",
                    "legs",
                    "runway-state",
                    "observations",
                    "forecasts",
                    "signoffs",
                ][..],
            ),
            ("fleet", &["aircraft.json", "types"][..]),
        ] {
            let Ok(entries) = std::fs::read_dir(dir.join(sub)) else {
                continue;
            };
            let mut names: Vec<String> = entries
                .filter_map(|e| e.ok())
                .map(|e| e.file_name().to_string_lossy().into_owned())
                .filter(|n| !n.starts_with('.') && !known.contains(&n.as_str()))
                .collect();
            names.sort();
            for n in names {
                let rel = if sub.is_empty() {
                    n.clone()
                } else {
                    format!("{sub}/{n}")
                };
                problems.push(Diagnostic {
                    severity: Severity::Warning,
                    file: rel,
                    path: String::new(),
                    line: 1,
                    column: 1,
                    message: format!(
                        "not part of the operator-folder layout, so not read (expected in {}: {})",
                        if sub.is_empty() { "the folder" } else { sub },
                        known.join(", ")
                    ),
                });
            }
        }
        let mut read = |rel: String, path: &Path| {
            let problem = |message: String| Diagnostic {
                severity: Severity::Error,
                file: rel.clone(),
                path: String::new(),
                line: 1,
                column: 1,
                message,
            };
            match std::fs::metadata(path) {
                Ok(m) if m.len() > MAX_FILE_BYTES => problems.push(problem(format!(
                    "file is {} MB; the largest file read is {} MB — split it or remove it",
                    m.len() / 1_000_000,
                    MAX_FILE_BYTES / 1_000_000
                ))),
                Ok(_) => match std::fs::read(path) {
                    Ok(bytes) => match String::from_utf8(bytes) {
                        Ok(text) => {
                            files.insert(rel, text);
                        }
                        Err(e) => problems.push(problem(format!(
                            "not UTF-8 text (bad byte at offset {}); save it as UTF-8",
                            e.utf8_error().valid_up_to()
                        ))),
                    },
                    Err(e) => problems.push(problem(format!("cannot read: {e}"))),
                },
                Err(e) => problems.push(problem(format!("cannot read: {e}"))),
            }
        };
        for name in ["operator.json", "pilots.json", "fleet/aircraft.json"] {
            let p = dir.join(name);
            if p.exists() {
                read(name.to_string(), &p);
            }
        }
        for (sub, ext) in [
            ("fleet/types", "json"),
            ("airfields", "json"),
            ("legs", "json"),
            ("runway-state", "json"),
            ("observations", "txt"),
            ("forecasts", "txt"),
        ] {
            let d = dir.join(sub);
            let Ok(entries) = std::fs::read_dir(&d) else {
                continue;
            };
            let (mut names, other): (Vec<_>, Vec<_>) = entries
                .filter_map(|e| e.ok())
                .map(|e| e.file_name().to_string_lossy().into_owned())
                .filter(|n| !n.starts_with('.'))
                .partition(|n| n.ends_with(&format!(".{ext}")));
            names.sort();
            for n in names {
                read(format!("{sub}/{n}"), &d.join(&n));
            }
            ignored.extend(other.into_iter().map(|n| (format!("{sub}/{n}"), ext)));
        }
        ignored.sort();
        for (rel, ext) in ignored {
            problems.push(Diagnostic {
                severity: Severity::Warning,
                file: rel,
                path: String::new(),
                line: 1,
                column: 1,
                message: format!("not read: only .{ext} files are read in this folder"),
            });
        }
        Ok((OpsFiles { files }, problems))
    }

    /// Writes the files under `dir`, creating folders.
    pub fn write_dir(&self, dir: &Path) -> std::io::Result<()> {
        for (rel, text) in &self.files {
            let p = dir.join(rel);
            if let Some(parent) = p.parent() {
                std::fs::create_dir_all(parent)?;
            }
            std::fs::write(p, text)?;
        }
        Ok(())
    }

    /// Files under a sub-folder with an extension, in name order.
    pub fn under<'a>(
        &'a self,
        sub: &'a str,
        ext: &'a str,
    ) -> impl Iterator<Item = (&'a str, &'a str)> + 'a {
        self.files.iter().filter_map(move |(k, v)| {
            let rest = k.strip_prefix(sub)?.strip_prefix('/')?;
            (!rest.contains('/') && rest.ends_with(ext)).then_some((k.as_str(), v.as_str()))
        })
    }
}

/// Collects diagnostics, indexing a file's spans only when it has something to report.
pub struct Collector<'a> {
    files: &'a OpsFiles,
    spans: HashMap<String, Spans>,
    seen: std::collections::HashSet<Diagnostic>,
    per_file: HashMap<String, usize>,
    /// Files with an error among the problems past the cap (only warnings past it: the
    /// count line is a warning, and the file still loads).
    over_errors: std::collections::HashSet<String>,
    /// Files that failed to parse: the cross-file checks, run on what did load, say so
    /// instead of calling what they hold unknown.
    pub unparsed: std::collections::BTreeSet<String>,
    /// Unparsed files already named by a reference into them (named once, not once per
    /// reference).
    pub unparsed_named: std::collections::BTreeSet<String>,
    /// What was found so far.
    pub report: Report,
}

impl<'a> Collector<'a> {
    /// A collector over these files.
    pub fn new(files: &'a OpsFiles) -> Collector<'a> {
        Collector {
            files,
            spans: HashMap::new(),
            seen: Default::default(),
            per_file: HashMap::new(),
            over_errors: Default::default(),
            unparsed: Default::default(),
            unparsed_named: Default::default(),
            report: Report::default(),
        }
    }

    /// The file under `folder` that failed to parse and would have held `id`: the one
    /// named `<id>.json`, else one whose text names `"<id>"`.
    pub fn unparsed_holding(&self, folder: &str, id: &str) -> Option<&str> {
        let named = format!("{folder}/{id}.json");
        if self.unparsed.contains(&named) {
            return self.unparsed.get(&named).map(String::as_str);
        }
        let quoted = format!("\"{id}\"");
        self.unparsed
            .iter()
            .filter(|f| f.strip_prefix(folder).is_some_and(|r| r.starts_with('/')))
            .find(|f| {
                self.files
                    .files
                    .get(*f)
                    .is_some_and(|t| t.contains(&quoted))
            })
            .map(String::as_str)
    }

    fn spans(&mut self, file: &str) -> &Spans {
        let text = self.files.files.get(file).map_or("", String::as_str);
        self.spans
            .entry(file.to_string())
            .or_insert_with(|| Spans::new(text))
    }

    /// Records a problem at a field path (positioned at the value, or its nearest
    /// existing parent).
    pub fn at(&mut self, severity: Severity, file: &str, path: &str, message: impl Into<String>) {
        // Past the per-file cap only the count matters (and finding positions would cost).
        if let Some(n) = self.per_file.get_mut(file)
            && *n >= MAX_PER_FILE
        {
            *n += 1;
            if severity == Severity::Error {
                self.over_errors.insert(file.to_string());
            }
            return;
        }
        let (line, column) = self.spans(file).position(path);
        self.push(
            severity,
            file,
            path.to_string(),
            line,
            column,
            message.into(),
        );
    }

    /// Records an error at a field path.
    pub fn error(&mut self, file: &str, path: &str, message: impl Into<String>) {
        self.at(Severity::Error, file, path, message);
    }

    /// Records a warning at a field path.
    pub fn warn(&mut self, file: &str, path: &str, message: impl Into<String>) {
        self.at(Severity::Warning, file, path, message);
    }

    /// Records a problem at a line and column (for text files such as observations).
    pub fn at_line(
        &mut self,
        severity: Severity,
        file: &str,
        line: usize,
        column: usize,
        message: impl Into<String>,
    ) {
        self.push(severity, file, String::new(), line, column, message.into());
    }

    fn push(
        &mut self,
        severity: Severity,
        file: &str,
        path: String,
        line: usize,
        column: usize,
        message: String,
    ) {
        let d = Diagnostic {
            severity,
            file: file.to_string(),
            path,
            line,
            column,
            message,
        };
        let count = self.per_file.entry(d.file.clone()).or_insert(0);
        if *count >= MAX_PER_FILE {
            if severity == Severity::Error {
                self.over_errors.insert(d.file.clone());
            }
            if self.seen.insert(d) {
                *count += 1;
            }
            return;
        }
        let list = match severity {
            Severity::Error => &mut self.report.errors,
            Severity::Warning => &mut self.report.warnings,
        };
        if self.seen.insert(d.clone()) {
            *count += 1;
            list.push(d);
        }
    }

    /// Adds, for every file with more than [`MAX_PER_FILE`] problems, one line saying
    /// how many more there are.
    fn finish(&mut self) {
        let mut over: Vec<(String, usize)> = self
            .per_file
            .iter()
            .filter(|&(_, &n)| n > MAX_PER_FILE)
            .map(|(f, &n)| (f.clone(), n - MAX_PER_FILE))
            .collect();
        over.sort();
        for (file, more) in over {
            let last_line = self
                .files
                .files
                .get(&file)
                .map_or(1, |t| t.lines().count().max(1));
            let (severity, list) = if self.over_errors.contains(&file) {
                (Severity::Error, &mut self.report.errors)
            } else {
                (Severity::Warning, &mut self.report.warnings)
            };
            list.push(Diagnostic {
                severity,
                file,
                path: String::new(),
                line: last_line,
                column: 1,
                message: format!(
                    "… and {more} more problem(s) in this file; fix the ones above and run again"
                ),
            });
        }
    }

    /// Records a serde_json error at its own position, offset by `base` bytes into the
    /// file (for an element parsed on its own), with the path found by position.
    fn serde_error(&mut self, file: &str, err: &serde_json::Error, base: usize) {
        let text = self.files.files.get(file).map_or("", String::as_str);
        let elem_off =
            line_col_to_offset_in(text.get(base..).unwrap_or(""), err.line(), err.column());
        let offset = base + elem_off;
        let spans = self.spans(file);
        let mut msg = err.to_string();
        if let Some(i) = msg.rfind(" at line ") {
            msg.truncate(i);
        }
        // A missing field is reported at the object's closing brace: name the object.
        let (path, (line, column)) = if msg.starts_with("missing field") {
            let p = spans.path_at(offset).to_string();
            let pos = spans.position(&p);
            (p, pos)
        } else if let Some(field) = msg
            .strip_prefix("unknown field `")
            .and_then(|r| r.split('`').next())
        {
            // Reported just after the key, which is not a value: name the key itself.
            let parent = spans.path_at(offset.saturating_sub(1));
            let p = if parent.is_empty() {
                field.to_string()
            } else {
                format!("{parent}.{field}")
            };
            (p, spans.line_col(offset.saturating_sub(field.len() + 2)))
        } else {
            (
                spans.path_at(offset.saturating_sub(1)).to_string(),
                spans.line_col(offset),
            )
        };
        let msg = msg
            .replace(
                "expected f64",
                "expected a number (the unit is in the field name)",
            )
            .replace("expected u32", "expected a whole number")
            .replace("expected u64", "expected a whole number")
            // serde_json's words for the commonest slips, in a writer's terms.
            .replace(
                "control character (\\u0000-\\u001F) found while parsing a string",
                "a text runs on past the end of its line: a closing quote \" is missing (here or on the line before)",
            )
            .replace(
                "expected value",
                "expected a value here: a number, a text in quotes, true or false, a list or an object",
            )
;
        let msg = match err.classify() {
            serde_json::error::Category::Syntax => format!("JSON syntax: {msg}"),
            serde_json::error::Category::Eof => format!("JSON ends too early: {msg}"),
            _ => msg,
        };
        self.push(Severity::Error, file, path, line, column, msg);
    }

    /// Parses one JSON file as `T`. On failure every element of the named arrays is
    /// also parsed on its own, so one file with three broken elements reports all three.
    pub fn parse<T: DeserializeOwned>(
        &mut self,
        file: &str,
        lists: &[(&str, Parser)],
    ) -> Option<T> {
        let text = self.files.files.get(file)?;
        if let Some(v) = schema_version(text)
            && v != u64::from(SCHEMA_VERSION)
        {
            self.error(
                file,
                "schema_version",
                format!("schema_version {v} is not one this build reads ({SCHEMA_VERSION})"),
            );
            self.unparsed.insert(file.to_string());
            return None;
        }
        match serde_json::from_str::<T>(text) {
            Ok(v) => Some(v),
            Err(e) => {
                // Whole-file error: report it unless it lies inside a list element that
                // is reported on its own below.
                let whole_at = line_col_to_offset_in(text, e.line(), e.column());
                let mut covered = false;
                if e.classify() == serde_json::error::Category::Data {
                    for (array, parse) in lists {
                        let elems = self.spans(file).elements(array);
                        for (_, start, end) in elems {
                            if let Err(ee) = parse(&text[start..end]) {
                                covered |= (start..=end).contains(&whole_at);
                                self.serde_error(file, &ee, start);
                            }
                        }
                    }
                }
                if !covered {
                    self.serde_error(file, &e, 0);
                }
                self.unparsed.insert(file.to_string());
                None
            }
        }
    }
}

/// Parses one element on its own, for [`Collector::parse`].
pub type Parser = fn(&str) -> Result<(), serde_json::Error>;

/// A [`Parser`] for element type `E`.
pub fn element<E: DeserializeOwned>(text: &str) -> Result<(), serde_json::Error> {
    serde_json::from_str::<E>(text).map(|_| ())
}

fn line_col_to_offset_in(text: &str, line: usize, column: usize) -> usize {
    let mut start = 0;
    for _ in 1..line {
        match text[start..].find('\n') {
            Some(i) => start += i + 1,
            None => break,
        }
    }
    (start + column).min(text.len())
}

/// Reads `schema_version` cheaply, without requiring the rest of the file to be valid.
fn schema_version(text: &str) -> Option<u64> {
    #[derive(serde::Deserialize)]
    struct V {
        schema_version: Option<u64>,
    }
    serde_json::from_str::<V>(text).ok()?.schema_version
}

/// The result of loading: the data when there were no errors, and the report.
#[derive(Debug)]
pub struct Loaded {
    /// The operator's data; `None` when there were errors.
    pub ops: Option<Ops>,
    /// Every problem found.
    pub report: Report,
}

/// Loads an operator from its files: parses every file, then runs every check.
pub fn load_files(files: &OpsFiles) -> Loaded {
    let mut c = Collector::new(files);
    let ops = parse_all(&mut c, files);
    if let Some(ops) = &ops {
        super::validate::check_cross(ops, &mut c);
    }
    c.finish();
    let ok = c.report.errors.is_empty();
    let key = |d: &Diagnostic| (d.file.clone(), d.line, d.column);
    c.report.errors.sort_by_key(key);
    c.report.warnings.sort_by_key(key);
    Loaded {
        ops: if ok { ops } else { None },
        report: c.report,
    }
}

fn missing(c: &mut Collector<'_>, file: &str) {
    c.report.errors.push(Diagnostic {
        severity: Severity::Error,
        file: file.to_string(),
        path: String::new(),
        line: 1,
        column: 1,
        message: "file is missing; every operator folder needs one (`rhoboard init DIR` writes a template)"
            .to_string(),
    });
}

fn parse_all(c: &mut Collector<'_>, files: &OpsFiles) -> Option<Ops> {
    use super::airfield::RunwayEnd;
    use super::fleet::Aircraft;
    use super::legs::Leg;
    use super::pilots::Pilot;

    let operator = if files.files.contains_key("operator.json") {
        c.parse::<OperatorFile>(
            "operator.json",
            &[("categories", element::<super::operator::Minimums>)],
        )
    } else {
        missing(c, "operator.json");
        None
    };
    let pilots = if files.files.contains_key("pilots.json") {
        c.parse::<PilotsFile>("pilots.json", &[("pilots", element::<Pilot>)])
    } else {
        missing(c, "pilots.json");
        None
    };
    let aircraft = if files.files.contains_key("fleet/aircraft.json") {
        c.parse::<AircraftFile>("fleet/aircraft.json", &[("aircraft", element::<Aircraft>)])
    } else {
        missing(c, "fleet/aircraft.json");
        None
    };
    let mut types = Vec::new();
    for (file, _) in files.under("fleet/types", ".json") {
        let Some(t) = c.parse::<AircraftTypeFile>(file, &[]) else {
            continue;
        };
        match Performance::from_file(&t.performance) {
            Ok(performance) => types.push((
                file.to_string(),
                AircraftType {
                    file: t,
                    performance,
                },
            )),
            Err((path, msg)) => {
                c.error(file, &path, msg);
                c.unparsed.insert(file.to_string());
            }
        }
    }
    let mut airfields = Vec::new();
    for (file, _) in files.under("airfields", ".json") {
        if let Some(a) = c.parse::<Airfield>(file, &[("runway_ends", element::<RunwayEnd>)]) {
            airfields.push((file.to_string(), a));
        }
    }
    let mut legs = Vec::new();
    for (file, _) in files.under("legs", ".json") {
        if let Some(l) = c.parse::<LegsFile>(file, &[("legs", element::<Leg>)]) {
            legs.push((file.to_string(), l));
        }
    }
    let mut runway_states = Vec::new();
    for (file, _) in files.under("runway-state", ".json") {
        if let Some(r) = c.parse::<super::runway_state::RunwayStateFile>(file, &[]) {
            runway_states.push((file.to_string(), r));
        }
    }
    let observations = files
        .under("observations", ".txt")
        .chain(files.under("forecasts", ".txt"))
        .map(|(k, v)| (k.to_string(), v.to_string()))
        .collect();
    {
        use super::validate as v;
        if let Some(o) = &operator {
            v::check_operator(o, c);
        }
        if let Some(p) = &pilots {
            v::check_pilots(p, c);
        }
        if let Some(a) = &aircraft {
            v::check_aircraft_file(a, c);
        }
        for (file, t) in &types {
            v::check_type(file, t, c);
        }
        for (file, a) in &airfields {
            v::check_airfield(file, a, c);
        }
        for (file, l) in &legs {
            v::check_legs_file(file, l, c);
        }
    }
    let missing_anchor = [operator.is_none(), pilots.is_none(), aircraft.is_none()];
    let (Some(operator), Some(pilots), Some(aircraft)) = (operator, pilots, aircraft) else {
        // The cross-file checks (legs against airfields, aircraft and pilots) hang on
        // these three files: say that they wait, so a clean rest is not read as clean.
        let missing: Vec<&str> = ["operator.json", "pilots.json", "fleet/aircraft.json"]
            .into_iter()
            .zip(missing_anchor)
            .filter(|(_, m)| *m)
            .map(|(f, _)| f)
            .collect();
        c.warn(
            missing[0],
            "",
            format!(
                "the cross-file checks (legs against airfields, aircraft and pilots) wait for \
                 {} to load: fix {} and run validate again",
                missing.join(", "),
                if missing.len() == 1 { "it" } else { "them" }
            ),
        );
        return None;
    };
    // The cross-file checks run on what did load, so one run lists every problem;
    // a reference into a file that failed to parse is reported as such
    // (`Collector::unparsed_holding`), not as unknown.
    let mut ops = Ops::new(
        operator,
        pilots,
        aircraft,
        types,
        airfields,
        legs,
        observations,
    );
    super::validate::check_runway_states(&ops, &runway_states, c);
    ops.runway_states = runway_states.into_iter().map(|(_, r)| r).collect();
    Some(ops)
}
