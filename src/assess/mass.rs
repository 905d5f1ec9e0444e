//! Mass and balance of a leg: empty aircraft + people and baggage by station + fuel →
//! ramp, takeoff and landing mass, moment and centre of gravity; the checks against the
//! maximum masses, each station's limit, the tanks, the reserve and the CG envelope.
//!
//! Moments are kg·mm (arms in mm aft of the manual's datum); CG = Σ moment ÷ Σ mass
//! (FAA Aircraft Weight and Balance Handbook, FAA-H-8083-1, chapter 2). Fuel is spread
//! over the tanks in proportion to their usable capacity.

use serde::Serialize;

use super::limits::{LimitCheck, LimitKind};
use super::state::{State, verdict};
use crate::ops::actype::{AircraftTypeFile, EnvelopePoint, MassBalance as TypeMassBalance};
use crate::ops::legs::Loads;
use crate::ops::operator::{DEFAULT_FUEL_RESERVE_MIN, Policy};
use crate::ops::{Aircraft, Leg};
use crate::units::L_PER_USGAL;

/// One row of the loading table.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LoadRow {
    /// Station id (`empty`, a station, `fuel`).
    pub station: String,
    /// Display name.
    pub name: String,
    /// Mass, kg.
    pub mass_kg: f64,
    /// Arm, mm.
    pub arm_mm: f64,
    /// Moment, kg·mm.
    pub moment_kg_mm: f64,
    /// The station's limit, kg.
    pub max_mass_kg: Option<f64>,
}

/// Mass and CG at one moment of the leg.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct MassPoint {
    /// Mass, kg.
    pub mass_kg: f64,
    /// Centre of gravity, mm aft of datum.
    pub cg_mm: f64,
}

/// A leg's mass and balance.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MassBalance {
    /// The loading table at takeoff (empty, stations, takeoff fuel).
    pub rows: Vec<LoadRow>,
    /// At engine start.
    pub ramp: MassPoint,
    /// At brake release.
    pub takeoff: MassPoint,
    /// At touchdown.
    pub landing: MassPoint,
    /// Fuel at engine start, litres.
    pub fuel_start_l: f64,
    /// Fuel at landing, litres.
    pub fuel_landing_l: f64,
    /// Reserve required at landing, litres.
    pub fuel_reserve_l: f64,
    /// The takeoff-to-landing CG line stays inside the envelope (`None`: the leg gives
    /// only a fixed mass, so there is no CG).
    pub within_envelope: Option<bool>,
    /// The type's envelope, for drawing.
    pub envelope: Vec<EnvelopePoint>,
    /// The envelope's CG limits at the takeoff mass (`None`: a fixed mass, or a mass
    /// the envelope does not reach).
    pub takeoff_cg_range: Option<CgRange>,
    /// The same at the landing mass.
    pub landing_cg_range: Option<CgRange>,
    /// The tightest point of the CG line from takeoff to landing: its mass, CG, the
    /// envelope's limits there and the margin to the nearer one (`None` as above).
    pub cg_margin: Option<CgRange>,
    /// The checks (maximum masses, stations, fuel, envelope).
    pub checks: Vec<LimitCheck>,
}

/// Which CG limit is the nearer one.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum CgSide {
    /// The forward limit (a minimum arm).
    Fore,
    /// The aft limit (a maximum arm).
    Aft,
}

impl CgSide {
    /// The word for the chain.
    pub const fn word(self) -> &'static str {
        match self {
            CgSide::Fore => "fore",
            CgSide::Aft => "aft",
        }
    }
}

/// The envelope's CG range at one mass, and a CG against it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct CgRange {
    /// The mass, kg.
    pub mass_kg: f64,
    /// The CG, mm aft of datum.
    pub cg_mm: f64,
    /// The forward CG limit at this mass, mm (of the stretch of the envelope holding
    /// the CG, or nearest it when outside).
    pub fore_limit_mm: f64,
    /// The aft CG limit at this mass, mm.
    pub aft_limit_mm: f64,
    /// Distance to the nearer limit, mm: positive inside, negative outside.
    pub margin_mm: f64,
    /// Which limit is nearer.
    pub nearer: CgSide,
}

impl CgRange {
    /// The nearer limit, mm.
    pub fn nearer_limit_mm(&self) -> f64 {
        match self.nearer {
            CgSide::Fore => self.fore_limit_mm,
            CgSide::Aft => self.aft_limit_mm,
        }
    }
}

/// Where the horizontal line at `mass_kg` crosses the envelope's edges, sorted: pairs
/// of crossings bound the allowed CG stretches (even-odd rule). At the envelope's top
/// edge (its maximum mass, where a loading often sits) the half-open rule that counts a
/// vertex once finds nothing; it is taken closed from above there.
fn crossings(envelope: &[EnvelopePoint], mass_kg: f64) -> Vec<f64> {
    let n = envelope.len();
    let mut xs = Vec::new();
    for strict in [true, false] {
        for i in 0..n {
            let (a, b) = (envelope[i], envelope[(i + 1) % n]);
            let (above_a, above_b) = if strict {
                (a.mass_kg > mass_kg, b.mass_kg > mass_kg)
            } else {
                (a.mass_kg >= mass_kg, b.mass_kg >= mass_kg)
            };
            if above_a != above_b {
                xs.push(
                    a.arm_mm
                        + (mass_kg - a.mass_kg) * (b.arm_mm - a.arm_mm) / (b.mass_kg - a.mass_kg),
                );
            }
        }
        if !xs.is_empty() {
            break;
        }
    }
    xs.sort_by(f64::total_cmp);
    xs
}

/// The envelope's fore and aft CG limits at `mass_kg` and the margin of `cg_mm` to
/// the nearer one; `None` when the envelope does not reach that mass (or has fewer
/// than three points).
pub fn cg_range(envelope: &[EnvelopePoint], mass_kg: f64, cg_mm: f64) -> Option<CgRange> {
    if envelope.len() < 3 || !mass_kg.is_finite() || !cg_mm.is_finite() {
        return None;
    }
    let xs = crossings(envelope, mass_kg);
    let eps = 1e-9;
    let mut best: Option<CgRange> = None;
    for pair in xs.chunks_exact(2) {
        let (fore, aft) = (pair[0], pair[1]);
        let (to_fore, to_aft) = (cg_mm - fore, aft - cg_mm);
        let (margin, nearer) = if to_fore >= -eps && to_aft >= -eps {
            if to_fore <= to_aft {
                (to_fore.max(0.0), CgSide::Fore)
            } else {
                (to_aft.max(0.0), CgSide::Aft)
            }
        } else if to_fore < 0.0 {
            (to_fore, CgSide::Fore)
        } else {
            (to_aft, CgSide::Aft)
        };
        let r = CgRange {
            mass_kg,
            cg_mm,
            fore_limit_mm: fore,
            aft_limit_mm: aft,
            margin_mm: margin,
            nearer,
        };
        // The stretch holding the CG, else the one nearest it.
        if best.is_none_or(|b| r.margin_mm > b.margin_mm) {
            best = Some(r);
        }
    }
    best
}

/// The tightest point of the straight CG line from `from` to `to` against the envelope:
/// the margin is read at both ends, at every envelope vertex's mass in between and
/// half-way between those (the limits are straight between vertex masses, so the
/// smallest margin is at one of these). `None` when some point of the line is at a
/// mass the envelope does not reach.
pub fn line_margin(envelope: &[EnvelopePoint], from: MassPoint, to: MassPoint) -> Option<CgRange> {
    let (lo, hi) = if from.mass_kg <= to.mass_kg {
        (from.mass_kg, to.mass_kg)
    } else {
        (to.mass_kg, from.mass_kg)
    };
    let cg_at = |m: f64| {
        if (to.mass_kg - from.mass_kg).abs() < 1e-12 {
            from.cg_mm
        } else {
            from.cg_mm + (m - from.mass_kg) * (to.cg_mm - from.cg_mm) / (to.mass_kg - from.mass_kg)
        }
    };
    let mut masses: Vec<f64> = envelope
        .iter()
        .map(|p| p.mass_kg)
        .filter(|m| *m > lo && *m < hi)
        .chain([lo, hi])
        .collect();
    masses.sort_by(f64::total_cmp);
    masses.dedup();
    let mids: Vec<f64> = masses.windows(2).map(|w| 0.5 * (w[0] + w[1])).collect();
    let mut best: Option<CgRange> = None;
    // The two ends first, so that a tie names the takeoff or landing point.
    for m in [from.mass_kg, to.mass_kg]
        .into_iter()
        .chain(masses)
        .chain(mids)
    {
        let cg = if m == from.mass_kg {
            from.cg_mm
        } else if m == to.mass_kg {
            to.cg_mm
        } else {
            cg_at(m)
        };
        let r = cg_range(envelope, m, cg)?;
        if best.is_none_or(|b| r.margin_mm < b.margin_mm) {
            best = Some(r);
        }
    }
    // A level line (takeoff and landing at one mass) is checked at its two ends.
    best
}

/// Whether point (arm, mass) is inside the polygon or on its boundary.
pub fn inside(envelope: &[EnvelopePoint], arm_mm: f64, mass_kg: f64) -> bool {
    let n = envelope.len();
    if n < 3 {
        return false;
    }
    let eps = 1e-9;
    let mut crossings = false;
    for i in 0..n {
        let a = envelope[i];
        let b = envelope[(i + 1) % n];
        // On the edge counts as inside.
        let cross = (b.arm_mm - a.arm_mm) * (mass_kg - a.mass_kg)
            - (b.mass_kg - a.mass_kg) * (arm_mm - a.arm_mm);
        let within_box = arm_mm >= a.arm_mm.min(b.arm_mm) - eps
            && arm_mm <= a.arm_mm.max(b.arm_mm) + eps
            && mass_kg >= a.mass_kg.min(b.mass_kg) - eps
            && mass_kg <= a.mass_kg.max(b.mass_kg) + eps;
        let len = (b.arm_mm - a.arm_mm)
            .hypot(b.mass_kg - a.mass_kg)
            .max(1e-12);
        if within_box && (cross / len).abs() <= 1e-7 {
            return true;
        }
        // Ray to +arm: count edges straddling the point's mass.
        if (a.mass_kg > mass_kg) != (b.mass_kg > mass_kg) {
            let x =
                a.arm_mm + (mass_kg - a.mass_kg) * (b.arm_mm - a.arm_mm) / (b.mass_kg - a.mass_kg);
            if x > arm_mm {
                crossings = !crossings;
            }
        }
    }
    crossings
}

fn orient(p: (f64, f64), q: (f64, f64), r: (f64, f64)) -> f64 {
    (q.0 - p.0) * (r.1 - p.1) - (q.1 - p.1) * (r.0 - p.0)
}

/// Whether segments pq and rs cross at a point interior to both.
fn properly_cross(p: (f64, f64), q: (f64, f64), r: (f64, f64), s: (f64, f64)) -> bool {
    let (d1, d2) = (orient(r, s, p), orient(r, s, q));
    let (d3, d4) = (orient(p, q, r), orient(p, q, s));
    d1 * d2 < 0.0 && d3 * d4 < 0.0
}

/// Whether the straight line from one (arm, mass) point to another stays inside the
/// envelope: both ends inside, and no edge crossed (a concave envelope can be left and
/// re-entered between two inside points).
pub fn line_inside(envelope: &[EnvelopePoint], from: MassPoint, to: MassPoint) -> bool {
    if !inside(envelope, from.cg_mm, from.mass_kg) || !inside(envelope, to.cg_mm, to.mass_kg) {
        return false;
    }
    let p = (from.cg_mm, from.mass_kg);
    let q = (to.cg_mm, to.mass_kg);
    let n = envelope.len();
    for i in 0..n {
        let a = envelope[i];
        let b = envelope[(i + 1) % n];
        if properly_cross(p, q, (a.arm_mm, a.mass_kg), (b.arm_mm, b.mass_kg)) {
            return false;
        }
    }
    // The midpoint too, for a line that runs along a concave notch's vertex.
    inside(envelope, 0.5 * (p.0 + q.0), 0.5 * (p.1 + q.1))
}

/// Whether a polygon is simple: no two non-adjacent edges cross.
pub fn self_intersects(envelope: &[EnvelopePoint]) -> bool {
    let n = envelope.len();
    for i in 0..n {
        for j in i + 1..n {
            if j == i + 1 || (i == 0 && j == n - 1) {
                continue;
            }
            let (a, b) = (envelope[i], envelope[(i + 1) % n]);
            let (c, d) = (envelope[j], envelope[(j + 1) % n]);
            if properly_cross(
                (a.arm_mm, a.mass_kg),
                (b.arm_mm, b.mass_kg),
                (c.arm_mm, c.mass_kg),
                (d.arm_mm, d.mass_kg),
            ) {
                return true;
            }
        }
    }
    false
}

/// The people and baggage at each station, kg, in the order of `loads.stations`.
pub fn station_masses(loads: &Loads, policy: &Policy) -> Vec<f64> {
    let (adult, child) = policy
        .standard_masses
        .as_ref()
        .map_or((f64::NAN, f64::NAN), |s| (s.adult_kg, s.child_kg));
    loads
        .stations
        .iter()
        .map(|s| {
            let mut m = s.mass_kg.unwrap_or(0.0);
            if s.standard_adults > 0 {
                m += f64::from(s.standard_adults) * adult;
            }
            if s.standard_children > 0 {
                m += f64::from(s.standard_children) * child;
            }
            m
        })
        .collect()
}

/// Fuel at engine start in litres from whichever unit the leg gives.
pub fn fuel_start_l(loads: &Loads, density_kg_per_l: f64) -> f64 {
    loads
        .fuel_at_start_l
        .or(loads.fuel_at_start_usgal.map(|g| g * L_PER_USGAL))
        .or(loads.fuel_at_start_kg.map(|kg| kg / density_kg_per_l))
        .unwrap_or(0.0)
}

/// The inputs of a mass-and-balance computation, with any extra load at one station.
#[derive(Debug, Clone, Copy)]
pub struct Extra {
    /// Station index in the type's stations.
    pub station: usize,
    /// Extra mass there, kg (negative: removed).
    pub kg: f64,
}

/// Computes the mass and balance of a leg with loads; `None` when the type has no
/// mass-and-balance data.
pub fn compute(
    leg: &Leg,
    loads: &Loads,
    aircraft: &Aircraft,
    ty: &AircraftTypeFile,
    policy: &Policy,
    extra: Option<Extra>,
) -> Option<MassBalance> {
    let mb: &TypeMassBalance = ty.mass_balance.as_ref()?;
    let (max_takeoff_mass_kg, max_landing_mass_kg) =
        (ty.limits.max_takeoff_mass_kg, ty.limits.max_landing_mass_kg);
    let masses = station_masses(loads, policy);
    let density = mb
        .fuel_tanks
        .first()
        .map_or(0.72, |t| t.fuel_density_kg_per_l);
    let capacity_l: f64 = mb.fuel_tanks.iter().map(|t| t.usable_capacity_l).sum();
    // Fuel spread by capacity: one mean arm.
    let fuel_arm = if capacity_l > 0.0 {
        mb.fuel_tanks
            .iter()
            .map(|t| t.arm_mm * t.usable_capacity_l)
            .sum::<f64>()
            / capacity_l
    } else {
        0.0
    };
    let mut rows = vec![LoadRow {
        station: "empty".to_string(),
        name: format!("{} empty (weighing record)", aircraft.registration),
        mass_kg: aircraft.empty_mass_kg,
        arm_mm: aircraft.empty_arm_mm,
        moment_kg_mm: aircraft.empty_mass_kg * aircraft.empty_arm_mm,
        max_mass_kg: None,
    }];
    let mut checks = Vec::new();
    for (si, st) in mb.stations.iter().enumerate() {
        let mut m: f64 = loads
            .stations
            .iter()
            .zip(&masses)
            .filter(|(l, _)| l.station == st.id)
            .map(|(_, m)| *m)
            .sum();
        if let Some(e) = extra
            && e.station == si
        {
            m = (m + e.kg).max(0.0);
        }
        if m == 0.0 {
            continue;
        }
        rows.push(LoadRow {
            station: st.id.clone(),
            name: st.name.clone(),
            mass_kg: m,
            arm_mm: st.arm_mm,
            moment_kg_mm: m * st.arm_mm,
            max_mass_kg: Some(st.max_mass_kg),
        });
        let margin = st.max_mass_kg - m;
        checks.push(LimitCheck {
            kind: LimitKind::Loading,
            value: Some(m),
            limit: Some(st.max_mass_kg),
            unit: "kg",
            margin,
            band: 0.0,
            state: if margin < 0.0 {
                State::Below
            } else {
                State::Within
            },
            source: "aircraft type: loading station limit".to_string(),
            note: format!("{} ({})", st.name, st.id),
            subject: format!("{} ({})", st.name, st.id),
            open_ended: false,
        });
    }
    // A load at a station this type does not have (a swapped aircraft, a typo) is never
    // dropped silently: it is a failed check, and its mass still counts at the empty CG.
    for (l, m) in loads.stations.iter().zip(&masses) {
        if !mb.stations.iter().any(|st| st.id == l.station) {
            let known: Vec<&str> = mb.stations.iter().map(|st| st.id.as_str()).collect();
            rows.push(LoadRow {
                station: l.station.clone(),
                name: format!("{} (not a station of this type)", l.station),
                mass_kg: *m,
                arm_mm: aircraft.empty_arm_mm,
                moment_kg_mm: m * aircraft.empty_arm_mm,
                max_mass_kg: Some(0.0),
            });
            checks.push(LimitCheck {
                kind: LimitKind::Loading,
                value: Some(*m),
                limit: Some(0.0),
                unit: "kg",
                margin: -m.max(1.0),
                band: 0.0,
                state: State::Below,
                source: "aircraft type: loading stations".to_string(),
                note: format!(
                    "{} kg at '{}', which this type does not have (it has: {})",
                    m,
                    l.station,
                    known.join(", ")
                ),
                subject: format!("'{}'", l.station),
                open_ended: false,
            });
        }
    }
    let start_l = fuel_start_l(loads, density);
    let takeoff_l = (start_l - loads.taxi_fuel_l).max(0.0);
    let hours = ((leg.arrives_utc() - leg.departs_utc()).num_seconds() as f64 / 3_600.0).max(0.0);
    let burn_l = loads.burn_l_per_h * hours;
    let landing_l = takeoff_l - burn_l;
    let reserve_min = policy
        .fuel_reserve
        .as_ref()
        .map_or(DEFAULT_FUEL_RESERVE_MIN, |r| r.minutes);
    let reserve_l = loads.burn_l_per_h * reserve_min / 60.0;

    let payload: (f64, f64) = rows.iter().fold((0.0, 0.0), |(m, mo), r| {
        (m + r.mass_kg, mo + r.moment_kg_mm)
    });
    let point = |fuel_l: f64| {
        let fm = fuel_l.max(0.0) * density;
        let mass = payload.0 + fm;
        MassPoint {
            mass_kg: mass,
            cg_mm: (payload.1 + fm * fuel_arm) / mass,
        }
    };
    rows.push(LoadRow {
        station: "fuel".to_string(),
        name: format!("fuel at takeoff, {takeoff_l:.0} L"),
        mass_kg: takeoff_l * density,
        arm_mm: fuel_arm,
        moment_kg_mm: takeoff_l * density * fuel_arm,
        max_mass_kg: Some(capacity_l * density),
    });
    let (ramp, takeoff, landing) = (point(start_l), point(takeoff_l), point(landing_l));

    let kg_check = |kind, value: f64, limit: f64, source: &str, note: String| {
        let margin = limit - value;
        LimitCheck {
            kind,
            value: Some(value),
            limit: Some(limit),
            unit: "kg",
            margin,
            band: 0.0,
            state: if margin < 0.0 {
                State::Below
            } else {
                State::Within
            },
            source: source.to_string(),
            note,
            subject: String::new(),
            open_ended: false,
        }
    };
    checks.push(kg_check(
        LimitKind::TakeoffMass,
        takeoff.mass_kg,
        max_takeoff_mass_kg,
        "aircraft type: maximum takeoff mass",
        "takeoff mass".to_string(),
    ));
    checks.push(kg_check(
        LimitKind::LandingMass,
        landing.mass_kg,
        max_landing_mass_kg,
        "aircraft type: maximum landing mass",
        "landing mass".to_string(),
    ));
    checks.push(LimitCheck {
        unit: "L",
        ..kg_check(
            LimitKind::Fuel,
            start_l,
            capacity_l,
            "aircraft type: usable fuel",
            "fuel at engine start".to_string(),
        )
    });
    let reserve_source = policy.fuel_reserve.as_ref().map_or_else(
        || "rhoboard default 45 min (14 CFR 91.151: 30 min by day, 45 min at night)".to_string(),
        |r| r.source.clone(),
    );
    checks.push(LimitCheck {
        unit: "L",
        margin: landing_l - reserve_l,
        state: if landing_l < reserve_l {
            State::Below
        } else {
            State::Within
        },
        ..kg_check(
            LimitKind::FuelReserve,
            landing_l,
            reserve_l,
            &reserve_source,
            format!(
                "fuel at landing against {reserve_min:.0} min at {:.0} L/h",
                loads.burn_l_per_h
            ),
        )
    });
    let within = line_inside(&mb.envelope, takeoff, landing);
    let takeoff_cg_range = cg_range(&mb.envelope, takeoff.mass_kg, takeoff.cg_mm);
    let landing_cg_range = cg_range(&mb.envelope, landing.mass_kg, landing.cg_mm);
    let tightest = line_margin(&mb.envelope, takeoff, landing);
    let line = format!(
        "CG {:.0} mm at {:.0} kg (takeoff) to {:.0} mm at {:.0} kg (landing), {} the envelope",
        takeoff.cg_mm,
        takeoff.mass_kg,
        landing.cg_mm,
        landing.mass_kg,
        if within { "inside" } else { "outside" }
    );
    checks.push(match tightest {
        Some(t) => LimitCheck {
            kind: LimitKind::Envelope,
            value: Some(t.cg_mm),
            limit: Some(t.nearer_limit_mm()),
            unit: "mm",
            // The state is the line test's; a margin that disagrees with it (a line
            // leaving and re-entering a concave envelope between two sample points) is
            // shown as none to spare.
            margin: if within {
                t.margin_mm.max(0.0)
            } else {
                t.margin_mm.min(0.0)
            },
            band: 0.0,
            state: if within { State::Within } else { State::Below },
            source: "aircraft type: CG envelope".to_string(),
            note: format!(
                "{line}; tightest at {:.0} kg, where the envelope allows {:.0}–{:.0} mm: {:.0} mm {} the {} limit",
                t.mass_kg,
                t.fore_limit_mm,
                t.aft_limit_mm,
                t.margin_mm.abs(),
                if t.margin_mm >= 0.0 { "inside" } else { "beyond" },
                t.nearer.word()
            ),
            // Which limit the value and margin are against: "CG envelope fore".
            subject: t.nearer.word().to_string(),
            open_ended: false,
        },
        None => LimitCheck {
            kind: LimitKind::Envelope,
            value: Some(takeoff.cg_mm),
            limit: None,
            unit: "mm",
            margin: -1.0,
            band: 0.0,
            state: State::Below,
            source: "aircraft type: CG envelope".to_string(),
            note: format!("{line}: the envelope has no CG range at some mass of the line"),
            subject: String::new(),
            open_ended: false,
        },
    });
    Some(MassBalance {
        rows,
        ramp,
        takeoff,
        landing,
        fuel_start_l: start_l,
        fuel_landing_l: landing_l,
        fuel_reserve_l: reserve_l,
        within_envelope: Some(within),
        envelope: mb.envelope.clone(),
        takeoff_cg_range,
        landing_cg_range,
        cg_margin: tightest,
        checks,
    })
}

/// The mass checks of a leg that gives only fixed masses (no CG).
pub fn fixed(takeoff_mass_kg: f64, landing_mass_kg: f64, mtow: f64, mlm: f64) -> MassBalance {
    let point = |m: f64| MassPoint {
        mass_kg: m,
        cg_mm: f64::NAN,
    };
    let check = |kind, value: f64, limit: f64, source: &str| {
        let margin = limit - value;
        LimitCheck {
            kind,
            value: Some(value),
            limit: Some(limit),
            unit: "kg",
            margin,
            band: 0.0,
            state: verdict(margin, 0.0),
            source: source.to_string(),
            note: String::new(),
            subject: String::new(),
            open_ended: false,
        }
    };
    MassBalance {
        rows: Vec::new(),
        ramp: point(takeoff_mass_kg),
        takeoff: point(takeoff_mass_kg),
        landing: point(landing_mass_kg),
        fuel_start_l: f64::NAN,
        fuel_landing_l: f64::NAN,
        fuel_reserve_l: f64::NAN,
        within_envelope: None,
        envelope: Vec::new(),
        takeoff_cg_range: None,
        landing_cg_range: None,
        cg_margin: None,
        checks: vec![
            check(
                LimitKind::TakeoffMass,
                takeoff_mass_kg,
                mtow,
                "aircraft type: maximum takeoff mass",
            ),
            check(
                LimitKind::LandingMass,
                landing_mass_kg,
                mlm,
                "aircraft type: maximum landing mass",
            ),
        ],
    }
}

impl MassBalance {
    /// Whether every mass-and-balance check passes.
    pub fn passes(&self) -> bool {
        self.checks.iter().all(|c| c.state != State::Below)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn pt(mass_kg: f64, arm_mm: f64) -> EnvelopePoint {
        EnvelopePoint { mass_kg, arm_mm }
    }

    #[test]
    fn point_in_polygon_edges_vertices_and_concave() {
        let square = [pt(0.0, 0.0), pt(0.0, 10.0), pt(10.0, 10.0), pt(10.0, 0.0)];
        assert!(inside(&square, 5.0, 5.0));
        assert!(inside(&square, 10.0, 5.0), "on an edge");
        assert!(inside(&square, 0.0, 0.0), "on a vertex");
        assert!(inside(&square, 10.0, 10.0), "on the far vertex");
        assert!(!inside(&square, 10.000_1, 5.0));
        assert!(!inside(&square, -1.0, 5.0));
        // A concave "C": the notch on the right between masses 4 and 6.
        let c = [
            pt(0.0, 0.0),
            pt(0.0, 10.0),
            pt(4.0, 10.0),
            pt(4.0, 4.0),
            pt(6.0, 4.0),
            pt(6.0, 10.0),
            pt(10.0, 10.0),
            pt(10.0, 0.0),
        ];
        assert!(inside(&c, 2.0, 5.0));
        assert!(!inside(&c, 8.0, 5.0), "in the notch");
        assert!(inside(&c, 4.0, 5.0), "on the notch's floor");
        // Both ends inside but the line crosses the notch: not inside.
        let from = MassPoint {
            mass_kg: 3.0,
            cg_mm: 8.0,
        };
        let to = MassPoint {
            mass_kg: 7.0,
            cg_mm: 8.0,
        };
        assert!(inside(&c, from.cg_mm, from.mass_kg) && inside(&c, to.cg_mm, to.mass_kg));
        assert!(!line_inside(&c, from, to));
        assert!(line_inside(
            &c,
            from,
            MassPoint {
                mass_kg: 3.0,
                cg_mm: 1.0
            }
        ));
        assert!(!self_intersects(&c));
        let bow = [pt(0.0, 0.0), pt(10.0, 10.0), pt(10.0, 0.0), pt(0.0, 10.0)];
        assert!(self_intersects(&bow));
    }
}
