//! The operator's data compiled for assessment: every rule resolved once (manual first,
//! the policy's fallback where the manual is silent), runway ends laid out contiguously
//! by airfield, so the per-end work is a few multiplications.

use std::sync::{Arc, Mutex, OnceLock};

use chrono::NaiveDate;

use crate::daylight::{self, Daylight};
use crate::ops::actype::{PhaseCorrections, SurfaceRule};
use crate::ops::airfield::{Condition, Surface};
use crate::ops::operator::{FallbackPhase, Policy};
use crate::ops::runway_state::{DayCondition, EndState, RunwayStateFile};
use crate::ops::{Category, Ops};

/// Where a correction or factor comes from.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Origin {
    /// The aircraft type's flight manual (the type file).
    Manual,
    /// The operator's policy fallback, used where the manual is silent.
    Policy,
}

impl Origin {
    /// Words for the chain.
    pub const fn word(self) -> &'static str {
        match self {
            Origin::Manual => "flight manual",
            Origin::Policy => "operator policy, the manual being silent",
        }
    }
}

/// Which surface correction applies to a runway end today.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "snake_case")]
pub enum SurfaceCase {
    /// Dry paved: no correction.
    PavedDry,
    /// Wet paved.
    PavedWet,
    /// Dry grass.
    GrassDry,
    /// Wet grass.
    GrassWet,
    /// Soft ground (grass).
    GrassSoft,
    /// Long grass.
    GrassLong,
    /// Standing water: contaminated, outside light-aircraft manual data.
    Contaminated,
}

impl SurfaceCase {
    /// Number of cases.
    pub const COUNT: usize = 7;

    /// From the end's surface and condition.
    pub const fn of(surface: Surface, condition: Condition) -> SurfaceCase {
        match (surface, condition) {
            (Surface::Paved, Condition::Dry) => SurfaceCase::PavedDry,
            (Surface::Paved, Condition::Wet) => SurfaceCase::PavedWet,
            (Surface::Grass, Condition::Dry) => SurfaceCase::GrassDry,
            (Surface::Grass, Condition::Wet) => SurfaceCase::GrassWet,
        }
    }

    /// From the end's surface and the day's condition.
    pub const fn of_day(surface: Surface, condition: DayCondition) -> SurfaceCase {
        match (surface, condition) {
            (_, DayCondition::StandingWater) => SurfaceCase::Contaminated,
            (Surface::Paved, DayCondition::Wet) => SurfaceCase::PavedWet,
            (Surface::Paved, _) => SurfaceCase::PavedDry,
            (Surface::Grass, DayCondition::Dry) => SurfaceCase::GrassDry,
            (Surface::Grass, DayCondition::Wet) => SurfaceCase::GrassWet,
            (Surface::Grass, DayCondition::SoftGround) => SurfaceCase::GrassSoft,
            (Surface::Grass, DayCondition::LongGrass) => SurfaceCase::GrassLong,
        }
    }

    /// Words for the chain.
    pub const fn word(self) -> &'static str {
        match self {
            SurfaceCase::PavedDry => "dry paved",
            SurfaceCase::PavedWet => "wet paved",
            SurfaceCase::GrassDry => "dry grass",
            SurfaceCase::GrassWet => "wet grass",
            SurfaceCase::GrassSoft => "soft ground",
            SurfaceCase::GrassLong => "long grass",
            SurfaceCase::Contaminated => "standing water",
        }
    }
}

/// A surface rule with its origin.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Rule {
    /// The rule.
    pub rule: SurfaceRule,
    /// Where it comes from.
    pub origin: Origin,
}

/// One phase's (takeoff or landing) corrections, resolved.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PhaseRules {
    /// Decrease per knot of (factored) headwind, percent; `None`: no headwind credit.
    pub headwind_percent_per_kt: Option<f64>,
    /// Increase per knot of (factored) tailwind, percent; `None`: the manual gives none.
    pub tailwind_percent_per_kt: Option<f64>,
    /// The manual's wind figures already include the 50 %/150 % factoring.
    pub wind_factoring_included: bool,
    /// Surface rules by [`SurfaceCase`] index (paved dry has none; soft ground and long
    /// grass only where the manual or the policy gives one; standing water never).
    pub surface: [Option<Rule>; SurfaceCase::COUNT],
    /// Increase per 1 % of adverse slope, percent, with its origin.
    pub slope_percent_per_percent: (f64, Origin),
}

impl PhaseRules {
    fn resolve(manual: &PhaseCorrections, fallback: &FallbackPhase) -> PhaseRules {
        let pick = |m: Option<SurfaceRule>, f: SurfaceRule| match m {
            Some(rule) => Rule {
                rule,
                origin: Origin::Manual,
            },
            None => Rule {
                rule: f,
                origin: Origin::Policy,
            },
        };
        // A wet paved landing with no manual figure takes the category's own wet factor
        // where it has one (`Minimums::wet_paved_landing_factor`) instead of this
        // fallback, never both: see `perf::landing_extra_factor`.
        let paved_wet = Some(pick(manual.paved_wet, fallback.paved_wet.rule));
        let optional =
            |m: Option<SurfaceRule>, f: &Option<crate::ops::operator::SourcedRule>| match (m, f) {
                (Some(rule), _) => Some(Rule {
                    rule,
                    origin: Origin::Manual,
                }),
                (None, Some(f)) => Some(Rule {
                    rule: f.rule,
                    origin: Origin::Policy,
                }),
                (None, None) => None,
            };
        PhaseRules {
            headwind_percent_per_kt: manual.headwind_decrease_percent_per_kt,
            tailwind_percent_per_kt: manual.tailwind_increase_percent_per_kt,
            wind_factoring_included: manual.wind_factoring_included,
            surface: [
                None,
                paved_wet,
                Some(pick(manual.grass_dry, fallback.grass_dry.rule)),
                Some(pick(manual.grass_wet, fallback.grass_wet.rule)),
                optional(manual.grass_soft, &fallback.grass_soft),
                optional(manual.grass_long, &fallback.grass_long),
                None,
            ],
            slope_percent_per_percent: match manual.adverse_slope_increase_percent_per_percent {
                Some(k) => (k, Origin::Manual),
                None => (
                    fallback.adverse_slope.increase_percent_per_percent,
                    Origin::Policy,
                ),
            },
        }
    }

    /// The surface rule for a case, if any.
    pub fn surface_rule(&self, case: SurfaceCase) -> Option<Rule> {
        self.surface[case as usize]
    }
}

/// An aircraft type, compiled.
#[derive(Debug, Clone, PartialEq)]
pub struct TypeModel {
    /// Index in `Ops::types`.
    pub index: usize,
    /// Takeoff corrections.
    pub takeoff: PhaseRules,
    /// Landing corrections.
    pub landing: PhaseRules,
    /// Indicated climb speed of the climb table, kt.
    pub climb_speed_kias: f64,
    /// Maximum takeoff mass, kg.
    pub max_takeoff_mass_kg: f64,
    /// Maximum landing mass, kg.
    pub max_landing_mass_kg: f64,
    /// Maximum demonstrated crosswind, kt.
    pub max_demonstrated_crosswind_kt: f64,
    /// Rotation speed, kt indicated (for the abort-point advice).
    pub rotation_kias: f64,
    /// Whether a value below an axis may be held at the axis (all tables regular).
    pub conservative_below: bool,
    /// The warmest OAT in the tables, °C.
    pub oat_top_c: f64,
    /// The coldest OAT in the tables, °C.
    pub oat_bottom_c: f64,
}

/// One runway end, compiled.
#[derive(Debug, Clone, PartialEq)]
pub struct EndModel {
    /// Index of the airfield in `Ops::airfields`.
    pub field: usize,
    /// Index of the end in the airfield's `runway_ends`.
    pub index: usize,
    /// True heading, degrees.
    pub heading_true_deg: f64,
    /// Take-off run available, m.
    pub tora_m: f64,
    /// Take-off distance available, counting clearway for at most half of TORA, m.
    pub toda_m: f64,
    /// Accelerate-stop distance available, m.
    pub asda_m: f64,
    /// Landing distance available, m.
    pub lda_m: f64,
    /// Surface and condition today.
    pub surface: SurfaceCase,
    /// Slope, percent, positive uphill in the direction of travel.
    pub slope_percent: f64,
    /// Required climb gradient for the departure, ft/NM.
    pub required_gradient_ft_per_nm: Option<f64>,
    /// Usable today (not closed all day).
    pub usable: bool,
    /// Closed from this time today (with `closed_until`, a window).
    pub closed_from: Option<chrono::DateTime<chrono::Utc>>,
    /// Closed until this time today.
    pub closed_until: Option<chrono::DateTime<chrono::Utc>>,
    /// Today's runway state for this end, when one is set (shown and signed).
    pub day_note: Option<String>,
}

impl EndModel {
    /// Whether the end can be used at `t`: not closed all day, and `t` outside the
    /// closure's window (from its start, else the day's; to its end, else the day's).
    pub fn usable_at(&self, t: chrono::DateTime<chrono::Utc>) -> bool {
        let in_window = match (self.closed_from, self.closed_until) {
            (None, None) => false,
            (from, until) => from.is_none_or(|f| t >= f) && until.is_none_or(|u| t < u),
        };
        self.usable && !in_window
    }
}

/// An airfield, compiled.
#[derive(Debug, Clone, PartialEq)]
pub struct FieldModel {
    /// Field elevation, ft.
    pub elevation_ft: f64,
    /// Its ends: `ends[first..first + count]`.
    pub first_end: usize,
    /// Number of ends.
    pub end_count: usize,
    /// The calm-wind end, index into the field's ends.
    pub preferential_end: Option<usize>,
}

/// Today's runway state: the end set in use, closures, reduced distances and the
/// surface condition (board, `rhoboard runway`, or `runway-state/<date>.json`).
#[derive(Debug, Clone, Default, PartialEq)]
pub struct DaySettings {
    /// Airfield id → designator of the end in use.
    pub runway_in_use: std::collections::HashMap<String, String>,
    /// Airfield id → designators closed all day.
    pub closed: std::collections::HashMap<String, Vec<String>>,
    /// The day's state file, if any.
    pub state: Option<RunwayStateFile>,
}

impl DaySettings {
    /// The settings of the operator's runway-state file for `date`, if it has one.
    pub fn for_date(ops: &Ops, date: chrono::NaiveDate) -> DaySettings {
        let state = ops.runway_states.iter().find(|s| s.date == date).cloned();
        let mut d = DaySettings {
            state,
            ..DaySettings::default()
        };
        if let Some(s) = &d.state {
            for a in &ops.airfields {
                if let Some(e) = s.in_use(&a.id) {
                    d.runway_in_use.insert(a.id.clone(), e);
                }
            }
        }
        d
    }

    /// These settings as they stand at `t` ([`RunwayStateFile::as_of`]): the state's
    /// entries in force then, and an end in use that the state set taken from them.
    pub fn as_of(&self, ops: &Ops, t: Option<chrono::DateTime<chrono::Utc>>) -> DaySettings {
        let Some(full) = &self.state else {
            return self.clone();
        };
        let state = full.as_of(t);
        let mut runway_in_use = self.runway_in_use.clone();
        for a in &ops.airfields {
            if full.in_use(&a.id).is_some() {
                match state.in_use(&a.id) {
                    Some(e) => runway_in_use.insert(a.id.clone(), e),
                    None => runway_in_use.remove(&a.id),
                };
            }
        }
        DaySettings {
            runway_in_use,
            closed: self.closed.clone(),
            state: Some(state),
        }
    }
}

/// The runway ends as a day's state has them from `from` on (a change set during the
/// day: [`Model::field_ends_at`]).
#[derive(Debug, Clone)]
pub struct Epoch {
    /// From when.
    pub from: chrono::DateTime<chrono::Utc>,
    /// All runway ends, grouped by airfield as [`Model::ends`].
    pub ends: Vec<EndModel>,
    /// Per `Ops::airfields`: the end set in use, as [`Model::set_in_use`].
    pub set_in_use: Vec<Option<usize>>,
}

/// The whole operator, compiled.
#[derive(Debug, Clone)]
pub struct Model {
    /// Per `Ops::types`.
    pub types: Vec<TypeModel>,
    /// Per `Ops::airfields`.
    pub fields: Vec<FieldModel>,
    /// All runway ends, grouped by airfield.
    pub ends: Vec<EndModel>,
    /// Per `Ops::aircraft`: index into `types`, when the type exists.
    pub aircraft_type: Vec<Option<usize>>,
    /// Per `Ops::airfields`: the end set in use today, index into the field's ends.
    pub set_in_use: Vec<Option<usize>>,
    /// The ends as changes made during the day have them, from each change's time on
    /// (`ends` and `set_in_use` are the state from the day's start), earliest first.
    pub epochs: Vec<Epoch>,
    /// Headwind credit, fraction (0.5).
    pub headwind_credit: f64,
    /// Tailwind penalty, fraction (1.5).
    pub tailwind_factor: f64,
    /// Stale age, minutes.
    pub stale_after_min: f64,
    /// The strictest category the operator flies (pairings with no leg use it).
    pub strictest: Option<Category>,
    /// Each airfield's daylight on the dates asked for most recently.
    sun: SunCache,
}

/// How many dates' daylight a model keeps (today, and the dates of legs that arrive
/// after midnight or left before it).
const SUN_DATES: usize = 4;

/// Each airfield's daylight for the few UTC dates asked for most recently
/// ([`Model::sun_on`]). Keyed by date, so a board that runs past midnight UTC reads
/// the new date's light, never the old; a field's light is computed on first use.
#[derive(Debug)]
struct SunCache {
    /// Per airfield, latitude (° north) and longitude (° east).
    places: Arc<[(f64, f64)]>,
    /// Most recently used last.
    days: Mutex<Vec<Arc<SunDay>>>,
}

impl Clone for SunCache {
    fn clone(&self) -> SunCache {
        let days = self
            .days
            .lock()
            .unwrap_or_else(std::sync::PoisonError::into_inner)
            .clone();
        SunCache {
            places: Arc::clone(&self.places),
            days: Mutex::new(days),
        }
    }
}

/// Every airfield's daylight on one UTC date, each computed on first use
/// ([`daylight::daylight`] at the field's position), then kept.
#[derive(Debug)]
pub struct SunDay {
    date: NaiveDate,
    places: Arc<[(f64, f64)]>,
    sun: Box<[OnceLock<Daylight>]>,
}

impl SunDay {
    /// The date.
    pub fn date(&self) -> NaiveDate {
        self.date
    }

    /// Airfield `fi`'s daylight on this date (`fi` indexes `Ops::airfields`).
    pub fn field(&self, fi: usize) -> Daylight {
        let (lat_deg, lon_deg) = self.places[fi];
        *self.sun[fi].get_or_init(|| daylight::daylight(self.date, lat_deg, lon_deg))
    }
}

impl Model {
    /// Compiles the operator's data with today's runway settings.
    pub fn new(ops: &Ops, day: &DaySettings) -> Model {
        let policy: &Policy = &ops.operator.policy;
        let types = ops
            .types
            .iter()
            .enumerate()
            .map(|(index, t)| {
                let f = &t.file;
                let grid = &t.performance.grid;
                let oat = grid.oat_c();
                TypeModel {
                    index,
                    takeoff: PhaseRules::resolve(
                        &f.corrections.takeoff,
                        &policy.fallback_corrections.takeoff,
                    ),
                    landing: PhaseRules::resolve(
                        &f.corrections.landing,
                        &policy.fallback_corrections.landing,
                    ),
                    climb_speed_kias: f.performance.climb.climb_speed_kias,
                    max_takeoff_mass_kg: f.limits.max_takeoff_mass_kg,
                    max_landing_mass_kg: f.limits.max_landing_mass_kg,
                    max_demonstrated_crosswind_kt: f.limits.max_demonstrated_crosswind_kt,
                    rotation_kias: f.speeds.rotation_kias,
                    conservative_below: f.performance.takeoff.irregular_ok.is_none()
                        && f.performance.landing.irregular_ok.is_none()
                        && f.performance.climb.irregular_ok.is_none(),
                    oat_top_c: oat.last().copied().unwrap_or(f64::NAN),
                    oat_bottom_c: oat.first().copied().unwrap_or(f64::NAN),
                }
            })
            .collect();
        let mut fields = Vec::with_capacity(ops.airfields.len());
        let mut first_end = 0;
        for a in &ops.airfields {
            let find = |d: &str| a.runway_ends.iter().position(|e| e.designator == d);
            fields.push(FieldModel {
                elevation_ft: a.elevation_ft,
                first_end,
                end_count: a.runway_ends.len(),
                preferential_end: a.preferential_end.as_deref().and_then(find),
            });
            first_end += a.runway_ends.len();
        }
        // The day's start, then each time a change during the day takes effect.
        let (ends, set_in_use) = compile_ends(ops, &day.as_of(ops, None));
        let epochs = day
            .state
            .as_ref()
            .map(|s| s.starts())
            .unwrap_or_default()
            .into_iter()
            .map(|from| {
                let (ends, set_in_use) = compile_ends(ops, &day.as_of(ops, Some(from)));
                Epoch {
                    from,
                    ends,
                    set_in_use,
                }
            })
            .collect();
        let aircraft_type = ops
            .aircraft
            .iter()
            .map(|a| ops.type_position(&a.type_id))
            .collect();
        let strictest = Category::ALL
            .into_iter()
            .find(|c| ops.operator.categories.contains_key(c));
        Model {
            types,
            fields,
            ends,
            aircraft_type,
            set_in_use,
            epochs,
            headwind_credit: policy.wind.headwind_credit_percent / 100.0,
            tailwind_factor: policy.wind.tailwind_penalty_percent / 100.0,
            stale_after_min: policy.stale_after_min,
            strictest,
            sun: SunCache {
                places: ops
                    .airfields
                    .iter()
                    .map(|a| (a.latitude_deg, a.longitude_deg))
                    .collect(),
                days: Mutex::new(Vec::with_capacity(SUN_DATES)),
            },
        }
    }

    /// Every airfield's daylight on `date`, kept for the model's life (the few most
    /// recent dates): the same values as [`daylight::daylight`], computed once.
    pub fn sun_on(&self, date: NaiveDate) -> Arc<SunDay> {
        // A poisoned lock only means another thread panicked while holding it; the
        // list and its entries are always whole.
        let mut days = self
            .sun
            .days
            .lock()
            .unwrap_or_else(std::sync::PoisonError::into_inner);
        if let Some(k) = days.iter().position(|d| d.date == date) {
            let day = days.remove(k);
            days.push(Arc::clone(&day));
            return day;
        }
        let places = Arc::clone(&self.sun.places);
        let day = Arc::new(SunDay {
            date,
            sun: (0..places.len()).map(|_| OnceLock::new()).collect(),
            places,
        });
        if days.len() >= SUN_DATES {
            days.remove(0);
        }
        days.push(Arc::clone(&day));
        day
    }

    /// Airfield `fi`'s daylight on `date` ([`Model::sun_on`]).
    pub fn daylight(&self, fi: usize, date: NaiveDate) -> Daylight {
        self.sun_on(date).field(fi)
    }

    /// The runway ends of field `fi` as the day starts.
    pub fn field_ends(&self, fi: usize) -> &[EndModel] {
        let f = &self.fields[fi];
        &self.ends[f.first_end..f.first_end + f.end_count]
    }

    /// The runway ends of field `fi` at `t`: with the changes made during the day that
    /// hold by then (a change set at 14Z leaves the morning's legs as they were).
    pub fn field_ends_at(&self, fi: usize, t: chrono::DateTime<chrono::Utc>) -> &[EndModel] {
        let f = &self.fields[fi];
        let all = self
            .epochs
            .iter()
            .rev()
            .find(|e| e.from <= t)
            .map_or(&self.ends, |e| &e.ends);
        &all[f.first_end..f.first_end + f.end_count]
    }

    /// The end set in use at field `fi` at `t` (as [`Model::field_ends_at`]).
    pub fn set_in_use_at(&self, fi: usize, t: chrono::DateTime<chrono::Utc>) -> Option<usize> {
        self.epochs
            .iter()
            .rev()
            .find(|e| e.from <= t)
            .map_or(&self.set_in_use, |e| &e.set_in_use)
            .get(fi)
            .copied()
            .flatten()
    }

    /// Since when the end set in use at field `fi` at `t` has been set: `None` when it
    /// holds from the day's start, else the start of the change that made it so.
    pub fn set_in_use_since(
        &self,
        fi: usize,
        t: chrono::DateTime<chrono::Utc>,
    ) -> Option<chrono::DateTime<chrono::Utc>> {
        let now = self.set_in_use_at(fi, t)?;
        let mut since = None;
        for e in self.epochs.iter().rev().filter(|e| e.from <= t) {
            if e.set_in_use.get(fi).copied().flatten() != Some(now) {
                return since;
            }
            since = Some(e.from);
        }
        // Every change up to `t` keeps it: from the day's start, unless the day's start
        // had another (or none).
        (self.set_in_use.get(fi).copied().flatten() != Some(now))
            .then_some(since)
            .flatten()
    }
}

/// Every airfield's runway ends with `day`'s state on them, grouped by airfield as
/// [`Model::ends`], and each airfield's end set in use.
fn compile_ends(ops: &Ops, day: &DaySettings) -> (Vec<EndModel>, Vec<Option<usize>>) {
    let mut ends = Vec::new();
    let mut set_in_use = Vec::with_capacity(ops.airfields.len());
    for (fi, a) in ops.airfields.iter().enumerate() {
        let closed = day.closed.get(&a.id);

        for (ei, e) in a.runway_ends.iter().enumerate() {
            let mut usable = closed.is_none_or(|c| !c.contains(&e.designator));
            let today = day.state.as_ref().and_then(|s| s.end(&a.id, &e.designator));
            let (mut tora, mut toda, mut asda, mut lda) = (e.tora_m, e.toda_m, e.asda_m, e.lda_m);
            let mut surface = SurfaceCase::of(e.surface, e.condition);
            let (mut closed_from, mut closed_until) = (None, None);
            let mut day_note = None;
            if let Some(t) = &today {
                if t.closed == Some(true) {
                    match (t.from, t.until) {
                        (None, None) => usable = false,
                        (from, until) => (closed_from, closed_until) = (from, until),
                    }
                }
                // Reduced distances only ever reduce.
                tora = t.tora_m.map_or(tora, |v| v.min(tora));
                toda = t.toda_m.map_or(toda, |v| v.min(toda));
                asda = t.asda_m.map_or(asda, |v| v.min(asda));
                lda = t.lda_m.map_or(lda, |v| v.min(lda));
                if let Some(c) = t.condition {
                    surface = SurfaceCase::of_day(e.surface, c);
                }
                // An entry that says nothing in words leaves none.
                day_note = Some(describe(t)).filter(|d| !d.is_empty());
            }
            ends.push(EndModel {
                field: fi,
                index: ei,
                heading_true_deg: e.true_heading_deg,
                tora_m: tora,
                toda_m: toda.min(tora * 1.5),
                asda_m: asda,
                lda_m: lda,
                surface,
                slope_percent: e.slope_percent,
                required_gradient_ft_per_nm: e
                    .required_climb_gradient
                    .as_ref()
                    .map(|g| g.ft_per_nm),
                usable,
                closed_from,
                closed_until,
                day_note,
            });
        }
        let find = |d: &str| a.runway_ends.iter().position(|e| e.designator == d);
        set_in_use.push(day.runway_in_use.get(&a.id).and_then(|d| find(d)));
    }
    (ends, set_in_use)
}

/// Today's state of an end in words: "closed until 1800Z (works); TORA 900 m; wet".
pub fn describe(t: &EndState) -> String {
    let mut parts = Vec::new();
    match (t.closed, t.from, t.until) {
        (Some(true), Some(f), Some(u)) => parts.push(format!(
            "closed {}–{}",
            f.format("%H%MZ"),
            u.format("%H%MZ")
        )),
        (Some(true), Some(f), None) => parts.push(format!("closed from {}", f.format("%H%MZ"))),
        (Some(true), None, Some(u)) => parts.push(format!("closed until {}", u.format("%H%MZ"))),
        (Some(true), None, None) => parts.push("closed".to_string()),
        (Some(false), ..) => parts.push("open".to_string()),
        _ => {}
    }
    for (name, v) in [
        ("TORA", t.tora_m),
        ("TODA", t.toda_m),
        ("ASDA", t.asda_m),
        ("LDA", t.lda_m),
    ] {
        if let Some(v) = v {
            parts.push(format!("{name} {v:.0} m"));
        }
    }
    if let Some(c) = t.condition {
        parts.push(c.word().to_string());
    }
    if t.in_use == Some(true) {
        parts.push("in use".to_string());
    }
    let mut s = parts.join("; ");
    if !t.note.is_empty() {
        s.push_str(&format!(" ({})", t.note));
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::ops::demo;

    /// The kept daylight is the NOAA computation of `daylight::daylight` (itself held to
    /// NOAA's and ephem's times in tests/daylight.rs) for whichever date is asked, in
    /// any order, past the number of dates kept, and in a clone of the model.
    #[test]
    fn kept_daylight_is_each_dates_own() {
        let ops = demo::load().ops.expect("the demo loads");
        let model = Model::new(&ops, &DaySettings::default());
        let day = |d: u32| NaiveDate::from_ymd_opt(2026, 6, d).unwrap();
        let dates = [14, 15, 14, 16, 17, 18, 19, 20, 14, 30];
        for d in dates {
            let m = model.clone();
            for (fi, a) in ops.airfields.iter().enumerate() {
                let want = daylight::daylight(day(d), a.latitude_deg, a.longitude_deg);
                assert_eq!(model.daylight(fi, day(d)), want, "{} on {d}", a.id);
                assert_eq!(m.daylight(fi, day(d)), want, "{} on {d}, clone", a.id);
            }
        }
        // Only the most recent dates are kept.
        let kept = model.sun.days.lock().unwrap();
        assert_eq!(kept.len(), SUN_DATES);
        assert_eq!(kept.last().map(|d| d.date()), Some(day(30)));
    }

    /// Consecutive dates give different light (the sun rises about a minute later each
    /// day in December at 40° N by the NOAA method), so a kept date cannot stand for
    /// the next.
    #[test]
    fn next_date_is_not_the_kept_one() {
        let ops = demo::load().ops.expect("the demo loads");
        let model = Model::new(&ops, &DaySettings::default());
        let d1 = NaiveDate::from_ymd_opt(2026, 12, 31).unwrap();
        let d2 = NaiveDate::from_ymd_opt(2027, 1, 1).unwrap();
        let (a, b) = (model.daylight(0, d1), model.daylight(0, d2));
        assert_ne!(a.sunrise, b.sunrise);
        assert_eq!(model.sun_on(d1).date(), d1);
        assert_eq!(model.sun_on(d2).field(0), b);
    }
}
