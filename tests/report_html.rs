//! report.html as text: self-contained, escaped, every chart present, the
//! saving and the status stated honestly, cautions shown where the plan
//! proposes overtime or stock built ahead.

mod report_fixture;

use lotwright::report::{html, money};
use lotwright::solve::Status;
use report_fixture::{planned, MARKUP_ID};

#[test]
fn the_page_is_self_contained_and_escapes_user_text() {
    let (_dir, scenario, outcome) = planned();
    let page = html::plan(&scenario, &outcome);
    assert!(page.starts_with("<!DOCTYPE html>"));
    assert!(page.contains("@media print"), "a print stylesheet");
    for forbidden in ["<script", "http://", "https://", "src=", "@import", "url("] {
        assert!(!page.contains(forbidden), "the page holds {forbidden:?}");
    }
    assert!(
        !page.contains(MARKUP_ID),
        "the raw id must not reach the page"
    );
    assert!(
        page.contains("PAN&lt;b&gt;&amp;co"),
        "the id is shown escaped"
    );
}

#[test]
fn every_chart_is_there_with_its_name() {
    let (_dir, scenario, outcome) = planned();
    let page = html::plan(&scenario, &outcome);
    let mut expected = vec!["cost-by-method".to_string(), "load-PRESS".to_string()];
    expected.extend(["PAN&lt;b&gt;&amp;co", "TIN", "RACK"].map(|id| format!("stock-{id}")));
    for name in &expected {
        assert!(
            page.contains(&format!("<svg data-chart=\"{name}\"")),
            "chart {name}"
        );
    }
    assert_eq!(page.matches("<svg").count(), expected.len(), "no other svg");
    // Week 3 has reduced capacity and is shaded and named in the caption.
    assert!(page.contains("capacity reduced: period 3 (2027-01-18): 500"));
    assert!(page.contains("PRESS: capacity reduced in period 3"));
}

#[test]
fn the_summary_states_the_saving_against_the_rule_in_use() {
    let (_dir, scenario, outcome) = planned();
    let page = html::plan(&scenario, &outcome);
    let optimal = &outcome.comparison[0];
    let fixed = outcome
        .comparison
        .iter()
        .find(|r| r.method == "fixed-lot")
        .expect("the fixture gives fixed lots");
    assert_eq!(optimal.status, Status::Optimal);
    assert!(page.contains(&format!(
        "The optimal plan costs {} EUR: {} EUR",
        money(optimal.total_cost()),
        money(fixed.total_cost() - optimal.total_cost())
    )));
    assert!(page.contains(&format!(
        "less than the fixed-lot rule in use today ({} EUR)",
        money(fixed.total_cost())
    )));
    assert!(page.contains("Status: proven optimal."));
    // RACK has no fixed lot: the chart says the rule ordered it lot-for-lot.
    assert!(page.contains("RACK: ") && page.contains("(no fixed_lot: ordered lot-for-lot)"));
}

#[test]
fn an_unproven_plan_is_not_called_optimal() {
    let (_dir, scenario, mut outcome) = planned();
    let cost = outcome.chosen.total_cost();
    outcome.chosen.status = Status::Feasible;
    outcome.chosen.lower_bound = Some(cost * 0.98);
    let page = html::plan(&scenario, &outcome);
    assert!(!page.contains("Status: proven optimal"));
    assert!(page.contains("Status: feasible, not proven optimal."));
    assert!(page.contains(&format!(
        "no plan can cost less than {} EUR",
        money(cost * 0.98)
    )));
    // The gap on the total (2 %) beside the gap on the cost the plan
    // controls (the total less the unit cost every plan pays).
    assert!(page.contains("2.00 % of its total"), "{page}");
    let unavoidable = lotwright::eval::unavoidable_cost(&scenario);
    let controlled = cost * 0.02 / (cost - unavoidable);
    assert!(
        page.contains(&format!("{:.2} % of the", 100.0 * controlled)),
        "{page}"
    );
    // Nor is it named optimal in the summary's words.
    assert!(page.contains("The best plan found costs"));
    assert!(!page.contains("The optimal plan costs"));
}

#[test]
fn cautions_appear_where_the_plan_builds_ahead() {
    let (_dir, scenario, outcome) = planned();
    let cautions = lotwright::solve::cautions(&scenario, &outcome.chosen);
    assert!(!cautions.is_empty(), "the fixture plan builds ahead");
    let page = html::plan(&scenario, &outcome);
    assert!(page.contains("Check before releasing the orders"));
    for caution in cautions {
        // The caution may name the item whose id is markup.
        let escaped = caution
            .replace('&', "&amp;")
            .replace('<', "&lt;")
            .replace('>', "&gt;")
            .replace('\'', "&#39;");
        assert!(page.contains(&escaped), "caution shown: {caution}");
    }
}

#[test]
fn a_plan_without_cautions_shows_none() {
    // One item with demand in every week and a high holding cost: the
    // plan orders lot-for-lot, with no overtime and no stock built ahead.
    let dir = tempfile::tempdir().unwrap();
    for (name, text) in [
        (
            "scenario.toml",
            "name = \"plain\"\nstart = \"2027-01-04\"\nbucket = \"week\"\nperiods = 3\n",
        ),
        ("items.csv", "item,setup_cost,holding_cost\nA,10,50\n"),
        ("demand.csv", "item,period,quantity\nA,1,5\nA,2,5\nA,3,5\n"),
    ] {
        std::fs::write(dir.path().join(name), text).unwrap();
    }
    let scenario = lotwright::input::read_scenario(dir.path()).unwrap();
    let outcome =
        lotwright::solve::plan_scenario(&scenario, &lotwright::solve::Options::default()).unwrap();
    let page = html::plan(&scenario, &outcome);
    assert!(!page.contains("Check before releasing the orders"));
    assert!(
        !page.contains("data-chart=\"load-"),
        "no resource, no load chart"
    );
    // No fixed lot anywhere: the saving is against the cheapest rule.
    assert!(page.contains("the cheapest lot rule"));
}
