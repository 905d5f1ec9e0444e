//! The forecast look-ahead on the board, exactly as `rhoboard check --forecast` does it:
//! the operator's TAFs known at the board's clock, the expected high where a TAF has no
//! TX/TN, each leg's forecast state and the time the forecast makes it `below`.
//! Recomputed when a report arrives; always labelled a forecast, kept apart from the
//! observed state.

use chrono::{DateTime, Utc};
use ratatui::text::Line;

use super::app::App;
use super::theme::Theme;
use crate::assess::lookahead::{LookAhead, TafSource, look_ahead};
use crate::assess::{Context, Model, State};
use crate::observation::Store;
use crate::ops::Ops;

pub use crate::assess::lookahead::Progress;

/// The look-ahead of every leg on the board, parallel to `Assessment::legs`.
pub fn looks(
    ops: &Ops,
    model: &Model,
    store: &Store,
    at: DateTime<Utc>,
    legs: &[(usize, State)],
) -> Vec<Option<LookAhead>> {
    let tafs = crate::observation::taf::from_files(&ops.observations, at);
    if tafs.is_empty() && ops.operator.policy.expected_high_c.is_none() {
        return vec![None; legs.len()];
    }
    let ctx = Context {
        ops,
        model,
        store,
        at,
    };
    let src = TafSource {
        tafs: &tafs,
        as_of: at,
        expected_high_c: ops.operator.policy.expected_high_c,
        utc_offset_min: ops.operator.time_zone.utc_offset_min,
        store,
    };
    let end_of_day = at
        .date_naive()
        .and_hms_opt(23, 59, 0)
        .map_or(at, |t| t.and_utc());
    legs.iter()
        .map(|&(index, observed)| look_ahead(&ctx, index, observed, &src, end_of_day))
        .collect()
}

/// The leg row's cell: `fails ~1340Z`, `holds`, `below now`, `forecast only` (the
/// leg is observed no-data: the forecast alone never reads better than that), or `—`
/// (no forecast); for a leg already gone on the board's clock `left 0900Z` (in the
/// air) or `landed 1030Z`, never a departure forecast as if still ahead.
pub fn cell(l: Option<&LookAhead>, observed: State, progress: Progress) -> String {
    match (l, progress) {
        (_, Progress::Airborne { left, .. }) => format!("left {}", left.format("%H%MZ")),
        (_, Progress::Landed { landed, .. }) => format!("landed {}", landed.format("%H%MZ")),
        (l, Progress::Ahead) => ahead_cell(l, observed),
    }
}

fn ahead_cell(l: Option<&LookAhead>, observed: State) -> String {
    match l {
        None => "—".to_string(),
        Some(_) if observed == State::Below => "below now".to_string(),
        Some(l) if l.observation_missing => "forecast only".to_string(),
        Some(l) => match l.fails_from {
            Some(_) if l.fails_now => "fails now".to_string(),
            Some(t) => format!("fails ~{}", t.format("%H%MZ")),
            None => format!("{} holds", l.state.glyph()),
        },
    }
}

/// One-line summary (the what-if comparison); a leg gone on the board's clock says so.
pub fn summary(l: Option<&LookAhead>, observed: State, progress: Progress) -> String {
    match progress {
        Progress::Airborne { left, .. } => {
            return format!("left {}: departed, no forecast ahead", left.format("%H%MZ"));
        }
        Progress::Landed { landed, .. } => {
            return format!(
                "landed {}: flown, no forecast ahead",
                landed.format("%H%MZ")
            );
        }
        Progress::Ahead => {}
    }
    match l {
        None => "no forecast".to_string(),
        Some(_) if observed == State::Below => "forecast ✗ below (below now)".to_string(),
        Some(l) => format!(
            "forecast {}{}",
            l.state_words(),
            match l.fails_from {
                Some(_) if l.fails_now => "; would be below if flown now".to_string(),
                Some(t) => format!("; would be below if flown from ~{}", t.format("%H%MZ")),
                None => "; holds all day".to_string(),
            }
        ),
    }
}

impl App {
    /// Recomputes the look-ahead of every leg (after new reports or a new day).
    pub(super) fn relook(&mut self) {
        let legs: Vec<(usize, State)> = self
            .assessment
            .legs
            .iter()
            .map(|r| (r.index, r.state))
            .collect();
        self.forecast = looks(&self.ops, self.model(), &self.store, self.clock, &legs);
    }

    /// The look-ahead of a leg (index into `Assessment::legs`).
    pub fn look(&self, k: usize) -> Option<&LookAhead> {
        self.forecast.get(k).and_then(|l| l.as_ref())
    }
}

/// The detail's forecast section for leg `k` of the assessment.
pub fn detail_lines(app: &App, k: usize, t: Theme) -> Vec<Line<'static>> {
    let Some(r) = app.assessment.legs.get(k) else {
        return Vec::new();
    };
    let mut lines = vec![
        Line::default(),
        Line::styled(
            "Forecast look-ahead (from the TAFs — a forecast, not an observation)",
            t.heading(),
        ),
    ];
    let progress = app
        .ops
        .legs
        .get(r.index)
        .map_or(Progress::Ahead, |l| Progress::of(l, app.clock));
    match progress {
        Progress::Airborne { left, lands } => {
            lines.push(Line::from(format!(
                "  departed {} on the board's clock, lands {}: the look-ahead is for a departure still ahead, so none is shown",
                left.format("%H:%MZ"),
                lands.format("%H:%MZ")
            )));
            return lines;
        }
        Progress::Landed { left, landed } => {
            lines.push(Line::from(format!(
                "  flown: departed {}, landed {} on the board's clock (planned times); nothing ahead to forecast",
                left.format("%H:%MZ"),
                landed.format("%H:%MZ")
            )));
            return lines;
        }
        Progress::Ahead => {}
    }
    match app.look(k) {
        None => lines.push(Line::from(
            "  no forecast covers this leg (no TAF for its fields, no expected high)",
        )),
        Some(l) => {
            lines.push(Line::from(vec![
                ratatui::text::Span::raw("  forecast state at the planned times: "),
                ratatui::text::Span::styled(
                    l.state_words(),
                    // With nothing observed, styled as the observation (no-data).
                    t.state(if l.observation_missing {
                        r.state
                    } else {
                        l.state
                    }),
                ),
                ratatui::text::Span::raw(format!(
                    " (observed now: {} {})",
                    r.state.glyph(),
                    r.state.word()
                )),
            ]));
            let when = match l.fails_from {
                Some(t) if l.fails_now => format!(
                    "  flown now ({}) or later, the forecast makes it below",
                    t.format("%H:%MZ")
                ),
                Some(t) => format!(
                    "  flown from ~{} on, the forecast makes it below",
                    t.format("%H:%MZ")
                ),
                None if r.state == State::Below => "  below now (observed)".to_string(),
                None => "  holds through the forecast (to the end of the day)".to_string(),
            };
            lines.push(Line::from(when));
            if let Some(lim) = &l.limiting {
                lines.push(Line::from(format!("  limiting in the forecast: {lim}")));
            }
            if l.worst_case {
                lines.push(Line::from(
                    "  includes a TEMPO/PROB worst case (conservative)",
                ));
            }
            if l.no_temperature {
                lines.push(Line::from(
                    "  no temperature forecast for a field: its temperature is held at the latest report's",
                ));
            }
            lines.push(Line::styled(format!("  basis: {}", l.basis), t.dim()));
        }
    }
    lines
}
