//! Forecast conditions at a time, from a decoded [`Taf`], and an hourly temperature
//! curve. Pure functions: the instant asked about is always a parameter; no clock.
//!
//! How a TAF is read at an instant `t` (start inclusive, end exclusive):
//! - the base conditions hold from the start of validity;
//! - `FM` replaces everything from its time (an element an FM group leaves out is
//!   carried over from before — a tolerance, not the standard; weather and wind shear
//!   are not carried: an FM group without weather forecasts none);
//! - `BECMG` changes the elements it gives at some time within its period: during the
//!   period the prevailing value is the worse of before and after, element by element;
//!   from its end the new values hold;
//! - `TEMPO` and `PROB30/40` (with or without `TEMPO`) do not change the prevailing
//!   conditions; during their period the worst case (the worse of prevailing and the
//!   group's conditions) is given beside the prevailing, flagged and labelled;
//! - outside the validity, and for an unusable TAF, there is no forecast (`None`).
//!
//! "Worse" element by element: the higher wind (mean and gust separately; a change of
//! direction widens the variable sector to cover both), the lower visibility, the lower
//! ceiling (an unknown ceiling is worst), all weather and all hazards of both.
//!
//! Temperature: see [`temperature_at`].

use chrono::{DateTime, Duration, Utc};

use super::taf::{Change, ChangeKind, Conditions, Extreme, Taf, TemperaturePoint};
use super::{Bound, Ceiling, CloudLayer, Hazards, Report, SkyClear, Visibility, Weather, Wind};

/// The operator's expected high for a field without TX/TN, with the latest observed
/// temperature to start the curve from.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ExpectedHigh {
    /// The day's expected maximum, °C.
    pub high_c: f64,
    /// When the maximum is expected.
    pub high_at: DateTime<Utc>,
    /// The latest observed temperature, °C.
    pub observed_c: f64,
    /// When it was observed.
    pub observed_at: DateTime<Utc>,
}

/// A forecast temperature, or the reason there is none.
#[derive(Debug, Clone, PartialEq)]
pub struct TemperatureEstimate {
    /// The temperature, °C; `None` when no temperature forecast exists.
    pub temperature_c: Option<f64>,
    /// How it was obtained, or why there is none.
    pub basis: String,
}

/// The forecast conditions at one instant, in the types of an observed [`Report`].
#[derive(Debug, Clone, PartialEq)]
pub struct ForecastConditions {
    /// The instant.
    pub at: DateTime<Utc>,
    /// Surface wind (true).
    pub wind: Wind,
    /// Prevailing visibility.
    pub visibility: Visibility,
    /// CAVOK in force.
    pub cavok: bool,
    /// Ceiling.
    pub ceiling: Ceiling,
    /// Cloud layers in force.
    pub clouds: Vec<CloudLayer>,
    /// Weather in force.
    pub weather: Vec<Weather>,
    /// Hazards.
    pub hazards: Hazards,
    /// Temperature, °C, when a temperature forecast exists.
    pub temperature_c: Option<f64>,
    /// How the temperature was obtained, or why there is none.
    pub temperature_basis: String,
    /// True for a TEMPO/PROB worst case; false for the prevailing conditions.
    pub worst_case: bool,
    /// Which parts of the TAF the values come from, e.g.
    /// `TAF XSEA 140500Z: FM141200 + TEMPO 1414/1415 (worst case)`.
    pub basis: String,
}

impl ForecastConditions {
    /// A synthetic [`Report`] with these values, for the assessment: wind, visibility,
    /// CAVOK, clouds, ceiling, weather, hazards and temperature are set; the altimeter
    /// setting and dew point are left `None` for the caller to hold from the latest
    /// observation; `kind` is `None` and `text` names the forecast, so it is never
    /// mistaken for an observation. `observed_at` is the forecast instant.
    pub fn to_report(&self, station: &str) -> Report {
        Report {
            text: format!("forecast for {}: {}", self.at.format("%d%H%MZ"), self.basis),
            kind: None,
            station: station.to_string(),
            time_text: self.at.format("%d%H%MZ").to_string(),
            observed_at: Some(self.at),
            wind: Some(self.wind),
            cavok: self.cavok,
            visibility: Some(self.visibility),
            weather: self.weather.clone(),
            clouds: self.clouds.clone(),
            sky_clear: (self.clouds.is_empty() && !self.cavok).then_some(SkyClear::Nsc),
            ceiling: self.ceiling,
            temperature_c: self.temperature_c,
            hazards: self.hazards,
            ..Report::default()
        }
    }
}

/// The prevailing forecast at an instant and, when a TEMPO or PROB group covers it,
/// the worst case.
#[derive(Debug, Clone, PartialEq)]
pub struct Outlook {
    /// The prevailing conditions (`worst_case == false`).
    pub prevailing: ForecastConditions,
    /// The worst case under TEMPO/PROB groups (`worst_case == true`), if any applies.
    pub worst: Option<ForecastConditions>,
}

impl Outlook {
    /// The worst case when there is one, else the prevailing conditions.
    pub fn worst_or_prevailing(&self) -> &ForecastConditions {
        self.worst.as_ref().unwrap_or(&self.prevailing)
    }
}

/// The elements in force: every element known.
#[derive(Debug, Clone, PartialEq)]
struct State {
    wind: Wind,
    visibility: Visibility,
    cavok: bool,
    weather: Vec<Weather>,
    clouds: Vec<CloudLayer>,
    sky_clear: Option<SkyClear>,
    wind_shear: bool,
}

impl State {
    fn from_base(c: &Conditions) -> Option<State> {
        Some(State {
            wind: c.wind?,
            visibility: c.visibility?,
            cavok: c.cavok,
            weather: if c.cavok {
                Vec::new()
            } else {
                c.weather.clone()
            },
            clouds: c.clouds.clone(),
            sky_clear: c.sky_clear,
            wind_shear: c.wind_shear.is_some(),
        })
    }

    /// Applies a BECMG/TEMPO/PROB group: the elements it gives replace, the rest stay.
    fn apply(&self, c: &Conditions) -> State {
        let mut s = self.clone();
        if let Some(w) = c.wind {
            s.wind = w;
        }
        if c.cavok {
            s.cavok = true;
            s.weather.clear();
            s.clouds.clear();
            s.sky_clear = None;
        }
        if let Some(v) = c.visibility {
            s.visibility = v;
            if !c.cavok && s.cavok {
                s.cavok = false;
                // CAVOK implied no significant cloud; that stays unless clouds are given.
                s.sky_clear = Some(SkyClear::Nsc);
            }
        }
        if c.no_significant_weather {
            s.weather.clear();
        }
        if !c.weather.is_empty() {
            s.weather = c.weather.clone();
            if s.cavok {
                s.cavok = false;
                s.sky_clear = Some(SkyClear::Nsc);
            }
        }
        if !c.clouds.is_empty() || c.sky_clear.is_some() {
            s.clouds = c.clouds.clone();
            s.sky_clear = c.sky_clear;
            s.cavok = c.cavok;
        }
        if c.wind_shear.is_some() {
            s.wind_shear = true;
        }
        s
    }

    /// Applies an FM group: a fresh state, with absent wind/visibility/cloud carried.
    fn replace(&self, c: &Conditions) -> State {
        let mut s = self.apply(c);
        s.weather = if c.cavok {
            Vec::new()
        } else {
            c.weather.clone()
        };
        s.wind_shear = c.wind_shear.is_some();
        s
    }

    fn conditions(&self, at: DateTime<Utc>, basis: String) -> ForecastConditions {
        let c = Conditions {
            wind: Some(self.wind),
            cavok: self.cavok,
            visibility: Some(self.visibility),
            weather: self.weather.clone(),
            no_significant_weather: false,
            clouds: self.clouds.clone(),
            sky_clear: self.sky_clear,
            wind_shear: None,
        };
        let (ceiling, mut hazards) = c.ceiling_and_hazards();
        hazards.wind_shear = self.wind_shear;
        ForecastConditions {
            at,
            wind: self.wind,
            visibility: self.visibility,
            cavok: self.cavok,
            ceiling,
            clouds: self.clouds.clone(),
            weather: self.weather.clone(),
            hazards,
            temperature_c: None,
            temperature_basis: String::new(),
            worst_case: false,
            basis,
        }
    }
}

/// The higher of two winds: mean and gust separately; different directions give a
/// variable sector spanning both (the shorter way round); VRB stays VRB.
pub fn worse_wind(a: &Wind, b: &Wind) -> Wind {
    let strength = |w: &Wind| w.gust_kt.unwrap_or(w.speed_kt).max(w.speed_kt);
    let (strong, weak) = if strength(b) > strength(a) {
        (b, a)
    } else {
        (a, b)
    };
    let mut w = *strong;
    w.speed_kt = a.speed_kt.max(b.speed_kt);
    w.speed_bound = if a.speed_bound == Bound::AtLeast || b.speed_bound == Bound::AtLeast {
        Bound::AtLeast
    } else {
        Bound::Exact
    };
    w.gust_kt = match (a.gust_kt, b.gust_kt) {
        (Some(x), Some(y)) => Some(x.max(y)),
        (x, y) => x.or(y),
    };
    match (strong.direction_deg, weak.direction_deg) {
        _ if a.variable || b.variable => {
            w.direction_deg = None;
            w.variable = true;
            w.variable_from_deg = None;
            w.variable_to_deg = None;
        }
        (Some(x), Some(y)) if (x - y).abs() > 0.5 || weak.variable_from_deg.is_some() => {
            // Every direction either wind may blow from: both points and both sectors.
            let mut dirs = vec![x, y];
            for s in [strong, weak] {
                if let (Some(f), Some(t)) = (s.variable_from_deg, s.variable_to_deg) {
                    dirs.push(f);
                    dirs.push(t);
                }
            }
            let (from, to) = smallest_sector(&dirs);
            w.variable_from_deg = Some(from);
            w.variable_to_deg = Some(to);
        }
        _ => {}
    }
    w
}

/// The smallest clockwise sector `(from, to)` containing all the directions.
fn smallest_sector(dirs: &[f64]) -> (f64, f64) {
    let mut d: Vec<f64> = dirs.iter().map(|x| x.rem_euclid(360.0)).collect();
    d.sort_by(f64::total_cmp);
    // The sector is the circle minus the largest gap between neighbours.
    let mut best = (0usize, -1.0f64);
    for k in 0..d.len() {
        let here = d.get(k).copied().unwrap_or(0.0);
        let next = d.get((k + 1) % d.len()).copied().unwrap_or(0.0);
        let gap = (next - here).rem_euclid(360.0);
        let gap = if d.len() == 1 { 360.0 } else { gap };
        if gap > best.1 {
            best = (k, gap);
        }
    }
    let from = d.get((best.0 + 1) % d.len()).copied().unwrap_or(0.0);
    let to = d.get(best.0).copied().unwrap_or(0.0);
    let norm = |x: f64| if x == 0.0 { 360.0 } else { x };
    (norm(from), norm(to))
}

fn worse_ceiling(a: Ceiling, b: Ceiling) -> Ceiling {
    match (a, b) {
        (Ceiling::Unknown, _) | (_, Ceiling::Unknown) => Ceiling::Unknown,
        (Ceiling::Known(x), Ceiling::Known(y)) => Ceiling::Known(x.min(y)),
        (Ceiling::Known(x), Ceiling::None) | (Ceiling::None, Ceiling::Known(x)) => {
            Ceiling::Known(x)
        }
        (Ceiling::None, Ceiling::None) => Ceiling::None,
    }
}

fn or_hazards(a: Hazards, b: Hazards) -> Hazards {
    Hazards {
        thunderstorm: a.thunderstorm || b.thunderstorm,
        cumulonimbus: a.cumulonimbus || b.cumulonimbus,
        freezing_precipitation: a.freezing_precipitation || b.freezing_precipitation,
        fog: a.fog || b.fog,
        wind_shear: a.wind_shear || b.wind_shear,
        severe: a.severe || b.severe,
    }
}

/// The worse of two sets of conditions, element by element (see the module notes).
pub fn worse(a: &ForecastConditions, b: &ForecastConditions) -> ForecastConditions {
    let mut clouds = a.clouds.clone();
    for l in &b.clouds {
        if !clouds.contains(l) {
            clouds.push(*l);
        }
    }
    clouds.sort_by(|x, y| {
        x.base_ft
            .unwrap_or(f64::MAX)
            .total_cmp(&y.base_ft.unwrap_or(f64::MAX))
    });
    let mut weather = a.weather.clone();
    for w in &b.weather {
        if !weather.iter().any(|x| x.code() == w.code()) {
            weather.push(w.clone());
        }
    }
    let visibility = if b.visibility.prevailing_m < a.visibility.prevailing_m {
        b.visibility
    } else {
        a.visibility
    };
    ForecastConditions {
        at: a.at,
        wind: worse_wind(&a.wind, &b.wind),
        visibility,
        cavok: a.cavok && b.cavok,
        ceiling: worse_ceiling(a.ceiling, b.ceiling),
        clouds,
        weather,
        hazards: or_hazards(a.hazards, b.hazards),
        temperature_c: a.temperature_c,
        temperature_basis: a.temperature_basis.clone(),
        worst_case: a.worst_case || b.worst_case,
        basis: a.basis.clone(),
    }
}

/// The forecast at `t` from `taf`: prevailing and (under TEMPO/PROB) worst case, each
/// with a temperature from [`temperature_at`] (TX/TN, else `expected_high`).
/// `None` outside the validity or when the TAF is unusable.
pub fn at(taf: &Taf, t: DateTime<Utc>, expected_high: Option<&ExpectedHigh>) -> Option<Outlook> {
    if !taf.usable() || !taf.covers(t) {
        return None;
    }
    let mut state = State::from_base(&taf.base)?;
    let mut before: Option<State> = None;
    let mut parts: Vec<String> = vec!["base".into()];
    let mut ordered: Vec<&Change> = taf.changes.iter().collect();
    ordered.sort_by_key(|c| c.from);
    for c in ordered.iter().filter(|c| !c.kind.is_fluctuation()) {
        if c.from > t {
            continue;
        }
        match c.kind {
            ChangeKind::From => {
                state = state.replace(&c.conditions);
                before = None;
                parts = vec![c.label.clone()];
            }
            _ if t < c.to => {
                before = Some(before.unwrap_or_else(|| state.clone()));
                state = state.apply(&c.conditions);
                parts.push(format!("{} (in transition)", c.label));
            }
            _ => {
                if let Some(b) = before.as_mut() {
                    *b = b.apply(&c.conditions);
                }
                state = state.apply(&c.conditions);
                parts.push(c.label.clone());
            }
        }
    }
    let head = format!("TAF {} {}", taf.station, taf.issued_text);
    let basis = format!("{head}: {}", parts.join(" + "));
    let mut prevailing = state.conditions(t, basis.clone());
    if let Some(b) = &before {
        prevailing = worse(&prevailing, &b.conditions(t, basis.clone()));
        prevailing.cavok = prevailing.cavok && b.cavok;
    }
    let temp = temperature_at(Some(taf), expected_high, t);
    prevailing.temperature_c = temp.temperature_c;
    prevailing.temperature_basis = temp.basis;
    let mut worst: Option<ForecastConditions> = None;
    let mut labels: Vec<String> = Vec::new();
    for c in ordered
        .iter()
        .filter(|c| c.kind.is_fluctuation() && c.from <= t && t < c.to)
    {
        let mut alt = state.apply(&c.conditions).conditions(t, String::new());
        alt.worst_case = true;
        let base = worst.as_ref().unwrap_or(&prevailing);
        worst = Some(worse(base, &alt));
        labels.push(c.label.clone());
    }
    if let Some(w) = worst.as_mut() {
        w.worst_case = true;
        w.basis = format!("{basis} + {} (worst case)", labels.join(" + "));
    }
    Some(Outlook { prevailing, worst })
}

/// The temperature at `t`.
///
/// With TX and TN in the TAF: the extremes are taken to repeat every 24 hours at the
/// same hours (a TAF gives at most two of each). From a minimum to the next maximum the
/// temperature rises along a quarter sine (`TN + (TX − TN)·sin(πf/2)`, `f` the fraction
/// of the time between them): warming is fastest just after the minimum (near sunrise)
/// and flattens into the maximum, the usual shape of a clear-sky day. From a maximum to
/// the next minimum it falls along a half-cosine (`TX − (TX − TN)·(1 − cos πf)/2`): slow
/// at first, fastest in the evening, flattening into the night minimum. Both stay within
/// [TN, TX]. Two extremes of the same kind in a row are joined linearly. Cloud, fronts
/// and sea breezes are not modelled: the curve is only as good as TX/TN and their times.
///
/// Else with the operator's expected high: the same quarter-sine rise from the observed
/// temperature at its time to the high at its time; after the high, the mirror image of
/// the rise (cooling as fast as it warmed), never below the observed value; before the
/// observation, the observed value. A high below the observed value is raised to it.
///
/// Else: no temperature forecast (`temperature_c: None` with the reason).
pub fn temperature_at(
    taf: Option<&Taf>,
    expected_high: Option<&ExpectedHigh>,
    t: DateTime<Utc>,
) -> TemperatureEstimate {
    if let Some(taf) = taf {
        let has_max = taf.temperatures.iter().any(|p| p.extreme == Extreme::Max);
        let has_min = taf.temperatures.iter().any(|p| p.extreme == Extreme::Min);
        if has_max
            && has_min
            && let Some(v) = diurnal(&taf.temperatures, t)
        {
            return TemperatureEstimate {
                temperature_c: Some(v),
                basis: format!(
                    "TAF {} TX/TN: quarter-sine rise to TX, half-cosine fall to TN",
                    taf.station
                ),
            };
        }
    }
    if let Some(e) = expected_high {
        return TemperatureEstimate {
            temperature_c: Some(from_expected_high(e, t)),
            basis: format!(
                "operator's expected high {:.0} °C at {}, from {:.1} °C observed at {}",
                e.high_c,
                e.high_at.format("%H:%MZ"),
                e.observed_c,
                e.observed_at.format("%H:%MZ")
            ),
        };
    }
    let reason = match taf {
        Some(x) if x.temperatures.is_empty() => format!(
            "no temperature forecast: the TAF for {} gives no TX/TN and no expected high is set",
            x.station
        ),
        Some(x) => format!(
            "no temperature forecast: the TAF for {} gives only one of TX and TN and no expected high is set",
            x.station
        ),
        None => "no temperature forecast: no TAF and no expected high".into(),
    };
    TemperatureEstimate {
        temperature_c: None,
        basis: reason,
    }
}

/// Quarter-sine rise from `a` to `b` (steepest at the start).
fn quarter_sine(a: f64, b: f64, f: f64) -> f64 {
    a + (b - a) * (std::f64::consts::FRAC_PI_2 * f.clamp(0.0, 1.0)).sin()
}

/// Half-cosine from `a` to `b` (flat at both ends).
fn half_cosine(a: f64, b: f64, f: f64) -> f64 {
    let f = f.clamp(0.0, 1.0);
    a + (b - a) * (1.0 - (std::f64::consts::PI * f).cos()) / 2.0
}

/// The TX/TN curve at `t` (see [`temperature_at`]).
fn diurnal(points: &[TemperaturePoint], t: DateTime<Utc>) -> Option<f64> {
    // The given extremes, each repeated one and two days before and after.
    let mut pts: Vec<TemperaturePoint> = Vec::with_capacity(points.len() * 3);
    for p in points {
        for shift in [-2i64, -1, 0, 1, 2] {
            let at = p.at + Duration::days(shift);
            // A repeat never displaces a given extreme of the same kind nearby.
            let clash = shift != 0
                && points
                    .iter()
                    .any(|q| q.extreme == p.extreme && (q.at - at).num_hours().abs() < 12);
            if !clash {
                pts.push(TemperaturePoint { at, ..*p });
            }
        }
    }
    pts.sort_by_key(|p| p.at);
    let prev = pts.iter().rev().find(|p| p.at <= t)?;
    let next = pts.iter().find(|p| p.at > t)?;
    let span = (next.at - prev.at).num_seconds() as f64;
    if span <= 0.0 {
        return Some(prev.temperature_c);
    }
    let f = (t - prev.at).num_seconds() as f64 / span;
    Some(if prev.extreme == next.extreme {
        prev.temperature_c + (next.temperature_c - prev.temperature_c) * f
    } else if prev.extreme == Extreme::Min {
        quarter_sine(prev.temperature_c, next.temperature_c, f)
    } else {
        half_cosine(prev.temperature_c, next.temperature_c, f)
    })
}

fn from_expected_high(e: &ExpectedHigh, t: DateTime<Utc>) -> f64 {
    let high = e.high_c.max(e.observed_c);
    if t <= e.observed_at || e.high_at <= e.observed_at {
        return e.observed_c;
    }
    let rise = (e.high_at - e.observed_at).num_seconds() as f64;
    let since = (t - e.observed_at).num_seconds() as f64;
    // Mirror after the high: the same time past it as before it.
    let f = if t <= e.high_at {
        since / rise
    } else {
        let past = (t - e.high_at).num_seconds() as f64;
        ((rise - past) / rise).max(0.0)
    };
    quarter_sine(e.observed_c, high, f)
}

/// The hourly temperatures from `from` to `to` (inclusive, on the hour).
pub fn hourly_temperatures(
    taf: Option<&Taf>,
    expected_high: Option<&ExpectedHigh>,
    from: DateTime<Utc>,
    to: DateTime<Utc>,
) -> Vec<(DateTime<Utc>, TemperatureEstimate)> {
    let secs = from.timestamp().rem_euclid(3600);
    let mut h = if secs == 0 {
        from
    } else {
        from + Duration::seconds(3600 - secs)
    };
    let mut out = Vec::new();
    while h <= to && out.len() < 24 * 40 {
        out.push((h, temperature_at(taf, expected_high, h)));
        h += Duration::hours(1);
    }
    out
}

/// The periods of a TAF in time order: (start, end, label). The base runs from the
/// start of validity; each change gives its own period.
pub fn periods(taf: &Taf) -> Vec<(DateTime<Utc>, DateTime<Utc>, String)> {
    let (Some(a), Some(b)) = (taf.valid_from, taf.valid_to) else {
        return Vec::new();
    };
    let first_fm = taf
        .changes
        .iter()
        .filter(|c| c.kind == ChangeKind::From)
        .map(|c| c.from)
        .min()
        .unwrap_or(b);
    let mut v = vec![(a, first_fm, "base".to_string())];
    for c in &taf.changes {
        v.push((c.from, c.to, c.label.clone()));
    }
    v.sort_by_key(|p| (p.0, p.1));
    v
}
