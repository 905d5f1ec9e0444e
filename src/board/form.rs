//! The manual-observation form (key `o`): plain text fields with units, validated by
//! `observation::manual_observation`, each error shown beside its field.

use chrono::{DateTime, NaiveTime, Utc};
use ratatui::crossterm::event::{KeyCode, KeyEvent, KeyModifiers};

use crate::observation::{ManualError, ManualInput, Report, WindReference, manual_observation};
use crate::ops::Ops;

/// One field of the form: label, hint, and the name `ManualError` uses for it.
#[derive(Debug, Clone, Copy)]
pub struct FieldSpec {
    /// Label on screen.
    pub label: &'static str,
    /// Example of what to type.
    pub hint: &'static str,
    /// The field name in `ManualError` messages.
    pub error_name: &'static str,
}

/// The form's fields, in order.
pub const FIELDS: [FieldSpec; 11] = [
    FieldSpec {
        label: "station",
        hint: "airfield id, e.g. XSEA",
        error_name: "station",
    },
    FieldSpec {
        label: "time (UTC)",
        hint: "HHMM, e.g. 1320",
        error_name: "time",
    },
    FieldSpec {
        label: "wind direction",
        hint: "degrees magnetic, VRB or calm",
        error_name: "wind direction",
    },
    FieldSpec {
        label: "wind true? (y/n)",
        hint: "y if the direction is true",
        error_name: "wind reference",
    },
    FieldSpec {
        label: "wind speed",
        hint: "15kt (empty for calm)",
        error_name: "wind speed",
    },
    FieldSpec {
        label: "gust",
        hint: "25kt, optional",
        error_name: "gust",
    },
    FieldSpec {
        label: "visibility",
        hint: "8km, 5sm, 1500m, 9999 (empty: unknown)",
        error_name: "visibility",
    },
    FieldSpec {
        label: "ceiling",
        hint: "2500ft, or none (empty: unknown)",
        error_name: "ceiling",
    },
    FieldSpec {
        label: "temperature",
        hint: "31C or 88F",
        error_name: "temperature",
    },
    FieldSpec {
        label: "dew point",
        hint: "12C, optional (else saturated)",
        error_name: "dew point",
    },
    FieldSpec {
        label: "altimeter (QNH)",
        hint: "1019hPa or 30.12inHg",
        error_name: "altimeter",
    },
];

/// What a key did to a form's text fields.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FieldKey {
    /// Esc: close the form.
    Cancel,
    /// Enter: submit it.
    Submit,
    /// Typed, deleted or moved (or nothing).
    Edited,
}

/// One key on a form of text fields (every board form: the report by hand, the
/// runway state, the sign-off): Tab/↓ and Shift-Tab/↑ move, Backspace deletes,
/// Ctrl-U empties the field (as in a shell), characters type.
pub fn field_key(values: &mut [String], focus: &mut usize, key: &KeyEvent) -> FieldKey {
    let n = values.len().max(1);
    match key.code {
        KeyCode::Esc => return FieldKey::Cancel,
        KeyCode::Enter => return FieldKey::Submit,
        KeyCode::Tab | KeyCode::Down => *focus = (*focus + 1) % n,
        KeyCode::BackTab | KeyCode::Up => *focus = (*focus + n - 1) % n,
        KeyCode::Backspace => {
            if let Some(v) = values.get_mut(*focus) {
                v.pop();
            }
        }
        KeyCode::Char('u') if key.modifiers.contains(KeyModifiers::CONTROL) => {
            if let Some(v) = values.get_mut(*focus) {
                v.clear();
            }
        }
        KeyCode::Char(ch) if !key.modifiers.contains(KeyModifiers::CONTROL) => {
            if let Some(v) = values.get_mut(*focus) {
                v.push(ch);
            }
        }
        _ => {}
    }
    FieldKey::Edited
}

/// After field `i` was edited: its error, and the errors tied to no field, are stale
/// and go (the others stay until the next submit).
pub fn clear_stale(errors: &mut Vec<(Option<usize>, String)>, i: usize) {
    errors.retain(|(f, _)| f.is_some_and(|f| f != i));
}

/// The error beside field `i` among a form's `errors`, if any.
pub fn error_at(errors: &[(Option<usize>, String)], i: usize) -> Option<&str> {
    errors
        .iter()
        .find(|(f, _)| *f == Some(i))
        .map(|(_, m)| m.as_str())
}

/// The form's state.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Form {
    /// What is typed in each field, parallel to [`FIELDS`].
    pub values: [String; 11],
    /// The field being typed in.
    pub focus: usize,
    /// Problems from the last submit: (field index if known, message).
    pub errors: Vec<(Option<usize>, String)>,
    /// A time after the board's clock the user was warned about: a second Enter with
    /// the same time adds the report (it counts from then on).
    pub future_warned: Option<DateTime<Utc>>,
}

impl Form {
    /// A fresh form, the time filled with the board's clock.
    pub fn new(clock: DateTime<Utc>, station: Option<&str>) -> Form {
        let mut f = Form::default();
        f.values[0] = station.unwrap_or_default().to_string();
        f.values[1] = clock.format("%H%M").to_string();
        f.values[3] = "n".to_string();
        f
    }

    /// The error shown beside field `i`, if any.
    pub fn error_for(&self, i: usize) -> Option<&str> {
        error_at(&self.errors, i)
    }

    /// Builds the report, or fills `errors`. `clock` gives the date of the time field.
    pub fn submit(&mut self, ops: &Ops, clock: DateTime<Utc>) -> Option<Report> {
        self.errors.clear();
        let v = &self.values;
        let opt = |s: &String| (!s.trim().is_empty()).then(|| s.trim().to_string());
        let station = v[0].trim().to_ascii_uppercase();
        let field = ops.airfield(&station);
        if !station.is_empty() && field.is_none() {
            let known: Vec<&str> = ops.airfields.iter().map(|a| a.id.as_str()).collect();
            self.errors.push((
                Some(0),
                format!(
                    "'{station}' is not one of the operator's airfields ({})",
                    known.join(", ")
                ),
            ));
        }
        let time_text = v[1].trim().trim_end_matches(['Z', 'z']);
        let observed_at = NaiveTime::parse_from_str(time_text, "%H%M")
            .ok()
            .and_then(|t| clock.date_naive().and_time(t).and_utc().into());
        if observed_at.is_none() && !time_text.is_empty() {
            self.errors.push((
                Some(1),
                format!("'{}': expected HHMM in UTC, e.g. 1320", v[1].trim()),
            ));
        }
        if let Some(at) = observed_at
            && at > clock
            && self.future_warned != Some(at)
        {
            self.future_warned = Some(at);
            self.errors.push((
                Some(1),
                format!(
                    "{} is {} min after the board's clock ({}): Enter again to add it anyway (it counts from {} on), or correct the time",
                    at.format("%H%MZ"),
                    // Whole minutes, rounded up: 9 min 20 s ahead says 10.
                    ((at - clock).num_seconds() + 59) / 60,
                    clock.format("%H%MZ"),
                    at.format("%H%MZ")
                ),
            ));
        }
        let wind_reference = match v[3].trim().to_ascii_lowercase().as_str() {
            "y" | "yes" | "true" | "t" => WindReference::True,
            "" | "n" | "no" | "m" | "magnetic" => WindReference::Magnetic,
            other => {
                self.errors.push((
                    Some(3),
                    format!("'{other}': expected y (true) or n (magnetic)"),
                ));
                WindReference::Magnetic
            }
        };
        let input = ManualInput {
            station: station.clone(),
            observed_at: observed_at.or(if time_text.is_empty() {
                None
            } else {
                Some(clock)
            }),
            wind_direction: v[2].trim().to_string(),
            wind_speed: v[4].trim().to_string(),
            gust: opt(&v[5]),
            wind_reference,
            visibility: opt(&v[6]),
            ceiling: opt(&v[7]),
            temperature: v[8].trim().to_string(),
            dewpoint: opt(&v[9]),
            altimeter: v[10].trim().to_string(),
            hazards: Default::default(),
        };
        let variation = field.map_or(0.0, |f| f.magnetic_variation_deg);
        match manual_observation(&input, variation) {
            Ok(report) if self.errors.is_empty() => Some(report),
            Ok(_) => None,
            Err(errors) => {
                for e in errors {
                    let idx = match &e {
                        ManualError::Missing { field, .. }
                        | ManualError::Value { field, .. }
                        | ManualError::Inconsistent { field, .. } => {
                            FIELDS.iter().position(|f| f.error_name == *field)
                        }
                    };
                    if idx == Some(1) && self.error_for(1).is_some() {
                        continue;
                    }
                    self.errors.push((idx, e.to_string()));
                }
                None
            }
        }
    }
}
