//! One prior of any family, chosen at run time (the command line and the
//! project file name families by id), and its data.

use super::keys::{self, Keys};
use super::*;
use crate::error::{Error, Result};

/// The family ids, in the order the help lists them.
pub const FAMILY_IDS: [&str; 7] = [
    BetaBinomial::ID,
    GammaPoisson::ID,
    GammaExponential::ID,
    NormalKnownVariance::ID,
    NormalInverseGamma::ID,
    DirichletMultinomial::ID,
    InverseGammaVariance::ID,
];

/// A prior of one of the seven families.
///
/// Serialised externally tagged, `BetaBinomial((alpha: 2.0, beta: 8.0))` in RON,
/// which every serde format reads back.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub enum Prior {
    /// θ ~ Beta.
    BetaBinomial(BetaBinomial),
    /// λ ~ Gamma, Poisson counts.
    GammaPoisson(GammaPoisson),
    /// λ ~ Gamma, exponential times.
    GammaExponential(GammaExponential),
    /// μ ~ Normal, σ known.
    NormalKnownVariance(NormalKnownVariance),
    /// (μ, σ²) ~ Normal-inverse-gamma.
    NormalInverseGamma(NormalInverseGamma),
    /// θ ~ Dirichlet.
    DirichletMultinomial(DirichletMultinomial),
    /// σ² ~ InvGamma, μ known.
    InverseGammaVariance(InverseGammaVariance),
}

/// Observed data for a prior of the matching family.
#[derive(Clone, Debug, PartialEq, serde::Serialize, serde::Deserialize)]
pub enum Data {
    /// Successes in trials.
    BetaBinomial(Trials),
    /// Events in exposure.
    GammaPoisson(EventCounts),
    /// Failures in time on test.
    GammaExponential(LifeTest),
    /// n values with their mean.
    NormalKnownVariance(MeanStats),
    /// n values with mean and variance.
    NormalInverseGamma(NormalSample),
    /// Counts per category.
    DirichletMultinomial(Counts),
    /// n values with their squares about the known mean.
    InverseGammaVariance(SquaresAboutMean),
}

/// Runs `$body` with `$p` bound to the family struct inside a [`Prior`].
macro_rules! each {
    ($prior:expr, $p:ident => $body:expr) => {
        match $prior {
            Prior::BetaBinomial($p) => $body,
            Prior::GammaPoisson($p) => $body,
            Prior::GammaExponential($p) => $body,
            Prior::NormalKnownVariance($p) => $body,
            Prior::NormalInverseGamma($p) => $body,
            Prior::DirichletMultinomial($p) => $body,
            Prior::InverseGammaVariance($p) => $body,
        }
    };
}

/// Runs `$body` for a prior and data of the same family, or errors.
macro_rules! with_data {
    ($prior:expr, $data:expr, $p:ident, $d:ident => $body:expr) => {
        match ($prior, $data) {
            (Prior::BetaBinomial($p), Data::BetaBinomial($d)) => $body,
            (Prior::GammaPoisson($p), Data::GammaPoisson($d)) => $body,
            (Prior::GammaExponential($p), Data::GammaExponential($d)) => $body,
            (Prior::NormalKnownVariance($p), Data::NormalKnownVariance($d)) => $body,
            (Prior::NormalInverseGamma($p), Data::NormalInverseGamma($d)) => $body,
            (Prior::DirichletMultinomial($p), Data::DirichletMultinomial($d)) => {
                $p.check_data($d)?;
                $body
            }
            (Prior::InverseGammaVariance($p), Data::InverseGammaVariance($d)) => $body,
            (p, _) => {
                return Err(Error::Rule(format!(
                    "the data are not for the {} family",
                    p.id()
                )));
            }
        }
    };
}

/// Prior keys accepted per family: conventional, or pseudo-observations.
fn prior_keys(family: &str) -> Option<(&'static [&'static str], &'static str)> {
    Some(match family {
        "beta-binomial" | "gamma-poisson" | "gamma-exponential" => (
            &["alpha", "beta", "mean", "ess"],
            "alpha,beta (or mean,ess)",
        ),
        "normal-known-variance" => (
            &["mu0", "kappa0", "sigma", "mean", "ess"],
            "mu0,kappa0,sigma (or mean,ess,sigma)",
        ),
        "normal-inverse-gamma" => (
            &[
                "mu0",
                "kappa0",
                "alpha0",
                "beta0",
                "mean",
                "ess",
                "variance",
                "variance_ess",
            ],
            "mu0,kappa0,alpha0,beta0 (or mean,ess,variance,variance_ess)",
        ),
        "dirichlet-multinomial" => (
            &["alpha", "mean", "ess", "names"],
            "alpha=a1;a2;… (or mean=s1;s2;…,ess; optional names=n1;n2;…)",
        ),
        "inverse-gamma-variance" => (
            &["alpha", "beta", "mu", "mean", "ess"],
            "alpha,beta (or mean,ess), optional mu",
        ),
        _ => return None,
    })
}

/// A prior given either way: conventional keys, or pseudo-observations.
fn either(keys: &Keys, conventional: &[&str], pseudo: &[&str]) -> Result<bool> {
    let conv = conventional.iter().any(|k| keys.has(k));
    let pse = pseudo.iter().any(|k| keys.has(k));
    if conv && pse {
        return Err(Error::Rule(format!(
            "{}: give either {} or {}, not both",
            keys.context(),
            conventional.join(","),
            pseudo.join(",")
        )));
    }
    Ok(pse)
}

impl Prior {
    /// Parses `--prior` text for `family`.
    pub fn parse(family: &str, text: &str) -> Result<Self> {
        let Some((expected, needed)) = prior_keys(family) else {
            return Err(Error::UnknownFamily {
                given: family.to_owned(),
                known: FAMILY_IDS.join(", "),
            });
        };
        let k = Keys::parse(text, &format!("--prior for {family}"), expected)?;
        let num = |key: &str| k.required(key, needed);
        Ok(match family {
            "beta-binomial" | "gamma-poisson" | "gamma-exponential" => {
                let pseudo = either(&k, &["alpha", "beta"], &["mean", "ess"])?;
                let (a, b) = if pseudo {
                    (num("mean")?, num("ess")?)
                } else {
                    (num("alpha")?, num("beta")?)
                };
                match (family, pseudo) {
                    ("beta-binomial", false) => Self::BetaBinomial(BetaBinomial::new(a, b)?),
                    ("beta-binomial", true) => {
                        Self::BetaBinomial(BetaBinomial::from_mean_ess(a, b)?)
                    }
                    ("gamma-poisson", false) => Self::GammaPoisson(GammaPoisson::new(a, b)?),
                    ("gamma-poisson", true) => {
                        Self::GammaPoisson(GammaPoisson::from_mean_ess(a, b)?)
                    }
                    (_, false) => Self::GammaExponential(GammaExponential::new(a, b)?),
                    (_, true) => Self::GammaExponential(GammaExponential::from_mean_ess(a, b)?),
                }
            }
            "normal-known-variance" => {
                let pseudo = either(&k, &["mu0", "kappa0"], &["mean", "ess"])?;
                let sigma = num("sigma")?;
                let (m, n) = if pseudo {
                    (num("mean")?, num("ess")?)
                } else {
                    (num("mu0")?, num("kappa0")?)
                };
                Self::NormalKnownVariance(NormalKnownVariance::new(m, n, sigma)?)
            }
            "normal-inverse-gamma" => {
                let pseudo = either(
                    &k,
                    &["mu0", "kappa0", "alpha0", "beta0"],
                    &["mean", "ess", "variance", "variance_ess"],
                )?;
                Self::NormalInverseGamma(if pseudo {
                    NormalInverseGamma::from_pseudo(
                        num("mean")?,
                        num("ess")?,
                        num("variance")?,
                        num("variance_ess")?,
                    )?
                } else {
                    NormalInverseGamma::new(
                        num("mu0")?,
                        num("kappa0")?,
                        num("alpha0")?,
                        num("beta0")?,
                    )?
                })
            }
            "dirichlet-multinomial" => {
                let pseudo = either(&k, &["alpha"], &["mean", "ess"])?;
                let names = k.names("names");
                Self::DirichletMultinomial(if pseudo {
                    DirichletMultinomial::from_mean_ess(
                        &k.numbers("mean", needed)?,
                        num("ess")?,
                        names,
                    )?
                } else {
                    DirichletMultinomial::new(k.numbers("alpha", needed)?, names)?
                })
            }
            _ => {
                let pseudo = either(&k, &["alpha", "beta"], &["mean", "ess"])?;
                let mu = k.number("mu")?;
                Self::InverseGammaVariance(if pseudo {
                    InverseGammaVariance::from_mean_ess(num("mean")?, num("ess")?, mu)?
                } else {
                    InverseGammaVariance::new(num("alpha")?, num("beta")?, mu)?
                })
            }
        })
    }

    /// Parses `--data` text for this prior's family.
    pub fn parse_data(&self, text: &str) -> Result<Data> {
        let ctx = format!("--data for {}", self.id());
        Ok(match self {
            Self::BetaBinomial(_) => {
                let need = "successes,trials";
                let k = Keys::parse(text, &ctx, &["successes", "trials"])?;
                Data::BetaBinomial(Trials::observed(
                    k.required("successes", need)?,
                    k.required("trials", need)?,
                )?)
            }
            Self::GammaPoisson(_) => {
                let need = "events,exposure";
                let k = Keys::parse(text, &ctx, &["events", "exposure"])?;
                Data::GammaPoisson(EventCounts::observed(
                    k.required("events", need)?,
                    k.required("exposure", need)?,
                )?)
            }
            Self::GammaExponential(_) => {
                let need = "failures,time";
                let k = Keys::parse(text, &ctx, &["failures", "time"])?;
                Data::GammaExponential(LifeTest::observed(
                    k.required("failures", need)?,
                    k.required("time", need)?,
                )?)
            }
            Self::NormalKnownVariance(_) => {
                let need = "n,mean (optional variance)";
                let k = Keys::parse(text, &ctx, &["n", "mean", "variance"])?;
                Data::NormalKnownVariance(MeanStats::observed(
                    k.required("n", need)?,
                    k.required("mean", need)?,
                    k.number("variance")?,
                )?)
            }
            Self::NormalInverseGamma(_) => {
                let need = "n,mean,variance";
                let k = Keys::parse(text, &ctx, &["n", "mean", "variance"])?;
                Data::NormalInverseGamma(NormalSample::observed(
                    k.required("n", need)?,
                    k.required("mean", need)?,
                    k.number("variance")?,
                )?)
            }
            Self::DirichletMultinomial(p) => {
                let k = Keys::parse(text, &ctx, &["counts"])?;
                let d = Counts::observed(k.numbers("counts", "counts=c1;c2;…")?)?;
                p.check_data(&d)?;
                Data::DirichletMultinomial(d)
            }
            Self::InverseGammaVariance(_) => {
                let need = "n,ss";
                let k = Keys::parse(text, &ctx, &["n", "ss"])?;
                Data::InverseGammaVariance(SquaresAboutMean::observed(
                    k.required("n", need)?,
                    k.required("ss", need)?,
                )?)
            }
        })
    }

    /// Parses `--future` text for this prior's family.
    pub fn parse_future(&self, text: &str) -> Result<Future> {
        let ctx = format!("--future for {}", self.id());
        let whole = |k: &Keys, key: &str, need: &str| -> Result<u64> {
            let v = crate::error::count(key, k.required(key, need)?)?;
            if v < 1.0 {
                return Err(Error::invalid(
                    key,
                    v,
                    "it must be a whole number, 1 or more",
                ));
            }
            Ok(v as u64)
        };
        Ok(match self {
            Self::BetaBinomial(_) => {
                let k = Keys::parse(text, &ctx, &["trials"])?;
                Future::Trials(whole(&k, "trials", "trials=m")?)
            }
            Self::GammaPoisson(_) => {
                let k = Keys::parse(text, &ctx, &["exposure"])?;
                Future::Exposure(keys::positive(&k, "exposure", "exposure=t")?)
            }
            Self::GammaExponential(_) => {
                let k = Keys::parse(text, &ctx, &["n", "time"])?;
                match (k.has("n"), k.has("time")) {
                    (true, false) => {
                        let n = whole(&k, "n", "n=1 or time=T")?;
                        if n != 1 {
                            return Err(Error::invalid(
                                "n",
                                n as f64,
                                "gamma-exponential predicts one waiting time: n=1",
                            ));
                        }
                        Future::Values(1)
                    }
                    (false, true) => Future::Time(keys::positive(&k, "time", "n=1 or time=T")?),
                    _ => {
                        return Err(Error::Rule(format!(
                            "{ctx}: give exactly one of n=1 or time=T"
                        )));
                    }
                }
            }
            Self::NormalKnownVariance(_) | Self::NormalInverseGamma(_) => {
                let k = Keys::parse(text, &ctx, &["n"])?;
                Future::Values(whole(&k, "n", "n=m")?)
            }
            Self::DirichletMultinomial(_) => {
                let k = Keys::parse(text, &ctx, &["n"])?;
                Future::Trials(whole(&k, "n", "n=m")?)
            }
            Self::InverseGammaVariance(_) => {
                let k = Keys::parse(text, &ctx, &["n"])?;
                let n = whole(&k, "n", "n=1")?;
                if n != 1 {
                    return Err(Error::invalid(
                        "n",
                        n as f64,
                        "inverse-gamma-variance predicts one value: n=1",
                    ));
                }
                Future::Values(1)
            }
        })
    }

    /// The family id.
    pub fn id(&self) -> &'static str {
        match self {
            Self::BetaBinomial(_) => BetaBinomial::ID,
            Self::GammaPoisson(_) => GammaPoisson::ID,
            Self::GammaExponential(_) => GammaExponential::ID,
            Self::NormalKnownVariance(_) => NormalKnownVariance::ID,
            Self::NormalInverseGamma(_) => NormalInverseGamma::ID,
            Self::DirichletMultinomial(_) => DirichletMultinomial::ID,
            Self::InverseGammaVariance(_) => InverseGammaVariance::ID,
        }
    }

    /// Marginals of the unknowns.
    pub fn marginals(&self) -> Vec<Marginal> {
        each!(self, p => p.marginals())
    }

    /// Hyperparameters, conventional form.
    pub fn hyperparameters(&self) -> Vec<(&'static str, Value)> {
        each!(self, p => p.hyperparameters())
    }

    /// The prior as `key=value` text that [`Prior::parse`] reads back to
    /// the same prior (numbers in shortest round-trip form): for editing.
    pub fn to_keys(&self) -> String {
        let mut parts: Vec<String> = self
            .hyperparameters()
            .into_iter()
            .map(|(k, v)| match v {
                Value::Number(x) => format!("{k}={x}"),
                Value::List(xs) => format!(
                    "{k}={}",
                    xs.iter().map(f64::to_string).collect::<Vec<_>>().join(";")
                ),
            })
            .collect();
        // Known quantities the parser also needs.
        match self {
            Self::NormalKnownVariance(p) if !parts.iter().any(|s| s.starts_with("sigma=")) => {
                parts.push(format!("sigma={}", p.sigma));
            }
            Self::InverseGammaVariance(p) if !parts.iter().any(|s| s.starts_with("mu=")) => {
                if let Some(mu) = p.mu {
                    parts.push(format!("mu={mu}"));
                }
            }
            _ => {}
        }
        parts.join(",")
    }

    /// Pseudo-observation view.
    pub fn pseudo_observations(&self) -> Vec<(&'static str, Value)> {
        each!(self, p => p.pseudo_observations())
    }

    /// What the prior amounts to, in one sentence.
    pub fn as_if(&self) -> String {
        each!(self, p => p.as_if())
    }

    /// Predictive distribution for a future sample.
    pub fn predictive(&self, future: &Future) -> Result<Predictive> {
        each!(self, p => p.predictive(future))
    }

    /// Posterior after `data`.
    pub fn update(&self, data: &Data) -> Result<Prior> {
        Ok(with_data!(self, data, p, d => Prior::from(p.update(d)?)))
    }

    /// ln p(data | prior).
    pub fn ln_marginal_likelihood(&self, data: &Data) -> Result<f64> {
        Ok(with_data!(self, data, p, d => p.ln_marginal_likelihood(d)))
    }

    /// Power prior: updated by historical data scaled by a0 ∈ (0, 1].
    pub fn with_history(&self, history: &Data, a0: f64) -> Result<Prior> {
        Ok(with_data!(self, history, p, d => Prior::from(p.with_history(d, a0)?)))
    }

    /// Prior's share of the posterior information.
    pub fn prior_share(&self, data: &Data) -> Result<f64> {
        Ok(with_data!(self, data, p, d => p.prior_share(d)))
    }

    /// Prior–data conflict check, where the family has one.
    pub fn conflict(&self, data: &Data) -> Result<Option<Conflict>> {
        Ok(with_data!(self, data, p, d => p.conflict(d)))
    }
}

macro_rules! from_family {
    ($($t:ident),*) => {$(
        impl From<$t> for Prior {
            fn from(p: $t) -> Self {
                Prior::$t(p)
            }
        }
    )*};
}
from_family!(
    BetaBinomial,
    GammaPoisson,
    GammaExponential,
    NormalKnownVariance,
    NormalInverseGamma,
    DirichletMultinomial,
    InverseGammaVariance
);

/// Collects the family structs of one variant, or errors on a mixed list.
macro_rules! pool_as {
    ($parts:expr, $variant:ident) => {{
        let mut same = Vec::new();
        for (w, p) in $parts {
            match p {
                Prior::$variant(x) => same.push((*w, x.clone())),
                other => {
                    return Err(Error::Rule(format!(
                        "all priors in a pool must be of one family; found {} beside {}",
                        other.id(),
                        $parts[0].1.id()
                    )));
                }
            }
        }
        Prior::from(Conjugate::log_pool(&same)?)
    }};
}

impl Prior {
    /// The logarithmic pool of same-family priors (weights summing to 1):
    /// again one conjugate prior.
    pub fn log_pool(parts: &[(f64, Prior)]) -> Result<Prior> {
        let Some((_, first)) = parts.first() else {
            return Err(Error::Rule("a pool needs at least one prior".to_owned()));
        };
        Ok(match first {
            Prior::BetaBinomial(_) => pool_as!(parts, BetaBinomial),
            Prior::GammaPoisson(_) => pool_as!(parts, GammaPoisson),
            Prior::GammaExponential(_) => pool_as!(parts, GammaExponential),
            Prior::NormalKnownVariance(_) => pool_as!(parts, NormalKnownVariance),
            Prior::NormalInverseGamma(_) => pool_as!(parts, NormalInverseGamma),
            Prior::DirichletMultinomial(_) => pool_as!(parts, DirichletMultinomial),
            Prior::InverseGammaVariance(_) => pool_as!(parts, InverseGammaVariance),
        })
    }
}

impl Prior {
    /// A weakly informative prior of the same family: the same prior mean of
    /// the data-scale quantity (and the same spread guess), worth one
    /// observation in the family's own units (one trial, one unit of
    /// exposure, one failure, one value, one draw). Used as the robust
    /// component of a mixture.
    pub fn unit_information(&self) -> Result<Prior> {
        Ok(match self {
            Self::BetaBinomial(p) => Self::BetaBinomial(BetaBinomial::from_mean_ess(
                p.alpha / (p.alpha + p.beta),
                1.0,
            )?),
            Self::GammaPoisson(p) => {
                Self::GammaPoisson(GammaPoisson::from_mean_ess(p.alpha / p.beta, 1.0)?)
            }
            Self::GammaExponential(p) => {
                Self::GammaExponential(GammaExponential::from_mean_ess(p.beta / p.alpha, 1.0)?)
            }
            Self::NormalKnownVariance(p) => {
                Self::NormalKnownVariance(NormalKnownVariance::new(p.mu0, 1.0, p.sigma)?)
            }
            Self::NormalInverseGamma(p) => Self::NormalInverseGamma(
                NormalInverseGamma::from_pseudo(p.mu0, 1.0, p.beta0 / p.alpha0, 1.0)?,
            ),
            Self::DirichletMultinomial(p) => {
                let total = p.total();
                let shares: Vec<f64> = p.alpha.iter().map(|a| a / total).collect();
                let mut q = DirichletMultinomial::new(shares.clone(), p.names.clone())?;
                q.alpha = shares;
                Self::DirichletMultinomial(q)
            }
            Self::InverseGammaVariance(p) => Self::InverseGammaVariance(
                InverseGammaVariance::from_mean_ess(p.beta / p.alpha, 1.0, p.mu)?,
            ),
        })
    }
}

impl Prior {
    /// Checks the hyperparameters through the family's constructor (values
    /// read from a file bypass it).
    pub fn validate(&self) -> Result<()> {
        match self {
            Self::BetaBinomial(p) => BetaBinomial::new(p.alpha, p.beta).map(drop),
            Self::GammaPoisson(p) => GammaPoisson::new(p.alpha, p.beta).map(drop),
            Self::GammaExponential(p) => GammaExponential::new(p.alpha, p.beta).map(drop),
            Self::NormalKnownVariance(p) => {
                NormalKnownVariance::new(p.mu0, p.kappa0, p.sigma).map(drop)
            }
            Self::NormalInverseGamma(p) => {
                NormalInverseGamma::new(p.mu0, p.kappa0, p.alpha0, p.beta0).map(drop)
            }
            Self::DirichletMultinomial(p) => {
                DirichletMultinomial::new(p.alpha.clone(), p.names.clone()).map(drop)
            }
            Self::InverseGammaVariance(p) => {
                InverseGammaVariance::new(p.alpha, p.beta, p.mu).map(drop)
            }
        }
    }
}

impl Data {
    /// Checks the statistics through the constructors (whole counts, successes ≤ trials, …).
    pub fn validate(&self) -> Result<()> {
        match self {
            Self::BetaBinomial(d) => Trials::observed(d.successes, d.trials).map(drop),
            Self::GammaPoisson(d) => EventCounts::observed(d.events, d.exposure).map(drop),
            Self::GammaExponential(d) => LifeTest::observed(d.failures, d.time).map(drop),
            Self::NormalKnownVariance(d) => MeanStats::observed(d.n, d.mean, d.variance).map(drop),
            Self::NormalInverseGamma(d) => {
                NormalSample::observed(d.n, d.mean, Some(d.variance)).map(drop)
            }
            Self::DirichletMultinomial(d) => Counts::observed(d.counts.clone()).map(drop),
            Self::InverseGammaVariance(d) => SquaresAboutMean::observed(d.n, d.ss).map(drop),
        }
    }
}
