//! Sunrise, sunset and civil twilight against fixtures/reference/daylight.json, made by
//! scripts/daylight_reference.py with the PyPI library `ephem` 4.2.1 (PyEphem, the
//! XEphem engine) under the U.S. Naval Observatory conventions. Tolerance: 2 minutes
//! within ±65° latitude, 4 minutes beyond (the sun crosses the horizon slowly there).

use chrono::{DateTime, NaiveDate, Utc};
use rhoboard::daylight::{Event, daylight};

#[derive(serde::Deserialize)]
struct Fixture {
    cases: Vec<Case>,
}

#[derive(serde::Deserialize)]
struct Case {
    place: String,
    latitude_deg: f64,
    longitude_deg: f64,
    date: NaiveDate,
    civil_dawn: String,
    sunrise: String,
    sunset: String,
    civil_dusk: String,
}

fn check(label: &str, got: Event, want: &str, tol_s: i64) {
    match (got, want) {
        (Event::AlwaysAbove, "always_above") | (Event::AlwaysBelow, "always_below") => {}
        (Event::At(t), w) if !w.starts_with("always") => {
            let w: DateTime<Utc> = w.parse().expect("RFC 3339");
            let off = (t - w).num_seconds();
            assert!(
                off.abs() <= tol_s,
                "{label}: got {t}, want {w} (off {off} s)"
            );
        }
        (g, w) => panic!("{label}: got {g:?}, want {w}"),
    }
}

#[test]
fn daylight_matches_pyephem_for_named_places() {
    let fixture: Fixture =
        serde_json::from_str(include_str!("../fixtures/reference/daylight.json")).unwrap();
    assert!(fixture.cases.len() >= 40);
    for c in &fixture.cases {
        let d = daylight(c.date, c.latitude_deg, c.longitude_deg);
        let tol = if c.latitude_deg.abs() <= 65.0 {
            120
        } else {
            240
        };
        let label = |what: &str| format!("{} {} {what}", c.place, c.date);
        check(&label("civil dawn"), d.civil_dawn, &c.civil_dawn, tol);
        check(&label("sunrise"), d.sunrise, &c.sunrise, tol);
        check(&label("sunset"), d.sunset, &c.sunset, tol);
        check(&label("civil dusk"), d.civil_dusk, &c.civil_dusk, tol);
    }
}
