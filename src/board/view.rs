//! The views: pure functions of `&App` into a buffer (`impl Widget for &App`, so no
//! state is cloned per frame). They map states to glyphs, words and styles; they
//! decide nothing.

use ratatui::buffer::Buffer;
use ratatui::layout::{Constraint, Rect};
use ratatui::style::Style;
use ratatui::text::{Line, Span};
use ratatui::widgets::{Block, Borders, Cell, Clear, Paragraph, Row, Table, Widget, Wrap};

use super::app::{App, DetailOf, Mode, NoteKind, Pane, category_short};
use super::display::Show;
use super::fit::{self, Column};
use super::form::{FIELDS, Form};
use super::keys::KEYMAP;
use super::layout::{BoardLayout, LayoutSettings, MIN_SIZE};
use super::runway_form::{RUNWAY_FIELDS, RunwayForm};
use super::theme::Theme;
use crate::assess::leg::FieldWx;
use crate::assess::pairing::PairCell;
use crate::assess::{LegResult, State};
use crate::observation::Report;

/// First row shown so that `cursor` is visible in `height` rows.
pub fn scroll_offset(cursor: usize, height: usize) -> usize {
    if height == 0 || cursor < height {
        0
    } else {
        cursor + 1 - height
    }
}

fn state_text(s: State) -> String {
    format!("{} {}", s.glyph(), s.word())
}

impl App {
    fn theme(&self) -> Theme {
        Theme {
            color: self.settings.color,
        }
    }
}

impl Widget for &App {
    fn render(self, area: Rect, buf: &mut Buffer) {
        let layout = BoardLayout::build(area, &LayoutSettings::of(self));
        let t = self.theme();
        if layout.too_small {
            too_small(area, buf, t);
            return;
        }
        header(self, layout.header, buf, t);
        let legs_rows = (self.ui.pane == Pane::Legs && !layout.detail_replaces_main())
            .then(|| usize::from(layout.main.height.saturating_sub(1)));
        tabs(self, layout.tabs, legs_rows, buf, t);
        if !layout.detail_replaces_main() {
            match self.ui.pane {
                Pane::Legs => legs(self, layout.main, buf, t),
                Pane::Pairings => pairings(self, layout.main, buf, t),
                Pane::Airfields => airfields(self, layout.main, buf, t),
                Pane::Fleet => fleet(self, layout.main, buf, t),
                Pane::Reports => reports(self, layout.main, buf, t),
            }
        }
        if let Some(d) = layout.detail {
            detail(self, d, buf, t);
        }
        changes(self, layout.changes, buf, t);
        hints(self, layout.hints, buf, t);
        Paragraph::new(crate::CAUTION)
            .style(t.caution())
            .wrap(Wrap { trim: true })
            .render(layout.caution, buf);
        match &self.ui.mode {
            Mode::Help => help(self, area, buf, t, self.ui.help_scroll),
            Mode::Form(f) => form(self, f, area, buf, t),
            Mode::Sign(f) => super::overlays::sign(self, f, area, buf, t),
            Mode::Replan(r) => super::overlays::replan(self, r, area, buf, t),
            Mode::Conflict => super::overlays::conflict(self, area, buf, t),
            Mode::ConfirmQuit => super::overlays::confirm_quit(self, area, buf, t),
            Mode::Runway(f) => runway_form(self, f, area, buf, t),
            Mode::Normal | Mode::Filter => {}
        }
    }
}

fn too_small(area: Rect, buf: &mut Buffer, t: Theme) {
    let text = vec![
        Line::styled("Enlarge the terminal", t.heading()),
        Line::from(format!(
            "The board needs at least {}×{}; this one is {}×{}.",
            MIN_SIZE.0, MIN_SIZE.1, area.width, area.height
        )),
        Line::from("q quits."),
    ];
    let h = (text.len() as u16).min(area.height);
    let y = area.y + area.height.saturating_sub(h) / 2;
    Paragraph::new(text)
        .wrap(Wrap { trim: true })
        .centered()
        .render(
            Rect::new(area.x, y, area.width, area.height - (y - area.y)),
            buf,
        );
}

/// The header line's parts, from the fullest wording to the sparest: the first that
/// fits is shown, so nothing is cut (the clock and the counts always stay).
fn header(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let day_clock = app.clock.format("%Y-%m-%d %H:%MZ").to_string();
    let clock = app.clock.format("%H:%MZ").to_string();
    let replay = |long: bool| -> String {
        match &app.replay {
            Some(rp) => {
                let speed = if (rp.speed - rp.speed.round()).abs() < 1e-9 {
                    format!("{:.0}", rp.speed)
                } else {
                    format!("{}", rp.speed)
                };
                let state = match (rp.paused, long) {
                    (true, true) => "‖ paused",
                    (true, false) => "‖",
                    (false, _) => "▶",
                };
                format!("replay {state} ×{speed}")
            }
            None => "live".to_string(),
        }
    };
    let c = app.assessment.counts();
    // `gap` "" is the sparest form: glyph and count alone (`✓6 ~1 ✗8 ?1`), taken before
    // the newest report gives way; the legs table beside names each glyph's state.
    // `TIGHT`: one space between counts and the glyph against its word (`✓within 11
    // ~thin 4`), so that "newest" keeps its word at 80 columns.
    const TIGHT: &str = "\u{0}";
    let counts = |gap: &str| -> Vec<Span<'static>> {
        let (compact, tight) = (gap.is_empty(), gap == TIGHT);
        let gap = if compact || tight { " " } else { gap };
        let mut spans = Vec::new();
        for (i, (s, n)) in [
            (State::Within, c[0]),
            (State::Thin, c[1]),
            (State::Below, c[2]),
            (State::NoData, c[3]),
        ]
        .into_iter()
        .enumerate()
        {
            if i > 0 {
                spans.push(Span::raw(gap.to_string()));
            }
            let text = if compact {
                format!("{}{n}", s.glyph())
            } else if tight {
                format!("{}{} {n}", s.glyph(), s.word())
            } else {
                format!("{} {} {n}", s.glyph(), s.word())
            };
            spans.push(Span::styled(text, t.state(s)));
        }
        spans
    };
    // A report from another day than the board's says its date (finding 11: an
    // `init` folder's reports of 2026-06-14 looked like today's).
    let newest = |time: bool| match app.newest_report() {
        Some(r) => {
            let other_day = r
                .observed_at
                .filter(|t| t.date_naive() != app.clock.date_naive());
            match (time, other_day) {
                (true, Some(t)) => format!("newest {} {}", r.station, t.format("%Y-%m-%d %H%MZ")),
                (true, None) => format!(
                    "newest {} {}",
                    r.station,
                    r.observed_at
                        .map_or(r.time_text.clone(), |t| t.format("%H%MZ").to_string())
                ),
                // Short: the station and its time, never the station alone (a name
                // with no time says nothing about how fresh it is).
                (false, Some(t)) => format!("newest {} {}", r.station, t.format("%-d %b")),
                (false, None) => format!(
                    "{} {}",
                    r.station,
                    r.observed_at
                        .map_or(r.time_text.clone(), |t| t.format("%H%MZ").to_string())
                ),
            }
        }
        None => "no reports yet".to_string(),
    };
    let bar = || Span::styled(" │ ", t.frame());
    // (clock, "‖ paused" in full, the word "replay", gap between counts, newest, operator)
    let line =
        |clock: &str, long: bool, word: bool, gap: &str, newest: Option<String>, op: bool| {
            let mut mode = replay(long);
            if !word {
                mode = mode.trim_start_matches("replay ").to_string();
            }
            let mut spans = vec![
                Span::styled(format!(" {clock} "), t.heading()),
                Span::raw(mode),
                bar(),
            ];
            spans.extend(counts(gap));
            if let Some(n) = newest {
                spans.push(bar());
                spans.push(Span::raw(n));
            }
            if op {
                spans.push(bar());
                spans.push(Span::styled(app.ops.operator.name.clone(), t.dim()));
            }
            Line::from(spans)
        };
    let candidates = vec![
        line(&day_clock, true, true, "  ", Some(newest(true)), true),
        line(&day_clock, true, true, "  ", Some(newest(true)), false),
        line(&clock, true, true, "  ", Some(newest(true)), false),
        line(&clock, false, true, "  ", Some(newest(true)), false),
        line(&clock, false, true, " ", Some(newest(true)), false),
        line(&clock, false, true, TIGHT, Some(newest(true)), false),
        line(&clock, false, true, " ", Some(newest(false)), false),
        line(&clock, false, true, "", Some(newest(false)), false),
        line(&clock, false, false, "", Some(newest(false)), false),
        line(&clock, false, true, " ", None, false),
        line(&clock, false, false, " ", None, false),
    ];
    fit::first_line(candidates, usize::from(area.width)).render(area, buf);
}

/// Which rows of `total` show in `height` lines with the cursor on `cursor`, when some
/// are hidden: "14 of 16 ↓", "↑ 3–16 of 16", "↑ 3–12 of 16 ↓".
pub fn rows_shown(cursor: usize, height: usize, total: usize) -> Option<String> {
    if height == 0 || total <= height {
        return None;
    }
    let first = scroll_offset(cursor, height);
    let last = (first + height).min(total);
    let below = if last < total { " ↓" } else { "" };
    Some(if first == 0 {
        format!("{last} of {total}{below}")
    } else {
        format!("↑ {}–{last} of {total}{below}", first + 1)
    })
}

/// The tab line: the panes, and on the right what the Legs pane is showing — which
/// rows when some are hidden (`legs_rows`: its height in rows), a kept filter, the
/// sort — fullest first; the filter is dropped last and is cut with "…" rather than
/// left out.
/// The pane titles' width on the tab line (" Legs │ Pairs │ … "), short or full.
fn titles_width(short: bool, width: u16) -> usize {
    let names: usize = Pane::ALL
        .iter()
        .map(|p| {
            fit::width(if short {
                p.short_title()
            } else {
                p.tab_title(width)
            }) + 2
        })
        .sum();
    names + Pane::ALL.len() - 1
}

/// How the tab line is laid out at `width`: whether the pane titles take their short
/// form (`Pairs`, `Fields`, `Reps`) and the right-hand text, fullest first — the pane
/// titles shorten before anything on the right gives way, then the filter's count, the
/// word `filter:` and the rows shown, and only then the sort. `None`: even the sparest is too wide
/// (the filter is then cut). Shared by the view and the mouse (a click on a tab).
pub fn tab_plan(app: &App, width: u16, legs_rows: Option<usize>) -> (bool, Option<String>) {
    let pos = legs_rows.and_then(|h| rows_shown(app.ui.leg_row, h, app.rows().len()));
    let sort = format!("sort: {}", app.ui.sort.word());
    let join = |parts: &[Option<String>]| {
        parts
            .iter()
            .flatten()
            .cloned()
            .collect::<Vec<_>>()
            .join(" · ")
            + " "
    };
    // The rows shown, spare: "9/16↓", "↑3–16/16".
    let pos_short = pos
        .as_ref()
        .map(|p| p.replace(" of ", "/").replace("↑ ", "↑").replace(" ↓", "↓"));
    let mut with_sort: Vec<String> = Vec::new();
    let mut without_sort: Vec<String> = Vec::new();
    if app.ui.filter.is_empty() {
        with_sort.push(join(&[pos.clone(), Some(sort.clone())]));
        with_sort.push(join(&[pos_short.clone(), Some(sort.clone())]));
        without_sort.push(join(std::slice::from_ref(&pos)));
    } else {
        let f = &app.ui.filter;
        let counted = format!(
            "filter: {f} ({} of {})",
            app.rows().len(),
            app.assessment.legs.len()
        );
        for filter in [counted.clone(), format!("filter: {f}"), format!("/{f}")] {
            with_sort.push(join(&[pos.clone(), Some(filter), Some(sort.clone())]));
        }
        with_sort.push(join(&[Some(format!("/{f}")), Some(sort.clone())]));
        without_sort.push(join(&[pos.clone(), Some(counted)]));
        without_sort.push(join(&[pos.clone(), Some(format!("filter: {f}"))]));
        without_sort.push(join(&[pos.clone(), Some(format!("/{f}"))]));
        without_sort.push(join(&[Some(format!("/{f}"))]));
    }
    let fits = |short: bool, list: &[String]| {
        let room = usize::from(width).saturating_sub(titles_width(short, width) + 1);
        list.iter().find(|c| fit::width(c) <= room).cloned()
    };
    // Each wording with the sort, with the full pane titles and then the short ones:
    // the titles shorten before the filter's count or the sort gives way.
    for c in &with_sort {
        for short in [false, true] {
            if let Some(c) = fits(short, std::slice::from_ref(c)) {
                return (short || width < Pane::SHORT_BELOW, Some(c));
            }
        }
    }
    (true, fits(true, &without_sort))
}

/// The tab line: the panes, and on the right what the Legs pane is showing — which
/// rows when some are hidden (`legs_rows`: its height in rows), a kept filter, the
/// sort ([`tab_plan`]); the filter is dropped last and is cut with "…" rather than
/// left out.
fn tabs(app: &App, area: Rect, legs_rows: Option<usize>, buf: &mut Buffer, t: Theme) {
    let filtering = matches!(app.ui.mode, Mode::Filter);
    let (short, planned) = if filtering {
        (area.width < Pane::SHORT_BELOW, None)
    } else {
        tab_plan(app, area.width, legs_rows)
    };
    let mut spans: Vec<Span> = Vec::new();
    for (i, p) in Pane::ALL.iter().enumerate() {
        if i > 0 {
            spans.push(Span::styled("│", t.frame()));
        }
        let title = if short {
            p.short_title()
        } else {
            p.tab_title(area.width)
        };
        let text = format!(" {title} ");
        if *p == app.ui.pane {
            spans.push(Span::styled(text, t.selected()));
        } else {
            spans.push(Span::raw(text));
        }
    }
    let used = Line::from(spans.clone()).width();
    Line::from(spans).render(area, buf);
    let room = usize::from(area.width).saturating_sub(used + 1);
    let right = match planned {
        _ if filtering => fit::words(
            &format!("filter: {}▏ Enter keeps, Esc clears ", app.ui.filter),
            room,
        )
        .into_owned(),
        Some(c) => c,
        // Even the sparest is too wide: the filter, cut.
        None if !app.ui.filter.is_empty() => {
            let f = format!("/{}", app.ui.filter);
            let w = room.saturating_sub(1);
            let mut cut: String = String::new();
            for ch in f.chars() {
                if fit::width(&cut) + fit::width(&ch.to_string()) + 1 > w {
                    break;
                }
                cut.push(ch);
            }
            format!("{cut}… ")
        }
        None => String::new(),
    };
    if !right.trim().is_empty() && fit::width(&right) <= room {
        Line::styled(right, t.dim())
            .right_aligned()
            .render(area, buf);
    }
}

/// Headroom in the legs table: `≥+23.0°C` (the table ends first), `-6.3°C`,
/// `≤-38.7°C` (still below at the table's coldest column), or `—`
/// ([`Headroom::figure`](crate::assess::leg::Headroom::figure), as the report says).
pub fn headroom_cell(show: Show, r: &LegResult) -> String {
    match r.headroom {
        None => "—".to_string(),
        Some(h) => h.figure_in(|d| show.warming_value(d), show.temp_unit()),
    }
}

/// The limiting check in words, richest first: the whole rule, then what it is
/// checked against, then the check alone (`XPIN 26 takeoff distance_50ft × 1.25 ≤
/// TORA`, `XPIN 26 takeoff vs TORA`, `XPIN 26 takeoff`). With no limiting check, the
/// first reason.
pub fn limiting_wordings(r: &LegResult, show: Show) -> Vec<String> {
    let Some(l) = &r.limiting else {
        let Some(why) = r.reasons.first() else {
            return vec!["—".to_string()];
        };
        // "arrival XSHT: report 141200Z is stale (105 min old, …)" → "arrival XSHT: stale report"
        let mut out = vec![show.in_text(why)];
        if let Some((place, rest)) = why.split_once(": ")
            && rest.starts_with("report ")
            && rest.contains(" is stale")
        {
            out.push(format!("{place}: stale report"));
            if let Some(field) = place.split(' ').next_back() {
                out.push(format!("{field}: stale report"));
            }
        }
        return out;
    };
    let mut out = vec![l.check.clone()];
    for phase in [" takeoff ", " landing "] {
        if let Some(at) = l.check.find(phase) {
            let head = &l.check[..at + phase.len() - 1];
            if let Some((_, against)) = l.check.rsplit_once(" ≤ ") {
                out.push(format!("{head} vs {against}"));
            }
            out.push(head.to_string());
            break;
        }
    }
    out
}

fn lines_of(v: Vec<String>) -> Vec<Line<'static>> {
    v.into_iter().map(Line::from).collect()
}

/// The empty legs table on a day with no legs: names the days that have legs, in the
/// words `rhoboard check` uses, and how to start the board on one.
pub fn no_legs_text(app: &App) -> String {
    let day = app.clock.format("%Y-%m-%d");
    let days = app.ops.leg_days();
    match days.first() {
        Some(d) => format!(
            "No legs depart on {day}. The operator has legs on {}: pass --at, e.g. rhoboard board --at {d}T08:00:00Z.",
            days.iter()
                .map(ToString::to_string)
                .collect::<Vec<_>>()
                .join(", ")
        ),
        None => format!("No legs depart on {day} (legs/<date>.json)."),
    }
}

fn legs(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let height = usize::from(area.height.saturating_sub(1));
    let rows = app.rows();
    if rows.is_empty() {
        let msg = if app.assessment.legs.is_empty() {
            no_legs_text(app)
        } else {
            format!(
                "No leg matches the filter '{}' (Esc clears it).",
                app.ui.filter
            )
        };
        Paragraph::new(msg)
            .wrap(Wrap { trim: true })
            .render(area, buf);
        return;
    }
    let offset = scroll_offset(app.ui.leg_row, height);
    let cols = super::overlays::LegColumns::for_width(area.width);
    let show = Show::of(&app.ops);
    let shown: Vec<(usize, usize, &LegResult)> = rows
        .iter()
        .enumerate()
        .skip(offset)
        .take(height)
        .filter_map(|(row, &k)| Some((row, k, app.assessment.legs.get(k)?)))
        .collect();
    let leg = |r: &LegResult| app.ops.legs.get(r.index);
    let text = |f: &dyn Fn(&LegResult) -> String| -> Vec<Line<'static>> {
        shown.iter().map(|(_, _, r)| Line::from(f(r))).collect()
    };
    let mut table: Vec<Column> = vec![Column::new(
        cols.first_header(),
        0,
        shown
            .iter()
            .map(|(_, k, r)| cols.first_line(app, *k, app.flashing(r.index), t))
            .collect(),
    )];
    if cols.words {
        table.push(Column::new(
            cols.mark_header(),
            7,
            shown
                .iter()
                .map(|(_, k, _)| cols.mark_line(app, *k, t))
                .collect(),
        ));
    }
    table.extend([
        Column::new(
            "dep",
            0,
            text(&|r| {
                leg(r).map_or("—".into(), |l| {
                    l.departs_utc().format("%H%MZ").to_string()
                })
            }),
        ),
        Column::new("leg", 0, text(&|r| r.id.clone())),
        Column::new(
            "aircraft",
            4,
            text(&|r| leg(r).map_or("—".into(), |l| l.aircraft.clone())),
        )
        .short("a/c"),
        Column::new(
            "route",
            2,
            text(&|r| leg(r).map_or("—".into(), |l| format!("{}-{}", l.from, l.to))),
        ),
        Column::new(
            "category",
            6,
            text(&|r| category_short(r.category).to_string()),
        ),
        Column::new(
            "state",
            0,
            shown
                .iter()
                .map(|(_, _, r)| Line::styled(state_text(r.state), t.state(r.state)))
                .collect(),
        )
        // As wide as "? no-data", whichever rows are in view.
        .at_least(9),
        Column::new("margin", 0, text(&|r| show.limiting_margin(r))),
        Column::new("headroom", 3, text(&|r| headroom_cell(show, r))),
        Column::new(
            "forecast",
            5,
            shown
                .iter()
                .map(|(_, k, r)| {
                    let progress = app
                        .ops
                        .legs
                        .get(r.index)
                        .map_or(super::forecast::Progress::Ahead, |l| {
                            super::forecast::Progress::of(l, app.clock)
                        });
                    Line::from(super::forecast::cell(app.look(*k), r.state, progress))
                })
                .collect(),
        ),
        Column::flex(
            "limiting check",
            21,
            shown
                .iter()
                .map(|(_, _, r)| lines_of(limiting_wordings(r, show)))
                .collect(),
        ),
    ]);
    let styles: Vec<Style> = shown
        .iter()
        .map(|(row, _, r)| {
            let mut style = Style::new();
            if app.flashing(r.index) {
                style = style.patch(t.changed());
            }
            if *row == app.ui.leg_row {
                style = style.patch(t.selected());
            }
            style
        })
        .collect();
    fit::table(table, &styles, t.heading(), area, buf);
}

/// A pairing's margin in the display unit ([`Show::pair_margin`]).
pub fn pair_margin(c: &PairCell, show: Show) -> Option<(f64, &'static str, usize)> {
    show.pair_margin(c)
}

/// A pairing's headroom, marked as a bound where the tables end first (`≥+8.0 °C`,
/// `≤-38.7 °C`); `—` for no data or a pairing below for a reason temperature cannot
/// change (wind, the field's weather).
fn pair_headroom(c: &PairCell, show: Show) -> String {
    match c.headroom_c {
        None => "—".to_string(),
        Some(h) => format!("{}{}", c.headroom_mark(), show.headroom_degrees(h)),
    }
}

/// A pairing's cell: its glyph and margin with its unit (`✓+12%`, `✗-4kt`, `~+200ft`).
fn cell_text(c: &PairCell, show: Show) -> String {
    match pair_margin(c, show) {
        None => format!("{} —", c.state.glyph()),
        Some((m, unit, d)) => format!("{}{m:+.d$}{unit}", c.state.glyph()),
    }
}

/// What limits a pairing, naming the weather minimum (`ceiling`, `gust`), with its
/// margin where it has one: `ceiling (+200 ft)`.
pub(super) fn limit_word(c: &PairCell, show: Show) -> String {
    match pair_margin(c, show) {
        Some((m, unit, d)) if !unit.is_empty() => {
            let sep = if unit == "%" { "" } else { " " };
            format!("{} ({m:+.d$}{sep}{unit})", c.limiting_words())
        }
        Some((m, _, d)) => format!("{} ({m:+.d$})", c.limiting_words()),
        None => c.limiting_words().to_string(),
    }
}

fn pairings(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let m = &app.assessment.matrix;
    let show = Show::of(&app.ops);
    if m.aircraft.is_empty() || m.fields == 0 {
        Paragraph::new("No available aircraft or no airfields.").render(area, buf);
        return;
    }
    const REG_W: u16 = 9;
    const CELL_W: u16 = 9;
    let visible_cols = usize::from(area.width.saturating_sub(REG_W) / CELL_W).max(1);
    let (cur_a, cur_f) = app.ui.pair;
    let col0 = scroll_offset(cur_f, visible_cols);
    // Rows: the height less the header and the words under the table.
    let height = usize::from(area.height.saturating_sub(5));
    let row0 = scroll_offset(cur_a, height);
    let fields: Vec<usize> = (col0..m.fields.min(col0 + visible_cols)).collect();
    let header =
        Row::new(
            std::iter::once(Cell::from("aircraft"))
                .chain(fields.iter().map(|&fi| {
                    Cell::from(app.ops.airfields.get(fi).map_or("—", |f| f.id.as_str()))
                }))
                .collect::<Vec<_>>(),
        )
        .style(t.heading());
    let rows = (row0..m.aircraft.len().min(row0 + height)).map(|ai| {
        let reg = app
            .ops
            .aircraft
            .get(m.aircraft[ai])
            .map_or("—", |a| a.registration.as_str());
        let cells = std::iter::once(Cell::from(reg)).chain(fields.iter().map(|&fi| {
            let c = m.cell(ai, fi);
            let mut style = t.state(c.state);
            if (ai, fi) == (cur_a, cur_f) {
                style = style.patch(t.selected());
            }
            Cell::from(cell_text(c, show)).style(style)
        }));
        Row::new(cells.collect::<Vec<_>>())
    });
    let widths: Vec<Constraint> = std::iter::once(Constraint::Length(REG_W - 1))
        .chain(fields.iter().map(|_| Constraint::Length(CELL_W - 1)))
        .collect();
    // What the selected cell says, in words.
    let summary = if cur_a < m.aircraft.len() && cur_f < m.fields {
        let c = m.cell(cur_a, cur_f);
        let reg = app
            .ops
            .aircraft
            .get(m.aircraft[cur_a])
            .map_or("—", |a| a.registration.as_str());
        let field = app.ops.airfields.get(cur_f);
        let runway = c
            .end_in_use
            .and_then(|k| field.and_then(|f| f.runway_ends.get(usize::from(k))))
            .map_or("—".to_string(), |e| e.designator.clone());
        format!(
            "{reg} at {}: {} on runway {runway}, limited by {}; best end {}; headroom {}. Enter opens its chain.",
            field.map_or("—", |f| f.id.as_str()),
            state_text(c.state),
            limit_word(c, show),
            state_text(c.best_end_state),
            match c.headroom_absent_why() {
                Some(why) => format!("— ({why})"),
                None => pair_headroom(c, show),
            }
        )
    } else {
        String::new()
    };
    let more = if m.fields > visible_cols {
        format!(
            "  (airfields {}–{} of {}; ← → scroll)",
            col0 + 1,
            col0 + fields.len(),
            m.fields
        )
    } else {
        String::new()
    };
    // The words under the table take the lines they need (wrapped, never cut).
    let words: Vec<Line> = fit::wrap(
        Line::from(format!("{summary}{more}")),
        usize::from(area.width),
        Some(0),
    );
    let words_h = (words.len() as u16).min(area.height / 2);
    let table_h = area.height.saturating_sub(words_h);
    Table::new(rows, widths)
        .header(header)
        .column_spacing(1)
        .render(Rect::new(area.x, area.y, area.width, table_h), buf);
    Paragraph::new(words).render(
        Rect::new(area.x, area.y + table_h, area.width, area.height - table_h),
        buf,
    );
}

fn wind_text(r: &Report) -> String {
    match &r.wind {
        None => "—".to_string(),
        Some(w) if w.is_calm() => "calm".to_string(),
        Some(w) => {
            let dir = if w.variable && w.direction_deg.is_none() {
                "VRB".to_string()
            } else {
                w.direction_deg
                    .map_or("—".to_string(), |d| format!("{d:03.0}"))
            };
            let gust = w.gust_kt.map_or(String::new(), |g| format!("G{g:.0}"));
            // A hand-typed wind is kept in degrees true (a magnetic entry turned by the
            // airfield's variation): the T says so, where the number differs from the
            // one typed. A METAR's wind is true by definition and goes unmarked.
            let mark =
                if r.kind == Some(crate::observation::Kind::Manual) && w.direction_deg.is_some() {
                    "T"
                } else {
                    ""
                };
            format!("{dir}{mark}/{:.0}{gust}kt", w.speed_kt)
        }
    }
}

fn airfields(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    // The selected airfield's sun and runway ends below the table, where there is room.
    let ends = app
        .ops
        .airfields
        .get(app.ui.field_row)
        .map_or(0, |f| f.runway_ends.len() as u16);
    let panel_h = (ends + 5).min(area.height / 2);
    let area = if panel_h >= 4 {
        let table_h = area.height.saturating_sub(panel_h);
        field_panel(
            app,
            Rect::new(area.x, area.y + table_h, area.width, panel_h),
            buf,
            t,
        );
        Rect::new(area.x, area.y, area.width, table_h)
    } else {
        area
    };
    let show = Show::of(&app.ops);
    let height = usize::from(area.height.saturating_sub(1));
    let off = scroll_offset(app.ui.field_row, height);
    let mut rows: Vec<[String; 12]> = Vec::new();
    let mut styles: Vec<Style> = Vec::new();
    for (fi, f) in app.ops.airfields.iter().enumerate().skip(off).take(height) {
        let valid = app.store.valid_at(&f.id, app.clock);
        let dash = || "—".to_string();
        let (time, age, temp, da, wind) = match &valid {
            None => (dash(), dash(), dash(), dash(), dash()),
            Some(v) => {
                let wx = FieldWx::from_report(v.report, f.elevation_ft);
                (
                    v.report
                        .observed_at
                        .map_or_else(dash, |t| t.format("%H%MZ").to_string()),
                    format!(
                        "{} min{}",
                        v.age.num_minutes(),
                        if v.stale { " STALE" } else { "" }
                    ),
                    v.report.temperature_c.map_or_else(dash, |c| show.temp(c)),
                    wx.map_or_else(dash, |w| {
                        format!("{:.0} ft", crate::units::up0(w.air.density_altitude_ft))
                    }),
                    wind_text(v.report),
                )
            }
        };
        let runway = app
            .field_end_in_use(fi)
            .and_then(|k| f.runway_ends.get(k))
            .map_or_else(dash, |e| e.designator.clone());
        let sunset = crate::daylight::daylight(app.day(), f.latitude_deg, f.longitude_deg).sunset;
        let local = sun_local(app, sunset).unwrap_or_else(dash);
        let today: Vec<String> = app
            .model()
            .field_ends_at(fi, app.clock)
            .iter()
            .filter_map(|e| {
                let note = e.day_note.as_ref()?;
                let id = f.runway_ends.get(e.index)?;
                Some(format!("{} {note}", id.designator))
            })
            .collect();
        let today = if today.is_empty() {
            dash()
        } else {
            today.join("; ")
        };
        styles.push(if fi == app.ui.field_row {
            t.selected()
        } else if valid.as_ref().is_some_and(|v| v.stale) {
            t.state(State::NoData)
        } else {
            Style::new()
        });
        rows.push([
            f.id.clone(),
            f.name.clone(),
            format!("{:.0} ft", f.elevation_ft),
            time,
            age,
            temp,
            da,
            wind,
            runway,
            sun_z(sunset),
            local,
            today,
        ]);
    }
    // (heading, which goes first when narrow: higher sooner, 0 never)
    const COLS: [(&str, u8); 11] = [
        ("id", 0),
        ("name", 6),
        ("elev", 5),
        ("report", 0),
        ("age", 1),
        ("temp", 3),
        ("dens alt", 0),
        ("wind", 0),
        ("runway", 2),
        ("sunset", 4),
        ("local", 7),
    ];
    let mut cols: Vec<Column> = COLS
        .iter()
        .enumerate()
        .map(|(i, (head, drop))| {
            Column::new(
                head,
                *drop,
                rows.iter().map(|r| Line::from(r[i].clone())).collect(),
            )
        })
        .collect();
    // "rwy state", not "today": beside "sunset" that read as "sunset today"; "rwy"
    // where the column is narrower.
    cols.push(
        Column::flex(
            "rwy state",
            10,
            rows.iter()
                .map(|r| vec![Line::from(r[11].clone())])
                .collect(),
        )
        .short("rwy"),
    );
    fit::table(cols, &styles, t.heading(), area, buf);
}

fn fleet(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let height = usize::from(area.height.saturating_sub(1));
    let off = scroll_offset(app.ui.fleet_row, height);
    let (mut reg, mut ty, mut status, mut n, mut worst) = (vec![], vec![], vec![], vec![], vec![]);
    let mut styles = Vec::new();
    for (i, a) in app.ops.aircraft.iter().enumerate().skip(off).take(height) {
        let mine: Vec<&LegResult> = app
            .assessment
            .legs
            .iter()
            .filter(|r| {
                app.ops
                    .legs
                    .get(r.index)
                    .is_some_and(|l| l.aircraft == a.registration)
            })
            .collect();
        reg.push(Line::from(a.registration.clone()));
        ty.push(Line::from(
            app.ops
                .aircraft_type(&a.type_id)
                .map_or(a.type_id.clone(), |ty| {
                    format!("{} ({})", ty.file.id, ty.file.name)
                }),
        ));
        status.push(vec![Line::from(match a.status {
            crate::ops::fleet::Status::Available => "available".to_string(),
            crate::ops::fleet::Status::Maintenance => format!(
                "maintenance{}",
                a.maintenance
                    .as_ref()
                    .map_or(String::new(), |m| format!(": {}", m.note))
            ),
        })]);
        n.push(Line::from(mine.len().to_string()));
        worst.push(match mine.iter().map(|r| r.state).max() {
            Some(s) => Line::styled(state_text(s), t.state(s)),
            None => Line::from("—"),
        });
        styles.push(if i == app.ui.fleet_row {
            t.selected()
        } else {
            Style::new()
        });
    }
    let cols = vec![
        Column::new("registration", 0, reg),
        Column::new("legs today", 1, n),
        Column::new("worst state", 0, worst),
        Column::new("type", 2, ty),
        Column::flex("status", 12, status),
    ];
    fit::table(cols, &styles, t.heading(), area, buf);
}

fn reports(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    if app.received.is_empty() {
        Paragraph::new("No reports received yet.").render(area, buf);
        return;
    }
    let height = usize::from(area.height.saturating_sub(1));
    let off = scroll_offset(app.ui.report_row, height);
    let (mut at, mut from, mut mark, mut text) = (vec![], vec![], vec![], vec![]);
    let mut styles = Vec::new();
    for (i, r) in app.received.iter().enumerate().skip(off).take(height) {
        let (m, body, style) = match &r.rejected {
            None => {
                let m = if r.replaced { "replaced" } else { "stored" };
                let body = if r.not_understood.is_empty() {
                    r.text.clone()
                } else {
                    format!(
                        "not understood: {} — {}",
                        r.not_understood.join(" "),
                        r.text
                    )
                };
                (m, body, Style::new())
            }
            Some(why) => ("REJECTED", format!("{why} — {}", r.text), t.error()),
        };
        at.push(Line::from(r.at.format("%H%MZ").to_string()));
        from.push(Line::from(r.source.clone()));
        mark.push(Line::from(m));
        text.push(vec![Line::from(body)]);
        styles.push(if i == app.ui.report_row {
            style.patch(t.selected())
        } else {
            style
        });
    }
    let cols = vec![
        Column::new("at", 0, at),
        Column::new("from", 1, from),
        Column::new("", 0, mark),
        Column::flex("report", 20, text),
    ];
    fit::table(cols, &styles, t.heading(), area, buf);
}

fn detail(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let focused = app.ui.detail_open;
    let title = if focused {
        " Detail — ↑↓ scroll, Esc closes "
    } else {
        " Detail — Enter to scroll "
    };
    let block = Block::new()
        .borders(Borders::LEFT | Borders::TOP)
        .border_style(if focused { t.heading() } else { t.frame() })
        .title(title);
    let inner = block.inner(area);
    block.render(area, buf);
    let lines = match app.detail_of() {
        Some(DetailOf::Pairing(p)) => {
            super::detail::lines(&app.ops, &p.result, Some(&p.title), t, inner.width)
        }
        Some(DetailOf::Leg(k)) => match app.assessment.legs.get(k) {
            Some(r) => {
                let mut l = super::detail::lines(&app.ops, r, None, t, inner.width);
                l.extend(super::overlays::detail_extra(app, k, t));
                l
            }
            None => vec![Line::from("No leg selected.")],
        },
        None => vec![Line::from("No leg selected.")],
    };
    // Each item wrapped on its own, continuations under a hanging indent.
    let w = usize::from(inner.width);
    let lines: Vec<Line> = lines
        .into_iter()
        .flat_map(|l| fit::wrap(l, w, None))
        .collect();
    // Scrolling stops with the last line in view.
    let max =
        u16::try_from(lines.len().saturating_sub(usize::from(inner.height))).unwrap_or(u16::MAX);
    app.ui.detail_scroll_max.set(max);
    Paragraph::new(lines)
        .scroll((app.ui.detail_scroll.min(max), 0))
        .render(inner, buf);
}

fn changes(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let block = Block::new()
        .borders(Borders::TOP)
        .border_style(t.frame())
        .title(" Changes ")
        .title_top(
            Line::styled(
                super::overlays::status(app),
                super::overlays::status_style(app, t),
            )
            .right_aligned(),
        );
    let inner = block.inner(area);
    block.render(area, buf);
    if app.notes.is_empty() {
        Paragraph::new("No changes yet: each new report re-checks the legs it touches; changed legs are marked *.")
            .style(t.dim())
            .wrap(Wrap { trim: true })
            .render(inner, buf);
        return;
    }
    let mut lines: Vec<Line> = app
        .notes
        .iter()
        .take(usize::from(inner.height))
        .enumerate()
        .map(|(i, n)| {
            let style = match n.kind {
                NoteKind::Change(s) => t.state(s),
                NoteKind::Error => t.error(),
                NoteKind::Info => Style::new(),
            };
            let tag = match n.kind {
                NoteKind::Error => "error: ",
                _ => "",
            };
            // Too long for the line: the newest note, where the pane has a second
            // line, wraps onto it (a file name stays whole); the others keep whole
            // words and `…` (the values stay whole).
            let room = usize::from(inner.width).saturating_sub(6);
            let text = format!("{tag}{}", n.text);
            let text = if i == 0 && inner.height >= 2 {
                text
            } else {
                fit::words(&text, room).into_owned()
            };
            Line::from(vec![
                Span::styled(format!("{} ", n.at.format("%H%MZ")), t.dim()),
                Span::styled(text, style),
            ])
        })
        .collect();
    if let Some(first) = lines.first().cloned() {
        let w = usize::from(inner.width);
        let wrapped = fit::wrap(first.clone(), w, Some(6));
        if wrapped.len() == 2 {
            lines.splice(0..1, wrapped);
        } else if wrapped.len() > 2 {
            // Longer than two lines: one, whole words and `…`.
            let mut spans = first.spans;
            if let Some(last) = spans.last_mut() {
                last.content = fit::words(&last.content, w.saturating_sub(6))
                    .into_owned()
                    .into();
            }
            lines[0] = Line::from(spans);
        }
    }
    Paragraph::new(lines).render(inner, buf);
}

/// The keys in the hint line's short form, in order.
const SHORT_KEYS: [&str; 11] = [
    "?:help",
    "Tab:pane",
    "Enter:open",
    "Esc:close",
    "/:filter",
    "s:sort",
    "o:report",
    "r:runway",
    "space:pause",
    "n/p:hour",
    "q:quit",
];

fn hints(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let text = match &app.ui.mode {
        Mode::Filter => {
            "type to filter · Enter keeps the filter · Esc or Ctrl-U clears it".to_string()
        }
        Mode::Help => "Esc or ? closes the help".to_string(),
        Mode::Form(_) => "Tab/↑↓ field · Enter adds the report · Esc cancels".to_string(),
        Mode::Sign(_) | Mode::Replan(_) | Mode::Conflict | Mode::ConfirmQuit => {
            super::overlays::hint(&app.ui.mode)
        }
        Mode::Runway(_) => "Tab/↑↓ field · Enter sets the runway state · Esc cancels".to_string(),
        Mode::Normal => {
            // The fullest wording that fits; keys give way from the end of the list
            // (the help lists every key).
            let replay = app.replay.is_some();
            let open = matches!(app.ui.pane, Pane::Legs | Pane::Pairings);
            let long: Vec<&str> = [
                Some("? help"),
                Some("Tab pane"),
                Some("↑↓ select"),
                open.then_some("Enter open · Esc close"),
                Some("/ filter"),
                Some("s sort"),
                Some("o report"),
                Some("r runway"),
                replay.then_some("space pause · n/p next/prev hour"),
                Some("q quit"),
            ]
            .into_iter()
            .flatten()
            .collect();
            let short = |gone: &[&str]| -> String {
                SHORT_KEYS
                    .into_iter()
                    .filter(|k| !gone.contains(k))
                    .filter(|k| replay || !matches!(*k, "space:pause" | "n/p:hour"))
                    .collect::<Vec<_>>()
                    .join(" ")
            };
            let mut wordings = vec![long.join(" · ")];
            for gone in [
                &[][..],
                &["Esc:close", "r:runway"],
                &["Esc:close", "r:runway", "Tab:pane"],
                &["Esc:close", "r:runway", "Tab:pane", "o:report", "n/p:hour"],
            ] {
                wordings.push(short(gone));
            }
            let w = usize::from(area.width);
            wordings
                .into_iter()
                .find(|s| fit::width(s) <= w)
                .unwrap_or_else(|| "?:help q:quit".to_string())
        }
    };
    let w = usize::from(area.width);
    Line::styled(fit::words(&text, w).into_owned(), t.dim()).render(area, buf);
}

/// A `w`×`h` rectangle in the middle of `area` (clipped to it).
pub(super) fn centered(area: Rect, w: u16, h: u16) -> Rect {
    let w = w.min(area.width);
    let h = h.min(area.height);
    Rect::new(
        area.x + (area.width - w) / 2,
        area.y + (area.height - h) / 2,
        w,
        h,
    )
}

fn help(app: &App, area: Rect, buf: &mut Buffer, t: Theme, scroll: u16) {
    let b = &app.ops.operator.policy.buffers;
    let show = Show::of(&app.ops);
    let mut lines: Vec<Line> = vec![
        // First, so it is in view however small the screen the help covers.
        Line::styled(crate::CAUTION, t.heading()),
        Line::from(""),
        Line::styled("What the board shows", t.heading()),
        Line::from(
            "Every leg of the day against the operator's minimums, re-checked as each \
             report arrives. Enter on a leg opens its chain: observation, air, wind, \
             takeoff, climb, landing, limits, headroom and advice.",
        ),
        Line::from(vec![
            Span::styled("✓ within", t.state(State::Within)),
            Span::raw(" every minimum with the buffer to spare · "),
            Span::styled("~ thin", t.state(State::Thin)),
            Span::raw(" inside the buffer"),
        ]),
        Line::from(vec![
            Span::styled("✗ below", t.state(State::Below)),
            Span::raw(" misses a minimum · "),
            Span::styled("? no-data", t.state(State::NoData)),
            Span::raw(" no usable report, or outside the tables"),
        ]),
        Line::from(super::overlays::HELP_LEGEND),
        Line::default(),
        Line::styled("The legs table", t.heading()),
        Line::from(
            "* in the first column: the leg's state changed with the latest report \
             (marked for 30 s; the change list says from what to what).",
        ),
        Line::from(format!(
            "margin: the limiting check's room to spare, in its own unit: % for \
             distances and climb, kt for wind, ft for density altitude. headroom: \
             {} of warming left before the leg is below (≥: the flight-manual table \
             ends first). a/c: aircraft. A text ending in … is shortened at a word; the \
             detail has it whole. Narrow terminals drop columns (category, forecast, \
             aircraft, headroom, route, in that order).",
            show.temp_unit()
        )),
        Line::from(format!(
            "Sort by margin ÷ buffer: each leg's limiting margin divided by that check's \
             thin buffer ({:.0} % distances, {:.0} % climb, {:.0} kt wind, {:.0} ft density \
             altitude, {:.0} ft ceiling, {} visibility), so %, kt and ft compare: \
             below 0 misses, 0 to 1 is thin; the smallest first, the no-data legs \
             right after the below ones.",
            b.distance_percent,
            b.climb_percent,
            b.wind_kt,
            b.density_altitude_ft,
            b.ceiling_ft,
            match show.limit_value(b.visibility_m, "m", true) {
                (v, "SM") => format!("{v:.1} SM"),
                (v, u) => format!("{v:.0} {u}"),
            }
        )),
        Line::default(),
        Line::styled("Keys", t.heading()),
    ];
    for b in KEYMAP {
        lines.push(Line::from(vec![
            Span::styled(format!("  {:<11}", b.label), t.heading()),
            Span::raw(b.help),
        ]));
    }
    lines.push(Line::default());
    lines.push(Line::styled(crate::CAUTION, t.caution()));
    // Wrapped here, so each key's text stays in its column.
    let inner_w = usize::from(area.width.min(80).saturating_sub(2));
    let lines: Vec<Line> = lines
        .into_iter()
        .flat_map(|l| {
            let key = l.spans.len() == 2 && l.spans[0].content.starts_with("  ");
            fit::wrap(l, inner_w, key.then_some(13).or(Some(0)))
        })
        .collect();
    let r = centered(area, 80, lines.len() as u16 + 2);
    let hidden = (lines.len() as u16 + 2).saturating_sub(r.height);
    let scroll = scroll.min(hidden);
    let title = if hidden > 0 {
        " Help — ↑↓ scroll, Esc closes "
    } else {
        " Help — Esc closes "
    };
    Clear.render(r, buf);
    Paragraph::new(lines)
        .scroll((scroll, 0))
        .block(Block::bordered().border_style(t.frame()).title(title))
        .render(r, buf);
}

/// A form's fields, one line each — label (`label_w` wide, right-aligned), value
/// (the cursor on the focused one), hint — and the field's error under it.
pub(super) fn field_lines<'a>(
    specs: impl Iterator<Item = (&'static str, &'static str)>,
    values: &[String],
    focus: usize,
    error: impl Fn(usize) -> Option<&'a str>,
    label_w: usize,
    t: Theme,
) -> Vec<Line<'static>> {
    let mut lines = Vec::new();
    for (i, (label, hint)) in specs.enumerate() {
        let v = values.get(i).map_or("", String::as_str);
        let value = if i == focus {
            format!("{v}▏")
        } else {
            v.to_string()
        };
        let label_style = if i == focus {
            t.selected()
        } else {
            t.heading()
        };
        lines.push(Line::from(vec![
            Span::styled(format!("{label:>label_w$}"), label_style),
            Span::raw(format!(" {value:<14} ")),
            Span::styled(hint, t.dim()),
        ]));
        if let Some(e) = error(i) {
            lines.push(Line::styled(format!("{:>label_w$} ✗ {e}", ""), t.error()));
        }
    }
    lines
}

/// A field's error without the "manual observation XSEA: " prefix the form makes plain.
fn field_error(e: &str) -> &str {
    match e.strip_prefix("manual observation ") {
        Some(rest) => rest.split_once(": ").map_or(rest, |(_, m)| m),
        None => e,
    }
}

fn form(app: &App, f: &Form, area: Rect, buf: &mut Buffer, t: Theme) {
    let mut lines: Vec<Line> = vec![
        Line::styled(
            "An observation typed by hand (tagged as manual wherever shown):",
            t.dim(),
        ),
        Line::default(),
    ];
    lines.extend(field_lines(
        FIELDS.iter().map(|s| (s.label, s.hint)),
        &f.values,
        f.focus,
        |i| f.error_for(i).map(field_error),
        17,
        t,
    ));
    let general: Vec<&str> = f
        .errors
        .iter()
        .filter(|(i, _)| i.is_none())
        .map(|(_, m)| m.as_str())
        .collect();
    lines.push(Line::default());
    for g in general {
        lines.push(Line::styled(format!("✗ {g}"), t.error()));
    }
    if !f.errors.is_empty() {
        lines.push(Line::styled(
            format!(
                "{} problem(s): fix the marked fields and press Enter again.",
                f.errors.len()
            ),
            t.error(),
        ));
    }
    lines.push(Line::styled(
        format!("Wind: {}.", crate::observation::manual::WIND_FORM_NOTE),
        t.dim(),
    ));
    lines.push(Line::styled(
        format!(
            "Date: {} (the board's day). Enter adds the report, Esc cancels.",
            app.clock.format("%Y-%m-%d")
        ),
        t.dim(),
    ));
    super::overlays::boxed(lines, " Report by hand (o) ".into(), area, buf, t, 100);
}

/// The ends of airfield `fi` today, one line each: designator, usable now or not,
/// in use, declared distances as today, and the day's note.
fn end_lines(app: &App, fi: usize, t: Theme) -> Vec<Line<'static>> {
    let (Some(field), Some(_)) = (app.ops.airfields.get(fi), app.model().fields.get(fi)) else {
        return Vec::new();
    };
    let set = app.model().set_in_use_at(fi, app.clock);
    let now = app.field_end_in_use(fi);
    app.model()
        .field_ends_at(fi, app.clock)
        .iter()
        .map(|e| {
            let id = field
                .runway_ends
                .get(e.index)
                .map_or("—".to_string(), |r| r.designator.clone());
            let usable = e.usable_at(app.clock);
            let word = if !usable {
                "✗ closed"
            } else if set == Some(e.index) {
                "▶ in use (set)"
            } else if now == Some(e.index) {
                "▶ in use"
            } else {
                "· usable"
            };
            let mut state = e
                .day_note
                .clone()
                .unwrap_or_else(|| "as declared".to_string());
            // Changes set to start later today (a closure at 1500Z), so an opening or
            // another change now is made knowing them.
            let mut prev = e.day_note.clone();
            for ep in app.model().epochs.iter().filter(|ep| ep.from > app.clock) {
                let then = app
                    .model()
                    .field_ends_at(fi, ep.from)
                    .get(e.index)
                    .and_then(|x| x.day_note.clone());
                if then != prev {
                    state.push_str(&format!(
                        "; from {}: {}",
                        ep.from.format("%H%MZ"),
                        then.as_deref().unwrap_or("as declared")
                    ));
                    prev = then;
                }
            }
            Line::from(vec![
                Span::styled(
                    format!("  {id:<4} {word:<15}"),
                    if usable { Style::new() } else { t.error() },
                ),
                Span::raw(format!(
                    "TORA {}, LDA {}, {} · ",
                    length(app, e.tora_m),
                    length(app, e.lda_m),
                    e.surface.word()
                )),
                Span::styled(
                    format!("today: {state}"),
                    if state != "as declared" {
                        t.heading()
                    } else {
                        t.dim()
                    },
                ),
            ])
        })
        .collect()
}

/// A declared distance in the operator's display unit.
fn length(app: &App, m: f64) -> String {
    match app.ops.operator.display_units.distance {
        crate::ops::operator::DistanceUnit::M => format!("{m:.0} m"),
        crate::ops::operator::DistanceUnit::Ft => {
            format!("{:.0} ft", crate::units::m_to_ft(m))
        }
    }
}

fn runway_form(app: &App, f: &RunwayForm, area: Rect, buf: &mut Buffer, t: Theme) {
    let mut lines: Vec<Line> = vec![Line::styled(
        format!(
            "Runway state on {} (as `rhoboard runway` sets it):",
            app.day()
        ),
        t.dim(),
    )];
    match app.ops.airfield_position(&f.airfield()) {
        Some(fi) => lines.extend(end_lines(app, fi, t)),
        None => lines.push(Line::styled(
            "  (type an airfield id to see its ends)",
            t.dim(),
        )),
    }
    if area.height >= 30 {
        lines.push(Line::default());
    }
    lines.extend(field_lines(
        RUNWAY_FIELDS.iter().map(|s| (s.label, s.hint)),
        &f.values,
        f.focus,
        |i| f.error_for(i),
        10,
        t,
    ));
    for (_, g) in f.errors.iter().filter(|(i, _)| i.is_none()) {
        lines.push(Line::styled(format!("✗ {g}"), t.error()));
    }
    let where_to = match (&app.settings.ops_dir, app.settings.demo) {
        (Some(dir), false) => format!(
            "Enter writes {} and re-checks every leg; Esc cancels.",
            crate::commands::runway::state_path(dir, app.day()).display()
        ),
        _ => "Demo, no operator folder: kept in memory for this session only. Enter sets \
              it and re-checks every leg; Esc cancels."
            .to_string(),
    };
    lines.push(Line::styled(where_to, t.dim()));
    super::overlays::boxed(
        lines,
        " Runway state for the day (r) ".into(),
        area,
        buf,
        t,
        104,
    );
}

/// A sun event as `1947Z`, or why there is none.
fn sun_z(e: crate::daylight::Event) -> String {
    match e {
        crate::daylight::Event::At(t) => t.format("%H%MZ").to_string(),
        crate::daylight::Event::AlwaysAbove => "up all day".to_string(),
        crate::daylight::Event::AlwaysBelow => "no sun".to_string(),
    }
}

/// A sun event in the operator's local time (`2147`), when there is one.
fn sun_local(app: &App, e: crate::daylight::Event) -> Option<String> {
    let off = chrono::TimeDelta::minutes(i64::from(app.ops.operator.time_zone.utc_offset_min));
    e.time().map(|t| (t + off).format("%H%M").to_string())
}

/// `UTC+2`, `UTC-5:30`.
fn utc_offset_text(min: i32) -> String {
    let sign = if min < 0 { '-' } else { '+' };
    let (h, m) = (min.abs() / 60, min.abs() % 60);
    if m == 0 {
        format!("UTC{sign}{h}")
    } else {
        format!("UTC{sign}{h}:{m:02}")
    }
}

/// The selected airfield's day: sun times (Z and local) and its runway ends today.
fn field_panel(app: &App, area: Rect, buf: &mut Buffer, t: Theme) {
    let Some(f) = app.ops.airfields.get(app.ui.field_row) else {
        return;
    };
    let d = crate::daylight::daylight(app.day(), f.latitude_deg, f.longitude_deg);
    let tz = &app.ops.operator.time_zone;
    let both = |e| match sun_local(app, e) {
        Some(l) => format!("{} ({l} local)", sun_z(e)),
        None => sun_z(e),
    };
    let mut lines = vec![
        Line::from(vec![
            Span::styled(format!("{} on {}: ", f.id, app.day()), t.heading()),
            Span::raw(format!(
                "sunrise {}, sunset {}, civil twilight ends {} (local: {})",
                both(d.sunrise),
                both(d.sunset),
                both(d.civil_dusk),
                if tz.name.contains("UTC") {
                    tz.name.clone()
                } else {
                    format!("{}, {}", tz.name, utc_offset_text(tz.utc_offset_min))
                }
            )),
        ]),
        Line::styled("Runway ends today (r sets the state):", t.dim()),
    ];
    lines.extend(end_lines(app, app.ui.field_row, t));
    let block = Block::new().borders(Borders::TOP).border_style(t.frame());
    let inner = block.inner(area);
    block.render(area, buf);
    let w = usize::from(inner.width);
    let lines: Vec<Line> = lines
        .into_iter()
        .flat_map(|l| fit::wrap(l, w, None))
        .collect();
    Paragraph::new(lines).render(inner, buf);
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::assess::limits::LimitKind;
    use crate::assess::pairing::{PairLimit, WeatherMinimum};
    use crate::ops::operator::{
        DisplayUnits, DistanceUnit, MassUnit, PressureUnit, TemperatureUnit,
    };

    fn show(distance: DistanceUnit) -> Show {
        Show(DisplayUnits {
            distance,
            mass: MassUnit::Kg,
            pressure: PressureUnit::Hpa,
            temperature: TemperatureUnit::C,
        })
    }

    fn weather(kind: LimitKind, margin: f64, unit: &'static str) -> PairCell {
        PairCell {
            state: State::Below,
            score: -1.0,
            margin_percent: f64::NAN,
            limiting: PairLimit::Weather,
            best_end_state: State::Below,
            end_in_use: Some(0),
            headroom_c: None,
            headroom_table_ends: false,
            minimum: Some(WeatherMinimum { kind, margin, unit }),
        }
    }

    /// A pairing the weather decides names its minimum with its margin and unit,
    /// never "the field's weather" with no margin.
    #[test]
    fn a_weather_decided_pairing_names_its_minimum_and_margin() {
        let c = weather(LimitKind::Ceiling, -200.0, "ft");
        let m = show(DistanceUnit::M);
        assert_eq!(cell_text(&c, m), "✗-200ft");
        assert_eq!(limit_word(&c, m), "ceiling (-200 ft)");
        assert_eq!(pair_headroom(&c, m), "—");
        // 1 SM = 1609.344 m (NIST SP 811): a visibility margin in SM with distances
        // in ft.
        let v = weather(LimitKind::Visibility, -1609.344, "m");
        assert_eq!(cell_text(&v, show(DistanceUnit::Ft)), "✗-1.0SM");
        // Rounded down, never larger than it is: -1609.344 m shows as -1610 m.
        assert_eq!(limit_word(&v, m), "visibility (-1610 m)");
    }
}
