//! `rhoboard calc` end to end through the built binary: output, JSON keys, exit codes.

use std::process::Command;

fn rhoboard(args: &[&str]) -> (i32, String, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .output()
        .expect("the binary runs");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

const DONE_WHEN: [&str; 9] = [
    "calc",
    "--elevation",
    "5900ft",
    "--altimeter",
    "30.12inHg",
    "--temp",
    "31C",
    "--dewpoint",
    "8C",
];

/// The issue's "done when" case. Expected values from the reference libraries in the same
/// way as fixtures/reference/atmosphere.json (ambiance 1.3.1 + metpy 1.7.1, see
/// scripts/atmosphere_reference.py, case "5900 ft, 30.12inHg, 31 C, 8 C"): pressure
/// altitude 5,717 ft, station pressure 820.70 hPa, density altitude 8,93x ft.
#[test]
fn calc_json_has_the_documented_keys_and_values() {
    let mut args = DONE_WHEN.to_vec();
    args.extend(["--ias", "65kt", "--json"]);
    let (code, stdout, stderr) = rhoboard(&args);
    assert_eq!(code, 0, "{stderr}");
    let v: serde_json::Value = serde_json::from_str(&stdout).expect("JSON");
    for key in [
        "pressure_altitude_ft",
        "density_altitude_ft",
        "density_altitude_dry_ft",
        "density_altitude_rule_of_thumb_ft",
        "isa_temperature_c",
        "isa_deviation_c",
        "station_pressure_hpa",
        "air_density_kg_m3",
        "density_ratio",
        "true_airspeed_factor",
        "true_airspeed_kt",
    ] {
        assert!(v[key].is_number(), "{key} missing in {stdout}");
    }
    let reference: serde_json::Value =
        serde_json::from_str(include_str!("../fixtures/reference/atmosphere.json")).unwrap();
    let case = reference["cases"]
        .as_array()
        .unwrap()
        .iter()
        .find(|c| c["elevation_ft"] == 5900 && c["altimeter"] == "30.12inHg")
        .expect("the reference fixture holds the 5900 ft case");
    let num = |v: &serde_json::Value| v.as_f64().unwrap();
    assert!((num(&v["pressure_altitude_ft"]) - num(&case["pressure_altitude_ft"])).abs() < 3.0);
    assert!((num(&v["density_altitude_ft"]) - num(&case["density_altitude_ft"])).abs() < 15.0);
    assert!((num(&v["station_pressure_hpa"]) - num(&case["station_pressure_hpa"])).abs() < 0.15);
    // TAS = IAS / sqrt(sigma).
    let tas = num(&v["true_airspeed_kt"]);
    assert!((tas - 65.0 / num(&v["density_ratio"]).sqrt()).abs() < 1e-9);
}

#[test]
fn calc_without_dew_point_reports_dry_density_altitude_for_both() {
    let (code, stdout, _) = rhoboard(
        &DONE_WHEN[..7]
            .iter()
            .copied()
            .chain(["--json"])
            .collect::<Vec<_>>(),
    );
    assert_eq!(code, 0);
    let v: serde_json::Value = serde_json::from_str(&stdout).unwrap();
    assert_eq!(v["density_altitude_ft"], v["density_altitude_dry_ft"]);
    assert!(v["dewpoint_c"].is_null());
    assert!(v.get("true_airspeed_kt").is_none());
}

#[test]
fn calc_human_output_names_units_and_the_caution() {
    let (code, stdout, _) = rhoboard(&DONE_WHEN);
    assert_eq!(code, 0);
    for needle in [
        "5,717 ft",
        "820.7 hPa",
        "ISA +27.3 °C",
        "density altitude",
        "Planning aid only",
    ] {
        assert!(stdout.contains(needle), "{needle} not in\n{stdout}");
    }
}

#[test]
fn bad_input_exits_2_with_one_line_quoting_the_value() {
    let cases: [(&[&str], &str); 6] = [
        (
            &[
                "calc",
                "--elevation",
                "5900",
                "--altimeter",
                "30.12inHg",
                "--temp",
                "31C",
            ],
            "'5900'",
        ),
        (
            &[
                "calc",
                "--elevation",
                "5900ft",
                "--altimeter",
                "1200hPa",
                "--temp",
                "31C",
            ],
            "'1200hPa'",
        ),
        (
            &[
                "calc",
                "--elevation",
                "5900ft",
                "--altimeter",
                "30.12inHg",
                "--temp",
                "-70C",
            ],
            "'-70C'",
        ),
        (
            &[
                "calc",
                "--elevation",
                "-2000ft",
                "--altimeter",
                "30.12inHg",
                "--temp",
                "31C",
            ],
            "'-2000ft'",
        ),
        (
            &[
                "calc",
                "--elevation",
                "5900ft",
                "--altimeter",
                "30.12inHg",
                "--temp",
                "31C",
                "--dewpoint",
                "35C",
            ],
            "'35C'",
        ),
        (
            &[
                "calc",
                "--elevation",
                "5900ft",
                "--altimeter",
                "30.12 furlongs",
                "--temp",
                "31C",
            ],
            "'furlongs'",
        ),
    ];
    for (args, quoted) in cases {
        let (code, stdout, stderr) = rhoboard(args);
        assert_eq!(code, 2, "{args:?}: {stderr}");
        assert!(stdout.is_empty());
        assert_eq!(stderr.trim_end().lines().count(), 1, "one line: {stderr}");
        assert!(stderr.contains(quoted), "{quoted} not in {stderr}");
        assert!(!stderr.contains("panicked"));
    }
}

#[test]
fn garbage_never_panics_the_binary() {
    let garbage = [
        "",
        "\u{7f}",
        "ft",
        "--",
        "NaNft",
        "infhPa",
        "1e999C",
        "💥",
        "-",
        "9".repeat(400).leak(),
    ];
    for g in garbage {
        for flag in [
            "--elevation",
            "--altimeter",
            "--temp",
            "--dewpoint",
            "--ias",
        ] {
            let mut args = vec![
                "calc",
                "--elevation",
                "1000ft",
                "--altimeter",
                "1013hPa",
                "--temp",
                "15C",
            ];
            args.extend([flag, g]);
            let (code, _, stderr) = rhoboard(&args);
            assert!(code == 0 || code == 2, "{flag} {g:?}: {code} {stderr}");
            assert!(!stderr.contains("panicked"), "{flag} {g:?}: {stderr}");
        }
    }
}

#[test]
fn no_arguments_prints_the_overview_with_a_worked_example() {
    let (code, stdout, _) = rhoboard(&[]);
    assert_eq!(code, 0);
    assert!(stdout.contains("Planning aid only"));
    assert!(stdout.contains("density altitude 8,9"), "{stdout}");
    assert!(!stdout.to_lowercase().contains("not implemented"));
}

/// A value typed as the program prints it ("5,900 ft") reads the same as without the
/// comma; without a dew point the dry-air figure is given once, not twice.
#[test]
fn thousands_separators_and_one_dry_air_line() {
    let mut args = DONE_WHEN[..7].to_vec();
    let (code, plain, stderr) = rhoboard(&args);
    assert_eq!(code, 0, "{stderr}");
    args[2] = "5,900ft";
    let (code, grouped, stderr) = rhoboard(&args);
    assert_eq!(code, 0, "{stderr}");
    assert_eq!(plain, grouped);
    assert_eq!(plain.matches("dry air").count(), 2, "{plain}");
    assert!(plain.contains("no dew point (dry air assumed)"), "{plain}");
    assert!(!plain.contains("\n    dry air"), "{plain}");
    let (code, _, stderr) = rhoboard(&[
        "calc",
        "--elevation",
        "5,90ft",
        "--altimeter",
        "1013hPa",
        "--temp",
        "15C",
    ]);
    assert_eq!(code, 2);
    assert!(stderr.contains("'5,90ft'"), "{stderr}");
}

/// The README's `calc` sample is the program's output, byte for byte (trial finding:
/// the sample had lost its closing lines).
#[test]
fn the_readme_sample_is_the_output() {
    let readme =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/README.md")).expect("README");
    let at = readme.find("## `rhoboard calc`").expect("the calc section");
    let sample = readme[at..]
        .split("```\n")
        .nth(2)
        .expect("the output block");
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args([
            "calc",
            "--elevation",
            "5900ft",
            "--altimeter",
            "30.12inHg",
            "--temp",
            "31C",
            "--dewpoint",
            "8C",
        ])
        .output()
        .expect("runs");
    assert_eq!(String::from_utf8_lossy(&out.stdout), sample);
}

/// A unit typed apart from its number (`--elevation 5900 ft`) is named with the fix
/// (trial finding: clap's bare "unexpected argument 'ft'").
#[test]
fn a_unit_apart_from_its_number_is_named_with_the_fix() {
    let (code, out, err) = rhoboard(&[
        "calc",
        "--elevation",
        "5900",
        "ft",
        "--altimeter",
        "1013hPa",
        "--temp",
        "20C",
    ]);
    assert_eq!(code, 2);
    assert!(out.is_empty(), "{out}");
    assert!(
        err.contains("'ft' is not an option: a unit goes with its number, with no space between"),
        "{err}"
    );
}
