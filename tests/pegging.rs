//! Pegging over a bill of material, through the command line: the parent
//! orders behind each component requirement (JSON `pegging`, records.csv),
//! and a component's shortage in `check --orders` pegged to the parent
//! orders it leaves without parts. Worked by hand on invented data.

mod common;

use common::lotwright;

use serde_json::{json, Value};

/// Runs `plan DIR --out DIR/out` and returns the output folder.
fn plan_out(dir: &tempfile::TempDir) -> std::path::PathBuf {
    let out = dir.path().join("out");
    let (code, _, stderr) = lotwright(&[
        "plan",
        dir.path().to_str().unwrap(),
        "--out",
        out.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{stderr}");
    out
}

/// Two parents share component C: P needs 2 (lead time 1 week), Q needs 1
/// (no lead time). P sells 10 in week 3, Q 5 in week 2, and C has spares
/// demand of 3 in week 2 and 12 in stock. Setups 50; holding 5 a week for
/// the parents, 1 for C.
fn shared_component() -> tempfile::TempDir {
    common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(3)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,initial_stock,lead_time\n\
             P,50,5,0,1\n\
             Q,50,5,0,0\n\
             C,50,1,12,0\n",
        ),
        ("demand.csv", "item,period,quantity\nP,3,10\nQ,2,5\nC,2,3\n"),
        ("bom.csv", "parent,component,quantity_per\nP,C,2\nQ,C,1\n"),
    ])
}

/// The proposal makes P's 10 (received in week 3, so released in week 2)
/// and Q's 5 in week 2, and nothing of C. In week 2 C is called for 3
/// (its own demand), 20 (P's order) and 5 (Q's): 28 against 12 in stock,
/// so 16 short at the end of week 2 and still at the end of week 3. Stock
/// serves the own demand first, then the bill's lines in order: 3 to the
/// spares, 9 of P's 20, none of Q's 5. So the 16 short are Q's 5 and 11 of
/// P's 20. The proposal has no order of C at all: no order covers it.
#[test]
fn a_component_shortage_is_pegged_to_the_parent_orders_it_leaves_short() {
    let dir = shared_component();
    let orders = dir.path().join("orders.csv");
    std::fs::write(&orders, "item,period,quantity\nP,3,10\nQ,2,5\n").unwrap();
    let scenario = dir.path().to_str().unwrap();
    let orders = orders.to_str().unwrap();
    let (code, stdout, stderr) = lotwright(&["check", scenario, "--orders", orders, "--json"]);
    assert_eq!(code, 0, "{stderr}");
    let v: Value = serde_json::from_str(&stdout).unwrap();
    assert_eq!(v["feasible"], json!(false));
    let short_for = json!([
        {"parent": "Q", "parent_period": 2, "parent_quantity": 5.0, "short": 5.0},
        {"parent": "P", "parent_period": 3, "parent_quantity": 10.0, "short": 11.0},
    ]);
    assert_eq!(
        v["shortages"],
        json!([
            {"item": "C", "period": 2, "quantity": 16.0, "unit": "units", "own_demand": 0.0, "parent_orders": short_for,
             "order": null, "next_order": null, "cause": "no order covers it"},
            {"item": "C", "period": 3, "quantity": 16.0, "unit": "units", "own_demand": 0.0, "parent_orders": short_for,
             "order": null, "next_order": null, "cause": "no order covers it"},
        ])
    );
    assert_eq!(
        v["pegging"],
        json!([
            {"component": "C", "period": 2, "date": "2027-01-11", "quantity": 20.0, "parent": "P",
             "parent_period": 3, "parent_quantity": 10.0, "parent_kind": "planned"},
            {"component": "C", "period": 2, "date": "2027-01-11", "quantity": 5.0, "parent": "Q",
             "parent_period": 2, "parent_quantity": 5.0, "parent_kind": "planned"},
        ])
    );
    // The terminal says the same in words.
    let (_, text, _) = lotwright(&["check", scenario, "--orders", orders]);
    assert!(
        text.contains("Q's order of 5 for period 2 (5); P's order of 10 for period 3 (11)"),
        "{text}"
    );
}

/// The best plan: P received in week 3 (a week earlier costs 50 of P's
/// holding), Q in week 2, and C's 16 missing units in week 2 (in week 1
/// they would cost 16 more holding). records.csv then shows C's level 1,
/// its dependent requirement of 25 in week 2 and the two parent orders
/// behind it; P and Q are level 0 with nothing dependent.
#[test]
fn records_carry_the_level_and_the_parent_orders() {
    let dir = shared_component();
    let out = dir.path().join("out");
    let scenario = dir.path().to_str().unwrap();
    let (code, _, stderr) = lotwright(&["plan", scenario, "--out", out.to_str().unwrap()]);
    assert_eq!(code, 0, "{stderr}");
    let text = std::fs::read_to_string(out.join("records.csv")).unwrap();
    let mut reader = csv::Reader::from_reader(text.as_bytes());
    let header: Vec<String> = reader.headers().unwrap().iter().map(String::from).collect();
    let col = |name: &str| header.iter().position(|h| h == name).expect(name);
    let rows: Vec<csv::StringRecord> = reader.records().map(|r| r.unwrap()).collect();
    let row = |item: &str, period: &str| {
        rows.iter()
            .find(|r| &r[0] == item && &r[1] == period)
            .expect("a row")
            .clone()
    };
    let c2 = row("C", "2");
    assert_eq!(&c2[col("level")], "1");
    assert_eq!(&c2[col("dependent_requirement")], "25");
    assert_eq!(&c2[col("gross_requirement")], "28");
    assert_eq!(&c2[col("planned_receipts")], "16");
    assert_eq!(&c2[col("parent_orders")], "P period 3: 20; Q period 2: 5");
    let p3 = row("P", "3");
    assert_eq!(&p3[col("level")], "0");
    assert_eq!(&p3[col("planned_receipts")], "10");
    assert_eq!(&p3[col("parent_orders")], "");
    assert_eq!(&row("C", "1")[col("parent_orders")], "");
    let (_, json_text, _) = lotwright(&["plan", scenario, "--json"]);
    let v: Value = serde_json::from_str(&json_text).unwrap();
    assert_eq!(v["pegging"].as_array().map(Vec::len), Some(2));
    assert_eq!(v["shortages"], json!([]));
}

/// Without a bill of material, records.csv keeps its columns and the
/// pegging list is empty.
#[test]
fn without_a_bill_nothing_is_pegged() {
    let dir = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(2)),
        ("items.csv", "item,setup_cost,holding_cost\nA,10,1\n"),
        ("demand.csv", "item,period,quantity\nA,2,4\n"),
    ]);
    let out = plan_out(&dir);
    let text = std::fs::read_to_string(out.join("records.csv")).unwrap();
    assert!(text.starts_with("item,period,date,gross_requirement,"));
    assert!(!text.lines().next().unwrap().contains("level"));
    let (_, json_text, _) = lotwright(&["plan", dir.path().to_str().unwrap(), "--json"]);
    let v: Value = serde_json::from_str(&json_text).unwrap();
    assert_eq!(v["pegging"], json!([]));
}

/// plan.xlsx's Stock records sheet, read back with calamine: the level,
/// the dependent requirement (a number) and the parent orders, as in
/// records.csv.
#[test]
fn the_spreadsheet_carries_the_level_and_the_parent_orders() {
    use calamine::{open_workbook_from_rs, Data, DataType, Reader, Xlsx};
    let dir = shared_component();
    let out = plan_out(&dir);
    let bytes = std::fs::read(out.join("plan.xlsx")).unwrap();
    let mut workbook: Xlsx<_> = open_workbook_from_rs(std::io::Cursor::new(bytes)).unwrap();
    let range = workbook.worksheet_range("Stock records").unwrap();
    let header: Vec<String> = range
        .rows()
        .next()
        .unwrap()
        .iter()
        .map(|c| c.get_string().unwrap_or("").to_string())
        .collect();
    let col = |name: &str| {
        header
            .iter()
            .position(|h| h == name)
            .unwrap_or_else(|| panic!("{name} in {header:?}"))
    };
    let c2 = range
        .rows()
        .find(|r| r[0].get_string() == Some("C") && r[1] == Data::Float(2.0))
        .expect("C's week 2");
    assert_eq!(c2[col("Level")], Data::Float(1.0));
    assert_eq!(c2[col("Dependent requirement")], Data::Float(25.0));
    assert_eq!(
        c2[col("Parent orders (parent, period: units)")].get_string(),
        Some("P period 3: 20; Q period 2: 5")
    );
}

/// The plan's JSON is written as it is serialised, without a tree of
/// values; it must read exactly as the value would print (keys in sorted
/// order), here with pegging and component shortages pegged to parents.
#[test]
fn plan_json_written_as_it_goes_equals_the_value() {
    use lotwright::report::json;
    // C now starts empty and takes a week to make, so P's release in week 1
    // (for its demand in week 2) leaves C short there.
    let short = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(3)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,initial_stock,lead_time\n\
             P,50,5,0,1\n\
             Q,50,5,0,0\n\
             C,50,1,0,1\n",
        ),
        ("demand.csv", "item,period,quantity\nP,2,10\nQ,2,5\nC,2,3\n"),
        ("bom.csv", "parent,component,quantity_per\nP,C,2\nQ,C,1\n"),
    ]);
    for (dir, short_of_parts) in [(shared_component(), false), (short, true)] {
        let scenario = lotwright::input::read_scenario(dir.path()).unwrap();
        let options = lotwright::solve::Options::default();
        let outcome = lotwright::solve::plan_scenario(&scenario, &options).unwrap();
        let streamed =
            serde_json::to_string_pretty(&json::plan_document(&scenario, &outcome)).unwrap();
        let value = json::plan(&scenario, &outcome);
        assert_eq!(streamed, serde_json::to_string_pretty(&value).unwrap());
        assert!(!value["pegging"].as_array().unwrap().is_empty());
        let pegged_shortage = value["shortages"][0]["parent_orders"][0]["parent"] == "P";
        assert_eq!(pegged_shortage, short_of_parts);
    }
}
