//! Reading speed (criterion): a CSV of two numeric columns reduced to
//! sufficient statistics. Target (issue: data): at least 200 MB/s on one core.
//! Peak memory is measured on a 10-million-row file by
//! `scripts/measure-data-memory.sh`. Run: `cargo bench --no-default-features --bench data`.

use criterion::{Criterion, Throughput, criterion_group, criterion_main};
use priorwright::data::{Mapping, ReadOptions, read_from};
use priorwright::family::Prior;
use std::fmt::Write as _;
use std::hint::black_box;

/// Two numeric columns: short rows (`3,2.45`, 7 bytes) or wide ones
/// (`134567,1001.234567890`, 22 bytes).
fn csv_rows(rows: usize, wide: bool) -> Vec<u8> {
    let mut s = String::from("nests,km_walked\n");
    for i in 0..rows {
        if wide {
            let _ = writeln!(
                s,
                "{},{:.9}",
                100_000 + i % 100_000,
                1000.0 + (i % 7919) as f64 / 7919.0 * 3.0
            );
        } else {
            let _ = writeln!(s, "{},{}.{:02}", i % 17, 1 + i % 3, i % 100);
        }
    }
    s.into_bytes()
}

fn reduce(c: &mut Criterion) {
    let prior = Prior::parse("gamma-poisson", "alpha=2,beta=1").expect("prior");
    let mapping = Mapping::Counts {
        count: "nests".into(),
        exposure: Some("km_walked".into()),
    };
    for (name, wide) in [("short rows", false), ("wide rows", true)] {
        let bytes = csv_rows(1_000_000, wide);
        let mut g = c.benchmark_group("data");
        g.throughput(Throughput::Bytes(bytes.len() as u64));
        g.sample_size(10);
        g.bench_function(format!("reduce 1M {name}, 2 numeric columns"), |b| {
            b.iter(|| {
                read_from(
                    black_box(bytes.as_slice()),
                    "bench.csv",
                    b',',
                    &mapping,
                    &prior,
                    ReadOptions::default(),
                )
            })
        });
        g.finish();
    }
}

criterion_group!(benches, reduce);
criterion_main!(benches);
