//! bom.csv: `parent, component, quantity_per[, scrap_rate]`, one row per
//! line of the bill of material. Both items must be in items.csv; a parent
//! lists each component once; quantity per is more than zero; scrap is a
//! share from 0 up to (not including) 1; and no item may go, through any
//! chain of lines, into itself.

use std::collections::HashMap;
use std::path::Path;

use super::{CsvFile, Record, Schema};
use crate::error::{Error, Result};
use crate::model::BomLine;

const BOM: Schema = Schema {
    known: &["parent", "component", "quantity_per", "scrap_rate"],
    required: &["parent", "component", "quantity_per"],
};

/// Reads `dir/bom.csv`; an absent file is an empty bill.
pub fn read_bom(
    dir: &Path,
    index: &HashMap<String, usize>,
    names: &[String],
) -> Result<Vec<BomLine>> {
    let Some(file) = CsvFile::open(dir, "bom.csv", &BOM, false)? else {
        return Ok(Vec::new());
    };
    let mut lines: Vec<BomLine> = Vec::new();
    let mut rows: Vec<u64> = Vec::new();
    let mut seen: HashMap<(usize, usize), u64> = HashMap::new();
    for record in &file.records {
        let parent = item_in(&file, record, "parent", index)?;
        let component = item_in(&file, record, "component", index)?;
        if parent == component {
            return Err(file.required(record, "component")?.error(format!(
                "{} is listed as a component of itself; an item cannot go into itself",
                names[component]
            )));
        }
        if let Some(first) = seen.insert((parent, component), record.line) {
            return Err(Error::input(
                file.row_location(record),
                format!(
                    "{} already lists {} as a component on line {first}; give each component of a parent one row (add the quantities)",
                    names[parent], names[component]
                ),
            ));
        }
        let quantity_per = file.required(record, "quantity_per")?.positive()?;
        let scrap_rate = match file.cell(record, "scrap_rate") {
            None => 0.0,
            Some(cell) => {
                let rate = cell.number()?;
                if !(0.0..1.0).contains(&rate) {
                    return Err(cell.error(format!(
                        "{} is not a scrap rate; write the share of the component lost, from 0 up to below 1 (0.05 for 5 %)",
                        cell.text
                    )));
                }
                rate
            }
        };
        lines.push(BomLine {
            parent,
            component,
            quantity_per,
            scrap_rate,
        });
        rows.push(record.line);
    }
    if let Some((cycle, line)) = find_cycle(names.len(), &lines, &rows) {
        let chain: Vec<&str> = cycle.iter().map(|&i| names[i].as_str()).collect();
        return Err(Error::input(
            crate::error::Location::line(&file.path, line),
            format!(
                "this line closes a cycle in the bill of material: {}; an item cannot go, through its components, into itself",
                chain.join(" -> ")
            ),
        ));
    }
    Ok(lines)
}

fn item_in(
    file: &CsvFile,
    record: &Record,
    column: &str,
    index: &HashMap<String, usize>,
) -> Result<usize> {
    let cell = file.required(record, column)?;
    index.get(cell.text).copied().ok_or_else(|| {
        cell.error(format!(
            "unknown item {}; every {column} must have a row in items.csv",
            cell.text
        ))
    })
}

/// A cycle of items (first item repeated at the end) and the line of the
/// row that closes it, or `None` for an acyclic bill.
fn find_cycle(items: usize, lines: &[BomLine], rows: &[u64]) -> Option<(Vec<usize>, u64)> {
    let mut out: Vec<Vec<(usize, u64)>> = vec![Vec::new(); items];
    for (line, &row) in lines.iter().zip(rows) {
        out[line.parent].push((line.component, row));
    }
    // Depth-first search with colours: 0 unseen, 1 on the path, 2 done.
    let mut colour = vec![0u8; items];
    let mut path: Vec<usize> = Vec::new();
    for root in 0..items {
        if colour[root] != 0 {
            continue;
        }
        // (item, next edge to try)
        let mut stack: Vec<(usize, usize)> = vec![(root, 0)];
        colour[root] = 1;
        path.push(root);
        while let Some(&mut (node, ref mut next)) = stack.last_mut() {
            if let Some(&(child, row)) = out[node].get(*next) {
                *next += 1;
                match colour[child] {
                    0 => {
                        colour[child] = 1;
                        path.push(child);
                        stack.push((child, 0));
                    }
                    1 => {
                        let from = path.iter().position(|&i| i == child).unwrap_or(0);
                        let mut cycle = path[from..].to_vec();
                        cycle.push(child);
                        return Some((cycle, row));
                    }
                    _ => {}
                }
            } else {
                colour[node] = 2;
                path.pop();
                stack.pop();
            }
        }
    }
    None
}
