//! Reading speed (criterion): a CSV of two numeric columns reduced to
//! sufficient statistics. Target (issue: data): at least 200 MB/s on one core.
//! Peak memory is measured on a 10-million-row file by
//! `scripts/measure-data-memory.sh`. Run: `cargo bench --no-default-features --bench data`.

use criterion::{Criterion, Throughput, criterion_group, criterion_main};
use priorwright::data::{Mapping, ReadOptions, read_from};
use priorwright::family::Prior;
use std::fmt::Write as _;
use std::hint::black_box;

fn csv_rows(rows: usize) -> Vec<u8> {
    let mut s = String::from("nests,km_walked\n");
    for i in 0..rows {
        let _ = writeln!(s, "{},{}.{:02}", i % 17, 1 + i % 3, i % 100);
    }
    s.into_bytes()
}

fn reduce(c: &mut Criterion) {
    let bytes = csv_rows(1_000_000);
    let prior = Prior::parse("gamma-poisson", "alpha=2,beta=1").expect("prior");
    let mapping = Mapping::Counts {
        count: "nests".into(),
        exposure: Some("km_walked".into()),
    };
    let mut g = c.benchmark_group("data");
    g.throughput(Throughput::Bytes(bytes.len() as u64));
    g.sample_size(10);
    g.bench_function("reduce 1M rows, 2 numeric columns", |b| {
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

criterion_group!(benches, reduce);
criterion_main!(benches);
