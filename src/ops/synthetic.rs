//! A deterministic synthetic large operator for benchmarks and scale tests: the demo's
//! operator, pilots and (fictional) types copied to `types` type ids, `aircraft`
//! aircraft, `airfields` airfields with four runway ends each, `legs` legs on the demo
//! day, and one METAR per airfield per hour. Invented numbers throughout; never real.

use std::collections::BTreeMap;
use std::fmt::Write as _;

use super::load::OpsFiles;

/// Size of the synthetic operator.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Size {
    /// Aircraft types (copies of the demo's three).
    pub types: usize,
    /// Aircraft.
    pub aircraft: usize,
    /// Airfields (four runway ends each).
    pub airfields: usize,
    /// Legs.
    pub legs: usize,
    /// Hours of reports (from 06Z).
    pub hours: usize,
}

impl Size {
    /// The assessment benchmark's operator: 200 aircraft of 10 types, 2,000 airfields
    /// (8,000 runway ends), 2,000 legs.
    pub const LARGE: Size = Size {
        types: 10,
        aircraft: 200,
        airfields: 2_000,
        legs: 2_000,
        hours: 12,
    };
}

/// A small deterministic generator (splitmix64), so the operator is the same on every run.
struct Rng(u64);

impl Rng {
    fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    fn unit(&mut self) -> f64 {
        (self.next() >> 11) as f64 / (1u64 << 53) as f64
    }

    fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }
}

/// The station id of synthetic airfield `i`: `X` and three base-36 characters.
pub fn station_id(i: usize) -> String {
    const DIGITS: &[u8; 36] = b"0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZ";
    let mut s = String::from("X");
    for k in (0..3).rev() {
        s.push(DIGITS[(i / 36usize.pow(k)) % 36] as char);
    }
    s
}

fn designator(heading_mag_deg: f64) -> String {
    let n = ((heading_mag_deg / 10.0).round() as i64).rem_euclid(36);
    format!("{:02}", if n == 0 { 36 } else { n })
}

/// The synthetic operator's files (in the operator-folder layout) for `size`.
pub fn operator(size: Size) -> OpsFiles {
    let demo = super::demo::files();
    let mut files = BTreeMap::new();
    let mut rng = Rng(0x005E_ED0F_0BEE);
    for name in ["operator.json", "pilots.json"] {
        if let Some(text) = demo.files.get(name) {
            files.insert(name.to_string(), text.clone());
        }
    }
    // Types: copies of the demo types under new ids.
    let demo_types: Vec<serde_json::Value> = demo
        .files
        .iter()
        .filter(|(k, _)| k.starts_with("fleet/types/"))
        .filter_map(|(_, v)| serde_json::from_str(v).ok())
        .collect();
    let mut type_ids = Vec::new();
    let mut empty_mass = Vec::new();
    let mut mtow = Vec::new();
    for t in 0..size.types {
        let Some(base) = demo_types.get(t % demo_types.len().max(1)) else {
            break;
        };
        let mut v = base.clone();
        // The demo's own types keep their ids (the demo pilots' endorsements name them).
        let id = if t < demo_types.len() {
            v["id"].as_str().unwrap_or_default().to_string()
        } else {
            v["id"] = serde_json::Value::String(format!("syn{t}"));
            v["name"] = serde_json::Value::String(format!(
                "Synthetic type {t} (fictional, benchmark only)"
            ));
            format!("syn{t}")
        };
        mtow.push(
            v["limits"]["max_takeoff_mass_kg"]
                .as_f64()
                .unwrap_or(1_000.0),
        );
        let masses = v["performance"]["axes"]["mass_kg"]
            .as_array()
            .cloned()
            .unwrap_or_default();
        let lightest = masses.first().and_then(|m| m.as_f64()).unwrap_or(600.0);
        empty_mass.push(lightest * 0.7);
        files.insert(
            format!("fleet/types/{id}.json"),
            serde_json::to_string_pretty(&v).unwrap_or_default(),
        );
        type_ids.push(id);
    }
    // Aircraft.
    let mut aircraft = String::from("{\n  \"schema_version\": 1,\n  \"aircraft\": [\n");
    let mut regs = Vec::new();
    for a in 0..size.aircraft {
        let t = a % type_ids.len().max(1);
        let reg = format!("S-{a:04}");
        let _ = write!(
            aircraft,
            "{}    {{\"registration\": \"{reg}\", \"type_id\": \"{}\", \"empty_mass_kg\": {:.0}, \"empty_arm_mm\": 900, \"status\": \"available\"}}",
            if a == 0 { "" } else { ",\n" },
            type_ids[t],
            empty_mass[t]
        );
        regs.push((reg, t));
    }
    aircraft.push_str("\n  ]\n}\n");
    files.insert("fleet/aircraft.json".to_string(), aircraft);
    // Airfields: two runways (four ends), elevations from sea level to 7,000 ft.
    let mut elevations = Vec::with_capacity(size.airfields);
    for i in 0..size.airfields {
        let id = station_id(i);
        let elevation_ft = (rng.unit() * 7_000.0).round();
        elevations.push(elevation_ft);
        let variation = (rng.unit() * 10.0 - 5.0).round();
        let mut ends = String::new();
        let mut first_heading = 0.0;
        for r in 0..2 {
            let heading = if r == 0 {
                (rng.unit() * 180.0).round()
            } else {
                first_heading + 60.0 + (rng.unit() * 60.0).round()
            };
            if r == 0 {
                first_heading = heading;
            }
            let length = 500.0 + (rng.unit() * 1_500.0).round();
            let grass = rng.unit() < 0.3;
            let slope = if rng.unit() < 0.2 { 1.0 } else { 0.0 };
            for (k, h) in [heading % 360.0, (heading + 180.0) % 360.0]
                .into_iter()
                .enumerate()
            {
                let mag = h - variation;
                let slope_here = if k == 0 || slope == 0.0 {
                    slope
                } else {
                    -slope
                };
                let gradient = if rng.unit() < 0.1 {
                    ", \"required_climb_gradient\": {\"ft_per_nm\": 250, \"note\": \"synthetic obstacle\"}"
                } else {
                    ""
                };
                let _ = write!(
                    ends,
                    "{}    {{\"designator\": \"{}\", \"true_heading_deg\": {h}, \"tora_m\": {length}, \"toda_m\": {length}, \"asda_m\": {length}, \"lda_m\": {length}, \"surface\": \"{}\", \"slope_percent\": {slope_here}{gradient}}}",
                    if ends.is_empty() { "" } else { ",\n" },
                    designator(mag),
                    if grass { "grass" } else { "paved" },
                );
            }
        }
        let lat = 35.0 + rng.unit() * 20.0;
        let lon = -10.0 + rng.unit() * 25.0;
        files.insert(
            format!("airfields/{id}.json"),
            format!(
                "{{\n  \"schema_version\": 1,\n  \"id\": \"{id}\",\n  \"name\": \"Synthetic field {i} (fictional)\",\n  \"elevation_ft\": {elevation_ft},\n  \"latitude_deg\": {lat:.3},\n  \"longitude_deg\": {lon:.3},\n  \"magnetic_variation_deg\": {variation},\n  \"runway_ends\": [\n{ends}\n  ]\n}}\n"
            ),
        );
    }
    // Legs on the demo day, dual and charter so no solo endorsement is needed. Each
    // aircraft flies its legs one after another, each from where the last one landed.
    let date = super::demo::DATE;
    let mut legs =
        format!("{{\n  \"schema_version\": 1,\n  \"date\": \"{date}\",\n  \"legs\": [\n");
    let per_aircraft = size.legs.div_ceil(regs.len().max(1));
    let mut at_field: Vec<usize> = (0..regs.len()).map(|_| rng.below(size.airfields)).collect();
    for l in 0..size.legs {
        let a = l % regs.len().max(1);
        let (reg, t) = &regs[a];
        let k = l / regs.len().max(1);
        let from = at_field[a];
        let to = rng.below(size.airfields);
        at_field[a] = to;
        let minute = 6 * 60 + k * (11 * 60 / per_aircraft.max(1));
        let (pilot, category) = if l % 2 == 0 {
            ("ins-mara", "dual")
        } else {
            ("chr-idris", "charter")
        };
        let mass = (mtow[*t] * (0.8 + 0.15 * rng.unit())).round();
        let _ = write!(
            legs,
            "{}    {{\"id\": \"S{l:05}\", \"departs_at\": \"{date}T{:02}:{:02}:00Z\", \"arrives_at\": \"{date}T{:02}:{:02}:00Z\", \"aircraft\": \"{reg}\", \"pilot\": \"{pilot}\", \"category\": \"{category}\", \"from\": \"{}\", \"to\": \"{}\", \"takeoff_mass_kg\": {mass}, \"landing_mass_kg\": {}}}",
            if l == 0 { "" } else { ",\n" },
            minute / 60,
            minute % 60,
            (minute + 40) / 60,
            (minute + 40) % 60,
            station_id(from),
            station_id(to),
            (mass - 25.0).round(),
        );
    }
    legs.push_str("\n  ]\n}\n");
    files.insert(format!("legs/{date}.json"), legs);
    files.insert(
        "observations/synthetic.txt".to_string(),
        reports(size, &elevations),
    );
    OpsFiles { files }
}

/// Hourly METARs for every synthetic airfield from 06Z, warming through the day.
pub fn reports(size: Size, elevations: &[f64]) -> String {
    let mut rng = Rng(0xA1B2_C3D4);
    let mut out = String::new();
    for h in 0..size.hours {
        for (i, elev) in elevations.iter().enumerate().take(size.airfields) {
            let base = 14.0 - elev / 1_000.0 * 2.0;
            let t = (base + h as f64 * 1.6 + rng.unit() * 3.0).round() as i32;
            let dew = (t - 8 - rng.below(10) as i32).min(t);
            let dir = 10 * (1 + rng.below(36));
            let speed = rng.below(16);
            let qnh = 1_005 + rng.below(20);
            let fmt_t = |v: i32| {
                if v < 0 {
                    format!("M{:02}", -v)
                } else {
                    format!("{v:02}")
                }
            };
            let _ = writeln!(
                out,
                "METAR {} 14{:02}00Z {dir:03}{speed:02}KT 9999 FEW040 {}/{} Q{qnh}",
                station_id(i),
                6 + h,
                fmt_t(t),
                fmt_t(dew)
            );
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn station_ids_are_unique_and_four_characters() {
        let ids: std::collections::HashSet<String> = (0..5_000).map(station_id).collect();
        assert_eq!(ids.len(), 5_000);
        assert!(ids.iter().all(|s| s.len() == 4 && s.starts_with('X')));
    }

    #[test]
    fn a_small_synthetic_operator_loads_without_errors() {
        let files = operator(Size {
            types: 4,
            aircraft: 12,
            airfields: 30,
            legs: 20,
            hours: 3,
        });
        let loaded = super::super::load_files(&files);
        assert!(
            loaded.report.errors.is_empty(),
            "{:#?}",
            &loaded.report.errors[..loaded.report.errors.len().min(5)]
        );
        let ops = loaded.ops.unwrap();
        assert_eq!(ops.airfields.len(), 30);
        assert_eq!(ops.legs.len(), 20);
    }
}
