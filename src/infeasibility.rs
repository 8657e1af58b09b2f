//! Why a plan is infeasible, as data: the resources it overloads (from which
//! bucket, by how much), the items it leaves short, and the lot rules and
//! stock floors it breaks. Summarised from the evaluation, so every method's
//! plan is explained the same way; `report` words it.

use serde::Serialize;

use crate::eval::{Evaluation, ViolationKind};

/// One resource a plan overloads beyond its capacity and overtime.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ResourceOverload {
    pub resource: String,
    /// The first bucket overloaded (1-based).
    pub first_period: usize,
    /// Load over capacity plus overtime in that bucket.
    pub excess: f64,
    /// The number of buckets overloaded.
    pub periods: usize,
    /// The excess summed over those buckets.
    pub total_excess: f64,
    /// Load and the limit it breaks (capacity plus the overtime allowed)
    /// in the first bucket overloaded.
    pub load: f64,
    pub limit: f64,
}

/// One item a plan leaves short (an item without backlog).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ItemShortage {
    pub item: String,
    /// The first bucket short (1-based).
    pub first_period: usize,
    /// Units short at the end of that bucket.
    pub quantity: f64,
    /// The number of buckets short.
    pub periods: usize,
}

/// A lot rule or stock floor a plan breaks: the first bucket it is broken
/// for each item and kind.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Breach {
    pub item: String,
    pub period: usize,
    pub kind: ViolationKind,
    pub quantity: f64,
    pub limit: f64,
    /// The number of buckets this item breaks it in.
    pub periods: usize,
}

/// Why a plan is infeasible.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Infeasibility {
    pub overloads: Vec<ResourceOverload>,
    pub shortages: Vec<ItemShortage>,
    pub breaches: Vec<Breach>,
}

impl Evaluation {
    /// Why this plan is infeasible; `None` when it is feasible.
    pub fn infeasibility(&self) -> Option<Infeasibility> {
        if self.feasible {
            return None;
        }
        let mut overloads: Vec<ResourceOverload> = Vec::new();
        for o in &self.overloads {
            match overloads.iter_mut().find(|r| r.resource == o.resource) {
                Some(r) => {
                    r.periods += 1;
                    r.total_excess += o.excess;
                }
                None => overloads.push(ResourceOverload {
                    resource: o.resource.clone(),
                    first_period: o.period,
                    excess: o.excess,
                    periods: 1,
                    total_excess: o.excess,
                    load: o.load,
                    limit: o.capacity,
                }),
            }
        }
        let mut shortages: Vec<ItemShortage> = Vec::new();
        for s in &self.shortages {
            match shortages.iter_mut().find(|r| r.item == s.item) {
                Some(r) => r.periods += 1,
                None => shortages.push(ItemShortage {
                    item: s.item.clone(),
                    first_period: s.period,
                    quantity: s.quantity,
                    periods: 1,
                }),
            }
        }
        let mut breaches: Vec<Breach> = Vec::new();
        for v in self.violations.iter().filter(|v| v.binding) {
            match breaches
                .iter_mut()
                .find(|b| b.item == v.item && b.kind == v.kind)
            {
                Some(b) => b.periods += 1,
                None => breaches.push(Breach {
                    item: v.item.clone(),
                    period: v.period,
                    kind: v.kind,
                    quantity: v.quantity,
                    limit: v.limit,
                    periods: 1,
                }),
            }
        }
        Some(Infeasibility {
            overloads,
            shortages,
            breaches,
        })
    }
}
