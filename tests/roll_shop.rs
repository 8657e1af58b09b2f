//! The rolling run as the shop could carry it out: a week's releases cut
//! to the lines' capacity (`roll::shop`), and a week that cannot be met
//! planned with the units late and named (`roll::short`). Worked by hand
//! on invented data, and a property on random tiny rolls: no realised
//! figure rests on capacity that does not exist.

mod common;

use common::{item, on_one_line as scenario, snapshots};
use lotwright::model::Item;
use lotwright::roll::shop::Cut;
use lotwright::roll::short::Late;
use lotwright::roll::{roll, Quiet, Release, RollOptions};
use lotwright::solve::Status;
use proptest::collection::vec;
use proptest::prelude::*;

fn options(method: &str, horizon: usize, frozen: usize) -> RollOptions {
    RollOptions {
        horizon,
        frozen,
        change_cost: 0.0,
        change_cost_per_unit: 0.0,
        method: method.into(),
        milp: Default::default(),
        service_level: None,
        end_correction: false,
    }
}

/// One item, setup 100, holding 1, three weeks ahead, one frozen. Week 1
/// forecasts 10, 10, 10: one order of 30 now (100 + 20 + 10 = 130 beats
/// 210 for two). 10 are sold: 20 in stock. Week 2's forecast rises to 40
/// in week 2, inside the freeze, where the previous plan released
/// nothing: 20 cannot be had before week 3. The week is planned with 20
/// late at the end of week 2, not refused.
#[test]
fn a_week_that_cannot_be_met_is_planned_with_its_late_units_named() {
    let base = scenario(vec![item(&[10.0, 40.0, 10.0, 10.0], 100.0, 1.0)], None);
    let history = snapshots(
        4,
        &[
            vec![vec![10.0, 10.0, 10.0]],
            vec![vec![40.0, 10.0, 10.0]],
            vec![vec![10.0, 10.0]],
        ],
    );
    let run = roll(&base, &history, &options("exact", 3, 1), &Quiet).expect("a run");
    assert_eq!(run.executed.receipts[0][0], 30.0);
    let week = &run.weeks[1];
    assert_ne!(week.status, Status::Infeasible, "{:?}", week.notes);
    assert_eq!(
        week.late,
        vec![Late {
            item: 0,
            bucket: 1,
            quantity: 20.0
        }]
    );
    assert_eq!(run.weeks_late(), 1);
    assert!(run.weeks[0].late.is_empty() && run.weeks[2].late.is_empty());
}

/// Two items on one line of 50 a week; lot-for-lot releases 40 of A and
/// 30 of B in week 1: 20 over. Neither has stock, so both cover -1 week
/// without the order; on the tie the later item, B, is cut, by 20 to 10.
#[test]
fn the_shop_cuts_an_overloaded_week_in_the_stated_order() {
    let base = scenario(
        vec![
            Item::simple("A", &[40.0, 40.0], 10.0, 1.0),
            Item::simple("B", &[30.0, 30.0], 10.0, 1.0),
        ],
        Some(50.0),
    );
    let history = snapshots(
        2,
        &[
            vec![vec![40.0, 40.0], vec![30.0, 30.0]],
            vec![vec![40.0], vec![30.0]],
        ],
    );
    let run = roll(&base, &history, &options("lot-for-lot", 2, 0), &Quiet).expect("a run");
    assert_eq!(
        run.weeks[0].cuts,
        vec![Cut {
            item: 1,
            bucket: 0,
            resource: 0,
            quantity: 20.0
        }]
    );
    assert_eq!(run.weeks[0].overload, 20.0);
    assert_eq!(run.executed.receipts[0][0], 40.0);
    assert_eq!(run.executed.receipts[1][0], 10.0);
    assert!(run.realised.overloads.is_empty());
    assert!(run.realised.fill_rate() < 1.0);
}

/// The best carried quantities by brute force: every pair of whole-unit
/// quantities up to the planned ones that fits the line, the item that
/// cannot wait (less cover) kept as large as possible first, then the
/// other: the stated cut order, as an optimisation over all choices.
fn best_by_enumeration(
    planned: [u32; 2],
    per_unit: [u32; 2],
    setup_time: [u32; 2],
    capacity: u32,
    can_wait_longest: usize,
) -> [u32; 2] {
    let must = 1 - can_wait_longest;
    let load = |q: [u32; 2]| -> u32 {
        (0..2)
            .map(|i| {
                if q[i] > 0 {
                    per_unit[i] * q[i] + setup_time[i]
                } else {
                    0
                }
            })
            .sum()
    };
    let mut best: Option<[u32; 2]> = None;
    for a in 0..=planned[0] {
        for b in 0..=planned[1] {
            let q = [a, b];
            if load(q) > capacity {
                continue;
            }
            let better = match best {
                None => true,
                Some(o) => (q[must], q[can_wait_longest]) > (o[must], o[can_wait_longest]),
            };
            if better {
                best = Some(q);
            }
        }
    }
    best.expect("carrying nothing always fits")
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(24))]

    /// One week carried out (`shop::carry_out`) against brute force: two
    /// whole-unit items on one line, random planned releases, times per
    /// unit, setup times and capacity.
    #[test]
    fn a_week_carried_out_keeps_what_brute_force_keeps(
        planned in prop::array::uniform2(0u32..30),
        per_unit in prop::array::uniform2(1u32..4),
        setup_time in prop::array::uniform2(0u32..6),
        capacity in 0u32..90,
        cover in prop::array::uniform2(0u32..10),
    ) {
        let mut base = scenario(
            vec![Item::simple("A", &[0.0; 2], 10.0, 1.0), Item::simple("B", &[0.0; 2], 10.0, 1.0)],
            Some(capacity as f64),
        );
        for (i, route) in base.routings.iter_mut().enumerate() {
            route.per_unit = per_unit[i] as f64;
            route.setup_time = setup_time[i] as f64;
        }
        for item in &mut base.items {
            item.lot_multiple = Some(1.0);
        }
        let releases: Vec<Release> = (0..2)
            .filter(|&i| planned[i] > 0)
            .map(|i| Release { item: i, bucket: 0, quantity: planned[i] as f64 })
            .collect();
        let cover = [cover[0] as f64, cover[1] as f64];
        let carried = lotwright::roll::shop::carry_out(&base, 0, &releases, &cover);
        let mut got = [0.0; 2];
        for order in &carried.orders {
            got[order.item] += order.quantity;
        }
        // Ties in cover go to the later item, as the shop breaks them.
        let can_wait_longest = if cover[1] >= cover[0] { 1 } else { 0 };
        let best = best_by_enumeration(planned, per_unit, setup_time, capacity, can_wait_longest);
        prop_assert_eq!(got, [best[0] as f64, best[1] as f64], "cuts {:?}", carried.cuts);
        let cut: f64 = carried.cuts.iter().map(|c| c.quantity).sum();
        prop_assert!((cut - (planned[0] + planned[1]) as f64 + got[0] + got[1]).abs() < 1e-9);
    }

    /// Random tiny rolls (2 items, 4 to 6 weeks, one line): whatever the
    /// method plans, the orders carried out never load the line beyond
    /// its capacity in the realised evaluation, and nothing is cut in a
    /// run whose plans never overloaded it.
    #[test]
    fn orders_carried_out_always_fit_the_line(
        periods in 4usize..=6,
        demand in vec(vec(0u32..40, 6), 2),
        capacity in 20u32..80,
        rule in prop::sample::select(vec!["lot-for-lot", "eoq", "silver-meal", "exact"]),
    ) {
        let items: Vec<Item> = demand
            .iter()
            .enumerate()
            .map(|(i, row)| {
                let row: Vec<f64> = row[..periods].iter().map(|&q| q as f64).collect();
                let mut it = Item::simple(["A", "B"][i], &row, 30.0 + 20.0 * i as f64, 1.0);
                it.backlog_cost = Some(5.0);
                it
            })
            .collect();
        let rows: Vec<Vec<Vec<f64>>> = (0..periods)
            .map(|k| items.iter().map(|it| it.demand[k..].to_vec()).collect())
            .collect();
        let base = scenario(items, Some(capacity as f64));
        let history = snapshots(periods, &rows);
        let run = roll(&base, &history, &options(rule, 3, 0), &Quiet).expect("a run");
        prop_assert!(run.realised.overloads.is_empty(), "{:?}", run.realised.overloads);
        if run.overload_planned() == 0.0 {
            prop_assert_eq!(run.units_cut(), 0.0);
        }
        prop_assert!(run.units_cut() >= 0.0);
    }
}
