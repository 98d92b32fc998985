//! The command line as scripts use it: JSON shape, options, and one clear
//! message with exit code 2 for each kind of bad input.

use serde_json::Value;
use std::process::Command;

fn run(args: &[&str]) -> (i32, String, String) {
    let out = Command::new(env!("CARGO_BIN_EXE_priorwright"))
        .args(args)
        .output()
        .expect("binary runs");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn json(args: &[&str]) -> Value {
    let (code, out, err) = run(args);
    assert_eq!(code, 0, "{args:?} failed: {err}");
    serde_json::from_str(&out).expect("valid JSON")
}

/// Runs, expects exit code 2 and exactly one stderr line containing `needle`.
fn fails_with(args: &[&str], needle: &str) {
    let (code, out, err) = run(args);
    assert_eq!(code, 2, "{args:?}: exit {code}, stderr {err}");
    assert!(out.is_empty(), "{args:?} printed to stdout: {out}");
    let lines: Vec<&str> = err.lines().collect();
    assert_eq!(lines.len(), 1, "{args:?}: not one line: {err}");
    assert!(
        lines[0].contains(needle),
        "{args:?}: {:?} lacks {needle:?}",
        lines[0]
    );
    assert!(!err.contains("panicked"), "{err}");
}

#[test]
fn describe_prints_the_contract() {
    let v = json(&[
        "describe",
        "--family",
        "beta-binomial",
        "--prior",
        "alpha=2,beta=8",
        "--json",
    ]);
    assert_eq!(v["family"], "beta-binomial");
    assert_eq!(v["hyperparameters"]["alpha"], 2.0);
    assert_eq!(v["hyperparameters"]["beta"], 8.0);
    assert_eq!(v["pseudo_observations"]["mean"], 0.2);
    assert_eq!(v["pseudo_observations"]["ess"], 10.0);
    let p = &v["parameters"][0];
    assert_eq!(p["name"], "theta");
    for key in [
        "mean",
        "sd",
        "mode",
        "median",
        "quantiles",
        "central_interval",
        "hpd_interval",
        "cdf",
    ] {
        assert!(p.get(key).is_some(), "missing {key}");
    }
    assert_eq!(p["mode"], 0.125);
    assert_eq!(p["central_interval"]["level"], 0.95);
    let qs = p["quantiles"].as_array().unwrap();
    assert_eq!(qs.len(), 5);
    assert_eq!(qs[0]["p"], 0.025);
    assert!(v.get("components").is_none() && v.get("log_marginal_likelihood").is_none());
}

#[test]
fn options_echo_probabilities_and_points_unrounded() {
    let v = json(&[
        "describe",
        "--family",
        "gamma-exponential",
        "--prior",
        "alpha=3,beta=1500",
        "--prob",
        "0.1,0.123456789",
        "--level=0.9",
        "--cdf",
        "0.001",
        "--cdf",
        "mean_time:600",
        "--json",
    ]);
    let lambda = &v["parameters"][0];
    assert_eq!(lambda["quantiles"][1]["p"], 0.123456789);
    assert_eq!(lambda["hpd_interval"]["level"], 0.9);
    assert_eq!(lambda["cdf"][0]["x"], 0.001);
    let mt = &v["parameters"][1];
    assert_eq!(mt["name"], "mean_time");
    assert_eq!(mt["cdf"][0]["x"], 600.0);
    let (c, s) = (
        mt["cdf"][0]["cdf"].as_f64().unwrap(),
        mt["cdf"][0]["sf"].as_f64().unwrap(),
    );
    assert!((c + s - 1.0).abs() < 1e-15);
    // Negative points with '=' (DESIGN §7).
    let v = json(&[
        "describe",
        "--family",
        "normal-known-variance",
        "--prior",
        "mu0=0,kappa0=1,sigma=100",
        "--cdf=-100",
        "--json",
    ]);
    assert_eq!(v["parameters"][0]["cdf"][0]["x"], -100.0);
}

#[test]
fn missing_moments_and_unbounded_modes_are_null() {
    // Gamma-exponential with alpha ≤ 1: no mean of 1/λ; a Gamma with shape < 1
    // is unbounded at 0, so no mode.
    let v = json(&[
        "describe",
        "--family",
        "gamma-exponential",
        "--prior",
        "alpha=0.5,beta=2",
        "--json",
    ]);
    assert!(v["parameters"][0]["mode"].is_null());
    assert!(v["parameters"][1]["mean"].is_null());
    assert!(v["parameters"][1]["sd"].is_null());
    // A U-shaped Beta: its highest-density set has two pieces.
    let v = json(&[
        "describe",
        "--family",
        "beta-binomial",
        "--prior",
        "alpha=0.5,beta=0.5",
        "--json",
    ]);
    let hpd = &v["parameters"][0]["hpd_interval"];
    assert_eq!(hpd["pieces"].as_array().unwrap().len(), 2);
    assert!(v["parameters"][0]["mode"].is_null());
}

#[test]
fn update_reports_posterior_marginal_likelihood_and_conflict() {
    let v = json(&[
        "update",
        "--family",
        "beta-binomial",
        "--prior",
        "alpha=2,beta=8",
        "--data",
        "successes=3,trials=20",
        "--json",
    ]);
    assert_eq!(v["hyperparameters"]["alpha"], 5.0);
    assert_eq!(v["hyperparameters"]["beta"], 25.0);
    assert!(v["log_marginal_likelihood"].as_f64().unwrap() < 0.0);
    let c = &v["conflict"];
    assert_eq!(c["mid_p"], true);
    let (lo, up, p) = (
        c["lower_tail"].as_f64().unwrap(),
        c["upper_tail"].as_f64().unwrap(),
        c["p_value"].as_f64().unwrap(),
    );
    assert!((p - (2.0 * lo.min(up)).min(1.0)).abs() < 1e-15);
    assert!((v["prior_share"].as_f64().unwrap() - 10.0 / 30.0).abs() < 1e-15);
}

#[test]
fn predict_reports_the_predictive() {
    let v = json(&[
        "predict",
        "--family",
        "beta-binomial",
        "--prior",
        "alpha=2,beta=8",
        "--future",
        "trials=20",
        "--at",
        "0,4",
        "--json",
    ]);
    let p = &v["predictive"];
    assert_eq!(p["distribution"], "beta-binomial");
    assert!((p["mean"].as_f64().unwrap() - 4.0).abs() < 1e-12);
    assert_eq!(p["at"][1]["x"], 4.0);
    let v = json(&[
        "predict",
        "--family",
        "dirichlet-multinomial",
        "--prior",
        "alpha=1;2;3",
        "--future",
        "n=12",
        "--json",
    ]);
    let cats = v["predictive"]["categories"].as_array().unwrap();
    assert_eq!(cats.len(), 3);
    assert!((cats[2]["mean"].as_f64().unwrap() - 6.0).abs() < 1e-12);
    let v = json(&[
        "predict",
        "--family",
        "gamma-exponential",
        "--prior",
        "alpha=1.5,beta=10",
        "--future",
        "n=1",
        "--json",
    ]);
    assert_eq!(v["predictive"]["distribution"], "lomax");
    assert!(v["predictive"]["sd"].is_null(), "Lomax sd needs shape > 2");
    // Posterior predictive with --data.
    let v = json(&[
        "predict",
        "--family",
        "gamma-poisson",
        "--prior",
        "alpha=3,beta=5",
        "--data",
        "events=3,exposure=2",
        "--future",
        "exposure=1",
        "--json",
    ]);
    assert_eq!(v["hyperparameters"]["alpha"], 6.0);
    assert_eq!(v["predictive_of"], "posterior");
}

#[test]
fn pseudo_observation_keys_give_the_same_prior() {
    let a = json(&[
        "describe",
        "--family",
        "beta-binomial",
        "--prior",
        "mean=0.25,ess=12",
        "--json",
    ]);
    assert_eq!(a["hyperparameters"]["alpha"], 3.0);
    assert_eq!(a["hyperparameters"]["beta"], 9.0);
}

#[test]
fn tables_are_readable() {
    let (code, out, _) = run(&[
        "describe",
        "--family",
        "beta-binomial",
        "--prior",
        "alpha=2,beta=8",
    ]);
    assert_eq!(code, 0);
    assert!(out.contains("as if you had already seen 2 successes in 10 trials"));
    assert!(out.contains("95% highest density"));
    assert!(out.contains("Caution"));
}

#[test]
fn help_explains_every_family() {
    for sub in ["describe", "update", "predict"] {
        let (code, out, _) = run(&[sub, "--help"]);
        assert_eq!(code, 0);
        for fam in priorwright::family::FAMILY_IDS {
            assert!(out.contains(fam), "{sub} --help lacks {fam}");
        }
        assert!(out.contains("successes=S,trials=N"));
    }
    let (code, out, _) = run(&[]);
    assert_eq!(code, 0);
    assert!(out.contains("describe"));
}

#[test]
fn bad_input_gets_one_clear_message() {
    let bb = ["describe", "--family", "beta-binomial", "--prior"];
    let with =
        |prior: &'static str| -> Vec<&'static str> { bb.iter().copied().chain([prior]).collect() };
    fails_with(
        &["describe", "--family", "beta", "--prior", "alpha=1,beta=2"],
        "unknown family 'beta'; the families are beta-binomial",
    );
    fails_with(
        &with("alpha=2"),
        "--prior for beta-binomial: key 'beta' is missing",
    );
    fails_with(
        &with("alpha=2,alpha=3,beta=1"),
        "key 'alpha' is given more than once",
    );
    fails_with(
        &with("alpah=2,beta=8"),
        "unknown key 'alpah'; expected alpha, beta",
    );
    fails_with(
        &with("alpha=0,beta=8"),
        "alpha = 0 is not allowed: it must be a positive finite number",
    );
    fails_with(&with("alpha=-2,beta=8"), "alpha = -2 is not allowed");
    fails_with(&with("alpha=NaN,beta=8"), "alpha = NaN is not allowed");
    fails_with(&with("alpha=inf,beta=8"), "alpha = inf is not allowed");
    fails_with(&with("alpha=two,beta=8"), "alpha = 'two' is not a number");
    let upd = |data: &'static str| -> Vec<&'static str> {
        vec![
            "update",
            "--family",
            "beta-binomial",
            "--prior",
            "alpha=2,beta=8",
            "--data",
            data,
        ]
    };
    fails_with(
        &upd("successes=12,trials=10"),
        "successes = 12 is more than trials = 10",
    );
    fails_with(
        &upd("successes=2.5,trials=10"),
        "successes = 2.5 is not allowed: it must be a whole number",
    );
    fails_with(
        &[
            "update",
            "--family",
            "gamma-poisson",
            "--prior",
            "alpha=2,beta=8",
            "--data",
            "events=1.5,exposure=2",
        ],
        "events = 1.5 is not allowed: it must be a whole number",
    );
    let mut p = with("alpha=2,beta=8");
    p.extend(["--prob", "0,0.5"]);
    fails_with(
        &p,
        "--prob = 0 is not allowed: it must lie strictly between 0 and 1",
    );
    let mut p = with("alpha=2,beta=8");
    p.extend(["--prob", "1.5"]);
    fails_with(&p, "--prob = 1.5 is not allowed");
    let mut p = with("alpha=2,beta=8");
    p.extend(["--level", "1"]);
    fails_with(
        &p,
        "--level = 1 is not allowed: it must lie strictly between 0 and 1",
    );
    let mut p = with("alpha=2,beta=8");
    p.extend(["--level=-0.2"]);
    fails_with(&p, "--level = -0.2 is not allowed");
    fails_with(&["describe", "--family", "beta-binomial"], "--prior");
    fails_with(&["describe", "--bogus"], "unexpected argument '--bogus'");
    fails_with(
        &[
            "predict",
            "--family",
            "inverse-gamma-variance",
            "--prior",
            "alpha=2,beta=3",
            "--future",
            "n=1",
        ],
        "needs the known mean: add mu=",
    );
    fails_with(
        &[
            "predict",
            "--family",
            "beta-binomial",
            "--prior",
            "alpha=2,beta=3",
            "--future",
            "trials=5",
            "--at",
            "1.5",
        ],
        "--at = 1.5 is not allowed: the predictive is a count",
    );
    fails_with(
        &[
            "update",
            "--family",
            "dirichlet-multinomial",
            "--prior",
            "alpha=1;1;1",
            "--data",
            "counts=1;2",
        ],
        "the data have 2 counts but the prior has 3 categories",
    );
    fails_with(
        &[
            "describe",
            "--family",
            "gamma-exponential",
            "--prior",
            "alpha=1,beta=2",
            "--cdf",
            "mtbf:3",
        ],
        "--cdf names 'mtbf', which is not a parameter here; the parameters are lambda, mean_time",
    );
}

#[test]
fn extreme_hyperparameters_never_print_nan() {
    for prior in [
        "alpha=1e-3,beta=1e7",
        "alpha=1e7,beta=1e7",
        "alpha=1e-3,beta=1e-3",
    ] {
        for fam in [
            "beta-binomial",
            "gamma-poisson",
            "gamma-exponential",
            "inverse-gamma-variance",
        ] {
            let (code, out, err) = run(&[
                "describe",
                "--family",
                fam,
                "--prior",
                prior,
                "--prob",
                "1e-10,0.5,0.9999999999",
                "--json",
            ]);
            assert_eq!(code, 0, "{fam} {prior}: {err}");
            assert!(
                !out.contains("NaN") && !out.contains("Infinity"),
                "{fam} {prior}: {out}"
            );
            serde_json::from_str::<Value>(&out).expect("JSON");
        }
    }
}
