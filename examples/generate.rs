//! A seeded generator of large scenario folders, for benchmarks: items,
//! buckets, resources, utilisation, setup-time share and demand pattern.
//!
//! `cargo run --release --example generate -- --items 10000 --periods 52 OUT`
//! writes OUT/scenario.toml, items.csv, demand.csv and, with `--resources N`,
//! resources.csv and routing.csv sized so that the average load is the
//! `--utilisation` share of capacity. The data are invented.

use std::fmt::Write as _;
use std::path::PathBuf;

use clap::{Parser, ValueEnum};

#[derive(Clone, Copy, ValueEnum)]
enum Pattern {
    Seasonal,
    Lumpy,
    Trending,
}

#[derive(Parser)]
struct Args {
    #[arg(long, default_value_t = 1000)]
    items: usize,
    #[arg(long, default_value_t = 52)]
    periods: usize,
    /// Resources (0: no capacity files); each item runs on `--routes` of
    /// them, round robin.
    #[arg(long, default_value_t = 0)]
    resources: usize,
    /// Resources each item runs on (2 or more ties all items into one
    /// shared-capacity group).
    #[arg(long, default_value_t = 1)]
    routes: usize,
    /// Average load over capacity, e.g. 0.85.
    #[arg(long, default_value_t = 0.85)]
    utilisation: f64,
    /// Share of capacity used by setups at one setup per item and bucket.
    #[arg(long, default_value_t = 0.1)]
    setup_share: f64,
    #[arg(long, value_enum, default_value_t = Pattern::Seasonal)]
    pattern: Pattern,
    #[arg(long, default_value_t = 1)]
    seed: u64,
    out: PathBuf,
}

/// A small deterministic generator (SplitMix64), so runs repeat exactly.
struct Random(u64);

impl Random {
    fn next(&mut self) -> f64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        ((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64
    }
}

#[allow(clippy::needless_range_loop)]
fn main() -> std::io::Result<()> {
    let args = Args::parse();
    let mut random = Random(args.seed);
    std::fs::create_dir_all(&args.out)?;
    std::fs::write(
        args.out.join("scenario.toml"),
        format!(
            "name = \"generated {} items x {} weeks, seed {}\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = {}\n",
            args.items, args.periods, args.seed, args.periods
        ),
    )?;
    let mut items = String::from("item,setup_cost,holding_cost,unit_cost,fixed_lot\n");
    let mut demand = String::from("item,period,quantity\n");
    let mut item_load = vec![0.0; args.items];
    for i in 0..args.items {
        let mean = 20.0 + 180.0 * random.next();
        let setup = 50.0 + 450.0 * random.next();
        let holding = 0.05 + 0.95 * random.next();
        let unit = (2.0 + 40.0 * random.next()).round();
        let eoq = (2.0 * mean * setup / holding).sqrt().round().max(1.0);
        let _ = writeln!(items, "P{i:05},{setup:.2},{holding:.3},{unit},{eoq}");
        for t in 0..args.periods {
            let phase = t as f64 / 52.0 * std::f64::consts::TAU;
            let level = match args.pattern {
                // Low in winter, high in summer: cumulative demand never runs
                // ahead of the average, so the capacity can keep up.
                Pattern::Seasonal => mean * (1.0 - 0.5 * phase.cos()),
                Pattern::Lumpy => {
                    if random.next() < 0.3 {
                        mean * 3.0
                    } else {
                        0.0
                    }
                }
                Pattern::Trending => mean * (0.6 + 0.8 * t as f64 / args.periods.max(1) as f64),
            };
            let quantity = (level * (0.8 + 0.4 * random.next())).round();
            if quantity > 0.0 {
                item_load[i] += quantity;
                let _ = writeln!(demand, "P{i:05},{},{quantity}", t + 1);
            }
        }
    }
    std::fs::write(args.out.join("items.csv"), items)?;
    std::fs::write(args.out.join("demand.csv"), demand)?;
    if args.resources > 0 {
        // Each item runs on `routes` resources, round robin. Each resource's
        // capacity is set so that its average production load is the
        // utilisation asked for; one setup per item and bucket would take
        // the setup share of capacity on top of it.
        let routes = args.routes.clamp(1, args.resources);
        let resource_of = |i: usize| (0..routes).map(move |k| (i + k) % args.resources);
        let mut load = vec![0.0; args.resources];
        let mut count = vec![0usize; args.resources];
        for (i, &quantity) in item_load.iter().enumerate() {
            for r in resource_of(i) {
                load[r] += quantity;
                count[r] += 1;
            }
        }
        let capacity: Vec<f64> = load
            .iter()
            .map(|l| (l / args.periods as f64 / args.utilisation.max(0.01)).ceil())
            .collect();
        let setup_time: Vec<f64> = (0..args.resources)
            .map(|r| args.setup_share * capacity[r] / count[r].max(1) as f64)
            .collect();
        let mut resources = String::from("resource,capacity\n");
        for (r, c) in capacity.iter().enumerate() {
            let _ = writeln!(resources, "R{r},{c:.1}");
        }
        let mut routing = String::from("item,resource,per_unit,setup_time\n");
        for i in 0..args.items {
            for r in resource_of(i) {
                let _ = writeln!(routing, "P{i:05},R{r},1,{:.2}", setup_time[r]);
            }
        }
        std::fs::write(args.out.join("resources.csv"), resources)?;
        std::fs::write(args.out.join("routing.csv"), routing)?;
    }
    Ok(())
}
