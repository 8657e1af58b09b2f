//! Property tests of the O(T log T) program (`single::fast`) against the
//! O(T^2) reference (`single::exact`): the same feasibility and the same cost
//! on random items without backlog, and the fast plan's own cost against
//! the one evaluation.
//!
//! Quantities are mostly whole numbers, so sums are exact in floating point;
//! one property moves them off that grid (tenths and thirds) to check that
//! rounding noise does not change the answer.

mod common;

use common::{assert_cost_eq, item, scenario, single_plan};
use lotwright::eval::evaluate;
use lotwright::model::Item;
use lotwright::single::{exact, fast};
use proptest::collection::vec;
use proptest::prelude::*;

/// A random item without backlog or lot constraints.
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
        item
    }
}

/// Mostly zero, sometimes up to `max` (whole units).
fn lumpy(max: u32) -> impl Strategy<Value = f64> {
    prop_oneof![2 => Just(0.0), 3 => (0..=max).prop_map(f64::from)]
}

/// Quarters from 0 to `max`.
fn quarters(max: u32) -> impl Strategy<Value = f64> {
    (0..=4 * max).prop_map(|q| f64::from(q) / 4.0)
}

/// Horizons 1..=`longest`, demand with zeros, setup, unit and holding cost
/// varying by bucket (zero included), initial stock, receipts, safety stock,
/// lead time 0..=3 and an ending-stock target.
fn case(longest: usize) -> impl Strategy<Value = Case> {
    (1usize..=longest).prop_flat_map(|t| {
        (
            vec(lumpy(40), t),
            vec((0u32..=200).prop_map(f64::from), t),
            vec(quarters(3), t),
            vec(quarters(5), t),
            vec(
                prop_oneof![4 => Just(0.0), 1 => (1u32..=30).prop_map(f64::from)],
                t,
            ),
            prop_oneof![Just(0.0), (0u32..=60).prop_map(f64::from)],
            prop_oneof![2 => Just(0.0), 1 => (0u32..=15).prop_map(f64::from)],
            0usize..=3,
            prop_oneof![2 => Just(0.0), 1 => (0u32..=20).prop_map(f64::from)],
        )
            .prop_map(
                |(demand, setup, holding, unit, receipts, initial, safety, lead, ending)| Case {
                    demand,
                    setup,
                    holding,
                    unit,
                    receipts,
                    initial_stock: initial,
                    safety_stock: safety,
                    lead_time: lead,
                    ending_stock: ending,
                },
            )
    })
}

/// The same items with quantities off the whole-unit grid.
fn fractional_case() -> impl Strategy<Value = Case> {
    case(25).prop_map(|mut case| {
        for d in case.demand.iter_mut().filter(|d| **d > 0.0) {
            *d = *d * 0.1 + 1.0 / 3.0;
        }
        for r in case.receipts.iter_mut() {
            *r *= 0.7;
        }
        case.initial_stock *= 1.1;
        case.safety_stock *= 0.3;
        case.ending_stock *= 0.9;
        case
    })
}

/// Fast and exact agree on feasibility and cost; the fast plan's evaluation
/// is feasible and costs what the fast program reports.
fn check(case: &Case) -> Result<(), TestCaseError> {
    let item = case.item();
    let fast = fast::solve(&item);
    let exact = exact::solve(&item);
    prop_assert_eq!(fast.is_some(), exact.is_some(), "feasibility differs");
    let (Some(fast), Some(exact)) = (fast, exact) else {
        return Ok(());
    };
    prop_assert_eq!(fast.receipts.len(), item.periods());
    let scale = 1.0f64.max(exact.cost.abs());
    prop_assert!(
        (fast.cost - exact.cost).abs() <= 1e-9 * scale,
        "fast {} against exact {}",
        fast.cost,
        exact.cost
    );
    let scenario = scenario(vec![item]);
    let evaluation = evaluate(&scenario, &single_plan(&fast.receipts));
    prop_assert!(
        evaluation.feasible,
        "fast plan not feasible: {:?}",
        evaluation
    );
    assert_cost_eq(
        evaluation.total_cost(),
        fast.cost,
        "evaluation of the fast plan",
    );
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn fast_equals_exact_on_short_horizons(case in case(12)) {
        check(&case)?;
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(200))]

    #[test]
    fn fast_equals_exact_on_longer_horizons(case in case(80)) {
        check(&case)?;
    }

    #[test]
    fn fast_equals_exact_off_the_whole_unit_grid(case in fractional_case()) {
        check(&case)?;
    }
}

/// Infeasible items are infeasible for both: need in bucket 2 with a lead
/// time of two and no stock; with stock to cover it, both plan alike.
#[test]
fn both_refuse_need_before_the_first_arrival() {
    let mut item = item(&[0.0, 5.0, 3.0, 0.0, 8.0], 50.0, 1.0);
    item.lead_time = 2;
    assert!(exact::solve(&item).is_none());
    assert!(fast::solve(&item).is_none());
    item.initial_stock = 5.0;
    let fast = fast::solve(&item).expect("stock covers the lead time");
    let exact = exact::solve(&item).expect("stock covers the lead time");
    assert_cost_eq(fast.cost, exact.cost, "after adding stock");
    assert_eq!(fast.receipts[..2], [0.0, 0.0]);
}

/// A long seasonal horizon where the O(T^2) program is still quick: both
/// give the same cost.
#[test]
fn fast_equals_exact_on_two_years_of_weekly_seasonal_demand() {
    let periods = 104;
    let demand: Vec<f64> = (0..periods)
        .map(|t| (100.0 + 60.0 * (t as f64 * std::f64::consts::TAU / 52.0).sin()).round())
        .collect();
    let mut item = item(&demand, 400.0, 0.8);
    item.unit_cost = (0..periods).map(|t| 10.0 + (t % 13) as f64 * 0.1).collect();
    item.holding_cost = (0..periods).map(|t| 0.5 + (t % 7) as f64 * 0.1).collect();
    item.safety_stock = 20.0;
    item.lead_time = 1;
    item.initial_stock = 150.0;
    let fast = fast::solve(&item).expect("feasible");
    let exact = exact::solve(&item).expect("feasible");
    assert_cost_eq(fast.cost, exact.cost, "two seasonal years");
}
