//! Shared capacity: the scenario split into connected components of the
//! item-resource graph, the MILP for components that share a resource, and
//! the explanation when capacity cannot be met.

pub mod milp;

use crate::model::Scenario;

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
    for group in &mut groups {
        let mut resources: Vec<usize> = scenario
            .routings
            .iter()
            .filter(|x| group.items.contains(&x.item))
            .map(|x| x.resource)
            .collect();
        resources.sort_unstable();
        resources.dedup();
        group.resources = resources;
    }
    groups
}

/// Why a group cannot be planned within capacity: the first bucket from
/// which the load that must be released by then (net requirements, plus one
/// setup per item with need) exceeds the cumulative capacity with overtime.
pub fn explain_capacity(scenario: &Scenario, group: &Group) -> String {
    let periods = scenario.periods();
    for &r in &group.resources {
        let resource = &scenario.resources[r];
        let mut capacity = 0.0;
        let mut regular = 0.0;
        for t in 0..periods {
            capacity += resource.capacity[t] + resource.overtime_capacity[t];
            regular += resource.capacity[t];
            let mut load = 0.0;
            for routing in scenario.routings.iter().filter(|x| x.resource == r) {
                let item = &scenario.items[routing.item];
                // Receipts needed by bucket t + lead time must be released by t.
                let through = (t + item.lead_time).min(periods - 1);
                let net = crate::single::net_requirements(item, |s| item.stock_floor(s));
                let need: f64 = net[..=through].iter().sum();
                if need > 0.0 && !item.allows_backlog() {
                    load += routing.per_unit * need + routing.setup_time;
                }
            }
            if load > capacity + 1e-6 * (1.0 + capacity) {
                let short = load - capacity;
                let overtime_note = if regular < load {
                    format!(
                        "{} more overtime capacity by then, or backlog allowed on its items, would be needed",
                        crate::report::quantity((load - regular).ceil())
                    )
                } else {
                    String::new()
                };
                return format!(
                    "resource {}: from period 1 to period {} the load that must be made by then ({}, with one setup per item) exceeds the capacity with overtime ({}) by {}; {}",
                    resource.id,
                    t + 1,
                    crate::report::quantity(load.round()),
                    crate::report::quantity(capacity.round()),
                    crate::report::quantity(short.ceil()),
                    overtime_note
                );
            }
        }
    }
    let names: Vec<&str> = group
        .resources
        .iter()
        .map(|&r| scenario.resources[r].id.as_str())
        .collect();
    format!(
        "no plan fits the capacity of {} in every bucket, although the cumulative load fits; setup times, maximum lots or lead times leave too little room. More overtime capacity or backlog would be needed",
        names.join(", ")
    )
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
            capacity: vec![10.0; 2],
            overtime_capacity: vec![0.0; 2],
            overtime_cost: 0.0,
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
