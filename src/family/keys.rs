//! `key=value,key=value` lists, as the command line states priors, data and
//! future sample sizes. Parsing is strict: unknown, repeated and missing keys
//! are errors that name the key and list what is expected.

use crate::error::{self, Error, Result};

/// A parsed key list, checked against the keys its context accepts.
#[derive(Clone, Debug)]
pub struct Keys {
    context: String,
    expected: &'static [&'static str],
    items: Vec<(String, String)>,
}

impl Keys {
    /// Parses `text` (e.g. `alpha=2,beta=8`) for `context` (e.g. "--prior for
    /// beta-binomial"), accepting only the `expected` keys.
    pub fn parse(text: &str, context: &str, expected: &'static [&'static str]) -> Result<Self> {
        let mut items: Vec<(String, String)> = Vec::new();
        for item in text.split(',').map(str::trim).filter(|s| !s.is_empty()) {
            let Some((k, v)) = item.split_once('=') else {
                return Err(Error::Malformed {
                    context: context.to_owned(),
                    item: item.to_owned(),
                });
            };
            let (k, v) = (k.trim(), v.trim());
            if !expected.contains(&k) {
                return Err(Error::UnknownKey {
                    context: context.to_owned(),
                    key: k.to_owned(),
                    expected: expected.join(", "),
                });
            }
            if items.iter().any(|(seen, _)| seen == k) {
                return Err(Error::DuplicateKey {
                    context: context.to_owned(),
                    key: k.to_owned(),
                });
            }
            items.push((k.to_owned(), v.to_owned()));
        }
        Ok(Self {
            context: context.to_owned(),
            expected,
            items,
        })
    }

    /// Whether `key` was given.
    pub fn has(&self, key: &str) -> bool {
        self.items.iter().any(|(k, _)| k == key)
    }

    /// The raw text of `key`.
    pub fn text(&self, key: &str) -> Option<&str> {
        self.items
            .iter()
            .find(|(k, _)| k == key)
            .map(|(_, v)| v.as_str())
    }

    /// Error for a missing key, listing `needed` as the complete form.
    pub fn missing(&self, key: &str, needed: &str) -> Error {
        Error::MissingKey {
            context: self.context.clone(),
            key: key.to_owned(),
            expected: needed.to_owned(),
        }
    }

    fn parse_number(&self, key: &str, text: &str) -> Result<f64> {
        let v: f64 = text.parse().map_err(|_| Error::NotANumber {
            context: self.context.clone(),
            key: key.to_owned(),
            text: text.to_owned(),
        })?;
        if v.is_finite() {
            Ok(v)
        } else {
            Err(Error::invalid(key, v, "it must be a finite number"))
        }
    }

    /// The number under `key`, if given (NaN and ±∞ are refused).
    pub fn number(&self, key: &str) -> Result<Option<f64>> {
        self.text(key)
            .map(|t| self.parse_number(key, t))
            .transpose()
    }

    /// The number under `key`; `needed` names the full key set for the message.
    pub fn required(&self, key: &str, needed: &str) -> Result<f64> {
        self.number(key)?.ok_or_else(|| self.missing(key, needed))
    }

    /// A `;`-separated list of numbers under `key`.
    pub fn numbers(&self, key: &str, needed: &str) -> Result<Vec<f64>> {
        let text = self.text(key).ok_or_else(|| self.missing(key, needed))?;
        text.split(';')
            .map(|t| self.parse_number(key, t.trim()))
            .collect()
    }

    /// A `;`-separated list of names under `key`, if given.
    pub fn names(&self, key: &str) -> Option<Vec<String>> {
        self.text(key)
            .map(|t| t.split(';').map(|s| s.trim().to_owned()).collect())
    }

    /// The keys this list accepts.
    pub fn expected(&self) -> &'static [&'static str] {
        self.expected
    }

    /// Where these keys were given.
    pub fn context(&self) -> &str {
        &self.context
    }
}

/// The number under `key`, required to be positive and finite.
pub fn positive(keys: &Keys, key: &str, needed: &str) -> Result<f64> {
    error::positive(key, keys.required(key, needed)?)
}

#[cfg(test)]
mod tests {
    use super::*;

    const AB: &[&str] = &["alpha", "beta"];

    #[test]
    fn parses_and_reports_each_fault() {
        let k = Keys::parse("alpha=2, beta=8", "--prior", AB).unwrap();
        assert_eq!(k.number("beta").unwrap(), Some(8.0));
        let e = Keys::parse("alpah=2,beta=8", "--prior for beta-binomial", AB).unwrap_err();
        assert_eq!(
            e.to_string(),
            "--prior for beta-binomial: unknown key 'alpah'; expected alpha, beta"
        );
        let e = Keys::parse("alpha=2,alpha=3", "--prior", AB).unwrap_err();
        assert_eq!(
            e.to_string(),
            "--prior: key 'alpha' is given more than once"
        );
        let k = Keys::parse("alpha=x", "--prior", AB).unwrap();
        assert_eq!(
            k.number("alpha").unwrap_err().to_string(),
            "--prior: alpha = 'x' is not a number"
        );
        let k = Keys::parse("alpha=NaN", "--prior", AB).unwrap();
        assert!(
            k.number("alpha")
                .unwrap_err()
                .to_string()
                .contains("alpha = NaN is not allowed")
        );
        let e = Keys::parse("alpha", "--prior", AB).unwrap_err();
        assert_eq!(
            e.to_string(),
            "--prior: 'alpha' is not of the form key=value"
        );
    }
}
