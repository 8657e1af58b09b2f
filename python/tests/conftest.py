"""Shared fixtures of the Python tests: the repository's demo folders and
the command-line binary the results are held against."""

import json
import os
import subprocess

import pytest

ROOT = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
DEMO = os.path.join(ROOT, "demo-data")


def demo(name: str) -> str:
    return os.path.join(DEMO, name)


@pytest.fixture(scope="session")
def cli():
    """Runs `lotwright ARGS --json` (the release binary, or LOTWRIGHT_BIN)
    and returns the parsed JSON."""
    binary = os.environ.get("LOTWRIGHT_BIN", os.path.join(ROOT, "target", "release", "lotwright"))
    if not os.path.exists(binary):
        pytest.fail(f"the lotwright binary is missing at {binary}; run cargo build --release")

    def run(*args):
        done = subprocess.run([binary, *args, "--json"], capture_output=True, text=True)
        assert done.returncode in (0, 1, 4), done.stderr
        return json.loads(done.stdout)

    return run


def cents(value):
    """Every number of a JSON value rounded to the cent, so two results can
    be compared to the cent."""
    if isinstance(value, float):
        return round(value, 2)
    if isinstance(value, list):
        return [cents(v) for v in value]
    if isinstance(value, dict):
        return {k: cents(v) for k, v in value.items()}
    return value
