//! Sign-offs on the board: the log read at load and after each sign-off, each leg's
//! standing (`✎ signed` / `↻ re-check`), and the confirmation form that shows the
//! basis before the event loop appends the record. `update` never writes: confirming
//! queues an [`Effect::Sign`](super::effects::Effect) for the event loop.

use chrono::{DateTime, Utc};
use ratatui::crossterm::event::{KeyCode, KeyEvent};

use super::app::{App, Mode, NoteKind};
use super::effects::Effect;
use super::form::FieldKey;
use crate::assess::LegResult;
use crate::report::LogLine;
use crate::signoff::log::{Chain, Log};
use crate::signoff::{self, DataHashes, Record, Refusal, Request, Standing};

/// A leg's standing with its sign-off, owned (no borrow of the chain).
#[derive(Debug, Clone, PartialEq)]
pub enum Mark {
    /// No sign-off in force.
    Unsigned,
    /// Signed and current.
    Signed {
        /// The record's sequence number.
        seq: u64,
        /// Who signed.
        instructor: String,
    },
    /// Signed, but a later report (or a re-plan) undermines it.
    Recheck {
        /// The record's sequence number.
        seq: u64,
        /// Who signed.
        instructor: String,
        /// Why a re-check is needed.
        why: Vec<String>,
    },
}

impl Mark {
    /// Glyph for the leg row.
    pub const fn glyph(&self) -> &'static str {
        match self {
            Mark::Unsigned => " ",
            Mark::Signed { .. } => "✎",
            Mark::Recheck { .. } => "↻",
        }
    }

    /// Glyph and word (wide rows, the detail).
    pub fn text(&self) -> String {
        match self {
            Mark::Unsigned => "—".to_string(),
            Mark::Signed { seq, instructor } => format!("✎ signed #{seq} {instructor}"),
            Mark::Recheck {
                seq, instructor, ..
            } => format!("↻ re-check #{seq} {instructor}"),
        }
    }
}

/// The sign-off side of the board.
#[derive(Debug, Clone, Default)]
pub struct Signoffs {
    /// The log, when one could be set up.
    pub log: Option<Log>,
    /// The operator data's hashes (the basis of each record).
    pub data: Option<DataHashes>,
    /// The chain as last read.
    pub chain: Option<Chain>,
    /// Why the log is not available, if it is not.
    pub unavailable: Option<String>,
    /// Standing per leg, parallel to `Assessment::legs`.
    pub marks: Vec<Mark>,
}

impl Signoffs {
    /// How many sign-offs need a re-check.
    pub fn rechecks(&self) -> usize {
        self.marks
            .iter()
            .filter(|m| matches!(m, Mark::Recheck { .. }))
            .count()
    }

    /// The log's line for the status line: head `SEQ:HASH`, or why there is none.
    pub fn log_line(&self) -> LogLine {
        match (&self.chain, &self.unavailable) {
            (Some(c), _) => LogLine::of(c),
            (None, Some(why)) => LogLine::Unavailable(why.clone()),
            (None, None) => LogLine::Unavailable("no sign-off log set up".into()),
        }
    }

    /// Short status text: re-checks and the head.
    pub fn status(&self) -> String {
        if self.log.is_none() && self.unavailable.is_none() && self.chain.is_none() {
            // No log was asked for (a board built in code): nothing to say.
            return String::new();
        }
        let head = match self.log_line() {
            LogLine::Sound(h) => {
                let short: String = h.sha256.chars().take(12).collect();
                format!("log head {}:{short}", h.seq)
            }
            LogLine::Empty => "log: no sign-offs yet".to_string(),
            LogLine::Broken { .. } => "✗ LOG DOES NOT VERIFY".to_string(),
            LogLine::Unavailable(_) => "log: not available".to_string(),
        };
        let n = self.rechecks();
        if n == 0 {
            head
        } else {
            format!("↻ re-check {n} · {head}")
        }
    }
}

/// The confirmation form of a sign-off.
#[derive(Debug, Clone, PartialEq)]
pub struct SignForm {
    /// The leg (index into `Assessment::legs`) when opened.
    pub leg: usize,
    /// The leg's result the record is made of (the basis).
    pub result: LegResult,
    /// The board's clock when opened: the basis time.
    pub basis_at: DateTime<Utc>,
    /// Instructor, note, override reason.
    pub values: [String; 3],
    /// Focused field.
    pub focus: usize,
    /// The record as it would be written, or why it would be refused.
    pub preview: Result<Record, Refusal>,
    /// An error from the last attempt (the log failed, or refused).
    pub error: Option<String>,
    /// Waiting for the event loop to write it.
    pub busy: bool,
    /// Whether the override reason is asked: only for a leg that does not meet the
    /// minimums, in a category whose overrides the policy allows.
    pub offers_override: bool,
    /// The leg had left on the board's clock and the user was told so: the next Enter
    /// signs it anyway.
    pub departed_warned: bool,
}

impl SignForm {
    /// How many fields the form has (the override reason only where it can be used).
    pub fn fields(&self) -> usize {
        if self.offers_override {
            SIGN_FIELDS.len()
        } else {
            SIGN_FIELDS.len() - 1
        }
    }
}

/// The form's field labels.
pub const SIGN_FIELDS: [&str; 3] = ["instructor", "note", "override reason"];

impl App {
    /// Sets up the sign-off log (at load): reads the chain and marks every leg.
    /// I/O: for the loader and tests, never for `update`.
    pub fn attach_signoffs(&mut self, log: anyhow::Result<Log>, data: anyhow::Result<DataHashes>) {
        match data {
            Ok(d) => self.signoffs.data = Some(d),
            Err(e) => {
                self.notice(
                    NoteKind::Error,
                    format!("sign-offs: operator data not hashed: {e:#}"),
                );
            }
        }
        match log {
            Ok(log) => {
                let chain = log.read();
                self.signoffs.log = Some(log);
                self.take_chain(chain.map_err(|e| e.to_string()));
            }
            Err(e) => {
                self.signoffs.unavailable = Some(format!("{e:#}"));
                self.notice(NoteKind::Error, format!("sign-offs: {e:#}"));
            }
        }
    }

    /// The log read again after it changed on disk: a record written elsewhere (the
    /// head moved past what the board holds) is said; the board's own, read back,
    /// is not.
    pub(super) fn log_read(&mut self, chain: Result<Chain, String>) {
        let before = self.signoffs.chain.as_ref().and_then(Chain::head);
        if let Ok(c) = &chain {
            let now = c.head();
            if now != before
                && let Some(h) = &now
            {
                let new = h.seq.saturating_sub(before.as_ref().map_or(0, |b| b.seq));
                self.notice(
                    NoteKind::Info,
                    format!(
                        "sign-off log changed on disk (another board or `rhoboard signoff`): read, {new} new record(s), newest #{}",
                        h.seq
                    ),
                );
            }
        }
        self.take_chain(chain);
    }

    /// A chain read by the event loop (or at load).
    pub(super) fn take_chain(&mut self, chain: Result<Chain, String>) {
        match chain {
            Ok(c) => {
                if !c.is_sound() {
                    let text = LogLine::of(&c).text();
                    self.notice(NoteKind::Error, text);
                }
                self.signoffs.chain = Some(c);
                self.signoffs.unavailable = None;
            }
            Err(e) => {
                self.notice(NoteKind::Error, format!("sign-off log not read: {e}"));
                self.signoffs.unavailable = Some(e);
            }
        }
        // Sign-offs found needing a re-check (at load, or since the last read) are listed.
        self.restand(true);
    }

    /// Recomputes every leg's standing; with `announce`, a sign-off newly needing a
    /// re-check goes into the change list.
    pub(super) fn restand(&mut self, announce: bool) {
        let marks: Vec<Mark> = match &self.signoffs.chain {
            None => vec![Mark::Unsigned; self.assessment.legs.len()],
            Some(chain) => self
                .assessment
                .legs
                .iter()
                .map(|r| match signoff::standing(chain, &self.ops, r) {
                    Standing::Unsigned => Mark::Unsigned,
                    Standing::Signed(e) => Mark::Signed {
                        seq: e.record.seq,
                        instructor: e.record.instructor.clone(),
                    },
                    Standing::Recheck(e, why) => Mark::Recheck {
                        seq: e.record.seq,
                        instructor: e.record.instructor.clone(),
                        why,
                    },
                })
                .collect(),
        };
        if announce {
            let old = std::mem::take(&mut self.signoffs.marks);
            for (k, m) in marks.iter().enumerate() {
                let Mark::Recheck { seq, why, .. } = m else {
                    continue;
                };
                let id = self.assessment.legs[k].id.clone();
                // Compared by leg id: the rows may have been rebuilt.
                let was_recheck = self.assessment.legs.iter().zip(old.iter()).any(|(r, o)| {
                    r.id == id && matches!(o, Mark::Recheck { seq: s, .. } if s == seq)
                });
                if !was_recheck {
                    self.notice(
                        NoteKind::Change(crate::assess::State::Thin),
                        format!("{id} sign-off #{seq} needs a re-check: {}", why.join("; ")),
                    );
                }
            }
        }
        self.signoffs.marks = marks;
    }

    /// The mark of a leg (index into `Assessment::legs`).
    pub fn mark(&self, k: usize) -> &Mark {
        self.signoffs.marks.get(k).unwrap_or(&Mark::Unsigned)
    }

    /// `S`: opens the confirmation for the selected leg.
    pub(super) fn open_sign(&mut self) {
        if self.ui.pane != super::app::Pane::Legs {
            self.notice(
                NoteKind::Info,
                "S signs off a leg: choose one in the Legs pane (Tab)".into(),
            );
            return;
        }
        let Some(&k) = self.rows().get(self.ui.leg_row) else {
            self.notice(NoteKind::Info, "sign-off: no leg selected".into());
            return;
        };
        let Some(shown) = self.assessment.legs.get(k) else {
            return;
        };
        // The basis is the leg assessed afresh at the board's clock, so the record's
        // report ages and staleness are as of its basis time (the board's own
        // re-check may be minutes old).
        let ctx = crate::assess::leg::Context {
            ops: &self.ops,
            model: self.model(),
            store: &self.store,
            at: self.clock,
        };
        let Some(result) = crate::assess::assess_leg(&ctx, shown.index) else {
            return;
        };
        let offers_override = !result.state.meets_minimums()
            && self
                .ops
                .operator
                .policy
                .sign_off
                .override_categories
                .contains(&result.category);
        let mut form = SignForm {
            leg: k,
            result,
            basis_at: self.clock,
            values: Default::default(),
            focus: 0,
            preview: Err(Refusal::NoInstructor),
            error: None,
            busy: false,
            offers_override,
            departed_warned: false,
        };
        self.preview_sign(&mut form);
        self.ui.mode = Mode::Sign(Box::new(form));
    }

    fn preview_sign(&self, f: &mut SignForm) {
        let empty = DataHashes {
            combined_sha256: String::new(),
            files: Vec::new(),
        };
        let data = self.signoffs.data.as_ref().unwrap_or(&empty);
        let over = if f.offers_override {
            f.values[2].trim()
        } else {
            ""
        };
        let req = Request {
            instructor: &f.values[0],
            note: f.values[1].trim(),
            override_reason: (!over.is_empty()).then_some(over),
            signed_at: self.wall,
            basis_at: f.basis_at,
            data,
        };
        f.preview = signoff::draft(&self.ops, &f.result, &req);
    }

    /// Keys in the confirmation form.
    pub(super) fn sign_key(&mut self, key: KeyEvent) {
        let Mode::Sign(mut f) = std::mem::replace(&mut self.ui.mode, Mode::Normal) else {
            return;
        };
        if f.busy {
            // Writing: keys wait (Esc still closes; the record may land anyway).
            if key.code != KeyCode::Esc {
                self.ui.mode = Mode::Sign(f);
            }
            return;
        }
        let n = f.fields();
        let before = f.values.clone();
        let form = &mut *f;
        match super::form::field_key(&mut form.values[..n], &mut form.focus, &key) {
            FieldKey::Cancel => return,
            FieldKey::Edited => {
                if f.values != before {
                    f.error = None;
                }
            }
            FieldKey::Submit => {
                self.preview_sign(&mut f);
                let departs = self
                    .ops
                    .legs
                    .get(f.result.index)
                    .map(|l| l.departs_utc())
                    .filter(|&at| at < self.clock);
                match (&f.preview, &self.signoffs.log, &self.signoffs.data) {
                    (Err(r), _, _) => f.error = Some(r.to_string()),
                    (Ok(_), Some(_), Some(_)) if departs.is_some() && !f.departed_warned => {
                        f.departed_warned = true;
                        f.error = departs.map(|at| {
                            super::replan::past_words(at, self.clock, super::replan::Past::Sign)
                        });
                    }
                    (Ok(_), None, _) => {
                        f.error = Some(format!(
                            "no sign-off log: {}",
                            self.signoffs
                                .unavailable
                                .clone()
                                .unwrap_or_else(|| "not set up".into())
                        ))
                    }
                    (Ok(_), _, None) => {
                        f.error = Some("the operator data could not be hashed".into())
                    }
                    (Ok(_), Some(_), Some(_)) => {
                        f.busy = true;
                        f.error = None;
                        let over = if f.offers_override {
                            f.values[2].trim().to_string()
                        } else {
                            String::new()
                        };
                        self.push_effect(Effect::Sign {
                            result: Box::new(f.result.clone()),
                            instructor: f.values[0].trim().to_string(),
                            note: f.values[1].trim().to_string(),
                            override_reason: (!over.is_empty()).then_some(over),
                            basis_at: f.basis_at,
                        });
                    }
                }
            }
        }
        if !f.busy {
            self.preview_sign(&mut f);
        }
        self.ui.mode = Mode::Sign(f);
    }

    /// The event loop's answer to [`Effect::Sign`].
    pub(super) fn signed(
        &mut self,
        outcome: Result<(u64, String), String>,
        chain: Result<Chain, String>,
    ) {
        let form = match std::mem::replace(&mut self.ui.mode, Mode::Normal) {
            Mode::Sign(f) => Some(f),
            other => {
                self.ui.mode = other;
                None
            }
        };
        match outcome {
            Ok((_seq, text)) => self.notice(NoteKind::Info, text),
            Err(e) => match form {
                Some(mut f) => {
                    f.busy = false;
                    f.error = Some(e);
                    self.ui.mode = Mode::Sign(f);
                }
                None => self.notice(NoteKind::Error, format!("sign-off: {e}")),
            },
        }
        self.take_chain(chain);
    }
}
