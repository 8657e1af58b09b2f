//! A week that cannot be met is planned, not refused.
//!
//! Inside a freeze, a forecast that rose can leave a week's window with no
//! plan that meets every requirement on time: the frozen orders are too
//! small and nothing new can arrive before the freeze ends. Refusing the
//! week would leave the shop with no plan at all (and, before, with a
//! lot-for-lot plan nobody had checked). So `roll` plans such a window
//! again with every requirement allowed to wait, at a penalty per unit per
//! bucket late far above anything else a unit can cost in the window:
//!
//!   penalty = 10 x (setup cost + unit cost + holding cost x buckets in the
//!   window), each at its largest in the window.
//!
//! One unit late for one bucket then costs more than a setup and holding
//! it over the whole window together, so the plan is late only where no
//! plan can be on time, and the late units (item, bucket, units) are named.
//! Items that already allow backlog keep their own cost.

use crate::model::Scenario;
use crate::solve::MethodResult;

/// Requirement a week's plan leaves to wait.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Late {
    pub item: usize,
    /// Bucket of the scenario (not of the window) at whose end it is owed.
    pub bucket: usize,
    pub quantity: f64,
}

/// The penalty per unit per bucket late for an item of the window.
pub fn penalty(window: &Scenario, i: usize) -> f64 {
    let item = &window.items[i];
    let largest = |v: &[f64]| v.iter().copied().fold(0.0, f64::max);
    10.0 * (largest(&item.setup_cost)
        + largest(&item.unit_cost)
        + largest(&item.holding_cost) * window.periods() as f64)
        .max(1.0)
}

/// The window with every item that does not allow backlog given the
/// penalty as its backlog cost.
pub fn with_backlog(window: &Scenario) -> Scenario {
    let mut relaxed = window.clone();
    for i in 0..relaxed.items.len() {
        if relaxed.items[i].backlog_cost.is_none() {
            relaxed.items[i].backlog_cost = Some(penalty(window, i));
        }
    }
    relaxed
}

/// The units the plan of the relaxed window leaves owed, by item and
/// bucket (`start`: the window's first bucket in the scenario), for the
/// items that did not allow backlog in `window`.
pub fn late(window: &Scenario, planned: &MethodResult, start: usize) -> Vec<Late> {
    let mut late = Vec::new();
    for (i, record) in planned.evaluation.items.iter().enumerate() {
        if window.items[i].backlog_cost.is_some() {
            continue;
        }
        for t in 0..window.periods() {
            let owed = record.backlog(t);
            if owed > 1e-6 {
                late.push(Late {
                    item: i,
                    bucket: start + t,
                    quantity: owed,
                });
            }
        }
    }
    late
}
