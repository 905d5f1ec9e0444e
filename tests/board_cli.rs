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

/// The board's options work without the word `board`: `rhoboard --speed 0` is the
/// board's own range check, `rhoboard --at …` off a terminal the board's "needs a
/// terminal", never the overview that ignores the option; bare `rhoboard` piped still
/// prints the overview.
#[test]
fn board_options_without_the_command_mean_the_board() {
    let run = |args: &[&str]| {
        let out = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
            .args(args)
            .output()
            .expect("runs");
        (
            out.status.code(),
            String::from_utf8_lossy(&out.stdout).into_owned(),
            String::from_utf8_lossy(&out.stderr).into_owned(),
        )
    };
    let (code, _, err) = run(&["--speed", "0"]);
    assert_eq!(code, Some(2));
    assert!(
        err.contains("--speed 0: expected a pace between 0.1 and 1000"),
        "{err}"
    );
    let (code, out, err) = run(&["--at", "2026-06-14T11:00:00Z"]);
    assert_eq!(code, Some(2), "{out}");
    assert!(err.contains("the board needs a terminal"), "{err}");
    let (code, out, _) = run(&[]);
    assert_eq!(code, Some(0));
    assert!(out.starts_with("rhoboard "), "{out}");
    // A board option with a command is refused by name.
    let (code, _, err) = run(&["--bell", "check"]);
    assert_eq!(code, Some(2));
    assert!(err.contains("--bell"), "{err}");
}

/// Runs the binary on the operator folder `dir` (`--ops dir` after `args`) with `home`
/// as its home, config and data folder, and asserts it exits 0.
fn succeeds_in(home: &std::path::Path, dir: &std::path::Path, args: &[&str]) {
    let o = Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .arg("--ops")
        .arg(dir)
        .env("HOME", home)
        .env("XDG_CONFIG_HOME", home)
        .env("RHOBOARD_DATA_DIR", home)
        .output()
        .unwrap();
    assert_eq!(
        o.status.code(),
        Some(0),
        "{args:?}: {}",
        String::from_utf8_lossy(&o.stderr)
    );
}

fn demo_folder(tag: &str) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("rhoboard-board-ops-{tag}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    for (path, text) in rhoboard::ops::demo::files().files {
        let p = dir.join(path);
        std::fs::create_dir_all(p.parent().unwrap()).unwrap();
        std::fs::write(p, text).unwrap();
    }
    dir
}

#[test]
fn replay_of_a_file_starts_half_an_hour_after_its_first_report() {
    use chrono::{TimeZone, Utc};
    use rhoboard::commands::board::{Args, prepare};
    let dir = demo_folder("replay");
    let args = Args {
        ops: Some(dir.clone()),
        replay: Some(dir.join("observations/2026-06-14.txt")),
        speed: Some(4.0),
        ..Args::default()
    };
    let now = Utc.with_ymd_and_hms(2026, 12, 1, 19, 0, 0).unwrap();
    let (app, feeds) = prepare(&args, now).expect("prepares");
    assert_eq!(
        app.clock,
        Utc.with_ymd_and_hms(2026, 6, 14, 6, 30, 0).unwrap()
    );
    let rp = app.replay.as_ref().expect("replay");
    assert_eq!(rp.speed, 4.0);
    assert!(!app.assessment.legs.is_empty());
    assert!(
        feeds.folder.is_none() && feeds.command.is_none(),
        "a replay has no live feeds"
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn live_on_a_folder_watches_its_observations_and_runs_the_feed_command() {
    use chrono::{TimeZone, Utc};
    use rhoboard::commands::board::{Args, prepare};
    let dir = demo_folder("live");
    let args = Args {
        ops: Some(dir.clone()),
        at: Some("2026-06-14T10:00:00Z".into()),
        feed_cmd: Some("cat /dev/null".into()),
        feed_every: "5m".into(),
        ..Args::default()
    };
    let now = Utc.with_ymd_and_hms(2026, 12, 1, 19, 0, 0).unwrap();
    let (app, feeds) = prepare(&args, now).expect("prepares");
    assert!(app.replay.is_none());
    assert_eq!(
        app.clock,
        Utc.with_ymd_and_hms(2026, 6, 14, 10, 0, 0).unwrap()
    );
    assert_eq!(feeds.folder.as_ref().unwrap().0, dir.join("observations"));
    assert_eq!(
        feeds.command,
        Some((
            "cat /dev/null".to_string(),
            std::time::Duration::from_secs(300)
        ))
    );
    assert_eq!(
        feeds.clock_offset,
        app.clock - now,
        "feeds date reports on the board's clock"
    );
    // A bad schedule is named.
    let bad = Args {
        feed_every: "soon".into(),
        ..args
    };
    let err = prepare(&bad, now).err().expect("refused").to_string();
    assert!(err.contains("--feed-every 'soon'"), "{err}");
    std::fs::remove_dir_all(&dir).unwrap();
}

/// The folder feed starts where the operator folder's load ended: the reports loaded at
/// start are not read, stored and listed a second time (trial nit: a rejected line was
/// listed twice, and two reports of one station and minute were stored again in turn),
/// while a line appended after the load still arrives, once.
#[test]
fn the_folder_feed_starts_after_what_the_load_read() {
    use chrono::{TimeZone, Utc};
    use rhoboard::board::Msg;
    use rhoboard::commands::board::{Args, prepare};
    use std::collections::BTreeMap;
    let dir = demo_folder("loaded");
    let day = dir.join("observations/2026-06-14.txt");
    let mut text = std::fs::read_to_string(&day).unwrap();
    text.push_str("METAR XSEA 141130Z 27010KT 9999 Q1016\n");
    std::fs::write(&day, &text).unwrap();
    let args = Args {
        ops: Some(dir.clone()),
        at: Some("2026-06-14T13:00:00Z".into()),
        feed_every: "5m".into(),
        ..Args::default()
    };
    let now = Utc.with_ymd_and_hms(2026, 12, 1, 19, 0, 0).unwrap();
    let (app, feeds) = prepare(&args, now).expect("prepares");
    // The Reports pane starts with each station's report valid at the board's clock,
    // none from after it (trial nit: 1700Z reports listed on a board at 1300Z).
    assert!(!app.received.is_empty());
    for r in &app.received {
        let end_of_day = Utc.with_ymd_and_hms(2026, 6, 14, 23, 59, 0).unwrap();
        let rep = rhoboard::observation::decode(&r.text, end_of_day);
        let t = rep.observed_at.unwrap();
        assert!(t <= app.clock, "{} after {}", r.text, app.clock);
    }
    // The bad line is named once, with its line, by the load.
    let named = app
        .notes
        .iter()
        .filter(|n| n.text.contains("141130Z"))
        .count();
    assert_eq!(named, 1, "{:?}", app.notes);
    let mut files: BTreeMap<_, _> = feeds
        .folder_loaded
        .into_iter()
        .map(|f| (f.path().to_path_buf(), f))
        .collect();
    assert!(files.contains_key(&day), "{:?}", files.keys());
    let (tx, rx) = std::sync::mpsc::channel();
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 23, 0, 0).unwrap();
    let obs = dir.join("observations");
    assert!(rhoboard::board::feed::poll_folder(
        &obs, &mut files, reference, &tx
    ));
    assert!(rx.try_iter().next().is_none(), "nothing read twice");
    let mut f = std::fs::OpenOptions::new().append(true).open(&day).unwrap();
    std::io::Write::write_all(
        &mut f,
        b"METAR XSEA 141310Z 27010KT 9999 FEW040 24/10 Q1016\n",
    )
    .unwrap();
    assert!(rhoboard::board::feed::poll_folder(
        &obs, &mut files, reference, &tx
    ));
    let got: Vec<String> = rx
        .try_iter()
        .flat_map(|m| match m {
            Msg::Observations { reports, .. } => reports
                .into_iter()
                .map(|r| format!("{}: {}", r.line, r.report.text))
                .collect(),
            other => vec![format!("{other:?}")],
        })
        .collect();
    let line = text.lines().count() + 1;
    assert_eq!(
        got,
        [format!(
            "{line}: METAR XSEA 141310Z 27010KT 9999 FEW040 24/10 Q1016"
        )]
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

/// A sign-off written elsewhere (another board, or `rhoboard signoff` in another
/// terminal) reaches an open board: the log watch sees the log change and the board
/// reads it again, marks the leg and says so (trial finding: a second board kept
/// "log: no sign-offs yet"); its own records read back are not announced again.
#[test]
fn a_sign_off_written_elsewhere_reaches_the_board() {
    use chrono::{TimeZone, Utc};
    use rhoboard::board::Msg;
    use rhoboard::board::signoff::Mark;
    use rhoboard::commands::board::{Args, prepare};
    let dir = demo_folder("logwatch");
    let home = dir.join(".home");
    let args = Args {
        ops: Some(dir.clone()),
        at: Some("2026-06-14T08:00:00Z".into()),
        feed_every: "5m".into(),
        ..Args::default()
    };
    let now = Utc.with_ymd_and_hms(2026, 12, 1, 19, 0, 0).unwrap();
    let (mut app, mut feeds) = prepare(&args, now).expect("prepares");
    let mut watch = feeds.signoff_log.take().expect("the log is watched");
    let (tx, rx) = std::sync::mpsc::channel();
    assert!(rhoboard::board::feed::poll_log(&mut watch, &tx));
    assert!(rx.try_iter().next().is_none(), "unchanged since the load");
    succeeds_in(
        &home,
        &dir,
        &[
            "signoff",
            "L04",
            "--instructor",
            "Mara Greyling",
            "--at",
            "2026-06-14T08:00:00Z",
        ],
    );
    assert!(rhoboard::board::feed::poll_log(&mut watch, &tx));
    let msgs: Vec<Msg> = rx.try_iter().collect();
    assert_eq!(msgs.len(), 1, "{msgs:?}");
    for m in msgs {
        app.update(m);
    }
    let k = app
        .assessment
        .legs
        .iter()
        .position(|r| r.id == "L04")
        .unwrap();
    assert!(
        matches!(app.mark(k), Mark::Signed { seq: 1, .. }),
        "{:?}",
        app.mark(k)
    );
    let said = |app: &rhoboard::board::App| {
        app.notes
            .iter()
            .filter(|n| n.text.starts_with("sign-off log changed on disk"))
            .count()
    };
    assert_eq!(said(&app), 1, "{:?}", app.notes);
    assert!(
        app.notes
            .iter()
            .any(|n| n.text.ends_with("1 new record(s), newest #1"))
    );
    // Read again with nothing new: not said again.
    let chain = rhoboard::signoff::Log::of_operator(&dir)
        .read()
        .map_err(|e| e.to_string());
    app.update(Msg::LogRead(chain));
    assert_eq!(said(&app), 1);
    assert!(rhoboard::board::feed::poll_log(&mut watch, &tx));
    assert!(rx.try_iter().next().is_none(), "nothing changed since");
    std::fs::remove_dir_all(&dir).unwrap();
}

/// The runway form lists a change set to start later today beside each end's state
/// now (trial finding: "27 … today: as declared" with a closure at 1500Z unseen), and
/// opening the end before that closure starts is refused, naming its start.
#[test]
fn the_runway_form_shows_a_later_closure_and_will_not_cancel_it() {
    use chrono::{TimeZone, Utc};
    use ratatui::crossterm::event::{KeyCode, KeyEvent, KeyModifiers};
    use rhoboard::board::Msg;
    use rhoboard::board::app::Mode;
    use rhoboard::commands::board::{Args, prepare};
    let dir = demo_folder("later");
    let home = dir.join(".home");
    succeeds_in(
        &home,
        &dir,
        &[
            "runway",
            "XSEA",
            "27",
            "--closed",
            "--from",
            "15:00Z",
            "--until",
            "17:00Z",
            "--date",
            "2026-06-14",
        ],
    );
    let args = Args {
        ops: Some(dir.clone()),
        at: Some("2026-06-14T13:00:00Z".into()),
        feed_every: "5m".into(),
        ..Args::default()
    };
    let now = Utc.with_ymd_and_hms(2026, 12, 1, 19, 0, 0).unwrap();
    let (mut app, _) = prepare(&args, now).expect("prepares");
    let key = |c: KeyCode| Msg::Key(KeyEvent::new(c, KeyModifiers::NONE));
    app.update(Msg::Resize(120, 40));
    app.update(key(KeyCode::Char('r')));
    // Onto XSEA 27 (the first leg departs XSEA): the end field, cleared, 27.
    let Mode::Runway(f) = &app.ui.mode else {
        panic!("r opens the form")
    };
    assert_eq!(f.values[0], "XSEA");
    app.update(key(KeyCode::BackTab));
    app.update(Msg::Key(KeyEvent::new(
        KeyCode::Char('u'),
        KeyModifiers::CONTROL,
    )));
    for c in "27".chars() {
        app.update(key(KeyCode::Char(c)));
    }
    let backend = ratatui::backend::TestBackend::new(120, 40);
    let mut term = ratatui::Terminal::new(backend).unwrap();
    term.draw(|fr| fr.render_widget(&app, fr.area())).unwrap();
    let text: String = term
        .backend()
        .buffer()
        .content()
        .chunks(120)
        .map(|row| row.iter().map(|c| c.symbol()).collect::<String>() + "\n")
        .collect();
    // The line wraps in the form (the board shows beside the box).
    let line = text
        .lines()
        .find(|l| l.contains("  27   ▶ in use"))
        .unwrap_or_else(|| panic!("{text}"));
    assert!(
        line.contains("today: as declared; from 1500Z: closed"),
        "{line}"
    );
    assert!(
        text.contains("│    1500Z–1700Z; from 1700Z: as declared "),
        "{text}"
    );
    app.update(key(KeyCode::Tab));
    app.update(key(KeyCode::Char('n')));
    app.update(key(KeyCode::Enter));
    let Mode::Runway(f) = &app.ui.mode else {
        panic!("refused: the form stays")
    };
    // Under "closed", in the form's words (it has no start field).
    assert_eq!(
        f.error_for(2),
        Some(
            "27 is not closed at 1300Z: its closure starts at 1500Z, and opening it earlier would cancel that closure; to end it, open it here at 1500Z or later, or with `rhoboard runway XSEA 27 --open --from` that time"
        )
    );
    assert_eq!(f.focus, 2);
    std::fs::remove_dir_all(&dir).unwrap();
}
