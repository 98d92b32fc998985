//! Two dials per prior, for setting it by hand: where the imaginary data sit
//! (the centre) and how many there are (the effective sample size).
//!
//! The desktop app draws the centre and the upper 95% point of one marginal as
//! handles on its density; dragging the centre keeps the ESS, dragging the 95%
//! point solves for the ESS that puts it there with the centre kept. The same
//! functions serve the numeric fields beside the plot, so the handles and the
//! fields can never disagree.

use crate::error::{Error, Result};
use crate::family::{
    BetaBinomial, DirichletMultinomial, GammaExponential, GammaPoisson, InverseGammaVariance,
    NormalInverseGamma, NormalKnownVariance, Prior,
};

/// Which pair of dials.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
pub enum Dial {
    /// The family's main unknown (for normal-inverse-gamma: the mean μ).
    #[default]
    Main,
    /// Normal-inverse-gamma's variance σ²: the variance guess and its ESS.
    Variance,
    /// One share of a dirichlet-multinomial prior, with the total ESS.
    Share(usize),
}

/// The dials' current values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Setting {
    /// Where the imaginary data sit, on the dial's marginal's scale.
    pub centre: f64,
    /// How many imaginary observations.
    pub ess: f64,
}

/// The dials that exist for a prior (Main always; Variance or one Share per category).
pub fn available(prior: &Prior) -> Vec<Dial> {
    match prior {
        Prior::NormalInverseGamma(_) => vec![Dial::Main, Dial::Variance],
        Prior::DirichletMultinomial(p) => (0..p.alpha.len()).map(Dial::Share).collect(),
        _ => vec![Dial::Main],
    }
}

/// The dial a prior starts on.
pub fn first(prior: &Prior) -> Dial {
    available(prior)[0]
}

/// Which entry of [`Prior::marginals`] the dial's handles sit on.
pub fn marginal_index(prior: &Prior, dial: Dial) -> usize {
    match (prior, dial) {
        (Prior::NormalInverseGamma(_), Dial::Variance) => 1,
        (Prior::DirichletMultinomial(p), Dial::Share(i)) => i.min(p.alpha.len() - 1),
        _ => 0,
    }
}

/// What the centre and the ESS mean for this prior, in words (for labels and tooltips).
pub fn meaning(prior: &Prior, dial: Dial) -> (&'static str, &'static str) {
    match (prior, dial) {
        (Prior::BetaBinomial(_), _) => ("prior mean of θ", "imaginary trials"),
        (Prior::GammaPoisson(_), _) => ("prior mean rate λ", "imaginary units of exposure"),
        (Prior::GammaExponential(_), _) => ("prior mean rate λ", "imaginary failures"),
        (Prior::NormalKnownVariance(_), _) => ("prior mean μ", "imaginary values"),
        (Prior::NormalInverseGamma(_), Dial::Variance) => (
            "variance guess σ² (β0/α0)",
            "imaginary values behind the variance guess",
        ),
        (Prior::NormalInverseGamma(_), _) => ("prior mean μ", "imaginary values behind the mean"),
        (Prior::DirichletMultinomial(_), _) => ("prior mean share", "imaginary draws in all"),
        (Prior::InverseGammaVariance(_), _) => ("variance guess σ² (β/α)", "imaginary values"),
    }
}

/// The dials' values.
pub fn setting(prior: &Prior, dial: Dial) -> Setting {
    let (centre, ess) = match (prior, dial) {
        (Prior::BetaBinomial(p), _) => (p.alpha / (p.alpha + p.beta), p.alpha + p.beta),
        (Prior::GammaPoisson(p), _) => (p.alpha / p.beta, p.beta),
        (Prior::GammaExponential(p), _) => (p.alpha / p.beta, p.alpha),
        (Prior::NormalKnownVariance(p), _) => (p.mu0, p.kappa0),
        (Prior::NormalInverseGamma(p), Dial::Variance) => (p.beta0 / p.alpha0, 2.0 * p.alpha0),
        (Prior::NormalInverseGamma(p), _) => (p.mu0, p.kappa0),
        (Prior::DirichletMultinomial(p), d) => {
            let i = share_index(p, d);
            (p.alpha[i] / p.total(), p.total())
        }
        (Prior::InverseGammaVariance(p), _) => (p.beta / p.alpha, 2.0 * p.alpha),
    };
    Setting { centre, ess }
}

fn share_index(p: &DirichletMultinomial, dial: Dial) -> usize {
    match dial {
        Dial::Share(i) => i.min(p.alpha.len() - 1),
        _ => 0,
    }
}

/// The centre's open range: (0, 1) for a probability or share, (0, ∞) for a
/// rate or variance, the whole line for a mean.
pub fn centre_range(prior: &Prior, dial: Dial) -> (f64, f64) {
    match (prior, dial) {
        (Prior::BetaBinomial(_) | Prior::DirichletMultinomial(_), _) => (0.0, 1.0),
        (Prior::NormalKnownVariance(_) | Prior::NormalInverseGamma(_), Dial::Main) => {
            (f64::NEG_INFINITY, f64::INFINITY)
        }
        _ => (0.0, f64::INFINITY),
    }
}

/// ESS bounds: a dial cannot make a prior improper or a point mass.
pub const ESS_RANGE: (f64, f64) = (1e-3, 1e7);

/// The prior with the dials at `setting`; what the dials do not cover (a known
/// σ or μ, the other unknown's dials, the other shares' proportions, category
/// names) is kept. Errors name the dial and the rule.
pub fn with_setting(prior: &Prior, dial: Dial, setting: Setting) -> Result<Prior> {
    let Setting { centre: m, ess: n } = setting;
    let (lo, hi) = centre_range(prior, dial);
    let (centre_name, ess_name) = meaning(prior, dial);
    if !(m.is_finite() && m > lo && m < hi) {
        return Err(Error::invalid(centre_name, m, &range_words(lo, hi)));
    }
    if !(n.is_finite() && n >= ESS_RANGE.0 && n <= ESS_RANGE.1) {
        return Err(Error::invalid(
            ess_name,
            n,
            &format!("it must lie in [{}, {}]", ESS_RANGE.0, ESS_RANGE.1),
        ));
    }
    Ok(match (prior, dial) {
        (Prior::BetaBinomial(_), _) => {
            Prior::BetaBinomial(BetaBinomial::new(m * n, (1.0 - m) * n)?)
        }
        (Prior::GammaPoisson(_), _) => Prior::GammaPoisson(GammaPoisson::new(m * n, n)?),
        (Prior::GammaExponential(_), _) => {
            Prior::GammaExponential(GammaExponential::new(n, n / m)?)
        }
        (Prior::NormalKnownVariance(p), _) => {
            Prior::NormalKnownVariance(NormalKnownVariance::new(m, n, p.sigma)?)
        }
        (Prior::NormalInverseGamma(p), Dial::Variance) => Prior::NormalInverseGamma(
            NormalInverseGamma::new(p.mu0, p.kappa0, n / 2.0, m * n / 2.0)?,
        ),
        (Prior::NormalInverseGamma(p), _) => {
            Prior::NormalInverseGamma(NormalInverseGamma::new(m, n, p.alpha0, p.beta0)?)
        }
        (Prior::DirichletMultinomial(p), d) => {
            let i = share_index(p, d);
            let others: f64 = p.total() - p.alpha[i];
            let alpha = p
                .alpha
                .iter()
                .enumerate()
                .map(|(k, a)| {
                    if k == i {
                        m * n
                    } else {
                        a / others * (1.0 - m) * n
                    }
                })
                .collect();
            Prior::DirichletMultinomial(DirichletMultinomial::new(alpha, p.names.clone())?)
        }
        (Prior::InverseGammaVariance(p), _) => {
            Prior::InverseGammaVariance(InverseGammaVariance::new(n / 2.0, m * n / 2.0, p.mu)?)
        }
    })
}

/// The prior with every pseudo-observation count multiplied by `factor`
/// and every centre kept: each dial's ESS becomes `factor` times its value
/// (for normal-inverse-gamma both the mean's and the variance's). This is
/// the ESS scaling of the sensitivity sweep.
pub fn scaled(prior: &Prior, factor: f64) -> Result<Prior> {
    if !(factor.is_finite() && factor > 0.0) {
        return Err(Error::invalid(
            "ESS factor",
            factor,
            "it must be a positive number",
        ));
    }
    let c = factor;
    Ok(match prior {
        Prior::BetaBinomial(p) => Prior::BetaBinomial(BetaBinomial::new(c * p.alpha, c * p.beta)?),
        Prior::GammaPoisson(p) => Prior::GammaPoisson(GammaPoisson::new(c * p.alpha, c * p.beta)?),
        Prior::GammaExponential(p) => {
            Prior::GammaExponential(GammaExponential::new(c * p.alpha, c * p.beta)?)
        }
        Prior::NormalKnownVariance(p) => {
            Prior::NormalKnownVariance(NormalKnownVariance::new(p.mu0, c * p.kappa0, p.sigma)?)
        }
        Prior::NormalInverseGamma(p) => Prior::NormalInverseGamma(NormalInverseGamma::new(
            p.mu0,
            c * p.kappa0,
            c * p.alpha0,
            c * p.beta0,
        )?),
        Prior::DirichletMultinomial(p) => Prior::DirichletMultinomial(DirichletMultinomial::new(
            p.alpha.iter().map(|a| c * a).collect(),
            p.names.clone(),
        )?),
        Prior::InverseGammaVariance(p) => {
            Prior::InverseGammaVariance(InverseGammaVariance::new(c * p.alpha, c * p.beta, p.mu)?)
        }
    })
}

fn range_words(lo: f64, hi: f64) -> String {
    match (lo.is_finite(), hi.is_finite()) {
        (true, true) => format!("it must lie strictly between {lo} and {hi}"),
        (true, false) => format!("it must be more than {lo}"),
        _ => "it must be a finite number".to_owned(),
    }
}

/// The probability whose quantile the spread handle sits at.
pub const SPREAD_POINT: f64 = 0.95;

/// Where the spread handle sits: the dial's marginal's 95% point.
pub fn spread_point(prior: &Prior, dial: Dial) -> f64 {
    let i = marginal_index(prior, dial);
    prior.marginals()[i].distribution.quantile(SPREAD_POINT)
}

/// The ESS that puts the 95% point at `x` with the centre kept; `x` outside
/// what any allowed ESS reaches gives the nearest bound. Errors if `x` is not
/// above the centre.
pub fn ess_for_spread_point(prior: &Prior, dial: Dial, x: f64) -> Result<f64> {
    let s = setting(prior, dial);
    if !(x.is_finite() && x > s.centre) {
        return Err(Error::invalid(
            "95% point",
            x,
            "it must lie above the centre of the prior",
        ));
    }
    // The 95% point falls as the ESS grows and the prior tightens about the
    // centre, but only from the current ESS on up: at a tiny ESS a gamma or
    // beta prior piles up near zero and its 95% point falls again. So bracket
    // from the current ESS outwards (never past the widest point), then bisect
    // on log ESS.
    let at = |ln_n: f64| -> Result<f64> {
        let p = with_setting(
            prior,
            dial,
            Setting {
                centre: s.centre,
                ess: ln_n.exp().clamp(ESS_RANGE.0, ESS_RANGE.1),
            },
        )?;
        Ok(spread_point(&p, dial))
    };
    let (floor, ceiling) = (ESS_RANGE.0.ln(), ESS_RANGE.1.ln());
    let now = s.ess.ln();
    let (mut lo, mut hi);
    if at(now)? > x {
        // Tighter: more ESS.
        lo = now;
        hi = now;
        loop {
            hi = (hi + 4f64.ln()).min(ceiling);
            if at(hi)? <= x {
                break;
            }
            if hi >= ceiling {
                return Ok(ESS_RANGE.1);
            }
            lo = hi;
        }
    } else {
        // Wider: less ESS, while the 95% point still rises.
        hi = now;
        lo = now;
        let mut best = at(now)?;
        loop {
            let next = (lo - 4f64.ln()).max(floor);
            let q = at(next)?;
            if q >= x {
                lo = next;
                break;
            }
            if q <= best || next <= floor {
                // As wide as this centre allows.
                return Ok(
                    if q > best { next.exp() } else { lo.exp() }.clamp(ESS_RANGE.0, ESS_RANGE.1)
                );
            }
            best = q;
            hi = next;
            lo = next;
        }
    }
    for _ in 0..80 {
        let mid = 0.5 * (lo + hi);
        if at(mid)? > x {
            lo = mid;
        } else {
            hi = mid;
        }
        if hi - lo < 1e-10 {
            break;
        }
    }
    Ok((0.5 * (lo + hi)).exp().clamp(ESS_RANGE.0, ESS_RANGE.1))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn all_families() -> Vec<Prior> {
        [
            ("beta-binomial", "alpha=3,beta=9"),
            ("gamma-poisson", "alpha=4,beta=2"),
            ("gamma-exponential", "alpha=3,beta=600"),
            ("normal-known-variance", "mu0=5,kappa0=4,sigma=2"),
            ("normal-inverse-gamma", "mu0=1,kappa0=2,alpha0=3,beta0=0.5"),
            ("dirichlet-multinomial", "alpha=2;3;5"),
            ("inverse-gamma-variance", "alpha=4,beta=2,mu=0"),
        ]
        .iter()
        .map(|(f, t)| Prior::parse(f, t).unwrap())
        .collect()
    }

    #[test]
    fn scaling_multiplies_every_dials_ess_and_keeps_every_centre() {
        for p in all_families() {
            let q = scaled(&p, 2.5).unwrap();
            for d in available(&p) {
                let (s, t) = (setting(&p, d), setting(&q, d));
                assert!((s.centre - t.centre).abs() < 1e-12 * s.centre.abs().max(1.0));
                assert!(
                    (t.ess - 2.5 * s.ess).abs() < 1e-12 * t.ess,
                    "{} {d:?}",
                    p.id()
                );
            }
            assert_eq!(scaled(&p, 1.0).unwrap(), p);
        }
        assert!(scaled(&all_families()[0], 0.0).is_err());
    }

    #[test]
    fn setting_a_prior_to_its_own_dials_gives_it_back() {
        // Common practice: the pseudo-observation view is a reparameterisation.
        for p in all_families() {
            for d in available(&p) {
                let back = with_setting(&p, d, setting(&p, d)).unwrap();
                assert_eq!(back.id(), p.id());
                let (s, t) = (setting(&p, d), setting(&back, d));
                assert!((s.centre - t.centre).abs() < 1e-12 * s.centre.abs().max(1.0));
                assert!((s.ess - t.ess).abs() < 1e-12 * s.ess);
            }
        }
    }

    #[test]
    fn the_spread_handle_lands_where_it_was_dragged() {
        for p in all_families() {
            for d in available(&p) {
                let x0 = spread_point(&p, d);
                let c = setting(&p, d).centre;
                for (scale, tighter) in [(0.7, true), (1.3, false)] {
                    let target = c + scale * (x0 - c);
                    let n = ess_for_spread_point(&p, d, target).unwrap();
                    let now = setting(&p, d).ess;
                    assert_eq!(n > now, tighter, "{} {d:?} ×{scale}: {n} vs {now}", p.id());
                    let q = with_setting(&p, d, Setting { centre: c, ess: n }).unwrap();
                    let got = spread_point(&q, d);
                    let tol = 1e-6 * target.abs().max(1.0);
                    assert!((got - target).abs() < tol, "{} {d:?} ×{scale}", p.id());
                    assert!((setting(&q, d).centre - c).abs() < 1e-12 * c.abs().max(1.0));
                }
            }
        }
    }

    #[test]
    fn a_dirichlet_share_moves_alone_and_the_others_keep_their_proportions() {
        let p = Prior::parse("dirichlet-multinomial", "alpha=2;3;5").unwrap();
        let q = with_setting(
            &p,
            Dial::Share(0),
            Setting {
                centre: 0.5,
                ess: 20.0,
            },
        )
        .unwrap();
        let Prior::DirichletMultinomial(d) = q else {
            panic!()
        };
        assert_eq!(d.alpha[0], 10.0);
        assert!((d.alpha[1] - 3.75).abs() < 1e-12 && (d.alpha[2] - 6.25).abs() < 1e-12);
    }

    #[test]
    fn bad_dial_values_name_the_dial() {
        let p = Prior::parse("beta-binomial", "alpha=3,beta=9").unwrap();
        let e = with_setting(
            &p,
            Dial::Main,
            Setting {
                centre: 1.2,
                ess: 5.0,
            },
        )
        .unwrap_err();
        assert!(e.to_string().contains("prior mean of θ"), "{e}");
        let e = with_setting(
            &p,
            Dial::Main,
            Setting {
                centre: 0.2,
                ess: f64::NAN,
            },
        )
        .unwrap_err();
        assert!(e.to_string().contains("imaginary trials"), "{e}");
        assert!(ess_for_spread_point(&p, Dial::Main, 0.1).is_err());
    }
}
