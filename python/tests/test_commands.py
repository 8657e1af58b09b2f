"""The Python functions against the command line on the demo folders: the
same JSON to the cent, and DataFrames that agree with it."""

import pandas as pd
import pytest

import lotwright as lw
from conftest import cents, demo

DEMOS = ["harbor-bakeware", "harbor-bakeware-parts", "harbor-bakeware-year", "harbor-bakeware-four-weeks"]
RULES = ["lot-for-lot", "eoq", "poq", "silver-meal", "least-unit-cost", "part-period-balancing"]


@pytest.mark.parametrize("name", DEMOS)
@pytest.mark.parametrize("method", RULES)
def test_every_rule_on_every_demo_equals_the_cli(cli, name, method):
    folder = demo(name)
    result = lw.plan(folder, method=method)
    assert cents(result.json) == cents(cli("plan", folder, "--method", method))
    assert result.total_cost == pytest.approx(sum(result.costs[k] for k in result.costs if k != "total"), abs=0.01)


def test_the_whole_comparison_of_the_small_demo_equals_the_cli(cli):
    folder = demo("harbor-bakeware-four-weeks")
    result = lw.plan(folder)
    expected = cli("plan", folder)
    assert cents(result.json) == cents(expected)
    assert result.status == "optimal" and result.gap == 0
    assert list(result.comparison["method"]) == [row["method"] for row in expected["comparison"]]
    assert result.comparison["total_cost"].tolist() == [row["total_cost"] for row in expected["comparison"]]
    assert result.orders["quantity"].sum() == pytest.approx(sum(o["quantity"] for o in expected["orders"]))


def test_the_exact_plan_of_the_shared_capacity_demo_is_priced_the_same_by_the_cli(cli, tmp_path):
    # The MILP stops at its time limit on a busy machine, so the plan itself
    # may differ run to run; what must hold is that the CLI prices the plan
    # Python got at the cost Python states, to the cent.
    folder = demo("harbor-bakeware")
    result = lw.plan(folder, method="exact", time_limit=5, out=str(tmp_path / "out"))
    assert result.status in ("optimal", "feasible")
    assert result.lower_bound <= result.total_cost + 0.01
    checked = cli("check", folder, "--orders", str(tmp_path / "out" / "plan.csv"), "--time-limit", "1")
    assert checked["total_cost"] == pytest.approx(result.total_cost, abs=0.005)
    assert checked["feasible"] is True
    written = pd.read_csv(tmp_path / "out" / "records.csv")
    pd.testing.assert_frame_equal(written, result.records, check_dtype=False)
    assert sorted(p.name for p in (tmp_path / "out").iterdir()) == sorted(
        ["plan.csv", "records.csv", "load.csv", "comparison.csv", "plan.xlsx", "report.html"]
    )
    load = result.load
    assert {"resource", "period"} <= set(load.columns) and len(load) > 0


def test_check_compare_roll_and_eoq_equal_the_cli(cli):
    folder = demo("harbor-bakeware-four-weeks")
    history = demo("harbor-bakeware-four-weeks/history")
    rolled = lw.roll(folder, history, horizon=3, frozen=1, change_cost=10)
    assert cents(rolled.json) == cents(cli("roll", folder, "--history", history, "--horizon", "3", "--frozen", "1", "--change-cost", "10"))
    assert set(rolled.methods["method"]) >= {"exact", "exact+change-cost", "lot-for-lot"}
    assert len(rolled.weeks) == 4 * len(rolled.methods)
    corrected = lw.roll(folder, history, horizon=3, frozen=1, method="exact", end_correction=True)
    assert corrected.json["end_correction"] is True
    assert cents(corrected.json) == cents(cli("roll", folder, "--history", history, "--horizon", "3", "--frozen", "1", "--method", "exact", "--end-correction"))
    compared = lw.compare(folder, set=["demand=120%"])
    expected = cli("compare", folder, "--set", "demand=120%")
    assert cents(compared.json["difference"]) == cents(expected["difference"])
    assert compared.json["b"]["total_cost"] == expected["b"]["total_cost"]
    economic = lw.eoq(26000, 180, 2.6, lot=1500)
    assert cents(economic.json) == cents(cli("eoq", "--demand", "26000", "--setup-cost", "180", "--holding-cost", "2.6", "--lot", "1500"))
    orders = pd.DataFrame({"item": ["PIE-DISH"], "period": [1], "quantity": [100]})
    checked = lw.check(folder, orders)
    assert checked.feasible is False and len(checked.shortages) > 0
