//! The output folder of `plan --out` appears whole or not at all, never
//! replaces the inputs, and is refused when it exists unless `--force`;
//! inputs are never modified; and the same input gives the same bytes, on
//! stdout and in the files, run after run.

use std::collections::BTreeMap;
use std::path::{Path, PathBuf};
use std::process::{Command, Output};

use tempfile::TempDir;

const SCENARIO_TOML: &str =
    "name = \"atomic\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 6\n";
const ITEMS: &str = "item,setup_cost,holding_cost,unit_cost,initial_stock,lead_time,fixed_lot\n\
A,80,2,1,0,0,50\n\
B,40,0.5,3,25,1,\n";
const DEMAND: &str = "item,period,quantity\nA,1,18\nA,2,30\nA,3,42\nB,2,15\nB,4,30\n";
const RECEIPTS: &str = "item,date,quantity\nB,2027-01-11,10\n";
/// Both items share M1, so the pair is planned by the MILP.
const RESOURCES: &str = "resource,capacity,overtime_capacity,overtime_cost\nM1,60,20,1.5\n";
const CAPACITY: &str = "resource,period,capacity\nM1,2,40\n";
const ROUTING: &str = "item,resource,per_unit,setup_time\nA,M1,1,5\nB,M1,0.5,2\n";

/// A root folder holding `scenario/` (and whatever a test adds beside it).
struct Fixture {
    root: TempDir,
}

impl Fixture {
    fn new(shared: bool) -> Fixture {
        let root = tempfile::tempdir().expect("a temporary folder");
        let dir = root.path().join("scenario");
        std::fs::create_dir(&dir).expect("the scenario folder");
        let mut files = vec![
            ("scenario.toml", SCENARIO_TOML),
            ("items.csv", ITEMS),
            ("demand.csv", DEMAND),
            ("receipts.csv", RECEIPTS),
        ];
        if shared {
            files.extend([
                ("resources.csv", RESOURCES),
                ("capacity.csv", CAPACITY),
                ("routing.csv", ROUTING),
            ]);
        }
        for (name, text) in files {
            std::fs::write(dir.join(name), text).expect("a fixture file");
        }
        Fixture { root }
    }

    fn root(&self) -> &Path {
        self.root.path()
    }

    fn scenario(&self) -> PathBuf {
        self.root().join("scenario")
    }

    fn path(&self, name: &str) -> PathBuf {
        self.root().join(name)
    }

    /// Runs the binary with the root folder as the working directory.
    fn run(&self, args: &[&str]) -> Output {
        Command::new(env!("CARGO_BIN_EXE_lotwright"))
            .args(args)
            .current_dir(self.root())
            .output()
            .expect("the binary runs")
    }

    /// The names directly in the root folder, sorted.
    fn entries(&self) -> Vec<String> {
        let mut names: Vec<String> = std::fs::read_dir(self.root())
            .expect("the root lists")
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

/// Every file under `dir` with its bytes, by path relative to `dir`.
fn snapshot(dir: &Path) -> BTreeMap<PathBuf, Vec<u8>> {
    let mut files = BTreeMap::new();
    let mut pending = vec![dir.to_path_buf()];
    while let Some(folder) = pending.pop() {
        for entry in std::fs::read_dir(&folder).expect("a folder lists") {
            let path = entry.expect("an entry").path();
            if path.is_dir() {
                pending.push(path);
            } else {
                let bytes = std::fs::read(&path).expect("a file reads");
                let relative = path.strip_prefix(dir).expect("inside").to_path_buf();
                files.insert(relative, bytes);
            }
        }
    }
    files
}

fn stderr(output: &Output) -> String {
    String::from_utf8_lossy(&output.stderr).into_owned()
}

fn assert_code(output: &Output, code: i32) {
    assert_eq!(
        output.status.code(),
        Some(code),
        "stdout: {}\nstderr: {}",
        String::from_utf8_lossy(&output.stdout),
        stderr(output)
    );
}

#[test]
fn a_good_run_leaves_the_whole_folder_and_no_temporary_sibling() {
    let fixture = Fixture::new(false);
    let inputs = snapshot(&fixture.scenario());
    let output = fixture.run(&["plan", "scenario", "--out", "out"]);
    assert_code(&output, 0);
    assert_eq!(fixture.entries(), ["out", "scenario"]);
    let written = snapshot(&fixture.path("out"));
    for name in ["plan.csv", "comparison.csv"] {
        let bytes = written
            .get(Path::new(name))
            .unwrap_or_else(|| panic!("{name} written; got {:?}", written.keys()));
        assert!(!bytes.is_empty(), "{name} is not empty");
    }
    let plan = String::from_utf8_lossy(&written[Path::new("plan.csv")]).into_owned();
    assert!(
        plan.starts_with("item,period,date,release_period,release_date,quantity,kind,unit\n"),
        "{plan}"
    );
    assert_eq!(snapshot(&fixture.scenario()), inputs, "inputs unchanged");
}

#[test]
fn a_bad_input_creates_nothing_and_leaves_an_earlier_output_untouched() {
    let fixture = Fixture::new(false);
    assert_code(&fixture.run(&["plan", "scenario", "--out", "out"]), 0);
    // A note of the planner's own inside the earlier output must survive too.
    std::fs::write(fixture.path("out").join("notes.txt"), "keep me\n").expect("a note");
    let earlier = snapshot(&fixture.path("out"));
    std::fs::write(
        fixture.scenario().join("demand.csv"),
        "item,period,quantity\nA,1,18\nA,99,30\n",
    )
    .expect("a broken demand file");
    let inputs = snapshot(&fixture.scenario());
    for force in [false, true] {
        let mut args = vec!["plan", "scenario", "--out", "out"];
        if force {
            args.push("--force");
        }
        let output = fixture.run(&args);
        assert_code(&output, 2);
        assert!(
            stderr(&output).contains("demand.csv, line 3"),
            "{}",
            stderr(&output)
        );
        assert_eq!(snapshot(&fixture.path("out")), earlier, "force {force}");
        assert_eq!(fixture.entries(), ["out", "scenario"], "force {force}");
    }
    // Bad input and a fresh folder: nothing appears.
    let output = fixture.run(&["plan", "scenario", "--out", "fresh"]);
    assert_code(&output, 2);
    assert_eq!(fixture.entries(), ["out", "scenario"]);
    assert_eq!(snapshot(&fixture.scenario()), inputs, "inputs unchanged");
}

#[test]
fn an_existing_folder_is_refused_without_force_and_replaced_with_it() {
    let fixture = Fixture::new(false);
    let out = fixture.path("out");
    std::fs::create_dir(&out).expect("an old output folder");
    std::fs::write(out.join("plan.csv"), "stale\n").expect("a stale plan");
    std::fs::write(out.join("old-report.txt"), "stale\n").expect("a stale file");
    let before = snapshot(&out);
    let refused = fixture.run(&["plan", "scenario", "--out", "out"]);
    assert_code(&refused, 2);
    assert!(refused.stdout.is_empty());
    assert!(stderr(&refused).contains("--force"), "{}", stderr(&refused));
    assert_eq!(snapshot(&out), before, "the refused folder is untouched");
    assert_eq!(fixture.entries(), ["out", "scenario"]);

    let replaced = fixture.run(&["plan", "scenario", "--out", "out", "--force"]);
    assert_code(&replaced, 0);
    let after = snapshot(&out);
    assert!(
        !after.contains_key(Path::new("old-report.txt")),
        "{:?}",
        after.keys()
    );
    assert_ne!(after[Path::new("plan.csv")], b"stale\n".to_vec());
    // No temporary or old sibling is left behind.
    assert_eq!(fixture.entries(), ["out", "scenario"]);

    // The replacement is what a fresh run writes.
    let fresh = fixture.run(&["plan", "scenario", "--out", "fresh"]);
    assert_code(&fresh, 0);
    assert_eq!(snapshot(&fixture.path("fresh")), after);
}

#[test]
fn the_scenario_folder_and_folders_of_inputs_are_refused_even_with_force() {
    let fixture = Fixture::new(false);
    // Another scenario's folder, and a folder holding only an items.csv.
    let other = fixture.path("other");
    std::fs::create_dir(&other).expect("another folder");
    std::fs::write(other.join("scenario.toml"), SCENARIO_TOML).expect("its scenario.toml");
    let items_only = fixture.path("items-only");
    std::fs::create_dir(&items_only).expect("a folder");
    std::fs::write(items_only.join("items.csv"), ITEMS).expect("its items.csv");
    let before = snapshot(fixture.root());
    let scenario_abs = fixture.scenario();
    let scenario_abs = scenario_abs.to_str().expect("a UTF-8 path");
    for target in [
        "scenario",
        "./scenario",
        "scenario/",
        scenario_abs,
        "other",
        "items-only",
        // The folder holding the scenario: replacing it would delete it.
        ".",
    ] {
        for force in [false, true] {
            let mut args = vec!["plan", "scenario", "--out", target];
            if force {
                args.push("--force");
            }
            let output = fixture.run(&args);
            assert_code(&output, 2);
            assert!(output.stdout.is_empty(), "--out {target}");
            let message = stderr(&output);
            assert!(
                message.contains("choose another --out folder"),
                "--out {target} (force {force}): {message}"
            );
            assert_eq!(
                snapshot(fixture.root()),
                before,
                "--out {target} (force {force}) changed files"
            );
            assert_eq!(
                fixture.entries(),
                ["items-only", "other", "scenario"],
                "--out {target} (force {force})"
            );
        }
    }
}

#[test]
fn an_output_path_that_cannot_be_a_folder_is_refused_before_the_work() {
    let fixture = Fixture::new(false);
    std::fs::write(fixture.path("a-file"), "not a folder\n").expect("a plain file");
    let before = snapshot(fixture.root());
    for (target, says) in [
        ("a-file", "not a folder"),
        ("missing/out", "parent folder does not exist"),
    ] {
        let output = fixture.run(&["plan", "scenario", "--out", target, "--force"]);
        assert_code(&output, 2);
        assert!(stderr(&output).contains(says), "{}", stderr(&output));
        assert_eq!(snapshot(fixture.root()), before, "--out {target}");
        assert_eq!(fixture.entries(), ["a-file", "scenario"], "--out {target}");
    }
}

#[test]
fn no_command_modifies_its_inputs() {
    for shared in [false, true] {
        let fixture = Fixture::new(shared);
        let inputs = snapshot(&fixture.scenario());
        assert_code(&fixture.run(&["plan", "scenario"]), 0);
        assert_code(&fixture.run(&["plan", "scenario", "--json"]), 0);
        assert_code(&fixture.run(&["plan", "scenario", "--out", "out"]), 0);
        assert_code(
            &fixture.run(&["plan", "scenario", "--out", "out", "--force", "--detail"]),
            0,
        );
        let orders = fixture.path("out").join("plan.csv");
        let orders = orders.to_str().expect("a UTF-8 path");
        let plan_before = std::fs::read(orders).expect("plan.csv");
        assert_code(&fixture.run(&["check", "scenario", "--orders", orders]), 0);
        assert_code(
            &fixture.run(&["check", "scenario", "--orders", orders, "--json"]),
            0,
        );
        assert_eq!(snapshot(&fixture.scenario()), inputs, "shared {shared}");
        assert_eq!(std::fs::read(orders).expect("plan.csv"), plan_before);
        assert_eq!(fixture.entries(), ["out", "scenario"]);
    }
}

#[test]
fn the_same_input_gives_the_same_bytes() {
    for (shared, extra) in [
        (false, &[][..]),
        (true, &[][..]),
        (true, &["--threads", "2"][..]),
    ] {
        let fixture = Fixture::new(shared);
        let mut runs = Vec::new();
        for n in 0..2 {
            if n == 1 {
                // Past a clock second, so a time stamp written into any
                // file (a spreadsheet's creation date) would show.
                std::thread::sleep(std::time::Duration::from_millis(1100));
            }
            let out = format!("out{n}");
            let mut table = vec!["plan", "scenario", "--detail"];
            table.extend_from_slice(extra);
            let mut json = vec!["plan", "scenario", "--json", "--out", &out];
            json.extend_from_slice(extra);
            let table = fixture.run(&table);
            let json = fixture.run(&json);
            assert_code(&table, 0);
            assert_code(&json, 0);
            runs.push((table.stdout, json.stdout, snapshot(&fixture.path(&out))));
        }
        let (table, json, files) = &runs[0];
        assert!(!table.is_empty() && !json.is_empty() && !files.is_empty());
        assert_eq!(
            String::from_utf8_lossy(table),
            String::from_utf8_lossy(&runs[1].0),
            "tables, shared {shared} {extra:?}"
        );
        assert_eq!(
            String::from_utf8_lossy(json),
            String::from_utf8_lossy(&runs[1].1),
            "JSON, shared {shared} {extra:?}"
        );
        assert_eq!(files, &runs[1].2, "files, shared {shared} {extra:?}");
        if shared {
            let value: serde_json::Value = serde_json::from_slice(json).expect("JSON");
            assert!(
                value["solver"].as_str().is_some_and(|s| s.contains("milp")),
                "the shared scenario goes through the MILP: {}",
                value["solver"]
            );
        }
    }
}

#[test]
fn a_usage_error_writes_nothing() {
    let fixture = Fixture::new(false);
    for args in [
        &["--method", "cheapest"][..],
        &["--time-limit", "-1"][..],
        &["--item", "NO-SUCH-ITEM"][..],
    ] {
        let mut full = vec!["plan", "scenario", "--out", "out"];
        full.extend_from_slice(args);
        let output = fixture.run(&full);
        assert_code(&output, 2);
        assert!(output.stdout.is_empty(), "{args:?}");
        assert_eq!(fixture.entries(), ["scenario"], "{args:?}");
    }
}
