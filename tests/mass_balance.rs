//! Mass and balance: the loading arithmetic, the envelope, the checks, the payload
//! headroom, and the demo's afternoon charter.

use chrono::{DateTime, TimeZone, Utc};
use proptest::prelude::*;
use rhoboard::assess::leg::{assess, leg_mass_balance};
use rhoboard::assess::limits::LimitKind;
use rhoboard::assess::mass;
use rhoboard::assess::{Context, DaySettings, Model, State};
use rhoboard::observation::{Store, decode_all};
use rhoboard::ops::legs::{Loads, StationLoad};
use rhoboard::ops::{Leg, Ops, demo};
use rhoboard::units::{L_PER_USGAL, lb_to_kg};

fn ops() -> Ops {
    demo::load().ops.expect("demo")
}

fn at(h: u32, m: u32) -> DateTime<Utc> {
    Utc.with_ymd_and_hms(2026, 6, 14, h, m, 0).unwrap()
}

fn store(ops: &Ops, t: DateTime<Utc>) -> Store {
    let mut s = Store::default();
    for (_, text) in &ops.observations {
        for r in decode_all(text, t) {
            s.insert(r.report);
        }
    }
    s
}

fn leg(ops: &Ops, id: &str) -> Leg {
    ops.legs.iter().find(|l| l.id == id).cloned().expect("leg")
}

fn station(id: &str, mass_kg: Option<f64>, adults: u32) -> StationLoad {
    StationLoad {
        station: id.to_string(),
        mass_kg,
        standard_adults: adults,
        standard_children: 0,
        note: String::new(),
    }
}

/// Fuel conversions: avgas at 6.0 lb per US gallon (FAA Pilot's Handbook of Aeronautical
/// Knowledge, weight and balance chapter) is 6.0 × 0.45359237 / 3.785411784 = 0.7190 kg/L;
/// 1 US gal = 3.785411784 L exactly (NIST SP 811).
#[test]
fn fuel_units() {
    let avgas_kg_per_l = lb_to_kg(6.0) / L_PER_USGAL;
    assert!((avgas_kg_per_l - 0.7190).abs() < 1e-4);
    let loads = |l: Option<f64>, g: Option<f64>, kg: Option<f64>| Loads {
        stations: vec![],
        fuel_at_start_l: l,
        fuel_at_start_usgal: g,
        fuel_at_start_kg: kg,
        taxi_fuel_l: 0.0,
        burn_l_per_h: 0.0,
    };
    assert!(
        (mass::fuel_start_l(&loads(None, Some(40.0), None), 0.72) - 151.416_471_36).abs() < 1e-6
    );
    assert!((mass::fuel_start_l(&loads(None, None, Some(72.0)), 0.72) - 100.0).abs() < 1e-9);
    assert_eq!(
        mass::fuel_start_l(&loads(Some(88.0), None, None), 0.72),
        88.0
    );
}

/// The loading of the demo's L16 (six-seat type), worked by hand by the method of the
/// FAA Aircraft Weight and Balance Handbook (FAA-H-8083-1B, ch. 2) — not a printed
/// example (the printed ones are `ac_43_13_1b_*` below): moment = mass × arm, CG =
/// total moment ÷ total mass. X-UTLB empty 1,016 kg at 1,158 mm; pilot 84 kg at
/// 1,000 mm; two standard adults (90 kg each) at 1,900 mm; one at 2,700 mm; 10 kg of
/// baggage at 3,300 mm; 125 L at engine start, 5 L taxi: 120 L × 0.72 = 86.4 kg at 1,250 mm.
///   moments: 1,176,528 + 84,000 + 342,000 + 243,000 + 33,000 + 108,000 = 1,986,528 kg·mm
///   takeoff mass 1,016 + 84 + 180 + 90 + 10 + 86.4 = 1,466.4 kg; CG 1,354.7 mm
/// 55 min at 65 L/h burns 59.58 L (42.9 kg): landing 1,423.5 kg, CG
///   (1,986,528 − 42.9 × 1,250) / 1,423.5 = 1,357.9 mm.
#[test]
fn a_worked_loading_table() {
    let ops = ops();
    let l16 = leg(&ops, "L16");
    let mb = leg_mass_balance(&ops, &l16).expect("loads");
    assert!(
        (mb.takeoff.mass_kg - 1_466.4).abs() < 1e-9,
        "{}",
        mb.takeoff.mass_kg
    );
    assert!((mb.takeoff.cg_mm - 1_986_528.0 / 1_466.4).abs() < 1e-6);
    let burn_kg = 65.0 * 55.0 / 60.0 * 0.72;
    assert!((mb.landing.mass_kg - (1_466.4 - burn_kg)).abs() < 1e-9);
    let landing_cg = (1_986_528.0 - burn_kg * 1_250.0) / (1_466.4 - burn_kg);
    assert!((mb.landing.cg_mm - landing_cg).abs() < 1e-6);
    assert_eq!(mb.within_envelope, Some(true));
    // The ramp point carries the taxi fuel.
    assert!((mb.ramp.mass_kg - (1_466.4 + 5.0 * 0.72)).abs() < 1e-9);
    // Reserve: 45 min at 65 L/h = 48.75 L; landing with 120 − 59.58 = 60.4 L passes.
    assert!((mb.fuel_reserve_l - 48.75).abs() < 1e-9);
    assert!(mb.passes());
}

/// A type whose loading stations, tank and empty weight are those of the aircraft in the
/// printed examples of FAA Advisory Circular 43.13-1B (1998), chapter 10 (Weight and
/// Balance), section 2: empty 1,169 lb at +10.6 in, oil 17 lb at −49 in, front seats
/// +16 in, rear seats +48 in, baggage +75.5 in, fuel +22 in. Pounds and inches are
/// converted exactly (1 lb = 0.45359237 kg, 1 in = 25.4 mm).
fn ac_43_13_aircraft() -> (Ops, Leg) {
    let mut ops = ops();
    let mm = |inches: f64| inches * 25.4;
    let reg = leg(&ops, "L16").aircraft;
    let type_id = ops.aircraft(&reg).unwrap().type_id.clone();
    let ac = ops
        .aircraft
        .iter_mut()
        .find(|a| a.registration == reg)
        .unwrap();
    ac.empty_mass_kg = lb_to_kg(1_169.0);
    ac.empty_arm_mm = mm(10.6);
    let ty = ops.types.iter_mut().find(|t| t.file.id == type_id).unwrap();
    let mb = ty.file.mass_balance.as_mut().unwrap();
    let st = |id: &str, arm_in: f64| rhoboard::ops::actype::Station {
        id: id.to_string(),
        name: id.to_string(),
        arm_mm: mm(arm_in),
        max_mass_kg: lb_to_kg(1_000.0),
        seats: 0,
    };
    mb.stations = vec![
        st("oil", -49.0),
        st("front", 16.0),
        st("rear", 48.0),
        st("baggage", 75.5),
    ];
    mb.fuel_tanks.truncate(1);
    mb.fuel_tanks[0].arm_mm = mm(22.0);
    mb.fuel_tanks[0].usable_capacity_l = 200.0;
    let mut l = leg(&ops, "L16");
    l.loads = Some(Loads {
        stations: vec![],
        fuel_at_start_l: None,
        fuel_at_start_usgal: None,
        fuel_at_start_kg: Some(lb_to_kg(240.0)),
        taxi_fuel_l: 0.0,
        burn_l_per_h: 0.0,
    });
    (ops, l)
}

/// Total mass (kg), total moment (kg·mm) and CG (mm) of a loading in pounds at the
/// stations of [`ac_43_13_aircraft`], back in lb, lb·in and in.
fn ac_43_13_totals(ops: &Ops, l: &Leg, lb: &[(&str, f64)]) -> (f64, f64, f64) {
    let mut l = l.clone();
    let loads = l.loads.as_mut().unwrap();
    loads.stations = lb
        .iter()
        .map(|(id, w)| station(id, Some(lb_to_kg(*w)), 0))
        .collect();
    let mb = leg_mass_balance(ops, &l).expect("loads");
    let moment_kg_mm: f64 = mb.rows.iter().map(|r| r.moment_kg_mm).sum();
    let kg_per_lb = lb_to_kg(1.0);
    // The sum of the rows is the total the CG is made from.
    assert!((moment_kg_mm / mb.takeoff.mass_kg - mb.takeoff.cg_mm).abs() < 1e-9);
    (
        mb.takeoff.mass_kg / kg_per_lb,
        moment_kg_mm / (kg_per_lb * 25.4),
        mb.takeoff.cg_mm / 25.4,
    )
}

/// FAA AC 43.13-1B, chapter 10, Figure 10-14 (page 10-18), "Loading conditions:
/// determination of the fuel and the number and location of passengers permissible
/// with maximum baggage" — printed: aircraft empty 1,169 lb × +10.6 = +12,391; oil
/// 17 × −49 = −833; pilot 170 × +16 = +2,720; passenger (1) rear 170 × +48 = +8,160;
/// passenger (1) front 170 × +16 = +2,720; fuel (40 gal) 240 × +22 = +5,280; baggage
/// 100 × +75.5 = +7,550; total 2,036 lb and 37,988 lb·in; CG = TM ÷ TW = +18.7 in. (The
/// printed moments are rounded to the lb·in: 1,169 × 10.6 is 12,391.4.)
#[test]
fn ac_43_13_1b_figure_10_14_loading() {
    let (ops, l) = ac_43_13_aircraft();
    let (lb, lb_in, cg_in) = ac_43_13_totals(
        &ops,
        &l,
        &[
            ("oil", 17.0),
            ("front", 170.0),
            ("rear", 170.0),
            ("front", 170.0),
            ("baggage", 100.0),
        ],
    );
    assert!((lb - 2_036.0).abs() < 1e-9, "{lb}");
    assert!((lb_in - 37_988.0).abs() < 1.0, "{lb_in}");
    assert!((cg_in - 18.7).abs() < 0.05, "{cg_in}");
}

/// FAA AC 43.13-1B, chapter 10, Figure 10-11 (the check of the most rearward weight and
/// balance extreme) — printed: empty 1,169 lb at +10.6, oil 17 at −49, pilot 170 at +16,
/// two rear passengers 340 at +48, fuel (40 gal) 240 at +22, baggage 100 at +75.5; total
/// 2,036 lb (TW) and 43,428 lb·in (TM), against a rearward C.G. limit of 21.9 in.
#[test]
fn ac_43_13_1b_figure_10_11_rearward_extreme() {
    let (ops, l) = ac_43_13_aircraft();
    let (lb, lb_in, cg_in) = ac_43_13_totals(
        &ops,
        &l,
        &[
            ("oil", 17.0),
            ("front", 170.0),
            ("rear", 340.0),
            ("baggage", 100.0),
        ],
    );
    assert!((lb - 2_036.0).abs() < 1e-9, "{lb}");
    assert!((lb_in - 43_428.0).abs() < 1.0, "{lb_in}");
    assert!((cg_in - 43_428.0 / 2_036.0).abs() < 1e-3, "{cg_in}");
    assert!(cg_in < 21.9);
}

/// The envelope's CG limits at a mass, worked by hand on the demo six-seat type's
/// envelope (950 kg 1,050 mm → 1,250 kg 1,050 mm → 1,600 kg 1,250 mm → 1,600 kg
/// 1,470 mm → 950 kg 1,470 mm): the fore limit is straight between vertices, so at
/// 1,423.5 kg it is 1,050 + (1,423.5 − 1,250) × 200 ÷ 350 = 1,149.1 mm, the aft 1,470 mm.
/// L16 lands at 1,423.5 kg with its CG at 1,357.9 mm: 112.1 mm inside the aft limit,
/// tighter than at takeoff (1,466.4 kg, CG 1,354.7 mm: 115.3 mm).
#[test]
fn cg_limits_and_margin_at_the_mass() {
    let ops = ops();
    let mb = leg_mass_balance(&ops, &leg(&ops, "L16")).expect("loads");
    let land = mb.landing_cg_range.unwrap();
    let fore = 1_050.0 + (mb.landing.mass_kg - 1_250.0) * 200.0 / 350.0;
    assert!((land.fore_limit_mm - fore).abs() < 1e-9);
    assert!((fore - 1_149.1).abs() < 0.05);
    assert_eq!(land.aft_limit_mm, 1_470.0);
    assert_eq!(land.nearer, mass::CgSide::Aft);
    assert!((land.margin_mm - (1_470.0 - mb.landing.cg_mm)).abs() < 1e-9);
    let takeoff = mb.takeoff_cg_range.unwrap();
    assert!((takeoff.margin_mm - (1_470.0 - mb.takeoff.cg_mm)).abs() < 1e-9);
    assert!((takeoff.margin_mm - 115.3).abs() < 0.05);
    // The line's tightest point is the landing, and the check carries it.
    let t = mb.cg_margin.unwrap();
    assert_eq!(t.mass_kg, mb.landing.mass_kg);
    assert!((t.margin_mm - 112.1).abs() < 0.05);
    let c = mb
        .checks
        .iter()
        .find(|c| c.kind == LimitKind::Envelope)
        .unwrap();
    assert_eq!(c.limit, Some(1_470.0));
    assert!((c.margin - t.margin_mm).abs() < 1e-12);
    assert_eq!(c.value, Some(mb.landing.cg_mm));
    assert!(
        c.note.contains("1149–1470 mm: 112 mm inside the aft limit"),
        "{}",
        c.note
    );
    // At the maximum mass, the top edge: 1,250–1,470 mm.
    let env = &mb.envelope;
    let top = mass::cg_range(env, 1_600.0, 1_300.0).unwrap();
    assert_eq!((top.fore_limit_mm, top.aft_limit_mm), (1_250.0, 1_470.0));
    assert_eq!((top.margin_mm, top.nearer), (50.0, mass::CgSide::Fore));
    // Outside: 30 mm beyond the aft limit; above the envelope's mass: no range.
    let out = mass::cg_range(env, 1_400.0, 1_500.0).unwrap();
    assert_eq!((out.margin_mm, out.nearer), (-30.0, mass::CgSide::Aft));
    assert!(mass::cg_range(env, 1_600.5, 1_300.0).is_none());
}

/// A line between two inside points that crosses a concave notch has a negative margin
/// at the notch (the envelope of the unit test in `assess::mass`: a "C" whose notch,
/// masses 4–6, leaves only arms 0–4).
#[test]
fn a_line_across_a_notch_has_a_negative_margin() {
    use rhoboard::ops::actype::EnvelopePoint;
    let pt = |mass_kg: f64, arm_mm: f64| EnvelopePoint { mass_kg, arm_mm };
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
    let from = mass::MassPoint {
        mass_kg: 3.0,
        cg_mm: 8.0,
    };
    let to = mass::MassPoint {
        mass_kg: 7.0,
        cg_mm: 8.0,
    };
    assert!(!mass::line_inside(&c, from, to));
    let t = mass::line_margin(&c, from, to).unwrap();
    assert_eq!((t.margin_mm, t.aft_limit_mm), (-4.0, 4.0));
    // Along the outer edge instead: inside, 2 mm from the aft limit.
    let t = mass::line_margin(
        &c,
        from,
        mass::MassPoint {
            mass_kg: 3.0,
            cg_mm: 2.0,
        },
    )
    .unwrap();
    assert_eq!(t.margin_mm, 2.0);
}

#[test]
fn each_failure_is_a_check_that_makes_the_leg_below() {
    let ops = ops();
    let model = Model::new(&ops, &DaySettings::default());
    let s = store(&ops, at(8, 0));
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &s,
        at: at(8, 0),
    };
    let base = leg(&ops, "L03");
    let with = |f: &dyn Fn(&mut Loads)| {
        let mut l = base.clone();
        f(l.loads.as_mut().unwrap());
        assess(&ctx, &l, 0)
    };
    let failing = |r: &rhoboard::assess::LegResult, kind: LimitKind| {
        r.mass_balance
            .as_ref()
            .unwrap()
            .checks
            .iter()
            .any(|c| c.kind == kind && c.state == State::Below)
    };
    // Over the station limit (rear row 180 kg).
    let r = with(&|l| l.stations.push(station("rear_seats", Some(200.0), 0)));
    assert!(failing(&r, LimitKind::Loading) && r.state == State::Below);
    // The station is named, in the reasons and as the limiting check.
    assert!(
        r.reasons
            .iter()
            .any(|w| w.contains("station load Rear row (rear_seats) below")),
        "{:?}",
        r.reasons
    );
    assert!(
        r.limiting
            .as_ref()
            .unwrap()
            .check
            .contains("Rear row (rear_seats)"),
        "{:?}",
        r.limiting
    );
    // More fuel than the tanks hold.
    let r = with(&|l| l.fuel_at_start_l = Some(320.0));
    assert!(failing(&r, LimitKind::Fuel) && r.state == State::Below);
    // Too little fuel for the trip and the reserve.
    let r = with(&|l| l.fuel_at_start_l = Some(60.0));
    assert!(failing(&r, LimitKind::FuelReserve) && r.state == State::Below);
    assert!(
        r.reasons.iter().any(|w| w.contains("fuel reserve")),
        "{:?}",
        r.reasons
    );
    // Heavy baggage far aft: outside the envelope (aft limit).
    let r = with(&|l| {
        l.stations
            .retain(|s| s.station != "front_seats" || s.mass_kg.is_some());
        l.stations.push(station("baggage", Some(25.0), 0));
        l.stations.push(station("rear_seats", None, 2));
    });
    assert!(
        failing(&r, LimitKind::Envelope),
        "{:?}",
        r.mass_balance.as_ref().unwrap().checks
    );
    assert_eq!(
        r.mass_balance.as_ref().unwrap().within_envelope,
        Some(false)
    );
    // Over the maximum takeoff mass.
    let r = with(&|l| l.fuel_at_start_l = Some(300.0));
    assert!(failing(&r, LimitKind::TakeoffMass) && r.state == State::Below);
    assert!(
        r.headroom.is_none(),
        "warming cannot fix an overweight aircraft"
    );
}

#[test]
fn the_afternoon_charter_is_fine_with_two_passengers_and_below_with_three() {
    let ops = ops();
    let model = Model::new(&ops, &DaySettings::default());
    let s = store(&ops, at(14, 0));
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &s,
        at: at(14, 0),
    };
    let three = leg(&ops, "L16");
    let r3 = assess(&ctx, &three, 0);
    assert_eq!(r3.state, State::Below, "{:?}", r3.reasons);
    assert!(
        r3.limiting.as_ref().unwrap().check.contains("takeoff"),
        "{:?}",
        r3.limiting
    );
    // The payload headroom says how much must come off, and from where.
    let p = r3.payload_headroom.as_ref().expect("payload headroom");
    assert!(p.kg < 0.0 && p.kg > -90.0, "{p:?}");
    let mut two = three.clone();
    two.loads
        .as_mut()
        .unwrap()
        .stations
        .retain(|s| s.station != "rear_seats");
    let r2 = assess(&ctx, &two, 0);
    assert_eq!(
        r2.state,
        State::Within,
        "{:?} {:?}",
        r2.limiting,
        r2.reasons
    );
    let p2 = r2.payload_headroom.as_ref().unwrap();
    assert!(
        p2.kg > 0.0 && p2.kg < 90.0,
        "not room for a third standard adult: {p2:?}"
    );
    // In the morning three passengers still go.
    let s8 = store(&ops, at(8, 0));
    let ctx8 = Context {
        store: &s8,
        at: at(8, 0),
        ..ctx
    };
    assert_ne!(assess(&ctx8, &three, 0).state, State::Below);
}

/// Payload headroom bound first by each of: takeoff performance, the climb, the landing
/// mass, and the aft CG limit.
#[test]
fn payload_headroom_binds_on_each_limit() {
    let ops = ops();
    let s = store(&ops, at(8, 0));
    let base = leg(&ops, "L03");
    // Just past the headroom, the failing check is the expected kind.
    let past = |model: &Model, l: &Leg| -> (f64, String, Vec<String>) {
        let ctx = Context {
            ops: &ops,
            model,
            store: &s,
            at: at(8, 0),
        };
        let r = assess(&ctx, l, 0);
        let p = r.payload_headroom.clone().expect("headroom");
        let mut more = l.clone();
        let st = p
            .station
            .split('(')
            .nth(1)
            .unwrap()
            .trim_end_matches(')')
            .to_string();
        more.loads
            .as_mut()
            .unwrap()
            .stations
            .push(station(&st, Some(p.kg + 2.0), 0));
        let r2 = assess(&ctx, &more, 0);
        (
            p.kg,
            r2.limiting.map(|l| l.check).unwrap_or_default(),
            r2.reasons,
        )
    };
    // A lighter loading far from the maximum mass, and runway figures set just above
    // what it needs now.
    let mut light = base.clone();
    {
        let l = light.loads.as_mut().unwrap();
        l.stations = vec![
            station("front_seats", Some(84.0), 0),
            station("middle_seats", None, 1),
        ];
        l.fuel_at_start_l = Some(150.0);
    }
    let model = Model::new(&ops, &DaySettings::default());
    let now = assess(
        &Context {
            ops: &ops,
            model: &model,
            store: &s,
            at: at(8, 0),
        },
        &light,
        0,
    );
    let need_m = now.departure.takeoff.as_ref().unwrap().checks[0]
        .result
        .required_m;
    let gradient = now
        .departure
        .climb
        .as_ref()
        .unwrap()
        .chain
        .gradient_ft_per_nm;
    let fi = ops.airfield_position(&base.from).unwrap();
    // 1. Takeoff performance: a runway 6 % longer than needed.
    let mut model = Model::new(&ops, &DaySettings::default());
    let first = model.fields[fi].first_end;
    for k in 0..model.fields[fi].end_count {
        model.ends[first + k].tora_m = need_m * 1.06;
        model.ends[first + k].toda_m = need_m * 1.06;
    }
    let (kg, check, _) = past(&model, &light);
    assert!(kg > 0.0 && check.contains("takeoff"), "{kg} {check}");
    // 2. The climb: an obstacle gradient 5 % under what it climbs now.
    let mut model = Model::new(&ops, &DaySettings::default());
    for k in 0..model.fields[fi].end_count {
        model.ends[first + k].required_gradient_ft_per_nm = Some(gradient / 1.05);
    }
    let (kg, check, _) = past(&model, &light);
    assert!(kg > 0.0 && check.contains("climb"), "{kg} {check}");
    // 3. The landing mass: a short hop burns little fuel, so landing mass binds before
    //    the takeoff mass (1,550 kg against 1,600 kg).
    let model = Model::new(&ops, &DaySettings::default());
    let mut hop = base.clone();
    hop.arrives_at = hop.departs_at + chrono::Duration::minutes(10);
    hop.loads.as_mut().unwrap().fuel_at_start_l = Some(120.0);
    let (_, check, reasons) = past(&model, &hop);
    assert!(check.contains("landing mass"), "{check} {reasons:?}");
    // 4. The aft CG: only the baggage area has room, and the envelope's aft limit sits
    //    15 mm behind the takeoff CG; each kilogram of baggage at 3,300 mm moves the CG
    //    aft by about 1.4 mm, so the envelope binds long before the maximum mass.
    let mut ops4 = ops.clone();
    let ty = ops4.types.iter_mut().find(|t| t.file.id == "ft6").unwrap();
    let mbt = ty.file.mass_balance.as_mut().unwrap();
    for st in mbt.stations.iter_mut().filter(|st| st.id != "baggage") {
        st.max_mass_kg = if st.id == "front_seats" {
            84.0
        } else if st.id == "middle_seats" {
            90.0
        } else {
            1.0
        };
    }
    let now_mb = leg_mass_balance(&ops, &light).unwrap();
    let aft_limit = now_mb.takeoff.cg_mm.max(now_mb.landing.cg_mm) + 15.0;
    for v in mbt.envelope.iter_mut() {
        if v.arm_mm > 1_400.0 {
            v.arm_mm = aft_limit;
        }
    }
    let model = Model::new(&ops4, &DaySettings::default());
    let ctx = Context {
        ops: &ops4,
        model: &model,
        store: &s,
        at: at(8, 0),
    };
    let r = assess(&ctx, &light, 0);
    let p = r.payload_headroom.clone().expect("headroom");
    assert!(
        p.station.contains("baggage") && p.kg > 0.0 && p.kg < 20.0,
        "{p:?}"
    );
    let mut more = light.clone();
    more.loads
        .as_mut()
        .unwrap()
        .stations
        .push(station("baggage", Some(p.kg + 2.0), 0));
    let r2 = assess(&ctx, &more, 0);
    assert_eq!(r2.state, State::Below);
    assert!(
        r2.limiting.unwrap().check.contains("CG envelope"),
        "{:?}",
        r2.reasons
    );
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    /// The margin's sign agrees with the point-in-polygon test on the demo envelope,
    /// and the limits hold the CG between them when inside.
    #[test]
    fn cg_margin_sign_agrees_with_inside(mass_kg in 960.0f64..1_600.0, cg_mm in 950.0f64..1_600.0) {
        let ops = ops();
        let env = ops.aircraft_type("ft6").unwrap().file.mass_balance.as_ref().unwrap().envelope.clone();
        let r = mass::cg_range(&env, mass_kg, cg_mm).unwrap();
        prop_assert!(r.fore_limit_mm < r.aft_limit_mm);
        if r.margin_mm.abs() > 1e-6 {
            prop_assert_eq!(r.margin_mm > 0.0, mass::inside(&env, cg_mm, mass_kg));
        }
        if r.margin_mm >= 0.0 {
            prop_assert!(r.fore_limit_mm <= cg_mm + 1e-9 && cg_mm <= r.aft_limit_mm + 1e-9);
        }
    }

    #[test]
    fn adding_load_never_lowers_takeoff_mass_or_raises_a_takeoff_margin(
        extra in 0.0f64..120.0, which in 0usize..4,
    ) {
        let ops = ops();
        let model = Model::new(&ops, &DaySettings::default());
        let s = store(&ops, at(8, 0));
        let ctx = Context { ops: &ops, model: &model, store: &s, at: at(8, 0) };
        let base = leg(&ops, "L03");
        let st = ["front_seats", "middle_seats", "rear_seats", "baggage"][which];
        let mut more = base.clone();
        more.loads.as_mut().unwrap().stations.push(station(st, Some(extra), 0));
        let a = assess(&ctx, &base, 0);
        let b = assess(&ctx, &more, 0);
        prop_assert!(b.takeoff_mass_kg.unwrap() >= a.takeoff_mass_kg.unwrap());
        if let (Some(ta), Some(tb)) = (&a.departure.takeoff, &b.departure.takeoff) {
            prop_assert!(tb.margin <= ta.margin + 1e-12);
        }
    }
}
