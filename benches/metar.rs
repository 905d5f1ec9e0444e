//! Decoding speed and store loading (issue 3: < 2 µs a typical report; a 10,000-report
//! file into the store well under 50 ms).
//!
//! cargo bench --bench metar -- --warm-up-time 1 --measurement-time 3

use std::hint::black_box;

use chrono::{TimeZone, Utc};
use criterion::{Criterion, criterion_group, criterion_main};
use rhoboard::observation::{ObservationFile, Store, decode};

const TYPICAL: &str =
    "METAR XQAB 141250Z 27015G25KT 240V300 9999 -SHRA FEW020 BKN035 21/12 Q1015 NOSIG";
const US: &str = "XMTN 141251Z 22012G20KT 10SM FEW080 SCT200 31/M02 A3012 RMK AO2 SLP142 T03111017";

fn day_file(n: usize) -> String {
    let mut s = String::with_capacity(n * 80);
    let stations = 50;
    for k in 0..n {
        let st = k % stations;
        let hour_index = k / stations; // hourly, from the 6th to the 14th
        let day = 6 + (hour_index / 24) as u32;
        let hour = (hour_index % 24) as u32;
        let t = 5 + (k % 30) as i32;
        s.push_str(&format!(
            "METAR X{st:03} {day:02}{hour:02}50Z {:03}{:02}KT 9999 FEW030 SCT080 {t:02}/05 Q{}\n",
            (k * 10) % 360,
            5 + k % 20,
            1000 + k % 30
        ));
    }
    s
}

fn benches(c: &mut Criterion) {
    let reference = Utc.with_ymd_and_hms(2026, 6, 14, 23, 59, 0).unwrap();
    c.bench_function("decode typical ICAO report", |b| {
        b.iter(|| decode(black_box(TYPICAL), reference))
    });
    c.bench_function("decode US report with remarks", |b| {
        b.iter(|| decode(black_box(US), reference))
    });

    let dir = std::env::temp_dir().join(format!("rhoboard-bench-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp dir");
    let path = dir.join("observations.txt");
    std::fs::write(&path, day_file(10_000)).expect("write bench file");
    let mut group = c.benchmark_group("store");
    group.sample_size(20);
    group.bench_function("load 10,000-report file into the store", |b| {
        b.iter(|| {
            let mut file = ObservationFile::new(&path);
            let mut store = Store::default();
            for fr in file.read_new(reference).expect("read") {
                store.insert(fr.report);
            }
            assert_eq!(store.len(), 10_000);
            store
        })
    });
    let mut store = Store::default();
    let mut file = ObservationFile::new(&path);
    for fr in file.read_new(reference).expect("read") {
        store.insert(fr.report);
    }
    let at = Utc.with_ymd_and_hms(2026, 6, 12, 7, 10, 0).unwrap();
    group.bench_function("valid_at lookup", |b| {
        b.iter(|| {
            store
                .valid_at(black_box("X017"), black_box(at))
                .map(|v| v.stale)
        })
    });
    group.finish();
    let _ = std::fs::remove_dir_all(&dir);
}

criterion_group!(metar, benches);
criterion_main!(metar);
