//! Writes the demo's year of weekly forecast snapshots for `lotwright roll`:
//! demo-data/harbor-bakeware-year/history/, one file per week, each
//! forecasting 13 weeks ahead, and that folder's demand.csv (what was
//! really ordered: the first week of each snapshot).
//!
//! `cargo run --release --example forecast_history -- demo-data/harbor-bakeware-year`
//!
//! The numbers are invented and seeded, so the files come out the same
//! every time. Each item has a weekly mean (about the quarterly demo's), a
//! seasonal swing of a quarter peaking in mid-November, and noise of 6 %
//! in what is really ordered. A forecast made k weeks ahead errs by a
//! further 2.5 % a week of distance, so snapshots move as the weeks come
//! closer, which is what replanning is about.

use std::fmt::Write as _;
use std::path::PathBuf;

/// (item, mean weekly demand).
const ITEMS: [(&str, f64); 10] = [
    ("SHEET-PAN-L", 590.0),
    ("SHEET-PAN-S", 780.0),
    ("MUFFIN-12", 570.0),
    ("LOAF-TIN", 550.0),
    ("CAKE-RD-24", 290.0),
    ("SPRING-26", 240.0),
    ("TART-28", 310.0),
    ("ROAST-XL", 290.0),
    ("COOL-RACK", 390.0),
    ("BAKE-MAT", 490.0),
];
const WEEKS: usize = 52;
const AHEAD: usize = 13;

/// A small seeded generator (64-bit linear congruential, Knuth's
/// constants), uniform in [0, 1).
struct Random(u64);

impl Random {
    fn next(&mut self) -> f64 {
        self.0 = self
            .0
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (self.0 >> 11) as f64 / (1u64 << 53) as f64
    }

    /// Standard normal (Box-Muller).
    fn normal(&mut self) -> f64 {
        let u = self.next().max(1e-12);
        let v = self.next();
        (-2.0 * u.ln()).sqrt() * (2.0 * std::f64::consts::PI * v).cos()
    }
}

fn main() -> std::io::Result<()> {
    let folder: PathBuf = std::env::args()
        .nth(1)
        .unwrap_or_else(|| "demo-data/harbor-bakeware-year".into())
        .into();
    let start = chrono::NaiveDate::from_ymd_opt(2027, 1, 4).expect("a date");
    let week = |t: usize| start + chrono::Days::new(7 * t as u64);
    let periods = WEEKS + AHEAD - 1;
    let mut random = Random(20270104);
    // What is really ordered, week by week (and after the run, the mean).
    let actual: Vec<Vec<f64>> = ITEMS
        .iter()
        .map(|(_, mean)| {
            (0..periods)
                .map(|t| {
                    let season =
                        1.0 + 0.25 * (2.0 * std::f64::consts::PI * (t as f64 - 46.0) / 52.0).cos();
                    (mean * season * (1.0 + 0.06 * random.normal()))
                        .max(0.0)
                        .round()
                })
                .collect()
        })
        .collect();
    let history = folder.join("history");
    std::fs::create_dir_all(&history)?;
    for k in 0..WEEKS {
        let mut text = String::from("item,date,quantity\n");
        for (i, (id, _)) in ITEMS.iter().enumerate() {
            let end = (k + AHEAD).min(periods);
            for (t, &really) in actual[i].iter().enumerate().take(end).skip(k) {
                let error = if t == k {
                    0.0
                } else {
                    0.025 * (t - k) as f64 * random.normal()
                };
                let q = (really * (1.0 + error)).max(0.0).round();
                let _ = writeln!(text, "{id},{},{q}", week(t));
            }
        }
        std::fs::write(history.join(format!("{}.csv", week(k))), text)?;
    }
    let mut demand = String::from("item,period,quantity\n");
    for (i, (id, _)) in ITEMS.iter().enumerate() {
        for (t, q) in actual[i].iter().enumerate() {
            let _ = writeln!(demand, "{id},{},{q}", t + 1);
        }
    }
    std::fs::write(folder.join("demand.csv"), demand)?;
    println!(
        "wrote {} snapshots and demand.csv into {}",
        WEEKS,
        folder.display()
    );
    Ok(())
}
