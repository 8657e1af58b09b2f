//! Honest statuses: what plan, check and compare say when the time limit
//! runs out before the exact method finds a plan. A time-out is never "no
//! feasible plan": the run exits 4 and says the time ran out.
//!
//! The fixture tests/data/tight-bill is invented: a bill of material on one
//! line so tight that the level-by-level start breaks capacity, so HiGHS
//! needs more than a few milliseconds to find any plan (it finds one within
//! seconds; checked below, so the fixture cannot silently become
//! infeasible).

use std::path::{Path, PathBuf};
use std::process::{Command, Output};

use serde_json::Value;

fn lotwright(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .args(args)
        .output()
        .expect("the binary runs")
}

fn tight_bill() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/data/tight-bill")
}

fn text(output: &Output) -> String {
    format!(
        "{}{}",
        String::from_utf8_lossy(&output.stdout),
        String::from_utf8_lossy(&output.stderr)
    )
}

fn json(output: &Output) -> Value {
    serde_json::from_slice(&output.stdout)
        .unwrap_or_else(|e| panic!("stdout is one JSON object ({e}):\n{}", text(output)))
}

/// A lot-for-lot plan of the fixture, written by `plan --out`, to check.
fn proposal(dir: &Path) -> PathBuf {
    let out = dir.join("lfl");
    let output = lotwright(&[
        "plan",
        tight_bill().to_str().unwrap(),
        "--method",
        "lot-for-lot",
        "--out",
        out.to_str().unwrap(),
    ]);
    assert_eq!(output.status.code(), Some(0), "{}", text(&output));
    out.join("plan.csv")
}

#[test]
fn the_fixture_has_a_plan_given_time() {
    let output = lotwright(&[
        "plan",
        tight_bill().to_str().unwrap(),
        "--method",
        "exact",
        "--time-limit",
        "20",
        "--json",
    ]);
    assert_eq!(output.status.code(), Some(0), "{}", text(&output));
    let value = json(&output);
    assert!(
        ["optimal", "feasible"].contains(&value["status"].as_str().unwrap()),
        "{value}"
    );
}

#[test]
fn plan_that_runs_out_of_time_exits_4_and_does_not_say_infeasible() {
    let dir = tight_bill();
    for json_flag in [false, true] {
        let mut args = vec![
            "plan",
            dir.to_str().unwrap(),
            "--method",
            "exact",
            "--time-limit",
            "0.001",
        ];
        if json_flag {
            args.push("--json");
        }
        let output = lotwright(&args);
        assert_eq!(output.status.code(), Some(4), "{}", text(&output));
        let words = text(&output).to_lowercase();
        assert!(!words.contains("no feasible plan"), "{words}");
        if json_flag {
            assert_eq!(json(&output)["status"], "unknown");
        } else {
            assert!(words.contains("no plan found in time"), "{words}");
        }
    }
}

#[test]
fn check_that_runs_out_of_time_exits_4_and_does_not_say_infeasible() {
    let tmp = tempfile::tempdir().unwrap();
    let orders = proposal(tmp.path());
    let dir = tight_bill();
    let base = [
        "check",
        dir.to_str().unwrap(),
        "--orders",
        orders.to_str().unwrap(),
        "--time-limit",
        "0.001",
    ];
    let output = lotwright(&base);
    assert_eq!(output.status.code(), Some(4), "{}", text(&output));
    let words = text(&output).to_lowercase();
    assert!(!words.contains("no feasible plan"), "{words}");
    assert!(words.contains("time limit ran out"), "{words}");

    let mut args = base.to_vec();
    args.push("--json");
    let output = lotwright(&args);
    assert_eq!(output.status.code(), Some(4), "{}", text(&output));
    let value = json(&output);
    assert_eq!(value["best_status"], "unknown", "{value}");
    assert!(value["best_cost"].is_null(), "{value}");
    assert_eq!(value["feasible"], false, "lot-for-lot overloads the line");
}

#[test]
fn compare_that_runs_out_of_time_exits_4_and_does_not_say_infeasible() {
    let dir = tight_bill();
    let output = lotwright(&[
        "compare",
        dir.to_str().unwrap(),
        "--set",
        "capacity=120%",
        "--method",
        "exact",
        "--time-limit",
        "0.001",
    ]);
    assert_eq!(output.status.code(), Some(4), "{}", text(&output));
    let words = text(&output).to_lowercase();
    assert!(!words.contains("no feasible plan"), "{words}");
    assert!(words.contains("no plan found in time"), "{words}");
}
