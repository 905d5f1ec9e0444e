//! The operator's data: aircraft types with their performance tables, the aircraft,
//! pilots, airfields, the day's legs and the operator's minimums — their file formats,
//! loading and validation, and the built-in fictional demo operator.
//!
//! Loading never panics: every problem becomes a [`Diagnostic`] with file, field path,
//! line and column ([`load_files`], [`load_dir`]). The assessment works on [`Ops`],
//! which exists only when there were no errors.

pub mod actype;
pub mod airfield;
pub mod config;
pub mod demo;
pub mod demo_day;
pub mod demo_gen;
pub mod fleet;
pub mod legs;
pub mod load;
pub mod operator;
pub mod pilots;
pub mod runway_state;
pub mod spans;
pub mod synthetic;
pub mod tables;
pub mod validate;

use std::collections::HashMap;
use std::path::Path;

pub use actype::{AircraftType, AircraftTypeFile, Performance, PerformanceAt};
pub use airfield::{Airfield, RunwayEnd, Surface};
pub use fleet::{Aircraft, AircraftFile, Status};
pub use legs::{Leg, LegsFile};
pub use load::{Diagnostic, Loaded, OpsFiles, Report, Severity, load_files};
pub use operator::{Minimums, OperatorFile};
pub use pilots::{Category, Pilot, PilotsFile};
pub use tables::{Axis, Cell, Clamped, Grid, OutsideTable, Table};

/// A loaded, checked operator. Lists keep file order; lookups by id are hashed.
#[derive(Debug, Clone)]
pub struct Ops {
    /// `operator.json`.
    pub operator: OperatorFile,
    /// `pilots.json`.
    pub pilots: Vec<Pilot>,
    /// `fleet/aircraft.json`.
    pub aircraft: Vec<Aircraft>,
    /// `fleet/types/*.json`, in file-name order.
    pub types: Vec<AircraftType>,
    /// `airfields/*.json`, in file-name order.
    pub airfields: Vec<Airfield>,
    /// Every leg of every `legs/*.json`, in file then file order.
    pub legs: Vec<Leg>,
    /// Observation and forecast texts: (relative path, text).
    pub observations: Vec<(String, String)>,
    /// `runway-state/*.json`: the runway state of each day that has one.
    pub runway_states: Vec<runway_state::RunwayStateFile>,
    /// Where each type came from (relative path), parallel to `types`.
    pub type_files: Vec<String>,
    /// Where each airfield came from, parallel to `airfields`.
    pub airfield_files: Vec<String>,
    /// Where each leg came from: (relative path, index in that file's `legs`).
    pub leg_files: Vec<(String, usize)>,
    type_index: HashMap<String, usize>,
    aircraft_index: HashMap<String, usize>,
    pilot_index: HashMap<String, usize>,
    airfield_index: HashMap<String, usize>,
}

impl Ops {
    /// Assembles an operator from already-parsed files, without validation (for
    /// generated operators, e.g. benchmarks; folders go through [`load_files`]). Each
    /// type, airfield and legs file comes with the relative path it is named by.
    pub fn new(
        operator: OperatorFile,
        pilots: pilots::PilotsFile,
        aircraft: fleet::AircraftFile,
        types: Vec<(String, AircraftType)>,
        airfields: Vec<(String, Airfield)>,
        legs: Vec<(String, legs::LegsFile)>,
        observations: Vec<(String, String)>,
    ) -> Ops {
        // First occurrence wins; duplicates are reported by validation.
        fn index<T>(items: &[T], id: impl Fn(&T) -> &str) -> HashMap<String, usize> {
            let mut m = HashMap::with_capacity(items.len());
            for (i, t) in items.iter().enumerate() {
                m.entry(id(t).to_string()).or_insert(i);
            }
            m
        }
        let (type_files, types): (Vec<_>, Vec<_>) = types.into_iter().unzip();
        let (airfield_files, airfields): (Vec<_>, Vec<_>) = airfields.into_iter().unzip();
        let mut leg_files = Vec::new();
        let mut all_legs = Vec::new();
        for (file, lf) in legs {
            for (i, leg) in lf.legs.into_iter().enumerate() {
                leg_files.push((file.clone(), i));
                all_legs.push(leg);
            }
        }
        Ops {
            type_index: index(&types, |t: &AircraftType| &t.file.id),
            aircraft_index: index(&aircraft.aircraft, |a: &Aircraft| &a.registration),
            pilot_index: index(&pilots.pilots, |p: &Pilot| &p.id),
            airfield_index: index(&airfields, |a: &Airfield| &a.id),
            operator,
            pilots: pilots.pilots,
            aircraft: aircraft.aircraft,
            types,
            airfields,
            legs: all_legs,
            observations,
            runway_states: Vec::new(),
            type_files,
            airfield_files,
            leg_files,
        }
    }

    /// The aircraft type with this id.
    pub fn aircraft_type(&self, id: &str) -> Option<&AircraftType> {
        self.type_index.get(id).map(|&i| &self.types[i])
    }

    /// Index of the aircraft type with this id in `types`.
    pub fn type_position(&self, id: &str) -> Option<usize> {
        self.type_index.get(id).copied()
    }

    /// The aircraft with this registration.
    pub fn aircraft(&self, registration: &str) -> Option<&Aircraft> {
        self.aircraft_index
            .get(registration)
            .map(|&i| &self.aircraft[i])
    }

    /// The pilot with this id.
    pub fn pilot(&self, id: &str) -> Option<&Pilot> {
        self.pilot_index.get(id).map(|&i| &self.pilots[i])
    }

    /// The UTC days the operator has legs on, earliest first, each once.
    pub fn leg_days(&self) -> Vec<chrono::NaiveDate> {
        let mut days: Vec<chrono::NaiveDate> = self
            .legs
            .iter()
            .map(|l| l.departs_utc().date_naive())
            .collect();
        days.sort_unstable();
        days.dedup();
        days
    }

    /// The airfield with this id.
    pub fn airfield(&self, id: &str) -> Option<&Airfield> {
        self.airfield_index.get(id).map(|&i| &self.airfields[i])
    }

    /// Index of the airfield with this id in `airfields`.
    pub fn airfield_position(&self, id: &str) -> Option<usize> {
        self.airfield_index.get(id).copied()
    }

    /// The minimums for a category, if the operator flies it.
    pub fn minimums(&self, category: Category) -> Option<&Minimums> {
        self.operator.categories.get(&category)
    }
}

/// Loads and checks an operator folder.
pub fn load_dir(dir: &Path) -> anyhow::Result<Loaded> {
    let (files, problems) = OpsFiles::read_dir(dir)?;
    let mut loaded = load_files(&files);
    let (errors, warnings): (Vec<_>, Vec<_>) = problems
        .into_iter()
        .partition(|d| d.severity == Severity::Error);
    if !errors.is_empty() {
        loaded.ops = None;
    }
    loaded.report.errors.splice(0..0, errors);
    loaded.report.warnings.splice(0..0, warnings);
    Ok(loaded)
}
