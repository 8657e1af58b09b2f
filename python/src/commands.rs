//! The commands as Python functions: `plan`, `check`, `compare`, `roll`
//! and `eoq`. Each takes folder paths and plain values, checks them as the
//! command line does, runs the library on a thread of its own (see
//! `wait_for`) and returns the JSON text the command line prints with
//! `--json`, and for `plan` the files `plan --out` writes.

use std::path::Path;

use lotwright::error::Error;
use lotwright::report;
use lotwright::roll::{roll as roll_method, Quiet, RollOptions};
use lotwright::single::eoq as eoq_model;
use lotwright::solve::{self, Outcome};
use pyo3::prelude::*;
use pyo3::types::{PyBytes, PyDict};

use crate::{json_text, milp_options, read_scenario, to_py, usage, wait_for};

/// Plans a scenario folder, changed by `sets` (as `compare --set`) if
/// given. Returns `(json, files)`: the JSON of `plan
/// --json` and a dict of the files of `plan --out` by name (the four CSV
/// files always; plan.xlsx and report.html too with `documents`).
#[pyfunction]
#[pyo3(signature = (dir, sets=Vec::new(), method=None, frozen=None, time_limit=None, gap=None, threads=None, solver="auto", documents=false))]
#[allow(clippy::too_many_arguments)]
pub fn plan<'py>(
    py: Python<'py>,
    dir: &str,
    sets: Vec<String>,
    method: Option<String>,
    frozen: Option<usize>,
    time_limit: Option<f64>,
    gap: Option<f64>,
    threads: Option<u32>,
    solver: &str,
    documents: bool,
) -> PyResult<(String, Bound<'py, PyDict>)> {
    let milp = milp_options(time_limit, gap, threads, solver)?;
    let cancel = milp.interrupt.clone();
    let scenario = read_scenario(dir, &sets, frozen)?;
    let options = solve::Options { method, milp };
    let (scenario, outcome) = wait_for(py, cancel, move || {
        let outcome = solve::plan_scenario(&scenario, &options);
        (scenario, outcome)
    })?;
    let outcome: Outcome = outcome.map_err(to_py)?;
    let mut files: Vec<(&str, Vec<u8>)> = vec![
        ("plan.csv", report::csv::plan(&scenario, &outcome)),
        (
            "comparison.csv",
            report::csv::comparison(&scenario, &outcome),
        ),
        ("records.csv", report::csv::records(&scenario, &outcome)),
        ("load.csv", report::csv::load(&scenario, &outcome)),
    ];
    if documents {
        files.push((
            "plan.xlsx",
            report::xlsx::plan(&scenario, &outcome).map_err(to_py)?,
        ));
        files.push((
            "report.html",
            report::html::plan(&scenario, &outcome).into_bytes(),
        ));
    }
    let dict = PyDict::new(py);
    for (name, bytes) in files {
        dict.set_item(name, PyBytes::new(py, &bytes))?;
    }
    let json = json_text(&report::json::plan(&scenario, &outcome))?;
    Ok((json, dict))
}

/// Checks a plan file against a scenario folder; the JSON of `check
/// --json`.
#[pyfunction]
#[pyo3(signature = (dir, orders, frozen=None, time_limit=None, gap=None, threads=None, solver="auto"))]
#[allow(clippy::too_many_arguments)]
pub fn check(
    py: Python<'_>,
    dir: &str,
    orders: &str,
    frozen: Option<usize>,
    time_limit: Option<f64>,
    gap: Option<f64>,
    threads: Option<u32>,
    solver: &str,
) -> PyResult<String> {
    let milp = milp_options(time_limit, gap, threads, solver)?;
    let cancel = milp.interrupt.clone();
    let scenario = read_scenario(dir, &[], frozen)?;
    let proposal = lotwright::input::read_orders(Path::new(orders), &scenario).map_err(to_py)?;
    let value = wait_for(py, cancel, move || {
        let report = lotwright::check::check(&scenario, &proposal, &milp);
        report::json::check(&scenario, &report)
    })?;
    json_text(&value)
}

/// Plans two scenario folders (or one and a copy changed by `sets`, in
/// the syntax of `--set`) with one method; the JSON of `compare --json`.
/// `names` are the sides' names in the output (the folders by default).
#[pyfunction]
#[pyo3(signature = (a, b=None, sets=Vec::new(), names=(None, None), method=None, frozen=None, time_limit=None, gap=None, threads=None, solver="auto"))]
#[allow(clippy::too_many_arguments)]
pub fn compare(
    py: Python<'_>,
    a: &str,
    b: Option<&str>,
    sets: Vec<String>,
    names: (Option<String>, Option<String>),
    method: Option<String>,
    frozen: Option<usize>,
    time_limit: Option<f64>,
    gap: Option<f64>,
    threads: Option<u32>,
    solver: &str,
) -> PyResult<String> {
    use lotwright::compare::{apply, parse_override, Comparison, Side};
    let milp = milp_options(time_limit, gap, threads, solver)?;
    let cancel = milp.interrupt.clone();
    let overrides = sets
        .iter()
        .map(|text| parse_override(text))
        .collect::<lotwright::Result<Vec<_>>>()
        .map_err(to_py)?;
    if b.is_none() && overrides.is_empty() {
        return Err(usage(
            "compare needs a second scenario, or sets to make B from A (for example sets=['capacity=120%'])",
        ));
    }
    let b_dir = b.unwrap_or(a);
    let scenario_a = read_scenario(a, &[], frozen)?;
    let mut scenario_b = read_scenario(b_dir, &[], frozen)?;
    for o in &overrides {
        apply(&mut scenario_b, o).map_err(to_py)?;
    }
    let name_a = names.0.unwrap_or_else(|| a.to_string());
    let mut name_b = names.1.unwrap_or_else(|| b_dir.to_string());
    if !sets.is_empty() {
        name_b = format!("{name_b} with {}", sets.join(", "));
    }
    let options = solve::Options { method, milp };
    let value = wait_for(py, cancel, move || {
        let planned_a = solve::plan_scenario(&scenario_a, &options)?;
        let planned_b = solve::plan_scenario(&scenario_b, &options)?;
        let comparison = Comparison::new(
            Side {
                name: name_a,
                scenario: scenario_a,
                result: planned_a.chosen,
            },
            Side {
                name: name_b,
                scenario: scenario_b,
                result: planned_b.chosen,
            },
        );
        Ok::<_, Error>(report::json::compare(&comparison))
    })?
    .map_err(to_py)?;
    json_text(&value)
}

/// A rolling run over a folder of forecast snapshots (the scenario changed
/// by `sets`, as `compare --set`, if given); the JSON of `roll
/// --json`. As on the command line, no `methods` means the exact method
/// and every rule, and a change cost runs the exact method with and
/// without it; `plain_too=False` runs only the priced one (one policy of a
/// grid).
#[pyfunction]
#[pyo3(signature = (dir, history, sets=Vec::new(), horizon=13, methods=Vec::new(), change_cost=None, plain_too=true, frozen=None, time_limit=None, threads=None, end_correction=false))]
#[allow(clippy::too_many_arguments)]
pub fn roll(
    py: Python<'_>,
    dir: &str,
    history: &str,
    sets: Vec<String>,
    horizon: usize,
    methods: Vec<String>,
    change_cost: Option<f64>,
    plain_too: bool,
    frozen: Option<usize>,
    time_limit: Option<f64>,
    threads: Option<u32>,
    end_correction: bool,
) -> PyResult<String> {
    let milp = milp_options(Some(time_limit.unwrap_or(5.0)), None, threads, "auto")?;
    let cancel = milp.interrupt.clone();
    if horizon == 0 {
        return Err(usage("horizon must be at least 1 bucket"));
    }
    let change_cost = match change_cost {
        Some(c) if !(c.is_finite() && c >= 0.0) => {
            return Err(usage(format!(
                "change_cost must be a number of 0 or more, got {c}"
            )))
        }
        other => other.unwrap_or(0.0),
    };
    let scenario = read_scenario(dir, &sets, frozen)?;
    let frozen = scenario.frozen;
    if frozen >= horizon {
        return Err(usage(format!(
            "a freeze of {frozen} buckets leaves nothing to plan in a horizon of {horizon}; freeze fewer or look further ahead"
        )));
    }
    let history = lotwright::input::read_history(Path::new(history), &scenario).map_err(to_py)?;
    let runs = roll_runs(&scenario, methods, change_cost, plain_too)?;
    let time_limit = milp.time_limit;
    let value = wait_for(py, cancel, move || {
        let mut results = Vec::new();
        for (method, cost) in runs {
            let options = RollOptions {
                horizon,
                frozen,
                change_cost: cost,
                change_cost_per_unit: 0.0,
                method,
                milp: milp.clone(),
                service_level: None,
                end_correction,
            };
            results.push(roll_method(&scenario, &history, &options, &Quiet)?);
        }
        let run = report::table::RollRun {
            scenario: &scenario,
            weeks: history.len(),
            first: history.first().map_or(0, |s| s.bucket),
            horizon,
            frozen,
            change_cost,
            frontier: false,
            time_limit,
            results: &results,
            safety: None,
            end_correction,
        };
        Ok::<_, Error>(report::json::roll(&run))
    })?
    .map_err(to_py)?;
    json_text(&value)
}

/// The (method, change cost) runs of a roll, as the command line picks
/// them.
fn roll_runs(
    scenario: &lotwright::model::Scenario,
    methods: Vec<String>,
    change_cost: f64,
    plain_too: bool,
) -> PyResult<Vec<(String, f64)>> {
    let mut methods: Vec<String> = if methods.is_empty() {
        solve::METHOD_NAMES
            .iter()
            .filter(|m| **m != "fixed-lot" || scenario.items.iter().any(|i| i.fixed_lot.is_some()))
            .map(|m| m.to_string())
            .collect()
    } else {
        methods
    };
    for m in &mut methods {
        if m == "optimal" {
            *m = solve::EXACT.to_string();
        }
        if !solve::METHOD_NAMES.contains(&m.as_str()) {
            return Err(usage(format!(
                "unknown method {m}; choose one of {}",
                solve::METHOD_NAMES.join(", ")
            )));
        }
    }
    let mut runs = Vec::new();
    for m in methods {
        let exact = m == solve::EXACT;
        if !(exact && change_cost > 0.0) || plain_too {
            runs.push((m.clone(), 0.0));
        }
        if exact && change_cost > 0.0 {
            runs.push((m, change_cost));
        }
    }
    Ok(runs)
}

/// The classic EOQ and its variants; the JSON of `eoq --json`.
/// `price_breaks` is in the syntax of `--price-breaks` (`Q:PRICE,...`).
#[pyfunction]
#[pyo3(signature = (demand, setup_cost, holding_cost=None, production_rate=None, backorder_cost=None, price_breaks=None, carrying_rate=None, lot=None))]
#[allow(clippy::too_many_arguments)]
pub fn eoq(
    demand: f64,
    setup_cost: f64,
    holding_cost: Option<f64>,
    production_rate: Option<f64>,
    backorder_cost: Option<f64>,
    price_breaks: Option<&str>,
    carrying_rate: Option<f64>,
    lot: Option<f64>,
) -> PyResult<String> {
    let price_breaks = price_breaks
        .map(eoq_model::parse_price_breaks)
        .transpose()
        .map_err(to_py)?;
    let input = eoq_model::EoqInput {
        demand,
        setup_cost,
        holding_cost,
        production_rate,
        backorder_cost,
        price_breaks,
        carrying_rate,
        lot,
    };
    let result = eoq_model::solve(&input).map_err(to_py)?;
    // The same JSON as `lotwright eoq --json` without --time-unit and
    // --unit-cost: the checks that need no unit still run.
    let hints = lotwright::single::eoq_units::check(&result, None, None);
    let value = report::eoq::json(&result, None, &hints).map_err(to_py)?;
    json_text(&value)
}
