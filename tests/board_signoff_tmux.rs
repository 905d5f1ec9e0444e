//! End to end in tmux, as a dispatcher would: on the demo, sign L09 at 08:00 from the
//! board, step to 13:00 and see it flagged; re-plan L16 and be asked before quitting.
//! A hang-up right after a sign-off (SIGHUP to the board, or its tmux session killed)
//! gives the terminal back and loses nothing recorded. The log goes to a temporary `RHOBOARD_DATA_DIR`. Skips with a printed reason where
//! tmux is absent — except in CI (`CI=true`), where it fails.

#[path = "common/tmux.rs"]
mod tmux_common;

use rhoboard::signoff::Log;
use tmux_common::{Session, have_tmux};

/// Wide enough for the detail beside the legs.
const SIZE: (u16, u16) = (140, 40);

/// On the demo at 08:00, signs L09 from the board as M. Ortiz and waits for the answer.
fn sign_l09_at_0800(s: &Session) {
    s.wait_for_all("the first frame", &["L01", "replay"]);
    s.keys(&["Space"]);
    s.wait_for_all("paused", &["paused"]);
    s.keys(&["n", "n"]);
    s.wait_for_all("08:00", &["08:00Z"]);
    s.keys(&["/", "L09", "Enter", "S"]);
    s.wait_for_all("the confirmation", &["Sign off L09"]);
    s.keys(&["-l", "M. Ortiz"]);
    s.wait_for_all("the name", &["✓ Enter signs"]);
    s.keys(&["Enter"]);
    s.wait_for_all("signed", &["L09 signed #1 by M. Ortiz", "log head 1:"]);
}

/// The demo's sign-off log of the session: sound, holding L09's sign-off by M. Ortiz.
fn assert_l09_kept(s: &Session) {
    let chain = Log::of_operator(&s.home.join("data/demo"))
        .read()
        .expect("the demo's log reads");
    assert!(chain.is_sound(), "{:?} {:?}", chain.problems, chain.torn);
    let kept: Vec<_> = chain
        .entries
        .iter()
        .map(|e| {
            (
                e.record.seq,
                e.record.leg.as_str(),
                e.record.instructor.as_str(),
            )
        })
        .collect();
    assert_eq!(kept, [(1, "L09", "M. Ortiz")]);
}

#[test]
fn sign_l09_at_0800_see_the_recheck_at_1300_and_replan_l16() {
    if !have_tmux("sign-off") {
        return;
    }
    let s = Session::start("so-main", "", SIZE);
    sign_l09_at_0800(&s);
    s.keys(&["Escape"]);
    for _ in 0..5 {
        s.keys(&["n"]);
    }
    // Wait for the whole frame (status line and row), not a frame caught mid-draw.
    s.wait_for("13:00 and the re-check", |t| {
        t.contains("13:00Z")
            && t.contains("↻ re-check 1")
            && t.lines().any(|l| l.contains(" L09 ") && l.contains('↻'))
    });
    // Re-plan L16: move it to 06:30 and see it within.
    s.keys(&["/", "L16", "Enter", "e", "t", "0630", "Enter"]);
    // 0630Z is before the 13Z clock: warned first, planned on the second Enter.
    s.wait_for_all("the past-time warning", &["before the board's clock"]);
    s.keys(&["Enter"]);
    s.wait_for_all("old → new", &["→ ✓ within", "✗ below"]);
    s.keys(&["Escape"]);
    s.wait_for("the re-plan closed, its edit pending", |t| {
        !t.contains("→ ✓ within") && t.contains("what-if: 1 pending")
    });
    s.keys(&["q"]);
    s.wait_for_all("the question", &["pending and not written"]);
    s.keys(&["y"]);
    s.wait_for_all("exit", &["rhoboard exited 0"]);
    let files: Vec<_> = std::fs::read_dir(s.home.join("data/demo/signoffs"))
        .expect("the demo's log folder")
        .filter_map(Result::ok)
        .filter(|e| e.file_name().to_string_lossy().ends_with(".jsonl"))
        .collect();
    assert_eq!(files.len(), 1, "one monthly file");
    assert_l09_kept(&s);
}

/// A board on the demo with L09 just signed from it; `None` (skipped) without tmux.
fn signed_board(tag: &str) -> Option<Session> {
    if !have_tmux("sign-off") {
        return None;
    }
    let s = Session::start(tag, "", SIZE);
    sign_l09_at_0800(&s);
    Some(s)
}

#[test]
fn sighup_right_after_a_sign_off_restores_the_terminal_and_keeps_the_record() {
    let Some(s) = signed_board("so-hup") else {
        return;
    };
    // The terminal hangs up (SIGHUP to the board): it quits like `q` on a clean board,
    // gives the terminal back, and the record signed just before is in the log.
    if s.signal_board("-HUP").is_none() {
        println!("skipping the SIGHUP check: cannot find the board's process id");
        return;
    }
    s.wait_for_all("exit", &["rhoboard exited 0"]);
    s.assert_restored();
    assert_l09_kept(&s);
}

#[test]
fn a_killed_tmux_session_hangs_the_board_up_and_the_record_stays() {
    let Some(s) = signed_board("so-kill") else {
        return;
    };
    let Some(pid) = s.board_pid() else {
        println!("skipping the hang-up check: cannot find the board's process id");
        return;
    };
    // Killing the session closes the terminal: the kernel sends SIGHUP to the board.
    tmux_common::tmux(&["kill-session", "-t", &s.name]);
    let start = std::time::Instant::now();
    while std::path::Path::new(&format!("/proc/{pid}")).exists() {
        // A zombie (exited, not yet reaped by the dead shell) counts as gone.
        let state = std::fs::read_to_string(format!("/proc/{pid}/stat")).unwrap_or_default();
        if state.split_whitespace().nth(2) == Some("Z") {
            break;
        }
        assert!(
            start.elapsed() < std::time::Duration::from_secs(20),
            "the board (pid {pid}) still runs after its terminal went away"
        );
        std::thread::sleep(std::time::Duration::from_millis(100));
    }
    assert_l09_kept(&s);
}
