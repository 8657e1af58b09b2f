//! The command line: clap definitions, the commands, exit codes. This
//! is the only code that prints or exits.

mod init;
mod output;
mod progress;

use std::io::Write;
use std::path::PathBuf;

use clap::{Args, Parser, Subcommand};

use lotwright::error::{Error, Result};
use lotwright::report::{self, table::Detail};
use lotwright::single::eoq;
use lotwright::single::eoq_units::{self, TimeUnit};
use lotwright::solve::{self, Status};

#[derive(Parser)]
#[command(
    name = "lotwright",
    version,
    about = "Least-cost production and purchase lots from a demand forecast, compared with the lot rules in use",
    after_help = "Exit codes: 0 done; 1 the scenario has no feasible plan; 2 bad input or usage; 3 internal error; 4 the time limit ran out before any plan was found."
)]
pub struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Solve a scenario folder and compare the plan with the lot rules.
    Plan(PlanArgs),
    /// Evaluate a proposed plan (planned orders) against a scenario.
    Check(CheckArgs),
    /// Plan two scenarios (or one and a changed copy) and set them side by side.
    Compare(CompareArgs),
    /// Replan bucket by bucket over a folder of forecast snapshots and
    /// report realised cost, service and plan stability by method.
    Roll(RollArgs),
    /// The classic economic order quantity and its variants.
    Eoq(EoqArgs),
    /// Write a small, explained starter scenario into a new or empty folder.
    Init(InitArgs),
}

#[derive(Args)]
struct InitArgs {
    /// The folder to create (it may exist if it is empty).
    dir: PathBuf,
}

#[derive(Args)]
struct PlanArgs {
    /// The scenario folder (scenario.toml, items.csv, demand.csv, ...).
    dir: PathBuf,
    /// Run only this method: exact (also called optimal), lot-for-lot, fixed-lot, eoq, poq,
    /// silver-meal, least-unit-cost or part-period-balancing.
    #[arg(long)]
    method: Option<String>,
    /// Print one JSON object on stdout instead of tables.
    #[arg(long)]
    json: bool,
    /// Write the plan files into this folder (created whole, or not at
    /// all): plan.csv, comparison.csv, records.csv, load.csv, plan.xlsx and
    /// report.html.
    #[arg(long, value_name = "DIR")]
    out: Option<PathBuf>,
    /// Replace an existing output folder.
    #[arg(long)]
    force: bool,
    /// Show the bucket records of every item.
    #[arg(long)]
    detail: bool,
    /// Show the bucket records of this item (repeatable).
    #[arg(long = "item", value_name = "ID")]
    items: Vec<String>,
    #[command(flatten)]
    freeze: Freeze,
    #[command(flatten)]
    limits: Limits,
}

/// The frozen horizon, over scenario.toml's.
#[derive(Args)]
struct Freeze {
    /// Freeze the first N periods: no new order is released there, only
    /// firm orders (orders-firm.csv) and receipts; overrides frozen_periods
    /// in scenario.toml (0 unfreezes).
    #[arg(long, value_name = "N")]
    frozen: Option<usize>,
    /// A target cycle service level (for example 0.95): an item that gives
    /// forecast_error (items.csv) gets a safety stock of k x forecast_error
    /// x sqrt(lead time + 1), where that is above its own; in roll, the
    /// forecast errors seen in the history set it too.
    #[arg(long, value_name = "P")]
    service_level: Option<f64>,
}

impl Freeze {
    /// Reads the scenario and applies the freeze asked for.
    fn read(&self, dir: &std::path::Path) -> Result<lotwright::model::Scenario> {
        let mut scenario = lotwright::input::read_scenario(dir)?;
        if let Some(frozen) = self.frozen {
            if frozen >= scenario.periods() {
                return Err(Error::usage(format!(
                    "--frozen {frozen} leaves nothing to plan: the horizon has {} periods, so freeze at most {}",
                    scenario.periods(),
                    scenario.periods() - 1
                )));
            }
            scenario.frozen = frozen;
        }
        if let Some(level) = self.service_level {
            if !(level.is_finite() && (0.5..1.0).contains(&level)) {
                return Err(Error::usage(format!(
                    "--service-level must be a fraction from 0.5 up to 1 (0.95 = 95 %), got {level}"
                )));
            }
            lotwright::model::safety::apply(&mut scenario, level);
        }
        Ok(scenario)
    }
}

/// Limits of the MILP for items that share capacity.
#[derive(Args)]
struct Limits {
    /// Seconds the MILP may run in all (default 60). On time out the best
    /// plan is returned with its lower bound and gap, marked not proven.
    #[arg(long, value_name = "S")]
    time_limit: Option<f64>,
    /// Stop the MILP once the relative gap is at most G (e.g. 0.01); the
    /// plan is then reported as feasible with its gap, not as optimal.
    #[arg(long, value_name = "G")]
    gap: Option<f64>,
    /// Threads HiGHS may use (default: its own choice).
    #[arg(long, value_name = "N")]
    threads: Option<u32>,
    /// What plans a group of items that share resources: milp (exact, for
    /// groups HiGHS can close), lagrangean (relaxation and smoothing),
    /// fix-and-optimize (relaxation, then MILP subproblems), or auto (the
    /// MILP up to 2000 setup decisions, items times buckets, else
    /// fix-and-optimize). Heuristics report a proven lower bound and gap.
    #[arg(long, value_name = "NAME", default_value = "auto")]
    solver: String,
    /// The solver's random seed (default 1). Runs with the same seed,
    /// threads and --nodes give the same plan.
    #[arg(long, value_name = "N")]
    seed: Option<u32>,
    /// Stop each MILP after N branch-and-bound nodes: a limit of work that
    /// stops at the same point on every run, where a run cut short by
    /// --time-limit may differ from the next. The time limit still applies.
    #[arg(long, value_name = "N")]
    nodes: Option<u64>,
}

use lotwright::capacity::GroupSolver;

impl Limits {
    fn milp(&self) -> Result<lotwright::capacity::milp::MilpOptions> {
        let mut options = lotwright::capacity::milp::MilpOptions::default();
        if let Some(seconds) = self.time_limit {
            if !(seconds.is_finite() && seconds > 0.0) {
                return Err(Error::usage(format!(
                    "--time-limit must be a positive number of seconds, got {seconds}"
                )));
            }
            options.time_limit = seconds;
        }
        if let Some(gap) = self.gap {
            if !(gap.is_finite() && (0.0..1.0).contains(&gap)) {
                return Err(Error::usage(format!(
                    "--gap must be a fraction from 0 up to 1 (0.01 = 1 %), got {gap}"
                )));
            }
            options.gap = Some(gap);
        }
        if let Some(threads) = self.threads {
            if threads == 0 {
                return Err(Error::usage("--threads must be at least 1"));
            }
            options.threads = Some(threads);
        }
        if let Some(seed) = self.seed {
            options.seed = seed;
        }
        if let Some(nodes) = self.nodes {
            if nodes == 0 {
                return Err(Error::usage("--nodes must be at least 1"));
            }
            options.nodes = Some(nodes);
        }
        options.solver = GroupSolver::parse(&self.solver).ok_or_else(|| {
            Error::usage(format!(
                "unknown solver `{}`; choose one of {}",
                self.solver,
                GroupSolver::NAMES.join(", ")
            ))
        })?;
        Ok(options)
    }
}

#[derive(Args)]
struct CheckArgs {
    /// The scenario folder.
    dir: PathBuf,
    /// The proposed orders: item, period or date (receipt bucket), quantity.
    #[arg(long, value_name = "FILE")]
    orders: PathBuf,
    /// Print one JSON object on stdout instead of tables.
    #[arg(long)]
    json: bool,
    /// Exit with code 1 when the proposal is not feasible.
    #[arg(long)]
    strict: bool,
    /// Check the proposal alone: do not solve the scenario for the best
    /// plan (best_cost is then null, and only past-due and release-now
    /// actions are given).
    #[arg(long)]
    no_solve: bool,
    #[command(flatten)]
    freeze: Freeze,
    #[command(flatten)]
    limits: Limits,
}

#[derive(Args)]
struct CompareArgs {
    /// The first scenario folder (A).
    a: PathBuf,
    /// The second scenario folder (B); without it, B is A changed by --set.
    b: Option<PathBuf>,
    /// Change B: KEY[.ID]=N sets every bucket to N, KEY[.ID]=N% scales to N
    /// percent, KEY[.ID]=+N or -N adds or takes away N in every bucket,
    /// +N% or -N% raises or lowers by N percent. Keys: capacity and overtime (of a resource, or all),
    /// demand, setup_cost, holding_cost and unit_cost (of an item, or all),
    /// frozen_periods. Repeatable, applied in order.
    #[arg(long = "set", value_name = "KEY=VALUE")]
    set: Vec<String>,
    /// Plan both with this method (default: exact).
    #[arg(long)]
    method: Option<String>,
    /// Print one JSON object on stdout instead of tables.
    #[arg(long)]
    json: bool,
    /// Write compare.html (both plans side by side, with charts) and
    /// compare.json into this folder (created whole, or not at all).
    #[arg(long, value_name = "DIR")]
    out: Option<PathBuf>,
    /// Replace an existing output folder.
    #[arg(long)]
    force: bool,
    /// List every item that differs, not only the first ones.
    #[arg(long)]
    detail: bool,
    #[command(flatten)]
    freeze: Freeze,
    #[command(flatten)]
    limits: Limits,
}

#[derive(Args)]
struct RollArgs {
    /// The scenario folder; its periods must cover the whole run and the
    /// planning horizon after the last week.
    dir: PathBuf,
    /// The folder of forecast snapshots, one per bucket, named by the date
    /// the bucket starts (2027-01-04.csv), laid out like demand.csv.
    #[arg(long, value_name = "DIR")]
    history: PathBuf,
    /// Buckets each plan looks ahead.
    #[arg(long, value_name = "N", default_value_t = 13)]
    horizon: usize,
    /// Run only this method (repeatable): exact or a rule's name. Default:
    /// the exact method and every rule.
    #[arg(long = "method", value_name = "NAME")]
    methods: Vec<String>,
    /// Price a change of plan: an order in a bucket where the previous plan
    /// had none of that item costs C more, one where it had one C less
    /// (down to a setup cost of 0). The exact method then runs with and
    /// without it; the realised cost does not include it. Several values
    /// (0,100,400, or the option repeated) run the exact method once per
    /// value and show the frontier of realised cost against instability.
    #[arg(long, value_name = "C", value_delimiter = ',')]
    change_cost: Vec<f64>,
    /// Price each unit moved: every plan pays U x |x - p| for each item and
    /// release bucket the previous plan covers, x its release and p the
    /// previous plan's. Several values as with --change-cost; given with
    /// it, the exact method runs once per pair (C, U) and shows the
    /// frontier.
    #[arg(long, value_name = "U", value_delimiter = ',')]
    change_cost_per_unit: Vec<f64>,
    /// Charge the setups in each plan's last buckets only for the share of
    /// an economic cycle (the EOQ's time between orders) that falls inside
    /// the plan, so that plans do not stretch their last lots to the
    /// horizon's end; every method of the run plans with it.
    #[arg(long)]
    end_correction: bool,
    /// Print one JSON object on stdout instead of tables.
    #[arg(long)]
    json: bool,
    /// Write the run's files into this folder (created whole, or not at
    /// all): realised.csv, stability.csv, weeks.csv and report.html.
    #[arg(long, value_name = "DIR")]
    out: Option<PathBuf>,
    /// Replace an existing output folder.
    #[arg(long)]
    force: bool,
    #[command(flatten)]
    freeze: Freeze,
    /// Seconds each week's MILP may run (default 5); a plan cut short is
    /// reported as feasible with its gap.
    #[arg(long, value_name = "S")]
    time_limit: Option<f64>,
    /// Threads HiGHS may use (default: its own choice).
    #[arg(long, value_name = "N")]
    threads: Option<u32>,
    /// The solver's random seed (default 1), as for plan.
    #[arg(long, value_name = "N")]
    seed: Option<u32>,
    /// Stop each week's MILP after N branch-and-bound nodes (as for plan):
    /// with it, a run gives the same plans every time.
    #[arg(long, value_name = "N")]
    nodes: Option<u64>,
}

/// Demand, holding cost, production rate and backorder cost must all be
/// given per the same time unit (all per year, or all per week): a yearly
/// demand with a weekly holding cost gives a lot about 7 times too large.
/// Name the unit with --time-unit to have the result checked against the
/// calendar; the command warns when the time between orders is under a
/// day or over a year, or (with --unit-cost) when the holding cost is not
/// 2 to 100 % of the unit cost a year.
#[derive(Args)]
struct EoqArgs {
    /// Demand per time unit (for example per year); the same time unit as
    /// the holding cost.
    #[arg(long)]
    demand: f64,
    /// Cost of one setup or order.
    #[arg(long, alias = "order-cost")]
    setup_cost: f64,
    /// Holding cost per unit per time unit: the same time unit as the
    /// demand (per year with a yearly demand).
    #[arg(long)]
    holding_cost: Option<f64>,
    /// The time unit demand and holding cost share: day, week, month or
    /// year. Optional; with it the cycle is also given in days and checked.
    #[arg(long, value_name = "UNIT", value_parser = ["day", "week", "month", "year"])]
    time_unit: Option<String>,
    /// Cost of one unit, to check the holding cost against (with
    /// --time-unit); the price paid is used under --price-breaks.
    #[arg(long)]
    unit_cost: Option<f64>,
    /// Finite production rate, per time unit (the EPQ model).
    #[arg(long)]
    production_rate: Option<f64>,
    /// Cost per unit backordered per time unit (planned backorders).
    #[arg(long)]
    backorder_cost: Option<f64>,
    /// All-units quantity discounts: Q:PRICE,... (a price holds from its
    /// break quantity upward, inclusive).
    #[arg(long, value_name = "Q:PRICE,...")]
    price_breaks: Option<String>,
    /// Holding cost as a fraction of the unit price per time unit (with
    /// --price-breaks).
    #[arg(long)]
    carrying_rate: Option<f64>,
    /// A chosen lot size, to see its cost penalty against the optimum.
    #[arg(long)]
    lot: Option<f64>,
    /// Print one JSON object on stdout.
    #[arg(long)]
    json: bool,
}

/// Runs the command line and returns the process exit code.
pub fn run() -> i32 {
    let cli = match Cli::try_parse() {
        Ok(cli) => cli,
        Err(e) => {
            let code = if e.use_stderr() { 2 } else { 0 };
            let _ = e.print();
            return code;
        }
    };
    let result = match cli.command {
        Command::Plan(args) => plan(args),
        Command::Check(args) => check(args),
        Command::Compare(args) => compare(args),
        Command::Roll(args) => roll_command(args),
        Command::Eoq(args) => eoq_command(args),
        Command::Init(args) => init_command(args),
    };
    match result {
        Ok(code) => code,
        Err(e) => {
            eprintln!("lotwright: {e}");
            e.exit_code()
        }
    }
}

/// Writes to stdout; a closed pipe (`| head`) ends quietly.
fn emit(text: &str) -> Result<()> {
    let mut stdout = std::io::stdout().lock();
    match stdout
        .write_all(text.as_bytes())
        .and_then(|_| stdout.flush())
    {
        Ok(()) => Ok(()),
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        Err(e) => Err(Error::Output {
            path: PathBuf::from("<stdout>"),
            message: e.to_string(),
        }),
    }
}

/// Writes JSON to stdout as it is serialised (no copy of the whole text in
/// memory); a closed pipe ends quietly.
fn emit_json(value: &impl serde::Serialize) -> Result<()> {
    let stdout = std::io::stdout().lock();
    let mut writer = std::io::BufWriter::with_capacity(1 << 16, stdout);
    let written = serde_json::to_writer_pretty(&mut writer, value)
        .map_err(std::io::Error::from)
        .and_then(|_| writer.write_all(b"\n"))
        .and_then(|_| writer.flush());
    match written {
        Ok(()) => Ok(()),
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        Err(e) => Err(Error::Output {
            path: PathBuf::from("<stdout>"),
            message: e.to_string(),
        }),
    }
}

fn plan(args: PlanArgs) -> Result<i32> {
    let milp = args.limits.milp()?;
    let scenario = args.freeze.read(&args.dir)?;
    for id in &args.items {
        if scenario.item_index(id).is_none() {
            return Err(Error::usage(format!(
                "--item {id}: no such item in items.csv"
            )));
        }
    }
    // Check the output folder before the work, so a bad path fails early.
    let target = match &args.out {
        Some(out) => Some(output::Target::prepare(out, &args.dir, args.force)?),
        None => None,
    };
    let options = solve::Options {
        method: args.method.clone(),
        milp,
    };
    let spinner = progress::Spinner::new(!args.json);
    let outcome = solve::plan_scenario_with(&scenario, &options, &spinner);
    spinner.finish();
    let outcome = outcome?;
    if let Some(target) = target {
        target.write(&[
            ("plan.csv", report::csv::plan(&scenario, &outcome)),
            (
                "comparison.csv",
                report::csv::comparison(&scenario, &outcome),
            ),
            ("records.csv", report::csv::records(&scenario, &outcome)),
            ("load.csv", report::csv::load(&scenario, &outcome)),
            ("plan.xlsx", report::xlsx::plan(&scenario, &outcome)?),
            (
                "report.html",
                report::html::plan(&scenario, &outcome).into_bytes(),
            ),
        ])?;
    }
    if args.json {
        emit_json(&report::json::plan_document(&scenario, &outcome))?;
    } else {
        let detail = Detail {
            all: args.detail,
            items: args.items.clone(),
        };
        emit(&report::table::plan(&scenario, &outcome, &detail))?;
    }
    // Only the exact method can tell that the scenario has no feasible
    // plan; a rule's infeasible plan says nothing about the scenario.
    let code = if !outcome.chosen.is_exact() {
        0
    } else {
        match outcome.chosen.status {
            Status::Optimal | Status::Feasible => 0,
            Status::Infeasible => 1,
            Status::Unknown => 4,
        }
    };
    // The process ends next and the system takes its memory back whole;
    // freeing the plans and records of many items one by one would only
    // cost time (half a second at 100,000 items).
    std::mem::forget(outcome);
    std::mem::forget(scenario);
    Ok(code)
}

fn check(args: CheckArgs) -> Result<i32> {
    let milp = args.limits.milp()?;
    let scenario = args.freeze.read(&args.dir)?;
    let proposal = lotwright::input::read_orders(&args.orders, &scenario)?;
    let report = if args.no_solve {
        lotwright::check::check_only(&scenario, &proposal)
    } else {
        lotwright::check::check(&scenario, &proposal, &milp)
    };
    if args.json {
        emit_json(&report::json::check(&scenario, &report))?;
    } else {
        emit(&report::table::check(&scenario, &report))?;
    }
    Ok(if report.best_status == Some(Status::Unknown) {
        4
    } else if args.strict && !report.evaluation.feasible {
        1
    } else {
        0
    })
}

fn compare(args: CompareArgs) -> Result<i32> {
    use lotwright::compare::{apply, parse_override, Comparison, Side};
    let milp = args.limits.milp()?;
    let overrides = args
        .set
        .iter()
        .map(|text| parse_override(text))
        .collect::<Result<Vec<_>>>()?;
    let b_dir = match (&args.b, overrides.is_empty()) {
        (None, true) => {
            return Err(Error::usage(
                "compare needs a second scenario folder, or --set changes to make B from A (for example --set capacity=120%)",
            ))
        }
        (Some(b), _) => b.clone(),
        (None, false) => args.a.clone(),
    };
    let a = args.freeze.read(&args.a)?;
    let mut b = args.freeze.read(&b_dir)?;
    for o in &overrides {
        apply(&mut b, o)?;
    }
    let target = match &args.out {
        Some(out) => {
            output::Target::prepare(out, &b_dir, args.force)?;
            Some(output::Target::prepare(out, &args.a, args.force)?)
        }
        None => None,
    };
    let options = solve::Options {
        method: args.method.clone(),
        milp,
    };
    let spinner = progress::Spinner::new(!args.json);
    let planned = solve::plan_scenario_with(&a, &options, &spinner).and_then(|planned_a| {
        solve::plan_scenario_with(&b, &options, &spinner).map(|planned_b| (planned_a, planned_b))
    });
    spinner.finish();
    let (planned_a, planned_b) = planned?;
    let (result_a, result_b) = (planned_a.chosen, planned_b.chosen);
    let mut b_name = b_dir.display().to_string();
    if !overrides.is_empty() {
        // Each change as typed, and what it does in words (a signed value
        // is an addition, which the bare text may not make plain).
        let changes: Vec<String> = overrides
            .iter()
            .map(|o| format!("{} ({})", o.text, report::notes::change(o)))
            .collect();
        b_name = format!("{b_name} with {}", changes.join(", "));
    }
    let comparison = Comparison::new(
        Side {
            name: args.a.display().to_string(),
            scenario: a,
            result: result_a,
        },
        Side {
            name: b_name,
            scenario: b,
            result: result_b,
        },
    );
    let value = report::json::compare(&comparison);
    if let Some(target) = target {
        let json = serde_json::to_vec_pretty(&value).map_err(|e| Error::Internal(e.to_string()))?;
        target.write(&[
            (
                "compare.html",
                report::html::compare(&comparison).into_bytes(),
            ),
            ("compare.json", json),
        ])?;
    }
    if args.json {
        emit_json(&value)?;
    } else {
        emit(&report::table::compare(&comparison, args.detail))?;
    }
    let statuses = [comparison.a.result.status, comparison.b.result.status];
    if !comparison.a.result.is_exact() {
        return Ok(0);
    }
    Ok(if statuses.contains(&Status::Unknown) {
        4
    } else if statuses.contains(&Status::Infeasible) {
        1
    } else {
        0
    })
}

fn roll_command(args: RollArgs) -> Result<i32> {
    use lotwright::roll::{roll, RollOptions};
    let limits = Limits {
        time_limit: Some(args.time_limit.unwrap_or(5.0)),
        gap: None,
        threads: args.threads,
        solver: "auto".into(),
        seed: args.seed,
        nodes: args.nodes,
    };
    let milp = limits.milp()?;
    if args.horizon == 0 {
        return Err(Error::usage("--horizon must be at least 1 bucket"));
    }
    let prices = |values: &[f64], option: &str| -> Result<Vec<f64>> {
        let mut kept: Vec<f64> = Vec::new();
        for &c in values {
            if !(c.is_finite() && c >= 0.0) {
                return Err(Error::usage(format!(
                    "{option} must be a number of 0 or more, got {c}"
                )));
            }
            if !kept.contains(&c) {
                kept.push(c);
            }
        }
        if kept.is_empty() {
            kept.push(0.0);
        }
        Ok(kept)
    };
    let change_costs = prices(&args.change_cost, "--change-cost")?;
    let per_unit_costs = prices(&args.change_cost_per_unit, "--change-cost-per-unit")?;
    // Every pair (C, U) priced; (0, 0) is the exact method's own run.
    let settings: Vec<(f64, f64)> = change_costs
        .iter()
        .flat_map(|&c| per_unit_costs.iter().map(move |&u| (c, u)))
        .filter(|&(c, u)| c > 0.0 || u > 0.0)
        .collect();
    let frontier = settings.len() > 1 || per_unit_costs.iter().any(|&u| u > 0.0);
    let change_cost = change_costs.iter().copied().fold(0.0, f64::max);
    let scenario = args.freeze.read(&args.dir)?;
    let frozen = scenario.frozen;
    if frozen >= args.horizon {
        return Err(Error::usage(format!(
            "a freeze of {frozen} buckets leaves nothing to plan in a horizon of {}; freeze fewer or look further ahead",
            args.horizon
        )));
    }
    let history = lotwright::input::read_history(&args.history, &scenario)?;
    // Check the output folder before the run, so a bad path fails early;
    // neither the scenario nor the history folder may be written over.
    let target = match &args.out {
        Some(out) => {
            output::Target::prepare(out, &args.history, args.force)?;
            Some(output::Target::prepare(out, &args.dir, args.force)?)
        }
        None => None,
    };
    let mut methods: Vec<String> = if args.methods.is_empty() {
        solve::METHOD_NAMES
            .iter()
            .filter(|m| **m != "fixed-lot" || scenario.items.iter().any(|i| i.fixed_lot.is_some()))
            .map(|m| m.to_string())
            .collect()
    } else {
        args.methods.clone()
    };
    for m in &mut methods {
        if m == "optimal" {
            *m = solve::EXACT.to_string();
        }
        if !solve::METHOD_NAMES.contains(&m.as_str()) {
            return Err(Error::usage(format!(
                "unknown method {m}; choose one of {}",
                solve::METHOD_NAMES.join(", ")
            )));
        }
    }
    let mut runs: Vec<(String, f64, f64)> = Vec::new();
    for m in &methods {
        runs.push((m.clone(), 0.0, 0.0));
        if m == solve::EXACT {
            runs.extend(settings.iter().map(|&(c, u)| (m.clone(), c, u)));
        }
    }
    let progress = progress::RollLine::new(!args.json);
    // The runs are independent: they run at once, as many as there are
    // cores, and keep their order.
    let results: Vec<lotwright::roll::RollResult> = {
        use rayon::prelude::*;
        runs.into_par_iter()
            .with_max_len(1)
            .map(|(method, cost, per_unit)| {
                let options = RollOptions {
                    horizon: args.horizon,
                    frozen,
                    change_cost: cost,
                    change_cost_per_unit: per_unit,
                    method,
                    milp: milp.clone(),
                    service_level: args.freeze.service_level,
                    end_correction: args.end_correction,
                };
                let mut result = roll(&scenario, &history, &options, &progress)?;
                if settings.len() > 1 && (cost > 0.0 || per_unit > 0.0) {
                    // Several priced runs of one method need names of
                    // their own.
                    result.label = report::table::priced_label(&result);
                }
                Ok(result)
            })
            .collect::<Result<Vec<_>>>()?
    };
    progress.finish();
    let run = report::table::RollRun {
        scenario: &scenario,
        weeks: history.len(),
        first: history.first().map_or(0, |s| s.bucket),
        horizon: args.horizon,
        frozen,
        change_cost,
        frontier,
        time_limit: milp.time_limit,
        results: &results,
        end_correction: args.end_correction,
        safety: args.freeze.service_level.map(|level| {
            (
                level,
                lotwright::roll::safety_estimates(&scenario, &history, level, history.len()),
            )
        }),
    };
    if let Some(target) = target {
        target.write(&[
            ("realised.csv", report::csv::roll_realised(&run)),
            ("stability.csv", report::csv::roll_stability(&run)),
            ("weeks.csv", report::csv::roll_weeks(&run)),
            ("report.html", report::html::roll(&run).into_bytes()),
        ])?;
    }
    if args.json {
        emit_json(&report::json::roll(&run))?;
    } else {
        emit(&report::table::roll(&run))?;
    }
    Ok(0)
}

fn init_command(args: InitArgs) -> Result<i32> {
    init::write(&args.dir)?;
    emit(&format!(
        "Wrote a starter scenario into {} ({} files; README.txt explains them). Try: lotwright plan {}\n",
        args.dir.display(),
        init::FILES.len(),
        args.dir.display()
    ))?;
    Ok(0)
}

fn eoq_command(args: EoqArgs) -> Result<i32> {
    let price_breaks = match &args.price_breaks {
        Some(text) => Some(eoq::parse_price_breaks(text)?),
        None => None,
    };
    let input = eoq::EoqInput {
        demand: args.demand,
        setup_cost: args.setup_cost,
        holding_cost: args.holding_cost,
        production_rate: args.production_rate,
        backorder_cost: args.backorder_cost,
        price_breaks,
        carrying_rate: args.carrying_rate,
        lot: args.lot,
    };
    let result = eoq::solve(&input)?;
    let time_unit = args.time_unit.as_deref().map(|unit| match unit {
        "day" => TimeUnit::Day,
        "week" => TimeUnit::Week,
        "month" => TimeUnit::Month,
        _ => TimeUnit::Year,
    });
    if let Some(cost) = args.unit_cost {
        if !(cost.is_finite() && cost > 0.0) {
            return Err(Error::Usage(format!(
                "--unit-cost {cost} must be a number above 0"
            )));
        }
    }
    let hints = eoq_units::check(&result, time_unit, args.unit_cost);
    if args.json {
        let value = report::eoq::json(&result, time_unit, &hints)?;
        emit_json(&value)?;
    } else {
        emit(&report::eoq::text(&result, time_unit, &hints))?;
    }
    Ok(0)
}
