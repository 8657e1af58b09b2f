//! Firm orders and a frozen horizon (`crate::replan`), checked three ways:
//!
//! - brute force: on tiny items every plan of whole quantities is
//!   enumerated, releases inside the freeze included, and priced by the one
//!   evaluation of the full scenario (which flags a new order inside the
//!   freeze as binding); the exact method must find the cheapest feasible
//!   plan, or say there is none;
//! - the reduction's own claim: for any plan of the free part, the full
//!   evaluation's cost is the free part's plus one constant;
//! - every method keeps the firm orders and releases nothing new inside
//!   the freeze.
//!
//! The data are invented, small and whole, so that sums are exact.

mod common;

use common::{calendar, item};
use lotwright::eval::{evaluate, ViolationKind};
use lotwright::model::{Item, Plan, Resource, Routing, Scenario};
use lotwright::replan::free_part;
use lotwright::solve::{plan_scenario, solve_exact, Options, Status};
use proptest::collection::vec;
use proptest::prelude::*;

/// One random item: demand, costs, stock, lead time, lot rules, firm orders.
#[derive(Debug, Clone)]
struct ItemCase {
    demand: Vec<f64>,
    setup: Vec<f64>,
    holding: f64,
    unit: Vec<f64>,
    initial_stock: f64,
    safety_stock: f64,
    lead_time: usize,
    min_lot: f64,
    multiple: f64,
    backlog_cost: Option<f64>,
    /// Firm order quantity by receipt bucket (0 = none).
    firm: Vec<f64>,
}

impl ItemCase {
    fn item(&self, id: &str) -> Item {
        let periods = self.demand.len();
        let mut item = item(&self.demand, self.setup[0], self.holding);
        item.id = id.into();
        item.setup_cost = self.setup.clone();
        item.unit_cost = self.unit.clone();
        item.initial_stock = self.initial_stock;
        item.safety_stock = self.safety_stock;
        item.lead_time = self.lead_time;
        item.min_lot = self.min_lot;
        item.lot_multiple = Some(self.multiple);
        item.backlog_cost = self.backlog_cost;
        // A firm order's release must fall in the horizon.
        item.firm = (0..periods)
            .map(|t| {
                if t >= self.lead_time {
                    self.firm[t]
                } else {
                    0.0
                }
            })
            .collect();
        item
    }
}

fn item_case(periods: usize, most: u32) -> impl Strategy<Value = ItemCase> {
    (
        vec(0u32..=most, periods),
        vec(prop_oneof![Just(4.0), Just(9.0), Just(15.0)], periods),
        prop_oneof![Just(1.0), Just(2.0)],
        vec(0u32..=2, periods),
        0u32..=most,
        prop_oneof![3 => Just(0.0), 1 => Just(1.0)],
        0usize..=1,
        prop_oneof![3 => Just(0.0), 1 => Just(2.0)],
        prop_oneof![3 => Just(1.0), 1 => Just(2.0)],
        prop_oneof![3 => Just(None), 1 => Just(Some(5.0))],
        vec(prop_oneof![2 => Just(0u32), 1 => 1u32..=most + 1], periods),
    )
        .prop_map(
            |(
                demand,
                setup,
                holding,
                unit,
                initial,
                safety,
                lead,
                min_lot,
                multiple,
                backlog,
                firm,
            )| {
                ItemCase {
                    demand: demand.into_iter().map(f64::from).collect(),
                    setup,
                    holding,
                    unit: unit.into_iter().map(f64::from).collect(),
                    initial_stock: f64::from(initial),
                    safety_stock: safety,
                    lead_time: lead,
                    min_lot,
                    multiple,
                    backlog_cost: backlog,
                    firm: firm.into_iter().map(f64::from).collect(),
                }
            },
        )
}

/// A scenario of the items, with one resource of the given capacity and
/// overtime when `capacity` is given (every item on it, one unit of
/// capacity a unit, setups taking `setup_time`).
fn scenario(items: Vec<Item>, frozen: usize, capacity: Option<(f64, f64, f64)>) -> Scenario {
    let periods = items[0].periods();
    let (resources, routings) = match capacity {
        None => (Vec::new(), Vec::new()),
        Some((regular, overtime, setup_time)) => (
            vec![Resource {
                id: "R".into(),
                unit: "capacity units".into(),
                capacity: vec![regular; periods],
                overtime_capacity: vec![overtime; periods],
                overtime_cost: 3.0,
                capacity_cost: None,
            }],
            (0..items.len())
                .map(|item| Routing {
                    item,
                    resource: 0,
                    per_unit: 1.0,
                    setup_time,
                })
                .collect(),
        ),
    };
    Scenario {
        name: "replanning".into(),
        currency: None,
        calendar: calendar(periods),
        items,
        resources,
        routings,
        frozen,
        bom: Vec::new(),
        period_offset: 0,
    }
}

/// The cheapest feasible plan's cost by enumeration: every item orders 0
/// to `most` units (in its multiples) in every bucket. No order of a
/// least-cost plan exceeds the item's whole need (demand and safety stock)
/// plus its minimum lot and one multiple, which is what `most` is. `None`
/// when no plan is feasible.
fn brute_force(scenario: &Scenario) -> Option<f64> {
    let periods = scenario.periods();
    let choices: Vec<Vec<f64>> = scenario
        .items
        .iter()
        .map(|item| {
            let m = item.lot_multiple.unwrap_or(1.0);
            let most = item.demand.iter().sum::<f64>() + item.safety_stock + item.min_lot + m;
            let mut q = vec![0.0];
            let mut k = 1.0;
            while k * m <= most {
                if k * m >= item.min_lot {
                    q.push(k * m);
                }
                k += 1.0;
            }
            q
        })
        .collect();
    let slots = scenario.items.len() * periods;
    let mut index = vec![0usize; slots];
    let mut best: Option<f64> = None;
    let mut plan = Plan::empty(scenario.items.len(), periods);
    loop {
        for (s, &k) in index.iter().enumerate() {
            let (i, t) = (s / periods, s % periods);
            plan.receipts[i][t] = choices[i][k];
        }
        let evaluation = evaluate(scenario, &plan);
        if evaluation.feasible {
            let cost = evaluation.total_cost();
            best = Some(best.map_or(cost, |b: f64| b.min(cost)));
        }
        // The next combination (an odometer over the slots).
        let mut s = 0;
        loop {
            if s == slots {
                return best;
            }
            let i = s / periods;
            index[s] += 1;
            if index[s] < choices[i].len() {
                break;
            }
            index[s] = 0;
            s += 1;
        }
    }
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-6 * (1.0 + a.abs().max(b.abs()))
}

/// The exact method against the brute force: the same least cost when a
/// feasible plan exists (proven optimal, its bound at that cost), and no
/// claim of a plan when none does.
fn agrees_with_brute_force(scenario: &Scenario) -> Result<(), TestCaseError> {
    let exact = solve_exact(scenario, &Default::default());
    match brute_force(scenario) {
        Some(best) => {
            prop_assert_eq!(exact.status, Status::Optimal, "notes: {:?}", exact.notes);
            prop_assert!(
                close(exact.total_cost(), best),
                "exact {} against brute force {}",
                exact.total_cost(),
                best
            );
            let bound = exact.lower_bound.expect("an optimal plan has a bound");
            prop_assert!(bound <= exact.total_cost() + 1e-6 * (1.0 + best.abs()));
            prop_assert!(close(bound, best), "bound {} against {}", bound, best);
        }
        None => {
            prop_assert!(
                !matches!(exact.status, Status::Optimal | Status::Feasible),
                "the exact method claims {:?} at {} where no plan is feasible",
                exact.status,
                exact.total_cost()
            );
            prop_assert!(
                !exact.notes.is_empty(),
                "an infeasible result explains itself"
            );
        }
    }
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 60, ..ProptestConfig::default() })]

    /// One item of four buckets, with firm orders and a freeze of 0 to 2
    /// buckets, without resources (the dynamic programs).
    #[test]
    fn one_free_item_with_firm_orders_and_a_freeze_equals_brute_force(
        case in item_case(4, 2),
        frozen in 0usize..=2,
    ) {
        let scenario = scenario(vec![case.item("A")], frozen, None);
        agrees_with_brute_force(&scenario)?;
    }

    /// The same on a resource with overtime and setup time: firm orders take
    /// their share of capacity first (the program over stock levels or the
    /// MILP).
    #[test]
    fn one_item_on_a_resource_with_firm_orders_and_a_freeze_equals_brute_force(
        case in item_case(4, 2),
        frozen in 0usize..=2,
        regular in 1u32..=4,
        overtime in 0u32..=2,
        setup_time in 0u32..=1,
    ) {
        let capacity = (f64::from(regular), f64::from(overtime), f64::from(setup_time));
        let scenario = scenario(vec![case.item("A")], frozen, Some(capacity));
        agrees_with_brute_force(&scenario)?;
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 16, ..ProptestConfig::default() })]

    /// Two items of three buckets sharing one resource (the MILP), in
    /// single units without a minimum lot so that the enumeration stays
    /// small.
    #[test]
    fn two_items_sharing_a_resource_with_firm_orders_and_a_freeze_equal_brute_force(
        a in item_case(3, 1),
        b in item_case(3, 1),
        frozen in 0usize..=1,
        regular in 1u32..=3,
        overtime in 0u32..=1,
    ) {
        let capacity = (f64::from(regular), f64::from(overtime), 0.0);
        let plain = |case: ItemCase, id| {
            let mut item = case.item(id);
            item.min_lot = 0.0;
            item.lot_multiple = Some(1.0);
            item
        };
        let scenario = scenario(vec![plain(a, "A"), plain(b, "B")], frozen, Some(capacity));
        agrees_with_brute_force(&scenario)?;
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 120, ..ProptestConfig::default() })]

    /// The reduction is exact: whatever the free part's plan (of releases
    /// inside the free part), the full evaluation costs the free part's cost plus one constant, and is
    /// feasible when the free plan is and nothing is short in the freeze.
    #[test]
    fn the_full_cost_is_the_free_cost_plus_a_constant(
        a in item_case(6, 6),
        b in item_case(6, 6),
        frozen in 0usize..=3,
        regular in 3u32..=12,
        overtime in 0u32..=4,
        plans in vec(vec(vec(prop_oneof![2 => Just(0u32), 1 => 1u32..=12], 6), 2), 2..=5),
    ) {
        let scenario = scenario(
            vec![a.item("A"), b.item("B")],
            frozen,
            Some((f64::from(regular), f64::from(overtime), 1.0)),
        );
        let free = free_part(&scenario);
        let periods = free.scenario.periods();
        let mut shifts = Vec::new();
        for rows in plans {
            // Receipts before an item's lead time are released before the
            // free part starts, a plan no method makes; they are left out.
            let plan = Plan {
                receipts: rows
                    .iter()
                    .zip(&free.scenario.items)
                    .map(|(row, item)| {
                        (0..periods)
                            .map(|t| if t < item.lead_time { 0.0 } else { f64::from(row[t]) })
                            .collect()
                    })
                    .collect(),
            };
            let part = evaluate(&free.scenario, &plan);
            let full = evaluate(&scenario, &free.lift(&plan));
            shifts.push(full.total_cost() - part.total_cost());
            if part.feasible && free.shortfalls.is_empty() && free.overloads.is_empty() {
                prop_assert!(full.feasible, "full: {:?}", full.violations);
            }
            if full.feasible {
                prop_assert!(part.feasible);
            }
        }
        for shift in &shifts {
            prop_assert!(close(*shift, shifts[0]), "shifts {:?}", shifts);
        }
    }

    /// Every method keeps the firm orders, releases no new order inside the
    /// freeze, and its cost is the one evaluation of its plan; the exact
    /// plan is never dearer than a feasible rule's.
    #[test]
    fn every_method_keeps_firm_orders_and_the_freeze(
        a in item_case(8, 6),
        b in item_case(8, 6),
        frozen in 0usize..=3,
    ) {
        let scenario = scenario(vec![a.item("A"), b.item("B")], frozen, None);
        let outcome = plan_scenario(&scenario, &Options::default()).expect("a plan");
        let exact = &outcome.comparison[0];
        for result in &outcome.comparison {
            let evaluation = evaluate(&scenario, &result.plan);
            prop_assert!(close(evaluation.total_cost(), result.total_cost()));
            for (item, record) in scenario.items.iter().zip(&result.evaluation.items) {
                prop_assert_eq!(&record.firm_receipts, &item.firm);
                for t in 0..frozen {
                    prop_assert_eq!(record.planned_releases[t], 0.0, "{} releases in {}", result.method, t + 1);
                }
            }
            prop_assert!(!result
                .evaluation
                .violations
                .iter()
                .any(|v| v.kind == ViolationKind::InsideFrozenHorizon));
            if result.evaluation.feasible && exact.status == Status::Optimal {
                prop_assert!(exact.total_cost() <= result.total_cost() + 1e-6 * (1.0 + result.total_cost().abs()));
            }
        }
    }
}

/// A hand-computed case. One item, weekly demand 10 in each of 4 weeks, no
/// stock, setup 50, holding 1 a unit a week, lead time 0. Unfrozen, the
/// least cost orders 40 in week 1: 50 + 30 + 20 + 10 = 110 (against two
/// orders of 20: 100 + 10 + 10 = 120). With a firm order of 20 received in
/// week 1 and weeks 1 and 2 frozen, the weeks 3 and 4 need 20 more: one
/// order of 20 in week 3 (50 + holding 10 in week 3) beats none. The firm
/// order costs its setup 50 and holding 10 in week 1, so the total is
/// 50 + 10 + 50 + 10 = 120.
#[test]
fn a_firm_order_and_a_freeze_by_hand() {
    let mut item = item(&[10.0, 10.0, 10.0, 10.0], 50.0, 1.0);
    let free = scenario(vec![item.clone()], 0, None);
    assert!(close(
        solve_exact(&free, &Default::default()).total_cost(),
        110.0
    ));
    item.firm = vec![20.0, 0.0, 0.0, 0.0];
    let frozen = scenario(vec![item], 2, None);
    let exact = solve_exact(&frozen, &Default::default());
    assert_eq!(exact.status, Status::Optimal);
    assert!(close(exact.total_cost(), 120.0), "{}", exact.total_cost());
    assert_eq!(exact.plan.receipts[0], vec![0.0, 0.0, 20.0, 0.0]);
    assert_eq!(exact.evaluation.setups, 2);
    assert!(close(exact.lower_bound.expect("a bound"), 120.0));
}

/// A freeze that leaves an item short is infeasible, and the note names
/// the item, the first short period and the units.
#[test]
fn a_shortage_inside_the_freeze_is_explained() {
    let mut item = item(&[10.0, 10.0, 10.0, 10.0], 50.0, 1.0);
    item.initial_stock = 15.0;
    let scenario = scenario(vec![item], 2, None);
    let exact = solve_exact(&scenario, &Default::default());
    assert_eq!(exact.status, Status::Infeasible);
    let note = exact.notes.join(" ");
    assert!(
        note.contains("item A: short from period 2 (up to 5 units), inside the frozen horizon"),
        "{note}"
    );
    assert!(note.contains("period 3"), "{note}");
    // The plan catches up with the first order that can arrive: 5 owed plus
    // the 20 of weeks 3 and 4.
    assert_eq!(exact.plan.receipts[0], vec![0.0, 0.0, 25.0, 0.0]);
}
