//! Table lookup speed: one `locate` shared by the five tables of a demo type, against
//! five lookups that each locate again.

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use rhoboard::ops::demo;

fn bench(c: &mut Criterion) {
    let ops = demo::load().ops.expect("demo loads");
    let p = &ops.aircraft_type("ft4").expect("ft4").performance;
    let points: Vec<(f64, f64, f64)> = (0..64)
        .map(|i| {
            let f = f64::from(i);
            (960.0 + f * 2.9, -500.0 + f * 150.0, -5.0 + f * 0.7)
        })
        .collect();
    c.bench_function("locate once + read five tables (64 points)", |b| {
        b.iter(|| {
            let mut sum = 0.0;
            for &(m, pa, t) in &points {
                let cell = p
                    .locate(black_box(m), black_box(pa), black_box(t))
                    .expect("inside");
                let at = p.at(&cell);
                sum += at.takeoff_distance_50ft_m + at.landing_distance_50ft_m + at.climb_rate_fpm;
            }
            sum
        })
    });
    c.bench_function("locate per table, five tables (64 points)", |b| {
        b.iter(|| {
            let mut sum = 0.0;
            for &(m, pa, t) in &points {
                for table in [
                    &p.takeoff_ground_roll_m,
                    &p.takeoff_distance_50ft_m,
                    &p.landing_distance_50ft_m,
                    &p.landing_ground_roll_m,
                    &p.climb_rate_fpm,
                ] {
                    let cell = p
                        .locate(black_box(m), black_box(pa), black_box(t))
                        .expect("inside");
                    sum += table.at(&cell);
                }
            }
            sum
        })
    });
}

criterion_group!(benches, bench);
criterion_main!(benches);
