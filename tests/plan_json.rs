//! The JSON of `plan`: written as a document straight to its writer, it
//! must read exactly as the value of the same document prints (keys in
//! sorted order), and carry every key of the contract: units, infeasibility
//! reasons, the cost no plan avoids, safety stock and forecast error, and
//! the unit of each order and fault.

mod common;

use std::collections::BTreeSet;

use lotwright::report::json;
use serde_json::Value;

/// Three items in three units on two resources in two units, with faults
/// of every kind: ZETA needs 20 kg in week 1 but takes two weeks to make
/// (a shortage), ALPHA keeps a safety stock it cannot hold in week 2 (a
/// breach, not binding: it allows backlog), and the oven and the packing
/// line get more work than they hold (overloads).
fn faulty_scenario() -> tempfile::TempDir {
    common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(8)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,unit_cost,lead_time,safety_stock,backlog_cost,min_lot,unit,forecast_error\n\
             ZETA,60,0.5,4,2,,,,kg,3.5\n\
             ALPHA,80,1.2,7,0,5,9,,pieces,\n\
             MID,40,0.3,2,0,,,30,cartons,1.25\n",
        ),
        (
            "demand.csv",
            "item,period,quantity\n\
             ZETA,1,20\nZETA,4,25\nZETA,7,30\n\
             ALPHA,1,12\nALPHA,2,40\nALPHA,5,33\n\
             MID,3,14\nMID,6,22\n",
        ),
        (
            "resources.csv",
            "resource,capacity,unit\nOVEN,30,hours\nPACK,25,shifts\n",
        ),
        (
            "routing.csv",
            "item,resource,per_unit,setup_time\nALPHA,OVEN,1,2\nMID,PACK,1,1\nZETA,OVEN,0.5,1\n",
        ),
    ])
}

fn keys(value: &Value) -> BTreeSet<&str> {
    value
        .as_object()
        .expect("an object")
        .keys()
        .map(String::as_str)
        .collect()
}

/// The keys of every entry of a list, which must not be empty.
fn entry_keys<'a>(document: &'a Value, list: &str) -> BTreeSet<&'a str> {
    let entries = document[list].as_array().expect("a list");
    assert!(!entries.is_empty(), "{list} is empty");
    entries.iter().flat_map(keys).collect()
}

fn set<'a>(names: &[&'a str]) -> BTreeSet<&'a str> {
    names.iter().copied().collect()
}

#[test]
fn the_document_prints_as_its_value_and_keeps_every_key() {
    let dir = faulty_scenario();
    let scenario = lotwright::input::read_scenario(dir.path()).unwrap();
    let outcome =
        lotwright::solve::plan_scenario(&scenario, &lotwright::solve::Options::default()).unwrap();
    let document = json::plan_document(&scenario, &outcome);
    let streamed = serde_json::to_string_pretty(&document).unwrap();
    let value = serde_json::to_value(&document).unwrap();
    assert_eq!(streamed, serde_json::to_string_pretty(&value).unwrap());
    assert_eq!(value, json::plan(&scenario, &outcome));

    assert_eq!(
        keys(&value),
        set(&[
            "bucket",
            "cautions",
            "comparison",
            "components",
            "controllable_gap",
            "costs",
            "currency",
            "frozen_periods",
            "gap",
            "items",
            "lower_bound",
            "method",
            "notes",
            "orders",
            "overloads",
            "pegging",
            "periods",
            "scenario",
            "setups",
            "shortages",
            "solver",
            "start",
            "status",
            "total_cost",
            "unavoidable_cost",
            "units",
            "violations",
        ])
    );
    assert_eq!(
        entry_keys(&value, "items"),
        set(&[
            "average_stock",
            "costs",
            "ending_stock",
            "ending_stock_value",
            "fill_rate",
            "forecast_error",
            "item",
            "safety_stock",
            "setups",
            "unit",
        ])
    );
    assert_eq!(
        entry_keys(&value, "comparison"),
        set(&[
            "average_stock",
            "average_stock_value",
            "buckets_of_cover",
            "costs",
            "ending_stock",
            "ending_stock_value",
            "extra_cost_percent",
            "feasible",
            "fill_rate",
            "inventory_turns",
            "method",
            "notes",
            "overtime_unit",
            "overtime_used",
            "reason",
            "setups",
            "status",
            "stock_unit",
            "total_cost",
        ])
    );
    assert_eq!(
        entry_keys(&value, "orders"),
        set(&[
            "date",
            "item",
            "kind",
            "period",
            "quantity",
            "release_date",
            "release_period",
            "unit",
        ])
    );
    assert_eq!(
        entry_keys(&value, "shortages"),
        set(&["item", "period", "quantity", "unit"])
    );
    assert_eq!(
        entry_keys(&value, "overloads"),
        set(&["capacity", "excess", "load", "period", "resource", "unit"])
    );
    assert_eq!(
        entry_keys(&value, "violations"),
        set(&["binding", "item", "kind", "limit", "period", "quantity", "unit"])
    );

    // Units by id, in id order, and the unit of each fault's item or
    // resource.
    assert_eq!(
        serde_json::to_string(&value["units"]).unwrap(),
        r#"{"items":{"ALPHA":"pieces","MID":"cartons","ZETA":"kg"},"resources":{"OVEN":"hours","PACK":"shifts"}}"#
    );
    assert_eq!(value["shortages"][0]["item"], "ZETA");
    assert_eq!(value["shortages"][0]["unit"], "kg");
    assert_eq!(value["overloads"][0]["resource"], "OVEN");
    assert_eq!(value["overloads"][0]["unit"], "hours");
    let breach = &value["violations"].as_array().unwrap();
    assert!(breach
        .iter()
        .any(|v| v["item"] == "ALPHA" && v["kind"] == "safety-stock" && v["unit"] == "pieces"));

    // Items in three units and resources in two: no count across them.
    for row in value["comparison"].as_array().unwrap() {
        assert!(row["stock_unit"].is_null() && row["average_stock"].is_null());
        assert!(row["overtime_unit"].is_null() && row["overtime_used"].is_null());
        assert_eq!(row["feasible"], false);
        assert!(row["reason"]["overloads"].is_array(), "{}", row["reason"]);
    }
    let items = value["items"].as_array().unwrap();
    let figures: Vec<(&str, &str, f64, Option<f64>)> = items
        .iter()
        .map(|i| {
            (
                i["item"].as_str().unwrap(),
                i["unit"].as_str().unwrap(),
                i["safety_stock"].as_f64().unwrap(),
                i["forecast_error"].as_f64(),
            )
        })
        .collect();
    assert_eq!(
        figures,
        [
            ("ZETA", "kg", 0.0, Some(3.5)),
            ("ALPHA", "pieces", 5.0, None),
            ("MID", "cartons", 0.0, Some(1.25)),
        ]
    );
    // Every item's unit cost is its own least, so what no plan avoids is
    // the units it must make: 75 kg at 4, 85 pieces at 7, 36 cartons at 2.
    assert_eq!(
        value["unavoidable_cost"],
        75.0 * 4.0 + 85.0 * 7.0 + 36.0 * 2.0
    );
}

#[test]
fn a_feasible_plan_gives_counts_in_the_shared_unit_and_no_reason() {
    let dir = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(4)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,unit\nB,30,1,cases\nA,20,2,cases\n",
        ),
        (
            "demand.csv",
            "item,period,quantity\nA,1,10\nA,3,10\nB,2,5\nB,4,5\n",
        ),
    ]);
    let scenario = lotwright::input::read_scenario(dir.path()).unwrap();
    let outcome =
        lotwright::solve::plan_scenario(&scenario, &lotwright::solve::Options::default()).unwrap();
    let document = json::plan_document(&scenario, &outcome);
    let streamed = serde_json::to_string_pretty(&document).unwrap();
    let value = serde_json::to_value(&document).unwrap();
    assert_eq!(streamed, serde_json::to_string_pretty(&value).unwrap());
    assert_eq!(value["status"], "optimal");
    assert_eq!(value["controllable_gap"], 0.0);
    for row in value["comparison"].as_array().unwrap() {
        assert_eq!(row["stock_unit"], "cases");
        assert!(row["average_stock"].is_number());
        assert!(row["reason"].is_null());
    }
    assert!(value["shortages"].as_array().unwrap().is_empty());
    assert_eq!(
        serde_json::to_string(&value["units"]).unwrap(),
        r#"{"items":{"A":"cases","B":"cases"},"resources":{}}"#
    );
    let orders = value["orders"].as_array().unwrap();
    assert!(!orders.is_empty());
    assert!(orders.iter().all(|o| o["unit"] == "cases"));
}
