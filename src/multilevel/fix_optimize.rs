//! Fix-and-optimize across the levels of a bill of material, for bills too
//! large for the joint program to improve on its start in the time given.
//!
//! After S. Helber and F. Sahling (2010), "A fix-and-optimize approach for
//! the multi-level capacitated lot sizing problem", International Journal
//! of Production Economics 123(2): keep a plan and, one subproblem at a
//! time, free the setups of some items or some buckets, fix every other
//! setup where the plan has it, and solve the joint program (`milp::solve`)
//! with those fixings, started from the plan. A subproblem's plan replaces
//! the current one only when the one evaluation finds it feasible and
//! cheaper, so the plan never gets worse. Each subproblem still sees every
//! level: a parent's lots are priced with what they cost its components.
//!
//! The subproblems, in turn until a pass improves nothing or time runs
//! out: blocks of items in low-level-code order, all buckets free. A block's
//! items and every part below them may change their lots (the parts keep
//! their setups); every other item keeps its lots, passed to the program as
//! firm orders, so that each subproblem is small. Every other pass shifts
//! the blocks by half a block. After the blocks come windows of 4 buckets
//! with every item free, from the end of the horizon back. These are larger:
//! on the 100-item bill each took three to eight times its time limit
//! (HiGHS's root cuts on the whole bill), and only the last one improved
//! the plan (docs/benchmarks.md).

use std::time::{Duration, Instant};

use super::milp;
use crate::capacity::milp::{MilpOptions, MilpStatus};
use crate::eval::{evaluate, quantity_tolerance};
use crate::model::{Plan, Scenario};

/// Items freed together, and the seconds one subproblem may take. Measured on the generated 100-item, 4-level,
/// 26-week bill of docs/benchmarks.md ("Bills of material").
const BLOCK: usize = 10;
const WINDOW: usize = 4;
const SUBPROBLEM_LIMIT: f64 = 3.0;

/// What the search did.
#[derive(Debug, Clone)]
pub struct Searched {
    pub plan: Plan,
    pub cost: f64,
    pub subproblems: usize,
    pub improved: usize,
}

/// Which setups a subproblem frees.
#[derive(Debug, Clone, Copy)]
enum Free<'a> {
    /// These items' setups in every bucket.
    Items(&'a [usize]),
    /// Every item's setups in buckets from..to.
    Buckets(usize, usize),
}

impl Free<'_> {
    fn contains(&self, item: usize, bucket: usize) -> bool {
        match *self {
            Free::Items(items) => items.contains(&item),
            Free::Buckets(from, to) => (from..to).contains(&bucket),
        }
    }
}

/// Improves the feasible plan `start` until `deadline`.
pub fn improve(
    scenario: &Scenario,
    options: &MilpOptions,
    start: &Plan,
    deadline: Instant,
) -> Searched {
    improve_with(scenario, options, start, deadline, BLOCK)
}

/// `improve` with `block` items freed together (the tests use small
/// blocks, so that most subproblems keep some items' lots as they are).
pub fn improve_with(
    scenario: &Scenario,
    options: &MilpOptions,
    start: &Plan,
    deadline: Instant,
    block: usize,
) -> Searched {
    let periods = scenario.periods();
    let mut current = start.clone();
    let mut cost = evaluate(scenario, &current).total_cost();
    let order = scenario.level_order();
    let block = block.clamp(1, order.len().max(1));
    let mut subproblems = 0;
    let mut improved = 0;
    // Passes that improved nothing in a row: the search ends after two, one
    // with the blocks in place and one shifted.
    let mut idle = 0;
    for pass in 0.. {
        let mut better = false;
        // Blocks of items in level order; every other pass shifts them by
        // half a block, so that neighbours of one block meet in the next.
        let shift = if pass % 2 == 1 { block / 2 } else { 0 };
        let mut starts: Vec<usize> = (shift..order.len()).step_by(block).collect();
        if shift > 0 {
            starts.insert(0, 0);
        }
        starts.push(order.len());
        let blocks = starts.windows(2).map(|b| Free::Items(&order[b[0]..b[1]]));
        // Then windows of buckets, every item free, from the horizon's end
        // back (on the 100-item bill the last window was the one that
        // improved the plan).
        let width = WINDOW.min(periods).max(1);
        let windows = (0..periods)
            .rev()
            .step_by((width / 2).max(1))
            .map(|end| Free::Buckets((end + 1).saturating_sub(width), end + 1));
        for free in blocks.chain(windows) {
            let left = deadline.saturating_duration_since(Instant::now());
            if left < Duration::from_millis(200) {
                return Searched {
                    plan: current,
                    cost,
                    subproblems,
                    improved,
                };
            }
            // Items whose lots may change: with a block of items freed, the
            // block and every part below it (their setups stay, their
            // quantities follow the block's lots); the others keep their
            // lots, passed to the program as firm orders, so that it is
            // small enough to solve within its time.
            let movable = match free {
                Free::Items(block) => below(scenario, block),
                Free::Buckets(..) => vec![true; scenario.items.len()],
            };
            let mut sub_scenario = scenario.clone();
            for (i, item) in sub_scenario.items.iter_mut().enumerate() {
                if !movable[i] {
                    for (firm, q) in item.firm.iter_mut().zip(&current.receipts[i]) {
                        *firm += q;
                    }
                }
            }
            let fixed: Vec<Vec<Option<bool>>> = scenario
                .items
                .iter()
                .enumerate()
                .map(|(i, item)| {
                    let tolerance = quantity_tolerance(item);
                    (0..periods)
                        .map(|j| {
                            if !movable[i] {
                                Some(false)
                            } else if free.contains(i, j) {
                                None
                            } else {
                                Some(current.receipts[i][j] > tolerance)
                            }
                        })
                        .collect()
                })
                .collect();
            let mut sub_start = current.clone();
            for (i, row) in sub_start.receipts.iter_mut().enumerate() {
                if !movable[i] {
                    row.iter_mut().for_each(|q| *q = 0.0);
                }
            }
            let sub = MilpOptions {
                time_limit: left.as_secs_f64().min(SUBPROBLEM_LIMIT),
                gap: Some(1e-4),
                fixed: Some(fixed),
                log_file: None,
                ..options.clone()
            };
            let result = milp::solve(&sub_scenario, &sub, Some(&sub_start));
            subproblems += 1;
            if !matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible) {
                continue;
            }
            let mut receipts = result.receipts;
            for (i, row) in receipts.iter_mut().enumerate() {
                if !movable[i] {
                    row.clone_from(&current.receipts[i]);
                }
            }
            let candidate = Plan { receipts };
            let evaluation = evaluate(scenario, &candidate);
            let candidate_cost = evaluation.total_cost();
            if evaluation.feasible && candidate_cost < cost - 1e-7 * cost.abs().max(1.0) {
                current = candidate;
                cost = candidate_cost;
                improved += 1;
                better = true;
            }
        }
        idle = if better { 0 } else { idle + 1 };
        if idle == 2 {
            break;
        }
    }
    Searched {
        plan: current,
        cost,
        subproblems,
        improved,
    }
}

/// The items of `block` and every item below them in the bill.
fn below(scenario: &Scenario, block: &[usize]) -> Vec<bool> {
    let mut marked = vec![false; scenario.items.len()];
    for &i in block {
        marked[i] = true;
    }
    // Parents come before their components in level order.
    for i in scenario.level_order() {
        if marked[i] {
            continue;
        }
        marked[i] = scenario
            .bom
            .iter()
            .any(|line| line.component == i && marked[line.parent]);
    }
    marked
}
