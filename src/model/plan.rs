//! A plan: the planned receipt quantity of every item in every bucket.
//!
//! Plans are stored by receipt bucket; the release bucket is the receipt
//! bucket minus the item's lead time, and the evaluation derives it.

use serde::Serialize;

#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Plan {
    /// `receipts[item][bucket]`: planned receipt quantity (0 = no order).
    pub receipts: Vec<Vec<f64>>,
}

impl Plan {
    /// A plan with no orders.
    pub fn empty(items: usize, periods: usize) -> Plan {
        Plan {
            receipts: vec![vec![0.0; periods]; items],
        }
    }

    /// The number of buckets with an order, over all items.
    pub fn order_count(&self) -> usize {
        self.receipts
            .iter()
            .map(|row| row.iter().filter(|&&q| q > 0.0).count())
            .sum()
    }
}
