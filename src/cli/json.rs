//! The JSON contract (field names are a promise to scripts; see DESIGN §7).
//! Values that do not exist, and any non-finite number, are `null`.

use crate::analysis::summary::{ParameterSummary, PredictiveSummary};
use crate::distribution::Interval;
use crate::elicit::{Belief, Mixture};
use crate::family::{Conflict, Value as HyperValue};
use serde_json::{Map, Value, json};

fn num(x: f64) -> Value {
    if x.is_finite() { json!(x) } else { Value::Null }
}

fn opt(x: Option<f64>) -> Value {
    x.map_or(Value::Null, num)
}

fn named(values: &[(&'static str, HyperValue)]) -> Value {
    let mut m = Map::new();
    for (k, v) in values {
        let v = match v {
            HyperValue::Number(x) => num(*x),
            HyperValue::List(xs) => Value::Array(xs.iter().map(|x| num(*x)).collect()),
        };
        m.insert((*k).to_owned(), v);
    }
    Value::Object(m)
}

fn interval(i: &Interval) -> Value {
    let mut v = json!({ "level": num(i.level), "lower": num(i.lower), "upper": num(i.upper) });
    if !i.pieces.is_empty() {
        v["pieces"] = Value::Array(
            i.pieces
                .iter()
                .map(|(a, b)| json!([num(*a), num(*b)]))
                .collect(),
        );
    }
    v
}

fn parameter(p: &ParameterSummary) -> Value {
    json!({
        "name": p.name,
        "distribution": p.distribution.name(),
        "mean": opt(p.mean),
        "sd": opt(p.sd),
        "mode": opt(p.mode),
        "median": num(p.median),
        "quantiles": p.quantiles.iter().map(|(p, v)| json!({"p": p, "value": num(*v)})).collect::<Vec<_>>(),
        "central_interval": interval(&p.central),
        "hpd_interval": interval(&p.hpd),
        "cdf": p.cdf.iter().map(|c| json!({"x": num(c.x), "cdf": num(c.cdf), "sf": num(c.sf)})).collect::<Vec<_>>(),
    })
}

fn components(m: &Mixture) -> Value {
    Value::Array(
        m.components()
            .iter()
            .map(|(w, p)| {
                json!({
                    "weight": num(*w),
                    "hyperparameters": named(&p.hyperparameters()),
                    "pseudo_observations": named(&p.pseudo_observations()),
                })
            })
            .collect(),
    )
}

fn head(belief: &Belief) -> Map<String, Value> {
    let mut m = Map::new();
    m.insert("family".into(), json!(belief.id()));
    match belief {
        Belief::One(prior) => {
            m.insert("hyperparameters".into(), named(&prior.hyperparameters()));
            m.insert(
                "pseudo_observations".into(),
                named(&prior.pseudo_observations()),
            );
            m.insert("as_if".into(), json!(prior.as_if()));
        }
        Belief::Mix(mix) => {
            m.insert("components".into(), components(mix));
        }
    }
    m
}

fn with_pool(mut m: Map<String, Value>, pooled: Option<&Mixture>) -> Map<String, Value> {
    if let Some(mix) = pooled {
        m.insert(
            "pool".into(),
            json!({ "method": "log", "components": components(mix) }),
        );
    }
    m
}

fn finish(m: Map<String, Value>) -> String {
    let mut s = serde_json::to_string_pretty(&Value::Object(m)).unwrap_or_default();
    s.push('\n');
    s
}

/// `describe --json`.
pub fn describe(prior: &Belief, pooled: Option<&Mixture>, params: &[ParameterSummary]) -> String {
    let mut m = with_pool(head(prior), pooled);
    m.insert(
        "parameters".into(),
        Value::Array(params.iter().map(parameter).collect()),
    );
    finish(m)
}

/// What `update` reports.
pub struct UpdateReport<'a> {
    /// The prior.
    pub prior: &'a Belief,
    /// The priors a logarithmic pool was made of, if it was.
    pub pooled: Option<&'a Mixture>,
    /// The posterior.
    pub posterior: &'a Belief,
    /// Posterior summaries.
    pub params: &'a [ParameterSummary],
    /// ln p(data | prior).
    pub ln_ml: f64,
    /// Prior's share of the posterior information.
    pub share: f64,
    /// Conflict check, where the family has one.
    pub conflict: Option<Conflict>,
}

fn conflict(c: &Conflict) -> Value {
    json!({
        "statistic": c.statistic,
        "observed": num(c.observed),
        "lower_tail": num(c.lower_tail),
        "upper_tail": num(c.upper_tail),
        "p_value": num(c.p_value),
        "mid_p": c.mid_p,
    })
}

/// `update --json`: hyperparameters and parameters describe the posterior.
pub fn update(r: &UpdateReport<'_>) -> String {
    let mut m = with_pool(head(r.posterior), r.pooled);
    m.insert(
        "parameters".into(),
        Value::Array(r.params.iter().map(parameter).collect()),
    );
    m.insert("log_marginal_likelihood".into(), num(r.ln_ml));
    if let Some(c) = &r.conflict {
        m.insert("conflict".into(), conflict(c));
    }
    m.insert("prior_share".into(), num(r.share));
    let mut prior = head(r.prior);
    prior.remove("family");
    prior.remove("as_if");
    m.insert("prior".into(), Value::Object(prior));
    finish(m)
}

fn predictive(p: &PredictiveSummary) -> Map<String, Value> {
    let mut m = Map::new();
    if let Some(c) = &p.category {
        m.insert("category".into(), json!(c));
    }
    m.insert("distribution".into(), json!(p.distribution));
    let mut params = Map::new();
    for (k, v) in &p.parameters {
        params.insert((*k).to_owned(), num(*v));
    }
    m.insert("parameters".into(), Value::Object(params));
    m.insert("mean".into(), opt(p.mean));
    m.insert("sd".into(), opt(p.sd));
    m.insert(
        "quantiles".into(),
        Value::Array(
            p.quantiles
                .iter()
                .map(|(pr, v)| json!({"p": pr, "value": num(*v)}))
                .collect(),
        ),
    );
    m.insert(
        "at".into(),
        Value::Array(
            p.at.iter()
                .map(|a| json!({"x": num(a.x), "density": num(a.density), "cdf": num(a.cdf)}))
                .collect(),
        ),
    );
    m
}

/// `predict --json`.
pub fn predict(
    used: &Belief,
    pooled: Option<&Mixture>,
    summaries: &[PredictiveSummary],
    posterior: bool,
) -> String {
    let mut m = with_pool(head(used), pooled);
    m.insert(
        "predictive_of".into(),
        json!(if posterior { "posterior" } else { "prior" }),
    );
    let pred = if summaries.len() == 1 && summaries[0].category.is_none() {
        Value::Object(predictive(&summaries[0]))
    } else {
        let mut top = Map::new();
        top.insert("distribution".into(), json!("dirichlet-multinomial"));
        top.insert(
            "categories".into(),
            Value::Array(
                summaries
                    .iter()
                    .map(|s| Value::Object(predictive(s)))
                    .collect(),
            ),
        );
        Value::Object(top)
    };
    m.insert("predictive".into(), pred);
    finish(m)
}

/// `fit --json`: the fitted prior (usable as --prior) and the `fit` object.
pub fn fit(prior: &crate::family::Prior, fit: &Value) -> String {
    let mut m = head(&Belief::One(prior.clone()));
    m.insert("fit".into(), fit.clone());
    finish(m)
}
