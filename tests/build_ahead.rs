//! The caution on stock built ahead measures each lot against the demand
//! that follows it: a lot that only meets its own bucket's demand is made to
//! order, however long the quiet spell after it, while a lot that covers
//! several later buckets is built ahead. Invented data.

mod common;

use common::{lotwright, scenario_dir, weekly_toml};
use serde_json::Value;

/// Made to order: two orders in ten weeks, each for its own week's demand.
/// Holding is dear against the setup, so the least-cost plan orders each
/// lot in the week it is needed (lot-for-lot); the quiet weeks in between
/// are no stock built ahead.
const LUMPY: &str = "VALVE,30,5\n";
const LUMPY_DEMAND: &str = "VALVE,2,40\nVALVE,7,30\n";

/// Built ahead: steady demand of 20 a week, a setup of 100 against a
/// holding cost of 1, so each lot covers about three weeks.
const STEADY: &str = "GASKET,100,1\n";

fn plan_json(items: &str, demand: &str) -> Value {
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(10)),
        (
            "items.csv",
            &format!("item,setup_cost,holding_cost\n{items}"),
        ),
        ("demand.csv", &format!("item,period,quantity\n{demand}")),
    ]);
    let (code, out, err) = lotwright(&["plan", dir.path().to_str().unwrap(), "--json"]);
    assert_eq!(code, 0, "{err}");
    serde_json::from_str(&out).expect("JSON")
}

fn ahead_caution(json: &Value) -> Option<String> {
    json["cautions"]
        .as_array()
        .expect("cautions")
        .iter()
        .filter_map(Value::as_str)
        .find(|c| c.contains("ahead of need"))
        .map(str::to_string)
}

fn steady_demand() -> String {
    (1..=10).map(|t| format!("GASKET,{t},20\n")).collect()
}

#[test]
fn a_made_to_order_item_with_lumpy_demand_gets_no_build_ahead_caution() {
    let json = plan_json(LUMPY, LUMPY_DEMAND);
    // The plan is the two lots of the demand, in its weeks.
    let orders: Vec<(u64, f64)> = json["orders"]
        .as_array()
        .unwrap()
        .iter()
        .map(|o| {
            (
                o["period"].as_u64().unwrap(),
                o["quantity"].as_f64().unwrap(),
            )
        })
        .collect();
    assert_eq!(orders, [(2, 40.0), (7, 30.0)]);
    assert_eq!(ahead_caution(&json), None, "{}", json["cautions"]);
}

#[test]
fn a_true_build_ahead_still_gets_the_caution_and_is_the_item_named() {
    let json = plan_json(
        &format!("{LUMPY}{STEADY}"),
        &format!("{LUMPY_DEMAND}{}", steady_demand()),
    );
    let caution = ahead_caution(&json).expect("a build-ahead caution");
    assert!(caution.contains("item GASKET"), "{caution}");
    assert!(!caution.contains("VALVE"), "{caution}");
    // The cover stated is the longest lot's: its quantity over 20 a week.
    let longest = json["orders"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|o| o["item"] == "GASKET")
        .map(|o| (o["quantity"].as_f64().unwrap() / 20.0).ceil() as u64)
        .max()
        .unwrap();
    assert!(longest >= 2, "the steady item builds ahead");
    assert!(
        caution.contains(&format!("up to {longest} weeks of demand")),
        "{caution}"
    );
}
