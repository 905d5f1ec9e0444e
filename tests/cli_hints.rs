//! Command-line hints (finding 26): what `--at` accepts, the day's leg ids for an
//! unknown leg, and "did you mean" for a mistyped airfield or aircraft.

use std::process::Command;

fn rhoboard(home: &std::path::Path, args: &[&str]) -> (i32, String) {
    let o = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .env("RHOBOARD_DATA_DIR", home)
        .env("XDG_CONFIG_HOME", home)
        .env("HOME", home)
        .output()
        .unwrap();
    (
        o.status.code().unwrap_or(-1),
        format!(
            "{}{}",
            String::from_utf8_lossy(&o.stdout),
            String::from_utf8_lossy(&o.stderr)
        ),
    )
}

#[test]
fn at_without_a_date_says_what_is_accepted() {
    let home = tempfile::tempdir().unwrap();
    let (code, out) = rhoboard(home.path(), &["check", "--at", "14:00"]);
    assert_eq!(code, 2);
    assert!(
        out.contains("--at '14:00': expected an RFC 3339 date and time")
            && out.contains("2026-06-14T14:00:00Z"),
        "{out}"
    );
    assert!(!out.contains("premature end of input"), "{out}");
}

#[test]
fn an_unknown_leg_lists_the_days_leg_ids() {
    let home = tempfile::tempdir().unwrap();
    let (code, out) = rhoboard(home.path(), &["check", "--leg", "L99"]);
    assert_eq!(code, 2);
    assert!(
        out.contains("--leg 'L99': no such leg (the legs of 2026-06-14: L01, L02,")
            && out.contains("L15"),
        "{out}"
    );
    let (code, out) = rhoboard(
        home.path(),
        &["leg", "set", "L99", "--fuel", "100L", "--dry-run"],
    );
    assert_eq!(code, 2);
    assert!(
        out.contains("leg 'L99': no such leg (the legs of 2026-06-14:"),
        "{out}"
    );
    // Ids are matched exactly; one in another case is named (trial finding: `l16` got
    // the list but no hint, and the nearest by spelling alone was L06).
    let (code, out) = rhoboard(home.path(), &["check", "--leg", "l16"]);
    assert_eq!(code, 2);
    assert!(
        out.contains("--leg 'l16': no such leg; did you mean L16? (the legs of"),
        "{out}"
    );
    // A letter O for the digit 0 is named too (trial nit).
    let (code, out) = rhoboard(home.path(), &["check", "--leg", "L1O"]);
    assert_eq!(code, 2);
    assert!(
        out.contains("--leg 'L1O': no such leg; did you mean L10? (the legs of"),
        "{out}"
    );
    // A number without its leading zero too.
    let (code, out) = rhoboard(home.path(), &["check", "--leg", "L9"]);
    assert_eq!(code, 2);
    assert!(
        out.contains("--leg 'L9': no such leg; did you mean L09? (the legs of"),
        "{out}"
    );
}

#[test]
fn a_mistyped_airfield_or_aircraft_gets_did_you_mean() {
    let home = tempfile::tempdir().unwrap();
    let (code, out) = rhoboard(
        home.path(),
        &["leg", "set", "L16", "--to", "XPNI", "--dry-run"],
    );
    assert_eq!(code, 2);
    assert!(
        out.contains(
            "--to: unknown airfield 'XPNI'; it needs airfields/XPNI.json; did you mean XPIN?"
        ),
        "{out}"
    );
    let (code, out) = rhoboard(
        home.path(),
        &["leg", "set", "L16", "--aircraft", "X-UTBL", "--dry-run"],
    );
    assert_eq!(code, 2);
    assert!(out.contains("did you mean X-UTLB?"), "{out}");
    // Nothing close: no guess.
    let (_, out) = rhoboard(
        home.path(),
        &["leg", "set", "L16", "--to", "QQQQ", "--dry-run"],
    );
    assert!(!out.contains("did you mean"), "{out}");
}
