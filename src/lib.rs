//! rhoboard: a terminal dispatch board for small flight schools and charter operators.
//!
//! The library is the domain core — the standard atmosphere, unit handling, and (as
//! they land) observations, the operator's data and the assessment — plus the command
//! implementations the thin binary dispatches to. The core reads no clock and touches
//! no terminal; "now" is always a parameter.
//!
//! rhoboard is a planning aid. The aircraft flight manual, the pilot in command, the
//! operator's approved procedures and local regulations govern.

pub mod assess;
pub mod atmosphere;
pub mod board;
pub mod commands;
pub mod daylight;
pub mod display;
pub mod observation;
pub mod ops;
pub mod replan;
pub mod report;
pub mod signoff;
pub mod units;

/// The caution shown on every screen and in every report.
pub const CAUTION: &str = "Planning aid only: the aircraft flight manual, the pilot in command, \
the operator's approved procedures and local regulations govern.";
