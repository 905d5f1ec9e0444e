//! Pilots (`pilots.json`): category, endorsements and written limitations.

use chrono::NaiveDate;
use serde::{Deserialize, Serialize};

/// `pilots.json` as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PilotsFile {
    /// File format version; this build reads 1.
    pub schema_version: u32,
    /// Set by `rhoboard init`: the file still holds fictional demo values to replace.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub replace_before_use: Option<String>,
    /// The pilots.
    pub pilots: Vec<Pilot>,
}

/// A pilot category: whose minimums apply.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Category {
    /// A student flying solo under an instructor's endorsement.
    StudentSolo,
    /// A licensed pilot flying solo (club or rental).
    Solo,
    /// Instructor and student together.
    Dual,
    /// Commercial passenger flight.
    Charter,
}

impl Category {
    /// Every category, strictest first.
    pub const ALL: [Category; 4] = [
        Category::StudentSolo,
        Category::Charter,
        Category::Solo,
        Category::Dual,
    ];

    /// The JSON name.
    pub const fn name(self) -> &'static str {
        match self {
            Category::StudentSolo => "student_solo",
            Category::Solo => "solo",
            Category::Dual => "dual",
            Category::Charter => "charter",
        }
    }

    /// In words, as tables and sentences show it: `student solo`.
    pub const fn words(self) -> &'static str {
        match self {
            Category::StudentSolo => "student solo",
            c => c.name(),
        }
    }
}

/// One pilot.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Pilot {
    /// Identifier used by legs.
    pub id: String,
    /// Name.
    pub name: String,
    /// The pilot's usual category.
    pub category: Category,
    /// Endorsements (students).
    #[serde(default)]
    pub endorsements: Endorsements,
    /// Limitations the instructor has written; they tighten the category's minimums.
    #[serde(default)]
    pub limitations: PilotLimitations,
    /// Free text.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub remarks: String,
}

/// A dated endorsement.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Endorsement {
    /// The aircraft type id it is for (make and model).
    pub type_id: String,
    /// Date given (YYYY-MM-DD); a solo endorsement is valid 90 days (14 CFR 61.87(n)).
    pub date: NaiveDate,
    /// Who gave it.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub instructor: String,
}

/// A student's endorsements.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Endorsements {
    /// Solo endorsements, per type.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub solo: Vec<Endorsement>,
    /// Solo cross-country endorsements.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub cross_country: Vec<Endorsement>,
    /// Solo night endorsements.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub night: Vec<Endorsement>,
}

/// Limitations written for one pilot (each optional; each only tightens).
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PilotLimitations {
    /// Maximum crosswind, kt.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub max_crosswind_kt: Option<f64>,
    /// Maximum wind, kt.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub max_wind_kt: Option<f64>,
    /// Maximum gust, kt.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub max_gust_kt: Option<f64>,
    /// Minimum ceiling, ft above the field.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub min_ceiling_ft: Option<f64>,
    /// Minimum visibility, m.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub min_visibility_m: Option<f64>,
    /// Maximum density altitude, ft.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub max_density_altitude_ft: Option<f64>,
    /// Airfields the pilot may use (empty: any).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub airfields: Vec<String>,
    /// What the instructor wrote.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub note: String,
}
