//! Views of the sign-off, forecast and what-if parts of the board: the leg row's extra
//! columns, the status text, the detail's extra sections, and the overlays (sign-off
//! confirmation, what-if panel, save conflict, quit with changes pending). Pure.

use ratatui::buffer::Buffer;
use ratatui::layout::Rect;
use ratatui::style::Style;
use ratatui::text::{Line, Span};
use ratatui::widgets::{Block, Clear, Paragraph, Widget};

use super::app::{App, Mode};
use super::replan::{Ask, Figures, ReplanUi, Typed};
use super::signoff::{Mark, SIGN_FIELDS, SignForm};
use super::theme::Theme;
use crate::assess::State;

/// The help's line on the sign-off marks and the forecast column.
pub const HELP_LEGEND: &str = "✎ signed off · ↻ sign-off needs a re-check · forecast: fails ~HHMMZ (a forecast, not an observation: flown from about then, the TAFs make the leg below); a leg already gone on the board's clock shows left HHMMZ (in the air) or landed HHMMZ instead, never a departure forecast";

/// How the sign-off shows in the legs table.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct LegColumns {
    /// The sign-off column with words (else the glyph beside the change mark).
    pub words: bool,
}

impl LegColumns {
    /// For a legs pane `width` columns wide.
    pub fn for_width(width: u16) -> LegColumns {
        LegColumns {
            words: width >= 130,
        }
    }

    /// The first column: the change mark `*`, and on narrow panes the sign-off glyph.
    pub fn first_header(&self) -> &'static str {
        if self.words { " " } else { " ✎" }
    }

    /// Its cell for leg `k`.
    pub fn first_line(&self, app: &App, k: usize, flash: bool, t: Theme) -> Line<'static> {
        let star = if flash { "*" } else { " " };
        if self.words {
            return Line::from(star);
        }
        let m = app.mark(k);
        Line::from(vec![
            Span::raw(star),
            Span::styled(m.glyph(), mark_style(m, t)),
        ])
    }

    /// The sign-off column's heading.
    pub fn mark_header(&self) -> &'static str {
        if self.words { "sign-off" } else { "✎" }
    }

    /// The sign-off cell of leg `k`.
    pub fn mark_line(&self, app: &App, k: usize, t: Theme) -> Line<'static> {
        let m = app.mark(k);
        let text = if self.words {
            match m {
                Mark::Unsigned => "—".to_string(),
                Mark::Signed { .. } => "✎ signed".to_string(),
                Mark::Recheck { .. } => "↻ re-check".to_string(),
            }
        } else {
            m.glyph().to_string()
        };
        Line::styled(text, mark_style(m, t))
    }
}

fn mark_style(m: &Mark, t: Theme) -> Style {
    match m {
        Mark::Unsigned => Style::new(),
        Mark::Signed { .. } => t.state(State::Within),
        Mark::Recheck { .. } => t.state(State::Thin),
    }
}

/// The status text on the change list's frame: re-checks, the log head, pending changes.
pub fn status(app: &App) -> String {
    let mut s = app.signoffs.status();
    if app.plan.pending() {
        s.push_str(&format!(
            "{}what-if: {} pending (w writes, u undoes)",
            if s.is_empty() { "" } else { " · " },
            app.plan.steps.len()
        ));
    }
    if s.is_empty() { s } else { format!(" {s} ") }
}

/// Its style: a re-check or a broken log stands out.
pub fn status_style(app: &App, t: Theme) -> Style {
    if app.signoffs.rechecks() > 0 || app.plan.pending() {
        t.state(State::Thin)
    } else if matches!(
        app.signoffs.log_line(),
        crate::report::LogLine::Broken { .. }
    ) {
        t.error()
    } else {
        t.dim()
    }
}

/// The hints line in the new modes.
pub fn hint(mode: &Mode) -> String {
    match mode {
        Mode::Sign(_) => "Tab/↑↓ field · Enter signs · Esc cancels".into(),
        Mode::Replan(r) => match r.ask {
            Ask::Menu => "a t d l f c x: change · u undo · w write · Esc close".into(),
            Ask::Pick { .. } => {
                "↑↓ choose · type to jump · Enter applies the highlighted · Esc back".into()
            }
            Ask::Type { .. } => "type · Enter applies · Esc back".into(),
        },
        Mode::Conflict => "t keep theirs · o our changes onto theirs · Esc decide later".into(),
        Mode::ConfirmQuit => "y quit and drop the changes · w write · any other key stays".into(),
        _ => String::new(),
    }
}

/// The detail's extra sections for leg `k`: sign-off, forecast, what-if.
pub fn detail_extra(app: &App, k: usize, t: Theme) -> Vec<Line<'static>> {
    let mut lines = vec![Line::default(), Line::styled("Sign-off", t.heading())];
    let m = app.mark(k);
    lines.push(Line::styled(format!("  {}", m.text()), mark_style(m, t)));
    if let Mark::Recheck { why, .. } = m {
        for w in why {
            lines.push(Line::from(format!("    - {w}")));
        }
    }
    if matches!(m, Mark::Unsigned) {
        lines.push(Line::styled(
            "  S signs it off (the basis is shown first)",
            t.dim(),
        ));
    }
    lines.extend(super::forecast::detail_lines(app, k, t));
    if let Some(r) = app.assessment.legs.get(k)
        && let Some(c) = app.compared(r.index)
    {
        lines.push(Line::default());
        lines.push(Line::styled("What-if (pending, not written)", t.heading()));
        lines.extend(comparison(
            c.old.as_ref(),
            c.new.as_ref(),
            &c.what,
            t,
            usize::MAX,
        ));
    }
    lines
}

fn fig_cell(f: Option<&Figures>, row: usize) -> (String, Style) {
    match f {
        None => ("—".into(), Style::new()),
        Some(f) => match row {
            0 => (
                format!("{} {}", f.state.glyph(), f.state.word()),
                Style::new(),
            ),
            1 => (f.limiting.clone(), Style::new()),
            2 => (f.margin.clone(), Style::new()),
            3 => (f.headroom.clone(), Style::new()),
            _ => (f.forecast.clone(), Style::new()),
        },
    }
}

/// Old → new, one row per figure.
/// Old → new figures; the new side shortened at a word to fit `width` (the panel's
/// inner width; `usize::MAX` where the lines wrap on their own).
fn comparison(
    old: Option<&Figures>,
    new: Option<&Figures>,
    what: &[String],
    t: Theme,
    width: usize,
) -> Vec<Line<'static>> {
    let mut lines = vec![Line::from(vec![
        Span::styled(format!("  {:<10}", ""), t.dim()),
        Span::styled(format!("{:<44}", "now (as loaded)"), t.heading()),
        Span::styled("   ", t.dim()),
        Span::styled("what-if", t.heading()),
    ])];
    for (row, name) in ["state", "limiting", "margin", "headroom", "forecast"]
        .iter()
        .enumerate()
    {
        let (a, _) = fig_cell(old, row);
        let (b, _) = fig_cell(new, row);
        let (sa, sb) = if row == 0 {
            (
                old.map_or(Style::new(), |f| t.state(f.state)),
                new.map_or(Style::new(), |f| t.state(f.state)),
            )
        } else {
            (Style::new(), Style::new())
        };
        let a = if old.is_none() && row == 0 {
            "— (new leg)".to_string()
        } else {
            a
        };
        let b = if new.is_none() && row == 0 {
            "— cancelled".to_string()
        } else {
            b
        };
        // Shortened at a word with "…", never cut inside one (the help's promise); the
        // what-if side to what is left of the line (at 80 columns a wrapped value read
        // as the old one).
        let a = super::fit::words(&a, 43).into_owned();
        let b = super::fit::words(&b, width.saturating_sub(2 + 10 + 44 + 3)).into_owned();
        lines.push(Line::from(vec![
            Span::styled(format!("  {name:<10}"), t.dim()),
            Span::styled(format!("{a:<44}"), sa),
            Span::styled(" → ", t.dim()),
            Span::styled(b, sb),
        ]));
    }
    if !what.is_empty() {
        lines.push(Line::from(format!("  changed: {}", what.join(", "))));
    }
    lines
}

/// `lines` in a bordered box `w` wide centred in `area`, each line wrapped at words
/// with a hanging indent (so a wrapped item still reads as one).
pub(super) fn boxed(
    lines: Vec<Line<'static>>,
    title: String,
    area: Rect,
    buf: &mut Buffer,
    t: Theme,
    w: u16,
) {
    let inner_w = usize::from(w.min(area.width).saturating_sub(2));
    let lines: Vec<Line<'static>> = lines
        .into_iter()
        .flat_map(|l| super::fit::wrap(l, inner_w, None))
        .collect();
    let r = super::view::centered(area, w, lines.len() as u16 + 2);
    Clear.render(r, buf);
    Paragraph::new(lines)
        .block(Block::bordered().border_style(t.frame()).title(title))
        .render(r, buf);
}

fn opt(v: Option<f64>, unit: &str) -> String {
    v.map_or("—".into(), |x| format!("{x:.0}{unit}"))
}

/// The sign-off confirmation: the basis, the fields, and what Enter will do.
pub fn sign(app: &App, f: &SignForm, area: Rect, buf: &mut Buffer, t: Theme) {
    let r = &f.result;
    let fig = crate::signoff::Figures::of(r);
    let leg = app.ops.legs.get(r.index);
    let mut lines: Vec<Line<'static>> = Vec::new();
    lines.push(Line::from(format!(
        "{} {} {} {} pilot {} · {}",
        r.id,
        leg.map_or("—".into(), |l| l
            .departs_utc()
            .format("%H%MZ")
            .to_string()),
        leg.map_or("—", |l| l.aircraft.as_str()),
        leg.map_or("—".into(), |l| format!("{}→{}", l.from, l.to)),
        leg.map_or("—", |l| l.pilot.as_str()),
        r.category.words()
    )));
    let show = super::display::Show::of(&app.ops);
    lines.push(Line::from(vec![
        Span::raw("Assessed at "),
        Span::styled(f.basis_at.format("%H:%MZ").to_string(), t.heading()),
        Span::raw(" on the reports then known: "),
        Span::styled(
            format!("{} {}", r.state.glyph(), r.state.word()),
            t.state(r.state),
        ),
        Span::raw(format!(
            " · {}{} · headroom {}",
            fig.limiting_check.clone().unwrap_or_else(|| "—".into()),
            // A hard limit (an endorsement, a currency) has no margin to show.
            fig.limiting_margin
                .as_deref()
                .map_or(String::new(), |m| format!(" {m}")),
            super::view::headroom_cell(show, r)
        )),
    ]));
    let top = std::mem::take(&mut lines);
    for (name, e) in [("departure", &fig.departure), ("arrival", &fig.arrival)] {
        lines.push(Line::from(format!(
            "{name} {} rwy {}: PA {} DA {} OAT {} · headwind {} crosswind {}",
            e.airfield,
            e.runway.clone().unwrap_or_else(|| "—".into()),
            opt(e.pressure_altitude_ft, " ft"),
            opt(e.density_altitude_ft.map(crate::units::up0), " ft"),
            e.oat_c.map_or("—".to_string(), |c| show.temp(c)),
            opt(e.headwind_kt.map(crate::units::down0), " kt"),
            opt(e.crosswind_kt.map(crate::units::up0), " kt"),
        )));
        match &e.report {
            Some(rep) => lines.push(Line::styled(
                format!(
                    "  report: {} ({:.0} min old{}{})",
                    rep.text,
                    rep.age_min,
                    if rep.stale { ", STALE" } else { "" },
                    if rep.as_of {
                        ", as of the basis time"
                    } else {
                        ""
                    }
                ),
                t.dim(),
            )),
            None => lines.push(Line::styled("  report: none", t.error())),
        }
        for c in &e.checks {
            lines.push(Line::from(format!(
                "  {} {}: {} required of {} ({})",
                c.phase,
                c.rule,
                show.dist(c.required_m),
                show.dist(c.available_m),
                // Rounded down, as the legs table shows it (-6.4 % is -7 %).
                c.margin_percent.map_or("—".into(), |m| {
                    crate::assess::leg::percent_text(m / 100.0)
                })
            )));
        }
        if let Some(c) = &e.climb {
            lines.push(Line::from(format!(
                "  climb {:.0} fpm (min {:.0}), {:.0} ft/NM{}",
                c.rate_fpm,
                c.min_rate_fpm,
                // Rounded down, as the detail and the sheet show it.
                crate::units::down0(c.gradient_ft_per_nm),
                c.required_gradient_ft_per_nm
                    .map_or(String::new(), |g| format!(" (required {g:.0})"))
            )));
        }
    }
    let ends = std::mem::take(&mut lines);
    for why in r.reasons.iter().take(3) {
        lines.push(Line::styled(format!("  - {why}"), t.state(r.state)));
    }
    let reasons = std::mem::take(&mut lines);
    lines.push(Line::default());
    // The override reason is asked only where the policy lets this leg be signed
    // with one (a below or no-data leg of a category it allows overrides for).
    let hints = [
        "who signs",
        "optional",
        "this leg does not meet the minimums: signing it needs a reason",
    ];
    lines.extend(super::view::field_lines(
        SIGN_FIELDS.iter().copied().zip(hints).take(f.fields()),
        &f.values,
        f.focus,
        |_| None,
        16,
        t,
    ));
    if !f.offers_override && !r.state.meets_minimums() {
        lines.push(Line::styled(
            format!(
                "{:>16} none: the policy allows no override for {} legs",
                "",
                r.category.words()
            ),
            t.dim(),
        ));
    }
    lines.push(Line::default());
    if f.busy {
        lines.push(Line::styled("Writing the record…", t.heading()));
    } else if let Some(e) = &f.error {
        lines.push(Line::styled(format!("✗ {e}"), t.error()));
    } else {
        match &f.preview {
            Ok(rec) => {
                lines.push(Line::styled(
                    format!(
                        "✓ Enter signs: a {} record by {} goes into the log{}",
                        if rec.override_reason.is_some() {
                            "sign-off (override)"
                        } else {
                            "sign-off"
                        },
                        rec.instructor,
                        app.signoffs.log.as_ref().map_or(
                            " (none set up)".to_string(),
                            |l| format!(" at {}", l.dir().display())
                        )
                    ),
                    t.state(State::Within),
                ))
            }
            Err(crate::signoff::Refusal::NoInstructor) => {
                lines.push(Line::styled("Type the instructor's name.", t.dim()))
            }
            Err(e) => lines.push(Line::styled(format!("✗ would be refused: {e}"), t.error())),
        }
    }
    lines.push(Line::styled(crate::CAUTION, t.caution()));
    boxed_keeping(
        [top, ends, reasons, lines],
        "of the basis: a taller terminal shows them, as does the leg's detail",
        format!(" Sign off {} — the basis (S) ", r.id),
        area,
        buf,
        t,
        110,
    );
}

/// Like [`boxed`] for the sign-off: the parts `[top, ends, reasons, tail]` wrapped
/// (never cut mid-line); when they do not all fit the height, the per-end lines go
/// first (a line says how many), so the fields and the message always show.
fn boxed_keeping(
    parts: [Vec<Line<'static>>; 4],
    what: &str,
    title: String,
    area: Rect,
    buf: &mut Buffer,
    t: Theme,
    w: u16,
) {
    let inner_w = usize::from(w.min(area.width).saturating_sub(2));
    let [top, mut ends, reasons, tail] = parts.map(|p| {
        p.into_iter()
            .flat_map(|l| super::fit::wrap(l, inner_w, None))
            .collect::<Vec<_>>()
    });
    let room = usize::from(area.height.saturating_sub(2));
    let fixed = top.len() + reasons.len() + tail.len();
    if fixed + ends.len() > room {
        let marker = |dropped: usize| {
            super::fit::wrap(
                Line::styled(
                    format!(
                        "  … {dropped} more line{} {what}",
                        if dropped == 1 { "" } else { "s" }
                    ),
                    t.dim(),
                ),
                inner_w,
                None,
            )
        };
        let marker_h = marker(ends.len()).len();
        let keep = room.saturating_sub(fixed + marker_h).min(ends.len());
        let dropped = ends.len() - keep;
        ends.truncate(keep);
        ends.extend(marker(dropped));
    }
    let mut lines = top;
    lines.extend(ends);
    lines.extend(reasons);
    // Still too tall (a tiny terminal): the end of the form, with the message, shows.
    let skip = (lines.len() + tail.len()).saturating_sub(room);
    lines.extend(tail);
    let lines: Vec<Line<'static>> = lines.into_iter().skip(skip).collect();
    let r = super::view::centered(area, w, lines.len() as u16 + 2);
    Clear.render(r, buf);
    Paragraph::new(lines)
        .block(Block::bordered().border_style(t.frame()).title(title))
        .render(r, buf);
}

/// The what-if panel: the leg as planned, old → new, the pending changes, and the menu.
pub fn replan(app: &App, ui: &ReplanUi, area: Rect, buf: &mut Buffer, t: Theme) {
    let id = app
        .plan
        .slots
        .get(ui.slot)
        .map_or("—".to_string(), |s| s.leg.id.clone());
    let mut lines: Vec<Line<'static>> = vec![Line::from(format!(
        "{}: {}",
        app.slot_heading(ui.slot),
        app.slot_words(ui.slot)
    ))];
    match app.compared(ui.slot) {
        Some(c) => {
            let inner_w = usize::from(110u16.min(area.width).saturating_sub(2));
            lines.extend(comparison(
                c.old.as_ref(),
                c.new.as_ref(),
                &c.what,
                t,
                inner_w,
            ));
            // What `validate` would say of it in the plan as a whole, here and not only
            // as a passing notice: `w` writes nothing while a refusal stands.
            for r in &c.vetting.refusals {
                lines.push(Line::styled(
                    format!("  ✗ validate would refuse (w writes nothing): {r}"),
                    t.error(),
                ));
            }
            for w in &c.vetting.warnings {
                lines.push(Line::styled(format!("  ⚠ warning: {w}"), t.error()));
            }
        }
        None => lines.push(Line::styled(
            "  no change to this leg yet: each change is re-assessed at once and shown old → new",
            t.dim(),
        )),
    }
    // A leg planned to depart before the board's clock says so while the panel is open.
    if let Some(s) = app.plan.slots.get(ui.slot)
        && !s.cancelled
        && s.leg.departs_utc() < app.clock
    {
        let as_loaded = match s.origin {
            super::replan::Origin::Original(o) => {
                app.ops.legs.get(o).map(|l| l.departs_at) == Some(s.leg.departs_at)
            }
            super::replan::Origin::CopyOf(_) => false,
        };
        let how = if as_loaded {
            super::replan::Past::AsLoaded
        } else {
            super::replan::Past::Planned
        };
        lines.push(Line::styled(
            format!(
                "  ⚠ {}",
                super::replan::past_words(s.leg.departs_utc(), app.clock, how)
            ),
            t.error(),
        ));
    }
    lines.push(Line::default());
    if app.plan.steps.is_empty() {
        lines.push(Line::styled("Pending changes: none", t.dim()));
    } else {
        lines.push(Line::styled(
            format!("Pending changes ({}), not written:", app.plan.steps.len()),
            t.heading(),
        ));
        let n = app.plan.steps.len();
        for (i, p) in app.plan.steps.iter().enumerate().skip(n.saturating_sub(5)) {
            lines.push(Line::from(format!("  {}. {}", i + 1, p.label)));
        }
        // What validate says of the other changed legs (a copy, a leg moved earlier).
        for c in app.plan.compared.iter().filter(|c| c.slot != ui.slot) {
            for r in &c.vetting.refusals {
                lines.push(Line::styled(
                    format!(
                        "  ✗ {}: validate would refuse (w writes nothing): {r}",
                        c.id
                    ),
                    t.error(),
                ));
            }
            for w in &c.vetting.warnings {
                lines.push(Line::styled(
                    format!("  ⚠ {}: warning: {w}", c.id),
                    t.error(),
                ));
            }
        }
    }
    lines.push(Line::default());
    // Where the choice list starts: the lines above it give way when it does not fit.
    let mut pick_at: Option<usize> = None;
    match &ui.ask {
        Ask::Menu => {
            lines.push(Line::from(vec![
                Span::styled("a", t.heading()),
                Span::raw(" aircraft · "),
                Span::styled("t", t.heading()),
                Span::raw(" departure time · "),
                Span::styled("d", t.heading()),
                Span::raw(" destination · "),
                Span::styled("l", t.heading()),
                Span::raw(" loads · "),
                Span::styled("f", t.heading()),
                Span::raw(" fuel · "),
                Span::styled("c", t.heading()),
                Span::raw(" copy · "),
                Span::styled("x", t.heading()),
                Span::raw(" cancel the leg"),
            ]));
            lines.push(Line::from(vec![
                Span::styled("u", t.heading()),
                Span::raw(" undo · "),
                Span::styled("w", t.heading()),
                Span::raw(" write · "),
                Span::styled("Esc", t.heading()),
                Span::raw(" close (changes stay pending)"),
            ]));
        }
        Ask::Pick {
            title,
            options,
            cursor,
            typed,
            error,
        } => {
            let head_len = lines.len();
            let inner_w = usize::from(110u16.min(area.width).saturating_sub(2));
            let height = |l: &Line<'static>| super::fit::wrap(l.clone(), inner_w, None).len();
            lines.push(Line::styled(title.clone(), t.heading()));
            if options.is_empty() {
                lines.push(Line::styled("  nothing to choose", t.dim()));
            }
            if !typed.is_empty() {
                lines.push(Line::from(vec![
                    Span::styled("  typed: ", t.dim()),
                    Span::raw(typed.clone()),
                    Span::styled(" (jumps to the first match)", t.dim()),
                ]));
            }
            if let Some(e) = error {
                lines.push(Line::styled(format!("  ✗ {e}"), t.error()));
            }
            // As many rows as fit (at most 8), the highlighted one always among them; the
            // panel above gives way first (down to its first line and a count).
            let rows: Vec<Line<'static>> = options
                .iter()
                .enumerate()
                .map(|(i, (label, _))| {
                    let style = if i == *cursor {
                        t.selected()
                    } else {
                        Style::new()
                    };
                    Line::styled(format!("  {label}"), style)
                })
                .collect();
            let fixed: usize = lines[head_len..].iter().map(height).sum::<usize>()
                + usize::from(app.plan.dir.is_none()) * 2
                + 1 // the position line
                + 3; // the panel's first line and the count of what it left out
            let avail = usize::from(area.height.saturating_sub(2))
                .saturating_sub(fixed)
                .max(1);
            let h: Vec<usize> = rows.iter().map(height).collect();
            let cur = (*cursor).min(rows.len().saturating_sub(1));
            let mut first = cur;
            let mut used = h.get(cur).copied().unwrap_or(0);
            let mut n = 0usize;
            while first > 0 && used + h[first - 1] <= avail && cur - first + 1 < 8 {
                first -= 1;
                used += h[first];
            }
            n += cur + 1 - first;
            let mut last = cur + 1;
            while last < rows.len() && used + h[last] <= avail && n < 8 {
                used += h[last];
                last += 1;
                n += 1;
            }
            if !rows.is_empty() {
                lines.extend(rows[first..last].iter().cloned());
            }
            if n < options.len() {
                lines.push(Line::styled(
                    format!(
                        "  ({} of {}; ↑↓ scroll, or type to jump)",
                        cursor + 1,
                        options.len()
                    ),
                    t.dim(),
                ));
            }
            pick_at = Some(head_len);
        }
        Ask::Type {
            what,
            text,
            error,
            note,
            ..
        } => {
            if let Some(n) = note {
                lines.push(Line::styled(n.clone(), t.state(State::Thin)));
            }
            let prompt = match what {
                Typed::Departs => "New departure time, HHMM UTC (the planned duration is kept):",
                Typed::Fuel => "Fuel at engine start, litres:",
            };
            lines.push(Line::from(vec![
                Span::styled(prompt, t.heading()),
                Span::raw(format!(" {text}▏")),
            ]));
            if let Some(e) = error {
                lines.push(Line::styled(format!("✗ {e}"), t.error()));
            }
        }
    }
    if app.plan.dir.is_none() {
        lines.push(Line::styled(
            "Demo: there is no operator folder, so w applies the changes in memory only.",
            t.dim(),
        ));
    }
    let title = format!(" What-if {id} — nothing is written until w ");
    match pick_at {
        Some(at) if at > 1 => {
            let tail = lines.split_off(at);
            let rest = lines.split_off(1);
            boxed_keeping(
                [lines, rest, Vec::new(), tail],
                "of the panel: a taller terminal shows them",
                title,
                area,
                buf,
                t,
                110,
            );
        }
        _ => boxed(lines, title, area, buf, t, 110),
    }
}

/// A save met a changed file: both versions of the affected legs, and the choice.
pub fn conflict(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let Some(c) = &app.plan.conflict else {
        return;
    };
    let mut lines: Vec<Line<'static>> = vec![
        Line::styled(
            format!(
                "{} changed on disk since it was loaded (another dispatcher, an editor): nothing was written.",
                c.rel
            ),
            t.error(),
        ),
        Line::default(),
    ];
    for (id, loaded, theirs, ours) in &c.legs {
        lines.push(Line::styled(id.clone(), t.heading()));
        lines.push(Line::from(format!("  as loaded:  {loaded}")));
        lines.push(Line::from(format!("  theirs now: {theirs}")));
        lines.push(Line::from(format!("  with o:     {ours}")));
    }
    lines.push(Line::default());
    lines.push(Line::from(vec![
        Span::styled("t", t.heading()),
        Span::raw(" keep theirs (reload the file, drop our changes) · "),
        Span::styled("o", t.heading()),
        Span::raw(" apply our changes onto theirs (a field both changed stops it; theirs kept as the backup) · "),
        Span::styled("Esc", t.heading()),
        Span::raw(" decide later"),
    ]));
    boxed(lines, " Save conflict ".into(), area, buf, t, 120);
}

/// Quit asked with changes pending.
pub fn confirm_quit(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let lines = vec![
        Line::from(format!(
            "{} what-if change(s) are pending and not written.",
            app.plan.steps.len()
        )),
        Line::from(vec![
            Span::styled("y", t.heading()),
            Span::raw(" quit and drop them · "),
            Span::styled("w", t.heading()),
            Span::raw(" write them · any other key stays"),
        ]),
    ];
    boxed(lines, " Quit? ".into(), area, buf, t, 70);
}
