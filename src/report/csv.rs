//! CSV files written by `plan --out`: plan.csv (which `check` reads back as
//! it is) and comparison.csv.

use super::clean;
use crate::model::Scenario;
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

/// plan.csv: `item, period, date, release_period, release_date, quantity`.
pub fn plan(scenario: &Scenario, outcome: &Outcome) -> Vec<u8> {
    let mut rows = vec![[
        "item",
        "period",
        "date",
        "release_period",
        "release_date",
        "quantity",
    ]
    .iter()
    .map(|s| s.to_string())
    .collect()];
    for (item, period, date, release, release_date, quantity) in
        super::json::order_rows(scenario, &outcome.chosen.plan)
    {
        rows.push(vec![
            item,
            period.to_string(),
            date,
            release.to_string(),
            release_date,
            number(quantity),
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
        ]);
    }
    write_rows(rows)
}
