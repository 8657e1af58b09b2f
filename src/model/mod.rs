//! The validated scenario: items with per-bucket costs, demand and receipts,
//! resources with per-bucket capacity, routings, and the plan type that every
//! method returns.
//!
//! Everything here has been checked at the edge (`crate::input`); code that
//! takes these types may rely on finite, non-negative numbers and consistent
//! lengths (every per-bucket vector has `calendar.periods` entries).

mod calendar;
mod plan;
pub mod safety;

pub use calendar::{BucketKind, Calendar, DatePlace};
pub use plan::Plan;

use serde::Serialize;

/// The unit of an item whose row in items.csv gives none.
pub const DEFAULT_ITEM_UNIT: &str = "units";
/// The unit of a resource whose row in resources.csv gives none.
pub const DEFAULT_CAPACITY_UNIT: &str = "capacity units";

/// The one unit every entry shares, or `None` when they differ (or there
/// are none): quantities may then be added only as value, not as counts.
pub fn shared_unit<'a>(mut units: impl Iterator<Item = &'a str>) -> Option<&'a str> {
    let first = units.next()?;
    units.all(|u| u == first).then_some(first)
}

/// One item to be made or bought.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Item {
    pub id: String,
    /// What one unit of the item is (kegs, cartons, kg): the unit of its
    /// quantities in every output. `DEFAULT_ITEM_UNIT` when items.csv
    /// gives none.
    pub unit: String,
    /// Cost of a setup (or an order), by the bucket where the release falls.
    pub setup_cost: Vec<f64>,
    /// The setup cost of items.csv, before per-bucket overrides (the EOQ
    /// rule sizes its lot from it).
    pub nominal_setup_cost: f64,
    /// The holding cost per unit per bucket from items.csv (or its rate times
    /// unit cost), before per-bucket overrides.
    pub nominal_holding_cost: f64,
    /// Cost of holding one unit for one bucket, by bucket of the stock.
    pub holding_cost: Vec<f64>,
    /// Cost of one unit made or bought, by release bucket.
    pub unit_cost: Vec<f64>,
    pub initial_stock: f64,
    pub safety_stock: f64,
    /// Buckets between release and receipt.
    pub lead_time: usize,
    pub min_lot: f64,
    /// `None` means continuous quantities.
    pub lot_multiple: Option<f64>,
    pub max_lot: Option<f64>,
    /// Cost per unit backordered per bucket; `None` means no backlog allowed.
    pub backlog_cost: Option<f64>,
    /// The lot size of the plant's current fixed-lot rule, if it has one.
    pub fixed_lot: Option<f64>,
    /// Stock wanted at the end of the horizon (a floor on the last bucket's stock).
    pub ending_stock: f64,
    /// Standard deviation of the one-bucket-ahead forecast error, where
    /// items.csv gives it (`forecast_error`): with a target service level
    /// it sets the safety stock (`safety`).
    pub forecast_error: Option<f64>,
    /// Gross requirement by bucket.
    pub demand: Vec<f64>,
    /// Scheduled receipts (open orders already released), by receipt bucket.
    pub receipts: Vec<f64>,
    /// Firm orders (orders-firm.csv), by receipt bucket: orders the planner
    /// has pinned, released inside the horizon (receipt bucket minus lead
    /// time is bucket 0 or later) and kept as they are by every method.
    /// They pay their setup and unit cost and load the resources like any
    /// order; lot constraints do not apply to them.
    pub firm: Vec<f64>,
    /// A price on moving away from an earlier plan's quantities (set by
    /// `crate::roll` on each week's window; `None` everywhere else).
    pub quantity_change: Option<QuantityChange>,
}

/// A price per unit moved away from an earlier plan: the plan pays
/// `per_unit` x |release - previous| in every release bucket the earlier
/// plan covers, where release is the quantity released in the bucket
/// (planned and firm orders together). The cost is convex in the
/// quantity, so only programs that price each bucket's quantity as it is
/// (the MILP, with two deviation columns per bucket) are exact for it;
/// the dynamic programs on the zero-inventory property are not.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct QuantityChange {
    /// Cost per unit of |release - previous|.
    pub per_unit: f64,
    /// The earlier plan's release quantity by release bucket (0 where it
    /// had no order); `None` where the earlier plan does not cover the
    /// bucket, which then pays nothing. A value may be below 0 only where
    /// firm orders were taken out of the item (`crate::replan`).
    pub previous: Vec<Option<f64>>,
}

impl QuantityChange {
    /// The change cost of releasing `release` in bucket `r`.
    pub fn cost(&self, r: usize, release: f64) -> f64 {
        match self.previous.get(r).copied().flatten() {
            Some(previous) => self.per_unit * (release - previous).abs(),
            None => 0.0,
        }
    }
}

impl Item {
    /// An item with constant costs and nothing else: no unit cost, stock,
    /// lead time, lot rules or backlog (for benchmark readers and tests).
    pub fn simple(id: &str, demand: &[f64], setup_cost: f64, holding_cost: f64) -> Item {
        let periods = demand.len();
        Item {
            id: id.to_string(),
            unit: DEFAULT_ITEM_UNIT.to_string(),
            setup_cost: vec![setup_cost; periods],
            nominal_setup_cost: setup_cost,
            nominal_holding_cost: holding_cost,
            holding_cost: vec![holding_cost; periods],
            unit_cost: vec![0.0; periods],
            initial_stock: 0.0,
            safety_stock: 0.0,
            lead_time: 0,
            min_lot: 0.0,
            lot_multiple: None,
            max_lot: None,
            backlog_cost: None,
            fixed_lot: None,
            ending_stock: 0.0,
            forecast_error: None,
            demand: demand.to_vec(),
            receipts: vec![0.0; periods],
            firm: vec![0.0; periods],
            quantity_change: None,
        }
    }

    /// What an earlier plan released for receipt in bucket `j`, beyond
    /// the firm orders there (0 without a price per unit moved): under
    /// that price an optimal plan may receive up to this much beyond
    /// need, so programs that bound a receipt by the need widen the bound
    /// by it. Lowering a receipt that lies above both this and its need
    /// (by whole lot multiples, staying at or above the minimum lot)
    /// lowers its unit, holding and change cost alike.
    pub fn kept_release(&self, j: usize) -> f64 {
        let Some(change) = self.quantity_change.as_ref().filter(|c| c.per_unit > 0.0) else {
            return 0.0;
        };
        let Some(r) = j.checked_sub(self.lead_time) else {
            return 0.0;
        };
        let firm = self.firm.get(j).copied().unwrap_or(0.0);
        change
            .previous
            .get(r)
            .copied()
            .flatten()
            .map_or(0.0, |p| (p - firm).max(0.0))
    }

    /// Whether a price per unit moved applies to any bucket of the item.
    pub fn has_quantity_change(&self) -> bool {
        self.quantity_change
            .as_ref()
            .is_some_and(|c| c.per_unit > 0.0 && c.previous.iter().any(Option::is_some))
    }

    /// True when the item carries a minimum lot, a lot multiple or a maximum lot.
    pub fn has_lot_constraints(&self) -> bool {
        self.min_lot > 0.0 || self.lot_multiple.is_some() || self.max_lot.is_some()
    }

    pub fn allows_backlog(&self) -> bool {
        self.backlog_cost.is_some()
    }

    pub fn periods(&self) -> usize {
        self.demand.len()
    }

    /// The stock wanted at the end of bucket `t`: safety stock, and in the
    /// last bucket also the ending-stock target. Before the lead time has
    /// passed no order can arrive, so no stock can be asked for there.
    pub fn stock_target(&self, t: usize) -> f64 {
        if t < self.lead_time {
            return 0.0;
        }
        if t + 1 == self.periods() {
            self.safety_stock.max(self.ending_stock)
        } else {
            self.safety_stock
        }
    }

    /// The stock floor a plan must respect at the end of bucket `t`. An item
    /// that allows backlog treats safety stock as a target only, so its floor
    /// is the ending stock alone.
    pub fn stock_floor(&self, t: usize) -> f64 {
        if self.allows_backlog() {
            if t + 1 == self.periods() && t >= self.lead_time {
                self.ending_stock
            } else {
                0.0
            }
        } else {
            self.stock_target(t)
        }
    }
}

/// A machine, line or crew with a capacity per bucket.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Resource {
    pub id: String,
    /// What capacity is counted in (hours, minutes, pieces): the unit of
    /// its capacity, load and overtime in every output, and of the
    /// routings' `per_unit` and `setup_time`. `DEFAULT_CAPACITY_UNIT`
    /// when resources.csv gives none.
    pub unit: String,
    pub capacity: Vec<f64>,
    pub overtime_capacity: Vec<f64>,
    pub overtime_cost: f64,
    /// What one more unit of regular capacity costs in a bucket, where
    /// resources.csv gives it (`capacity_cost`): `compare` prices the
    /// capacity a scenario adds with it.
    pub capacity_cost: Option<f64>,
}

/// How much of a resource an item uses.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Routing {
    pub item: usize,
    pub resource: usize,
    pub per_unit: f64,
    pub setup_time: f64,
}

/// One line of the bill of material: `quantity_per` units of `component`
/// go into one unit of `parent`, issued when the parent's order is
/// released. `scrap_rate` is the share of the component lost on the way,
/// issued on top: a release of q parents needs q x quantity_per x
/// (1 + scrap_rate) components (a component scrap allowance, as MRP
/// practice usually states it).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BomLine {
    pub parent: usize,
    pub component: usize,
    pub quantity_per: f64,
    pub scrap_rate: f64,
}

impl BomLine {
    /// Components needed per unit of the parent released, scrap included.
    pub fn per_parent_unit(&self) -> f64 {
        self.quantity_per * (1.0 + self.scrap_rate)
    }
}

/// A whole, validated planning scenario.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Scenario {
    pub name: String,
    pub currency: Option<String>,
    pub calendar: Calendar,
    pub items: Vec<Item>,
    pub resources: Vec<Resource>,
    pub routings: Vec<Routing>,
    /// The bill of material (bom.csv); empty when every item's demand
    /// comes from outside. The reader makes sure it has no cycle.
    pub bom: Vec<BomLine>,
    /// The frozen horizon: release buckets `0..frozen` take no new orders,
    /// only firm orders and receipts (0: nothing is frozen).
    pub frozen: usize,
    /// Added to bucket numbers in messages: a scenario cut from a longer
    /// one (the part after a frozen horizon) names its buckets as the
    /// planner knows them.
    #[serde(skip)]
    pub period_offset: usize,
}

impl Scenario {
    pub fn periods(&self) -> usize {
        self.calendar.periods
    }

    /// Whether the planner pinned orders or froze buckets: then the methods
    /// plan the part of the problem that is still free (`crate::replan`).
    pub fn has_replanning(&self) -> bool {
        self.frozen > 0
            || self
                .items
                .iter()
                .any(|item| item.firm.iter().any(|&q| q > 0.0))
    }

    /// The first receipt bucket a new order of `item` can reach: its lead
    /// time after the frozen horizon.
    pub fn first_arrival(&self, item: &Item) -> usize {
        self.frozen + item.lead_time
    }

    /// Whether a bill of material links the items: then a parent's
    /// releases are its components' requirements (`crate::multilevel`).
    pub fn has_bom(&self) -> bool {
        !self.bom.is_empty()
    }

    /// The low-level code of every item: 0 for an item that goes into no
    /// other, else one more than the highest code of its parents (the
    /// lowest level at which it appears in any bill). Planning items in
    /// this order sees every parent before its components.
    pub fn low_level_codes(&self) -> Vec<usize> {
        let mut codes = vec![0; self.items.len()];
        // A chain in an acyclic bill has fewer lines than items, so this
        // settles within as many passes as there are items.
        for _ in 0..self.items.len() {
            let mut changed = false;
            for line in &self.bom {
                let wanted = codes[line.parent] + 1;
                if codes[line.component] < wanted {
                    codes[line.component] = wanted;
                    changed = true;
                }
            }
            if !changed {
                break;
            }
        }
        codes
    }

    /// Items in low-level-code order (ties by their order in items.csv).
    pub fn level_order(&self) -> Vec<usize> {
        let codes = self.low_level_codes();
        let mut order: Vec<usize> = (0..self.items.len()).collect();
        order.sort_by_key(|&i| (codes[i], i));
        order
    }

    /// The requirement that parents' releases place on each item, by item
    /// and bucket: a parent's release (`releases[parent][t]`, by release
    /// bucket, firm orders included) issued along each line
    /// (`Scenario::issue`), in the same bucket.
    pub fn dependent_requirements(&self, releases: &[Vec<f64>]) -> Vec<Vec<f64>> {
        let mut need = vec![vec![0.0; self.periods()]; self.items.len()];
        for line in &self.bom {
            for (t, &q) in releases[line.parent].iter().enumerate() {
                if q > 0.0 {
                    need[line.component][t] += self.issue(line, q);
                }
            }
        }
        need
    }

    /// The components a release of `parent_quantity` parents calls for
    /// along `line`: quantity per times (1 + scrap rate), rounded up to a
    /// whole unit when the component is counted in whole units (its
    /// `lot_multiple` is not 0). A scrap allowance on a whole-unit part
    /// issues whole parts: 23 parents at 1.1 each call for 26, not 25.3.
    /// What is issued in one bucket along one line is rounded once.
    pub fn issue(&self, line: &BomLine, parent_quantity: f64) -> f64 {
        let exact = line.per_parent_unit() * parent_quantity;
        if self.rounds_issue(line) {
            // Float noise (25.999999999) is not a fraction anyone issued.
            let nearest = exact.round();
            if (exact - nearest).abs() < 1e-6 {
                nearest
            } else {
                exact.ceil()
            }
        } else {
            exact
        }
    }

    /// Whether `issue` may round along this line: the component comes in
    /// whole units, and a parent release can call for a fraction of one
    /// (a fractional quantity per, scrap included, or a continuous parent).
    pub fn rounds_issue(&self, line: &BomLine) -> bool {
        self.items[line.component].lot_multiple.is_some()
            && (line.per_parent_unit().fract() != 0.0
                || self.items[line.parent].lot_multiple.is_none())
    }

    pub fn item_index(&self, id: &str) -> Option<usize> {
        self.items.iter().position(|item| item.id == id)
    }

    /// The scenario of just these items (in this order), with every
    /// resource and the routings of these items.
    pub fn subset(&self, items: &[usize]) -> Scenario {
        let routings = self
            .routings
            .iter()
            .filter_map(|r| {
                items.iter().position(|&i| i == r.item).map(|k| Routing {
                    item: k,
                    ..r.clone()
                })
            })
            .collect();
        Scenario {
            name: self.name.clone(),
            currency: self.currency.clone(),
            calendar: self.calendar.clone(),
            items: items.iter().map(|&i| self.items[i].clone()).collect(),
            resources: self.resources.clone(),
            routings,
            bom: self
                .bom
                .iter()
                .filter_map(|line| {
                    let parent = items.iter().position(|&i| i == line.parent)?;
                    let component = items.iter().position(|&i| i == line.component)?;
                    Some(BomLine {
                        parent,
                        component,
                        ..line.clone()
                    })
                })
                .collect(),
            frozen: self.frozen,
            period_offset: self.period_offset,
        }
    }

    /// Buckets `start..end` as a scenario of their own: every per-bucket
    /// value cut to them, the calendar starting at `start`, messages naming
    /// buckets as this scenario does. Stock, lead times and lot rules are
    /// left as they are; the caller sets the stock the window starts with.
    pub fn window(&self, start: usize, end: usize) -> Scenario {
        let cut = |v: &Vec<f64>| v[start..end].to_vec();
        Scenario {
            calendar: Calendar {
                start: self.calendar.bucket_start(start),
                periods: end - start,
                ..self.calendar.clone()
            },
            items: self
                .items
                .iter()
                .map(|item| Item {
                    setup_cost: cut(&item.setup_cost),
                    holding_cost: cut(&item.holding_cost),
                    unit_cost: cut(&item.unit_cost),
                    demand: cut(&item.demand),
                    receipts: cut(&item.receipts),
                    firm: cut(&item.firm),
                    quantity_change: item.quantity_change.as_ref().map(|c| QuantityChange {
                        previous: c.previous[start..end].to_vec(),
                        ..c.clone()
                    }),
                    ..item.clone()
                })
                .collect(),
            resources: self
                .resources
                .iter()
                .map(|r| Resource {
                    capacity: cut(&r.capacity),
                    overtime_capacity: cut(&r.overtime_capacity),
                    ..r.clone()
                })
                .collect(),
            period_offset: self.period_offset + start,
            ..self.clone()
        }
    }

    /// The unit all items share, or `None` when their units differ: then
    /// stock across items is shown as value, never as a summed count.
    pub fn stock_unit(&self) -> Option<&str> {
        shared_unit(self.items.iter().map(|item| item.unit.as_str()))
    }

    /// The unit all resources share, or `None` when they differ (or there
    /// are no resources): then overtime across resources is shown as its
    /// cost, never as a summed count.
    pub fn capacity_unit(&self) -> Option<&str> {
        shared_unit(self.resources.iter().map(|r| r.unit.as_str()))
    }

    /// The routings of one item.
    pub fn routings_of(&self, item: usize) -> impl Iterator<Item = &Routing> {
        self.routings.iter().filter(move |r| r.item == item)
    }
}
