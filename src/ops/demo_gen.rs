//! The physics model behind the demo operator's fictional aircraft types, and the
//! writer of the demo's generated files (type tables and the demo day's METARs).
//!
//! This is not used by the assessment: the assessment reads tables, like a pilot reads
//! a flight manual. The model only has to produce tables that look and behave like a
//! real manual's. It uses no rule of thumb itself; the rules of thumb are tests.
//!
//! The model (standard textbook performance estimates; Anderson, *Aircraft Performance
//! and Design*, ch. 6, and Raymer, *Aircraft Design: A Conceptual Approach*, ch. 17 —
//! from memory):
//!
//! - Stall from the lift equation, `V_S = √(2W / (ρ S C_Lmax))`.
//! - Engine power lapse with density, Gagg–Ferrar: `P/P₀ = 1.132σ − 0.132`.
//! - Propeller thrust from the shaft power by actuator-disk momentum theory
//!   (Rankine–Froude): `T (V + v_i) = η P` with induced velocity
//!   `v_i = (−V + √(V² + 2T / (ρ A))) / 2`, `A` the disk area and `η` a figure of merit
//!   for the blade losses. At rest this gives the static thrust `T³ = 2 ρ A (η P)²`;
//!   at speed it tends to `η P / V`.
//! - Takeoff ground roll `s_g = m V_LOF² / (2 F̄)`, lift-off at `1.2 V_S` (true
//!   airspeed at the air's density), with the average accelerating force `F̄` taken at
//!   `0.7 V_LOF`: thrust, minus drag `q S (C_D0 + k C_L²)`, minus rolling friction
//!   `μ (W − L)` (μ = 0.02, dry paved).
//! - Air segment to 50 ft by energy: `s_a = (h + (V₅₀² − V_LOF²) / 2g) · W / (T − D)`,
//!   with `V₅₀ = 1.3 V_S` and thrust and drag at the mean of the two speeds.
//! - Landing: approach at `1.3 V_S0`, touchdown at `1.15 V_S0`; air segment by energy with
//!   idle power, `s_a = (h + (V_app² − V_td²) / 2g) · D / W` inverted (`W / D`); ground roll
//!   after one second of free roll, braking with μ_b against `W − L` plus drag, at `0.7 V_td`.
//! - Rate of climb from excess power at Vy (indicated ≈ equivalent airspeed, so true
//!   airspeed `V = V_y / √σ`): `RC = (T − D) V / W`.

use std::fmt::Write as _;

use crate::atmosphere::{
    SEA_LEVEL_DENSITY_KG_M3, density_kg_m3, pressure_at_pressure_altitude_hpa,
};
use crate::units::{M_PER_FT, MPS_PER_KT};

/// Standard gravity, m/s².
pub const G: f64 = 9.806_65;
/// Height of the screen, m (50 ft).
pub const SCREEN_HEIGHT_M: f64 = 50.0 * M_PER_FT;
/// Rolling friction on dry paved runways (Raymer, from memory: 0.02–0.03 concrete/asphalt).
pub const MU_PAVED: f64 = 0.02;
/// Rolling friction on short dry grass (Raymer, from memory: 0.05).
pub const MU_GRASS: f64 = 0.05;
/// Free roll before braking after touchdown, s (common practice in textbook estimates).
pub const FREE_ROLL_S: f64 = 1.0;

/// A fictional airframe's design parameters.
#[derive(Debug, Clone, PartialEq)]
pub struct Airframe {
    /// Type id.
    pub id: &'static str,
    /// Display name (says it is fictional).
    pub name: &'static str,
    /// Engines.
    pub engines: u32,
    /// Seats.
    pub seats: u32,
    /// Masses of the tables, kg (the last is the maximum takeoff mass).
    pub masses_kg: [f64; 3],
    /// Maximum landing mass, kg.
    pub max_landing_mass_kg: f64,
    /// Maximum demonstrated crosswind, kt.
    pub max_crosswind_kt: f64,
    /// Wing area, m².
    pub wing_area_m2: f64,
    /// Span, m.
    pub span_m: f64,
    /// Oswald efficiency.
    pub oswald: f64,
    /// Zero-lift drag coefficient, clean.
    pub cd0: f64,
    /// Extra zero-lift drag with takeoff flap and the gear down.
    pub cd0_takeoff_extra: f64,
    /// Extra zero-lift drag with landing flap.
    pub cd0_landing_extra: f64,
    /// C_Lmax with takeoff flap.
    pub cl_max_takeoff: f64,
    /// C_Lmax with landing flap.
    pub cl_max_landing: f64,
    /// Lift coefficient in the ground-roll attitude.
    pub cl_ground: f64,
    /// Total sea-level power, kW.
    pub power_kw: f64,
    /// Propeller diameter, m (one per engine).
    pub prop_diameter_m: f64,
    /// Propeller figure of merit during the takeoff run.
    pub eta_takeoff: f64,
    /// Propeller efficiency in the climb.
    pub eta_climb: f64,
    /// Braking friction coefficient (dry paved).
    pub mu_brake: f64,
    /// Best-rate climb speed, KIAS.
    pub vy_kias: f64,
    /// Best-angle climb speed, KIAS.
    pub vx_kias: f64,
    /// Approach speed, KIAS.
    pub approach_kias: f64,
    /// Rotation speed, KIAS.
    pub rotation_kias: f64,
}

impl Airframe {
    fn k(&self) -> f64 {
        let ar = self.span_m * self.span_m / self.wing_area_m2;
        1.0 / (std::f64::consts::PI * self.oswald * ar)
    }

    fn thrust_n(&self, rho: f64, v: f64, eta: f64) -> f64 {
        let area = std::f64::consts::PI * 0.25 * self.prop_diameter_m * self.prop_diameter_m;
        f64::from(self.engines)
            * propeller_thrust_n(
                self.power_w(rho) / f64::from(self.engines),
                eta,
                rho,
                area,
                v,
            )
    }

    fn power_w(&self, rho: f64) -> f64 {
        let sigma = rho / SEA_LEVEL_DENSITY_KG_M3;
        self.power_kw * 1000.0 * gagg_ferrar(sigma)
    }
}

/// Gagg–Ferrar power lapse for a normally aspirated piston engine: `P/P₀ = 1.132σ − 0.132`.
pub fn gagg_ferrar(sigma: f64) -> f64 {
    1.132 * sigma - 0.132
}

/// Propeller thrust at true airspeed `v_mps` from momentum theory, N: solves
/// `T (V + v_i) = η P`, `v_i = (−V + √(V² + 2T/(ρA)))/2`, by bisection.
pub fn propeller_thrust_n(power_w: f64, eta: f64, rho: f64, disk_area_m2: f64, v_mps: f64) -> f64 {
    let target = eta * power_w;
    if target.is_nan() || target <= 0.0 {
        return 0.0;
    }
    let useful = |t: f64| {
        let vi = 0.5 * (-v_mps + (v_mps * v_mps + 2.0 * t / (rho * disk_area_m2)).sqrt());
        t * (v_mps + vi)
    };
    let static_t = (2.0 * rho * disk_area_m2 * target * target).cbrt();
    let (mut lo, mut hi) = (
        0.0,
        static_t.max(target / v_mps.max(1e-9)).min(static_t * 10.0) + 1.0,
    );
    while useful(hi) < target {
        hi *= 2.0;
    }
    for _ in 0..100 {
        let mid = 0.5 * (lo + hi);
        if useful(mid) < target {
            lo = mid
        } else {
            hi = mid
        }
    }
    0.5 * (lo + hi)
}

/// Stall speed from the lift equation, m/s (true airspeed).
pub fn stall_speed_mps(mass_kg: f64, rho: f64, wing_area_m2: f64, cl_max: f64) -> f64 {
    (2.0 * mass_kg * G / (rho * wing_area_m2 * cl_max)).sqrt()
}

/// Ground roll for a mass accelerated from rest to `v_mps` by an average force, m.
pub fn roll_distance_m(mass_kg: f64, v_mps: f64, average_force_n: f64) -> f64 {
    mass_kg * v_mps * v_mps / (2.0 * average_force_n)
}

/// Takeoff ground roll and distance to 50 ft at a density, dry paved, no wind, m.
/// `None` when the aircraft cannot accelerate or climb.
pub fn takeoff_m(af: &Airframe, mass_kg: f64, rho: f64) -> Option<(f64, f64)> {
    let w = mass_kg * G;
    let s = af.wing_area_m2;
    let k = af.k();
    let vs = stall_speed_mps(mass_kg, rho, s, af.cl_max_takeoff);
    let v_lof = 1.2 * vs;
    let v = 0.7 * v_lof;
    let q = 0.5 * rho * v * v;
    let thrust = af.thrust_n(rho, v, af.eta_takeoff);
    let drag = q * s * (af.cd0 + af.cd0_takeoff_extra + k * af.cl_ground * af.cl_ground);
    let lift = q * s * af.cl_ground;
    let force = thrust - drag - MU_PAVED * (w - lift);
    if force <= 0.0 {
        return None;
    }
    let ground = roll_distance_m(mass_kg, v_lof, force);
    let v50 = 1.3 * vs;
    let vm = 0.5 * (v_lof + v50);
    let qm = 0.5 * rho * vm * vm;
    let cl = w / (qm * s);
    let thrust_m = af.thrust_n(rho, vm, af.eta_climb);
    let drag_m = qm * s * (af.cd0 + af.cd0_takeoff_extra + k * cl * cl);
    let excess = thrust_m - drag_m;
    if excess <= 0.0 {
        return None;
    }
    let air = (SCREEN_HEIGHT_M + (v50 * v50 - v_lof * v_lof) / (2.0 * G)) * w / excess;
    Some((ground, ground + air))
}

/// Landing distance from 50 ft and ground roll at a density, dry paved, no wind, m.
pub fn landing_m(af: &Airframe, mass_kg: f64, rho: f64) -> (f64, f64) {
    let w = mass_kg * G;
    let s = af.wing_area_m2;
    let k = af.k();
    let vs0 = stall_speed_mps(mass_kg, rho, s, af.cl_max_landing);
    let v_app = 1.3 * vs0;
    let v_td = 1.15 * vs0;
    let vm = 0.5 * (v_app + v_td);
    let qm = 0.5 * rho * vm * vm;
    let cl = w / (qm * s);
    let drag_air = qm * s * (af.cd0 + af.cd0_landing_extra + k * cl * cl);
    let air = (SCREEN_HEIGHT_M + (v_app * v_app - v_td * v_td) / (2.0 * G)) * w / drag_air;
    let v = 0.7 * v_td;
    let q = 0.5 * rho * v * v;
    let lift = q * s * af.cl_ground;
    let drag = q * s * (af.cd0 + af.cd0_landing_extra + k * af.cl_ground * af.cl_ground);
    let force = af.mu_brake * (w - lift) + drag;
    let ground = v_td * FREE_ROLL_S + roll_distance_m(mass_kg, v_td, force);
    (air + ground, ground)
}

/// Rate of climb at Vy, clean, ft/min (negative when the aircraft cannot climb).
pub fn climb_fpm(af: &Airframe, mass_kg: f64, rho: f64) -> f64 {
    let w = mass_kg * G;
    let s = af.wing_area_m2;
    let sigma = rho / SEA_LEVEL_DENSITY_KG_M3;
    let v = af.vy_kias * MPS_PER_KT / sigma.sqrt();
    let q = 0.5 * rho * v * v;
    let cl = w / (q * s);
    let drag = q * s * (af.cd0 + af.k() * cl * cl);
    let rc_mps = (af.thrust_n(rho, v, af.eta_climb) - drag) * v / w;
    rc_mps / M_PER_FT * 60.0
}

/// The demo tables' pressure-altitude axis, ft.
pub const PRESSURE_ALTITUDES_FT: [f64; 12] = [
    -1000.0, 0.0, 1000.0, 2000.0, 3000.0, 4000.0, 5000.0, 6000.0, 7000.0, 8000.0, 9000.0, 10000.0,
];
/// The demo tables' OAT axis, °C.
pub const OATS_C: [f64; 6] = [-10.0, 0.0, 10.0, 20.0, 30.0, 40.0];

/// Dry-air density at a grid point, kg/m³ (manual tables are for dry air).
pub fn grid_density(pressure_altitude_ft: f64, oat_c: f64) -> f64 {
    density_kg_m3(
        pressure_at_pressure_altitude_hpa(pressure_altitude_ft),
        oat_c,
        None,
    )
}

/// Rounds a distance the way the demo manual prints it: to 5 m.
pub fn round_distance(m: f64) -> f64 {
    (m / 5.0).round() * 5.0
}

/// Rounds a climb rate the way the demo manual prints it: to 5 ft/min.
pub fn round_climb(fpm: f64) -> f64 {
    (fpm / 5.0).round() * 5.0
}

/// The three fictional demo airframes.
pub fn airframes() -> [Airframe; 3] {
    [
        Airframe {
            id: "ft2",
            name: "Fictional Trainer FT-2 (demo only — never use for a real aircraft)",
            engines: 1,
            seats: 2,
            masses_kg: [600.0, 675.0, 750.0],
            max_landing_mass_kg: 750.0,
            max_crosswind_kt: 12.0,
            wing_area_m2: 11.0,
            span_m: 9.1,
            oswald: 0.75,
            cd0: 0.032,
            cd0_takeoff_extra: 0.008,
            cd0_landing_extra: 0.045,
            cl_max_takeoff: 1.6,
            cl_max_landing: 1.9,
            cl_ground: 0.5,
            power_kw: 75.0,
            prop_diameter_m: 1.75,
            eta_takeoff: 0.75,
            eta_climb: 0.8,
            mu_brake: 0.3,
            vy_kias: 68.0,
            vx_kias: 56.0,
            approach_kias: 60.0,
            rotation_kias: 50.0,
        },
        Airframe {
            id: "ft4",
            name: "Fictional Tourer FT-4 (demo only — never use for a real aircraft)",
            engines: 1,
            seats: 4,
            masses_kg: [950.0, 1050.0, 1150.0],
            max_landing_mass_kg: 1150.0,
            max_crosswind_kt: 15.0,
            wing_area_m2: 15.0,
            span_m: 10.9,
            oswald: 0.76,
            cd0: 0.030,
            cd0_takeoff_extra: 0.008,
            cd0_landing_extra: 0.045,
            cl_max_takeoff: 1.6,
            cl_max_landing: 1.95,
            cl_ground: 0.5,
            power_kw: 120.0,
            prop_diameter_m: 1.9,
            eta_takeoff: 0.75,
            eta_climb: 0.8,
            mu_brake: 0.3,
            vy_kias: 76.0,
            vx_kias: 62.0,
            approach_kias: 66.0,
            rotation_kias: 55.0,
        },
        Airframe {
            id: "ft6",
            name: "Fictional Utility FT-6 (demo only — never use for a real aircraft)",
            engines: 1,
            seats: 6,
            masses_kg: [1300.0, 1450.0, 1600.0],
            max_landing_mass_kg: 1550.0,
            max_crosswind_kt: 17.0,
            wing_area_m2: 16.5,
            span_m: 11.0,
            oswald: 0.76,
            cd0: 0.031,
            cd0_takeoff_extra: 0.009,
            cd0_landing_extra: 0.05,
            cl_max_takeoff: 1.65,
            cl_max_landing: 2.0,
            cl_ground: 0.5,
            power_kw: 224.0,
            prop_diameter_m: 2.1,
            eta_takeoff: 0.75,
            eta_climb: 0.8,
            mu_brake: 0.3,
            vy_kias: 88.0,
            vx_kias: 72.0,
            approach_kias: 75.0,
            rotation_kias: 62.0,
        },
    ]
}

/// The five tables of an airframe on the demo grid, nested `[mass][pa][oat]`, rounded
/// like a printed manual: (takeoff ground roll, takeoff 50 ft, landing 50 ft, landing
/// ground roll, climb rate).
pub type Tables = [Vec<Vec<Vec<f64>>>; 5];

/// Computes the demo tables for an airframe.
pub fn tables(af: &Airframe) -> Tables {
    let mut out: Tables = Default::default();
    for &m in &af.masses_kg {
        let mut blocks: [Vec<Vec<f64>>; 5] = Default::default();
        for &pa in &PRESSURE_ALTITUDES_FT {
            let mut rows: [Vec<f64>; 5] = Default::default();
            for &t in &OATS_C {
                let rho = grid_density(pa, t);
                let (tg, t50) = takeoff_m(af, m, rho).unwrap_or((f64::NAN, f64::NAN));
                let (l50, lg) = landing_m(af, m, rho);
                rows[0].push(round_distance(tg));
                rows[1].push(round_distance(t50));
                rows[2].push(round_distance(l50));
                rows[3].push(round_distance(lg));
                rows[4].push(round_climb(climb_fpm(af, m, rho)));
            }
            for (b, r) in blocks.iter_mut().zip(rows) {
                b.push(r);
            }
        }
        for (o, b) in out.iter_mut().zip(blocks) {
            o.push(b);
        }
    }
    out
}

fn num(v: f64) -> String {
    if v.fract() == 0.0 && v.abs() < 1e15 {
        format!("{}", v as i64)
    } else {
        format!("{v}")
    }
}

fn list(v: &[f64]) -> String {
    let items: Vec<String> = v.iter().map(|&x| num(x)).collect();
    format!("[{}]", items.join(", "))
}

fn table_json(out: &mut String, key: &str, t: &[Vec<Vec<f64>>], last: bool) {
    let _ = writeln!(out, "      \"{key}\": [");
    for (mi, block) in t.iter().enumerate() {
        out.push_str("        [\n");
        for (pi, row) in block.iter().enumerate() {
            let comma = if pi + 1 < block.len() { "," } else { "" };
            let _ = writeln!(out, "          {}{comma}", list(row));
        }
        let comma = if mi + 1 < t.len() { "," } else { "" };
        let _ = writeln!(out, "        ]{comma}");
    }
    let _ = writeln!(out, "      ]{}", if last { "" } else { "," });
}

/// The type file text for an airframe.
pub fn type_json(af: &Airframe) -> String {
    let t = tables(af);
    let mut o = String::new();
    let mtow = af.masses_kg[2];
    let _ = write!(
        o,
        r#"{{
  "schema_version": 1,
  "id": "{id}",
  "name": "{name}",
  "engines": {engines},
  "seats": {seats},
  "limits": {{
    "max_takeoff_mass_kg": {mtow},
    "max_landing_mass_kg": {mlw},
    "max_demonstrated_crosswind_kt": {xw}
  }},
  "speeds": {{
    "rotation_kias": {vr},
    "vx_kias": {vx},
    "vy_kias": {vy},
    "approach_kias": {va}
  }},
  "source": {{
    "document": "rhoboard demo physics model (examples/gen_demo.rs) — invented data, not a flight manual",
    "revision": "demo-1",
    "entered_by": "generated",
    "checked_by": "tests/ops_demo_gen.rs",
    "date": "2026-06-01"
  }},
  "performance": {{
    "axes": {{
      "mass_kg": {masses},
      "pressure_altitude_ft": {pas},
      "oat_c": {oats}
    }},
    "takeoff": {{
      "conditions": "Flaps takeoff setting, full power before brake release, dry paved level runway, no wind. Lift-off 1.2 V_S, 1.3 V_S at 50 ft.",
"#,
        id = af.id,
        name = af.name,
        engines = af.engines,
        seats = af.seats,
        mtow = num(mtow),
        mlw = num(af.max_landing_mass_kg),
        xw = num(af.max_crosswind_kt),
        vr = num(af.rotation_kias),
        vx = num(af.vx_kias),
        vy = num(af.vy_kias),
        va = num(af.approach_kias),
        masses = list(&af.masses_kg),
        pas = list(&PRESSURE_ALTITUDES_FT),
        oats = list(&OATS_C),
    );
    table_json(&mut o, "ground_roll_m", &t[0], false);
    table_json(&mut o, "distance_50ft_m", &t[1], true);
    o.push_str("    },\n    \"landing\": {\n");
    o.push_str("      \"conditions\": \"Flaps landing setting, power idle, 1.3 V_S0 at 50 ft, maximum braking, dry paved level runway, no wind.\",\n");
    table_json(&mut o, "distance_50ft_m", &t[2], false);
    table_json(&mut o, "ground_roll_m", &t[3], true);
    o.push_str("    },\n    \"climb\": {\n");
    o.push_str("      \"conditions\": \"Flaps up, full power, at Vy.\",\n");
    let _ = writeln!(o, "      \"climb_speed_kias\": {},", num(af.vy_kias));
    table_json(&mut o, "rate_fpm", &t[4], true);
    o.push_str("    }\n  },\n");
    o.push_str(&corrections_json(af.id));
    o.push_str(&mass_balance_json(af));
    o.push_str("  \"remarks\": \"Fictional demo type generated from a physics model. Never use for a real aircraft.\"\n}\n");
    o
}

fn corrections_json(id: &str) -> String {
    // Manual-style correction rules; each type exercises a different combination.
    match id {
        "ft2" => r#"  "corrections": {
    "takeoff": {
      "headwind_decrease_percent_per_kt": 1.1,
      "tailwind_increase_percent_per_kt": 5,
      "wind_factoring_included": false,
      "grass_dry": {"add_percent_of_ground_roll": 15}
    },
    "landing": {
      "headwind_decrease_percent_per_kt": 1.1,
      "tailwind_increase_percent_per_kt": 5,
      "wind_factoring_included": false,
      "grass_dry": {"add_percent_of_ground_roll": 30}
    }
  },
"#
        .to_string(),
        "ft4" => r#"  "corrections": {
    "takeoff": {
      "headwind_decrease_percent_per_kt": 0.5,
      "tailwind_increase_percent_per_kt": 7.5,
      "wind_factoring_included": true,
      "grass_dry": {"multiply_by": 1.2},
      "grass_wet": {"multiply_by": 1.3}
    },
    "landing": {
      "headwind_decrease_percent_per_kt": 0.5,
      "tailwind_increase_percent_per_kt": 7.5,
      "wind_factoring_included": true,
      "grass_dry": {"multiply_by": 1.15}
    }
  },
"#
        .to_string(),
        _ => r#"  "corrections": {
    "takeoff": {
      "headwind_decrease_percent_per_kt": 1.0,
      "tailwind_increase_percent_per_kt": 5,
      "wind_factoring_included": false,
      "adverse_slope_increase_percent_per_percent": 5
    },
    "landing": {
      "headwind_decrease_percent_per_kt": 1.0,
      "tailwind_increase_percent_per_kt": 5,
      "wind_factoring_included": false,
      "paved_wet": {"multiply_by": 1.15},
      "adverse_slope_increase_percent_per_percent": 5
    }
  },
"#
        .to_string(),
    }
}

fn mass_balance_json(af: &Airframe) -> String {
    let mtow = af.masses_kg[2];
    let (stations, tank, env): (&str, (f64, f64), [(f64, f64); 5]) = match af.id {
        "ft2" => (
            r#"      {"id": "seats", "name": "Pilot and passenger", "arm_mm": 990, "max_mass_kg": 200, "seats": 2},
      {"id": "baggage", "name": "Baggage area", "arm_mm": 1640, "max_mass_kg": 25}"#,
            (1070.0, 90.0),
            [
                (500.0, 790.0),
                (650.0, 790.0),
                (750.0, 860.0),
                (750.0, 920.0),
                (500.0, 920.0),
            ],
        ),
        "ft4" => (
            r#"      {"id": "front_seats", "name": "Front seats", "arm_mm": 940, "max_mass_kg": 220, "seats": 2},
      {"id": "rear_seats", "name": "Rear seats", "arm_mm": 1850, "max_mass_kg": 200, "seats": 2},
      {"id": "baggage", "name": "Baggage area", "arm_mm": 2410, "max_mass_kg": 55}"#,
            (1220.0, 180.0),
            [
                (700.0, 890.0),
                (900.0, 890.0),
                (1150.0, 1000.0),
                (1150.0, 1200.0),
                (700.0, 1200.0),
            ],
        ),
        _ => (
            r#"      {"id": "front_seats", "name": "Pilot and front passenger", "arm_mm": 1000, "max_mass_kg": 220, "seats": 2},
      {"id": "middle_seats", "name": "Middle row", "arm_mm": 1900, "max_mass_kg": 200, "seats": 2},
      {"id": "rear_seats", "name": "Rear row", "arm_mm": 2700, "max_mass_kg": 180, "seats": 2},
      {"id": "baggage", "name": "Baggage area", "arm_mm": 3300, "max_mass_kg": 70}"#,
            (1250.0, 300.0),
            [
                (950.0, 1050.0),
                (1250.0, 1050.0),
                (1600.0, 1250.0),
                (1600.0, 1470.0),
                (950.0, 1470.0),
            ],
        ),
    };
    let _ = mtow;
    let env: Vec<String> = env
        .iter()
        .map(|(m, a)| format!("{{\"mass_kg\": {}, \"arm_mm\": {}}}", num(*m), num(*a)))
        .collect();
    format!(
        r#"  "mass_balance": {{
    "stations": [
{stations}
    ],
    "fuel_tanks": [
      {{"id": "main", "arm_mm": {arm}, "usable_capacity_l": {cap}, "fuel_density_kg_per_l": 0.72}}
    ],
    "envelope": [
      {env}
    ]
  }},
"#,
        arm = num(tank.0),
        cap = num(tank.1),
        env = env.join(",\n      ")
    )
}

/// Every generated file: (path from the repository root, text).
pub fn generated_files() -> Vec<(String, String)> {
    let mut v: Vec<(String, String)> = airframes()
        .iter()
        .map(|af| (format!("fleet/types/{}.json", af.id), type_json(af)))
        .collect();
    v.push((
        format!("fixtures/demo/observations/{DEMO_DATE}.txt"),
        super::demo_day::metars(),
    ));
    v.push((
        format!("fixtures/demo/forecasts/{DEMO_DATE}.txt"),
        super::demo_day::tafs(),
    ));
    v
}

/// The demo day (UTC).
pub const DEMO_DATE: &str = "2026-06-14";
