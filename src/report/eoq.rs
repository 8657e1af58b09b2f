//! Terminal output of the `eoq` command.

use std::fmt::Write;

use serde_json::{json, Value};

use super::{clean, money};
use crate::error::{Error, Result};
use crate::single::eoq::EoqResult;
use crate::single::eoq_units::{TimeUnit, TimeUnitHint, CARRYING_RATE_BAND};

/// One warning in words.
fn warning(hint: &TimeUnitHint) -> String {
    let same = "Demand and holding cost must be given per the same time unit";
    match *hint {
        TimeUnitHint::CycleUnderADay { cycle_days } => format!(
            "the lot lasts {}: more than one order a day. {same}: a weekly demand with a yearly holding cost gives a lot about 7 times too small",
            cycle_days.map_or("under a day even if the time unit is a year".to_string(), |d| format!("{:.2} days", d))
        ),
        TimeUnitHint::CycleOverAYear { cycle_days } => format!(
            "the lot lasts {}: fewer than one order a year. {same}: a yearly demand with a weekly holding cost gives a lot about 7 times too large",
            cycle_days.map_or("over a year even if the time unit is a day".to_string(), |d| format!("{:.0} days", d))
        ),
        TimeUnitHint::CarryingRate { yearly_rate } => format!(
            "the holding cost is {:.1} % of the unit cost a year, outside the {:.0} to {:.0} % a carrying rate usually lies in. {same}: a holding cost per week read as per year is 52 times too small",
            100.0 * yearly_rate,
            100.0 * CARRYING_RATE_BAND.0,
            100.0 * CARRYING_RATE_BAND.1
        ),
    }
}

/// The JSON of `eoq`: the result's fields, `time_unit` (or `null`),
/// `cycle_days` (with a time unit) and `warnings` (sentences, empty when
/// nothing looks wrong).
pub fn json(
    result: &EoqResult,
    time_unit: Option<TimeUnit>,
    hints: &[TimeUnitHint],
) -> Result<Value> {
    let mut value = serde_json::to_value(result).map_err(|e| Error::Internal(e.to_string()))?;
    if let Value::Object(map) = &mut value {
        map.insert("time_unit".into(), json!(time_unit.map(TimeUnit::name)));
        map.insert(
            "cycle_days".into(),
            json!(time_unit.map(|u| clean(result.cycle * u.days()))),
        );
        let warnings: Vec<String> = hints.iter().map(warning).collect();
        map.insert("warnings".into(), json!(warnings));
    }
    Ok(value)
}

fn number(value: f64) -> String {
    if value.abs() >= 100.0 {
        format!("{value:.1}")
    } else {
        format!("{value:.4}")
    }
}

/// The EOQ result in words and figures.
pub fn text(result: &EoqResult, time_unit: Option<TimeUnit>, hints: &[TimeUnitHint]) -> String {
    let mut out = String::new();
    let model = match result.model {
        "classic" => "classic EOQ",
        "production-rate" => "finite production rate (EPQ)",
        "backorders" => "EOQ with planned backorders",
        "production-rate+backorders" => "finite production rate with planned backorders",
        "price-breaks" => "EOQ with all-units quantity discounts",
        other => other,
    };
    let _ = writeln!(out, "Model: {model}");
    let _ = writeln!(out, "Economic lot:         {}", number(result.eoq));
    let per = time_unit.map_or("time unit", TimeUnit::name);
    let label = format!("Orders per {per}:");
    let _ = writeln!(out, "{label:<22}{}", number(result.orders));
    match time_unit {
        Some(unit) => {
            let _ = writeln!(
                out,
                "Time between orders:  {} {}s ({:.1} days)",
                number(result.cycle),
                unit.name(),
                result.cycle * unit.days()
            );
        }
        None => {
            let _ = writeln!(
                out,
                "Time between orders:  {} time units",
                number(result.cycle)
            );
        }
    }
    let _ = writeln!(
        out,
        "Maximum stock:        {}",
        number(result.max_inventory)
    );
    if result.max_backorder > 0.0 {
        let _ = writeln!(
            out,
            "Maximum backorder:    {}",
            number(result.max_backorder)
        );
    }
    if let Some(price) = result.unit_price {
        let _ = writeln!(out, "Unit price paid:      {}", money(price));
    }
    let _ = writeln!(out, "\nCost per {per} at the economic lot");
    let _ = writeln!(
        out,
        "  setup/order   {:>14}",
        money(result.setup_cost_per_time)
    );
    let _ = writeln!(
        out,
        "  holding       {:>14}",
        money(result.holding_cost_per_time)
    );
    if result.backorder_cost_per_time > 0.0 {
        let _ = writeln!(
            out,
            "  backorder     {:>14}",
            money(result.backorder_cost_per_time)
        );
    }
    if result.purchase_cost_per_time > 0.0 {
        let _ = writeln!(
            out,
            "  purchase      {:>14}",
            money(result.purchase_cost_per_time)
        );
    }
    let _ = writeln!(out, "  total         {:>14}", money(result.total_cost));
    if !result.candidates.is_empty() {
        let _ = writeln!(out, "\nPrice levels");
        let _ = writeln!(
            out,
            "  {:>12}  {:>12}  {:>12}  {:>14}",
            "from qty", "price", "best lot", "total cost"
        );
        for c in &result.candidates {
            let _ = writeln!(
                out,
                "  {:>12}  {:>12}  {:>12}  {:>14}",
                number(c.from_quantity),
                money(c.price),
                number(c.lot),
                money(c.total_cost)
            );
        }
    }
    if let Some(chosen) = &result.chosen_lot {
        let _ = writeln!(
            out,
            "\nA lot of {} costs {} per {per}: {} ({:.2} %) more than the economic lot.",
            super::quantity(chosen.lot),
            money(chosen.total_cost),
            money(chosen.extra_cost),
            chosen.extra_percent
        );
    }
    for hint in hints {
        let _ = writeln!(out, "\nWarning: {}.", warning(hint));
    }
    if time_unit.is_none() {
        let _ = writeln!(
            out,
            "\nDemand and holding cost are taken per the same time unit; --time-unit names it and checks the result."
        );
    }
    out
}
