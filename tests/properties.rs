//! Property tests on small random items: the exact dynamic program against
//! brute force written out here (its own cost simulation, independent of the
//! library), the DP's own cost against the one evaluation, the DP against
//! every lot rule, and the lot constraints on every rule's plan.
//!
//! Data are mostly whole numbers or halves so that sums are exact in
//! floating point (one property moves them off that grid); case counts are
//! kept modest so the suite stays fast.

mod common;

use common::{item, scenario, single_plan};
use lotwright::eval::{evaluate, ViolationKind};
use lotwright::model::Item;
use lotwright::single::exact;
use lotwright::single::rules::{self, Rule, Sizing};
use lotwright::solve::{plan_scenario, Options, Status};
use proptest::collection::vec;
use proptest::prelude::*;

/// A random single item without lot constraints.
#[derive(Debug, Clone)]
struct Case {
    demand: Vec<f64>,
    setup: Vec<f64>,
    holding: Vec<f64>,
    unit: Vec<f64>,
    receipts: Vec<f64>,
    initial_stock: f64,
    safety_stock: f64,
    lead_time: usize,
    ending_stock: f64,
    backlog_cost: Option<f64>,
    fixed_lot: Option<f64>,
}

impl Case {
    fn item(&self) -> Item {
        let mut item = item(&self.demand, 0.0, 0.0);
        item.setup_cost = self.setup.clone();
        item.holding_cost = self.holding.clone();
        item.unit_cost = self.unit.clone();
        item.nominal_setup_cost = self.setup[0];
        item.nominal_holding_cost = self.holding[0];
        item.receipts = self.receipts.clone();
        item.initial_stock = self.initial_stock;
        item.safety_stock = self.safety_stock;
        item.lead_time = self.lead_time;
        item.ending_stock = self.ending_stock;
        item.backlog_cost = self.backlog_cost;
        item.fixed_lot = self.fixed_lot;
        item
    }

    fn periods(&self) -> usize {
        self.demand.len()
    }
}

/// Mostly zero, sometimes up to `max` (whole units).
fn lumpy(max: u32) -> impl Strategy<Value = f64> {
    prop_oneof![2 => Just(0.0), 3 => (0..=max).prop_map(f64::from)]
}

/// Halves from 0 to `max`.
fn halves(max: u32) -> impl Strategy<Value = f64> {
    (0..=2 * max).prop_map(|h| f64::from(h) / 2.0)
}

/// Items without backlog: horizons 1..=10, demand with zeros, time-varying
/// costs, stock, receipts, safety stock, lead time 0..=2, ending stock.
fn no_backlog_case() -> impl Strategy<Value = Case> {
    (1usize..=10).prop_flat_map(|t| {
        (
            vec(lumpy(20), t),
            vec(0u32..=100, t),
            vec(halves(4), t),
            vec(halves(3), t),
            vec(
                prop_oneof![4 => Just(0.0), 1 => (1u32..=20).prop_map(f64::from)],
                t,
            ),
            prop_oneof![Just(0.0), (0u32..=30).prop_map(f64::from)],
            prop_oneof![Just(0.0), (0u32..=10).prop_map(f64::from)],
            0usize..=2,
            prop_oneof![Just(0.0), (0u32..=10).prop_map(f64::from)],
        )
            .prop_map(
                |(demand, setup, holding, unit, receipts, initial, safety, lead, ending)| Case {
                    demand,
                    setup: setup.into_iter().map(f64::from).collect(),
                    holding,
                    unit,
                    receipts,
                    initial_stock: initial,
                    safety_stock: safety,
                    lead_time: lead,
                    ending_stock: ending,
                    backlog_cost: None,
                    fixed_lot: None,
                },
            )
    })
}

/// The same items with quantities off the whole-unit grid (thirds and
/// tenths), where rounding noise must not change the answer.
fn fractional_case() -> impl Strategy<Value = Case> {
    no_backlog_case().prop_map(|mut case| {
        for d in case.demand.iter_mut().filter(|d| **d > 0.0) {
            *d = *d * 0.1 + 1.0 / 3.0;
        }
        for r in case.receipts.iter_mut() {
            *r *= 0.7;
        }
        case.initial_stock *= 1.1;
        case.safety_stock *= 0.3;
        case
    })
}

/// Items with backlog: horizons 1..=5, demand 0..=4, small stock and
/// receipts, lead time 0..=2, ending stock 0..=2.
fn backlog_case() -> impl Strategy<Value = Case> {
    (1usize..=5).prop_flat_map(|t| {
        (
            vec((0u32..=4).prop_map(f64::from), t),
            vec((0u32..=12).prop_map(f64::from), t),
            vec(halves(2), t),
            vec(halves(1), t),
            vec(
                prop_oneof![3 => Just(0.0), 1 => (1u32..=3).prop_map(f64::from)],
                t,
            ),
            (0u32..=3).prop_map(f64::from),
            (0u32..=2).prop_map(f64::from),
            0usize..=2,
            (0u32..=2).prop_map(f64::from),
            halves(4),
        )
            .prop_map(
                |(
                    demand,
                    setup,
                    holding,
                    unit,
                    receipts,
                    initial,
                    safety,
                    lead,
                    ending,
                    backlog,
                )| {
                    Case {
                        demand,
                        setup,
                        holding,
                        unit,
                        receipts,
                        initial_stock: initial,
                        safety_stock: safety,
                        lead_time: lead,
                        ending_stock: ending,
                        backlog_cost: Some(backlog),
                        fixed_lot: None,
                    }
                },
            )
    })
}

/// Either kind, sometimes with a fixed lot for the fixed-lot rule.
fn any_case() -> impl Strategy<Value = Case> {
    (
        prop_oneof![3 => no_backlog_case(), 1 => backlog_case()],
        prop_oneof![Just(None), (1u32..=40).prop_map(|q| Some(f64::from(q)))],
    )
        .prop_map(|(mut case, fixed_lot)| {
            case.fixed_lot = fixed_lot;
            case
        })
}

/// The stock floor at the end of bucket `t` of an item without backlog, as
/// PRODUCT.md states it: safety stock (and, in the last bucket, the ending
/// stock if higher); before the lead time has passed no order can arrive,
/// so only a non-negative stock is asked for there.
fn floor(case: &Case, t: usize) -> f64 {
    if t < case.lead_time {
        0.0
    } else if t + 1 == case.periods() {
        case.safety_stock.max(case.ending_stock)
    } else {
        case.safety_stock
    }
}

/// Cost of receipts `x` by simulation: setup and unit cost in the release
/// bucket, holding on positive end-of-bucket stock, backlog on negative
/// end-of-bucket stock. `None` when the plan is not allowed: a receipt
/// before the lead time has passed, or stock below `floor_at`.
// Buckets index several per-bucket vectors at once; a range loop reads best.
#[allow(clippy::needless_range_loop)]
fn simulate(case: &Case, x: &[f64], floor_at: impl Fn(usize) -> f64) -> Option<f64> {
    let mut stock = case.initial_stock;
    let mut cost = 0.0;
    for t in 0..case.periods() {
        if x[t] > 0.0 {
            let release = t.checked_sub(case.lead_time)?;
            cost += case.setup[release] + case.unit[release] * x[t];
        }
        stock += case.receipts[t] + x[t] - case.demand[t];
        if stock < floor_at(t) - 1e-9 {
            return None;
        }
        // Without backlog, stock within rounding noise below zero holds
        // nothing and costs nothing (the floor check above refused more).
        cost += match case.backlog_cost {
            Some(backlog) if stock < 0.0 => backlog * -stock,
            _ => case.holding[t] * stock.max(0.0),
        };
    }
    Some(cost)
}

/// Brute force without backlog: every subset of order buckets (from the
/// lead time on), each order the least quantity that keeps stock above its
/// floor until the next order. Returns the cheapest cost and its receipts.
#[allow(clippy::needless_range_loop)]
fn brute_force_subsets(case: &Case) -> Option<(f64, Vec<f64>)> {
    let periods = case.periods();
    let lead = case.lead_time;
    if lead >= periods {
        let x = vec![0.0; periods];
        return simulate(case, &x, |t| floor(case, t)).map(|c| (c, x));
    }
    let free = periods - lead;
    let mut best: Option<(f64, Vec<f64>)> = None;
    for mask in 0u32..(1 << free) {
        let orders: Vec<usize> = (0..free)
            .filter(|k| mask >> k & 1 == 1)
            .map(|k| k + lead)
            .collect();
        let mut x = vec![0.0; periods];
        let mut stock = case.initial_stock;
        for t in 0..periods {
            if let Some(k) = orders.iter().position(|&o| o == t) {
                let next = orders.get(k + 1).copied().unwrap_or(periods);
                // The least order that keeps buckets t..next above the floor.
                let (mut running, mut need) = (stock, 0.0f64);
                for u in t..next {
                    running += case.receipts[u] - case.demand[u];
                    need = need.max(floor(case, u) - running);
                }
                x[t] = need;
            }
            stock += case.receipts[t] + x[t] - case.demand[t];
        }
        if let Some(cost) = simulate(case, &x, |t| floor(case, t)) {
            if best.as_ref().is_none_or(|(b, _)| cost < *b) {
                best = Some((cost, x));
            }
        }
    }
    best
}

/// Exhaustive search with backlog: every whole order quantity in every
/// bucket from the lead time on, with total orders up to the total demand
/// plus the ending stock. Stock may go negative (backlog) except at the end,
/// where it must reach the ending stock (or zero if no order can arrive).
fn exhaustive_backlog(case: &Case) -> Option<f64> {
    let periods = case.periods();
    let end_floor = if periods > case.lead_time {
        case.ending_stock
    } else {
        0.0
    };
    let most = case.demand.iter().sum::<f64>() + case.ending_stock;
    let mut best: Option<f64> = None;
    let mut x = vec![0.0; periods];
    fn search(
        case: &Case,
        t: usize,
        left: f64,
        x: &mut Vec<f64>,
        end_floor: f64,
        best: &mut Option<f64>,
    ) {
        if t == case.periods() {
            let last = case.periods() - 1;
            let floor_at = |u: usize| {
                if u == last {
                    end_floor
                } else {
                    f64::NEG_INFINITY
                }
            };
            if let Some(cost) = simulate(case, x, floor_at) {
                if best.is_none_or(|b| cost < b) {
                    *best = Some(cost);
                }
            }
            return;
        }
        let top = if t < case.lead_time { 0.0 } else { left };
        let mut q = 0.0;
        while q <= top {
            x[t] = q;
            search(case, t + 1, left - q, x, end_floor, best);
            q += 1.0;
        }
        x[t] = 0.0;
    }
    search(case, 0, most, &mut x, end_floor, &mut best);
    best
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-7 * (1.0 + a.abs().max(b.abs()))
}

fn lot_violations(item: &Item, receipts: &[f64]) -> Vec<ViolationKind> {
    evaluate(&scenario(vec![item.clone()]), &single_plan(receipts))
        .violations
        .iter()
        .map(|v| v.kind)
        .filter(|k| {
            matches!(
                k,
                ViolationKind::BelowMinLot
                    | ViolationKind::NotLotMultiple
                    | ViolationKind::AboveMaxLot
                    | ViolationKind::ReleaseBeforeStart
            )
        })
        .collect()
}

/// Lot constraints as items.csv allows them: max_lot at least min_lot and
/// lot_multiple, and some multiple of lot_multiple between min_lot and
/// max_lot.
fn lot_constraints() -> impl Strategy<Value = (f64, Option<f64>, Option<f64>)> {
    (
        prop_oneof![Just(0u32), 1u32..=30],
        prop_oneof![Just(None), (1u32..=15).prop_map(Some)],
        prop_oneof![Just(None), (1u32..=60).prop_map(Some)],
    )
        .prop_filter_map(
            "lot constraints items.csv would refuse",
            |(min, mult, max)| {
                let min = f64::from(min);
                let mult = mult.map(f64::from);
                let max = max.map(f64::from);
                if let Some(max) = max {
                    if max < min || mult.is_some_and(|m| max < m) {
                        return None;
                    }
                    if let Some(m) = mult {
                        if (min / m).ceil().max(1.0) * m > max {
                            return None;
                        }
                    }
                }
                if min == 0.0 && mult.is_none() && max.is_none() {
                    return None;
                }
                Some((min, mult, max))
            },
        )
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    /// (a) Without backlog, the DP's cost is the least over every set of
    /// order buckets, and the DP finds no plan exactly when no set of order
    /// buckets gives a feasible plan; the evaluation agrees with the brute
    /// force's own cost of its best plan and with the DP's cost.
    #[test]
    fn dp_equals_brute_force_over_order_buckets(case in no_backlog_case()) {
        let item = case.item();
        let dp = exact::solve(&item);
        let brute = brute_force_subsets(&case);
        match (&dp, &brute) {
            (None, None) => {}
            (Some(dp), Some((cost, receipts))) => {
                prop_assert!(close(dp.cost, *cost), "DP {} vs brute force {} ({:?} vs {:?})", dp.cost, cost, dp.receipts, receipts);
                let scenario = scenario(vec![item.clone()]);
                let brute_eval = evaluate(&scenario, &single_plan(receipts));
                prop_assert!(brute_eval.feasible, "brute-force plan {:?} evaluates infeasible: {:?}", receipts, brute_eval.violations);
                prop_assert!(close(brute_eval.total_cost(), *cost), "evaluation {} vs own simulation {}", brute_eval.total_cost(), cost);
                let dp_eval = evaluate(&scenario, &single_plan(&dp.receipts));
                prop_assert!(dp_eval.feasible, "DP plan {:?} evaluates infeasible: {:?}", dp.receipts, dp_eval.violations);
                prop_assert!(close(dp_eval.total_cost(), dp.cost));
            }
            (dp, brute) => prop_assert!(false, "DP {:?} but brute force {:?}", dp, brute),
        }
    }

    /// (a) again, off the whole-unit grid.
    #[test]
    fn dp_equals_brute_force_with_fractional_quantities(case in fractional_case()) {
        let dp = exact::solve(&case.item());
        let brute = brute_force_subsets(&case);
        match (&dp, &brute) {
            (None, None) => {}
            (Some(dp), Some((cost, receipts))) => prop_assert!(close(dp.cost, *cost), "DP {} {:?} vs brute force {} {:?}", dp.cost, dp.receipts, cost, receipts),
            (dp, brute) => prop_assert!(false, "DP {:?} but brute force {:?}", dp, brute),
        }
    }

    /// (b) With backlog, the DP's cost is the least over every whole order
    /// quantity in every bucket.
    #[test]
    fn dp_with_backlog_equals_exhaustive_search(case in backlog_case()) {
        let dp = exact::solve(&case.item());
        let best = exhaustive_backlog(&case);
        match (&dp, best) {
            (None, None) => {}
            (Some(dp), Some(cost)) => prop_assert!(close(dp.cost, cost), "DP {} {:?} vs exhaustive {}", dp.cost, dp.receipts, cost),
            (dp, best) => prop_assert!(false, "DP {:?} but exhaustive search {:?}", dp, best),
        }
    }

    /// (c) The DP's own reported cost equals the evaluation of its plan,
    /// with or without backlog.
    #[test]
    fn dp_cost_equals_evaluation_of_its_plan(case in any_case()) {
        let item = case.item();
        if let Some(dp) = exact::solve(&item) {
            let evaluation = evaluate(&scenario(vec![item]), &single_plan(&dp.receipts));
            prop_assert!(close(evaluation.total_cost(), dp.cost), "evaluation {} vs DP {}", evaluation.total_cost(), dp.cost);
        }
    }

    /// (c) The DP's plan, with or without backlog, is feasible in the one
    /// evaluation (backlog is allowed where backlog_cost is given).
    #[test]
    fn dp_plan_is_feasible_in_the_evaluation(case in any_case()) {
        let item = case.item();
        if let Some(dp) = exact::solve(&item) {
            let evaluation = evaluate(&scenario(vec![item]), &single_plan(&dp.receipts));
            prop_assert!(evaluation.feasible, "DP plan {:?} evaluates infeasible: violations {:?}, shortages {:?}", dp.receipts, evaluation.violations, evaluation.shortages);
        }
    }

    /// (d) Without lot constraints, the DP is never costlier than a rule's
    /// plan that is feasible.
    #[test]
    fn dp_is_never_costlier_than_a_feasible_rule(case in any_case()) {
        let item = case.item();
        let scenario = scenario(vec![item.clone()]);
        let dp = exact::solve(&item);
        for rule in Rule::ALL {
            let receipts = rules::plan(&item, Sizing::Rule(rule));
            let evaluation = evaluate(&scenario, &single_plan(&receipts));
            if evaluation.feasible {
                let Some(dp) = &dp else {
                    return Err(TestCaseError::fail(format!(
                        "{} found a feasible plan {:?} but the DP found none", rule.name(), receipts
                    )));
                };
                prop_assert!(
                    dp.cost <= evaluation.total_cost() + 1e-7 * (1.0 + dp.cost.abs()),
                    "DP {} above {} {} ({:?})", dp.cost, rule.name(), evaluation.total_cost(), receipts
                );
            }
        }
    }

    /// Planning a scenario evaluates every method on rows made once and
    /// shared (demand, receipts, a plan's releases without lead time): the
    /// figures equal those of a fresh evaluation of each plan, and the
    /// demand row is one storage for every method.
    #[test]
    fn shared_evaluations_equal_fresh_ones(case in any_case()) {
        let mut other = case.item();
        other.id = "B".into();
        other.lead_time = 0;
        let scenario = scenario(vec![case.item(), other]);
        let outcome = plan_scenario(&scenario, &Options::default()).unwrap();
        let first = &outcome.comparison[0].evaluation;
        for result in &outcome.comparison {
            prop_assert_eq!(&result.evaluation, &evaluate(&scenario, &result.plan), "{}", result.method);
            for (record, shared) in result.evaluation.items.iter().zip(&first.items) {
                prop_assert!(record.gross_requirement.shares(&shared.gross_requirement));
            }
            let b = &result.evaluation.items[1];
            let plain = result.plan.receipts[1].iter().all(|&q| q > 0.0 || q.to_bits() == 0);
            prop_assert_eq!(b.planned_releases.shares(&b.planned_receipts), plain);
        }
    }

    /// (e) Every rule's plan meets min_lot, lot_multiple and max_lot when
    /// they are set, and never releases before bucket 1.
    #[test]
    fn every_rule_meets_the_lot_constraints(
        case in any_case(),
        (min_lot, lot_multiple, max_lot) in lot_constraints(),
    ) {
        let mut item = case.item();
        item.min_lot = min_lot;
        item.lot_multiple = lot_multiple;
        item.max_lot = max_lot;
        for rule in Rule::ALL {
            let receipts = rules::plan(&item, Sizing::Rule(rule));
            let faults = lot_violations(&item, &receipts);
            prop_assert!(faults.is_empty(), "{} plan {:?} breaks {:?}", rule.name(), receipts, faults);
        }
    }
}

proptest! {
    // Fewer cases: items with lot constraints may go to the MILP.
    #![proptest_config(ProptestConfig::with_cases(100))]

    /// The exact method of the comparison, with lot constraints: whenever a
    /// rule has a feasible plan, the exact row has one too, meets the lot
    /// constraints, is never costlier than any feasible rule, and its lower
    /// bound does not pass its cost.
    #[test]
    fn exact_method_with_lot_constraints_beats_every_feasible_rule(
        case in any_case(),
        (min_lot, lot_multiple, max_lot) in lot_constraints(),
    ) {
        let mut item = case.item();
        item.min_lot = min_lot;
        item.lot_multiple = lot_multiple;
        item.max_lot = max_lot;
        let scenario = scenario(vec![item.clone()]);
        let outcome = plan_scenario(&scenario, &Options::default()).expect("the plan runs");
        let exact = &outcome.comparison[0];
        prop_assert_eq!(exact.method, "exact");
        let rules: Vec<_> = outcome.comparison[1..].iter().filter(|r| r.evaluation.feasible).collect();
        if !rules.is_empty() {
            prop_assert!(exact.evaluation.feasible, "a rule is feasible but the exact plan {:?} is not: {:?}", exact.plan.receipts, exact.evaluation.violations);
            prop_assert!(matches!(exact.status, Status::Optimal | Status::Feasible));
        }
        if exact.evaluation.feasible {
            let faults = lot_violations(&item, &exact.plan.receipts[0]);
            prop_assert!(faults.is_empty(), "exact plan {:?} breaks {:?}", exact.plan.receipts[0], faults);
            for rule in &rules {
                prop_assert!(
                    exact.total_cost() <= rule.total_cost() + 1e-7 * (1.0 + rule.total_cost().abs()),
                    "exact {} above {} {}", exact.total_cost(), rule.method, rule.total_cost()
                );
            }
            if let Some(bound) = exact.lower_bound {
                prop_assert!(bound <= exact.total_cost() + 1e-7 * (1.0 + bound.abs()));
            }
        }
        for rule in &outcome.comparison[1..] {
            let expected = if rule.evaluation.feasible { Status::Feasible } else { Status::Infeasible };
            prop_assert_eq!(rule.status, expected, "{}", rule.method);
        }
    }
}

/// The brute force itself on a hand-computed case, so that the properties
/// above compare with something known to be right: demand 10, 10, setup
/// 5, holding 1: two orders (10) beat one (5 + 10 = 15).
#[test]
fn brute_force_agrees_with_a_hand_computed_case() {
    let case = Case {
        demand: vec![10.0, 10.0],
        setup: vec![5.0, 5.0],
        holding: vec![1.0, 1.0],
        unit: vec![0.0, 0.0],
        receipts: vec![0.0, 0.0],
        initial_stock: 0.0,
        safety_stock: 0.0,
        lead_time: 0,
        ending_stock: 0.0,
        backlog_cost: None,
        fixed_lot: None,
    };
    let (cost, receipts) = brute_force_subsets(&case).expect("feasible");
    assert_eq!(cost, 10.0);
    assert_eq!(receipts, vec![10.0, 10.0]);
    // With backlog at 0.5 a bucket, one order in bucket 2 costs 5 + 5 = 10
    // as well; at 0.25 it costs 7.5 and wins.
    let backlog = Case {
        backlog_cost: Some(0.25),
        ..case
    };
    assert_eq!(exhaustive_backlog(&backlog), Some(7.5));
}

/// Whether every quantity of a plan is a whole number.
fn whole(receipts: &[f64]) -> bool {
    receipts.iter().all(|q| q.fract() == 0.0)
}

proptest! {
    // Fractional demand on a whole item sends the exact method to the
    // program over stock levels or the MILP: fewer cases.
    #![proptest_config(ProptestConfig::with_cases(60))]

    /// Whole units, the default (`lot_multiple` 1): with demand, stock
    /// and receipts off the whole-unit grid, every rule's plan and the
    /// exact plan are whole, the exact plan is feasible whenever a rule's
    /// is, and it is never costlier than a feasible rule.
    #[test]
    fn every_plan_is_whole_on_a_whole_item(case in fractional_case()) {
        let mut item = case.item();
        item.lot_multiple = Some(1.0);
        for rule in Rule::ALL {
            let receipts = rules::plan(&item, Sizing::Rule(rule));
            prop_assert!(whole(&receipts), "{} plan {:?} is not whole", rule.name(), receipts);
        }
        let scenario = scenario(vec![item]);
        let outcome = plan_scenario(&scenario, &Options::default()).expect("the plan runs");
        let exact = &outcome.comparison[0];
        prop_assert!(whole(&exact.plan.receipts[0]), "exact plan {:?} is not whole", exact.plan.receipts[0]);
        for rule in outcome.comparison[1..].iter().filter(|r| r.evaluation.feasible) {
            prop_assert!(exact.evaluation.feasible);
            prop_assert!(
                exact.total_cost() <= rule.total_cost() + 1e-7 * (1.0 + rule.total_cost().abs()),
                "exact {} above {} {}", exact.total_cost(), rule.method, rule.total_cost()
            );
        }
    }
}

/// A continuous item (`lot_multiple` 0 in items.csv, `None` here) is still
/// planned in fractional quantities: demand 2.5 and 4.25 with a setup cost
/// of 1 and holding of 10 is cheapest lot-for-lot, 2.5 and 4.25 exactly
/// (hand-computed: one lot of 6.75 would cost 1 + 42.5 against 2).
#[test]
fn a_continuous_item_is_planned_in_fractions() {
    let item = item(&[2.5, 4.25], 1.0, 10.0);
    assert_eq!(item.lot_multiple, None);
    let outcome = plan_scenario(&scenario(vec![item]), &Options::default()).expect("plan");
    let exact = &outcome.comparison[0];
    assert_eq!(exact.plan.receipts[0], vec![2.5, 4.25]);
    assert_eq!(exact.total_cost(), 2.0);
    // The same item in whole units orders 3 and then 4 (the half unit left
    // from the first lot covers part of bucket 2's need), ending with 0.25:
    // 2 setups + (0.5 + 0.25) x 10 holding = 9.5; one lot of 7 would cost
    // 1 + (4.5 + 0.25) x 10 = 48.5.
    let mut unit = common::item(&[2.5, 4.25], 1.0, 10.0);
    unit.lot_multiple = Some(1.0);
    let outcome = plan_scenario(&scenario(vec![unit]), &Options::default()).expect("plan");
    let exact = &outcome.comparison[0];
    assert_eq!(exact.plan.receipts[0], vec![3.0, 4.0]);
    assert!(
        (exact.total_cost() - 9.5).abs() < 1e-9,
        "{}",
        exact.total_cost()
    );
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(80))]

    /// The program on rounded requirements (a lot multiple alone, data off
    /// the grid) against HiGHS on the MILP with integer lot counts, a
    /// general-purpose solver that knows nothing of the rounding argument:
    /// the same least cost; the program's plan is in multiples, feasible,
    /// and costs in `eval` what the program says.
    #[test]
    fn rounded_requirements_program_equals_the_milp(
        case in fractional_case(),
        multiple in 1u32..=5,
    ) {
        use lotwright::capacity::milp::{self, MilpOptions, MilpStatus};
        let mut item = case.item();
        item.lot_multiple = Some(f64::from(multiple));
        let solved = lotwright::single::multiple::solve(&item);
        let scenario = scenario(vec![item.clone()]);
        let options = MilpOptions { threads: Some(1), ..MilpOptions::default() };
        let reference = milp::solve(&scenario, &[0], &options);
        match solved {
            None => prop_assert_eq!(reference.status, MilpStatus::Infeasible),
            Some(plan) => {
                prop_assert_eq!(reference.status, MilpStatus::Optimal);
                let m = f64::from(multiple);
                prop_assert!(plan.receipts.iter().all(|q| (q / m).fract() == 0.0), "{:?}", plan.receipts);
                let evaluation = evaluate(&scenario, &single_plan(&plan.receipts));
                prop_assert!(evaluation.feasible, "{:?}", evaluation.violations);
                prop_assert!(close(evaluation.total_cost(), plan.cost), "eval {} program {}", evaluation.total_cost(), plan.cost);
                prop_assert!(close(plan.cost, reference.objective), "program {} MILP {}", plan.cost, reference.objective);
            }
        }
    }
}
