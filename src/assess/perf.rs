//! The takeoff, landing and climb chains for one runway end: table value → wind →
//! surface → slope → the policy's checks. Plain `Copy` data, no allocation, so the
//! pairing matrix can run them for every end.

use serde::Serialize;

use super::model::{EndModel, Origin, PhaseRules, Rule, SurfaceCase};
use super::wind::factored_headwind_kt;
use crate::ops::operator::{Available, DistanceCheck, Required};

/// Why a chain could not be computed.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum PerfGap {
    /// There is a tailwind and the manual gives no tailwind correction.
    NoTailwindRule,
    /// Neither the manual nor the policy gives a factor for the day's surface.
    NoSurfaceRule(SurfaceCase),
    /// Standing water: a contaminated runway.
    Contaminated,
}

impl std::fmt::Display for PerfGap {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            PerfGap::NoTailwindRule => {
                f.write_str("tailwind, and the flight manual gives no tailwind correction")
            }
            PerfGap::NoSurfaceRule(c) => write!(
                f,
                "{}: neither the flight manual nor the operator's policy gives a factor",
                c.word()
            ),
            PerfGap::Contaminated => {
                f.write_str("standing water: a contaminated runway is outside the manual's data")
            }
        }
    }
}

/// A distance chain: the manual's figures and each correction in order.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct DistanceChain {
    /// Table ground roll, m.
    pub table_ground_roll_m: f64,
    /// Table distance to (takeoff) or from (landing) 50 ft, m.
    pub table_distance_50ft_m: f64,
    /// The steady headwind component as reported, kt (negative: tailwind).
    pub headwind_reported_kt: f64,
    /// The component used after the policy's factoring, kt.
    pub headwind_used_kt: f64,
    /// Whether the manual's wind figures already include the factoring.
    pub wind_factoring_in_manual: bool,
    /// The wind correction factor applied to both figures.
    pub wind_factor: f64,
    /// Surface and condition.
    pub surface: SurfaceCase,
    /// The surface rule applied, if any.
    #[serde(skip)]
    pub surface_rule: Option<Rule>,
    /// Ground roll after wind and surface, m.
    pub after_surface_ground_roll_m: f64,
    /// 50 ft distance after wind and surface, m.
    pub after_surface_distance_50ft_m: f64,
    /// Adverse slope, percent (uphill for takeoff, downhill for landing; 0 if favourable).
    pub adverse_slope_percent: f64,
    /// Slope factor.
    pub slope_factor: f64,
    /// Where the slope rule comes from.
    pub slope_origin: Origin,
    /// Final ground roll, m.
    pub ground_roll_m: f64,
    /// Final distance to/from 50 ft, m.
    pub distance_50ft_m: f64,
}

/// A reported steady headwind component and the policy's factoring of it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WindInput {
    /// Steady headwind component, kt (negative: tailwind).
    pub headwind_kt: f64,
    /// Fraction of a headwind counted (0.5).
    pub headwind_credit: f64,
    /// Factor on a tailwind (1.5).
    pub tailwind_factor: f64,
}

/// Runs the chain for table values, a reported steady headwind, a surface and the
/// adverse slope.
pub fn distances(
    rules: &PhaseRules,
    table_ground_roll_m: f64,
    table_distance_50ft_m: f64,
    wind: WindInput,
    surface: SurfaceCase,
    adverse_slope_percent: f64,
) -> Result<DistanceChain, PerfGap> {
    Ok(corrections(rules, wind, surface, adverse_slope_percent)?
        .chain(table_ground_roll_m, table_distance_50ft_m))
}

/// The corrections of a distance chain on one end in one wind: everything in it but
/// the table values, which do not depend on them. Resolved once, they are applied to the
/// table values at any temperature ([`Corrections::chain`], [`Corrections::figures`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Corrections {
    headwind_reported_kt: f64,
    headwind_used_kt: f64,
    wind_factoring_in_manual: bool,
    wind_factor: f64,
    surface: SurfaceCase,
    surface_rule: Option<Rule>,
    adverse_slope_percent: f64,
    slope_factor: f64,
    slope_origin: Origin,
}

/// Resolves the corrections of [`distances`].
pub fn corrections(
    rules: &PhaseRules,
    wind: WindInput,
    surface: SurfaceCase,
    adverse_slope_percent: f64,
) -> Result<Corrections, PerfGap> {
    let headwind_kt = wind.headwind_kt;
    match surface {
        SurfaceCase::Contaminated => return Err(PerfGap::Contaminated),
        SurfaceCase::GrassSoft | SurfaceCase::GrassLong
            if rules.surface_rule(surface).is_none() =>
        {
            return Err(PerfGap::NoSurfaceRule(surface));
        }
        _ => {}
    }
    let used = if rules.wind_factoring_included {
        headwind_kt
    } else {
        factored_headwind_kt(headwind_kt, wind.headwind_credit, wind.tailwind_factor)
    };
    let wind_factor = if used >= 0.0 {
        // No manual headwind rule: no credit (conservative).
        rules
            .headwind_percent_per_kt
            .map_or(1.0, |p| (1.0 - p * used / 100.0).max(0.0))
    } else {
        match rules.tailwind_percent_per_kt {
            Some(p) => 1.0 + p * (-used) / 100.0,
            None => return Err(PerfGap::NoTailwindRule),
        }
    };
    let adverse = adverse_slope_percent.max(0.0);
    let (k, slope_origin) = rules.slope_percent_per_percent;
    Ok(Corrections {
        headwind_reported_kt: headwind_kt,
        headwind_used_kt: used,
        wind_factoring_in_manual: rules.wind_factoring_included,
        wind_factor,
        surface,
        surface_rule: rules.surface_rule(surface),
        adverse_slope_percent: adverse,
        slope_factor: 1.0 + k * adverse / 100.0,
        slope_origin,
    })
}

impl Corrections {
    /// Ground roll and distance to/from 50 ft after wind and surface, then after the
    /// slope, m.
    #[inline]
    pub fn figures(&self, table_ground_roll_m: f64, table_distance_50ft_m: f64) -> [f64; 4] {
        let (gr, d50) = (
            table_ground_roll_m * self.wind_factor,
            table_distance_50ft_m * self.wind_factor,
        );
        let (gr, d50) = match self.surface_rule {
            Some(r) => r.rule.apply(gr, d50),
            None => (gr, d50),
        };
        [gr, d50, gr * self.slope_factor, d50 * self.slope_factor]
    }

    /// The whole chain for table values.
    pub fn chain(&self, table_ground_roll_m: f64, table_distance_50ft_m: f64) -> DistanceChain {
        let [gr, d50, ground_roll_m, distance_50ft_m] =
            self.figures(table_ground_roll_m, table_distance_50ft_m);
        DistanceChain {
            table_ground_roll_m,
            table_distance_50ft_m,
            headwind_reported_kt: self.headwind_reported_kt,
            headwind_used_kt: self.headwind_used_kt,
            wind_factoring_in_manual: self.wind_factoring_in_manual,
            wind_factor: self.wind_factor,
            surface: self.surface,
            surface_rule: self.surface_rule,
            after_surface_ground_roll_m: gr,
            after_surface_distance_50ft_m: d50,
            adverse_slope_percent: self.adverse_slope_percent,
            slope_factor: self.slope_factor,
            slope_origin: self.slope_origin,
            ground_roll_m,
            distance_50ft_m,
        }
    }

    /// The extra factor on a landing check with these corrections
    /// ([`landing_extra_factor`]).
    pub fn landing_extra_factor(&self, wet_paved_landing_factor: Option<f64>) -> f64 {
        extra_factor(self.surface, self.surface_rule, wet_paved_landing_factor)
    }
}

/// One check `required × factor ≤ available`, evaluated.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct CheckResult {
    /// Which figure.
    pub required: Required,
    /// Which declared distance.
    pub available: Available,
    /// The policy's factor times any extra (wet) factor.
    pub factor: f64,
    /// The figure before the factor, m.
    pub figure_m: f64,
    /// Required distance including the factor, m.
    pub required_m: f64,
    /// The declared distance, m.
    pub available_m: f64,
    /// available ÷ required − 1.
    pub margin: f64,
}

/// The declared distance of a check on an end.
pub fn available_m(end: &EndModel, a: Available) -> f64 {
    match a {
        Available::Tora => end.tora_m,
        Available::Toda => end.toda_m,
        Available::Asda => end.asda_m,
        Available::Lda => end.lda_m,
    }
}

/// Evaluates one check.
pub fn check(chain: &DistanceChain, end: &EndModel, c: &DistanceCheck, extra: f64) -> CheckResult {
    check_figures(chain.ground_roll_m, chain.distance_50ft_m, end, c, extra)
}

/// [`check`] on a chain's final ground roll and distance to/from 50 ft, m.
#[inline]
fn check_figures(
    ground_roll_m: f64,
    distance_50ft_m: f64,
    end: &EndModel,
    c: &DistanceCheck,
    extra: f64,
) -> CheckResult {
    let figure_m = match c.required {
        Required::GroundRoll => ground_roll_m,
        Required::Distance50ft => distance_50ft_m,
    };
    let factor = c.factor * extra;
    let required_m = figure_m * factor;
    let available_m = available_m(end, c.available);
    CheckResult {
        required: c.required,
        available: c.available,
        factor,
        figure_m,
        required_m,
        available_m,
        margin: available_m / required_m - 1.0,
    }
}

/// The smallest margin of a list of checks (no allocation); +∞ for an empty list.
pub fn min_margin(
    chain: &DistanceChain,
    end: &EndModel,
    checks: &[DistanceCheck],
    extra: f64,
) -> f64 {
    min_margin_of(
        chain.ground_roll_m,
        chain.distance_50ft_m,
        end,
        checks,
        extra,
    )
}

/// [`min_margin`] on a chain's final ground roll and distance to/from 50 ft, m.
#[inline]
pub fn min_margin_of(
    ground_roll_m: f64,
    distance_50ft_m: f64,
    end: &EndModel,
    checks: &[DistanceCheck],
    extra: f64,
) -> f64 {
    checks
        .iter()
        .map(|c| check_figures(ground_roll_m, distance_50ft_m, end, c, extra).margin)
        .fold(f64::INFINITY, f64::min)
}

/// The extra factor on a landing check: the category's wet paved factor, where the
/// manual gives no wet paved figure (the chain then applied no surface rule).
pub fn landing_extra_factor(chain: &DistanceChain, wet_paved_landing_factor: Option<f64>) -> f64 {
    extra_factor(chain.surface, chain.surface_rule, wet_paved_landing_factor)
}

fn extra_factor(
    surface: SurfaceCase,
    surface_rule: Option<Rule>,
    wet_paved_landing_factor: Option<f64>,
) -> f64 {
    match (surface, wet_paved_landing_factor) {
        (SurfaceCase::PavedWet, Some(f)) if surface_rule.is_none() => f,
        _ => 1.0,
    }
}

/// The landing rules for a category: where the category has its own wet paved factor
/// and the manual is silent, the policy's fallback surface rule gives way to it.
pub fn landing_rules(rules: &PhaseRules, wet_paved_landing_factor: Option<f64>) -> PhaseRules {
    let mut r = *rules;
    let wet = SurfaceCase::PavedWet as usize;
    if wet_paved_landing_factor.is_some()
        && r.surface[wet].is_some_and(|x| x.origin == Origin::Policy)
    {
        r.surface[wet] = None;
    }
    r
}

/// The climb chain.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ClimbChain {
    /// Table rate of climb, ft/min.
    pub rate_fpm: f64,
    /// Indicated climb speed, kt.
    pub climb_speed_kias: f64,
    /// True airspeed of the climb speed, kt.
    pub true_airspeed_kt: f64,
    /// Tailwind component counted, kt (no headwind credit).
    pub tailwind_kt: f64,
    /// Ground speed, kt.
    pub ground_speed_kt: f64,
    /// Climb gradient, ft per NM.
    pub gradient_ft_per_nm: f64,
    /// The category's minimum rate, ft/min.
    pub min_rate_fpm: f64,
    /// rate ÷ minimum − 1.
    pub rate_margin: f64,
    /// The end's required gradient, ft/NM.
    pub required_gradient_ft_per_nm: Option<f64>,
    /// gradient ÷ required − 1.
    pub gradient_margin: Option<f64>,
}

impl ClimbChain {
    /// The smaller of the rate and gradient margins.
    pub fn margin(&self) -> f64 {
        self.gradient_margin
            .map_or(self.rate_margin, |g| g.min(self.rate_margin))
    }
}

/// Climb gradient from rate of climb and ground speed: ft/min × 60 ÷ kt = ft per NM.
pub fn gradient_ft_per_nm(rate_fpm: f64, ground_speed_kt: f64) -> f64 {
    rate_fpm * 60.0 / ground_speed_kt
}

/// Runs the climb chain.
pub fn climb(
    rate_fpm: f64,
    climb_speed_kias: f64,
    true_airspeed_factor: f64,
    headwind_kt: f64,
    min_rate_fpm: f64,
    required_gradient_ft_per_nm: Option<f64>,
) -> ClimbChain {
    let tas = climb_speed_kias * true_airspeed_factor;
    let tailwind_kt = (-headwind_kt).max(0.0);
    let gs = tas + tailwind_kt;
    let gradient = gradient_ft_per_nm(rate_fpm, gs);
    ClimbChain {
        rate_fpm,
        climb_speed_kias,
        true_airspeed_kt: tas,
        tailwind_kt,
        ground_speed_kt: gs,
        gradient_ft_per_nm: gradient,
        min_rate_fpm,
        rate_margin: if min_rate_fpm > 0.0 {
            rate_fpm / min_rate_fpm - 1.0
        } else if rate_fpm > 0.0 {
            f64::INFINITY
        } else {
            -1.0
        },
        required_gradient_ft_per_nm,
        gradient_margin: required_gradient_ft_per_nm.map(|g| gradient / g - 1.0),
    }
}
