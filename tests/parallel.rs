//! Groups without resources are solved in parallel: the output must be the
//! same, byte for byte, whatever the number of threads.

use std::fmt::Write as _;
use std::process::Command;

mod common;

/// 300 items with seasonal-looking demand over 26 weeks (invented data,
/// deterministic), three of them sharing a press.
fn scenario() -> tempfile::TempDir {
    let mut items = String::from("item,setup_cost,holding_cost,unit_cost\n");
    let mut demand = String::from("item,period,quantity\n");
    for i in 0..300u64 {
        let _ = writeln!(
            items,
            "P{i:03},{},{},{}",
            40 + (i * 37) % 300,
            1 + i % 4,
            5 + i % 7
        );
        for t in 0..26u64 {
            let q = (i * 13 + t * 7 + (i * t) % 11) % 40;
            if q % 5 != 0 {
                let _ = writeln!(demand, "P{i:03},{},{q}", t + 1);
            }
        }
    }
    let files = [
        ("scenario.toml", common::weekly_toml(26)),
        ("items.csv", items),
        ("demand.csv", demand),
        ("resources.csv", "resource,capacity\nPress,60\n".to_string()),
        (
            "routing.csv",
            "item,resource,per_unit,setup_time\nP000,Press,1,2\nP001,Press,1,2\nP002,Press,1,2\n"
                .to_string(),
        ),
    ];
    let borrowed: Vec<(&str, &str)> = files.iter().map(|(n, c)| (*n, c.as_str())).collect();
    common::scenario_dir(&borrowed)
}

fn plan(dir: &std::path::Path, threads: &str) -> Vec<u8> {
    let out = Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .args(["plan", "--json", "--threads", "1"])
        .arg(dir)
        .env("RAYON_NUM_THREADS", threads)
        .output()
        .expect("run lotwright");
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    out.stdout
}

#[test]
fn one_thread_and_several_give_the_same_bytes() {
    let dir = scenario();
    let one = plan(dir.path(), "1");
    let several = plan(dir.path(), "4");
    assert!(one.len() > 10_000, "a real plan was printed");
    assert!(one == several, "the JSON differs between 1 and 4 threads");
    let json: serde_json::Value = serde_json::from_slice(&one).unwrap();
    assert_eq!(json["components"].as_array().unwrap().len(), 298);
    assert_eq!(json["status"], "optimal");
}
