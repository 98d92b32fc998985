//! The core's error type: every message names the value or key at fault and
//! the rule it broke, so the CLI and the GUI can show it as it is.

/// What went wrong, in one sentence.
#[derive(Clone, Debug, PartialEq, thiserror::Error)]
#[non_exhaustive]
pub enum Error {
    /// A family id that is not one of ours.
    #[error("unknown family '{given}'; the families are {known}")]
    UnknownFamily {
        /// What was given.
        given: String,
        /// The ids we know, comma-separated.
        known: String,
    },
    /// A key that the family does not take (often a misspelling).
    #[error("{context}: unknown key '{key}'; expected {expected}")]
    UnknownKey {
        /// Where the key was given, e.g. "--prior for beta-binomial".
        context: String,
        /// The key.
        key: String,
        /// The keys that are accepted.
        expected: String,
    },
    /// The same key twice.
    #[error("{context}: key '{key}' is given more than once")]
    DuplicateKey {
        /// Where.
        context: String,
        /// The key.
        key: String,
    },
    /// A required key is absent.
    #[error("{context}: key '{key}' is missing; expected {expected}")]
    MissingKey {
        /// Where.
        context: String,
        /// The key.
        key: String,
        /// What a complete list looks like.
        expected: String,
    },
    /// An item that is not `key=value`.
    #[error("{context}: '{item}' is not of the form key=value")]
    Malformed {
        /// Where.
        context: String,
        /// The item.
        item: String,
    },
    /// Text that does not parse as a number.
    #[error("{context}: {key} = '{text}' is not a number")]
    NotANumber {
        /// Where.
        context: String,
        /// The key or option.
        key: String,
        /// The text.
        text: String,
    },
    /// A value that breaks a rule.
    #[error("{name} = {value} is not allowed: {rule}")]
    Invalid {
        /// The quantity, e.g. "alpha".
        name: String,
        /// The value as given.
        value: String,
        /// The rule, e.g. "it must be a positive finite number".
        rule: String,
    },
    /// A rule that ties several values together (successes ≤ trials, …).
    #[error("{0}")]
    Rule(String),
}

/// Result with the core's error.
pub type Result<T> = std::result::Result<T, Error>;

impl Error {
    /// A value that breaks a rule.
    pub fn invalid(name: &str, value: f64, rule: &str) -> Self {
        Self::Invalid {
            name: name.to_owned(),
            value: format_value(value),
            rule: rule.to_owned(),
        }
    }
}

/// Values in messages: shortest round-trip form, with NaN and ∞ spelled out.
pub fn format_value(v: f64) -> String {
    if v.is_nan() {
        "NaN".to_owned()
    } else if v.is_infinite() {
        if v > 0.0 {
            "inf".to_owned()
        } else {
            "-inf".to_owned()
        }
    } else {
        format!("{v}")
    }
}

/// `v` if it is a positive finite number.
pub fn positive(name: &str, v: f64) -> Result<f64> {
    if v.is_finite() && v > 0.0 {
        Ok(v)
    } else {
        Err(Error::invalid(
            name,
            v,
            "it must be a positive finite number",
        ))
    }
}

/// `v` if it is finite.
pub fn finite(name: &str, v: f64) -> Result<f64> {
    if v.is_finite() {
        Ok(v)
    } else {
        Err(Error::invalid(name, v, "it must be a finite number"))
    }
}

/// `v` if it is a whole number ≥ 0 (a count).
pub fn count(name: &str, v: f64) -> Result<f64> {
    if v.is_finite() && v >= 0.0 && v.fract() == 0.0 && v < 9.007_199_254_740_992e15 {
        Ok(v)
    } else {
        Err(Error::invalid(
            name,
            v,
            "it must be a whole number, 0 or more",
        ))
    }
}

/// `v` if it is ≥ 0 and finite.
pub fn non_negative(name: &str, v: f64) -> Result<f64> {
    if v.is_finite() && v >= 0.0 {
        Ok(v)
    } else {
        Err(Error::invalid(
            name,
            v,
            "it must be a finite number, 0 or more",
        ))
    }
}

/// `p` if it lies strictly between 0 and 1.
pub fn probability(name: &str, p: f64) -> Result<f64> {
    if p > 0.0 && p < 1.0 {
        Ok(p)
    } else {
        Err(Error::invalid(
            name,
            p,
            "it must lie strictly between 0 and 1",
        ))
    }
}
