//! `roll --out DIR` run as a user runs it: the real binary on the
//! four-week demo and on an invented run with a press, writing
//! realised.csv, stability.csv, weeks.csv and report.html whole or not at
//! all. Every figure in the files is the one `--json` prints in the same
//! run; the four-week demo keeps the figures worked by hand in its README
//! (and in tests/roll.rs).

mod common;
mod roll_fixture;

use std::path::{Path, PathBuf};

use common::lotwright;
use serde_json::Value;

fn demo() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("demo-data")
        .join("harbor-bakeware-four-weeks")
}

/// A CSV file: its header and its rows.
fn read_csv(path: &Path) -> (Vec<String>, Vec<Vec<String>>) {
    let mut reader = csv::Reader::from_path(path).expect("the file reads as CSV");
    let header = reader
        .headers()
        .unwrap()
        .iter()
        .map(str::to_string)
        .collect();
    let rows = reader
        .records()
        .map(|r| r.unwrap().iter().map(str::to_string).collect())
        .collect();
    (header, rows)
}

/// A figure of a file against the JSON's: equal to the file's six decimals.
fn same(cell: &str, json: &Value, what: &str) {
    match json {
        Value::Null => assert_eq!(cell, "", "{what}: empty for null"),
        Value::String(s) => assert_eq!(cell, s, "{what}"),
        _ => {
            let expected = json.as_f64().unwrap_or_else(|| panic!("{what}: {json}"));
            let got: f64 = cell.parse().unwrap_or_else(|_| panic!("{what}: {cell:?}"));
            assert!(
                (got - expected).abs() <= 1e-6 * (1.0 + expected.abs()),
                "{what}: file {got}, JSON {expected}"
            );
        }
    }
}

/// Runs `roll` with `--json` and `--out`, and checks every file against
/// the JSON; returns the JSON.
fn run_and_compare(dir: &Path, terms: &[String], out: &Path) -> Value {
    let mut args: Vec<String> = vec!["roll".into(), dir.display().to_string()];
    args.extend(terms.iter().cloned());
    args.extend(["--json".into(), "--out".into(), out.display().to_string()]);
    let args: Vec<&str> = args.iter().map(String::as_str).collect();
    let (code, stdout, stderr) = lotwright(&args);
    assert_eq!(code, 0, "{stderr}");
    let json: Value = serde_json::from_str(&stdout).expect("one JSON object");
    let methods = json["methods"].as_array().unwrap();
    let mut files: Vec<String> = std::fs::read_dir(out)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    files.sort();
    assert_eq!(
        files,
        ["realised.csv", "report.html", "stability.csv", "weeks.csv"]
    );

    let (header, rows) = read_csv(&out.join("realised.csv"));
    assert_eq!(
        header,
        [
            "method",
            "cost",
            "setup_cost",
            "holding_cost",
            "backlog_cost",
            "overtime_cost",
            "unit_cost",
            "total_cost",
            "setups",
            "fill_rate",
            "cost_per_unit_served",
            "most_short",
            "ending_stock_value",
            "overload_planned",
            "units_cut",
            "weeks_late",
        ]
    );
    assert_eq!(rows.len(), methods.len());
    for (row, m) in rows.iter().zip(methods) {
        let r = &m["realised"];
        let expected = [
            &m["method"],
            &r["cost_without_unit"],
            &r["costs"]["setup"],
            &r["costs"]["holding"],
            &r["costs"]["backlog"],
            &r["costs"]["overtime"],
            &r["costs"]["unit"],
            &r["total_cost"],
            &r["setups"],
            &r["fill_rate"],
            &r["cost_per_unit_served"],
            &r["most_short"],
            &r["ending_stock_value"],
            &r["overload_planned"],
            &r["units_cut"],
            &m["statuses"]["late"],
        ];
        for ((cell, json), name) in row.iter().zip(expected).zip(&header) {
            same(cell, json, &format!("realised.csv {} {name}", row[0]));
        }
    }

    let (header, rows) = read_csv(&out.join("stability.csv"));
    assert_eq!(
        header,
        [
            "method",
            "orders_changed",
            "added",
            "removed",
            "resized",
            "kept",
            "units_moved",
            "units_before",
        ]
    );
    assert_eq!(rows.len(), methods.len());
    for (row, m) in rows.iter().zip(methods) {
        let s = &m["stability"];
        let expected = [
            &m["method"],
            &s["mean_share_changed"],
            &s["added"],
            &s["removed"],
            &s["resized"],
            &s["kept"],
            &s["units_moved"],
            &s["units_before"],
        ];
        for ((cell, json), name) in row.iter().zip(expected).zip(&header) {
            same(cell, json, &format!("stability.csv {} {name}", row[0]));
        }
    }

    let (header, rows) = read_csv(&out.join("weeks.csv"));
    assert_eq!(
        header,
        [
            "method",
            "period",
            "date",
            "status",
            "plan_cost",
            "gap",
            "share_changed",
            "units_moved",
            "overload",
            "units_cut",
            "units_late",
        ]
    );
    let plans = json["plans"].as_u64().unwrap() as usize;
    assert_eq!(rows.len(), methods.len() * plans);
    let weeks = methods.iter().flat_map(|m| {
        m["weeks"]
            .as_array()
            .unwrap()
            .iter()
            .map(move |w| (&m["method"], w))
    });
    for (row, (method, w)) in rows.iter().zip(weeks) {
        let cut: f64 = w["cuts"]
            .as_array()
            .unwrap()
            .iter()
            .map(|c| c["quantity"].as_f64().unwrap())
            .sum();
        let late: f64 = w["late"]
            .as_array()
            .unwrap()
            .iter()
            .map(|l| l["quantity"].as_f64().unwrap())
            .sum();
        let expected = [
            method,
            &w["period"],
            &w["date"],
            &w["status"],
            &w["plan_cost"],
            &w["gap"],
            &w["share_changed"],
            &w["units_moved"],
            &w["overload"],
            &Value::from(cut),
            &Value::from(late),
        ];
        for ((cell, json), name) in row.iter().zip(expected).zip(&header) {
            same(
                cell,
                json,
                &format!("weeks.csv {} {} {name}", row[0], row[1]),
            );
        }
    }
    json
}

/// The four-week demo: one row per method in realised.csv and
/// stability.csv, one per method and week in weeks.csv, each figure the
/// JSON's; the exact method keeps the README's hand-worked figures
/// (390 realised, 280 units moved of 520, no plan late or cut).
#[test]
fn the_four_week_demo_writes_the_figures_the_json_prints() {
    let folder = tempfile::tempdir().unwrap();
    let out = folder.path().join("run");
    let dir = demo();
    let terms: Vec<String> = [
        "--history",
        &dir.join("history").display().to_string(),
        "--horizon",
        "3",
        "--frozen",
        "1",
    ]
    .iter()
    .map(|s| s.to_string())
    .collect();
    let json = run_and_compare(&dir, &terms, &out);
    assert_eq!(json["plans"], 4);
    let (_, realised) = read_csv(&out.join("realised.csv"));
    let exact = realised
        .iter()
        .find(|r| r[0] == "exact")
        .expect("an exact row");
    assert_eq!((exact[1].as_str(), exact[8].as_str()), ("390", "3"));
    assert_eq!(&exact[13..], ["0", "0", "0"]);
    let (_, stability) = read_csv(&out.join("stability.csv"));
    let exact = stability.iter().find(|r| r[0] == "exact").unwrap();
    assert_eq!((exact[6].as_str(), exact[7].as_str()), ("280", "520"));
    let page = std::fs::read_to_string(out.join("report.html")).unwrap();
    assert!(page.contains("Rolling run: Harbor Bakeware pie dish"));
    assert!(!page.contains("<script"), "no scripts");
    // The exact method's orders build a lot ahead (170 in week 3 for weeks
    // 3 and 4), so the page carries the caution.
    assert!(page.contains("Shelf life, quality holds"));
    // No staging folder is left beside the output.
    let left: Vec<_> = std::fs::read_dir(folder.path())
        .unwrap()
        .map(|e| e.unwrap().file_name())
        .collect();
    assert_eq!(left.len(), 1, "{left:?}");
}

/// The invented run on a press: the rules' orders are cut and the exact
/// method plans the jump in sales late; the files carry both, week by
/// week, and the page names the late units, the cuts and the safety
/// stock of each item.
#[test]
fn cuts_late_units_and_safety_stock_reach_the_files_and_the_page() {
    let folder = tempfile::tempdir().unwrap();
    let dir = folder.path().join("tinware");
    roll_fixture::write(&dir);
    let out = folder.path().join("run");
    let json = run_and_compare(&dir, &roll_fixture::terms(&dir), &out);
    let (_, weeks) = read_csv(&out.join("weeks.csv"));
    let total = |method: &str, column: usize| -> f64 {
        weeks
            .iter()
            .filter(|r| r[0] == method)
            .map(|r| r[column].parse::<f64>().unwrap())
            .sum()
    };
    let methods = json["methods"].as_array().unwrap();
    assert!(methods
        .iter()
        .any(|m| m["realised"]["units_cut"].as_f64() > Some(0.0)));
    for m in methods {
        let label = m["method"].as_str().unwrap();
        same(
            &total(label, 9).to_string(),
            &m["realised"]["units_cut"],
            &format!("{label}: units cut by week add up"),
        );
    }
    let exact = methods.iter().find(|m| m["method"] == "exact").unwrap();
    assert!(exact["statuses"]["late"].as_u64() > Some(0));
    assert!(total("exact", 10) > 0.0, "exact plans some units late");
    let page = std::fs::read_to_string(out.join("report.html")).unwrap();
    for words in [
        "Units planned late",
        "Orders cut to fit the lines",
        "Safety stock for a 90.0 % cycle service level",
        "local labour law",
    ] {
        assert!(page.contains(words), "the page says {words:?}");
    }
}

/// An existing folder is refused without --force and left as it was;
/// with --force it is replaced whole; the history folder is never an
/// output.
#[test]
fn an_existing_folder_is_kept_unless_forced_and_the_history_is_never_written() {
    let folder = tempfile::tempdir().unwrap();
    let out = folder.path().join("run");
    std::fs::create_dir(&out).unwrap();
    std::fs::write(out.join("mine.txt"), "keep me").unwrap();
    let dir = demo();
    let history = dir.join("history");
    let base = |out: &Path| -> Vec<String> {
        [
            "roll",
            &dir.display().to_string(),
            "--history",
            &history.display().to_string(),
            "--horizon",
            "3",
            "--frozen",
            "1",
            "--method",
            "exact",
            "--out",
            &out.display().to_string(),
        ]
        .iter()
        .map(|s| s.to_string())
        .collect()
    };
    let run = |args: &[String]| {
        let args: Vec<&str> = args.iter().map(String::as_str).collect();
        lotwright(&args)
    };
    let (code, _, stderr) = run(&base(&out));
    assert_eq!(code, 2, "{stderr}");
    assert!(stderr.contains("--force"), "{stderr}");
    assert_eq!(
        std::fs::read_to_string(out.join("mine.txt")).unwrap(),
        "keep me"
    );

    let mut forced = base(&out);
    forced.push("--force".into());
    let (code, _, stderr) = run(&forced);
    assert_eq!(code, 0, "{stderr}");
    assert!(!out.join("mine.txt").exists(), "the old folder is replaced");
    let (_, rows) = read_csv(&out.join("realised.csv"));
    assert_eq!(rows.len(), 1, "one method asked for");

    let before: Vec<_> = std::fs::read_dir(&history).unwrap().collect();
    let mut into_history = base(&history);
    into_history.push("--force".into());
    let (code, _, stderr) = run(&into_history);
    assert_eq!(code, 2, "{stderr}");
    assert!(stderr.contains("inputs"), "{stderr}");
    assert_eq!(std::fs::read_dir(&history).unwrap().count(), before.len());
}
