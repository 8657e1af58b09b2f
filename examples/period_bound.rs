//! A measurement, not a part of the product: how much a period
//! decomposition raises the lower bound of the capacitated benchmark
//! instances above the facility-location LP the MILP starts from.
//!
//! The bound is the Dantzig-Wolfe decomposition of the capacity rows: the
//! facility-location LP (shares `z[i][j][t]` of bucket t's demand received
//! in j, setups `y[i][j]` in [0, 1]) with each bucket's production and
//! setups `(x[.][j], y[.][j])` a convex combination of plans that fit that
//! bucket's capacity with binary setups, priced by column generation. It
//! is at least the facility-location LP bound (every such combination fits
//! the capacity row) and can be more, since a fractional setup can no
//! longer carry a whole lot's capacity. The idea of decomposing by period
//! follows R. Jans and Z. Degraeve, "Improved lower bounds for the
//! capacitated lot sizing problem with setup times", Operations Research
//! Letters 32(2), 2004 (cited from memory); this combination with the
//! facility-location master is written here.
//!
//! Every bound printed is a Lagrangean (Lasdon) bound: the restricted
//! master's value plus each bucket's least reduced cost, valid at every
//! iteration, not only at the end.
//!
//! ```text
//! cargo run --release --example period_bound -- [--iterations N] FILES...
//! ```

#![allow(clippy::needless_range_loop)]

use std::path::PathBuf;
use std::time::Instant;

use highs::{ColProblem, HighsModelStatus, Row, Sense};
use lotwright::input::literature;
use lotwright::model::Scenario;

/// One instance in the decomposition's terms (one resource, no lead time).
struct Data {
    demand: Vec<Vec<f64>>,
    holding: Vec<f64>,
    setup: Vec<f64>,
    per_unit: Vec<f64>,
    setup_time: Vec<f64>,
    capacity: Vec<f64>,
}

/// A plan of one bucket that fits its capacity.
struct Column {
    bucket: usize,
    x: Vec<f64>,
    y: Vec<f64>,
}

const ARTIFICIAL: f64 = 1e6;

fn main() {
    let mut iterations = 300;
    let mut files = Vec::new();
    let mut args = std::env::args().skip(1);
    while let Some(arg) = args.next() {
        if arg == "--iterations" {
            iterations = args
                .next()
                .and_then(|v| v.parse().ok())
                .unwrap_or(iterations);
        } else {
            files.push(PathBuf::from(arg));
        }
    }
    let (instances, _) = literature::read_capacitated_instances(&files, |_| true, None)
        .unwrap_or_else(|e| {
            eprintln!("error: {e}");
            std::process::exit(2)
        });
    println!("instance     FL LP   period DW   iters       s");
    for scenario in &instances {
        let data = data(scenario);
        let started = Instant::now();
        let fl = location_lp(&data);
        let (bound, done) = decomposition(&data, iterations);
        println!(
            "{:<9} {:>9.1} {:>11.1} {:>7} {:>7.2}",
            scenario.name,
            fl,
            bound,
            done,
            started.elapsed().as_secs_f64()
        );
    }
}

fn data(scenario: &Scenario) -> Data {
    let n = scenario.items.len();
    let mut per_unit = vec![0.0; n];
    let mut setup_time = vec![0.0; n];
    for r in &scenario.routings {
        per_unit[r.item] = r.per_unit;
        setup_time[r.item] = r.setup_time;
    }
    Data {
        demand: scenario.items.iter().map(|i| i.demand.clone()).collect(),
        holding: scenario.items.iter().map(|i| i.holding_cost[0]).collect(),
        setup: scenario.items.iter().map(|i| i.setup_cost[0]).collect(),
        per_unit,
        setup_time,
        capacity: scenario.resources[0].capacity.clone(),
    }
}

/// The most item i can make in bucket j: its demand from j on, and what
/// fits the capacity after its setup time.
fn most(data: &Data, i: usize, j: usize) -> f64 {
    let need: f64 = data.demand[i][j..].iter().sum();
    let room = (data.capacity[j] - data.setup_time[i]).max(0.0) / data.per_unit[i];
    need.min(room)
}

/// The facility-location rows every model here shares: demand shares and
/// `z <= y`. Returns the z columns' rows to fill as (item, receipt, demand
/// bucket, demand row, share row) and the share rows by (item, receipt).
struct Shares {
    demand_rows: Vec<Vec<Option<Row>>>,
    share_rows: Vec<Vec<Vec<(usize, Row)>>>,
}

fn share_rows(problem: &mut ColProblem, data: &Data) -> Shares {
    let (n, periods) = (data.demand.len(), data.capacity.len());
    let mut demand_rows = vec![vec![None; periods]; n];
    let mut share_rows = vec![vec![Vec::new(); periods]; n];
    for i in 0..n {
        for t in 0..periods {
            if data.demand[i][t] > 0.0 {
                demand_rows[i][t] = Some(problem.add_row(1.0..=1.0));
                for j in 0..=t {
                    share_rows[i][j].push((t, problem.add_row(..=0.0)));
                }
            }
        }
    }
    Shares {
        demand_rows,
        share_rows,
    }
}

/// The share columns of item i received in bucket j, each entering
/// `work` with `work.1` per unit of demand, and the setup column, entering
/// `setup` with `setup.1`.
fn item_columns(
    problem: &mut ColProblem,
    data: &Data,
    shares: &Shares,
    (i, j): (usize, usize),
    work: (Row, f64),
    setup: (Row, f64),
) {
    for &(t, row) in &shares.share_rows[i][j] {
        let d = data.demand[i][t];
        let demand_row = shares.demand_rows[i][t].expect("a share row has demand");
        let cost = data.holding[i] * d * (t - j) as f64;
        problem.add_column(
            cost,
            0.0..=1.0,
            [(demand_row, 1.0), (row, 1.0), (work.0, work.1 * d)],
        );
    }
    let mut factors: Vec<(Row, f64)> = shares.share_rows[i][j]
        .iter()
        .map(|&(_, r)| (r, -1.0))
        .collect();
    factors.push(setup);
    problem.add_column(data.setup[i], 0.0..=1.0, factors);
}

/// The facility-location LP with the capacity rows themselves.
fn location_lp(data: &Data) -> f64 {
    let (n, periods) = (data.demand.len(), data.capacity.len());
    let mut problem = ColProblem::default();
    let shares = share_rows(&mut problem, data);
    let capacity: Vec<Row> = (0..periods)
        .map(|j| problem.add_row(..=data.capacity[j]))
        .collect();
    for i in 0..n {
        for j in 0..periods {
            let work = (capacity[j], data.per_unit[i]);
            let setup = (capacity[j], data.setup_time[i]);
            item_columns(&mut problem, data, &shares, (i, j), work, setup);
        }
    }
    let mut model = problem.optimise(Sense::Minimise);
    model.make_quiet();
    let solved = model.solve();
    assert_eq!(solved.status(), HighsModelStatus::Optimal);
    solved.objective_value()
}

/// Column generation over the buckets' capacity sets; the best Lagrangean
/// bound reached and the iterations done.
fn decomposition(data: &Data, iterations: usize) -> (f64, usize) {
    let (n, periods) = (data.demand.len(), data.capacity.len());
    // Every bucket starts with the plan that makes nothing.
    let mut columns: Vec<Column> = (0..periods)
        .map(|bucket| Column {
            bucket,
            x: vec![0.0; n],
            y: vec![0.0; n],
        })
        .collect();
    let mut best = f64::NEG_INFINITY;
    for iteration in 1..=iterations {
        let (value, x_dual, y_dual, convexity) = master(data, &columns);
        let mut bound = value;
        let mut added = 0;
        for j in 0..periods {
            let (reduced, column) = price(data, j, &x_dual[j], &y_dual[j], convexity[j]);
            bound += reduced.min(0.0);
            if reduced < -1e-7 * value.abs().max(1.0) {
                columns.push(column);
                added += 1;
            }
        }
        best = best.max(bound);
        if added == 0 {
            return (best, iteration);
        }
    }
    (best, iterations)
}

/// Solves the restricted master; its value and the duals of the x and y
/// link rows (by bucket, item) and of the convexity rows.
#[allow(clippy::type_complexity)]
fn master(data: &Data, columns: &[Column]) -> (f64, Vec<Vec<f64>>, Vec<Vec<f64>>, Vec<f64>) {
    let (n, periods) = (data.demand.len(), data.capacity.len());
    let mut problem = ColProblem::default();
    let shares = share_rows(&mut problem, data);
    let x_link: Vec<Vec<Row>> = (0..periods)
        .map(|_| (0..n).map(|_| problem.add_row(0.0..=0.0)).collect())
        .collect();
    let y_link: Vec<Vec<Row>> = (0..periods)
        .map(|_| (0..n).map(|_| problem.add_row(0.0..=0.0)).collect())
        .collect();
    let convexity: Vec<Row> = (0..periods).map(|_| problem.add_row(1.0..=1.0)).collect();
    for i in 0..n {
        for j in 0..periods {
            let (x, y) = ((x_link[j][i], 1.0), (y_link[j][i], 1.0));
            item_columns(&mut problem, data, &shares, (i, j), x, y);
            // Artificials keep the master feasible before the columns can.
            for row in [x_link[j][i], y_link[j][i]] {
                problem.add_column(ARTIFICIAL, 0.0.., [(row, 1.0)]);
                problem.add_column(ARTIFICIAL, 0.0.., [(row, -1.0)]);
            }
        }
    }
    for column in columns {
        let j = column.bucket;
        let mut factors = vec![(convexity[j], 1.0)];
        for i in 0..n {
            if column.x[i] != 0.0 {
                factors.push((x_link[j][i], -column.x[i]));
            }
            if column.y[i] != 0.0 {
                factors.push((y_link[j][i], -column.y[i]));
            }
        }
        problem.add_column(0.0, 0.0.., factors);
    }
    let rows_before: usize = shares
        .demand_rows
        .iter()
        .flatten()
        .filter(|r| r.is_some())
        .count()
        + shares
            .share_rows
            .iter()
            .flatten()
            .map(Vec::len)
            .sum::<usize>();
    let mut model = problem.optimise(Sense::Minimise);
    model.make_quiet();
    let solved = model.solve();
    assert_eq!(solved.status(), HighsModelStatus::Optimal);
    let solution = solved.get_solution();
    let duals = solution.dual_rows();
    let mut k = rows_before;
    let mut take = |count: usize| {
        let part = duals[k..k + count].to_vec();
        k += count;
        part
    };
    let x_dual: Vec<Vec<f64>> = (0..periods).map(|_| take(n)).collect();
    let y_dual: Vec<Vec<f64>> = (0..periods).map(|_| take(n)).collect();
    let conv = take(periods);
    (solved.objective_value(), x_dual, y_dual, conv)
}

/// The bucket plan of least reduced cost `sum x pi + y sigma - mu`, by
/// enumerating the setups and filling the capacity left greedily (a
/// fractional knapsack is exact for the continuous lots).
fn price(data: &Data, j: usize, pi: &[f64], sigma: &[f64], mu: f64) -> (f64, Column) {
    let n = pi.len();
    let usable: Vec<usize> = (0..n).filter(|&i| most(data, i, j) > 0.0).collect();
    let mut best = (f64::INFINITY, vec![0.0; n], vec![0.0; n]);
    for mask in 0u64..(1u64 << usable.len()) {
        let chosen: Vec<usize> = (0..usable.len())
            .filter(|b| mask >> b & 1 == 1)
            .map(|b| usable[b])
            .collect();
        let mut room = data.capacity[j] - chosen.iter().map(|&i| data.setup_time[i]).sum::<f64>();
        if room < 0.0 {
            continue;
        }
        let mut cost: f64 = chosen.iter().map(|&i| sigma[i]).sum();
        let mut order: Vec<usize> = chosen.iter().copied().filter(|&i| pi[i] < 0.0).collect();
        order.sort_by(|&a, &b| (pi[a] / data.per_unit[a]).total_cmp(&(pi[b] / data.per_unit[b])));
        let mut x = vec![0.0; n];
        for i in order {
            let amount = most(data, i, j).min(room / data.per_unit[i]);
            x[i] = amount;
            room -= amount * data.per_unit[i];
            cost += pi[i] * amount;
        }
        if cost < best.0 {
            let mut y = vec![0.0; n];
            for &i in &chosen {
                y[i] = 1.0;
            }
            best = (cost, x, y);
        }
    }
    (
        best.0 - mu,
        Column {
            bucket: j,
            x: best.1,
            y: best.2,
        },
    )
}
