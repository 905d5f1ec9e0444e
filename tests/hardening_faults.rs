//! Faults the board and the commands meet on a dispatch desk: a report file being
//! written while read, files deleted or replaced, an operator folder that goes away,
//! and a full disk when a sign-off is written. Nothing recorded is lost and the user is
//! told.

use std::io::Write;
use std::process::Command;

use chrono::{TimeZone, Utc};
use rhoboard::observation::{Insert, ObservationFile, Store};

fn temp(name: &str) -> std::path::PathBuf {
    let d = std::env::temp_dir().join(format!("rhoboard-fault-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    d
}

#[test]
fn a_report_half_written_when_read_is_taken_whole_once_complete() {
    let dir = temp("half");
    let path = dir.join("today.txt");
    let at = Utc.with_ymd_and_hms(2026, 6, 14, 15, 0, 0).unwrap();
    let full = "METAR XSEA 141400Z 31016G28KT 9999 SCT050 31/12 Q1014 RMK T03070125";
    let (first, rest) = full.split_at(40);
    std::fs::write(
        &path,
        format!("METAR XSEA 141300Z 31012KT 9999 SCT050 30/12 Q1015\n{first}"),
    )
    .unwrap();
    let mut file = ObservationFile::new(&path);
    let mut store = Store::default();
    for r in file.read_new(at).unwrap() {
        store.insert(r.report);
    }
    // The writer finishes the line.
    let mut f = std::fs::OpenOptions::new()
        .append(true)
        .open(&path)
        .unwrap();
    writeln!(f, "{rest}").unwrap();
    drop(f);
    let again = file.read_new(at).unwrap();
    assert_eq!(again.len(), 1, "only the completed line is read again");
    let ins = store.insert(again[0].report.clone());
    assert!(!matches!(ins, Insert::Rejected(_)), "{ins:?}");
    let latest = store.current("XSEA").unwrap();
    assert_eq!(latest.text, full);
    assert_eq!(
        latest.temperature_c,
        Some(30.7),
        "the remark's tenths, from the whole line"
    );
    assert_eq!(store.reports("XSEA").count(), 2, "one report per time");
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn a_file_deleted_or_replaced_under_the_reader() {
    let dir = temp("replaced");
    let path = dir.join("today.txt");
    let at = Utc.with_ymd_and_hms(2026, 6, 14, 15, 0, 0).unwrap();
    std::fs::write(&path, "METAR XSEA 141300Z 31012KT 9999 SCT050 30/12 Q1015\nMETAR XSEA 141400Z 31012KT 9999 SCT050 31/12 Q1015\n").unwrap();
    let mut file = ObservationFile::new(&path);
    assert_eq!(file.read_new(at).unwrap().len(), 2);
    // Deleted: an error the feed shows, not a panic.
    std::fs::remove_file(&path).unwrap();
    let err = file.read_new(at).unwrap_err();
    assert_eq!(err.kind(), std::io::ErrorKind::NotFound);
    // Replaced by a shorter file: read again from the start.
    std::fs::write(
        &path,
        "METAR XSEA 141500Z 30013KT 9999 SCT050 31/13 Q1014\n",
    )
    .unwrap();
    let r = file.read_new(at).unwrap();
    assert_eq!(r.len(), 1);
    assert_eq!(r[0].report.time_text, "141500Z");
    let _ = std::fs::remove_dir_all(&dir);
}

fn rhoboard(home: &std::path::Path, args: &[&str]) -> (i32, String, String) {
    let o = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .env("XDG_CONFIG_HOME", home)
        .env("HOME", home)
        .env("RHOBOARD_DATA_DIR", home.join("data"))
        .output()
        .unwrap();
    (
        o.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&o.stdout).into_owned(),
        String::from_utf8_lossy(&o.stderr).into_owned(),
    )
}

#[test]
fn an_operator_folder_that_goes_away_is_an_error_naming_it() {
    let dir = temp("gone");
    let ops = dir.join("ops");
    let home = dir.join("home");
    let d = ops.to_str().unwrap();
    assert_eq!(rhoboard(&home, &["init", d]).0, 0);
    std::fs::remove_dir_all(&ops).unwrap();
    let (code, _, err) = rhoboard(&home, &["check", "--ops", d]);
    assert_eq!(code, 2);
    assert!(err.contains(d), "{err}");
    // A folder turned into a file.
    std::fs::write(&ops, "not a folder").unwrap();
    let (code, _, err) = rhoboard(&home, &["validate", "--ops", d]);
    assert_eq!(code, 2);
    assert!(err.contains("not a folder"), "{err}");
    let _ = std::fs::remove_dir_all(&dir);
}

/// The remembered default folder broken by hand (a truncated pilots.json): `check` and
/// `report` fail with the folder's name and exit 2, never assess the demo in its place
/// (a script's `rhoboard check && …` must not pass on invented legs).
#[test]
fn a_broken_default_folder_is_an_error_not_the_demo() {
    let dir = temp("broken-default");
    let ops = dir.join("ops");
    let home = dir.join("home");
    let d = ops.to_str().unwrap();
    assert_eq!(rhoboard(&home, &["init", d, "--make-default"]).0, 0);
    let (code, _, err) = rhoboard(&home, &["check"]);
    assert_ne!(code, 2, "the copy of the demo loads: {err}");
    std::fs::write(ops.join("pilots.json"), "{").unwrap();
    for args in [&["check"][..], &["report"][..]] {
        let (code, out, err) = rhoboard(&home, args);
        assert_eq!(code, 2, "{args:?}: {err}");
        assert!(
            err.contains(d) && err.contains("rhoboard validate"),
            "{err}"
        );
        assert!(
            !out.contains("Fictional Skies"),
            "{args:?} printed the demo: {out}"
        );
    }
    let _ = std::fs::remove_dir_all(&dir);
}

/// A device in place of the month's log file (here /dev/full, which reads as endless
/// zeros) is refused with a clear message, never read without end.
#[test]
fn a_log_file_that_is_not_a_file_is_refused() {
    if !std::path::Path::new("/dev/full").exists() {
        eprintln!("skipped: no /dev/full on this system");
        return;
    }
    let dir = temp("device");
    let ops = dir.join("ops");
    let home = dir.join("home");
    let d = ops.to_str().unwrap();
    assert_eq!(rhoboard(&home, &["init", d]).0, 0);
    std::fs::create_dir_all(ops.join("signoffs")).unwrap();
    std::os::unix::fs::symlink("/dev/full", ops.join("signoffs/2026-06.jsonl")).unwrap();
    let (code, _, err) = rhoboard(&home, &["log", "verify", "--ops", d]);
    assert_ne!(code, 0);
    assert!(err.contains("not a regular file"), "{err}");
    let _ = std::fs::remove_dir_all(&dir);
}

/// A full disk: the sign-off log's folder is a tiny tmpfs, filled up but for a few
/// bytes. The sign-off fails and says why; the records before it are intact; once there
/// is space again the torn tail is set aside and the chain verifies.
#[test]
fn a_full_disk_when_signing_is_reported_and_nothing_recorded_is_lost() {
    let dir = temp("full");
    let ops = dir.join("ops");
    let home = dir.join("home");
    let d = ops.to_str().unwrap();
    assert_eq!(rhoboard(&home, &["init", d]).0, 0);
    let logs = ops.join("signoffs");
    std::fs::create_dir_all(&logs).unwrap();
    let mounted = Command::new("mount")
        .args(["-t", "tmpfs", "-o", "size=64k", "tmpfs"])
        .arg(&logs)
        .status()
        .is_ok_and(|s| s.success());
    if !mounted {
        let _ = std::fs::remove_dir_all(&dir);
        assert!(
            std::env::var("CI").is_err(),
            "CI runs as root and must be able to mount a small tmpfs for this test"
        );
        eprintln!("skipped: cannot mount a tmpfs here (not root?)");
        return;
    }
    let at = "2026-06-14T08:00:00Z";
    let sign = |leg: &str| {
        rhoboard(
            &home,
            &[
                "signoff",
                leg,
                "--instructor",
                "M. Greyling",
                "--ops",
                d,
                "--at",
                at,
            ],
        )
    };
    let (code, _, err) = sign("L04");
    assert_eq!(code, 0, "{err}");
    // Fill the disk, leaving a few hundred bytes: less than a record.
    let filler = logs.join("filler.bin");
    let mut f = std::fs::File::create(&filler).unwrap();
    let chunk = vec![0u8; 1024];
    while f.write_all(&chunk).is_ok() {}
    let _ = f.sync_all();
    drop(f);
    let (code, out, err) = sign("L06");
    assert_ne!(
        code, 0,
        "a sign-off on a full disk must not report success: {out}"
    );
    assert!(
        err.to_lowercase().contains("space") || err.contains("wrote"),
        "the user is told why: {err}"
    );
    // Space again.
    std::fs::remove_file(&filler).unwrap();
    let (code, out, err) = rhoboard(&home, &["log", "show", "--ops", d, "--json"]);
    assert_eq!(code, 0, "{err}");
    assert!(
        out.contains("\"L04\""),
        "the earlier record is intact: {out}"
    );
    assert!(!out.contains("\"L06\""), "the failed one is not recorded");
    let (code, _, err) = sign("L06");
    assert_eq!(code, 0, "{err}");
    let (code, out, err) = rhoboard(&home, &["log", "verify", "--ops", d]);
    let _ = Command::new("umount").arg(&logs).status();
    assert_eq!(code, 0, "{out}{err}");
    let _ = std::fs::remove_dir_all(&dir);
}
