//! Fitting text to the width there is, without ever cutting a value: tables that drop
//! their least needed columns, text shortened at word boundaries (marked `…`), lines
//! wrapped with a hanging indent, and the first of several wordings that fits.

use std::borrow::Cow;

use ratatui::buffer::Buffer;
use ratatui::layout::{Constraint, Rect};
use ratatui::style::Style;
use ratatui::text::{Line, Span};
use ratatui::widgets::{Cell, Row, Table, Widget};

/// Display width of `s` (terminal columns).
pub fn width(s: &str) -> usize {
    Span::raw(s).width()
}

/// Units that stay on the line of their number (`-10 kt` is never `-10…`).
const UNITS: [&str; 22] = [
    "%", "kt", "ft", "m", "°C", "°F", "kg", "lb", "hPa", "inHg", "min", "SM", "ft/NM", "ft/min",
    "KIAS", "L", "mm", "in", "kg·m", "lb·in", "°C)", "%)",
];

fn is_unit(word: &str) -> bool {
    let w = word.trim_end_matches([',', ';', ':', '.', ')']);
    UNITS.contains(&w) || UNITS.contains(&word)
}

fn ends_in_digit(s: &str) -> bool {
    s.ends_with(|c: char| c.is_ascii_digit())
}

/// Whether `word` stays on the line of `prev`: a number's unit, or a state's word
/// after its glyph (`✗ below`).
fn glued(prev: &str, word: &str) -> bool {
    (ends_in_digit(prev) && is_unit(word))
        || (matches!(prev, "✓" | "~" | "✗" | "?")
            && ["within", "thin", "below", "no-data"]
                .iter()
                .any(|s| word.trim_end_matches([',', ';', ':', '.', ')']) == *s))
}

/// The words of `text`, a number and its unit kept as one.
fn unit_words(text: &str) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    for word in text.split(' ') {
        match out.last_mut() {
            Some(prev) if glued(prev, word) => {
                prev.push(' ');
                prev.push_str(word);
            }
            _ => out.push(word.to_string()),
        }
    }
    out
}

/// `text` if it fits in `w` columns, else as many whole words as fit followed by `…`
/// (a word longer than `w` alone is left out too: nothing is cut inside a word, and
/// a number keeps its unit).
pub fn words(text: &str, w: usize) -> Cow<'_, str> {
    if width(text) <= w {
        return Cow::Borrowed(text);
    }
    let mut out = String::new();
    for word in unit_words(text) {
        let word = word.as_str();
        let sep = usize::from(!out.is_empty());
        if width(&out) + sep + width(word) + 1 > w {
            break;
        }
        if sep == 1 {
            out.push(' ');
        }
        out.push_str(word);
    }
    let out = out.trim_end_matches([',', ';', ':', ' ']).to_string();
    if w == 0 {
        Cow::Borrowed("")
    } else {
        Cow::Owned(format!("{out}…"))
    }
}

/// The first of `lines` (richest first) that fits in `w`, else the last.
pub fn first_line(lines: Vec<Line<'static>>, w: usize) -> Line<'static> {
    let n = lines.len();
    lines
        .into_iter()
        .enumerate()
        .find(|(i, l)| l.width() <= w || i + 1 == n)
        .map(|(_, l)| l)
        .unwrap_or_default()
}

/// One column of a board table.
pub struct Column {
    /// The heading (with the unit where the cells carry none).
    pub head: String,
    /// A shorter heading for when the cells are narrower than `head` (explained in
    /// the help's legend).
    pub short: Option<&'static str>,
    /// One cell a row; a flexible column's cells are its wordings, richest first.
    pub cells: Vec<Vec<Line<'static>>>,
    /// Which goes first when the width runs short: 0 never, higher sooner.
    pub drop: u8,
    /// The one column that takes the room left (and is shortened at words to fit),
    /// with the least width worth showing.
    pub flex: Option<u16>,
    /// The least width, so the column does not shift as rows scroll by.
    pub min: u16,
}

impl Column {
    /// A fixed column of plain cells.
    pub fn new(head: &str, drop: u8, cells: Vec<Line<'static>>) -> Column {
        Column {
            head: head.to_string(),
            short: None,
            cells: cells.into_iter().map(|c| vec![c]).collect(),
            drop,
            flex: None,
            min: 0,
        }
    }

    /// The flexible column: each row's wordings, richest first.
    pub fn flex(head: &str, min: u16, cells: Vec<Vec<Line<'static>>>) -> Column {
        Column {
            head: head.to_string(),
            short: None,
            cells,
            drop: 0,
            flex: Some(min),
            min: 0,
        }
    }

    /// The same, at least `w` wide (the widest value it can hold).
    pub fn at_least(mut self, w: u16) -> Column {
        self.min = w;
        self
    }

    /// The same with a shorter heading for narrow tables.
    pub fn short(mut self, head: &'static str) -> Column {
        self.short = Some(head);
        self
    }

    fn heading(&self, w: usize) -> String {
        match self.short {
            Some(s) if width(&self.head) > w => s.to_string(),
            _ => words(&self.head, w).into_owned(),
        }
    }

    fn natural(&self) -> u16 {
        let cells = self
            .cells
            .iter()
            .map(|c| c.first().map_or(0, Line::width))
            .max()
            .unwrap_or(0);
        let head = width(&self.head).min(self.short.map_or(usize::MAX, width));
        (cells.max(head) as u16).max(self.min)
    }

    /// The widest a flexible column grows: its richest cells or its full heading.
    fn widest(&self) -> u16 {
        self.natural().max(width(&self.head) as u16)
    }
}

/// Which columns show in `w` columns (spacing 1), and each one's width: the flexible
/// column gives way down to its least width, then columns are dropped, highest `drop`
/// first (the rightmost among equals), until the rest fits whole.
pub fn plan(cols: &[Column], w: u16) -> Vec<Option<u16>> {
    let natural: Vec<u16> = cols.iter().map(Column::natural).collect();
    let mut shown: Vec<bool> = vec![true; cols.len()];
    let need = |shown: &[bool]| -> u16 {
        let n = shown.iter().filter(|s| **s).count() as u16;
        let sum: u16 = cols
            .iter()
            .zip(&natural)
            .zip(shown)
            .filter(|(_, s)| **s)
            .map(|((c, nat), _)| c.flex.map_or(*nat, |m| m.min(*nat)))
            .sum();
        sum + n.saturating_sub(1)
    };
    while need(&shown) > w {
        let victim = cols
            .iter()
            .enumerate()
            .filter(|(i, c)| shown[*i] && c.drop > 0)
            .max_by_key(|(i, c)| (c.drop, *i))
            .map(|(i, _)| i);
        match victim {
            Some(i) => shown[i] = false,
            None => break,
        }
    }
    let fixed: u16 = need(&shown);
    cols.iter()
        .zip(&natural)
        .zip(&shown)
        .map(|((c, nat), s)| {
            if !s {
                return None;
            }
            Some(match c.flex {
                Some(m) => {
                    let base = m.min(*nat);
                    (base + w.saturating_sub(fixed)).min(c.widest().max(base))
                }
                None => *nat,
            })
        })
        .collect()
}

/// Renders `cols` as a table in `area`: the header row, then one row per cell index,
/// styled by `styles`; only the columns [`plan`] keeps, none cut.
pub fn table(cols: Vec<Column>, styles: &[Style], head_style: Style, area: Rect, buf: &mut Buffer) {
    let widths = plan(&cols, area.width);
    let rows_n = cols.iter().map(|c| c.cells.len()).max().unwrap_or(0);
    let kept: Vec<(Column, u16)> = cols
        .into_iter()
        .zip(widths)
        .filter_map(|(c, w)| w.map(|w| (c, w)))
        .collect();
    let header = Row::new(
        kept.iter()
            .map(|(c, w)| Cell::from(c.heading(usize::from(*w))))
            .collect::<Vec<_>>(),
    )
    .style(head_style);
    let mut cells: Vec<std::vec::IntoIter<Vec<Line<'static>>>> = Vec::new();
    let mut flex: Vec<Option<u16>> = Vec::new();
    let mut constraints: Vec<Constraint> = Vec::new();
    for (c, w) in kept {
        flex.push(c.flex.map(|_| w));
        constraints.push(Constraint::Length(w));
        cells.push(c.cells.into_iter());
    }
    let rows = (0..rows_n).map(|r| {
        let row: Vec<Cell> = cells
            .iter_mut()
            .zip(&flex)
            .map(|(it, f)| {
                let wordings = it.next().unwrap_or_default();
                match f {
                    Some(w) => Cell::from(fit_line(wordings, usize::from(*w))),
                    None => Cell::from(wordings.into_iter().next().unwrap_or_default()),
                }
            })
            .collect();
        Row::new(row).style(styles.get(r).copied().unwrap_or_default())
    });
    let rows: Vec<Row> = rows.collect();
    Table::new(rows, constraints)
        .header(header)
        .column_spacing(1)
        .render(area, buf);
}

/// The first wording that fits in `w`, else the last shortened at words (one style).
fn fit_line(wordings: Vec<Line<'static>>, w: usize) -> Line<'static> {
    if let Some(l) = wordings.iter().find(|l| l.width() <= w) {
        return l.clone();
    }
    let Some(last) = wordings.into_iter().last() else {
        return Line::default();
    };
    let style = last.spans.first().map_or(Style::new(), |s| s.style);
    let text: String = last.spans.iter().map(|s| s.content.as_ref()).collect();
    Line::from(Span::styled(words(&text, w).into_owned(), style)).style(last.style)
}

/// `line` wrapped at word boundaries into lines of at most `w` columns; continuation
/// lines start at `hang` columns (by default the item's own indent plus two), so a
/// wrapped item still reads as one. Styles are kept; a word longer than a line is
/// split only then.
pub fn wrap(line: Line<'static>, w: usize, hang: Option<usize>) -> Vec<Line<'static>> {
    if line.width() <= w || w < 8 {
        return vec![line];
    }
    let text: String = line.spans.iter().map(|s| s.content.as_ref()).collect();
    let indent = text.len() - text.trim_start_matches(' ').len();
    let hang = hang.unwrap_or(indent + 2).min(w / 2);
    // Words (runs of non-spaces, possibly across spans) and the spaces before them.
    let mut tokens: Vec<(bool, Vec<Span<'static>>)> = Vec::new();
    for span in &line.spans {
        let mut rest = span.content.as_ref();
        while !rest.is_empty() {
            let space = rest.starts_with(' ');
            let end = rest
                .find(|c: char| (c == ' ') != space)
                .unwrap_or(rest.len());
            let piece = Span::styled(rest[..end].to_string(), span.style);
            match tokens.last_mut() {
                Some((s, spans)) if *s == space => spans.push(piece),
                _ => tokens.push((space, vec![piece])),
            }
            rest = &rest[end..];
        }
    }
    // A number and its unit stay together: word, space, unit become one word.
    let text_of = |v: &[Span]| v.iter().map(|s| s.content.as_ref()).collect::<String>();
    let mut merged: Vec<(bool, Vec<Span<'static>>)> = Vec::new();
    for tok in tokens {
        let n = merged.len();
        let glue = !tok.0
            && n >= 2
            && merged[n - 1].0
            && !merged[n - 2].0
            && glued(&text_of(&merged[n - 2].1), &text_of(&tok.1));
        if glue {
            let (_, gap) = merged.pop().unwrap_or_default();
            if let Some((_, word)) = merged.last_mut() {
                word.extend(gap);
                word.extend(tok.1);
            }
        } else {
            merged.push(tok);
        }
    }
    let tokens = merged;
    let mut out: Vec<Line<'static>> = Vec::new();
    let mut cur: Vec<Span<'static>> = Vec::new();
    let mut cur_w = 0usize;
    let mut gap: Vec<Span<'static>> = Vec::new();
    let span_w = |v: &[Span]| v.iter().map(Span::width).sum::<usize>();
    let mut first = true;
    for (space, spans) in tokens {
        if space {
            if first && cur.is_empty() {
                cur_w += span_w(&spans);
                cur.extend(spans);
            } else {
                gap = spans;
            }
            continue;
        }
        first = false;
        let ww = span_w(&spans);
        let gw = span_w(&gap);
        if cur_w + gw + ww > w && cur_w > hang {
            out.push(Line::from(std::mem::take(&mut cur)).style(line.style));
            cur.push(Span::raw(" ".repeat(hang)));
            cur_w = hang;
            gap.clear();
        } else {
            cur_w += gw;
            cur.append(&mut gap);
        }
        // A word longer than a whole line: split it by characters.
        let mut pending = spans;
        while cur_w + span_w(&pending) > w && w > cur_w {
            let (head, tail) = split_spans(pending, w - cur_w);
            cur.extend(head);
            out.push(Line::from(std::mem::take(&mut cur)).style(line.style));
            cur.push(Span::raw(" ".repeat(hang)));
            cur_w = hang;
            pending = tail;
        }
        cur_w += span_w(&pending);
        cur.extend(pending);
    }
    if !cur.is_empty() {
        out.push(Line::from(cur).style(line.style));
    }
    out
}

/// Splits spans after `w` columns.
fn split_spans(spans: Vec<Span<'static>>, w: usize) -> (Vec<Span<'static>>, Vec<Span<'static>>) {
    let (mut head, mut tail) = (Vec::new(), Vec::new());
    let mut used = 0usize;
    for s in spans {
        if used >= w {
            tail.push(s);
            continue;
        }
        let mut a = String::new();
        let mut b = String::new();
        for ch in s.content.chars() {
            let cw = width(ch.encode_utf8(&mut [0; 4]));
            if b.is_empty() && used + cw <= w {
                a.push(ch);
                used += cw;
            } else {
                b.push(ch);
            }
        }
        if !a.is_empty() {
            head.push(Span::styled(a, s.style));
        }
        if !b.is_empty() {
            used = w;
            tail.push(Span::styled(b, s.style));
        }
    }
    (head, tail)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn texts(lines: &[Line]) -> Vec<String> {
        lines.iter().map(|l| l.to_string()).collect()
    }

    #[test]
    fn words_never_cut_inside_a_word() {
        assert_eq!(words("XSEA crosswind", 14), "XSEA crosswind");
        assert_eq!(words("XSEA crosswind", 11), "XSEA…");
        assert_eq!(
            words("arrival XSHT: report 141200Z is stale", 24),
            "arrival XSHT: report…"
        );
        assert_eq!(words("crosswind", 4), "…");
        // A number keeps its unit.
        assert_eq!(words("XSEA crosswind -10 kt", 19), "XSEA crosswind…");
    }

    #[test]
    fn a_number_and_its_unit_wrap_together() {
        let l = Line::from("  result: ground roll 468 m, 50 ft 870 m");
        let out = texts(&wrap(l, 25, None));
        assert_eq!(out, ["  result: ground roll", "    468 m, 50 ft 870 m"]);
        // A state's glyph keeps its word.
        let l = Line::from("── Departure XPIN 1600Z · runway 26  ✗ below");
        assert_eq!(
            texts(&wrap(l, 40, None)),
            ["── Departure XPIN 1600Z · runway 26", "  ✗ below"]
        );
    }

    #[test]
    fn wrapped_lines_keep_a_hanging_indent() {
        let l = Line::from("  check distance_50ft × 1.33 ≤ TODA: 870 m × 1.33 = 1157 m needed");
        let out = texts(&wrap(l, 40, None));
        assert_eq!(
            out,
            [
                "  check distance_50ft × 1.33 ≤ TODA:",
                "    870 m × 1.33 = 1157 m needed",
            ]
        );
        for line in &out {
            assert!(width(line) <= 40, "{line}");
        }
        // Continuations of a help entry line up under its text.
        let h = Line::from("  s          sort: time, state, margin ÷ buffer");
        assert_eq!(
            texts(&wrap(h, 30, Some(13))),
            [
                "  s          sort: time,",
                "             state, margin ÷",
                "             buffer"
            ]
        );
    }

    #[test]
    fn a_word_longer_than_the_line_is_split_only_then() {
        let l = Line::from("ab cdefghijklmnopqrstuvwxyz");
        let out = texts(&wrap(l, 10, Some(0)));
        assert!(out.iter().all(|s| width(s) <= 10), "{out:?}");
        assert_eq!(out.concat().replace(' ', ""), "abcdefghijklmnopqrstuvwxyz");
    }

    fn col(head: &str, drop: u8, cells: &[&str]) -> Column {
        Column::new(
            head,
            drop,
            cells.iter().map(|c| Line::from(c.to_string())).collect(),
        )
    }

    #[test]
    fn columns_are_dropped_whole_by_rank_and_the_flexible_one_takes_the_rest() {
        let cols = vec![
            col("leg", 0, &["L01"]),
            col("route", 2, &["XSEA-XMRS"]),
            col("margin", 1, &["+1095 ft"]),
            Column::flex(
                "limiting check",
                10,
                vec![vec![Line::from("XSEA crosswind")]],
            ),
        ];
        // Everything: 3 + 9 + 8 + 14 and three spaces.
        assert_eq!(plan(&cols, 40), [Some(3), Some(9), Some(8), Some(14)]);
        // The flexible column gives way first, to its least width.
        assert_eq!(plan(&cols, 33), [Some(3), Some(9), Some(8), Some(10)]);
        // Then the route (drop 2) goes, and the check gets the room back.
        assert_eq!(plan(&cols, 30), [Some(3), None, Some(8), Some(14)]);
        assert_eq!(plan(&cols, 20), [Some(3), None, None, Some(14)]);
    }
}
