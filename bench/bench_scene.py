"""What the browser spends on plotly.js and on the force scene, in an
isolated page (headless Debian chromium, no server): evaluating the full
plotly.js and the 2D bundle the pages load; drawing the demo drive's force
scene with plotly.js (WebGL through SwiftShader) and with loadscope's own
canvas renderer (``loadscope/widgets/scene3d.js``), first draw and a redraw
after a slider-like change.

    python bench/bench_scene.py [--repeats 3]

Medians of ``--repeats`` fresh pages; the load average is printed beside.
"""

from __future__ import annotations

import argparse
import json
import statistics
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
from dashboard_harness import CHROMIUM, CHROMIUM_ARGS  # noqa: E402

import loadscope as ls  # noqa: E402
from loadscope.spec import demo_snapshot, drive_from_snapshot  # noqa: E402
from loadscope.vendor import PLOTLY_BASIC, installed_plotly_js  # noqa: E402
from loadscope.viz import force_scene  # noqa: E402

SCENE_JS = Path(ls.__file__).parent / "widgets" / "scene3d.js"
PAGE = "<html><body style='margin:0'><div id=a style='width:900px'></div></body></html>"
#: until the next frame has been painted
NEXT_FRAME = "() => new Promise(r => requestAnimationFrame(() => setTimeout(r, 0)))"


def _scenes() -> tuple[str, str]:
    """The demo drive's force scene and the same after a power step (JSON)."""
    drive = drive_from_snapshot(demo_snapshot())
    first = force_scene(ls.solve(drive), show="both")
    snap = demo_snapshot()
    snap["input"]["power"] = "6 kW"
    second = force_scene(ls.solve(drive_from_snapshot(snap)), show="both",
                         arrow_scale=first["layout"]["meta"]["arrow_scale"])
    return json.dumps(first), json.dumps(second)


def _timed(page, script: str, arg=None) -> float:
    """Milliseconds of ``script`` (an async function returning nothing) plus the next frame."""
    t = time.perf_counter()
    page.evaluate(script, arg)
    page.evaluate(NEXT_FRAME)
    return (time.perf_counter() - t) * 1000


def run_once(browser, first: str, second: str) -> dict[str, float]:
    out = {}
    for name, bundle in (("evaluate full plotly.js", installed_plotly_js()), ("evaluate 2D plotly.js", PLOTLY_BASIC)):
        page = browser.new_page(viewport={"width": 1000, "height": 800})
        page.set_content(PAGE)
        t = time.perf_counter()
        page.add_script_tag(path=str(bundle))
        out[name] = (time.perf_counter() - t) * 1000
        if name.startswith("evaluate full"):
            out["scene, plotly.js (WebGL)"] = _timed(
                page, "async (s) => { const f = JSON.parse(s); await Plotly.react('a', f.data, f.layout); }", first)
            out["scene update, plotly.js"] = _timed(
                page, "async (s) => { const f = JSON.parse(s); await Plotly.react('a', f.data, f.layout); }", second)
        page.close()
    page = browser.new_page(viewport={"width": 1000, "height": 800})
    page.set_content(PAGE)
    page.add_script_tag(content=SCENE_JS.read_text() + "\nwindow.SceneView = SceneView;")
    out["scene, own canvas renderer"] = _timed(
        page, "(s) => { window.sv = new SceneView(document.getElementById('a')); sv.update(JSON.parse(s)); }", first)
    out["scene update, own renderer"] = _timed(page, "(s) => { sv.update(JSON.parse(s)); }", second)
    out["scene rotate step, own renderer"] = page.evaluate(
        "() => { const t = performance.now(); for (let i = 0; i < 20; i++) { sv.cam.theta += 0.05; sv.draw(); }"
        " return (performance.now() - t) / 20; }")
    page.close()
    return out


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeats", type=int, default=3)
    args = ap.parse_args()
    first, second = _scenes()
    from playwright.sync_api import sync_playwright

    rows: dict[str, list[float]] = {}
    with sync_playwright() as p:
        browser = p.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS, headless=True)
        try:
            for _ in range(args.repeats):
                for k, v in run_once(browser, first, second).items():
                    rows.setdefault(k, []).append(v)
        finally:
            browser.close()
    load_avg = " ".join(open("/proc/loadavg").read().split()[:3])
    sizes = {p.name: p.stat().st_size / 1e6 for p in (installed_plotly_js(), PLOTLY_BASIC)}
    print(f"isolated page, {args.repeats} fresh pages; load average {load_avg} (2 cores)")
    print("bundles: " + ", ".join(f"{k} {v:.2f} MB" for k, v in sizes.items()))
    print(f"scene JSON {len(first) / 1e3:.0f} kB, {len(json.loads(first)['data'])} traces")
    for k, v in rows.items():
        print(f"{k:<36} {statistics.median(v):8.1f} ms  ({min(v):.1f}-{max(v):.1f})")


if __name__ == "__main__":
    main()
