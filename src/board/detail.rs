//! The detail of one leg (or pairing): every number opened to its chain, as the basis
//! an instructor signs. Pure: lines from an assessed result.

use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::style::{Color, Style};
use ratatui::symbols::Marker;
use ratatui::text::{Line, Span};
use ratatui::widgets::Widget;
use ratatui::widgets::canvas::{Canvas, Line as CanvasLine};

use super::display::Show;
use super::theme::Theme;
use crate::assess::leg::{ClimbResult, PhaseResult, Side};
use crate::assess::mass::MassBalance;
use crate::assess::wind::Side as XSide;
use crate::assess::{LegResult, State};
use crate::ops::Ops;
use crate::ops::actype::SurfaceRule;
use crate::ops::operator::MassUnit;

fn state_span(t: Theme, s: State) -> Span<'static> {
    Span::styled(format!("{} {}", s.glyph(), s.word()), t.state(s))
}

/// A margin as a whole percent, rounded down as the legs table and `check` show it
/// (`-6.4 %` is `-7 %`: never larger than it is).
fn pct(margin: f64) -> String {
    if margin.is_finite() {
        crate::assess::leg::percent_text(margin)
    } else {
        "—".to_string()
    }
}

fn plain(text: impl Into<String>) -> Line<'static> {
    Line::from(text.into())
}

/// One limit's row: its label (on a line of its own when longer than the label
/// column, e.g. a named station), value, limit, margin and state.
fn limit_row(
    out: &mut Vec<Line<'static>>,
    t: Theme,
    label: &str,
    value: &str,
    limit: &str,
    margin: &str,
    state: State,
) {
    const LABEL: usize = 16;
    let label = if label.chars().count() > LABEL {
        out.push(indented(1, label.to_string()));
        ""
    } else {
        label
    };
    out.push(Line::from(vec![
        Span::raw(format!(
            "  {label:<LABEL$} {value:>10} limit {limit:>10}  margin {margin:>10}  "
        )),
        state_span(t, state),
    ]));
}

/// A limit's value, limit and margin as shown ([`LimitCheck::shown`]): the margin is
/// the shown value minus the shown limit, never rounded up (`60.4 L limit 48.6 L margin
/// +11.8 L`, not `60 L limit 49 L margin +12 L`). Negative margins carry `minus`.
fn shown_figures(
    c: &crate::assess::limits::LimitCheck,
    minus: &str,
    convert: impl Fn(f64) -> f64,
    unit: &str,
    decimals: usize,
) -> (String, String, String) {
    let s = c.shown(convert, decimals);
    let d = s.decimals;
    let fig = |x: Option<f64>| x.map_or("—".to_string(), |x| format!("{x:.d$} {unit}"));
    let margin = s.margin.map_or("—".to_string(), |m| {
        if m < 0.0 {
            format!("{minus}{:.d$} {unit}", -m)
        } else {
            format!("+{m:.d$} {unit}")
        }
    });
    (fig(s.value), fig(s.limit), margin)
}

/// A weather or pilot limit's value, limit and margin in the display unit, at that
/// unit's precision ([`shown_figures`]).
fn limit_figures(l: &crate::assess::limits::LimitCheck, show: Show) -> (String, String, String) {
    let vis = l.kind == crate::assess::limits::LimitKind::Visibility;
    let (_, unit) = show.limit_value(0.0, l.unit, vis);
    let decimals = if matches!(unit, "SM" | "in") { 1 } else { 0 };
    shown_figures(
        l,
        "-",
        |v| show.limit_value(v, l.unit, vis).0,
        unit,
        decimals,
    )
}

fn indented(depth: usize, text: impl Into<String>) -> Line<'static> {
    Line::from(format!("{}{}", "  ".repeat(depth), text.into()))
}

/// The lines of the detail of `r`, for a pane `width` columns wide (the envelope
/// drawing's size). `title` overrides the heading (pairings).
pub fn lines(
    ops: &Ops,
    r: &LegResult,
    title: Option<&str>,
    t: Theme,
    width: u16,
) -> Vec<Line<'static>> {
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
            r.category.words(),
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
    let show = Show::of(ops);
    let limiting = r.limiting.as_ref().map_or("—".to_string(), |l| {
        // A limit row's margin in the display unit, as its row below shows it; a hard
        // limit (a lapsed endorsement) has none in numbers and names only the check.
        match r.limiting_check() {
            Some(c) => match limit_figures(c, show).2.as_str() {
                "—" => l.check.clone(),
                m => format!("{} ({m})", l.check),
            },
            None if l.has_margin() => format!("{} ({})", l.check, l.margin),
            None => l.check.clone(),
        }
    });
    // One line where both fit; else each on its own, so "Headroom:" never ends a
    // line without its value (finding 27).
    let limiting = format!("Limiting: {limiting}");
    let headroom = format!("Headroom: {}", headroom_words(r, show));
    if super::fit::width(&limiting) + 3 + super::fit::width(&headroom) <= usize::from(width) {
        out.push(plain(format!("{limiting}   {headroom}")));
    } else {
        out.push(plain(limiting));
        out.push(plain(headroom));
    }
    let unit = ops.operator.display_units.mass;
    out.push(plain(format!(
        "Mass: takeoff {}, landing {}{}",
        // Rounded up in the display unit, as the mass limits' rows show them.
        mass_up(r.takeoff_mass_kg, unit),
        mass_up(r.landing_mass_kg, unit),
        match &r.payload_headroom {
            Some(p) => format!("   Payload: {}", payload_words(p, unit)),
            None => String::new(),
        }
    )));
    if !r.reasons.is_empty() {
        out.push(Line::styled("Why:", t.heading()));
        // As `check` and the sheet word them: a limit row's reason rebuilt from the
        // row in the display unit, not converted from its rounded text.
        for why in show.reasons(r) {
            out.push(Line::styled(format!("  - {why}"), t.state(r.state)));
        }
    }
    side(&mut out, "Departure", &r.departure, show, t);
    let same = r.arrival.airfield == r.departure.airfield
        && r.arrival.event_at == r.departure.event_at
        && r.arrival.takeoff.is_none()
        && r.arrival.landing.is_none();
    if !same {
        side(&mut out, "Arrival", &r.arrival, show, t);
    }
    if let Some(mb) = &r.mass_balance {
        mass_balance(&mut out, mb, r, unit, t, width);
    }
    if !r.advice.is_empty() {
        out.push(Line::default());
        out.push(Line::styled("Advice", t.heading()));
        for a in &r.advice {
            out.push(plain(format!("  - {}", show.in_text(a))));
        }
    }
    out.push(Line::default());
    out.push(Line::styled(crate::CAUTION, t.caution()));
    out
}

/// A mass in the operator's display unit.
fn mass(kg: f64, unit: MassUnit) -> String {
    match unit {
        MassUnit::Kg => format!("{kg:.0} kg"),
        MassUnit::Lb => format!("{:.0} lb", crate::units::kg_to_lb(kg)),
    }
}

/// A mass against a maximum, rounded up after conversion (`986.2 kg` is `987 kg`,
/// `2174.2 lb` is `2175 lb`), as the limits' rows show it; `—` for none.
fn mass_up(kg: Option<f64>, unit: MassUnit) -> String {
    kg.map_or("—".to_string(), |kg| match unit {
        MassUnit::Kg => format!("{:.0} kg", crate::units::up0(kg)),
        MassUnit::Lb => format!("{:.0} lb", crate::units::up0(crate::units::kg_to_lb(kg))),
    })
}

fn mass_opt(kg: Option<f64>, unit: MassUnit) -> String {
    kg.map_or("—".to_string(), |m| mass(m, unit))
}

/// The payload headroom in the dispatcher's words.
pub fn payload_words(p: &crate::assess::leg::PayloadHeadroom, unit: MassUnit) -> String {
    // Rounded the safe way, as `leg set` does: room down, what must come off up.
    let (value, word) = match unit {
        MassUnit::Kg => (p.kg, "kg"),
        MassUnit::Lb => (crate::units::kg_to_lb(p.kg), "lb"),
    };
    if value >= 0.0 {
        format!("can take {:.0} {word} more at {}", value.floor(), p.station)
    } else {
        format!(
            "{:.0} {word} must come off at {}",
            (-value).ceil(),
            p.station
        )
    }
}

/// Arms: mm with kg, inches with lb (the weight-and-balance convention of each).
fn arm(mm: f64, unit: MassUnit) -> String {
    match unit {
        MassUnit::Kg => format!("{mm:.0} mm"),
        MassUnit::Lb => format!("{:.1} in", mm / 25.4),
    }
}

fn moment(kg_mm: f64, unit: MassUnit) -> String {
    match unit {
        MassUnit::Kg => format!("{:.1} kg·m", kg_mm / 1000.0),
        MassUnit::Lb => format!("{:.0} lb·in", crate::units::kg_to_lb(kg_mm) / 25.4),
    }
}

/// `text` in lines of at most `w` characters, broken between words (a word longer than
/// `w` is broken inside); the continuation lines are 2 narrower (they are indented).
fn name_lines(text: &str, w: usize) -> Vec<String> {
    let mut lines: Vec<String> = Vec::new();
    let mut cur = String::new();
    for word in text.split_whitespace() {
        let room = if lines.is_empty() {
            w
        } else {
            w.saturating_sub(2)
        }
        .max(4);
        let need = cur.chars().count() + usize::from(!cur.is_empty()) + word.chars().count();
        if need <= room {
            if !cur.is_empty() {
                cur.push(' ');
            }
            cur.push_str(word);
            continue;
        }
        if !cur.is_empty() {
            lines.push(std::mem::take(&mut cur));
        }
        let mut rest: Vec<char> = word.chars().collect();
        loop {
            let room = if lines.is_empty() {
                w
            } else {
                w.saturating_sub(2)
            }
            .max(4);
            if rest.len() <= room {
                cur = rest.into_iter().collect();
                break;
            }
            let tail = rest.split_off(room);
            lines.push(rest.into_iter().collect());
            rest = tail;
        }
    }
    if !cur.is_empty() || lines.is_empty() {
        lines.push(cur);
    }
    lines
}

fn mass_balance(
    out: &mut Vec<Line<'static>>,
    mb: &MassBalance,
    r: &LegResult,
    unit: MassUnit,
    t: Theme,
    width: u16,
) {
    out.push(Line::default());
    let state = mb
        .checks
        .iter()
        .map(|c| c.state)
        .max()
        .unwrap_or(State::Within);
    let envelope = match mb.within_envelope {
        None => "fixed mass given: no loading, no CG".to_string(),
        Some(true) => "takeoff-to-landing CG line inside the envelope".to_string(),
        Some(false) => "the CG leaves the envelope".to_string(),
    };
    out.push(Line::from(vec![
        Span::styled(format!("── Mass and balance · {envelope}  "), t.heading()),
        state_span(t, state),
    ]));
    // The loading table, with the envelope drawn beside it when there is room.
    let mut left: Vec<Line<'static>> = Vec::new();
    if !mb.rows.is_empty() {
        left.push(Line::styled(
            format!(
                "  {:<28} {:>8} {:>9} {:>11} {:>7}",
                "load", "mass", "arm", "moment", "max"
            ),
            t.heading(),
        ));
        for row in &mb.rows {
            let over = row.max_mass_kg.is_some_and(|m| row.mass_kg > m + 1e-6);
            // The name whole, wrapped at words within its column (the rest of it on
            // the lines below), never cut.
            let mut name = name_lines(&row.name, 28).into_iter();
            let text = format!(
                "  {:<28} {:>8} {:>9} {:>11} {:>7}{}",
                name.next().unwrap_or_default(),
                mass(row.mass_kg, unit),
                arm(row.arm_mm, unit),
                moment(row.moment_kg_mm, unit),
                mass_opt(row.max_mass_kg, unit),
                if over { " ✗ over" } else { "" }
            );
            for text in std::iter::once(text).chain(name.map(|n| format!("    {n}"))) {
                left.push(if over {
                    Line::styled(text, t.state(State::Below))
                } else {
                    plain(text)
                });
            }
        }
    }
    for (what, p) in [
        ("ramp", mb.ramp),
        ("takeoff", mb.takeoff),
        ("landing", mb.landing),
    ] {
        let cg = if mb.rows.is_empty() {
            "—".to_string()
        } else {
            arm(p.cg_mm, unit)
        };
        left.push(plain(format!(
            "  {what:<8} mass {:>8}  CG {cg:>9}",
            // Rounded up, as the mass limits' rows show it.
            mass_up(Some(p.mass_kg), unit)
        )));
    }
    if !mb.rows.is_empty() {
        let gal = |l: f64| match unit {
            MassUnit::Kg => String::new(),
            MassUnit::Lb => format!(" ({:.1} US gal)", l / crate::units::L_PER_USGAL),
        };
        // Rounded the safe way: the fuel on board down, the reserve it must keep up
        // (as the limits' rows show them).
        let (start_l, landing_l) = (
            (mb.fuel_start_l + 1e-6).floor(),
            (mb.fuel_landing_l + 1e-6).floor(),
        );
        let reserve_l = (mb.fuel_reserve_l - 1e-6).ceil();
        left.push(plain(format!(
            "  fuel {start_l:.0} L{} at engine start, {landing_l:.0} L{} at landing,",
            gal(mb.fuel_start_l),
            gal(mb.fuel_landing_l),
        )));
        left.push(plain(format!(
            "       reserve {reserve_l:.0} L{}",
            gal(mb.fuel_reserve_l)
        )));
    }
    const LEFT_W: u16 = 72;
    let drawable = mb.envelope.len() >= 3 && !mb.rows.is_empty();
    let beside = drawable && width >= LEFT_W + 36;
    if beside {
        let plot = envelope_drawing(mb, unit, t, (width - LEFT_W).min(72), left.len());
        let n = left.len().max(plot.len());
        let mut left = left.into_iter();
        let mut plot = plot.into_iter();
        for _ in 0..n {
            let mut l = left.next().unwrap_or_default();
            let pad = usize::from(LEFT_W).saturating_sub(l.width());
            l.spans.push(Span::raw(" ".repeat(pad)));
            if let Some(p) = plot.next() {
                l.spans.extend(p.spans);
            }
            out.push(l);
        }
    } else {
        out.extend(left);
    }
    if let Some(p) = &r.payload_headroom {
        out.push(plain(format!(
            "  Payload headroom at today's temperature: {}",
            payload_words(p, unit)
        )));
    }
    if drawable && !beside {
        out.push(Line::default());
        out.extend(envelope_drawing(mb, unit, t, width, 12));
    }
    out.push(plain(
        "  Checks (station loads inside their limit: see the max column):",
    ));
    for c in &mb.checks {
        if c.kind == crate::assess::limits::LimitKind::Loading && c.state == State::Within {
            continue;
        }
        let (convert, unit, decimals): (fn(f64) -> f64, &str, usize) = match (c.unit, unit) {
            ("kg", MassUnit::Lb) => (crate::units::kg_to_lb, "lb", 0),
            ("mm", MassUnit::Lb) => (|mm| mm / 25.4, "in", 1),
            (u, _) => (|v| v, u, 0),
        };
        let (v, lim, margin) = shown_figures(c, "−", convert, unit, decimals);
        limit_row(out, t, &c.label(), &v, &lim, &margin, c.state);
        if !c.note.is_empty() && (c.state != State::Within || c.value.is_none()) {
            out.push(indented(3, c.note.clone()));
        }
        if !c.source.is_empty() {
            out.push(Line::styled(format!("      from {}", c.source), t.dim()));
        }
    }
}

/// The CG envelope drawn with braille lines in `width` columns and about `rows` rows:
/// the outline plain, the takeoff (`T`) and landing (`L`) points labelled and joined,
/// so it reads in monochrome.
fn envelope_drawing(
    mb: &MassBalance,
    unit: MassUnit,
    t: Theme,
    width: u16,
    rows: usize,
) -> Vec<Line<'static>> {
    const LABEL_W: u16 = 9;
    let plot_w = width.saturating_sub(LABEL_W + 2).min(64);
    // Caption, plot, axis, arm labels.
    let plot_h = (rows.saturating_sub(3) as u16).clamp(6, 14);
    let mut out = Vec::new();
    if plot_w < 16 {
        return out;
    }
    let (t_pt, l_pt) = (mb.takeoff, mb.landing);
    let arms = mb
        .envelope
        .iter()
        .map(|p| p.arm_mm)
        .chain([t_pt.cg_mm, l_pt.cg_mm]);
    let masses = mb
        .envelope
        .iter()
        .map(|p| p.mass_kg)
        .chain([t_pt.mass_kg, l_pt.mass_kg]);
    let (x0, x1) = arms.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
        (a.min(v), b.max(v))
    });
    let (y0, y1) = masses.fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
        (a.min(v), b.max(v))
    });
    if !(x0.is_finite() && x1 > x0 && y0.is_finite() && y1 > y0) {
        return out;
    }
    let (px, py) = ((x1 - x0) * 0.04, (y1 - y0) * 0.06);
    let (x0, x1, y0, y1) = (x0 - px, x1 + px, y0 - py, y1 + py);
    let outline = if t.color { Color::Gray } else { Color::Reset };
    let worst = mb
        .checks
        .iter()
        .map(|c| c.state)
        .max()
        .unwrap_or(State::Within);
    let path = t
        .state(worst)
        .fg
        .filter(|_| t.color)
        .unwrap_or(Color::Reset);
    let canvas = Canvas::default()
        .marker(Marker::Braille)
        .x_bounds([x0, x1])
        .y_bounds([y0, y1])
        .paint(|ctx| {
            let n = mb.envelope.len();
            for i in 0..n {
                let (a, b) = (mb.envelope[i], mb.envelope[(i + 1) % n]);
                ctx.draw(&CanvasLine::new(
                    a.arm_mm, a.mass_kg, b.arm_mm, b.mass_kg, outline,
                ));
            }
            ctx.layer();
            ctx.draw(&CanvasLine::new(
                t_pt.cg_mm,
                t_pt.mass_kg,
                l_pt.cg_mm,
                l_pt.mass_kg,
                path,
            ));
            ctx.layer();
            let bold = Style::new().add_modifier(ratatui::style::Modifier::BOLD);
            ctx.print(l_pt.cg_mm, l_pt.mass_kg, Span::styled("L", bold));
            ctx.print(t_pt.cg_mm, t_pt.mass_kg, Span::styled("T", bold));
        });
    let area = Rect::new(0, 0, plot_w, plot_h);
    let mut buf = Buffer::empty(area);
    canvas.render(area, &mut buf);
    let unit_word = match unit {
        MassUnit::Kg => "kg",
        MassUnit::Lb => "lb",
    };
    out.push(Line::styled(
        "CG envelope · T takeoff · L landing".to_string(),
        t.heading(),
    ));
    let label = |kg: f64| match unit {
        MassUnit::Kg => format!("{kg:.0} {unit_word}"),
        MassUnit::Lb => format!("{:.0} {unit_word}", crate::units::kg_to_lb(kg)),
    };
    for row in 0..plot_h {
        let left = if row == 0 {
            label(y1)
        } else if row == plot_h - 1 {
            label(y0)
        } else {
            String::new()
        };
        let mut spans = vec![Span::styled(
            format!("{left:>w$} │", w = usize::from(LABEL_W - 1)),
            t.dim(),
        )];
        for col in 0..plot_w {
            let cell = &buf[(col, row)];
            spans.push(Span::styled(cell.symbol().to_string(), cell.style()));
        }
        out.push(Line::from(spans));
    }
    let (lx, rx) = (arm(x0, unit), arm(x1, unit));
    let gap = usize::from(plot_w).saturating_sub(lx.chars().count() + rx.chars().count());
    let pad = " ".repeat(usize::from(LABEL_W - 1));
    out.push(Line::styled(
        format!("{pad} └{}", "─".repeat(usize::from(plot_w))),
        t.dim(),
    ));
    out.push(Line::styled(
        format!("{pad}  {lx}{}{rx}", " ".repeat(gap)),
        t.dim(),
    ));
    out
}

/// Headroom in words for the detail, as the report words it
/// ([`Headroom::words`](crate::assess::leg::Headroom::words)), in the display unit.
/// With no figure, why: no data, or below for what warming or cooling does not change
/// (the limits the assessment leaves out of its headroom search: every `below` limit but
/// density altitude, a failed mass and balance, no usable runway end).
pub fn headroom_words(r: &LegResult, show: Show) -> String {
    match r.headroom {
        None => format!("— ({})", r.headroom_absent_why()),
        Some(h) => h.words_in(
            |d| show.warming_value(d),
            |c| show.temp_value(c),
            show.temp_unit(),
        ),
    }
}

fn side(out: &mut Vec<Line<'static>>, what: &str, s: &Side, show: Show, t: Theme) {
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
            "Air: OAT {}{}, QNH {}",
            show.temp(a.oat_c),
            a.dewpoint_c
                .map_or(String::new(), |d| format!(", dew point {}", show.temp(d))),
            show.pressure(a.qnh_hpa),
        )));
        out.push(plain(format!(
            "     station pressure {}, pressure altitude {:.0} ft, ISA {}",
            show.pressure(a.station_pressure_hpa),
            a.pressure_altitude_ft,
            show.warming(a.isa_deviation_c)
        )));
        let thumb =
            crate::atmosphere::density_altitude_rule_of_thumb_ft(a.pressure_altitude_ft, a.oat_c);
        out.push(Line::from(vec![
            Span::raw("     "),
            Span::styled(
                // Rounded up, as the density-altitude limit's row shows it.
                format!(
                    "density altitude {:.0} ft",
                    crate::units::up0(a.density_altitude_ft)
                ),
                t.heading(),
            ),
            Span::styled(
                format!(" (cross-check, 120 ft/°C rule: {thumb:.0} ft)"),
                t.dim(),
            ),
        ]));
    }
    if !s.ends.is_empty() {
        out.push(plain(
            "Wind per runway end (headwind steady; crosswind and tailwind with the gust, as the \
             limits take them):",
        ));
        for e in &s.ends {
            let w = e.wind;
            // Rounded the safe way, as the limits' rows show them.
            let head = w.along_words();
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
            let mut spans = vec![
                Span::raw(format!(
                    "  {:<4} {:<11} {head}, crosswind {:.0} kt from the {from}  ",
                    e.designator,
                    tag,
                    w.crosswind_shown_kt()
                )),
                // A closed end is not assessed: its state would only say "no data".
                if e.usable {
                    state_span(t, e.state)
                } else {
                    Span::styled("✗ closed", t.error())
                },
            ];
            if let Some(today) = &e.today {
                let style = if e.usable { t.dim() } else { t.error() };
                spans.push(Span::styled(format!("  today: {today}"), style));
            }
            out.push(Line::from(spans));
        }
    }
    if let Some(p) = &s.takeoff {
        phase(out, "Takeoff", p, show, t);
    }
    if let Some(c) = &s.climb {
        climb(out, c, t);
    }
    if let Some(p) = &s.landing {
        phase(out, "Landing", p, show, t);
    }
    if !s.limits.is_empty() {
        out.push(plain("Limits:"));
        for l in &s.limits {
            let (v, lim, margin) = limit_figures(l, show);
            limit_row(out, t, &l.label(), &v, &lim, &margin, l.state);
            // A row with no value ("— limit 3000 ft") says why ("no ceiling reported").
            if !l.note.is_empty() && (l.state != State::Within || l.value.is_none()) {
                out.push(indented(3, show.in_text(&l.note)));
            }
            if !l.source.is_empty() {
                out.push(Line::styled(format!("      from {}", l.source), t.dim()));
            }
        }
    }
    for g in &s.gaps {
        out.push(Line::styled(
            format!("No data: {}", show.in_text(g)),
            t.state(State::NoData),
        ));
    }
}

fn phase(out: &mut Vec<Line<'static>>, what: &str, p: &PhaseResult, show: Show, t: Theme) {
    let c = &p.chain;
    let d = |m: f64| show.dist(m);
    out.push(Line::from(vec![
        Span::styled(
            format!("{what} at {}  ", show.mass_up(p.mass_kg)),
            t.heading(),
        ),
        state_span(t, p.state),
        Span::raw(format!("  margin {}", pct(p.margin))),
    ]));
    out.push(indented(
        1,
        format!(
            "flight-manual table: ground roll {}, 50 ft {}",
            d(c.table_ground_roll_m),
            d(c.table_distance_50ft_m)
        ),
    ));
    // A tailwind in words as a tailwind, not a negative headwind.
    let along = crate::assess::leg::along_wind;
    let wind = if c.wind_factoring_in_manual {
        format!(
            "wind: {} reported, counted as it is (the manual's table factors the wind \
             itself) → × {:.3}",
            along(c.headwind_used_kt, 1),
            c.wind_factor
        )
    } else {
        format!(
            "wind: {} reported, {} counted (policy factoring) → × {:.3}",
            along(c.headwind_reported_kt, 1),
            along(c.headwind_used_kt, 1),
            c.wind_factor
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
            "→ ground roll {}, 50 ft {}",
            d(c.after_surface_ground_roll_m),
            d(c.after_surface_distance_50ft_m)
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
            "result: ground roll {}, 50 ft {}",
            d(c.ground_roll_m),
            d(c.distance_50ft_m)
        ),
    ));
    for ch in &p.checks {
        let r = &ch.result;
        out.push(Line::from(vec![
            Span::raw(format!(
                "  check {}: {} × {} = {} needed of {} → {}  ",
                ch.rule,
                d(r.figure_m),
                r.factor,
                d(r.required_m),
                d(r.available_m),
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
            "rate {:.0} ft/min at {:.0} KIAS = {:.1} kt true airspeed; ground speed {:.1} kt{}",
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
            "gradient {:.0} ft/min × 60 ÷ {:.1} kt = {:.0} ft/NM",
            ch.rate_fpm,
            ch.ground_speed_kt,
            // Rounded down, as a figure against a minimum is shown.
            crate::units::down0(ch.gradient_ft_per_nm)
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

#[cfg(test)]
mod tests {
    use super::{name_lines, payload_words};
    use crate::assess::leg::PayloadHeadroom;
    use crate::ops::operator::MassUnit;

    /// Payload rounded the safe way, as `leg set` words it: room down, what must come
    /// off up (32.8 kg of room is 32 kg; 32.2 kg too many is 33 kg to take off), in
    /// pounds too (1 kg = 2.204 62 lb, the international pound, exact by definition).
    #[test]
    fn payload_is_rounded_the_safe_way() {
        let p = |kg: f64| PayloadHeadroom {
            kg,
            station: "Rear row".into(),
        };
        assert_eq!(
            payload_words(&p(32.8), MassUnit::Kg),
            "can take 32 kg more at Rear row"
        );
        assert_eq!(
            payload_words(&p(-32.2), MassUnit::Kg),
            "33 kg must come off at Rear row"
        );
        // 10 kg = 22.05 lb: room for 22 lb; 10 kg too many: 23 lb off.
        assert_eq!(
            payload_words(&p(10.0), MassUnit::Lb),
            "can take 22 lb more at Rear row"
        );
        assert_eq!(
            payload_words(&p(-10.0), MassUnit::Lb),
            "23 lb must come off at Rear row"
        );
    }

    #[test]
    fn a_long_name_wraps_whole_at_words() {
        let name = "X-TRNB empty (weighing report 2026-03, with the oil)";
        let lines = name_lines(name, 28);
        assert!(lines.len() > 1, "{lines:?}");
        assert!(lines[0].chars().count() <= 28);
        assert!(
            lines[1..].iter().all(|l| l.chars().count() <= 26),
            "{lines:?}"
        );
        assert_eq!(lines.join(" "), name, "nothing lost, nothing cut");
        assert_eq!(name_lines("pilot", 28), ["pilot"]);
        let long = "a".repeat(60);
        assert_eq!(name_lines(&long, 28).concat(), long);
    }
}
