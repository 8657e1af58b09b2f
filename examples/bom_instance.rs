//! Writes a seeded multi-level scenario folder for the benchmarks of
//! docs/benchmarks.md ("Bills of material").
//!
//! `cargo run --release --example bom_instance -- DIR ITEMS LEVELS WEEKS RESOURCES UTILISATION [SEED [COMMONALITY]]`
//!
//! The items are spread evenly over the levels. Level 0 items have demand
//! (a weekly mean between 20 and 120, lumpy: a bucket is empty with
//! probability 0.3). Every item below level 0 goes into one to COMMONALITY
//! items of the level above (default 3, so components are shared; 1 makes
//! a pure assembly structure, every part in one parent), with 1 to 3 per
//! parent.
//! Lead times are 0 or 1 week; setup costs 50 to 500; holding 0.2 to 2 for
//! an item without components, else its components' holding plus 0.1 to 0.5.
//! With RESOURCES > 0 every item is routed to one of them, and each
//! resource's capacity is its mean lot-for-lot load divided by
//! UTILISATION, with a setup time of 5 % of it. Invented data: a benchmark,
//! not a plant.

use std::fmt::Write as _;
use std::path::PathBuf;

use lotwright::model::{BomLine, Calendar, Item, Resource, Routing, Scenario};
use lotwright::single::rules::Rule;

struct Random(u64);

impl Random {
    fn next(&mut self) -> f64 {
        self.0 = self
            .0
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (self.0 >> 11) as f64 / (1u64 << 53) as f64
    }

    fn range(&mut self, low: f64, high: f64) -> f64 {
        low + (high - low) * self.next()
    }

    fn below(&mut self, n: usize) -> usize {
        ((self.next() * n as f64) as usize).min(n - 1)
    }
}

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    if args.len() < 6 {
        eprintln!(
            "usage: bom_instance DIR ITEMS LEVELS WEEKS RESOURCES UTILISATION [SEED [COMMONALITY]]"
        );
        std::process::exit(2);
    }
    let dir = PathBuf::from(&args[0]);
    let number = |k: usize| -> f64 {
        args[k].parse().unwrap_or_else(|_| {
            eprintln!("argument {} must be a number, got {}", k + 1, args[k]);
            std::process::exit(2)
        })
    };
    let count = number(1) as usize;
    let levels = (number(2) as usize).clamp(1, count.max(1));
    let weeks = number(3) as usize;
    let resources = number(4) as usize;
    let utilisation = number(5);
    let seed = if args.len() > 6 { number(6) as u64 } else { 1 };
    let commonality = if args.len() > 7 {
        number(7) as usize
    } else {
        3
    }
    .max(1);
    let mut rng = Random(seed.wrapping_mul(0x9E37_79B9_7F4A_7C15) + 17);

    let level_of = |i: usize| i * levels / count;
    let mut items = Vec::new();
    for i in 0..count {
        let demand: Vec<f64> = if level_of(i) == 0 {
            let mean = rng.range(20.0, 120.0);
            (0..weeks)
                .map(|_| {
                    if rng.next() < 0.3 {
                        0.0
                    } else {
                        (mean * rng.range(0.5, 1.5)).round()
                    }
                })
                .collect()
        } else {
            vec![0.0; weeks]
        };
        let mut item = Item::simple(
            &format!("P{i:04}"),
            &demand,
            rng.range(50.0, 500.0).round(),
            (rng.range(0.2, 2.0) * 100.0).round() / 100.0,
        );
        item.lead_time = rng.below(2);
        item.lot_multiple = Some(1.0);
        items.push(item);
    }
    let mut bom = Vec::new();
    for i in 0..count {
        let level = level_of(i);
        if level == 0 {
            continue;
        }
        let above: Vec<usize> = (0..count).filter(|&p| level_of(p) == level - 1).collect();
        let parents = 1 + rng.below(commonality);
        let mut chosen: Vec<usize> = Vec::new();
        for _ in 0..parents {
            let p = above[rng.below(above.len())];
            if !chosen.contains(&p) {
                chosen.push(p);
            }
        }
        for p in chosen {
            bom.push(BomLine {
                parent: p,
                component: i,
                quantity_per: (1 + rng.below(3)) as f64,
                scrap_rate: 0.0,
            });
        }
    }
    // Value is added on the way up: a parent costs at least its components
    // to hold, plus its own share (common practice in costing).
    for i in (0..count).rev() {
        let components: f64 = bom
            .iter()
            .filter(|line: &&BomLine| line.parent == i)
            .map(|line| line.quantity_per * items[line.component].nominal_holding_cost)
            .sum();
        if components > 0.0 {
            let own = (rng.range(0.1, 0.5) * 100.0).round() / 100.0;
            let h = ((components + own) * 100.0).round() / 100.0;
            items[i].nominal_holding_cost = h;
            items[i].holding_cost = vec![h; weeks];
        }
    }
    let calendar = Calendar {
        start: chrono::NaiveDate::from_ymd_opt(2027, 1, 4).expect("a date"),
        kind: lotwright::model::BucketKind::Week,
        periods: weeks,
    };
    // Stock at the start covers the first two weeks of need, so that lead
    // times do not make the instance infeasible before any order arrives.
    let mut scenario = Scenario {
        name: format!("bom {count} items x {levels} levels x {weeks} weeks"),
        currency: None,
        calendar,
        items,
        resources: Vec::new(),
        routings: Vec::new(),
        bom,
        frozen: 0,
        period_offset: 0,
    };
    let plan = lotwright::solve::run_rule(&scenario, Rule::LotForLot);
    for (item, record) in scenario.items.iter_mut().zip(&plan.evaluation.items) {
        item.initial_stock = record.gross_requirement.iter().take(2).sum::<f64>();
    }
    let mut routing_csv = String::from("item,resource,per_unit,setup_time\n");
    let mut resources_csv = String::from("resource,capacity\n");
    if resources > 0 {
        let plan = lotwright::solve::run_rule(&scenario, Rule::LotForLot);
        let mut load = vec![0.0; resources];
        let mut lots = vec![0usize; resources];
        for (i, record) in plan.evaluation.items.iter().enumerate() {
            let r = i % resources;
            let per_unit = 1.0;
            load[r] += per_unit * record.planned_releases.iter().sum::<f64>();
            lots[r] += record.planned_releases.iter().filter(|&&q| q > 0.0).count();
            scenario.routings.push(Routing {
                item: i,
                resource: r,
                per_unit,
                setup_time: 0.0,
            });
        }
        for r in 0..resources {
            let mean = load[r] / weeks as f64;
            let setup_time = (0.05 * mean * weeks as f64 / lots[r].max(1) as f64).round();
            let capacity =
                ((mean + setup_time * lots[r] as f64 / weeks as f64) / utilisation).round();
            scenario.resources.push(Resource {
                id: format!("R{r}"),
                unit: "capacity units".into(),
                capacity: vec![capacity; weeks],
                overtime_capacity: vec![0.0; weeks],
                overtime_cost: 0.0,
                capacity_cost: None,
            });
            writeln!(resources_csv, "R{r},{capacity}").expect("a string");
            for routing in scenario.routings.iter_mut().filter(|x| x.resource == r) {
                routing.setup_time = setup_time;
            }
        }
        for routing in &scenario.routings {
            writeln!(
                routing_csv,
                "{},R{},{},{}",
                scenario.items[routing.item].id,
                routing.resource,
                routing.per_unit,
                routing.setup_time
            )
            .expect("a string");
        }
    }
    std::fs::create_dir_all(&dir).expect("the folder");
    let write = |name: &str, text: &str| std::fs::write(dir.join(name), text).expect("a file");
    write(
        "scenario.toml",
        &format!(
            "# Seeded benchmark instance (examples/bom_instance.rs, seed {seed}); invented data.\nname = \"{}\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = {weeks}\n",
            scenario.name
        ),
    );
    let mut items_csv = String::from("item,setup_cost,holding_cost,initial_stock,lead_time\n");
    let mut demand_csv = String::from("item,period,quantity\n");
    for item in &scenario.items {
        writeln!(
            items_csv,
            "{},{},{},{},{}",
            item.id,
            item.nominal_setup_cost,
            item.nominal_holding_cost,
            item.initial_stock,
            item.lead_time
        )
        .expect("a string");
        for (t, q) in item.demand.iter().enumerate() {
            if *q > 0.0 {
                writeln!(demand_csv, "{},{},{q}", item.id, t + 1).expect("a string");
            }
        }
    }
    let mut bom_csv = String::from("parent,component,quantity_per\n");
    for line in &scenario.bom {
        writeln!(
            bom_csv,
            "{},{},{}",
            scenario.items[line.parent].id, scenario.items[line.component].id, line.quantity_per
        )
        .expect("a string");
    }
    write("items.csv", &items_csv);
    write("demand.csv", &demand_csv);
    write("bom.csv", &bom_csv);
    if resources > 0 {
        write("resources.csv", &resources_csv);
        write("routing.csv", &routing_csv);
    }
}
