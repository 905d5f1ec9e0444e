//! Unit conversions and the parsing of unit-suffixed values typed by people.
//!
//! Inside rhoboard every quantity is a plain `f64` whose unit is in its name
//! (`elevation_ft`, `qnh_hpa`, `oat_c`, `wind_kt`). That keeps the hot assessment
//! loop free of wrapper noise while the unit is never in doubt. This module holds
//! the exact conversion factors and the parsers for values a person types on the
//! command line or in a form, where the unit is a suffix:
//!
//! | quantity    | accepted suffixes (case-insensitive)                  | parsed to |
//! | ----------- | ----------------------------------------------------- | --------- |
//! | length      | `ft`, `m`, `km`, `sm` (statute mile), `nm` (nautical) | feet or metres |
//! | pressure    | `hPa`, `mb`, `mbar`, `inHg`                           | hPa       |
//! | temperature | `C`, `F`, `K`                                         | °C        |
//! | speed       | `kt`, `kts`, `kn`, `km/h`, `kmh`, `mph`, `m/s`, `mps` | knots     |
//! | mass        | `kg`, `lb`, `lbs`                                     | kg        |
//! | volume      | `L`, `l`, `usgal`, `gal`                              | litres    |
//!
//! A number alone is refused: the unit is what tells a typo from a value.

use std::fmt;

/// Metres in one international foot (exact, 1959 international yard and pound agreement).
pub const M_PER_FT: f64 = 0.3048;
/// Metres in one statute mile (exact: 5,280 ft).
pub const M_PER_SM: f64 = 1_609.344;
/// Metres in one international nautical mile (exact).
pub const M_PER_NM: f64 = 1_852.0;
/// Hectopascals in one inch of mercury (conventional, 0 °C mercury: 3386.389 Pa).
pub const HPA_PER_INHG: f64 = 33.863_886_666_7;
/// Kilograms in one avoirdupois pound (exact).
pub const KG_PER_LB: f64 = 0.453_592_37;
/// Litres in one US gallon (exact: 231 cubic inches).
pub const L_PER_USGAL: f64 = 3.785_411_784;
/// Metres per second in one knot (exact: 1,852 m per hour).
pub const MPS_PER_KT: f64 = 1_852.0 / 3_600.0;
/// Kilometres per hour in one knot (exact).
pub const KMH_PER_KT: f64 = 1.852;
/// Statute miles per hour in one knot.
pub const MPH_PER_KT: f64 = 1_852.0 / M_PER_SM;
/// Kelvin at 0 °C.
pub const KELVIN_AT_0C: f64 = 273.15;

/// Feet to metres.
pub const fn ft_to_m(ft: f64) -> f64 {
    ft * M_PER_FT
}

/// Metres to feet.
pub const fn m_to_ft(m: f64) -> f64 {
    m / M_PER_FT
}

/// Inches of mercury to hectopascals.
pub const fn inhg_to_hpa(inhg: f64) -> f64 {
    inhg * HPA_PER_INHG
}

/// Hectopascals to inches of mercury.
pub const fn hpa_to_inhg(hpa: f64) -> f64 {
    hpa / HPA_PER_INHG
}

/// Degrees Fahrenheit to degrees Celsius.
pub const fn f_to_c(f: f64) -> f64 {
    (f - 32.0) * 5.0 / 9.0
}

/// Degrees Celsius to degrees Fahrenheit.
pub const fn c_to_f(c: f64) -> f64 {
    c * 9.0 / 5.0 + 32.0
}

/// Degrees Celsius to kelvin.
pub const fn c_to_k(c: f64) -> f64 {
    c + KELVIN_AT_0C
}

/// Kilograms to pounds.
pub const fn kg_to_lb(kg: f64) -> f64 {
    kg / KG_PER_LB
}

/// Pounds to kilograms.
pub const fn lb_to_kg(lb: f64) -> f64 {
    lb * KG_PER_LB
}

/// Statute miles to metres.
pub const fn sm_to_m(sm: f64) -> f64 {
    sm * M_PER_SM
}

/// Metres to statute miles.
pub const fn m_to_sm(m: f64) -> f64 {
    m / M_PER_SM
}

/// Knots to metres per second.
pub const fn kt_to_mps(kt: f64) -> f64 {
    kt * MPS_PER_KT
}

/// Metres per second to knots.
pub const fn mps_to_kt(mps: f64) -> f64 {
    mps / MPS_PER_KT
}

/// `x` rounded up to whole units, the way a quantity is shown where more is worse
/// (density altitude, a mass against its maximum, a distance needed): as the limits'
/// rows show it ([`LimitCheck::shown`]), so one quantity reads the same on every line.
/// A hair of slack keeps an exact figure from moving a step.
///
/// [`LimitCheck::shown`]: crate::assess::limits::LimitCheck::shown
pub fn up0(x: f64) -> f64 {
    (x - 1e-9).ceil() + 0.0
}

/// `x` rounded down to whole units, where less is worse (fuel on board, a headwind):
/// the counterpart of [`up0`].
pub fn down0(x: f64) -> f64 {
    (x + 1e-9).floor() + 0.0
}

/// A headroom (warming left, negative: cooling needed) to a tenth, rounded down: less
/// room left, more cooling needed — the safe side of either (`11.34` is `11.3`,
/// `-11.34` is `-11.4`).
pub fn colder_tenth(d: f64) -> f64 {
    (d * 10.0 + 1e-6).floor() / 10.0 + 0.0
}

/// What kind of quantity a typed value was expected to be.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Kind {
    /// A length or height.
    Length,
    /// A pressure such as an altimeter setting.
    Pressure,
    /// A temperature.
    Temperature,
    /// A speed.
    Speed,
    /// A mass.
    Mass,
    /// A volume of fuel.
    Volume,
}

impl Kind {
    /// The suffixes accepted for this kind, as shown in error messages.
    pub const fn accepted(self) -> &'static str {
        match self {
            Kind::Length => "ft, m, km, sm or nm (e.g. 5900ft, 1800m)",
            Kind::Pressure => "hPa, mb or inHg (e.g. 1013hPa, 29.92inHg)",
            Kind::Temperature => "C, F or K (e.g. 31C, -4C, 88F)",
            Kind::Speed => "kt, km/h, mph or m/s (e.g. 15kt, 28km/h)",
            Kind::Mass => "kg or lb (e.g. 1100kg, 2400lb)",
            Kind::Volume => "L or usgal (e.g. 120L, 32usgal)",
        }
    }

    const fn noun(self) -> &'static str {
        match self {
            Kind::Length => "length",
            Kind::Pressure => "pressure",
            Kind::Temperature => "temperature",
            Kind::Speed => "speed",
            Kind::Mass => "mass",
            Kind::Volume => "volume",
        }
    }
}

/// A typed value that could not be read.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum UnitError {
    /// No number at the start of the value.
    #[error("'{text}': expected a number followed by a unit, one of {}", kind.accepted())]
    NoNumber {
        /// The text as typed.
        text: String,
        /// What was expected.
        kind: Kind,
    },
    /// A number with nothing after it.
    #[error("'{text}': the unit is missing; write it after the number, one of {}", kind.accepted())]
    MissingUnit {
        /// The text as typed.
        text: String,
        /// What was expected.
        kind: Kind,
    },
    /// A suffix that is not a unit of the expected kind.
    #[error("'{text}': '{unit}' is not a {} unit; use {}", kind.noun(), kind.accepted())]
    UnknownUnit {
        /// The text as typed.
        text: String,
        /// The suffix that was not understood.
        unit: String,
        /// What was expected.
        kind: Kind,
    },
    /// A decimal comma (`26,2C`): the number is read with a point.
    #[error("'{text}': write the decimal point as a point ('{fixed}')")]
    DecimalComma {
        /// The text as typed.
        text: String,
        /// The text with the comma as a point.
        fixed: String,
    },
    /// A value outside the range the program accepts for this input.
    #[error("'{text}' is outside the accepted range {range}")]
    OutOfRange {
        /// The text as typed.
        text: String,
        /// The accepted range, with its unit, in words.
        range: String,
    },
}

/// A length as typed, in the unit the person used.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Length {
    /// International feet.
    Ft(f64),
    /// Metres.
    M(f64),
}

impl Length {
    /// The length in feet.
    pub const fn ft(self) -> f64 {
        match self {
            Length::Ft(v) => v,
            Length::M(v) => m_to_ft(v),
        }
    }

    /// The length in metres.
    pub const fn m(self) -> f64 {
        match self {
            Length::Ft(v) => ft_to_m(v),
            Length::M(v) => v,
        }
    }
}

impl fmt::Display for Length {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Length::Ft(v) => write!(f, "{v} ft"),
            Length::M(v) => write!(f, "{v} m"),
        }
    }
}

/// Splits `text` into its leading number and the unit suffix after it.
fn split_number(text: &str, kind: Kind) -> Result<(f64, String), UnitError> {
    let t = text.trim();
    let bytes = t.as_bytes();
    let mut end = 0;
    if end < bytes.len() && (bytes[end] == b'-' || bytes[end] == b'+') {
        end += 1;
    }
    let digits_start = end;
    // Digits and a decimal point; a comma only as a thousands separator, before three
    // digits that end the group (`5,900ft`, `12,500 ft`), never after the point.
    let group_follows = |at: usize| {
        bytes.get(at) == Some(&b',')
            && bytes.len() >= at + 4
            && bytes[at + 1..at + 4].iter().all(u8::is_ascii_digit)
            && bytes.get(at + 4).is_none_or(|b| !b.is_ascii_digit())
    };
    let mut seen_point = false;
    while end < bytes.len() {
        match bytes[end] {
            b'0'..=b'9' => end += 1,
            // A second point makes the number unreadable (`1.2.3kt`), not a unit.
            b'.' => {
                seen_point = true;
                end += 1;
            }
            b',' if !seen_point && end > digits_start && group_follows(end) => end += 1,
            _ => break,
        }
    }
    let no_number = || UnitError::NoNumber {
        text: text.to_string(),
        kind,
    };
    if end == digits_start {
        return Err(no_number());
    }
    // `end` only advanced over ASCII bytes, so it is a char boundary.
    let number = &t[..end];
    // The first group before a comma has one to three digits.
    if number.contains(',') {
        let first = number[digits_start..].split(',').next().unwrap_or("");
        if first.is_empty() || first.len() > 3 {
            return Err(no_number());
        }
    }
    let plain: String = number.chars().filter(|&c| c != ',').collect();
    let value: f64 = plain.parse().map_err(|_| no_number())?;
    if !value.is_finite() {
        return Err(no_number());
    }
    let unit = t[end..].trim();
    // `26,2C`: a comma where a point was meant (not a thousands separator).
    if unit.starts_with(',') && unit[1..].starts_with(|c: char| c.is_ascii_digit()) {
        return Err(UnitError::DecimalComma {
            text: text.to_string(),
            fixed: format!("{}.{}", &t[..end], &unit[1..]),
        });
    }
    if unit.is_empty() {
        return Err(UnitError::MissingUnit {
            text: text.to_string(),
            kind,
        });
    }
    Ok((value, unit.to_ascii_lowercase()))
}

fn unknown(text: &str, unit: String, kind: Kind) -> UnitError {
    UnitError::UnknownUnit {
        text: text.to_string(),
        unit,
        kind,
    }
}

/// Parses a length such as `5900ft`, `1800m`, `1.2km`, `3sm` or `2nm`.
///
/// Feet and metres keep the unit typed; the others come back in metres.
pub fn parse_length(text: &str) -> Result<Length, UnitError> {
    let (v, unit) = split_number(text, Kind::Length)?;
    match unit.as_str() {
        "ft" | "feet" | "foot" | "'" => Ok(Length::Ft(v)),
        "m" | "metre" | "metres" | "meter" | "meters" => Ok(Length::M(v)),
        "km" => Ok(Length::M(v * 1_000.0)),
        "sm" => Ok(Length::M(v * M_PER_SM)),
        "nm" => Ok(Length::M(v * M_PER_NM)),
        _ => Err(unknown(text, unit, Kind::Length)),
    }
}

/// Parses a pressure such as `1019hPa`, `1019mb` or `30.12inHg`, in hPa.
pub fn parse_pressure_hpa(text: &str) -> Result<f64, UnitError> {
    let (v, unit) = split_number(text, Kind::Pressure)?;
    match unit.as_str() {
        "hpa" | "mb" | "mbar" | "millibar" | "millibars" => Ok(v),
        "inhg" | "in" | "\"hg" => Ok(inhg_to_hpa(v)),
        _ => Err(unknown(text, unit, Kind::Pressure)),
    }
}

/// The altimeter settings accepted (QNH), hPa: 850 to 1100 (25.10 to 32.48 inHg).
pub const ALTIMETER_RANGE_HPA: (f64, f64) = (850.0, 1100.0);

/// Parses an altimeter setting ([`parse_pressure_hpa`]) and checks it lies in
/// [`ALTIMETER_RANGE_HPA`]. Out of range, where the number would be in range in the
/// other unit (`30.12hPa`, `1013inHg`), the message asks whether that was meant.
pub fn parse_altimeter_hpa(text: &str) -> Result<f64, UnitError> {
    const RANGE: &str = "850 to 1100 hPa (25.10 to 32.48 inHg)";
    let hpa = parse_pressure_hpa(text)?;
    let (lo, hi) = ALTIMETER_RANGE_HPA;
    if (lo..=hi).contains(&hpa) {
        return Ok(hpa);
    }
    let (v, unit) = split_number(text, Kind::Pressure)?;
    let as_inhg = inhg_to_hpa(v);
    let other = if unit.starts_with("in") || unit == "\"hg" {
        (lo..=hi).contains(&v).then(|| format!("{v}hPa"))
    } else {
        (lo..=hi).contains(&as_inhg).then(|| format!("{v}inHg"))
    };
    Err(UnitError::OutOfRange {
        text: text.to_string(),
        range: match other {
            Some(o) => format!("{RANGE}; did you mean {o}?"),
            None => RANGE.to_string(),
        },
    })
}

/// Parses a temperature such as `31C`, `-4C`, `88F` or `290K`, in °C.
pub fn parse_temperature_c(text: &str) -> Result<f64, UnitError> {
    let (v, unit) = split_number(text, Kind::Temperature)?;
    match unit.as_str() {
        "c" | "°c" | "degc" => Ok(v),
        "f" | "°f" | "degf" => Ok(f_to_c(v)),
        "k" => Ok(v - KELVIN_AT_0C),
        _ => Err(unknown(text, unit, Kind::Temperature)),
    }
}

/// Parses a speed such as `15kt`, `28km/h`, `20mph` or `8m/s`, in knots.
pub fn parse_speed_kt(text: &str) -> Result<f64, UnitError> {
    let (v, unit) = split_number(text, Kind::Speed)?;
    match unit.as_str() {
        "kt" | "kts" | "kn" | "knots" | "knot" => Ok(v),
        "km/h" | "kmh" | "kph" => Ok(v / KMH_PER_KT),
        "mph" => Ok(v / MPH_PER_KT),
        "m/s" | "mps" => Ok(mps_to_kt(v)),
        _ => Err(unknown(text, unit, Kind::Speed)),
    }
}

/// Parses a mass such as `1100kg` or `2400lb`, in kg.
pub fn parse_mass_kg(text: &str) -> Result<f64, UnitError> {
    let (v, unit) = split_number(text, Kind::Mass)?;
    match unit.as_str() {
        "kg" => Ok(v),
        "lb" | "lbs" => Ok(lb_to_kg(v)),
        _ => Err(unknown(text, unit, Kind::Mass)),
    }
}

/// Parses a volume of fuel such as `120L` or `32usgal`, in litres.
pub fn parse_volume_l(text: &str) -> Result<f64, UnitError> {
    let (v, unit) = split_number(text, Kind::Volume)?;
    match unit.as_str() {
        "l" | "litre" | "litres" | "liter" | "liters" => Ok(v),
        "usgal" | "gal" | "usg" => Ok(v * L_PER_USGAL),
        _ => Err(unknown(text, unit, Kind::Volume)),
    }
}

/// Checks that `value` lies in `lo..=hi`, else an [`UnitError::OutOfRange`] quoting `text`.
pub fn in_range(text: &str, value: f64, lo: f64, hi: f64, range: &str) -> Result<f64, UnitError> {
    if (lo..=hi).contains(&value) {
        Ok(value)
    } else {
        Err(UnitError::OutOfRange {
            text: text.to_string(),
            range: range.to_string(),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A decimal comma is named, with the number as meant (trial nit: "',2c' is not a
    /// temperature unit"); a thousands separator is still read.
    #[test]
    fn a_decimal_comma_is_named() {
        assert_eq!(
            parse_temperature_c("26,2C").unwrap_err().to_string(),
            "'26,2C': write the decimal point as a point ('26.2C')"
        );
        assert_eq!(parse_length("5,900ft").unwrap().ft(), 5900.0);
    }

    // Exact definitions: NIST SP 811 (2008), appendix B.8 — 1 ft = 0.3048 m,
    // 1 mi = 1609.344 m, 1 nmi = 1852 m, 1 lb = 0.45359237 kg, 1 gal (US) = 3.785411784 L,
    // 1 inHg (conventional) = 3386.389 Pa.
    #[test]
    fn conversion_factors_match_nist_sp_811() {
        assert_eq!(ft_to_m(1.0), 0.3048);
        assert_eq!(sm_to_m(1.0), 1609.344);
        assert!((m_to_ft(M_PER_SM) - 5280.0).abs() < 1e-9);
        assert!((inhg_to_hpa(1.0) * 100.0 - 3386.389).abs() < 1e-3);
        assert!((lb_to_kg(1.0) - 0.453_592_37).abs() < 1e-12);
        assert!((L_PER_USGAL - 3.785_411_784).abs() < 1e-12);
        // 29.92 inHg is 1013.2 hPa (the standard altimeter setting, FAA AIM 7-2-2, to 0.1).
        assert!((inhg_to_hpa(29.92) - 1013.2).abs() < 0.05);
        assert!((c_to_f(100.0) - 212.0).abs() < 1e-12);
        assert!((f_to_c(-40.0) + 40.0).abs() < 1e-12);
        assert!((kt_to_mps(1.0) - 0.514_444).abs() < 1e-6);
    }

    #[test]
    fn parses_the_documented_suffixes() {
        assert_eq!(parse_length("5900ft").unwrap(), Length::Ft(5900.0));
        assert_eq!(parse_length("1800m").unwrap(), Length::M(1800.0));
        assert_eq!(parse_length("-200 FT").unwrap(), Length::Ft(-200.0));
        // Thousands separators, as the program itself prints them ("5,900 ft").
        assert_eq!(parse_length("5,900ft").unwrap(), Length::Ft(5900.0));
        assert_eq!(parse_length("12,500 ft").unwrap(), Length::Ft(12500.0));
        assert_eq!(parse_length("-1,500ft").unwrap(), Length::Ft(-1500.0));
        assert!(parse_length("5,90ft").is_err(), "not a group of three");
        assert!(parse_length("1234,567ft").is_err(), "first group too long");
        assert!(
            parse_length("1.5,000ft").is_err(),
            "no comma after the point"
        );
        assert!((parse_length("1nm").unwrap().m() - 1852.0).abs() < 1e-9);
        assert!((parse_pressure_hpa("30.12inHg").unwrap() - 1019.98).abs() < 0.01);
        assert_eq!(parse_pressure_hpa("1019hPa").unwrap(), 1019.0);
        assert_eq!(parse_pressure_hpa("1019mb").unwrap(), 1019.0);
        assert_eq!(parse_temperature_c("31C").unwrap(), 31.0);
        assert_eq!(parse_temperature_c("-4C").unwrap(), -4.0);
        assert!((parse_temperature_c("88F").unwrap() - 31.111).abs() < 0.001);
        assert_eq!(parse_speed_kt("15kt").unwrap(), 15.0);
        assert!((parse_speed_kt("28km/h").unwrap() - 15.119).abs() < 0.001);
        assert!((parse_mass_kg("2400lb").unwrap() - 1088.62).abs() < 0.01);
        assert!((parse_volume_l("10usgal").unwrap() - 37.854).abs() < 0.001);
    }

    #[test]
    fn error_messages_quote_the_value_and_say_what_is_accepted() {
        insta::assert_snapshot!(parse_length("5900").unwrap_err(), @"'5900': the unit is missing; write it after the number, one of ft, m, km, sm or nm (e.g. 5900ft, 1800m)");
        insta::assert_snapshot!(parse_pressure_hpa("30.12in Hg").unwrap_err(), @"'30.12in Hg': 'in hg' is not a pressure unit; use hPa, mb or inHg (e.g. 1013hPa, 29.92inHg)");
        insta::assert_snapshot!(parse_temperature_c("warm").unwrap_err(), @"'warm': expected a number followed by a unit, one of C, F or K (e.g. 31C, -4C, 88F)");
        insta::assert_snapshot!(parse_speed_kt("1.2.3kt").unwrap_err(), @"'1.2.3kt': expected a number followed by a unit, one of kt, km/h, mph or m/s (e.g. 15kt, 28km/h)");
    }

    proptest::proptest! {
        #[test]
        fn parsers_never_panic(s in "\\PC{0,40}") {
            let _ = parse_length(&s);
            let _ = parse_pressure_hpa(&s);
            let _ = parse_temperature_c(&s);
            let _ = parse_speed_kt(&s);
            let _ = parse_mass_kg(&s);
            let _ = parse_volume_l(&s);
        }

        #[test]
        fn conversions_round_trip(v in -1.0e6f64..1.0e6) {
            proptest::prop_assert!((m_to_ft(ft_to_m(v)) - v).abs() <= 1e-9 * v.abs().max(1.0));
            proptest::prop_assert!((hpa_to_inhg(inhg_to_hpa(v)) - v).abs() <= 1e-9 * v.abs().max(1.0));
            proptest::prop_assert!((f_to_c(c_to_f(v)) - v).abs() <= 1e-9 * v.abs().max(1.0));
            proptest::prop_assert!((kg_to_lb(lb_to_kg(v)) - v).abs() <= 1e-9 * v.abs().max(1.0));
        }
    }
}
