//! `check` tells the analyst what to do with each proposed order against
//! the best plan (past due, release now, move in or out by N buckets,
//! cancel, add), points each shortage to the order that leaves it short,
//! and with `--no-solve` checks without solving the scenario. Invented data.

mod common;

use common::{lotwright, scenario_dir, weekly_toml};
use serde_json::Value;

/// CARTON is bought with a lead time of 2 weeks and starts with 50 in
/// stock; LID is made in the week it is needed. The proposal receives 10
/// CARTON in week 1 (released in week -1: past due), 30 in week 3, 30 in
/// week 5 (after week 4 runs short by 15) and 80 in week 6, and no LID at
/// all (10 short in week 5).
fn fixture() -> (tempfile::TempDir, String) {
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(8)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,lead_time,initial_stock\nCARTON,60,0.5,2,50\nLID,20,0.2,0,0\n",
        ),
        (
            "demand.csv",
            "item,period,quantity\nCARTON,1,20\nCARTON,2,25\nCARTON,3,30\nCARTON,4,30\nCARTON,6,40\nCARTON,7,20\nCARTON,8,20\nLID,5,10\n",
        ),
        (
            "orders.csv",
            "item,period,quantity\nCARTON,1,10\nCARTON,3,30\nCARTON,5,30\nCARTON,6,80\n",
        ),
    ]);
    let orders = dir.path().join("orders.csv").to_str().unwrap().to_string();
    (dir, orders)
}

fn check_json(extra: &[&str]) -> Value {
    let (dir, orders) = fixture();
    let mut args = vec![
        "check",
        dir.path().to_str().unwrap(),
        "--orders",
        &orders,
        "--json",
    ];
    args.extend_from_slice(extra);
    let (code, out, err) = lotwright(&args);
    assert_eq!(code, 0, "{err}");
    serde_json::from_str(&out).expect("JSON")
}

fn actions(json: &Value) -> &Vec<Value> {
    json["actions"].as_array().expect("an actions list")
}

fn action_of<'a>(json: &'a Value, item: &str, period: u64) -> &'a Value {
    let found: Vec<&Value> = actions(json)
        .iter()
        .filter(|a| a["item"] == item && a["period"] == period && a["action"] != "add")
        .collect();
    assert_eq!(
        found.len(),
        1,
        "one action for {item} in {period}: {found:?}"
    );
    found[0]
}

#[test]
fn an_order_released_before_the_horizon_is_past_due() {
    let json = check_json(&[]);
    let first = action_of(&json, "CARTON", 1);
    assert_eq!(first["action"], "past-due", "{first}");
    assert_eq!(first["release_period"], -1);
    let (dir, orders) = fixture();
    let (_, text, _) = lotwright(&["check", dir.path().to_str().unwrap(), "--orders", &orders]);
    let line = text
        .lines()
        .find(|l| l.starts_with("CARTON") && l.contains("past due"))
        .unwrap_or_else(|| panic!("CARTON's order flagged past due:\n{text}"));
    assert!(line.contains("-1"), "names the release period: {line}");
}

#[test]
fn every_proposed_order_gets_one_action_that_agrees_with_the_best_plan() {
    let json = check_json(&[]);
    let best: Vec<(String, u64, f64)> = json["best_orders"]
        .as_array()
        .expect("the best plan's orders")
        .iter()
        .map(|o| {
            (
                o["item"].as_str().unwrap().to_string(),
                o["period"].as_u64().unwrap(),
                o["quantity"].as_f64().unwrap(),
            )
        })
        .collect();
    assert!(!best.is_empty());
    for period in [1, 3, 5, 6] {
        let a = action_of(&json, "CARTON", period);
        let kind = a["action"].as_str().unwrap();
        match kind {
            "move-in" | "move-out" | "keep" | "release-now" => {
                let to = a["to_period"].as_u64().expect("a target period");
                let by = a["by"].as_i64().expect("a shift");
                assert_eq!(by, period as i64 - to as i64, "{a}");
                match kind {
                    "move-in" => assert!(by > 0, "{a}"),
                    "move-out" => assert!(by < 0, "{a}"),
                    _ => assert_eq!(by, 0, "{a}"),
                }
                let quantity = a["to_quantity"].as_f64().unwrap();
                assert!(
                    best.contains(&("CARTON".into(), to, quantity)),
                    "{a} is an order of the best plan {best:?}"
                );
                assert_eq!(
                    a["release_now"] == true,
                    to == 3,
                    "received in 3 after 2 weeks is released now: {a}"
                );
            }
            "cancel" | "past-due" => {}
            other => panic!("unexpected action {other}: {a}"),
        }
    }
    // The best plan orders LID by week 5; the proposal has none: add it.
    let adds: Vec<&Value> = actions(&json)
        .iter()
        .filter(|a| a["item"] == "LID")
        .collect();
    assert_eq!(adds.len(), 1, "{adds:?}");
    assert_eq!(adds[0]["action"], "add");
    let to = adds[0]["to_period"].as_u64().unwrap();
    assert!(best.contains(&("LID".into(), to, adds[0]["to_quantity"].as_f64().unwrap())));
    // Every best order of CARTON is the target of an action.
    for (item, period, _) in best.iter().filter(|b| b.0 == "CARTON") {
        assert!(
            actions(&json)
                .iter()
                .any(|a| a["item"] == item.as_str() && a["to_period"] == *period),
            "best order {item} {period} is reached by an action"
        );
    }
}

#[test]
fn each_shortage_names_the_order_that_leaves_it_short() {
    let json = check_json(&[]);
    let shortages = json["shortages"].as_array().unwrap();
    let carton = shortages
        .iter()
        .find(|s| s["item"] == "CARTON")
        .expect("CARTON short");
    assert_eq!(carton["period"], 4);
    assert_eq!(carton["quantity"], 15.0);
    assert_eq!(
        carton["order"]["period"], 3,
        "the lot received in week 3 runs out"
    );
    assert_eq!(carton["order"]["quantity"], 30.0);
    assert_eq!(
        carton["next_order"]["period"], 5,
        "the next lot comes in week 5"
    );
    let lid = shortages
        .iter()
        .find(|s| s["item"] == "LID")
        .expect("LID short");
    assert_eq!(lid["order"], Value::Null);
    assert_eq!(lid["next_order"], Value::Null);
    let (dir, orders) = fixture();
    let (_, text, _) = lotwright(&["check", dir.path().to_str().unwrap(), "--orders", &orders]);
    assert!(
        text.lines()
            .any(|l| l.starts_with("LID") && l.contains("no order covers it")),
        "{text}"
    );
    assert!(
        text.lines().any(|l| l.starts_with("CARTON")
            && l.contains("received in period 3")
            && l.contains("period 5")),
        "{text}"
    );
}

#[test]
fn no_solve_checks_without_the_best_plan_and_says_why() {
    let json = check_json(&["--no-solve"]);
    for key in [
        "feasible",
        "total_cost",
        "shortages",
        "overloads",
        "violations",
        "best_cost",
    ] {
        assert!(json.get(key).is_some(), "contract key {key}");
    }
    assert_eq!(json["feasible"], false);
    assert_eq!(json["best_cost"], Value::Null);
    assert_eq!(json["best_skipped"], true);
    let note = json["best_note"].as_str().expect("why best_cost is null");
    assert!(note.contains("--no-solve"), "{note}");
    assert_eq!(action_of(&json, "CARTON", 1)["action"], "past-due");
    assert_eq!(action_of(&json, "CARTON", 3)["action"], "release-now");
    assert_eq!(action_of(&json, "CARTON", 6)["action"], "keep");
    assert!(actions(&json).iter().all(|a| a["action"] != "add"));
    // The same check with the solve says the scenario has a best plan.
    let solved = check_json(&[]);
    assert_eq!(solved["best_skipped"], false);
    assert!(solved["best_cost"].as_f64().is_some());
}

/// One item made in the week it is needed (holding 5 a unit-week against a
/// setup of 10, so the best plan is lot-for-lot: 10 in week 2, 10 in week
/// 5). The proposal has them a week early and a week late.
#[test]
fn an_early_order_moves_out_and_a_late_one_moves_in() {
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(6)),
        ("items.csv", "item,setup_cost,holding_cost\nSEAL,10,5\n"),
        ("demand.csv", "item,period,quantity\nSEAL,2,10\nSEAL,5,10\n"),
        ("orders.csv", "item,period,quantity\nSEAL,1,10\nSEAL,6,10\n"),
    ]);
    let orders = dir.path().join("orders.csv");
    let (code, out, err) = lotwright(&[
        "check",
        dir.path().to_str().unwrap(),
        "--orders",
        orders.to_str().unwrap(),
        "--json",
    ]);
    assert_eq!(code, 0, "{err}");
    let json: Value = serde_json::from_str(&out).unwrap();
    let early = action_of(&json, "SEAL", 1);
    assert_eq!(early["action"], "move-out", "{early}");
    assert_eq!(
        (early["to_period"].as_u64(), early["by"].as_i64()),
        (Some(2), Some(-1))
    );
    let late = action_of(&json, "SEAL", 6);
    assert_eq!(late["action"], "move-in", "{late}");
    assert_eq!(
        (late["to_period"].as_u64(), late["by"].as_i64()),
        (Some(5), Some(1))
    );
    assert_eq!(actions(&json).len(), 2, "nothing to add or cancel");
    let shortage = &json["shortages"][0];
    assert_eq!(shortage["period"], 5);
    assert_eq!(
        shortage["order"]["period"], 1,
        "week 1's lot ran out in week 2"
    );
    assert_eq!(shortage["next_order"]["period"], 6);
    let (_, text, _) = lotwright(&[
        "check",
        dir.path().to_str().unwrap(),
        "--orders",
        orders.to_str().unwrap(),
    ]);
    assert!(text.contains("move out by 1 week to period 2"), "{text}");
    assert!(text.contains("move in by 1 week to period 5"), "{text}");
}
