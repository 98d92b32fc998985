//! Speed of the engine (criterion). Targets (issue: core): `describe` of any
//! family with five quantiles and a 95% highest-density interval under 50 µs
//! (median); `update` under 1 µs. Run: `cargo bench --no-default-features --bench engine`.

use criterion::{Criterion, criterion_group, criterion_main};
use priorwright::analysis::summary::{SummaryOptions, summarize};
use priorwright::family::Prior;
use std::hint::black_box;

/// A typical prior and data set per family.
const CASES: [(&str, &str, &str); 7] = [
    ("beta-binomial", "alpha=2,beta=8", "successes=3,trials=20"),
    ("gamma-poisson", "alpha=3,beta=5", "events=3,exposure=2"),
    (
        "gamma-exponential",
        "alpha=3,beta=1500",
        "failures=4,time=3000",
    ),
    (
        "normal-known-variance",
        "mu0=900,kappa0=4,sigma=40",
        "n=1,mean=850",
    ),
    (
        "normal-inverse-gamma",
        "mu0=1.9,kappa0=1,alpha0=0.5,beta0=0.005",
        "n=9,mean=1.804,variance=0.0169",
    ),
    ("dirichlet-multinomial", "alpha=1;2;3", "counts=4;0;7"),
    ("inverse-gamma-variance", "alpha=2,beta=4,mu=0", "n=6,ss=12"),
];

fn describe(c: &mut Criterion) {
    let opts = SummaryOptions::default(); // five quantiles, 95% central and HPD
    for (family, prior, _) in CASES {
        let p = Prior::parse(family, prior).expect("valid prior");
        let marginals = p.marginals();
        c.bench_function(&format!("describe/{family}"), |b| {
            b.iter(|| summarize(black_box(&marginals), black_box(&opts)))
        });
    }
}

fn update(c: &mut Criterion) {
    for (family, prior, data) in CASES {
        let p = Prior::parse(family, prior).expect("valid prior");
        let d = p.parse_data(data).expect("valid data");
        c.bench_function(&format!("update/{family}"), |b| {
            b.iter(|| black_box(&p).update(black_box(&d)))
        });
    }
}

criterion_group!(benches, describe, update);
criterion_main!(benches);
