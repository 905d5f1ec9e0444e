//! The assessment on a deterministic synthetic large operator (`ops::synthetic`):
//! 200 aircraft of 10 types, 2,000 airfields with 8,000 runway ends, 2,000 legs.
//! Targets (issue floors): one runway-end takeoff+climb evaluation ≤ 150 ns; the full
//! pairing matrix (400,000 pairs, all ends) ≤ 0.5 s; all legs with headroom ≤ 0.2 s;
//! the incremental update for one new report ≤ 2 ms. DESIGN.md aims at ~10 ms for the
//! matrix.

use std::hint::black_box;

use chrono::{TimeZone, Utc};
use criterion::{Criterion, criterion_group, criterion_main};
use rhoboard::assess::leg::{FieldWx, Setup, departure_chains};
use rhoboard::assess::{Assessment, Context, DaySettings, Model, assess_leg, pairing, perf};
use rhoboard::observation::{Store, decode_all};
use rhoboard::ops::synthetic::{self, Size};
use rhoboard::ops::{Category, Ops, load_files};

fn operator() -> (Ops, Store) {
    let files = synthetic::operator(Size::LARGE);
    let loaded = load_files(&files);
    assert!(
        loaded.report.errors.is_empty(),
        "{:?}",
        loaded.report.errors.first()
    );
    let ops = loaded.ops.expect("loads");
    let at = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    let mut store = Store::default();
    for (_, text) in &ops.observations {
        for r in decode_all(text, at) {
            store.insert(r.report);
        }
    }
    (ops, store)
}

fn bench(c: &mut Criterion) {
    let (ops, store) = operator();
    let at = Utc.with_ymd_and_hms(2026, 6, 14, 12, 0, 0).unwrap();
    let model = Model::new(&ops, &DaySettings::default());
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &store,
        at,
    };

    // One runway end: takeoff chain, its checks and the climb.
    let fi = 7;
    let report = store
        .valid_at(&ops.airfields[fi].id, at)
        .expect("report")
        .report;
    let wx = FieldWx::from_report(report, ops.airfields[fi].elevation_ft).expect("wx");
    let end = &model.field_ends(fi)[0];
    let w = wx.on_end(end.heading_true_deg);
    let ty = &model.types[1];
    let mins = ops.minimums(Category::Dual).expect("dual");
    let setup = Setup {
        model: &model,
        ty,
        perf: &ops.types[ty.index].performance,
        mins,
        takeoff_mass_kg: ty.max_takeoff_mass_kg * 0.9,
        landing_mass_kg: ty.max_takeoff_mass_kg * 0.88,
        distance_buffer: 0.1,
        climb_buffer: 0.1,
    };
    c.bench_function("one runway end: takeoff + checks + climb", |b| {
        b.iter(|| {
            let (chain, climb) = departure_chains(
                black_box(&setup),
                black_box(end),
                black_box(&wx.air),
                black_box(w.headwind_kt),
            )
            .expect("in table");
            (
                perf::min_margin(&chain, end, &mins.takeoff_checks, 1.0),
                climb.margin(),
            )
        })
    });

    let mut group = c.benchmark_group("large operator");
    group.sample_size(10);
    group.bench_function(
        "pairing matrix (200 aircraft x 2,000 airfields, all ends, headroom)",
        |b| b.iter(|| pairing::matrix(black_box(&ctx))),
    );
    let legs: Vec<usize> = (0..ops.legs.len()).collect();
    group.bench_function("all 2,000 legs with headroom", |b| {
        b.iter(|| {
            legs.iter()
                .filter_map(|&i| assess_leg(black_box(&ctx), i))
                .count()
        })
    });
    let mut day = Assessment::new(&ctx, legs.clone());
    let station = ops.airfields[fi].id.clone();
    group.bench_function("incremental update for one new report", |b| {
        b.iter(|| day.on_report(black_box(&ctx), black_box(&station)))
    });
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
