//! The limits of the pilot category, tightened by the pilot's own written limitations
//! and by regulation: ceiling, visibility, wind, gust, gust spread, crosswind,
//! tailwind, density altitude, weather hazards, daylight and endorsements.

use chrono::{DateTime, Duration, Utc};
use serde::Serialize;

use super::state::{State, verdict};
use crate::daylight::{self, Daylight, Event};
use crate::observation::{Ceiling, Report};
use crate::ops::operator::{Buffers, Hazard, Minimums, Regime};
use crate::ops::{Airfield, Category, Pilot};
use crate::units::M_PER_SM;

/// What a limit is about.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum LimitKind {
    /// Lowest BKN/OVC/VV layer.
    Ceiling,
    /// Prevailing visibility.
    Visibility,
    /// Mean wind speed.
    Wind,
    /// Gust.
    Gust,
    /// Gust minus mean.
    GustSpread,
    /// Crosswind component on the runway in use (gust where reported).
    Crosswind,
    /// Tailwind component on the runway in use (gust where reported).
    Tailwind,
    /// Density altitude.
    DensityAltitude,
    /// A weather hazard the category refuses.
    Hazard,
    /// Daylight window.
    Daylight,
    /// A required endorsement.
    Endorsement,
    /// The pilot is limited to named airfields.
    NamedAirfields,
    /// A loading station's limit.
    Loading,
    /// Maximum takeoff mass.
    TakeoffMass,
    /// Maximum landing mass.
    LandingMass,
    /// Usable fuel capacity.
    Fuel,
    /// Fuel reserve at landing.
    FuelReserve,
    /// The CG envelope, takeoff to landing.
    Envelope,
}

impl LimitKind {
    /// Words for the limit.
    pub const fn word(self) -> &'static str {
        match self {
            LimitKind::Ceiling => "ceiling",
            LimitKind::Visibility => "visibility",
            LimitKind::Wind => "wind",
            LimitKind::Gust => "gust",
            LimitKind::GustSpread => "gust spread",
            LimitKind::Crosswind => "crosswind",
            LimitKind::Tailwind => "tailwind",
            LimitKind::DensityAltitude => "density altitude",
            LimitKind::Hazard => "weather hazard",
            LimitKind::Daylight => "daylight",
            LimitKind::Endorsement => "endorsement",
            LimitKind::NamedAirfields => "named airfields",
            LimitKind::Loading => "station load",
            LimitKind::TakeoffMass => "takeoff mass",
            LimitKind::LandingMass => "landing mass",
            LimitKind::Fuel => "fuel capacity",
            LimitKind::FuelReserve => "fuel reserve",
            LimitKind::Envelope => "CG envelope",
        }
    }
}

/// One limit, evaluated.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LimitCheck {
    /// What it is about.
    pub kind: LimitKind,
    /// The observed value, in `unit`.
    pub value: Option<f64>,
    /// The limit, in `unit` (a minimum for ceiling and visibility, else a maximum; for
    /// the CG envelope the nearer of the fore and aft limits at the line's tightest
    /// mass, see [`super::mass::CgRange`]).
    pub limit: Option<f64>,
    /// Unit of value, limit and margin.
    pub unit: &'static str,
    /// Room to spare in `unit` (negative: missed; NaN: cannot be assessed).
    pub margin: f64,
    /// The thin band, in `unit`.
    pub band: f64,
    /// Verdict.
    pub state: State,
    /// Where the limit comes from (category, pilot, regulation, type).
    pub source: String,
    /// A plain sentence.
    pub note: String,
    /// What the limit is on, where one kind covers several (a loading station's name
    /// and id); empty otherwise. See [`LimitCheck::label`].
    #[serde(skip_serializing_if = "String::is_empty")]
    pub subject: String,
    /// The value is only a bound that already passes (`9999`, `P6SM`, CAVOK): the
    /// limit is not in play and never names itself as the limiting check.
    pub open_ended: bool,
}

impl LimitCheck {
    /// The row's name in a chain: the kind, and its subject when it has one
    /// (`station load Rear row (rear_seats)`).
    pub fn label(&self) -> std::borrow::Cow<'static, str> {
        if self.subject.is_empty() {
            self.kind.word().into()
        } else {
            format!("{} {}", self.kind.word(), self.subject).into()
        }
    }

    /// Margin divided by the band: below 0 missed, below 1 thin.
    pub fn score(&self) -> f64 {
        // No tailwind, crosswind or gust spread at all: the limit is not in play, so it
        // never names itself as the limiting check.
        let not_in_play = matches!(
            self.kind,
            LimitKind::Tailwind | LimitKind::Crosswind | LimitKind::GustSpread
        ) && self.value.is_some_and(|v| v <= 0.0)
            || self.open_ended;
        if self.margin.is_nan() {
            f64::NAN
        } else if not_in_play && self.margin >= 0.0 {
            f64::INFINITY
        } else if self.band > 0.0 {
            self.margin / self.band
        } else if self.margin < 0.0 {
            // A hard limit with no thin band (an endorsement, a hazard, daylight, a mass
            // limit) that fails is named first: no runway or hour of the day fixes it.
            f64::NEG_INFINITY
        } else {
            f64::INFINITY
        }
    }
}

/// A limit's value, limit and margin as shown at the unit's precision, so that the
/// margin shown is the shown value minus the shown limit (a maximum: the shown limit
/// minus the shown value) and never more than the true margin ([`LimitCheck::shown`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Shown {
    /// The value at `decimals`, rounded toward the limit where a margin is shown.
    pub value: Option<f64>,
    /// The limit at `decimals`, rounded toward the value where a margin is shown.
    pub limit: Option<f64>,
    /// The margin, equal to the shown value and limit's difference where both are
    /// shown, never rounded up.
    pub margin: Option<f64>,
    /// Decimals to print all three with (the `decimals` asked for).
    pub decimals: usize,
}

impl LimitCheck {
    /// Value, limit and margin for display in the unit `convert` gives (the identity
    /// for the check's own unit; a linear scaling such as ft → m), at `decimals`, the
    /// unit's normal precision. Value and limit are rounded conservatively, each to the
    /// side that makes the margin smaller (a maximum's value up and limit down, a
    /// minimum's value down and limit up), and the margin is exactly the difference of
    /// the figures shown: 986.24 kg against a maximum of 1150 kg shows as 987 kg, limit
    /// 1150 kg, margin +163 kg, never more margin than there is. Where that rounding
    /// would show a passing check as missed (value and limit inside one step), the
    /// value shows at the limit with a margin of 0; a missed check always shows a
    /// margin below 0.
    pub fn shown(&self, convert: impl Fn(f64) -> f64, decimals: usize) -> Shown {
        let margin = self.margin.is_finite().then(|| convert(self.margin));
        let (v, l) = (self.value.map(&convert), self.limit.map(&convert));
        let p = 10f64.powi(decimals as i32);
        let step = 1.0 / p;
        let round = |x: f64| (x * p).round() / p;
        // A hair of slack so that an exact figure (or one a conversion left a hair off
        // it) is not moved one step.
        let down = |x: f64| ((x * p) + 1e-9).floor() / p;
        let up = |x: f64| ((x * p) - 1e-9).ceil() / p;
        // `+ 0.0` turns a −0 into 0: no "tailwind -0 kt".
        let shown = |value: Option<f64>, limit: Option<f64>, margin: Option<f64>| Shown {
            value: value.map(|v| v + 0.0),
            limit: limit.map(|l| l + 0.0),
            margin: margin.map(|m| m + 0.0),
            decimals,
        };
        let Some(m) = margin else {
            return shown(v.map(round), l.map(round), None);
        };
        let (Some(v), Some(l)) = (v, l) else {
            return shown(v.map(round), l.map(round), Some(down(m)));
        };
        // A minimum's margin is value − limit, a maximum's limit − value.
        let tol = 1e-6 * (1.0 + m.abs());
        let minimum = if (v - l - m).abs() <= tol {
            true
        } else if (l - v - m).abs() <= tol {
            false
        } else {
            // Not a plain difference: the margin on its own, rounded down.
            return shown(Some(round(v)), Some(round(l)), Some(down(m)));
        };
        let (mut vs, ls) = if minimum {
            (down(v), up(l))
        } else {
            (up(v), down(l))
        };
        // `+ 0.0` turns a −0 into 0, so an exact margin never prints as "-0".
        let diff = |vs: f64| round(if minimum { vs - ls } else { ls - vs }) + 0.0;
        if m >= 0.0 && diff(vs) < 0.0 {
            // Passing by less than a step: at the limit, not beyond it.
            vs = ls;
        } else if m < 0.0 && diff(vs) >= 0.0 {
            // Missed by less than the slack: one step beyond the limit.
            vs = if minimum { ls - step } else { ls + step };
        }
        // Keep the figures on the grid of `decimals` (no 0.30000000000000004).
        let vs = round(vs);
        shown(Some(vs), Some(ls), Some(diff(vs)))
    }
}

impl LimitCheck {
    /// The margin in the check's own unit at its normal precision, as
    /// [`LimitCheck::shown`] rounds it (`+163 kg`, `-337 ft`); `None` for a check with
    /// no margin in numbers (a flag such as an endorsement or a hazard, or no data).
    pub fn margin_text(&self) -> Option<String> {
        if self.unit.is_empty() || !self.margin.is_finite() {
            return None;
        }
        let m = self.shown(|x| x, 0).margin?;
        Some(format!("{m:+.0} {}", self.unit))
    }
}

/// A limit on a value with `margin` to spare (in the value's unit).
fn bounded(
    kind: LimitKind,
    value: f64,
    limit: f64,
    margin: f64,
    unit: &'static str,
    band: f64,
    source: String,
) -> LimitCheck {
    LimitCheck {
        kind,
        value: Some(value),
        limit: Some(limit),
        unit,
        margin,
        band,
        state: verdict(margin, band),
        source,
        note: String::new(),
        subject: String::new(),
        open_ended: false,
    }
}

/// A maximum: `value ≤ limit`.
fn max_check(
    kind: LimitKind,
    value: f64,
    limit: f64,
    unit: &'static str,
    band: f64,
    source: String,
) -> LimitCheck {
    bounded(kind, value, limit, limit - value, unit, band, source)
}

/// A minimum: `value ≥ limit`.
fn min_check(
    kind: LimitKind,
    value: f64,
    limit: f64,
    unit: &'static str,
    band: f64,
    source: String,
) -> LimitCheck {
    bounded(kind, value, limit, value - limit, unit, band, source)
}

fn flag(kind: LimitKind, ok: bool, source: String, note: String) -> LimitCheck {
    LimitCheck {
        kind,
        value: None,
        limit: None,
        unit: "",
        margin: if ok { f64::INFINITY } else { -1.0 },
        band: 0.0,
        state: if ok { State::Within } else { State::Below },
        source,
        note,
        subject: String::new(),
        open_ended: false,
    }
}

fn no_data(
    kind: LimitKind,
    unit: &'static str,
    limit: f64,
    source: String,
    note: String,
) -> LimitCheck {
    LimitCheck {
        kind,
        value: None,
        limit: Some(limit),
        unit,
        margin: f64::NAN,
        band: 0.0,
        state: State::NoData,
        source,
        note,
        subject: String::new(),
        open_ended: false,
    }
}

/// Where a limit's value comes from, kept as a tag until its text is wanted.
#[derive(Debug, Clone, Copy)]
enum Origin {
    /// The category's minimums: this field of them ([`source_of`]).
    Minimums(&'static str),
    /// The pilot's written limitation.
    Pilot,
    /// A rule, quoted as it stands.
    Rule(&'static str),
}

impl Origin {
    fn text(self, who: &Who<'_>) -> String {
        match self {
            Origin::Minimums(field) => source_of(who, field),
            Origin::Pilot => "pilot's written limitation".to_string(),
            Origin::Rule(rule) => rule.to_string(),
        }
    }
}

/// The tighter of the category's limit (`field` of its minimums) and the pilot's own,
/// with where it comes from.
fn tighter(
    category_value: f64,
    field: &'static str,
    pilot_value: Option<f64>,
    maximum: bool,
) -> (f64, Origin) {
    match pilot_value {
        Some(p) if (maximum && p < category_value) || (!maximum && p > category_value) => {
            (p, Origin::Pilot)
        }
        _ => (category_value, Origin::Minimums(field)),
    }
}

/// Who the limits are for.
#[derive(Debug, Clone, Copy)]
pub struct Who<'a> {
    /// The category flown.
    pub category: Category,
    /// Its minimums.
    pub minimums: &'a Minimums,
    /// The pilot, when known.
    pub pilot: Option<&'a Pilot>,
    /// The operator's regime.
    pub regime: Regime,
    /// The thin bands.
    pub buffers: &'a Buffers,
}

fn source_of(who: &Who<'_>, field: &str) -> String {
    let cat = who.category.name();
    match who.minimums.sources.get(field) {
        // No parentheses round the operator's text: it often has its own, and the chain
        // quotes a source after a dash or "from", never inside another pair.
        Some(s) => format!("{cat} minimums: {s}"),
        None => format!("{cat} minimums"),
    }
}

/// The day's light at an airfield on the date of `at`.
pub fn sun(field: &Airfield, at: DateTime<Utc>) -> Daylight {
    daylight::daylight(at.date_naive(), field.latitude_deg, field.longitude_deg)
}

/// Is `at` between sunrise and sunset? Polar day counts as day, polar night as night.
pub fn is_day(d: &Daylight, at: DateTime<Utc>) -> bool {
    match (d.sunrise, d.sunset) {
        (Event::At(rise), Event::At(set)) => at >= rise && at <= set,
        (Event::AlwaysAbove, _) | (_, Event::AlwaysAbove) => true,
        _ => false,
    }
}

/// A stretch of night (14 CFR 1.1, from memory: "the time between the end of evening
/// civil twilight and the beginning of morning civil twilight") inside a leg, at one
/// airfield.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct NightSpan {
    /// First instant of the leg that is in night.
    pub from: DateTime<Utc>,
    /// Last instant of that stretch inside the leg.
    pub to: DateTime<Utc>,
    /// The end of evening civil twilight that began it, when that is a time.
    pub after_dusk: Option<DateTime<Utc>>,
    /// The beginning of morning civil twilight that ends it, when that is a time.
    pub before_dawn: Option<DateTime<Utc>>,
}

/// The place's civil-twilight day around `date`: from the beginning of morning civil
/// twilight to the end of evening civil twilight. Where the sun never sinks 6° below the
/// horizon the day spans the whole 24 h about solar noon; where it never rises to −6°
/// there is none.
fn civil_day(date: chrono::NaiveDate, field: &Airfield) -> Option<(DateTime<Utc>, DateTime<Utc>)> {
    let d = daylight::daylight(date, field.latitude_deg, field.longitude_deg);
    let half = Duration::hours(12);
    let start = match d.civil_dawn {
        Event::At(t) => t,
        Event::AlwaysAbove => d.solar_noon - half,
        Event::AlwaysBelow => return None,
    };
    let end = match d.civil_dusk {
        Event::At(t) => t,
        Event::AlwaysAbove => d.solar_noon + half,
        Event::AlwaysBelow => return None,
    };
    (start < end).then_some((start, end))
}

/// The first stretch of night between `from` and `to` at `field`, or `None` when the
/// whole of it lies between the beginning of morning and the end of evening civil
/// twilight (NOAA solar method, [`crate::daylight`]). Reads the civil days of the dates
/// around the leg; no allocation.
pub fn night_during(field: &Airfield, from: DateTime<Utc>, to: DateTime<Utc>) -> Option<NightSpan> {
    const MAX_DAYS: usize = 8;
    let to = to.max(from);
    let first = from.date_naive() - Duration::days(1);
    // The dates from the day before the departure to the day after the arrival (a leg
    // of a week at most), each with its civil day, in time order.
    let n = ((to.date_naive() - first).num_days().max(0) as usize + 2).min(MAX_DAYS);
    let mut days = [None; MAX_DAYS];
    for (k, d) in days.iter_mut().enumerate().take(n) {
        *d = civil_day(first + Duration::days(k as i64), field);
    }
    let days = &days[..n];
    let mut t = from;
    loop {
        // The civil day that holds `t`, if any: skip to its end.
        let covering = days.iter().flatten().filter(|(a, b)| *a <= t && t <= *b);
        match covering.map(|(_, b)| *b).max() {
            Some(end) if end >= to => return None,
            Some(end) => t = end + Duration::seconds(1),
            None => {
                let after_dusk = days
                    .iter()
                    .flatten()
                    .map(|(_, b)| *b)
                    .filter(|b| *b < t)
                    .max();
                let before_dawn = days
                    .iter()
                    .flatten()
                    .map(|(a, _)| *a)
                    .filter(|a| *a > t)
                    .min();
                return Some(NightSpan {
                    from: t,
                    to: before_dawn.map_or(to, |d| d.min(to)),
                    after_dusk,
                    before_dawn,
                });
            }
        }
    }
}

/// A student solo any part of which, departure to arrival, falls in night at either
/// end needs the pilot's night solo endorsement for the type (14 CFR 61.87(o) under the
/// FAA regime, from memory; the operator's rule elsewhere), given within the category's
/// solo-endorsement validity where it has one (61.87(o)(3): the 90 days before the
/// flight, from memory). Night is civil night, 14 CFR 1.1 (from memory). The route
/// between the two fields is not modelled: a leg is in night if it is at either end.
/// Nothing is added for a leg wholly in civil daylight.
#[allow(clippy::too_many_arguments)]
pub fn night_limits(
    who: &Who<'_>,
    type_id: &str,
    from_field: &Airfield,
    to_field: &Airfield,
    departs_at: DateTime<Utc>,
    arrives_at: DateTime<Utc>,
    out: &mut Vec<LimitCheck>,
) {
    if who.category != Category::StudentSolo {
        return;
    }
    let Some(pilot) = who.pilot else {
        return;
    };
    let spans = [
        (from_field, night_during(from_field, departs_at, arrives_at)),
        (to_field, night_during(to_field, departs_at, arrives_at)),
    ];
    let Some((field, span)) = spans
        .iter()
        .filter_map(|(f, s)| s.map(|s| (*f, s)))
        .min_by_key(|(_, s)| s.from)
    else {
        return;
    };
    let hhmm = |t: DateTime<Utc>| t.format("%H%MZ").to_string();
    let night = match (span.after_dusk, span.before_dawn) {
        (Some(dusk), Some(dawn)) => format!(
            "end of evening civil twilight {} to beginning of morning civil twilight {}",
            hhmm(dusk),
            hhmm(dawn)
        ),
        (Some(dusk), None) => format!("from the end of evening civil twilight {}", hhmm(dusk)),
        (None, Some(dawn)) => {
            format!(
                "until the beginning of morning civil twilight {}",
                hhmm(dawn)
            )
        }
        (None, None) => "no civil twilight: polar night".to_string(),
    };
    let when = format!(
        "the leg {}–{} is in night at {} from {} to {} (night: {night}, NOAA solar method)",
        hhmm(departs_at),
        hhmm(arrives_at),
        field.id,
        hhmm(span.from),
        hhmm(span.to)
    );
    let day = departs_at.date_naive();
    let days = who.minimums.solo_endorsement_valid_days;
    let matching = || {
        pilot
            .endorsements
            .night
            .iter()
            .filter(|e| e.type_id == type_id && e.date <= day)
    };
    let valid = matching()
        .filter(|e| days.is_none_or(|n| day - e.date < Duration::days(i64::from(n))))
        .max_by_key(|e| e.date);
    let who_name = format!("{} ({})", pilot.name, pilot.id);
    let source = if who.regime == Regime::Faa {
        "14 CFR 61.87(o): night solo endorsement (from memory); night per 14 CFR 1.1, end to beginning of civil twilight (from memory)".to_string()
    } else {
        "operator: night solo endorsement; night per 14 CFR 1.1, end to beginning of civil twilight (from memory)".to_string()
    };
    out.push(match valid {
        Some(e) => flag(
            LimitKind::Endorsement,
            true,
            source,
            format!(
                "{who_name} holds a night solo endorsement for type {type_id} of {}; {when}",
                e.date
            ),
        ),
        None => {
            let lapsed = matching().map(|e| e.date).max();
            flag(
                LimitKind::Endorsement,
                false,
                source,
                match (lapsed, days) {
                    (Some(d), Some(n)) => format!(
                        "{who_name}'s night solo endorsement for type {type_id} of {d} has lapsed ({n}-day validity); {when}"
                    ),
                    _ => format!(
                        "{who_name} has no night solo endorsement for type {type_id}; {when}"
                    ),
                },
            )
        }
    });
}

/// The field-level limits at one end of a leg (everything but the runway components).
/// `sun` is the field's daylight on the event's date ([`sun`]).
pub fn field_limits(
    who: &Who<'_>,
    report: &Report,
    density_altitude_ft: f64,
    sun: &Daylight,
    event_at: DateTime<Utc>,
    departure: bool,
    out: &mut Vec<LimitCheck>,
) {
    field_limits_to(
        who,
        report,
        density_altitude_ft,
        sun,
        event_at,
        departure,
        out,
    );
}

/// Where [`field_limits_to`] puts its checks: a list of whole checks, or only their
/// worst verdict ([`Weather`]). Each check comes without its texts (source and note);
/// `texts` writes them, and only a sink that keeps them calls it.
pub trait LimitSink {
    /// One check, and what writes its texts.
    fn put(&mut self, check: LimitCheck, texts: impl FnOnce(&mut LimitCheck));
}

impl LimitSink for Vec<LimitCheck> {
    fn put(&mut self, mut check: LimitCheck, texts: impl FnOnce(&mut LimitCheck)) {
        texts(&mut check);
        self.push(check);
    }
}

/// [`field_limits`] into any [`LimitSink`]: the same checks, in the same order, with
/// their texts written only for a sink that keeps them (the pairing matrix keeps only
/// the verdict, so it builds no string).
pub fn field_limits_to<S: LimitSink>(
    who: &Who<'_>,
    report: &Report,
    density_altitude_ft: f64,
    sun: &Daylight,
    event_at: DateTime<Utc>,
    departure: bool,
    out: &mut S,
) {
    let m = who.minimums;
    let b = who.buffers;
    let lim = who.pilot.map(|p| &p.limitations);
    // Ceiling.
    let (min_ceiling, src) = tighter(
        m.min_ceiling_ft,
        "min_ceiling_ft",
        lim.and_then(|l| l.min_ceiling_ft),
        false,
    );
    match report.ceiling {
        Ceiling::Known(ft) => out.put(
            min_check(
                LimitKind::Ceiling,
                ft,
                min_ceiling,
                "ft",
                b.ceiling_ft,
                String::new(),
            ),
            |c| c.source = src.text(who),
        ),
        // Nothing to measure, but the minimum still shows, in its unit.
        Ceiling::None => out.put(
            LimitCheck {
                open_ended: true,
                limit: Some(min_ceiling),
                unit: "ft",
                ..flag(LimitKind::Ceiling, true, String::new(), String::new())
            },
            |c| {
                c.source = src.text(who);
                c.note = "no ceiling reported".to_string();
            },
        ),
        Ceiling::Unknown => out.put(
            no_data(
                LimitKind::Ceiling,
                "ft",
                min_ceiling,
                String::new(),
                String::new(),
            ),
            |c| {
                c.source = src.text(who);
                c.note = "ceiling unknown (no sky group in the report, or a layer of unknown height or amount)".to_string();
            },
        ),
    }
    // Visibility, with the regulatory floor under the operator's value.
    let day = is_day(sun, event_at);
    let (mut min_vis, mut src) = tighter(
        m.min_visibility_m,
        "min_visibility_m",
        lim.and_then(|l| l.min_visibility_m),
        false,
    );
    if who.category == Category::StudentSolo && who.regime == Regime::Faa {
        let (floor_sm, rule) = if day {
            (3.0, "14 CFR 61.89(a)(6): 3 SM by day for a student solo")
        } else {
            (5.0, "14 CFR 61.89(a)(6): 5 SM at night for a student solo")
        };
        let floor_m = floor_sm * M_PER_SM;
        if floor_m > min_vis {
            min_vis = floor_m;
            src = Origin::Rule(rule);
        }
    }
    match report.visibility {
        Some(v) => {
            let mut c = min_check(
                LimitKind::Visibility,
                v.prevailing_m,
                min_vis,
                "m",
                b.visibility_m,
                String::new(),
            );
            c.open_ended = v.bound == crate::observation::Bound::AtLeast && c.margin >= 0.0;
            out.put(c, |c| c.source = src.text(who));
        }
        None if report.cavok => out.put(
            LimitCheck {
                open_ended: true,
                ..min_check(
                    LimitKind::Visibility,
                    10_000.0,
                    min_vis,
                    "m",
                    b.visibility_m,
                    String::new(),
                )
            },
            |c| {
                c.source = src.text(who);
                c.note = "CAVOK".to_string();
            },
        ),
        None => out.put(
            no_data(
                LimitKind::Visibility,
                "m",
                min_vis,
                String::new(),
                String::new(),
            ),
            |c| {
                c.source = src.text(who);
                c.note = "no visibility in the report".to_string();
            },
        ),
    }
    // Wind, gust, spread.
    if let Some(w) = report.wind {
        let (max_wind, src) = tighter(
            m.max_wind_kt,
            "max_wind_kt",
            lim.and_then(|l| l.max_wind_kt),
            true,
        );
        out.put(
            max_check(
                LimitKind::Wind,
                w.speed_kt,
                max_wind,
                "kt",
                b.wind_kt,
                String::new(),
            ),
            |c| c.source = src.text(who),
        );
        let (max_gust, src) = tighter(
            m.max_gust_kt,
            "max_gust_kt",
            lim.and_then(|l| l.max_gust_kt),
            true,
        );
        // With no gust reported, the steady wind stands for it (and says so).
        let gust = w.gust_kt.unwrap_or(w.speed_kt);
        out.put(
            max_check(
                LimitKind::Gust,
                gust,
                max_gust,
                "kt",
                b.wind_kt,
                String::new(),
            ),
            |c| {
                c.source = src.text(who);
                if w.gust_kt.is_none() {
                    c.subject = "(none reported: the steady wind)".to_string();
                }
            },
        );
        out.put(
            max_check(
                LimitKind::GustSpread,
                gust - w.speed_kt,
                m.max_gust_spread_kt,
                "kt",
                b.wind_kt,
                String::new(),
            ),
            |c| c.source = source_of(who, "max_gust_spread_kt"),
        );
    }
    // Density altitude.
    let (max_da, src) = tighter(
        m.max_density_altitude_ft,
        "max_density_altitude_ft",
        lim.and_then(|l| l.max_density_altitude_ft),
        true,
    );
    out.put(
        max_check(
            LimitKind::DensityAltitude,
            density_altitude_ft,
            max_da,
            "ft",
            b.density_altitude_ft,
            String::new(),
        ),
        |c| c.source = src.text(who),
    );
    // Hazards.
    let h = report.hazards;
    for hazard in &m.refuse_hazards {
        let (present, what) = match hazard {
            Hazard::Thunderstorm => (h.thunderstorm || h.cumulonimbus, "thunderstorm or CB/TCU"),
            Hazard::FreezingPrecipitation => (h.freezing_precipitation, "freezing precipitation"),
            Hazard::Fog => (h.fog, "fog"),
            Hazard::WindShear => (h.wind_shear, "wind shear"),
        };
        if present {
            out.put(
                flag(LimitKind::Hazard, false, String::new(), String::new()),
                |c| {
                    c.source = source_of(who, "refuse_hazards");
                    c.note = format!("{what} reported; refused for {}", who.category.name());
                },
            );
        }
    }
    // Daylight: depart after sunrise (plus the category's margin), land before sunset
    // (less its margin).
    if m.daylight_only {
        let (edge, need_min, label) = if departure {
            (
                sun.sunrise,
                m.depart_after_sunrise_min.unwrap_or(0.0),
                "sunrise",
            )
        } else {
            (
                sun.sunset,
                m.land_before_sunset_min.unwrap_or(0.0),
                "sunset",
            )
        };
        let field = match (departure, need_min > 0.0) {
            (true, true) => "depart_after_sunrise_min",
            (false, true) => "land_before_sunset_min",
            _ => "daylight_only",
        };
        match edge {
            Event::At(t) => {
                let gap = if departure {
                    event_at - t
                } else {
                    t - event_at
                };
                let margin = gap.num_seconds() as f64 / 60.0 - need_min;
                let what = if departure { "departs" } else { "lands" };
                out.put(
                    LimitCheck {
                        kind: LimitKind::Daylight,
                        value: Some(gap.num_seconds() as f64 / 60.0),
                        limit: Some(need_min),
                        unit: "min",
                        margin,
                        band: 0.0,
                        state: if margin < 0.0 {
                            State::Below
                        } else {
                            State::Within
                        },
                        source: String::new(),
                        subject: String::new(),
                        note: String::new(),
                        open_ended: false,
                    },
                    |c| {
                        c.source = source_of(who, field);
                        c.note = format!(
                            "{label} {} (NOAA solar method); {what} {} min {} it{}",
                            t.format("%H%MZ"),
                            gap.num_minutes().abs(),
                            if gap.num_seconds() >= 0 {
                                if departure { "after" } else { "before" }
                            } else if departure {
                                "before"
                            } else {
                                "after"
                            },
                            if need_min > 0.0 {
                                format!(", {need_min:.0} min required")
                            } else {
                                String::new()
                            }
                        );
                    },
                );
            }
            Event::AlwaysAbove => out.put(
                flag(LimitKind::Daylight, true, String::new(), String::new()),
                |c| {
                    c.source = source_of(who, field);
                    c.note = "polar day".to_string();
                },
            ),
            Event::AlwaysBelow => out.put(
                flag(LimitKind::Daylight, false, String::new(), String::new()),
                |c| {
                    c.source = source_of(who, field);
                    c.note = "no daylight today (polar night)".to_string();
                },
            ),
        }
    }
}

/// The per-runway-end limits: crosswind and tailwind against the category, the pilot
/// and the type's demonstrated crosswind.
pub fn end_limits(
    who: &Who<'_>,
    crosswind_kt: f64,
    tailwind_kt: f64,
    demonstrated_crosswind_kt: f64,
    out: &mut Vec<LimitCheck>,
) {
    let m = who.minimums;
    let (mut max_x, mut src) = tighter(
        m.max_crosswind_kt,
        "max_crosswind_kt",
        who.pilot.and_then(|p| p.limitations.max_crosswind_kt),
        true,
    );
    if demonstrated_crosswind_kt < max_x {
        max_x = demonstrated_crosswind_kt;
        src = Origin::Rule("aircraft type: maximum demonstrated crosswind");
    }
    out.push(max_check(
        LimitKind::Crosswind,
        crosswind_kt,
        max_x,
        "kt",
        who.buffers.wind_kt,
        src.text(who),
    ));
    out.push(max_check(
        LimitKind::Tailwind,
        tailwind_kt,
        m.max_tailwind_kt,
        "kt",
        who.buffers.wind_kt,
        source_of(who, "max_tailwind_kt"),
    ));
}

/// The pilot's endorsements and airfield limitations for a leg.
pub fn pilot_limits(
    who: &Who<'_>,
    type_id: &str,
    departs_at: DateTime<Utc>,
    from: &str,
    to: &str,
    out: &mut Vec<LimitCheck>,
) {
    let Some(pilot) = who.pilot else {
        return;
    };
    if let Some(days) = who.minimums.solo_endorsement_valid_days {
        let day = departs_at.date_naive();
        let valid = pilot
            .endorsements
            .solo
            .iter()
            .filter(|e| e.type_id == type_id)
            .find(|e| e.date <= day && day - e.date < Duration::days(i64::from(days)));
        let src = source_of(who, "solo_endorsement_valid_days");
        out.push(match valid {
            Some(e) => {
                let left = i64::from(days) - (day - e.date).num_days();
                let mut c = flag(
                    LimitKind::Endorsement,
                    true,
                    src,
                    format!(
                        "solo endorsement for type {type_id} of {} ({left} days left)",
                        e.date
                    ),
                );
                c.value = Some(left as f64);
                c.unit = "days";
                c
            }
            None => {
                let last = pilot
                    .endorsements
                    .solo
                    .iter()
                    .filter(|e| e.type_id == type_id)
                    .map(|e| e.date)
                    .max();
                flag(
                    LimitKind::Endorsement,
                    false,
                    src,
                    match last {
                        Some(d) => format!(
                            "solo endorsement for type {type_id} of {d} has lapsed ({days}-day validity)"
                        ),
                        None => format!("no solo endorsement for type {type_id}"),
                    },
                )
            }
        });
    }
    // A student solo to another airfield needs a solo cross-country endorsement for the
    // make and model (14 CFR 61.93 under the FAA regime; the operator's rule elsewhere).
    if who.category == Category::StudentSolo && from != to {
        let ok = pilot
            .endorsements
            .cross_country
            .iter()
            .any(|e| e.type_id == type_id && e.date <= departs_at.date_naive());
        out.push(flag(
            LimitKind::Endorsement,
            ok,
            if who.regime == Regime::Faa {
                "14 CFR 61.93: solo cross-country endorsement".to_string()
            } else {
                "operator: solo cross-country endorsement".to_string()
            },
            if ok {
                format!("cross-country endorsement for type {type_id}")
            } else {
                format!("{from} to {to} is a cross-country flight and there is no cross-country endorsement for type {type_id}")
            },
        ));
    }
    let named = &pilot.limitations.airfields;
    if !named.is_empty() {
        let missing: Vec<&str> = [from, to]
            .into_iter()
            .filter(|a| !named.iter().any(|n| n == a))
            .collect();
        out.push(flag(
            LimitKind::NamedAirfields,
            missing.is_empty(),
            "pilot's written limitation".to_string(),
            if missing.is_empty() {
                format!("limited to {}", named.join(", "))
            } else {
                format!(
                    "not cleared for {} (limited to {})",
                    missing.join(", "),
                    named.join(", ")
                )
            },
        ));
    }
}
