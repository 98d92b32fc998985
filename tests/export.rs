//! Export: each target's parameterisation (from the targets' own reference
//! documentation, as collected in the project's ecosystem notes: Stan
//! Functions Reference, PyMC and NumPyro sources, JAGS user manual, R help
//! pages, brms `set_prior`, scipy.stats), and the scipy export executed.

use priorwright::distribution::Continuous;
use priorwright::elicit::{Belief, Mixture};
use priorwright::export::{Target, export};
use priorwright::family::Prior;
use priorwright::numeric::gamma::ln_gamma;

fn one(family: &str, text: &str, target: Target) -> String {
    export(&Belief::One(Prior::parse(family, text).unwrap()), target).unwrap()
}

#[test]
fn each_target_uses_its_own_parameterisation() {
    use Target::*;
    let bb = "alpha=2,beta=8";
    assert_eq!(one("beta-binomial", bb, Stan), "theta ~ beta(2.0, 8.0);\n");
    assert_eq!(
        one("beta-binomial", bb, PyMC),
        "theta = pm.Beta(\"theta\", alpha=2.0, beta=8.0)\n"
    );
    assert_eq!(
        one("beta-binomial", bb, NumPyro),
        "theta = numpyro.sample(\"theta\", dist.Beta(2.0, 8.0))\n"
    );
    assert_eq!(one("beta-binomial", bb, Jags), "theta ~ dbeta(2.0, 8.0)\n");
    assert_eq!(
        one("beta-binomial", bb, R),
        "dbeta(theta, shape1 = 2.0, shape2 = 8.0)\n"
    );
    assert!(one("beta-binomial", bb, Brms).starts_with("set_prior(\"beta(2.0, 8.0)\""));
    assert_eq!(
        one("beta-binomial", bb, Scipy),
        "theta_prior = stats.beta(2.0, 8.0)\n"
    );
    // Gamma: rate in Stan, PyMC (beta), NumPyro, JAGS, R, brms; scale = 1/rate in scipy.
    let g = "alpha=3,beta=5";
    assert_eq!(one("gamma-poisson", g, Stan), "lambda ~ gamma(3.0, 5.0);\n");
    assert_eq!(
        one("gamma-poisson", g, PyMC),
        "lambda = pm.Gamma(\"lambda\", alpha=3.0, beta=5.0)\n"
    );
    assert_eq!(
        one("gamma-poisson", g, NumPyro),
        "lambda = numpyro.sample(\"lambda\", dist.Gamma(3.0, 5.0))\n"
    );
    assert_eq!(one("gamma-poisson", g, Jags), "lambda ~ dgamma(3.0, 5.0)\n");
    assert_eq!(
        one("gamma-poisson", g, R),
        "dgamma(lambda, shape = 3.0, rate = 5.0)\n"
    );
    assert!(one("gamma-poisson", g, Brms).contains("gamma(3.0, 5.0)"));
    assert_eq!(
        one("gamma-poisson", g, Scipy),
        "lambda_prior = stats.gamma(3.0, scale=0.2)\n"
    );
    assert!(
        one("gamma-exponential", "alpha=3,beta=1500", Stan)
            .starts_with("lambda ~ gamma(3.0, 1500.0);")
    );
    // Normal: sd everywhere but JAGS, which takes the precision 1/sd².
    let k = "mu0=900,kappa0=4,sigma=40";
    assert_eq!(
        one("normal-known-variance", k, Stan),
        "mu ~ normal(900.0, 20.0);\n"
    );
    assert_eq!(
        one("normal-known-variance", k, PyMC),
        "mu = pm.Normal(\"mu\", mu=900.0, sigma=20.0)\n"
    );
    assert_eq!(
        one("normal-known-variance", k, NumPyro),
        "mu = numpyro.sample(\"mu\", dist.Normal(900.0, 20.0))\n"
    );
    assert!(one("normal-known-variance", k, Jags).starts_with("mu ~ dnorm(900.0, 0.0025)"));
    assert_eq!(
        one("normal-known-variance", k, R),
        "dnorm(mu, mean = 900.0, sd = 20.0)\n"
    );
    assert_eq!(
        one("normal-known-variance", k, Scipy),
        "mu_prior = stats.norm(loc=900.0, scale=20.0)\n"
    );
    // Normal-inverse-gamma: σ² (inverse-gamma scale) then μ | σ².
    let n = "mu0=1.9,kappa0=2,alpha0=3,beta0=0.5";
    assert_eq!(
        one("normal-inverse-gamma", n, Stan),
        "sigma2 ~ inv_gamma(3.0, 0.5);\nmu ~ normal(1.9, sqrt(sigma2 / 2.0));\n"
    );
    assert!(
        one("normal-inverse-gamma", n, PyMC)
            .contains("pm.InverseGamma(\"sigma2\", alpha=3.0, beta=0.5)")
    );
    assert!(one("normal-inverse-gamma", n, NumPyro).contains("dist.InverseGamma(3.0, 0.5)"));
    // JAGS has no inverse gamma: τ = 1/σ² ~ Gamma(α, rate β), μ precision κτ.
    let j = one("normal-inverse-gamma", n, Jags);
    assert!(j.contains("tau ~ dgamma(3.0, 0.5)") && j.contains("mu ~ dnorm(1.9, 2.0 * tau)"));
    assert!(
        one("normal-inverse-gamma", n, R)
            .contains("dgamma(1 / sigma2, shape = 3.0, rate = 0.5) / sigma2^2")
    );
    assert!(
        one("normal-inverse-gamma", n, Brms)
            .contains("inv_gamma_lpdf(square(sigma) | 3.0, 0.5) + log(2 * sigma)")
    );
    // Dirichlet and the known-mean variance.
    assert_eq!(
        one("dirichlet-multinomial", "alpha=1;2;3", Stan),
        "theta ~ dirichlet([1.0, 2.0, 3.0]');  // theta declared simplex[3]\n"
    );
    assert_eq!(
        one("dirichlet-multinomial", "alpha=1;2;3", PyMC),
        "theta = pm.Dirichlet(\"theta\", a=[1.0, 2.0, 3.0])\n"
    );
    assert!(
        one("dirichlet-multinomial", "alpha=1;2;3", Jags)
            .starts_with("theta[1:3] ~ ddirch(alpha[1:3])")
    );
    assert_eq!(
        one("inverse-gamma-variance", "alpha=5,beta=10", Stan),
        "sigma2 ~ inv_gamma(5.0, 10.0);\n"
    );
    assert_eq!(
        one("inverse-gamma-variance", "alpha=5,beta=10", Scipy),
        "sigma2_prior = stats.invgamma(5.0, scale=10.0)\n"
    );
    assert!(
        one("inverse-gamma-variance", "alpha=5,beta=10", Jags)
            .starts_with("tau ~ dgamma(5.0, 10.0)")
    );
    // JSON spells out the parameterisation.
    let v: serde_json::Value = serde_json::from_str(&one("gamma-poisson", g, Json)).unwrap();
    assert_eq!(v["family"], "gamma-poisson");
    assert_eq!(v["hyperparameters"]["beta"], 5.0);
    assert!(
        v["parameterisation"]
            .as_str()
            .unwrap()
            .contains("rate = beta")
    );
}

#[test]
fn mixtures_are_written_where_the_target_can_and_refused_where_not() {
    let mix = Belief::Mix(
        Mixture::new(vec![
            (
                0.6,
                Prior::parse("beta-binomial", "alpha=2,beta=18").unwrap(),
            ),
            (
                0.4,
                Prior::parse("beta-binomial", "alpha=6,beta=6").unwrap(),
            ),
        ])
        .unwrap(),
    );
    assert!(
        export(&mix, Target::Stan)
            .unwrap()
            .contains("log_sum_exp({log(0.6) + beta_lpdf(theta | 2.0, 18.0)")
    );
    assert!(
        export(&mix, Target::PyMC)
            .unwrap()
            .contains("pm.Mixture(\"theta\", w=[0.6, 0.4]")
    );
    assert!(
        export(&mix, Target::NumPyro)
            .unwrap()
            .contains("MixtureSameFamily")
    );
    assert!(
        export(&mix, Target::R)
            .unwrap()
            .contains("0.6 * dbeta(theta")
    );
    // Components whose single statement carries a comment (gamma-exponential,
    // Dirichlet) still give a clean log_sum_exp: no comment inside the call.
    let gx = Belief::Mix(
        Mixture::new(vec![
            (
                0.5,
                Prior::parse("gamma-exponential", "alpha=2,beta=1000").unwrap(),
            ),
            (
                0.5,
                Prior::parse("gamma-exponential", "alpha=3,beta=900").unwrap(),
            ),
        ])
        .unwrap(),
    );
    let stan = export(&gx, Target::Stan).unwrap();
    assert!(!stan.contains("//"), "{stan}");
    assert!(
        stan.contains("log(0.5) + gamma_lpdf(lambda | 2.0, 1000.0)"),
        "{stan}"
    );
    let e = export(&mix, Target::Jags).unwrap_err().to_string();
    assert!(
        e.contains(
            "jags cannot state a mixture prior directly (JAGS needs a latent component indicator"
        ),
        "{e}"
    );
    let e = export(&mix, Target::Brms).unwrap_err().to_string();
    assert!(
        e.contains("brms cannot state a mixture prior directly"),
        "{e}"
    );
}

/// Runs the scipy export and returns its densities at the given points.
fn scipy_pdf(code: &str, eval: &str) -> Vec<f64> {
    let script = format!(
        "import numpy as np\nfrom scipy import stats\n{code}\nfor v in {eval}:\n    print(repr(float(v)))\n"
    );
    let out = std::process::Command::new("python3")
        .arg("-c")
        .arg(&script)
        .output()
        .expect("python3 runs (CI installs it with scipy)");
    assert!(
        out.status.success(),
        "python3 failed: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8_lossy(&out.stdout)
        .lines()
        .map(|l| l.parse().unwrap())
        .collect()
}

fn close(a: f64, b: f64) -> bool {
    ((a - b) / b).abs() < 1e-10
}

#[test]
fn scipy_export_runs_and_matches_our_densities() {
    let xs = [0.05, 0.2, 0.6];
    let code = one("beta-binomial", "alpha=2.5,beta=8", Target::Scipy);
    let got = scipy_pdf(&code, "[theta_prior.pdf(x) for x in (0.05, 0.2, 0.6)]");
    let d = Continuous::Beta { a: 2.5, b: 8.0 };
    for (x, g) in xs.iter().zip(&got) {
        assert!(
            close(*g, d.pdf(*x)),
            "beta at {x}: scipy {g}, ours {}",
            d.pdf(*x)
        );
    }
    for fam in ["gamma-poisson", "gamma-exponential"] {
        let code = one(fam, "alpha=3.5,beta=1.25", Target::Scipy);
        let got = scipy_pdf(&code, "[lambda_prior.pdf(x) for x in (0.5, 2.0, 6.0)]");
        let d = Continuous::Gamma {
            shape: 3.5,
            rate: 1.25,
        };
        for (x, g) in [0.5, 2.0, 6.0].iter().zip(&got) {
            assert!(close(*g, d.pdf(*x)), "{fam} at {x}");
        }
    }
    let code = one(
        "normal-known-variance",
        "mu0=900,kappa0=4,sigma=40",
        Target::Scipy,
    );
    let got = scipy_pdf(&code, "[mu_prior.pdf(x) for x in (860.0, 900.0, 951.0)]");
    let d = Continuous::Normal {
        mean: 900.0,
        sd: 20.0,
    };
    for (x, g) in [860.0, 900.0, 951.0].iter().zip(&got) {
        assert!(close(*g, d.pdf(*x)), "normal at {x}");
    }
    let code = one("inverse-gamma-variance", "alpha=5,beta=10", Target::Scipy);
    let got = scipy_pdf(&code, "[sigma2_prior.pdf(x) for x in (0.8, 2.0, 7.5)]");
    let d = Continuous::InvGamma {
        shape: 5.0,
        scale: 10.0,
    };
    for (x, g) in [0.8, 2.0, 7.5].iter().zip(&got) {
        assert!(close(*g, d.pdf(*x)), "inverse gamma at {x}");
    }
    // Normal-inverse-gamma: joint density p(σ²) p(μ | σ²) at three points.
    let code = one(
        "normal-inverse-gamma",
        "mu0=1.9,kappa0=2,alpha0=3,beta0=0.5",
        Target::Scipy,
    );
    let pts = [(1.8, 0.1), (2.0, 0.3), (1.5, 0.05)];
    let got = scipy_pdf(
        &code,
        "[sigma2_prior.pdf(s) * mu_prior(s).pdf(m) for m, s in ((1.8, 0.1), (2.0, 0.3), (1.5, 0.05))]",
    );
    for ((m, s), g) in pts.iter().zip(&got) {
        let ours = Continuous::InvGamma {
            shape: 3.0,
            scale: 0.5,
        }
        .pdf(*s)
            * Continuous::Normal {
                mean: 1.9,
                sd: (s / 2.0f64).sqrt(),
            }
            .pdf(*m);
        assert!(close(*g, ours), "NIG at {m},{s}");
    }
    // Dirichlet density at three points of the simplex.
    let code = one("dirichlet-multinomial", "alpha=1.5;2;3", Target::Scipy);
    let pts = [[0.2, 0.3, 0.5], [0.6, 0.3, 0.1], [0.1, 0.1, 0.8]];
    let got = scipy_pdf(
        &code,
        "[theta_prior.pdf(np.array(p)) for p in ((0.2, 0.3, 0.5), (0.6, 0.3, 0.1), (0.1, 0.1, 0.8))]",
    );
    let alpha = [1.5, 2.0, 3.0];
    for (p, g) in pts.iter().zip(&got) {
        let ln = ln_gamma(alpha.iter().sum()) - alpha.iter().map(|a| ln_gamma(*a)).sum::<f64>()
            + alpha
                .iter()
                .zip(p)
                .map(|(a, x)| (a - 1.0) * f64::ln(*x))
                .sum::<f64>();
        assert!(close(*g, ln.exp()), "dirichlet at {p:?}");
    }
    // A mixture's scipy export evaluates to the weighted sum.
    let mix = Belief::Mix(
        Mixture::new(vec![
            (
                0.6,
                Prior::parse("beta-binomial", "alpha=2,beta=18").unwrap(),
            ),
            (
                0.4,
                Prior::parse("beta-binomial", "alpha=6,beta=6").unwrap(),
            ),
        ])
        .unwrap(),
    );
    let code = export(&mix, Target::Scipy).unwrap();
    let got = scipy_pdf(&code, "[prior_pdf(x) for x in (0.05, 0.2, 0.6)]");
    for (x, g) in xs.iter().zip(&got) {
        let ours = 0.6 * Continuous::Beta { a: 2.0, b: 18.0 }.pdf(*x)
            + 0.4 * Continuous::Beta { a: 6.0, b: 6.0 }.pdf(*x);
        assert!(close(*g, ours), "mixture at {x}");
    }
}

/// A family, a prior, and for each target the fragments its line must hold.
type Case = (
    &'static str,
    &'static str,
    [(Target, &'static [&'static str]); 7],
);

/// Every target × family: the numbers each target's documentation asks for
/// appear in its line (rates vs scales, sd vs precision).
#[test]
fn every_target_and_family_carries_the_right_numbers() {
    use Target::*;
    // (family, prior, per-target expected fragments)
    let cases: [Case; 7] = [
        (
            "beta-binomial",
            "alpha=2.5,beta=7",
            [
                (Stan, &["beta(2.5, 7.0)"]),
                (PyMC, &["alpha=2.5", "beta=7.0"]),
                (NumPyro, &["Beta(2.5, 7.0)"]),
                (Jags, &["dbeta(2.5, 7.0)"]),
                (R, &["shape1 = 2.5", "shape2 = 7.0"]),
                (Brms, &["beta(2.5, 7.0)"]),
                (Scipy, &["stats.beta(2.5, 7.0)"]),
            ],
        ),
        (
            "gamma-poisson",
            "alpha=3,beta=4",
            [
                (Stan, &["gamma(3.0, 4.0)"]),
                (PyMC, &["alpha=3.0", "beta=4.0"]),
                (NumPyro, &["Gamma(3.0, 4.0)"]),
                (Jags, &["dgamma(3.0, 4.0)"]),
                (R, &["shape = 3.0", "rate = 4.0"]),
                (Brms, &["gamma(3.0, 4.0)"]),
                (Scipy, &["stats.gamma(3.0, scale=0.25)"]),
            ],
        ),
        (
            "gamma-exponential",
            "alpha=2,beta=800",
            [
                (Stan, &["gamma(2.0, 800.0)"]),
                (PyMC, &["beta=800.0"]),
                (NumPyro, &["Gamma(2.0, 800.0)"]),
                (Jags, &["dgamma(2.0, 800.0)"]),
                (R, &["rate = 800.0"]),
                (Brms, &["gamma(2.0, 800.0)"]),
                (Scipy, &["scale=0.00125"]),
            ],
        ),
        (
            "normal-known-variance",
            "mu0=5,kappa0=16,sigma=2",
            [
                (Stan, &["normal(5.0, 0.5)"]),
                (PyMC, &["mu=5.0", "sigma=0.5"]),
                (NumPyro, &["Normal(5.0, 0.5)"]),
                (Jags, &["dnorm(5.0, 4.0)"]),
                (R, &["mean = 5.0", "sd = 0.5"]),
                (Brms, &["normal(5.0, 0.5)"]),
                (Scipy, &["loc=5.0", "scale=0.5"]),
            ],
        ),
        (
            "normal-inverse-gamma",
            "mu0=5,kappa0=2,alpha0=3,beta0=4",
            [
                (
                    Stan,
                    &["inv_gamma(3.0, 4.0)", "normal(5.0, sqrt(sigma2 / 2.0))"],
                ),
                (PyMC, &["alpha=3.0, beta=4.0", "sigma2 / 2.0"]),
                (NumPyro, &["InverseGamma(3.0, 4.0)", "sigma2 / 2.0"]),
                (Jags, &["dgamma(3.0, 4.0)", "dnorm(5.0, 2.0 * tau)"]),
                (R, &["shape = 3.0, rate = 4.0", "sigma2 / 2.0"]),
                (
                    Brms,
                    &[
                        "inv_gamma_lpdf(square(sigma) | 3.0, 4.0)",
                        "sigma / sqrt(2.0)",
                    ],
                ),
                (Scipy, &["stats.invgamma(3.0, scale=4.0)", "sigma2 / 2.0"]),
            ],
        ),
        (
            "dirichlet-multinomial",
            "alpha=1;2;3",
            [
                (Stan, &["dirichlet([1.0, 2.0, 3.0]')"]),
                (PyMC, &["a=[1.0, 2.0, 3.0]"]),
                (NumPyro, &["[1.0, 2.0, 3.0]"]),
                (Jags, &["ddirch(alpha[1:3])", "c(1.0, 2.0, 3.0)"]),
                (R, &["c(1.0, 2.0, 3.0)"]),
                (Brms, &["dirichlet(c(1.0, 2.0, 3.0))"]),
                (Scipy, &["stats.dirichlet([1.0, 2.0, 3.0])"]),
            ],
        ),
        (
            "inverse-gamma-variance",
            "alpha=3,beta=4",
            [
                (Stan, &["inv_gamma(3.0, 4.0)"]),
                (PyMC, &["InverseGamma(\"sigma2\", alpha=3.0, beta=4.0)"]),
                (NumPyro, &["InverseGamma(3.0, 4.0)"]),
                (Jags, &["tau ~ dgamma(3.0, 4.0)", "sigma2 <- 1 / tau"]),
                (
                    R,
                    &["dgamma(1 / sigma2, shape = 3.0, rate = 4.0) / sigma2^2"],
                ),
                (Brms, &["inv_gamma_lpdf(square(sigma) | 3.0, 4.0)"]),
                (Scipy, &["stats.invgamma(3.0, scale=4.0)"]),
            ],
        ),
    ];
    for (family, prior, targets) in cases {
        for (target, fragments) in targets {
            let text = one(family, prior, target);
            for f in fragments {
                assert!(
                    text.contains(f),
                    "{family} → {}: {text:?} lacks {f:?}",
                    target.name()
                );
            }
        }
        let v: serde_json::Value = serde_json::from_str(&one(family, prior, Json)).unwrap();
        assert_eq!(v["family"], family);
    }
}
