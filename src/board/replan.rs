//! Re-planning on the board: what-if edits of the selected leg (aircraft, departure
//! time, destination, loads, fuel; cancel or copy), each applied to an in-memory copy
//! of the legs and re-assessed at once, shown old → new beside the original. Nothing
//! touches the files until `w`, which queues an [`Effect::SaveLegs`] for the event loop
//! (a save against the hash of the file as loaded: a file changed on disk meanwhile is
//! never overwritten — both versions are shown and the dispatcher chooses).

use std::collections::HashMap;
use std::path::{Path, PathBuf};

use chrono::{DateTime, NaiveTime, Utc};
use ratatui::crossterm::event::{KeyCode, KeyEvent, KeyModifiers};

use super::app::{App, Mode, NoteKind};
use super::display::Show;
use super::effects::{Effect, LegsSave, SaveOutcome};
use super::forecast::Progress;
use crate::assess::lookahead::LookAhead;
use crate::assess::{Context, LegResult, State};
use crate::ops::Leg;
use crate::ops::legs::LegsFile;
use crate::replan::{Edit, apply, content_hash};

/// One change of the plan.
#[derive(Debug, Clone, PartialEq)]
pub enum Step {
    /// An edit of the leg in a slot.
    Edit(Edit),
    /// Cancel the leg.
    Cancel,
    /// Copy the leg into a new slot (a new leg id).
    Copy,
}

/// A change, with the slot it applies to and its words.
#[derive(Debug, Clone, PartialEq)]
pub struct Planned {
    /// The slot (an index into `Ops::legs`, or past its end for copies).
    pub slot: usize,
    /// The change.
    pub step: Step,
    /// In words: "L16: departure 12:30Z → 06:30Z".
    pub label: String,
}

/// Where a slot's leg came from.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Origin {
    /// The operator's leg at this index of `Ops::legs`.
    Original(usize),
    /// A copy of the operator's leg at this index.
    CopyOf(usize),
}

/// A leg as planned.
#[derive(Debug, Clone, PartialEq)]
pub struct Slot {
    /// The leg.
    pub leg: Leg,
    /// Where it came from.
    pub origin: Origin,
    /// Cancelled.
    pub cancelled: bool,
}

/// A day legs file as loaded (the base of a save).
#[derive(Debug, Clone, PartialEq)]
pub struct LoadedFile {
    /// Full path.
    pub path: PathBuf,
    /// Its text as loaded.
    pub text: String,
    /// The hash of that text.
    pub hash: String,
}

/// A leg's figures for the comparison.
#[derive(Debug, Clone, PartialEq)]
pub struct Figures {
    /// State.
    pub state: State,
    /// Limiting check.
    pub limiting: String,
    /// Its margin.
    pub margin: String,
    /// Headroom.
    pub headroom: String,
    /// The forecast, in words.
    pub forecast: String,
}

impl Figures {
    fn of(r: &LegResult, look: Option<&LookAhead>, show: Show, progress: Progress) -> Figures {
        Figures {
            state: r.state,
            limiting: r.limiting.as_ref().map_or_else(
                || r.reasons.first().cloned().unwrap_or_else(|| "—".into()),
                |l| l.check.clone(),
            ),
            margin: r.limiting.as_ref().map_or("—".into(), |l| l.margin.clone()),
            headroom: super::view::headroom_cell(show, r),
            forecast: super::forecast::summary(look, r.state, progress),
        }
    }
}

/// One changed leg, old beside new.
#[derive(Debug, Clone, PartialEq)]
pub struct Compared {
    /// The slot.
    pub slot: usize,
    /// Leg id (as planned).
    pub id: String,
    /// What changed, in words.
    pub what: Vec<String>,
    /// Before (none for a copy).
    pub old: Option<Figures>,
    /// After (none when cancelled).
    pub new: Option<Figures>,
    /// What `validate` would say of it in the whole plan ([`App::plan_vetting`]):
    /// shown in the what-if panel; `w` writes nothing while it refuses.
    pub vetting: crate::replan::Vetting,
}

/// A save that met a file changed on disk.
#[derive(Debug, Clone, PartialEq)]
pub struct Conflict {
    /// Relative path of the file.
    pub rel: String,
    /// Its text on disk now.
    pub on_disk: String,
    /// Per affected leg id: as loaded, theirs (on disk), ours (planned), in words.
    pub legs: Vec<(String, String, String, String)>,
}

/// The re-planning side of the board.
#[derive(Debug, Clone, Default)]
pub struct Plan {
    /// The changes, oldest first (`u` undoes the last).
    pub steps: Vec<Planned>,
    /// The legs as planned (derived from `Ops::legs` and `steps`).
    pub slots: Vec<Slot>,
    /// The changed legs, old beside new (derived).
    pub compared: Vec<Compared>,
    /// The operator folder, when there is one (the demo has none: edits stay in memory).
    pub dir: Option<PathBuf>,
    /// The day legs files as loaded, by relative path.
    pub files: HashMap<String, LoadedFile>,
    /// A save that met a changed file.
    pub conflict: Option<Conflict>,
    /// Quitting was asked with changes pending.
    pub confirm_quit: bool,
    /// Per relative path: our changes merged onto the version found on disk (`o` at a
    /// conflict), written instead of our legs for that file.
    pub merged: HashMap<String, Vec<Leg>>,
}

impl Plan {
    /// Whether changes are pending.
    pub fn pending(&self) -> bool {
        !self.steps.is_empty()
    }
}

/// What the what-if panel is asking.
#[derive(Debug, Clone, PartialEq)]
pub enum Ask {
    /// The menu of edits.
    Menu,
    /// Choose one of these (label, edit).
    Pick {
        /// Heading.
        title: String,
        /// Choices.
        options: Vec<(String, Step)>,
        /// Cursor.
        cursor: usize,
        /// What was typed to jump to a choice (the first whose words begin with it,
        /// else the first that holds it).
        typed: String,
        /// Why the last key typed was refused (no choice matches).
        error: Option<String>,
    },
    /// Type a value.
    Type {
        /// What is typed.
        what: Typed,
        /// The text so far.
        text: String,
        /// The last error.
        error: Option<String>,
        /// Why the prompt opened by itself (a copy asks for its own time).
        note: Option<String>,
        /// A departure before the board's clock the user was warned about: a second
        /// Enter with the same time plans it (as the hand-report form does for a time
        /// after the clock).
        past_warned: Option<DateTime<Utc>>,
    },
}

/// A typed value.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Typed {
    /// Departure time, HHMM UTC.
    Departs,
    /// Fuel at engine start, litres.
    Fuel,
}

/// The what-if panel of one leg.
#[derive(Debug, Clone, PartialEq)]
pub struct ReplanUi {
    /// The slot edited.
    pub slot: usize,
    /// What is being asked.
    pub ask: Ask,
}

/// Reads the day legs files of an operator folder with their hashes (at load; I/O).
pub fn load_files(dir: &Path, rels: &[String]) -> (HashMap<String, LoadedFile>, Vec<String>) {
    let mut files = HashMap::new();
    let mut errors = Vec::new();
    for rel in rels {
        if files.contains_key(rel) {
            continue;
        }
        let path = dir.join(rel);
        match std::fs::read_to_string(&path) {
            Ok(text) => {
                let hash = content_hash(&text);
                files.insert(rel.clone(), LoadedFile { path, text, hash });
            }
            Err(e) => errors.push(format!("reading {}: {e}", path.display())),
        }
    }
    (files, errors)
}

fn leg_words(l: &Leg, show: Show) -> String {
    show.in_text(&leg_words_kg(l))
}

/// A leg as its file has it (kg, L).
fn leg_words_kg(l: &Leg) -> String {
    let loads = l.loads.as_ref().map_or_else(
        || {
            l.takeoff_mass_kg
                .map_or("no mass".into(), |m| format!("{m:.0} kg"))
        },
        |lo| {
            let st: Vec<String> = lo
                .stations
                .iter()
                .map(|s| {
                    let mut t = s.station.clone();
                    if s.standard_adults > 0 {
                        t.push_str(&format!(" {} adult(s)", s.standard_adults));
                    }
                    if let Some(m) = s.mass_kg {
                        t.push_str(&format!(" {m:.0} kg"));
                    }
                    t
                })
                .collect();
            format!(
                "{}; fuel {}",
                st.join(", "),
                lo.fuel_at_start_l
                    .map_or("—".to_string(), |f| format!("{f:.0} L"))
            )
        },
    );
    format!(
        "{} {} {}-{} pilot {} · {}",
        l.departs_utc().format("%H%MZ"),
        l.aircraft,
        l.from,
        l.to,
        l.pilot,
        loads
    )
}

/// What differs between two versions of a leg, in words (masses in the display unit).
pub fn differences(old: &Leg, new: &Leg, show: Show) -> Vec<String> {
    differences_kg(old, new)
        .iter()
        .map(|d| show.in_text(d))
        .collect()
}

fn differences_kg(old: &Leg, new: &Leg) -> Vec<String> {
    let mut out = Vec::new();
    if old.departs_at != new.departs_at {
        out.push(format!(
            "departure {} → {}",
            old.departs_utc().format("%H%MZ"),
            new.departs_utc().format("%H%MZ")
        ));
    }
    for (what, a, b) in [
        ("aircraft", &old.aircraft, &new.aircraft),
        ("from", &old.from, &new.from),
        ("to", &old.to, &new.to),
        ("pilot", &old.pilot, &new.pilot),
    ] {
        if a != b {
            out.push(format!("{what} {a} → {b}"));
        }
    }
    if old.takeoff_mass_kg != new.takeoff_mass_kg {
        out.push(format!(
            "takeoff mass {} → {}",
            old.takeoff_mass_kg
                .map_or("—".into(), |m| format!("{m:.0} kg")),
            new.takeoff_mass_kg
                .map_or("—".into(), |m| format!("{m:.0} kg"))
        ));
    }
    if let (Some(a), Some(b)) = (&old.loads, &new.loads) {
        let load = |l: &crate::ops::legs::Loads, id: &str| {
            l.stations.iter().find(|s| s.station == id).map_or_else(
                || "empty".to_string(),
                |s| {
                    let mut t = Vec::new();
                    if s.standard_adults > 0 {
                        t.push(format!("{} adult(s)", s.standard_adults));
                    }
                    if let Some(m) = s.mass_kg {
                        t.push(format!("{m:.0} kg"));
                    }
                    if t.is_empty() {
                        "empty".into()
                    } else {
                        t.join(" + ")
                    }
                },
            )
        };
        let mut ids: Vec<&str> = Vec::new();
        for s in a.stations.iter().chain(&b.stations) {
            if !ids.contains(&s.station.as_str()) {
                ids.push(&s.station);
            }
        }
        for id in ids {
            let (x, y) = (load(a, id), load(b, id));
            if x != y {
                out.push(format!("{id} {x} → {y}"));
            }
        }
        if a.fuel_at_start_l != b.fuel_at_start_l {
            out.push(format!(
                "fuel {} → {}",
                a.fuel_at_start_l
                    .map_or("—".into(), |f| format!("{f:.0} L")),
                b.fuel_at_start_l
                    .map_or("—".into(), |f| format!("{f:.0} L"))
            ));
        }
    } else if old.loads != new.loads {
        out.push("loads changed".into());
    }
    out
}

impl App {
    /// Sets up saving (at load): the operator folder and its day legs files as loaded.
    pub fn attach_legs_files(&mut self, dir: Option<&Path>) {
        let Some(dir) = dir else {
            self.plan.dir = None;
            return;
        };
        let rels: Vec<String> = self.ops.leg_files.iter().map(|(r, _)| r.clone()).collect();
        let (files, errors) = load_files(dir, &rels);
        self.plan.dir = Some(dir.to_path_buf());
        self.plan.files = files;
        for e in errors {
            self.notice(NoteKind::Error, format!("re-planning: {e}"));
        }
    }

    /// Re-derives the planned legs and the comparison (after a change, undo or report).
    pub(super) fn replan(&mut self) {
        let mut slots: Vec<Slot> = self
            .ops
            .legs
            .iter()
            .enumerate()
            .map(|(i, l)| Slot {
                leg: l.clone(),
                origin: Origin::Original(i),
                cancelled: false,
            })
            .collect();
        for p in &self.plan.steps {
            let Some(s) = slots.get_mut(p.slot) else {
                continue;
            };
            match &p.step {
                Step::Edit(e) => {
                    let _ = apply(&mut s.leg, e);
                }
                Step::Cancel => s.cancelled = true,
                Step::Copy => {
                    let mut leg = s.leg.clone();
                    let source = match s.origin {
                        Origin::Original(i) | Origin::CopyOf(i) => i,
                    };
                    leg.id = copy_id(&slots, &leg.id);
                    slots.push(Slot {
                        leg,
                        origin: Origin::CopyOf(source),
                        cancelled: false,
                    });
                }
            }
        }
        self.plan.slots = slots;
        self.compare();
    }

    fn compare(&mut self) {
        let show = Show::of(&self.ops);
        let changed: Vec<usize> = (0..self.plan.slots.len())
            .filter(|&i| self.slot_changed(i))
            .collect();
        if changed.is_empty() {
            self.plan.compared.clear();
            return;
        }
        // The planned operator: the forecast look-ahead reads legs by index.
        let mut planned = self.ops.clone();
        planned.legs = self.plan.slots.iter().map(|s| s.leg.clone()).collect();
        let ctx = Context {
            ops: &planned,
            model: self.model(),
            store: &self.store,
            at: self.clock,
        };
        let mut out = Vec::new();
        let mut news: Vec<(usize, State)> = Vec::new();
        let mut results = Vec::new();
        for &i in &changed {
            let s = &self.plan.slots[i];
            let new = (!s.cancelled).then(|| crate::assess::leg::assess(&ctx, &s.leg, i));
            if let Some(r) = &new {
                news.push((i, r.state));
            }
            results.push(new);
        }
        let looks = super::forecast::looks(&planned, self.model(), &self.store, self.clock, &news);
        let mut looks = looks.into_iter();
        for (n, &i) in changed.iter().enumerate() {
            let s = &self.plan.slots[i];
            let old = match s.origin {
                Origin::Original(o) => {
                    self.assessment
                        .legs
                        .iter()
                        .position(|r| r.index == o)
                        .map(|k| {
                            let progress = Progress::of(&self.ops.legs[o], self.clock);
                            Figures::of(&self.assessment.legs[k], self.look(k), show, progress)
                        })
                }
                Origin::CopyOf(_) => None,
            };
            let new = results[n].as_ref().map(|r| {
                let look = looks.next().flatten();
                Figures::of(r, look.as_ref(), show, Progress::of(&s.leg, self.clock))
            });
            let mut what = match s.origin {
                Origin::Original(o) => self
                    .ops
                    .legs
                    .get(o)
                    .map_or_else(Vec::new, |l| differences(l, &s.leg, Show::of(&self.ops))),
                Origin::CopyOf(o) => vec![format!(
                    "new leg, a copy of {}",
                    self.ops.legs.get(o).map_or("—", |l| l.id.as_str())
                )],
            };
            if s.cancelled {
                what.push("cancelled".into());
            }
            let vetting = self.plan_vetting(i, &s.leg).unwrap_or_default();
            out.push(Compared {
                slot: i,
                id: s.leg.id.clone(),
                what,
                old,
                new,
                vetting,
            });
        }
        self.plan.compared = out;
    }

    fn slot_changed(&self, i: usize) -> bool {
        let s = &self.plan.slots[i];
        match s.origin {
            Origin::CopyOf(_) => true,
            Origin::Original(o) => s.cancelled || self.ops.legs.get(o) != Some(&s.leg),
        }
    }

    /// `e`: opens the what-if panel on the selected leg.
    pub(super) fn open_replan(&mut self) {
        if self.ui.pane != super::app::Pane::Legs {
            self.notice(
                NoteKind::Info,
                "e re-plans a leg: choose one in the Legs pane (Tab)".into(),
            );
            return;
        }
        let Some(r) = self.selected_leg() else {
            self.notice(NoteKind::Info, "what-if: no leg selected".into());
            return;
        };
        let slot = r.index;
        if self.plan.slots.len() != self.ops.legs.len() + self.copies() {
            self.replan();
        }
        self.ui.mode = Mode::Replan(Box::new(ReplanUi {
            slot,
            ask: Ask::Menu,
        }));
    }

    fn copies(&self) -> usize {
        self.plan
            .steps
            .iter()
            .filter(|p| p.step == Step::Copy)
            .count()
    }

    /// Adds a change (checked by applying it to a copy first) and re-assesses.
    pub fn plan_step(&mut self, slot: usize, step: Step) -> Result<(), String> {
        if self.plan.slots.is_empty() {
            self.replan();
        }
        let s = self
            .plan
            .slots
            .get(slot)
            .ok_or_else(|| "no such leg".to_string())?;
        let id = s.leg.id.clone();
        let label = match &step {
            Step::Edit(e) => {
                let mut trial = s.leg.clone();
                apply(&mut trial, e).map_err(|e| e.to_string())?;
                let d = differences(&s.leg, &trial, Show::of(&self.ops));
                if d.is_empty() {
                    return Err(format!("{id}: that changes nothing"));
                }
                format!("{id}: {}", d.join(", "))
            }
            Step::Cancel => {
                if s.cancelled {
                    return Err(format!("{id} is already cancelled"));
                }
                format!("{id}: cancelled")
            }
            Step::Copy => format!("{id}: copied as {}", copy_id(&self.plan.slots, &id)),
        };
        self.plan.steps.push(Planned { slot, step, label });
        self.replan();
        // Shown, not blocking: a later step may settle it; `w` refuses what is left.
        let vetting = self
            .plan
            .slots
            .get(slot)
            .and_then(|s| self.plan_vetting(slot, &s.leg));
        if let Some(v) = vetting {
            for r in &v.refusals {
                self.notice(NoteKind::Error, format!("{id}: validate would refuse: {r}"));
            }
            for w in &v.warnings {
                self.notice(NoteKind::Info, format!("{id}: warning: {w}"));
            }
        }
        Ok(())
    }

    /// What `validate` would say of slot `slot`'s planned leg (as `leg set` vets it,
    /// [`crate::replan::vet`]), in the plan as a whole: every other planned change
    /// made, cancelled legs gone (they hold no aircraft or pilot any more) and copies in
    /// place — so a plan may move a leg onto another's time and move that one too, or
    /// cancel it. A copy is vetted as a leg added to its source's file
    /// ([`crate::replan::vet_added`]). `leg` stands in for the slot's leg (a candidate
    /// change). `None` for a cancelled leg (nothing to vet).
    pub fn plan_vetting(&self, slot: usize, leg: &Leg) -> Option<crate::replan::Vetting> {
        let s = self.plan.slots.get(slot)?;
        if s.cancelled {
            return None;
        }
        let mut ops = self.ops.clone();
        let mut legs = Vec::with_capacity(self.plan.slots.len());
        let mut files = Vec::with_capacity(self.plan.slots.len());
        let mut at = None;
        for (k, other) in self.plan.slots.iter().enumerate() {
            if k == slot {
                if let Origin::Original(o) = other.origin {
                    at = Some(legs.len());
                    // The leg as loaded: `vet` compares it with `leg`.
                    legs.push(self.ops.legs.get(o)?.clone());
                    files.push(self.ops.leg_files.get(o).cloned()?);
                }
                continue;
            }
            if other.cancelled {
                continue;
            }
            let source = match other.origin {
                Origin::Original(j) | Origin::CopyOf(j) => j,
            };
            let (file, n) = self.ops.leg_files.get(source).cloned()?;
            // A copy's place in its file: after the file's own legs and earlier copies.
            let n = match other.origin {
                Origin::Original(_) => n,
                Origin::CopyOf(_) => {
                    let own = self
                        .ops
                        .leg_files
                        .iter()
                        .filter(|(f, _)| *f == file)
                        .count();
                    let copies = files
                        .iter()
                        .filter(|(f, i): &&(String, usize)| *f == file && *i >= own)
                        .count();
                    own + copies
                }
            };
            legs.push(other.leg.clone());
            files.push((file, n));
        }
        ops.legs = legs;
        ops.leg_files = files;
        match (s.origin, at) {
            (Origin::Original(_), Some(at)) => Some(crate::replan::vet(&ops, at, leg)),
            (Origin::CopyOf(j), _) => {
                let (file, _) = self.ops.leg_files.get(j)?;
                let day = self.ops.legs.get(j)?.departs_utc().date_naive();
                Some(crate::replan::vet_added(&ops, file, day, leg))
            }
            (Origin::Original(_), None) => None,
        }
    }

    /// Every refusal of the whole plan ([`App::plan_vetting`] of each changed leg),
    /// `"L16: …"`.
    pub fn plan_refusals(&self) -> Vec<String> {
        let mut out = Vec::new();
        for (k, s) in self.plan.slots.iter().enumerate() {
            if !self.slot_changed(k) {
                continue;
            }
            if let Some(v) = self.plan_vetting(k, &s.leg) {
                out.extend(v.refusals.into_iter().map(|r| format!("{}: {r}", s.leg.id)));
            }
        }
        out
    }

    /// `u`: undoes the last change.
    pub fn plan_undo(&mut self) {
        match self.plan.steps.pop() {
            Some(p) => {
                self.replan();
                self.notice(NoteKind::Info, format!("undone: {}", p.label));
            }
            None => self.notice(NoteKind::Info, "nothing to undo".into()),
        }
    }

    /// The legs of every file, as planned, in the operator's order (copies after their
    /// source, cancelled legs left out).
    fn planned_files(&self) -> Vec<(String, Vec<Leg>)> {
        let mut files = self.planned_from_board();
        for (rel, legs) in files.iter_mut() {
            if let Some(m) = self.plan.merged.get(rel) {
                legs.clone_from(m);
            }
        }
        files
    }

    fn planned_from_board(&self) -> Vec<(String, Vec<Leg>)> {
        let mut files: Vec<(String, Vec<Leg>)> = Vec::new();
        for (i, (rel, _)) in self.ops.leg_files.iter().enumerate() {
            let k = match files.iter().position(|(r, _)| r == rel) {
                Some(k) => k,
                None => {
                    files.push((rel.clone(), Vec::new()));
                    files.len() - 1
                }
            };
            for s in self.plan.slots.iter().filter(|s| match s.origin {
                Origin::Original(o) => o == i,
                Origin::CopyOf(o) => o == i,
            }) {
                if !s.cancelled {
                    files[k].1.push(s.leg.clone());
                }
            }
        }
        files
    }

    fn affected_files(&self) -> Vec<String> {
        let mut out: Vec<String> = Vec::new();
        for c in &self.plan.compared {
            let o = match self.plan.slots[c.slot].origin {
                Origin::Original(o) | Origin::CopyOf(o) => o,
            };
            if let Some((rel, _)) = self.ops.leg_files.get(o)
                && !out.contains(rel)
            {
                out.push(rel.clone());
            }
        }
        out
    }

    /// The operator's legs replaced by these files' legs; the board re-assessed.
    fn adopt(&mut self, files: Vec<(String, Vec<Leg>)>) {
        let mut legs = Vec::new();
        let mut leg_files = Vec::new();
        for (rel, ls) in files {
            for (n, l) in ls.into_iter().enumerate() {
                legs.push(l);
                leg_files.push((rel.clone(), n));
            }
        }
        self.ops.legs = legs;
        self.ops.leg_files = leg_files;
        self.plan.steps.clear();
        self.plan.conflict = None;
        self.plan.merged.clear();
        self.reassess_all();
        self.replan();
    }

    /// `w`: writes the pending changes (the event loop saves; the demo keeps them in memory).
    pub fn plan_write(&mut self) {
        if !self.plan.pending() {
            self.notice(
                NoteKind::Info,
                "nothing to write: no pending changes".into(),
            );
            return;
        }
        let refusals = self.plan_refusals();
        if !refusals.is_empty() {
            self.notice(
                NoteKind::Error,
                format!(
                    "nothing written: validate would refuse the plan: {}",
                    refusals.join("; ")
                ),
            );
            return;
        }
        let files = self.planned_files();
        let Some(dir) = self.plan.dir.clone() else {
            let n = self.plan.steps.len();
            self.adopt(files);
            self.notice(
                NoteKind::Info,
                format!(
                    "demo: no operator folder, so the {n} change(s) are applied in memory only (rhoboard init DIR makes a folder)"
                ),
            );
            return;
        };
        let affected = self.affected_files();
        let mut saves = Vec::new();
        for rel in affected {
            let Some(loaded) = self.plan.files.get(&rel) else {
                self.notice(
                    NoteKind::Error,
                    format!("{rel} was not read at load: nothing written"),
                );
                return;
            };
            let mut file: LegsFile = match serde_json::from_str(&loaded.text) {
                Ok(f) => f,
                Err(e) => {
                    self.notice(NoteKind::Error, format!("{rel}: {e}: nothing written"));
                    return;
                }
            };
            file.legs = files
                .iter()
                .find(|(r, _)| *r == rel)
                .map(|(_, l)| l.clone())
                .unwrap_or_default();
            saves.push(LegsSave {
                path: dir.join(&rel),
                rel,
                expected_hash: loaded.hash.clone(),
                file,
            });
        }
        self.push_effect(Effect::SaveLegs(saves));
    }

    /// The event loop's answer to [`Effect::SaveLegs`].
    pub(super) fn saved(&mut self, outcomes: Vec<(String, SaveOutcome)>) {
        let planned = self.planned_files();
        let mut all_written = true;
        for (rel, o) in outcomes {
            match o {
                SaveOutcome::Written { hash, backup } => {
                    if let Some((_, legs)) = planned.iter().find(|(r, _)| *r == rel)
                        && let Some(f) = self.plan.files.get_mut(&rel)
                        && let Ok(mut file) = serde_json::from_str::<LegsFile>(&f.text)
                    {
                        file.legs = legs.clone();
                        f.text = serde_json::to_string_pretty(&file).unwrap_or_default() + "\n";
                        f.hash = hash;
                    }
                    // The backup named relative to the operator folder, so the
                    // note fits a line (finding 21).
                    let backup = self
                        .plan
                        .dir
                        .as_deref()
                        .and_then(|d| backup.strip_prefix(d).ok())
                        .unwrap_or(&backup)
                        .display()
                        .to_string();
                    self.notice(NoteKind::Info, format!("saved {rel} (backup: {backup})"));
                }
                SaveOutcome::Unchanged => {
                    self.notice(
                        NoteKind::Info,
                        format!("{rel} already holds these legs: nothing written"),
                    );
                }
                SaveOutcome::Conflict(on_disk) => {
                    all_written = false;
                    let legs = self.conflict_legs(&rel, &on_disk);
                    self.notice(
                        NoteKind::Error,
                        format!(
                            "{rel} changed on disk since it was loaded: nothing written; choose t (keep theirs) or o (our changes onto theirs)"
                        ),
                    );
                    self.plan.conflict = Some(Conflict { rel, on_disk, legs });
                    self.ui.mode = Mode::Conflict;
                }
                SaveOutcome::Failed(e) => {
                    all_written = false;
                    self.notice(NoteKind::Error, format!("{e}: the changes stay pending"));
                }
            }
        }
        if all_written {
            self.adopt(planned);
            if matches!(self.ui.mode, Mode::Conflict) {
                self.ui.mode = Mode::Normal;
            }
        }
    }

    fn conflict_legs(&self, rel: &str, on_disk: &str) -> Vec<(String, String, String, String)> {
        let theirs: Option<LegsFile> = serde_json::from_str(on_disk).ok();
        let loaded: Option<LegsFile> = self
            .plan
            .files
            .get(rel)
            .and_then(|f| serde_json::from_str(&f.text).ok());
        // "Ours" is what `o` would write: our changes onto theirs, where they merge.
        let merged = theirs
            .as_ref()
            .and_then(|th| self.merge_onto(rel, &th.legs).ok());
        let ours = merged.unwrap_or_else(|| {
            self.planned_files()
                .into_iter()
                .find(|(r, _)| r == rel)
                .map(|(_, l)| l)
                .unwrap_or_default()
        });
        let show = Show::of(&self.ops);
        let find = |ls: Option<&Vec<Leg>>, id: &str| {
            ls.and_then(|ls| ls.iter().find(|l| l.id == id))
                .map_or("— (not there)".to_string(), |l| leg_words(l, show))
        };
        let mut ids: Vec<String> = Vec::new();
        let base = loaded.as_ref().map(|f| &f.legs);
        let th = theirs.as_ref().map(|f| &f.legs);
        for l in ours
            .iter()
            .chain(th.into_iter().flatten())
            .chain(base.into_iter().flatten())
        {
            let changed = find(base, &l.id) != find(Some(&ours), &l.id)
                || find(base, &l.id) != find(th, &l.id);
            if changed && !ids.contains(&l.id) {
                ids.push(l.id.clone());
            }
        }
        if theirs.is_none() {
            ids.insert(0, "(their file does not parse as a legs file)".into());
        }
        ids.into_iter()
            .map(|id| {
                let a = find(base, &id);
                let b = find(th, &id);
                let c = find(Some(&ours), &id);
                (id, a, b, c)
            })
            .collect()
    }

    /// Keys while a conflict is shown: `t` keeps theirs, `o` applies our changes onto theirs.
    pub(super) fn conflict_key(&mut self, key: KeyEvent) {
        let Some(c) = self.plan.conflict.clone() else {
            self.ui.mode = Mode::Normal;
            return;
        };
        match key.code {
            KeyCode::Char('t') => {
                let theirs: Result<LegsFile, _> = serde_json::from_str(&c.on_disk);
                match theirs {
                    Ok(f) => {
                        let mut files = self.planned_files();
                        // Ours for the other files stay as they were on the board.
                        let originals = self.original_files();
                        for (rel, legs) in files.iter_mut() {
                            *legs = if *rel == c.rel {
                                f.legs.clone()
                            } else {
                                originals
                                    .iter()
                                    .find(|(r, _)| r == rel)
                                    .map(|(_, l)| l.clone())
                                    .unwrap_or_default()
                            };
                        }
                        let n = self.plan.steps.len();
                        if let Some(lf) = self.plan.files.get_mut(&c.rel) {
                            lf.hash = content_hash(&c.on_disk);
                            lf.text = c.on_disk.clone();
                        }
                        self.adopt(files);
                        self.ui.mode = Mode::Normal;
                        self.notice(
                            NoteKind::Info,
                            format!(
                                "kept theirs: {} reloaded from disk; our {n} change(s) dropped",
                                c.rel
                            ),
                        );
                    }
                    Err(e) => self.notice(
                        NoteKind::Error,
                        format!(
                            "{}: their version does not read as a legs file ({e}); only o (write ours whole) or Esc",
                            c.rel
                        ),
                    ),
                }
            }
            KeyCode::Char('o') => {
                // Our changes, field by field, onto their version: what only they
                // changed stays theirs; a field both changed differently is a real
                // conflict and nothing is written. A file of theirs that does not read
                // as a legs file cannot be merged: ours is written whole.
                if let Ok(theirs) = serde_json::from_str::<LegsFile>(&c.on_disk) {
                    match self.merge_onto(&c.rel, &theirs.legs) {
                        Ok(legs) => {
                            self.plan.merged.insert(c.rel.clone(), legs);
                        }
                        Err(clashes) => {
                            self.notice(
                                NoteKind::Error,
                                format!(
                                    "{}: both changed {}: nothing written; t keeps theirs, Esc decides later",
                                    c.rel,
                                    clashes.join("; ")
                                ),
                            );
                            return;
                        }
                    }
                }
                if let Some(lf) = self.plan.files.get_mut(&c.rel) {
                    // Against the hash of what is there now.
                    lf.hash = content_hash(&c.on_disk);
                    lf.text = c.on_disk.clone();
                }
                self.plan.conflict = None;
                self.ui.mode = Mode::Normal;
                self.plan_write();
            }
            KeyCode::Esc => {
                self.ui.mode = Mode::Normal;
                self.notice(
                    NoteKind::Info,
                    "conflict left open: the changes stay pending (w tries again)".into(),
                );
            }
            _ => {}
        }
    }

    /// Our pending changes to the legs of `rel` applied onto `theirs` (the file's legs
    /// on disk now), in their order; our copies follow their source and our cancelled
    /// legs are left out. `Err` lists each field both sides changed differently
    /// ("L16 aircraft: theirs X-UTLA, ours X-UTLC"), and legs we changed that they removed.
    fn merge_onto(&self, rel: &str, theirs: &[Leg]) -> Result<Vec<Leg>, Vec<String>> {
        use serde_json::to_value;
        let mut clashes = Vec::new();
        let in_file = |o: usize| self.ops.leg_files.get(o).is_some_and(|(r, _)| r == rel);
        let mut out: Vec<Leg> = Vec::new();
        let mut ours_placed: Vec<usize> = Vec::new();
        for t in theirs {
            let base =
                (0..self.ops.legs.len()).find(|&o| in_file(o) && self.ops.legs[o].id == t.id);
            let Some(o) = base else {
                // A leg only they added.
                out.push(t.clone());
                continue;
            };
            ours_placed.push(o);
            let slot = &self.plan.slots[o];
            let b = &self.ops.legs[o];
            if !slot.cancelled {
                if slot.leg == *b {
                    out.push(t.clone());
                } else {
                    let (bv, tv, ov) = (to_value(b), to_value(t), to_value(&slot.leg));
                    let (Ok(bv), Ok(tv), Ok(ov)) = (bv, tv, ov) else {
                        clashes.push(format!("{} (cannot compare)", t.id));
                        continue;
                    };
                    let mut here = Vec::new();
                    let merged = merge_value(&bv, &tv, &ov, &t.id, &mut here);
                    match serde_json::from_value::<Leg>(merged) {
                        Ok(l) if here.is_empty() => out.push(l),
                        Ok(_) => clashes.extend(here),
                        Err(e) => clashes.push(format!("{}: the merge does not read ({e})", t.id)),
                    }
                }
            } else if *t != *b {
                clashes.push(format!("{} (we cancel it, they changed it)", t.id));
            }
            // Our copies of this leg, after it (made from ours as planned).
            out.extend(
                self.plan
                    .slots
                    .iter()
                    .filter(|s| s.origin == Origin::CopyOf(o) && !s.cancelled)
                    .map(|s| s.leg.clone()),
            );
        }
        // Legs they removed: gone, unless we changed or copied them.
        for o in (0..self.ops.legs.len()).filter(|&o| in_file(o) && !ours_placed.contains(&o)) {
            let copied = self
                .plan
                .slots
                .iter()
                .any(|s| s.origin == Origin::CopyOf(o) && !s.cancelled);
            if self.slot_changed(o) || copied {
                clashes.push(format!(
                    "{} (they removed it, we {} it)",
                    self.ops.legs[o].id,
                    if copied { "copied" } else { "changed" }
                ));
            }
        }
        if clashes.is_empty() {
            Ok(out)
        } else {
            Err(clashes)
        }
    }

    fn original_files(&self) -> Vec<(String, Vec<Leg>)> {
        let mut files: Vec<(String, Vec<Leg>)> = Vec::new();
        for (l, (rel, _)) in self.ops.legs.iter().zip(&self.ops.leg_files) {
            match files.iter_mut().find(|(r, _)| r == rel) {
                Some((_, v)) => v.push(l.clone()),
                None => files.push((rel.clone(), vec![l.clone()])),
            }
        }
        files
    }

    /// `q`: quits, unless changes are pending — then it asks first.
    pub(super) fn ask_quit(&mut self) {
        if self.plan.pending() && !matches!(self.ui.mode, Mode::ConfirmQuit) {
            self.ui.mode = Mode::ConfirmQuit;
        } else {
            self.quit = true;
        }
    }

    /// Keys while quitting is being confirmed: `y` quits (dropping the changes), `w`
    /// writes them, anything else stays.
    pub(super) fn confirm_quit_key(&mut self, key: KeyEvent) {
        self.ui.mode = Mode::Normal;
        match key.code {
            KeyCode::Char('y') | KeyCode::Char('Y') => self.quit = true,
            KeyCode::Char('w') => {
                self.interrupted = false;
                self.plan_write();
            }
            _ => self.interrupted = false,
        }
    }

    /// Keys in the what-if panel.
    pub(super) fn replan_key(&mut self, key: KeyEvent) {
        let Mode::Replan(mut ui) = std::mem::replace(&mut self.ui.mode, Mode::Normal) else {
            return;
        };
        let ctrl = key.modifiers.contains(KeyModifiers::CONTROL);
        match &mut ui.ask {
            Ask::Menu => match key.code {
                KeyCode::Esc | KeyCode::Char('q') => return,
                KeyCode::Char('a') => ui.ask = self.pick_aircraft(ui.slot),
                KeyCode::Char('d') => ui.ask = self.pick_destination(ui.slot),
                KeyCode::Char('l') => ui.ask = self.pick_loads(ui.slot),
                KeyCode::Char('t') => {
                    ui.ask = Ask::Type {
                        what: Typed::Departs,
                        text: String::new(),
                        error: None,
                        note: None,
                        past_warned: None,
                    }
                }
                KeyCode::Char('f') => {
                    ui.ask = Ask::Type {
                        what: Typed::Fuel,
                        text: String::new(),
                        error: None,
                        note: None,
                        past_warned: None,
                    }
                }
                KeyCode::Char('c') => {
                    let before = self.plan.slots.len();
                    self.step_or_note(ui.slot, Step::Copy);
                    if self.plan.slots.len() > before {
                        // The copy flies the same aircraft at the same time, which
                        // validate refuses: its own time is asked for at once.
                        let copy = self.plan.slots.len() - 1;
                        let id = self.plan.slots[copy].leg.id.clone();
                        ui.slot = copy;
                        ui.ask = Ask::Type {
                            what: Typed::Departs,
                            text: String::new(),
                            error: None,
                            note: Some(format!(
                                "{id} is a copy at the same time, on the same aircraft (validate would refuse it): type its own departure time, or Esc to keep it and change it in the menu (a aircraft, t time)"
                            )),
                            past_warned: None,
                        };
                    }
                }
                KeyCode::Char('x') => self.step_or_note(ui.slot, Step::Cancel),
                KeyCode::Char('u') => {
                    // Undoing the copy being shown goes back to the leg it was made of.
                    let back = self.plan.slots.get(ui.slot).map(|s| match s.origin {
                        Origin::Original(i) | Origin::CopyOf(i) => i,
                    });
                    self.plan_undo();
                    if ui.slot >= self.plan.slots.len() {
                        ui.slot = back.unwrap_or(0);
                    }
                }
                KeyCode::Char('w') => {
                    self.plan_write();
                    if !matches!(self.ui.mode, Mode::Normal) {
                        return;
                    }
                }
                _ => {}
            },
            Ask::Pick {
                options,
                cursor,
                typed,
                error,
                ..
            } => match key.code {
                KeyCode::Esc => ui.ask = Ask::Menu,
                KeyCode::Up => *cursor = cursor.saturating_sub(1),
                KeyCode::Down => *cursor = (*cursor + 1).min(options.len().saturating_sub(1)),
                // j and k move until something is typed; then they are letters.
                KeyCode::Char('k') if typed.is_empty() && !ctrl => {
                    *cursor = cursor.saturating_sub(1)
                }
                KeyCode::Char('j') if typed.is_empty() && !ctrl => {
                    *cursor = (*cursor + 1).min(options.len().saturating_sub(1))
                }
                KeyCode::PageUp => *cursor = cursor.saturating_sub(8),
                KeyCode::PageDown => *cursor = (*cursor + 8).min(options.len().saturating_sub(1)),
                KeyCode::Home => *cursor = 0,
                KeyCode::End => *cursor = options.len().saturating_sub(1),
                KeyCode::Backspace => {
                    typed.pop();
                    *error = None;
                    if let Some(i) = jump(options, typed) {
                        *cursor = i;
                    } else if !typed.is_empty() {
                        *error = Some(no_match(typed));
                    }
                }
                KeyCode::Char('u') if ctrl => {
                    typed.clear();
                    *error = None;
                }
                KeyCode::Enter => {
                    // Only the highlighted choice, never one the typing did not reach.
                    match options.get(*cursor).cloned() {
                        _ if error.is_some() => {
                            *error = Some(format!("{}; Enter chose nothing", no_match(typed)));
                        }
                        Some((label, step)) => {
                            self.step_or_note(ui.slot, step);
                            self.notice(
                                NoteKind::Info,
                                format!(
                                    "what-if: chose {}",
                                    label.split_whitespace().collect::<Vec<_>>().join(" ")
                                ),
                            );
                            ui.ask = Ask::Menu;
                        }
                        None => {
                            *error = Some("nothing to choose here: Esc goes back".into());
                        }
                    }
                }
                KeyCode::Char(ch) if !ctrl => {
                    typed.push(ch);
                    match jump(options, typed) {
                        Some(i) => {
                            *cursor = i;
                            *error = None;
                        }
                        None => *error = Some(no_match(typed)),
                    }
                }
                _ => {}
            },
            Ask::Type {
                what,
                text,
                error,
                past_warned,
                ..
            } => match key.code {
                KeyCode::Esc => ui.ask = Ask::Menu,
                KeyCode::Backspace => {
                    text.pop();
                }
                KeyCode::Char('u') if ctrl => text.clear(),
                KeyCode::Enter => match self.typed_edit(ui.slot, *what, text) {
                    Ok(Edit::Departs(at))
                        if at.with_timezone(&Utc) < self.clock
                            && *past_warned != Some(at.with_timezone(&Utc)) =>
                    {
                        let at = at.with_timezone(&Utc);
                        *past_warned = Some(at);
                        *error = Some(past_words(at, self.clock, Past::Ask));
                    }
                    Ok(e) => match self.plan_step(ui.slot, Step::Edit(e)) {
                        Ok(()) => ui.ask = Ask::Menu,
                        Err(e) => *error = Some(e),
                    },
                    Err(e) => *error = Some(e),
                },
                KeyCode::Char(ch) if !ctrl => {
                    text.push(ch);
                    *error = None;
                }
                _ => {}
            },
        }
        self.ui.mode = Mode::Replan(ui);
    }

    fn step_or_note(&mut self, slot: usize, step: Step) {
        if let Err(e) = self.plan_step(slot, step) {
            self.notice(NoteKind::Error, format!("what-if: {e}"));
        }
    }

    fn typed_edit(&self, slot: usize, what: Typed, text: &str) -> Result<Edit, String> {
        let leg = &self
            .plan
            .slots
            .get(slot)
            .ok_or_else(|| "no such leg".to_string())?
            .leg;
        match what {
            Typed::Departs => {
                let hm = text.trim().trim_end_matches(['Z', 'z']);
                let t = NaiveTime::parse_from_str(hm, "%H%M")
                    .or_else(|_| NaiveTime::parse_from_str(hm, "%H:%M"))
                    .map_err(|_| format!("'{text}': expected a UTC time as HHMM, e.g. 0630"))?;
                let day = leg.departs_utc().date_naive();
                Ok(Edit::Departs(day.and_time(t).and_utc().fixed_offset()))
            }
            Typed::Fuel => {
                let t = text.trim();
                let n = t.trim_end_matches(['L', 'l']).trim();
                let l: f64 = n
                    .parse()
                    .ok()
                    .filter(|v: &f64| v.is_finite() && *v >= 0.0)
                    .ok_or_else(|| format!("'{text}': expected litres, e.g. 90 or 90L"))?;
                Ok(Edit::FuelL(l))
            }
        }
    }

    fn pick_aircraft(&self, slot: usize) -> Ask {
        let Some(leg) = self.plan.slots.get(slot).map(|s| &s.leg) else {
            return Ask::Menu;
        };
        let m = &self.assessment.matrix;
        let show = super::display::Show::of(&self.ops);
        let fi = self.ops.airfields.iter().position(|f| f.id == leg.from);
        let mut options: Vec<(State, f64, String, Step)> = Vec::new();
        let mut refused: Vec<String> = Vec::new();
        for (ai, &a) in m.aircraft.iter().enumerate() {
            let Some(ac) = self.ops.aircraft.get(a) else {
                continue;
            };
            if ac.registration == leg.aircraft {
                continue;
            }
            let Some(fi) = fi.filter(|&f| f < m.fields) else {
                continue;
            };
            let c = m.cell(ai, fi);
            if c.state == State::Below {
                continue;
            }
            let mut trial = leg.clone();
            trial.aircraft.clone_from(&ac.registration);
            if let Some(v) = self.plan_vetting(slot, &trial)
                && let Some(r) = v.refusals.first()
            {
                refused.push(format!("{} ({r})", ac.registration));
                continue;
            }
            // Best first by margin ÷ buffer, which compares %, kt and ft; the label
            // gives the margin with its unit and what it is a margin of.
            let score = if c.score.is_finite() {
                c.score
            } else {
                f64::NEG_INFINITY
            };
            let margin = match super::view::pair_margin(c, show) {
                Some((m, unit, d)) => {
                    let sep = if unit == "%" || unit.is_empty() {
                        ""
                    } else {
                        " "
                    };
                    format!("{m:+.d$}{sep}{unit} {}", c.limiting_words())
                }
                None => "—".into(),
            };
            options.push((
                c.state,
                score,
                format!(
                    "{:<8} {:<12} {} {:<8} {margin} at {}",
                    ac.registration,
                    ac.type_id,
                    c.state.glyph(),
                    c.state.word(),
                    leg.from
                ),
                Step::Edit(Edit::Aircraft(ac.registration.clone())),
            ));
        }
        options.sort_by(|a, b| a.0.cmp(&b.0).then(b.1.total_cmp(&a.1)));
        Ask::Pick {
            // An empty list says why (trial finding: "nothing to choose" alone).
            title: if options.is_empty() && refused.is_empty() {
                format!(
                    "No other aircraft for {}: every other available one is below at {} now \
                     (the Pairings pane shows why; one in maintenance is not offered). Esc goes back",
                    leg.id, leg.from
                )
            } else if refused.is_empty() {
                format!(
                    "Another aircraft for {} (pairings at {} not below, best first)",
                    leg.id, leg.from
                )
            } else {
                format!(
                    "Another aircraft for {} (pairings at {} not below, best first; not offered, \
                     validate would refuse: {})",
                    leg.id,
                    leg.from,
                    refused.join("; ")
                )
            },
            options: options.into_iter().map(|(_, _, l, s)| (l, s)).collect(),
            cursor: 0,
            typed: String::new(),
            error: None,
        }
    }

    fn pick_destination(&self, slot: usize) -> Ask {
        let Some(leg) = self.plan.slots.get(slot).map(|s| &s.leg) else {
            return Ask::Menu;
        };
        let options = self
            .ops
            .airfields
            .iter()
            .filter(|f| f.id != leg.to)
            .map(|f| {
                (
                    format!("{:<5} {} ({:.0} ft)", f.id, f.name, f.elevation_ft),
                    Step::Edit(Edit::To(f.id.clone())),
                )
            })
            .collect();
        Ask::Pick {
            title: format!("Another destination for {} (now {})", leg.id, leg.to),
            options,
            cursor: 0,
            typed: String::new(),
            error: None,
        }
    }

    fn pick_loads(&self, slot: usize) -> Ask {
        let Some(leg) = self.plan.slots.get(slot).map(|s| &s.leg) else {
            return Ask::Menu;
        };
        let Some(loads) = &leg.loads else {
            return Ask::Pick {
                title: format!("{} gives a fixed takeoff mass, not loads", leg.id),
                options: Vec::new(),
                cursor: 0,
                typed: String::new(),
                error: None,
            };
        };
        let stations: Vec<(String, String)> = self
            .ops
            .aircraft(&leg.aircraft)
            .and_then(|a| self.ops.aircraft_type(&a.type_id))
            .and_then(|t| t.file.mass_balance.as_ref())
            .map(|mb| {
                mb.stations
                    .iter()
                    .map(|s| (s.id.clone(), s.name.clone()))
                    .collect()
            })
            .unwrap_or_else(|| {
                loads
                    .stations
                    .iter()
                    .map(|s| (s.station.clone(), s.station.clone()))
                    .collect()
            });
        // The pilot's station (the type's first seated one, as validate takes it) is
        // never offered empty.
        let pilot_station: Option<String> = self
            .ops
            .aircraft(&leg.aircraft)
            .and_then(|a| self.ops.aircraft_type(&a.type_id))
            .and_then(|t| t.file.mass_balance.as_ref())
            .and_then(|mb| mb.stations.iter().find(|s| s.seats > 0))
            .map(|s| s.id.clone());
        // A bag's mass moves in steps of 10 kg (shown in the display unit).
        const STEP_KG: f64 = 10.0;
        let show = Show::of(&self.ops);
        let mut options = Vec::new();
        for (id, name) in stations {
            let cur = loads.stations.iter().find(|s| s.station == id);
            let adults = cur.map_or(0, |s| s.standard_adults);
            let mass = cur.and_then(|s| s.mass_kg);
            let bags = id.contains("bag") || name.to_lowercase().contains("bag");
            if !bags {
                if adults > 0 {
                    options.push((
                        format!("{id}: remove a passenger ({adults} → {})", adults - 1),
                        if adults == 1 && mass.is_none() {
                            Step::Edit(Edit::Unload(id.clone()))
                        } else {
                            Step::Edit(Edit::Load {
                                station: id.clone(),
                                mass_kg: mass,
                                adults: adults - 1,
                            })
                        },
                    ));
                }
                // A station stated by mass (the pilot's, say) counts its people by
                // mass: the label says what is added to what.
                let now = match mass {
                    Some(kg) if adults == 0 => format!("{} stated", show.mass(kg)),
                    Some(kg) => format!("{} and {adults} adult(s)", show.mass(kg)),
                    None => format!("{adults} adult(s)"),
                };
                options.push((
                    format!("{id}: add a standard adult ({now}, one more)"),
                    Step::Edit(Edit::Load {
                        station: id.clone(),
                        mass_kg: mass,
                        adults: adults + 1,
                    }),
                ));
            } else {
                let m = mass.unwrap_or(0.0);
                if m > 0.0 {
                    options.push((
                        format!(
                            "{id}: {} less ({} → {})",
                            show.mass(STEP_KG),
                            show.mass(m),
                            show.mass((m - STEP_KG).max(0.0))
                        ),
                        Step::Edit(Edit::Load {
                            station: id.clone(),
                            mass_kg: Some((m - STEP_KG).max(0.0)),
                            adults,
                        }),
                    ));
                }
                options.push((
                    format!(
                        "{id}: {} more ({} → {})",
                        show.mass(STEP_KG),
                        show.mass(m),
                        show.mass(m + STEP_KG)
                    ),
                    Step::Edit(Edit::Load {
                        station: id.clone(),
                        mass_kg: Some(m + STEP_KG),
                        adults,
                    }),
                ));
            }
            if cur.is_some() && pilot_station.as_ref() != Some(&id) {
                // Everything at the station goes.
                let what = match (mass, adults) {
                    (Some(kg), 0) => show.mass(kg),
                    (Some(kg), n) => format!("{} and {n} adult(s)", show.mass(kg)),
                    (None, n) => format!("{n} adult(s)"),
                };
                options.push((
                    format!("{id}: empty it ({name}: all of it, {what})"),
                    Step::Edit(Edit::Unload(id.clone())),
                ));
            }
        }
        Ask::Pick {
            title: format!("Loads of {} (fuel: f in the menu)", leg.id),
            options,
            cursor: 0,
            typed: String::new(),
            error: None,
        }
    }

    /// The comparison of the slot, if it changed.
    pub fn compared(&self, slot: usize) -> Option<&Compared> {
        self.plan.compared.iter().find(|c| c.slot == slot)
    }

    /// The leg in a slot as the operator planned it (before any pending change), in
    /// words; a copy, which has no such leg, as it stands now.
    pub fn slot_words(&self, slot: usize) -> String {
        let show = Show::of(&self.ops);
        self.plan.slots.get(slot).map_or("—".to_string(), |s| {
            let leg = match s.origin {
                Origin::Original(o) => self.ops.legs.get(o).unwrap_or(&s.leg),
                Origin::CopyOf(_) => &s.leg,
            };
            leg_words(leg, show)
        })
    }

    /// The heading word of [`App::slot_words`]: "as planned" for the operator's leg,
    /// "new leg" for a copy.
    pub fn slot_heading(&self, slot: usize) -> &'static str {
        match self.plan.slots.get(slot).map(|s| s.origin) {
            Some(Origin::CopyOf(_)) => "new leg",
            _ => "as planned",
        }
    }
}

/// A departure at `at`, before the board's `clock`, in words: "0630Z is 6 h 30 min
/// before the board's clock (1300Z): the leg would have left already", with `how` to go
/// on (the time prompt's warning) or not (the panel's standing lines).
pub fn past_words(at: DateTime<Utc>, clock: DateTime<Utc>, how: Past) -> String {
    // Between the two times as shown (whole minutes, HHMM): 1000Z against a clock of
    // 13:00:30 is 3 h 0 min, as the reader subtracts them; under a minute says so.
    let whole = |t: DateTime<Utc>| t.timestamp().div_euclid(60);
    let min = whole(clock) - whole(at);
    let ago = if min >= 60 {
        format!("{} h {} min", min / 60, min % 60)
    } else if min >= 1 {
        format!("{min} min")
    } else {
        "less than a minute".to_string()
    };
    let head = format!(
        "{} is {ago} before the board's clock ({})",
        at.format("%H%MZ"),
        clock.format("%H%MZ")
    );
    match how {
        Past::Ask => format!(
            "{head}: the leg would have left already. Enter again to plan it anyway (to compare), or correct the time"
        ),
        Past::Planned => format!(
            "{head}: the leg would have left already (a what-if to compare, not a departure still ahead)"
        ),
        Past::AsLoaded => format!("{head}: the leg has left already"),
        Past::Sign => format!(
            "{head}: the leg has left already. Enter again to sign it anyway, or Esc to cancel"
        ),
    }
}

/// Which words [`past_words`] gives.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Past {
    /// The time prompt's warning: Enter again, or correct it.
    Ask,
    /// The panel's standing line for a planned change.
    Planned,
    /// The panel's line for the leg as loaded (no change to its time).
    AsLoaded,
    /// The sign-off form's warning: Enter again signs it anyway.
    Sign,
}

/// The choice `typed` jumps to: the first whose label, or a word of it, begins with
/// it (any case), else the first that holds it; `None` for empty text or no match.
fn jump(options: &[(String, Step)], typed: &str) -> Option<usize> {
    let t = typed.to_lowercase();
    if t.is_empty() {
        return None;
    }
    let labels: Vec<String> = options.iter().map(|(l, _)| l.to_lowercase()).collect();
    labels
        .iter()
        .position(|l| l.split_whitespace().any(|w| w.starts_with(&t)) || l.starts_with(&t))
        .or_else(|| labels.iter().position(|l| l.contains(&t)))
}

/// The words for typed text no choice matches.
fn no_match(typed: &str) -> String {
    format!("no choice matches '{typed}': Backspace (Ctrl-U clears it), or ↑↓ to choose")
}

/// A new id for a copy: `L16-2`, `L16-3`, …
fn copy_id(slots: &[Slot], id: &str) -> String {
    let base = id.split_once('-').map_or(id, |(b, _)| b);
    (2..)
        .map(|n| format!("{base}-{n}"))
        .find(|c| !slots.iter().any(|s| &s.leg.id == c))
        .unwrap_or_else(|| format!("{base}-copy"))
}

/// A three-way merge of one JSON value: base `b`, theirs `t`, ours `o`. What one side
/// left as it was takes the other's; objects merge key by key; anything else both
/// changed differently is a clash, named by its path in `clashes`.
fn merge_value(
    b: &serde_json::Value,
    t: &serde_json::Value,
    o: &serde_json::Value,
    path: &str,
    clashes: &mut Vec<String>,
) -> serde_json::Value {
    use serde_json::Value;
    if o == b || o == t {
        return t.clone();
    }
    if t == b {
        return o.clone();
    }
    if let (Value::Object(bm), Value::Object(tm), Value::Object(om)) = (b, t, o) {
        let keys: Vec<&String> = tm.keys().chain(om.keys()).chain(bm.keys()).collect();
        let mut out = serde_json::Map::new();
        let mut seen = std::collections::HashSet::new();
        for k in keys {
            if !seen.insert(k) {
                continue;
            }
            let get = |m: &serde_json::Map<String, Value>| m.get(k).cloned().unwrap_or(Value::Null);
            let v = merge_value(
                &get(bm),
                &get(tm),
                &get(om),
                &format!("{path} {k}"),
                clashes,
            );
            if !v.is_null() {
                out.insert(k.clone(), v);
            }
        }
        return Value::Object(out);
    }
    let show = |v: &Value| match v {
        Value::Null => "(none)".to_string(),
        Value::String(s) => s.clone(),
        other => other.to_string(),
    };
    clashes.push(format!("{path}: theirs {}, ours {}", show(t), show(o)));
    t.clone()
}

#[cfg(test)]
mod past_words_tests {
    use super::{Past, past_words};
    use chrono::{TimeZone, Utc};

    /// The gap between two times as shown (HHMM), as a reader subtracts them (trial
    /// finding: "1000Z is 3 h 1 min before the board's clock (1300Z)" at 13:00:30).
    #[test]
    fn the_gap_is_between_the_times_shown() {
        let at = Utc.with_ymd_and_hms(2026, 6, 14, 10, 0, 0).unwrap();
        let clock = Utc.with_ymd_and_hms(2026, 6, 14, 13, 0, 30).unwrap();
        assert!(
            past_words(at, clock, Past::AsLoaded)
                .starts_with("1000Z is 3 h 0 min before the board's clock (1300Z)")
        );
        let at = Utc.with_ymd_and_hms(2026, 6, 14, 13, 0, 10).unwrap();
        assert!(
            past_words(at, clock, Past::AsLoaded)
                .starts_with("1300Z is less than a minute before the board's clock")
        );
    }
}
