//! Projects, data files and export: the sample projects round-trip, bad
//! files get one clear message naming file, line and column, and exports use
//! each target's documented parameterisation.

use priorwright::data::{Mapping, Missing, ReadOptions, read_file, read_from};
use priorwright::family::{Data, Prior};
use priorwright::project::{self, Project};
use std::path::{Path, PathBuf};

fn samples() -> Vec<PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("sample-projects");
    let mut v: Vec<PathBuf> = std::fs::read_dir(&dir)
        .expect("sample-projects/")
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| p.extension().is_some_and(|e| e == "ron"))
        .collect();
    v.sort();
    v
}

#[test]
fn sample_projects_cover_every_family_and_round_trip() {
    let files = samples();
    assert!(files.len() >= 5);
    let mut families = std::collections::BTreeSet::new();
    for path in files {
        let text = std::fs::read_to_string(&path).unwrap();
        let p = project::load(&path).unwrap();
        families.insert(p.scenario.family.clone());
        assert!(
            p.scenario.description.contains("invented"),
            "{}: say it is invented",
            path.display()
        );
        // Saves back byte for byte.
        assert_eq!(
            project::to_text(&p).unwrap(),
            text,
            "{} does not save back identically",
            path.display()
        );
        // Recomputed from its data file, the statistics are the stored ones.
        for d in &p.data {
            let file = path.parent().unwrap().join(d.path.as_ref().unwrap());
            let r = read_file(
                &file,
                d.mapping.as_ref().unwrap(),
                &p.experts[0].prior,
                ReadOptions::default(),
            )
            .unwrap();
            assert_eq!(r.data, d.statistics, "{}", path.display());
            assert_eq!(r.rows, d.rows);
        }
        assert_eq!(p.pooling.pooled.as_ref(), Some(&p.log_pool().unwrap()));
        assert!(p.posterior().unwrap().is_some());
        if p.experts.len() > 1 {
            assert!(p.experts.len() >= 2);
        }
    }
    assert_eq!(families.len(), 7, "families used: {families:?}");
}

fn read_text(
    text: &str,
    mapping: &Mapping,
    prior: &str,
    family: &str,
    opts: ReadOptions,
) -> Result<priorwright::data::Reduced, String> {
    let prior = Prior::parse(family, prior).unwrap();
    read_from(text.as_bytes(), "test.csv", b',', mapping, &prior, opts).map_err(|e| e.to_string())
}

fn binary() -> Mapping {
    Mapping::Binary {
        column: "ok".into(),
    }
}

fn bb(text: &str) -> Result<priorwright::data::Reduced, String> {
    read_text(
        text,
        &binary(),
        "alpha=1,beta=1",
        "beta-binomial",
        ReadOptions::default(),
    )
}

#[test]
fn data_files_reduce_to_sufficient_statistics() {
    let r = bb("id,ok\n1,1\n2,0\n3,1\n").unwrap();
    assert_eq!(
        r.data,
        Data::BetaBinomial(priorwright::family::Trials {
            successes: 2.0,
            trials: 3.0
        })
    );
    // Byte-order mark and CRLF line ends are accepted.
    assert_eq!(bb("\u{feff}id,ok\r\n1,1\r\n2,0\r\n").unwrap().rows, 2);
    // Missing values are skipped and counted by default.
    let r = bb("id,ok\n1,1\n2,\n3,NA\n").unwrap();
    assert_eq!((r.rows, r.missing), (1, 2));
    // Times with censoring, counts with exposure, values, categories.
    let m = Mapping::Times {
        time: "t".into(),
        event: Some("failed".into()),
    };
    let r = read_text(
        "t,failed\n10,1\n25,0\n5,1\n",
        &m,
        "alpha=1,beta=1",
        "gamma-exponential",
        ReadOptions::default(),
    )
    .unwrap();
    assert_eq!(
        r.data,
        Data::GammaExponential(priorwright::family::LifeTest {
            failures: 2.0,
            time: 40.0
        })
    );
    let m = Mapping::Counts {
        count: "y".into(),
        exposure: Some("km".into()),
    };
    let r = read_text(
        "y,km\n3,1.5\n4,2.5\n",
        &m,
        "alpha=1,beta=1",
        "gamma-poisson",
        ReadOptions::default(),
    )
    .unwrap();
    assert_eq!(
        r.data,
        Data::GammaPoisson(priorwright::family::EventCounts {
            events: 7.0,
            exposure: 4.0
        })
    );
    let m = Mapping::Values { column: "y".into() };
    let r = read_text(
        "y\n1\n2\n3\n4\n",
        &m,
        "mu0=0,kappa0=1,alpha0=1,beta0=1",
        "normal-inverse-gamma",
        ReadOptions::default(),
    )
    .unwrap();
    // Sample variance of 1..4 with the n − 1 divisor is 5/3 (common practice).
    assert_eq!(
        r.data,
        Data::NormalInverseGamma(priorwright::family::NormalSample {
            n: 4.0,
            mean: 2.5,
            variance: 5.0 / 3.0
        })
    );
    let m = Mapping::Category {
        column: "a".into(),
        labels: vec!["yes".into(), "no".into()],
    };
    let r = read_text(
        "a\nyes\nno\nyes\n",
        &m,
        "alpha=1;1",
        "dirichlet-multinomial",
        ReadOptions::default(),
    )
    .unwrap();
    assert_eq!(
        r.data,
        Data::DirichletMultinomial(priorwright::family::Counts {
            counts: vec![2.0, 1.0]
        })
    );
    let m = Mapping::SuccessesTrials {
        successes: "s".into(),
        trials: "n".into(),
    };
    let r = read_text(
        "s,n\n2,10\n3,5\n",
        &m,
        "alpha=1,beta=1",
        "beta-binomial",
        ReadOptions::default(),
    )
    .unwrap();
    assert_eq!(
        r.data,
        Data::BetaBinomial(priorwright::family::Trials {
            successes: 5.0,
            trials: 15.0
        })
    );
}

#[test]
fn bad_data_files_get_one_clear_message() {
    let cases: Vec<(&str, Result<priorwright::data::Reduced, String>)> = vec![
        (
            "test.csv, line 1: the file is empty: a header row is needed",
            bb(""),
        ),
        ("test.csv: a header row but no data", bb("id,ok\n")),
        (
            "test.csv, line 1, column 'ok': no such column; the header has id, done",
            bb("id,done\n1,1\n"),
        ),
        (
            "test.csv, line 3, column 'ok': 'yes' is not a number",
            bb("id,ok\n1,1\n2,yes\n"),
        ),
        (
            "test.csv, line 2, column 'ok': 'NaN' is not a finite number",
            bb("id,ok\n1,NaN\n"),
        ),
        (
            "test.csv, line 2, column 'ok': 'inf' is not a finite number",
            bb("id,ok\n1,inf\n"),
        ),
        (
            "test.csv, line 2, column 'ok': '2' is not 0 or 1",
            bb("id,ok\n1,2\n"),
        ),
        (
            "test.csv, line 3: this row has 3 fields but the header has 2",
            bb("id,ok\n1,1\n2,0,7\n"),
        ),
        (
            "test.csv: every row has a missing value",
            bb("id,ok\n1,\n2,NA\n"),
        ),
        (
            "test.csv, line 2, column 'ok': empty cell (missing values were asked to be errors)",
            read_text(
                "id,ok\n1,\n",
                &binary(),
                "alpha=1,beta=1",
                "beta-binomial",
                ReadOptions {
                    missing: Missing::Error,
                    ..ReadOptions::default()
                },
            ),
        ),
    ];
    let st = Mapping::SuccessesTrials {
        successes: "s".into(),
        trials: "n".into(),
    };
    let counts = Mapping::Counts {
        count: "y".into(),
        exposure: Some("t".into()),
    };
    let times = Mapping::Times {
        time: "t".into(),
        event: Some("e".into()),
    };
    let cat = Mapping::Category {
        column: "a".into(),
        labels: vec!["yes".into(), "no".into()],
    };
    let d = ReadOptions::default();
    let more: Vec<(&str, Result<priorwright::data::Reduced, String>)> = vec![
        (
            "test.csv, line 2, column 's': 12 successes is more than the 10 trials",
            read_text("s,n\n12,10\n", &st, "alpha=1,beta=1", "beta-binomial", d),
        ),
        (
            "test.csv, line 2, column 's': '2.5' is not a whole count (0 or more)",
            read_text("s,n\n2.5,10\n", &st, "alpha=1,beta=1", "beta-binomial", d),
        ),
        (
            "test.csv, line 2, column 'y': '-3' is not a whole count (0 or more)",
            read_text("y,t\n-3,1\n", &counts, "alpha=1,beta=1", "gamma-poisson", d),
        ),
        (
            "test.csv, line 2, column 't': exposure '0' must be positive",
            read_text("y,t\n3,0\n", &counts, "alpha=1,beta=1", "gamma-poisson", d),
        ),
        (
            "test.csv, line 2, column 'e': event flag '2' must be 1 (failure) or 0 (censored)",
            read_text(
                "t,e\n5,2\n",
                &times,
                "alpha=1,beta=1",
                "gamma-exponential",
                d,
            ),
        ),
        (
            "test.csv, line 2, column 't': time '-5' must be 0 or more",
            read_text(
                "t,e\n-5,1\n",
                &times,
                "alpha=1,beta=1",
                "gamma-exponential",
                d,
            ),
        ),
        (
            "test.csv, line 2, column 'a': 'maybe' is not one of the categories yes, no",
            read_text("a\nmaybe\n", &cat, "alpha=1;1", "dirichlet-multinomial", d),
        ),
        (
            "test.csv: a 0/1 column mapping does not fit the gamma-poisson family",
            read_text("ok\n1\n", &binary(), "alpha=1,beta=1", "gamma-poisson", d),
        ),
        (
            "test.csv: the mapping must name 3 categories, one per category of the prior",
            read_text("a\nyes\n", &cat, "alpha=1;1;1", "dirichlet-multinomial", d),
        ),
    ];
    for (want, got) in cases.into_iter().chain(more) {
        assert_eq!(got.unwrap_err(), want);
    }
    // A runaway line is refused before it is buffered (limit lowered to keep the test small).
    let long = format!("id,ok\n1,{}\n", "1".repeat(5 << 20));
    let e = read_text(
        &long,
        &binary(),
        "alpha=1,beta=1",
        "beta-binomial",
        ReadOptions::default(),
    )
    .unwrap_err();
    assert_eq!(
        e,
        "test.csv, line 2: this line is longer than 1048576 bytes"
    );
    // A file that is not there.
    let prior = Prior::parse("beta-binomial", "alpha=1,beta=1").unwrap();
    let e = read_file(Path::new("/nonexistent/data.csv"), &binary(), &prior, d)
        .unwrap_err()
        .to_string();
    assert!(
        e.starts_with("/nonexistent/data.csv: cannot be opened"),
        "{e}"
    );
}

fn sample_text() -> String {
    std::fs::read_to_string(samples()[0].clone()).unwrap()
}

fn scratch(name: &str) -> PathBuf {
    let d = std::env::temp_dir().join(format!("priorwright-test-{}-{name}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).unwrap();
    d
}

#[test]
fn bad_project_files_get_one_clear_message_and_stay_unchanged() {
    let good = sample_text();
    let dir = scratch("bad");
    let check = |name: &str, text: &str, want: &str| {
        let path = dir.join(name);
        std::fs::write(&path, text).unwrap();
        let e = project::load(&path).unwrap_err().to_string();
        assert!(e.starts_with(&path.display().to_string()), "{e}");
        assert!(e.contains(want), "{name}: {e} lacks {want}");
        assert_eq!(
            std::fs::read_to_string(&path).unwrap(),
            text,
            "{name} was changed"
        );
    };
    check("empty.ron", "", "the file is empty");
    check(
        "truncated.ron",
        &good[..good.len() / 2],
        "cannot be read as a Priorwright project (at line:column ",
    );
    check(
        "garbage.ron",
        "hello world",
        "cannot be read as a Priorwright project",
    );
    check(
        "newer.ron",
        &good.replacen("format_version: 1", "format_version: 7", 1),
        "written by a newer Priorwright (format_version 7); this version reads up to format_version 1",
    );
    let fam = good
        .lines()
        .find(|l| l.contains("family:"))
        .unwrap()
        .to_owned();
    check(
        "family.ron",
        &good.replacen(&fam, "        family: \"beta-geometric\",", 1),
        "unknown family 'beta-geometric'",
    );
    let w = good
        .lines()
        .find(|l| l.contains("weight:"))
        .unwrap()
        .to_owned();
    check(
        "weights.ron",
        &good.replacen(&w, "            weight: 0.9,", 1),
        "expert weights must be 0 or more and sum to 1",
    );
    let a = good
        .lines()
        .find(|l| l.trim_start().starts_with("alpha:"))
        .unwrap()
        .to_owned();
    check(
        "negative.ron",
        &good.replacen(&a, "                alpha: -2.0,", 1),
        "alpha = -2 is not allowed",
    );
    check(
        "zero.ron",
        &good.replacen(&a, "                alpha: 0.0,", 1),
        "alpha = 0 is not allowed",
    );
}

#[test]
fn saving_is_atomic_and_a_failed_save_changes_nothing() {
    let dir = scratch("save");
    let path = dir.join("p.ron");
    let p: Project = project::load(&samples()[0]).unwrap();
    project::save(&path, &p).unwrap();
    let before = std::fs::read_to_string(&path).unwrap();
    let mut q = p.clone();
    q.notes = "changed".into();
    project::save(&path, &q).unwrap();
    assert!(
        std::fs::read_to_string(&path)
            .unwrap()
            .contains("notes: \"changed\"")
    );
    // No temporary files left behind.
    let left: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .filter_map(|e| e.ok())
        .filter(|e| e.file_name().to_string_lossy().ends_with(".tmp"))
        .collect();
    assert!(left.is_empty());
    // A folder that does not exist: the save fails with a message and the project in memory is intact.
    let e = project::save(&dir.join("missing-folder/p.ron"), &q)
        .unwrap_err()
        .to_string();
    assert!(
        e.contains("could not be saved") && e.contains("the file on disk is unchanged"),
        "{e}"
    );
    assert_eq!(q.notes, "changed");
    let _ = before;
}

#[test]
fn a_project_whose_data_moved_still_opens_from_its_statistics() {
    let dir = scratch("moved");
    let src = &samples()[0];
    let path = dir.join("moved.ron");
    std::fs::copy(src, &path).unwrap();
    let out = std::process::Command::new(env!("CARGO_BIN_EXE_priorwright"))
        .arg("check")
        .arg(&path)
        .arg("--json")
        .output()
        .unwrap();
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert!(
        v["notes"][0]
            .as_str()
            .unwrap()
            .contains("is missing; the statistics stored in the project are used")
    );
    assert!(v.get("posterior").is_some());
}

#[test]
fn check_and_export_work_on_every_sample_project() {
    for path in samples() {
        let run = |args: &[&str]| {
            std::process::Command::new(env!("CARGO_BIN_EXE_priorwright"))
                .args(args)
                .output()
                .unwrap()
        };
        let p = path.to_str().unwrap();
        let out = run(&["check", p, "--json"]);
        assert!(
            out.status.success(),
            "{p}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
        assert!(v["experts"].as_array().unwrap().len() >= 2, "{p}");
        for target in [
            "stan", "pymc", "numpyro", "jags", "r", "brms", "scipy", "json",
        ] {
            let out = run(&["export", p, "--to", target]);
            let err = String::from_utf8_lossy(&out.stderr);
            if out.status.success() {
                assert!(!out.stdout.is_empty(), "{p} {target}");
            } else {
                // Only mixtures may be refused, and then with the reason.
                assert!(
                    err.contains("cannot state a mixture prior directly"),
                    "{p} {target}: {err}"
                );
                assert_eq!(err.lines().count(), 1);
            }
        }
    }
}
