//! Whether an EOQ's demand and holding cost look like they share one time
//! unit. The formula sqrt(2 D S / H) takes both per the same time unit; a
//! yearly demand with a weekly holding cost gives a lot sqrt(52) times too
//! large, and nothing in the numbers alone says so. Two checks catch the
//! clear cases, each only as a warning:
//!
//! - the time between orders, Q / D: shorter than a day or longer than a
//!   year is implausible for a lot worth computing. With a known time unit
//!   (`--time-unit`) the cycle is turned into days; without one, it is
//!   implausible only if it is so under every unit from a day to a year
//!   (under 1/365 or over 365 time units).
//! - with a unit cost (`--unit-cost`, or the price paid under price
//!   breaks) and a known time unit, the holding cost as a yearly share of
//!   the unit cost. Carrying rates are usually quoted at about 10 to 40 %
//!   a year (common practice, no single source); outside 2 to 100 % the
//!   holding cost is more likely per another time unit than the demand.
//!
//! The checks return data; `report::eoq` words them.

use serde::Serialize;

use super::eoq::EoqResult;

/// The time unit the user says demand and holding cost are given in.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum TimeUnit {
    Day,
    Week,
    Month,
    Year,
}

impl TimeUnit {
    /// Days in one time unit (a month as a twelfth of 365 days).
    pub fn days(self) -> f64 {
        match self {
            TimeUnit::Day => 1.0,
            TimeUnit::Week => 7.0,
            TimeUnit::Month => 365.0 / 12.0,
            TimeUnit::Year => 365.0,
        }
    }

    /// Time units in a year.
    pub fn per_year(self) -> f64 {
        365.0 / self.days()
    }

    pub fn name(self) -> &'static str {
        match self {
            TimeUnit::Day => "day",
            TimeUnit::Week => "week",
            TimeUnit::Month => "month",
            TimeUnit::Year => "year",
        }
    }
}

/// The plausible yearly carrying rate, as a share of the unit cost.
pub const CARRYING_RATE_BAND: (f64, f64) = (0.02, 1.0);

/// A sign that demand and holding cost are in different time units.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum TimeUnitHint {
    /// More than one order a day. `cycle_days` when the time unit is known.
    CycleUnderADay { cycle_days: Option<f64> },
    /// Fewer than one order a year.
    CycleOverAYear { cycle_days: Option<f64> },
    /// The holding cost is this share of the unit cost a year, outside
    /// `CARRYING_RATE_BAND`.
    CarryingRate { yearly_rate: f64 },
}

/// The hints for one EOQ result; empty when nothing looks wrong.
pub fn check(
    result: &EoqResult,
    time_unit: Option<TimeUnit>,
    unit_cost: Option<f64>,
) -> Vec<TimeUnitHint> {
    let mut hints = Vec::new();
    let cycle = result.cycle;
    if cycle.is_finite() && cycle > 0.0 {
        let (days, under, over) = match time_unit {
            Some(unit) => (
                Some(cycle * unit.days()),
                1.0 / unit.days(),
                365.0 / unit.days(),
            ),
            None => (None, 1.0 / 365.0, 365.0),
        };
        if cycle < under {
            hints.push(TimeUnitHint::CycleUnderADay { cycle_days: days });
        } else if cycle > over {
            hints.push(TimeUnitHint::CycleOverAYear { cycle_days: days });
        }
    }
    if let (Some(unit), Some(price)) = (time_unit, unit_cost.or(result.unit_price)) {
        if price > 0.0 && result.holding_cost > 0.0 {
            let yearly_rate = result.holding_cost * unit.per_year() / price;
            if yearly_rate < CARRYING_RATE_BAND.0 || yearly_rate > CARRYING_RATE_BAND.1 {
                hints.push(TimeUnitHint::CarryingRate { yearly_rate });
            }
        }
    }
    hints
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::single::eoq::{solve, EoqInput};

    fn result(demand: f64, setup_cost: f64, holding_cost: f64) -> EoqResult {
        solve(&EoqInput {
            demand,
            setup_cost,
            holding_cost: Some(holding_cost),
            production_rate: None,
            backorder_cost: None,
            price_breaks: None,
            carrying_rate: None,
            lot: None,
        })
        .unwrap()
    }

    #[test]
    fn a_yearly_demand_with_a_weekly_holding_cost_is_flagged_by_its_rate() {
        // Invented: 9,100 a year, 45 an order, 0.06 a week on a 15.00 part
        // (0.06 x 52 / 15 = 20.8 % a year is plausible; read as yearly it
        // is 0.4 %).
        let r = result(9100.0, 45.0, 0.06);
        let hints = check(&r, Some(TimeUnit::Year), Some(15.0));
        assert_eq!(hints.len(), 1, "{hints:?}");
        let TimeUnitHint::CarryingRate { yearly_rate } = hints[0] else {
            panic!("{hints:?}")
        };
        assert!((yearly_rate - 0.004).abs() < 1e-12);
        // In one time unit the same numbers pass.
        let r = result(9100.0, 45.0, 0.06 * 52.0);
        assert!(check(&r, Some(TimeUnit::Year), Some(15.0)).is_empty());
    }

    #[test]
    fn cycles_outside_a_day_to_a_year_are_flagged() {
        // Q = sqrt(2 x 3 x 500 / 0.001) = 1732: 577 time units between
        // orders, over a year even if the unit were a day.
        let r = result(3.0, 500.0, 0.001);
        assert!(matches!(
            check(&r, None, None)[..],
            [TimeUnitHint::CycleOverAYear { cycle_days: None }]
        ));
        // Q = sqrt(2 x 50000 x 2 / 8) = 158.1: 0.00316 years, 1.15 days.
        let r = result(50000.0, 2.0, 8.0);
        assert!(check(&r, Some(TimeUnit::Year), None).is_empty());
        // The same numbers per week: 0.022 days between orders.
        let hints = check(&r, Some(TimeUnit::Week), None);
        let [TimeUnitHint::CycleUnderADay {
            cycle_days: Some(days),
        }] = hints[..]
        else {
            panic!("{hints:?}")
        };
        assert!((days - 7.0 * r.cycle).abs() < 1e-12);
    }
}
