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

/// A leg's loads (the mass-and-balance work builds on this).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Loads {
    /// People and baggage by station.
    pub stations: Vec<StationLoad>,
    /// Fuel at engine start, litres.
    pub fuel_at_start_l: f64,
    /// Taxi fuel, litres.
    #[serde(default)]
    pub taxi_fuel_l: f64,
    /// Planned burn, litres per hour.
    pub burn_l_per_h: f64,
}

/// A load at one station.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct StationLoad {
    /// Station id from the type's mass-and-balance data.
    pub station: String,
    /// Mass, kg.
    pub mass_kg: f64,
}
