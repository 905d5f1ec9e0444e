//! The board's state and its one `update`: every event arrives as a [`Msg`]; `update`
//! changes plain data and does no I/O, so tests drive it with a fixed clock.

use std::collections::{HashMap, VecDeque};
use std::path::PathBuf;
use std::time::Duration;

use chrono::{DateTime, DurationRound, TimeDelta, Utc};
use ratatui::crossterm::event::{KeyCode, KeyEvent, KeyModifiers};

use super::form::{FieldKey, Form, field_key};
use super::keys::{Action, action_for, is_ctrl_c};
use super::runway_form::RunwayForm;
use crate::assess::{Assessment, Change, Context, DaySettings, LegResult, Model, State};
use crate::observation::{FileReport, Insert, Report, Store};
use crate::ops::runway_state::{EndState, RunwayStateFile};
use crate::ops::{Category, Leg, Ops};

/// Simulated seconds per real second at pace ×1: one simulated hour in ten seconds.
pub const REPLAY_RATE: f64 = 360.0;
/// How long (real time) a leg whose state changed stays marked.
pub const FLASH_FOR: Duration = Duration::from_secs(30);
/// How often (board clock) every leg is re-checked for staleness with no new report.
pub const REFRESH_EVERY: TimeDelta = TimeDelta::minutes(5);
/// Notes kept in the change list.
const NOTES_KEPT: usize = 200;
/// Reports kept in the Reports pane.
const RECEIVED_KEPT: usize = 500;

/// Everything that can happen to the board.
#[derive(Debug, Clone)]
pub enum Msg {
    /// A key press.
    Key(KeyEvent),
    /// A mouse click at (column, row).
    Click(u16, u16),
    /// The terminal's new size.
    Resize(u16, u16),
    /// Time passed: the wall clock now, and real time since the last tick.
    Tick {
        /// Wall clock (the board's clock when live).
        now: DateTime<Utc>,
        /// Real time since the previous tick (drives the replay clock).
        elapsed: Duration,
    },
    /// Reports read by a feed (a file of the observations folder, or the feed command).
    Observations {
        /// Where they came from, for the Reports pane.
        source: String,
        /// The decoded reports.
        reports: Vec<FileReport>,
    },
    /// A feed failed (the board keeps running and says so).
    FeedError {
        /// Which feed.
        source: String,
        /// What went wrong.
        error: String,
    },
    /// The folder feed read a runway-state file that changed on disk (another process,
    /// e.g. `rhoboard runway`): the day's whole state.
    RunwayStateRead {
        /// The file, for the note.
        source: String,
        /// The state it now holds.
        state: RunwayStateFile,
    },
    /// The sign-off log changed on disk (another board, or `rhoboard signoff`): the
    /// chain read again.
    LogRead(Result<crate::signoff::Chain, String>),
    /// Quit (SIGTERM, SIGHUP, or the input thread ending): exit 0.
    Quit,
    /// The user interrupted (SIGINT): quit, exit 130.
    Interrupt,
    /// The event loop did an [`Effect`](super::effects::Effect): its result.
    Done(super::effects::Done),
}

/// The panes, in Tab order.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Pane {
    /// Today's legs (with the detail beside them on wide terminals).
    Legs,
    /// Aircraft × airfield matrix.
    Pairings,
    /// Airfields and their latest weather.
    Airfields,
    /// The aircraft.
    Fleet,
    /// Reports as received.
    Reports,
}

impl Pane {
    /// Every pane in Tab order.
    pub const ALL: [Pane; 5] = [
        Pane::Legs,
        Pane::Pairings,
        Pane::Airfields,
        Pane::Fleet,
        Pane::Reports,
    ];

    /// The pane's name on its tab.
    pub const fn title(self) -> &'static str {
        match self {
            Pane::Legs => "Legs",
            Pane::Pairings => "Pairings",
            Pane::Airfields => "Airfields",
            Pane::Fleet => "Fleet",
            Pane::Reports => "Reports",
        }
    }

    /// The pane's name on a narrow terminal's tab (below [`Pane::SHORT_BELOW`]
    /// columns), leaving room for the filter and the row count.
    pub const fn short_title(self) -> &'static str {
        match self {
            Pane::Legs => "Legs",
            Pane::Pairings => "Pairs",
            Pane::Airfields => "Fields",
            Pane::Fleet => "Fleet",
            Pane::Reports => "Reps",
        }
    }

    /// Terminals narrower than this show the short tab names.
    pub const SHORT_BELOW: u16 = 72;

    /// The tab's name at this terminal width.
    pub const fn tab_title(self, width: u16) -> &'static str {
        if width < Pane::SHORT_BELOW {
            self.short_title()
        } else {
            self.title()
        }
    }

    fn step(self, by: isize) -> Pane {
        let i = Pane::ALL.iter().position(|p| *p == self).unwrap_or(0) as isize;
        let n = Pane::ALL.len() as isize;
        Pane::ALL[(i + by).rem_euclid(n) as usize]
    }
}

/// How the legs are ordered.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Sort {
    /// By departure time.
    Time,
    /// Worst state first (below, no-data, thin, within), then time.
    State,
    /// Smallest margin ÷ thin buffer first (a unit-free score, so %, kt and ft
    /// compare; no-data legs right after the below ones), then time.
    Margin,
}

impl Sort {
    /// Word on screen.
    pub const fn word(self) -> &'static str {
        match self {
            Sort::Time => "time",
            Sort::State => "state",
            Sort::Margin => "margin ÷ buffer",
        }
    }
}

/// What keys type into.
#[derive(Debug, Clone, PartialEq)]
pub enum Mode {
    /// Keys are actions.
    Normal,
    /// Keys type the filter.
    Filter,
    /// The help overlay.
    Help,
    /// The manual-observation form.
    Form(Box<Form>),
    /// The sign-off confirmation (`S`).
    Sign(Box<super::signoff::SignForm>),
    /// The what-if panel of a leg (`e`).
    Replan(Box<super::replan::ReplanUi>),
    /// A save met a legs file changed on disk: keep theirs or apply ours onto theirs.
    Conflict,
    /// Quit asked with changes pending.
    ConfirmQuit,
    /// The runway-state form.
    Runway(Box<RunwayForm>),
}

/// What the detail shows.
#[derive(Debug, Clone)]
pub enum DetailOf {
    /// A leg of the day (index into `Assessment::legs`).
    Leg(usize),
    /// A pairing, assessed as a local flight of that aircraft at that airfield.
    Pairing(Box<PairingDetail>),
}

/// A pairing opened from the matrix.
#[derive(Debug, Clone)]
pub struct PairingDetail {
    /// Heading: which aircraft, where, as what.
    pub title: String,
    /// The assessment of the synthetic local flight.
    pub result: LegResult,
}

/// Cursor positions and what is open.
#[derive(Debug, Clone)]
pub struct Ui {
    /// The pane shown.
    pub pane: Pane,
    /// What keys do.
    pub mode: Mode,
    /// Order of the legs.
    pub sort: Sort,
    /// Filter text (case-insensitive substring).
    pub filter: String,
    /// Row of the legs cursor (in the filtered, sorted rows).
    pub leg_row: usize,
    /// Pairings cursor: (row in `matrix.aircraft`, airfield).
    pub pair: (usize, usize),
    /// Airfields cursor.
    pub field_row: usize,
    /// Fleet cursor.
    pub fleet_row: usize,
    /// Reports cursor.
    pub report_row: usize,
    /// Whether the detail is open (narrow: instead of the pane; wide: focused).
    pub detail_open: bool,
    /// A pairing's detail, when one was opened from the matrix.
    pub pairing: Option<Box<PairingDetail>>,
    /// Lines scrolled in the detail.
    pub detail_scroll: u16,
    /// The furthest the detail scrolls at its last drawing (its wrapped lines less the
    /// lines in view), so scrolling stops at the last line. Set by the view.
    pub detail_scroll_max: std::cell::Cell<u16>,
    /// Lines scrolled in the help.
    pub help_scroll: u16,
}

/// A line of the change list.
#[derive(Debug, Clone, PartialEq)]
pub struct Note {
    /// Board clock when it happened.
    pub at: DateTime<Utc>,
    /// Kind.
    pub kind: NoteKind,
    /// Text.
    pub text: String,
}

/// Kinds of note.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum NoteKind {
    /// A leg changed state; the new state.
    Change(State),
    /// Something went wrong (a feed, a file, a form).
    Error,
    /// Information (replay stepped, report added by hand).
    Info,
}

/// A report as received, for the Reports pane.
#[derive(Debug, Clone, PartialEq)]
pub struct Received {
    /// Board clock when it arrived.
    pub at: DateTime<Utc>,
    /// Where from.
    pub source: String,
    /// The text.
    pub text: String,
    /// `None` if stored, else why it was rejected.
    pub rejected: Option<String>,
    /// Stored in place of an earlier report of the same station and time.
    pub replaced: bool,
    /// Groups of a stored report not understood (kept, not fatal).
    pub not_understood: Vec<String>,
}

/// A report and its line in its file, where it has one.
type LinedReport = (Option<usize>, Report);

/// How the note of a replay step back starts.
const STEPPED_BACK: &str = "stepped back to";

/// The replay of a day on a simulated clock.
#[derive(Debug, Clone)]
pub struct Replay {
    /// The day's reports, oldest first.
    pub queue: Vec<Report>,
    /// How many of `queue` the store has.
    pub fed: usize,
    /// Paused.
    pub paused: bool,
    /// Pace multiplier (×1 = one simulated hour per ten seconds).
    pub speed: f64,
    /// Where the replay started.
    pub start: DateTime<Utc>,
    /// Simulated time not yet applied (sub-second remainders).
    carry_ms: f64,
    /// [`Replay::end`].
    end_at: DateTime<Utc>,
}

impl Replay {
    /// A replay of `reports` starting at `start`, at pace `speed`.
    pub fn new(mut reports: Vec<Report>, start: DateTime<Utc>, speed: f64) -> Replay {
        reports.retain(|r| r.observed_at.is_some() || r.rejection().is_some());
        reports.sort_by_key(|r| r.observed_at);
        let last = reports
            .iter()
            .filter_map(|r| r.observed_at)
            .max()
            .map_or(start, |t| t.max(start));
        let midnight = last.duration_trunc(TimeDelta::days(1)).unwrap_or(last);
        let end_at = midnight + TimeDelta::days(1) - TimeDelta::minutes(1);
        Replay {
            end_at,
            queue: reports,
            fed: 0,
            paused: false,
            speed: if speed.is_finite() && speed > 0.0 {
                speed
            } else {
                1.0
            },
            start,
            carry_ms: 0.0,
        }
    }

    /// Where the replay ends: the last minute (23:59Z) of the UTC day of its last
    /// report, or of the day it starts on when it has none timed later. The clock
    /// stops there rather than run on into a day with no reports.
    pub fn end(&self) -> DateTime<Utc> {
        self.end_at
    }
}

/// Settings fixed at start.
#[derive(Debug, Clone)]
pub struct Settings {
    /// Colours allowed (`NO_COLOR` unset).
    pub color: bool,
    /// Ring the terminal bell when a leg becomes `below`.
    pub bell: bool,
    /// Whether this is the built-in demo.
    pub demo: bool,
    /// Live board with `--at`: the clock runs from that time (wall clock + this).
    pub live_offset: Option<TimeDelta>,
    /// The operator folder, where the runway state is written (none: kept in memory).
    pub ops_dir: Option<PathBuf>,
}

impl Default for Settings {
    fn default() -> Self {
        Settings {
            color: true,
            bell: false,
            demo: false,
            live_offset: None,
            ops_dir: None,
        }
    }
}

/// The board's whole state.
pub struct App {
    /// The operator.
    pub ops: Ops,
    model: Model,
    /// The observations known.
    pub store: Store,
    /// Legs and pairings, kept current.
    pub assessment: Assessment,
    /// The board's clock: the wall clock when live, the simulated one in replay.
    pub clock: DateTime<Utc>,
    /// The replay, if replaying.
    pub replay: Option<Replay>,
    /// Cursors, pane and mode.
    pub ui: Ui,
    /// The change list, newest first.
    pub notes: VecDeque<Note>,
    /// Reports as received, newest first.
    pub received: VecDeque<Received>,
    /// Legs (index into `Ops::legs`) marked as changed, until this much real time.
    pub flash: HashMap<usize, Duration>,
    /// Real time the board has run (from ticks).
    pub uptime: Duration,
    /// Fixed settings.
    pub settings: Settings,
    /// The terminal's size.
    pub size: (u16, u16),
    /// Set when the board should end.
    pub quit: bool,
    /// The user interrupted (Ctrl-C, SIGINT): the board exits 130, not 0.
    pub interrupted: bool,
    /// Hand-entered reports (kept across a replay step back).
    manual: Vec<Report>,
    /// Visible legs: indices into `assessment.legs`, filtered and sorted.
    rows: Vec<usize>,
    last_refresh: DateTime<Utc>,
    /// The UTC date whose legs are on the board.
    day: chrono::NaiveDate,
    bell_pending: bool,
    /// Set when something visible changed since the last draw.
    dirty: bool,
    /// Sign-offs: the log, its chain, each leg's standing.
    pub signoffs: super::signoff::Signoffs,
    /// The forecast look-ahead, parallel to `assessment.legs`.
    pub forecast: Vec<Option<crate::assess::lookahead::LookAhead>>,
    /// What-if changes pending, and how to save them.
    pub plan: super::replan::Plan,
    /// I/O asked for by `update` (sign-offs, legs files, runway state), for the event
    /// loop: `update` does none itself.
    effects: Vec<super::effects::Effect>,
    /// The real clock at the last tick (a sign-off's `signed_at` preview).
    pub wall: DateTime<Utc>,
}

fn category_word(c: Category) -> &'static str {
    match c {
        Category::StudentSolo => "stu solo",
        Category::Solo => "solo",
        Category::Dual => "dual",
        Category::Charter => "charter",
    }
}

/// Short words for a pilot category on the board.
pub fn category_short(c: Category) -> &'static str {
    category_word(c)
}

impl App {
    /// A board on `ops` with the observations in `store`, at `clock`; with `replay`,
    /// the store is filled from the replay's reports up to `clock` instead.
    pub fn new(
        ops: Ops,
        store: Store,
        clock: DateTime<Utc>,
        replay: Option<Replay>,
        settings: Settings,
    ) -> App {
        let model = Model::new(&ops, &DaySettings::for_date(&ops, clock.date_naive()));
        let legs = crate::commands::check::legs_of_day(&ops, clock);
        let ctx = Context {
            ops: &ops,
            model: &model,
            store: &store,
            at: clock,
        };
        let assessment = Assessment::new(&ctx, legs);
        let mut app = App {
            ops,
            model,
            store,
            assessment,
            clock,
            replay,
            ui: Ui {
                pane: Pane::Legs,
                mode: Mode::Normal,
                sort: Sort::Time,
                filter: String::new(),
                leg_row: 0,
                pair: (0, 0),
                field_row: 0,
                fleet_row: 0,
                report_row: 0,
                detail_open: false,
                pairing: None,
                detail_scroll: 0,
                detail_scroll_max: std::cell::Cell::new(u16::MAX),
                help_scroll: 0,
            },
            notes: VecDeque::new(),
            received: VecDeque::new(),
            flash: HashMap::new(),
            uptime: Duration::ZERO,
            settings,
            size: (80, 24),
            quit: false,
            interrupted: false,
            manual: Vec::new(),
            rows: Vec::new(),
            last_refresh: clock,
            day: clock.date_naive(),
            bell_pending: false,
            dirty: true,
            signoffs: Default::default(),
            forecast: Vec::new(),
            plan: Default::default(),
            effects: Vec::new(),
            wall: clock,
        };
        if app.replay.is_some() {
            app.rebuild_store();
        } else {
            // Seed the Reports pane with each station's report valid at the clock (a
            // live board run `--at` an earlier time knows nothing later).
            let mut latest: Vec<Report> = app
                .store
                .stations()
                .iter()
                .filter_map(|s| app.store.valid_at(s, app.clock).map(|v| v.report.clone()))
                .collect();
            latest.sort_by_key(|r| r.observed_at);
            for r in latest {
                app.log_received("on load", &r, None, false);
            }
        }
        app.rebuild_rows();
        if app.replay.is_none() {
            // (A replay's `rebuild_store` has done it already.)
            app.reassessed();
        }
        app
    }

    /// Queues work for the event loop.
    pub(super) fn push_effect(&mut self, e: super::effects::Effect) {
        self.effects.push(e);
    }

    /// Takes the queued work (the event loop performs each with
    /// [`effects::perform`](super::effects::perform) and sends back its `Msg::Done`).
    pub fn take_effects(&mut self) -> Vec<super::effects::Effect> {
        std::mem::take(&mut self.effects)
    }

    /// After the assessment changed: the look-ahead, the sign-off standings, the what-if.
    fn reassessed(&mut self) {
        self.relook();
        self.restand(true);
        if self.plan.pending() {
            self.replan();
        }
    }

    /// Re-assesses every leg of the day from the operator's (changed) legs.
    pub(super) fn reassess_all(&mut self) {
        let legs = crate::commands::check::legs_of_day(&self.ops, self.clock);
        let ctx = Context {
            ops: &self.ops,
            model: &self.model,
            store: &self.store,
            at: self.clock,
        };
        self.assessment = Assessment::new(&ctx, legs);
        self.flash.clear();
        self.dirty = true;
        self.rebuild_rows();
        self.reassessed();
    }

    /// The built-in demo day in replay, starting at `start` (tests and `rhoboard`).
    pub fn demo(start: DateTime<Utc>, settings: Settings) -> anyhow::Result<App> {
        let ops = crate::ops::demo::load()
            .ops
            .ok_or_else(|| anyhow::anyhow!("the built-in demo failed its own checks"))?;
        let reports = replay_reports(&ops, start);
        let store = Store::new(stale_after(&ops));
        let replay = Replay::new(reports, start, 1.0);
        Ok(App::new(
            ops,
            store,
            start,
            Some(replay),
            Settings {
                demo: true,
                ..settings
            },
        ))
    }

    /// Visible legs: indices into `assessment.legs`, filtered and sorted.
    pub fn rows(&self) -> &[usize] {
        &self.rows
    }

    /// The leg under the cursor.
    pub fn selected_leg(&self) -> Option<&LegResult> {
        let k = *self.rows.get(self.ui.leg_row)?;
        self.assessment.legs.get(k)
    }

    /// What the detail shows now.
    pub fn detail_of(&self) -> Option<DetailOf> {
        if let Some(p) = &self.ui.pairing {
            return Some(DetailOf::Pairing(p.clone()));
        }
        self.rows.get(self.ui.leg_row).map(|&k| DetailOf::Leg(k))
    }

    /// Takes the pending bell (the event loop rings it).
    pub fn take_bell(&mut self) -> bool {
        std::mem::take(&mut self.bell_pending)
    }

    /// The compiled operator with today's runway state.
    pub fn model(&self) -> &Model {
        &self.model
    }

    /// The UTC date whose legs are on the board.
    pub fn day(&self) -> chrono::NaiveDate {
        self.day
    }

    /// The runway in use at airfield `fi` now, as the pairings found it (index into
    /// the field's runway ends).
    pub fn field_end_in_use(&self, fi: usize) -> Option<usize> {
        let m = &self.assessment.matrix;
        (0..m.aircraft.len())
            .find_map(|ai| m.cell(ai, fi).end_in_use)
            .map(usize::from)
    }

    /// Takes the redraw flag.
    pub fn take_dirty(&mut self) -> bool {
        std::mem::take(&mut self.dirty)
    }

    /// The newest report in the store (station and time).
    pub fn newest_report(&self) -> Option<&Report> {
        self.store
            .stations()
            .iter()
            .filter_map(|s| self.store.valid_at(s, self.clock))
            .map(|v| v.report)
            .max_by_key(|r| r.observed_at)
    }

    /// Whether the leg (index into `Ops::legs`) is marked as changed.
    pub fn flashing(&self, leg: usize) -> bool {
        self.flash
            .get(&leg)
            .is_some_and(|until| *until > self.uptime)
    }

    /// Changes state for one message. No I/O.
    pub fn update(&mut self, msg: Msg) {
        match msg {
            Msg::Key(key) => {
                self.dirty = true;
                self.on_key(key);
            }
            Msg::Click(col, row) => {
                self.dirty = true;
                self.on_click(col, row);
            }
            Msg::Resize(w, h) => {
                self.dirty = true;
                self.size = (w, h);
            }
            Msg::Tick { now, elapsed } => {
                self.wall = now;
                self.on_tick(now, elapsed)
            }
            Msg::Observations { source, reports } => {
                let reports: Vec<(Option<usize>, Report)> = reports
                    .into_iter()
                    .map(|r| (Some(r.line), r.report))
                    .collect();
                self.take_reports_at(&source, reports);
            }
            Msg::FeedError { source, error } => {
                let text = format!("{source}: {error}");
                // A feed that keeps failing the same way says so once.
                if self.notes.front().is_none_or(|n| n.text != text) {
                    self.note(NoteKind::Error, text);
                }
            }
            Msg::LogRead(chain) => self.log_read(chain),
            // What the board holds already (its own save, read back) changes nothing.
            Msg::RunwayStateRead { source, state } => {
                if !self.ops.runway_states.contains(&state)
                    && (!state.entries.is_empty()
                        || self.ops.runway_states.iter().any(|s| s.date == state.date))
                {
                    self.note(NoteKind::Info, format!("{source}: changed on disk, read"));
                    self.apply_runway_state(state, &source);
                } else if self
                    .notes
                    .iter()
                    .find(|n| n.text.starts_with(&format!("{source}: ")))
                    .is_some_and(|n| n.kind == NoteKind::Error)
                {
                    // Mended back to what the board holds: say so, or the error would
                    // stand as the file's last word.
                    self.note(
                        NoteKind::Info,
                        format!("{source}: reads again; the runway state is as before"),
                    );
                }
            }
            Msg::Quit => self.quit = true,
            Msg::Interrupt => {
                self.interrupted = true;
                self.quit = true;
            }
            Msg::Done(done) => {
                self.dirty = true;
                match done {
                    super::effects::Done::Signed { outcome, chain } => self.signed(outcome, chain),
                    super::effects::Done::Saved(o) => self.saved(o),
                    super::effects::Done::RunwayState { what, result } => {
                        self.runway_saved(&what, result)
                    }
                }
            }
        }
    }

    /// The event loop's answer to [`Effect::SaveRunwayState`](super::effects::Effect).
    fn runway_saved(&mut self, what: &str, result: Result<(PathBuf, RunwayStateFile), String>) {
        // The answer replaces the "saving…" line (it would stand as a save under way).
        let saving = format!("{what}: saving…");
        self.notes.retain(|n| n.text != saving);
        match result {
            Ok((path, state)) => {
                // The legs' changes first, so the line saying where it went is on top.
                self.apply_runway_state(state, what);
                self.note(
                    NoteKind::Info,
                    format!("{what}: saved in {}", path.display()),
                );
            }
            Err(e) => self.note(
                NoteKind::Error,
                format!("{what}: not saved, nothing changed: {e}"),
            ),
        }
    }

    /// Puts the day's runway state into the operator data, recompiles the model and
    /// re-checks every leg, listing what changed under `label`.
    fn apply_runway_state(&mut self, state: RunwayStateFile, label: &str) {
        let date = state.date;
        match self.ops.runway_states.iter_mut().find(|s| s.date == date) {
            Some(s) => *s = state,
            None => self.ops.runway_states.push(state),
        }
        if date != self.day {
            return;
        }
        self.model = Model::new(&self.ops, &DaySettings::for_date(&self.ops, self.day));
        let ctx = Context {
            ops: &self.ops,
            model: &self.model,
            store: &self.store,
            at: self.clock,
        };
        let changes = self.assessment.refresh(&ctx);
        self.last_refresh = self.clock;
        self.dirty = true;
        self.note_changes(label, changes);
        self.rebuild_rows();
        self.reassessed();
    }

    /// A submitted runway-state entry: written by the event loop to the operator
    /// folder, or on the built-in demo (no folder) kept in memory and said so.
    fn runway_entry(&mut self, entry: EndState) {
        // In the words the day's state uses ("open; wet", "closed from 1300Z", "in use"),
        // with the time it holds from (a closure says its own).
        let from = match (entry.closed, entry.from) {
            (Some(true), _) | (_, None) => String::new(),
            (_, Some(t)) => format!(" from {}", t.format("%H%MZ")),
        };
        let what = format!(
            "{} {}: {}{from}",
            entry.airfield,
            entry.end,
            crate::assess::model::describe(&entry)
        );
        match self.settings.ops_dir.clone() {
            Some(dir) if !self.settings.demo => {
                self.note(NoteKind::Info, format!("{what}: saving…"));
                self.push_effect(super::effects::Effect::SaveRunwayState {
                    dir,
                    date: self.day,
                    entry,
                    what,
                });
            }
            _ => {
                let mut state = self
                    .ops
                    .runway_states
                    .iter()
                    .find(|s| s.date == self.day)
                    .cloned()
                    .unwrap_or_else(|| RunwayStateFile::new(self.day));
                state.entries.push(entry);
                self.apply_runway_state(state, &what);
                self.note(
                    NoteKind::Info,
                    format!(
                        "{what}: kept in memory only — the built-in demo has no operator folder"
                    ),
                );
            }
        }
    }

    /// Adds a line to the change list (load warnings, hints).
    pub fn notice(&mut self, kind: NoteKind, text: String) {
        self.note(kind, text);
    }

    fn note(&mut self, kind: NoteKind, text: String) {
        self.dirty = true;
        self.notes.push_front(Note {
            at: self.clock,
            kind,
            text,
        });
        self.notes.truncate(NOTES_KEPT);
    }

    fn log_received(&mut self, source: &str, r: &Report, rejected: Option<String>, replaced: bool) {
        self.received.push_front(Received {
            at: self.clock,
            source: source.to_string(),
            text: r.text.clone(),
            rejected,
            replaced,
            not_understood: r.not_understood.iter().map(|g| g.group.clone()).collect(),
        });
        self.received.truncate(RECEIVED_KEPT);
    }

    /// Inserts reports, recomputes what they touch and lists the changes.
    fn take_reports(&mut self, source: &str, reports: Vec<Report>) {
        self.take_reports_at(source, reports.into_iter().map(|r| (None, r)).collect());
    }

    /// [`App::take_reports`] with each report's line in its file, where it has one (a
    /// rejection is named `observations/2026-06-14.txt:104`, as `check` names it).
    fn take_reports_at(&mut self, source: &str, reports: Vec<(Option<usize>, Report)>) {
        // Station by station, so a change is put down to the report that made it.
        let mut groups: Vec<(String, Vec<LinedReport>)> = Vec::new();
        for (line, r) in reports {
            match groups.iter_mut().find(|(s, _)| *s == r.station) {
                Some((_, g)) => g.push((line, r)),
                None => groups.push((r.station.clone(), vec![(line, r)])),
            }
        }
        // Many stations at once (a folder read at start): one full pass instead.
        let one_pass = groups.len() > 32;
        let mut any = false;
        // Every report goes into the store before any leg is re-assessed, so a leg
        // between two stations reported together never passes through a state that
        // neither report gives (the one end's old report stale while the other's new
        // one is read); each change is put down to the first station that made it.
        let mut touched: Vec<(String, String)> = Vec::new();
        for (station, group) in groups {
            let mut label = None;
            for (line, r) in group {
                // The note carries the board's time; name the report's own only if it differs.
                let this = match r.observed_at {
                    Some(t)
                        if t.format("%H%M").to_string()
                            != self.clock.format("%H%M").to_string() =>
                    {
                        format!("{} {}", r.station, t.format("%H%MZ"))
                    }
                    _ => r.station.clone(),
                };
                let copy = r.clone();
                match self.store.insert(r) {
                    Insert::Added { .. } => {
                        self.log_received(source, &copy, None, false);
                        label = Some(this);
                    }
                    Insert::Replaced => {
                        // A correction, a resend with a difference, or a hand report
                        // typed for the minute of a METAR: never silently.
                        if source != "on load" {
                            let when = copy
                                .observed_at
                                .map_or(String::new(), |t| format!(" {}", t.format("%H%MZ")));
                            self.note(
                                NoteKind::Info,
                                format!(
                                    "{source}: {}{when} replaces the report of the same station and time read before",
                                    copy.station
                                ),
                            );
                        }
                        self.log_received(source, &copy, None, true);
                        label = Some(this);
                    }
                    Insert::Duplicate | Insert::KeptCorrection => {}
                    Insert::Rejected(why) => {
                        self.dirty = true;
                        if source != "on load" {
                            let at = line.map_or(source.to_string(), |l| format!("{source}:{l}"));
                            self.note(NoteKind::Error, format!("{at}: rejected {why}"));
                        }
                        self.log_received(source, &copy, Some(why), false);
                    }
                }
            }
            let Some(label) = label else {
                continue;
            };
            any = true;
            touched.push((station, label));
        }
        if !one_pass {
            let mut all: Vec<(String, Change)> = Vec::new();
            for (station, label) in &touched {
                let ctx = Context {
                    ops: &self.ops,
                    model: &self.model,
                    store: &self.store,
                    at: self.clock,
                };
                let changes = self.assessment.on_report(&ctx, station);
                all.extend(changes.into_iter().map(|c| (label.clone(), c)));
            }
            // Put each change down to the report of the end that decides it now, where
            // that station reported in this batch.
            for (label, ch) in all {
                let deciding = self
                    .assessment
                    .legs
                    .iter()
                    .find(|r| r.index == ch.leg)
                    .and_then(|r| r.limiting_side())
                    .map(|side| side.airfield.clone());
                let label = deciding
                    .and_then(|f| touched.iter().find(|(s, _)| *s == f))
                    .map_or(label, |(_, l)| l.clone());
                self.note_changes(&label, vec![ch]);
            }
        }
        if !any {
            return;
        }
        self.dirty = true;
        if one_pass {
            let ctx = Context {
                ops: &self.ops,
                model: &self.model,
                store: &self.store,
                at: self.clock,
            };
            let changes = self.assessment.refresh(&ctx);
            self.last_refresh = self.clock;
            self.note_changes("", changes);
        }
        self.rebuild_rows();
        self.reassessed();
    }

    fn note_changes(&mut self, label: &str, changes: Vec<Change>) {
        for ch in changes {
            if ch.to == State::Below && ch.from != State::Below && self.settings.bell {
                self.bell_pending = true;
            }
            self.flash.insert(ch.leg, self.uptime + FLASH_FOR);
            let prefix = if label.is_empty() {
                "re-check".to_string()
            } else {
                label.to_string()
            };
            let why = if ch.why.is_empty() {
                String::new()
            } else {
                format!(": {}", super::display::Show::of(&self.ops).in_text(&ch.why))
            };
            self.note(
                NoteKind::Change(ch.to),
                format!(
                    "{prefix}: {} now {} {} (was {}){why}",
                    ch.id,
                    ch.to.glyph(),
                    ch.to.word(),
                    ch.from.word()
                ),
            );
        }
    }

    fn refresh(&mut self) {
        let ctx = Context {
            ops: &self.ops,
            model: &self.model,
            store: &self.store,
            at: self.clock,
        };
        let changes = self.assessment.refresh(&ctx);
        self.last_refresh = self.clock;
        if !changes.is_empty() {
            self.dirty = true;
            self.note_changes("", changes);
            self.reassessed();
        }
        self.rebuild_rows();
    }

    fn on_tick(&mut self, now: DateTime<Utc>, elapsed: Duration) {
        let before_flash = self.flash.values().filter(|u| **u > self.uptime).count();
        self.uptime += elapsed;
        let after_flash = self.flash.values().filter(|u| **u > self.uptime).count();
        if before_flash != after_flash {
            self.dirty = true;
            self.flash.retain(|_, u| *u > self.uptime);
        }
        let old = self.clock;
        match &mut self.replay {
            Some(rp) if !rp.paused => {
                let ms = elapsed.as_secs_f64() * 1000.0 * REPLAY_RATE * rp.speed + rp.carry_ms;
                let whole = ms.floor();
                rp.carry_ms = ms - whole;
                self.clock += TimeDelta::milliseconds(whole as i64);
            }
            Some(_) => {}
            None => self.clock = now + self.settings.live_offset.unwrap_or_default(),
        }
        self.stop_at_replay_end();
        if self.clock.format("%H%M").to_string() != old.format("%H%M").to_string() {
            self.dirty = true;
        }
        if self.clock != old {
            self.advance();
        }
    }

    /// A replay's clock stops (paused) at [`Replay::end`], with a note the first time.
    fn stop_at_replay_end(&mut self) {
        let Some(rp) = &mut self.replay else {
            return;
        };
        let end = rp.end();
        if self.clock < end {
            return;
        }
        let first = !rp.paused || self.clock > end;
        self.clock = end;
        rp.paused = true;
        rp.carry_ms = 0.0;
        if first {
            let text = format!(
                "the replay ends at {}: the last day of its reports is over (p steps back)",
                end.format("%Y-%m-%d %H%MZ")
            );
            self.note(NoteKind::Info, text);
        }
    }

    /// After the clock moved forward: feed due replay reports, re-check staleness.
    fn advance(&mut self) {
        if let Some(rp) = &mut self.replay {
            let start = rp.fed;
            let clock = self.clock;
            let pending = rp.queue.get(start..).unwrap_or_default();
            let due = pending
                .iter()
                .take_while(|r| r.observed_at.is_none_or(|t| t <= clock))
                .count();
            let batch: Vec<Report> = pending[..due].to_vec();
            rp.fed = start + due;
            if !batch.is_empty() {
                self.take_reports("replay", batch);
            }
        }
        if self.clock.date_naive() != self.day {
            self.new_day();
        } else if self.clock - self.last_refresh >= REFRESH_EVERY {
            self.refresh();
        }
    }

    /// The clock passed midnight UTC: the new date's legs replace the old.
    fn new_day(&mut self) {
        self.day = self.clock.date_naive();
        self.model = Model::new(&self.ops, &DaySettings::for_date(&self.ops, self.day));
        let legs = crate::commands::check::legs_of_day(&self.ops, self.clock);
        let n = legs.len();
        let ctx = Context {
            ops: &self.ops,
            model: &self.model,
            store: &self.store,
            at: self.clock,
        };
        self.assessment = Assessment::new(&ctx, legs);
        self.last_refresh = self.clock;
        self.flash.clear();
        self.ui.leg_row = 0;
        self.rebuild_rows();
        self.reassessed();
        let text = format!("a new UTC day: the {n} legs of {}", self.day);
        self.note(NoteKind::Info, text);
    }

    /// Replay: empties the store and refills it with the reports up to the clock.
    fn rebuild_store(&mut self) {
        let Some(rp) = &mut self.replay else {
            return;
        };
        self.store = Store::new(self.store.stale_after());
        let clock = self.clock;
        rp.fed = rp
            .queue
            .iter()
            .take_while(|r| r.observed_at.is_none_or(|t| t <= clock))
            .count();
        let replaced: Vec<bool> = rp.queue[..rp.fed]
            .iter()
            .map(|r| self.store.insert(r.clone()) == Insert::Replaced)
            .collect();
        // Hand-entered reports stay whatever their time: the store only answers with
        // reports at or before the time asked.
        for r in &self.manual {
            self.store.insert(r.clone());
        }
        self.received.clear();
        let shown: Vec<Report> = rp.queue[..rp.fed].to_vec();
        for (r, replaced) in shown.iter().zip(replaced) {
            let rej = r.rejection();
            self.log_received("replay", r, rej, replaced);
        }
        let ctx = Context {
            ops: &self.ops,
            model: &self.model,
            store: &self.store,
            at: self.clock,
        };
        self.day = self.clock.date_naive();
        let legs = crate::commands::check::legs_of_day(&self.ops, self.clock);
        self.assessment = Assessment::new(&ctx, legs);
        self.last_refresh = self.clock;
        self.dirty = true;
        self.reassessed();
    }

    fn rebuild_rows(&mut self) {
        let keep = self.rows.get(self.ui.leg_row).copied();
        let needle = self.ui.filter.to_lowercase();
        let ops = &self.ops;
        let mut rows: Vec<usize> = self
            .assessment
            .legs
            .iter()
            .enumerate()
            .filter(|(_, r)| needle.is_empty() || leg_matches(ops, r, &needle))
            .map(|(k, _)| k)
            .collect();
        let legs = &self.assessment.legs;
        let time = |k: usize| ops.legs.get(legs[k].index).map(Leg::departs_utc);
        match self.ui.sort {
            Sort::Time => rows.sort_by_key(|&k| (time(k), k)),
            Sort::State => rows.sort_by_key(|&k| (std::cmp::Reverse(legs[k].state), time(k), k)),
            Sort::Margin => rows.sort_by(|&a, &b| {
                // A leg that cannot be assessed comes right after the below ones (score
                // 0, the edge of missing), never last where it would be overlooked.
                let s = |k: usize| match (&legs[k].limiting, legs[k].state) {
                    (_, State::NoData) => 0.0,
                    (Some(l), _) if !l.score.is_nan() => l.score,
                    _ => f64::INFINITY,
                };
                s(a).total_cmp(&s(b))
                    .then_with(|| time(a).cmp(&time(b)))
                    .then(a.cmp(&b))
            }),
        }
        self.rows = rows;
        self.ui.leg_row = keep
            .and_then(|k| self.rows.iter().position(|&r| r == k))
            .unwrap_or(self.ui.leg_row)
            .min(self.rows.len().saturating_sub(1));
    }

    fn page(&self) -> usize {
        usize::from(self.size.1.saturating_sub(12)).max(1)
    }

    fn on_key(&mut self, key: KeyEvent) {
        if is_ctrl_c(&key) {
            // An interrupt, even when it first asks about pending changes: a quit
            // that follows it exits 130.
            self.interrupted = true;
            self.ask_quit();
            return;
        }
        match &mut self.ui.mode {
            Mode::Sign(_) => return self.sign_key(key),
            Mode::Replan(_) => return self.replan_key(key),
            Mode::Conflict => return self.conflict_key(key),
            Mode::ConfirmQuit => return self.confirm_quit_key(key),
            Mode::Filter => {
                match key.code {
                    KeyCode::Enter => self.ui.mode = Mode::Normal,
                    KeyCode::Esc => {
                        self.ui.filter.clear();
                        self.ui.mode = Mode::Normal;
                    }
                    KeyCode::Backspace => {
                        self.ui.filter.pop();
                    }
                    // Ctrl-U empties the line, as in a shell (Enter then keeps no filter).
                    KeyCode::Char('u') if key.modifiers.contains(KeyModifiers::CONTROL) => {
                        self.ui.filter.clear();
                    }
                    KeyCode::Char(ch) if !key.modifiers.contains(KeyModifiers::CONTROL) => {
                        self.ui.filter.push(ch);
                    }
                    _ => {}
                }
                self.ui.leg_row = 0;
                self.rebuild_rows();
                return;
            }
            Mode::Help => {
                match action_for(&key) {
                    Some(Action::Down) => {
                        self.ui.help_scroll = self.ui.help_scroll.saturating_add(1).min(200)
                    }
                    Some(Action::Up) => self.ui.help_scroll = self.ui.help_scroll.saturating_sub(1),
                    Some(Action::PageDown) => {
                        self.ui.help_scroll = self.ui.help_scroll.saturating_add(10).min(200)
                    }
                    Some(Action::PageUp) => {
                        self.ui.help_scroll = self.ui.help_scroll.saturating_sub(10)
                    }
                    Some(Action::Close | Action::Help | Action::Open | Action::Quit) => {
                        self.ui.mode = Mode::Normal;
                    }
                    _ => {}
                }
                return;
            }
            Mode::Form(_) | Mode::Runway(_) => return self.form_key(key),
            Mode::Normal => {}
        }
        if let Some(action) = action_for(&key) {
            self.act(action);
        }
    }

    /// A key on the open form (the report by hand, the runway state).
    fn form_key(&mut self, key: KeyEvent) {
        let (values, focus, errors) = match &mut self.ui.mode {
            Mode::Form(f) => (&mut f.values[..], &mut f.focus, &mut f.errors),
            Mode::Runway(f) => (&mut f.values[..], &mut f.focus, &mut f.errors),
            _ => return,
        };
        let at = *focus;
        let before = values.get(at).cloned();
        match field_key(values, focus, &key) {
            FieldKey::Edited => {
                if values.get(at) != before.as_ref() {
                    super::form::clear_stale(errors, at);
                }
            }
            FieldKey::Cancel => self.ui.mode = Mode::Normal,
            FieldKey::Submit => match std::mem::replace(&mut self.ui.mode, Mode::Normal) {
                Mode::Form(f) => self.submit_report(f),
                Mode::Runway(f) => self.submit_runway(f),
                other => self.ui.mode = other,
            },
        }
    }

    /// The report typed by hand: stored and assessed, or the form again with the
    /// cursor on the first field in error.
    fn submit_report(&mut self, mut f: Box<Form>) {
        match f.submit(&self.ops, self.clock) {
            Some(report) => {
                let label = report.label();
                self.manual.push(report.clone());
                self.note(NoteKind::Info, format!("{label}: added by hand"));
                self.take_reports("by hand", vec![report]);
            }
            None => {
                if let Some(first) = f.errors.iter().find_map(|(i, _)| *i) {
                    f.focus = first;
                }
                self.ui.mode = Mode::Form(f);
            }
        }
    }

    /// The runway-state entry: saved (or kept, on the demo), or the form again.
    fn submit_runway(&mut self, mut f: Box<RunwayForm>) {
        let now = (self.clock.date_naive() == self.day).then_some(self.clock);
        match f.submit(&self.ops, self.day, now) {
            Some(entry) => self.runway_entry(entry),
            None => self.ui.mode = Mode::Runway(f),
        }
    }

    /// Performs one keymap action.
    pub fn act(&mut self, action: Action) {
        self.dirty = true;
        let detail = self.ui.detail_open;
        match action {
            Action::Quit => self.ask_quit(),
            Action::SignOff => self.open_sign(),
            Action::WhatIf => self.open_replan(),
            Action::Write => self.plan_write(),
            Action::Undo => self.plan_undo(),
            Action::Help => {
                self.ui.help_scroll = 0;
                self.ui.mode = Mode::Help;
            }
            Action::Filter => {
                self.ui.pane = Pane::Legs;
                self.ui.detail_open = false;
                self.ui.pairing = None;
                self.ui.mode = Mode::Filter;
            }
            Action::Sort => {
                self.ui.sort = match self.ui.sort {
                    Sort::Time => Sort::State,
                    Sort::State => Sort::Margin,
                    Sort::Margin => Sort::Time,
                };
                self.rebuild_rows();
            }
            Action::ManualReport => {
                let station = match self.ui.pane {
                    Pane::Airfields => self.ops.airfields.get(self.ui.field_row),
                    Pane::Pairings => self.ops.airfields.get(self.ui.pair.1),
                    _ => self
                        .selected_leg()
                        .and_then(|r| self.ops.airfield(&r.departure.airfield)),
                }
                .map(|a| a.id.clone());
                self.ui.mode = Mode::Form(Box::new(Form::new(self.clock, station.as_deref())));
            }
            Action::RunwayState => {
                // The selected airfield, else the selected leg's departure; its end in use.
                let fi = match self.ui.pane {
                    Pane::Airfields => Some(self.ui.field_row),
                    Pane::Pairings => Some(self.ui.pair.1),
                    _ => self
                        .selected_leg()
                        .and_then(|r| self.ops.airfield_position(&r.departure.airfield)),
                };
                let field = fi.and_then(|fi| self.ops.airfields.get(fi));
                let end = match (self.ui.pane, self.selected_leg()) {
                    (Pane::Legs, Some(r)) => r.departure.runway.clone(),
                    _ => None,
                }
                .or_else(|| {
                    let fi = fi?;
                    let k = self.field_end_in_use(fi)?;
                    Some(field?.runway_ends.get(k)?.designator.clone())
                });
                self.ui.mode = Mode::Runway(Box::new(RunwayForm::new(
                    field.map(|f| f.id.as_str()),
                    end.as_deref(),
                )));
            }
            Action::Close => {
                if self.ui.detail_open || self.ui.pairing.is_some() {
                    self.ui.detail_open = false;
                    self.ui.pairing = None;
                    self.ui.detail_scroll = 0;
                } else if !self.ui.filter.is_empty() {
                    self.ui.filter.clear();
                    self.rebuild_rows();
                }
            }
            Action::NextPane | Action::PrevPane => {
                self.ui.pane = self
                    .ui
                    .pane
                    .step(if action == Action::NextPane { 1 } else { -1 });
                self.ui.detail_open = false;
                self.ui.pairing = None;
                self.ui.detail_scroll = 0;
            }
            Action::Open => self.open(),
            Action::Up | Action::Down | Action::PageUp | Action::PageDown if detail => {
                let by: i32 = match action {
                    Action::Up => -1,
                    Action::Down => 1,
                    Action::PageUp => -(self.page() as i32),
                    _ => self.page() as i32,
                };
                let max = i32::from(self.ui.detail_scroll_max.get().min(2000));
                self.ui.detail_scroll =
                    (i32::from(self.ui.detail_scroll) + by).clamp(0, max) as u16;
            }
            Action::Top if detail => self.ui.detail_scroll = 0,
            Action::Up => self.move_by(-1, 0),
            Action::Down => self.move_by(1, 0),
            Action::PageUp => self.move_by(-(self.page() as isize), 0),
            Action::PageDown => self.move_by(self.page() as isize, 0),
            Action::Top => self.move_by(-1_000_000, 0),
            Action::Bottom => self.move_by(1_000_000, 0),
            Action::Left => self.move_by(0, -1),
            Action::Right => self.move_by(0, 1),
            Action::Pause => match &mut self.replay {
                Some(rp) if rp.paused && self.clock >= rp.end() => {
                    let text = format!(
                        "the replay ended at {}: nothing to run on to (p steps back)",
                        rp.end().format("%H%MZ")
                    );
                    self.note(NoteKind::Info, text);
                }
                Some(rp) => rp.paused = !rp.paused,
                None => self.note(
                    NoteKind::Info,
                    "live board: pause, n and p work in replay (--replay FILE)".into(),
                ),
            },
            Action::Faster | Action::Slower => {
                if let Some(rp) = &mut self.replay {
                    rp.speed = if action == Action::Faster {
                        (rp.speed * 2.0).min(64.0)
                    } else {
                        (rp.speed / 2.0).max(0.125)
                    };
                }
            }
            Action::NextHour => self.step_hour(true),
            Action::PrevHour => self.step_hour(false),
        }
    }

    fn step_hour(&mut self, forward: bool) {
        if self.replay.is_none() {
            self.note(
                NoteKind::Info,
                "live board: n and p step the replay (--replay FILE)".into(),
            );
            return;
        }
        let floor = self
            .clock
            .duration_trunc(TimeDelta::hours(1))
            .unwrap_or(self.clock);
        if forward {
            self.clock = floor + TimeDelta::hours(1);
            self.stop_at_replay_end();
            self.advance();
            self.rebuild_rows();
        } else {
            // Just past a whole hour, "previous" means the one before it.
            let back = if self.clock - floor < TimeDelta::minutes(2) {
                floor - TimeDelta::hours(1)
            } else {
                floor
            };
            self.clock = back;
            self.rebuild_store();
            self.rebuild_rows();
            // The changes the replay listed after the new time are not known yet (they
            // come back as the clock passes them again), and one step-back note stands
            // for a run of them.
            self.notes
                .retain(|n| !(matches!(n.kind, NoteKind::Change(_)) && n.at > back));
            if self
                .notes
                .front()
                .is_some_and(|n| n.kind == NoteKind::Info && n.text.starts_with(STEPPED_BACK))
            {
                self.notes.pop_front();
            }
            let text = format!(
                "{STEPPED_BACK} {}: reports after it are not known yet",
                self.clock.format("%H%MZ")
            );
            self.note(NoteKind::Info, text);
        }
    }

    fn move_by(&mut self, down: isize, right: isize) {
        let step = |cur: usize, by: isize, len: usize| -> usize {
            if len == 0 {
                return 0;
            }
            (cur as isize + by).clamp(0, len as isize - 1) as usize
        };
        match self.ui.pane {
            Pane::Legs => {
                self.ui.leg_row = step(self.ui.leg_row, down, self.rows.len());
                self.ui.detail_scroll = 0;
            }
            Pane::Pairings => {
                let m = &self.assessment.matrix;
                self.ui.pair.0 = step(self.ui.pair.0, down, m.aircraft.len());
                self.ui.pair.1 = step(self.ui.pair.1, right, m.fields);
            }
            Pane::Airfields => {
                self.ui.field_row = step(self.ui.field_row, down, self.ops.airfields.len());
            }
            Pane::Fleet => {
                self.ui.fleet_row = step(self.ui.fleet_row, down, self.ops.aircraft.len());
            }
            Pane::Reports => {
                self.ui.report_row = step(self.ui.report_row, down, self.received.len());
            }
        }
    }

    fn open(&mut self) {
        match self.ui.pane {
            Pane::Legs => {
                if !self.rows.is_empty() {
                    self.ui.detail_open = true;
                    self.ui.detail_scroll = 0;
                }
            }
            Pane::Pairings => {
                let (ai, fi) = self.ui.pair;
                if let Some(p) = self.pairing_detail(ai, fi) {
                    self.ui.pairing = Some(Box::new(p));
                    self.ui.detail_open = true;
                    self.ui.detail_scroll = 0;
                }
            }
            Pane::Airfields | Pane::Fleet | Pane::Reports => {}
        }
    }

    /// A pairing's full chain (`Matrix::open`): the aircraft assessed as a local flight
    /// at the airfield at the board's time, with the cell's masses and category.
    pub fn pairing_detail(&self, ai: usize, fi: usize) -> Option<PairingDetail> {
        let a = *self.assessment.matrix.aircraft.get(ai)?;
        let aircraft = self.ops.aircraft.get(a)?;
        let field = self.ops.airfields.get(fi)?;
        let ctx = Context {
            ops: &self.ops,
            model: &self.model,
            store: &self.store,
            at: self.clock,
        };
        let result = self.assessment.matrix.open(&ctx, ai, fi)?;
        Some(PairingDetail {
            title: format!(
                "Pairing {} ({}) at {} — a local flight at {}, {} minimums, {}",
                aircraft.registration,
                aircraft.type_id,
                field.id,
                self.clock.format("%H%MZ"),
                result.category.words(),
                result
                    .takeoff_mass_kg
                    .map_or("no mass".to_string(), |m| super::display::Show::of(
                        &self.ops
                    )
                    .mass(m))
            ),
            result,
        })
    }

    fn on_click(&mut self, col: u16, row: u16) {
        let layout = super::layout::BoardLayout::build(
            ratatui::layout::Rect::new(0, 0, self.size.0, self.size.1),
            &super::layout::LayoutSettings::of(self),
        );
        let pos = ratatui::layout::Position::new(col, row);
        if layout.tabs.contains(pos) {
            // Tabs are laid out as " Name " segments separated by "│", short or full
            // as the view lays them out.
            let legs_rows = (self.ui.pane == Pane::Legs && !layout.detail_replaces_main())
                .then(|| usize::from(layout.main.height.saturating_sub(1)));
            let short = match self.ui.mode {
                Mode::Filter => layout.tabs.width < Pane::SHORT_BELOW,
                _ => super::view::tab_plan(self, layout.tabs.width, legs_rows).0,
            };
            let mut x = layout.tabs.x;
            for p in Pane::ALL {
                let title = if short {
                    p.short_title()
                } else {
                    p.tab_title(layout.tabs.width)
                };
                let w = title.chars().count() as u16 + 3;
                if col >= x && col < x + w {
                    self.ui.pane = p;
                    self.ui.detail_open = false;
                    self.ui.pairing = None;
                    return;
                }
                x += w;
            }
            return;
        }
        if layout.main.contains(pos) && self.ui.pane == Pane::Legs {
            // Row 0 is the header; the view scrolls so the cursor stays visible.
            let height = usize::from(layout.main.height.saturating_sub(1));
            let offset = super::view::scroll_offset(self.ui.leg_row, height);
            let r = usize::from(row - layout.main.y);
            if r >= 1 && offset + r - 1 < self.rows.len() {
                self.ui.leg_row = offset + r - 1;
                self.ui.detail_scroll = 0;
            }
        }
    }
}

/// Whether a leg matches the filter text: a substring of its id, aircraft, airfields,
/// pilot or category; its state word only from the word's start ("thin" finds the thin
/// legs, not the "within" ones; "no-" finds the no-data ones).
fn leg_matches(ops: &Ops, r: &LegResult, needle: &str) -> bool {
    let Some(leg) = ops.legs.get(r.index) else {
        return false;
    };
    r.state.word().to_lowercase().starts_with(needle)
        || [
            leg.id.as_str(),
            leg.aircraft.as_str(),
            leg.from.as_str(),
            leg.to.as_str(),
            leg.pilot.as_str(),
            category_word(leg.category),
        ]
        .iter()
        .any(|s| s.to_lowercase().contains(needle))
}

/// The store's stale age from the operator's policy.
pub fn stale_after(ops: &Ops) -> TimeDelta {
    TimeDelta::seconds((ops.operator.policy.stale_after_min * 60.0) as i64)
}

/// The reports a replay plays: the operator's observation texts, decoded against the
/// end of `day`'s UTC date.
pub fn replay_reports(ops: &Ops, day: DateTime<Utc>) -> Vec<Report> {
    let reference = end_of_day(day);
    ops.observations
        .iter()
        .filter(|(path, _)| path.starts_with("observations/"))
        .flat_map(|(_, text)| crate::observation::decode_all(text, reference))
        .map(|r| r.report)
        .collect()
}

/// The last second of `t`'s UTC date (the reference for decoding a day's METARs).
pub fn end_of_day(t: DateTime<Utc>) -> DateTime<Utc> {
    t.date_naive()
        .and_hms_opt(23, 59, 59)
        .map_or(t, |d| d.and_utc())
}
