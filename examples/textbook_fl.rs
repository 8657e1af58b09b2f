//! Side-by-side runner: each Trigeiro-Thomas-McClain instance (Management
//! Science 35(3), 1989) solved twice in one run, once as the textbook
//! facility-location model handed to HiGHS directly and once by lotwright's
//! own MILP (`capacity::milp::solve`), with the same time limit, threads and
//! seed. One table row per instance, then totals.
//!
//! ```text
//! cargo run --release --example textbook_fl -- [--time-limit S] [--threads N]
//!     [--filter TEXT]... [--limit N] [--lp] [--item-capacity-rows] [--exact]
//!     DIR_OR_FILES...
//! ```
//!
//! `--lp` also solves both LP relaxations. `--item-capacity-rows` adds to the
//! textbook model the per-item capacity row that lotwright's model carries
//! (a diagnostic: it is then no longer the plain textbook model).
//!
//! The textbook model is written here from the formulation, apart from the
//! library's model code, so that it can serve as a baseline: the
//! facility-location reformulation of capacitated lot sizing with setup times
//! (Krarup and Bilde 1977; Pochet and Wolsey, "Production Planning by Mixed
//! Integer Programming", Springer 2006). With `y[i][s]` the setup of item i in
//! period s and `x[i][s][t]` the share of item i's demand of period t made in
//! period s <= t:
//!
//! ```text
//! min  sum sc[i][s] y[i][s] + sum d[i][t] (c[i][s] + h[i][s] + ... + h[i][t-1]) x[i][s][t]
//! s.t. sum_{s<=t} x[i][s][t] = 1                      for every t with d[i][t] > 0
//!      x[i][s][t] <= y[i][s]
//!      sum_i (a_i sum_{t>=s} d[i][t] x[i][s][t] + st_i y[i][s]) <= C[s]
//!      x >= 0, y binary
//! ```
//!
//! Nothing else (without `--item-capacity-rows`): no bound of a share by the
//! capacity, no per-item capacity row on the setup. Periods without demand
//! get no share columns, since a share of nothing would force a needless
//! setup. The scenario comes from `input::literature::parse_capacitated`,
//! which leaves the instance's unit cost out (a constant, see
//! docs/benchmarks.md); both models therefore report costs without it. Each model's plan goes through `eval::evaluate`,
//! and the check column flags costs or bounds that contradict each other.

use std::io::{self, Write};
use std::path::PathBuf;
use std::process::ExitCode;
use std::time::Instant;

use clap::Parser;
use good_lp::{constraint, variable, Expression, ProblemVariables, SolverModel, Variable};
use highs::{HighsModelStatus, HighsSolutionStatus};
use lotwright::capacity::milp::{self, MilpOptions, MilpStatus};
use lotwright::eval::evaluate;
use lotwright::input::literature;
use lotwright::model::{Plan, Scenario};

#[derive(Parser)]
#[command(about = "Trigeiro-Thomas-McClain instances: textbook facility location vs lotwright")]
struct Args {
    /// Time limit of each solve (each model gets it), in seconds.
    #[arg(long, default_value_t = 10.0)]
    time_limit: f64,
    /// Threads HiGHS may use in each solve.
    #[arg(long, default_value_t = 1)]
    threads: u32,
    /// Keep instances whose file name contains TEXT (repeatable: any may match).
    #[arg(long, value_name = "TEXT")]
    filter: Vec<String>,
    /// Solve at most N instances (after filtering, in the order read).
    #[arg(long)]
    limit: Option<usize>,
    /// Also solve both LP relaxations and show their values.
    #[arg(long)]
    lp: bool,
    /// Add to the textbook model the one row lotwright's model has beyond
    /// it on these instances (an item's lot at most its capacity net of
    /// setup time, times its setup), to tell that row's effect from noise.
    #[arg(long)]
    item_capacity_rows: bool,
    /// Solve lotwright's side as `plan --method exact` does
    /// (`capacity::staged::solve`: the start plan, fix-and-optimize beside
    /// the MILP on the second core) instead of the MILP alone.
    #[arg(long)]
    exact: bool,
    /// Instance files, or folders (every file in them that looks like an instance).
    #[arg(required = true, value_name = "DIR_OR_FILES")]
    paths: Vec<PathBuf>,
}

/// One solve of one model, with its plan's evaluation.
struct Run {
    status: MilpStatus,
    /// `evaluate(..).total_cost()` of the plan (infinite without a plan).
    cost: f64,
    /// The solver's objective of that plan.
    solver_objective: f64,
    bound: f64,
    seconds: f64,
    feasible: bool,
}

impl Run {
    fn has_plan(&self) -> bool {
        matches!(self.status, MilpStatus::Optimal | MilpStatus::Feasible)
    }

    fn without_plan(status: MilpStatus, bound: f64, seconds: f64) -> Run {
        Run {
            status,
            cost: f64::INFINITY,
            solver_objective: f64::INFINITY,
            bound,
            seconds,
            feasible: false,
        }
    }
}

/// Both models' runs on one instance.
struct Outcome {
    name: String,
    textbook: Run,
    lotwright: Run,
    /// With `--lp`: the LP relaxation values (textbook, lotwright).
    lp: Option<(f64, f64)>,
    warnings: Vec<String>,
}

fn main() -> ExitCode {
    match run(Args::parse()) {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) if e.kind() == io::ErrorKind::BrokenPipe => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("error: {e}");
            ExitCode::from(2)
        }
    }
}

fn run(args: Args) -> io::Result<()> {
    let usage = |m: &str| io::Error::new(io::ErrorKind::InvalidInput, m.to_string());
    if !(args.time_limit.is_finite() && args.time_limit > 0.0) {
        return Err(usage("--time-limit must be a positive number of seconds"));
    }
    if args.limit == Some(0) || args.threads == 0 {
        return Err(usage("--limit and --threads must be at least 1"));
    }
    let instances = read_instances(&args)?;
    if instances.is_empty() {
        return Err(usage("no instance matched the paths and filters given"));
    }
    let mut out = io::stdout().lock();
    writeln!(
        out,
        "{} instances, time limit {} s per solve, threads {}, {} cores visible",
        instances.len(),
        args.time_limit,
        args.threads,
        std::thread::available_parallelism().map_or(0, |n| n.get()),
    )?;
    writeln!(out, "{}", header(args.lp))?;
    out.flush()?;
    let started = Instant::now();
    let mut outcomes = Vec::with_capacity(instances.len());
    for scenario in &instances {
        let options = |relax| MilpOptions {
            time_limit: args.time_limit,
            threads: Some(args.threads),
            relax,
            ..Default::default()
        };
        let textbook_model = |relax| Textbook {
            time_limit: args.time_limit,
            threads: args.threads,
            relax,
            item_capacity_rows: args.item_capacity_rows,
        };
        let textbook = solve_textbook(scenario, &textbook_model(false));
        let lotwright = solve_lotwright(scenario, &options(false), args.exact);
        let lp = args.lp.then(|| {
            let textbook = solve_textbook(scenario, &textbook_model(true));
            let lotwright = solve_lotwright(scenario, &options(true), false);
            let value = |run: Run| {
                if run.status == MilpStatus::Optimal {
                    run.solver_objective
                } else {
                    f64::NAN
                }
            };
            (value(textbook), value(lotwright))
        });
        let warnings = checks(&textbook, &lotwright, lp);
        let outcome = Outcome {
            name: scenario.name.clone(),
            textbook,
            lotwright,
            lp,
            warnings,
        };
        writeln!(out, "{}", row(&outcome))?;
        out.flush()?;
        outcomes.push(outcome);
    }
    write!(out, "{}", totals(&outcomes))?;
    writeln!(out, "wall time {:.1} s", started.elapsed().as_secs_f64())?;
    Ok(())
}

// ---------------------------------------------------------------- reading

/// The instances named by the paths, filtered, in order (folders by file
/// name); in a folder, files whose first line is not `n T` are skipped.
fn read_instances(args: &Args) -> io::Result<Vec<Scenario>> {
    let wanted = |name: &str| {
        args.filter.is_empty() || args.filter.iter().any(|f| name.contains(f.as_str()))
    };
    let (instances, skipped) =
        literature::read_capacitated_instances(&args.paths, wanted, args.limit)
            .map_err(|e| io::Error::new(io::ErrorKind::InvalidData, e.to_string()))?;
    for path in skipped {
        eprintln!(
            "note: skipped {}: its first line is not `n T`",
            path.display()
        );
    }
    for scenario in &instances {
        if let Some(why) = outside_textbook(scenario) {
            let message = format!(
                "{}: the textbook model here does not cover {why}",
                scenario.name
            );
            return Err(io::Error::new(io::ErrorKind::InvalidData, message));
        }
    }
    Ok(instances)
}

/// What the scenario has that the textbook model leaves out, if anything:
/// it assumes no stock at the start or end, no receipts, no lead time, no
/// lot rules, no backlog and no overtime, which is what the literature
/// reader builds.
fn outside_textbook(scenario: &Scenario) -> Option<&'static str> {
    for item in &scenario.items {
        if item.initial_stock != 0.0 || item.safety_stock != 0.0 || item.ending_stock != 0.0 {
            return Some("stock at the start or end");
        }
        if item.receipts.iter().any(|&r| r != 0.0) || item.lead_time != 0 {
            return Some("scheduled receipts or lead times");
        }
        if item.has_lot_constraints() || item.allows_backlog() {
            return Some("lot rules or backlog");
        }
    }
    if scenario
        .resources
        .iter()
        .any(|r| r.overtime_capacity.iter().any(|&o| o != 0.0))
    {
        return Some("overtime");
    }
    None
}

// ---------------------------------------------------------------- solving

/// How to build and solve the textbook model.
struct Textbook {
    time_limit: f64,
    threads: u32,
    /// Solve the LP relaxation only.
    relax: bool,
    /// Add `sum_t d[i][t] x[i][s][t] <= (C[s] - st_i) / a_i * y[i][s]`.
    item_capacity_rows: bool,
}

/// Builds and solves the textbook facility-location model; the time covers
/// building the model and the solve, as `milp::solve`'s does.
fn solve_textbook(scenario: &Scenario, options: &Textbook) -> Run {
    let relax = options.relax;
    let started = Instant::now();
    let periods = scenario.periods();
    let mut vars = ProblemVariables::new();
    let mut objective = Expression::from(0.0);
    let mut rows = Vec::new();
    // HiGHS numbers its columns in the order the variables are made.
    let add = |vars: &mut ProblemVariables, binary: bool| {
        let column = vars.len();
        let definition = if binary && !relax {
            variable().binary()
        } else if binary {
            variable().min(0.0).max(1.0)
        } else {
            variable().min(0.0)
        };
        (vars.add(definition), column)
    };
    let mut setups: Vec<Vec<Variable>> = Vec::new();
    // Per item: (production period s, demand period t, share column).
    let mut shares: Vec<Vec<(usize, usize, Variable, usize)>> = Vec::new();
    for item in &scenario.items {
        let y: Vec<Variable> = (0..periods).map(|_| add(&mut vars, true).0).collect();
        for (s, &setup) in y.iter().enumerate() {
            objective += item.setup_cost[s] * setup;
        }
        let mut item_shares = Vec::new();
        for t in (0..periods).filter(|&t| item.demand[t] > 0.0) {
            let demand = item.demand[t];
            let mut cover = Expression::from(0.0);
            for (s, &setup) in y.iter().enumerate().take(t + 1) {
                let (x, column) = add(&mut vars, false);
                let holding: f64 = item.holding_cost[s..t].iter().sum();
                objective += demand * (item.unit_cost[s] + holding) * x;
                rows.push(constraint::leq(x, setup));
                cover += x;
                item_shares.push((s, t, x, column));
            }
            rows.push(cover.eq(1.0));
        }
        setups.push(y);
        shares.push(item_shares);
    }
    // Capacity: production time and setup time in the production period.
    for (r, resource) in scenario.resources.iter().enumerate() {
        let mut load = vec![Expression::from(0.0); periods];
        for routing in scenario.routings.iter().filter(|x| x.resource == r) {
            let i = routing.item;
            for (s, &setup) in setups[i].iter().enumerate() {
                load[s] += routing.setup_time * setup;
            }
            for &(s, t, x, _) in &shares[i] {
                load[s] += routing.per_unit * scenario.items[i].demand[t] * x;
            }
        }
        if options.item_capacity_rows {
            for routing in scenario
                .routings
                .iter()
                .filter(|x| x.resource == r && x.per_unit > 0.0)
            {
                let i = routing.item;
                let mut lot = vec![Expression::from(0.0); periods];
                for &(s, t, x, _) in &shares[i] {
                    lot[s] += scenario.items[i].demand[t] * x;
                }
                for (s, lot) in lot.into_iter().enumerate() {
                    let room = (resource.capacity[s] - routing.setup_time) / routing.per_unit;
                    rows.push(lot.leq(room * setups[i][s]));
                }
            }
        }
        for (s, load) in load.into_iter().enumerate() {
            rows.push(load.leq(resource.capacity[s]));
        }
    }
    let mut problem = vars
        .minimise(objective)
        .using(good_lp::solvers::highs::highs);
    for row in rows {
        problem.add_constraint(row);
    }
    let elapsed = |started: Instant| started.elapsed().as_secs_f64();
    let Ok(mut model) = problem.try_into_inner() else {
        return Run::without_plan(MilpStatus::NoPlan, f64::NEG_INFINITY, elapsed(started));
    };
    model.make_quiet();
    model.set_option("time_limit", options.time_limit);
    model.set_option("mip_rel_gap", 1e-6);
    model.set_option("random_seed", 1);
    model.set_option("threads", options.threads as i32);
    let Ok(solved) = model.try_solve() else {
        return Run::without_plan(MilpStatus::NoPlan, f64::NEG_INFINITY, elapsed(started));
    };
    let seconds = elapsed(started);
    let bound = solved
        .double_info_value(c"mip_dual_bound")
        .unwrap_or(f64::NEG_INFINITY);
    match solved.status() {
        HighsModelStatus::Infeasible | HighsModelStatus::UnboundedOrInfeasible => {
            return Run::without_plan(MilpStatus::Infeasible, f64::INFINITY, seconds);
        }
        _ if solved.primal_solution_status() != HighsSolutionStatus::Feasible => {
            return Run::without_plan(MilpStatus::NoPlan, bound, seconds);
        }
        _ => {}
    }
    if relax {
        let value = solved.objective_value();
        let status = if solved.status() == HighsModelStatus::Optimal {
            MilpStatus::Optimal
        } else {
            MilpStatus::NoPlan
        };
        return Run {
            status,
            cost: value,
            solver_objective: value,
            bound: value,
            seconds,
            feasible: false,
        };
    }
    let solution = solved.get_solution();
    let values = solution.columns();
    // Receipts: each share times its demand, noise below 1e-6 rounded away
    // (the demands are whole numbers).
    let receipts: Vec<Vec<f64>> = shares
        .iter()
        .enumerate()
        .map(|(i, item_shares)| {
            let mut receipt = vec![0.0; periods];
            for &(s, t, _, column) in item_shares {
                receipt[s] += scenario.items[i].demand[t] * values[column];
            }
            receipt
                .into_iter()
                .map(|q| {
                    if (q - q.round()).abs() <= 1e-6 {
                        q.round()
                    } else {
                        q
                    }
                })
                .collect()
        })
        .collect();
    let evaluation = evaluate(scenario, &Plan { receipts });
    Run {
        status: if solved.status() == HighsModelStatus::Optimal {
            MilpStatus::Optimal
        } else {
            MilpStatus::Feasible
        },
        cost: evaluation.total_cost(),
        solver_objective: solved.objective_value(),
        bound,
        seconds,
        feasible: evaluation.feasible,
    }
}

/// The library's model on all items as one component.
fn solve_lotwright(scenario: &Scenario, options: &MilpOptions, exact: bool) -> Run {
    let items: Vec<usize> = (0..scenario.items.len()).collect();
    let result = if exact {
        let group = lotwright::capacity::Group {
            items,
            resources: (0..scenario.resources.len()).collect(),
        };
        lotwright::capacity::staged::solve(scenario, &group, options)
    } else {
        milp::solve(scenario, &items, options)
    };
    if !matches!(result.status, MilpStatus::Optimal | MilpStatus::Feasible) {
        return Run::without_plan(result.status, result.lower_bound, result.seconds);
    }
    let evaluation = evaluate(
        scenario,
        &Plan {
            receipts: result.receipts,
        },
    );
    Run {
        status: result.status,
        cost: evaluation.total_cost(),
        solver_objective: result.solver_objective,
        bound: result.lower_bound,
        seconds: result.seconds,
        feasible: evaluation.feasible,
    }
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-6 * a.abs().max(b.abs()).max(1.0)
}

/// Contradictions between the two models and the evaluation.
fn checks(textbook: &Run, lotwright: &Run, lp: Option<(f64, f64)>) -> Vec<String> {
    let mut warnings = Vec::new();
    for (label, run) in [("textbook", textbook), ("lotwright", lotwright)] {
        if !run.has_plan() {
            continue;
        }
        if !run.feasible {
            warnings.push(format!("{label} plan infeasible in eval"));
        }
        if run.status == MilpStatus::Optimal && !close(run.cost, run.solver_objective) {
            let (solver, cost) = (run.solver_objective, run.cost);
            warnings.push(format!("{label} objective {solver:.3} but eval {cost:.3}"));
        }
    }
    let both_optimal =
        textbook.status == MilpStatus::Optimal && lotwright.status == MilpStatus::Optimal;
    if both_optimal && !close(textbook.cost, lotwright.cost) {
        warnings.push("the two optima differ".into());
    }
    // Either model's proven bound must not exceed a plan of the other.
    for (label, run, other) in [
        ("textbook", textbook, lotwright),
        ("lotwright", lotwright, textbook),
    ] {
        if other.has_plan() && run.bound > other.cost && !close(run.bound, other.cost) {
            warnings.push(format!("{label} bound above the other's plan"));
        }
    }
    // An LP relaxation bounds both models' plans from below.
    let best = textbook.cost.min(lotwright.cost);
    if let Some((lp_textbook, lp_lotwright)) = lp {
        for (label, value) in [("textbook", lp_textbook), ("lotwright", lp_lotwright)] {
            if value > best && !close(value, best) {
                warnings.push(format!("{label} LP above a plan's cost"));
            }
        }
    }
    warnings
}

// ---------------------------------------------------------------- rendering

fn number(value: f64, decimals: usize) -> String {
    if value.is_finite() {
        format!("{value:.decimals$}")
    } else {
        "-".into()
    }
}

fn header(lp: bool) -> String {
    let mut line = format!(
        "{:<9} | {:<8} {:>9} {:>9} {:>6} | {:<8} {:>9} {:>9} {:>6} |",
        "instance", "textbook", "cost", "bound", "s", "lotwrght", "cost", "bound", "s"
    );
    if lp {
        line += &format!(" {:>9} {:>9} |", "LP text", "LP lotw");
    }
    line + " check"
}

fn cells(run: &Run) -> String {
    format!(
        "{:<8} {:>9} {:>9} {:>6.2}",
        run.status.name(),
        number(run.cost, 1),
        number(run.bound, 1),
        run.seconds
    )
}

fn row(outcome: &Outcome) -> String {
    let mut line = format!(
        "{:<9} | {} | {} |",
        outcome.name,
        cells(&outcome.textbook),
        cells(&outcome.lotwright)
    );
    if let Some((textbook, lotwright)) = outcome.lp {
        line += &format!(" {:>9} {:>9} |", number(textbook, 1), number(lotwright, 1));
    }
    if outcome.warnings.is_empty() {
        line + " ok"
    } else {
        format!("{line} WARNING: {}", outcome.warnings.join("; "))
    }
}

fn median(values: &mut [f64]) -> f64 {
    values.sort_by(f64::total_cmp);
    match values.len() {
        0 => f64::NAN,
        n if n % 2 == 1 => values[n / 2],
        n => (values[n / 2 - 1] + values[n / 2]) / 2.0,
    }
}

fn summary(label: &str, runs: &[&Run]) -> String {
    let optimal = runs
        .iter()
        .filter(|r| r.status == MilpStatus::Optimal)
        .count();
    let with_plan = runs.iter().filter(|r| r.has_plan()).count();
    let mut seconds: Vec<f64> = runs.iter().map(|r| r.seconds).collect();
    let mean = seconds.iter().sum::<f64>() / seconds.len() as f64;
    format!(
        "  {label:<9}: {optimal} of {} proven optimal, {with_plan} with a plan; \
         median {:.2} s, mean {:.2} s\n",
        runs.len(),
        median(&mut seconds),
        mean
    )
}

/// Solved counts, times, the geometric mean of lotwright's time over the
/// textbook model's (below 1: lotwright is faster), and with `--lp` how far
/// each LP bound sits below the best plan found.
fn totals(outcomes: &[Outcome]) -> String {
    let textbook: Vec<&Run> = outcomes.iter().map(|o| &o.textbook).collect();
    let lotwright: Vec<&Run> = outcomes.iter().map(|o| &o.lotwright).collect();
    let geometric = |ratios: &[f64]| {
        let logs: f64 = ratios.iter().map(|r| r.ln()).sum();
        (logs / ratios.len() as f64).exp()
    };
    let ratio = |o: &Outcome| o.lotwright.seconds / o.textbook.seconds;
    let all: Vec<f64> = outcomes.iter().map(ratio).collect();
    let closed: Vec<f64> = outcomes
        .iter()
        .filter(|o| {
            o.textbook.status == MilpStatus::Optimal && o.lotwright.status == MilpStatus::Optimal
        })
        .map(ratio)
        .collect();
    let mut text = String::from("totals\n");
    text += &summary("textbook", &textbook);
    text += &summary("lotwright", &lotwright);
    text += &format!(
        "  time lotwright / textbook, geometric mean: {} over all {}, {} over the {} both proved\n",
        number(geometric(&all), 2),
        all.len(),
        number(geometric(&closed), 2),
        closed.len()
    );
    let mut below = (Vec::new(), Vec::new());
    for outcome in outcomes {
        let best = outcome.textbook.cost.min(outcome.lotwright.cost);
        if let (Some((t, l)), true) = (outcome.lp, best.is_finite()) {
            below.0.push(100.0 * (best - t) / best);
            below.1.push(100.0 * (best - l) / best);
        }
    }
    if !below.0.is_empty() {
        let mean = |v: &[f64]| v.iter().sum::<f64>() / v.len() as f64;
        text += &format!(
            "  LP bound below the best plan found: textbook {} %, lotwright {} % (mean over {})\n",
            number(mean(&below.0), 2),
            number(mean(&below.1), 2),
            below.0.len()
        );
    }
    let warned = outcomes.iter().filter(|o| !o.warnings.is_empty()).count();
    text += &format!("  instances with a warning: {warned}\n");
    text
}
