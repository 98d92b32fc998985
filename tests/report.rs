//! The report for every sample project: each section is there, the numbers
//! are the ones `check --json` prints, the HTML parses cleanly (html5lib's
//! strict parser, the WHATWG parsing algorithm, run by python3) and nothing
//! outside the file is referenced.

use priorwright::export::report::{CAUTIONS, num};
use serde_json::Value;
use std::process::Command;

const SAMPLES: [&str; 7] = [
    "checkout-button",
    "gauge-repeatability",
    "nest-transects",
    "sensor-offset",
    "survey-answers",
    "tablet-coating",
    "valve-seat-leaks",
];

fn run(args: &[&str]) -> String {
    let out = Command::new(env!("CARGO_BIN_EXE_priorwright"))
        .args(args)
        .output()
        .expect("binary runs");
    assert!(
        out.status.success(),
        "{args:?}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8_lossy(&out.stdout).into_owned()
}

/// The HTML's table cells holding numbers, in order.
fn number_cells(html: &str) -> Vec<String> {
    html.split("<td class=\"n\">")
        .skip(1)
        .filter_map(|c| c.split("</td>").next())
        .map(str::to_owned)
        .collect()
}

#[test]
fn every_sample_report_has_each_section_and_the_check_numbers() {
    let dir = std::env::temp_dir().join(format!("pw-report-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let root = env!("CARGO_MANIFEST_DIR");
    for name in SAMPLES {
        let project = format!("{root}/sample-projects/{name}.ron");
        let out = dir.join(format!("{name}.html"));
        run(&["report", &project, "--out", out.to_str().unwrap()]);
        let html = std::fs::read_to_string(&out).unwrap();
        let check: Value = serde_json::from_str(&run(&["check", &project, "--json"])).unwrap();

        for id in [
            "scenario",
            "people",
            "judgments",
            "priors",
            "predictive",
            "data",
            "sensitivity",
            "conflict",
            "export",
            "notes",
            "cautions",
        ] {
            assert!(
                html.contains(&format!("<h2 id=\"{id}\">")),
                "{name}: section {id}"
            );
        }
        for c in CAUTIONS {
            let escaped = c.replace('\'', "&#x27;");
            assert!(
                html.contains(c) || html.contains(&escaped),
                "{name}: caution {c}"
            );
        }
        // Priors, posterior and the two sweeps; the predictive too, except for
        // categories, where it is a table.
        assert!(
            html.matches("<svg class=\"plot\"").count() >= 4,
            "{name}: plots"
        );

        // Numbers: the posterior summary, the conflict check, the prior's
        // share and each alternative's posterior, as check --json has them.
        let cells = number_cells(&html);
        let post = &check["posterior"]["parameters"][0];
        let mut want = vec![
            num(&post["mean"]),
            num(&post["sd"]),
            num(&post["median"]),
            format!(
                "{} to {}",
                num(&post["central_interval"]["lower"]),
                num(&post["central_interval"]["upper"])
            ),
            num(&check["conflict"]["p_value"]),
            num(&check["conflict"]["lower_tail"]),
            num(&check["conflict"]["upper_tail"]),
            num(&check["prior_share"]),
        ];
        for r in check["sensitivity"]["alternatives"].as_array().unwrap() {
            want.push(num(&r["posterior"]["mean"]));
            want.push(format!(
                "{} to {}",
                num(&r["posterior"]["lower"]),
                num(&r["posterior"]["upper"])
            ));
        }
        for e in check["experts"].as_array().unwrap() {
            want.push(num(&e["parameters"][0]["mean"]));
        }
        for w in &want {
            assert!(
                cells.iter().any(|c| c == w),
                "{name}: {w} from check --json is not in the report"
            );
        }
        match check["conflict"]["warning"].as_str() {
            Some(w) => assert!(html.contains(&w.replace('\'', "&#x27;")) || html.contains(w)),
            None => assert!(html.contains("No conflict is flagged")),
        }
        // Self-contained: no address, no script, no fetched resource.
        for bad in [
            "http:", "https:", "<script", "<link", " src=", " href=", "url(", "@import",
        ] {
            assert!(!html.contains(bad), "{name}: the report references {bad}");
        }
    }
    // html5lib's strict mode raises on the first parse error.
    let files: Vec<String> = SAMPLES
        .iter()
        .map(|n| dir.join(format!("{n}.html")).display().to_string())
        .collect();
    let script = "import sys, html5lib\nfor f in sys.argv[1:]:\n    html5lib.HTMLParser(strict=True).parse(open(f, 'rb').read())\nprint('ok')";
    let out = Command::new("python3")
        .arg("-c")
        .arg(script)
        .args(&files)
        .output()
        .expect("python3 runs (install html5lib: pip install html5lib)");
    assert!(
        out.status.success() && String::from_utf8_lossy(&out.stdout).trim() == "ok",
        "html5lib: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn a_report_into_a_missing_folder_fails_with_one_line_and_writes_nothing() {
    let out = Command::new(env!("CARGO_BIN_EXE_priorwright"))
        .args([
            "report",
            concat!(
                env!("CARGO_MANIFEST_DIR"),
                "/sample-projects/nest-transects.ron"
            ),
            "--out",
            "/no/such/folder/r.html",
        ])
        .output()
        .unwrap();
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8_lossy(&out.stderr);
    assert_eq!(err.lines().count(), 1, "{err}");
    assert!(err.contains("/no/such/folder/r.html"), "{err}");
}
