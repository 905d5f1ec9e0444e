//! Properties of the assessment on the demo operator's types and airfields: worse
//! conditions never improve a margin; `no-data` for an exceeded table or a stale report;
//! the runway in use is the end set for the day or else the one with the most headwind.

use chrono::{DateTime, TimeZone, Utc};
use proptest::prelude::*;
use rhoboard::assess::leg::{self, Context, Setup};
use rhoboard::assess::model::{DaySettings, Model};
use rhoboard::assess::{State, assess_leg, perf};
use rhoboard::observation::{Store, decode};
use rhoboard::ops::{Category, Ops, demo};

fn demo_ops() -> Ops {
    demo::load().ops.expect("the demo loads")
}

fn at(h: u32, m: u32) -> DateTime<Utc> {
    Utc.with_ymd_and_hms(2026, 6, 14, h, m, 0).unwrap()
}

fn store_with(reports: &[&str], reference: DateTime<Utc>) -> Store {
    let mut s = Store::default();
    for r in reports {
        let rep = decode(r, reference);
        assert!(rep.usable_for_performance(), "{r}: {:?}", rep.errors);
        s.insert(rep);
    }
    s
}

fn leg_index(ops: &Ops, id: &str) -> usize {
    ops.legs.iter().position(|l| l.id == id).expect("leg")
}

/// Conditions for one evaluation.
#[derive(Clone, Copy)]
struct Case {
    mass_kg: f64,
    qnh_hpa: f64,
    oat_c: f64,
    headwind_kt: f64,
    tora_scale: f64,
}

/// The margins of takeoff (smallest check), climb and landing of the demo trainer at
/// one field, first end, for the given conditions.
fn margins(ops: &Ops, model: &Model, field: &str, c: Case) -> Option<(f64, f64, f64)> {
    let Case {
        mass_kg,
        qnh_hpa,
        oat_c,
        headwind_kt,
        tora_scale,
    } = c;
    let end_k = 0;
    let fi = ops.airfield_position(field)?;
    let ty = &model.types[0];
    let mins = ops.minimums(Category::Solo)?;
    let mut end = model.field_ends(fi)[end_k].clone();
    end.tora_m *= tora_scale;
    end.toda_m *= tora_scale;
    end.lda_m *= tora_scale;
    let air = rhoboard::atmosphere::AirData::from_observation(
        ops.airfields[fi].elevation_ft,
        qnh_hpa,
        oat_c,
        Some(oat_c - 10.0),
    );
    let s = Setup {
        model,
        ty,
        perf: &ops.types[ty.index].performance,
        mins,
        takeoff_mass_kg: mass_kg,
        landing_mass_kg: mass_kg,
        distance_buffer: 0.1,
        climb_buffer: 0.1,
    };
    let (t, c) = leg::departure_chains(&s, &end, &air, headwind_kt).ok()?;
    let l = leg::landing_chain(&s, &end, &air, headwind_kt).ok()?;
    Some((
        perf::min_margin(&t, &end, &mins.takeoff_checks, 1.0),
        c.margin(),
        perf::min_margin(&l, &end, &mins.landing_checks, 1.0),
    ))
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn worse_conditions_never_improve_a_margin(
        field_k in 0usize..9,
        mass_frac in 0.0f64..1.0,
        qnh in 990.0f64..1_035.0,
        oat in -5.0f64..35.0,
        wind in -8.0f64..25.0,
        hotter in 0.0f64..5.0,
        heavier in 0.0f64..30.0,
        less_wind in 0.0f64..6.0,
        shorter in 0.7f64..1.0,
    ) {
        let ops = demo_ops();
        let model = Model::new(&ops, &DaySettings::default());
        let field = ops.airfields[field_k].id.clone();
        let ty = &ops.types[0].file;
        let masses = &ops.types[0].file.performance.axes.mass_kg;
        let mass = masses[0] + mass_frac * (ty.limits.max_takeoff_mass_kg - masses[0] - 30.0).max(0.0);
        let c = Case { mass_kg: mass, qnh_hpa: qnh, oat_c: oat, headwind_kt: wind, tora_scale: 1.0 };
        let base = margins(&ops, &model, &field, c);
        prop_assume!(base.is_some());
        let (t0, c0, l0) = base.unwrap();
        let worse = [
            margins(&ops, &model, &field, Case { oat_c: oat + hotter, ..c }),
            // Lower QNH: a higher pressure altitude.
            margins(&ops, &model, &field, Case { qnh_hpa: qnh - hotter, ..c }),
            margins(&ops, &model, &field, Case { mass_kg: mass + heavier, ..c }),
            margins(&ops, &model, &field, Case { headwind_kt: wind - less_wind, ..c }),
            margins(&ops, &model, &field, Case { tora_scale: shorter, ..c }),
        ];
        for (k, w) in worse.into_iter().enumerate() {
            // Outside the table is no-data, never a better answer.
            if let Some((t, c, l)) = w {
                prop_assert!(t <= t0 + 1e-9, "case {k}: takeoff {t} > {t0}");
                prop_assert!(c <= c0 + 1e-9, "case {k}: climb {c} > {c0}");
                prop_assert!(l <= l0 + 1e-9, "case {k}: landing {l} > {l0}");
            }
        }
    }
}

#[test]
fn a_report_hotter_than_the_tables_is_no_data_never_within() {
    let ops = demo_ops();
    let model = Model::new(&ops, &DaySettings::default());
    let i = leg_index(&ops, "L01");
    let leg = &ops.legs[i];
    let top = ops.types[0]
        .file
        .performance
        .axes
        .oat_c
        .last()
        .copied()
        .unwrap();
    let hot = format!(
        "METAR {} 140600Z 23004KT 9999 FEW030 {:02}/05 Q1019",
        leg.from,
        top as i32 + 3
    );
    let store = store_with(&[&hot], at(6, 30));
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &store,
        at: at(6, 30),
    };
    let r = assess_leg(&ctx, i).unwrap();
    assert_eq!(r.state, State::NoData, "{:?}", r.reasons);
    assert!(r.headroom.is_none());
    assert!(
        r.reasons
            .iter()
            .any(|w| w.contains("outside the flight-manual table")),
        "{:?}",
        r.reasons
    );
}

#[test]
fn a_stale_report_is_no_data() {
    let ops = demo_ops();
    let model = Model::new(&ops, &DaySettings::default());
    let i = leg_index(&ops, "L01");
    let leg = &ops.legs[i];
    let old = format!("METAR {} 140500Z 23004KT 9999 FEW030 12/05 Q1019", leg.from);
    // L01 departs 0700Z: the 0500Z report is 120 minutes old then (policy 75).
    let store = store_with(&[&old], at(9, 0));
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &store,
        at: at(9, 0),
    };
    let r = assess_leg(&ctx, i).unwrap();
    assert_eq!(r.state, State::NoData);
    assert!(
        r.reasons.iter().any(|w| w.contains("stale")),
        "{:?}",
        r.reasons
    );
    // A later report that came but was rejected is named with the stale one (trial
    // nit: the rejection showed only where the file was read).
    let mut with_bad = store_with(&[&old], at(9, 0));
    let bad = decode(
        &format!("METAR {} 140620Z 23004KT 9999 FEW030 1O/05 Q1019", leg.from),
        at(9, 0),
    );
    let why = bad.rejection().expect("rejected");
    with_bad.insert(bad);
    let ctx = Context {
        store: &with_bad,
        ..ctx
    };
    let r = assess_leg(&ctx, i).unwrap();
    assert_eq!(r.state, State::NoData);
    let want = format!("; the later report 140620Z was rejected: {why}");
    assert!(
        r.reasons
            .iter()
            .any(|w| w.contains("is stale") && w.ends_with(&want)),
        "{:?}",
        r.reasons
    );
    // No report at all: no-data too.
    let empty = Store::default();
    let ctx = Context {
        store: &empty,
        ..ctx
    };
    assert_eq!(assess_leg(&ctx, i).unwrap().state, State::NoData);
}

#[test]
fn reports_after_the_reference_time_do_not_exist() {
    let ops = demo_ops();
    let model = Model::new(&ops, &DaySettings::default());
    let i = leg_index(&ops, "L01");
    let from = ops.legs[i].from.clone();
    let early = format!("METAR {from} 140600Z 23004KT 9999 FEW030 12/05 Q1019");
    let late = format!("METAR {from} 140650Z 23004KT 9999 FEW030 40/05 Q1019");
    let store = store_with(&[&early, &late], at(7, 30));
    // At 0630Z the 0650Z report is unknown: the leg (0700Z) uses 0600Z "as of".
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &store,
        at: at(6, 30),
    };
    let r = assess_leg(&ctx, i).unwrap();
    let o = r.departure.observation.as_ref().unwrap();
    assert!(o.text.contains("140600Z") && o.as_of, "{}", o.text);
    // At 0730Z the departure time is past: the latest report at or before 0700Z.
    let ctx = Context {
        at: at(7, 30),
        ..ctx
    };
    let r = assess_leg(&ctx, i).unwrap();
    let o = r.departure.observation.as_ref().unwrap();
    assert!(o.text.contains("140650Z") && !o.as_of, "{}", o.text);
    assert!((o.age_min - 10.0).abs() < 1e-9);
}

#[test]
fn runway_in_use_is_the_set_end_else_the_most_headwind() {
    let ops = demo_ops();
    let i = leg_index(&ops, "L01");
    let from = ops.legs[i].from.clone();
    let field = ops.airfield(&from).unwrap();
    let ends = &field.runway_ends;
    // Wind straight down the first end: it has the most headwind.
    let wdir = ends[0].true_heading_deg.round() as i32;
    let wdir = if wdir == 0 { 360 } else { wdir };
    let rep = format!("METAR {from} 140600Z {wdir:03}10KT 9999 FEW030 12/05 Q1019");
    let store = store_with(&[&rep], at(6, 30));
    let model = Model::new(&ops, &DaySettings::default());
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &store,
        at: at(6, 30),
    };
    let r = assess_leg(&ctx, i).unwrap();
    assert_eq!(
        r.departure.runway.as_deref(),
        Some(ends[0].designator.as_str())
    );
    assert_eq!(r.departure.runway_reason, "most headwind");
    let best = r.departure.ends.iter().find(|e| e.in_use).unwrap();
    for e in &r.departure.ends {
        assert!(e.wind.headwind_kt <= best.wind.headwind_kt + 1e-9);
    }
    // Set for the day: the other end, even with a tailwind; the first end is then an
    // alternative that does better, and the reasons say so when the state differs.
    let mut day = DaySettings::default();
    day.runway_in_use
        .insert(from.clone(), ends[1].designator.clone());
    let model = Model::new(&ops, &day);
    let ctx = Context {
        model: &model,
        ..ctx
    };
    let r = assess_leg(&ctx, i).unwrap();
    assert_eq!(
        r.departure.runway.as_deref(),
        Some(ends[1].designator.as_str())
    );
    assert_eq!(r.departure.runway_reason, "set for the day");
    let alt = r.departure.ends.iter().find(|e| !e.in_use).unwrap();
    let in_use = r.departure.ends.iter().find(|e| e.in_use).unwrap();
    assert!(alt.state <= in_use.state);
    if alt.state < in_use.state {
        assert!(
            r.reasons
                .iter()
                .any(|w| w.contains(&format!("runway {} would be", alt.designator)))
        );
    }
    // Closed for the day: not usable, never chosen.
    let mut day = DaySettings::default();
    day.closed
        .insert(from.clone(), vec![ends[0].designator.clone()]);
    let model = Model::new(&ops, &day);
    let ctx = Context {
        model: &model,
        ..ctx
    };
    let r = assess_leg(&ctx, i).unwrap();
    assert_eq!(
        r.departure.runway.as_deref(),
        Some(ends[1].designator.as_str())
    );
}

#[test]
fn warming_never_improves_the_state_and_headroom_only_shrinks() {
    let ops = demo_ops();
    let model = Model::new(&ops, &DaySettings::default());
    for id in ["L03", "L09", "L14"] {
        let i = leg_index(&ops, id);
        let leg = &ops.legs[i];
        let mut last: Option<(State, f64)> = None;
        for t in [10, 15, 20, 25, 30, 35] {
            let mk = |st: &str| format!("METAR {st} 140600Z 27008KT 9999 FEW050 {t:02}/05 Q1015");
            let (a, b) = (mk(&leg.from), mk(&leg.to));
            let store = store_with(&[&a, &b], at(6, 10));
            let ctx = Context {
                ops: &ops,
                model: &model,
                store: &store,
                at: at(6, 10),
            };
            let r = assess_leg(&ctx, i).unwrap();
            if let Some((s0, h0)) = last {
                assert!(
                    r.state >= s0 || r.state == State::NoData,
                    "{id} at {t} C: {:?} after {s0:?}",
                    r.state
                );
                if let Some(h) = r.headroom {
                    assert!(
                        h.warming_c <= h0 + 0.11,
                        "{id} at {t} C: headroom {} after {h0}",
                        h.warming_c
                    );
                }
            }
            if let Some(h) = r.headroom {
                // A leg with headroom left is not below; a negative headroom is below.
                assert_eq!(
                    h.warming_c < 0.0,
                    r.state == State::Below,
                    "{id} at {t} C: {h:?} {:?}",
                    r.state
                );
                last = Some((r.state, h.warming_c));
            }
        }
    }
}

/// A METAR for `station` at 0600Z with the temperature in tenths (remark T group).
fn metar_tenths(station: &str, t_c: f64, wind: &str) -> String {
    let tenths = (t_c * 10.0).round() as i64;
    let sign = if tenths < 0 { 1 } else { 0 };
    let whole = (t_c.round() as i64).max(0);
    format!(
        "METAR {station} 140600Z {wind} 9999 FEW050 {whole:02}/02 Q1013 RMK T{sign}{:03}0020",
        tenths.abs()
    )
}

/// Headroom, then the state just past it: below, limited by the check named.
fn binding_check(ops: &Ops, model: &Model, id: &str, wind: &str) -> String {
    let i = leg_index(ops, id);
    let leg = &ops.legs[i];
    let base = 10.0;
    let mk = |t: f64| {
        let a = metar_tenths(&leg.from, t, wind);
        let b = metar_tenths(&leg.to, t, wind);
        store_with(&[&a, &b], at(6, 10))
    };
    let store = mk(base);
    let ctx = Context {
        ops,
        model,
        store: &store,
        at: at(6, 10),
    };
    let r = assess_leg(&ctx, i).unwrap();
    let h = r.headroom.expect("headroom");
    assert!(!h.table_ends && h.warming_c > 0.0, "{id}: {h:?}");
    // Just inside: not below. Just past: below, and the limiting check says why.
    let inside = mk(base + h.warming_c - 0.1);
    let r_in = assess_leg(
        &Context {
            store: &inside,
            ..ctx
        },
        i,
    )
    .unwrap();
    assert_ne!(r_in.state, State::Below, "{id} at +{} C", h.warming_c - 0.1);
    let past = mk(base + h.warming_c + 0.3);
    let r_past = assess_leg(
        &Context {
            store: &past,
            ..ctx
        },
        i,
    )
    .unwrap();
    assert_eq!(
        r_past.state,
        State::Below,
        "{id} at +{} C",
        h.warming_c + 0.3
    );
    r_past.limiting.expect("limiting").check
}

#[test]
fn headroom_where_the_climb_limits_first() {
    let ops = demo_ops();
    let mut model = Model::new(&ops, &DaySettings::default());
    let i = leg_index(&ops, "L04");
    let fi = ops.airfield_position(&ops.legs[i].from).unwrap();
    // Give every end of the departure field a steep obstacle gradient.
    let first = model.fields[fi].first_end;
    for k in 0..model.fields[fi].end_count {
        model.ends[first + k].required_gradient_ft_per_nm = Some(640.0);
    }
    let check = binding_check(&ops, &model, "L04", "00000KT");
    assert!(check.contains("climb gradient"), "{check}");
}

#[test]
fn headroom_where_the_landing_limits_first() {
    let ops = demo_ops();
    let i = leg_index(&ops, "L04");
    let leg = &ops.legs[i];
    // What the landing needs at 10 °C, calm; then a destination with 3 % more than that.
    let model = Model::new(&ops, &DaySettings::default());
    let a = metar_tenths(&leg.from, 10.0, "00000KT");
    let b = metar_tenths(&leg.to, 10.0, "00000KT");
    let store = store_with(&[&a, &b], at(6, 10));
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &store,
        at: at(6, 10),
    };
    let r = assess_leg(&ctx, i).unwrap();
    let need = r.arrival.landing.as_ref().unwrap().checks[0]
        .result
        .required_m;
    let mut model = Model::new(&ops, &DaySettings::default());
    let fi = ops.airfield_position(&leg.to).unwrap();
    let first = model.fields[fi].first_end;
    for k in 0..model.fields[fi].end_count {
        model.ends[first + k].lda_m = need * 1.03;
    }
    let check = binding_check(&ops, &model, "L04", "00000KT");
    assert!(check.contains("landing"), "{check}");
}

#[test]
fn a_pairing_opens_to_its_chain_with_the_same_state() {
    let ops = demo_ops();
    let model = Model::new(&ops, &DaySettings::default());
    let texts: Vec<String> = ops.observations.iter().map(|(_, t)| t.clone()).collect();
    let mut store = Store::default();
    for t in &texts {
        for r in rhoboard::observation::decode_all(t, at(14, 0)) {
            store.insert(r.report);
        }
    }
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &store,
        at: at(14, 0),
    };
    let m = rhoboard::assess::pairing::matrix(&ctx);
    let mut compared = 0;
    let mut mismatches = Vec::new();
    for ai in 0..m.aircraft.len() {
        for fi in 0..m.fields {
            let cell = m.cell(ai, fi);
            let r = m.open(&ctx, ai, fi).unwrap();
            // The chain shows the numbers behind the cell: same runway in use, and its
            // takeoff and landing checks are present whenever the cell has data.
            if cell.state != State::NoData {
                assert!(r.departure.takeoff.is_some() || !r.departure.gaps.is_empty());
                let k = cell.end_in_use.unwrap() as usize;
                assert_eq!(
                    r.departure.runway.as_deref(),
                    Some(ops.airfields[fi].runway_ends[k].designator.as_str())
                );
                if r.state != cell.state {
                    mismatches.push(format!(
                        "{} {}: cell {:?} chain {:?} {:?}",
                        ai, ops.airfields[fi].id, cell.state, r.state, r.limiting
                    ));
                }
                compared += 1;
            }
        }
    }
    assert!(compared > 20);
    assert!(mismatches.is_empty(), "{mismatches:#?}");
}

proptest::proptest! {
    #![proptest_config(proptest::prelude::ProptestConfig::with_cases(128))]

    /// Night as 14 CFR 1.1 defines it (from memory): a leg on 2026-06-14 at Greenwich is
    /// free of night exactly when it lies between that day's beginning of morning and
    /// end of evening civil twilight (NOAA method, itself checked against ephem in
    /// tests/daylight.rs); otherwise the night found is inside the leg and outside it.
    #[test]
    fn night_is_outside_the_civil_twilight_day(start_min in 0i64..1_440, len_min in 5i64..240) {
        use chrono::{Duration, NaiveDate, TimeZone, Utc};
        let mut field = rhoboard::ops::demo::load().ops.unwrap().airfields[0].clone();
        field.latitude_deg = 51.4769;
        field.longitude_deg = -0.0005;
        let day = NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
        let sun = rhoboard::daylight::daylight(day, field.latitude_deg, field.longitude_deg);
        let (dawn, dusk) = (sun.civil_dawn.time().unwrap(), sun.civil_dusk.time().unwrap());
        let from = Utc.with_ymd_and_hms(2026, 6, 14, 0, 0, 0).unwrap() + Duration::minutes(start_min);
        let to = from + Duration::minutes(len_min);
        let night = rhoboard::assess::limits::night_during(&field, from, to);
        proptest::prop_assert_eq!(night.is_none(), from >= dawn && to <= dusk, "{:?}", night);
        if let Some(n) = night {
            proptest::prop_assert!(n.from >= from && n.from <= to && n.to <= to && n.from <= n.to);
            proptest::prop_assert!(n.from < dawn || n.from > dusk);
        }
    }
}

/// With no ceiling reported there is nothing to measure, but the category's minimum
/// still shows, in feet (the demo's own minimums file gives the figure).
#[test]
fn no_ceiling_reported_still_shows_the_limit_and_its_unit() {
    let ops = demo_ops();
    let i = leg_index(&ops, "L01");
    let leg = &ops.legs[i];
    let from = leg.from.clone();
    let rep = format!("METAR {from} 140600Z 00000KT 9999 SKC 12/05 Q1019");
    let store = store_with(&[&rep], at(6, 30));
    let model = Model::new(&ops, &DaySettings::default());
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &store,
        at: at(6, 30),
    };
    let r = assess_leg(&ctx, i).unwrap();
    let c = r
        .departure
        .limits
        .iter()
        .find(|l| l.kind == rhoboard::assess::limits::LimitKind::Ceiling)
        .expect("a ceiling row");
    let want = ops.minimums(leg.category).unwrap().min_ceiling_ft;
    assert_eq!(c.value, None);
    assert_eq!(c.unit, "ft");
    assert_eq!(c.note, "no ceiling reported");
    // The pilot's own limit may be tighter; never looser than the category's.
    assert!(
        c.limit.is_some_and(|l| l >= want),
        "{:?} vs {want}",
        c.limit
    );
    assert_eq!(c.state, State::Within);
}

/// The demo day's reports as `check` reads them (each day file against its own date).
fn demo_day_store(ops: &Ops) -> Store {
    let stale = chrono::TimeDelta::seconds((ops.operator.policy.stale_after_min * 60.0) as i64);
    let mut s = Store::new(stale);
    for (file, text) in ops
        .observations
        .iter()
        .filter(|(f, _)| f.starts_with("observations/"))
    {
        for r in rhoboard::observation::decode_all(text, at(12, 0)) {
            let _ = s.insert(r.report);
        }
        assert!(file.contains("2026-06-14"), "a demo day file: {file}");
    }
    s
}

/// `Limiting::at` is a stable reference: at every hour of the demo day, for every leg,
/// the check it points to is the one `Limiting::check` names (the same airfield, runway
/// and rule or limit label), its margin is that check's margin as shown (a limit row's
/// `LimitCheck::margin_text`, whole percent rounded down for a distance or climb), and
/// a check with no margin in numbers says `—`, never a state word.
#[test]
fn the_limiting_reference_points_at_the_check_it_names() {
    use rhoboard::assess::leg::{LimitingAt, NO_MARGIN, percent_text};
    let ops = demo_ops();
    let model = Model::new(&ops, &DaySettings::default());
    let store = demo_day_store(&ops);
    let (mut limits, mut distances, mut hard) = (0, 0, 0);
    for h in 6..=18 {
        let ctx = Context {
            ops: &ops,
            model: &model,
            store: &store,
            at: at(h, 0),
        };
        for i in 0..ops.legs.len() {
            let r = assess_leg(&ctx, i).unwrap();
            let Some(l) = &r.limiting else { continue };
            let side = r.limiting_side().expect("a side");
            let place = format!("{} {}", side.airfield, side.runway.as_deref().unwrap_or(""));
            let (name, margin) = match l.at {
                LimitingAt::Takeoff(k) => {
                    let c = &side.takeoff.as_ref().unwrap().checks[k];
                    distances += 1;
                    (
                        format!("{place} takeoff {}", c.rule),
                        percent_text(c.result.margin),
                    )
                }
                LimitingAt::Landing(k) => {
                    let c = &side.landing.as_ref().unwrap().checks[k];
                    distances += 1;
                    (
                        format!("{place} landing {}", c.rule),
                        percent_text(c.result.margin),
                    )
                }
                LimitingAt::Climb => {
                    let c = side.climb.as_ref().unwrap();
                    let name = match c.chain.gradient_margin {
                        Some(g) if g < c.chain.rate_margin => "climb gradient",
                        _ => "climb rate",
                    };
                    (format!("{place} {name}"), percent_text(c.chain.margin()))
                }
                LimitingAt::NoRunway { .. } => (
                    format!("{}: no usable runway end", side.airfield),
                    NO_MARGIN.to_string(),
                ),
                LimitingAt::Limit { .. } => {
                    let c = r.limiting_check().expect("the limit row");
                    let m = c.margin_text();
                    if m.is_none() {
                        hard += 1;
                    } else {
                        limits += 1;
                    }
                    (
                        format!("{} {}", side.airfield, c.label()),
                        m.unwrap_or_else(|| NO_MARGIN.to_string()),
                    )
                }
            };
            assert_eq!(l.check, name, "{h}Z {}", r.id);
            assert_eq!(l.margin, margin, "{h}Z {} {}", r.id, l.check);
            assert!(
                !["below", "thin", "within", "no-data"].contains(&l.margin.as_str()),
                "{h}Z {}: {}",
                r.id,
                l.margin
            );
            assert_eq!(l.has_margin(), l.margin_words().is_some());
            // The change list and the look-ahead phrase: the check, then a number or
            // nothing, never a dash or a state word.
            let words = l.words();
            assert!(words.starts_with(&l.check), "{words}");
            assert!(
                !words.ends_with(NO_MARGIN) && !words.ends_with("below"),
                "{words}"
            );
        }
    }
    // The demo day has all three kinds: L08's lapsed endorsement is the hard limit.
    assert!(
        limits > 10 && distances > 10 && hard > 0,
        "{limits} {distances} {hard}"
    );
}
