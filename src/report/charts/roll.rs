//! The charts of the roll page (`roll --out`): realised cost by method,
//! the units each plan moved against the one before, week by week, and
//! every weekly plan's status. They draw the run's figures as they are.

use super::{
    axis_date, emphasis, fill, stacked_costs, value_axis, Column, CostBar, AXIS_TEXT, BLUE, GREEN,
    ORANGE, PURPLE, SKY, VERMILION,
};
use crate::report::svg::{ticks, Scale, Svg};
use crate::report::table::RollRun;
use crate::roll::RollResult;
use crate::solve::Status;

const BLACK: &str = "#000000";
const GREY: &str = "#8c8c8c";

/// The exact method's runs are set apart: bold labels, solid lines drawn
/// on top of the rules'.
fn is_exact(r: &RollResult) -> bool {
    r.method == crate::solve::EXACT
}

/// A line style per method: colour and dashes stay apart for eight
/// methods (the Okabe and Ito palette without its yellow, which is too
/// pale on white).
fn line_style(k: usize, exact: bool) -> String {
    const COLOURS: [&str; 7] = [BLUE, ORANGE, GREEN, VERMILION, PURPLE, SKY, BLACK];
    const DASHES: [&str; 4] = [
        "",
        " stroke-dasharray=\"7 4\"",
        " stroke-dasharray=\"2 3\"",
        " stroke-dasharray=\"9 3 2 3\"",
    ];
    let width = if exact { 2.8 } else { 1.8 };
    format!(
        "stroke=\"{}\" stroke-width=\"{width}\"{}",
        COLOURS[k % COLOURS.len()],
        if exact { "" } else { DASHES[(k % 3) + 1] }
    )
}

/// Legend entries laid out left to right, wrapping onto a new line before
/// `right`; returns the y of the last line.
fn legends(svg: &mut Svg, entries: &[(String, String, bool)], left: f64, right: f64) -> f64 {
    let (mut x, mut y) = (left, 18.0);
    for (label, style, as_line) in entries {
        let width = 6.6 * label.chars().count() as f64 + 40.0;
        if x > left && x + width > right {
            x = left;
            y += 20.0;
        }
        x = svg.legend(x, y, label, style, *as_line);
    }
    y
}

/// Week labels under a plot whose x scale runs over the run's weeks.
fn week_axis(svg: &mut Svg, run: &RollRun, x: &Scale, baseline: f64, min_gap: f64) {
    let band = x.map(1.0) - x.map(0.0);
    let mut every = 1;
    while band * (every as f64) < min_gap && every < run.weeks.max(1) {
        every += 1;
    }
    for k in (0..run.weeks).step_by(every) {
        svg.text(
            x.map(k as f64 + 0.5),
            baseline + 16.0,
            &axis_date(run.scenario, run.first + k),
            "middle",
            AXIS_TEXT,
        );
    }
}

/// Realised cost by method, stacked by kind (setup, holding, and backlog
/// and overtime where a method has any), with the cost, the fill rate and
/// the units cut beside each bar. Unit cost is left out, as in the
/// terminal's realised table.
pub fn realised_cost(run: &RollRun, currency: &str) -> String {
    let any_cut = run.results.iter().any(|r| r.units_cut() > 0.0);
    let rows: Vec<CostBar> = run
        .results
        .iter()
        .map(|r| {
            let costs = &r.realised.costs;
            let mut figures = vec![
                (
                    crate::report::money(costs.total() - costs.unit),
                    emphasis(is_exact(r)),
                ),
                (
                    format!("{:.1} %", 100.0 * r.realised.fill_rate()),
                    AXIS_TEXT.to_string(),
                ),
            ];
            if any_cut {
                figures.push((
                    crate::report::quantity(r.units_cut().round()),
                    AXIS_TEXT.to_string(),
                ));
            }
            CostBar {
                label: &r.label,
                costs,
                exact: is_exact(r),
                figures,
            }
        })
        .collect();
    let mut columns = vec![
        Column {
            heading: "cost",
            x: 770.0,
            anchor: "end",
        },
        Column {
            heading: "fill rate",
            x: 870.0,
            anchor: "end",
        },
    ];
    if any_cut {
        columns.push(Column {
            heading: "units cut",
            x: 985.0,
            anchor: "end",
        });
    }
    stacked_costs(
        (
            "realised-cost",
            "Realised cost by method: setup, holding, backlog and overtime cost of the orders carried out",
            &format!("realised cost without unit cost {currency}"),
        ),
        640.0,
        &columns,
        &rows,
    )
}

/// Units moved by each plan against the plan before, over the weeks both
/// cover: one line per method, one point per week from the second (the
/// first plan has nothing before it).
pub fn changes_by_week(run: &RollRun) -> String {
    let (width, left, right, bottom) = (1000.0, 66.0, 16.0, 34.0);
    let entries: Vec<(String, String, bool)> = run
        .results
        .iter()
        .enumerate()
        .map(|(k, r)| (r.label.clone(), line_style(k, is_exact(r)), true))
        .collect();
    // The legend's lines are measured first, so that the plot starts
    // below them.
    let mut probe = Svg::new("", width, 10.0, "");
    let legend_bottom = legends(&mut probe, &entries, 8.0, width - right);
    let top = legend_bottom + 36.0;
    let height = top + 220.0 + bottom;
    let unit = run.scenario.calendar.kind.name();
    let mut svg = Svg::new(
        "changes-by-week",
        width,
        height,
        &format!("Units moved by each {unit}'s plan against the plan before, by method"),
    );
    legends(&mut svg, &entries, 8.0, width - right);
    let moved = |r: &RollResult| -> Vec<Option<f64>> {
        r.weeks
            .iter()
            .map(|w| w.stability.map(|s| s.quantity_moved))
            .collect()
    };
    let high = run
        .results
        .iter()
        .flat_map(|r| moved(r).into_iter().flatten())
        .fold(1.0, f64::max);
    let (values, step) = ticks(0.0, high * 1.05, 5);
    let y = Scale::new(
        (0.0, *values.last().unwrap_or(&high)),
        (height - bottom, top),
    );
    let x = Scale::new((0.0, run.weeks.max(1) as f64), (left, width - right));
    value_axis(&mut svg, &values, step, &y, (left, width - right), true);
    week_axis(&mut svg, run, &x, height - bottom, 56.0);
    // The rules first, so that the exact method's line stays on top.
    let order = run
        .results
        .iter()
        .enumerate()
        .filter(|(_, r)| !is_exact(r))
        .chain(run.results.iter().enumerate().filter(|(_, r)| is_exact(r)));
    for (k, r) in order {
        let style = line_style(k, is_exact(r));
        let points: Vec<(usize, f64)> = moved(r)
            .into_iter()
            .enumerate()
            .filter_map(|(w, v)| v.map(|v| (w, v)))
            .collect();
        let path: Vec<(f64, f64)> = points
            .iter()
            .map(|(w, v)| (x.map(*w as f64 + 0.5), y.map(*v)))
            .collect();
        svg.path(&path, &style);
        let colour = style.split('"').nth(1).unwrap_or(BLUE).to_string();
        for (w, v) in &points {
            let week = &r.weeks[*w];
            let share = week.stability.map_or(0.0, |s| s.share_changed());
            let tip = format!(
                "{}, plan of {}: {} units moved, {:.0} % of orders changed",
                r.label,
                run.scenario.calendar.label(week.bucket),
                crate::report::quantity(v.round()),
                100.0 * share
            );
            let (cx, cy) = (x.map(*w as f64 + 0.5), y.map(*v));
            svg.rect(cx - 2.5, cy - 2.5, 5.0, 5.0, &fill(&colour), Some(&tip));
        }
    }
    svg.text(8.0, top - 12.0, "units moved", "start", AXIS_TEXT);
    svg.finish()
}

/// Each weekly plan's status, one row per method and one cell per week:
/// proven optimal, feasible, infeasible or no plan found; a plan made
/// with units late carries an L, a week whose orders the shop had to cut
/// a dark bar at the cell's foot.
pub fn statuses_by_week(run: &RollRun) -> String {
    let (width, left, right, row_height) = (1000.0, 190.0, 16.0, 24.0);
    let status_fill = |status: Status| match status {
        Status::Optimal => GREEN,
        Status::Feasible => SKY,
        Status::Infeasible => VERMILION,
        Status::Unknown => GREY,
    };
    let cut_style = format!("fill=\"{BLACK}\"");
    let entries = vec![
        ("optimal (proven)".to_string(), fill(GREEN), false),
        ("feasible".to_string(), fill(SKY), false),
        ("infeasible".to_string(), fill(VERMILION), false),
        ("no plan found".to_string(), fill(GREY), false),
        (
            "L: planned with units late".to_string(),
            "fill=\"#fff\" stroke=\"#333\"".to_string(),
            false,
        ),
        (
            "foot bar: orders cut to fit the lines".to_string(),
            cut_style.clone(),
            false,
        ),
    ];
    let mut probe = Svg::new("", width, 10.0, "");
    let top = legends(&mut probe, &entries, left, width - right) + 18.0;
    let rows = run.results.len();
    let bottom = 34.0;
    let height = top + row_height * rows as f64 + bottom;
    let unit = run.scenario.calendar.kind.name();
    let mut svg = Svg::new(
        "plan-status",
        width,
        height,
        &format!("The status of each {unit}'s plan, by method"),
    );
    legends(&mut svg, &entries, left, width - right);
    let x = Scale::new((0.0, run.weeks.max(1) as f64), (left, width - right));
    let band = x.map(1.0) - x.map(0.0);
    let gap = if band > 6.0 { 1.5 } else { 0.0 };
    for (k, r) in run.results.iter().enumerate() {
        let y = top + row_height * k as f64;
        let emphasis = if is_exact(r) {
            "font-weight=\"600\""
        } else {
            ""
        };
        svg.text(left - 8.0, y + 16.0, &r.label, "end", emphasis);
        for (w, week) in r.weeks.iter().enumerate() {
            let mut tip = format!(
                "{}, plan of {}: {}",
                r.label,
                run.scenario.calendar.label(week.bucket),
                week.status.name()
            );
            if !week.late.is_empty() {
                tip.push_str(&format!(
                    ", {} units late",
                    crate::report::quantity(week.units_late())
                ));
            }
            if !week.cuts.is_empty() {
                tip.push_str(&format!(
                    ", {} units cut to fit the lines",
                    crate::report::quantity(week.units_cut())
                ));
            }
            let x0 = x.map(w as f64) + gap / 2.0;
            let cell = band - gap;
            svg.rect(
                x0,
                y + 2.0,
                cell,
                row_height - 4.0,
                &fill(status_fill(week.status)),
                Some(&tip),
            );
            if !week.cuts.is_empty() {
                svg.rect(x0, y + row_height - 6.0, cell, 4.0, &cut_style, Some(&tip));
            }
            if !week.late.is_empty() {
                svg.text(
                    x0 + cell / 2.0,
                    y + 15.5,
                    "L",
                    "middle",
                    "fill=\"#fff\" font-weight=\"700\" font-size=\"11\"",
                );
            }
        }
    }
    week_axis(&mut svg, run, &x, top + row_height * rows as f64, 56.0);
    svg.finish()
}
