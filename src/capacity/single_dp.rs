//! The capacitated single item, exact, by dynamic programming over stock
//! levels, for items planned in lot multiples (whole units: every item with
//! a `lot_multiple`; its demand, stock and receipts may be fractional).
//!
//! The state is the count of multiples received so far, which with the
//! stock the item would have without orders gives the end-of-bucket stock
//! (negative for backlog); a decision is the number of lot multiples
//! received in a bucket, within min_lot, max_lot and the capacity (with
//! overtime) of the item's resources in the release bucket. Every plan
//! whose stock stays between the lowest and highest stock allowed is a
//! path through the states, and some least-cost plan does (costs are never
//! negative; see `top` below), so the least path is the optimum
//! (Bellman's principle; the model of Florian and Klein
//! 1971, "Deterministic production planning with concave costs and capacity
//! constraints", Management Science 18(1), cited from memory, with general
//! costs here).
//!
//! State-space bound: buckets x stock levels x lot counts. When it passes
//! `STATE_LIMIT` the caller falls back to the MILP and says so.

use crate::eval::quantity_tolerance;
use crate::model::Scenario;

/// The largest buckets x stock levels x decisions this program enumerates.
pub const STATE_LIMIT: f64 = 2e8;

/// Why the program does not apply to an item.
#[derive(Debug, Clone, PartialEq)]
pub enum NotApplicable {
    /// Quantities are continuous (no lot multiple).
    NotWhole,
    /// The state space would pass the limit (its size is given).
    TooLarge(f64),
    /// A price per unit moved from an earlier plan
    /// (`model::QuantityChange`): it may pay to receive beyond the need,
    /// which the stock bound here leaves out.
    QuantityChange,
}

/// The program's plan and its cost (as `eval` computes it); `None` inside
/// `Ok` when no plan exists.
pub type Solved = Option<(Vec<f64>, f64)>;

/// Solves item `i` of `scenario` (which uses resources no other item uses).
#[allow(clippy::needless_range_loop)]
pub fn solve(scenario: &Scenario, i: usize) -> Result<Solved, NotApplicable> {
    let item = &scenario.items[i];
    let periods = item.periods();
    if item.has_quantity_change() {
        return Err(NotApplicable::QuantityChange);
    }
    let Some(multiple) = item.lot_multiple else {
        return Err(NotApplicable::NotWhole);
    };
    let m = multiple;
    let total_demand: f64 = item.demand.iter().sum();
    let scheduled: f64 = item.receipts.iter().sum();
    let supply: f64 = item.initial_stock + scheduled;
    // An order never needs to lift stock above the remaining need plus one
    // lot, but scheduled receipts that arrive after it come on top (a
    // minimum lot ordered for a safety stock, then receipts: found by the
    // property test of the exact method with lot constraints). Backlog
    // never exceeds the demand.
    let top = (total_demand
        + item.safety_stock.max(item.ending_stock)
        + item.min_lot
        + multiple
        + scheduled)
        .max(supply)
        + m;
    let bottom = if item.allows_backlog() {
        -total_demand
    } else {
        0.0
    };
    // The state is the count of multiples received so far, c: stock at the
    // end of bucket t is `base[t] + c m`, with `base[t]` the stock without
    // orders (whole or not; the forecast may be fractional).
    let mut base = Vec::with_capacity(periods);
    let mut without_orders = item.initial_stock;
    for t in 0..periods {
        without_orders += item.receipts[t] - item.demand[t];
        base.push(without_orders);
    }
    // The count never falls, and the last bucket's stock stays under the
    // ceiling, so the last bucket bounds every count.
    let end_base = base.last().copied().unwrap_or(item.initial_stock);
    let mut most_count = ((top - end_base) / m).ceil();
    if !item.allows_backlog() {
        // Some least-cost plan receives in all less than the total net
        // requirement N plus min_lot plus one multiple: in a plan above
        // that, the last lot either loses a multiple and stays at least
        // min_lot, or it is below min_lot + m and can go whole; either way
        // every floor still holds (N is the largest cumulative need) and
        // no cost rises (costs are never negative; load only falls).
        let need: f64 = crate::single::net_requirements(item, |t| item.stock_target(t))
            .iter()
            .sum();
        most_count = most_count.min(((need + item.min_lot + m) / m).ceil());
    }
    if !most_count.is_finite() || most_count > 1e9 {
        return Err(NotApplicable::TooLarge(f64::INFINITY));
    }
    let most_count = most_count as i64;
    let levels = (most_count + 1) as usize;
    // Largest lot count per bucket from max_lot and capacity.
    let routings: Vec<_> = scenario.routings_of(i).collect();
    let mut most = vec![0i64; periods];
    for (j, slot) in most.iter_mut().enumerate() {
        if j < item.lead_time {
            continue;
        }
        let r = j - item.lead_time;
        let mut cap = item.max_lot.unwrap_or(f64::INFINITY).min(top - bottom);
        for routing in &routings {
            let resource = &scenario.resources[routing.resource];
            let room = resource.capacity[r] + resource.overtime_capacity[r] - routing.setup_time;
            if room < 0.0 {
                cap = -1.0;
            } else if routing.per_unit > 0.0 {
                cap = cap.min(room / routing.per_unit);
            }
        }
        *slot = if cap < 0.0 {
            -1
        } else {
            (cap / multiple + 1e-9).floor() as i64
        };
    }
    let decisions: f64 = most.iter().map(|&k| (k + 1).max(1) as f64).sum::<f64>();
    let size = levels as f64 * decisions;
    if size > STATE_LIMIT {
        return Err(NotApplicable::TooLarge(size));
    }
    let min_count = ((item.min_lot / multiple) - 1e-9).ceil().max(1.0) as i64;
    let tolerance = quantity_tolerance(item);
    // Cost of receiving k multiples in bucket j (setup, unit, overtime), or
    // None when capacity forbids it.
    let order_cost = |j: usize, k: i64| -> Option<f64> {
        if k == 0 {
            return Some(0.0);
        }
        let r = j - item.lead_time;
        let q = k as f64 * m;
        let mut cost = item.setup_cost[r] + item.unit_cost[r] * q;
        for routing in &routings {
            let resource = &scenario.resources[routing.resource];
            let load = routing.per_unit * q + routing.setup_time;
            let over = load - resource.capacity[r];
            if over > 1e-7 * (1.0 + resource.capacity[r]) {
                if over > resource.overtime_capacity[r] + 1e-7 * (1.0 + resource.capacity[r]) {
                    return None;
                }
                cost += over * resource.overtime_cost;
            }
        }
        Some(cost)
    };
    let mut value = vec![f64::INFINITY; levels];
    value[0] = 0.0;
    let mut choice: Vec<Vec<i32>> = Vec::with_capacity(periods);
    for t in 0..periods {
        let mut next = vec![f64::INFINITY; levels];
        let mut picked = vec![-1i32; levels];
        let last = t + 1 == periods;
        let lowest = if item.allows_backlog() && !last {
            bottom
        } else {
            item.stock_floor(t)
        } - tolerance;
        let counts: Vec<(i64, f64)> = if t < item.lead_time || most[t] < 0 {
            vec![(0, 0.0)]
        } else {
            std::iter::once(0)
                .chain(min_count..=most[t])
                .filter_map(|k| order_cost(t, k).map(|c| (k, c)))
                .collect()
        };
        for (count, &v) in value.iter().enumerate() {
            if !v.is_finite() {
                continue;
            }
            for &(k, cost) in &counts {
                let after = count + k as usize;
                if after >= levels {
                    continue;
                }
                let on_hand = base[t] + after as f64 * m;
                if on_hand < lowest || on_hand > top {
                    continue;
                }
                let keep = if on_hand >= 0.0 {
                    item.holding_cost[t] * on_hand
                } else {
                    item.backlog_cost.unwrap_or(0.0) * -on_hand
                };
                let total = v + cost + keep;
                if total < next[after] {
                    next[after] = total;
                    picked[after] = k as i32;
                }
            }
        }
        value = next;
        choice.push(picked);
    }
    let Some((mut count, best)) = value
        .iter()
        .copied()
        .enumerate()
        .filter(|(_, v)| v.is_finite())
        .min_by(|a, b| a.1.total_cmp(&b.1))
    else {
        return Ok(None);
    };
    let mut receipts = vec![0.0; periods];
    for t in (0..periods).rev() {
        let k = choice[t][count] as usize;
        receipts[t] = k as f64 * m;
        count -= k;
    }
    Ok(Some((receipts, best)))
}
