//! Soak: a week of reports every ten minutes for every demo airfield, through the same
//! path as the board's feeds (`Msg::Observations` into `App::update`) at full speed,
//! with the clock ticking. Checks that every leg's state equals a fresh recomputation at
//! each checkpoint and that memory stays bounded. The full week is `#[ignore]`d
//! (`cargo test --release --test hardening_soak -- --ignored`); CI runs one day.

use chrono::{DateTime, Duration, TimeZone, Utc};
use rhoboard::assess::{Assessment, Context, DaySettings, Model};
use rhoboard::board::{App, Msg, Settings};
use rhoboard::observation::{FileReport, Store, decode};
use rhoboard::ops::demo;

fn rss_kb() -> Option<u64> {
    std::fs::read_to_string("/proc/self/status")
        .ok()
        .and_then(|s| {
            s.lines()
                .find(|l| l.starts_with("VmRSS:"))
                .and_then(|l| l.split_whitespace().nth(1)?.parse().ok())
        })
}

/// A deterministic report for `station` at `t`: warming by day, a wind that veers.
fn report(station: &str, t: DateTime<Utc>, k: u64) -> String {
    let hour = t.format("%H").to_string().parse::<i32>().unwrap_or(12);
    let temp = 12 + (12 - (hour - 14).abs()).max(0) + (k % 3) as i32;
    let dir = 10 * (1 + (k * 7 % 36));
    let speed = 3 + (k * 5 % 14);
    format!(
        "METAR {station} {}Z {dir:03}{speed:02}KT 9999 FEW040 {temp:02}/06 Q{}",
        t.format("%d%H%M"),
        1008 + (k % 12)
    )
}

fn soak(days: i64) {
    let ops = demo::load().ops.unwrap();
    let stations: Vec<String> = ops.airfields.iter().map(|a| a.id.clone()).collect();
    let start = Utc.with_ymd_and_hms(2026, 6, 14, 0, 0, 0).unwrap();
    let mut app = App::new(ops, Store::default(), start, None, Settings::default());
    app.update(Msg::Resize(120, 40));
    let steps = days * 24 * 6;
    let mut rss_mid = None;
    let mut k: u64 = 0;
    for step in 0..steps {
        let t = start + Duration::minutes(10 * step);
        app.update(Msg::Tick {
            now: t,
            elapsed: std::time::Duration::from_secs(600),
        });
        let reports = stations
            .iter()
            .map(|s| {
                k += 1;
                FileReport {
                    line: 1,
                    report: decode(&report(s, t, k), t),
                }
            })
            .collect();
        app.update(Msg::Observations {
            source: "soak".to_string(),
            reports,
        });
        // Every six hours: the board's states equal a fresh recomputation.
        if step % 36 == 35 {
            let model = Model::new(
                &app.ops,
                &DaySettings::for_date(&app.ops, app.clock.date_naive()),
            );
            let ctx = Context {
                ops: &app.ops,
                model: &model,
                store: &app.store,
                at: app.clock,
            };
            let fresh = Assessment::new(&ctx, app.assessment.leg_indices.clone());
            let board: Vec<_> = app
                .assessment
                .legs
                .iter()
                .map(|l| (l.id.clone(), l.state))
                .collect();
            let again: Vec<_> = fresh.legs.iter().map(|l| (l.id.clone(), l.state)).collect();
            assert_eq!(board, again, "at {t}");
            assert_eq!(
                app.assessment.matrix.cells().count(),
                fresh.matrix.cells().count()
            );
            for (a, b) in app.assessment.matrix.cells().zip(fresh.matrix.cells()) {
                assert_eq!(a.state, b.state, "pairing at {t}");
            }
        }
        if step == steps / 2 {
            rss_mid = rss_kb();
        }
    }
    assert!(app.store.len() as i64 >= steps * stations.len() as i64 - 1);
    if let (Some(mid), Some(end)) = (rss_mid, rss_kb()) {
        // The store keeps every report (about a kilobyte each); beyond that nothing may grow.
        let reports_kb = (steps as u64 / 2) * stations.len() as u64 * 4;
        assert!(
            end <= mid + reports_kb + 16 * 1024,
            "memory grew from {mid} kB to {end} kB over the second half"
        );
    }
}

#[test]
fn one_day_of_ten_minute_reports() {
    soak(1);
}

#[test]
#[ignore = "a week at full speed: run with --release -- --ignored"]
fn a_week_of_ten_minute_reports() {
    soak(7);
}
