//! Speed of the prior checks (criterion). Targets (issue: sensitivity,
//! conflict and report): the ESS sweep of 200 points with posterior 95%
//! intervals under 5 ms (median). The sweep here has 201 points (odd, so ×1
//! is one of them); a report for any sample project under 1 s. Run: `cargo bench --no-default-features --bench checks`.

use criterion::{Criterion, criterion_group, criterion_main};
use priorwright::analysis::sensitivity::{ESS_POINTS, ess_sweep, log_factors};
use priorwright::elicit::dials::Dial;
use std::hint::black_box;

fn sweeps(c: &mut Criterion) {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("sample-projects");
    let factors = log_factors(ESS_POINTS);
    for name in ["tablet-coating", "checkout-button", "survey-answers"] {
        let p = priorwright::project::load(&dir.join(format!("{name}.ron"))).unwrap();
        let belief = p.belief().unwrap();
        let data: Vec<_> = p.data.iter().map(|d| d.statistics.clone()).collect();
        c.bench_function(&format!("ess sweep 201 points/{name}"), |b| {
            b.iter(|| ess_sweep(black_box(&belief), &data, Dial::Main, &factors, 0.95).unwrap())
        });
    }
}

/// Target: a report for any sample project under 1 s.
fn reports(c: &mut Criterion) {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("sample-projects");
    let mut group = c.benchmark_group("report");
    group.sample_size(10);
    for name in [
        "checkout-button",
        "tablet-coating",
        "survey-answers",
        "valve-seat-leaks",
    ] {
        let path = dir.join(format!("{name}.ron"));
        group.bench_function(name, |b| {
            b.iter(|| priorwright::cli::report_html(black_box(&path), None).unwrap())
        });
    }
    group.finish();
}

criterion_group!(benches, sweeps, reports);
criterion_main!(benches);
