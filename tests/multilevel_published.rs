//! The joint multi-level plan against published optima.
//!
//! Source: N. Dellaert and J. Jeunet, "Solving large unconstrained
//! multilevel lot-sizing problems using a hybrid genetic algorithm",
//! International Journal of Production Research 38(5), 2000, pp. 1083-1099:
//! its first set of small instances (5 items, 12 periods, no capacity, no
//! lead time, no initial stock). The data and optimal values below were
//! read from the instance files and the table of proven optima
//! (benchmarks/DJ2000/Phase1/README.md) of the public repository
//! Lemoine-OR/LotSizingDataModel.Benchmarks, which states them as proven
//! optimal by a MILP solver; its data licence is not recorded, so only the
//! few numbers of two instances are written here, not the files. The cost
//! is setup cost plus each item's own holding cost on its end-of-period
//! stock, as in lotwright.

mod common;

use lotwright::solve::{self, Status};

/// Demand of the end item, the same in both instances.
const DEMAND: [u32; 12] = [80, 100, 125, 100, 50, 50, 100, 125, 125, 100, 50, 100];

/// Plans an instance given as (item, setup cost, holding cost) rows and
/// (parent, component) lines, each quantity per 1, and returns the exact
/// plan and the exact method applied level by level.
fn plan(
    items: &[(&str, f64, f64)],
    lines: &[(&str, &str)],
) -> (solve::MethodResult, solve::MethodResult) {
    let mut items_csv = String::from("item,setup_cost,holding_cost\n");
    for (id, setup, holding) in items {
        items_csv.push_str(&format!("{id},{setup},{holding}\n"));
    }
    let mut demand_csv = String::from("item,period,quantity\n");
    for (t, q) in DEMAND.iter().enumerate() {
        demand_csv.push_str(&format!("{},{},{q}\n", items[0].0, t + 1));
    }
    let mut bom_csv = String::from("parent,component,quantity_per\n");
    for (parent, component) in lines {
        bom_csv.push_str(&format!("{parent},{component},1\n"));
    }
    let dir = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(12)),
        ("items.csv", &items_csv),
        ("demand.csv", &demand_csv),
        ("bom.csv", &bom_csv),
    ]);
    let scenario = lotwright::input::read_scenario(dir.path()).expect("the instance reads");
    let outcome = solve::plan_scenario(&scenario, &Default::default()).expect("a plan");
    let by_level = outcome
        .comparison
        .iter()
        .find(|r| r.method == lotwright::multilevel::EXACT_BY_LEVEL)
        .expect("the level-by-level row")
        .clone();
    (outcome.chosen, by_level)
}

fn assert_optimum(result: &solve::MethodResult, published: f64) {
    assert_eq!(result.status, Status::Optimal, "{:?}", result.notes);
    let cost = result.total_cost();
    assert!(
        (cost - published).abs() <= 1e-6 * published,
        "lotwright {cost} against the published optimum {published}"
    );
}

/// ph1in01: a serial bill, 1 <- 2 <- 3 <- 4 <- 5. Published optimum
/// 336.547875.
#[test]
fn a_serial_bill_reaches_the_published_optimum() {
    let items = [
        ("I1", 1.28, 0.073205),
        ("I2", 3.2, 0.06655),
        ("I3", 8.0, 0.0605),
        ("I4", 20.0, 0.055),
        ("I5", 50.0, 0.05),
    ];
    let lines = [("I1", "I2"), ("I2", "I3"), ("I3", "I4"), ("I4", "I5")];
    let (joint, by_level) = plan(&items, &lines);
    assert_optimum(&joint, 336.547875);
    assert!(by_level.total_cost() >= joint.total_cost() - 1e-9);
}

/// ph1in04: an assembly bill, 1 <- 2, 3, 4, 5. Published optimum 984.5.
#[test]
fn an_assembly_bill_reaches_the_published_optimum() {
    let items = [
        ("I1", 20.0, 0.22),
        ("I2", 50.0, 0.05),
        ("I3", 50.0, 0.05),
        ("I4", 50.0, 0.05),
        ("I5", 50.0, 0.05),
    ];
    let lines = [("I1", "I2"), ("I1", "I3"), ("I1", "I4"), ("I1", "I5")];
    let (joint, by_level) = plan(&items, &lines);
    assert_optimum(&joint, 984.5);
    assert!(by_level.total_cost() >= joint.total_cost() - 1e-9);
}
