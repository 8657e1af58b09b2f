//! Many items planned one by one, each with a minimum lot and a fractional
//! forecast (so that neither dynamic program applies and each needs the
//! MILP), under a time limit far too short for all of them: every item
//! gets a share of the time, and every result stays honest. An item
//! HiGHS cannot finish is feasible with a bound (its own, or its least
//! cost without its lot rules), never called optimal unproven, and the
//! plan meets every lot rule. Invented data.

mod common;

use lotwright::eval::evaluate;
use lotwright::solve::{self, Status};

#[test]
fn a_short_time_limit_is_shared_and_every_result_is_honest() {
    let mut items = "item,setup_cost,holding_cost,min_lot\n".to_string();
    let mut demand = "item,period,quantity\n".to_string();
    for i in 0..40 {
        let setup = 80.0 + (i * 37 % 320) as f64;
        let holding = 0.2 + (i * 13 % 80) as f64 / 100.0;
        items.push_str(&format!("T{i:02},{setup},{holding:.2},150\n"));
        for t in 1..=52 {
            let q = 60.0 + ((i * 7 + t * 13) % 41) as f64 + 0.01 * ((i * 31 + t * 17) % 100) as f64;
            demand.push_str(&format!("T{i:02},{t},{q:.2}\n"));
        }
    }
    let dir = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(52)),
        ("items.csv", &items),
        ("demand.csv", &demand),
    ]);
    let scenario = lotwright::input::read_scenario(dir.path()).unwrap();
    let options = solve::Options {
        method: Some("exact".into()),
        milp: lotwright::capacity::milp::MilpOptions {
            time_limit: 1.0,
            ..Default::default()
        },
    };
    let outcome = solve::plan_scenario(&scenario, &options).unwrap();
    let result = &outcome.chosen;
    assert!(
        matches!(result.status, Status::Optimal | Status::Feasible),
        "{:?} {:?}",
        result.status,
        result.notes
    );
    let evaluation = evaluate(&scenario, &result.plan);
    assert!(evaluation.feasible, "{:?}", evaluation.violations);
    let bound = result.lower_bound.expect("a bound");
    assert!(bound <= result.total_cost() + 1e-6);
    // The bound is no weaker than the least cost without lot rules, which
    // the exact program on the items without their minimum lots gives.
    let mut relaxed = scenario.clone();
    for item in &mut relaxed.items {
        item.min_lot = 0.0;
        item.lot_multiple = None;
    }
    let free = solve::plan_scenario(&relaxed, &Default::default()).unwrap();
    assert_eq!(free.chosen.status, Status::Optimal);
    assert!(
        bound >= free.chosen.total_cost() - 1e-6 * bound.abs(),
        "bound {bound} below the relaxation's {}",
        free.chosen.total_cost()
    );
    for component in &result.components {
        if component.status == Status::Optimal {
            assert_ne!(component.solver, "rule", "{component:?}");
        }
    }
}
