//! The folder feed: new files and appended lines arrive as messages, once each.

use std::collections::BTreeMap;
use std::io::Write;
use std::sync::mpsc;

use chrono::{TimeZone, Utc};
use rhoboard::board::Msg;
use rhoboard::board::feed::poll_folder;

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
    let dir = std::env::temp_dir().join(format!("rhoboard-feed-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
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
        ["a.txt: METAR XSEA 140600Z 23004KT 9999 FEW030 14/11 Q1019"]
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
            "a.txt: METAR XSEA 140700Z 23005KT 9999 FEW030 17/11 Q1018",
            "b.txt: METAR XFEN 140700Z 22005KT 9999 FEW030 16/10 Q1018"
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
    std::fs::remove_dir_all(&dir).unwrap();
}
