mod common;
use common::*;
use lotwright::eval::evaluate;
use lotwright::single::exact;
#[test]
fn dbg() {
    let mut it = item(&[10.0, 0.0, 50.0], 100.0, 1.0);
    it.backlog_cost = Some(1.5);
    let p = exact::solve(&it).unwrap();
    println!("{:?}", p);
    let e = evaluate(&scenario(vec![it.clone()]), &single_plan(&p.receipts));
    println!(
        "{:?} {:?} {:?} {}",
        e.violations, e.shortages, e.costs, e.feasible
    );
}
