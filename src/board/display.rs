//! The operator's display units, kept here for the board's own paths; the type lives
//! in [`crate::display`], shared with the text commands and the report.

pub use crate::display::Show;
