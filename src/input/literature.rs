//! Reading benchmark instances of the capacitated lot-sizing literature:
//! the whitespace-separated format of the Trigeiro, Thomas and McClain (1989)
//! instances described in shared/benchmarks/README.md (items and periods;
//! a unit cost; the capacity per period; per item its capacity per unit,
//! holding cost, setup time and setup cost; the demand, one line per period).
//! Lines after the demand (the generator's notes) are ignored.

use std::path::{Path, PathBuf};

use crate::error::{Error, Location, Result};
use crate::model::{BucketKind, Calendar, Item, Resource, Routing, Scenario};

/// The non-blank lines of a file, with their 1-based numbers.
struct Lines<'a> {
    path: &'a Path,
    lines: Box<dyn Iterator<Item = (u64, &'a str)> + 'a>,
    last: u64,
}

impl<'a> Lines<'a> {
    fn new(path: &'a Path, text: &'a str) -> Self {
        let lines = text
            .lines()
            .enumerate()
            .map(|(k, l)| (k as u64 + 1, l))
            .filter(|(_, l)| !l.trim().is_empty());
        Lines {
            path,
            lines: Box::new(lines),
            last: 0,
        }
    }

    /// The next line as exactly `fields.len()` non-negative numbers.
    fn numbers(&mut self, what: &str, fields: &[String]) -> Result<(u64, Vec<f64>)> {
        let Some((number, line)) = self.lines.next() else {
            let message = format!("the file ends here; expected {what} next");
            return Err(Error::input(Location::line(self.path, self.last), message));
        };
        self.last = number;
        let tokens: Vec<&str> = line.split_whitespace().collect();
        if tokens.len() != fields.len() {
            let message = format!(
                "expected {what}: {} number(s) ({}), found {}",
                fields.len(),
                fields.join(", "),
                tokens.len()
            );
            return Err(Error::input(Location::line(self.path, number), message));
        }
        let mut values = Vec::with_capacity(tokens.len());
        for (k, (token, field)) in tokens.iter().zip(fields).enumerate() {
            let cell = || Location::cell(self.path, number, k + 1, field);
            let value: f64 = token
                .parse()
                .map_err(|_| Error::input(cell(), format!("`{token}` is not a number")))?;
            if !value.is_finite() || value < 0.0 {
                let message = format!("`{token}` must be a finite number, 0 or more");
                return Err(Error::input(cell(), message));
            }
            values.push(value);
        }
        Ok((number, values))
    }
}

/// The instances a run names: each path is an instance file or a folder,
/// whose files are taken in name order. Only instances whose file name
/// `wanted` accepts are read, and at most `limit` of them. A file named
/// directly must be an instance; in a folder, a file whose first line is
/// not `n T` (a licence, a readme) is passed over and returned second.
pub fn read_capacitated_instances(
    paths: &[PathBuf],
    wanted: impl Fn(&str) -> bool,
    limit: Option<usize>,
) -> Result<(Vec<Scenario>, Vec<PathBuf>)> {
    let unreadable = |path: &Path, e: std::io::Error| {
        Error::input(Location::file(path), format!("cannot read: {e}"))
    };
    let mut files: Vec<(PathBuf, bool)> = Vec::new();
    for path in paths {
        if std::fs::metadata(path)
            .map_err(|e| unreadable(path, e))?
            .is_dir()
        {
            let mut listed: Vec<PathBuf> = std::fs::read_dir(path)
                .map_err(|e| unreadable(path, e))?
                .filter_map(|entry| entry.ok().map(|e| e.path()))
                .filter(|p| p.is_file() && !file_name(p).starts_with('.'))
                .collect();
            listed.sort();
            files.extend(listed.into_iter().map(|p| (p, true)));
        } else {
            files.push((path.clone(), false));
        }
    }
    let mut instances = Vec::new();
    let mut skipped = Vec::new();
    for (path, listed) in files {
        let name = file_name(&path);
        if !wanted(&name) {
            continue;
        }
        if limit.is_some_and(|n| instances.len() >= n) {
            break;
        }
        let bytes = std::fs::read(&path).map_err(|e| unreadable(&path, e))?;
        let text = String::from_utf8_lossy(&bytes);
        if listed && !starts_with_size(&text) {
            skipped.push(path);
            continue;
        }
        instances.push(parse_capacitated(&path, &name, &text)?);
    }
    Ok((instances, skipped))
}

/// The file name of a path, or the whole path when it has none.
pub fn file_name(path: &Path) -> String {
    path.file_name().map_or_else(
        || path.display().to_string(),
        |n| n.to_string_lossy().into_owned(),
    )
}

/// Whether the first non-blank line is two whole numbers (`n T`).
fn starts_with_size(text: &str) -> bool {
    let first = text.lines().find(|l| !l.trim().is_empty()).unwrap_or("");
    let tokens: Vec<&str> = first.split_whitespace().collect();
    tokens.len() == 2 && tokens.iter().all(|t| t.parse::<usize>().is_ok())
}

/// Reads one instance into a scenario named `name`: one resource with the
/// instance's capacity every period, no overtime, no stock. The unit cost is
/// left out (set to 0): it is the same for every item, and every plan makes
/// exactly the total demand, so it adds a constant and cannot change the
/// optimum.
pub fn parse_capacitated(path: &Path, name: &str, text: &str) -> Result<Scenario> {
    let mut lines = Lines::new(path, text);
    let names = |list: &[&str]| list.iter().map(|s| s.to_string()).collect::<Vec<_>>();
    let (line, size) = lines.numbers("the header `n T`", &names(&["items", "periods"]))?;
    let whole = |v: f64| v.fract() == 0.0 && (1.0..=10_000.0).contains(&v);
    if !size.iter().all(|&v| whole(v)) {
        let message = "items and periods must be whole numbers from 1 to 10000";
        return Err(Error::input(Location::line(path, line), message));
    }
    let (items, periods) = (size[0] as usize, size[1] as usize);
    lines.numbers("the unit cost", &names(&["unit cost"]))?;
    let (line, capacity) = lines.numbers("the capacity per period", &names(&["capacity"]))?;
    if capacity[0] <= 0.0 {
        return Err(Error::input(
            Location::line(path, line),
            "capacity must be above 0",
        ));
    }
    let item_fields = names(&[
        "capacity per unit",
        "holding cost",
        "setup time",
        "setup cost",
    ]);
    let mut item_rows = Vec::with_capacity(items);
    for i in 0..items {
        let (_, v) = lines.numbers(&format!("item {} of {items}", i + 1), &item_fields)?;
        item_rows.push([v[0], v[1], v[2], v[3]]);
    }
    let demand_fields: Vec<String> = (1..=items).map(|i| format!("demand of item {i}")).collect();
    let mut demand = Vec::with_capacity(periods);
    for t in 0..periods {
        let what = format!("the demand of period {} of {periods}", t + 1);
        demand.push(lines.numbers(&what, &demand_fields)?.1);
    }
    Ok(scenario(name, capacity[0], &item_rows, &demand))
}

/// The instance as a scenario; `items` rows are capacity per unit, holding
/// cost, setup time, setup cost; `demand[period][item]`.
fn scenario(name: &str, capacity: f64, rows: &[[f64; 4]], demand: &[Vec<f64>]) -> Scenario {
    let periods = demand.len();
    let items = rows
        .iter()
        .enumerate()
        .map(|(i, &[_, holding_cost, _, setup_cost])| {
            let item_demand: Vec<f64> = demand.iter().map(|row| row[i]).collect();
            Item::simple(
                &format!("item{}", i + 1),
                &item_demand,
                setup_cost,
                holding_cost,
            )
        })
        .collect();
    let routings = rows
        .iter()
        .enumerate()
        .map(|(i, &[per_unit, _, setup_time, _])| Routing {
            item: i,
            resource: 0,
            per_unit,
            setup_time,
        })
        .collect();
    Scenario {
        name: name.to_string(),
        currency: None,
        calendar: Calendar {
            start: chrono::NaiveDate::from_ymd_opt(2027, 1, 4).unwrap_or_default(),
            kind: BucketKind::Week,
            periods,
        },
        items,
        resources: vec![Resource {
            id: "machine".into(),
            unit: "capacity units".into(),
            capacity: vec![capacity; periods],
            overtime_capacity: vec![0.0; periods],
            overtime_cost: 0.0,
            capacity_cost: None,
        }],
        routings,
        frozen: 0,
        bom: Vec::new(),
        period_offset: 0,
    }
}
