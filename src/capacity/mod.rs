//! Shared capacity: the scenario split into connected components of the
//! item-resource graph, the MILP for components that share a resource, and
//! the explanation when capacity cannot be met.

pub(crate) mod beside;
pub mod fix_optimize;
#[allow(unsafe_code)]
mod interrupt;
pub mod lagrange;
pub mod milp;
pub mod single_dp;
mod smoothing;
pub mod staged;
pub(crate) mod tidy;

use crate::model::Scenario;

/// What plans a group of several items that share resources.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum GroupSolver {
    /// The MILP up to `AUTO_SETUP_LIMIT` setup decisions, fix-and-optimize
    /// above.
    #[default]
    Auto,
    Milp,
    Lagrangean,
    FixAndOptimize,
}

/// Setup decisions (items times buckets) above which `auto` leaves the
/// full MILP for fix-and-optimize.
pub const AUTO_SETUP_LIMIT: usize = 2000;

impl GroupSolver {
    pub const NAMES: [&'static str; 4] = ["auto", "milp", "lagrangean", "fix-and-optimize"];

    pub fn parse(name: &str) -> Option<GroupSolver> {
        Some(match name {
            "auto" => GroupSolver::Auto,
            "milp" => GroupSolver::Milp,
            "lagrangean" => GroupSolver::Lagrangean,
            "fix-and-optimize" => GroupSolver::FixAndOptimize,
            _ => return None,
        })
    }

    pub fn name(self) -> &'static str {
        Self::NAMES[self as usize]
    }

    /// The solver `auto` stands for on a group of this size.
    pub fn pick(self, items: usize, periods: usize) -> GroupSolver {
        match self {
            GroupSolver::Auto if items * periods > AUTO_SETUP_LIMIT => GroupSolver::FixAndOptimize,
            GroupSolver::Auto => GroupSolver::Milp,
            other => other,
        }
    }
}

/// A group of items that share resources, directly or through each other.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Group {
    pub items: Vec<usize>,
    pub resources: Vec<usize>,
}

/// The connected components of the item-resource graph, in item order.
/// An item with no routing is a group of its own with no resources.
pub fn components(scenario: &Scenario) -> Vec<Group> {
    let items = scenario.items.len();
    // Union-find over items; resources join the items routed to them.
    let mut parent: Vec<usize> = (0..items).collect();
    fn root(parent: &mut [usize], mut x: usize) -> usize {
        while parent[x] != x {
            parent[x] = parent[parent[x]];
            x = parent[x];
        }
        x
    }
    for r in 0..scenario.resources.len() {
        let routed: Vec<usize> = scenario
            .routings
            .iter()
            .filter(|x| x.resource == r)
            .map(|x| x.item)
            .collect();
        for pair in routed.windows(2) {
            let (a, b) = (root(&mut parent, pair[0]), root(&mut parent, pair[1]));
            if a != b {
                parent[a.max(b)] = a.min(b);
            }
        }
    }
    let mut groups: Vec<Group> = Vec::new();
    let mut slot = vec![usize::MAX; items];
    for i in 0..items {
        let r = root(&mut parent, i);
        if slot[r] == usize::MAX {
            slot[r] = groups.len();
            groups.push(Group {
                items: Vec::new(),
                resources: Vec::new(),
            });
        }
        groups[slot[r]].items.push(i);
    }
    for routing in &scenario.routings {
        let r = root(&mut parent, routing.item);
        groups[slot[r]].resources.push(routing.resource);
    }
    for group in &mut groups {
        group.resources.sort_unstable();
        group.resources.dedup();
    }
    groups
}

/// The first resource and bucket from which the load that must be released
/// by then (net requirements, plus one setup per item with need) exceeds
/// the cumulative capacity with overtime: (resource, bucket, load,
/// capacity). Where there is one, no plan fits.
pub fn cumulative_shortfall(
    scenario: &Scenario,
    group: &Group,
) -> Option<(usize, usize, f64, f64)> {
    let periods = scenario.periods();
    for &r in &group.resources {
        let resource = &scenario.resources[r];
        // Per routed item without backlog: its per-unit use, setup time,
        // lead time and cumulative net requirement by receipt bucket.
        let routed: Vec<(f64, f64, usize, Vec<f64>)> = scenario
            .routings
            .iter()
            .filter(|x| x.resource == r && !scenario.items[x.item].allows_backlog())
            .map(|routing| {
                let item = &scenario.items[routing.item];
                let net = crate::single::net_requirements(item, |s| item.stock_floor(s));
                let cumulative = net
                    .iter()
                    .scan(0.0, |sum, &q| {
                        *sum += q;
                        Some(*sum)
                    })
                    .collect();
                (
                    routing.per_unit,
                    routing.setup_time,
                    item.lead_time,
                    cumulative,
                )
            })
            .collect();
        let mut capacity = 0.0;
        for t in 0..periods {
            capacity += resource.capacity[t] + resource.overtime_capacity[t];
            let mut load = 0.0;
            for (per_unit, setup_time, lead_time, cumulative) in &routed {
                // Receipts needed by bucket t + lead time must be released by t.
                let need = cumulative[(t + lead_time).min(periods - 1)];
                if need > 0.0 {
                    load += per_unit * need + setup_time;
                }
            }
            if load > capacity + 1e-6 * (1.0 + capacity) {
                return Some((r, t, load, capacity));
            }
        }
    }
    None
}

/// Why a group cannot be planned within capacity, as data (the words are
/// `report::notes::capacity_shortfall`'s).
#[derive(Debug, Clone, PartialEq)]
pub enum Shortfall {
    /// The load that must be made by the end of release bucket `last`
    /// (with one setup per item) exceeds `resource`'s capacity with
    /// overtime over buckets 0..=last.
    Cumulative {
        resource: usize,
        last: usize,
        load: f64,
        capacity: f64,
    },
    /// Capacity missing by (resource, release bucket, amount); `least`
    /// when the MILP proved it the least that makes a plan possible.
    Buckets {
        places: Vec<(usize, usize, f64)>,
        least: bool,
    },
    /// The search for the capacity missing ran out of time.
    Undecided { resources: Vec<usize> },
    /// No extra capacity alone makes a plan possible.
    NotCapacity { resources: Vec<usize> },
}

/// Why a group cannot be planned within capacity: the cumulative test of
/// `cumulative_shortfall` where it finds the cause, else the least extra
/// capacity a plan needs.
pub fn explain_capacity(
    scenario: &Scenario,
    group: &Group,
    options: &milp::MilpOptions,
) -> Shortfall {
    if let Some((resource, last, load, capacity)) = cumulative_shortfall(scenario, group) {
        return Shortfall::Cumulative {
            resource,
            last,
            load,
            capacity,
        };
    }
    // The cumulative test misses what setup times, maximum lots, lead times
    // and several resources do together: ask the MILP for the least extra
    // capacity that makes a plan possible, and say where it is needed.
    let extra = milp::MilpOptions {
        extra_capacity: true,
        time_limit: options.time_limit.min(30.0),
        ..options.clone()
    };
    let result = milp::solve(scenario, &group.items, &extra);
    if !result.shortfall.is_empty() {
        return Shortfall::Buckets {
            places: result.shortfall,
            least: result.status == milp::MilpStatus::Optimal,
        };
    }
    let resources = group.resources.clone();
    if result.status != milp::MilpStatus::Infeasible {
        return Shortfall::Undecided { resources };
    }
    Shortfall::NotCapacity { resources }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{BucketKind, Calendar, Resource, Routing};
    use crate::single::exact::tests::item_with;

    #[test]
    fn items_sharing_a_resource_form_one_component() {
        let mut items = Vec::new();
        for id in ["A", "B", "C", "D"] {
            let mut item = item_with(&[1.0, 1.0], 1.0, 1.0);
            item.id = id.into();
            items.push(item);
        }
        let resource = |id: &str| Resource {
            id: id.into(),
            unit: "capacity units".into(),
            capacity: vec![10.0; 2],
            overtime_capacity: vec![0.0; 2],
            overtime_cost: 0.0,
            capacity_cost: None,
        };
        let route = |item, resource| Routing {
            item,
            resource,
            per_unit: 1.0,
            setup_time: 0.0,
        };
        let scenario = Scenario {
            name: "t".into(),
            currency: None,
            calendar: Calendar {
                start: chrono::NaiveDate::from_ymd_opt(2027, 1, 4).unwrap(),
                kind: BucketKind::Week,
                periods: 2,
            },
            items,
            resources: vec![resource("P"), resource("Q")],
            // A and C share P; C and D share Q; B has no routing.
            routings: vec![route(0, 0), route(2, 0), route(2, 1), route(3, 1)],
            frozen: 0,
            bom: Vec::new(),
            period_offset: 0,
        };
        let groups = components(&scenario);
        assert_eq!(
            groups,
            vec![
                Group {
                    items: vec![0, 2, 3],
                    resources: vec![0, 1]
                },
                Group {
                    items: vec![1],
                    resources: vec![]
                },
            ]
        );
    }
}
