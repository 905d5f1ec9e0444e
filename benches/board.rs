//! The board: a full frame on the synthetic large operator (2,000 legs; issue floor
//! ≤ 5 ms), and from start to the first frame on the demo (floor ≤ 150 ms).

use std::hint::black_box;

use chrono::{TimeZone, Utc};
use criterion::{Criterion, criterion_group, criterion_main};
use ratatui::Terminal;
use ratatui::backend::TestBackend;
use rhoboard::board::{App, Msg, Settings};
use rhoboard::observation::{Store, decode_all};
use rhoboard::ops::load_files;
use rhoboard::ops::synthetic::{self, Size};

fn large() -> App {
    let loaded = load_files(&synthetic::operator(Size::LARGE));
    let ops = loaded.ops.expect("synthetic operator loads");
    let at = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    let mut store = Store::default();
    for (_, text) in &ops.observations {
        for r in decode_all(text, at) {
            store.insert(r.report);
        }
    }
    App::new(ops, store, at, None, Settings::default())
}

fn bench(c: &mut Criterion) {
    let mut app = large();
    assert!(app.assessment.legs.len() >= 2000);
    let mut g = c.benchmark_group("board");
    for (w, h) in [(120u16, 40u16), (200, 60)] {
        app.update(Msg::Resize(w, h));
        let mut terminal = Terminal::new(TestBackend::new(w, h)).unwrap();
        g.bench_function(format!("frame_2000_legs_{w}x{h}"), |b| {
            b.iter(|| {
                terminal
                    .draw(|f| f.render_widget(black_box(&app), f.area()))
                    .unwrap();
            })
        });
    }
    let start = Utc.with_ymd_and_hms(2026, 6, 14, 6, 30, 0).unwrap();
    g.bench_function("demo_start_to_first_frame", |b| {
        b.iter(|| {
            let mut app = App::demo(start, Settings::default()).unwrap();
            app.update(Msg::Resize(120, 40));
            let mut terminal = Terminal::new(TestBackend::new(120, 40)).unwrap();
            terminal.draw(|f| f.render_widget(&app, f.area())).unwrap();
        })
    });
    g.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
