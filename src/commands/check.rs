//! `rhoboard check`: assesses every leg of the day (and with `--pairings` every
//! aircraft × airfield pairing) non-interactively.

use std::io::Write;
use std::path::PathBuf;

use anyhow::Context as _;
use chrono::{DateTime, NaiveDate, Utc};
use serde_json::{Value, json};

use crate::assess::leg::{LegResult, PhaseResult, Side};
use crate::assess::lookahead::{LookAhead, TafSource, look_ahead};
use crate::assess::pairing::{self, Matrix};
use crate::assess::{Context, DaySettings, Model, State, assess_leg};
use crate::commands::Outcome;
use crate::display::Show;
pub use crate::observation::day_of_file;
use crate::observation::{Insert, Store, decode_all};
use crate::ops::config::{self, Choice};
use crate::ops::{Ops, demo};

/// Arguments of `rhoboard check`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// The operator folder (default: the configured one, else the built-in demo).
    #[arg(long, value_name = "DIR")]
    pub ops: Option<PathBuf>,
    /// Observation files to read besides the folder's `observations/` (METAR lines).
    #[arg(long = "obs", value_name = "FILE")]
    pub obs: Vec<PathBuf>,
    /// Reference time, RFC 3339 (e.g. 2026-06-14T15:00:00Z): reports after it are
    /// unknown. Default: now; for the built-in demo, 08:00Z on its demo day.
    #[arg(long, value_name = "TIME")]
    pub at: Option<String>,
    /// Only this leg.
    #[arg(long, value_name = "ID")]
    pub leg: Option<String>,
    /// Also assess every available aircraft at every airfield.
    #[arg(long)]
    pub pairings: bool,
    /// Also look ahead with the operator's TAFs: the forecast state of each leg and the
    /// time from which the forecast makes it below.
    #[arg(long)]
    pub forecast: bool,
    /// Print JSON.
    #[arg(long)]
    pub json: bool,
}

/// The operator, the observations and the reference time, ready to assess.
pub struct Loaded {
    /// The operator's data.
    pub ops: Ops,
    /// The observation store.
    pub store: Store,
    /// The reference time.
    pub at: DateTime<Utc>,
    /// Warnings for stderr (rejected reports, a fallen-back default folder).
    pub warnings: Vec<String>,
    /// Whether this is the built-in demo.
    pub demo: bool,
}

/// Parses `--at`.
pub fn parse_at(text: &str) -> anyhow::Result<DateTime<Utc>> {
    DateTime::parse_from_rfc3339(text.trim())
        .map(|t| t.with_timezone(&Utc))
        .map_err(|_| {
            anyhow::anyhow!(
                "--at '{text}': expected an RFC 3339 date and time with its zone, such as 2026-06-14T14:00:00Z (the date, a T, the UTC time, and Z or an offset like +02:00)"
            )
        })
}

/// The demo's own morning: 08:00Z on its day.
pub fn demo_morning() -> DateTime<Utc> {
    NaiveDate::parse_from_str(demo::DATE, "%Y-%m-%d")
        .ok()
        .and_then(|d| d.and_hms_opt(8, 0, 0))
        .map(|t| t.and_utc())
        .unwrap_or_default()
}

/// Loads the operator, reads every observation text into a store, and fixes T.
pub fn load(
    ops_dir: Option<&std::path::Path>,
    obs_files: &[PathBuf],
    at: Option<&str>,
    now: DateTime<Utc>,
) -> anyhow::Result<Loaded> {
    let choice = config::choose(ops_dir, config::config_file().as_deref());
    let demo = choice == Choice::Demo;
    let ops = config::load_for_use(&choice)?;
    let mut warnings: Vec<String> = Vec::new();
    let at = match at {
        Some(t) => parse_at(t)?,
        None if demo => demo_morning(),
        None => now,
    };
    let stale = chrono::TimeDelta::seconds((ops.operator.policy.stale_after_min * 60.0) as i64);
    let mut store = Store::new(stale);
    // TAFs (under `forecasts/`) are not observations.
    let mut texts: Vec<(String, String)> = ops
        .observations
        .iter()
        .filter(|(file, _)| !file.starts_with("forecasts/"))
        .cloned()
        .collect();
    for f in obs_files {
        let text = std::fs::read_to_string(f)
            .with_context(|| format!("reading observation file {}", f.display()))?;
        texts.push((f.display().to_string(), text));
    }
    for (file, text) in &texts {
        // A day file (`observations/2026-06-14.txt`) is read against its own date, so
        // its day-of-month times resolve to that day whatever the clock says.
        let reference = day_of_file(file).unwrap_or(at);
        for r in decode_all(text, reference) {
            if let Insert::Rejected(why) = store.insert(r.report) {
                warnings.push(format!("{file}:{}: {why}", r.line));
            }
        }
    }
    Ok(Loaded {
        ops,
        store,
        at,
        warnings,
        demo,
    })
}

/// The legs assessed by default: those departing on T's UTC date.
/// "no such leg", listing the leg ids of `at`'s day (or, with none that day, of every
/// day). No guess: short ids like L09 and L99 are one keystroke apart.
pub fn unknown_leg(ops: &Ops, id: &str, at: DateTime<Utc>) -> String {
    let day = legs_of_day(ops, at);
    let (ids, whose): (Vec<&str>, String) = if day.is_empty() {
        (
            ops.legs.iter().map(|l| l.id.as_str()).collect(),
            "the operator's legs".to_string(),
        )
    } else {
        (
            day.iter().map(|&i| ops.legs[i].id.as_str()).collect(),
            format!("the legs of {}", at.date_naive()),
        )
    };
    if ids.is_empty() {
        return format!("leg '{id}': no such leg; the operator has no legs");
    }
    // Only an id in another case, or with a letter O or I for a digit 0 or 1, is
    // named: leg ids are short, and a near spelling (L99 → L09) is more likely another
    // leg than the one meant.
    let norm = |s: &str| -> String {
        s.chars()
            .map(|c| match c.to_ascii_uppercase() {
                'O' => '0',
                'I' => '1',
                c => c,
            })
            .collect()
    };
    // And a number written without its leading zero (L9 for L09).
    let number = |s: &str| -> Option<(String, u64)> {
        let s = norm(s);
        let digits = s.trim_start_matches(|c: char| !c.is_ascii_digit());
        let prefix = &s[..s.len() - digits.len()];
        Some((prefix.to_string(), digits.parse().ok()?))
    };
    let hint = ops
        .legs
        .iter()
        .find(|l| l.id.eq_ignore_ascii_case(id))
        .or_else(|| ops.legs.iter().find(|l| norm(&l.id) == norm(id)))
        .or_else(|| {
            let n = number(id)?;
            ops.legs.iter().find(|l| number(&l.id).as_ref() == Some(&n))
        })
        .map_or(String::new(), |l| format!("; did you mean {}?", l.id));
    format!(
        "leg '{id}': no such leg{hint} ({whose}: {})",
        ids.join(", ")
    )
}

/// "unknown airfield", with "did you mean" when an airfield id is close.
pub fn unknown_airfield(ops: &Ops, id: &str) -> String {
    format!(
        "unknown airfield '{id}'; it needs airfields/{id}.json{}",
        crate::ops::validate::suggestion(id, ops.airfields.iter().map(|a| a.id.as_str()))
    )
}

/// "not in fleet/aircraft.json", with "did you mean" when a registration is close.
pub fn unknown_aircraft(ops: &Ops, reg: &str) -> String {
    format!(
        "not in fleet/aircraft.json{}",
        crate::ops::validate::suggestion(reg, ops.aircraft.iter().map(|a| a.registration.as_str()))
    )
}

pub fn legs_of_day(ops: &Ops, at: DateTime<Utc>) -> Vec<usize> {
    let day = at.date_naive();
    (0..ops.legs.len())
        .filter(|&i| ops.legs[i].departs_utc().date_naive() == day)
        .collect()
}

fn phase_json(p: &Option<PhaseResult>) -> Value {
    match p {
        None => Value::Null,
        Some(p) => json!({
            "mass_kg": p.mass_kg,
            "table_ground_roll_m": p.chain.table_ground_roll_m,
            "table_distance_50ft_m": p.chain.table_distance_50ft_m,
            "wind_factor": p.chain.wind_factor,
            "wind_factoring_in_manual": p.chain.wind_factoring_in_manual,
            "surface": p.chain.surface,
            "surface_rule": p.chain.surface_rule.map(|r| json!({
                "rule": r.rule, "from": r.origin,
            })),
            "slope_factor": p.chain.slope_factor,
            "ground_roll_m": p.chain.ground_roll_m,
            "distance_50ft_m": p.chain.distance_50ft_m,
            "state": p.state,
            "checks": p.checks.iter().map(|c| json!({
                "rule": c.rule,
                "factor": c.result.factor,
                "required_m": c.result.required_m,
                "available_m": c.result.available_m,
                "margin_percent": c.result.margin * 100.0,
                "state": c.state,
                "source": c.source,
            })).collect::<Vec<_>>(),
        }),
    }
}

fn side_json(s: &Side) -> Value {
    json!({
        "airfield": s.airfield,
        "time": s.event_at,
        "runway": s.runway,
        "runway_reason": s.runway_reason,
        "observation": s.observation.as_ref().map(|o| o.text.clone()),
        "observation_age_min": s.observation.as_ref().map(|o| o.age_min),
        "observation_as_of": s.observation.as_ref().map(|o| o.as_of),
        "observation_stale": s.observation.as_ref().map(|o| o.stale),
        "pressure_altitude_ft": s.air.map(|a| a.pressure_altitude_ft),
        "density_altitude_ft": s.air.map(|a| a.density_altitude_ft),
        "oat_c": s.air.map(|a| a.oat_c),
        "isa_deviation_c": s.air.map(|a| a.isa_deviation_c),
        "headwind_kt": s.wind.map(|w| w.headwind_kt),
        "crosswind_kt": s.wind.map(|w| w.crosswind_kt),
        "crosswind_from": s.wind.map(|w| w.crosswind_from),
        "takeoff": phase_json(&s.takeoff),
        "climb": s.climb.as_ref().map(|c| json!({
            "rate_fpm": c.chain.rate_fpm,
            "true_airspeed_kt": c.chain.true_airspeed_kt,
            "ground_speed_kt": c.chain.ground_speed_kt,
            "gradient_ft_per_nm": c.chain.gradient_ft_per_nm,
            "min_rate_fpm": c.chain.min_rate_fpm,
            "required_gradient_ft_per_nm": c.chain.required_gradient_ft_per_nm,
            "margin_percent": c.chain.margin() * 100.0,
            "state": c.state,
        })),
        "landing": phase_json(&s.landing),
        "limits": s.limits.iter().map(|l| json!({
            "kind": l.kind,
            "value": l.value,
            "limit": l.limit,
            "unit": l.unit,
            "margin": if l.margin.is_finite() { Some(l.margin) } else { None },
            "state": l.state,
            "source": l.source,
            "note": l.note,
        })).collect::<Vec<_>>(),
        "runway_today": s.ends.iter().find(|e| e.in_use).and_then(|e| e.today.clone()),
        "alternatives": s.ends.iter().filter(|e| !e.in_use).map(|e| json!({
            "runway": e.designator,
            "usable": e.usable,
            "today": e.today,
            "state": e.state,
            "headwind_kt": e.wind.headwind_kt,
            "crosswind_kt": e.wind.crosswind_kt,
        })).collect::<Vec<_>>(),
        "state": s.state,
    })
}

/// The JSON form of one leg (README documents the keys).
pub fn leg_json(ops: &Ops, r: &LegResult) -> Value {
    // A pairing opened to its chain is not one of the operator's legs.
    let leg = ops.legs.get(r.index);
    json!({
        "id": r.id,
        "departs_at": r.departure.event_at,
        "arrives_at": r.arrival.event_at,
        "aircraft": leg.map(|l| l.aircraft.clone()),
        "pilot": leg.map(|l| l.pilot.clone()),
        "category": r.category,
        "from": r.departure.airfield,
        "to": r.arrival.airfield,
        "state": r.state,
        "limiting_check": r.limiting.as_ref().map(|l| l.check.clone()),
        // The margin as the text shows it; null where there is none in numbers.
        "limiting_margin": r.limiting.as_ref().and_then(|l| l.margin_words()),
        "headroom_c": r.headroom.map(|h| h.warming_c),
        "headroom_table_ends": r.headroom.map(|h| h.table_ends),
        "survives_expected_high": r.headroom.and_then(|h| h.survives_expected_high),
        "takeoff_mass_kg": r.takeoff_mass_kg,
        "landing_mass_kg": r.landing_mass_kg,
        "mass_balance": r.mass_balance.as_ref().map(|m| {
            let finite = |v: f64| v.is_finite().then_some(v);
            json!({
                "takeoff_mass_kg": m.takeoff.mass_kg,
                "landing_mass_kg": m.landing.mass_kg,
                "ramp_mass_kg": m.ramp.mass_kg,
                "takeoff_cg_mm": finite(m.takeoff.cg_mm),
                "landing_cg_mm": finite(m.landing.cg_mm),
                "within_envelope": m.within_envelope,
                "cg_limits": m.cg_margin.map(|t| json!({
                    "mass_kg": t.mass_kg,
                    "cg_mm": t.cg_mm,
                    "fore_limit_mm": t.fore_limit_mm,
                    "aft_limit_mm": t.aft_limit_mm,
                    "nearer": t.nearer,
                    "margin_mm": t.margin_mm,
                })),
                "fuel_start_l": finite(m.fuel_start_l),
                "fuel_landing_l": finite(m.fuel_landing_l),
                "fuel_reserve_l": finite(m.fuel_reserve_l),
                "payload_headroom_kg": r.payload_headroom.as_ref().map(|p| p.kg),
                "payload_headroom_station": r.payload_headroom.as_ref().map(|p| p.station.clone()),
                "loading": m.rows.iter().map(|row| json!({
                    "station": row.station,
                    "name": row.name,
                    "mass_kg": row.mass_kg,
                    "arm_mm": row.arm_mm,
                    "moment_kg_mm": row.moment_kg_mm,
                    "max_mass_kg": row.max_mass_kg,
                })).collect::<Vec<_>>(),
            })
        }),
        "departure": side_json(&r.departure),
        "arrival": side_json(&r.arrival),
        "reasons": r.reasons,
        "advice": r.advice,
    })
}

/// Headroom as a figure in the display unit, as the report and the board print it
/// ([`Show::headroom`]): `+4.2°C`, `≥+8.0°C` (still passing at the table's top),
/// `≤-38.7°C` (still below at the table's coldest column), `—`.
pub fn headroom_text(r: &LegResult, show: Show) -> String {
    r.headroom.map_or("—".to_string(), |h| show.headroom(&h))
}

/// The limiting check's margin for a text table ([`Show::limiting_margin`]): a limit
/// row (wind, ceiling, density altitude, a mass …) in the display unit as
/// [`LimitCheck::shown`] rounds it, value and limit toward each other with the margin
/// their difference, so never more than there is (`+4 kt`, `+163 kg`); a distance or
/// climb check in whole percent, rounded down; `—` where there is no margin in numbers
/// (a lapsed endorsement: its state says below).
///
/// [`LimitCheck::shown`]: crate::assess::limits::LimitCheck::shown
pub fn limiting_margin_text(r: &LegResult, show: Show) -> String {
    show.limiting_margin(r)
}

fn write_table(ops: &Ops, results: &[LegResult], out: &mut dyn Write) -> std::io::Result<()> {
    let show = Show::of(ops);
    let reasons: Vec<Vec<String>> = results.iter().map(|r| show.reasons(r)).collect();
    writeln!(
        out,
        "{:<6} {:<5} {:<8} {:<11} {:<12} {:<10} {:>9} {:>11}  limiting check",
        "dep", "leg", "aircraft", "route", "category", "state", "margin", "headroom"
    )?;
    for (r, why) in results.iter().zip(&reasons) {
        let Some(leg) = ops.legs.get(r.index) else {
            continue;
        };
        writeln!(
            out,
            "{:<6} {:<5} {:<8} {:<11} {:<12} {:<10} {:>9} {:>11}  {}",
            leg.departs_utc().format("%H%MZ"),
            r.id,
            leg.aircraft,
            format!("{}-{}", leg.from, leg.to),
            r.category.words().to_string(),
            r.state.to_string(),
            limiting_margin_text(r, show),
            headroom_text(r, show),
            match (&r.limiting, why.first()) {
                (Some(l), _) => l.check.as_str(),
                (None, Some(why)) => why.as_str(),
                (None, None) => "—",
            },
        )?;
    }
    let not_within: Vec<(&LegResult, &Vec<String>)> = results
        .iter()
        .zip(&reasons)
        .filter(|(r, _)| r.state != State::Within)
        .collect();
    if !not_within.is_empty() {
        writeln!(out)?;
        writeln!(out, "Why:")?;
        for (r, reasons) in not_within {
            writeln!(out, "  {} {}:", r.id, r.state)?;
            for why in reasons {
                writeln!(out, "    - {why}")?;
            }
        }
    }
    Ok(())
}

/// The look-ahead of every result from the operator's TAFs, to the end of the UTC day.
pub fn look_aheads(
    ctx: &Context<'_>,
    store: &Store,
    results: &[LegResult],
) -> Vec<Option<LookAhead>> {
    let ops = ctx.ops;
    // Each forecasts file is read against its own date when it is named for one.
    let tafs: Vec<crate::observation::taf::Taf> = ops
        .observations
        .iter()
        .filter(|(path, _)| path.starts_with("forecasts/"))
        .flat_map(|(path, text)| {
            let reference = day_of_file(path).unwrap_or(ctx.at);
            crate::observation::taf::split_tafs(text)
                .into_iter()
                .map(move |(_, t)| crate::observation::taf::decode(&t, reference))
        })
        .collect();
    let src = TafSource {
        tafs: &tafs,
        as_of: ctx.at,
        expected_high_c: ops.operator.policy.expected_high_c,
        utc_offset_min: ops.operator.time_zone.utc_offset_min,
        store,
    };
    let end_of_day = ctx
        .at
        .date_naive()
        .and_hms_opt(23, 59, 0)
        .map(|t| t.and_utc())
        .unwrap_or(ctx.at);
    results
        .iter()
        .map(|r| look_ahead(ctx, r.index, r.state, &src, end_of_day))
        .collect()
}

/// The forecast object of a leg's JSON: always labelled as a forecast.
pub fn forecast_json(l: Option<&LookAhead>) -> Value {
    match l {
        None => {
            json!({"state": Value::Null, "fails_from": Value::Null, "basis": "no forecast covers this leg"})
        }
        Some(l) => json!({
            "state": l.state,
            "fails_from": l.fails_from,
            "fails_now": l.fails_now,
            "limiting": l.limiting,
            "basis": l.basis,
            "worst_case": l.worst_case,
            "no_temperature_forecast": l.no_temperature,
            "observation_missing": l.observation_missing,
        }),
    }
}

fn write_forecast(
    ops: &Ops,
    at: DateTime<Utc>,
    results: &[LegResult],
    looks: &[Option<LookAhead>],
    out: &mut dyn Write,
) -> std::io::Result<()> {
    writeln!(out)?;
    writeln!(
        out,
        "Forecast look-ahead (from the TAFs; a forecast, not an observation):"
    )?;
    // The sheet's words: a leg gone at `at` says when it left or landed.
    for (f, l) in crate::report::forecast_lines(ops, at, results, looks)
        .iter()
        .zip(looks)
    {
        match (l, f.state) {
            (Some(l), Some(_)) => writeln!(
                out,
                "  {:<5} forecast {:<10} {}",
                f.leg,
                l.state_words(),
                f.outlook
            )?,
            _ => writeln!(out, "  {:<5} {}", f.leg, f.outlook)?,
        }
    }
    Ok(())
}

/// A pairing's margin for the text table: the deciding check's or the deciding weather
/// minimum's, in the display unit ([`Show::limit_value`]) with its unit, floored to a
/// whole unit (a tenth for SM) so it never reads larger than it is (`-12 kt`, `+4 %`);
/// `—` where the deciding check has no number.
pub fn pair_margin_text(c: &pairing::PairCell, show: Show) -> String {
    match show.pair_margin(c) {
        Some((m, unit, d)) => {
            let sep = if unit.is_empty() { "" } else { " " };
            format!("{m:+.d$}{sep}{unit}")
        }
        None => "—".to_string(),
    }
}

/// A pairing's headroom for the text table in the display unit, marked as a bound
/// where the search reached an end of the flight-manual tables (`≥+8°C`, `≤-30°C`);
/// `—` where there is none (no-data, or below for a reason temperature cannot change).
pub fn pair_headroom_text(c: &pairing::PairCell, show: Show) -> String {
    match c.headroom_c {
        None => "—".to_string(),
        Some(h) => format!(
            "{}{:+.1}{}",
            c.headroom_mark(),
            crate::units::colder_tenth(show.warming_value(h)),
            show.temp_unit()
        ),
    }
}

fn write_matrix(ops: &Ops, m: &Matrix, out: &mut dyn Write) -> std::io::Result<()> {
    let show = Show::of(ops);
    writeln!(out)?;
    writeln!(
        out,
        "Pairings (runway in use; the deciding check, its margin, headroom in {} of warming left):",
        show.temp_unit()
    )?;
    writeln!(
        out,
        "{:<9} {:<8} {:<6} {:<10} {:>9} {:>9}  deciding check",
        "aircraft", "airfield", "runway", "state", "margin", "headroom"
    )?;
    for (ai, reg) in m.aircraft.iter().enumerate() {
        for (fi, field) in ops.airfields.iter().enumerate() {
            let c = m.cell(ai, fi);
            let runway = c
                .end_in_use
                .and_then(|k| field.runway_ends.get(k as usize))
                .map_or("—", |e| e.designator.as_str());
            writeln!(
                out,
                "{:<9} {:<8} {:<6} {:<10} {:>9} {:>9}  {}",
                ops.aircraft[*reg].registration,
                field.id,
                runway,
                c.state.to_string(),
                pair_margin_text(c, show),
                pair_headroom_text(c, show),
                match c.headroom_absent_why() {
                    Some(why) if why.starts_with("also below") => {
                        format!("{} (also below on the wind or weather)", c.limiting_words())
                    }
                    _ => c.limiting_words().to_string(),
                },
            )?;
        }
    }
    writeln!(
        out,
        "(headroom —: no data, or below on the wind or the field's weather, which warming or \
         cooling does not change)"
    )?;
    Ok(())
}

/// Runs `rhoboard check`.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    let loaded = load(
        args.ops.as_deref(),
        &args.obs,
        args.at.as_deref(),
        Utc::now(),
    )?;
    for w in &loaded.warnings {
        eprintln!("rhoboard: warning: {w}");
    }
    let ops = &loaded.ops;
    let model = Model::new(ops, &DaySettings::for_date(ops, loaded.at.date_naive()));
    let ctx = Context {
        ops,
        model: &model,
        store: &loaded.store,
        at: loaded.at,
    };
    let indices: Vec<usize> = match &args.leg {
        Some(id) => {
            let i = ops
                .legs
                .iter()
                .position(|l| &l.id == id)
                .ok_or_else(|| anyhow::anyhow!("--{}", unknown_leg(ops, id, loaded.at)))?;
            vec![i]
        }
        None => legs_of_day(ops, loaded.at),
    };
    let results: Vec<LegResult> = indices
        .iter()
        .filter_map(|&i| assess_leg(&ctx, i))
        .collect();
    let looks: Vec<Option<LookAhead>> = if args.forecast {
        look_aheads(&ctx, &loaded.store, &results)
    } else {
        Vec::new()
    };
    let matrix = args.pairings.then(|| pairing::matrix(&ctx));
    if args.json {
        let v = json!({
            "operator": ops.operator.name,
            "at": loaded.at,
            "caution": crate::CAUTION,
            "legs": results.iter().enumerate().map(|(k, r)| {
                let mut v = leg_json(ops, r);
                if args.forecast {
                    v["forecast"] = forecast_json(looks.get(k).and_then(|l| l.as_ref()));
                }
                v
            }).collect::<Vec<_>>(),
            "pairings": matrix.as_ref().map(|m| m.to_json(ops)),
        });
        serde_json::to_writer_pretty(&mut *out, &v)?;
        writeln!(out)?;
    } else {
        writeln!(
            out,
            "{} — legs of {} assessed as of {} UTC (reports known up to then)",
            ops.operator.name,
            loaded.at.format("%Y-%m-%d"),
            loaded.at.format("%H:%M")
        )?;
        writeln!(out, "{}", crate::CAUTION)?;
        writeln!(out)?;
        if results.is_empty() {
            let days = ops.leg_days();
            match days.first() {
                Some(d) => writeln!(
                    out,
                    "No legs depart on {}. The operator has legs on {}: pass --at, e.g. --at {}T08:00:00Z.",
                    loaded.at.format("%Y-%m-%d"),
                    days.iter()
                        .map(ToString::to_string)
                        .collect::<Vec<_>>()
                        .join(", "),
                    d
                )?,
                None => writeln!(out, "No legs depart on {}.", loaded.at.format("%Y-%m-%d"))?,
            }
        }
        // No legs, no table: the message above says why, an empty header says nothing.
        if !results.is_empty() {
            write_table(ops, &results, out)?;
        }
        if args.forecast && !results.is_empty() {
            write_forecast(ops, loaded.at, &results, &looks, out)?;
        }
        if let Some(m) = &matrix {
            write_matrix(ops, m, out)?;
        }
    }
    let all_ok = results.iter().all(|r| r.state.meets_minimums());
    Ok(if all_ok {
        Outcome::Success
    } else {
        Outcome::Findings
    })
}
