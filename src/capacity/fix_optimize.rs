//! Large groups of items that share resources, where the full MILP will not
//! finish: a lower bound from the Lagrangean relaxation (`lagrange`) and a
//! plan improved by fix-and-optimize, after S. Helber and F. Sahling (2010),
//! "A fix-and-optimize approach for the multi-level capacitated lot sizing
//! problem", International Journal of Production Economics 123(2).
//!
//! Fix-and-optimize keeps a plan and, one subproblem at a time, frees the
//! setups of a window of buckets (all items) or of a block of items (all
//! buckets), fixes every other setup where the plan has it, and solves the
//! resulting MILP on HiGHS, started from the plan, so a subproblem never
//! returns anything worse. The start need not fit capacity: while the plan
//! overloads, subproblems minimise the overload alone; once it fits, the
//! cost, with any overload priced far above what capacity is worth. The
//! plan returned fits, or the group is reported without a plan.

use std::time::{Duration, Instant};

use super::lagrange;
use super::milp::{self, MilpOptions, MilpResult, MilpStatus};
use super::Group;
use crate::eval::{evaluate, quantity_tolerance};
use crate::model::{Plan, Scenario};

/// Buckets freed together in a time-window subproblem (windows overlap by
/// half), items freed together in an item subproblem, and the seconds one
/// subproblem may take: tuned on the generated 100-item, 52-week, 3-resource
/// group of docs/performance.md, where larger subproblems hit their limit
/// before improving the plan.
const WINDOW: usize = 4;
const BLOCK: usize = 10;
const SUBPROBLEM_LIMIT: f64 = 3.0;

/// Which heuristic plans the group.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Search {
    /// Lagrangean relaxation with the smoothing heuristic only.
    Lagrangean,
    /// The relaxation, then fix-and-optimize from its best plan.
    FixAndOptimize,
}

/// What a heuristic solve found, with the relaxation's figures.
#[derive(Debug, Clone)]
pub struct Found {
    pub result: MilpResult,
    pub iterations: usize,
    /// Subproblems solved and how many improved the plan.
    pub subproblems: usize,
    pub improved: usize,
}

/// Plans `group` with `search` within `options.time_limit`.
pub fn solve(scenario: &Scenario, group: &Group, options: &MilpOptions, search: Search) -> Found {
    let started = Instant::now();
    let budget = Duration::from_secs_f64(options.time_limit.max(0.1));
    let relax_share = match search {
        Search::Lagrangean => 1.0,
        Search::FixAndOptimize => 0.15,
    };
    let items = &group.items;
    let periods = scenario.periods();
    let Some(relaxation) = lagrange::relax(
        scenario,
        items,
        &group.resources,
        started + budget.mul_f64(relax_share),
        2000,
    ) else {
        return Found {
            result: no_plan(items.len(), periods, started, MilpStatus::Infeasible),
            iterations: 0,
            subproblems: 0,
            improved: 0,
        };
    };
    let subset = scenario.subset(items);
    let penalty = overload_price(scenario, items);
    // Cost and overload (load beyond capacity and overtime) from the one
    // evaluation.
    let score = |receipts: &[Vec<f64>]| -> (f64, f64) {
        let evaluation = evaluate(
            &subset,
            &Plan {
                receipts: receipts.to_vec(),
            },
        );
        let over: f64 = evaluation.overloads.iter().map(|o| o.excess).sum();
        (evaluation.total_cost() + penalty * over, over)
    };
    // The start: the smoothed plan when the relaxation found one, else the
    // subproblems' own plans, overloads and all (measured: a better start
    // than lot-for-lot, whose setup time everywhere leaves more to repair).
    let mut current = match &relaxation.best_plan {
        Some((receipts, _)) => receipts.clone(),
        None => relaxation.pattern.clone(),
    };
    let mut current_score = score(&current);

    let mut subproblems = 0;
    let mut improved = 0;
    if search == Search::FixAndOptimize {
        let deadline = started + budget;
        let width = WINDOW.min(periods);
        let block = BLOCK.min(items.len());
        'passes: loop {
            let mut better = false;
            // Blocks of items over the whole horizon (they can move an
            // item's production anywhere in time), then windows of buckets
            // from the first on. Measured on the generated groups of
            // docs/performance.md: with the repair objective below, this
            // order reached a plan within capacity on both, and closer to
            // the bound than windows first.
            let blocks = (0..items.len()).step_by(block);
            let windows = (0..periods).step_by((width / 2).max(1));
            let frees: Vec<Free> = blocks
                .map(|b| Free::Items(b, (b + block).min(items.len())))
                .chain(windows.map(|a| Free::Buckets(a, (a + width).min(periods))))
                .collect();
            for free in frees {
                let left = deadline.saturating_duration_since(Instant::now());
                if left < Duration::from_millis(200) {
                    break 'passes;
                }
                let fixed: Vec<Vec<Option<bool>>> = (0..items.len())
                    .map(|k| {
                        let tolerance = quantity_tolerance(&subset.items[k]);
                        (0..periods)
                            .map(|j| (!free.contains(k, j)).then(|| current[k][j] > tolerance))
                            .collect()
                    })
                    .collect();
                // While the plan overloads, a subproblem looks for the
                // least overload alone (a feasibility problem HiGHS closes
                // fast once it finds none); then for the least cost, with
                // overload priced.
                let repairing = current_score.1 > 0.0;
                let sub = MilpOptions {
                    time_limit: left.as_secs_f64().min(SUBPROBLEM_LIMIT),
                    gap: Some(1e-3),
                    fixed: Some(fixed),
                    extra_capacity: repairing,
                    elastic: (!repairing).then_some(penalty),
                    // The stock-flow model with big-M from the whole need:
                    // small, and any start plan fits it (measured better
                    // here than facility location or tighter big-M).
                    plain: true,
                    start: Some(current.clone()),
                    log_file: None,
                    ..options.clone()
                };
                let result = milp::solve(scenario, items, &sub);
                subproblems += 1;
                if !matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible) {
                    continue;
                }
                let candidate = score(&result.receipts);
                let less_overload = candidate.1 < current_score.1 - 1e-6;
                let cheaper = candidate.1 <= current_score.1
                    && candidate.0 < current_score.0 - 1e-7 * current_score.0.abs().max(1.0);
                if less_overload || cheaper {
                    current = result.receipts;
                    current_score = candidate;
                    improved += 1;
                    better = true;
                }
            }
            if !better {
                break;
            }
        }
    }
    let bound = relaxation.lower_bound;
    let evaluation = evaluate(
        &subset,
        &Plan {
            receipts: current.clone(),
        },
    );
    let seconds = started.elapsed().as_secs_f64();
    let result = if current_score.1 > 1e-9 || !evaluation.feasible {
        MilpResult {
            lower_bound: bound,
            ..no_plan(items.len(), periods, started, MilpStatus::NoPlan)
        }
    } else {
        let cost = evaluation.total_cost();
        let proven = (cost - bound) <= milp::OPTIMALITY_GAP * cost.abs().max(1e-9);
        MilpResult {
            status: if proven {
                MilpStatus::Optimal
            } else {
                MilpStatus::Feasible
            },
            receipts: current,
            objective: cost,
            solver_objective: cost,
            lower_bound: bound.min(cost),
            seconds,
            hit_time_limit: Instant::now() >= started + budget,
            shortfall: Vec::new(),
        }
    };
    Found {
        result,
        iterations: relaxation.iterations,
        subproblems,
        improved,
    }
}

/// Share of a MILP's time limit that fix-and-optimize may take to find a
/// start when `start_plan` finds none.
pub const START_SEARCH_SHARE: f64 = 0.1;

/// A plan within capacity for HiGHS to start from: `start_plan`'s when it
/// finds one, else the plan fix-and-optimize reaches within
/// `START_SEARCH_SHARE` of the time limit (measured: on the tightest
/// benchmark instances HiGHS alone found no plan in 60 s; see
/// docs/benchmarks.md). The second search stops on the clock, so a start
/// it finds can differ from run to run; the first is repeatable.
pub fn milp_start(
    scenario: &Scenario,
    group: &Group,
    options: &MilpOptions,
) -> Option<Vec<Vec<f64>>> {
    if let Some(start) = start_plan(scenario, group) {
        return Some(start);
    }
    if super::cumulative_shortfall(scenario, group).is_some() {
        // No plan fits; the MILP proves it without a search first.
        return None;
    }
    let limits = MilpOptions {
        time_limit: options.time_limit * START_SEARCH_SHARE,
        log_file: None,
        start: None,
        ..options.clone()
    };
    let found = solve(scenario, group, &limits, Search::FixAndOptimize);
    matches!(
        found.result.status,
        MilpStatus::Optimal | MilpStatus::Feasible
    )
    .then_some(found.result.receipts)
}

/// The group's full MILP from the start given in `options`, else the one
/// `milp_start` finds: the search's time counts against the limit and in
/// the result's seconds. The MILP keeps at least half a second (or the
/// whole limit, if that is less).
pub fn solve_from_start(scenario: &Scenario, group: &Group, options: &MilpOptions) -> MilpResult {
    let started = Instant::now();
    let start = match &options.start {
        Some(start) => Some(start.clone()),
        None => milp_start(scenario, group, options),
    };
    let spent = started.elapsed().as_secs_f64();
    let limits = MilpOptions {
        start,
        time_limit: (options.time_limit - spent).max(options.time_limit.min(0.5)),
        ..options.clone()
    };
    let mut result = milp::solve(scenario, &group.items, &limits);
    result.seconds += spent;
    result
}

/// Subgradient steps `start_plan` takes: a count, not a time, so that the
/// start and with it the MILP's path repeat on every run.
const START_STEPS: usize = 100;

/// A plan within capacity to start the full MILP from, if a quick search
/// finds one: the cheaper of the smoothing heuristic's best plan (over
/// `START_STEPS` steps of the Lagrangean relaxation) and the cheapest lot
/// rule whose plan fits. `None` when neither fits.
pub fn start_plan(scenario: &Scenario, group: &Group) -> Option<Vec<Vec<f64>>> {
    use crate::single::rules::{self, Rule, Sizing};
    let subset = scenario.subset(&group.items);
    let mut best: Option<(f64, Vec<Vec<f64>>)> = None;
    let mut consider = |receipts: Vec<Vec<f64>>| {
        let evaluation = evaluate(
            &subset,
            &Plan {
                receipts: receipts.clone(),
            },
        );
        if evaluation.feasible
            && best
                .as_ref()
                .is_none_or(|(c, _)| evaluation.total_cost() < *c)
        {
            best = Some((evaluation.total_cost(), receipts));
        }
    };
    for rule in Rule::ALL {
        consider(
            subset
                .items
                .iter()
                .map(|item| rules::plan(item, Sizing::Rule(rule)))
                .collect(),
        );
    }
    // The deadline only guards against a pathological group.
    let deadline = Instant::now() + Duration::from_secs(10);
    if let Some(relaxation) = lagrange::relax(
        scenario,
        &group.items,
        &group.resources,
        deadline,
        START_STEPS,
    ) {
        if let Some((receipts, _)) = relaxation.best_plan {
            consider(receipts);
        }
    }
    best.map(|(_, receipts)| receipts)
}

/// The setups a subproblem leaves free.
enum Free {
    /// Receipt buckets `a..b` of every item.
    Buckets(usize, usize),
    /// Items `a..b` of the group, every bucket.
    Items(usize, usize),
}

impl Free {
    fn contains(&self, k: usize, j: usize) -> bool {
        match *self {
            Free::Buckets(a, b) => (a..b).contains(&j),
            Free::Items(a, b) => (a..b).contains(&k),
        }
    }
}

/// A price per unit of capacity above what a plan gains from one more:
/// ten times, for the item that gains most, a setup saved per unit of its
/// setup time plus the spread of its unit cost and its holding over the
/// whole horizon per unit of its per-unit time.
fn overload_price(scenario: &Scenario, items: &[usize]) -> f64 {
    let mut worth: f64 = 1.0;
    for &i in items {
        let item = &scenario.items[i];
        let most = |v: &[f64]| v.iter().copied().fold(0.0, f64::max);
        let least = |v: &[f64]| v.iter().copied().fold(f64::INFINITY, f64::min);
        let spread = most(&item.unit_cost) - least(&item.unit_cost).min(most(&item.unit_cost));
        let held: f64 = item.holding_cost.iter().sum();
        for routing in scenario.routings_of(i) {
            if routing.setup_time > 0.0 {
                worth = worth.max(most(&item.setup_cost) / routing.setup_time);
            }
            if routing.per_unit > 0.0 {
                worth = worth.max((spread + held) / routing.per_unit);
            }
        }
    }
    10.0 * worth
}

fn no_plan(items: usize, periods: usize, started: Instant, status: MilpStatus) -> MilpResult {
    MilpResult::without_plan(status, periods, items, started)
}
