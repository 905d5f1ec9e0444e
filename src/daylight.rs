//! Sunrise, sunset and civil twilight at a place and date, by the NOAA solar-position
//! method (the NOAA Global Monitoring Laboratory solar calculator, after Meeus,
//! *Astronomical Algorithms*, 1991). Good to about a minute between ±72° latitude;
//! towards the poles the times are less certain and polar day and night are reported
//! as such, never as a time.
//!
//! Sunrise and sunset are when the sun's upper limb meets the horizon with standard
//! refraction: zenith 90.833°. Civil twilight begins and ends with the sun's centre 6°
//! below the horizon: zenith 96°.

use chrono::{DateTime, Duration, NaiveDate, Utc};

/// Zenith of sunrise and sunset: 90° + 34′ refraction + 16′ semi-diameter.
pub const SUNRISE_ZENITH_DEG: f64 = 90.833;
/// Zenith at the start and end of civil twilight.
pub const CIVIL_TWILIGHT_ZENITH_DEG: f64 = 96.0;

/// When a sun event happens on a day, or why it does not.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Event {
    /// It happens at this instant.
    At(DateTime<Utc>),
    /// The sun stays above that zenith all day (polar day, or twilight all night).
    AlwaysAbove,
    /// The sun stays below that zenith all day (polar night).
    AlwaysBelow,
}

impl Event {
    /// The instant, when there is one.
    pub fn time(self) -> Option<DateTime<Utc>> {
        match self {
            Event::At(t) => Some(t),
            _ => None,
        }
    }
}

/// The day's light at one place.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Daylight {
    /// Start of morning civil twilight.
    pub civil_dawn: Event,
    /// Sunrise.
    pub sunrise: Event,
    /// Solar noon.
    pub solar_noon: DateTime<Utc>,
    /// Sunset.
    pub sunset: Event,
    /// End of evening civil twilight.
    pub civil_dusk: Event,
}

/// Julian day of 0h UTC on `date`.
fn julian_day_at_midnight(date: NaiveDate) -> f64 {
    // The Unix epoch 1970-01-01T00:00Z is JD 2440587.5.
    let days = (date - NaiveDate::from_ymd_opt(1970, 1, 1).unwrap_or_default()).num_days();
    2_440_587.5 + days as f64
}

/// Declination of the sun (degrees) and the equation of time (minutes) at Julian
/// century `t` from J2000.0 — the NOAA spreadsheet's columns, in its order.
fn sun_position(t: f64) -> (f64, f64) {
    let l0 = (280.466_46 + t * (36_000.769_83 + t * 0.000_303_2)).rem_euclid(360.0);
    let m = 357.529_11 + t * (35_999.050_29 - 0.000_153_7 * t);
    let e = 0.016_708_634 - t * (0.000_042_037 + 0.000_000_126_7 * t);
    let m_rad = m.to_radians();
    let c = m_rad.sin() * (1.914_602 - t * (0.004_817 + 0.000_014 * t))
        + (2.0 * m_rad).sin() * (0.019_993 - 0.000_101 * t)
        + (3.0 * m_rad).sin() * 0.000_289;
    let true_long = l0 + c;
    let omega = (125.04 - 1_934.136 * t).to_radians();
    let apparent_long = true_long - 0.005_69 - 0.004_78 * omega.sin();
    let mean_obliquity =
        23.0 + (26.0 + (21.448 - t * (46.815 + t * (0.000_59 - t * 0.001_813))) / 60.0) / 60.0;
    let obliquity = mean_obliquity + 0.002_56 * omega.cos();
    let declination = (obliquity.to_radians().sin() * apparent_long.to_radians().sin())
        .asin()
        .to_degrees();
    let y = (obliquity.to_radians() / 2.0).tan().powi(2);
    let l0r = l0.to_radians();
    let eq_time = 4.0
        * (y * (2.0 * l0r).sin() - 2.0 * e * m_rad.sin()
            + 4.0 * e * y * m_rad.sin() * (2.0 * l0r).cos()
            - 0.5 * y * y * (4.0 * l0r).sin()
            - 1.25 * e * e * (2.0 * m_rad).sin())
        .to_degrees();
    (declination, eq_time)
}

fn century(jd: f64) -> f64 {
    (jd - 2_451_545.0) / 36_525.0
}

/// Minutes after 0h UTC of solar noon at longitude `lon_deg` (east positive).
fn solar_noon_min(jd0: f64, lon_deg: f64) -> f64 {
    // Two passes: the equation of time at the approximate noon, then at the refined one.
    let mut noon = 720.0 - 4.0 * lon_deg;
    for _ in 0..2 {
        let (_, eq) = sun_position(century(jd0 + noon / 1_440.0));
        noon = 720.0 - 4.0 * lon_deg - eq;
    }
    noon
}

/// The event at `zenith_deg`, morning (`rising`) or evening, in minutes after 0h UTC.
fn event_min(jd0: f64, lat_deg: f64, lon_deg: f64, zenith_deg: f64, rising: bool) -> Event {
    let noon = solar_noon_min(jd0, lon_deg);
    let mut minutes = noon;
    // Iterate: the sun's position at the event time itself, three passes reach
    // well under a second.
    for _ in 0..3 {
        let (decl, eq) = sun_position(century(jd0 + minutes / 1_440.0));
        let lat = lat_deg.to_radians();
        let d = decl.to_radians();
        let cos_ha = zenith_deg.to_radians().cos() / (lat.cos() * d.cos()) - lat.tan() * d.tan();
        if cos_ha.is_nan() || cos_ha < -1.0 {
            return Event::AlwaysAbove;
        }
        if cos_ha > 1.0 {
            return Event::AlwaysBelow;
        }
        let ha = cos_ha.acos().to_degrees();
        let local_noon = 720.0 - 4.0 * lon_deg - eq;
        minutes = if rising {
            local_noon - 4.0 * ha
        } else {
            local_noon + 4.0 * ha
        };
    }
    Event::At(at_minutes(jd0, minutes))
}

fn at_minutes(jd0: f64, minutes: f64) -> DateTime<Utc> {
    let midnight_unix_s = ((jd0 - 2_440_587.5) * 86_400.0).round() as i64;
    let base = DateTime::from_timestamp(midnight_unix_s, 0).unwrap_or_default();
    base + Duration::milliseconds((minutes * 60_000.0).round() as i64)
}

/// Sunrise, sunset, civil twilight and solar noon for `date` at latitude `lat_deg`
/// (north positive) and longitude `lon_deg` (east positive). The events are those
/// around the solar noon that falls nearest 12:00 UTC on `date` shifted by longitude,
/// i.e. the place's own day.
pub fn daylight(date: NaiveDate, lat_deg: f64, lon_deg: f64) -> Daylight {
    let lat_deg = lat_deg.clamp(-89.999, 89.999);
    let jd0 = julian_day_at_midnight(date);
    Daylight {
        civil_dawn: event_min(jd0, lat_deg, lon_deg, CIVIL_TWILIGHT_ZENITH_DEG, true),
        sunrise: event_min(jd0, lat_deg, lon_deg, SUNRISE_ZENITH_DEG, true),
        solar_noon: at_minutes(jd0, solar_noon_min(jd0, lon_deg)),
        sunset: event_min(jd0, lat_deg, lon_deg, SUNRISE_ZENITH_DEG, false),
        civil_dusk: event_min(jd0, lat_deg, lon_deg, CIVIL_TWILIGHT_ZENITH_DEG, false),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn polar_day_and_night_are_not_times() {
        // 80° N: midnight sun in June, polar night in December.
        let june = daylight(NaiveDate::from_ymd_opt(2026, 6, 21).unwrap(), 80.0, 15.0);
        assert_eq!(june.sunrise, Event::AlwaysAbove);
        assert_eq!(june.sunset, Event::AlwaysAbove);
        let dec = daylight(NaiveDate::from_ymd_opt(2026, 12, 21).unwrap(), 80.0, 15.0);
        assert_eq!(dec.sunrise, Event::AlwaysBelow);
        // The poles themselves do not panic.
        let _ = daylight(NaiveDate::from_ymd_opt(2026, 3, 20).unwrap(), 90.0, 0.0);
        let _ = daylight(NaiveDate::from_ymd_opt(2026, 3, 20).unwrap(), -90.0, 180.0);
    }

    #[test]
    fn order_of_the_day() {
        let d = daylight(NaiveDate::from_ymd_opt(2026, 6, 14).unwrap(), 47.0, -1.0);
        let t = |e: Event| e.time().unwrap();
        assert!(t(d.civil_dawn) < t(d.sunrise));
        assert!(t(d.sunrise) < d.solar_noon && d.solar_noon < t(d.sunset));
        assert!(t(d.sunset) < t(d.civil_dusk));
    }
}
