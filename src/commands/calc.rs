//! `rhoboard calc`: the air at one field from elevation, altimeter setting and
//! temperature — pressure and density altitude, density, ISA deviation, TAS factor.

use std::io::Write;

use anyhow::{Context, bail};
use serde::Serialize;

use crate::atmosphere::AirData;
use crate::commands::Outcome;
use crate::units::{self, UnitError};

/// Arguments of `rhoboard calc`. Values carry their unit as a suffix.
#[derive(Debug, Clone, clap::Args)]
pub struct Args {
    /// Field elevation, e.g. 5900ft or 1800m (-1,500 to 20,000 ft).
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true)]
    pub elevation: String,
    /// Altimeter setting (QNH), e.g. 30.12inHg, 1019hPa or 1019mb (850 to 1100 hPa).
    #[arg(long, value_name = "PRESSURE")]
    pub altimeter: String,
    /// Outside air temperature, e.g. 31C, -4C or 88F (-60 to +60 °C).
    #[arg(long, value_name = "TEMP", allow_hyphen_values = true)]
    pub temp: String,
    /// Dew point, e.g. 8C (not above the temperature). Without it the air is taken as dry.
    #[arg(long, value_name = "TEMP", allow_hyphen_values = true)]
    pub dewpoint: Option<String>,
    /// An indicated airspeed to convert to true airspeed, e.g. 65kt.
    #[arg(long, value_name = "SPEED")]
    pub ias: Option<String>,
    /// Print JSON instead of the readable summary.
    #[arg(long)]
    pub json: bool,
    /// Words after the options (a unit typed apart from its number, `5900 ft`): named
    /// in the error, with the fix.
    #[arg(hide = true, num_args = 0.., trailing_var_arg = false)]
    pub stray: Vec<String>,
}

/// Validated inputs of one calculation, in internal units.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Inputs {
    /// Field elevation, ft.
    pub elevation_ft: f64,
    /// Altimeter setting, hPa.
    pub altimeter_hpa: f64,
    /// Outside air temperature, °C.
    pub temperature_c: f64,
    /// Dew point, °C.
    pub dewpoint_c: Option<f64>,
    /// Indicated airspeed, kt.
    pub ias_kt: Option<f64>,
}

fn arg_error(flag: &str, err: UnitError) -> anyhow::Error {
    anyhow::anyhow!("--{flag} {err}")
}

impl Inputs {
    /// Reads and range-checks the typed values; the error names the flag and quotes
    /// the value.
    pub fn from_args(args: &Args) -> anyhow::Result<Inputs> {
        let elevation_ft = units::parse_length(&args.elevation)
            .map_err(|e| arg_error("elevation", e))?
            .ft();
        let elevation_ft = units::in_range(
            &args.elevation,
            elevation_ft,
            -1_500.0,
            20_000.0,
            "-1,500 ft to 20,000 ft",
        )
        .map_err(|e| arg_error("elevation", e))?;
        let altimeter_hpa =
            units::parse_altimeter_hpa(&args.altimeter).map_err(|e| arg_error("altimeter", e))?;
        let temperature_c = units::parse_temperature_c(&args.temp)
            .and_then(|v| units::in_range(&args.temp, v, -60.0, 60.0, "-60 °C to +60 °C"))
            .map_err(|e| arg_error("temp", e))?;
        let dewpoint_c = match &args.dewpoint {
            None => None,
            Some(text) => {
                let td = units::parse_temperature_c(text)
                    .and_then(|v| units::in_range(text, v, -80.0, 60.0, "-80 °C to +60 °C"))
                    .map_err(|e| arg_error("dewpoint", e))?;
                if td > temperature_c + 1e-9 {
                    bail!(
                        "--dewpoint '{text}' is above the temperature '{}'; the dew point can be at most the temperature",
                        args.temp
                    );
                }
                Some(td)
            }
        };
        let ias_kt = match &args.ias {
            None => None,
            Some(text) => Some(
                units::parse_speed_kt(text)
                    .and_then(|v| units::in_range(text, v, 0.0, 400.0, "0 to 400 kt"))
                    .map_err(|e| arg_error("ias", e))?,
            ),
        };
        Ok(Inputs {
            elevation_ft,
            altimeter_hpa,
            temperature_c,
            dewpoint_c,
            ias_kt,
        })
    }
}

/// The JSON form of a calculation.
#[derive(Debug, Clone, Serialize, PartialEq)]
pub struct CalcJson {
    /// Field elevation used, ft.
    pub elevation_ft: f64,
    /// Altimeter setting, hPa.
    pub altimeter_hpa: f64,
    /// Altimeter setting, inHg.
    pub altimeter_inhg: f64,
    /// Outside air temperature, °C.
    pub temperature_c: f64,
    /// Dew point, °C (null when not given: dry air).
    pub dewpoint_c: Option<f64>,
    /// Station pressure, hPa.
    pub station_pressure_hpa: f64,
    /// Pressure altitude, ft.
    pub pressure_altitude_ft: f64,
    /// ISA temperature at the pressure altitude, °C.
    pub isa_temperature_c: f64,
    /// OAT minus ISA, °C.
    pub isa_deviation_c: f64,
    /// Air density with humidity, kg/m³.
    pub air_density_kg_m3: f64,
    /// σ = ρ/ρ₀.
    pub density_ratio: f64,
    /// Density altitude with humidity (equal to dry without a dew point), ft.
    pub density_altitude_ft: f64,
    /// Density altitude of dry air, ft.
    pub density_altitude_dry_ft: f64,
    /// The 120 ft/°C estimate, ft (cross-check only).
    pub density_altitude_rule_of_thumb_ft: f64,
    /// 1/√σ.
    pub true_airspeed_factor: f64,
    /// The indicated airspeed given, kt.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub indicated_airspeed_kt: Option<f64>,
    /// TAS for the given IAS, kt.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub true_airspeed_kt: Option<f64>,
    /// The planning-aid caution.
    pub caution: &'static str,
}

/// Computes the JSON form for validated inputs.
pub fn compute(inputs: &Inputs) -> CalcJson {
    let air = AirData::from_observation(
        inputs.elevation_ft,
        inputs.altimeter_hpa,
        inputs.temperature_c,
        inputs.dewpoint_c,
    );
    CalcJson {
        elevation_ft: inputs.elevation_ft,
        altimeter_hpa: inputs.altimeter_hpa,
        altimeter_inhg: units::hpa_to_inhg(inputs.altimeter_hpa),
        temperature_c: inputs.temperature_c,
        dewpoint_c: inputs.dewpoint_c,
        station_pressure_hpa: air.station_pressure_hpa,
        pressure_altitude_ft: air.pressure_altitude_ft,
        isa_temperature_c: air.isa_temperature_c,
        isa_deviation_c: air.isa_deviation_c,
        air_density_kg_m3: air.density_kg_m3,
        density_ratio: air.density_ratio,
        density_altitude_ft: air.density_altitude_ft,
        density_altitude_dry_ft: air.density_altitude_dry_ft,
        density_altitude_rule_of_thumb_ft: air.density_altitude_rule_of_thumb_ft,
        true_airspeed_factor: air.true_airspeed_factor,
        indicated_airspeed_kt: inputs.ias_kt,
        true_airspeed_kt: inputs.ias_kt.map(|v| v * air.true_airspeed_factor),
        caution: crate::CAUTION,
    }
}

/// Formats a whole number of feet with thousands separators: `9,046`.
pub fn feet(v: f64) -> String {
    let n = v.round() as i64;
    let digits = n.unsigned_abs().to_string();
    let mut out = String::with_capacity(digits.len() + 4);
    if n < 0 {
        out.push('-');
    }
    for (i, ch) in digits.chars().enumerate() {
        if i > 0 && (digits.len() - i).is_multiple_of(3) {
            out.push(',');
        }
        out.push(ch);
    }
    out
}

/// One plain line on what this density altitude means for takeoff and climb.
pub fn meaning(c: &CalcJson) -> String {
    // Rounded up, as the board and the sheet show every density altitude.
    let da_ft = units::up0(c.density_altitude_ft);
    let above = da_ft - c.elevation_ft;
    let da = feet(da_ft);
    if above.abs() < 250.0 {
        format!(
            "The air is close to standard for this field: the aircraft will perform about as its \
             manual's tables show for {da} ft."
        )
    } else if above > 0.0 {
        format!(
            "The aircraft performs as if the field were at {da} ft, {} ft higher than it is: \
             expect a longer takeoff run, a weaker climb and a faster-looking ground; fly the \
             normal indicated speeds.",
            feet(above)
        )
    } else {
        format!(
            "The air is denser than standard: the aircraft performs as if the field were at \
             {da} ft, {} ft lower than it is; takeoff and climb are better than at standard.",
            feet(-above)
        )
    }
}

fn write_human(c: &CalcJson, out: &mut dyn Write) -> std::io::Result<()> {
    let dew = match c.dewpoint_c {
        Some(td) => format!("dew point {td:.1} °C"),
        None => "no dew point (dry air assumed)".to_string(),
    };
    writeln!(
        out,
        "Air at {} ft, altimeter {:.2} inHg / {:.1} hPa, {:.1} °C, {dew}",
        feet(c.elevation_ft),
        c.altimeter_inhg,
        c.altimeter_hpa,
        c.temperature_c
    )?;
    writeln!(out)?;
    let sign = if c.isa_deviation_c >= 0.0 { "+" } else { "-" };
    let mut rows: Vec<(&str, String, String)> = vec![
        (
            "station pressure",
            format!("{:.1} hPa", c.station_pressure_hpa),
            format!("{:.2} inHg", units::hpa_to_inhg(c.station_pressure_hpa)),
        ),
        (
            "pressure altitude",
            format!("{} ft", feet(c.pressure_altitude_ft)),
            String::new(),
        ),
        (
            "ISA temperature",
            format!("{:.1} °C", c.isa_temperature_c),
            format!("OAT is ISA {sign}{:.1} °C", c.isa_deviation_c.abs()),
        ),
        (
            "air density",
            format!("{:.4} kg/m³", c.air_density_kg_m3),
            format!("σ = {:.3} of standard sea level", c.density_ratio),
        ),
        (
            "density altitude",
            format!("{} ft", feet(units::up0(c.density_altitude_ft))),
            if c.dewpoint_c.is_some() {
                "with humidity".to_string()
            } else {
                "dry air".to_string()
            },
        ),
        (
            "  120 ft/°C estimate",
            format!("{} ft", feet(c.density_altitude_rule_of_thumb_ft)),
            "rule of thumb, cross-check only".to_string(),
        ),
        (
            "true airspeed factor",
            format!("{:.3}", c.true_airspeed_factor),
            "TAS = factor × IAS".to_string(),
        ),
        (
            "true airspeed",
            match (c.indicated_airspeed_kt, c.true_airspeed_kt) {
                (Some(_), Some(tas)) => format!("{tas:.0} kt"),
                _ => "—".to_string(),
            },
            match c.indicated_airspeed_kt {
                Some(ias) => format!("at {ias:.0} kt indicated"),
                None => "give --ias to convert".to_string(),
            },
        ),
    ];
    // With a dew point, the dry-air figure beside it shows what the humidity adds.
    if c.dewpoint_c.is_some() {
        rows.insert(
            5,
            (
                "  dry air",
                format!("{} ft", feet(c.density_altitude_dry_ft)),
                String::new(),
            ),
        );
    }
    for (name, value, note) in rows {
        let line = format!("  {name:<22}{value:>14}   {note}");
        writeln!(out, "{}", line.trim_end())?;
    }
    writeln!(out)?;
    writeln!(out, "{}", meaning(c))?;
    writeln!(out)?;
    writeln!(out, "{}", crate::CAUTION)?;
    Ok(())
}

/// Runs `rhoboard calc`.
pub fn run(args: &Args, out: &mut dyn Write) -> anyhow::Result<Outcome> {
    if let Some(word) = args.stray.first() {
        anyhow::bail!(
            "'{word}' is not an option: a unit goes with its number, with no space between \
             (--elevation 5900ft, --temp 31C, --altimeter 30.12inHg)"
        );
    }
    let inputs = Inputs::from_args(args)?;
    let result = compute(&inputs);
    if args.json {
        serde_json::to_writer_pretty(&mut *out, &result).context("writing JSON")?;
        writeln!(out)?;
    } else {
        write_human(&result, out)?;
    }
    Ok(Outcome::Success)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn args(e: &str, a: &str, t: &str, d: Option<&str>) -> Args {
        Args {
            elevation: e.into(),
            altimeter: a.into(),
            temp: t.into(),
            dewpoint: d.map(Into::into),
            ias: None,
            json: false,
            stray: Vec::new(),
        }
    }

    #[test]
    fn thousands_separators() {
        assert_eq!(feet(9046.4), "9,046");
        assert_eq!(feet(-1234.0), "-1,234");
        assert_eq!(feet(999.0), "999");
        assert_eq!(feet(1_000_000.0), "1,000,000");
    }

    #[test]
    fn bad_values_are_refused_with_one_line_naming_the_flag() {
        let err = |a: Args| Inputs::from_args(&a).unwrap_err().to_string();
        insta::assert_snapshot!(err(args("5900", "30.12inHg", "31C", None)), @"--elevation '5900': the unit is missing; write it after the number, one of ft, m, km, sm or nm (e.g. 5900ft, 1800m)");
        insta::assert_snapshot!(err(args("25000ft", "30.12inHg", "31C", None)), @"--elevation '25000ft' is outside the accepted range -1,500 ft to 20,000 ft");
        insta::assert_snapshot!(err(args("5900ft", "800hPa", "31C", None)), @"--altimeter '800hPa' is outside the accepted range 850 to 1100 hPa (25.10 to 32.48 inHg)");
        // The number in range in the other unit: asked whether that was meant.
        insta::assert_snapshot!(err(args("5900ft", "30.12hpa", "31C", None)), @"--altimeter '30.12hpa' is outside the accepted range 850 to 1100 hPa (25.10 to 32.48 inHg); did you mean 30.12inHg?");
        insta::assert_snapshot!(err(args("5900ft", "1013inHg", "31C", None)), @"--altimeter '1013inHg' is outside the accepted range 850 to 1100 hPa (25.10 to 32.48 inHg); did you mean 1013hPa?");
        insta::assert_snapshot!(err(args("5900ft", "30.12", "31C", None)), @"--altimeter '30.12': the unit is missing; write it after the number, one of hPa, mb or inHg (e.g. 1013hPa, 29.92inHg)");
        insta::assert_snapshot!(err(args("5900ft", "30.12inHg", "61C", None)), @"--temp '61C' is outside the accepted range -60 °C to +60 °C");
        insta::assert_snapshot!(err(args("5900ft", "30.12inHg", "31C", Some("32C"))), @"--dewpoint '32C' is above the temperature '31C'; the dew point can be at most the temperature");
        insta::assert_snapshot!(err(args("5900ft", "30.12inHg", "31X", None)), @"--temp '31X': 'x' is not a temperature unit; use C, F or K (e.g. 31C, -4C, 88F)");
    }

    proptest::proptest! {
        #[test]
        fn garbage_in_any_argument_never_panics(
            e in "\\PC{0,16}", a in "\\PC{0,16}", t in "\\PC{0,16}", d in "\\PC{0,16}", v in "\\PC{0,16}",
        ) {
            let mut x = args(&e, &a, &t, Some(&d));
            x.ias = Some(v);
            if let Ok(inputs) = Inputs::from_args(&x) {
                let c = compute(&inputs);
                let mut buf = Vec::new();
                write_human(&c, &mut buf).unwrap();
                proptest::prop_assert!(c.density_altitude_ft.is_finite());
            }
        }

        #[test]
        fn every_accepted_input_gives_finite_numbers(
            elev in -1_500.0f64..=20_000.0, qnh in 850.0f64..=1_100.0,
            t in -60.0f64..=60.0, spread in 0.0f64..=60.0,
        ) {
            let td = (t - spread).max(-80.0);
            let x = args(&format!("{elev}ft"), &format!("{qnh}hPa"), &format!("{t}C"), Some(&format!("{td}C")));
            let inputs = Inputs::from_args(&x).unwrap();
            let c = compute(&inputs);
            for v in [c.station_pressure_hpa, c.pressure_altitude_ft, c.density_altitude_ft, c.true_airspeed_factor] {
                proptest::prop_assert!(v.is_finite());
            }
        }
    }
}
