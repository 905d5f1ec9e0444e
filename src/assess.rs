//! The assessment: from the operator's data, the observations and a reference time to
//! a state per leg and per aircraft × airfield pairing, with the chain behind each
//! number. Pure: no I/O, no clock, no allocation in the per-runway-end inner loop.
//! DESIGN.md "The assessment, in order" is followed step by step: air ([`leg::FieldWx`]),
//! wind ([`wind`]), takeoff, climb and landing ([`perf`]), category limits ([`limits`]),
//! runway in use, state ([`state`]), headroom and advice ([`leg`]).

pub mod day;
pub mod headroom;
pub mod leg;
pub mod limits;
pub mod lookahead;
pub mod mass;
pub mod model;
pub mod pairing;
pub mod perf;
pub mod state;
pub mod wind;

pub use day::{Assessment, Change};
pub use leg::{Context, LegResult, assess_leg};
pub use model::{DaySettings, Model};
pub use state::State;
