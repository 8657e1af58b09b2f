//! Terminal output: the plan, the comparison and the bucket records, laid out
//! to fit a 100-column terminal with numbers right-aligned.

use std::fmt::Write;

use super::{count, money, quantity};
use crate::check::CheckReport;
use crate::eval::{Evaluation, ViolationKind};
use crate::model::Scenario;
use crate::multilevel::peg::{pegs, shortage_causes};
use crate::report::notes::describe;
use crate::solve::{cautions, MethodResult, Outcome, Status};

/// How much of the bucket records to show.
#[derive(Debug, Clone, Default)]
pub struct Detail {
    /// Records of every item (otherwise only when there are few items).
    pub all: bool,
    /// Records of just these items.
    pub items: Vec<String>,
}

/// The widest line the terminal output may have.
pub const WIDTH: usize = 100;
/// Items up to which the records are shown without `--detail`.
const FEW_ITEMS: usize = 3;

/// Writes `text` in lines of at most `WIDTH` columns, each starting with
/// `indent` (continuation lines two spaces further in).
fn wrap(text: &str, indent: &str, out: &mut String) {
    let mut line = String::from(indent);
    let mut fresh = true;
    for word in text.split_whitespace() {
        if !fresh && line.chars().count() + 1 + word.chars().count() > WIDTH {
            out.push_str(&line);
            out.push('\n');
            line = format!("{indent}  ");
            fresh = true;
        }
        if !fresh {
            line.push(' ');
        }
        line.push_str(word);
        fresh = false;
    }
    out.push_str(&line);
    out.push('\n');
}

/// A simple text table: columns of numbers right-aligned, text left-aligned.
struct Grid {
    rows: Vec<Vec<String>>,
}

impl Grid {
    fn new(header: &[&str]) -> Grid {
        Grid {
            rows: vec![header.iter().map(|s| s.to_string()).collect()],
        }
    }

    fn push(&mut self, row: Vec<String>) {
        self.rows.push(row);
    }

    fn render(&self, out: &mut String) {
        let columns = self.rows.iter().map(Vec::len).max().unwrap_or(0);
        let widths: Vec<usize> = (0..columns)
            .map(|c| {
                self.rows
                    .iter()
                    .map(|r| r.get(c).map_or(0, |s| s.chars().count()))
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        let numeric: Vec<bool> = (0..columns)
            .map(|c| {
                c > 0
                    && self.rows[1..].iter().all(|r| {
                        r.get(c).is_none_or(|cell| {
                            let bare: String = cell
                                .chars()
                                .filter(|ch| !matches!(ch, ',' | '%' | '+' | ' '))
                                .collect();
                            bare == "-"
                                || bare.parse::<f64>().is_ok()
                                || bare.len() == 5 && bare.as_bytes()[2] == b'-'
                        })
                    })
            })
            .collect();
        for row in &self.rows {
            let mut line = String::new();
            for (c, cell) in row.iter().enumerate() {
                let gap = if c == 0 { "" } else { "  " };
                if numeric[c] {
                    let _ = write!(line, "{gap}{cell:>width$}", width = widths[c]);
                } else {
                    let _ = write!(line, "{gap}{cell:<width$}", width = widths[c]);
                }
            }
            out.push_str(line.trim_end());
            out.push('\n');
        }
    }
}

fn status_words(scenario: &Scenario, result: &MethodResult) -> String {
    match result.status {
        Status::Optimal => "proven optimal".to_string(),
        Status::Feasible => match super::figures::gap_words(scenario, result, money) {
            Some(words) => format!("feasible, not proven optimal: {words}"),
            None => "feasible".to_string(),
        },
        Status::Infeasible => super::figures::status_phrase(result.status, result.is_exact()),
        Status::Unknown => "unknown: no plan found in time".to_string(),
    }
}

fn heading(scenario: &Scenario, out: &mut String) {
    let calendar = &scenario.calendar;
    let _ = writeln!(
        out,
        "{}: {}, {} {}{} from {}{}",
        scenario.name,
        count(scenario.items.len(), "item"),
        calendar.periods,
        calendar.kind.name(),
        if calendar.periods == 1 { "" } else { "s" },
        calendar.label(0),
        scenario
            .currency
            .as_ref()
            .map(|c| format!(", costs in {c}"))
            .unwrap_or_default()
    );
}

/// The unit of an item by id (empty for an id the scenario lacks).
fn item_unit(scenario: &Scenario, id: &str) -> String {
    scenario
        .items
        .iter()
        .find(|i| i.id == id)
        .map_or_else(String::new, |i| i.unit.clone())
}

/// The unit of a resource by id (empty for an id the scenario lacks).
fn resource_unit(scenario: &Scenario, id: &str) -> String {
    scenario
        .resources
        .iter()
        .find(|r| r.id == id)
        .map_or_else(String::new, |r| r.unit.clone())
}

/// The distinct units, in order of first appearance: "kegs, cartons, kg".
fn units_listed<'a>(units: impl Iterator<Item = &'a str>) -> String {
    let mut seen: Vec<&str> = Vec::new();
    for unit in units {
        if !seen.contains(&unit) {
            seen.push(unit);
        }
    }
    seen.join(", ")
}

/// The whole terminal report of `plan`.
pub fn plan(scenario: &Scenario, outcome: &Outcome, detail: &Detail) -> String {
    let mut out = String::new();
    heading(scenario, &mut out);
    let chosen = &outcome.chosen;
    let solver = chosen.solver();
    let cost = money(chosen.total_cost());
    out.push('\n');
    // Status first, then what produced the plan: the method's name must
    // never read like a status ("optimal, feasible").
    let source = match (chosen.is_exact(), solver.is_empty()) {
        (true, false) => format!("exact method, solver {solver}"),
        (true, true) => "exact method".to_string(),
        (false, _) => format!("{} rule", chosen.method),
    };
    let headline = format!(
        "Plan: {} ({source}). {}.",
        status_words(scenario, chosen),
        if chosen.status == Status::Infeasible && chosen.is_exact() {
            format!("The orders shown (lot-for-lot where no plan exists) break a constraint as well; their cost would be {cost}")
        } else if chosen.status == Status::Infeasible {
            format!("Its cost would be {cost}")
        } else {
            format!("Total cost {cost}")
        }
    );
    wrap(&headline, "", &mut out);
    for note in &chosen.notes {
        wrap(&format!("Note: {note}"), "  ", &mut out);
    }
    comparison(scenario, outcome, &mut out);
    faults(scenario, &chosen.evaluation, None, &mut out);
    orders(scenario, chosen, detail, &mut out);
    let few = scenario.items.len() <= FEW_ITEMS;
    let mut shown = 0;
    for (i, item) in scenario.items.iter().enumerate() {
        if detail.all || few || detail.items.iter().any(|id| id == &item.id) {
            records(scenario, &chosen.evaluation, i, &mut out);
            shown += 1;
        }
    }
    if shown == 0 {
        item_summary(scenario, &chosen.evaluation, &mut out);
        let _ = writeln!(
            out,
            "\nBucket records: add --detail for every item, or --item ID for one."
        );
    }
    for caution in cautions(scenario, chosen) {
        out.push('\n');
        wrap(&format!("Caution: {caution}"), "", &mut out);
    }
    out
}

fn comparison(scenario: &Scenario, outcome: &Outcome, out: &mut String) {
    let rows = &outcome.comparison;
    let show_backlog = rows.iter().any(|r| r.evaluation.costs.backlog > 0.0);
    let show_overtime = rows.iter().any(|r| r.evaluation.costs.overtime > 0.0);
    let mut header = vec!["method", "status", "total cost", "setup", "holding", "unit"];
    if show_backlog {
        header.push("backlog");
    }
    if show_overtime {
        header.push("overtime");
    }
    let _ = writeln!(out, "\nCost by method");
    let mut grid = Grid::new(&header);
    for r in rows {
        let c = &r.evaluation.costs;
        let mut row = vec![
            r.method.to_string(),
            r.status.name().to_string(),
            money(c.total()),
            money(c.setup),
            money(c.holding),
            money(c.unit),
        ];
        if show_backlog {
            row.push(money(c.backlog));
        }
        if show_overtime {
            row.push(money(c.overtime));
        }
        grid.push(row);
    }
    grid.render(out);
    for r in rows {
        if let Some(why) = r.evaluation.infeasibility() {
            let words = super::reasons::infeasibility(scenario, &why);
            wrap(&format!("{} is infeasible: {words}", r.method), "  ", out);
        }
    }
    let reference = rows
        .iter()
        .find(|r| r.is_exact() && r.evaluation.feasible)
        .map(|r| r.total_cost());
    let _ = writeln!(out, "\nStock and setups by method");
    // Stock summed over items is a count only when they share a unit.
    let unit = scenario.stock_unit();
    let mut header = vec!["method", "setups"];
    if unit.is_some() {
        header.push("avg stock");
    }
    header.push("avg stock value");
    if unit.is_some() {
        header.push("end stock");
    }
    header.extend(["end stock value", "vs exact plan"]);
    let mut grid = Grid::new(&header);
    for r in rows {
        let e = &r.evaluation;
        let extra = match reference {
            Some(best) if best.abs() > 1e-9 => {
                format!("{:+.1} %", 100.0 * (e.total_cost() - best) / best.abs())
            }
            _ => "-".to_string(),
        };
        let mut row = vec![r.method.to_string(), e.setups.to_string()];
        if unit.is_some() {
            row.push(quantity((e.average_stock() * 10.0).round() / 10.0));
        }
        row.push(money(e.average_stock_value(scenario)));
        if unit.is_some() {
            row.push(quantity(e.items.iter().map(|i| i.ending_stock).sum()));
        }
        row.extend([money(e.ending_stock_value()), extra]);
        grid.push(row);
    }
    grid.render(out);
    if let Some(unit) = unit.filter(|&u| u != crate::model::DEFAULT_ITEM_UNIT) {
        let _ = writeln!(out, "  stock counted in {unit}");
    }
    if unit.is_none() {
        wrap(
            &format!(
                "stock is shown as value only: the items count in different units ({})",
                units_listed(scenario.items.iter().map(|i| i.unit.as_str()))
            ),
            "  ",
            out,
        );
    }
    let cover = format!("{}s of cover", scenario.calendar.kind.name());
    let _ = writeln!(out, "\nService and stock turns by method");
    // Overtime summed over resources is a count only in one unit.
    let overtime_unit = if scenario.resources.is_empty() {
        Some(String::new())
    } else {
        scenario.capacity_unit().map(|u| format!(" ({u})"))
    };
    let overtime = format!("overtime used{}", overtime_unit.as_deref().unwrap_or(""));
    let mut header = vec!["method", "fill rate", "turns a year", &cover];
    if overtime_unit.is_some() {
        header.push(&overtime);
    }
    let mut grid = Grid::new(&header);
    for r in rows {
        let e = &r.evaluation;
        let or_dash = |v: Option<f64>| v.map_or("-".to_string(), |v| format!("{v:.1}"));
        let mut row = vec![
            r.method.to_string(),
            format!("{:.1} %", 100.0 * e.fill_rate()),
            or_dash(e.inventory_turns(scenario)),
            or_dash(e.buckets_of_cover()),
        ];
        if overtime_unit.is_some() {
            row.push(quantity((e.overtime_used() * 10.0).round() / 10.0));
        }
        grid.push(row);
    }
    grid.render(out);
    for r in rows {
        if !r.is_exact() {
            for note in &r.notes {
                wrap(&format!("{}: {note}", r.method), "  ", out);
            }
        }
    }
}

/// Shortages, overloads and rule breaches; `around`, for a checked
/// proposal, adds to each shortage the order that leaves it short.
fn faults(
    scenario: &Scenario,
    evaluation: &Evaluation,
    around: Option<&[crate::actions::ShortageOrders]>,
    out: &mut String,
) {
    if !evaluation.shortages.is_empty() {
        let _ = writeln!(out, "\nShortages");
        let bom = scenario.has_bom();
        let mut header = vec!["item", "period", "short", "unit"];
        if bom {
            header.push("leaves short");
        }
        if around.is_some() {
            header.push("why");
        }
        let mut grid = Grid::new(&header);
        let pegged = pegs(scenario, evaluation);
        let causes = shortage_causes(scenario, evaluation, &pegged);
        for (k, (s, cause)) in evaluation.shortages.iter().zip(&causes).enumerate() {
            let mut row = vec![
                s.item.clone(),
                s.period.to_string(),
                quantity(s.quantity),
                item_unit(scenario, &s.item),
            ];
            if bom {
                let mut whose: Vec<String> = cause
                    .parent_orders
                    .iter()
                    .map(|&(k, short)| {
                        format!("{} ({})", describe(scenario, &pegged[k]), quantity(short))
                    })
                    .collect();
                if cause.own_demand > 0.0 {
                    whose.push(format!("own demand ({})", quantity(cause.own_demand)));
                }
                row.push(whose.join("; "));
            }
            if let Some(orders) = around.and_then(|a| a.get(k)) {
                row.push(super::actions::shortage(orders));
            }
            grid.push(row);
        }
        grid.render(out);
    }
    if !evaluation.overloads.is_empty() {
        let _ = writeln!(out, "\nCapacity overloads (load includes setup time)");
        let mut grid = Grid::new(&[
            "resource",
            "period",
            "load",
            "capacity + overtime",
            "over by",
            "unit",
        ]);
        for o in &evaluation.overloads {
            grid.push(vec![
                o.resource.clone(),
                o.period.to_string(),
                quantity(o.load),
                quantity(o.capacity),
                quantity(o.excess),
                resource_unit(scenario, &o.resource),
            ]);
        }
        grid.render(out);
    }
    if !evaluation.violations.is_empty() {
        let _ = writeln!(out, "\nRule breaches");
        let mut grid = Grid::new(&[
            "item",
            "period",
            "what",
            "quantity",
            "limit",
            "unit",
            "breaks plan",
        ]);
        for v in &evaluation.violations {
            let what = match v.kind {
                ViolationKind::BelowMinLot => "lot below min_lot",
                ViolationKind::NotLotMultiple => "lot not a lot_multiple",
                ViolationKind::AboveMaxLot => "lot above max_lot",
                ViolationKind::ReleaseBeforeStart => "past due: released before period 1",
                ViolationKind::InsideFrozenHorizon => "new order in the frozen horizon",
                ViolationKind::SafetyStock => "stock below safety stock",
                ViolationKind::EndingStock => "ending stock below target",
            };
            grid.push(vec![
                v.item.clone(),
                v.period.to_string(),
                what.to_string(),
                quantity(v.quantity),
                quantity(v.limit),
                item_unit(scenario, &v.item),
                if v.binding { "yes" } else { "no: target" }.to_string(),
            ]);
        }
        grid.render(out);
    }
}

/// Orders shown without `--detail` before the list is cut short.
const FEW_ORDERS: usize = 60;

fn orders(scenario: &Scenario, result: &MethodResult, detail: &Detail, out: &mut String) {
    let _ = writeln!(out, "\nPlanned orders ({})", result.method);
    let mut grid = Grid::new(&[
        "item",
        "receipt",
        "date",
        "release",
        "release date",
        "quantity",
        "unit",
        "kind",
    ]);
    let rows = super::json::orders(scenario, &result.plan);
    if rows.is_empty() {
        let _ = writeln!(out, "  none: stock and open orders cover the horizon");
        return;
    }
    let total = rows.len();
    let chosen = |item: &String| detail.items.is_empty() || detail.items.contains(item);
    let rows: Vec<_> = rows.into_iter().filter(|r| chosen(&r.item)).collect();
    let shown = if detail.all || !detail.items.is_empty() {
        rows.len()
    } else {
        rows.len().min(FEW_ORDERS)
    };
    let hidden = rows.len() - shown;
    for o in rows.into_iter().take(shown) {
        grid.push(vec![
            o.item,
            o.period.to_string(),
            o.date,
            o.release_period.to_string(),
            o.release_date,
            quantity(o.quantity),
            o.unit,
            o.kind.to_string(),
        ]);
    }
    grid.render(out);
    if hidden > 0 {
        wrap(
            &format!("... and {hidden} more of {total} orders: add --detail to list them all, --item ID for one item, or --out DIR for plan.csv"),
            "  ",
            out,
        );
    }
}

/// Items listed in the summary before it is cut short.
const FEW_SUMMARY: usize = 50;

fn item_summary(scenario: &Scenario, evaluation: &Evaluation, out: &mut String) {
    let _ = writeln!(out, "\nItems");
    let mut grid = Grid::new(&[
        "item",
        "setups",
        "total cost",
        "avg stock",
        "end stock",
        "unit",
        "fill rate",
    ]);
    for (item, record) in scenario
        .items
        .iter()
        .zip(&evaluation.items)
        .take(FEW_SUMMARY)
    {
        grid.push(vec![
            item.id.clone(),
            record.setups.to_string(),
            money(record.costs.total()),
            quantity((record.average_stock * 10.0).round() / 10.0),
            quantity(record.ending_stock),
            item.unit.clone(),
            format!("{:.1} %", 100.0 * record.fill_rate),
        ]);
    }
    grid.render(out);
    let hidden = scenario.items.len().saturating_sub(FEW_SUMMARY);
    if hidden > 0 {
        wrap(
            &format!("... and {hidden} more items: --out DIR writes records.csv, plan.xlsx and report.html with all of them"),
            "  ",
            out,
        );
    }
}

/// The bucket-by-bucket record of one item, in chunks that fit the width.
fn records(scenario: &Scenario, evaluation: &Evaluation, i: usize, out: &mut String) {
    let item = &scenario.items[i];
    let record = &evaluation.items[i];
    let _ = writeln!(
        out,
        "\n{} ({}): {}, cost {}, lead time {}, safety stock {}",
        item.id,
        item.unit,
        count(record.setups, "setup"),
        money(record.costs.total()),
        count(item.lead_time, scenario.calendar.kind.name()),
        quantity(item.safety_stock)
    );
    let calendar = &scenario.calendar;
    let periods = scenario.periods();
    let on_hand: Vec<f64> = record.on_hand.iter().map(|&q| q.max(0.0)).collect();
    let owed: Vec<f64> = record.on_hand.iter().map(|&q| (-q).max(0.0)).collect();
    let mut lines: Vec<(&str, &[f64])> = vec![
        ("gross req.", &record.gross_requirement),
        ("sched. receipts", &record.scheduled_receipts),
    ];
    if record.firm_receipts.iter().any(|&q| q > 0.0) {
        lines.push(("firm receipts", &record.firm_receipts));
    }
    lines.extend([
        ("planned receipts", &*record.planned_receipts),
        ("planned releases", &*record.planned_releases),
        ("on hand", &on_hand),
    ]);
    // Negative stock is demand owed: shown as backlog, never as stock
    // below zero.
    if owed.iter().any(|&q| q > 0.0) {
        lines.push(("backlog", &owed));
    }
    let per_chunk = 9;
    let mut start = 0;
    while start < periods {
        let end = (start + per_chunk).min(periods);
        let mut header = vec!["period".to_string()];
        let mut dates = vec!["starts".to_string()];
        for t in start..end {
            header.push((t + 1).to_string());
            dates.push(calendar.short_label(t));
        }
        let mut grid = Grid {
            rows: vec![header, dates],
        };
        for &(label, values) in &lines {
            let mut row = vec![label.to_string()];
            row.extend(
                values[start..end]
                    .iter()
                    .map(|&v| quantity((v.max(0.0) * 100.0).round() / 100.0)),
            );
            grid.push(row);
        }
        grid.render(out);
        start = end;
    }
}

/// The terminal report of `check`.
pub fn check(scenario: &Scenario, report: &CheckReport) -> String {
    let mut out = String::new();
    heading(scenario, &mut out);
    let evaluation = &report.evaluation;
    let _ = writeln!(
        out,
        "\nProposed plan: {}, total cost {} ({}).",
        if evaluation.feasible {
            "feasible"
        } else {
            "NOT feasible"
        },
        money(evaluation.total_cost()),
        count(evaluation.setups, "setup")
    );
    let c = &evaluation.costs;
    let _ = writeln!(
        out,
        "  setup {}, holding {}, unit {}, backlog {}, overtime {}",
        money(c.setup),
        money(c.holding),
        money(c.unit),
        money(c.backlog),
        money(c.overtime)
    );
    match &report.best {
        Some(best) => {
            let saving = report.saving().unwrap_or(0.0);
            let against = if saving >= -0.005 {
                format!("the proposal costs {} more", money(saving))
            } else if evaluation.feasible {
                format!("the proposal costs {} less", money(-saving))
            } else {
                // Cheaper only because it leaves requirements unmet.
                format!(
                    "the proposal costs {} less only because it does not meet every requirement",
                    money(-saving)
                )
            };
            let _ = writeln!(
                out,
                "Best plan: {} ({}); {against}.",
                money(best.total_cost()),
                status_words(scenario, best),
            );
        }
        None if report.skipped => {
            let note = super::actions::best_note(report).unwrap_or_default();
            wrap(&format!("Best plan: {note}."), "", &mut out);
        }
        None if report.best_status == Some(Status::Infeasible) => {
            let _ = writeln!(out, "The scenario itself has no feasible plan.");
        }
        None => {
            let _ = writeln!(
                out,
                "No best plan to compare with: the time limit ran out before a plan was found.\n\
                 That says nothing about whether the scenario has one; give more time with --time-limit."
            );
        }
    }
    faults(
        scenario,
        evaluation,
        Some(&report.shortage_orders),
        &mut out,
    );
    if !report.actions.is_empty() {
        let _ = writeln!(
            out,
            "\nWhat to do with each order{}",
            if report.best.is_some() {
                " (against the best plan)"
            } else {
                ""
            }
        );
        for a in &report.actions {
            let words = super::actions::action(scenario, a);
            let line = match a.order {
                Some(o) => format!(
                    "{} {} received in period {} (released in period {}): {words}",
                    a.item,
                    quantity(o.quantity),
                    o.period,
                    o.release_period
                ),
                None => format!("{}: {words}", a.item),
            };
            wrap(&line, "", &mut out);
        }
    }
    if !report.findings.is_empty() {
        let _ = writeln!(out, "\nWhere the proposal loses money");
        let mut grid = Grid::new(&["item", "extra cost", "why"]);
        for f in &report.findings {
            grid.push(vec![f.item.clone(), money(f.extra_cost), f.message.clone()]);
        }
        grid.render(&mut out);
    }
    out
}

/// Items listed in a comparison without `--detail`.
const FEW_COMPARED: usize = 25;

/// A signed difference of money: `+1,234.50`, `-80.00`, `0.00`.
fn signed_money(value: f64) -> String {
    let text = money(value);
    if text != "0.00" && !text.starts_with('-') {
        format!("+{text}")
    } else {
        text
    }
}

/// A signed difference of a count or quantity.
fn signed_quantity(value: f64) -> String {
    let text = quantity(value);
    if text != "0" && !text.starts_with('-') {
        format!("+{text}")
    } else {
        text
    }
}

/// The terminal page of `compare`: the two plans' totals, cost by kind,
/// setups, stock and status side by side, then the items and resources
/// that differ.
pub fn compare(c: &crate::compare::Comparison, all_items: bool) -> String {
    let mut out = String::new();
    let (a, b) = (&c.a, &c.b);
    let method = if a.result.is_exact() {
        "exact method".to_string()
    } else {
        format!("{} rule", a.result.method)
    };
    let _ = writeln!(out, "Two plans side by side ({method})");
    for (label, side) in [("A", a), ("B", b)] {
        let calendar = &side.scenario.calendar;
        wrap(
            &format!(
                "{label}: {} ({}, {}, {} {}s from {})",
                side.name,
                side.scenario.name,
                count(side.scenario.items.len(), "item"),
                calendar.periods,
                calendar.kind.name(),
                calendar.label(0)
            ),
            "  ",
            &mut out,
        );
    }
    for (label, side) in [("A", a), ("B", b)] {
        wrap(
            &format!("{label}: {}", status_words(&side.scenario, &side.result)),
            "",
            &mut out,
        );
        if let Some(why) = side.result.evaluation.infeasibility() {
            let words = super::reasons::infeasibility(&side.scenario, &why);
            wrap(&format!("Why: {words}"), "  ", &mut out);
        }
        for note in &side.result.notes {
            wrap(&format!("Note: {note}"), "  ", &mut out);
        }
    }
    for sentence in super::notes::compare_sentences(c, money) {
        wrap(&sentence, "  ", &mut out);
    }
    let (ea, eb) = (&a.result.evaluation, &b.result.evaluation);
    let mut grid = Grid::new(&["", "A", "B", "B - A"]);
    let money_row = |label: &str, x: f64, y: f64| {
        vec![label.to_string(), money(x), money(y), signed_money(y - x)]
    };
    grid.push(money_row("total cost", ea.total_cost(), eb.total_cost()));
    for (label, x, y) in [
        ("  setup", ea.costs.setup, eb.costs.setup),
        ("  holding", ea.costs.holding, eb.costs.holding),
        ("  unit", ea.costs.unit, eb.costs.unit),
        ("  backlog", ea.costs.backlog, eb.costs.backlog),
        ("  overtime", ea.costs.overtime, eb.costs.overtime),
    ] {
        grid.push(money_row(label, x, y));
    }
    let bound = |r: &MethodResult| r.lower_bound.map(money).unwrap_or_else(|| "-".into());
    grid.push(vec![
        "lower bound".into(),
        bound(&a.result),
        bound(&b.result),
        String::new(),
    ]);
    grid.push(vec![
        "setups".into(),
        ea.setups.to_string(),
        eb.setups.to_string(),
        signed_quantity(eb.setups as f64 - ea.setups as f64),
    ]);
    grid.push(money_row(
        "average stock value",
        ea.average_stock_value(&a.scenario),
        eb.average_stock_value(&b.scenario),
    ));
    grid.push(money_row(
        "ending stock value",
        ea.ending_stock_value(),
        eb.ending_stock_value(),
    ));
    grid.push(vec![
        "overtime used".into(),
        quantity(ea.overtime_used()),
        quantity(eb.overtime_used()),
        signed_quantity(eb.overtime_used() - ea.overtime_used()),
    ]);
    grid.push(vec![
        "fill rate".into(),
        format!("{:.1} %", 100.0 * ea.fill_rate()),
        format!("{:.1} %", 100.0 * eb.fill_rate()),
        String::new(),
    ]);
    out.push('\n');
    grid.render(&mut out);
    // Items whose figures differ, the largest change in cost first.
    let differing: Vec<_> = c
        .items_by_change()
        .into_iter()
        .filter(|row| match (&row.a, &row.b) {
            (Some(x), Some(y)) => {
                (x.cost - y.cost).abs() > 0.005
                    || x.setups != y.setups
                    || (x.average_stock - y.average_stock).abs() > 1e-6
            }
            _ => true,
        })
        .collect();
    if !c.items_compared() {
        let _ = writeln!(out);
        wrap(&super::notes::no_plan_to_compare(c), "", &mut out);
    } else {
        let _ = writeln!(
            out,
            "\nItems that differ: {} of {}",
            differing.len(),
            c.items.len()
        );
    }
    if c.items_compared() && !differing.is_empty() {
        let mut grid = Grid::new(&[
            "item",
            "cost A",
            "cost B",
            "B - A",
            "setups A",
            "setups B",
            "avg stock A",
            "avg stock B",
        ]);
        let shown = if all_items {
            differing.len()
        } else {
            differing.len().min(FEW_COMPARED)
        };
        let dash = || "-".to_string();
        for row in &differing[..shown] {
            let (x, y) = (row.a.as_ref(), row.b.as_ref());
            grid.push(vec![
                row.id.clone(),
                x.map_or_else(dash, |f| money(f.cost)),
                y.map_or_else(dash, |f| money(f.cost)),
                signed_money(row.cost_change()),
                x.map_or_else(dash, |f| f.setups.to_string()),
                y.map_or_else(dash, |f| f.setups.to_string()),
                x.map_or_else(dash, |f| quantity((f.average_stock * 10.0).round() / 10.0)),
                y.map_or_else(dash, |f| quantity((f.average_stock * 10.0).round() / 10.0)),
            ]);
        }
        grid.render(&mut out);
        if shown < differing.len() {
            let _ = writeln!(
                out,
                "  ... and {} more: add --detail to list them all",
                differing.len() - shown
            );
        }
    }
    if !c.resources.is_empty() {
        let _ = writeln!(out, "\nResources (load is production plus setup time)");
        let mut grid = Grid::new(&[
            "resource",
            "load A",
            "load B",
            "capacity A",
            "capacity B",
            "overtime A",
            "overtime B",
            "busiest A",
            "busiest B",
        ]);
        let dash = || "-".to_string();
        let busiest = |f: &crate::compare::ResourceFigures| match f.peak {
            Some((t, u)) => format!("{:.0} % in {}", 100.0 * u, t + 1),
            None => dash(),
        };
        for row in &c.resources {
            let (x, y) = (row.a.as_ref(), row.b.as_ref());
            grid.push(vec![
                row.id.clone(),
                x.map_or_else(dash, |f| quantity(f.load.round())),
                y.map_or_else(dash, |f| quantity(f.load.round())),
                x.map_or_else(dash, |f| quantity(f.capacity.round())),
                y.map_or_else(dash, |f| quantity(f.capacity.round())),
                x.map_or_else(dash, |f| quantity(f.overtime.round())),
                y.map_or_else(dash, |f| quantity(f.overtime.round())),
                x.map_or_else(dash, busiest),
                y.map_or_else(dash, busiest),
            ]);
        }
        grid.render(&mut out);
        let _ = writeln!(
            out,
            "  busiest: the bucket with the highest load over regular capacity"
        );
    }
    out
}

/// A rolling run, for the renderers.
pub struct RollRun<'a> {
    pub scenario: &'a Scenario,
    /// Plans made (one per snapshot).
    pub weeks: usize,
    /// The first bucket of the run.
    pub first: usize,
    pub horizon: usize,
    pub frozen: usize,
    pub change_cost: f64,
    /// Whether to show the frontier of realised cost against instability
    /// over the exact method's prices of change (`frontier_rows`).
    pub frontier: bool,
    /// Seconds each week's MILP may run.
    pub time_limit: f64,
    pub results: &'a [crate::roll::RollResult],
    /// With a target service level: the level, and each item's safety
    /// stock from the forecast errors of the whole history (the last
    /// week's estimate; earlier weeks saw fewer errors).
    pub safety: Option<(f64, Vec<Option<crate::roll::SafetyEstimate>>)>,
    /// Whether each window's last setups were weighted
    /// (`roll::horizon_end`).
    pub end_correction: bool,
}

/// The columns of a rolling run's stability table (terminal and page).
pub const STABILITY_COLUMNS: [&str; 8] = [
    "method",
    "orders changed",
    "added",
    "removed",
    "resized",
    "kept",
    "units moved",
    "instability",
];

/// The name of an exact run among several priced ones: the method and
/// its prices of change, `exact C=100 U=0.5`.
pub fn priced_label(result: &crate::roll::RollResult) -> String {
    let method = &result.method;
    format!(
        "{method} C={} U={}",
        money(result.change_cost),
        money(result.change_cost_per_unit)
    )
}

/// The runs of the frontier: the exact method's, by its prices of change
/// (C, then U), the unpriced run first.
pub fn frontier_rows<'a>(run: &RollRun<'a>) -> Vec<&'a crate::roll::RollResult> {
    let mut rows: Vec<&crate::roll::RollResult> = run
        .results
        .iter()
        .filter(|r| r.label.starts_with(crate::solve::EXACT))
        .collect();
    rows.sort_by(|a, b| {
        (a.change_cost, a.change_cost_per_unit)
            .partial_cmp(&(b.change_cost, b.change_cost_per_unit))
            .unwrap_or(std::cmp::Ordering::Equal)
    });
    rows
}

/// The terminal page of `roll`: realised cost and service, plan stability
/// and the weekly plans' status, one row per method.
pub fn roll(run: &RollRun) -> String {
    let mut out = String::new();
    let calendar = &run.scenario.calendar;
    let unit = calendar.kind.name();
    let _ = writeln!(
        out,
        "{}: a rolling run of {} {unit}ly plans from {}, each {} {unit}s ahead",
        run.scenario.name,
        run.weeks,
        calendar.label(run.first),
        run.horizon
    );
    let mut terms = vec![format!(
        "frozen: {} {unit}{} (the previous plan's orders are kept there)",
        run.frozen,
        if run.frozen == 1 { "" } else { "s" }
    )];
    if run.change_cost > 0.0 {
        terms.push(format!(
            "change cost {} per order where the previous plan had none",
            money(run.change_cost)
        ));
    }
    let per_unit: Vec<f64> = run
        .results
        .iter()
        .map(|r| r.change_cost_per_unit)
        .filter(|&u| u > 0.0)
        .collect();
    if let Some(&most) = per_unit.iter().max_by(|a, b| a.total_cmp(b)) {
        terms.push(format!(
            "change cost up to {} per unit moved from the previous plan",
            money(most)
        ));
    }
    if run.end_correction {
        terms.push(super::notes::end_correction(unit));
    }
    terms.push(format!(
        "each plan's search for the least cost stops after {} s",
        run.time_limit
    ));
    wrap(&terms.join("; "), "  ", &mut out);
    let _ = writeln!(
        out,
        "\nRealised: the orders carried out, priced against the demand that happened"
    );
    let mut grid = Grid::new(&[
        "method",
        "cost",
        "setup",
        "holding",
        "other",
        "end stock",
        "setups",
        "fill rate",
        "per unit",
        "short",
    ]);
    for r in run.results {
        let e = &r.realised;
        let short = r.most_short();
        let c = &e.costs;
        grid.push(vec![
            r.label.clone(),
            money(c.setup + c.holding + c.backlog + c.overtime),
            money(c.setup),
            money(c.holding),
            money(c.backlog + c.overtime),
            money(e.ending_stock_value()),
            e.setups.to_string(),
            format!("{:.1} %", 100.0 * e.fill_rate()),
            r.cost_per_unit_served().map_or("-".into(), money),
            quantity(short),
        ]);
    }
    grid.render(&mut out);
    wrap(
        &format!("cost: setup, holding and other (backlog and overtime); unit cost is left apart, as it follows the units bought, and a method that leaves demand unmet or stock at the end buys fewer or more; per unit: that cost over the units of demand met on time (cost per unit served), the figure to compare methods that serve different shares of the demand by; end stock: its value at unit cost; short: the most units short at the end of a {unit} (items without backlog)"),
        "  ",
        &mut out,
    );
    if run.results.iter().any(|r| r.overload_planned() > 0.0) {
        let _ = writeln!(
            out,
            "\nCarried out as the lines allow: each {unit}'s orders cut to capacity plus overtime"
        );
        let mut grid = Grid::new(&["method", "overload as planned", "units cut", "fill rate"]);
        for r in run.results {
            grid.push(vec![
                r.label.clone(),
                quantity(r.overload_planned().round()),
                quantity(r.units_cut().round()),
                format!("{:.1} %", 100.0 * r.realised.fill_rate()),
            ]);
        }
        grid.render(&mut out);
        wrap(
            &format!("overload as planned: capacity the orders needed beyond capacity and overtime in the {unit}s carried out; units cut: what the shop could not make for it (the item whose stock can wait longest is cut first), so every realised figure above rests on capacity that exists"),
            "  ",
            &mut out,
        );
    }
    let _ = writeln!(
        out,
        "\nPlan stability: each plan against the one before, over the {unit}s both cover"
    );
    let mut grid = Grid::new(&STABILITY_COLUMNS);
    for r in run.results {
        let s = &r.stability;
        let instability = if s.quantity_before > 0.0 {
            format!("{:.1} %", 100.0 * s.quantity_moved / s.quantity_before)
        } else {
            "-".to_string()
        };
        grid.push(vec![
            r.label.clone(),
            format!("{:.1} %", 100.0 * r.mean_share_changed()),
            s.added.to_string(),
            s.removed.to_string(),
            s.changed.to_string(),
            s.unchanged.to_string(),
            quantity(s.quantity_moved.round()),
            instability,
        ]);
    }
    grid.render(&mut out);
    wrap(
        "orders changed: the mean share of orders added, removed or resized; instability: units moved over the earlier plan's units",
        "  ",
        &mut out,
    );
    if run.frontier {
        let _ = writeln!(
            out,
            "\nRealised cost against instability: the exact method under each price of change"
        );
        let mut grid = Grid::new(&[
            "change cost",
            "per unit moved",
            "cost",
            "fill rate",
            "units moved",
            "orders changed",
        ]);
        for r in frontier_rows(run) {
            let c = &r.realised.costs;
            grid.push(vec![
                money(r.change_cost),
                money(r.change_cost_per_unit),
                money(c.setup + c.holding + c.backlog + c.overtime),
                format!("{:.1} %", 100.0 * r.realised.fill_rate()),
                quantity(r.stability.quantity_moved.round()),
                format!("{:.1} %", 100.0 * r.mean_share_changed()),
            ]);
        }
        grid.render(&mut out);
        wrap(
            "change cost: added to an order's setup where the previous plan had none, taken off where it had one; per unit moved: paid on |release - previous release| in every bucket both plans cover; both priced in the plans, neither in the realised cost (setup, holding and other, as above)",
            "  ",
            &mut out,
        );
    }
    if let Some((level, estimates)) = &run.safety {
        let _ = writeln!(
            out,
            "\nSafety stock for a {:.1} % cycle service level, from the forecast errors",
            100.0 * level
        );
        let mut grid = Grid::new(&["item", "errors", "error sd", "lead time", "safety stock"]);
        for (item, estimate) in run.scenario.items.iter().zip(estimates) {
            grid.push(match estimate {
                Some(e) => vec![
                    item.id.clone(),
                    e.errors.to_string(),
                    format!("{:.1}", e.sigma),
                    item.lead_time.to_string(),
                    quantity(e.safety_stock.round().max(item.safety_stock)),
                ],
                None => vec![
                    item.id.clone(),
                    "-".into(),
                    "-".into(),
                    item.lead_time.to_string(),
                    quantity(item.safety_stock),
                ],
            });
        }
        grid.render(&mut out);
        wrap(
            &format!("safety stock = k x error sd x sqrt(lead time + 1), k the normal quantile of the level (Silver, Pyke & Thomas, 4th ed.), from {} errors on, kept at the item's own where that is higher; each {unit} uses the errors seen before it", crate::roll::MIN_ERRORS),
            "  ",
            &mut out,
        );
    }
    let _ = writeln!(out, "\nThe {unit}ly plans");
    let mut grid = Grid::new(&[
        "method",
        "optimal",
        "feasible",
        "infeasible",
        "unknown",
        "late",
        "largest gap",
    ]);
    for r in run.results {
        grid.push(vec![
            r.label.clone(),
            r.count(Status::Optimal).to_string(),
            r.count(Status::Feasible).to_string(),
            r.count(Status::Infeasible).to_string(),
            r.count(Status::Unknown).to_string(),
            r.weeks_late().to_string(),
            r.worst_gap()
                .map_or_else(|| "-".to_string(), |g| format!("{:.2} %", 100.0 * g)),
        ]);
    }
    grid.render(&mut out);
    wrap(
        "for the rules, feasible means the rule's plan met every constraint; it is not a claim of least cost; late: plans that could not meet every requirement on time (a forecast that rose inside the freeze) and were planned with those units late, at a penalty far above any other cost of a unit; the units are listed below",
        "  ",
        &mut out,
    );
    for r in run.results {
        for week in r.weeks.iter().filter(|w| !w.late.is_empty()) {
            let units: Vec<String> = week
                .late
                .iter()
                .map(|l| {
                    format!(
                        "{} {} late at the end of {}",
                        run.scenario.items[l.item].id,
                        quantity(l.quantity),
                        calendar.label(l.bucket)
                    )
                })
                .collect();
            wrap(
                &format!(
                    "Late: {} in the plan of {}: {}",
                    r.label,
                    calendar.label(week.bucket),
                    units.join("; ")
                ),
                "  ",
                &mut out,
            );
        }
    }
    // The first note of the first week that has one, per method: usually
    // why a plan was infeasible.
    for r in run.results {
        if let Some(week) = r.weeks.iter().find(|w| !w.notes.is_empty()) {
            wrap(
                &format!(
                    "Note: {} in the {unit} of {}: {}",
                    r.label,
                    calendar.label(week.bucket),
                    week.notes[0]
                ),
                "  ",
                &mut out,
            );
        }
    }
    out
}
