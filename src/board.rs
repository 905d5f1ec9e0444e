//! The terminal board: plain state ([`App`]), one message type ([`Msg`]) into an
//! `update` that does no I/O, pure views (`impl Widget for &App`), the layout as data
//! ([`layout::BoardLayout`]), and an event loop on std threads with one channel
//! ([`run`]): an input thread, feed threads (the operator's `observations/` folder,
//! an optional feed command) and the replay's simulated clock.
//!
//! Only this module imports ratatui and crossterm.

pub mod app;
pub mod detail;
pub mod display;
pub mod effects;
pub mod feed;
pub mod fit;
pub mod forecast;
pub mod form;
pub mod keys;
pub mod layout;
pub mod overlays;
pub mod replan;
pub mod run;
pub mod runway_form;
pub mod screenshot;
pub mod signoff;
pub mod theme;
pub mod view;

pub use app::{App, Msg, Pane, Replay, Settings, Sort};
pub use effects::Effect;
pub use keys::{Action, KEYMAP};
pub use layout::{BoardLayout, LayoutSettings};
pub use run::{Feeds, run};
