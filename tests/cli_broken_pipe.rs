//! `rhoboard … | head -1` under `set -o pipefail`: a reader that stops early must cut
//! the output, never the verdict. Each command is run twice through the binary — once
//! read to the end, once with its standard output's read end closed (at once, or after
//! the first line as `head -1` does) — and the cut run must exit with the same status
//! (README "Exit status": 0 all within, 1 any below/no-data, 2 bad input) and write the
//! same standard error: nothing more for the closed pipe, and no panic.

use std::io::{BufRead, BufReader, Write};
use std::path::Path;
use std::process::{Command, Stdio};

/// When the test stops reading the child's standard output.
#[derive(Debug, Clone, Copy)]
enum Cut {
    /// The read end closed before the child writes anything: its first write meets
    /// `EPIPE`, for certain (the parent holds the only read end).
    AtOnce,
    /// One line read, then closed: `head -1`.
    AfterFirstLine,
}

fn command(args: &[&str], env_dir: &Path) -> Command {
    let mut c = Command::new(env!("CARGO_BIN_EXE_rhoboard"));
    c.args(args)
        .env("RHOBOARD_DATA_DIR", env_dir)
        // No developer's configured default folder: the demo is the demo.
        .env("XDG_CONFIG_HOME", env_dir)
        .env("HOME", env_dir)
        .stdin(Stdio::piped())
        .stderr(Stdio::piped());
    c
}

/// Feeds `stdin` from a thread, so a child that stops reading cannot block the test.
fn feed(child: &mut std::process::Child, stdin: &str) -> std::thread::JoinHandle<()> {
    let mut w = child.stdin.take().expect("stdin");
    let text = stdin.to_string();
    // A child that never reads its input closes the pipe: that error is expected.
    std::thread::spawn(move || drop(w.write_all(text.as_bytes())))
}

/// The whole run: exit status, standard output, standard error.
fn uncut(args: &[&str], stdin: &str, env_dir: &Path) -> (Option<i32>, Vec<u8>, String) {
    let mut child = command(args, env_dir)
        .stdout(Stdio::piped())
        .spawn()
        .expect("spawn rhoboard");
    let writer = feed(&mut child, stdin);
    let o = child.wait_with_output().expect("wait");
    writer.join().expect("stdin thread");
    (
        o.status.code(),
        o.stdout,
        String::from_utf8_lossy(&o.stderr).into_owned(),
    )
}

/// The run with its output cut: exit status (as `pipefail` sees it) and standard error.
fn cut(args: &[&str], stdin: &str, env_dir: &Path, how: Cut) -> (Option<i32>, String) {
    let mut child = command(args, env_dir)
        .stdout(Stdio::piped())
        .spawn()
        .expect("spawn rhoboard");
    let stdout = child.stdout.take().expect("stdout");
    let writer = feed(&mut child, stdin);
    match how {
        Cut::AtOnce => drop(stdout),
        Cut::AfterFirstLine => {
            let mut first = String::new();
            let mut r = BufReader::new(stdout);
            r.read_line(&mut first).expect("first line");
            assert!(!first.is_empty(), "{args:?} printed nothing");
            drop(r);
        }
    }
    let o = child.wait_with_output().expect("wait");
    writer.join().expect("stdin thread");
    (
        o.status.code(),
        String::from_utf8_lossy(&o.stderr).into_owned(),
    )
}

/// Runs `args` whole and cut both ways; the verdict and standard error must not change.
/// Returns the whole run's status and output for the caller's own checks.
fn same_verdict_when_cut(args: &[&str], stdin: &str) -> (Option<i32>, Vec<u8>) {
    let env_dir = tempfile::tempdir().expect("temp dir");
    let (code, out, err) = uncut(args, stdin, env_dir.path());
    assert!(!out.is_empty(), "{args:?} printed nothing: {err}");
    assert!(!err.contains("panicked"), "{args:?}: {err}");
    for how in [Cut::AtOnce, Cut::AfterFirstLine] {
        let (cut_code, cut_err) = cut(args, stdin, env_dir.path(), how);
        assert_eq!(
            cut_code, code,
            "{args:?} cut {how:?}: exit status changed (stderr: {cut_err})"
        );
        assert_eq!(cut_err, err, "{args:?} cut {how:?}: standard error changed");
    }
    (code, out)
}

const AFTERNOON: &str = "2026-06-14T13:00:00Z";

#[test]
fn check_keeps_its_findings_status_when_the_reader_stops_early() {
    // The demo day at 13Z has legs below (tests/check_demo.rs): exit 1, cut or not.
    let (code, out) = same_verdict_when_cut(&["check", "--at", AFTERNOON], "");
    assert_eq!(code, Some(1));
    assert!(String::from_utf8_lossy(&out).contains("below"));
    // The JSON is larger than a pipe's buffer (64 KiB on Linux), so even the `head -1`
    // cut meets a closed pipe mid-output.
    let (code, out) = same_verdict_when_cut(&["check", "--json", "--at", AFTERNOON], "");
    assert_eq!(code, Some(1));
    assert!(out.len() > 65_536, "{} bytes", out.len());
}

#[test]
fn report_log_validate_and_the_overview_keep_their_status() {
    let (code, _) = same_verdict_when_cut(&["report", "--at", AFTERNOON], "");
    assert_eq!(code, Some(1), "the sheet of a day with legs below");
    for args in [
        &["log", "show"][..],
        &["log", "verify"][..],
        &["validate"][..],
        &["validate", "--json"][..],
        // No subcommand, standard output not a terminal: the printed overview.
        &[][..],
    ] {
        let (code, _) = same_verdict_when_cut(args, "");
        assert_eq!(code, Some(0), "{args:?}");
    }
}

#[test]
fn metar_and_taf_keep_their_status_for_a_corpus_on_stdin() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let metars = std::fs::read_to_string(root.join("fixtures/metar/corpus.txt")).expect("read");
    let tafs = std::fs::read_to_string(root.join("fixtures/taf/corpus.txt")).expect("read");
    for (args, stdin) in [
        (&["metar", "--date", "2026-06-14", "-"][..], metars.as_str()),
        (
            &["metar", "--json", "--date", "2026-06-14", "-"][..],
            &metars,
        ),
        (&["taf", "-"][..], tafs.as_str()),
        (&["taf", "--json", "-"][..], &tafs),
    ] {
        same_verdict_when_cut(args, stdin);
    }
    // A rejected report is bad input (exit 2) with its message on standard error, and
    // stays so when the output is cut.
    let mixed = "METAR XKNL 141250Z 27015KT 9999 FEW040 31/12 Q1013\nMETAR XKNL 14125 garbage\n";
    let (code, _) = same_verdict_when_cut(&["metar", "--date", "2026-06-14", "-"], mixed);
    assert_eq!(code, Some(2));
}
