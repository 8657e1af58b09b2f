//! How the joint program over every level is run: in the stages of
//! `capacity::staged` where items come in whole units or lot multiples
//! (the setups with relaxed lot counts, then the lots).
//!
//! The fix-and-optimize search of `capacity::beside` is not run beside it:
//! measured on the generated 10-item, 3-level, 13-week bills at 85 %, it
//! took the second core from HiGHS and cost proofs (seed 2 proven in 51 s
//! instead of 38 s; seed 3 ended at a 0.41 % gap instead of 0.007 %;
//! docs/benchmarks.md).

use super::milp;
use crate::capacity::milp::{MilpOptions, MilpResult};
use crate::capacity::staged;
use crate::model::{Plan, Scenario};

/// Solves the joint program from `start` (a plan within every constraint,
/// if there is one).
pub(crate) fn solve(
    scenario: &Scenario,
    options: &MilpOptions,
    start: Option<&Plan>,
) -> MilpResult {
    let all: Vec<usize> = (0..scenario.items.len()).collect();
    let lot_counts = staged::has_lot_counts(scenario, &all);
    let program = |limits: &MilpOptions| {
        let start = limits.start.clone().map(|receipts| Plan { receipts });
        milp::solve(scenario, limits, start.as_ref())
    };
    let setups = |receipts: &[Vec<f64>]| staged::setup_pattern(scenario, &all, receipts);
    let shape = (scenario.periods(), all.len());
    let main = |limits: &MilpOptions| {
        if lot_counts {
            staged::in_stages(limits, None, shape, &program, &setups)
        } else {
            program(limits)
        }
    };
    let options = MilpOptions {
        start: start.map(|plan| plan.receipts.clone()),
        ..options.clone()
    };
    main(&options)
}
