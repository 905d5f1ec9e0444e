//! End to end in a real terminal: the built binary runs in tmux on the demo; the test
//! steps the replay, opens a detail, reads the screen with `capture-pane`, quits, and
//! checks the terminal was restored (normal screen, canonical mode, echo). Skips with
//! a printed reason where tmux is absent — except in CI (`CI=true`), where it fails.

use std::process::Command;
use std::time::{Duration, Instant};

struct Session {
    name: String,
}

impl Drop for Session {
    fn drop(&mut self) {
        let _ = Command::new("tmux")
            .args(["kill-session", "-t", &self.name])
            .status();
    }
}

fn tmux(args: &[&str]) -> String {
    let out = Command::new("tmux").args(args).output().expect("tmux runs");
    String::from_utf8_lossy(&out.stdout).into_owned()
}

fn have_tmux() -> bool {
    let found = Command::new("tmux")
        .arg("-V")
        .output()
        .is_ok_and(|o| o.status.success());
    if !found {
        if std::env::var("CI").is_ok_and(|v| v == "true") {
            panic!("tmux is missing in CI: .ci/run installs it");
        }
        println!("skipping the tmux end-to-end test: tmux is not installed");
    }
    found
}

impl Session {
    fn start(tag: &str, extra: &str) -> Session {
        let name = format!("rhoboard-e2e-{tag}-{}", std::process::id());
        let home = std::env::temp_dir().join(&name);
        std::fs::create_dir_all(&home).expect("temp home");
        let bin = env!("CARGO_BIN_EXE_rhoboard");
        // A fresh HOME so no configured operator is picked up: the built-in demo.
        let script = format!(
            "HOME='{h}' XDG_CONFIG_HOME='{h}' '{bin}' {extra}; echo \"rhoboard exited $?\"; stty -a; exec sleep 60",
            h = home.display()
        );
        let s = Session { name };
        let status = Command::new("tmux")
            .args([
                "new-session",
                "-d",
                "-s",
                &s.name,
                "-x",
                "120",
                "-y",
                "40",
                "sh",
                "-c",
                &script,
            ])
            .status()
            .expect("tmux new-session");
        assert!(status.success());
        s
    }

    fn screen(&self) -> String {
        tmux(&["capture-pane", "-p", "-t", &self.name])
    }

    fn keys(&self, keys: &[&str]) {
        for k in keys {
            tmux(&["send-keys", "-t", &self.name, k]);
        }
    }

    /// Waits (polling) until the screen satisfies `ok`; the screen then.
    fn wait_for(&self, what: &str, ok: impl Fn(&str) -> bool) -> String {
        let start = Instant::now();
        loop {
            let s = self.screen();
            if ok(&s) {
                return s;
            }
            // Generous: a loaded 2-core CI machine can be slow to start a release build.
            if start.elapsed() > Duration::from_secs(45) {
                panic!("timed out waiting for {what}; screen:\n{s}");
            }
            std::thread::sleep(Duration::from_millis(100));
        }
    }

    fn alternate_on(&self) -> bool {
        tmux(&["display-message", "-p", "-t", &self.name, "#{alternate_on}"]).trim() == "1"
    }

    fn pane_pid(&self) -> String {
        tmux(&["display-message", "-p", "-t", &self.name, "#{pane_pid}"])
            .trim()
            .to_string()
    }
}

fn assert_restored(s: &Session) {
    // Wait for stty's report after the exit line, then read its flags as words.
    let screen = s.wait_for("stty's report", |t| {
        t.contains("rhoboard exited") && t.split_whitespace().any(|w| w.ends_with("icanon"))
    });
    assert!(!s.alternate_on(), "left the alternate screen");
    assert!(
        !screen.contains("Planning aid only"),
        "board gone:\n{screen}"
    );
    let words: Vec<&str> = screen.split_whitespace().collect();
    assert!(words.contains(&"icanon"), "canonical mode back:\n{screen}");
    assert!(
        !words.contains(&"-icanon"),
        "canonical mode back:\n{screen}"
    );
    assert!(words.contains(&"echo"), "echo back:\n{screen}");
    assert!(!words.contains(&"-echo"), "echo back:\n{screen}");
}

#[test]
fn the_demo_steps_opens_a_detail_quits_and_restores_the_terminal() {
    if !have_tmux() {
        return;
    }
    let s = Session::start("quit", "");
    s.wait_for("the first frame", |t| {
        t.contains("L01") && t.contains("Planning aid only") && t.contains("replay")
    });
    assert!(s.alternate_on(), "the board uses the alternate screen");
    // Pause, then step to 08:00 and on to 15:00.
    s.keys(&["Space"]);
    s.wait_for("paused", |t| t.contains("paused"));
    s.keys(&["n", "n"]);
    s.wait_for("08:00", |t| t.contains("08:00Z"));
    for _ in 0..7 {
        s.keys(&["n"]);
    }
    let screen = s.wait_for("15:00", |t| t.contains("15:00Z"));
    assert!(screen.contains("✗ below"), "{screen}");
    // Open L15 detail through the filter.
    s.keys(&["/", "L15", "Enter", "Enter"]);
    let screen = s.wait_for("the detail", |t| t.contains("── Departure XPIN"));
    assert!(screen.contains("L15"), "{screen}");
    assert!(screen.contains("Takeoff at"), "{screen}");
    s.keys(&["Escape", "?"]);
    s.wait_for("the help", |t| t.contains("Keys"));
    s.keys(&["Escape", "q"]);
    let screen = s.wait_for("exit", |t| t.contains("rhoboard exited"));
    assert!(screen.contains("rhoboard exited 0"), "{screen}");
    assert_restored(&s);
}

#[test]
fn sigterm_restores_the_terminal() {
    if !have_tmux() {
        return;
    }
    let s = Session::start("term", "board --speed 2");
    s.wait_for("the first frame", |t| t.contains("L01"));
    let sh = s.pane_pid();
    let children =
        std::fs::read_to_string(format!("/proc/{sh}/task/{sh}/children")).unwrap_or_default();
    let Some(pid) = children.split_whitespace().next().map(str::to_string) else {
        println!("skipping the SIGTERM check: cannot find the board's process id");
        return;
    };
    let status = Command::new("kill")
        .args(["-TERM", &pid])
        .status()
        .expect("kill");
    assert!(status.success());
    s.wait_for("exit", |t| t.contains("rhoboard exited"));
    assert_restored(&s);
}

#[test]
fn the_runway_form_closes_an_end_on_the_demo_and_l01_goes_below() {
    if !have_tmux() {
        return;
    }
    let s = Session::start("runway", "");
    s.wait_for("the first frame", |t| {
        t.contains("L01") && t.contains("replay")
    });
    s.keys(&["Space"]);
    s.wait_for("paused", |t| t.contains("paused"));
    s.keys(&["n", "n"]);
    s.wait_for("08:00", |t| t.contains("08:00Z"));
    // L01 is selected: r opens the form on XSEA and its runway in use, the cursor on
    // "closed".
    s.keys(&["g", "r"]);
    // Wait for the whole form, not only its title (a frame can be caught mid-draw).
    let screen = s.wait_for("the runway form", |t| {
        t.contains("Runway state for the day") && t.contains("airfield XSEA")
    });
    assert!(screen.contains("airfield XSEA"), "{screen}");
    assert!(screen.contains("kept in memory"), "{screen}");
    s.keys(&["y", "Enter"]);
    let screen = s.wait_for("the change", |t| {
        t.contains(
            "XSEA 27: closed: kept in memory only — the built-in demo has no operator folder",
        )
    });
    let l01 = screen
        .lines()
        .find(|l| l.contains(" L01 "))
        .unwrap_or_default();
    assert!(
        l01.contains("✗ below") && l01.contains("XSEA tailwind"),
        "{screen}"
    );
    s.keys(&["q"]);
    s.wait_for("exit", |t| t.contains("rhoboard exited 0"));
    assert_restored(&s);
}
