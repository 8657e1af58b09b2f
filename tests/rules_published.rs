//! The lot rules against worked examples: textbook data where it is known
//! (recalled from memory, no book at hand; said so beside each), otherwise
//! hand-computed examples with the arithmetic in the comments. The rules
//! follow the conventions of PRODUCT.md: a lot starts in a bucket with a
//! positive net requirement; Silver-Meal extends while the cost per bucket
//! does not rise, least unit cost while the cost per unit does not rise,
//! part-period balancing while the lot's holding cost gets strictly closer
//! to its setup cost; POQ covers P = max(1, round(EOQ / D)) buckets; the EOQ
//! and fixed-lot rules order the smallest multiple of their lot that covers
//! the need.

mod common;

use common::{assert_cost_eq, item, scenario, single_plan};
use lotwright::eval::{evaluate, Evaluation};
use lotwright::model::Item;
use lotwright::single::rules::{self, eoq_lot, poq_interval, Rule, Sizing};

fn plan(item: &Item, rule: Rule) -> Vec<f64> {
    rules::plan(item, Sizing::Rule(rule))
}

fn evaluation(item: &Item, receipts: &[f64]) -> Evaluation {
    evaluate(&scenario(vec![item.clone()]), &single_plan(receipts))
}

/// Plans the item with the rule, checks the receipts, and returns the
/// evaluation after checking it is feasible and costs `cost`.
fn check_rule(item: &Item, rule: Rule, receipts: &[f64], cost: f64) -> Evaluation {
    let planned = plan(item, rule);
    assert_eq!(planned, receipts, "{} receipts", rule.name());
    let evaluation = evaluation(item, &planned);
    assert!(
        evaluation.feasible,
        "{} plan feasible: {:?}",
        rule.name(),
        evaluation.violations
    );
    assert_cost_eq(evaluation.total_cost(), cost, rule.name());
    evaluation
}

/// Nahmias, "Production and Operations Analysis", lot-sizing chapter:
/// requirements 18, 30, 42, 5, 20 with setup K = $80 and holding h = $2 per
/// unit per period, worked by each heuristic. Data, and the costs quoted
/// below ($310 Silver-Meal, $340 least unit cost, $310 part-period
/// balancing), are from memory of the book; the arithmetic is repeated in
/// each test.
const NAHMIAS: [f64; 5] = [18.0, 30.0, 42.0, 5.0, 20.0];

/// Silver, Pyke and Peterson, "Inventory Management and Production Planning
/// and Scheduling", 3rd ed. (1998), chapter 6: monthly demand, A = $54,
/// h = v r = $20 x 0.02 = $0.40 per unit per month (data from memory).
const SPP: [f64; 12] = [
    10.0, 62.0, 12.0, 130.0, 154.0, 129.0, 88.0, 52.0, 124.0, 160.0, 238.0, 41.0,
];

// ---------------------------------------------------------------------------
// Lot-for-lot
// ---------------------------------------------------------------------------

#[test]
fn lot_for_lot_nets_stock_receipts_and_safety_stock_with_lead_time() {
    // Hand-computed. Demand 20, 30, 0, 40; initial stock 25; a scheduled
    // receipt of 10 in bucket 2; safety stock 5; lead time 1.
    //   bucket 1: 25 - 20 = 5 left (no order can arrive yet; none needed)
    //   bucket 2: 5 + 10 - 30 = -15, and 5 must stay: order 20
    //   bucket 3: no demand, 5 stays
    //   bucket 4: 5 - 40 = -35, and 5 must stay: order 40
    // Stock 5 at the end of every bucket: holding 4 x 5 x 1 = 20; setups
    // 2 x 50 = 100 (released in buckets 1 and 3); total 120.
    let mut item = item(&[20.0, 30.0, 0.0, 40.0], 50.0, 1.0);
    item.initial_stock = 25.0;
    item.receipts[1] = 10.0;
    item.safety_stock = 5.0;
    item.lead_time = 1;
    let evaluation = check_rule(&item, Rule::LotForLot, &[0.0, 20.0, 0.0, 40.0], 120.0);
    let record = &evaluation.items[0];
    assert_eq!(record.on_hand, vec![5.0, 5.0, 5.0, 5.0]);
    assert_eq!(record.planned_releases, vec![20.0, 0.0, 40.0, 0.0]);
}

#[test]
fn lot_for_lot_raises_to_the_minimum_lot_then_rounds_to_the_multiple() {
    // Hand-computed. Demand 12, 3, 0, 47; min_lot 20; lot_multiple 10.
    //   bucket 1: need 12, raised to 20 (a multiple of 10): 8 left
    //   bucket 2: 8 - 3 = 5 left; bucket 3: 5 left
    //   bucket 4: need 47 - 5 = 42, rounded up to 50: 8 left
    // Holding 8 + 5 + 5 + 8 = 26 at 1; setups 2 x 10 = 20; total 46.
    let mut item = item(&[12.0, 3.0, 0.0, 47.0], 10.0, 1.0);
    item.min_lot = 20.0;
    item.lot_multiple = Some(10.0);
    let evaluation = check_rule(&item, Rule::LotForLot, &[20.0, 0.0, 0.0, 50.0], 46.0);
    assert_eq!(evaluation.items[0].ending_stock, 8.0);
}

// ---------------------------------------------------------------------------
// Fixed lot
// ---------------------------------------------------------------------------

#[test]
fn fixed_lot_orders_the_smallest_multiple_that_covers_the_need() {
    // Hand-computed. Demand 40, 25, 0, 70, 15; initial stock 20; fixed lot
    // 50; setup 100; holding 1.
    //   bucket 1: need 40 - 20 = 20: one lot of 50, 30 left
    //   bucket 2: 30 - 25 = 5 left; bucket 3: 5 left
    //   bucket 4: need 70 - 5 = 65: two lots, 100; 35 left
    //   bucket 5: 35 - 15 = 20 left
    // Holding 30 + 5 + 5 + 35 + 20 = 95; setups 2 x 100 = 200; total 295,
    // ending with 20 in stock.
    let mut item = item(&[40.0, 25.0, 0.0, 70.0, 15.0], 100.0, 1.0);
    item.initial_stock = 20.0;
    item.fixed_lot = Some(50.0);
    let evaluation = check_rule(&item, Rule::FixedLot, &[50.0, 0.0, 0.0, 100.0, 0.0], 295.0);
    assert_eq!(evaluation.items[0].ending_stock, 20.0);
}

#[test]
fn fixed_lot_without_a_lot_is_lot_for_lot() {
    // PRODUCT.md: an item without fixed_lot is ordered lot-for-lot under
    // the fixed-lot rule.
    let item = item(&[40.0, 25.0, 0.0, 70.0], 100.0, 1.0);
    assert_eq!(plan(&item, Rule::FixedLot), plan(&item, Rule::LotForLot));
    assert_eq!(plan(&item, Rule::FixedLot), vec![40.0, 25.0, 0.0, 70.0]);
}

// ---------------------------------------------------------------------------
// EOQ lot and periodic order quantity, on the Silver-Pyke-Peterson data
// ---------------------------------------------------------------------------

#[test]
fn eoq_rule_on_silver_pyke_peterson_data() {
    // Data: Silver, Pyke and Peterson 1998, ch. 6 (from memory). The plan
    // below is hand-computed under the contract's EOQ rule.
    // Mean demand 1200 / 12 = 100 per month; EOQ = sqrt(2 x 100 x 54 / 0.4)
    // = sqrt(27000) = 164.3, rounded to 164.
    let item = item(&SPP, 54.0, 0.4);
    assert_eq!(eoq_lot(&item), Some(164.0));
    // Stock after each month (order when the stock cannot cover the month,
    // the smallest multiple of 164 that does):
    //   1: order 164 -> 154; 2: 92; 3: 80; 4: need 50, order 164 -> 114;
    //   5: need 40, 164 -> 124; 6: need 5, 164 -> 159; 7: 71; 8: 19;
    //   9: need 105, 164 -> 59; 10: need 101, 164 -> 63;
    //   11: need 175, two lots 328 -> 153; 12: 112.
    // Stock sums to 1200: holding 0.4 x 1200 = 480; 7 setups x 54 = 378;
    // total 858, ending with 112 units in stock.
    let receipts = [
        164.0, 0.0, 0.0, 164.0, 164.0, 164.0, 0.0, 0.0, 164.0, 164.0, 328.0, 0.0,
    ];
    let evaluation = check_rule(&item, Rule::Eoq, &receipts, 858.0);
    assert_eq!(evaluation.items[0].ending_stock, 112.0);
    assert_eq!(evaluation.setups, 7);
}

#[test]
fn poq_on_silver_pyke_peterson_data_covers_two_months() {
    // Data: Silver, Pyke and Peterson 1998, ch. 6 (from memory); plan
    // hand-computed. P = max(1, round(164 / 100)) = 2 months per lot:
    //   1: 10 + 62 = 72; 3: 12 + 130 = 142; 5: 154 + 129 = 283;
    //   7: 88 + 52 = 140; 9: 124 + 160 = 284; 11: 238 + 41 = 279.
    // Each lot holds its second month's demand one month: 0.4 x (62 + 130 +
    // 129 + 52 + 160 + 41) = 0.4 x 574 = 229.60; 6 setups x 54 = 324;
    // total 553.60.
    let item = item(&SPP, 54.0, 0.4);
    assert_eq!(poq_interval(&item), 2);
    let receipts = [
        72.0, 0.0, 142.0, 0.0, 283.0, 0.0, 140.0, 0.0, 284.0, 0.0, 279.0, 0.0,
    ];
    check_rule(&item, Rule::Poq, &receipts, 553.6);
}

#[test]
fn poq_interval_is_at_least_one_bucket() {
    // Hand-computed. Demand 100 a bucket, setup 1, holding 1: EOQ =
    // round(sqrt(2 x 100 x 1 / 1)) = round(14.1) = 14; 14 / 100 rounds to
    // 0, so P = max(1, 0) = 1 and POQ is lot-for-lot.
    let item = item(&[100.0, 100.0, 100.0], 1.0, 1.0);
    assert_eq!(eoq_lot(&item), Some(14.0));
    assert_eq!(poq_interval(&item), 1);
    check_rule(&item, Rule::Poq, &[100.0, 100.0, 100.0], 3.0);
}

#[test]
fn poq_counts_buckets_without_demand() {
    // Hand-computed. Demand 30, 0, 30, 30; setup 60; holding 1. Mean 22.5;
    // EOQ = round(sqrt(2 x 22.5 x 60)) = round(51.96) = 52; P = round(52 /
    // 22.5) = round(2.31) = 2. The lot in 1 covers buckets 1-2 (30, as 2
    // has no demand); the next need is in 3, covering 3-4 (60).
    // Holding: 0 + 0 + 30 + 0 = 30; setups 120; total 150.
    let item = item(&[30.0, 0.0, 30.0, 30.0], 60.0, 1.0);
    assert_eq!(poq_interval(&item), 2);
    check_rule(&item, Rule::Poq, &[30.0, 0.0, 60.0, 0.0], 150.0);
}

// ---------------------------------------------------------------------------
// Silver-Meal
// ---------------------------------------------------------------------------

#[test]
fn silver_meal_on_nahmias_example() {
    // Nahmias (from memory): Silver-Meal costs $310 on this data.
    //   from 1: C(1) = 80; C(2) = (80 + 2 x 30) / 2 = 70;
    //           C(3) = (140 + 2 x 2 x 42) / 3 = 102.7 rises: lot 48
    //   from 3: C(1) = 80; C(2) = (80 + 2 x 5) / 2 = 45;
    //           C(3) = (90 + 2 x 2 x 20) / 3 = 56.7 rises: lot 47
    //   from 5: last bucket: lot 20
    // Cost 3 x 80 + 60 + 10 = 310.
    let item = item(&NAHMIAS, 80.0, 2.0);
    check_rule(
        &item,
        Rule::SilverMeal,
        &[48.0, 0.0, 47.0, 0.0, 20.0],
        310.0,
    );
}

#[test]
fn silver_meal_on_silver_pyke_peterson_data() {
    // Data: Silver, Pyke and Peterson 1998, ch. 6 (from memory); the
    // arithmetic is hand-computed here. Cost per month of each lot:
    //   from 1: 54, (54 + 0.4 x 62) / 2 = 39.40,
    //           (78.80 + 0.8 x 12) / 3 = 29.47,
    //           (88.40 + 1.2 x 130) / 4 = 61.10 rises: lot 84 (months 1-3)
    //   from 4: 54, (54 + 0.4 x 154) / 2 = 57.80 rises: lot 130
    //   from 5: 54, (54 + 0.4 x 129) / 2 = 52.80,
    //           (105.60 + 0.8 x 88) / 3 = 58.67 rises: lot 283
    //   from 7: 54, (54 + 0.4 x 52) / 2 = 37.40,
    //           (74.80 + 0.8 x 124) / 3 = 58.00 rises: lot 140
    //   from 9: 54, (54 + 0.4 x 160) / 2 = 59.00 rises: lot 124
    //   from 10: 54, (54 + 0.4 x 238) / 2 = 74.60 rises: lot 160
    //   from 11: 54, (54 + 0.4 x 41) / 2 = 35.20, horizon ends: lot 279
    // 7 setups = 378, holding 0.4 x 308 = 123.20: total 501.20, which is
    // also the Wagner-Whitin optimum of this data (tests/exact_published.rs).
    let item = item(&SPP, 54.0, 0.4);
    let receipts = [
        84.0, 0.0, 0.0, 130.0, 283.0, 0.0, 140.0, 0.0, 124.0, 160.0, 279.0, 0.0,
    ];
    check_rule(&item, Rule::SilverMeal, &receipts, 501.2);
}

#[test]
fn silver_meal_extends_while_the_cost_per_bucket_stays_equal() {
    // Hand-computed. Demand 20, 100, 50; setup 100; holding 1.
    //   C(1) = 100; C(2) = (100 + 100) / 2 = 100, equal: extend;
    //   C(3) = (200 + 2 x 50) / 3 = 100, equal: extend. One lot of 170.
    // Cost 100 + holding 150 + 50 = 300.
    let item = item(&[20.0, 100.0, 50.0], 100.0, 1.0);
    check_rule(&item, Rule::SilverMeal, &[170.0, 0.0, 0.0], 300.0);
}

#[test]
fn silver_meal_uses_per_bucket_holding_cost() {
    // Hand-computed. Demand 10, 10, 10; setup 100; holding 1, 50, 1 by
    // bucket (a dear month in bucket 2).
    //   from 1: C(1) = 100; C(2) = (100 + 1 x 10) / 2 = 55;
    //           C(3) = (110 + (1 + 50) x 10) / 3 = 206.7 rises: lot 20
    //   from 3: lot 10
    // Cost 2 x 100 + 10 x 1 (stock 10 at the end of bucket 1) = 210.
    let mut item = item(&[10.0, 10.0, 10.0], 100.0, 1.0);
    item.holding_cost = vec![1.0, 50.0, 1.0];
    check_rule(&item, Rule::SilverMeal, &[20.0, 0.0, 10.0], 210.0);
}

#[test]
fn silver_meal_uses_the_setup_cost_of_the_release_bucket() {
    // Hand-computed. Demand 0, 10, 10; lead time 1; setup 5, 200, 200 by
    // bucket; holding 1. The lot received in bucket 2 is released in
    // bucket 1, so its setup costs 5:
    //   C(1) = 5; C(2) = (5 + 10) / 2 = 7.5 rises: lot 10
    // The lot received in bucket 3 is released in bucket 2 (setup 200): 10.
    // Cost 5 + 200 = 205, no stock held.
    let mut item = item(&[0.0, 10.0, 10.0], 0.0, 1.0);
    item.setup_cost = vec![5.0, 200.0, 200.0];
    item.lead_time = 1;
    let evaluation = check_rule(&item, Rule::SilverMeal, &[0.0, 10.0, 10.0], 205.0);
    assert_eq!(evaluation.items[0].planned_releases, vec![10.0, 10.0, 0.0]);
}

// ---------------------------------------------------------------------------
// Least unit cost
// ---------------------------------------------------------------------------

#[test]
fn least_unit_cost_on_nahmias_example() {
    // Nahmias (from memory): least unit cost costs $340 on this data.
    //   from 1: 80 / 18 = 4.44; (80 + 60) / 48 = 2.92;
    //           (140 + 168) / 90 = 3.42 rises: lot 48
    //   from 3: 80 / 42 = 1.905; (80 + 10) / 47 = 1.915 rises: lot 42
    //   from 4: 80 / 5 = 16; (80 + 40) / 25 = 4.8, horizon ends: lot 25
    // Cost 3 x 80 + 60 + 40 = 340.
    let item = item(&NAHMIAS, 80.0, 2.0);
    check_rule(
        &item,
        Rule::LeastUnitCost,
        &[48.0, 0.0, 42.0, 25.0, 0.0],
        340.0,
    );
}

#[test]
fn least_unit_cost_extends_while_the_cost_per_unit_stays_equal() {
    // Hand-computed. Demand 50, 25, 10; setup 50; holding 1.
    //   50 / 50 = 1; (50 + 25) / 75 = 1, equal: extend;
    //   (75 + 2 x 10) / 85 = 1.118 rises: lot 75, then 10 in bucket 3.
    // Cost 2 x 50 + 25 = 125.
    let item = item(&[50.0, 25.0, 10.0], 50.0, 1.0);
    check_rule(&item, Rule::LeastUnitCost, &[75.0, 0.0, 10.0], 125.0);
}

// ---------------------------------------------------------------------------
// Part-period balancing
// ---------------------------------------------------------------------------

#[test]
fn part_period_balancing_on_nahmias_example() {
    // Nahmias (from memory): part-period balancing costs $310 on this data.
    //   from 1: holding 0 (80 away from the setup 80); + 2 x 30 = 60 (20
    //           away, closer); + 2 x 2 x 42 = 228 (148 away): lot 48
    //   from 3: 0 (80 away); + 2 x 5 = 10 (70 away); + 2 x 2 x 20 = 90 (10
    //           away, closer), horizon ends: lot 67
    // Cost 2 x 80 + 60 + 90 = 310.
    let item = item(&NAHMIAS, 80.0, 2.0);
    check_rule(
        &item,
        Rule::PartPeriodBalancing,
        &[48.0, 0.0, 67.0, 0.0, 0.0],
        310.0,
    );
}

#[test]
fn part_period_balancing_stops_when_not_strictly_closer() {
    // Hand-computed. Demand 30, 200; setup 100; holding 1. Holding of the
    // lot from 1 is 0 (100 away from the setup); adding bucket 2 makes it
    // 200 (also 100 away): not strictly closer, so the lot stops.
    // Two lots: cost 200.
    let item = item(&[30.0, 200.0], 100.0, 1.0);
    check_rule(&item, Rule::PartPeriodBalancing, &[30.0, 200.0], 200.0);
}

#[test]
fn part_period_balancing_on_silver_pyke_peterson_data() {
    // Data: Silver, Pyke and Peterson 1998, ch. 6 (from memory); the
    // arithmetic is hand-computed (distance of the lot's holding from 54):
    //   from 1: 0 (54); 24.8 (29.2); 34.4 (19.6); 34.4 + 156 (136.4): lot 84
    //   from 4: 0 (54); 61.6 (7.6); 61.6 + 103.2 (110.8): lot 284
    //   from 6: 0 (54); 35.2 (18.8); 35.2 + 41.6 = 76.8 (22.8): lot 217
    //   from 8: 0 (54); 49.6 (4.4); 49.6 + 128 (123.6): lot 176
    //   from 10: 0 (54); 95.2 (41.2) is closer; 95.2 + 32.8 = 128 (74):
    //            lot 398
    //   from 12: lot 41
    // Setups 6 x 54 = 324; holding 24.8 + 9.6 + 61.6 + 35.2 + 49.6 + 95.2
    // = 276; total 600.
    let item = item(&SPP, 54.0, 0.4);
    let receipts = [
        84.0, 0.0, 0.0, 284.0, 0.0, 217.0, 0.0, 176.0, 0.0, 398.0, 0.0, 41.0,
    ];
    check_rule(&item, Rule::PartPeriodBalancing, &receipts, 600.0);
}
