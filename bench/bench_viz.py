"""Build time and size of each figure spec of the demo drive, and what one
parameter change costs once the figure exists (the delta, and applying it to
a plotly Figure inside one batch update).

Run: ``.venv/bin/python bench/bench_viz.py``. Nothing here is asserted; the
numbers go into the issue and the widgets' design.
"""

from __future__ import annotations

import json
import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from bench_solve import median_time  # noqa: E402

from loadscope import solve  # noqa: E402
from loadscope.spec import demo_snapshot, drive_from_snapshot  # noqa: E402
from loadscope.viz import (  # noqa: E402
    as_figure,
    dashboard_figure,
    figure_update,
    force_scene,
    reaction_bars,
    shaft_diagrams,
)


def main() -> None:
    snap = demo_snapshot()
    result = solve(drive_from_snapshot(snap))
    snap["input"]["power"] = "7.5 kW"
    changed = solve(drive_from_snapshot(snap))
    for r in (result, changed):
        for sr in r.shafts:
            _ = sr.solution.diagram          # sampled once per result; measured in bench_solve.py
    builders = {
        "force_scene": lambda r: force_scene(r, show="both"),
        "reaction_bars": lambda r: reaction_bars(r),
        "shaft_diagrams": lambda r: shaft_diagrams(r, "output"),
        "dashboard_figure": lambda r: dashboard_figure(r, "output"),
    }
    print(f"{'figure':18} {'traces':>6} {'JSON':>9} {'build':>9} {'delta JSON':>11} {'delta':>8} "
          f"{'apply':>9} {'as_figure':>10}")
    for name, build in builders.items():
        old, new = build(result), build(changed)
        delta = figure_update(old, new)
        t_build = median_time(lambda b=build: b(result), repeat=15, number=20)
        t_delta = median_time(lambda o=old, n=new: figure_update(o, n), repeat=15, number=20)
        t_fig = median_time(lambda o=old: as_figure(o), repeat=5, number=3)
        fig = as_figure(old)

        def apply(f=fig, d=delta):
            with f.batch_update():
                for trace, change in zip(f.data, d["data"]):
                    if change:
                        trace.update(change)
                f.layout.update(d["layout"])
        t_apply = median_time(apply, repeat=5, number=5)
        print(f"{name:18} {len(old['data']):6d} {len(json.dumps(old)) / 1e3:7.1f}kB {t_build * 1e3:7.2f}ms "
              f"{len(json.dumps(delta)) / 1e3:9.1f}kB {t_delta * 1e3:6.2f}ms {t_apply * 1e3:7.2f}ms "
              f"{t_fig * 1e3:8.1f}ms")
    print("delta: figure_update after a power change (5.5 -> 7.5 kW); apply: that delta into a plotly Figure "
          "in one batch_update (plotly validation included)")


if __name__ == "__main__":
    main()
