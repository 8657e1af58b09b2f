//! The roll page's words: the summary (which method's orders cost the
//! least, the fill rates, what was cut and planned late) with the exact
//! method's figures as cards, and the cautions where the orders carried
//! out used overtime or built stock ahead.

use std::fmt::Write;

use crate::report::html::{card, percent, Cash};
use crate::report::svg::escape;
use crate::report::table::RollRun;
use crate::report::{count, money, quantity};
use crate::roll::RollResult;

/// Realised cost without unit cost: setup, holding, backlog, overtime.
pub(super) fn cost(r: &RollResult) -> f64 {
    let c = &r.realised.costs;
    c.total() - c.unit
}

/// Labels joined as people write them: `a`, `a and b`, `a, b and c`.
fn listed(labels: &[&str]) -> String {
    match labels {
        [] => String::new(),
        [one] => one.to_string(),
        [rest @ .., last] => format!("{} and {last}", rest.join(", ")),
    }
}

/// Where the methods serve different shares of the demand: which costs
/// least per unit met on time, and the least of another method beside it.
fn per_unit_served(results: &[RollResult], cash: &Cash) -> Option<String> {
    let mut ranked: Vec<(&RollResult, f64)> = results
        .iter()
        .filter_map(|r| r.cost_per_unit_served().map(|c| (r, c)))
        .collect();
    ranked.sort_by(|a, b| a.1.total_cmp(&b.1));
    let (first, least) = *ranked.first()?;
    let mut sentence = format!(
        "Per unit of demand met on time, which compares methods that serve different shares, {} costs the least: {} a unit",
        first.label,
        cash.of(least)
    );
    if let Some(&(other, next)) = ranked.iter().find(|(r, _)| r.method != first.method) {
        let _ = write!(
            sentence,
            ", against {} for {}, the least of another method",
            cash.of(next),
            other.label
        );
    }
    sentence.push('.');
    Some(sentence)
}

pub(super) fn summary(run: &RollRun, cash: &Cash, out: &mut String) {
    let unit = run.scenario.calendar.kind.name();
    let results = run.results;
    let least = results.iter().map(cost).fold(f64::INFINITY, f64::min);
    let most = results.iter().map(cost).fold(f64::NEG_INFINITY, f64::max);
    let cheapest: Vec<&str> = results
        .iter()
        .filter(|r| cost(r) <= least + 0.005)
        .map(|r| r.label.as_str())
        .collect();
    let mut sentences = Vec::new();
    if !results.is_empty() {
        let mut lead = format!(
            "Carried out {unit} by {unit}, the orders of {} cost the least: {} of setup, holding, backlog and overtime",
            listed(&cheapest),
            cash.of(least)
        );
        if let [one] = cheapest.as_slice() {
            if let Some(r) = results.iter().find(|r| r.label == *one) {
                let _ = write!(
                    lead,
                    ", at a fill rate of {}",
                    percent(r.realised.fill_rate(), 1)
                );
            }
        }
        if most > least + 0.005 {
            let dearest: Vec<&str> = results
                .iter()
                .filter(|r| cost(r) >= most - 0.005)
                .map(|r| r.label.as_str())
                .collect();
            let _ = write!(
                lead,
                "; {} cost the most, {}",
                listed(&dearest),
                cash.of(most)
            );
        }
        lead.push('.');
        sentences.push(lead);
        let low = results
            .iter()
            .map(|r| r.realised.fill_rate())
            .fold(f64::INFINITY, f64::min);
        let high = results
            .iter()
            .map(|r| r.realised.fill_rate())
            .fold(f64::NEG_INFINITY, f64::max);
        sentences.push(if high - low < 5e-4 {
            format!(
                "Every method met {} of the demand that happened from stock.",
                percent(high, 1)
            )
        } else {
            let lowest: Vec<&str> = results
                .iter()
                .filter(|r| r.realised.fill_rate() <= low + 5e-4)
                .map(|r| r.label.as_str())
                .collect();
            let highest: Vec<&str> = results
                .iter()
                .filter(|r| r.realised.fill_rate() >= high - 5e-4)
                .map(|r| r.label.as_str())
                .collect();
            format!(
                "The fill rate (demand met from stock on time) runs from {} ({}) to {} ({}).",
                percent(low, 1),
                listed(&lowest),
                percent(high, 1),
                listed(&highest)
            )
        });
        if high - low >= 5e-4 {
            if let Some(sentence) = per_unit_served(results, cash) {
                sentences.push(sentence);
            }
        }
    }
    let cut: Vec<&RollResult> = results.iter().filter(|r| r.units_cut() > 0.0).collect();
    if cut.is_empty() {
        sentences.push(
            "Every order carried out fitted the lines as planned: nothing had to be cut."
                .to_string(),
        );
    } else {
        let names: Vec<&str> = cut.iter().map(|r| r.label.as_str()).collect();
        sentences.push(format!(
            "The orders of {} needed more than capacity plus overtime in some {unit}s; the shop made what fitted and the rest was cut, so every realised figure rests on capacity that exists.",
            listed(&names)
        ));
    }
    let late: Vec<&RollResult> = results.iter().filter(|r| r.weeks_late() > 0).collect();
    if !late.is_empty() {
        let names: Vec<String> = late
            .iter()
            .map(|r| format!("{} ({})", r.label, count(r.weeks_late(), unit)))
            .collect();
        let names: Vec<&str> = names.iter().map(String::as_str).collect();
        sentences.push(format!(
            "Some {unit}s could not meet every requirement on time (a forecast that rose inside the freeze) and were planned with those units late: {}. They are named below.",
            listed(&names)
        ));
    }
    out.push_str("<section class=\"summary\"><h2>Summary</h2>");
    for (k, sentence) in sentences.iter().enumerate() {
        let class = if k == 0 { " class=\"lead\"" } else { "" };
        let _ = write!(out, "<p{class}>{}</p>", escape(sentence));
    }
    // Cards for the exact method, the one the run is about.
    if let Some(exact) = results
        .iter()
        .find(|r| r.label == crate::solve::EXACT)
        .or(results.first())
    {
        let money_unit = run
            .scenario
            .currency
            .as_ref()
            .map(|c| format!(", {c}"))
            .unwrap_or_default();
        out.push_str("<div class=\"cards\">");
        card(
            out,
            &format!("{}: realised cost{money_unit}", exact.label),
            &money(cost(exact)),
        );
        card(
            out,
            &format!("{}: fill rate", exact.label),
            &percent(exact.realised.fill_rate(), 1),
        );
        card(
            out,
            &format!("{}: setups", exact.label),
            &exact.realised.setups.to_string(),
        );
        card(
            out,
            &format!("{}: orders changed", exact.label),
            &percent(exact.mean_share_changed(), 1),
        );
        card(
            out,
            &format!("{}: {unit}s planned late", exact.label),
            &exact.weeks_late().to_string(),
        );
        out.push_str("</div>");
    }
    out.push_str("</section>");
}

/// Overtime used and stock built ahead by the orders carried out, method
/// by method, with the usual cautions.
pub(super) fn cautions(run: &RollRun, out: &mut String) {
    let unit = run.scenario.calendar.kind.name();
    let overtime: Vec<String> = run
        .results
        .iter()
        .filter(|r| r.realised.overtime_used() > 0.0)
        .map(|r| {
            format!(
                "{} {}",
                r.label,
                quantity(r.realised.overtime_used().round())
            )
        })
        .collect();
    let ahead: Vec<String> = run
        .results
        .iter()
        .filter_map(|r| {
            r.realised
                .items
                .iter()
                .zip(&run.scenario.items)
                .filter(|(record, _)| record.longest_cover >= 2)
                .max_by_key(|(record, _)| record.longest_cover)
                .map(|(record, item)| {
                    format!(
                        "{} {} ({})",
                        r.label,
                        count(record.longest_cover, unit),
                        item.id
                    )
                })
        })
        .collect();
    if overtime.is_empty() && ahead.is_empty() {
        return;
    }
    out.push_str("<section class=\"cautions\"><h2>Check before following these plans</h2>");
    if !overtime.is_empty() {
        let _ = write!(out, "<p>{}</p>", escape(&format!(
            "The orders carried out use overtime (units of capacity over the run): {}. Overtime and shift patterns must respect local labour law and agreements; check with the people who set them.",
            overtime.join(", ")
        )));
    }
    if !ahead.is_empty() {
        let _ = write!(out, "<p>{}</p>", escape(&format!(
            "The orders carried out build stock ahead of need (the most demand one lot covers, and its item): {}. Shelf life, quality holds and rules for regulated products (food, pharmaceuticals) can forbid building ahead; check them before releasing the orders.",
            ahead.join(", ")
        )));
    }
    out.push_str("</section>");
}
