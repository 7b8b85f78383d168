"""Drive the served dashboards in a real browser: shared by the browser
tests (tests/dashboards) and the page bench (bench/bench_dashboard.py).

* :class:`Server` runs ``loadscope serve`` in a subprocess on a free loopback
  port and knows its kernel processes;
* :func:`launch_browser` starts Debian's headless chromium through
  Playwright (never a browser download of Playwright's own);
* :class:`Dashboard` reads and works a page the way a person does: the
  figures (each figure view shows the revision it draws in ``data-rev``),
  the sliders, the load tables, the message bar and the snapshot bar.
"""

from __future__ import annotations

import contextlib
import json
import os
import socket
import subprocess
import sys
import time
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import psutil

CHROMIUM = "/usr/bin/chromium"
#: flags that work as root, headless, offline (the pages need no WebGL: the 3D
#: scene is drawn on a 2D canvas)
CHROMIUM_ARGS = [
    "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--disable-quic", "--no-first-run",
    "--disable-background-networking", "--disable-component-update", "--disable-sync",
]
#: figure views per dashboard
FIGURES = {"drive": 3, "gear_pair": 2, "shaft": 2}
DASHBOARDS = tuple(FIGURES)


def test_environment(home: Path) -> dict[str, str]:
    """The environment with HOME, Jupyter's and IPython's folders in ``home``."""
    env = dict(os.environ)
    for key, sub in (("HOME", ""), ("JUPYTER_CONFIG_DIR", ".jupyter"), ("JUPYTER_DATA_DIR", ".local/share/jupyter"),
                     ("JUPYTER_RUNTIME_DIR", ".local/share/jupyter/runtime"), ("IPYTHONDIR", ".ipython"),
                     ("XDG_CONFIG_HOME", ".config"), ("XDG_CACHE_HOME", ".cache")):
        path = home / sub
        path.mkdir(parents=True, exist_ok=True)
        env[key] = str(path)
    env.pop("LOADSCOPE_SNAPSHOT", None)
    env["PYTHONUNBUFFERED"] = "1"
    return env


test_environment.__test__ = False  # type: ignore[attr-defined]  # a helper, not a test


def free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def _stop_with_parent() -> None:
    """In the server's process: get SIGTERM when the test run dies (Linux),
    so an interrupted run leaves no server and no kernels behind."""
    try:
        import ctypes
        import signal

        ctypes.CDLL("libc.so.6", use_errno=True).prctl(1, signal.SIGTERM)    # PR_SET_PDEATHSIG
    except (OSError, AttributeError):
        pass


class Server:
    """``loadscope serve --no-browser`` on a free port, until :meth:`stop`."""

    def __init__(self, env: dict[str, str], workdir: Path, pool: int = 1, snapshot: str | None = None,
                 timeout: float = 90.0) -> None:
        self.port = free_port()
        self.url = f"http://127.0.0.1:{self.port}/"
        self.log = workdir / "server.log"
        cmd = [sys.executable, "-m", "loadscope", "serve", "--no-browser", f"--port={self.port}", f"--pool={pool}"]
        if snapshot:
            cmd.append(f"--snapshot={snapshot}")
        with open(self.log, "w") as out:
            self.proc = subprocess.Popen(cmd, env=env, cwd=workdir, stdout=out, stderr=subprocess.STDOUT,
                                         preexec_fn=_stop_with_parent)
        self.pool = pool
        deadline = time.monotonic() + timeout
        while "serving" not in self.log.read_text():
            if self.proc.poll() is not None or time.monotonic() > deadline:
                self.stop()
                raise RuntimeError(f"loadscope serve did not start:\n{self.log.read_text()}")
            time.sleep(0.1)

    def log_tail(self, chars: int = 3000) -> str:
        """The end of the server's log, without Voila's routine warnings."""
        noise = ("websocket_ping", "Setting websocket_ping")
        lines = [ln for ln in self.log.read_text().splitlines() if not any(n in ln for n in noise)]
        return "\n".join(lines)[-chars:]

    def page_url(self, name: str) -> str:
        return f"{self.url}voila/render/{name}.ipynb"

    def kernels(self) -> list[psutil.Process]:
        """The kernel processes the server runs now."""
        try:
            children = psutil.Process(self.proc.pid).children(recursive=True)
        except psutil.NoSuchProcess:
            return []
        out = []
        for p in children:
            with contextlib.suppress(psutil.Error):
                if "ipykernel_launcher" in " ".join(p.cmdline()):
                    out.append(p)
        return out

    def wait_kernels(self, count: int, timeout: float = 60.0) -> int:
        """Wait until the server runs ``count`` kernels; returns the last count seen."""
        deadline = time.monotonic() + timeout
        while (n := len(self.kernels())) != count and time.monotonic() < deadline:
            time.sleep(0.25)
        return n

    def warm(self, timeout: float = 90.0) -> None:
        """Wait until every dashboard has its warm kernel (pool filled)."""
        self.wait_kernels(self.pool * len(DASHBOARDS), timeout)

    def stop(self) -> None:
        if self.proc.poll() is None:
            self.proc.terminate()
            try:
                self.proc.wait(20)
            except subprocess.TimeoutExpired:
                self.proc.kill()
                self.proc.wait(5)


@contextlib.contextmanager
def launch_browser(env: dict[str, str]) -> Iterator[Any]:
    """A headless Debian chromium driven by Playwright."""
    from playwright.sync_api import sync_playwright

    with sync_playwright() as p:
        browser = p.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS, env=env, headless=True)
        try:
            yield browser
        finally:
            browser.close()


_REVS = "() => [...document.querySelectorAll('[data-rev]')].map(e => Number(e.dataset.rev))"

#: an init script that counts the WebGL contexts a page asks for (``window.__webglContexts``)
COUNT_WEBGL = """(() => {
  window.__webglContexts = 0;
  for (const C of [window.HTMLCanvasElement, window.OffscreenCanvas]) {
    if (!C) continue;
    const get = C.prototype.getContext;
    C.prototype.getContext = function (kind, ...rest) {
      if (/webgl/i.test(String(kind))) window.__webglContexts += 1;
      return get.call(this, kind, ...rest);
    };
  }
})();"""

#: CSS pixel [x, y] of the first 3 x 3 patch of colour ``rgb`` on the force scene's canvas
_SCENE_SPOT = """(rgb) => {
  const c = document.querySelector('[data-figure=force_scene] canvas');
  const w = c.width, h = c.height, d = c.getContext('2d').getImageData(0, 0, w, h).data;
  const near = (x, y) => { const i = 4 * (y * w + x);
    return Math.abs(d[i] - rgb[0]) <= 10 && Math.abs(d[i + 1] - rgb[1]) <= 10 && Math.abs(d[i + 2] - rgb[2]) <= 10; };
  for (let y = 2; y < h - 2; y++) for (let x = 2; x < w - 2; x++) {
    let all = true;
    for (let dy = -1; dy <= 1 && all; dy++) for (let dx = -1; dx <= 1 && all; dx++) all = near(x + dx, y + dy);
    if (all) return [x * c.clientWidth / w, y * c.clientHeight / h];
  }
  return null;
}"""

#: the force scene's canvas: share of pixels unlike its corner (the
#: background), pixels near ``rgb`` (within 10 per channel), and a hash
_SCENE_PIXELS = """(rgb) => {
  const c = document.querySelector('[data-figure=force_scene] canvas');
  if (!c || !c.width) return null;
  const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
  let drawn = 0, near = 0, hash = 0;
  for (let i = 0; i < d.length; i += 4) {
    if (d[i] !== d[0] || d[i + 1] !== d[1] || d[i + 2] !== d[2]) drawn++;
    if (Math.abs(d[i] - rgb[0]) <= 10 && Math.abs(d[i + 1] - rgb[1]) <= 10 && Math.abs(d[i + 2] - rgb[2]) <= 10) near++;
    hash = (Math.imul(hash, 31) + d[i] + 7 * d[i + 1] + 13 * d[i + 2]) >>> 0;
  }
  return {drawn: drawn / (d.length / 4), near, hash};
}"""


class Dashboard:
    """One dashboard page in the browser."""

    def __init__(self, page: Any, name: str) -> None:
        self.page = page
        self.name = name

    @classmethod
    def open(cls, context: Any, server: Server, name: str, timeout: float = 60_000) -> Dashboard:
        page = context.new_page()
        board = cls(page, name)
        page.goto(server.page_url(name), wait_until="commit")
        board.wait_ready(timeout)
        return board

    # what the page shows --------------------------------------------------
    def wait_ready(self, timeout: float = 60_000) -> None:
        """Until every figure of the dashboard draws a figure and the sliders are there."""
        n = FIGURES[self.name]
        self.page.wait_for_function(
            f"() => {{ const r = ({_REVS})(); return r.length === {n} && r.every(x => x >= 0); }}", timeout=timeout)
        self.page.wait_for_selector(".loadscope-param .noUi-handle", timeout=timeout)

    def revs(self) -> list[int]:
        return self.page.evaluate(_REVS)

    def figure_errors(self) -> list[str]:
        return self.page.evaluate("() => [...document.querySelectorAll('[data-rev]')]"
                                  ".map(e => e.dataset.error || '').filter(Boolean)")

    def plotted(self) -> list[int]:
        """How many plot layers each figure view holds (plotly's SVG, or the 3D scene's canvas)."""
        return self.page.evaluate("() => [...document.querySelectorAll('[data-rev]')]"
                                  ".map(e => e.querySelectorAll('.main-svg, canvas').length)")

    def webgl_contexts(self) -> int:
        """WebGL contexts the page asked for (needs ``COUNT_WEBGL`` as an init script)."""
        return self.page.evaluate("() => window.__webglContexts")

    def scene_pixels(self, rgb: tuple[int, int, int]) -> dict[str, float] | None:
        """What the force scene's canvas shows: ``drawn`` (share of pixels
        unlike the background), ``near`` (pixels of colour ``rgb``) and a ``hash``."""
        return self.page.evaluate(_SCENE_PIXELS, list(rgb))

    def scene_spot(self, rgb: tuple[int, int, int]) -> tuple[float, float] | None:
        """Page coordinates of a point of the force scene's canvas inside a
        3 x 3 pixel patch of colour ``rgb`` (the middle of a drawn line), or None."""
        spot = self.page.evaluate(_SCENE_SPOT, list(rgb))
        if spot is None:
            return None
        box = self.page.locator("[data-figure=force_scene] canvas").bounding_box()
        return box["x"] + spot[0], box["y"] + spot[1]

    def table_text(self) -> str:
        return self.page.locator(".loadscope-table").first.inner_text()

    def message(self) -> str:
        return self.page.locator(".loadscope-message").first.inner_text()

    def param(self, label: str) -> Any:
        return self.page.locator(".loadscope-param", has_text=label).first

    def readout(self, label: str) -> str:
        return self.param(label).locator(".widget-readout").inner_text()

    def kernel_id(self) -> str:
        return self.page.evaluate("() => JSON.parse(document.getElementById('jupyter-config-data').textContent)"
                                  ".kernelId")

    # what a person does ---------------------------------------------------
    def move_slider(self, label: str, presses: int = 3, key: str = "ArrowRight") -> None:
        """Focus a slider's handle and press an arrow key: one step per press."""
        handle = self.param(label).locator(".noUi-handle")
        handle.focus()
        for _ in range(presses):
            handle.press(key)

    def wait_revs_above(self, before: list[int], timeout: float = 20_000) -> list[int]:
        """Until every figure shows a later revision than in ``before``."""
        self.page.wait_for_function(
            f"() => {{ const r = ({_REVS})(), b = {json.dumps(before)};"
            " return r.length === b.length && r.every((x, i) => x > b[i]); }", timeout=timeout)
        return self.revs()

    def wait_table_change(self, before: str, timeout: float = 20_000) -> str:
        self.page.wait_for_function(
            "(b) => { const t = document.querySelector('.loadscope-table'); return t && t.innerText !== b; }",
            arg=before, timeout=timeout)
        return self.table_text()

    def wait_table(self, expected: str, timeout: float = 20_000) -> None:
        """Until the load table reads ``expected``."""
        self.page.wait_for_function(
            "(x) => { const t = document.querySelector('.loadscope-table'); return t && t.innerText === x; }",
            arg=expected, timeout=timeout)

    def settle(self, quiet: float = 0.8, timeout: float = 20.0) -> None:
        """Until the table and the figures have not changed for ``quiet`` seconds
        (the last of a series of slider steps has been drawn)."""
        deadline = time.monotonic() + timeout
        last, since = None, time.monotonic()
        while time.monotonic() < deadline:
            now = (self.table_text(), tuple(self.revs()))
            if now != last:
                last, since = now, time.monotonic()
            elif time.monotonic() - since >= quiet:
                return
            self.page.wait_for_timeout(100)
        raise TimeoutError("the page kept changing")

    def save_snapshot(self, to: Path) -> Path:
        with self.page.expect_download(timeout=20_000) as dl:
            self.page.locator(".loadscope-snapshot-bar button", has_text="Save snapshot").click()
        dl.value.save_as(to)
        return to

    def open_snapshot(self, file: Path) -> None:
        with self.page.expect_file_chooser(timeout=20_000) as fc:
            self.page.locator(".loadscope-snapshot-bar .widget-upload").click()
        fc.value.set_files(str(file))

    def screenshot(self, path: Path, height: int = 2400) -> None:
        """The whole dashboard: Voila scrolls inside the page, so the
        viewport is made tall for the picture."""
        size = self.page.viewport_size
        self.page.set_viewport_size({"width": size["width"], "height": height})
        self.page.wait_for_timeout(500)          # plotly resizes its figures to the new size
        self.page.screenshot(path=str(path), full_page=True)
        self.page.set_viewport_size(size)

    def close(self) -> None:
        self.page.close(run_before_unload=True)
