//! Terminal output of the `eoq` command.

use std::fmt::Write;

use super::money;
use crate::single::eoq::EoqResult;

fn number(value: f64) -> String {
    if value.abs() >= 100.0 {
        format!("{value:.1}")
    } else {
        format!("{value:.4}")
    }
}

/// The EOQ result in words and figures.
pub fn text(result: &EoqResult) -> String {
    let mut out = String::new();
    let model = match result.model {
        "classic" => "classic EOQ",
        "production-rate" => "finite production rate (EPQ)",
        "backorders" => "EOQ with planned backorders",
        "production-rate+backorders" => "finite production rate with planned backorders",
        "price-breaks" => "EOQ with all-units quantity discounts",
        other => other,
    };
    let _ = writeln!(out, "Model: {model}");
    let _ = writeln!(out, "Economic lot:         {}", number(result.eoq));
    let _ = writeln!(out, "Orders per time unit: {}", number(result.orders));
    let _ = writeln!(
        out,
        "Time between orders:  {} time units",
        number(result.cycle)
    );
    let _ = writeln!(
        out,
        "Maximum stock:        {}",
        number(result.max_inventory)
    );
    if result.max_backorder > 0.0 {
        let _ = writeln!(
            out,
            "Maximum backorder:    {}",
            number(result.max_backorder)
        );
    }
    if let Some(price) = result.unit_price {
        let _ = writeln!(out, "Unit price paid:      {}", money(price));
    }
    let _ = writeln!(out, "\nCost per time unit at the economic lot");
    let _ = writeln!(
        out,
        "  setup/order   {:>14}",
        money(result.setup_cost_per_time)
    );
    let _ = writeln!(
        out,
        "  holding       {:>14}",
        money(result.holding_cost_per_time)
    );
    if result.backorder_cost_per_time > 0.0 {
        let _ = writeln!(
            out,
            "  backorder     {:>14}",
            money(result.backorder_cost_per_time)
        );
    }
    if result.purchase_cost_per_time > 0.0 {
        let _ = writeln!(
            out,
            "  purchase      {:>14}",
            money(result.purchase_cost_per_time)
        );
    }
    let _ = writeln!(out, "  total         {:>14}", money(result.total_cost));
    if !result.candidates.is_empty() {
        let _ = writeln!(out, "\nPrice levels");
        let _ = writeln!(
            out,
            "  {:>12}  {:>12}  {:>12}  {:>14}",
            "from qty", "price", "best lot", "total cost"
        );
        for c in &result.candidates {
            let _ = writeln!(
                out,
                "  {:>12}  {:>12}  {:>12}  {:>14}",
                number(c.from_quantity),
                money(c.price),
                number(c.lot),
                money(c.total_cost)
            );
        }
    }
    if let Some(chosen) = &result.chosen_lot {
        let _ = writeln!(
            out,
            "\nA lot of {} costs {} per time unit: {} ({:.2} %) more than the economic lot.",
            super::quantity(chosen.lot),
            money(chosen.total_cost),
            money(chosen.extra_cost),
            chosen.extra_percent
        );
    }
    out
}
