//! Benchmark runner: the capacitated lot-sizing instances of Trigeiro, Thomas
//! and McClain (Management Science 35(3), 1989) solved with the shared-capacity
//! MILP, one table row per instance, then totals and peak memory.
//!
//! ```text
//! cargo run --release --example benchmark -- [--time-limit S]
//!     [--formulation strong|plain|both] [--limit N] [--filter TEXT]
//!     [--replicate LETTER] [--threads N] [--start | --exact] [--whole]
//!     [--reference FILE] [--highs NAME=VALUE] DIR_OR_FILES...
//! ```
//!
//! Each instance becomes a `Scenario` built in code: week buckets, one
//! resource with the instance's capacity in every bucket and no overtime,
//! routings with the per-unit use and setup time, and unit cost 0. The
//! instance's unit cost is the same for every item and bucket, and with no
//! initial or ending stock every plan makes exactly the total demand, so it
//! adds the same constant to every plan and cannot change the optimum.
//!
//! Every plan the MILP returns goes through `eval::evaluate`; the check
//! column says when the solver's own cost or status disagrees with it.

use std::fs;
use std::io::{self, Write};
use std::path::PathBuf;
use std::process::ExitCode;
use std::time::Instant;

use clap::{Parser, ValueEnum};
use lotwright::capacity::milp::{self, MilpOptions, MilpResult, MilpStatus};
use lotwright::capacity::{fix_optimize, staged, Group};
use lotwright::eval::evaluate;
use lotwright::input::literature;
use lotwright::model::{Plan, Scenario};
use lotwright::Error;

mod reference;

#[derive(Parser)]
#[command(about = "Solve Trigeiro-Thomas-McClain instances with the lotwright MILP")]
struct Args {
    /// Time limit of each MILP solve, in seconds.
    #[arg(long, default_value_t = milp::DEFAULT_TIME_LIMIT)]
    time_limit: f64,
    /// Which model to solve; `both` also solves the LP relaxation of each.
    #[arg(long, value_enum, default_value_t = Formulation::Strong)]
    formulation: Formulation,
    /// Solve at most N instances (after filtering, in the order read).
    #[arg(long)]
    limit: Option<usize>,
    /// Keep instances whose file name contains TEXT (repeatable: any may match).
    #[arg(long, value_name = "TEXT")]
    filter: Vec<String>,
    /// Keep instances whose file name ends with this replicate letter.
    #[arg(long, value_name = "LETTER")]
    replicate: Option<char>,
    /// Threads HiGHS may use (HiGHS's own choice if not given).
    #[arg(long)]
    threads: Option<u32>,
    /// Hand HiGHS the library's start plan, as `plan` does (the cheapest
    /// lot rule or smoothed relaxation plan that fits, else what
    /// fix-and-optimize finds in a tenth of the limit); its time counts.
    #[arg(long)]
    start: bool,
    /// Solve as `lotwright plan --method exact` does: the staged MILP
    /// with fix-and-optimize beside it (`capacity::staged::solve`).
    #[arg(long, conflicts_with = "start")]
    exact: bool,
    /// Make every item whole units (lot multiple 1), as a scenario folder
    /// read by `lotwright` is by default; the files' quantities are
    /// continuous otherwise.
    #[arg(long)]
    whole: bool,
    /// A reference file (instance,best_plan,proven,best_bound): adds each
    /// plan's deviation from the best known plan and totals.
    #[arg(long, value_name = "FILE")]
    reference: Option<PathBuf>,
    /// A HiGHS option set after the library's own, as NAME=VALUE
    /// (repeatable; for tuning experiments).
    #[arg(long, value_name = "NAME=VALUE")]
    highs: Vec<String>,
    /// Instance files, or folders (every file in them that looks like an instance).
    #[arg(required = true, value_name = "DIR_OR_FILES")]
    paths: Vec<PathBuf>,
}

#[derive(Clone, Copy, PartialEq, Eq, ValueEnum)]
enum Formulation {
    /// Facility-location model (the library's default).
    Strong,
    /// Textbook big-M stock-flow model.
    Plain,
    /// Both MILPs and both LP relaxations.
    Both,
}

/// One MILP solve, with the evaluation of its plan.
struct Run {
    status: MilpStatus,
    cost: f64,
    bound: f64,
    seconds: f64,
    /// `evaluate(...).total_cost()` and feasibility of the plan, when there is one.
    /// (solver objective when proven optimal, else the evaluated cost; feasible; evaluated cost)
    evaluated: Option<(f64, bool, f64)>,
}

impl Run {
    fn has_plan(&self) -> bool {
        matches!(self.status, MilpStatus::Optimal | MilpStatus::Feasible)
    }

    /// Relative gap in percent, when there is a plan.
    fn gap(&self) -> Option<f64> {
        self.has_plan()
            .then(|| 100.0 * (self.cost - self.bound).max(0.0) / self.cost.abs().max(1e-9))
    }
}

/// Everything measured on one instance.
struct Outcome {
    name: String,
    main: Run,
    /// With `--formulation both`: the plain MILP and the two LP bounds.
    plain: Option<Run>,
    lp_strong: Option<f64>,
    lp_plain: Option<f64>,
    warnings: Vec<String>,
}

enum Failure {
    Input(Error),
    Output(io::Error),
}

impl From<Error> for Failure {
    fn from(e: Error) -> Self {
        Failure::Input(e)
    }
}

impl From<io::Error> for Failure {
    fn from(e: io::Error) -> Self {
        Failure::Output(e)
    }
}

fn main() -> ExitCode {
    match run(Args::parse()) {
        Ok(()) => ExitCode::SUCCESS,
        Err(Failure::Output(e)) if e.kind() == io::ErrorKind::BrokenPipe => ExitCode::SUCCESS,
        Err(Failure::Output(e)) => {
            eprintln!("error: cannot write the table: {e}");
            ExitCode::from(1)
        }
        Err(Failure::Input(e)) => {
            eprintln!("error: {e}");
            ExitCode::from(2)
        }
    }
}

fn run(args: Args) -> Result<(), Failure> {
    if !(args.time_limit.is_finite() && args.time_limit > 0.0) {
        return Err(
            Error::Usage("--time-limit must be a positive number of seconds".into()).into(),
        );
    }
    if args.limit == Some(0) || args.threads == Some(0) {
        return Err(Error::Usage("--limit and --threads must be at least 1".into()).into());
    }
    if args.start && args.formulation == Formulation::Plain {
        return Err(Error::Usage(
            "--start applies to the strong model; it cannot be used with --formulation plain"
                .into(),
        )
        .into());
    }
    let mut highs_options = Vec::new();
    for setting in &args.highs {
        let Some((name, value)) = setting.split_once('=') else {
            return Err(Error::Usage(format!("--highs `{setting}`: expected NAME=VALUE")).into());
        };
        if !milp::highs_option_accepted(name, value) {
            return Err(Error::Usage(format!(
                "--highs `{setting}`: HiGHS does not accept this option or value"
            ))
            .into());
        }
        highs_options.push((name.to_string(), value.to_string()));
    }
    let mut instances = read_instances(&args)?;
    if args.whole {
        for item in instances.iter_mut().flat_map(|s| s.items.iter_mut()) {
            item.lot_multiple = Some(1.0);
        }
    }
    let references = match &args.reference {
        Some(path) => reference::read(path)?,
        None => Default::default(),
    };
    if instances.is_empty() {
        return Err(Error::Usage("no instance matched the paths and filters given".into()).into());
    }
    let both = args.formulation == Formulation::Both;
    let options = |plain, relax| MilpOptions {
        time_limit: args.time_limit,
        gap: None,
        threads: args.threads,
        plain,
        relax,
        highs_options: highs_options.clone(),
        ..MilpOptions::default()
    };
    let mut out = io::stdout().lock();
    let threads = args
        .threads
        .map_or("HiGHS default".to_string(), |t| t.to_string());
    writeln!(
        out,
        "{} instances, time limit {} s per MILP, formulation {}, threads {}, {} cores visible{}{}",
        instances.len(),
        args.time_limit,
        formulation_name(args.formulation),
        threads,
        std::thread::available_parallelism().map_or(0, |n| n.get()),
        match (args.exact, args.start, args.whole) {
            (true, _, true) => ", as plan --method exact, whole units",
            (true, _, false) => ", as plan --method exact",
            (false, true, true) => ", start plan, whole units",
            (false, true, false) => ", start plan",
            (false, false, true) => ", whole units",
            (false, false, false) => "",
        },
        if args.highs.is_empty() {
            String::new()
        } else {
            format!(", HiGHS options {}", args.highs.join(" "))
        },
    )?;
    writeln!(out, "{}", header(both))?;
    out.flush()?;
    let started = Instant::now();
    let mut outcomes = Vec::with_capacity(instances.len());
    let mut compared = Vec::new();
    for scenario in &instances {
        let main_plain = args.formulation == Formulation::Plain;
        let main = if args.exact {
            let group = Group {
                items: all_items(scenario),
                resources: (0..scenario.resources.len()).collect(),
            };
            let result = staged::solve(scenario, &group, &options(false, false));
            checked_run(scenario, result)
        } else if args.start {
            let group = Group {
                items: all_items(scenario),
                resources: (0..scenario.resources.len()).collect(),
            };
            let result = fix_optimize::solve_from_start(scenario, &group, &options(false, false));
            checked_run(scenario, result)
        } else {
            solve(scenario, &options(main_plain, false))
        };
        let mut outcome = Outcome {
            name: scenario.name.clone(),
            main,
            plain: None,
            lp_strong: None,
            lp_plain: None,
            warnings: Vec::new(),
        };
        if both {
            outcome.plain = Some(solve(scenario, &options(true, false)));
            outcome.lp_strong = relaxation(scenario, &options(false, true));
            outcome.lp_plain = relaxation(scenario, &options(true, true));
        }
        outcome.warnings = checks(&outcome);
        let reference = references.get(&outcome.name).copied();
        let mut line = row(&outcome, both);
        if !references.is_empty() {
            let plan = outcome.main.has_plan().then_some(outcome.main.cost);
            let deviation = plan
                .zip(reference)
                .and_then(|(c, r)| reference::deviation(c, &r));
            line += &format!("  vs best {} %", number(deviation, 2));
            compared.push((plan, outcome.main.bound, reference));
        }
        writeln!(out, "{line}")?;
        out.flush()?;
        outcomes.push(outcome);
    }
    write!(out, "{}", totals(&outcomes, args.formulation))?;
    if !references.is_empty() {
        write!(out, "{}", reference::summary(&compared))?;
    }
    writeln!(
        out,
        "wall time {:.1} s; peak memory (VmHWM) {}",
        started.elapsed().as_secs_f64(),
        peak_memory().map_or("unavailable".into(), |kib| format!(
            "{:.1} MiB",
            kib as f64 / 1024.0
        ))
    )?;
    Ok(())
}

fn formulation_name(formulation: Formulation) -> &'static str {
    match formulation {
        Formulation::Strong => "strong (facility location)",
        Formulation::Plain => "plain (big-M)",
        Formulation::Both => "both",
    }
}

// ---------------------------------------------------------------- reading

/// The instances named by the paths, filtered, in order (folders by file
/// name); files in a folder that are not instances are skipped with a note.
fn read_instances(args: &Args) -> Result<Vec<Scenario>, Error> {
    let wanted = |name: &str| {
        (args.filter.is_empty() || args.filter.iter().any(|f| name.contains(f.as_str())))
            && args.replicate.is_none_or(|r| name.ends_with(r))
    };
    let (instances, skipped) =
        literature::read_capacitated_instances(&args.paths, wanted, args.limit)?;
    for path in skipped {
        eprintln!(
            "note: skipped {}: its first line is not `n T`",
            path.display()
        );
    }
    Ok(instances)
}

// ---------------------------------------------------------------- solving

fn all_items(scenario: &Scenario) -> Vec<usize> {
    (0..scenario.items.len()).collect()
}

fn solve(scenario: &Scenario, options: &MilpOptions) -> Run {
    checked_run(
        scenario,
        milp::solve(scenario, &all_items(scenario), options),
    )
}

/// The figures of one solve, its plan checked against `evaluate`.
fn checked_run(scenario: &Scenario, result: MilpResult) -> Run {
    let has_plan = matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible);
    let evaluated = has_plan.then(|| {
        let plan = Plan {
            receipts: result.receipts.clone(),
        };
        let evaluation = evaluate(scenario, &plan);
        (evaluation.total_cost(), evaluation.feasible)
    });
    Run {
        status: result.status,
        cost: result.objective,
        bound: result.lower_bound,
        seconds: result.seconds,
        // A proven optimum's solver objective must be its plan's cost.
        evaluated: evaluated.map(|(cost, feasible)| {
            if result.status == MilpStatus::Optimal {
                (result.solver_objective, feasible, cost)
            } else {
                (cost, feasible, cost)
            }
        }),
    }
}

/// The LP relaxation's value, when HiGHS solved it.
fn relaxation(scenario: &Scenario, options: &MilpOptions) -> Option<f64> {
    let result = milp::solve(scenario, &all_items(scenario), options);
    (result.status == MilpStatus::Optimal).then_some(result.solver_objective)
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-6 * a.abs().max(b.abs()).max(1.0)
}

/// Disagreements between the solver, `evaluate` and the two formulations.
fn checks(outcome: &Outcome) -> Vec<String> {
    let mut warnings = Vec::new();
    let runs = [
        Some(("", &outcome.main)),
        outcome.plain.as_ref().map(|p| ("plain ", p)),
    ];
    for (label, run) in runs.into_iter().flatten() {
        if let Some((solver, feasible, cost)) = run.evaluated {
            if !close(run.cost, cost) || !close(solver, cost) {
                warnings.push(format!("{label}cost {solver:.3} but eval {cost:.3}"));
            }
            if !feasible {
                warnings.push(format!("{label}plan infeasible in eval"));
            }
        }
    }
    let plans: Vec<f64> = runs_with_plan(outcome).map(|r| r.cost).collect();
    let best = plans.iter().copied().fold(f64::INFINITY, f64::min);
    if let Some(plain) = &outcome.plain {
        let main = &outcome.main;
        let both_optimal =
            main.status == MilpStatus::Optimal && plain.status == MilpStatus::Optimal;
        if both_optimal && !close(main.cost, plain.cost) {
            warnings.push("the two optima differ".into());
        }
        for (label, run) in [("strong", main), ("plain", plain)] {
            if run.bound.is_finite() && run.bound > best && !close(run.bound, best) {
                warnings.push(format!("{label} bound above a known plan's cost"));
            }
        }
    }
    for (label, lp) in [("strong", outcome.lp_strong), ("plain", outcome.lp_plain)] {
        if let Some(lp) = lp {
            if lp > best && !close(lp, best) {
                warnings.push(format!("{label} LP above a plan's cost"));
            }
        }
    }
    if let (Some(strong), Some(plain)) = (outcome.lp_strong, outcome.lp_plain) {
        if strong < plain && !close(strong, plain) {
            warnings.push("strong LP below plain LP".into());
        }
    }
    warnings
}

fn runs_with_plan(outcome: &Outcome) -> impl Iterator<Item = &Run> {
    std::iter::once(&outcome.main)
        .chain(outcome.plain.as_ref())
        .filter(|r| r.has_plan())
}

// ---------------------------------------------------------------- rendering

fn number(value: Option<f64>, decimals: usize) -> String {
    match value {
        Some(v) if v.is_finite() => format!("{v:.decimals$}"),
        _ => "-".into(),
    }
}

fn header(both: bool) -> String {
    let mut line = format!(
        "{:<9} {:<10} {:>10} {:>10} {:>7} {:>7}",
        "instance", "status", "cost", "bound", "gap %", "s"
    );
    if both {
        line += &format!(
            " {:>10} {:>10} {:<10} {:>7} {:>7}",
            "LP strong", "LP plain", "plain", "gap %", "s"
        );
    }
    line + " check"
}

fn row(outcome: &Outcome, both: bool) -> String {
    let main = &outcome.main;
    let plan_cost = main.has_plan().then_some(main.cost);
    let bound = main.bound.is_finite().then_some(main.bound);
    let mut line = format!(
        "{:<9} {:<10} {:>10} {:>10} {:>7} {:>7.2}",
        outcome.name,
        main.status.name(),
        number(plan_cost, 1),
        number(bound, 1),
        number(main.gap(), 2),
        main.seconds
    );
    if both {
        let plain = outcome.plain.as_ref();
        line += &format!(
            " {:>10} {:>10} {:<10} {:>7} {:>7}",
            number(outcome.lp_strong, 1),
            number(outcome.lp_plain, 1),
            plain.map_or("-", |p| p.status.name()),
            number(plain.and_then(Run::gap), 2),
            number(plain.map(|p| p.seconds), 2),
        );
    }
    let check = if outcome.warnings.is_empty() {
        "ok".to_string()
    } else {
        format!("WARNING: {}", outcome.warnings.join("; "))
    };
    format!("{line} {check}")
}

/// Totals over the runs of one formulation.
fn summary<'a>(label: &str, runs: impl Iterator<Item = &'a Run>) -> String {
    let runs: Vec<&Run> = runs.collect();
    let count = |s| runs.iter().filter(|r| r.status == s).count();
    let mut seconds: Vec<f64> = runs.iter().map(|r| r.seconds).collect();
    seconds.sort_by(f64::total_cmp);
    let median = match seconds.len() {
        0 => None,
        n if n % 2 == 1 => Some(seconds[n / 2]),
        n => Some((seconds[n / 2 - 1] + seconds[n / 2]) / 2.0),
    };
    let gaps: Vec<f64> = runs.iter().filter_map(|r| r.gap()).collect();
    let mean_gap = (!gaps.is_empty()).then(|| gaps.iter().sum::<f64>() / gaps.len() as f64);
    let max_gap = gaps.iter().copied().reduce(f64::max);
    format!(
        "{label}: {} instances, {} proven optimal, {} feasible, {} no plan, {} infeasible; \
         median {} s; mean gap {} %, max gap {} % (over the {} with a plan)\n",
        runs.len(),
        count(MilpStatus::Optimal),
        count(MilpStatus::Feasible),
        count(MilpStatus::NoPlan),
        count(MilpStatus::Infeasible),
        number(median, 2),
        number(mean_gap, 2),
        number(max_gap, 2),
        gaps.len()
    )
}

fn totals(outcomes: &[Outcome], formulation: Formulation) -> String {
    let both = formulation == Formulation::Both;
    let label = if formulation == Formulation::Plain {
        "  plain "
    } else {
        "  strong"
    };
    let mut text = String::from("totals\n");
    text += &summary(label, outcomes.iter().map(|o| &o.main));
    let warned = outcomes.iter().filter(|o| !o.warnings.is_empty()).count();
    text += &format!("  instances with a warning: {warned}\n");
    if !both {
        return text;
    }
    text += &summary("  plain ", outcomes.iter().filter_map(|o| o.plain.as_ref()));
    // Root gap: how far each LP bound sits below the best plan found.
    let mut strong_gaps = Vec::new();
    let mut plain_gaps = Vec::new();
    for outcome in outcomes {
        let best = runs_with_plan(outcome)
            .map(|r| r.cost)
            .fold(f64::INFINITY, f64::min);
        if !best.is_finite() {
            continue;
        }
        if let (Some(s), Some(p)) = (outcome.lp_strong, outcome.lp_plain) {
            strong_gaps.push(100.0 * (best - s) / best);
            plain_gaps.push(100.0 * (best - p) / best);
        }
    }
    let mean = |v: &[f64]| (!v.is_empty()).then(|| v.iter().sum::<f64>() / v.len() as f64);
    text += &format!(
        "  LP bound below the best plan found: strong {} %, plain {} % (mean over {})\n",
        number(mean(&strong_gaps), 2),
        number(mean(&plain_gaps), 2),
        strong_gaps.len()
    );
    text
}

/// Peak resident memory of this process in KiB, from /proc/self/status.
fn peak_memory() -> Option<u64> {
    let status = fs::read_to_string("/proc/self/status").ok()?;
    let line = status.lines().find_map(|l| l.strip_prefix("VmHWM:"))?;
    line.trim().trim_end_matches("kB").trim().parse().ok()
}
