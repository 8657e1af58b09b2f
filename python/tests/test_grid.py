"""Grids on a real Dask LocalCluster of two worker processes against the
same grid run serially: the same rows, failed runs kept as rows."""

import pandas as pd
import pytest

import lotwright as lw
from lotwright.grids import COLUMNS
from conftest import demo

COMPARED = [c for c in COLUMNS if c != "seconds"]


def test_a_grid_of_rolls_on_two_worker_processes_equals_the_serial_run(tmp_path):
    from distributed import Client, LocalCluster

    folder = demo("harbor-bakeware-four-weeks")
    runs = lw.policies(frozen=[0, 1], change_cost=[0, 5, 20, 80])
    # One policy that cannot run: a freeze as long as the horizon.
    runs = pd.concat([runs, pd.DataFrame([{"frozen": 3, "change_cost": 0}])], ignore_index=True)
    options = dict(history=demo("harbor-bakeware-four-weeks/history"), horizon=3, time_limit=10)
    serial = lw.grid(folder, runs, serial=True, **options)
    with LocalCluster(n_workers=2, threads_per_worker=1, processes=True, dashboard_address=None) as cluster:
        with Client(cluster) as client:
            parallel = lw.grid(folder, runs, client=client, out=str(tmp_path / "runs"), **options)
            workers = len(client.scheduler_info()["workers"])
    assert workers == 2
    assert len(parallel) == 9
    pd.testing.assert_frame_equal(parallel[COMPARED], serial[COMPARED])
    ok = parallel[parallel["error"].isna()]
    assert len(ok) == 8 and set(ok["status"]) == {"optimal"}
    assert (ok["realised_cost"] > 0).all() and ok["fill_rate"].between(0, 1).all()
    failed = parallel[parallel["error"].notna()]
    assert failed["status"].tolist() == ["error"] and "leaves nothing to plan" in failed["error"].iloc[0]
    # Each roll's own figures are those of a roll run alone.
    one = lw.roll(folder, options["history"], horizon=3, frozen=1, change_cost=20, method="exact", plain_too=False)
    row = parallel[(parallel["frozen"] == 1) & (parallel["change_cost"] == 20)].iloc[0]
    assert row["realised_cost"] == one.json["methods"][0]["realised"]["total_cost"]
    assert row["stability"] == one.json["methods"][0]["stability"]["mean_share_changed"]
    assert sorted(p.name for p in (tmp_path / "runs").iterdir()) == sorted(ok["run"])


def test_a_list_of_scenarios_with_changes_is_planned_as_plan_does():
    scenarios = [demo("harbor-bakeware-four-weeks"), demo("harbor-bakeware-parts")]
    runs = pd.DataFrame({"set": [None, "demand=150%; setup_cost=80%"], "method": ["silver-meal", "eoq"]})
    table = lw.grid(scenarios, runs, serial=True)
    assert table["run"].tolist() == ["001-0001", "001-0002", "002-0001", "002-0002"]
    alone = lw.plan(scenarios[1], method="eoq", set=["demand=150%", "setup_cost=80%"])
    row = table.iloc[3]
    assert (row["status"], row["total_cost"], row["setups"]) == (alone.status, alone.total_cost, alone.json["setups"])
    assert row["setup_cost"] == alone.costs["setup"]


def test_unknown_grid_columns_are_refused():
    with pytest.raises(TypeError, match="unknown columns"):
        lw.grid(demo("harbor-bakeware-four-weeks"), pd.DataFrame({"freeze": [1]}), serial=True)


def test_without_a_client_the_grid_starts_and_closes_its_own_local_cluster():
    folder = demo("harbor-bakeware-four-weeks")
    runs = lw.policies(method=["exact", "silver-meal"], frozen=[0, 1])
    local = lw.grid(folder, runs, history=demo("harbor-bakeware-four-weeks/history"), horizon=3, workers=2)
    serial = lw.grid(folder, runs, history=demo("harbor-bakeware-four-weeks/history"), horizon=3, serial=True)
    pd.testing.assert_frame_equal(local[COMPARED], serial[COMPARED])
    assert local["method"].tolist() == ["exact", "exact", "silver-meal", "silver-meal"]
    assert local["error"].isna().all()


def test_a_roll_row_counts_its_weekly_statuses():
    folder = demo("harbor-bakeware-four-weeks")
    row = lw.grid(folder, history=demo("harbor-bakeware-four-weeks/history"), horizon=3, serial=True).iloc[0]
    weeks = [row[f"weeks_{s}"] for s in ("optimal", "feasible", "infeasible", "unknown")]
    assert weeks == [4, 0, 0, 0] and row["status"] == "optimal"
