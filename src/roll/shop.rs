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
//! Order of the cut, on an overloaded resource: first the order of the
//! item with the most cover without it (stock on hand plus what arrives
//! this bucket, less this bucket's requirement, over its mean requirement
//! in the buckets ahead), that is the item that can wait longest; ties go
//! to the later item in items.csv. An order is cut down to what still
//! fits, kept whole where the item has a lot multiple and above its
//! minimum lot, or dropped with its setup time when less would not fit.

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

/// Fits the releases of bucket `b` to the resources of `base`. `cover`
/// gives, by item, the buckets of requirement its stock covers without
/// this bucket's order (larger is cut first).
pub fn carry_out(base: &Scenario, b: usize, releases: &[Release], cover: &[f64]) -> Carried {
    let mut orders: Vec<Release> = releases.to_vec();
    let load = |orders: &[Release], r: usize| -> f64 {
        base.routings
            .iter()
            .filter(|route| route.resource == r)
            .map(|route| {
                orders
                    .iter()
                    .filter(|o| o.item == route.item && o.quantity > 0.0)
                    .map(|o| route.per_unit * o.quantity + route.setup_time)
                    .sum::<f64>()
            })
            .sum()
    };
    let limit = |r: usize| {
        let resource = &base.resources[r];
        resource.capacity[b] + resource.overtime_capacity[b]
    };
    let tolerance = |r: usize| 1e-9 * (1.0 + limit(r).abs());
    let overload: f64 = (0..base.resources.len())
        .map(|r| (load(&orders, r) - limit(r)).max(0.0))
        .sum();
    let mut cuts = Vec::new();
    for r in 0..base.resources.len() {
        while load(&orders, r) > limit(r) + tolerance(r) {
            // The order on r that can wait longest.
            let pick = orders
                .iter()
                .enumerate()
                .filter(|(_, o)| o.quantity > 0.0)
                .filter_map(|(k, o)| {
                    base.routings
                        .iter()
                        .find(|route| route.resource == r && route.item == o.item)
                        .map(|route| (k, route.per_unit))
                })
                .max_by(|(x, _), (y, _)| {
                    let (ox, oy) = (&orders[*x], &orders[*y]);
                    cover[ox.item]
                        .total_cmp(&cover[oy.item])
                        .then(ox.item.cmp(&oy.item))
                });
            let Some((k, per_unit)) = pick else { break };
            let excess = load(&orders, r) - limit(r);
            let item = &base.items[orders[k].item];
            let had = orders[k].quantity;
            let mut keep = if per_unit > 0.0 {
                had - excess / per_unit
            } else {
                0.0
            };
            if let Some(multiple) = item.lot_multiple {
                keep = (keep / multiple + 1e-9).floor() * multiple;
            }
            if keep < item.min_lot.max(1e-9) || keep <= 0.0 {
                keep = 0.0;
            }
            // Always take something off, or the loop would not end.
            let keep = if keep >= had { 0.0 } else { keep };
            cuts.push(Cut {
                item: orders[k].item,
                bucket: b,
                resource: r,
                quantity: had - keep,
            });
            orders[k].quantity = keep;
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
