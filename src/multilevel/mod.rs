//! Plans over a bill of material: a parent's releases are its components'
//! requirements.
//!
//! Two ways to plan, both evaluated by the one `eval::evaluate`, which
//! explodes every plan itself:
//!
//! - **Level by level** (`by_level`), as MRP does it: items in low-level-code
//!   order, each level planned by a single-level method (a lot rule, or the
//!   exact method) on the requirements its parents' plans leave, with the
//!   capacity the levels above have used taken off. Each level may be
//!   optimal for itself; the whole is only feasible, since a level cannot
//!   see what its lots cost further down.
//! - **Jointly** (`milp::solve`): one mixed-integer program over every level,
//!   on HiGHS, with its bound and gap.
//!
//! This module holds the programs and the explosion; `solve::bills`, a
//! floor above, runs them as methods and words their notes.

pub mod fix_optimize;
pub(crate) mod joint;
pub mod milp;
pub mod peg;

use crate::model::{Plan, Scenario};

/// Item-buckets from which a bill counts as large: fix-and-optimize then
/// improves the level-by-level plan before the joint program runs.
/// Measured: the 10-item, 13-week bills (130) are best left to the joint
/// program; on the 100-item, 26-week bill (2,600) HiGHS alone found nothing
/// better than its start in 60 s (docs/benchmarks.md).
pub const LARGE_BILL: usize = 1000;

/// The name of the exact method applied one level at a time.
pub const EXACT_BY_LEVEL: &str = "exact-by-level";

/// Releases by item and release bucket: planned receipts moved back by the
/// lead time (a receipt before the lead time has passed has no release in
/// the horizon and explodes nowhere), plus firm orders.
pub fn releases(scenario: &Scenario, plan: &Plan) -> Vec<Vec<f64>> {
    let periods = scenario.periods();
    scenario
        .items
        .iter()
        .zip(&plan.receipts)
        .map(|(item, receipts)| {
            let mut out = vec![0.0; periods];
            for t in item.lead_time..periods {
                out[t - item.lead_time] += receipts[t] + item.firm[t];
            }
            out
        })
        .collect()
}
