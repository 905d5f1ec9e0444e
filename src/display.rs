//! Quantities in the operator's display units (`operator.json` `display_units`), each
//! with its unit in the text. The assessment works in kg, m, hPa and °C; only the
//! words of the board, `check`, `report` and `leg set` change. Altitudes stay in ft
//! and wind in kt (the aviation units the limits are written in).

use crate::assess::leg::{Headroom, LegResult, NO_MARGIN};
use crate::assess::limits::{LimitCheck, LimitKind, Shown};
use crate::ops::Ops;
use crate::ops::operator::{DisplayUnits, DistanceUnit, MassUnit, PressureUnit, TemperatureUnit};
use crate::units;

/// The operator's display units.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Show(pub DisplayUnits);

impl Show {
    /// The display units of `ops`.
    pub fn of(ops: &Ops) -> Show {
        Show(ops.operator.display_units)
    }

    /// A distance: `721 m` or `2365 ft`.
    pub fn dist(self, m: f64) -> String {
        let (v, unit) = self.dist_value(m);
        format!("{v:.0} {unit}")
    }

    /// A mass: `986 kg` or `2174 lb`.
    pub fn mass(self, kg: f64) -> String {
        let (v, unit) = self.mass_value(kg);
        format!("{v:.0} {unit}")
    }

    /// A mass against a maximum (takeoff, landing, ramp), rounded up in the display
    /// unit as the mass limits' rows show it: `986.2 kg` is `987 kg`.
    pub fn mass_up(self, kg: f64) -> String {
        let (v, unit) = self.mass_value(kg);
        format!("{:.0} {unit}", units::up0(v))
    }

    /// A pressure: `1014.0 hPa` or `29.94 inHg`.
    pub fn pressure(self, hpa: f64) -> String {
        match self.0.pressure {
            PressureUnit::Hpa => format!("{hpa:.1} hPa"),
            PressureUnit::InHg => format!("{:.2} inHg", units::hpa_to_inhg(hpa)),
        }
    }

    /// The temperature unit's symbol, `°C` or `°F`.
    pub fn temp_unit(self) -> &'static str {
        match self.0.temperature {
            TemperatureUnit::C => "°C",
            TemperatureUnit::F => "°F",
        }
    }

    /// A temperature in the display unit.
    pub fn temp_value(self, c: f64) -> f64 {
        match self.0.temperature {
            TemperatureUnit::C => c,
            TemperatureUnit::F => units::c_to_f(c),
        }
    }

    /// A temperature to a tenth: `29.0 °C` or `84.2 °F`.
    pub fn temp(self, c: f64) -> String {
        format!("{:.1} {}", self.temp_value(c), self.temp_unit())
    }

    /// A temperature to the degree: `29 °C` or `84 °F`.
    pub fn temp0(self, c: f64) -> String {
        format!("{:.0} {}", self.temp_value(c), self.temp_unit())
    }

    /// A temperature difference, signed: `+6.3 °C` or `+11.3 °F` (1 °C = 1.8 °F).
    pub fn warming(self, dc: f64) -> String {
        format!("{:+.1} {}", self.warming_value(dc), self.temp_unit())
    }

    /// A headroom in the display unit to a tenth, rounded the safe way
    /// ([`units::colder_tenth`]), as every headroom is shown: `+4.2 °C`, `-11.4 °F`.
    pub fn headroom_degrees(self, dc: f64) -> String {
        format!(
            "{:+.1} {}",
            units::colder_tenth(self.warming_value(dc)),
            self.temp_unit()
        )
    }

    /// A limit's value in the display unit: metres of visibility as statute miles
    /// with distances in ft (the unit visibility is given in where runways are in
    /// feet), other metres as distances, kg and mm as lb and in with masses in lb;
    /// every other unit as it is. `(value, unit)`.
    pub fn limit_value(self, v: f64, unit: &'static str, visibility: bool) -> (f64, &'static str) {
        match (unit, self.0.distance, self.0.mass) {
            ("m", DistanceUnit::Ft, _) if visibility => (units::m_to_sm(v), "SM"),
            ("m", DistanceUnit::Ft, _) => (units::m_to_ft(v), "ft"),
            // Masses in lb go with arms in inches (the weight-and-balance convention).
            ("kg", _, MassUnit::Lb) => (units::kg_to_lb(v), "lb"),
            ("mm", _, MassUnit::Lb) => (v / 25.4, "in"),
            _ => (v, unit),
        }
    }

    /// `text` (a sentence from the assessment) with each `<number> m`, `kg`, `hPa` and
    /// `°C` in the display units, and `mm` as inches with masses in lb; metres are
    /// statute miles in a sentence about visibility (with distances in ft). In a range
    /// (`590 to 1600 kg`) the first figure converts with the second. A figure already
    /// in its display unit stays as written.
    pub fn in_text(self, text: &str) -> String {
        const TRIM: [char; 5] = [',', ';', ':', ')', '.'];
        let visibility = text.contains("visibility");
        // Whether `unit` changes in the display units.
        let changes = |unit: &str| match unit {
            "m" => self.0.distance == DistanceUnit::Ft,
            "kg" | "mm" => self.0.mass == MassUnit::Lb,
            "hPa" => self.0.pressure == PressureUnit::InHg,
            "°C" => self.0.temperature == TemperatureUnit::F,
            _ => false,
        };
        let convert = |v: f64, unit: &str| -> Option<String> {
            if !changes(unit) {
                return None;
            }
            Some(match unit {
                "m" if visibility && self.0.distance == DistanceUnit::Ft => {
                    format!("{:.1} SM", units::m_to_sm(v))
                }
                "m" => self.dist(v),
                "kg" => self.mass(v),
                "mm" if self.0.mass == MassUnit::Lb => {
                    let (inches, unit) = self.limit_value(v, "mm", false);
                    format!("{inches:.1} {unit}")
                }
                "hPa" => self.pressure(v),
                "°C" => self.temp0(v),
                _ => return None,
            })
        };
        let words: Vec<&str> = text.split(' ').collect();
        let mut out: Vec<String> = Vec::with_capacity(words.len());
        let mut i = 0;
        while i < words.len() {
            let w = words[i];
            let next = words.get(i + 1).copied().unwrap_or("");
            let unit = next.trim_end_matches(TRIM);
            let tail = &next[unit.len()..];
            let (pre, num) = w.split_at(w.len() - w.trim_start_matches('(').len());
            let plus = if num.starts_with('+') { "+" } else { "" };
            let value = num.parse::<f64>().ok();
            if let Some(shown) = value.and_then(|v| convert(v, unit)) {
                out.push(format!("{pre}{plus}{shown}{tail}"));
                i += 2;
                continue;
            }
            let range_unit = words
                .get(i + 3)
                .map(|u| u.trim_end_matches(TRIM))
                .filter(|_| {
                    next == "to" && words.get(i + 2).is_some_and(|b| b.parse::<f64>().is_ok())
                });
            match (value, range_unit) {
                (Some(v), Some(u)) if let Some(shown) = convert(v, u) => {
                    let figure = shown.rsplit_once(' ').map_or(shown.as_str(), |(f, _)| f);
                    out.push(format!("{pre}{plus}{figure}"));
                }
                _ => out.push(w.to_string()),
            }
            i += 1;
        }
        out.join(" ")
    }

    /// The leg's reasons in the display units: a limit row's sentence written afresh
    /// from the row ([`Show::limit_shown`]), so its value, limit and margin are rounded
    /// toward each other in the display unit; every other sentence through
    /// [`Show::in_text`].
    pub fn reasons(self, r: &LegResult) -> Vec<String> {
        let rows: Vec<(String, &LimitCheck)> =
            [("departure", &r.departure), ("arrival", &r.arrival)]
                .into_iter()
                .flat_map(|(role, side)| {
                    side.limits.iter().map(move |l| {
                        let head =
                            format!("{role} {}: {} {}", side.airfield, l.label(), l.state.word());
                        (head, l)
                    })
                })
                .collect();
        r.reasons
            .iter()
            .map(|why| {
                let row = rows.iter().find(|(head, l)| {
                    why.strip_prefix(head.as_str())
                        .is_some_and(|rest| rest.starts_with(" — ") && !l.unit.is_empty())
                });
                match row {
                    Some((head, l)) => self
                        .limit_reason(head, l)
                        .unwrap_or_else(|| self.in_text(why)),
                    None => self.in_text(&self.distance_reason(r, why)),
                }
            })
            .collect()
    }

    /// A distance check's reason (`arrival XPIN 26 takeoff: distance_50ft × 1.25 ≤ TORA
    /// needs 1171 m, 1100 m available (-7 %)`) with its distances converted from the
    /// check's own figures, as the chain shows them (`3841 ft`), not from the whole
    /// metres of the sentence (`3842 ft`); any other sentence as it is.
    fn distance_reason(self, r: &LegResult, why: &str) -> String {
        if self.0.distance == DistanceUnit::M {
            return why.to_string();
        }
        for (role, side) in [("departure", &r.departure), ("arrival", &r.arrival)] {
            let at = format!(
                "{} {}",
                side.airfield,
                side.runway.as_deref().unwrap_or("?")
            );
            for (phase, p) in [("takeoff", &side.takeoff), ("landing", &side.landing)] {
                let Some(p) = p else { continue };
                for c in &p.checks {
                    let head = format!("{role} {at} {phase}: {} needs ", c.rule);
                    if !why.starts_with(&head) {
                        continue;
                    }
                    let (req, avail) = (c.result.required_m, c.result.available_m);
                    let (req_m, req_d) = (
                        format!("needs {req:.0} m"),
                        format!("needs {}", self.dist(req)),
                    );
                    let mut out = why.replacen(&req_m, &req_d, 1);
                    for m in [format!("{avail} m"), format!("{avail:.0} m")] {
                        for (before, after) in [("", " available"), ("of ", ",")] {
                            let from = format!("{before}{m}{after}");
                            if out.contains(&from) {
                                out = out.replacen(
                                    &from,
                                    &format!("{before}{}{after}", self.dist(avail)),
                                    1,
                                );
                            }
                        }
                    }
                    return out;
                }
            }
        }
        why.to_string()
    }

    /// A limit row's reason in the display unit: `head — V against L, margin M; from
    /// source`; `None` without both figures.
    fn limit_reason(self, head: &str, l: &LimitCheck) -> Option<String> {
        let (sh, unit) = self.limit_shown(l);
        let d = sh.decimals;
        let (v, lim) = (sh.value?, sh.limit?);
        let margin = sh
            .margin
            .map_or(String::new(), |m| format!(", margin {m:+.d$} {unit}"));
        Some(format!(
            "{head} — {v:.d$} {unit} against {lim:.d$} {unit}{margin}; from {}",
            l.source
        ))
    }

    /// A temperature difference in the display unit.
    pub fn warming_value(self, dc: f64) -> f64 {
        match self.0.temperature {
            TemperatureUnit::C => dc,
            TemperatureUnit::F => dc * 1.8,
        }
    }

    /// A mass in the display unit, and the unit: `(2174.0, "lb")`.
    pub fn mass_value(self, kg: f64) -> (f64, &'static str) {
        match self.0.mass {
            MassUnit::Kg => (kg, "kg"),
            MassUnit::Lb => (units::kg_to_lb(kg), "lb"),
        }
    }

    /// A distance in the display unit, and the unit: `(2365.0, "ft")`.
    pub fn dist_value(self, m: f64) -> (f64, &'static str) {
        match self.0.distance {
            DistanceUnit::M => (m, "m"),
            DistanceUnit::Ft => (units::m_to_ft(m), "ft"),
        }
    }

    /// Payload headroom rounded the safe way after converting: room down, what must
    /// come off up. `(true, "22 lb")` is room for 22 lb; `(false, "23 lb")` is 23 lb to
    /// remove.
    pub fn payload(self, kg: f64) -> (bool, String) {
        let (v, unit) = self.mass_value(kg);
        if v >= 0.0 {
            (true, format!("{:.0} {unit}", v.floor()))
        } else {
            (false, format!("{:.0} {unit}", (-v).ceil()))
        }
    }

    /// A limit row's value, limit and margin in the display unit
    /// ([`Show::limit_value`]) at that unit's precision (a tenth for SM and in, else
    /// whole), rounded toward each other ([`LimitCheck::shown`]); with the unit.
    pub fn limit_shown(self, l: &LimitCheck) -> (Shown, &'static str) {
        let vis = l.kind == LimitKind::Visibility;
        let (_, unit) = self.limit_value(0.0, l.unit, vis);
        let decimals = if matches!(unit, "SM" | "in") { 1 } else { 0 };
        (
            l.shown(|v| self.limit_value(v, l.unit, vis).0, decimals),
            unit,
        )
    }

    /// The limiting check's margin for a text table: a limit row's in the display unit
    /// ([`Show::limit_shown`]), a distance or climb check's in percent as assessed
    /// (`-7 %`), `—` where there is none in numbers.
    pub fn limiting_margin(self, r: &LegResult) -> String {
        let Some(l) = &r.limiting else {
            return NO_MARGIN.to_string();
        };
        match r.limiting_check() {
            Some(c) if l.has_margin() && !c.unit.is_empty() => {
                let (s, unit) = self.limit_shown(c);
                let d = s.decimals;
                s.margin
                    .map_or_else(|| l.margin.clone(), |m| format!("{m:+.d$} {unit}"))
            }
            _ => l.margin.clone(),
        }
    }

    /// The limiting check and its margin in one phrase, as [`Limiting::words`] in the
    /// display unit (`XHIG density altitude -9 ft`, `XSHT endorsement`).
    ///
    /// [`Limiting::words`]: crate::assess::leg::Limiting::words
    pub fn limiting_words(self, r: &LegResult) -> String {
        match &r.limiting {
            None => NO_MARGIN.to_string(),
            Some(l) if l.has_margin() => format!("{} {}", l.check, self.limiting_margin(r)),
            Some(l) => l.check.clone(),
        }
    }

    /// Headroom as a figure ([`Headroom::figure_in`]): `+4.2°C`, `≥+41.4°F`.
    pub fn headroom(self, h: &Headroom) -> String {
        h.figure_in(|d| self.warming_value(d), self.temp_unit())
    }

    /// Headroom in words ([`Headroom::words_in`]).
    pub fn headroom_words(self, h: &Headroom) -> String {
        h.words_in(
            |d| self.warming_value(d),
            |c| self.temp_value(c),
            self.temp_unit(),
        )
    }

    /// A pairing's margin in the display unit, with its unit and the digits to show:
    /// the deciding check's, or the deciding weather minimum's (`+200 ft` of ceiling),
    /// rounded down to those digits so it never reads larger than it is (-8.4 kt is
    /// -9 kt; a tenth for SM and in); `None` where there is none. The board's cells and
    /// `check --pairings` both print this figure.
    pub fn pair_margin(
        self,
        c: &crate::assess::pairing::PairCell,
    ) -> Option<(f64, &'static str, usize)> {
        use crate::assess::pairing::PairLimit;
        let m = c.margin()?;
        let vis = c
            .minimum
            .is_some_and(|w| c.limiting == PairLimit::Weather && w.kind == LimitKind::Visibility);
        let (m, unit) = self.limit_value(m, c.margin_unit(), vis);
        let d = if matches!(unit, "SM" | "in") { 1 } else { 0 };
        let p = 10f64.powi(d as i32);
        // `+ 0.0`: never "-0".
        Some(((m * p + 1e-9).floor() / p + 0.0, unit, d))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn imperial() -> Show {
        Show(DisplayUnits {
            distance: DistanceUnit::Ft,
            mass: MassUnit::Lb,
            pressure: PressureUnit::InHg,
            temperature: TemperatureUnit::F,
        })
    }

    #[test]
    fn conversions_match_the_published_definitions() {
        // Exact definitions: 1 ft = 0.3048 m, 1 lb = 0.453 592 37 kg (NIST SP 811,
        // appendix B); 1 inHg = 33.8639 hPa (NIST SP 811); °F = °C × 1.8 + 32.
        let s = imperial();
        assert_eq!(s.dist(304.8), "1000 ft");
        assert_eq!(s.mass(453.592_37), "1000 lb");
        assert_eq!(s.pressure(1013.25), "29.92 inHg");
        assert_eq!(s.temp(100.0), "212.0 °F");
        assert_eq!(s.temp0(-40.0), "-40 °F");
        assert_eq!(s.warming(5.0), "+9.0 °F");
        let m = Show(DisplayUnits {
            distance: DistanceUnit::M,
            mass: MassUnit::Kg,
            pressure: PressureUnit::Hpa,
            temperature: TemperatureUnit::C,
        });
        assert_eq!(m.dist(721.4), "721 m");
        assert_eq!(m.pressure(1013.0), "1013.0 hPa");
        assert_eq!(m.warming(-3.24), "-3.2 °C");
        // Sentences from the assessment, in the display units.
        let why = "XPIN 26 takeoff: needs 1157 m, 1100 m available (-5 %)";
        assert_eq!(m.in_text(why), why);
        assert_eq!(
            s.in_text(why),
            "XPIN 26 takeoff: needs 3796 ft, 3609 ft available (-5 %)"
        );
        // 1 SM = 1609.344 m (NIST SP 811): 4828 m is 3.0 SM.
        assert_eq!(
            s.in_text("visibility 4828 m against 8047 m"),
            "visibility 3.0 SM against 5.0 SM"
        );
        assert_eq!(s.limit_value(1609.344, "m", true), (1.0, "SM"));
        assert_eq!(s.limit_value(20.0, "kt", false), (20.0, "kt"));
        assert_eq!(s.limit_value(25.4, "mm", false), (1.0, "in"));
        // A unit before a colon: 1600 kg is 3527.4 lb.
        assert_eq!(
            s.in_text("maximum takeoff mass (1600 kg): check the loading"),
            "maximum takeoff mass (3527 lb): check the loading"
        );
        // A range converts whole (590 kg = 1300.7 lb); arms in inches with lb
        // (1 in = 25.4 mm exactly, NIST SP 811).
        let range = "mass 1601 kg is outside the flight-manual table (590 to 1600 kg)";
        assert_eq!(
            s.in_text(range),
            "mass 3530 lb is outside the flight-manual table (1301 to 3527 lb)"
        );
        assert_eq!(m.in_text(range), range);
        assert_eq!(
            s.in_text("CG 1310 mm at 1600 kg (takeoff)"),
            "CG 51.6 in at 3527 lb (takeoff)"
        );
        assert_eq!(m.in_text("CG 1310 mm at 1600 kg"), "CG 1310 mm at 1600 kg");
    }

    #[test]
    fn payload_is_rounded_the_safe_way_after_converting() {
        // 10 kg = 22.046 lb (1 lb = 0.453 592 37 kg, NIST SP 811): room for 22 lb, and
        // 10 kg too many is 23 lb to take off; in kg, 32.8 is 32 and -32.2 is 33 off.
        let s = imperial();
        assert_eq!(s.payload(10.0), (true, "22 lb".to_string()));
        assert_eq!(s.payload(-10.0), (false, "23 lb".to_string()));
        let m = Show(DisplayUnits {
            distance: DistanceUnit::M,
            mass: MassUnit::Kg,
            pressure: PressureUnit::Hpa,
            temperature: TemperatureUnit::C,
        });
        assert_eq!(m.payload(32.8), (true, "32 kg".to_string()));
        assert_eq!(m.payload(-32.2), (false, "33 kg".to_string()));
    }

    #[test]
    fn a_bounded_headroom_keeps_its_mark_in_fahrenheit() {
        // A temperature difference of 1 °C is 1.8 °F and 0 °C is 32 °F (NIST SP 811,
        // appendix B): 38.7 °C of cooling is 69.7 °F, a table end at -10 °C is 14 °F.
        let h = crate::assess::leg::Headroom {
            warming_c: -38.7,
            warmest_oat_c: -10.0,
            table_ends: true,
            survives_expected_high: None,
        };
        let s = imperial();
        assert_eq!(
            h.figure_in(|d| s.warming_value(d), s.temp_unit()),
            "≤-69.7°F"
        );
        let w = h.words_in(|d| s.warming_value(d), |c| s.temp_value(c), s.temp_unit());
        assert_eq!(
            w,
            "below now: needs at least 69.7 °F of cooling, still below at a departure OAT of \
             14.0 °F, where the flight-manual table ends"
        );
        // In °C the words are the report's own.
        assert_eq!(h.words_in(|d| d, |c| c, "°C"), h.words());
    }

    /// The cooling and the OAT it reaches add up as shown (trial finding: 79.2 °F less
    /// 11.3 °F printed as 67.8 °F). By NIST SP 811 (°F = 1.8 °C + 32): 26.2 °C is
    /// 79.16 °F, shown 79.2; 6.3 °C of cooling is 11.34 °F, shown 11.4 (rounded the
    /// safe way, more cooling); 79.2 − 11.4 = 67.8 °F. Room is rounded down: 4.15 °C
    /// is 7.47 °F, shown 7.4.
    #[test]
    fn a_headroom_and_its_oat_add_up_in_fahrenheit() {
        let s = imperial();
        let below = crate::assess::leg::Headroom {
            warming_c: -6.3,
            warmest_oat_c: 19.9,
            table_ends: false,
            survives_expected_high: None,
        };
        assert_eq!(s.temp(26.2), "79.2 °F");
        assert_eq!(
            s.headroom_words(&below),
            "below now: needs 11.4 °F of cooling, not below at a departure OAT of 67.8 °F or colder"
        );
        assert_eq!(s.headroom(&below), "-11.4°F");
        let room = crate::assess::leg::Headroom {
            warming_c: 4.15,
            warmest_oat_c: 20.15,
            table_ends: false,
            survives_expected_high: None,
        };
        // 16.0 °C is 60.8 °F; 60.8 + 7.4 = 68.2 °F.
        assert_eq!(
            s.headroom_words(&room),
            "takes 7.4 °F more warming: turns below at a departure OAT of 68.2 °F"
        );
        assert_eq!(s.headroom_degrees(4.15), "+7.4 °F");
    }
}
