//! End-to-end benchmark for large scenarios: generates each case with the
//! `generate` example, runs the release `lotwright plan --json` on it as a
//! planner would, and prints wall time, peak memory, status, cost, bound and
//! gap per case.
//!
//! ```text
//! cargo build --release --examples && cargo build --release
//! cargo run --release --example scale -- [--time-limit S] [--only TEXT] [--keep DIR]
//! ```
//!
//! Peak memory is the child's high-water mark (VmHWM in /proc), sampled
//! every 5 ms while it runs, so growth in its last few milliseconds can be
//! missed. The data are invented by the seeded generator.

use std::path::{Path, PathBuf};
use std::process::{Command, ExitCode, Stdio};
use std::time::{Duration, Instant};

use clap::Parser;

#[derive(Parser)]
#[command(about = "Time lotwright end to end on generated large scenarios")]
struct Args {
    /// Time limit passed to lotwright for cases with shared capacity.
    #[arg(long, default_value_t = 60.0)]
    time_limit: f64,
    /// Run only the cases whose name contains TEXT.
    #[arg(long)]
    only: Option<String>,
    /// Where to write the generated scenarios (default: a folder in /tmp).
    #[arg(long)]
    keep: Option<PathBuf>,
    /// The lotwright binary.
    #[arg(long, default_value = "target/release/lotwright")]
    lotwright: PathBuf,
    /// The generator binary.
    #[arg(long, default_value = "target/release/examples/generate")]
    generator: PathBuf,
}

/// One case: a name, the generator's arguments, extra arguments of `plan`.
struct Case {
    name: &'static str,
    generate: &'static [&'static str],
    plan: &'static [&'static str],
}

const CASES: [Case; 6] = [
    Case {
        name: "1k-items-52",
        generate: &["--items", "1000", "--periods", "52"],
        plan: &[],
    },
    Case {
        name: "10k-items-52",
        generate: &["--items", "10000", "--periods", "52"],
        plan: &[],
    },
    Case {
        name: "1-item-52000",
        generate: &["--items", "1", "--periods", "52000"],
        plan: &["--method", "exact"],
    },
    Case {
        name: "20-items-52-2res-milp",
        generate: &[
            "--items",
            "20",
            "--periods",
            "52",
            "--resources",
            "2",
            "--routes",
            "2",
            "--utilisation",
            "0.8",
        ],
        plan: &["--method", "exact", "--solver", "milp"],
    },
    Case {
        name: "100-items-52-3res-85pct-seed1",
        generate: &[
            "--items",
            "100",
            "--periods",
            "52",
            "--resources",
            "3",
            "--routes",
            "2",
            "--utilisation",
            "0.85",
            "--setup-share",
            "0.1",
            "--seed",
            "1",
        ],
        plan: &["--method", "exact"],
    },
    Case {
        name: "100-items-52-3res-85pct-seed2",
        generate: &[
            "--items",
            "100",
            "--periods",
            "52",
            "--resources",
            "3",
            "--routes",
            "2",
            "--utilisation",
            "0.85",
            "--setup-share",
            "0.1",
            "--seed",
            "2",
        ],
        plan: &["--method", "exact"],
    },
];

fn main() -> ExitCode {
    let args = Args::parse();
    let root = args.keep.clone().unwrap_or_else(|| {
        std::env::temp_dir().join(format!("lotwright-scale-{}", std::process::id()))
    });
    println!(
        "{:<31} {:>8} {:>9} {:>9} {:>15} {:>15} {:>8}",
        "case", "wall s", "peak MiB", "status", "total cost", "lower bound", "gap"
    );
    for case in CASES
        .iter()
        .filter(|c| args.only.as_deref().is_none_or(|o| c.name.contains(o)))
    {
        let dir = root.join(case.name);
        let _ = std::fs::remove_dir_all(&dir);
        let made = Command::new(&args.generator)
            .args(case.generate)
            .arg(&dir)
            .status();
        if !matches!(made, Ok(s) if s.success()) {
            eprintln!(
                "scale: the generator failed for {} ({})",
                case.name,
                args.generator.display()
            );
            return ExitCode::FAILURE;
        }
        match run(&args, case, &dir) {
            Ok(row) => println!("{row}"),
            Err(message) => {
                eprintln!("scale: {}: {message}", case.name);
                return ExitCode::FAILURE;
            }
        }
    }
    if args.keep.is_none() {
        let _ = std::fs::remove_dir_all(&root);
    }
    ExitCode::SUCCESS
}

/// Runs `plan --json` on one generated scenario and formats its row.
fn run(args: &Args, case: &Case, dir: &Path) -> Result<String, String> {
    let out = dir.with_extension("json");
    let file = std::fs::File::create(&out).map_err(|e| e.to_string())?;
    let started = Instant::now();
    let mut child = Command::new(&args.lotwright)
        .args([
            "plan",
            "--json",
            "--time-limit",
            &args.time_limit.to_string(),
        ])
        .args(case.plan)
        .arg(dir)
        .stdout(file)
        .stderr(Stdio::null())
        .spawn()
        .map_err(|e| format!("cannot run {}: {e}", args.lotwright.display()))?;
    let status_file = format!("/proc/{}/status", child.id());
    let mut peak_kib = 0u64;
    let code = loop {
        if let Some(kib) = high_water(&status_file) {
            peak_kib = peak_kib.max(kib);
        }
        match child.try_wait().map_err(|e| e.to_string())? {
            Some(status) => break status.code(),
            None => std::thread::sleep(Duration::from_millis(5)),
        }
    };
    let wall = started.elapsed().as_secs_f64();
    let text = std::fs::read_to_string(&out).map_err(|e| e.to_string())?;
    let json: serde_json::Value = serde_json::from_str(&text)
        .map_err(|e| format!("exit {code:?}, output is not JSON: {e}"))?;
    let number = |key: &str| {
        json[key]
            .as_f64()
            .map_or("-".to_string(), |x| format!("{x:.2}"))
    };
    let gap = json["gap"]
        .as_f64()
        .map_or("-".to_string(), |g| format!("{:.3}%", 100.0 * g));
    Ok(format!(
        "{:<31} {:>8.2} {:>9.1} {:>9} {:>15} {:>15} {:>8}",
        case.name,
        wall,
        peak_kib as f64 / 1024.0,
        json["status"].as_str().unwrap_or("?"),
        number("total_cost"),
        number("lower_bound"),
        gap
    ))
}

/// The VmHWM line of a /proc status file, in KiB.
fn high_water(path: &str) -> Option<u64> {
    let text = std::fs::read_to_string(path).ok()?;
    let line = text.lines().find(|l| l.starts_with("VmHWM:"))?;
    line.split_whitespace().nth(1)?.parse().ok()
}
