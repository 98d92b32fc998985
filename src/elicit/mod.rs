//! Turning judgments into priors: fits to stated probabilities, other
//! elicitation methods, pools of several experts and robust mixtures.

pub mod belief;
pub mod dials;
pub mod fit;
mod lsq;
pub mod methods;
pub mod mixture;

pub use belief::Belief;
pub use mixture::{CountMixture, Mixture, PoolMethod};
