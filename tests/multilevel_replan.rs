//! A bill of material together with the replanning features: firm orders
//! and a freeze, `compare` with an override, and `roll`. Invented data,
//! worked by hand.

mod common;

use common::lotwright;

use lotwright::eval::evaluate;
use lotwright::roll::{roll, Quiet, RollOptions};
use serde_json::Value;

/// Frame F needs 2 of bracket B. F sells 10 in week 2 and 10 in week 4;
/// B has a firm order of 20 arriving in week 1 and nothing in stock.
/// Week 1 is frozen. Setups 100 (F) and 30 (B); holding 1 (F) and 0.1 (B).
///
/// By hand: nothing new may start in week 1, so F is made in week 2 (10,
/// or 20 held two weeks for 20 against a setup of 100: 20 in week 2 is
/// cheaper, 100 + 20 = 120 against 200). Its 20 call for 40 brackets in
/// week 2: the firm 20 cover half, so B makes 20 in week 2 (30, against
/// holding nothing more). Holding: B's 20 at the end of week 1 (2.00), F's
/// 10 at the end of weeks 2 and 3 (20). Total 100 + 30 + 30 (the firm
/// order's setup) + 2 + 20 = 182.
fn frame_and_bracket(frozen: bool) -> tempfile::TempDir {
    let toml = format!(
        "{}{}",
        common::weekly_toml(4),
        if frozen { "frozen_periods = 1\n" } else { "" }
    );
    common::scenario_dir(&[
        ("scenario.toml", &toml),
        (
            "items.csv",
            "item,setup_cost,holding_cost\nF,100,1\nB,30,0.1\n",
        ),
        ("demand.csv", "item,period,quantity\nF,2,10\nF,4,10\n"),
        ("bom.csv", "parent,component,quantity_per\nF,B,2\n"),
        ("orders-firm.csv", "item,period,quantity\nB,1,20\n"),
    ])
}

#[test]
fn firm_orders_and_a_freeze_carry_through_the_bill() {
    let dir = frame_and_bracket(true);
    let (code, stdout, stderr) = lotwright(&["plan", dir.path().to_str().unwrap(), "--json"]);
    assert_eq!(code, 0, "{stderr}");
    let v: Value = serde_json::from_str(&stdout).unwrap();
    assert_eq!(v["status"], "optimal", "{}", v["notes"]);
    common::assert_cost_eq(v["total_cost"].as_f64().unwrap(), 182.0, "the frozen plan");
    let orders: Vec<(String, u64, f64, String)> = v["orders"]
        .as_array()
        .unwrap()
        .iter()
        .map(|o| {
            (
                o["item"].as_str().unwrap().to_string(),
                o["period"].as_u64().unwrap(),
                o["quantity"].as_f64().unwrap(),
                o["kind"].as_str().unwrap().to_string(),
            )
        })
        .collect();
    assert_eq!(
        orders,
        vec![
            ("F".into(), 2, 20.0, "planned".into()),
            ("B".into(), 1, 20.0, "firm".into()),
            ("B".into(), 2, 20.0, "planned".into()),
        ]
    );
    // F's order calls for 40 brackets in week 2.
    let pegging = v["pegging"].as_array().unwrap();
    assert_eq!(pegging.len(), 1);
    assert_eq!(pegging[0]["quantity"].as_f64(), Some(40.0));
    assert_eq!(pegging[0]["period"].as_u64(), Some(2));
    // Every level-by-level row keeps the firm order and the freeze too.
    for row in v["comparison"].as_array().unwrap() {
        assert_ne!(row["status"], "infeasible", "{row}");
    }
}

/// `compare` with the frame's demand doubled: the bracket's requirement
/// doubles with it (it has no demand of its own, no stock and no ending
/// stock, so it needs twice the frame's releases, whatever the lots).
#[test]
fn compare_explodes_an_override_into_the_parts() {
    let dir = frame_and_bracket(false);
    let (code, stdout, stderr) = lotwright(&[
        "compare",
        dir.path().to_str().unwrap(),
        "--set",
        "demand.F=200%",
        "--json",
    ]);
    assert_eq!(code, 0, "{stderr}");
    let v: Value = serde_json::from_str(&stdout).unwrap();
    let bracket = v["items"]
        .as_array()
        .unwrap()
        .iter()
        .find(|i| i["item"] == "B")
        .expect("the bracket's row");
    assert_eq!(bracket["a"]["demand"].as_f64(), Some(40.0));
    assert_eq!(bracket["b"]["demand"].as_f64(), Some(80.0));
}

/// The exact method rolled over `snapshots` (file name, contents), written
/// into DIR/history, each plan 2 weeks ahead, nothing frozen.
fn roll_exact(dir: &tempfile::TempDir, snapshots: &[(&str, &str)]) -> lotwright::roll::RollResult {
    let base = lotwright::input::read_scenario(dir.path()).unwrap();
    let history_dir = dir.path().join("history");
    std::fs::create_dir_all(&history_dir).unwrap();
    common::write_files(&history_dir, snapshots);
    let history = lotwright::input::read_history(&history_dir, &base).unwrap();
    let options = RollOptions {
        horizon: 2,
        frozen: 0,
        change_cost: 0.0,
        change_cost_per_unit: 0.0,
        method: "exact".into(),
        milp: Default::default(),
        service_level: None,
        end_correction: false,
    };
    roll(&base, &history, &options, &Quiet).expect("a run")
}

/// `roll` over three weekly forecasts of the frame: the orders carried out
/// are evaluated across both levels. The bracket's realised requirement is
/// twice the frame's lots carried out, read from the executed plan, and
/// every sale that happened is made on time.
#[test]
fn a_rolling_run_explodes_what_was_carried_out() {
    let dir = frame_and_bracket(false);
    let run = roll_exact(
        &dir,
        &[
            ("2027-01-04.csv", "item,period,quantity\nF,2,10\n"),
            ("2027-01-11.csv", "item,period,quantity\nF,1,12\nF,2,4\n"),
            ("2027-01-18.csv", "item,period,quantity\nF,1,6\nF,2,10\n"),
        ],
    );
    // F has no lead time and no firm orders of its own, so what it received
    // in a week is what it released then.
    let bracket = &run.realised.items[1];
    for t in 0..run.realised_scenario.periods() {
        let released = run.executed.receipts[0][t];
        common::assert_cost_eq(
            bracket.dependent_requirement[t],
            2.0 * released,
            "B's requirement",
        );
    }
    // The sales that happened (each snapshot's first week: 0, 12, 6) are made.
    assert!(run.executed.receipts[0].iter().sum::<f64>() >= 18.0 - 1e-9);
    assert!(
        (run.realised.fill_rate() - 1.0).abs() < 1e-9,
        "{:?} {:?} {:?}",
        run.realised.shortages,
        run.executed.receipts,
        run.weeks
            .iter()
            .map(|w| (w.status, w.notes.clone()))
            .collect::<Vec<_>>()
    );
    let evaluation = evaluate(&run.realised_scenario, &run.executed);
    common::assert_cost_eq(
        run.realised.total_cost(),
        evaluation.total_cost(),
        "the realised cost is the evaluation's",
    );
}

/// A firm order of a parent with a lead time, in a rolling run: frame F
/// (lead time 1) has a firm order of 10 received in week 2, for its sale of
/// 10 then; bracket B (1 per frame) has 10 in stock. Carried out in week 1,
/// the firm order is an open order from then on; week 2's plan must not
/// receive it a second time, nor call for its brackets again. By hand: no
/// other order is needed, and B's 10 are issued in week 1, so nothing is
/// held at the end of any week. The realised cost is F's firm setup, 100.
#[test]
fn a_parents_firm_order_is_carried_out_once_in_a_rolling_run() {
    let dir = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(4)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,initial_stock,lead_time\nF,100,1,0,1\nB,30,0.1,10,0\n",
        ),
        ("demand.csv", "item,period,quantity\nF,2,10\n"),
        ("bom.csv", "parent,component,quantity_per\nF,B,1\n"),
        ("orders-firm.csv", "item,period,quantity\nF,2,10\n"),
    ]);
    let run = roll_exact(
        &dir,
        &[
            ("2027-01-04.csv", "item,period,quantity\nF,2,10\n"),
            ("2027-01-11.csv", "item,period,quantity\nF,1,10\n"),
            ("2027-01-18.csv", "item,period,quantity\n"),
        ],
    );
    assert_eq!(
        run.executed.receipts[0],
        vec![0.0, 10.0, 0.0, 0.0],
        "F received once"
    );
    assert_eq!(run.executed.receipts[1], vec![0.0; 4], "no bracket ordered");
    assert!(run.realised.feasible, "{:?}", run.realised.shortages);
    common::assert_cost_eq(run.realised.total_cost(), 100.0, "the realised cost");
}
