"""Scenarios given as DataFrames or dicts of columns: read by the same
reader as a folder, so the same plans and the same messages."""

import os
import tomllib

import pandas as pd
import pytest

import lotwright as lw
from conftest import cents, demo


def typed_tables(folder):
    """The demo folder as a notebook would load it: pandas' own types
    (numbers as numbers, empty cells as NaN), scenario.toml as a dict."""
    with open(os.path.join(folder, "scenario.toml"), "rb") as f:
        tables = {"scenario": tomllib.load(f)}
    for name in lw.scenario.TABLES:
        path = os.path.join(folder, f"{name}.csv")
        if os.path.exists(path):
            tables[name.replace("-", "_")] = pd.read_csv(path)
    return tables


@pytest.mark.parametrize("name", ["harbor-bakeware", "harbor-bakeware-parts", "harbor-bakeware-year"])
def test_dataframes_plan_as_the_folder_does(name):
    folder = demo(name)
    for method in ("silver-meal", "eoq"):
        from_folder = lw.plan(folder, method=method)
        from_frames = lw.plan(typed_tables(folder), method=method)
        assert cents(from_frames.json) == cents(from_folder.json)
        pd.testing.assert_frame_equal(from_frames.records, from_folder.records)


def test_dicts_of_columns_and_the_scenario_class_plan_the_same():
    folder = demo("harbor-bakeware-four-weeks")
    tables = typed_tables(folder)
    as_dicts = {k: (v.to_dict("list") if isinstance(v, pd.DataFrame) else v) for k, v in tables.items()}
    a = lw.plan(as_dicts)
    b = lw.plan(lw.Scenario.read(folder))
    c = lw.plan(folder)
    assert cents(a.json) == cents(c.json) == cents(b.json)
    history = {f[:-4]: pd.read_csv(os.path.join(folder, "history", f)) for f in os.listdir(os.path.join(folder, "history"))}
    rolled = lw.roll(as_dicts, history, horizon=3, frozen=1)
    assert cents(rolled.json) == cents(lw.roll(folder, os.path.join(folder, "history"), horizon=3, frozen=1).json)


def test_a_bad_cell_raises_with_table_line_and_column():
    tables = typed_tables(demo("harbor-bakeware"))
    items = tables["items"].copy()
    items["setup_cost"] = items["setup_cost"].astype(object)
    items.loc[2, "setup_cost"] = "12 EUR"
    tables["items"] = items
    with pytest.raises(lw.InputError) as caught:
        lw.plan(tables)
    error = caught.value
    assert (error.table, error.file, error.line, error.row) == ("items", "items.csv", 4, 2)
    assert (error.column, error.column_name) == (2, "setup_cost")
    assert "12 EUR is not a number" in error.reason
    assert str(error).startswith("items.csv, line 4, column 2 (setup_cost): ")


def test_the_message_is_the_cli_message(tmp_path):
    import subprocess
    from conftest import ROOT
    tables = typed_tables(demo("harbor-bakeware-four-weeks"))
    tables["demand"] = pd.DataFrame({"item": ["PIE-DISH", "NO-SUCH"], "period": [1, 2], "quantity": [10, 5]})
    with pytest.raises(lw.InputError) as caught:
        lw.plan(tables)
    lw.Scenario.from_dict(tables).write(tmp_path)
    done = subprocess.run([os.path.join(ROOT, "target", "release", "lotwright"), "plan", str(tmp_path)], capture_output=True, text=True)
    assert done.returncode == 2
    assert done.stderr.strip() == f"lotwright: {tmp_path / 'demand.csv'}, line 3, column 1 (item): {caught.value.reason}"
    assert caught.value.table == "demand" and caught.value.line == 3 and caught.value.column == 1


def test_an_unknown_column_and_bad_settings_are_refused_with_their_place():
    tables = typed_tables(demo("harbor-bakeware-four-weeks"))
    tables["items"] = tables["items"].assign(colour="red")
    with pytest.raises(lw.InputError) as caught:
        lw.plan(tables)
    assert caught.value.table == "items" and caught.value.line == 1 and caught.value.column_name == "colour"
    tables = typed_tables(demo("harbor-bakeware-four-weeks"))
    tables["scenario"]["bucket"] = "fortnight"
    with pytest.raises(lw.InputError) as caught:
        lw.plan(tables)
    assert caught.value.table == "scenario" and caught.value.line is not None


def test_bad_arguments_raise_usage_errors():
    with pytest.raises(lw.UsageError, match="time_limit"):
        lw.plan(demo("harbor-bakeware-four-weeks"), time_limit=-1)
    with pytest.raises(lw.UsageError):
        lw.eoq(-5, 10, 1)
    with pytest.raises(lw.InputError, match="not a scenario folder"):
        lw.plan(demo("no-such-folder"))
