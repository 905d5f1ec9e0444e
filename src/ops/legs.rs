//! The planned legs of a day (`legs/<YYYY-MM-DD>.json`, named by the UTC date of departure).

use chrono::{DateTime, FixedOffset, NaiveDate, Utc};
use serde::{Deserialize, Serialize};

use super::pilots::Category;

/// One day's legs file as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LegsFile {
    /// File format version; this build reads 1.
    pub schema_version: u32,
    /// Set by `rhoboard init`: the file still holds fictional demo values to replace.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub replace_before_use: Option<String>,
    /// The UTC date of departure of every leg; equal to the file name.
    pub date: NaiveDate,
    /// The legs.
    pub legs: Vec<Leg>,
}

/// One planned leg.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Leg {
    /// Identifier, unique across the operator's legs.
    pub id: String,
    /// Planned departure, RFC 3339 (UTC `Z`, or an explicit offset).
    pub departs_at: DateTime<FixedOffset>,
    /// Planned arrival, RFC 3339.
    pub arrives_at: DateTime<FixedOffset>,
    /// Aircraft registration.
    pub aircraft: String,
    /// Pilot id (`pilots.json`).
    pub pilot: String,
    /// The category the leg is flown under.
    pub category: Category,
    /// Departure airfield id.
    pub from: String,
    /// Destination airfield id.
    pub to: String,
    /// Takeoff mass, kg (give this or `loads`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub takeoff_mass_kg: Option<f64>,
    /// Landing mass, kg (with `takeoff_mass_kg`; defaults to the takeoff mass).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub landing_mass_kg: Option<f64>,
    /// Loads by station (mass-and-balance; give this or `takeoff_mass_kg`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub loads: Option<Loads>,
    /// Free text.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub remarks: String,
}

impl Leg {
    /// Departure time in UTC.
    pub fn departs_utc(&self) -> DateTime<Utc> {
        self.departs_at.with_timezone(&Utc)
    }

    /// Arrival time in UTC.
    pub fn arrives_utc(&self) -> DateTime<Utc> {
        self.arrives_at.with_timezone(&Utc)
    }
}

/// A leg's loads: people and baggage by station, and the fuel.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Loads {
    /// People and baggage by loading station.
    pub stations: Vec<StationLoad>,
    /// Fuel at engine start, litres (give exactly one of the three fuel fields).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub fuel_at_start_l: Option<f64>,
    /// Fuel at engine start, US gallons.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub fuel_at_start_usgal: Option<f64>,
    /// Fuel at engine start, kg.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub fuel_at_start_kg: Option<f64>,
    /// Taxi and run-up fuel, litres.
    #[serde(default)]
    pub taxi_fuel_l: f64,
    /// Planned burn, litres per hour (times the planned flight time).
    pub burn_l_per_h: f64,
}

/// What is loaded at one station: a stated mass, people at the operator's standard
/// masses, or both (added).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StationLoad {
    /// Station id from the type's mass-and-balance data.
    pub station: String,
    /// Stated mass, kg (people weighed or declared, baggage weighed).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mass_kg: Option<f64>,
    /// Adults at the operator's standard adult mass.
    #[serde(default, skip_serializing_if = "is_zero")]
    pub standard_adults: u32,
    /// Children at the operator's standard child mass.
    #[serde(default, skip_serializing_if = "is_zero")]
    pub standard_children: u32,
    /// Free text (who or what).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub note: String,
}

fn is_zero(n: &u32) -> bool {
    *n == 0
}
