//! The capacitated single-item dynamic program over stock levels against
//! the MILP on HiGHS, against a brute force over every plan of tiny items,
//! and against the one evaluation of its plans.

use lotwright::capacity::milp::{self, MilpOptions, MilpStatus};
use lotwright::capacity::single_dp;
use lotwright::eval::evaluate;
use lotwright::model::{BucketKind, Calendar, Item, Plan, Resource, Routing, Scenario};
use proptest::prelude::*;

#[allow(clippy::too_many_arguments)]
fn scenario(
    demand: Vec<f64>,
    setup: f64,
    holding: f64,
    multiple: f64,
    min_lot: f64,
    max_lot: Option<f64>,
    backlog: Option<f64>,
    capacity: f64,
    overtime: f64,
    setup_time: f64,
    initial: f64,
) -> Scenario {
    let periods = demand.len();
    let item = Item {
        id: "A".into(),
        unit: "units".into(),
        setup_cost: vec![setup; periods],
        nominal_setup_cost: setup,
        nominal_holding_cost: holding,
        holding_cost: vec![holding; periods],
        unit_cost: (0..periods).map(|t| (t % 3) as f64).collect(),
        initial_stock: initial,
        safety_stock: 0.0,
        lead_time: 0,
        min_lot,
        lot_multiple: Some(multiple),
        max_lot,
        backlog_cost: backlog,
        fixed_lot: None,
        ending_stock: 0.0,
        forecast_error: None,
        demand,
        receipts: vec![0.0; periods],
        firm: vec![0.0; periods],
        quantity_change: None,
    };
    Scenario {
        name: "t".into(),
        currency: None,
        calendar: Calendar {
            start: chrono::NaiveDate::from_ymd_opt(2027, 1, 4).unwrap(),
            kind: BucketKind::Week,
            periods,
        },
        items: vec![item],
        resources: vec![Resource {
            id: "R".into(),
            unit: "capacity units".into(),
            capacity: vec![capacity; periods],
            overtime_capacity: vec![overtime; periods],
            overtime_cost: 3.0,
            capacity_cost: None,
        }],
        routings: vec![Routing {
            item: 0,
            resource: 0,
            per_unit: 1.0,
            setup_time,
        }],
        frozen: 0,
        bom: Vec::new(),
        period_offset: 0,
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 80, ..ProptestConfig::default() })]

    /// Whole quantities with capacity, overtime, setup time, lot rules and
    /// backlog: the program and the MILP prove the same least cost, and the
    /// program's plan costs what the evaluation says.
    #[test]
    fn the_program_over_stock_levels_equals_the_milp(
        demand in prop::collection::vec(0u32..12, 2..7),
        setup in 0u32..60,
        holding in 1u32..4,
        multiple in prop::sample::select(vec![1.0, 2.0, 5.0]),
        min_lot in prop::sample::select(vec![0.0, 4.0]),
        max_lot in prop::option::of(10u32..20),
        backlog in prop::option::of(1u32..6),
        capacity in 6u32..20,
        overtime in 0u32..6,
        setup_time in 0u32..3,
        initial in 0u32..6,
    ) {
        let s = scenario(
            demand.iter().map(|&d| d as f64).collect(),
            setup as f64, holding as f64 * 0.5, multiple, min_lot,
            max_lot.map(|m| m as f64), backlog.map(|b| b as f64),
            capacity as f64, overtime as f64, setup_time as f64, initial as f64,
        );
        let dp = single_dp::solve(&s, 0).expect("whole data within the bound");
        let options = MilpOptions { threads: Some(1), ..MilpOptions::default() };
        let result = milp::solve(&s, &[0], &options);
        match dp {
            None => prop_assert_eq!(result.status, MilpStatus::Infeasible),
            Some((receipts, cost)) => {
                prop_assert_eq!(result.status, MilpStatus::Optimal);
                prop_assert!((cost - result.objective).abs() <= 1e-6 * (1.0 + cost.abs()),
                    "dp {} milp {}", cost, result.objective);
                let evaluation = evaluate(&s, &Plan { receipts: vec![receipts] });
                prop_assert!(evaluation.feasible, "{:?} {:?}", evaluation.violations, evaluation.overloads);
                prop_assert!((evaluation.total_cost() - cost).abs() <= 1e-6 * (1.0 + cost.abs()));
            }
        }
    }
}

#[test]
fn continuous_quantities_are_left_to_the_milp() {
    let mut s = scenario(
        vec![3.0, 4.0],
        10.0,
        1.0,
        1.0,
        0.0,
        None,
        None,
        10.0,
        0.0,
        0.0,
        0.0,
    );
    s.items[0].lot_multiple = None;
    assert_eq!(
        single_dp::solve(&s, 0),
        Err(single_dp::NotApplicable::NotWhole)
    );
}

/// The least cost of one whole item on its resource by trying every receipt
/// quantity in every bucket, with its own cost and feasibility check (not
/// `evaluate`): lot rules, capacity with overtime at its cost, setup time,
/// backlog at its cost and cleared by the end, initial stock, scheduled
/// receipts, and safety stock as a floor on end-of-bucket stock for an item
/// without backlog (a target only, not checked, with backlog); no lead
/// time.
fn brute_force(s: &Scenario) -> Option<f64> {
    let item = &s.items[0];
    let resource = &s.resources[0];
    let routing = &s.routings[0];
    let periods = item.periods();
    let most = |t: usize| {
        let room = resource.capacity[t] + resource.overtime_capacity[t] - routing.setup_time;
        (room / routing.per_unit).floor().max(0.0) as usize
    };
    let allowed = |q: usize| {
        let q = q as f64;
        q == 0.0
            || (q >= item.min_lot
                && item.max_lot.is_none_or(|m| q <= m)
                && item.lot_multiple.is_none_or(|m| (q / m).fract() == 0.0))
    };
    let mut best: Option<f64> = None;
    let mut quantities = vec![0usize; periods];
    loop {
        let mut cost = 0.0;
        let mut ok = true;
        let mut stock = item.initial_stock;
        for (t, &q) in quantities.iter().enumerate() {
            ok &= allowed(q);
            let q = q as f64;
            if q > 0.0 {
                cost += item.setup_cost[t] + item.unit_cost[t] * q;
                let load = routing.per_unit * q + routing.setup_time;
                cost += resource.overtime_cost * (load - resource.capacity[t]).max(0.0);
            }
            stock += item.receipts[t] + q - item.demand[t];
            if item.backlog_cost.is_none() && stock < item.safety_stock {
                ok = false;
            }
            match item.backlog_cost {
                Some(b) if stock < 0.0 => cost += b * -stock,
                None if stock < 0.0 => ok = false,
                _ => cost += item.holding_cost[t] * stock,
            }
        }
        ok &= stock >= 0.0;
        if ok && best.is_none_or(|b| cost < b - 1e-9) {
            best = Some(cost);
        }
        // The next vector of quantities, each bucket up to what fits.
        let mut t = 0;
        loop {
            if t == periods {
                return best;
            }
            if quantities[t] < most(t) {
                quantities[t] += 1;
                break;
            }
            quantities[t] = 0;
            t += 1;
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 60, ..ProptestConfig::default() })]

    /// On items small enough to try every plan, the program over stock
    /// levels finds the least cost a brute force finds, or proves with it
    /// that there is no plan.
    #[test]
    fn the_program_over_stock_levels_equals_a_brute_force(
        demand in prop::collection::vec(0u32..7, 2..5),
        setup in 0u32..40,
        holding in 1u32..4,
        multiple in prop::sample::select(vec![1.0, 2.0, 3.0]),
        min_lot in prop::sample::select(vec![0.0, 3.0]),
        max_lot in prop::option::of(5u32..9),
        backlog in prop::option::of(1u32..6),
        capacity in 3u32..9,
        overtime in 0u32..3,
        setup_time in 0u32..2,
        initial in 0u32..4,
        receipts in prop::collection::vec(prop::sample::select(vec![0u32, 0, 0, 3, 7]), 4),
        safety in prop::sample::select(vec![0u32, 0, 1, 2]),
    ) {
        let mut s = scenario(
            demand.iter().map(|&d| d as f64).collect(),
            setup as f64, holding as f64 * 0.5, multiple, min_lot,
            max_lot.map(|m| m as f64), backlog.map(|b| b as f64),
            capacity as f64, overtime as f64, setup_time as f64, initial as f64,
        );
        s.items[0].receipts = receipts[..demand.len()].iter().map(|&r| r as f64).collect();
        s.items[0].safety_stock = safety as f64;
        let dp = single_dp::solve(&s, 0).expect("whole data within the bound");
        match (dp, brute_force(&s)) {
            (None, None) => {}
            (Some((_, cost)), Some(best)) => prop_assert!(
                (cost - best).abs() <= 1e-9 * (1.0 + best.abs()),
                "program {} brute force {}", cost, best
            ),
            (dp, best) => prop_assert!(false, "program {:?} brute force {:?}", dp, best),
        }
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 60, ..ProptestConfig::default() })]

    /// The same with a fractional forecast and stock (quarters, exact in
    /// binary) on a whole item: the program's states are counts of
    /// multiples, so it still finds the brute force's least cost.
    #[test]
    fn the_program_equals_a_brute_force_on_fractional_forecasts(
        quarters in prop::collection::vec(0u32..25, 2..5),
        setup in 0u32..40,
        holding in 1u32..4,
        multiple in prop::sample::select(vec![1.0, 2.0]),
        min_lot in prop::sample::select(vec![0.0, 3.0]),
        max_lot in prop::option::of(5u32..9),
        backlog in prop::option::of(1u32..6),
        capacity in 3u32..9,
        overtime in 0u32..3,
        initial_quarters in 0u32..12,
        safety in prop::sample::select(vec![0.0, 0.0, 1.5]),
    ) {
        let mut s = scenario(
            quarters.iter().map(|&q| q as f64 / 4.0).collect(),
            setup as f64, holding as f64 * 0.5, multiple, min_lot,
            max_lot.map(|m| m as f64), backlog.map(|b| b as f64),
            capacity as f64, overtime as f64, 0.0, initial_quarters as f64 / 4.0,
        );
        s.items[0].safety_stock = safety;
        let dp = single_dp::solve(&s, 0).expect("within the bound");
        match (dp, brute_force(&s)) {
            (None, None) => {}
            (Some((receipts, cost)), Some(best)) => {
                prop_assert!(
                    (cost - best).abs() <= 1e-9 * (1.0 + best.abs()),
                    "program {} brute force {}", cost, best
                );
                let evaluation = evaluate(&s, &Plan { receipts: vec![receipts] });
                prop_assert!(evaluation.feasible, "{:?}", evaluation.violations);
                prop_assert!((evaluation.total_cost() - cost).abs() <= 1e-9 * (1.0 + cost.abs()));
            }
            (dp, best) => prop_assert!(false, "program {:?} brute force {:?}", dp, best),
        }
    }
}

/// A minimum lot ordered for a safety stock, with scheduled receipts after
/// it: stock passes "remaining need plus one lot" and the program must
/// still reach it (it once called this item infeasible; found by the
/// property test of the exact method with lot constraints).
#[test]
fn receipts_after_a_minimum_lot_stay_within_the_states() {
    let mut s = scenario(
        vec![0.0; 5],
        0.0,
        0.0,
        1.0,
        13.0,
        None,
        None,
        100.0,
        0.0,
        0.0,
        0.0,
    );
    s.items[0].unit_cost = vec![0.0; 5];
    s.items[0].safety_stock = 1.0;
    s.items[0].receipts = vec![0.0, 0.0, 3.0, 0.0, 15.0];
    let (receipts, cost) = single_dp::solve(&s, 0)
        .expect("whole data within the bound")
        .expect("ordering 13 in the first bucket is a plan");
    assert_eq!(receipts, vec![13.0, 0.0, 0.0, 0.0, 0.0]);
    assert_eq!(cost, 0.0);
    let evaluation = evaluate(
        &s,
        &Plan {
            receipts: vec![receipts],
        },
    );
    assert!(evaluation.feasible, "{:?}", evaluation.violations);
}
