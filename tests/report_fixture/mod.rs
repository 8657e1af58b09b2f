//! The scenario the report tests share: three items over eight weeks, two
//! of them on one press whose capacity is cut in week 3, a fixed lot for
//! the rule in use, a currency, and an item id with markup in it (ids are
//! user input, and the reports must escape them). Invented data.

#![allow(dead_code)]

use std::path::Path;
use std::process::{Command, Output};

use lotwright::model::Scenario;
use lotwright::solve::{self, Outcome};

/// An item id that is also markup.
pub const MARKUP_ID: &str = "PAN<b>&co";

pub const FILES: [(&str, &str); 7] = [
    (
        "scenario.toml",
        "name = \"Report fixture\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 8\ncurrency = \"EUR\"\n",
    ),
    (
        "items.csv",
        "item,setup_cost,holding_cost,unit_cost,initial_stock,safety_stock,fixed_lot\n\
         PAN<b>&co,200,0.4,5,100,50,600\n\
         TIN,150,0.3,4,0,,500\n\
         RACK,90,0.2,3,50,,\n",
    ),
    (
        "demand.csv",
        "item,period,quantity\n\
         PAN<b>&co,1,120\nPAN<b>&co,2,150\nPAN<b>&co,3,200\nPAN<b>&co,4,180\n\
         PAN<b>&co,5,160\nPAN<b>&co,6,220\nPAN<b>&co,7,240\nPAN<b>&co,8,150\n\
         TIN,1,80\nTIN,2,100\nTIN,3,90\nTIN,4,130\nTIN,5,120\nTIN,6,110\nTIN,7,90\nTIN,8,100\n\
         RACK,2,60\nRACK,4,70\nRACK,6,80\nRACK,8,50\n",
    ),
    (
        "resources.csv",
        "resource,capacity,overtime_capacity,overtime_cost\nPRESS,900,200,1.5\n",
    ),
    ("capacity.csv", "resource,period,capacity\nPRESS,3,500\n"),
    (
        "routing.csv",
        "item,resource,per_unit,setup_time\nPAN<b>&co,PRESS,1.5,60\nTIN,PRESS,1.0,40\n",
    ),
    ("receipts.csv", "item,period,quantity\nTIN,1,60\n"),
];

/// Writes the fixture into a fresh temporary folder.
pub fn folder() -> tempfile::TempDir {
    let dir = tempfile::tempdir().expect("a temporary folder");
    for (name, text) in FILES {
        std::fs::write(dir.path().join(name), text).expect("a fixture file written");
    }
    dir
}

/// The fixture read and planned through the library.
pub fn planned() -> (tempfile::TempDir, Scenario, Outcome) {
    let dir = folder();
    let scenario = lotwright::input::read_scenario(dir.path()).expect("the fixture reads");
    let outcome =
        solve::plan_scenario(&scenario, &solve::Options::default()).expect("the fixture plans");
    (dir, scenario, outcome)
}

pub fn lotwright(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .args(args)
        .output()
        .expect("the binary runs")
}

pub fn path(p: &Path) -> &str {
    p.to_str().expect("a UTF-8 temporary path")
}

/// `plan DIR --out OUT --json`, asserting exit 0; returns the JSON.
pub fn plan_out(dir: &Path, out: &Path) -> serde_json::Value {
    let output = lotwright(&["plan", path(dir), "--out", path(out), "--json"]);
    assert_eq!(
        output.status.code(),
        Some(0),
        "stderr: {}",
        String::from_utf8_lossy(&output.stderr)
    );
    serde_json::from_slice(&output.stdout).expect("stdout is one JSON object")
}
