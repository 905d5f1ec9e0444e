//! Effects: what `update` asks the event loop to do (write a sign-off, save the legs,
//! save the day's runway state), and the [`Done`] message each sends back. `update`
//! only queues them, in one queue (`App::take_effects`); [`perform`] does the I/O, with
//! the real clock passed in (tests pass a fixed one).

use std::path::PathBuf;

use chrono::{DateTime, Utc};

use super::app::{App, Msg};
use crate::assess::LegResult;
use crate::ops::legs::LegsFile;
use crate::ops::runway_state::{EndState, RunwayStateFile};
use crate::replan::{self, Saved};
use crate::signoff::log::{AppendOptions, LogError};
use crate::signoff::{self, Request};

/// Work for the event loop.
#[derive(Debug, Clone)]
pub enum Effect {
    /// Sign this assessed leg and append the record to the log.
    Sign {
        /// The basis (the leg's result shown in the confirmation).
        result: Box<LegResult>,
        /// Who signs.
        instructor: String,
        /// Their note.
        note: String,
        /// An override reason, for a leg that does not meet minimums.
        override_reason: Option<String>,
        /// The board's clock when the confirmation opened.
        basis_at: DateTime<Utc>,
    },
    /// Save day legs files, each only if its content still hashes as loaded.
    SaveLegs(Vec<LegsSave>),
    /// Append `entry` to `dir/runway-state/<date>.json` (as `rhoboard runway` does).
    SaveRunwayState {
        /// The operator folder.
        dir: PathBuf,
        /// The UTC date of the state.
        date: chrono::NaiveDate,
        /// The change.
        entry: EndState,
        /// The change in words, for the answer's note.
        what: String,
    },
}

/// One legs file to save.
#[derive(Debug, Clone, PartialEq)]
pub struct LegsSave {
    /// Path relative to the operator folder (`legs/2026-06-14.json`).
    pub rel: String,
    /// Full path.
    pub path: PathBuf,
    /// The hash the file must still have.
    pub expected_hash: String,
    /// The content to write.
    pub file: LegsFile,
}

/// What a save of one file came to.
#[derive(Debug, Clone, PartialEq)]
pub enum SaveOutcome {
    /// Written: the new text's hash.
    Written {
        /// The new hash.
        hash: String,
        /// The backup of the previous version.
        backup: PathBuf,
    },
    /// The file already holds exactly this: nothing written.
    Unchanged,
    /// Changed on disk since loaded: nothing written; the text there now.
    Conflict(String),
    /// The save failed.
    Failed(String),
}

/// The event loop's answers.
#[derive(Debug, Clone)]
pub enum Done {
    /// A sign-off was attempted: the note to show (or the error), and the chain re-read.
    Signed {
        /// `(seq, note)` or the reason it failed.
        outcome: Result<(u64, String), String>,
        /// The chain after it.
        chain: Result<crate::signoff::log::Chain, String>,
    },
    /// Legs files were saved (or not), in the order asked.
    Saved(Vec<(String, SaveOutcome)>),
    /// The day's runway state was written (and where, with the whole day's state), or
    /// why it could not be.
    RunwayState {
        /// What was asked for, in words ("XSEA 27: closed").
        what: String,
        /// The file written and the day's whole state, or the error.
        result: Result<(PathBuf, RunwayStateFile), String>,
    },
}

/// Does one effect (I/O) and returns the message for `update`. `now` is the real clock.
pub fn perform(app: &App, effect: Effect, now: DateTime<Utc>) -> Msg {
    match effect {
        Effect::Sign {
            result,
            instructor,
            note,
            override_reason,
            basis_at,
        } => {
            let (Some(log), Some(data)) = (&app.signoffs.log, &app.signoffs.data) else {
                return Msg::Done(Done::Signed {
                    outcome: Err("no sign-off log is set up".into()),
                    chain: Err("no sign-off log is set up".into()),
                });
            };
            let req = Request {
                instructor: &instructor,
                note: &note,
                override_reason: override_reason.as_deref(),
                signed_at: now,
                basis_at,
                data,
            };
            let outcome =
                match signoff::sign(log, &app.ops, &result, &req, &AppendOptions::default()) {
                    Ok(a) => {
                        let mut text = format!(
                            "{} signed #{} by {} on the {} basis ({} {})",
                            a.entry.record.leg,
                            a.entry.record.seq,
                            a.entry.record.instructor,
                            basis_at.format("%H%MZ"),
                            result.state.glyph(),
                            result.state.word()
                        );
                        if let Some(s) = a.entry.record.supersedes_seq {
                            text.push_str(&format!("; supersedes #{s}"));
                        }
                        if let Some(t) = &a.set_aside {
                            text.push_str(&format!("; a torn line was set aside: {t}"));
                        }
                        Ok((a.entry.record.seq, text))
                    }
                    Err(LogError::Refused(r)) => Err(format!("refused: {r}")),
                    Err(e) => Err(format!("not signed: {e}")),
                };
            let chain = log.read().map_err(|e| e.to_string());
            Msg::Done(Done::Signed { outcome, chain })
        }
        Effect::SaveLegs(saves) => {
            let out = saves
                .into_iter()
                .map(|s| {
                    let o = match replan::save_legs(&s.path, &s.expected_hash, &s.file) {
                        Ok(Saved::Written { backup, hash }) => {
                            SaveOutcome::Written { hash, backup }
                        }
                        Ok(Saved::Conflict { on_disk }) => SaveOutcome::Conflict(on_disk),
                        Ok(Saved::Unchanged) => SaveOutcome::Unchanged,
                        Err(e) => SaveOutcome::Failed(format!("saving {}: {e}", s.path.display())),
                    };
                    (s.rel, o)
                })
                .collect();
            Msg::Done(Done::Saved(out))
        }
        // The same code as `rhoboard runway` (written atomically).
        Effect::SaveRunwayState {
            dir,
            date,
            entry,
            what,
        } => {
            let result = crate::commands::runway::append_entry(&dir, date, entry)
                .map_err(|e| format!("{e:#}"));
            Msg::Done(Done::RunwayState { what, result })
        }
    }
}
