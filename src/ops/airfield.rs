//! Airfields (`airfields/<id>.json`) and their runway ends.

use serde::{Deserialize, Serialize};

/// One airfield file as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Airfield {
    /// File format version; this build reads 1.
    pub schema_version: u32,
    /// Set by `rhoboard init`: the file still holds fictional demo values to replace.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub replace_before_use: Option<String>,
    /// Identifier (the METAR station id), equal to the file name without `.json`.
    pub id: String,
    /// Display name.
    pub name: String,
    /// Field elevation, ft above mean sea level.
    pub elevation_ft: f64,
    /// Latitude, degrees north positive.
    pub latitude_deg: f64,
    /// Longitude, degrees east positive.
    pub longitude_deg: f64,
    /// Magnetic variation, degrees east positive (magnetic = true − variation).
    pub magnetic_variation_deg: f64,
    /// The end to use in calm wind, by designator.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub preferential_end: Option<String>,
    /// The runway ends.
    pub runway_ends: Vec<RunwayEnd>,
    /// Free text.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub remarks: String,
}

/// Runway surface.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Surface {
    /// Asphalt or concrete.
    Paved,
    /// Grass.
    Grass,
}

/// Runway condition.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Condition {
    /// Dry.
    #[default]
    Dry,
    /// Wet.
    Wet,
}

/// A required climb gradient for a departure (obstacles, a published procedure).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ClimbGradient {
    /// Required gradient, ft per NM.
    pub ft_per_nm: f64,
    /// What it is for.
    pub note: String,
}

/// A departure from an intersection, with its own distances.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Intersection {
    /// Taxiway or intersection name.
    pub name: String,
    /// Take-off run available from it, m.
    pub tora_m: f64,
    /// Take-off distance available from it, m.
    pub toda_m: f64,
    /// Accelerate-stop distance available from it, m.
    pub asda_m: f64,
}

/// One runway end (the direction of travel).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RunwayEnd {
    /// Designator, e.g. `27`, `09L`.
    pub designator: String,
    /// True heading of travel, degrees.
    pub true_heading_deg: f64,
    /// Take-off run available, m.
    pub tora_m: f64,
    /// Take-off distance available, m.
    pub toda_m: f64,
    /// Accelerate-stop distance available, m.
    pub asda_m: f64,
    /// Landing distance available, m.
    pub lda_m: f64,
    /// `paved` or `grass`.
    pub surface: Surface,
    /// Default condition (`dry` unless set).
    #[serde(default)]
    pub condition: Condition,
    /// Slope, percent, positive uphill in the direction of travel.
    #[serde(default)]
    pub slope_percent: f64,
    /// Required climb gradient for the departure, if any.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub required_climb_gradient: Option<ClimbGradient>,
    /// Intersection departures.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub intersections: Vec<Intersection>,
}

impl RunwayEnd {
    /// The runway number of the designator (`09L` → 9), if it has one.
    pub fn number(&self) -> Option<u32> {
        let digits: String = self
            .designator
            .chars()
            .take_while(|c| c.is_ascii_digit())
            .collect();
        let rest = &self.designator[digits.len()..];
        if digits.is_empty() || digits.len() > 2 || !matches!(rest, "" | "L" | "R" | "C") {
            return None;
        }
        digits.parse().ok().filter(|n| (1..=36).contains(n))
    }
}
