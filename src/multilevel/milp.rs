//! The joint plan over every level of a bill of material: one
//! mixed-integer program on HiGHS.
//!
//! Per item `i` and receipt bucket `j` (from its lead time after the frozen
//! horizon on): a setup binary `y`, a receipt `x` (a whole number of lot
//! multiples where the item has one). Per item and bucket a stock (split
//! into stock and backlog for an item that allows backlog), with the
//! balance
//!
//! ```text
//! stock[t] = stock[t-1] + scheduled + firm + x[i][t] - demand[t]
//!            - sum over parents p of  per(p,i) * (x[p][t + L_p] + firm release of p in t)
//! ```
//!
//! so a parent's release in bucket t is its components' requirement in t,
//! as `eval` explodes it. Stock floors, lot rules, capacity with setup time
//! and overtime by release bucket, and costs follow `eval` term by term;
//! the firm orders' setup and unit cost are the objective's constant.
//!
//! The big-M of `x <= M y` is the least of the capacity room, the maximum
//! lot and `U[i][j]`, a bound on what an item can usefully receive from
//! bucket j on: its own requirement from j on (all of it with backlog),
//! its largest stock floor, one minimum lot and one lot multiple, plus
//! `per(p,i) * U[p][j + L_p]` for every parent, and what could be made from
//! the stock and open orders of everything below it (a parent made beyond
//! its need can use up component stock that is dearer to hold).
//! docs/algorithms.md, section 11e, gives the argument and its limits;
//! the brute-force tests check it on tiny bills.

use std::collections::HashMap;
use std::time::Instant;

use good_lp::{constraint, variable, Expression, ProblemVariables, SolverModel, Variable};
use highs::HighsModelStatus;

use crate::capacity::milp::{
    configure, has_whole_data, snap_given, MilpOptions, MilpResult, MilpStatus, OPTIMALITY_GAP,
};
use crate::eval::evaluate;
use crate::model::{Plan, Scenario};

/// Columns of one item.
struct Columns {
    /// (receipt bucket, setup, quantity, lot count of a lot multiple).
    orders: Vec<(usize, Variable, Variable, Option<Variable>)>,
}

/// What an item can usefully receive from each bucket on (see the module
/// notes), by item and receipt bucket.
pub fn useful_receipts(scenario: &Scenario) -> Vec<Vec<f64>> {
    let periods = scenario.periods();
    let firm = firm_releases(scenario);
    let dependent = scenario.dependent_requirements(&firm);
    let mut bound = vec![vec![0.0; periods + 1]; scenario.items.len()];
    // What can exist of each item without being ordered: its stock, open
    // and firm orders, and what its components' such supply could make.
    // An optimal plan may make a parent beyond its need to use up
    // component stock dearer to hold than the parent, but never beyond
    // this.
    let order = scenario.level_order();
    let mut supply = vec![0.0; scenario.items.len()];
    for &c in order.iter().rev() {
        let item = &scenario.items[c];
        supply[c] =
            item.initial_stock + item.receipts.iter().sum::<f64>() + item.firm.iter().sum::<f64>();
        for line in scenario.bom.iter().filter(|line| line.parent == c) {
            supply[c] += supply[line.component] / line.per_parent_unit();
        }
    }
    for i in order {
        let item = &scenario.items[i];
        let floor = item.safety_stock.max(item.ending_stock);
        // Making the parent beyond need cannot pay where holding it costs,
        // in every bucket, at least (1 + lead time) times what holding its
        // components costs at their dearest: the stock it would use up is
        // held at most that many buckets longer than the parent.
        let lines: Vec<&crate::model::BomLine> = scenario
            .bom
            .iter()
            .filter(|line| line.parent == i)
            .collect();
        let components_holding: f64 = lines
            .iter()
            .map(|line| {
                let dearest = scenario.items[line.component]
                    .holding_cost
                    .iter()
                    .fold(0.0_f64, |a, &h| a.max(h));
                line.per_parent_unit() * dearest
            })
            .sum();
        let cheapest = item
            .holding_cost
            .iter()
            .fold(f64::INFINITY, |a, &h| a.min(h));
        let pays = cheapest < (1.0 + item.lead_time as f64) * components_holding;
        let absorb: f64 = if pays {
            lines
                .iter()
                .map(|line| supply[line.component] / line.per_parent_unit())
                .sum()
        } else {
            0.0
        };
        let slack = item.min_lot + item.lot_multiple.unwrap_or(0.0) + absorb;
        let total: f64 = item
            .demand
            .iter()
            .zip(&dependent[i])
            .map(|(d, q)| d + q)
            .sum();
        let mut from_j = 0.0;
        for j in (0..periods).rev() {
            from_j += item.demand[j] + dependent[i][j];
            let own = if item.allows_backlog() { total } else { from_j };
            let mut parents = 0.0;
            for line in scenario.bom.iter().filter(|line| line.component == i) {
                let lead = scenario.items[line.parent].lead_time;
                if j + lead < periods {
                    parents += line.per_parent_unit() * bound[line.parent][j + lead];
                    if scenario.rounds_issue(line) {
                        // Each release bucket's issue rounds up by under one.
                        parents += (periods - j) as f64;
                    }
                }
            }
            // A price per unit moved (`model::QuantityChange`) may make
            // it pay to receive the earlier plan's quantity beyond need.
            let kept = match (&item.quantity_change, j.checked_sub(item.lead_time)) {
                (Some(change), Some(r)) => change.previous[r].unwrap_or(0.0).max(0.0),
                _ => 0.0,
            };
            bound[i][j] = own + floor + slack + parents + kept;
        }
    }
    for row in &mut bound {
        row.pop();
    }
    bound
}

/// Firm orders by item and release bucket: the releases of an empty plan.
fn firm_releases(scenario: &Scenario) -> Vec<Vec<f64>> {
    super::releases(
        scenario,
        &Plan::empty(scenario.items.len(), scenario.periods()),
    )
}

/// Solves the joint program over every item of `scenario`. `start`, when
/// given, is handed to HiGHS as its first incumbent. The result's
/// `objective` is the returned plan's cost as `eval` computes it; proof is
/// judged on it against HiGHS's bound.
pub fn solve(scenario: &Scenario, options: &MilpOptions, start: Option<&Plan>) -> MilpResult {
    let started = Instant::now();
    let periods = scenario.periods();
    let items = scenario.items.len();
    let useful = useful_receipts(scenario);
    let firm = firm_releases(scenario);
    let firm_dependent = scenario.dependent_requirements(&firm);
    let mut vars = ProblemVariables::new();
    let mut objective = Expression::from(0.0);
    let mut constraints = Vec::new();
    let mut start_values: Vec<(Variable, f64)> = Vec::new();
    let mut constant = 0.0;
    // Receipt columns by item and bucket, for the balance rows.
    let mut receipt: Vec<Vec<Option<(Variable, Variable)>>> = vec![vec![None; periods]; items];
    let mut columns: Vec<Columns> = Vec::with_capacity(items);
    for (i, item) in scenario.items.iter().enumerate() {
        for t in item.lead_time..periods {
            if item.firm[t] > 0.0 {
                let r = t - item.lead_time;
                constant += item.setup_cost[r] + item.unit_cost[r] * item.firm[t];
            }
        }
        let mut orders = Vec::new();
        let first = scenario.frozen + item.lead_time;
        for j in first..periods {
            let r = j - item.lead_time;
            let mut room = useful[i][j].min(item.max_lot.unwrap_or(f64::INFINITY));
            for routing in scenario.routings_of(i) {
                let resource = &scenario.resources[routing.resource];
                let free =
                    resource.capacity[r] + resource.overtime_capacity[r] - routing.setup_time;
                if free < 0.0 {
                    room = 0.0;
                } else if routing.per_unit > 0.0 {
                    room = room.min(free / routing.per_unit);
                }
            }
            if let Some(m) = item.lot_multiple {
                room = (room / m + 1e-9).floor() * m;
            }
            // The useful-receipt bound holds for some optimal plan, not for
            // every plan: a start that receives more must stay in the model,
            // or HiGHS drops it.
            if let Some(plan) = start {
                room = room.max(plan.receipts[i][j]);
            }
            let fixed = options.fixed.as_ref().and_then(|f| f[i][j]);
            if room <= 0.0 || room < item.min_lot || fixed == Some(false) {
                continue;
            }
            let y = match (fixed == Some(true), options.relax) {
                (true, false) => vars.add(variable().binary().min(1.0)),
                (true, true) => vars.add(variable().min(1.0).max(1.0)),
                (false, false) => vars.add(variable().binary()),
                (false, true) => vars.add(variable().min(0.0).max(1.0)),
            };
            let x = vars.add(variable().min(0.0).max(room));
            objective += item.setup_cost[r] * y + item.unit_cost[r] * x;
            constraints.push(constraint::leq(x, room * y));
            if item.min_lot > 0.0 {
                constraints.push(constraint::geq(x, item.min_lot * y));
            }
            let count = item.lot_multiple.map(|m| {
                let k = if options.relax || options.relax_multiples {
                    vars.add(variable().min(0.0))
                } else {
                    vars.add(variable().integer().min(0.0))
                };
                constraints.push(constraint::eq(x, m * k));
                k
            });
            if let Some(plan) = start {
                let q = plan.receipts[i][j];
                start_values.push((y, if q > 0.0 { 1.0 } else { 0.0 }));
                if let (Some(k), Some(m)) = (count, item.lot_multiple) {
                    start_values.push((k, (q / m).round()));
                }
            }
            receipt[i][j] = Some((y, x));
            orders.push((j, y, x, count));
        }
        let quantity: Vec<Expression> = receipt[i]
            .iter()
            .map(|column| column.map_or_else(|| Expression::from(0.0), |(_, x)| x.into()))
            .collect();
        crate::capacity::milp::change_columns(
            item,
            &quantity,
            &mut vars,
            &mut objective,
            &mut constant,
            &mut constraints,
        );
        columns.push(Columns { orders });
    }
    // Stock balance, floors and the end of the horizon.
    let mut stocks: Vec<Vec<Expression>> = Vec::with_capacity(items);
    for (i, item) in scenario.items.iter().enumerate() {
        let mut row = Vec::with_capacity(periods);
        let reach = scenario.frozen + item.lead_time;
        let mut previous = Expression::from(item.initial_stock);
        for t in 0..periods {
            let last = t + 1 == periods;
            let reachable = t >= reach;
            let mut inflow = previous.clone()
                + (item.receipts[t] + item.firm[t] - item.demand[t] - firm_dependent[i][t]);
            if let Some((_, x)) = receipt[i][t] {
                inflow += x;
            }
            for line in scenario.bom.iter().filter(|line| line.component == i) {
                let lead = scenario.items[line.parent].lead_time;
                let Some(Some((_, x))) = receipt[line.parent].get(t + lead) else {
                    continue;
                };
                let per = line.per_parent_unit();
                if !scenario.rounds_issue(line) {
                    inflow -= per * *x;
                    continue;
                }
                // Whole components are issued whole (`Scenario::issue`):
                // an integer at least the exact call of the bucket's
                // release, less what the firm orders' rounded issue
                // (in `firm_dependent`) already takes.
                let f = firm[line.parent][t];
                let firm_issue = if f > 0.0 {
                    scenario.issue(line, f)
                } else {
                    0.0
                };
                let issued = if options.relax || options.relax_multiples {
                    vars.add(variable().min(0.0))
                } else {
                    vars.add(variable().integer().min(0.0))
                };
                constraints.push(constraint::geq(issued, per * *x + (per * f - firm_issue)));
                if let Some(plan) = start {
                    let q = plan.receipts[line.parent][t + lead];
                    let total = if q + f > 0.0 {
                        scenario.issue(line, q + f)
                    } else {
                        0.0
                    };
                    start_values.push((issued, total - firm_issue));
                }
                inflow -= issued;
            }
            let stock = if item.allows_backlog() {
                let floor = if last && reachable {
                    item.ending_stock
                } else {
                    0.0
                };
                let on_hand = vars.add(variable().min(floor));
                objective += item.holding_cost[t] * on_hand;
                if last {
                    constraints.push(constraint::eq(inflow, on_hand));
                    Expression::from(on_hand)
                } else {
                    let owed = vars.add(variable().min(0.0));
                    objective += item.backlog_cost.unwrap_or(0.0) * owed;
                    constraints.push(constraint::eq(inflow, on_hand - owed));
                    on_hand - owed
                }
            } else {
                let floor = match (reachable, last) {
                    (false, _) => 0.0,
                    (true, false) => item.safety_stock,
                    (true, true) => item.safety_stock.max(item.ending_stock),
                };
                let on_hand = vars.add(variable().min(floor));
                objective += item.holding_cost[t] * on_hand;
                constraints.push(constraint::eq(inflow, on_hand));
                Expression::from(on_hand)
            };
            row.push(stock.clone());
            previous = stock;
        }
        stocks.push(row);
    }
    echelon_inequalities(scenario, &receipt, &stocks, &mut vars, &mut constraints);
    // Capacity by resource and release bucket, firm orders' load included.
    let firm_load = crate::replan::firm_load(scenario);
    for (r, resource) in scenario.resources.iter().enumerate() {
        for (t, &pinned) in firm_load[r].iter().enumerate() {
            let mut load = Expression::from(0.0);
            let mut any = false;
            for routing in scenario.routings.iter().filter(|x| x.resource == r) {
                let item = &scenario.items[routing.item];
                if let Some(Some((y, x))) = receipt[routing.item].get(t + item.lead_time) {
                    load += routing.setup_time * *y + routing.per_unit * *x;
                    any = true;
                }
            }
            if !any {
                continue;
            }
            if resource.overtime_capacity[t] > 0.0 {
                let overtime = vars.add(variable().min(0.0).max(resource.overtime_capacity[t]));
                objective += resource.overtime_cost * overtime;
                load -= overtime;
            }
            constraints.push(load.leq(resource.capacity[t] - pinned));
        }
    }
    let index: HashMap<Variable, usize> = vars
        .iter_variables_with_def()
        .enumerate()
        .map(|(k, (v, _))| (v, k))
        .collect();
    let mut problem = vars
        .minimise(objective)
        .using(good_lp::solvers::highs::highs);
    for c in constraints {
        problem.add_constraint(c);
    }
    let Ok(mut model) = problem.try_into_inner() else {
        return MilpResult::without_plan(MilpStatus::NoPlan, periods, items, started);
    };
    configure(&mut model, options, 1e-9);
    if !start_values.is_empty() {
        let mut values = vec![0.0; index.len()];
        for (v, value) in &start_values {
            values[index[v]] = *value;
        }
        // A start HiGHS cannot use is only a lost head start.
        let _ = model.try_set_solution(Some(&values), None, None, None);
    }
    let Ok(solved) = model.try_solve() else {
        return MilpResult::without_plan(MilpStatus::NoPlan, periods, items, started);
    };
    let empty = matches!(solved.status(), HighsModelStatus::ModelEmpty);
    let status = if empty {
        HighsModelStatus::Optimal
    } else {
        solved.status()
    };
    let hit_time_limit = matches!(status, HighsModelStatus::ReachedTimeLimit);
    if matches!(
        status,
        HighsModelStatus::Infeasible | HighsModelStatus::UnboundedOrInfeasible
    ) {
        return MilpResult {
            lower_bound: f64::INFINITY,
            ..MilpResult::without_plan(MilpStatus::Infeasible, periods, items, started)
        };
    }
    if options.relax {
        // The relaxation's optimum is a lower bound on every plan; its
        // fractional setups are no plan.
        let optimal = matches!(status, HighsModelStatus::Optimal);
        return MilpResult {
            lower_bound: if optimal {
                solved.objective_value() + constant
            } else {
                f64::NEG_INFINITY
            },
            hit_time_limit,
            ..MilpResult::without_plan(MilpStatus::NoPlan, periods, items, started)
        };
    }
    // HiGHS's code for a feasible solution is 2 (see capacity::milp).
    let has_plan = solved.int_info_value(c"primal_solution_status") == Ok(2)
        || matches!(status, HighsModelStatus::Optimal);
    let dual = if empty {
        None
    } else {
        solved.double_info_value(c"mip_dual_bound").ok()
    };
    if !has_plan {
        return MilpResult {
            lower_bound: dual.map_or(f64::NEG_INFINITY, |b| b + constant),
            hit_time_limit,
            ..MilpResult::without_plan(MilpStatus::NoPlan, periods, items, started)
        };
    }
    let solution = solved.get_solution();
    let values = solution.columns();
    let value = |v: &Variable| values[index[v]];
    let mut receipts = vec![vec![0.0; periods]; items];
    let whole = whole_requirements(scenario);
    for (i, item_columns) in columns.iter().enumerate() {
        for &(j, _, x, count) in &item_columns.orders {
            let quantity = match (count, scenario.items[i].lot_multiple) {
                (Some(k), Some(m)) => value(&k).round() * m,
                _ => value(&x),
            };
            receipts[i][j] = snap_given(&scenario.items[i], quantity, whole[i]);
        }
    }
    let solver_objective = solved.objective_value() + constant;
    let dual_bound = dual.map_or(solver_objective, |b| b + constant);
    let plan = Plan { receipts };
    let evaluation = evaluate(scenario, &plan);
    let plan_cost = evaluation.total_cost();
    let gap = if plan_cost.abs() > 1e-9 {
        (plan_cost - dual_bound) / plan_cost.abs()
    } else {
        plan_cost - dual_bound
    };
    // With relaxed lot counts the plan read back is rounded to multiples:
    // HiGHS's own objective is what its bound proves.
    let proven = if options.relax_multiples {
        let judged = solver_objective;
        matches!(status, HighsModelStatus::Optimal)
            && judged - dual_bound <= OPTIMALITY_GAP * judged.abs().max(1e-9)
    } else {
        matches!(status, HighsModelStatus::Optimal) && gap <= OPTIMALITY_GAP
    };
    MilpResult {
        status: if proven {
            MilpStatus::Optimal
        } else {
            MilpStatus::Feasible
        },
        receipts: plan.receipts,
        objective: plan_cost,
        solver_objective,
        lower_bound: dual_bound.min(plan_cost),
        seconds: started.elapsed().as_secs_f64(),
        hit_time_limit,
        shortfall: Vec::new(),
    }
}

/// The longest run of buckets an echelon inequality spans (it bounds the
/// rows added to items x buckets x this).
const ECHELON_SPAN: usize = 0;

/// Echelon inequalities, a strengthening of the big-M rows.
///
/// The echelon stock of item i at the end of bucket k is its own stock plus,
/// for every parent p, per(p, i) times p's echelon stock and p's orders
/// released by k but not yet received:
///
/// ```text
/// E[i][k] = s[i][k] + sum over p of per(p,i) (E[p][k] + receipts of p in k+1..k+L_p)
/// ```
///
/// A parent's release moves per(p, i) units from i's stock into p's pipeline,
/// so it leaves E[i] unchanged. E[i] falls only by the echelon demand
/// De[i][t] = d[i][t] + sum of per(p,i) De[p][t]. It rises by i's own receipts
/// (planned and firm) and by the echelon scheduled receipts
/// Re[i][t] = r[i][t] + sum of per(p,i) Re[p][t] (parents' open orders, whose
/// components were issued before the horizon). So, over buckets j..k,
///
/// ```text
/// sum of x[i][j..k] = E[i][k] - E[i][j-1] + De[i][j..k] - (firm + Re)[i][j..k]
/// ```
///
/// Where no stock in i's echelon can go negative (neither i nor any item
/// above it allows backlog), E[i][j-1] >= 0. Then
/// x[i][j] <= max(0, De[i][j..k] - (firm + Re)[i][j..k]) y[i][j] + E[i][k] holds
/// for every plan. With y = 0 both sides allow x = 0; with y = 1 it is the
/// sum above. This is the (l, S) inequality of the single item, with the
/// single-bucket S, written on echelon stock (see Pochet and Wolsey,
/// "Production Planning by Mixed Integer Programming", Springer 2006, on
/// echelon reformulations of multi-level problems; cited from memory).
fn echelon_inequalities(
    scenario: &Scenario,
    receipt: &[Vec<Option<(Variable, Variable)>>],
    stocks: &[Vec<Expression>],
    vars: &mut ProblemVariables,
    constraints: &mut Vec<good_lp::Constraint>,
) {
    let periods = scenario.periods();
    let items = scenario.items.len();
    let mut demand = vec![vec![0.0; periods]; items];
    let mut inflow = vec![vec![0.0; periods]; items];
    let mut eligible = vec![false; items];
    let mut echelon: Vec<Vec<Option<Variable>>> = vec![vec![None; periods]; items];
    for i in scenario.level_order() {
        let item = &scenario.items[i];
        let parents: Vec<&crate::model::BomLine> = scenario
            .bom
            .iter()
            .filter(|line| line.component == i)
            .collect();
        // Rounded issues are not linear in the parents' echelon stock.
        eligible[i] = !item.allows_backlog()
            && parents
                .iter()
                .all(|line| eligible[line.parent] && !scenario.rounds_issue(line));
        if !eligible[i] {
            continue;
        }
        for t in 0..periods {
            demand[i][t] = item.demand[t];
            inflow[i][t] = item.receipts[t];
            for line in &parents {
                let per = line.per_parent_unit();
                demand[i][t] += per * demand[line.parent][t];
                inflow[i][t] += per * inflow[line.parent][t];
            }
        }
        for t in 0..periods {
            let e = vars.add(variable().min(0.0));
            let mut definition = stocks[i][t].clone();
            for line in &parents {
                let p = line.parent;
                let per = line.per_parent_unit();
                let Some(parent_echelon) = echelon[p][t] else {
                    continue;
                };
                definition += per * parent_echelon;
                let lead = scenario.items[p].lead_time;
                let arriving = t + 1..(t + lead + 1).min(periods);
                let firm = &scenario.items[p].firm[arriving.clone()];
                for (&quantity, column) in firm.iter().zip(&receipt[p][arriving]) {
                    definition += per * quantity;
                    if let Some((_, x)) = column {
                        definition += per * *x;
                    }
                }
            }
            constraints.push(constraint::eq(e, definition));
            echelon[i][t] = Some(e);
        }
        for (j, column) in receipt[i].iter().enumerate() {
            let Some((y, x)) = *column else {
                continue;
            };
            let mut net = 0.0;
            for k in j..(j + ECHELON_SPAN).min(periods) {
                net += demand[i][k] - inflow[i][k] - item.firm[k];
                let Some(e) = echelon[i][k] else { continue };
                constraints.push(constraint::leq(x - e, net.max(0.0) * y));
            }
        }
    }
}

/// Whether every requirement on each item is whole: its own data, and every
/// parent whole with a whole quantity per (scrap included).
fn whole_requirements(scenario: &Scenario) -> Vec<bool> {
    let mut whole: Vec<bool> = scenario.items.iter().map(has_whole_data).collect();
    for i in scenario.level_order() {
        for line in scenario.bom.iter().filter(|l| l.component == i) {
            // A rounded issue is whole whatever the parent's quantities.
            whole[i] &= scenario.rounds_issue(line)
                || (whole[line.parent] && line.per_parent_unit().fract() == 0.0);
        }
    }
    whole
}
