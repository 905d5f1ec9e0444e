//! Every available aircraft at every airfield: takeoff, climb and landing on the
//! runway in use (and the best other end), the runway limits and the field's weather
//! limits for the aircraft's strictest category, and the headroom in degrees.
//!
//! This is the hot path. Each airfield's air and per-end winds are computed once per
//! report, its weather limits judged without writing their texts and its daylight read
//! from the model (kept per date); rows alike in type, masses and category (a class)
//! are computed and kept once per airfield. A class's masses are located on its type's
//! mass axis and its landing rules resolved once per matrix (`Masses`); each pairing
//! locates its pressure altitude in the tables once (`Lookup`); the cell at the report's
//! OAT is shared by the takeoff, climb and landing tables and every runway end, and the
//! headroom search asks only for the OAT again, with the runway in use's corrections
//! resolved once for both (`EndCorrections`, `HotEnd`) and only the warmed air's density
//! figures ([`Warming`]). Nothing here allocates per pairing, and every result equals, bit for
//! bit, the plain cell-by-cell computation kept in the tests.

use serde_json::{Value, json};

use super::leg::LegResult;
use super::leg::{Context, EndWind, FieldWx, ReportAge, Setup, TableValues, report_for};
use super::limits::{self, Who};
use super::model::{EndModel, Model, PhaseRules, SunDay};
use super::perf;
use super::state::{State, verdict};
use crate::atmosphere::{WarmAir, Warming};
use crate::observation::Report;
use crate::ops::operator::{Buffers, Minimums};
use crate::ops::tables::{MassAt, Slice};
use crate::ops::{Axis, Category, Leg, Ops, Performance, Status};

/// What decided a pairing's state.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum PairLimit {
    /// Nothing limits (no checks).
    None,
    /// A takeoff distance check.
    Takeoff,
    /// Rate or gradient of climb.
    Climb,
    /// A landing distance check.
    Landing,
    /// Crosswind.
    Crosswind,
    /// Tailwind.
    Tailwind,
    /// Density altitude.
    DensityAltitude,
    /// The field's weather (ceiling, visibility, wind, hazards, daylight).
    Weather,
    /// No usable report.
    Observation,
    /// Outside the flight-manual tables, or a correction the manual lacks.
    Table,
    /// Every runway end closed at the time.
    NoRunway,
}

impl PairLimit {
    /// The unit of a cell's margin for this limiting check.
    pub const fn margin_unit(self) -> &'static str {
        match self {
            PairLimit::Takeoff | PairLimit::Climb | PairLimit::Landing => "%",
            PairLimit::Crosswind | PairLimit::Tailwind => "kt",
            PairLimit::DensityAltitude => "ft",
            PairLimit::None
            | PairLimit::Weather
            | PairLimit::Observation
            | PairLimit::Table
            | PairLimit::NoRunway => "",
        }
    }
}

/// One cell of the matrix.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PairCell {
    /// State on the runway in use.
    pub state: State,
    /// Margin ÷ buffer of the limiting check.
    pub score: f64,
    /// The limiting check's margin: percent for distances and climb, kt for wind, ft
    /// for density altitude ([`PairLimit::margin_unit`]); NaN when the field's weather
    /// decides (its margin is in [`PairCell::minimum`], see [`PairCell::margin`]).
    pub margin_percent: f64,
    /// What limits.
    pub limiting: PairLimit,
    /// The best state over every usable end.
    pub best_end_state: State,
    /// Index (in the field's ends) of the runway in use.
    pub end_in_use: Option<u8>,
    /// Degrees of warming left (negative: the cooling needed); `None` for no-data and
    /// for a pairing below for a reason temperature cannot change (wind, the field's
    /// weather).
    pub headroom_c: Option<f64>,
    /// The search reached an end of the flight-manual tables first: `headroom_c` is a
    /// bound (at least that much warming left, or at least that much cooling needed).
    pub headroom_table_ends: bool,
    /// The weather minimum that decides, when `limiting` is [`PairLimit::Weather`].
    pub minimum: Option<WeatherMinimum>,
}

/// The field's weather minimum that decides a pairing: which one, and its margin.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WeatherMinimum {
    /// Which minimum (ceiling, visibility, wind, gust, hazard, daylight …).
    pub kind: limits::LimitKind,
    /// Room to spare in `unit`; NaN where the minimum has no measure (a hazard, no
    /// usable value).
    pub margin: f64,
    /// Unit of `margin` (`ft`, `m`, `kt`; empty for a yes/no minimum).
    pub unit: &'static str,
}

/// The field's weather for one category: its state, score, and the deciding minimum.
#[derive(Debug, Clone, Copy)]
struct FieldWeather {
    state: State,
    score: f64,
    minimum: Option<WeatherMinimum>,
}

impl FieldWeather {
    const NO_DATA: FieldWeather = FieldWeather {
        state: State::NoData,
        score: f64::NAN,
        minimum: None,
    };

    /// Nothing missed yet: the start of [`FieldWeather::put`]'s fold.
    const WITHIN: FieldWeather = FieldWeather {
        state: State::Within,
        score: f64::INFINITY,
        minimum: None,
    };

    /// The worst of the field's weather limits (density altitude excepted: the
    /// pairing judges it with the performance), from a list with its texts.
    #[cfg(test)]
    fn pick(lim: &[limits::LimitCheck]) -> FieldWeather {
        use limits::LimitSink;
        let mut w = FieldWeather::WITHIN;
        for l in lim {
            w.put(l.clone(), |_| {});
        }
        w
    }
}

/// Why an end is the one in use ([`end_in_use`]).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum EndChoice {
    /// Set in use in the day's runway state.
    Set,
    /// The other ends are closed.
    OnlyUsable,
    /// The most headwind.
    MostHeadwind,
    /// Calm: the field's preferential end.
    CalmPreferential,
    /// Calm, no preferential end usable: the first usable one.
    CalmFirst,
}

impl EndChoice {
    /// In words, as a leg's runway reason has them (`the only usable end: 27 is closed`);
    /// `closed` names the field's ends not usable then.
    pub fn words(self, closed: &[&str]) -> String {
        match self {
            EndChoice::Set => "set in use".to_string(),
            EndChoice::OnlyUsable => format!(
                "the only usable end: {} {} closed",
                closed.join(", "),
                if closed.len() == 1 { "is" } else { "are" }
            ),
            EndChoice::MostHeadwind => "most headwind".to_string(),
            EndChoice::CalmPreferential => "calm: the preferential end".to_string(),
            EndChoice::CalmFirst => "calm: the first usable end".to_string(),
        }
    }
}

/// The end in use at field `fi` at `at`, on the report's air (`winds` and `usable`
/// per end, as [`Model::field_ends_at`] has the ends then), and why: the end set in use
/// when it is usable, else the only usable one, else the one with the most headwind;
/// calm, the preferential end, else the first usable one. `None` without a usable end,
/// or without a (fresh) report where none is set. The pairings, and the sheet's
/// Airfields table, use it.
pub fn end_in_use(
    model: &Model,
    fi: usize,
    at: chrono::DateTime<chrono::Utc>,
    wx: Option<&FieldWx>,
    winds: &[EndWind],
    usable: &[bool],
) -> Option<(usize, EndChoice)> {
    let is_usable = |k: &usize| usable.get(*k).copied().unwrap_or(false);
    if let Some(k) = model.set_in_use_at(fi, at).filter(is_usable) {
        return Some((k, EndChoice::Set));
    }
    let wx = wx?;
    let open = usable.iter().filter(|u| **u).count();
    if wx.calm() {
        model.fields[fi]
            .preferential_end
            .filter(is_usable)
            .map(|k| (k, EndChoice::CalmPreferential))
            .or_else(|| {
                (0..usable.len())
                    .find(is_usable)
                    .map(|k| (k, EndChoice::CalmFirst))
            })
    } else {
        (0..usable.len().min(winds.len()))
            .filter(is_usable)
            .max_by(|&a, &b| winds[a].headwind_kt.total_cmp(&winds[b].headwind_kt))
            .map(|k| {
                if open == 1 && usable.len() > 1 {
                    (k, EndChoice::OnlyUsable)
                } else {
                    (k, EndChoice::MostHeadwind)
                }
            })
    }
}

/// The fold of the field's weather checks as [`limits::field_limits_to`] makes them: the
/// highest state, then the lowest score ([`limits::LimitCheck::score`]) within it, and
/// that check as the deciding minimum. No text is written.
impl limits::LimitSink for FieldWeather {
    fn put(&mut self, l: limits::LimitCheck, _texts: impl FnOnce(&mut limits::LimitCheck)) {
        if l.kind == limits::LimitKind::DensityAltitude {
            return;
        }
        let s = l.score();
        if l.state > self.state || (l.state == self.state && s < self.score) {
            *self = FieldWeather {
                state: l.state,
                score: s,
                minimum: Some(WeatherMinimum {
                    kind: l.kind,
                    // A yes/no minimum's -1 / ∞ is no measure.
                    margin: if l.margin.is_finite() && !l.unit.is_empty() {
                        l.margin
                    } else {
                        f64::NAN
                    },
                    unit: l.unit,
                }),
            };
        }
    }
}

/// A cell's verdict from the runway in use's outcome `now` and the field's weather:
/// the state, score, limiting check, its margin and the deciding weather minimum, and
/// whether the headroom search applies (not for a pairing below for a reason
/// temperature cannot change: the wind limits or the field's weather).
fn combine(
    now: &Outcome,
    weather: &FieldWeather,
    wind_below: bool,
) -> (State, f64, PairLimit, f64, Option<WeatherMinimum>, bool) {
    let (mut state, mut score, mut limiting, mut margin, mut minimum) =
        (now.state, now.score, now.limiting, now.margin_percent, None);
    if weather.state > state || (weather.state == state && weather.score < score) {
        state = weather.state;
        score = weather.score;
        limiting = PairLimit::Weather;
        minimum = weather.minimum;
        // The minimum's margin is in `minimum` (its own unit).
        margin = f64::NAN;
    }
    let searched = now.state != State::NoData && !wind_below && weather.state != State::Below;
    (state, score, limiting, margin, minimum, searched)
}

/// Whether the runway in use's crosswind or tailwind limit is missed (as [`evaluate`]
/// judges them).
fn wind_below(s: &Setup<'_>, b: &Buffers, w: &EndWind) -> bool {
    let max_x = s
        .mins
        .max_crosswind_kt
        .min(s.ty.max_demonstrated_crosswind_kt);
    verdict(max_x - w.crosswind_kt, b.wind_kt) == State::Below
        || verdict(s.mins.max_tailwind_kt - w.tailwind_limit_kt, b.wind_kt) == State::Below
}

impl PairCell {
    /// Why the cell has no headroom figure, in words (`None` where it has one): no
    /// data, or below for what warming or cooling does not change — the deciding
    /// wind or weather minimum, or, where a temperature-dependent check decides, the
    /// wind or the field's weather as well (the cell keeps only the deciding check).
    pub fn headroom_absent_why(&self) -> Option<String> {
        if self.headroom_c.is_some() {
            return None;
        }
        Some(match (self.state, self.limiting) {
            (State::NoData, _) => "no data".to_string(),
            (_, PairLimit::Crosswind | PairLimit::Tailwind | PairLimit::Weather) => format!(
                "below on {}, which warming or cooling does not change",
                self.limiting_words()
            ),
            _ => "also below on the wind or the field's weather, which warming or cooling \
                  does not change"
                .to_string(),
        })
    }

    /// The bound mark of the headroom: `≥` (warming left beyond the tables' top) or `≤`
    /// (at least that much cooling, the tables' bottom reached first); empty when exact.
    pub fn headroom_mark(&self) -> &'static str {
        match (
            self.headroom_table_ends,
            self.headroom_c.is_some_and(|h| h >= 0.0),
        ) {
            (false, _) => "",
            (true, true) => "≥",
            (true, false) => "≤",
        }
    }

    /// The deciding check's margin in [`PairCell::margin_unit`]: the limiting check's,
    /// or the deciding weather minimum's; `None` where there is none.
    pub fn margin(&self) -> Option<f64> {
        let m = match (self.limiting, self.minimum) {
            (PairLimit::Weather, Some(m)) => m.margin,
            _ => self.margin_percent,
        };
        m.is_finite().then_some(m)
    }

    /// The unit of [`PairCell::margin`]: the limiting check's, or the deciding
    /// weather minimum's.
    pub fn margin_unit(&self) -> &'static str {
        match (self.limiting, self.minimum) {
            (PairLimit::Weather, Some(m)) => m.unit,
            (l, _) => l.margin_unit(),
        }
    }

    /// The limiting check in words, naming the weather minimum (`ceiling`, not just
    /// `weather`).
    pub fn limiting_words(&self) -> &'static str {
        match (self.limiting, self.minimum) {
            (PairLimit::Weather, Some(m)) => m.kind.word(),
            (PairLimit::None, _) => "nothing",
            (PairLimit::Takeoff, _) => "takeoff distance",
            (PairLimit::Climb, _) => "climb",
            (PairLimit::Landing, _) => "landing distance",
            (PairLimit::Crosswind, _) => "crosswind",
            (PairLimit::Tailwind, _) => "tailwind",
            (PairLimit::DensityAltitude, _) => "density altitude",
            (PairLimit::Weather, None) => "the field's weather",
            (PairLimit::Observation, _) => "no usable report (none, or stale)",
            (PairLimit::Table, _) => "the flight-manual tables",
            (PairLimit::NoRunway, _) => "no usable runway end (every end closed)",
        }
    }

    /// Every runway end closed at a field with a fresh report: below, as a leg there is.
    const NO_RUNWAY: PairCell = PairCell {
        state: State::Below,
        score: f64::NEG_INFINITY,
        margin_percent: f64::NAN,
        limiting: PairLimit::NoRunway,
        best_end_state: State::Below,
        end_in_use: None,
        headroom_c: None,
        headroom_table_ends: false,
        minimum: None,
    };

    const NO_DATA: PairCell = PairCell {
        state: State::NoData,
        score: f64::NAN,
        margin_percent: f64::NAN,
        limiting: PairLimit::Observation,
        best_end_state: State::NoData,
        end_in_use: None,
        headroom_c: None,
        headroom_table_ends: false,
        minimum: None,
    };
}

/// The matrix: available aircraft × airfields. Rows alike in type, masses and category
/// (a class) share their cells, so the matrix keeps one cell per class and airfield and
/// one per row whose leg gives it other masses at an airfield ([`Matrix::cell`]).
#[derive(Debug, Clone)]
pub struct Matrix {
    /// Indices into `Ops::aircraft` of the rows.
    pub aircraft: Vec<usize>,
    /// Number of columns (airfields).
    pub fields: usize,
    /// One cell per class and airfield, class-major (`class × fields + field`).
    by_class: Vec<PairCell>,
    /// The cells of the rows whose legs give them other masses at an airfield,
    /// parallel to `Prepared::exceptions` (by airfield, then row).
    exception_cells: Vec<PairCell>,
    /// Per-aircraft data kept for column updates.
    prep: Prepared,
}

impl Matrix {
    /// The cell of row `ai` (index into `aircraft`) and airfield `fi`.
    pub fn cell(&self, ai: usize, fi: usize) -> &PairCell {
        let p = &self.prep;
        let (lo, hi) = (p.exception_start[fi], p.exception_start[fi + 1]);
        match p.exceptions[lo..hi].binary_search_by_key(&ai, |&(_, a)| a) {
            Ok(k) => &self.exception_cells[lo + k],
            Err(_) => &self.by_class[p.row_class[ai] * self.fields + fi],
        }
    }

    /// Every cell, row by row (`aircraft × fields` of them).
    pub fn cells(&self) -> impl Iterator<Item = &PairCell> + '_ {
        (0..self.aircraft.len())
            .flat_map(move |ai| (0..self.fields).map(move |fi| self.cell(ai, fi)))
    }

    /// JSON: one object per pairing.
    pub fn to_json(&self, ops: &Ops) -> Value {
        let mut rows = Vec::with_capacity(self.aircraft.len() * self.fields);
        for (ai, &a) in self.aircraft.iter().enumerate() {
            for fi in 0..self.fields {
                let c = self.cell(ai, fi);
                let field = &ops.airfields[fi];
                rows.push(json!({
                    "aircraft": ops.aircraft[a].registration,
                    "airfield": field.id,
                    "runway": c.end_in_use.and_then(|k| field.runway_ends.get(k as usize)).map(|e| e.designator.clone()),
                    "state": c.state,
                    "limiting": c.limiting,
                    "limiting_minimum": c.minimum.map(|m| m.kind.word()),
                    "margin": c.margin(),
                    "margin_unit": c.margin_unit(),
                    "best_end_state": c.best_end_state,
                    "headroom_c": c.headroom_c,
                    "headroom_table_ends": c.headroom_c.is_some().then_some(c.headroom_table_ends),
                }));
            }
        }
        Value::Array(rows)
    }

    /// The full chain behind a cell, on demand: the pairing assessed as a leg from and
    /// to the airfield at the reference time, with the cell's masses and category and no
    /// pilot (so no pilot's own limits). `ai` indexes `aircraft`, `fi` the airfields.
    pub fn open(&self, ctx: &Context<'_>, ai: usize, fi: usize) -> Option<LegResult> {
        let a = *self.aircraft.get(ai)?;
        let ops = ctx.ops;
        let field = ops.airfields.get(fi)?;
        let (tom, lm) = self.prep.masses(ctx.model, a, fi)?;
        let at = ctx.at.fixed_offset();
        let leg = Leg {
            id: format!("{} at {}", ops.aircraft[a].registration, field.id),
            departs_at: at,
            arrives_at: at,
            aircraft: ops.aircraft[a].registration.clone(),
            pilot: String::new(),
            category: self.prep.aircraft[a].category,
            from: field.id.clone(),
            to: field.id.clone(),
            takeoff_mass_kg: Some(tom),
            landing_mass_kg: Some(lm),
            loads: None,
            remarks: "pairing".to_string(),
        };
        Some(super::leg::assess(ctx, &leg, usize::MAX))
    }

    /// Recomputes one airfield's column (after a new report for it).
    pub fn update_field(&mut self, ctx: &Context<'_>, fi: usize) {
        if fi < self.fields {
            let (lo, hi) = (
                self.prep.exception_start[fi],
                self.prep.exception_start[fi + 1],
            );
            let mut per_class = vec![PairCell::NO_DATA; self.prep.classes.len()];
            self.prep.column(
                ctx,
                fi,
                field_report(ctx, fi),
                &mut Scratch::default(),
                &mut per_class,
                &mut self.exception_cells[lo..hi],
            );
            for (c, cell) in per_class.into_iter().enumerate() {
                self.by_class[c * self.fields + fi] = cell;
            }
        }
    }
}

/// Per airfield, computed once per report.
struct FieldPrep<'a> {
    wx: Option<FieldWx>,
    /// The report's air for other temperatures (headroom).
    warming: Option<Warming>,
    winds: Vec<EndWind>,
    /// Whether each end is usable at the reference time.
    usable: Vec<bool>,
    ends: &'a [EndModel],
    in_use: Option<usize>,
    /// Field-level weather state per category (ceiling, visibility, wind, hazards);
    /// only the categories some row of the matrix is assessed under.
    weather: [FieldWeather; 4],
    /// The minimums of each category, by [`cat_index`] (looked up once per field, not
    /// once per pairing).
    minimums: [Option<&'a Minimums>; 4],
    stale: bool,
    /// The warmed air at the table tops this field's searches asked for.
    tops: std::cell::RefCell<Tops>,
}

/// The warmed air of one field's report at a few temperatures: every search of a
/// type probes its tables' warmest OAT first, and types often share it, so each is
/// computed once per field.
struct Tops {
    len: usize,
    seen: [(u64, WarmAir); 4],
}

impl Default for Tops {
    fn default() -> Tops {
        let none = WarmAir {
            oat_c: f64::NAN,
            density_kg_m3: f64::NAN,
            density_altitude_ft: f64::NAN,
            true_airspeed_factor: f64::NAN,
        };
        Tops {
            len: 0,
            seen: [(f64::NAN.to_bits(), none); 4],
        }
    }
}

/// Field `fi`'s report at the reference time, with its age, and the weather read from
/// it.
fn field_report<'a>(ctx: &Context<'a>, fi: usize) -> FieldReport<'a> {
    let field = &ctx.ops.airfields[fi];
    let found = report_for(
        ctx.store,
        &field.id,
        ctx.at,
        ctx.at,
        ctx.model.stale_after_min,
    );
    FieldReport {
        wx: found
            .as_ref()
            .and_then(|(r, _)| FieldWx::from_report(r, field.elevation_ft)),
        found,
    }
}

/// A field's report ([`field_report`]).
struct FieldReport<'a> {
    found: Option<(&'a Report, ReportAge)>,
    wx: Option<FieldWx>,
}

/// Buffers reused from one airfield to the next.
#[derive(Default)]
struct Scratch {
    winds: Vec<EndWind>,
    usable: Vec<bool>,
    /// The fields' daylight on the reference date.
    sun: Option<std::sync::Arc<SunDay>>,
}

fn cat_index(c: Category) -> usize {
    match c {
        Category::StudentSolo => 0,
        Category::Solo => 1,
        Category::Dual => 2,
        Category::Charter => 3,
    }
}

impl<'a> FieldPrep<'a> {
    /// A fresh report, and every runway end closed then.
    fn no_runway(&self) -> bool {
        self.wx.is_some()
            && !self.stale
            && self.in_use.is_none()
            && !self.usable.is_empty()
            && !self.usable.iter().any(|u| *u)
    }

    /// Field `fi` with its report `found` ([`field_report`]).
    fn new(
        ctx: &Context<'a>,
        fi: usize,
        report: FieldReport<'a>,
        categories: &[bool; 4],
        scratch: &mut Scratch,
    ) -> FieldPrep<'a> {
        let ops = ctx.ops;
        let model = ctx.model;
        let ends = model.field_ends_at(fi, ctx.at);
        let FieldReport { found, wx } = report;
        let stale = found.as_ref().is_some_and(|(_, u)| u.stale);
        let mut winds = std::mem::take(&mut scratch.winds);
        winds.clear();
        if let Some(wx) = &wx {
            winds.extend(ends.iter().map(|e| wx.on_end(e.heading_true_deg)));
        }
        let mut usable = std::mem::take(&mut scratch.usable);
        usable.clear();
        usable.extend(ends.iter().map(|e| e.usable_at(ctx.at)));
        let in_use = end_in_use(model, fi, ctx.at, wx.as_ref(), &winds, &usable).map(|(k, _)| k);
        let mut minimums = [None; 4];
        for c in Category::ALL {
            minimums[cat_index(c)] = ops.minimums(c);
        }
        let mut weather = [FieldWeather::NO_DATA; 4];
        if let (Some((report, _)), Some(wx)) = (&found, &wx) {
            let date = ctx.at.date_naive();
            let day = match scratch.sun.take() {
                Some(d) if d.date() == date => d,
                _ => model.sun_on(date),
            };
            let sun = day.field(fi);
            scratch.sun = Some(day);
            for c in Category::ALL {
                if !categories[cat_index(c)] {
                    continue;
                }
                let Some(mins) = minimums[cat_index(c)] else {
                    continue;
                };
                let who = Who {
                    category: c,
                    minimums: mins,
                    pilot: None,
                    regime: ops.operator.regime,
                    buffers: &ops.operator.policy.buffers,
                };
                // Only the verdict and the deciding minimum: no source or note is written.
                let mut w = FieldWeather::WITHIN;
                limits::field_limits_to(
                    &who,
                    report,
                    wx.air.density_altitude_ft,
                    &sun,
                    ctx.at,
                    true,
                    &mut w,
                );
                weather[cat_index(c)] = w;
            }
        }
        FieldPrep {
            warming: wx.as_ref().map(|wx| Warming::new(&wx.air)),
            wx,
            winds,
            usable,
            ends,
            in_use,
            weather,
            minimums,
            stale,
            tops: Default::default(),
        }
    }

    /// `warming.at(oat_c)`, kept for the field's other searches that ask for it.
    fn warm_top(&self, warming: &Warming, oat_c: f64) -> WarmAir {
        let mut tops = self.tops.borrow_mut();
        let key = oat_c.to_bits();
        if let Some(&(_, air)) = tops.seen[..tops.len].iter().find(|(k, _)| *k == key) {
            return air;
        }
        let air = warming.at(oat_c);
        if tops.len < tops.seen.len() {
            let n = tops.len;
            tops.seen[n] = (key, air);
            tops.len += 1;
        }
        air
    }

    /// Hands the reusable buffers back.
    fn recycle(self, scratch: &mut Scratch) {
        scratch.winds = self.winds;
        scratch.usable = self.usable;
    }
}

/// Type, takeoff and landing mass (bits) and category: what a cell depends on.
type CellKey = (Option<usize>, u64, u64, Category);

/// What a cell depends on besides the field, resolved: equal classes give equal cells.
#[derive(Debug, Clone, Copy)]
struct Class {
    ty: Option<usize>,
    category: Category,
    /// Takeoff and landing mass, kg; `None` when the type is unknown.
    masses: Option<(f64, f64)>,
}

impl Class {
    fn key(&self) -> CellKey {
        let (tom, lm) = self.masses.unwrap_or((f64::NAN, f64::NAN));
        (self.ty, tom.to_bits(), lm.to_bits(), self.category)
    }
}

/// Per aircraft, computed once per matrix.
#[derive(Debug, Clone)]
struct AircraftPrep {
    ty: Option<usize>,
    category: Category,
    /// Takeoff mass per departure airfield of its legs (else MTOW).
    legs_from: Vec<(usize, f64)>,
    /// Landing mass per arrival airfield of its legs.
    legs_to: Vec<(usize, f64)>,
}

#[derive(Debug, Clone)]
struct Prepared {
    aircraft: Vec<AircraftPrep>,
    /// Indices into `Ops::aircraft` of the rows (`Matrix::aircraft`).
    rows: Vec<usize>,
    /// The distinct classes of the rows away from their legs' airfields.
    classes: Vec<Class>,
    /// Each class's masses located on its type's mass axis, parallel to `classes`.
    class_masses: Vec<Masses>,
    /// The class of each row (index into `classes`).
    row_class: Vec<usize>,
    /// (airfield, row) where a row's leg gives other masses than its class, sorted by
    /// airfield; `exception_start[fi]..exception_start[fi + 1]` are field `fi`'s.
    exceptions: Vec<(usize, usize)>,
    exception_start: Vec<usize>,
    /// The categories some row is assessed under, by [`cat_index`].
    categories: [bool; 4],
    /// Per type, its five tables side by side ([`pack`]).
    packed: Vec<Vec<[f64; 5]>>,
    dist_buf: f64,
    climb_buf: f64,
}

impl Prepared {
    fn new(ctx: &Context<'_>, rows: &[usize]) -> Prepared {
        let ops = ctx.ops;
        let model = ctx.model;
        let day = ctx.at.date_naive();
        let mut aircraft: Vec<AircraftPrep> = (0..ops.aircraft.len())
            .map(|i| AircraftPrep {
                ty: model.aircraft_type.get(i).copied().flatten(),
                category: model.strictest.unwrap_or(Category::StudentSolo),
                legs_from: Vec::new(),
                legs_to: Vec::new(),
            })
            .collect();
        let position: std::collections::HashMap<&str, usize> = ops
            .aircraft
            .iter()
            .enumerate()
            .map(|(i, a)| (a.registration.as_str(), i))
            .collect();
        let mut cats: Vec<Vec<Category>> = vec![Vec::new(); ops.aircraft.len()];
        for leg in ops
            .legs
            .iter()
            .filter(|l| l.departs_utc().date_naive() == day)
        {
            let Some(&i) = position.get(leg.aircraft.as_str()) else {
                continue;
            };
            cats[i].push(leg.category);
            let (tom, lm) = super::leg::leg_masses(ops, leg);
            if let (Some(fi), Some(m)) = (ops.airfield_position(&leg.from), tom) {
                aircraft[i].legs_from.push((fi, m));
            }
            if let (Some(fi), Some(m)) = (ops.airfield_position(&leg.to), lm) {
                aircraft[i].legs_to.push((fi, m));
            }
        }
        for (ap, cats) in aircraft.iter_mut().zip(cats) {
            // The strictest category the aircraft flies today, else the operator's.
            if let Some(c) = Category::ALL.into_iter().find(|c| cats.contains(c)) {
                ap.category = c;
            }
        }
        let b: &Buffers = &ops.operator.policy.buffers;
        let mut prep = Prepared {
            aircraft,
            classes: Vec::new(),
            class_masses: Vec::new(),
            rows: rows.to_vec(),
            row_class: Vec::with_capacity(rows.len()),
            exceptions: Vec::new(),
            exception_start: Vec::new(),
            categories: [false; 4],
            packed: ops.types.iter().map(|t| pack(&t.performance)).collect(),
            dist_buf: b.distance_percent / 100.0,
            climb_buf: b.climb_percent / 100.0,
        };
        // Each row's class away from its legs' fields (`usize::MAX`: no such field).
        for (ai, &a) in rows.iter().enumerate() {
            let class = prep.class(model, a, usize::MAX);
            let key = class.key();
            let c = match prep.classes.iter().position(|k| k.key() == key) {
                Some(c) => c,
                None => {
                    prep.classes.push(class);
                    prep.categories[cat_index(class.category)] = true;
                    prep.classes.len() - 1
                }
            };
            prep.row_class.push(c);
            let ap = &prep.aircraft[a];
            for &(fi, _) in ap.legs_from.iter().chain(&ap.legs_to) {
                if prep.class(model, a, fi).key() != key {
                    prep.exceptions.push((fi, ai));
                }
            }
        }
        prep.class_masses = prep.classes.iter().map(|c| Masses::of(ctx, c)).collect();
        prep.exceptions.sort_unstable();
        prep.exceptions.dedup();
        let fields = ops.airfields.len();
        let mut k = 0;
        for fi in 0..=fields {
            while k < prep.exceptions.len() && prep.exceptions[k].0 < fi {
                k += 1;
            }
            prep.exception_start.push(k);
        }
        prep
    }

    /// Takeoff and landing mass of aircraft `a` at field `fi`: its leg's where it has
    /// one there, else the maximum takeoff mass (landing: held to the maximum landing mass).
    fn masses(&self, model: &Model, a: usize, fi: usize) -> Option<(f64, f64)> {
        let ap = &self.aircraft[a];
        let ty = model.types.get(ap.ty?)?;
        let tom = ap
            .legs_from
            .iter()
            .find(|(f, _)| *f == fi)
            .map_or(ty.max_takeoff_mass_kg, |&(_, m)| m);
        let lm = ap
            .legs_to
            .iter()
            .find(|(f, _)| *f == fi)
            .map_or(tom.min(ty.max_landing_mass_kg), |&(_, m)| m);
        Some((tom, lm))
    }

    /// What aircraft `a`'s cell at field `fi` depends on besides the field.
    fn class(&self, model: &Model, a: usize, fi: usize) -> Class {
        let ap = &self.aircraft[a];
        Class {
            ty: ap.ty,
            category: ap.category,
            masses: self.masses(model, a, fi),
        }
    }

    /// Field `fi`'s cells: one per class into `per_class`, and those of the rows whose
    /// legs give other masses there into `exceptions`, in the order of the field's
    /// [`Prepared::exceptions`] (rows alike in type, masses and category share one
    /// computation).
    fn column(
        &self,
        ctx: &Context<'_>,
        fi: usize,
        found: FieldReport<'_>,
        scratch: &mut Scratch,
        per_class: &mut [PairCell],
        exceptions: &mut [PairCell],
    ) {
        let field = FieldPrep::new(ctx, fi, found, &self.categories, scratch);
        for ((c, m), out) in self
            .classes
            .iter()
            .zip(&self.class_masses)
            .zip(per_class.iter_mut())
        {
            *out = self.pair(ctx, &field, c, m);
        }
        let mut seen: Vec<(CellKey, PairCell)> = Vec::new();
        let span = self.exception_start[fi]..self.exception_start[fi + 1];
        for (&(_, ai), out) in self.exceptions[span].iter().zip(exceptions) {
            let class = self.class(ctx.model, self.rows[ai], fi);
            let key = class.key();
            let cell = match seen.iter().find(|(k, _)| *k == key) {
                Some((_, c)) => *c,
                None => {
                    let c = self.pair(ctx, &field, &class, &Masses::of(ctx, &class));
                    seen.push((key, c));
                    c
                }
            };
            *out = cell;
        }
        field.recycle(scratch);
    }

    fn pair(
        &self,
        ctx: &Context<'_>,
        field: &FieldPrep<'_>,
        class: &Class,
        masses: &Masses,
    ) -> PairCell {
        let ops = ctx.ops;
        let model = ctx.model;
        if class.ty.is_some() && field.no_runway() {
            return PairCell::NO_RUNWAY;
        }
        let (Some(t), Some(wx), Some(warming), Some(in_use)) = (
            class.ty,
            field.wx.as_ref(),
            field.warming.as_ref(),
            field.in_use,
        ) else {
            return PairCell::NO_DATA;
        };
        if field.stale {
            return PairCell::NO_DATA;
        }
        let Some(mins) = field.minimums[cat_index(class.category)] else {
            return PairCell::NO_DATA;
        };
        let ty = &model.types[t];
        let perf = &ops.types[t].performance;
        let Some((tom, lm)) = class.masses else {
            return PairCell::NO_DATA;
        };
        let b = &ops.operator.policy.buffers;
        let setup = Setup {
            model,
            ty,
            perf,
            mins,
            takeoff_mass_kg: tom,
            landing_mass_kg: lm,
            distance_buffer: self.dist_buf,
            climb_buffer: self.climb_buf,
        };
        // Mass and pressure altitude are located once; per temperature only the OAT.
        let lookup = Lookup::located(&setup, &self.packed[t], masses, wx.air.pressure_altitude_ft);
        // The landing rules of the category, resolved once per class.
        let resolved;
        let landing_rules = match &masses.landing_rules {
            Some(r) => r,
            None => {
                resolved = perf::landing_rules(&ty.landing, mins.wet_paved_landing_factor);
                &resolved
            }
        };
        let corrections =
            |k: usize| EndCorrections::new(&setup, landing_rules, &field.ends[k], &field.winds[k]);
        let eval = |k: usize, air: &WarmAir, tv: Option<&TableValues>, c: &EndCorrections| {
            evaluate(&setup, b, &field.ends[k], air, tv, &field.winds[k], c)
        };
        let air0 = WarmAir {
            oat_c: wx.air.oat_c,
            density_kg_m3: wx.air.density_kg_m3,
            density_altitude_ft: wx.air.density_altitude_ft,
            true_airspeed_factor: wx.air.true_airspeed_factor,
        };
        // One cell lookup for this air, shared by every runway end.
        let tv0 = lookup.at(wx.air.oat_c);
        let weather = field.weather[cat_index(class.category)];
        let in_use_corrections = corrections(in_use);
        let now = eval(in_use, &air0, tv0.as_ref(), &in_use_corrections);
        // An end's state is the worst of its checks' (`Outcome::add`), so its wind and
        // density-altitude limits alone bound it from below, as `evaluate` judges them:
        // an end bounded at or above the best so far cannot better it.
        let max_x = mins.max_crosswind_kt.min(ty.max_demonstrated_crosswind_kt);
        let wind_bound = |k: usize| {
            let w = &field.winds[k];
            verdict(max_x - w.crosswind_kt, b.wind_kt)
                .and(verdict(
                    mins.max_tailwind_kt - w.tailwind_limit_kt,
                    b.wind_kt,
                ))
                .and(verdict(
                    mins.max_density_altitude_ft - air0.density_altitude_ft,
                    b.density_altitude_ft,
                ))
        };
        let mut best = now.state;
        for k in 0..field.ends.len() {
            if best == State::Within {
                break; // No end can do better.
            }
            if k != in_use && field.usable[k] && wind_bound(k) < best {
                best = best.min(eval(k, &air0, tv0.as_ref(), &corrections(k)).state);
            }
        }
        let (state, score, limiting, margin, minimum, searched) =
            combine(&now, &weather, wind_below(&setup, b, &field.winds[in_use]));
        // Wind limits do not change with temperature: the search judges only the rest.
        // With the dew point at or below the OAT, no warming at all is the air itself.
        let zero_is_now = wx.air.dewpoint_c.is_none_or(|td| td <= wx.air.oat_c);
        // The search's first probe past now: the tables' warmest OAT.
        let up = ty.oat_top_c - wx.air.oat_c;
        let found = if searched {
            super::headroom::search(
                {
                    let hot = HotEnd {
                        setup: &setup,
                        buffers: b,
                        end: &field.ends[in_use],
                        wind: &field.winds[in_use],
                        corrections: &in_use_corrections,
                    };
                    move |dt| {
                        if dt == 0.0 && zero_is_now {
                            return now.temperature_score;
                        }
                        let oat_c = wx.air.oat_c + dt;
                        let air = if dt == up {
                            field.warm_top(warming, oat_c)
                        } else {
                            warming.at(oat_c)
                        };
                        hot.temperature_score(&air, lookup.at(air.oat_c).as_ref())
                    }
                },
                up,
                ty.oat_bottom_c - wx.air.oat_c,
            )
        } else {
            None
        };
        PairCell {
            state,
            score,
            margin_percent: margin,
            limiting,
            best_end_state: best.and(weather.state),
            end_in_use: u8::try_from(in_use).ok(),
            headroom_c: found.map(|f| f.warming_c),
            headroom_table_ends: found.is_some_and(|f| f.table_ends),
            minimum,
        }
    }
}

/// The distance corrections of one class on one runway end in the report's wind,
/// resolved once and applied to the table values at the report's OAT and at every
/// temperature of the headroom search: the chains of `leg::departure_with` and
/// `leg::landing_with` (`perf::distances` is `perf::corrections` then
/// `Corrections::chain`), by the same operations.
#[derive(Debug, Clone, Copy)]
struct EndCorrections {
    /// `None`: a correction the manual lacks (no-data at every temperature).
    takeoff: Option<perf::Corrections>,
    landing: Option<perf::Corrections>,
    /// The extra factor on the landing checks (the category's wet paved factor).
    landing_extra: f64,
}

impl EndCorrections {
    /// `landing_rules`: `perf::landing_rules` of the type's landing rules and the
    /// category's wet paved factor.
    fn new(s: &Setup<'_>, landing_rules: &PhaseRules, end: &EndModel, w: &EndWind) -> Self {
        let wind = perf::WindInput {
            headwind_kt: w.headwind_kt,
            headwind_credit: s.model.headwind_credit,
            tailwind_factor: s.model.tailwind_factor,
        };
        let takeoff = perf::corrections(&s.ty.takeoff, wind, end.surface, end.slope_percent).ok();
        // A downhill landing is the adverse one.
        let landing = perf::corrections(landing_rules, wind, end.surface, -end.slope_percent).ok();
        EndCorrections {
            takeoff,
            landing_extra: landing.map_or(1.0, |c| {
                c.landing_extra_factor(s.mins.wet_paved_landing_factor)
            }),
            landing,
        }
    }
}

/// The runway in use of one pairing, for the headroom search: its distance corrections
/// resolved once, then per temperature only what the temperature changes.
struct HotEnd<'a> {
    setup: &'a Setup<'a>,
    buffers: &'a Buffers,
    end: &'a EndModel,
    wind: &'a EndWind,
    corrections: &'a EndCorrections,
}

impl HotEnd<'_> {
    /// [`Outcome::temperature_score`] of [`evaluate`] on this end, the same value by the
    /// same operations in the same order, without the wind limits and the chains' other
    /// figures.
    #[inline]
    fn temperature_score(&self, air: &WarmAir, tv: Option<&TableValues>) -> Option<f64> {
        let (s, end, mins) = (self.setup, self.end, self.setup.mins);
        // A check with a NaN margin is no-data, which ends the search's knowledge.
        let step =
            |t: f64, margin: f64, buffer: f64| (!margin.is_nan()).then(|| t.min(margin / buffer));
        let tv = tv?;
        let c = self.corrections.takeoff.as_ref()?;
        let [_, _, gr, d50] = c.figures(tv.takeoff_ground_roll_m, tv.takeoff_distance_50ft_m);
        let m = perf::min_margin_of(gr, d50, end, &mins.takeoff_checks, 1.0);
        let t = step(f64::INFINITY, m, s.distance_buffer)?;
        let climb = perf::climb(
            tv.climb_rate_fpm,
            s.ty.climb_speed_kias,
            air.true_airspeed_factor,
            self.wind.headwind_kt,
            mins.min_climb_rate_fpm,
            end.required_gradient_ft_per_nm,
        );
        let t = step(t, climb.margin(), s.climb_buffer)?;
        let l = self.corrections.landing.as_ref()?;
        let [_, _, gr, d50] = l.figures(tv.landing_ground_roll_m, tv.landing_distance_50ft_m);
        let m = perf::min_margin_of(
            gr,
            d50,
            end,
            &mins.landing_checks,
            self.corrections.landing_extra,
        );
        let t = step(t, m, s.distance_buffer)?;
        step(
            t,
            mins.max_density_altitude_ft - air.density_altitude_ft,
            self.buffers.density_altitude_ft,
        )
    }
}

/// A class's takeoff and landing masses located on its type's mass axis (held at the
/// lightest table mass for a conservative type), and its landing rules, once per
/// matrix: they do not depend on the field. `None`: outside the table.
#[derive(Debug, Clone, Copy, Default)]
struct Masses {
    takeoff: Option<MassAt>,
    /// `None` with a landing mass equal to the takeoff mass (the takeoff cell serves).
    landing: Option<Option<MassAt>>,
    /// `perf::landing_rules` of the type and the category's wet paved factor (`None`:
    /// not resolved, [`Prepared::pair`] resolves them).
    landing_rules: Option<PhaseRules>,
}

impl Masses {
    /// The masses of `s`.
    fn located(s: &Setup<'_>) -> Masses {
        let grid = &s.perf.grid;
        let conservative = s.ty.conservative_below;
        let at = |mass_kg: f64| {
            let m = if conservative {
                grid.hold_below(Axis::Mass, mass_kg).0
            } else {
                mass_kg
            };
            grid.locate_mass(m).ok()
        };
        Masses {
            takeoff: at(s.takeoff_mass_kg),
            landing: (s.landing_mass_kg != s.takeoff_mass_kg).then(|| at(s.landing_mass_kg)),
            landing_rules: None,
        }
    }

    /// The masses of a class (none for an unknown type or no masses).
    fn of(ctx: &Context<'_>, class: &Class) -> Masses {
        let (Some(t), Some((tom, lm))) = (class.ty, class.masses) else {
            return Masses::default();
        };
        let Some(mins) = ctx.ops.minimums(class.category) else {
            return Masses::default();
        };
        let ty = &ctx.model.types[t];
        Masses {
            landing_rules: Some(perf::landing_rules(
                &ty.landing,
                mins.wet_paved_landing_factor,
            )),
            ..Masses::located(&Setup {
                model: ctx.model,
                ty,
                perf: &ctx.ops.types[t].performance,
                mins,
                takeoff_mass_kg: tom,
                landing_mass_kg: lm,
                distance_buffer: f64::NAN,
                climb_buffer: f64::NAN,
            })
        }
    }
}

/// [`table_values`] for one setup at one pressure altitude and any OAT: the mass and
/// pressure-altitude axes located once, the OAT per call. Equal to `table_values` for
/// the same point, bit for bit (a test below holds it to that).
struct Lookup<'a> {
    perf: &'a Performance,
    packed: &'a [[f64; 5]],
    conservative: bool,
    takeoff: Option<Slice>,
    /// `None` with a landing mass equal to the takeoff mass (the takeoff cell serves).
    landing: Option<Option<Slice>>,
}

impl<'a> Lookup<'a> {
    #[cfg(test)]
    fn new(s: &Setup<'a>, packed: &'a [[f64; 5]], pressure_altitude_ft: f64) -> Lookup<'a> {
        let masses = Masses::located(s);
        Lookup::located(s, packed, &masses, pressure_altitude_ft)
    }

    /// With the setup's masses already located ([`Masses`]): only the pressure altitude
    /// is located here.
    fn located(
        s: &Setup<'a>,
        packed: &'a [[f64; 5]],
        masses: &Masses,
        pressure_altitude_ft: f64,
    ) -> Lookup<'a> {
        let grid = &s.perf.grid;
        let conservative = s.ty.conservative_below;
        let p = if conservative {
            grid.hold_below(Axis::PressureAltitude, pressure_altitude_ft)
                .0
        } else {
            pressure_altitude_ft
        };
        // A mass outside the table is no slice, as `locate_slice` refuses it first.
        let slice = |m: &Option<MassAt>| m.as_ref().and_then(|m| m.slice(grid, p).ok());
        Lookup {
            perf: s.perf,
            packed,
            conservative,
            takeoff: slice(&masses.takeoff),
            landing: masses.landing.as_ref().map(slice),
        }
    }

    /// The five table values at `oat_c`; `None` outside the tables. The OAT is located
    /// once for both masses, and each mass's cell reads only the tables it serves.
    #[inline]
    fn at(&self, oat_c: f64) -> Option<TableValues> {
        let grid = &self.perf.grid;
        let oat = if self.conservative {
            grid.hold_below(Axis::Oat, oat_c).0
        } else {
            oat_c
        };
        let takeoff = self.takeoff?;
        let oat = grid.locate_oat(oat).ok()?;
        Some(match &self.landing {
            None => {
                let v = takeoff.read_rows::<5, 0, 5>(&oat, self.packed);
                TableValues {
                    takeoff_ground_roll_m: v[0],
                    takeoff_distance_50ft_m: v[1],
                    climb_rate_fpm: v[2],
                    landing_ground_roll_m: v[3],
                    landing_distance_50ft_m: v[4],
                }
            }
            Some(l) => {
                let vl = l.as_ref()?.read_rows::<5, 3, 2>(&oat, self.packed);
                let vt = takeoff.read_rows::<5, 0, 3>(&oat, self.packed);
                TableValues {
                    takeoff_ground_roll_m: vt[0],
                    takeoff_distance_50ft_m: vt[1],
                    climb_rate_fpm: vt[2],
                    landing_ground_roll_m: vl[0],
                    landing_distance_50ft_m: vl[1],
                }
            }
        })
    }
}

/// A type's five tables side by side, one `[f64; 5]` per grid point (takeoff ground
/// roll, takeoff distance to 50 ft, climb rate, landing ground roll, landing distance
/// from 50 ft), so a cell's eight corners are eight reads instead of forty.
fn pack(perf: &Performance) -> Vec<[f64; 5]> {
    let tables = [
        &perf.takeoff_ground_roll_m,
        &perf.takeoff_distance_50ft_m,
        &perf.climb_rate_fpm,
        &perf.landing_ground_roll_m,
        &perf.landing_distance_50ft_m,
    ];
    // A value a table lacks reads as zero, as `Table::at` reads it.
    (0..perf.grid.len())
        .map(|i| tables.map(|t| t.values().get(i).copied().unwrap_or(0.0)))
        .collect()
}

#[derive(Debug, Clone, Copy)]
struct Outcome {
    state: State,
    score: f64,
    margin_percent: f64,
    limiting: PairLimit,
    /// The smallest margin ÷ buffer of the temperature-dependent checks (distances,
    /// climb, density altitude); `None` when the tables do not cover the point.
    temperature_score: Option<f64>,
}

impl Outcome {
    /// A limit with `margin` to spare in its unit and a thin `band` in the same unit.
    fn limit(&mut self, margin: f64, band: f64, what: PairLimit) {
        self.add(verdict(margin, band), margin / band, margin, what);
    }

    fn add(&mut self, state: State, score: f64, margin_percent: f64, what: PairLimit) {
        if state > self.state || (state == self.state && score < self.score) {
            *self = Outcome {
                state,
                score,
                margin_percent,
                limiting: what,
                temperature_score: self.temperature_score,
            };
        }
        if !matches!(what, PairLimit::Crosswind | PairLimit::Tailwind) {
            self.temperature_score = match (self.temperature_score, state) {
                (_, State::NoData) | (None, _) => None,
                (Some(t), _) => Some(t.min(score)),
            };
        }
    }
}

/// One runway end at one air and its table values, with the end's corrections resolved
/// ([`EndCorrections`]): the checks of `leg::departure_with` and `leg::landing_with`, the
/// wind limits and the density altitude.
#[inline]
fn evaluate(
    s: &Setup<'_>,
    b: &Buffers,
    end: &EndModel,
    air: &WarmAir,
    tv: Option<&TableValues>,
    w: &EndWind,
    corrections: &EndCorrections,
) -> Outcome {
    let (ty, mins) = (s.ty, s.mins);
    let (dist_buf, climb_buf) = (s.distance_buffer, s.climb_buffer);
    let mut o = Outcome {
        state: State::Within,
        score: f64::INFINITY,
        margin_percent: f64::INFINITY,
        limiting: PairLimit::None,
        temperature_score: Some(f64::INFINITY),
    };
    match tv {
        None => o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table),
        Some(tv) => {
            match &corrections.takeoff {
                Some(c) => {
                    let [_, _, gr, d50] =
                        c.figures(tv.takeoff_ground_roll_m, tv.takeoff_distance_50ft_m);
                    let m = perf::min_margin_of(gr, d50, end, &mins.takeoff_checks, 1.0);
                    o.add(
                        verdict(m, dist_buf),
                        m / dist_buf,
                        m * 100.0,
                        PairLimit::Takeoff,
                    );
                    let climb = perf::climb(
                        tv.climb_rate_fpm,
                        ty.climb_speed_kias,
                        air.true_airspeed_factor,
                        w.headwind_kt,
                        mins.min_climb_rate_fpm,
                        end.required_gradient_ft_per_nm,
                    );
                    let c = climb.margin();
                    o.add(
                        verdict(c, climb_buf),
                        c / climb_buf,
                        c * 100.0,
                        PairLimit::Climb,
                    );
                }
                None => o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table),
            }
            match &corrections.landing {
                Some(c) => {
                    let [_, _, gr, d50] =
                        c.figures(tv.landing_ground_roll_m, tv.landing_distance_50ft_m);
                    let m = perf::min_margin_of(
                        gr,
                        d50,
                        end,
                        &mins.landing_checks,
                        corrections.landing_extra,
                    );
                    o.add(
                        verdict(m, dist_buf),
                        m / dist_buf,
                        m * 100.0,
                        PairLimit::Landing,
                    );
                }
                None => o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table),
            }
        }
    }
    let max_x = mins.max_crosswind_kt.min(ty.max_demonstrated_crosswind_kt);
    o.limit(max_x - w.crosswind_kt, b.wind_kt, PairLimit::Crosswind);
    o.limit(
        mins.max_tailwind_kt - w.tailwind_limit_kt,
        b.wind_kt,
        PairLimit::Tailwind,
    );
    o.limit(
        mins.max_density_altitude_ft - air.density_altitude_ft,
        b.density_altitude_ft,
        PairLimit::DensityAltitude,
    );
    o
}

/// The whole matrix.
pub fn matrix(ctx: &Context<'_>) -> Matrix {
    let ops = ctx.ops;
    let aircraft: Vec<usize> = (0..ops.aircraft.len())
        .filter(|&i| ops.aircraft[i].status == Status::Available)
        .collect();
    let prep = Prepared::new(ctx, &aircraft);
    let fields = ops.airfields.len();
    // Field by field, one cell per class and one per row whose legs differ there.
    let n_classes = prep.classes.len();
    let mut by_class = vec![PairCell::NO_DATA; n_classes * fields];
    let mut per_class = vec![PairCell::NO_DATA; n_classes];
    let mut exception_cells = vec![PairCell::NO_DATA; prep.exceptions.len()];
    let mut scratch = Scratch::default();
    // Every field's report and its weather first: the look-ups and the reads of the
    // reports are independent of each other, so their cache misses overlap instead of
    // waiting one by one between the fields' pairings.
    let found: Vec<_> = (0..fields).map(|fi| field_report(ctx, fi)).collect();
    for (fi, found) in found.into_iter().enumerate() {
        let span = prep.exception_start[fi]..prep.exception_start[fi + 1];
        prep.column(
            ctx,
            fi,
            found,
            &mut scratch,
            &mut per_class,
            &mut exception_cells[span],
        );
        for (c, cell) in per_class.iter().enumerate() {
            by_class[c * fields + fi] = *cell;
        }
    }
    Matrix {
        aircraft,
        fields,
        by_class,
        exception_cells,
        prep,
    }
}

#[cfg(test)]
mod tests {
    //! The matrix against the way it was computed before the fast path: every cell on
    //! its own, with the full air of `AirData::with_oat`, `leg::table_values` and
    //! `leg::departure_with` at every step of the headroom search. Cells must agree bit
    //! for bit (the fast path changes the arithmetic's route, never its operations).
    use super::*;
    use crate::assess::leg::{Gap, departure_with, landing_with, table_values};
    use crate::assess::model::DaySettings;
    use crate::atmosphere::AirData;
    use crate::observation::{Store, decode_all};
    use crate::ops::synthetic::{self, Size};
    use crate::ops::{demo, load_files};
    use chrono::{DateTime, TimeZone, Utc};
    use proptest::prelude::*;

    fn evaluate_reference(
        s: &Setup<'_>,
        b: &Buffers,
        end: &EndModel,
        air: &AirData,
        tv: &Result<TableValues, Gap>,
        w: &EndWind,
    ) -> Outcome {
        let (ty, mins) = (s.ty, s.mins);
        let (dist_buf, climb_buf) = (s.distance_buffer, s.climb_buffer);
        let mut o = Outcome {
            state: State::Within,
            score: f64::INFINITY,
            margin_percent: f64::INFINITY,
            limiting: PairLimit::None,
            temperature_score: Some(f64::INFINITY),
        };
        let tv = match tv {
            Ok(tv) => Some(tv),
            Err(_) => {
                o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table);
                None
            }
        };
        match tv.map(|tv| departure_with(s, tv, end, air, w.headwind_kt)) {
            Some(Ok((chain, climb))) => {
                let m = perf::min_margin(&chain, end, &mins.takeoff_checks, 1.0);
                o.add(
                    verdict(m, dist_buf),
                    m / dist_buf,
                    m * 100.0,
                    PairLimit::Takeoff,
                );
                let c = climb.margin();
                o.add(
                    verdict(c, climb_buf),
                    c / climb_buf,
                    c * 100.0,
                    PairLimit::Climb,
                );
            }
            Some(Err(_)) => o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table),
            None => {}
        }
        match tv.map(|tv| landing_with(s, tv, end, w.headwind_kt)) {
            Some(Ok(chain)) => {
                let extra = perf::landing_extra_factor(&chain, mins.wet_paved_landing_factor);
                let m = perf::min_margin(&chain, end, &mins.landing_checks, extra);
                o.add(
                    verdict(m, dist_buf),
                    m / dist_buf,
                    m * 100.0,
                    PairLimit::Landing,
                );
            }
            Some(Err(_)) => o.add(State::NoData, f64::NAN, f64::NAN, PairLimit::Table),
            None => {}
        }
        let max_x = mins.max_crosswind_kt.min(ty.max_demonstrated_crosswind_kt);
        o.limit(max_x - w.crosswind_kt, b.wind_kt, PairLimit::Crosswind);
        o.limit(
            mins.max_tailwind_kt - w.tailwind_limit_kt,
            b.wind_kt,
            PairLimit::Tailwind,
        );
        o.limit(
            mins.max_density_altitude_ft - air.density_altitude_ft,
            b.density_altitude_ft,
            PairLimit::DensityAltitude,
        );
        o
    }

    /// One cell the old way: aircraft `a` at field `fi`.
    fn cell_reference(
        ctx: &Context<'_>,
        prep: &Prepared,
        field: &FieldPrep<'_>,
        a: usize,
        fi: usize,
    ) -> PairCell {
        let (ops, model) = (ctx.ops, ctx.model);
        let ap = &prep.aircraft[a];
        if ap.ty.is_some() && field.no_runway() {
            return PairCell::NO_RUNWAY;
        }
        let (Some(t), Some(wx), Some(in_use)) = (ap.ty, field.wx.as_ref(), field.in_use) else {
            return PairCell::NO_DATA;
        };
        if field.stale {
            return PairCell::NO_DATA;
        }
        let Some(mins) = ops.minimums(ap.category) else {
            return PairCell::NO_DATA;
        };
        let ty = &model.types[t];
        let Some((tom, lm)) = prep.masses(model, a, fi) else {
            return PairCell::NO_DATA;
        };
        let b = &ops.operator.policy.buffers;
        let setup = Setup {
            model,
            ty,
            perf: &ops.types[t].performance,
            mins,
            takeoff_mass_kg: tom,
            landing_mass_kg: lm,
            distance_buffer: prep.dist_buf,
            climb_buffer: prep.climb_buf,
        };
        let eval = |k: usize, air: &AirData, tv: &Result<TableValues, Gap>| {
            evaluate_reference(&setup, b, &field.ends[k], air, tv, &field.winds[k])
        };
        let tv0 = table_values(&setup, &wx.air);
        let weather = weather_reference(ctx, fi, ap.category);
        let now = eval(in_use, &wx.air, &tv0);
        let mut best = now.state;
        for k in 0..field.ends.len() {
            if k != in_use && field.ends[k].usable_at(ctx.at) {
                best = best.min(eval(k, &wx.air, &tv0).state);
            }
        }
        let (state, score, limiting, margin, minimum, searched) =
            combine(&now, &weather, wind_below(&setup, b, &field.winds[in_use]));
        let found = if searched {
            super::super::headroom::search(
                |dt| {
                    let air = wx.air.with_oat(wx.air.oat_c + dt);
                    eval(in_use, &air, &table_values(&setup, &air)).temperature_score
                },
                ty.oat_top_c - wx.air.oat_c,
                ty.oat_bottom_c - wx.air.oat_c,
            )
        } else {
            None
        };
        PairCell {
            state,
            score,
            margin_percent: margin,
            limiting,
            best_end_state: best.and(weather.state),
            end_in_use: u8::try_from(in_use).ok(),
            headroom_c: found.map(|f| f.warming_c),
            headroom_table_ends: found.is_some_and(|f| f.table_ends),
            minimum,
        }
    }

    /// A field's weather verdict for a category the old way: the report, the field's
    /// daylight computed afresh for the reference date, every field limit with its
    /// texts, then the worst of them but density altitude.
    fn weather_reference(ctx: &Context<'_>, fi: usize, category: Category) -> FieldWeather {
        let ops = ctx.ops;
        let field = &ops.airfields[fi];
        let found = crate::assess::leg::observation_for(
            ctx.store,
            &field.id,
            ctx.at,
            ctx.at,
            ctx.model.stale_after_min,
        );
        let Some((report, _)) = found else {
            return FieldWeather::NO_DATA;
        };
        let (Some(wx), Some(mins)) = (
            FieldWx::from_report(report, field.elevation_ft),
            ops.minimums(category),
        ) else {
            return FieldWeather::NO_DATA;
        };
        let who = Who {
            category,
            minimums: mins,
            pilot: None,
            regime: ops.operator.regime,
            buffers: &ops.operator.policy.buffers,
        };
        let mut lim = Vec::new();
        limits::field_limits(
            &who,
            report,
            wx.air.density_altitude_ft,
            &limits::sun(field, ctx.at),
            ctx.at,
            true,
            &mut lim,
        );
        FieldWeather::pick(&lim)
    }

    fn same(a: &PairCell, b: &PairCell) -> bool {
        a.state == b.state
            && a.score.to_bits() == b.score.to_bits()
            && a.margin_percent.to_bits() == b.margin_percent.to_bits()
            && a.limiting == b.limiting
            && a.best_end_state == b.best_end_state
            && a.end_in_use == b.end_in_use
            && a.headroom_c.map(f64::to_bits) == b.headroom_c.map(f64::to_bits)
            && a.headroom_table_ends == b.headroom_table_ends
            && a.minimum.map(|m| (m.kind, m.margin.to_bits()))
                == b.minimum.map(|m| (m.kind, m.margin.to_bits()))
    }

    fn check_against_reference(ops: &Ops, store: &Store, at: DateTime<Utc>) -> usize {
        let model = Model::new(ops, &DaySettings::default());
        check_with_model(ops, &model, store, at)
    }

    /// Every cell of the matrix on `model` (which may have served other dates before)
    /// against the cell-by-cell reference; returns how many had a headroom.
    fn check_with_model(ops: &Ops, model: &Model, store: &Store, at: DateTime<Utc>) -> usize {
        let ctx = Context {
            ops,
            model,
            store,
            at,
        };
        let mut m = matrix(&ctx);
        let mut checked = 0;
        for fi in 0..m.fields {
            // Every category's weather, as before only the rows' categories were.
            let found = field_report(&ctx, fi);
            let field = FieldPrep::new(&ctx, fi, found, &[true; 4], &mut Scratch::default());
            for c in Category::ALL {
                let (got, want) = (field.weather[cat_index(c)], weather_reference(&ctx, fi, c));
                assert!(
                    got.state == want.state
                        && got.score.to_bits() == want.score.to_bits()
                        && got.minimum.map(|m| (m.kind, m.margin.to_bits(), m.unit))
                            == want.minimum.map(|m| (m.kind, m.margin.to_bits(), m.unit)),
                    "{} {c:?} weather: {got:?} vs {want:?}",
                    ops.airfields[fi].id
                );
            }
            for (ai, &a) in m.aircraft.iter().enumerate() {
                let want = cell_reference(&ctx, &m.prep, &field, a, fi);
                let got = m.cell(ai, fi);
                assert!(
                    same(got, &want),
                    "{} at {}: {got:?} vs {want:?}",
                    ops.aircraft[a].registration,
                    ops.airfields[fi].id
                );
                checked += usize::from(want.headroom_c.is_some());
            }
        }
        // A column recomputed in place gives the same cells.
        let before: Vec<PairCell> = m.cells().copied().collect();
        for fi in 0..m.fields {
            m.update_field(&ctx, fi);
        }
        assert_eq!(before.len(), m.aircraft.len() * m.fields);
        assert!(before.iter().zip(m.cells()).all(|(a, b)| same(a, b)));
        checked
    }

    fn store_of(ops: &Ops, at: DateTime<Utc>) -> Store {
        let mut store = Store::default();
        for (_, text) in &ops.observations {
            for r in decode_all(text, at) {
                store.insert(r.report);
            }
        }
        store
    }

    #[test]
    fn matrix_equals_the_cell_by_cell_reference_on_a_synthetic_operator() {
        let size = Size {
            types: 10,
            aircraft: 40,
            airfields: 120,
            legs: 160,
            hours: 12,
        };
        let ops = load_files(&synthetic::operator(size)).ops.expect("loads");
        for h in [7, 12, 17] {
            let at = Utc.with_ymd_and_hms(2026, 6, 14, h, 0, 0).unwrap();
            let checked = check_against_reference(&ops, &store_of(&ops, at), at);
            assert!(
                checked > 1_000,
                "only {checked} cells with a headroom at {h}Z"
            );
        }
    }

    #[test]
    fn matrix_equals_the_cell_by_cell_reference_on_the_demo() {
        let ops = demo::load().ops.expect("the demo loads");
        for h in [6, 8, 11, 14, 16] {
            let at = Utc.with_ymd_and_hms(2026, 6, 14, h, 0, 0).unwrap();
            check_against_reference(&ops, &store_of(&ops, at), at);
        }
    }

    /// One report per airfield, observed ten minutes before `at`: light wind, good
    /// visibility, so that daylight is what a solo departure turns on before sunrise.
    fn fresh_store(ops: &Ops, at: DateTime<Utc>) -> Store {
        let observed = at - chrono::Duration::minutes(10);
        let mut store = Store::default();
        for f in &ops.airfields {
            let text = format!(
                "METAR {} {} 27005KT 9999 FEW040 14/08 Q1016",
                f.id,
                observed.format("%d%H%MZ")
            );
            for r in decode_all(&text, at) {
                store.insert(r.report);
            }
        }
        store
    }

    /// A board runs all day on one model: past midnight UTC the matrix must read the
    /// new date's daylight, never the old date's kept one. Before sunrise on the 15th
    /// (about 0440Z at the demo's fields near 40° N, 0° E by the NOAA method) the solo
    /// categories' departures are refused for daylight; the old date's sunrise would
    /// let them go. Dates beyond the ones the model keeps, and back, read right too.
    #[test]
    fn one_model_reads_each_dates_daylight_across_midnight() {
        let ops = demo::load().ops.expect("the demo loads");
        let model = Model::new(&ops, &DaySettings::default());
        let at = |d: u32, h: u32, m: u32| Utc.with_ymd_and_hms(2026, 6, d, h, m, 0).unwrap();
        let times = [
            at(14, 12, 0),
            at(14, 23, 50),
            at(15, 4, 0),
            at(14, 12, 0),
            at(16, 4, 0),
            at(17, 4, 0),
            at(18, 4, 0),
            at(19, 4, 0),
            at(15, 4, 0),
            at(15, 12, 0),
        ];
        let mut refused = 0;
        for t in times {
            let store = fresh_store(&ops, t);
            check_with_model(&ops, &model, &store, t);
            let ctx = Context {
                ops: &ops,
                model: &model,
                store: &store,
                at: t,
            };
            let m = matrix(&ctx);
            let before_sunrise = m
                .cells()
                .filter(|c| c.state == State::Below && c.limiting == PairLimit::Weather)
                .count();
            if t.format("%H").to_string() == "04" {
                assert!(before_sunrise > 0, "no daylight refusal at {t}");
                refused += before_sunrise;
            } else {
                assert_eq!(before_sunrise, 0, "a refusal at {t}");
            }
        }
        assert!(refused > 0);
    }

    fn demo_model() -> &'static (Ops, Model) {
        static DEMO: std::sync::OnceLock<(Ops, Model)> = std::sync::OnceLock::new();
        DEMO.get_or_init(|| {
            let ops = demo::load().ops.expect("the demo loads");
            let model = Model::new(&ops, &DaySettings::default());
            (ops, model)
        })
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(3000))]
        /// The headroom search's score on the runway in use (lean warming, slice lookup,
        /// resolved corrections) and the whole outcome of `evaluate` with those
        /// corrections equal, bit for bit, the reference outcome on the full air of
        /// `with_oat` and `leg::table_values`, on every demo type, field, end and
        /// category, in any wind, dry or moist, warming or cooling.
        #[test]
        fn hot_end_score_equals_the_full_evaluation(
            t in 0usize..16, f in 0usize..64, k in 0usize..8, cat in 0usize..4,
            fm in 0.0f64..1.1, fl in 0.0f64..1.1,
            qnh_hpa in 980.0f64..1_045.0, oat_c in -25.0f64..45.0,
            spread_c in 0.0f64..25.0, moist in proptest::bool::ANY,
            wind_deg in 0.0f64..360.0, wind_kt in 0.0f64..30.0, dt_c in -40.0f64..40.0,
        ) {
            let (ops, model) = demo_model();
            let t = t % model.types.len();
            let fi = f % ops.airfields.len();
            let ends = model.field_ends(fi);
            let end = &ends[k % ends.len()];
            let Some(mins) = ops.minimums(Category::ALL[cat]) else { return Ok(()); };
            let (ty, perf) = (&model.types[t], &ops.types[t].performance);
            let (lo, hi) = perf.grid.range(Axis::Mass);
            let setup = Setup {
                model, ty, perf, mins,
                takeoff_mass_kg: lo + fm * (hi - lo),
                landing_mass_kg: lo + fl * (hi - lo),
                distance_buffer: 0.1, climb_buffer: 0.1,
            };
            let air = AirData::from_observation(
                ops.airfields[fi].elevation_ft, qnh_hpa, oat_c, moist.then_some(oat_c - spread_c));
            let wx = FieldWx { air, direction: crate::assess::wind::Direction::Steady(wind_deg), speed_kt: wind_kt, gust_kt: None };
            let w = wx.on_end(end.heading_true_deg);
            let b = &ops.operator.policy.buffers;
            let warm = air.with_oat(oat_c + dt_c);
            let full = evaluate_reference(&setup, b, end, &warm, &table_values(&setup, &warm), &w);
            let want = full.temperature_score;
            let packed = pack(perf);
            let lookup = Lookup::new(&setup, &packed, air.pressure_altitude_ft);
            let lean = Warming::new(&air).at(oat_c + dt_c);
            let landing_rules = perf::landing_rules(&ty.landing, mins.wet_paved_landing_factor);
            let corrections = EndCorrections::new(&setup, &landing_rules, end, &w);
            let hot = HotEnd { setup: &setup, buffers: b, end, wind: &w, corrections: &corrections };
            let tv = lookup.at(lean.oat_c);
            let got = hot.temperature_score(&lean, tv.as_ref());
            prop_assert_eq!(got.map(f64::to_bits), want.map(f64::to_bits), "{:?} vs {:?}", got, want);
            // The whole outcome with the resolved corrections, too.
            let fast = evaluate(&setup, b, end, &lean, tv.as_ref(), &w, &corrections);
            prop_assert_eq!(fast.state, full.state);
            prop_assert_eq!(fast.limiting, full.limiting);
            prop_assert_eq!(fast.score.to_bits(), full.score.to_bits());
            prop_assert_eq!(fast.margin_percent.to_bits(), full.margin_percent.to_bits());
            prop_assert_eq!(fast.temperature_score.map(f64::to_bits), want.map(f64::to_bits));
        }
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(2000))]
        /// The per-pairing lookup equals `leg::table_values` bit for bit, on every demo
        /// type, at masses, pressure altitudes and temperatures in, below and above the
        /// tables (`None` exactly where `table_values` is an error).
        #[test]
        fn lookup_equals_table_values(
            t in 0usize..16, fm in -0.3f64..1.3, fl in -0.3f64..1.3, same_mass in proptest::bool::ANY,
            pa_ft in -3_000.0f64..14_000.0, oat_c in -50.0f64..60.0,
        ) {
            let (ops, model) = demo_model();
            let t = t % model.types.len();
            let ty = &model.types[t];
            let perf = &ops.types[t].performance;
            let (lo, hi) = perf.grid.range(Axis::Mass);
            let tom = lo + fm * (hi - lo);
            let lm = if same_mass { tom } else { lo + fl * (hi - lo) };
            let mins = ops.minimums(Category::Dual).expect("dual");
            let setup = Setup {
                model, ty, perf, mins,
                takeoff_mass_kg: tom, landing_mass_kg: lm,
                distance_buffer: 0.1, climb_buffer: 0.1,
            };
            let air = AirData::from_observation(0.0, 1013.25, oat_c, None);
            let air = AirData { pressure_altitude_ft: pa_ft, ..air };
            let want = table_values(&setup, &air).ok();
            let packed = pack(perf);
            let got = Lookup::new(&setup, &packed, pa_ft).at(oat_c);
            let bits = |v: Option<TableValues>| v.map(|v| [
                v.takeoff_ground_roll_m.to_bits(), v.takeoff_distance_50ft_m.to_bits(),
                v.climb_rate_fpm.to_bits(), v.landing_ground_roll_m.to_bits(),
                v.landing_distance_50ft_m.to_bits(),
            ]);
            prop_assert_eq!(bits(got), bits(want));
        }
    }
}

#[cfg(test)]
mod headroom_words {
    use super::*;

    /// A cell without headroom says why: no data; the deciding wind limit; or a
    /// temperature-dependent check that decides while the wind or weather is below too
    /// (trial finding: "density altitude" with headroom "—" read as "cooling cannot
    /// help a density-altitude failure").
    #[test]
    fn a_cell_without_headroom_says_why() {
        assert_eq!(
            PairCell::NO_DATA.headroom_absent_why().as_deref(),
            Some("no data")
        );
        let below = |limiting| PairCell {
            state: State::Below,
            limiting,
            ..PairCell::NO_DATA
        };
        assert_eq!(
            below(PairLimit::Crosswind).headroom_absent_why().as_deref(),
            Some("below on crosswind, which warming or cooling does not change")
        );
        assert!(
            below(PairLimit::DensityAltitude)
                .headroom_absent_why()
                .unwrap()
                .starts_with("also below on the wind or the field's weather")
        );
        let with = PairCell {
            headroom_c: Some(-2.0),
            ..below(PairLimit::DensityAltitude)
        };
        assert_eq!(with.headroom_absent_why(), None);
    }
}
