//! `rhoboard board` through the binary when standard output is not a terminal.

use std::process::Command;

#[test]
fn the_board_needs_a_terminal_and_says_what_to_use_instead() {
    let home = std::env::temp_dir().join(format!("rhoboard-cli-board-{}", std::process::id()));
    let out = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .arg("board")
        .env("HOME", &home)
        .env("XDG_CONFIG_HOME", &home)
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    insta::assert_snapshot!(err, @"rhoboard: the board needs a terminal; for text or JSON use `rhoboard check` (with --json)");
}

#[test]
fn bad_board_arguments_are_named() {
    let out = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(["board", "--ops", "/nonexistent/rhoboard-ops"])
        .output()
        .expect("runs");
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert!(err.contains("/nonexistent/rhoboard-ops"), "{err}");
}
