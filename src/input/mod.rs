//! Reading a scenario folder: scenario.toml and the CSV files of the contract
//! in PRODUCT.md, checked once, here, so everything after takes validated types.

mod bom;
mod csvfile;
pub mod literature;
mod orders;
mod settings;

pub use csvfile::{Cell, CsvFile, Record, Schema};
pub use orders::read_orders;

use std::collections::HashMap;
use std::path::Path;

use crate::error::{Error, Location, Result};
use crate::model::{
    Calendar, DatePlace, Item, Resource, Routing, Scenario, DEFAULT_CAPACITY_UNIT,
    DEFAULT_ITEM_UNIT,
};

const ITEMS: Schema = Schema {
    known: &[
        "item",
        "setup_cost",
        "holding_cost",
        "holding_rate",
        "unit_cost",
        "initial_stock",
        "safety_stock",
        "lead_time",
        "min_lot",
        "lot_multiple",
        "max_lot",
        "backlog_cost",
        "fixed_lot",
        "ending_stock",
        "forecast_error",
        "unit",
    ],
    required: &["item", "setup_cost"],
};
const DEMAND: Schema = Schema {
    known: &["item", "period", "date", "quantity"],
    required: &["item", "quantity"],
};
const COSTS: Schema = Schema {
    known: &[
        "item",
        "period",
        "date",
        "setup_cost",
        "holding_cost",
        "unit_cost",
    ],
    required: &["item"],
};
const RESOURCES: Schema = Schema {
    known: &[
        "resource",
        "capacity",
        "overtime_capacity",
        "overtime_cost",
        "capacity_cost",
        "unit",
    ],
    required: &["resource", "capacity"],
};
const CAPACITY: Schema = Schema {
    known: &[
        "resource",
        "period",
        "date",
        "capacity",
        "overtime_capacity",
    ],
    required: &["resource", "capacity"],
};
const ROUTING: Schema = Schema {
    known: &["item", "resource", "per_unit", "setup_time"],
    required: &["item", "resource", "per_unit"],
};

/// Reads and validates the scenario in `dir`.
pub fn read_scenario(dir: &Path) -> Result<Scenario> {
    if !dir.is_dir() {
        return Err(Error::input(
            Location::file(dir),
            "not a scenario folder (it must be a folder holding scenario.toml, items.csv and demand.csv)",
        ));
    }
    let settings = settings::read(dir)?;
    let calendar = settings.calendar.clone();
    let (mut items, rates) = read_items(dir, &calendar)?;
    let index: HashMap<String, usize> = items
        .iter()
        .enumerate()
        .map(|(i, item)| (item.id.clone(), i))
        .collect();
    read_quantities(dir, "demand.csv", true, &calendar, &index, |item, t, q| {
        items[item].demand[t] += q
    })?;
    read_quantities(
        dir,
        "receipts.csv",
        false,
        &calendar,
        &index,
        |item, t, q| items[item].receipts[t] += q,
    )?;
    read_cost_overrides(dir, &calendar, &index, &rates, &mut items)?;
    let mut resources = read_resources(dir, &calendar)?;
    read_capacity(dir, &calendar, &mut resources)?;
    let routings = read_routing(dir, &index, &resources)?;
    let names: Vec<String> = items.iter().map(|item| item.id.clone()).collect();
    let bom = bom::read_bom(dir, &index, &names)?;
    let mut scenario = Scenario {
        name: settings.name,
        currency: settings.currency,
        calendar,
        items,
        resources,
        routings,
        bom,
        frozen: settings.frozen,
        period_offset: 0,
    };
    let firm = dir.join("orders-firm.csv");
    if firm.exists() {
        orders::read_firm_orders(&firm, &mut scenario)?;
    }
    Ok(scenario)
}

/// The bucket of a row, from its `period` or its `date` cell.
pub fn bucket_of(file: &CsvFile, record: &Record, calendar: &Calendar) -> Result<usize> {
    let period = file.cell(record, "period");
    let date = file.cell(record, "date");
    match (period, date) {
        (Some(_), Some(cell)) => {
            Err(cell.error("the row gives both a period and a date; give one of them"))
        }
        (None, None) => Err(Error::input(
            file.row_location(record),
            "the row gives neither a period nor a date; give one of them",
        )),
        (Some(cell), None) => {
            let period = cell.whole()?;
            if period == 0 || period > calendar.periods {
                return Err(cell.error(format!(
                    "period {period} is outside the horizon; periods run from 1 to {} (scenario.toml)",
                    calendar.periods
                )));
            }
            Ok(period - 1)
        }
        (None, Some(cell)) => {
            let date = cell.date()?;
            match calendar.place(date) {
                DatePlace::Inside(t) => Ok(t),
                DatePlace::Before => Err(cell.error(format!(
                    "{date} is before the horizon starts on {}; drop the row, or move `start` in scenario.toml back to cover it",
                    calendar.start
                ))),
                DatePlace::After => Err(cell.error(format!(
                    "{date} is after the horizon, whose last bucket ends on {}; drop the row, or raise `periods` in scenario.toml",
                    calendar.end().pred_opt().unwrap_or(calendar.end())
                ))),
            }
        }
    }
}

fn optional(file: &CsvFile, record: &Record, name: &str, default: f64) -> Result<f64> {
    match file.cell(record, name) {
        Some(cell) => cell.non_negative(),
        None => Ok(default),
    }
}

/// The row's `unit` cell, or `default` when it is empty or absent.
fn unit_of(file: &CsvFile, record: &Record, default: &str) -> Result<String> {
    match file.cell(record, "unit") {
        Some(cell) => cell.unit(),
        None => Ok(default.to_string()),
    }
}

/// The lot multiple of a `lot_multiple` cell: `0` makes the item continuous
/// (`None`); any other value must be a whole number of units, since whole
/// units are the default and a fractional multiple would break them.
fn lot_multiple(cell: &Cell) -> Result<Option<f64>> {
    let value = cell.number()?;
    if value == 0.0 {
        return Ok(None);
    }
    if value < 0.0 {
        return Err(cell.error(format!(
            "{} must not be negative; give a whole number of units per lot, or 0 for a continuous item (kg, litres)",
            cell.text
        )));
    }
    if value.fract() != 0.0 {
        return Err(cell.error(format!(
            "{} is not a whole number; quantities are whole units, so a lot multiple must be whole (or 0 for a continuous item, whose quantities may be fractional)",
            cell.text
        )));
    }
    Ok(Some(value))
}

/// The items, and for each the holding rate per bucket when its holding cost
/// derives from unit cost (so a unit-cost override can follow it).
fn read_items(dir: &Path, calendar: &Calendar) -> Result<(Vec<Item>, Vec<Option<f64>>)> {
    let file = CsvFile::open(dir, "items.csv", &ITEMS, true)?
        .ok_or_else(|| Error::Internal("items.csv vanished while being read".into()))?;
    if !file.has_column("holding_cost") && !file.has_column("holding_rate") {
        return Err(Error::input(
            Location::line(&file.path, 1),
            "items.csv needs a holding_cost column (per unit per bucket) or a holding_rate column (per year, times unit_cost)",
        ));
    }
    let periods = calendar.periods;
    let mut items: Vec<Item> = Vec::new();
    let mut rates = Vec::new();
    let mut seen = std::collections::HashSet::new();
    for record in &file.records {
        let id_cell = file.required(record, "item")?;
        let id = id_cell.text.to_string();
        if !seen.insert(id.clone()) {
            return Err(id_cell.error(format!("item {id} appears twice; give each item one row")));
        }
        let setup_cost = file.required(record, "setup_cost")?.non_negative()?;
        let unit_cost = optional(&file, record, "unit_cost", 0.0)?;
        let holding = match (
            file.cell(record, "holding_cost"),
            file.cell(record, "holding_rate"),
        ) {
            (Some(_), Some(rate)) => {
                return Err(rate
                    .error("the row gives both holding_cost and holding_rate; give one of them"))
            }
            (None, None) => {
                return Err(Error::input(
                    file.row_location(record),
                    format!(
                        "item {id} has neither a holding_cost nor a holding_rate; give one of them"
                    ),
                ))
            }
            (Some(cell), None) => Holding::PerBucket(cell.non_negative()?),
            (None, Some(cell)) => Holding::Rate(cell.non_negative()? / calendar.kind.per_year()),
        };
        let lead_time = match file.cell(record, "lead_time") {
            Some(cell) => cell.whole()?,
            None => 0,
        };
        let min_lot = optional(&file, record, "min_lot", 0.0)?;
        // Whole units unless the cell says 0 (bulk goods: kg, litres).
        let lot_multiple = match file.cell(record, "lot_multiple") {
            Some(cell) => lot_multiple(&cell)?,
            None => Some(1.0),
        };
        let max_lot = match file.cell(record, "max_lot") {
            Some(cell) => {
                let value = cell.positive()?;
                if value < min_lot {
                    return Err(cell.error(format!(
                        "max_lot {value} is below min_lot {min_lot}; no lot could meet both"
                    )));
                }
                if let Some(multiple) = lot_multiple {
                    if value < multiple {
                        return Err(cell.error(format!(
                            "max_lot {value} is below lot_multiple {multiple}; no lot could meet both"
                        )));
                    }
                }
                Some(value)
            }
            None => None,
        };
        let backlog_cost = match file.cell(record, "backlog_cost") {
            Some(cell) => Some(cell.non_negative()?),
            None => None,
        };
        let fixed_lot = match file.cell(record, "fixed_lot") {
            Some(cell) => Some(cell.positive()?),
            None => None,
        };
        if let (Some(multiple), Some(max)) = (lot_multiple, max_lot) {
            let smallest = (min_lot / multiple).ceil().max(1.0) * multiple;
            if smallest > max * (1.0 + 1e-12) {
                return Err(Error::input(
                    file.row_location(record),
                    format!("no lot can meet min_lot {min_lot}, lot_multiple {multiple} and max_lot {max} together: the smallest allowed multiple is {smallest}"),
                ));
            }
        }
        let unit = vec![unit_cost; periods];
        items.push(Item {
            id,
            unit: unit_of(&file, record, DEFAULT_ITEM_UNIT)?,
            setup_cost: vec![setup_cost; periods],
            nominal_setup_cost: setup_cost,
            nominal_holding_cost: match holding {
                Holding::PerBucket(h) => h,
                Holding::Rate(r) => r * unit_cost,
            },
            holding_cost: holding.per_bucket(&unit),
            unit_cost: unit,
            initial_stock: optional(&file, record, "initial_stock", 0.0)?,
            safety_stock: optional(&file, record, "safety_stock", 0.0)?,
            lead_time,
            min_lot,
            lot_multiple,
            max_lot,
            backlog_cost,
            fixed_lot,
            ending_stock: optional(&file, record, "ending_stock", 0.0)?,
            forecast_error: file
                .cell(record, "forecast_error")
                .map(|cell| cell.non_negative())
                .transpose()?,
            demand: vec![0.0; periods],
            receipts: vec![0.0; periods],
            firm: vec![0.0; periods],
            quantity_change: None,
        });
        rates.push(holding.rate());
    }
    if items.is_empty() {
        return Err(Error::input(
            Location::file(&file.path),
            "items.csv has a header but no items; add one row per item",
        ));
    }
    Ok((items, rates))
}

#[derive(Clone, Copy)]
enum Holding {
    PerBucket(f64),
    /// Yearly rate already divided by the buckets per year.
    Rate(f64),
}

impl Holding {
    fn per_bucket(self, unit_cost: &[f64]) -> Vec<f64> {
        match self {
            Holding::PerBucket(h) => vec![h; unit_cost.len()],
            Holding::Rate(r) => unit_cost.iter().map(|c| r * c).collect(),
        }
    }

    fn rate(self) -> Option<f64> {
        match self {
            Holding::PerBucket(_) => None,
            Holding::Rate(r) => Some(r),
        }
    }
}

/// Reads a file of `item, period|date, quantity` rows and hands each to `add`.
fn read_quantities(
    dir: &Path,
    name: &str,
    required: bool,
    calendar: &Calendar,
    index: &HashMap<String, usize>,
    mut add: impl FnMut(usize, usize, f64),
) -> Result<()> {
    let Some(file) = CsvFile::open(dir, name, &DEMAND, required)? else {
        return Ok(());
    };
    needs_bucket_column(&file, name)?;
    // Rows of one item usually come together: the id found last is tried
    // before the index.
    let mut last: Option<(&str, usize)> = None;
    for record in &file.records {
        let id = file.required(record, "item")?.text;
        let item = match last {
            Some((last_id, item)) if last_id == id => item,
            _ => item_of(&file, record, index)?,
        };
        last = Some((id, item));
        let t = bucket_of(&file, record, calendar)?;
        let quantity = file.required(record, "quantity")?.non_negative()?;
        add(item, t, quantity);
    }
    Ok(())
}

/// Files whose rows belong to a bucket need a `period` or a `date` column.
fn needs_bucket_column(file: &CsvFile, name: &str) -> Result<()> {
    if !file.has_column("period") && !file.has_column("date") {
        return Err(Error::input(
            Location::line(&file.path, 1),
            format!("{name} needs a period column or a date column"),
        ));
    }
    Ok(())
}

/// An override file gives one row per id and bucket; a second row would
/// silently replace the first, so it is refused.
fn refuse_second_override(
    seen: &mut HashMap<(usize, usize), u64>,
    file: &CsvFile,
    record: &Record,
    key: (usize, usize),
    what: &str,
) -> Result<()> {
    if let Some(first) = seen.insert(key, record.line) {
        return Err(Error::input(
            file.row_location(record),
            format!(
                "{what} already has a row for period {} on line {first}; put the changes of one bucket on one row",
                key.1 + 1
            ),
        ));
    }
    Ok(())
}

fn item_of(file: &CsvFile, record: &Record, index: &HashMap<String, usize>) -> Result<usize> {
    let cell = file.required(record, "item")?;
    index.get(cell.text).copied().ok_or_else(|| {
        cell.error(format!(
            "unknown item {}; every item must have a row in items.csv",
            cell.text
        ))
    })
}

fn read_cost_overrides(
    dir: &Path,
    calendar: &Calendar,
    index: &HashMap<String, usize>,
    rates: &[Option<f64>],
    items: &mut [Item],
) -> Result<()> {
    let Some(file) = CsvFile::open(dir, "costs.csv", &COSTS, false)? else {
        return Ok(());
    };
    needs_bucket_column(&file, "costs.csv")?;
    let mut seen = HashMap::new();
    for record in &file.records {
        let i = item_of(&file, record, index)?;
        let t = bucket_of(&file, record, calendar)?;
        let what = format!("item {}", items[i].id);
        refuse_second_override(&mut seen, &file, record, (i, t), &what)?;
        let item = &mut items[i];
        if let Some(cell) = file.cell(record, "setup_cost") {
            item.setup_cost[t] = cell.non_negative()?;
        }
        if let Some(cell) = file.cell(record, "unit_cost") {
            item.unit_cost[t] = cell.non_negative()?;
            if let Some(rate) = rates[i] {
                item.holding_cost[t] = rate * item.unit_cost[t];
            }
        }
        if let Some(cell) = file.cell(record, "holding_cost") {
            item.holding_cost[t] = cell.non_negative()?;
        }
    }
    Ok(())
}

fn read_resources(dir: &Path, calendar: &Calendar) -> Result<Vec<Resource>> {
    let Some(file) = CsvFile::open(dir, "resources.csv", &RESOURCES, false)? else {
        return Ok(Vec::new());
    };
    let mut resources: Vec<Resource> = Vec::new();
    for record in &file.records {
        let id_cell = file.required(record, "resource")?;
        let id = id_cell.text.to_string();
        if resources.iter().any(|r| r.id == id) {
            return Err(id_cell.error(format!(
                "resource {id} appears twice; give each resource one row"
            )));
        }
        let capacity = file.required(record, "capacity")?.non_negative()?;
        let overtime_capacity = optional(&file, record, "overtime_capacity", 0.0)?;
        let overtime_cost = optional(&file, record, "overtime_cost", 0.0)?;
        if overtime_capacity > 0.0 && file.cell(record, "overtime_cost").is_none() {
            return Err(Error::input(
                file.row_location(record),
                format!("resource {id} allows overtime but gives no overtime_cost; give its cost per unit of capacity (0 if it is free)"),
            ));
        }
        let capacity_cost = file
            .cell(record, "capacity_cost")
            .map(|cell| cell.non_negative())
            .transpose()?;
        resources.push(Resource {
            id,
            unit: unit_of(&file, record, DEFAULT_CAPACITY_UNIT)?,
            capacity: vec![capacity; calendar.periods],
            overtime_capacity: vec![overtime_capacity; calendar.periods],
            overtime_cost,
            capacity_cost,
        });
    }
    Ok(resources)
}

fn resource_of(file: &CsvFile, record: &Record, resources: &[Resource]) -> Result<usize> {
    let cell = file.required(record, "resource")?;
    resources
        .iter()
        .position(|r| r.id == cell.text)
        .ok_or_else(|| {
            cell.error(format!(
                "unknown resource {}; every resource must have a row in resources.csv",
                cell.text
            ))
        })
}

fn read_capacity(dir: &Path, calendar: &Calendar, resources: &mut [Resource]) -> Result<()> {
    let Some(file) = CsvFile::open(dir, "capacity.csv", &CAPACITY, false)? else {
        return Ok(());
    };
    needs_bucket_column(&file, "capacity.csv")?;
    let mut seen = HashMap::new();
    for record in &file.records {
        let r = resource_of(&file, record, resources)?;
        let t = bucket_of(&file, record, calendar)?;
        let what = format!("resource {}", resources[r].id);
        refuse_second_override(&mut seen, &file, record, (r, t), &what)?;
        if let Some(cell) = file.cell(record, "capacity") {
            let capacity = cell.non_negative()?;
            resources[r].capacity[t] = capacity;
            // A bucket of capacity 0 is a shutdown: its overtime closes too,
            // unless the row itself gives overtime for it.
            if capacity == 0.0 {
                resources[r].overtime_capacity[t] = 0.0;
            }
        }
        if let Some(cell) = file.cell(record, "overtime_capacity") {
            resources[r].overtime_capacity[t] = cell.non_negative()?;
        }
    }
    Ok(())
}

fn read_routing(
    dir: &Path,
    index: &HashMap<String, usize>,
    resources: &[Resource],
) -> Result<Vec<Routing>> {
    let Some(file) = CsvFile::open(dir, "routing.csv", &ROUTING, false)? else {
        return Ok(Vec::new());
    };
    let mut routings: Vec<Routing> = Vec::new();
    let mut pairs = std::collections::HashSet::new();
    for record in &file.records {
        let item = item_of(&file, record, index)?;
        let resource = resource_of(&file, record, resources)?;
        if !pairs.insert((item, resource)) {
            return Err(Error::input(
                file.row_location(record),
                "this item and resource pair appears twice; give it one row",
            ));
        }
        routings.push(Routing {
            item,
            resource,
            per_unit: file.required(record, "per_unit")?.non_negative()?,
            setup_time: optional(&file, record, "setup_time", 0.0)?,
        });
    }
    Ok(routings)
}

/// One weekly forecast of a rolling run: the demand forecast made at the
/// start of bucket `bucket`, by item and bucket of the scenario (zero
/// before `bucket`).
#[derive(Debug, Clone, PartialEq)]
pub struct Snapshot {
    pub bucket: usize,
    pub demand: Vec<Vec<f64>>,
    pub file: std::path::PathBuf,
}

/// Reads a folder of forecast snapshots for `lotwright roll`: one file per
/// bucket, named by the date the bucket starts (`2027-01-04.csv`), in the
/// layout of demand.csv. A `period` in a snapshot counts from the
/// snapshot's own bucket (period 1); a `date` must fall in it or later.
/// The snapshots must follow one another bucket by bucket, inside the
/// scenario's horizon. Files that are not `.csv` are left alone.
pub fn read_history(dir: &Path, scenario: &Scenario) -> Result<Vec<Snapshot>> {
    let entries = std::fs::read_dir(dir).map_err(|e| {
        let message = if e.kind() == std::io::ErrorKind::NotFound {
            "the forecast history folder is missing; check the path given to --history".to_string()
        } else {
            format!("cannot read the folder: {e}")
        };
        Error::input(Location::file(dir), message)
    })?;
    let calendar = &scenario.calendar;
    let mut dated = Vec::new();
    for entry in entries {
        let entry = entry.map_err(|e| Error::input(Location::file(dir), e.to_string()))?;
        let path = entry.path();
        if path.extension().and_then(|e| e.to_str()) != Some("csv") {
            continue;
        }
        let stem = path.file_stem().and_then(|s| s.to_str()).unwrap_or("");
        let date = chrono::NaiveDate::parse_from_str(stem, "%Y-%m-%d").map_err(|_| {
            Error::input(
                Location::file(&path),
                "a forecast snapshot is named by the date its first bucket starts, such as 2027-01-04.csv",
            )
        })?;
        let bucket = match calendar.place(date) {
            DatePlace::Inside(t) if calendar.bucket_start(t) == date => t,
            DatePlace::Inside(t) => {
                return Err(Error::input(
                    Location::file(&path),
                    format!(
                        "{date} is not the first day of a bucket; the bucket holding it starts on {}",
                        calendar.label(t)
                    ),
                ))
            }
            _ => {
                return Err(Error::input(
                    Location::file(&path),
                    format!(
                        "{date} is outside the scenario's horizon ({} to {}); scenario.toml's periods must cover every week of the run and the planning horizon after the last",
                        calendar.label(0),
                        calendar.end()
                    ),
                ))
            }
        };
        dated.push((bucket, path));
    }
    dated.sort();
    if dated.is_empty() {
        return Err(Error::input(
            Location::file(dir),
            "the folder holds no forecast snapshots (files named by date, such as 2027-01-04.csv)",
        ));
    }
    for pair in dated.windows(2) {
        if pair[1].0 != pair[0].0 + 1 {
            return Err(Error::input(
                Location::file(&pair[1].1),
                format!(
                    "the snapshots must follow one another bucket by bucket, and the one for {} is missing",
                    calendar.label(pair[0].0 + 1)
                ),
            ));
        }
    }
    let index: HashMap<String, usize> = scenario
        .items
        .iter()
        .enumerate()
        .map(|(i, item)| (item.id.clone(), i))
        .collect();
    let periods = scenario.periods();
    dated
        .into_iter()
        .map(|(bucket, path)| {
            let from = Calendar {
                start: calendar.bucket_start(bucket),
                periods: periods - bucket,
                ..calendar.clone()
            };
            let mut demand = vec![vec![0.0; periods]; scenario.items.len()];
            let (folder, name) = (
                path.parent().unwrap_or(dir),
                path.file_name().and_then(|n| n.to_str()).unwrap_or(""),
            );
            read_quantities(folder, name, true, &from, &index, |item, t, q| {
                demand[item][bucket + t] += q
            })?;
            Ok(Snapshot {
                bucket,
                demand,
                file: path,
            })
        })
        .collect()
}
