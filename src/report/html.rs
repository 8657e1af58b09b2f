//! report.html written by `plan --out` (and, in `roll`, by `roll --out`): one self-contained page for a
//! manager (no scripts, no fetches, a print stylesheet) with the summary and
//! saving in words, charts as inline SVG (see `charts`), the comparison and
//! the orders. All text is escaped: item ids are user input.

use std::fmt::Write;

use super::svg::escape;
use super::{charts, figures, money, quantity};
use crate::model::Scenario;
use crate::solve::{cautions, Outcome};

mod roll;
mod sections;
mod words;

const STYLE: &str = include_str!("report.css");

/// The capacity unit both scenarios' resources share, if any.
fn shared_capacity_unit<'a>(
    a: &'a crate::model::Scenario,
    b: &'a crate::model::Scenario,
) -> Option<&'a str> {
    let unit = a.capacity_unit()?;
    (b.resources.is_empty() || b.capacity_unit() == Some(unit)).then_some(unit)
}

/// Money with the scenario's currency: `1,234.50 EUR`.
struct Cash<'a>(Option<&'a str>);

impl Cash<'_> {
    fn of(&self, value: f64) -> String {
        match self.0 {
            Some(currency) => format!("{} {currency}", money(value)),
            None => money(value),
        }
    }
}

/// A quantity with thousands grouped: `1,264.722`, `1,540`.
fn units(value: f64) -> String {
    let plain = quantity(value);
    let (whole, fraction) = plain.split_once('.').unwrap_or((&plain, ""));
    let digits = whole.trim_start_matches('-');
    let mut grouped = String::new();
    for (i, digit) in digits.chars().enumerate() {
        if i > 0 && (digits.len() - i) % 3 == 0 {
            grouped.push(',');
        }
        grouped.push(digit);
    }
    let sign = if whole.starts_with('-') { "-" } else { "" };
    if fraction.is_empty() {
        format!("{sign}{grouped}")
    } else {
        format!("{sign}{grouped}.{fraction}")
    }
}

fn percent(fraction: f64, decimals: usize) -> String {
    format!("{:.*} %", decimals, 100.0 * fraction)
}

fn card(out: &mut String, label: &str, value: &str) {
    let _ = write!(
        out,
        "<div class=\"card\"><div class=\"label\">{}</div><div class=\"value\">{}</div></div>",
        escape(label),
        escape(value)
    );
}

/// A table: header cells, then rows of (text, numeric?) cells.
fn table(out: &mut String, class: &str, header: &[&str], rows: &[Vec<(String, bool)>]) {
    let _ = write!(
        out,
        "<div class=\"table-wrap\"><table class=\"{class}\"><thead><tr>"
    );
    let numeric: Vec<bool> = (0..header.len())
        .map(|c| rows.iter().all(|r| r.get(c).is_none_or(|cell| cell.1)) && !rows.is_empty())
        .collect();
    for (c, h) in header.iter().enumerate() {
        let class = if numeric[c] { " class=\"num\"" } else { "" };
        let _ = write!(out, "<th scope=\"col\"{class}>{}</th>", escape(h));
    }
    out.push_str("</tr></thead><tbody>");
    for row in rows {
        out.push_str("<tr>");
        for (text, is_number) in row {
            let class = if *is_number { " class=\"num\"" } else { "" };
            let _ = write!(out, "<td{class}>{}</td>", escape(text));
        }
        out.push_str("</tr>");
    }
    out.push_str("</tbody></table></div>");
}

fn text(value: impl Into<String>) -> (String, bool) {
    (value.into(), false)
}

fn num(value: impl Into<String>) -> (String, bool) {
    (value.into(), true)
}

/// The whole page.
pub fn plan(scenario: &Scenario, outcome: &Outcome) -> String {
    let chosen = &outcome.chosen;
    let calendar = &scenario.calendar;
    let mut out = String::new();
    let title = escape(&scenario.name);
    let _ = write!(out, "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"><title>Plan: {title}</title><style>{STYLE}</style></head><body><main>");
    let _ = write!(out, "<header><h1>{title}</h1><p class=\"meta\">{} {}s from {}, {} item{}, {} resource{}{}.</p></header>",
        calendar.periods, calendar.kind.name(), calendar.label(0),
        scenario.items.len(), if scenario.items.len() == 1 { "" } else { "s" },
        scenario.resources.len(), if scenario.resources.len() == 1 { "" } else { "s" },
        scenario.currency.as_ref().map(|c| format!(", costs in {}", escape(c))).unwrap_or_default());
    out.push_str("<section class=\"summary\"><h2>Summary</h2>");
    for (k, sentence) in words::summary_sentences(scenario, outcome)
        .iter()
        .enumerate()
    {
        let class = if k == 0 { " class=\"lead\"" } else { "" };
        let _ = write!(out, "<p{class}>{}</p>", escape(sentence));
    }
    // The currency goes into the label so that the figures stay on one line.
    let unit = scenario
        .currency
        .as_ref()
        .map(|c| format!(", {c}"))
        .unwrap_or_default();
    out.push_str("<div class=\"cards\">");
    card(
        &mut out,
        &format!("total cost{unit}"),
        &money(chosen.total_cost()),
    );
    if let Some(s) = figures::saving(scenario, outcome).filter(|_| chosen.is_exact()) {
        let label = format!("saving against {}{unit}", s.reference.method);
        card(&mut out, &label, &money(s.amount));
        if (s.net_of_ending_stock - s.amount).abs() > 0.5 {
            let label = format!("saving, ending stock at its value{unit}");
            card(&mut out, &label, &money(s.net_of_ending_stock));
        }
    }
    card(&mut out, "setups", &chosen.evaluation.setups.to_string());
    let average = chosen.evaluation.average_stock_value(scenario);
    card(
        &mut out,
        &format!("average stock value{unit}"),
        &money(average),
    );
    let ending = chosen.evaluation.ending_stock_value();
    card(
        &mut out,
        &format!("ending stock value{unit}"),
        &money(ending),
    );
    out.push_str("</div></section>");
    let warnings = cautions(scenario, chosen);
    if !warnings.is_empty() {
        out.push_str("<section class=\"cautions\"><h2>Check before releasing the orders</h2>");
        for caution in &warnings {
            let _ = write!(out, "<p>{}</p>", escape(caution));
        }
        out.push_str("</section>");
    }
    let notes: Vec<String> = outcome
        .comparison
        .iter()
        .flat_map(|r| {
            r.notes.iter().map(move |n| {
                if r.is_exact() {
                    n.clone()
                } else {
                    format!("{}: {n}", r.method)
                }
            })
        })
        .collect();
    if !notes.is_empty() {
        out.push_str("<section class=\"notes\"><h2>Notes</h2><ul>");
        for note in &notes {
            let _ = write!(out, "<li>{}</li>", escape(note));
        }
        out.push_str("</ul></section>");
    }
    let _ = write!(out, "<section><h2>Cost by method</h2><p>Setup, holding, backlog and overtime cost of each method's plan. Unit cost (what is made or bought) is far larger than the rest, so it is listed beside the bars with the total instead of drawn.</p><figure>{}</figure></section>", charts::cost_by_method(outcome, scenario.currency.as_deref().unwrap_or("")));
    sections::stock_section(scenario, outcome, &mut out);
    sections::levels_section(scenario, outcome, &mut out);
    sections::load_section(scenario, chosen, &mut out);
    out.push_str("<section><h2>Comparison of methods</h2>");
    sections::comparison_table(scenario, outcome, &mut out);
    let _ = write!(out, "<p class=\"small\">Costs{}. Average and ending stock are valued at unit cost. A method marked infeasible has a plan that breaks capacity, stock or lot rules.</p></section>", scenario.currency.as_ref().map(|c| format!(" in {}", escape(c))).unwrap_or_default());
    let _ = write!(out, "<section><h2>Items</h2><p>The {} plan, item by item. Cover is average stock over mean demand per {}.</p>", escape(chosen.method), calendar.kind.name());
    sections::items_table(scenario, chosen, &mut out);
    out.push_str("</section>");
    let _ = write!(out, "<section><h2>Planned orders</h2><p>The {} plan's orders: released in the release period, received in the receipt period.</p>", escape(chosen.method));
    sections::orders_table(scenario, chosen, &mut out);
    out.push_str("</section>");
    let _ = writeln!(out, "<footer>Made by lotwright {}. A plan is decision support: the people who know the plant decide.</footer></main></body></html>", env!("CARGO_PKG_VERSION"));
    out
}

/// The page of `roll --out`: realised cost and fill rate by method, plan
/// changes by week, the weekly plans' status and safety stock.
pub fn roll(run: &super::table::RollRun) -> String {
    roll::page(run)
}

/// The page of `compare --out`: two plans side by side, their totals, the
/// items and resources that differ, and charts of stock and load over time.
pub fn compare(c: &crate::compare::Comparison) -> String {
    let (a, b) = (&c.a, &c.b);
    let (ea, eb) = (&a.result.evaluation, &b.result.evaluation);
    let mut out = String::new();
    let title = format!("{} against {}", a.name, b.name);
    let _ = write!(out, "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"><title>Comparison: {}</title><style>{STYLE}</style></head><body><main>", escape(&title));
    let _ = write!(
        out,
        "<header><h1>Two plans side by side</h1><p class=\"meta\">A: {} ({}). B: {} ({}). Both planned by the {}.</p></header>",
        escape(&a.name),
        escape(&a.scenario.name),
        escape(&b.name),
        escape(&b.scenario.name),
        if a.result.is_exact() {
            "exact method".to_string()
        } else {
            format!("{} rule", escape(a.result.method))
        }
    );
    let currency = a.scenario.currency.as_deref();
    let cash = Cash(currency.filter(|c| b.scenario.currency.as_deref() == Some(c)));
    let difference = eb.total_cost() - ea.total_cost();
    let controllable = ea.total_cost() - crate::eval::unavoidable_cost(&a.scenario);
    let share = if controllable > 1e-9 && ea.total_cost().abs() > 1e-9 {
        format!(
            " ({} of the cost A's plan controls, {} of A's total)",
            percent(difference.abs() / controllable, 1),
            percent(difference.abs() / ea.total_cost().abs(), 1)
        )
    } else if ea.total_cost().abs() > 1e-9 {
        format!(
            " ({} of A's total)",
            percent(difference.abs() / ea.total_cost().abs(), 1)
        )
    } else {
        String::new()
    };
    let lead = if difference.abs() < 0.005 {
        "B costs the same as A.".to_string()
    } else if difference < 0.0 {
        format!("B costs {} less than A{share}.", cash.of(-difference))
    } else {
        format!("B costs {} more than A{share}.", cash.of(difference))
    };
    out.push_str("<section class=\"summary\"><h2>Summary</h2>");
    let _ = write!(out, "<p class=\"lead\">{}</p>", escape(&lead));
    for sentence in super::notes::compare_sentences(c, |x| cash.of(x)) {
        let _ = write!(out, "<p>{}</p>", escape(&sentence));
    }
    for (label, side) in [("A", a), ("B", b)] {
        let status = figures::status_phrase(side.result.status, side.result.is_exact());
        let gaps = (
            figures::controllable_gap(&side.scenario, &side.result),
            side.result.gap(),
        );
        let bound = match (side.result.status, gaps) {
            (crate::solve::Status::Feasible, (Some(controlled), Some(gap))) => format!(
                ", lower bound {}, gap {} of the cost the plan controls ({} of the total)",
                money(side.result.lower_bound.unwrap_or(0.0)),
                percent(controlled, 2),
                percent(gap, 2)
            ),
            _ => String::new(),
        };
        let why = side
            .result
            .evaluation
            .infeasibility()
            .map(|why| {
                format!(
                    " Why: {}.",
                    super::reasons::infeasibility(&side.scenario, &why)
                )
            })
            .unwrap_or_default();
        let _ = write!(
            out,
            "<p>{label}: {}{}.{}</p>",
            escape(&status),
            escape(&bound),
            escape(&why)
        );
    }
    let unit = currency.map(|c| format!(", {c}")).unwrap_or_default();
    out.push_str("<div class=\"cards\">");
    card(
        &mut out,
        &format!("total cost A{unit}"),
        &money(ea.total_cost()),
    );
    card(
        &mut out,
        &format!("total cost B{unit}"),
        &money(eb.total_cost()),
    );
    card(&mut out, &format!("B - A{unit}"), &money(difference));
    card(
        &mut out,
        "setups A / B",
        &format!("{} / {}", ea.setups, eb.setups),
    );
    out.push_str("</div></section>");
    // Each caution says which scenario's plan it is about.
    let (in_a, in_b) = (
        cautions(&a.scenario, &a.result),
        cautions(&b.scenario, &b.result),
    );
    let mut warnings: Vec<String> = in_a
        .iter()
        .map(|w| {
            let label = if in_b.contains(w) { "A and B" } else { "A" };
            format!("{label}: {w}")
        })
        .collect();
    warnings.extend(
        in_b.iter()
            .filter(|w| !in_a.contains(w))
            .map(|w| format!("B: {w}")),
    );
    if !warnings.is_empty() {
        out.push_str("<section class=\"cautions\"><h2>Check before releasing the orders</h2>");
        for caution in &warnings {
            let _ = write!(out, "<p>{}</p>", escape(caution));
        }
        out.push_str("</section>");
    }
    let notes: Vec<String> = [("A", a), ("B", b)]
        .iter()
        .flat_map(|(label, side)| {
            side.result
                .notes
                .iter()
                .map(move |n| format!("{label}: {n}"))
        })
        .collect();
    if !notes.is_empty() {
        out.push_str("<section class=\"notes\"><h2>Notes</h2><ul>");
        for note in &notes {
            let _ = write!(out, "<li>{}</li>", escape(note));
        }
        out.push_str("</ul></section>");
    }
    out.push_str("<section><h2>Totals</h2>");
    let row =
        |label: &str, x: String, y: String, d: String| vec![text(label), num(x), num(y), num(d)];
    let m = |label: &str, x: f64, y: f64| row(label, money(x), money(y), money(y - x));
    let rows = vec![
        m("total cost", ea.total_cost(), eb.total_cost()),
        m("setup cost", ea.costs.setup, eb.costs.setup),
        m("holding cost", ea.costs.holding, eb.costs.holding),
        m("unit cost", ea.costs.unit, eb.costs.unit),
        m("backlog cost", ea.costs.backlog, eb.costs.backlog),
        m("overtime cost", ea.costs.overtime, eb.costs.overtime),
        row(
            "setups",
            ea.setups.to_string(),
            eb.setups.to_string(),
            (eb.setups as i64 - ea.setups as i64).to_string(),
        ),
        m(
            "average stock value",
            ea.average_stock_value(&a.scenario),
            eb.average_stock_value(&b.scenario),
        ),
        m(
            "ending stock value",
            ea.ending_stock_value(),
            eb.ending_stock_value(),
        ),
        match shared_capacity_unit(&a.scenario, &b.scenario) {
            Some(unit) => row(
                &format!("overtime used ({unit})"),
                units(ea.overtime_used()),
                units(eb.overtime_used()),
                units(eb.overtime_used() - ea.overtime_used()),
            ),
            None => row(
                "overtime used (resources in different units: see the overtime cost)",
                "-".into(),
                "-".into(),
                String::new(),
            ),
        },
        row(
            "fill rate",
            percent(ea.fill_rate(), 1),
            percent(eb.fill_rate(), 1),
            String::new(),
        ),
    ];
    table(&mut out, "", &["", "A", "B", "B - A"], &rows);
    out.push_str("</section>");
    // Charts over time need one calendar.
    if a.scenario.calendar == b.scenario.calendar {
        // Counts add up only in one unit; otherwise stock is valued.
        let counted =
            a.scenario.stock_unit().is_some() && a.scenario.stock_unit() == b.scenario.stock_unit();
        let total = |scenario: &crate::model::Scenario, e: &crate::eval::Evaluation| -> Vec<f64> {
            (0..a.scenario.periods())
                .map(|t| {
                    e.items
                        .iter()
                        .zip(&scenario.items)
                        .map(|(r, item)| {
                            let price = if counted { 1.0 } else { item.unit_cost[t] };
                            r.on_hand[t].max(0.0) * price
                        })
                        .sum()
                })
                .collect()
        };
        let (sa, sb) = (total(&a.scenario, ea), total(&b.scenario, eb));
        let what = match a.scenario.stock_unit().filter(|_| counted) {
            Some(unit) => format!("Stock on hand ({unit}) at the end of each bucket, all items together."),
            None => "Stock on hand at the end of each bucket, all items together, as value at unit cost (the items count in different units).".to_string(),
        };
        let _ = write!(
            out,
            "<section><h2>Stock over time</h2><p>{}</p><figure>{}</figure></section>",
            escape(&what),
            charts::steps(
                &a.scenario,
                "compare-stock",
                "Stock on hand at the end of each bucket, A and B",
                &[
                    charts::Series {
                        label: "A".into(),
                        values: &sa
                    },
                    charts::Series {
                        label: "B".into(),
                        values: &sb
                    },
                ],
            )
        );
        out.push_str("<section><h2>Load over time</h2><p>Production plus setup time by release bucket, with each side's regular capacity.</p>");
        for (r, resource) in a.scenario.resources.iter().enumerate() {
            let Some(rb) = b
                .scenario
                .resources
                .iter()
                .position(|x| x.id == resource.id)
            else {
                continue;
            };
            let load = |e: &crate::eval::Evaluation, r: usize| -> Vec<f64> {
                (0..a.scenario.periods())
                    .map(|t| e.resources[r].load(t))
                    .collect()
            };
            let (la, lb) = (load(ea, r), load(eb, rb));
            let (ca, cb) = (&ea.resources[r].capacity, &eb.resources[rb].capacity);
            let mut series = vec![
                charts::Series {
                    label: "load A".into(),
                    values: &la,
                },
                charts::Series {
                    label: "load B".into(),
                    values: &lb,
                },
                charts::Series {
                    label: "capacity A".into(),
                    values: ca,
                },
            ];
            if ca != cb {
                series.push(charts::Series {
                    label: "capacity B".into(),
                    values: cb,
                });
            }
            let _ = write!(
                out,
                "<h3>{}</h3><figure>{}</figure>",
                escape(&resource.id),
                charts::steps(
                    &a.scenario,
                    &format!("compare-load-{}", resource.id),
                    &format!("Load of {} by bucket, A and B", resource.id),
                    &series,
                )
            );
        }
        out.push_str("</section>");
    }
    out.push_str("<section><h2>Items</h2><p>Every item's cost, setups and average stock under each plan, the largest change first.</p>");
    if !c.items_compared() {
        let _ = write!(
            out,
            "<p>{}</p>",
            escape(&super::notes::no_plan_to_compare(c))
        );
    }
    let items = c.items_by_change();
    let dash = || "-".to_string();
    let rows: Vec<Vec<(String, bool)>> = items
        .iter()
        .map(|row| {
            let (x, y) = (row.a.as_ref(), row.b.as_ref());
            vec![
                text(row.id.clone()),
                num(x.map_or_else(dash, |f| money(f.cost))),
                num(y.map_or_else(dash, |f| money(f.cost))),
                num(money(row.cost_change())),
                num(x.map_or_else(dash, |f| f.setups.to_string())),
                num(y.map_or_else(dash, |f| f.setups.to_string())),
                num(x.map_or_else(dash, |f| units((f.average_stock * 10.0).round() / 10.0))),
                num(y.map_or_else(dash, |f| units((f.average_stock * 10.0).round() / 10.0))),
            ]
        })
        .collect();
    table(
        &mut out,
        "",
        &[
            "item",
            "cost A",
            "cost B",
            "B - A",
            "setups A",
            "setups B",
            "avg stock A",
            "avg stock B",
        ],
        &rows,
    );
    out.push_str("</section>");
    if !c.resources.is_empty() {
        out.push_str("<section><h2>Resources</h2><p>Load (production plus setup time) and overtime over the horizon; the busiest bucket is the one with the highest load over regular capacity.</p>");
        let busiest = |f: &crate::compare::ResourceFigures| match f.peak {
            Some((t, u)) => format!("{} in period {}", percent(u, 0), t + 1),
            None => dash(),
        };
        let rows: Vec<Vec<(String, bool)>> = c
            .resources
            .iter()
            .map(|row| {
                let (x, y) = (row.a.as_ref(), row.b.as_ref());
                vec![
                    text(row.id.clone()),
                    num(x.map_or_else(dash, |f| units(f.load.round()))),
                    num(y.map_or_else(dash, |f| units(f.load.round()))),
                    num(x.map_or_else(dash, |f| units(f.capacity.round()))),
                    num(y.map_or_else(dash, |f| units(f.capacity.round()))),
                    num(x.map_or_else(dash, |f| units(f.overtime.round()))),
                    num(y.map_or_else(dash, |f| units(f.overtime.round()))),
                    text(x.map_or_else(dash, busiest)),
                    text(y.map_or_else(dash, busiest)),
                ]
            })
            .collect();
        table(
            &mut out,
            "",
            &[
                "resource",
                "load A",
                "load B",
                "capacity A",
                "capacity B",
                "overtime A",
                "overtime B",
                "busiest A",
                "busiest B",
            ],
            &rows,
        );
        out.push_str("</section>");
    }
    let _ = writeln!(out, "<footer>Made by lotwright {}. A plan is decision support: the people who know the plant decide.</footer></main></body></html>", env!("CARGO_PKG_VERSION"));
    out
}
