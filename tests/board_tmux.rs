//! End to end in a real terminal: the built binary runs in tmux on the demo; the test
//! steps the replay, opens a detail, reads the screen with `capture-pane`, quits, and
//! checks the terminal was restored (normal screen, canonical mode, echo). Skips with
//! a printed reason where tmux is absent — except in CI (`CI=true`), where it fails.

#[path = "common/tmux.rs"]
mod tmux_common;

use tmux_common::{Session, have_tmux};

/// The board's terminal for these tests.
const SIZE: (u16, u16) = (120, 40);

#[test]
fn the_demo_steps_opens_a_detail_quits_and_restores_the_terminal() {
    if !have_tmux("end-to-end") {
        return;
    }
    let s = Session::start("quit", "", SIZE);
    s.wait_for_all("the first frame", &["L01", "Planning aid only", "replay"]);
    assert!(s.alternate_on(), "the board uses the alternate screen");
    // Pause, then step to 08:00 and on to 15:00.
    s.keys(&["Space"]);
    s.wait_for_all("paused", &["paused"]);
    s.keys(&["n", "n"]);
    s.wait_for_all("08:00", &["08:00Z"]);
    for _ in 0..7 {
        s.keys(&["n"]);
    }
    s.wait_for_all("15:00 and its below legs", &["15:00Z", "✗ below"]);
    // Open L15 detail through the filter.
    s.keys(&["/", "L15", "Enter", "Enter"]);
    s.wait_for_all("the detail", &["── Departure XPIN", "L15", "Takeoff at"]);
    s.keys(&["Escape", "?"]);
    s.wait_for_all("the help", &["Keys"]);
    s.keys(&["Escape", "q"]);
    s.wait_for_all("exit", &["rhoboard exited 0"]);
    s.assert_restored();
}

#[test]
fn sigterm_restores_the_terminal() {
    if !have_tmux("end-to-end") {
        return;
    }
    let s = Session::start("term", "board --speed 2", SIZE);
    s.wait_for_all("the first frame", &["L01", "Planning aid only"]);
    if s.signal_board("-TERM").is_none() {
        println!("skipping the SIGTERM check: cannot find the board's process id");
        return;
    }
    s.wait_for_all("exit", &["rhoboard exited"]);
    s.assert_restored();
}

#[test]
fn the_runway_form_closes_an_end_on_the_demo_and_l01_goes_below() {
    if !have_tmux("end-to-end") {
        return;
    }
    let s = Session::start("runway", "", SIZE);
    s.wait_for_all("the first frame", &["L01", "replay"]);
    s.keys(&["Space"]);
    s.wait_for_all("paused", &["paused"]);
    // Still before L01's 0700Z departure (a closure starts at the board's clock: the
    // legs already flown keep the end). L01 is selected: r opens the form on XSEA and its runway in use, the cursor on
    // "closed".
    s.keys(&["g", "r"]);
    // Wait for the whole form, not only its title (a frame can be caught mid-draw).
    s.wait_for_all(
        "the runway form",
        &[
            "Runway state for the day",
            "airfield XSEA",
            "kept in memory",
        ],
    );
    s.keys(&["y", "Enter"]);
    // The note and L01's row, whole, in one frame.
    s.wait_for("the change and L01 below", |t| {
        t.contains("XSEA 27: closed from 06")
            && t.contains("kept in memory only — the built-in demo has no operator folder")
            && t.lines().any(|l| {
                l.contains(" L01 ") && l.contains("✗ below") && l.contains("XSEA tailwind")
            })
    });
    s.keys(&["q"]);
    s.wait_for_all("exit", &["rhoboard exited 0"]);
    s.assert_restored();
}

/// Ctrl-C is a user interrupt: the board gives the terminal back and exits 130 (128 +
/// SIGINT), as a shell reports an interrupted command; `q` exits 0.
#[test]
fn ctrl_c_exits_130_and_restores_the_terminal() {
    if !have_tmux("end-to-end") {
        return;
    }
    let s = Session::start("ctrlc", "board --speed 2", (80, 24));
    s.wait_for_all("the first frame", &["L01", "Planning aid only"]);
    s.keys(&["C-c"]);
    s.wait_for_all("exit", &["rhoboard exited 130"]);
    s.assert_restored();
}
