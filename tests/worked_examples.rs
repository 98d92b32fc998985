//! Published worked examples, one or more per family, checked at the precision
//! they are printed with. Values recalled from the books are marked "from
//! memory"; the chi-square critical values are the standard table entries.

use priorwright::distribution::Continuous;
use priorwright::family::*;

/// `x` agrees with a value printed to `decimals` places.
fn printed(x: f64, value: f64, decimals: i32) {
    let half = 0.5 * 10f64.powi(-decimals) + 1e-12;
    assert!(
        (x - value).abs() <= half,
        "{x} does not round to {value} at {decimals} decimals"
    );
}

fn marginal(ms: &[Marginal], name: &str) -> Continuous {
    ms.iter()
        .find(|m| m.name == name)
        .expect("parameter present")
        .distribution
}

#[test]
fn beta_binomial_placenta_previa() {
    // Gelman et al., Bayesian Data Analysis, 3rd ed., §2.4: 437 girls in 980
    // placenta previa births, uniform prior → Beta(438, 544), mean 0.446,
    // sd 0.016, central 95% interval [0.415, 0.477] (from memory).
    let prior = BetaBinomial::new(1.0, 1.0).unwrap();
    let post = prior
        .update(&Trials::observed(437.0, 980.0).unwrap())
        .unwrap();
    assert_eq!(post, BetaBinomial::new(438.0, 544.0).unwrap());
    let theta = marginal(&post.marginals(), "theta");
    printed(theta.mean().unwrap(), 0.446, 3);
    printed(theta.sd().unwrap(), 0.016, 3);
    let ci = theta.central_interval(0.95);
    printed(ci.lower, 0.415, 3);
    printed(ci.upper, 0.477, 3);
}

#[test]
fn gamma_poisson_asthma_mortality() {
    // Gelman et al., BDA 3rd ed., §2.6 (asthma mortality): prior Gamma(3.0, 5.0)
    // has mean 0.6 with 97.5% of its mass below 1.44; 3 deaths in a population
    // of 200,000 (exposure 2.0 in units of 100,000) → Gamma(6.0, 7.0), mean 0.86
    // (from memory).
    let prior = GammaPoisson::new(3.0, 5.0).unwrap();
    let lambda = marginal(&prior.marginals(), "lambda");
    printed(lambda.mean().unwrap(), 0.6, 1);
    printed(lambda.quantile(0.975), 1.44, 2);
    let post = prior
        .update(&EventCounts::observed(3.0, 2.0).unwrap())
        .unwrap();
    assert_eq!(post, GammaPoisson::new(6.0, 7.0).unwrap());
    printed(
        marginal(&post.marginals(), "lambda").mean().unwrap(),
        0.86,
        2,
    );
}

#[test]
fn gamma_exponential_chi_square_bound() {
    // For a Gamma(α, β) posterior with whole α, 2βλ ~ χ²(2α), so the 95% upper
    // credible bound on λ is χ²_0.95(2α)/(2β) (common practice in reliability
    // work). χ²_0.95(10) = 18.307: NIST/SEMATECH e-Handbook of Statistical
    // Methods, §1.3.6.7.4, upper critical values of the chi-square distribution.
    let prior = GammaExponential::new(1.0, 100.0).unwrap();
    let post = prior
        .update(&LifeTest::observed(4.0, 900.0).unwrap())
        .unwrap();
    assert_eq!(post, GammaExponential::new(5.0, 1000.0).unwrap());
    let ms = post.marginals();
    printed(
        2.0 * 1000.0 * marginal(&ms, "lambda").quantile(0.95),
        18.307,
        3,
    );
    // The same bound seen on the mean time: its 5% point is 2β/χ²_0.95(10).
    printed(
        2.0 * 1000.0 / marginal(&ms, "mean_time").quantile(0.05),
        18.307,
        3,
    );
}

#[test]
fn normal_known_variance_two_physicists() {
    // Box & Tiao, Bayesian Inference in Statistical Analysis (1973), §1.2.3,
    // retold in Lee, Bayesian Statistics: An Introduction, 4th ed., §2.2: a
    // measurement x = 850 with sd 40; physicist A's prior N(900, 20²) gives
    // N(890, 17.9²), physicist B's N(800, 80²) gives N(840, 35.8²) (from memory).
    // In pseudo-observations κ0 = 40²/τ0²: 4 for A, 0.25 for B.
    let data = MeanStats::observed(1.0, 850.0, None).unwrap();
    for (kappa0, mu0, mean, sd) in [(4.0, 900.0, 890.0, 17.9), (0.25, 800.0, 840.0, 35.8)] {
        let post = NormalKnownVariance::new(mu0, kappa0, 40.0)
            .unwrap()
            .update(&data)
            .unwrap();
        let mu = marginal(&post.marginals(), "mu");
        printed(mu.mean().unwrap(), mean, 0);
        printed(mu.sd().unwrap(), sd, 1);
    }
}

#[test]
fn normal_inverse_gamma_midge_wings() {
    // Hoff, A First Course in Bayesian Statistical Methods (2009), §5.3: midge
    // wing lengths, n = 9, ȳ = 1.804, s² = 0.0169; prior μ0 = 1.9, κ0 = 1,
    // ν0 = 1, σ0² = 0.010 → μn = 1.814, κn = νn = 10, σn² = 0.015, and a 95%
    // interval for μ of (1.73, 1.90) (from memory). Here α = ν/2, β = νσ²/2.
    let prior = NormalInverseGamma::new(1.9, 1.0, 0.5, 0.005).unwrap();
    let post = prior
        .update(&NormalSample::observed(9.0, 1.804, Some(0.0169)).unwrap())
        .unwrap();
    printed(post.mu0, 1.814, 3);
    assert!((post.kappa0 - 10.0).abs() < 1e-12);
    assert!((2.0 * post.alpha0 - 10.0).abs() < 1e-12);
    printed(post.beta0 / post.alpha0, 0.015, 3);
    let ci = marginal(&post.marginals(), "mu").central_interval(0.95);
    printed(ci.lower, 1.73, 2);
    printed(ci.upper, 1.90, 2);
}

#[test]
fn dirichlet_multinomial_pre_election_poll() {
    // Gelman et al., BDA 3rd ed., §3.4: 727 Bush, 583 Dukakis, 137 other in a
    // poll of 1447; a uniform Dirichlet prior gives Dirichlet(728, 584, 138)
    // (from memory).
    let prior = DirichletMultinomial::new(vec![1.0, 1.0, 1.0], None).unwrap();
    let post = prior
        .update(&Counts::observed(vec![727.0, 583.0, 137.0]).unwrap())
        .unwrap();
    assert_eq!(post.alpha, vec![728.0, 584.0, 138.0]);
    // Each share's marginal is Beta(α_k, A − α_k) (common practice).
    let theta1 = marginal(&post.marginals(), "theta1");
    assert_eq!(theta1, Continuous::Beta { a: 728.0, b: 722.0 });
}

#[test]
fn inverse_gamma_variance_chi_square_interval() {
    // σ² | data ~ Inv-χ²(ν, s²) = InvGamma(ν/2, νs²/2) (Gelman et al., BDA
    // 3rd ed., §2.6 and Appendix A), so its central 95% interval is
    // [νs²/χ²_0.975(ν), νs²/χ²_0.025(ν)]. χ²_0.975(10) = 20.483 and
    // χ²_0.025(10) = 3.247: NIST/SEMATECH e-Handbook §1.3.6.7.4.
    let prior = InverseGammaVariance::new(2.0, 4.0, Some(0.0)).unwrap();
    let post = prior
        .update(&SquaresAboutMean::observed(6.0, 12.0).unwrap())
        .unwrap();
    assert_eq!(
        post,
        InverseGammaVariance::new(5.0, 10.0, Some(0.0)).unwrap()
    );
    let ci = marginal(&post.marginals(), "sigma2").central_interval(0.95);
    printed(20.0 / ci.lower, 20.483, 3);
    printed(20.0 / ci.upper, 3.247, 3);
}
