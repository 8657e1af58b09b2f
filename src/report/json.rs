//! JSON output of `plan` and `check`, with the keys of the contract in
//! PRODUCT.md. Numbers are cleaned of float noise so output is stable.

use serde::Serialize;
use serde_json::{json, Value};

use super::clean;
use crate::check::CheckReport;
use crate::eval::{Costs, Evaluation};
use crate::model::{Plan, Scenario};
use crate::solve::{cautions, MethodResult, Outcome};

fn costs(costs: &Costs) -> Value {
    json!({
        "setup": clean(costs.setup),
        "holding": clean(costs.holding),
        "unit": clean(costs.unit),
        "backlog": clean(costs.backlog),
        "overtime": clean(costs.overtime),
        "total": clean(costs.total()),
    })
}

/// One order of a plan as the outputs list it.
#[derive(Debug, Clone, Serialize)]
pub struct Order {
    pub item: String,
    pub period: usize,
    pub date: String,
    pub release_period: i64,
    pub release_date: String,
    pub quantity: f64,
    /// `planned` (the method's order) or `firm` (orders-firm.csv, kept as
    /// it is).
    pub kind: &'static str,
}

/// The orders of a plan and the scenario's firm orders, by item then
/// receipt bucket (a firm order first where both fall in one bucket).
pub fn orders(scenario: &Scenario, plan: &Plan) -> Vec<Order> {
    let calendar = &scenario.calendar;
    let mut orders = Vec::new();
    for (item, row) in scenario.items.iter().zip(&plan.receipts) {
        for (t, &quantity) in row.iter().enumerate() {
            for (quantity, kind) in [(item.firm[t], "firm"), (quantity, "planned")] {
                if quantity > 0.0 {
                    let release = t as i64 - item.lead_time as i64;
                    orders.push(Order {
                        item: item.id.clone(),
                        period: t + 1,
                        date: calendar.label(t),
                        release_period: release + 1,
                        release_date: calendar
                            .signed_bucket_start(release)
                            .format("%Y-%m-%d")
                            .to_string(),
                        quantity: clean(quantity),
                        kind,
                    });
                }
            }
        }
    }
    orders
}

fn faults(evaluation: &Evaluation) -> Value {
    let mut shortages = serde_json::to_value(&evaluation.shortages).unwrap_or(Value::Null);
    let mut overloads = serde_json::to_value(&evaluation.overloads).unwrap_or(Value::Null);
    let mut violations = serde_json::to_value(&evaluation.violations).unwrap_or(Value::Null);
    for value in [&mut shortages, &mut overloads, &mut violations] {
        clean_numbers(value);
    }
    json!({ "shortages": shortages, "overloads": overloads, "violations": violations })
}

/// Rounds every number in a JSON value in place.
fn clean_numbers(value: &mut Value) {
    match value {
        Value::Number(n) => {
            if let Some(f) = n.as_f64() {
                if n.is_f64() {
                    *value = json!(clean(f));
                }
            }
        }
        Value::Array(items) => items.iter_mut().for_each(clean_numbers),
        Value::Object(map) => map.values_mut().for_each(clean_numbers),
        _ => {}
    }
}

fn row(scenario: &Scenario, result: &MethodResult, reference: Option<f64>) -> Value {
    let evaluation = &result.evaluation;
    let total = evaluation.total_cost();
    let extra = reference
        .filter(|r| r.abs() > 1e-9)
        .map(|r| clean(100.0 * (total - r) / r.abs()));
    json!({
        "method": result.method,
        "status": result.status.name(),
        "feasible": evaluation.feasible,
        "total_cost": clean(total),
        "costs": costs(&evaluation.costs),
        "setups": evaluation.setups,
        "average_stock": clean(evaluation.average_stock()),
        "average_stock_value": clean(evaluation.average_stock_value(scenario)),
        "ending_stock": clean(evaluation.items.iter().map(|r| r.ending_stock).sum()),
        "ending_stock_value": clean(evaluation.ending_stock_value()),
        "inventory_turns": evaluation.inventory_turns(scenario).map(clean),
        "buckets_of_cover": evaluation.buckets_of_cover().map(clean),
        "overtime_used": clean(evaluation.overtime_used()),
        "fill_rate": clean(evaluation.fill_rate()),
        "extra_cost_percent": extra,
        "notes": result.notes,
    })
}

/// The JSON of `plan`.
pub fn plan(scenario: &Scenario, outcome: &Outcome) -> Value {
    let chosen = &outcome.chosen;
    let evaluation = &chosen.evaluation;
    let reference = outcome
        .comparison
        .iter()
        .find(|r| r.is_exact() && r.evaluation.feasible)
        .map(|r| r.total_cost());
    let items: Vec<Value> = scenario
        .items
        .iter()
        .zip(&evaluation.items)
        .map(|(item, record)| {
            json!({
                "item": item.id,
                "costs": costs(&record.costs),
                "setups": record.setups,
                "average_stock": clean(record.average_stock),
                "ending_stock": clean(record.ending_stock),
                "ending_stock_value": clean(record.ending_stock_value),
                "fill_rate": clean(record.fill_rate),
            })
        })
        .collect();
    let mut value = json!({
        "scenario": scenario.name,
        "start": scenario.calendar.label(0),
        "bucket": scenario.calendar.kind.name(),
        "periods": scenario.periods(),
        "frozen_periods": scenario.frozen,
        "currency": scenario.currency,
        "method": chosen.method,
        "status": chosen.status.name(),
        "solver": chosen.solver(),
        "components": chosen.components,
        "total_cost": clean(chosen.total_cost()),
        "lower_bound": chosen.lower_bound.map(clean),
        "gap": chosen.gap().map(clean),
        "costs": costs(&evaluation.costs),
        "setups": evaluation.setups,
        "orders": orders(scenario, &chosen.plan),
        "items": items,
        "comparison": outcome.comparison.iter().map(|r| row(scenario, r, reference)).collect::<Vec<_>>(),
        "notes": chosen.notes,
        "cautions": cautions(scenario, chosen),
    });
    if let (Value::Object(map), Value::Object(extra)) = (&mut value, faults(evaluation)) {
        map.extend(extra);
    }
    value
}

/// The JSON of `check`.
pub fn check(scenario: &Scenario, report: &CheckReport) -> Value {
    let evaluation = &report.evaluation;
    let mut value = json!({
        "scenario": scenario.name,
        "feasible": evaluation.feasible,
        "total_cost": clean(evaluation.total_cost()),
        "costs": costs(&evaluation.costs),
        "setups": evaluation.setups,
        "best_cost": report.best.as_ref().map(|b| clean(b.total_cost())),
        "best_status": report.best.as_ref().map(|b| b.status.name()),
        "saving": report.saving().map(clean),
        "findings": report.findings,
    });
    if let (Value::Object(map), Value::Object(extra)) = (&mut value, faults(evaluation)) {
        map.extend(extra);
    }
    value
}
