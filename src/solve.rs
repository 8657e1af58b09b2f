//! Planning a whole scenario: the exact plan (per item, or per group of items
//! that share capacity), every lot rule for comparison, and one evaluation
//! of each.

use serde::Serialize;

use crate::eval::{evaluate, Evaluation};
use crate::model::{Plan, Scenario};
use crate::single::exact;
use crate::single::rules::{self, Rule, Sizing};

/// What a method's result is proven to be.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Status {
    /// Proven least-cost.
    Optimal,
    /// A plan that meets every constraint, not proven least-cost.
    Feasible,
    /// No plan meets every constraint (or this method's plan does not).
    Infeasible,
    /// The time limit ran out before any plan was found.
    Unknown,
}

impl Status {
    pub fn name(self) -> &'static str {
        match self {
            Status::Optimal => "optimal",
            Status::Feasible => "feasible",
            Status::Infeasible => "infeasible",
            Status::Unknown => "unknown",
        }
    }
}

/// What solved one group of items (a connected component of the
/// item-resource graph, or a single item).
#[derive(Debug, Clone, Serialize)]
pub struct Component {
    pub items: Vec<String>,
    pub resources: Vec<String>,
    /// `dp` for the dynamic program, `milp` for HiGHS, or a heuristic's name.
    pub solver: &'static str,
    pub status: Status,
}

/// One method's plan, its evaluation and what is proven about it.
#[derive(Debug, Clone)]
pub struct MethodResult {
    /// How each component was solved (empty for the lot rules).
    pub components: Vec<Component>,
    /// `optimal` for the exact method, else the rule's name.
    pub method: &'static str,
    pub status: Status,
    pub plan: Plan,
    pub evaluation: Evaluation,
    /// A proven lower bound on the least cost, where one is known.
    pub lower_bound: Option<f64>,
    /// Plain-language remarks a planner should read with the result.
    pub notes: Vec<String>,
}

impl MethodResult {
    /// The solvers that produced the plan, joined by `+` (`dp`, `dp+milp`).
    pub fn solver(&self) -> String {
        let mut names: Vec<&str> = self.components.iter().map(|c| c.solver).collect();
        names.sort_unstable();
        names.dedup();
        names.join("+")
    }

    pub fn total_cost(&self) -> f64 {
        self.evaluation.total_cost()
    }

    /// (total cost - lower bound) / |total cost|, or 0 when both are 0.
    pub fn gap(&self) -> Option<f64> {
        let bound = self.lower_bound?;
        let cost = self.total_cost();
        if cost.abs() < 1e-12 {
            return Some(0.0);
        }
        Some(((cost - bound) / cost.abs()).max(0.0))
    }
}

/// What the planner asked for.
#[derive(Debug, Clone, Default)]
pub struct Options {
    /// Only this method (its output name); `None` for all.
    pub method: Option<String>,
}

/// The names every method goes by, in the order of the comparison.
pub const METHOD_NAMES: [&str; 8] = [
    "optimal",
    "lot-for-lot",
    "fixed-lot",
    "eoq",
    "poq",
    "silver-meal",
    "least-unit-cost",
    "part-period-balancing",
];

/// The result of planning a scenario.
#[derive(Debug, Clone)]
pub struct Outcome {
    /// The method whose plan is the answer (the exact one unless the
    /// planner chose another).
    pub chosen: MethodResult,
    /// Every method run, the chosen one included, in comparison order.
    pub comparison: Vec<MethodResult>,
}

/// Plans the scenario with every method (or the one asked for).
pub fn plan_scenario(scenario: &Scenario, options: &Options) -> crate::error::Result<Outcome> {
    if let Some(method) = &options.method {
        if !METHOD_NAMES.contains(&method.as_str()) {
            return Err(crate::error::Error::usage(format!(
                "unknown method {method}; choose one of {}",
                METHOD_NAMES.join(", ")
            )));
        }
        if method == "fixed-lot" && !has_fixed_lot(scenario) {
            return Err(crate::error::Error::usage(
                "no item in items.csv gives a fixed_lot, so there is no fixed-lot rule to run",
            ));
        }
    }
    let wanted = |name: &str| options.method.as_deref().is_none_or(|m| m == name);
    let mut comparison = Vec::new();
    if wanted("optimal") {
        comparison.push(solve_exact(scenario));
    }
    for rule in Rule::ALL {
        if rule == Rule::FixedLot && !has_fixed_lot(scenario) {
            continue;
        }
        if wanted(rule.name()) {
            comparison.push(run_rule(scenario, rule));
        }
    }
    let chosen = comparison
        .first()
        .cloned()
        .ok_or_else(|| crate::error::Error::Internal("no method ran".into()))?;
    Ok(Outcome { chosen, comparison })
}

fn has_fixed_lot(scenario: &Scenario) -> bool {
    scenario.items.iter().any(|item| item.fixed_lot.is_some())
}

/// The plan of one rule for every item.
pub fn run_rule(scenario: &Scenario, rule: Rule) -> MethodResult {
    let receipts = scenario
        .items
        .iter()
        .map(|item| rules::plan(item, Sizing::Rule(rule)))
        .collect();
    let plan = Plan { receipts };
    let evaluation = evaluate(scenario, &plan);
    let mut notes = Vec::new();
    if rule == Rule::FixedLot {
        let without: Vec<&str> = scenario
            .items
            .iter()
            .filter(|item| item.fixed_lot.is_none())
            .map(|item| item.id.as_str())
            .collect();
        if !without.is_empty() {
            notes.push(format!(
                "items without a fixed_lot are ordered lot-for-lot under the fixed-lot rule: {}",
                without.join(", ")
            ));
        }
    }
    let status = if evaluation.feasible {
        Status::Feasible
    } else {
        Status::Infeasible
    };
    MethodResult {
        components: Vec::new(),
        method: rule.name(),
        status,
        plan,
        evaluation,
        lower_bound: None,
        notes,
    }
}

/// The exact method: per item, the dynamic program; lot constraints and
/// shared capacity are honoured or the result says it is not proven.
pub fn solve_exact(scenario: &Scenario) -> MethodResult {
    let periods = scenario.periods();
    let mut plan = Plan::empty(scenario.items.len(), periods);
    let mut lower_bound = 0.0;
    let mut proven = true;
    let mut infeasible = Vec::new();
    let mut notes = Vec::new();
    let mut components = Vec::new();
    for (i, item) in scenario.items.iter().enumerate() {
        let mut component = Component {
            items: vec![item.id.clone()],
            resources: Vec::new(),
            solver: "dp",
            status: Status::Optimal,
        };
        let Some(exact) = exact::solve(item) else {
            component.status = Status::Infeasible;
            components.push(component);
            infeasible.push(explain_item(item));
            plan.receipts[i] = rules::plan(item, Sizing::Rule(Rule::LotForLot));
            continue;
        };
        lower_bound += exact.cost;
        if item.has_lot_constraints() && !meets_lot_constraints(item, &exact.receipts) {
            // The unconstrained optimum is a lower bound; a plan that meets
            // the constraints is built from its lots, and the better of that
            // and the rules' plans is kept.
            proven = false;
            component.status = Status::Feasible;
            plan.receipts[i] = best_constrained(scenario, i, &exact.receipts);
            notes.push(format!(
                "item {}: the least-cost plan without lot constraints breaks min_lot, lot_multiple or max_lot; the plan shown meets them but is not proven optimal (exact lot constraints come with the capacitated solver)",
                item.id
            ));
        } else {
            plan.receipts[i] = exact.receipts;
        }
        components.push(component);
    }
    let evaluation = evaluate(scenario, &plan);
    let mut status = if !infeasible.is_empty() {
        notes.extend(infeasible);
        Status::Infeasible
    } else if proven {
        Status::Optimal
    } else {
        Status::Feasible
    };
    if status != Status::Infeasible && !scenario.routings.is_empty() {
        // The plan ignores capacity. It is the capacitated optimum when it
        // fits without overtime (a relaxation's optimum that is feasible).
        let overtime: f64 = evaluation
            .resources
            .iter()
            .flat_map(|r| r.overtime.iter())
            .sum();
        if !evaluation.overloads.is_empty() {
            status = Status::Infeasible;
            notes.push("the least-cost plan without capacity limits overloads a resource; the capacitated solver is needed to plan within capacity".into());
        } else if overtime > 0.0 {
            status = Status::Feasible;
            notes.push("the plan uses overtime; without the capacitated solver it is not proven least-cost".into());
        }
    }
    let lower_bound = match status {
        Status::Optimal => Some(evaluation.total_cost()),
        Status::Feasible => Some(lower_bound.min(evaluation.total_cost())),
        _ => None,
    };
    MethodResult {
        components,
        method: "optimal",
        status,
        plan,
        evaluation,
        lower_bound,
        notes,
    }
}

fn meets_lot_constraints(item: &crate::model::Item, receipts: &[f64]) -> bool {
    let tolerance = crate::eval::quantity_tolerance(item);
    receipts
        .iter()
        .filter(|&&q| q > 0.0)
        .all(|&q| (rules::constrain(item, q) - q).abs() <= tolerance)
}

/// The cheapest plan for item `i` that meets its lot constraints, among the
/// optimum's lots made to fit and the rules' plans.
fn best_constrained(scenario: &Scenario, i: usize, optimum: &[f64]) -> Vec<f64> {
    let item = &scenario.items[i];
    let mut candidates = vec![rules::plan(item, Sizing::Follow(optimum))];
    candidates.extend(
        Rule::ALL
            .iter()
            .map(|&rule| rules::plan(item, Sizing::Rule(rule))),
    );
    let single = Scenario {
        items: vec![item.clone()],
        resources: Vec::new(),
        routings: Vec::new(),
        ..scenario.clone()
    };
    candidates
        .into_iter()
        .map(|receipts| {
            let evaluation = evaluate(
                &single,
                &Plan {
                    receipts: vec![receipts.clone()],
                },
            );
            (evaluation.feasible, evaluation.total_cost(), receipts)
        })
        .min_by(|a, b| {
            (!a.0, a.1)
                .partial_cmp(&(!b.0, b.1))
                .unwrap_or(std::cmp::Ordering::Equal)
        })
        .map(|(_, _, receipts)| receipts)
        .unwrap_or_default()
}

/// Why an item has no feasible plan: need before an order can arrive.
fn explain_item(item: &crate::model::Item) -> String {
    let mut stock = item.initial_stock;
    for t in 0..item.periods().min(item.lead_time.max(1)) {
        stock += item.receipts[t] - item.demand[t];
        if stock < -crate::eval::quantity_tolerance(item) {
            return format!(
                "item {}: {} units short in period {}, before an order released in period 1 can arrive (lead time {} buckets); add stock or receipts, or allow backlog",
                item.id,
                fmt_quantity(-stock),
                t + 1,
                item.lead_time
            );
        }
    }
    format!(
        "item {}: no plan meets its stock floors (lead time {} buckets)",
        item.id, item.lead_time
    )
}

fn fmt_quantity(q: f64) -> String {
    if q.fract() == 0.0 {
        format!("{q:.0}")
    } else {
        format!("{q:.3}")
    }
}

/// The cautions a plan calls for: overtime and stock built ahead of need
/// are decisions for people who know the local rules.
pub fn cautions(scenario: &Scenario, result: &MethodResult) -> Vec<String> {
    let mut cautions = Vec::new();
    let overtime: f64 = result
        .evaluation
        .resources
        .iter()
        .flat_map(|r| r.overtime.iter())
        .sum();
    if overtime > 0.0 {
        cautions.push(format!(
            "The plan uses {} units of overtime capacity. Overtime and shift patterns must respect local labour law and agreements; check with the people who set them.",
            fmt_quantity(overtime)
        ));
    }
    let ahead = result
        .evaluation
        .items
        .iter()
        .zip(&scenario.items)
        .filter(|(record, _)| record.longest_cover >= 2)
        .max_by_key(|(record, _)| record.longest_cover);
    if let Some((record, item)) = ahead {
        let unit = scenario.calendar.kind.name();
        cautions.push(format!(
            "The plan builds stock ahead of need (up to {} {unit}s of demand in one lot, item {}). Shelf life, quality holds and rules for regulated products (food, pharmaceuticals) can forbid building ahead; check them before releasing the orders.",
            record.longest_cover, item.id
        ));
    }
    cautions
}
