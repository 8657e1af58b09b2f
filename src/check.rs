//! Checking a proposed plan (an MRP run's planned orders, a colleague's
//! plan): its evaluation, the best plan's cost, where it loses money, and
//! what to do with each order (`crate::actions`).

use serde::Serialize;

use crate::actions::{actions, shortage_orders, Action, ShortageOrders};
use crate::capacity::milp::MilpOptions;
use crate::eval::{evaluate, Evaluation};
use crate::model::{Plan, Scenario};
use crate::solve::{solve_exact, MethodResult, Status};

/// One plain-language finding about an item of the proposal.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Finding {
    pub item: String,
    /// Extra cost of the proposal over the best plan for this item.
    pub extra_cost: f64,
    pub message: String,
}

#[derive(Debug, Clone)]
pub struct CheckReport {
    pub evaluation: Evaluation,
    /// The best plan lotwright finds; `None` when it found none (see
    /// `best_status`) or was not asked to solve (`skipped`).
    pub best: Option<MethodResult>,
    /// What the search for the best plan proved: `Infeasible` when the
    /// scenario has no feasible plan, `Unknown` when the time limit ran out
    /// before a plan was found (which says nothing about the scenario).
    /// `None` when the scenario was not solved (`skipped`).
    pub best_status: Option<Status>,
    pub findings: Vec<Finding>,
    /// What to do with each proposed order (and the best orders to add).
    pub actions: Vec<Action>,
    /// For each shortage of the evaluation, the orders around it.
    pub shortage_orders: Vec<ShortageOrders>,
    /// Whether the scenario was left unsolved (a check of the proposal
    /// alone).
    pub skipped: bool,
}

impl CheckReport {
    /// What the best plan saves against the proposal.
    pub fn saving(&self) -> Option<f64> {
        let best = self.best.as_ref()?;
        Some(self.evaluation.total_cost() - best.total_cost())
    }
}

/// Evaluates `proposal` and compares it with the best plan.
pub fn check(scenario: &Scenario, proposal: &Plan, options: &MilpOptions) -> CheckReport {
    let best = solve_exact(scenario, options);
    let best_status = match best.status {
        // A plan shown for an unproven search may break a constraint; only
        // a feasible one is a best plan to compare with.
        Status::Optimal | Status::Feasible if !best.evaluation.feasible => Status::Unknown,
        status => status,
    };
    let best = best.evaluation.feasible.then_some(best);
    report(scenario, proposal, best, Some(best_status))
}

/// Evaluates `proposal` alone, without solving the scenario for the best
/// plan: shortages, overloads, rule breaches, past-due orders.
pub fn check_only(scenario: &Scenario, proposal: &Plan) -> CheckReport {
    report(scenario, proposal, None, None)
}

fn report(
    scenario: &Scenario,
    proposal: &Plan,
    best: Option<MethodResult>,
    best_status: Option<Status>,
) -> CheckReport {
    let skipped = best_status.is_none();
    let evaluation = evaluate(scenario, proposal);
    let mut findings = Vec::new();
    if let Some(best) = &best {
        for (i, item) in scenario.items.iter().enumerate() {
            let mine = &evaluation.items[i];
            let theirs = &best.evaluation.items[i];
            let extra = mine.costs.total() - theirs.costs.total();
            if extra <= 1e-6 * (1.0 + theirs.costs.total().abs()) {
                continue;
            }
            let more = |a: f64, b: f64| a > b + 1e-6 * (1.0 + b.abs());
            let mut reasons = Vec::new();
            if mine.setups > theirs.setups {
                reasons.push(format!(
                    "{} setups where {} suffice",
                    mine.setups, theirs.setups
                ));
            }
            if more(mine.costs.holding, theirs.costs.holding) {
                reasons.push(format!(
                    "stock built earlier or larger than needed (holding {:.2} against {:.2})",
                    mine.costs.holding, theirs.costs.holding
                ));
            }
            if more(mine.costs.backlog, theirs.costs.backlog) {
                reasons.push(format!(
                    "backlog cost {:.2} against {:.2}",
                    mine.costs.backlog, theirs.costs.backlog
                ));
            }
            if more(mine.costs.unit, theirs.costs.unit) {
                reasons.push(format!(
                    "unit cost {:.2} against {:.2} (more units, or bought at dearer prices)",
                    mine.costs.unit, theirs.costs.unit
                ));
            }
            if reasons.is_empty() {
                reasons.push("a costlier timing of its orders".to_string());
            }
            findings.push(Finding {
                item: item.id.clone(),
                extra_cost: extra,
                message: reasons.join("; "),
            });
        }
        findings.sort_by(|a, b| {
            b.extra_cost
                .total_cmp(&a.extra_cost)
                .then(a.item.cmp(&b.item))
        });
    }
    let actions = actions(scenario, proposal, best.as_ref().map(|b| &b.plan));
    let shortage_orders = shortage_orders(scenario, proposal, &evaluation);
    CheckReport {
        evaluation,
        best,
        best_status,
        findings,
        actions,
        shortage_orders,
        skipped,
    }
}
