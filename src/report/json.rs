//! JSON output of `plan` and `check`, with the keys of the contract in
//! PRODUCT.md. Numbers are cleaned of float noise so output is stable.

use serde::Serialize;
use serde_json::{json, Value};

use super::clean;
use crate::check::CheckReport;
use crate::eval::{Costs, Evaluation, ViolationKind};
use crate::model::{Plan, Scenario};
use crate::multilevel::peg::{pegs, shortage_causes, Peg};
use crate::solve::{cautions, Outcome};

mod plan;

pub use plan::{plan_document, PlanDocument};

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

/// Overtime used, summed over resources: a count only when they share a
/// unit (or there are none), else `null` (the overtime cost stands).
fn overtime_used(scenario: &Scenario, evaluation: &Evaluation) -> Option<f64> {
    (scenario.resources.is_empty() || scenario.capacity_unit().is_some())
        .then(|| clean(evaluation.overtime_used()))
}

fn costs(costs: &Costs) -> Value {
    serde_json::to_value(plan::CostsJson::from(costs)).unwrap_or(Value::Null)
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
    let dates = Dates::of(scenario);
    order_list(scenario, plan)
        .map(|order| Order {
            item: scenario.items[order.item].id.clone(),
            period: order.bucket + 1,
            date: dates.at(order.bucket as i64).into_owned(),
            release_period: order.release + 1,
            release_date: dates.at(order.release).into_owned(),
            quantity: order.quantity,
            kind: order.kind,
            unit: scenario.items[order.item].unit.clone(),
        })
        .collect()
}

/// An order by the numbers: item index, receipt and release buckets.
struct OrderAt {
    item: usize,
    bucket: usize,
    /// The release bucket, negative before the horizon.
    release: i64,
    quantity: f64,
    kind: &'static str,
}

/// `orders`, one at a time, as they are read off the plan.
fn order_list<'a>(scenario: &'a Scenario, plan: &'a Plan) -> impl Iterator<Item = OrderAt> + 'a {
    scenario
        .items
        .iter()
        .zip(&plan.receipts)
        .enumerate()
        .flat_map(move |(i, (item, row))| {
            row.iter().enumerate().flat_map(move |(t, &quantity)| {
                [(item.firm[t], "firm"), (quantity, "planned")]
                    .into_iter()
                    .filter(|&(quantity, _)| quantity > 0.0)
                    .map(move |(quantity, kind)| OrderAt {
                        item: i,
                        bucket: t,
                        release: t as i64 - item.lead_time as i64,
                        quantity: clean(quantity),
                        kind,
                    })
            })
        })
}

/// The dates of the buckets orders fall in, written once rather than for
/// every order: the horizon and, for releases before it, as far back as
/// the longest lead time (at most a horizon's length; older ones are
/// written when asked for).
struct Dates<'a> {
    calendar: &'a crate::model::Calendar,
    first: i64,
    texts: Vec<String>,
}

impl<'a> Dates<'a> {
    fn of(scenario: &'a Scenario) -> Dates<'a> {
        let periods = scenario.periods() as i64;
        let lead = scenario
            .items
            .iter()
            .map(|i| i.lead_time)
            .max()
            .unwrap_or(0);
        let first = -(lead.min(scenario.periods()) as i64);
        let calendar = &scenario.calendar;
        Dates {
            calendar,
            first,
            texts: (first..periods)
                .map(|k| Dates::write(calendar, k))
                .collect(),
        }
    }

    fn write(calendar: &crate::model::Calendar, bucket: i64) -> String {
        calendar
            .signed_bucket_start(bucket)
            .format("%Y-%m-%d")
            .to_string()
    }

    /// The start date of a bucket (negative: before the horizon).
    fn at(&self, bucket: i64) -> std::borrow::Cow<'_, str> {
        match usize::try_from(bucket - self.first) {
            Ok(k) if k < self.texts.len() => self.texts[k].as_str().into(),
            _ => Dates::write(self.calendar, bucket).into(),
        }
    }
}

/// An order in the JSON: the keys in sorted order (see `plan`).
#[derive(Serialize)]
struct OrderJson<'a> {
    date: std::borrow::Cow<'a, str>,
    item: &'a str,
    kind: &'static str,
    period: usize,
    quantity: f64,
    release_date: std::borrow::Cow<'a, str>,
    release_period: i64,
    unit: &'a str,
}

impl<'a> OrderJson<'a> {
    fn new(scenario: &'a Scenario, dates: &'a Dates, order: OrderAt) -> OrderJson<'a> {
        OrderJson {
            date: dates.at(order.bucket as i64),
            item: &scenario.items[order.item].id,
            kind: order.kind,
            period: order.bucket + 1,
            quantity: order.quantity,
            release_date: dates.at(order.release),
            release_period: order.release + 1,
            unit: &scenario.items[order.item].unit,
        }
    }
}

/// One entry of `pegging`: a parent order's call on a component.
#[derive(Serialize)]
struct PegJson<'a> {
    component: &'a str,
    date: String,
    parent: &'a str,
    parent_kind: &'static str,
    parent_period: usize,
    parent_quantity: f64,
    period: usize,
    quantity: f64,
}

/// Which parent orders make up each component requirement (empty without
/// a bill of material).
fn pegging<'a>(scenario: &'a Scenario, pegs: &[Peg]) -> Vec<PegJson<'a>> {
    let calendar = &scenario.calendar;
    pegs.iter()
        .map(|p| PegJson {
            component: &scenario.items[p.component].id,
            date: calendar.label(p.bucket),
            parent: &scenario.items[p.parent].id,
            parent_kind: if p.firm { "firm" } else { "planned" },
            parent_period: p.parent_receipt + 1,
            parent_quantity: clean(p.parent_quantity),
            period: p.bucket + 1,
            quantity: clean(p.quantity),
        })
        .collect()
}

/// A parent order that a component's shortage leaves without parts.
#[derive(Serialize)]
struct ParentOrderJson<'a> {
    parent: &'a str,
    parent_period: usize,
    parent_quantity: f64,
    short: f64,
}

#[derive(Serialize)]
struct ShortageJson<'a> {
    item: &'a str,
    #[serde(skip_serializing_if = "Option::is_none")]
    own_demand: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    parent_orders: Option<Vec<ParentOrderJson<'a>>>,
    period: usize,
    quantity: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    unit: Option<&'a str>,
}

#[derive(Serialize)]
struct OverloadJson<'a> {
    capacity: f64,
    excess: f64,
    load: f64,
    period: usize,
    resource: &'a str,
    #[serde(skip_serializing_if = "Option::is_none")]
    unit: Option<&'a str>,
}

#[derive(Serialize)]
struct ViolationJson<'a> {
    binding: bool,
    item: &'a str,
    kind: ViolationKind,
    limit: f64,
    period: usize,
    quantity: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    unit: Option<&'a str>,
}

/// The unit of an item or a resource by its id, found by a table built
/// only when there are faults to name.
struct UnitOf<'a> {
    items: std::collections::HashMap<&'a str, &'a str>,
    resources: std::collections::HashMap<&'a str, &'a str>,
}

impl<'a> UnitOf<'a> {
    fn new(scenario: &'a Scenario, evaluation: &Evaluation) -> UnitOf<'a> {
        let items = if evaluation.shortages.is_empty() && evaluation.violations.is_empty() {
            Default::default()
        } else {
            let units = scenario
                .items
                .iter()
                .map(|i| (i.id.as_str(), i.unit.as_str()));
            units.collect()
        };
        let resources = if evaluation.overloads.is_empty() {
            Default::default()
        } else {
            let units = scenario
                .resources
                .iter()
                .map(|r| (r.id.as_str(), r.unit.as_str()));
            units.collect()
        };
        UnitOf { items, resources }
    }

    fn item(&self, id: &str) -> Option<&'a str> {
        self.items.get(id).copied()
    }

    fn resource(&self, id: &str) -> Option<&'a str> {
        self.resources.get(id).copied()
    }
}

/// Shortages, overloads and violations of one evaluation.
struct Faults<'a> {
    shortages: Vec<ShortageJson<'a>>,
    overloads: Vec<OverloadJson<'a>>,
    violations: Vec<ViolationJson<'a>>,
}

/// Shortages, overloads and violations; with a bill of material each
/// shortage also says whose requirement it leaves short: `own_demand` units
/// of the item's own demand and `parent_orders` (parent, its order's
/// period, units short). Each names the unit of its item or resource.
fn faults<'a>(scenario: &'a Scenario, evaluation: &'a Evaluation, pegs: &[Peg]) -> Faults<'a> {
    let unit = UnitOf::new(scenario, evaluation);
    let mut shortages: Vec<ShortageJson> = evaluation
        .shortages
        .iter()
        .map(|s| ShortageJson {
            item: &s.item,
            own_demand: None,
            parent_orders: None,
            period: s.period,
            quantity: clean(s.quantity),
            unit: unit.item(&s.item),
        })
        .collect();
    if scenario.has_bom() {
        let causes = shortage_causes(scenario, evaluation, pegs);
        for (entry, cause) in shortages.iter_mut().zip(causes) {
            entry.own_demand = Some(clean(cause.own_demand));
            entry.parent_orders = Some(
                cause
                    .parent_orders
                    .iter()
                    .map(|&(k, short)| {
                        let p = &pegs[k];
                        ParentOrderJson {
                            parent: &scenario.items[p.parent].id,
                            parent_period: p.parent_receipt + 1,
                            parent_quantity: clean(p.parent_quantity),
                            short: clean(short),
                        }
                    })
                    .collect(),
            );
        }
    }
    let overloads = evaluation
        .overloads
        .iter()
        .map(|o| OverloadJson {
            capacity: clean(o.capacity),
            excess: clean(o.excess),
            load: clean(o.load),
            period: o.period,
            resource: &o.resource,
            unit: unit.resource(&o.resource),
        })
        .collect();
    let violations = evaluation
        .violations
        .iter()
        .map(|v| ViolationJson {
            binding: v.binding,
            item: &v.item,
            kind: v.kind,
            limit: clean(v.limit),
            period: v.period,
            quantity: clean(v.quantity),
            unit: unit.item(&v.item),
        })
        .collect();
    Faults {
        shortages,
        overloads,
        violations,
    }
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

/// The JSON of `plan` as a value (`plan_document` writes the same text
/// without building it).
/// The JSON of `plan` as a value (`plan_document` writes the same text
/// without building it).
pub fn plan(scenario: &Scenario, outcome: &Outcome) -> Value {
    serde_json::to_value(plan_document(scenario, outcome)).unwrap_or(Value::Null)
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
    let faults = faults(scenario, evaluation, &pegged);
    if let Value::Object(map) = &mut value {
        let list = |v: Result<Value, _>| v.unwrap_or(Value::Null);
        map.insert(
            "shortages".into(),
            list(serde_json::to_value(&faults.shortages)),
        );
        map.insert(
            "overloads".into(),
            list(serde_json::to_value(&faults.overloads)),
        );
        map.insert(
            "violations".into(),
            list(serde_json::to_value(&faults.violations)),
        );
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
                    "cost_per_unit_served": r.cost_per_unit_served().map(clean),
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
        "end_correction": run.end_correction,
        "time_limit": run.time_limit,
        "methods": methods,
    });
    if let Some(rows) = frontier {
        value["frontier"] = json!(rows);
    }
    value
}
