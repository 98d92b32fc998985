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
    let (code, out, _) = run(&["--help"]);
    assert_eq!(code, 0);
    assert!(out.contains("describe") && out.contains("open"));
}

#[test]
fn no_subcommand_or_open_asks_for_the_window_and_open_checks_the_file_first() {
    use priorwright::cli::{Invocation, invocation};
    let args = |a: &[&str]| -> Vec<String> { a.iter().map(|s| (*s).to_owned()).collect() };
    assert_eq!(
        invocation(&args(&["priorwright"])),
        Invocation::Window(None)
    );
    assert_eq!(
        invocation(&args(&["priorwright", "open", "p.ron"])),
        Invocation::Window(Some("p.ron".into()))
    );
    assert_eq!(
        invocation(&args(&["priorwright", "check", "p.ron"])),
        Invocation::Command
    );
    // A missing project is refused before any window opens; a build
    // without the window says so.
    let (code, _, err) = run(&["open", "/no/such/project.ron"]);
    assert_eq!(code, 2);
    let expected = if cfg!(feature = "gui") {
        "/no/such/project.ron: no such project file"
    } else {
        "this build has no desktop window"
    };
    assert!(err.contains(expected), "{err}");
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

#[test]
fn fit_prints_the_contract() {
    let v = json(&[
        "fit",
        "--family",
        "beta-binomial",
        "--quantile",
        "0.5:0.3",
        "--quantile",
        "0.9:0.5",
        "--json",
    ]);
    assert_eq!(v["family"], "beta-binomial");
    let f = &v["fit"];
    assert_eq!(f["method"], "exact");
    assert!(f["max_abs_probability_error"].as_f64().unwrap() < 1e-12);
    let js = f["judgments"].as_array().unwrap();
    assert_eq!(js.len(), 2);
    assert_eq!(js[1]["p"], 0.9);
    assert_eq!(js[1]["value"], 0.5);
    // The objective is the plain sum of squared probability errors.
    let sum: f64 = js
        .iter()
        .map(|j| (j["fitted_p"].as_f64().unwrap() - j["p"].as_f64().unwrap()).powi(2))
        .sum();
    let v3 = json(&[
        "fit",
        "--family",
        "beta-binomial",
        "--quantile",
        "0.1:0.1",
        "--quantile",
        "0.5:0.3",
        "--quantile",
        "0.9:0.5",
        "--json",
    ]);
    let js3 = v3["fit"]["judgments"].as_array().unwrap();
    let sum3: f64 = js3
        .iter()
        .map(|j| (j["fitted_p"].as_f64().unwrap() - j["p"].as_f64().unwrap()).powi(2))
        .sum();
    assert!((v3["fit"]["objective"].as_f64().unwrap() - sum3).abs() < 1e-15 && sum < 1e-20);
    // The hyperparameters are usable as --prior.
    let h = &v["hyperparameters"];
    let prior = format!("alpha={},beta={}", h["alpha"], h["beta"]);
    let d = json(&[
        "describe",
        "--family",
        "beta-binomial",
        "--prior",
        &prior,
        "--prob",
        "0.5,0.9",
        "--json",
    ]);
    let q = d["parameters"][0]["quantiles"].as_array().unwrap();
    assert!((q[0]["value"].as_f64().unwrap() - 0.3).abs() < 1e-12);
    // A named parameter and negative values with '='.
    let v = json(&[
        "fit",
        "--family",
        "gamma-exponential",
        "--quantile",
        "mean_time:0.5:600",
        "--quantile",
        "mean_time:0.95:2000",
        "--json",
    ]);
    assert_eq!(v["fit"]["judgments"][0]["parameter"], "mean_time");
    let v = json(&[
        "fit",
        "--family",
        "normal-known-variance",
        "--fixed",
        "sigma=2",
        "--quantile=0.25:-1.5",
        "--quantile=0.75:0.5",
        "--json",
    ]);
    assert!((v["hyperparameters"]["mu0"].as_f64().unwrap() + 0.5).abs() < 1e-9);
}

#[test]
fn fit_methods_each_carry_the_fit_object() {
    for args in [
        vec![
            "fit",
            "--family",
            "beta-binomial",
            "--mode",
            "0.2",
            "--interval",
            "0.1:0.4:0.9",
            "--json",
        ],
        vec![
            "fit",
            "--family",
            "beta-binomial",
            "--bins",
            "0,0.1,0.2,0.4,1",
            "--chips",
            "2,5,3,0",
            "--json",
        ],
        vec![
            "fit",
            "--family",
            "gamma-poisson",
            "--mean",
            "2",
            "--imagined",
            "events=30,exposure=10,estimate=2.5",
            "--json",
        ],
        vec![
            "fit",
            "--family",
            "gamma-poisson",
            "--observable",
            "exposure=500",
            "--quantile",
            "0.5:4",
            "--quantile",
            "0.9:10",
            "--json",
        ],
        vec![
            "fit",
            "--family",
            "dirichlet-multinomial",
            "--shares",
            "0.5;0.3;0.2",
            "--quantile",
            "theta1:0.05:0.3",
            "--quantile",
            "theta1:0.95:0.7",
            "--json",
        ],
    ] {
        let v = json(&args);
        let f = &v["fit"];
        for key in [
            "method",
            "objective",
            "max_abs_probability_error",
            "judgments",
        ] {
            assert!(f.get(key).is_some(), "{args:?} lacks fit.{key}");
        }
        assert!(v.get("hyperparameters").is_some());
    }
}

#[test]
fn mixtures_and_pools_on_the_command_line() {
    let v = json(&[
        "update",
        "--family",
        "beta-binomial",
        "--component",
        "0.6:alpha=2,beta=18",
        "--component",
        "0.4:alpha=6,beta=6",
        "--data",
        "successes=7,trials=20",
        "--json",
    ]);
    assert!(
        v.get("hyperparameters").is_none(),
        "a mixture has no single set of hyperparameters"
    );
    let comps = v["components"].as_array().unwrap();
    assert_eq!(comps.len(), 2);
    let w: f64 = comps.iter().map(|c| c["weight"].as_f64().unwrap()).sum();
    assert!((w - 1.0).abs() < 1e-12);
    assert_eq!(comps[0]["hyperparameters"]["alpha"], 9.0);
    assert_eq!(v["prior"]["components"][0]["weight"], 0.6);
    let v = json(&[
        "describe",
        "--family",
        "beta-binomial",
        "--component",
        "0.5:alpha=2,beta=8",
        "--component",
        "0.5:alpha=8,beta=2",
        "--pool",
        "log",
        "--json",
    ]);
    assert_eq!(v["hyperparameters"]["alpha"], 5.0);
    assert_eq!(v["pool"]["method"], "log");
    let v = json(&[
        "describe",
        "--family",
        "gamma-poisson",
        "--prior",
        "alpha=10,beta=10",
        "--robust",
        "0.2",
        "--json",
    ]);
    assert_eq!(v["components"].as_array().unwrap().len(), 2);
    assert_eq!(v["components"][1]["pseudo_observations"]["ess"], 1.0);
    let v = json(&[
        "predict",
        "--family",
        "beta-binomial",
        "--component",
        "0.5:alpha=2,beta=8",
        "--component",
        "0.5:alpha=8,beta=2",
        "--future",
        "trials=10",
        "--json",
    ]);
    assert!((v["predictive"]["mean"].as_f64().unwrap() - 5.0).abs() < 1e-12);
}

#[test]
fn bad_elicitation_input_gets_one_clear_message() {
    let fit = ["fit", "--family", "beta-binomial"];
    let with = |extra: &[&'static str]| -> Vec<&'static str> {
        fit.iter().copied().chain(extra.iter().copied()).collect()
    };
    fails_with(&with(&[]), "fit needs judgments");
    fails_with(
        &with(&["--quantile", "0.5:0.3", "--quantile", "0.9:0.2"]),
        "judgments 2 and 1 are not increasing",
    );
    fails_with(
        &with(&["--quantile", "0.5:0.3", "--quantile", "1.2:0.5"]),
        "judgment 2: probability 1.2 must lie strictly between 0 and 1",
    );
    fails_with(
        &with(&["--quantile", "0.5:1.3", "--quantile", "0.9:0.5"]),
        "judgment 1: value 1.3 for theta must be inside",
    );
    fails_with(
        &with(&["--quantile", "0.5"]),
        "--quantile 1: '0.5' is not of the form [NAME:]P:VALUE",
    );
    fails_with(
        &with(&["--quantile", "0.5:x"]),
        "--quantile 1 value = 'x' is not a number",
    );
    fails_with(
        &with(&[
            "--quantile",
            "0.5:0.3",
            "--mode",
            "0.2",
            "--interval",
            "0.1:0.4:0.9",
        ]),
        "give one fitting method per call",
    );
    fails_with(
        &with(&["--mode", "0.2"]),
        "--mode and --interval go together",
    );
    fails_with(
        &with(&["--mode", "0.5", "--interval", "0.1:0.4:0.9"]),
        "the mode 0.5 must lie inside the interval",
    );
    fails_with(
        &with(&["--bins", "0,0.5,1", "--chips", "1"]),
        "3 bin edges need 2 chip counts; got 1",
    );
    fails_with(
        &with(&["--bins", "0,0.5,0.4", "--chips", "1,1"]),
        "bin edges must increase: 0.5 then 0.4",
    );
    fails_with(
        &with(&[
            "--mean",
            "0.2",
            "--imagined",
            "successes=10,trials=20,estimate=0.2",
        ]),
        "does not move",
    );
    fails_with(
        &with(&[
            "--mean",
            "0.2",
            "--imagined",
            "succeses=10,trials=20,estimate=0.3",
        ]),
        "unknown key 'succeses'",
    );
    fails_with(
        &[
            "describe",
            "--family",
            "beta-binomial",
            "--component",
            "0.5:alpha=2,beta=8",
            "--component",
            "0.4:alpha=8,beta=2",
        ],
        "mixture weights must sum to 1; they sum to 0.9",
    );
    fails_with(
        &[
            "describe",
            "--family",
            "beta-binomial",
            "--prior",
            "alpha=2,beta=8",
            "--component",
            "1:alpha=2,beta=8",
        ],
        "give either --prior or --component, not both",
    );
    fails_with(
        &[
            "describe",
            "--family",
            "beta-binomial",
            "--component",
            "alpha=2,beta=8",
        ],
        "is not of the form WEIGHT:key=value",
    );
    fails_with(
        &[
            "describe",
            "--family",
            "beta-binomial",
            "--component",
            "1:alpha=2,beta=8",
            "--pool",
            "geometric",
        ],
        "--pool = 'geometric' is not a pooling method; use linear or log",
    );
    fails_with(
        &[
            "describe",
            "--family",
            "beta-binomial",
            "--prior",
            "alpha=2,beta=8",
            "--robust",
            "1.5",
        ],
        "--robust = 1.5 is not allowed",
    );
}

#[test]
fn check_reports_sensitivity_and_the_conflict_threshold() {
    let dir = concat!(env!("CARGO_MANIFEST_DIR"), "/sample-projects");
    for name in [
        "checkout-button",
        "gauge-repeatability",
        "nest-transects",
        "sensor-offset",
        "survey-answers",
        "tablet-coating",
        "valve-seat-leaks",
    ] {
        let v = json(&["check", &format!("{dir}/{name}.ron"), "--json"]);
        assert_eq!(v["checks"]["conflict_threshold"], 0.05, "{name}");
        let c = &v["conflict"];
        assert!(
            c["p_value"].is_number(),
            "{name}: every family has a conflict check"
        );
        assert_eq!(c["threshold"], 0.05);
        let p = c["p_value"].as_f64().unwrap();
        assert_eq!(
            c["warning"].is_string(),
            p < 0.05,
            "{name}: warning iff p < threshold"
        );
        let s = &v["sensitivity"];
        let sweep = s["ess_sweep"].as_array().unwrap();
        assert_eq!(sweep.len(), 201, "{name}");
        let one = sweep.iter().find(|pt| pt["factor"] == 1.0).unwrap();
        let post = &v["posterior"]["parameters"][0];
        assert_eq!(s["parameter"], post["name"], "{name}");
        let close = |a: &Value, b: &Value| {
            let (a, b) = (a.as_f64().unwrap(), b.as_f64().unwrap());
            (a - b).abs() <= 1e-13 * b.abs().max(1.0)
        };
        assert!(
            close(&one["mean"], &post["mean"]),
            "{name}: ×1 is the posterior"
        );
        assert!(
            close(&one["lower"], &post["central_interval"]["lower"]),
            "{name}"
        );
        assert!(
            close(&one["upper"], &post["central_interval"]["upper"]),
            "{name}"
        );
        let names: Vec<&str> = s["alternatives"]
            .as_array()
            .unwrap()
            .iter()
            .map(|r| r["name"].as_str().unwrap())
            .collect();
        assert_eq!(
            names,
            ["elicited", "vague", "sceptical", "enthusiastic"],
            "{name}"
        );
        assert!(s["centre_sweep"].as_array().unwrap().len() >= 41, "{name}");
    }
}
