//! The exponential-family structure, checked once for every family.

use priorwright::family::*;

fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * b.abs().max(1.0)
}

#[test]
fn update_adds_sufficient_statistics() {
    // Beta(2, 8) and 3 successes in 20 trials → Beta(5, 25) (common practice).
    let post = BetaBinomial::new(2.0, 8.0)
        .unwrap()
        .update(&Trials::observed(3.0, 20.0).unwrap())
        .unwrap();
    assert_eq!(post, BetaBinomial::new(5.0, 25.0).unwrap());
    // Gamma(3, 5) and 3 events in exposure 2 → Gamma(6, 7).
    let post = GammaPoisson::new(3.0, 5.0)
        .unwrap()
        .update(&EventCounts::observed(3.0, 2.0).unwrap())
        .unwrap();
    assert_eq!(post, GammaPoisson::new(6.0, 7.0).unwrap());
    // Dirichlet(1,1,1) + (727, 583, 137) → Dirichlet(728, 584, 138).
    let post = DirichletMultinomial::new(vec![1.0; 3], None)
        .unwrap()
        .update(&Counts::observed(vec![727.0, 583.0, 137.0]).unwrap())
        .unwrap();
    assert_eq!(post.alpha, vec![728.0, 584.0, 138.0]);
}

#[test]
fn normal_inverse_gamma_update_matches_the_textbook_formulas() {
    // κn = κ0+n, μn = (κ0μ0+nȳ)/κn, αn = α0+n/2,
    // βn = β0 + ½(n−1)s² + κ0 n (ȳ−μ0)² / (2κn)  (DESIGN §3).
    let p = NormalInverseGamma::new(1.0, 2.0, 3.0, 4.0).unwrap();
    let d = NormalSample::observed(10.0, 1.5, Some(0.8)).unwrap();
    let q = p.update(&d).unwrap();
    assert!(close(q.kappa0, 12.0, 1e-15));
    assert!(close(q.mu0, (2.0 + 15.0) / 12.0, 1e-15));
    assert!(close(q.alpha0, 8.0, 1e-15));
    let beta = 4.0 + 0.5 * 9.0 * 0.8 + 2.0 * 10.0 * 0.25 / 24.0;
    assert!(close(q.beta0, beta, 1e-14));
}

#[test]
fn discount_scales_the_history_and_full_weight_equals_update() {
    let p = GammaExponential::new(2.0, 1000.0).unwrap();
    let h = LifeTest::observed(4.0, 3000.0).unwrap();
    assert_eq!(p.with_history(&h, 1.0).unwrap(), p.update(&h).unwrap());
    assert_eq!(
        p.with_history(&h, 0.5).unwrap(),
        GammaExponential::new(4.0, 2500.0).unwrap()
    );
    assert!(p.with_history(&h, 0.0).is_err());
    assert!(p.with_history(&h, 1.5).is_err());
}

#[test]
fn log_pool_is_the_weighted_natural_sum() {
    // Product of normal densities to powers w: precision-weighted (common practice).
    let a = NormalKnownVariance::new(0.0, 1.0, 2.0).unwrap();
    let b = NormalKnownVariance::new(10.0, 3.0, 2.0).unwrap();
    let pool = NormalKnownVariance::log_pool(&[(0.5, a), (0.5, b)]).unwrap();
    assert!(close(pool.kappa0, 2.0, 1e-15));
    assert!(close(pool.mu0, 7.5, 1e-15));
    // Beta^w1 · Beta^w2 ∝ θ^{Σw(α−1)} (1−θ)^{Σw(β−1)}.
    let pool = BetaBinomial::log_pool(&[
        (0.25, BetaBinomial::new(2.0, 8.0).unwrap()),
        (0.75, BetaBinomial::new(6.0, 4.0).unwrap()),
    ])
    .unwrap();
    assert!(close(pool.alpha, 5.0, 1e-15) && close(pool.beta, 5.0, 1e-15));
    let bad = BetaBinomial::log_pool(&[(0.3, BetaBinomial::new(1.0, 1.0).unwrap())]).unwrap_err();
    assert_eq!(
        bad.to_string(),
        "pool weights must be 0 or more and sum to 1; they sum to 0.3"
    );
}

#[test]
fn nig_log_pool_matches_the_density_product() {
    // ln of Π p_i^{w_i} minus ln of the pooled density must be constant in (μ, σ²).
    let a = NormalInverseGamma::new(0.0, 1.0, 2.0, 1.0).unwrap();
    let b = NormalInverseGamma::new(3.0, 4.0, 5.0, 6.0).unwrap();
    let w = 0.3;
    let pool = NormalInverseGamma::log_pool(&[(w, a.clone()), (1.0 - w, b.clone())]).unwrap();
    let ln_kernel = |p: &NormalInverseGamma, mu: f64, s2: f64| {
        -(p.alpha0 + 1.5) * s2.ln() - (p.beta0 + 0.5 * p.kappa0 * (mu - p.mu0).powi(2)) / s2
    };
    let diff = |mu: f64, s2: f64| {
        w * ln_kernel(&a, mu, s2) + (1.0 - w) * ln_kernel(&b, mu, s2) - ln_kernel(&pool, mu, s2)
    };
    let d0 = diff(0.0, 1.0);
    for &(mu, s2) in &[(1.0, 0.5), (-2.0, 3.0), (5.0, 0.1)] {
        assert!((diff(mu, s2) - d0).abs() < 1e-12);
    }
}

#[test]
fn pseudo_observations_round_trip() {
    let p = BetaBinomial::from_mean_ess(0.25, 12.0).unwrap();
    assert!(close(p.alpha, 3.0, 1e-15) && close(p.beta, 9.0, 1e-15));
    let g = GammaExponential::from_mean_ess(500.0, 3.0).unwrap();
    assert_eq!(g, GammaExponential::new(3.0, 1500.0).unwrap());
    let n = NormalInverseGamma::from_pseudo(1.0, 2.0, 0.5, 6.0).unwrap();
    assert_eq!(n, NormalInverseGamma::new(1.0, 2.0, 3.0, 1.5).unwrap());
    let v = InverseGammaVariance::from_mean_ess(2.0, 10.0, None).unwrap();
    assert_eq!(v, InverseGammaVariance::new(5.0, 10.0, None).unwrap());
    let d = DirichletMultinomial::from_mean_ess(&[0.5, 0.25, 0.25], 8.0, None).unwrap();
    assert_eq!(d.alpha, vec![4.0, 2.0, 2.0]);
    assert!(BetaBinomial::from_mean_ess(1.2, 3.0).is_err());
}

#[test]
fn invalid_values_name_the_value_and_rule() {
    assert_eq!(
        BetaBinomial::new(-1.0, 2.0).unwrap_err().to_string(),
        "alpha = -1 is not allowed: it must be a positive finite number"
    );
    assert_eq!(
        Trials::observed(4.0, 3.0).unwrap_err().to_string(),
        "successes = 4 is more than trials = 3"
    );
    assert_eq!(
        DirichletMultinomial::new(vec![1.0], None)
            .unwrap_err()
            .to_string(),
        "a dirichlet-multinomial prior needs at least 2 categories; alpha has 1"
    );
}

#[test]
fn marginal_likelihood_sums_to_one_over_counts() {
    // Σ_k p(k successes | prior) over k = 0..n is 1: the beta-binomial pmf.
    let p = BetaBinomial::new(1.5, 3.5).unwrap();
    let total: f64 = (0..=12)
        .map(|k| {
            p.ln_marginal_likelihood(&Trials::observed(f64::from(k), 12.0).unwrap())
                .exp()
        })
        .sum();
    assert!(close(total, 1.0, 1e-13));
    let g = GammaPoisson::new(2.0, 3.0).unwrap();
    let total: f64 = (0..400)
        .map(|k| {
            g.ln_marginal_likelihood(&EventCounts::observed(f64::from(k), 5.0).unwrap())
                .exp()
        })
        .sum();
    assert!(close(total, 1.0, 1e-13));
}

#[test]
fn a_prior_written_as_keys_reads_back_as_the_same_prior() {
    for (fam, text) in [
        ("beta-binomial", "alpha=3.26,beta=7.19"),
        ("gamma-poisson", "alpha=4,beta=2.5"),
        ("gamma-exponential", "alpha=3,beta=600"),
        ("normal-known-variance", "mu0=5,kappa0=4,sigma=2"),
        ("normal-inverse-gamma", "mu0=1,kappa0=2,alpha0=3,beta0=0.5"),
        ("dirichlet-multinomial", "alpha=2;3;5.5"),
        ("inverse-gamma-variance", "alpha=4,beta=2,mu=0.1"),
    ] {
        let p = priorwright::family::Prior::parse(fam, text).unwrap();
        let back = priorwright::family::Prior::parse(fam, &p.to_keys()).unwrap();
        assert_eq!(back, p, "{fam}: {}", p.to_keys());
    }
}
