//! A rolling run that shows everything the roll outputs can say: two items
//! on one press with a little overtime, eight weekly forecasts, and a week
//! whose sales jump far above the forecast. The lot rules ignore the press
//! and have orders cut; the exact method meets the jump late, inside the
//! freeze; the forecast errors give a safety stock. Invented data.

#![allow(dead_code)]

use std::path::Path;

/// Sales that happened, week by week, per item.
pub const SOLD: [(&str, [u32; 8]); 2] = [
    ("TRAY", [50, 60, 45, 150, 55, 70, 40, 65]),
    ("LID", [30, 25, 40, 35, 60, 30, 45, 35]),
];

/// What every forecast expects each item to sell in the weeks after its
/// own.
pub const EXPECTED: [u32; 2] = [55, 35];

/// The run's arguments after the scenario folder: `--history` and the
/// terms (4 weeks ahead, 1 frozen, a 90 % service level).
pub fn terms(dir: &Path) -> Vec<String> {
    vec![
        "--history".into(),
        dir.join("history").display().to_string(),
        "--horizon".into(),
        "4".into(),
        "--frozen".into(),
        "1".into(),
        "--service-level".into(),
        "0.9".into(),
    ]
}

/// Writes the scenario folder, with its forecasts in `history/`.
pub fn write(dir: &Path) {
    let files = [
        (
            "scenario.toml",
            "name = \"Quayside Tinware press, eight weeks replanned\"\nstart = \"2027-03-01\"\nbucket = \"week\"\nperiods = 12\ncurrency = \"EUR\"\n".to_string(),
        ),
        (
            "items.csv",
            "item,setup_cost,holding_cost,unit_cost,initial_stock,lead_time\nTRAY,60,0.4,3,20,0\nLID,45,0.3,2,10,0\n".to_string(),
        ),
        (
            "resources.csv",
            "resource,capacity,overtime_capacity,overtime_cost\nPRESS,120,20,4\n".to_string(),
        ),
        (
            "routing.csv",
            "item,resource,per_unit,setup_time\nTRAY,PRESS,1,10\nLID,PRESS,0.5,5\n".to_string(),
        ),
    ];
    std::fs::create_dir_all(dir.join("history")).unwrap();
    for (name, body) in files {
        std::fs::write(dir.join(name), body).unwrap();
    }
    // demand.csv: what was sold, then the forecast after the run.
    let mut demand = String::from("item,period,quantity\n");
    for t in 0..12 {
        for (k, (item, sold)) in SOLD.iter().enumerate() {
            let q = if t < 8 { sold[t] } else { EXPECTED[k] };
            demand.push_str(&format!("{item},{},{q}\n", t + 1));
        }
    }
    std::fs::write(dir.join("demand.csv"), demand).unwrap();
    // Week w's forecast: its own week as sold, the next three as expected.
    let start = chrono::NaiveDate::from_ymd_opt(2027, 3, 1).unwrap();
    for w in 0..8 {
        let mut forecast = String::from("item,period,quantity\n");
        for (k, (item, sold)) in SOLD.iter().enumerate() {
            for j in 0..4 {
                let q = if j == 0 { sold[w] } else { EXPECTED[k] };
                forecast.push_str(&format!("{item},{},{q}\n", j + 1));
            }
        }
        let date = start + chrono::Duration::weeks(w as i64);
        std::fs::write(dir.join("history").join(format!("{date}.csv")), forecast).unwrap();
    }
}
