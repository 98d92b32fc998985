//! One function per target; numbers are printed in shortest round-trip form.

use crate::elicit::Mixture;
use crate::family::Prior;
use serde_json::json;

/// Where the prior goes.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Target {
    /// Stan model block.
    Stan,
    /// PyMC 5.
    PyMC,
    /// NumPyro.
    NumPyro,
    /// JAGS.
    Jags,
    /// R base density functions.
    R,
    /// brms `prior()` / `set_prior()`.
    Brms,
    /// scipy.stats frozen distributions.
    Scipy,
    /// A JSON document.
    Json,
}

/// Target names for the command line.
pub const TARGETS: [(&str, Target); 8] = [
    ("stan", Target::Stan),
    ("pymc", Target::PyMC),
    ("numpyro", Target::NumPyro),
    ("jags", Target::Jags),
    ("r", Target::R),
    ("brms", Target::Brms),
    ("scipy", Target::Scipy),
    ("json", Target::Json),
];

impl Target {
    /// Parses a target name.
    pub fn parse(name: &str) -> Option<Target> {
        TARGETS.iter().find(|(n, _)| *n == name).map(|(_, t)| *t)
    }

    /// The name.
    pub fn name(self) -> &'static str {
        TARGETS
            .iter()
            .find(|(_, t)| *t == self)
            .map_or("?", |(n, _)| n)
    }

    /// The target as people write it, for windows and reports.
    pub fn title(self) -> &'static str {
        match self {
            Self::Stan => "Stan",
            Self::PyMC => "PyMC",
            Self::NumPyro => "NumPyro",
            Self::Jags => "JAGS",
            Self::R => "R",
            Self::Brms => "brms",
            Self::Scipy => "scipy.stats",
            Self::Json => "JSON",
        }
    }

    /// Why a mixture cannot be written, for targets that cannot.
    pub fn mixture_note(self) -> &'static str {
        match self {
            Self::Jags => "JAGS needs a latent component indicator, which changes the model",
            Self::Brms => "brms priors are independent per parameter and have no mixture",
            _ => "no mixture form",
        }
    }
}

/// Shortest round-trip number.
fn n(x: f64) -> String {
    let s = format!("{x}");
    if s.contains('.') || s.contains('e') || s.contains("inf") || s.contains("NaN") {
        s
    } else {
        format!("{s}.0")
    }
}

fn list(xs: &[f64]) -> String {
    xs.iter().map(|x| n(*x)).collect::<Vec<_>>().join(", ")
}

/// (variable, Stan distribution, arguments) of a prior that is one Stan
/// statement (all but the normal-inverse-gamma pair). Written once, used for
/// the single statement and inside a mixture's `log_sum_exp`.
fn stan_statement(p: &Prior) -> Option<(&'static str, &'static str, String)> {
    Some(match p {
        Prior::BetaBinomial(b) => ("theta", "beta", format!("{}, {}", n(b.alpha), n(b.beta))),
        Prior::GammaPoisson(g) => ("lambda", "gamma", format!("{}, {}", n(g.alpha), n(g.beta))),
        Prior::GammaExponential(g) => ("lambda", "gamma", format!("{}, {}", n(g.alpha), n(g.beta))),
        Prior::NormalKnownVariance(k) => (
            "mu",
            "normal",
            format!("{}, {}", n(k.mu0), n(k.sigma / k.kappa0.sqrt())),
        ),
        Prior::DirichletMultinomial(d) => ("theta", "dirichlet", format!("[{}]'", list(&d.alpha))),
        Prior::InverseGammaVariance(v) => (
            "sigma2",
            "inv_gamma",
            format!("{}, {}", n(v.alpha), n(v.beta)),
        ),
        Prior::NormalInverseGamma(_) => return None,
    })
}

/// (variable, frozen scipy.stats distribution) of a prior that is one
/// distribution (all but the normal-inverse-gamma pair).
fn scipy_frozen(p: &Prior) -> Option<(&'static str, String)> {
    Some(match p {
        Prior::BetaBinomial(b) => (
            "theta",
            format!("stats.beta({}, {})", n(b.alpha), n(b.beta)),
        ),
        Prior::GammaPoisson(g) => (
            "lambda",
            format!("stats.gamma({}, scale={})", n(g.alpha), n(1.0 / g.beta)),
        ),
        Prior::GammaExponential(g) => (
            "lambda",
            format!("stats.gamma({}, scale={})", n(g.alpha), n(1.0 / g.beta)),
        ),
        Prior::NormalKnownVariance(k) => (
            "mu",
            format!(
                "stats.norm(loc={}, scale={})",
                n(k.mu0),
                n(k.sigma / k.kappa0.sqrt())
            ),
        ),
        Prior::DirichletMultinomial(d) => {
            ("theta", format!("stats.dirichlet([{}])", list(&d.alpha)))
        }
        Prior::InverseGammaVariance(v) => (
            "sigma2",
            format!("stats.invgamma({}, scale={})", n(v.alpha), n(v.beta)),
        ),
        Prior::NormalInverseGamma(_) => return None,
    })
}

/// The note a single statement carries, in the target's comment syntax.
fn note(p: &Prior, comment: &str) -> String {
    match p {
        Prior::GammaExponential(_) => format!("  {comment} mean time = 1 / lambda"),
        Prior::DirichletMultinomial(d) if comment == "//" => {
            format!("  // theta declared simplex[{}]", d.alpha.len())
        }
        _ => String::new(),
    }
}

/// A single conjugate prior.
pub fn single(p: &Prior, t: Target) -> String {
    use Prior as P;
    use Target as T;
    match (p, t) {
        (_, T::Json) => json_doc(p),
        (_, T::Stan) if let Some((var, dist, args)) = stan_statement(p) => {
            format!("{var} ~ {dist}({args});{}\n", note(p, "//"))
        }
        (_, T::Scipy) if let Some((var, expr)) = scipy_frozen(p) => {
            format!("{var}_prior = {expr}{}\n", note(p, "#"))
        }
        (P::BetaBinomial(b), _) => {
            let (a, bb) = (n(b.alpha), n(b.beta));
            match t {
                T::PyMC => format!("theta = pm.Beta(\"theta\", alpha={a}, beta={bb})\n"),
                T::NumPyro => format!("theta = numpyro.sample(\"theta\", dist.Beta({a}, {bb}))\n"),
                T::Jags => format!("theta ~ dbeta({a}, {bb})\n"),
                T::R => format!("dbeta(theta, shape1 = {a}, shape2 = {bb})\n"),
                T::Brms => {
                    format!("set_prior(\"beta({a}, {bb})\", class = \"b\", lb = 0, ub = 1)\n")
                }
                // Stan, scipy and JSON are written above from the shared pieces.
                T::Json | T::Stan | T::Scipy => unreachable!(),
            }
        }
        (P::GammaPoisson(g), _) => gamma_lines("lambda", g.alpha, g.beta, t, ""),
        (P::GammaExponential(g), _) => {
            gamma_lines("lambda", g.alpha, g.beta, t, "mean time = 1 / lambda")
        }
        (P::NormalKnownVariance(k), _) => {
            let sd = k.sigma / k.kappa0.sqrt();
            let (m, s, prec) = (n(k.mu0), n(sd), n(1.0 / (sd * sd)));
            match t {
                T::PyMC => format!("mu = pm.Normal(\"mu\", mu={m}, sigma={s})\n"),
                T::NumPyro => format!("mu = numpyro.sample(\"mu\", dist.Normal({m}, {s}))\n"),
                T::Jags => format!("mu ~ dnorm({m}, {prec})  # precision = 1 / sd^2\n"),
                T::R => format!("dnorm(mu, mean = {m}, sd = {s})\n"),
                T::Brms => format!("set_prior(\"normal({m}, {s})\", class = \"Intercept\")\n"),
                // Stan, scipy and JSON are written above from the shared pieces.
                T::Json | T::Stan | T::Scipy => unreachable!(),
            }
        }
        (P::NormalInverseGamma(g), _) => {
            let (m, k, a, b) = (n(g.mu0), n(g.kappa0), n(g.alpha0), n(g.beta0));
            match t {
                T::Stan => format!(
                    "sigma2 ~ inv_gamma({a}, {b});\nmu ~ normal({m}, sqrt(sigma2 / {k}));\n"
                ),
                T::PyMC => format!(
                    "sigma2 = pm.InverseGamma(\"sigma2\", alpha={a}, beta={b})\nmu = pm.Normal(\"mu\", mu={m}, sigma=pm.math.sqrt(sigma2 / {k}))\n"
                ),
                T::NumPyro => format!(
                    "sigma2 = numpyro.sample(\"sigma2\", dist.InverseGamma({a}, {b}))  # 2nd argument acts as the scale\nmu = numpyro.sample(\"mu\", dist.Normal({m}, jnp.sqrt(sigma2 / {k})))\n"
                ),
                T::Jags => format!(
                    "tau ~ dgamma({a}, {b})  # tau = 1 / sigma2, so sigma2 ~ InvGamma({a}, {b})\nsigma2 <- 1 / tau\nmu ~ dnorm({m}, {k} * tau)\n"
                ),
                T::R => format!(
                    "dgamma(1 / sigma2, shape = {a}, rate = {b}) / sigma2^2 * dnorm(mu, mean = {m}, sd = sqrt(sigma2 / {k}))\n"
                ),
                T::Brms => format!(
                    "c(set_prior(\"\", class = \"sigma\"), set_prior(\"\", class = \"Intercept\"),\n  set_prior(\"target += inv_gamma_lpdf(square(sigma) | {a}, {b}) + log(2 * sigma)\", check = FALSE),\n  set_prior(\"target += normal_lpdf(Intercept | {m}, sigma / sqrt({k}))\", check = FALSE))\n"
                ),
                T::Scipy => format!(
                    "sigma2_prior = stats.invgamma({a}, scale={b})\ndef mu_prior(sigma2):\n    return stats.norm(loc={m}, scale=np.sqrt(sigma2 / {k}))\n"
                ),
                T::Json => unreachable!(),
            }
        }
        (P::DirichletMultinomial(d), _) => {
            let (k, a) = (d.alpha.len(), list(&d.alpha));
            match t {
                T::PyMC => format!("theta = pm.Dirichlet(\"theta\", a=[{a}])\n"),
                T::NumPyro => {
                    format!("theta = numpyro.sample(\"theta\", dist.Dirichlet(jnp.array([{a}])))\n")
                }
                T::Jags => format!("theta[1:{k}] ~ ddirch(alpha[1:{k}])  # data: alpha = c({a})\n"),
                T::R => format!(
                    "alpha <- c({a})\nexp(lgamma(sum(alpha)) - sum(lgamma(alpha)) + sum((alpha - 1) * log(theta)))\n"
                ),
                T::Brms => format!(
                    "set_prior(\"dirichlet(c({a}))\", class = \"simo\")  # brms takes Dirichlet priors only on simplex classes\n"
                ),
                // Stan, scipy and JSON are written above from the shared pieces.
                T::Json | T::Stan | T::Scipy => unreachable!(),
            }
        }
        (P::InverseGammaVariance(v), _) => {
            let (a, b) = (n(v.alpha), n(v.beta));
            match t {
                T::PyMC => format!("sigma2 = pm.InverseGamma(\"sigma2\", alpha={a}, beta={b})\n"),
                T::NumPyro => format!(
                    "sigma2 = numpyro.sample(\"sigma2\", dist.InverseGamma({a}, {b}))  # 2nd argument acts as the scale\n"
                ),
                T::Jags => {
                    format!("tau ~ dgamma({a}, {b})  # tau = 1 / sigma2\nsigma2 <- 1 / tau\n")
                }
                T::R => format!("dgamma(1 / sigma2, shape = {a}, rate = {b}) / sigma2^2\n"),
                T::Brms => format!(
                    "c(set_prior(\"\", class = \"sigma\"),\n  set_prior(\"target += inv_gamma_lpdf(square(sigma) | {a}, {b}) + log(2 * sigma)\", check = FALSE))\n"
                ),
                // Stan, scipy and JSON are written above from the shared pieces.
                T::Json | T::Stan | T::Scipy => unreachable!(),
            }
        }
    }
}

fn gamma_lines(name: &str, a: f64, b: f64, t: Target, note: &str) -> String {
    let (a, bb) = (n(a), n(b));
    let c = |mark: &str| {
        if note.is_empty() {
            String::new()
        } else {
            format!("  {mark} {note}")
        }
    };
    match t {
        Target::PyMC => format!(
            "{name} = pm.Gamma(\"{name}\", alpha={a}, beta={bb}){}\n",
            c("#")
        ),
        Target::NumPyro => format!(
            "{name} = numpyro.sample(\"{name}\", dist.Gamma({a}, {bb})){}\n",
            c("#")
        ),
        Target::Jags => format!("{name} ~ dgamma({a}, {bb}){}\n", c("#")),
        Target::R => format!("dgamma({name}, shape = {a}, rate = {bb})\n"),
        Target::Brms => format!("set_prior(\"gamma({a}, {bb})\", class = \"b\", lb = 0)\n"),
        // Stan, scipy and JSON are written by `single` from the shared pieces.
        Target::Json | Target::Stan | Target::Scipy => unreachable!(),
    }
}

/// The JSON document: family, parameterisation in words, hyperparameters.
fn json_doc(p: &Prior) -> String {
    let mut h = serde_json::Map::new();
    for (k, v) in p.hyperparameters() {
        let v = match v {
            crate::family::Value::Number(x) => json!(x),
            crate::family::Value::List(xs) => json!(xs),
        };
        h.insert(k.to_owned(), v);
    }
    let param = match p {
        Prior::BetaBinomial(_) => "theta ~ Beta(alpha, beta)",
        Prior::GammaPoisson(_) | Prior::GammaExponential(_) => {
            "lambda ~ Gamma(shape = alpha, rate = beta)"
        }
        Prior::NormalKnownVariance(_) => "mu ~ Normal(mean = mu0, sd = sigma / sqrt(kappa0))",
        Prior::NormalInverseGamma(_) => {
            "sigma2 ~ InvGamma(shape = alpha0, scale = beta0); mu | sigma2 ~ Normal(mean = mu0, sd = sqrt(sigma2 / kappa0))"
        }
        Prior::DirichletMultinomial(_) => "theta ~ Dirichlet(alpha)",
        Prior::InverseGammaVariance(_) => "sigma2 ~ InvGamma(shape = alpha, scale = beta)",
    };
    let doc = json!({ "family": p.id(), "parameterisation": param, "hyperparameters": h });
    serde_json::to_string_pretty(&doc).unwrap_or_default() + "\n"
}

/// A mixture, where the target has a way to write one.
pub fn mixture(m: &Mixture, t: Target) -> Option<String> {
    let parts = m.components();
    let weights: Vec<f64> = parts.iter().map(|(w, _)| *w).collect();
    match t {
        Target::Jags | Target::Brms => None,
        Target::Json => {
            let comps: Vec<serde_json::Value> = parts
                .iter()
                .map(|(w, p)| {
                    let inner: serde_json::Value =
                        serde_json::from_str(&json_doc(p)).unwrap_or_default();
                    json!({ "weight": w, "prior": inner })
                })
                .collect();
            Some(
                serde_json::to_string_pretty(&json!({ "family": m.id(), "mixture": comps }))
                    .unwrap_or_default()
                    + "\n",
            )
        }
        Target::Scipy => {
            let mut s = String::from("# mixture prior: weights and components\n");
            s.push_str(&format!("weights = [{}]\n", list(&weights)));
            s.push_str("components = [\n");
            for (_, p) in parts {
                let (_, expr) = scipy_frozen(p)?;
                s.push_str(&format!("    {expr},\n"));
            }
            s.push_str("]\ndef prior_pdf(x):\n    return sum(w * c.pdf(x) for w, c in zip(weights, components))\n");
            Some(s)
        }
        Target::R => {
            let terms: Vec<String> = parts
                .iter()
                .map(|(w, p)| format!("{} * {}", n(*w), single(p, Target::R).trim()))
                .collect();
            Some(terms.join(" +\n  ") + "\n")
        }
        Target::Stan => {
            // target += log_sum_exp over components of log(w) + lpdf.
            let lp: Vec<String> = parts
                .iter()
                .map(|(w, p)| {
                    let (var, dist, args) = stan_statement(p)?;
                    Some(format!("log({}) + {dist}_lpdf({var} | {args})", n(*w)))
                })
                .collect::<Option<_>>()?;
            Some(format!(
                "target += log_sum_exp({{{}}});\n",
                lp.join(",\n    ")
            ))
        }
        Target::PyMC | Target::NumPyro => {
            let (name, ctor): (&str, fn(&Prior) -> Option<String>) = match parts[0].1 {
                Prior::BetaBinomial(_) => ("theta", |p| match p {
                    Prior::BetaBinomial(b) => Some(format!("{}, {}", n(b.alpha), n(b.beta))),
                    _ => None,
                }),
                Prior::GammaPoisson(_) | Prior::GammaExponential(_) => ("lambda", |p| match p {
                    Prior::GammaPoisson(g) => Some(format!("{}, {}", n(g.alpha), n(g.beta))),
                    Prior::GammaExponential(g) => Some(format!("{}, {}", n(g.alpha), n(g.beta))),
                    _ => None,
                }),
                _ => return None,
            };
            let args: Vec<String> = parts.iter().map(|(_, p)| ctor(p)).collect::<Option<_>>()?;
            let family = if name == "theta" { "Beta" } else { "Gamma" };
            Some(match t {
                Target::PyMC => {
                    // PyMC names both Beta and Gamma arguments alpha and beta.
                    let (kw1, kw2) = ("alpha", "beta");
                    let comps: Vec<String> = args
                        .iter()
                        .map(|a| {
                            let (x, y) = a.split_once(", ").unwrap_or((a, ""));
                            format!("pm.{family}.dist({kw1}={x}, {kw2}={y})")
                        })
                        .collect();
                    format!(
                        "{name} = pm.Mixture(\"{name}\", w=[{}], comp_dists=[{}])\n",
                        list(&weights),
                        comps.join(", ")
                    )
                }
                _ => {
                    let (xs, ys): (Vec<&str>, Vec<&str>) = args
                        .iter()
                        .map(|a| a.split_once(", ").unwrap_or((a, "")))
                        .unzip();
                    format!(
                        "{name} = numpyro.sample(\"{name}\", dist.MixtureSameFamily(dist.Categorical(probs=jnp.array([{}])), dist.{family}(jnp.array([{}]), jnp.array([{}]))))\n",
                        list(&weights),
                        xs.join(", "),
                        ys.join(", ")
                    )
                }
            })
        }
    }
}
