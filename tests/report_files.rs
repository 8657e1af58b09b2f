//! The files `plan --out` writes for people: records.csv and load.csv (one
//! row per item or resource and bucket), plan.xlsx and report.html, all in
//! one folder, the same bytes for the same input.

mod report_fixture;

use report_fixture::{folder, plan_out};

const WRITTEN: [&str; 6] = [
    "comparison.csv",
    "load.csv",
    "plan.csv",
    "plan.xlsx",
    "records.csv",
    "report.html",
];

fn read_csv(path: &std::path::Path) -> Vec<csv::StringRecord> {
    let mut reader = csv::Reader::from_path(path).expect("the CSV opens");
    let mut rows = vec![reader.headers().expect("a header").clone()];
    rows.extend(reader.records().map(|r| r.expect("a CSV row")));
    rows
}

fn number(text: &str) -> f64 {
    text.parse()
        .unwrap_or_else(|_| panic!("{text:?} is a number"))
}

#[test]
fn out_writes_every_file_and_records_match_the_json() {
    let dir = folder();
    let parent = tempfile::tempdir().unwrap();
    let out = parent.path().join("result");
    let json = plan_out(dir.path(), &out);
    let mut names: Vec<String> = std::fs::read_dir(&out)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    assert_eq!(names, WRITTEN);
    // No staging folder is left beside the output.
    let siblings = std::fs::read_dir(parent.path()).unwrap().count();
    assert_eq!(siblings, 1, "only the output folder is left");

    let records = read_csv(&out.join("records.csv"));
    assert_eq!(
        records[0].iter().collect::<Vec<_>>(),
        [
            "item",
            "period",
            "date",
            "gross_requirement",
            "scheduled_receipts",
            "planned_receipts",
            "planned_releases",
            "on_hand",
            "shortage",
            "backlog",
            "firm_receipts",
            "firm_releases",
            "unit"
        ]
    );
    assert_eq!(records.len(), 1 + 3 * 8, "one row per item and bucket");
    // The open order of TIN shows in bucket 1; the last on hand of every
    // item is its ending stock in the JSON.
    let tin_first = records.iter().find(|r| &r[0] == "TIN" && &r[1] == "1");
    assert_eq!(tin_first.map(|r| number(&r[4])), Some(60.0));
    assert_eq!(records[1][2].to_string(), "2027-01-04");
    for item in json["items"].as_array().unwrap() {
        let id = item["item"].as_str().unwrap();
        let last = records
            .iter()
            .find(|r| &r[0] == id && &r[1] == "8")
            .unwrap_or_else(|| panic!("a row for {id} in bucket 8"));
        let expected = item["ending_stock"].as_f64().unwrap();
        assert!((number(&last[7]) - expected).abs() < 1e-6, "{id}");
    }
    // Planned receipts add up to the JSON's orders.
    let ordered: f64 = json["orders"]
        .as_array()
        .unwrap()
        .iter()
        .map(|o| o["quantity"].as_f64().unwrap())
        .sum();
    let received: f64 = records[1..].iter().map(|r| number(&r[5])).sum();
    assert!((ordered - received).abs() < 1e-4, "{ordered} vs {received}");

    let load = read_csv(&out.join("load.csv"));
    assert_eq!(
        load[0].iter().collect::<Vec<_>>(),
        [
            "resource",
            "period",
            "date",
            "production",
            "setup_time",
            "load",
            "capacity",
            "overtime_capacity",
            "overtime",
            "unit"
        ]
    );
    assert_eq!(load.len(), 1 + 8);
    for row in &load[1..] {
        let sum = number(&row[3]) + number(&row[4]);
        assert!(
            (number(&row[5]) - sum).abs() < 1e-6,
            "load = production + setup time"
        );
        let expected = if &row[1] == "3" { 500.0 } else { 900.0 };
        assert_eq!(number(&row[6]), expected, "capacity.csv cuts week 3");
        assert!(number(&row[5]) <= number(&row[6]) + number(&row[8]) + 1e-6);
    }
}

#[test]
fn the_same_input_writes_the_same_bytes() {
    let dir = folder();
    let parent = tempfile::tempdir().unwrap();
    let (first, second) = (parent.path().join("a"), parent.path().join("b"));
    plan_out(dir.path(), &first);
    plan_out(dir.path(), &second);
    for name in WRITTEN {
        let a = std::fs::read(first.join(name)).unwrap();
        let b = std::fs::read(second.join(name)).unwrap();
        assert!(!a.is_empty(), "{name} is empty");
        assert!(a == b, "{name} differs between two runs");
    }
}
