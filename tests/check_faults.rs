//! `check` on a fixture seeded with one fault of each kind: every fault is
//! found, by item (or resource), bucket and kind, and the check itself exits
//! 0 (1 with --strict).

use std::process::Command;

fn lotwright(args: &[&str]) -> (i32, String) {
    let output = Command::new(env!("CARGO_BIN_EXE_lotwright"))
        .args(args)
        .output()
        .expect("the binary runs");
    (
        output.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&output.stdout).into_owned(),
    )
}

#[test]
fn check_finds_every_seeded_fault() {
    let dir = tempfile::tempdir().unwrap();
    let files = [
        ("scenario.toml", "name = \"faults\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 4\n"),
        (
            "items.csv",
            "item,setup_cost,holding_cost,safety_stock,lead_time,min_lot,lot_multiple,max_lot,initial_stock\n\
             SHORT,10,1,,,,,,\n\
             SAFE,10,1,5,,,,,\n\
             EARLY,10,1,,1,,,,5\n\
             MIN,10,1,,,50,,,\n\
             MULT,10,1,,,,10,,\n\
             MAX,10,1,,,,,30,\n\
             BUSY,10,1,,,,,,\n",
        ),
        (
            "demand.csv",
            "item,period,quantity\nSHORT,2,20\nSAFE,1,10\nEARLY,1,5\nEARLY,2,5\nMIN,1,20\nMULT,1,15\nMAX,2,40\nBUSY,3,80\n",
        ),
        ("resources.csv", "resource,capacity\nLINE,50\n"),
        ("routing.csv", "item,resource,per_unit,setup_time\nBUSY,LINE,1,0\n"),
    ];
    for (name, body) in files {
        std::fs::write(dir.path().join(name), body).unwrap();
    }
    // The scenario itself is feasible (EARLY's stock covers week 1, MAX can
    // split 40 over weeks 1 and 2, BUSY can build ahead). The proposal:
    // SHORT gets 10 of 20; SAFE exactly its demand (no safety stock);
    // EARLY is received in week 1, so released in week 0; MIN gets a lot of
    // 20 (min 50); MULT 15 (multiple 10); MAX 40 (max 30); BUSY 80 on a line
    // of 50.
    let orders = dir.path().join("orders.csv");
    std::fs::write(
        &orders,
        "item,period,quantity\nSHORT,2,10\nSAFE,1,10\nEARLY,1,5\nMIN,1,20\nMULT,1,15\nMAX,2,40\nBUSY,3,80\n",
    )
    .unwrap();
    let scenario = dir.path().to_str().unwrap();
    let orders = orders.to_str().unwrap();
    let (code, stdout) = lotwright(&["check", scenario, "--orders", orders, "--json"]);
    assert_eq!(code, 0, "{stdout}");
    let json: serde_json::Value = serde_json::from_str(&stdout).unwrap();
    assert_eq!(json["feasible"], false);
    let shortages = json["shortages"].as_array().unwrap();
    assert!(
        shortages
            .iter()
            .any(|s| s["item"] == "SHORT" && s["period"] == 2 && s["quantity"] == 10.0),
        "{shortages:?}"
    );
    let overloads = json["overloads"].as_array().unwrap();
    assert!(
        overloads
            .iter()
            .any(|o| o["resource"] == "LINE" && o["period"] == 3 && o["excess"] == 30.0),
        "{overloads:?}"
    );
    let violations = json["violations"].as_array().unwrap();
    let has = |item: &str, kind: &str| {
        violations
            .iter()
            .any(|v| v["item"] == item && v["kind"] == kind && v["binding"] == true)
    };
    assert!(has("SAFE", "safety-stock"), "{violations:?}");
    assert!(has("EARLY", "release-before-start"), "{violations:?}");
    assert!(has("MIN", "below-min-lot"), "{violations:?}");
    assert!(has("MULT", "not-lot-multiple"), "{violations:?}");
    assert!(has("MAX", "above-max-lot"), "{violations:?}");
    // The best plan exists (the scenario itself is feasible) and is cheaper.
    assert!(json["best_cost"].as_f64().is_some(), "{stdout}");
    let (strict, _) = lotwright(&["check", scenario, "--orders", orders, "--strict"]);
    assert_eq!(strict, 1);
}
