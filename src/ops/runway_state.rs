//! Today's runway state (`runway-state/<YYYY-MM-DD>.json`): closures, reduced declared
//! distances, the surface condition of the day and the end set in use — set from the
//! board or `rhoboard runway`, kept in the operator folder for that date.

use chrono::{DateTime, NaiveDate, Utc};
use serde::{Deserialize, Serialize};

/// The surface condition of a runway end for the day.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum DayCondition {
    /// Dry.
    Dry,
    /// Wet.
    Wet,
    /// Soft ground (grass after rain, thawing).
    SoftGround,
    /// Long grass.
    LongGrass,
    /// Standing water: a contaminated runway, outside light-aircraft manual data.
    StandingWater,
}

impl DayCondition {
    /// Words.
    pub const fn word(self) -> &'static str {
        match self {
            DayCondition::Dry => "dry",
            DayCondition::Wet => "wet",
            DayCondition::SoftGround => "soft ground",
            DayCondition::LongGrass => "long grass",
            DayCondition::StandingWater => "standing water",
        }
    }

    /// Parses the command-line word (`dry`, `wet`, `soft`, `long-grass`, `water`).
    pub fn parse(text: &str) -> Option<DayCondition> {
        match text.to_ascii_lowercase().replace('_', "-").as_str() {
            "dry" => Some(DayCondition::Dry),
            "wet" => Some(DayCondition::Wet),
            "soft" | "soft-ground" => Some(DayCondition::SoftGround),
            "long" | "long-grass" => Some(DayCondition::LongGrass),
            "water" | "standing-water" => Some(DayCondition::StandingWater),
            _ => None,
        }
    }
}

/// One change to one runway end for the day. Later entries for the same end override
/// earlier ones field by field.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct EndState {
    /// Airfield id.
    pub airfield: String,
    /// Runway end designator.
    pub end: String,
    /// Closed (from `from`, else the start of the day; until `until`, else all day).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub closed: Option<bool>,
    /// The closure starts at this time (UTC): legs before it keep the end.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub from: Option<DateTime<Utc>>,
    /// The closure ends at this time (UTC).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub until: Option<DateTime<Utc>>,
    /// Reduced take-off run available, m.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub tora_m: Option<f64>,
    /// Reduced take-off distance available, m.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub toda_m: Option<f64>,
    /// Reduced accelerate-stop distance available, m.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub asda_m: Option<f64>,
    /// Reduced landing distance available, m (a displaced threshold).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub lda_m: Option<f64>,
    /// Surface condition for the day.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub condition: Option<DayCondition>,
    /// This end is the one in use for the day.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub in_use: Option<bool>,
    /// Why (works, rain overnight, …).
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub note: String,
    /// Who set it and when.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub set_by: String,
}

/// `runway-state/<date>.json`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RunwayStateFile {
    /// File format version; this build reads 1.
    pub schema_version: u32,
    /// The UTC date it is for; equal to the file name.
    pub date: NaiveDate,
    /// The changes, in the order they were made.
    pub entries: Vec<EndState>,
}

impl RunwayStateFile {
    /// An empty state for a date.
    pub fn new(date: NaiveDate) -> RunwayStateFile {
        RunwayStateFile {
            schema_version: 1,
            date,
            entries: Vec::new(),
        }
    }

    /// The combined state of one end: later entries override earlier ones field by field.
    pub fn end(&self, airfield: &str, end: &str) -> Option<EndState> {
        let mut out: Option<EndState> = None;
        for e in self
            .entries
            .iter()
            .filter(|e| e.airfield == airfield && e.end == end)
        {
            let o = out.get_or_insert_with(|| EndState {
                airfield: airfield.to_string(),
                end: end.to_string(),
                ..EndState::default()
            });
            macro_rules! take {
                ($($f:ident),*) => {$( if e.$f.is_some() { o.$f = e.$f.clone(); } )*};
            }
            // A closure's times and note go with it: a later closing or opening
            // replaces them (an end opened again is not "open (works)").
            if e.closed.is_some() {
                o.closed = e.closed;
                o.from = e.from;
                o.until = e.until;
                o.note = e.note.clone();
            }
            take!(tora_m, toda_m, asda_m, lda_m, condition, in_use);
            if !e.note.is_empty() {
                o.note = e.note.clone();
            }
            if !e.set_by.is_empty() {
                o.set_by = e.set_by.clone();
            }
        }
        out
    }

    /// The state as it stands at `t`: the entries that hold from the day's start (no
    /// `from`) and those whose `from` is at or before `t` (`None`: the day's start
    /// only). A change set at 14Z is not part of the state at 09Z.
    ///
    /// A closure whose window has ended by `t` no longer closes anything (its other
    /// fields still hold): so one closure written after another, in another window,
    /// does not cancel it — each closes its own window, and where both hold the later
    /// written wins.
    pub fn as_of(&self, t: Option<DateTime<Utc>>) -> RunwayStateFile {
        RunwayStateFile {
            entries: self
                .entries
                .iter()
                .filter(|e| e.from.is_none_or(|f| t.is_some_and(|t| f <= t)))
                .map(|e| {
                    let ended = e.closed == Some(true)
                        && e.until.is_some_and(|u| t.is_some_and(|t| u <= t));
                    if ended {
                        EndState {
                            closed: None,
                            from: None,
                            until: None,
                            note: String::new(),
                            ..e.clone()
                        }
                    } else {
                        e.clone()
                    }
                })
                .collect(),
            ..self.clone()
        }
    }

    /// The times the state changes during the day: each entry's start (`from`) and
    /// each closure's end (`until`), earliest first, each once.
    pub fn starts(&self) -> Vec<DateTime<Utc>> {
        let mut t: Vec<DateTime<Utc>> = self
            .entries
            .iter()
            .flat_map(|e| [e.from, e.until.filter(|_| e.closed == Some(true))])
            .flatten()
            .collect();
        t.sort_unstable();
        t.dedup();
        t
    }

    /// The end set in use at an airfield, the latest entry that says so.
    pub fn in_use(&self, airfield: &str) -> Option<String> {
        self.entries
            .iter()
            .rev()
            .find(|e| e.airfield == airfield && e.in_use == Some(true))
            .map(|e| e.end.clone())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn later_entries_override_field_by_field() {
        let mut f = RunwayStateFile::new(NaiveDate::from_ymd_opt(2026, 6, 14).unwrap());
        f.entries.push(EndState {
            airfield: "XSEA".into(),
            end: "27".into(),
            closed: Some(true),
            note: "works".into(),
            ..EndState::default()
        });
        f.entries.push(EndState {
            airfield: "XSEA".into(),
            end: "27".into(),
            tora_m: Some(900.0),
            ..EndState::default()
        });
        f.entries.push(EndState {
            airfield: "XSEA".into(),
            end: "27".into(),
            closed: Some(false),
            ..EndState::default()
        });
        let e = f.end("XSEA", "27").unwrap();
        assert_eq!(e.closed, Some(false));
        assert_eq!(e.tora_m, Some(900.0));
        // The closure's note went with it.
        assert_eq!(e.note, "");
        assert!(f.end("XSEA", "09").is_none());
        assert_eq!(DayCondition::parse("soft"), Some(DayCondition::SoftGround));
        assert_eq!(
            DayCondition::parse("Long_Grass"),
            Some(DayCondition::LongGrass)
        );
        assert_eq!(DayCondition::parse("icy"), None);
    }
}
