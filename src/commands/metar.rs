//! `rhoboard metar TEXT` / `rhoboard metar -`: decodes METAR and SPECI reports, group by
//! group in plain words, or as JSON.

use anyhow::Context;
use chrono::{DateTime, NaiveDate, Utc};
use serde_json::{Value, json};

use super::Outcome;
use crate::observation::{Ceiling, DecodeError, Report, describe, split_reports};

/// Arguments of `rhoboard metar`.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// The report(s): one argument per report (quoted), an unquoted single report, or `-`
    /// to read one or many reports from standard input (one per line, `#` comments allowed).
    #[arg(required = true, value_name = "TEXT")]
    pub text: Vec<String>,
    /// Print JSON (an array with one object per report) instead of the readable decode.
    #[arg(long)]
    pub json: bool,
    /// UTC date the reports' day-hour-minute is resolved against (YYYY-MM-DD); default today.
    #[arg(long, value_name = "YYYY-MM-DD")]
    pub date: Option<String>,
}

/// Runs the command, writing to `out`. Exit 2 when any report is unusable.
pub fn run(args: &Args, out: &mut dyn std::io::Write) -> anyhow::Result<Outcome> {
    let reference = match &args.date {
        Some(d) => reference_for_date(d)?,
        None => Utc::now(),
    };
    let input = if args.text.len() == 1 && args.text.first().is_some_and(|t| t == "-") {
        super::read_stdin("reports")?
    } else if looks_unquoted(&args.text) {
        args.text.join(" ")
    } else {
        args.text.join("\n")
    };
    let texts = split_reports(&input);
    if texts.is_empty() {
        writeln!(
            out,
            "no report given: pass a METAR as TEXT, or '-' and reports on standard input"
        )?;
        return Ok(Outcome::BadInput);
    }
    let reports: Vec<Report> = texts
        .iter()
        .map(|(_, t)| crate::observation::decode(t, reference))
        .collect();
    super::print_decoded(&reports, args.json, to_json, write_readable, out)?;
    Ok(if reports.iter().all(Report::usable_for_performance) {
        Outcome::Success
    } else {
        Outcome::BadInput
    })
}

/// `YYYY-MM-DD` → noon UTC of that day (so a report of that day resolves to it).
fn reference_for_date(d: &str) -> anyhow::Result<DateTime<Utc>> {
    let date = NaiveDate::parse_from_str(d.trim(), "%Y-%m-%d")
        .with_context(|| format!("--date '{d}': expected a UTC date such as 2026-06-14"))?;
    date.and_hms_opt(12, 0, 0)
        .map(|t| t.and_utc())
        .context("--date: not a valid date")
}

/// `rhoboard metar XQAB 141250Z 27015KT …` typed without quotes: one report.
fn looks_unquoted(args: &[String]) -> bool {
    if args.len() < 2 || args.iter().any(|a| a.contains(char::is_whitespace)) {
        return false;
    }
    let skip = usize::from(matches!(
        args.first().map(String::as_str),
        Some("METAR" | "SPECI" | "metar" | "speci")
    ));
    args.get(skip + 1)
        .is_some_and(|t| t.len() == 7 && t.ends_with(['Z', 'z']))
}

fn round(v: f64, places: i32) -> f64 {
    let f = 10f64.powi(places);
    (v * f).round() / f
}

/// The JSON object for one report (the keys are documented in docs/observations.md).
pub fn to_json(r: &Report) -> Value {
    let wind = r.wind.map(|w| {
        json!({
            "direction_deg": w.direction_deg,
            "variable": w.variable,
            "speed_kt": round(w.speed_kt, 1),
            "gust_kt": w.gust_kt.map(|g| round(g, 1)),
            "variable_from_deg": w.variable_from_deg,
            "variable_to_deg": w.variable_to_deg,
        })
    });
    let clouds: Vec<Value> = r
        .clouds
        .iter()
        .map(|c| {
            json!({
                "cover": c.cover,
                "base_ft": c.base_ft,
                "convective": c.convective,
            })
        })
        .collect();
    let ceiling_ft = match r.ceiling {
        Ceiling::Known(ft) => json!(ft),
        _ => Value::Null,
    };
    let ceiling = match r.ceiling {
        Ceiling::None => "none",
        Ceiling::Known(_) => "known",
        Ceiling::Unknown => "unknown",
    };
    let vis = r.visibility;
    json!({
        "text": r.text,
        "station": r.station,
        "kind": r.kind,
        "observed_at": r.observed_at.map(|t| t.to_rfc3339_opts(chrono::SecondsFormat::Secs, true)),
        "auto": r.auto,
        "corrected": r.corrected,
        "nil": r.nil,
        "wind": wind,
        "visibility_m": vis.map(|v| round(v.prevailing_m, 1)),
        "visibility_sm": vis.map(|v| round(v.prevailing_sm(), 3)),
        "visibility_bound": vis.map(|v| v.bound),
        "minimum_visibility_m": vis.and_then(|v| v.minimum_m),
        "cavok": r.cavok,
        "rvr": r.rvr.iter().map(|v| json!({
            "runway": v.runway,
            "range_m": round(v.range_m, 1),
            "bound": v.bound,
            "variable_to_m": v.variable_to_m.map(|m| round(m, 1)),
            "in_feet": v.in_feet,
            "tendency": v.tendency.map(String::from),
        })).collect::<Vec<_>>(),
        "weather": r.weather.iter().map(|w| w.code()).collect::<Vec<_>>(),
        "recent_weather": r.recent_weather.iter().map(|w| format!("RE{}", w.code())).collect::<Vec<_>>(),
        "clouds": clouds,
        "sky_clear": r.sky_clear,
        "ceiling": ceiling,
        "ceiling_ft": ceiling_ft,
        "temperature_c": r.temperature_c,
        "dewpoint_c": r.dewpoint_c,
        "altimeter_hpa": r.altimeter_hpa.map(|v| round(v, 1)),
        "altimeter_inhg": r.altimeter_inhg.map(|v| round(v, 2)),
        "hazards": r.hazards,
        "wind_shear": !r.wind_shear.is_empty(),
        "trend": r.trend,
        "remarks": r.remarks,
        "not_understood": r.not_understood.iter().map(|n| json!({
            "group": n.group,
            "column": n.column,
            "reason": n.reason,
        })).collect::<Vec<_>>(),
        "usable_for_performance": r.usable_for_performance(),
        "errors": r.error_lines(),
    })
}

/// The readable decode: the report, then each group on its own line.
pub fn write_readable(r: &Report, out: &mut dyn std::io::Write) -> std::io::Result<()> {
    let groups = r
        .groups
        .iter()
        .map(|g| (g.start, r.group_text(g).to_string(), describe(r, g)));
    let malformed = r.errors.iter().filter_map(|e| match e {
        DecodeError::Malformed {
            group,
            text,
            column,
            problem,
        } => Some((*column, text.clone(), format!("✗ {group}: {problem}"))),
        _ => None,
    });
    crate::commands::write_decoded(&r.text, groups, &r.not_understood, malformed, out)?;
    let ceiling = match r.ceiling {
        Ceiling::None => "none".to_string(),
        Ceiling::Known(ft) => format!("{ft:.0} ft"),
        Ceiling::Unknown => "unknown (treated as no data)".to_string(),
    };
    writeln!(out, "  ceiling: {ceiling}")?;
    let h = r.hazards;
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
    if !hz.is_empty() {
        writeln!(out, "  hazards: {}", hz.join(", "))?;
    }
    if r.usable_for_performance() {
        writeln!(out, "  usable for performance: yes")?;
    } else {
        writeln!(out, "  usable for performance: NO — rejected")?;
        for e in r.error_lines() {
            writeln!(out, "  ✗ {e}")?;
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::observation::{ManualInput, manual_observation};
    use chrono::TimeZone;

    #[test]
    fn manual_reports_serialise_tagged_as_manual() {
        let input = ManualInput {
            station: "XHA1".into(),
            observed_at: Some(Utc.with_ymd_and_hms(2026, 6, 14, 12, 50, 0).unwrap()),
            wind_direction: "calm".into(),
            temperature: "88F".into(),
            altimeter: "30.12inHg".into(),
            ceiling: Some("none".into()),
            ..ManualInput::default()
        };
        let r = manual_observation(&input, 5.0).unwrap();
        let v = to_json(&r);
        assert_eq!(v["kind"], "manual");
        assert_eq!(v["ceiling"], "none");
        assert_eq!(v["usable_for_performance"], true);
        assert_eq!(v["wind"]["speed_kt"], 0.0);
        assert_eq!(v["observed_at"], "2026-06-14T12:50:00Z");
    }

    #[test]
    fn unquoted_words_are_one_report() {
        let words = |s: &str| s.split(' ').map(String::from).collect::<Vec<_>>();
        assert!(looks_unquoted(&words("XQAB 141250Z 27015KT")));
        assert!(looks_unquoted(&words("METAR XQAB 141250Z 27015KT")));
        assert!(!looks_unquoted(&[
            "XQAB 141250Z 27015KT".into(),
            "XHA1 141250Z 00000KT".into()
        ]));
        assert!(!looks_unquoted(&words("XQAB")));
    }
}
