//! The board on the synthetic large operator (200 aircraft, 2,000 airfields with 8,000
//! runway ends, 2,000 legs, 24,000 reports): start-up (loading the operator's files,
//! reading the reports, the first assessment of every leg and the whole pairing matrix,
//! the first frame; issue floor ≤ 1 s) and one new report to a redrawn board (≤ 50 ms).
//! Memory is measured by `cargo run --release --example scale_memory`.

use std::hint::black_box;

use chrono::{TimeZone, Utc};
use criterion::{Criterion, criterion_group, criterion_main};
use ratatui::Terminal;
use ratatui::backend::TestBackend;
use rhoboard::board::{App, Msg, Settings};
use rhoboard::observation::{FileReport, Store, decode, decode_all};
use rhoboard::ops::load_files;
use rhoboard::ops::synthetic::{self, Size};

fn start(files: &rhoboard::ops::OpsFiles) -> App {
    let at = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    let ops = load_files(files).ops.expect("synthetic operator loads");
    let mut store = Store::default();
    for (_, text) in &ops.observations {
        for r in decode_all(text, at) {
            store.insert(r.report);
        }
    }
    App::new(ops, store, at, None, Settings::default())
}

fn bench(c: &mut Criterion) {
    let files = synthetic::operator(Size::LARGE);
    let mut g = c.benchmark_group("scale");
    g.sample_size(10);
    g.bench_function("start-up: load, read reports, assess, first frame", |b| {
        b.iter(|| {
            let mut app = start(black_box(&files));
            app.update(Msg::Resize(160, 48));
            let mut t = Terminal::new(TestBackend::new(160, 48)).unwrap();
            t.draw(|f| f.render_widget(&app, f.area())).unwrap();
        })
    });
    let mut app = start(&files);
    app.update(Msg::Resize(160, 48));
    let mut t = Terminal::new(TestBackend::new(160, 48)).unwrap();
    let station = synthetic::station_id(7);
    let mut minute = 0u32;
    g.bench_function("one new report to a redrawn board", |b| {
        b.iter(|| {
            minute = (minute + 1) % 59;
            let text = format!("METAR {station} 1412{minute:02}Z 27012KT 9999 FEW040 27/10 Q1012");
            let at = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
            let report = decode(&text, at);
            app.update(Msg::Observations {
                source: "bench".to_string(),
                reports: vec![FileReport { line: 1, report }],
            });
            t.draw(|f| f.render_widget(&app, f.area())).unwrap();
        })
    });
    g.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
