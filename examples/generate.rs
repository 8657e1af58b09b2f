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
    /// Resources (0: no capacity files); each item runs on one, round robin.
    #[arg(long, default_value_t = 0)]
    resources: usize,
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
    let mut total_load = 0.0;
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
                Pattern::Seasonal => mean * (1.0 + 0.5 * phase.sin()),
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
                total_load += quantity;
                let _ = writeln!(demand, "P{i:05},{},{quantity}", t + 1);
            }
        }
    }
    std::fs::write(args.out.join("items.csv"), items)?;
    std::fs::write(args.out.join("demand.csv"), demand)?;
    if args.resources > 0 {
        // Each item runs on one resource, round robin; capacity is set so
        // that production plus one setup per item and bucket... scaled by
        // the setup share meets the utilisation asked for.
        let per_resource_load = total_load / args.resources as f64 / args.periods as f64;
        let capacity = per_resource_load / args.utilisation.max(0.01);
        let items_per_resource = args.items.div_ceil(args.resources) as f64;
        let setup_time = args.setup_share * capacity / items_per_resource;
        let mut resources = String::from("resource,capacity\n");
        for r in 0..args.resources {
            let _ = writeln!(resources, "R{r},{:.1}", capacity.ceil());
        }
        let mut routing = String::from("item,resource,per_unit,setup_time\n");
        for i in 0..args.items {
            let _ = writeln!(routing, "P{i:05},R{},1,{setup_time:.2}", i % args.resources);
        }
        std::fs::write(args.out.join("resources.csv"), resources)?;
        std::fs::write(args.out.join("routing.csv"), routing)?;
    }
    Ok(())
}
