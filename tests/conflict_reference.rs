//! Prior–data conflict tails against scipy.stats
//! (tests/reference/fixtures/checks.json, written by
//! tests/reference/generate_checks.py: betabinom, nbinom, t, norm, f,
//! dirichlet_multinomial walked over every count vector, chi2).

use priorwright::family::Prior;
use serde_json::Value;

#[test]
fn conflict_tails_match_scipy_for_every_family() {
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/reference/fixtures/checks.json"
    ))
    .expect("fixture present");
    let v: Value = serde_json::from_str(&text).expect("JSON");
    let mut failures = Vec::new();
    let mut families = std::collections::BTreeSet::new();
    for c in v["cases"].as_array().expect("cases") {
        let fam = c["family"].as_str().unwrap();
        families.insert(fam.to_owned());
        let prior = Prior::parse(fam, c["prior"].as_str().unwrap()).unwrap();
        let data = prior.parse_data(c["data"].as_str().unwrap()).unwrap();
        let k = prior
            .conflict(&data)
            .unwrap()
            .expect("every family has a conflict check");
        let label = format!("{fam} {} {}", c["prior"], c["data"]);
        for (what, got, want) in [
            ("lower", k.lower_tail, c["lower_tail"].as_f64().unwrap()),
            ("upper", k.upper_tail, c["upper_tail"].as_f64().unwrap()),
        ] {
            if (got - want).abs() > 1e-10 {
                failures.push(format!("{label}: {what} tail {got} against scipy {want}"));
            }
        }
        if k.mid_p != c["mid_p"].as_bool().unwrap() {
            failures.push(format!("{label}: mid_p {}", k.mid_p));
        }
        let p = (2.0 * k.lower_tail.min(k.upper_tail)).min(1.0);
        assert_eq!(k.p_value, p, "{label}: p is two-sided");
    }
    assert_eq!(
        families.len(),
        priorwright::family::FAMILY_IDS.len(),
        "a family has no case"
    );
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}
