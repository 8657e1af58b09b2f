//! A method whose plan is infeasible says why, wherever the comparison of
//! methods appears: the terminal table, the JSON row (`reason`, as data:
//! overload by resource and period with the amount, shortage by item and
//! period, broken lot rules), report.html and the Comparison sheet of
//! plan.xlsx.
//!
//! The fixture (invented): items A and B share LINE (100 a week, no
//! overtime). Lot-for-lot loads it with 70, 110, 70, 110: 10 over in weeks 2
//! and 4. Cumulative load (70, 180, 250, 360) stays within cumulative
//! capacity (100, 200, 300, 400), so the exact method builds ahead and fits.

mod common;

use std::io::Cursor;

use calamine::{open_workbook_from_rs, Data, DataType, Reader, Xlsx};
use common::{lotwright, scenario_dir, weekly_toml};
use serde_json::Value;

const ITEMS: &str = "item,setup_cost,holding_cost\nA,50,1\nB,40,1\n";
const DEMAND: &str =
    "item,period,quantity\nA,1,30\nA,2,70\nA,3,30\nA,4,70\nB,1,40\nB,2,40\nB,3,40\nB,4,40\n";

fn fixture() -> tempfile::TempDir {
    scenario_dir(&[
        ("scenario.toml", &weekly_toml(4)),
        ("items.csv", ITEMS),
        ("demand.csv", DEMAND),
        ("resources.csv", "resource,capacity\nLINE,100\n"),
        (
            "routing.csv",
            "item,resource,per_unit,setup_time\nA,LINE,1,0\nB,LINE,1,0\n",
        ),
    ])
}

fn row<'a>(json: &'a Value, method: &str) -> &'a Value {
    json["comparison"]
        .as_array()
        .expect("a comparison list")
        .iter()
        .find(|r| r["method"] == method)
        .unwrap_or_else(|| panic!("a {method} row"))
}

#[test]
fn the_json_row_of_an_infeasible_rule_carries_its_overloads() {
    let dir = fixture();
    let (code, out, err) = lotwright(&["plan", dir.path().to_str().unwrap(), "--json"]);
    assert_eq!(code, 0, "{err}");
    let json: Value = serde_json::from_str(&out).expect("JSON");
    let exact = row(&json, "exact");
    assert_eq!(exact["feasible"], true);
    assert_eq!(exact["reason"], Value::Null, "a feasible row has no reason");
    let lfl = row(&json, "lot-for-lot");
    assert_eq!(lfl["feasible"], false);
    let overloads = lfl["reason"]["overloads"].as_array().expect("overloads");
    assert_eq!(overloads.len(), 1, "one resource: {overloads:?}");
    let line = &overloads[0];
    assert_eq!(line["resource"], "LINE");
    assert_eq!(line["first_period"], 2);
    assert_eq!(line["excess"], 10.0);
    assert_eq!(line["periods"], 2);
    assert_eq!(line["total_excess"], 20.0);
    assert_eq!(lfl["reason"]["shortages"], serde_json::json!([]));
    // Every infeasible row has a reason, every feasible one none.
    for r in json["comparison"].as_array().unwrap() {
        assert_eq!(
            r["reason"].is_null(),
            r["feasible"] == true,
            "{}: {r}",
            r["method"]
        );
    }
}

#[test]
fn the_terminal_table_says_why_a_rule_is_infeasible() {
    let dir = fixture();
    let (code, out, err) = lotwright(&["plan", dir.path().to_str().unwrap()]);
    assert_eq!(code, 0, "{err}");
    let line = out
        .lines()
        .find(|l| l.trim_start().starts_with("lot-for-lot is infeasible"))
        .unwrap_or_else(|| panic!("a line on lot-for-lot's infeasibility:\n{out}"));
    assert!(
        line.contains("LINE") && line.contains("period 2") && line.contains("by 10"),
        "{line}"
    );
    assert!(out.lines().all(|l| l.chars().count() <= 100), "{out}");
}

#[test]
fn report_html_and_plan_xlsx_say_why_as_well() {
    let dir = fixture();
    let parent = tempfile::tempdir().unwrap();
    let out = parent.path().join("out");
    let (code, _, err) = lotwright(&[
        "plan",
        dir.path().to_str().unwrap(),
        "--out",
        out.to_str().unwrap(),
    ]);
    assert_eq!(code, 0, "{err}");
    let html = std::fs::read_to_string(out.join("report.html")).expect("report.html");
    let table = html
        .split("<h2>Comparison of methods</h2>")
        .nth(1)
        .expect("the comparison section");
    let table = table.split("</section>").next().unwrap();
    assert!(table.contains("why infeasible"), "{table}");
    assert!(
        table.contains("LINE over capacity in 2 periods from period 2"),
        "{table}"
    );
    let bytes = std::fs::read(out.join("plan.xlsx")).expect("plan.xlsx");
    let mut book: Xlsx<_> = open_workbook_from_rs(Cursor::new(bytes)).expect("opens");
    let sheet = book
        .worksheet_range("Comparison")
        .expect("Comparison sheet");
    let mut rows = sheet.rows();
    let header = rows.next().expect("a header");
    let why = header
        .iter()
        .position(|c| c.get_string() == Some("Why infeasible"))
        .unwrap_or_else(|| panic!("a Why infeasible column in {header:?}"));
    let lfl = rows
        .find(|r| r.first().and_then(|c| c.get_string()) == Some("lot-for-lot"))
        .expect("a lot-for-lot row");
    match &lfl[why] {
        Data::String(text) => assert!(text.contains("LINE") && text.contains("period 2"), "{text}"),
        other => panic!("a text cell, got {other:?}"),
    }
}

#[test]
fn compare_says_why_a_side_is_infeasible() {
    let dir = fixture();
    let d = dir.path().to_str().unwrap();
    let args = [
        "compare",
        d,
        "--set",
        "capacity.LINE=120%",
        "--method",
        "lot-for-lot",
    ];
    let (code, out, err) = lotwright(&[&args[..], &["--json"]].concat());
    assert_eq!(code, 0, "{err}");
    let json: Value = serde_json::from_str(&out).expect("JSON");
    assert_eq!(json["a"]["feasible"], false);
    assert_eq!(json["a"]["reason"]["overloads"][0]["resource"], "LINE");
    assert_eq!(json["b"]["feasible"], true, "120 a week fits lot-for-lot");
    assert_eq!(json["b"]["reason"], Value::Null);
    let (_, text, _) = lotwright(&args);
    let line = text
        .lines()
        .find(|l| l.starts_with("A: infeasible"))
        .unwrap_or_else(|| panic!("A's status line:\n{text}"));
    let why = text
        .split(line)
        .nth(1)
        .and_then(|rest| rest.lines().nth(1))
        .unwrap_or("");
    assert!(
        (line.to_string() + why).contains("LINE over capacity in 2 periods from period 2"),
        "{text}"
    );
    let parent = tempfile::tempdir().unwrap();
    let out = parent.path().join("cmp");
    let (code, _, err) = lotwright(&[&args[..], &["--out", out.to_str().unwrap()]].concat());
    assert_eq!(code, 0, "{err}");
    let html = std::fs::read_to_string(out.join("compare.html")).expect("compare.html");
    assert!(
        html.contains("LINE over capacity in 2 periods from period 2"),
        "compare.html says why"
    );
}
