//! The mixed-integer program for items that share resources, solved by HiGHS
//! through good_lp.
//!
//! Items without backlog use the facility-location reformulation (Krarup and
//! Bilde 1977; see Pochet and Wolsey, "Production Planning by Mixed Integer
//! Programming", Springer 2006, ch. 7): `z[j][t]` is the share of bucket t's
//! net requirement received in bucket j, so `z[j][t] <= y[j]` is as tight as
//! the convex hull of the single-item uncapacitated problem, which the
//! textbook big-M model is far from. A surplus variable carries what lot
//! constraints force beyond the need. Items that allow backlog use the
//! stock-flow model with split stock and backlog, with every big-M tightened
//! by the remaining need, the maximum lot and the capacity net of setup time.
//!
//! Capacity, setup time and overtime fall in the release bucket (receipt
//! minus lead time), as in `eval`.

use std::time::Instant;

use good_lp::{constraint, variable, Expression, ProblemVariables, SolverModel, Variable};
use highs::HighsModelStatus;

use crate::eval::{evaluate, quantity_tolerance};
use crate::model::{Item, Plan, Scenario};
use crate::single::exact::shift;

/// Limits for the solve.
#[derive(Debug, Clone)]
pub struct MilpOptions {
    pub time_limit: f64,
    /// Relative gap at which HiGHS may stop; `None` proves optimality to 1e-6.
    pub gap: Option<f64>,
    pub threads: Option<u32>,
    /// Use the plain big-M model for every item (for the benchmark's
    /// comparison of formulations).
    pub plain: bool,
    /// Solve the LP relaxation only (for the benchmark's bound comparison).
    pub relax: bool,
    /// Let lot counts (whole units, lot multiples) be fractional while the
    /// setups stay binary: a relaxation whose bound holds for the whole
    /// problem and which HiGHS solves far faster (`staged`).
    pub relax_multiples: bool,
    /// Find the least extra capacity that makes the plan possible instead
    /// of the least cost (for explaining infeasible capacity).
    pub extra_capacity: bool,
    /// Where HiGHS may write its log while it solves (the command line
    /// reads it to show progress); `None` keeps it quiet.
    pub log_file: Option<std::path::PathBuf>,
    /// Setups fixed from outside (fix-and-optimize): by item of the
    /// component and receipt bucket, `Some(open)` fixes the setup, `None`
    /// leaves it to the solver.
    pub fixed: Option<Vec<Vec<Option<bool>>>>,
    /// A cost per unit of capacity used beyond capacity and overtime, so
    /// that every setup pattern has a plan (fix-and-optimize's search; a
    /// plan that uses it overloads and is not feasible).
    pub elastic: Option<f64>,
    /// A plan to start from (receipts by item of the component), handed to
    /// HiGHS as its first incumbent.
    pub start: Option<Vec<Vec<f64>>>,
    /// What plans groups of several items (the `solve` module reads it;
    /// this function always solves the MILP).
    pub solver: super::GroupSolver,
    /// Once set, HiGHS stops at its next check and the solve returns what
    /// it has (`interrupt`; the search beside the MILP stops this way).
    pub interrupt: Option<std::sync::Arc<std::sync::atomic::AtomicBool>>,
    /// HiGHS options set after the library's own (name, value), for
    /// tuning experiments: `true`/`false`, whole numbers and decimals are
    /// passed as such, anything else as text.
    pub highs_options: Vec<(String, String)>,
    /// HiGHS's random seed (its search breaks ties with it).
    pub seed: u32,
    /// Branch-and-bound nodes each MILP may explore: a limit of work that,
    /// unlike the time limit, stops at the same point on every run, so that
    /// a plan cut short repeats for the same seed and threads. It also
    /// keeps the search beside the MILP (`beside`) out, whose result
    /// depends on timing.
    pub nodes: Option<u64>,
}

impl Default for MilpOptions {
    fn default() -> Self {
        MilpOptions {
            time_limit: DEFAULT_TIME_LIMIT,
            gap: None,
            threads: None,
            plain: false,
            relax: false,
            relax_multiples: false,
            extra_capacity: false,
            log_file: None,
            fixed: None,
            elastic: None,
            start: None,
            solver: super::GroupSolver::Auto,
            interrupt: None,
            highs_options: Vec::new(),
            seed: DEFAULT_SEED,
            nodes: None,
        }
    }
}

/// HiGHS's random seed unless the planner gives one.
pub const DEFAULT_SEED: u32 = 1;

/// The time limit of a solve unless the planner sets one, in seconds.
pub const DEFAULT_TIME_LIMIT: f64 = 60.0;
/// The relative gap under which a plan counts as proven optimal.
pub const OPTIMALITY_GAP: f64 = 1e-6;

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MilpStatus {
    Optimal,
    /// Stopped by the time limit or the planner's gap, with a plan.
    Feasible,
    Infeasible,
    /// Stopped by the time limit before any plan was found.
    NoPlan,
}

impl MilpStatus {
    /// The status in words, as tables print it.
    pub fn name(self) -> &'static str {
        match self {
            MilpStatus::Optimal => "optimal",
            MilpStatus::Feasible => "feasible",
            MilpStatus::NoPlan => "no plan",
            MilpStatus::Infeasible => "infeasible",
        }
    }
}

#[derive(Debug, Clone)]
pub struct MilpResult {
    pub status: MilpStatus,
    /// Receipts by item of the component (in the order given), by bucket.
    pub receipts: Vec<Vec<f64>>,
    /// The cost of the returned plan, as `eval` computes it. At a time
    /// limit HiGHS's incumbent may pay for a setup with nothing received;
    /// the plan drops it, so this can be below `solver_objective`.
    pub objective: f64,
    /// HiGHS's objective value of its incumbent (constant included); equal
    /// to `objective` when the solve is proven optimal.
    pub solver_objective: f64,
    /// HiGHS's proven lower bound (constant included).
    pub lower_bound: f64,
    pub seconds: f64,
    pub hit_time_limit: bool,
    /// With `extra_capacity`: (resource, release bucket, capacity missing).
    pub shortfall: Vec<(usize, usize, f64)>,
}

/// Columns of one item in the model.
struct ItemColumns {
    /// Setup binaries by receipt bucket (`None` before the lead time).
    setup: Vec<Option<Variable>>,
    /// Receipt quantity by bucket, as an expression.
    quantity: Vec<Expression>,
}

/// Solves the component made of `items` (indices into the scenario) and all
/// resources their routings touch.
pub fn solve(scenario: &Scenario, items: &[usize], options: &MilpOptions) -> MilpResult {
    let started = Instant::now();
    let periods = scenario.periods();
    let mut vars = ProblemVariables::new();
    let mut objective = Expression::from(0.0);
    let mut slack_total = Expression::from(0.0);
    let mut slacks = Vec::new();
    let mut constant = 0.0;
    let mut constraints = Vec::new();
    let mut columns = Vec::with_capacity(items.len());
    // Integer columns and the value a start plan gives them.
    let mut start_values: Vec<(Variable, f64)> = Vec::new();
    let binary = |vars: &mut ProblemVariables| {
        if options.relax {
            vars.add(variable().min(0.0).max(1.0))
        } else {
            vars.add(variable().binary())
        }
    };
    for (k, &i) in items.iter().enumerate() {
        let item = &scenario.items[i];
        let cap = capacity_bounds(
            scenario,
            i,
            options.extra_capacity || options.elastic.is_some(),
        );
        let mut setup = vec![None; periods];
        let fixed = |j: usize| options.fixed.as_ref().and_then(|f| f[k][j]);
        for (j, slot) in setup.iter_mut().enumerate().skip(item.lead_time) {
            if fixed(j) == Some(false) {
                continue;
            }
            let y = binary(&mut vars);
            objective += item.setup_cost[j - item.lead_time] * y;
            if cap[j] <= 0.0 {
                constraints.push(constraint::eq(y, 0.0));
            } else if fixed(j) == Some(true) {
                constraints.push(constraint::eq(y, 1.0));
            }
            if let Some(start) = &options.start {
                let open = start[k][j] > 0.0 || fixed(j) == Some(true);
                start_values.push((y, if open { 1.0 } else { 0.0 }));
            }
            *slot = Some(y);
        }
        let quantity = if item.allows_backlog() || options.plain {
            flow_model(
                item,
                &setup,
                &cap,
                &mut vars,
                &mut objective,
                &mut constant,
                &mut constraints,
                options.plain,
            )
        } else {
            location_model(
                item,
                &setup,
                &cap,
                &mut vars,
                &mut objective,
                &mut constant,
                &mut constraints,
            )
        };
        let counts = lot_constraints(
            item,
            &setup,
            &quantity,
            &mut vars,
            &mut constraints,
            options.relax || options.relax_multiples,
        );
        if let (Some(start), Some(multiple)) = (&options.start, item.lot_multiple) {
            for (j, count) in counts {
                start_values.push((count, (start[k][j] / multiple).round()));
            }
        }
        change_columns(
            item,
            &quantity,
            &mut vars,
            &mut objective,
            &mut constant,
            &mut constraints,
        );
        columns.push(ItemColumns { setup, quantity });
    }
    // Capacity by resource and release bucket, with overtime.
    for (r, resource) in scenario.resources.iter().enumerate() {
        let routed: Vec<(usize, &crate::model::Routing)> = items
            .iter()
            .enumerate()
            .filter_map(|(k, &i)| {
                scenario
                    .routings
                    .iter()
                    .find(|x| x.item == i && x.resource == r)
                    .map(|x| (k, x))
            })
            .collect();
        if routed.is_empty() {
            continue;
        }
        for t in 0..periods {
            let mut load = Expression::from(0.0);
            let mut any = false;
            for &(k, routing) in &routed {
                let item = &scenario.items[items[k]];
                let j = t + item.lead_time;
                if j >= periods {
                    continue;
                }
                if let Some(y) = columns[k].setup[j] {
                    load += routing.setup_time * y;
                    load.add_mul(routing.per_unit, columns[k].quantity[j].clone());
                    any = true;
                }
            }
            if !any {
                continue;
            }
            let overtime_capacity = resource.overtime_capacity[t];
            if overtime_capacity > 0.0 {
                let overtime = vars.add(variable().min(0.0).max(overtime_capacity));
                objective += resource.overtime_cost * overtime;
                load -= overtime;
            }
            if options.extra_capacity {
                let extra = vars.add(variable().min(0.0));
                load -= extra;
                slack_total += extra;
                slacks.push((r, t, extra));
            } else if let Some(penalty) = options.elastic {
                let extra = vars.add(variable().min(0.0));
                objective += penalty * extra;
                load -= extra;
            }
            constraints.push(load.leq(resource.capacity[t]));
        }
    }
    // HiGHS numbers its columns in the order the variables were made.
    let index: std::collections::HashMap<Variable, usize> = vars
        .iter_variables_with_def()
        .enumerate()
        .map(|(k, (v, _))| (v, k))
        .collect();
    // In extra-capacity mode only the capacity added counts.
    let goal = if options.extra_capacity {
        slack_total
    } else {
        objective
    };
    let mut problem = vars.minimise(goal).using(good_lp::solvers::highs::highs);
    for c in constraints {
        problem.add_constraint(c);
    }
    let Ok(mut model) = problem.try_into_inner() else {
        return failed(periods, items.len(), started);
    };
    // On a cost grid a gap below one step proves optimality (PRODUCT.md).
    let grid = if options.extra_capacity || options.elastic.is_some() {
        None
    } else {
        cost_grid(scenario, items)
    };
    configure(&mut model, options, grid.map_or(1e-9, |g| g * 0.99));
    if options.start.is_some() {
        // Only the integer columns are given; HiGHS finds the rest by
        // solving the LP with them fixed.
        let mut start = vec![0.0; index.len()];
        for (v, value) in &start_values {
            start[index[v]] = *value;
        }
        // A start HiGHS cannot use is only a lost head start.
        // (HiGHS logs "MIP start solution is feasible" when it takes it.)
        let _ = model.try_set_solution(Some(&start), None, None, None);
    }

    let Ok(solved) = model.try_solve() else {
        return failed(periods, items.len(), started);
    };
    // A model with no rows and columns left (nothing to decide: no need)
    // is solved by its constant: optimal.
    let empty = matches!(solved.status(), HighsModelStatus::ModelEmpty);
    let status = if empty {
        HighsModelStatus::Optimal
    } else {
        solved.status()
    };
    let seconds = started.elapsed().as_secs_f64();
    // Read as a number: on a model that presolve empties HiGHS reports -1,
    // which the bindings' typed reader refuses with a panic. HiGHS's
    // code for a feasible solution is 2 (kSolutionStatusFeasible); an
    // emptied model solved to optimality has its (trivial) plan too.
    let has_plan = solved.int_info_value(c"primal_solution_status") == Ok(2)
        || matches!(status, HighsModelStatus::Optimal);
    let hit_time_limit = matches!(status, HighsModelStatus::ReachedTimeLimit);
    if matches!(
        status,
        HighsModelStatus::Infeasible | HighsModelStatus::UnboundedOrInfeasible
    ) {
        return MilpResult {
            status: MilpStatus::Infeasible,
            receipts: vec![vec![0.0; periods]; items.len()],
            objective: f64::INFINITY,
            solver_objective: f64::INFINITY,
            lower_bound: f64::INFINITY,
            seconds,
            hit_time_limit: false,
            shortfall: Vec::new(),
        };
    }
    if !has_plan {
        return MilpResult {
            status: MilpStatus::NoPlan,
            receipts: vec![vec![0.0; periods]; items.len()],
            objective: f64::INFINITY,
            solver_objective: f64::INFINITY,
            lower_bound: solved
                .double_info_value(c"mip_dual_bound")
                .unwrap_or(f64::NEG_INFINITY)
                + constant,
            seconds,
            hit_time_limit,
            shortfall: Vec::new(),
        };
    }
    let solution = solved.get_solution();
    let values = solution.columns();
    let objective_value = solved.objective_value() + constant;
    let dual_bound = if options.relax || empty {
        objective_value
    } else {
        solved
            .double_info_value(c"mip_dual_bound")
            .map(|b| b + constant)
            .unwrap_or(f64::NEG_INFINITY)
    };
    let solution_values = Values {
        columns: values,
        index: &index,
    };
    let receipts: Vec<Vec<f64>> = columns
        .iter()
        .zip(items)
        .map(|(c, &i)| settle(&scenario.items[i], c, &solution_values))
        .collect();
    let evaluation = evaluate(
        &scenario.subset(items),
        &Plan {
            receipts: receipts.clone(),
        },
    );
    if empty && !evaluation.feasible && !options.extra_capacity && options.elastic.is_none() {
        // Nothing left to decide, and the plan without orders falls short
        // (need before the lead time has passed): no plan exists.
        return MilpResult {
            lower_bound: f64::INFINITY,
            ..MilpResult::without_plan(MilpStatus::Infeasible, periods, items.len(), started)
        };
    }
    let plan_cost = evaluation.total_cost();
    // Proof is judged on the plan returned, as evaluated, not on HiGHS's
    // own objective: the two differ when settling the solver's noise
    // changes the plan. (With extra capacity or priced overload the
    // objective is not the plan's cost, and an LP relaxation's fractional
    // setups are no plan; there HiGHS's own is judged.)
    // With relaxed lot counts the settled plan is rounded to multiples and
    // is not the relaxation's solution either.
    let judged = if options.extra_capacity
        || options.elastic.is_some()
        || options.relax
        || options.relax_multiples
    {
        objective_value
    } else {
        plan_cost
    };
    let gap = if judged.abs() > 1e-9 {
        (judged - dual_bound) / judged.abs()
    } else {
        judged - dual_bound
    };
    let below_grid = grid.is_some_and(|g| judged - dual_bound < g * 0.99 + 1e-9);
    let proven =
        matches!(status, HighsModelStatus::Optimal) && (gap <= OPTIMALITY_GAP || below_grid);
    let shortfall = slacks
        .iter()
        .map(|&(r, t, v)| (r, t, values[index[&v]]))
        .filter(|&(_, _, amount)| amount > 1e-6)
        .collect();
    MilpResult {
        status: if proven {
            MilpStatus::Optimal
        } else {
            MilpStatus::Feasible
        },
        receipts,
        objective: plan_cost,
        solver_objective: objective_value,
        lower_bound: dual_bound.min(plan_cost),
        seconds,
        hit_time_limit,
        shortfall,
    }
}

/// The price per unit moved away from an earlier plan
/// (`model::QuantityChange`), exactly: in each release bucket r the earlier
/// plan covers, two nonnegative deviation columns with x - p = up - down
/// cost per_unit x (up + down). At the optimum one of them is 0, so the
/// pair costs per_unit x |x - p|. Here x is the planned quantity received
/// at r + lead time (firm orders are taken out by `crate::replan` before
/// a program sees them; any left are added to x). A bucket whose receipt
/// falls beyond the horizon has no order to decide: its price is a
/// constant.
pub(crate) fn change_columns(
    item: &Item,
    quantity: &[Expression],
    vars: &mut ProblemVariables,
    objective: &mut Expression,
    constant: &mut f64,
    constraints: &mut Vec<good_lp::Constraint>,
) {
    let Some(change) = item.quantity_change.as_ref().filter(|c| c.per_unit > 0.0) else {
        return;
    };
    let periods = quantity.len();
    for (r, previous) in change.previous.iter().enumerate() {
        let Some(previous) = *previous else { continue };
        let j = r + item.lead_time;
        let firm = item.firm.get(j).copied().unwrap_or(0.0);
        if j >= periods {
            *constant += change.per_unit * (firm - previous).abs();
            continue;
        }
        let up = vars.add(variable().min(0.0));
        let down = vars.add(variable().min(0.0));
        *objective += change.per_unit * up + change.per_unit * down;
        constraints.push(constraint::eq(
            quantity[j].clone() - up + down,
            previous - firm,
        ));
    }
}

/// Sets one HiGHS option, the value read as a flag, a whole number, a
/// decimal or else text; false when HiGHS refuses the name or the value.
/// The HiGHS options every program here runs with: quiet, or logging to
/// the file the command line reads; the time limit, the relative gap (or
/// the proof tolerance) and `abs_gap`; a fixed seed, so that a run can be
/// repeated; the threads asked for; then the user's own options
/// (`MilpOptions::highs_options`, checked beforehand with
/// `highs_option_accepted`).
pub(crate) fn configure(model: &mut highs::Model, options: &MilpOptions, abs_gap: f64) {
    model.make_quiet();
    if let Some(path) = &options.log_file {
        model.set_option("log_to_console", false);
        model.set_option("log_file", path.to_string_lossy().as_ref());
        model.set_option("output_flag", true);
    }
    model.set_option("time_limit", options.time_limit.max(0.01));
    model.set_option("mip_rel_gap", options.gap.unwrap_or(OPTIMALITY_GAP * 0.99));
    model.set_option("mip_abs_gap", abs_gap);
    model.set_option("random_seed", options.seed.min(i32::MAX as u32) as i32);
    if let Some(nodes) = options.nodes {
        model.set_option("mip_max_nodes", nodes.min(i32::MAX as u64) as i32);
    }
    if let Some(threads) = options.threads {
        model.set_option("threads", threads as i32);
    }
    for (name, value) in &options.highs_options {
        let _ = apply_highs_option(model, name, value);
    }
    if let Some(flag) = &options.interrupt {
        super::interrupt::watch(model, flag);
    }
}

pub(crate) fn apply_highs_option(model: &mut highs::Model, name: &str, value: &str) -> bool {
    let set = if let Ok(flag) = value.parse::<bool>() {
        model.try_set_option(name, flag)
    } else if let Ok(whole) = value.parse::<i32>() {
        model.try_set_option(name, whole)
    } else if let Ok(number) = value.parse::<f64>() {
        model.try_set_option(name, number)
    } else {
        model.try_set_option(name, value)
    };
    set.is_ok()
}

/// Whether HiGHS takes this option name and value (see
/// `MilpOptions::highs_options`).
pub fn highs_option_accepted(name: &str, value: &str) -> bool {
    let mut model = highs::RowProblem::default().optimise(highs::Sense::Minimise);
    model.make_quiet();
    apply_highs_option(&mut model, name, value)
}

/// The step every plan's cost of these items moves in, when there is one:
/// every quantity whole (a whole lot multiple on every item; whole demand,
/// stock, receipts and floors) and every cost a whole number of steps of
/// 10^-d for some d up to 6 (cents: d = 2). With overtime on a resource,
/// per-unit and setup times and capacities must have at most e decimals
/// (e up to 6), so that the overtime a plan needs is a whole number of
/// steps of 10^-e, and its cost one of overtime_cost * 10^-e, which joins
/// the other costs in finding d. Then two plans' costs differ by at
/// least one step, and a gap below it proves optimality.
pub fn cost_grid(scenario: &Scenario, items: &[usize]) -> Option<f64> {
    let whole = |x: f64| (x - x.round()).abs() <= 1e-9 * x.abs().max(1.0);
    let mut costs: Vec<f64> = Vec::new();
    for &i in items {
        let item = &scenario.items[i];
        let multiple = item.lot_multiple?;
        let quantities = item.demand.iter().chain(&item.receipts).chain([
            &multiple,
            &item.initial_stock,
            &item.safety_stock,
            &item.ending_stock,
        ]);
        if !quantities.into_iter().all(|&q| whole(q)) {
            return None;
        }
        if let Some(change) = &item.quantity_change {
            // |x - p| is whole when p is; its price then joins the grid.
            if !change.previous.iter().flatten().all(|&p| whole(p)) {
                return None;
            }
            costs.push(change.per_unit);
        }
        costs.extend(&item.setup_cost);
        costs.extend(&item.unit_cost);
        costs.extend(&item.holding_cost);
        costs.extend(item.backlog_cost);
        for routing in scenario.routings_of(i) {
            let resource = &scenario.resources[routing.resource];
            if resource.overtime_capacity.iter().any(|&o| o > 0.0) {
                // Overtime is a sum of times less a capacity: with whole
                // quantities, a whole number of steps of 10^-d when every
                // time and limit has at most d decimals, so its cost is a
                // whole number of steps of overtime_cost * 10^-d.
                let times = [routing.per_unit, routing.setup_time];
                let limits = resource.capacity.iter().chain(&resource.overtime_capacity);
                let values: Vec<f64> = times.iter().chain(limits).copied().collect();
                let decimals = (0..=6).find(|&d| {
                    let scale = 10f64.powi(d);
                    values.iter().all(|&x| whole(x * scale))
                })?;
                costs.push(resource.overtime_cost / 10f64.powi(decimals));
            }
        }
    }
    (0..=6).find_map(|d| {
        let scale = 10f64.powi(d);
        costs.iter().all(|&c| whole(c * scale)).then(|| 1.0 / scale)
    })
}

/// Column values looked up by variable, to evaluate expressions.
struct Values<'a> {
    columns: &'a [f64],
    index: &'a std::collections::HashMap<Variable, usize>,
}

impl good_lp::Solution for Values<'_> {
    fn status(&self) -> good_lp::SolutionStatus {
        good_lp::SolutionStatus::Optimal
    }

    fn value(&self, variable: Variable) -> f64 {
        self.index
            .get(&variable)
            .and_then(|&k| self.columns.get(k))
            .copied()
            .unwrap_or(0.0)
    }
}

fn failed(periods: usize, items: usize, started: Instant) -> MilpResult {
    MilpResult::without_plan(MilpStatus::NoPlan, periods, items, started)
}

impl MilpResult {
    /// A result with no plan (infinite cost, no bound) and this status.
    pub(crate) fn without_plan(
        status: MilpStatus,
        periods: usize,
        items: usize,
        started: Instant,
    ) -> MilpResult {
        MilpResult {
            status,
            receipts: vec![vec![0.0; periods]; items],
            objective: f64::INFINITY,
            solver_objective: f64::INFINITY,
            lower_bound: f64::NEG_INFINITY,
            seconds: started.elapsed().as_secs_f64(),
            hit_time_limit: false,
            shortfall: Vec::new(),
        }
    }
}

/// The receipts of one item from the solution: a quantity in a bucket
/// whose setup column is below one half is solver noise (a setup HiGHS
/// treats as closed within its integrality tolerance) and joins the
/// item's latest earlier open lot, or the next one when there is none;
/// every quantity is then snapped.
fn settle(item: &Item, columns: &ItemColumns, values: &Values) -> Vec<f64> {
    let mut raw: Vec<f64> = columns
        .quantity
        .iter()
        .map(|q| q.eval_with(values))
        .collect();
    let open: Vec<bool> = columns
        .setup
        .iter()
        .map(|y| y.is_some_and(|y| good_lp::Solution::value(values, y) >= 0.5))
        .collect();
    for j in 0..raw.len() {
        if open[j] || raw[j] == 0.0 {
            continue;
        }
        let target = (0..j)
            .rev()
            .find(|&s| open[s])
            .or_else(|| (j + 1..raw.len()).find(|&s| open[s]));
        if let Some(s) = target {
            raw[s] += raw[j];
            raw[j] = 0.0;
        }
    }
    raw.into_iter().map(|q| snap(item, q)).collect()
}

/// Rounds away solver noise: near-whole quantities become whole, lots
/// become exact multiples, tiny ones vanish.
///
/// HiGHS meets its constraints to its feasibility tolerance (1e-6 by
/// default), so a lot of 2 can come back as 1.999999 and its neighbour as
/// 1.000001, and the pair then overloads a full machine by a millionth.
/// Where every quantity the item is given is whole, its plan is rounded to
/// whole units within 1e-5: the rounded plan balances exactly. Where the
/// forecast is fractional a near-whole lot may be the true one, so only the
/// item's own tight tolerance applies.
pub(crate) fn snap(item: &Item, quantity: f64) -> f64 {
    snap_given(item, quantity, has_whole_data(item))
}

/// `snap` where the caller knows whether every requirement on the item is
/// whole (a component's requirement also comes from its parents' lots).
pub(crate) fn snap_given(item: &Item, quantity: f64, whole_data: bool) -> f64 {
    let mut tolerance = quantity_tolerance(item) * 0.1;
    if whole_data {
        tolerance = tolerance.max(WHOLE_SNAP);
    }
    if quantity <= tolerance {
        return 0.0;
    }
    if let Some(multiple) = item.lot_multiple {
        return (quantity / multiple).round() * multiple;
    }
    let whole = quantity.round();
    if (quantity - whole).abs() <= tolerance {
        whole
    } else {
        quantity
    }
}

/// How far from a whole number a solver's quantity may be and still be read
/// as that whole number, for items whose data are whole.
const WHOLE_SNAP: f64 = 1e-5;

/// True when the item's demand, stocks, open and firm orders and lot rules
/// are all whole.
pub(crate) fn has_whole_data(item: &Item) -> bool {
    let whole = |x: &f64| x.fract() == 0.0;
    item.demand.iter().all(whole)
        && item.receipts.iter().all(whole)
        && item.firm.iter().all(whole)
        && whole(&item.initial_stock)
        && whole(&item.safety_stock)
        && whole(&item.ending_stock)
        && item.max_lot.as_ref().is_none_or(whole)
        && item.lot_multiple.as_ref().is_none_or(whole)
        && whole(&item.min_lot)
}

/// The most an item can receive in each bucket given the capacity of its
/// resources net of setup time (infinite without routing).
fn capacity_bounds(scenario: &Scenario, i: usize, unlimited: bool) -> Vec<f64> {
    let item = &scenario.items[i];
    let periods = scenario.periods();
    (0..periods)
        .map(|j| {
            if j < item.lead_time {
                return 0.0;
            }
            let t = j - item.lead_time;
            let mut bound = item.max_lot.unwrap_or(f64::INFINITY);
            if unlimited {
                return bound;
            }
            for routing in scenario.routings_of(i) {
                let resource = &scenario.resources[routing.resource];
                let room =
                    resource.capacity[t] + resource.overtime_capacity[t] - routing.setup_time;
                if room < 0.0 {
                    return 0.0;
                }
                if routing.per_unit > 0.0 {
                    bound = bound.min(room / routing.per_unit);
                }
            }
            // A whole item receives whole multiples: the most that fits is
            // the largest multiple within the room (a valid, tighter bound
            // for the rows below; the slack guards against rounding noise).
            match item.lot_multiple {
                Some(multiple) if bound.is_finite() => (bound / multiple + 1e-9).floor() * multiple,
                _ => bound,
            }
        })
        .collect()
}

/// Facility-location model of an item without backlog; returns the receipt
/// quantity expressions.
fn location_model(
    item: &Item,
    setup: &[Option<Variable>],
    cap: &[f64],
    vars: &mut ProblemVariables,
    objective: &mut Expression,
    constant: &mut f64,
    constraints: &mut Vec<good_lp::Constraint>,
) -> Vec<Expression> {
    let periods = item.periods();
    let tolerance = quantity_tolerance(item);
    let shifted = shift(item);
    for t in 0..periods {
        *constant += item.holding_cost[t] * shifted.offset[t];
    }
    let mut quantity: Vec<Expression> = vec![Expression::from(0.0); periods];
    for t in 0..periods {
        let need = shifted.net[t];
        if need <= tolerance {
            continue;
        }
        let mut cover = Expression::from(0.0);
        let mut carrying = 0.0; // holding from j to t, per unit
        for j in (0..=t).rev() {
            if let Some(y) = setup[j] {
                let z = vars.add(variable().min(0.0).max(1.0));
                let unit = item.unit_cost[j - item.lead_time];
                *objective += need * (unit + carrying) * z;
                constraints.push(constraint::leq(z, y));
                if cap[j] < need {
                    // A bucket can never receive more than its capacity allows.
                    constraints.push((need * z).leq(cap[j] * y));
                }
                cover += z;
                quantity[j] += need * z;
            }
            if j > 0 {
                carrying += item.holding_cost[j - 1];
            }
        }
        constraints.push(cover.eq(1.0));
    }
    // Surplus that min_lot or lot_multiple forces beyond the need stays in
    // stock to the end; an optimal plan needs at most min_lot + multiple,
    // and under a price per unit moved at most the earlier plan's release
    // more (`Item::kept_release`).
    let changes = item.has_quantity_change();
    let has_surplus = item.min_lot > 0.0 || item.lot_multiple.is_some() || changes;
    let most = |j: usize| {
        if has_surplus {
            item.min_lot + item.lot_multiple.unwrap_or(0.0) + item.kept_release(j)
        } else {
            0.0
        }
    };
    if has_surplus {
        for j in 0..periods {
            let Some(y) = setup[j] else { continue };
            if most(j) <= 0.0 {
                continue;
            }
            let surplus = vars.add(variable().min(0.0));
            let carrying: f64 = item.holding_cost[j..].iter().sum();
            *objective += (item.unit_cost[j - item.lead_time] + carrying) * surplus;
            constraints.push((1.0 * surplus).leq(most(j) * y));
            quantity[j] += surplus;
        }
    }
    // The most bucket j can receive under `z <= y` and the surplus bound:
    // the need from j on, plus the surplus allowed. Where that fits the
    // capacity the row would only repeat those rows, so it is left out.
    let mut need_from = 0.0;
    let mut reach = vec![0.0; periods];
    for t in (0..periods).rev() {
        if shifted.net[t] > tolerance {
            need_from += shifted.net[t];
        }
        reach[t] = need_from + most(t);
    }
    for j in 0..periods {
        if let Some(y) = setup[j] {
            if cap[j].is_finite() && reach[j] > cap[j] {
                constraints.push(quantity[j].clone().leq(cap[j] * y));
            }
        }
    }
    quantity
}

/// Stock-flow model (used for backlog, and as the plain model when asked).
#[allow(clippy::too_many_arguments)]
fn flow_model(
    item: &Item,
    setup: &[Option<Variable>],
    cap: &[f64],
    vars: &mut ProblemVariables,
    objective: &mut Expression,
    constant: &mut f64,
    constraints: &mut Vec<good_lp::Constraint>,
    plain: bool,
) -> Vec<Expression> {
    let periods = item.periods();
    let _ = constant;
    let total_need = (item.demand.iter().sum::<f64>() + item.safety_stock.max(item.ending_stock)
        - item.initial_stock
        - item.receipts.iter().sum::<f64>())
    .max(0.0);
    // Need from bucket j to the end bounds what bucket j should receive.
    let mut need_from = vec![0.0; periods + 1];
    for t in (0..periods).rev() {
        need_from[t] = need_from[t + 1] + item.demand[t];
    }
    let mut quantity = Vec::with_capacity(periods);
    let mut previous: Option<(Variable, Option<Variable>)> = None;
    for t in 0..periods {
        let q = vars.add(variable().min(0.0));
        if let Some(y) = setup[t] {
            *objective += item.unit_cost[t - item.lead_time] * q;
            let extra = item.min_lot + item.lot_multiple.unwrap_or(0.0) + item.kept_release(t);
            let bound = if plain {
                (total_need + extra).max(1.0)
            } else {
                let backlog_reach = if item.allows_backlog() {
                    total_need
                } else {
                    0.0
                };
                (need_from[t] + item.ending_stock.max(item.safety_stock) + backlog_reach + extra)
                    .min(total_need + extra)
                    .min(cap[t])
                    .max(0.0)
            };
            constraints.push((1.0 * q).leq(bound * y));
        } else {
            constraints.push(constraint::eq(q, 0.0));
        }
        let stock = vars.add(variable().min(0.0));
        *objective += item.holding_cost[t] * stock;
        let last = t + 1 == periods;
        let backlog = if item.allows_backlog() && !last {
            let b = vars.add(variable().min(0.0));
            *objective += item.backlog_cost.unwrap_or(0.0) * b;
            Some(b)
        } else {
            None
        };
        // stock - backlog = previous stock - previous backlog + receipts + q - demand
        let mut balance = stock - q;
        if let Some(b) = backlog {
            balance -= b;
        }
        let mut rhs = item.receipts[t] - item.demand[t];
        match previous {
            Some((s, pb)) => {
                balance -= s;
                if let Some(pb) = pb {
                    balance += pb;
                }
            }
            None => rhs += item.initial_stock,
        }
        constraints.push(balance.eq(rhs));
        let floor = item.stock_floor(t);
        if floor > 0.0 {
            constraints.push((1.0 * stock).geq(floor));
        }
        quantity.push(Expression::from(q));
        previous = Some((stock, backlog));
    }
    quantity
}

/// min_lot, lot_multiple and max_lot on the receipt quantities; returns the
/// lot-count columns of a lot_multiple by receipt bucket.
fn lot_constraints(
    item: &Item,
    setup: &[Option<Variable>],
    quantity: &[Expression],
    vars: &mut ProblemVariables,
    constraints: &mut Vec<good_lp::Constraint>,
    relax: bool,
) -> Vec<(usize, Variable)> {
    let mut counts = Vec::new();
    for (j, q) in quantity.iter().enumerate() {
        let Some(y) = setup[j] else { continue };
        if item.min_lot > 0.0 {
            constraints.push(q.clone().geq(item.min_lot * y));
        }
        if let Some(max) = item.max_lot {
            constraints.push(q.clone().leq(max * y));
        }
        if let Some(multiple) = item.lot_multiple {
            let count = if relax {
                vars.add(variable().min(0.0))
            } else {
                vars.add(variable().integer().min(0.0))
            };
            constraints.push(q.clone().eq(multiple * count));
            counts.push((j, count));
        }
    }
    counts
}
