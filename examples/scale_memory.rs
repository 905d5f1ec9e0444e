//! The board's memory on the synthetic large operator: resident set size after start-up
//! and after 500 new reports (read from /proc/self/status; Linux).
//!
//!     cargo run --release --example scale_memory

use chrono::{Duration, TimeZone, Utc};
use rhoboard::board::{App, Msg, Settings};
use rhoboard::observation::{FileReport, Store, decode, decode_all};
use rhoboard::ops::load_files;
use rhoboard::ops::synthetic::{self, Size};

fn rss_mb() -> f64 {
    std::fs::read_to_string("/proc/self/status")
        .ok()
        .and_then(|s| {
            s.lines().find(|l| l.starts_with("VmRSS:")).and_then(|l| {
                l.split_whitespace()
                    .nth(1)
                    .and_then(|v| v.parse::<f64>().ok())
            })
        })
        .map_or(f64::NAN, |kb| kb / 1024.0)
}

fn main() {
    let before = rss_mb();
    let at = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    let ops = load_files(&synthetic::operator(Size::LARGE))
        .ops
        .expect("loads");
    let mut store = Store::default();
    for (_, text) in &ops.observations {
        for r in decode_all(text, at) {
            store.insert(r.report);
        }
    }
    let mut app = App::new(ops, store, at, None, Settings::default());
    app.update(Msg::Resize(160, 48));
    let started = rss_mb();
    for k in 0..500 {
        let t = at + Duration::minutes(k);
        let text = format!(
            "METAR {} {}Z 27012KT 9999 FEW040 27/10 Q1012",
            synthetic::station_id((k as usize * 37) % 2000),
            t.format("%d%H%M")
        );
        app.update(Msg::Observations {
            source: "memory".to_string(),
            reports: vec![FileReport {
                line: 1,
                report: decode(&text, t),
            }],
        });
    }
    println!(
        "RSS: {before:.0} MB before, {started:.0} MB after start-up, {:.0} MB after 500 reports",
        rss_mb()
    );
}
