//! Headroom against the atmosphere: where the search says a leg stops being below (or
//! turns below), the density altitude computed afresh with the crate's ISA functions
//! (themselves held to the ICAO / US Standard Atmosphere 1976 tables in
//! `tests/atmosphere.rs`) is at the limit; and a bound is never shown as a crossing.

use std::process::Command;

use rhoboard::assess::leg::Headroom;
use rhoboard::atmosphere;
use serde_json::Value;

fn check_leg(at: &str, leg: &str) -> Value {
    let config = std::env::temp_dir().join(format!("rhoboard-headroom-{}", std::process::id()));
    let out = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(["check", "--json", "--at", at, "--leg", leg])
        .env("XDG_CONFIG_HOME", &config)
        .env("HOME", &config)
        .env("RHOBOARD_DATA_DIR", &config)
        .output()
        .expect("runs");
    let v: Value = serde_json::from_slice(&out.stdout).expect("JSON");
    v["legs"][0].clone()
}

/// The METAR's `RMK Tsttt sddd` group: temperature and dew point to 0.1 °C.
fn rmk_t(metar: &str) -> (f64, f64) {
    let g = metar
        .split_whitespace()
        .find(|g| g.len() == 9 && g.starts_with('T'))
        .expect("a T group");
    let val = |s: &str| {
        let v: f64 = s[1..].parse::<f64>().unwrap() / 10.0;
        if s.starts_with('1') { -v } else { v }
    };
    (val(&g[1..5]), val(&g[5..9]))
}

/// Density altitude at `oat_c` with the side's pressure altitude held and the dew point
/// capped at the temperature, from the atmosphere's own functions.
fn da_at(pressure_altitude_ft: f64, oat_c: f64, dewpoint_c: f64) -> f64 {
    let p = atmosphere::pressure_at_pressure_altitude_hpa(pressure_altitude_ft);
    atmosphere::density_altitude_ft(atmosphere::density_kg_m3(
        p,
        oat_c,
        Some(dewpoint_c.min(oat_c)),
    ))
}

#[test]
fn negative_headroom_lands_on_the_density_altitude_limit() {
    // Demo L09 at 13Z: below on the density altitude at XPIN (arrival); both ends are
    // cooled alike, so at the returned cooling the arrival's density altitude is at
    // the limit: within it there, over it 0.2 °C warmer (the search's 0.1 °C grain).
    let l = check_leg("2026-06-14T13:00:00Z", "L09");
    assert_eq!(l["state"], "below");
    assert_eq!(l["headroom_table_ends"], false);
    let w = l["headroom_c"].as_f64().unwrap();
    assert!(w < 0.0, "{w}");
    let arr = &l["arrival"];
    let lim = arr["limits"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["kind"] == "density_altitude")
        .unwrap();
    let max_da = lim["limit"].as_f64().unwrap();
    let pa = arr["pressure_altitude_ft"].as_f64().unwrap();
    let (oat, td) = rmk_t(arr["observation"].as_str().unwrap());
    assert!((oat - arr["oat_c"].as_f64().unwrap()).abs() < 1e-9);
    // The reported density altitude is the same computation at the reported OAT.
    assert!((da_at(pa, oat, td) - arr["density_altitude_ft"].as_f64().unwrap()).abs() < 0.5);
    let at_w = da_at(pa, oat + w, td);
    let warmer = da_at(pa, oat + w + 0.2, td);
    assert!(at_w <= max_da, "{at_w} ft at {w} °C against {max_da} ft");
    assert!(warmer > max_da, "{warmer} ft at {} °C", w + 0.2);
}

#[test]
fn positive_headroom_lands_on_the_density_altitude_limit() {
    // Demo L03 at 13Z: within, limited by the density altitude at XHIG.
    let l = check_leg("2026-06-14T13:00:00Z", "L03");
    assert_eq!(l["headroom_table_ends"], false);
    let w = l["headroom_c"].as_f64().unwrap();
    assert!(w > 0.0, "{w}");
    let sides = [&l["departure"], &l["arrival"]];
    let side = sides
        .iter()
        .find(|s| {
            l["limiting_check"]
                .as_str()
                .unwrap()
                .starts_with(s["airfield"].as_str().unwrap())
        })
        .unwrap();
    let lim = side["limits"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["kind"] == "density_altitude")
        .unwrap();
    let max_da = lim["limit"].as_f64().unwrap();
    let pa = side["pressure_altitude_ft"].as_f64().unwrap();
    let (oat, td) = rmk_t(side["observation"].as_str().unwrap());
    assert!(da_at(pa, oat + w, td) <= max_da);
    assert!(da_at(pa, oat + w + 0.2, td) > max_da);
}

#[test]
fn a_bound_reads_as_a_bound() {
    let h = |warming_c: f64, table_ends: bool| Headroom {
        warming_c,
        warmest_oat_c: 28.7 + warming_c,
        table_ends,
        survives_expected_high: None,
    };
    assert_eq!(h(-38.7, true).figure(), "≤-38.7°C");
    assert_eq!(h(12.0, true).figure(), "≥+12.0°C");
    assert_eq!(h(-3.2, false).figure(), "-3.2°C");
    // The four cases in plain words: how much warming it takes (or cooling it needs),
    // then the departure OAT where that happens, a table's end said as a bound.
    assert_eq!(
        h(-38.7, true).words(),
        "below now: needs at least 38.7 °C of cooling, still below at a departure OAT of \
         -10.0 °C, where the flight-manual table ends"
    );
    assert_eq!(
        h(-3.2, false).words(),
        "below now: needs 3.2 °C of cooling, not below at a departure OAT of 25.5 °C or colder"
    );
    assert_eq!(
        h(6.2, false).words(),
        "takes 6.2 °C more warming: turns below at a departure OAT of 34.9 °C"
    );
    assert_eq!(
        h(12.0, true).words(),
        "takes at least 12.0 °C more warming: the flight-manual table ends at a departure \
         OAT of 40.7 °C"
    );
    // Under the search's 0.1 °C grain (rounded down to 0.0): less than a step, not "0.0".
    assert_eq!(
        h(0.0, false).words(),
        "takes less than 0.1 °C more warming: turns below at a departure OAT of 28.7 °C"
    );
    // No word of the old "not below from … down" form.
    for w in [h(-3.2, false).words(), h(6.2, false).words()] {
        assert!(!w.contains("below from") && !w.contains(" down"), "{w}");
    }
}
