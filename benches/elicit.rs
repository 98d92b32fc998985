//! Speed of elicitation (criterion). Targets (issue: elicitation): a
//! two-hyperparameter fit from three judgments under 200 µs (median), a
//! normal-inverse-gamma joint fit under 2 ms, a mixture quantile under 20 µs.
//! Run: `cargo bench --no-default-features --bench elicit`.

use criterion::{Criterion, criterion_group, criterion_main};
use priorwright::elicit::Mixture;
use priorwright::elicit::fit::{Fixed, Judgment, Scale, fit};
use priorwright::family::Prior;
use std::hint::black_box;

fn j(parameter: &str, p: f64, value: f64) -> Judgment {
    Judgment {
        parameter: Some(parameter.to_owned()),
        p,
        value,
    }
}

fn fits(c: &mut Criterion) {
    let three = [
        j("theta", 0.1, 0.1),
        j("theta", 0.5, 0.3),
        j("theta", 0.9, 0.5),
    ];
    c.bench_function("fit/beta-binomial, 3 judgments", |b| {
        b.iter(|| {
            fit(
                "beta-binomial",
                &Fixed::default(),
                Scale::Unknowns,
                black_box(&three),
            )
        })
    });
    let three = [
        j("mean_time", 0.05, 200.0),
        j("mean_time", 0.5, 600.0),
        j("mean_time", 0.95, 2000.0),
    ];
    c.bench_function("fit/gamma-exponential, 3 judgments", |b| {
        b.iter(|| {
            fit(
                "gamma-exponential",
                &Fixed::default(),
                Scale::Unknowns,
                black_box(&three),
            )
        })
    });
    let nig = [
        j("mu", 0.05, 1.7),
        j("mu", 0.5, 1.88),
        j("mu", 0.95, 2.1),
        j("sigma", 0.25, 0.09),
        j("sigma", 0.75, 0.16),
    ];
    c.bench_function("fit/normal-inverse-gamma, joint", |b| {
        b.iter(|| {
            fit(
                "normal-inverse-gamma",
                &Fixed::default(),
                Scale::Unknowns,
                black_box(&nig),
            )
        })
    });
}

fn mixture_quantile(c: &mut Criterion) {
    let parts = vec![
        (
            0.6,
            Prior::parse("beta-binomial", "alpha=2,beta=18").expect("prior"),
        ),
        (
            0.4,
            Prior::parse("beta-binomial", "alpha=6,beta=6").expect("prior"),
        ),
    ];
    let law = Mixture::new(parts)
        .expect("mixture")
        .marginals()
        .remove(0)
        .1;
    c.bench_function("mixture/quantile, 2 beta components", |b| {
        b.iter(|| law.quantile_near(black_box(0.975), None))
    });
}

criterion_group!(benches, fits, mixture_quantile);
criterion_main!(benches);
