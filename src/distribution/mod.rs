//! The univariate distributions the conjugate families hand out: the marginal
//! of each unknown, and the predictive distribution of future data.

pub mod continuous;
pub mod discrete;
mod guess;
pub mod interval;
pub mod law;
pub mod mixture;

pub use continuous::Continuous;
pub use discrete::Discrete;
pub use guess::normal_quantile as guess_normal_quantile;
pub use interval::Interval;
pub use law::Law;
pub use mixture::MixtureLaw;
