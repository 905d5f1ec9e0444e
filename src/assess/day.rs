//! The day's assessment kept up to date: every leg of the day and the pairing matrix,
//! recomputed incrementally when one station's report arrives — only the legs that
//! use that airfield and that airfield's column of the matrix.

use super::leg::{Context, LegResult, assess_leg};
use super::pairing::{self, Matrix};
use super::state::State;

/// A leg whose state changed with a new report.
#[derive(Debug, Clone, PartialEq)]
pub struct Change {
    /// Index into `Ops::legs`.
    pub leg: usize,
    /// Leg id.
    pub id: String,
    /// State before.
    pub from: State,
    /// State after.
    pub to: State,
    /// The deciding check after, in words.
    pub why: String,
}

/// The deciding check of a result, in words, for the change list.
fn why(r: &LegResult) -> String {
    r.limiting
        .as_ref()
        .map(|l| l.words())
        .or_else(|| r.reasons.first().cloned())
        .unwrap_or_default()
}

/// The day's legs and pairings.
#[derive(Debug, Clone)]
pub struct Assessment {
    /// Indices into `Ops::legs` of the legs assessed.
    pub leg_indices: Vec<usize>,
    /// Results, parallel to `leg_indices`.
    pub legs: Vec<LegResult>,
    /// The pairing matrix.
    pub matrix: Matrix,
}

impl Assessment {
    /// Assesses the given legs and the whole matrix.
    pub fn new(ctx: &Context<'_>, leg_indices: Vec<usize>) -> Assessment {
        let legs = leg_indices
            .iter()
            .filter_map(|&i| assess_leg(ctx, i))
            .collect();
        Assessment {
            leg_indices,
            legs,
            matrix: pairing::matrix(ctx),
        }
    }

    /// Recomputes what depends on `station` (legs from or to it, its matrix column)
    /// and returns the legs whose state changed. `ctx.at` is the new reference time.
    pub fn on_report(&mut self, ctx: &Context<'_>, station: &str) -> Vec<Change> {
        let mut changes = Vec::new();
        for (k, &i) in self.leg_indices.iter().enumerate() {
            let Some(leg) = ctx.ops.legs.get(i) else {
                continue;
            };
            if leg.from != station && leg.to != station {
                continue;
            }
            let Some(new) = assess_leg(ctx, i) else {
                continue;
            };
            if let Some(old) = self.legs.get_mut(k) {
                if old.state != new.state {
                    changes.push(Change {
                        leg: i,
                        id: new.id.clone(),
                        from: old.state,
                        to: new.state,
                        why: why(&new),
                    });
                }
                *old = new;
            }
        }
        if let Some(fi) = ctx.ops.airfield_position(station) {
            self.matrix.update_field(ctx, fi);
        }
        changes
    }

    /// Recomputes everything (a new reference time with no new report, e.g. staleness).
    pub fn refresh(&mut self, ctx: &Context<'_>) -> Vec<Change> {
        let old: Vec<(usize, State)> = self.legs.iter().map(|l| (l.index, l.state)).collect();
        *self = Assessment::new(ctx, std::mem::take(&mut self.leg_indices));
        self.legs
            .iter()
            .zip(old)
            .filter(|(new, (_, s))| new.state != *s)
            .map(|(new, (i, s))| Change {
                leg: i,
                id: new.id.clone(),
                from: s,
                to: new.state,
                why: why(new),
            })
            .collect()
    }

    /// Count of legs per state: within, thin, below, no-data.
    pub fn counts(&self) -> [usize; 4] {
        let mut c = [0; 4];
        for l in &self.legs {
            c[match l.state {
                State::Within => 0,
                State::Thin => 1,
                State::Below => 2,
                State::NoData => 3,
            }] += 1;
        }
        c
    }
}
