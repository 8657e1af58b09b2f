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
    ],
    required: &["item", "quantity"],
};

/// Reads the orders file at `path` into a plan for `scenario`.
pub fn read_orders(path: &Path, scenario: &Scenario) -> Result<Plan> {
    let bytes = std::fs::read(path).map_err(|e| {
        let message = if e.kind() == std::io::ErrorKind::NotFound {
            "the orders file is missing; check the path given to --orders".to_string()
        } else {
            format!("cannot read the file: {e}")
        };
        Error::input(Location::file(path), message)
    })?;
    let file = CsvFile::parse(path, &bytes, &ORDERS)?;
    if !file.has_column("period") && !file.has_column("date") {
        return Err(Error::input(
            Location::line(path, 1),
            "the orders file needs a period column or a date column (the receipt bucket)",
        ));
    }
    let index: HashMap<&str, usize> = scenario
        .items
        .iter()
        .enumerate()
        .map(|(i, item)| (item.id.as_str(), i))
        .collect();
    let calendar = &scenario.calendar;
    let mut plan = Plan::empty(scenario.items.len(), scenario.periods());
    for record in &file.records {
        let cell = file.required(record, "item")?;
        let item = *index.get(cell.text).ok_or_else(|| {
            cell.error(format!(
                "unknown item {}; it is not in items.csv",
                cell.text
            ))
        })?;
        let receipt = receipt_bucket(&file, record, calendar)?;
        let quantity = file.required(record, "quantity")?.non_negative()?;
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
        plan.receipts[item][receipt] += quantity;
    }
    Ok(plan)
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
