//! Quantiles and tails against the mpmath reference (40 digits) written by
//! tests/reference/generate_distributions.py: 1e-10 relative, or 1e-300
//! absolute where the reference is that small.

use priorwright::distribution::Continuous;
use serde_json::Value;

fn load() -> Value {
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/reference/fixtures/distributions.json"
    ))
    .expect("fixture file present");
    serde_json::from_str(&text).expect("fixture is JSON")
}

fn dist(case: &Value) -> Continuous {
    let p = &case["parameters"];
    let g = |k: &str| p[k].as_f64().expect("parameter");
    match case["distribution"].as_str().expect("name") {
        "beta" => Continuous::Beta {
            a: g("a"),
            b: g("b"),
        },
        "gamma" => Continuous::Gamma {
            shape: g("shape"),
            rate: g("rate"),
        },
        "inverse-gamma" => Continuous::InvGamma {
            shape: g("shape"),
            scale: g("scale"),
        },
        "square-root-inverse-gamma" => Continuous::SqrtInvGamma {
            shape: g("shape"),
            scale: g("scale"),
        },
        "student-t" => Continuous::StudentT {
            df: g("df"),
            loc: g("loc"),
            scale: g("scale"),
        },
        "normal" => Continuous::Normal {
            mean: g("mean"),
            sd: g("sd"),
        },
        "lomax" => Continuous::Lomax {
            shape: g("shape"),
            scale: g("scale"),
        },
        other => panic!("unknown distribution {other}"),
    }
}

fn close(got: f64, want: Option<f64>) -> bool {
    match want {
        None => got.is_infinite(),
        Some(w) => {
            if w.abs() < 1e-300 {
                (got - w).abs() <= 1e-300
            } else {
                ((got - w) / w).abs() <= 1e-10
            }
        }
    }
}

#[test]
fn quantiles_and_tails_match_mpmath() {
    let data = load();
    let mut failures = Vec::new();
    let mut checked = 0;
    for case in data["cases"].as_array().expect("cases") {
        let d = dist(case);
        for q in case["quantiles"].as_array().expect("quantiles") {
            let p = q["p"].as_f64().expect("p");
            let got = d.quantile(p);
            checked += 1;
            if !close(got, q["value"].as_f64()) {
                failures.push(format!(
                    "{d:?} quantile({p}) = {got:e}, reference {}",
                    q["value"]
                ));
            }
        }
        for c in case["cdf"].as_array().expect("cdf") {
            let x = c["x"].as_f64().expect("x");
            let (lo, up) = d.tails(x);
            checked += 2;
            if !close(lo, c["cdf"].as_f64()) {
                failures.push(format!("{d:?} cdf({x:e}) = {lo:e}, reference {}", c["cdf"]));
            }
            if !close(up, c["sf"].as_f64()) {
                failures.push(format!("{d:?} sf({x:e}) = {up:e}, reference {}", c["sf"]));
            }
        }
    }
    assert!(checked > 500, "only {checked} values checked");
    assert!(
        failures.is_empty(),
        "{} of {checked} off:\n{}",
        failures.len(),
        failures.join("\n")
    );
}
