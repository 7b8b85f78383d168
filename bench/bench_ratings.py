"""Median time to rate the demo drive: three load cases solved, every
bearing, shaft section, stiffness limit and bolt rated, the duty cycle
summed; and the share of it spent outside the three solves.

Run: ``.venv/bin/python bench/bench_ratings.py``. No target is asserted; the
numbers go in the report of the change that moves them.
"""

from __future__ import annotations

from bench_solve import median_time  # the same timing rule as the solve bench

from loadscope import rate, solve_cases
from loadscope.report import margins_tables
from loadscope.spec import demo_snapshot, drive_from_snapshot


def main() -> None:
    drive = drive_from_snapshot(demo_snapshot())
    ratings = rate(drive)                               # warm up (diagram sampling, imports)
    margins_tables(ratings)
    t_rate = median_time(lambda: rate(drive), repeat=15, number=10)
    t_solve = median_time(lambda: [s.solution.diagram for r in solve_cases(drive) for s in r.result.shafts],
                          repeat=15, number=10)
    t_table = median_time(lambda: margins_tables(ratings), repeat=15, number=10)
    n = len(ratings.checks)
    print(f"rate(demo), 3 cases, {n} checks: {t_rate * 1e3:.1f} ms "
          f"(of which solving the cases with their diagrams {t_solve * 1e3:.1f} ms)")
    print(f"margins_tables (4 DataFrames): {t_table * 1e3:.1f} ms")


if __name__ == "__main__":
    main()
