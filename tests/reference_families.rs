//! Families end to end against tests/reference/fixtures/families.json (mpmath,
//! 40 digits; marginal likelihoods by quadrature of their defining integrals):
//! predictive quantiles and cdfs, log marginal likelihoods, highest-density
//! intervals and conflict tails. Inputs go through the same key parsing as the
//! command line.

use priorwright::analysis::summary::summarize_predictive;
use priorwright::family::Prior;
use serde_json::Value;

fn cases() -> Vec<Value> {
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/reference/fixtures/families.json"
    ))
    .expect("fixture present");
    let v: Value = serde_json::from_str(&text).expect("JSON");
    v["cases"].as_array().expect("cases").clone()
}

fn rel(got: f64, want: f64) -> f64 {
    if want == 0.0 {
        got.abs()
    } else {
        ((got - want) / want).abs()
    }
}

fn prior_of(c: &Value) -> Prior {
    Prior::parse(c["family"].as_str().unwrap(), c["prior"].as_str().unwrap()).unwrap()
}

#[test]
fn every_family_matches_the_reference() {
    let mut failures = Vec::new();
    let mut kinds = std::collections::BTreeSet::new();
    for c in cases() {
        let kind = c["kind"].as_str().unwrap().to_owned();
        kinds.insert(kind.clone());
        let prior = prior_of(&c);
        let label = format!("{} {} {}", kind, c["family"], c["prior"]);
        let mut check = |what: &str, got: f64, want: f64, tol: f64| {
            if rel(got, want) > tol {
                failures.push(format!("{label} {what}: got {got:e}, reference {want:e}"));
            }
        };
        match kind.as_str() {
            "predictive" => {
                let used = match c["data"].as_str() {
                    Some(d) => prior.update(&prior.parse_data(d).unwrap()).unwrap(),
                    None => prior.clone(),
                };
                let future = used.parse_future(c["future"].as_str().unwrap()).unwrap();
                let pred = used.predictive(&future).unwrap();
                let probs: Vec<f64> = c["quantiles"]
                    .as_array()
                    .unwrap()
                    .iter()
                    .map(|q| q["p"].as_f64().unwrap())
                    .collect();
                let at: Vec<f64> = c["at"]
                    .as_array()
                    .unwrap()
                    .iter()
                    .map(|a| a["x"].as_f64().unwrap())
                    .collect();
                let s = &summarize_predictive(&pred, &probs, &at).unwrap()[0];
                for (q, (_, got)) in c["quantiles"].as_array().unwrap().iter().zip(&s.quantiles) {
                    check("quantile", *got, q["value"].as_f64().unwrap(), 1e-10);
                }
                for (a, got) in c["at"].as_array().unwrap().iter().zip(&s.at) {
                    check(
                        "density",
                        got.density,
                        a["density"].as_f64().unwrap(),
                        1e-10,
                    );
                    check("cdf", got.cdf, a["cdf"].as_f64().unwrap(), 1e-10);
                }
            }
            "ln_ml" => {
                let data = prior.parse_data(c["data"].as_str().unwrap()).unwrap();
                let got = prior.ln_marginal_likelihood(&data).unwrap();
                check(
                    "ln marginal likelihood",
                    got,
                    c["value"].as_f64().unwrap(),
                    1e-11,
                );
            }
            "hpd" => {
                let name = c["parameter"].as_str().unwrap();
                let m = prior
                    .marginals()
                    .into_iter()
                    .find(|m| m.name == name)
                    .unwrap();
                let i = m.distribution.hpd_interval(c["level"].as_f64().unwrap());
                check("hpd lower", i.lower, c["lower"].as_f64().unwrap(), 1e-9);
                check("hpd upper", i.upper, c["upper"].as_f64().unwrap(), 1e-9);
            }
            "conflict" => {
                let data = prior.parse_data(c["data"].as_str().unwrap()).unwrap();
                let k = prior.conflict(&data).unwrap().unwrap();
                check(
                    "lower tail",
                    k.lower_tail,
                    c["lower_tail"].as_f64().unwrap(),
                    1e-10,
                );
                check(
                    "upper tail",
                    k.upper_tail,
                    c["upper_tail"].as_f64().unwrap(),
                    1e-10,
                );
            }
            other => panic!("unknown case kind {other}"),
        }
    }
    assert_eq!(kinds.len(), 4, "fixture lacks a kind: {kinds:?}");
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}
