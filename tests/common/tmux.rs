//! The tmux session the end-to-end board tests drive: the built binary in a real
//! terminal with a fresh HOME, config dir and data dir (so the built-in demo, and a
//! sign-off log of its own), keys sent with `send-keys`, the screen read with
//! `capture-pane`. After the board exits the shell prints `rhoboard exited N` and
//! `stty -a`, so a test can check the terminal was given back.
#![allow(dead_code, reason = "each test file uses a different part")]

use std::path::PathBuf;
use std::process::Command;
use std::time::{Duration, Instant};

/// How long a screen may take to show what a test waits for: generous, since a loaded
/// 2-core CI machine can be slow to start the binary.
const PATIENCE: Duration = Duration::from_secs(45);

/// One tmux session running the board; killed (and its temporary folder removed) on drop.
pub struct Session {
    /// The tmux session's name.
    pub name: String,
    /// HOME, XDG_CONFIG_HOME, and `data/` below it as RHOBOARD_DATA_DIR.
    pub home: PathBuf,
}

impl Drop for Session {
    fn drop(&mut self) {
        let _ = Command::new("tmux")
            .args(["kill-session", "-t", &self.name])
            .status();
        let _ = std::fs::remove_dir_all(&self.home);
    }
}

/// Runs tmux; its standard output.
pub fn tmux(args: &[&str]) -> String {
    let out = Command::new("tmux").args(args).output().expect("tmux runs");
    String::from_utf8_lossy(&out.stdout).into_owned()
}

/// Whether tmux is here; where not, says so and the test skips — except in CI
/// (`CI=true`), where it fails.
pub fn have_tmux(test: &str) -> bool {
    let found = Command::new("tmux")
        .arg("-V")
        .output()
        .is_ok_and(|o| o.status.success());
    if !found {
        if std::env::var("CI").is_ok_and(|v| v == "true") {
            panic!("tmux is missing in CI: .ci/run installs it");
        }
        println!("skipping the tmux {test} test: tmux is not installed");
    }
    found
}

impl Session {
    /// Starts `rhoboard ARGS` in a `width`×`height` terminal.
    pub fn start(tag: &str, args: &str, (width, height): (u16, u16)) -> Session {
        let name = format!("rhoboard-e2e-{tag}-{}", std::process::id());
        let home = std::env::temp_dir().join(&name);
        std::fs::create_dir_all(&home).expect("temp home");
        let bin = env!("CARGO_BIN_EXE_rhoboard");
        let script = format!(
            "HOME='{h}' XDG_CONFIG_HOME='{h}' RHOBOARD_DATA_DIR='{h}/data' '{bin}' {args}; echo \"rhoboard exited $?\"; stty -a; exec sleep 60",
            h = home.display()
        );
        let s = Session { name, home };
        let (w, h) = (width.to_string(), height.to_string());
        // Tests run in parallel: two first sessions can race to start the tmux server,
        // and the loser's new-session fails. Try again a few times before giving up.
        let mut last = String::new();
        for attempt in 0..5 {
            let out = Command::new("tmux")
                .args([
                    "new-session",
                    "-d",
                    "-s",
                    &s.name,
                    "-x",
                    &w,
                    "-y",
                    &h,
                    "sh",
                    "-c",
                    &script,
                ])
                .output()
                .expect("tmux new-session");
            if out.status.success() {
                return s;
            }
            last = String::from_utf8_lossy(&out.stderr).into_owned();
            std::thread::sleep(Duration::from_millis(200 * (attempt + 1)));
        }
        panic!("tmux new-session failed five times: {last}")
    }

    /// The screen now.
    pub fn screen(&self) -> String {
        tmux(&["capture-pane", "-p", "-t", &self.name])
    }

    /// Sends each of `keys` (tmux key names, or `-l TEXT`). After an Escape it pauses:
    /// an Escape read together with the next key is that key with Alt, as a terminal
    /// would have it, and a loaded machine can read them together.
    pub fn keys(&self, keys: &[&str]) {
        for k in keys {
            tmux(&["send-keys", "-t", &self.name, k]);
            if *k == "Escape" {
                std::thread::sleep(Duration::from_millis(300));
            }
        }
    }

    /// Waits (polling) until the screen satisfies `ok`; the screen then.
    pub fn wait_for(&self, what: &str, ok: impl Fn(&str) -> bool) -> String {
        let start = Instant::now();
        loop {
            let s = self.screen();
            if ok(&s) {
                return s;
            }
            if start.elapsed() > PATIENCE {
                panic!("timed out waiting for {what}; screen:\n{s}");
            }
            std::thread::sleep(Duration::from_millis(100));
        }
    }

    /// Waits until every one of `parts` is on the screen at once — a frame caught
    /// mid-draw under load has some and not others — and returns that screen. A
    /// time-out names the parts still missing.
    pub fn wait_for_all(&self, what: &str, parts: &[&str]) -> String {
        let start = Instant::now();
        loop {
            let s = self.screen();
            let missing: Vec<&&str> = parts.iter().filter(|p| !s.contains(**p)).collect();
            if missing.is_empty() {
                return s;
            }
            if start.elapsed() > PATIENCE {
                panic!("timed out waiting for {what}: missing {missing:?}; screen:\n{s}");
            }
            std::thread::sleep(Duration::from_millis(100));
        }
    }

    /// Whether the pane shows the alternate screen.
    pub fn alternate_on(&self) -> bool {
        tmux(&["display-message", "-p", "-t", &self.name, "#{alternate_on}"]).trim() == "1"
    }

    /// The board's process id: the pane's shell's child, while it runs.
    pub fn board_pid(&self) -> Option<String> {
        let sh = tmux(&["display-message", "-p", "-t", &self.name, "#{pane_pid}"]);
        let sh = sh.trim();
        std::fs::read_to_string(format!("/proc/{sh}/task/{sh}/children"))
            .ok()?
            .split_whitespace()
            .next()
            .map(str::to_string)
    }

    /// Sends `signal` (e.g. `-HUP`) to the board's process.
    pub fn signal_board(&self, signal: &str) -> Option<String> {
        let pid = self.board_pid()?;
        let status = Command::new("kill")
            .args([signal, &pid])
            .status()
            .expect("kill");
        assert!(status.success(), "kill {signal} {pid}");
        Some(pid)
    }

    /// After the board exited: the normal screen, canonical mode and echo are back, as
    /// `stty -a` reports them.
    pub fn assert_restored(&self) {
        // Wait for stty's report after the exit line, then read its flags as words.
        let screen = self.wait_for("stty's report", |t| {
            t.contains("rhoboard exited") && t.split_whitespace().any(|w| w.ends_with("icanon"))
        });
        assert!(!self.alternate_on(), "left the alternate screen");
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
}
