//! Lagrangean relaxation of the capacity rows, after J. Trigeiro, L. J.
//! Thomas and J. O. McClain (1989), "Capacitated lot sizing with setup
//! times", Management Science 35(3): with a price `lambda[r][t] >= 0` on each
//! capacity row, the group falls apart into one uncapacitated item per
//! subproblem, solved exactly by the single-item dynamic program with the
//! capacity priced into its unit and setup costs. Every price vector gives a
//! lower bound on the least cost; subgradient steps raise it. A smoothing
//! heuristic (a backward pass that moves production out of overloaded
//! buckets into earlier ones) turns the subproblems' plans into plans within
//! capacity.
//!
//! The relaxation also drops the lot constraints and the capacity bound of
//! each bucket, so its bound is valid whatever the items carry; it is never
//! above the LP bound of the facility-location model (Pochet and Wolsey,
//! "Production Planning by Mixed Integer Programming", Springer 2006,
//! ch. 7), whose single-item polytope is the convex hull of the
//! uncapacitated problem.

use std::time::Instant;

use crate::eval::{evaluate, quantity_tolerance};
use crate::model::{Item, Plan, Scenario};
use crate::single::fast;

/// What the relaxation found.
#[derive(Debug, Clone)]
pub struct Relaxation {
    /// The best proven lower bound (every cost included).
    pub lower_bound: f64,
    pub iterations: usize,
    /// The best plan within capacity the smoothing found, with its cost
    /// (receipts by item of the group).
    pub best_plan: Option<(Vec<Vec<f64>>, f64)>,
    /// The subproblems' receipts at the best bound: cheap but may overload.
    pub pattern: Vec<Vec<f64>>,
}

/// One item of the group: its costs before pricing and its routes.
pub(crate) struct Member {
    pub(crate) base: Item,
    priced: Item,
    /// (resource of the group, per-unit use, setup time).
    pub(crate) routes: Vec<(usize, f64, f64)>,
}

/// The group's data in the relaxation's own terms.
pub(crate) struct Frame {
    pub(crate) members: Vec<Member>,
    /// Capacity, overtime capacity by resource of the group and bucket.
    pub(crate) capacity: Vec<Vec<f64>>,
    pub(crate) overtime: Vec<Vec<f64>>,
    overtime_cost: Vec<f64>,
    pub(crate) periods: usize,
}

impl Frame {
    pub(crate) fn new(scenario: &Scenario, items: &[usize], resources: &[usize]) -> Frame {
        let members = items
            .iter()
            .map(|&i| {
                let routes = scenario
                    .routings_of(i)
                    .filter_map(|x| {
                        let r = resources.iter().position(|&r| r == x.resource)?;
                        Some((r, x.per_unit, x.setup_time))
                    })
                    .collect();
                Member {
                    base: scenario.items[i].clone(),
                    priced: scenario.items[i].clone(),
                    routes,
                }
            })
            .collect();
        Frame {
            members,
            capacity: resources
                .iter()
                .map(|&r| scenario.resources[r].capacity.clone())
                .collect(),
            overtime: resources
                .iter()
                .map(|&r| scenario.resources[r].overtime_capacity.clone())
                .collect(),
            overtime_cost: resources
                .iter()
                .map(|&r| scenario.resources[r].overtime_cost)
                .collect(),
            periods: scenario.periods(),
        }
    }

    /// Load by resource of the group and release bucket of these receipts.
    pub(crate) fn load(&self, receipts: &[Vec<f64>]) -> Vec<Vec<f64>> {
        let mut load = vec![vec![0.0; self.periods]; self.capacity.len()];
        for (member, received) in self.members.iter().zip(receipts) {
            let lead = member.base.lead_time;
            let tolerance = quantity_tolerance(&member.base);
            for (j, &q) in received.iter().enumerate().skip(lead) {
                if q <= tolerance {
                    continue;
                }
                for &(r, per_unit, setup_time) in &member.routes {
                    load[r][j - lead] += per_unit * q + setup_time;
                }
            }
        }
        load
    }
}

/// Raises the Lagrangean bound by subgradient steps until `deadline`, at
/// most `iterations` steps, or until the step size has shrunk to nothing.
/// `None` when an item has no plan even without capacity (need before its
/// lead time has passed).
pub fn relax(
    scenario: &Scenario,
    items: &[usize],
    resources: &[usize],
    deadline: Instant,
    iterations: usize,
) -> Option<Relaxation> {
    let mut frame = Frame::new(scenario, items, resources);
    let subset = scenario.subset(items);
    let rows = frame.capacity.len();
    let periods = frame.periods;
    let mut price = vec![vec![0.0; periods]; rows];
    let mut best_bound = f64::NEG_INFINITY;
    let mut best_plan: Option<(Vec<Vec<f64>>, f64)> = None;
    let mut pattern = Vec::new();
    let mut step = 1.0;
    let mut stalled = 0;
    let mut done = 0;
    while done < iterations && Instant::now() < deadline && step > 1e-4 {
        done += 1;
        let (receipts, bound) = subproblems(&mut frame, &price)?;
        if bound > best_bound + 1e-9 * bound.abs().max(1.0) {
            best_bound = bound;
            pattern = receipts.clone();
            stalled = 0;
        } else {
            stalled += 1;
            if stalled >= 10 {
                step /= 2.0;
                stalled = 0;
            }
        }
        // Smoothing costs far more than a step (it scans earlier buckets
        // for room); every tenth step is tried.
        if done % 10 == 1 {
            if let Some(smoothed) = super::smoothing::smooth(&frame, &receipts) {
                let cost = evaluate(
                    &subset,
                    &Plan {
                        receipts: smoothed.clone(),
                    },
                );
                if cost.feasible
                    && best_plan
                        .as_ref()
                        .is_none_or(|(_, best)| cost.total_cost() < *best)
                {
                    best_plan = Some((smoothed, cost.total_cost()));
                }
            }
        }
        // The subgradient: load beyond capacity (and beyond overtime where
        // the price makes overtime worth buying).
        let load = frame.load(&receipts);
        let mut gradient = vec![vec![0.0; periods]; rows];
        let mut norm = 0.0;
        for r in 0..rows {
            for t in 0..periods {
                let mut g = load[r][t] - frame.capacity[r][t];
                if price[r][t] > frame.overtime_cost[r] {
                    g -= frame.overtime[r][t];
                }
                if price[r][t] <= 0.0 && g < 0.0 {
                    g = 0.0;
                }
                gradient[r][t] = g;
                norm += g * g;
            }
        }
        if norm <= 1e-12 {
            // Within capacity at these prices with nothing to complain of:
            // the bound cannot rise further along the subgradient.
            break;
        }
        let target = match &best_plan {
            Some((_, cost)) => *cost,
            None => best_bound + 0.05 * best_bound.abs().max(1.0),
        };
        let length = step * (target - bound).max(1e-6 * bound.abs().max(1.0)) / norm;
        for r in 0..rows {
            for t in 0..periods {
                price[r][t] = (price[r][t] + length * gradient[r][t]).max(0.0);
            }
        }
    }
    Some(Relaxation {
        lower_bound: best_bound,
        iterations: done,
        best_plan,
        pattern,
    })
}

/// Solves every item at these prices; returns the receipts and the
/// Lagrangean bound.
#[allow(clippy::needless_range_loop)]
fn subproblems(frame: &mut Frame, price: &[Vec<f64>]) -> Option<(Vec<Vec<f64>>, f64)> {
    let periods = frame.periods;
    let mut bound = 0.0;
    let mut receipts = Vec::with_capacity(frame.members.len());
    for member in &mut frame.members {
        for t in 0..periods {
            let mut setup = member.base.setup_cost[t];
            let mut unit = member.base.unit_cost[t];
            for &(r, per_unit, setup_time) in &member.routes {
                setup += price[r][t] * setup_time;
                unit += price[r][t] * per_unit;
            }
            member.priced.setup_cost[t] = setup;
            member.priced.unit_cost[t] = unit;
        }
        let solved = fast::solve(&member.priced)?;
        bound += solved.cost;
        receipts.push(solved.receipts);
    }
    for r in 0..frame.capacity.len() {
        for t in 0..periods {
            bound -= price[r][t] * frame.capacity[r][t];
            let overtime_gain = price[r][t] - frame.overtime_cost[r];
            if overtime_gain > 0.0 {
                bound -= overtime_gain * frame.overtime[r][t];
            }
        }
    }
    Some((receipts, bound))
}
