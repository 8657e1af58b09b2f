//! A rolling-horizon run: the plan redone bucket by bucket as the forecast
//! moves, the way plants replan every week.
//!
//! Each bucket b of the run, with the forecast snapshot made at its start:
//!
//! 1. the window b .. b + horizon of the scenario is planned, starting from
//!    the stock and open orders the run has reached, with the forecast of
//!    the snapshot; the previous plan's orders released inside the frozen
//!    horizon (b .. b + frozen) are pinned as firm orders (from the second
//!    week on: the first plan has nothing before it to keep). A change
//!    cost C, if asked for, is priced through the setup cost: an order in a
//!    bucket where the previous plan had none of the item pays C more, one
//!    where it had one pays C less (never below a setup cost of 0). Up to
//!    a constant this is C times the number of order timings added or
//!    removed, the binary part of |y - y_previous|; so moving an order
//!    pays up to 2C, and every exact method (dynamic programs and MILP)
//!    prices it as a setup cost. A price U per unit moved, if asked for,
//!    is set on the window as data (`model::QuantityChange`): every item
//!    and release bucket the previous plan covers pays U x |x - p|, x the
//!    window's release quantity (planned and firm) and p the previous
//!    plan's. The evaluation prices it, the MILP prices it exactly with
//!    two deviation columns per item and bucket, and items with it are
//!    planned by the MILP rather than the dynamic programs, which cannot
//!    price a convex cost of the quantity. The week's plan cost includes
//!    both prices; the realised cost includes neither;
//! 2. the plan's releases in bucket b are carried out (they become open
//!    orders, and with a bill of material their components are taken out
//!    of stock), and bucket b's demand happens: the first bucket of its own
//!    snapshot is taken as what was really ordered (common practice in
//!    rolling-horizon studies). Demand not met is owed and met first later.
//!
//! The orders carried out are then priced by the one evaluation against
//! the demand that happened (`realised`), over the run's buckets and as
//! many more as the longest lead time, so that every order carried out is
//! received and costed. Plan stability compares each plan with the one
//! before over the buckets both cover.

pub mod horizon_end;
pub mod shop;
pub mod short;

use std::time::Instant;

use crate::capacity::milp::MilpOptions;
use crate::eval::{evaluate, Evaluation};
use crate::input::Snapshot;
use crate::model::{Plan, Scenario};
use crate::solve::{self, Status};

/// What to run.
#[derive(Debug, Clone)]
pub struct RollOptions {
    /// Buckets each week's plan looks ahead.
    pub horizon: usize,
    /// Buckets at the start of each plan in which only the previous plan's
    /// orders (and receipts) are released.
    pub frozen: usize,
    /// A price on changing the plan: added to the setup cost where the
    /// previous plan had no order of the item, taken off it (down to 0)
    /// where it had one.
    pub change_cost: f64,
    /// A price per unit moved: each window pays this times |x - p| for
    /// every item and release bucket the previous plan covers, x the
    /// window's release and p the previous plan's (`QuantityChange`).
    pub change_cost_per_unit: f64,
    /// The method's output name (`exact` or a rule).
    pub method: String,
    pub milp: MilpOptions,
    /// A target cycle service level: each week's safety stock is set from
    /// the forecast errors seen so far (`safety_estimates`), where that is
    /// above the item's own.
    pub service_level: Option<f64>,
    /// Charge the setups in each window's last buckets only for the share
    /// of an economic cycle they cover inside it (`horizon_end`).
    pub end_correction: bool,
}

/// Forecast errors needed before an item's error is estimated.
pub const MIN_ERRORS: usize = 4;

/// One item's safety stock from its forecast error (`model::safety`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SafetyEstimate {
    /// Standard deviation of the one-bucket-ahead forecast error.
    pub sigma: f64,
    /// Forecast errors it rests on.
    pub errors: usize,
    /// k x sigma x sqrt(lead time + 1).
    pub safety_stock: f64,
}

/// Each item's safety stock for a cycle service level `level`, from the
/// one-bucket-ahead errors of the snapshots before `upto` (the week being
/// planned sees only errors that have happened): the demand that happened
/// in a snapshot's first bucket less what the snapshot before forecast for
/// it. `None` for an item with fewer than `MIN_ERRORS` errors.
pub fn safety_estimates(
    base: &Scenario,
    history: &[Snapshot],
    level: f64,
    upto: usize,
) -> Vec<Option<SafetyEstimate>> {
    let upto = upto.min(history.len());
    (0..base.items.len())
        .map(|i| {
            let errors: Vec<f64> = (1..upto)
                .filter(|&k| history[k].bucket == history[k - 1].bucket + 1)
                .map(|k| {
                    let b = history[k].bucket;
                    history[k].demand[i][b] - history[k - 1].demand[i][b]
                })
                .collect();
            if errors.len() < MIN_ERRORS {
                return None;
            }
            let sigma = crate::model::safety::error_sd(&errors)?;
            Some(SafetyEstimate {
                sigma,
                errors: errors.len(),
                safety_stock: crate::model::safety::safety_stock(
                    level,
                    sigma,
                    base.items[i].lead_time,
                ),
            })
        })
        .collect()
}

/// One order of a plan: item, release bucket and quantity (of the
/// scenario's buckets).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Release {
    pub item: usize,
    pub bucket: usize,
    pub quantity: f64,
}

/// How one plan differs from the one before, over the buckets both cover.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct Stability {
    /// Orders of the earlier plan in the overlap.
    pub before: usize,
    /// Same item and release bucket, same quantity.
    pub unchanged: usize,
    /// Same item and release bucket, another quantity.
    pub changed: usize,
    /// An order where the earlier plan had none.
    pub added: usize,
    /// An order of the earlier plan that is gone.
    pub removed: usize,
    /// The sum of |new - old| quantity over items and release buckets.
    pub quantity_moved: f64,
    /// The earlier plan's quantity in the overlap.
    pub quantity_before: f64,
}

impl Stability {
    /// Orders changed, added or removed, over all the orders either plan
    /// has in the overlap (0 when neither has any).
    pub fn share_changed(&self) -> f64 {
        let moved = self.changed + self.added + self.removed;
        let all = self.unchanged + moved;
        if all == 0 {
            0.0
        } else {
            moved as f64 / all as f64
        }
    }

    pub fn add(&mut self, other: &Stability) {
        self.before += other.before;
        self.unchanged += other.unchanged;
        self.changed += other.changed;
        self.added += other.added;
        self.removed += other.removed;
        self.quantity_moved += other.quantity_moved;
        self.quantity_before += other.quantity_before;
    }
}

/// One week (bucket) of the run.
#[derive(Debug, Clone)]
pub struct Week {
    pub bucket: usize,
    pub status: Status,
    /// The plan's own cost over its window (the change penalty included).
    pub plan_cost: f64,
    pub gap: Option<f64>,
    /// Against the previous week's plan (none in the first week).
    pub stability: Option<Stability>,
    pub notes: Vec<String>,
    /// Requirements the week's plan leaves late because no plan could meet
    /// them on time (`short`); empty for a week planned as it stood.
    pub late: Vec<short::Late>,
    /// Work of the week's releases cut to fit the lines (`shop`).
    pub cuts: Vec<shop::Cut>,
    /// Load of the week's releases as planned beyond capacity plus
    /// overtime, over the resources.
    pub overload: f64,
}

impl Week {
    /// Units cut from the week's releases to fit the lines.
    pub fn units_cut(&self) -> f64 {
        self.cuts.iter().map(|c| c.quantity).sum()
    }

    /// Units the week's plan leaves late, over items and buckets.
    pub fn units_late(&self) -> f64 {
        self.late.iter().map(|l| l.quantity).sum()
    }
}

/// The whole run of one method.
#[derive(Debug, Clone)]
pub struct RollResult {
    /// The method's name (`exact` or a rule's), whatever the label.
    pub method: String,
    /// The method, with `+change-cost` when a penalty was priced (and
    /// `+per-unit` when units moved were).
    pub label: String,
    /// The prices of change the run planned with (`RollOptions`).
    pub change_cost: f64,
    pub change_cost_per_unit: f64,
    pub weeks: Vec<Week>,
    /// The buckets of the run and after it, the demand that happened.
    pub realised_scenario: Scenario,
    /// The orders carried out, by receipt bucket of `realised_scenario`.
    pub executed: Plan,
    pub realised: Evaluation,
    /// Stability summed over every pair of consecutive plans.
    pub stability: Stability,
}

impl RollResult {
    /// Weeks whose plan has each status.
    pub fn count(&self, status: Status) -> usize {
        self.weeks.iter().filter(|w| w.status == status).count()
    }

    /// Weeks planned with requirements left late (`Week::late`).
    pub fn weeks_late(&self) -> usize {
        self.weeks.iter().filter(|w| !w.late.is_empty()).count()
    }

    /// Units cut from the orders carried out, over the run.
    pub fn units_cut(&self) -> f64 {
        self.weeks.iter().map(Week::units_cut).sum()
    }

    /// The most units short at the end of a bucket of the realised plan
    /// (items without backlog; 0 when none is short).
    pub fn most_short(&self) -> f64 {
        self.realised
            .shortages
            .iter()
            .map(|s| s.quantity)
            .fold(0.0, f64::max)
    }

    /// Load planned beyond capacity plus overtime in the buckets carried
    /// out, over the run.
    pub fn overload_planned(&self) -> f64 {
        self.weeks.iter().map(|w| w.overload).sum()
    }

    /// The realised cost of setup, holding, backlog and overtime per unit
    /// of demand met from stock on time: a figure that compares methods
    /// which serve different shares of the demand (one that leaves demand
    /// unmet pays for fewer units, and serves fewer). None when nothing
    /// was met.
    pub fn cost_per_unit_served(&self) -> Option<f64> {
        let e = &self.realised;
        let met = e.units_met();
        let c = &e.costs;
        (met > 1e-9).then(|| (c.total() - c.unit) / met)
    }

    /// The largest gap of a week's plan that is not proven optimal.
    pub fn worst_gap(&self) -> Option<f64> {
        self.weeks
            .iter()
            .filter_map(|w| w.gap)
            .fold(None, |worst, g| Some(worst.map_or(g, |w: f64| w.max(g))))
    }

    /// The mean over consecutive pairs of plans (those with an order in
    /// the buckets both cover) of the share of orders changed, added or
    /// removed.
    pub fn mean_share_changed(&self) -> f64 {
        let shares: Vec<f64> = self
            .weeks
            .iter()
            .filter_map(|w| w.stability)
            .filter(|s| s.unchanged + s.changed + s.added + s.removed > 0)
            .map(|s| s.share_changed())
            .collect();
        if shares.is_empty() {
            0.0
        } else {
            shares.iter().sum::<f64>() / shares.len() as f64
        }
    }
}

/// Hears how a long run goes (the command line shows it).
pub trait RollProgress: Sync {
    fn week_done(&self, _label: &str, _week: usize, _weeks: usize, _status: Status) {}
}

/// No progress to show.
pub struct Quiet;

impl RollProgress for Quiet {}

/// Runs `method` over the snapshots.
pub fn roll(
    base: &Scenario,
    history: &[Snapshot],
    options: &RollOptions,
    progress: &dyn RollProgress,
) -> crate::error::Result<RollResult> {
    let periods = base.periods();
    let items = base.items.len();
    let first = history.first().map_or(0, |s| s.bucket);
    let last = history.last().map_or(0, |s| s.bucket);
    // Signed stock: negative is demand owed.
    let mut stock: Vec<f64> = base.items.iter().map(|i| i.initial_stock).collect();
    // Open orders by item and receipt bucket (of the scenario).
    let mut open = vec![vec![0.0; periods]; items];
    let mut executed: Vec<Release> = Vec::new();
    let mut actual = vec![vec![0.0; periods]; items];
    // Firm orders of the scenario already carried out, by item and receipt
    // bucket.
    let mut firm_done = vec![vec![false; periods]; items];
    let mut previous: Option<(usize, Vec<Release>)> = None;
    let mut weeks = Vec::new();
    let mut total = Stability::default();
    for (k, snapshot) in history.iter().enumerate() {
        let b = snapshot.bucket;
        let end = (b + options.horizon).min(periods);
        let mut window = base.window(b, end);
        // The first plan has no plan before it to keep, so nothing is frozen.
        window.frozen = if previous.is_some() {
            options.frozen.min(end - b - 1)
        } else {
            0
        };
        let safety = options
            .service_level
            .map(|level| safety_estimates(base, history, level, k + 1));
        for (i, item) in window.items.iter_mut().enumerate() {
            if let Some(Some(estimate)) = safety.as_ref().map(|s| s[i]) {
                item.safety_stock = item.safety_stock.max(estimate.safety_stock.round());
            }
            item.demand = snapshot.demand[i][b..end].to_vec();
            item.initial_stock = stock[i].max(0.0);
            item.demand[0] += (-stock[i]).max(0.0);
            for t in 0..end - b {
                item.receipts[t] += open[i][b + t];
                // A firm order of the scenario carried out in an earlier week
                // is among the open orders now.
                if firm_done[i][b + t] {
                    item.firm[t] = (item.firm[t] - base.items[i].firm[b + t]).max(0.0);
                }
            }
        }
        if options.end_correction {
            horizon_end::correct(&mut window);
        }
        if let Some((prev_end, orders)) = &previous {
            // The previous plan's orders inside the freeze are pinned (the
            // scenario's own firm orders are in the window already).
            for order in orders {
                let item = &mut window.items[order.item];
                let receipt = order.bucket + item.lead_time;
                if order.bucket < b + window.frozen && order.bucket >= b && receipt < end {
                    let own = base.items[order.item].firm[receipt];
                    item.firm[receipt - b] += (order.quantity - own).max(0.0);
                }
            }
            if options.change_cost_per_unit > 0.0 {
                // Release buckets both plans cover whose receipt falls in
                // the window (the previous plan has no other).
                let covered = (*prev_end).min(end);
                for (i, item) in window.items.iter_mut().enumerate() {
                    let previous = (0..end - b)
                        .map(|t| {
                            (b + t < covered && t + item.lead_time < end - b).then(|| {
                                orders
                                    .iter()
                                    .filter(|o| o.item == i && o.bucket == b + t)
                                    .map(|o| o.quantity)
                                    .sum::<f64>()
                            })
                        })
                        .collect();
                    item.quantity_change = Some(crate::model::QuantityChange {
                        per_unit: options.change_cost_per_unit,
                        previous,
                    });
                }
            }
            if options.change_cost > 0.0 {
                let c = options.change_cost;
                for (i, item) in window.items.iter_mut().enumerate() {
                    for t in 0..end - b {
                        let had = orders.iter().any(|o| o.item == i && o.bucket == b + t);
                        let setup = &mut item.setup_cost[t];
                        *setup = if had {
                            (*setup - c).max(0.0)
                        } else {
                            *setup + c
                        };
                    }
                }
            }
        }
        // The week's time limit covers both tries: a window found to have
        // no plan on time is planned again with what is left (at least a
        // quarter of the limit, so that the second try has time to find a
        // plan at all).
        let started = Instant::now();
        let plan = |scenario: &Scenario, time_limit: f64| {
            solve::plan_scenario(
                scenario,
                &solve::Options {
                    method: Some(options.method.clone()),
                    milp: MilpOptions {
                        time_limit,
                        ..options.milp.clone()
                    },
                },
            )
            .map(|outcome| outcome.chosen)
        };
        let limit = options.milp.time_limit;
        let mut planned = plan(&window, limit)?;
        let mut late = Vec::new();
        if planned.is_exact() && planned.status == Status::Infeasible {
            let left = (limit - started.elapsed().as_secs_f64()).max(limit / 4.0);
            let again = plan(&short::with_backlog(&window), left)?;
            if again.evaluation.feasible {
                late = short::late(&window, &again, b);
                planned = again;
            }
        }
        let releases = releases_of(&window, &planned.plan, b);
        let stability = previous
            .as_ref()
            .map(|(prev_end, prev)| compare_plans(prev, &releases, b, (*prev_end).min(end), items));
        if let Some(s) = &stability {
            total.add(s);
        }
        // Carry out bucket b as the lines allow: its releases become open
        // orders, then its demand happens.
        let due: Vec<Release> = releases.iter().filter(|o| o.bucket == b).copied().collect();
        let cover: Vec<f64> = (0..items)
            .map(|i| {
                let left =
                    stock[i] + base.items[i].receipts[b] + open[i][b] - snapshot.demand[i][b];
                let ahead = &snapshot.demand[i][(b + 1).min(end)..end];
                let mean = ahead.iter().sum::<f64>() / ahead.len().max(1) as f64;
                if mean > 1e-9 {
                    left / mean
                } else {
                    f64::INFINITY
                }
            })
            .collect();
        let carried = shop::carry_out(base, b, &due, &cover);
        for order in &carried.orders {
            let receipt = order.bucket + base.items[order.item].lead_time;
            if receipt < periods && base.items[order.item].firm[receipt] > 0.0 {
                firm_done[order.item][receipt] = true;
            }
            executed.push(*order);
            if receipt < periods {
                open[order.item][receipt] += order.quantity;
            }
        }
        // A parent's order started in bucket b takes its components out of
        // stock then (bill of material).
        let mut issued = vec![0.0; items];
        for order in &carried.orders {
            for line in base.bom.iter().filter(|l| l.parent == order.item) {
                issued[line.component] += line.per_parent_unit() * order.quantity;
            }
        }
        for i in 0..items {
            actual[i][b] = snapshot.demand[i][b];
            stock[i] += base.items[i].receipts[b] + open[i][b] - actual[i][b] - issued[i];
        }
        progress.week_done(&options.method, k + 1, history.len(), planned.status);
        weeks.push(Week {
            bucket: b,
            status: planned.status,
            plan_cost: planned.total_cost(),
            gap: planned.gap().filter(|_| planned.status == Status::Feasible),
            stability,
            notes: planned.notes.clone(),
            late,
            cuts: carried.cuts,
            overload: carried.overload,
        });
        previous = Some((end, releases));
    }
    // The orders carried out against the demand that happened, over the
    // run and the longest lead time after it.
    let longest = base.items.iter().map(|i| i.lead_time).max().unwrap_or(0);
    let realised_end = (last + 1 + longest).min(periods);
    let mut realised_scenario = base.window(first, realised_end);
    realised_scenario.frozen = 0;
    for (i, item) in realised_scenario.items.iter_mut().enumerate() {
        item.demand = actual[i][first..realised_end].to_vec();
        item.firm = vec![0.0; realised_end - first];
    }
    let mut plan = Plan::empty(items, realised_end - first);
    for order in &executed {
        let receipt = order.bucket + base.items[order.item].lead_time;
        if receipt < realised_end {
            plan.receipts[order.item][receipt - first] += order.quantity;
        }
    }
    let realised = evaluate(&realised_scenario, &plan);
    let mut label = options.method.clone();
    if options.change_cost > 0.0 {
        label.push_str("+change-cost");
    }
    if options.change_cost_per_unit > 0.0 {
        label.push_str("+per-unit");
    }
    Ok(RollResult {
        method: options.method.clone(),
        label,
        change_cost: options.change_cost,
        change_cost_per_unit: options.change_cost_per_unit,
        weeks,
        realised_scenario,
        executed: plan,
        realised,
        stability: total,
    })
}

/// A window's plan (and its firm orders) as releases in the scenario's
/// buckets; orders released before the window are left out.
fn releases_of(window: &Scenario, plan: &Plan, start: usize) -> Vec<Release> {
    let mut releases = Vec::new();
    for (i, item) in window.items.iter().enumerate() {
        for t in 0..window.periods() {
            let quantity = plan.receipts[i][t] + item.firm[t];
            if quantity > 0.0 && t >= item.lead_time {
                releases.push(Release {
                    item: i,
                    bucket: start + t - item.lead_time,
                    quantity,
                });
            }
        }
    }
    releases
}

/// Stability of `new` against `old` over release buckets `from..to`.
pub fn compare_plans(
    old: &[Release],
    new: &[Release],
    from: usize,
    to: usize,
    items: usize,
) -> Stability {
    let mut s = Stability::default();
    let quantity = |orders: &[Release], i: usize, t: usize| -> f64 {
        orders
            .iter()
            .filter(|o| o.item == i && o.bucket == t)
            .map(|o| o.quantity)
            .sum()
    };
    for i in 0..items {
        for t in from..to {
            let (q_old, q_new) = (quantity(old, i, t), quantity(new, i, t));
            let tolerance = 1e-6 * (1.0 + q_old.abs().max(q_new.abs()));
            if q_old > 0.0 {
                s.before += 1;
                s.quantity_before += q_old;
            }
            match (q_old > 0.0, q_new > 0.0) {
                (true, true) if (q_old - q_new).abs() <= tolerance => s.unchanged += 1,
                (true, true) => s.changed += 1,
                (false, true) => s.added += 1,
                (true, false) => s.removed += 1,
                (false, false) => {}
            }
            s.quantity_moved += (q_new - q_old).abs();
        }
    }
    s
}
