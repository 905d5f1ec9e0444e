//! The assessment: from the operator's data, the observations and a reference time to
//! a state per leg and per aircraft × airfield pairing, with the chain behind each
//! number. Pure: no I/O, no clock, no allocation in the per-runway-end inner loop.

pub mod state;
pub mod wind;

pub use state::State;
