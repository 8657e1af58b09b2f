//! The capacitated methods against worked examples printed in books: the
//! exact method (the program over stock levels where quantities are whole,
//! the MILP otherwise) and the MILP alone must reproduce the published plan
//! and cost, and `eval` must cost that plan the same.
//!
//! Each example names its source. Where the book prints a plan but no cost,
//! the cost is worked out by hand from the printed plan in the comment.

use lotwright::capacity::milp::{self, MilpOptions, MilpStatus};
use lotwright::eval::evaluate;
use lotwright::model::{BucketKind, Calendar, Item, Plan, Resource, Routing, Scenario};
use lotwright::solve::{solve_exact, Status};

/// One item on one resource with the given capacity and overtime per
/// bucket; every unit uses one unit of capacity and setups take no time.
fn one_item_on_one_resource(
    item: Item,
    capacity: &[f64],
    overtime: &[f64],
    overtime_cost: f64,
) -> Scenario {
    let periods = item.periods();
    Scenario {
        name: "published".into(),
        currency: None,
        calendar: Calendar {
            start: chrono::NaiveDate::from_ymd_opt(2027, 1, 4).expect("a valid date"),
            kind: BucketKind::Week,
            periods,
        },
        items: vec![item],
        resources: vec![Resource {
            id: "line".into(),
            unit: "capacity units".into(),
            capacity: capacity.to_vec(),
            overtime_capacity: overtime.to_vec(),
            overtime_cost,
            capacity_cost: None,
        }],
        routings: vec![Routing {
            item: 0,
            resource: 0,
            per_unit: 1.0,
            setup_time: 0.0,
        }],
        frozen: 0,
        bom: Vec::new(),
        period_offset: 0,
    }
}

fn close(got: f64, expected: f64) -> bool {
    (got - expected).abs() <= 1e-9 * (1.0 + expected.abs())
}

/// Asserts that the exact method and the MILP alone both prove `cost` with
/// the `receipts` given, and that `eval` agrees.
fn assert_reproduced(scenario: &Scenario, receipts: &[f64], cost: f64, exact_solver: &str) {
    let options = MilpOptions {
        threads: Some(1),
        ..MilpOptions::default()
    };
    let exact = solve_exact(scenario, &options);
    assert_eq!(exact.status, Status::Optimal, "notes: {:?}", exact.notes);
    assert_eq!(exact.solver(), exact_solver);
    assert!(exact.evaluation.feasible);
    assert!(
        close(exact.total_cost(), cost),
        "exact method: {} against the published {cost}",
        exact.total_cost()
    );
    assert_eq!(exact.plan.receipts[0], receipts, "exact method's plan");

    let result = milp::solve(scenario, &[0], &options);
    assert_eq!(result.status, MilpStatus::Optimal);
    assert!(
        close(result.objective, cost),
        "MILP: {} against the published {cost}",
        result.objective
    );
    assert!(close(result.solver_objective, cost));
    for (got, want) in result.receipts[0].iter().zip(receipts) {
        assert!(
            (got - want).abs() < 1e-6,
            "MILP plan {:?}",
            result.receipts[0]
        );
    }

    let published = evaluate(
        scenario,
        &Plan {
            receipts: vec![receipts.to_vec()],
        },
    );
    assert!(published.feasible);
    assert!(close(published.total_cost(), cost));
}

/// H. A. Taha, "Operations Research: An Introduction", Pearson, section
/// 13.4.1, Example 13.4-1 with Table 13.2 (the 10th edition, 2017, judged
/// by the dates in the copy read). Four months; regular capacity 90, 100,
/// 120, 110 and overtime capacity 50, 60, 80, 70; demand 100, 190, 210,
/// 160; a unit costs $6 on regular time and $9 on overtime; holding $0.10
/// per unit and month; no setup cost, no shortage. The book's optimum
/// makes 140, 160, 200, 160 (all regular capacity used, plus overtime
/// 50, 60, 80, 50)
/// at a total cost of $4685.
///
/// Here the $3 overtime premium is the resource's overtime cost per unit of
/// capacity, and the $6 is the item's unit cost.
#[test]
fn taha_regular_and_overtime_production_plan() {
    let mut item = Item::simple("metal", &[100.0, 190.0, 210.0, 160.0], 0.0, 0.1);
    item.unit_cost = vec![6.0; 4];
    item.lot_multiple = Some(1.0);
    let scenario = one_item_on_one_resource(
        item,
        &[90.0, 100.0, 120.0, 110.0],
        &[50.0, 60.0, 80.0, 70.0],
        3.0,
    );
    assert_reproduced(&scenario, &[140.0, 160.0, 200.0, 160.0], 4685.0, "dp");
    let evaluation = evaluate(
        &scenario,
        &Plan {
            receipts: vec![vec![140.0, 160.0, 200.0, 160.0]],
        },
    );
    let overtime: f64 = evaluation.resources[0].overtime.iter().sum();
    assert!(close(overtime, 240.0), "overtime used {overtime}");

    // Continuous quantities (the book's transportation model) reach the
    // same optimum through the MILP.
    let mut continuous = scenario.clone();
    continuous.items[0].lot_multiple = None;
    assert_reproduced(&continuous, &[140.0, 160.0, 200.0, 160.0], 4685.0, "milp");
}

/// W. L. Winston's production and inventory example: demand 1, 3, 2, 4 over
/// four months, setup $3 in a month with production, $1 a unit, holding
/// $0.50 per unit on hand at the end of a month, at most 5 units made a
/// month, at most 4 units in stock at a month's end, none at the start.
/// Optimum $20: make 1, 5, 0, 4. Source: Winston, "Introduction to
/// Probability Models: Operations Research Volume II", 4th ed., 2004,
/// ch. 6, Example 4, as two course hand-outs name it and give the $20
/// (the book itself was not read; the same example in Winston's
/// "Operations Research: Applications and Algorithms" is recalled from
/// memory with the same answer). lotwright has no stock limit; the
/// optimum holds at most 2 units, within the book's 4, so the limit does
/// not bind.
#[test]
fn winston_capacitated_production_with_setup_cost() {
    let mut item = Item::simple("part", &[1.0, 3.0, 2.0, 4.0], 3.0, 0.5);
    item.unit_cost = vec![1.0; 4];
    item.lot_multiple = Some(1.0);
    let scenario = one_item_on_one_resource(item, &[5.0; 4], &[0.0; 4], 0.0);
    assert_reproduced(&scenario, &[1.0, 5.0, 0.0, 4.0], 20.0, "dp");
}

/// The lot-sizing example with backlog of W. E. Hart, C. D. Laird,
/// J.-P. Watson, D. L. Woodruff, G. A. Hackebeil, B. L. Nicholson and
/// J. D. Siirola, "Pyomo: Optimization Modeling in Python", Springer, the
/// chapter on blocks (2nd ed. 2017; chapter and edition from memory; data
/// and printed plan read from the book's example files). Five periods,
/// demand 5, 7, 6.2, 3.1, 1.7, 5 in stock at the start, setup cost 4.6, at
/// most 5 made in a period, holding 0.7 per unit on hand and shortage 1.2
/// per unit short at the end of a period, carried forward as backlog;
/// continuous quantities. Printed plan: make 3, 5, 5, 5, 0. The book
/// prints no cost; from its plan, stock at the period ends is 3, 1, -0.2,
/// 1.7, 0, so the cost is 4 x 4.6 + 0.7 x (3 + 1 + 1.7) + 1.2 x 0.2 =
/// 18.4 + 3.99 + 0.24 = 22.63.
#[test]
fn backlog_with_capacity_from_a_modelling_book() {
    let mut item = Item::simple("mix", &[5.0, 7.0, 6.2, 3.1, 1.7], 4.6, 0.7);
    item.initial_stock = 5.0;
    item.backlog_cost = Some(1.2);
    let scenario = one_item_on_one_resource(item, &[5.0; 5], &[0.0; 5], 0.0);
    assert_reproduced(&scenario, &[3.0, 5.0, 5.0, 5.0, 0.0], 22.63, "milp");
    let evaluation = evaluate(
        &scenario,
        &Plan {
            receipts: vec![vec![3.0, 5.0, 5.0, 5.0, 0.0]],
        },
    );
    let record = &evaluation.items[0];
    let backlog: f64 = (0..5).map(|t| record.backlog(t)).sum();
    assert!(close(backlog, 0.2), "backlog carried {backlog}");
}
