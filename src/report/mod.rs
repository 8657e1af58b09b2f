//! Renderers: pure functions from results to text or bytes. They format;
//! they never compute costs or feasibility (that is `eval`'s job).

pub mod actions;
mod charts;
pub mod csv;
pub mod eoq;
pub mod figures;
pub mod html;
pub mod json;
pub mod notes;
pub mod reasons;
mod svg;
pub mod table;
pub mod xlsx;

/// A count with its noun, singular for one: "1 setup", "3 setups",
/// "0 items". The one place outputs make a plural.
pub fn count(n: usize, noun: &str) -> String {
    if n == 1 {
        format!("1 {noun}")
    } else {
        format!("{n} {noun}s")
    }
}

/// A quantity as a planner reads it: whole numbers without decimals, others
/// with up to three.
pub fn quantity(value: f64) -> String {
    // Solver noise (a millionth of a unit) is not a quantity anyone ordered.
    let rounded = value.round();
    if (value - rounded).abs() < 1e-6 {
        format!("{:.0}", rounded + 0.0)
    } else {
        let text = format!("{value:.3}");
        let text = text.trim_end_matches('0').trim_end_matches('.');
        if text == "-0" {
            "0".to_string()
        } else {
            text.to_string()
        }
    }
}

/// Money with two decimals and thousands separators.
pub fn money(value: f64) -> String {
    let value = if value.abs() < 0.005 { 0.0 } else { value };
    let text = format!("{:.2}", value.abs());
    let (whole, cents) = text.split_once('.').unwrap_or((&text, "00"));
    let mut grouped = String::new();
    for (i, digit) in whole.chars().enumerate() {
        if i > 0 && (whole.len() - i) % 3 == 0 {
            grouped.push(',');
        }
        grouped.push(digit);
    }
    let sign = if value < 0.0 { "-" } else { "" };
    format!("{sign}{grouped}.{cents}")
}

/// A value rounded for machine output: 9 significant decimals, so that the
/// JSON is stable across platforms and free of float noise.
pub fn clean(value: f64) -> f64 {
    if !value.is_finite() {
        return value;
    }
    let rounded = (value * 1e9).round() / 1e9;
    if rounded == 0.0 {
        0.0
    } else {
        rounded
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn money_groups_thousands() {
        assert_eq!(money(1234567.891), "1,234,567.89");
        assert_eq!(money(-12.5), "-12.50");
        assert_eq!(money(0.001), "0.00");
        assert_eq!(money(999.999), "1,000.00");
    }

    #[test]
    fn quantities_drop_needless_decimals() {
        assert_eq!(quantity(1200.0), "1200");
        assert_eq!(quantity(12.5), "12.5");
        assert_eq!(quantity(1.0 / 3.0), "0.333");
        assert_eq!(quantity(-0.0), "0");
    }
}
