//! The analyst's actions on a proposed plan, in words: what to do with each
//! order (`crate::actions`), what leaves each shortage short, and why a
//! check has no best plan to compare with.

use crate::actions::{Action, ActionKind, ShortageOrders};
use crate::check::CheckReport;
use crate::model::Scenario;

use super::quantity;

/// "1 week", "3 weeks".
fn buckets(scenario: &Scenario, n: i64) -> String {
    let unit = scenario.calendar.kind.name();
    if n.abs() == 1 {
        format!("1 {unit}")
    } else {
        format!("{} {unit}s", n.abs())
    }
}

/// The action on one order, in words.
pub fn action(scenario: &Scenario, a: &Action) -> String {
    let resized = match (a.order, a.target) {
        (Some(o), Some(t)) if (o.quantity - t.quantity).abs() > 1e-6 * (1.0 + t.quantity) => {
            format!(
                ", quantity {} instead of {}",
                quantity(t.quantity),
                quantity(o.quantity)
            )
        }
        _ => String::new(),
    };
    let now = if a.release_now { "; release now" } else { "" };
    let to = a.target.map_or(0, |t| t.period);
    match a.kind {
        ActionKind::PastDue => format!(
            "past due: released in period {}, before the horizon starts; if it is already out, list it in receipts.csv, else expedite or cancel it",
            a.order.map_or(0, |o| o.release_period)
        ),
        ActionKind::ReleaseNow => format!("release now{resized}"),
        ActionKind::MoveIn => format!(
            "move in by {} to period {to}{resized}{now}",
            buckets(scenario, a.by.unwrap_or(0))
        ),
        ActionKind::MoveOut => format!(
            "move out by {} to period {to}{resized}{now}",
            buckets(scenario, a.by.unwrap_or(0))
        ),
        ActionKind::Keep if a.target.is_none() => "not yet due".to_string(),
        ActionKind::Keep if resized.is_empty() => "keep".to_string(),
        ActionKind::Keep => format!("keep{resized}"),
        ActionKind::Cancel => {
            "cancel: the best plan has no order to take its place".to_string()
        }
        ActionKind::Add => {
            let t = a.target.expect("an added order has its target");
            format!(
                "add {} received in period {} (released in period {}){now}",
                quantity(t.quantity),
                t.period,
                t.release_period
            )
        }
    }
}

/// Which order leaves a shortage short, in words.
pub fn shortage(around: &ShortageOrders) -> String {
    match (around.order, around.next_order) {
        (Some(o), Some(n)) => format!(
            "lot of {} received in period {} runs out; next in period {}",
            quantity(o.quantity),
            o.period,
            n.period
        ),
        (Some(o), None) => format!(
            "lot of {} received in period {} runs out; no order after it",
            quantity(o.quantity),
            o.period
        ),
        (None, Some(n)) => format!("first order received in period {}, too late", n.period),
        (None, None) => "no order covers it".to_string(),
    }
}

/// Why a check has no best plan to compare with; `None` when it has one.
pub fn best_note(report: &CheckReport) -> Option<String> {
    if report.skipped {
        Some("not solved: --no-solve checks the proposal alone, so there is no best plan and no best_cost; only past-due and release-now actions are given".to_string())
    } else if report.best.is_none() {
        Some("the scenario itself has no feasible plan".to_string())
    } else {
        None
    }
}
