//! Figures the reports show that the evaluation does not carry yet: which
//! rule the plan is compared with, the saving against it, weeks of cover,
//! utilisation and the buckets with reduced capacity.
//!
//! Each is a small pure function of the evaluation, so that the HTML page
//! and the spreadsheet state the same numbers. They read the evaluation's
//! costs and never cost a plan themselves; they belong in `eval` in time.

use crate::eval::{unavoidable_cost, ItemRecord, ResourceLoad};
use crate::model::Scenario;
use crate::solve::{MethodResult, Outcome, Status};

/// The rule the optimal plan is measured against, and what it saves.
#[derive(Debug, Clone, Copy)]
pub struct Saving<'a> {
    /// The optimal method's result.
    pub optimal: &'a MethodResult,
    /// The rule compared with: the plant's fixed-lot rule when the items
    /// give one, else the cheapest rule (feasible ones first).
    pub reference: &'a MethodResult,
    /// Why this rule was chosen, in words for the page.
    pub reference_is_current_rule: bool,
    /// Reference cost minus optimal cost (negative when the optimal plan
    /// costs more, as it may against a rule whose plan is infeasible).
    pub amount: f64,
    /// `amount` over the reference cost; `None` when that cost is 0.
    pub fraction: Option<f64>,
    /// `amount` over the part of the reference cost a plan controls (its
    /// total less the unavoidable cost); `None` when that part is 0.
    pub controllable_fraction: Option<f64>,
    /// `amount` less the difference in ending stock value (at unit cost):
    /// the saving when stock left at the end counts at what it is worth.
    pub net_of_ending_stock: f64,
}

/// The saving of the optimal plan, when both it and a rule were run.
pub fn saving<'a>(scenario: &Scenario, outcome: &'a Outcome) -> Option<Saving<'a>> {
    let optimal = outcome.comparison.iter().find(|r| r.is_exact())?;
    let rules = || outcome.comparison.iter().filter(|r| r.is_rule());
    let fixed = rules().find(|r| r.method == "fixed-lot");
    let cheapest = || {
        let feasible = rules()
            .filter(|r| r.evaluation.feasible)
            .min_by(|a, b| a.total_cost().total_cmp(&b.total_cost()));
        feasible.or_else(|| rules().min_by(|a, b| a.total_cost().total_cmp(&b.total_cost())))
    };
    let reference = fixed.or_else(cheapest)?;
    let amount = reference.total_cost() - optimal.total_cost();
    let fraction = (reference.total_cost().abs() > 1e-9).then(|| amount / reference.total_cost());
    let controllable = reference.total_cost() - unavoidable_cost(scenario);
    let controllable_fraction = (controllable > 1e-9).then(|| amount / controllable);
    let ending =
        reference.evaluation.ending_stock_value() - optimal.evaluation.ending_stock_value();
    Some(Saving {
        optimal,
        reference,
        reference_is_current_rule: fixed.is_some(),
        amount,
        fraction,
        controllable_fraction,
        net_of_ending_stock: amount - ending,
    })
}

/// The gap of `result` on the cost its plan controls (see
/// `MethodResult::controllable_gap`).
pub fn controllable_gap(scenario: &Scenario, result: &MethodResult) -> Option<f64> {
    result.controllable_gap(unavoidable_cost(scenario))
}

/// How far a plan that is not proven may lie above the best possible, in
/// words, on the cost the plan controls with the total beside it: "no plan
/// can cost less than B (the lower bound), so this plan costs at most X
/// above the least possible cost: G % of the C it controls, g % of its
/// total". `money` formats an amount. `None` without a bound.
pub fn gap_words(
    scenario: &Scenario,
    result: &MethodResult,
    money: impl Fn(f64) -> String,
) -> Option<String> {
    let bound = result.lower_bound?;
    let gap = result.gap()?;
    let unavoidable = unavoidable_cost(scenario);
    let controlled = result.controllable_gap(unavoidable)?;
    let above = (result.total_cost() - bound.max(unavoidable)).max(0.0);
    Some(format!(
        "no plan can cost less than {} (the lower bound), so this plan costs at most {} above the least possible cost: {:.2} % of the {} it controls (setups, holding, backlog, overtime and unit cost beyond the {} no plan avoids), {:.2} % of its total",
        money(bound),
        money(above),
        100.0 * controlled,
        money(result.total_cost() - unavoidable),
        money(unavoidable),
        100.0 * gap
    ))
}

/// A status in words: `proven optimal` only when it is. `exact` is true for
/// the least-cost method, whose infeasibility means no plan exists; a rule's
/// means only that its own plan breaks a constraint.
pub fn status_phrase(status: Status, exact: bool) -> String {
    match status {
        Status::Optimal => "proven optimal",
        Status::Feasible => "feasible, not proven optimal",
        Status::Infeasible if exact => "infeasible: no plan meets every constraint",
        Status::Infeasible => "infeasible: this rule's plan breaks a constraint",
        Status::Unknown => "unknown: no plan was found before the time limit",
    }
    .to_string()
}

/// The plan the optimal one is drawn against in the stock chart: the
/// fixed-lot rule when there is one, else lot-for-lot.
pub fn current_rule(outcome: &Outcome) -> Option<&MethodResult> {
    let find = |name: &str| outcome.comparison.iter().find(|r| r.method == name);
    find("fixed-lot").or_else(|| find("lot-for-lot"))
}

/// A method's total cost against the optimal plan's, as a fraction (0.05 =
/// 5 % dearer), as the JSON's `extra_cost_percent` states it in percent.
pub fn extra_over_optimal(outcome: &Outcome, result: &MethodResult) -> Option<f64> {
    let best = outcome
        .comparison
        .iter()
        .find(|r| r.is_exact() && r.evaluation.feasible)?
        .total_cost();
    (best.abs() > 1e-9).then(|| (result.total_cost() - best) / best.abs())
}

/// How many buckets of mean demand the average stock covers (weeks of
/// cover for weekly buckets); `None` for an item without demand.
pub fn cover(record: &ItemRecord) -> Option<f64> {
    let periods = record.gross_requirement.len();
    let demand: f64 = record.gross_requirement.iter().sum();
    if periods == 0 || demand <= 0.0 {
        return None;
    }
    Some(record.average_stock / (demand / periods as f64))
}

/// Load over regular capacity in bucket `t`; `None` where capacity is 0.
pub fn utilisation(load: &ResourceLoad, t: usize) -> Option<f64> {
    let capacity = load.capacity[t];
    (capacity > 0.0).then(|| load.load(t) / capacity)
}

/// The resource's usual capacity: the value most buckets have (the larger
/// one on a tie). The scenario keeps only the capacity after capacity.csv
/// overrides, so the usual level is read back from the buckets.
pub fn usual_capacity(capacity: &[f64]) -> f64 {
    let mut best = (0usize, 0.0f64);
    for &value in capacity {
        let count = capacity.iter().filter(|&&c| c == value).count();
        if count > best.0 || (count == best.0 && value > best.1) {
            best = (count, value);
        }
    }
    best.1
}

/// Whether each bucket's regular capacity lies below the usual level (a
/// holiday, a shutdown, a short week from capacity.csv).
pub fn reduced_buckets(load: &ResourceLoad) -> Vec<bool> {
    let usual = usual_capacity(&load.capacity);
    load.capacity
        .iter()
        .map(|&c| c < usual - 1e-9 * (1.0 + usual))
        .collect()
}

/// Stock by level of the bill of material: for each low-level code, the
/// end-of-bucket stock of that level's items, valued at unit cost, and
/// whether values are money. When no item has a unit cost, the stock is
/// counted in units instead (and the flag is false).
pub fn stock_by_level(
    scenario: &crate::model::Scenario,
    result: &MethodResult,
) -> (Vec<Vec<f64>>, bool) {
    let codes = scenario.low_level_codes();
    let levels = codes.iter().copied().max().map_or(0, |d| d + 1);
    let valued = scenario
        .items
        .iter()
        .any(|i| i.unit_cost.iter().any(|&c| c > 0.0));
    let mut stock = vec![vec![0.0; scenario.periods()]; levels];
    for (i, (item, record)) in scenario
        .items
        .iter()
        .zip(&result.evaluation.items)
        .enumerate()
    {
        for (t, &on_hand) in record.on_hand.iter().enumerate() {
            let price = if valued { item.unit_cost[t] } else { 1.0 };
            stock[codes[i]][t] += on_hand.max(0.0) * price;
        }
    }
    (stock, valued)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn load(capacity: &[f64], production: &[f64]) -> ResourceLoad {
        let n = capacity.len();
        ResourceLoad {
            production: production.to_vec(),
            setup_time: vec![10.0; n],
            capacity: capacity.to_vec(),
            overtime: vec![0.0; n],
            overtime_capacity: vec![0.0; n],
        }
    }

    #[test]
    fn the_usual_capacity_is_the_most_common_and_lower_buckets_are_reduced() {
        let l = load(&[3600.0, 4500.0, 4500.0, 0.0, 4500.0], &[0.0; 5]);
        assert_eq!(usual_capacity(&l.capacity), 4500.0);
        assert_eq!(reduced_buckets(&l), vec![true, false, false, true, false]);
        // A tie goes to the larger value: the smaller one is the exception.
        assert_eq!(usual_capacity(&[100.0, 80.0]), 100.0);
        assert_eq!(usual_capacity(&[]), 0.0);
    }

    #[test]
    fn utilisation_counts_setup_time_and_skips_closed_buckets() {
        let l = load(&[100.0, 0.0], &[40.0, 0.0]);
        assert_eq!(utilisation(&l, 0), Some(0.5));
        assert_eq!(utilisation(&l, 1), None);
    }
}
