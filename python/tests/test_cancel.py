"""Ctrl-C during a long solve: Python gets KeyboardInterrupt while the
solve runs with the GIL released."""

import os
import signal
import subprocess
import sys
import time

from conftest import demo

SCRIPT = """
import sys, lotwright
print("solving", flush=True)
try:
    lotwright.plan(sys.argv[1], method="exact", time_limit=600, gap=0.0)
except KeyboardInterrupt:
    print("interrupted", flush=True)
    sys.exit(7)
print("finished", flush=True)
"""


def test_ctrl_c_interrupts_a_long_solve():
    process = subprocess.Popen(
        [sys.executable, "-c", SCRIPT, demo("harbor-bakeware")],
        stdout=subprocess.PIPE, text=True,
    )
    assert process.stdout.readline().strip() == "solving"
    time.sleep(2)  # into the solve
    process.send_signal(signal.SIGINT)
    try:
        out, _ = process.communicate(timeout=60)
    finally:
        process.kill()
    assert out.strip() == "interrupted" and process.returncode == 7
