//! The board's layout as data: which rectangle each part gets, for a terminal size
//! and what is open. Tested on its own; never panics on a tiny area.

use ratatui::layout::{Constraint, Layout, Rect};

use super::app::{App, Pane};

/// The smallest terminal the board is laid out for.
pub const MIN_SIZE: (u16, u16) = (60, 20);
/// The Legs pane's width that shows every column (the category and the forecast
/// too): beside the detail it is never narrower, so a wider terminal never shows
/// fewer columns than a narrower one without the detail (finding 22).
pub const LEGS_FULL_W: u16 = 104;
/// The detail's least width beside the legs.
pub const DETAIL_MIN_W: u16 = 56;
/// From this width the detail stands beside the legs.
pub const WIDE_FROM: u16 = LEGS_FULL_W + DETAIL_MIN_W;

/// What the layout depends on besides the size.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct LayoutSettings {
    /// The pane shown.
    pub pane: Pane,
    /// Whether a detail is open.
    pub detail_open: bool,
    /// Whether the open detail is a pairing's (shown full width).
    pub pairing: bool,
}

impl LayoutSettings {
    /// The settings of the app's current state.
    pub fn of(app: &App) -> LayoutSettings {
        LayoutSettings {
            pane: app.ui.pane,
            detail_open: app.ui.detail_open,
            pairing: app.ui.pairing.is_some(),
        }
    }
}

/// Where each part of the board goes.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct BoardLayout {
    /// The terminal is smaller than [`MIN_SIZE`]: only `message` is used.
    pub too_small: bool,
    /// The whole area (for the too-small message and overlays).
    pub message: Rect,
    /// Operator, clock, replay state, counts.
    pub header: Rect,
    /// Pane tabs, sort and filter.
    pub tabs: Rect,
    /// The pane (or, narrow with a detail open, the detail).
    pub main: Rect,
    /// The detail beside the legs (wide), or in place of the pane (narrow, open).
    pub detail: Option<Rect>,
    /// The change list.
    pub changes: Rect,
    /// Key hints.
    pub hints: Rect,
    /// The planning-aid caution.
    pub caution: Rect,
}

impl BoardLayout {
    /// Lays out `area`.
    pub fn build(area: Rect, s: &LayoutSettings) -> BoardLayout {
        if area.width < MIN_SIZE.0 || area.height < MIN_SIZE.1 {
            return BoardLayout {
                too_small: true,
                message: area,
                ..BoardLayout::default()
            };
        }
        // As many lines as the caution takes, wrapped at words.
        let caution_lines = super::fit::wrap(
            ratatui::text::Line::from(crate::CAUTION),
            usize::from(area.width),
            Some(0),
        )
        .len() as u16;
        let changes_lines = if area.height >= 40 { 7 } else { 4 };
        let [header, tabs, body, changes, hints, caution] = area.layout(&Layout::vertical([
            Constraint::Length(1),
            Constraint::Length(1),
            Constraint::Min(8),
            Constraint::Length(changes_lines),
            Constraint::Length(1),
            Constraint::Length(caution_lines),
        ]));
        let wide = area.width >= WIDE_FROM;
        let (main, detail) = if s.detail_open && (s.pairing || !wide) {
            (body, Some(body))
        } else if wide && s.pane == Pane::Legs {
            let detail_w = (area.width * 2 / 5)
                .min(area.width - LEGS_FULL_W)
                .max(DETAIL_MIN_W);
            let [legs, detail] = body.layout(&Layout::horizontal([
                Constraint::Min(LEGS_FULL_W),
                Constraint::Length(detail_w),
            ]));
            (legs, Some(detail))
        } else {
            (body, None)
        };
        BoardLayout {
            too_small: false,
            message: area,
            header,
            tabs,
            main,
            detail,
            changes,
            hints,
            caution,
        }
    }

    /// Whether the detail takes the pane's place (so the pane is not drawn).
    pub fn detail_replaces_main(&self) -> bool {
        self.detail == Some(self.main)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn legs(open: bool) -> LayoutSettings {
        LayoutSettings {
            pane: Pane::Legs,
            detail_open: open,
            pairing: false,
        }
    }

    #[test]
    fn below_the_minimum_only_the_message() {
        for (w, h) in [(1, 1), (59, 24), (80, 19), (0, 0)] {
            let l = BoardLayout::build(Rect::new(0, 0, w, h), &legs(false));
            assert!(l.too_small, "{w}×{h}");
        }
        assert!(!BoardLayout::build(Rect::new(0, 0, 60, 20), &legs(false)).too_small);
        assert!(!BoardLayout::build(Rect::new(0, 0, 80, 24), &legs(false)).too_small);
    }

    #[test]
    fn at_80_by_24_every_part_fits_and_the_caution_wraps() {
        let l = BoardLayout::build(Rect::new(0, 0, 80, 24), &legs(false));
        assert_eq!(l.header, Rect::new(0, 0, 80, 1));
        assert_eq!(l.tabs, Rect::new(0, 1, 80, 1));
        assert_eq!(l.caution.height, 2);
        assert_eq!(l.caution.bottom(), 24);
        assert!(l.main.height >= 8);
        assert_eq!(l.detail, None);
        let parts = [l.header, l.tabs, l.main, l.changes, l.hints, l.caution];
        assert_eq!(parts.iter().map(|r| r.height).sum::<u16>(), 24);
    }

    #[test]
    fn narrow_detail_replaces_the_pane() {
        let l = BoardLayout::build(Rect::new(0, 0, 120, 40), &legs(true));
        assert!(l.detail_replaces_main());
        assert_eq!(l.caution.height, 2, "the caution is 131 characters");
        let wide = BoardLayout::build(Rect::new(0, 0, 140, 40), &legs(false));
        assert_eq!(wide.caution.height, 1);
    }

    #[test]
    fn wide_shows_detail_beside_legs() {
        let l = BoardLayout::build(Rect::new(0, 0, 200, 60), &legs(false));
        let d = l.detail.expect("detail beside legs");
        assert_eq!(d.y, l.main.y);
        assert_eq!(l.main.right(), d.x);
        assert_eq!(d.width, 80);
        assert!(!l.detail_replaces_main());
        // Other panes get the full width.
        let p = BoardLayout::build(
            Rect::new(0, 0, 200, 60),
            &LayoutSettings {
                pane: Pane::Pairings,
                detail_open: false,
                pairing: false,
            },
        );
        assert_eq!(p.detail, None);
        assert_eq!(p.main.width, 200);
    }
}
