//! `compare --set` with a signed value adds to what is there, and says so;
//! a side without a plan is never said to match the other item by item; a
//! shutdown week (capacity 0 in capacity.csv) closes its overtime too,
//! unless the row gives overtime. Invented data.

mod common;

use common::{lotwright, scenario_dir, weekly_toml};
use serde_json::Value;

/// Two items on LINE, 100 a week with 30 of overtime at 2; holding is dear,
/// so the least-cost plan is lot-for-lot (load 70 a week).
fn fixture() -> tempfile::TempDir {
    scenario_dir(&[
        ("scenario.toml", &weekly_toml(4)),
        ("items.csv", "item,setup_cost,holding_cost\nA,10,5\nB,10,5\n"),
        (
            "demand.csv",
            "item,period,quantity\nA,1,30\nA,2,30\nA,3,30\nA,4,30\nB,1,40\nB,2,40\nB,3,40\nB,4,40\n",
        ),
        (
            "resources.csv",
            "resource,capacity,overtime_capacity,overtime_cost\nLINE,100,30,2\n",
        ),
        (
            "routing.csv",
            "item,resource,per_unit,setup_time\nA,LINE,1,0\nB,LINE,1,0\n",
        ),
    ])
}

fn compare(dir: &tempfile::TempDir, set: &str, json: bool) -> (i32, String, String) {
    let mut args = vec!["compare", dir.path().to_str().unwrap(), "--set", set];
    if json {
        args.push("--json");
    }
    lotwright(&args)
}

fn capacity(json: &Value, side: &str) -> f64 {
    json["resources"][0][side]["capacity"]
        .as_f64()
        .expect("capacity")
}

#[test]
fn a_signed_capacity_is_added_to_every_period_and_echoed_as_an_addition() {
    let dir = fixture();
    let (code, out, err) = compare(&dir, "capacity.LINE=+10", true);
    assert_eq!(code, 0, "{err}");
    let json: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(capacity(&json, "a"), 400.0);
    assert_eq!(capacity(&json, "b"), 440.0, "110 in each of 4 weeks");
    let (_, down, err) = compare(&dir, "capacity.LINE=-25", true);
    let down: Value = serde_json::from_str(&down).unwrap_or_else(|_| panic!("{err}"));
    assert_eq!(capacity(&down, "b"), 300.0, "75 in each of 4 weeks");
    let (_, up, _) = compare(&dir, "capacity.LINE=+10%", true);
    let up: Value = serde_json::from_str(&up).unwrap();
    assert!((capacity(&up, "b") - 440.0).abs() < 1e-9, "10 % more");
    // The echo says what was done, not only what was typed.
    let (_, text, _) = compare(&dir, "capacity.LINE=+10", false);
    assert!(
        text.contains("capacity of LINE raised by 10 in every period"),
        "{text}"
    );
    let (_, text, _) = compare(&dir, "capacity.LINE=80", false);
    assert!(
        text.contains("capacity of LINE set to 80 in every period"),
        "{text}"
    );
}

#[test]
fn a_subtraction_below_zero_is_refused_with_a_message() {
    let dir = fixture();
    let (code, out, err) = compare(&dir, "capacity.LINE=-150", false);
    assert_eq!(code, 2, "{out}");
    assert!(err.contains("below 0") && err.contains("LINE"), "{err}");
    let (code, _, err) = compare(&dir, "frozen_periods=+1%", false);
    assert_eq!(code, 2);
    assert!(err.contains("whole number"), "{err}");
}

#[test]
fn items_are_not_said_to_match_when_b_has_no_plan() {
    let dir = fixture();
    // 30 a week with 30 of overtime cannot carry 70 a week: B has no plan,
    // and the lot-for-lot orders it shows equal A's plan.
    let (code, text, _) = compare(&dir, "capacity.LINE=30", false);
    assert_eq!(code, 1, "{text}");
    assert!(!text.contains("Items that differ: 0"), "{text}");
    assert!(text.contains("B has no plan"), "{text}");
    let (_, out, _) = compare(&dir, "capacity.LINE=30", true);
    let json: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(json["items_compared"], false);
    let (_, out, _) = compare(&dir, "capacity.LINE=120%", true);
    let json: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(json["items_compared"], true);
}

#[test]
fn a_shutdown_week_closes_overtime_unless_the_row_gives_it() {
    let dir = fixture();
    std::fs::write(
        dir.path().join("capacity.csv"),
        "resource,period,capacity,overtime_capacity\nLINE,2,0,\nLINE,3,50,\nLINE,4,0,20\n",
    )
    .unwrap();
    let scenario = lotwright::input::read_scenario(dir.path()).expect("reads");
    let line = &scenario.resources[0];
    assert_eq!(line.capacity, [100.0, 0.0, 50.0, 0.0]);
    assert_eq!(
        line.overtime_capacity,
        [30.0, 0.0, 30.0, 20.0],
        "week 2 shut (no overtime), week 3 short (keeps it), week 4 given 20"
    );
}
