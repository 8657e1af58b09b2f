//! A plan improved beside the MILP: fix-and-optimize on the second core
//! while HiGHS searches on the first.
//!
//! HiGHS's branch-and-bound spends most of a hard solve on its bound, and
//! its incumbent can stall far from the best plan (measured on the
//! tightest benchmark instances, docs/benchmarks.md). So while it runs, a
//! fix-and-optimize search in the manner of S. Helber and F. Sahling
//! (2010), "A fix-and-optimize approach for the multi-level capacitated lot
//! sizing problem", International Journal of Production Economics 123(2),
//! keeps a plan and improves it one neighbourhood at a time: a window of
//! buckets for every item, or a block of items over every bucket, is freed
//! and every other setup fixed where the plan has it; HiGHS solves that
//! small program started from the plan, so no step makes it worse. A pass
//! without gain widens the neighbourhoods.
//!
//! When the MILP proves its plan optimal, that plan is returned, so a
//! proven run gives the same plan every time. When it stops at the time
//! limit, the cheaper of its plan and the search's is returned, with the
//! MILP's bound: the one evaluation judges both.

use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Arc;
use std::time::{Duration, Instant};

use super::milp::{MilpOptions, MilpResult, MilpStatus, OPTIMALITY_GAP};
use super::staged::Fixed;

/// Width of the first time windows and size of the first item blocks;
/// each pass without gain adds `GROW` to both.
const WINDOW: usize = 4;
const BLOCK: usize = 3;
const GROW: usize = 2;
/// Seconds one subproblem may take: a guard; they usually close in well
/// under a second on groups of ten items.
const SUBPROBLEM_LIMIT: f64 = 2.0;
/// Share of the time limit the first subproblem (everything free) may take.
const FIRST_SHARE: f64 = 0.2;
/// Share of the time limit the search waits before it starts.
const DELAY_SHARE: f64 = 0.1;

/// The program being solved, as the search sees it.
pub(crate) struct Program<'a> {
    /// (buckets, items) of a plan.
    pub shape: (usize, usize),
    /// Whether some item has lot counts (whole units or lot multiples).
    pub lot_counts: bool,
    /// Solves the program with these options (setups in `fixed`, a start
    /// in `start`).
    pub solve: &'a (dyn Fn(&MilpOptions) -> MilpResult + Sync),
    /// The cost of a plan, `None` when it breaks a constraint.
    pub judge: &'a (dyn Fn(&[Vec<f64>]) -> Option<f64> + Sync),
    /// The setups of a plan, fixed where it receives and closed elsewhere.
    pub setups: &'a (dyn Fn(&[Vec<f64>]) -> Fixed + Sync),
}

/// Runs `main` (the exact solve) and, from `start`, the search beside it
/// until `main` returns; the better result as described above.
pub(crate) fn race(
    program: &Program,
    options: &MilpOptions,
    start: Option<Vec<Vec<f64>>>,
    main: &(dyn Fn(&MilpOptions) -> MilpResult + Sync),
) -> MilpResult {
    let start = start.and_then(|plan| (program.judge)(&plan).map(|cost| (plan, cost)));
    let Some(start) = start else {
        return main(options);
    };
    let stop = Arc::new(AtomicBool::new(false));
    let deadline = Instant::now() + Duration::from_secs_f64(options.time_limit);
    // The threads stay as the planner set them (or HiGHS's default): HiGHS
    // has one scheduler per process, and a solve that asks for another
    // thread count than the first one did fails.
    let started = Instant::now();
    let (mut result, found) = std::thread::scope(|scope| {
        let search = scope.spawn(|| improve(program, options, start, &stop, deadline));
        let result = main(options);
        stop.store(true, Ordering::SeqCst);
        (result, search.join().ok())
    });
    // The seconds until the search has stopped too.
    result.seconds = started.elapsed().as_secs_f64();
    let Some((plan, cost)) = found else {
        return result;
    };
    let has_plan = matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible);
    if result.status == MilpStatus::Optimal
        || result.status == MilpStatus::Infeasible
        || (has_plan && result.objective <= cost)
    {
        return result;
    }
    // The search's plan is cheaper (or the MILP has none): it replaces the
    // incumbent under the MILP's bound.
    let bound = result.lower_bound.min(cost);
    let proven = cost - bound <= OPTIMALITY_GAP * cost.abs().max(1e-9);
    MilpResult {
        status: if proven {
            MilpStatus::Optimal
        } else {
            MilpStatus::Feasible
        },
        receipts: plan,
        objective: cost,
        solver_objective: cost,
        lower_bound: bound,
        ..result
    }
}

/// Fix-and-optimize from `start` until `stop` or `deadline`; the best plan
/// and its cost.
fn improve(
    program: &Program,
    options: &MilpOptions,
    start: (Vec<Vec<f64>>, f64),
    stop: &Arc<AtomicBool>,
    deadline: Instant,
) -> (Vec<Vec<f64>>, f64) {
    let (periods, items) = program.shape;
    let (mut plan, mut cost) = start;
    // The search waits a while: most groups are proven by then, and the
    // MILP has both cores to itself meanwhile.
    let begin = Instant::now() + Duration::from_secs_f64(options.time_limit * DELAY_SHARE);
    while Instant::now() < begin {
        if stop.load(Ordering::SeqCst) {
            return (plan, cost);
        }
        std::thread::sleep(Duration::from_millis(20));
    }
    let mut width = WINDOW.min(periods);
    let mut block = BLOCK.min(items);
    // The first subproblem frees everything for a share of the time: a
    // plan of the whole program's own search to improve on (the quick
    // start is often far from it).
    let mut frees = vec![Free::All];
    frees.extend(neighbourhoods(periods, items, width, block));
    loop {
        let mut better = false;
        for free in frees {
            let left = deadline.saturating_duration_since(Instant::now());
            if stop.load(Ordering::SeqCst) || left < Duration::from_millis(100) {
                return (plan, cost);
            }
            let limit = match free {
                Free::All => options.time_limit * FIRST_SHARE,
                _ => SUBPROBLEM_LIMIT,
            };
            let mut fixed = (program.setups)(&plan);
            for (k, row) in fixed.iter_mut().enumerate() {
                for (j, slot) in row.iter_mut().enumerate() {
                    if free.contains(k, j) {
                        *slot = None;
                    }
                }
            }
            // With lot counts, the setups are chosen with the counts relaxed
            // and the lots then sized in whole units with every setup fixed
            // (the stages of `staged`, in small).
            let sub = MilpOptions {
                time_limit: left.as_secs_f64().min(limit),
                gap: Some(1e-4),
                fixed: Some(fixed),
                start: Some(plan.clone()),
                relax_multiples: program.lot_counts,
                log_file: None,
                interrupt: Some(stop.clone()),
                ..options.clone()
            };
            let mut result = (program.solve)(&sub);
            if !matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible) {
                continue;
            }
            if program.lot_counts {
                let left = deadline.saturating_duration_since(Instant::now());
                result = (program.solve)(&MilpOptions {
                    time_limit: left.as_secs_f64().min(SUBPROBLEM_LIMIT),
                    gap: Some(1e-6),
                    fixed: Some((program.setups)(&result.receipts)),
                    start: None,
                    relax_multiples: false,
                    ..sub
                });
                if !matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible) {
                    continue;
                }
            }
            if let Some(found) = (program.judge)(&result.receipts) {
                if found < cost - 1e-7 * cost.abs().max(1.0) {
                    plan = result.receipts;
                    cost = found;
                    better = true;
                }
            }
        }
        if !better {
            if width >= periods && block >= items {
                return (plan, cost);
            }
            width = (width + GROW).min(periods);
            block = (block + GROW).min(items);
        }
        frees = neighbourhoods(periods, items, width, block);
    }
}

/// The setups one subproblem frees.
#[derive(Debug, Clone, Copy)]
enum Free {
    /// Every setup.
    All,
    /// Buckets `a..b` of every item.
    Buckets(usize, usize),
    /// Items `a..b`, every bucket.
    Items(usize, usize),
}

impl Free {
    fn contains(self, k: usize, j: usize) -> bool {
        match self {
            Free::All => true,
            Free::Buckets(a, b) => (a..b).contains(&j),
            Free::Items(a, b) => (a..b).contains(&k),
        }
    }
}

/// Windows of `width` buckets overlapping by half, then blocks of `block`
/// items overlapping by one, in a fixed order; the last of each ends at
/// the end.
fn neighbourhoods(periods: usize, items: usize, width: usize, block: usize) -> Vec<Free> {
    let starts = |len: usize, size: usize, step: usize| {
        let mut starts = vec![0];
        while starts[starts.len() - 1] + size < len {
            let next = starts[starts.len() - 1] + step.max(1);
            starts.push(next);
        }
        starts
    };
    let mut frees: Vec<Free> = starts(periods, width, width / 2)
        .into_iter()
        .map(|a| Free::Buckets(a, (a + width).min(periods)))
        .collect();
    if items > 1 {
        frees.extend(
            starts(items, block, block.saturating_sub(1))
                .into_iter()
                .map(|a| Free::Items(a, (a + block).min(items))),
        );
    }
    frees
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn neighbourhoods_cover_every_bucket_and_item() {
        for (periods, items, width, block) in [(20, 10, 5, 3), (13, 10, 7, 5), (4, 1, 5, 3)] {
            let frees = neighbourhoods(periods, items, width, block);
            for j in 0..periods {
                assert!(frees
                    .iter()
                    .any(|f| matches!(f, Free::Buckets(..)) && f.contains(0, j)));
            }
            if items > 1 {
                for k in 0..items {
                    assert!(frees
                        .iter()
                        .any(|f| matches!(f, Free::Items(..)) && f.contains(k, 0)));
                }
            }
        }
    }
}
