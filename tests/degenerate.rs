//! Degenerate scenarios and numerical extremes: every method runs, the exact
//! method's answer is feasible and no dearer than a feasible rule, and costs
//! are what the evaluation says.

mod common;

use common::{item, scenario};
use lotwright::capacity::milp::{self, MilpOptions, MilpStatus};
use lotwright::eval::evaluate;
use lotwright::model::{Item, Plan, Resource, Routing, Scenario};
use lotwright::single::exact;
use lotwright::solve::{plan_scenario, Options, Status};

fn run(s: &Scenario) -> lotwright::solve::Outcome {
    plan_scenario(s, &Options::default()).expect("the scenario plans")
}

/// The exact row is proven optimal, feasible, and no dearer than any
/// feasible rule; every row's cost is its evaluation.
fn sound(s: &Scenario) {
    let outcome = run(s);
    let exact = &outcome.comparison[0];
    assert_eq!(exact.method, "exact");
    assert_eq!(exact.status, Status::Optimal, "{:?}", exact.notes);
    assert!(exact.evaluation.feasible);
    for row in &outcome.comparison {
        let again = evaluate(s, &row.plan).total_cost();
        assert!((again - row.total_cost()).abs() <= 1e-9 * (1.0 + again.abs()));
        if row.evaluation.feasible {
            assert!(
                exact.total_cost() <= row.total_cost() + 1e-6 * (1.0 + row.total_cost().abs()),
                "{} {} beats optimal {}",
                row.method,
                row.total_cost(),
                exact.total_cost()
            );
        }
    }
}

fn with(mut it: Item, change: impl FnOnce(&mut Item)) -> Item {
    change(&mut it);
    it
}

#[test]
fn an_item_with_no_demand_orders_nothing() {
    let s = scenario(vec![item(&[0.0; 6], 100.0, 1.0)]);
    sound(&s);
    assert_eq!(run(&s).chosen.plan.order_count(), 0);
}

#[test]
fn one_bucket() {
    let s = scenario(vec![item(&[7.0], 100.0, 1.0)]);
    sound(&s);
    assert_eq!(run(&s).chosen.plan.receipts[0], vec![7.0]);
}

#[test]
fn all_demand_in_the_last_bucket_is_ordered_there() {
    let s = scenario(vec![item(&[0.0, 0.0, 0.0, 40.0], 100.0, 1.0)]);
    sound(&s);
    assert_eq!(run(&s).chosen.plan.receipts[0], vec![0.0, 0.0, 0.0, 40.0]);
}

#[test]
fn a_lead_time_longer_than_the_horizon() {
    // With stock enough nothing needs ordering: feasible and optimal.
    let covered = with(item(&[5.0, 5.0, 5.0], 100.0, 1.0), |i| {
        i.lead_time = 5;
        i.initial_stock = 20.0;
    });
    sound(&scenario(vec![covered]));
    // Without stock no order can arrive in time: infeasible, and said why.
    let short = with(item(&[5.0, 5.0, 5.0], 100.0, 1.0), |i| i.lead_time = 5);
    let outcome = run(&scenario(vec![short]));
    assert_eq!(outcome.chosen.status, Status::Infeasible);
    assert!(
        outcome
            .chosen
            .notes
            .iter()
            .any(|n| n.contains("lead time 5")),
        "{:?}",
        outcome.chosen.notes
    );
}

#[test]
fn zero_setup_cost_orders_lot_for_lot() {
    let s = scenario(vec![item(&[5.0, 0.0, 8.0, 3.0], 0.0, 1.0)]);
    sound(&s);
    assert_eq!(run(&s).chosen.total_cost(), 0.0);
}

#[test]
fn zero_holding_cost_orders_once() {
    let s = scenario(vec![item(&[5.0, 0.0, 8.0, 3.0], 50.0, 0.0)]);
    sound(&s);
    assert_eq!(run(&s).chosen.plan.order_count(), 1);
}

fn routed(it: Item, capacity: f64) -> Scenario {
    let periods = it.periods();
    let mut s = scenario(vec![it]);
    s.resources = vec![Resource {
        id: "R".into(),
        unit: "capacity units".into(),
        capacity: vec![capacity; periods],
        overtime_capacity: vec![0.0; periods],
        overtime_cost: 0.0,
        capacity_cost: None,
    }];
    s.routings = vec![Routing {
        item: 0,
        resource: 0,
        per_unit: 1.0,
        setup_time: 0.0,
    }];
    s
}

/// Quantities up to 1e9 and cost ratios across twelve orders of magnitude:
/// the MILP on HiGHS still finds the dynamic program's optimum.
#[test]
fn extremes_of_size_and_cost_ratio_agree_with_the_dynamic_program() {
    let cases = [
        (vec![1e9, 3e8, 0.0, 7e8], 1e6, 1e-4),
        (vec![1e9, 3e8, 0.0, 7e8], 1e-2, 1e3),
        (vec![0.001, 0.002, 0.0, 0.004], 1e6, 1e-6),
        (vec![12.0, 0.0, 30.0, 5.0], 1e8, 1e-4),
    ];
    for (demand, setup, holding) in cases {
        let it = item(&demand, setup, holding);
        let dp = exact::solve(&it).expect("feasible");
        let s = routed(it, 1e12);
        let result = milp::solve(&s, &[0], &MilpOptions::default());
        assert_eq!(
            result.status,
            MilpStatus::Optimal,
            "{demand:?} {setup} {holding}"
        );
        let relative = (result.objective - dp.cost).abs() / dp.cost.abs().max(1e-9);
        assert!(
            relative < 1e-6,
            "{demand:?}: milp {} dp {}",
            result.objective,
            dp.cost
        );
        let evaluation = evaluate(
            &s,
            &Plan {
                receipts: result.receipts.clone(),
            },
        );
        assert!(
            evaluation.feasible,
            "{demand:?}: {:?}",
            evaluation.shortages
        );
    }
}

/// The manager's figures on a hand-computed case: one order of 20 covers
/// two weeks of 10 at unit cost 10; stock is 10 then 0, so the average stock
/// is 5 units worth 50; the demand of the horizon is worth 200, so turns a
/// year are 200 / 50 / (2 / 52) = 104 (common practice definition); cover is
/// 5 / 10 = 0.5 weeks; all demand is met on time.
#[test]
fn manager_figures_match_a_hand_computation() {
    let mut it = item(&[10.0, 10.0], 1000.0, 0.1);
    it.unit_cost = vec![10.0, 10.0];
    let s = scenario(vec![it]);
    let outcome = run(&s);
    let e = &outcome.chosen.evaluation;
    assert_eq!(outcome.chosen.plan.receipts[0], vec![20.0, 0.0]);
    assert!((e.average_stock_value(&s) - 50.0).abs() < 1e-9);
    assert!((e.inventory_turns(&s).unwrap() - 104.0).abs() < 1e-9);
    assert!((e.buckets_of_cover().unwrap() - 0.5).abs() < 1e-9);
    assert_eq!(e.fill_rate(), 1.0);
    assert_eq!(e.overtime_used(), 0.0);
}
