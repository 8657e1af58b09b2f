//! Carrying out a week's orders as the lines allow.
//!
//! A plan may release more work in a bucket than the resources hold (a
//! lot rule ignores capacity; a plan that could not be met is shown
//! anyway). The shop cannot make it: in `roll`, the orders released in the
//! week being carried out are checked against each resource's capacity
//! plus overtime in that bucket, and where they exceed it, work is cut
//! until they fit. The cut is not made that week (it is not moved either):
//! the next week's plan starts from the stock that resulted and plans the
//! shortfall again.
//!
//! Order of the cut: the orders are carried out in order of urgency, the
//! item with the least cover without its order first (stock on hand plus
//! what arrives this bucket, less this bucket's requirement, over its mean
//! requirement in the buckets ahead); ties go to the earlier item in
//! items.csv. Each is made as far as it still fits on every resource it
//! uses, kept whole where the item has a lot multiple and at or above its
//! minimum lot, or dropped with its setup time when less would not fit.
//! So the item that can wait longest is cut first, and an order dropped
//! leaves its room to the orders after it (tests/roll_shop.rs checks the
//! result against every choice on small cases).

use crate::model::Scenario;

use super::Release;

/// Work taken out of an order so that the week's releases fit.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Cut {
    pub item: usize,
    /// Release bucket (of the scenario).
    pub bucket: usize,
    /// The resource whose capacity forced the cut.
    pub resource: usize,
    /// Units not made.
    pub quantity: f64,
}

/// What the shop did with one bucket's releases.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Carried {
    /// The releases as carried out (an order cut to 0 is left out).
    pub orders: Vec<Release>,
    pub cuts: Vec<Cut>,
    /// Load of the releases as planned beyond capacity plus overtime,
    /// summed over the resources (capacity units).
    pub overload: f64,
}

/// Carries out bucket `b`'s releases as the lines allow. `cover[i]` is
/// item i's cover in buckets without this bucket's order (infinite for an
/// item with no requirement ahead).
pub fn carry_out(base: &Scenario, b: usize, releases: &[Release], cover: &[f64]) -> Carried {
    let mut orders: Vec<Release> = releases.to_vec();
    let resources = base.resources.len();
    let limit = |r: usize| {
        let resource = &base.resources[r];
        resource.capacity[b] + resource.overtime_capacity[b]
    };
    let tolerance = |r: usize| 1e-9 * (1.0 + limit(r).abs());
    let routes = |item: usize| base.routings.iter().filter(move |route| route.item == item);
    let mut load = vec![0.0; resources];
    for o in orders.iter().filter(|o| o.quantity > 0.0) {
        for route in routes(o.item) {
            load[route.resource] += route.per_unit * o.quantity + route.setup_time;
        }
    }
    let overload: f64 = (0..resources).map(|r| (load[r] - limit(r)).max(0.0)).sum();
    if (0..resources).all(|r| load[r] <= limit(r) + tolerance(r)) {
        orders.retain(|o| o.quantity > 0.0);
        return Carried {
            orders,
            cuts: Vec::new(),
            overload,
        };
    }
    // The orders that can wait least go first, each as much as still fits
    // on every resource it uses; ties go to the earlier item, so the later
    // one is cut first.
    let mut turn: Vec<usize> = (0..orders.len()).collect();
    turn.sort_by(|&x, &y| {
        let (ox, oy) = (&orders[x], &orders[y]);
        cover[ox.item]
            .total_cmp(&cover[oy.item])
            .then(ox.item.cmp(&oy.item))
    });
    let mut used = vec![0.0; resources];
    let mut cuts = Vec::new();
    for k in turn {
        let had = orders[k].quantity;
        if had <= 0.0 {
            continue;
        }
        let item = &base.items[orders[k].item];
        let mut keep = had;
        let mut binding = None;
        for route in routes(orders[k].item) {
            let r = route.resource;
            let room = limit(r) - used[r] - route.setup_time;
            let fits = if room < -tolerance(r) {
                0.0
            } else if route.per_unit > 0.0 {
                room.max(0.0) / route.per_unit
            } else {
                f64::INFINITY
            };
            if fits < keep - 1e-9 * (1.0 + keep) {
                keep = fits;
                binding = Some(r);
            }
        }
        if let Some(r) = binding {
            if let Some(multiple) = item.lot_multiple {
                keep = (keep / multiple + 1e-9).floor() * multiple;
            }
            if keep < item.min_lot.max(1e-9) {
                keep = 0.0;
            }
            let keep = keep.min(had);
            if keep < had {
                cuts.push(Cut {
                    item: orders[k].item,
                    bucket: b,
                    resource: r,
                    quantity: had - keep,
                });
                orders[k].quantity = keep;
            }
        }
        if orders[k].quantity > 0.0 {
            for route in routes(orders[k].item) {
                used[route.resource] += route.per_unit * orders[k].quantity + route.setup_time;
            }
        }
    }
    orders.retain(|o| o.quantity > 0.0);
    Carried {
        orders,
        cuts,
        overload,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{BucketKind, Calendar, Item, Resource, Routing};

    /// Two items on one line of 100 a bucket (no overtime), 1 unit of
    /// capacity per unit and a setup time of 10. Orders of 60 (A) and 50
    /// (B) load 130: 30 over. A's stock covers 4 buckets, B's 1, so A is
    /// cut first, by 30 to 30 (load 40 + 60 = 100).
    #[test]
    fn the_item_that_can_wait_longest_is_cut_to_what_fits() {
        let base = Scenario {
            name: "shop".into(),
            currency: None,
            calendar: Calendar {
                start: chrono::NaiveDate::from_ymd_opt(2027, 1, 4).unwrap(),
                kind: BucketKind::Week,
                periods: 2,
            },
            items: vec![
                Item::simple("A", &[10.0, 10.0], 50.0, 1.0),
                Item::simple("B", &[10.0, 10.0], 50.0, 1.0),
            ],
            resources: vec![Resource {
                id: "LINE".into(),
                unit: "capacity units".into(),
                capacity: vec![100.0; 2],
                overtime_capacity: vec![0.0; 2],
                overtime_cost: 0.0,
                capacity_cost: None,
            }],
            routings: (0..2)
                .map(|item| Routing {
                    item,
                    resource: 0,
                    per_unit: 1.0,
                    setup_time: 10.0,
                })
                .collect(),
            frozen: 0,
            bom: Vec::new(),
            period_offset: 0,
        };
        let releases = [
            Release {
                item: 0,
                bucket: 0,
                quantity: 60.0,
            },
            Release {
                item: 1,
                bucket: 0,
                quantity: 50.0,
            },
        ];
        let carried = carry_out(&base, 0, &releases, &[4.0, 1.0]);
        assert!((carried.overload - 30.0).abs() < 1e-9);
        assert_eq!(carried.cuts.len(), 1);
        assert_eq!(carried.cuts[0].item, 0);
        assert!((carried.cuts[0].quantity - 30.0).abs() < 1e-9);
        assert_eq!(carried.orders[0].quantity, 30.0);
        assert_eq!(carried.orders[1].quantity, 50.0);

        // Within capacity nothing is cut.
        let fits = carry_out(&base, 0, &releases[1..], &[4.0, 1.0]);
        assert_eq!(fits.overload, 0.0);
        assert!(fits.cuts.is_empty());
        assert_eq!(fits.orders, releases[1..].to_vec());
    }
}
