//! No input makes the library panic: a valid scenario (no resources, so the
//! MILP is rarely involved) is mutated at random, byte by byte and cell by
//! cell, then read, planned, rendered as JSON and, with a mutated plan file,
//! checked. Every step may return an error; none may panic.
//!
//! The number of cases comes from `LOTWRIGHT_FUZZ_CASES` (64 by default);
//! `make fuzz` runs 100000 of them in release. `LOTWRIGHT_FUZZ_SEED` fixes
//! the random seed to replay a run.

use std::panic::{catch_unwind, AssertUnwindSafe};
use std::path::Path;

use lotwright::capacity::milp::MilpOptions;
use lotwright::solve;
use proptest::prelude::*;
use proptest::sample::Index;
use proptest::test_runner::{Config, RngSeed};

/// The orders file lives beside the scenario files but is read by
/// `read_orders`, not by `read_scenario` (which ignores names it does not
/// know).
const ORDERS: &str = "orders.csv";

const BASE: &[(&str, &str)] = &[
    (
        "scenario.toml",
        "name = \"mutation\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 6\ncurrency = \"EUR\"\n",
    ),
    (
        "items.csv",
        "item,setup_cost,holding_cost,holding_rate,unit_cost,initial_stock,safety_stock,lead_time,min_lot,lot_multiple,max_lot,backlog_cost,fixed_lot,ending_stock,x_note\n\
A,80,2,,1,0,0,0,,,,,50,,pressed\n\
B,40,,0.26,3,25,5,1,10,5,,,,,\"bought, boxed\"\n\
C,60,1,,2,0,,0,,1,40,4,,5,\n",
    ),
    (
        "demand.csv",
        "item,period,date,quantity\n\
A,1,,18\nA,2,,30\nA,3,,42\nA,,2027-01-27,5\nA,6,,20\n\
B,2,,15\nB,,2027-01-26,30\nB,5,,10\n\
C,1,,12\nC,3,,25\nC,6,,40\n",
    ),
    (
        "costs.csv",
        "item,period,setup_cost,holding_cost,unit_cost\nA,2,90,,\nB,3,,,3.5\nC,4,,1.5,\n",
    ),
    ("receipts.csv", "item,date,quantity\nB,2027-01-11,10\nC,2027-01-12,5\n"),
    (
        ORDERS,
        "item,period,date,release_period,quantity\nA,1,,1,48\nA,3,2027-01-18,3,47\nB,4,,3,10\nC,6,,,45\n",
    ),
];

/// One change to one file. Positions are indices into whatever the file
/// holds when the change is made.
#[derive(Debug, Clone)]
enum Mutation {
    FlipByte {
        file: Index,
        at: Index,
        mask: u8,
    },
    InsertByte {
        file: Index,
        at: Index,
        byte: u8,
    },
    DeleteByte {
        file: Index,
        at: Index,
    },
    ReplaceCell {
        file: Index,
        row: Index,
        column: Index,
        text: String,
    },
    /// A plausible number in a data cell of a CSV file, so that more
    /// mutated scenarios get through reading to the solvers.
    SetNumber {
        file: Index,
        row: Index,
        column: Index,
        text: String,
    },
    DuplicateRow {
        file: Index,
        row: Index,
    },
    DeleteRow {
        file: Index,
        row: Index,
    },
    SwapColumns {
        file: Index,
        a: Index,
        b: Index,
    },
    RemoveFile {
        file: Index,
    },
}

/// Cell texts that tend to find mistakes: numbers at the edges, numbers
/// with words, dates that do not exist, ids of no item, and noise.
fn cell_text() -> impl Strategy<Value = String> {
    prop_oneof![
        Just(String::new()),
        (-1000i64..1000).prop_map(|n| n.to_string()),
        (0u32..20).prop_map(|n| n.to_string()),
        any::<f64>().prop_map(|x| x.to_string()),
        (-1e6f64..1e6).prop_map(|x| format!("{x:.3}")),
        prop::sample::select(vec![
            "NaN",
            "inf",
            "-inf",
            "1e12",
            "-1e12",
            "1e13",
            "1e308",
            "5e-324",
            "-0",
            "0.1",
            "1e9",
            "999999999",
            "12 pcs",
            "1,5",
            "2027-02-30",
            "2027-01-04",
            "2026-12-31",
            "2030-01-01",
            "9999-12-31",
            "A",
            "B",
            "C",
            "Z",
            "\"",
            "x_",
            " ",
            ";",
            "\u{feff}",
            "é",
            "period",
            "date",
        ])
        .prop_map(str::to_string),
        "[ -~]{0,10}",
        any::<String>().prop_map(|s| s.chars().take(6).collect()),
    ]
}

fn plausible_number() -> impl Strategy<Value = String> {
    prop_oneof![
        (0u32..8).prop_map(|n| n.to_string()),
        (0u32..500).prop_map(|n| n.to_string()),
        (0.0f64..100.0).prop_map(|x| format!("{x:.2}")),
        Just(String::new()),
    ]
}

fn mutation() -> impl Strategy<Value = Mutation> {
    prop_oneof![
        3 => (any::<Index>(), any::<Index>(), 1u8..=255)
            .prop_map(|(file, at, mask)| Mutation::FlipByte { file, at, mask }),
        3 => (any::<Index>(), any::<Index>(), any::<u8>())
            .prop_map(|(file, at, byte)| Mutation::InsertByte { file, at, byte }),
        3 => (any::<Index>(), any::<Index>())
            .prop_map(|(file, at)| Mutation::DeleteByte { file, at }),
        6 => (any::<Index>(), any::<Index>(), any::<Index>(), cell_text()).prop_map(
            |(file, row, column, text)| Mutation::ReplaceCell { file, row, column, text }
        ),
        6 => (any::<Index>(), any::<Index>(), any::<Index>(), plausible_number()).prop_map(
            |(file, row, column, text)| Mutation::SetNumber { file, row, column, text }
        ),
        2 => (any::<Index>(), any::<Index>())
            .prop_map(|(file, row)| Mutation::DuplicateRow { file, row }),
        2 => (any::<Index>(), any::<Index>())
            .prop_map(|(file, row)| Mutation::DeleteRow { file, row }),
        2 => (any::<Index>(), any::<Index>(), any::<Index>())
            .prop_map(|(file, a, b)| Mutation::SwapColumns { file, a, b }),
        1 => any::<Index>().prop_map(|file| Mutation::RemoveFile { file }),
    ]
}

/// The files as lines of cells (commas split cells; in scenario.toml the
/// value after `=` is the one cell of a line that can be replaced).
fn lines(bytes: &[u8]) -> Vec<String> {
    String::from_utf8_lossy(bytes)
        .split('\n')
        .map(str::to_string)
        .collect()
}

fn join(lines: &[String]) -> Vec<u8> {
    lines.join("\n").into_bytes()
}

fn apply(files: &mut Vec<(String, Vec<u8>)>, mutation: &Mutation) {
    if files.is_empty() {
        return;
    }
    let count = files.len();
    match mutation {
        Mutation::FlipByte { file, at, mask } => {
            let bytes = &mut files[file.index(count)].1;
            if !bytes.is_empty() {
                let i = at.index(bytes.len());
                bytes[i] ^= mask;
            }
        }
        Mutation::InsertByte { file, at, byte } => {
            let bytes = &mut files[file.index(count)].1;
            let i = at.index(bytes.len() + 1);
            bytes.insert(i, *byte);
        }
        Mutation::DeleteByte { file, at } => {
            let bytes = &mut files[file.index(count)].1;
            if !bytes.is_empty() {
                let i = at.index(bytes.len());
                bytes.remove(i);
            }
        }
        Mutation::ReplaceCell {
            file,
            row,
            column,
            text,
        } => {
            let f = file.index(count);
            let toml = files[f].0.ends_with(".toml");
            let mut rows = lines(&files[f].1);
            let r = row.index(rows.len());
            if toml {
                let key = rows[r].split('=').next().unwrap_or("").to_string();
                rows[r] = format!("{key}= {text}");
            } else {
                let mut cells: Vec<String> = rows[r].split(',').map(str::to_string).collect();
                let c = column.index(cells.len());
                cells[c] = text.clone();
                rows[r] = cells.join(",");
            }
            files[f].1 = join(&rows);
        }
        Mutation::SetNumber {
            file,
            row,
            column,
            text,
        } => {
            let csv: Vec<usize> = (0..count)
                .filter(|&f| files[f].0.ends_with(".csv"))
                .collect();
            if csv.is_empty() {
                return;
            }
            let f = csv[file.index(csv.len())];
            let mut rows = lines(&files[f].1);
            if rows.len() < 2 {
                return;
            }
            let r = 1 + row.index(rows.len() - 1);
            let mut cells: Vec<String> = rows[r].split(',').map(str::to_string).collect();
            let c = column.index(cells.len());
            cells[c] = text.clone();
            rows[r] = cells.join(",");
            files[f].1 = join(&rows);
        }
        Mutation::DuplicateRow { file, row } => {
            let f = file.index(count);
            let mut rows = lines(&files[f].1);
            let r = row.index(rows.len());
            rows.insert(r, rows[r].clone());
            files[f].1 = join(&rows);
        }
        Mutation::DeleteRow { file, row } => {
            let f = file.index(count);
            let mut rows = lines(&files[f].1);
            rows.remove(row.index(rows.len()));
            files[f].1 = join(&rows);
        }
        Mutation::SwapColumns { file, a, b } => {
            let f = file.index(count);
            let rows: Vec<String> = lines(&files[f].1)
                .into_iter()
                .map(|line| {
                    let mut cells: Vec<&str> = line.split(',').collect();
                    let (i, j) = (a.index(cells.len()), b.index(cells.len()));
                    cells.swap(i, j);
                    cells.join(",")
                })
                .collect();
            files[f].1 = join(&rows);
        }
        Mutation::RemoveFile { file } => {
            files.remove(file.index(count));
        }
    }
}

/// Writes the files into `dir`, a fresh folder.
fn write(dir: &Path, files: &[(String, Vec<u8>)]) {
    for (name, bytes) in files {
        std::fs::write(dir.join(name), bytes).expect("a fixture file written");
    }
}

/// Reads, plans, renders and checks; what happened, for the report. Errors
/// are expected; only a panic fails the case.
fn run(dir: &Path) -> String {
    let scenario = match lotwright::input::read_scenario(dir) {
        Ok(scenario) => scenario,
        Err(e) => return format!("read: {e}"),
    };
    let options = solve::Options {
        method: None,
        milp: MilpOptions {
            time_limit: 2.0,
            ..Default::default()
        },
    };
    let planned = match solve::plan_scenario(&scenario, &options) {
        Ok(outcome) => {
            let json = lotwright::report::json::plan(&scenario, &outcome);
            format!("planned: {}", json["status"])
        }
        Err(e) => format!("plan: {e}"),
    };
    match lotwright::input::read_orders(&dir.join(ORDERS), &scenario) {
        Ok(proposal) => {
            let report = lotwright::check::check(&scenario, &proposal, &options.milp);
            format!(
                "{planned}; checked: feasible {}",
                report.evaluation.feasible
            )
        }
        Err(e) => format!("{planned}; orders: {e}"),
    }
}

fn show(files: &[(String, Vec<u8>)]) -> String {
    files
        .iter()
        .map(|(name, bytes)| format!("--- {name}\n{}", bytes.escape_ascii()))
        .collect::<Vec<_>>()
        .join("\n")
}

fn config() -> Config {
    let cases = std::env::var("LOTWRIGHT_FUZZ_CASES")
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(64);
    let mut config = Config::with_cases(cases);
    if let Some(seed) = std::env::var("LOTWRIGHT_FUZZ_SEED")
        .ok()
        .and_then(|v| v.parse().ok())
    {
        config.rng_seed = RngSeed::Fixed(seed);
    }
    // A panic is reported with its input; shrinking it further would rerun
    // the solver many times for little gain.
    config.max_shrink_iters = 64;
    config
}

fn base() -> Vec<(String, Vec<u8>)> {
    BASE.iter()
        .map(|(name, text)| (name.to_string(), text.as_bytes().to_vec()))
        .collect()
}

#[test]
fn the_unmutated_base_reads_plans_and_checks() {
    let dir = tempfile::tempdir().expect("a temporary folder");
    write(dir.path(), &base());
    let outcome = run(dir.path());
    assert!(
        outcome.starts_with("planned: \"optimal\"; checked:"),
        "{outcome}"
    );
}

proptest! {
    #![proptest_config(config())]

    #[test]
    fn mutated_scenarios_never_panic(mutations in prop::collection::vec(mutation(), 1..=3)) {
        let mut files = base();
        for mutation in &mutations {
            apply(&mut files, mutation);
        }
        let dir = tempfile::tempdir().expect("a temporary folder");
        write(dir.path(), &files);
        let result = catch_unwind(AssertUnwindSafe(|| run(dir.path())));
        if let Err(panic) = result {
            let message = panic
                .downcast_ref::<String>()
                .cloned()
                .or_else(|| panic.downcast_ref::<&str>().map(|s| s.to_string()))
                .unwrap_or_default();
            return Err(TestCaseError::fail(format!(
                "panicked ({message}) on the mutations {mutations:?} giving\n{}",
                show(&files)
            )));
        }
    }
}
