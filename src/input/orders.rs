//! A plan to check: `item, period|date, quantity` by receipt bucket, with an
//! optional release bucket that must agree with the item's lead time. The
//! plan.csv that `plan --out` writes is accepted as it is.

use std::collections::HashMap;
use std::path::Path;

use super::{CsvFile, Record, Schema};
use crate::error::{Error, Location, Result};
use crate::model::{Calendar, DatePlace, Plan, Scenario};

const ORDERS: Schema = Schema {
    known: &[
        "item",
        "period",
        "date",
        "release_period",
        "release_date",
        "quantity",
        "kind",
        "unit",
    ],
    required: &["item", "quantity"],
};

/// One order row: its item, receipt bucket and quantity.
struct OrderRow {
    item: usize,
    receipt: usize,
    quantity: f64,
    /// Where the quantity and the receipt bucket are written, for messages.
    location: Location,
    bucket_location: Location,
}

/// Reads the orders file at `path` into a plan for `scenario`. Rows of kind
/// `firm` (plan.csv lists the firm orders it kept) are the scenario's own
/// firm orders, not part of the plan checked.
pub fn read_orders(path: &Path, scenario: &Scenario) -> Result<Plan> {
    let missing = "the orders file is missing; check the path given to --orders";
    let mut plan = Plan::empty(scenario.items.len(), scenario.periods());
    for row in read_rows(path, scenario, missing, false)? {
        plan.receipts[row.item][row.receipt] += row.quantity;
    }
    Ok(plan)
}

/// Reads orders-firm.csv (the same layout; plan.csv is accepted as it is)
/// into the items' firm orders. Every firm order is released inside the
/// horizon, has a positive quantity, is whole for an item planned in whole
/// units, and is the only firm order of its item in its bucket.
pub fn read_firm_orders(path: &Path, scenario: &mut Scenario) -> Result<()> {
    let rows = read_rows(path, scenario, "the file is missing", true)?;
    let mut seen: HashMap<(usize, usize), u64> = HashMap::new();
    for row in rows {
        let item = &scenario.items[row.item];
        let line = row.location.line.unwrap_or(0);
        if row.receipt < item.lead_time {
            return Err(Error::input(
                row.bucket_location,
                format!(
                    "this firm order of item {} is received in period {}, so with a lead time of {} buckets it was released before the horizon starts; an order already released is an open order: list it in receipts.csv",
                    item.id,
                    row.receipt + 1,
                    item.lead_time
                ),
            ));
        }
        if row.quantity <= 0.0 {
            return Err(Error::input(
                row.location,
                "a firm order needs a quantity above 0; drop the row if there is no order",
            ));
        }
        if item.lot_multiple.is_some() && row.quantity.fract() != 0.0 {
            return Err(Error::input(
                row.location,
                format!(
                    "{} is not a whole number, and item {} is planned in whole units (lot_multiple in items.csv; 0 there makes it continuous)",
                    row.quantity,
                    item.id
                ),
            ));
        }
        if let Some(first) = seen.insert((row.item, row.receipt), line) {
            return Err(Error::input(
                row.location,
                format!(
                    "item {} already has a firm order received in period {} (line {first}); give one row per order, or add the quantities up",
                    item.id,
                    row.receipt + 1
                ),
            ));
        }
        scenario.items[row.item].firm[row.receipt] = row.quantity;
    }
    Ok(())
}

/// The order rows of a file: firm rows only (`firm`), or every row but
/// the firm ones.
fn read_rows(path: &Path, scenario: &Scenario, missing: &str, firm: bool) -> Result<Vec<OrderRow>> {
    let bytes = std::fs::read(path).map_err(|e| {
        let message = if e.kind() == std::io::ErrorKind::NotFound {
            missing.to_string()
        } else {
            format!("cannot read the file: {e}")
        };
        Error::input(Location::file(path), message)
    })?;
    let file = CsvFile::parse(path, &bytes, &ORDERS)?;
    if !file.has_column("period") && !file.has_column("date") {
        return Err(Error::input(
            Location::line(path, 1),
            "the file needs a period column or a date column (the receipt bucket)",
        ));
    }
    let index: HashMap<&str, usize> = scenario
        .items
        .iter()
        .enumerate()
        .map(|(i, item)| (item.id.as_str(), i))
        .collect();
    let calendar = &scenario.calendar;
    let mut rows = Vec::new();
    for record in &file.records {
        if let Some(cell) = file.cell(record, "kind") {
            let is_firm = match cell.text {
                "firm" => true,
                "planned" => false,
                other => {
                    return Err(cell.error(format!(
                        "kind {other} is not known; use planned or firm (or leave it empty)"
                    )))
                }
            };
            // A plan.csv lists both: the plan checked is its planned rows,
            // while as firm orders every row of it is kept.
            if is_firm && !firm {
                continue;
            }
        }
        let cell = file.required(record, "item")?;
        let item = *index.get(cell.text).ok_or_else(|| {
            cell.error(format!(
                "unknown item {}; it is not in items.csv",
                cell.text
            ))
        })?;
        if let Some(cell) = file.cell(record, "unit") {
            let unit = &scenario.items[item].unit;
            if cell.text != unit {
                return Err(cell.error(format!(
                    "item {} is counted in {unit} (items.csv), not in {}; convert the quantity to {unit}, or fix the unit in items.csv",
                    scenario.items[item].id, cell.text
                )));
            }
        }
        let receipt = receipt_bucket(&file, record, calendar)?;
        let quantity_cell = file.required(record, "quantity")?;
        let quantity = quantity_cell.non_negative()?;
        let bucket_location = file
            .cell(record, "period")
            .or_else(|| file.cell(record, "date"))
            .map_or_else(|| file.row_location(record), |cell| cell.location());
        let lead_time = scenario.items[item].lead_time as i64;
        if let Some(release) = release_bucket(&file, record, calendar)? {
            if release != receipt as i64 - lead_time {
                return Err(Error::input(
                    file.row_location(record),
                    format!(
                        "the release bucket does not agree with the lead time: item {} has a lead time of {} buckets, so an order received in period {} is released in period {}",
                        scenario.items[item].id,
                        lead_time,
                        receipt + 1,
                        receipt as i64 + 1 - lead_time
                    ),
                ));
            }
        }
        rows.push(OrderRow {
            item,
            receipt,
            quantity,
            location: quantity_cell.location(),
            bucket_location,
        });
    }
    Ok(rows)
}

/// The receipt bucket; plan.csv carries both period and date, which must agree.
fn receipt_bucket(file: &CsvFile, record: &Record, calendar: &Calendar) -> Result<usize> {
    let by_period = match file.cell(record, "period") {
        Some(cell) => {
            let period = cell.whole()?;
            if period == 0 || period > calendar.periods {
                return Err(cell.error(format!(
                    "period {period} is outside the horizon; periods run from 1 to {}",
                    calendar.periods
                )));
            }
            Some(period - 1)
        }
        None => None,
    };
    let by_date = match file.cell(record, "date") {
        Some(cell) => match calendar.place(cell.date()?) {
            DatePlace::Inside(t) => Some((t, cell)),
            DatePlace::Before => {
                return Err(cell.error(format!(
                    "{} is before the horizon starts on {}",
                    cell.text, calendar.start
                )))
            }
            DatePlace::After => {
                return Err(cell.error(format!("{} is after the horizon's last bucket", cell.text)))
            }
        },
        None => None,
    };
    match (by_period, by_date) {
        (Some(p), Some((d, cell))) if p != d => Err(cell.error(format!(
            "the date {} falls in period {}, but the row says period {}",
            cell.text,
            d + 1,
            p + 1
        ))),
        (Some(p), _) => Ok(p),
        (None, Some((d, _))) => Ok(d),
        (None, None) => Err(Error::input(
            file.row_location(record),
            "the row gives neither a period nor a date for the receipt",
        )),
    }
}

/// The release bucket as a signed number (releases may fall before bucket 1,
/// written as period 0 or less), when the row gives one.
fn release_bucket(file: &CsvFile, record: &Record, calendar: &Calendar) -> Result<Option<i64>> {
    if let Some(cell) = file.cell(record, "release_period") {
        let value = cell.number()?;
        if value.fract() != 0.0 {
            return Err(cell.error(format!("{} must be a whole number", cell.text)));
        }
        return Ok(Some(value as i64 - 1));
    }
    if let Some(cell) = file.cell(record, "release_date") {
        let date = cell.date()?;
        return Ok(Some(match calendar.place(date) {
            DatePlace::Inside(t) => t as i64,
            DatePlace::After => calendar.periods as i64,
            DatePlace::Before => {
                // Count whole buckets back from the start.
                let mut t = -1i64;
                while t > -100_000 && calendar.signed_bucket_start(t) > date {
                    t -= 1;
                }
                t
            }
        }));
    }
    Ok(None)
}
