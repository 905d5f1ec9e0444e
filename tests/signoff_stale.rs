//! Stale sign-offs on the demo day: a leg signed on the morning's reports needs a
//! re-check once the afternoon's reports undermine it — the state got worse, the
//! density altitude rose by more than the policy's step, or the headroom fell below
//! the policy's floor.

use chrono::{DateTime, Utc};
use rhoboard::assess::{Context, DaySettings, LegResult, Model, State, assess_leg};
use rhoboard::commands::check;
use rhoboard::ops::operator::SignOffPolicy;
use rhoboard::signoff::{DataHashes, Freshness, Record, Request, draft, recheck};

/// The demo operator as a folder, so a developer's configured default folder is not used.
fn demo_dir() -> &'static std::path::Path {
    static DIR: std::sync::OnceLock<tempfile::TempDir> = std::sync::OnceLock::new();
    DIR.get_or_init(|| {
        let dir = tempfile::tempdir().expect("temp dir");
        for (rel, text) in rhoboard::ops::demo::FILES {
            let p = dir.path().join(rel);
            std::fs::create_dir_all(p.parent().expect("parent")).expect("mkdir");
            std::fs::write(&p, text).expect("write");
        }
        dir
    })
    .path()
}

fn utc(s: &str) -> DateTime<Utc> {
    DateTime::parse_from_rfc3339(s)
        .expect("time")
        .with_timezone(&Utc)
}

fn assessed(leg: &str, at: &str) -> (rhoboard::ops::Ops, LegResult) {
    let loaded = check::load(Some(demo_dir()), &[], Some(at), utc(at)).expect("demo");
    let ops = loaded.ops.clone();
    let model = Model::new(&ops, &DaySettings::default());
    let ctx = Context {
        ops: &ops,
        model: &model,
        store: &loaded.store,
        at: loaded.at,
    };
    let i = ops.legs.iter().position(|l| l.id == leg).expect("leg");
    let r = assess_leg(&ctx, i).expect("assessed");
    (ops, r)
}

fn signed(leg: &str, at: &str) -> (Record, SignOffPolicy) {
    let (ops, r) = assessed(leg, at);
    let data = DataHashes::of(&rhoboard::ops::demo::files());
    let req = Request {
        instructor: "Mara Greyling",
        note: "",
        override_reason: None,
        signed_at: utc(at),
        basis_at: utc(at),
        data: &data,
    };
    (
        draft(&ops, &r, &req).expect("signable"),
        ops.operator.policy.sign_off.clone(),
    )
}

#[test]
fn the_solo_signed_at_0800_is_re_check_after_the_1300_report() {
    let (record, policy) = signed("L09", "2026-06-14T08:00:00Z");
    assert_eq!(
        record.figures.as_ref().map(|f| f.state.as_str()),
        Some("within")
    );
    // On the morning's own reports it stands.
    let (_, morning) = assessed("L09", "2026-06-14T08:00:00Z");
    assert_eq!(recheck(&record, &morning, &policy), Freshness::Current);
    // The 13:00 report: L09 (solo, XKNL→XPIN) is below.
    let (_, afternoon) = assessed("L09", "2026-06-14T13:00:00Z");
    assert_eq!(afternoon.state, State::Below);
    let Freshness::Recheck(why) = recheck(&record, &afternoon, &policy) else {
        panic!("expected re-check");
    };
    let all = why.join("\n");
    assert!(all.contains("state went from ✓ within to ✗ below"), "{all}");
    assert!(all.contains("arrival XPIN density altitude rose"), "{all}");
    assert!(all.contains("under the floor of +3.0 °C"), "{all}");
}

#[test]
fn a_student_solo_that_thins_is_re_check() {
    // L12 (student solo, XSEA circuits at 14Z): within at 08Z, thin on the crosswind at 13Z.
    let (record, policy) = signed("L12", "2026-06-14T08:00:00Z");
    let (_, afternoon) = assessed("L12", "2026-06-14T13:00:00Z");
    assert_eq!(afternoon.state, State::Thin);
    let f = recheck(&record, &afternoon, &policy);
    assert!(f.is_recheck(), "{f}");
    assert!(f.to_string().contains("from ✓ within to ~ thin"), "{f}");
}

#[test]
fn a_density_altitude_rise_alone_is_re_check() {
    let (mut record, policy) = signed("L01", "2026-06-14T08:00:00Z");
    let (_, now) = assessed("L01", "2026-06-14T08:00:00Z");
    assert_eq!(recheck(&record, &now, &policy), Freshness::Current);
    let fig = record.figures.as_mut().expect("figures");
    let da = fig.departure.density_altitude_ft.expect("da");
    // Signed 301 ft lower than now: over the 300 ft step.
    fig.departure.density_altitude_ft = Some(da - 301.0);
    let f = recheck(&record, &now, &policy);
    assert!(
        f.to_string()
            .contains("departure XSEA density altitude rose 301 ft"),
        "{f}"
    );
    // 299 ft: inside the step.
    let fig = record.figures.as_mut().expect("figures");
    fig.departure.density_altitude_ft = Some(da - 299.0);
    fig.arrival.density_altitude_ft = Some(da - 299.0);
    assert_eq!(recheck(&record, &now, &policy), Freshness::Current);
}

#[test]
fn a_headroom_under_the_floor_is_re_check() {
    let (record, _) = signed("L01", "2026-06-14T08:00:00Z");
    let (_, now) = assessed("L01", "2026-06-14T08:00:00Z");
    let h = now.headroom.expect("headroom").warming_c;
    let policy = SignOffPolicy {
        recheck_headroom_floor_c: h + 1.0,
        ..SignOffPolicy::default()
    };
    // Signed with the same headroom: it did not fall, so no re-check…
    assert_eq!(recheck(&record, &now, &policy), Freshness::Current);
    // …but one that was signed with more, now under the floor, is.
    let mut more = record.clone();
    if let Some(f) = more.figures.as_mut() {
        f.headroom_c = Some(h + 5.0);
    }
    let f = recheck(&more, &now, &policy);
    assert!(f.to_string().contains("under the floor"), "{f}");
}

#[test]
fn the_policy_defaults_are_300_ft_and_no_overrides() {
    let p = SignOffPolicy::default();
    assert_eq!(p.recheck_density_altitude_rise_ft, 300.0);
    assert!(p.override_categories.is_empty());
}

#[test]
fn standing_on_the_chain_follows_sign_off_revocation_and_the_afternoon() {
    use rhoboard::signoff::{AppendOptions, Log, Standing, revoke, sign, standing};
    let dir = tempfile::tempdir().expect("temp dir");
    let log = Log::of_operator(dir.path());
    let (ops, morning) = assessed("L09", "2026-06-14T08:00:00Z");
    let (_, afternoon) = assessed("L09", "2026-06-14T13:00:00Z");
    let chain = log.read().expect("read");
    assert_eq!(standing(&chain, &ops, &morning), Standing::Unsigned);
    let data = DataHashes::of(&rhoboard::ops::demo::files());
    let req = Request {
        instructor: "Mara Greyling",
        note: "",
        override_reason: None,
        signed_at: utc("2026-06-14T07:55:00Z"),
        basis_at: utc("2026-06-14T08:00:00Z"),
        data: &data,
    };
    sign(&log, &ops, &morning, &req, &AppendOptions::default()).expect("signed");
    let chain = log.read().expect("read");
    assert!(matches!(standing(&chain, &ops, &morning), Standing::Signed(e) if e.record.seq == 1));
    assert!(
        matches!(standing(&chain, &ops, &afternoon), Standing::Recheck(e, _) if e.record.seq == 1)
    );
    revoke(&log, &ops, morning.index, &req, &AppendOptions::default()).expect("revoked");
    let chain = log.read().expect("read");
    assert_eq!(standing(&chain, &ops, &afternoon), Standing::Unsigned);
}

#[test]
fn a_leg_re_planned_since_the_sign_off_is_re_check() {
    use rhoboard::signoff::{AppendOptions, Log, Standing, sign, standing};
    let dir = tempfile::tempdir().expect("temp dir");
    let log = Log::of_operator(dir.path());
    let (ops, morning) = assessed("L09", "2026-06-14T08:00:00Z");
    let data = DataHashes::of(&rhoboard::ops::demo::files());
    let req = Request {
        instructor: "Mara Greyling",
        note: "",
        override_reason: None,
        signed_at: utc("2026-06-14T07:55:00Z"),
        basis_at: utc("2026-06-14T08:00:00Z"),
        data: &data,
    };
    sign(&log, &ops, &morning, &req, &AppendOptions::default()).expect("signed");
    let chain = log.read().expect("read");
    // Another aircraft on the same leg.
    let mut replanned = ops.clone();
    replanned.legs[morning.index].aircraft = "X-TOUB".to_string();
    let Standing::Recheck(_, why) = standing(&chain, &replanned, &morning) else {
        panic!("expected re-check");
    };
    assert_eq!(why, ["aircraft is now X-TOUB, signed for X-TOUA"]);
    // More mass on board.
    let mut heavier = morning.clone();
    heavier.takeoff_mass_kg = heavier.takeoff_mass_kg.map(|m| m + 40.0);
    let f = recheck(
        &chain.entries[0].record,
        &heavier,
        &ops.operator.policy.sign_off,
    );
    assert!(f.to_string().contains("takeoff mass rose 40 kg"), "{f}");
}
