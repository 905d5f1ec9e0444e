//! `rhoboard signoff` and `rhoboard log show` through the binary, on a copy of the demo
//! operator folder: what a record keeps, the refusal rules and their exit codes,
//! override, revocation, supersession, and the demo's log in the data dir.

#[path = "common/signoff.rs"]
mod signoff_common;

use std::path::Path;
use std::process::{Command, Output};

use rhoboard::signoff::{Kind, Log, sha256_hex};
use signoff_common::demo_folder;

fn rhoboard(args: &[&str], data_dir: &Path) -> Output {
    Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .env("RHOBOARD_DATA_DIR", data_dir)
        // No developer's configured default folder: the demo is the demo.
        .env("XDG_CONFIG_HOME", data_dir)
        .env("HOME", data_dir)
        .env_remove("RHOBOARD_TEST_SPLIT_WRITE_MS")
        .output()
        .expect("run rhoboard")
}

fn text(o: &Output) -> String {
    format!(
        "{}{}",
        String::from_utf8_lossy(&o.stdout),
        String::from_utf8_lossy(&o.stderr)
    )
}

fn sign(dir: &Path, leg: &str, at: &str, extra: &[&str]) -> Output {
    let d = dir.to_str().expect("utf-8 path");
    let mut args = vec![
        "signoff",
        leg,
        "--instructor",
        "Mara Greyling",
        "--ops",
        d,
        "--at",
        at,
    ];
    args.extend_from_slice(extra);
    rhoboard(&args, dir)
}

const MORNING: &str = "2026-06-14T08:00:00Z";
const AFTERNOON: &str = "2026-06-14T13:00:00Z";

#[test]
fn a_within_leg_is_signed_with_its_basis() {
    let dir = demo_folder();
    let o = sign(
        dir.path(),
        "L09",
        MORNING,
        &["--note", "briefed the density altitude at XPIN"],
    );
    assert_eq!(o.status.code(), Some(0), "{}", text(&o));
    assert!(
        text(&o).contains("signed L09 of 2026-06-14 (within)"),
        "{}",
        text(&o)
    );
    assert!(text(&o).contains("log head 1:"), "{}", text(&o));
    // The planning-aid statement goes with every sign-off (trial nit: it was missing).
    assert!(text(&o).contains(rhoboard::CAUTION), "{}", text(&o));
    // An empty instructor is bad input, exit 2 (trial nit: it was a refusal, exit 1).
    let d = dir.path().to_str().expect("utf-8");
    let empty = rhoboard(
        &[
            "signoff",
            "L09",
            "--instructor",
            " ",
            "--ops",
            d,
            "--at",
            MORNING,
        ],
        dir.path(),
    );
    assert_eq!(empty.status.code(), Some(2), "{}", text(&empty));
    assert!(
        text(&empty).contains("--instructor: give the name"),
        "{}",
        text(&empty)
    );

    let chain = Log::of_operator(dir.path()).read().expect("read");
    assert!(chain.is_sound(), "{:?}", chain.problems);
    let r = &chain.entries[0].record;
    assert_eq!((r.seq, r.kind, r.leg.as_str()), (1, Kind::SignOff, "L09"));
    assert_eq!(r.aircraft, "X-TOUA");
    assert_eq!(r.pilot, "pil-juno");
    assert_eq!(r.instructor, "Mara Greyling");
    assert_eq!(r.note, "briefed the density altitude at XPIN");
    assert_eq!(r.basis_at.to_rfc3339(), "2026-06-14T08:00:00+00:00");
    assert_ne!(r.signed_at, r.basis_at, "signed_at is the real time");
    assert_eq!(r.rhoboard_version, env!("CARGO_PKG_VERSION"));
    let f = r.figures.as_ref().expect("figures");
    assert_eq!(f.state, "within");
    assert!(f.headroom_c.is_some_and(|h| h > 0.0));
    assert!(f.departure.density_altitude_ft.is_some());
    assert!(f.arrival.density_altitude_ft.is_some());
    assert!(
        f.departure
            .report
            .as_ref()
            .is_some_and(|r| r.text.starts_with("METAR XKNL"))
    );
    assert!(
        f.arrival
            .report
            .as_ref()
            .is_some_and(|r| r.text.starts_with("METAR XPIN"))
    );
    assert!(
        !f.departure.checks.is_empty() && f.departure.checks.iter().all(|c| c.phase == "takeoff")
    );
    assert!(!f.arrival.checks.is_empty() && f.arrival.checks.iter().all(|c| c.phase == "landing"));
    assert!(
        f.departure
            .checks
            .iter()
            .all(|c| c.required_m > 0.0 && c.available_m > 0.0)
    );
    let climb = f.departure.climb.as_ref().expect("climb");
    assert!(climb.rate_fpm > 0.0 && climb.gradient_ft_per_nm > 0.0);
    assert!(f.departure.headwind_kt.is_some() && f.departure.crosswind_kt.is_some());
    // The hash of each operator file is the SHA-256 of its bytes.
    let op = r
        .data
        .files
        .iter()
        .find(|h| h.path == "operator.json")
        .expect("operator.json hashed");
    let bytes = std::fs::read(dir.path().join("operator.json")).expect("read");
    assert_eq!(op.sha256, sha256_hex(&bytes));
    assert!(
        r.data
            .files
            .iter()
            .any(|h| h.path == "observations/2026-06-14.txt")
    );
    assert_eq!(r.data.combined_sha256.len(), 64);
}

#[test]
fn below_and_no_data_legs_are_refused_unless_the_policy_allows_an_override() {
    let dir = demo_folder();
    // L09 (solo) is below at 13Z and the demo policy allows overrides for dual only:
    // with or without an override, the refusal says up front that none is allowed and
    // does not send the instructor to `--override`.
    for extra in [&[][..], &["--override", "ferry home"][..]] {
        let o = sign(dir.path(), "L09", AFTERNOON, extra);
        assert_eq!(o.status.code(), Some(1), "{}", text(&o));
        let t = text(&o);
        assert!(t.contains("refused: leg L09 is ✗ below"), "{t}");
        assert!(
            t.contains(
                "it cannot be signed: the policy allows no override for solo legs \
                 (policy.sign_off.override_categories: dual)"
            ),
            "{t}"
        );
        assert!(!t.contains("needs --override"), "{t}");
    }
    // L15 (dual) is below at 13Z with no override given: the refusal names the way.
    let o = sign(dir.path(), "L15", AFTERNOON, &[]);
    assert_eq!(o.status.code(), Some(1), "{}", text(&o));
    assert!(
        text(&o).contains("signing it needs --override REASON (allowed for: dual)"),
        "{}",
        text(&o)
    );
    // L15 (dual) is below at 13Z: an override is allowed and recorded.
    let o = sign(
        dir.path(),
        "L15",
        AFTERNOON,
        &["--override", "instructor on board, 60 kg less fuel"],
    );
    assert_eq!(o.status.code(), Some(0), "{}", text(&o));
    assert!(
        text(&o).contains("OVERRIDE: instructor on board"),
        "{}",
        text(&o)
    );
    let chain = Log::of_operator(dir.path()).read().expect("read");
    assert_eq!(chain.entries.len(), 1, "refusals write nothing");
    let r = &chain.entries[0].record;
    assert_eq!(
        r.override_reason.as_deref(),
        Some("instructor on board, 60 kg less fuel")
    );
    assert_eq!(r.figures.as_ref().map(|f| f.state.as_str()), Some("below"));
}

#[test]
fn a_student_solo_with_a_lapsed_endorsement_cannot_be_signed_even_with_an_override() {
    let dir = demo_folder();
    // Overrides for student solos allowed, to show the endorsement still refuses.
    let op = dir.path().join("operator.json");
    let text_op = std::fs::read_to_string(&op).expect("read");
    let changed = text_op.replace(
        "\"override_categories\": [\"dual\"]",
        "\"override_categories\": [\"dual\", \"student_solo\"]",
    );
    assert_ne!(text_op, changed);
    std::fs::write(&op, changed).expect("write");
    let o = sign(
        dir.path(),
        "L08",
        MORNING,
        &["--override", "just a circuit"],
    );
    assert_eq!(o.status.code(), Some(1), "{}", text(&o));
    assert!(
        text(&o).contains(
            "student solo cannot be signed — solo endorsement for type ft2 of 2026-03-10 has lapsed"
        ),
        "{}",
        text(&o)
    );
    assert!(
        !dir.path().join("signoffs").join(".lock").exists()
            || Log::of_operator(dir.path())
                .read()
                .expect("read")
                .entries
                .is_empty()
    );
}

#[test]
fn bad_input_exits_2() {
    let dir = demo_folder();
    let o = sign(dir.path(), "L99", MORNING, &[]);
    assert_eq!(o.status.code(), Some(2), "{}", text(&o));
    assert!(text(&o).contains("leg 'L99': no such leg"), "{}", text(&o));
    let o = sign(dir.path(), "L01", "14 June", &[]);
    assert_eq!(o.status.code(), Some(2), "{}", text(&o));
    assert!(text(&o).contains("--at '14 June'"), "{}", text(&o));
    let d = dir.path().to_str().expect("utf-8");
    let o = rhoboard(
        &["log", "verify", "--ops", d, "--head", "seven"],
        dir.path(),
    );
    assert_eq!(o.status.code(), Some(2), "{}", text(&o));
    assert!(text(&o).contains("expected SEQ:HASH"), "{}", text(&o));
    let o = rhoboard(
        &["log", "show", "--ops", d, "--date", "14/06/2026"],
        dir.path(),
    );
    assert_eq!(o.status.code(), Some(2), "{}", text(&o));
}

#[test]
fn a_new_sign_off_supersedes_and_a_revocation_is_a_new_record() {
    let dir = demo_folder();
    let d = dir.path().to_str().expect("utf-8");
    let o = sign(dir.path(), "L01", MORNING, &["--revoke"]);
    assert_eq!(o.status.code(), Some(1), "{}", text(&o));
    assert!(
        text(&o).contains("no sign-off in force to revoke"),
        "{}",
        text(&o)
    );
    assert_eq!(sign(dir.path(), "L01", MORNING, &[]).status.code(), Some(0));
    assert_eq!(sign(dir.path(), "L03", MORNING, &[]).status.code(), Some(0));
    let o = sign(dir.path(), "L01", MORNING, &["--note", "new briefing"]);
    assert!(text(&o).contains("supersedes record 1"), "{}", text(&o));
    let o = sign(
        dir.path(),
        "L03",
        MORNING,
        &["--revoke", "--note", "charter cancelled"],
    );
    assert_eq!(o.status.code(), Some(0), "{}", text(&o));
    assert!(
        text(&o).contains("revoked the sign-off of L03 of 2026-06-14 (record 2)"),
        "{}",
        text(&o)
    );

    let chain = Log::of_operator(dir.path()).read().expect("read");
    assert!(chain.is_sound());
    assert_eq!(chain.entries.len(), 4);
    let date = chain.entries[0].record.leg_date;
    assert_eq!(chain.in_force("L01", date).map(|e| e.record.seq), Some(3));
    assert!(chain.in_force("L03", date).is_none());
    assert_eq!(chain.entries[2].record.supersedes_seq, Some(1));
    assert_eq!(chain.entries[3].record.revokes_seq, Some(2));

    let o = rhoboard(&["log", "show", "--ops", d], dir.path());
    let shown = text(&o);
    assert_eq!(o.status.code(), Some(0), "{shown}");
    for want in [
        "superseded",
        "in force",
        "revoked",
        "revocation",
        "charter cancelled",
    ] {
        assert!(shown.contains(want), "{want} in {shown}");
    }
    // A leg id the operator does not have is named (trial nit: "(no records)" read as
    // if the leg were merely unsigned); a real leg without records is just that.
    let o = rhoboard(&["log", "show", "--ops", d, "--leg", "L99"], dir.path());
    assert!(
        text(&o).contains("(no records: L99 is not one of the operator's legs; they are L01, L02,"),
        "{}",
        text(&o)
    );
    let o = rhoboard(&["log", "show", "--ops", d, "--leg", "L12"], dir.path());
    assert!(text(&o).contains("\n(no records)\n"), "{}", text(&o));
    let o = rhoboard(
        &["log", "show", "--ops", d, "--leg", "L03", "--json"],
        dir.path(),
    );
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).expect("json");
    let rows = v.as_array().expect("array");
    assert_eq!(rows.len(), 2);
    assert_eq!(rows[0]["status"], "revoked");
    assert_eq!(rows[1]["record"]["kind"], "revocation");
    assert_eq!(rows[0]["file"], chain.entries[1].file.as_str());
    let o = rhoboard(
        &["log", "show", "--ops", d, "--date", "2026-06-15"],
        dir.path(),
    );
    assert!(text(&o).contains("(no records)"), "{}", text(&o));
}

#[test]
fn the_demo_keeps_its_log_in_the_data_dir() {
    let data = tempfile::tempdir().expect("temp dir");
    let o = rhoboard(
        &["signoff", "L01", "--instructor", "Mara Greyling"],
        data.path(),
    );
    assert_eq!(o.status.code(), Some(0), "{}", text(&o));
    assert!(
        text(&o).contains("on the reports known at 2026-06-14T08:00Z"),
        "{}",
        text(&o)
    );
    let chain = Log::of_operator(&data.path().join("demo"))
        .read()
        .expect("read");
    assert_eq!(chain.entries.len(), 1);
    let o = rhoboard(&["log", "verify"], data.path());
    assert_eq!(o.status.code(), Some(0), "{}", text(&o));
    assert!(text(&o).contains("✓ sound"), "{}", text(&o));
}

#[test]
fn validate_names_a_bad_sign_off_policy() {
    let dir = demo_folder();
    let op = dir.path().join("operator.json");
    let t = std::fs::read_to_string(&op).expect("read");
    let bad = t
        .replace(
            "\"recheck_density_altitude_rise_ft\": 300",
            "\"recheck_density_altitude_rise_ft\": -5",
        )
        .replace(
            "\"override_categories\": [\"dual\"]",
            "\"override_categories\": [\"glider\"]",
        );
    std::fs::write(&op, &bad).expect("write");
    let d = dir.path().to_str().expect("utf-8");
    let o = rhoboard(&["validate", "--ops", d], dir.path());
    assert_eq!(o.status.code(), Some(2), "{}", text(&o));
    assert!(text(&o).contains("operator.json"), "{}", text(&o));
    assert!(text(&o).contains("glider"), "{}", text(&o));
    std::fs::write(&op, bad.replace("[\"glider\"]", "[\"dual\"]")).expect("write");
    let o = rhoboard(&["validate", "--ops", d], dir.path());
    assert!(
        text(&o).contains("policy.sign_off.recheck_density_altitude_rise_ft"),
        "{}",
        text(&o)
    );
}

#[test]
fn json_says_signed_or_refused() {
    let dir = demo_folder();
    let o = sign(dir.path(), "L01", MORNING, &["--json"]);
    assert_eq!(o.status.code(), Some(0), "{}", text(&o));
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).expect("json");
    assert_eq!(v["signed"]["record"]["seq"], 1);
    assert_eq!(v["signed"]["line"], 1);
    let head = v["signed"]["head"].as_str().expect("head");
    assert!(head.starts_with("1:") && head.len() == 66, "{head}");
    let o = sign(dir.path(), "L08", MORNING, &["--json"]);
    assert_eq!(o.status.code(), Some(1), "{}", text(&o));
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).expect("json");
    assert!(
        v["refused"]
            .as_str()
            .is_some_and(|r| r.contains("has lapsed")),
        "{v}"
    );
}

/// Finding 13: `log show` says a sign-off in force needs a re-check when the report and
/// the board do (the same `signoff::standing`), with the reasons; not at its basis.
#[test]
fn log_show_marks_a_sign_off_in_force_that_needs_a_re_check() {
    let dir = demo_folder();
    let d = dir.path().to_str().expect("utf-8");
    assert_eq!(sign(dir.path(), "L09", MORNING, &[]).status.code(), Some(0));
    let later = "2026-06-14T14:00:00Z";
    let report = rhoboard(&["report", "--ops", d, "--at", later], dir.path());
    let sheet = text(&report);
    assert!(sheet.contains("↻"), "the report marks a re-check: {sheet}");
    let o = rhoboard(&["log", "show", "--ops", d, "--at", later], dir.path());
    let shown = text(&o);
    assert_eq!(o.status.code(), Some(0), "{shown}");
    assert!(
        shown.contains("re-check") && shown.contains("↻ needs a re-check:"),
        "{shown}"
    );
    assert!(!shown.contains("in force"), "{shown}");
    let o = rhoboard(
        &["log", "show", "--ops", d, "--at", later, "--json"],
        dir.path(),
    );
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).expect("json");
    assert_eq!(v[0]["status"], "re-check");
    assert!(
        v[0]["recheck"].as_array().is_some_and(|a| !a.is_empty()),
        "{v}"
    );
    // At its own basis nothing has changed: in force, no re-check.
    let o = rhoboard(&["log", "show", "--ops", d, "--at", MORNING], dir.path());
    let shown = text(&o);
    assert!(
        shown.contains("in force") && !shown.contains("re-check"),
        "{shown}"
    );
}

/// A leg already gone at the assessment's time, and an override where nothing needs
/// one: both are signed (the record is the signer's word) but the signer is told.
#[test]
fn signing_a_gone_leg_or_overriding_a_within_one_warns() {
    let dir = demo_folder();
    // L03 departs 0800Z; at 13:00Z it has left.
    let o = sign(dir.path(), "L03", AFTERNOON, &[]);
    assert!(o.status.success(), "{}", text(&o));
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(
        err.contains("L03 departed at 0800Z") && err.contains("1300Z"),
        "{err}"
    );
    // L09 (1200Z) is within at 08:00Z: an override is not needed.
    let o = sign(
        dir.path(),
        "L09",
        MORNING,
        &["--override", "checked by hand"],
    );
    assert!(o.status.success(), "{}", text(&o));
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(err.contains("no override is needed"), "{err}");
    assert!(!err.contains("departed"), "{err}");
}
