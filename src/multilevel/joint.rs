//! How the joint program over every level is run: in the stages of
//! `capacity::staged` where items come in whole units or lot multiples
//! (the setups with relaxed lot counts, then the lots), with the
//! fix-and-optimize search of `capacity::beside` improving the start plan
//! on the second core while HiGHS runs.

use super::milp;
use crate::capacity::beside::{self, Program};
use crate::capacity::milp::{MilpOptions, MilpResult};
use crate::capacity::staged;
use crate::eval::evaluate;
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
    if all.len() < 2 {
        return main(&options);
    }
    let judge = |receipts: &[Vec<f64>]| {
        let evaluation = evaluate(
            scenario,
            &Plan {
                receipts: receipts.to_vec(),
            },
        );
        evaluation.feasible.then(|| evaluation.total_cost())
    };
    let search = Program {
        shape,
        lot_counts,
        solve: &program,
        judge: &judge,
        setups: &setups,
    };
    beside::race(&search, &options, options.start.clone(), &main)
}
