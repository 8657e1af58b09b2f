//! Single-item methods: the classic EOQ formulas, the lot rules plants use,
//! and the exact dynamic program.

pub mod eoq;
pub mod eoq_units;
pub mod exact;
pub mod fast;
pub mod multiple;
pub mod rules;

use crate::model::Item;

/// Net requirements by receipt bucket: what must arrive in each bucket, at
/// the latest, so that stock never falls below its target, after initial
/// stock and scheduled receipts are used. Never negative: a surplus carries
/// forward and covers later need.
///
/// `targets` gives the stock wanted at the end of each bucket.
pub fn net_requirements(item: &Item, targets: impl Fn(usize) -> f64) -> Vec<f64> {
    let mut net = Vec::with_capacity(item.periods());
    let mut covered = 0.0f64; // cumulative net requirement so far
    let mut cumulative = -item.initial_stock;
    for t in 0..item.periods() {
        cumulative += item.demand[t] - item.receipts[t];
        let need = (cumulative + targets(t)).max(covered);
        net.push(need - covered);
        covered = need;
    }
    net
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::single::exact::tests::item_with;

    #[test]
    fn initial_stock_and_receipts_come_first() {
        let mut item = item_with(&[30.0, 20.0, 40.0, 10.0], 100.0, 1.0);
        item.initial_stock = 40.0;
        item.receipts[2] = 15.0;
        // Stock 40 covers bucket 1 and half of bucket 2; the receipt of 15
        // covers part of bucket 3.
        let net = net_requirements(&item, |_| 0.0);
        assert_eq!(net, vec![0.0, 10.0, 25.0, 10.0]);
    }

    #[test]
    fn a_late_surplus_covers_later_need() {
        let mut item = item_with(&[10.0, 0.0, 5.0], 100.0, 1.0);
        item.receipts[1] = 12.0;
        let net = net_requirements(&item, |_| 0.0);
        assert_eq!(net, vec![10.0, 0.0, 0.0]);
    }
}
