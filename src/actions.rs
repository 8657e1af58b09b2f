//! What the analyst does with a proposed plan: an action for each proposed
//! order against the best plan (past due, release now, move in or out by N
//! buckets, keep, cancel) and the best plan's orders the proposal lacks
//! (add); and, for each shortage, the order that leaves it short. As data:
//! `report` words it.
//!
//! Proposed and best orders of an item are paired in time order by the
//! least total shift (an alignment, as in edit distance): an unpaired order
//! costs as much as a shift over the whole horizon, so as many orders as
//! possible are paired, and among those pairings the one that moves orders
//! the fewest buckets in all is taken. A proposed order released before the
//! horizon is past due and is not paired: the best plan cannot have it.

use serde::Serialize;

use crate::eval::Evaluation;
use crate::model::{Plan, Scenario};

/// What to do with one order.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum ActionKind {
    /// Released before the horizon starts: it should have gone out already.
    PastDue,
    /// As the best plan has it, released in the first bucket: release it.
    ReleaseNow,
    /// The best plan receives it earlier.
    MoveIn,
    /// The best plan receives it later.
    MoveOut,
    /// As the best plan has it (or, without a best plan, not yet due).
    Keep,
    /// The best plan has no order to pair with it.
    Cancel,
    /// An order of the best plan that the proposal lacks.
    Add,
}

/// One order: its receipt bucket and release bucket (1-based; a release
/// before the horizon is 0 or less) and quantity.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct OrderRef {
    pub period: usize,
    pub release_period: i64,
    pub quantity: f64,
}

/// The action on one proposed order (`order`), or on a best order the
/// proposal lacks (`Add`, without `order`).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Action {
    pub item: String,
    pub kind: ActionKind,
    /// The proposed order; `None` for `Add`.
    pub order: Option<OrderRef>,
    /// The best plan's order it becomes; `None` for `Cancel`, `PastDue`
    /// and every action when there is no best plan.
    pub target: Option<OrderRef>,
    /// Buckets the receipt moves in (positive) or out (negative).
    pub by: Option<i64>,
    /// Whether the order, as the action leaves it, is released in the first
    /// bucket of the horizon: now.
    pub release_now: bool,
}

/// The orders around a shortage: the last one received by its bucket (the
/// lot that runs out) and the next one after it. Both `None`: no order
/// covers it.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ShortageOrders {
    pub order: Option<OrderRef>,
    pub next_order: Option<OrderRef>,
}

/// The orders of `item` (index `i`) in `plan`, by receipt bucket.
fn orders_of(scenario: &Scenario, plan: &Plan, i: usize) -> Vec<OrderRef> {
    let lead = scenario.items[i].lead_time as i64;
    plan.receipts[i]
        .iter()
        .enumerate()
        .filter(|(_, &q)| q > 0.0)
        .map(|(t, &quantity)| OrderRef {
            period: t + 1,
            release_period: t as i64 + 1 - lead,
            quantity,
        })
        .collect()
}

/// The action for each proposed order, against `best` when there is one,
/// and an `Add` for each best order left unpaired; by item, then receipt.
pub fn actions(scenario: &Scenario, proposal: &Plan, best: Option<&Plan>) -> Vec<Action> {
    let mut all = Vec::new();
    for (i, item) in scenario.items.iter().enumerate() {
        let proposed = orders_of(scenario, proposal, i);
        let (past_due, due): (Vec<OrderRef>, Vec<OrderRef>) =
            proposed.into_iter().partition(|o| o.release_period < 1);
        let mut item_actions: Vec<Action> = past_due
            .into_iter()
            .map(|order| Action {
                item: item.id.clone(),
                kind: ActionKind::PastDue,
                order: Some(order),
                target: None,
                by: None,
                release_now: false,
            })
            .collect();
        let action = |kind, order: Option<OrderRef>, target: Option<OrderRef>| Action {
            item: item.id.clone(),
            kind,
            order,
            target,
            by: order
                .zip(target)
                .map(|(o, t)| o.period as i64 - t.period as i64),
            release_now: target.or(order).is_some_and(|o| o.release_period == 1)
                && kind != ActionKind::Cancel,
        };
        match best {
            None => item_actions.extend(due.into_iter().map(|o| {
                let kind = if o.release_period == 1 {
                    ActionKind::ReleaseNow
                } else {
                    ActionKind::Keep
                };
                action(kind, Some(o), None)
            })),
            Some(best) => {
                let wanted = orders_of(scenario, best, i);
                for pair in align(&due, &wanted, scenario.periods()) {
                    item_actions.push(match pair {
                        (Some(o), Some(t)) => {
                            let kind = match o.period.cmp(&t.period) {
                                std::cmp::Ordering::Greater => ActionKind::MoveIn,
                                std::cmp::Ordering::Less => ActionKind::MoveOut,
                                _ if t.release_period == 1 => ActionKind::ReleaseNow,
                                _ => ActionKind::Keep,
                            };
                            action(kind, Some(o), Some(t))
                        }
                        (Some(o), None) => action(ActionKind::Cancel, Some(o), None),
                        (None, Some(t)) => action(ActionKind::Add, None, Some(t)),
                        (None, None) => unreachable!("an alignment pairs at least one order"),
                    });
                }
            }
        }
        item_actions.sort_by_key(|a| a.order.or(a.target).map_or(0, |o| o.period));
        all.extend(item_actions);
    }
    all
}

/// Pairs proposed and best orders of one item in time order with the least
/// total shift; an unpaired order costs `periods` buckets.
fn align(
    proposed: &[OrderRef],
    best: &[OrderRef],
    periods: usize,
) -> Vec<(Option<OrderRef>, Option<OrderRef>)> {
    let (n, m) = (proposed.len(), best.len());
    let gap = periods.max(1);
    // cost[k][l]: the least cost of pairing the first k proposed and the
    // first l best orders.
    let mut cost = vec![vec![0usize; m + 1]; n + 1];
    for k in 0..=n {
        for l in 0..=m {
            cost[k][l] = match (k, l) {
                (0, _) => l * gap,
                (_, 0) => k * gap,
                _ => {
                    let shift = proposed[k - 1].period.abs_diff(best[l - 1].period);
                    (cost[k - 1][l - 1] + shift)
                        .min(cost[k - 1][l] + gap)
                        .min(cost[k][l - 1] + gap)
                }
            };
        }
    }
    let mut pairs = Vec::new();
    let (mut k, mut l) = (n, m);
    while k > 0 || l > 0 {
        if k > 0 && l > 0 {
            let shift = proposed[k - 1].period.abs_diff(best[l - 1].period);
            if cost[k][l] == cost[k - 1][l - 1] + shift {
                pairs.push((Some(proposed[k - 1]), Some(best[l - 1])));
                k -= 1;
                l -= 1;
                continue;
            }
        }
        if k > 0 && cost[k][l] == cost[k - 1][l] + gap {
            pairs.push((Some(proposed[k - 1]), None));
            k -= 1;
        } else {
            pairs.push((None, Some(best[l - 1])));
            l -= 1;
        }
    }
    pairs.reverse();
    pairs
}

/// For each shortage of `evaluation` (in its order), the proposed orders
/// around it.
pub fn shortage_orders(
    scenario: &Scenario,
    proposal: &Plan,
    evaluation: &Evaluation,
) -> Vec<ShortageOrders> {
    evaluation
        .shortages
        .iter()
        .map(|s| {
            let orders = scenario
                .item_index(&s.item)
                .map(|i| orders_of(scenario, proposal, i))
                .unwrap_or_default();
            ShortageOrders {
                order: orders.iter().rev().find(|o| o.period <= s.period).copied(),
                next_order: orders.iter().find(|o| o.period > s.period).copied(),
            }
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    fn at(periods: &[usize]) -> Vec<OrderRef> {
        periods
            .iter()
            .map(|&period| OrderRef {
                period,
                release_period: period as i64,
                quantity: 10.0,
            })
            .collect()
    }

    fn shape(pairs: &[(Option<OrderRef>, Option<OrderRef>)]) -> Vec<(usize, usize)> {
        pairs
            .iter()
            .map(|(a, b)| (a.map_or(0, |o| o.period), b.map_or(0, |o| o.period)))
            .collect()
    }

    #[test]
    fn orders_pair_in_time_order_with_the_least_shift() {
        // 1, 5, 9 against 1, 4, 8, 11: three pairs (moves of 0, 1, 1) and
        // one order to add.
        let pairs = align(&at(&[1, 5, 9]), &at(&[1, 4, 8, 11]), 12);
        assert_eq!(shape(&pairs), [(1, 1), (5, 4), (9, 8), (0, 11)]);
        // One proposed order too many: the one farthest from any best order
        // is cancelled.
        let pairs = align(&at(&[2, 3, 9]), &at(&[2, 9]), 12);
        assert_eq!(shape(&pairs), [(2, 2), (3, 0), (9, 9)]);
        assert!(align(&[], &[], 5).is_empty());
    }
}
