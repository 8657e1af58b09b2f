//! Whole units under shared capacity, solved in stages.
//!
//! Quantities are whole units by default (a lot multiple of 1), and each
//! lot count is an integer column of the MILP. Under tight capacity those
//! columns make HiGHS's search far slower: on the capacitated benchmark
//! instance X11219C of Trigeiro, Thomas and McClain (1989), made into a
//! scenario folder in whole units, 30 s of the whole-unit MILP ended 28 %
//! above the plan the same MILP finds in continuous quantities (measured,
//! docs/benchmarks.md). The setups are the hard part; the lot sizes, once
//! the setups are known, are an easy program.
//!
//! So a group whose items carry lot multiples is solved as:
//!
//! 1. the MILP with the lot counts relaxed to continuous and the setups
//!    binary. Every whole plan is a plan of this relaxation, so its lower
//!    bound holds for the whole problem;
//! 2. the whole-unit MILP with every setup fixed where stage 1's plan has
//!    it: a plan in whole units (when the setups admit one), judged against
//!    stage 1's bound: a gap below the cost grid proves it optimal;
//! 3. when stage 1 was proven and stage 2 was not, the whole-unit MILP
//!    started from stage 2's plan for the time left, whose bound, with
//!    stage 1's, bounds the plan.
//!
//! Every plan goes through the one evaluation (in `milp::solve`); only
//! proven bounds are kept (the fixed program's own bound is not one).

use std::time::Instant;

use super::beside;
use super::fix_optimize;
use super::milp::{self, MilpOptions, MilpResult, MilpStatus};
use super::Group;
use crate::eval::quantity_tolerance;
use crate::model::Scenario;

/// Share of the time limit kept back from stage 1 for stage 2 (a small
/// program with every setup fixed). Stage 3 runs only when stage 1 was
/// proven, so it has what stage 1 left. (At 0.15, the open benchmark
/// instances stopped at 51 of 60 s.)
const LATER_SHARE: f64 = 0.05;

/// True when any of these items has integer lot counts to relax.
pub fn has_lot_counts(scenario: &Scenario, items: &[usize]) -> bool {
    items
        .iter()
        .any(|&i| scenario.items[i].lot_multiple.is_some())
}

/// The exact method on a group that shares resources: the MILP (in the
/// stages above when the items have lot counts, else in one, from the
/// start plan of `fix_optimize`) with fix-and-optimize beside it
/// (`beside`).
pub fn solve(scenario: &Scenario, group: &Group, options: &MilpOptions) -> MilpResult {
    if options.relax || options.extra_capacity || group.items.len() < 2 {
        return solve_alone(scenario, group, options);
    }
    // A node limit asks for a run that repeats: the search beside the MILP
    // stops when the MILP does, at a moment that varies, so it stays out.
    if options.nodes.is_some() {
        return tidied(scenario, group, solve_alone(scenario, group, options));
    }
    let subset = scenario.subset(&group.items);
    let judge = |receipts: &[Vec<f64>]| super::tidy::feasible_cost(&subset, receipts);
    let setups = |receipts: &[Vec<f64>]| setup_pattern(scenario, &group.items, receipts);
    let sub = |limits: &MilpOptions| milp::solve(scenario, &group.items, limits);
    let program = beside::Program {
        shape: (scenario.periods(), group.items.len()),
        lot_counts: has_lot_counts(scenario, &group.items),
        solve: &sub,
        judge: &judge,
        setups: &setups,
    };
    // One start for both: the search's, and HiGHS's first incumbent.
    let start = fix_optimize::start_plan(scenario, group);
    let options = MilpOptions {
        start: options.start.clone().or(start.clone()),
        ..options.clone()
    };
    let result = beside::race(&program, &options, start, &|limits: &MilpOptions| {
        solve_alone(scenario, group, limits)
    });
    tidied(scenario, group, result)
}

/// A plan that is not proven, with orders that do not pay for their setup
/// merged away (`tidy`).
fn tidied(scenario: &Scenario, group: &Group, mut result: MilpResult) -> MilpResult {
    if result.status != MilpStatus::Feasible {
        return result;
    }
    let subset = scenario.subset(&group.items);
    let judge = |receipts: &[Vec<f64>]| super::tidy::feasible_cost(&subset, receipts);
    if let Some(cost) = super::tidy::tidy(&mut result.receipts, &judge) {
        result.objective = cost;
    }
    result
}

/// The MILP alone, in stages where the items have lot counts.
fn solve_alone(scenario: &Scenario, group: &Group, options: &MilpOptions) -> MilpResult {
    if !has_lot_counts(scenario, &group.items) || options.relax || options.extra_capacity {
        return fix_optimize::solve_from_start(scenario, group, options);
    }
    let program = |limits: &MilpOptions| {
        if limits.fixed.is_none() {
            fix_optimize::solve_from_start(scenario, group, limits)
        } else {
            milp::solve(scenario, &group.items, limits)
        }
    };
    let setups = |receipts: &[Vec<f64>]| setup_pattern(scenario, &group.items, receipts);
    let shape = (scenario.periods(), group.items.len());
    let grid = milp::cost_grid(scenario, &group.items);
    in_stages(options, grid, shape, &program, &setups)
}

/// Setups fixed from outside, by item and receipt bucket
/// (`MilpOptions::fixed`).
pub(crate) type Fixed = Vec<Vec<Option<bool>>>;

/// The setups of a plan (receipts by item of `items`), each fixed open
/// where the plan receives and closed elsewhere.
pub(crate) fn setup_pattern(scenario: &Scenario, items: &[usize], receipts: &[Vec<f64>]) -> Fixed {
    items
        .iter()
        .zip(receipts)
        .map(|(&i, received)| {
            let tolerance = quantity_tolerance(&scenario.items[i]);
            received.iter().map(|&q| Some(q > tolerance)).collect()
        })
        .collect()
}

/// The stages, for any program over setups and lot counts: `program`
/// solves with the options given (a start in `start`, setups fixed in
/// `fixed`; with neither it may find its own start), `setups` reads the
/// setup pattern of a plan, `shape` is (buckets, items) and `grid` the
/// plans' cost grid, if any.
pub(crate) fn in_stages(
    options: &MilpOptions,
    grid: Option<f64>,
    shape: (usize, usize),
    program: &dyn Fn(&MilpOptions) -> MilpResult,
    setups: &dyn Fn(&[Vec<f64>]) -> Fixed,
) -> MilpResult {
    let started = Instant::now();
    let left = || (options.time_limit - started.elapsed().as_secs_f64()).max(0.0);
    let first = program(&MilpOptions {
        relax_multiples: true,
        time_limit: options.time_limit * (1.0 - LATER_SHARE),
        ..options.clone()
    });
    match first.status {
        // No plan of the relaxation: none in whole units either.
        MilpStatus::Infeasible => return timed(first, started),
        // Nothing to fix from: the whole-unit program for the time left.
        MilpStatus::NoPlan => {
            let whole = program(&MilpOptions {
                time_limit: left().max(options.time_limit.min(0.5)),
                ..options.clone()
            });
            return timed(
                MilpResult {
                    lower_bound: whole.lower_bound.max(first.lower_bound),
                    ..whole
                },
                started,
            );
        }
        MilpStatus::Optimal | MilpStatus::Feasible => {}
    }
    let second = program(&MilpOptions {
        fixed: Some(setups(&first.receipts)),
        start: None,
        time_limit: left().max(options.time_limit.min(0.5)),
        ..options.clone()
    });
    let has_plan = |r: &MilpResult| matches!(r.status, MilpStatus::Optimal | MilpStatus::Feasible);
    let mut best = has_plan(&second).then_some(second);
    let mut bound = first.lower_bound;
    let settled = |best: &Option<MilpResult>, bound: f64| {
        best.as_ref()
            .is_some_and(|b| proven(b.objective, bound, grid))
    };
    if first.status == MilpStatus::Optimal && !settled(&best, bound) && left() > 0.05 {
        let third = program(&MilpOptions {
            start: best
                .as_ref()
                .map(|b| b.receipts.clone())
                .or(options.start.clone()),
            time_limit: left(),
            ..options.clone()
        });
        match third.status {
            // The relaxation has plans, but none in whole units (a lot
            // that fits only in part).
            MilpStatus::Infeasible => return timed(third, started),
            // The time limit or the solver's failure: keep what stage 2
            // found.
            MilpStatus::NoPlan => {}
            MilpStatus::Optimal => return timed(third, started),
            MilpStatus::Feasible => {
                bound = bound.max(third.lower_bound);
                if best.as_ref().is_none_or(|b| third.objective < b.objective) {
                    best = Some(third);
                }
            }
        }
    }
    let Some(best) = best else {
        // The setups of stage 1 admit no plan in whole units, and no later
        // stage found one in the time left.
        return timed(
            MilpResult {
                lower_bound: bound,
                hit_time_limit: true,
                ..MilpResult::without_plan(MilpStatus::NoPlan, shape.0, shape.1, started)
            },
            started,
        );
    };
    let bound = bound.min(best.objective);
    let optimal = proven(best.objective, bound, grid);
    timed(
        MilpResult {
            status: if optimal {
                MilpStatus::Optimal
            } else {
                MilpStatus::Feasible
            },
            lower_bound: bound,
            hit_time_limit: !optimal && (first.hit_time_limit || best.hit_time_limit),
            ..best
        },
        started,
    )
}

/// A plan costing `cost` is proven optimal against `bound` when the gap is
/// within the optimality tolerance or below one step of the cost grid.
fn proven(cost: f64, bound: f64, grid: Option<f64>) -> bool {
    let gap = cost - bound;
    gap <= milp::OPTIMALITY_GAP * cost.abs().max(1e-9)
        || grid.is_some_and(|g| gap < g * 0.99 + 1e-9)
}

/// The result with the seconds of all stages.
fn timed(result: MilpResult, started: Instant) -> MilpResult {
    MilpResult {
        seconds: started.elapsed().as_secs_f64(),
        ..result
    }
}
