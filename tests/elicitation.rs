//! Elicitation against outside references: scipy least-squares and exact
//! fits, mpmath mixture posteriors (tests/reference/generate_fits.py), a
//! published quantile-fit example, and the behaviour each method promises.

use priorwright::elicit::fit::{Fixed, Judgment, Method, Scale, fit};
use priorwright::elicit::{Mixture, methods};
use priorwright::family::keys::Keys;
use priorwright::family::{Future, Prior, Value};
use serde_json::Value as Json;

fn fixture() -> Json {
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/reference/fixtures/fits.json"
    ))
    .expect("fixture present");
    serde_json::from_str(&text).expect("JSON")
}

fn hyper(prior: &Prior, key: &str) -> f64 {
    match prior.hyperparameters().into_iter().find(|(k, _)| *k == key) {
        Some((_, Value::Number(x))) => x,
        _ => panic!("no {key}"),
    }
}

fn j(parameter: Option<&str>, p: f64, value: f64) -> Judgment {
    Judgment {
        parameter: parameter.map(str::to_owned),
        p,
        value,
    }
}

#[test]
fn fits_match_scipy() {
    for case in fixture()["fits"].as_array().unwrap() {
        let family = case["family"].as_str().unwrap();
        let judgments: Vec<Judgment> = case["judgments"]
            .as_array()
            .unwrap()
            .iter()
            .map(|x| {
                j(
                    x["parameter"].as_str(),
                    x["p"].as_f64().unwrap(),
                    x["value"].as_f64().unwrap(),
                )
            })
            .collect();
        let fixed = Fixed {
            sigma: case["fixed"]["sigma"].as_f64(),
            ..Fixed::default()
        };
        let scale = match case["observable"].as_f64() {
            None => Scale::Unknowns,
            Some(m) if family == "beta-binomial" => Scale::Observable(Future::Trials(m as u64)),
            Some(t) => Scale::Observable(Future::Exposure(t)),
        };
        let f = fit(family, &fixed, scale, &judgments).unwrap();
        let theirs = case["objective"].as_f64().unwrap();
        assert!(
            f.objective <= theirs + 1e-12,
            "{family}: objective {} vs scipy {theirs}",
            f.objective
        );
        for (k, v) in case["hyperparameters"].as_object().unwrap() {
            let (ours, want) = (hyper(&f.prior, k), v.as_f64().unwrap());
            assert!(
                ((ours - want) / want).abs() < 1e-6,
                "{family} {k}: {ours} vs scipy {want}"
            );
        }
        if judgments.len() == 2 {
            assert_eq!(f.method, Method::Exact, "{family}");
        }
    }
}

#[test]
fn mixture_posteriors_match_quadrature() {
    for case in fixture()["mixtures"].as_array().unwrap() {
        let family = case["family"].as_str().unwrap();
        let parts = case["components"]
            .as_array()
            .unwrap()
            .iter()
            .map(|c| {
                (
                    c[0].as_f64().unwrap(),
                    Prior::parse(family, c[1].as_str().unwrap()).unwrap(),
                )
            })
            .collect();
        let mix = Mixture::new(parts).unwrap();
        let data = mix.components()[0]
            .1
            .parse_data(case["data"].as_str().unwrap())
            .unwrap();
        let post = mix.update(&data).unwrap();
        for ((w, _), want) in post
            .components()
            .iter()
            .zip(case["weights"].as_array().unwrap())
        {
            assert!(
                (w - want.as_f64().unwrap()).abs() < 1e-10,
                "{family} weight {w} vs {want}"
            );
        }
        let law = &post.marginals()[0].1;
        let mean = law.mean().unwrap();
        assert!((mean - case["mean"].as_f64().unwrap()).abs() < 1e-10 * mean);
        for (p, want) in [0.025, 0.975]
            .iter()
            .zip(case["central_95"].as_array().unwrap())
        {
            let got = law.quantile_near(*p, None);
            let want = want.as_f64().unwrap();
            assert!(
                ((got - want) / want).abs() < 1e-9,
                "{family} q{p}: {got} vs {want}"
            );
        }
        let ln_ml = mix.ln_marginal_likelihood(&data).unwrap();
        assert!((ln_ml - case["ln_marginal"].as_f64().unwrap()).abs() < 1e-10);
    }
}

#[test]
fn albert_median_and_ninetieth_percentile() {
    // Albert, Bayesian Computation with R, 2nd ed. (2009), §2.4: a prior whose
    // median is 0.3 and 90th percentile 0.5 is Beta(3.26, 7.19) (from memory).
    let f = fit(
        "beta-binomial",
        &Fixed::default(),
        Scale::Unknowns,
        &[j(None, 0.5, 0.3), j(None, 0.9, 0.5)],
    )
    .unwrap();
    assert!((hyper(&f.prior, "alpha") - 3.26).abs() < 0.005);
    assert!((hyper(&f.prior, "beta") - 7.19).abs() < 0.005);
    assert_eq!(f.method, Method::Exact);
    assert!(f.max_abs_error < 1e-12);
}

#[test]
fn inconsistent_judgments_name_the_one_at_fault() {
    let fx = Fixed::default();
    let e = fit(
        "beta-binomial",
        &fx,
        Scale::Unknowns,
        &[j(None, 0.5, 0.3), j(None, 0.9, 0.2)],
    )
    .unwrap_err();
    assert_eq!(
        e.to_string(),
        "judgments 2 and 1 are not increasing: P(theta ≤ 0.2) = 0.9 but P(theta ≤ 0.3) = 0.5"
    );
    let e = fit(
        "beta-binomial",
        &fx,
        Scale::Unknowns,
        &[j(None, 1.5, 0.3), j(None, 0.9, 0.5)],
    )
    .unwrap_err();
    assert_eq!(
        e.to_string(),
        "judgment 1: probability 1.5 must lie strictly between 0 and 1"
    );
    let e = fit(
        "gamma-poisson",
        &fx,
        Scale::Unknowns,
        &[j(None, 0.5, -1.0), j(None, 0.9, 2.0)],
    )
    .unwrap_err();
    assert_eq!(
        e.to_string(),
        "judgment 1: value -1 for lambda must be inside the unknown's range"
    );
    let e = fit("beta-binomial", &fx, Scale::Unknowns, &[j(None, 0.5, 0.3)]).unwrap_err();
    assert!(e.to_string().contains("give at least 2 judgments (got 1)"));
    let e = fit(
        "gamma-exponential",
        &fx,
        Scale::Unknowns,
        &[j(Some("mtbf"), 0.5, 3.0), j(None, 0.9, 5.0)],
    )
    .unwrap_err();
    assert!(
        e.to_string()
            .contains("judgment 1 names 'mtbf', which is not an unknown of gamma-exponential")
    );
    let e = fit(
        "normal-known-variance",
        &fx,
        Scale::Unknowns,
        &[j(None, 0.5, 3.0), j(None, 0.9, 5.0)],
    )
    .unwrap_err();
    assert!(e.to_string().contains("--fixed sigma="));
    let e = fit(
        "beta-binomial",
        &fx,
        Scale::Observable(Future::Trials(20)),
        &[j(None, 0.5, 4.5), j(None, 0.9, 8.0)],
    )
    .unwrap_err();
    assert!(
        e.to_string()
            .contains("must be a whole count from 0 to the future trials")
    );
}

#[test]
fn mode_with_interval_keeps_the_mode() {
    let m = methods::mode_interval(
        "beta-binomial",
        None,
        &Fixed::default(),
        0.2,
        (0.1, 0.4),
        0.9,
    )
    .unwrap();
    let theta = m.prior.marginals()[0].distribution;
    assert!((theta.mode().unwrap() - 0.2).abs() < 1e-12);
    assert!((theta.cdf(0.4) - theta.cdf(0.1) - 0.9).abs() < 1e-10);
    let m = methods::mode_interval(
        "gamma-exponential",
        Some("mean_time"),
        &Fixed::default(),
        500.0,
        (200.0, 2000.0),
        0.8,
    )
    .unwrap();
    let mt = m.prior.marginals()[1].distribution;
    assert!((mt.mode().unwrap() - 500.0).abs() < 1e-9);
    let e = methods::mode_interval(
        "beta-binomial",
        None,
        &Fixed::default(),
        0.5,
        (0.1, 0.4),
        0.9,
    )
    .unwrap_err();
    assert_eq!(
        e.to_string(),
        "the mode 0.5 must lie inside the interval [0.1, 0.4]"
    );
    // The flattest beta with mode 0.5 (uniform) already gives [0.05, 0.95] probability 0.9.
    let e = methods::mode_interval(
        "beta-binomial",
        None,
        &Fixed::default(),
        0.5,
        (0.05, 0.95),
        0.5,
    )
    .unwrap_err();
    assert!(e.to_string().contains("is too low"));
}

#[test]
fn chips_handle_empty_end_bins_and_a_single_full_bin() {
    // Empty end bins collapse to the edge beside the chips: same fit with or without them.
    let fx = Fixed::default();
    let a = methods::chips(
        "beta-binomial",
        None,
        &fx,
        &[0.0, 0.1, 0.2, 0.3, 0.4, 1.0],
        &[0.0, 3.0, 5.0, 2.0, 0.0],
    )
    .unwrap();
    let b = methods::chips(
        "beta-binomial",
        None,
        &fx,
        &[0.1, 0.2, 0.3, 0.4],
        &[3.0, 5.0, 2.0],
    )
    .unwrap();
    assert_eq!(a.judgments.len(), 4);
    assert!((hyper(&a.prior, "alpha") - hyper(&b.prior, "alpha")).abs() < 1e-9);
    // All chips in one bin: two judgments at its edges, met exactly.
    let c = methods::chips(
        "gamma-poisson",
        None,
        &fx,
        &[0.0, 1.0, 2.0, 5.0],
        &[0.0, 10.0, 0.0],
    )
    .unwrap();
    assert_eq!(c.judgments.len(), 2);
    assert_eq!(c.method, Method::Exact);
    assert!((c.judgments[0].p - 0.5 / 11.0).abs() < 1e-15);
    let e = methods::chips("beta-binomial", None, &fx, &[0.0, 0.5, 1.0], &[0.0, 0.0]).unwrap_err();
    assert_eq!(e.to_string(), "no chips were placed");
    let e = methods::chips("beta-binomial", None, &fx, &[0.0, 0.5, 1.0], &[1.5, 2.0]).unwrap_err();
    assert!(
        e.to_string()
            .contains("chips in bin 1 = 1.5 is not allowed")
    );
}

#[test]
fn imagined_data_fix_the_ess_or_say_why_not() {
    let fx = Fixed::default();
    let keys =
        |t: &str| Keys::parse(t, "--imagined", &["successes", "trials", "estimate"]).unwrap();
    // Mean 0.2 held; 10 of 20 would move the estimate to 0.3: (0.2·E + 10)/(E + 20) = 0.3 → E = 40.
    let p = methods::imagined(
        "beta-binomial",
        &fx,
        0.2,
        &keys("successes=10,trials=20,estimate=0.3"),
    )
    .unwrap();
    assert!((hyper(&p, "alpha") - 8.0).abs() < 1e-12 && (hyper(&p, "beta") - 32.0).abs() < 1e-12);
    let e = methods::imagined(
        "beta-binomial",
        &fx,
        0.2,
        &keys("successes=10,trials=20,estimate=0.2"),
    )
    .unwrap_err();
    assert!(e.to_string().contains("does not move"));
    let e = methods::imagined(
        "beta-binomial",
        &fx,
        0.2,
        &keys("successes=10,trials=20,estimate=0.1"),
    )
    .unwrap_err();
    assert!(e.to_string().contains("away from the imagined data"));
    let e = methods::imagined(
        "beta-binomial",
        &fx,
        0.2,
        &keys("successes=10,trials=20,estimate=0.6"),
    )
    .unwrap_err();
    assert!(e.to_string().contains("moves past the imagined data"));
}

#[test]
fn observable_judgments_fit_through_the_predictive() {
    // Successes in the next 20 trials: median 4 and 90th percentile 8.
    let f = fit(
        "beta-binomial",
        &Fixed::default(),
        Scale::Observable(Future::Trials(20)),
        &[j(None, 0.5, 4.0), j(None, 0.9, 8.0)],
    )
    .unwrap();
    let pred = match f.prior.predictive(&Future::Trials(20)).unwrap() {
        priorwright::family::Predictive::Count(d) => d,
        _ => unreachable!(),
    };
    assert!((pred.cdf(4) - 0.5).abs() < 1e-12 && (pred.cdf(8) - 0.9).abs() < 1e-12);
}

#[test]
fn pools_and_robust_mixtures() {
    let a = Prior::parse("beta-binomial", "alpha=2,beta=18").unwrap();
    let b = Prior::parse("beta-binomial", "alpha=6,beta=6").unwrap();
    let mix = Mixture::new(vec![(0.6, a.clone()), (0.4, b.clone())]).unwrap();
    // Log pool: weighted sum of the natural hyperparameters.
    let pool = mix.log_pool().unwrap();
    assert!((hyper(&pool, "alpha") - (0.6 * 2.0 + 0.4 * 6.0)).abs() < 1e-12);
    // The linear pool's two modes give a two-piece highest-density region at a low level.
    let law = &mix.marginals()[0].1;
    let central = law.quantile_near(0.5, None);
    let hpd = law.hpd_interval(
        0.6,
        &priorwright::distribution::Interval::single(0.6, central, central),
    );
    assert_eq!(hpd.pieces.len(), 2, "{hpd:?}");
    let mass: f64 = hpd
        .pieces
        .iter()
        .map(|(l, u)| law.tails(*u).0 - law.tails(*l).0)
        .sum();
    assert!((mass - 0.6).abs() < 1e-9);
    let e = Mixture::new(vec![(0.5, a.clone()), (0.4, b.clone())]).unwrap_err();
    assert_eq!(
        e.to_string(),
        "mixture weights must sum to 1; they sum to 0.9"
    );
    let g = Prior::parse("gamma-poisson", "alpha=1,beta=1").unwrap();
    let e = Mixture::new(vec![(0.5, a), (0.5, g)]).unwrap_err();
    assert!(e.to_string().contains("a mixture needs one family"));
    // Unit-information component: same mean, ESS 1.
    let u = b.unit_information().unwrap();
    assert!((hyper(&u, "alpha") - 0.5).abs() < 1e-15 && (hyper(&u, "beta") - 0.5).abs() < 1e-15);
}
