//! The detail of one leg (or pairing): every number opened to its chain, as the basis
//! an instructor signs. Pure: lines from an assessed result.

use ratatui::text::{Line, Span};

use super::theme::Theme;
use crate::assess::leg::{ClimbResult, PhaseResult, Side};
use crate::assess::wind::Side as XSide;
use crate::assess::{LegResult, State};
use crate::ops::Ops;
use crate::ops::actype::SurfaceRule;

fn state_span(t: Theme, s: State) -> Span<'static> {
    Span::styled(format!("{} {}", s.glyph(), s.word()), t.state(s))
}

fn pct(margin: f64) -> String {
    if margin.is_finite() {
        format!("{:+.0} %", margin * 100.0)
    } else {
        "—".to_string()
    }
}

fn plain(text: impl Into<String>) -> Line<'static> {
    Line::from(text.into())
}

fn indented(depth: usize, text: impl Into<String>) -> Line<'static> {
    Line::from(format!("{}{}", "  ".repeat(depth), text.into()))
}

/// The lines of the detail of `r`. `title` overrides the heading (pairings).
pub fn lines(ops: &Ops, r: &LegResult, title: Option<&str>, t: Theme) -> Vec<Line<'static>> {
    let mut out: Vec<Line<'static>> = Vec::new();
    let leg = ops.legs.get(r.index);
    let heading = match (title, leg) {
        (Some(title), _) => title.to_string(),
        (None, Some(leg)) => format!(
            "{}  {}  {}→{}  {}–{}  {} (pilot {})",
            r.id,
            leg.aircraft,
            leg.from,
            leg.to,
            leg.departs_utc().format("%H%MZ"),
            leg.arrives_utc().format("%H%MZ"),
            r.category.name().replace('_', " "),
            if leg.pilot.is_empty() {
                "—"
            } else {
                &leg.pilot
            },
        ),
        (None, None) => r.id.clone(),
    };
    out.push(Line::from(vec![
        Span::styled(heading, t.heading()),
        Span::raw("  "),
        state_span(t, r.state),
    ]));
    let limiting = r
        .limiting
        .as_ref()
        .map_or("—".to_string(), |l| format!("{} ({})", l.check, l.margin));
    out.push(plain(format!(
        "Limiting: {limiting}   Headroom: {}",
        headroom_words(r)
    )));
    out.push(plain(format!(
        "Mass: takeoff {}, landing {}",
        kg(r.takeoff_mass_kg),
        kg(r.landing_mass_kg)
    )));
    if !r.reasons.is_empty() {
        out.push(Line::styled("Why:", t.heading()));
        for why in &r.reasons {
            out.push(Line::styled(format!("  - {why}"), t.state(r.state)));
        }
    }
    side(&mut out, "Departure", &r.departure, t);
    let same = r.arrival.airfield == r.departure.airfield
        && r.arrival.event_at == r.departure.event_at
        && r.arrival.takeoff.is_none()
        && r.arrival.landing.is_none();
    if !same {
        side(&mut out, "Arrival", &r.arrival, t);
    }
    if !r.advice.is_empty() {
        out.push(Line::default());
        out.push(Line::styled("Advice", t.heading()));
        for a in &r.advice {
            out.push(plain(format!("  - {a}")));
        }
    }
    out.push(Line::default());
    out.push(Line::styled(crate::CAUTION, t.caution()));
    out
}

fn kg(m: Option<f64>) -> String {
    m.map_or("—".to_string(), |m| format!("{m:.0} kg"))
}

/// Headroom in words for the detail.
pub fn headroom_words(r: &LegResult) -> String {
    match r.headroom {
        None => "— (no data)".to_string(),
        Some(h) if h.table_ends && h.warming_c >= 0.0 => format!(
            "≥ {:+.1} °C of warming (the flight-manual table ends at {:.1} °C)",
            h.warming_c, h.warmest_oat_c
        ),
        Some(h) if h.warming_c < 0.0 => format!(
            "{:+.1} °C: below now; needs {:.1} °C cooler (below from {:.1} °C)",
            h.warming_c, -h.warming_c, h.warmest_oat_c
        ),
        Some(h) => format!(
            "{:+.1} °C of warming left (below from {:.1} °C)",
            h.warming_c, h.warmest_oat_c
        ),
    }
}

fn side(out: &mut Vec<Line<'static>>, what: &str, s: &Side, t: Theme) {
    out.push(Line::default());
    let runway = s.runway.as_deref().map_or("no runway".to_string(), |r| {
        if s.runway_reason.is_empty() {
            format!("runway {r}")
        } else {
            format!("runway {r} ({})", s.runway_reason)
        }
    });
    out.push(Line::from(vec![
        Span::styled(
            format!(
                "── {what} {} {} · {runway}  ",
                s.airfield,
                s.event_at.format("%H%MZ")
            ),
            t.heading(),
        ),
        state_span(t, s.state),
    ]));
    match &s.observation {
        None => out.push(Line::styled(
            "Observation: none valid (no-data)",
            t.state(State::NoData),
        )),
        Some(o) => {
            let mut tags: Vec<&str> = Vec::new();
            if o.manual {
                tags.push("entered by hand");
            }
            let as_of = format!(
                "as of now: no report for {} yet",
                s.event_at.format("%H%MZ")
            );
            if o.as_of {
                tags.push(&as_of);
            }
            if o.stale {
                tags.push("STALE");
            }
            let tags = if tags.is_empty() {
                String::new()
            } else {
                format!("; {}", tags.join("; "))
            };
            out.push(plain(format!(
                "Observation, {:.0} min old{tags}:",
                o.age_min
            )));
            out.push(indented(1, o.text.clone()));
        }
    }
    if let Some(a) = s.air {
        out.push(plain(format!(
            "Air: OAT {:.1} °C{}, QNH {:.1} hPa",
            a.oat_c,
            a.dewpoint_c
                .map_or(String::new(), |d| format!(", dew point {d:.1} °C")),
            a.qnh_hpa,
        )));
        out.push(plain(format!(
            "     station pressure {:.1} hPa, pressure altitude {:.0} ft, ISA {:+.1} °C",
            a.station_pressure_hpa, a.pressure_altitude_ft, a.isa_deviation_c
        )));
        let thumb =
            crate::atmosphere::density_altitude_rule_of_thumb_ft(a.pressure_altitude_ft, a.oat_c);
        out.push(Line::from(vec![
            Span::raw("     "),
            Span::styled(
                format!("density altitude {:.0} ft", a.density_altitude_ft),
                t.heading(),
            ),
            Span::styled(
                format!(" (cross-check, 120 ft/°C rule: {thumb:.0} ft)"),
                t.dim(),
            ),
        ]));
    }
    if !s.ends.is_empty() {
        out.push(plain("Wind per runway end (steady; limits use the gust):"));
        for e in &s.ends {
            let w = e.wind;
            let head = if w.headwind_kt >= 0.0 {
                format!("headwind {:.0} kt", w.headwind_kt)
            } else {
                format!("tailwind {:.0} kt", -w.headwind_kt)
            };
            let from = match w.crosswind_from {
                XSide::Left => "left",
                XSide::Right => "right",
            };
            let tag = if e.in_use {
                "in use"
            } else if e.usable {
                "alternative"
            } else {
                "not usable"
            };
            out.push(Line::from(vec![
                Span::raw(format!(
                    "  {:<4} {:<11} {head}, crosswind {:.0} kt from the {from}  ",
                    e.designator, tag, w.crosswind_kt
                )),
                state_span(t, e.state),
            ]));
        }
    }
    if let Some(p) = &s.takeoff {
        phase(out, "Takeoff", p, t);
    }
    if let Some(c) = &s.climb {
        climb(out, c, t);
    }
    if let Some(p) = &s.landing {
        phase(out, "Landing", p, t);
    }
    if !s.limits.is_empty() {
        out.push(plain("Limits:"));
        for l in &s.limits {
            let v = l
                .value
                .map_or("—".to_string(), |v| format!("{v:.0} {}", l.unit));
            let lim = l
                .limit
                .map_or("—".to_string(), |v| format!("{v:.0} {}", l.unit));
            let margin = if l.margin.is_finite() {
                format!("{:+.0} {}", l.margin, l.unit)
            } else {
                "—".to_string()
            };
            out.push(Line::from(vec![
                Span::raw(format!(
                    "  {:<16} {:>10} limit {:>10}  margin {:>9}  ",
                    l.kind.word(),
                    v,
                    lim,
                    margin
                )),
                state_span(t, l.state),
            ]));
            if !l.note.is_empty() && l.state != State::Within {
                out.push(indented(3, l.note.clone()));
            }
            if !l.source.is_empty() {
                out.push(Line::styled(format!("      from {}", l.source), t.dim()));
            }
        }
    }
    for g in &s.gaps {
        out.push(Line::styled(
            format!("No data: {g}"),
            t.state(State::NoData),
        ));
    }
}

fn phase(out: &mut Vec<Line<'static>>, what: &str, p: &PhaseResult, t: Theme) {
    let c = &p.chain;
    out.push(Line::from(vec![
        Span::styled(format!("{what} at {:.0} kg  ", p.mass_kg), t.heading()),
        state_span(t, p.state),
        Span::raw(format!("  margin {}", pct(p.margin))),
    ]));
    out.push(indented(
        1,
        format!(
            "flight-manual table: ground roll {:.0} m, 50 ft {:.0} m",
            c.table_ground_roll_m, c.table_distance_50ft_m
        ),
    ));
    let wind = if c.wind_factoring_in_manual {
        format!(
            "wind: {:+.0} kt headwind (the manual's figures include the factoring) → × {:.3}",
            c.headwind_reported_kt, c.wind_factor
        )
    } else {
        format!(
            "wind: {:+.0} kt headwind reported, {:+.1} kt counted (policy factoring) → × {:.3}",
            c.headwind_reported_kt, c.headwind_used_kt, c.wind_factor
        )
    };
    out.push(indented(1, wind));
    let surface = match c.surface_rule {
        None => format!("surface: {} → no correction", c.surface.word()),
        Some(r) => {
            let how = match r.rule {
                SurfaceRule::MultiplyBy(f) => format!("× {f:.2}"),
                SurfaceRule::AddPercentOfGroundRoll(p) => format!("+ {p:.0} % of the ground roll"),
            };
            format!(
                "surface: {} → {how} ({})",
                c.surface.word(),
                r.origin.word()
            )
        }
    };
    out.push(indented(1, surface));
    out.push(indented(
        2,
        format!(
            "→ ground roll {:.0} m, 50 ft {:.0} m",
            c.after_surface_ground_roll_m, c.after_surface_distance_50ft_m
        ),
    ));
    if c.adverse_slope_percent > 0.0 {
        out.push(indented(
            1,
            format!(
                "slope: {:.1} % adverse → × {:.3} ({})",
                c.adverse_slope_percent,
                c.slope_factor,
                c.slope_origin.word()
            ),
        ));
    } else {
        out.push(indented(
            1,
            "slope: none adverse → no correction (a favourable slope earns no credit)",
        ));
    }
    out.push(indented(
        1,
        format!(
            "result: ground roll {:.0} m, 50 ft {:.0} m",
            c.ground_roll_m, c.distance_50ft_m
        ),
    ));
    for ch in &p.checks {
        let r = &ch.result;
        out.push(Line::from(vec![
            Span::raw(format!(
                "  check {}: {:.0} m × {} = {:.0} m needed of {:.0} m → {}  ",
                ch.rule,
                r.figure_m,
                r.factor,
                r.required_m,
                r.available_m,
                pct(r.margin)
            )),
            state_span(t, ch.state),
        ]));
        if !ch.source.is_empty() {
            out.push(Line::styled(format!("      from {}", ch.source), t.dim()));
        }
    }
}

fn climb(out: &mut Vec<Line<'static>>, c: &ClimbResult, t: Theme) {
    let ch = &c.chain;
    out.push(Line::from(vec![
        Span::styled("Climb  ", t.heading()),
        state_span(t, c.state),
        Span::raw(format!("  margin {}", pct(ch.margin()))),
    ]));
    out.push(indented(
        1,
        format!(
            "rate {:.0} ft/min at {:.0} KIAS = {:.0} kt true airspeed; ground speed {:.0} kt{}",
            ch.rate_fpm,
            ch.climb_speed_kias,
            ch.true_airspeed_kt,
            ch.ground_speed_kt,
            if ch.tailwind_kt > 0.0 {
                format!(" (tailwind {:.0} kt)", ch.tailwind_kt)
            } else {
                " (no headwind credit)".to_string()
            }
        ),
    ));
    out.push(indented(
        1,
        format!(
            "gradient {:.0} ft/min × 60 ÷ {:.0} kt = {:.0} ft/NM",
            ch.rate_fpm, ch.ground_speed_kt, ch.gradient_ft_per_nm
        ),
    ));
    out.push(indented(
        1,
        format!(
            "check rate ≥ {:.0} ft/min (category minimum) → {}",
            ch.min_rate_fpm,
            pct(ch.rate_margin)
        ),
    ));
    if let (Some(req), Some(m)) = (ch.required_gradient_ft_per_nm, ch.gradient_margin) {
        out.push(indented(
            1,
            format!(
                "check gradient ≥ {req:.0} ft/NM (runway end's departure) → {}",
                pct(m)
            ),
        ));
    }
    if ch.true_airspeed_kt > ch.climb_speed_kias * 1.08 {
        out.push(indented(
            1,
            "High density altitude: the same indicated speeds mean a higher true airspeed \
             and the ground looks faster — fly the normal indicated speeds.",
        ));
    }
}
