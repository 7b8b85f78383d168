"""Time and size of the HTML design-load report of the demo drive, and how
much of the size is the embedded plotly.js.

Run: ``.venv/bin/python bench/bench_report.py``. Nothing here is asserted.
"""

from __future__ import annotations

import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

from bench_solve import median_time  # noqa: E402

from loadscope import solve  # noqa: E402
from loadscope.report.html import to_html  # noqa: E402
from loadscope.spec import demo_snapshot, drive_from_snapshot  # noqa: E402


def main() -> None:
    from plotly.offline import get_plotlyjs

    result = solve(drive_from_snapshot(demo_snapshot()))
    text = to_html(result)                       # warm up: imports plotly and pandas
    t = median_time(lambda: to_html(result), repeat=5, number=3)
    js = len(get_plotlyjs().encode())
    size = len(text.encode())
    print(f"HTML report of the demo drive ({len(result.shafts)} shafts, {2 + len(result.shafts)} figures): "
          f"median {t * 1e3:.0f} ms per report")
    print(f"  size {size / 1e6:.2f} MB, of which plotly.js {js / 1e6:.2f} MB and the page itself "
          f"{(size - js) / 1e3:.0f} kB")


if __name__ == "__main__":
    main()
