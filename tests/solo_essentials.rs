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
    // Not "most headwind": the wind did not choose 09 (trial finding).
    assert_eq!(
        closed.departure.runway_reason,
        "the only usable end: 27 is closed"
    );
    assert_eq!(open.departure.runway_reason, "most headwind");
    // And it is among the reasons the leg is below (check's "Why:").
    assert!(
        closed
            .reasons
            .iter()
            .any(|r| r == "departure XSEA: runway 09 in use, the only usable end: 27 is closed"),
        "{:?}",
        closed.reasons
    );
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
    let dir = std::env::temp_dir().join(format!("rhoboard-runway-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let home = dir.join("home");
    let ops_dir = dir.join("ops");
    let cmd = |args: &[&str]| rhoboard_in(&home, args);
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
    assert!(
        err.contains("with no --from, this closure holds from the start of 2026-06-14 until 1500Z"),
        "{err}"
    );
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
    assert!(
        err.contains("--condition 'soft' (soft ground) is for grass"),
        "{err}"
    );
    // A change's start: before a closure's end, and on the state's day.
    for (args, said) in [
        (
            &["--closed", "--from", "16:00Z", "--until", "15:00Z"][..],
            "--from 1600Z is not before --until 1500Z",
        ),
        (
            &["--closed", "--from", "2026-06-15T01:00:00Z"][..],
            "--from 2026-06-15 0100Z is not on 2026-06-14",
        ),
    ] {
        let mut all = vec!["runway", "XSEA", "09"];
        all.extend_from_slice(args);
        all.extend_from_slice(&["--date", "2026-06-14", "--ops", d]);
        let (code, _, err) = cmd(&all);
        assert_eq!(code, 2, "{args:?}");
        assert!(err.contains(said), "{args:?}: {err}");
    }
    let (code, _, err) = cmd(&["runway", "XSEA", "99", "--closed", "--ops", d]);
    assert_eq!(code, 2);
    assert!(err.contains("has no runway end '99'"), "{err}");
    // Without --date the state is today's: a folder whose legs are on another day is
    // told so (trial finding: a closure silently missed the folder's day).
    let (code, out, err) = cmd(&["runway", "XSEA", "09", "--ops", d]);
    assert_eq!(code, 0, "{err}");
    assert!(out.contains("as declared"), "{out}");
    if chrono::Utc::now().date_naive().to_string() != "2026-06-14" {
        assert!(
            err.contains(
                "this folder has no legs that day. Its legs are on 2026-06-14: --date 2026-06-14"
            ),
            "{err}"
        );
    }
    // An end's state is shown through the day, as the assessment reads it at each
    // time (trial finding: the merged state alone read "closed 1300Z–1500Z" while the
    // day-long closure still held before 1300Z), and opening an end that is not
    // closed (the wrong end) saves nothing.
    let on_day = |args: &[&str]| {
        let mut all = vec!["runway", "XMRS", "22"];
        all.extend_from_slice(args);
        all.extend_from_slice(&["--date", "2026-06-14", "--ops", d]);
        cmd(&all)
    };
    let (code, _, err) = on_day(&["--condition", "wet", "--from", "13:00Z"]);
    assert_eq!(code, 0, "{err}");
    let (code, out, err) = on_day(&["--in-use"]);
    assert_eq!(code, 0, "{err}");
    assert!(
        out.ends_with(
            "XMRS 22 on 2026-06-14, through the day:\n  from the day's start: in use\n  from 1300Z: wet; in use\n"
        ),
        "{out}"
    );
    assert!(
        err.contains("with no --from, this holds for the whole of 2026-06-14"),
        "{err}"
    );
    let (code, out, err) = on_day(&["--open", "--from", "14:00Z"]);
    assert_eq!(code, 2, "{out}");
    assert!(
        err.contains(
            "XMRS 22 is not closed at 1400Z, so there is nothing to open; nothing was saved"
        ),
        "{err}"
    );
    let (code, _, err) = cmd(&[
        "runway",
        "XSEA",
        "09",
        "--open",
        "--date",
        "2026-06-14",
        "--ops",
        d,
    ]);
    assert_eq!(code, 2);
    assert!(err.contains("(closed that day: 27)"), "{err}");
    // A closure with no start says it holds from the day's start; one with a start
    // after it shows both, each from when it holds.
    let (code, out, err) = cmd(&[
        "runway",
        "XSEA",
        "27",
        "--closed",
        "--from",
        "13:00Z",
        "--until",
        "15:00Z",
        "--date",
        "2026-06-14",
        "--ops",
        d,
    ]);
    assert_eq!(code, 0, "{err}");
    assert!(
        out.ends_with(
            "XSEA 27 on 2026-06-14, through the day:\n  from the day's start: closed until 1500Z (works)\n  from 1300Z: closed 1300Z–1500Z\n  from 1500Z: as declared\n"
        ),
        "{out}"
    );
    assert!(
        err.contains("XSEA 27 already has a closure that day (closed until 1500Z (works)); this one is written after it"),
        "{err}"
    );
    let (code, _, err) = cmd(&[
        "runway",
        "XSEA",
        "27",
        "--open",
        "--from",
        "15:00Z",
        "--date",
        "2026-06-14",
        "--ops",
        d,
    ]);
    assert_eq!(code, 2, "closed until 1500Z: open again at 1500Z");
    assert!(err.contains("XSEA 27 is not closed at 1500Z"), "{err}");
    let (code, _, err) = cmd(&[
        "runway",
        "XSEA",
        "27",
        "--open",
        "--from",
        "14:30Z",
        "--date",
        "2026-06-14",
        "--ops",
        d,
    ]);
    assert_eq!(code, 0, "{err}");
    // An opening before a closure that starts later would cancel it unseen (trial
    // finding): refused, naming the closure's start; from its start on, it ends it.
    let (code, _, err) = cmd(&[
        "runway",
        "XKNL",
        "14",
        "--closed",
        "--from",
        "10:00Z",
        "--note",
        "works",
        "--date",
        "2026-06-14",
        "--ops",
        d,
    ]);
    assert_eq!(code, 0, "{err}");
    let (code, _, err) = cmd(&[
        "runway",
        "XKNL",
        "14",
        "--open",
        "--from",
        "09:00Z",
        "--date",
        "2026-06-14",
        "--ops",
        d,
    ]);
    assert_eq!(code, 2);
    assert!(
        err.contains("XKNL 14 is not closed at 0900Z: its closure starts at 1000Z, and opening it earlier would cancel that closure; to end the closure, open it from 1000Z or later (--from 10:00Z); nothing was saved"),
        "{err}"
    );
    let (code, out, err) = cmd(&[
        "runway",
        "XKNL",
        "14",
        "--open",
        "--from",
        "12:00Z",
        "--date",
        "2026-06-14",
        "--ops",
        d,
    ]);
    assert_eq!(code, 0, "{err}");
    assert!(
        out.ends_with("  from the day's start: as declared\n  from 1000Z: closed from 1000Z (works)\n  from 1200Z: open\n"),
        "{out}"
    );
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

/// Greenwich on 2026-06-14 from fixtures/reference/daylight.json (PyPI `ephem` 4.2.1):
/// morning civil twilight begins 02:55:10Z, evening civil twilight ends 21:05:44Z.
fn xsea_at_greenwich(ops: &mut Ops) {
    let f = ops.airfields.iter_mut().find(|a| a.id == "XSEA").unwrap();
    f.latitude_deg = 51.4769;
    f.longitude_deg = -0.0005;
    // The night rule on its own: the category's daylight-only window is another check.
    let m = ops
        .operator
        .categories
        .get_mut(&rhoboard::ops::Category::StudentSolo)
        .unwrap();
    m.daylight_only = false;
}

/// The `HHMMZ` after `label` in `text` is within two minutes of `want` (the tolerance
/// of tests/daylight.rs against ephem), on the date of `want`.
fn near(text: &str, label: &str, want: DateTime<Utc>) {
    let i = text
        .find(label)
        .unwrap_or_else(|| panic!("{label:?} not in {text}"));
    let hhmm = &text[i + label.len()..i + label.len() + 4];
    let (h, m) = (hhmm[..2].parse().unwrap(), hhmm[2..].parse().unwrap());
    let got = want.date_naive().and_hms_opt(h, m, 0).unwrap().and_utc();
    let off = (got - want).num_seconds().abs();
    assert!(
        off <= 120,
        "{label}{hhmm}Z is {off} s from {want} in {text}"
    );
}

fn night_checks(r: &LegResult) -> Vec<rhoboard::assess::limits::LimitCheck> {
    limit(r, LimitKind::Endorsement)
        .into_iter()
        .filter(|c| c.source.contains("61.87(o)"))
        .cloned()
        .collect()
}

/// Night is the time between the end of evening civil twilight and the beginning of
/// morning civil twilight (14 CFR 1.1, from memory); a student solo in night needs the
/// night solo endorsement (14 CFR 61.87(o), from memory). Circuits departing 20:40Z and
/// landing 21:30Z run past the end of civil twilight at 21:05:44Z (ephem): below, the
/// reason naming the pilot, the endorsement and the times. Landing 21:00Z: no night, no
/// check at all. With a night endorsement for the type: within.
#[test]
fn a_student_solo_into_the_night_needs_the_night_endorsement() {
    let mut ops = ops();
    xsea_at_greenwich(&mut ops);
    let mut l = leg(&ops, "L01");
    l.departs_at = at(20, 40).fixed_offset();
    l.arrives_at = at(21, 30).fixed_offset();
    let reports = [calm("XSEA", "2030")];
    let r = run(&ops, &DaySettings::default(), &reports, at(20, 35), &l);
    let n = night_checks(&r);
    assert_eq!(n.len(), 1, "{:?}", limit(&r, LimitKind::Endorsement));
    assert_eq!(n[0].state, State::Below);
    assert_eq!(r.state, State::Below);
    assert!(r.headroom.is_none(), "no warming fixes an endorsement");
    let pilot = ops.pilot(&l.pilot).unwrap();
    let reason = r
        .reasons
        .iter()
        .find(|w| w.contains("night solo endorsement"))
        .unwrap_or_else(|| panic!("{:?}", r.reasons));
    for want in [
        pilot.name.as_str(),
        "no night solo endorsement for type ft2",
        "2040Z–2130Z",
        "to 2130Z",
    ] {
        assert!(reason.contains(want), "{want:?} not in {reason}");
    }
    near(
        reason,
        "in night at XSEA from ",
        at(21, 5) + Duration::seconds(44),
    );
    near(
        reason,
        "end of evening civil twilight ",
        at(21, 5) + Duration::seconds(44),
    );
    // Down at 21:00Z, before the end of civil twilight: no night check.
    l.arrives_at = at(21, 0).fixed_offset();
    let r = run(&ops, &DaySettings::default(), &reports, at(20, 35), &l);
    assert!(night_checks(&r).is_empty());
    assert_ne!(r.state, State::Below, "{:?}", r.reasons);
    // Endorsed for night on the type a month ago: the check passes and says so.
    l.arrives_at = at(21, 30).fixed_offset();
    let date = NaiveDate::from_ymd_opt(2026, 5, 14).unwrap();
    ops.pilots
        .iter_mut()
        .find(|p| p.id == l.pilot)
        .unwrap()
        .endorsements
        .night
        .push(rhoboard::ops::pilots::Endorsement {
            type_id: "ft2".into(),
            date,
            instructor: "ins-mara".into(),
        });
    let r = run(&ops, &DaySettings::default(), &reports, at(20, 35), &l);
    let n = night_checks(&r);
    assert_eq!(n[0].state, State::Within, "{:?}", n[0]);
    assert!(n[0].note.contains("of 2026-05-14"), "{}", n[0].note);
    assert_ne!(r.state, State::Below, "{:?}", r.reasons);
}

/// A departure before morning civil twilight (02:55:10Z at Greenwich, ephem) is in
/// night from its start; a night endorsement older than the category's 90 days (the
/// same validity as 14 CFR 61.87(o)(3), from memory) has lapsed; one for another type
/// does not count.
#[test]
fn a_dawn_solo_and_a_lapsed_or_wrong_type_night_endorsement() {
    let mut ops = ops();
    xsea_at_greenwich(&mut ops);
    let mut l = leg(&ops, "L01");
    l.departs_at = at(2, 30).fixed_offset();
    l.arrives_at = at(3, 20).fixed_offset();
    let reports = [calm("XSEA", "0220")];
    let pilot = ops.pilots.iter_mut().find(|p| p.id == l.pilot).unwrap();
    let day = NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    pilot.endorsements.night = vec![
        rhoboard::ops::pilots::Endorsement {
            type_id: "ft2".into(),
            date: day - Duration::days(90),
            instructor: String::new(),
        },
        rhoboard::ops::pilots::Endorsement {
            type_id: "ft4".into(),
            date: day - Duration::days(3),
            instructor: String::new(),
        },
    ];
    let r = run(&ops, &DaySettings::default(), &reports, at(2, 25), &l);
    let n = night_checks(&r);
    assert_eq!(n[0].state, State::Below, "{:?}", n[0]);
    for want in [
        "has lapsed (90-day validity)",
        "in night at XSEA from 0230Z to ",
    ] {
        assert!(n[0].note.contains(want), "{want:?} not in {}", n[0].note);
    }
    let dawn = at(2, 55) + Duration::seconds(10);
    near(&n[0].note, "in night at XSEA from 0230Z to ", dawn);
    near(&n[0].note, "beginning of morning civil twilight ", dawn);
    // 89 days: still valid.
    ops.pilots
        .iter_mut()
        .find(|p| p.id == l.pilot)
        .unwrap()
        .endorsements
        .night[0]
        .date = day - Duration::days(89);
    let r = run(&ops, &DaySettings::default(), &reports, at(2, 25), &l);
    assert_eq!(night_checks(&r)[0].state, State::Within);
    // Only student solos: the same times flown dual need no endorsement.
    let mut dual = l.clone();
    dual.category = rhoboard::ops::Category::Dual;
    let r = run(&ops, &DaySettings::default(), &reports, at(2, 25), &dual);
    assert!(night_checks(&r).is_empty());
}

/// `validate` names the file, line, column and field of a night endorsement for a type
/// the fleet does not have, and accepts one for a known type.
#[test]
fn validate_points_at_a_night_endorsement_for_an_unknown_type() {
    let dir = std::env::temp_dir().join(format!("rhoboard-night-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    let home = dir.join("home");
    let ops_dir = dir.join("ops");
    let cmd = |args: &[&str]| {
        let (code, out, _) = rhoboard_in(&home, args);
        (code, out)
    };
    let d = ops_dir.to_str().unwrap();
    assert_eq!(cmd(&["init", d]).0, 0);
    let path = ops_dir.join("pilots.json");
    let text = std::fs::read_to_string(&path).unwrap();
    let mut v: serde_json::Value = serde_json::from_str(&text).unwrap();
    v["pilots"][0]["endorsements"]["night"] =
        serde_json::json!([{"type_id": "ft2", "date": "2026-05-20", "instructor": "ins-mara"}]);
    std::fs::write(&path, serde_json::to_string_pretty(&v).unwrap()).unwrap();
    let (_, out) = cmd(&["validate", "--ops", d]);
    assert!(!out.contains("endorsements.night"), "{out}");
    v["pilots"][0]["endorsements"]["night"][0]["type_id"] = "zz9".into();
    let pretty = serde_json::to_string_pretty(&v).unwrap();
    std::fs::write(&path, &pretty).unwrap();
    let line = pretty.lines().position(|l| l.contains("\"zz9\"")).unwrap() + 1;
    let (code, out) = cmd(&["validate", "--ops", d]);
    assert_eq!(code, 2, "{out}");
    let want = format!("pilots.json:{line}:");
    let hit = out
        .lines()
        .find(|l| l.contains("pilots[0].endorsements.night[0].type_id"))
        .unwrap_or_else(|| panic!("{out}"));
    assert!(
        hit.contains(&want) && hit.contains("unknown aircraft type 'zz9'"),
        "{hit}"
    );
    let _ = std::fs::remove_dir_all(&dir);
}

/// With no report at the departure the leg's weather cannot be assessed, but the
/// night endorsement can: below (which outranks no-data), not no-data.
#[test]
fn a_night_solo_without_a_report_is_still_below_for_the_endorsement() {
    let mut ops = ops();
    xsea_at_greenwich(&mut ops);
    let mut l = leg(&ops, "L01");
    l.departs_at = at(21, 30).fixed_offset();
    l.arrives_at = at(22, 20).fixed_offset();
    let r = run(&ops, &DaySettings::default(), &[], at(21, 25), &l);
    assert_eq!(night_checks(&r).len(), 1);
    assert_eq!(r.state, State::Below, "{:?}", r.reasons);
    assert!(r.reasons.iter().any(|w| w.contains("no usable report")));
    assert!(
        r.reasons
            .iter()
            .any(|w| w.contains("night solo endorsement"))
    );
}

/// Runs the binary with `home` as its home, config and data folder: (exit code, stdout,
/// stderr).
fn rhoboard_in(home: &std::path::Path, args: &[&str]) -> (i32, String, String) {
    let o = std::process::Command::new(env!("CARGO_BIN_EXE_rhoboard"))
        .args(args)
        .env("XDG_CONFIG_HOME", home)
        .env("HOME", home)
        .env("RHOBOARD_DATA_DIR", home)
        .output()
        .unwrap();
    (
        o.status.code().unwrap(),
        String::from_utf8_lossy(&o.stdout).into_owned(),
        String::from_utf8_lossy(&o.stderr).into_owned(),
    )
}

/// A closure with a start (`from`, set by `rhoboard runway --from` or the board's
/// clock) keeps the end for the legs before it and takes it from the legs after.
#[test]
fn a_closure_from_a_time_keeps_the_end_for_the_legs_before_it() {
    let ops = rhoboard::ops::demo::load().ops.unwrap();
    let l = ops.legs.iter().find(|l| l.id == "L01").unwrap().clone();
    let date = chrono::NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    let mut state = RunwayStateFile::new(date);
    state.entries.push(EndState {
        airfield: "XSEA".into(),
        end: "27".into(),
        closed: Some(true),
        from: Some(at(12, 0)),
        ..EndState::default()
    });
    let mut with = ops.clone();
    with.runway_states.push(state);
    let day = DaySettings::for_date(&with, date);
    let reports = ["METAR XSEA 140600Z 27006KT 9999 FEW040 18/08 Q1016".to_string()];
    let early = run(&with, &day, &reports, at(6, 30), &l);
    assert_eq!(
        early.departure.runway.as_deref(),
        Some("27"),
        "before 1200Z: open"
    );
    let mut late = l.clone();
    late.departs_at = at(13, 0).fixed_offset();
    late.arrives_at = at(13, 50).fixed_offset();
    let reports = ["METAR XSEA 141300Z 27006KT 9999 FEW040 18/08 Q1016".to_string()];
    let r = run(&with, &day, &reports, at(13, 10), &late);
    assert_eq!(
        r.departure.runway.as_deref(),
        Some("09"),
        "from 1200Z: closed"
    );
}

/// Any change made during the day holds from its start (`from`): wet grass set at 12Z
/// leaves the morning's legs on the dry runway they flew from, and the afternoon's get
/// the wet factor; with no start it holds for the whole day.
#[test]
fn a_change_made_during_the_day_holds_from_its_start() {
    let ops = rhoboard::ops::demo::load().ops.unwrap();
    let date = NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    let surface = |from: Option<DateTime<Utc>>, t: DateTime<Utc>| {
        let mut state = RunwayStateFile::new(date);
        state.entries.push(EndState {
            airfield: "XMRS".into(),
            end: "22".into(),
            condition: Some(DayCondition::Wet),
            from,
            ..EndState::default()
        });
        let mut with = ops.clone();
        with.runway_states.push(state);
        let model = Model::new(&with, &DaySettings::for_date(&with, date));
        let fi = with.airfields.iter().position(|a| a.id == "XMRS").unwrap();
        let k = with.airfields[fi]
            .runway_ends
            .iter()
            .position(|e| e.designator == "22")
            .unwrap();
        model.field_ends_at(fi, t)[k].day_note.clone()
    };
    assert_eq!(
        surface(Some(at(12, 0)), at(8, 0)),
        None,
        "before 12Z: as declared"
    );
    assert_eq!(surface(Some(at(12, 0)), at(13, 0)).as_deref(), Some("wet"));
    assert_eq!(
        surface(None, at(8, 0)).as_deref(),
        Some("wet"),
        "no start: all day"
    );
}

/// An end's state in words is never empty (trial finding: "today:" with nothing after
/// it, and `runway_today: ""` in the JSON, for an end set in use or opened again), and
/// an end opened again from 14Z with wet set in the same entry is wet from 14Z only.
#[test]
fn an_ends_state_in_words_is_never_empty() {
    let ops = rhoboard::ops::demo::load().ops.unwrap();
    let date = NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    let mut state = RunwayStateFile::new(date);
    let entry = |end: &str| EndState {
        airfield: "XSEA".into(),
        end: end.into(),
        ..EndState::default()
    };
    state.entries.push(EndState {
        in_use: Some(true),
        ..entry("09")
    });
    state.entries.push(EndState {
        closed: Some(true),
        from: Some(at(12, 0)),
        ..entry("27")
    });
    state.entries.push(EndState {
        closed: Some(false),
        from: Some(at(14, 0)),
        condition: Some(DayCondition::Wet),
        ..entry("27")
    });
    let mut with = ops.clone();
    with.runway_states.push(state);
    let model = Model::new(&with, &DaySettings::for_date(&with, date));
    let fi = with.airfields.iter().position(|a| a.id == "XSEA").unwrap();
    let notes = |t: DateTime<Utc>| -> Vec<Option<String>> {
        model
            .field_ends_at(fi, t)
            .iter()
            .map(|e| e.day_note.clone())
            .collect()
    };
    // XSEA's ends are 09 and 27, in that order.
    assert_eq!(notes(at(8, 0)), [Some("in use".into()), None]);
    assert_eq!(
        notes(at(13, 0)),
        [Some("in use".into()), Some("closed from 1200Z".into())]
    );
    assert_eq!(
        notes(at(15, 0)),
        [Some("in use".into()), Some("open; wet".into())]
    );
}

/// An end set in use from a time says so in the runway reason ("set in use from
/// 1200Z"), not "set for the day"; the legs before the change keep the wind's choice,
/// and an end set with no start is "set for the day" (trial finding).
#[test]
fn an_end_set_in_use_from_a_time_says_from_when() {
    let ops = rhoboard::ops::demo::load().ops.unwrap();
    let l = ops.legs.iter().find(|l| l.id == "L01").unwrap().clone();
    let date = NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    let with_entry = |from: Option<DateTime<Utc>>| {
        let mut state = RunwayStateFile::new(date);
        state.entries.push(EndState {
            airfield: "XSEA".into(),
            end: "09".into(),
            in_use: Some(true),
            from,
            ..EndState::default()
        });
        let mut with = ops.clone();
        with.runway_states.push(state);
        with
    };
    let mut late = l.clone();
    late.departs_at = at(13, 0).fixed_offset();
    late.arrives_at = at(13, 50).fixed_offset();
    let wind = ["METAR XSEA 141300Z 27006KT 9999 FEW040 18/08 Q1016".to_string()];

    let from_noon = with_entry(Some(at(12, 0)));
    let day = DaySettings::for_date(&from_noon, date);
    let r = run(&from_noon, &day, &wind, at(13, 10), &late);
    assert_eq!(r.departure.runway.as_deref(), Some("09"));
    assert_eq!(r.departure.runway_reason, "set in use from 1200Z");
    let morning = ["METAR XSEA 140600Z 27006KT 9999 FEW040 18/08 Q1016".to_string()];
    let r = run(&from_noon, &day, &morning, at(6, 30), &l);
    assert_eq!(r.departure.runway.as_deref(), Some("27"), "before 1200Z");
    assert_eq!(r.departure.runway_reason, "most headwind");

    let all_day = with_entry(None);
    let day = DaySettings::for_date(&all_day, date);
    let r = run(&all_day, &day, &wind, at(13, 10), &late);
    assert_eq!(r.departure.runway_reason, "set for the day");
}

/// Two closures of one end in different windows both hold, whichever was written
/// first (trial finding: closing 27 for 14–15Z on the board after a 15–17Z closure had
/// been set wiped the later one, and a 16Z landing was graded on 27); an opening
/// written after both ends them from its start.
#[test]
fn closures_in_different_windows_both_hold() {
    let ops = rhoboard::ops::demo::load().ops.unwrap();
    let date = NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    let closure = |from: u32, until: u32| EndState {
        airfield: "XSEA".into(),
        end: "27".into(),
        closed: Some(true),
        from: Some(at(from, 0)),
        until: Some(at(until, 0)),
        ..EndState::default()
    };
    let usable = |entries: Vec<EndState>| -> Vec<(u32, bool)> {
        let mut state = RunwayStateFile::new(date);
        state.entries = entries;
        let mut with = ops.clone();
        with.runway_states.push(state);
        let model = Model::new(&with, &DaySettings::for_date(&with, date));
        let fi = with.airfields.iter().position(|a| a.id == "XSEA").unwrap();
        [13, 14, 15, 16, 17, 18]
            .into_iter()
            .map(|h| {
                let t = at(h, 30);
                (h, model.field_ends_at(fi, t)[1].usable_at(t))
            })
            .collect()
    };
    let want = vec![
        (13, true),
        (14, false),
        (15, false),
        (16, false),
        (17, true),
        (18, true),
    ];
    assert_eq!(usable(vec![closure(15, 17), closure(14, 15)]), want);
    assert_eq!(usable(vec![closure(14, 15), closure(15, 17)]), want);
    let reopen = EndState {
        airfield: "XSEA".into(),
        end: "27".into(),
        closed: Some(false),
        from: Some(at(16, 0)),
        ..EndState::default()
    };
    assert_eq!(
        usable(vec![closure(15, 17), closure(14, 15), reopen]),
        [
            (13, true),
            (14, false),
            (15, false),
            (16, true),
            (17, true),
            (18, true)
        ]
    );
}

/// With every end closed at the departure's time, that is the deciding check (trial
/// finding: an arrival's tailwind read as limiting, the closure only as "no data"),
/// the reason names each end's closure, the ends are listed, and nothing is a gap.
#[test]
fn no_usable_end_at_the_departure_is_the_deciding_check() {
    let ops = rhoboard::ops::demo::load().ops.unwrap();
    let date = NaiveDate::from_ymd_opt(2026, 6, 14).unwrap();
    let closure = |end: &str, from: u32, until: u32| EndState {
        airfield: "XSEA".into(),
        end: end.into(),
        closed: Some(true),
        from: Some(at(from, 0)),
        until: Some(at(until, 0)),
        ..EndState::default()
    };
    let mut state = RunwayStateFile::new(date);
    state.entries = vec![closure("27", 15, 17), closure("09", 16, 17)];
    let mut with = ops.clone();
    with.runway_states.push(state);
    let day = DaySettings::for_date(&with, date);
    let mut l = leg(&with, "L05");
    l.departs_at = at(16, 0).fixed_offset();
    l.arrives_at = at(16, 50).fixed_offset();
    let reports = ["METAR XSEA 141600Z 30013KT 9999 FEW040 29/10 Q1013".to_string()];
    let r = run(&with, &day, &reports, at(16, 0), &l);
    assert_eq!(r.state, State::Below);
    let lim = r.limiting.as_ref().unwrap();
    assert_eq!(lim.check, "XSEA: no usable runway end");
    assert_eq!(
        lim.at,
        rhoboard::assess::leg::LimitingAt::NoRunway { departure: true }
    );
    assert_eq!(r.limiting_side().unwrap().airfield, "XSEA");
    assert!(
        r.reasons.iter().any(|w| w
            == "departure XSEA: no usable runway end at 1600Z (09 closed 1600Z–1700Z; 27 closed 1500Z–1700Z)"),
        "{:?}",
        r.reasons
    );
    assert_eq!(r.departure.ends.len(), 2);
    assert!(r.departure.ends.iter().all(|e| !e.usable));
    // A closed end is below, never no-data (trial finding: "state": "no-data" in the
    // alternatives of the JSON).
    assert!(r.departure.ends.iter().all(|e| e.state == State::Below));
    // The pairings at XSEA then: below on no usable runway end, not "no usable report"
    // (trial finding), in the fast path and the cell-by-cell reference alike.
    let model = Model::new(&with, &day);
    let s = store(&reports, at(16, 10));
    let ctx = Context {
        ops: &with,
        model: &model,
        store: &s,
        at: at(16, 10),
    };
    let m = rhoboard::assess::pairing::matrix(&ctx);
    let fi = with.airfield_position("XSEA").unwrap();
    let mut cells = 0;
    for ai in 0..m.aircraft.len() {
        let c = m.cell(ai, fi);
        if c.state == State::NoData && c.limiting != rhoboard::assess::pairing::PairLimit::NoRunway
        {
            // An aircraft the tables cannot place (none in the demo) stays no-data.
            continue;
        }
        assert_eq!(c.state, State::Below, "{ai}: {c:?}");
        assert_eq!(
            c.limiting_words(),
            "no usable runway end (every end closed)"
        );
        cells += 1;
    }
    assert!(cells > 3, "{cells}");
    assert!(r.departure.gaps.is_empty(), "{:?}", r.departure.gaps);
    assert!(
        r.headroom_absent_why()
            .contains("no usable runway end at XSEA")
    );
}
