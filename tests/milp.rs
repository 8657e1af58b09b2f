//! The MILP on HiGHS against independent answers: the exact dynamic program
//! on single items, an exhaustive search on tiny shared-capacity scenarios,
//! and the one evaluation of its plans.

#![allow(clippy::needless_range_loop)]

use lotwright::capacity::milp::{self, MilpOptions, MilpStatus};
use lotwright::eval::evaluate;
use lotwright::model::{BucketKind, Calendar, Item, Plan, Resource, Routing, Scenario};
use lotwright::single::exact;
use proptest::prelude::*;

fn item(id: &str, demand: &[f64], setup: f64, holding: f64) -> Item {
    Item::simple(id, demand, setup, holding)
}

fn scenario(items: Vec<Item>, resources: Vec<Resource>, routings: Vec<Routing>) -> Scenario {
    let periods = items[0].demand.len();
    Scenario {
        name: "test".into(),
        currency: None,
        calendar: Calendar {
            start: chrono::NaiveDate::from_ymd_opt(2027, 1, 4).unwrap(),
            kind: BucketKind::Week,
            periods,
        },
        items,
        resources,
        routings,
        frozen: 0,
        bom: Vec::new(),
        period_offset: 0,
    }
}

fn resource(capacity: f64, periods: usize) -> Resource {
    Resource {
        id: "R".into(),
        unit: "capacity units".into(),
        capacity: vec![capacity; periods],
        overtime_capacity: vec![0.0; periods],
        overtime_cost: 0.0,
        capacity_cost: None,
    }
}

fn solve_all(s: &Scenario) -> milp::MilpResult {
    let items: Vec<usize> = (0..s.items.len()).collect();
    milp::solve(
        s,
        &items,
        &MilpOptions {
            threads: Some(1),
            ..MilpOptions::default()
        },
    )
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-6 * (1.0 + a.abs().max(b.abs()))
}

/// The MILP's objective is the evaluation of its plan.
fn assert_objective_is_evaluation(s: &Scenario, result: &milp::MilpResult) {
    let evaluation = evaluate(
        s,
        &Plan {
            receipts: result.receipts.clone(),
        },
    );
    assert!(
        evaluation.feasible,
        "MILP plan not feasible: {:?}",
        evaluation.violations
    );
    assert!(
        close(evaluation.total_cost(), result.solver_objective),
        "solver objective {} but evaluation {}",
        result.solver_objective,
        evaluation.total_cost()
    );
}

fn single_item() -> impl Strategy<Value = Item> {
    (2usize..8).prop_flat_map(|periods| {
        (
            prop::collection::vec(0u32..40, periods),
            prop::collection::vec(0u32..200, periods),
            prop::collection::vec(0u32..5, periods),
            prop::collection::vec(0u32..4, periods),
            0u32..30,
            0u32..15,
            0usize..2,
            prop::option::of(1u32..6),
        )
            .prop_map(
                |(demand, setup, holding, unit, initial, safety, lead, backlog)| {
                    let periods = demand.len();
                    let mut it = item(
                        "A",
                        &demand.iter().map(|&d| d as f64).collect::<Vec<_>>(),
                        0.0,
                        0.0,
                    );
                    it.setup_cost = setup.iter().map(|&s| s as f64).collect();
                    it.holding_cost = holding.iter().map(|&h| h as f64 * 0.5).collect();
                    it.unit_cost = unit.iter().map(|&u| u as f64).collect();
                    it.initial_stock = initial as f64;
                    it.safety_stock = safety as f64;
                    it.lead_time = lead.min(periods - 1);
                    it.backlog_cost = backlog.map(|b| b as f64);
                    it
                },
            )
    })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 60, ..ProptestConfig::default() })]

    /// On a single item without capacity the MILP and the exact dynamic
    /// program agree (both with and without backlog), and the MILP's
    /// objective is the evaluation of its plan.
    #[test]
    fn milp_equals_the_dynamic_program_on_single_items(it in single_item()) {
        let s = scenario(vec![it.clone()], vec![], vec![]);
        let result = solve_all(&s);
        match exact::solve(&it) {
            None => prop_assert_eq!(result.status, MilpStatus::Infeasible),
            Some(dp) => {
                prop_assert_eq!(result.status, MilpStatus::Optimal);
                prop_assert!(close(dp.cost, result.objective), "dp {} milp {}", dp.cost, result.objective);
                assert_objective_is_evaluation(&s, &result);
            }
        }
    }
}

/// The least cost of a tiny shared-capacity scenario by trying every whole
/// quantity for every item and bucket (no stock, no lead time).
fn exhaustive(s: &Scenario) -> Option<f64> {
    let periods = s.periods();
    let n = s.items.len();
    let totals: Vec<usize> = s
        .items
        .iter()
        .map(|i| i.demand.iter().sum::<f64>() as usize)
        .collect();
    let mut best: Option<f64> = None;
    let mut quantities = vec![vec![0usize; periods]; n];
    fn next(q: &mut [Vec<usize>], totals: &[usize]) -> bool {
        for (row, &total) in q.iter_mut().zip(totals) {
            for cell in row.iter_mut() {
                if *cell < total {
                    *cell += 1;
                    return true;
                }
                *cell = 0;
            }
        }
        false
    }
    loop {
        let plan = Plan {
            receipts: quantities
                .iter()
                .map(|r| r.iter().map(|&q| q as f64).collect())
                .collect(),
        };
        // An independent cost and feasibility check, not `evaluate`.
        let mut cost = 0.0;
        let mut ok = true;
        let mut load = vec![vec![0.0; periods]; s.resources.len()];
        for (i, it) in s.items.iter().enumerate() {
            let mut stock = 0.0;
            for t in 0..periods {
                let q = plan.receipts[i][t];
                if q > 0.0 {
                    cost += it.setup_cost[t] + it.unit_cost[t] * q;
                    for r in s.routings.iter().filter(|r| r.item == i) {
                        load[r.resource][t] += r.per_unit * q + r.setup_time;
                    }
                }
                stock += q - it.demand[t];
                if stock < 0.0 {
                    ok = false;
                }
                cost += it.holding_cost[t] * stock.max(0.0);
            }
        }
        for (r, res) in s.resources.iter().enumerate() {
            for t in 0..periods {
                if load[r][t] > res.capacity[t] + 1e-9 {
                    ok = false;
                }
            }
        }
        if ok && best.is_none_or(|b| cost < b) {
            best = Some(cost);
        }
        if !next(&mut quantities, &totals) {
            return best;
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 40, ..ProptestConfig::default() })]

    /// Two or three items sharing one resource with setup times: the MILP
    /// finds the least cost an exhaustive search finds, or proves there is none.
    #[test]
    fn milp_equals_exhaustive_search_with_setup_times(
        n in 2usize..4,
        demand in prop::collection::vec(0u32..3, 9),
        setups in prop::collection::vec(1u32..20, 3),
        setup_time in prop::collection::vec(0u32..3, 3),
        capacity in 2u32..8,
    ) {
        let periods = 3;
        let items: Vec<Item> = (0..n)
            .map(|i| {
                let d: Vec<f64> = demand[i * periods..(i + 1) * periods].iter().map(|&x| x as f64).collect();
                item(&format!("I{i}"), &d, setups[i] as f64, 1.0 + i as f64 * 0.5)
            })
            .collect();
        let routings = (0..n)
            .map(|i| Routing { item: i, resource: 0, per_unit: 1.0, setup_time: setup_time[i] as f64 })
            .collect();
        let s = scenario(items, vec![resource(capacity as f64, periods)], routings);
        let result = solve_all(&s);
        match exhaustive(&s) {
            None => prop_assert_eq!(result.status, MilpStatus::Infeasible),
            Some(best) => {
                prop_assert_eq!(result.status, MilpStatus::Optimal);
                prop_assert!(close(best, result.objective), "exhaustive {} milp {}", best, result.objective);
                assert_objective_is_evaluation(&s, &result);
            }
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 40, ..ProptestConfig::default() })]

    /// The exact method's staged solve (`capacity::staged`: setups with
    /// the lot counts relaxed, then the lots, then the whole MILP where
    /// needed; fix-and-optimize beside it) on items in whole units whose
    /// per-unit times make fractional lots tempting: its bound never lies
    /// above the least cost an exhaustive search over whole quantities
    /// finds, and its plan is that least cost, proven.
    #[test]
    fn staged_whole_units_equal_exhaustive_search_and_bound_it(
        n in 2usize..4,
        demand in prop::collection::vec(0u32..3, 9),
        setups in prop::collection::vec(1u32..20, 3),
        per_unit in prop::collection::vec(1u32..4, 3),
        setup_time in prop::collection::vec(0u32..3, 3),
        capacity in 3u32..12,
    ) {
        let periods = 3;
        let items: Vec<Item> = (0..n)
            .map(|i| {
                let d: Vec<f64> = demand[i * periods..(i + 1) * periods].iter().map(|&x| x as f64).collect();
                let mut it = item(&format!("I{i}"), &d, setups[i] as f64, 1.0 + i as f64 * 0.5);
                it.lot_multiple = Some(1.0);
                it
            })
            .collect();
        let routings = (0..n)
            .map(|i| Routing { item: i, resource: 0, per_unit: per_unit[i] as f64, setup_time: setup_time[i] as f64 })
            .collect();
        let s = scenario(items, vec![resource(capacity as f64, periods)], routings);
        let group = lotwright::capacity::Group { items: (0..n).collect(), resources: vec![0] };
        let result = lotwright::capacity::staged::solve(&s, &group, &MilpOptions::default());
        match exhaustive(&s) {
            None => prop_assert_eq!(result.status, MilpStatus::Infeasible),
            Some(best) => {
                prop_assert!(result.lower_bound <= best + 1e-6, "bound {} above the least cost {}", result.lower_bound, best);
                prop_assert_eq!(result.status, MilpStatus::Optimal, "least cost {}, staged {} bound {}", best, result.objective, result.lower_bound);
                prop_assert!(close(best, result.objective), "exhaustive {} staged {}", best, result.objective);
                let evaluation = evaluate(&s, &Plan { receipts: result.receipts.clone() });
                prop_assert!(evaluation.feasible);
                prop_assert!(close(evaluation.total_cost(), result.objective));
            }
        }
    }
}

/// Lot constraints are met exactly and the optimum is proven.
#[test]
fn lot_constraints_are_met_by_the_milp() {
    let mut it = item("A", &[35.0, 0.0, 42.0, 18.0, 0.0, 60.0], 100.0, 1.0);
    it.min_lot = 50.0;
    it.lot_multiple = Some(25.0);
    it.max_lot = Some(100.0);
    let s = scenario(vec![it], vec![], vec![]);
    let result = solve_all(&s);
    assert_eq!(result.status, MilpStatus::Optimal);
    for &q in result.receipts[0].iter().filter(|&&q| q > 0.0) {
        assert!(
            (50.0..=100.0).contains(&q) && (q / 25.0).fract() == 0.0,
            "lot {q}"
        );
    }
    assert_objective_is_evaluation(&s, &result);
}

/// Overtime is bought only where capacity runs out, and costed as `eval` does.
#[test]
fn overtime_is_used_and_costed() {
    let it = item("A", &[0.0, 15.0], 1000.0, 5.0);
    let mut res = resource(10.0, 2);
    res.overtime_capacity = vec![10.0; 2];
    res.overtime_cost = 2.0;
    let s = scenario(
        vec![it],
        vec![res],
        vec![Routing {
            item: 0,
            resource: 0,
            per_unit: 1.0,
            setup_time: 0.0,
        }],
    );
    let result = solve_all(&s);
    assert_eq!(result.status, MilpStatus::Optimal);
    // One setup in bucket 2 with 5 units of overtime (10 + 1000) beats two setups.
    assert_eq!(result.receipts[0], vec![0.0, 15.0]);
    assert!(close(result.objective, 1010.0));
    assert_objective_is_evaluation(&s, &result);
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 30, ..ProptestConfig::default() })]

    /// Whole quantities and costs in cents: the optimum is proven on the
    /// cost grid (a gap below one cent), and it is the exhaustive search's
    /// least cost to the cent.
    #[test]
    fn optimality_on_the_cost_grid_is_exact(
        n in 2usize..4,
        demand in prop::collection::vec(0u32..3, 9),
        setups in prop::collection::vec(100u32..2000, 3),
        holding in prop::collection::vec(1u32..150, 3),
        setup_time in prop::collection::vec(0u32..3, 3),
        capacity in 3u32..8,
    ) {
        let periods = 3;
        let items: Vec<Item> = (0..n)
            .map(|i| {
                let d: Vec<f64> = demand[i * periods..(i + 1) * periods].iter().map(|&x| x as f64).collect();
                let mut it = item(&format!("I{i}"), &d, setups[i] as f64 / 100.0, holding[i] as f64 / 100.0);
                it.lot_multiple = Some(1.0);
                it
            })
            .collect();
        let routings = (0..n)
            .map(|i| Routing { item: i, resource: 0, per_unit: 1.0, setup_time: setup_time[i] as f64 })
            .collect();
        let s = scenario(items, vec![resource(capacity as f64, periods)], routings);
        let all: Vec<usize> = (0..n).collect();
        let grid = milp::cost_grid(&s, &all).expect("whole quantities, costs in cents");
        prop_assert!(grid == 0.01 || grid == 0.1 || grid == 1.0, "grid {}", grid);
        let result = solve_all(&s);
        match exhaustive(&s) {
            None => prop_assert_eq!(result.status, MilpStatus::Infeasible),
            Some(best) => {
                prop_assert_eq!(result.status, MilpStatus::Optimal);
                prop_assert!((best - result.objective).abs() < 0.005, "exhaustive {} milp {}", best, result.objective);
                assert_objective_is_evaluation(&s, &result);
            }
        }
    }
}

/// The grid exists only when every quantity is whole and every cost lies
/// on a decimal step.
#[test]
fn the_cost_grid_needs_whole_quantities_and_decimal_costs() {
    let mut it = item("A", &[3.0, 0.0, 4.0], 12.5, 0.25);
    let one = |it: &Item| scenario(vec![it.clone()], vec![], vec![]);
    assert_eq!(
        milp::cost_grid(&one(&it), &[0]),
        None,
        "no lot multiple: quantities may be fractional"
    );
    it.lot_multiple = Some(1.0);
    assert_eq!(milp::cost_grid(&one(&it), &[0]), Some(0.01));
    it.setup_cost = vec![12.0; 3];
    it.holding_cost = vec![1.0; 3];
    assert_eq!(milp::cost_grid(&one(&it), &[0]), Some(1.0));
    it.demand[1] = 0.5;
    assert_eq!(
        milp::cost_grid(&one(&it), &[0]),
        None,
        "half a unit of demand"
    );
    it.demand[1] = 0.0;
    it.holding_cost[2] = 1.0 / 3.0;
    assert_eq!(
        milp::cost_grid(&one(&it), &[0]),
        None,
        "a third has no decimal step"
    );
}
