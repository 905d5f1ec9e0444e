//! One broken operator per kind of problem (`tests/bad-ops/<case>/`), each checked for
//! the exact message `rhoboard validate` prints.
//!
//! A case folder holds only the files that differ from `tests/bad-ops/_base/` (a small,
//! valid operator), plus an optional `DELETE` listing files to remove. The test lays the
//! base and the case into a temporary folder and runs the real command on it.

use std::path::{Path, PathBuf};

use rhoboard::commands::validate::{Args, run};

fn copy_tree(from: &Path, to: &Path) {
    for e in std::fs::read_dir(from).unwrap() {
        let e = e.unwrap();
        let p = e.path();
        let target = to.join(e.file_name());
        if p.is_dir() {
            std::fs::create_dir_all(&target).unwrap();
            copy_tree(&p, &target);
        } else if e.file_name() != "DELETE" {
            std::fs::copy(&p, &target).unwrap();
        }
    }
}

/// Lays out a case and returns what `rhoboard validate` prints, after the first line
/// (which names the temporary folder), followed by the exit code.
fn validate_case(name: &str) -> String {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad-ops");
    let dir: PathBuf =
        std::env::temp_dir().join(format!("rhoboard-bad-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    copy_tree(&root.join("_base"), &dir);
    copy_tree(&root.join(name), &dir);
    if let Ok(list) = std::fs::read_to_string(root.join(name).join("DELETE")) {
        for f in list.lines().filter(|l| !l.trim().is_empty()) {
            std::fs::remove_file(dir.join(f.trim())).unwrap();
        }
    }
    let mut out = Vec::new();
    let outcome = run(
        &Args {
            ops: Some(dir.clone()),
            json: false,
        },
        &mut out,
    )
    .unwrap();
    std::fs::remove_dir_all(&dir).unwrap();
    // The closing line names the folder as given (trial finding: a literal "DIR");
    // its temporary path reads as DIR in the snapshots.
    let text = String::from_utf8(out).unwrap();
    if text.contains("Fix the errors") {
        let again = format!("run `rhoboard validate --ops {}` again", dir.display());
        assert!(text.contains(&again), "{text}");
    }
    let text = text.replace(&dir.display().to_string(), "DIR");
    let body: Vec<&str> = text.lines().skip(1).collect();
    format!("{}\nexit {}", body.join("\n"), outcome.code())
}

#[test]
fn the_base_is_valid() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad-ops/_base");
    let loaded = rhoboard::ops::load_dir(&root).unwrap();
    assert!(
        loaded.report.errors.is_empty() && loaded.report.warnings.is_empty(),
        "{:#?}",
        loaded.report
    );
}

#[test]
fn every_case_folder_has_a_test() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad-ops");
    let mut cases: Vec<String> = std::fs::read_dir(&root)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .filter(|n| n != "_base")
        .collect();
    cases.sort();
    assert_eq!(cases, CASES);
}
#[test]
fn json_report_for_scripts() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad-ops");
    let dir = std::env::temp_dir().join(format!("rhoboard-bad-json-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    copy_tree(&root.join("_base"), &dir);
    copy_tree(&root.join("tora-toda-asda"), &dir);
    let mut out = Vec::new();
    let outcome = run(
        &Args {
            ops: Some(dir.clone()),
            json: true,
        },
        &mut out,
    )
    .unwrap();
    std::fs::remove_dir_all(&dir).unwrap();
    assert_eq!(outcome.code(), 2);
    let v: serde_json::Value = serde_json::from_slice(&out).unwrap();
    assert_eq!(v["ok"], false);
    insta::assert_snapshot!(serde_json::to_string_pretty(&v["errors"][0]).unwrap(), @r#"
    {
      "column": 75,
      "file": "airfields/XAAA.json",
      "line": 10,
      "message": "TODA 850 m is shorter than TORA 900 m; TODA is TORA plus any clearway",
      "path": "runway_ends[0].toda_m",
      "severity": "error"
    }
    "#);
}

const CASES: &[&str] = &[
    "axes-not-increasing",
    "climb-increases",
    "designator-heading",
    "distance-decreases",
    "duplicate-ids",
    "envelope-crossing",
    "every-problem-in-one-run",
    "ground-roll-above-50ft",
    "irregular-ok",
    "json-syntax",
    "leg-arrives-first",
    "leg-loads",
    "leg-maintenance",
    "leg-nobody-at-the-controls",
    "leg-overlap-and-position",
    "leg-typo-no-follow-on",
    "leg-unknown-refs",
    "leg-wrong-day-file",
    "loads-fuel-units",
    "maintenance-without-note",
    "missing-field",
    "missing-file",
    "misspelt-folder",
    "non-positive-distance",
    "observation-rejected",
    "operator-two-categories",
    "runway-state-closure-window",
    "runway-state-unknown-end",
    "schema-errors-top-and-list",
    "schema-version",
    "slope-signs",
    "table-shape",
    "table-too-cool",
    "three-errors-one-file",
    "tora-toda-asda",
    "unknown-fields",
    "variation-sign",
    "wrong-type",
];

#[test]
fn axes_not_increasing() {
    insta::assert_snapshot!(validate_case("axes-not-increasing"), @r#"
    1 error(s):
      fleet/types/tiny.json:11:68: performance.axes.pressure_altitude_ft[1]: axis pressure_altitude_ft must be strictly increasing, but 0 follows 8000
    1 warning(s):
      fleet/aircraft.json:4:43: aircraft[0].type_id: 'tiny' is in fleet/types/tiny.json, which failed to load (see its error); references to it are not checked until that file is fixed
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn climb_increases() {
    insta::assert_snapshot!(validate_case("climb-increases"), @r#"
    2 error(s):
      fleet/types/tiny.json:22:40: performance.climb.rate_fpm[0][1][1]: value 940 increases from 900 as pressure altitude rises from 0 to 8000 ft; probably a typing error (if the manual really says so, add "irregular_ok": "reason" to this section)
      fleet/types/tiny.json:22:40: performance.climb.rate_fpm[0][1][1]: value 940 increases from 600 as OAT rises from -10 to 40 °C; probably a typing error (if the manual really says so, add "irregular_ok": "reason" to this section)
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn designator_heading() {
    insta::assert_snapshot!(validate_case("designator-heading"), @r#"
    1 error(s):
      airfields/XAAA.json:10:46: runway_ends[0].true_heading_deg: designator 09 disagrees with the magnetic heading 110° (true 112 − variation 2) by 20°; check the heading, the designator or the variation's sign (east positive)
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn distance_decreases() {
    insta::assert_snapshot!(validate_case("distance-decreases"), @r#"
    2 error(s):
      fleet/types/tiny.json:14:46: performance.takeoff.distance_50ft_m[0][1][1]: value 360 decreases from 370 as pressure altitude rises from 0 to 8000 ft; probably a typing error (if the manual really says so, add "irregular_ok": "reason" to this section)
      fleet/types/tiny.json:14:46: performance.takeoff.distance_50ft_m[0][1][1]: value 360 decreases from 460 as OAT rises from -10 to 40 °C; probably a typing error (if the manual really says so, add "irregular_ok": "reason" to this section)
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn duplicate_ids() {
    insta::assert_snapshot!(validate_case("duplicate-ids"), @r#"
    4 error(s):
      fleet/aircraft.json:5:22: aircraft[1].registration: duplicate registration 'X-TINA' (also aircraft[0])
      legs/2026-06-14.json:7:12: legs[1].id: duplicate leg id 'T1' (also legs/2026-06-14.json legs[0])
      legs/2026-06-14.json:8:15: legs[1].pilot: unknown pilot 'ins-bo'; it is not in pilots.json
      pilots.json:6:12: pilots[1].id: duplicate pilot id 'stu-ash' (also pilots[0])
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn ground_roll_above_50ft() {
    insta::assert_snapshot!(validate_case("ground-roll-above-50ft"), @r#"
    1 error(s):
      fleet/types/tiny.json:13:70: performance.takeoff.ground_roll_m[1][1][1]: ground roll 1500 m is longer than the 50 ft distance 930 m at the same point; one of them is mistyped
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn irregular_ok() {
    insta::assert_snapshot!(validate_case("irregular-ok"), @r#"
    All is well: 1 aircraft type(s), 2 aircraft, 2 pilot(s), 2 airfield(s), 2 leg(s), 1 observation and forecast file(s).
    exit 0
    "#);
}

#[test]
fn json_syntax() {
    insta::assert_snapshot!(validate_case("json-syntax"), @r#"
    1 error(s):
      airfields/XAAA.json:5:24: JSON syntax: key must be a string
    1 warning(s):
      legs/2026-06-14.json:6:62: legs[0].from: 'XAAA' is in airfields/XAAA.json, which failed to load (see its error); references to it are not checked until that file is fixed
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn leg_arrives_first() {
    insta::assert_snapshot!(validate_case("leg-arrives-first"), @r#"
    1 error(s):
      legs/2026-06-14.json:5:70: legs[0].arrives_at: arrives at 2026-06-14T07:30:00+00:00 before or when it departs (2026-06-14T08:00:00+00:00)
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

/// A closure that ends before it starts, or starts on another day, is named at its start.
#[test]
fn runway_state_closure_window() {
    insta::assert_snapshot!(validate_case("runway-state-closure-window"), @r"
    2 error(s):
      runway-state/2026-06-14.json:5:63: entries[0].from: the closure's start 1600Z is not before its end 1500Z
      runway-state/2026-06-14.json:6:63: entries[1].from: 2026-06-13 2200Z is not on 2026-06-14: a day's runway state holds for its own UTC day
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    ");
}

/// A leg whose loads put nobody at the type's first seats (where the pilot sits) has
/// nobody to fly it (trial finding: emptying the pilot's seat improved the leg).
#[test]
fn leg_nobody_at_the_controls() {
    insta::assert_snapshot!(validate_case("leg-nobody-at-the-controls"), @r"
    1 error(s):
      legs/2026-06-14.json:7:28: legs[0].loads.stations: nobody at seats (Pilot and passenger), the type's first seats, where the pilot sits: give the pilot's mass_kg or standard_adults there
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    ");
}

#[test]
fn leg_loads() {
    insta::assert_snapshot!(validate_case("leg-loads"), @r#"
    2 error(s):
      legs/2026-06-14.json:7:41: legs[0].loads.stations[0].station: type tiny has no loading station 'front_seats' (it has: seats, baggage)
      legs/2026-06-14.json:7:92: legs[0].loads.fuel_at_start_l: 100 L of fuel is more than the usable capacity 90 L
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn leg_maintenance() {
    insta::assert_snapshot!(validate_case("leg-maintenance"), @r#"
    1 error(s):
      legs/2026-06-14.json:7:116: legs[1].aircraft: aircraft X-TINB is in maintenance (Propeller overhaul); choose another aircraft
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn leg_overlap_and_position() {
    insta::assert_snapshot!(validate_case("leg-overlap-and-position"), @r#"
    1 error(s):
      legs/2026-06-14.json:7:32: legs[1].departs_at: aircraft X-TINA is on leg T1 until 0900Z, which overlaps leg T2
    1 warning(s):
      legs/2026-06-14.json:10:53: legs[2].from: aircraft X-TINA departs XBBB on leg T3 at 1200Z but its previous leg T2 landed at XAAA
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

/// A typo'd airfield (`XBBX` for `XBBB`) is one error on its own field; the next leg
/// of the aircraft, departing the real XBBB, gets no warning that only repeats it ("the
/// previous leg landed at XBBX"). A real break in the aircraft's positions (T3 departs
/// XBBB after T2 landed at XAAA) still warns.
#[test]
fn leg_typo_no_follow_on() {
    insta::assert_snapshot!(validate_case("leg-typo-no-follow-on"), @r#"
    1 error(s):
      legs/2026-06-14.json:6:76: legs[0].to: unknown airfield 'XBBX'; add airfields/XBBX.json or fix the id; did you mean XBBB?
    1 warning(s):
      legs/2026-06-14.json:10:53: legs[2].from: aircraft X-TINA departs XBBB on leg T3 at 1200Z but its previous leg T2 landed at XAAA
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn leg_unknown_refs() {
    insta::assert_snapshot!(validate_case("leg-unknown-refs"), @r#"
    3 error(s):
      legs/2026-06-14.json:5:106: legs[0].aircraft: unknown aircraft 'X-TINZ'; it is not in fleet/aircraft.json; did you mean X-TINA?
      legs/2026-06-14.json:6:15: legs[0].pilot: unknown pilot 'stu-ashe'; it is not in pilots.json; did you mean stu-ash?
      legs/2026-06-14.json:6:63: legs[0].from: unknown airfield 'XAAB'; add airfields/XAAB.json or fix the id; did you mean XAAA?
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn leg_wrong_day_file() {
    insta::assert_snapshot!(validate_case("leg-wrong-day-file"), @r#"
    1 error(s):
      legs/2026-06-14.json:5:32: legs[0].departs_at: departs on 2026-06-15 UTC, but this file holds the legs departing on 2026-06-14; move it to legs/2026-06-15.json
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn maintenance_without_note() {
    insta::assert_snapshot!(validate_case("maintenance-without-note"), @r#"
    1 error(s):
      fleet/aircraft.json:5:104: aircraft[1].status: status is `maintenance` but there is no `maintenance` note: add {"note": …, "since": "YYYY-MM-DD"}
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn missing_field() {
    insta::assert_snapshot!(validate_case("missing-field"), @r#"
    1 error(s):
      fleet/aircraft.json:4:5: aircraft[0]: missing field `empty_mass_kg`
    1 warning(s):
      fleet/aircraft.json:1:1: the cross-file checks (legs against airfields, aircraft and pilots) wait for fleet/aircraft.json to load: fix it and run validate again
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn missing_file() {
    insta::assert_snapshot!(validate_case("missing-file"), @r#"
    1 error(s):
      pilots.json:1:1: file is missing; every operator folder needs one (`rhoboard init DIR` writes a template)
    1 warning(s):
      pilots.json:1:1: the cross-file checks (legs against airfields, aircraft and pilots) wait for pilots.json to load: fix it and run validate again
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn misspelt_folder() {
    insta::assert_snapshot!(validate_case("misspelt-folder"), @r#"
    2 warning(s):
      airfield:1:1: not part of the operator-folder layout, so not read (expected in the folder: operator.json, pilots.json, fleet, airfields, legs, runway-state, observations, forecasts, signoffs)
      airfields/XDDD.JSON:1:1: not read: only .json files are read in this folder
    No errors (2 warning(s) above): 1 aircraft type(s), 2 aircraft, 2 pilot(s), 2 airfield(s), 2 leg(s), 1 observation and forecast file(s).
    exit 0
    "#);
}

#[test]
fn non_positive_distance() {
    insta::assert_snapshot!(validate_case("non-positive-distance"), @r#"
    2 error(s):
      fleet/types/tiny.json:17:29: performance.landing.distance_50ft_m[0][0][0]: distance 0 m must be positive
      fleet/types/tiny.json:18:27: performance.landing.ground_roll_m[0][0][0]: ground roll 140 m is longer than the 50 ft distance 0 m at the same point; one of them is mistyped
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn observation_rejected() {
    insta::assert_snapshot!(validate_case("observation-rejected"), @r#"
    1 warning(s):
      observations/2026-06-14.txt:3:1: report not usable: observation XAAA 140900Z: temperature/dew point group missing (expected e.g. 15/08)
    No errors (1 warning(s) above): 1 aircraft type(s), 2 aircraft, 2 pilot(s), 2 airfield(s), 2 leg(s), 1 observation and forecast file(s).
    exit 0
    "#);
}

#[test]
fn operator_two_categories() {
    insta::assert_snapshot!(validate_case("operator-two-categories"), @r#"
    2 error(s):
      operator.json:109:7: categories.student_solo.min_ceiling: unknown field `min_ceiling`, expected one of `takeoff_checks`, `landing_checks`, `wet_paved_landing_factor`, `min_climb_rate_fpm`, `min_ceiling_ft`, `min_visibility_m`, `max_wind_kt`, `max_gust_kt`, `max_gust_spread_kt`, `max_crosswind_kt`, `max_tailwind_kt`, `max_density_altitude_ft`, `daylight_only`, `refuse_hazards`, `solo_endorsement_valid_days`, `land_before_sunset_min`, `depart_after_sunrise_min`, `sources`
      operator.json:225:7: categories.dual.max_crosswind_kts: unknown field `max_crosswind_kts`, expected one of `takeoff_checks`, `landing_checks`, `wet_paved_landing_factor`, `min_climb_rate_fpm`, `min_ceiling_ft`, `min_visibility_m`, `max_wind_kt`, `max_gust_kt`, `max_gust_spread_kt`, `max_crosswind_kt`, `max_tailwind_kt`, `max_density_altitude_ft`, `daylight_only`, `refuse_hazards`, `solo_endorsement_valid_days`, `land_before_sunset_min`, `depart_after_sunrise_min`, `sources`
    1 warning(s):
      operator.json:1:1: the cross-file checks (legs against airfields, aircraft and pilots) wait for operator.json to load: fix it and run validate again
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn schema_errors_top_and_list() {
    insta::assert_snapshot!(validate_case("schema-errors-top-and-list"), @r#"
    2 error(s):
      airfields/XBBB.json:5:25: elevation_ft: invalid type: string "1200", expected a number (the unit is in the field name)
      airfields/XBBB.json:10:127: runway_ends[0].surface: unknown variant `gras`, expected `paved` or `grass`
    1 warning(s):
      legs/2026-06-14.json:6:76: legs[0].to: 'XBBB' is in airfields/XBBB.json, which failed to load (see its error); references to it are not checked until that file is fixed
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn schema_version() {
    insta::assert_snapshot!(validate_case("schema-version"), @r#"
    1 error(s):
      airfields/XBBB.json:2:21: schema_version: schema_version 2 is not one this build reads (1)
    1 warning(s):
      legs/2026-06-14.json:6:76: legs[0].to: 'XBBB' is in airfields/XBBB.json, which failed to load (see its error); references to it are not checked until that file is fixed
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn slope_signs() {
    insta::assert_snapshot!(validate_case("slope-signs"), @r#"
    1 error(s):
      airfields/XAAA.json:11:147: runway_ends[1].slope_percent: runway 27 slopes 1 % and its opposite end 09 slopes 1 %; opposite ends carry opposite signs (uphill one way is downhill the other)
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn table_shape() {
    insta::assert_snapshot!(validate_case("table-shape"), @r#"
    1 error(s):
      fleet/types/tiny.json:13:38: performance.takeoff.ground_roll_m[0][1]: expected 2 columns (one per oat_c value), found 1
    1 warning(s):
      fleet/aircraft.json:4:43: aircraft[0].type_id: 'tiny' is in fleet/types/tiny.json, which failed to load (see its error); references to it are not checked until that file is fixed
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn table_too_cool() {
    insta::assert_snapshot!(validate_case("table-too-cool"), @r#"
    1 warning(s):
      fleet/types/tiny.json:11:81: performance.axes.oat_c: tables stop at 40 °C while the folder's reports reach 43 °C; legs in that heat will be no-data
    No errors (1 warning(s) above): 1 aircraft type(s), 2 aircraft, 2 pilot(s), 2 airfield(s), 2 leg(s), 1 observation and forecast file(s).
    exit 0
    "#);
}

#[test]
fn three_errors_one_file() {
    insta::assert_snapshot!(validate_case("three-errors-one-file"), @r#"
    3 error(s):
      airfields/XBBB.json:6:19: latitude_deg: latitude 140.2 is outside -90 to 90
      airfields/XBBB.json:10:76: runway_ends[0].toda_m: TODA 650 m is shorter than TORA 700 m; TODA is TORA plus any clearway
      airfields/XBBB.json:10:105: runway_ends[0].lda_m: lda_m must be a positive number, found -700
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn tora_toda_asda() {
    insta::assert_snapshot!(validate_case("tora-toda-asda"), @r#"
    2 error(s):
      airfields/XAAA.json:10:75: runway_ends[0].toda_m: TODA 850 m is shorter than TORA 900 m; TODA is TORA plus any clearway
      airfields/XAAA.json:10:90: runway_ends[0].asda_m: ASDA 800 m is shorter than TORA 900 m; ASDA is TORA plus any stopway
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn unknown_fields() {
    insta::assert_snapshot!(validate_case("unknown-fields"), @r#"
    2 error(s):
      airfields/XAAA.json:10:50: runway_ends[0].tora: unknown field `tora`, expected one of `designator`, `true_heading_deg`, `tora_m`, `toda_m`, `asda_m`, `lda_m`, `surface`, `condition`, `slope_percent`, `required_climb_gradient`, `intersections`
      airfields/XAAA.json:11:130: runway_ends[1].surface: unknown variant `asphalt`, expected `paved` or `grass`
    1 warning(s):
      legs/2026-06-14.json:6:62: legs[0].from: 'XAAA' is in airfields/XAAA.json, which failed to load (see its error); references to it are not checked until that file is fixed
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn variation_sign() {
    insta::assert_snapshot!(validate_case("variation-sign"), @r#"
    2 error(s):
      airfields/XAAA.json:10:46: runway_ends[0].true_heading_deg: designator 09 disagrees with the magnetic heading 104° (true 92 − variation -12) by 14°; check the heading, the designator or the variation's sign (east positive)
      airfields/XAAA.json:11:46: runway_ends[1].true_heading_deg: designator 27 disagrees with the magnetic heading 284° (true 272 − variation -12) by 14°; check the heading, the designator or the variation's sign (east positive)
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn wrong_type() {
    insta::assert_snapshot!(validate_case("wrong-type"), @r#"
    1 error(s):
      airfields/XBBB.json:5:27: elevation_ft: invalid type: string "1200ft", expected a number (the unit is in the field name)
    1 warning(s):
      legs/2026-06-14.json:6:76: legs[0].to: 'XBBB' is in airfields/XBBB.json, which failed to load (see its error); references to it are not checked until that file is fixed
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

#[test]
fn loads_fuel_units() {
    insta::assert_snapshot!(validate_case("loads-fuel-units"), @r"
    3 error(s):
      legs/2026-06-14.json:7:15: legs[0].loads: give exactly one of fuel_at_start_l, fuel_at_start_usgal or fuel_at_start_kg
      legs/2026-06-14.json:7:29: legs[0].loads.stations[0]: standard masses are used but operator.json has no policy.standard_masses
      legs/2026-06-14.json:7:73: legs[0].loads.stations[1]: give mass_kg, standard_adults or standard_children
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    ");
}

#[test]
fn envelope_crossing() {
    insta::assert_snapshot!(validate_case("envelope-crossing"), @r"
    1 error(s):
      fleet/types/tiny.json:31:17: mass_balance.envelope: the CG envelope crosses itself; list its corners in order around the outline
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    ");
}

#[test]
fn runway_state_unknown_end() {
    insta::assert_snapshot!(validate_case("runway-state-unknown-end"), @r"
    3 error(s):
      runway-state/2026-06-14.json:5:33: entries[0].end: XAAA has no runway end '31' (it has: 09, 27)
      runway-state/2026-06-14.json:6:18: entries[1].airfield: unknown airfield 'XZZZ'
      runway-state/2026-06-14.json:7:49: entries[2].tora_m: -5 must be positive
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    ");
}

/// Finding 10: an unparseable airfield file no longer hides the cross-file checks. A
/// leg naming the airfield in the broken file is not called unknown (its file failed);
/// a truly unknown airfield is still named, with the nearest known id.
#[test]
fn every_problem_in_one_run() {
    insta::assert_snapshot!(validate_case("every-problem-in-one-run"), @r#"
    2 error(s):
      airfields/XBBB.json:5:25: colour: unknown field `colour`, expected one of `schema_version`, `replace_before_use`, `id`, `name`, `elevation_ft`, `latitude_deg`, `longitude_deg`, `magnetic_variation_deg`, `preferential_end`, `runway_ends`, `remarks`
      legs/2026-06-14.json:8:67: legs[1].to: unknown airfield 'XAAX'; add airfields/XAAX.json or fix the id; did you mean XAAA?
    1 warning(s):
      legs/2026-06-14.json:6:76: legs[0].to: 'XBBB' is in airfields/XBBB.json, which failed to load (see its error); references to it are not checked until that file is fixed
    Fix the errors above and run `rhoboard validate --ops DIR` again.
    exit 2
    "#);
}

/// `check` (as every command that uses a folder: board, report, runway, signoff) on a
/// folder that does not load names its first problems with file, line, column and
/// field, as `validate` does, rather than a bare count (trial finding).
#[test]
fn a_command_on_a_broken_folder_names_the_problems() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/bad-ops");
    for (case, want) in [
        ("json-syntax", 1),
        ("three-errors-one-file", 3),
        ("every-problem-in-one-run", 3),
    ] {
        let dir =
            std::env::temp_dir().join(format!("rhoboard-bad-use-{case}-{}", std::process::id()));
        let _ = std::fs::remove_dir_all(&dir);
        std::fs::create_dir_all(&dir).unwrap();
        copy_tree(&root.join("_base"), &dir);
        copy_tree(&root.join(case), &dir);
        let home = dir.join(".home");
        let o = std::process::Command::new(env!("CARGO_BIN_EXE_rhoboard"))
            .args(["check", "--ops"])
            .arg(&dir)
            .env("HOME", &home)
            .env("XDG_CONFIG_HOME", &home)
            .env("RHOBOARD_DATA_DIR", &home)
            .output()
            .unwrap();
        let err = String::from_utf8_lossy(&o.stderr).into_owned();
        assert_eq!(o.status.code(), Some(2), "{case}: {err}");
        // The same lines validate prints, each on its own line.
        let mut out = Vec::new();
        run(
            &Args {
                ops: Some(dir.clone()),
                json: false,
            },
            &mut out,
        )
        .unwrap();
        let listed = String::from_utf8(out).unwrap();
        // validate's error lines: those indented under "N error(s):".
        let errors: Vec<&str> = listed
            .lines()
            .skip_while(|l| !l.ends_with("error(s):"))
            .skip(1)
            .take_while(|l| l.starts_with("  "))
            .collect();
        assert!(!errors.is_empty(), "{case}: {listed}");
        let shown: Vec<&str> = err
            .lines()
            .filter(|l| l.starts_with("  ") && !l.contains("… and"))
            .collect();
        assert_eq!(shown.len(), want.min(errors.len()), "{case}: {err}");
        assert_eq!(shown[..], errors[..shown.len()], "{case}: {err}\n{listed}");
        if errors.len() > 3 {
            assert!(
                err.contains(&format!("… and {} more", errors.len() - 3)),
                "{err}"
            );
        }
        assert!(err.contains("rhoboard validate --ops"), "{err}");
        std::fs::remove_dir_all(&dir).unwrap();
    }
}

/// serde_json's words for the commonest slips are put in a writer's terms (trial nit:
/// "control character (\u0000-\u001F) found while parsing a string" for a missing
/// closing quote, "expected value" for a word without quotes), still at the file,
/// line and field.
#[test]
fn a_missing_quote_and_a_misspelt_word_are_said_plainly() {
    let base = rhoboard::ops::demo::files();
    let aircraft = base.files["fleet/aircraft.json"].clone();
    let first_reg = aircraft.find("\"X-TRNA\"").unwrap();
    for (broken, want) in [
        (
            // The registration's closing quote dropped.
            format!(
                "{}\"X-TRNA,{}",
                &aircraft[..first_reg],
                &aircraft[first_reg + "\"X-TRNA\",".len()..]
            ),
            "a text runs on past the end of its line: a closing quote \" is missing",
        ),
        (
            aircraft.replacen("\"available\"", "availabel", 1),
            "expected a value here: a number, a text in quotes, true or false, a list or an object",
        ),
    ] {
        let mut files = base.clone();
        files.files.insert("fleet/aircraft.json".into(), broken);
        let loaded = rhoboard::ops::load_files(&files);
        let e = loaded.report.errors.first().expect("an error");
        assert_eq!(e.file, "fleet/aircraft.json");
        assert!(e.message.contains(want), "{e}");
        assert!(e.line > 1, "{e}");
    }
}

/// A report rejected for a malformed group is placed at that group's column, as the
/// decoder and the board name it (trial nit: `:104:1:` beside "at column 40").
#[test]
fn a_rejected_report_is_placed_at_its_bad_group() {
    let mut files = rhoboard::ops::demo::files();
    let obs = files.files.get_mut("observations/2026-06-14.txt").unwrap();
    let line = obs.lines().count() + 1;
    // Q10155: column 39 of this line.
    let bad = "METAR XPIN 141230Z 31012KT 9999 28/02 Q10155";
    assert_eq!(bad.find("Q10155").map(|i| i + 1), Some(39));
    obs.push_str(bad);
    obs.push('\n');
    let loaded = rhoboard::ops::load_files(&files);
    let w = loaded
        .report
        .warnings
        .iter()
        .find(|w| w.line == line)
        .expect("warned");
    assert_eq!(w.column, 39, "{w}");
    assert!(w.message.contains("at column 39"), "{w}");
}
