//! Aircraft types (`fleet/types/<id>.json`): limits, speeds, the flight manual's
//! performance tables and correction rules, mass-and-balance data, and where the
//! numbers came from.

use serde::{Deserialize, Serialize};

use super::tables::{Cell, Grid, OutsideTable, Table};

/// One aircraft type file as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct AircraftTypeFile {
    /// File format version; this build reads 1.
    pub schema_version: u32,
    /// Set by `rhoboard init`: the file still holds fictional demo values to replace.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub replace_before_use: Option<String>,
    /// Identifier, equal to the file name without `.json`.
    pub id: String,
    /// Display name.
    pub name: String,
    /// Number of engines.
    pub engines: u32,
    /// Seats, including the pilot's.
    pub seats: u32,
    /// Mass and wind limits.
    pub limits: Limits,
    /// Indicated airspeeds from the manual.
    pub speeds: Speeds,
    /// Where the data came from.
    pub source: DataSource,
    /// The performance tables.
    pub performance: PerformanceFile,
    /// The manual's correction rules.
    #[serde(default)]
    pub corrections: Corrections,
    /// Mass-and-balance data (loading stations, tanks, CG envelope).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub mass_balance: Option<MassBalance>,
    /// Free text.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub remarks: String,
}

/// Mass and wind limits.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Limits {
    /// Maximum takeoff mass, kg.
    pub max_takeoff_mass_kg: f64,
    /// Maximum landing mass, kg.
    pub max_landing_mass_kg: f64,
    /// Maximum demonstrated crosswind, kt.
    pub max_demonstrated_crosswind_kt: f64,
}

/// Indicated airspeeds from the manual, kt.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Speeds {
    /// Rotation speed.
    pub rotation_kias: f64,
    /// Best angle of climb speed.
    pub vx_kias: f64,
    /// Best rate of climb speed (the climb table's speed).
    pub vy_kias: f64,
    /// Final approach speed.
    pub approach_kias: f64,
}

/// Where the data came from; shown wherever the numbers are used.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct DataSource {
    /// The flight manual (or other document) and its identification.
    pub document: String,
    /// Its revision.
    pub revision: String,
    /// Who typed the data in.
    pub entered_by: String,
    /// Who checked it against the document.
    pub checked_by: String,
    /// When it was entered or last checked (YYYY-MM-DD).
    pub date: chrono::NaiveDate,
}

/// The performance section: one grid, five tables on it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PerformanceFile {
    /// The axes shared by every table of this type.
    pub axes: AxesFile,
    /// Takeoff figures.
    pub takeoff: TakeoffFile,
    /// Landing figures.
    pub landing: LandingFile,
    /// Climb figures.
    pub climb: ClimbFile,
}

/// Axis values as written.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct AxesFile {
    /// Masses, kg, strictly increasing.
    pub mass_kg: Vec<f64>,
    /// Pressure altitudes, ft, strictly increasing.
    pub pressure_altitude_ft: Vec<f64>,
    /// Outside air temperatures, °C, strictly increasing.
    pub oat_c: Vec<f64>,
}

/// A nested table as written: `[mass][pressure altitude][oat]`.
pub type Nested = Vec<Vec<Vec<f64>>>;

/// Takeoff tables (flaps and technique as the manual's conditions say).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct TakeoffFile {
    /// The manual's stated conditions (flaps, technique, surface).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub conditions: String,
    /// Ground roll, m.
    pub ground_roll_m: Nested,
    /// Distance to clear 50 ft, m.
    pub distance_50ft_m: Nested,
    /// Reason the tables may be irregular.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub irregular_ok: Option<String>,
}

/// Landing tables.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LandingFile {
    /// The manual's stated conditions.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub conditions: String,
    /// Distance from 50 ft to a stop, m.
    pub distance_50ft_m: Nested,
    /// Ground roll, m.
    pub ground_roll_m: Nested,
    /// Reason the tables may be irregular.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub irregular_ok: Option<String>,
}

/// Climb table.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct ClimbFile {
    /// The manual's stated conditions.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub conditions: String,
    /// Indicated climb speed the table is for, kt.
    pub climb_speed_kias: f64,
    /// Rate of climb, ft/min.
    pub rate_fpm: Nested,
    /// Reason the table may be irregular.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub irregular_ok: Option<String>,
}

/// A surface correction as the manual states it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields, rename_all = "snake_case")]
pub enum SurfaceRule {
    /// Multiply both the ground roll and the 50 ft distance by this factor.
    MultiplyBy(f64),
    /// Add this percentage of the ground roll to both figures.
    AddPercentOfGroundRoll(f64),
}

impl SurfaceRule {
    /// Applies the rule to (ground roll, distance to/from 50 ft), both m.
    pub fn apply(self, ground_roll_m: f64, distance_50ft_m: f64) -> (f64, f64) {
        match self {
            SurfaceRule::MultiplyBy(f) => (ground_roll_m * f, distance_50ft_m * f),
            SurfaceRule::AddPercentOfGroundRoll(p) => {
                let add = ground_roll_m * p / 100.0;
                (ground_roll_m + add, distance_50ft_m + add)
            }
        }
    }
}

/// The manual's correction rules for takeoff or landing; each optional (silent manual:
/// the operator's fallback factor applies).
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PhaseCorrections {
    /// Decrease distances by this percentage per knot of headwind.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub headwind_decrease_percent_per_kt: Option<f64>,
    /// Increase distances by this percentage per knot of tailwind.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub tailwind_increase_percent_per_kt: Option<f64>,
    /// True when the manual's wind figures already include the 50 % headwind /
    /// 150 % tailwind factoring, so the policy must not apply it again.
    #[serde(default)]
    pub wind_factoring_included: bool,
    /// Dry grass.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub grass_dry: Option<SurfaceRule>,
    /// Wet grass.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub grass_wet: Option<SurfaceRule>,
    /// Wet paved.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub paved_wet: Option<SurfaceRule>,
    /// Increase distances by this percentage per 1 % of adverse slope (uphill for
    /// takeoff, downhill for landing).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub adverse_slope_increase_percent_per_percent: Option<f64>,
    /// Soft ground (grass).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub grass_soft: Option<SurfaceRule>,
    /// Long grass.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub grass_long: Option<SurfaceRule>,
}

/// The manual's correction rules.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Corrections {
    /// Takeoff corrections.
    #[serde(default)]
    pub takeoff: PhaseCorrections,
    /// Landing corrections.
    #[serde(default)]
    pub landing: PhaseCorrections,
}

/// Mass-and-balance data. Arms are in millimetres aft of the manual's datum.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct MassBalance {
    /// Loading stations (seats, baggage areas).
    pub stations: Vec<Station>,
    /// Fuel tanks.
    pub fuel_tanks: Vec<FuelTank>,
    /// The CG envelope, a polygon of (mass, arm) vertices in order; closed implicitly.
    pub envelope: Vec<EnvelopePoint>,
}

/// A loading station.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Station {
    /// Identifier used by legs' loads.
    pub id: String,
    /// Display name.
    pub name: String,
    /// Arm, mm aft of datum.
    pub arm_mm: f64,
    /// Maximum load, kg.
    pub max_mass_kg: f64,
    /// Seats at this station (0 for a baggage area).
    #[serde(default)]
    pub seats: u32,
}

/// A fuel tank.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FuelTank {
    /// Identifier.
    pub id: String,
    /// Arm, mm aft of datum.
    pub arm_mm: f64,
    /// Usable capacity, litres.
    pub usable_capacity_l: f64,
    /// Fuel density, kg per litre (avgas about 0.72: 6.0 lb/US gal, FAA).
    pub fuel_density_kg_per_l: f64,
}

/// A vertex of the CG envelope.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct EnvelopePoint {
    /// Mass, kg.
    pub mass_kg: f64,
    /// CG arm, mm aft of datum.
    pub arm_mm: f64,
}

/// The built performance tables of a type: one grid, five tables.
#[derive(Debug, Clone, PartialEq)]
pub struct Performance {
    /// The shared axes.
    pub grid: Grid,
    /// Takeoff ground roll, m.
    pub takeoff_ground_roll_m: Table,
    /// Takeoff distance to 50 ft, m.
    pub takeoff_distance_50ft_m: Table,
    /// Landing distance from 50 ft, m.
    pub landing_distance_50ft_m: Table,
    /// Landing ground roll, m.
    pub landing_ground_roll_m: Table,
    /// Rate of climb at the climb speed, ft/min.
    pub climb_rate_fpm: Table,
}

/// The five table values at one point.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PerformanceAt {
    /// Takeoff ground roll, m.
    pub takeoff_ground_roll_m: f64,
    /// Takeoff distance to 50 ft, m.
    pub takeoff_distance_50ft_m: f64,
    /// Landing distance from 50 ft, m.
    pub landing_distance_50ft_m: f64,
    /// Landing ground roll, m.
    pub landing_ground_roll_m: f64,
    /// Rate of climb, ft/min.
    pub climb_rate_fpm: f64,
}

impl Performance {
    /// Locates a point once; read any of the five tables with the returned cell.
    #[inline]
    pub fn locate(
        &self,
        mass_kg: f64,
        pressure_altitude_ft: f64,
        oat_c: f64,
    ) -> Result<Cell, OutsideTable> {
        self.grid.locate(mass_kg, pressure_altitude_ft, oat_c)
    }

    /// All five values at a located cell.
    #[inline]
    pub fn at(&self, cell: &Cell) -> PerformanceAt {
        PerformanceAt {
            takeoff_ground_roll_m: self.takeoff_ground_roll_m.at(cell),
            takeoff_distance_50ft_m: self.takeoff_distance_50ft_m.at(cell),
            landing_distance_50ft_m: self.landing_distance_50ft_m.at(cell),
            landing_ground_roll_m: self.landing_ground_roll_m.at(cell),
            climb_rate_fpm: self.climb_rate_fpm.at(cell),
        }
    }

    /// Builds the tables from the file's section; errors name the table's field path.
    pub fn from_file(p: &PerformanceFile) -> Result<Performance, (String, String)> {
        let grid = Grid::new(
            p.axes.mass_kg.clone(),
            p.axes.pressure_altitude_ft.clone(),
            p.axes.oat_c.clone(),
        )
        .map_err(|e| {
            let field = match &e {
                super::tables::GridError::Empty(a) | super::tables::GridError::NotFinite(a) => {
                    format!("performance.axes.{}", a.field())
                }
                super::tables::GridError::NotIncreasing { axis, index, .. } => {
                    format!("performance.axes.{}[{index}]", axis.field())
                }
                super::tables::GridError::TooLarge(_) => "performance.axes".to_string(),
            };
            (field, e.to_string())
        })?;
        let build = |name: &str, n: &Nested| {
            Table::from_nested(&grid, n).map_err(|e| {
                let at = match &e {
                    super::tables::TableError::Shape { at, .. }
                    | super::tables::TableError::NotFinite { at } => at.clone(),
                };
                (format!("performance.{name}{at}"), e.to_string())
            })
        };
        Ok(Performance {
            takeoff_ground_roll_m: build("takeoff.ground_roll_m", &p.takeoff.ground_roll_m)?,
            takeoff_distance_50ft_m: build("takeoff.distance_50ft_m", &p.takeoff.distance_50ft_m)?,
            landing_distance_50ft_m: build("landing.distance_50ft_m", &p.landing.distance_50ft_m)?,
            landing_ground_roll_m: build("landing.ground_roll_m", &p.landing.ground_roll_m)?,
            climb_rate_fpm: build("climb.rate_fpm", &p.climb.rate_fpm)?,
            grid,
        })
    }
}

/// A loaded aircraft type: the file plus its built tables.
#[derive(Debug, Clone, PartialEq)]
pub struct AircraftType {
    /// The file as written.
    pub file: AircraftTypeFile,
    /// Built tables for lookups.
    pub performance: Performance,
}

impl AircraftType {
    /// Builds the tables of a type file; the error is (field path, message).
    pub fn new(file: AircraftTypeFile) -> Result<AircraftType, (String, String)> {
        let performance = Performance::from_file(&file.performance)?;
        Ok(AircraftType { file, performance })
    }
}
