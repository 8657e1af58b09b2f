//! The end of a rolling window, corrected.
//!
//! A plan over a window of T buckets sees only the part of a late lot's
//! cover that falls inside the window: a lot received two buckets before
//! the end serves two buckets of demand in the plan, though the shop will
//! use it longer. It pays the whole setup for that part, so a truncated
//! plan shuns late setups and stretches earlier lots to the window's end
//! instead; the next week's plan inherits the short cycle. With constant
//! demand the rolled plans then repeat lots shorter than the economic
//! cycle, week after week.
//!
//! The correction charges a setup near the end only for the share of an
//! economic lot's cover that lies inside the window. For item i, with
//! setup cost S, holding cost h per unit and bucket and mean forecast
//! demand D per bucket in the window, the economic time between orders is
//!
//!   TBO = sqrt(2 S / (h D))   buckets (the EOQ's cycle),
//!
//! and an order released in bucket t, received in t + L (lead time L),
//! covers at most T - t - L buckets of the window. Its setup cost is
//! weighted by
//!
//!   w(t) = min(1, (T - t - L) / TBO).
//!
//! The idea of charging the setups at the end of a rolling window only in
//! part follows H. Stadtler, "Improved rolling schedules for the dynamic
//! single-level lot-sizing problem", Management Science 46(2), 2000
//! (cited from memory); the weight above is this module's own simple form
//! of it, not the paper's formula. Only the window's planning costs
//! change: capacity, setup times and the realised evaluation are as
//! before. An item with no demand of its own in the window (a component
//! made only for its parents) or no holding cost keeps its setups whole.

use crate::model::Scenario;

/// Each item's economic time between orders in buckets over the window's
/// forecast, or None where it is not defined (no own demand, no holding
/// cost, no setup cost).
pub fn economic_cycle(window: &Scenario, i: usize) -> Option<f64> {
    let item = &window.items[i];
    let periods = item.demand.len();
    if periods == 0 {
        return None;
    }
    let demand = item.demand.iter().sum::<f64>() / periods as f64;
    let setup = item.nominal_setup_cost;
    let holding = item.nominal_holding_cost;
    (demand > 0.0 && setup > 0.0 && holding > 0.0)
        .then(|| (2.0 * setup / (holding * demand)).sqrt())
}

/// The share of a setup released in bucket `t` that a window charges,
/// for an item with this economic cycle (`economic_cycle`).
pub fn weight(window: &Scenario, i: usize, cycle: Option<f64>, t: usize) -> f64 {
    let Some(cycle) = cycle else {
        return 1.0;
    };
    let cover = window
        .periods()
        .saturating_sub(t + window.items[i].lead_time);
    if cover == 0 {
        // Received after the window: the window sees none of its cover,
        // and such an order does nothing for it; its setup stays whole.
        return 1.0;
    }
    (cover as f64 / cycle).min(1.0)
}

/// Weights the setup costs in the window's last buckets (`weight`); the
/// frozen buckets are left alone.
pub fn correct(window: &mut Scenario) {
    let weights: Vec<Vec<f64>> = (0..window.items.len())
        .map(|i| {
            let cycle = economic_cycle(window, i);
            (0..window.periods())
                .map(|t| weight(window, i, cycle, t))
                .collect()
        })
        .collect();
    for (item, weights) in window.items.iter_mut().zip(weights) {
        for (t, w) in weights.into_iter().enumerate() {
            if t >= window.frozen {
                item.setup_cost[t] *= w;
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::{BucketKind, Calendar, Item};
    use chrono::NaiveDate;

    fn window(demand: &[f64], setup: f64, holding: f64, lead_time: usize) -> Scenario {
        let mut item = Item::simple("A", demand, setup, holding);
        item.lead_time = lead_time;
        Scenario {
            name: "window".into(),
            currency: None,
            calendar: Calendar {
                start: NaiveDate::from_ymd_opt(2027, 1, 4).expect("a valid date"),
                kind: BucketKind::Week,
                periods: demand.len(),
            },
            items: vec![item],
            resources: Vec::new(),
            routings: Vec::new(),
            bom: Vec::new(),
            frozen: 0,
            period_offset: 0,
        }
    }

    #[test]
    fn weights_by_the_share_of_an_economic_cycle_in_the_window() {
        // Demand 25 a bucket, setup 200, holding 1: TBO = sqrt(400 / 25) = 4.
        let mut w = window(&[25.0; 8], 200.0, 1.0, 0);
        assert!((economic_cycle(&w, 0).unwrap() - 4.0).abs() < 1e-12);
        correct(&mut w);
        assert_eq!(
            w.items[0].setup_cost,
            vec![200.0, 200.0, 200.0, 200.0, 200.0, 150.0, 100.0, 50.0]
        );
    }

    #[test]
    fn a_lead_time_moves_the_weights_earlier_and_the_freeze_keeps_its_own() {
        let mut w = window(&[25.0; 8], 200.0, 1.0, 2);
        w.frozen = 6;
        correct(&mut w);
        // Releases in 3, 4, 5 are received in 5, 6, 7; 6 and 7 are frozen;
        // a release in 6 or 7 arrives after the window and keeps its cost.
        assert_eq!(
            w.items[0].setup_cost,
            vec![200.0, 200.0, 200.0, 200.0, 200.0, 200.0, 200.0, 200.0]
        );
        let mut open = window(&[25.0; 8], 200.0, 1.0, 2);
        correct(&mut open);
        assert_eq!(
            open.items[0].setup_cost,
            vec![200.0, 200.0, 200.0, 150.0, 100.0, 50.0, 200.0, 200.0]
        );
    }

    #[test]
    fn an_item_without_demand_or_holding_cost_keeps_its_setups() {
        let mut idle = window(&[0.0; 6], 200.0, 1.0, 0);
        correct(&mut idle);
        assert!(idle.items[0].setup_cost.iter().all(|&s| s == 200.0));
        let mut free = window(&[25.0; 6], 200.0, 0.0, 0);
        correct(&mut free);
        assert!(free.items[0].setup_cost.iter().all(|&s| s == 200.0));
    }
}
