//! The O(T log T) single-item lot-sizing algorithm for items without
//! backlog: A. Wagelmans, S. van Hoesel and A. Kolen (1992), "Economic
//! lot-sizing: an O(n log n) algorithm that runs in linear time in the
//! Wagner-Whitin case", Operations Research 40(S1); the same bound was found
//! by A. Federgruen and M. Tzur (1991), "A simple forward algorithm to solve
//! general dynamic lot sizing models with n periods in O(n log n) or O(n)
//! time", Management Science 37(8).
//!
//! It solves the same problem as `exact::solve` (time-varying setup, unit and
//! holding costs, initial stock, scheduled receipts, safety stock, lead time,
//! ending stock) on the same shifted net requirements, and returns the same
//! full cost, in O(T log T) time and O(T) memory instead of O(T^2).
//!
//! Why it is exact. Without backlog and capacity an optimal plan orders only
//! when the shifted stock is zero (Wagner and Whitin 1958), so an order
//! received in bucket t covers the net requirements of a run of buckets
//! t..s-1, and the plan is a chain of such runs. One unit needed in bucket u
//! and received in bucket t costs the unit cost c(t) and the holding
//! cost of buckets t..u-1, that is c(t) + H(u) - H(t), with H(u) the sum of
//! holding costs before u. The H(u) part does not depend on the plan: every
//! unit of need is received exactly once. So, after subtracting the constant
//! sum of d(u) H(u), a run costs K(t) + p(t) (P(s) - P(t)) with K the setup
//! cost, p(t) = c(t) - H(t) a reduced unit cost and P the cumulative net
//! requirement. The backward recursion is then
//!
//! ```text
//! F(t) = K(t) - p(t) P(t) + min over s > t of ( F(s) + p(t) P(s) )
//! ```
//!
//! (or F(t) = F(t + 1) when bucket t needs nothing). The minimum is that of
//! the linear function (x, y) -> y + p(t) x over the points (P(s), F(s)),
//! s > t, and a linear function with a positive weight on y reaches its
//! minimum over a point set at a vertex of the set's lower convex hull. The
//! points arrive in order of x (P falls as t goes back), so the hull is kept
//! as a stack: each new point is the leftmost one, and pops the points it
//! hides. A point that is not on the hull of a set is on no hull of a larger
//! set, so a popped point is never needed again. Along the hull the edge
//! slopes rise, so y + p x falls and then rises, and a binary search finds
//! the minimum. Each point is pushed and popped once: O(T) for the hull and
//! O(log T) per query, O(T log T) in all. (When the reduced unit costs never
//! rise with t, the Wagner-Whitin case of the paper, the answers move one
//! way only and a pointer would make it linear; the binary search is kept
//! for all cases.)
//!
//! The recursion is on the reduced costs; the cost returned is computed from
//! the plan itself, bucket by bucket, the way `exact::solve` and the
//! evaluation count it (setup, unit and holding on end-of-bucket stock,
//! including the stock offsets from safety stock and receipts).

use crate::eval::quantity_tolerance;
use crate::model::Item;
use crate::single::exact::{self, shift, ExactPlan, Shifted};

/// Solves an item without backlog exactly in O(T log T). `None` exactly when
/// no plan meets every floor (need before the lead time has passed that
/// stock and receipts cannot cover). An item that allows backlog is handed
/// to `exact::solve`, which models backlog.
pub fn solve(item: &Item) -> Option<ExactPlan> {
    if item.allows_backlog() {
        return exact::solve(item);
    }
    let periods = item.periods();
    let lead = item.lead_time;
    let tolerance = quantity_tolerance(item);
    let Shifted { net, offset } = shift(item);
    let need = significant_need(&net, tolerance);
    // No order can arrive before the lead time has passed.
    if need.iter().take(lead).any(|&n| n > 0.0) {
        return None;
    }
    let mut cumulative = vec![0.0; periods + 1];
    for t in 0..periods {
        cumulative[t + 1] = cumulative[t] + need[t];
    }
    let next = order_runs(item, &need, &cumulative);
    let mut receipts = vec![0.0; periods];
    let mut t = 0;
    while t < periods {
        match next[t] {
            Some(end) => {
                receipts[t] = cumulative[end] - cumulative[t];
                t = end;
            }
            None => t += 1,
        }
    }
    let cost = plan_cost(item, &receipts, &net, &offset);
    Some(ExactPlan { receipts, cost })
}

/// The net requirements with rounding noise taken out: need below the
/// quantity tolerance is carried forward until, added up, it passes the
/// tolerance, so that a bucket whose need is a floating-point remnant does
/// not call for a setup of its own, and the shortfall left at any time stays
/// within the tolerance that the evaluation allows.
fn significant_need(net: &[f64], tolerance: f64) -> Vec<f64> {
    let mut pending = 0.0;
    net.iter()
        .map(|&n| {
            pending += n;
            if pending > tolerance {
                std::mem::take(&mut pending)
            } else {
                0.0
            }
        })
        .collect()
}

/// The backward recursion of the module doc. `next[t]` is `Some(s)` when the
/// best plan from bucket `t` on orders in `t` (receipt bucket) for buckets
/// `t..s`, and `None` when it orders nothing in `t`. Needs no order before
/// the lead time (the caller has checked).
fn order_runs(item: &Item, need: &[f64], cumulative: &[f64]) -> Vec<Option<usize>> {
    let periods = need.len();
    let lead = item.lead_time;
    // held_before[t]: holding cost of one unit over buckets 0..t.
    let mut held_before = vec![0.0; periods + 1];
    for t in 0..periods {
        held_before[t + 1] = held_before[t] + item.holding_cost[t];
    }
    // best[t]: least reduced cost of buckets t.. starting from zero shifted
    // stock.
    let mut best = vec![0.0; periods + 1];
    let mut next = vec![None; periods];
    let mut hull = LowerHull::default();
    hull.push(cumulative[periods], 0.0, periods);
    for t in (lead..periods).rev() {
        // Costs fall in the release bucket, t - lead.
        let setup = item.setup_cost[t - lead];
        let reduced_unit = item.unit_cost[t - lead] - held_before[t];
        let end = hull.minimizer(reduced_unit);
        let order = setup + reduced_unit * (cumulative[end] - cumulative[t]) + best[end];
        if need[t] == 0.0 && best[t + 1] <= order {
            best[t] = best[t + 1];
        } else {
            best[t] = order;
            next[t] = Some(end);
        }
        hull.push(cumulative[t], best[t], t);
    }
    next
}

/// The lower convex hull of points (x, y) given in order of falling x, kept
/// as a stack whose top is the leftmost point. Each point carries its bucket.
#[derive(Default)]
struct LowerHull {
    points: Vec<(f64, f64, usize)>,
}

impl LowerHull {
    /// Adds a point left of (or at the x of) every point held so far.
    fn push(&mut self, x: f64, y: f64, bucket: usize) {
        while let Some(&(top_x, top_y, _)) = self.points.last() {
            if top_x <= x {
                // Same x: the lower point hides the other for every query.
                if y <= top_y {
                    self.points.pop();
                    continue;
                }
                return;
            }
            let len = self.points.len();
            if len < 2 {
                break;
            }
            let (next_x, next_y, _) = self.points[len - 2];
            // The top stays only if the slope rises from (new, top) to
            // (top, next); otherwise it lies on or above the new edge.
            if (top_y - y) * (next_x - top_x) >= (next_y - top_y) * (top_x - x) {
                self.points.pop();
            } else {
                break;
            }
        }
        self.points.push((x, y, bucket));
    }

    /// The bucket of the point that minimises y + weight * x. Going right
    /// from the leftmost point the value falls while the edge slope is below
    /// -weight and rises after; points are stored right to left, so the
    /// steps that lower the value form the tail of the stack.
    fn minimizer(&self, weight: f64) -> usize {
        let points = &self.points;
        let last = points.len() - 1;
        // lowers(k): moving from point k + 1 to point k (one step right)
        // lowers the value.
        let lowers = |k: usize| {
            let (x, y, _) = points[k];
            let (left_x, left_y, _) = points[k + 1];
            (y - left_y) + weight * (x - left_x) < 0.0
        };
        let (mut low, mut high) = (0, last);
        while low < high {
            let middle = (low + high) / 2;
            if lowers(middle) {
                high = middle;
            } else {
                low = middle + 1;
            }
        }
        points[low].2
    }
}

/// The full cost of `receipts` as `exact::solve` counts it: setup and unit
/// cost in the release bucket, holding on end-of-bucket stock (shifted stock
/// plus offset).
fn plan_cost(item: &Item, receipts: &[f64], net: &[f64], offset: &[f64]) -> f64 {
    let lead = item.lead_time;
    let mut cost = 0.0;
    let mut shifted = 0.0;
    for t in 0..receipts.len() {
        let quantity = receipts[t];
        if quantity > 0.0 {
            cost += item.setup_cost[t - lead] + item.unit_cost[t - lead] * quantity;
        }
        shifted += quantity - net[t];
        cost += item.holding_cost[t] * (shifted + offset[t]).max(0.0);
    }
    cost
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::single::exact::tests::item_with;

    #[test]
    fn matches_the_exact_program_on_a_classic_shape() {
        let demand = [69.0, 29.0, 36.0, 61.0, 61.0, 26.0, 34.0, 67.0, 45.0, 67.0];
        let item = item_with(&demand, 85.0, 1.0);
        let fast = solve(&item).unwrap();
        let exact = exact::solve(&item).unwrap();
        assert!((fast.cost - exact.cost).abs() < 1e-9, "{fast:?} {exact:?}");
    }

    #[test]
    fn a_cheap_setup_in_a_bucket_without_need_is_used() {
        // Bucket 2 needs nothing but its setup is free: ordering there for
        // bucket 3 costs one bucket of holding (5) instead of a setup (100)
        // or two buckets of holding from bucket 1 (10).
        let mut item = item_with(&[10.0, 0.0, 10.0], 100.0, 0.5);
        item.setup_cost[1] = 0.0;
        let plan = solve(&item).unwrap();
        assert_eq!(plan.receipts, vec![10.0, 10.0, 0.0]);
        assert!((plan.cost - 105.0).abs() < 1e-9);
    }

    #[test]
    fn need_before_the_lead_time_is_infeasible() {
        let mut item = item_with(&[10.0, 10.0, 10.0], 5.0, 1.0);
        item.lead_time = 1;
        assert!(solve(&item).is_none());
        item.initial_stock = 10.0;
        let plan = solve(&item).unwrap();
        assert_eq!(plan.receipts, vec![0.0, 10.0, 10.0]);
    }

    #[test]
    fn the_hull_drops_a_point_above_the_chord() {
        let mut hull = LowerHull::default();
        hull.push(2.0, 0.0, 2);
        hull.push(1.0, 5.0, 1); // above the chord from (0, 0) to (2, 0)
        hull.push(0.0, 0.0, 0);
        assert_eq!(hull.points.len(), 2);
        // A positive weight favours the left end, a negative one the right.
        assert_eq!(hull.minimizer(1.0), 0);
        assert_eq!(hull.minimizer(-1.0), 2);
    }
}
