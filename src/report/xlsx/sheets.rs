//! The five sheets of plan.xlsx, each built from the outcome: Summary,
//! Orders, Stock records, Capacity and Comparison.

use rust_xlsxwriter::{Worksheet, XlsxError};

use super::{in_currency, table, table_sheet, write_cell, yes_no, Cell, Formats};
use crate::model::Scenario;
use crate::multilevel::peg::pegs;
use crate::report::figures;
use crate::report::notes::parent_orders_text;
use crate::solve::{cautions, Outcome};

pub(super) fn summary(
    scenario: &Scenario,
    outcome: &Outcome,
    f: &Formats,
) -> std::result::Result<Worksheet, XlsxError> {
    let money = in_currency(scenario);
    let chosen = &outcome.chosen;
    let evaluation = &chosen.evaluation;
    let calendar = &scenario.calendar;
    let mut sheet = Worksheet::new();
    sheet.set_name("Summary")?;
    sheet.write_string_with_format(0, 0, format!("Plan: {}", scenario.name), &f.title)?;
    let mut lines: Vec<(String, Cell)> = vec![
        ("Scenario".into(), Cell::Text(scenario.name.clone())),
        ("First bucket starts".into(), Cell::DateLeft(calendar.start)),
        (
            format!("Buckets ({}s)", calendar.kind.name()),
            Cell::Count(calendar.periods),
        ),
        ("Items".into(), Cell::Count(scenario.items.len())),
        ("Resources".into(), Cell::Count(scenario.resources.len())),
        ("Method".into(), Cell::Text(chosen.method.to_string())),
        (
            "Status".into(),
            Cell::Text(figures::status_phrase(chosen.status, chosen.is_exact())),
        ),
        ("Solver".into(), Cell::Text(chosen.solver())),
        (
            format!("Total cost{money}"),
            Cell::Money(chosen.total_cost()),
        ),
    ];
    if let Some(bound) = chosen.lower_bound {
        lines.push((format!("Lower bound{money}"), Cell::Money(bound)));
    }
    if let Some(gap) = figures::controllable_gap(scenario, chosen) {
        lines.push((
            "Gap on the cost the plan controls".into(),
            Cell::FinePercent(gap),
        ));
    }
    if let Some(gap) = chosen.gap() {
        lines.push(("Gap on the total cost".into(), Cell::FinePercent(gap)));
    }
    lines.push((
        format!("Cost no plan avoids{money}"),
        Cell::Money(crate::eval::unavoidable_cost(scenario)),
    ));
    let c = &evaluation.costs;
    for (kind, value) in [
        ("Setup cost", c.setup),
        ("Holding cost", c.holding),
        ("Unit cost", c.unit),
        ("Backlog cost", c.backlog),
        ("Overtime cost", c.overtime),
    ] {
        lines.push((format!("{kind}{money}"), Cell::Money(value)));
    }
    lines.push(("Setups".into(), Cell::Count(evaluation.setups)));
    lines.push((
        format!("Average stock value{money}"),
        Cell::Money(evaluation.average_stock_value(scenario)),
    ));
    lines.push((
        format!("Ending stock value{money}"),
        Cell::Money(evaluation.ending_stock_value()),
    ));
    if let Some(saving) = figures::saving(scenario, outcome) {
        let reference = saving.reference;
        lines.push((
            "Compared with".into(),
            Cell::Text(format!(
                "{}{}",
                reference.method,
                if saving.reference_is_current_rule {
                    " (the rule in use)"
                } else {
                    " (the cheapest rule)"
                }
            )),
        ));
        lines.push((
            format!("Its total cost{money}"),
            Cell::Money(reference.total_cost()),
        ));
        lines.push((
            "Its plan is feasible".into(),
            Cell::Text(yes_no(reference.evaluation.feasible).into()),
        ));
        lines.push((format!("Saving{money}"), Cell::Money(saving.amount)));
        if let Some(fraction) = saving.controllable_fraction {
            lines.push((
                "Saving (share of the cost a plan controls)".into(),
                Cell::Percent(fraction),
            ));
        }
        if let Some(fraction) = saving.fraction {
            lines.push((
                "Saving (share of its total cost)".into(),
                Cell::Percent(fraction),
            ));
        }
        lines.push((
            format!("Its ending stock value{money}"),
            Cell::Money(reference.evaluation.ending_stock_value()),
        ));
        lines.push((
            format!("Saving with ending stock at its value{money}"),
            Cell::Money(saving.net_of_ending_stock),
        ));
    }
    let mut row = 2;
    for (label, cell) in &lines {
        sheet.write_string_with_format(row, 0, label, &f.label)?;
        write_cell(&mut sheet, row, 1, cell, f)?;
        row += 1;
    }
    let mut remarks: Vec<String> = outcome
        .comparison
        .iter()
        .flat_map(|r| {
            r.notes.iter().map(move |n| {
                if r.is_exact() {
                    n.clone()
                } else {
                    format!("{}: {n}", r.method)
                }
            })
        })
        .collect();
    remarks.extend(
        cautions(scenario, chosen)
            .into_iter()
            .map(|c| format!("Caution: {c}")),
    );
    if !remarks.is_empty() {
        row += 1;
        for remark in &remarks {
            // Long remarks wrap across the summary's width (columns A to
            // H, about 140 characters) instead of running off the page.
            sheet.merge_range(row, 0, row, 7, remark, &f.note)?;
            let lines = remark.chars().count().div_ceil(120).max(1);
            sheet.set_row_height(row, 15 * lines as u32)?;
            row += 1;
        }
    }
    row += 1;
    sheet.write_string_with_format(row, 0, "Items under this plan", &f.label)?;
    let columns = [
        ("Item", 30.0),
        ("Setups", 14.0),
        (&*format!("Total cost{money}"), 16.0),
        ("Average stock", 14.0),
        (
            &*format!("Cover ({}s of demand)", calendar.kind.name()),
            14.0,
        ),
        ("Ending stock", 14.0),
        ("Unit", 10.0),
        (&*format!("Ending stock value{money}"), 16.0),
        ("Fill rate", 10.0),
    ];
    let rows: Vec<Vec<Cell>> = scenario
        .items
        .iter()
        .zip(&evaluation.items)
        .map(|(item, record)| {
            vec![
                Cell::Text(item.id.clone()),
                Cell::Count(record.setups),
                Cell::Money(record.costs.total()),
                Cell::Quantity((record.average_stock * 10.0).round() / 10.0),
                figures::cover(record).map_or(Cell::Empty, Cell::Decimal),
                Cell::Quantity(record.ending_stock),
                Cell::Text(item.unit.clone()),
                Cell::Money(record.ending_stock_value),
                Cell::Percent(record.fill_rate),
            ]
        })
        .collect();
    table(&mut sheet, row + 1, &columns, &rows, f)?;
    // The labels are long and the first table column holds item ids.
    sheet.set_column_width(0, 42)?;
    sheet.set_column_width(1, 22)?;
    sheet.set_landscape();
    sheet.set_print_fit_to_pages(1, 0);
    Ok(sheet)
}

pub(super) fn orders(
    scenario: &Scenario,
    outcome: &Outcome,
    f: &Formats,
) -> std::result::Result<Worksheet, XlsxError> {
    let calendar = &scenario.calendar;
    let columns = [
        ("Item", 18.0),
        ("Receipt period", 10.0),
        ("Receipt date", 12.0),
        ("Release period", 10.0),
        ("Release date", 12.0),
        ("Quantity", 12.0),
        ("Unit", 10.0),
        ("Kind", 9.0),
    ];
    let rows: Vec<Vec<Cell>> = crate::report::json::orders(scenario, &outcome.chosen.plan)
        .into_iter()
        .map(|o| {
            vec![
                Cell::Text(o.item),
                Cell::Count(o.period),
                Cell::Date(calendar.bucket_start(o.period - 1)),
                Cell::Period(o.release_period),
                Cell::Date(calendar.signed_bucket_start(o.release_period - 1)),
                Cell::Quantity(o.quantity),
                Cell::Text(o.unit),
                Cell::Text(o.kind.to_string()),
            ]
        })
        .collect();
    table_sheet("Orders", &columns, &rows, 1, f)
}

pub(super) fn stock_records(
    scenario: &Scenario,
    outcome: &Outcome,
    f: &Formats,
) -> std::result::Result<Worksheet, XlsxError> {
    let evaluation = &outcome.chosen.evaluation;
    let mut columns = vec![
        ("Item", 18.0),
        ("Period", 8.0),
        ("Bucket starts", 12.0),
        ("Gross requirement", 13.0),
        ("Scheduled receipts", 13.0),
        ("Firm orders received", 13.0),
        ("Planned receipts", 13.0),
        ("Planned releases", 13.0),
        ("On hand at end", 13.0),
        ("Safety stock", 11.0),
        ("Shortage", 11.0),
        ("Backlog", 11.0),
    ];
    let bom = scenario.has_bom();
    if bom {
        columns.extend([
            ("Level", 7.0),
            ("Dependent requirement", 13.0),
            ("Parent orders (parent, period: units)", 40.0),
        ]);
    }
    columns.push(("Unit", 10.0));
    let levels = scenario.low_level_codes();
    let pegged = pegs(scenario, evaluation);
    let mut rows = Vec::new();
    for (i, (item, record)) in scenario.items.iter().zip(&evaluation.items).enumerate() {
        for t in 0..scenario.periods() {
            let (shortage, backlog) = (record.shortage(t), record.backlog(t));
            let mut row = vec![
                Cell::Text(item.id.clone()),
                Cell::Count(t + 1),
                Cell::Date(scenario.calendar.bucket_start(t)),
                Cell::Quantity(record.gross_requirement[t]),
                Cell::Quantity(record.scheduled_receipts[t]),
                Cell::Quantity(record.firm_receipts[t]),
                Cell::Quantity(record.planned_receipts[t]),
                Cell::Quantity(record.planned_releases[t]),
                // Demand owed is the backlog column, not stock below zero.
                Cell::Quantity(record.on_hand[t].max(0.0)),
                Cell::Quantity(item.safety_stock),
                Cell::Quantity(shortage),
                Cell::Quantity(backlog),
            ];
            if bom {
                row.push(Cell::Count(levels[i]));
                row.push(Cell::Quantity(record.dependent_requirement[t]));
                row.push(Cell::Text(parent_orders_text(scenario, &pegged, i, t)));
            }
            row.push(Cell::Text(item.unit.clone()));
            rows.push(row);
        }
    }
    table_sheet("Stock records", &columns, &rows, 3, f)
}

pub(super) fn capacity(
    scenario: &Scenario,
    outcome: &Outcome,
    f: &Formats,
) -> std::result::Result<Worksheet, XlsxError> {
    let columns = [
        ("Resource", 16.0),
        ("Period", 8.0),
        ("Bucket starts", 12.0),
        ("Production", 12.0),
        ("Setup time", 12.0),
        ("Load (production + setup)", 13.0),
        ("Regular capacity", 12.0),
        ("Overtime allowed", 12.0),
        ("Overtime used", 12.0),
        ("Utilisation of regular capacity", 14.0),
        ("Reduced capacity", 10.0),
        ("Unit", 12.0),
    ];
    let mut rows = Vec::new();
    for (resource, load) in scenario
        .resources
        .iter()
        .zip(&outcome.chosen.evaluation.resources)
    {
        let reduced = figures::reduced_buckets(load);
        for (t, &is_reduced) in reduced.iter().enumerate() {
            rows.push(vec![
                Cell::Text(resource.id.clone()),
                Cell::Count(t + 1),
                Cell::Date(scenario.calendar.bucket_start(t)),
                Cell::Quantity(load.production[t]),
                Cell::Quantity(load.setup_time[t]),
                Cell::Quantity(load.load(t)),
                Cell::Quantity(load.capacity[t]),
                Cell::Quantity(load.overtime_capacity[t]),
                Cell::Quantity(load.overtime[t]),
                figures::utilisation(load, t).map_or(Cell::Empty, Cell::Percent),
                if is_reduced {
                    Cell::Flag("yes")
                } else {
                    Cell::Empty
                },
                Cell::Text(resource.unit.clone()),
            ]);
        }
    }
    table_sheet("Capacity", &columns, &rows, 3, f)
}

pub(super) fn comparison(
    scenario: &Scenario,
    outcome: &Outcome,
    f: &Formats,
) -> std::result::Result<Worksheet, XlsxError> {
    let money = in_currency(scenario);
    // Stock summed over items is a count only in one unit.
    let unit = scenario.stock_unit();
    let counted = |label: &str| match unit {
        Some(unit) => format!("{label} ({unit})"),
        None => format!("{label} (items in different units: see the value)"),
    };
    let headers = [
        ("Method".to_string(), 22.0),
        ("Status".to_string(), 11.0),
        ("Feasible".to_string(), 9.0),
        (format!("Total cost{money}"), 14.0),
        (format!("Setup cost{money}"), 12.0),
        (format!("Holding cost{money}"), 12.0),
        (format!("Unit cost{money}"), 14.0),
        (format!("Backlog cost{money}"), 12.0),
        (format!("Overtime cost{money}"), 12.0),
        ("Setups".to_string(), 8.0),
        (counted("Average stock"), 11.0),
        (format!("Average stock value{money}"), 13.0),
        (counted("Ending stock"), 11.0),
        (format!("Ending stock value{money}"), 13.0),
        ("Cost over exact plan".to_string(), 10.0),
        (format!("Lower bound{money}"), 14.0),
        ("Why infeasible".to_string(), 60.0),
    ];
    let columns: Vec<(&str, f64)> = headers.iter().map(|(h, w)| (h.as_str(), *w)).collect();
    let rows: Vec<Vec<Cell>> = outcome
        .comparison
        .iter()
        .map(|r| {
            let e = &r.evaluation;
            let c = &e.costs;
            vec![
                Cell::Text(r.method.to_string()),
                Cell::Text(r.status.name().to_string()),
                Cell::Flag(yes_no(e.feasible)),
                Cell::Money(c.total()),
                Cell::Money(c.setup),
                Cell::Money(c.holding),
                Cell::Money(c.unit),
                Cell::Money(c.backlog),
                Cell::Money(c.overtime),
                Cell::Count(e.setups),
                unit.map_or(Cell::Empty, |_| {
                    Cell::Quantity((e.average_stock() * 10.0).round() / 10.0)
                }),
                Cell::Money(e.average_stock_value(scenario)),
                unit.map_or(Cell::Empty, |_| {
                    Cell::Quantity(e.items.iter().map(|i| i.ending_stock).sum())
                }),
                Cell::Money(e.ending_stock_value()),
                figures::extra_over_optimal(outcome, r).map_or(Cell::Empty, Cell::Percent),
                r.lower_bound.map_or(Cell::Empty, Cell::Money),
                e.infeasibility().map_or(Cell::Empty, |why| {
                    Cell::Text(crate::report::reasons::infeasibility(scenario, &why))
                }),
            ]
        })
        .collect();
    table_sheet("Comparison", &columns, &rows, 1, f)
}
