//! The exact single-item program for an item whose only lot constraint is
//! its lot multiple (whole units are the default: multiple 1), when demand,
//! stock or receipts are fractional, so that the plain program's lots (sums
//! of net requirements) are not multiples.
//!
//! Let `A_t` be the cumulative net requirement to bucket t (the least
//! cumulative receipt that keeps every stock floor) rounded up to the
//! multiple. A plan of multiples meets every floor exactly when its
//! cumulative receipts `X_t >= A_t`; and `A_t` is itself a multiple and
//! never falls. So the item is equivalent to one with demand
//! `A_t - A_(t-1)` (multiples), no stock and no floors: its holding cost
//! differs by the constant `sum_t h_t (A_t + on hand without orders)`, its
//! setup and unit costs not at all. The uncapacitated problem of that item
//! is solved by the O(T log T) program, whose lots are sums of those
//! demands, hence multiples; as the optimum over every plan (fractional
//! ones included) it is the optimum over plans of multiples too. Common
//! practice of lot-sizing with rounded requirements; the argument is
//! written out here because no source at hand states it for time-varying
//! costs.

use crate::eval::quantity_tolerance;
use crate::model::Item;
use crate::single::exact::ExactPlan;
use crate::single::{fast, net_requirements};

/// The item's least-cost plan in multiples of its lot multiple, or `None`
/// when the program does not apply (no multiple, a minimum or maximum lot,
/// backlog) or no plan meets the floors before the lead time has passed.
pub fn solve(item: &Item) -> Option<ExactPlan> {
    let multiple = item.lot_multiple?;
    if item.min_lot > 0.0 || item.max_lot.is_some() || item.allows_backlog() {
        return None;
    }
    let tolerance = quantity_tolerance(item);
    let net = net_requirements(item, |t| item.stock_target(t));
    let mut rounded = Item {
        initial_stock: 0.0,
        safety_stock: 0.0,
        ending_stock: 0.0,
        forecast_error: None,
        lot_multiple: None,
        receipts: vec![0.0; item.periods()],
        ..item.clone()
    };
    let mut covered = 0.0; // cumulative net requirement
    let mut before = 0.0; // A_(t-1)
    let mut on_hand_without_orders = item.initial_stock;
    let mut constant = 0.0;
    for (t, need) in net.iter().enumerate() {
        covered += need;
        // Rounded up to the multiple, with room for float noise.
        let cumulative = if covered <= tolerance {
            0.0
        } else {
            (covered / multiple - 1e-9).ceil() * multiple
        };
        rounded.demand[t] = cumulative - before;
        before = cumulative;
        on_hand_without_orders += item.receipts[t] - item.demand[t];
        constant += item.holding_cost[t] * (cumulative + on_hand_without_orders);
    }
    let plan = fast::solve(&rounded)?;
    Some(ExactPlan {
        receipts: plan.receipts,
        cost: plan.cost + constant,
    })
}
