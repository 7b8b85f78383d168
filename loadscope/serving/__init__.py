"""Serve the dashboards (``dashboards/*.ipynb``) as web pages with Voila.

``loadscope serve`` runs :func:`serve`. The server's settings live in
``voila.json`` beside this module (never next to the notebooks: a ``voila.py``
there would shadow the ``voila`` package inside every kernel):

* loopback only (``127.0.0.1``); put a reverse proxy with authentication in
  front to serve a team (docs/serving.md);
* notebook sources stripped, no tracebacks in the page, no files served from
  the notebook folder;
* one warm kernel per dashboard kept ready (``--pool``), so a page does not
  wait for a kernel to start and the notebook to run;
* a cell's output is awaited up to 60 s after the kernel's reply
  (``VoilaExecutor.iopub_timeout``; the default 4 s lost the output, and the
  page stayed blank, when many pages opened at once on a busy machine);
* a closed page's kernel stops at once (its shutdown beacon works, see
  :mod:`loadscope.serving.app`); a kernel that lost its page anyway is culled
  after 10 idle minutes.

The kernels learn two things from the environment: ``LOADSCOPE_PLOTLY_URL``
(where the page loads plotly.js from) and ``LOADSCOPE_SNAPSHOT`` (the snapshot
file the explorers open on, from ``--snapshot``).
"""

from __future__ import annotations

import os
from pathlib import Path

from ..errors import InputError

#: environment variable the figure views read the plotly.js URL from
PLOTLY_URL_ENV = "LOADSCOPE_PLOTLY_URL"
#: environment variable the explorers read the snapshot to open from
SNAPSHOT_ENV = "LOADSCOPE_SNAPSHOT"
#: the folder of the server's settings (voila.json)
CONFIG_DIR = Path(__file__).resolve().parent
DEFAULT_PORT = 8866


def dashboards_dir() -> Path:
    """The ``dashboards/`` folder of the loadscope checkout."""
    folder = CONFIG_DIR.parent.parent / "dashboards"
    if not folder.is_dir():
        raise InputError("dashboards", f"folder not found at {folder}",
                         "a loadscope checkout installed with `pip install -e .`")
    return folder


def startup_snapshot() -> str | None:
    """The snapshot file a dashboard opens on: the one ``loadscope serve
    --snapshot FILE`` named (through ``LOADSCOPE_SNAPSHOT``), else None (the
    explorers then open the demo drive).

    >>> import os; os.environ.pop(SNAPSHOT_ENV, None) and None
    >>> startup_snapshot() is None
    True
    """
    return os.environ.get(SNAPSHOT_ENV) or None


def check_snapshot(path: str) -> Path:
    """The absolute path of a snapshot file, after checking that it loads,
    so a bad file is reported before the server starts."""
    from .. import spec

    file = Path(path).expanduser().resolve()
    if not file.is_file():
        raise InputError("--snapshot", f"no such file: {path}", "a readable snapshot file")
    spec.load_snapshot(file)
    return file


def voila_argv(port: int, pool: int, base_url: str, open_browser: bool) -> list[str]:
    """Command-line settings that go on top of ``voila.json``.

    >>> voila_argv(8866, 0, "/", False)[-2:]
    ['--VoilaConfiguration.preheat_kernel=False', '--Voila.open_browser=False']
    """
    if not 0 <= port <= 65535:
        raise InputError("--port", f"is out of range, got {port}", "0 to 65535")
    if not 0 <= pool <= 8:
        raise InputError("--pool", f"is out of range, got {pool}", "0 to 8 warm kernels per dashboard")
    if not (base_url.startswith("/") and base_url.endswith("/")):
        raise InputError("--base-url", f"must start and end with '/', got {base_url!r}", "e.g. / or /loadscope/")
    return [
        f"--port={port}",
        f"--Voila.base_url={base_url}",
        f"--VoilaConfiguration.default_pool_size={pool}",
        f"--VoilaConfiguration.preheat_kernel={pool > 0}",
        f"--Voila.open_browser={open_browser}",
    ]


def serve(port: int = DEFAULT_PORT, snapshot: str | None = None, open_browser: bool = True,
          pool: int = 1, base_url: str = "/") -> None:
    """Serve the dashboards on ``http://127.0.0.1:{port}{base_url}`` until
    interrupted; prints the URL once the server listens."""
    argv = voila_argv(port, pool, base_url, open_browser)
    root = dashboards_dir()
    from .app import DashboardServer, plotly_url

    # kernels (warm ones included) copy the server's environment when they start
    os.environ[PLOTLY_URL_ENV] = plotly_url(base_url)
    if snapshot:
        os.environ[SNAPSHOT_ENV] = str(check_snapshot(snapshot))
    else:
        os.environ.pop(SNAPSHOT_ENV, None)

    app = DashboardServer(config_file_paths=[str(CONFIG_DIR)])
    app.initialize([*argv, str(root)])

    def announce() -> None:
        url = f"http://127.0.0.1:{app.port}{base_url}"
        print(f"loadscope: serving {root.name}/ at {url}  (Ctrl-C stops)", flush=True)
        for name in sorted(p.name for p in root.glob("*.ipynb")):
            print(f"  {url}voila/render/{name}", flush=True)

    import tornado.ioloop

    tornado.ioloop.IOLoop.current().add_callback(announce)
    app.start()

