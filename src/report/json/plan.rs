//! The JSON of `plan` as a document that serialises straight to a writer:
//! no tree of values, no list of every order held in memory. Keys are
//! declared in sorted order, the order a `serde_json::Value` prints them in,
//! so both ways give the same text (tests/plan_json.rs and tests/pegging.rs
//! hold them to it, and tests/plan_json.rs to every key of the contract).

use rayon::prelude::*;
use serde::{Serialize, Serializer};
use serde_json::Value;

use super::{
    clean, faults, order_list, overtime_used, pegging, reason, Dates, Faults, OrderJson, PegJson,
};
use crate::eval::{unavoidable_cost, Costs, Evaluation};
use crate::model::{Plan, Scenario};
use crate::multilevel::peg::pegs;
use crate::solve::{cautions, Component, MethodResult, Outcome};

fn is_zero(value: &f64) -> bool {
    *value == 0.0
}

/// Cost by kind, cleaned of float noise.
#[derive(Serialize)]
pub(super) struct CostsJson {
    backlog: f64,
    /// Only a rolling plan's window prices units moved from an earlier
    /// plan; elsewhere the key is left out.
    #[serde(skip_serializing_if = "is_zero")]
    change: f64,
    holding: f64,
    overtime: f64,
    setup: f64,
    total: f64,
    unit: f64,
}

impl From<&Costs> for CostsJson {
    fn from(costs: &Costs) -> CostsJson {
        CostsJson {
            backlog: clean(costs.backlog),
            change: clean(costs.change),
            holding: clean(costs.holding),
            overtime: clean(costs.overtime),
            setup: clean(costs.setup),
            total: clean(costs.total()),
            unit: clean(costs.unit),
        }
    }
}

/// One row of `comparison`. Stock summed across items is a count only
/// when they share a unit (`stock_unit`), overtime only when the resources
/// do (`overtime_unit`); otherwise both are `null` and the values and costs
/// beside them stand.
#[derive(Serialize)]
struct RowJson<'a> {
    average_stock: Option<f64>,
    average_stock_value: f64,
    buckets_of_cover: Option<f64>,
    costs: CostsJson,
    ending_stock: Option<f64>,
    ending_stock_value: f64,
    extra_cost_percent: Option<f64>,
    feasible: bool,
    fill_rate: f64,
    inventory_turns: Option<f64>,
    method: &'static str,
    notes: &'a [String],
    overtime_unit: Option<&'a str>,
    overtime_used: Option<f64>,
    /// Why the plan is infeasible (`null` when it is feasible): a value,
    /// so its keys print sorted like the rest.
    reason: Value,
    setups: usize,
    status: &'static str,
    stock_unit: Option<&'a str>,
    total_cost: f64,
}

fn row<'a>(
    scenario: &'a Scenario,
    result: &'a MethodResult,
    reference: Option<f64>,
) -> RowJson<'a> {
    let evaluation = &result.evaluation;
    let total = evaluation.total_cost();
    let extra = reference
        .filter(|r| r.abs() > 1e-9)
        .map(|r| clean(100.0 * (total - r) / r.abs()));
    let stock_unit = scenario.stock_unit();
    let counted = |v: f64| stock_unit.map(|_| clean(v));
    RowJson {
        average_stock: counted(evaluation.average_stock()),
        average_stock_value: clean(evaluation.average_stock_value(scenario)),
        buckets_of_cover: evaluation.buckets_of_cover().map(clean),
        costs: CostsJson::from(&evaluation.costs),
        ending_stock: counted(evaluation.items.iter().map(|r| r.ending_stock).sum()),
        ending_stock_value: clean(evaluation.ending_stock_value()),
        extra_cost_percent: extra,
        feasible: evaluation.feasible,
        fill_rate: clean(evaluation.fill_rate()),
        inventory_turns: evaluation.inventory_turns(scenario).map(clean),
        method: result.method,
        notes: &result.notes,
        overtime_unit: scenario.capacity_unit(),
        overtime_used: overtime_used(scenario, evaluation),
        reason: reason(evaluation),
        setups: evaluation.setups,
        status: result.status.name(),
        stock_unit,
        total_cost: clean(total),
    }
}

/// One entry of `items`: the chosen plan's figures for one item, with its
/// unit, safety stock and forecast error.
#[derive(Serialize)]
struct ItemJson<'a> {
    average_stock: f64,
    costs: CostsJson,
    ending_stock: f64,
    ending_stock_value: f64,
    fill_rate: f64,
    forecast_error: Option<f64>,
    item: &'a str,
    safety_stock: f64,
    setups: usize,
    unit: &'a str,
}

/// `items`, written one item at a time.
struct Items<'a> {
    scenario: &'a Scenario,
    evaluation: &'a Evaluation,
}

impl Serialize for Items<'_> {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        let items = self.scenario.items.iter().zip(&self.evaluation.items);
        serializer.collect_seq(items.map(|(item, record)| ItemJson {
            average_stock: clean(record.average_stock),
            costs: CostsJson::from(&record.costs),
            ending_stock: clean(record.ending_stock),
            ending_stock_value: clean(record.ending_stock_value),
            fill_rate: clean(record.fill_rate),
            forecast_error: item.forecast_error.map(clean),
            item: &item.id,
            safety_stock: clean(item.safety_stock),
            setups: record.setups,
            unit: &item.unit,
        }))
    }
}

/// `orders`, written one order at a time as they are read off the plan.
struct Orders<'a> {
    scenario: &'a Scenario,
    plan: &'a Plan,
}

impl Serialize for Orders<'_> {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        let dates = Dates::of(self.scenario);
        let orders = order_list(self.scenario, self.plan);
        serializer.collect_seq(orders.map(|order| OrderJson::new(self.scenario, &dates, order)))
    }
}

/// `units`: the unit of every item and resource, by id (in id order, as a
/// map of values prints them).
struct Units<'a> {
    scenario: &'a Scenario,
}

/// Ids and units in id order, written as a map.
struct ById<'a>(Vec<(&'a str, &'a str)>);

impl<'a> ById<'a> {
    fn new(pairs: impl Iterator<Item = (&'a str, &'a str)>) -> ById<'a> {
        let mut pairs: Vec<(&str, &str)> = pairs.collect();
        pairs.sort_unstable_by(|a, b| a.0.cmp(b.0));
        ById(pairs)
    }
}

impl Serialize for ById<'_> {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.collect_map(self.0.iter().copied())
    }
}

impl Serialize for Units<'_> {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        use serde::ser::SerializeStruct;
        let scenario = self.scenario;
        let items = scenario.items.iter();
        let resources = scenario.resources.iter();
        let mut map = serializer.serialize_struct("Units", 2)?;
        map.serialize_field(
            "items",
            &ById::new(items.map(|i| (i.id.as_str(), i.unit.as_str()))),
        )?;
        map.serialize_field(
            "resources",
            &ById::new(resources.map(|r| (r.id.as_str(), r.unit.as_str()))),
        )?;
        map.end()
    }
}

/// The JSON of `plan`, ready to be written (`serde_json::to_writer_pretty`)
/// or turned into a value (`serde_json::to_value`).
#[derive(Serialize)]
pub struct PlanDocument<'a> {
    bucket: &'static str,
    cautions: Vec<String>,
    comparison: Vec<RowJson<'a>>,
    components: &'a [Component],
    controllable_gap: Option<f64>,
    costs: CostsJson,
    currency: &'a Option<String>,
    frozen_periods: usize,
    gap: Option<f64>,
    items: Items<'a>,
    lower_bound: Option<f64>,
    method: &'static str,
    notes: &'a [String],
    orders: Orders<'a>,
    overloads: Vec<super::OverloadJson<'a>>,
    pegging: Vec<PegJson<'a>>,
    periods: usize,
    scenario: &'a str,
    setups: usize,
    shortages: Vec<super::ShortageJson<'a>>,
    solver: String,
    start: String,
    status: &'static str,
    total_cost: f64,
    unavoidable_cost: f64,
    units: Units<'a>,
    violations: Vec<super::ViolationJson<'a>>,
}

/// The JSON of `plan`: the chosen method's plan, cost, bound and faults,
/// its orders and items, and the comparison with every method run.
pub fn plan_document<'a>(scenario: &'a Scenario, outcome: &'a Outcome) -> PlanDocument<'a> {
    let chosen = &outcome.chosen;
    let evaluation = &chosen.evaluation;
    let pegged = pegs(scenario, evaluation);
    let reference = outcome
        .comparison
        .iter()
        .find(|r| r.is_exact() && r.evaluation.feasible)
        .map(|r| r.total_cost());
    let Faults {
        shortages,
        overloads,
        violations,
    } = faults(scenario, evaluation, &pegged);
    PlanDocument {
        bucket: scenario.calendar.kind.name(),
        cautions: cautions(scenario, chosen),
        // Each row sums over every item and bucket of its plan: the rows
        // are figured side by side, in their order.
        comparison: outcome
            .comparison
            .par_iter()
            .map(|r| row(scenario, r, reference))
            .collect(),
        components: &chosen.components,
        controllable_gap: super::super::figures::controllable_gap(scenario, chosen).map(clean),
        costs: CostsJson::from(&evaluation.costs),
        currency: &scenario.currency,
        frozen_periods: scenario.frozen,
        gap: chosen.gap().map(clean),
        items: Items {
            scenario,
            evaluation,
        },
        lower_bound: chosen.lower_bound.map(clean),
        method: chosen.method,
        notes: &chosen.notes,
        orders: Orders {
            scenario,
            plan: &chosen.plan,
        },
        overloads,
        pegging: pegging(scenario, &pegged),
        periods: scenario.periods(),
        scenario: &scenario.name,
        setups: evaluation.setups,
        shortages,
        solver: chosen.solver(),
        start: scenario.calendar.label(0),
        status: chosen.status.name(),
        total_cost: clean(chosen.total_cost()),
        unavoidable_cost: clean(unavoidable_cost(scenario)),
        units: Units { scenario },
        violations,
    }
}
