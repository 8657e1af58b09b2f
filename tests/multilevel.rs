//! Plans over a bill of material, checked against the outside world:
//!
//! - a textbook MRP problem with a shared component on two levels, read from
//!   bom.csv and planned lot-for-lot level by level;
//! - an independent explosion written here (gross-to-net, lot-for-lot,
//!   lead-time offset), against the tool's level-by-level plan on seeded
//!   random bills;
//! - brute force over every whole plan of tiny bills, against the joint
//!   MILP; and the joint plan never dearer than any level-by-level plan.

mod common;

use lotwright::eval::evaluate;
use lotwright::model::{BomLine, Item, Plan, QuantityChange, Resource, Routing, Scenario};
use lotwright::single::rules::Rule;
use lotwright::solve::{self, Status};

/// The textbook problem: A needs 1 B, 2 C and 1 D; C needs 2 D and 3 E, so
/// D is used on two levels. Demand for A: 30 in period 2, 30 in period 5,
/// 40 in period 8.
///
/// Source: an end-of-chapter problem of the MRP chapter attributed to
/// F. R. Jacobs and R. B. Chase, "Operations and Supply Chain Management"
/// (McGraw-Hill), as reproduced on several homework pages; edition and
/// problem number not verified, and the book's printed answer was not seen.
/// The releases below are a hand computation (kept in the comments), which
/// agrees with a third party's worked answer to the same problem.
#[test]
fn a_textbook_mrp_problem_is_exploded_as_worked_by_hand() {
    let dir = common::scenario_dir(&[
        ("scenario.toml", &common::weekly_toml(8)),
        (
            "items.csv",
            "item,setup_cost,holding_cost,initial_stock,lead_time,min_lot,lot_multiple\n\
             A,50,1,20,1,,\n\
             B,50,1,0,1,,\n\
             C,50,1,10,1,50,\n\
             D,50,1,20,2,,100\n\
             E,50,1,10,2,,50\n",
        ),
        (
            "demand.csv",
            "item,period,quantity\nA,2,30\nA,5,30\nA,8,40\n",
        ),
        ("receipts.csv", "item,period,quantity\nB,1,10\nC,1,50\n"),
        (
            "bom.csv",
            "parent,component,quantity_per\nA,B,1\nA,C,2\nA,D,1\nC,D,2\nC,E,3\n",
        ),
    ]);
    let scenario = lotwright::input::read_scenario(dir.path()).expect("the textbook scenario");
    assert_eq!(scenario.low_level_codes(), vec![0, 1, 1, 2, 2]);
    let result = solve::run_rule(&scenario, Rule::LotForLot);
    // Receipts by period (1-based), worked by hand:
    // A: on hand 20 covers 20 of period 2's 30: 10 in 2, 30 in 5, 40 in 8;
    //    released a period earlier: 10 in 1, 30 in 4, 40 in 7.
    // B: needs 10, 30, 40 in 1, 4, 7; the open order of 10 covers period 1.
    // C: needs 20, 60, 80 in 1, 4, 7; 10 + 50 on hand leaves 40; net 20 in
    //    4 is raised to the minimum of 50 (30 left), net 50 in 7.
    // D: needs 10 (A) in 1, 100 (C) in 3, 30 (A) in 4, 100 (C) in 6, 40 (A)
    //    in 7; on hand 20; lots of 100 arrive in 3, 4 and 6.
    // E: needs 150 in 3 and 6 (C's releases of 50 times 3); on hand 10;
    //    lots in multiples of 50: 150 in 3 and 150 in 6.
    let expected: [&[(usize, f64)]; 5] = [
        &[(2, 10.0), (5, 30.0), (8, 40.0)],
        &[(4, 30.0), (7, 40.0)],
        &[(4, 50.0), (7, 50.0)],
        &[(3, 100.0), (4, 100.0), (6, 100.0)],
        &[(3, 150.0), (6, 150.0)],
    ];
    for (i, orders) in expected.iter().enumerate() {
        let mut row = vec![0.0; 8];
        for &(period, quantity) in *orders {
            row[period - 1] = quantity;
        }
        assert_eq!(
            result.plan.receipts[i], row,
            "receipts of {}",
            scenario.items[i].id
        );
    }
    let d = &result.evaluation.items[3];
    assert_eq!(
        d.gross_requirement,
        vec![10.0, 0.0, 100.0, 30.0, 0.0, 100.0, 40.0, 0.0]
    );
    assert_eq!(
        d.on_hand,
        vec![10.0, 10.0, 10.0, 80.0, 80.0, 80.0, 40.0, 40.0]
    );
    assert!(result.evaluation.feasible, "{:?}", result.evaluation);
    assert_eq!(result.status, Status::Feasible);
}

/// A small linear congruential generator, so the random bills are the same
/// on every run.
struct Lcg(u64);

impl Lcg {
    fn below(&mut self, n: u64) -> u64 {
        self.0 = self
            .0
            .wrapping_mul(6364136223846793005)
            .wrapping_add(1442695040888963407);
        (self.0 >> 33) % n
    }
}

/// A random acyclic bill: items 0..n, each line from a lower to a higher
/// index, demand only on the first items and from bucket `from` on.
fn random_scenario(rng: &mut Lcg, n: usize, periods: usize, from: usize) -> Scenario {
    let mut items = Vec::new();
    for i in 0..n {
        let demand: Vec<f64> = (0..periods)
            .map(|t| {
                if i < 2 && t >= from {
                    rng.below(4) as f64
                } else {
                    0.0
                }
            })
            .collect();
        let mut item = Item::simple(
            &format!("I{i}"),
            &demand,
            5.0 + rng.below(20) as f64,
            0.5 + rng.below(3) as f64 * 0.5,
        );
        item.initial_stock = rng.below(3) as f64;
        item.lead_time = rng.below(2) as usize;
        item.lot_multiple = Some(1.0);
        items.push(item);
    }
    let mut scenario = common::scenario(items);
    for parent in 0..n {
        for component in parent + 1..n {
            if rng.below(3) == 0 {
                scenario.bom.push(BomLine {
                    parent,
                    component,
                    quantity_per: (1 + rng.below(2)) as f64,
                    scrap_rate: 0.0,
                });
            }
        }
    }
    scenario
}

/// The MRP record written out here, apart from the product's code: items
/// in an order where every parent comes first (index order, by
/// construction), gross = own demand + parents' releases times quantity
/// per, lot-for-lot net requirements received in their bucket, released
/// the lead time earlier.
fn explode_lot_for_lot(scenario: &Scenario) -> Vec<Vec<f64>> {
    let periods = scenario.periods();
    let n = scenario.items.len();
    let mut receipts = vec![vec![0.0; periods]; n];
    let mut releases = vec![vec![0.0; periods]; n];
    for i in 0..n {
        let item = &scenario.items[i];
        let mut gross = item.demand.clone();
        for line in scenario.bom.iter().filter(|l| l.component == i) {
            for t in 0..periods {
                gross[t] += line.quantity_per * releases[line.parent][t];
            }
        }
        let mut stock = item.initial_stock;
        for t in 0..periods {
            stock -= gross[t];
            if stock < 0.0 {
                assert!(
                    t >= item.lead_time,
                    "the fixtures keep need after the lead time"
                );
                receipts[i][t] = -stock;
                releases[i][t - item.lead_time] = -stock;
                stock = 0.0;
            }
        }
    }
    receipts
}

#[test]
fn level_by_level_lot_for_lot_equals_an_independent_explosion() {
    let mut rng = Lcg(20261203);
    for case in 0..200 {
        let scenario = random_scenario(&mut rng, 2 + case % 5, 10, 5);
        let result = solve::run_rule(&scenario, Rule::LotForLot);
        assert_eq!(
            result.plan.receipts,
            explode_lot_for_lot(&scenario),
            "case {case}: {:?}",
            scenario.bom
        );
        assert!(result.evaluation.feasible, "case {case}");
    }
}

/// Every whole plan with receipts up to `caps[item]` a bucket, the
/// cheapest feasible one's cost as `eval` prices it (None when none is
/// feasible). A cap at the item's whole requirement over the horizon
/// leaves out no plan worth having.
fn brute_force(scenario: &Scenario, caps: &[u32]) -> Option<f64> {
    let periods = scenario.periods();
    let n = scenario.items.len();
    let cells = n * periods;
    let mut digits = vec![0u32; cells];
    let mut best: Option<f64> = None;
    loop {
        let plan = Plan {
            receipts: (0..n)
                .map(|i| {
                    (0..periods)
                        .map(|t| digits[i * periods + t] as f64)
                        .collect()
                })
                .collect(),
        };
        let evaluation = evaluate(scenario, &plan);
        if evaluation.feasible {
            let cost = evaluation.total_cost();
            if best.is_none_or(|b| cost < b) {
                best = Some(cost);
            }
        }
        let mut k = 0;
        loop {
            if k == cells {
                return best;
            }
            digits[k] += 1;
            if digits[k] <= caps[k / periods] {
                break;
            }
            digits[k] = 0;
            k += 1;
        }
    }
}

/// Two parents sharing a component (one unit of it each), three buckets,
/// drawn from `rng`: random demand of 0 or 1, costs, open orders, a lead
/// time on the first parent in some cases, component stock, and in every
/// third case a tight machine for the component.
fn tiny_bill(rng: &mut Lcg, case: usize) -> Scenario {
    let periods = 3;
    let mut items = Vec::new();
    for i in 0..3 {
        let demand: Vec<f64> = (0..periods)
            .map(|_| if i < 2 { rng.below(2) as f64 } else { 0.0 })
            .collect();
        let mut item = Item::simple(
            ["P", "Q", "C"][i],
            &demand,
            2.0 + rng.below(9) as f64,
            0.5 + rng.below(4) as f64 * 0.5,
        );
        item.lot_multiple = Some(1.0);
        item.unit_cost = vec![rng.below(2) as f64; periods];
        // An open order now and then, whose components were issued
        // before the horizon, and a lead time on the first parent.
        if i < 2 && rng.below(3) == 0 {
            item.receipts[rng.below(periods as u64) as usize] = 1.0;
        }
        if i == 0 && case % 4 == 1 {
            item.lead_time = 1;
            item.initial_stock = item.demand[0];
        }
        // The component has stock for the first bucket's releases.
        if i == 2 {
            item.initial_stock = rng.below(2) as f64;
            item.lead_time = case % 2;
        }
        items.push(item);
    }
    let mut scenario = common::scenario(items);
    scenario.bom = vec![
        BomLine {
            parent: 0,
            component: 2,
            quantity_per: 1.0,
            scrap_rate: 0.0,
        },
        BomLine {
            parent: 1,
            component: 2,
            quantity_per: 1.0,
            scrap_rate: 0.0,
        },
    ];
    if case.is_multiple_of(3) {
        // The component's machine, tight enough to bind.
        scenario.resources.push(Resource {
            id: "M".into(),
            unit: "capacity units".into(),
            capacity: vec![4.0; periods],
            overtime_capacity: vec![1.0; periods],
            overtime_cost: 3.0,
            capacity_cost: None,
        });
        scenario.routings.push(Routing {
            item: 2,
            resource: 0,
            per_unit: 1.0,
            setup_time: 0.5,
        });
    }
    scenario
}

/// The joint MILP against every whole plan of a tiny bill: proven optimal
/// at the least cost, or infeasible where no plan is; no level-by-level
/// plan cheaper. `extra` widens every item's cap (for prices per unit
/// moved, which can make receiving a previous plan's quantity worth it).
/// Returns whether the bill had a plan.
fn joint_equals_enumeration(scenario: &Scenario, case: usize, extra: u32) -> bool {
    let outcome =
        solve::plan_scenario(scenario, &solve::Options::default()).expect("a plan of a tiny bill");
    let joint = &outcome.comparison[0];
    assert_eq!(joint.method, solve::EXACT);
    // A parent is worth making beyond its own demand only to use up the
    // component's stock (when the component is dearer to hold), so at
    // most that stock more; the component is needed at most for all the
    // parents make (one each).
    let own = |i: usize| scenario.items[i].demand.iter().sum::<f64>() as u32;
    let stock = scenario.items[2].initial_stock as u32;
    let (p, q) = (own(0) + stock + extra, own(1) + stock + extra);
    match brute_force(scenario, &[p, q, p + q]) {
        None => {
            assert_eq!(joint.status, Status::Infeasible, "case {case}");
            false
        }
        Some(best) => {
            assert_eq!(joint.status, Status::Optimal, "case {case}");
            assert!(joint.evaluation.feasible, "case {case}");
            common::assert_cost_eq(
                joint.total_cost(),
                best,
                &format!("case {case}: {:?} {:?}", joint.plan, scenario.items),
            );
            assert!(joint.lower_bound.expect("a bound") <= best + 1e-6);
            for other in &outcome.comparison[1..] {
                if other.evaluation.feasible {
                    assert!(
                        joint.total_cost() <= other.total_cost() + 1e-9,
                        "case {case}: {} is cheaper than the joint plan",
                        other.method
                    );
                }
            }
            true
        }
    }
}

/// The joint MILP's cost is the least over every whole plan of tiny
/// bills, and no level-by-level plan is cheaper.
#[test]
fn the_joint_plan_is_the_cheapest_whole_plan_on_tiny_bills() {
    let mut rng = Lcg(7);
    let compared = (0..12)
        .filter(|&case| joint_equals_enumeration(&tiny_bill(&mut rng, case), case, 0))
        .count();
    assert!(compared >= 8, "only {compared} tiny bills had a plan");
}

/// The same with a price per unit moved from a previous plan
/// (`model::QuantityChange`, as `roll --change-cost-per-unit` sets it):
/// the joint program's deviation columns price |x - p| exactly, as the one
/// evaluation does, on every item and level.
#[test]
fn a_price_per_unit_moved_keeps_the_joint_plan_the_cheapest_whole_plan() {
    let mut rng = Lcg(11);
    let mut compared = 0;
    for case in 0..6 {
        let mut scenario = tiny_bill(&mut rng, case);
        for item in &mut scenario.items {
            let previous = (0..3)
                .map(|_| match rng.below(3) {
                    0 => None,
                    k => Some((k - 1) as f64),
                })
                .collect();
            item.quantity_change = Some(QuantityChange {
                per_unit: 0.5 + rng.below(6) as f64,
                previous,
            });
        }
        if joint_equals_enumeration(&scenario, case, 1) {
            compared += 1;
        }
    }
    assert!(
        compared >= 4,
        "only {compared} priced tiny bills had a plan"
    );
}

/// Scrap is issued on top of the quantity per: 10 parents released with
/// 2 per and 5 % scrap need 21 components.
#[test]
fn scrap_is_issued_on_top_of_the_quantity_per() {
    let mut parent = Item::simple("P", &[0.0, 10.0], 1.0, 1.0);
    parent.lead_time = 1;
    let mut component = Item::simple("C", &[0.0, 0.0], 1.0, 1.0);
    component.initial_stock = 30.0;
    let mut scenario = common::scenario(vec![parent, component]);
    scenario.bom.push(BomLine {
        parent: 0,
        component: 1,
        quantity_per: 2.0,
        scrap_rate: 0.05,
    });
    let plan = Plan {
        receipts: vec![vec![0.0, 10.0], vec![0.0, 0.0]],
    };
    let evaluation = evaluate(&scenario, &plan);
    assert_eq!(evaluation.items[1].dependent_requirement, vec![21.0, 0.0]);
    assert_eq!(evaluation.items[1].on_hand, vec![9.0, 9.0]);
}

/// Fix-and-optimize across the levels, with blocks of two items so that
/// most subproblems keep other items' lots as firm orders: from the
/// lot-for-lot plan it returns a feasible plan, costed as the evaluation
/// costs it, never dearer than its start and never cheaper than the joint
/// MILP's proven optimum, on seeded random bills.
#[test]
fn fix_and_optimize_improves_within_the_joint_optimum() {
    use lotwright::capacity::milp::{MilpOptions, MilpStatus};
    use lotwright::multilevel::{fix_optimize, milp};
    let mut rng = Lcg(41);
    let mut improved_somewhere = false;
    for _ in 0..6 {
        let scenario = random_scenario(&mut rng, 8, 6, 2);
        let start = solve::run_rule(&scenario, Rule::LotForLot);
        if !start.evaluation.feasible {
            continue;
        }
        let options = MilpOptions {
            threads: Some(1),
            ..MilpOptions::default()
        };
        let deadline = std::time::Instant::now() + std::time::Duration::from_secs(30);
        let searched = fix_optimize::improve_with(&scenario, &options, &start.plan, deadline, 2);
        let evaluation = evaluate(&scenario, &searched.plan);
        assert!(evaluation.feasible, "{:?}", evaluation.shortages);
        common::assert_cost_eq(evaluation.total_cost(), searched.cost, "the search's cost");
        assert!(searched.cost <= start.total_cost() + 1e-9);
        let joint = milp::solve(&scenario, &options, None);
        assert_eq!(joint.status, MilpStatus::Optimal);
        assert!(
            searched.cost >= joint.objective - 1e-6 * joint.objective.abs().max(1.0),
            "search {} below the optimum {}",
            searched.cost,
            joint.objective
        );
        improved_somewhere |= searched.improved > 0;
    }
    assert!(
        improved_somewhere,
        "no case gave the search anything to improve"
    );
}
