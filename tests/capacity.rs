//! Shared capacity through the command line: the demo plant is solved to
//! proven optimality within capacity, and a scenario whose capacity cannot
//! carry its demand is explained.

mod common;

use common::lotwright;

fn write(dir: &std::path::Path, files: &[(&str, &str)]) {
    for (name, body) in files {
        std::fs::write(dir.join(name), body).unwrap();
    }
}

#[test]
fn capacity_shortfall_is_explained_with_resource_bucket_and_amount() {
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        &[
            (
                "scenario.toml",
                "name = \"short\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 3\n",
            ),
            (
                "items.csv",
                "item,setup_cost,holding_cost\nA,50,1\nB,50,1\n",
            ),
            (
                "demand.csv",
                "item,period,quantity\nA,1,5\nA,2,10\nB,2,10\nB,3,4\n",
            ),
            ("resources.csv", "resource,capacity\nLINE,10\n"),
            (
                "routing.csv",
                "item,resource,per_unit,setup_time\nA,LINE,1,1\nB,LINE,1,1\n",
            ),
        ],
    );
    let (code, stdout, _) = lotwright(&["plan", dir.path().to_str().unwrap(), "--json"]);
    assert_eq!(code, 1, "{stdout}");
    let json: serde_json::Value = serde_json::from_str(&stdout).unwrap();
    assert_eq!(json["status"], "infeasible");
    let notes = json["notes"].to_string();
    // By period 2 the load is 5 + 10 + 10 units plus two setups of 1 = 27
    // against 20 of capacity: 7 short.
    assert!(notes.contains("LINE"), "{notes}");
    assert!(notes.contains("period 2"), "{notes}");
    assert!(notes.contains("by 7"), "{notes}");
    assert!(notes.contains("overtime"), "{notes}");
    // The plan printed meanwhile is not one to release, and says so.
    assert!(
        notes.contains("the plan shows A, B lot-for-lot; that breaks a constraint as well and is not to be released"),
        "{notes}"
    );
    let (code, table, _) = lotwright(&["plan", dir.path().to_str().unwrap()]);
    assert_eq!(code, 1, "{table}");
    assert!(table.lines().all(|l| l.chars().count() <= 100), "{table}");
    // The headline is wrapped; read it as one line.
    let words = table.split_whitespace().collect::<Vec<_>>().join(" ");
    assert!(
        words.contains("infeasible: no plan meets every constraint"),
        "{table}"
    );
    assert!(
        words.contains(
            "The orders shown (lot-for-lot where no plan exists) break a constraint as well"
        ),
        "{table}"
    );
}

#[test]
fn a_shortfall_in_the_first_period_is_named_as_that_period() {
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        &[
            (
                "scenario.toml",
                "name = \"first\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 2\n",
            ),
            (
                "items.csv",
                "item,setup_cost,holding_cost\nA,50,1\nB,50,1\n",
            ),
            ("demand.csv", "item,period,quantity\nA,1,50\nB,1,50\n"),
            ("resources.csv", "resource,capacity\nP,100\n"),
            (
                "routing.csv",
                "item,resource,per_unit,setup_time\nA,P,1,30\nB,P,1,30\n",
            ),
        ],
    );
    let (code, stdout, _) = lotwright(&["plan", dir.path().to_str().unwrap(), "--json"]);
    assert_eq!(code, 1, "{stdout}");
    let json: serde_json::Value = serde_json::from_str(&stdout).unwrap();
    let notes = json["notes"].to_string();
    // 50 + 50 units and two setups of 30 against 100 in period 1: 60 short.
    assert!(
        notes.contains("resource P: in period 1 the load"),
        "{notes}"
    );
    assert!(
        notes.contains("by 60; 60 more overtime capacity in that period"),
        "{notes}"
    );
}

#[test]
fn the_demo_plant_is_planned_within_capacity_and_proven_optimal() {
    let demo = concat!(env!("CARGO_MANIFEST_DIR"), "/demo-data/harbor-bakeware");
    // A generous limit: the proof takes about half a minute on two idle
    // cores, longer on a loaded machine, and the test is about the result.
    let (code, stdout, stderr) = lotwright(&[
        "plan",
        demo,
        "--json",
        "--method",
        "exact",
        "--time-limit",
        "900",
    ]);
    assert_eq!(code, 0, "{stderr}");
    let json: serde_json::Value = serde_json::from_str(&stdout).unwrap();
    assert_eq!(json["status"], "optimal");
    assert_eq!(json["overloads"].as_array().map(Vec::len), Some(0));
    assert_eq!(json["shortages"].as_array().map(Vec::len), Some(0));
    let solver = json["solver"].as_str().unwrap();
    assert!(solver.contains("milp"), "{solver}");
    let components = json["components"].as_array().unwrap();
    assert!(components.iter().all(|c| c["status"] == "optimal"));
}

#[test]
fn a_shortfall_the_cumulative_test_misses_is_found_by_the_extra_capacity_model() {
    // Item A needs both lines, but LINE-1 runs only in week 1 and LINE-2 only
    // in week 2: each line has room enough over the horizon, no single week
    // has both. The least extra capacity is 5 units on one line.
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        &[
            (
                "scenario.toml",
                "name = \"split\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 2\n",
            ),
            ("items.csv", "item,setup_cost,holding_cost\nA,50,1\n"),
            ("demand.csv", "item,period,quantity\nA,2,5\n"),
            ("resources.csv", "resource,capacity\nLINE-1,10\nLINE-2,10\n"),
            (
                "capacity.csv",
                "resource,period,capacity\nLINE-1,2,0\nLINE-2,1,0\n",
            ),
            (
                "routing.csv",
                "item,resource,per_unit,setup_time\nA,LINE-1,1,0\nA,LINE-2,1,0\n",
            ),
        ],
    );
    let (code, stdout, _) = lotwright(&["plan", dir.path().to_str().unwrap(), "--json"]);
    assert_eq!(code, 1, "{stdout}");
    let json: serde_json::Value = serde_json::from_str(&stdout).unwrap();
    let notes = json["notes"].to_string();
    assert!(notes.contains("least extra capacity"), "{notes}");
    assert!(notes.contains("5 in period"), "{notes}");
}

#[test]
fn the_least_extra_capacity_is_the_least() {
    // 12 units due in week 2, 10 of capacity a week, a setup takes 5. One
    // lot needs 17 in week 2 (7 short); lots of 5 in week 1 and 7 in week 2
    // need 10 and 12 (2 short): the least extra capacity is 2.
    let dir = tempfile::tempdir().unwrap();
    write(
        dir.path(),
        &[
            (
                "scenario.toml",
                "name = \"setup\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 2\n",
            ),
            ("items.csv", "item,setup_cost,holding_cost\nA,50,1\n"),
            ("demand.csv", "item,period,quantity\nA,2,12\n"),
            ("resources.csv", "resource,capacity\nL,10\n"),
            (
                "routing.csv",
                "item,resource,per_unit,setup_time\nA,L,1,5\n",
            ),
        ],
    );
    let (code, stdout, _) = lotwright(&["plan", dir.path().to_str().unwrap(), "--json"]);
    assert_eq!(code, 1, "{stdout}");
    let json: serde_json::Value = serde_json::from_str(&stdout).unwrap();
    let notes = json["notes"].to_string();
    assert!(
        notes.contains("least extra capacity that makes a plan possible is 2 in period"),
        "{notes}"
    );
}
