//! JSON output of `plan` and `check`, with the keys of the contract in
//! PRODUCT.md. Numbers are cleaned of float noise so output is stable.

use serde::Serialize;
use serde_json::{json, Value};

use super::clean;
use crate::check::CheckReport;
use crate::eval::{Costs, Evaluation};
use crate::model::{Plan, Scenario};
use crate::multilevel::peg::{pegs, shortage_causes, Peg};
use crate::solve::{cautions, MethodResult, Outcome};

/// The unit of every item and resource, by id.
fn units(scenario: &Scenario) -> Value {
    let items: serde_json::Map<String, Value> = scenario
        .items
        .iter()
        .map(|item| (item.id.clone(), json!(item.unit)))
        .collect();
    let resources: serde_json::Map<String, Value> = scenario
        .resources
        .iter()
        .map(|r| (r.id.clone(), json!(r.unit)))
        .collect();
    json!({ "items": items, "resources": resources })
}

/// Adds the unit of the named item (key `item`) or resource (key
/// `resource`) to each entry of a list of faults.
fn add_units(scenario: &Scenario, list: &mut Value) {
    let Value::Array(entries) = list else {
        return;
    };
    for entry in entries {
        let Value::Object(map) = entry else {
            continue;
        };
        let unit = if let Some(id) = map.get("item").and_then(Value::as_str) {
            scenario
                .items
                .iter()
                .find(|i| i.id == id)
                .map(|i| i.unit.clone())
        } else if let Some(id) = map.get("resource").and_then(Value::as_str) {
            scenario
                .resources
                .iter()
                .find(|r| r.id == id)
                .map(|r| r.unit.clone())
        } else {
            None
        };
        if let Some(unit) = unit {
            map.insert("unit".into(), json!(unit));
        }
    }
}

/// Overtime used, summed over resources: a count only when they share a
/// unit (or there are none), else `null` (the overtime cost stands).
fn overtime_used(scenario: &Scenario, evaluation: &Evaluation) -> Option<f64> {
    (scenario.resources.is_empty() || scenario.capacity_unit().is_some())
        .then(|| clean(evaluation.overtime_used()))
}

fn costs(costs: &Costs) -> Value {
    let mut value = json!({
        "setup": clean(costs.setup),
        "holding": clean(costs.holding),
        "unit": clean(costs.unit),
        "backlog": clean(costs.backlog),
        "overtime": clean(costs.overtime),
        "total": clean(costs.total()),
    });
    // Only a rolling plan's window prices units moved from an earlier plan.
    if costs.change != 0.0 {
        value["change"] = json!(clean(costs.change));
    }
    value
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
    /// The item's unit of measure (items.csv `unit`).
    pub unit: String,
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
                        unit: item.unit.clone(),
                    });
                }
            }
        }
    }
    orders
}

/// Which parent orders make up each component requirement (empty without
/// a bill of material).
fn pegging(scenario: &Scenario, pegs: &[Peg]) -> Value {
    let calendar = &scenario.calendar;
    let list: Vec<Value> = pegs
        .iter()
        .map(|p| {
            json!({
                "component": scenario.items[p.component].id,
                "period": p.bucket + 1,
                "date": calendar.label(p.bucket),
                "quantity": clean(p.quantity),
                "parent": scenario.items[p.parent].id,
                "parent_period": p.parent_receipt + 1,
                "parent_quantity": clean(p.parent_quantity),
                "parent_kind": if p.firm { "firm" } else { "planned" },
            })
        })
        .collect();
    Value::Array(list)
}

/// Shortages, overloads and violations; with a bill of material each
/// shortage also says whose requirement it leaves short: `own_demand` units
/// of the item's own demand and `parent_orders` (parent, its order's
/// period, units short).
fn faults(scenario: &Scenario, evaluation: &Evaluation, pegs: &[Peg]) -> Value {
    let mut shortages = serde_json::to_value(&evaluation.shortages).unwrap_or(Value::Null);
    if scenario.has_bom() {
        let causes = shortage_causes(scenario, evaluation, pegs);
        if let Value::Array(list) = &mut shortages {
            for (entry, cause) in list.iter_mut().zip(causes) {
                if let Value::Object(map) = entry {
                    map.insert("own_demand".into(), json!(clean(cause.own_demand)));
                    let parents: Vec<Value> = cause
                        .parent_orders
                        .iter()
                        .map(|&(k, short)| {
                            let p = &pegs[k];
                            json!({
                                "parent": scenario.items[p.parent].id,
                                "parent_period": p.parent_receipt + 1,
                                "parent_quantity": clean(p.parent_quantity),
                                "short": clean(short),
                            })
                        })
                        .collect();
                    map.insert("parent_orders".into(), Value::Array(parents));
                }
            }
        }
    }
    let mut overloads = serde_json::to_value(&evaluation.overloads).unwrap_or(Value::Null);
    let mut violations = serde_json::to_value(&evaluation.violations).unwrap_or(Value::Null);
    for value in [&mut shortages, &mut overloads, &mut violations] {
        clean_numbers(value);
        add_units(scenario, value);
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

/// Why a plan is infeasible, as data (`null` when it is feasible).
fn reason(evaluation: &Evaluation) -> Value {
    let mut value = serde_json::to_value(evaluation.infeasibility()).unwrap_or(Value::Null);
    clean_numbers(&mut value);
    value
}

fn row(scenario: &Scenario, result: &MethodResult, reference: Option<f64>) -> Value {
    let evaluation = &result.evaluation;
    let total = evaluation.total_cost();
    let extra = reference
        .filter(|r| r.abs() > 1e-9)
        .map(|r| clean(100.0 * (total - r) / r.abs()));
    // Stock summed across items is a count only when they share a unit;
    // otherwise it is `null` and the values beside it stand.
    let stock_unit = scenario.stock_unit();
    let counted = |v: f64| stock_unit.map(|_| clean(v));
    let overtime_unit = scenario.capacity_unit();
    let overtime = overtime_used(scenario, evaluation);
    json!({
        "method": result.method,
        "status": result.status.name(),
        "feasible": evaluation.feasible,
        "total_cost": clean(total),
        "costs": costs(&evaluation.costs),
        "setups": evaluation.setups,
        "stock_unit": stock_unit,
        "average_stock": counted(evaluation.average_stock()),
        "average_stock_value": clean(evaluation.average_stock_value(scenario)),
        "ending_stock": counted(evaluation.items.iter().map(|r| r.ending_stock).sum()),
        "ending_stock_value": clean(evaluation.ending_stock_value()),
        "inventory_turns": evaluation.inventory_turns(scenario).map(clean),
        "buckets_of_cover": evaluation.buckets_of_cover().map(clean),
        "overtime_unit": overtime_unit,
        "overtime_used": overtime,
        "fill_rate": clean(evaluation.fill_rate()),
        "extra_cost_percent": extra,
        "reason": reason(evaluation),
        "notes": result.notes,
    })
}

/// The JSON of `plan`.
pub fn plan(scenario: &Scenario, outcome: &Outcome) -> Value {
    let chosen = &outcome.chosen;
    let evaluation = &chosen.evaluation;
    let pegged = pegs(scenario, evaluation);
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
                "unit": item.unit,
                "costs": costs(&record.costs),
                "setups": record.setups,
                "average_stock": clean(record.average_stock),
                "ending_stock": clean(record.ending_stock),
                "ending_stock_value": clean(record.ending_stock_value),
                "fill_rate": clean(record.fill_rate),
                "safety_stock": clean(item.safety_stock),
                "forecast_error": item.forecast_error.map(clean),
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
        "units": units(scenario),
        "method": chosen.method,
        "status": chosen.status.name(),
        "solver": chosen.solver(),
        "components": chosen.components,
        "total_cost": clean(chosen.total_cost()),
        "lower_bound": chosen.lower_bound.map(clean),
        "gap": chosen.gap().map(clean),
        "unavoidable_cost": clean(crate::eval::unavoidable_cost(scenario)),
        "controllable_gap": super::figures::controllable_gap(scenario, chosen).map(clean),
        "costs": costs(&evaluation.costs),
        "setups": evaluation.setups,
        "orders": orders(scenario, &chosen.plan),
        "pegging": pegging(scenario, &pegged),
        "items": items,
        "comparison": outcome.comparison.iter().map(|r| row(scenario, r, reference)).collect::<Vec<_>>(),
        "notes": chosen.notes,
        "cautions": cautions(scenario, chosen),
    });
    if let (Value::Object(map), Value::Object(extra)) =
        (&mut value, faults(scenario, evaluation, &pegged))
    {
        map.extend(extra);
    }
    value
}

/// An order of `crate::actions` (`null` for none).
fn order_ref(scenario: &Scenario, order: Option<crate::actions::OrderRef>) -> Value {
    order.map_or(Value::Null, |o| {
        json!({
            "period": o.period,
            "date": scenario.calendar.label(o.period - 1),
            "release_period": o.release_period,
            "quantity": clean(o.quantity),
        })
    })
}

/// The JSON of `check`.
pub fn check(scenario: &Scenario, report: &CheckReport) -> Value {
    let evaluation = &report.evaluation;
    let pegged = pegs(scenario, evaluation);
    let actions: Vec<Value> = report
        .actions
        .iter()
        .map(|a| {
            let order = a.order.or(a.target);
            json!({
                "item": a.item,
                "action": a.kind,
                "period": a.order.map(|o| o.period),
                "release_period": a.order.map(|o| o.release_period),
                "quantity": a.order.map(|o| clean(o.quantity)),
                "to_period": a.target.map(|o| o.period),
                "to_release_period": a.target.map(|o| o.release_period),
                "to_quantity": a.target.map(|o| clean(o.quantity)),
                "by": a.by,
                "release_now": a.release_now,
                "message": super::actions::action(scenario, a),
                "date": order.map(|o| scenario.calendar.label(o.period - 1)),
            })
        })
        .collect();
    let mut value = json!({
        "scenario": scenario.name,
        "units": units(scenario),
        "feasible": evaluation.feasible,
        "total_cost": clean(evaluation.total_cost()),
        "costs": costs(&evaluation.costs),
        "setups": evaluation.setups,
        "best_cost": report.best.as_ref().map(|b| clean(b.total_cost())),
        "best_status": report.best_status.map(|s| s.name()),
        "best_skipped": report.skipped,
        "best_note": super::actions::best_note(report),
        "best_orders": report.best.as_ref().map_or_else(Vec::new, |b| orders(scenario, &b.plan)),
        "saving": report.saving().map(clean),
        "findings": report.findings,
        "actions": actions,
        "pegging": pegging(scenario, &pegged),
    });
    if let (Value::Object(map), Value::Object(extra)) =
        (&mut value, faults(scenario, evaluation, &pegged))
    {
        map.extend(extra);
    }
    // Each shortage with the proposed orders around it.
    if let Some(Value::Array(list)) = value.get_mut("shortages") {
        for (entry, around) in list.iter_mut().zip(&report.shortage_orders) {
            if let Value::Object(map) = entry {
                map.insert("order".into(), order_ref(scenario, around.order));
                map.insert("next_order".into(), order_ref(scenario, around.next_order));
                map.insert("cause".into(), json!(super::actions::shortage(around)));
            }
        }
    }
    value
}

/// One side of `compare`: its plan's totals, status and notes.
fn side(side: &crate::compare::Side) -> Value {
    let result = &side.result;
    let evaluation = &result.evaluation;
    json!({
        "name": side.name,
        "scenario": side.scenario.name,
        "periods": side.scenario.periods(),
        "frozen_periods": side.scenario.frozen,
        "method": result.method,
        "status": result.status.name(),
        "solver": result.solver(),
        "feasible": evaluation.feasible,
        "total_cost": clean(result.total_cost()),
        "lower_bound": result.lower_bound.map(clean),
        "gap": result.gap().map(clean),
        "unavoidable_cost": clean(crate::eval::unavoidable_cost(&side.scenario)),
        "controllable_gap": super::figures::controllable_gap(&side.scenario, result).map(clean),
        "costs": costs(&evaluation.costs),
        "setups": evaluation.setups,
        "average_stock_value": clean(evaluation.average_stock_value(&side.scenario)),
        "ending_stock_value": clean(evaluation.ending_stock_value()),
        "overtime_used": overtime_used(&side.scenario, evaluation),
        "fill_rate": clean(evaluation.fill_rate()),
        "reason": reason(evaluation),
        "notes": result.notes,
        "cautions": cautions(&side.scenario, result),
    })
}

/// The unit of an item or resource in scenario A, else in B.
fn unit_in<'a>(
    c: &'a crate::compare::Comparison,
    find: impl Fn(&'a Scenario) -> Option<&'a String>,
) -> Option<&'a String> {
    find(&c.a.scenario).or_else(|| find(&c.b.scenario))
}

/// The JSON of `compare`: both sides, their difference (B - A), and the
/// figures of every item and resource on either side (`null` where one
/// scenario lacks it).
pub fn compare(c: &crate::compare::Comparison) -> Value {
    let (ea, eb) = (&c.a.result.evaluation, &c.b.result.evaluation);
    let diff = |x: f64, y: f64| clean(y - x);
    let items: Vec<Value> = c
        .items
        .iter()
        .map(|row| {
            let figures = |f: &Option<crate::compare::ItemFigures>| {
                f.as_ref().map(|f| {
                    json!({
                        "cost": clean(f.cost),
                        "setups": f.setups,
                        "average_stock": clean(f.average_stock),
                        "ending_stock": clean(f.ending_stock),
                        "fill_rate": clean(f.fill_rate),
                        "demand": clean(f.demand),
                    })
                })
            };
            let cost = |f: &Option<crate::compare::ItemFigures>| f.as_ref().map_or(0.0, |f| f.cost);
            json!({
                "item": row.id,
                "unit": unit_in(c, |s| s.items.iter().find(|i| i.id == row.id).map(|i| &i.unit)),
                "a": figures(&row.a),
                "b": figures(&row.b),
                "cost_difference": clean(cost(&row.b) - cost(&row.a)),
            })
        })
        .collect();
    let resources: Vec<Value> = c
        .resources
        .iter()
        .map(|row| {
            let figures = |f: &Option<crate::compare::ResourceFigures>| {
                f.as_ref().map(|f| {
                    json!({
                        "load": clean(f.load),
                        "capacity": clean(f.capacity),
                        "overtime": clean(f.overtime),
                        "busiest_period": f.peak.map(|(t, _)| t + 1),
                        "busiest_utilisation": f.peak.map(|(_, u)| clean(u)),
                    })
                })
            };
            json!({
                "resource": row.id,
                "unit": unit_in(c, |s| s.resources.iter().find(|r| r.id == row.id).map(|r| &r.unit)),
                "a": figures(&row.a),
                "b": figures(&row.b),
            })
        })
        .collect();
    json!({
        "a": side(&c.a),
        "b": side(&c.b),
        "difference": {
            "total_cost": diff(ea.total_cost(), eb.total_cost()),
            "costs": {
                "setup": diff(ea.costs.setup, eb.costs.setup),
                "holding": diff(ea.costs.holding, eb.costs.holding),
                "unit": diff(ea.costs.unit, eb.costs.unit),
                "backlog": diff(ea.costs.backlog, eb.costs.backlog),
                "overtime": diff(ea.costs.overtime, eb.costs.overtime),
            },
            "setups": eb.setups as i64 - ea.setups as i64,
            "average_stock_value": diff(ea.average_stock_value(&c.a.scenario), eb.average_stock_value(&c.b.scenario)),
            "overtime_used": overtime_used(&c.a.scenario, ea)
                .zip(overtime_used(&c.b.scenario, eb))
                .map(|(x, y)| clean(y - x)),
            "least_cost_range": c.difference_range().map(|(low, high)| [clean(low), clean(high)]),
            "within_gaps": c.within_gaps(),
        },
        "added_capacity": c.added_capacity().iter().map(|added| json!({
            "resource": added.resource,
            "added": clean(added.added),
            "price": added.price.map(clean),
            "cost": added.cost().map(clean),
        })).collect::<Vec<_>>(),
        "items_compared": c.items_compared(),
        "items": items,
        "resources": resources,
    })
}

/// The JSON of `roll`: the run's terms and, per method, the realised cost
/// and service, plan stability and every week's plan.
pub fn roll(run: &super::table::RollRun) -> Value {
    let calendar = &run.scenario.calendar;
    let methods: Vec<Value> = run
        .results
        .iter()
        .map(|r| {
            let e = &r.realised;
            let s = &r.stability;
            let weeks: Vec<Value> = r
                .weeks
                .iter()
                .map(|w| {
                    json!({
                        "period": w.bucket + 1,
                        "date": calendar.label(w.bucket),
                        "status": w.status.name(),
                        "plan_cost": clean(w.plan_cost),
                        "gap": w.gap.map(clean),
                        "share_changed": w.stability.map(|s| clean(s.share_changed())),
                        "units_moved": w.stability.map(|s| clean(s.quantity_moved)),
                        "notes": w.notes,
                        "late": w.late.iter().map(|l| json!({
                            "item": run.scenario.items[l.item].id,
                            "period": l.bucket + 1,
                            "date": calendar.label(l.bucket),
                            "quantity": clean(l.quantity),
                        })).collect::<Vec<_>>(),
                        "overload": clean(w.overload),
                        "units_cut": clean(w.units_cut()),
                        "units_late": clean(w.units_late()),
                        "cuts": w.cuts.iter().map(|c| json!({
                            "item": run.scenario.items[c.item].id,
                            "resource": run.scenario.resources[c.resource].id,
                            "quantity": clean(c.quantity),
                        })).collect::<Vec<_>>(),
                    })
                })
                .collect();
            json!({
                "method": r.label,
                "realised": {
                    "total_cost": clean(e.total_cost()),
                    "cost_without_unit": clean(e.total_cost() - e.costs.unit),
                    "ending_stock_value": clean(e.ending_stock_value()),
                    "costs": costs(&e.costs),
                    "setups": e.setups,
                    "fill_rate": clean(e.fill_rate()),
                    "average_stock": clean(e.average_stock()),
                    "shortages": e.shortages.len(),
                    "most_short": clean(r.most_short()),
                    "overload_planned": clean(r.overload_planned()),
                    "units_cut": clean(r.units_cut()),
                    "overloads": e.overloads.len(),
                },
                "stability": {
                    "mean_share_changed": clean(r.mean_share_changed()),
                    "orders_before": s.before,
                    "kept": s.unchanged,
                    "resized": s.changed,
                    "added": s.added,
                    "removed": s.removed,
                    "units_moved": clean(s.quantity_moved),
                    "units_before": clean(s.quantity_before),
                },
                "statuses": {
                    "optimal": r.count(crate::solve::Status::Optimal),
                    "feasible": r.count(crate::solve::Status::Feasible),
                    "infeasible": r.count(crate::solve::Status::Infeasible),
                    "unknown": r.count(crate::solve::Status::Unknown),
                    "late": r.weeks_late(),
                },
                "largest_gap": r.worst_gap().map(clean),
                "weeks": weeks,
            })
        })
        .collect();
    let safety = run.safety.as_ref().map(|(level, estimates)| {
        json!({
            "service_level": clean(*level),
            "items": run.scenario.items.iter().zip(estimates).map(|(item, e)| json!({
                "item": item.id,
                "errors": e.map(|e| e.errors),
                "error_sd": e.map(|e| clean(e.sigma)),
                "safety_stock": clean(e.map_or(item.safety_stock, |e| e.safety_stock.round().max(item.safety_stock))),
            })).collect::<Vec<_>>(),
        })
    });
    let frontier = run.frontier.then(|| {
        super::table::frontier_rows(run)
            .into_iter()
            .map(|r| {
                let c = &r.realised.costs;
                json!({
                    "method": r.label,
                    "change_cost": clean(r.change_cost),
                    "change_cost_per_unit": clean(r.change_cost_per_unit),
                    "cost_without_unit": clean(c.setup + c.holding + c.backlog + c.overtime),
                    "fill_rate": clean(r.realised.fill_rate()),
                    "units_moved": clean(r.stability.quantity_moved),
                    "mean_share_changed": clean(r.mean_share_changed()),
                })
            })
            .collect::<Vec<_>>()
    });
    let mut value = json!({
        "safety_stock": safety,
        "scenario": run.scenario.name,
        "bucket": calendar.kind.name(),
        "start": calendar.label(run.first),
        "plans": run.weeks,
        "horizon": run.horizon,
        "frozen_periods": run.frozen,
        "change_cost": clean(run.change_cost),
        "time_limit": run.time_limit,
        "methods": methods,
    });
    if let Some(rows) = frontier {
        value["frontier"] = json!(rows);
    }
    value
}
