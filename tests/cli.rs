//! The command line on fixture scenarios written into temporary folders:
//! `plan` (tables, JSON, `--out`), `check` of the plan it wrote, `eoq`, and
//! the exit codes and messages of bad input. The fixtures have no resources
//! or routing, so every item is solved by the single-item methods.

mod common;

use std::path::Path;
use std::process::{Command, Output};

use common::{scenario_dir, weekly_toml};
use serde_json::Value;

fn lotwright(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .args(args)
        .output()
        .expect("the binary runs")
}

fn path(p: &Path) -> &str {
    p.to_str().expect("a UTF-8 temporary path")
}

fn stdout(output: &Output) -> String {
    String::from_utf8_lossy(&output.stdout).into_owned()
}

fn stderr(output: &Output) -> String {
    String::from_utf8_lossy(&output.stderr).into_owned()
}

fn json(output: &Output) -> Value {
    serde_json::from_slice(&output.stdout).unwrap_or_else(|e| {
        panic!(
            "stdout is one JSON object ({e}):\n{}\nstderr:\n{}",
            stdout(output),
            stderr(output)
        )
    })
}

fn number(value: &Value, key: &str) -> f64 {
    value[key]
        .as_f64()
        .unwrap_or_else(|| panic!("{key} is a number in {value}"))
}

const ITEMS: &str = "item,setup_cost,holding_cost,unit_cost,initial_stock,lead_time,fixed_lot\n\
A,80,2,0,0,0,50\n\
B,40,0.5,3,25,1,\n";

const DEMAND: &str = "item,period,quantity\n\
A,1,18\nA,2,30\nA,3,42\nA,4,5\nA,5,20\n\
B,1,20\nB,2,15\nB,4,30\nB,5,10\n";

/// Two items over five weeks, no resources: A is the Nahmias lot-sizing
/// example (requirements 18, 30, 42, 5, 20; K = 80; h = 2; values from
/// memory, optimum 310) with a fixed lot of 50; B has stock, a unit cost
/// and a lead time of one week, and no fixed lot.
fn fixture() -> tempfile::TempDir {
    scenario_dir(&[
        ("scenario.toml", &weekly_toml(5)),
        ("items.csv", ITEMS),
        ("demand.csv", DEMAND),
    ])
}

const METHODS: [&str; 8] = [
    "exact",
    "lot-for-lot",
    "fixed-lot",
    "eoq",
    "poq",
    "silver-meal",
    "least-unit-cost",
    "part-period-balancing",
];

#[test]
fn plan_prints_a_comparison_naming_every_method() {
    let dir = fixture();
    let output = lotwright(&["plan", path(dir.path())]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let text = stdout(&output);
    for method in METHODS {
        assert!(
            text.lines()
                .any(|line| line.split_whitespace().next() == Some(method)),
            "no row for {method} in:\n{text}"
        );
    }
}

#[test]
fn plan_json_has_the_contract_keys() {
    let dir = fixture();
    let output = lotwright(&["plan", path(dir.path()), "--json"]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let value = json(&output);
    assert_eq!(value["status"], "optimal");
    let total = number(&value, "total_cost");
    // Proven optimal: the lower bound is the cost and the gap is zero.
    assert!((number(&value, "lower_bound") - total).abs() < 1e-9);
    assert_eq!(number(&value, "gap"), 0.0);
    for kind in ["setup", "holding", "unit", "backlog", "overtime"] {
        assert!(value["costs"][kind].is_number(), "costs.{kind} in {value}");
    }
    let orders = value["orders"].as_array().expect("orders is a list");
    assert!(!orders.is_empty());
    for order in orders {
        for key in [
            "item",
            "period",
            "date",
            "release_period",
            "release_date",
            "quantity",
        ] {
            assert!(!order[key].is_null(), "order without {key}: {order}");
        }
        // Item B has a lead time of one week: released a bucket earlier.
        let lead = if order["item"] == "B" { 1 } else { 0 };
        assert_eq!(
            order["release_period"].as_i64().unwrap(),
            order["period"].as_i64().unwrap() - lead
        );
    }
    let comparison = value["comparison"]
        .as_array()
        .expect("comparison is a list");
    let methods: Vec<&str> = comparison
        .iter()
        .map(|row| row["method"].as_str().expect("method is text"))
        .collect();
    assert_eq!(methods, METHODS);
    for row in comparison {
        for key in [
            "method",
            "status",
            "total_cost",
            "feasible",
            "setups",
            "ending_stock_value",
        ] {
            assert!(!row[key].is_null(), "comparison row without {key}: {row}");
        }
        // No rule beats the proven optimum.
        if row["feasible"] == true {
            assert!(number(row, "total_cost") >= total - 1e-9, "{row}");
        }
    }
    assert_eq!(comparison[0]["status"], "optimal");
    assert!((number(&comparison[0], "total_cost") - total).abs() < 1e-9);
    // B has no fixed lot: the fixed-lot row says it is ordered lot-for-lot.
    let fixed = &comparison[2];
    let notes = fixed["notes"].to_string();
    assert!(
        notes.contains("lot-for-lot") && notes.contains('B'),
        "{notes}"
    );
}

#[test]
fn plan_json_includes_the_optimum_of_the_published_example() {
    // Item A alone is the Nahmias example (values from memory): 310.
    // Item B is hand-computed. Stock 25 covers week 1 (5 left); orders
    // arrive from week 2 on and must bring 50 in all (purchase 3 x 50 =
    // 150). Holding the 5 left in week 1 costs 2.50 whatever the plan.
    //   one order of 50 in week 2: 40 + 0.5 x (40 + 40 + 10) = 85
    //   10 in week 2, 40 in week 4: 80 + 0.5 x 10 = 85 (a tie)
    //   40 in week 2, 10 in week 5: 80 + 0.5 x (30 + 30) = 110
    //   10, 30, 10 in weeks 2, 4, 5: 120
    // B costs 150 + 2.50 + 85 = 237.50; the plan 310 + 237.50 = 547.50.
    let dir = fixture();
    let value = json(&lotwright(&["plan", path(dir.path()), "--json"]));
    let items = value["items"].as_array().expect("items is a list");
    let a = items.iter().find(|i| i["item"] == "A").expect("item A");
    assert!((number(&a["costs"], "total") - 310.0).abs() < 1e-9, "{a}");
    let b = items.iter().find(|i| i["item"] == "B").expect("item B");
    assert!((number(&b["costs"], "unit") - 150.0).abs() < 1e-9, "{b}");
    assert!((number(&b["costs"], "total") - 237.5).abs() < 1e-9, "{b}");
    assert!((number(&value, "total_cost") - 547.5).abs() < 1e-9);
}

#[test]
fn without_any_fixed_lot_there_is_no_fixed_lot_row() {
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        ("items.csv", "item,setup_cost,holding_cost\nA,50,1\n"),
        ("demand.csv", "item,period,quantity\nA,1,10\nA,3,10\n"),
    ]);
    let value = json(&lotwright(&["plan", path(dir.path()), "--json"]));
    let methods: Vec<&str> = value["comparison"]
        .as_array()
        .expect("comparison is a list")
        .iter()
        .map(|row| row["method"].as_str().unwrap())
        .collect();
    assert!(!methods.contains(&"fixed-lot"), "{methods:?}");
    assert_eq!(methods.len(), 7);
}

#[test]
fn infeasible_scenario_exits_1_and_still_prints_json() {
    // Demand in period 1, lead time 1, no stock: no order can arrive in time.
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,lead_time\nA,50,1,1\n",
        ),
        ("demand.csv", "item,period,quantity\nA,1,10\nA,2,10\n"),
    ]);
    let output = lotwright(&["plan", path(dir.path()), "--json"]);
    assert_eq!(output.status.code(), Some(1), "stderr: {}", stderr(&output));
    let value = json(&output);
    assert_eq!(value["status"], "infeasible");
    let comparison = value["comparison"]
        .as_array()
        .expect("comparison is a list");
    assert_eq!(comparison[0]["method"], "exact");
    assert_eq!(comparison[0]["status"], "infeasible");
    assert_eq!(comparison[0]["feasible"], false);
    // The explanation names the item and the period of the shortage.
    let notes = value["notes"].to_string();
    assert!(notes.contains("period 1"), "{notes}");
}

#[test]
fn the_headline_gives_the_status_first_and_then_what_made_the_plan() {
    let dir = fixture();
    let output = lotwright(&["plan", path(dir.path())]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let text = String::from_utf8_lossy(&output.stdout).to_string();
    let headline = text
        .lines()
        .find(|l| l.starts_with("Plan: "))
        .expect("a headline");
    assert!(
        headline.starts_with("Plan: proven optimal (exact method, solver dp)."),
        "{headline}"
    );
    let rule = lotwright(&["plan", path(dir.path()), "--method", "silver-meal"]);
    let text = String::from_utf8_lossy(&rule.stdout).to_string();
    assert!(
        text.contains("Plan: feasible (silver-meal rule)."),
        "{text}"
    );
    // The exact method's former name is still understood.
    let old = lotwright(&["plan", path(dir.path()), "--method", "optimal", "--json"]);
    assert_eq!(old.status.code(), Some(0), "stderr: {}", stderr(&old));
    assert_eq!(json(&old)["comparison"][0]["method"], "exact");
}

#[test]
fn quantities_are_whole_units_unless_lot_multiple_is_zero() {
    // Fractional forecasts (2.5 a week): item W leaves lot_multiple empty
    // (whole units), item K sets 0 (continuous, kilograms).
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,lot_multiple\nW,1,10,\nK,1,10,0\n",
        ),
        (
            "demand.csv",
            "item,period,quantity\nW,1,2.5\nW,2,4.25\nW,3,1\nK,1,2.5\nK,2,4.25\nK,3,1\n",
        ),
    ]);
    let output = lotwright(&["plan", path(dir.path()), "--json"]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let value = json(&output);
    let quantities = |id: &str| -> Vec<f64> {
        value["orders"]
            .as_array()
            .expect("orders")
            .iter()
            .filter(|o| o["item"] == id)
            .map(|o| o["quantity"].as_f64().expect("a number"))
            .collect()
    };
    // Whole: 3, 4 and 1 (0.25 left after bucket 2 is too little for
    // bucket 3, and holding 10 a unit makes a lot of 8 up front dearer).
    assert_eq!(quantities("W"), vec![3.0, 4.0, 1.0]);
    assert_eq!(quantities("K"), vec![2.5, 4.25, 1.0]);
    // Every rule has a plan, and the Silver-Meal plan of W is whole.
    for row in value["comparison"].as_array().expect("comparison") {
        assert_ne!(row["status"], "infeasible", "{row}");
    }
    let text = lotwright(&[
        "plan",
        path(dir.path()),
        "--method",
        "silver-meal",
        "--json",
    ]);
    let rule = json(&text);
    for order in rule["orders"].as_array().expect("orders") {
        let q = order["quantity"].as_f64().expect("a number");
        if order["item"] == "W" {
            assert_eq!(q.fract(), 0.0, "{order}");
        }
    }
}

#[test]
fn missing_items_csv_exits_2_naming_the_file() {
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        ("demand.csv", "item,period,quantity\nA,1,10\n"),
    ]);
    let output = lotwright(&["plan", path(dir.path()), "--json"]);
    assert_eq!(output.status.code(), Some(2));
    assert!(stderr(&output).contains("items.csv"), "{}", stderr(&output));
}

#[test]
fn a_bad_cell_exits_2_with_file_line_and_column() {
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        ("items.csv", "item,setup_cost,holding_cost\nA,50,1\n"),
        ("demand.csv", "item,period,quantity\nA,1,10\nA,2,12 pcs\n"),
    ]);
    let parent = tempfile::tempdir().expect("a temporary folder");
    let out = parent.path().join("out");
    let output = lotwright(&["plan", path(dir.path()), "--out", path(&out)]);
    assert_eq!(output.status.code(), Some(2));
    let message = stderr(&output);
    assert!(message.contains("demand.csv"), "{message}");
    assert!(message.contains("line 3"), "{message}");
    assert!(message.contains("column 3"), "{message}");
    assert!(message.contains("12 pcs"), "{message}");
    // Bad input writes nothing.
    assert!(!out.exists(), "an output folder was written");
}

#[test]
fn a_date_before_the_start_exits_2_saying_how_to_fix_it() {
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        ("items.csv", "item,setup_cost,holding_cost\nA,50,1\n"),
        (
            "demand.csv",
            "item,date,quantity\nA,2027-01-04,10\nA,2026-12-28,5\n",
        ),
    ]);
    let output = lotwright(&["plan", path(dir.path())]);
    assert_eq!(output.status.code(), Some(2));
    let message = stderr(&output);
    assert!(message.contains("demand.csv"), "{message}");
    assert!(message.contains("line 3"), "{message}");
    assert!(message.contains("2026-12-28"), "{message}");
    // How to fix it: the start in scenario.toml, or the row.
    assert!(
        message.contains("scenario.toml") && message.contains("start"),
        "{message}"
    );
}

#[test]
fn out_writes_plan_and_comparison_and_refuses_an_existing_folder() {
    let dir = fixture();
    let parent = tempfile::tempdir().expect("a temporary folder");
    let out = parent.path().join("result");
    let output = lotwright(&["plan", path(dir.path()), "--out", path(&out), "--json"]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let plan_json = json(&output);
    let plan_csv = std::fs::read_to_string(out.join("plan.csv")).expect("plan.csv written");
    let mut lines = plan_csv.lines();
    assert_eq!(
        lines.next(),
        Some("item,period,date,release_period,release_date,quantity,kind,unit")
    );
    assert_eq!(
        lines.count(),
        plan_json["orders"].as_array().unwrap().len(),
        "one row per order"
    );
    let comparison =
        std::fs::read_to_string(out.join("comparison.csv")).expect("comparison.csv written");
    let methods: Vec<&str> = comparison
        .lines()
        .skip(1)
        .map(|line| line.split(',').next().unwrap())
        .collect();
    assert_eq!(methods, METHODS);

    // The folder now exists: refused without --force, and left untouched.
    std::fs::write(out.join("note.txt"), "mine").unwrap();
    let again = lotwright(&["plan", path(dir.path()), "--out", path(&out)]);
    assert_eq!(again.status.code(), Some(2));
    assert!(stderr(&again).contains("--force"), "{}", stderr(&again));
    assert!(out.join("note.txt").exists());

    // With --force it is replaced whole.
    let forced = lotwright(&["plan", path(dir.path()), "--out", path(&out), "--force"]);
    assert_eq!(forced.status.code(), Some(0), "stderr: {}", stderr(&forced));
    assert!(out.join("plan.csv").exists());
    assert!(
        !out.join("note.txt").exists(),
        "the old folder was replaced"
    );
    assert_eq!(
        std::fs::read_to_string(out.join("plan.csv")).unwrap(),
        plan_csv
    );
}

#[test]
fn out_refuses_the_scenario_folder_itself() {
    let dir = fixture();
    let output = lotwright(&[
        "plan",
        path(dir.path()),
        "--out",
        path(dir.path()),
        "--force",
    ]);
    assert_eq!(output.status.code(), Some(2));
    assert!(dir.path().join("items.csv").exists());
    assert!(!dir.path().join("plan.csv").exists());
}

#[test]
fn check_accepts_the_written_plan_as_it_is() {
    let dir = fixture();
    let parent = tempfile::tempdir().expect("a temporary folder");
    let out = parent.path().join("result");
    let planned = lotwright(&["plan", path(dir.path()), "--out", path(&out), "--json"]);
    assert_eq!(
        planned.status.code(),
        Some(0),
        "stderr: {}",
        stderr(&planned)
    );
    let plan_cost = number(&json(&planned), "total_cost");
    let orders = out.join("plan.csv");
    let output = lotwright(&[
        "check",
        path(dir.path()),
        "--orders",
        path(&orders),
        "--json",
    ]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let value = json(&output);
    assert_eq!(value["feasible"], true);
    assert!((number(&value, "total_cost") - plan_cost).abs() < 1e-9);
    assert!((number(&value, "best_cost") - plan_cost).abs() < 1e-9);
    for key in ["shortages", "overloads", "violations"] {
        let list = value[key].as_array().unwrap_or_else(|| panic!("{key}"));
        assert!(list.is_empty(), "{key}: {list:?}");
    }
}

#[test]
fn check_reports_a_shortage_in_a_proposal() {
    // Hand-computed: item A ordered lot-for-lot but missing bucket 3's 42.
    let dir = fixture();
    let proposal = scenario_dir(&[(
        "orders.csv",
        "item,period,quantity\nA,1,18\nA,2,30\nA,4,5\nA,5,20\nB,4,50\n",
    )]);
    let orders = proposal.path().join("orders.csv");
    let output = lotwright(&[
        "check",
        path(dir.path()),
        "--orders",
        path(&orders),
        "--json",
    ]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let value = json(&output);
    assert_eq!(value["feasible"], false);
    let shortages = value["shortages"].as_array().expect("shortages is a list");
    assert!(
        shortages
            .iter()
            .any(|s| s["item"] == "A" && s["period"] == 3 && s["quantity"] == 42.0),
        "{shortages:?}"
    );
}

#[test]
fn the_same_input_gives_the_same_output() {
    let dir = fixture();
    let first = lotwright(&["plan", path(dir.path()), "--json"]);
    let second = lotwright(&["plan", path(dir.path()), "--json"]);
    assert_eq!(first.stdout, second.stdout);
    let first = lotwright(&["plan", path(dir.path())]);
    let second = lotwright(&["plan", path(dir.path())]);
    assert_eq!(first.stdout, second.stdout);
}

#[test]
fn eoq_json_gives_the_classic_lot_and_cost() {
    // Common practice arithmetic with numbers of our own: EOQ =
    // sqrt(2 x 7200 x 25 / 4) = sqrt(90000) = 300; ordering and holding
    // cost are equal there, 7200 / 300 x 25 = 600 and 300 / 2 x 4 = 600,
    // so the total is 1200; 24 orders per time unit, one every 1/24 of it.
    let output = lotwright(&[
        "eoq",
        "--demand",
        "7200",
        "--setup-cost",
        "25",
        "--holding-cost",
        "4",
        "--json",
    ]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let value = json(&output);
    assert!((number(&value, "eoq") - 300.0).abs() < 1e-9);
    assert!((number(&value, "total_cost") - 1200.0).abs() < 1e-9);
    assert!((number(&value, "orders") - 24.0).abs() < 1e-9);
    assert!((number(&value, "cycle") - 1.0 / 24.0).abs() < 1e-12);
}

#[test]
fn backlog_item_plans_with_safety_stock_as_a_target_only() {
    // Hand-computed (the same data as in tests/exact_published.rs):
    // demand 10, 0, 50; setup 100, holding 1, backlog 1.5 a unit a week.
    // One order of 60 in week 3, backlogging week 1's 10 units for two
    // weeks, costs 100 + 15 + 15 = 130, less than any plan without backlog
    // (200). Safety stock 5 is a target for an item that allows backlog:
    // its breaches are reported, not binding.
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,backlog_cost,safety_stock\nA,100,1,1.5,5\n",
        ),
        ("demand.csv", "item,period,quantity\nA,1,10\nA,3,50\n"),
    ]);
    let output = lotwright(&["plan", path(dir.path()), "--json"]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let value = json(&output);
    assert_eq!(value["status"], "optimal");
    assert!((number(&value, "total_cost") - 130.0).abs() < 1e-9);
    assert!((number(&value["costs"], "backlog") - 30.0).abs() < 1e-9);
    let violations = value["violations"]
        .as_array()
        .expect("violations is a list");
    assert!(
        !violations.is_empty(),
        "the safety-stock breaches are reported"
    );
    assert!(violations
        .iter()
        .all(|v| v["kind"] == "safety-stock" && v["binding"] == false));
    assert_eq!(value["comparison"][0]["feasible"], true);
}

#[test]
fn terminal_output_fits_100_columns_with_many_items() {
    // 80 items over 26 weeks, half without a fixed lot (a long note), a
    // lead time and safety stock (breaches in the records).
    let mut items = String::from("item,setup_cost,holding_cost,safety_stock,lead_time,fixed_lot\n");
    let mut demand = String::from("item,period,quantity\n");
    for i in 0..80 {
        let fixed = if i % 2 == 0 { "300" } else { "" };
        items.push_str(&format!(
            "LONG-ITEM-NAME-{i:03},{},0.5,5,{},{fixed}\n",
            50 + i,
            i % 2
        ));
        for t in 2..=26 {
            demand.push_str(&format!(
                "LONG-ITEM-NAME-{i:03},{t},{}\n",
                10 + (i * t) % 37
            ));
        }
    }
    let toml = weekly_toml(26);
    let dir = scenario_dir(&[
        ("scenario.toml", toml.as_str()),
        ("items.csv", &items),
        ("demand.csv", &demand),
    ]);
    for extra in [&[][..], &["--detail"][..], &["--method", "silver-meal"][..]] {
        let mut args = vec!["plan", path(dir.path())];
        args.extend_from_slice(extra);
        let output = lotwright(&args);
        assert_eq!(output.status.code(), Some(0), "{}", stderr(&output));
        let text = stdout(&output);
        let widest = text.lines().map(|l| l.chars().count()).max().unwrap_or(0);
        assert!(widest <= 100, "{extra:?}: a line of {widest} columns");
        assert!(text.contains("Cost by method"));
    }
}

/// Firm orders and a freeze through the command line: the firm orders are
/// listed with their kind in the JSON and in plan.csv, `check` reads that
/// plan.csv back to the same cost (its firm rows are the scenario's, not
/// the plan's), a new order inside the freeze is a binding breach, and a
/// freeze over the whole horizon is a usage error.
#[test]
fn firm_orders_and_a_freeze_reach_every_output_and_check() {
    let dir = fixture();
    std::fs::write(
        dir.path().join("orders-firm.csv"),
        "item,period,quantity\nA,1,50\nB,2,20\n",
    )
    .expect("orders-firm.csv written");
    let parent = tempfile::tempdir().expect("a temporary folder");
    let out = parent.path().join("result");
    let planned = lotwright(&[
        "plan",
        path(dir.path()),
        "--frozen",
        "1",
        "--out",
        path(&out),
        "--json",
    ]);
    assert_eq!(
        planned.status.code(),
        Some(0),
        "stderr: {}",
        stderr(&planned)
    );
    let value = json(&planned);
    assert_eq!(value["status"], "optimal");
    assert_eq!(value["frozen_periods"], 1);
    let orders = value["orders"].as_array().expect("orders");
    let firm: Vec<(String, u64, f64)> = orders
        .iter()
        .filter(|o| o["kind"] == "firm")
        .map(|o| {
            (
                o["item"].as_str().unwrap_or("").to_string(),
                o["period"].as_u64().unwrap_or(0),
                number(o, "quantity"),
            )
        })
        .collect();
    assert_eq!(firm, vec![("A".into(), 1, 50.0), ("B".into(), 2, 20.0)]);
    assert!(
        orders
            .iter()
            .filter(|o| o["kind"] == "planned")
            .all(|o| o["release_period"].as_i64().unwrap_or(0) >= 2),
        "no new release in the frozen period 1: {orders:?}"
    );
    let plan_cost = number(&value, "total_cost");
    let plan_csv = std::fs::read_to_string(out.join("plan.csv")).expect("plan.csv");
    assert!(
        plan_csv.contains("A,1,2027-01-04,1,2027-01-04,50,firm"),
        "{plan_csv}"
    );
    let checked = lotwright(&[
        "check",
        path(dir.path()),
        "--frozen",
        "1",
        "--orders",
        path(&out.join("plan.csv")),
        "--json",
    ]);
    assert_eq!(
        checked.status.code(),
        Some(0),
        "stderr: {}",
        stderr(&checked)
    );
    let report = json(&checked);
    assert_eq!(report["feasible"], true);
    assert!((number(&report, "total_cost") - plan_cost).abs() < 1e-9);
    assert!((number(&report, "best_cost") - plan_cost).abs() < 1e-9);
    // A proposal that releases a new order in the frozen period 1.
    let inside = parent.path().join("inside.csv");
    std::fs::write(&inside, format!("{plan_csv}A,1,,,,5,planned,units\n")).expect("written");
    let checked = lotwright(&[
        "check",
        path(dir.path()),
        "--frozen",
        "1",
        "--orders",
        path(&inside),
        "--json",
    ]);
    let report = json(&checked);
    assert_eq!(report["feasible"], false);
    let kinds: Vec<&str> = report["violations"]
        .as_array()
        .expect("violations")
        .iter()
        .filter_map(|v| v["kind"].as_str())
        .collect();
    assert!(kinds.contains(&"inside-frozen-horizon"), "{kinds:?}");
    let whole = lotwright(&["plan", path(dir.path()), "--frozen", "5"]);
    assert_eq!(whole.status.code(), Some(2));
    assert!(
        stderr(&whole).contains("--frozen 5 leaves nothing to plan"),
        "{}",
        stderr(&whole)
    );
}

/// `compare A --set demand.A=200%` plans the same B as a folder whose
/// demand.csv doubles every row of item A (written here by hand): the
/// overrides mean what they say. A's side is `plan A`'s plan, the difference is B - A, and
/// the items' differences add up to it.
#[test]
fn compare_sets_two_plans_side_by_side_and_overrides_equal_edited_files() {
    let dir = fixture();
    let doubled: String = DEMAND
        .lines()
        .enumerate()
        .map(|(k, line)| {
            if k == 0 || !line.starts_with("A,") {
                return format!("{line}\n");
            }
            let (head, quantity) = line.rsplit_once(',').expect("item,period,quantity");
            let quantity: f64 = quantity.parse().expect("a number");
            format!("{head},{}\n", 2.0 * quantity)
        })
        .collect();
    let edited = scenario_dir(&[
        ("scenario.toml", &weekly_toml(5)),
        ("items.csv", ITEMS),
        ("demand.csv", &doubled),
    ]);
    let planned = json(&lotwright(&["plan", path(dir.path()), "--json"]));
    let by_set = lotwright(&[
        "compare",
        path(dir.path()),
        "--set",
        "demand.A=200%",
        "--json",
    ]);
    assert_eq!(by_set.status.code(), Some(0), "stderr: {}", stderr(&by_set));
    let by_set = json(&by_set);
    let by_file = json(&lotwright(&[
        "compare",
        path(dir.path()),
        path(edited.path()),
        "--json",
    ]));
    let (a, b) = (
        number(&by_set["a"], "total_cost"),
        number(&by_set["b"], "total_cost"),
    );
    assert!((a - number(&planned, "total_cost")).abs() < 1e-9);
    assert!(
        (b - number(&by_file["b"], "total_cost")).abs() < 1e-9,
        "{b}"
    );
    assert!(b > a, "twice the demand costs more: {a} against {b}");
    assert_eq!(by_set["b"]["status"], "optimal");
    assert!((number(&by_set["difference"], "total_cost") - (b - a)).abs() < 1e-6);
    let items: f64 = by_set["items"]
        .as_array()
        .expect("items")
        .iter()
        .map(|row| number(row, "cost_difference"))
        .sum();
    assert!((items - (b - a)).abs() < 1e-6, "{items} against {}", b - a);
    // The terminal page names both sides and the change.
    let text = stdout(&lotwright(&[
        "compare",
        path(dir.path()),
        "--set",
        "demand.A=200%",
    ]));
    assert!(text.contains("with demand.A=200%"), "{text}");
    assert!(text.contains("Items that differ: 1 of 2"), "{text}");
    // --out writes the page and the JSON, whole.
    let parent = tempfile::tempdir().expect("a temporary folder");
    let out = parent.path().join("whatif");
    let written = lotwright(&[
        "compare",
        path(dir.path()),
        "--set",
        "setup_cost.A=50%",
        "--out",
        path(&out),
    ]);
    assert_eq!(
        written.status.code(),
        Some(0),
        "stderr: {}",
        stderr(&written)
    );
    let html = std::fs::read_to_string(out.join("compare.html")).expect("compare.html");
    assert!(html.contains("setup_cost.A=50%"));
    let saved: Value =
        serde_json::from_slice(&std::fs::read(out.join("compare.json")).expect("compare.json"))
            .expect("JSON");
    assert!(
        number(&saved["difference"], "total_cost") < 0.0,
        "cheaper setups save"
    );
}

#[test]
fn compare_refuses_a_missing_second_side_and_unknown_overrides() {
    let dir = fixture();
    for (args, message) in [
        (vec![], "needs a second scenario folder, or --set"),
        (vec!["--set", "speed=2"], "speed is not known"),
        (vec!["--set", "demand.Z=150%"], "no item Z in items.csv"),
        (
            vec!["--set", "capacity=90%"],
            "the scenario has no resources",
        ),
        (vec!["--set", "demand=lots"], "not a number of 0 or more"),
        // A signed value is an addition; one below 0 is refused.
        (vec!["--set", "demand=-1000"], "below 0"),
        (vec!["--set", "frozen_periods=5"], "freeze at most 4"),
    ] {
        let mut all = vec!["compare", path(dir.path())];
        all.extend(args.iter().copied());
        let output = lotwright(&all);
        assert_eq!(
            output.status.code(),
            Some(2),
            "{args:?}: {}",
            stderr(&output)
        );
        assert!(
            stderr(&output).contains(message),
            "{args:?}: {}",
            stderr(&output)
        );
        assert!(output.stdout.is_empty(), "{args:?}");
    }
}

/// `roll` on files: the run of tests/roll.rs `a_run_followed_by_hand`
/// (setup 100, holding 1; forecasts 10, 10 / 30, 10 / 10) realises 220,
/// and a history with a week missing, a file not named by a date or a
/// date that starts no bucket is refused naming the file.
#[test]
fn roll_runs_a_history_folder_and_refuses_a_broken_one() {
    let dir = scenario_dir(&[
        ("scenario.toml", &weekly_toml(3)),
        ("items.csv", "item,setup_cost,holding_cost\nA,100,1\n"),
        (
            "demand.csv",
            "item,period,quantity\nA,1,10\nA,2,30\nA,3,10\n",
        ),
    ]);
    let history = dir.path().join("history");
    std::fs::create_dir(&history).expect("history folder");
    for (date, rows) in [
        ("2027-01-04", "A,2027-01-04,10\nA,2027-01-11,10\n"),
        ("2027-01-11", "A,2027-01-11,30\nA,2027-01-18,10\n"),
        ("2027-01-18", "A,2027-01-18,10\n"),
    ] {
        std::fs::write(
            history.join(format!("{date}.csv")),
            format!("item,date,quantity\n{rows}"),
        )
        .expect("a snapshot");
    }
    std::fs::write(history.join("README.txt"), "not a snapshot").expect("written");
    let args = |extra: &[&str]| {
        let mut all = vec!["roll", path(dir.path()), "--history", path(&history)];
        all.extend_from_slice(extra);
        all.iter().map(|s| s.to_string()).collect::<Vec<_>>()
    };
    let run = |extra: &[&str]| {
        let owned = args(extra);
        let refs: Vec<&str> = owned.iter().map(String::as_str).collect();
        lotwright(&refs)
    };
    let output = run(&[
        "--horizon",
        "2",
        "--method",
        "exact",
        "--method",
        "lot-for-lot",
        "--json",
    ]);
    assert_eq!(output.status.code(), Some(0), "stderr: {}", stderr(&output));
    let value = json(&output);
    assert_eq!(value["plans"], 3);
    let exact = &value["methods"][0];
    assert_eq!(exact["method"], "exact");
    assert!((number(&exact["realised"], "total_cost") - 220.0).abs() < 1e-9);
    assert_eq!(exact["statuses"]["optimal"], 3);
    assert!((number(&exact["stability"], "mean_share_changed") - 1.0).abs() < 1e-9);
    assert_eq!(value["methods"][1]["method"], "lot-for-lot");
    let text = stdout(&run(&["--horizon", "2"]));
    assert!(
        text.contains("a rolling run of 3 weekly plans from 2027-01-04"),
        "{text}"
    );
    for line in text.lines() {
        assert!(line.chars().count() <= 100, "too wide: {line}");
    }
    // A broken history.
    std::fs::rename(history.join("2027-01-11.csv"), history.join("week2.csv")).expect("renamed");
    let output = run(&[]);
    assert_eq!(output.status.code(), Some(2));
    assert!(stderr(&output).contains("week2.csv"), "{}", stderr(&output));
    assert!(
        stderr(&output).contains("named by the date"),
        "{}",
        stderr(&output)
    );
    std::fs::remove_file(history.join("week2.csv")).expect("removed");
    let output = run(&[]);
    assert_eq!(output.status.code(), Some(2));
    assert!(
        stderr(&output).contains("the one for 2027-01-11 is missing"),
        "{}",
        stderr(&output)
    );
    std::fs::write(history.join("2027-01-12.csv"), "item,period,quantity\n").expect("written");
    let output = run(&[]);
    assert_eq!(output.status.code(), Some(2));
    assert!(
        stderr(&output).contains("2027-01-12.csv: 2027-01-12 is not the first day of a bucket"),
        "{}",
        stderr(&output)
    );
    let output = run(&["--frozen", "2", "--horizon", "2"]);
    assert_eq!(output.status.code(), Some(2));
}
