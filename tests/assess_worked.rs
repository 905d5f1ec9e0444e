//! Worked examples of the assessment chains, every step shown, each against its source.

use rhoboard::assess::model::{EndModel, Origin, PhaseRules, Rule, SurfaceCase};
use rhoboard::assess::perf::{self, WindInput};
use rhoboard::assess::state::{State, verdict};
use rhoboard::assess::wind;
use rhoboard::ops::actype::SurfaceRule;
use rhoboard::ops::operator::{Available, DistanceCheck, Required};

fn close(what: &str, got: f64, want: f64, tol: f64) {
    assert!(
        (got - want).abs() <= tol,
        "{what}: got {got}, want {want} ± {tol}"
    );
}

fn end(tora_m: f64, toda_m: f64, lda_m: f64, surface: SurfaceCase, slope_percent: f64) -> EndModel {
    EndModel {
        field: 0,
        index: 0,
        heading_true_deg: 270.0,
        tora_m,
        toda_m: toda_m.min(tora_m * 1.5),
        asda_m: tora_m,
        lda_m,
        surface,
        slope_percent,
        required_gradient_ft_per_nm: None,
        usable: true,
        closed_from: None,
        closed_until: None,
        day_note: None,
    }
}

fn check(required: Required, factor: f64, available: Available) -> DistanceCheck {
    DistanceCheck {
        required,
        factor,
        available,
        source: "test".to_string(),
    }
}

/// A manual that says: distances −1 % per kt of headwind, +5 % per kt of tailwind, and
/// nothing about surfaces or slope — so the policy's fallbacks apply: grass ×1.2 and
/// +5 % per 1 % of upslope.
fn rules_easa_fallbacks() -> PhaseRules {
    PhaseRules {
        headwind_percent_per_kt: Some(1.0),
        tailwind_percent_per_kt: Some(5.0),
        wind_factoring_included: false,
        surface: [
            None,
            Some(Rule {
                rule: SurfaceRule::MultiplyBy(1.0),
                origin: Origin::Policy,
            }),
            Some(Rule {
                rule: SurfaceRule::MultiplyBy(1.2),
                origin: Origin::Policy,
            }),
            Some(Rule {
                rule: SurfaceRule::MultiplyBy(1.3),
                origin: Origin::Policy,
            }),
            None,
            None,
            None,
        ],
        slope_percent_per_percent: (5.0, Origin::Policy),
    }
}

/// EASA Air Operations, Regulation (EU) No 965/2012, performance class B take-off:
/// CAT.POL.A.305(b)(1) "the unfactored take-off distance … when multiplied by a factor
/// of 1.25, [shall not exceed] the take-off run available (TORA)"; (c)(6) not more than
/// 50 % of the reported headwind, not less than 150 % of the tailwind; AMC2
/// CAT.POL.A.305 "increased by 5 % for each 1 % of upslope" (2 % upslope: ×1.10); dry
/// grass ×1.2 (AMC1 CAT.POL.A.305 Table 1, from memory; UK CAA Safety Sense Leaflet 7
/// gives the same).
///
/// By hand: table distance to 50 ft 500 m, ground roll 300 m, reported headwind 10 kt.
///   headwind counted: 10 × 0.5 = 5 kt; wind factor 1 − 5 × 1 % = 0.95 → 475 m
///   dry grass × 1.2 → 570 m;   2 % upslope × (1 + 2 × 5 %) = 1.10 → 627 m
///   required 627 × 1.25 = 783.75 m against TORA 800 m: margin 800 / 783.75 − 1 = 2.07 %
///   (inside the 10 % buffer: thin).
#[test]
fn easa_class_b_takeoff_worked_example() {
    let rules = rules_easa_fallbacks();
    let wind = WindInput {
        headwind_kt: 10.0,
        headwind_credit: 0.5,
        tailwind_factor: 1.5,
    };
    let c = perf::distances(&rules, 300.0, 500.0, wind, SurfaceCase::GrassDry, 2.0).unwrap();
    close("headwind counted", c.headwind_used_kt, 5.0, 1e-12);
    close("wind factor", c.wind_factor, 0.95, 1e-12);
    close("after grass", c.after_surface_distance_50ft_m, 570.0, 1e-9);
    close("slope factor", c.slope_factor, 1.10, 1e-12);
    close("distance to 50 ft", c.distance_50ft_m, 627.0, 1e-9);
    let rwy = end(800.0, 800.0, 800.0, SurfaceCase::GrassDry, 2.0);
    let r = perf::check(
        &c,
        &rwy,
        &check(Required::Distance50ft, 1.25, Available::Tora),
        1.0,
    );
    close("required", r.required_m, 783.75, 1e-9);
    close("margin", r.margin, 800.0 / 783.75 - 1.0, 1e-12);
    assert_eq!(verdict(r.margin, 0.10), State::Thin);

    // The same with a 4 kt tailwind: counted at 150 % = 6 kt, +5 % per kt → ×1.30:
    // 500 × 1.30 × 1.2 × 1.10 = 858 m, × 1.25 = 1,072.5 m > 800 m: below.
    let tail = WindInput {
        headwind_kt: -4.0,
        ..wind
    };
    let c = perf::distances(&rules, 300.0, 500.0, tail, SurfaceCase::GrassDry, 2.0).unwrap();
    close("tailwind counted", c.headwind_used_kt, -6.0, 1e-12);
    close("tailwind factor", c.wind_factor, 1.30, 1e-12);
    let r = perf::check(
        &c,
        &rwy,
        &check(Required::Distance50ft, 1.25, Available::Tora),
        1.0,
    );
    close("required with tailwind", r.required_m, 1_072.5, 1e-9);
    assert_eq!(verdict(r.margin, 0.10), State::Below);

    // A favourable (downhill) slope earns no credit.
    let c = perf::distances(&rules, 300.0, 500.0, wind, SurfaceCase::PavedDry, -2.0).unwrap();
    close("downhill takeoff", c.slope_factor, 1.0, 0.0);
}

/// Landing at 70 % of LDA (distance from 50 ft × 1/0.7 ≈ × 1.43; EASA CAT.POL.A.330(a),
/// Regulation (EU) No 965/2012: "a full-stop landing from 50 ft above the threshold within
/// 70 % of the LDA"; UK CAA SSL 7) on a wet paved runway, a further × 1.15 (EASA
/// CAT.POL.A.335; "the wet factor (1.15)" in GM1 CAT.POL.A.335(b), as the UK CAA's
/// copy of the regulation's guidance gives it; the rule's own paragraph number from
/// memory), the manual silent on wet runways.
///
/// By hand: table landing distance 400 m, calm, paved, level.
///   required 400 × 1.43 × 1.15 = 657.8 m against LDA 700 m: margin 700/657.8 − 1 = 6.4 %.
/// The policy's own wet paved fallback (×1.15) gives way to the category's factor: it
/// is never applied twice (400 × 1.15 × 1.43 × 1.15 would be 756.5 m).
#[test]
fn landing_at_seventy_percent_of_lda_wet_paved() {
    let base = rules_easa_fallbacks();
    let mut rules = base;
    rules.surface[SurfaceCase::PavedWet as usize] = Some(Rule {
        rule: SurfaceRule::MultiplyBy(1.15),
        origin: Origin::Policy,
    });
    let rules = perf::landing_rules(&rules, Some(1.15));
    let calm = WindInput {
        headwind_kt: 0.0,
        headwind_credit: 0.5,
        tailwind_factor: 1.5,
    };
    let c = perf::distances(&rules, 250.0, 400.0, calm, SurfaceCase::PavedWet, 0.0).unwrap();
    close("no surface rule applied", c.distance_50ft_m, 400.0, 1e-12);
    let extra = perf::landing_extra_factor(&c, Some(1.15));
    close("wet factor", extra, 1.15, 0.0);
    let rwy = end(700.0, 700.0, 700.0, SurfaceCase::PavedWet, 0.0);
    let r = perf::check(
        &c,
        &rwy,
        &check(Required::Distance50ft, 1.43, Available::Lda),
        extra,
    );
    close("required", r.required_m, 657.8, 1e-9);
    close("margin", r.margin, 700.0 / 657.8 - 1.0, 1e-12);
    assert_eq!(verdict(r.margin, 0.10), State::Thin);

    // A manual that gives its own wet figure (+10 % of the ground roll to both) keeps
    // it, and the category factor is then not added.
    let mut manual = base;
    manual.surface[SurfaceCase::PavedWet as usize] = Some(Rule {
        rule: SurfaceRule::AddPercentOfGroundRoll(10.0),
        origin: Origin::Manual,
    });
    let rules = perf::landing_rules(&manual, Some(1.15));
    let c = perf::distances(&rules, 250.0, 400.0, calm, SurfaceCase::PavedWet, 0.0).unwrap();
    close(
        "manual wet: 400 + 10 % of 250",
        c.distance_50ft_m,
        425.0,
        1e-12,
    );
    close(
        "no extra",
        perf::landing_extra_factor(&c, Some(1.15)),
        1.0,
        0.0,
    );
}

/// UK CAA Safety Sense Leaflet 7, Aeroplane Performance (from memory): take-off on dry
/// grass ×1.2 and a 2 % uphill slope ×1.1, then the safety factor ×1.33 against TODA;
/// landing on dry grass ×1.15 with ×1.43.
///
/// By hand, take-off: 450 m × 1.2 × 1.1 = 594 m; × 1.33 = 790.02 m against 800 m → 1.26 %.
/// Ground roll 270 m × 1.2 × 1.1 = 356.4 m; × 1.33 = 474.01 m against TORA 800 m → 68.8 %.
/// Landing: 380 m × 1.15 = 437 m; × 1.43 = 624.91 m against LDA 700 m → 12.0 %.
#[test]
fn ssl7_style_combination() {
    let mut rules = rules_easa_fallbacks();
    rules.slope_percent_per_percent = (5.0, Origin::Policy);
    let calm = WindInput {
        headwind_kt: 0.0,
        headwind_credit: 0.5,
        tailwind_factor: 1.5,
    };
    let c = perf::distances(&rules, 270.0, 450.0, calm, SurfaceCase::GrassDry, 2.0).unwrap();
    let rwy = end(800.0, 800.0, 700.0, SurfaceCase::GrassDry, 2.0);
    let d = perf::check(
        &c,
        &rwy,
        &check(Required::Distance50ft, 1.33, Available::Toda),
        1.0,
    );
    close("TODR", d.required_m, 790.02, 1e-9);
    close("TODA margin", d.margin, 800.0 / 790.02 - 1.0, 1e-12);
    let g = perf::check(
        &c,
        &rwy,
        &check(Required::GroundRoll, 1.33, Available::Tora),
        1.0,
    );
    close("TORR", g.required_m, 474.012, 1e-9);
    let checks = [
        check(Required::Distance50ft, 1.33, Available::Toda),
        check(Required::GroundRoll, 1.33, Available::Tora),
    ];
    close(
        "takeoff margin is the smallest",
        perf::min_margin(&c, &rwy, &checks, 1.0),
        d.margin,
        0.0,
    );

    let mut landing = rules_easa_fallbacks();
    landing.surface[SurfaceCase::GrassDry as usize] = Some(Rule {
        rule: SurfaceRule::MultiplyBy(1.15),
        origin: Origin::Policy,
    });
    // Landing uphill on this end (slope +2 %) is favourable: no factor.
    let c = perf::distances(&landing, 230.0, 380.0, calm, SurfaceCase::GrassDry, -2.0).unwrap();
    close("landing slope", c.slope_factor, 1.0, 0.0);
    let l = perf::check(
        &c,
        &rwy,
        &check(Required::Distance50ft, 1.43, Available::Lda),
        1.0,
    );
    close("LDR", l.required_m, 624.91, 1e-9);
    close("LDA margin", l.margin, 700.0 / 624.91 - 1.0, 1e-12);
}

/// "Add N % of the ground roll to both figures": a manual grass rule of +20 % of the
/// ground roll on a 300 m roll adds 60 m to both (from the design's manual-rule forms).
#[test]
fn add_percent_of_ground_roll_rule() {
    let (gr, d) = SurfaceRule::AddPercentOfGroundRoll(20.0).apply(300.0, 500.0);
    close("ground roll", gr, 360.0, 1e-12);
    close("50 ft", d, 560.0, 1e-12);
}

/// FAA Terminal Procedures Publication, climb/descent table (from memory): 200 ft/NM at
/// 90 kt ground speed needs 300 ft/min; at 120 kt, 400 ft/min.
#[test]
fn climb_gradient_conversion() {
    close(
        "200 ft/NM at 90 kt",
        perf::gradient_ft_per_nm(300.0, 90.0),
        200.0,
        1e-12,
    );
    close(
        "200 ft/NM at 120 kt",
        perf::gradient_ft_per_nm(400.0, 120.0),
        200.0,
        1e-12,
    );
    // The chain: 75 KIAS at a TAS factor of 1.2 is 90 kt TAS; a 6 kt tailwind makes
    // 96 kt over the ground and 600 ft/min gives 375 ft/NM against 200 required: +87.5 %.
    // A headwind earns no credit: the ground speed stays at the TAS.
    let c = perf::climb(600.0, 75.0, 1.2, -6.0, 400.0, Some(200.0));
    close("TAS", c.true_airspeed_kt, 90.0, 1e-12);
    close("GS", c.ground_speed_kt, 96.0, 1e-12);
    close("gradient", c.gradient_ft_per_nm, 375.0, 1e-12);
    close("gradient margin", c.gradient_margin.unwrap(), 0.875, 1e-12);
    close("rate margin", c.rate_margin, 0.5, 1e-12);
    close("smaller margin", c.margin(), 0.5, 1e-12);
    let h = perf::climb(600.0, 75.0, 1.2, 15.0, 400.0, Some(200.0));
    close("no headwind credit", h.ground_speed_kt, 90.0, 1e-12);
}

/// Crosswind on runway 27 (270° true) from 300° at 20 kt: 20 sin 30° = 10 kt from the
/// right, 20 cos 30° = 17.3 kt headwind (trigonometry; FAA PHAK crosswind chart).
#[test]
fn crosswind_component_check() {
    let c = wind::components(300.0, 20.0, 270.0);
    close("crosswind", c.crosswind_kt, 10.0, 1e-9);
    assert_eq!(c.crosswind_from, wind::Side::Right);
    close("headwind", c.headwind_kt, 17.320_508, 1e-6);
}

/// A limit row for the shown-margin tests (a fuel row: a minimum in litres, or as a
/// maximum when `minimum` is false).
fn shown_row(value: f64, limit: f64, minimum: bool) -> rhoboard::assess::limits::LimitCheck {
    use rhoboard::assess::limits::{LimitCheck, LimitKind};
    let margin = if minimum {
        value - limit
    } else {
        limit - value
    };
    LimitCheck {
        kind: LimitKind::FuelReserve,
        value: Some(value),
        limit: Some(limit),
        unit: "L",
        margin,
        band: 0.0,
        state: if margin < 0.0 {
            State::Below
        } else {
            State::Within
        },
        source: String::new(),
        note: String::new(),
        subject: String::new(),
        open_ended: false,
    }
}

/// Margins as shown: value and limit rounded conservatively at the unit's precision
/// (toward each other), the margin exactly their difference, never more than the true
/// margin (hand arithmetic beside each case).
#[test]
fn shown_margins_are_the_difference_of_the_shown_figures() {
    let row = shown_row;
    let all = |s: rhoboard::assess::limits::Shown| (s.value, s.limit, s.margin, s.decimals);
    // 60.4 L against a minimum of 48.75 L: margin 11.65 L; value down to 60, limit up
    // to 49, margin 60 − 49 = 11 (≤ 11.65).
    let s = row(60.4, 48.75, true).shown(|x| x, 0);
    assert_eq!(all(s), (Some(60.0), Some(49.0), Some(11.0), 0));
    // 60.6 L against 48.4 L: nearest rounding would give 61 − 48 = 13 > 12.2; value
    // down to 60, limit up to 49: 11, whole units, no extra decimals.
    let s = row(60.6, 48.4, true).shown(|x| x, 0);
    assert_eq!(all(s), (Some(60.0), Some(49.0), Some(11.0), 0));
    // A maximum: 986.24 kg against 1150 kg (margin 163.76 kg): the value up to 987,
    // margin 1150 − 987 = 163.
    let s = row(986.24, 1150.0, false).shown(|x| x, 0);
    assert_eq!(all(s), (Some(987.0), Some(1150.0), Some(163.0), 0));
    // A missed maximum: 8336.28 ft density altitude against 8000 ft (margin −336.28):
    // value up to 8337, margin 8000 − 8337 = −337, more missed than there is, not less.
    let s = row(8336.28, 8000.0, false).shown(|x| x, 0);
    assert_eq!(all(s), (Some(8337.0), Some(8000.0), Some(-337.0), 0));
    // In another unit (ft → m, 0.3048 m/ft exactly): 3000 ft against a minimum of
    // 2500 ft is 914.4 m against 762 m, margin 152.4 m; shown 914 − 762 = 152.
    let s = row(3000.0, 2500.0, true).shown(|x| x * 0.3048, 0);
    assert_eq!(all(s), (Some(914.0), Some(762.0), Some(152.0), 0));
    // Passing by less than a step: 1499 ft against a maximum of 1500 ft in metres is
    // 456.895 m against 457.2 m; 457 − 457 = 0 rather than a missed-looking 457 − 458.
    let s = row(1499.0, 1500.0, false).shown(|x| x * 0.3048, 0);
    assert_eq!(all(s), (Some(457.0), Some(457.0), Some(0.0), 0));
    // Exactly at the limit: 15 kt against 15 kt, margin +0 (not −0, not −1).
    let s = row(15.0, 15.0, false).shown(|x| x, 0);
    assert_eq!(all(s), (Some(15.0), Some(15.0), Some(0.0), 0));
    assert!(s.margin.unwrap().is_sign_positive());
    // At one decimal (visibility in SM): 4.97 SM against a minimum of 3 SM: 4.9 − 3.0.
    let s = row(4.97, 3.0, true).shown(|x| x, 1);
    assert_eq!(all(s), (Some(4.9), Some(3.0), Some(1.9), 1));
}

proptest::proptest! {
    #![proptest_config(proptest::prelude::ProptestConfig::with_cases(2000))]

    /// For any value, limit, kind (minimum or maximum), precision and a linear unit
    /// change: the shown margin is exactly the shown value minus the shown limit (a
    /// maximum: the reverse), never more than the true margin, less by under two steps,
    /// on the same side of zero, and the figures sit on the grid of the precision.
    #[test]
    fn shown_margin_is_the_shown_difference_and_never_more_than_the_true_one(
        value in -20_000.0f64..20_000.0,
        limit in -20_000.0f64..20_000.0,
        near in proptest::prelude::any::<bool>(),
        nudge in -2.0f64..2.0,
        minimum in proptest::prelude::any::<bool>(),
        decimals in 0usize..3,
        scale in proptest::sample::select(vec![1.0, 0.3048, 1.0 / 0.3048, 1.852]),
    ) {
        // Half the cases put the value within a couple of units of the limit, where
        // rounding matters most.
        let value = if near { limit + nudge } else { value };
        let r = shown_row(value, limit, minimum);
        let s = r.shown(|x| x * scale, decimals);
        let (v, l, m) = (s.value.unwrap(), s.limit.unwrap(), s.margin.unwrap());
        let step = 10f64.powi(-(decimals as i32));
        let true_m = r.margin * scale;
        let diff = if minimum { v - l } else { l - v };
        proptest::prop_assert!((m - diff).abs() < 1e-6 * step, "{s:?}");
        proptest::prop_assert!(m <= true_m + 1e-6 * step, "{s:?} vs {true_m}");
        proptest::prop_assert!(true_m - m < 2.0 * step + 1e-6, "{s:?} vs {true_m}");
        proptest::prop_assert_eq!(m < 0.0, true_m < 0.0, "{:?} vs {}", s, true_m);
        for x in [v, l, m] {
            proptest::prop_assert!(((x / step) - (x / step).round()).abs() < 1e-6, "{s:?}");
        }
        proptest::prop_assert_eq!(s.decimals, decimals);
    }
}
