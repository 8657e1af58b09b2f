//! Why a plan is infeasible, in words: the summary of
//! `crate::infeasibility` as one line a planner reads beside the plan's
//! cost ("LINE over capacity in 2 periods from period 2, by 10 there").

use crate::eval::ViolationKind;
use crate::infeasibility::{Breach, Infeasibility, ItemShortage, ResourceOverload};
use crate::model::Scenario;

use super::quantity;

/// Reasons listed before the rest are only counted.
const SHOWN: usize = 3;

/// The reasons in one line, the overloads first, then shortages and broken
/// rules; past three, the rest are counted.
pub fn infeasibility(scenario: &Scenario, why: &Infeasibility) -> String {
    let mut parts: Vec<String> = why
        .overloads
        .iter()
        .map(|o| overload(scenario, o))
        .chain(why.shortages.iter().map(shortage))
        .chain(why.breaches.iter().map(breach))
        .collect();
    if parts.len() > SHOWN {
        let more = parts.len() - SHOWN;
        parts.truncate(SHOWN);
        parts.push(format!("and {more} more"));
    }
    parts.join("; ")
}

/// "in period 2" or "in 3 periods from period 2".
fn span(first: usize, periods: usize) -> String {
    if periods == 1 {
        format!("in period {first}")
    } else {
        format!("in {periods} periods from period {first}")
    }
}

fn overload(scenario: &Scenario, o: &ResourceOverload) -> String {
    let overtime = scenario
        .resources
        .iter()
        .find(|r| r.id == o.resource)
        .is_some_and(|r| r.overtime_capacity.iter().any(|&c| c > 0.0));
    let limit = if overtime {
        "capacity and overtime"
    } else {
        "capacity"
    };
    let mut text = format!(
        "{} over {limit} {}, by {}",
        o.resource,
        span(o.first_period, o.periods),
        quantity(o.excess)
    );
    if o.periods > 1 {
        text.push_str(&format!(" there ({} in all)", quantity(o.total_excess)));
    }
    text
}

fn shortage(s: &ItemShortage) -> String {
    let mut text = format!(
        "item {} short {}, by {}",
        s.item,
        span(s.first_period, s.periods),
        quantity(s.quantity)
    );
    if s.periods > 1 {
        text.push_str(" there");
    }
    text
}

fn breach(b: &Breach) -> String {
    // "a lot of 40 below min_lot 50": what was planned against its rule.
    let against = |subject: &str, relation: &str| {
        format!(
            "{subject} {} {relation} {}",
            quantity(b.quantity),
            quantity(b.limit)
        )
    };
    let what = match b.kind {
        ViolationKind::BelowMinLot => against("a lot of", "below min_lot"),
        ViolationKind::NotLotMultiple => against("a lot of", "not a multiple of"),
        ViolationKind::AboveMaxLot => against("a lot of", "above max_lot"),
        ViolationKind::ReleaseBeforeStart => format!(
            "an order past due (released in period {}, before the horizon)",
            quantity(b.limit)
        ),
        ViolationKind::InsideFrozenHorizon => "a new order in the frozen horizon".to_string(),
        ViolationKind::SafetyStock => against("stock", "below safety stock"),
        ViolationKind::EndingStock => against("ending stock", "below its target"),
    };
    let at = if b.periods == 1 {
        format!("in period {}", b.period)
    } else {
        format!("from period {} ({} times)", b.period, b.periods)
    };
    format!("item {}: {what} {at}", b.item)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn broken(kind: ViolationKind, quantity: f64, limit: f64, periods: usize) -> String {
        breach(&Breach {
            item: "A".into(),
            period: 3,
            kind,
            quantity,
            limit,
            periods,
        })
    }

    #[test]
    fn each_broken_rule_reads_as_a_sentence() {
        assert_eq!(
            broken(ViolationKind::BelowMinLot, 40.0, 50.0, 1),
            "item A: a lot of 40 below min_lot 50 in period 3"
        );
        assert_eq!(
            broken(ViolationKind::NotLotMultiple, 45.0, 10.0, 2),
            "item A: a lot of 45 not a multiple of 10 from period 3 (2 times)"
        );
        assert_eq!(
            broken(ViolationKind::AboveMaxLot, 120.0, 100.0, 1),
            "item A: a lot of 120 above max_lot 100 in period 3"
        );
        assert_eq!(
            broken(ViolationKind::SafetyStock, 5.0, 20.0, 1),
            "item A: stock 5 below safety stock 20 in period 3"
        );
        assert_eq!(
            broken(ViolationKind::EndingStock, 0.0, 30.0, 1),
            "item A: ending stock 0 below its target 30 in period 3"
        );
        assert_eq!(
            broken(ViolationKind::InsideFrozenHorizon, 10.0, 0.0, 1),
            "item A: a new order in the frozen horizon in period 3"
        );
    }
}
