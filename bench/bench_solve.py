"""Median time of one full solve of the demo drive by loadscope, and of the
same shafts modelled in PyNiteFEA, measured side by side in one run.

Run: ``make bench``. Targets (issue: the drive statics kernel): loadscope at
least 100x faster than PyNiteFEA and under 1 ms per full solve.
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from pynite_drive import solve_models  # noqa: E402

from loadscope import solve  # noqa: E402
from loadscope.spec import demo_snapshot, drive_from_snapshot  # noqa: E402


def median_time(fn, repeat: int, number: int, clock=time.perf_counter) -> float:
    """Median over ``repeat`` runs of the mean time of ``number`` calls [s],
    by ``clock`` (wall time by default; ``time.process_time`` for CPU time)."""
    times = []
    for _ in range(repeat):
        t0 = clock()
        for _ in range(number):
            fn()
        times.append((clock() - t0) / number)
    return statistics.median(times)


def main() -> None:
    drive = drive_from_snapshot(demo_snapshot())
    result = solve(drive)
    solve_models(result)                         # warm up both
    t_ls = median_time(lambda: solve(drive), repeat=15, number=100)
    t_pn = median_time(lambda: solve_models(result), repeat=7, number=3)

    def sample_all() -> None:
        r = solve(drive)
        for sr in r.shafts:
            _ = sr.solution.diagram      # dense samples for plots, computed on first use
    t_dense = median_time(sample_all, repeat=7, number=30) - t_ls
    print(f"demo drive: {len(drive.shafts)} shafts, {len(drive.meshes)} meshes, "
          f"{sum(len(s.supports) for s in drive.shafts)} supports")
    print(f"loadscope full solve (train, tooth forces, reactions, diagram and deflection values at every "
          f"station, housing, bolts): median {t_ls * 1e3:.3f} ms")
    print(f"  + dense diagram samples for plotting, all shafts: {t_dense * 1e3:.3f} ms more")
    print(f"PyNiteFEA, the same shafts and loads (shaft statics only):     median {t_pn * 1e3:.3f} ms")
    print(f"ratio PyNiteFEA / loadscope: {t_pn / t_ls:.0f}x   (targets: >= 100x, loadscope < 1 ms)")


if __name__ == "__main__":
    main()
