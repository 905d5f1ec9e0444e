//! Leg states, margins and the verdict of one check.

use serde::Serialize;

/// The state of a leg, a pairing or one check (DESIGN.md "Names we use").
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum State {
    /// Meets every minimum with at least the operator's buffer to spare.
    Within,
    /// Meets every minimum, but some margin is inside the buffer.
    Thin,
    /// Cannot be assessed: no observation, stale, or outside the flight-manual tables.
    NoData,
    /// Misses at least one minimum.
    Below,
}

impl State {
    /// The word shown for the state.
    pub const fn word(self) -> &'static str {
        match self {
            State::Within => "within",
            State::Thin => "thin",
            State::NoData => "no-data",
            State::Below => "below",
        }
    }

    /// The glyph shown beside the word, so the state never rests on colour alone.
    pub const fn glyph(self) -> char {
        match self {
            State::Within => '✓',
            State::Thin => '~',
            State::NoData => '?',
            State::Below => '✗',
        }
    }

    /// The combined state of two parts: `below` over `no-data` over `thin` over `within`
    /// (the declaration order makes this `max`).
    pub fn and(self, other: State) -> State {
        self.max(other)
    }

    /// Whether this state lets the leg go (exit status 0 for `check`).
    pub const fn meets_minimums(self) -> bool {
        matches!(self, State::Within | State::Thin)
    }
}

impl std::fmt::Display for State {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{} {}", self.glyph(), self.word())
    }
}

/// The verdict of a margin against its buffer: negative is `below`, inside the buffer
/// `thin`, else `within`. A margin that is not a number is `no-data`.
pub fn verdict(margin: f64, buffer: f64) -> State {
    if margin.is_nan() {
        State::NoData
    } else if margin < 0.0 {
        State::Below
    } else if margin < buffer {
        State::Thin
    } else {
        State::Within
    }
}

/// Margin of a distance check `required × factor ≤ available`: `available ÷ (required ×
/// factor) − 1`, as a fraction (0.10 = 10 % to spare).
pub fn distance_margin(required_m: f64, factor: f64, available_m: f64) -> f64 {
    available_m / (required_m * factor) - 1.0
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn precedence_is_below_then_no_data_then_thin_then_within() {
        use State::*;
        assert_eq!(Within.and(Thin), Thin);
        assert_eq!(Thin.and(NoData), NoData);
        assert_eq!(NoData.and(Below), Below);
        assert_eq!(Below.and(Within), Below);
        assert_eq!(
            [Within, Thin, Within].into_iter().fold(Within, State::and),
            Thin
        );
    }

    #[test]
    fn words_and_glyphs_follow_the_design() {
        let shown: Vec<String> = [State::Within, State::Thin, State::Below, State::NoData]
            .iter()
            .map(ToString::to_string)
            .collect();
        assert_eq!(shown, ["✓ within", "~ thin", "✗ below", "? no-data"]);
    }

    #[test]
    fn verdicts() {
        assert_eq!(verdict(0.25, 0.10), State::Within);
        assert_eq!(verdict(0.10, 0.10), State::Within);
        assert_eq!(verdict(0.05, 0.10), State::Thin);
        assert_eq!(verdict(0.0, 0.10), State::Thin);
        assert_eq!(verdict(-0.01, 0.10), State::Below);
        assert_eq!(verdict(f64::NAN, 0.10), State::NoData);
        // 500 m needed × 1.25 against 700 m: 700 / 625 − 1 = 12 %.
        assert!((distance_margin(500.0, 1.25, 700.0) - 0.12).abs() < 1e-12);
    }
}
