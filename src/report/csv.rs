//! CSV files written by `plan --out`: plan.csv (which `check` reads back as
//! it is), comparison.csv, and the bucket tables records.csv (item x bucket)
//! and load.csv (resource x bucket); and by `roll --out`: realised.csv and
//! stability.csv (one row per method) and weeks.csv (method x week).

use super::clean;
use super::table::RollRun;
use crate::model::Scenario;
use crate::multilevel::peg::pegs;
use crate::report::notes::parent_orders_text;
use crate::solve::Outcome;

fn write_rows(rows: Vec<Vec<String>>) -> Vec<u8> {
    let mut writer = csv::Writer::from_writer(Vec::new());
    for row in rows {
        // Writing to memory cannot fail; a failure would only drop the row.
        let _ = writer.write_record(&row);
    }
    writer.into_inner().unwrap_or_default()
}

/// A number for a file: full precision up to 6 decimals, no trailing zeros.
fn number(value: f64) -> String {
    let text = format!("{:.6}", clean(value));
    let text = text.trim_end_matches('0').trim_end_matches('.');
    if text == "-0" {
        "0".to_string()
    } else {
        text.to_string()
    }
}

/// plan.csv: `item, period, date, release_period, release_date, quantity,
/// kind, unit` (`planned`, or `firm` for the firm orders the plan kept;
/// `check` leaves the firm rows to orders-firm.csv; `unit` is the item's).
pub fn plan(scenario: &Scenario, outcome: &Outcome) -> Vec<u8> {
    let mut rows = vec![[
        "item",
        "period",
        "date",
        "release_period",
        "release_date",
        "quantity",
        "kind",
        "unit",
    ]
    .iter()
    .map(|s| s.to_string())
    .collect()];
    for order in super::json::orders(scenario, &outcome.chosen.plan) {
        rows.push(vec![
            order.item,
            order.period.to_string(),
            order.date,
            order.release_period.to_string(),
            order.release_date,
            number(order.quantity),
            order.kind.to_string(),
            order.unit,
        ]);
    }
    write_rows(rows)
}

/// comparison.csv: one row per method, costs by kind, setups and stock.
pub fn comparison(scenario: &Scenario, outcome: &Outcome) -> Vec<u8> {
    let header = [
        "method",
        "status",
        "feasible",
        "total_cost",
        "setup_cost",
        "holding_cost",
        "unit_cost",
        "backlog_cost",
        "overtime_cost",
        "setups",
        "average_stock",
        "average_stock_value",
        "ending_stock",
        "ending_stock_value",
        "lower_bound",
        "fill_rate",
        "inventory_turns",
        "buckets_of_cover",
        "overtime_used",
    ];
    let mut rows = vec![header.iter().map(|s| s.to_string()).collect::<Vec<_>>()];
    for r in &outcome.comparison {
        let e = &r.evaluation;
        let c = &e.costs;
        rows.push(vec![
            r.method.to_string(),
            r.status.name().to_string(),
            e.feasible.to_string(),
            number(c.total()),
            number(c.setup),
            number(c.holding),
            number(c.unit),
            number(c.backlog),
            number(c.overtime),
            e.setups.to_string(),
            number(e.average_stock()),
            number(e.average_stock_value(scenario)),
            number(e.items.iter().map(|i| i.ending_stock).sum()),
            number(e.ending_stock_value()),
            r.lower_bound.map(number).unwrap_or_default(),
            number(e.fill_rate()),
            e.inventory_turns(scenario).map(number).unwrap_or_default(),
            e.buckets_of_cover().map(number).unwrap_or_default(),
            number(e.overtime_used()),
        ]);
    }
    write_rows(rows)
}

/// records.csv: the bucket record of every item under the chosen plan, one
/// row per item and bucket. `on_hand` is end-of-bucket stock (negative is
/// backlog or shortage); `shortage` is the evaluation's shortage (items
/// without backlog), `backlog` the units owed by an item that allows it;
/// `firm_receipts` and `firm_releases` are the firm orders (orders-firm.csv).
/// With a bill of material three columns follow: `level` (the low-level
/// code, 0 for finished items), `dependent_requirement` (what parents'
/// releases call for, part of the gross requirement) and `parent_orders`
/// (the parent orders behind it, as `parent_orders_text` writes them).
pub fn records(scenario: &Scenario, outcome: &Outcome) -> Vec<u8> {
    let header = [
        "item",
        "period",
        "date",
        "gross_requirement",
        "scheduled_receipts",
        "planned_receipts",
        "planned_releases",
        "on_hand",
        "shortage",
        "backlog",
        "firm_receipts",
        "firm_releases",
    ];
    let evaluation = &outcome.chosen.evaluation;
    let bom = scenario.has_bom();
    let mut header: Vec<String> = header.iter().map(|s| s.to_string()).collect();
    if bom {
        header.extend(["level", "dependent_requirement", "parent_orders"].map(String::from));
    }
    header.push("unit".to_string());
    let levels = scenario.low_level_codes();
    let pegged = pegs(scenario, evaluation);
    let mut rows = vec![header];
    for (i, (item, record)) in scenario.items.iter().zip(&evaluation.items).enumerate() {
        for t in 0..scenario.periods() {
            let (shortage, backlog) = (record.shortage(t), record.backlog(t));
            let mut row = vec![
                item.id.clone(),
                (t + 1).to_string(),
                scenario.calendar.label(t),
                number(record.gross_requirement[t]),
                number(record.scheduled_receipts[t]),
                number(record.planned_receipts[t]),
                number(record.planned_releases[t]),
                number(record.on_hand[t]),
                number(shortage),
                number(backlog),
                number(record.firm_receipts[t]),
                number(record.firm_releases[t]),
            ];
            if bom {
                row.push(levels[i].to_string());
                row.push(number(record.dependent_requirement[t]));
                row.push(parent_orders_text(scenario, &pegged, i, t));
            }
            row.push(item.unit.clone());
            rows.push(row);
        }
    }
    write_rows(rows)
}

/// load.csv: the load of every resource under the chosen plan, one row per
/// resource and release bucket; `load` is production plus setup time.
pub fn load(scenario: &Scenario, outcome: &Outcome) -> Vec<u8> {
    let header = [
        "resource",
        "period",
        "date",
        "production",
        "setup_time",
        "load",
        "capacity",
        "overtime_capacity",
        "overtime",
        "unit",
    ];
    let mut rows = vec![header.iter().map(|s| s.to_string()).collect::<Vec<_>>()];
    for (resource, load) in scenario
        .resources
        .iter()
        .zip(&outcome.chosen.evaluation.resources)
    {
        for t in 0..scenario.periods() {
            rows.push(vec![
                resource.id.clone(),
                (t + 1).to_string(),
                scenario.calendar.label(t),
                number(load.production[t]),
                number(load.setup_time[t]),
                number(load.load(t)),
                number(load.capacity[t]),
                number(load.overtime_capacity[t]),
                number(load.overtime[t]),
                resource.unit.clone(),
            ]);
        }
    }
    write_rows(rows)
}

/// realised.csv: one row per method of a rolling run, the orders carried
/// out priced against the demand that happened (the terminal's realised
/// table): `cost` is setup + holding + backlog + overtime (unit cost apart,
/// in `unit_cost`), `most_short` the most units short at the end of a
/// bucket, `overload_planned` the load the orders as planned needed beyond
/// capacity plus overtime, `units_cut` what the shop could not make for it,
/// `weeks_late` the plans made with requirements left late.
pub fn roll_realised(run: &RollRun) -> Vec<u8> {
    let header = [
        "method",
        "cost",
        "setup_cost",
        "holding_cost",
        "backlog_cost",
        "overtime_cost",
        "unit_cost",
        "total_cost",
        "setups",
        "fill_rate",
        "cost_per_unit_served",
        "most_short",
        "ending_stock_value",
        "overload_planned",
        "units_cut",
        "weeks_late",
    ];
    let mut rows = vec![header.iter().map(|s| s.to_string()).collect::<Vec<_>>()];
    for r in run.results {
        let e = &r.realised;
        let c = &e.costs;
        rows.push(vec![
            r.label.clone(),
            number(c.total() - c.unit),
            number(c.setup),
            number(c.holding),
            number(c.backlog),
            number(c.overtime),
            number(c.unit),
            number(e.total_cost()),
            e.setups.to_string(),
            number(e.fill_rate()),
            r.cost_per_unit_served().map(number).unwrap_or_default(),
            number(r.most_short()),
            number(e.ending_stock_value()),
            number(r.overload_planned()),
            number(r.units_cut()),
            r.weeks_late().to_string(),
        ]);
    }
    write_rows(rows)
}

/// stability.csv: one row per method, each plan against the one before
/// over the buckets both cover, summed over the run: `orders_changed` the
/// mean share of orders added, removed or resized, then the counts, the
/// units moved and the earlier plans' units.
pub fn roll_stability(run: &RollRun) -> Vec<u8> {
    let header = [
        "method",
        "orders_changed",
        "added",
        "removed",
        "resized",
        "kept",
        "units_moved",
        "units_before",
    ];
    let mut rows = vec![header.iter().map(|s| s.to_string()).collect::<Vec<_>>()];
    for r in run.results {
        let s = &r.stability;
        rows.push(vec![
            r.label.clone(),
            number(r.mean_share_changed()),
            s.added.to_string(),
            s.removed.to_string(),
            s.changed.to_string(),
            s.unchanged.to_string(),
            number(s.quantity_moved),
            number(s.quantity_before),
        ]);
    }
    write_rows(rows)
}

/// weeks.csv: one row per method and bucket of the run: the plan's
/// status, cost and gap (empty unless feasible and not proven), its
/// change against the plan before (empty in the first bucket), the load
/// planned beyond capacity plus overtime, the units cut and the units
/// left late.
pub fn roll_weeks(run: &RollRun) -> Vec<u8> {
    let header = [
        "method",
        "period",
        "date",
        "status",
        "plan_cost",
        "gap",
        "share_changed",
        "units_moved",
        "overload",
        "units_cut",
        "units_late",
    ];
    let calendar = &run.scenario.calendar;
    let mut rows = vec![header.iter().map(|s| s.to_string()).collect::<Vec<_>>()];
    for r in run.results {
        for w in &r.weeks {
            rows.push(vec![
                r.label.clone(),
                (w.bucket + 1).to_string(),
                calendar.label(w.bucket),
                w.status.name().to_string(),
                number(w.plan_cost),
                w.gap.map(number).unwrap_or_default(),
                w.stability
                    .map(|s| number(s.share_changed()))
                    .unwrap_or_default(),
                w.stability
                    .map(|s| number(s.quantity_moved))
                    .unwrap_or_default(),
                number(w.overload),
                number(w.units_cut()),
                number(w.units_late()),
            ]);
        }
    }
    write_rows(rows)
}
