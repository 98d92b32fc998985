//! `priorwright fit`: parse the method's options, fit through the core, print.

use super::args::FitArgs;
use super::{numbers, parse_number};
use crate::elicit::fit::{self, Fixed, Judgment, Scale};
use crate::elicit::methods;
use crate::error::{Error, Result};
use crate::family::Prior;
use crate::family::keys::Keys;
use serde_json::{Value, json};

/// The `fit` object and the prior, whatever the method.
pub struct Outcome {
    /// The fitted prior.
    pub prior: Prior,
    /// The contract's `fit` object.
    pub fit: Value,
}

fn num(x: f64) -> Value {
    if x.is_finite() { json!(x) } else { Value::Null }
}

fn fixed(a: &FitArgs) -> Result<Fixed> {
    let mut f = Fixed::default();
    if let Some(text) = &a.fixed {
        let k = Keys::parse(text, "--fixed", &["sigma", "mu"])?;
        f.sigma = k
            .number("sigma")?
            .map(|s| crate::error::positive("sigma", s))
            .transpose()?;
        f.mu = k.number("mu")?;
    }
    if let Some(text) = &a.shares {
        f.shares = Some(
            text.split(';')
                .map(|t| parse_number("--shares", t.trim()))
                .collect::<Result<Vec<_>>>()?,
        );
    }
    f.names = a
        .names
        .as_ref()
        .map(|t| t.split(';').map(|s| s.trim().to_owned()).collect());
    Ok(f)
}

/// One `[NAME:]P:VALUE`.
fn judgment(i: usize, text: &str) -> Result<Judgment> {
    let parts: Vec<&str> = text.split(':').map(str::trim).collect();
    let what = format!("--quantile {}", i + 1);
    let (parameter, p, v) = match parts.as_slice() {
        [p, v] => (None, *p, *v),
        [n, p, v] => (Some((*n).to_owned()), *p, *v),
        _ => {
            return Err(Error::Rule(format!(
                "{what}: '{text}' is not of the form [NAME:]P:VALUE"
            )));
        }
    };
    Ok(Judgment {
        parameter,
        p: parse_number(&format!("{what} probability"), p)?,
        value: parse_number(&format!("{what} value"), v)?,
    })
}

/// A prior of `family` used only to read future keys.
fn probe(family: &str) -> Result<Prior> {
    let text = match family {
        "normal-known-variance" => "mu0=0,kappa0=1,sigma=1",
        "normal-inverse-gamma" => "mu0=0,kappa0=1,alpha0=1,beta0=1",
        "dirichlet-multinomial" => "alpha=1;1",
        "inverse-gamma-variance" => "alpha=1,beta=1,mu=0",
        _ => "alpha=1,beta=1",
    };
    Prior::parse(family, text)
}

fn fit_object(f: &fit::Fit) -> Value {
    json!({
        "method": f.method.name(),
        "objective": num(f.objective),
        "max_abs_probability_error": num(f.max_abs_error),
        "judgments": f.judgments.iter().map(|j| json!({
            "parameter": j.target, "p": j.p, "value": j.value, "fitted_p": num(j.fitted_p),
        })).collect::<Vec<_>>(),
    })
}

/// Runs the one method the options ask for.
pub fn run(a: &FitArgs) -> Result<Outcome> {
    let fixed = fixed(a)?;
    let methods = [
        !a.quantiles.is_empty(),
        a.mode.is_some() || a.interval.is_some(),
        a.bins.is_some() || a.chips.is_some(),
        a.mean.is_some() || a.imagined.is_some(),
    ];
    match methods.iter().filter(|m| **m).count() {
        0 => {
            return Err(Error::Rule(
                "fit needs judgments: --quantile, --mode with --interval, --bins with --chips, or --mean with --imagined"
                    .to_owned(),
            ));
        }
        1 => {}
        _ => return Err(Error::Rule("give one fitting method per call".to_owned())),
    }
    if a.observable.is_some() && a.quantiles.is_empty() {
        return Err(Error::Rule(
            "--observable goes with --quantile judgments".to_owned(),
        ));
    }
    if methods[0] {
        let judgments = a
            .quantiles
            .iter()
            .enumerate()
            .map(|(i, t)| judgment(i, t))
            .collect::<Result<Vec<_>>>()?;
        let scale = match &a.observable {
            Some(t) => Scale::Observable(probe(&a.family)?.parse_future(t)?),
            None => Scale::Unknowns,
        };
        let f = fit::fit(&a.family, &fixed, scale, &judgments)?;
        return Ok(Outcome {
            fit: fit_object(&f),
            prior: f.prior,
        });
    }
    if methods[1] {
        let (Some(mode), Some(interval)) = (&a.mode, &a.interval) else {
            return Err(Error::Rule("--mode and --interval go together".to_owned()));
        };
        let mode = parse_number("--mode", mode)?;
        let parts: Vec<&str> = interval.split(':').map(str::trim).collect();
        let [lo, hi, p] = parts.as_slice() else {
            return Err(Error::Rule(format!(
                "--interval '{interval}' is not of the form LO:HI:PROB"
            )));
        };
        let (lo, hi, p) = (
            parse_number("--interval", lo)?,
            parse_number("--interval", hi)?,
            parse_number("--interval", p)?,
        );
        let m =
            methods::mode_interval(&a.family, a.parameter.as_deref(), &fixed, mode, (lo, hi), p)?;
        let err = (m.fitted - m.stated).abs();
        let fit = json!({
            "method": "mode-interval",
            "objective": num(err * err),
            "max_abs_probability_error": num(err),
            "judgments": [],
            "parameter": m.parameter,
            "mode": num(m.mode),
            "interval": { "lower": num(lo), "upper": num(hi), "p": p, "fitted_p": num(m.fitted) },
        });
        return Ok(Outcome {
            prior: m.prior,
            fit,
        });
    }
    if methods[2] {
        let (Some(bins), Some(chips)) = (&a.bins, &a.chips) else {
            return Err(Error::Rule("--bins and --chips go together".to_owned()));
        };
        let edges = numbers("--bins", std::slice::from_ref(bins))?;
        let counts = numbers("--chips", std::slice::from_ref(chips))?;
        let f = methods::chips(&a.family, a.parameter.as_deref(), &fixed, &edges, &counts)?;
        let mut fit = fit_object(&f);
        fit["chips"] = json!({ "bins": edges, "chips": counts });
        return Ok(Outcome {
            fit,
            prior: f.prior,
        });
    }
    let (Some(mean), Some(imagined)) = (&a.mean, &a.imagined) else {
        return Err(Error::Rule("--mean and --imagined go together".to_owned()));
    };
    let mean = parse_number("--mean", mean)?;
    let keys = Keys::parse(
        imagined,
        &format!("--imagined for {}", a.family),
        methods::imagined_keys(&a.family),
    )?;
    let prior = methods::imagined(&a.family, &fixed, mean, &keys)?;
    let fit = json!({ "method": "imagined-data", "objective": 0.0, "max_abs_probability_error": 0.0, "judgments": [] });
    Ok(Outcome { prior, fit })
}
