//! Properties over random valid hyperparameters (proptest): nothing panics,
//! nothing is NaN, quantiles invert the cdf, intervals hold their mass.

use priorwright::analysis::summary::{SummaryOptions, summarize};
use priorwright::distribution::interval::Shape;
use priorwright::distribution::{Continuous, Discrete};
use priorwright::family::Prior;
use proptest::prelude::*;

/// Log-uniform on [1e-3, 1e7]: the hyperparameter range the engine promises.
fn shape() -> impl Strategy<Value = f64> {
    (-3.0f64..7.0).prop_map(|e| 10f64.powf(e))
}

fn prob() -> impl Strategy<Value = f64> {
    prop_oneof![
        (-10.0f64..-0.3).prop_map(|e| 10f64.powf(e)),
        (0.0f64..1.0),
        (-10.0f64..-0.3).prop_map(|e| 1.0 - 10f64.powf(e))
    ]
    .prop_filter("inside (0, 1)", |p| *p > 0.0 && *p < 1.0)
}

fn continuous() -> impl Strategy<Value = Continuous> {
    prop_oneof![
        (shape(), shape()).prop_map(|(a, b)| Continuous::Beta { a, b }),
        (shape(), shape()).prop_map(|(shape, rate)| Continuous::Gamma { shape, rate }),
        (shape(), shape()).prop_map(|(shape, scale)| Continuous::InvGamma { shape, scale }),
        (shape(), shape()).prop_map(|(shape, scale)| Continuous::SqrtInvGamma { shape, scale }),
        (-1e6f64..1e6, shape()).prop_map(|(mean, sd)| Continuous::Normal { mean, sd }),
        (shape(), -1e3f64..1e3, shape()).prop_map(|(df, loc, scale)| Continuous::StudentT {
            df,
            loc,
            scale
        }),
        (shape(), shape()).prop_map(|(shape, scale)| Continuous::Lomax { shape, scale }),
    ]
}

/// The probability of the tail on p's side, computed at x.
fn tail_at(d: &Continuous, x: f64, p: f64) -> (f64, f64) {
    let (lo, up) = d.tails(x);
    if p <= 0.5 { (lo, p) } else { (up, 1.0 - p) }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn quantile_inverts_cdf(d in continuous(), p in prob()) {
        let x = d.quantile(p);
        prop_assert!(!x.is_nan(), "{d:?} quantile({p}) is NaN");
        let (lo, hi) = d.support();
        prop_assert!(x >= lo && x <= hi);
        // Where x is a representable interior point, the tail there is p's tail.
        if x.is_finite() && x != 0.0 && x.abs() > 1e-300 && x != 1.0 {
            let (got, want) = tail_at(&d, x, p);
            let slack = d.pdf(x) * x.abs() * 4e-15 / want;
            prop_assert!(((got - want) / want).abs() < 1e-8 + slack, "{d:?}: tail at q({p}) = {got}, want {want}");
        }
        let (c, s) = d.tails(x);
        prop_assert!(!c.is_nan() && !s.is_nan() && !d.pdf(x).is_nan());
    }

    #[test]
    fn intervals_hold_their_mass(d in continuous(), level in 0.5f64..0.999) {
        let starts_at_zero = matches!(d.shape(), Shape::Decreasing | Shape::UShaped);
        for (i, hpd) in [(d.central_interval(level), false), (d.hpd_interval(level), true)] {
            prop_assert!(!i.lower.is_nan() && !i.upper.is_nan() && i.lower <= i.upper);
            let pieces = if i.pieces.is_empty() { vec![(i.lower, i.upper)] } else { i.pieces.clone() };
            // An end below 1e-290 that is not the support's own end is a
            // quantile that underflowed: the mass beside it is not measurable.
            let underflow = pieces.iter().any(|(a, b)| {
                [*a, *b].iter().any(|x| x.abs() < 1e-290 && !(hpd && starts_at_zero && *x == 0.0))
            });
            // Ends are rounded to doubles: allow the mass that rounding can move.
            let (lo, hi) = d.support();
            // (A central end at the support's edge is a rounded quantile: its
            // density, often unbounded there, then sets the slack.)
            let ends_at_top = matches!(d.shape(), Shape::Increasing | Shape::UShaped);
            let ends: Vec<f64> = pieces.iter().flat_map(|(a, b)| [*a, *b]).collect();
            let last = ends.len() - 1;
            let slack: f64 = ends
                .iter()
                .enumerate()
                .filter(|(k, x)| {
                    let designed = hpd
                        && ((*k == 0 && **x == lo && starts_at_zero) || (*k == last && **x == hi && ends_at_top));
                    !designed
                })
                .map(|(_, x)| 4.0 * d.pdf(*x) * x.abs() * f64::EPSILON)
                .sum();
            if !underflow && slack.is_finite() && pieces.iter().all(|(a, b)| a.is_finite() && b.is_finite()) {
                let mass: f64 = pieces.iter().map(|(a, b)| d.cdf(*b) - d.cdf(*a)).sum();
                prop_assert!((mass - level).abs() < 1e-7 + slack, "{d:?} {i:?}: mass {mass}");
            }
        }
        // The highest-density set is never longer than the central interval.
        let (c, h) = (d.central_interval(level), d.hpd_interval(level));
        if h.pieces.is_empty() && c.upper.is_finite() && h.upper.is_finite() {
            prop_assert!(h.upper - h.lower <= (c.upper - c.lower) * (1.0 + 1e-9));
        }
    }

    #[test]
    fn count_quantiles_are_the_smallest_count_reaching_p(
        a in shape(), b in shape(), n in 1u64..200, t in shape(), p in 0.001f64..0.999
    ) {
        for d in [Discrete::BetaBinomial { n, a, b }, Discrete::gamma_poisson(a.min(1e4), b, t.min(1e4))] {
            let k = d.quantile(p);
            prop_assert!(d.cdf(k) >= p * (1.0 - 1e-12), "{d:?} cdf(q) < p");
            if k > 0 {
                prop_assert!(d.cdf(k - 1) < p * (1.0 + 1e-12), "{d:?} q not smallest");
            }
            prop_assert!(!d.mean().is_nan() && !d.sd().is_nan() && !d.pmf(k).is_nan());
        }
    }

    #[test]
    fn every_family_summarises_without_nan(a in shape(), b in shape(), c in shape(), m in -1e3f64..1e3) {
        let priors = [
            ("beta-binomial", format!("alpha={a},beta={b}")),
            ("gamma-poisson", format!("alpha={a},beta={b}")),
            ("gamma-exponential", format!("alpha={a},beta={b}")),
            ("normal-known-variance", format!("mu0={m},kappa0={a},sigma={b}")),
            ("normal-inverse-gamma", format!("mu0={m},kappa0={a},alpha0={b},beta0={c}")),
            ("dirichlet-multinomial", format!("alpha={a};{b};{c}")),
            ("inverse-gamma-variance", format!("alpha={a},beta={b},mu={m}")),
        ];
        for (fam, text) in priors {
            let prior = Prior::parse(fam, &text).unwrap();
            let s = summarize(&prior.marginals(), &SummaryOptions::default()).unwrap();
            for p in s {
                let mut xs = vec![p.median, p.central.lower, p.central.upper, p.hpd.lower, p.hpd.upper];
                xs.extend(p.quantiles.iter().map(|q| q.1));
                xs.extend([p.mean, p.sd, p.mode].into_iter().flatten());
                prop_assert!(xs.iter().all(|x| !x.is_nan()), "{fam} {text}: NaN in {}", p.name);
            }
        }
    }
}

mod round_trip {
    use priorwright::elicit::fit::{Fixed, Judgment, Scale, fit};
    use priorwright::family::{Prior, Value};
    use proptest::prelude::*;

    fn moderate() -> impl Strategy<Value = f64> {
        (-0.7f64..2.3).prop_map(|e| 10f64.powf(e))
    }

    fn hyper(p: &Prior, k: &str) -> f64 {
        match p.hyperparameters().into_iter().find(|(n, _)| *n == k) {
            Some((_, Value::Number(x))) => x,
            _ => f64::NAN,
        }
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(150))]

        /// Judgments read off a known prior are fitted back to it.
        #[test]
        fn judgments_from_a_prior_fit_back_to_it(a in moderate(), b in moderate(), which in 0usize..3) {
            let (family, text, name) = [
                ("beta-binomial", format!("alpha={a},beta={b}"), "theta"),
                ("gamma-exponential", format!("alpha={a},beta={b}"), "mean_time"),
                ("inverse-gamma-variance", format!("alpha={a},beta={b}"), "sigma"),
            ][which].clone();
            let truth = Prior::parse(family, &text).unwrap();
            let law = truth.marginals().into_iter().find(|m| m.name == name).unwrap().distribution;
            let judgments: Vec<Judgment> = [0.1, 0.5, 0.9]
                .iter()
                .map(|p| Judgment { parameter: Some(name.to_owned()), p: *p, value: law.quantile(*p) })
                .collect();
            let f = fit(family, &Fixed::default(), Scale::Unknowns, &judgments).unwrap();
            for k in ["alpha", "beta"] {
                let (got, want) = (hyper(&f.prior, k), hyper(&truth, k));
                prop_assert!(((got - want) / want).abs() < 1e-6, "{family} {k}: {got} vs {want}");
            }
            prop_assert!(f.objective < 1e-20);
        }
    }
}
