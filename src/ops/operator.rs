//! The operator (`operator.json`): name, regime, display units, time zone, the policy
//! (wind factoring, buffers, stale age, fallback correction factors) and the minimums
//! per pilot category.

use std::collections::BTreeMap;

use serde::{Deserialize, Serialize};

use super::actype::SurfaceRule;
use super::pilots::Category;

/// `operator.json` as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct OperatorFile {
    /// File format version; this build reads 1.
    pub schema_version: u32,
    /// Set by `rhoboard init`: the file still holds fictional demo values to replace.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub replace_before_use: Option<String>,
    /// Operator name.
    pub name: String,
    /// Whose regulatory floors apply (e.g. the 14 CFR 61.89 visibility floor for
    /// student solos under `faa`).
    pub regime: Regime,
    /// Units for display (files always carry their unit in the field name).
    pub display_units: DisplayUnits,
    /// The local time zone for display; times are stored in UTC.
    pub time_zone: TimeZone,
    /// Policy shared by every category.
    pub policy: Policy,
    /// Minimums per pilot category.
    pub categories: BTreeMap<Category, Minimums>,
}

/// Regulatory regime.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Regime {
    /// United States, 14 CFR.
    Faa,
    /// European Union, EASA Air Operations.
    Easa,
    /// United Kingdom CAA.
    Uk,
    /// None of the above: only the operator's own values apply.
    Other,
}

/// Distance display unit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub enum DistanceUnit {
    /// Metres.
    #[serde(rename = "m")]
    M,
    /// Feet.
    #[serde(rename = "ft")]
    Ft,
}

/// Mass display unit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub enum MassUnit {
    /// Kilograms.
    #[serde(rename = "kg")]
    Kg,
    /// Pounds.
    #[serde(rename = "lb")]
    Lb,
}

/// Pressure display unit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub enum PressureUnit {
    /// Hectopascals.
    #[serde(rename = "hPa")]
    Hpa,
    /// Inches of mercury.
    #[serde(rename = "inHg")]
    InHg,
}

/// Temperature display unit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub enum TemperatureUnit {
    /// Degrees Celsius.
    #[serde(rename = "C")]
    C,
    /// Degrees Fahrenheit.
    #[serde(rename = "F")]
    F,
}

/// Display units.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DisplayUnits {
    /// `m` or `ft`.
    pub distance: DistanceUnit,
    /// `kg` or `lb`.
    pub mass: MassUnit,
    /// `hPa` or `inHg`.
    pub pressure: PressureUnit,
    /// `C` or `F`.
    pub temperature: TemperatureUnit,
}

/// A fixed-offset local time zone for display.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TimeZone {
    /// Name shown beside local times.
    pub name: String,
    /// Offset from UTC, minutes (east positive).
    pub utc_offset_min: i32,
}

/// A factor together with where it comes from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SourcedRule {
    /// The rule.
    pub rule: SurfaceRule,
    /// Where it comes from.
    pub source: String,
}

/// A per-percent slope factor with its source.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct SourcedSlope {
    /// Increase in distance, percent, per 1 % of adverse slope.
    pub increase_percent_per_percent: f64,
    /// Where it comes from.
    pub source: String,
}

/// Fallback corrections for one phase, used where the manual is silent.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FallbackPhase {
    /// Dry grass.
    pub grass_dry: SourcedRule,
    /// Wet grass.
    pub grass_wet: SourcedRule,
    /// Wet paved.
    pub paved_wet: SourcedRule,
    /// Soft ground (grass), when the day's runway state says so.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub grass_soft: Option<SourcedRule>,
    /// Long grass, when the day's runway state says so.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub grass_long: Option<SourcedRule>,
    /// Adverse slope (uphill takeoff, downhill landing).
    pub adverse_slope: SourcedSlope,
}

/// The policy's fallback correction factors.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Fallbacks {
    /// Takeoff.
    pub takeoff: FallbackPhase,
    /// Landing.
    pub landing: FallbackPhase,
}

/// Wind factoring for performance.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct WindFactoring {
    /// Percentage of a headwind counted (at most).
    pub headwind_credit_percent: f64,
    /// Percentage of a tailwind counted (at least).
    pub tailwind_penalty_percent: f64,
    /// Where it comes from.
    pub source: String,
}

/// Thin bands: a margin inside these is `thin`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Buffers {
    /// Distances, percent of margin.
    pub distance_percent: f64,
    /// Climb, percent of margin.
    pub climb_percent: f64,
    /// Wind limits, kt.
    pub wind_kt: f64,
    /// Density altitude, ft.
    pub density_altitude_ft: f64,
    /// Ceiling, ft.
    pub ceiling_ft: f64,
    /// Visibility, m.
    pub visibility_m: f64,
    /// Where these come from.
    pub source: String,
}

/// The operator's policy, shared by every category.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Policy {
    /// A report older than this, at the time it stands for, is stale.
    pub stale_after_min: f64,
    /// Wind factoring.
    pub wind: WindFactoring,
    /// Thin bands.
    pub buffers: Buffers,
    /// Fallback corrections where the manual is silent.
    pub fallback_corrections: Fallbacks,
    /// Expected high temperature of the day at the home base, °C, if the operator gives one.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub expected_high_c: Option<f64>,
    /// Standard masses for people loaded without a stated mass.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub standard_masses: Option<StandardMasses>,
    /// Fuel that must remain at landing.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub fuel_reserve: Option<FuelReserve>,
    /// Instructor sign-offs: overrides and when a sign-off needs a re-check.
    #[serde(default)]
    pub sign_off: SignOffPolicy,
}

/// The policy for instructor sign-offs (`policy.sign_off`; every field optional).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields, default)]
pub struct SignOffPolicy {
    /// Categories whose `below` or `no-data` legs may be signed with `--override REASON`.
    /// Default: none (so never a student solo unless the operator lists it).
    pub override_categories: Vec<Category>,
    /// A sign-off needs a re-check when density altitude at either end rose by more
    /// than this, ft.
    pub recheck_density_altitude_rise_ft: f64,
    /// A sign-off needs a re-check when the headroom falls below this, °C of warming.
    pub recheck_headroom_floor_c: f64,
}

impl Default for SignOffPolicy {
    fn default() -> Self {
        SignOffPolicy {
            override_categories: Vec::new(),
            recheck_density_altitude_rise_ft: 300.0,
            recheck_headroom_floor_c: 3.0,
        }
    }
}

/// Standard masses per person, including hand baggage.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StandardMasses {
    /// An adult, kg.
    pub adult_kg: f64,
    /// A child, kg.
    pub child_kg: f64,
    /// Where the figures come from.
    pub source: String,
}

/// The fuel reserve at landing.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FuelReserve {
    /// Minutes of flight at the planned burn.
    pub minutes: f64,
    /// Where it comes from.
    pub source: String,
}

/// The reserve used when the operator gives none, minutes (conservative: the night
/// figure of 14 CFR 91.151(a)(2); by day the rule asks 30 minutes).
pub const DEFAULT_FUEL_RESERVE_MIN: f64 = 45.0;

/// Which performance figure a check uses.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Required {
    /// Ground roll.
    GroundRoll,
    /// Distance to (takeoff) or from (landing) 50 ft.
    #[serde(rename = "distance_50ft")]
    Distance50ft,
}

/// Which declared distance a check compares with.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Available {
    /// Take-off run available.
    Tora,
    /// Take-off distance available (clearway counts for at most half of TORA).
    Toda,
    /// Accelerate-stop distance available.
    Asda,
    /// Landing distance available.
    Lda,
}

/// A check `required × factor ≤ available`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DistanceCheck {
    /// The figure required.
    pub required: Required,
    /// The factor applied to it.
    pub factor: f64,
    /// The declared distance.
    pub available: Available,
    /// Where the factor comes from.
    pub source: String,
}

/// A weather hazard a category may refuse.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Hazard {
    /// Thunderstorm, or CB / TCU at or near the field.
    Thunderstorm,
    /// Freezing precipitation.
    FreezingPrecipitation,
    /// Fog.
    Fog,
    /// Reported wind shear.
    WindShear,
}

/// Minimums for one pilot category. Each limit's source is in `sources`, keyed by
/// the field name.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Minimums {
    /// Takeoff checks; the takeoff margin is the smallest.
    pub takeoff_checks: Vec<DistanceCheck>,
    /// Landing checks.
    pub landing_checks: Vec<DistanceCheck>,
    /// Extra landing factor on a wet paved runway.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub wet_paved_landing_factor: Option<f64>,
    /// Minimum rate of climb, ft/min.
    pub min_climb_rate_fpm: f64,
    /// Minimum ceiling, ft above the field.
    pub min_ceiling_ft: f64,
    /// Minimum visibility, m.
    pub min_visibility_m: f64,
    /// Maximum mean wind, kt.
    pub max_wind_kt: f64,
    /// Maximum gust, kt.
    pub max_gust_kt: f64,
    /// Maximum gust spread (gust minus mean), kt.
    pub max_gust_spread_kt: f64,
    /// Maximum crosswind component, kt.
    pub max_crosswind_kt: f64,
    /// Maximum tailwind component, kt.
    pub max_tailwind_kt: f64,
    /// Maximum density altitude, ft.
    pub max_density_altitude_ft: f64,
    /// Daylight only.
    pub daylight_only: bool,
    /// Hazards this category refuses.
    pub refuse_hazards: Vec<Hazard>,
    /// Student solos: a solo endorsement for the type, valid this many days, is required.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub solo_endorsement_valid_days: Option<u32>,
    /// Daylight categories: land at least this many minutes before sunset.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub land_before_sunset_min: Option<f64>,
    /// Daylight categories: depart no earlier than this many minutes after sunrise.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub depart_after_sunrise_min: Option<f64>,
    /// Source of each value, keyed by field name.
    pub sources: BTreeMap<String, String>,
}
