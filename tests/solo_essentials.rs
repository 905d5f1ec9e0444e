//! The instructor's essentials for a solo: daylight, today's runway state, the
//! student's own limits and endorsements — each a check with its source.

use chrono::{DateTime, Duration, NaiveDate, TimeZone, Utc};
use rhoboard::assess::leg::assess;
use rhoboard::assess::limits::LimitKind;
use rhoboard::assess::{Context, DaySettings, LegResult, Model, State};
use rhoboard::observation::{Store, decode};
use rhoboard::ops::runway_state::{DayCondition, EndState, RunwayStateFile};
use rhoboard::ops::{Leg, Ops, demo};

fn ops() -> Ops {
    demo::load().ops.expect("demo")
}

fn at(h: u32, m: u32) -> DateTime<Utc> {
    Utc.with_ymd_and_hms(2026, 6, 14, h, m, 0).unwrap()
}

fn leg(ops: &Ops, id: &str) -> Leg {
    ops.legs.iter().find(|l| l.id == id).cloned().unwrap()
}

fn store(reports: &[String], t: DateTime<Utc>) -> Store {
    let mut s = Store::default();
    for r in reports {
        let rep = decode(r, t);
        assert!(rep.usable_for_performance(), "{r}");
        s.insert(rep);
    }
    s
}

fn run(ops: &Ops, day: &DaySettings, reports: &[String], t: DateTime<Utc>, l: &Leg) -> LegResult {
    let model = Model::new(ops, day);
    let s = store(reports, t);
    let ctx = Context {
        ops,
        model: &model,
        store: &s,
        at: t,
    };
    assess(&ctx, l, 0)
}

fn limit(r: &LegResult, kind: LimitKind) -> Vec<&rhoboard::assess::limits::LimitCheck> {
    r.departure
        .limits
        .iter()
        .chain(&r.arrival.limits)
        .filter(|c| c.kind == kind)
        .collect()
}

fn calm(station: &str, hhmm: &str) -> String {
    format!("METAR {station} 14{hhmm}Z 00000KT 9999 FEW040 18/08 Q1016")
}

/// 14 CFR 61.87(n): a student's solo endorsement is valid for the 90 days before the
/// flight. Endorsed 90 days before the day: lapsed (yesterday was the last day).
/// Endorsed 89 days before: valid, with one day left.
#[test]
fn a_solo_endorsement_that_lapsed_yesterday() {
    let mut ops = ops();
    let l = leg(&ops, "L01");
    let day = NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    let reports = [calm("XSEA", "0600")];
    for (age, ok) in [(90, false), (89, true)] {
        let pilot = ops.pilots.iter_mut().find(|p| p.id == l.pilot).unwrap();
        pilot.endorsements.solo[0].date = day - Duration::days(age);
        let r = run(&ops, &DaySettings::default(), &reports, at(6, 30), &l);
        let e = limit(&r, LimitKind::Endorsement);
        assert_eq!(e.len(), 1);
        assert_eq!(e[0].state == State::Within, ok, "{age} days: {:?}", e[0]);
        assert!(e[0].source.contains("61.87(n)"), "{}", e[0].source);
        if !ok {
            assert_eq!(r.state, State::Below);
            assert!(e[0].note.contains("lapsed"), "{}", e[0].note);
        } else {
            assert!(e[0].note.contains("1 days left"), "{}", e[0].note);
        }
    }
}

/// The instructor's written crosswind limit (8 kt for this student) tightens the
/// category's 10 kt, and the check says where it comes from.
#[test]
fn a_crosswind_limit_written_lower_than_the_category() {
    let ops = ops();
    let l = leg(&ops, "L01");
    let category = ops.minimums(l.category).unwrap().max_crosswind_kt;
    let pilot = ops.pilot(&l.pilot).unwrap();
    let written = pilot.limitations.max_crosswind_kt.unwrap();
    assert!(written < category);
    // XSEA runs 09/27 (about 090°/270° true): a wind from 360 at 9 kt is a 9 kt crosswind.
    let r = run(
        &ops,
        &DaySettings::default(),
        &["METAR XSEA 140600Z 36009KT 9999 FEW040 18/08 Q1016".to_string()],
        at(6, 30),
        &l,
    );
    let x = limit(&r, LimitKind::Crosswind);
    let dep = x[0];
    assert_eq!(dep.limit, Some(written));
    assert_eq!(dep.source, "pilot's written limitation");
    assert_eq!(dep.state, State::Below, "{dep:?}");
    assert_eq!(r.state, State::Below);
}

/// Runway 27 closed for works until 1500Z: with a westerly wind only 09 is left, with a
/// tailwind beyond the student's 2 kt limit. After 1500Z, 27 is back.
#[test]
fn a_closed_end_leaving_only_a_tailwind_end() {
    let ops = ops();
    let l = leg(&ops, "L01");
    let mut state = RunwayStateFile::new(NaiveDate::from_ymd_opt(2026, 6, 14).unwrap());
    state.entries.push(EndState {
        airfield: "XSEA".into(),
        end: "27".into(),
        closed: Some(true),
        until: Some(at(15, 0)),
        note: "works".into(),
        ..EndState::default()
    });
    let day = DaySettings {
        state: Some(state),
        ..DaySettings::default()
    };
    let reports = ["METAR XSEA 140600Z 27006KT 9999 FEW040 18/08 Q1016".to_string()];
    let open = run(&ops, &DaySettings::default(), &reports, at(6, 30), &l);
    assert_eq!(open.departure.runway.as_deref(), Some("27"));
    assert_ne!(open.state, State::Below);
    let closed = run(&ops, &day, &reports, at(6, 30), &l);
    assert_eq!(closed.departure.runway.as_deref(), Some("09"));
    let t = limit(&closed, LimitKind::Tailwind);
    assert!(t.iter().any(|c| c.state == State::Below), "{t:?}");
    assert_eq!(closed.state, State::Below);
    let alt = closed
        .departure
        .ends
        .iter()
        .find(|e| e.designator == "27")
        .unwrap();
    assert!(!alt.usable);
    assert!(
        alt.today.as_deref().unwrap().contains("closed until 1500Z"),
        "{:?}",
        alt.today
    );
    // The same leg flown at 1600Z has 27 again.
    let mut late = l.clone();
    late.departs_at = at(16, 0).fixed_offset();
    late.arrives_at = at(16, 50).fixed_offset();
    let reports = ["METAR XSEA 141600Z 27006KT 9999 FEW040 18/08 Q1016".to_string()];
    let r = run(&ops, &day, &reports, at(16, 10), &late);
    assert_eq!(r.departure.runway.as_deref(), Some("27"));
}

/// Soft ground on the grass strip after rain: the policy's ×1.25 (UK CAA SSL 7, from
/// memory) turns a thin grass landing below.
#[test]
fn soft_grass_turns_a_thin_leg_below() {
    let ops = ops();
    let l = leg(&ops, "L02");
    let reports = [calm("XSEA", "0700"), calm("XMRS", "0700")];
    let dry = run(&ops, &DaySettings::default(), &reports, at(8, 0), &l);
    assert_eq!(dry.state, State::Thin, "{:?}", dry.limiting);
    let runway = dry.arrival.runway.clone().unwrap();
    let mut state = RunwayStateFile::new(NaiveDate::from_ymd_opt(2026, 6, 14).unwrap());
    for e in &ops.airfield("XMRS").unwrap().runway_ends {
        state.entries.push(EndState {
            airfield: "XMRS".into(),
            end: e.designator.clone(),
            condition: Some(DayCondition::SoftGround),
            note: "rain overnight".into(),
            ..EndState::default()
        });
    }
    let day = DaySettings {
        state: Some(state),
        ..DaySettings::default()
    };
    let soft = run(&ops, &day, &reports, at(8, 0), &l);
    assert_eq!(soft.state, State::Below, "{:?}", soft.reasons);
    let land = soft.arrival.landing.as_ref().unwrap();
    let rule = land.chain.surface_rule.unwrap();
    assert_eq!(
        rule.rule,
        rhoboard::ops::actype::SurfaceRule::MultiplyBy(1.25)
    );
    assert_eq!(soft.arrival.runway.as_deref(), Some(runway.as_str()));
    // Standing water: no data, never a guess.
    let mut state = day.state.clone().unwrap();
    for e in state.entries.iter_mut() {
        e.condition = Some(DayCondition::StandingWater);
    }
    let wet = run(
        &ops,
        &DaySettings {
            state: Some(state),
            ..DaySettings::default()
        },
        &reports,
        at(8, 0),
        &l,
    );
    assert_eq!(wet.state, State::NoData, "{:?}", wet.reasons);
}

/// Daylight: a student solo must depart after sunrise and be down 30 minutes before
/// sunset (the demo's category setting), from the airfield's position by the NOAA method.
#[test]
fn daylight_window_for_a_student_solo() {
    let ops = ops();
    let mut l = leg(&ops, "L01");
    let field = ops.airfield("XSEA").unwrap();
    let sun = rhoboard::daylight::daylight(
        NaiveDate::from_ymd_opt(2026, 6, 14).unwrap(),
        field.latitude_deg,
        field.longitude_deg,
    );
    let sunset = sun.sunset.time().unwrap();
    let sunrise = sun.sunrise.time().unwrap();
    // Lands 20 minutes before sunset: below (30 required).
    l.departs_at = (sunset - Duration::minutes(70)).fixed_offset();
    l.arrives_at = (sunset - Duration::minutes(20)).fixed_offset();
    let t = sunset - Duration::minutes(90);
    let hhmm = t.format("%H%M").to_string();
    let r = run(
        &ops,
        &DaySettings::default(),
        &[calm("XSEA", &hhmm)],
        t + Duration::minutes(10),
        &l,
    );
    let d: Vec<_> = limit(&r, LimitKind::Daylight);
    let arrival = d.iter().find(|c| c.note.starts_with("sunset")).unwrap();
    assert_eq!(arrival.state, State::Below, "{arrival:?}");
    assert!((arrival.margin - -10.0).abs() < 1.0, "{}", arrival.margin);
    // Departs ten minutes before sunrise: below.
    let mut early = leg(&ops, "L01");
    early.departs_at = (sunrise - Duration::minutes(10)).fixed_offset();
    early.arrives_at = (sunrise + Duration::minutes(40)).fixed_offset();
    let t = sunrise - Duration::minutes(30);
    let r = run(
        &ops,
        &DaySettings::default(),
        &[calm("XSEA", &t.format("%H%M").to_string())],
        t + Duration::minutes(5),
        &early,
    );
    let dep = limit(&r, LimitKind::Daylight)
        .into_iter()
        .find(|c| c.note.starts_with("sunrise"))
        .unwrap()
        .clone();
    assert_eq!(dep.state, State::Below, "{dep:?}");
}

/// 14 CFR 61.93: a student solo to another airfield needs the cross-country endorsement.
#[test]
fn a_cross_country_solo_needs_its_endorsement() {
    let mut ops = ops();
    let l = leg(&ops, "L08");
    assert_ne!(l.from, l.to);
    let reports = [calm(&l.from, "1030"), calm(&l.to, "1030")];
    let r = run(&ops, &DaySettings::default(), &reports, at(10, 45), &l);
    let xc: Vec<_> = limit(&r, LimitKind::Endorsement)
        .into_iter()
        .filter(|c| c.source.contains("61.93"))
        .cloned()
        .collect();
    assert_eq!(xc.len(), 1);
    assert_eq!(xc[0].state, State::Within);
    ops.pilots
        .iter_mut()
        .find(|p| p.id == l.pilot)
        .unwrap()
        .endorsements
        .cross_country
        .clear();
    let r = run(&ops, &DaySettings::default(), &reports, at(10, 45), &l);
    let xc: Vec<_> = limit(&r, LimitKind::Endorsement)
        .into_iter()
        .filter(|c| c.source.contains("61.93"))
        .cloned()
        .collect();
    assert_eq!(xc[0].state, State::Below);
    assert!(xc[0].note.contains("cross-country"), "{}", xc[0].note);
}

/// `rhoboard runway` keeps the day's state in the operator folder; `check` uses it.
#[test]
fn the_runway_command_writes_a_state_that_check_uses() {
    use std::process::Command;
    let bin = env!("CARGO_BIN_EXE_rhoboard");
    let dir = std::env::temp_dir().join(format!("rhoboard-runway-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let home = dir.join("home");
    let ops_dir = dir.join("ops");
    let cmd = |args: &[&str]| {
        let o = Command::new(bin)
            .args(args)
            .env("XDG_CONFIG_HOME", &home)
            .env("HOME", &home)
            .output()
            .unwrap();
        (
            o.status.code().unwrap(),
            String::from_utf8_lossy(&o.stdout).into_owned(),
            String::from_utf8_lossy(&o.stderr).into_owned(),
        )
    };
    let d = ops_dir.to_str().unwrap();
    assert_eq!(cmd(&["init", d]).0, 0);
    let (code, out, err) = cmd(&[
        "runway",
        "XSEA",
        "27",
        "--closed",
        "--until",
        "15:00Z",
        "--date",
        "2026-06-14",
        "--note",
        "works",
        "--ops",
        d,
    ]);
    assert_eq!(code, 0, "{err}");
    assert!(out.contains("closed until 1500Z (works)"), "{out}");
    let (code, _, err) = cmd(&[
        "runway",
        "XSEA",
        "27",
        "--condition",
        "soft",
        "--date",
        "2026-06-14",
        "--ops",
        d,
    ]);
    assert_eq!(code, 2);
    assert!(err.contains("is for grass"), "{err}");
    let (code, _, err) = cmd(&["runway", "XSEA", "99", "--closed", "--ops", d]);
    assert_eq!(code, 2);
    assert!(err.contains("has no runway end '99'"), "{err}");
    let (code, out, _) = cmd(&["validate", "--ops", d]);
    assert_eq!(code, 0, "{out}");
    let (_, out, _) = cmd(&[
        "check",
        "--ops",
        d,
        "--json",
        "--leg",
        "L01",
        "--at",
        "2026-06-14T07:30:00Z",
    ]);
    let v: serde_json::Value = serde_json::from_str(&out).unwrap();
    let dep = &v["legs"][0]["departure"];
    let alt = dep["alternatives"]
        .as_array()
        .unwrap()
        .iter()
        .find(|a| a["runway"] == "27");
    let in_use_27 = dep["runway"] == "27";
    assert!(!in_use_27, "27 is closed");
    assert_eq!(alt.unwrap()["usable"], false);
    let _ = std::fs::remove_dir_all(&dir);
}
