//! The checks behind `rhoboard validate`: per file (schema is serde's job; this is the
//! meaning) and across files (references, overlaps, coverage). Every problem is
//! collected; nothing stops at the first.

#![expect(
    clippy::neg_cmp_op_on_partial_ord,
    reason = "`!(x >= 0.0)` also refuses NaN, which `x < 0.0` would let through"
)]

use std::collections::{HashMap, HashSet};

use super::Ops;
use super::actype::{AircraftType, Nested, SurfaceRule};
use super::airfield::Airfield;
use super::fleet::{AircraftFile, Status};
use super::legs::LegsFile;
use super::load::Collector;
use super::operator::{Available, OperatorFile};
use super::pilots::{Category, PilotsFile};
use super::tables::Axis;

fn file_stem(file: &str) -> &str {
    let name = file.rsplit('/').next().unwrap_or(file);
    name.strip_suffix(".json").unwrap_or(name)
}

fn template(c: &mut Collector<'_>, file: &str, notice: &Option<String>) {
    if notice.is_some() {
        c.warn(
            file,
            "replace_before_use",
            "this file is still the fictional template from `rhoboard init`: replace its values with your own, then delete `replace_before_use`",
        );
    }
}

fn positive(c: &mut Collector<'_>, file: &str, path: &str, v: f64, what: &str) {
    if !(v > 0.0 && v.is_finite()) {
        c.error(
            file,
            path,
            format!("{what} must be a positive number, found {v}"),
        );
    }
}

fn non_empty(c: &mut Collector<'_>, file: &str, path: &str, v: &str, what: &str) {
    if v.trim().is_empty() {
        c.error(file, path, format!("{what} is empty; fill it in"));
    }
}

/// Checks `operator.json`.
pub fn check_operator(o: &OperatorFile, c: &mut Collector<'_>) {
    let f = "operator.json";
    template(c, f, &o.replace_before_use);
    non_empty(c, f, "name", &o.name, "operator name");
    if o.time_zone.utc_offset_min.abs() > 14 * 60 {
        c.error(
            f,
            "time_zone.utc_offset_min",
            format!(
                "UTC offset {} min is beyond ±14 h",
                o.time_zone.utc_offset_min
            ),
        );
    }
    let p = &o.policy;
    positive(
        c,
        f,
        "policy.stale_after_min",
        p.stale_after_min,
        "stale age",
    );
    positive(
        c,
        f,
        "policy.sign_off.recheck_density_altitude_rise_ft",
        p.sign_off.recheck_density_altitude_rise_ft,
        "re-check density-altitude step",
    );
    if !p.sign_off.recheck_headroom_floor_c.is_finite() {
        c.error(
            f,
            "policy.sign_off.recheck_headroom_floor_c",
            "re-check headroom floor must be a number of °C".to_string(),
        );
    }
    if !(0.0..=100.0).contains(&p.wind.headwind_credit_percent) {
        c.error(
            f,
            "policy.wind.headwind_credit_percent",
            format!(
                "headwind credit {} % must be between 0 and 100 (EASA class B: at most 50)",
                p.wind.headwind_credit_percent
            ),
        );
    }
    if !(p.wind.tailwind_penalty_percent >= 100.0) {
        c.error(
            f,
            "policy.wind.tailwind_penalty_percent",
            format!(
                "tailwind penalty {} % must be at least 100 (EASA class B: at least 150)",
                p.wind.tailwind_penalty_percent
            ),
        );
    }
    for (phase, fb) in [
        ("takeoff", &p.fallback_corrections.takeoff),
        ("landing", &p.fallback_corrections.landing),
    ] {
        for (name, r) in [
            ("grass_dry", &fb.grass_dry),
            ("grass_wet", &fb.grass_wet),
            ("paved_wet", &fb.paved_wet),
        ] {
            let path = format!("policy.fallback_corrections.{phase}.{name}.rule");
            surface_rule(c, f, &path, r.rule);
            non_empty(
                c,
                f,
                &format!("policy.fallback_corrections.{phase}.{name}.source"),
                &r.source,
                "source",
            );
        }
        let path = format!(
            "policy.fallback_corrections.{phase}.adverse_slope.increase_percent_per_percent"
        );
        if !(fb.adverse_slope.increase_percent_per_percent >= 0.0) {
            c.error(
                f,
                &path,
                "slope correction must be zero or positive (a favourable slope earns no credit)",
            );
        }
    }
    if o.categories.is_empty() {
        c.error(f, "categories", "no pilot categories: give minimums for at least one of student_solo, solo, dual, charter");
    }
    for (cat, m) in &o.categories {
        let base = format!("categories.{}", cat.name());
        for (kind, checks, landing) in [
            ("takeoff_checks", &m.takeoff_checks, false),
            ("landing_checks", &m.landing_checks, true),
        ] {
            if checks.is_empty() {
                c.error(
                    f,
                    &format!("{base}.{kind}"),
                    format!("no {kind}: give at least one `required × factor ≤ available` check"),
                );
            }
            for (i, ch) in checks.iter().enumerate() {
                let path = format!("{base}.{kind}[{i}]");
                if !(ch.factor >= 1.0 && ch.factor.is_finite()) {
                    c.error(
                        f,
                        &format!("{path}.factor"),
                        format!("factor {} must be at least 1.0", ch.factor),
                    );
                }
                let ok = if landing {
                    ch.available == Available::Lda
                } else {
                    ch.available != Available::Lda
                };
                if !ok {
                    c.error(
                        f,
                        &format!("{path}.available"),
                        if landing {
                            "a landing check compares with `lda`".to_string()
                        } else {
                            "a takeoff check compares with `tora`, `toda` or `asda`, not `lda`"
                                .to_string()
                        },
                    );
                }
                non_empty(
                    c,
                    f,
                    &format!("{path}.source"),
                    &ch.source,
                    "source of the factor",
                );
            }
        }
        for (name, v) in [
            ("min_visibility_m", m.min_visibility_m),
            ("max_wind_kt", m.max_wind_kt),
            ("max_gust_kt", m.max_gust_kt),
            ("max_crosswind_kt", m.max_crosswind_kt),
            ("max_density_altitude_ft", m.max_density_altitude_ft),
        ] {
            positive(c, f, &format!("{base}.{name}"), v, name);
        }
        for (name, v) in [
            ("min_ceiling_ft", m.min_ceiling_ft),
            ("max_tailwind_kt", m.max_tailwind_kt),
            ("max_gust_spread_kt", m.max_gust_spread_kt),
            ("min_climb_rate_fpm", m.min_climb_rate_fpm),
        ] {
            if !(v >= 0.0 && v.is_finite()) {
                c.error(
                    f,
                    &format!("{base}.{name}"),
                    format!("{name} must be zero or positive, found {v}"),
                );
            }
        }
        if m.max_gust_kt < m.max_wind_kt {
            c.warn(
                f,
                &format!("{base}.max_gust_kt"),
                format!(
                    "max gust {} kt is below max wind {} kt",
                    m.max_gust_kt, m.max_wind_kt
                ),
            );
        }
    }
}

fn surface_rule(c: &mut Collector<'_>, f: &str, path: &str, r: SurfaceRule) {
    match r {
        SurfaceRule::MultiplyBy(x) if !(x >= 1.0 && x.is_finite()) => c.error(
            f,
            &format!("{path}.multiply_by"),
            format!("factor {x} must be at least 1.0 (a surface never shortens a distance here)"),
        ),
        SurfaceRule::AddPercentOfGroundRoll(x) if !(x >= 0.0 && x.is_finite()) => c.error(
            f,
            &format!("{path}.add_percent_of_ground_roll"),
            format!("percentage {x} must be zero or positive"),
        ),
        _ => {}
    }
}

/// Checks `pilots.json`.
pub fn check_pilots(p: &PilotsFile, c: &mut Collector<'_>) {
    let f = "pilots.json";
    template(c, f, &p.replace_before_use);
    let mut seen = HashMap::new();
    for (i, pilot) in p.pilots.iter().enumerate() {
        let path = format!("pilots[{i}]");
        if let Some(first) = seen.insert(pilot.id.as_str(), i) {
            c.error(
                f,
                &format!("{path}.id"),
                format!("duplicate pilot id '{}' (also pilots[{first}])", pilot.id),
            );
        }
        non_empty(c, f, &format!("{path}.id"), &pilot.id, "pilot id");
        non_empty(c, f, &format!("{path}.name"), &pilot.name, "pilot name");
        if pilot.category == Category::StudentSolo && pilot.endorsements.solo.is_empty() {
            c.warn(f, &format!("{path}.endorsements.solo"), "student has no solo endorsement; student solo legs will fail the endorsement check");
        }
    }
}

/// Checks `fleet/aircraft.json`.
pub fn check_aircraft_file(a: &AircraftFile, c: &mut Collector<'_>) {
    let f = "fleet/aircraft.json";
    template(c, f, &a.replace_before_use);
    let mut seen = HashMap::new();
    for (i, ac) in a.aircraft.iter().enumerate() {
        let path = format!("aircraft[{i}]");
        if let Some(first) = seen.insert(ac.registration.as_str(), i) {
            c.error(
                f,
                &format!("{path}.registration"),
                format!(
                    "duplicate registration '{}' (also aircraft[{first}])",
                    ac.registration
                ),
            );
        }
        non_empty(
            c,
            f,
            &format!("{path}.registration"),
            &ac.registration,
            "registration",
        );
        positive(
            c,
            f,
            &format!("{path}.empty_mass_kg"),
            ac.empty_mass_kg,
            "empty mass",
        );
        match (ac.status, &ac.maintenance) {
            (Status::Maintenance, None) => c.error(
                f,
                &format!("{path}.status"),
                "status is `maintenance` but there is no `maintenance` note: add {\"note\": …, \"since\": \"YYYY-MM-DD\"}",
            ),
            (Status::Available, Some(_)) => c.warn(
                f,
                &format!("{path}.maintenance"),
                "a maintenance note on an available aircraft; remove it or set status to `maintenance`",
            ),
            _ => {}
        }
    }
}

fn index_path(m: usize, p: usize, t: usize) -> String {
    format!("[{m}][{p}][{t}]")
}

/// Checks one type file (its tables have been built, so the shapes match the axes).
pub fn check_type(file: &str, t: &AircraftType, c: &mut Collector<'_>) {
    let tf = &t.file;
    template(c, file, &tf.replace_before_use);
    if tf.id != file_stem(file) {
        c.error(
            file,
            "id",
            format!(
                "id '{}' differs from the file name; name the file {}.json",
                tf.id, tf.id
            ),
        );
    }
    non_empty(c, file, "name", &tf.name, "type name");
    if tf.engines == 0 {
        c.error(file, "engines", "engines must be at least 1");
    }
    let l = &tf.limits;
    positive(
        c,
        file,
        "limits.max_takeoff_mass_kg",
        l.max_takeoff_mass_kg,
        "maximum takeoff mass",
    );
    positive(
        c,
        file,
        "limits.max_landing_mass_kg",
        l.max_landing_mass_kg,
        "maximum landing mass",
    );
    positive(
        c,
        file,
        "limits.max_demonstrated_crosswind_kt",
        l.max_demonstrated_crosswind_kt,
        "maximum demonstrated crosswind",
    );
    if l.max_landing_mass_kg > l.max_takeoff_mass_kg {
        c.warn(
            file,
            "limits.max_landing_mass_kg",
            "maximum landing mass is above maximum takeoff mass; check the manual",
        );
    }
    let s = &tf.speeds;
    for (name, v) in [
        ("rotation_kias", s.rotation_kias),
        ("vx_kias", s.vx_kias),
        ("vy_kias", s.vy_kias),
        ("approach_kias", s.approach_kias),
    ] {
        positive(c, file, &format!("speeds.{name}"), v, name);
    }
    for (name, v) in [
        ("document", &tf.source.document),
        ("revision", &tf.source.revision),
        ("entered_by", &tf.source.entered_by),
        ("checked_by", &tf.source.checked_by),
    ] {
        non_empty(c, file, &format!("source.{name}"), v, name);
    }
    let g = &t.performance.grid;
    let (_, top_mass) = g.range(Axis::Mass);
    if top_mass < l.max_takeoff_mass_kg {
        c.warn(
            file,
            "performance.axes.mass_kg",
            format!("tables stop at {top_mass} kg, below the maximum takeoff mass {} kg; heavier legs will be no-data", l.max_takeoff_mass_kg),
        );
    }
    let p = &tf.performance;
    let distances: [(&str, &Nested, &Option<String>); 4] = [
        (
            "takeoff.ground_roll_m",
            &p.takeoff.ground_roll_m,
            &p.takeoff.irregular_ok,
        ),
        (
            "takeoff.distance_50ft_m",
            &p.takeoff.distance_50ft_m,
            &p.takeoff.irregular_ok,
        ),
        (
            "landing.distance_50ft_m",
            &p.landing.distance_50ft_m,
            &p.landing.irregular_ok,
        ),
        (
            "landing.ground_roll_m",
            &p.landing.ground_roll_m,
            &p.landing.irregular_ok,
        ),
    ];
    for (name, table, irregular) in distances {
        for_each(table, |m, pa, oat, v| {
            if !(v > 0.0) {
                c.error(
                    file,
                    &format!("performance.{name}{}", index_path(m, pa, oat)),
                    format!("distance {v} m must be positive"),
                );
            }
        });
        if irregular.is_none() {
            monotonic(file, &format!("performance.{name}"), table, g, true, c);
        }
    }
    if p.climb.irregular_ok.is_none() {
        monotonic(
            file,
            "performance.climb.rate_fpm",
            &p.climb.rate_fpm,
            g,
            false,
            c,
        );
    }
    positive(
        c,
        file,
        "performance.climb.climb_speed_kias",
        p.climb.climb_speed_kias,
        "climb speed",
    );
    for (phase, gr, d50) in [
        (
            "takeoff",
            &p.takeoff.ground_roll_m,
            &p.takeoff.distance_50ft_m,
        ),
        (
            "landing",
            &p.landing.ground_roll_m,
            &p.landing.distance_50ft_m,
        ),
    ] {
        for_each(gr, |m, pa, oat, v| {
            let d = d50[m][pa][oat];
            if v > d {
                c.error(
                    file,
                    &format!("performance.{phase}.ground_roll_m{}", index_path(m, pa, oat)),
                    format!("ground roll {v} m is longer than the 50 ft distance {d} m at the same point; one of them is mistyped"),
                );
            }
        });
    }
    for (phase, pc) in [
        ("takeoff", &tf.corrections.takeoff),
        ("landing", &tf.corrections.landing),
    ] {
        for (name, r) in [
            ("grass_dry", pc.grass_dry),
            ("grass_wet", pc.grass_wet),
            ("paved_wet", pc.paved_wet),
        ] {
            if let Some(r) = r {
                surface_rule(c, file, &format!("corrections.{phase}.{name}"), r);
            }
        }
        for (name, v) in [
            (
                "headwind_decrease_percent_per_kt",
                pc.headwind_decrease_percent_per_kt,
            ),
            (
                "tailwind_increase_percent_per_kt",
                pc.tailwind_increase_percent_per_kt,
            ),
            (
                "adverse_slope_increase_percent_per_percent",
                pc.adverse_slope_increase_percent_per_percent,
            ),
        ] {
            if let Some(v) = v
                && !(v >= 0.0 && v.is_finite())
            {
                c.error(
                    file,
                    &format!("corrections.{phase}.{name}"),
                    format!("{v} must be zero or positive"),
                );
            }
        }
    }
    if let Some(mb) = &tf.mass_balance {
        let mut ids = HashSet::new();
        for (i, st) in mb.stations.iter().enumerate() {
            if !ids.insert(st.id.as_str()) {
                c.error(
                    file,
                    &format!("mass_balance.stations[{i}].id"),
                    format!("duplicate station id '{}'", st.id),
                );
            }
            positive(
                c,
                file,
                &format!("mass_balance.stations[{i}].max_mass_kg"),
                st.max_mass_kg,
                "station limit",
            );
        }
        for (i, tank) in mb.fuel_tanks.iter().enumerate() {
            positive(
                c,
                file,
                &format!("mass_balance.fuel_tanks[{i}].usable_capacity_l"),
                tank.usable_capacity_l,
                "tank capacity",
            );
            if !(0.5..=1.0).contains(&tank.fuel_density_kg_per_l) {
                c.error(
                    file,
                    &format!("mass_balance.fuel_tanks[{i}].fuel_density_kg_per_l"),
                    format!("fuel density {} kg/L is implausible (avgas about 0.72, jet fuel about 0.8)", tank.fuel_density_kg_per_l),
                );
            }
        }
        if mb.envelope.len() < 3 {
            c.error(
                file,
                "mass_balance.envelope",
                "the CG envelope needs at least 3 points",
            );
        } else if crate::assess::mass::self_intersects(&mb.envelope) {
            c.error(
                file,
                "mass_balance.envelope",
                "the CG envelope crosses itself; list its corners in order around the outline",
            );
        }
        for (i, p) in mb.envelope.iter().enumerate() {
            positive(
                c,
                file,
                &format!("mass_balance.envelope[{i}].mass_kg"),
                p.mass_kg,
                "envelope mass",
            );
            positive(
                c,
                file,
                &format!("mass_balance.envelope[{i}].arm_mm"),
                p.arm_mm,
                "envelope arm",
            );
        }
    }
}

fn for_each(t: &Nested, mut f: impl FnMut(usize, usize, usize, f64)) {
    for (m, block) in t.iter().enumerate() {
        for (p, row) in block.iter().enumerate() {
            for (o, &v) in row.iter().enumerate() {
                f(m, p, o, v);
            }
        }
    }
}

/// Distances must not fall, and climb rates must not rise, as mass, pressure altitude
/// or OAT rise. One message per offending value, naming the axis.
fn monotonic(
    file: &str,
    name: &str,
    t: &Nested,
    g: &super::tables::Grid,
    rising: bool,
    c: &mut Collector<'_>,
) {
    let what = if rising { "decreases" } else { "increases" };
    let bad = |prev: f64, v: f64| if rising { v < prev } else { v > prev };
    let axes = [
        (Axis::Mass, g.mass_kg()),
        (Axis::PressureAltitude, g.pressure_altitude_ft()),
        (Axis::Oat, g.oat_c()),
    ];
    for_each(t, |m, p, o, v| {
        let idx = [m, p, o];
        for (k, (axis, points)) in axes.iter().enumerate() {
            if idx[k] == 0 {
                continue;
            }
            let mut prev_idx = idx;
            prev_idx[k] -= 1;
            let prev = t[prev_idx[0]][prev_idx[1]][prev_idx[2]];
            if bad(prev, v) {
                let (label, unit) = match axis {
                    Axis::Mass => ("mass", "kg"),
                    Axis::PressureAltitude => ("pressure altitude", "ft"),
                    Axis::Oat => ("OAT", "°C"),
                };
                c.error(
                    file,
                    &format!("{name}{}", index_path(m, p, o)),
                    format!(
                        "value {v} {what} from {prev} as {label} rises from {} to {} {unit}; probably a typing error \
                         (if the manual really says so, add \"irregular_ok\": \"reason\" to this section)",
                        points[idx[k] - 1],
                        points[idx[k]]
                    ),
                );
            }
        }
    });
}

fn normalise_deg(d: f64) -> f64 {
    d.rem_euclid(360.0)
}

fn angle_diff(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(360.0);
    d.min(360.0 - d)
}

/// Checks one airfield file.
pub fn check_airfield(file: &str, a: &Airfield, c: &mut Collector<'_>) {
    template(c, file, &a.replace_before_use);
    if a.id != file_stem(file) {
        c.error(
            file,
            "id",
            format!(
                "id '{}' differs from the file name; name the file {}.json",
                a.id, a.id
            ),
        );
    }
    non_empty(c, file, "name", &a.name, "airfield name");
    if !(-1500.0..=16000.0).contains(&a.elevation_ft) {
        c.error(
            file,
            "elevation_ft",
            format!(
                "elevation {} ft is outside -1,500 to 16,000 ft; is it in metres?",
                a.elevation_ft
            ),
        );
    }
    if !(-90.0..=90.0).contains(&a.latitude_deg) {
        c.error(
            file,
            "latitude_deg",
            format!("latitude {} is outside -90 to 90", a.latitude_deg),
        );
    }
    if !(-180.0..=180.0).contains(&a.longitude_deg) {
        c.error(
            file,
            "longitude_deg",
            format!("longitude {} is outside -180 to 180", a.longitude_deg),
        );
    }
    if !(-180.0..=180.0).contains(&a.magnetic_variation_deg) {
        c.error(
            file,
            "magnetic_variation_deg",
            format!(
                "variation {} is outside -180 to 180",
                a.magnetic_variation_deg
            ),
        );
    }
    if a.runway_ends.is_empty() {
        c.error(file, "runway_ends", "no runway ends");
    }
    let mut seen = HashMap::new();
    for (i, e) in a.runway_ends.iter().enumerate() {
        let p = format!("runway_ends[{i}]");
        if let Some(first) = seen.insert(e.designator.as_str(), i) {
            c.error(
                file,
                &format!("{p}.designator"),
                format!(
                    "duplicate designator '{}' (also runway_ends[{first}])",
                    e.designator
                ),
            );
        }
        for (name, v) in [
            ("tora_m", e.tora_m),
            ("toda_m", e.toda_m),
            ("asda_m", e.asda_m),
            ("lda_m", e.lda_m),
        ] {
            positive(c, file, &format!("{p}.{name}"), v, name);
        }
        if e.tora_m > e.toda_m {
            c.error(
                file,
                &format!("{p}.toda_m"),
                format!(
                    "TODA {} m is shorter than TORA {} m; TODA is TORA plus any clearway",
                    e.toda_m, e.tora_m
                ),
            );
        }
        if e.asda_m < e.tora_m {
            c.error(
                file,
                &format!("{p}.asda_m"),
                format!(
                    "ASDA {} m is shorter than TORA {} m; ASDA is TORA plus any stopway",
                    e.asda_m, e.tora_m
                ),
            );
        }
        if !(0.0..=360.0).contains(&e.true_heading_deg) {
            c.error(
                file,
                &format!("{p}.true_heading_deg"),
                format!("heading {} is outside 0 to 360", e.true_heading_deg),
            );
        }
        match e.number() {
            None => c.error(
                file,
                &format!("{p}.designator"),
                format!(
                    "designator '{}' is not a runway number 01–36 with an optional L, C or R",
                    e.designator
                ),
            ),
            Some(n) => {
                let magnetic = normalise_deg(e.true_heading_deg - a.magnetic_variation_deg);
                let diff = angle_diff(magnetic, f64::from(n) * 10.0);
                if diff > 10.0 {
                    c.error(
                        file,
                        &format!("{p}.true_heading_deg"),
                        format!(
                            "designator {} disagrees with the magnetic heading {magnetic:.0}° (true {} − variation {}) by {diff:.0}°; check the heading, the designator or the variation's sign (east positive)",
                            e.designator, e.true_heading_deg, a.magnetic_variation_deg
                        ),
                    );
                }
            }
        }
        if !(-10.0..=10.0).contains(&e.slope_percent) {
            c.error(
                file,
                &format!("{p}.slope_percent"),
                format!("slope {} % is outside -10 to 10 %", e.slope_percent),
            );
        }
        if let Some(g) = &e.required_climb_gradient {
            positive(
                c,
                file,
                &format!("{p}.required_climb_gradient.ft_per_nm"),
                g.ft_per_nm,
                "required climb gradient",
            );
        }
        for (k, x) in e.intersections.iter().enumerate() {
            let q = format!("{p}.intersections[{k}]");
            if x.tora_m > e.tora_m {
                c.error(
                    file,
                    &format!("{q}.tora_m"),
                    format!(
                        "intersection TORA {} m is longer than the full TORA {} m",
                        x.tora_m, e.tora_m
                    ),
                );
            }
            if x.tora_m > x.toda_m {
                c.error(
                    file,
                    &format!("{q}.toda_m"),
                    format!("TODA {} m is shorter than TORA {} m", x.toda_m, x.tora_m),
                );
            }
            if x.asda_m < x.tora_m {
                c.error(
                    file,
                    &format!("{q}.asda_m"),
                    format!("ASDA {} m is shorter than TORA {} m", x.asda_m, x.tora_m),
                );
            }
        }
    }
    // Opposite ends: runway numbers 18 apart with swapped L/R suffix.
    for i in 0..a.runway_ends.len() {
        for j in (i + 1)..a.runway_ends.len() {
            let (ei, ej) = (&a.runway_ends[i], &a.runway_ends[j]);
            let (Some(ni), Some(nj)) = (ei.number(), ej.number()) else {
                continue;
            };
            let si = ei
                .designator
                .trim_start_matches(|c: char| c.is_ascii_digit());
            let sj = ej
                .designator
                .trim_start_matches(|c: char| c.is_ascii_digit());
            let swapped = matches!((si, sj), ("", "") | ("C", "C") | ("L", "R") | ("R", "L"));
            if (ni + 18 - 1) % 36 + 1 != nj && (nj + 18 - 1) % 36 + 1 != ni || !swapped {
                continue;
            }
            let (a_s, b_s) = (ei.slope_percent, ej.slope_percent);
            let opposite = (a_s == 0.0 && b_s == 0.0)
                || (a_s * b_s < 0.0 && (a_s + b_s).abs() <= 0.05 * a_s.abs().max(b_s.abs()) + 0.01);
            if !opposite {
                c.error(
                    file,
                    &format!("runway_ends[{j}].slope_percent"),
                    format!(
                        "runway {} slopes {} % and its opposite end {} slopes {} %; opposite ends carry opposite signs (uphill one way is downhill the other)",
                        ej.designator, b_s, ei.designator, a_s
                    ),
                );
            }
        }
    }
    if let Some(pref) = &a.preferential_end
        && !a.runway_ends.iter().any(|e| &e.designator == pref)
    {
        c.error(
            file,
            "preferential_end",
            format!("preferential end '{pref}' is not one of the runway ends"),
        );
    }
}

/// Checks one legs file on its own.
pub fn check_legs_file(file: &str, l: &LegsFile, c: &mut Collector<'_>) {
    template(c, file, &l.replace_before_use);
    let stem = file_stem(file);
    if l.date.to_string() != stem {
        c.error(
            file,
            "date",
            format!(
                "date {} differs from the file name; name the file {}.json",
                l.date, l.date
            ),
        );
    }
    for (i, leg) in l.legs.iter().enumerate() {
        let p = format!("legs[{i}]");
        non_empty(c, file, &format!("{p}.id"), &leg.id, "leg id");
        if leg.departs_utc().date_naive() != l.date {
            c.error(
                file,
                &format!("{p}.departs_at"),
                format!("departs on {} UTC, but this file holds the legs departing on {}; move it to legs/{}.json", leg.departs_utc().date_naive(), l.date, leg.departs_utc().date_naive()),
            );
        }
        if leg.arrives_at <= leg.departs_at {
            c.error(
                file,
                &format!("{p}.arrives_at"),
                format!(
                    "arrives at {} before or when it departs ({})",
                    leg.arrives_at.to_rfc3339(),
                    leg.departs_at.to_rfc3339()
                ),
            );
        }
        match (&leg.takeoff_mass_kg, &leg.loads) {
            (None, None) => c.error(file, &p, "give either `takeoff_mass_kg` or `loads`"),
            (Some(_), Some(_)) => c.error(
                file,
                &format!("{p}.loads"),
                "give either `takeoff_mass_kg` or `loads`, not both",
            ),
            (Some(m), None) => {
                positive(c, file, &format!("{p}.takeoff_mass_kg"), *m, "takeoff mass")
            }
            (None, Some(_)) => {}
        }
        if let Some(m) = leg.landing_mass_kg {
            positive(c, file, &format!("{p}.landing_mass_kg"), m, "landing mass");
            if leg.takeoff_mass_kg.is_some_and(|t| m > t) {
                c.error(
                    file,
                    &format!("{p}.landing_mass_kg"),
                    "landing mass is above the takeoff mass",
                );
            }
        }
    }
}

/// Highest temperature in METAR-like lines (`12/08`, `M02/M05`), °C.
fn max_reported_temperature(text: &str) -> Option<f64> {
    let parse = |s: &str| -> Option<f64> {
        let (neg, d) = match s.strip_prefix('M') {
            Some(d) => (true, d),
            None => (false, s),
        };
        (d.len() == 2 && d.bytes().all(|b| b.is_ascii_digit())).then(|| {
            let v: f64 = d.parse().unwrap_or(0.0);
            if neg { -v } else { v }
        })
    };
    text.split_whitespace()
        .filter_map(|tok| {
            let (t, dp) = tok.split_once('/')?;
            let t = parse(t)?;
            (dp.is_empty() || parse(dp).is_some()).then_some(t)
        })
        .reduce(f64::max)
}

/// The closest of `known` to a mistyped `word` (edit distance at most 1 for an id of up
/// to four characters, else 2; a swap of
/// two neighbours counting one (optimal string alignment, `strsim`), ignoring
/// case), for "did you mean …?".
pub fn did_you_mean<'a>(word: &str, known: impl IntoIterator<Item = &'a str>) -> Option<&'a str> {
    let w = word.to_uppercase();
    known
        .into_iter()
        .map(|k| (strsim::osa_distance(&w, &k.to_uppercase()), k))
        // A match in another case (`l16` for `L16`) comes first, at distance 0.
        .filter(|&(d, k)| {
            (d > 0 || k != word) && d <= if w.len() <= 4 { 1 } else { 2 } && d < k.len()
        })
        .min_by_key(|&(d, _)| d)
        .map(|(_, k)| k)
}

/// " — did you mean X?" or nothing.
pub fn suggestion<'a>(word: &str, known: impl IntoIterator<Item = &'a str>) -> String {
    did_you_mean(word, known).map_or(String::new(), |k| format!("; did you mean {k}?"))
}

/// Reports `id`, referred to at `file`/`path`, as not among the loaded `folder` files:
/// when the file that would hold it failed to parse, a warning saying so (the error is
/// that file's own, reported there); otherwise the error `unknown`, with a "did you
/// mean".
#[allow(clippy::too_many_arguments)]
fn missing_ref<'a>(
    c: &mut Collector<'_>,
    file: &str,
    path: &str,
    folder: &str,
    id: &str,
    known: impl IntoIterator<Item = &'a str>,
    unknown: String,
) {
    match c.unparsed_holding(folder, id).map(str::to_string) {
        // Said at the first reference only: every leg at a broken airfield's file would
        // otherwise repeat it.
        Some(f) if c.unparsed_named.contains(&f) => {}
        Some(f) => {
            c.warn(
                file,
                path,
                format!("'{id}' is in {f}, which failed to load (see its error); references to it are not checked until that file is fixed"),
            );
            c.unparsed_named.insert(f);
        }
        None => {
            let m = format!("{unknown}{}", suggestion(id, known));
            c.error(file, path, m)
        }
    }
}

/// Checks across files: references, duplicates, overlaps, coverage.
pub fn check_cross(ops: &Ops, c: &mut Collector<'_>) {
    let af = "fleet/aircraft.json";
    for (i, a) in ops.aircraft.iter().enumerate() {
        match ops.aircraft_type(&a.type_id) {
            None => missing_ref(
                c,
                af,
                &format!("aircraft[{i}].type_id"),
                "fleet/types",
                &a.type_id,
                ops.types.iter().map(|t| t.file.id.as_str()),
                format!(
                    "unknown aircraft type '{}'; add fleet/types/{}.json or fix the id",
                    a.type_id, a.type_id
                ),
            ),
            Some(t) => {
                // An empty CG far outside the envelope's span is almost always a typo
                // (an arm in inches, or from another datum).
                if let Some(mb) = &t.file.mass_balance {
                    let lo = mb
                        .envelope
                        .iter()
                        .map(|p| p.arm_mm)
                        .fold(f64::INFINITY, f64::min);
                    let hi = mb
                        .envelope
                        .iter()
                        .map(|p| p.arm_mm)
                        .fold(f64::NEG_INFINITY, f64::max);
                    let span = hi - lo;
                    if lo.is_finite() && (a.empty_arm_mm < lo - span || a.empty_arm_mm > hi + span)
                    {
                        c.warn(
                            af,
                            &format!("aircraft[{i}].empty_arm_mm"),
                            format!(
                                "empty CG {} mm is far outside the {} envelope's {lo}–{hi} mm; check the unit and the datum",
                                a.empty_arm_mm, t.file.id
                            ),
                        );
                    }
                }
            }
        }
    }
    for (i, p) in ops.pilots.iter().enumerate() {
        for (kind, list) in [
            ("solo", &p.endorsements.solo),
            ("cross_country", &p.endorsements.cross_country),
            ("night", &p.endorsements.night),
        ] {
            for (k, e) in list.iter().enumerate() {
                if ops.aircraft_type(&e.type_id).is_none() {
                    missing_ref(
                        c,
                        "pilots.json",
                        &format!("pilots[{i}].endorsements.{kind}[{k}].type_id"),
                        "fleet/types",
                        &e.type_id,
                        ops.types.iter().map(|t| t.file.id.as_str()),
                        format!("unknown aircraft type '{}'", e.type_id),
                    );
                }
            }
        }
    }
    for (i, p) in ops.pilots.iter().enumerate() {
        for (k, id) in p.limitations.airfields.iter().enumerate() {
            if ops.airfield(id).is_none() {
                missing_ref(
                    c,
                    "pilots.json",
                    &format!("pilots[{i}].limitations.airfields[{k}]"),
                    "airfields",
                    id,
                    ops.airfields.iter().map(|a| a.id.as_str()),
                    format!("unknown airfield '{id}' in the pilot's written limitations"),
                );
            }
        }
    }
    let mut leg_ids: HashMap<&str, usize> = HashMap::new();
    for (i, leg) in ops.legs.iter().enumerate() {
        let (file, k) = &ops.leg_files[i];
        let p = format!("legs[{k}]");
        if let Some(first) = leg_ids.insert(leg.id.as_str(), i) {
            let (ff, fk) = &ops.leg_files[first];
            c.error(
                file,
                &format!("{p}.id"),
                format!("duplicate leg id '{}' (also {ff} legs[{fk}])", leg.id),
            );
        }
        match ops.aircraft(&leg.aircraft) {
            None => c.error(
                file,
                &format!("{p}.aircraft"),
                format!(
                    "unknown aircraft '{}'; it is not in fleet/aircraft.json{}",
                    leg.aircraft,
                    suggestion(
                        &leg.aircraft,
                        ops.aircraft.iter().map(|a| a.registration.as_str())
                    )
                ),
            ),
            Some(a) => {
                if a.status == Status::Maintenance {
                    let note = a
                        .maintenance
                        .as_ref()
                        .map_or(String::new(), |m| format!(" ({})", m.note));
                    c.error(
                        file,
                        &format!("{p}.aircraft"),
                        format!(
                            "aircraft {} is in maintenance{note}; choose another aircraft",
                            a.registration
                        ),
                    );
                }
                if let (Some(t), Some(m)) = (ops.aircraft_type(&a.type_id), leg.takeoff_mass_kg)
                    && m > t.file.limits.max_takeoff_mass_kg
                {
                    c.error(
                        file,
                        &format!("{p}.takeoff_mass_kg"),
                        format!(
                            "takeoff mass {m} kg is above the maximum takeoff mass {} kg",
                            t.file.limits.max_takeoff_mass_kg
                        ),
                    );
                }
            }
        }
        if let (Some(loads), Some(t)) = (
            &leg.loads,
            ops.aircraft(&leg.aircraft)
                .and_then(|a| ops.aircraft_type(&a.type_id)),
        ) {
            match &t.file.mass_balance {
                None => c.error(
                    file,
                    &format!("{p}.loads"),
                    format!(
                        "type {} has no mass_balance data; give takeoff_mass_kg instead of loads",
                        t.file.id
                    ),
                ),
                Some(mb) => {
                    let mut unknown_station = false;
                    for (k, sl) in loads.stations.iter().enumerate() {
                        if !mb.stations.iter().any(|s| s.id == sl.station) {
                            unknown_station = true;
                            let known: Vec<&str> =
                                mb.stations.iter().map(|s| s.id.as_str()).collect();
                            c.error(
                                file,
                                &format!("{p}.loads.stations[{k}].station"),
                                format!(
                                    "type {} has no loading station '{}' (it has: {})",
                                    t.file.id,
                                    sl.station,
                                    known.join(", ")
                                ),
                            );
                        }
                    }
                    // The pilot sits at the type's first seated station (the front row,
                    // as a loading sheet lists it): a leg that loads nobody there has
                    // nobody to fly it.
                    // (Not after a mistyped station: that is the error to fix.)
                    if let Some(first) = mb
                        .stations
                        .iter()
                        .find(|s| s.seats > 0)
                        .filter(|_| !unknown_station)
                    {
                        let aboard = loads.stations.iter().any(|sl| {
                            sl.station == first.id
                                && (sl.mass_kg.is_some_and(|m| m > 0.0)
                                    || sl.standard_adults > 0
                                    || sl.standard_children > 0)
                        });
                        if !aboard {
                            c.error(
                                file,
                                &format!("{p}.loads.stations"),
                                format!(
                                    "nobody at {} ({}), the type's first seats, where the pilot \
                                     sits: give the pilot's mass_kg or standard_adults there",
                                    first.id, first.name
                                ),
                            );
                        }
                    }
                    let capacity: f64 = mb.fuel_tanks.iter().map(|t| t.usable_capacity_l).sum();
                    let given = [
                        ("fuel_at_start_l", loads.fuel_at_start_l),
                        ("fuel_at_start_usgal", loads.fuel_at_start_usgal),
                        ("fuel_at_start_kg", loads.fuel_at_start_kg),
                    ];
                    let n = given.iter().filter(|(_, v)| v.is_some()).count();
                    if n != 1 {
                        c.error(
                            file,
                            &format!("{p}.loads"),
                            "give exactly one of fuel_at_start_l, fuel_at_start_usgal or fuel_at_start_kg",
                        );
                    }
                    let density = mb
                        .fuel_tanks
                        .first()
                        .map_or(0.72, |t| t.fuel_density_kg_per_l);
                    let litres = loads
                        .fuel_at_start_l
                        .or(loads
                            .fuel_at_start_usgal
                            .map(|g| g * crate::units::L_PER_USGAL))
                        .or(loads.fuel_at_start_kg.map(|kg| kg / density));
                    if let Some(l) = litres
                        && l > capacity
                    {
                        let field = given
                            .iter()
                            .find(|(_, v)| v.is_some())
                            .map_or("fuel_at_start_l", |(f, _)| f);
                        c.error(
                            file,
                            &format!("{p}.loads.{field}"),
                            format!(
                                "{l:.0} L of fuel is more than the usable capacity {capacity} L"
                            ),
                        );
                    }
                    for (k, sl) in loads.stations.iter().enumerate() {
                        if sl.mass_kg.is_none()
                            && sl.standard_adults == 0
                            && sl.standard_children == 0
                        {
                            c.error(
                                file,
                                &format!("{p}.loads.stations[{k}]"),
                                "give mass_kg, standard_adults or standard_children",
                            );
                        }
                        if (sl.standard_adults > 0 || sl.standard_children > 0)
                            && ops.operator.policy.standard_masses.is_none()
                        {
                            c.error(
                                file,
                                &format!("{p}.loads.stations[{k}]"),
                                "standard masses are used but operator.json has no policy.standard_masses",
                            );
                        }
                        if let Some(m) = sl.mass_kg
                            && !(m >= 0.0 && m.is_finite())
                        {
                            c.error(
                                file,
                                &format!("{p}.loads.stations[{k}].mass_kg"),
                                format!("{m} must be zero or positive"),
                            );
                        }
                    }
                }
            }
        }
        match ops.pilot(&leg.pilot) {
            None => c.error(
                file,
                &format!("{p}.pilot"),
                format!(
                    "unknown pilot '{}'; it is not in pilots.json{}",
                    leg.pilot,
                    suggestion(&leg.pilot, ops.pilots.iter().map(|p| p.id.as_str()))
                ),
            ),
            Some(pl) => {
                if (leg.category == Category::StudentSolo) != (pl.category == Category::StudentSolo)
                {
                    c.warn(
                        file,
                        &format!("{p}.category"),
                        format!(
                            "leg category {} but pilot {} is listed as {}",
                            leg.category.name(),
                            pl.id,
                            pl.category.name()
                        ),
                    );
                }
            }
        }
        for (field, id) in [("from", &leg.from), ("to", &leg.to)] {
            if ops.airfield(id).is_none() {
                missing_ref(
                    c,
                    file,
                    &format!("{p}.{field}"),
                    "airfields",
                    id,
                    ops.airfields.iter().map(|a| a.id.as_str()),
                    format!("unknown airfield '{id}'; add airfields/{id}.json or fix the id"),
                );
            }
        }
        if ops.minimums(leg.category).is_none() {
            c.error(
                file,
                &format!("{p}.category"),
                format!(
                    "operator.json has no minimums for category {}",
                    leg.category.name()
                ),
            );
        }
    }
    // Per aircraft, in time order: overlaps (error) and position continuity (warning).
    let mut by_aircraft: HashMap<&str, Vec<usize>> = HashMap::new();
    for (i, leg) in ops.legs.iter().enumerate() {
        by_aircraft
            .entry(leg.aircraft.as_str())
            .or_default()
            .push(i);
    }
    let mut regs: Vec<_> = by_aircraft.into_iter().collect();
    regs.sort();
    for (_, mut idx) in regs {
        idx.sort_by_key(|&i| ops.legs[i].departs_utc());
        for w in idx.windows(2) {
            let (a, b) = (&ops.legs[w[0]], &ops.legs[w[1]]);
            let (file, k) = &ops.leg_files[w[1]];
            if b.departs_utc() < a.arrives_utc() {
                c.error(
                    file,
                    &format!("legs[{k}].departs_at"),
                    format!(
                        "aircraft {} is on leg {} until {}, which overlaps leg {}",
                        b.aircraft,
                        a.id,
                        a.arrives_utc().format("%H%MZ"),
                        b.id
                    ),
                );
            } else if b.from != a.to
                // An unknown airfield on either side is already an error on its own
                // field; a position warning would only repeat the typo ("the previous
                // leg landed at XPNI").
                && ops.airfield(&a.to).is_some()
                && ops.airfield(&b.from).is_some()
            {
                c.warn(
                    file,
                    &format!("legs[{k}].from"),
                    format!(
                        "aircraft {} departs {} on leg {} at {} but its previous leg {} landed at {}",
                        b.aircraft,
                        b.from,
                        b.id,
                        b.departs_utc().format("%H%MZ"),
                        a.id,
                        a.to
                    ),
                );
            }
        }
    }
    // Per pilot: two legs at once (a warning: an instructor may be named on a dual leg
    // while supervising, but it is worth a look).
    let mut by_pilot: HashMap<&str, Vec<usize>> = HashMap::new();
    for (i, leg) in ops.legs.iter().enumerate() {
        by_pilot.entry(leg.pilot.as_str()).or_default().push(i);
    }
    let mut pilots: Vec<_> = by_pilot.into_iter().collect();
    pilots.sort();
    for (_, mut idx) in pilots {
        idx.sort_by_key(|&i| ops.legs[i].departs_utc());
        for w in idx.windows(2) {
            let (a, b) = (&ops.legs[w[0]], &ops.legs[w[1]]);
            let (file, k) = &ops.leg_files[w[1]];
            if b.departs_utc() < a.arrives_utc() {
                c.warn(
                    file,
                    &format!("legs[{k}].pilot"),
                    format!(
                        "pilot {} is on leg {} until {}, which overlaps leg {}",
                        b.pilot,
                        a.id,
                        a.arrives_utc().format("%H%MZ"),
                        b.id
                    ),
                );
            }
        }
    }
    // Observation files: rejected reports are warnings; decoded temperatures feed the
    // coverage check below.
    let latest_day = ops.legs.iter().map(|l| l.departs_utc().date_naive()).max();
    let mut hottest: Option<f64> = None;
    for (file, text) in &ops.observations {
        if !file.starts_with("observations/") {
            continue;
        }
        let stem = file
            .rsplit('/')
            .next()
            .unwrap_or(file)
            .trim_end_matches(".txt");
        let day = chrono::NaiveDate::parse_from_str(stem, "%Y-%m-%d")
            .ok()
            .or(latest_day);
        let Some(reference) = day
            .and_then(|d| d.and_hms_opt(23, 59, 59))
            .map(|t| t.and_utc())
        else {
            hottest = hottest
                .into_iter()
                .chain(max_reported_temperature(text))
                .reduce(f64::max);
            continue;
        };
        for r in crate::observation::file::decode_all(text, reference) {
            if let Some(why) = r.report.rejection() {
                // At the group that is wrong, where the first problem names one.
                let column = r
                    .report
                    .errors
                    .first()
                    .and_then(|e| match e {
                        crate::observation::metar::DecodeError::Malformed { column, .. } => {
                            Some(*column)
                        }
                        _ => None,
                    })
                    .unwrap_or(1);
                c.at_line(
                    super::load::Severity::Warning,
                    file,
                    r.line,
                    column,
                    format!("report not usable: {why}"),
                );
            }
            if let Some(t) = r.report.temperature_c {
                hottest = Some(hottest.map_or(t, |h: f64| h.max(t)));
            }
        }
    }
    // Coverage: tables against the folder's observations and airfields.
    let highest = ops
        .airfields
        .iter()
        .map(|a| a.elevation_ft)
        .reduce(f64::max);
    for (t, file) in ops.types.iter().zip(&ops.type_files) {
        let g = &t.performance.grid;
        let (_, top_oat) = g.range(Axis::Oat);
        if let Some(h) = hottest
            && h > top_oat
        {
            c.warn(file, "performance.axes.oat_c", format!("tables stop at {top_oat} °C while the folder's reports reach {h} °C; legs in that heat will be no-data"));
        }
        let (_, top_pa) = g.range(Axis::PressureAltitude);
        if let Some(e) = highest
            && e + 1000.0 > top_pa
        {
            c.warn(file, "performance.axes.pressure_altitude_ft", format!("tables stop at {top_pa} ft pressure altitude, within 1,000 ft of the highest airfield ({e} ft); low pressure there will be no-data"));
        }
    }
}

/// `runway-state/<date>.json`: the date matches the file name, and every entry names a
/// known airfield and one of its runway ends, with plausible distances.
pub fn check_runway_states(
    ops: &Ops,
    states: &[(String, super::runway_state::RunwayStateFile)],
    c: &mut Collector<'_>,
) {
    for (file, st) in states {
        if st.date.to_string() != file_stem(file) {
            c.error(
                file,
                "date",
                format!(
                    "date {} differs from the file name; name the file {}.json",
                    st.date, st.date
                ),
            );
        }
        for (i, e) in st.entries.iter().enumerate() {
            let p = format!("entries[{i}]");
            let Some(a) = ops.airfield(&e.airfield) else {
                missing_ref(
                    c,
                    file,
                    &format!("{p}.airfield"),
                    "airfields",
                    &e.airfield,
                    ops.airfields.iter().map(|a| a.id.as_str()),
                    format!("unknown airfield '{}'", e.airfield),
                );
                continue;
            };
            let Some(end) = a.runway_ends.iter().find(|r| r.designator == e.end) else {
                let known: Vec<&str> = a
                    .runway_ends
                    .iter()
                    .map(|r| r.designator.as_str())
                    .collect();
                c.error(
                    file,
                    &format!("{p}.end"),
                    format!(
                        "{} has no runway end '{}' (it has: {})",
                        a.id,
                        e.end,
                        known.join(", ")
                    ),
                );
                continue;
            };
            let start = st.date.and_time(chrono::NaiveTime::MIN).and_utc();
            for (name, t) in [("from", e.from), ("until", e.until)] {
                if let Some(t) = t
                    && (t < start || t > start + chrono::TimeDelta::days(1))
                {
                    c.error(
                        file,
                        &format!("{p}.{name}"),
                        format!(
                            "{} is not on {}: a day's runway state holds for its own UTC day",
                            t.format("%Y-%m-%d %H%MZ"),
                            st.date
                        ),
                    );
                }
            }
            if let (Some(f), Some(u)) = (e.from, e.until)
                && f >= u
            {
                c.error(
                    file,
                    &format!("{p}.from"),
                    format!(
                        "the closure's start {} is not before its end {}",
                        f.format("%H%MZ"),
                        u.format("%H%MZ")
                    ),
                );
            }
            for (name, v, declared) in [
                ("tora_m", e.tora_m, end.tora_m),
                ("toda_m", e.toda_m, end.toda_m),
                ("asda_m", e.asda_m, end.asda_m),
                ("lda_m", e.lda_m, end.lda_m),
            ] {
                if let Some(v) = v {
                    if !(v > 0.0 && v.is_finite()) {
                        c.error(
                            file,
                            &format!("{p}.{name}"),
                            format!("{v} must be positive"),
                        );
                    } else if v > declared {
                        c.warn(
                            file,
                            &format!("{p}.{name}"),
                            format!("{v} m is more than the declared {declared} m; a day's state only reduces distances"),
                        );
                    }
                }
            }
        }
    }
}
