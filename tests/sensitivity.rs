//! The sensitivity check against direct recomputation: each sampled sweep
//! point is rebuilt by hand from the conjugate update formulas (Gelman et
//! al., *Bayesian Data Analysis* 3rd ed., §2.4 beta-binomial and §3.3 the
//! normal model with conjugate prior) and summarised with the distribution
//! code that tests/reference_distributions.rs checks against mpmath.

use priorwright::analysis::sensitivity::{self, Alternative};
use priorwright::distribution::Continuous;
use priorwright::elicit::Belief;
use priorwright::elicit::dials::Dial;
use priorwright::family::Prior;

fn close(got: f64, want: f64, tol: f64, what: &str) {
    assert!(
        (got - want).abs() <= tol * want.abs().max(1.0),
        "{what}: {got} against {want}"
    );
}

fn beta_interval(a: f64, b: f64) -> (f64, f64, f64) {
    let d = Continuous::Beta { a, b };
    (
        a / (a + b),
        d.quantile_near(0.025, None),
        d.quantile_near(0.975, None),
    )
}

#[test]
fn ess_sweep_points_equal_the_hand_built_beta_posterior() {
    let (a, b) = (4.0, 16.0);
    let prior = Prior::parse("beta-binomial", &format!("alpha={a},beta={b}")).unwrap();
    let data = prior.parse_data("successes=18,trials=40").unwrap();
    let factors = [0.1, 0.37, 1.0, 2.9, 10.0];
    let s = sensitivity::ess_sweep(
        &Belief::One(prior),
        std::slice::from_ref(&data),
        Dial::Main,
        &factors,
        0.95,
    )
    .unwrap();
    for (pt, c) in s.points.iter().zip(factors) {
        // Beta(c·a + s, c·b + n − s): the ESS c(a + b), the centre a/(a + b) kept.
        let (m, lo, hi) = beta_interval(c * a + 18.0, c * b + 22.0);
        close(pt.mean.unwrap(), m, 1e-12, "mean");
        close(pt.lower, lo, 1e-10, "lower");
        close(pt.upper, hi, 1e-10, "upper");
    }
}

#[test]
fn centre_sweep_points_equal_the_hand_built_beta_posterior() {
    let prior = Prior::parse("beta-binomial", "alpha=3,beta=9").unwrap();
    let data = prior.parse_data("successes=5,trials=30").unwrap();
    let s = sensitivity::centre_sweep(
        &Belief::One(prior),
        std::slice::from_ref(&data),
        Dial::Main,
        11,
        0.95,
    )
    .unwrap();
    assert!(s.points.len() >= 11);
    assert!(
        s.points.iter().any(|p| p.x == 0.25),
        "the elicited centre is a point"
    );
    for pt in &s.points {
        // Beta(m·12 + 5, (1 − m)·12 + 25).
        let (m, lo, hi) = beta_interval(pt.x * 12.0 + 5.0, (1.0 - pt.x) * 12.0 + 25.0);
        close(pt.mean.unwrap(), m, 1e-12, "mean");
        close(pt.lower, lo, 1e-10, "lower");
        close(pt.upper, hi, 1e-10, "upper");
    }
}

#[test]
fn ess_sweep_of_a_normal_inverse_gamma_prior_scales_both_unknowns() {
    let (mu0, k0, a0, b0) = (41.0, 0.9, 2.4, 4.7);
    let prior = Prior::parse(
        "normal-inverse-gamma",
        &format!("mu0={mu0},kappa0={k0},alpha0={a0},beta0={b0}"),
    )
    .unwrap();
    let (n, ybar, s2) = (18.0, 44.5, 3.1);
    let data = prior
        .parse_data(&format!("n={n},mean={ybar},variance={s2}"))
        .unwrap();
    for c in [0.1, 1.0, 6.0] {
        let s = sensitivity::ess_sweep(
            &Belief::One(prior.clone()),
            std::slice::from_ref(&data),
            Dial::Main,
            &[c],
            0.95,
        )
        .unwrap();
        // BDA3 §3.3: κn = κ0 + n, μn = (κ0 μ0 + n ȳ)/κn, αn = α0 + n/2,
        // βn = β0 + (n−1)s²/2 + κ0 n (ȳ − μ0)²/(2κn); μ | y ~ t_{2αn}(μn, √(βn/(αn κn))).
        let (k, a, b) = (c * k0, c * a0, c * b0);
        let kn = k + n;
        let mun = (k * mu0 + n * ybar) / kn;
        let an = a + n / 2.0;
        let bn = b + (n - 1.0) * s2 / 2.0 + k * n * (ybar - mu0).powi(2) / (2.0 * kn);
        let t = Continuous::StudentT {
            df: 2.0 * an,
            loc: mun,
            scale: (bn / (an * kn)).sqrt(),
        };
        let pt = s.points[0];
        close(pt.mean.unwrap(), mun, 1e-12, "mean");
        close(pt.lower, t.quantile_near(0.025, None), 1e-10, "lower");
        close(pt.upper, t.quantile_near(0.975, None), 1e-10, "upper");
    }
}

#[test]
fn the_times_one_point_is_the_plain_posterior_for_every_sample_project() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("sample-projects");
    let mut seen = 0;
    for entry in std::fs::read_dir(&dir).unwrap() {
        let path = entry.unwrap().path();
        if path.extension().is_none_or(|e| e != "ron") {
            continue;
        }
        let p = priorwright::project::load(&path).unwrap();
        let belief = p.belief().unwrap();
        let data: Vec<_> = p.data.iter().map(|d| d.statistics.clone()).collect();
        assert_eq!(
            sensitivity::scale_belief(&belief, 1.0).unwrap(),
            belief,
            "{}: ×1 leaves the prior as it is",
            path.display()
        );
        let s = sensitivity::run(
            &belief,
            &p.log_pool().unwrap(),
            &[],
            &data,
            Dial::Main,
            0.95,
        )
        .unwrap();
        let one = s
            .ess
            .points
            .iter()
            .find(|pt| pt.x == 1.0)
            .expect("a ×1 point");
        let post = p.posterior().unwrap().expect("every sample has data");
        let (_, law) = post.marginals().into_iter().next().unwrap();
        let name = path.display().to_string();
        close(one.mean.unwrap(), law.mean().unwrap(), 1e-13, &name);
        close(one.lower, law.quantile_near(0.025, None), 1e-13, &name);
        close(one.upper, law.quantile_near(0.975, None), 1e-13, &name);
        assert_eq!(
            s.table[0].posterior.lower, one.lower,
            "{name}: table row 1 is the elicited prior"
        );
        assert_eq!(
            s.table.len(),
            4,
            "{name}: elicited, vague, sceptical, enthusiastic"
        );
        // The sweep spans the whole ×0.1 to ×10 range.
        let first = s.ess.points.first().unwrap();
        let last = s.ess.points.last().unwrap();
        assert!(first.x < 0.1 + 1e-12 && last.x > 10.0 - 1e-9, "{name}");
        seen += 1;
    }
    assert_eq!(seen, 7);
}

#[test]
fn stated_alternatives_replace_the_defaults_and_a_foreign_family_is_refused() {
    let prior = Prior::parse("gamma-poisson", "alpha=6,beta=3").unwrap();
    let data = prior.parse_data("events=4,exposure=5").unwrap();
    let mine = Alternative {
        name: "handbook".into(),
        how: "from a published rate".into(),
        prior: Prior::parse("gamma-poisson", "alpha=2,beta=4").unwrap(),
    };
    let b = Belief::One(prior.clone());
    let s = sensitivity::run(
        &b,
        &prior,
        std::slice::from_ref(&mine),
        std::slice::from_ref(&data),
        Dial::Main,
        0.9,
    )
    .unwrap();
    assert!(!s.default_alternatives);
    assert_eq!(s.table.len(), 2);
    // Gamma(2 + 4, 4 + 5): the posterior mean 6/9.
    close(
        s.table[1].posterior.mean.unwrap(),
        6.0 / 9.0,
        1e-12,
        "posterior mean",
    );
    let foreign = Alternative {
        prior: Prior::parse("beta-binomial", "alpha=1,beta=1").unwrap(),
        ..mine
    };
    let err = sensitivity::compare(&b, &[foreign], &[data], Dial::Main, 0.9).unwrap_err();
    assert!(
        err.to_string()
            .contains("beta-binomial prior in a gamma-poisson project"),
        "{err}"
    );
}
