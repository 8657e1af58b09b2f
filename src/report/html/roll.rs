//! The page of `roll --out` (report.html): the run's terms, realised cost
//! and fill rate by method as a chart and a table, the cautions where the
//! orders carried out used overtime or built stock ahead, the plan changes
//! week by week, every weekly plan's status with the units planned late
//! and cut named, and safety stock per item with a service level. A pure
//! function of the run; no scripts, nothing outside the page.

use std::fmt::Write;

mod words;

use super::{num, percent, table, text, units, Cash, STYLE};
use crate::report::svg::escape;
use crate::report::table::RollRun;
use crate::report::{charts, count, money};
use crate::solve::Status;
use words::cost;

fn realised_section(run: &RollRun, out: &mut String) {
    let unit = run.scenario.calendar.kind.name();
    let currency = run.scenario.currency.as_deref().unwrap_or("");
    let _ = write!(out, "<section><h2>Realised cost by method</h2><p>Each method's orders as they were carried out {unit} by {unit}, priced against the demand that happened. Unit cost (what is made or bought) follows the units bought, and a method that leaves demand unmet or stock at the end buys fewer or more, so it is left out of the bars and listed in the table.</p><figure>{}</figure>", charts::roll::realised_cost(run, currency));
    let results = run.results;
    let show_backlog = results.iter().any(|r| r.realised.costs.backlog > 0.0);
    let show_overtime = results.iter().any(|r| r.realised.costs.overtime > 0.0);
    let mut header = vec!["method", "cost", "setup", "holding"];
    if show_backlog {
        header.push("backlog");
    }
    if show_overtime {
        header.push("overtime");
    }
    header.extend([
        "unit cost",
        "end stock value",
        "setups",
        "fill rate",
        "cost per unit served",
        "most short",
    ]);
    let rows: Vec<Vec<(String, bool)>> = results
        .iter()
        .map(|r| {
            let e = &r.realised;
            let c = &e.costs;
            let mut row = vec![
                text(r.label.clone()),
                num(money(cost(r))),
                num(money(c.setup)),
                num(money(c.holding)),
            ];
            if show_backlog {
                row.push(num(money(c.backlog)));
            }
            if show_overtime {
                row.push(num(money(c.overtime)));
            }
            row.extend([
                num(money(c.unit)),
                num(money(e.ending_stock_value())),
                num(e.setups.to_string()),
                num(percent(e.fill_rate(), 1)),
                num(r.cost_per_unit_served().map_or("-".into(), money)),
                num(units(r.most_short())),
            ]);
            row
        })
        .collect();
    table(out, "wide", &header, &rows);
    let _ = write!(out, "<p class=\"small\">Cost: setup, holding, backlog and overtime{}. End stock: its value at unit cost. Most short: the most units short at the end of a {unit} (items without backlog). Fill rate: the share of the demand that happened met from stock on time. Cost per unit served: the cost over the units met on time, the figure to compare methods that serve different shares of the demand by.</p>", run.scenario.currency.as_ref().map(|c| format!(", in {}", escape(c))).unwrap_or_default());
    if results.iter().any(|r| r.overload_planned() > 0.0) {
        let _ = write!(out, "<h3>Carried out as the lines allow</h3><p>Where a {unit}'s orders needed more than capacity plus overtime, the shop made what fitted: the item whose stock could wait longest was cut first, and the next {unit}'s plan started from the stock that resulted.</p>");
        let rows: Vec<Vec<(String, bool)>> = results
            .iter()
            .map(|r| {
                vec![
                    text(r.label.clone()),
                    num(units(r.overload_planned().round())),
                    num(units(r.units_cut().round())),
                    num(r
                        .weeks
                        .iter()
                        .filter(|w| !w.cuts.is_empty())
                        .count()
                        .to_string()),
                    num(percent(r.realised.fill_rate(), 1)),
                ]
            })
            .collect();
        let cut_weeks = format!("{unit}s cut");
        table(
            out,
            "",
            &[
                "method",
                "overload as planned",
                "units cut",
                &cut_weeks,
                "fill rate",
            ],
            &rows,
        );
        let _ = write!(out, "<p class=\"small\">Overload as planned: capacity the orders needed beyond capacity and overtime in the {unit}s carried out, in the resources' own units. Units cut: what the shop could not make for it. weeks.csv lists both {unit} by {unit}.</p>");
    }
    out.push_str("</section>");
}

fn stability_section(run: &RollRun, out: &mut String) {
    let unit = run.scenario.calendar.kind.name();
    let _ = write!(out, "<section><h2>Plan changes by {unit}</h2><p>How far each {unit}'s plan moved from the plan before, over the {unit}s both cover: the units added, taken away or resized, summed over items. Fewer units moved means a steadier schedule for the shop and the suppliers. The first plan has nothing before it. Methods with the same figures draw over one another; the exact method is drawn on top.</p><figure>{}</figure>", charts::roll::changes_by_week(run));
    let rows: Vec<Vec<(String, bool)>> = run
        .results
        .iter()
        .map(|r| {
            let s = &r.stability;
            vec![
                text(r.label.clone()),
                num(percent(r.mean_share_changed(), 1)),
                num(s.added.to_string()),
                num(s.removed.to_string()),
                num(s.changed.to_string()),
                num(s.unchanged.to_string()),
                num(units(s.quantity_moved.round())),
                num(if s.quantity_before > 0.0 {
                    percent(s.quantity_moved / s.quantity_before, 1)
                } else {
                    "-".into()
                }),
            ]
        })
        .collect();
    table(out, "", &crate::report::table::STABILITY_COLUMNS, &rows);
    out.push_str("<p class=\"small\">Orders changed: the mean share of orders added, removed or resized. Instability: units moved over the earlier plans' units.</p></section>");
}

fn statuses_section(run: &RollRun, out: &mut String) {
    let calendar = &run.scenario.calendar;
    let unit = calendar.kind.name();
    let _ = write!(out, "<section><h2>The {unit}ly plans</h2><p>What each {unit}'s plan proved. For the exact method, optimal means no plan for that {unit}'s window costs less; for the rules, feasible means the rule's plan met every constraint, not that it is the least cost.</p><figure>{}</figure>", charts::roll::statuses_by_week(run));
    let rows: Vec<Vec<(String, bool)>> = run
        .results
        .iter()
        .map(|r| {
            vec![
                text(r.label.clone()),
                num(r.count(Status::Optimal).to_string()),
                num(r.count(Status::Feasible).to_string()),
                num(r.count(Status::Infeasible).to_string()),
                num(r.count(Status::Unknown).to_string()),
                num(r.weeks_late().to_string()),
                num(r
                    .worst_gap()
                    .map_or_else(|| "-".to_string(), |g| percent(g, 2))),
            ]
        })
        .collect();
    let late_header = format!("{unit}s planned late");
    table(
        out,
        "",
        &[
            "method",
            "optimal",
            "feasible",
            "infeasible",
            "no plan found",
            &late_header,
            "largest gap",
        ],
        &rows,
    );
    let late: Vec<Vec<(String, bool)>> = run
        .results
        .iter()
        .flat_map(|r| {
            r.weeks.iter().flat_map(move |w| {
                w.late.iter().map(move |l| {
                    vec![
                        text(r.label.clone()),
                        num(calendar.label(w.bucket)),
                        text(run.scenario.items[l.item].id.clone()),
                        num(calendar.label(l.bucket)),
                        num(units(l.quantity)),
                    ]
                })
            })
        })
        .collect();
    if late.is_empty() {
        let _ = write!(
            out,
            "<p>Every {unit}'s plan met every requirement on time.</p>"
        );
    } else {
        let _ = write!(out, "<h3>Units planned late</h3><p>A forecast that rose inside the freeze can leave a {unit} with no plan that is on time. Such a {unit} was planned with the units late, at a penalty per unit far above anything else a unit can cost, so a plan is late only where no plan could be on time.</p>");
        let plan_of = format!("plan of the {unit} of");
        let owed = format!("late at the end of the {unit} of");
        table(
            out,
            "",
            &["method", &plan_of, "item", &owed, "units"],
            &late,
        );
    }
    let cuts: Vec<Vec<(String, bool)>> = run
        .results
        .iter()
        .flat_map(|r| {
            r.weeks.iter().flat_map(move |w| {
                w.cuts.iter().map(move |c| {
                    vec![
                        text(r.label.clone()),
                        num(calendar.label(c.bucket)),
                        text(run.scenario.items[c.item].id.clone()),
                        text(run.scenario.resources[c.resource].id.clone()),
                        num(units(c.quantity)),
                    ]
                })
            })
        })
        .collect();
    if !cuts.is_empty() {
        let _ = write!(out, "<h3>Orders cut to fit the lines</h3><p>The units of each {unit}'s orders the shop could not make, and the resource that ran out.</p>");
        let released = format!("{unit} released");
        table(
            out,
            "",
            &["method", &released, "item", "resource", "units cut"],
            &cuts,
        );
    }
    let notes: Vec<String> = run
        .results
        .iter()
        .filter_map(|r| {
            r.weeks.iter().find(|w| !w.notes.is_empty()).map(|w| {
                format!(
                    "{}, {unit} of {}: {}",
                    r.label,
                    calendar.label(w.bucket),
                    w.notes[0]
                )
            })
        })
        .collect();
    if !notes.is_empty() {
        out.push_str("<div class=\"notes\"><h3>Notes</h3><ul>");
        for note in &notes {
            let _ = write!(out, "<li>{}</li>", escape(note));
        }
        out.push_str("</ul></div>");
    }
    out.push_str("</section>");
}

fn safety_section(run: &RollRun, out: &mut String) {
    let Some((level, estimates)) = &run.safety else {
        return;
    };
    let unit = run.scenario.calendar.kind.name();
    let _ = write!(out, "<section><h2>Safety stock for a {} cycle service level</h2><p>Each item's safety stock from its one-{unit}-ahead forecast errors: k x error sd x sqrt(lead time + 1), k the normal quantile of the level (Silver, Pyke and Thomas, Inventory and Production Management in Supply Chains, 4th ed.). An item needs {} errors before its own are used, and keeps its own safety stock where that is higher. Each {unit} of the run used the errors seen before it; the table shows the estimate from the whole history.</p>", percent(*level, 1), crate::roll::MIN_ERRORS);
    let rows: Vec<Vec<(String, bool)>> = run
        .scenario
        .items
        .iter()
        .zip(estimates)
        .map(|(item, estimate)| match estimate {
            Some(e) => vec![
                text(item.id.clone()),
                num(e.errors.to_string()),
                num(format!("{:.1}", e.sigma)),
                num(item.lead_time.to_string()),
                num(units(e.safety_stock.round().max(item.safety_stock))),
                text(item.unit.clone()),
            ],
            None => vec![
                text(item.id.clone()),
                num("-"),
                num("-"),
                num(item.lead_time.to_string()),
                num(units(item.safety_stock)),
                text(item.unit.clone()),
            ],
        })
        .collect();
    let lead = format!("lead time ({unit}s)");
    table(
        out,
        "",
        &["item", "errors", "error sd", &lead, "safety stock", "unit"],
        &rows,
    );
    out.push_str("</section>");
}

/// The whole page.
pub(super) fn page(run: &RollRun) -> String {
    let scenario = run.scenario;
    let calendar = &scenario.calendar;
    let unit = calendar.kind.name();
    let cash = Cash(scenario.currency.as_deref());
    let mut out = String::new();
    let title = escape(&scenario.name);
    let _ = write!(out, "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"><title>Rolling run: {title}</title><style>{STYLE}</style></head><body><main>");
    let mut terms = vec![format!(
        "{} from {}, each looking {} ahead",
        count(run.weeks, &format!("{unit}ly plan")),
        calendar.label(run.first),
        count(run.horizon, unit)
    )];
    terms.push(match run.frozen {
        0 => "nothing frozen".to_string(),
        1 => format!(
            "the first {unit} of each plan frozen (the previous plan's orders are kept there)"
        ),
        n => format!(
            "the first {n} {unit}s of each plan frozen (the previous plan's orders are kept there)"
        ),
    });
    if run.change_cost > 0.0 {
        terms.push(format!(
            "a change cost of {} per order where the previous plan had none (exact+change-cost; the realised cost leaves it out)",
            cash.of(run.change_cost)
        ));
    }
    if run.end_correction {
        terms.push(crate::report::notes::end_correction(unit));
    }
    terms.push(format!(
        "each plan's search for the least cost stopped after {} s",
        run.time_limit
    ));
    if let Some(currency) = &scenario.currency {
        terms.push(format!("costs in {currency}"));
    }
    let _ = write!(
        out,
        "<header><h1>Rolling run: {title}</h1><p class=\"meta\">{}.</p></header>",
        escape(&terms.join("; "))
    );
    words::summary(run, &cash, &mut out);
    words::cautions(run, &mut out);
    realised_section(run, &mut out);
    stability_section(run, &mut out);
    statuses_section(run, &mut out);
    safety_section(run, &mut out);
    let _ = writeln!(out, "<footer>Made by lotwright {}. Each {unit}'s plan was made with the forecast of its day and carried out for one {unit}; the demand that happened is the first {unit} of each forecast. A plan is decision support: the people who know the plant decide.</footer></main></body></html>", env!("CARGO_PKG_VERSION"));
    out
}
