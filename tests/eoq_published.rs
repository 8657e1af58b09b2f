//! The `eoq` models checked against textbook worked examples, facts of the
//! trade, and brute-force minimisation of cost functions written out here.
//!
//! No book was at hand while these were written: every published value below
//! comes from memory of the book named beside it, and was kept only because
//! recomputing it from the model's formula gives the same number.

use approx::assert_relative_eq;
use lotwright::single::eoq::*;
use proptest::prelude::*;

fn classic(demand: f64, setup_cost: f64, holding_cost: f64) -> EoqInput {
    EoqInput {
        demand,
        setup_cost,
        holding_cost: Some(holding_cost),
        ..EoqInput::default()
    }
}

fn with_rate(demand: f64, setup_cost: f64, carrying_rate: f64, pairs: &[(f64, f64)]) -> EoqInput {
    EoqInput {
        demand,
        setup_cost,
        carrying_rate: Some(carrying_rate),
        price_breaks: Some(
            pairs
                .iter()
                .map(|&(quantity, price)| PriceBreak { quantity, price })
                .collect(),
        ),
        ..EoqInput::default()
    }
}

// ---------------------------------------------------------------------------
// Published worked examples
// ---------------------------------------------------------------------------

/// Heizer and Render, "Operations Management", chapter "Inventory Management",
/// worked example of Sharp, Inc. (hypodermic needles); edition from memory
/// (the example appears across many editions, e.g. the 10th, 2011).
#[test]
fn heizer_render_sharp_classic_eoq() {
    // Values from memory of Heizer and Render: D = 1,000 units a year,
    // S = $10, H = $0.50; Q* = 200, N = 5 orders a year, TC = $100.
    let result = solve(&classic(1000.0, 10.0, 0.5)).unwrap();
    assert_eq!(result.model, "classic");
    assert_relative_eq!(result.eoq, 200.0, max_relative = 1e-12);
    assert_relative_eq!(result.orders, 5.0, max_relative = 1e-12);
    assert_relative_eq!(result.total_cost, 100.0, max_relative = 1e-12);
    // The book gives the time between orders as 250 working days / 5 = 50
    // days (value from memory); in years that is 0.2.
    assert_relative_eq!(result.cycle * 250.0, 50.0, max_relative = 1e-12);
}

/// Heizer and Render, "Operations Management", chapter "Inventory Management",
/// production order quantity example of Nathan Manufacturing (hubcaps).
#[test]
fn heizer_render_nathan_production_order_quantity() {
    // Values from memory of Heizer and Render: D = 1,000 a year, S = $10,
    // H = $0.50, daily production 8 against daily demand 4; Q* = 282.8,
    // rounded to 283 hubcaps. Our rates share one time unit: P = 2 D.
    let input = EoqInput {
        production_rate: Some(2000.0),
        ..classic(1000.0, 10.0, 0.5)
    };
    let result = solve(&input).unwrap();
    assert_eq!(result.model, "production-rate");
    assert_relative_eq!(result.eoq, 282.84, max_relative = 1e-4);
    assert_eq!(result.eoq.round(), 283.0);
}

/// Heizer and Render, "Operations Management", chapter "Inventory Management",
/// all-units quantity discount example of Wohl's Discount Store (toy cars).
#[test]
fn heizer_render_wohls_quantity_discount() {
    // Values from memory of Heizer and Render: D = 5,000, S = $49, I = 20%,
    // $5.00 below 1,000, $4.80 from 1,000, $4.75 from 2,000. EOQs 700, 714
    // (raised to 1,000) and 718 (raised to 2,000); total costs $25,700,
    // $24,725 and $24,822.50; the best order is 1,000 units.
    let input = with_rate(
        5000.0,
        49.0,
        0.2,
        &[(0.0, 5.0), (1000.0, 4.8), (2000.0, 4.75)],
    );
    let result = solve(&input).unwrap();
    assert_eq!(result.model, "price-breaks");
    let table: Vec<(f64, f64, f64)> = result
        .candidates
        .iter()
        .map(|c| (c.eoq_at_price.round(), c.lot, c.total_cost))
        .collect();
    let expected = [
        (700.0, 700.0, 25_700.0),
        (714.0, 1000.0, 24_725.0),
        (718.0, 2000.0, 24_822.5),
    ];
    assert_eq!(table.len(), expected.len());
    for (got, want) in table.iter().zip(expected) {
        assert_eq!(got.0, want.0);
        assert_relative_eq!(got.1, want.1, max_relative = 1e-12);
        assert_relative_eq!(got.2, want.2, max_relative = 1e-12);
    }
    assert_relative_eq!(result.eoq, 1000.0);
    assert_relative_eq!(result.total_cost, 24_725.0, max_relative = 1e-12);
    assert_eq!(result.unit_price, Some(4.8));
    assert_relative_eq!(
        result.purchase_cost_per_time,
        24_000.0,
        max_relative = 1e-12
    );
}

/// Hillier and Lieberman, "Introduction to Operations Research", chapter
/// "Inventory Theory", the example of a TV maker producing its own speakers
/// (basic EOQ model, then planned shortages).
#[test]
fn hillier_lieberman_speakers_classic_and_planned_shortages() {
    // Values from memory of Hillier and Lieberman: demand 8,000 speakers a
    // month, setup $12,000, holding $0.30 per speaker per month; Q* = 25,298
    // and t* = 3.2 months.
    let base = classic(8000.0, 12_000.0, 0.3);
    let result = solve(&base).unwrap();
    assert_eq!(result.eoq.round(), 25_298.0);
    assert_eq!((result.cycle * 10.0).round() / 10.0, 3.2);

    // With a shortage cost of $1.10 per speaker per month (value from memory
    // of the same example): Q* = 28,540, S* = 22,424 (stock on hand when a
    // batch arrives, our max_inventory) and t* = 3.6 months.
    let shortages = EoqInput {
        backorder_cost: Some(1.1),
        ..base
    };
    let result = solve(&shortages).unwrap();
    assert_eq!(result.model, "backorders");
    assert_eq!(result.eoq.round(), 28_540.0);
    assert_eq!(result.max_inventory.round(), 22_424.0);
    assert_eq!((result.cycle * 10.0).round() / 10.0, 3.6);
    // Q* - S* is the most backordered, by the geometry of the cycle.
    assert_relative_eq!(
        result.max_backorder,
        result.eoq - result.max_inventory,
        max_relative = 1e-12
    );
}

/// Nahmias, "Production and Operations Analysis", chapter on inventory
/// control with known demand, the example of pencils at a campus bookstore.
#[test]
fn nahmias_pencils_classic_eoq() {
    // Values from memory of Nahmias: 60 pencils a week (3,120 a year),
    // 2 cents each, $12 an order, 25% annual interest, so h = $0.005;
    // Q* = 3,870 pencils.
    let result = solve(&classic(60.0 * 52.0, 12.0, 0.25 * 0.02)).unwrap();
    assert_eq!(result.eoq.round(), 3870.0);
}

/// Nahmias, "Production and Operations Analysis", chapter on inventory
/// control with known demand, the all-units discount example of a trash bag
/// company.
#[test]
fn nahmias_trash_bags_all_units_discount() {
    // Values from memory of Nahmias: 600 bags a year, $8 an order, 20%
    // interest, 30 cents below 500, 29 cents from 500, 28 cents from 1,000.
    // EOQ(0.30) = 400 is feasible; the other EOQs (407, 414) are raised to
    // 500 and 1,000. Annual costs $204.00, $198.10 and $200.80: order 500.
    let input = with_rate(
        600.0,
        8.0,
        0.2,
        &[(0.0, 0.30), (500.0, 0.29), (1000.0, 0.28)],
    );
    let result = solve(&input).unwrap();
    let costs: Vec<(f64, f64)> = result
        .candidates
        .iter()
        .map(|c| (c.lot, c.total_cost))
        .collect();
    let expected = [(400.0, 204.0), (500.0, 198.1), (1000.0, 200.8)];
    assert_eq!(costs.len(), 3);
    for (got, want) in costs.iter().zip(expected) {
        assert_relative_eq!(got.0, want.0, max_relative = 1e-12);
        assert_relative_eq!(got.1, want.1, max_relative = 1e-12);
    }
    assert_relative_eq!(result.eoq, 500.0);
    assert_relative_eq!(result.total_cost, 198.1, max_relative = 1e-12);
}

/// Silver, Pyke and Peterson, "Inventory Management and Production Planning
/// and Scheduling", 3rd ed. 1998, chapter 5 (the basic EOQ), its numerical
/// illustration.
#[test]
fn silver_pyke_peterson_basic_eoq() {
    // Values from memory of Silver, Pyke and Peterson: D = 2,400 units a
    // year, A = $3.20, v = $0.40, r = 0.24 a year; EOQ = 400 units (two
    // months of supply) and relevant cost TRC(EOQ) = sqrt(2ADvr) = $38.40.
    let result = solve(&classic(2400.0, 3.20, 0.24 * 0.40)).unwrap();
    assert_relative_eq!(result.eoq, 400.0, max_relative = 1e-12);
    assert_relative_eq!(result.total_cost, 38.40, max_relative = 1e-12);
    assert_relative_eq!(result.cycle * 12.0, 2.0, max_relative = 1e-12);
}

// ---------------------------------------------------------------------------
// Facts of the trade
// ---------------------------------------------------------------------------

/// One instance per model without price breaks.
fn steady_inputs() -> Vec<EoqInput> {
    let base = classic(1200.0, 75.0, 2.5);
    vec![
        base.clone(),
        EoqInput {
            production_rate: Some(3000.0),
            ..base.clone()
        },
        EoqInput {
            backorder_cost: Some(9.0),
            ..base.clone()
        },
        EoqInput {
            production_rate: Some(3000.0),
            backorder_cost: Some(9.0),
            ..base
        },
    ]
}

#[test]
fn setup_cost_equals_the_other_costs_at_the_optimum() {
    // common practice: at Q*, setup cost per time equals holding cost per
    // time; with backorders, it equals holding plus backorder cost.
    for input in steady_inputs() {
        let result = solve(&input).unwrap();
        assert_relative_eq!(
            result.setup_cost_per_time,
            result.holding_cost_per_time + result.backorder_cost_per_time,
            max_relative = 1e-12
        );
        assert_relative_eq!(
            result.total_cost,
            2.0 * result.setup_cost_per_time,
            max_relative = 1e-12
        );
    }
}

#[test]
fn a_lot_away_from_the_optimum_costs_the_square_root_rule() {
    // common practice: TC(Q) = TC* (Q/Q* + Q*/Q) / 2, here for every model
    // without price breaks (each has the form DS/Q + H_e Q/2).
    for input in steady_inputs() {
        let optimum = solve(&input).unwrap();
        for factor in [0.25, 0.5, 0.9, 1.0, 1.3, 2.0, 5.0] {
            let lot = factor * optimum.eoq;
            let chosen = solve(&EoqInput {
                lot: Some(lot),
                ..input.clone()
            })
            .unwrap()
            .chosen_lot
            .unwrap();
            let rule = optimum.total_cost * (factor + 1.0 / factor) / 2.0;
            assert_relative_eq!(chosen.total_cost, rule, max_relative = 1e-12);
            assert_relative_eq!(
                chosen.extra_cost,
                rule - optimum.total_cost,
                epsilon = 1e-9 * optimum.total_cost
            );
            assert_relative_eq!(
                chosen.extra_percent,
                100.0 * ((factor + 1.0 / factor) / 2.0 - 1.0),
                epsilon = 1e-9
            );
        }
    }
}

#[test]
fn production_rate_model_tends_to_classic_as_the_rate_grows() {
    // common practice: the EPQ tends to the EOQ as P goes to infinity.
    let classic_lot = solve(&classic(1200.0, 75.0, 2.5)).unwrap().eoq;
    let mut previous_gap = f64::INFINITY;
    for multiple in [2.0, 10.0, 1e3, 1e6, 1e12] {
        let input = EoqInput {
            production_rate: Some(1200.0 * multiple),
            ..classic(1200.0, 75.0, 2.5)
        };
        let gap = solve(&input).unwrap().eoq - classic_lot;
        assert!(gap > 0.0 && gap < previous_gap, "{multiple}: gap {gap}");
        previous_gap = gap;
    }
    assert!(previous_gap < 1e-9 * classic_lot);
}

#[test]
fn backorder_model_tends_to_classic_as_backorders_grow_dear() {
    // common practice: with B going to infinity no backorder pays, and the
    // lot and its cost return to the classic ones.
    let classic_result = solve(&classic(1200.0, 75.0, 2.5)).unwrap();
    let mut previous_gap = f64::INFINITY;
    for backorder_cost in [1.0, 10.0, 1e3, 1e6, 1e12] {
        let input = EoqInput {
            backorder_cost: Some(backorder_cost),
            ..classic(1200.0, 75.0, 2.5)
        };
        let result = solve(&input).unwrap();
        let gap = result.eoq - classic_result.eoq;
        assert!(
            gap > 0.0 && gap < previous_gap,
            "{backorder_cost}: gap {gap}"
        );
        assert!(result.total_cost < classic_result.total_cost);
        previous_gap = gap;
    }
    assert!(previous_gap < 1e-9 * classic_result.eoq);
}

// ---------------------------------------------------------------------------
// Brute force: cost functions written out here, minimised numerically
// ---------------------------------------------------------------------------

/// The cost per time unit of lot `q` with `b` units at most backordered,
/// built from the stock curve itself: a cycle of length q/D starts at -b,
/// rises at P - D while the lot is made (instantly without a rate), then falls
/// at D. Holding and backorder are the time averages of the positive and
/// negative parts, by the midpoint rule over `steps` slices (exact on each
/// straight piece; the error sits in the slices holding a kink).
fn integrated_cost(input: &EoqInput, q: f64, b: f64, steps: u32) -> f64 {
    let d = input.demand;
    let cycle = q / d;
    let (rise_rate, rise_time) = match input.production_rate {
        Some(p) => (p - d, q / p),
        None => (f64::INFINITY, 0.0),
    };
    let level_at = |t: f64| {
        if t < rise_time {
            -b + rise_rate * t
        } else {
            let peak = if rise_time > 0.0 {
                -b + rise_rate * rise_time
            } else {
                q - b
            };
            peak - d * (t - rise_time)
        }
    };
    let width = cycle / f64::from(steps);
    let (mut on_hand, mut short) = (0.0, 0.0);
    for step in 0..steps {
        let level = level_at((step as f64 + 0.5) * width);
        on_hand += level.max(0.0) * width;
        short += (-level).max(0.0) * width;
    }
    input.setup_cost / cycle
        + input.holding_cost.unwrap() * on_hand / cycle
        + input.backorder_cost.unwrap_or(0.0) * short / cycle
}

/// The textbook cost function with backorder level b and r = 1 - D/P.
fn textbook_cost(input: &EoqInput, q: f64, b: f64) -> f64 {
    let h = input.holding_cost.unwrap();
    let r = input
        .production_rate
        .map_or(1.0, |p| 1.0 - input.demand / p);
    let peak = r * q;
    input.demand * input.setup_cost / q
        + h * (peak - b).powi(2) / (2.0 * peak)
        + input.backorder_cost.unwrap_or(0.0) * b * b / (2.0 * peak)
}

/// Minimum of a convex function on [low, high] by golden-section search.
fn golden_min(mut low: f64, mut high: f64, f: impl Fn(f64) -> f64) -> (f64, f64) {
    let ratio = (5f64.sqrt() - 1.0) / 2.0;
    for _ in 0..60 {
        let left = high - ratio * (high - low);
        let right = low + ratio * (high - low);
        if f(left) <= f(right) {
            high = right;
        } else {
            low = left;
        }
    }
    let x = (low + high) / 2.0;
    (x, f(x))
}

/// The cost of lot q with the backorder level that suits it best, found by
/// search rather than by formula.
fn best_over_backorders(input: &EoqInput, q: f64, cost: impl Fn(f64, f64) -> f64) -> (f64, f64) {
    if input.backorder_cost.is_none() {
        return (0.0, cost(q, 0.0));
    }
    let r = input
        .production_rate
        .map_or(1.0, |p| 1.0 - input.demand / p);
    golden_min(0.0, r * q, |b| cost(q, b))
}

#[test]
fn combined_model_matches_a_search_over_the_stock_curve() {
    // The production-rate+backorders formulas were derived for this crate
    // (module docs); check them against the stock curve integrated directly
    // and minimised over both the lot and the backorder level.
    let input = EoqInput {
        production_rate: Some(3000.0),
        backorder_cost: Some(9.0),
        ..classic(1200.0, 75.0, 2.5)
    };
    let result = solve(&input).unwrap();
    assert_eq!(result.model, "production-rate+backorders");

    // The reported cost is the cost of the reported stock curve.
    let at_optimum = integrated_cost(&input, result.eoq, result.max_backorder, 20_000);
    assert_relative_eq!(at_optimum, result.total_cost, max_relative = 1e-7);

    // A coarse curve for the search over both, a fine one for the backorder
    // level, whose cost is flat near its optimum and so sensitive to noise.
    let search = |q: f64, steps| {
        best_over_backorders(&input, q, |q, b| integrated_cost(&input, q, b, steps))
    };
    let (best_lot, best_cost) =
        golden_min(0.2 * result.eoq, 5.0 * result.eoq, |q| search(q, 5_000).1);
    let (best_backorder, _) = search(result.eoq, 100_000);
    assert_relative_eq!(best_lot, result.eoq, max_relative = 1e-5);
    assert_relative_eq!(best_backorder, result.max_backorder, max_relative = 1e-4);
    assert_relative_eq!(best_cost, result.total_cost, max_relative = 1e-6);
    assert!(result.total_cost <= best_cost * (1.0 + 1e-6));
    assert_relative_eq!(
        result.max_inventory + result.max_backorder,
        result.eoq * (1.0 - 1200.0 / 3000.0),
        max_relative = 1e-12
    );
}

#[test]
fn every_model_reports_the_cost_of_its_own_stock_curve() {
    // The closed-form cost split agrees with the integrated stock curve.
    for input in steady_inputs() {
        let result = solve(&input).unwrap();
        let integrated = integrated_cost(&input, result.eoq, result.max_backorder, 20_000);
        assert_relative_eq!(integrated, result.total_cost, max_relative = 1e-7);
    }
}

/// The cost of lot q under price breaks, written out from the definition.
fn price_cost(input: &EoqInput, q: f64) -> Option<f64> {
    let breaks = input.price_breaks.as_ref().unwrap();
    let level = breaks.iter().rev().find(|level| level.quantity <= q)?;
    let holding = match input.carrying_rate {
        Some(rate) => rate * level.price,
        None => input.holding_cost.unwrap(),
    };
    Some(input.demand * input.setup_cost / q + holding * q / 2.0 + input.demand * level.price)
}

fn steady_strategy() -> impl Strategy<Value = EoqInput> {
    (
        1e-2..1e6f64,
        1e-2..1e4f64,
        1e-3..1e2f64,
        proptest::option::of(0.01..10.0f64),
        proptest::option::of(1e-3..1e3f64),
    )
        .prop_map(
            |(demand, setup_cost, holding, spare, backorder_cost)| EoqInput {
                production_rate: spare.map(|spare| demand * (1.0 + spare)),
                backorder_cost,
                ..classic(demand, setup_cost, holding)
            },
        )
}

fn price_strategy() -> impl Strategy<Value = EoqInput> {
    (
        1.0..1e5f64,
        1.0..1e3f64,
        proptest::option::of(0.05..0.5f64),
        0.5..20.0f64,
        prop_oneof![Just(0.0), 1.0..2000.0f64],
        proptest::collection::vec((1.0..3000.0f64, 0.7..1.0f64), 0..5),
        1.0..100.0f64,
    )
        .prop_map(|(demand, setup_cost, rate, holding, first, steps, price)| {
            let mut pairs = vec![(first, price)];
            for (gap, discount) in steps {
                let &(quantity, price) = pairs.last().unwrap();
                pairs.push((quantity + gap, price * discount));
            }
            let mut input = with_rate(demand, setup_cost, rate.unwrap_or(0.0), &pairs);
            if rate.is_none() {
                input.carrying_rate = None;
                input.holding_cost = Some(holding);
            }
            input
        })
}

proptest! {
    /// The optimum of each model without price breaks is no worse than any
    /// lot on a grid around it, each lot with its best backorder level found
    /// by search.
    #[test]
    fn steady_optimum_beats_a_grid_of_lots(input in steady_strategy()) {
        let result = solve(&input).unwrap();
        let cost = |q, b| textbook_cost(&input, q, b);
        prop_assert!(
            (cost(result.eoq, result.max_backorder) - result.total_cost).abs()
                <= 1e-9 * result.total_cost
        );
        for step in 0..=40 {
            let q = result.eoq * (0.5 + 1.5 * step as f64 / 40.0);
            let (_, best) = best_over_backorders(&input, q, cost);
            prop_assert!(result.total_cost <= best * (1.0 + 1e-9), "lot {} costs {} < {}", q, best, result.total_cost);
        }
    }

    /// common practice: the price-break optimum is never dearer than any lot
    /// on a fine grid (the break quantities themselves included).
    #[test]
    fn price_break_optimum_beats_a_fine_grid(input in price_strategy()) {
        let result = solve(&input).unwrap();
        let breaks = input.price_breaks.clone().unwrap();
        let reported = price_cost(&input, result.eoq).unwrap();
        prop_assert!((reported - result.total_cost).abs() <= 1e-9 * result.total_cost);
        let largest_eoq = result
            .candidates
            .iter()
            .map(|c| c.eoq_at_price)
            .fold(0.0, f64::max);
        let high = 3.0 * largest_eoq.max(breaks.last().unwrap().quantity).max(1.0);
        let low = breaks[0].quantity;
        let grid = (0..=20_000)
            .map(|step| low + (high - low) * step as f64 / 20_000.0)
            .chain(breaks.iter().map(|level| level.quantity))
            .filter(|&q| q > 0.0);
        for q in grid {
            if let Some(cost) = price_cost(&input, q) {
                prop_assert!(result.total_cost <= cost * (1.0 + 1e-9), "lot {} costs {} < {}", q, cost, result.total_cost);
            }
        }
    }
}
