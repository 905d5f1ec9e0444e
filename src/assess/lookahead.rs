//! Forecast look-ahead: a leg assessed with the forecast conditions valid at its
//! departure and arrival, and the first time of day at which the forecast makes it
//! `below`. Always labelled as a forecast and kept apart from the observed result; it
//! never turns an observed `below` into anything better.
//!
//! The forecast gives wind, visibility, ceiling, weather and temperature; the pressure
//! and the dew point are held from the latest report (the dew point capped at the
//! forecast temperature), as the design says.

use chrono::{DateTime, Duration, Utc};
use serde::Serialize;

use super::leg::{Context, LegResult, assess, observation_for};
use super::state::State;
use crate::observation::{Ceiling, Hazards, Report, Store, Visibility, Weather, Wind};

/// The forecast at one station and time, as the look-ahead needs it.
#[derive(Debug, Clone, PartialEq)]
pub struct ForecastAt {
    /// Wind (METAR conventions: true, kt).
    pub wind: Wind,
    /// Visibility, when forecast.
    pub visibility: Option<Visibility>,
    /// CAVOK.
    pub cavok: bool,
    /// Ceiling.
    pub ceiling: Ceiling,
    /// Weather groups.
    pub weather: Vec<Weather>,
    /// Hazards.
    pub hazards: Hazards,
    /// Forecast temperature, °C, when a temperature forecast exists.
    pub temperature_c: Option<f64>,
    /// These conditions are a TEMPO/PROB worst case, not the prevailing forecast.
    pub worst_case: bool,
    /// Where it comes from, e.g. `TAF XSEA 140500Z, FM141200; TX31/1415Z curve`.
    pub basis: String,
}

/// Where forecasts come from (a TAF store, an operator's expected high, a test).
pub trait ForecastSource {
    /// The forecast valid at `station` at `t`, if any.
    fn at(&self, station: &str, t: DateTime<Utc>) -> Option<ForecastAt>;
}

impl<F: Fn(&str, DateTime<Utc>) -> Option<ForecastAt>> ForecastSource for F {
    fn at(&self, station: &str, t: DateTime<Utc>) -> Option<ForecastAt> {
        self(station, t)
    }
}

/// The look-ahead of one leg.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LookAhead {
    /// The forecast state at the planned times (never better than an observed `below`).
    pub state: State,
    /// For a leg not `below` now: the first time, flown then, at which the forecast
    /// makes it `below` (to about 5 minutes); `None` when it holds through the forecast.
    pub fails_from: Option<DateTime<Utc>>,
    /// `fails_from` is the clock itself: the forecast makes it `below` already now
    /// (read "fails now", not as a time still ahead).
    pub fails_now: bool,
    /// What limits it in the forecast.
    pub limiting: Option<String>,
    /// The forecasts used.
    pub basis: String,
    /// A worst-case (TEMPO/PROB) period was used.
    pub worst_case: bool,
    /// No temperature forecast exists for a station: its temperature is held at the
    /// latest report's.
    pub no_temperature: bool,
    /// The leg is observed `no-data` (no usable or a stale report): this is the
    /// forecast alone, with nothing observed to hold it against, and never reads as
    /// better than the observation.
    pub observation_missing: bool,
}

impl LookAhead {
    /// The forecast state for a table: `✓ within`, or with the observation missing
    /// `forecast only: ~ thin (no usable observation)`.
    pub fn state_words(&self) -> String {
        if self.observation_missing {
            format!(
                "forecast only: {} {} (no usable observation)",
                self.state.glyph(),
                self.state.word()
            )
        } else {
            format!("{} {}", self.state.glyph(), self.state.word())
        }
    }
}

/// A synthetic report: the latest observed one with the forecast laid over it.
fn synthetic(base: &Report, f: &ForecastAt, t: DateTime<Utc>) -> Report {
    let mut r = base.clone();
    r.observed_at = Some(t);
    r.wind = Some(f.wind);
    r.visibility = f.visibility;
    r.cavok = f.cavok;
    r.ceiling = f.ceiling;
    r.weather = f.weather.clone();
    r.hazards = f.hazards;
    r.wind_shear = Vec::new();
    if let Some(temp) = f.temperature_c {
        r.temperature_c = Some(temp);
        r.dewpoint_c = r.dewpoint_c.map(|d| d.min(temp));
    }
    r.text = format!(
        "forecast for {} at {}: {}",
        r.station,
        t.format("%H%MZ"),
        f.basis
    );
    r
}

/// The leg flown with its departure at `departs`, under the forecast.
struct Trial<'a> {
    ctx: &'a Context<'a>,
    leg: crate::ops::Leg,
    index: usize,
    base_dep: Report,
    base_arr: Report,
}

impl Trial<'_> {
    fn at(
        &self,
        src: &impl ForecastSource,
        departs: DateTime<Utc>,
    ) -> Option<(LegResult, bool, bool, String)> {
        let duration = self.leg.arrives_utc() - self.leg.departs_utc();
        let arrives = departs + duration;
        let fd = src.at(&self.leg.from, departs)?;
        let fa = src.at(&self.leg.to, arrives)?;
        let mut store = Store::default();
        store.insert(synthetic(&self.base_dep, &fd, departs));
        store.insert(synthetic(&self.base_arr, &fa, arrives));
        let mut leg = self.leg.clone();
        leg.departs_at = departs.fixed_offset();
        leg.arrives_at = arrives.fixed_offset();
        let ctx = Context {
            store: &store,
            at: arrives.max(departs),
            ..*self.ctx
        };
        let r = assess(&ctx, &leg, self.index);
        let basis = if fd.basis == fa.basis {
            fd.basis.clone()
        } else {
            format!("{}; {}", fd.basis, fa.basis)
        };
        Some((
            r,
            fd.worst_case || fa.worst_case,
            fd.temperature_c.is_none() || fa.temperature_c.is_none(),
            basis,
        ))
    }
}

/// The look-ahead of leg `index`, against its observed result `observed`, scanning to
/// `until` (the end of the forecasts or of the day).
pub fn look_ahead(
    ctx: &Context<'_>,
    index: usize,
    observed: State,
    src: &impl ForecastSource,
    until: DateTime<Utc>,
) -> Option<LookAhead> {
    let leg = ctx.ops.legs.get(index)?.clone();
    // The latest report at T, whatever its age: it gives the pressure and dew point.
    let base = |station: &str| {
        observation_for(ctx.store, station, ctx.at, ctx.at, f64::INFINITY).map(|(r, _)| r.clone())
    };
    let trial = Trial {
        ctx,
        index,
        base_dep: base(&leg.from)?,
        base_arr: base(&leg.to)?,
        leg,
    };
    let planned = trial.leg.departs_utc();
    let (r, worst_case, no_temperature, basis) = trial.at(src, planned)?;
    let basis = if observed == State::NoData {
        format!("forecast only, the observation is missing or stale: {basis}")
    } else {
        basis
    };
    // Never better than an observed below.
    let state = if observed == State::Below {
        State::Below
    } else {
        r.state
    };
    let limiting = r.limiting.map(|l| l.words());
    let fails_from = if observed == State::Below {
        None
    } else {
        first_failure(&trial, src, ctx.at, until)
    };
    Some(LookAhead {
        state,
        fails_now: fails_from.is_some_and(|t| t <= ctx.at),
        fails_from,
        limiting,
        basis,
        worst_case,
        no_temperature,
        observation_missing: observed == State::NoData,
    })
}

fn below_at(trial: &Trial<'_>, src: &impl ForecastSource, t: DateTime<Utc>) -> Option<bool> {
    trial.at(src, t).map(|(r, ..)| r.state == State::Below)
}

/// Hour by hour from `from` to `until` (the state can flip back as change groups shift
/// the wind), then halving inside the first failing hour to about 5 minutes.
fn first_failure(
    trial: &Trial<'_>,
    src: &impl ForecastSource,
    from: DateTime<Utc>,
    until: DateTime<Utc>,
) -> Option<DateTime<Utc>> {
    let mut prev = from;
    if below_at(trial, src, prev) == Some(true) {
        return Some(prev);
    }
    let mut t = from;
    while t < until {
        t = (t + Duration::hours(1)).min(until);
        if below_at(trial, src, t) == Some(true) {
            let (mut ok, mut bad) = (prev, t);
            while bad - ok > Duration::minutes(5) {
                let mid = ok + (bad - ok) / 2;
                if below_at(trial, src, mid) == Some(true) {
                    bad = mid;
                } else {
                    ok = mid;
                }
            }
            return Some(bad);
        }
        prev = t;
    }
    None
}

/// Forecasts from the operator's TAFs: for a station and time, the latest usable TAF
/// issued at or before the reference time that covers it; TEMPO/PROB worst cases are
/// used where they apply (conservative), flagged as such. Where a TAF has no TX/TN, the
/// operator's expected high (assumed at 15:00 local time) is the temperature curve's top.
pub struct TafSource<'a> {
    /// The decoded TAFs.
    pub tafs: &'a [crate::observation::taf::Taf],
    /// Forecasts issued after this are not known.
    pub as_of: DateTime<Utc>,
    /// The operator's expected high, °C.
    pub expected_high_c: Option<f64>,
    /// The operator's UTC offset, minutes (for the expected high's time).
    pub utc_offset_min: i32,
    /// The observation store (the expected-high curve starts at the latest report).
    pub store: &'a Store,
}

impl ForecastSource for TafSource<'_> {
    fn at(&self, station: &str, t: DateTime<Utc>) -> Option<ForecastAt> {
        use crate::observation::forecast;
        let taf = crate::observation::taf::select(self.tafs, station, t, self.as_of)?;
        let expected = self.expected_high_c.and_then(|high_c| {
            let v = self.store.valid_at(station, self.as_of)?;
            let observed_at = v.report.observed_at?;
            let local_15 = t.date_naive().and_hms_opt(15, 0, 0)?.and_utc()
                - Duration::minutes(i64::from(self.utc_offset_min));
            Some(forecast::ExpectedHigh {
                high_c,
                high_at: local_15,
                observed_c: v.report.temperature_c?,
                observed_at,
            })
        });
        let outlook = forecast::at(taf, t, expected.as_ref())?;
        let c = outlook.worst_or_prevailing();
        Some(ForecastAt {
            wind: c.wind,
            visibility: Some(c.visibility),
            cavok: c.cavok,
            ceiling: c.ceiling,
            weather: c.weather.clone(),
            hazards: c.hazards,
            temperature_c: c.temperature_c.or(outlook.prevailing.temperature_c),
            worst_case: c.worst_case,
            basis: format!(
                "{}; temperature: {}",
                c.basis, outlook.prevailing.temperature_basis
            ),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::assess::{DaySettings, Model};
    use crate::observation::decode_all;
    use chrono::TimeZone;

    fn at(h: u32, m: u32) -> DateTime<Utc> {
        Utc.with_ymd_and_hms(2026, 6, 14, h, m, 0).unwrap()
    }

    /// A forecast that warms linearly from 14 °C at 06Z by `rate` °C per hour, calm.
    fn warming(rate: f64) -> impl Fn(&str, DateTime<Utc>) -> Option<ForecastAt> {
        move |_s: &str, t: DateTime<Utc>| {
            let hours = (t - at(6, 0)).num_seconds() as f64 / 3_600.0;
            Some(ForecastAt {
                wind: Wind::default(),
                visibility: None,
                cavok: true,
                ceiling: Ceiling::None,
                weather: Vec::new(),
                hazards: Hazards::default(),
                temperature_c: Some(14.0 + rate * hours),
                worst_case: false,
                basis: format!("test warming {rate} °C/h"),
            })
        }
    }

    #[test]
    fn a_hotter_forecast_never_fails_later() {
        let ops = crate::ops::demo::load().ops.unwrap();
        let model = Model::new(&ops, &DaySettings::default());
        let mut store = Store::default();
        for (_, t) in &ops.observations {
            for r in decode_all(t, at(8, 0)) {
                store.insert(r.report);
            }
        }
        let ctx = Context {
            ops: &ops,
            model: &model,
            store: &store,
            at: at(8, 0),
        };
        let i = ops.legs.iter().position(|l| l.id == "L16").unwrap();
        let mut last: Option<DateTime<Utc>> = None;
        let mut seen_failure = false;
        for rate in [1.0, 1.5, 2.0, 3.0, 4.0] {
            let la = look_ahead(&ctx, i, State::Thin, &warming(rate), at(20, 0)).unwrap();
            if let Some(f) = la.fails_from {
                seen_failure = true;
                if let Some(l) = last {
                    assert!(f <= l, "rate {rate}: fails from {f} after {l}");
                }
                last = Some(f);
            } else {
                assert!(
                    last.is_none(),
                    "rate {rate}: a hotter forecast stopped failing"
                );
            }
        }
        assert!(seen_failure);
        // An observed below stays below in the look-ahead.
        let la = look_ahead(&ctx, i, State::Below, &warming(0.0), at(20, 0)).unwrap();
        assert_eq!(la.state, State::Below);
        assert!(la.fails_from.is_none());
    }
}

/// Where a leg stands at a clock (the board's, or a sheet's time): the look-ahead ("flown from ~1340Z, the
/// forecast makes it below") is about a departure still ahead, so a leg already gone
/// shows when it left instead.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Progress {
    /// Departs at or after the board's clock.
    Ahead,
    /// Departed before the clock, lands at or after it.
    Airborne {
        /// Departure (UTC).
        left: DateTime<Utc>,
        /// Planned arrival (UTC).
        lands: DateTime<Utc>,
    },
    /// Departed and landed before the clock.
    Landed {
        /// Departure (UTC).
        left: DateTime<Utc>,
        /// Planned arrival (UTC).
        landed: DateTime<Utc>,
    },
}

impl Progress {
    /// The leg's progress at `clock` (its planned times; the board has no actual ones).
    pub fn of(leg: &crate::ops::legs::Leg, clock: DateTime<Utc>) -> Progress {
        let (left, lands) = (leg.departs_utc(), leg.arrives_utc());
        if left >= clock {
            Progress::Ahead
        } else if lands >= clock {
            Progress::Airborne { left, lands }
        } else {
            Progress::Landed {
                left,
                landed: lands,
            }
        }
    }
}
