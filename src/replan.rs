//! Re-planning a leg: edits (aircraft, departure time, route, pilot, loads, fuel,
//! cancel, copy), applied to an in-memory copy of the operator's legs and re-assessed
//! before anything is written; and the safe save of a day's legs file — a temporary
//! file in the same folder, synced, renamed over the original, the previous version kept
//! as a hidden backup, and never over a file that changed on disk since it was read
//! (detected by content hash, not modification time). The save changes only the spans
//! of the values that changed (`json_edit`): key order, spacing and number style of
//! the rest of the file are the operator's and stay.

use std::io::Write as _;
use std::path::{Path, PathBuf};

use chrono::{DateTime, FixedOffset};
use sha2::{Digest, Sha256};

use crate::ops::legs::{LegsFile, StationLoad};
use crate::ops::load::{Collector, Diagnostic, OpsFiles};
use crate::ops::{Leg, Ops};

mod json_edit;
pub use json_edit::edit_in_place;

/// One change to a leg.
#[derive(Debug, Clone, PartialEq)]
pub enum Edit {
    /// Another aircraft.
    Aircraft(String),
    /// Another departure time; the planned duration is kept.
    Departs(DateTime<FixedOffset>),
    /// Another departure airfield.
    From(String),
    /// Another destination.
    To(String),
    /// Another pilot.
    Pilot(String),
    /// Set a station's load: a stated mass (kg) and/or standard adults.
    Load {
        /// Station id.
        station: String,
        /// Stated mass, kg.
        mass_kg: Option<f64>,
        /// Standard adults.
        adults: u32,
    },
    /// Empty a station.
    Unload(String),
    /// Fuel at engine start, litres.
    FuelL(f64),
    /// A fixed takeoff mass, kg (legs without loads).
    TakeoffMass(f64),
}

/// Why an edit cannot be applied.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum EditError {
    /// A load edit on a leg that gives a fixed mass.
    #[error("leg {0} gives a fixed takeoff mass, not loads; set --takeoff-mass instead")]
    NoLoads(String),
    /// A fixed-mass edit on a leg with loads.
    #[error("leg {0} gives loads; change the loads or the fuel instead of the mass")]
    HasLoads(String),
    /// Emptying a station the leg has nothing at (a mistyped station id, or one already
    /// empty): nothing would change, and saying nothing would read as done.
    #[error("leg {leg} has nothing at '{station}' to take off (loaded: {loaded})")]
    NotLoaded {
        /// The leg.
        leg: String,
        /// The station asked for.
        station: String,
        /// The stations the leg loads, comma-separated.
        loaded: String,
    },
}

/// Applies one edit to a leg.
pub fn apply(leg: &mut Leg, edit: &Edit) -> Result<(), EditError> {
    match edit {
        Edit::Aircraft(r) => leg.aircraft = r.clone(),
        Edit::Departs(t) => {
            let duration = leg.arrives_at - leg.departs_at;
            leg.departs_at = *t;
            leg.arrives_at = *t + duration;
        }
        Edit::From(f) => leg.from = f.clone(),
        Edit::To(f) => leg.to = f.clone(),
        Edit::Pilot(p) => leg.pilot = p.clone(),
        Edit::Load {
            station,
            mass_kg,
            adults,
        } => {
            let loads = leg
                .loads
                .as_mut()
                .ok_or_else(|| EditError::NoLoads(leg.id.clone()))?;
            loads.stations.retain(|s| &s.station != station);
            loads.stations.push(StationLoad {
                station: station.clone(),
                mass_kg: *mass_kg,
                standard_adults: *adults,
                standard_children: 0,
                note: String::new(),
            });
        }
        Edit::Unload(station) => {
            let loads = leg
                .loads
                .as_mut()
                .ok_or_else(|| EditError::NoLoads(leg.id.clone()))?;
            if !loads.stations.iter().any(|s| &s.station == station) {
                let loaded: Vec<&str> = loads.stations.iter().map(|s| s.station.as_str()).collect();
                return Err(EditError::NotLoaded {
                    leg: leg.id.clone(),
                    station: station.clone(),
                    loaded: if loaded.is_empty() {
                        "nothing".to_string()
                    } else {
                        loaded.join(", ")
                    },
                });
            }
            loads.stations.retain(|s| &s.station != station);
        }
        Edit::FuelL(l) => {
            let loads = leg
                .loads
                .as_mut()
                .ok_or_else(|| EditError::NoLoads(leg.id.clone()))?;
            loads.fuel_at_start_l = Some(*l);
            loads.fuel_at_start_usgal = None;
            loads.fuel_at_start_kg = None;
        }
        Edit::TakeoffMass(m) => {
            if leg.loads.is_some() {
                return Err(EditError::HasLoads(leg.id.clone()));
            }
            leg.takeoff_mass_kg = Some(*m);
        }
    }
    Ok(())
}

/// What the operator-data checks say about a changed leg, before it is written.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Vetting {
    /// What `validate` would call an error and the leg did not already have: the change
    /// must not be written.
    pub refusals: Vec<String>,
    /// New warnings (the aircraft or pilot on an overlapping leg, a broken chain of
    /// positions): written only with the warning shown.
    pub warnings: Vec<String>,
}

impl Vetting {
    /// Whether the change may be written.
    pub fn allowed(&self) -> bool {
        self.refusals.is_empty()
    }
}

/// Everything `validate` says about the legs: the per-file checks (with the leg's own
/// day as the file's date) and the cross-file ones.
fn leg_diagnostics(ops: &Ops, day: chrono::NaiveDate, index: usize) -> Vec<Diagnostic> {
    let files = OpsFiles::default();
    let mut c = Collector::new(&files);
    let file = ops
        .leg_files
        .get(index)
        .map_or_else(|| format!("legs/{day}.json"), |(f, _)| f.clone());
    let lf = LegsFile {
        schema_version: crate::ops::load::SCHEMA_VERSION,
        replace_before_use: None,
        date: day,
        legs: ops.legs.get(index).cloned().into_iter().collect(),
    };
    crate::ops::validate::check_legs_file(&file, &lf, &mut c);
    crate::ops::validate::check_cross(ops, &mut c);
    let mut all = c.report.errors;
    all.extend(c.report.warnings);
    all
}

/// Checks the leg at `index` of `ops` changed to `changed`, the way `validate` would:
/// an error the change brings in (an aircraft in maintenance, a loading station its
/// type does not have, the aircraft on two legs at once, a departure moved to another
/// day…) is a refusal; a new warning is passed on. Shared by `leg set` and the board.
pub fn vet(ops: &Ops, index: usize, changed: &Leg) -> Vetting {
    let Some(old) = ops.legs.get(index) else {
        return Vetting {
            refusals: vec![format!("no leg at position {index}")],
            warnings: Vec::new(),
        };
    };
    let day = old.departs_utc().date_naive();
    let before = leg_diagnostics(ops, day, index);
    let mut after_ops = ops.clone();
    after_ops.legs[index] = changed.clone();
    let after = leg_diagnostics(&after_ops, day, index);
    brought_in(&before, &after)
}

/// Checks a leg added to `ops` (a copy made on the board's what-if) as `validate`
/// would once it is in `file`, the day legs file of `day`: what it brings in that `ops`
/// did not already have is refused or warned about, as [`vet`] does for a change.
pub fn vet_added(ops: &Ops, file: &str, day: chrono::NaiveDate, added: &Leg) -> Vetting {
    let files = OpsFiles::default();
    let mut c = Collector::new(&files);
    crate::ops::validate::check_cross(ops, &mut c);
    let mut before = c.report.errors;
    before.extend(c.report.warnings);
    let mut after_ops = ops.clone();
    let in_file = ops.leg_files.iter().filter(|(f, _)| f == file).count();
    after_ops.legs.push(added.clone());
    after_ops.leg_files.push((file.to_string(), in_file));
    let after = leg_diagnostics(&after_ops, day, after_ops.legs.len() - 1);
    brought_in(&before, &after)
}

/// The diagnostics of `after` that `before` did not have: errors refused, warnings passed on.
fn brought_in(before: &[Diagnostic], after: &[Diagnostic]) -> Vetting {
    let mut v = Vetting::default();
    // Matched on file, field and message: the positions are those of the file on disk.
    let key = |d: &Diagnostic| {
        (
            d.severity,
            d.file.clone(),
            d.path.clone(),
            d.message.clone(),
        )
    };
    let old: std::collections::HashSet<_> = before.iter().map(key).collect();
    for d in after.iter().filter(|d| !old.contains(&key(d))) {
        let text = format!("{} {}: {}", d.file, d.path, d.message);
        match d.severity {
            crate::ops::Severity::Error => v.refusals.push(text),
            crate::ops::Severity::Warning => v.warnings.push(text),
        }
    }
    v
}

/// SHA-256 of a file's text, hex.
pub fn content_hash(text: &str) -> String {
    let digest = Sha256::digest(text.as_bytes());
    digest.iter().map(|b| format!("{b:02x}")).collect()
}

/// What a save did.
#[derive(Debug, Clone, PartialEq)]
pub enum Saved {
    /// Written; the previous version kept at `backup`.
    Written {
        /// The hidden backup of the previous version.
        backup: PathBuf,
        /// The new content's hash (the base for the next save).
        hash: String,
    },
    /// The file changed on disk since it was read: nothing written.
    Conflict {
        /// The file's text on disk now.
        on_disk: String,
    },
    /// The legs are the same as on disk: nothing written.
    Unchanged,
}

/// Saves a day's legs file at `path`, only if its content still hashes to `expected_hash`.
pub fn save_legs(path: &Path, expected_hash: &str, file: &LegsFile) -> std::io::Result<Saved> {
    let now = std::fs::read_to_string(path)?;
    if content_hash(&now) != expected_hash {
        return Ok(Saved::Conflict { on_disk: now });
    }
    if serde_json::from_str::<LegsFile>(&now).is_ok_and(|old| &old == file) {
        return Ok(Saved::Unchanged);
    }
    // Only what changed: every other byte of the operator's file stays as it was. A
    // file that cannot be edited faithfully in place is written whole, as before.
    let text = match edit_in_place(&now, file) {
        Some(t) => t,
        None => serde_json::to_string_pretty(file).map_err(std::io::Error::other)? + "\n",
    };
    let dir = path.parent().unwrap_or(Path::new("."));
    let name = path
        .file_name()
        .and_then(|n| n.to_str())
        .unwrap_or("legs.json");
    // One backup per version replaced, named by its content hash: a second save never
    // overwrites the backup of the original.
    let backup = dir.join(format!(
        ".{name}.{}.bak",
        &expected_hash[..expected_hash.len().min(12)]
    ));
    let tmp = dir.join(format!(".{name}.tmp-{}", std::process::id()));
    {
        let mut f = std::fs::File::create(&tmp)?;
        f.write_all(text.as_bytes())?;
        f.sync_all()?;
    }
    std::fs::write(&backup, &now)?;
    // The rename is the commit point: a crash before it leaves the old file, after it
    // the new one; never a half-written file.
    std::fs::rename(&tmp, path)?;
    if let Ok(d) = std::fs::File::open(dir) {
        let _ = d.sync_all();
    }
    Ok(Saved::Written {
        backup,
        hash: content_hash(&text),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_file_changed_on_disk_is_never_overwritten() {
        let dir = std::env::temp_dir().join(format!("rhoboard-replan-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let path = dir.join("2026-06-14.json");
        let original = crate::ops::demo::FILES
            .iter()
            .find(|(p, _)| p.starts_with("legs/"))
            .unwrap()
            .1;
        std::fs::write(&path, original).unwrap();
        let hash = content_hash(original);
        let mut file: LegsFile = serde_json::from_str(original).unwrap();
        apply(&mut file.legs[0], &Edit::Pilot("ins-mara".into())).unwrap();
        // Someone else edits the file in between.
        let theirs = original.replace("Circuits, first solo consolidation", "Circuits (moved)");
        std::fs::write(&path, &theirs).unwrap();
        match save_legs(&path, &hash, &file).unwrap() {
            Saved::Conflict { on_disk } => assert_eq!(on_disk, theirs),
            other => panic!("{other:?}"),
        }
        assert_eq!(
            std::fs::read_to_string(&path).unwrap(),
            theirs,
            "nothing lost"
        );
        // Against the current hash it writes, keeping a backup of what was there.
        let saved = save_legs(&path, &content_hash(&theirs), &file).unwrap();
        let Saved::Written { backup, .. } = saved else {
            panic!()
        };
        assert_eq!(std::fs::read_to_string(&backup).unwrap(), theirs);
        let back: LegsFile =
            serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
        assert_eq!(back.legs[0].pilot, "ins-mara");
        let _ = std::fs::remove_dir_all(&dir);
    }

    #[test]
    fn edits() {
        let ops = crate::ops::demo::load().ops.unwrap();
        let mut l = ops.legs.iter().find(|l| l.id == "L16").unwrap().clone();
        let duration = l.arrives_at - l.departs_at;
        let t = DateTime::parse_from_rfc3339("2026-06-14T08:00:00Z").unwrap();
        apply(&mut l, &Edit::Departs(t)).unwrap();
        assert_eq!(l.departs_at, t);
        assert_eq!(l.arrives_at - l.departs_at, duration);
        apply(&mut l, &Edit::Unload("rear_seats".into())).unwrap();
        assert!(
            l.loads
                .as_ref()
                .unwrap()
                .stations
                .iter()
                .all(|s| s.station != "rear_seats")
        );
        assert_eq!(
            apply(&mut l, &Edit::TakeoffMass(1500.0)),
            Err(EditError::HasLoads("L16".into()))
        );
    }
}
