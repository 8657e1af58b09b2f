//! A price per unit moved from the previous plan (`roll
//! --change-cost-per-unit`, `model::QuantityChange`): a roll small enough
//! to follow by hand in which the price keeps a resize from happening,
//! and the exact method on one priced window against enumeration of every
//! plan in small whole quantities. The data are invented.

mod common;

use common::{calendar, item, one_item_snapshots as snapshots};
use lotwright::eval::evaluate;
use lotwright::model::{Item, Plan, QuantityChange, Resource, Routing, Scenario};
use lotwright::roll::{roll, Quiet, RollOptions};
use lotwright::solve::{solve_exact, Status};

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-6 * (1.0 + a.abs().max(b.abs()))
}

fn one_item_scenario(periods: usize) -> Scenario {
    common::scenario(vec![item(&vec![0.0; periods], 10.0, 1.0)])
}

fn options(change_cost: f64, per_unit: f64) -> RollOptions {
    RollOptions {
        horizon: 3,
        frozen: 0,
        change_cost,
        change_cost_per_unit: per_unit,
        method: "exact".into(),
        milp: Default::default(),
        service_level: None,
        end_correction: false,
    }
}

/// Setup 10, holding 1 a unit a week, plans three weeks ahead, nothing
/// frozen.
///
/// Week 1 forecasts 0, 6, 6: one order of 12 in week 2 (10 + 6 holding
/// beats two setups, 20). Nothing is sold.
///
/// Week 2 forecasts 6, 6, 3 for weeks 2-4. Unpriced, the best plan resizes
/// week 2's order to 15 (10 + 9 + 3 holding = 22) against keeping 12 and
/// ordering 3 in week 4 (10 + 6 + 10 = 26). A change cost of 100 per order
/// added or removed changes nothing: the order stays in week 2, only its
/// size moves. At 2 per unit moved the resize costs 22 + 2 x 3 = 28, so
/// the plan keeps 12 and orders 3 in week 4, a week the previous plan does
/// not cover (26, nothing moved).
#[test]
fn a_price_per_unit_moved_keeps_an_order_from_being_resized() {
    let periods = 5;
    let base = one_item_scenario(periods);
    let history = snapshots(periods, &[&[0.0, 6.0, 6.0], &[6.0, 6.0, 3.0], &[6.0, 3.0]]);

    let plain = roll(&base, &history, &options(0.0, 0.0), &Quiet).expect("a run");
    assert!(close(plain.weeks[0].plan_cost, 16.0));
    assert!(close(plain.weeks[1].plan_cost, 22.0));
    let s = plain.weeks[1]
        .stability
        .expect("week 2 has a plan before it");
    assert_eq!((s.changed, s.unchanged, s.added, s.removed), (1, 0, 0, 0));
    assert!(close(s.quantity_moved, 3.0));

    // A price per order changed does not see a resize.
    let per_order = roll(&base, &history, &options(100.0, 0.0), &Quiet).expect("a run");
    let s = per_order.weeks[1]
        .stability
        .expect("week 2 has a plan before it");
    assert_eq!(s.changed, 1);
    assert!(close(s.quantity_moved, 3.0));

    let priced = roll(&base, &history, &options(0.0, 2.0), &Quiet).expect("a run");
    assert_eq!(priced.label, "exact+per-unit");
    assert_eq!(priced.weeks[1].status, Status::Optimal);
    assert!(close(priced.weeks[1].plan_cost, 26.0));
    let s = priced.weeks[1]
        .stability
        .expect("week 2 has a plan before it");
    assert_eq!((s.changed, s.unchanged, s.added, s.removed), (0, 1, 0, 0));
    assert!(close(s.quantity_moved, 0.0));
    // What was carried out: 12 in week 2 either way (week 1 orders
    // nothing); the realised cost holds no price of change.
    assert!(close(priced.realised.costs.change, 0.0));
}

/// Every plan of whole quantities 0..=most per item and bucket, evaluated;
/// the least feasible cost.
fn brute_force(scenario: &Scenario, most: usize) -> f64 {
    let items = scenario.items.len();
    let periods = scenario.periods();
    let cells = items * periods;
    let mut best = f64::INFINITY;
    let mut counter = vec![0usize; cells];
    loop {
        let mut plan = Plan::empty(items, periods);
        for (k, &q) in counter.iter().enumerate() {
            plan.receipts[k / periods][k % periods] = q as f64;
        }
        let evaluation = evaluate(scenario, &plan);
        if evaluation.feasible {
            best = best.min(evaluation.total_cost());
        }
        let mut k = 0;
        loop {
            if k == cells {
                return best;
            }
            counter[k] += 1;
            if counter[k] <= most {
                break;
            }
            counter[k] = 0;
            k += 1;
        }
    }
}

fn whole(mut item: Item, id: &str) -> Item {
    item.id = id.into();
    item.lot_multiple = Some(1.0);
    item
}

/// Two items on one line of 7 a week, three weeks, each with a previous
/// plan priced at 1.5 a unit moved. Item B's previous plan received 8 in
/// week 2 against a need of 4 from there on: receiving beyond the need
/// may pay, which the programs' bounds on a receipt must allow.
#[test]
fn a_priced_window_of_two_items_sharing_a_line_equals_enumeration() {
    let periods = 3;
    let mut a = whole(item(&[3.0, 2.0, 4.0], 6.0, 1.0), "A");
    a.quantity_change = Some(QuantityChange {
        per_unit: 1.5,
        previous: vec![Some(5.0), Some(0.0), Some(4.0)],
    });
    let mut b = whole(item(&[2.0, 3.0, 1.0], 5.0, 0.5), "B");
    b.quantity_change = Some(QuantityChange {
        per_unit: 1.5,
        previous: vec![Some(0.0), Some(8.0), None],
    });
    let scenario = Scenario {
        resources: vec![Resource {
            id: "LINE".into(),
            unit: "capacity units".into(),
            capacity: vec![7.0; periods],
            overtime_capacity: vec![0.0; periods],
            overtime_cost: 0.0,
            capacity_cost: None,
        }],
        routings: (0..2)
            .map(|item| Routing {
                item,
                resource: 0,
                per_unit: 1.0,
                setup_time: 0.0,
            })
            .collect(),
        calendar: calendar(periods),
        ..common::scenario(vec![a, b])
    };
    let exact = solve_exact(&scenario, &Default::default());
    assert_eq!(exact.status, Status::Optimal);
    let best = brute_force(&scenario, 8);
    assert!(
        close(exact.total_cost(), best),
        "exact {} against enumeration {best}",
        exact.total_cost()
    );
    assert!(exact.evaluation.costs.change > 0.0);
}

/// One item with a lead time of 1 and a frozen first week holding the
/// previous plan's firm order, priced at 0.8 a unit moved: the free part
/// after the freeze prices the rest (`replan`), and the exact method
/// equals enumeration.
#[test]
fn a_priced_window_with_a_freeze_and_a_lead_time_equals_enumeration() {
    let mut a = whole(item(&[0.0, 4.0, 3.0, 5.0], 7.0, 0.6), "A");
    a.lead_time = 1;
    a.initial_stock = 1.0;
    // The previous plan released 3 in week 1 (received in week 2, firm
    // now) and 9 in week 2.
    a.firm = vec![0.0, 3.0, 0.0, 0.0];
    a.quantity_change = Some(QuantityChange {
        per_unit: 0.8,
        previous: vec![Some(3.0), Some(9.0), Some(0.0), None],
    });
    let scenario = Scenario {
        frozen: 1,
        ..common::scenario(vec![a])
    };
    let exact = solve_exact(&scenario, &Default::default());
    assert_eq!(exact.status, Status::Optimal);
    let best = brute_force(&scenario, 13);
    assert!(
        close(exact.total_cost(), best),
        "exact {} against enumeration {best}",
        exact.total_cost()
    );
}
