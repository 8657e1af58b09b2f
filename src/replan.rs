//! Firm orders and a frozen horizon, reduced to a plain scenario.
//!
//! Firm orders are kept as they are, and releases inside the frozen horizon
//! (release buckets `0..frozen`) are reserved for them. What is left to
//! decide is a scenario of its own: the buckets after the freeze, starting
//! from the stock the freeze leaves, with firm orders as receipts and the
//! resources' capacity less what firm orders use. Every method plans that
//! scenario unchanged; `lift` puts its plan back on the full horizon, and
//! the full scenario's evaluation prices it, firm orders included.
//!
//! The reduction is exact: for every plan of the free part, the full
//! evaluation's cost is the free part's cost plus one constant (the firm
//! orders' setup and unit cost, overtime their load alone forces, stock and
//! backlog cost inside the freeze). So the free part's optimum and lower
//! bound are the full problem's, shifted by that constant. The argument is
//! in docs/algorithms.md, section 11b.

use crate::eval::quantity_tolerance;
use crate::model::{Calendar, Plan, Scenario};

/// Units an item without backlog is short where no new order can reach.
#[derive(Debug, Clone, PartialEq)]
pub struct Shortfall {
    pub item: usize,
    /// The first short bucket (0-based, of the full horizon).
    pub bucket: usize,
    /// The largest shortage before a new order can arrive; the free part
    /// brings it in with the first order that can arrive.
    pub quantity: f64,
}

/// A resource bucket that firm orders alone load beyond capacity and
/// overtime.
#[derive(Debug, Clone, PartialEq)]
pub struct FirmOverload {
    pub resource: usize,
    pub bucket: usize,
    pub load: f64,
    pub limit: f64,
}

/// The part of a scenario that is still free to plan.
#[derive(Debug, Clone)]
pub struct Free {
    /// Buckets `start..` of the full horizon, with nothing frozen or firm.
    pub scenario: Scenario,
    /// The first bucket of the free part: the length of the freeze.
    pub start: usize,
    pub shortfalls: Vec<Shortfall>,
    pub overloads: Vec<FirmOverload>,
}

/// The free part of `scenario`. The freeze must be shorter than the horizon
/// (the reader makes sure).
pub fn free_part(scenario: &Scenario) -> Free {
    let periods = scenario.periods();
    let start = scenario.frozen.min(periods.saturating_sub(1));
    let length = periods - start;
    let mut shortfalls = Vec::new();
    let items = scenario
        .items
        .iter()
        .enumerate()
        .map(|(i, item)| {
            let arriving = |t: usize| item.receipts[t] + item.firm[t];
            let stock: f64 = item.initial_stock
                + (0..start)
                    .map(|t| arriving(t) - item.demand[t])
                    .sum::<f64>();
            let mut demand = item.demand[start..].to_vec();
            let mut initial_stock = stock.max(0.0);
            if item.allows_backlog() {
                // Backlog left by the freeze is owed in its first free bucket.
                demand[0] += (-stock).max(0.0);
            } else if start > 0 {
                // Short before any new order can arrive: unavoidable. The
                // free part starts as if the gap were filled and brings the
                // units in with the first order that can arrive, so that the
                // plan catches up as early as it can.
                let reach = (start + item.lead_time).min(periods);
                let mut running = item.initial_stock;
                let mut deepest = 0.0_f64;
                let mut first = None;
                for t in 0..reach {
                    running += arriving(t) - item.demand[t];
                    if running < -quantity_tolerance(item) && first.is_none() {
                        first = Some(t);
                    }
                    deepest = deepest.max(-running);
                }
                if let Some(bucket) = first {
                    shortfalls.push(Shortfall {
                        item: i,
                        bucket,
                        quantity: deepest,
                    });
                    initial_stock = stock + deepest;
                    if reach < periods {
                        demand[reach - start] += deepest;
                    }
                }
            }
            crate::model::Item {
                setup_cost: item.setup_cost[start..].to_vec(),
                holding_cost: item.holding_cost[start..].to_vec(),
                unit_cost: item.unit_cost[start..].to_vec(),
                initial_stock,
                demand,
                receipts: (start..periods).map(arriving).collect(),
                firm: vec![0.0; length],
                // Firm orders released after the freeze become receipts
                // here, so a change is priced on the planned part of the
                // release: |firm + x - p| = |x - (p - firm)|.
                quantity_change: item.quantity_change.as_ref().map(|c| {
                    crate::model::QuantityChange {
                        previous: (start..periods)
                            .map(|r| {
                                let firm = item.firm.get(r + item.lead_time).copied();
                                c.previous[r].map(|p| p - firm.unwrap_or(0.0))
                            })
                            .collect(),
                        ..c.clone()
                    }
                }),
                ..item.clone()
            }
        })
        .collect();
    let firm_load = firm_load(scenario);
    let mut overloads = Vec::new();
    let resources = scenario
        .resources
        .iter()
        .enumerate()
        .map(|(r, resource)| {
            let mut capacity = Vec::with_capacity(length);
            let mut overtime = Vec::with_capacity(length);
            for (t, &load) in firm_load[r].iter().enumerate() {
                let (regular, extra) = (resource.capacity[t], resource.overtime_capacity[t]);
                let limit = regular + extra;
                if load > limit + 1e-7 * (1.0 + regular) {
                    overloads.push(FirmOverload {
                        resource: r,
                        bucket: t,
                        load,
                        limit,
                    });
                }
                if t >= start {
                    capacity.push((regular - load).max(0.0));
                    overtime.push((extra - (load - regular).max(0.0)).max(0.0));
                }
            }
            crate::model::Resource {
                capacity,
                overtime_capacity: overtime,
                ..resource.clone()
            }
        })
        .collect();
    let calendar = Calendar {
        start: scenario.calendar.bucket_start(start),
        periods: length,
        ..scenario.calendar.clone()
    };
    Free {
        scenario: Scenario {
            calendar,
            items,
            resources,
            frozen: 0,
            period_offset: scenario.period_offset + start,
            ..scenario.clone()
        },
        start,
        shortfalls,
        overloads,
    }
}

/// Capacity that firm orders use, by resource and release bucket.
pub fn firm_load(scenario: &Scenario) -> Vec<Vec<f64>> {
    let periods = scenario.periods();
    let mut load = vec![vec![0.0; periods]; scenario.resources.len()];
    for routing in &scenario.routings {
        let item = &scenario.items[routing.item];
        for (t, &quantity) in item.firm.iter().enumerate() {
            if quantity > 0.0 {
                let release = t.saturating_sub(item.lead_time);
                load[routing.resource][release] += routing.per_unit * quantity + routing.setup_time;
            }
        }
    }
    load
}

impl Free {
    /// The free part's plan on the full horizon (no new order inside the
    /// freeze).
    pub fn lift(&self, plan: &Plan) -> Plan {
        Plan {
            receipts: plan
                .receipts
                .iter()
                .map(|row| {
                    let mut full = vec![0.0; self.start];
                    full.extend_from_slice(row);
                    full
                })
                .collect(),
        }
    }
}
