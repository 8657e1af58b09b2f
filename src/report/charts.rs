//! The charts of report.html as inline SVG: cost by method (stacked by
//! kind), stock over time per item, and load against capacity per
//! resource. Every chart carries a `data-chart` attribute that names it.
//!
//! The charts draw figures of the evaluation; they sum cost kinds only to
//! place the stacked bars.

pub mod roll;

use super::figures;
use super::svg::{grouped, step_decimals, ticks, Scale, Svg};
use crate::model::Scenario;
use crate::solve::{MethodResult, Outcome};

// Colours that stay apart for readers with a colour-vision deficiency
// (the Okabe and Ito palette, common practice for charts).
const BLUE: &str = "#0072B2";
const SKY: &str = "#56B4E9";
const ORANGE: &str = "#E69F00";
const VERMILION: &str = "#D55E00";
const PURPLE: &str = "#CC79A7";
const GREEN: &str = "#009E73";
const GRID: &str = "stroke=\"#e3e3e3\" stroke-width=\"1\"";
const AXIS_TEXT: &str = "fill=\"#555\"";
const REDUCED: &str = "#f7e8c4";

fn fill(colour: &str) -> String {
    format!("fill=\"{colour}\"")
}

/// One bar of a stacked cost chart: the method's label, its costs, whether
/// it is the exact method (bold), and the figures written beside the bar,
/// one per column, each with its SVG text style.
pub(crate) struct CostBar<'a> {
    pub label: &'a str,
    pub costs: &'a crate::eval::Costs,
    pub exact: bool,
    pub figures: Vec<(String, String)>,
}

/// A column of figures beside the bars: its heading, where its text is
/// anchored and how (`end` or `start`).
pub(crate) struct Column {
    pub heading: &'static str,
    pub x: f64,
    pub anchor: &'static str,
}

/// The style of a figure that is bold on the exact method's bar.
pub(crate) fn emphasis(exact: bool) -> String {
    if exact { BOLD } else { "" }.to_string()
}

const BOLD: &str = "font-weight=\"600\"";

/// Costs by method as stacked bars (setup and holding always, backlog and
/// overtime where a bar has any), unit cost left out, with columns of
/// figures to the right of the bars.
pub(crate) fn stacked_costs(
    (id, title, axis): (&str, &str, &str),
    bars_right: f64,
    columns: &[Column],
    rows: &[CostBar],
) -> String {
    type Kind = (&'static str, &'static str, fn(&crate::eval::Costs) -> f64);
    let all_kinds: [Kind; 4] = [
        ("setup", BLUE, |c| c.setup),
        ("holding", ORANGE, |c| c.holding),
        ("backlog", PURPLE, |c| c.backlog),
        ("overtime", VERMILION, |c| c.overtime),
    ];
    let kinds: Vec<&Kind> = all_kinds
        .iter()
        .filter(|(name, _, value)| {
            *name == "setup" || *name == "holding" || rows.iter().any(|r| value(r.costs) > 0.0)
        })
        .collect();
    let (width, left) = (1000.0, 190.0);
    let (top, row_height) = (56.0, 30.0);
    let height = top + row_height * rows.len() as f64 + 40.0;
    let mut svg = Svg::new(id, width, height, title);
    let mut x = left;
    for (name, colour, _) in &kinds {
        x = svg.legend(x, 18.0, &format!("{name} cost"), &fill(colour), false);
    }
    let widest = rows
        .iter()
        .map(|r| kinds.iter().map(|(_, _, v)| v(r.costs)).sum::<f64>())
        .fold(0.0, f64::max);
    let (values, step) = ticks(0.0, widest.max(1.0), 5);
    let scale = Scale::new((0.0, *values.last().unwrap_or(&1.0)), (left, bars_right));
    let bottom = top + row_height * rows.len() as f64;
    for v in &values {
        let x = scale.map(*v);
        svg.line(x, top - 6.0, x, bottom, GRID);
        let label = grouped(*v, step_decimals(step));
        svg.text(x, bottom + 16.0, &label, "middle", AXIS_TEXT);
    }
    svg.text(
        (left + bars_right) / 2.0,
        bottom + 32.0,
        axis.trim_end(),
        "middle",
        AXIS_TEXT,
    );
    for column in columns {
        svg.text(column.x, top - 12.0, column.heading, column.anchor, BOLD);
    }
    for (k, r) in rows.iter().enumerate() {
        let y = top + row_height * k as f64;
        let style = if r.exact { BOLD } else { "" };
        svg.text(left - 8.0, y + 18.0, r.label, "end", style);
        let mut at = 0.0;
        for (name, colour, value) in &kinds {
            let v = value(r.costs);
            if v > 0.0 {
                let (x0, x1) = (scale.map(at), scale.map(at + v));
                let tip = format!("{}: {name} cost {}", r.label, super::money(v));
                svg.rect(x0, y + 5.0, x1 - x0, 18.0, &fill(colour), Some(&tip));
                at += v;
            }
        }
        for (column, (text, style)) in columns.iter().zip(&r.figures) {
            svg.text(column.x, y + 18.0, text, column.anchor, style);
        }
    }
    svg.finish()
}

/// Cost by method, stacked by kind, without unit cost: unit cost is much
/// larger than the rest and is listed beside the bars with the total.
pub fn cost_by_method(outcome: &Outcome, currency: &str) -> String {
    let rows: Vec<CostBar> = outcome
        .comparison
        .iter()
        .map(|r| {
            let (word, style) = if r.evaluation.feasible {
                (r.status.name(), AXIS_TEXT)
            } else {
                ("infeasible", "fill=\"#b00\" font-weight=\"600\"")
            };
            CostBar {
                label: r.method,
                costs: &r.evaluation.costs,
                exact: r.is_exact(),
                figures: vec![
                    (super::money(r.total_cost()), emphasis(r.is_exact())),
                    (super::money(r.evaluation.costs.unit), AXIS_TEXT.to_string()),
                    (word.to_string(), style.to_string()),
                ],
            }
        })
        .collect();
    let columns = [
        Column {
            heading: "total cost",
            x: 730.0,
            anchor: "end",
        },
        Column {
            heading: "of which unit cost",
            x: 870.0,
            anchor: "end",
        },
        Column {
            heading: "plan",
            x: 890.0,
            anchor: "start",
        },
    ];
    stacked_costs(
        (
            "cost-by-method",
            "Cost by method: setup, holding, backlog and overtime cost",
            &format!("cost {currency}"),
        ),
        600.0,
        &columns,
        &rows,
    )
}

/// A bucket's start as people read it on an axis: `4 Jan`, or `Jan 2027`
/// for months.
fn axis_date(scenario: &Scenario, t: usize) -> String {
    let date = scenario.calendar.bucket_start(t);
    match scenario.calendar.kind {
        crate::model::BucketKind::Month => date.format("%b %Y").to_string(),
        _ => date.format("%-d %b").to_string(),
    }
}

/// Labels for the x axis: every k-th bucket so that labels stay apart.
fn bucket_labels(scenario: &Scenario, band: f64, min_gap: f64) -> usize {
    let periods = scenario.periods().max(1);
    let mut every = 1;
    while band * (every as f64) < min_gap && every < periods {
        every += 1;
    }
    every
}

/// Horizontal grid lines at `values`, labelled left of the plot, which
/// spans `plot` (left and right edge); with `mark_zero` the zero line is
/// drawn darker.
fn value_axis(
    svg: &mut Svg,
    values: &[f64],
    step: f64,
    y: &Scale,
    plot: (f64, f64),
    mark_zero: bool,
) {
    let (left, right) = plot;
    for v in values {
        let style = if mark_zero && *v == 0.0 {
            "stroke=\"#999\" stroke-width=\"1\""
        } else {
            GRID
        };
        svg.line(left, y.map(*v), right, y.map(*v), style);
        svg.text(
            left - 6.0,
            y.map(*v) + 4.0,
            &grouped(*v, step_decimals(step)),
            "end",
            AXIS_TEXT,
        );
    }
}

/// The buckets' dates under the plot's `baseline`, every k-th so that
/// labels stay `min_gap` apart.
fn bucket_axis(svg: &mut Svg, scenario: &Scenario, x: &Scale, baseline: f64, min_gap: f64) {
    let periods = scenario.periods();
    let band = x.map(1.0) - x.map(0.0);
    let every = bucket_labels(scenario, band, min_gap);
    for t in (0..periods).step_by(every) {
        svg.text(
            x.map(t as f64 + 0.5),
            baseline + 16.0,
            &axis_date(scenario, t),
            "middle",
            AXIS_TEXT,
        );
    }
}

/// End-of-bucket stock of one item under the optimal plan and the current
/// rule, with its safety stock.
pub fn stock(
    scenario: &Scenario,
    item: usize,
    optimal: &MethodResult,
    reference: Option<&MethodResult>,
) -> String {
    let periods = scenario.periods();
    let (width, height) = (480.0, 210.0);
    let (left, right, top, bottom) = (58.0, 12.0, 34.0, 30.0);
    let id = &scenario.items[item].id;
    let safety = scenario.items[item].safety_stock;
    let mut svg = Svg::new(
        &format!("stock-{id}"),
        width,
        height,
        &format!("Stock of {id} at the end of each bucket"),
    );
    let mut plans: Vec<&MethodResult> = reference.into_iter().collect();
    plans.push(optimal);
    let all = plans
        .iter()
        .flat_map(|p| p.evaluation.items[item].on_hand.iter().copied());
    let high = all.clone().fold(safety, f64::max).max(1.0);
    // Solver noise (-1e-10) is no backlog: keep the axis at zero for it.
    let low = all.fold(0.0, f64::min);
    let low = if low > -1e-6 * high { 0.0 } else { low };
    let (values, step) = ticks(low, high, 4);
    let y = Scale::new(
        (values[0], *values.last().unwrap_or(&high)),
        (height - bottom, top),
    );
    let x = Scale::new((0.0, periods as f64), (left, width - right));
    value_axis(&mut svg, &values, step, &y, (left, width - right), true);
    bucket_axis(&mut svg, scenario, &x, height - bottom, 46.0);
    let mut lx = 8.0;
    if safety > 0.0 {
        let style = "stroke=\"#666\" stroke-width=\"1.5\" stroke-dasharray=\"2 3\"";
        svg.line(left, y.map(safety), width - right, y.map(safety), style);
        lx = svg.legend(lx, 16.0, "safety stock", style, true);
    }
    for plan in &plans {
        let is_optimal = std::ptr::eq(*plan, optimal);
        let style = if is_optimal {
            format!("stroke=\"{BLUE}\" stroke-width=\"2.5\"")
        } else {
            format!("stroke=\"{ORANGE}\" stroke-width=\"2\" stroke-dasharray=\"7 4\"")
        };
        let on_hand = &plan.evaluation.items[item].on_hand;
        let mut points = Vec::with_capacity(2 * periods);
        for (t, s) in on_hand.iter().enumerate() {
            points.push((x.map(t as f64), y.map(*s)));
            points.push((x.map(t as f64 + 1.0), y.map(*s)));
        }
        svg.path(&points, &style);
        let name = if is_optimal {
            format!("{} plan", plan.method)
        } else {
            format!("{} (current rule)", plan.method)
        };
        lx = svg.legend(lx, 16.0, &name, &style, true);
    }
    svg.finish()
}

/// Load of one resource against its capacity, by release bucket:
/// production and setup time stacked, capacity as steps, overtime used
/// marked, buckets of reduced capacity shaded.
pub fn load(scenario: &Scenario, resource: usize, result: &MethodResult) -> String {
    let periods = scenario.periods();
    let load = &result.evaluation.resources[resource];
    let id = &scenario.resources[resource].id;
    let (width, height) = (1000.0, 290.0);
    let (left, right, top, bottom) = (66.0, 16.0, 44.0, 34.0);
    let mut svg = Svg::new(
        &format!("load-{id}"),
        width,
        height,
        &format!("Load of {id} against its capacity, by bucket"),
    );
    let reduced = figures::reduced_buckets(load);
    let high = (0..periods)
        .map(|t| {
            load.load(t)
                .max(load.capacity[t] + load.overtime_capacity[t])
        })
        .fold(1.0, f64::max);
    let (values, step) = ticks(0.0, high * 1.05, 5);
    let y = Scale::new(
        (0.0, *values.last().unwrap_or(&high)),
        (height - bottom, top),
    );
    let x = Scale::new((0.0, periods as f64), (left, width - right));
    let band = (width - left - right) / periods.max(1) as f64;
    // One shaded band per run of reduced buckets.
    let mut t = 0;
    while t < periods {
        if !reduced[t] {
            t += 1;
            continue;
        }
        let first = t;
        while t < periods && reduced[t] {
            t += 1;
        }
        let capacities: Vec<String> = (first..t)
            .map(|k| {
                format!(
                    "period {} ({}): {}",
                    k + 1,
                    scenario.calendar.label(k),
                    super::quantity(load.capacity[k])
                )
            })
            .collect();
        let tip = format!("capacity reduced: {}", capacities.join("; "));
        let span = band * (t - first) as f64;
        svg.rect(
            x.map(first as f64),
            top,
            span,
            height - bottom - top,
            &fill(REDUCED),
            Some(&tip),
        );
        if span >= 44.0 {
            let middle = x.map(first as f64) + span / 2.0;
            svg.text(
                middle,
                top + 12.0,
                "reduced",
                "middle",
                "fill=\"#8a6d1f\" font-size=\"11\"",
            );
        }
    }
    value_axis(&mut svg, &values, step, &y, (left, width - right), false);
    bucket_axis(&mut svg, scenario, &x, height - bottom, 48.0);
    let bar = band * 0.62;
    let any_overtime = load.overtime_capacity.iter().any(|&o| o > 0.0);
    for t in 0..periods {
        let x0 = x.map(t as f64 + 0.5) - bar / 2.0;
        let tip = format!(
            "period {} ({}): production {}, setup time {}, capacity {}{}",
            t + 1,
            scenario.calendar.label(t),
            super::quantity(load.production[t]),
            super::quantity(load.setup_time[t]),
            super::quantity(load.capacity[t]),
            if load.overtime[t] > 0.0 {
                format!(", overtime used {}", super::quantity(load.overtime[t]))
            } else {
                String::new()
            }
        );
        let p = load.production[t];
        svg.rect(
            x0,
            y.map(p),
            bar,
            y.map(0.0) - y.map(p),
            &fill(SKY),
            Some(&tip),
        );
        let s = load.setup_time[t];
        svg.rect(
            x0,
            y.map(p + s),
            bar,
            y.map(p) - y.map(p + s),
            &fill(BLUE),
            Some(&tip),
        );
        if load.overtime[t] > 0.0 {
            let c = load.capacity[t];
            let o = load.overtime[t];
            let style = format!("fill=\"none\" stroke=\"{VERMILION}\" stroke-width=\"2.5\"");
            svg.rect(
                x0,
                y.map(c + o),
                bar,
                y.map(c) - y.map(c + o),
                &style,
                Some(&tip),
            );
            svg.text(
                x.map(t as f64 + 0.5),
                y.map(c + o) - 5.0,
                "OT",
                "middle",
                &format!("fill=\"{VERMILION}\" font-size=\"11\" font-weight=\"700\""),
            );
        }
        if result
            .evaluation
            .overloads
            .iter()
            .any(|o| &o.resource == id && o.period == t + 1)
        {
            svg.text(
                x.map(t as f64 + 0.5),
                y.map(load.load(t)) - 18.0,
                "over",
                "middle",
                "fill=\"#b00\" font-weight=\"700\"",
            );
        }
    }
    let steps = |level: &dyn Fn(usize) -> f64| {
        let mut points = Vec::new();
        for t in 0..periods {
            points.push((x.map(t as f64), y.map(level(t))));
            points.push((x.map(t as f64 + 1.0), y.map(level(t))));
        }
        points
    };
    let capacity_style = "stroke=\"#222\" stroke-width=\"2\"";
    let overtime_style =
        format!("stroke=\"{GREEN}\" stroke-width=\"1.5\" stroke-dasharray=\"6 4\"");
    if any_overtime {
        svg.path(
            &steps(&|t| load.capacity[t] + load.overtime_capacity[t]),
            &overtime_style,
        );
    }
    svg.path(&steps(&|t| load.capacity[t]), capacity_style);
    let mut lx = left;
    lx = svg.legend(lx, 18.0, "production", &fill(SKY), false);
    lx = svg.legend(lx, 18.0, "setup time", &fill(BLUE), false);
    lx = svg.legend(lx, 18.0, "regular capacity", capacity_style, true);
    if any_overtime {
        lx = svg.legend(lx, 18.0, "with overtime allowed", &overtime_style, true);
    }
    if load.overtime.iter().any(|&o| o > 0.0) {
        lx = svg.legend(
            lx,
            18.0,
            "overtime used (OT)",
            &format!("fill=\"none\" stroke=\"{VERMILION}\" stroke-width=\"2\""),
            false,
        );
    }
    if reduced.iter().any(|&r| r) {
        svg.legend(lx, 18.0, "reduced capacity", &fill(REDUCED), false);
    }
    svg.finish()
}

/// One series of a comparison chart: its legend and value by bucket.
pub struct Series<'a> {
    pub label: String,
    pub values: &'a [f64],
}

/// Two (or more) series by bucket as steps on one axis, for the page that
/// sets two scenarios side by side: the first solid blue, the second dashed
/// orange, further ones dotted. `scenario` gives the buckets' dates.
pub fn steps(scenario: &Scenario, name: &str, title: &str, series: &[Series]) -> String {
    let periods = scenario.periods();
    let (width, height) = (1000.0, 260.0);
    let (left, right, top, bottom) = (66.0, 16.0, 40.0, 34.0);
    let mut svg = Svg::new(name, width, height, title);
    let all = series.iter().flat_map(|s| s.values.iter().copied());
    let high = all.clone().fold(1.0, f64::max);
    let low = all.fold(0.0, f64::min);
    let (values, step) = ticks(low.min(0.0), high * 1.05, 5);
    let y = Scale::new(
        (values[0], *values.last().unwrap_or(&high)),
        (height - bottom, top),
    );
    let x = Scale::new((0.0, periods as f64), (left, width - right));
    value_axis(&mut svg, &values, step, &y, (left, width - right), true);
    bucket_axis(&mut svg, scenario, &x, height - bottom, 60.0);
    let mut lx = 8.0;
    for (k, s) in series.iter().enumerate() {
        let style = match k {
            0 => format!("stroke=\"{BLUE}\" stroke-width=\"2.5\""),
            1 => format!("stroke=\"{ORANGE}\" stroke-width=\"2\" stroke-dasharray=\"7 4\""),
            2 => format!("stroke=\"{GREEN}\" stroke-width=\"2\" stroke-dasharray=\"2 3\""),
            _ => format!("stroke=\"{PURPLE}\" stroke-width=\"2\" stroke-dasharray=\"2 5\""),
        };
        let mut points = Vec::with_capacity(2 * periods);
        for (t, v) in s.values.iter().take(periods).enumerate() {
            points.push((x.map(t as f64), y.map(*v)));
            points.push((x.map(t as f64 + 1.0), y.map(*v)));
        }
        svg.path(&points, &style);
        lx = svg.legend(lx, 16.0, &s.label, &style, true);
    }
    svg.finish()
}
