//! Planning a whole scenario: the exact plan (per item, or per group of items
//! that share capacity), every lot rule for comparison, and one evaluation
//! of each.

mod bills;

use rayon::prelude::*;
use serde::Serialize;

use crate::capacity::fix_optimize::{Found, Search};
use crate::capacity::{self, milp::MilpOptions, GroupSolver};
use crate::eval::{evaluate, evaluate_with, Evaluation, Inputs};
use crate::model::{Plan, Scenario};
use crate::single::exact;
use crate::single::rules::{self, Rule, Sizing};

/// What a method's result is proven to be.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Status {
    /// Proven least-cost.
    Optimal,
    /// A plan that meets every constraint, not proven least-cost.
    Feasible,
    /// No plan meets every constraint (or this method's plan does not).
    Infeasible,
    /// The time limit ran out before any plan was found.
    Unknown,
}

impl Status {
    pub fn name(self) -> &'static str {
        match self {
            Status::Optimal => "optimal",
            Status::Feasible => "feasible",
            Status::Infeasible => "infeasible",
            Status::Unknown => "unknown",
        }
    }
}

/// What solved one group of items (a connected component of the
/// item-resource graph, or a single item).
#[derive(Debug, Clone, Serialize)]
pub struct Component {
    pub items: Vec<String>,
    pub resources: Vec<String>,
    /// `dp` for the dynamic program, `milp` for HiGHS, or a heuristic's name.
    pub solver: &'static str,
    pub status: Status,
}

/// One method's plan, its evaluation and what is proven about it.
#[derive(Debug, Clone)]
pub struct MethodResult {
    /// How each component was solved (empty for the lot rules).
    pub components: Vec<Component>,
    /// `optimal` for the exact method, else the rule's name.
    pub method: &'static str,
    pub status: Status,
    pub plan: Plan,
    pub evaluation: Evaluation,
    /// A proven lower bound on the least cost, where one is known.
    pub lower_bound: Option<f64>,
    /// Plain-language remarks a planner should read with the result.
    pub notes: Vec<String>,
}

impl MethodResult {
    /// Whether this is the exact (least-cost) method rather than a lot rule.
    pub fn is_exact(&self) -> bool {
        self.method == EXACT
    }

    /// A lot rule's result: neither the exact method nor the exact method
    /// applied level by level.
    pub fn is_rule(&self) -> bool {
        !self.is_exact() && self.method != crate::multilevel::EXACT_BY_LEVEL
    }

    /// The solvers that produced the plan, joined by `+` (`dp`, `dp+milp`).
    pub fn solver(&self) -> String {
        let mut names: Vec<&str> = self.components.iter().map(|c| c.solver).collect();
        names.sort_unstable();
        names.dedup();
        names.join("+")
    }

    pub fn total_cost(&self) -> f64 {
        self.evaluation.total_cost()
    }

    /// (total cost - lower bound) / |total cost|, or 0 when both are 0.
    pub fn gap(&self) -> Option<f64> {
        let bound = self.lower_bound?;
        let cost = self.total_cost();
        if cost.abs() < 1e-12 {
            return Some(0.0);
        }
        Some(((cost - bound) / cost.abs()).max(0.0))
    }

    /// The gap on the cost the plan controls: (total cost - lower bound)
    /// over (total cost - `unavoidable`), where `unavoidable` is the cost no
    /// feasible plan avoids (`eval::unavoidable_cost`). A total that is
    /// mostly unit cost makes `gap` look small; this one says how far the
    /// setups, holding, backlog and overtime may be from their best.
    pub fn controllable_gap(&self, unavoidable: f64) -> Option<f64> {
        let bound = self.lower_bound?.max(unavoidable);
        let cost = self.total_cost();
        let controllable = cost - unavoidable;
        if controllable <= 1e-9 * (1.0 + cost.abs()) {
            return Some(0.0);
        }
        Some(((cost - bound) / controllable).clamp(0.0, 1.0))
    }
}

/// What the planner asked for.
#[derive(Debug, Clone, Default)]
pub struct Options {
    /// Only this method (its output name); `None` for all.
    pub method: Option<String>,
    /// Limits of the MILP.
    pub milp: MilpOptions,
}

/// The exact method's name (it was `optimal`, a status word, before).
pub const EXACT: &str = "exact";

/// The names every method goes by, in the order of the comparison.
pub const METHOD_NAMES: [&str; 8] = [
    EXACT,
    "lot-for-lot",
    "fixed-lot",
    "eoq",
    "poq",
    "silver-meal",
    "least-unit-cost",
    "part-period-balancing",
];

/// The result of planning a scenario.
#[derive(Debug, Clone)]
pub struct Outcome {
    /// The method whose plan is the answer (the exact one unless the
    /// planner chose another).
    pub chosen: MethodResult,
    /// Every method run, the chosen one included, in comparison order.
    pub comparison: Vec<MethodResult>,
}

/// Plans the scenario with every method (or the one asked for).
pub fn plan_scenario(scenario: &Scenario, options: &Options) -> crate::error::Result<Outcome> {
    plan_scenario_with(scenario, options, &Silent)
}

/// Hears how a long solve goes: the command line shows it on stderr; the
/// library itself never prints.
pub trait Progress {
    /// A group of items that share resources goes to the MILP.
    fn milp_started(&self, _index: usize, _total: usize, _items: usize) {}
    /// A file HiGHS may write its log to while it solves, so that the
    /// progress shown can follow the search; `None` keeps HiGHS quiet.
    fn solver_log(&self) -> Option<std::path::PathBuf> {
        None
    }
    /// It came back with this status, cost and gap.
    fn milp_finished(
        &self,
        _index: usize,
        _total: usize,
        _status: Status,
        _cost: f64,
        _gap: Option<f64>,
    ) {
    }
}

/// No progress to show.
pub struct Silent;

impl Progress for Silent {}

/// `plan_scenario`, telling `progress` how the MILP goes.
pub fn plan_scenario_with(
    scenario: &Scenario,
    options: &Options,
    progress: &dyn Progress,
) -> crate::error::Result<Outcome> {
    // `optimal`, the exact method's former name, is still understood.
    let method = options
        .method
        .as_deref()
        .map(|m| if m == "optimal" { EXACT } else { m });
    let by_level = crate::multilevel::EXACT_BY_LEVEL;
    if let Some(method) = method {
        if method == by_level && !scenario.has_bom() {
            return Err(crate::error::Error::usage(
                "exact-by-level plans one level of a bill of material at a time; this scenario has no bom.csv",
            ));
        }
        if !METHOD_NAMES.contains(&method) && method != by_level {
            return Err(crate::error::Error::usage(format!(
                "unknown method {method}; choose one of {}",
                METHOD_NAMES.join(", ")
            )));
        }
        if method == "fixed-lot" && !has_fixed_lot(scenario) {
            return Err(crate::error::Error::usage(
                "no item in items.csv gives a fixed_lot, so there is no fixed-lot rule to run",
            ));
        }
    }
    let wanted = |name: &str| method.is_none_or(|m| m == name);
    let mut comparison = Vec::new();
    if scenario.has_bom() && !wanted(EXACT) && wanted(by_level) {
        comparison.push(bills::exact_by_level(scenario, &options.milp));
    } else if scenario.has_bom() && (wanted(EXACT) || wanted(by_level)) {
        let (joint, staged) = bills::solve_exact(scenario, &options.milp, progress);
        if wanted(EXACT) {
            comparison.push(joint);
        }
        comparison.push(staged);
    }
    // The methods' evaluations share the scenario's rows (demand, receipts)
    // instead of each holding a copy.
    let plain = !scenario.has_bom() && !scenario.has_replanning();
    let inputs = plain.then(|| Inputs::of(scenario));
    if !scenario.has_bom() && wanted(EXACT) {
        comparison.push(solve_exact_sharing(
            scenario,
            &options.milp,
            progress,
            inputs.as_ref(),
        ));
    }
    for rule in Rule::ALL {
        if rule == Rule::FixedLot && !has_fixed_lot(scenario) {
            continue;
        }
        if wanted(rule.name()) {
            comparison.push(run_rule_sharing(scenario, rule, inputs.as_ref()));
        }
    }
    let chosen = comparison
        .first()
        .cloned()
        .ok_or_else(|| crate::error::Error::Internal("no method ran".into()))?;
    Ok(Outcome { chosen, comparison })
}

/// A method's result on the free part of a scenario with firm orders or a
/// frozen horizon (`crate::replan`), put back on the full scenario: the
/// plan on the full horizon, evaluated there with the firm orders. A bound
/// of the free part is a bound of the whole once the constant that the
/// reduction takes out is added back.
fn lift(scenario: &Scenario, free: &crate::replan::Free, result: MethodResult) -> MethodResult {
    let plan = free.lift(&result.plan);
    let evaluation = evaluate(scenario, &plan);
    let shift = evaluation.total_cost() - result.evaluation.total_cost();
    let status = match result.status {
        Status::Optimal | Status::Feasible if !evaluation.feasible => Status::Infeasible,
        other => other,
    };
    let lower_bound = match status {
        Status::Optimal | Status::Feasible => result.lower_bound.map(|b| b + shift),
        _ => None,
    };
    MethodResult {
        status,
        plan,
        evaluation,
        lower_bound,
        notes: crate::report::notes::freeze(scenario, free)
            .into_iter()
            .chain(result.notes)
            .collect(),
        ..result
    }
}

fn has_fixed_lot(scenario: &Scenario) -> bool {
    scenario.items.iter().any(|item| item.fixed_lot.is_some())
}

/// The plan of one rule for every item.
pub fn run_rule(scenario: &Scenario, rule: Rule) -> MethodResult {
    run_rule_sharing(scenario, rule, None)
}

/// `run_rule`, evaluated on `inputs` (the scenario's own rows, made once)
/// where given.
fn run_rule_sharing(scenario: &Scenario, rule: Rule, inputs: Option<&Inputs>) -> MethodResult {
    if scenario.has_bom() {
        return bills::by_level(scenario, rule.name(), &|level| run_rule(level, rule));
    }
    if scenario.has_replanning() {
        let free = crate::replan::free_part(scenario);
        return lift(scenario, &free, run_rule(&free.scenario, rule));
    }
    let receipts = scenario
        .items
        .par_iter()
        .map(|item| rules::plan(item, Sizing::Rule(rule)))
        .collect();
    let plan = Plan { receipts };
    let evaluation = evaluate_shared(scenario, inputs, &plan);
    let mut notes = Vec::new();
    if rule == Rule::FixedLot {
        let without: Vec<&str> = scenario
            .items
            .iter()
            .filter(|item| item.fixed_lot.is_none())
            .map(|item| item.id.as_str())
            .collect();
        if !without.is_empty() {
            notes.push(format!(
                "items without a fixed_lot are ordered lot-for-lot under the fixed-lot rule: {}",
                without.join(", ")
            ));
        }
    }
    let status = if evaluation.feasible {
        Status::Feasible
    } else {
        Status::Infeasible
    };
    MethodResult {
        components: Vec::new(),
        method: rule.name(),
        status,
        plan,
        evaluation,
        lower_bound: None,
        notes,
    }
}

/// The exact method: per item without shared capacity, the dynamic program;
/// per group of items that share resources, the MILP. Lot constraints and
/// capacity are honoured, or the result says it is not proven.
pub fn solve_exact(scenario: &Scenario, options: &MilpOptions) -> MethodResult {
    solve_exact_with(scenario, options, &Silent)
}

/// `solve_exact`, telling `progress` how the MILP goes.
pub fn solve_exact_with(
    scenario: &Scenario,
    options: &MilpOptions,
    progress: &dyn Progress,
) -> MethodResult {
    solve_exact_sharing(scenario, options, progress, None)
}

/// The evaluation of `plan`, on the scenario's rows made once where given.
fn evaluate_shared(scenario: &Scenario, inputs: Option<&Inputs>, plan: &Plan) -> Evaluation {
    match inputs {
        Some(inputs) => evaluate_with(scenario, inputs, plan),
        None => evaluate(scenario, plan),
    }
}

/// `solve_exact_with`, evaluated on `inputs` where given.
fn solve_exact_sharing(
    scenario: &Scenario,
    options: &MilpOptions,
    progress: &dyn Progress,
    inputs: Option<&Inputs>,
) -> MethodResult {
    if scenario.has_bom() {
        return bills::solve_exact(scenario, options, progress).0;
    }
    if scenario.has_replanning() {
        let free = crate::replan::free_part(scenario);
        let result = solve_exact_with(&free.scenario, options, progress);
        return lift(scenario, &free, result);
    }
    let periods = scenario.periods();
    let groups = capacity::components(scenario);
    let milp_total = groups.iter().filter(|g| g.items.len() > 1).count();
    let started = std::time::Instant::now();
    let shared = Shared {
        left: groups
            .iter()
            .filter(|g| g.resources.is_empty())
            .flat_map(|g| &g.items)
            .filter(|&&i| {
                let item = &scenario.items[i];
                item.has_lot_constraints() || item.has_quantity_change()
            })
            .count()
            .into(),
        workers: rayon::current_num_threads().max(1),
    };
    // Groups without resources are independent dynamic programs: solved in
    // parallel, then taken in group order like the rest, so the result is
    // the same as one thread's.
    let free: Vec<Option<GroupOutcome>> = groups
        .par_iter()
        .map(|group| {
            group
                .resources
                .is_empty()
                .then(|| solve_group(scenario, group, options, started, &shared, &Silent, 0, 0))
        })
        .collect();
    let mut plan = Plan::empty(scenario.items.len(), periods);
    let mut lower_bound = 0.0;
    let mut notes = Vec::new();
    let mut components = Vec::new();
    let mut milp_index = 0;
    for (group, outcome) in groups.iter().zip(free) {
        let outcome = outcome.unwrap_or_else(|| {
            if group.items.len() > 1 {
                milp_index += 1;
            }
            solve_group(
                scenario, group, options, started, &shared, progress, milp_index, milp_total,
            )
        });
        for (i, receipts) in outcome.receipts {
            plan.receipts[i] = receipts;
        }
        lower_bound += outcome.lower_bound;
        notes.extend(outcome.notes);
        components.push(outcome.component);
    }
    for item in &scenario.items {
        if item.ending_stock > 0.0 && item.lead_time >= periods {
            notes.push(format!(
                "item {}: its ending-stock target of {} cannot be met by any order: with a lead time of {} buckets nothing released in the horizon arrives before it ends",
                item.id,
                crate::report::quantity(item.ending_stock),
                item.lead_time
            ));
        }
    }
    let evaluation = evaluate_shared(scenario, inputs, &plan);
    let worst = |s: Status| components.iter().any(|c| c.status == s);
    let status = if worst(Status::Infeasible) {
        Status::Infeasible
    } else if worst(Status::Unknown) {
        Status::Unknown
    } else if worst(Status::Feasible) {
        Status::Feasible
    } else {
        Status::Optimal
    };
    // The proven bound: exact for dynamic programs, HiGHS's dual bound for
    // the MILP (within 1e-6 of the cost when proven optimal).
    let lower_bound = match status {
        Status::Optimal | Status::Feasible => Some(lower_bound.min(evaluation.total_cost())),
        _ => None,
    };
    MethodResult {
        components,
        method: EXACT,
        status,
        plan,
        evaluation,
        lower_bound,
        notes,
    }
}

/// The time the items planned one by one share: each item's MILP gets an
/// equal part of what is left, for the workers, of the items still to
/// come, so that many items cannot run the solve past its time limit.
struct Shared {
    /// Items without resources that may need the MILP, not yet started.
    left: std::sync::atomic::AtomicUsize,
    workers: usize,
}

impl Shared {
    /// The seconds the next item's MILP may take, and that item taken off.
    fn take(&self, options: &MilpOptions, started: std::time::Instant) -> f64 {
        use std::sync::atomic::Ordering;
        let left = self.left.fetch_sub(1, Ordering::SeqCst).max(1);
        let remaining = options.time_limit - started.elapsed().as_secs_f64();
        (remaining * self.workers as f64 / left as f64).min(remaining)
    }
}

/// What solving one group gave.
struct GroupOutcome {
    component: Component,
    /// Receipts by item of the scenario.
    receipts: Vec<(usize, Vec<f64>)>,
    lower_bound: f64,
    notes: Vec<String>,
}

/// Receipts of a group's items as they are decided.
#[derive(Default)]
struct Receipts(Vec<(usize, Vec<f64>)>);

impl Receipts {
    fn set(&mut self, item: usize, receipts: Vec<f64>) {
        match self.0.iter_mut().find(|(i, _)| *i == item) {
            Some(slot) => slot.1 = receipts,
            None => self.0.push((item, receipts)),
        }
    }
}

/// Solves one group: the dynamic programs of its items, then the capacitated
/// program, the MILP or a heuristic as its size and resources call for.
#[allow(clippy::too_many_arguments)]
fn solve_group(
    scenario: &Scenario,
    group: &capacity::Group,
    options: &MilpOptions,
    started: std::time::Instant,
    shared: &Shared,
    progress: &dyn Progress,
    milp_index: usize,
    milp_total: usize,
) -> GroupOutcome {
    let periods = scenario.periods();
    let mut plan = Receipts::default();
    let mut lower_bound = 0.0;
    let mut notes = Vec::new();
    let mut component = Component {
        items: group
            .items
            .iter()
            .map(|&i| scenario.items[i].id.clone())
            .collect(),
        resources: group
            .resources
            .iter()
            .map(|&r| scenario.resources[r].id.clone())
            .collect(),
        solver: "dp",
        status: Status::Optimal,
    };
    // Need before the lead time has passed makes an item infeasible
    // whatever the capacity; the dynamic program finds it.
    let mut single = Vec::new();
    for &i in &group.items {
        let item = &scenario.items[i];
        if item.allows_backlog() && periods > exact::BACKLOG_PERIOD_LIMIT {
            component.status = Status::Unknown;
            notes.push(format!(
                "item {}: backlog over {} buckets is beyond the dynamic program's limit of {}; no plan was computed",
                item.id, periods, exact::BACKLOG_PERIOD_LIMIT
            ));
            plan.set(i, rules::plan(item, Sizing::Rule(Rule::LotForLot)));
            continue;
        }
        // The O(T log T) program without backlog; the general one
        // (backlog) otherwise.
        let solved = if !item.allows_backlog() {
            crate::single::fast::solve(item)
        } else {
            exact::solve(item)
        };
        match solved {
            Some(exact) => single.push((i, exact)),
            None => {
                component.status = Status::Infeasible;
                notes.push(no_plan_note(
                    &explain_item(item, scenario.period_offset),
                    &format!("item {}", item.id),
                ));
                plan.set(i, rules::plan(item, Sizing::Rule(Rule::LotForLot)));
            }
        }
    }
    if component.status != Status::Optimal {
        for (i, exact) in single {
            plan.set(i, exact.receipts);
        }
        return GroupOutcome {
            component,
            receipts: plan.0,
            lower_bound,
            notes,
        };
    }
    if group.resources.is_empty() {
        for (i, exact) in single {
            let item = &scenario.items[i];
            let priced = item.has_quantity_change();
            let breaks_rules =
                item.has_lot_constraints() && !meets_lot_constraints(item, &exact.receipts);
            if breaks_rules && !priced {
                // A lot multiple alone (whole units of a fractional
                // forecast): the program on rounded requirements.
                if let Some(rounded) = crate::single::multiple::solve(item) {
                    lower_bound += rounded.cost;
                    plan.set(i, rounded.receipts);
                    continue;
                }
            }
            if priced || breaks_rules {
                // Other lot constraints: the program over stock levels for
                // items in lot multiples, else the MILP, handles them
                // exactly. A price per unit moved is convex in the
                // quantity: the dynamic programs on the zero-inventory
                // property cannot price it, the MILP prices it exactly. The
                // program's cost without them bounds it below.
                let share = shared.take(options, started);
                solve_constrained(
                    scenario,
                    options,
                    started,
                    Some((share, exact.cost)),
                    i,
                    &mut plan,
                    &mut component,
                    &mut lower_bound,
                    &mut notes,
                );
            } else {
                lower_bound += exact.cost;
                plan.set(i, exact.receipts);
            }
        }
    } else if let [i] = group.items[..] {
        solve_constrained(
            scenario,
            options,
            started,
            None,
            i,
            &mut plan,
            &mut component,
            &mut lower_bound,
            &mut notes,
        );
    } else {
        progress.milp_started(milp_index, milp_total, group.items.len());
        let limits = MilpOptions {
            log_file: progress.solver_log(),
            ..remaining(options, started)
        };
        let solver = options.solver.pick(group.items.len(), periods);
        let result = match solver {
            GroupSolver::Milp | GroupSolver::Auto => {
                component.solver = "milp";
                // A plan that fits, if a quick search finds one, is HiGHS's
                // first incumbent.
                capacity::staged::solve(scenario, group, &limits)
            }
            GroupSolver::Lagrangean | GroupSolver::FixAndOptimize => {
                let search = if solver == GroupSolver::Lagrangean {
                    Search::Lagrangean
                } else {
                    Search::FixAndOptimize
                };
                component.solver = solver.name();
                let found = capacity::fix_optimize::solve(scenario, group, &limits, search);
                notes.push(heuristic_note(&component, &found));
                found.result
            }
        };
        let gap = (result.objective.abs() > 1e-9)
            .then(|| ((result.objective - result.lower_bound) / result.objective.abs()).max(0.0));
        let status = match result.status {
            capacity::milp::MilpStatus::Optimal => Status::Optimal,
            capacity::milp::MilpStatus::Feasible => Status::Feasible,
            capacity::milp::MilpStatus::Infeasible => Status::Infeasible,
            capacity::milp::MilpStatus::NoPlan => Status::Unknown,
        };
        progress.milp_finished(milp_index, milp_total, status, result.objective, gap);
        take_milp(
            scenario,
            options,
            group,
            &result,
            &mut plan,
            &mut component,
            &mut lower_bound,
            &mut notes,
        );
    }
    GroupOutcome {
        component,
        receipts: plan.0,
        lower_bound,
        notes,
    }
}

/// One item with lot constraints or resources of its own: the dynamic
/// program over stock levels when the item has a lot multiple and the state space
/// is within its bound, else the MILP (saying why).
///
/// `share`, for an item without resources, is (the seconds its MILP may
/// take, the least cost of the item without its lot rules). When that
/// time is too short for HiGHS to find a plan, the item is ordered
/// lot-for-lot within its lot rules, a feasible plan, bounded below by that
/// least cost (a relaxation: the same item with fewer rules).
#[allow(clippy::too_many_arguments)]
fn solve_constrained(
    scenario: &Scenario,
    options: &MilpOptions,
    started: std::time::Instant,
    share: Option<(f64, f64)>,
    i: usize,
    plan: &mut Receipts,
    component: &mut Component,
    lower_bound: &mut f64,
    notes: &mut Vec<String>,
) {
    use capacity::single_dp::{self, NotApplicable};
    let item = &scenario.items[i];
    match single_dp::solve(scenario, i) {
        Ok(Some((receipts, cost))) => {
            component.solver = "dp";
            plan.set(i, receipts);
            *lower_bound += cost;
            return;
        }
        Ok(None) => {
            component.status = Status::Infeasible;
            plan.set(i, rules::plan(item, Sizing::Rule(Rule::LotForLot)));
            let group = capacity::Group {
                items: vec![i],
                resources: scenario.routings_of(i).map(|r| r.resource).collect(),
            };
            let names = format!("item {}", item.id);
            let why = no_plan_reason(scenario, &group, &names, options);
            notes.push(no_plan_note(&why, &names));
            return;
        }
        Err(NotApplicable::TooLarge(size)) => notes.push(format!(
            "item {}: the dynamic program over stock levels would pass its bound ({:.1e} states and decisions against {:.0e}); solved by the mixed-integer program instead",
            item.id,
            size,
            single_dp::STATE_LIMIT
        )),
        Err(NotApplicable::NotWhole | NotApplicable::QuantityChange) => {}
    }
    let mut resources: Vec<usize> = scenario.routings_of(i).map(|r| r.resource).collect();
    resources.sort_unstable();
    let group = capacity::Group {
        items: vec![i],
        resources,
    };
    let mut limits = remaining(options, started);
    if let Some((seconds, _)) = share {
        limits.time_limit = limits.time_limit.min(seconds.max(0.05));
        // Lot-for-lot within the lot rules as HiGHS's first incumbent, so
        // that a short share still ends with a plan and a bound.
        limits.start = Some(vec![rules::plan(item, Sizing::Rule(Rule::LotForLot))]);
    }
    let out_of_time = options.time_limit - started.elapsed().as_secs_f64() <= 0.0;
    let result = if out_of_time && share.is_some() {
        None
    } else {
        Some(capacity::milp::solve(scenario, &[i], &limits))
    };
    let no_plan = result
        .as_ref()
        .is_none_or(|r| r.status == capacity::milp::MilpStatus::NoPlan);
    if let (true, Some((_, relaxed))) = (no_plan, share) {
        let receipts = rules::plan(item, Sizing::Rule(Rule::LotForLot));
        let alone = scenario.subset(&[i]);
        let fits = evaluate(
            &alone,
            &Plan {
                receipts: vec![receipts.clone()],
            },
        )
        .feasible;
        plan.set(i, receipts);
        component.solver = "rule";
        if fits {
            if component.status == Status::Optimal {
                component.status = Status::Feasible;
            }
            *lower_bound += relaxed;
            notes.push(format!(
                "item {}: HiGHS found no plan in its share of the time limit ({:.1} s); it is ordered lot-for-lot within its lot rules, and its lower bound is its least cost without them",
                item.id, limits.time_limit
            ));
        } else {
            component.status = Status::Unknown;
            notes.push(format!(
                "item {}: HiGHS found no plan in its share of the time limit ({:.1} s), and lot-for-lot within its lot rules breaks a constraint; the plan shown is that one, do not release it",
                item.id, limits.time_limit
            ));
        }
        return;
    }
    let Some(mut result) = result else { return };
    let planned = matches!(
        result.status,
        capacity::milp::MilpStatus::Optimal | capacity::milp::MilpStatus::Feasible
    );
    if let (Some((_, relaxed)), true) = (share, planned) {
        // Both are lower bounds; a short run's own may be the weaker.
        result.lower_bound = result.lower_bound.max(relaxed).min(result.objective);
    }
    component.solver = "milp";
    take_milp(
        scenario,
        options,
        &group,
        &result,
        plan,
        component,
        lower_bound,
        notes,
    );
}

/// What a heuristic did for a group, in words.
fn heuristic_note(component: &Component, found: &Found) -> String {
    let what = match component.solver {
        "lagrangean" => format!(
            "the Lagrangean method ({} rounds of pricing capacity) and smoothing of the overloads",
            found.iterations
        ),
        _ => format!(
            "fix-and-optimize ({} smaller plans re-solved, {} improved the plan) from the Lagrangean method ({} rounds of pricing capacity)",
            found.subproblems, found.improved, found.iterations
        ),
    };
    format!(
        "{}: planned by {what}; the lower bound comes from pricing capacity, so the gap shown is proven but optimality is not claimed",
        group_name(component)
    )
}

/// A group named by its items when few, else by their count and resources.
fn group_name(component: &Component) -> String {
    if component.items.len() <= 6 {
        component.items.join(", ")
    } else {
        format!(
            "the group of {} items on {}",
            component.items.len(),
            component.resources.join(", ")
        )
    }
}

/// Where an unproven MILP stopped, in words: a time limit (a run that may
/// not repeat), the node limit or the gap asked for.
fn stop_words(hit_time_limit: bool, options: &MilpOptions) -> &'static str {
    match (hit_time_limit, options.nodes, options.gap) {
        (true, _, _) => "at the time limit (a run cut short by time may give another plan the next time; --nodes N stops at the same point on every run)",
        (false, Some(_), None) => "at the node limit",
        (false, Some(_), Some(_)) => "at the node limit or the gap asked for",
        (false, None, _) => "at the gap asked for",
    }
}

/// The options with the time limit cut to what is left of the budget.
fn remaining(options: &MilpOptions, started: std::time::Instant) -> MilpOptions {
    let left = options.time_limit - started.elapsed().as_secs_f64();
    MilpOptions {
        time_limit: left.max(0.5),
        ..options.clone()
    }
}

/// Folds a MILP result for `group` into the plan and the component.
#[allow(clippy::too_many_arguments)]
fn take_milp(
    scenario: &Scenario,
    options: &MilpOptions,
    group: &capacity::Group,
    result: &capacity::milp::MilpResult,
    plan: &mut Receipts,
    component: &mut Component,
    lower_bound: &mut f64,
    notes: &mut Vec<String>,
) {
    use capacity::milp::MilpStatus;
    let names = group_name(component);
    match result.status {
        MilpStatus::Optimal | MilpStatus::Feasible => {
            for (k, &i) in group.items.iter().enumerate() {
                plan.set(i, result.receipts[k].clone());
            }
            *lower_bound += result.lower_bound;
            if result.status == MilpStatus::Feasible && component.status == Status::Optimal {
                component.status = Status::Feasible;
            }
            if result.status == MilpStatus::Feasible && component.solver == "milp" {
                notes.push(format!(
                    "{}: the solver stopped {} before proving optimality; the plan is feasible, with its lower bound in the gap",
                    names,
                    stop_words(result.hit_time_limit, options)
                ));
            }
        }
        MilpStatus::Infeasible => {
            component.status = Status::Infeasible;
            for &i in &group.items {
                plan.set(
                    i,
                    rules::plan(&scenario.items[i], Sizing::Rule(Rule::LotForLot)),
                );
            }
            let why = no_plan_reason(scenario, group, &names, options);
            notes.push(no_plan_note(&why, &names));
        }
        MilpStatus::NoPlan => {
            component.status = Status::Unknown;
            for &i in &group.items {
                plan.set(
                    i,
                    rules::plan(&scenario.items[i], Sizing::Rule(Rule::LotForLot)),
                );
            }
            let bound = if result.lower_bound.is_finite() {
                format!(
                    " (no plan can cost less than {}, the solver's lower bound)",
                    crate::report::money(result.lower_bound)
                )
            } else {
                String::new()
            };
            notes.push(format!(
                "{names}: the time limit ran out before the solver found a plan{bound}; the plan shown is lot-for-lot and may overload capacity"
            ));
        }
    }
}

fn meets_lot_constraints(item: &crate::model::Item, receipts: &[f64]) -> bool {
    let tolerance = crate::eval::quantity_tolerance(item);
    receipts.iter().filter(|&&q| q > 0.0).all(|&q| {
        (rules::constrain(item, q) - q).abs() <= tolerance && q <= rules::lot_cap(item) + tolerance
    })
}

/// Why a group has no plan: its capacity explained, or, without resources,
/// its lot constraints and stock floors.
fn no_plan_reason(
    scenario: &Scenario,
    group: &capacity::Group,
    names: &str,
    options: &MilpOptions,
) -> String {
    if group.resources.is_empty() {
        format!("{names}: no plan meets the lot constraints and stock floors")
    } else {
        crate::report::notes::capacity_shortfall(
            scenario,
            &capacity::explain_capacity(scenario, group, options),
        )
    }
}

/// The note on items without a plan: why, and what the plan shows meanwhile.
fn no_plan_note(why: &str, shown: &str) -> String {
    format!(
        "{why}. Meanwhile the plan shows {shown} lot-for-lot; that breaks a constraint as well and is not to be released"
    )
}

/// Why an item has no feasible plan: need before an order can arrive.
/// `offset` is added to bucket numbers (see `Scenario::period_offset`).
fn explain_item(item: &crate::model::Item, offset: usize) -> String {
    let mut stock = item.initial_stock;
    for t in 0..item.periods().min(item.lead_time.max(1)) {
        stock += item.receipts[t] - item.demand[t];
        if stock < -crate::eval::quantity_tolerance(item) {
            return format!(
                "item {}: {} units short in period {}, before an order released in period {} can arrive (lead time {} buckets); add stock or receipts, or allow backlog",
                item.id,
                crate::report::quantity(-stock),
                t + 1 + offset,
                offset + 1,
                item.lead_time
            );
        }
    }
    format!(
        "item {}: no plan meets its stock floors (lead time {} buckets)",
        item.id, item.lead_time
    )
}

/// The cautions a plan calls for: overtime and stock built ahead of need
/// are decisions for people who know the local rules.
pub fn cautions(scenario: &Scenario, result: &MethodResult) -> Vec<String> {
    let mut cautions = Vec::new();
    let overtime: f64 = result
        .evaluation
        .resources
        .iter()
        .flat_map(|r| r.overtime.iter())
        .sum();
    if overtime > 0.0 {
        cautions.push(format!(
            "The plan uses {} units of overtime capacity. Overtime and shift patterns must respect local labour law and agreements; check with the people who set them.",
            crate::report::quantity(overtime)
        ));
    }
    let ahead = result
        .evaluation
        .items
        .iter()
        .zip(&scenario.items)
        .filter(|(record, _)| record.longest_cover >= 2)
        .max_by_key(|(record, _)| record.longest_cover);
    if let Some((record, item)) = ahead {
        let unit = scenario.calendar.kind.name();
        cautions.push(format!(
            "The plan builds stock ahead of need (up to {} {unit}s of demand in one lot, item {}). Shelf life, quality holds and rules for regulated products (food, pharmaceuticals) can forbid building ahead; check them before releasing the orders.",
            record.longest_cover, item.id
        ));
    }
    cautions
}
