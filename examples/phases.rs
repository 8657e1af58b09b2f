//! Where the time of `plan --json` goes on a large scenario: reading the
//! folder, the exact method, each lot rule (plan and evaluation), the JSON
//! written to a sink, and freeing it all, each timed on its own.
//!
//! ```text
//! cargo run --release --example generate -- --items 10000 --periods 52 /tmp/g10k
//! cargo run --release --example phases -- /tmp/g10k [--read-only]
//! ```
//!
//! Wall times per phase, in the order `lotwright plan DIR --json` runs
//! them; the parallel phases use every core rayon is given.

use std::time::Instant;

use lotwright::single::rules::Rule;
use lotwright::solve::{self, Outcome};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let dir = std::env::args()
        .nth(1)
        .ok_or("usage: phases SCENARIO_DIR")?;
    let total = Instant::now();
    let mut clock = Instant::now();
    let mut lap = |name: &str| {
        println!("{name:<28} {:>8.3} s", clock.elapsed().as_secs_f64());
        clock = Instant::now();
    };
    let scenario = lotwright::input::read_scenario(std::path::Path::new(&dir))?;
    lap("read the folder");
    if std::env::args().any(|a| a == "--read-only") {
        return Ok(()); // for profiling the reader alone
    }
    let exact = solve::solve_exact(&scenario, &Default::default());
    lap("exact method");
    let mut comparison = vec![exact];
    for rule in Rule::ALL {
        if rule == Rule::FixedLot && scenario.items.iter().all(|i| i.fixed_lot.is_none()) {
            continue;
        }
        comparison.push(solve::run_rule(&scenario, rule));
        lap(rule.name());
    }
    let outcome = Outcome {
        chosen: comparison[0].clone(),
        comparison,
    };
    lap("chosen plan copied");
    let document = lotwright::report::json::plan_document(&scenario, &outcome);
    lap("JSON document prepared");
    let mut sink = std::io::BufWriter::new(std::io::sink());
    serde_json::to_writer_pretty(&mut sink, &document)?;
    lap("JSON written (to a sink)");
    drop(document);
    drop(outcome);
    drop(scenario);
    lap("freed");
    println!("{:<28} {:>8.3} s", "total", total.elapsed().as_secs_f64());
    Ok(())
}
