"""Times a grid of year-demo rolls serially and on a LocalCluster, and prints
the table docs/benchmarks.md keeps.

    .venv/bin/python python/examples/grid_benchmark.py [--freezes 0,1,2,4] \
        [--change-costs 0,50,100,200] [--time-limit 1] [--workers 2]

Each run is `roll` of the exact method over the 52 weekly snapshots of
demo-data/harbor-bakeware-year, with one freeze and one change cost, each
week's MILP stopped after the time limit (one HiGHS thread per run).
"""

import argparse
import os
import platform
import time

import lotwright as lw

ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
YEAR = os.path.join(ROOT, "demo-data", "harbor-bakeware-year")


def numbers(text, kind):
    return [kind(x) for x in text.split(",")]


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--freezes", default="0,1,2,4")
    parser.add_argument("--change-costs", default="0,50,100,200")
    parser.add_argument("--time-limit", type=float, default=1.0)
    parser.add_argument("--workers", type=int, default=2)
    args = parser.parse_args()
    runs = lw.policies(frozen=numbers(args.freezes, int), change_cost=numbers(args.change_costs, float))
    options = dict(history=os.path.join(YEAR, "history"), time_limit=args.time_limit, method="exact")
    timings = {}
    tables = {}
    for label, extra in (("serial", dict(serial=True)), (f"LocalCluster, {args.workers} processes", dict(workers=args.workers))):
        started = time.perf_counter()
        tables[label] = lw.grid(YEAR, runs, **options, **extra)
        timings[label] = time.perf_counter() - started
    print(f"machine: {platform.machine()}, {os.cpu_count()} cores, Python {platform.python_version()}")
    print(f"grid: {len(runs)} rolls (freezes {args.freezes} x change costs {args.change_costs}), "
          f"exact, {args.time_limit:g} s per week")
    serial = timings["serial"]
    print("| run | wall time (s) | of serial |")
    print("|---|---:|---:|")
    for label, seconds in timings.items():
        print(f"| {label} | {seconds:.1f} | {seconds / serial:.2f} |")
    for label, table in tables.items():
        errors = table["error"].notna().sum()
        statuses = table["status"].value_counts().to_dict()
        print(f"{label}: statuses {statuses}, errors {errors}, "
              f"sum of run times {table['seconds'].sum():.1f} s")
    print(tables["serial"][["run", "frozen", "change_cost", "status", "realised_cost", "fill_rate", "stability", "gap_found", "seconds"]].to_string(index=False))


if __name__ == "__main__":
    main()
