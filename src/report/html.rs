//! report.html written by `plan --out`: one self-contained page for a
//! manager (no scripts, no fetches, a print stylesheet) with the summary and
//! saving in words, charts as inline SVG (see `charts`), the comparison and
//! the orders. All text is escaped: item ids are user input.

use std::fmt::Write;

use super::svg::escape;
use super::{charts, figures, money, quantity};
use crate::model::Scenario;
use crate::solve::{cautions, Outcome};

mod sections;
mod words;

const STYLE: &str = include_str!("report.css");

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
    if let Some(s) = figures::saving(outcome).filter(|_| chosen.is_exact()) {
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
