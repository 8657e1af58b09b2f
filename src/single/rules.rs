//! The lot rules plants use today, for the comparison: lot-for-lot, fixed
//! lot, EOQ lot, periodic order quantity, Silver-Meal, least unit cost and
//! part-period balancing. Each sizes a lot in a bucket with a positive net
//! requirement, then the lot constraints apply (raise to `min_lot`, round up
//! to `lot_multiple`, split above `max_lot` by building ahead);
//! docs/algorithms.md gives the
//! conventions and their sources.

use serde::Serialize;

use crate::eval::quantity_tolerance;
use crate::model::Item;
use crate::single::net_requirements;

/// A lot-sizing rule, named as in the output.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
pub enum Rule {
    #[serde(rename = "lot-for-lot")]
    LotForLot,
    #[serde(rename = "fixed-lot")]
    FixedLot,
    #[serde(rename = "eoq")]
    Eoq,
    #[serde(rename = "poq")]
    Poq,
    #[serde(rename = "silver-meal")]
    SilverMeal,
    #[serde(rename = "least-unit-cost")]
    LeastUnitCost,
    #[serde(rename = "part-period-balancing")]
    PartPeriodBalancing,
}

impl Rule {
    pub const ALL: [Rule; 7] = [
        Rule::LotForLot,
        Rule::FixedLot,
        Rule::Eoq,
        Rule::Poq,
        Rule::SilverMeal,
        Rule::LeastUnitCost,
        Rule::PartPeriodBalancing,
    ];

    pub fn name(self) -> &'static str {
        match self {
            Rule::LotForLot => "lot-for-lot",
            Rule::FixedLot => "fixed-lot",
            Rule::Eoq => "eoq",
            Rule::Poq => "poq",
            Rule::SilverMeal => "silver-meal",
            Rule::LeastUnitCost => "least-unit-cost",
            Rule::PartPeriodBalancing => "part-period-balancing",
        }
    }
}

/// The EOQ lot of the EOQ rule: sqrt(2 D S / H) with D the mean demand per
/// bucket over the horizon, S the item's setup cost and H its holding cost
/// per unit per bucket, rounded to the nearest whole unit. `None` when the
/// formula gives no finite positive lot (no demand, no setup cost, or free
/// holding).
pub fn eoq_lot(item: &Item) -> Option<f64> {
    let periods = item.periods().max(1) as f64;
    let mean = item.demand.iter().sum::<f64>() / periods;
    let (s, h) = (item.nominal_setup_cost, item.nominal_holding_cost);
    if mean <= 0.0 || s <= 0.0 || h <= 0.0 {
        return None;
    }
    let lot = (2.0 * mean * s / h).sqrt().round();
    (lot >= 1.0).then_some(lot)
}

/// The POQ interval: P = max(1, round(EOQ / D)) buckets.
pub fn poq_interval(item: &Item) -> usize {
    let periods = item.periods().max(1) as f64;
    let mean = item.demand.iter().sum::<f64>() / periods;
    match eoq_lot(item) {
        Some(lot) if mean > 0.0 => ((lot / mean).round() as usize).max(1),
        // Free holding: one lot covers everything; no setup cost: every bucket.
        _ if item.nominal_holding_cost <= 0.0 && item.nominal_setup_cost > 0.0 => {
            item.periods().max(1)
        }
        _ => 1,
    }
}

/// How a lot is sized before the lot constraints apply.
#[derive(Clone, Copy)]
pub enum Sizing<'a> {
    /// A named rule.
    Rule(Rule),
    /// Cover up to the next bucket where the given plan has an order (a
    /// plan's lot timing with the lot constraints applied).
    Follow(&'a [f64]),
}

/// The receipts of `item` planned by `sizing`, bucket by bucket.
pub fn plan(item: &Item, sizing: Sizing) -> Vec<f64> {
    let periods = item.periods();
    let tolerance = quantity_tolerance(item);
    let mut need = net_requirements(item, |t| item.stock_target(t));
    let mut receipts = vec![0.0; periods];
    let lead = item.lead_time;
    if lead >= periods {
        return receipts;
    }
    // Need before the first possible arrival cannot be ordered: it carries
    // to the first bucket an order can reach (and shows as a shortage).
    let early: f64 = need[..lead].iter().sum();
    need[..lead].iter_mut().for_each(|n| *n = 0.0);
    need[lead] += early;
    let fixed = match sizing {
        Sizing::Rule(Rule::FixedLot) => item.fixed_lot,
        Sizing::Rule(Rule::Eoq) => eoq_lot(item).or_else(|| {
            // Free holding: one lot for all that remains.
            (item.nominal_holding_cost <= 0.0).then(|| need.iter().sum::<f64>().max(1.0))
        }),
        _ => None,
    };
    for t in lead..periods {
        if need[t] <= tolerance {
            continue;
        }
        let lot = match (sizing, fixed) {
            (Sizing::Rule(Rule::FixedLot | Rule::Eoq), Some(q)) => {
                (need[t] / q - 1e-9).ceil().max(1.0) * q
            }
            (Sizing::Rule(rule), _) => cover(&need[t..], cover_count(item, rule, t, &need)),
            (Sizing::Follow(orders), _) => {
                let next = (t + 1..periods)
                    .find(|&s| orders[s] > 0.0)
                    .unwrap_or(periods);
                cover(&need[t..], next - t)
            }
        };
        let sized = constrain(item, lot.max(need[t]));
        let cap = lot_cap(item);
        receipts[t] = sized.min(cap);
        // A lot above max_lot is split: the part above it is received in
        // earlier buckets where room is left (built ahead), and what still
        // does not fit leaves need uncovered, which moves to the next bucket.
        let mut rest = sized - receipts[t];
        for s in (lead..t).rev() {
            if rest <= tolerance {
                break;
            }
            let room = cap - receipts[s];
            if room <= tolerance {
                continue;
            }
            let piece = if receipts[s] > 0.0 {
                rest.min(room)
            } else {
                constrain(item, rest).min(room)
            };
            receipts[s] += piece;
            rest -= piece;
        }
        let quantity = sized - rest.max(0.0);
        // Use the lot against this and later need; what it leaves uncovered
        // in this bucket moves to the next one.
        let mut left = quantity;
        let here = need[t].min(left);
        left -= here;
        let uncovered = need[t] - here;
        need[t] = 0.0;
        if t + 1 < periods {
            need[t + 1] += uncovered;
        }
        for later in need.iter_mut().skip(t + 1) {
            if left <= 0.0 {
                break;
            }
            let used = later.min(left);
            *later -= used;
            left -= used;
        }
    }
    receipts
}

fn cover(need: &[f64], buckets: usize) -> f64 {
    need.iter().take(buckets.max(1)).sum()
}

/// Holding cost of carrying one unit from receipt bucket `from` to bucket `to`.
fn carrying(item: &Item, from: usize, to: usize) -> f64 {
    item.holding_cost[from..to].iter().sum()
}

/// How many buckets, from `t`, a lot of `rule` covers.
fn cover_count(item: &Item, rule: Rule, t: usize, need: &[f64]) -> usize {
    let periods = need.len();
    let setup = item.setup_cost[t - item.lead_time];
    match rule {
        Rule::LotForLot | Rule::FixedLot | Rule::Eoq => 1,
        Rule::Poq => poq_interval(item),
        Rule::SilverMeal => {
            // Extend while the cost per bucket does not rise.
            let (mut cost, mut k) = (setup, 1);
            while t + k < periods {
                let next = cost + need[t + k] * carrying(item, t, t + k);
                if next / (k + 1) as f64 > cost / k as f64 {
                    break;
                }
                cost = next;
                k += 1;
            }
            k
        }
        Rule::LeastUnitCost => {
            // Extend while the cost per unit does not rise.
            let (mut cost, mut units, mut k) = (setup, need[t], 1);
            while t + k < periods {
                let next_cost = cost + need[t + k] * carrying(item, t, t + k);
                let next_units = units + need[t + k];
                if next_cost / next_units > cost / units {
                    break;
                }
                cost = next_cost;
                units = next_units;
                k += 1;
            }
            k
        }
        Rule::PartPeriodBalancing => {
            // Extend while the lot's holding cost gets strictly closer to its setup cost.
            let (mut holding, mut k) = (0.0, 1);
            while t + k < periods {
                let next = holding + need[t + k] * carrying(item, t, t + k);
                if (next - setup).abs() >= (holding - setup).abs() {
                    break;
                }
                holding = next;
                k += 1;
            }
            k
        }
    }
}

/// Applies the lot constraints to a sized lot: raise to the minimum lot and
/// round up to the lot multiple. The maximum lot is applied by splitting
/// (see `plan`); `lot_cap` gives it.
pub fn constrain(item: &Item, lot: f64) -> f64 {
    let mut quantity = lot.max(item.min_lot);
    if let Some(multiple) = item.lot_multiple {
        quantity = (quantity / multiple - 1e-9).ceil().max(1.0) * multiple;
    }
    quantity
}

/// The largest lot allowed in one bucket: max_lot, or the largest multiple
/// within it.
pub fn lot_cap(item: &Item) -> f64 {
    match (item.max_lot, item.lot_multiple) {
        (Some(max), Some(multiple)) => (max / multiple + 1e-9).floor() * multiple,
        (Some(max), None) => max,
        (None, _) => f64::INFINITY,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::single::exact::tests::item_with;

    #[test]
    fn lot_for_lot_orders_each_net_requirement() {
        let mut item = item_with(&[10.0, 0.0, 25.0], 50.0, 1.0);
        item.initial_stock = 4.0;
        assert_eq!(
            plan(&item, Sizing::Rule(Rule::LotForLot)),
            vec![6.0, 0.0, 25.0]
        );
    }

    #[test]
    fn fixed_lot_orders_the_smallest_multiple_that_covers() {
        let mut item = item_with(&[30.0, 30.0, 130.0, 0.0], 50.0, 1.0);
        item.fixed_lot = Some(50.0);
        // 50 covers bucket 1 (20 left), bucket 2 needs 10 more: 50 (40 left),
        // bucket 3 needs 90: two lots, 100.
        assert_eq!(
            plan(&item, Sizing::Rule(Rule::FixedLot)),
            vec![50.0, 50.0, 100.0, 0.0]
        );
    }

    #[test]
    fn constraints_raise_round_and_cut() {
        let mut item = item_with(&[1.0], 1.0, 1.0);
        item.min_lot = 30.0;
        item.lot_multiple = Some(25.0);
        item.max_lot = Some(110.0);
        assert_eq!(constrain(&item, 10.0), 50.0);
        assert_eq!(constrain(&item, 51.0), 75.0);
        assert_eq!(lot_cap(&item), 100.0);
    }

    #[test]
    fn a_lot_above_max_lot_is_built_ahead_where_there_is_room() {
        let mut item = item_with(&[20.0, 0.0, 150.0], 1.0, 1.0);
        item.max_lot = Some(100.0);
        // Bucket 3 needs 150: 100 in bucket 3, the other 50 ahead in bucket 2.
        assert_eq!(
            plan(&item, Sizing::Rule(Rule::LotForLot)),
            vec![20.0, 50.0, 100.0]
        );
    }

    #[test]
    fn a_lot_that_cannot_be_split_ahead_leaves_need_to_the_next_bucket() {
        let mut item = item_with(&[150.0, 0.0, 0.0], 1.0, 1.0);
        item.max_lot = Some(100.0);
        assert_eq!(
            plan(&item, Sizing::Rule(Rule::LotForLot)),
            vec![100.0, 50.0, 0.0]
        );
    }
}
