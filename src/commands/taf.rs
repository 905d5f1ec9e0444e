//! `rhoboard taf TEXT` / `rhoboard taf -`: decodes TAFs, group by group in plain words,
//! then the periods in time order and the forecast hour by hour; or as JSON (the keys
//! are documented in docs/forecast.md).

use anyhow::Context;
use chrono::{DateTime, Duration, NaiveDate, SecondsFormat, Utc};
use serde_json::{Value, json};

use super::Outcome;
use crate::observation::forecast::{self, ForecastConditions, Outlook};
use crate::observation::taf::{self, ChangeKind, Conditions, Taf, TafError};
use crate::observation::{Ceiling, Hazards, Visibility, Wind};

/// Arguments of `rhoboard taf`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// The TAF(s): one quoted argument per TAF, an unquoted single TAF, or `-` to read
    /// from standard input (a TAF may span lines; each starts with `TAF` or follows a
    /// `=` or a blank line; `#` comments allowed).
    #[arg(required = true, value_name = "TEXT")]
    pub text: Vec<String>,
    /// Print JSON (an array with one object per TAF) instead of the readable decode.
    #[arg(long)]
    pub json: bool,
    /// UTC date the issue day is resolved against (YYYY-MM-DD); default today.
    #[arg(long, value_name = "YYYY-MM-DD")]
    pub date: Option<String>,
}

/// Runs the command, writing to `out`. Exit 2 when any TAF is unusable.
pub fn run(args: &Args, out: &mut dyn std::io::Write) -> anyhow::Result<Outcome> {
    let reference = match &args.date {
        Some(d) => {
            let date = NaiveDate::parse_from_str(d.trim(), "%Y-%m-%d")
                .with_context(|| format!("--date '{d}': expected a UTC date such as 2026-06-14"))?;
            date.and_hms_opt(12, 0, 0)
                .map(|t| t.and_utc())
                .context("--date: not a valid date")?
        }
        None => Utc::now(),
    };
    let input = if args.text.len() == 1 && args.text.first().is_some_and(|t| t == "-") {
        super::read_stdin("forecasts")?
    } else if args.text.iter().any(|a| a.contains(char::is_whitespace)) {
        args.text.join("\n\n")
    } else {
        args.text.join(" ")
    };
    let texts = taf::split_tafs(&input);
    if texts.is_empty() {
        writeln!(
            out,
            "no forecast given: pass a TAF as TEXT, or '-' and TAFs on standard input"
        )?;
        return Ok(Outcome::BadInput);
    }
    let tafs: Vec<Taf> = texts
        .iter()
        .map(|(_, t)| taf::decode(t, reference))
        .collect();
    super::print_decoded(&tafs, args.json, to_json, write_readable, out)?;
    Ok(if tafs.iter().all(Taf::usable) {
        Outcome::Success
    } else {
        Outcome::BadInput
    })
}

fn round(v: f64, places: i32) -> f64 {
    let f = 10f64.powi(places);
    (v * f).round() / f
}

fn time(t: DateTime<Utc>) -> String {
    t.to_rfc3339_opts(SecondsFormat::Secs, true)
}

fn wind_json(w: &Wind) -> Value {
    json!({
        "direction_deg": w.direction_deg,
        "variable": w.variable,
        "speed_kt": round(w.speed_kt, 1),
        "gust_kt": w.gust_kt.map(|g| round(g, 1)),
        "variable_from_deg": w.variable_from_deg,
        "variable_to_deg": w.variable_to_deg,
    })
}

fn ceiling_json(c: Ceiling) -> (Value, Value) {
    match c {
        Ceiling::None => (json!("none"), Value::Null),
        Ceiling::Known(ft) => (json!("known"), json!(ft)),
        Ceiling::Unknown => (json!("unknown"), Value::Null),
    }
}

fn visibility_keys(v: Option<&Visibility>) -> (Value, Value, Value) {
    (
        json!(v.map(|v| round(v.prevailing_m, 1))),
        json!(v.map(|v| round(v.prevailing_sm(), 3))),
        json!(v.map(|v| v.bound)),
    )
}

fn conditions_json(c: &Conditions) -> Value {
    let (ceiling, ceiling_ft) = ceiling_json(c.ceiling_and_hazards().0);
    let (m, sm, bound) = visibility_keys(c.visibility.as_ref());
    json!({
        "wind": c.wind.as_ref().map(wind_json),
        "visibility_m": m,
        "visibility_sm": sm,
        "visibility_bound": bound,
        "cavok": c.cavok,
        "weather": c.weather.iter().map(|w| w.code()).collect::<Vec<_>>(),
        "no_significant_weather": c.no_significant_weather,
        "clouds": c.clouds.iter().map(|l| json!({
            "cover": l.cover,
            "base_ft": l.base_ft,
            "convective": l.convective,
        })).collect::<Vec<_>>(),
        "sky_clear": c.sky_clear,
        "wind_shear": c.wind_shear,
        "ceiling": ceiling,
        "ceiling_ft": ceiling_ft,
        "hazards": c.ceiling_and_hazards().1,
    })
}

fn forecast_json(f: &ForecastConditions) -> Value {
    let (ceiling, ceiling_ft) = ceiling_json(f.ceiling);
    json!({
        "wind": wind_json(&f.wind),
        "visibility_m": round(f.visibility.prevailing_m, 1),
        "visibility_bound": f.visibility.bound,
        "cavok": f.cavok,
        "ceiling": ceiling,
        "ceiling_ft": ceiling_ft,
        "weather": f.weather.iter().map(|w| w.code()).collect::<Vec<_>>(),
        "hazards": f.hazards,
        "temperature_c": f.temperature_c.map(|t| round(t, 1)),
        "temperature_basis": f.temperature_basis,
        "worst_case": f.worst_case,
        "basis": f.basis,
    })
}

/// The forecast at each whole hour of the validity.
fn hourly(t: &Taf) -> Vec<(DateTime<Utc>, Outlook)> {
    let (Some(a), Some(b)) = (t.valid_from, t.valid_to) else {
        return Vec::new();
    };
    let mut out = Vec::new();
    let mut h = a;
    while h < b && out.len() < 48 {
        if let Some(o) = forecast::at(t, h, None) {
            out.push((h, o));
        }
        h += Duration::hours(1);
    }
    out
}

/// The JSON object for one TAF.
pub fn to_json(t: &Taf) -> Value {
    json!({
        "text": t.text,
        "station": t.station,
        "amended": t.amended,
        "corrected": t.corrected,
        "nil": t.nil,
        "cancelled": t.cancelled,
        "issued_at": t.issued_at.map(time),
        "valid_from": t.valid_from.map(time),
        "valid_to": t.valid_to.map(time),
        "base": conditions_json(&t.base),
        "changes": t.changes.iter().map(|c| {
            let (kind, percent) = match c.kind {
                ChangeKind::From => ("from", None),
                ChangeKind::Becoming => ("becoming", None),
                ChangeKind::Tempo => ("tempo", None),
                ChangeKind::Probability { percent } => ("probability", Some(percent)),
                ChangeKind::ProbabilityTempo { percent } => ("probability_tempo", Some(percent)),
            };
            json!({
                "kind": kind,
                "percent": percent,
                "label": c.label,
                "from": time(c.from),
                "to": time(c.to),
                "column": c.column,
                "conditions": conditions_json(&c.conditions),
            })
        }).collect::<Vec<_>>(),
        "temperatures": t.temperatures,
        "remarks": t.remarks,
        "periods": forecast::periods(t).iter().map(|(a, b, label)| json!({
            "from": time(*a), "to": time(*b), "label": label,
        })).collect::<Vec<_>>(),
        "hourly": hourly(t).iter().map(|(h, o)| json!({
            "at": time(*h),
            "prevailing": forecast_json(&o.prevailing),
            "worst_case": o.worst.as_ref().map(forecast_json),
        })).collect::<Vec<_>>(),
        "not_understood": t.not_understood.iter().map(|n| json!({
            "group": n.group,
            "column": n.column,
            "reason": n.reason,
        })).collect::<Vec<_>>(),
        "usable": t.usable(),
        "errors": t.error_lines(),
    })
}

fn hazard_words(h: Hazards) -> String {
    let mut hz = Vec::new();
    for (on, word) in [
        (h.thunderstorm, "thunderstorm"),
        (h.cumulonimbus, "CB/TCU"),
        (h.freezing_precipitation, "freezing precipitation"),
        (h.fog, "fog"),
        (h.wind_shear, "wind shear"),
        (h.severe, "severe weather"),
    ] {
        if on {
            hz.push(word);
        }
    }
    hz.join(", ")
}

fn summary(f: &ForecastConditions) -> String {
    let w = &f.wind;
    let mut wind = match w.direction_deg {
        Some(d) => format!("{d:03.0}°/{:.0} kt", w.speed_kt),
        None => format!("VRB/{:.0} kt", w.speed_kt),
    };
    if let Some(g) = w.gust_kt {
        wind.push_str(&format!(" G{g:.0}"));
    }
    if let (Some(a), Some(b)) = (w.variable_from_deg, w.variable_to_deg) {
        wind.push_str(&format!(" ({a:03.0}°–{b:03.0}°)"));
    }
    let vis = if f.visibility.bound == crate::observation::Bound::AtLeast {
        format!("≥{:.0} m", f.visibility.prevailing_m)
    } else {
        format!("{:.0} m", f.visibility.prevailing_m)
    };
    let ceiling = match f.ceiling {
        Ceiling::None => "no ceiling".to_string(),
        Ceiling::Known(ft) => format!("ceiling {ft:.0} ft"),
        Ceiling::Unknown => "ceiling unknown".to_string(),
    };
    let mut s = format!("wind {wind}, visibility {vis}, {ceiling}");
    let wx: Vec<String> = f.weather.iter().map(|w| w.code()).collect();
    if !wx.is_empty() {
        s.push_str(&format!(", {}", wx.join(" ")));
    }
    let hz = hazard_words(f.hazards);
    if !hz.is_empty() {
        s.push_str(&format!(", hazards: {hz}"));
    }
    match f.temperature_c {
        Some(t) => s.push_str(&format!(", {t:.1} °C")),
        None => s.push_str(", no temperature forecast"),
    }
    s
}

/// The readable decode: the text, each group on its own line, the periods in time
/// order, and the forecast hour by hour.
pub fn write_readable(t: &Taf, out: &mut dyn std::io::Write) -> std::io::Result<()> {
    let groups = t
        .groups
        .iter()
        .map(|g| (g.start, t.group_text(g).to_string(), taf::describe(t, g)));
    let malformed = t.errors.iter().filter_map(|e| match e {
        TafError::Malformed {
            group,
            text,
            column,
            problem,
        } => Some((*column, text.clone(), format!("✗ {group}: {problem}"))),
        _ => None,
    });
    crate::commands::write_decoded(&t.text, groups, &t.not_understood, malformed, out)?;
    let periods = forecast::periods(t);
    if !periods.is_empty() {
        writeln!(out, "  periods:")?;
        for (a, b, label) in &periods {
            writeln!(
                out,
                "    {} – {}  {label}",
                a.format("%d %H:%MZ"),
                b.format("%d %H:%MZ")
            )?;
        }
    }
    let hours = hourly(t);
    if !hours.is_empty() {
        writeln!(
            out,
            "  hour by hour (prevailing; worst case under TEMPO/PROB):"
        )?;
        for (h, o) in &hours {
            writeln!(
                out,
                "    {}  {}",
                h.format("%d %H:%MZ"),
                summary(&o.prevailing)
            )?;
            if let Some(w) = &o.worst {
                writeln!(out, "             worst case: {}", summary(w))?;
            }
        }
    }
    if t.usable() {
        writeln!(out, "  usable: yes")?;
    } else {
        writeln!(out, "  usable: NO — rejected")?;
        for e in t.error_lines() {
            writeln!(out, "  ✗ {e}")?;
        }
    }
    Ok(())
}
