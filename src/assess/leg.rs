//! One leg, assessed: the observation valid at departure and arrival, the air, the wind
//! on every runway end, the runway in use, takeoff and climb at the departure, landing
//! at the destination, the category's limits, the state, the headroom in degrees of
//! warming, and the advice that goes with the numbers.

use chrono::{DateTime, Utc};
use serde::Serialize;

use super::limits::{self, LimitCheck, LimitKind, Who};
use super::mass::{self, MassBalance};
use super::model::{EndModel, Model, TypeModel};
use super::perf::{self, CheckResult, ClimbChain, DistanceChain, PerfGap};
use super::state::{State, verdict};
use super::wind::{self, Direction, Side as XSide};
use crate::atmosphere::AirData;
use crate::observation::{Report, Store};
use crate::ops::actype::Performance;
use crate::ops::operator::{Available, DistanceCheck, Minimums, Required};
use crate::ops::tables::OutsideTable;
use crate::ops::{Airfield, Category, Leg, Ops, Pilot};

/// Everything an assessment reads.
#[derive(Clone, Copy)]
pub struct Context<'a> {
    /// The operator's data.
    pub ops: &'a Ops,
    /// Its compiled form.
    pub model: &'a Model,
    /// The observations.
    pub store: &'a Store,
    /// The reference time T: reports observed after it do not exist.
    pub at: DateTime<Utc>,
}

/// The report an assessment used.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ObservationUsed {
    /// Station.
    pub station: String,
    /// The report as received.
    pub text: String,
    /// Its observation time.
    pub observed_at: DateTime<Utc>,
    /// Age at the time it stands for, minutes.
    pub age_min: f64,
    /// Older than the policy allows.
    pub stale: bool,
    /// The event is after T: this is the latest report at T ("as of").
    pub as_of: bool,
    /// Typed in by hand.
    pub manual: bool,
}

/// The report valid for an event at `event_at`, given the reference time.
pub fn observation_for<'s>(
    store: &'s Store,
    station: &str,
    event_at: DateTime<Utc>,
    at: DateTime<Utc>,
    stale_after_min: f64,
) -> Option<(&'s Report, ObservationUsed)> {
    let (report, v) = report_for(store, station, event_at, at, stale_after_min)?;
    Some((
        report,
        ObservationUsed {
            station: station.to_string(),
            text: report.text.clone(),
            observed_at: v.observed_at,
            age_min: v.age_min,
            stale: v.stale,
            as_of: v.as_of,
            manual: report.kind == Some(crate::observation::Kind::Manual),
        },
    ))
}

/// How [`report_for`] found a report: the figures of [`ObservationUsed`] without its
/// texts.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ReportAge {
    /// Its observation time.
    pub observed_at: DateTime<Utc>,
    /// Age at the time it stands for, minutes.
    pub age_min: f64,
    /// Older than the policy allows.
    pub stale: bool,
    /// The event is after T: this is the latest report at T ("as of").
    pub as_of: bool,
}

/// [`observation_for`] without copying the report's text or the station's name (the
/// pairing matrix looks up every airfield's report on every build).
pub fn report_for<'s>(
    store: &'s Store,
    station: &str,
    event_at: DateTime<Utc>,
    at: DateTime<Utc>,
    stale_after_min: f64,
) -> Option<(&'s Report, ReportAge)> {
    let as_of = event_at > at;
    let stands_for = if as_of { at } else { event_at };
    let valid = store.valid_at(station, stands_for)?;
    let observed_at = valid.report.observed_at?;
    let age_min = (stands_for - observed_at).num_seconds() as f64 / 60.0;
    Some((
        valid.report,
        ReportAge {
            observed_at,
            age_min,
            stale: age_min > stale_after_min,
            as_of,
        },
    ))
}

/// The weather at a field that the runway computations need.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FieldWx {
    /// The air.
    pub air: AirData,
    /// Wind direction (steady, sector or any).
    pub direction: Direction,
    /// Mean wind, kt.
    pub speed_kt: f64,
    /// Gust, kt.
    pub gust_kt: Option<f64>,
}

impl FieldWx {
    /// From a usable report at a field of `elevation_ft`; `None` when a needed value is missing.
    pub fn from_report(report: &Report, elevation_ft: f64) -> Option<FieldWx> {
        let w = report.wind?;
        let air = AirData::from_observation(
            elevation_ft,
            report.altimeter_hpa?,
            report.temperature_c?,
            report.dewpoint_c,
        );
        let direction = match (w.variable_from_deg, w.variable_to_deg, w.direction_deg) {
            (Some(from_deg), Some(to_deg), _) => Direction::Sector { from_deg, to_deg },
            (_, _, Some(d)) if !w.variable => Direction::Steady(d),
            _ => Direction::Any,
        };
        Some(FieldWx {
            air,
            direction,
            speed_kt: w.speed_kt,
            gust_kt: w.gust_kt,
        })
    }

    /// Whether the wind is calm.
    pub fn calm(&self) -> bool {
        self.speed_kt == 0.0 && self.gust_kt.is_none()
    }

    /// Wind on one end: (steady headwind for performance, crosswind and side with the
    /// gust, tailwind with the gust).
    pub fn on_end(&self, heading_true_deg: f64) -> EndWind {
        let limit_speed = self.gust_kt.unwrap_or(self.speed_kt);
        let (crosswind_kt, crosswind_from) =
            wind::worst_crosswind(self.direction, limit_speed, heading_true_deg);
        EndWind {
            headwind_kt: wind::worst_headwind_kt(self.direction, self.speed_kt, heading_true_deg),
            crosswind_kt,
            crosswind_from,
            tailwind_limit_kt: (-wind::worst_headwind_kt(
                self.direction,
                limit_speed,
                heading_true_deg,
            ))
            .max(0.0),
        }
    }
}

/// The wind on one runway end.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct EndWind {
    /// Steady (mean, worst direction) headwind component, kt; negative: tailwind.
    pub headwind_kt: f64,
    /// Crosswind component with the gust, kt.
    pub crosswind_kt: f64,
    /// Its side.
    pub crosswind_from: XSide,
    /// Tailwind component with the gust, kt (0 when none).
    pub tailwind_limit_kt: f64,
}

/// An along-runway component in words, a tailwind as a tailwind (`headwind 9 kt`,
/// `tailwind 5.7 kt`), at `decimals`; the figure as given, not rounded the safe way.
pub fn along_wind(kt: f64, decimals: usize) -> String {
    if kt >= 0.0 {
        format!("headwind {kt:.decimals$} kt")
    } else {
        format!("tailwind {:.decimals$} kt", -kt)
    }
}

impl EndWind {
    /// The along-runway wind in words, rounded the safe way as the limits' rows show
    /// it: "headwind 9 kt" (steady, rounded down) or "tailwind 5 kt" (with the gust,
    /// rounded up).
    pub fn along_words(&self) -> String {
        if self.headwind_kt >= 0.0 {
            format!("headwind {:.0} kt", crate::units::down0(self.headwind_kt))
        } else {
            format!(
                "tailwind {:.0} kt",
                crate::units::up0(self.tailwind_limit_kt.max(-self.headwind_kt))
            )
        }
    }

    /// The crosswind with the gust, rounded up as the crosswind limit's row shows it.
    pub fn crosswind_shown_kt(&self) -> f64 {
        crate::units::up0(self.crosswind_kt)
    }
}

/// Why a performance figure could not be found.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Gap {
    /// Outside the flight-manual table.
    Outside(OutsideTable),
    /// A correction the manual does not give.
    Perf(PerfGap),
}

impl std::fmt::Display for Gap {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Gap::Outside(o) => o.fmt(f),
            Gap::Perf(p) => p.fmt(f),
        }
    }
}

/// Looks up the table cell, held at an axis's bottom where that is conservative.
fn locate(
    ty: &TypeModel,
    perf: &Performance,
    mass_kg: f64,
    pa_ft: f64,
    oat_c: f64,
) -> Result<crate::ops::Cell, Gap> {
    if ty.conservative_below {
        perf.grid
            .locate_conservative(mass_kg, pa_ft, oat_c)
            .map(|(c, _)| c)
            .map_err(Gap::Outside)
    } else {
        perf.locate(mass_kg, pa_ft, oat_c).map_err(Gap::Outside)
    }
}

/// The aircraft type, its rules, the masses and the buffers one leg or pairing is
/// assessed with.
#[derive(Clone, Copy)]
pub struct Setup<'a> {
    /// The compiled operator.
    pub model: &'a Model,
    /// The type.
    pub ty: &'a TypeModel,
    /// Its tables.
    pub perf: &'a Performance,
    /// The category's minimums.
    pub mins: &'a Minimums,
    /// Takeoff mass, kg.
    pub takeoff_mass_kg: f64,
    /// Landing mass, kg.
    pub landing_mass_kg: f64,
    /// Distance buffer, fraction.
    pub distance_buffer: f64,
    /// Climb buffer, fraction.
    pub climb_buffer: f64,
}

impl Setup<'_> {
    fn wind(&self, headwind_kt: f64) -> perf::WindInput {
        perf::WindInput {
            headwind_kt,
            headwind_credit: self.model.headwind_credit,
            tailwind_factor: self.model.tailwind_factor,
        }
    }
}

/// The five table values at one point: a cell found once (twice when the landing mass
/// differs) and read by every table, then shared by every runway end.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TableValues {
    /// Takeoff ground roll, m.
    pub takeoff_ground_roll_m: f64,
    /// Takeoff distance to 50 ft, m.
    pub takeoff_distance_50ft_m: f64,
    /// Rate of climb, ft/min.
    pub climb_rate_fpm: f64,
    /// Landing ground roll, m.
    pub landing_ground_roll_m: f64,
    /// Landing distance from 50 ft, m.
    pub landing_distance_50ft_m: f64,
}

/// The table values for a setup's masses in this air.
pub fn table_values(s: &Setup<'_>, air: &AirData) -> Result<TableValues, Gap> {
    let (ty, perf) = (s.ty, s.perf);
    let (pa, oat) = (air.pressure_altitude_ft, air.oat_c);
    let t = locate(ty, perf, s.takeoff_mass_kg, pa, oat)?;
    let l = if s.landing_mass_kg == s.takeoff_mass_kg {
        t
    } else {
        locate(ty, perf, s.landing_mass_kg, pa, oat)?
    };
    Ok(TableValues {
        takeoff_ground_roll_m: perf.takeoff_ground_roll_m.at(&t),
        takeoff_distance_50ft_m: perf.takeoff_distance_50ft_m.at(&t),
        climb_rate_fpm: perf.climb_rate_fpm.at(&t),
        landing_ground_roll_m: perf.landing_ground_roll_m.at(&l),
        landing_distance_50ft_m: perf.landing_distance_50ft_m.at(&l),
    })
}

/// Takeoff and climb on one end from table values: a few multiplications.
pub fn departure_with(
    s: &Setup<'_>,
    tv: &TableValues,
    end: &EndModel,
    air: &AirData,
    headwind_kt: f64,
) -> Result<(DistanceChain, ClimbChain), Gap> {
    departure_at(s, tv, end, air.true_airspeed_factor, headwind_kt)
}

/// [`departure_with`] given only the air's true-airspeed factor, the one figure of the
/// air it reads (the pairing matrix's headroom search has no full `AirData`).
pub fn departure_at(
    s: &Setup<'_>,
    tv: &TableValues,
    end: &EndModel,
    true_airspeed_factor: f64,
    headwind_kt: f64,
) -> Result<(DistanceChain, ClimbChain), Gap> {
    let chain = perf::distances(
        &s.ty.takeoff,
        tv.takeoff_ground_roll_m,
        tv.takeoff_distance_50ft_m,
        s.wind(headwind_kt),
        end.surface,
        end.slope_percent,
    )
    .map_err(Gap::Perf)?;
    let climb = perf::climb(
        tv.climb_rate_fpm,
        s.ty.climb_speed_kias,
        true_airspeed_factor,
        headwind_kt,
        s.mins.min_climb_rate_fpm,
        end.required_gradient_ft_per_nm,
    );
    Ok((chain, climb))
}

/// Landing on one end from table values.
pub fn landing_with(
    s: &Setup<'_>,
    tv: &TableValues,
    end: &EndModel,
    headwind_kt: f64,
) -> Result<DistanceChain, Gap> {
    let rules = perf::landing_rules(&s.ty.landing, s.mins.wet_paved_landing_factor);
    perf::distances(
        &rules,
        tv.landing_ground_roll_m,
        tv.landing_distance_50ft_m,
        s.wind(headwind_kt),
        end.surface,
        // A downhill landing is the adverse one.
        -end.slope_percent,
    )
    .map_err(Gap::Perf)
}

/// Takeoff and climb on one end: the cell is found once and read by the takeoff and
/// climb tables.
pub fn departure_chains(
    s: &Setup<'_>,
    end: &EndModel,
    air: &AirData,
    headwind_kt: f64,
) -> Result<(DistanceChain, ClimbChain), Gap> {
    let (ty, perf) = (s.ty, s.perf);
    let cell = locate(
        ty,
        perf,
        s.takeoff_mass_kg,
        air.pressure_altitude_ft,
        air.oat_c,
    )?;
    let tv = TableValues {
        takeoff_ground_roll_m: perf.takeoff_ground_roll_m.at(&cell),
        takeoff_distance_50ft_m: perf.takeoff_distance_50ft_m.at(&cell),
        climb_rate_fpm: perf.climb_rate_fpm.at(&cell),
        landing_ground_roll_m: f64::NAN,
        landing_distance_50ft_m: f64::NAN,
    };
    departure_with(s, &tv, end, air, headwind_kt)
}

/// Landing on one end.
pub fn landing_chain(
    s: &Setup<'_>,
    end: &EndModel,
    air: &AirData,
    headwind_kt: f64,
) -> Result<DistanceChain, Gap> {
    let (ty, perf) = (s.ty, s.perf);
    let cell = locate(
        ty,
        perf,
        s.landing_mass_kg,
        air.pressure_altitude_ft,
        air.oat_c,
    )?;
    let tv = TableValues {
        takeoff_ground_roll_m: f64::NAN,
        takeoff_distance_50ft_m: f64::NAN,
        climb_rate_fpm: f64::NAN,
        landing_ground_roll_m: perf.landing_ground_roll_m.at(&cell),
        landing_distance_50ft_m: perf.landing_distance_50ft_m.at(&cell),
    };
    landing_with(s, &tv, end, headwind_kt)
}

/// One evaluated distance check with its rule text and source.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct NamedCheck {
    /// The rule, e.g. `distance_50ft × 1.33 ≤ TODA`.
    pub rule: String,
    /// The numbers.
    pub result: CheckResult,
    /// Verdict against the distance buffer.
    pub state: State,
    /// Where the factor comes from.
    pub source: String,
}

/// The rule text of a check.
pub fn rule_text(c: &DistanceCheck, extra: f64) -> String {
    let req = match c.required {
        Required::GroundRoll => "ground_roll",
        Required::Distance50ft => "distance_50ft",
    };
    let avail = match c.available {
        Available::Tora => "TORA",
        Available::Toda => "TODA",
        Available::Asda => "ASDA",
        Available::Lda => "LDA",
    };
    if (extra - 1.0).abs() > 1e-12 {
        format!("{req} × {} × {extra} (wet) ≤ {avail}", c.factor)
    } else {
        format!("{req} × {} ≤ {avail}", c.factor)
    }
}

/// Takeoff or landing, with its checks.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PhaseResult {
    /// Mass used, kg.
    pub mass_kg: f64,
    /// The chain.
    pub chain: DistanceChain,
    /// The checks.
    pub checks: Vec<NamedCheck>,
    /// Smallest margin.
    pub margin: f64,
    /// Verdict.
    pub state: State,
}

/// The climb with its verdict.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ClimbResult {
    /// The chain.
    pub chain: ClimbChain,
    /// Verdict against the climb buffer.
    pub state: State,
}

/// A runway end considered at a field.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct EndOption {
    /// Designator.
    pub designator: String,
    /// The wind on it.
    pub wind: EndWind,
    /// Its state for this leg (performance and runway limits).
    pub state: State,
    /// Limiting score (margin ÷ buffer).
    pub score: f64,
    /// The runway in use.
    pub in_use: bool,
    /// Usable at the event's time.
    pub usable: bool,
    /// Today's runway state of this end, in words, when one is set.
    pub today: Option<String>,
}

/// Departure or arrival.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Side {
    /// Airfield id.
    pub airfield: String,
    /// The event time (departure or arrival).
    pub event_at: DateTime<Utc>,
    /// The report used.
    pub observation: Option<ObservationUsed>,
    /// The air.
    pub air: Option<AirData>,
    /// Runway in use.
    pub runway: Option<String>,
    /// Why that runway.
    pub runway_reason: String,
    /// The wind on it.
    pub wind: Option<EndWind>,
    /// Every end.
    pub ends: Vec<EndOption>,
    /// Takeoff (departure only).
    pub takeoff: Option<PhaseResult>,
    /// Climb (departure only).
    pub climb: Option<ClimbResult>,
    /// Landing (arrival only).
    pub landing: Option<PhaseResult>,
    /// The limits.
    pub limits: Vec<LimitCheck>,
    /// What could not be assessed.
    pub gaps: Vec<String>,
    /// The side's state.
    pub state: State,
}

/// The check that decides a leg's state.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Limiting {
    /// Its name, e.g. `XHIG 30 takeoff distance_50ft × 1.33 ≤ TODA`.
    pub check: String,
    /// Its margin in words, e.g. `-7 %` or `+2 kt` (a limit row's as
    /// [`LimitCheck::margin_text`] shows it); `—` for a check with no numeric margin
    /// (an endorsement, a hazard, the named airfields: see [`Limiting::has_margin`]).
    pub margin: String,
    /// Margin ÷ buffer.
    pub score: f64,
    /// Where the check is in the leg's result ([`LegResult::limiting_check`]).
    pub at: LimitingAt,
}

/// The margin of a [`Limiting`] check that has none in numbers.
pub const NO_MARGIN: &str = "—";

impl Limiting {
    /// Whether the check has a margin in numbers (`+2 kt`, `-7 %`), not [`NO_MARGIN`].
    pub fn has_margin(&self) -> bool {
        self.margin != NO_MARGIN
    }

    /// The margin in numbers, `None` for a check with none (a lapsed endorsement).
    pub fn margin_words(&self) -> Option<&str> {
        self.has_margin().then_some(self.margin.as_str())
    }

    /// The check and its margin in one phrase (`XHIG density altitude -9 ft`), the
    /// check alone where it has no margin in numbers (`XSHT endorsement`).
    pub fn words(&self) -> String {
        match self.margin_words() {
            Some(m) => format!("{} {m}", self.check),
            None => self.check.clone(),
        }
    }
}

/// Which check a [`Limiting`] names, by its place in the leg's result (a stable
/// reference, not a name to match).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum LimitingAt {
    /// The departure's takeoff check at this index of its `checks`.
    Takeoff(usize),
    /// The arrival's landing check at this index of its `checks`.
    Landing(usize),
    /// The departure's climb.
    Climb,
    /// The limit at `index` of the departure's (`departure`) or the arrival's `limits`.
    Limit {
        /// On the departure side, else the arrival.
        departure: bool,
        /// Index in that side's `limits`.
        index: usize,
    },
    /// No runway end usable at the departure's (`departure`) or the arrival's time.
    NoRunway {
        /// On the departure side, else the arrival.
        departure: bool,
    },
}

impl LegResult {
    /// The limit row the limiting check is, when it is one (not a distance or climb
    /// check).
    pub fn limiting_check(&self) -> Option<&LimitCheck> {
        match self.limiting.as_ref()?.at {
            LimitingAt::Limit { departure, index } => {
                let side = if departure {
                    &self.departure
                } else {
                    &self.arrival
                };
                side.limits.get(index)
            }
            _ => None,
        }
    }

    /// Why the leg has no [`Headroom`] figure, in words: "no data"; or, for a leg
    /// below for what warming or cooling does not change (the limits the headroom
    /// search leaves out: every `below` limit but density altitude, a failed mass and
    /// balance, no usable runway end), "below on crosswind and visibility: warming or
    /// cooling does not change it". The board's detail and the report print it in
    /// brackets after `—`.
    pub fn headroom_absent_why(&self) -> String {
        match self.state {
            State::NoData => return "no data".to_string(),
            State::Below => {}
            _ => return "not assessed".to_string(),
        }
        let mut why: Vec<String> = Vec::new();
        let mut add = |w: String| {
            if !why.contains(&w) {
                why.push(w);
            }
        };
        for l in self.departure.limits.iter().chain(&self.arrival.limits) {
            if l.state == State::Below && l.kind != LimitKind::DensityAltitude {
                add(l.kind.word().to_string());
            }
        }
        if self.mass_balance.as_ref().is_some_and(|m| !m.passes()) {
            add("mass and balance".to_string());
        }
        for side in [&self.departure, &self.arrival] {
            if side.state == State::Below
                && side.runway.is_none()
                && !side.ends.is_empty()
                && side.ends.iter().all(|e| !e.usable)
            {
                add(format!("no usable runway end at {}", side.airfield));
            }
        }
        match why.split_last() {
            None => "below for reasons warming or cooling does not change".to_string(),
            Some((last, rest)) if !rest.is_empty() => format!(
                "below on {} and {last}: warming or cooling does not change it",
                rest.join(", ")
            ),
            Some((last, _)) => format!("below on {last}: warming or cooling does not change it"),
        }
    }

    /// The side (departure or arrival) of the limiting check.
    pub fn limiting_side(&self) -> Option<&Side> {
        Some(match self.limiting.as_ref()?.at {
            LimitingAt::Takeoff(_) | LimitingAt::Climb => &self.departure,
            LimitingAt::Landing(_) => &self.arrival,
            LimitingAt::Limit {
                departure: true, ..
            } => &self.departure,
            LimitingAt::Limit {
                departure: false, ..
            } => &self.arrival,
            LimitingAt::NoRunway { departure: true } => &self.departure,
            LimitingAt::NoRunway { departure: false } => &self.arrival,
        })
    }
}

/// Degrees of warming a leg can take.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Headroom {
    /// Warming left, °C; negative when already below (the cooling needed).
    pub warming_c: f64,
    /// The departure OAT at which the leg turns below, °C; with `table_ends`, the
    /// table's end where the search stopped (still passing at the top, still below at
    /// the bottom).
    pub warmest_oat_c: f64,
    /// The search stopped at an end of the flight-manual table: a bound, not a
    /// crossing. With `warming_c ≥ 0` at least that much warming is left; with
    /// `warming_c < 0` the leg is still below at the table's coldest column, so at
    /// least that much cooling is needed (and the tables cannot say how much).
    pub table_ends: bool,
    /// Whether the leg survives the operator's expected high, where one is given.
    pub survives_expected_high: Option<bool>,
}

impl Headroom {
    /// The headroom as a compact figure: `+4.2°C`, `≥+8.0°C` (still passing at the
    /// table's top), `-3.2°C`, `≤-38.7°C` (still below at the table's bottom: at least
    /// that much cooling needed).
    pub fn figure(&self) -> String {
        self.figure_in(|d| d, "°C")
    }

    /// [`Headroom::figure`] in another temperature unit: `diff` turns a difference in
    /// °C into the unit `unit` names (× 1.8 for °F).
    pub fn figure_in(&self, diff: impl Fn(f64) -> f64, unit: &str) -> String {
        let mark = match (self.table_ends, self.warming_c >= 0.0) {
            (false, _) => "",
            (true, true) => "≥",
            (true, false) => "≤",
        };
        format!(
            "{mark}{:+.1}{unit}",
            crate::units::colder_tenth(diff(self.warming_c))
        )
    }

    /// The headroom in words, saying when the figure is only a bound: "takes 6.2 °C
    /// more warming: turns below at a departure OAT of 24.4 °C", "takes at least 8.0 °C
    /// more warming: the flight-manual table ends at a departure OAT of 40.0 °C", "below now: needs 3.2 °C of cooling, not below at a
    /// departure OAT of 24.4 °C or colder", "below now: needs at least 38.7 °C of
    /// cooling, still below at a departure OAT of -10.0 °C, where the flight-manual
    /// table ends". The board's detail and the report's chain print these words.
    pub fn words(&self) -> String {
        self.words_in(|d| d, |t| t, "°C")
    }

    /// [`Headroom::words`] in another temperature unit: `diff` turns a difference in
    /// °C into the unit `unit` names, `temp` a temperature.
    pub fn words_in(
        &self,
        diff: impl Fn(f64) -> f64,
        temp: impl Fn(f64) -> f64,
        unit: &str,
    ) -> String {
        // The warming shown rounded the cold way (less room, more cooling), and the
        // OAT it turns at is the OAT as shown plus that figure, so the two add up in
        // any unit (26.2 °C less 6.3 °C is 19.9 °C; 79.2 °F less 11.4 °F is 67.8 °F).
        let w = crate::units::colder_tenth(diff(self.warming_c));
        let t = if self.table_ends {
            temp(self.warmest_oat_c)
        } else {
            let oat = temp(self.warmest_oat_c - self.warming_c);
            (oat * 10.0).round() / 10.0 + w
        };
        const TABLE_ENDS: &str = "where the flight-manual table ends";
        match (self.table_ends, self.warming_c >= 0.0) {
            // The search's grain is 0.1 °C, rounded down: 0.0 is less than a step.
            (false, true) if w < 0.05 => format!(
                "takes less than 0.1 {unit} more warming: turns below at a departure OAT of \
                 {t:.1} {unit}"
            ),
            (false, true) => format!(
                "takes {w:.1} {unit} more warming: turns below at a departure OAT of {t:.1} {unit}"
            ),
            (true, true) => format!(
                "takes at least {w:.1} {unit} more warming: the flight-manual table ends at a \
                 departure OAT of {t:.1} {unit}"
            ),
            (false, false) => format!(
                "below now: needs {:.1} {unit} of cooling, not below at a departure OAT of \
                 {t:.1} {unit} or colder",
                -w
            ),
            (true, false) => format!(
                "below now: needs at least {:.1} {unit} of cooling, still below at a \
                 departure OAT of {t:.1} {unit}, {TABLE_ENDS}",
                -w
            ),
        }
    }
}

/// One leg, assessed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LegResult {
    /// Index in `Ops::legs`.
    pub index: usize,
    /// Leg id.
    pub id: String,
    /// Category.
    pub category: Category,
    /// State.
    pub state: State,
    /// The deciding check.
    pub limiting: Option<Limiting>,
    /// Headroom in degrees of warming; `None` for `no-data` and for legs below for
    /// reasons warming or cooling cannot change.
    pub headroom: Option<Headroom>,
    /// Takeoff mass, kg.
    pub takeoff_mass_kg: Option<f64>,
    /// Landing mass, kg.
    pub landing_mass_kg: Option<f64>,
    /// Mass and balance (the loading table, CG, envelope and their checks).
    pub mass_balance: Option<MassBalance>,
    /// How much more payload the leg can take at the current temperature (negative:
    /// how much must come off), and at which station; for legs that give loads.
    pub payload_headroom: Option<PayloadHeadroom>,
    /// Departure.
    pub departure: Side,
    /// Arrival.
    pub arrival: Side,
    /// Why the leg is not `within`.
    pub reasons: Vec<String>,
    /// Advice that goes with the numbers.
    pub advice: Vec<String>,
}

/// Payload that can be added (or must be removed) keeping the leg not `below`.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PayloadHeadroom {
    /// Kilograms: positive can be added, negative must come off.
    pub kg: f64,
    /// The station it goes to or comes from.
    pub station: String,
}

/// What a score belongs to (cheap to carry while comparing).
#[derive(Debug, Clone, Copy, PartialEq)]
enum What {
    Takeoff(usize),
    Climb,
    Landing(usize),
    Limit(usize),
    NoRunway(bool),
}

#[derive(Debug, Clone, Copy)]
struct Worst {
    state: State,
    score: f64,
    what: Option<What>,
}

impl Worst {
    const NONE: Worst = Worst {
        state: State::Within,
        score: f64::INFINITY,
        what: None,
    };

    fn add(&mut self, state: State, score: f64, what: What) {
        if state > self.state || (state == self.state && score < self.score) {
            *self = Worst {
                state,
                score,
                what: Some(what),
            };
        }
    }
}

/// The leg's mass and balance: from its loads (empty + stations + fuel, with CG), or
/// the fixed masses it gives. A leg that gives a takeoff mass but no landing mass lands,
/// for the landing distance, at its takeoff mass held to the maximum landing mass (see
/// [`landing_mass_assumed`]). `None` when neither is given or the aircraft is unknown.
pub fn leg_mass_balance(ops: &Ops, leg: &Leg) -> Option<MassBalance> {
    let ac = ops.aircraft(&leg.aircraft)?;
    let ty = ops.aircraft_type(&ac.type_id)?;
    let limits = &ty.file.limits;
    if let Some(tom) = leg.takeoff_mass_kg {
        let lm = leg
            .landing_mass_kg
            .unwrap_or(tom.min(limits.max_landing_mass_kg));
        return Some(mass::fixed(
            tom,
            lm,
            limits.max_takeoff_mass_kg,
            limits.max_landing_mass_kg,
        ));
    }
    mass::compute(
        leg,
        leg.loads.as_ref()?,
        ac,
        &ty.file,
        &ops.operator.policy,
        None,
    )
}

/// The leg's takeoff and landing masses, kg.
pub fn leg_masses(ops: &Ops, leg: &Leg) -> (Option<f64>, Option<f64>) {
    match leg_mass_balance(ops, leg) {
        Some(mb) => (Some(mb.takeoff.mass_kg), Some(mb.landing.mass_kg)),
        None => (None, None),
    }
}

/// Whether the landing mass was assumed rather than given or computed from loads.
pub fn landing_mass_assumed(leg: &Leg) -> bool {
    leg.takeoff_mass_kg.is_some() && leg.landing_mass_kg.is_none()
}

/// A distance or climb margin (a fraction) in whole percent, rounded down so that it
/// never shows more margin than there is (+9.6 % is `+9 %`, −0.3 % is `-1 %`).
pub fn percent_text(margin: f64) -> String {
    // A hair of slack so that an exact figure is not floored one step down; `+ 0.0`
    // turns a −0 into 0.
    format!("{:+.0} %", (margin * 100.0 + 1e-9).floor() + 0.0)
}

fn pct(margin: f64) -> String {
    percent_text(margin)
}

struct SideInput<'a> {
    field_index: usize,
    field: &'a Airfield,
    event_at: DateTime<Utc>,
    departure: bool,
}

/// Everything about one leg that headroom needs, resolved once.
#[derive(Clone, Copy)]
struct Plan<'a> {
    setup: Setup<'a>,
    dep: Option<(FieldWx, &'a EndModel, EndWind)>,
    arr: Option<(FieldWx, &'a EndModel, EndWind)>,
    max_da_dep: f64,
    max_da_arr: f64,
    da_band: f64,
}

impl Plan<'_> {
    /// The smallest margin ÷ buffer of the temperature-dependent checks at a uniform
    /// warming of `dt_c` (see [`super::headroom`]); `None` outside the tables.
    fn score_at(&self, dt_c: f64) -> Option<f64> {
        let s = &self.setup;
        let mut score = f64::INFINITY;
        if let Some((wx, end, w)) = &self.dep {
            let air = wx.air.with_oat(wx.air.oat_c + dt_c);
            let (chain, climb) = departure_chains(s, end, &air, w.headwind_kt).ok()?;
            score = score
                .min(perf::min_margin(&chain, end, &s.mins.takeoff_checks, 1.0) / s.distance_buffer)
                .min(climb.margin() / s.climb_buffer)
                .min((self.max_da_dep - air.density_altitude_ft) / self.da_band);
        }
        if let Some((wx, end, w)) = &self.arr {
            let air = wx.air.with_oat(wx.air.oat_c + dt_c);
            let chain = landing_chain(s, end, &air, w.headwind_kt).ok()?;
            let extra = perf::landing_extra_factor(&chain, s.mins.wet_paved_landing_factor);
            score = score
                .min(
                    perf::min_margin(&chain, end, &s.mins.landing_checks, extra)
                        / s.distance_buffer,
                )
                .min((self.max_da_arr - air.density_altitude_ft) / self.da_band);
        }
        Some(score)
    }
}

/// Headroom to 0.1 °C on a uniform warming of both ends, station pressure held and dew
/// points capped at the new temperature.
fn headroom(plan: &Plan<'_>, expected_high_c: Option<f64>) -> Option<Headroom> {
    let dep_oat = plan.dep.as_ref().map(|(wx, ..)| wx.air.oat_c);
    let oats = [dep_oat, plan.arr.as_ref().map(|(wx, ..)| wx.air.oat_c)];
    let min_oat = oats.iter().flatten().copied().fold(f64::INFINITY, f64::min);
    let max_oat = oats
        .iter()
        .flatten()
        .copied()
        .fold(f64::NEG_INFINITY, f64::max);
    if !min_oat.is_finite() {
        return None;
    }
    // How far the tables reach from here.
    let up = plan.setup.ty.oat_top_c - max_oat;
    let down = plan.setup.ty.oat_bottom_c - min_oat;
    let found = super::headroom::search(|dt| plan.score_at(dt), up, down)?;
    let (warming_c, table_ends) = (found.warming_c, found.table_ends);
    let warmest = dep_oat.unwrap_or(min_oat) + warming_c;
    Some(Headroom {
        warming_c,
        warmest_oat_c: warmest,
        table_ends,
        // Past the table's top nothing is known: say nothing rather than guess.
        survives_expected_high: expected_high_c.and_then(|h| {
            if warmest >= h {
                Some(true)
            } else if table_ends {
                None
            } else {
                Some(false)
            }
        }),
    })
}

/// Assesses one leg.
pub fn assess_leg(ctx: &Context<'_>, index: usize) -> Option<LegResult> {
    let leg = ctx.ops.legs.get(index)?;
    Some(assess(ctx, leg, index))
}

/// Assesses a leg that need not be in the operator's files (a pairing opened to its
/// chain, a what-if); `index` is carried into the result.
pub fn assess(ctx: &Context<'_>, leg: &Leg, index: usize) -> LegResult {
    let ops = ctx.ops;
    let model = ctx.model;
    let buffers = &ops.operator.policy.buffers;
    let mut reasons = Vec::new();
    let mut advice = Vec::new();
    let ac_pos = ops
        .aircraft
        .iter()
        .position(|a| a.registration == leg.aircraft);
    let ty = ac_pos
        .and_then(|i| model.aircraft_type.get(i).copied().flatten())
        .and_then(|t| model.types.get(t));
    let mins = ops.minimums(leg.category);
    let pilot: Option<&Pilot> = ops.pilot(&leg.pilot);
    let dep_fi = ops.airfield_position(&leg.from);
    let arr_fi = ops.airfield_position(&leg.to);
    let mb = leg_mass_balance(ops, leg);
    let (tom, lm) = (
        mb.as_ref().map(|m| m.takeoff.mass_kg),
        mb.as_ref().map(|m| m.landing.mass_kg),
    );

    let mut dep = empty_side(&leg.from, leg.departs_utc());
    let mut arr = empty_side(&leg.to, leg.arrives_utc());
    let mut worst = Worst::NONE;
    let mut all_limits: Vec<(bool, LimitCheck)> = Vec::new();

    let (Some(ty), Some(mins), Some(dep_fi), Some(arr_fi), Some(tom), Some(lm)) =
        (ty, mins, dep_fi, arr_fi, tom, lm)
    else {
        let why = if ty.is_none() {
            format!("aircraft {} or its type is not in the fleet", leg.aircraft)
        } else if mins.is_none() {
            format!("the operator has no minimums for {}", leg.category.name())
        } else if dep_fi.is_none() || arr_fi.is_none() {
            format!("airfield {} or {} is unknown", leg.from, leg.to)
        } else {
            "no takeoff mass or loads given".to_string()
        };
        reasons.push(why.clone());
        dep.gaps.push(why);
        dep.state = State::NoData;
        return LegResult {
            index,
            id: leg.id.clone(),
            category: leg.category,
            state: State::NoData,
            limiting: None,
            headroom: None,
            takeoff_mass_kg: tom,
            landing_mass_kg: lm,
            mass_balance: mb,
            payload_headroom: None,
            departure: dep,
            arrival: arr,
            reasons,
            advice,
        };
    };
    let mb = mb.unwrap_or_else(|| mass::fixed(tom, lm, f64::INFINITY, f64::INFINITY));
    let perf = &ops.types[ty.index].performance;
    let type_id = ops.types[ty.index].file.id.as_str();
    let who = Who {
        category: leg.category,
        minimums: mins,
        pilot,
        regime: ops.operator.regime,
        buffers,
    };
    let dist_buf = buffers.distance_percent / 100.0;
    let climb_buf = buffers.climb_percent / 100.0;

    // Mass and balance: its checks join the departure's (takeoff side) and the
    // arrival's (landing side) limits.
    let mass_below = !mb.passes();
    if tom > 0.95 * ty.max_takeoff_mass_kg && tom <= ty.max_takeoff_mass_kg {
        advice.push(format!(
            "Mass {tom:.0} kg is within 5 % of the maximum takeoff mass ({:.0} kg): check the loading.",
            ty.max_takeoff_mass_kg
        ));
    }
    if landing_mass_assumed(leg) {
        advice.push(format!(
            "No landing mass given: the landing is computed at {lm:.0} kg (the takeoff mass, at most the maximum landing mass)."
        ));
    }
    for c in &mb.checks {
        let landing_side = matches!(c.kind, LimitKind::LandingMass | LimitKind::FuelReserve);
        all_limits.push((!landing_side, c.clone()));
    }

    let setup = Setup {
        model,
        ty,
        perf,
        mins,
        takeoff_mass_kg: tom,
        landing_mass_kg: lm,
        distance_buffer: dist_buf,
        climb_buffer: climb_buf,
    };
    let mut plan = Plan {
        setup,
        dep: None,
        arr: None,
        max_da_dep: f64::INFINITY,
        max_da_arr: f64::INFINITY,
        da_band: buffers.density_altitude_ft.max(1.0),
    };
    let mut temperature_independent_below = false;
    // The pilot's endorsements (solo, cross-country, night) and named airfields: with
    // the departure's limits, and assessed even when its weather cannot be.
    let arr_field = &ops.airfields[arr_fi];
    let pilot_checks = |out: &mut Vec<LimitCheck>| {
        limits::pilot_limits(&who, type_id, leg.departs_utc(), &leg.from, &leg.to, out);
        limits::night_limits(
            &who,
            type_id,
            &ops.airfields[dep_fi],
            arr_field,
            leg.departs_utc(),
            leg.arrives_utc(),
            out,
        );
    };
    let weatherless_pilot_checks =
        |departure: bool, all: &mut Vec<(bool, LimitCheck)>, independent: &mut bool| {
            if !departure {
                return;
            }
            let mut lim = Vec::new();
            pilot_checks(&mut lim);
            for l in lim {
                *independent |= l.state == State::Below;
                all.push((true, l));
            }
        };

    for side_in in [
        SideInput {
            field_index: dep_fi,
            field: &ops.airfields[dep_fi],
            event_at: leg.departs_utc(),
            departure: true,
        },
        SideInput {
            field_index: arr_fi,
            field: &ops.airfields[arr_fi],
            event_at: leg.arrives_utc(),
            departure: false,
        },
    ] {
        let side = if side_in.departure {
            &mut dep
        } else {
            &mut arr
        };
        let role = if side_in.departure {
            "departure"
        } else {
            "arrival"
        };
        let Some((report, used)) = observation_for(
            ctx.store,
            &side_in.field.id,
            side_in.event_at,
            ctx.at,
            model.stale_after_min,
        ) else {
            let why = format!(
                "{role} {}: no usable report at or before {}",
                side_in.field.id,
                side_in.event_at.min(ctx.at).format("%d %H%MZ")
            );
            side.gaps.push(why.clone());
            reasons.push(why);
            side.state = State::NoData;
            worst.add(State::NoData, f64::NAN, What::Limit(usize::MAX));
            weatherless_pilot_checks(
                side_in.departure,
                &mut all_limits,
                &mut temperature_independent_below,
            );
            continue;
        };
        let stale = used.stale;
        let age = used.age_min;
        side.observation = Some(used);
        let Some(wx) = FieldWx::from_report(report, side_in.field.elevation_ft) else {
            let why = format!(
                "{role} {}: the report lacks wind, temperature or QNH",
                side_in.field.id
            );
            side.gaps.push(why.clone());
            reasons.push(why);
            side.state = State::NoData;
            worst.add(State::NoData, f64::NAN, What::Limit(usize::MAX));
            weatherless_pilot_checks(
                side_in.departure,
                &mut all_limits,
                &mut temperature_independent_below,
            );
            continue;
        };
        side.air = Some(wx.air);
        if stale {
            let mut why = format!(
                "{role} {}: report {} is stale ({age:.0} min old, policy {:.0} min)",
                side_in.field.id, report.time_text, model.stale_after_min
            );
            // A later report that came but could not be used is why: say so here, not
            // only where it was read.
            if let Some(rej) = ctx.store.last_rejected(&side_in.field.id)
                && let (Some(t), Some(used)) = (rej.observed_at, report.observed_at)
                && t > used
                && t <= side_in.event_at.min(ctx.at)
                && let Some(r) = rej.rejection()
            {
                why.push_str(&format!(
                    "; the later report {} was rejected: {r}",
                    rej.time_text
                ));
            }
            side.gaps.push(why.clone());
            reasons.push(why);
            side.state = State::NoData;
            worst.add(State::NoData, f64::NAN, What::Limit(usize::MAX));
            // A stale report is no basis for a check: its air is shown (the detail's
            // "as last reported"), but no limit or distance is assessed on it, so
            // nothing at this end reads `within` or `thin`.
            weatherless_pilot_checks(
                side_in.departure,
                &mut all_limits,
                &mut temperature_independent_below,
            );
            continue;
        }

        // Every end, then the runway in use.
        // The ends as the day's state has them at the event (a change set later in
        // the day leaves it as it was).
        let ends = model.field_ends_at(side_in.field_index, side_in.event_at);
        let mut options: Vec<(EndOption, Option<Evaluated>)> = Vec::with_capacity(ends.len());
        for (k, end) in ends.iter().enumerate() {
            let w = wx.on_end(end.heading_true_deg);
            let usable = end.usable_at(side_in.event_at);
            let ev = usable.then(|| evaluate_end(&setup, &who, end, &wx, &w, side_in.departure));
            // A closed end is known unusable: below, never no-data.
            let (state, score) = ev
                .as_ref()
                .map_or((State::Below, f64::NEG_INFINITY), |e| (e.state, e.score));
            options.push((
                EndOption {
                    designator: side_in.field.runway_ends[k].designator.clone(),
                    wind: w,
                    state,
                    score,
                    in_use: false,
                    usable,
                    today: end.day_note.clone(),
                },
                ev,
            ));
        }
        let usable: Vec<usize> = (0..options.len())
            .filter(|&k| options[k].1.is_some())
            .collect();
        let set = model
            .set_in_use_at(side_in.field_index, side_in.event_at)
            .filter(|&k| usable.contains(&k));
        let choice = if let Some(k) = set {
            let why = match model.set_in_use_since(side_in.field_index, side_in.event_at) {
                Some(from) => format!("set in use from {}", from.format("%H%MZ")),
                None => "set for the day".to_string(),
            };
            Some((k, why))
        } else if wx.calm() {
            match model.fields[side_in.field_index]
                .preferential_end
                .filter(|k| usable.contains(k))
            {
                Some(k) => Some((k, "calm: the preferential end".to_string())),
                None => usable
                    .iter()
                    .copied()
                    .max_by(|&a, &b| rank(&options[a].0).total_cmp(&rank(&options[b].0)))
                    .map(|k| (k, "calm: the worse end".to_string())),
            }
        } else {
            usable
                .iter()
                .copied()
                .max_by(|&a, &b| {
                    options[a]
                        .0
                        .wind
                        .headwind_kt
                        .total_cmp(&options[b].0.wind.headwind_kt)
                })
                .map(|k| (k, "most headwind".to_string()))
        };
        // With the other ends closed, the wind did not choose: say so.
        let choice = choice.map(|(k, why)| {
            if usable.len() == 1 && options.len() > 1 && set.is_none() {
                let closed: Vec<&str> = options
                    .iter()
                    .filter(|(o, _)| !o.usable)
                    .map(|(o, _)| o.designator.as_str())
                    .collect();
                let verb = if closed.len() == 1 { "is" } else { "are" };
                (
                    k,
                    format!("{ONLY_USABLE_END}: {} {verb} closed", closed.join(", ")),
                )
            } else {
                (k, why)
            }
        });
        let Some((k, why_end)) = choice else {
            // Every end closed then: which, and how, as the day's state has them.
            let closed: Vec<String> = options
                .iter()
                .map(|(o, _)| match &o.today {
                    Some(t) => format!("{} {t}", o.designator),
                    None => format!("{} not usable", o.designator),
                })
                .collect();
            let why = format!(
                "{role} {}: no usable runway end at {} ({})",
                side_in.field.id,
                side_in.event_at.format("%H%MZ"),
                closed.join("; ")
            );
            // A known below, not a gap in the data.
            reasons.push(why);
            side.state = State::Below;
            side.ends = options.into_iter().map(|(o, _)| o).collect();
            // Nothing can be flown from or to it: the deciding check, before any margin.
            worst.add(
                State::Below,
                f64::NEG_INFINITY,
                What::NoRunway(side_in.departure),
            );
            temperature_independent_below = true;
            weatherless_pilot_checks(
                side_in.departure,
                &mut all_limits,
                &mut temperature_independent_below,
            );
            continue;
        };
        options[k].0.in_use = true;
        let end = &ends[k];
        side.runway = Some(options[k].0.designator.clone());
        side.runway_reason = why_end;
        side.wind = Some(options[k].0.wind);
        let w = options[k].0.wind;
        if side_in.departure {
            plan.dep = Some((wx, end, w));
        } else {
            plan.arr = Some((wx, end, w));
        }

        // Field limits and the in-use end's own evaluation.
        let mut lim = Vec::new();
        limits::field_limits(
            &who,
            report,
            wx.air.density_altitude_ft,
            // The model keeps each field's daylight per date ([`Model::sun_on`]).
            &model.daylight(side_in.field_index, side_in.event_at.date_naive()),
            side_in.event_at,
            side_in.departure,
            &mut lim,
        );
        if side_in.departure {
            pilot_checks(&mut lim);
        }
        if let Some(da) = lim.iter().find(|l| l.kind == LimitKind::DensityAltitude) {
            let max = da.limit.unwrap_or(f64::INFINITY);
            if side_in.departure {
                plan.max_da_dep = max;
            } else {
                plan.max_da_arr = max;
            }
        }
        let ev = options[k].1.take();
        let mut side_state = side.state;
        if let Some(ev) = ev {
            for l in ev.end_limits {
                lim.push(l);
            }
            match ev.perf {
                Ok(p) => {
                    if let Some(t) = p.takeoff {
                        for (ci, c) in t.checks.iter().enumerate() {
                            worst.add(c.state, c.result.margin / dist_buf, What::Takeoff(ci));
                        }
                        side_state = side_state.and(t.state);
                        side.takeoff = Some(t);
                    }
                    if let Some(c) = p.climb {
                        worst.add(c.state, c.chain.margin() / climb_buf, What::Climb);
                        side_state = side_state.and(c.state);
                        side.climb = Some(c);
                    }
                    if let Some(l) = p.landing {
                        for (ci, c) in l.checks.iter().enumerate() {
                            worst.add(c.state, c.result.margin / dist_buf, What::Landing(ci));
                        }
                        side_state = side_state.and(l.state);
                        side.landing = Some(l);
                    }
                }
                Err(gap) => {
                    let why = format!(
                        "{role} {} {}: {gap}",
                        side_in.field.id, options[k].0.designator
                    );
                    side.gaps.push(why.clone());
                    reasons.push(why);
                    side_state = side_state.and(State::NoData);
                    worst.add(State::NoData, f64::NAN, What::Limit(usize::MAX));
                }
            }
        }
        for l in lim {
            side_state = side_state.and(l.state);
            let temperature_dependent = l.kind == LimitKind::DensityAltitude;
            if l.state == State::Below && !temperature_dependent {
                temperature_independent_below = true;
            }
            all_limits.push((side_in.departure, l));
        }
        side.state = side_state;
        side.ends = options.into_iter().map(|(o, _)| o).collect();
        advise(&mut advice, side, side_in.field, end, ty, &wx);
    }

    // Limits into the worst tracker, by their index in `all_limits`: departure's first.
    all_limits.sort_by_key(|(departure, _)| !*departure);
    for (i, (_, l)) in all_limits.iter().enumerate() {
        worst.add(l.state, l.score(), What::Limit(i));
    }
    for (departure, l) in all_limits {
        let side = if departure { &mut dep } else { &mut arr };
        side.state = side.state.and(l.state);
        side.limits.push(l);
    }
    let state = worst.state.and(dep.state).and(arr.state);
    let limiting = worst
        .what
        .and_then(|w| describe_limiting(w, worst.score, &dep, &arr));
    if state != State::Within {
        collect_reasons(&mut reasons, &dep, &arr, buffers);
    }
    // Mass cannot fix a leg below for the weather, the wind or the density altitude.
    let fixed_by_mass = !dep.limits.iter().chain(&arr.limits).any(|l| {
        l.state == State::Below
            && !matches!(
                l.kind,
                LimitKind::Loading
                    | LimitKind::TakeoffMass
                    | LimitKind::LandingMass
                    | LimitKind::Fuel
                    | LimitKind::FuelReserve
                    | LimitKind::Envelope
            )
    }) && !dep.ends.is_empty()
        && !arr.ends.is_empty();
    let payload_headroom = if mb.rows.is_empty() || state == State::NoData || !fixed_by_mass {
        None
    } else {
        payload_headroom(ops, leg, &plan)
    };
    let headroom = if state == State::NoData || temperature_independent_below || mass_below {
        None
    } else {
        headroom(&plan, ops.operator.policy.expected_high_c)
    };
    if let (Some(h), Some(high)) = (headroom, ops.operator.policy.expected_high_c)
        && h.survives_expected_high == Some(false)
        && state != State::Below
    {
        advice.push(format!(
            "Would turn below at about {:.1} °C, before the expected high of {high:.0} °C.",
            h.warmest_oat_c
        ));
    }
    LegResult {
        index,
        id: leg.id.clone(),
        category: leg.category,
        state,
        limiting,
        headroom,
        takeoff_mass_kg: Some(tom),
        landing_mass_kg: Some(lm),
        mass_balance: Some(mb),
        payload_headroom,
        departure: dep,
        arrival: arr,
        reasons,
        advice,
    }
}

/// The largest payload one station can take (or the least that must come off one) with
/// the leg still not `below` at the current temperature, to 0.5 kg.
fn payload_headroom(ops: &Ops, leg: &Leg, plan: &Plan<'_>) -> Option<PayloadHeadroom> {
    let ac = ops.aircraft(&leg.aircraft)?;
    let ty = ops.aircraft_type(&ac.type_id)?;
    let loads = leg.loads.as_ref()?;
    let stations = &ty.file.mass_balance.as_ref()?.stations;
    let policy = &ops.operator.policy;
    let ok = |station: usize, kg: f64| -> bool {
        let extra = Some(mass::Extra { station, kg });
        let Some(m) = mass::compute(leg, loads, ac, &ty.file, policy, extra) else {
            return false;
        };
        let mut p = *plan;
        p.setup.takeoff_mass_kg = m.takeoff.mass_kg;
        p.setup.landing_mass_kg = m.landing.mass_kg;
        m.passes() && p.score_at(0.0).is_some_and(|s| s >= 0.0)
    };
    let masses = mass::station_masses(loads, policy);
    let current: Vec<f64> = stations
        .iter()
        .map(|st| {
            loads
                .stations
                .iter()
                .zip(&masses)
                .filter(|(l, _)| l.station == st.id)
                .map(|(_, m)| *m)
                .sum()
        })
        .collect();
    // The boundary between a passing `lo` and a failing `hi` extra mass, to 0.5 kg.
    let bisect = |si: usize, mut lo: f64, mut hi: f64, pass_low: bool| {
        while (hi - lo).abs() > 0.5 {
            let mid = 0.5 * (lo + hi);
            if ok(si, mid) == pass_low {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        if pass_low { lo } else { hi }
    };
    let name = |si: usize| format!("{} ({})", stations[si].name, stations[si].id);
    if ok(0, 0.0) {
        let mut best: Option<(f64, usize)> = None;
        for (si, st) in stations.iter().enumerate() {
            let spare = st.max_mass_kg - current[si];
            if spare <= 0.0 {
                continue;
            }
            let add = if ok(si, spare) {
                spare
            } else {
                bisect(si, 0.0, spare, true)
            };
            if best.is_none_or(|(b, _)| add > b) {
                best = Some((add, si));
            }
        }
        let (kg, si) = best.unwrap_or((0.0, 0));
        Some(PayloadHeadroom {
            kg: (kg * 2.0).floor() / 2.0,
            station: name(si),
        })
    } else {
        // Where to take load off, in the order a dispatcher would: baggage first, then
        // passenger rows behind the first, the first row (the pilot's) last.
        let rank = |si: usize| match stations[si].seats {
            0 => 0,
            _ if si > 0 => 1,
            _ => 2,
        };
        let mut best: Option<(f64, usize)> = None;
        for (si, &have) in current.iter().enumerate() {
            if have <= 0.0 || !ok(si, -have) {
                continue;
            }
            // Removing `have` passes, removing nothing fails.
            let off = -bisect(si, -have, 0.0, true);
            let better = best.is_none_or(|(b, bi)| (rank(si), off) < (rank(bi), b));
            if better {
                best = Some((off, si));
            }
        }
        best.map(|(kg, si)| PayloadHeadroom {
            kg: -(kg * 2.0).ceil() / 2.0,
            station: name(si),
        })
    }
}

fn rank(o: &EndOption) -> f64 {
    // Higher is worse: state first, then a smaller score.
    (o.state as u8 as f64) * 1e6 - o.score.clamp(-1e5, 1e5)
}

fn empty_side(airfield: &str, event_at: DateTime<Utc>) -> Side {
    Side {
        airfield: airfield.to_string(),
        event_at,
        observation: None,
        air: None,
        runway: None,
        runway_reason: String::new(),
        wind: None,
        ends: Vec::new(),
        takeoff: None,
        climb: None,
        landing: None,
        limits: Vec::new(),
        gaps: Vec::new(),
        state: State::Within,
    }
}

struct PerfResults {
    takeoff: Option<PhaseResult>,
    climb: Option<ClimbResult>,
    landing: Option<PhaseResult>,
}

struct Evaluated {
    state: State,
    score: f64,
    perf: Result<PerfResults, Gap>,
    end_limits: Vec<LimitCheck>,
}

fn named_checks(
    chain: &DistanceChain,
    end: &EndModel,
    checks: &[DistanceCheck],
    extra: f64,
    dist_buf: f64,
) -> (Vec<NamedCheck>, f64, State) {
    let mut out = Vec::with_capacity(checks.len());
    let mut margin = f64::INFINITY;
    let mut state = State::Within;
    for c in checks {
        let r = perf::check(chain, end, c, extra);
        let s = verdict(r.margin, dist_buf);
        margin = margin.min(r.margin);
        state = state.and(s);
        out.push(NamedCheck {
            rule: rule_text(c, extra),
            result: r,
            state: s,
            source: c.source.clone(),
        });
    }
    (out, margin, state)
}

fn evaluate_end(
    s: &Setup<'_>,
    who: &Who<'_>,
    end: &EndModel,
    wx: &FieldWx,
    w: &EndWind,
    departure: bool,
) -> Evaluated {
    let (ty, mins) = (s.ty, s.mins);
    let (tom, lm) = (s.takeoff_mass_kg, s.landing_mass_kg);
    let (dist_buf, climb_buf) = (s.distance_buffer, s.climb_buffer);
    let mut end_limits = Vec::new();
    limits::end_limits(
        who,
        w.crosswind_kt,
        w.tailwind_limit_kt,
        ty.max_demonstrated_crosswind_kt,
        &mut end_limits,
    );
    let mut state = State::Within;
    let mut score = f64::INFINITY;
    for l in &end_limits {
        if l.state > state || (l.state == state && l.score() < score) {
            state = l.state.max(state);
            score = l.score();
        }
    }
    let perf_res = if departure {
        departure_chains(s, end, &wx.air, w.headwind_kt).map(|(chain, climb)| {
            let (checks, margin, s) =
                named_checks(&chain, end, &mins.takeoff_checks, 1.0, dist_buf);
            let cs = verdict(climb.margin(), climb_buf);
            PerfResults {
                takeoff: Some(PhaseResult {
                    mass_kg: tom,
                    chain,
                    checks,
                    margin,
                    state: s,
                }),
                climb: Some(ClimbResult {
                    chain: climb,
                    state: cs,
                }),
                landing: None,
            }
        })
    } else {
        landing_chain(s, end, &wx.air, w.headwind_kt).map(|chain| {
            let extra = perf::landing_extra_factor(&chain, mins.wet_paved_landing_factor);
            let (checks, margin, s) =
                named_checks(&chain, end, &mins.landing_checks, extra, dist_buf);
            PerfResults {
                takeoff: None,
                climb: None,
                landing: Some(PhaseResult {
                    mass_kg: lm,
                    chain,
                    checks,
                    margin,
                    state: s,
                }),
            }
        })
    };
    let mut bump = |s: State, sc: f64| {
        if s > state || (s == state && sc < score) {
            state = s.max(state);
            score = sc;
        }
    };
    match &perf_res {
        Ok(p) => {
            if let Some(t) = &p.takeoff {
                bump(t.state, t.margin / dist_buf);
            }
            if let Some(c) = &p.climb {
                bump(c.state, c.chain.margin() / climb_buf);
            }
            if let Some(l) = &p.landing {
                bump(l.state, l.margin / dist_buf);
            }
        }
        Err(_) => bump(State::NoData, f64::NAN),
    }
    Evaluated {
        state,
        score,
        perf: perf_res,
        end_limits,
    }
}

fn describe_limiting(what: What, score: f64, dep: &Side, arr: &Side) -> Option<Limiting> {
    let at = |s: &Side| format!("{} {}", s.airfield, s.runway.as_deref().unwrap_or(""));
    let (check, margin, place) = match what {
        What::Takeoff(i) => {
            let c = dep.takeoff.as_ref()?.checks.get(i)?;
            (
                format!("{} takeoff {}", at(dep), c.rule),
                pct(c.result.margin),
                LimitingAt::Takeoff(i),
            )
        }
        What::Landing(i) => {
            let c = arr.landing.as_ref()?.checks.get(i)?;
            (
                format!("{} landing {}", at(arr), c.rule),
                pct(c.result.margin),
                LimitingAt::Landing(i),
            )
        }
        What::Climb => {
            let c = dep.climb.as_ref()?;
            let name = match c.chain.gradient_margin {
                Some(g) if g < c.chain.rate_margin => "climb gradient",
                _ => "climb rate",
            };
            (
                format!("{} {name}", at(dep)),
                pct(c.chain.margin()),
                LimitingAt::Climb,
            )
        }
        What::Limit(usize::MAX) => return None,
        What::NoRunway(departure) => {
            let side = if departure { dep } else { arr };
            (
                format!("{}: no usable runway end", side.airfield),
                NO_MARGIN.to_string(),
                LimitingAt::NoRunway { departure },
            )
        }
        What::Limit(i) => {
            let departure = i < dep.limits.len();
            let (side, index) = if departure {
                (dep, i)
            } else {
                (arr, i - dep.limits.len())
            };
            let l = side.limits.get(index)?;
            (
                format!("{} {}", side.airfield, l.label()),
                // A hard limit (a lapsed endorsement) has no margin in numbers: its
                // state already says below.
                l.margin_text().unwrap_or_else(|| NO_MARGIN.to_string()),
                LimitingAt::Limit { departure, index },
            )
        }
    };
    Some(Limiting {
        check,
        margin,
        score,
        at: place,
    })
}

/// How the reason for a runway in use starts when the other ends are closed.
const ONLY_USABLE_END: &str = "the only usable end";

fn collect_reasons(
    reasons: &mut Vec<String>,
    dep: &Side,
    arr: &Side,
    buffers: &crate::ops::operator::Buffers,
) {
    for (side, role) in [(dep, "departure"), (arr, "arrival")] {
        // A closure that left one end is part of why (the wind did not choose it).
        if side.state != State::Within && side.runway_reason.starts_with(ONLY_USABLE_END) {
            reasons.push(format!(
                "{role} {}: runway {} in use, {}",
                side.airfield,
                side.runway.as_deref().unwrap_or("?"),
                side.runway_reason
            ));
        }
        let at = format!(
            "{} {}",
            side.airfield,
            side.runway.as_deref().unwrap_or("?")
        );
        for (phase, p) in [("takeoff", &side.takeoff), ("landing", &side.landing)] {
            let Some(p) = p else { continue };
            for c in &p.checks {
                if c.state == State::Within {
                    continue;
                }
                let r = &c.result;
                let verb = if c.state == State::Below {
                    "exceeds"
                } else {
                    "leaves less than the buffer of"
                };
                let what = if c.state == State::Below {
                    format!(
                        "{role} {at} {phase}: {} needs {:.0} m, {} m available ({})",
                        c.rule,
                        r.required_m,
                        r.available_m,
                        pct(r.margin)
                    )
                } else {
                    format!(
                        "{role} {at} {phase}: {} needs {:.0} m of {:.0} m, {} {:.0} % ({} spare)",
                        c.rule,
                        r.required_m,
                        r.available_m,
                        verb,
                        buffers.distance_percent,
                        pct(r.margin)
                    )
                };
                reasons.push(what);
            }
        }
        if let Some(c) = &side.climb
            && c.state != State::Within
        {
            let ch = &c.chain;
            let mut s = format!(
                "{role} {at} climb: {:.0} ft/min (minimum {:.0}), {:.0} ft/NM",
                ch.rate_fpm,
                ch.min_rate_fpm,
                // Rounded down, as the chain shows it.
                crate::units::down0(ch.gradient_ft_per_nm)
            );
            if let Some(g) = ch.required_gradient_ft_per_nm {
                s.push_str(&format!(" (required {g:.0})"));
            }
            s.push_str(&format!(", {} {}", c.state.word(), pct(ch.margin())));
            reasons.push(s);
        }
        for l in &side.limits {
            if l.state == State::Within {
                continue;
            }
            let mut s = format!("{role} {}: {} {}", side.airfield, l.label(), l.state.word());
            // The source follows "from", never inside parentheses: it often has its own.
            // The figures as every margin shows them ([`LimitCheck::shown`]): rounded
            // toward each other, their difference the margin shown.
            let sh = l.shown(|x| x, 0);
            if let (Some(v), Some(lim)) = (sh.value, sh.limit) {
                let margin = l
                    .margin_text()
                    .map_or(String::new(), |m| format!(", margin {m}"));
                s.push_str(&format!(
                    " — {v:.0} {} against {lim:.0} {}{margin}; from {}",
                    l.unit, l.unit, l.source
                ));
            } else if !l.note.is_empty() {
                s.push_str(&format!(" — {}; from {}", l.note, l.source));
            }
            reasons.push(s);
        }
        for alt in side.ends.iter().filter(|e| !e.in_use && e.usable) {
            if let Some(in_use) = side.ends.iter().find(|e| e.in_use)
                && alt.state < in_use.state
            {
                reasons.push(format!(
                    "{role} {}: runway {} would be {} ({})",
                    side.airfield,
                    alt.designator,
                    alt.state.word(),
                    if alt.wind.headwind_kt < 0.0 {
                        "with a tailwind"
                    } else {
                        "another end"
                    }
                ));
            }
        }
    }
}

fn advise(
    advice: &mut Vec<String>,
    side: &Side,
    field: &Airfield,
    end: &EndModel,
    ty: &TypeModel,
    wx: &FieldWx,
) {
    let id = &field.id;
    let da = wx.air.density_altitude_ft;
    // As every density altitude is shown: rounded up.
    let da_shown = crate::units::up0(da);
    if let Some(w) = side.wind
        && w.headwind_kt < 0.0
    {
        advice.push(format!(
            "{id} {}: tailwind component {:.0} kt — distances rise steeply with a tailwind.",
            side.runway.as_deref().unwrap_or(""),
            // The tailwind's limit row's figure (with the gust), rounded up as it is.
            crate::units::up0(w.tailwind_limit_kt)
        ));
    }
    match end.surface {
        super::model::SurfaceCase::GrassDry => {
            advice.push(format!("{id}: grass runway — longer takeoff roll."))
        }
        super::model::SurfaceCase::GrassWet => advice.push(format!(
            "{id}: wet grass — much longer takeoff roll, poorer braking."
        )),
        super::model::SurfaceCase::PavedWet => {
            advice.push(format!("{id}: wet runway — longer landing roll."))
        }
        super::model::SurfaceCase::GrassSoft => advice.push(format!(
            "{id}: soft ground — the roll can lengthen far beyond any factor; walk the strip."
        )),
        super::model::SurfaceCase::GrassLong => {
            advice.push(format!("{id}: long grass — longer takeoff roll."))
        }
        super::model::SurfaceCase::Contaminated => advice.push(format!(
            "{id}: standing water reported — no performance data for a contaminated runway."
        )),
        super::model::SurfaceCase::PavedDry => {}
    }
    if end.slope_percent.abs() >= 0.5 {
        advice.push(format!(
            "{id} {}: runway slope {:+.1} % in the direction of travel.",
            side.runway.as_deref().unwrap_or(""),
            end.slope_percent
        ));
    }
    if da > 5_000.0 && side.takeoff.is_some() {
        advice.push(format!(
            "{id}: density altitude {da_shown:.0} ft — lean the mixture for takeoff as the manual says."
        ));
    }
    if da > 3_000.0 {
        advice.push(format!(
            "{id}: at {da_shown:.0} ft density altitude the same indicated speeds mean a {:.0} % higher true airspeed and ground speed; the ground will look faster — fly the normal indicated speeds.",
            (wx.air.true_airspeed_factor - 1.0) * 100.0
        ));
    }
    if let Some(t) = &side.takeoff {
        advice.push(format!(
            "{id}: abort point (common practice) — if not at about {:.0} KIAS (70 % of rotation speed) by {:.0} m, half the expected ground roll, abandon the takeoff.",
            0.7 * ty.rotation_kias,
            t.chain.ground_roll_m / 2.0
        ));
    }
}
