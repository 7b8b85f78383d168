"""Median time to rate the demo drive: three load cases solved, every
bearing (life and static safety), shaft section (with its minimum
diameters), stiffness limit and bolt rated, the duty cycle summed; and the
shares of it spent solving the cases and finding the minimum diameters.

Run: ``.venv/bin/python bench/bench_ratings.py``. No target is asserted; the
numbers go in the report of the change that moves them. On a shared machine
the CPU time of this process (``time.process_time``) is the steadier figure;
both are printed.
"""

from __future__ import annotations

import time

import numpy as np
from bench_solve import median_time  # the same timing rule as the solve bench

from loadscope import rate, solve_cases
from loadscope.kernel import shaftsize
from loadscope.report import margins_tables
from loadscope.spec import demo_snapshot, drive_from_snapshot


def _min_diameter_calls(ratings):
    """The section_minimum_diameters calls of one rating (one per shaft and case), rebuilt from the details."""
    calls = []
    for cr in ratings.cases:
        for shaft in ratings.drive.shafts:
            mat = shaft.material
            rows = [c.details for c in cr.checks if c.kind == "shaft section" and c.check.startswith("fatigue")
                    and c.component.startswith(f"{shaft.id} at")]
            if mat is None or not rows:
                continue
            col = {k: np.array([r[k] for r in rows]) for k in ("M", "T", "N", "Kf", "Kfs", "Se", "kb", "bore",
                                                                "diameter")}
            calls.append((mat.required_factor, col["M"], col["T"], col["Kf"], col["Kfs"], col["Se"] / col["kb"],
                          mat.Sut, mat.Sy, mat.criterion, shaft.alternating_torque * col["T"], np.abs(col["N"]),
                          col["bore"] / col["diameter"]))
    return calls


def main() -> None:
    drive = drive_from_snapshot(demo_snapshot())
    ratings = rate(drive)                               # warm up (diagram sampling, imports)
    margins_tables(ratings)
    t_rate = median_time(lambda: rate(drive), repeat=15, number=10)
    cpu_rate = median_time(lambda: rate(drive), repeat=15, number=10, clock=time.process_time)
    t_solve = median_time(lambda: [s.solution.diagram for r in solve_cases(drive) for s in r.result.shafts],
                          repeat=15, number=10)
    calls = _min_diameter_calls(ratings)
    t_dmin = median_time(lambda: [shaftsize.section_minimum_diameters(*a) for a in calls], repeat=15, number=10)
    t_table = median_time(lambda: margins_tables(ratings), repeat=15, number=10)
    n = len(ratings.checks)
    print(f"rate(demo), 3 cases, {n} checks: {t_rate * 1e3:.1f} ms wall, {cpu_rate * 1e3:.1f} ms CPU "
          f"(of which solving the cases with their diagrams {t_solve * 1e3:.1f} ms; "
          f"minimum diameters, {len(calls)} vectorised calls, {t_dmin * 1e3:.1f} ms)")
    print(f"margins_tables (4 DataFrames): {t_table * 1e3:.1f} ms")


if __name__ == "__main__":
    main()
