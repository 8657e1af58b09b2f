//! The end-of-horizon correction of a rolling run (`roll::horizon_end`),
//! checked on the case a handbook works by formula: constant demand.
//!
//! Demand 25 a week, setup 200, holding 1 a unit a week. A lot covering n
//! weeks costs 200 + 25 n (n - 1) / 2 in holding, so per week it costs
//! 200 / n + 12.5 (n - 1): 91.67 for n = 3, 87.50 for n = 4 (the least),
//! 90.00 for n = 5. That cycle is the economic time between orders of the
//! EOQ model, sqrt(2 x 200 / (1 x 25)) = 4 weeks; the per-period cost of a
//! cycle of n periods is the textbook one (common practice; any
//! inventory text's EOQ chapter).
//!
//! Rolled weekly with plans 6 weeks ahead, the plain plan of 6 weeks is
//! two lots of 3 (550 against 575 for 4 + 2), and only its first lot is
//! carried out before the next plan: 24 weeks cost 8 cycles of 3, 2,200.
//! With the correction, a setup received k weeks before the plan's end
//! (k < 4) is charged k/4 of 200, so 4 + 2 costs 200 + 150 + 100 + 25 =
//! 475 against 500 for 3 + 3, and the run repeats the economic cycle: 6
//! cycles of 4, 2,100, which is the least any plan can cost over the 24
//! weeks (weeks times the least cost per week). The numbers are invented.

mod common;

use common::{item, on_one_line as scenario, one_item_snapshots as snapshots};
use lotwright::roll::{roll, Quiet, RollOptions};

fn options(end_correction: bool) -> RollOptions {
    RollOptions {
        horizon: 6,
        frozen: 0,
        change_cost: 0.0,
        change_cost_per_unit: 0.0,
        method: "exact".into(),
        milp: Default::default(),
        service_level: None,
        end_correction,
    }
}

fn run(end_correction: bool, capacity: Option<f64>) -> lotwright::roll::RollResult {
    let weeks = 24;
    let base = scenario(vec![item(&[25.0; 30], 200.0, 1.0)], capacity);
    let forecast = [25.0; 6];
    let rows: Vec<&[f64]> = (0..weeks).map(|_| &forecast[..]).collect();
    let history = snapshots(30, &rows);
    roll(&base, &history, &options(end_correction), &Quiet).expect("a run")
}

fn lots(run: &lotwright::roll::RollResult) -> Vec<f64> {
    run.executed.receipts[0]
        .iter()
        .copied()
        .filter(|&q| q > 0.0)
        .collect()
}

#[test]
fn plain_rolling_plans_repeat_a_cycle_shorter_than_the_economic_one() {
    let plain = run(false, None);
    assert_eq!(lots(&plain), vec![75.0; 8]);
    assert!((plain.realised.total_cost() - 2_200.0).abs() < 1e-6);
    assert_eq!(plain.realised.fill_rate(), 1.0);
}

#[test]
fn the_correction_restores_the_economic_cycle_and_the_least_cost() {
    let corrected = run(true, None);
    assert_eq!(lots(&corrected), vec![100.0; 6]);
    assert!((corrected.realised.total_cost() - 2_100.0).abs() < 1e-6);
    assert_eq!(corrected.realised.fill_rate(), 1.0);
}

#[test]
fn the_shared_capacity_program_plans_the_same_with_the_correction() {
    // On a line of 1,000 units a week the exact method's capacity path
    // plans the item; the line never binds, so the lots are the same.
    let corrected = run(true, Some(1_000.0));
    assert_eq!(lots(&corrected), vec![100.0; 6]);
    assert!((corrected.realised.total_cost() - 2_100.0).abs() < 1e-6);
}
