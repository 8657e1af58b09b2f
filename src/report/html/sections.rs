//! The sections of report.html below the summary: the stock and load
//! charts with their captions, and the tables of methods, items and orders.

use std::fmt::Write;

use super::{num, percent, table, text, units};
use crate::model::Scenario;
use crate::report::svg::escape;
use crate::report::{charts, figures, money};
use crate::solve::{MethodResult, Outcome};

pub(super) fn comparison_table(scenario: &Scenario, outcome: &Outcome, out: &mut String) {
    let rows = &outcome.comparison;
    let show_backlog = rows.iter().any(|r| r.evaluation.costs.backlog > 0.0);
    let show_overtime = rows.iter().any(|r| r.evaluation.costs.overtime > 0.0);
    let mut header = vec!["method", "plan", "total cost", "setup", "holding", "unit"];
    if show_backlog {
        header.push("backlog");
    }
    if show_overtime {
        header.push("overtime");
    }
    header.extend([
        "setups",
        "avg stock value",
        "end stock value",
        "vs exact plan",
    ]);
    let show_why = rows.iter().any(|r| !r.evaluation.feasible);
    if show_why {
        header.push("why infeasible");
    }
    let cells: Vec<Vec<(String, bool)>> = rows
        .iter()
        .map(|r| {
            let e = &r.evaluation;
            let c = &e.costs;
            let mut row = vec![
                text(r.method),
                text(if e.feasible {
                    r.status.name()
                } else {
                    "infeasible"
                }),
                num(money(c.total())),
                num(money(c.setup)),
                num(money(c.holding)),
                num(money(c.unit)),
            ];
            if show_backlog {
                row.push(num(money(c.backlog)));
            }
            if show_overtime {
                row.push(num(money(c.overtime)));
            }
            row.extend([
                num(e.setups.to_string()),
                num(money(e.average_stock_value(scenario))),
                num(money(e.ending_stock_value())),
                num(figures::extra_over_optimal(outcome, r)
                    .map_or("-".into(), |f| format!("{:+.1} %", 100.0 * f))),
            ]);
            if show_why {
                row.push(text(e.infeasibility().map_or(String::new(), |why| {
                    crate::report::reasons::infeasibility(scenario, &why)
                })));
            }
            row
        })
        .collect();
    table(out, "wide", &header, &cells);
}

pub(super) fn items_table(scenario: &Scenario, chosen: &MethodResult, out: &mut String) {
    let unit = scenario.calendar.kind.name();
    let rows: Vec<Vec<(String, bool)>> = scenario
        .items
        .iter()
        .zip(&chosen.evaluation.items)
        .map(|(item, r)| {
            vec![
                text(item.id.clone()),
                num(r.setups.to_string()),
                num(money(r.costs.total())),
                num(units((r.average_stock * 10.0).round() / 10.0)),
                num(figures::cover(r).map_or("-".into(), |c| format!("{c:.1}"))),
                num(units((r.ending_stock * 100.0).round() / 100.0)),
                text(item.unit.clone()),
                num(percent(r.fill_rate, 1)),
            ]
        })
        .collect();
    let cover = format!("cover ({unit}s)");
    table(
        out,
        "",
        &[
            "item",
            "setups",
            "total cost",
            "avg stock",
            &cover,
            "end stock",
            "unit",
            "fill rate",
        ],
        &rows,
    );
}

pub(super) fn orders_table(scenario: &Scenario, chosen: &MethodResult, out: &mut String) {
    let rows: Vec<Vec<(String, bool)>> = crate::report::json::orders(scenario, &chosen.plan)
        .into_iter()
        .map(|o| {
            vec![
                text(o.item),
                num(o.period.to_string()),
                num(o.date),
                num(o.release_period.to_string()),
                num(o.release_date),
                num(units(o.quantity)),
                text(o.unit),
                text(o.kind.to_string()),
            ]
        })
        .collect();
    if rows.is_empty() {
        out.push_str("<p>No orders: stock and open orders cover the horizon.</p>");
        return;
    }
    table(
        out,
        "",
        &[
            "item",
            "receipt period",
            "receipt date",
            "release period",
            "release date",
            "quantity",
            "unit",
            "kind",
        ],
        &rows,
    );
}

pub(super) fn stock_section(scenario: &Scenario, outcome: &Outcome, out: &mut String) {
    let chosen = &outcome.chosen;
    let reference = figures::current_rule(outcome).filter(|r| r.method != chosen.method);
    let _ = write!(out, "<section><h2>Stock over time</h2><p>Stock in each item's own unit at the end of each {} under the {} plan (solid blue){}. Below zero is backlog or shortage.</p><div class=\"small-multiples\">",
        scenario.calendar.kind.name(),
        escape(chosen.method),
        reference.map(|r| format!(" and under the {} rule (dashed orange)", escape(r.method))).unwrap_or_default());
    for (i, item) in scenario.items.iter().enumerate() {
        let mine = &chosen.evaluation.items[i];
        let setups = |n: usize| crate::report::count(n, "setup");
        let mut caption = format!(
            "{}: {}, average stock {} {}",
            item.id,
            setups(mine.setups),
            units((mine.average_stock * 10.0).round() / 10.0),
            item.unit
        );
        if let Some(r) = reference {
            let theirs = &r.evaluation.items[i];
            let _ = write!(
                caption,
                "; {}: {}, average stock {} {}",
                r.method,
                setups(theirs.setups),
                units((theirs.average_stock * 10.0).round() / 10.0),
                item.unit
            );
            if r.method == "fixed-lot" && item.fixed_lot.is_none() {
                caption.push_str(" (no fixed_lot: ordered lot-for-lot)");
            }
        }
        let _ = write!(
            out,
            "<figure>{}<figcaption>{}</figcaption></figure>",
            charts::stock(scenario, i, chosen, reference),
            escape(&caption)
        );
    }
    out.push_str("</div></section>");
}

/// With a bill of material: stock by level of the bill over time under the
/// chosen plan, and the average by level against the plan made level by
/// level, where the comparison has one.
pub(super) fn levels_section(scenario: &Scenario, outcome: &Outcome, out: &mut String) {
    if !scenario.has_bom() {
        return;
    }
    let chosen = &outcome.chosen;
    let by_level = outcome
        .comparison
        .iter()
        .find(|r| r.method == crate::multilevel::EXACT_BY_LEVEL && r.method != chosen.method);
    let (stock, valued) = figures::stock_by_level(scenario, chosen);
    let codes = scenario.low_level_codes();
    let members = |level: usize| -> Vec<&str> {
        scenario
            .items
            .iter()
            .zip(&codes)
            .filter(|(_, &c)| c == level)
            .map(|(item, _)| item.id.as_str())
            .collect()
    };
    let what = if valued {
        "Stock value"
    } else {
        "Stock in units"
    };
    let series: Vec<charts::Series> = stock
        .iter()
        .enumerate()
        .map(|(level, values)| charts::Series {
            label: match members(level).len() {
                1 => format!("level {level} (1 item)"),
                n => format!("level {level} ({n} items)"),
            },
            values,
        })
        .collect();
    let _ = write!(out, "<section><h2>Stock by level of the bill of material</h2><p>{what} at the end of each {} under the {} plan, summed over each level's items{}. Level 0 holds the items that go into no other; each level below holds their parts, down to what is bought in.</p><figure>{}</figure>",
        scenario.calendar.kind.name(),
        escape(chosen.method),
        if valued { " at unit cost".to_string() } else { match scenario.stock_unit() {
            Some(unit) => format!(" (no item has a unit cost, so the count in {unit} is shown)"),
            None => " (no item has a unit cost, so units of every kind are added: read the levels apart)".to_string(),
        } },
        charts::steps(scenario, "stock-by-level", &format!("{what} by level of the bill of material"), &series));
    let average = |values: &[f64]| values.iter().sum::<f64>() / values.len().max(1) as f64;
    let theirs = by_level.map(|r| figures::stock_by_level(scenario, r).0);
    let mut header = vec![
        "level".to_string(),
        "items".to_string(),
        format!("average, {} plan", chosen.method),
    ];
    if let Some(r) = by_level {
        header.push(format!("average, {} plan", r.method));
    }
    let header: Vec<&str> = header.iter().map(String::as_str).collect();
    let format = |v: f64| {
        if valued {
            money(v)
        } else {
            units((v * 10.0).round() / 10.0)
        }
    };
    let rows: Vec<Vec<(String, bool)>> = stock
        .iter()
        .enumerate()
        .map(|(level, values)| {
            let mut row = vec![
                num(level.to_string()),
                text(members(level).join(", ")),
                num(format(average(values))),
            ];
            if let Some(theirs) = &theirs {
                row.push(num(format(average(&theirs[level]))));
            }
            row
        })
        .collect();
    table(out, "levels", &header, &rows);
    out.push_str("</section>");
}

pub(super) fn load_section(scenario: &Scenario, chosen: &MethodResult, out: &mut String) {
    if scenario.resources.is_empty() {
        return;
    }
    let _ = write!(out, "<section><h2>Load against capacity</h2><p>Capacity used per {} by the {} plan, in the release bucket: production and setup time. The black steps are the regular capacity, the dashed green steps what overtime allows on top; overtime used is outlined and marked OT. Shaded buckets have less capacity than usual (capacity.csv).</p>", scenario.calendar.kind.name(), escape(chosen.method));
    for (r, resource) in scenario.resources.iter().enumerate() {
        let load = &chosen.evaluation.resources[r];
        let reduced: Vec<String> = figures::reduced_buckets(load)
            .iter()
            .enumerate()
            .filter(|(_, &is)| is)
            .map(|(t, _)| (t + 1).to_string())
            .collect();
        let overtime = load.overtime.iter().filter(|&&o| o > 0.0).count();
        let mut caption = resource.id.clone();
        if !reduced.is_empty() {
            let _ = write!(
                caption,
                ": capacity reduced in period{} {}",
                if reduced.len() == 1 { "" } else { "s" },
                reduced.join(", ")
            );
        }
        if overtime > 0 {
            let _ = write!(
                caption,
                "{} overtime in {overtime} bucket{}",
                if reduced.is_empty() { ":" } else { ";" },
                if overtime == 1 { "" } else { "s" }
            );
        }
        let _ = write!(caption, " (load in {})", resource.unit);
        let _ = write!(
            out,
            "<figure>{}<figcaption>{}</figcaption></figure>",
            charts::load(scenario, r, chosen),
            escape(&caption)
        );
    }
    out.push_str("</section>");
}
