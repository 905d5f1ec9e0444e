//! The forecast look-ahead on the demo day: at the 08:00Z morning review, the TAFs name
//! the afternoon legs that the observed day then breaks.

use std::process::Command;

use serde_json::Value;

fn check(args: &[&str]) -> Value {
    let home = std::env::temp_dir().join(format!("rhoboard-fc-{}", std::process::id()));
    let o = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .env("XDG_CONFIG_HOME", &home)
        .env("HOME", &home)
        .output()
        .unwrap();
    serde_json::from_str(&String::from_utf8_lossy(&o.stdout)).expect("JSON")
}

#[test]
fn the_morning_forecast_names_the_legs_the_afternoon_breaks() {
    let morning = check(&[
        "check",
        "--json",
        "--forecast",
        "--at",
        "2026-06-14T08:00:00Z",
    ]);
    let afternoon = check(&["check", "--json", "--at", "2026-06-14T16:00:00Z"]);
    let legs = |v: &Value| v["legs"].as_array().unwrap().clone();
    let mut named = 0;
    for (m, a) in legs(&morning).iter().zip(legs(&afternoon).iter()) {
        assert_eq!(m["id"], a["id"]);
        let f = &m["forecast"];
        assert!(f["basis"].as_str().unwrap().contains("TAF"), "{f}");
        if a["state"] == "below" && m["state"] != "below" {
            // Broken later in the observed day: the morning forecast saw it coming —
            // below at its planned time, or failing from a time before it departs.
            let departs = m["departs_at"].as_str().unwrap();
            let fails = f["fails_from"].as_str();
            let foreseen = f["state"] == "below" || fails.is_some_and(|t| t <= departs);
            assert!(foreseen, "{}: forecast {f}", m["id"]);
            named += 1;
        }
        // A forecast never turns an observed below into anything better.
        if m["state"] == "below" {
            assert_eq!(f["state"], "below");
        }
    }
    assert!(named >= 3, "only {named} legs broken in the afternoon");
}

#[test]
fn the_forecast_is_kept_apart_from_the_observed_result() {
    let v = check(&[
        "check",
        "--json",
        "--forecast",
        "--leg",
        "L14",
        "--at",
        "2026-06-14T08:00:00Z",
    ]);
    let l = &v["legs"][0];
    assert_eq!(l["state"], "thin", "observed");
    assert!(l["forecast"]["state"].is_string());
    assert!(l["forecast"]["fails_from"].is_string());
    // Without --forecast there is no forecast key at all.
    let v = check(&[
        "check",
        "--json",
        "--leg",
        "L14",
        "--at",
        "2026-06-14T08:00:00Z",
    ]);
    assert!(v["legs"][0].get("forecast").is_none());
}

/// At 14Z L10 is observed `no-data` (its report is stale): its look-ahead is the
/// forecast alone and says so, in the JSON's basis and on the report's sheet, where it
/// never reads as a plain forecast state better than the observation.
#[test]
fn an_observed_no_data_leg_shows_its_forecast_as_forecast_only() {
    let v = check(&[
        "check",
        "--json",
        "--forecast",
        "--at",
        "2026-06-14T14:00:00Z",
    ]);
    let legs = v["legs"].as_array().unwrap();
    let mut seen = 0;
    for l in legs {
        let basis = l["forecast"]["basis"].as_str().unwrap_or("");
        if l["state"] == "no-data" && l["forecast"]["state"].is_string() {
            assert!(basis.starts_with("forecast only"), "{}: {basis}", l["id"]);
            seen += 1;
        } else {
            assert!(!basis.starts_with("forecast only"), "{}: {basis}", l["id"]);
        }
    }
    assert!(seen >= 1, "the 14Z demo has a leg observed no-data");
    // On the sheet a leg gone by then says so (L10 landed 1345Z), so L10 is moved to
    // 1345Z in a copy of the demo and seen at 1330Z: still ahead, XSHT's 12Z report stale.
    let dir = std::env::temp_dir().join(format!("rhoboard-fc-sheet-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    let ops = dir.join("ops");
    let run = |args: &[&str]| {
        Command::new(env!("CARGO_BIN_EXE_rhoboard"))
            .args(args)
            .env("XDG_CONFIG_HOME", &dir)
            .env("HOME", &dir)
            .env("RHOBOARD_DATA_DIR", &dir)
            .output()
            .unwrap()
    };
    let d = ops.to_str().unwrap();
    assert!(run(&["init", d]).status.success());
    let o = run(&[
        "leg",
        "set",
        "L10",
        "--etd",
        "13:45Z",
        "--at",
        "2026-06-14T13:30:00Z",
        "--ops",
        d,
    ]);
    // Saved (exit 1: the moved leg is no-data at 14Z, as `check` would say).
    assert_eq!(
        o.status.code(),
        Some(1),
        "{}",
        String::from_utf8_lossy(&o.stderr)
    );
    let text = String::from_utf8_lossy(
        &run(&[
            "check",
            "--forecast",
            "--at",
            "2026-06-14T13:30:00Z",
            "--ops",
            d,
        ])
        .stdout,
    )
    .into_owned();
    assert!(text.contains("  L10   forecast forecast only: "), "{text}");
    let md = dir.join("sheet.md");
    let o = run(&[
        "report",
        "--at",
        "2026-06-14T13:30:00Z",
        "--ops",
        d,
        "--out",
        md.to_str().unwrap(),
    ]);
    // Exit status 1: some leg is below or no-data, as for `check`.
    assert_eq!(
        o.status.code(),
        Some(1),
        "{}",
        String::from_utf8_lossy(&o.stderr)
    );
    let text = std::fs::read_to_string(&md).unwrap();
    let l10 = text
        .lines()
        .find(|l| l.starts_with("| L10 |") && l.contains("forecast"))
        .unwrap_or_else(|| panic!("L10's forecast row in\n{text}"));
    assert!(l10.contains("forecast only:"), "{l10}");
    assert!(l10.contains("(no usable observation)"), "{l10}");
}
