//! The runway-state form (key `r`): close an end (optionally until a time), reduce its
//! declared distances, set the day's surface condition or the end in use. Checked by
//! the same code as `rhoboard runway` (`commands::runway::entry`); writing the file is
//! the event loop's job (an [`Effect`](super::effects::Effect)), never `update`'s.

use chrono::NaiveDate;

use crate::commands::runway::{Names, Request, changes_something, entry};
use crate::ops::Ops;
use crate::ops::runway_state::{EndState, RunwayStateFile};

/// One field of the form.
#[derive(Debug, Clone, Copy)]
pub struct RunwayField {
    /// Label on screen (also the name errors use, where one does).
    pub label: &'static str,
    /// Example of what to type.
    pub hint: &'static str,
}

/// The form's fields, in order.
pub const RUNWAY_FIELDS: [RunwayField; 11] = [
    RunwayField {
        label: "airfield",
        hint: "airfield id, e.g. XSEA",
    },
    RunwayField {
        label: "end",
        hint: "runway end designator, e.g. 27",
    },
    RunwayField {
        label: "closed",
        hint: "y closes, n opens again, empty: no change",
    },
    RunwayField {
        label: "until",
        hint: "closes from now; 18:00Z (empty: rest of day)",
    },
    RunwayField {
        label: "TORA",
        hint: "reduced take-off run, e.g. 900m or 2950ft",
    },
    RunwayField {
        label: "TODA",
        hint: "reduced take-off distance",
    },
    RunwayField {
        label: "ASDA",
        hint: "reduced accelerate-stop distance",
    },
    RunwayField {
        label: "LDA",
        hint: "reduced landing distance (displaced threshold)",
    },
    RunwayField {
        label: "condition",
        hint: "dry, wet, soft, long-grass or water",
    },
    RunwayField {
        label: "in use",
        hint: "y makes this the end in use from the board's clock",
    },
    RunwayField {
        label: "note",
        hint: "why: works, rain overnight …",
    },
];

/// The runway-state form's state.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct RunwayForm {
    /// What is typed in each field, parallel to [`RUNWAY_FIELDS`].
    pub values: [String; 11],
    /// The field being typed in.
    pub focus: usize,
    /// Problems from the last submit: (field index if known, message).
    pub errors: Vec<(Option<usize>, String)>,
}

fn yes_no(text: &str) -> Result<Option<bool>, ()> {
    match text.trim().to_ascii_lowercase().as_str() {
        "" => Ok(None),
        "y" | "yes" | "true" => Ok(Some(true)),
        "n" | "no" | "false" | "open" => Ok(Some(false)),
        _ => Err(()),
    }
}

impl RunwayForm {
    /// A fresh form on `airfield`'s `end` (either may be empty).
    pub fn new(airfield: Option<&str>, end: Option<&str>) -> RunwayForm {
        let mut f = RunwayForm::default();
        f.values[0] = airfield.unwrap_or_default().to_string();
        f.values[1] = end.unwrap_or_default().to_string();
        // The cursor starts where the typing is.
        f.focus = if airfield.is_none() {
            0
        } else if end.is_none() {
            1
        } else {
            2
        };
        f
    }

    /// The error shown under field `i`, if any.
    pub fn error_for(&self, i: usize) -> Option<&str> {
        super::form::error_at(&self.errors, i)
    }

    /// The airfield typed, upper-cased.
    pub fn airfield(&self) -> String {
        self.values[0].trim().to_ascii_uppercase()
    }

    /// Builds the day's entry for `date`, or fills `errors` (the cursor goes to the
    /// first field with one). A closure starts at `now` (the board's clock, on the
    /// board's own day): the legs already flown keep the end.
    pub fn submit(
        &mut self,
        ops: &Ops,
        date: NaiveDate,
        now: Option<chrono::DateTime<chrono::Utc>>,
    ) -> Option<EndState> {
        self.errors.clear();
        let v = &self.values;
        let closed = match yes_no(&v[2]) {
            Ok(c) => c,
            Err(()) => {
                self.errors.push((
                    Some(2),
                    format!(
                        "'{}': expected y (close), n (open again) or nothing",
                        v[2].trim()
                    ),
                ));
                None
            }
        };
        let in_use = match yes_no(&v[9]) {
            Ok(c) => c == Some(true),
            Err(()) => {
                self.errors
                    .push((Some(9), format!("'{}': expected y or nothing", v[9].trim())));
                false
            }
        };
        let opt = |s: &String| (!s.trim().is_empty()).then(|| s.trim().to_string());
        // Every change starts at the board's clock: the legs already flown keep the
        // state they flew in.
        let from = now.map(|t| t.format("%Y-%m-%dT%H:%M:00Z").to_string());
        let req = Request {
            closed,
            from,
            until: opt(&v[3]),
            tora: opt(&v[4]),
            toda: opt(&v[5]),
            asda: opt(&v[6]),
            lda: opt(&v[7]),
            condition: opt(&v[8]),
            in_use,
            note: v[10].trim().to_string(),
            by: "board".to_string(),
        };
        let end = v[1].trim().to_ascii_uppercase();
        match entry(ops, &self.airfield(), &end, date, &req, Names::Labels) {
            Ok(e) if self.errors.is_empty() => {
                // Opening an end that is not closed (the end in use offered, the closed
                // one elsewhere) would save nothing useful: say which one is closed.
                if e.closed == Some(false) {
                    let day = ops
                        .runway_states
                        .iter()
                        .find(|s| s.date == date)
                        .cloned()
                        .unwrap_or_else(|| RunwayStateFile::new(date));
                    if let Some(why) = crate::commands::runway::open_refusal(
                        ops,
                        &day,
                        &e.airfield,
                        &e.end,
                        e.from,
                    ) {
                        // The field and end are the form's: say it from the end. The
                        // form has no start field (it is the board's clock): a closure
                        // set to start later is ended from its start, here or by
                        // `rhoboard runway`, and the error goes with "closed".
                        let why = why
                            .strip_prefix(&format!("{} ", e.airfield))
                            .unwrap_or(&why)
                            .to_string();
                        let (field, why) = match why.split_once("; to end the closure") {
                            Some((head, _)) => {
                                let start = why
                                    .split("its closure starts at ")
                                    .nth(1)
                                    .and_then(|t| t.split(',').next())
                                    .unwrap_or("its start");
                                (
                                    2,
                                    format!(
                                        "{head}; to end it, open it here at {start} or later, or with `rhoboard runway {} {} --open --from` that time",
                                        e.airfield, e.end
                                    ),
                                )
                            }
                            None => (1, why),
                        };
                        self.errors.push((Some(field), why));
                        self.focus = field;
                        return None;
                    }
                }
                if changes_something(&e) {
                    return Some(e);
                }
                self.errors.push((
                    None,
                    "nothing to change: close or open the end, reduce a distance, set a \
                     condition or make it the end in use"
                        .to_string(),
                ));
            }
            Ok(_) => {}
            Err(e) => {
                let mut msg = e.to_string();
                // The form has no start field (it is the board's clock): say so.
                if msg.starts_with("from ")
                    && msg.contains("is not before until")
                    && let Some(t) = now
                {
                    msg = format!(
                        "until is not after the board's clock ({}): give a later time, or \
                         leave it empty for the rest of the day",
                        t.format("%H%MZ")
                    );
                }
                let field = if msg.starts_with("unknown airfield") {
                    Some(0)
                } else if msg.contains("has no runway end") {
                    Some(1)
                } else if msg.starts_with("from ") || msg.starts_with("until is not after") {
                    // The start is the board's clock: the end time is what to change.
                    Some(3)
                } else {
                    RUNWAY_FIELDS
                        .iter()
                        .position(|f| msg.starts_with(&format!("{} ", f.label)))
                };
                self.errors.push((field, msg));
            }
        }
        if let Some(first) = self.errors.iter().find_map(|(i, _)| *i) {
            self.focus = first;
        }
        None
    }
}
