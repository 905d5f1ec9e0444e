//! Feeds: threads that read observations and send them to the board as messages.
//! Every failure becomes a `Msg::FeedError` on screen; a feed never ends the board.

use std::collections::BTreeMap;
use std::io::Read;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::sync::mpsc::Sender;
use std::thread;
use std::time::{Duration, Instant};

use chrono::{DateTime, TimeDelta, Utc};

use super::app::Msg;
use crate::observation::{ObservationFile, decode_all};
use crate::ops::runway_state::RunwayStateFile;

/// How long a feed command may run before it is stopped.
pub const FEED_COMMAND_TIMEOUT: Duration = Duration::from_secs(60);

/// Watches `dir` by polling every `every`: new `*.txt` files and lines appended to
/// known ones are read with [`ObservationFile::read_new`] and sent as reports.
/// `offset` shifts the wall clock used to date the reports (a live board run `--at`).
/// `loaded` are the files read with the operator folder, each from where that read
/// ended ([`ObservationFile::read_already`]). On the same pass, `runway` (when given) looks at the operator's runway-state files,
/// so a change made by another process (`rhoboard runway`) reaches the board too.
pub fn spawn_folder_watch(
    dir: PathBuf,
    every: Duration,
    offset: TimeDelta,
    mut runway: Option<RunwayStateWatch>,
    loaded: Vec<ObservationFile>,
    tx: Sender<Msg>,
) {
    thread::Builder::new()
        .name("rhoboard-folder-feed".into())
        .spawn(move || {
            let mut files: BTreeMap<PathBuf, ObservationFile> = loaded
                .into_iter()
                .map(|f| (f.path().to_path_buf(), f))
                .collect();
            loop {
                if !poll_folder(&dir, &mut files, Utc::now() + offset, &tx) {
                    return;
                }
                if let Some(w) = runway.as_mut()
                    && !poll_runway_state(w, &tx)
                {
                    return;
                }
                thread::sleep(every);
            }
        })
        .ok();
}

/// The operator's `runway-state/` folder as last seen by the feed.
#[derive(Debug, Clone)]
pub struct RunwayStateWatch {
    dir: PathBuf,
    /// Each airfield's runway ends, to check a changed file against.
    known_ends: BTreeMap<String, Vec<String>>,
    /// Each file's text as last seen (good or not), so a change is read once.
    seen: BTreeMap<PathBuf, String>,
}

impl RunwayStateWatch {
    /// Watches `ops_dir/runway-state/`, checking entries against the airfields of `ops`.
    pub fn new(ops_dir: &Path, ops: &crate::ops::Ops) -> Self {
        Self {
            dir: ops_dir.join("runway-state"),
            known_ends: ops
                .airfields
                .iter()
                .map(|a| {
                    let ends = a.runway_ends.iter().map(|r| r.designator.clone());
                    (a.id.clone(), ends.collect())
                })
                .collect(),
            seen: BTreeMap::new(),
        }
    }

    /// A runway-state file's text read as the day's state, or what is wrong with it,
    /// placed as `validate` places it: `5:50: entries[0].closed: …` (line, column and
    /// field, by the operator loader's own `Collector`).
    fn read(&self, path: &Path, text: &str) -> Result<RunwayStateFile, String> {
        use crate::ops::load::{Collector, OpsFiles};
        let name = path
            .file_name()
            .map_or_else(String::new, |n| n.to_string_lossy().into_owned());
        let rel = format!("runway-state/{name}");
        let files = OpsFiles {
            files: BTreeMap::from([(rel.clone(), text.to_string())]),
        };
        let mut c = Collector::new(&files);
        let first = |c: &Collector<'_>| {
            c.report.errors.first().map_or_else(
                || "does not read".to_string(),
                |d| {
                    let field = if d.path.is_empty() {
                        String::new()
                    } else {
                        format!("{}: ", d.path)
                    };
                    format!("{}:{}: {field}{}", d.line, d.column, d.message)
                },
            )
        };
        let Some(state) = c.parse::<RunwayStateFile>(&rel, &[]) else {
            return Err(first(&c));
        };
        let stem = path.file_stem().and_then(|s| s.to_str()).unwrap_or("");
        if state.date.to_string() != stem {
            c.error(
                &rel,
                "date",
                format!(
                    "{} differs from the file name; name the file {}.json",
                    state.date, state.date
                ),
            );
            return Err(first(&c));
        }
        for (i, e) in state.entries.iter().enumerate() {
            let Some(ends) = self.known_ends.get(&e.airfield) else {
                c.error(
                    &rel,
                    &format!("entries[{i}].airfield"),
                    format!("unknown airfield '{}'", e.airfield),
                );
                return Err(first(&c));
            };
            if !ends.contains(&e.end) {
                c.error(
                    &rel,
                    &format!("entries[{i}].end"),
                    format!(
                        "{} has no runway end '{}' (it has: {})",
                        e.airfield,
                        e.end,
                        ends.join(", ")
                    ),
                );
                return Err(first(&c));
            }
        }
        Ok(state)
    }
}

/// One pass over the runway-state folder: each file that changed since the last pass
/// is read and sent as the day's state ([`Msg::RunwayStateRead`]); a file that does not
/// read is a [`Msg::FeedError`] naming it (the board keeps the last good state); a file
/// that went away empties that day's state. False when the board has gone.
pub fn poll_runway_state(w: &mut RunwayStateWatch, tx: &Sender<Msg>) -> bool {
    let mut now: BTreeMap<PathBuf, String> = BTreeMap::new();
    if let Ok(entries) = std::fs::read_dir(&w.dir) {
        for p in entries.filter_map(Result::ok).map(|e| e.path()) {
            let name = p.file_name().and_then(|n| n.to_str()).unwrap_or("");
            // Hidden files are `rhoboard runway`'s temporaries mid-write.
            if name.starts_with('.') || p.extension().is_none_or(|x| x != "json") {
                continue;
            }
            match std::fs::read_to_string(&p) {
                Ok(text) => {
                    now.insert(p, text);
                }
                Err(e) => {
                    let msg = Msg::FeedError {
                        source: shown(&p),
                        error: format!("cannot read: {e}; the last good runway state stays"),
                    };
                    if tx.send(msg).is_err() {
                        return false;
                    }
                }
            }
        }
    }
    let mut msgs = Vec::new();
    for (p, text) in &now {
        if w.seen.get(p) == Some(text) {
            continue;
        }
        msgs.push(match w.read(p, text) {
            Ok(state) => Msg::RunwayStateRead {
                source: shown(p),
                state,
            },
            Err(error) => Msg::FeedError {
                source: shown(p),
                error: format!("{error}; the last good runway state stays"),
            },
        });
    }
    for p in w.seen.keys().filter(|p| !now.contains_key(*p)) {
        let date = p
            .file_stem()
            .and_then(|s| s.to_str())
            .and_then(|s| s.parse().ok());
        if let Some(date) = date {
            msgs.push(Msg::RunwayStateRead {
                source: shown(p),
                state: RunwayStateFile::new(date),
            });
        }
    }
    w.seen = now;
    msgs.into_iter().all(|m| tx.send(m).is_ok())
}

/// `runway-state/<name>` for notes: the folder and the file, as the operator knows it.
fn shown(p: &Path) -> String {
    let name = p
        .file_name()
        .map_or_else(String::new, |n| n.to_string_lossy().into_owned());
    format!("runway-state/{name}")
}

/// One pass over the folder, dating reports against `reference`; false when the
/// board has gone.
pub fn poll_folder(
    dir: &Path,
    files: &mut BTreeMap<PathBuf, ObservationFile>,
    reference: DateTime<Utc>,
    tx: &Sender<Msg>,
) -> bool {
    let source = format!("folder {}", dir.display());
    let entries = match std::fs::read_dir(dir) {
        Ok(e) => e,
        Err(e) => {
            return tx
                .send(Msg::FeedError {
                    source,
                    error: format!("cannot read the folder: {e}"),
                })
                .is_ok();
        }
    };
    let mut paths: Vec<PathBuf> = entries
        .filter_map(Result::ok)
        .map(|e| e.path())
        .filter(|p| p.extension().is_some_and(|x| x == "txt") && p.is_file())
        .collect();
    paths.sort();
    for p in paths {
        let f = files
            .entry(p.clone())
            .or_insert_with(|| ObservationFile::new(p.clone()));
        // Named with its folder (`observations/2026-06-14.txt`), as `validate` names it.
        let name = match (
            dir.file_name().map(|d| d.to_string_lossy()),
            p.file_name().map(|n| n.to_string_lossy()),
        ) {
            (Some(d), Some(n)) => format!("{d}/{n}"),
            _ => p.display().to_string(),
        };
        // A day file (`2026-06-14.txt`) is dated against its own day, as `check` does.
        let msg = match f.read_new(crate::observation::day_of_file(&p).unwrap_or(reference)) {
            Ok(reports) if reports.is_empty() => continue,
            Ok(reports) => Msg::Observations {
                source: name,
                reports,
            },
            Err(e) => Msg::FeedError {
                source: name,
                error: format!("cannot read: {e}"),
            },
        };
        if tx.send(msg).is_err() {
            return false;
        }
    }
    true
}

/// The sign-off log's folder as last seen, so a record written by another board or
/// by `rhoboard signoff` reaches this one.
#[derive(Debug, Clone)]
pub struct LogWatch {
    log: crate::signoff::Log,
    /// Each file's name, length and modification time at the last look (`None`: not
    /// looked yet — the board read the log at load).
    seen: Option<Vec<(String, u64, Option<std::time::SystemTime>)>>,
}

impl LogWatch {
    /// A watch on `log`, taking the log as the board read it at load.
    pub fn new(log: crate::signoff::Log) -> LogWatch {
        let mut w = LogWatch { log, seen: None };
        w.seen = Some(w.look());
        w
    }

    fn look(&self) -> Vec<(String, u64, Option<std::time::SystemTime>)> {
        let Ok(entries) = std::fs::read_dir(self.log.dir()) else {
            return Vec::new();
        };
        let mut files: Vec<_> = entries
            .filter_map(Result::ok)
            .filter_map(|e| {
                let name = e.file_name().to_string_lossy().into_owned();
                if name.starts_with('.') {
                    return None;
                }
                let m = e.metadata().ok()?;
                Some((name, m.len(), m.modified().ok()))
            })
            .collect();
        files.sort();
        files
    }
}

/// One look at the sign-off log: when its files changed since the last look, the
/// chain read again goes to the board. False when the board has gone.
pub fn poll_log(w: &mut LogWatch, tx: &Sender<Msg>) -> bool {
    let now = w.look();
    if w.seen.as_ref() == Some(&now) {
        return true;
    }
    w.seen = Some(now);
    let chain = w.log.read().map_err(|e| e.to_string());
    tx.send(Msg::LogRead(chain)).is_ok()
}

/// Looks at the sign-off log every `every` on its own thread.
pub fn spawn_log_watch(mut w: LogWatch, every: Duration, tx: Sender<Msg>) {
    thread::Builder::new()
        .name("rhoboard-log-watch".into())
        .spawn(move || {
            while poll_log(&mut w, &tx) {
                thread::sleep(every);
            }
        })
        .ok();
}

/// Runs `command` through `sh -c` now and then every `every`, reading its standard
/// output as METAR lines.
pub fn spawn_feed_command(command: String, every: Duration, offset: TimeDelta, tx: Sender<Msg>) {
    thread::Builder::new()
        .name("rhoboard-command-feed".into())
        .spawn(move || {
            loop {
                let msg = match run_feed_command(&command, FEED_COMMAND_TIMEOUT) {
                    Ok(text) => Msg::Observations {
                        source: "feed command".into(),
                        reports: decode_all(&text, Utc::now() + offset),
                    },
                    Err(error) => Msg::FeedError {
                        source: format!("feed command '{command}'"),
                        error,
                    },
                };
                if tx.send(msg).is_err() {
                    return;
                }
                thread::sleep(every);
            }
        })
        .ok();
}

/// Runs the feed command once; its output, or why it failed.
pub fn run_feed_command(command: &str, timeout: Duration) -> Result<String, String> {
    let mut child = Command::new("sh")
        .arg("-c")
        .arg(command)
        .stdin(Stdio::null())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .map_err(|e| format!("could not start: {e}"))?;
    let mut stdout = child.stdout.take();
    let mut stderr = child.stderr.take();
    // Read both pipes on their own threads so a chatty command cannot block on a full pipe.
    let out = thread::spawn(move || {
        let mut s = String::new();
        if let Some(o) = stdout.as_mut() {
            let _ = o.read_to_string(&mut s);
        }
        s
    });
    let err = thread::spawn(move || {
        let mut s = String::new();
        if let Some(e) = stderr.as_mut() {
            let _ = e.read_to_string(&mut s);
        }
        s
    });
    let started = Instant::now();
    let status = loop {
        match child.try_wait() {
            Ok(Some(s)) => break s,
            Ok(None) if started.elapsed() > timeout => {
                let _ = child.kill();
                let _ = child.wait();
                return Err(format!(
                    "stopped after {} s without finishing",
                    timeout.as_secs()
                ));
            }
            Ok(None) => thread::sleep(Duration::from_millis(50)),
            Err(e) => return Err(format!("could not wait for it: {e}")),
        }
    };
    let text = out.join().unwrap_or_default();
    let errs = err.join().unwrap_or_default();
    if status.success() {
        Ok(text)
    } else {
        let first = errs.lines().find(|l| !l.trim().is_empty()).unwrap_or("");
        Err(format!(
            "exited with {status}{}",
            if first.is_empty() {
                String::new()
            } else {
                format!(": {first}")
            }
        ))
    }
}

/// Parses `--feed-every`: `10m`, `30s`, `1h`, or plain seconds.
pub fn parse_every(text: &str) -> Result<Duration, String> {
    let t = text.trim();
    let (num, unit) = t
        .find(|c: char| !c.is_ascii_digit() && c != '.')
        .map_or((t, "s"), |i| t.split_at(i));
    let n: f64 = num
        .parse()
        .map_err(|_| format!("'{text}': expected a duration such as 10m, 30s or 1h"))?;
    let secs = match unit {
        "s" | "sec" => n,
        "m" | "min" => n * 60.0,
        "h" => n * 3600.0,
        _ => return Err(format!("'{text}': unit '{unit}' unknown; use s, m or h")),
    };
    if !(1.0..=86_400.0).contains(&secs) {
        return Err(format!("'{text}': expected between 1 s and 24 h"));
    }
    Ok(Duration::from_secs_f64(secs))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn durations() {
        assert_eq!(parse_every("10m"), Ok(Duration::from_secs(600)));
        assert_eq!(parse_every("30s"), Ok(Duration::from_secs(30)));
        assert_eq!(parse_every("1h"), Ok(Duration::from_secs(3600)));
        assert_eq!(parse_every("45"), Ok(Duration::from_secs(45)));
        assert!(parse_every("10x").is_err());
        assert!(parse_every("0s").is_err());
    }

    #[test]
    fn feed_command_output_and_failure() {
        assert_eq!(
            run_feed_command(
                "echo METAR XSEA 140600Z 23004KT 9999 14/11 Q1019",
                Duration::from_secs(10)
            )
            .as_deref(),
            Ok("METAR XSEA 140600Z 23004KT 9999 14/11 Q1019\n")
        );
        let err = run_feed_command("echo nope >&2; exit 3", Duration::from_secs(10)).unwrap_err();
        assert!(
            err.contains("exit status: 3") && err.contains("nope"),
            "{err}"
        );
    }
}
