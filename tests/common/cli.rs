//! The binary run with arguments and an optional standard input, for the command
//! tests: (exit code, stdout).
#![allow(dead_code, reason = "each test file uses a different part")]

use std::io::Write;
use std::process::{Command, Stdio};

pub fn rhoboard(args: &[&str], stdin: Option<&str>) -> (i32, String) {
    let mut child = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("run rhoboard");
    if let Some(input) = stdin {
        child
            .stdin
            .take()
            .expect("stdin")
            .write_all(input.as_bytes())
            .expect("write stdin");
    } else {
        drop(child.stdin.take());
    }
    let out = child.wait_with_output().expect("wait");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
    )
}
