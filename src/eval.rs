//! The one evaluation of a plan: projected stock, shortages, backlog,
//! safety-stock breaches, lot-rule violations, capacity use and cost by kind.
//!
//! Every method's plan goes through `evaluate`, and only here are cost and
//! feasibility computed, so that the methods can be compared on equal terms.

mod series;

use serde::Serialize;

pub use series::Series;

use rayon::prelude::*;

use crate::model::{Item, Plan, Scenario};

/// Cost by kind. `total` is their sum.
#[derive(Debug, Clone, Copy, Default, PartialEq, Serialize)]
pub struct Costs {
    pub setup: f64,
    pub holding: f64,
    pub unit: f64,
    pub backlog: f64,
    pub overtime: f64,
    /// The price of units moved away from an earlier plan
    /// (`model::QuantityChange`): 0, and left out of JSON, outside the
    /// windows of a rolling plan that prices it.
    #[serde(skip_serializing_if = "is_zero")]
    pub change: f64,
}

fn is_zero(value: &f64) -> bool {
    *value == 0.0
}

impl Costs {
    pub fn total(&self) -> f64 {
        self.setup + self.holding + self.unit + self.backlog + self.overtime + self.change
    }

    pub fn add(&mut self, other: &Costs) {
        self.setup += other.setup;
        self.holding += other.holding;
        self.unit += other.unit;
        self.backlog += other.backlog;
        self.overtime += other.overtime;
        self.change += other.change;
    }
}

/// The bucket-by-bucket record of one item. Its rows are shared with the
/// scenario's other evaluations where they hold the same figures.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ItemRecord {
    /// The item's own demand plus its dependent requirement.
    pub gross_requirement: Series,
    /// What parents' releases call for (bill of material), by bucket;
    /// zero for an item that goes into no other.
    pub dependent_requirement: Series,
    pub scheduled_receipts: Series,
    pub planned_receipts: Series,
    /// Planned releases by release bucket (receipt bucket minus lead time).
    pub planned_releases: Series,
    /// Firm (pinned) orders by receipt bucket, and by release bucket.
    pub firm_receipts: Series,
    pub firm_releases: Series,
    /// Projected on hand at the end of each bucket; negative is a shortage
    /// (or, for an item that allows it, backlog).
    pub on_hand: Series,
    pub costs: Costs,
    /// Orders in the horizon, firm orders included.
    pub setups: usize,
    /// Mean of the end-of-bucket stock (its positive part).
    pub average_stock: f64,
    pub ending_stock: f64,
    pub ending_stock_value: f64,
    /// Demand met on time over demand, in [0, 1] (1 when there is no demand).
    pub fill_rate: f64,
    /// The most buckets one planned lot covers: from its receipt to the
    /// last bucket whose requirement it meets, stock used first in, first
    /// out (see `longest_cover`). 1 for a lot that meets only its own
    /// bucket's need, however long the quiet spell after it; how far ahead
    /// stock is built.
    pub longest_cover: usize,
    /// Whether negative stock is backlog (allowed) or shortage.
    pub allows_backlog: bool,
    /// The item's quantity tolerance (see `quantity_tolerance`).
    pub tolerance: f64,
}

impl ItemRecord {
    /// Units short at the end of bucket `t` (an item without backlog).
    pub fn shortage(&self, t: usize) -> f64 {
        let stock = self.on_hand[t];
        if !self.allows_backlog && stock < -self.tolerance {
            -stock
        } else {
            0.0
        }
    }

    /// Units owed at the end of bucket `t` (an item that allows backlog).
    pub fn backlog(&self, t: usize) -> f64 {
        if self.allows_backlog {
            (-self.on_hand[t]).max(0.0)
        } else {
            0.0
        }
    }
}

/// Load of one resource, by release bucket.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ResourceLoad {
    /// Capacity used by production (per-unit use times quantity).
    pub production: Vec<f64>,
    /// Capacity used by setups.
    pub setup_time: Vec<f64>,
    pub capacity: Vec<f64>,
    pub overtime: Vec<f64>,
    pub overtime_capacity: Vec<f64>,
}

impl ResourceLoad {
    pub fn load(&self, t: usize) -> f64 {
        self.production[t] + self.setup_time[t]
    }
}

#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Shortage {
    pub item: String,
    pub period: usize,
    pub quantity: f64,
}

#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Overload {
    pub resource: String,
    pub period: usize,
    pub load: f64,
    /// Regular capacity plus the overtime the resource allows.
    pub capacity: f64,
    pub excess: f64,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "kebab-case")]
pub enum ViolationKind {
    BelowMinLot,
    NotLotMultiple,
    AboveMaxLot,
    /// Lead time puts the release before bucket 1.
    ReleaseBeforeStart,
    /// A new order released inside the frozen horizon.
    InsideFrozenHorizon,
    /// Safety stock breached where an order could have prevented it.
    SafetyStock,
    /// Below the ending-stock target, or backlog left at the end.
    EndingStock,
}

#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Violation {
    pub item: String,
    pub period: usize,
    pub kind: ViolationKind,
    /// The quantity at fault (the lot, or the stock).
    pub quantity: f64,
    /// The limit it breaks.
    pub limit: f64,
    /// Whether this makes the plan infeasible (safety stock of an item that
    /// allows backlog is a target only).
    pub binding: bool,
}

#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Evaluation {
    pub items: Vec<ItemRecord>,
    pub resources: Vec<ResourceLoad>,
    pub costs: Costs,
    pub shortages: Vec<Shortage>,
    pub overloads: Vec<Overload>,
    pub violations: Vec<Violation>,
    pub feasible: bool,
    pub setups: usize,
}

impl Evaluation {
    pub fn total_cost(&self) -> f64 {
        self.costs.total()
    }

    /// Average stock value at unit cost, summed over items.
    pub fn average_stock_value(&self, scenario: &Scenario) -> f64 {
        self.items
            .iter()
            .zip(&scenario.items)
            .map(|(record, item)| {
                let periods = record.on_hand.len().max(1) as f64;
                record
                    .on_hand
                    .iter()
                    .zip(&item.unit_cost)
                    .map(|(stock, cost)| stock.max(0.0) * cost)
                    .sum::<f64>()
                    / periods
            })
            .sum()
    }

    pub fn ending_stock_value(&self) -> f64 {
        self.items.iter().map(|r| r.ending_stock_value).sum()
    }

    pub fn average_stock(&self) -> f64 {
        self.items.iter().map(|r| r.average_stock).sum()
    }

    /// Inventory turns per year: the value of the demand (at unit cost) over
    /// the average stock value, scaled from the horizon to a year (common
    /// practice). `None` without stock value.
    pub fn inventory_turns(&self, scenario: &Scenario) -> Option<f64> {
        let average = self.average_stock_value(scenario);
        if average <= 0.0 {
            return None;
        }
        let used: f64 = scenario
            .items
            .iter()
            .map(|item| {
                item.demand
                    .iter()
                    .zip(&item.unit_cost)
                    .map(|(d, c)| d * c)
                    .sum::<f64>()
            })
            .sum();
        let years = scenario.periods() as f64 / scenario.calendar.kind.per_year();
        Some(used / average / years)
    }

    /// Buckets of cover: average stock over mean demand per bucket, summed
    /// over items as units (weeks of cover for weekly buckets). `None`
    /// without demand.
    pub fn buckets_of_cover(&self) -> Option<f64> {
        let periods = self.items.first().map_or(0, |r| r.on_hand.len());
        let demand: f64 = self
            .items
            .iter()
            .map(|r| r.gross_requirement.iter().sum::<f64>())
            .sum();
        if periods == 0 || demand <= 0.0 {
            return None;
        }
        Some(self.average_stock() / (demand / periods as f64))
    }

    /// Overtime used, in capacity units, over every resource and bucket.
    pub fn overtime_used(&self) -> f64 {
        self.resources.iter().flat_map(|r| r.overtime.iter()).sum()
    }

    /// Demand met on time over all demand, in [0, 1].
    pub fn fill_rate(&self) -> f64 {
        let demand: f64 = self
            .items
            .iter()
            .map(|r| r.gross_requirement.iter().sum::<f64>())
            .sum();
        if demand <= 0.0 {
            return 1.0;
        }
        (self.units_met() / demand).min(1.0)
    }

    /// Units of requirement met from stock on time, over every item.
    pub fn units_met(&self) -> f64 {
        self.items
            .iter()
            .map(|r| r.fill_rate * r.gross_requirement.iter().sum::<f64>())
            .sum()
    }
}

/// A tolerance for comparing quantities of one item: rounding noise from
/// solvers must not count as a shortage.
pub fn quantity_tolerance(item: &Item) -> f64 {
    // Relative to the item's size, so that float noise in sums of large
    // quantities is not a shortage, yet small enough (a billionth) that no
    // real shortage hides behind it.
    let scale: f64 = item.demand.iter().sum::<f64>() + item.initial_stock + item.ending_stock;
    1e-6 + 1e-9 * scale.abs().min(1e12)
}

fn is_multiple(quantity: f64, multiple: f64, tolerance: f64) -> bool {
    let ratio = quantity / multiple;
    (ratio - ratio.round()).abs() * multiple <= tolerance
}

/// The cost no feasible plan of `scenario` can avoid: firm orders' setup
/// and unit cost, and each item's least unit cost on the units it must still
/// make or buy (its requirement, its parents' included, less stock, open
/// receipts and firm orders). Every cost is 0 or more, so this is a lower
/// bound on any feasible plan's total; what lies above it is the cost the
/// plan controls, on which gaps and savings are stated.
pub fn unavoidable_cost(scenario: &Scenario) -> f64 {
    let mut required = vec![0.0; scenario.items.len()];
    let mut cost = 0.0;
    let order: Vec<usize> = if scenario.has_bom() {
        scenario.level_order()
    } else {
        (0..scenario.items.len()).collect()
    };
    for &i in &order {
        let item = &scenario.items[i];
        // Parents come first: what they must release, firm orders included.
        let dependent: f64 = scenario
            .bom
            .iter()
            .filter(|line| line.component == i)
            .map(|line| line.per_parent_unit() * required[line.parent])
            .sum();
        let firm: f64 = item.firm.iter().sum();
        let supply = item.initial_stock + item.receipts.iter().sum::<f64>() + firm;
        let demand: f64 = item.demand.iter().sum::<f64>() + dependent;
        let to_make = (demand - supply).max(0.0);
        let cheapest = item.unit_cost.iter().copied().fold(f64::INFINITY, f64::min);
        let cheapest = if cheapest.is_finite() {
            cheapest.max(0.0)
        } else {
            0.0
        };
        cost += cheapest * to_make;
        for (t, &q) in item.firm.iter().enumerate() {
            if q > 0.0 {
                let release = t.saturating_sub(item.lead_time);
                cost += item.setup_cost[release] + item.unit_cost[release] * q;
            }
        }
        required[i] = to_make + firm;
    }
    cost
}

/// The rows every evaluation of one scenario takes from its items (demand,
/// scheduled receipts, firm orders), made once so that the evaluations of
/// several plans share them instead of each holding a copy.
pub struct Inputs {
    demand: Vec<Series>,
    receipts: Vec<Series>,
    firm: Vec<Series>,
    zeros: Series,
}

impl Inputs {
    pub fn of(scenario: &Scenario) -> Inputs {
        let zeros = Series::from(vec![0.0; scenario.periods()]);
        let share = |values: &[f64]| {
            if Series::is_zero(values) {
                zeros.clone()
            } else {
                Series::from(values)
            }
        };
        Inputs {
            demand: scenario.items.iter().map(|i| share(&i.demand)).collect(),
            receipts: scenario.items.iter().map(|i| share(&i.receipts)).collect(),
            firm: scenario.items.iter().map(|i| share(&i.firm)).collect(),
            zeros,
        }
    }

    /// Whether these rows are those of `scenario`'s items.
    fn fit(&self, scenario: &Scenario) -> bool {
        self.demand.len() == scenario.items.len()
            && self.zeros.len() == scenario.periods()
            && scenario.items.iter().enumerate().all(|(i, item)| {
                *self.demand[i] == *item.demand
                    && *self.receipts[i] == *item.receipts
                    && *self.firm[i] == *item.firm
            })
    }
}

/// Items from which an evaluation is spread over threads: below it, handing
/// the work out costs more than it saves (evaluations of small groups run
/// thousands of times inside the heuristics).
const PARALLEL_ITEMS: usize = 256;

/// Evaluates `plan` against `scenario`.
pub fn evaluate(scenario: &Scenario, plan: &Plan) -> Evaluation {
    evaluate_with(scenario, &Inputs::of(scenario), plan)
}

/// `evaluate`, with the scenario's rows made once beforehand
/// (`Inputs::of(scenario)`) and shared by the evaluations of many plans.
pub fn evaluate_with(scenario: &Scenario, inputs: &Inputs, plan: &Plan) -> Evaluation {
    debug_assert!(inputs.fit(scenario), "inputs of another scenario");
    let periods = scenario.periods();
    let mut shortages = Vec::new();
    let mut violations = Vec::new();
    let mut costs = Costs::default();
    let records = if scenario.has_bom() {
        exploded_records(
            scenario,
            inputs,
            plan,
            &mut costs,
            &mut shortages,
            &mut violations,
        )
    } else {
        // Items without a bill of material are independent: evaluated in
        // parallel when there are many, then taken in item order, so that
        // costs add up and faults are listed as one thread would.
        let one = |(i, item): (usize, &Item)| {
            let (mut short, mut broken) = (Vec::new(), Vec::new());
            let shared = Shared {
                gross: inputs.demand[i].clone(),
                scheduled: inputs.receipts[i].clone(),
                firm: inputs.firm[i].clone(),
                zeros: &inputs.zeros,
            };
            let record = evaluate_item(
                item,
                &plan.receipts[i],
                scenario.frozen,
                shared,
                &mut short,
                &mut broken,
            );
            (record, short, broken)
        };
        let items = scenario.items.par_iter().enumerate();
        let evaluated: Vec<_> = if scenario.items.len() >= PARALLEL_ITEMS {
            items.map(one).collect()
        } else {
            scenario.items.iter().enumerate().map(one).collect()
        };
        let mut records = Vec::with_capacity(evaluated.len());
        for (record, short, broken) in evaluated {
            costs.add(&record.costs);
            shortages.extend(short);
            violations.extend(broken);
            records.push(record);
        }
        records
    };
    let mut resources: Vec<ResourceLoad> = scenario
        .resources
        .iter()
        .map(|r| ResourceLoad {
            production: vec![0.0; periods],
            setup_time: vec![0.0; periods],
            capacity: r.capacity.clone(),
            overtime: vec![0.0; periods],
            overtime_capacity: r.overtime_capacity.clone(),
        })
        .collect();
    for routing in &scenario.routings {
        let record = &records[routing.item];
        let load = &mut resources[routing.resource];
        let releases = record.planned_releases.iter().zip(&record.firm_releases);
        for (t, (&planned, &firm)) in releases.enumerate() {
            for quantity in [planned, firm] {
                if quantity > 0.0 {
                    load.production[t] += routing.per_unit * quantity;
                    load.setup_time[t] += routing.setup_time;
                }
            }
        }
    }
    let mut overloads = Vec::new();
    for (resource, load) in scenario.resources.iter().zip(resources.iter_mut()) {
        for t in 0..periods {
            let used = load.load(t);
            let tolerance = 1e-7 * (1.0 + load.capacity[t]);
            let over = used - load.capacity[t];
            if over > tolerance {
                let overtime = over.min(load.overtime_capacity[t]);
                load.overtime[t] = overtime;
                costs.overtime += overtime * resource.overtime_cost;
                let limit = load.capacity[t] + load.overtime_capacity[t];
                if used - limit > tolerance {
                    overloads.push(Overload {
                        resource: resource.id.clone(),
                        period: t + 1,
                        load: used,
                        capacity: limit,
                        excess: used - limit,
                    });
                }
            }
        }
    }
    let feasible =
        shortages.is_empty() && overloads.is_empty() && violations.iter().all(|v| !v.binding);
    let setups = records.iter().map(|r| r.setups).sum();
    Evaluation {
        items: records,
        resources,
        costs,
        shortages,
        overloads,
        violations,
        feasible,
        setups,
    }
}

/// The records of a scenario with a bill of material: parents come before
/// their components, whose gross requirement is their own demand plus what
/// the parents' releases (planned and firm) call for in the release bucket.
fn exploded_records(
    scenario: &Scenario,
    inputs: &Inputs,
    plan: &Plan,
    costs: &mut Costs,
    shortages: &mut Vec<Shortage>,
    violations: &mut Vec<Violation>,
) -> Vec<ItemRecord> {
    let periods = scenario.periods();
    let order = scenario.level_order();
    let mut slots: Vec<Option<ItemRecord>> = vec![None; scenario.items.len()];
    for &i in &order {
        let item = &scenario.items[i];
        let receipts = &plan.receipts[i];
        let mut dependent = vec![0.0; periods];
        for line in scenario.bom.iter().filter(|line| line.component == i) {
            let parent = slots[line.parent]
                .as_ref()
                .expect("a parent is evaluated before its components");
            let releases = parent.planned_releases.iter().zip(&parent.firm_releases);
            for (t, (&planned, &firm)) in releases.enumerate() {
                if planned + firm > 0.0 {
                    dependent[t] += scenario.issue(line, planned + firm);
                }
            }
        }
        let exploded;
        let (item, gross) = if dependent.iter().any(|&q| q > 0.0) {
            let mut with = item.clone();
            for (d, q) in with.demand.iter_mut().zip(&dependent) {
                *d += q;
            }
            exploded = with;
            (&exploded, Series::from(&exploded.demand[..]))
        } else {
            (item, inputs.demand[i].clone())
        };
        let shared = Shared {
            gross,
            scheduled: inputs.receipts[i].clone(),
            firm: inputs.firm[i].clone(),
            zeros: &inputs.zeros,
        };
        let mut record = evaluate_item(
            item,
            receipts,
            scenario.frozen,
            shared,
            shortages,
            violations,
        );
        if !Series::is_zero(&dependent) {
            record.dependent_requirement = dependent.into();
        }
        costs.add(&record.costs);
        slots[i] = Some(record);
    }
    slots.into_iter().flatten().collect()
}

/// The rows of an item's record that come from the scenario as they are.
struct Shared<'a> {
    gross: Series,
    scheduled: Series,
    firm: Series,
    zeros: &'a Series,
}

fn evaluate_item(
    item: &Item,
    receipts: &[f64],
    frozen: usize,
    shared: Shared,
    shortages: &mut Vec<Shortage>,
    violations: &mut Vec<Violation>,
) -> ItemRecord {
    let periods = item.periods();
    let tolerance = quantity_tolerance(item);
    let lead = item.lead_time;
    let mut releases = vec![0.0; periods];
    let mut firm_releases = vec![0.0; periods];
    let mut on_hand = vec![0.0; periods];
    let mut costs = Costs::default();
    let mut setups = 0;
    let mut stock = item.initial_stock;
    let mut met_on_time = 0.0;
    let violation = |period: usize, kind, quantity, limit, binding| Violation {
        item: item.id.clone(),
        period,
        kind,
        quantity,
        limit,
        binding,
    };
    for t in 0..periods {
        let firm = item.firm[t];
        if firm > 0.0 {
            // A firm order is costed and loaded like any order; the reader
            // keeps its release inside the horizon.
            setups += 1;
            let release = t.saturating_sub(lead);
            costs.setup += item.setup_cost[release];
            costs.unit += item.unit_cost[release] * firm;
            firm_releases[release] += firm;
        }
        let quantity = receipts[t];
        if quantity > 0.0 {
            setups += 1;
            // Costs fall in the release bucket; a release before bucket 1 is
            // flagged and costed at bucket 1's prices.
            let release = t.checked_sub(lead);
            let cost_bucket = release.unwrap_or(0);
            costs.setup += item.setup_cost[cost_bucket];
            costs.unit += item.unit_cost[cost_bucket] * quantity;
            match release {
                Some(r) if r < frozen => {
                    releases[r] += quantity;
                    violations.push(violation(
                        t + 1,
                        ViolationKind::InsideFrozenHorizon,
                        quantity,
                        frozen as f64,
                        true,
                    ));
                }
                Some(r) => releases[r] += quantity,
                None => violations.push(violation(
                    t + 1,
                    ViolationKind::ReleaseBeforeStart,
                    quantity,
                    (t + 1) as f64 - lead as f64,
                    true,
                )),
            }
            if item.min_lot > 0.0 && quantity < item.min_lot - tolerance {
                violations.push(violation(
                    t + 1,
                    ViolationKind::BelowMinLot,
                    quantity,
                    item.min_lot,
                    true,
                ));
            }
            if let Some(multiple) = item.lot_multiple {
                if !is_multiple(quantity, multiple, tolerance) {
                    violations.push(violation(
                        t + 1,
                        ViolationKind::NotLotMultiple,
                        quantity,
                        multiple,
                        true,
                    ));
                }
            }
            if let Some(max) = item.max_lot {
                if quantity > max + tolerance {
                    violations.push(violation(
                        t + 1,
                        ViolationKind::AboveMaxLot,
                        quantity,
                        max,
                        true,
                    ));
                }
            }
        }
        let arriving = item.receipts[t] + firm + quantity;
        met_on_time += item.demand[t].min((stock + arriving).max(0.0));
        stock += arriving - item.demand[t];
        on_hand[t] = stock;
        if stock >= 0.0 {
            costs.holding += item.holding_cost[t] * stock;
        } else if let Some(backlog_cost) = item.backlog_cost {
            costs.backlog += backlog_cost * -stock;
        }
        if stock < -tolerance && !item.allows_backlog() {
            shortages.push(Shortage {
                item: item.id.clone(),
                period: t + 1,
                quantity: -stock,
            });
        }
        let last = t + 1 == periods;
        let short = stock < -tolerance && !item.allows_backlog();
        // The end: backlog must be cleared and the ending-stock target met
        // (where a new order can still arrive in time: after the lead time
        // and the frozen horizon).
        let reachable = t >= lead + frozen;
        let end_floor = if reachable { item.ending_stock } else { 0.0 };
        let end_breach =
            last && !short && stock < end_floor - tolerance && (item.allows_backlog() || reachable);
        if end_breach {
            violations.push(violation(
                t + 1,
                ViolationKind::EndingStock,
                stock,
                end_floor,
                true,
            ));
        } else if item.safety_stock > 0.0 && !short && stock < item.safety_stock - tolerance {
            // Safety stock is a floor without backlog, a target with it;
            // before a new order can arrive (lead time, frozen horizon) no
            // order can restore it, so such a breach is reported without
            // being binding.
            let binding = !item.allows_backlog() && reachable;
            violations.push(violation(
                t + 1,
                ViolationKind::SafetyStock,
                stock,
                item.safety_stock,
                binding,
            ));
        }
    }
    if let Some(change) = &item.quantity_change {
        for r in 0..periods {
            costs.change += change.cost(r, releases[r] + firm_releases[r]);
        }
    }
    let total_demand: f64 = item.demand.iter().sum();
    let average_stock = on_hand.iter().map(|s| s.max(0.0)).sum::<f64>() / periods.max(1) as f64;
    let ending_stock = on_hand.last().copied().unwrap_or(item.initial_stock);
    let ending_unit_cost = item.unit_cost.last().copied().unwrap_or(0.0);
    let longest_cover = longest_cover(item, receipts, tolerance);
    let planned_receipts = Series::from(receipts);
    // Without a lead time every order is released where it is received.
    let plain = |q: f64| q > 0.0 || q.to_bits() == 0;
    let planned_releases = if lead == 0 && receipts.iter().all(|&q| plain(q)) {
        planned_receipts.clone()
    } else {
        releases.into()
    };
    let firm_releases = if Series::is_zero(&firm_releases) {
        shared.zeros.clone()
    } else {
        firm_releases.into()
    };
    ItemRecord {
        dependent_requirement: shared.zeros.clone(),
        longest_cover,
        allows_backlog: item.allows_backlog(),
        tolerance,
        gross_requirement: shared.gross,
        scheduled_receipts: shared.scheduled,
        planned_receipts,
        planned_releases,
        firm_receipts: shared.firm,
        firm_releases,
        on_hand: on_hand.into(),
        costs,
        setups,
        average_stock,
        ending_stock,
        ending_stock_value: ending_stock.max(0.0) * ending_unit_cost,
        fill_rate: if total_demand > 0.0 {
            (met_on_time / total_demand).min(1.0)
        } else {
            1.0
        },
    }
}

/// The most buckets one planned lot of `item` covers: from the bucket it is
/// received to the last bucket whose requirement it meets, with stock used
/// first in, first out (initial stock, scheduled and firm receipts first,
/// then the planned lots in the order they arrive). A lot that meets only
/// its own bucket's requirement covers 1, however many buckets pass before
/// the next need; a lot used up by the requirements of its bucket and the
/// two after covers 3. A lot never drawn on (stock kept to the end) covers
/// nothing. 0 without planned lots.
fn longest_cover(item: &Item, receipts: &[f64], tolerance: f64) -> usize {
    use std::collections::VecDeque;
    // (the bucket a planned lot is received, or None for other stock; units left)
    let mut stock: VecDeque<(Option<usize>, f64)> = VecDeque::new();
    if item.initial_stock > 0.0 {
        stock.push_back((None, item.initial_stock));
    }
    let mut owed = 0.0;
    let mut longest = 0;
    for (t, &planned) in receipts.iter().enumerate().take(item.periods()) {
        let other = item.receipts[t] + item.firm[t];
        if other > 0.0 {
            stock.push_back((None, other));
        }
        if planned > 0.0 {
            stock.push_back((Some(t), planned));
        }
        owed += item.demand[t];
        while owed > tolerance {
            let Some(front) = stock.front_mut() else {
                break;
            };
            let used = front.1.min(owed);
            front.1 -= used;
            owed -= used;
            if let Some(received) = front.0 {
                longest = longest.max(t - received + 1);
            }
            if front.1 <= tolerance {
                stock.pop_front();
            }
        }
    }
    longest
}

#[cfg(test)]
mod tests {
    use super::*;

    fn cover(demand: &[f64], initial: f64, receipts: &[f64]) -> usize {
        let mut item = Item::simple("A", demand, 10.0, 1.0);
        item.initial_stock = initial;
        longest_cover(&item, receipts, 1e-9)
    }

    #[test]
    fn a_lot_for_its_own_bucket_covers_one_however_long_the_quiet_after_it() {
        let demand = [0.0, 40.0, 0.0, 0.0, 0.0, 0.0, 30.0, 0.0];
        let receipts = [0.0, 40.0, 0.0, 0.0, 0.0, 0.0, 30.0, 0.0];
        assert_eq!(cover(&demand, 0.0, &receipts), 1);
    }

    #[test]
    fn a_lot_covers_up_to_the_last_bucket_it_meets_first_in_first_out() {
        // 60 in bucket 1 meets 20, 20, 20: three buckets.
        assert_eq!(cover(&[20.0; 4], 0.0, &[60.0, 0.0, 0.0, 20.0]), 3);
        // The same lot after 30 in stock: the stock goes first, so the lot
        // lasts into bucket 5 (20 of bucket 2, then 3, 4 and 10 of 5).
        assert_eq!(cover(&[20.0; 5], 30.0, &[0.0, 60.0, 0.0, 0.0, 0.0]), 4);
        // Demand 40 in bucket 2 and 30 in bucket 7, both made in bucket 2:
        // built ahead over six buckets.
        let demand = [0.0, 40.0, 0.0, 0.0, 0.0, 0.0, 30.0, 0.0];
        let receipts = [0.0, 70.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0];
        assert_eq!(cover(&demand, 0.0, &receipts), 6);
    }

    #[test]
    fn a_lot_never_drawn_on_covers_nothing() {
        assert_eq!(cover(&[10.0, 10.0], 20.0, &[0.0, 5.0]), 0);
        assert_eq!(cover(&[10.0, 10.0], 0.0, &[0.0, 0.0]), 0);
    }
}
