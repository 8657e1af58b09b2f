//! Pegging: which parent orders make up each component requirement, and
//! which of them a component's shortage leaves without parts.
//!
//! Both are read from an evaluation, so they explode exactly what
//! `eval::evaluate` exploded: a parent's planned and firm releases, by
//! release bucket, times the line's quantity per (scrap included), in the
//! same bucket.

use crate::eval::Evaluation;
use crate::model::Scenario;

/// One parent order's call on one component.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Peg {
    pub component: usize,
    /// The bucket the component is needed in: the parent order's release.
    pub bucket: usize,
    /// Units of the component the order calls for.
    pub quantity: f64,
    pub parent: usize,
    /// The parent order's receipt bucket (its `period` in plan.csv).
    pub parent_receipt: usize,
    /// The parent order's quantity.
    pub parent_quantity: f64,
    /// A firm order (orders-firm.csv, or pinned by a rolling run).
    pub firm: bool,
}

/// Every parent order's call on its components, by component, bucket and
/// then the bill's order of lines (a firm order before a planned one).
pub fn pegs(scenario: &Scenario, evaluation: &Evaluation) -> Vec<Peg> {
    let mut pegs = Vec::new();
    for line in &scenario.bom {
        let record = &evaluation.items[line.parent];
        let lead = scenario.items[line.parent].lead_time;
        let releases = record.firm_releases.iter().zip(&record.planned_releases);
        for (t, (&firm, &planned)) in releases.enumerate() {
            // The bucket's issue is rounded once (`Scenario::issue`): the
            // firm order's share first, the planned order the rest.
            let firm_issue = if firm > 0.0 {
                scenario.issue(line, firm)
            } else {
                0.0
            };
            let total_issue = if firm + planned > 0.0 {
                scenario.issue(line, firm + planned)
            } else {
                0.0
            };
            for (quantity, issued, is_firm) in [
                (firm, firm_issue, true),
                (planned, total_issue - firm_issue, false),
            ] {
                if quantity > 0.0 {
                    pegs.push(Peg {
                        component: line.component,
                        bucket: t,
                        quantity: issued,
                        parent: line.parent,
                        parent_receipt: t + lead,
                        parent_quantity: quantity,
                        firm: is_firm,
                    });
                }
            }
        }
    }
    // A stable sort keeps the bill's order of lines within a bucket.
    pegs.sort_by_key(|p| (p.component, p.bucket));
    pegs
}

/// The pegs of one component bucket, found by binary search in `pegs`
/// (sorted by component and bucket, as `pegs` returns them).
pub fn pegs_at(pegs: &[Peg], component: usize, bucket: usize) -> &[Peg] {
    &pegs[range_at(pegs, component, bucket)]
}

/// Where the pegs of one component bucket stand in `pegs`.
fn range_at(pegs: &[Peg], component: usize, bucket: usize) -> std::ops::Range<usize> {
    let key = (component, bucket);
    let from = pegs.partition_point(|p| (p.component, p.bucket) < key);
    let to = pegs.partition_point(|p| (p.component, p.bucket) <= key);
    from..to
}

/// What a shortage leaves without stock: units of the item's own demand,
/// and units of parent orders' requirements (by index into `pegs`).
#[derive(Debug, Clone, Default, PartialEq)]
pub struct ShortageCause {
    pub own_demand: f64,
    pub parent_orders: Vec<(usize, f64)>,
}

/// The requirements each of `evaluation.shortages` leaves uncovered.
///
/// Stock serves requirements first come, first served: in bucket order,
/// and within a bucket the item's own demand before the parent orders (in
/// the bill's order). What is short at the end of a bucket is then the
/// latest requirements up to it: this walks back from the short bucket,
/// taking them in the reverse of that order until the shortage is
/// accounted for.
pub fn shortage_causes(
    scenario: &Scenario,
    evaluation: &Evaluation,
    pegs: &[Peg],
) -> Vec<ShortageCause> {
    evaluation
        .shortages
        .iter()
        .map(|shortage| {
            let mut cause = ShortageCause::default();
            let Some(i) = scenario.items.iter().position(|it| it.id == shortage.item) else {
                return cause;
            };
            let tolerance = evaluation.items[i].tolerance;
            let mut left = shortage.quantity;
            for t in (0..shortage.period).rev() {
                for k in range_at(pegs, i, t).rev() {
                    let peg = &pegs[k];
                    let take = left.min(peg.quantity);
                    if take > tolerance {
                        cause.parent_orders.push((k, take));
                    }
                    left -= take;
                    if left <= tolerance {
                        return cause;
                    }
                }
                let take = left.min(scenario.items[i].demand[t]);
                cause.own_demand += take.max(0.0);
                left -= take;
                if left <= tolerance {
                    return cause;
                }
            }
            cause
        })
        .collect()
}
