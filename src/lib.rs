//! Priorwright: eliciting conjugate prior distributions.
//!
//! The core (`family`, `distribution`, `numeric`, `analysis`, `error`) knows
//! nothing of the GUI and builds with `--no-default-features`.

pub mod analysis;
pub mod cli;
pub mod data;
pub mod distribution;
pub mod elicit;
pub mod error;
pub mod export;
pub mod family;
#[cfg(feature = "gui")]
pub mod gui;
pub mod numeric;
pub mod project;
