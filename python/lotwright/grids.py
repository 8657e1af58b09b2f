"""Grids of runs on Dask: many scenarios, or one scenario times a table of
changes and replanning policies, planned or rolled in parallel.

Each run is one task on a ``dask.distributed`` cluster: the caller's
``Client``, a scheduler address, or (neither given) a ``LocalCluster`` of one
single-threaded worker process per core. Every run comes back as one row;
a run that fails comes back as a row with its error, never lost. Rows are
sorted by run id, so the same grid gives the same rows, provided that every
solve ends within its time limit (a solve cut short by the clock may stop
elsewhere on a busier machine; its status then says ``feasible`` or
``unknown`` and its ``gap``). Wall time is kept apart in ``seconds``.
"""

from __future__ import annotations

import itertools
import json
import os
import time
from typing import Any, Dict, List, Mapping, Optional, Sequence

import pandas as pd

from . import commands
from .errors import LotwrightError
from .results import RollResult, roll_status, write_folder
from .scenario import optional

#: Columns a table of runs may have (besides ``run``, the run's id).
PARAMETERS = ("frozen", "change_cost", "set", "method", "horizon", "time_limit", "gap", "threads")

#: The result columns, in order.
COLUMNS = [
    "run", "scenario", "command", "method", *[p for p in PARAMETERS if p != "method"],
    "status", "total_cost", "setup_cost", "holding_cost", "unit_cost", "backlog_cost",
    "overtime_cost", "lower_bound", "gap_found", "realised_cost", "fill_rate", "stability",
    "setups", "weeks_optimal", "weeks_feasible", "weeks_infeasible", "weeks_unknown",
    "error", "seconds",
]


def policies(**values: Sequence[Any]) -> pd.DataFrame:
    """Every combination of the values given, one row each:
    ``policies(frozen=[0, 2], change_cost=[0, 50])`` has four rows."""
    names = list(values)
    rows = [dict(zip(names, combo)) for combo in itertools.product(*values.values())]
    return pd.DataFrame(rows, columns=names)


def _specs(scenarios: Any, runs: Optional[pd.DataFrame], history: Any, defaults: Dict[str, Any]) -> List[Dict[str, Any]]:
    if isinstance(scenarios, (list, tuple)):
        listed = list(scenarios)
    else:
        listed = [scenarios]
    table = pd.DataFrame([{}]) if runs is None else pd.DataFrame(runs)
    unknown = [c for c in table.columns if c not in PARAMETERS and c != "run"]
    if unknown:
        raise TypeError(f"unknown columns {unknown} in the table of runs; use {', '.join(PARAMETERS)}")
    specs = []
    for s, scenario in enumerate(listed):
        label = os.fspath(scenario) if isinstance(scenario, (str, os.PathLike)) else f"scenario {s + 1}"
        for r, row in enumerate(table.to_dict("records")):
            params = {k: defaults.get(k) for k in PARAMETERS}
            params.update({k: optional(v) for k, v in row.items() if k in PARAMETERS})
            run = optional(row.get("run"))
            if run is None:
                run = f"{s + 1:03d}-{r + 1:04d}" if len(listed) > 1 else f"{r + 1:04d}"
            specs.append({"run": str(run), "scenario": label, "source": scenario, "history": history, "params": params})
    return specs


def _sets(value: Any) -> List[str]:
    if value is None:
        return []
    if isinstance(value, str):
        return [part.strip() for part in value.split(";") if part.strip()]
    return list(value)


def _number(value: Any, kind=float):
    return None if value is None else kind(value)


def run_one(spec: Dict[str, Any], out: Optional[str] = None) -> Dict[str, Any]:
    """One run of a grid, as a row; an error becomes the row's ``error``.
    (A module-level function, so Dask ships it to workers by name.)"""
    p = spec["params"]
    row: Dict[str, Any] = {"run": spec["run"], "scenario": spec["scenario"]}
    row.update({k: p.get(k) for k in PARAMETERS})
    row["command"] = "plan" if spec["history"] is None else "roll"
    started = time.perf_counter()
    try:
        common = dict(
            frozen=_number(p.get("frozen"), int),
            set=_sets(p.get("set")),
            time_limit=_number(p.get("time_limit")),
            threads=_number(p.get("threads"), int),
        )
        if spec["history"] is None:
            result = commands.plan(
                spec["source"], method=p.get("method"), gap=_number(p.get("gap")), **common
            )
            row.update(_plan_row(result))
            files = result.files
        else:
            result = commands.roll(
                spec["source"], spec["history"], horizon=_number(p.get("horizon"), int) or 13,
                method=p.get("method") or "exact", change_cost=_number(p.get("change_cost")),
                plain_too=False, **common,
            )
            row.update(_roll_row(result))
            files = {"roll.json": json.dumps(result.json, indent=2).encode()}
        if out is not None:
            write_folder(os.path.join(out, spec["run"]), files, force=True)
        row["error"] = None
    except (LotwrightError, TypeError, ValueError, OSError) as error:
        row.update(status="error", error=f"{type(error).__name__}: {error}")
    row["seconds"] = round(time.perf_counter() - started, 3)
    return row


def _plan_row(result) -> Dict[str, Any]:
    costs = result.costs
    chosen = next((r for r in result.json["comparison"] if r["method"] == result.method), {})
    return {
        "method": result.method, "status": result.status, "total_cost": result.total_cost,
        **{f"{k}_cost": costs[k] for k in ("setup", "holding", "unit", "backlog", "overtime")},
        "lower_bound": result.lower_bound, "gap_found": result.gap, "realised_cost": None,
        "fill_rate": chosen.get("fill_rate"), "stability": None, "setups": result.json["setups"],
    }


def _roll_row(result: RollResult) -> Dict[str, Any]:
    m = result.json["methods"][0]
    realised = m["realised"]
    return {
        "method": m["method"], "status": roll_status(m["statuses"]), "total_cost": realised["total_cost"],
        **{f"{k}_cost": realised["costs"][k] for k in ("setup", "holding", "unit", "backlog", "overtime")},
        "lower_bound": None, "gap_found": m["largest_gap"], "realised_cost": realised["total_cost"],
        "fill_rate": realised["fill_rate"], "stability": m["stability"]["mean_share_changed"],
        "setups": realised["setups"],
        **{f"weeks_{k}": v for k, v in m["statuses"].items()},
    }


def grid(
    scenarios: Any,
    runs: Optional[pd.DataFrame] = None,
    *,
    history: Any = None,
    client: Any = None,
    address: Optional[str] = None,
    workers: Optional[int] = None,
    serial: bool = False,
    out: Optional[str] = None,
    **defaults: Any,
) -> pd.DataFrame:
    """Runs every scenario times every row of ``runs`` and returns one
    DataFrame, a row per run, sorted by ``run``.

    ``scenarios`` is one scenario or a list (folder paths, Scenario objects
    or dicts of tables). ``runs`` has a column per parameter
    (``frozen``, ``change_cost``, ``set`` as ``"KEY=N; KEY=N%"``,
    ``method``, ``horizon``, ``time_limit``, ``gap``, ``threads``) and an
    optional ``run`` id; ``defaults`` give a parameter to every run
    (``time_limit=1``). With ``history`` (a snapshot folder) each run is a
    ``roll`` of one method (exact unless ``method``, priced with its
    ``change_cost``), else a ``plan``. ``threads`` defaults to 1 (one HiGHS
    thread per run: the workers are the parallelism). ``out`` writes each
    run's files into ``out/<run>/`` (the workers must see that path).

    ``client`` is a ``dask.distributed.Client``; ``address`` a scheduler's
    address to connect to; neither makes a LocalCluster of ``workers``
    processes (the machine's cores by default). ``serial`` runs here, one
    run after another, without Dask.
    """
    unknown = [k for k in defaults if k not in PARAMETERS]
    if unknown:
        raise TypeError(f"unknown parameters {unknown}; use {', '.join(PARAMETERS)}")
    defaults.setdefault("threads", 1)
    specs = _specs(scenarios, runs, history, defaults)
    if serial:
        rows = [run_one(spec, out) for spec in specs]
    else:
        rows = _on_dask(specs, out, client, address, workers)
    table = pd.DataFrame(rows).reindex(columns=COLUMNS)
    return table.sort_values("run", kind="stable").reset_index(drop=True)


def _on_dask(specs, out, client, address, workers) -> List[Dict[str, Any]]:
    from distributed import Client, LocalCluster

    owned = []
    if client is None:
        if address is not None:
            client = Client(address)
        else:
            cluster = LocalCluster(
                n_workers=workers or os.cpu_count() or 1, threads_per_worker=1, processes=True,
                dashboard_address=None,
                # One core per run: the library's own thread pool stays at one thread.
                env={"RAYON_NUM_THREADS": "1"},
            )
            owned.append(cluster)
            client = Client(cluster)
        owned.insert(0, client)
    try:
        futures = [client.submit(run_one, spec, out, pure=False) for spec in specs]
        rows = []
        for spec, future in zip(specs, futures):
            try:
                rows.append(future.result())
            except Exception as error:  # a worker lost, or the task killed: still a row
                rows.append({"run": spec["run"], "scenario": spec["scenario"], **spec["params"],
                             "status": "error", "error": f"{type(error).__name__}: {error}"})
        return rows
    finally:
        for thing in owned:
            thing.close()
