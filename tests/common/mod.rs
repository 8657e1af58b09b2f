//! Shared fixtures for the integration tests: items and scenarios built in
//! code, and scenario folders written into a fresh temporary directory.
//!
//! Each test crate uses only part of this module, so unused helpers are
//! allowed here.

#![allow(dead_code)]

use std::path::Path;

use chrono::NaiveDate;
use lotwright::input::Snapshot;
use lotwright::model::{BucketKind, Calendar, Item, Plan, Resource, Routing, Scenario};
use tempfile::TempDir;

/// A plain item: constant setup and holding cost, no unit cost, no stock,
/// no lead time, no lot constraints, no backlog.
pub fn item(demand: &[f64], setup_cost: f64, holding_cost: f64) -> Item {
    Item::simple("A", demand, setup_cost, holding_cost)
}

/// A weekly calendar of `periods` buckets from Monday 2027-01-04.
pub fn calendar(periods: usize) -> Calendar {
    Calendar {
        start: NaiveDate::from_ymd_opt(2027, 1, 4).expect("a valid date"),
        kind: BucketKind::Week,
        periods,
    }
}

/// A scenario of the given items (all of one horizon), with no resources.
pub fn scenario(items: Vec<Item>) -> Scenario {
    let periods = items.first().map_or(0, Item::periods);
    assert!(
        items.iter().all(|i| i.periods() == periods),
        "every item of a scenario needs the same horizon"
    );
    Scenario {
        name: "test".into(),
        currency: None,
        calendar: calendar(periods),
        items,
        resources: Vec::new(),
        routings: Vec::new(),
        frozen: 0,
        bom: Vec::new(),
        period_offset: 0,
    }
}

/// A plan for a scenario of one item.
pub fn single_plan(receipts: &[f64]) -> Plan {
    Plan {
        receipts: vec![receipts.to_vec()],
    }
}

/// Writes the files into a fresh temporary folder and returns it (the folder
/// is removed when the value is dropped).
pub fn scenario_dir(files: &[(&str, &str)]) -> TempDir {
    let dir = tempfile::tempdir().expect("a temporary folder");
    write_files(dir.path(), files);
    dir
}

/// Writes `(name, contents)` pairs into `dir`.
pub fn write_files(dir: &Path, files: &[(&str, &str)]) {
    for (name, contents) in files {
        std::fs::write(dir.join(name), contents).expect("a fixture file written");
    }
}

/// scenario.toml text for a weekly horizon from 2027-01-04.
pub fn weekly_toml(periods: usize) -> String {
    format!("name = \"fixture\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = {periods}\n")
}

/// demand.csv text with one `period` row per bucket of positive demand.
pub fn demand_csv(item: &str, demand: &[f64]) -> String {
    let mut text = String::from("item,period,quantity\n");
    for (t, q) in demand.iter().enumerate() {
        if *q > 0.0 {
            text.push_str(&format!("{item},{},{q}\n", t + 1));
        }
    }
    text
}

/// Asserts that two costs agree to a relative 1e-9 (and absolute 1e-9 near 0).
pub fn assert_cost_eq(got: f64, expected: f64, what: &str) {
    let scale = 1.0f64.max(expected.abs());
    assert!(
        (got - expected).abs() <= 1e-9 * scale,
        "{what}: got {got}, expected {expected}"
    );
}

/// Runs the lotwright binary with `args`: its exit code, stdout and stderr.
pub fn lotwright(args: &[&str]) -> (i32, String, String) {
    let output = std::process::Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .args(args)
        .output()
        .expect("the binary runs");
    (
        output.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&output.stdout).into_owned(),
        String::from_utf8_lossy(&output.stderr).into_owned(),
    )
}

/// A scenario of the given items (one horizon) on one line "R" of
/// `capacity` a bucket, 1 unit of capacity per unit and no setup time, or
/// with no resources when `capacity` is `None` (the rolling-run tests).
pub fn on_one_line(items: Vec<Item>, capacity: Option<f64>) -> Scenario {
    let periods = items[0].periods();
    let (resources, routings) = match capacity {
        None => (Vec::new(), Vec::new()),
        Some(c) => (
            vec![Resource {
                id: "R".into(),
                unit: "capacity units".into(),
                capacity: vec![c; periods],
                overtime_capacity: vec![0.0; periods],
                overtime_cost: 0.0,
                capacity_cost: None,
            }],
            (0..items.len())
                .map(|item| Routing {
                    item,
                    resource: 0,
                    per_unit: 1.0,
                    setup_time: 0.0,
                })
                .collect(),
        ),
    };
    Scenario {
        name: "roll".into(),
        currency: None,
        calendar: calendar(periods),
        items,
        resources,
        routings,
        frozen: 0,
        bom: Vec::new(),
        period_offset: 0,
    }
}

/// Forecast snapshots: `rows[k][i]` is item i's forecast made at bucket k,
/// for buckets k, k+1, ... (cut at the horizon).
pub fn snapshots(periods: usize, rows: &[Vec<Vec<f64>>]) -> Vec<Snapshot> {
    rows.iter()
        .enumerate()
        .map(|(k, by_item)| Snapshot {
            bucket: k,
            demand: by_item
                .iter()
                .map(|row| {
                    let mut demand = vec![0.0; periods];
                    for (j, q) in row.iter().enumerate() {
                        if k + j < periods {
                            demand[k + j] = *q;
                        }
                    }
                    demand
                })
                .collect(),
            file: format!("{k}.csv").into(),
        })
        .collect()
}

/// Snapshots of one item: `rows[k]` is the forecast made at bucket k.
pub fn one_item_snapshots(periods: usize, rows: &[&[f64]]) -> Vec<Snapshot> {
    let rows: Vec<Vec<Vec<f64>>> = rows.iter().map(|row| vec![row.to_vec()]).collect();
    snapshots(periods, &rows)
}
