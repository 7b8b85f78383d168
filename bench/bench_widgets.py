"""What one control move costs DriveExplorer on the demo drive, Python side:
the time from a value change to every figure, the table and the controls
updated (one solve, three figure deltas, one table), and the bytes sent to
the page, counted from the comm messages (JSON content as the kernel packs
it, plus binary buffers; message headers not counted).

Targets (issue 4): median time under 30 ms, under 20 kB per move.

The margins (every load case solved and every part rated) are worked out
once the controls are still, as in a kernel: the moves run inside an asyncio
loop, and the time of one rating and what it sends are measured apart.

Run: ``.venv/bin/python bench/bench_widgets.py``. Nothing is asserted here.
"""

from __future__ import annotations

import asyncio
import statistics
import time

from loadscope.widgets import DriveExplorer
from loadscope.widgets.capture import capture_comms

#: (control, values to step through in display units); each step is one move
MOVES = (
    ("input.power", [4.0 + 0.1 * i for i in range(40)]),                  # kW
    ("meshes[0].pressure_angle", [16.0 + 0.25 * i for i in range(40)]),   # deg
    ("meshes[1].pitch_radius", [26.0 + 0.1 * i for i in range(40)]),      # mm, the mate follows
    ("shafts[2].supports[1].at", [120.0 + 1.0 * i for i in range(40)]),   # mm
    ("input.speed", [1000.0 + 20.0 * i for i in range(40)]),              # rpm
)


async def measure() -> None:
    with capture_comms() as rec:
        t0 = time.perf_counter()
        ex = DriveExplorer()
        t_build = time.perf_counter() - t0
        build_bytes = rec.size
        models = sum(m.msg_type == "comm_open" for m in rec.messages)
        _ = ex.panel.controls                 # open every group of the panel (made on first opening)
    rec.clear()
    for view in ex.plots:                     # what a page load costs: each view asks for its figure
        view._handle_custom_msg({"kind": "need_figure"}, [])
    page_bytes = rec.size
    print(f"DriveExplorer on the demo drive: built in {t_build * 1e3:.0f} ms; {models} widget models, "
          f"{build_bytes / 1e3:.0f} kB of widget state; whole figures on a page load {page_bytes / 1e3:.0f} kB")
    print(f"{'control':28} {'moves':>5} {'median':>9} {'p90':>9} {'max':>9} {'CPU med':>9} {'bytes median':>13} "
          f"{'max':>8} {'msgs':>5}")
    all_t: list[float] = []
    all_c: list[float] = []
    all_b: list[int] = []
    for key, values in MOVES:
        ex.panel.set_value(key, values[0])    # warm up on this control
        times, cpu, sizes, counts = [], [], [], []
        for v in values[1:]:
            rec.clear()
            t0, c0 = time.perf_counter(), time.process_time()
            ex.panel.set_value(key, v)
            times.append(time.perf_counter() - t0)
            cpu.append(time.process_time() - c0)
            sizes.append(rec.size)
            counts.append(len(rec.messages))
            if ex.state.error:
                raise SystemExit(f"{key} = {v}: {ex.state.error}")
        all_t += times
        all_c += cpu
        all_b += sizes
        times.sort()
        print(f"{key:28} {len(times):5d} {statistics.median(times) * 1e3:7.1f}ms "
              f"{times[int(0.9 * len(times))] * 1e3:7.1f}ms {times[-1] * 1e3:7.1f}ms "
              f"{statistics.median(cpu) * 1e3:7.1f}ms {statistics.median(sizes) / 1e3:11.1f}kB "
              f"{max(sizes) / 1e3:6.1f}kB {statistics.median(counts):5.0f}")
    print(f"{'all moves':28} {len(all_t):5d} {statistics.median(all_t) * 1e3:7.1f}ms "
          f"{sorted(all_t)[int(0.9 * len(all_t))] * 1e3:7.1f}ms {max(all_t) * 1e3:7.1f}ms "
          f"{statistics.median(all_c) * 1e3:7.1f}ms {statistics.median(all_b) / 1e3:11.1f}kB {max(all_b) / 1e3:6.1f}kB")
    rec.clear()
    t0, c0 = time.perf_counter(), time.process_time()
    ex.state.rate_now()                       # what runs once the controls are still
    print(f"margins after the controls stop: {(time.perf_counter() - t0) * 1e3:.0f} ms "
          f"(CPU {(time.process_time() - c0) * 1e3:.0f} ms), {rec.size / 1e3:.1f} kB sent")
    print("targets: median < 30 ms, < 20 kB per move (CPU: this process's processor time, which other load on "
          "the machine does not inflate)")


def main() -> None:
    asyncio.run(measure())


if __name__ == "__main__":
    main()
