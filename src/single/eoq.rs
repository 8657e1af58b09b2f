//! Economic order quantity for the `eoq` command: the classic lot, a finite
//! production rate (EPQ), planned backorders, both together, and all-units
//! quantity discounts.
//!
//! Every model here assumes demand at a constant rate forever and costs that
//! never change, which is exactly what the plans elsewhere in the crate do not
//! assume; the command exists because planners compare against it.
//!
//! Notation: `D` demand per time unit, `S` setup (order) cost, `H` holding cost
//! per unit per time unit, `P` production rate, `B` backorder cost per unit
//! backordered per time unit, `Q` the lot. All rates share the user's time
//! unit, whatever it is.
//!
//! # The models without price breaks
//!
//! - **classic**: `TC(Q) = D S / Q + H Q / 2`, so `Q* = sqrt(2 D S / H)` and
//!   `TC* = sqrt(2 D S H)`.
//! - **production-rate** (EPQ, `P > D`): while a lot is being made, stock
//!   builds at `P - D`, so it peaks at `Q (1 - D/P)`:
//!   `TC(Q) = D S / Q + H Q (1 - D/P) / 2` and
//!   `Q* = sqrt(2 D S / (H (1 - D/P)))`.
//! - **backorders**: with at most `b` units backordered, stock peaks at
//!   `Q - b`: `TC(Q, b) = D S / Q + H (Q - b)^2 / (2 Q) + B b^2 / (2 Q)`.
//!   For a given lot the best `b` is `Q H / (H + B)`, which leaves
//!   `Q* = sqrt(2 D S / H) sqrt((H + B) / B)`.
//! - **production-rate+backorders**: the stock curve is the same sawtooth,
//!   only its height is `Q (1 - D/P)` instead of `Q`. Writing `r = 1 - D/P`:
//!   `TC(Q, b) = D S / Q + H (r Q - b)^2 / (2 r Q) + B b^2 / (2 r Q)`, the best
//!   `b = r Q H / (H + B)` and `Q* = sqrt(2 D S (H + B) / (H B r))`.
//!
//! With the best backorder level put in, all four reduce to
//! `TC(Q) = D S / Q + H_e Q / 2` with `H_e = H r B / (H + B)` (dropping the
//! factors that do not apply). That is why one pair of functions below serves
//! all four, and why a lot `Q` costs `TC* (Q/Q* + Q*/Q) / 2` in each of them.
//!
//! # All-units price breaks
//!
//! A price applies to every unit of a lot once the lot reaches its break
//! quantity, up to (not including) the next break. Holding is `rate x price`
//! (or a constant `H`), and the cost includes purchase:
//! `TC_i(Q) = D S / Q + H_i Q / 2 + D p_i` on `[q_i, q_(i+1))`. Each piece is
//! convex, so the best lot of level `i` is its own EOQ raised to `q_i`; when
//! that EOQ reaches `q_(i+1)` the level is left out, because the next level is
//! no dearer at `q_(i+1)` (prices must not rise with quantity) and so beats
//! every lot this level allows. The cheapest remaining candidate wins.

use serde::Serialize;

use crate::error::{Error, Result};

/// One all-units price level: `price` is paid for every unit of a lot of at
/// least `quantity` units, up to the next break's quantity.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PriceBreak {
    pub quantity: f64,
    pub price: f64,
}

/// The raw inputs of the `eoq` command, checked by [`solve`].
#[derive(Debug, Clone, PartialEq, Default)]
pub struct EoqInput {
    /// Demand per time unit (for example per year).
    pub demand: f64,
    /// Cost of one order or setup.
    pub setup_cost: f64,
    /// Cost of holding one unit for one time unit.
    pub holding_cost: Option<f64>,
    /// Finite production rate in the same time unit; must exceed the demand.
    pub production_rate: Option<f64>,
    /// Cost of one unit backordered for one time unit (planned backorders).
    pub backorder_cost: Option<f64>,
    /// All-units quantity discounts, strictly increasing in quantity.
    pub price_breaks: Option<Vec<PriceBreak>>,
    /// Holding cost as a fraction of the unit price per time unit; used with
    /// price breaks instead of `holding_cost`.
    pub carrying_rate: Option<f64>,
    /// A lot the user has in mind, to compare with the optimum.
    pub lot: Option<f64>,
}

/// The optimal lot under the model the inputs select, with its costs.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct EoqResult {
    /// `classic`, `production-rate`, `backorders`,
    /// `production-rate+backorders` or `price-breaks`.
    pub model: &'static str,
    /// The optimal lot, unrounded.
    pub eoq: f64,
    /// Cost per time unit at the optimum: setup + holding + backorder +
    /// purchase (purchase only with price breaks).
    pub total_cost: f64,
    pub setup_cost_per_time: f64,
    pub holding_cost_per_time: f64,
    pub backorder_cost_per_time: f64,
    /// Zero unless price breaks are given.
    pub purchase_cost_per_time: f64,
    /// Orders per time unit, `D / Q`.
    pub orders: f64,
    /// Time between orders, `Q / D`.
    pub cycle: f64,
    pub max_inventory: f64,
    /// Zero unless backorders are planned.
    pub max_backorder: f64,
    /// Holding cost per unit per time unit at the optimum: the input, or
    /// `carrying_rate x unit_price` with price breaks.
    pub holding_cost: f64,
    /// The unit price paid at the optimum, with price breaks.
    pub unit_price: Option<f64>,
    /// With price breaks: the best lot of each price level that can win, in
    /// increasing quantity. Levels whose own EOQ reaches the next break are
    /// left out (see the module docs).
    pub candidates: Vec<PriceCandidate>,
    /// The comparison with `EoqInput::lot`, when one was given.
    pub chosen_lot: Option<LotComparison>,
}

/// The best lot within one price level.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PriceCandidate {
    pub price: f64,
    /// The level's break quantity (inclusive).
    pub from_quantity: f64,
    /// The next break's quantity (exclusive); `None` for the last level.
    pub to_quantity: Option<f64>,
    /// The EOQ at this price before it is raised to `from_quantity`.
    pub eoq_at_price: f64,
    /// The best lot of this level: `max(eoq_at_price, from_quantity)`.
    pub lot: f64,
    /// Cost per time unit of `lot`, purchase included.
    pub total_cost: f64,
}

/// What a given lot costs under the same model, against the optimum.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LotComparison {
    pub lot: f64,
    pub total_cost: f64,
    /// `total_cost` minus the optimum's total cost.
    pub extra_cost: f64,
    /// `extra_cost` as a percentage of the optimum's total cost.
    pub extra_percent: f64,
    /// The unit price that lot earns, with price breaks.
    pub unit_price: Option<f64>,
}

/// Candidates whose costs differ by less than this fraction count as tied;
/// the larger lot then wins, so the answer does not hinge on rounding.
const TIE: f64 = 1e-12;

/// Finds the optimal lot for the model the inputs select.
///
/// Every input is checked first; a bad one gives `Error::Usage` naming its
/// command-line option. Results too large or too small for floating point are
/// refused the same way rather than returned as infinities.
pub fn solve(input: &EoqInput) -> Result<EoqResult> {
    let demand = positive("--demand", input.demand)?;
    let setup_cost = positive("--setup-cost", input.setup_cost)?;
    let lot = input.lot.map(|lot| positive("--lot", lot)).transpose()?;
    let result = match &input.price_breaks {
        Some(breaks) => Priced::new(input, demand, setup_cost, breaks)?.solve(lot)?,
        None => Steady::new(input, demand, setup_cost)?.solve(lot),
    };
    finite(result)
}

/// Reads `QUANTITY:PRICE,QUANTITY:PRICE,...` (the `--price-breaks` syntax).
/// Only the syntax is checked here; [`solve`] checks the values.
pub fn parse_price_breaks(text: &str) -> Result<Vec<PriceBreak>> {
    if text.trim().is_empty() {
        return Err(Error::usage(
            "--price-breaks needs at least one QUANTITY:PRICE pair, for example 0:5,1000:4.8",
        ));
    }
    text.split(',')
        .map(|pair| {
            let pair = pair.trim();
            let (quantity, price) = pair.split_once(':').ok_or_else(|| {
                Error::usage(format!(
                    "--price-breaks: '{pair}' is not QUANTITY:PRICE (for example 1000:4.8)"
                ))
            })?;
            Ok(PriceBreak {
                quantity: number("quantity", quantity, pair)?,
                price: number("price", price, pair)?,
            })
        })
        .collect()
}

fn number(what: &str, text: &str, pair: &str) -> Result<f64> {
    text.trim().parse().map_err(|_| {
        Error::usage(format!(
            "--price-breaks: the {what} '{}' in '{pair}' is not a number",
            text.trim()
        ))
    })
}

fn positive(option: &str, value: f64) -> Result<f64> {
    if value.is_finite() && value > 0.0 {
        Ok(value)
    } else {
        Err(Error::usage(format!(
            "{option} must be a positive number, got {value}"
        )))
    }
}

/// Cost per time unit of one lot, by kind, and the stock extremes it gives.
#[derive(Debug, Clone, Copy)]
struct LotCost {
    setup: f64,
    holding: f64,
    backorder: f64,
    purchase: f64,
    max_inventory: f64,
    max_backorder: f64,
}

impl LotCost {
    fn total(&self) -> f64 {
        self.setup + self.holding + self.backorder + self.purchase
    }
}

/// The checked inputs of the four models without price breaks.
struct Steady {
    model: &'static str,
    demand: f64,
    setup_cost: f64,
    holding_cost: f64,
    /// `1 - D/P`, or 1 without a production rate.
    build_share: f64,
    backorder_cost: Option<f64>,
}

impl Steady {
    fn new(input: &EoqInput, demand: f64, setup_cost: f64) -> Result<Self> {
        if input.carrying_rate.is_some() {
            return Err(Error::usage(
                "--carrying-rate applies only with --price-breaks (holding = rate x price); \
                 give --holding-cost instead",
            ));
        }
        let holding_cost = input.holding_cost.ok_or_else(|| {
            Error::usage(
                "--holding-cost is required: the cost of holding one unit for one time unit",
            )
        })?;
        let holding_cost = positive("--holding-cost", holding_cost)?;
        let build_share = match input.production_rate {
            None => 1.0,
            Some(rate) => {
                let rate = positive("--production-rate", rate)?;
                if rate <= demand {
                    return Err(Error::usage(format!(
                        "--production-rate must exceed --demand, or stock never builds up; \
                         got {rate} against a demand of {demand}"
                    )));
                }
                // (P - D) / P rather than 1 - D/P: exact when P is barely
                // above D, where 1 - D/P would round to zero.
                (rate - demand) / rate
            }
        };
        let backorder_cost = input
            .backorder_cost
            .map(|cost| positive("--backorder-cost", cost))
            .transpose()?;
        let model = match (input.production_rate.is_some(), backorder_cost.is_some()) {
            (false, false) => "classic",
            (true, false) => "production-rate",
            (false, true) => "backorders",
            (true, true) => "production-rate+backorders",
        };
        Ok(Steady {
            model,
            demand,
            setup_cost,
            holding_cost,
            build_share,
            backorder_cost,
        })
    }

    /// `Q* = sqrt(2 D S / H_e)` with `H_e = H r B / (H + B)` (module docs).
    fn optimal_lot(&self) -> f64 {
        let mut effective = self.holding_cost * self.build_share;
        if let Some(backorder) = self.backorder_cost {
            effective *= backorder / (self.holding_cost + backorder);
        }
        (2.0 * self.demand * self.setup_cost / effective).sqrt()
    }

    /// The cost of `lot` with the best backorder level for it.
    fn cost(&self, lot: f64) -> LotCost {
        let holding = self.holding_cost;
        // Height of the stock sawtooth, from most backordered to most on hand.
        let peak = self.build_share * lot;
        let (max_inventory, max_backorder) = match self.backorder_cost {
            // The best split makes the marginal holding and backorder costs
            // equal: b = peak H / (H + B).
            Some(backorder) => {
                let sum = holding + backorder;
                (peak * (backorder / sum), peak * (holding / sum))
            }
            None => (peak, 0.0),
        };
        // Average stock over a cycle is max_inventory^2 / (2 peak), average
        // backorder max_backorder^2 / (2 peak): similar triangles. Divided
        // before multiplying, so a large lot does not overflow needlessly.
        LotCost {
            setup: self.demand * self.setup_cost / lot,
            holding: holding * max_inventory * (max_inventory / peak) / 2.0,
            backorder: self.backorder_cost.unwrap_or(0.0) * max_backorder * (max_backorder / peak)
                / 2.0,
            purchase: 0.0,
            max_inventory,
            max_backorder,
        }
    }

    fn solve(&self, lot: Option<f64>) -> EoqResult {
        let eoq = self.optimal_lot();
        let cost = self.cost(eoq);
        let chosen_lot = lot.map(|lot| compare(lot, self.cost(lot).total(), cost.total(), None));
        assemble(self.model, eoq, self.demand, cost, self.holding_cost, None)
            .with(Vec::new(), chosen_lot)
    }
}

/// How holding cost follows the price with price breaks.
#[derive(Debug, Clone, Copy)]
enum PriceHolding {
    Constant(f64),
    Rate(f64),
}

/// The checked inputs of the all-units price-break model.
struct Priced<'a> {
    demand: f64,
    setup_cost: f64,
    holding: PriceHolding,
    breaks: &'a [PriceBreak],
}

impl<'a> Priced<'a> {
    fn new(
        input: &EoqInput,
        demand: f64,
        setup_cost: f64,
        breaks: &'a [PriceBreak],
    ) -> Result<Self> {
        for (given, option) in [
            (input.production_rate.is_some(), "--production-rate"),
            (input.backorder_cost.is_some(), "--backorder-cost"),
        ] {
            if given {
                return Err(Error::usage(format!(
                    "--price-breaks cannot be combined with {option}: that combination is not supported"
                )));
            }
        }
        let holding = match (input.holding_cost, input.carrying_rate) {
            (Some(_), Some(_)) => {
                return Err(Error::usage(
                    "give --carrying-rate or --holding-cost with --price-breaks, not both",
                ))
            }
            (None, None) => {
                return Err(Error::usage(
                    "--price-breaks needs --carrying-rate (holding = rate x price) \
                     or a constant --holding-cost",
                ))
            }
            (Some(cost), None) => PriceHolding::Constant(positive("--holding-cost", cost)?),
            (None, Some(rate)) => PriceHolding::Rate(positive("--carrying-rate", rate)?),
        };
        check_breaks(breaks)?;
        Ok(Priced {
            demand,
            setup_cost,
            holding,
            breaks,
        })
    }

    fn holding_at(&self, price: f64) -> f64 {
        match self.holding {
            PriceHolding::Constant(cost) => cost,
            PriceHolding::Rate(rate) => rate * price,
        }
    }

    fn cost(&self, lot: f64, price: f64) -> LotCost {
        LotCost {
            setup: self.demand * self.setup_cost / lot,
            holding: self.holding_at(price) * lot / 2.0,
            backorder: 0.0,
            purchase: self.demand * price,
            max_inventory: lot,
            max_backorder: 0.0,
        }
    }

    /// The best lot of every level that can win, in increasing quantity.
    fn candidates(&self) -> Vec<PriceCandidate> {
        let mut candidates = Vec::with_capacity(self.breaks.len());
        for (index, level) in self.breaks.iter().enumerate() {
            let to_quantity = self.breaks.get(index + 1).map(|next| next.quantity);
            let holding = self.holding_at(level.price);
            let eoq_at_price = (2.0 * self.demand * self.setup_cost / holding).sqrt();
            if to_quantity.is_some_and(|to| eoq_at_price >= to) {
                continue;
            }
            let lot = eoq_at_price.max(level.quantity);
            candidates.push(PriceCandidate {
                price: level.price,
                from_quantity: level.quantity,
                to_quantity,
                eoq_at_price,
                lot,
                total_cost: self.cost(lot, level.price).total(),
            });
        }
        candidates
    }

    fn solve(&self, lot: Option<f64>) -> Result<EoqResult> {
        let candidates = self.candidates();
        // The last level has no upper end, so at least one candidate exists.
        let best = candidates
            .iter()
            .reduce(|best, next| {
                if next.total_cost - best.total_cost <= TIE * best.total_cost {
                    next
                } else {
                    best
                }
            })
            .cloned()
            .ok_or_else(|| Error::Internal("no price level gave a candidate lot".into()))?;
        let cost = self.cost(best.lot, best.price);
        let chosen_lot = lot
            .map(|lot| {
                let level = self.level_of(lot)?;
                let total = self.cost(lot, level.price).total();
                Ok(compare(lot, total, cost.total(), Some(level.price)))
            })
            .transpose()?;
        let holding = self.holding_at(best.price);
        Ok(assemble(
            "price-breaks",
            best.lot,
            self.demand,
            cost,
            holding,
            Some(best.price),
        )
        .with(candidates, chosen_lot))
    }

    /// The price level a lot falls in: the last break at or below it.
    fn level_of(&self, lot: f64) -> Result<&PriceBreak> {
        self.breaks
            .iter()
            .rev()
            .find(|level| level.quantity <= lot)
            .ok_or_else(|| {
                let first = self.breaks.first().map_or(0.0, |level| level.quantity);
                Error::usage(format!(
                    "--lot {lot} is below the first price break ({first}): no price applies to it"
                ))
            })
    }
}

fn check_breaks(breaks: &[PriceBreak]) -> Result<()> {
    if breaks.is_empty() {
        return Err(Error::usage(
            "--price-breaks needs at least one QUANTITY:PRICE pair, for example 0:5,1000:4.8",
        ));
    }
    for (index, level) in breaks.iter().enumerate() {
        let number = index + 1;
        if !(level.quantity.is_finite() && level.quantity >= 0.0) {
            return Err(Error::usage(format!(
                "--price-breaks: the quantity of break {number} must be zero or a positive number, got {}",
                level.quantity
            )));
        }
        if !(level.price.is_finite() && level.price > 0.0) {
            return Err(Error::usage(format!(
                "--price-breaks: the price of break {number} must be a positive number, got {}",
                level.price
            )));
        }
        if let Some(previous) = index.checked_sub(1).and_then(|at| breaks.get(at)) {
            if level.quantity <= previous.quantity {
                return Err(Error::usage(format!(
                    "--price-breaks: quantities must be strictly increasing, \
                     but break {number} ({}) does not exceed break {index} ({})",
                    level.quantity, previous.quantity
                )));
            }
            // A dearer price for a larger lot would leave some levels with no
            // best lot (their cost only falls toward an excluded end point).
            if level.price > previous.price {
                return Err(Error::usage(format!(
                    "--price-breaks: prices must not rise with quantity, \
                     but break {number} ({}:{}) costs more than break {index} ({}:{})",
                    level.quantity, level.price, previous.quantity, previous.price
                )));
            }
        }
    }
    Ok(())
}

fn compare(lot: f64, total_cost: f64, optimum: f64, unit_price: Option<f64>) -> LotComparison {
    let extra_cost = total_cost - optimum;
    LotComparison {
        lot,
        total_cost,
        extra_cost,
        extra_percent: 100.0 * extra_cost / optimum,
        unit_price,
    }
}

fn assemble(
    model: &'static str,
    eoq: f64,
    demand: f64,
    cost: LotCost,
    holding_cost: f64,
    unit_price: Option<f64>,
) -> EoqResult {
    EoqResult {
        model,
        eoq,
        total_cost: cost.total(),
        setup_cost_per_time: cost.setup,
        holding_cost_per_time: cost.holding,
        backorder_cost_per_time: cost.backorder,
        purchase_cost_per_time: cost.purchase,
        orders: demand / eoq,
        cycle: eoq / demand,
        max_inventory: cost.max_inventory,
        max_backorder: cost.max_backorder,
        holding_cost,
        unit_price,
        candidates: Vec::new(),
        chosen_lot: None,
    }
}

impl EoqResult {
    fn with(self, candidates: Vec<PriceCandidate>, chosen_lot: Option<LotComparison>) -> Self {
        EoqResult {
            candidates,
            chosen_lot,
            ..self
        }
    }
}

/// Refuses a result that floating point could not carry: inputs of wildly
/// different sizes can overflow to infinity or underflow the lot to zero.
fn finite(result: EoqResult) -> Result<EoqResult> {
    let mut numbers = vec![
        result.eoq,
        result.total_cost,
        result.setup_cost_per_time,
        result.holding_cost_per_time,
        result.backorder_cost_per_time,
        result.purchase_cost_per_time,
        result.orders,
        result.cycle,
        result.max_inventory,
        result.max_backorder,
        result.holding_cost,
    ];
    for candidate in &result.candidates {
        numbers.extend([candidate.eoq_at_price, candidate.lot, candidate.total_cost]);
    }
    if let Some(chosen) = &result.chosen_lot {
        numbers.extend([chosen.total_cost, chosen.extra_cost, chosen.extra_percent]);
    }
    if result.eoq > 0.0 && numbers.iter().all(|number| number.is_finite()) {
        Ok(result)
    } else {
        Err(Error::usage(format!(
            "the inputs are too far apart in size to compute in floating point \
             (the lot came out as {}); express them in other units",
            result.eoq
        )))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;
    use proptest::prelude::*;

    fn classic(demand: f64, setup_cost: f64, holding_cost: f64) -> EoqInput {
        EoqInput {
            demand,
            setup_cost,
            holding_cost: Some(holding_cost),
            ..EoqInput::default()
        }
    }

    fn breaks(pairs: &[(f64, f64)]) -> Option<Vec<PriceBreak>> {
        Some(
            pairs
                .iter()
                .map(|&(quantity, price)| PriceBreak { quantity, price })
                .collect(),
        )
    }

    fn usage_message(input: &EoqInput) -> String {
        match solve(input) {
            Err(Error::Usage(message)) => message,
            other => panic!("expected a usage error, got {other:?}"),
        }
    }

    #[test]
    fn every_bad_number_is_refused_with_its_option_named() {
        let good = classic(100.0, 10.0, 2.0);
        // Each case sets one option to the bad value.
        type Setter = fn(&mut EoqInput, f64);
        let cases: [(&str, Setter); 6] = [
            ("--demand", |input, value| input.demand = value),
            ("--setup-cost", |input, value| input.setup_cost = value),
            ("--holding-cost", |input, value| {
                input.holding_cost = Some(value)
            }),
            ("--production-rate", |input, value| {
                input.production_rate = Some(value)
            }),
            ("--backorder-cost", |input, value| {
                input.backorder_cost = Some(value)
            }),
            ("--lot", |input, value| input.lot = Some(value)),
        ];
        for (option, set) in &cases {
            for bad in [-5.0, 0.0, f64::NAN, f64::INFINITY, f64::NEG_INFINITY] {
                let mut input = good.clone();
                set(&mut input, bad);
                let message = usage_message(&input);
                assert!(message.starts_with(option), "{option} {bad}: {message}");
                assert!(message.contains("must"), "{message}");
            }
        }
        let mut input = good;
        input.holding_cost = Some(-5.0);
        assert_eq!(
            usage_message(&input),
            "--holding-cost must be a positive number, got -5"
        );
    }

    #[test]
    fn missing_or_misplaced_holding_inputs_are_refused() {
        let mut input = classic(100.0, 10.0, 2.0);
        input.holding_cost = None;
        assert!(usage_message(&input).contains("--holding-cost is required"));
        input.carrying_rate = Some(0.2);
        assert!(usage_message(&input).contains("--carrying-rate applies only with --price-breaks"));
    }

    #[test]
    fn production_rate_must_exceed_demand() {
        let mut input = classic(100.0, 10.0, 2.0);
        for rate in [50.0, 100.0] {
            input.production_rate = Some(rate);
            assert!(usage_message(&input).contains("--production-rate must exceed --demand"));
        }
        // Barely above demand is allowed: the lot is huge but finite.
        input.production_rate = Some(100.0 * (1.0 + 4.0 * f64::EPSILON));
        let result = solve(&input).unwrap();
        assert!(result.eoq.is_finite() && result.eoq > 1e8);
    }

    #[test]
    fn price_breaks_refuse_unsupported_combinations() {
        let mut input = EoqInput {
            carrying_rate: Some(0.2),
            holding_cost: None,
            price_breaks: breaks(&[(0.0, 5.0)]),
            ..classic(100.0, 10.0, 1.0)
        };
        input.production_rate = Some(500.0);
        assert!(usage_message(&input).contains("cannot be combined with --production-rate"));
        input.production_rate = None;
        input.backorder_cost = Some(3.0);
        assert!(usage_message(&input).contains("cannot be combined with --backorder-cost"));
        input.backorder_cost = None;
        input.holding_cost = Some(1.0);
        assert!(usage_message(&input).contains("not both"));
        input.holding_cost = None;
        input.carrying_rate = None;
        assert!(usage_message(&input).contains("needs --carrying-rate"));
    }

    #[test]
    fn bad_price_break_lists_are_refused() {
        let input = |pairs: &[(f64, f64)]| EoqInput {
            holding_cost: None,
            carrying_rate: Some(0.2),
            price_breaks: breaks(pairs),
            ..classic(100.0, 10.0, 1.0)
        };
        let cases: [(&[(f64, f64)], &str); 6] = [
            (&[], "at least one"),
            (&[(-1.0, 5.0)], "quantity of break 1"),
            (&[(0.0, 5.0), (f64::NAN, 4.0)], "quantity of break 2"),
            (&[(0.0, 0.0)], "price of break 1"),
            (
                &[(0.0, 5.0), (100.0, 4.0), (100.0, 3.0)],
                "strictly increasing",
            ),
            (&[(0.0, 5.0), (100.0, 5.5)], "must not rise"),
        ];
        for (pairs, expected) in cases {
            let message = usage_message(&input(pairs));
            assert!(message.contains(expected), "{pairs:?}: {message}");
        }
    }

    #[test]
    fn a_first_break_above_zero_raises_the_lot_and_bounds_the_chosen_lot() {
        // EOQ at price 5 with rate 0.2 is sqrt(2 * 100 * 10 / 1) = 44.7.
        let mut input = EoqInput {
            holding_cost: None,
            carrying_rate: Some(0.2),
            price_breaks: breaks(&[(60.0, 5.0)]),
            ..classic(100.0, 10.0, 1.0)
        };
        let result = solve(&input).unwrap();
        assert_eq!(result.eoq, 60.0);
        assert_relative_eq!(result.candidates[0].eoq_at_price, 2000f64.sqrt());
        input.lot = Some(59.0);
        assert!(usage_message(&input).contains("below the first price break (60)"));
        input.lot = Some(60.0);
        let chosen = solve(&input).unwrap().chosen_lot.unwrap();
        assert_eq!(chosen.extra_cost, 0.0);
        assert_eq!(chosen.unit_price, Some(5.0));
    }

    #[test]
    fn an_exact_tie_between_price_levels_goes_to_the_larger_lot() {
        // Constant H = 1: Q* = 100 costs 100 + 100 x 10 = 1100; the lot 400
        // at 8.875 costs 12.5 + 200 + 887.5 = 1100 too. All exact in binary.
        let input = EoqInput {
            price_breaks: breaks(&[(0.0, 10.0), (400.0, 8.875)]),
            ..classic(100.0, 50.0, 1.0)
        };
        let result = solve(&input).unwrap();
        assert_eq!(result.candidates.len(), 2);
        assert_eq!(
            result.candidates[0].total_cost,
            result.candidates[1].total_cost
        );
        assert_eq!(result.eoq, 400.0);
        assert_eq!(result.unit_price, Some(8.875));
    }

    #[test]
    fn a_level_whose_eoq_reaches_the_next_break_is_left_out() {
        // EOQ is 200 at any price with constant holding: level [0, 100) loses.
        let input = EoqInput {
            price_breaks: breaks(&[(0.0, 5.0), (100.0, 5.0), (1000.0, 4.0)]),
            ..classic(100.0, 100.0, 0.5)
        };
        let result = solve(&input).unwrap();
        let froms: Vec<f64> = result.candidates.iter().map(|c| c.from_quantity).collect();
        assert_eq!(froms, [100.0, 1000.0]);
        assert_eq!(result.candidates[0].to_quantity, Some(1000.0));
        assert_eq!(result.candidates[1].to_quantity, None);
    }

    #[test]
    fn results_that_overflow_are_refused() {
        for input in [
            classic(1e300, 1e300, 1e-300),
            classic(1e-300, 1e-300, 1e300),
        ] {
            assert!(usage_message(&input).contains("too far apart in size"));
        }
    }

    #[test]
    fn price_break_text_is_read() {
        let read = parse_price_breaks(" 0:5, 1000:4.8 ,2000:4.75").unwrap();
        assert_eq!(
            read,
            breaks(&[(0.0, 5.0), (1000.0, 4.8), (2000.0, 4.75)]).unwrap()
        );
        for (bad, expected) in [
            ("", "at least one"),
            ("0:5,", "'' is not QUANTITY:PRICE"),
            ("1000", "'1000' is not QUANTITY:PRICE"),
            ("x:5", "the quantity 'x'"),
            ("0:five", "the price 'five'"),
        ] {
            match parse_price_breaks(bad) {
                Err(Error::Usage(message)) => assert!(message.contains(expected), "{message}"),
                other => panic!("{bad:?} gave {other:?}"),
            }
        }
    }

    #[test]
    fn json_carries_the_contract_keys() {
        let result = solve(&classic(1000.0, 10.0, 0.5)).unwrap();
        let json = serde_json::to_value(&result).unwrap();
        for key in ["eoq", "total_cost", "orders", "cycle"] {
            assert!(json[key].is_number(), "{key} missing in {json}");
        }
        assert_eq!(json["model"], "classic");
    }

    fn any_number() -> impl Strategy<Value = f64> {
        prop_oneof![
            any::<f64>(),
            Just(0.0),
            Just(f64::NAN),
            Just(f64::INFINITY),
            -1e3..1e3f64,
        ]
    }

    proptest! {
        /// Whatever the numbers, the answer is an error or a finite result.
        #[test]
        fn no_input_panics_or_yields_non_finite_numbers(
            demand in any_number(),
            setup_cost in any_number(),
            holding in proptest::option::of(any_number()),
            production in proptest::option::of(any_number()),
            backorder in proptest::option::of(any_number()),
            rate in proptest::option::of(any_number()),
            pairs in proptest::option::of(proptest::collection::vec((any_number(), any_number()), 0..4)),
            lot in proptest::option::of(any_number()),
        ) {
            let input = EoqInput {
                demand,
                setup_cost,
                holding_cost: holding,
                production_rate: production,
                backorder_cost: backorder,
                price_breaks: pairs.map(|pairs| {
                    pairs.into_iter().map(|(quantity, price)| PriceBreak { quantity, price }).collect()
                }),
                carrying_rate: rate,
                lot,
            };
            if let Ok(result) = solve(&input) {
                prop_assert!(result.eoq > 0.0 && result.eoq.is_finite());
                prop_assert!(result.total_cost.is_finite());
                prop_assert!(result.orders.is_finite() && result.cycle.is_finite());
            }
        }
    }
}
