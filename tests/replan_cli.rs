//! `rhoboard leg set`: re-planning from the command line, on a folder made by `init`.

use std::process::Command;

fn rhoboard(home: &std::path::Path, args: &[&str]) -> (i32, String, String) {
    let o = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .env("XDG_CONFIG_HOME", home)
        .env("HOME", home)
        .output()
        .unwrap();
    (
        o.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&o.stdout).into_owned(),
        String::from_utf8_lossy(&o.stderr).into_owned(),
    )
}

#[test]
fn the_afternoon_charter_is_re_planned_to_the_morning_and_saved() {
    let dir = std::env::temp_dir().join(format!("rhoboard-leg-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let home = dir.join("home");
    let ops = dir.join("ops");
    let d = ops.to_str().unwrap();
    assert_eq!(rhoboard(&home, &["init", d]).0, 0);
    let at = "2026-06-14T14:00:00Z";
    // Dry run: before and after, nothing written.
    let legs = ops.join("legs/2026-06-14.json");
    let original = std::fs::read_to_string(&legs).unwrap();
    let (code, out, err) = rhoboard(
        &home,
        &[
            "leg",
            "set",
            "L16",
            "--etd",
            "06:30Z",
            "--dry-run",
            "--ops",
            d,
            "--at",
            at,
        ],
    );
    assert_eq!(code, 0, "{err}");
    assert!(
        out.contains("before: ✗ below") && out.contains("after:  ✓ within"),
        "{out}"
    );
    assert!(out.contains("Dry run"), "{out}");
    // 06:30Z is before the assessment's 14:00Z: the leg would already have left.
    assert!(
        err.contains(
            "new departure 2026-06-14 0630Z is before the assessment's time 2026-06-14 1400Z"
        ),
        "{err}"
    );
    assert!(out.starts_with("L16 as of 2026-06-14 1400Z:"), "{out}");
    assert_eq!(std::fs::read_to_string(&legs).unwrap(), original);
    // Dropping the third passenger also makes it go, and says how much room is left.
    let (code, out, _) = rhoboard(
        &home,
        &[
            "leg",
            "set",
            "L16",
            "--unload",
            "rear_seats",
            "--dry-run",
            "--ops",
            d,
            "--at",
            at,
        ],
    );
    assert_eq!(code, 0);
    assert!(
        out.contains("after:  ✓ within") && out.contains("room for"),
        "{out}"
    );
    // Saved: the file changes, a hidden backup keeps the previous version, and the
    // folder still validates.
    let (code, out, err) = rhoboard(
        &home,
        &[
            "leg", "set", "L16", "--etd", "06:30Z", "--ops", d, "--at", at,
        ],
    );
    assert_eq!(code, 0, "{err}");
    assert!(out.contains("Saved"), "{out}");
    let now = std::fs::read_to_string(&legs).unwrap();
    assert!(
        now.contains("2026-06-14T06:30:00+00:00") || now.contains("2026-06-14T06:30:00Z"),
        "{now}"
    );
    let backup = |text: &str| {
        ops.join(format!(
            "legs/.2026-06-14.json.{}.bak",
            &rhoboard::replan::content_hash(text)[..12]
        ))
    };
    assert_eq!(
        std::fs::read_to_string(backup(&original)).unwrap(),
        original
    );
    // The same change again writes nothing; a further change keeps both backups.
    let (code, out, _) = rhoboard(
        &home,
        &[
            "leg", "set", "L16", "--etd", "06:30Z", "--ops", d, "--at", at,
        ],
    );
    assert_eq!(code, 0);
    assert!(out.contains("nothing written"), "{out}");
    let (code, _, err) = rhoboard(
        &home,
        &[
            "leg", "set", "L16", "--etd", "06:45Z", "--ops", d, "--at", at,
        ],
    );
    assert_eq!(code, 0, "{err}");
    assert_eq!(
        std::fs::read_to_string(backup(&original)).unwrap(),
        original,
        "the original's backup survives"
    );
    assert_eq!(std::fs::read_to_string(backup(&now)).unwrap(), now);
    assert_eq!(rhoboard(&home, &["validate", "--ops", d]).0, 0);
    // A stray temporary file (a crash between write and rename) is ignored and the
    // legs file is whole.
    std::fs::write(ops.join("legs/.2026-06-14.json.tmp-1"), "{ half a fi").unwrap();
    let (code, out, _) = rhoboard(&home, &["check", "--ops", d, "--leg", "L16", "--at", at]);
    assert!(code == 0 || code == 1, "{out}");
    // Bad input: exit 2 with the value quoted.
    let (code, _, err) = rhoboard(
        &home,
        &["leg", "set", "L16", "--aircraft", "X-NONE", "--ops", d],
    );
    assert_eq!(code, 2);
    assert!(err.contains("X-NONE"), "{err}");
    let (code, _, err) = rhoboard(
        &home,
        &["leg", "set", "L16", "--load", "baggage", "--ops", d],
    );
    assert_eq!(code, 2);
    assert!(err.contains("STATION=MASS"), "{err}");
    // On the built-in demo only a dry run is possible.
    let (code, _, err) = rhoboard(&home, &["leg", "set", "L16", "--etd", "06:30Z"]);
    assert_eq!(code, 2);
    assert!(err.contains("--dry-run"), "{err}");
    let _ = std::fs::remove_dir_all(&dir);
}

/// `rhoboard leg set L16 EDITS --ops DIR` at 14Z on the demo day.
fn set_l16(home: &std::path::Path, dir: &str, edits: &[&str]) -> (i32, String, String) {
    let mut args = vec!["leg", "set", "L16"];
    args.extend_from_slice(edits);
    args.extend(["--ops", dir, "--at", "2026-06-14T14:00:00Z"]);
    rhoboard(home, &args)
}

#[test]
fn a_saved_change_leaves_every_other_byte_of_the_legs_file_as_it_was() {
    let dir = tempfile::tempdir().unwrap();
    let home = dir.path().join("home");
    let ops = dir.path().join("ops");
    let d = ops.to_str().unwrap();
    assert_eq!(rhoboard(&home, &["init", d]).0, 0);
    let legs = ops.join("legs/2026-06-14.json");
    let original = std::fs::read_to_string(&legs).unwrap();
    let (code, out, err) = set_l16(&home, d, &["--load", "baggage=15kg", "--fuel", "110L"]);
    assert!(code == 0 || code == 1, "{err}");
    assert!(out.contains("Saved"), "{out}");
    let now = std::fs::read_to_string(&legs).unwrap();
    let (before, after): (Vec<_>, Vec<_>) = (original.lines().collect(), now.lines().collect());
    assert_eq!(before.len(), after.len(), "{now}");
    let changed: Vec<(&str, &str)> = before
        .iter()
        .zip(&after)
        .filter(|(a, b)| a != b)
        .map(|(a, b)| (a.trim(), b.trim()))
        .collect();
    // The two values typed, as typed (whole numbers stay whole); nothing else moves.
    assert_eq!(
        changed,
        [
            ("\"mass_kg\": 10", "\"mass_kg\": 15"),
            ("\"fuel_at_start_l\": 125,", "\"fuel_at_start_l\": 110,"),
        ],
        "{now}"
    );
    assert_eq!(original.ends_with('\n'), now.ends_with('\n'));
    // The backup holds the original and the folder still validates.
    let backup = ops.join(format!(
        "legs/.2026-06-14.json.{}.bak",
        &rhoboard::replan::content_hash(&original)[..12]
    ));
    assert_eq!(std::fs::read_to_string(backup).unwrap(), original);
    assert_eq!(rhoboard(&home, &["validate", "--ops", d]).0, 0);
    // A departure time typed as 06:30Z is written in the file's UTC style.
    let (code, _, err) = set_l16(&home, d, &["--etd", "06:30Z"]);
    assert!(code == 0 || code == 1, "{err}");
    let later = std::fs::read_to_string(&legs).unwrap();
    assert!(
        later.contains("\"departs_at\": \"2026-06-14T06:30:00Z\""),
        "{later}"
    );
    assert!(
        later.contains("\"arrives_at\": \"2026-06-14T07:25:00Z\""),
        "{later}"
    );
    assert_eq!(later.lines().count(), now.lines().count());
}

/// A fresh `init` folder under a per-test temporary directory.
fn init_folder(tag: &str) -> (std::path::PathBuf, std::path::PathBuf, String) {
    let dir = std::env::temp_dir().join(format!("rhoboard-leg-{tag}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let home = dir.join("home");
    let ops = dir.join("ops");
    assert_eq!(rhoboard(&home, &["init", ops.to_str().unwrap()]).0, 0);
    (dir, home, ops.to_str().unwrap().to_string())
}

#[test]
fn what_validate_calls_an_error_is_refused_and_never_written() {
    let (dir, home, d) = init_folder("refuse");
    let legs = dir.join("ops/legs/2026-06-14.json");
    let original = std::fs::read_to_string(&legs).unwrap();
    // X-TRND is in maintenance in the init folder.
    let (code, out, err) = rhoboard(
        &home,
        &["leg", "set", "L01", "--aircraft", "X-TRND", "--ops", &d],
    );
    assert_eq!(code, 2, "{out}{err}");
    assert!(
        err.contains("X-TRND is in maintenance") && err.contains("not changed"),
        "{err}"
    );
    // L16's six-seat loads on a two-seat trainer: the stations the type has are named.
    let (code, _, err) = rhoboard(
        &home,
        &["leg", "set", "L16", "--aircraft", "X-TRNA", "--ops", &d],
    );
    assert_eq!(code, 2);
    assert!(
        err.contains("has no loading station 'front_seats' (it has: seats, baggage)"),
        "{err}"
    );
    // A station the type does not have, given directly (refused even on a dry run).
    let (code, _, err) = rhoboard(
        &home,
        &[
            "leg",
            "set",
            "L16",
            "--load",
            "cargo_pod=20kg",
            "--dry-run",
            "--ops",
            &d,
        ],
    );
    assert_eq!(code, 2);
    assert!(err.contains("no loading station 'cargo_pod'"), "{err}");
    // The aircraft on two legs at once: L09 holds X-TOUA 1200–1300Z, L16 is 1230Z.
    let (code, _, err) = rhoboard(
        &home,
        &["leg", "set", "L16", "--aircraft", "X-TOUA", "--ops", &d],
    );
    assert_eq!(code, 2);
    assert!(err.contains("X-TOUA is on leg L09 until 1300Z"), "{err}");
    assert_eq!(
        std::fs::read_to_string(&legs).unwrap(),
        original,
        "nothing written"
    );
    // And the folder still validates.
    assert_eq!(rhoboard(&home, &["validate", "--ops", &d]).0, 0);
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn an_overlapping_pilot_or_a_broken_chain_is_warned_on_stderr_and_in_the_json() {
    let (dir, home, d) = init_folder("warn");
    let at = "2026-06-14T14:00:00Z";
    // X-UTLA lands L07 at XMES and flies L11 from XMES at 1330Z: L16 (XPIN→XSEA) between.
    let (code, out, err) = rhoboard(
        &home,
        &[
            "leg",
            "set",
            "L16",
            "--aircraft",
            "X-UTLA",
            "--ops",
            &d,
            "--at",
            at,
            "--json",
        ],
    );
    assert!(code == 0 || code == 1, "{err}");
    assert!(
        err.contains("warning:")
            && err.contains("on leg L11 at 1330Z but its previous leg L16 landed at XSEA"),
        "{err}"
    );
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let w = v["warnings"].as_array().unwrap();
    assert!(w.iter().any(|w| w.as_str().unwrap().contains("L11")), "{v}");
    assert!(v["saved"]["backup"].is_string(), "{v}");
    // pil-juno flies L09 until 1300Z; naming her on L16 (1230Z) is warned, not refused.
    let (code, out, err) = rhoboard(
        &home,
        &[
            "leg",
            "set",
            "L16",
            "--pilot",
            "pil-juno",
            "--dry-run",
            "--json",
            "--ops",
            &d,
            "--at",
            at,
        ],
    );
    assert!(code == 0 || code == 1, "{err}");
    assert!(
        err.contains("pilot pil-juno is on leg L09 until 1300Z, which overlaps leg L16"),
        "{err}"
    );
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    assert!(
        v["warnings"][0].as_str().unwrap().contains("pil-juno"),
        "{v}"
    );
    assert!(v["saved"].is_null());
    let _ = std::fs::remove_dir_all(&dir);
}

/// A leg below on a hard limit (L08's lapsed solo endorsement) summarises as the check
/// alone: no dash and no second "below" where a margin in numbers would go.
#[test]
fn a_hard_limit_summary_names_the_check_without_a_margin_word() {
    let (dir, home, d) = init_folder("hard-limit");
    let (code, out, err) = rhoboard(
        &home,
        &[
            "leg",
            "set",
            "L08",
            "--etd",
            "11:30Z",
            "--dry-run",
            "--ops",
            &d,
            "--at",
            "2026-06-14T13:00:00Z",
        ],
    );
    assert_eq!(code, 1, "{out}{err}");
    let lines: Vec<&str> = out
        .lines()
        .filter(|l| l.contains("before:") || l.contains("after:"))
        .collect();
    assert_eq!(lines.len(), 2, "{out}");
    for line in lines {
        assert!(
            line.ends_with("✗ below XSHT endorsement, headroom —"),
            "{line}"
        );
    }
    let _ = std::fs::remove_dir_all(&dir);
}

/// Without `--at`, a leg of another day is assessed on the reports known now: the
/// heading names both the leg's day and that time.
#[test]
fn a_leg_of_another_day_names_its_day_and_the_time_of_the_reports() {
    let (dir, home, d) = init_folder("other-day");
    let (code, out, err) = rhoboard(
        &home,
        &[
            "leg",
            "set",
            "L16",
            "--fuel",
            "100L",
            "--dry-run",
            "--ops",
            &d,
        ],
    );
    assert!(code == 0 || code == 1, "{err}");
    assert!(
        out.starts_with("L16 of 2026-06-14, assessed on the reports known at "),
        "{out}"
    );
    let _ = std::fs::remove_dir_all(&dir);
}

/// The payload in words is rounded the safe way against the JSON's exact figure: room
/// down (57.5 kg → 57), what must come off up.
#[test]
fn payload_words_round_room_down_and_removal_up() {
    let (dir, home, d) = init_folder("payload");
    let edits = ["--unload", "rear_seats", "--dry-run"];
    let (_, out, err) = set_l16(&home, &d, &edits);
    let mut json_args = edits.to_vec();
    json_args.push("--json");
    let (_, json, _) = set_l16(&home, &d, &json_args);
    let v: serde_json::Value = serde_json::from_str(&json).expect("JSON");
    let kg = v["after"]["mass_balance"]["payload_headroom_kg"]
        .as_f64()
        .expect("a payload figure");
    let want = if kg >= 0.0 {
        format!("room for {:.0} kg", kg.floor())
    } else {
        format!("remove {:.0} kg", (-kg).ceil())
    };
    assert!(out.contains(&want), "{want} in {out}{err}");
    let _ = std::fs::remove_dir_all(&dir);
}

/// `--unload` of a station the leg has nothing at (a typo) is refused by name, never a
/// silent no-op that reads as done; emptying the pilot's seat is refused as validate
/// would (trial findings).
#[test]
fn unloading_nothing_or_the_pilot_is_refused() {
    let home = tempfile::tempdir().unwrap();
    let at = ["--dry-run", "--at", "2026-06-14T13:00:00Z"];
    let run = |extra: &[&str]| {
        let mut args = vec!["leg", "set", "L16"];
        args.extend_from_slice(extra);
        args.extend_from_slice(&at);
        rhoboard(home.path(), &args)
    };
    let (code, out, err) = run(&["--unload", "rear_seat"]);
    assert_eq!(code, 2, "{out}");
    assert!(
        err.contains(
            "leg L16 has nothing at 'rear_seat' to take off (loaded: front_seats, middle_seats, rear_seats, baggage)"
        ),
        "{err}"
    );
    let (code, out, err) = run(&["--unload", "front_seats"]);
    assert_eq!(code, 2, "{out}");
    assert!(
        err.contains("nobody at front_seats (Pilot and front passenger), the type's first seats, where the pilot sits"),
        "{err}"
    );
    // A real change still goes through.
    let (code, out, err) = run(&["--unload", "rear_seats"]);
    assert_ne!(code, 2, "{err}");
    assert!(out.contains("Dry run"), "{out}");
}
