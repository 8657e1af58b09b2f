//! Safety stock from forecast error, for a target cycle service level.
//!
//! The textbook method for a periodic review every bucket (Silver, Pyke &
//! Thomas, Inventory and Production Management in Supply Chains, 4th ed.,
//! 2017, chapter 6 for the cycle service level and its safety factor k, and
//! the periodic-review chapter for the protection interval; chapter and
//! formula cited from memory): the stock must protect against forecast
//! error over the lead time plus the review period, L + R buckets. With
//! one-bucket-ahead forecast errors of standard deviation sigma, and errors
//! independent from bucket to bucket,
//!
//!   sigma over L + R = sigma x sqrt(L + R),
//!   safety stock     = k x sigma x sqrt(L + R),
//!
//! where k is the standard normal quantile of the cycle service level (the
//! chance of no stockout in a replenishment cycle): k = 1.645 for 95 %.
//! Plans here are redone every bucket, so R = 1.

/// The review period of a plan redone every bucket, in buckets.
pub const REVIEW: usize = 1;

/// The standard normal distribution function, by Simpson's rule on the
/// density from 0 to |x| (4,000 panels: error below 1e-12 for |x| <= 8).
pub fn normal_cdf(x: f64) -> f64 {
    if !x.is_finite() {
        return if x > 0.0 { 1.0 } else { 0.0 };
    }
    let a = x.abs().min(10.0);
    let n = 4000;
    let h = a / n as f64;
    let density = |z: f64| (-0.5 * z * z).exp() / (2.0 * std::f64::consts::PI).sqrt();
    let mut sum = density(0.0) + density(a);
    for k in 1..n {
        let weight = if k % 2 == 1 { 4.0 } else { 2.0 };
        sum += weight * density(k as f64 * h);
    }
    let half = sum * h / 3.0;
    if x >= 0.0 {
        0.5 + half
    } else {
        0.5 - half
    }
}

/// The standard normal quantile of `p` (0 < p < 1), by bisection on
/// `normal_cdf`.
pub fn normal_quantile(p: f64) -> f64 {
    let (mut low, mut high) = (-10.0, 10.0);
    for _ in 0..100 {
        let mid = 0.5 * (low + high);
        if normal_cdf(mid) < p {
            low = mid;
        } else {
            high = mid;
        }
    }
    0.5 * (low + high)
}

/// Safety stock for a cycle service level `level` (0.5 <= level < 1), a
/// one-bucket-ahead forecast error of standard deviation `sigma`, and a
/// lead time of `lead_time` buckets: k x sigma x sqrt(L + R).
pub fn safety_stock(level: f64, sigma: f64, lead_time: usize) -> f64 {
    let k = normal_quantile(level).max(0.0);
    k * sigma * ((lead_time + REVIEW) as f64).sqrt()
}

/// The standard deviation of forecast errors (actual less forecast), with
/// n - 1 in the denominator; `None` for fewer than two errors.
pub fn error_sd(errors: &[f64]) -> Option<f64> {
    let n = errors.len();
    if n < 2 {
        return None;
    }
    let mean = errors.iter().sum::<f64>() / n as f64;
    let ss: f64 = errors.iter().map(|e| (e - mean) * (e - mean)).sum();
    Some((ss / (n - 1) as f64).sqrt())
}

/// Sets the safety stock of every item of `scenario` that gives a
/// forecast error to k x error x sqrt(lead time + 1) for the cycle service
/// level `level`, rounded to a whole unit, where that is above its own.
pub fn apply(scenario: &mut super::Scenario, level: f64) {
    for item in &mut scenario.items {
        if let Some(sigma) = item.forecast_error {
            let stock = safety_stock(level, sigma, item.lead_time).round();
            item.safety_stock = item.safety_stock.max(stock);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Standard normal table values (any statistics table; common
    /// practice): Phi(1.645) = 0.95002, Phi(1.96) = 0.97500, and the
    /// quantiles of 0.95, 0.975 and 0.99: 1.644854, 1.959964, 2.326348.
    #[test]
    fn the_normal_distribution_matches_the_table() {
        assert!((normal_cdf(0.0) - 0.5).abs() < 1e-12);
        assert!((normal_cdf(1.645) - 0.950015).abs() < 1e-6);
        assert!((normal_cdf(-1.96) - 0.024998).abs() < 1e-6);
        assert!((normal_quantile(0.95) - 1.644854).abs() < 1e-6);
        assert!((normal_quantile(0.975) - 1.959964).abs() < 1e-6);
        assert!((normal_quantile(0.99) - 2.326348).abs() < 1e-6);
        assert!(normal_quantile(0.5).abs() < 1e-9);
    }

    /// Worked by hand: sigma 20 a week, lead time 3 weeks, reviewed
    /// weekly: sigma over 4 weeks = 20 x 2 = 40; at 95 % k = 1.644854, so
    /// the safety stock is 65.79 units. At 50 % it is 0.
    #[test]
    fn safety_stock_of_a_worked_case() {
        assert!((safety_stock(0.95, 20.0, 3) - 65.794).abs() < 1e-3);
        assert!(safety_stock(0.5, 20.0, 3).abs() < 1e-9);
    }

    /// Errors 4, -2, 0, 6, -8: mean 0, squares 16 + 4 + 0 + 36 + 64 = 120,
    /// over 4: 30, sd 5.477.
    #[test]
    fn the_error_standard_deviation() {
        let sd = error_sd(&[4.0, -2.0, 0.0, 6.0, -8.0]).unwrap();
        assert!((sd - 30f64.sqrt()).abs() < 1e-12);
        assert_eq!(error_sd(&[3.0]), None);
    }
}
