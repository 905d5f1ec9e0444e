//! How long the air data of one observation takes: station pressure, pressure altitude,
//! moist density and density altitude (target: well under 1 µs).

use std::hint::black_box;

use criterion::{Criterion, criterion_group, criterion_main};
use rhoboard::atmosphere::{self, AirData};

fn air_data(c: &mut Criterion) {
    c.bench_function("air data from one observation (with dew point)", |b| {
        b.iter(|| {
            AirData::from_observation(
                black_box(5_900.0),
                black_box(1_020.0),
                black_box(31.0),
                black_box(Some(8.0)),
            )
        })
    });
    let air = AirData::from_observation(5_900.0, 1_020.0, 31.0, Some(8.0));
    c.bench_function("same air at another OAT (headroom step)", |b| {
        b.iter(|| black_box(&air).with_oat(black_box(33.5)))
    });
    c.bench_function("density altitude from density", |b| {
        b.iter(|| atmosphere::density_altitude_ft(black_box(0.9354)))
    });
}

criterion_group!(benches, air_data);
criterion_main!(benches);
