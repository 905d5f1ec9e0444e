//! The warming search shared by legs and pairings: how many degrees of uniform warming
//! (station pressure held, dew point capped) a plan can take before a temperature-
//! dependent check — a distance, the climb, the density altitude — turns `below`.
//!
//! `score(dt)` is the smallest margin ÷ buffer of those checks at a warming of `dt` °C:
//! `Some(≥ 0)` passes, `Some(< 0)` fails, `None` is outside the flight-manual tables.
//! Warming never improves a margin, so the boundary is one crossing. It is found to
//! 0.1 °C by false position (Illinois variant) with a bisection fallback: the scores
//! are close to linear in temperature inside one table cell, so a handful of
//! evaluations replace the dozen a plain bisection needs.

/// The result of a search.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Found {
    /// Warming left, °C, rounded down to 0.1; negative when cooling is needed.
    pub warming_c: f64,
    /// The search reached the end of the tables first: at least this much.
    pub table_ends: bool,
}

fn passes(s: Option<f64>) -> bool {
    s.is_some_and(|v| v >= 0.0)
}

/// The warmest passing warming between `pass_at` (passes, score `pass_score`) and
/// `fail_at` (fails, score `fail_score`; `None` outside the tables).
fn boundary(
    score: &impl Fn(f64) -> Option<f64>,
    pass_at: f64,
    pass_score: f64,
    fail_at: f64,
    fail_score: Option<f64>,
) -> f64 {
    let (mut a, mut fa) = (pass_at, pass_score);
    let (mut b, mut fb) = (fail_at, fail_score);
    let mut last: i8 = 0; // 1: `a` moved last, -1: `b` moved last
    for _ in 0..60 {
        let width = b - a;
        if width.abs() <= 0.1 {
            break;
        }
        let min_step = 0.04 * width.signum();
        let mut x = match fb {
            Some(fbv) if fa - fbv > 0.0 => a + fa * (b - a) / (fa - fbv),
            _ => 0.5 * (a + b),
        };
        // Keep strictly inside, at least a little away from either end, so the bracket
        // always shrinks and straddles the root when close.
        if (x - a) / width < 0.0 || (x - a).abs() < min_step.abs() {
            x = a + min_step;
        }
        if (b - x) / width < 0.0 || (b - x).abs() < min_step.abs() {
            x = b - min_step;
        }
        let fx = score(x);
        // Illinois: when one end moves twice running, halve the weight of the other.
        if passes(fx) {
            a = x;
            fa = fx.unwrap_or(0.0);
            if last == 1 {
                fb = fb.map(|v| v * 0.5);
            }
            last = 1;
        } else {
            b = x;
            fb = fx;
            if last == -1 {
                fa *= 0.5;
            }
            last = -1;
        }
    }
    a
}

/// Searches the warming left, from the current state (`score(0)`), within the tables'
/// reach: `up` °C of warming and `down` °C (negative) of cooling.
pub fn search(score: impl Fn(f64) -> Option<f64>, up: f64, down: f64) -> Option<Found> {
    let now = score(0.0)?;
    let found = if now >= 0.0 {
        let top = if up > 0.0 { score(up) } else { Some(now) };
        if up <= 0.0 || passes(top) {
            Found {
                warming_c: up.max(0.0),
                table_ends: true,
            }
        } else {
            Found {
                warming_c: boundary(&score, 0.0, now, up, top),
                table_ends: false,
            }
        }
    } else {
        let bottom = if down < 0.0 { score(down) } else { None };
        match bottom {
            Some(s) if s >= 0.0 => Found {
                warming_c: boundary(&score, down, s, 0.0, Some(now)),
                table_ends: false,
            },
            _ => Found {
                warming_c: down.min(0.0),
                table_ends: true,
            },
        }
    };
    Some(Found {
        warming_c: (found.warming_c * 10.0).floor() / 10.0,
        ..found
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::cell::Cell;

    #[test]
    fn finds_a_linear_crossing_in_few_steps() {
        let calls = Cell::new(0);
        let f = |dt: f64| {
            calls.set(calls.get() + 1);
            Some((7.37 - dt) / 10.0)
        };
        let r = search(f, 30.0, -20.0).unwrap();
        assert_eq!(r.warming_c, 7.3);
        assert!(!r.table_ends);
        assert!(calls.get() <= 6, "{} evaluations", calls.get());
    }

    #[test]
    fn piecewise_and_outside_table() {
        // Kinked margin, and the table ends at +12: beyond it None.
        let f = |dt: f64| {
            if dt > 12.0 {
                None
            } else if dt < 4.0 {
                Some(1.0 - dt * 0.05)
            } else {
                Some(0.8 - (dt - 4.0) * 0.3)
            }
        };
        let r = search(f, 15.0, -10.0).unwrap();
        // 0.8 − 0.3 (dt − 4) = 0 at dt = 6.667
        assert_eq!(r.warming_c, 6.6);
        // Passing to the end of the table.
        let g = |dt: f64| if dt > 12.0 { None } else { Some(1.0) };
        let r = search(g, 12.0, -10.0).unwrap();
        assert!(r.table_ends && r.warming_c == 12.0);
    }

    #[test]
    fn cooling_needed_is_negative() {
        let f = |dt: f64| Some(-(dt + 3.25));
        let r = search(f, 10.0, -20.0).unwrap();
        assert_eq!(r.warming_c, -3.3);
        // Not even the coldest table column passes.
        let g = |_dt: f64| Some(-1.0);
        let r = search(g, 10.0, -20.0).unwrap();
        assert!(r.table_ends && r.warming_c == -20.0);
        // Outside the table now: no answer.
        assert!(search(|_| None, 10.0, -20.0).is_none());
    }

    proptest::proptest! {
        #[test]
        fn agrees_with_a_fine_scan(root in -15.0f64..25.0, slope1 in 0.01f64..2.0, slope2 in 0.01f64..2.0, kink in -10.0f64..20.0) {
            // A monotone decreasing, kinked function with its zero at `root`.
            let f = move |dt: f64| {
                let s = if dt < kink { slope1 } else { slope2 };
                Some((root - dt) * s)
            };
            let r = search(f, 30.0, -20.0).unwrap();
            let want = (root * 10.0).floor() / 10.0;
            proptest::prop_assert!((r.warming_c - want).abs() <= 0.1 + 1e-9, "{} vs {}", r.warming_c, want);
            proptest::prop_assert!(r.warming_c <= root + 1e-9);
        }
    }
}
