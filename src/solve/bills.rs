//! The methods over a bill of material: the level-by-level methods and
//! the exact method across levels (the joint program of `multilevel`,
//! after the exact method applied level by level), as results with their
//! notes. The programs themselves live in `multilevel`.

use crate::eval::{evaluate, Evaluation};
use crate::model::{Plan, Scenario};
use crate::multilevel::{fix_optimize, joint, milp, releases, EXACT_BY_LEVEL, LARGE_BILL};
use crate::solve::{MethodResult, Status};

/// Plans `scenario` one level at a time with `plan_level`, which gets a
/// scenario of one level's items (no bill, their demand raised by what the
/// levels above release, capacity less what those levels use) and returns
/// that scenario's result. The plan is then evaluated across all levels.
pub(crate) fn by_level(
    scenario: &Scenario,
    method: &'static str,
    plan_level: &dyn Fn(&Scenario) -> MethodResult,
) -> MethodResult {
    let periods = scenario.periods();
    let codes = scenario.low_level_codes();
    let deepest = codes.iter().copied().max().unwrap_or(0);
    let mut plan = Plan::empty(scenario.items.len(), periods);
    let mut used = vec![vec![0.0; periods]; scenario.resources.len()];
    let mut components = Vec::new();
    let mut notes = Vec::new();
    let mut unknown = false;
    for level in 0..=deepest {
        let items: Vec<usize> = (0..scenario.items.len())
            .filter(|&i| codes[i] == level)
            .collect();
        if items.is_empty() {
            continue;
        }
        let dependent = scenario.dependent_requirements(&releases(scenario, &plan));
        let mut sub = scenario.subset(&items);
        sub.bom.clear();
        for (k, &i) in items.iter().enumerate() {
            for (d, q) in sub.items[k].demand.iter_mut().zip(&dependent[i]) {
                *d += q;
            }
        }
        for (resource, load) in sub.resources.iter_mut().zip(&used) {
            let buckets = resource
                .capacity
                .iter_mut()
                .zip(resource.overtime_capacity.iter_mut())
                .zip(load);
            for ((regular, extra), &used) in buckets {
                let over = (used - *regular).max(0.0);
                *regular = (*regular - used).max(0.0);
                *extra = (*extra - over).max(0.0);
            }
        }
        let result = plan_level(&sub);
        for (k, &i) in items.iter().enumerate() {
            plan.receipts[i] = result.plan.receipts[k].clone();
        }
        for (load, level_load) in used.iter_mut().zip(&result.evaluation.resources) {
            for (t, slot) in load.iter_mut().enumerate() {
                *slot += level_load.load(t);
            }
        }
        unknown |= result.status == Status::Unknown;
        components.extend(result.components);
        notes.extend(result.notes);
    }
    let evaluation = evaluate(scenario, &plan);
    let status = if unknown {
        Status::Unknown
    } else if evaluation.feasible {
        Status::Feasible
    } else {
        Status::Infeasible
    };
    // Said once, on the exact method's row; a rule is never proven anyway.
    if method == EXACT_BY_LEVEL {
        notes.insert(
            0,
            format!(
            "planned level by level ({} levels): each level sees only what the levels above release, so the plan is not proven least-cost across levels",
                deepest + 1
            ),
        );
    }
    MethodResult {
        components,
        method,
        status,
        plan,
        evaluation,
        lower_bound: None,
        notes,
    }
}

/// The exact method applied one level at a time (no joint program), with
/// the whole time limit shared between the levels.
pub(crate) fn exact_by_level(
    scenario: &Scenario,
    options: &crate::capacity::milp::MilpOptions,
) -> MethodResult {
    let levels = scenario.low_level_codes().into_iter().max().unwrap_or(0) + 1;
    let level_options = crate::capacity::milp::MilpOptions {
        time_limit: options.time_limit / levels as f64,
        log_file: None,
        ..options.clone()
    };
    by_level(scenario, EXACT_BY_LEVEL, &|sub| {
        super::solve_exact_with(sub, &level_options, &super::Silent)
    })
}

/// The exact method over a bill of material: the exact method level by
/// level first (it is the comparison row `exact-by-level`, and HiGHS's
/// start), then the joint program over all levels with the time left. The
/// joint result keeps the level-by-level plan where HiGHS finds nothing
/// better, so it is never dearer; its bound is HiGHS's. Returns (joint,
/// level by level).
pub(crate) fn solve_exact(
    scenario: &Scenario,
    options: &crate::capacity::milp::MilpOptions,
    progress: &dyn super::Progress,
) -> (MethodResult, MethodResult) {
    use crate::capacity::milp::MilpStatus;
    let started = std::time::Instant::now();
    let levels = scenario.low_level_codes().into_iter().max().unwrap_or(0) + 1;
    let large = scenario.items.len() * scenario.periods() >= LARGE_BILL;
    // A share of the time limit for the levels, shared between them: a
    // quarter, or less for a large bill, where fix-and-optimize needs it.
    let level_share = if large { 0.15 } else { 0.25 };
    let level_options = crate::capacity::milp::MilpOptions {
        time_limit: options.time_limit * level_share / levels as f64,
        log_file: None,
        ..options.clone()
    };
    let staged = by_level(scenario, EXACT_BY_LEVEL, &|sub| {
        super::solve_exact_with(sub, &level_options, &super::Silent)
    });
    let mut notes = vec![format!(
        "planned jointly across the {levels} levels of the bill of material (one mixed-integer program over every item)"
    )];
    let mut resources: Vec<String> = scenario
        .routings
        .iter()
        .map(|r| scenario.resources[r.resource].id.clone())
        .collect();
    resources.sort();
    resources.dedup();
    let component = |status| super::Component {
        items: scenario.items.iter().map(|item| item.id.clone()).collect(),
        resources: resources.clone(),
        solver: "milp",
        status,
    };
    progress.milp_started(1, 1, scenario.items.len());
    if large && staged.evaluation.feasible {
        let result = large_bill(scenario, options, started, &staged, notes);
        let result = MethodResult {
            components: vec![component(result.status)],
            ..result
        };
        progress.milp_finished(1, 1, result.status, result.total_cost(), result.gap());
        return (result, staged);
    }
    // The best plan so far, which the joint program starts from and keeps
    // where it finds nothing cheaper.
    let incumbent = (staged.plan.clone(), staged.evaluation.clone());
    let joint_options = crate::capacity::milp::MilpOptions {
        time_limit: (options.time_limit - started.elapsed().as_secs_f64()).max(1.0),
        log_file: progress.solver_log(),
        ..options.clone()
    };
    let start = incumbent.1.feasible.then_some(&incumbent.0);
    let joint = joint::solve(scenario, &joint_options, start);
    let staged_cost = staged.evaluation.total_cost();
    let result = match joint.status {
        MilpStatus::Infeasible => {
            notes.push(
                "no plan meets every constraint across the levels; the plan shown is the level-by-level one, read it for the load, do not release it"
                    .into(),
            );
            MethodResult {
                components: vec![component(Status::Infeasible)],
                method: super::EXACT,
                status: Status::Infeasible,
                lower_bound: None,
                notes,
                ..staged.clone()
            }
        }
        MilpStatus::NoPlan if !staged.evaluation.feasible => MethodResult {
            components: vec![component(Status::Unknown)],
            method: super::EXACT,
            status: Status::Unknown,
            lower_bound: None,
            notes: {
                notes.push(format!(
                    "the time limit of {} s ran out before HiGHS found a plan across the levels, and the level-by-level plan breaks a constraint; the plan shown is that one, do not release it",
                    options.time_limit
                ));
                notes
            },
            ..staged.clone()
        },
        _ => {
            let joint_plan = Plan {
                receipts: joint.receipts.clone(),
            };
            let joint_evaluation = evaluate(scenario, &joint_plan);
            let take_joint = joint.status != MilpStatus::NoPlan
                && joint_evaluation.feasible
                && (!incumbent.1.feasible
                    || joint_evaluation.total_cost() <= incumbent.1.total_cost());
            let (plan, evaluation) = if take_joint {
                (joint_plan, joint_evaluation)
            } else {
                notes.push(
                    "HiGHS found no plan cheaper than the level-by-level one within the time limit; that plan is kept".into(),
                );
                incumbent.clone()
            };
            let (plan, evaluation) = if joint.status == MilpStatus::Optimal {
                (plan, evaluation)
            } else {
                tidied(scenario, plan, evaluation)
            };
            let cost = evaluation.total_cost();
            let bound = joint.lower_bound.min(cost);
            let proven = joint.status == MilpStatus::Optimal
                && (cost - bound) <= crate::capacity::milp::OPTIMALITY_GAP * cost.abs().max(1e-9);
            let status = judged(evaluation.feasible, proven);
            if staged.evaluation.feasible && evaluation.feasible {
                notes.push(saving_note(staged_cost, cost));
            }
            MethodResult {
                components: vec![component(status)],
                method: super::EXACT,
                status,
                plan,
                evaluation,
                lower_bound: match status {
                    Status::Optimal | Status::Feasible if bound.is_finite() => Some(bound),
                    _ => None,
                },
                notes,
            }
        }
    };
    progress.milp_finished(
        1,
        1,
        result.status,
        result.evaluation.total_cost(),
        result.gap(),
    );
    (result, staged)
}

/// An unproven plan with orders that do not pay for their setup merged
/// away (`capacity::tidy`), evaluated again.
fn tidied(scenario: &Scenario, mut plan: Plan, evaluation: Evaluation) -> (Plan, Evaluation) {
    use crate::capacity::tidy::{feasible_cost, tidy};
    let judge = |receipts: &[Vec<f64>]| feasible_cost(scenario, receipts);
    if tidy(&mut plan.receipts, &judge).is_none() {
        return (plan, evaluation);
    }
    let evaluation = evaluate(scenario, &plan);
    (plan, evaluation)
}

/// A large bill: fix-and-optimize across the levels from the feasible
/// level-by-level plan until nine tenths of the time limit, then the bound
/// of the joint program's LP relaxation. HiGHS on the whole program
/// overran its time limit by half on the 100-item bill (its root cuts do not
/// look at the clock) and found nothing better than its start; the
/// relaxation takes a fraction of a second (docs/benchmarks.md).
fn large_bill(
    scenario: &Scenario,
    options: &crate::capacity::milp::MilpOptions,
    started: std::time::Instant,
    staged: &MethodResult,
    mut notes: Vec<String>,
) -> MethodResult {
    use crate::capacity::milp::{MilpOptions, OPTIMALITY_GAP};
    let deadline = started + std::time::Duration::from_secs_f64(options.time_limit * 0.9);
    let searched = fix_optimize::improve(scenario, options, &staged.plan, deadline);
    notes[0] = format!(
        "planned across the {} levels of the bill of material by fix-and-optimize (smaller parts of the joint program re-solved), from the level-by-level plan: {} of {} subproblems improved it",
        scenario.low_level_codes().into_iter().max().unwrap_or(0) + 1,
        searched.improved,
        searched.subproblems
    );
    let relaxation = milp::solve(
        scenario,
        &MilpOptions {
            relax: true,
            fixed: None,
            log_file: None,
            time_limit: (options.time_limit - started.elapsed().as_secs_f64()).max(5.0),
            ..options.clone()
        },
        None,
    );
    let evaluation = evaluate(scenario, &searched.plan);
    let cost = evaluation.total_cost();
    // A relaxation above a plan known to be feasible (or one reported
    // infeasible) would mean a fault in the model; it proves nothing.
    let bound = Some(relaxation.lower_bound)
        .filter(|b| b.is_finite() && *b <= cost + OPTIMALITY_GAP * cost.abs().max(1.0))
        .map_or(f64::NEG_INFINITY, |b| b.min(cost));
    if bound.is_finite() {
        notes.push(
            "the lower bound comes from the joint program with fractional setups allowed".into(),
        );
    } else {
        notes.push(
            "the joint program with fractional setups allowed did not finish, so there is no lower bound".into(),
        );
    }
    let proven = bound.is_finite() && cost - bound <= OPTIMALITY_GAP * cost.abs().max(1e-9);
    let status = judged(evaluation.feasible, proven);
    notes.push(saving_note(staged.evaluation.total_cost(), cost));
    MethodResult {
        components: Vec::new(),
        method: super::EXACT,
        status,
        plan: searched.plan,
        evaluation,
        lower_bound: bound.is_finite().then_some(bound),
        notes,
    }
}

/// A plan's status from its evaluation and its proof.
fn judged(feasible: bool, proven: bool) -> Status {
    if !feasible {
        Status::Infeasible
    } else if proven {
        Status::Optimal
    } else {
        Status::Feasible
    }
}

/// The note on what the joint plan saves against level by level.
fn saving_note(staged_cost: f64, cost: f64) -> String {
    format!(
        "the joint plan costs {} less than the exact method applied level by level ({} against {})",
        crate::report::money(staged_cost - cost),
        crate::report::money(cost),
        crate::report::money(staged_cost)
    )
}
