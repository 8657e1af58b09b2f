//! Notes in words for what the engines return as data: why a group cannot
//! be planned within capacity, what the freeze leaves short, and the parent
//! orders behind a component's requirement.

use crate::capacity::Shortfall;
use crate::model::Scenario;
use crate::multilevel::peg::{pegs_at, Peg};
use crate::replan::Free;

use super::quantity;

/// Why no plan fits the capacity, with what would make one possible.
pub fn capacity_shortfall(scenario: &Scenario, shortfall: &Shortfall) -> String {
    let names = |resources: &[usize]| {
        resources
            .iter()
            .map(|&r| scenario.resources[r].id.as_str())
            .collect::<Vec<_>>()
            .join(", ")
    };
    match shortfall {
        Shortfall::Cumulative {
            resource,
            last,
            load,
            capacity,
        } => {
            let short = (load - capacity).ceil();
            let first = scenario.period_offset + 1;
            let (span, those) = if *last == 0 {
                (format!("in period {first}"), "that period")
            } else {
                (
                    format!("from period {first} to period {}", last + first),
                    "those periods",
                )
            };
            format!(
                "resource {}: {span} the load that must be made by then ({}, with one setup per item) exceeds the capacity with overtime ({}) by {}; {} more overtime capacity in {those}, or backlog allowed on its items, would make a plan possible",
                scenario.resources[*resource].id,
                quantity(load.round()),
                quantity(capacity.round()),
                quantity(short),
                quantity(short),
            )
        }
        Shortfall::Buckets { places, least } => {
            let places: Vec<String> = places
                .iter()
                .map(|&(r, t, amount)| {
                    format!(
                        "{} in period {} ({})",
                        quantity((amount * 1000.0).ceil() / 1000.0),
                        t + 1 + scenario.period_offset,
                        scenario.resources[r].id
                    )
                })
                .collect();
            let proven = if *least {
                "the least extra capacity that makes a plan possible is"
            } else {
                "a plan becomes possible with extra capacity of (not proven least)"
            };
            format!(
                "no plan fits the capacity in every bucket, although the cumulative load fits: setup times, maximum lots or lead times leave too little room; {proven} {}. Overtime of that much, or backlog, would make it feasible",
                places.join(", ")
            )
        }
        Shortfall::Undecided { resources } => format!(
            "no plan fits the capacity of {} in every bucket, although the cumulative load fits; the search for the capacity missing ran out of time before it found an answer",
            names(resources)
        ),
        Shortfall::NotCapacity { resources } => format!(
            "no plan fits the capacity of {} in every bucket, and no extra capacity alone makes one possible: maximum lots, lot multiples or lead times rule it out",
            names(resources)
        ),
    }
}

/// One peg in words: "FRAME-A's order of 60 for period 4".
pub fn describe(scenario: &Scenario, peg: &Peg) -> String {
    let kind = if peg.firm { "firm order" } else { "order" };
    format!(
        "{}'s {kind} of {} for period {}",
        scenario.items[peg.parent].id,
        quantity(peg.parent_quantity),
        peg.parent_receipt + 1
    )
}

/// The parent orders behind one component bucket, for a table cell:
/// "FRAME-A period 4: 120; FRAME-B period 5: 60" (the parent, its order's
/// receipt period, the component units it calls for).
pub fn parent_orders_text(
    scenario: &Scenario,
    pegs: &[Peg],
    component: usize,
    bucket: usize,
) -> String {
    pegs_at(pegs, component, bucket)
        .iter()
        .map(|p| {
            format!(
                "{}{} period {}: {}",
                scenario.items[p.parent].id,
                if p.firm { " (firm)" } else { "" },
                p.parent_receipt + 1,
                quantity(p.quantity)
            )
        })
        .collect::<Vec<_>>()
        .join("; ")
}

/// What a planner should read about the freeze and the firm orders.
pub fn freeze(scenario: &Scenario, free: &Free) -> Vec<String> {
    // Buckets as the planner knows them (a window of a longer run
    // starts later than period 1).
    let offset = scenario.period_offset;
    let mut notes = Vec::new();
    for s in &free.shortfalls {
        let item = &scenario.items[s.item];
        let arrival = scenario.first_arrival(item) + 1;
        let when = if arrival <= scenario.periods() {
            format!(
                "the first new order can arrive in period {}, and the plan brings the units in then",
                arrival + offset
            )
        } else {
            "no new order can arrive before the horizon ends".to_string()
        };
        let lead = match item.lead_time {
            1 => "1 bucket".to_string(),
            n => format!("{n} buckets"),
        };
        let frozen = match scenario.frozen {
            1 => format!("release in period {} is frozen", offset + 1),
            n => format!(
                "releases in periods {} to {} are frozen",
                offset + 1,
                offset + n
            ),
        };
        notes.push(format!(
            "item {}: short from period {} (up to {} units), inside the frozen horizon: {frozen} (only firm orders and receipts), and with a lead time of {lead} {when}. Add or enlarge a firm order, expedite a receipt, shorten the freeze, or allow backlog",
            item.id,
            s.bucket + 1 + offset,
            quantity(s.quantity),
        ));
    }
    for o in &free.overloads {
        notes.push(format!(
            "resource {}: the firm orders released in period {} alone load it to {}, beyond its capacity with overtime ({}); move or split a firm order",
            scenario.resources[o.resource].id,
            o.bucket + 1 + offset,
            quantity(o.load),
            quantity(o.limit),
        ));
    }
    notes
}

/// What a comparison leaves open and what it leaves out, in words: whether
/// the gaps of the two solves settle which scenario costs less, and the
/// price of the capacity B adds. `money` formats an amount.
pub fn compare_sentences(
    c: &crate::compare::Comparison,
    money: impl Fn(f64) -> String,
) -> Vec<String> {
    let mut sentences = Vec::new();
    for (label, side) in [("A", &c.a), ("B", &c.b)] {
        let result = &side.result;
        if result.is_exact() && !result.evaluation.feasible {
            sentences.push(format!(
                "{label}'s figures below are those of the plan shown in its place, which breaks a constraint: {label} has no plan of its own to compare (see its status)."
            ));
        }
    }
    if let (true, Some((low, high))) = (c.within_gaps(), c.difference_range()) {
        sentences.push(format!(
            "Which scenario can be planned for less is not proven: the gaps of the two solves overlap, so B's least possible cost lies anywhere from {} less to {} more than A's. Give both more time (--time-limit, or more --nodes) to settle it.",
            money(-low),
            money(high)
        ));
    }
    let difference = c.b.result.total_cost() - c.a.result.total_cost();
    for added in c.added_capacity() {
        let amount = quantity(added.added);
        match (added.price, added.cost()) {
            (Some(price), Some(cost)) => {
                let net = difference + cost;
                let verdict = if net.abs() < 0.005 {
                    "with that paid, B costs the same as A".to_string()
                } else if net < 0.0 {
                    format!("with that paid, B still costs {} less than A", money(-net))
                } else {
                    format!("with that paid, B costs {} more than A", money(net))
                };
                sentences.push(format!(
                    "B adds {amount} of capacity on {} over the horizon; at {} a unit (capacity_cost in resources.csv) that costs {}, which the plan costs leave out: {verdict}.",
                    added.resource,
                    money(price),
                    money(cost)
                ));
            }
            _ => sentences.push(format!(
                "B adds {amount} of capacity on {} over the horizon, which the plan costs leave out; give its price per unit as capacity_cost in resources.csv to have it counted.",
                added.resource
            )),
        }
    }
    sentences
}

/// What a `compare --set` change does, in words: "capacity of LINE-1
/// raised by 10 in every period".
pub fn change(o: &crate::compare::Override) -> String {
    use crate::compare::{Change, Field};
    let of = |noun: &str, resource: bool| match (&o.target, resource) {
        (Some(id), true) => format!("{noun} of {id}"),
        (Some(id), false) => format!("{noun} of item {id}"),
        (None, true) => format!("{noun} of every resource"),
        (None, false) => format!("{noun} of every item"),
    };
    let what = match o.field {
        Field::Capacity => of("capacity", true),
        Field::Overtime => of("overtime capacity", true),
        Field::Demand => of("demand", false),
        Field::SetupCost => of("setup cost", false),
        Field::HoldingCost => of("holding cost", false),
        Field::UnitCost => of("unit cost", false),
        Field::FrozenPeriods => "frozen horizon".to_string(),
    };
    if o.field == Field::FrozenPeriods {
        return match o.change {
            Change::Set(n) => format!("{what} set to {} periods", quantity(n)),
            Change::Add(n) if n >= 0.0 => format!("{what} lengthened by {} periods", quantity(n)),
            Change::Add(n) => format!("{what} shortened by {} periods", quantity(-n)),
            _ => what,
        };
    }
    match o.change {
        Change::Set(n) => format!("{what} set to {} in every period", quantity(n)),
        Change::Percent(p) => format!("{what} at {} % of its value in every period", quantity(p)),
        Change::Add(n) if n >= 0.0 => format!("{what} raised by {} in every period", quantity(n)),
        Change::Add(n) => format!("{what} lowered by {} in every period", quantity(-n)),
        Change::AddPercent(p) if p >= 0.0 => {
            format!("{what} raised by {} % in every period", quantity(p))
        }
        Change::AddPercent(p) => format!("{what} lowered by {} % in every period", quantity(-p)),
    }
}

/// Why the items of a comparison are not set side by side: a side has no
/// plan of its method, only the orders shown for reference.
pub fn no_plan_to_compare(c: &crate::compare::Comparison) -> String {
    let who = match (c.a.has_plan(), c.b.has_plan()) {
        (false, false) => "Neither A nor B has a plan",
        (false, true) => "A has no plan",
        _ => "B has no plan",
    };
    format!(
        "Items not compared: {who} (see its status above); the orders shown in its place are lot-for-lot for reference, so item-by-item differences would mean nothing."
    )
}

/// The rolling run's end-of-horizon correction (`roll::horizon_end`), as a
/// term of the run's description; `unit` is the bucket's name.
pub fn end_correction(unit: &str) -> String {
    format!(
        "setups in each plan's last {unit}s charged only for the share of an economic cycle they cover inside the plan (end-of-horizon correction; the realised cost charges them whole)"
    )
}
