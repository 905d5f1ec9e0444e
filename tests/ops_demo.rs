//! The built-in demo operator: it validates cleanly, the embedded copy is the committed
//! one, `init` writes a folder that validates, and the generator reproduces the
//! committed tables byte for byte.

use std::collections::BTreeSet;
use std::path::Path;

use rhoboard::ops::{self, OpsFiles, demo, demo_gen};

fn repo() -> &'static Path {
    Path::new(env!("CARGO_MANIFEST_DIR"))
}

#[test]
fn demo_validates_with_no_errors_and_no_warnings() {
    let loaded = demo::load();
    assert!(
        loaded.report.errors.is_empty(),
        "{:#?}",
        loaded.report.errors
    );
    assert!(
        loaded.report.warnings.is_empty(),
        "{:#?}",
        loaded.report.warnings
    );
    let ops = loaded.ops.unwrap();
    assert_eq!(ops.types.len(), 3);
    assert_eq!(ops.aircraft.len(), 8);
    assert_eq!(ops.airfields.len(), 9);
    assert_eq!(ops.legs.len(), 16);
    assert!(
        ops.aircraft
            .iter()
            .filter(|a| a.status == ops::Status::Maintenance)
            .count()
            == 1
    );
    for t in &ops.types {
        assert!(
            t.file.name.contains("Fictional")
                && t.file.name.contains("never use for a real aircraft")
        );
    }
    let elev: Vec<f64> = ops.airfields.iter().map(|a| a.elevation_ft).collect();
    assert!(elev.iter().any(|&e| e < 50.0) && elev.iter().any(|&e| e > 6500.0));
    assert!(ops.airfields.iter().all(|a| a.id.starts_with('X')));
}

#[test]
fn the_embedded_demo_is_every_committed_demo_file() {
    let mut on_disk = BTreeSet::new();
    for (root, prefix) in [("fixtures/demo", ""), ("fleet", "fleet/")] {
        let base = repo().join(root);
        let mut stack = vec![base.clone()];
        while let Some(d) = stack.pop() {
            for e in std::fs::read_dir(&d).unwrap() {
                let p = e.unwrap().path();
                if p.is_dir() {
                    stack.push(p);
                } else {
                    let rel = p
                        .strip_prefix(&base)
                        .unwrap()
                        .to_string_lossy()
                        .replace('\\', "/");
                    on_disk.insert(format!("{prefix}{rel}"));
                }
            }
        }
    }
    let embedded: BTreeSet<String> = demo::FILES.iter().map(|(k, _)| k.to_string()).collect();
    assert_eq!(embedded, on_disk, "update src/ops/demo.rs FILES");
    for (rel, text) in demo::FILES {
        let disk = if rel.starts_with("fleet/") {
            repo().join(rel)
        } else {
            repo().join("fixtures/demo").join(rel)
        };
        assert_eq!(std::fs::read_to_string(disk).unwrap(), *text, "{rel}");
    }
}

#[test]
fn generator_reproduces_the_committed_files_byte_for_byte() {
    for (path, text) in demo_gen::generated_files() {
        let committed = std::fs::read_to_string(repo().join(&path)).unwrap();
        assert!(
            committed == text,
            "{path} differs from the generator's output: run `cargo run --example gen_demo`"
        );
    }
}

#[test]
fn init_template_validates_with_only_replace_warnings() {
    let dir = std::env::temp_dir().join(format!("rhoboard-init-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let args = rhoboard::commands::init::Args {
        dir: dir.clone(),
        make_default: false,
    };
    let mut out = Vec::new();
    let outcome = rhoboard::commands::init::run(&args, &mut out).unwrap();
    assert_eq!(outcome, rhoboard::commands::Outcome::Success);
    for sub in [
        "operator.json",
        "pilots.json",
        "fleet/aircraft.json",
        "fleet/types",
        "airfields",
        "legs/2026-06-14.json",
        "observations",
    ] {
        assert!(dir.join(sub).exists(), "{sub}");
    }
    let loaded = ops::load_dir(&dir).unwrap();
    assert!(
        loaded.report.errors.is_empty(),
        "{:#?}",
        loaded.report.errors
    );
    let json_files = demo::FILES
        .iter()
        .filter(|(k, _)| k.ends_with(".json"))
        .count();
    assert_eq!(loaded.report.warnings.len(), json_files);
    assert!(
        loaded
            .report
            .warnings
            .iter()
            .all(|w| w.path == "replace_before_use")
    );
    insta::assert_snapshot!(loaded.report.warnings[0].to_string(), @"airfields/XBRK.json:3:25: replace_before_use: this file is still the fictional template from `rhoboard init`: replace its values with your own, then delete `replace_before_use`");
    // A second init into the same, now non-empty, folder refuses.
    let mut out = Vec::new();
    let err = rhoboard::commands::init::run(&args, &mut out).unwrap_err();
    assert!(
        err.to_string()
            .ends_with("exists and is not empty; choose a new folder (nothing was written)"),
        "{err}"
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn validate_command_on_the_demo_says_all_is_well() {
    let dir = std::env::temp_dir().join(format!("rhoboard-demo-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    demo::files().write_dir(&dir).unwrap();
    let mut out = Vec::new();
    let args = rhoboard::commands::validate::Args {
        ops: Some(dir.clone()),
        json: false,
    };
    let outcome = rhoboard::commands::validate::run(&args, &mut out).unwrap();
    assert_eq!(outcome, rhoboard::commands::Outcome::Success);
    let text = String::from_utf8(out).unwrap();
    let text = text.lines().skip(1).collect::<Vec<_>>().join("\n");
    insta::assert_snapshot!(text, @"All is well: 3 aircraft type(s), 8 aircraft, 6 pilot(s), 9 airfield(s), 16 leg(s), 2 observation and forecast file(s).");
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn observations_cover_every_demo_airfield_hourly() {
    let ops = demo::load().ops.unwrap();
    let text = &ops.observations[0].1;
    for a in &ops.airfields {
        let n = text
            .lines()
            .filter(|l| l.split_whitespace().nth(1) == Some(a.id.as_str()))
            .count();
        if a.id == "XSHT" {
            assert_eq!(n, 7, "XSHT's reports stop after 12Z by design");
        } else {
            assert_eq!(n, 12, "{}", a.id);
        }
    }
    assert!(text.lines().any(|l| l.contains("G28KT")), "one gusty hour");
    let _ = OpsFiles::default();
}

#[test]
fn every_demo_metar_decodes_cleanly() {
    use chrono::{TimeZone, Utc};
    let ops = demo::load().ops.unwrap();
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 18, 0, 0).unwrap();
    let reports = rhoboard::observation::file::decode_all(&ops.observations[0].1, reference);
    assert_eq!(reports.len(), 103);
    for r in &reports {
        let rep = &r.report;
        assert!(
            rep.usable_for_performance(),
            "line {}: {:?}",
            r.line,
            rep.error_lines()
        );
        assert!(
            rep.not_understood.is_empty(),
            "line {}: {:?}",
            r.line,
            rep.not_understood
        );
        assert!(ops.airfield(&rep.station).is_some(), "{}", rep.station);
        assert_eq!(
            rep.observed_at.unwrap().date_naive().to_string(),
            demo::DATE
        );
    }
}

#[test]
fn a_generated_operator_can_be_assembled_without_files() {
    // For benchmarks: parse the demo's pieces, multiply the airfields, assemble.
    use rhoboard::ops::{
        AircraftFile, AircraftType, Airfield, LegsFile, OperatorFile, Ops, PilotsFile,
    };
    let f = demo::files().files;
    let parse = |p: &str| f[p].clone();
    let operator: OperatorFile = serde_json::from_str(&parse("operator.json")).unwrap();
    let pilots: PilotsFile = serde_json::from_str(&parse("pilots.json")).unwrap();
    let aircraft: AircraftFile = serde_json::from_str(&parse("fleet/aircraft.json")).unwrap();
    let ty =
        AircraftType::new(serde_json::from_str(&parse("fleet/types/ft4.json")).unwrap()).unwrap();
    let field: Airfield = serde_json::from_str(&parse("airfields/XMES.json")).unwrap();
    let airfields: Vec<(String, Airfield)> = (0..2000)
        .map(|i| {
            let mut a = field.clone();
            a.id = format!("XB{i:04}");
            (format!("airfields/{}.json", a.id), a)
        })
        .collect();
    let legs: LegsFile = serde_json::from_str(&parse("legs/2026-06-14.json")).unwrap();
    let ops = Ops::new(
        operator,
        pilots,
        aircraft,
        vec![("fleet/types/ft4.json".into(), ty)],
        airfields,
        vec![("legs/2026-06-14.json".into(), legs)],
        Vec::new(),
    );
    assert_eq!(ops.airfield_position("XB1999"), Some(1999));
    assert!(ops.aircraft_type("ft4").is_some());
}
