//! `lotwright init DIR`: a starter scenario that `plan` accepts as it is,
//! written only into a new or empty folder.

use std::path::Path;
use std::process::{Command, Output};

fn lotwright(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .args(args)
        .output()
        .expect("the binary runs")
}

fn path(p: &Path) -> &str {
    p.to_str().expect("a UTF-8 temporary path")
}

const FILES: [&str; 9] = [
    "README.txt",
    "capacity.csv",
    "costs.csv",
    "demand.csv",
    "items.csv",
    "receipts.csv",
    "resources.csv",
    "routing.csv",
    "scenario.toml",
];

#[test]
fn init_then_plan_succeeds_and_uses_every_file() {
    let parent = tempfile::tempdir().unwrap();
    let dir = parent.path().join("starter");
    let output = lotwright(&["init", path(&dir)]);
    assert_eq!(
        output.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&output.stderr)
    );
    let mut names: Vec<String> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    assert_eq!(names, FILES);
    assert_eq!(
        std::fs::read_dir(parent.path()).unwrap().count(),
        1,
        "no staging folder left"
    );
    let toml = std::fs::read_to_string(dir.join("scenario.toml")).unwrap();
    assert!(
        toml.lines().filter(|l| l.starts_with('#')).count() >= 5,
        "commented"
    );
    for csv in FILES.iter().filter(|f| f.ends_with(".csv")) {
        let text = std::fs::read_to_string(dir.join(csv)).unwrap();
        let header = text.lines().next().unwrap();
        assert!(
            header.ends_with(",x_note"),
            "{csv} explains its rows: {header}"
        );
        assert!(text.lines().count() >= 2, "{csv} has a row");
    }

    let output = lotwright(&["plan", path(&dir), "--json"]);
    assert_eq!(
        output.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&output.stderr)
    );
    let json: serde_json::Value = serde_json::from_slice(&output.stdout).unwrap();
    assert_eq!(json["status"], "optimal");
    assert_eq!(json["currency"], "EUR");
    // The starter's capacity, routing and lot rules are all in play: the
    // shared line is solved by the MILP and the rule in use is compared.
    assert!(
        json["solver"].as_str().unwrap().contains("milp"),
        "{}",
        json["solver"]
    );
    let methods: Vec<&str> = json["comparison"]
        .as_array()
        .unwrap()
        .iter()
        .map(|r| r["method"].as_str().unwrap())
        .collect();
    assert!(methods.contains(&"fixed-lot"), "{methods:?}");
    // LID's open order and lead time: its first order arrives after week 1.
    assert!(json["orders"]
        .as_array()
        .unwrap()
        .iter()
        .filter(|o| o["item"] == "LID")
        .all(|o| o["period"].as_u64().unwrap() >= 2 && o["release_period"].as_i64().unwrap() >= 1));
}

#[test]
fn init_writes_into_an_empty_folder() {
    let dir = tempfile::tempdir().unwrap();
    let output = lotwright(&["init", path(dir.path())]);
    assert_eq!(
        output.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&output.stderr)
    );
    assert!(dir.path().join("items.csv").exists());
}

#[test]
fn init_refuses_a_folder_that_is_not_empty() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("notes.txt"), "mine").unwrap();
    let output = lotwright(&["init", path(dir.path())]);
    assert_eq!(output.status.code(), Some(2));
    let message = String::from_utf8_lossy(&output.stderr);
    assert!(message.contains("not empty"), "{message}");
    let names: Vec<_> = std::fs::read_dir(dir.path()).unwrap().collect();
    assert_eq!(names.len(), 1, "nothing was added");
    assert_eq!(
        std::fs::read_to_string(dir.path().join("notes.txt")).unwrap(),
        "mine"
    );
}
