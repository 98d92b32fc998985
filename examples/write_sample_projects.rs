//! Writes the bundled sample projects (sample-projects/*.ron) from their
//! invented scenarios and data files. Run from the repository root:
//! `cargo run --no-default-features --example write_sample_projects`.

use priorwright::data::{Mapping, ReadOptions, read_file};
use priorwright::elicit::PoolMethod;
use priorwright::elicit::fit::{Fixed, Judgment, Scale, fit};
use priorwright::family::Prior;
use priorwright::project::{DataSource, Expert, Pooling, Project, Scenario, StoredJudgment, save};
use std::path::Path;

const STAMP: &str = "2026-12-02T09:00:00Z";
const INVENTED: &str =
    "An invented scenario for demonstration; the experts and the data are made up.";

/// (parameter, probability, value).
type Stated = (Option<&'static str>, f64, f64);

/// An expert: name, weight, judgments, or a prior given directly.
type ExpertSpec = (&'static str, f64, Vec<Stated>, Option<&'static str>);

struct Spec {
    file: &'static str,
    title: &'static str,
    description: &'static str,
    unknown: &'static str,
    unit: &'static str,
    family: &'static str,
    high_stakes: bool,
    fixed: Fixed,
    /// (name, weight, judgments as (parameter, p, value)) or a direct prior.
    experts: Vec<ExpertSpec>,
    pooling: PoolMethod,
    robust: Option<f64>,
    data: &'static str,
    mapping: Mapping,
}

fn main() {
    let specs = vec![
        Spec {
            file: "valve-seat-leaks",
            title: "Valve seat leak rate",
            description: "Rate of seat leaks in a new valve design, from two engineers' judgments on the mean time to a leak, checked against a 3000-hour bench test with censoring.",
            unknown: "leak rate",
            unit: "per hour",
            family: "gamma-exponential",
            high_stakes: true,
            fixed: Fixed::default(),
            experts: vec![
                (
                    "Design engineer",
                    0.5,
                    vec![
                        (Some("mean_time"), 0.5, 2000.0),
                        (Some("mean_time"), 0.9, 6000.0),
                    ],
                    None,
                ),
                (
                    "Field service lead",
                    0.5,
                    vec![
                        (Some("mean_time"), 0.5, 1200.0),
                        (Some("mean_time"), 0.9, 3000.0),
                    ],
                    None,
                ),
            ],
            pooling: PoolMethod::Linear,
            robust: None,
            data: "valve-seat-leaks.csv",
            mapping: Mapping::Times {
                time: "hours_on_test".into(),
                event: Some("leaked".into()),
            },
        },
        Spec {
            file: "checkout-button",
            title: "Checkout button conversion",
            description: "Share of visitors who complete checkout with a redesigned button, pooled from a product manager, an analyst and a designer.",
            unknown: "conversion rate",
            unit: "share of visitors",
            family: "beta-binomial",
            high_stakes: false,
            fixed: Fixed::default(),
            experts: vec![
                (
                    "Product manager",
                    0.4,
                    vec![(None, 0.5, 0.12), (None, 0.9, 0.2)],
                    None,
                ),
                (
                    "Analyst",
                    0.4,
                    vec![(None, 0.1, 0.05), (None, 0.5, 0.09), (None, 0.9, 0.14)],
                    None,
                ),
                ("Designer", 0.2, vec![], Some("mean=0.15,ess=20")),
            ],
            pooling: PoolMethod::Linear,
            robust: Some(0.1),
            data: "checkout-button.csv",
            mapping: Mapping::Binary {
                column: "converted".into(),
            },
        },
        Spec {
            file: "nest-transects",
            title: "Ground-nest density",
            description: "Nests per kilometre of transect in a restored meadow, from two ecologists, with counts over transects of different lengths.",
            unknown: "nest density",
            unit: "nests per km",
            family: "gamma-poisson",
            high_stakes: false,
            fixed: Fixed::default(),
            experts: vec![
                (
                    "Site ecologist",
                    0.5,
                    vec![(None, 0.25, 1.5), (None, 0.75, 3.0)],
                    None,
                ),
                (
                    "Regional surveyor",
                    0.5,
                    vec![(None, 0.25, 1.0), (None, 0.75, 2.2)],
                    None,
                ),
            ],
            pooling: PoolMethod::Log,
            robust: None,
            data: "nest-transects.csv",
            mapping: Mapping::Counts {
                count: "nests".into(),
                exposure: Some("km_walked".into()),
            },
        },
        Spec {
            file: "tablet-coating",
            title: "Tablet coating thickness",
            description: "Mean and spread of film-coating thickness on a new press, judged jointly by a process engineer and a quality lead.",
            unknown: "coating thickness",
            unit: "micrometres",
            family: "normal-inverse-gamma",
            high_stakes: true,
            fixed: Fixed::default(),
            experts: vec![
                (
                    "Process engineer",
                    0.6,
                    vec![
                        (Some("mu"), 0.05, 38.0),
                        (Some("mu"), 0.95, 44.0),
                        (Some("sigma"), 0.5, 1.5),
                        (Some("sigma"), 0.9, 2.5),
                    ],
                    None,
                ),
                (
                    "Quality lead",
                    0.4,
                    vec![
                        (Some("mu"), 0.05, 40.0),
                        (Some("mu"), 0.95, 43.0),
                        (Some("sigma"), 0.5, 2.0),
                        (Some("sigma"), 0.9, 3.0),
                    ],
                    None,
                ),
            ],
            pooling: PoolMethod::Linear,
            robust: None,
            data: "tablet-coating.csv",
            mapping: Mapping::Values {
                column: "thickness_um".into(),
            },
        },
        Spec {
            file: "sensor-offset",
            title: "Temperature sensor offset",
            description: "Calibration offset of a sensor batch whose reading noise (sd 12 mK) is known from the data sheet.",
            unknown: "offset",
            unit: "mK",
            family: "normal-known-variance",
            high_stakes: false,
            fixed: Fixed {
                sigma: Some(12.0),
                ..Fixed::default()
            },
            experts: vec![
                (
                    "Metrologist",
                    0.5,
                    vec![(None, 0.05, -15.0), (None, 0.95, 5.0)],
                    None,
                ),
                (
                    "Supplier",
                    0.5,
                    vec![(None, 0.05, -5.0), (None, 0.95, 5.0)],
                    None,
                ),
            ],
            pooling: PoolMethod::Linear,
            robust: None,
            data: "sensor-offset.csv",
            mapping: Mapping::Values {
                column: "offset_mK".into(),
            },
        },
        Spec {
            file: "survey-answers",
            title: "Survey answer shares",
            description: "Shares of yes / no / unsure answers to a new survey question, from two survey methodologists.",
            unknown: "answer shares",
            unit: "share of respondents",
            family: "dirichlet-multinomial",
            high_stakes: false,
            fixed: Fixed {
                shares: Some(vec![0.5, 0.35, 0.15]),
                names: Some(vec!["yes".into(), "no".into(), "unsure".into()]),
                ..Fixed::default()
            },
            experts: vec![
                (
                    "Methodologist A",
                    0.5,
                    vec![(Some("yes"), 0.05, 0.35), (Some("yes"), 0.95, 0.65)],
                    None,
                ),
                (
                    "Methodologist B",
                    0.5,
                    vec![],
                    Some("mean=0.45;0.4;0.15,ess=30,names=yes;no;unsure"),
                ),
            ],
            pooling: PoolMethod::Linear,
            robust: None,
            data: "survey-answers.csv",
            mapping: Mapping::Category {
                column: "answer".into(),
                labels: vec!["yes".into(), "no".into(), "unsure".into()],
            },
        },
        Spec {
            file: "gauge-repeatability",
            title: "Gauge repeatability",
            description: "Variance of a bore gauge's deviations from a reference part (known mean 0), from a metrology technician and the gauge's maker.",
            unknown: "repeatability variance",
            unit: "square micrometres",
            family: "inverse-gamma-variance",
            high_stakes: false,
            fixed: Fixed {
                mu: Some(0.0),
                ..Fixed::default()
            },
            experts: vec![
                (
                    "Technician",
                    0.5,
                    vec![(Some("sigma"), 0.5, 2.0), (Some("sigma"), 0.9, 3.0)],
                    None,
                ),
                (
                    "Maker's data sheet",
                    0.5,
                    vec![],
                    Some("mean=4,ess=10,mu=0"),
                ),
            ],
            pooling: PoolMethod::Linear,
            robust: None,
            data: "gauge-repeatability.tsv",
            mapping: Mapping::Values {
                column: "deviation_um".into(),
            },
        },
    ];
    let dir = Path::new("sample-projects");
    for s in specs {
        let experts: Vec<Expert> = s
            .experts
            .iter()
            .map(|(name, weight, js, direct)| {
                let prior = match direct {
                    Some(text) => Prior::parse(s.family, text).expect("valid prior"),
                    None => {
                        let judgments: Vec<Judgment> = js
                            .iter()
                            .map(|(p, prob, v)| Judgment {
                                parameter: p.map(str::to_owned),
                                p: *prob,
                                value: *v,
                            })
                            .collect();
                        fit(s.family, &s.fixed, Scale::Unknowns, &judgments)
                            .expect("fit")
                            .prior
                    }
                };
                Expert {
                    name: (*name).to_owned(),
                    weight: *weight,
                    judgments: js
                        .iter()
                        .map(|(p, prob, v)| StoredJudgment {
                            parameter: p.map(str::to_owned),
                            p: *prob,
                            value: *v,
                        })
                        .collect(),
                    prior,
                    method: None,
                    changed: STAMP.to_owned(),
                }
            })
            .collect();
        let reduced = read_file(
            &dir.join(s.data),
            &s.mapping,
            &experts[0].prior,
            ReadOptions::default(),
        )
        .expect("data");
        let mut project = Project {
            format_version: priorwright::project::FORMAT_VERSION,
            scenario: Scenario {
                title: s.title.to_owned(),
                description: format!("{} {INVENTED}", s.description),
                unknown: s.unknown.to_owned(),
                unit: s.unit.to_owned(),
                family: s.family.to_owned(),
                high_stakes: s.high_stakes,
            },
            experts,
            pooling: Pooling {
                method: s.pooling,
                robust_weight: s.robust,
                pooled: None,
            },
            data: vec![DataSource {
                name: "bench data".to_owned(),
                path: Some(s.data.to_owned()),
                mapping: Some(s.mapping.clone()),
                missing_policy: Default::default(),
                statistics: reduced.data,
                rows: reduced.rows,
                missing: reduced.missing,
            }],
            history: None,
            checks: Default::default(),
            notes: "Invented for the demonstration; not a record of a real elicitation.".to_owned(),
            created: STAMP.to_owned(),
            changed: STAMP.to_owned(),
        };
        project.pooling.pooled = Some(project.log_pool().expect("pool"));
        save(&dir.join(format!("{}.ron", s.file)), &project).expect("saved");
        println!("wrote {}.ron", s.file);
    }
}
