//! The operator's aircraft (`fleet/aircraft.json`).

use serde::{Deserialize, Serialize};

/// `fleet/aircraft.json` as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct AircraftFile {
    /// File format version; this build reads 1.
    pub schema_version: u32,
    /// Set by `rhoboard init`: the file still holds fictional demo values to replace.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub replace_before_use: Option<String>,
    /// The tails.
    pub aircraft: Vec<Aircraft>,
}

/// Whether an aircraft may be dispatched.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Status {
    /// Serviceable.
    Available,
    /// In maintenance; `maintenance` says why and since when.
    Maintenance,
}

/// Why and since when an aircraft is in maintenance.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MaintenanceNote {
    /// What is being done.
    pub note: String,
    /// Since when (YYYY-MM-DD).
    pub since: chrono::NaiveDate,
    /// Expected back (YYYY-MM-DD), if known.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub expected_back: Option<chrono::NaiveDate>,
}

/// One aircraft.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Aircraft {
    /// Registration (the identifier legs use).
    pub registration: String,
    /// The aircraft type's id (`fleet/types/<id>.json`).
    pub type_id: String,
    /// Empty mass from the weighing record, kg.
    pub empty_mass_kg: f64,
    /// Empty-mass CG arm from the weighing record, mm aft of datum.
    pub empty_arm_mm: f64,
    /// Date of the weighing record (YYYY-MM-DD).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub weighed_on: Option<chrono::NaiveDate>,
    /// `available` or `maintenance`.
    pub status: Status,
    /// Required when `status` is `maintenance`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub maintenance: Option<MaintenanceNote>,
    /// Free text.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub remarks: String,
}
