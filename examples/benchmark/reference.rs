//! The reference values of `shared/benchmarks/trigeiro-x-reference.csv`
//! (the best plan and bound general-purpose solvers reached on each
//! instance) and how far a plan lies from them.

use std::collections::HashMap;
use std::path::Path;

use lotwright::Error;

/// One instance's reference: the best plan known (if any), whether it was
/// proven, and the best bound.
#[derive(Debug, Clone, Copy)]
pub struct Reference {
    pub best_plan: Option<f64>,
    pub proven: bool,
    pub best_bound: Option<f64>,
}

/// Reads the reference file: a header `instance,best_plan,proven,best_bound`
/// and one row per instance (an empty cell where there is no value).
pub fn read(path: &Path) -> Result<HashMap<String, Reference>, Error> {
    let text = std::fs::read_to_string(path)
        .map_err(|e| Error::Usage(format!("--reference {}: {e}", path.display())))?;
    let mut rows = HashMap::new();
    for (n, line) in text.lines().enumerate().skip(1) {
        if line.trim().is_empty() {
            continue;
        }
        let cells: Vec<&str> = line.split(',').map(str::trim).collect();
        let bad = |column: usize, what: &str| {
            Error::Usage(format!(
                "--reference {}, line {}, column {}: {what}",
                path.display(),
                n + 1,
                column + 1
            ))
        };
        if cells.len() != 4 {
            return Err(bad(
                0,
                "expected 4 cells: instance,best_plan,proven,best_bound",
            ));
        }
        let number = |column: usize| -> Result<Option<f64>, Error> {
            match cells[column] {
                "" => Ok(None),
                text => text
                    .parse()
                    .map(Some)
                    .map_err(|_| bad(column, &format!("`{text}` is not a number"))),
            }
        };
        rows.insert(
            cells[0].to_string(),
            Reference {
                best_plan: number(1)?,
                proven: cells[2] == "yes",
                best_bound: number(3)?,
            },
        );
    }
    Ok(rows)
}

/// The plan's deviation from the best known plan, in percent.
pub fn deviation(cost: f64, reference: &Reference) -> Option<f64> {
    let best = reference.best_plan?;
    Some(100.0 * (cost - best) / best.abs().max(1e-9))
}

/// Totals over the instances with a reference plan: mean and largest
/// deviation, how many lie within 0.5 % (the target), and how many
/// bounds lie above a reference plan (never allowed).
pub fn summary(rows: &[(Option<f64>, f64, Option<Reference>)]) -> String {
    let deviations: Vec<f64> = rows
        .iter()
        .filter_map(|(cost, _, reference)| deviation((*cost)?, reference.as_ref()?))
        .collect();
    let above: usize = rows
        .iter()
        .filter(|(_, bound, reference)| {
            reference
                .and_then(|r| r.best_plan)
                .is_some_and(|best| bound.is_finite() && *bound > best + 1e-6 * best.abs().max(1.0))
        })
        .count();
    // A plan below a proven optimum or below a proven bound is a bug.
    let below: usize = rows
        .iter()
        .filter(|(cost, _, reference)| {
            let (Some(cost), Some(r)) = (cost, reference) else {
                return false;
            };
            let floor = r.best_bound.or(r.best_plan.filter(|_| r.proven));
            floor.is_some_and(|f| *cost < f - 1e-6 * f.abs().max(1.0))
        })
        .count();
    let mean = deviations.iter().sum::<f64>() / deviations.len().max(1) as f64;
    let largest = deviations.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    let within = deviations.iter().filter(|&&d| d <= 0.5).count();
    format!(
        "  against the reference: {} plans compared; deviation from the best known plan mean {:.2} %, largest {:.2} %; {} within 0.5 %; bounds above a reference plan: {}; plans below a reference bound: {}\n",
        deviations.len(),
        mean,
        if deviations.is_empty() { 0.0 } else { largest },
        within,
        above,
        below
    )
}
