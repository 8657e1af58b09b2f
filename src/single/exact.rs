//! The exact single-item dynamic program: Wagner and Whitin (1958), "Dynamic
//! version of the economic lot size model", Management Science 5(1), with
//! time-varying setup, unit and holding costs, initial stock, scheduled
//! receipts, safety stock, lead time and an ending-stock target; and, for an
//! item that allows it, backlogging at a cost (Zangwill 1969, "A backlogging
//! model and a multi-echelon model of a dynamic economic lot size production
//! system: a network approach", Management Science 15(9)).
//!
//! Why it is exact: with fixed-plus-linear costs the problem is a concave-cost
//! flow in a network whose nodes are the buckets; an optimal flow lies on an
//! extreme point, a forest, so the horizon splits into intervals that start
//! and end with zero (shifted) stock and hold at most one order each. The
//! dynamic program enumerates those intervals; an interval with its order in
//! bucket j costs the order, plus backlog (or early stock from receipts)
//! before j, plus holding from j on.
//!
//! Cost: O(T^2) for items without backlog, whose intervals are cut short by
//! the first bucket with need; O(T^3) time and O(T^2) memory with backlog.

use crate::eval::quantity_tolerance;
use crate::model::Item;
use crate::single::net_requirements;

/// The plan of the dynamic program and its cost (setup, unit, holding and
/// backlog, as the evaluation computes them).
#[derive(Debug, Clone, PartialEq)]
pub struct ExactPlan {
    pub receipts: Vec<f64>,
    pub cost: f64,
}

/// Items with backlog and more buckets than this are not solved by the
/// O(T^3) program (its table would pass about 2 GB).
pub const BACKLOG_PERIOD_LIMIT: usize = 15_000;

/// The problem in shifted form: net requirement `net[t]` and stock offset
/// `offset[t]`, so that on hand = shifted stock + offset, and shifted stock
/// is cumulative orders minus cumulative net requirement.
pub(crate) struct Shifted {
    pub net: Vec<f64>,
    pub offset: Vec<f64>,
}

/// The item's requirements in shifted form (see `Shifted`). Without backlog
/// the net requirements are never negative.
pub(crate) fn shift(item: &Item) -> Shifted {
    let periods = item.periods();
    if item.allows_backlog() {
        // Stock may go negative; only the end is a floor.
        let mut net: Vec<f64> = (0..periods)
            .map(|t| item.demand[t] - item.receipts[t])
            .collect();
        let mut offset = vec![0.0; periods];
        if let Some(first) = net.first_mut() {
            *first -= item.initial_stock;
        }
        if let Some(last) = net.last_mut() {
            let floor = item.stock_floor(periods - 1);
            *last += floor;
            offset[periods - 1] = floor;
        }
        Shifted { net, offset }
    } else {
        let net = net_requirements(item, |t| item.stock_floor(t));
        let mut offset = Vec::with_capacity(periods);
        let (mut need, mut stock) = (0.0, item.initial_stock);
        for ((n, receipt), demand) in net.iter().zip(&item.receipts).zip(&item.demand) {
            need += n;
            stock += receipt - demand;
            offset.push(need + stock);
        }
        Shifted { net, offset }
    }
}

/// How the best plan up to a bucket ends.
#[derive(Clone, Copy)]
enum Last {
    /// The interval `from..=here` is covered by an order in `order`.
    Order { from: usize, order: usize },
    /// The interval `from..=here` needs no order.
    NoOrder { from: usize },
}

/// Solves the item exactly. `None` when no plan meets every floor (need
/// before the lead time has passed that stock and receipts cannot cover).
pub fn solve(item: &Item) -> Option<ExactPlan> {
    let periods = item.periods();
    if periods == 0 {
        return Some(ExactPlan {
            receipts: Vec::new(),
            cost: 0.0,
        });
    }
    if item.allows_backlog() && periods > BACKLOG_PERIOD_LIMIT {
        return None;
    }
    let tolerance = quantity_tolerance(item);
    let Shifted { net, offset } = shift(item);
    let lead = item.lead_time;
    let backlog = item.backlog_cost;
    let mut prefix = vec![0.0; periods + 1];
    for t in 0..periods {
        prefix[t + 1] = prefix[t] + net[t];
    }
    // Net requirement of buckets a..=b (zero when b < a).
    let need = |a: usize, b: usize| {
        if b < a {
            0.0
        } else {
            prefix[b + 1] - prefix[a]
        }
    };
    // Cost of bucket t with shifted stock y; infinite where not allowed.
    let bucket_cost = |t: usize, y: f64| -> f64 {
        let may_backlog = backlog.is_some() && t + 1 < periods;
        if y < -tolerance && !may_backlog {
            return f64::INFINITY;
        }
        let on_hand = y + offset[t];
        if on_hand >= 0.0 {
            item.holding_cost[t] * on_hand
        } else {
            backlog.unwrap_or(0.0) * -on_hand
        }
    };
    // before[a][k]: cost of buckets a..a+k-1 with no order yet in the
    // interval starting at a (shifted stock -need(a, t)).
    let before: Vec<Vec<f64>> = (0..periods)
        .map(|a| {
            let mut row = vec![0.0];
            let mut sum = 0.0;
            for t in a..periods {
                let cost = bucket_cost(t, -need(a, t));
                if !cost.is_finite() {
                    break;
                }
                sum += cost;
                row.push(sum);
            }
            row
        })
        .collect();
    // best[b + 1]: least cost of buckets 0..=b ending with zero shifted stock.
    let mut best = vec![f64::INFINITY; periods + 1];
    let mut last: Vec<Option<Last>> = vec![None; periods + 1];
    best[0] = 0.0;
    for b in 0..periods {
        let mut value = f64::INFINITY;
        let mut choice = None;
        // Intervals a..=b that need no order.
        for a in 0..=b {
            if !best[a].is_finite() || before[a].len() <= b + 1 - a {
                continue;
            }
            let left = need(a, b);
            let balanced = left.abs() <= tolerance || (b + 1 == periods && left <= tolerance);
            if balanced {
                let candidate = best[a] + before[a][b + 1 - a];
                if candidate < value {
                    value = candidate;
                    choice = Some(Last::NoOrder { from: a });
                }
            }
        }
        // Intervals a..=b with their order received in bucket j.
        let mut after = 0.0; // cost of buckets j..=b once the order is in
        for j in (0..=b).rev() {
            let cost = bucket_cost(j, need(j + 1, b));
            if !cost.is_finite() {
                break;
            }
            after += cost;
            if j < lead {
                break;
            }
            let setup = item.setup_cost[j - lead];
            let unit = item.unit_cost[j - lead];
            for a in (0..=j).rev() {
                let Some(&waiting) = before[a].get(j - a) else {
                    if backlog.is_some() {
                        continue;
                    }
                    break; // without backlog, an earlier start only adds need
                };
                if !best[a].is_finite() {
                    continue;
                }
                let quantity = need(a, b);
                if quantity <= tolerance {
                    continue;
                }
                let candidate = best[a] + setup + unit * quantity + waiting + after;
                if candidate < value {
                    value = candidate;
                    choice = Some(Last::Order { from: a, order: j });
                }
            }
        }
        best[b + 1] = value;
        last[b + 1] = choice;
    }
    if !best[periods].is_finite() {
        return None;
    }
    let mut receipts = vec![0.0; periods];
    let mut end = periods;
    while end > 0 {
        match last[end]? {
            Last::Order { from, order } => {
                receipts[order] = need(from, end - 1);
                end = from;
            }
            Last::NoOrder { from } => end = from,
        }
    }
    Some(ExactPlan {
        receipts,
        cost: best[periods],
    })
}

#[cfg(test)]
pub(crate) mod tests {
    use super::*;

    /// A plain item: constant costs, no stock, no lead time.
    pub(crate) fn item_with(demand: &[f64], setup: f64, holding: f64) -> Item {
        Item::simple("A", demand, setup, holding)
    }

    #[test]
    fn orders_once_when_holding_is_cheap() {
        let plan = solve(&item_with(&[10.0, 10.0, 10.0], 100.0, 0.1)).unwrap();
        assert_eq!(plan.receipts, vec![30.0, 0.0, 0.0]);
        assert!((plan.cost - (100.0 + 0.1 * 20.0 + 0.1 * 10.0)).abs() < 1e-9);
    }

    #[test]
    fn orders_every_bucket_when_holding_is_dear() {
        let plan = solve(&item_with(&[10.0, 10.0, 10.0], 5.0, 1.0)).unwrap();
        assert_eq!(plan.receipts, vec![10.0, 10.0, 10.0]);
        assert!((plan.cost - 15.0).abs() < 1e-9);
    }

    #[test]
    fn lead_time_need_before_the_first_arrival_is_infeasible() {
        let mut item = item_with(&[10.0, 10.0, 10.0], 5.0, 1.0);
        item.lead_time = 1;
        assert!(solve(&item).is_none());
        item.initial_stock = 10.0;
        let plan = solve(&item).unwrap();
        assert_eq!(plan.receipts, vec![0.0, 10.0, 10.0]);
    }

    #[test]
    fn backlog_is_used_when_cheaper_than_holding() {
        let mut item = item_with(&[10.0, 10.0], 100.0, 5.0);
        item.backlog_cost = Some(1.0);
        // One order in bucket 2 backlogs bucket 1's 10 units for 1 bucket.
        let plan = solve(&item).unwrap();
        assert_eq!(plan.receipts, vec![0.0, 20.0]);
        assert!((plan.cost - 110.0).abs() < 1e-9);
    }
}
