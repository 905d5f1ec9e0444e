//! The keymap: one table drives both the key handling and the help overlay.

use ratatui::crossterm::event::{KeyCode, KeyEvent, KeyModifiers};

/// Everything a key can ask the board to do (the keybinding vocabulary).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Action {
    /// Move the selection up (in the detail: scroll up).
    Up,
    /// Move the selection down (in the detail: scroll down).
    Down,
    /// Move left (pairings: previous airfield).
    Left,
    /// Move right (pairings: next airfield).
    Right,
    /// One page up.
    PageUp,
    /// One page down.
    PageDown,
    /// First row.
    Top,
    /// Last row.
    Bottom,
    /// Next pane.
    NextPane,
    /// Previous pane.
    PrevPane,
    /// Open the selected leg's or pairing's detail.
    Open,
    /// Close the detail, the help or a form; clear the filter.
    Close,
    /// Type a filter for the legs.
    Filter,
    /// Cycle the legs' sort: time, state, margin.
    Sort,
    /// Type an observation by hand.
    ManualReport,
    /// Set today's runway state (close an end, reduce distances, condition, end in use).
    RunwayState,
    /// Pause or resume the replay.
    Pause,
    /// Replay: jump to the next whole hour.
    NextHour,
    /// Replay: step back to the previous whole hour.
    PrevHour,
    /// Replay: double the pace.
    Faster,
    /// Replay: halve the pace.
    Slower,
    /// Sign off the selected leg (a confirmation shows the basis first).
    SignOff,
    /// What-if: re-plan the selected leg (aircraft, time, destination, loads).
    WhatIf,
    /// Write the pending what-if changes to the legs file.
    Write,
    /// Undo the last what-if change.
    Undo,
    /// Show or hide the help.
    Help,
    /// Quit.
    Quit,
}

/// One key a binding answers to.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Key {
    /// The key.
    pub code: KeyCode,
    /// Whether Ctrl must be held.
    pub ctrl: bool,
}

const fn k(code: KeyCode) -> Key {
    Key { code, ctrl: false }
}

const fn c(ch: char) -> Key {
    Key {
        code: KeyCode::Char(ch),
        ctrl: false,
    }
}

/// A row of the keymap.
#[derive(Debug, Clone, Copy)]
pub struct Binding {
    /// Keys that trigger it.
    pub keys: &'static [Key],
    /// How the keys are written in the help.
    pub label: &'static str,
    /// What it does.
    pub action: Action,
    /// What the help says.
    pub help: &'static str,
}

/// The keymap.
pub const KEYMAP: &[Binding] = &[
    Binding {
        keys: &[k(KeyCode::Up), c('k')],
        label: "↑ k",
        action: Action::Up,
        help: "select the row above (detail: scroll up)",
    },
    Binding {
        keys: &[k(KeyCode::Down), c('j')],
        label: "↓ j",
        action: Action::Down,
        help: "select the row below (detail: scroll down)",
    },
    Binding {
        keys: &[k(KeyCode::Left), c('h')],
        label: "← h",
        action: Action::Left,
        help: "pairings: airfield to the left",
    },
    Binding {
        keys: &[k(KeyCode::Right), c('l')],
        label: "→ l",
        action: Action::Right,
        help: "pairings: airfield to the right",
    },
    Binding {
        keys: &[k(KeyCode::PageUp)],
        label: "PgUp",
        action: Action::PageUp,
        help: "one page up",
    },
    Binding {
        keys: &[k(KeyCode::PageDown)],
        label: "PgDn",
        action: Action::PageDown,
        help: "one page down",
    },
    Binding {
        keys: &[k(KeyCode::Home), c('g')],
        label: "Home g",
        action: Action::Top,
        help: "first row",
    },
    Binding {
        keys: &[k(KeyCode::End), c('G')],
        label: "End G",
        action: Action::Bottom,
        help: "last row",
    },
    Binding {
        keys: &[k(KeyCode::Tab)],
        label: "Tab",
        action: Action::NextPane,
        help: "next pane: Legs, Pairings, Airfields, Fleet, Reports",
    },
    Binding {
        keys: &[k(KeyCode::BackTab)],
        label: "Shift-Tab",
        action: Action::PrevPane,
        help: "previous pane",
    },
    Binding {
        keys: &[k(KeyCode::Enter)],
        label: "Enter",
        action: Action::Open,
        help: "open the chain of the selected leg or pairing",
    },
    Binding {
        keys: &[k(KeyCode::Esc)],
        label: "Esc",
        action: Action::Close,
        help: "close the detail or help; clear the filter",
    },
    Binding {
        keys: &[c('/')],
        label: "/",
        action: Action::Filter,
        help: "filter the legs by text (leg, aircraft, airfield, pilot) or state (thin: only thin)",
    },
    Binding {
        keys: &[c('s')],
        label: "s",
        action: Action::Sort,
        help: "sort the legs: by time, worst state first, or smallest margin ÷ buffer first",
    },
    Binding {
        keys: &[c('o')],
        label: "o",
        action: Action::ManualReport,
        help: "type an observation by hand",
    },
    Binding {
        keys: &[c('r')],
        label: "r",
        action: Action::RunwayState,
        help: "today's runway state: close an end, reduce TORA/LDA, condition, end in use",
    },
    Binding {
        keys: &[c(' ')],
        label: "space",
        action: Action::Pause,
        help: "replay: pause / resume",
    },
    Binding {
        keys: &[c('n')],
        label: "n",
        action: Action::NextHour,
        help: "replay: jump to the next whole hour",
    },
    Binding {
        keys: &[c('p')],
        label: "p",
        action: Action::PrevHour,
        help: "replay: step back to the previous whole hour",
    },
    Binding {
        keys: &[c('+'), c('=')],
        label: "+",
        action: Action::Faster,
        help: "replay: twice the pace",
    },
    Binding {
        keys: &[c('-')],
        label: "-",
        action: Action::Slower,
        help: "replay: half the pace",
    },
    Binding {
        keys: &[c('S')],
        label: "S",
        action: Action::SignOff,
        help: "sign off the selected leg (shows the basis, asks the instructor)",
    },
    Binding {
        keys: &[c('e')],
        label: "e",
        action: Action::WhatIf,
        help: "what-if: change the leg's aircraft, time, destination or loads",
    },
    Binding {
        keys: &[c('w')],
        label: "w",
        action: Action::Write,
        help: "write the pending what-if changes to the legs file",
    },
    Binding {
        keys: &[c('u')],
        label: "u",
        action: Action::Undo,
        help: "undo the last what-if change",
    },
    Binding {
        keys: &[c('?')],
        label: "?",
        action: Action::Help,
        help: "this help",
    },
    Binding {
        keys: &[
            c('q'),
            Key {
                code: KeyCode::Char('c'),
                ctrl: true,
            },
        ],
        label: "q Ctrl-C",
        action: Action::Quit,
        help: "quit",
    },
];

/// The action a key press asks for, if any.
pub fn action_for(key: &KeyEvent) -> Option<Action> {
    let ctrl = key.modifiers.contains(KeyModifiers::CONTROL);
    let code = match key.code {
        // Terminals differ on whether Shift-Tab arrives as BackTab or Shift+Tab.
        KeyCode::Tab if key.modifiers.contains(KeyModifiers::SHIFT) => KeyCode::BackTab,
        other => other,
    };
    KEYMAP
        .iter()
        .find(|b| b.keys.iter().any(|k| k.code == code && k.ctrl == ctrl))
        .map(|b| b.action)
}

/// Whether the key is Ctrl-C (quits from any mode).
pub fn is_ctrl_c(key: &KeyEvent) -> bool {
    key.modifiers.contains(KeyModifiers::CONTROL) && key.code == KeyCode::Char('c')
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_key_has_one_action() {
        let mut seen: Vec<Key> = Vec::new();
        for b in KEYMAP {
            for key in b.keys {
                assert!(!seen.contains(key), "{key:?} bound twice");
                seen.push(*key);
            }
        }
    }

    #[test]
    fn keys_map_to_actions() {
        let press = |code, m| KeyEvent::new(code, m);
        assert_eq!(
            action_for(&press(KeyCode::Char('j'), KeyModifiers::NONE)),
            Some(Action::Down)
        );
        assert_eq!(
            action_for(&press(KeyCode::Tab, KeyModifiers::SHIFT)),
            Some(Action::PrevPane)
        );
        assert_eq!(
            action_for(&press(KeyCode::Char('c'), KeyModifiers::CONTROL)),
            Some(Action::Quit)
        );
        assert_eq!(
            action_for(&press(KeyCode::Char('c'), KeyModifiers::NONE)),
            None
        );
    }
}
