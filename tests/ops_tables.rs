//! Performance-table interpolation against hand-worked values (the arithmetic is in the
//! comments), the refusal to extrapolate, and the shared-cell lookup.

use rhoboard::ops::{Axis, Grid, OutsideTable, Table};

/// A 2 × 3 × 3 grid: masses 600/750 kg, pressure altitudes 0/2000/4000 ft, OATs 0/20/40 °C.
fn grid() -> Grid {
    Grid::new(
        vec![600.0, 750.0],
        vec![0.0, 2000.0, 4000.0],
        vec![0.0, 20.0, 40.0],
    )
    .unwrap()
}

/// A table that is exactly linear: v = 100 + 0.5·(m − 600) + 0.05·pa + 2·oat.
/// Multilinear interpolation reproduces a linear function exactly anywhere in the grid.
fn linear(g: &Grid) -> Table {
    let mut v = Vec::new();
    for &m in g.mass_kg() {
        for &p in g.pressure_altitude_ft() {
            for &t in g.oat_c() {
                v.push(100.0 + 0.5 * (m - 600.0) + 0.05 * p + 2.0 * t);
            }
        }
    }
    Table::from_flat(g, v).unwrap()
}

#[test]
fn hand_worked_between_grid_points_on_all_three_axes() {
    // Nested as a manual prints it: [mass][pressure altitude][oat].
    let g = grid();
    let t = Table::from_nested(
        &g,
        &[
            vec![
                vec![200.0, 220.0, 250.0],
                vec![230.0, 255.0, 290.0],
                vec![265.0, 295.0, 340.0],
            ],
            vec![
                vec![300.0, 330.0, 370.0],
                vec![345.0, 380.0, 430.0],
                vec![400.0, 445.0, 505.0],
            ],
        ],
    )
    .unwrap();
    // Point: mass 700 kg, pressure altitude 3000 ft, OAT 30 °C.
    // Fractions: mass (700−600)/150 = 2/3; pa (3000−2000)/2000 = 1/2; oat (30−20)/20 = 1/2.
    // Cell corners: pa rows 2000 and 4000, oat columns 20 and 40.
    // Mass 600: at pa 2000: 255 + ½(290−255) = 272.5; at pa 4000: 295 + ½(340−295) = 317.5;
    //           between: 272.5 + ½(317.5−272.5) = 295.
    // Mass 750: at pa 2000: 380 + ½(430−380) = 405;   at pa 4000: 445 + ½(505−445) = 475;
    //           between: 405 + ½(475−405) = 440.
    // Mass 700: 295 + ⅔(440−295) = 295 + 96.666… = 391.666…
    let cell = g.locate(700.0, 3000.0, 30.0).unwrap();
    let v = t.at(&cell);
    assert!((v - 391.666_666_666_666_7).abs() < 1e-9, "{v}");
    // The weights sum to one.
    assert!((cell.weights().iter().sum::<f64>() - 1.0).abs() < 1e-12);
}

#[test]
fn second_hand_worked_case_in_a_different_cell() {
    let g = grid();
    let t = Table::from_nested(
        &g,
        &[
            vec![
                vec![200.0, 220.0, 250.0],
                vec![230.0, 255.0, 290.0],
                vec![265.0, 295.0, 340.0],
            ],
            vec![
                vec![300.0, 330.0, 370.0],
                vec![345.0, 380.0, 430.0],
                vec![400.0, 445.0, 505.0],
            ],
        ],
    )
    .unwrap();
    // Point: 637.5 kg, 500 ft, 5 °C. Fractions: mass 37.5/150 = ¼; pa 500/2000 = ¼; oat 5/20 = ¼.
    // Mass 600: pa 0: 200 + ¼·20 = 205; pa 2000: 230 + ¼·25 = 236.25; → 205 + ¼·31.25 = 212.8125.
    // Mass 750: pa 0: 300 + ¼·30 = 307.5; pa 2000: 345 + ¼·35 = 353.75; → 307.5 + ¼·46.25 = 319.0625.
    // Mass 637.5: 212.8125 + ¼·(319.0625 − 212.8125) = 212.8125 + 26.5625 = 239.375.
    let v = t.at(&g.locate(637.5, 500.0, 5.0).unwrap());
    assert!((v - 239.375).abs() < 1e-9, "{v}");
}

#[test]
fn grid_points_and_edges_are_exact() {
    let g = grid();
    let t = linear(&g);
    for (m, p, o) in [
        (600.0, 0.0, 0.0),
        (750.0, 4000.0, 40.0),
        (750.0, 2000.0, 20.0),
        (600.0, 4000.0, 0.0),
    ] {
        let expect = 100.0 + 0.5 * (m - 600.0) + 0.05 * p + 2.0 * o;
        assert_eq!(t.at(&g.locate(m, p, o).unwrap()), expect);
    }
    // Linear data is reproduced exactly between points: 100 + 0.5·111 + 0.05·3210 + 2·17.3
    // = 100 + 55.5 + 160.5 + 34.6 = 350.6.
    let v = t.at(&g.locate(711.0, 3210.0, 17.3).unwrap());
    assert!((v - 350.6).abs() < 1e-9, "{v}");
}

#[test]
fn one_cell_serves_every_table_on_the_grid() {
    let g = grid();
    let a = linear(&g);
    let b = Table::from_flat(&g, a.values().iter().map(|v| v * 2.0).collect()).unwrap();
    let cell = g.locate(700.0, 1000.0, 10.0).unwrap();
    assert!((b.at(&cell) - 2.0 * a.at(&cell)).abs() < 1e-9);
}

#[test]
fn outside_the_table_is_refused_never_extrapolated() {
    let g = grid();
    let e = g.locate(700.0, 3000.0, 41.0).unwrap_err();
    assert_eq!(
        e,
        OutsideTable {
            axis: Axis::Oat,
            value: 41.0,
            range: (0.0, 40.0)
        }
    );
    insta::assert_snapshot!(e, @"OAT 41.0 °C is outside the flight-manual table (0.0 to 40.0 °C)");
    let e = g.locate(760.0, 3000.0, 20.0).unwrap_err();
    insta::assert_snapshot!(e, @"mass 760 kg is outside the flight-manual table (600 to 750 kg)");
    let e = g.locate(700.0, -200.0, 20.0).unwrap_err();
    insta::assert_snapshot!(e, @"pressure altitude -200 ft is outside the flight-manual table (0 to 4000 ft)");
    assert!(g.locate(f64::NAN, 0.0, 0.0).is_err());
    assert!(g.locate(700.0, f64::INFINITY, 0.0).is_err());
}

#[test]
fn conservative_lookup_holds_low_values_and_refuses_high_ones() {
    let g = grid();
    let t = linear(&g);
    let (cell, clamped) = g.locate_conservative(700.0, -160.0, 10.0).unwrap();
    assert!(clamped.pressure_altitude && !clamped.mass && !clamped.oat);
    // Held at pa 0: 100 + 0.5·100 + 0 + 2·10 = 170.
    assert!((t.at(&cell) - 170.0).abs() < 1e-9);
    assert!(g.locate_conservative(700.0, 4100.0, 10.0).is_err());
}

#[test]
fn bad_axes_and_shapes_are_errors() {
    let e = Grid::new(vec![600.0, 600.0], vec![0.0], vec![0.0]).unwrap_err();
    insta::assert_snapshot!(e, @"axis mass_kg must be strictly increasing, but 600 follows 600");
    let g = grid();
    let e = Table::from_nested(
        &g,
        &[
            vec![vec![1.0; 3]; 3],
            vec![vec![1.0; 2], vec![1.0; 3], vec![1.0; 3]],
        ],
    )
    .unwrap_err();
    insta::assert_snapshot!(e, @"expected 3 columns (one per oat_c value), found 2");
}

#[test]
fn single_point_axis_accepts_only_its_value() {
    let g = Grid::new(vec![750.0], vec![0.0, 1000.0], vec![0.0, 10.0]).unwrap();
    let t = Table::from_flat(&g, vec![1.0, 2.0, 3.0, 4.0]).unwrap();
    // pa ½, oat ½: (1 + 2 + 3 + 4)/4 = 2.5.
    assert!((t.at(&g.locate(750.0, 500.0, 5.0).unwrap()) - 2.5).abs() < 1e-12);
    assert!(g.locate(700.0, 500.0, 5.0).is_err());
}

mod properties {
    use proptest::prelude::*;
    use rhoboard::ops::demo;

    proptest! {
        #![proptest_config(ProptestConfig { cases: 256, .. ProptestConfig::default() })]

        /// On the demo's (validated, monotonic) tables: hotter, higher or heavier never
        /// shortens a distance or improves the climb, and every value lies between the
        /// table's extremes.
        #[test]
        fn interpolation_keeps_the_tables_order(
            ty in 0usize..3, m in 0.0f64..1.0, pa in 0.0f64..1.0, t in 0.0f64..1.0, d in 0.0f64..0.2, axis in 0usize..3,
        ) {
            let ops = demo::load().ops.unwrap();
            let p = &ops.types[ty].performance;
            let g = &p.grid;
            let span = |v: &[f64], f: f64| v[0] + f * (v[v.len() - 1] - v[0]);
            let (m0, pa0, t0) = (span(g.mass_kg(), m), span(g.pressure_altitude_ft(), pa), span(g.oat_c(), t));
            let mut x = [m, pa, t];
            x[axis] = (x[axis] + d).min(1.0);
            let (m1, pa1, t1) = (span(g.mass_kg(), x[0]), span(g.pressure_altitude_ft(), x[1]), span(g.oat_c(), x[2]));
            let a = p.at(&p.locate(m0, pa0, t0).unwrap());
            let b = p.at(&p.locate(m1, pa1, t1).unwrap());
            let eps = 1e-9;
            prop_assert!(b.takeoff_ground_roll_m >= a.takeoff_ground_roll_m - eps);
            prop_assert!(b.takeoff_distance_50ft_m >= a.takeoff_distance_50ft_m - eps);
            prop_assert!(b.landing_distance_50ft_m >= a.landing_distance_50ft_m - eps);
            prop_assert!(b.landing_ground_roll_m >= a.landing_ground_roll_m - eps);
            prop_assert!(b.climb_rate_fpm <= a.climb_rate_fpm + eps);
            let v = p.takeoff_distance_50ft_m.values();
            let (lo, hi) = v.iter().fold((f64::MAX, f64::MIN), |(l, h), &x| (l.min(x), h.max(x)));
            prop_assert!(a.takeoff_distance_50ft_m >= lo - eps && a.takeoff_distance_50ft_m <= hi + eps);
        }
    }
}
