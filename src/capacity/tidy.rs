//! A last pass over a plan the solver did not prove: orders that do not pay
//! for their setup are merged into a neighbouring order of the same item.
//!
//! A branch-and-bound cut short by its limit may hand back a plan with an
//! order of one unit that pays a full setup to save a little holding or
//! backlog. Moving such a lot onto the item's previous order (built earlier
//! and held), or onto its next one (where backlog is allowed), removes a
//! setup; the one evaluation judges every move, so a move that breaks
//! capacity, a lot rule or the freeze is never kept. The pass is a fixed
//! sequence of moves, so the same plan always tidies the same way.

use crate::eval::evaluate;
use crate::model::{Plan, Scenario};

/// A plan's cost as the one evaluation gives it, if the plan is feasible:
/// the judge of `tidy` (and of the search beside the MILP).
pub(crate) fn feasible_cost(scenario: &Scenario, receipts: &[Vec<f64>]) -> Option<f64> {
    let evaluation = evaluate(
        scenario,
        &Plan {
            receipts: receipts.to_vec(),
        },
    );
    evaluation.feasible.then(|| evaluation.total_cost())
}

/// Passes over every order at most; each pass that keeps a move may make
/// another worth it.
const PASSES: usize = 3;

/// Merges orders of `receipts` (by item, by receipt bucket) while that
/// lowers the cost `judge` gives (`None` for a plan that is not feasible),
/// and returns the new cost when any move was kept.
pub(crate) fn tidy(
    receipts: &mut [Vec<f64>],
    judge: &dyn Fn(&[Vec<f64>]) -> Option<f64>,
) -> Option<f64> {
    let mut cost = judge(receipts)?;
    let mut improved = false;
    for _ in 0..PASSES {
        let mut kept = false;
        for j in 0..receipts.len() {
            // Latest orders first: the lot rules and freeze bind early ones.
            let mut t = receipts[j].len();
            while t > 0 {
                t -= 1;
                if receipts[j][t] <= 0.0 {
                    continue;
                }
                let earlier = (0..t).rev().find(|&p| receipts[j][p] > 0.0);
                let later = (t + 1..receipts[j].len()).find(|&n| receipts[j][n] > 0.0);
                for target in [earlier, later].into_iter().flatten() {
                    let lot = receipts[j][t];
                    receipts[j][t] = 0.0;
                    receipts[j][target] += lot;
                    match judge(receipts) {
                        Some(new) if new < cost - 1e-9 * (1.0 + cost.abs()) => {
                            cost = new;
                            kept = true;
                            break;
                        }
                        _ => {
                            receipts[j][target] -= lot;
                            receipts[j][t] = lot;
                        }
                    }
                }
            }
        }
        improved |= kept;
        if !kept {
            break;
        }
    }
    improved.then_some(cost)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// One item, requirements 5, 1, 5 in three buckets, setup 10, holding 1
    /// a unit a bucket, no backlog: the plan 5, 1, 5 pays three setups
    /// (30). The latest order first: bucket 3's 5 onto bucket 2 holds 5 for
    /// one bucket (30 - 10 + 5 = 25); then bucket 2's 6 onto bucket 1 holds
    /// 6 + 5 (25 - 10 + 6 = 21). The best plan costs 21 (6, 0, 5 does too).
    fn judge(receipts: &[Vec<f64>]) -> Option<f64> {
        let demand = [5.0, 1.0, 5.0];
        let mut stock = 0.0;
        let mut cost = 0.0;
        for (t, &need) in demand.iter().enumerate() {
            let q = receipts[0][t];
            if q > 0.0 {
                cost += 10.0;
            }
            stock += q - need;
            if stock < -1e-9 {
                return None;
            }
            cost += stock;
        }
        Some(cost)
    }

    #[test]
    fn an_order_that_does_not_pay_its_setup_is_merged_and_others_stay() {
        let mut receipts = vec![vec![5.0, 1.0, 5.0]];
        assert_eq!(judge(&receipts), Some(30.0));
        let cost = tidy(&mut receipts, &judge);
        assert_eq!(cost, Some(21.0));
        assert_eq!(receipts, vec![vec![11.0, 0.0, 0.0]]);
        assert_eq!(judge(&receipts), Some(21.0));
    }

    #[test]
    fn a_plan_with_nothing_to_gain_is_left_as_it_is() {
        // 6, 0, 5 costs 21; merging either order gives 21 again, no less.
        let mut receipts = vec![vec![6.0, 0.0, 5.0]];
        assert_eq!(tidy(&mut receipts, &judge), None);
        assert_eq!(receipts, vec![vec![6.0, 0.0, 5.0]]);
    }
}
