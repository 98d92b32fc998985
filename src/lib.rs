//! Priorwright: eliciting conjugate prior distributions.
//!
//! The core (`family`, `distribution`, `numeric`, `analysis`) knows nothing of
//! the GUI and builds with `--no-default-features`.

pub mod distribution;
pub mod numeric;
