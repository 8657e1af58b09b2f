//! Units of measure: the `unit` column of items.csv and resources.csv, read
//! and checked like every other cell, and shown wherever a quantity of that
//! item or resource appears (terminal, JSON, CSV, plan.xlsx, report.html);
//! stock across items in different units shown as value only; backlog
//! called backlog; planner words instead of solver words; "1 setup".
//! The scenario is invented: a small brewery over six weeks.

mod common;

use std::io::{Cursor, Read};

use calamine::{open_workbook_from_rs, Data, Reader, Xlsx};
use common::{lotwright, scenario_dir, weekly_toml};
use serde_json::Value;

const ITEMS: &str = "item,setup_cost,holding_cost,unit_cost,initial_stock,lead_time,min_lot,lot_multiple,backlog_cost,unit\n\
KEG-PALE,380,1.5,40,0,0,,,2.5,kegs\n\
CARTON,60,0.02,0.8,200,1,300,,,cartons\n\
HOPS,45,0.05,9,10,0,,0,,kg\n";

const DEMAND: &str = "item,period,quantity\n\
KEG-PALE,1,30\nKEG-PALE,2,35\nKEG-PALE,3,20\nKEG-PALE,4,40\nKEG-PALE,5,25\nKEG-PALE,6,30\n\
CARTON,1,150\nCARTON,2,180\nCARTON,3,120\nCARTON,4,210\nCARTON,5,160\nCARTON,6,140\n\
HOPS,1,6.5\nHOPS,2,7.25\nHOPS,3,4\nHOPS,4,8\nHOPS,5,5.5\nHOPS,6,6\n";

const RESOURCES: &str = "resource,capacity,overtime_capacity,overtime_cost,unit\n\
BREWHOUSE,40,8,55,hours\n";

const ROUTING: &str = "item,resource,per_unit,setup_time\nKEG-PALE,BREWHOUSE,0.5,6\n";

fn brewery() -> tempfile::TempDir {
    scenario_dir(&[
        ("scenario.toml", &weekly_toml(6)),
        ("items.csv", ITEMS),
        ("demand.csv", DEMAND),
        ("resources.csv", RESOURCES),
        ("routing.csv", ROUTING),
    ])
}

fn path(dir: &std::path::Path) -> &str {
    dir.to_str().expect("a UTF-8 temporary path")
}

fn plan_json(dir: &std::path::Path) -> Value {
    let (code, out, err) = lotwright(&["plan", path(dir), "--json"]);
    assert_eq!(code, 0, "stderr: {err}");
    serde_json::from_str(&out).expect("one JSON object")
}

#[test]
fn json_names_the_unit_of_every_quantity() {
    let dir = brewery();
    let value = plan_json(dir.path());
    assert_eq!(value["units"]["items"]["KEG-PALE"], "kegs");
    assert_eq!(value["units"]["items"]["CARTON"], "cartons");
    assert_eq!(value["units"]["items"]["HOPS"], "kg");
    assert_eq!(value["units"]["resources"]["BREWHOUSE"], "hours");
    let orders = value["orders"].as_array().expect("orders");
    assert!(!orders.is_empty());
    for order in orders {
        let item = order["item"].as_str().unwrap();
        assert_eq!(order["unit"], value["units"]["items"][item], "{order}");
    }
    for item in value["items"].as_array().expect("items") {
        let id = item["item"].as_str().unwrap();
        assert_eq!(item["unit"], value["units"]["items"][id], "{item}");
    }
    // Kegs, cartons and kg do not add up: stock across items is a value.
    for row in value["comparison"].as_array().expect("comparison") {
        assert!(row["stock_unit"].is_null(), "{row}");
        assert!(row["average_stock"].is_null(), "{row}");
        assert!(row["ending_stock"].is_null(), "{row}");
        assert!(row["average_stock_value"].is_number(), "{row}");
        assert!(row["ending_stock_value"].is_number(), "{row}");
    }
}

#[test]
fn one_shared_unit_keeps_stock_as_a_count() {
    let items = "item,setup_cost,holding_cost,unit\nA,50,1,crates\nB,30,0.5,crates\n";
    let demand = "item,period,quantity\nA,1,10\nA,2,12\nB,1,4\nB,3,9\n";
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        ("items.csv", items),
        ("demand.csv", demand),
    ]);
    let value = plan_json(dir.path());
    for row in value["comparison"].as_array().expect("comparison") {
        assert_eq!(row["stock_unit"], "crates", "{row}");
        assert!(row["average_stock"].is_number(), "{row}");
    }
    let (code, text, err) = lotwright(&["plan", path(dir.path())]);
    assert_eq!(code, 0, "stderr: {err}");
    assert!(text.contains("stock counted in crates"), "{text}");
}

#[test]
fn the_terminal_shows_units_and_no_summed_stock_across_units() {
    let dir = brewery();
    let (code, text, err) = lotwright(&["plan", path(dir.path()), "--detail"]);
    assert_eq!(code, 0, "stderr: {err}");
    // The order list and every item's records carry the unit.
    let order_line = text
        .lines()
        .find(|l| l.starts_with("CARTON ") && l.contains("planned"))
        .unwrap_or_else(|| panic!("a planned CARTON order in:\n{text}"));
    assert!(order_line.contains("cartons"), "{order_line}");
    for heading in ["KEG-PALE (kegs):", "CARTON (cartons):", "HOPS (kg):"] {
        assert!(text.contains(heading), "no {heading} in:\n{text}");
    }
    // The stock table has no count column summing kegs, cartons and kg.
    let stock = text
        .split("Stock and setups by method")
        .nth(1)
        .expect("the stock table");
    let header = stock.lines().nth(1).expect("a header");
    assert!(!header.contains("avg stock  "), "{header}");
    assert!(!header.contains("end stock  "), "{header}");
    assert!(header.contains("avg stock value"), "{header}");
    assert!(
        text.contains("different units"),
        "no word on why stock is a value:\n{text}"
    );
}

#[test]
fn out_files_carry_the_units() {
    let dir = brewery();
    let parent = tempfile::tempdir().unwrap();
    let out = parent.path().join("out");
    let (code, _, err) = lotwright(&["plan", path(dir.path()), "--out", path(&out)]);
    assert_eq!(code, 0, "stderr: {err}");
    let read = |name: &str| std::fs::read_to_string(out.join(name)).unwrap();
    let plan = read("plan.csv");
    assert!(plan.lines().next().unwrap().ends_with(",unit"), "{plan}");
    assert!(plan
        .lines()
        .skip(1)
        .filter(|l| l.starts_with("KEG-PALE,"))
        .all(|l| l.ends_with(",kegs")));
    let records = read("records.csv");
    assert!(records.lines().next().unwrap().ends_with(",unit"));
    assert!(records
        .lines()
        .any(|l| l.starts_with("HOPS,") && l.ends_with(",kg")));
    let load = read("load.csv");
    assert!(load.lines().next().unwrap().ends_with(",unit"));
    assert!(
        load.lines().skip(1).all(|l| l.ends_with(",hours")),
        "{load}"
    );
    let html = read("report.html");
    for word in ["kegs", "cartons", "kg", "hours"] {
        assert!(html.contains(word), "report.html lacks {word}");
    }
    // plan.xlsx: the Orders sheet has a unit column with the item's unit.
    let bytes = std::fs::read(out.join("plan.xlsx")).unwrap();
    let mut book: Xlsx<_> = open_workbook_from_rs(Cursor::new(bytes.clone())).unwrap();
    let orders = book.worksheet_range("Orders").unwrap();
    let header: Vec<String> = orders
        .rows()
        .next()
        .unwrap()
        .iter()
        .map(|c| c.to_string())
        .collect();
    let column = header
        .iter()
        .position(|h| h == "Unit")
        .unwrap_or_else(|| panic!("a Unit column in {header:?}"));
    for row in orders.rows().skip(1) {
        if row[0] == Data::String("HOPS".into()) {
            assert_eq!(row[column], Data::String("kg".into()));
        }
    }
    let mut zip = zip::ZipArchive::new(Cursor::new(bytes)).unwrap();
    let mut strings = String::new();
    zip.by_name("xl/sharedStrings.xml")
        .unwrap()
        .read_to_string(&mut strings)
        .unwrap();
    assert!(strings.contains("hours"), "plan.xlsx never names hours");
    // check reads plan.csv back, unit column and all.
    let (code, _, err) = lotwright(&[
        "check",
        path(dir.path()),
        "--orders",
        path(&out.join("plan.csv")),
    ]);
    assert_eq!(code, 0, "stderr: {err}");
}

#[test]
fn an_order_in_the_wrong_unit_is_refused() {
    let dir = brewery();
    let orders = dir.path().join("orders.csv");
    std::fs::write(&orders, "item,period,quantity,unit\nCARTON,2,400,kg\n").unwrap();
    let (code, out, err) = lotwright(&["check", path(dir.path()), "--orders", path(&orders)]);
    assert_eq!(code, 2, "stdout: {out}");
    assert!(err.contains("orders.csv"), "{err}");
    assert!(err.contains("line 2"), "{err}");
    assert!(err.contains("column 4"), "{err}");
    assert!(err.contains("cartons"), "{err}");
}

#[test]
fn a_bad_unit_names_file_line_and_column() {
    for (items, column) in [
        ("item,setup_cost,holding_cost,unit\nA,50,1,kegs\nB,30,0.5,12\n", "column 4"),
        (
            "item,setup_cost,unit,holding_cost\nA,50,kegs,1\nB,30,a very long unit name beyond a header,0.5\n",
            "column 3",
        ),
    ] {
        let dir = scenario_dir(&[
            ("scenario.toml", &weekly_toml(3)),
            ("items.csv", items),
            ("demand.csv", "item,period,quantity\nA,1,5\n"),
        ]);
        let (code, out, err) = lotwright(&["plan", path(dir.path())]);
        assert_eq!(code, 2, "stdout: {out}");
        assert!(out.is_empty(), "nothing is printed on stdout: {out}");
        for part in ["items.csv", "line 3", column, "unit"] {
            assert!(err.contains(part), "no {part} in: {err}");
        }
    }
    let dir = brewery();
    common::write_files(
        dir.path(),
        &[("resources.csv", "resource,capacity,unit\nBREWHOUSE,40,-\n")],
    );
    let (code, _, err) = lotwright(&["plan", path(dir.path())]);
    assert_eq!(code, 2);
    for part in ["resources.csv", "line 2", "column 3"] {
        assert!(err.contains(part), "no {part} in: {err}");
    }
}

#[test]
fn negative_stock_is_called_backlog() {
    // Dear setups and cheap backlog: the plan backlogs kegs.
    let items = "item,setup_cost,holding_cost,backlog_cost,unit\nKEG,900,3,0.5,kegs\n";
    let demand = "item,period,quantity\nKEG,1,40\nKEG,2,72\nKEG,3,10\nKEG,4,10\n";
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(4)),
        ("items.csv", items),
        ("demand.csv", demand),
    ]);
    let (code, text, err) = lotwright(&["plan", path(dir.path())]);
    assert_eq!(code, 0, "stderr: {err}");
    let on_hand = text
        .lines()
        .find(|l| l.starts_with("on hand"))
        .unwrap_or_else(|| panic!("an on hand row in:\n{text}"));
    assert!(!on_hand.contains('-'), "negative stock shown: {on_hand}");
    let backlog = text
        .lines()
        .find(|l| l.starts_with("backlog"))
        .unwrap_or_else(|| panic!("a backlog row in:\n{text}"));
    assert!(backlog.contains("112"), "{backlog}");
}

/// Words of the solver's trade that a planner should not have to read.
const SOLVER_WORDS: [&str; 7] = [
    "binding",
    "slack",
    " LP ",
    "relaxation",
    "incumbent",
    "subgradient",
    "objective",
];

#[test]
fn check_speaks_planner_words_and_counts_one_setup() {
    let items = "item,setup_cost,holding_cost,min_lot\nA,50,1,30\n";
    let demand = "item,period,quantity\nA,1,10\nA,2,12\n";
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(2)),
        ("items.csv", items),
        ("demand.csv", demand),
    ]);
    let orders = dir.path().join("orders.csv");
    std::fs::write(&orders, "item,period,quantity\nA,1,22\n").unwrap();
    let (code, text, err) = lotwright(&["check", path(dir.path()), "--orders", path(&orders)]);
    assert!(code == 0 || code == 1, "stderr: {err}");
    assert!(
        text.contains("lot below min_lot"),
        "a breach table in:\n{text}"
    );
    for word in SOLVER_WORDS {
        assert!(!text.contains(word), "{word} in:\n{text}");
    }
    assert!(text.contains("(1 setup)"), "{text}");
    assert!(!text.contains("1 setups"), "{text}");
}

#[test]
fn plan_text_has_no_solver_words_nor_one_setups() {
    let dir = brewery();
    let (code, text, err) = lotwright(&["plan", path(dir.path()), "--detail"]);
    assert_eq!(code, 0, "stderr: {err}");
    for word in SOLVER_WORDS {
        assert!(!text.contains(word), "{word} in:\n{text}");
    }
    assert!(!text.contains(" 1 setups"), "{text}");
}

#[test]
fn eoq_help_says_one_time_unit_and_a_mismatch_warns() {
    let (code, help, _) = lotwright(&["eoq", "--help"]);
    assert_eq!(code, 0);
    assert!(help.contains("same time unit"), "{help}");
    // Invented: 9,100 a year, 45 an order, and a holding cost of 0.06 per
    // week on a part of 15.00, given as if it were per year.
    let args = [
        "eoq",
        "--demand",
        "9100",
        "--setup-cost",
        "45",
        "--holding-cost",
        "0.06",
        "--time-unit",
        "year",
        "--unit-cost",
        "15",
    ];
    let (code, text, err) = lotwright(&args);
    assert_eq!(code, 0, "{err}");
    assert!(text.contains("Warning:"), "{text}");
    assert!(text.contains("0.4 % of the unit cost a year"), "{text}");
    let (code, out, err) = lotwright(&[&args[..], &["--json"]].concat());
    assert_eq!(code, 0, "{err}");
    let value: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(value["time_unit"], "year");
    assert_eq!(
        value["warnings"].as_array().map(Vec::len),
        Some(1),
        "{value}"
    );
    // 0.06 x 52 = 3.12 a year: 20.8 % of 15.00, a lot of 512 every 20.55
    // days; nothing to warn about.
    let (code, out, _) = lotwright(&[
        "eoq",
        "--demand",
        "9100",
        "--setup-cost",
        "45",
        "--holding-cost",
        "3.12",
        "--time-unit",
        "year",
        "--unit-cost",
        "15",
        "--json",
    ]);
    assert_eq!(code, 0);
    let value: Value = serde_json::from_str(&out).unwrap();
    assert_eq!(value["warnings"], serde_json::json!([]), "{value}");
    assert!(
        (value["cycle_days"].as_f64().unwrap() - 20.55).abs() < 0.01,
        "{value}"
    );
    // Without a time unit, a lot lasting 577 time units is over a year
    // even if the unit is a day.
    let (_, text, _) = lotwright(&[
        "eoq",
        "--demand",
        "3",
        "--setup-cost",
        "500",
        "--holding-cost",
        "0.001",
    ]);
    assert!(text.contains("fewer than one order a year"), "{text}");
}
