//! The bad-input catalogue: every input file of a scenario (and the plan file
//! of `check`) broken in the ways planners' files break, each run through the
//! real binary. A bad case must exit 2 with one message on stderr naming the
//! file, the line and the column where there is one, print nothing on
//! stdout, and create no output folder. A few near misses (a byte-order
//! mark, Windows line ends, a bare TOML date) must be accepted and give the
//! same plan as the clean files.
//!
//! The fixtures are built in code: a base scenario without resources (solved
//! by the single-item methods, so each run is fast) and a small one that
//! adds resources, capacity overrides and routing. Each case names its base,
//! the edits it makes to the files and the substrings the message must hold.

use std::path::PathBuf;
use std::process::{Command, Output};

use tempfile::TempDir;

const SCENARIO_TOML: &str =
    "name = \"reliability\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 6\n";
const ITEMS: &str = "item,setup_cost,holding_cost,unit_cost,initial_stock,lead_time,fixed_lot\n\
A,80,2,1,0,0,50\n\
B,40,0.5,3,25,1,\n";
const DEMAND: &str = "item,period,quantity\nA,1,18\nA,2,30\nA,3,42\nB,2,15\nB,4,30\n";
const COSTS: &str = "item,period,setup_cost,unit_cost\nA,2,90,\n";
const RECEIPTS: &str = "item,date,quantity\nB,2027-01-11,10\n";
const RESOURCES: &str = "resource,capacity,overtime_capacity,overtime_cost\nM1,100,20,1.5\n";
const CAPACITY: &str = "resource,period,capacity\nM1,2,60\n";
const ROUTING: &str = "item,resource,per_unit,setup_time\nA,M1,1,5\nB,M1,0.5,\n";
/// A plan for the base scenario, checked by `check`.
const ORDERS_CSV: &str = "item,period,quantity\nA,1,48\nA,3,42\nB,4,10\n";

/// The name a case uses for the plan file of `check`; it lives beside the
/// scenario folder, not inside it.
const ORDERS: &str = "orders.csv";

#[derive(Clone, Copy, Debug)]
enum Base {
    /// Two items, no resources: scenario.toml, items, demand, costs, receipts.
    Plain,
    /// The plain scenario plus resources.csv, capacity.csv and routing.csv.
    Shared,
}

fn base_files(base: Base) -> Vec<(&'static str, Vec<u8>)> {
    let mut files = vec![
        ("scenario.toml", SCENARIO_TOML),
        ("items.csv", ITEMS),
        ("demand.csv", DEMAND),
        ("costs.csv", COSTS),
        ("receipts.csv", RECEIPTS),
    ];
    if let Base::Shared = base {
        files.push(("resources.csv", RESOURCES));
        files.push(("capacity.csv", CAPACITY));
        files.push(("routing.csv", ROUTING));
    }
    files
        .into_iter()
        .map(|(name, text)| (name, text.as_bytes().to_vec()))
        .collect()
}

/// What a case does to one file.
enum Edit {
    /// The file is not there.
    Remove,
    /// The file holds exactly these bytes.
    Write(&'static [u8]),
    /// The first occurrence of the text is replaced (the text must occur).
    Replace(&'static str, &'static str),
    /// The file's bytes are transformed.
    Map(fn(&[u8]) -> Vec<u8>),
}

struct Case {
    name: &'static str,
    base: Base,
    /// The file the message must name.
    file: &'static str,
    edits: &'static [(&'static str, Edit)],
    /// Substrings the message must hold: the place, then what is wrong.
    expect: &'static [&'static str],
}

/// A scenario folder and an orders file written into a fresh temporary
/// folder, with the paths a run needs.
struct Fixture {
    root: TempDir,
}

impl Fixture {
    fn new(base: Base, edits: &[(&str, Edit)]) -> Fixture {
        let root = tempfile::tempdir().expect("a temporary folder");
        let scenario = root.path().join("scenario");
        std::fs::create_dir(&scenario).expect("the scenario folder");
        let mut files = base_files(base);
        files.push((ORDERS, ORDERS_CSV.as_bytes().to_vec()));
        for (name, edit) in edits {
            let at = files.iter().position(|(n, _)| n == name);
            match edit {
                Edit::Remove => {
                    let at = at.unwrap_or_else(|| panic!("{name} is not a base file"));
                    files.remove(at);
                }
                Edit::Write(bytes) => match at {
                    Some(at) => files[at].1 = bytes.to_vec(),
                    None => files.push((name, bytes.to_vec())),
                },
                Edit::Replace(from, to) => {
                    let at = at.unwrap_or_else(|| panic!("{name} is not a base file"));
                    let text = String::from_utf8(files[at].1.clone()).expect("UTF-8 base");
                    assert!(text.contains(from), "{name} holds {from:?}");
                    files[at].1 = text.replacen(from, to, 1).into_bytes();
                }
                Edit::Map(f) => {
                    let at = at.unwrap_or_else(|| panic!("{name} is not a base file"));
                    files[at].1 = f(&files[at].1);
                }
            }
        }
        for (name, bytes) in &files {
            let path = if *name == ORDERS {
                root.path().join(name)
            } else {
                scenario.join(name)
            };
            std::fs::write(path, bytes).expect("a fixture file");
        }
        Fixture { root }
    }

    fn scenario(&self) -> PathBuf {
        self.root.path().join("scenario")
    }

    fn orders(&self) -> PathBuf {
        self.root.path().join(ORDERS)
    }

    fn out(&self) -> PathBuf {
        self.root.path().join("out")
    }

    /// `plan DIR --out OUT`, or `check DIR --orders FILE` when `check`.
    fn run(&self, check: bool) -> Output {
        let mut command = Command::new(env!("CARGO_BIN_EXE_lotwright"));
        if check {
            command
                .arg("check")
                .arg(self.scenario())
                .arg("--orders")
                .arg(self.orders())
                .arg("--json");
        } else {
            command
                .arg("plan")
                .arg(self.scenario())
                .arg("--out")
                .arg(self.out());
        }
        command.output().expect("the binary runs")
    }

    /// The names in the root folder (the scenario folder, the orders file
    /// and, after a good `plan`, the output folder), sorted.
    fn root_entries(&self) -> Vec<String> {
        let mut names: Vec<String> = std::fs::read_dir(self.root.path())
            .expect("the root folder lists")
            .map(|e| {
                e.expect("an entry")
                    .file_name()
                    .to_string_lossy()
                    .into_owned()
            })
            .collect();
        names.sort();
        names
    }
}

fn text(bytes: &[u8]) -> String {
    String::from_utf8_lossy(bytes).into_owned()
}

/// Checks one bad case; returns what is wrong with the run, if anything.
fn failure(case: &Case) -> Option<String> {
    let check = case.edits.iter().any(|(name, _)| *name == ORDERS);
    let fixture = Fixture::new(case.base, case.edits);
    let before = fixture.root_entries();
    let output = fixture.run(check);
    let stderr = text(&output.stderr);
    let mut problems = Vec::new();
    if output.status.code() != Some(2) {
        problems.push(format!("exit code {:?}, not 2", output.status.code()));
    }
    if !output.stdout.is_empty() {
        problems.push(format!("stdout is not empty: {}", text(&output.stdout)));
    }
    if !stderr.starts_with("lotwright: ") || stderr.trim_end().lines().count() != 1 {
        problems.push("stderr is not one `lotwright: ` line".to_string());
    }
    if stderr.contains("panicked") {
        problems.push("the binary panicked".to_string());
    }
    if !stderr.contains(case.file) {
        problems.push(format!("the message does not name {}", case.file));
    }
    for wanted in case.expect {
        if !stderr.contains(wanted) {
            problems.push(format!("the message lacks {wanted:?}"));
        }
    }
    if fixture.out().exists() {
        problems.push("the output folder was created".to_string());
    }
    let entries = fixture.root_entries();
    if entries != before {
        problems.push(format!("the root folder holds {entries:?}, not {before:?}"));
    }
    if problems.is_empty() {
        None
    } else {
        Some(format!(
            "{} ({:?}): {}\n    stderr: {}",
            case.name,
            case.base,
            problems.join("; "),
            stderr.trim_end()
        ))
    }
}

fn bom_crlf(bytes: &[u8]) -> Vec<u8> {
    let text = std::str::from_utf8(bytes).expect("UTF-8 base");
    let mut out = b"\xEF\xBB\xBF".to_vec();
    out.extend(text.replace('\n', "\r\n").into_bytes());
    out
}

fn semicolons(bytes: &[u8]) -> Vec<u8> {
    bytes
        .iter()
        .map(|&b| if b == b',' { b';' } else { b })
        .collect()
}

fn header_only(bytes: &[u8]) -> Vec<u8> {
    let end = bytes.iter().position(|&b| b == b'\n').map_or(0, |i| i + 1);
    bytes[..end].to_vec()
}

use Base::{Plain, Shared};
use Edit::{Map, Remove, Replace, Write};

const CASES: &[Case] = &[
    // ---- scenario.toml ----
    Case {
        name: "scenario.toml is missing",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Remove)],
        expect: &["the file is missing", "start, bucket and periods"],
    },
    Case {
        name: "scenario.toml has a syntax error",
        base: Plain,
        file: "scenario.toml",
        edits: &[(
            "scenario.toml",
            Write(b"name = \"open\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 6\n"),
        )],
        expect: &["scenario.toml, line 1, column "],
    },
    Case {
        name: "scenario.toml names an unknown bucket",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("\"week\"", "\"fortnight\""))],
        expect: &[
            "scenario.toml, line 3, column 10 (bucket)",
            "fortnight",
            "\"day\", \"week\" or \"month\"",
        ],
    },
    Case {
        name: "scenario.toml bucket is capitalised",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("\"week\"", "\"Week\""))],
        expect: &["line 3, column 10 (bucket)", "\"Week\" is not known"],
    },
    Case {
        name: "scenario.toml lacks start",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("start = \"2027-01-04\"\n", ""))],
        expect: &["the key start is missing", "start = \"2027-01-04\""],
    },
    Case {
        name: "scenario.toml lacks periods",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("periods = 6\n", ""))],
        expect: &["the key periods is missing"],
    },
    Case {
        name: "scenario.toml is empty",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Write(b""))],
        expect: &["the key start is missing"],
    },
    Case {
        name: "scenario.toml months that do not start on the 1st",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("\"week\"", "\"month\""))],
        expect: &[
            "scenario.toml, line 2, column 9 (start)",
            "1st of a month",
            "2027-01-04",
        ],
    },
    Case {
        name: "scenario.toml start is a date that does not exist",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("2027-01-04", "2027-02-30"))],
        expect: &[
            "scenario.toml, line 2, column 9 (start)",
            "\"2027-02-30\" is not a valid date",
            "YYYY-MM-DD",
        ],
    },
    Case {
        name: "scenario.toml start is written day first",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("2027-01-04", "04.01.2027"))],
        expect: &["line 2, column 9 (start)", "not a valid date"],
    },
    Case {
        name: "scenario.toml start carries a time",
        base: Plain,
        file: "scenario.toml",
        edits: &[(
            "scenario.toml",
            Replace("\"2027-01-04\"", "2027-01-04T08:00:00"),
        )],
        expect: &["line 2, column 9 (start)", "carries a time"],
    },
    Case {
        name: "scenario.toml periods is fractional",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("periods = 6", "periods = 6.5"))],
        expect: &[
            "scenario.toml, line 4, column 11 (periods)",
            "6.5 must be a whole number",
        ],
    },
    Case {
        name: "scenario.toml periods is quoted",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("periods = 6", "periods = \"6\""))],
        expect: &["line 4, column 11 (periods)", "without quotes"],
    },
    Case {
        name: "scenario.toml periods is zero",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("periods = 6", "periods = 0"))],
        expect: &["line 4, column 11 (periods)", "from 1 to 100000"],
    },
    Case {
        name: "scenario.toml periods is negative",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("periods = 6", "periods = -3"))],
        expect: &["line 4, column 11 (periods)", "-3 must be a whole number"],
    },
    Case {
        name: "scenario.toml periods is too large",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("periods = 6", "periods = 100001"))],
        expect: &["line 4, column 11 (periods)", "from 1 to 100000"],
    },
    Case {
        name: "scenario.toml horizon runs past the year 9999",
        base: Plain,
        file: "scenario.toml",
        edits: &[("scenario.toml", Replace("2027-01-04", "9999-12-27"))],
        expect: &["line 4, column 11 (periods)", "past the year 9999"],
    },
    Case {
        name: "scenario.toml has an unknown key",
        base: Plain,
        file: "scenario.toml",
        edits: &[(
            "scenario.toml",
            Replace("periods = 6\n", "periods = 6\nweeks = 6\n"),
        )],
        expect: &["scenario.toml, line 5, column 1", "unknown field `weeks`"],
    },
    Case {
        name: "scenario.toml is not UTF-8",
        base: Plain,
        file: "scenario.toml",
        edits: &[(
            "scenario.toml",
            Write(b"name = \"caf\xe9\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 6\n"),
        )],
        expect: &["scenario.toml, line 1, column 12", "not valid UTF-8"],
    },
    // ---- items.csv ----
    Case {
        name: "items.csv is missing",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Remove)],
        expect: &["the file is missing", "needs items.csv"],
    },
    Case {
        name: "items.csv is empty",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Write(b""))],
        expect: &["the file is empty", "item, setup_cost"],
    },
    Case {
        name: "items.csv has only its header",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Map(header_only))],
        expect: &["has a header but no items"],
    },
    Case {
        name: "items.csv misspells a column",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("setup_cost", "setup_cots"))],
        expect: &[
            "items.csv, line 1, column 2 (setup_cots)",
            "did you mean setup_cost?",
        ],
    },
    Case {
        name: "items.csv capitalises a column",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("holding_cost", "Holding_Cost"))],
        expect: &["line 1, column 3 (Holding_Cost)", "write holding_cost"],
    },
    Case {
        name: "items.csv has a column nobody knows",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost,colour\nA,80,2,red\n"),
        )],
        expect: &["line 1, column 4 (colour)", "unknown column", "x_"],
    },
    Case {
        name: "items.csv lacks the setup_cost column",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Write(b"item,holding_cost\nA,2\nB,0.5\n"))],
        expect: &["items.csv, line 1", "required column setup_cost is missing"],
    },
    Case {
        name: "items.csv lacks any holding column",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Write(b"item,setup_cost\nA,80\nB,40\n"))],
        expect: &["items.csv, line 1", "holding_cost", "holding_rate"],
    },
    Case {
        name: "items.csv gives one item twice",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("B,40", "A,40"))],
        expect: &["items.csv, line 3, column 1 (item)", "item A appears twice"],
    },
    Case {
        name: "items.csv gives a column twice",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost,setup_cost\nA,80,2,80\n"),
        )],
        expect: &["line 1, column 4 (setup_cost)", "appears twice"],
    },
    Case {
        name: "items.csv has a short row",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("B,40,0.5,3,25,1,", "B,40,0.5"))],
        expect: &["items.csv, line 3", "3 cells", "7 columns", "too few"],
    },
    Case {
        name: "items.csv has a long row",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("A,80,2,1,0,0,50", "A,80,2,1,0,0,50,9"))],
        expect: &["items.csv, line 2", "8 cells", "too many"],
    },
    Case {
        name: "items.csv has an unclosed quote",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("A,80", "\"A,80"))],
        expect: &["items.csv, line 2", "too few"],
    },
    Case {
        name: "items.csv has an empty id",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("B,40", ",40"))],
        expect: &["line 3, column 1 (item)", "the item cell is empty"],
    },
    Case {
        name: "items.csv has an empty required setup_cost",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("B,40", "B,"))],
        expect: &["line 3, column 2 (setup_cost)", "empty"],
    },
    Case {
        name: "items.csv has a negative setup cost",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("A,80", "A,-80"))],
        expect: &["line 2, column 2 (setup_cost)", "-80 must not be negative"],
    },
    Case {
        name: "items.csv has NaN",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("A,80,2", "A,80,NaN"))],
        expect: &[
            "line 2, column 3 (holding_cost)",
            "NaN is not a finite number",
        ],
    },
    Case {
        name: "items.csv has an infinite number",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("B,40", "B,inf"))],
        expect: &[
            "line 3, column 2 (setup_cost)",
            "inf is not a finite number",
        ],
    },
    Case {
        name: "items.csv has a number too large",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("A,80", "A,1e300"))],
        expect: &["line 2, column 2 (setup_cost)", "too large"],
    },
    Case {
        name: "items.csv carries a unit",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("3,25,1", "3,12 pcs,1"))],
        expect: &[
            "line 3, column 5 (initial_stock)",
            "12 pcs is not a number",
            "without a unit (pcs)",
        ],
    },
    Case {
        name: "items.csv carries a currency sign",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("A,80", "A,$80"))],
        expect: &["line 2, column 2 (setup_cost)", "$80 is not a number"],
    },
    Case {
        name: "items.csv uses a thousands separator",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("A,80", "A,\"1,080\""))],
        expect: &["line 2, column 2 (setup_cost)", "thousands separators"],
    },
    Case {
        name: "items.csv uses a decimal comma",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("B,40,0.5", "B,40,\"0,5\""))],
        expect: &["line 3, column 3 (holding_cost)", "decimal commas"],
    },
    Case {
        name: "items.csv has a fractional lead time",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("3,25,1,", "3,25,1.5,"))],
        expect: &["line 3, column 6 (lead_time)", "1.5 must be a whole number"],
    },
    Case {
        name: "items.csv has a negative lead time",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("3,25,1,", "3,25,-1,"))],
        expect: &["line 3, column 6 (lead_time)", "whole number of 0 or more"],
    },
    Case {
        name: "items.csv gives both holding cost and rate",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost,holding_rate,unit_cost\nA,80,2,0.25,4\n"),
        )],
        expect: &[
            "line 2, column 4 (holding_rate)",
            "both holding_cost and holding_rate",
        ],
    },
    Case {
        name: "items.csv gives an item no holding cost",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost,holding_rate\nA,80,2,\nB,40,,\n"),
        )],
        expect: &["items.csv, line 3", "item B has neither"],
    },
    Case {
        name: "items.csv max_lot below min_lot",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost,min_lot,max_lot\nA,80,2,50,10\n"),
        )],
        expect: &["line 2, column 5 (max_lot)", "below min_lot"],
    },
    Case {
        name: "items.csv negative lot_multiple",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost,lot_multiple\nA,80,2,-5\nB,40,1,\n"),
        )],
        expect: &[
            "line 2, column 4 (lot_multiple)",
            "must not be negative",
            "0 for a continuous item",
        ],
    },
    Case {
        name: "items.csv fractional lot_multiple on a whole item",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost,lot_multiple\nA,80,2,\nB,40,1,2.5\n"),
        )],
        expect: &[
            "line 3, column 4 (lot_multiple)",
            "2.5 is not a whole number",
            "0 for a continuous item",
        ],
    },
    Case {
        name: "items.csv with no lot meeting min, multiple and max",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost,min_lot,lot_multiple,max_lot\nA,80,2,30,20,35\n"),
        )],
        expect: &["items.csv, line 2", "smallest allowed multiple is 40"],
    },
    Case {
        name: "items.csv holds a byte that is not UTF-8",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item,setup_cost,holding_cost\nA,80,2\nP\xe2te,40,1\n"),
        )],
        expect: &["items.csv, line 3, column 2", "not valid UTF-8"],
    },
    Case {
        name: "items.csv is semicolon-delimited",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Map(semicolons))],
        expect: &["items.csv, line 1", "semicolon-delimited", "commas"],
    },
    Case {
        name: "items.csv is tab-delimited",
        base: Plain,
        file: "items.csv",
        edits: &[(
            "items.csv",
            Write(b"item\tsetup_cost\tholding_cost\nA\t80\t2\n"),
        )],
        expect: &["items.csv, line 1", "tab-delimited"],
    },
    Case {
        name: "items.csv holds a control character",
        base: Plain,
        file: "items.csv",
        edits: &[("items.csv", Replace("A,80,2,", "A,80,2\u{0},"))],
        expect: &[
            "line 2, column 3 (holding_cost)",
            "control character (U+0000)",
        ],
    },
    // ---- demand.csv ----
    Case {
        name: "demand.csv is missing",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Remove)],
        expect: &["the file is missing", "needs demand.csv"],
    },
    Case {
        name: "demand.csv is empty",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Write(b""))],
        expect: &["the file is empty", "item, quantity"],
    },
    Case {
        name: "demand.csv misspells period",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("period", "perod"))],
        expect: &[
            "demand.csv, line 1, column 2 (perod)",
            "did you mean period?",
        ],
    },
    Case {
        name: "demand.csv misspells quantity",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("quantity", "quantiy"))],
        expect: &["line 1, column 3 (quantiy)", "did you mean quantity?"],
    },
    Case {
        name: "demand.csv has neither period nor date column",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Write(b"item,quantity\nA,5\n"))],
        expect: &["demand.csv, line 1", "period column or a date column"],
    },
    Case {
        name: "demand.csv names an unknown item",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("B,4,30", "C,4,30"))],
        expect: &["demand.csv, line 6, column 1 (item)", "unknown item C"],
    },
    Case {
        name: "demand.csv matches ids exactly",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("B,2,15", "b,2,15"))],
        expect: &["line 5, column 1 (item)", "unknown item b"],
    },
    Case {
        name: "demand.csv period 0",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,1,18", "A,0,18"))],
        expect: &[
            "demand.csv, line 2, column 2 (period)",
            "period 0 is outside the horizon",
            "1 to 6",
        ],
    },
    Case {
        name: "demand.csv period after the horizon",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("B,4,30", "B,7,30"))],
        expect: &["line 6, column 2 (period)", "period 7 is outside"],
    },
    Case {
        name: "demand.csv fractional period",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,2,30", "A,2.5,30"))],
        expect: &["line 3, column 2 (period)", "2.5 must be a whole number"],
    },
    Case {
        name: "demand.csv period far too large",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,2,30", "A,1e20,30"))],
        expect: &["line 3, column 2 (period)", "too large"],
    },
    Case {
        name: "demand.csv a date in the period column",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,2,30", "A,2027-01-11,30"))],
        expect: &["line 3, column 2 (period)", "is a date, not a number"],
    },
    Case {
        name: "demand.csv a date that does not exist",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Write(b"item,date,quantity\nA,2027-02-30,5\n"))],
        expect: &[
            "demand.csv, line 2, column 2 (date)",
            "2027-02-30 is not a valid date",
        ],
    },
    Case {
        name: "demand.csv a date before the horizon",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Write(b"item,date,quantity\nA,2027-01-03,5\n"))],
        expect: &[
            "line 2, column 2 (date)",
            "before the horizon starts on 2027-01-04",
        ],
    },
    Case {
        name: "demand.csv a date after the horizon",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Write(b"item,date,quantity\nA,2027-02-15,5\n"))],
        expect: &[
            "line 2, column 2 (date)",
            "after the horizon",
            "ends on 2027-02-14",
        ],
    },
    Case {
        name: "demand.csv a date written day first",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Write(b"item,date,quantity\nA,11/01/2027,5\n"))],
        expect: &["line 2, column 2 (date)", "YYYY-MM-DD"],
    },
    Case {
        name: "demand.csv both period and date",
        base: Plain,
        file: "demand.csv",
        edits: &[(
            "demand.csv",
            Write(b"item,period,date,quantity\nA,1,,5\nA,2,2027-01-11,5\n"),
        )],
        expect: &["line 3, column 3 (date)", "both a period and a date"],
    },
    Case {
        name: "demand.csv neither period nor date",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Write(b"item,period,date,quantity\nA,,,5\n"))],
        expect: &["demand.csv, line 2", "neither a period nor a date"],
    },
    Case {
        name: "demand.csv empty quantity",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,3,42", "A,3,"))],
        expect: &["line 4, column 3 (quantity)", "the quantity cell is empty"],
    },
    Case {
        name: "demand.csv negative quantity",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,3,42", "A,3,-42"))],
        expect: &["line 4, column 3 (quantity)", "-42 must not be negative"],
    },
    Case {
        name: "demand.csv quantity with a unit",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,3,42", "A,3,42 kg"))],
        expect: &["line 4, column 3 (quantity)", "without a unit (kg)"],
    },
    Case {
        name: "demand.csv NaN quantity",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,3,42", "A,3,nan"))],
        expect: &["line 4, column 3 (quantity)", "not a finite number"],
    },
    Case {
        name: "demand.csv infinite quantity",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,3,42", "A,3,-infinity"))],
        expect: &["line 4, column 3 (quantity)", "not a finite number"],
    },
    Case {
        name: "demand.csv long row",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Replace("A,3,42", "A,3,42,7"))],
        expect: &["demand.csv, line 4", "too many"],
    },
    Case {
        name: "demand.csv semicolon-delimited",
        base: Plain,
        file: "demand.csv",
        edits: &[("demand.csv", Map(semicolons))],
        expect: &["demand.csv, line 1", "semicolon-delimited"],
    },
    Case {
        name: "demand.csv not UTF-8",
        base: Plain,
        file: "demand.csv",
        edits: &[(
            "demand.csv",
            Write(b"item,period,quantity\nA,1,18\nA,2,3\xa00\n"),
        )],
        expect: &["demand.csv, line 3, column 6", "not valid UTF-8"],
    },
    // ---- costs.csv ----
    Case {
        name: "costs.csv unknown item",
        base: Plain,
        file: "costs.csv",
        edits: &[("costs.csv", Replace("A,2", "Z,2"))],
        expect: &["costs.csv, line 2, column 1 (item)", "unknown item Z"],
    },
    Case {
        name: "costs.csv negative setup cost",
        base: Plain,
        file: "costs.csv",
        edits: &[("costs.csv", Replace("90", "-90"))],
        expect: &["line 2, column 3 (setup_cost)", "must not be negative"],
    },
    Case {
        name: "costs.csv period outside the horizon",
        base: Plain,
        file: "costs.csv",
        edits: &[("costs.csv", Replace("A,2", "A,9"))],
        expect: &["line 2, column 2 (period)", "period 9 is outside"],
    },
    Case {
        name: "costs.csv misspelt column",
        base: Plain,
        file: "costs.csv",
        edits: &[("costs.csv", Replace("unit_cost", "unitcost"))],
        expect: &["line 1, column 4 (unitcost)", "did you mean unit_cost?"],
    },
    Case {
        name: "costs.csv without a bucket column",
        base: Plain,
        file: "costs.csv",
        edits: &[("costs.csv", Write(b"item,setup_cost\nA,90\n"))],
        expect: &["costs.csv, line 1", "period column or a date column"],
    },
    Case {
        name: "costs.csv gives one bucket twice",
        base: Plain,
        file: "costs.csv",
        edits: &[(
            "costs.csv",
            Write(b"item,date,setup_cost\nA,2027-01-11,90\nA,2027-01-13,95\n"),
        )],
        expect: &[
            "costs.csv, line 3",
            "already has a row for period 2 on line 2",
        ],
    },
    Case {
        name: "costs.csv a date that does not exist",
        base: Plain,
        file: "costs.csv",
        edits: &[(
            "costs.csv",
            Write(b"item,date,setup_cost\nA,2027-02-29,90\n"),
        )],
        expect: &["line 2, column 2 (date)", "2027-02-29 is not a valid date"],
    },
    Case {
        name: "costs.csv a unit cost with a currency",
        base: Plain,
        file: "costs.csv",
        edits: &[("costs.csv", Replace("90,", "90,4 EUR"))],
        expect: &["line 2, column 4 (unit_cost)", "without a unit (EUR)"],
    },
    // ---- receipts.csv ----
    Case {
        name: "receipts.csv unknown item",
        base: Plain,
        file: "receipts.csv",
        edits: &[("receipts.csv", Replace("B,", "X,"))],
        expect: &["receipts.csv, line 2, column 1 (item)", "unknown item X"],
    },
    Case {
        name: "receipts.csv negative quantity",
        base: Plain,
        file: "receipts.csv",
        edits: &[("receipts.csv", Replace(",10", ",-10"))],
        expect: &["line 2, column 3 (quantity)", "must not be negative"],
    },
    Case {
        name: "receipts.csv fractional period",
        base: Plain,
        file: "receipts.csv",
        edits: &[("receipts.csv", Write(b"item,period,quantity\nB,2.5,10\n"))],
        expect: &["line 2, column 2 (period)", "2.5 must be a whole number"],
    },
    Case {
        name: "receipts.csv a date after the horizon",
        base: Plain,
        file: "receipts.csv",
        edits: &[("receipts.csv", Replace("2027-01-11", "2027-03-01"))],
        expect: &["line 2, column 2 (date)", "after the horizon"],
    },
    Case {
        name: "receipts.csv short row",
        base: Plain,
        file: "receipts.csv",
        edits: &[("receipts.csv", Replace("B,2027-01-11,10", "B,2027-01-11"))],
        expect: &["receipts.csv, line 2", "too few"],
    },
    Case {
        name: "receipts.csv semicolon-delimited",
        base: Plain,
        file: "receipts.csv",
        edits: &[("receipts.csv", Map(semicolons))],
        expect: &["receipts.csv, line 1", "semicolon-delimited"],
    },
    // ---- resources.csv ----
    Case {
        name: "resources.csv gives one resource twice",
        base: Shared,
        file: "resources.csv",
        edits: &[(
            "resources.csv",
            Write(b"resource,capacity\nM1,100\nM1,90\n"),
        )],
        expect: &[
            "resources.csv, line 3, column 1 (resource)",
            "resource M1 appears twice",
        ],
    },
    Case {
        name: "resources.csv misspelt column",
        base: Shared,
        file: "resources.csv",
        edits: &[("resources.csv", Replace("overtime_cost", "overtime_costs"))],
        expect: &[
            "line 1, column 4 (overtime_costs)",
            "did you mean overtime_cost?",
        ],
    },
    Case {
        name: "resources.csv lacks capacity",
        base: Shared,
        file: "resources.csv",
        edits: &[("resources.csv", Write(b"resource\nM1\n"))],
        expect: &[
            "resources.csv, line 1",
            "required column capacity is missing",
        ],
    },
    Case {
        name: "resources.csv overtime without a cost",
        base: Shared,
        file: "resources.csv",
        edits: &[("resources.csv", Replace(",1.5", ","))],
        expect: &["resources.csv, line 2", "no overtime_cost"],
    },
    Case {
        name: "resources.csv negative capacity",
        base: Shared,
        file: "resources.csv",
        edits: &[("resources.csv", Replace("M1,100", "M1,-100"))],
        expect: &["line 2, column 2 (capacity)", "must not be negative"],
    },
    Case {
        name: "resources.csv infinite capacity",
        base: Shared,
        file: "resources.csv",
        edits: &[("resources.csv", Replace("M1,100", "M1,inf"))],
        expect: &["line 2, column 2 (capacity)", "not a finite number"],
    },
    Case {
        name: "resources.csv is empty",
        base: Shared,
        file: "resources.csv",
        edits: &[("resources.csv", Write(b""))],
        expect: &["the file is empty", "resource, capacity"],
    },
    Case {
        name: "resources.csv header only while capacity.csv names M1",
        base: Shared,
        file: "capacity.csv",
        edits: &[("resources.csv", Map(header_only))],
        expect: &[
            "capacity.csv, line 2, column 1 (resource)",
            "unknown resource M1",
        ],
    },
    // ---- capacity.csv ----
    Case {
        name: "capacity.csv unknown resource",
        base: Shared,
        file: "capacity.csv",
        edits: &[("capacity.csv", Replace("M1,2", "M2,2"))],
        expect: &[
            "capacity.csv, line 2, column 1 (resource)",
            "unknown resource M2",
        ],
    },
    Case {
        name: "capacity.csv period outside the horizon",
        base: Shared,
        file: "capacity.csv",
        edits: &[("capacity.csv", Replace("M1,2", "M1,7"))],
        expect: &["line 2, column 2 (period)", "period 7 is outside"],
    },
    Case {
        name: "capacity.csv a date that does not exist",
        base: Shared,
        file: "capacity.csv",
        edits: &[(
            "capacity.csv",
            Write(b"resource,date,capacity\nM1,2027-01-32,60\n"),
        )],
        expect: &["line 2, column 2 (date)", "2027-01-32 is not a valid date"],
    },
    Case {
        name: "capacity.csv capacity with a unit",
        base: Shared,
        file: "capacity.csv",
        edits: &[("capacity.csv", Replace(",60", ",60 h"))],
        expect: &["line 2, column 3 (capacity)", "without a unit (h)"],
    },
    Case {
        name: "capacity.csv gives one bucket twice",
        base: Shared,
        file: "capacity.csv",
        edits: &[(
            "capacity.csv",
            Write(b"resource,period,capacity\nM1,2,60\nM1,2,50\n"),
        )],
        expect: &[
            "capacity.csv, line 3",
            "resource M1 already has a row for period 2",
        ],
    },
    Case {
        name: "capacity.csv without a bucket column",
        base: Shared,
        file: "capacity.csv",
        edits: &[("capacity.csv", Write(b"resource,capacity\nM1,60\n"))],
        expect: &["capacity.csv, line 1", "period column or a date column"],
    },
    // ---- routing.csv ----
    Case {
        name: "routing.csv unknown item",
        base: Shared,
        file: "routing.csv",
        edits: &[("routing.csv", Replace("B,M1", "Q,M1"))],
        expect: &["routing.csv, line 3, column 1 (item)", "unknown item Q"],
    },
    Case {
        name: "routing.csv unknown resource",
        base: Shared,
        file: "routing.csv",
        edits: &[("routing.csv", Replace("A,M1", "A,M7"))],
        expect: &[
            "routing.csv, line 2, column 2 (resource)",
            "unknown resource M7",
        ],
    },
    Case {
        name: "routing.csv gives a pair twice",
        base: Shared,
        file: "routing.csv",
        edits: &[("routing.csv", Replace("B,M1", "A,M1"))],
        expect: &["routing.csv, line 3", "appears twice"],
    },
    Case {
        name: "routing.csv negative run time",
        base: Shared,
        file: "routing.csv",
        edits: &[("routing.csv", Replace("A,M1,1,5", "A,M1,-1,5"))],
        expect: &["line 2, column 3 (per_unit)", "must not be negative"],
    },
    Case {
        name: "routing.csv lacks per_unit",
        base: Shared,
        file: "routing.csv",
        edits: &[("routing.csv", Write(b"item,resource\nA,M1\n"))],
        expect: &["routing.csv, line 1", "required column per_unit is missing"],
    },
    Case {
        name: "routing.csv without resources.csv",
        base: Shared,
        file: "routing.csv",
        edits: &[("resources.csv", Remove), ("capacity.csv", Remove)],
        expect: &["routing.csv, line 2, column 2 (resource)", "resources.csv"],
    },
    Case {
        name: "routing.csv capitalised column",
        base: Shared,
        file: "routing.csv",
        edits: &[("routing.csv", Replace("setup_time", "Setup_Time"))],
        expect: &["line 1, column 4 (Setup_Time)", "write setup_time"],
    },
    // ---- the orders file of `check` ----
    Case {
        name: "orders file is missing",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Remove)],
        expect: &["the orders file is missing", "--orders"],
    },
    Case {
        name: "orders file is empty",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Write(b""))],
        expect: &["the file is empty"],
    },
    Case {
        name: "orders file unknown item",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Replace("B,4", "Z,4"))],
        expect: &["orders.csv, line 4, column 1 (item)", "unknown item Z"],
    },
    Case {
        name: "orders file period outside the horizon",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Replace("A,3", "A,8"))],
        expect: &[
            "orders.csv, line 3, column 2 (period)",
            "period 8 is outside",
        ],
    },
    Case {
        name: "orders file fractional period",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Replace("A,3", "A,3.5"))],
        expect: &["line 3, column 2 (period)", "must be a whole number"],
    },
    Case {
        name: "orders file negative quantity",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Replace("A,1,48", "A,1,-48"))],
        expect: &["line 2, column 3 (quantity)", "must not be negative"],
    },
    Case {
        name: "orders file quantity with a unit",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Replace("A,1,48", "A,1,48pcs"))],
        expect: &["line 2, column 3 (quantity)", "without a unit (pcs)"],
    },
    Case {
        name: "orders file a date that does not exist",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Write(b"item,date,quantity\nA,2027-02-29,48\n"))],
        expect: &["line 2, column 2 (date)", "not a valid date"],
    },
    Case {
        name: "orders file a date before the horizon",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Write(b"item,date,quantity\nA,2026-12-28,48\n"))],
        expect: &["line 2, column 2 (date)", "before the horizon"],
    },
    Case {
        name: "orders file period and date disagree",
        base: Plain,
        file: "orders.csv",
        edits: &[(
            ORDERS,
            Write(b"item,period,date,quantity\nA,1,2027-01-11,48\n"),
        )],
        expect: &[
            "line 2, column 3 (date)",
            "falls in period 2",
            "says period 1",
        ],
    },
    Case {
        name: "orders file release disagrees with the lead time",
        base: Plain,
        file: "orders.csv",
        edits: &[(
            ORDERS,
            Write(b"item,period,quantity,release_period\nA,1,48,1\nB,4,10,4\n"),
        )],
        expect: &["orders.csv, line 3", "lead time", "released in period 3"],
    },
    Case {
        name: "bom.csv unknown component",
        base: Plain,
        file: "bom.csv",
        edits: &[(
            "bom.csv",
            Write(b"parent,component,quantity_per\nA,B,2\nA,RIVET,4\n"),
        )],
        expect: &[
            "bom.csv, line 3, column 2 (component)",
            "unknown item RIVET",
        ],
    },
    Case {
        name: "bom.csv item in itself",
        base: Plain,
        file: "bom.csv",
        edits: &[("bom.csv", Write(b"parent,component,quantity_per\nA,A,1\n"))],
        expect: &[
            "bom.csv, line 2, column 2 (component)",
            "component of itself",
        ],
    },
    Case {
        name: "bom.csv component listed twice",
        base: Plain,
        file: "bom.csv",
        edits: &[(
            "bom.csv",
            Write(b"parent,component,quantity_per\nA,B,2\nA,B,1\n"),
        )],
        expect: &["bom.csv, line 3", "already lists B", "line 2"],
    },
    Case {
        name: "bom.csv quantity per zero",
        base: Plain,
        file: "bom.csv",
        edits: &[("bom.csv", Write(b"parent,component,quantity_per\nA,B,0\n"))],
        expect: &["bom.csv, line 2, column 3 (quantity_per)", "more than zero"],
    },
    Case {
        name: "bom.csv scrap rate of one or more",
        base: Plain,
        file: "bom.csv",
        edits: &[(
            "bom.csv",
            Write(b"parent,component,quantity_per,scrap_rate\nA,B,1,1.5\n"),
        )],
        expect: &["bom.csv, line 2, column 4 (scrap_rate)", "not a scrap rate"],
    },
    Case {
        name: "bom.csv cycle",
        base: Plain,
        file: "bom.csv",
        edits: &[(
            "bom.csv",
            Write(b"parent,component,quantity_per\nA,B,1\nB,A,2\n"),
        )],
        expect: &["bom.csv, line 3", "cycle", "A -> B -> A"],
    },
    Case {
        name: "orders-firm.csv order released before the horizon",
        base: Plain,
        file: "orders-firm.csv",
        edits: &[(
            "orders-firm.csv",
            Write(b"item,period,quantity\nA,2,10\nB,1,10\n"),
        )],
        expect: &[
            "orders-firm.csv, line 3, column 2 (period)",
            "released before the horizon starts",
            "receipts.csv",
        ],
    },
    Case {
        name: "orders-firm.csv zero quantity",
        base: Plain,
        file: "orders-firm.csv",
        edits: &[("orders-firm.csv", Write(b"item,period,quantity\nA,2,0\n"))],
        expect: &["orders-firm.csv, line 2, column 3 (quantity)", "above 0"],
    },
    Case {
        name: "orders-firm.csv fractional quantity of a whole item",
        base: Plain,
        file: "orders-firm.csv",
        edits: &[(
            "orders-firm.csv",
            Write(b"item,period,quantity\nA,2,12.5\n"),
        )],
        expect: &[
            "orders-firm.csv, line 2, column 3 (quantity)",
            "12.5 is not a whole number",
        ],
    },
    Case {
        name: "orders-firm.csv two orders of one item in one bucket",
        base: Plain,
        file: "orders-firm.csv",
        edits: &[(
            "orders-firm.csv",
            Write(b"item,date,quantity\nA,2027-01-11,10\nA,2027-01-11,5\n"),
        )],
        expect: &[
            "orders-firm.csv, line 3",
            "already has a firm order received in period 2 (line 2)",
        ],
    },
    Case {
        name: "orders-firm.csv unknown item",
        base: Plain,
        file: "orders-firm.csv",
        edits: &[("orders-firm.csv", Write(b"item,period,quantity\nZ,2,5\n"))],
        expect: &["orders-firm.csv, line 2, column 1 (item)", "unknown item Z"],
    },
    Case {
        name: "orders-firm.csv unknown kind",
        base: Plain,
        file: "orders-firm.csv",
        edits: &[(
            "orders-firm.csv",
            Write(b"item,period,quantity,kind\nA,2,5,fixed\n"),
        )],
        expect: &[
            "orders-firm.csv, line 2, column 4 (kind)",
            "planned or firm",
        ],
    },
    Case {
        name: "scenario.toml freezes the whole horizon",
        base: Plain,
        file: "scenario.toml",
        edits: &[(
            "scenario.toml",
            Replace("periods = 6\n", "periods = 6\nfrozen_periods = 6\n"),
        )],
        expect: &["scenario.toml, line 5", "(frozen_periods)", "from 0 to 5"],
    },
    Case {
        name: "scenario.toml frozen_periods in quotes",
        base: Plain,
        file: "scenario.toml",
        edits: &[(
            "scenario.toml",
            Replace("periods = 6\n", "periods = 6\nfrozen_periods = \"2\"\n"),
        )],
        expect: &[
            "scenario.toml, line 5",
            "(frozen_periods)",
            "without quotes",
        ],
    },
    Case {
        name: "orders file misspelt column",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Replace("quantity", "quantiy"))],
        expect: &["line 1, column 3 (quantiy)", "did you mean quantity?"],
    },
    Case {
        name: "orders file without a bucket column",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Write(b"item,quantity\nA,48\n"))],
        expect: &["orders.csv, line 1", "period column or a date column"],
    },
    Case {
        name: "orders file semicolon-delimited",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Map(semicolons))],
        expect: &["orders.csv, line 1", "semicolon-delimited"],
    },
    Case {
        name: "orders file not UTF-8",
        base: Plain,
        file: "orders.csv",
        edits: &[(ORDERS, Write(b"item,period,quantity\n\xc3(,1,48\n"))],
        expect: &["orders.csv, line 2, column 1", "not valid UTF-8"],
    },
];

#[test]
fn every_bad_case_exits_2_naming_the_place_and_writes_nothing() {
    let failures: Vec<String> = CASES.iter().filter_map(failure).collect();
    assert!(
        failures.is_empty(),
        "{} of {} bad cases failed:\n{}",
        failures.len(),
        CASES.len(),
        failures.join("\n")
    );
}

#[test]
fn the_catalogue_covers_every_input_file() {
    let files = [
        "scenario.toml",
        "items.csv",
        "demand.csv",
        "costs.csv",
        "receipts.csv",
        "resources.csv",
        "capacity.csv",
        "routing.csv",
        "orders-firm.csv",
        ORDERS,
    ];
    for file in files {
        let count = CASES.iter().filter(|c| c.file == file).count();
        assert!(count >= 3, "{file} has only {count} cases");
    }
    assert!(CASES.len() >= 40, "{} cases", CASES.len());
    let mut names: Vec<&str> = CASES.iter().map(|c| c.name).collect();
    names.sort_unstable();
    names.dedup();
    assert_eq!(names.len(), CASES.len(), "case names are unique");
}

/// A clean run of a base: plan.csv's bytes (or the JSON of `check`).
fn clean_result(base: Base, edits: &[(&str, Edit)], check: bool) -> Vec<u8> {
    let fixture = Fixture::new(base, edits);
    let output = fixture.run(check);
    assert_eq!(
        output.status.code(),
        Some(0),
        "stderr: {}",
        text(&output.stderr)
    );
    assert!(output.stderr.is_empty(), "stderr: {}", text(&output.stderr));
    if check {
        // The JSON of `check` names no path, so it compares across folders.
        output.stdout
    } else {
        std::fs::read(fixture.out().join("plan.csv")).expect("plan.csv written")
    }
}

fn every_file(edit: fn(&[u8]) -> Vec<u8>) -> Vec<(&'static str, Edit)> {
    [
        "scenario.toml",
        "items.csv",
        "demand.csv",
        "costs.csv",
        "receipts.csv",
        "resources.csv",
        "capacity.csv",
        "routing.csv",
        ORDERS,
    ]
    .into_iter()
    .map(|name| (name, Map(edit)))
    .collect()
}

#[test]
fn a_byte_order_mark_and_windows_line_ends_are_accepted_in_every_file() {
    for base in [Plain, Shared] {
        let clean = clean_result(base, &[], false);
        let mut edits = every_file(bom_crlf);
        if let Plain = base {
            edits.retain(|(name, _)| {
                !["resources.csv", "capacity.csv", "routing.csv"].contains(name)
            });
        }
        assert_eq!(
            text(&clean_result(base, &edits, false)),
            text(&clean),
            "{base:?}: the same plan from BOM and CRLF files"
        );
    }
    let clean = clean_result(Plain, &[], true);
    let edits = [
        ("items.csv", Map(bom_crlf)),
        ("demand.csv", Map(bom_crlf)),
        (ORDERS, Map(bom_crlf)),
    ];
    assert_eq!(text(&clean_result(Plain, &edits, true)), text(&clean));
}

fn crlf_only(bytes: &[u8]) -> Vec<u8> {
    let text = std::str::from_utf8(bytes).expect("UTF-8 base");
    text.replace('\n', "\r\n").into_bytes()
}

fn bom_only(bytes: &[u8]) -> Vec<u8> {
    let mut out = b"\xEF\xBB\xBF".to_vec();
    out.extend_from_slice(bytes);
    out
}

#[test]
fn near_misses_that_mean_the_same_are_accepted() {
    let clean = clean_result(Plain, &[], false);
    let same: &[(&str, &[(&str, Edit)])] = &[
        ("CRLF alone", &[("items.csv", Map(crlf_only))]),
        ("a BOM alone", &[("demand.csv", Map(bom_only))]),
        (
            "a bare TOML date",
            &[("scenario.toml", Replace("\"2027-01-04\"", "2027-01-04"))],
        ),
        (
            "blank lines and a note column",
            &[(
                "items.csv",
                Write(
                    b"item,setup_cost,holding_cost,unit_cost,initial_stock,lead_time,fixed_lot,x_note\n\n\
A,80,2,1,0,0,50,\"made here, in lots\"\n\nB,40,0.5,3,25,1,,bought; by the box\n\n",
                ),
            )],
        ),
        (
            "demand by date instead of period",
            &[(
                "demand.csv",
                Write(
                    b"item,date,quantity\nA,2027-01-04,18\nA,2027-01-11,30\nA,2027-01-18,20\n\
A,2027-01-24,22\nB,2027-01-15,15\nB,2027-01-25,30\n",
                ),
            )],
        ),
        (
            "a leading plus and an exponent",
            &[("items.csv", Replace("A,80,2,1", "A,+80,2e0,1.0"))],
        ),
    ];
    for (name, edits) in same {
        assert_eq!(
            text(&clean_result(Plain, edits, false)),
            text(&clean),
            "{name}"
        );
    }
}

#[test]
fn optional_files_with_only_a_header_are_accepted() {
    // An empty override or receipts file changes nothing; an empty demand
    // file means no demand at all, which is a valid (if idle) scenario.
    let clean = clean_result(
        Plain,
        &[("receipts.csv", Remove), ("costs.csv", Remove)],
        false,
    );
    let headers = [
        ("receipts.csv", Map(header_only)),
        ("costs.csv", Map(header_only)),
    ];
    assert_eq!(text(&clean_result(Plain, &headers, false)), text(&clean));
    let idle = clean_result(Plain, &[("demand.csv", Map(header_only))], false);
    assert_eq!(
        text(&idle),
        "item,period,date,release_period,release_date,quantity,kind,unit\n"
    );
    // With only a header in routing.csv no item uses the resources.
    let free = clean_result(Shared, &[("routing.csv", Map(header_only))], false);
    assert_eq!(text(&free), text(&clean_result(Plain, &[], false)));
    // An empty proposal is a plan too: `check` evaluates it.
    let output = Fixture::new(Plain, &[(ORDERS, Map(header_only))]).run(true);
    assert_eq!(output.status.code(), Some(0), "{}", text(&output.stderr));
    let value: serde_json::Value = serde_json::from_slice(&output.stdout).expect("JSON");
    assert_eq!(value["feasible"], false, "{value}");
}

#[test]
fn a_folder_that_is_not_there_exits_2_naming_it() {
    let root = tempfile::tempdir().expect("a temporary folder");
    let missing = root.path().join("no-such-scenario");
    let out = root.path().join("out");
    let output = Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .arg("plan")
        .arg(&missing)
        .arg("--out")
        .arg(&out)
        .output()
        .expect("the binary runs");
    assert_eq!(output.status.code(), Some(2));
    assert!(output.stdout.is_empty());
    let stderr = text(&output.stderr);
    assert!(
        stderr.contains("no-such-scenario") && stderr.contains("not a scenario folder"),
        "{stderr}"
    );
    assert!(!out.exists());
}

#[test]
fn a_scenario_without_a_feasible_plan_exits_1_and_explains_in_notes() {
    // Demand in period 1, a lead time of 1 and no stock: nothing can arrive
    // in time, and the item allows no backlog.
    let edits = [
        (
            "items.csv",
            Write(b"item,setup_cost,holding_cost,lead_time\nA,50,1,1\n"),
        ),
        (
            "demand.csv",
            Write(b"item,period,quantity\nA,1,10\nA,3,10\n"),
        ),
        ("costs.csv", Remove),
        ("receipts.csv", Remove),
    ];
    let fixture = Fixture::new(Plain, &edits);
    let output = Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .arg("plan")
        .arg(fixture.scenario())
        .arg("--json")
        .output()
        .expect("the binary runs");
    assert_eq!(
        output.status.code(),
        Some(1),
        "stderr: {}",
        text(&output.stderr)
    );
    let value: serde_json::Value =
        serde_json::from_slice(&output.stdout).expect("stdout is one JSON object");
    assert_eq!(value["status"], "infeasible", "{value}");
    let notes: Vec<&str> = value["notes"]
        .as_array()
        .expect("notes is a list")
        .iter()
        .filter_map(|n| n.as_str())
        .collect();
    let explained = notes.iter().any(|n| {
        n.contains("item A")
            && n.contains("10 units short in period 1")
            && n.contains("lead time 1")
    });
    assert!(explained, "the notes explain the shortage: {notes:?}");
}
