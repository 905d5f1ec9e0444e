//! Observation files into the store: a day's file, appended lines, corrections and a
//! rejected report.

use std::io::Write;

use chrono::{TimeZone, Utc};
use rhoboard::observation::{Insert, ObservationFile, Store, read_reports};

#[test]
fn a_days_file_loads_and_the_last_good_report_stays_valid() {
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("fixtures/metar/day.txt");
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    let reports = read_reports(&path, reference).expect("read day.txt");
    assert_eq!(reports.len(), 29);
    let mut store = Store::default();
    let mut rejected = 0;
    let mut replaced = 0;
    for fr in reports {
        match store.insert(fr.report) {
            Insert::Rejected(_) => rejected += 1,
            Insert::Replaced => replaced += 1,
            _ => {}
        }
    }
    assert_eq!((rejected, replaced), (1, 1));
    assert_eq!(store.stations(), vec!["XHA1", "XQAB"]);
    // The 1920 XQAB SPECI was rejected: at 1925 the 1850 report is valid, and stale at 2006.
    let at = |h, m| Utc.with_ymd_and_hms(2026, 6, 14, h, m, 0).unwrap();
    let v = store.valid_at("XQAB", at(19, 25)).expect("valid");
    assert_eq!(v.report.time_text, "141850Z");
    assert!(!v.stale);
    assert!(store.valid_at("XQAB", at(20, 6)).expect("valid").stale);
    assert!(store.last_rejected("XQAB").is_some());
    // The SPECI at 1422 is valid between 1422 and 1450.
    assert_eq!(
        store.valid_at("XQAB", at(14, 30)).unwrap().report.time_text,
        "141422Z"
    );
    // The correction replaced XHA1 1550.
    let cor = store.valid_at("XHA1", at(15, 55)).unwrap().report;
    assert!(cor.corrected);
    assert_eq!(cor.temperature_c, Some(29.0));
}

#[test]
fn reading_again_after_an_append_adds_only_the_new_reports() {
    let dir = std::env::temp_dir().join(format!("rhoboard-obsfile-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("feed.txt");
    std::fs::write(
        &path,
        "# feed\nMETAR XQAB 141150Z 27010KT 9999 FEW030 18/09 Q1016=\n",
    )
    .unwrap();
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    let mut file = ObservationFile::new(&path);
    let first = file.read_new(reference).unwrap();
    assert_eq!(first.len(), 1);
    assert_eq!(first[0].line, 2);
    assert!(file.read_new(reference).unwrap().is_empty());
    let mut f = std::fs::OpenOptions::new()
        .append(true)
        .open(&path)
        .unwrap();
    write!(
        f,
        "\nMETAR XQAB 141250Z 27012KT 9999 FEW030 20/09 Q1015=\nMETAR XHA1 141250Z 20012KT 9999"
    )
    .unwrap();
    drop(f);
    // The unterminated last line is decoded but read again once it is complete.
    let second = file.read_new(reference).unwrap();
    assert_eq!(
        second.iter().map(|r| r.line).collect::<Vec<_>>(),
        vec![4, 5]
    );
    assert!(!second[1].report.usable_for_performance());
    let mut f = std::fs::OpenOptions::new()
        .append(true)
        .open(&path)
        .unwrap();
    writeln!(f, " FEW080 23/M01 Q1016=").unwrap();
    drop(f);
    let third = file.read_new(reference).unwrap();
    assert_eq!(third.len(), 1);
    assert_eq!(third[0].line, 5);
    assert!(
        third[0].report.usable_for_performance(),
        "{:?}",
        third[0].report.errors
    );
    // A file that shrank (rotated) is read from the start.
    std::fs::write(
        &path,
        "METAR XQAB 141350Z 27012KT 9999 FEW030 21/09 Q1015\n",
    )
    .unwrap();
    let fourth = file.read_new(reference).unwrap();
    assert_eq!(fourth.len(), 1);
    assert_eq!(fourth[0].line, 1);
    std::fs::remove_dir_all(&dir).unwrap();
}
