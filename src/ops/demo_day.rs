//! The demo day's weather: hourly METARs 06Z–17Z for every demo airfield, from a cool
//! morning to a hot afternoon, with a wind shift at 12Z, one gusty hour (14Z), morning
//! mist at the grass strip, afternoon cumulonimbus and a nearby thunderstorm at the
//! high field, and one station (XSHT) whose reports stop after 12Z.
//!
//! Generated (deterministically) rather than typed, so the profile is easy to read and
//! to change; `examples/gen_demo.rs` writes it to
//! `fixtures/demo/observations/2026-06-14.txt`.

use std::fmt::Write as _;

/// One station's weather profile for the day.
struct Station {
    id: &'static str,
    /// Lowest (06Z) and highest (15Z) temperature, °C.
    t_min_c: f64,
    t_max_c: f64,
    /// Dew point at 06Z and at 17Z, °C.
    dew_morning_c: f64,
    dew_evening_c: f64,
    /// Added to the regional wind direction, degrees (local terrain).
    dir_offset_deg: i32,
    /// Last hour with a report.
    last_hour: u32,
}

const STATIONS: [Station; 9] = [
    Station {
        id: "XSEA",
        t_min_c: 14.0,
        t_max_c: 31.0,
        dew_morning_c: 11.0,
        dew_evening_c: 13.0,
        dir_offset_deg: 0,
        last_hour: 17,
    },
    Station {
        id: "XMRS",
        t_min_c: 12.0,
        t_max_c: 32.0,
        dew_morning_c: 11.0,
        dew_evening_c: 12.0,
        dir_offset_deg: 10,
        last_hour: 17,
    },
    Station {
        id: "XFEN",
        t_min_c: 13.0,
        t_max_c: 32.0,
        dew_morning_c: 10.0,
        dew_evening_c: 11.0,
        dir_offset_deg: -10,
        last_hour: 17,
    },
    Station {
        id: "XSHT",
        t_min_c: 12.0,
        t_max_c: 31.0,
        dew_morning_c: 10.0,
        dew_evening_c: 10.0,
        dir_offset_deg: 0,
        last_hour: 12,
    },
    Station {
        id: "XKNL",
        t_min_c: 12.0,
        t_max_c: 30.0,
        dew_morning_c: 9.0,
        dew_evening_c: 9.0,
        dir_offset_deg: 20,
        last_hour: 17,
    },
    Station {
        id: "XBRK",
        t_min_c: 10.0,
        t_max_c: 29.0,
        dew_morning_c: 8.0,
        dew_evening_c: 7.0,
        dir_offset_deg: 0,
        last_hour: 17,
    },
    Station {
        id: "XMES",
        t_min_c: 10.0,
        t_max_c: 31.0,
        dew_morning_c: 6.0,
        dew_evening_c: 3.0,
        dir_offset_deg: -20,
        last_hour: 17,
    },
    Station {
        id: "XPIN",
        t_min_c: 8.0,
        t_max_c: 29.0,
        dew_morning_c: 5.0,
        dew_evening_c: 2.0,
        dir_offset_deg: 10,
        last_hour: 17,
    },
    Station {
        id: "XHIG",
        t_min_c: 8.0,
        t_max_c: 30.0,
        dew_morning_c: 3.0,
        dew_evening_c: 1.0,
        dir_offset_deg: 0,
        last_hour: 17,
    },
];

/// Fraction of the day's warming reached at an hour (0 at 06Z, 1 at 15Z).
fn warming(hour: u32) -> f64 {
    let h = f64::from(hour);
    if hour <= 15 {
        (std::f64::consts::FRAC_PI_2 * (h - 6.0) / 9.0).sin()
    } else {
        1.0 - 0.04 * (h - 15.0) * (h - 15.0)
    }
}

fn temp_group(c: f64) -> String {
    let r = c.round() as i64;
    if r < 0 {
        format!("M{:02}", -r)
    } else {
        format!("{r:02}")
    }
}

fn tenths(c: f64) -> String {
    let t = (c * 10.0).round() as i64;
    format!("{}{:03}", if t < 0 { 1 } else { 0 }, t.abs())
}

fn wind(s: &Station, hour: u32) -> String {
    let (base, speed, gust) = match hour {
        6..=8 => (230, 4 + (hour - 6), None),
        9..=10 => (240, 7, None),
        11 => (270, 9, None),
        12 | 13 => (310, 12, None),
        14 => (310, 16, Some(28)),
        _ => (300, 13, None),
    };
    let dir = (base + s.dir_offset_deg).rem_euclid(360);
    let dir = if dir == 0 { 360 } else { dir };
    match gust {
        Some(g) => format!("{dir:03}{speed:02}G{g:02}KT"),
        None => format!("{dir:03}{speed:02}KT"),
    }
}

fn sky(s: &Station, hour: u32) -> &'static str {
    match (s.id, hour) {
        ("XMRS", 6) => "3000 BR BKN004",
        ("XMRS", 7) => "6000 BR SCT006",
        ("XHIG", 16) => "9999 FEW060CB SCT090",
        ("XHIG", 17) => "9999 VCTS FEW055CB BKN090",
        ("XPIN", 16 | 17) => "9999 FEW065CB SCT100",
        (_, 6..=9) => "9999 FEW030",
        (_, 10..=12) => "9999 SCT040",
        _ => "9999 SCT050",
    }
}

/// The demo day's METARs, one per line, station by station in hour order.
pub fn metars() -> String {
    let mut out = String::new();
    for s in &STATIONS {
        for hour in 6..=s.last_hour {
            let t = s.t_min_c + (s.t_max_c - s.t_min_c) * warming(hour);
            let td =
                s.dew_morning_c + (s.dew_evening_c - s.dew_morning_c) * f64::from(hour - 6) / 11.0;
            let td = td.min(t);
            // Heat low: QNH falls through the day.
            let qnh = (1019.0 - 0.6 * f64::from(hour - 6)).round() as i64;
            let _ = writeln!(
                out,
                "METAR {id} 14{hour:02}00Z {wind} {sky} {tg}/{dg} Q{qnh} RMK T{tt}{dt}",
                id = s.id,
                wind = wind(s, hour),
                sky = sky(s, hour),
                tg = temp_group(t),
                dg = temp_group(td),
                tt = tenths(t),
                dt = tenths(td),
            );
        }
    }
    out
}

/// The demo day's TAFs, one per station, issued 05Z and valid 06Z to 06Z the next day,
/// written from the same profile as the METARs: TX/TN from the day's highest and
/// lowest temperature, the 12Z wind shift as an FM group, the gusty 14Z hour as a
/// TEMPO, the morning mist at XMRS and the afternoon CB at the high fields.
pub fn tafs() -> String {
    let mut out = String::new();
    for s in &STATIONS {
        let dir = |base: i32| {
            let d = (base + s.dir_offset_deg).rem_euclid(360);
            if d == 0 { 360 } else { d }
        };
        let base_sky = if s.id == "XMRS" {
            "3000 BR BKN004"
        } else {
            "9999 FEW030"
        };
        let _ = writeln!(
            out,
            "TAF {id} 140500Z 1406/1506 {d1:03}05KT {base_sky} TX{tx}/1415Z TN{tn}/1406Z",
            id = s.id,
            d1 = dir(230),
            tx = temp_group(s.t_max_c),
            tn = temp_group(s.t_min_c),
        );
        if s.id == "XMRS" {
            let _ = writeln!(out, "  BECMG 1407/1408 6000 SCT006");
            let _ = writeln!(out, "  BECMG 1408/1409 9999 NSW FEW030");
        }
        let _ = writeln!(out, "  BECMG 1409/1411 {:03}08KT SCT040", dir(250));
        let _ = writeln!(out, "  FM141200 {:03}12KT 9999 SCT040", dir(310));
        let _ = writeln!(out, "  TEMPO 1414/1415 {:03}16G28KT", dir(310));
        let _ = writeln!(out, "  FM141500 {:03}13KT 9999 SCT050", dir(300));
        match s.id {
            "XHIG" => {
                let _ = writeln!(out, "  PROB30 TEMPO 1416/1419 VCTS FEW055CB BKN090=");
            }
            "XPIN" => {
                let _ = writeln!(out, "  TEMPO 1416/1418 FEW065CB SCT100=");
            }
            _ => {
                let _ = writeln!(out, "  BECMG 1420/1422 {:03}06KT=", dir(280));
            }
        }
    }
    out
}
