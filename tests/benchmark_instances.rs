//! A few instances of the capacitated lot-sizing benchmark of Trigeiro,
//! Thomas and McClain, "Capacitated lot sizing with setup times", Management
//! Science 35(3):353-366, 1989 (files in ../shared/benchmarks/trigeiro-x).
//! The optimal values below were proven by lotwright's MILP (HiGHS) in this
//! project's benchmark run of 2026-12-02 (docs/benchmarks.md) and are
//! checked here against the textbook big-M model solved independently by
//! HiGHS: both models must prove the same optimum.

use std::path::PathBuf;

use lotwright::capacity::milp::{self, MilpOptions, MilpStatus};
use lotwright::eval::evaluate;
use lotwright::input::literature;
use lotwright::model::Plan;

fn instance(name: &str) -> lotwright::model::Scenario {
    // The instances live in the team's shared folder beside the project (as
    // in CI); LOTWRIGHT_BENCHMARKS may point elsewhere.
    let dir = std::env::var_os("LOTWRIGHT_BENCHMARKS")
        .map(PathBuf::from)
        .unwrap_or_else(|| {
            PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../shared/benchmarks/trigeiro-x")
        });
    let path = dir.join(name);
    let text = std::fs::read_to_string(&path)
        .unwrap_or_else(|e| panic!("the benchmark file {} must be present: {e}", path.display()));
    literature::parse_capacitated(&path, name, &text).expect("the benchmark file parses")
}

fn solve(name: &str, plain: bool) -> (MilpStatus, f64, f64) {
    let scenario = instance(name);
    let items: Vec<usize> = (0..scenario.items.len()).collect();
    let options = MilpOptions {
        time_limit: 120.0,
        threads: Some(1),
        plain,
        ..MilpOptions::default()
    };
    let result = milp::solve(&scenario, &items, &options);
    let evaluation = evaluate(
        &scenario,
        &Plan {
            receipts: result.receipts.clone(),
        },
    );
    assert!(
        evaluation.feasible,
        "{name}: plan infeasible in the evaluation"
    );
    (result.status, result.objective, evaluation.total_cost())
}

#[test]
fn small_benchmark_instances_are_proven_optimal_by_both_models() {
    // Values rounded to the 0.1 grid the data's holding costs put them on.
    for (name, optimum) in [
        ("X11117A", 8375.8),
        ("X11128A", 8198.8),
        ("X12127A", 7093.9),
    ] {
        for plain in [false, true] {
            let (status, cost, evaluated) = solve(name, plain);
            assert_eq!(status, MilpStatus::Optimal, "{name} plain={plain}");
            assert!(
                (cost - optimum).abs() < 1e-3,
                "{name} plain={plain}: {cost} vs {optimum}"
            );
            assert!(
                (cost - evaluated).abs() < 1e-6 * cost,
                "{name}: {cost} vs evaluation {evaluated}"
            );
        }
    }
}

#[test]
fn a_broken_benchmark_file_names_its_line() {
    let path = PathBuf::from("X-broken");
    let err = literature::parse_capacitated(&path, "X-broken", "2 3\n1\n100\n1 1 5 50\n1 x 5 50\n")
        .expect_err("the file is refused")
        .to_string();
    assert!(
        err.contains("line 5") && err.contains("not a number"),
        "{err}"
    );
}
