//! Observations typed in by hand, for a strip with no METAR: same units and suffixes as
//! `calc` (`31C`, `30.12inHg`, `15kt`, `8km`, `2500ft`), tagged as manual wherever shown.
//!
//! A hand-entered wind usually comes from a tower, an information broadcast or a windsock
//! and is magnetic; it is taken as magnetic unless marked true, and converted with the
//! airfield's magnetic variation (east positive: true = magnetic + variation).

use chrono::{DateTime, Utc};

use super::{Bound, Ceiling, Hazards, Kind, Report, SpeedUnit, Visibility, Wind};
use crate::units::{UnitError, in_range, parse_length, parse_speed_kt, parse_temperature_c};

/// What the manual-observation form says beside the wind direction.
pub const WIND_FORM_NOTE: &str = "wind direction in degrees magnetic, as given by a tower, an \
information broadcast or a windsock; mark it true if it is true (converted with the \
airfield's magnetic variation)";

/// Whether a hand-entered wind direction is magnetic (the default) or true.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum WindReference {
    /// Degrees magnetic (tower, information broadcast, windsock with a compass).
    #[default]
    Magnetic,
    /// Degrees true.
    True,
}

/// The form as typed: every value a string with its unit, as on the command line.
#[derive(Debug, Clone, Default)]
pub struct ManualInput {
    /// Station or airfield identifier.
    pub station: String,
    /// When the values were observed.
    pub observed_at: Option<DateTime<Utc>>,
    /// Wind direction in degrees (`270`), or `VRB`, or `calm`.
    pub wind_direction: String,
    /// Wind speed with unit (`15kt`); empty for calm.
    pub wind_speed: String,
    /// Gust speed with unit (`25kt`), optional.
    pub gust: Option<String>,
    /// Magnetic (default) or true.
    pub wind_reference: WindReference,
    /// Visibility with unit (`8km`, `5sm`, `1500m`), optional.
    pub visibility: Option<String>,
    /// Ceiling height above the field with unit (`2500ft`), or `none`; absent = unknown.
    pub ceiling: Option<String>,
    /// Temperature with unit (`31C`, `88F`).
    pub temperature: String,
    /// Dew point with unit, optional: without it the air is taken as saturated
    /// (dew point = temperature), the assumption that gives the highest density altitude.
    pub dewpoint: Option<String>,
    /// Altimeter setting (QNH) with unit (`1019hPa`, `30.12inHg`).
    pub altimeter: String,
    /// Hazards the observer reports.
    pub hazards: Hazards,
}

/// A value on the manual form that cannot be used.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ManualError {
    /// A required value is empty.
    #[error("manual observation {station}: {field} is missing")]
    Missing {
        /// Station as typed.
        station: String,
        /// Which field.
        field: &'static str,
    },
    /// A value that does not parse or is out of range.
    #[error("manual observation {station}: {field} {source}")]
    Value {
        /// Station as typed.
        station: String,
        /// Which field.
        field: &'static str,
        /// What is wrong with it.
        source: UnitError,
    },
    /// Values that contradict each other.
    #[error("manual observation {station}: {problem}")]
    Inconsistent {
        /// Station as typed.
        station: String,
        /// The field to correct (the form marks it).
        field: &'static str,
        /// What contradicts what.
        problem: String,
    },
}

fn normalise_deg(d: f64) -> f64 {
    let n = d.rem_euclid(360.0);
    if n == 0.0 { 360.0 } else { n }
}

/// Builds a manual [`Report`] from the form, converting a magnetic wind to true with
/// `magnetic_variation_deg` (east positive). Returns every problem found, not just the first.
pub fn manual_observation(
    input: &ManualInput,
    magnetic_variation_deg: f64,
) -> Result<Report, Vec<ManualError>> {
    let station = input.station.trim().to_ascii_uppercase();
    let label = if station.is_empty() {
        "(no station)".to_string()
    } else {
        station.clone()
    };
    let mut errors = Vec::new();
    let value_err = |field: &'static str, source: UnitError| ManualError::Value {
        station: label.clone(),
        field,
        source,
    };
    if station.is_empty() {
        errors.push(ManualError::Missing {
            station: label.clone(),
            field: "station",
        });
    }
    let Some(observed_at) = input.observed_at else {
        errors.push(ManualError::Missing {
            station: label.clone(),
            field: "time",
        });
        return Err(errors);
    };

    // Wind.
    let dir_text = input.wind_direction.trim();
    let calm = dir_text.eq_ignore_ascii_case("calm");
    let variable =
        dir_text.eq_ignore_ascii_case("vrb") || dir_text.eq_ignore_ascii_case("variable");
    let mut direction_deg = None;
    if dir_text.is_empty() {
        errors.push(ManualError::Missing {
            station: label.clone(),
            field: "wind direction",
        });
    } else if !calm && !variable {
        match dir_text.trim_end_matches('°').parse::<f64>() {
            Ok(d) if (0.0..=360.0).contains(&d) => {
                let truth = match input.wind_reference {
                    WindReference::Magnetic => d + magnetic_variation_deg,
                    WindReference::True => d,
                };
                direction_deg = Some(normalise_deg(truth));
            }
            _ => errors.push(value_err(
                "wind direction",
                UnitError::OutOfRange {
                    text: dir_text.to_string(),
                    range: "0 to 360 degrees, VRB or calm".into(),
                },
            )),
        }
    }
    let speed_kt = if calm && input.wind_speed.trim().is_empty() {
        0.0
    } else {
        match parse_speed_kt(&input.wind_speed)
            .and_then(|v| in_range(&input.wind_speed, v, 0.0, 150.0, "0 to 150 kt"))
        {
            Ok(v) => v,
            Err(e) => {
                errors.push(value_err("wind speed", e));
                0.0
            }
        }
    };
    let gust_kt = match &input.gust {
        Some(g) if !g.trim().is_empty() => {
            match parse_speed_kt(g).and_then(|v| in_range(g, v, 0.0, 200.0, "0 to 200 kt")) {
                Ok(v) if v < speed_kt => {
                    errors.push(ManualError::Inconsistent {
                        station: label.clone(),
                        field: "gust",
                        problem: format!("gust '{g}' is below the mean wind speed"),
                    });
                    None
                }
                Ok(v) => Some(v),
                Err(e) => {
                    errors.push(value_err("gust", e));
                    None
                }
            }
        }
        _ => None,
    };

    // Visibility and ceiling.
    let visibility = match &input.visibility {
        // As in a METAR's visibility group (WMO No. 306, FM 15): 9999 is 10 km or more,
        // the one bare number a reader of reports types naturally.
        Some(v) if v.trim() == "9999" => Some(Visibility {
            prevailing_m: 10_000.0,
            bound: Bound::AtLeast,
            ..Visibility::default()
        }),
        Some(v) if !v.trim().is_empty() => match parse_length(v) {
            Ok(l) if (0.0..=100_000.0).contains(&l.m()) => Some(Visibility {
                prevailing_m: l.m(),
                bound: Bound::Exact,
                ..Visibility::default()
            }),
            Ok(_) => {
                errors.push(value_err(
                    "visibility",
                    UnitError::OutOfRange {
                        text: v.clone(),
                        range: "0 to 100 km".into(),
                    },
                ));
                None
            }
            Err(e) => {
                errors.push(value_err("visibility", e));
                None
            }
        },
        _ => None,
    };
    let ceiling = match input.ceiling.as_deref().map(str::trim) {
        None | Some("") => Ceiling::Unknown,
        Some(c)
            if c.eq_ignore_ascii_case("none")
                || c.eq_ignore_ascii_case("nil")
                || c.eq_ignore_ascii_case("unlimited") =>
        {
            Ceiling::None
        }
        Some(c) => match parse_length(c) {
            Ok(l) if (0.0..=60_000.0).contains(&l.ft()) => Ceiling::Known(l.ft()),
            Ok(_) => {
                errors.push(value_err(
                    "ceiling",
                    UnitError::OutOfRange {
                        text: c.to_string(),
                        range: "0 to 60,000 ft, or none".into(),
                    },
                ));
                Ceiling::Unknown
            }
            Err(e) => {
                errors.push(value_err("ceiling", e));
                Ceiling::Unknown
            }
        },
    };

    // Air data.
    let temperature_c = match parse_temperature_c(&input.temperature)
        .and_then(|v| in_range(&input.temperature, v, -60.0, 60.0, "-60 to 60 °C"))
    {
        Ok(v) => Some(v),
        Err(e) => {
            errors.push(value_err("temperature", e));
            None
        }
    };
    let (dewpoint_c, dewpoint_assumed) = match &input.dewpoint {
        Some(d) if !d.trim().is_empty() => {
            match parse_temperature_c(d).and_then(|v| in_range(d, v, -80.0, 60.0, "-80 to 60 °C"))
            {
                Ok(v) => (Some(v), false),
                Err(e) => {
                    errors.push(value_err("dew point", e));
                    (None, false)
                }
            }
        }
        _ => (temperature_c, true),
    };
    if let (Some(t), Some(d)) = (temperature_c, dewpoint_c)
        && d > t + 1e-9
    {
        errors.push(ManualError::Inconsistent {
            station: label.clone(),
            field: "dew point",
            problem: format!(
                "dew point {d:.1} °C is above the temperature {t:.1} °C; the dew point can be at most the temperature"
            ),
        });
    }
    let altimeter_hpa = match crate::units::parse_altimeter_hpa(&input.altimeter) {
        Ok(v) => Some(v),
        Err(e) => {
            errors.push(value_err("altimeter", e));
            None
        }
    };

    if !errors.is_empty() {
        return Err(errors);
    }
    let wind = Wind {
        direction_deg: if calm { Some(0.0) } else { direction_deg },
        variable,
        speed_kt,
        speed_bound: Bound::Exact,
        gust_kt,
        variable_from_deg: None,
        variable_to_deg: None,
        unit: Some(SpeedUnit::Kt),
    };
    let time_text = observed_at.format("%d%H%MZ").to_string();
    let wind_text = match (calm, direction_deg) {
        (true, _) => "calm".to_string(),
        (_, None) => format!("VRB/{speed_kt:.0}kt"),
        (_, Some(d)) => format!(
            "{d:03.0}/{speed_kt:.0}kt true{}",
            if input.wind_reference == WindReference::Magnetic {
                format!(" (typed {dir_text} magnetic, variation {magnetic_variation_deg:+.0})")
            } else {
                String::new()
            }
        ),
    };
    let mut report = Report {
        text: format!("MANUAL {station} {time_text} wind {wind_text}"),
        kind: Some(Kind::Manual),
        station,
        time_text,
        observed_at: Some(observed_at),
        wind: Some(wind),
        visibility,
        ceiling,
        temperature_c,
        dewpoint_c,
        dewpoint_assumed,
        altimeter_hpa,
        altimeter_inhg: altimeter_hpa.map(crate::units::hpa_to_inhg),
        hazards: input.hazards,
        ..Report::default()
    };
    // Ceiling and hazards come from the form, not from cloud layers.
    report.ceiling = ceiling;
    Ok(report)
}

#[cfg(test)]
mod tests {
    use super::*;
    use chrono::TimeZone;

    fn form() -> ManualInput {
        ManualInput {
            station: "xha1".into(),
            observed_at: Some(Utc.with_ymd_and_hms(2026, 6, 14, 12, 50, 0).unwrap()),
            wind_direction: "260".into(),
            wind_speed: "12kt".into(),
            gust: Some("20kt".into()),
            visibility: Some("8km".into()),
            ceiling: Some("2500ft".into()),
            temperature: "31C".into(),
            dewpoint: Some("12C".into()),
            altimeter: "30.12inHg".into(),
            ..ManualInput::default()
        }
    }

    #[test]
    fn magnetic_wind_is_converted_with_the_variation() {
        // 260° magnetic with 8° west variation is 252° true (true = magnetic + variation).
        let r = manual_observation(&form(), -8.0).unwrap();
        assert_eq!(r.wind.unwrap().direction_deg, Some(252.0));
        assert_eq!(r.kind, Some(Kind::Manual));
        assert_eq!(r.station, "XHA1");
        assert!(r.usable_for_performance());
        assert_eq!(r.ceiling, Ceiling::Known(2500.0));
        assert!((r.altimeter_hpa.unwrap() - 1019.98).abs() < 0.01);
        assert!(r.label().ends_with("(manual)"));
        // 355° magnetic with 10° east is 005° true; 350° magnetic + 10° east is 360°.
        let mut f = form();
        f.wind_direction = "355".into();
        assert_eq!(
            manual_observation(&f, 10.0)
                .unwrap()
                .wind
                .unwrap()
                .direction_deg,
            Some(5.0)
        );
        f.wind_direction = "350".into();
        assert_eq!(
            manual_observation(&f, 10.0)
                .unwrap()
                .wind
                .unwrap()
                .direction_deg,
            Some(360.0)
        );
        f.wind_reference = WindReference::True;
        assert_eq!(
            manual_observation(&f, 10.0)
                .unwrap()
                .wind
                .unwrap()
                .direction_deg,
            Some(350.0)
        );
    }

    /// 9999 reads as in a METAR's visibility group (WMO No. 306, FM 15): 10 km or
    /// more, a bound; any other bare number still needs its unit.
    #[test]
    fn visibility_9999_is_ten_km_or_more() {
        let mut f = form();
        f.visibility = Some("9999".into());
        let v = manual_observation(&f, 0.0).unwrap().visibility.unwrap();
        assert_eq!(v.prevailing_m, 10_000.0);
        assert_eq!(v.bound, Bound::AtLeast);
        f.visibility = Some("8000".into());
        assert!(manual_observation(&f, 0.0).is_err());
    }

    #[test]
    fn missing_dew_point_is_taken_as_saturated() {
        let mut f = form();
        f.dewpoint = None;
        let r = manual_observation(&f, 0.0).unwrap();
        assert_eq!(r.dewpoint_c, Some(31.0));
        assert!(r.dewpoint_assumed);
    }

    #[test]
    fn every_bad_value_is_reported() {
        let mut f = form();
        f.temperature = "31".into();
        f.altimeter = "2992".into();
        f.gust = Some("5kt".into());
        f.wind_direction = "370".into();
        let errs: Vec<String> = manual_observation(&f, 0.0)
            .unwrap_err()
            .iter()
            .map(ToString::to_string)
            .collect();
        insta::assert_snapshot!(errs.join("\n"), @r"
        manual observation XHA1: wind direction '370' is outside the accepted range 0 to 360 degrees, VRB or calm
        manual observation XHA1: gust '5kt' is below the mean wind speed
        manual observation XHA1: temperature '31': the unit is missing; write it after the number, one of C, F or K (e.g. 31C, -4C, 88F)
        manual observation XHA1: altimeter '2992': the unit is missing; write it after the number, one of hPa, mb or inHg (e.g. 1013hPa, 29.92inHg)
        ");
    }
}
