"""The commands of the command line as Python functions.

Each takes a scenario as a folder path, a :class:`lotwright.Scenario` or a
dict of tables, hands folder paths to the compiled module (which reads and
solves with the library, the GIL released) and wraps the JSON it returns.
Arguments have the command line's names with underscores (``time_limit``
for ``--time-limit``) and its defaults.
"""

from __future__ import annotations

import json
from typing import Any, Iterable, Optional, Sequence, Union

from . import _lotwright
from .results import CheckResult, CompareResult, EoqResult, PlanResult, RollResult
from .scenario import ScenarioLike, history_folder, orders_file, scenario_folder, staging


def plan(
    scenario: ScenarioLike,
    *,
    method: Optional[str] = None,
    frozen: Optional[int] = None,
    set: Union[str, Sequence[str]] = (),
    time_limit: Optional[float] = None,
    gap: Optional[float] = None,
    threads: Optional[int] = None,
    solver: str = "auto",
    out: Optional[str] = None,
    force: bool = False,
) -> PlanResult:
    """Plans the scenario with the exact method and every lot rule (or
    ``method`` only), as ``lotwright plan``; ``set`` changes the scenario
    first, as ``compare --set`` does (``"capacity.PRESS-1=90%"``). ``out`` writes the files of
    ``plan --out`` (plan.csv, records.csv, load.csv, comparison.csv,
    plan.xlsx, report.html) into a new folder."""
    with staging() as stage:
        folder = scenario_folder(stage, scenario)
        text, files = _lotwright.plan(
            folder,
            sets=[set] if isinstance(set, str) else list(set),
            method=method,
            frozen=frozen,
            time_limit=time_limit,
            gap=gap,
            threads=threads,
            solver=solver,
            documents=out is not None,
        )
    result = PlanResult(json.loads(text), dict(files))
    if out is not None:
        result.write(out, force=force)
    return result


def check(
    scenario: ScenarioLike,
    orders: Any,
    *,
    frozen: Optional[int] = None,
    time_limit: Optional[float] = None,
    gap: Optional[float] = None,
    threads: Optional[int] = None,
    solver: str = "auto",
) -> CheckResult:
    """Checks proposed orders (a plan file path, or a table with ``item``,
    ``period`` or ``date``, ``quantity``) against the scenario, as
    ``lotwright check``."""
    with staging() as stage:
        folder = scenario_folder(stage, scenario)
        path = orders_file(stage, orders)
        text = _lotwright.check(
            folder, path, frozen=frozen, time_limit=time_limit, gap=gap, threads=threads, solver=solver
        )
    return CheckResult(json.loads(text))


def compare(
    a: ScenarioLike,
    b: Optional[ScenarioLike] = None,
    *,
    set: Union[str, Sequence[str]] = (),
    method: Optional[str] = None,
    frozen: Optional[int] = None,
    time_limit: Optional[float] = None,
    gap: Optional[float] = None,
    threads: Optional[int] = None,
    solver: str = "auto",
    names: Optional[Sequence[Optional[str]]] = None,
) -> CompareResult:
    """Plans A and B (or A and A changed by ``set``, each ``KEY[.ID]=N`` or
    ``=N%`` as ``--set``) with one method and sets them side by side, as
    ``lotwright compare``."""
    sets = [set] if isinstance(set, str) else list(set)
    if names is None:
        names = (_name(a, "A"), None if b is None else _name(b, "B"))
    with staging() as stage:
        folder_a = scenario_folder(stage, a)
        folder_b = None if b is None else scenario_folder(stage, b)
        if b is None and names[1] is None:
            names = (names[0], names[0])
        text = _lotwright.compare(
            folder_a,
            folder_b,
            sets=sets,
            names=tuple(names),
            method=method,
            frozen=frozen,
            time_limit=time_limit,
            gap=gap,
            threads=threads,
            solver=solver,
        )
    return CompareResult(json.loads(text))


def _name(scenario: ScenarioLike, fallback: str) -> str:
    if isinstance(scenario, str):
        return scenario
    if hasattr(scenario, "__fspath__"):
        return str(scenario)
    return fallback


def roll(
    scenario: ScenarioLike,
    history: Any,
    *,
    horizon: int = 13,
    method: Union[None, str, Iterable[str]] = None,
    change_cost: Optional[float] = None,
    frozen: Optional[int] = None,
    set: Union[str, Sequence[str]] = (),
    time_limit: Optional[float] = None,
    threads: Optional[int] = None,
    plain_too: bool = True,
    end_correction: bool = False,
) -> RollResult:
    """Replans bucket by bucket over the forecast snapshots in ``history``
    (a folder, or a dict of tables by date), as ``lotwright roll``: each
    week's MILP stops after ``time_limit`` seconds (5 by default). With a
    ``change_cost`` the exact method runs with and without it, unless
    ``plain_too`` is False. ``end_correction`` charges the setups in each
    plan's last buckets only for the share of an economic cycle they cover
    inside the plan, as ``--end-correction``."""
    methods = [] if method is None else [method] if isinstance(method, str) else list(method)
    with staging() as stage:
        folder = scenario_folder(stage, scenario)
        snapshots = history_folder(stage, history)
        text = _lotwright.roll(
            folder,
            snapshots,
            sets=[set] if isinstance(set, str) else list(set),
            horizon=horizon,
            methods=methods,
            change_cost=change_cost,
            plain_too=plain_too,
            frozen=frozen,
            time_limit=time_limit,
            threads=threads,
            end_correction=end_correction,
        )
    return RollResult(json.loads(text))


def eoq(
    demand: float,
    setup_cost: float,
    holding_cost: Optional[float] = None,
    *,
    production_rate: Optional[float] = None,
    backorder_cost: Optional[float] = None,
    price_breaks: Union[None, str, Sequence[Sequence[float]]] = None,
    carrying_rate: Optional[float] = None,
    lot: Optional[float] = None,
) -> EoqResult:
    """The classic EOQ and its variants, as ``lotwright eoq``.
    ``price_breaks`` is ``[(quantity, price), ...]`` or the text
    ``"Q:PRICE,..."``."""
    if price_breaks is not None and not isinstance(price_breaks, str):
        price_breaks = ",".join(f"{q!r}:{p!r}" for q, p in price_breaks)
    text = _lotwright.eoq(
        float(demand),
        float(setup_cost),
        holding_cost=holding_cost,
        production_rate=production_rate,
        backorder_cost=backorder_cost,
        price_breaks=price_breaks,
        carrying_rate=carrying_rate,
        lot=lot,
    )
    return EoqResult(json.loads(text))
