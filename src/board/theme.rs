//! Styles. Colours are the terminal's own 16 (so dark and light themes both keep their
//! contrast); every state also has its glyph and word, and `NO_COLOR` drops colour
//! but keeps bold and reverse.

use ratatui::style::{Color, Modifier, Style};

use crate::assess::State;

/// The board's styles.
#[derive(Debug, Clone, Copy)]
pub struct Theme {
    /// Colours allowed.
    pub color: bool,
}

impl Theme {
    fn fg(self, c: Color) -> Style {
        if self.color {
            Style::new().fg(c)
        } else {
            Style::new()
        }
    }

    /// A state's style.
    pub fn state(self, s: State) -> Style {
        match s {
            State::Within => self.fg(Color::Green),
            State::Thin => self.fg(Color::Yellow),
            State::Below => self.fg(Color::Red).add_modifier(Modifier::BOLD),
            State::NoData => self.fg(Color::Magenta),
        }
    }

    /// Headings in the detail.
    pub fn heading(self) -> Style {
        self.fg(Color::Cyan).add_modifier(Modifier::BOLD)
    }

    /// Quieter text (sources, hints).
    pub fn dim(self) -> Style {
        if self.color {
            Style::new().add_modifier(Modifier::DIM)
        } else {
            Style::new()
        }
    }

    /// The selected row.
    pub fn selected(self) -> Style {
        Style::new().add_modifier(Modifier::REVERSED)
    }

    /// Errors.
    pub fn error(self) -> Style {
        self.fg(Color::Red).add_modifier(Modifier::BOLD)
    }

    /// The caution line.
    pub fn caution(self) -> Style {
        self.fg(Color::Yellow)
    }

    /// Borders and titles.
    pub fn frame(self) -> Style {
        self.fg(Color::Blue)
    }

    /// A leg that just changed state.
    pub fn changed(self) -> Style {
        Style::new().add_modifier(Modifier::BOLD)
    }
}
