//! Wind components on a runway end, and the worst case of a variable wind.
//!
//! Directions are degrees true, the direction the wind blows *from*. A headwind
//! component is positive, a tailwind negative. The crosswind is a size with the side it
//! comes from.

/// The side a crosswind comes from, looking along the runway in the direction of travel.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Side {
    /// From the left.
    Left,
    /// From the right.
    Right,
}

/// Head/tail and cross components of one wind on one runway end.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Components {
    /// Headwind component, kt; negative for a tailwind.
    pub headwind_kt: f64,
    /// Crosswind component, kt (a size, never negative).
    pub crosswind_kt: f64,
    /// Where the crosswind comes from.
    pub crosswind_from: Side,
}

/// The direction part of a reported wind.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Direction {
    /// One direction, degrees true.
    Steady(f64),
    /// Varying clockwise from `from_deg` to `to_deg` (`dddVddd`), degrees true.
    Sector {
        /// Start of the sector.
        from_deg: f64,
        /// End of the sector, clockwise from the start.
        to_deg: f64,
    },
    /// `VRB`: any direction.
    Any,
}

fn normalize_deg(a: f64) -> f64 {
    a.rem_euclid(360.0)
}

/// Components of a wind from `wind_from_deg` at `speed_kt` on a runway whose true
/// heading is `runway_true_deg`.
pub fn components(wind_from_deg: f64, speed_kt: f64, runway_true_deg: f64) -> Components {
    let angle = (wind_from_deg - runway_true_deg).to_radians();
    let (sin, cos) = angle.sin_cos();
    let cross = speed_kt * sin;
    Components {
        headwind_kt: speed_kt * cos,
        crosswind_kt: cross.abs(),
        crosswind_from: if cross < 0.0 { Side::Left } else { Side::Right },
    }
}

impl Direction {
    /// Whether `deg` lies in this direction (for a sector: on the clockwise arc).
    pub fn contains(&self, deg: f64) -> bool {
        match *self {
            Direction::Steady(d) => normalize_deg(d - deg).abs() < 1e-9,
            Direction::Sector { from_deg, to_deg } => {
                normalize_deg(deg - from_deg) <= normalize_deg(to_deg - from_deg) + 1e-9
            }
            Direction::Any => true,
        }
    }

    /// The candidates for a worst case: the sector ends and any of `special` inside it.
    fn worst_of(&self, special: &[f64], mut score: impl FnMut(f64) -> f64) -> Option<f64> {
        let mut best: Option<(f64, f64)> = None;
        let mut consider = |d: f64| {
            let s = score(d);
            if best.is_none_or(|(bs, _)| s > bs) {
                best = Some((s, d));
            }
        };
        match *self {
            Direction::Steady(d) => consider(d),
            Direction::Sector { from_deg, to_deg } => {
                consider(from_deg);
                consider(to_deg);
                for &d in special {
                    if self.contains(d) {
                        consider(d);
                    }
                }
            }
            Direction::Any => {
                for &d in special {
                    consider(d);
                }
            }
        }
        best.map(|(_, d)| d)
    }
}

/// The least favourable head/tail component over the direction's range: the smallest
/// headwind, or largest tailwind (variable winds: worst direction in the sector, any
/// direction for `VRB`).
pub fn worst_headwind_kt(direction: Direction, speed_kt: f64, runway_true_deg: f64) -> f64 {
    let tail = normalize_deg(runway_true_deg + 180.0);
    let d = direction
        .worst_of(&[tail], |d| {
            -components(d, speed_kt, runway_true_deg).headwind_kt
        })
        .unwrap_or(tail);
    components(d, speed_kt, runway_true_deg).headwind_kt
}

/// The largest crosswind over the direction's range, with its side.
pub fn worst_crosswind(direction: Direction, speed_kt: f64, runway_true_deg: f64) -> (f64, Side) {
    let right = normalize_deg(runway_true_deg + 90.0);
    let left = normalize_deg(runway_true_deg - 90.0);
    let d = direction
        .worst_of(&[right, left], |d| {
            components(d, speed_kt, runway_true_deg).crosswind_kt
        })
        .unwrap_or(right);
    let c = components(d, speed_kt, runway_true_deg);
    (c.crosswind_kt, c.crosswind_from)
}

/// The wind to use for performance: at most `headwind_credit` of a headwind and at least
/// `tailwind_factor` of a tailwind (EASA performance class B: 0.5 and 1.5).
pub fn factored_headwind_kt(headwind_kt: f64, headwind_credit: f64, tailwind_factor: f64) -> f64 {
    if headwind_kt >= 0.0 {
        headwind_kt * headwind_credit
    } else {
        headwind_kt * tailwind_factor
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, tol: f64) {
        assert!((a - b).abs() <= tol, "{a} vs {b}");
    }

    // FAA Pilot's Handbook of Aeronautical Knowledge, crosswind component chart example
    // (from memory): wind 40° off the runway at 30 kt gives about 23 kt headwind and
    // 19 kt crosswind (chart reading); the trigonometry gives 22.98 and 19.28.
    #[test]
    fn phak_crosswind_chart_example() {
        let c = components(40.0, 30.0, 0.0);
        close(c.headwind_kt, 23.0, 0.5);
        close(c.crosswind_kt, 19.0, 0.5);
        assert_eq!(c.crosswind_from, Side::Right);
    }

    #[test]
    fn sides_and_signs() {
        // Runway 27 (270° true), wind 240 → from the left, headwind.
        let c = components(240.0, 20.0, 270.0);
        assert_eq!(c.crosswind_from, Side::Left);
        close(c.crosswind_kt, 10.0, 1e-9); // sin 30° = 0.5 exactly
        close(c.headwind_kt, 17.320_508, 1e-6);
        // Wind from behind: tailwind negative.
        close(components(90.0, 10.0, 270.0).headwind_kt, -10.0, 1e-9);
        // Across 0/360.
        let c = components(350.0, 10.0, 10.0);
        assert_eq!(c.crosswind_from, Side::Left);
        close(c.headwind_kt, 10.0 * 20f64.to_radians().cos(), 1e-9);
    }

    #[test]
    fn variable_sector_takes_the_worst_direction() {
        // Runway 09 (090°), wind 060V120 at 10 kt: the sector holds 090 (straight down
        // the runway) but neither beam, so its ends are the worst: 30° off at 10 kt.
        let sector = Direction::Sector {
            from_deg: 60.0,
            to_deg: 120.0,
        };
        close(
            worst_headwind_kt(sector, 10.0, 90.0),
            10.0 * 30f64.to_radians().cos(),
            1e-9,
        );
        let (x, _) = worst_crosswind(sector, 10.0, 90.0);
        close(x, 5.0, 1e-9);
        // 300V060 wraps through north and contains 000, the beam of runway 09 from the left.
        let wrap = Direction::Sector {
            from_deg: 300.0,
            to_deg: 60.0,
        };
        assert!(wrap.contains(0.0) && !wrap.contains(180.0));
        let (x, side) = worst_crosswind(wrap, 10.0, 90.0);
        close(x, 10.0, 1e-9);
        assert_eq!(side, Side::Left);
        // VRB: any direction — a full tailwind and a full crosswind.
        close(worst_headwind_kt(Direction::Any, 4.0, 90.0), -4.0, 1e-9);
        close(worst_crosswind(Direction::Any, 4.0, 90.0).0, 4.0, 1e-9);
    }

    // EASA performance class B: "not more than 50 % of the headwind component or not
    // less than 150 % of the tailwind component" (Regulation (EU) No 965/2012,
    // CAT.POL.A.330(c)(2), landing; CAT.POL.A.305(c)(6), take-off: "not more than 50 %
    // of the reported headwind component or not less than 150 % of the reported
    // tailwind component").
    #[test]
    fn class_b_wind_factoring() {
        close(factored_headwind_kt(10.0, 0.5, 1.5), 5.0, 1e-12);
        close(factored_headwind_kt(-4.0, 0.5, 1.5), -6.0, 1e-12);
    }

    proptest::proptest! {
        #[test]
        fn components_recompose_the_wind(d in 0.0f64..360.0, v in 0.0f64..80.0, r in 0.0f64..360.0) {
            let c = components(d, v, r);
            proptest::prop_assert!((c.headwind_kt.hypot(c.crosswind_kt) - v).abs() < 1e-9);
        }

        #[test]
        fn a_sector_is_never_better_than_its_steady_middle(
            from in 0.0f64..360.0, width in 0.0f64..180.0, v in 0.0f64..60.0, r in 0.0f64..360.0,
        ) {
            let sector = Direction::Sector { from_deg: from, to_deg: (from + width) % 360.0 };
            let mid = Direction::Steady((from + width / 2.0) % 360.0);
            proptest::prop_assert!(worst_headwind_kt(sector, v, r) <= worst_headwind_kt(mid, v, r) + 1e-9);
            proptest::prop_assert!(worst_crosswind(sector, v, r).0 >= worst_crosswind(mid, v, r).0 - 1e-9);
            proptest::prop_assert!(worst_headwind_kt(Direction::Any, v, r) <= worst_headwind_kt(sector, v, r) + 1e-9);
        }
    }
}
