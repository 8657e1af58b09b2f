//! The smoothing heuristic of the Lagrangean relaxation (after Trigeiro,
//! Thomas and McClain 1989): it turns the subproblems' plans, which ignore
//! capacity, into a plan within capacity by moving production between
//! buckets, or says it cannot.

use super::lagrange::Frame;
use crate::eval::quantity_tolerance;

/// The smoothing heuristic. A forward pass moves production out of
/// overloaded buckets into the next one where stock already covers the
/// need; a backward pass, from the last bucket to the second, moves what is
/// still too much one bucket earlier. Each move takes the item whose move
/// costs least per unit of capacity it frees, merging into an existing lot
/// before opening one (a new lot costs setup time too). `None` when the
/// first bucket stays overloaded.
pub(crate) fn smooth(frame: &Frame, receipts: &[Vec<f64>]) -> Option<Vec<Vec<f64>>> {
    let periods = frame.periods;
    let mut state = Smoothing {
        frame,
        release: frame
            .members
            .iter()
            .zip(receipts)
            .map(|(m, q)| {
                let lead = m.base.lead_time;
                (0..periods)
                    .map(|t| if t + lead < periods { q[t + lead] } else { 0.0 })
                    .collect()
            })
            .collect(),
        load: frame.load(receipts),
        on_hand: frame
            .members
            .iter()
            .zip(receipts)
            .map(|(m, q)| {
                let mut stock = m.base.initial_stock;
                (0..periods)
                    .map(|j| {
                        stock += m.base.receipts[j] + q[j] - m.base.demand[j];
                        stock
                    })
                    .collect()
            })
            .collect(),
    };
    let rows = frame.capacity.len();
    for t in 0..periods.saturating_sub(1) {
        for r in 0..rows {
            while state.excess(r, t) > 0.0 {
                let Some((k, amount, to)) = state.choose(r, t, true) else {
                    break;
                };
                state.shift(k, t, to, amount);
            }
        }
    }
    for t in (1..periods).rev() {
        for r in 0..rows {
            while state.excess(r, t) > 0.0 {
                let (k, amount, to) = state.choose(r, t, false)?;
                state.shift(k, t, to, amount);
            }
        }
    }
    if (0..rows).any(|r| state.excess(r, 0) > 0.0) {
        return None;
    }
    Some(
        frame
            .members
            .iter()
            .zip(&state.release)
            .map(|(m, rel)| {
                let lead = m.base.lead_time;
                (0..periods)
                    .map(|j| if j >= lead { rel[j - lead] } else { 0.0 })
                    .collect()
            })
            .collect(),
    )
}

/// The plan being smoothed, by release bucket, with its load and the stock
/// on hand at the end of each receipt bucket.
struct Smoothing<'a> {
    frame: &'a Frame,
    release: Vec<Vec<f64>>,
    load: Vec<Vec<f64>>,
    on_hand: Vec<Vec<f64>>,
}

impl Smoothing<'_> {
    /// Load beyond capacity and overtime (0 within a relative 1e-9).
    fn excess(&self, r: usize, t: usize) -> f64 {
        let limit = self.frame.capacity[r][t] + self.frame.overtime[r][t];
        let excess = self.load[r][t] - limit;
        if excess > 1e-9 * limit.abs().max(1.0) {
            excess
        } else {
            0.0
        }
    }

    /// The item, amount and bucket to move production released in bucket
    /// `t` to, to relieve resource `r`: one bucket later (`later`), where
    /// stock at hand covers the need; or earlier, into the latest bucket
    /// with room, else the item's latest earlier lot, else the bucket
    /// before.
    fn choose(&self, r: usize, t: usize, later: bool) -> Option<(usize, f64, usize)> {
        let excess = self.excess(r, t);
        let periods = self.frame.periods;
        self.frame
            .members
            .iter()
            .enumerate()
            .filter_map(|(k, m)| {
                let item = &m.base;
                let tolerance = quantity_tolerance(item);
                let q = self.release[k][t];
                let &(_, per_unit, setup_time) = m.routes.iter().find(|x| x.0 == r)?;
                if q <= tolerance {
                    return None;
                }
                let j = t + item.lead_time;
                let has_lot = |s: usize| self.release[k][s] > tolerance;
                // Where the production may go, and how much of it fits.
                let targets: Vec<(usize, f64)> = if later {
                    if j + 1 >= periods {
                        return None;
                    }
                    let covered = (self.on_hand[k][j] - item.stock_floor(j).max(0.0)).min(q);
                    vec![(t + 1, covered)]
                } else {
                    // The latest earlier lot of the item with room, and the
                    // latest earlier bucket with room for a new lot (setup
                    // time included); with room nowhere, the latest lot
                    // (a merge saves a setup) or the bucket before, whose
                    // excess then moves on.
                    let with_room = |lot: bool| {
                        (0..t).rev().find_map(|s| {
                            let room = self.room(k, s);
                            (has_lot(s) == lot && room > tolerance).then_some((s, room.min(q)))
                        })
                    };
                    let found: Vec<(usize, f64)> = [with_room(true), with_room(false)]
                        .into_iter()
                        .flatten()
                        .collect();
                    if found.is_empty() {
                        let lot = (0..t).rev().find(|&s| has_lot(s));
                        vec![(lot.unwrap_or(t - 1), q)]
                    } else {
                        found
                    }
                };
                let mut best: Option<(bool, f64, usize, f64, usize)> = None;
                for (to, movable) in targets {
                    if movable <= tolerance {
                        continue;
                    }
                    let partial = if per_unit > 0.0 {
                        (excess / per_unit).min(movable)
                    } else {
                        movable
                    };
                    let opens = !has_lot(to);
                    let carrying: f64 = if later {
                        -item.holding_cost[j]
                    } else {
                        item.holding_cost[to + item.lead_time..j].iter().sum()
                    };
                    // Part of the lot, just enough, or all of it (which
                    // frees its setup time as well).
                    let amounts = [Some(partial), (movable >= q - tolerance).then_some(q)];
                    for amount in amounts.into_iter().flatten() {
                        let whole = amount >= q - tolerance;
                        let mut cost = amount * (carrying + item.unit_cost[to] - item.unit_cost[t]);
                        if opens {
                            cost += item.setup_cost[to];
                        }
                        if whole {
                            cost -= item.setup_cost[t];
                        }
                        let freed = per_unit * amount + if whole { setup_time } else { 0.0 };
                        if freed <= 0.0 {
                            continue;
                        }
                        let option = (opens, cost / freed, k, amount, to);
                        if best.is_none_or(|b| (option.0, option.1) < (b.0, b.1)) {
                            best = Some(option);
                        }
                    }
                }
                best
            })
            .min_by(|a, b| a.0.cmp(&b.0).then(a.1.total_cmp(&b.1)).then(a.2.cmp(&b.2)))
            .map(|(_, _, k, amount, to)| (k, amount, to))
    }

    /// How much of item `k` release bucket `s` can still take within
    /// capacity and overtime on every resource it uses (a new lot's setup
    /// time included).
    fn room(&self, k: usize, s: usize) -> f64 {
        let member = &self.frame.members[k];
        let opens = self.release[k][s] <= quantity_tolerance(&member.base);
        member
            .routes
            .iter()
            .map(|&(r, per_unit, setup_time)| {
                let limit = self.frame.capacity[r][s] + self.frame.overtime[r][s];
                let free = limit - self.load[r][s] - if opens { setup_time } else { 0.0 };
                if per_unit > 0.0 {
                    free / per_unit
                } else if free >= 0.0 {
                    f64::INFINITY
                } else {
                    0.0
                }
            })
            .fold(f64::INFINITY, f64::min)
    }

    /// Moves `amount` of item `k` from release bucket `t` to `to`.
    fn shift(&mut self, k: usize, t: usize, to: usize, amount: f64) {
        let member = &self.frame.members[k];
        let tolerance = quantity_tolerance(&member.base);
        let opened = self.release[k][to] <= tolerance;
        self.release[k][t] -= amount;
        self.release[k][to] += amount;
        let closed = self.release[k][t] <= tolerance;
        if closed {
            self.release[k][t] = 0.0;
        }
        let (lead, j) = (member.base.lead_time, t + member.base.lead_time);
        if to > t {
            self.on_hand[k][j] -= amount;
        } else {
            for stock in &mut self.on_hand[k][to + lead..j] {
                *stock += amount;
            }
        }
        for &(s, per_unit, setup_time) in &member.routes {
            self.load[s][t] -= per_unit * amount + if closed { setup_time } else { 0.0 };
            self.load[s][to] += per_unit * amount + if opened { setup_time } else { 0.0 };
        }
    }
}
