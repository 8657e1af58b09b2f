//! The heuristics for large shared-capacity groups (Lagrangean relaxation,
//! smoothing, fix-and-optimize) against the MILP proven optimal on small
//! random groups: the Lagrangean bound never exceeds the optimum, every plan
//! they return fits capacity and costs what the evaluation says, never less
//! than the optimum; and the command line names the solver it used.

use lotwright::capacity::fix_optimize::{self, Search};
use lotwright::capacity::milp::{self, MilpOptions, MilpStatus};
use lotwright::capacity::{lagrange, Group};
use lotwright::eval::evaluate;
use lotwright::model::{BucketKind, Calendar, Item, Plan, Resource, Routing, Scenario};
use proptest::prelude::*;

mod common;

/// Three or four items over eight weeks on two machines; every item runs on
/// one or both, with setup times; capacity at `load` times the average
/// demand load, some overtime on the second machine.
fn group(demand: Vec<Vec<u32>>, costs: Vec<(u32, u32)>, both: Vec<bool>, load: f64) -> Scenario {
    let periods = demand[0].len();
    let items: Vec<Item> = demand
        .iter()
        .zip(&costs)
        .enumerate()
        .map(|(i, (d, &(setup, holding)))| {
            let d: Vec<f64> = d.iter().map(|&x| x as f64).collect();
            Item::simple(
                &format!("I{i}"),
                &d,
                20.0 + setup as f64,
                0.5 + holding as f64 / 4.0,
            )
        })
        .collect();
    let total: f64 = items.iter().flat_map(|i| i.demand.iter()).sum();
    let capacity = (total / periods as f64 / load).ceil() + 6.0;
    let mut routings = Vec::new();
    for (i, &two) in both.iter().enumerate().take(items.len()) {
        routings.push(Routing {
            item: i,
            resource: i % 2,
            per_unit: 1.0,
            setup_time: 2.0,
        });
        if two {
            routings.push(Routing {
                item: i,
                resource: 1 - i % 2,
                per_unit: 0.5,
                setup_time: 1.0,
            });
        }
    }
    let machine = |id: &str, overtime: f64| Resource {
        id: id.into(),
        unit: "capacity units".into(),
        capacity: vec![capacity; periods],
        overtime_capacity: vec![overtime; periods],
        overtime_cost: 3.0,
        capacity_cost: None,
    };
    Scenario {
        name: "small group".into(),
        currency: None,
        calendar: Calendar {
            start: chrono::NaiveDate::from_ymd_opt(2027, 1, 4).unwrap(),
            kind: BucketKind::Week,
            periods,
        },
        items,
        resources: vec![machine("M1", 0.0), machine("M2", 4.0)],
        routings,
        frozen: 0,
        bom: Vec::new(),
        period_offset: 0,
    }
}

fn whole_group(s: &Scenario) -> Group {
    Group {
        items: (0..s.items.len()).collect(),
        resources: vec![0, 1],
    }
}

fn limits(seconds: f64) -> MilpOptions {
    MilpOptions {
        time_limit: seconds,
        threads: Some(1),
        ..MilpOptions::default()
    }
}

/// Demand by item and bucket, (setup, holding) codes, runs on both
/// machines, load factor.
type GroupCase = (Vec<Vec<u32>>, Vec<(u32, u32)>, Vec<bool>, f64);

fn small_group() -> impl Strategy<Value = GroupCase> {
    (3usize..=4).prop_flat_map(|n| {
        (
            prop::collection::vec(prop::collection::vec(0u32..12, 8), n),
            prop::collection::vec((0u32..60, 0u32..6), n),
            prop::collection::vec(any::<bool>(), n),
            0.5f64..0.9,
        )
    })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 24, ..ProptestConfig::default() })]

    #[test]
    fn heuristics_keep_to_the_proven_optimum(
        (demand, costs, both, load) in small_group()
    ) {
        let s = group(demand, costs, both, load);
        let g = whole_group(&s);
        let exact = milp::solve(&s, &g.items, &limits(30.0));
        prop_assume!(exact.status == MilpStatus::Optimal);
        let optimum = exact.objective;
        let tolerance = 1e-6 * optimum.abs().max(1.0);

        let relaxation = lagrange::relax(
            &s,
            &g.items,
            &g.resources,
            std::time::Instant::now() + std::time::Duration::from_secs(5),
            300,
        )
        .expect("every item has a plan without capacity");
        prop_assert!(
            relaxation.lower_bound <= optimum + tolerance,
            "Lagrangean bound {} above the optimum {}", relaxation.lower_bound, optimum
        );
        if let Some((receipts, cost)) = &relaxation.best_plan {
            let evaluation = evaluate(&s, &Plan { receipts: receipts.clone() });
            prop_assert!(evaluation.feasible, "smoothed plan overloads: {:?}", evaluation.overloads);
            common::assert_cost_eq(*cost, evaluation.total_cost(), "smoothed plan");
            prop_assert!(*cost >= optimum - tolerance);
        }

        for search in [Search::Lagrangean, Search::FixAndOptimize] {
            let found = fix_optimize::solve(&s, &g, &limits(10.0), search);
            let result = &found.result;
            prop_assert!(result.lower_bound <= optimum + tolerance, "{search:?} bound above the optimum");
            if matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible) {
                let evaluation = evaluate(&s, &Plan { receipts: result.receipts.clone() });
                prop_assert!(evaluation.feasible, "{search:?} plan overloads");
                common::assert_cost_eq(result.objective, evaluation.total_cost(), "heuristic plan");
                prop_assert!(result.objective >= optimum - tolerance, "{search:?} beat the optimum");
                prop_assert!(result.lower_bound <= result.objective + tolerance);
            }
            if search == Search::FixAndOptimize {
                // From any start the search reaches a plan within capacity
                // on groups this small.
                prop_assert!(
                    matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible),
                    "fix-and-optimize found no plan"
                );
            }
        }
    }
}

/// The command line: `--solver` picks the method, the JSON `solver` key and
/// the component say which ran, an unknown name is a usage error.
#[test]
fn the_solver_option_reaches_the_json() {
    let dir = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(6)),
        (
            "items.csv",
            "item,setup_cost,holding_cost\nA,100,1\nB,80,1\nC,60,2\n",
        ),
        (
            "demand.csv",
            "item,period,quantity\nA,1,10\nA,2,30\nA,4,20\nA,6,25\nB,1,15\nB,3,15\nB,5,30\nC,2,20\nC,3,10\nC,6,20\n",
        ),
        ("resources.csv", "resource,capacity\nM,60\n"),
        (
            "routing.csv",
            "item,resource,per_unit,setup_time\nA,M,1,3\nB,M,1,3\nC,M,1,3\n",
        ),
    ]);
    let run = |solver: &str| {
        let out = std::process::Command::new(env!("CARGO_BIN_EXE_lotwright"))
            .args(["plan", "--json", "--threads", "1", "--solver", solver])
            .arg(dir.path())
            .output()
            .expect("run lotwright");
        (
            out.status.code(),
            out.stdout,
            String::from_utf8_lossy(&out.stderr).to_string(),
        )
    };
    let (code, stdout, _) = run("milp");
    assert_eq!(code, Some(0));
    let exact: serde_json::Value = serde_json::from_slice(&stdout).unwrap();
    assert_eq!(exact["solver"], "milp");
    assert_eq!(exact["status"], "optimal");
    let optimum = exact["total_cost"].as_f64().unwrap();
    for name in ["fix-and-optimize", "lagrangean"] {
        let (code, stdout, stderr) = run(name);
        let json: serde_json::Value = serde_json::from_slice(&stdout)
            .unwrap_or_else(|e| panic!("{name}: {e}; stderr {stderr}"));
        assert_eq!(json["solver"], name);
        assert_eq!(json["components"][0]["solver"], name);
        match json["status"].as_str().unwrap() {
            "feasible" | "optimal" => {
                assert_eq!(code, Some(0));
                let cost = json["total_cost"].as_f64().unwrap();
                let bound = json["lower_bound"].as_f64().unwrap();
                assert!(
                    cost >= optimum - 1e-6,
                    "{name}: {cost} below the optimum {optimum}"
                );
                assert!(
                    bound <= optimum + 1e-6,
                    "{name}: bound {bound} above {optimum}"
                );
                assert!(json["gap"].as_f64().unwrap() >= 0.0);
            }
            other => panic!("{name}: status {other}, stderr {stderr}"),
        }
    }
    let (code, _, stderr) = run("simplex");
    assert_eq!(code, Some(2));
    assert!(stderr.contains("unknown solver `simplex`"), "{stderr}");
}

/// Found by the property above: HiGHS left 3.3e-7 units in a bucket whose
/// setup it held closed within its tolerance, the evaluation charged that
/// setup, and a plan 11 % above the bound was called optimal while the
/// smoothing heuristic found the true optimum. Now the noise joins an open
/// lot and proof is judged on the evaluated plan.
#[test]
fn solver_noise_in_a_closed_setup_neither_adds_a_setup_nor_fakes_a_proof() {
    let s = group(
        vec![
            vec![7, 3, 7, 1, 6, 4, 8, 9],
            vec![0, 5, 3, 11, 0, 3, 8, 6],
            vec![4, 10, 5, 4, 0, 5, 3, 3],
            vec![9, 2, 1, 2, 0, 4, 6, 7],
        ],
        vec![(24, 2), (31, 0), (25, 0), (10, 0)],
        vec![false, true, true, false],
        0.6272496163018096,
    );
    let g = whole_group(&s);
    let exact = milp::solve(&s, &g.items, &limits(30.0));
    assert_eq!(exact.status, MilpStatus::Optimal);
    let evaluation = evaluate(
        &s,
        &Plan {
            receipts: exact.receipts.clone(),
        },
    );
    assert!(evaluation.feasible);
    let (cost, solver) = (evaluation.total_cost(), exact.solver_objective);
    assert!(
        (cost - solver).abs() <= 1e-6 * cost,
        "evaluated {cost}, solver {solver}"
    );
    assert!(exact.lower_bound <= exact.objective + 1e-6);
    assert!(exact.objective - exact.lower_bound <= 1e-6 * exact.objective);
    let relaxation = lagrange::relax(
        &s,
        &g.items,
        &g.resources,
        std::time::Instant::now() + std::time::Duration::from_secs(5),
        300,
    )
    .unwrap();
    if let Some((_, cost)) = relaxation.best_plan {
        assert!(
            cost >= exact.objective - 1e-6,
            "smoothed {cost} below the optimum {}",
            exact.objective
        );
    }
}
