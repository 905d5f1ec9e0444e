//! The folder feed: new files and appended lines arrive as messages, once each; the
//! runway-state files are watched on the same pass.

#[path = "common/board.rs"]
mod board_common;

use std::collections::BTreeMap;
use std::io::Write;
use std::sync::mpsc;

use chrono::{TimeZone, Utc};
use rhoboard::board::Msg;
use rhoboard::board::app::NoteKind;
use rhoboard::board::feed::{RunwayStateWatch, poll_folder, poll_runway_state};
use rhoboard::ops::runway_state::EndState;

fn texts(rx: &mpsc::Receiver<Msg>) -> Vec<String> {
    rx.try_iter()
        .flat_map(|m| match m {
            Msg::Observations { source, reports } => reports
                .into_iter()
                .map(|r| format!("{source}: {}", r.report.text))
                .collect::<Vec<_>>(),
            Msg::FeedError { source, error } => vec![format!("error {source}: {error}")],
            other => vec![format!("{other:?}")],
        })
        .collect()
}

#[test]
fn new_files_and_appended_lines_are_read_once() {
    let root = std::env::temp_dir().join(format!("rhoboard-feed-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&root);
    let dir = root.join("observations");
    std::fs::create_dir_all(&dir).unwrap();
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 23, 0, 0).unwrap();
    let (tx, rx) = mpsc::channel();
    let mut files = BTreeMap::new();
    std::fs::write(
        dir.join("a.txt"),
        "METAR XSEA 140600Z 23004KT 9999 FEW030 14/11 Q1019\n",
    )
    .unwrap();
    std::fs::write(dir.join("notes.md"), "not a report file\n").unwrap();
    assert!(poll_folder(&dir, &mut files, reference, &tx));
    assert_eq!(
        texts(&rx),
        ["observations/a.txt: METAR XSEA 140600Z 23004KT 9999 FEW030 14/11 Q1019"]
    );
    assert!(poll_folder(&dir, &mut files, reference, &tx));
    assert!(texts(&rx).is_empty(), "nothing new");
    let mut f = std::fs::OpenOptions::new()
        .append(true)
        .open(dir.join("a.txt"))
        .unwrap();
    writeln!(f, "METAR XSEA 140700Z 23005KT 9999 FEW030 17/11 Q1018").unwrap();
    std::fs::write(
        dir.join("b.txt"),
        "METAR XFEN 140700Z 22005KT 9999 FEW030 16/10 Q1018\n",
    )
    .unwrap();
    assert!(poll_folder(&dir, &mut files, reference, &tx));
    assert_eq!(
        texts(&rx),
        [
            "observations/a.txt: METAR XSEA 140700Z 23005KT 9999 FEW030 17/11 Q1018",
            "observations/b.txt: METAR XFEN 140700Z 22005KT 9999 FEW030 16/10 Q1018"
        ]
    );
    std::fs::remove_dir_all(&dir).unwrap();
    // A folder that went away is an error on screen, not the end of the board.
    assert!(poll_folder(&dir, &mut files, reference, &tx));
    let e = texts(&rx);
    assert!(e[0].starts_with("error folder"), "{e:?}");
    drop(rx);
    std::fs::create_dir_all(&dir).unwrap();
    std::fs::write(
        dir.join("c.txt"),
        "METAR XSEA 140800Z 23006KT 9999 20/11 Q1018\n",
    )
    .unwrap();
    assert!(
        !poll_folder(&dir, &mut files, reference, &tx),
        "stops when the board has gone"
    );
    std::fs::remove_dir_all(&root).unwrap();
}

/// L01's departure runway in use (the demo at 08:00: L01 leaves XSEA).
fn l01_runway(app: &rhoboard::board::App) -> Option<String> {
    let l = app.assessment.legs.iter().find(|l| l.id == "L01")?;
    l.departure.runway.clone()
}

#[test]
fn a_runway_state_changed_by_another_process_reaches_the_board_and_a_broken_one_keeps_the_last_good()
 {
    let dir = tempfile::tempdir().unwrap();
    let mut app = board_common::demo_stepped_to(8);
    assert_eq!(l01_runway(&app).as_deref(), Some("27"), "westerly wind: 27");
    let mut watch = RunwayStateWatch::new(dir.path(), &app.ops);
    let (tx, rx) = mpsc::channel();
    // No folder yet: nothing to say.
    assert!(poll_runway_state(&mut watch, &tx));
    assert_eq!(rx.try_iter().count(), 0);
    // Another process (`rhoboard runway`'s own code) closes XSEA 27.
    let date = chrono::NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    let entry = EndState {
        closed: Some(true),
        airfield: "XSEA".into(),
        end: "27".into(),
        ..EndState::default()
    };
    let (path, written) =
        rhoboard::commands::runway::append_entry(dir.path(), date, entry).unwrap();
    assert!(poll_runway_state(&mut watch, &tx));
    let msgs: Vec<Msg> = rx.try_iter().collect();
    assert_eq!(msgs.len(), 1, "{msgs:?}");
    for m in msgs {
        app.update(m);
    }
    assert_eq!(l01_runway(&app).as_deref(), Some("09"), "27 closed: 09");
    assert!(app.ops.runway_states.contains(&written));
    assert!(
        app.notes
            .iter()
            .any(|n| n.text == "runway-state/2026-06-14.json: changed on disk, read"),
        "{:?}",
        app.notes
    );
    // Read once: the next pass says nothing.
    assert!(poll_runway_state(&mut watch, &tx));
    assert_eq!(rx.try_iter().count(), 0);

    // Half an edit: the file does not read. A message naming file and line; the state
    // the board holds stays.
    std::fs::write(
        &path,
        "{\n  \"schema_version\": 1,\n  \"date\": \"2026-06-14\",\n  \"entries\": [\n",
    )
    .unwrap();
    assert!(poll_runway_state(&mut watch, &tx));
    let e = texts(&rx);
    assert_eq!(e.len(), 1, "{e:?}");
    assert!(
        e[0] == "error runway-state/2026-06-14.json: 5:1: JSON ends too early: EOF while parsing a list; the last good runway state stays",
        "{e:?}"
    );
    app.update(Msg::FeedError {
        source: "runway-state/2026-06-14.json".into(),
        error: e[0].clone(),
    });
    assert_eq!(app.notes.front().map(|n| n.kind), Some(NoteKind::Error));
    assert!(
        app.ops.runway_states.contains(&written),
        "the last good state stays"
    );
    assert_eq!(l01_runway(&app).as_deref(), Some("09"));
    // Mended back to the good file: the state is as the board holds it, and the board
    // says the file reads again (trial finding: the error stood as its last word).
    std::fs::write(&path, serde_json::to_string_pretty(&written).unwrap()).unwrap();
    assert!(poll_runway_state(&mut watch, &tx));
    for m in rx.try_iter() {
        app.update(m);
    }
    assert_eq!(
        app.notes.front().map(|n| n.text.as_str()),
        Some("runway-state/2026-06-14.json: reads again; the runway state is as before")
    );
    assert_eq!(l01_runway(&app).as_deref(), Some("09"));
    // A runway end the airfield does not have is named by its field.
    std::fs::write(
        &path,
        r#"{"schema_version": 1, "date": "2026-06-14", "entries": [{"airfield": "XSEA", "end": "18", "closed": true}]}"#,
    )
    .unwrap();
    assert!(poll_runway_state(&mut watch, &tx));
    assert_eq!(
        texts(&rx),
        [
            "error runway-state/2026-06-14.json: 1:85: entries[0].end: XSEA has no runway end '18' (it has: 09, 27); the last good runway state stays"
        ]
    );
    // Reopened by another process: the board follows.
    let reopen = EndState {
        closed: Some(false),
        airfield: "XSEA".into(),
        end: "27".into(),
        ..EndState::default()
    };
    std::fs::write(&path, serde_json::to_string_pretty(&written).unwrap()).unwrap();
    rhoboard::commands::runway::append_entry(dir.path(), date, reopen).unwrap();
    assert!(poll_runway_state(&mut watch, &tx));
    for m in rx.try_iter() {
        app.update(m);
    }
    assert_eq!(l01_runway(&app).as_deref(), Some("27"), "open again: 27");
    // The file removed: the day has no runway state any more.
    std::fs::remove_file(&path).unwrap();
    assert!(poll_runway_state(&mut watch, &tx));
    for m in rx.try_iter() {
        app.update(m);
    }
    assert!(
        app.ops.runway_states.iter().all(|s| s.entries.is_empty()),
        "{:?}",
        app.ops.runway_states
    );
    assert_eq!(l01_runway(&app).as_deref(), Some("27"));
    drop(rx);
    std::fs::write(&path, serde_json::to_string(&written).unwrap()).unwrap();
    assert!(
        !poll_runway_state(&mut watch, &tx),
        "stops when the board has gone"
    );
}

/// A day file in the watched folder (`2026-06-14.txt`) is dated against its own day, as
/// `check` dates it, not against the board's clock months later (a newcomer's trial saw
/// the June reports of an `init` folder dated in November).
#[test]
fn a_day_file_is_dated_against_its_own_day() {
    let root = std::env::temp_dir().join(format!("rhoboard-feed-day-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&root);
    let dir = root.join("observations");
    std::fs::create_dir_all(&dir).unwrap();
    std::fs::write(
        dir.join("2026-06-14.txt"),
        "METAR XSEA 141200Z 23004KT 9999 FEW030 24/11 Q1019\n",
    )
    .unwrap();
    std::fs::write(
        dir.join("live.txt"),
        "METAR XSEA 011200Z 23004KT 9999 FEW030 4/1 Q1019\n",
    )
    .unwrap();
    let board_clock = Utc.with_ymd_and_hms(2026, 12, 1, 13, 0, 0).unwrap();
    let (tx, rx) = mpsc::channel();
    let mut files = BTreeMap::new();
    assert!(poll_folder(&dir, &mut files, board_clock, &tx));
    let mut times: Vec<(String, Option<chrono::DateTime<Utc>>)> = rx
        .try_iter()
        .flat_map(|m| match m {
            Msg::Observations { source, reports } => reports
                .into_iter()
                .map(|r| (source.clone(), r.report.observed_at))
                .collect::<Vec<_>>(),
            other => panic!("{other:?}"),
        })
        .collect();
    times.sort();
    assert_eq!(
        times,
        [
            (
                // Named with its folder, as `validate` names it.
                "observations/2026-06-14.txt".to_string(),
                Some(Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap())
            ),
            (
                "observations/live.txt".to_string(),
                Some(Utc.with_ymd_and_hms(2026, 12, 1, 12, 0, 0).unwrap())
            ),
        ]
    );
    std::fs::remove_dir_all(&root).unwrap();
}
