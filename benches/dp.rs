//! Benchmarks of the single-item programs: the O(T^2) reference
//! (`single::exact`) and the O(T log T) one (`single::fast`) on one item with
//! seasonal weekly demand, time-varying costs, safety stock and a lead time,
//! from a fixed seed. Run with `cargo bench --bench dp`; docs/performance.md
//! holds the measured table.

use std::hint::black_box;
use std::time::Duration;

use criterion::{criterion_group, criterion_main, BenchmarkId, Criterion};
use lotwright::model::Item;
use lotwright::single::{exact, fast};

/// A small fixed-seed generator (splitmix64), so the data are the same on
/// every run and no extra dependency is needed.
struct Seeded(u64);

impl Seeded {
    /// A number in [0, 1).
    fn next(&mut self) -> f64 {
        self.0 = self.0.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        z ^= z >> 31;
        (z >> 11) as f64 / (1u64 << 53) as f64
    }
}

/// One item over `periods` weekly buckets: demand around 100 with a yearly
/// season of +-50 % and noise, one bucket in ten without demand; setup, unit
/// and holding costs that vary by bucket; safety stock 20, lead time 1 and
/// initial stock that covers the first bucket.
fn seasonal_item(periods: usize) -> Item {
    let mut random = Seeded(20_250_605);
    let mut demand = Vec::with_capacity(periods);
    let (mut setup_cost, mut unit_cost, mut holding_cost) = (vec![], vec![], vec![]);
    for t in 0..periods {
        let season = 1.0 + 0.5 * (t as f64 * std::f64::consts::TAU / 52.0).sin();
        let quantity = if random.next() < 0.1 {
            0.0
        } else {
            (100.0 * season * (0.6 + 0.8 * random.next())).round()
        };
        demand.push(quantity);
        setup_cost.push((300.0 + 400.0 * random.next()).round());
        unit_cost.push(10.0 + (random.next() * 20.0).round() / 10.0);
        holding_cost.push(0.2 + (random.next() * 4.0).round() / 10.0);
    }
    Item {
        id: "bench".into(),
        unit: "units".into(),
        nominal_setup_cost: setup_cost[0],
        nominal_holding_cost: holding_cost[0],
        setup_cost,
        holding_cost,
        unit_cost,
        initial_stock: 200.0,
        safety_stock: 20.0,
        lead_time: 1,
        min_lot: 0.0,
        lot_multiple: None,
        max_lot: None,
        backlog_cost: None,
        fixed_lot: None,
        ending_stock: 0.0,
        forecast_error: None,
        receipts: vec![0.0; periods],
        firm: vec![0.0; periods],
        quantity_change: None,
        demand,
    }
}

fn single_item(c: &mut Criterion) {
    let mut group = c.benchmark_group("single_item");
    group
        .sample_size(20)
        .warm_up_time(Duration::from_secs(1))
        .measurement_time(Duration::from_secs(5));
    for periods in [52, 520, 5_200] {
        let item = seasonal_item(periods);
        // Not timed: both programs must agree before they are compared.
        let reference = exact::solve(&item).expect("the bench item is feasible");
        let quick = fast::solve(&item).expect("the bench item is feasible");
        assert!(
            (reference.cost - quick.cost).abs() <= 1e-9 * reference.cost.abs().max(1.0),
            "exact {} and fast {} differ at T = {periods}",
            reference.cost,
            quick.cost
        );
        group.bench_with_input(BenchmarkId::new("exact", periods), &item, |b, item| {
            b.iter(|| exact::solve(black_box(item)))
        });
    }
    for periods in [52, 520, 5_200, 52_000] {
        let item = seasonal_item(periods);
        group.bench_with_input(BenchmarkId::new("fast", periods), &item, |b, item| {
            b.iter(|| fast::solve(black_box(item)))
        });
    }
    group.finish();
}

criterion_group!(benches, single_item);
criterion_main!(benches);
