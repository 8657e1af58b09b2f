//! Safety stock from forecast error in the rolling run: the estimate from
//! the snapshots, worked by hand, and its effect on the run.
//!
//! The formula is the textbook one (Silver, Pyke & Thomas, Inventory and
//! Production Management in Supply Chains, 4th ed., 2017; cited from
//! memory): safety stock = k x sigma x sqrt(L + R), k the normal quantile
//! of the cycle service level, R = 1 for a plan redone every week. The
//! data are invented.

mod common;

use common::{calendar, item};
use lotwright::input::Snapshot;
use lotwright::model::Scenario;
use lotwright::roll::{roll, safety_estimates, Quiet, RollOptions};

fn one_item(demand: &[f64], lead_time: usize) -> Scenario {
    let mut it = item(demand, 50.0, 1.0);
    it.lead_time = lead_time;
    Scenario {
        name: "safety".into(),
        currency: None,
        calendar: calendar(demand.len()),
        items: vec![it],
        resources: Vec::new(),
        routings: Vec::new(),
        frozen: 0,
        bom: Vec::new(),
        period_offset: 0,
    }
}

/// Snapshot k forecasts 20 for every bucket from k on, and bucket k's own
/// figure is what happened: 24, 18, 20, 26, 12, 20, ...
fn history(actual: &[f64], periods: usize) -> Vec<Snapshot> {
    actual
        .iter()
        .enumerate()
        .map(|(k, &happened)| {
            let mut demand = vec![0.0; periods];
            for (t, d) in demand.iter_mut().enumerate().skip(k) {
                *d = if t == k { happened } else { 20.0 };
            }
            Snapshot {
                bucket: k,
                demand: vec![demand],
                file: format!("{k}.csv").into(),
            }
        })
        .collect()
}

/// Errors (what happened less the forecast of a week before): 18 - 20,
/// 20 - 20, 26 - 20, 12 - 20 = -2, 0, 6, -8 from the second snapshot on,
/// then 4 more with bucket 5's 24: -2, 0, 6, -8, 4. Five errors: mean 0,
/// squares 4 + 0 + 36 + 64 + 16 = 120, sd sqrt(120 / 4) = 5.477. Lead time
/// 1, so sigma over 2 weeks is 5.477 x 1.414 = 7.746; at 95 % (k =
/// 1.644854) the safety stock is 12.741. With only the first four errors
/// (-2, 0, 6, -8: mean -1, squares 1 + 1 + 49 + 49 = 100, sd 5.774) it is
/// 13.430; with three there is no estimate.
#[test]
fn the_estimate_follows_the_errors_seen_so_far() {
    let actual = [24.0, 18.0, 20.0, 26.0, 12.0, 24.0];
    let base = one_item(&[20.0; 8], 1);
    let snapshots = history(&actual, 8);
    let all = safety_estimates(&base, &snapshots, 0.95, 6)[0].expect("five errors");
    assert_eq!(all.errors, 5);
    assert!((all.sigma - 30f64.sqrt()).abs() < 1e-9);
    assert!(
        (all.safety_stock - 12.741).abs() < 1e-3,
        "{}",
        all.safety_stock
    );
    let four = safety_estimates(&base, &snapshots, 0.95, 5)[0].expect("four errors");
    assert!(
        (four.safety_stock - 13.430).abs() < 1e-3,
        "{}",
        four.safety_stock
    );
    assert_eq!(safety_estimates(&base, &snapshots, 0.95, 4)[0], None);
}

/// The run holds the safety stock once it is known: from week 5 on (four
/// errors seen), the stock at the end of each week carried out stays at or
/// above that week's estimate where the forecast held (weeks 6 to 8 sell
/// the forecast 20; week 5 sells 12, less than forecast).
#[test]
fn a_run_with_a_service_level_plans_the_safety_stock() {
    let actual = [24.0, 18.0, 20.0, 26.0, 12.0, 20.0, 20.0, 20.0];
    let base = one_item(&[20.0; 10], 0);
    let snapshots = history(&actual, 10);
    let options = |level| RollOptions {
        horizon: 4,
        frozen: 0,
        change_cost: 0.0,
        change_cost_per_unit: 0.0,
        method: "exact".into(),
        milp: Default::default(),
        service_level: level,
        end_correction: false,
    };
    let plain = roll(&base, &snapshots, &options(None), &Quiet).expect("a run");
    let safe = roll(&base, &snapshots, &options(Some(0.95)), &Quiet).expect("a run");
    // Week 5 sees errors -2, 0, 6, -8: k x sd = 1.644854 x 5.774 = 9.50,
    // so 9 units; later weeks see more errors near 0 and hold a little less.
    let week5 = safety_estimates(&base, &snapshots, 0.95, 5)[0].unwrap();
    assert!((week5.safety_stock - 9.497).abs() < 1e-3);
    let on_hand = &safe.realised.items[0].on_hand;
    for t in 4..8 {
        let estimate = safety_estimates(&base, &snapshots, 0.95, t + 1)[0].unwrap();
        let held = estimate.safety_stock.round();
        assert!(held >= 6.0);
        assert!(on_hand[t] >= held - 1e-9, "week {}: {on_hand:?}", t + 1);
    }
    let plain_stock = &plain.realised.items[0].on_hand;
    assert!(
        plain_stock[4..8].iter().any(|&s| s < 6.0),
        "{plain_stock:?}"
    );
}

/// `plan --service-level 0.95` on an item with forecast_error 20 and a lead
/// time of 3 weeks: 1.644854 x 20 x sqrt(4) = 65.79, held as 66 (worked
/// in `model::safety`); the item without a forecast error keeps its own
/// safety stock of 5. A level outside 0.5 to 1 is refused.
#[test]
fn plan_sets_safety_stock_from_the_forecast_error_column() {
    let dir = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(6)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,lead_time,safety_stock,forecast_error\n\
             TRAY,60,0.5,3,,20\n\
             LID,40,0.2,0,5,\n",
        ),
        (
            "demand.csv",
            "item,period,quantity\nTRAY,4,50\nTRAY,5,50\nTRAY,6,50\nLID,2,30\nLID,4,30\n",
        ),
    ]);
    let run = |extra: &[&str]| {
        let mut args = vec!["plan", dir.path().to_str().unwrap(), "--json"];
        args.extend_from_slice(extra);
        std::process::Command::new(env!("CARGO_BIN_EXE_lotwright"))
            .args(&args)
            .output()
            .expect("runs")
    };
    let output = run(&["--service-level", "0.95"]);
    assert_eq!(
        output.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&output.stderr)
    );
    let value: serde_json::Value = serde_json::from_slice(&output.stdout).unwrap();
    let items = value["items"].as_array().unwrap();
    assert_eq!(items[0]["safety_stock"], 66.0);
    assert_eq!(items[0]["forecast_error"], 20.0);
    assert_eq!(items[1]["safety_stock"], 5.0);
    let plain: serde_json::Value = serde_json::from_slice(&run(&[]).stdout).unwrap();
    assert_eq!(plain["items"][0]["safety_stock"], 0.0);
    assert!(value["total_cost"].as_f64().unwrap() > plain["total_cost"].as_f64().unwrap());

    let refused = run(&["--service-level", "1.2"]);
    assert_eq!(refused.status.code(), Some(2));
}
