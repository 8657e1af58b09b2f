//! The summary of report.html in words: what the plan costs, what it
//! saves against the rule in use, what is wrong with a plan that is not
//! feasible, and what its status proves.

use super::{percent, Cash};
use crate::eval::Evaluation;
use crate::model::Scenario;
use crate::report::figures;
use crate::solve::{MethodResult, Outcome, Status};

/// Names in order of first appearance, each once.
fn distinct<'a>(names: impl Iterator<Item = &'a str>) -> String {
    let mut seen: Vec<&str> = Vec::new();
    for name in names {
        if !seen.contains(&name) {
            seen.push(name);
        }
    }
    seen.join(", ")
}

fn times(n: usize, one: &str, many: &str) -> String {
    format!("{n} {}", if n == 1 { one } else { many })
}

/// What is wrong with a plan that is not feasible, in words.
pub(super) fn faults_in_words(evaluation: &Evaluation) -> String {
    let mut parts = Vec::new();
    let overloads = &evaluation.overloads;
    if !overloads.is_empty() {
        parts.push(format!(
            "its plan needs more than the capacity and overtime available in {} ({})",
            times(overloads.len(), "bucket", "buckets"),
            distinct(overloads.iter().map(|o| o.resource.as_str()))
        ));
    }
    let shortages = &evaluation.shortages;
    if !shortages.is_empty() {
        parts.push(format!(
            "it runs short of stock {} ({})",
            times(shortages.len(), "time", "times"),
            distinct(shortages.iter().map(|s| s.item.as_str()))
        ));
    }
    let breaches: Vec<_> = evaluation.violations.iter().filter(|v| v.binding).collect();
    if !breaches.is_empty() {
        parts.push(format!(
            "it breaks a lot or stock rule {} ({})",
            times(breaches.len(), "time", "times"),
            distinct(breaches.iter().map(|v| v.item.as_str()))
        ));
    }
    parts.join("; ")
}

/// The status of the plan shown, stated as what is proven.
fn status_sentence(scenario: &Scenario, chosen: &MethodResult, cash: &Cash) -> String {
    if !chosen.is_exact() {
        return if chosen.evaluation.feasible {
            format!(
                "Status: the {} rule's plan is feasible; it is not optimized.",
                chosen.method
            )
        } else {
            format!(
                "Status: the {} rule's plan is not feasible: {}.",
                chosen.method,
                faults_in_words(&chosen.evaluation)
            )
        };
    }
    match chosen.status {
        Status::Optimal => {
            "Status: proven optimal. No plan that meets every constraint costs less.".into()
        }
        Status::Feasible => match figures::gap_words(scenario, chosen, |x| cash.of(x)) {
            Some(words) => format!(
                "Status: feasible, not proven optimal. The solver stopped before it could prove optimality; {words}."
            ),
            None => "Status: feasible, not proven optimal.".into(),
        },
        Status::Infeasible => "Status: infeasible. No plan meets every constraint; the plan shown is lot-for-lot, for reference only. The notes below say what stands in the way.".into(),
        Status::Unknown => "Status: unknown. The time limit ran out before the solver found a plan; the plan shown is lot-for-lot and may overload capacity.".into(),
    }
}

/// The summary in words: cost, saving against the rule, status.
pub(super) fn summary_sentences(scenario: &Scenario, outcome: &Outcome) -> Vec<String> {
    let cash = Cash(scenario.currency.as_deref());
    let chosen = &outcome.chosen;
    let mut sentences = Vec::new();
    // "Optimal" only when proven; otherwise the plan is the best one found.
    let (ours, our) = if chosen.status == Status::Optimal {
        ("The optimal plan", "the optimal plan")
    } else {
        ("The best plan found", "the best plan found")
    };
    let saving = figures::saving(scenario, outcome).filter(|_| chosen.is_exact());
    match saving {
        Some(s) => {
            let reference = s.reference;
            let described = if s.reference_is_current_rule {
                "the fixed-lot rule in use today".to_string()
            } else {
                format!("the cheapest lot rule, {}", reference.method)
            };
            let share = match (s.controllable_fraction, s.fraction) {
                (Some(c), Some(f)) => format!(
                    " ({} of the cost a plan controls, {} of the total)",
                    percent(c.abs(), 1),
                    percent(f.abs(), 1)
                ),
                (None, Some(f)) => format!(" ({} of the total)", percent(f.abs(), 1)),
                _ => String::new(),
            };
            let cost = cash.of(chosen.total_cost());
            sentences.push(if s.amount > 0.005 {
                format!(
                    "{ours} costs {cost}: {}{share} less than {described} ({}).",
                    cash.of(s.amount),
                    cash.of(reference.total_cost())
                )
            } else if s.amount < -0.005 {
                format!(
                    "{ours} costs {cost}: {}{share} more than {described} ({}).",
                    cash.of(-s.amount),
                    cash.of(reference.total_cost())
                )
            } else {
                format!("{ours} costs {cost}, the same as {described}.")
            });
            if !reference.evaluation.feasible {
                sentences.push(format!(
                    "The {} rule cannot be followed as it stands here: {}.",
                    reference.method,
                    faults_in_words(&reference.evaluation)
                ));
            }
            let (theirs, ours) = (
                reference.evaluation.ending_stock_value(),
                chosen.evaluation.ending_stock_value(),
            );
            if (theirs - ours).abs() > 0.5 {
                let net = s.net_of_ending_stock;
                let verdict = if net >= 0.0 {
                    format!("{our} still saves {}", cash.of(net))
                } else {
                    format!("{our} costs {} more", cash.of(-net))
                };
                sentences.push(format!(
                    "Stock left at the end of the horizon is part of these costs: the {} rule ends with stock worth {}, {our} with {}. Counting that stock at its value, {verdict}.",
                    reference.method,
                    cash.of(theirs),
                    cash.of(ours)
                ));
            }
        }
        None if chosen.is_exact() => {
            sentences.push(format!("{ours} costs {}.", cash.of(chosen.total_cost())));
        }
        None => sentences.push(format!(
            "This report shows the {} rule's plan (chosen with --method); it costs {}.",
            chosen.method,
            cash.of(chosen.total_cost())
        )),
    }
    sentences.push(status_sentence(scenario, chosen, &cash));
    sentences
}
