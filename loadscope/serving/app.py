"""The Voila application behind ``loadscope serve``.

Voila itself does the serving; this subclass adds two things its configuration
cannot express:

* a static, browser-cacheable route for plotly.js's 2D bundle shipped in
  loadscope (``loadscope.vendor.PLOTLY_BASIC``; the pages draw their 3D scene
  without plotly.js), so a page loads plotly.js once per browser instead of
  once per figure over the websocket (the figure views find it through
  ``LOADSCOPE_PLOTLY_URL``);
* the ``_xsrf`` cookie on every dashboard page. Voila's page sends a shutdown
  beacon when it closes, but the beacon is refused (403) while the cookie is
  missing, so closed pages would leave their kernels running until culled.
  Voila's ``prelaunch_hook`` can set the cookie too, but it cannot be combined
  with a warm kernel pool; setting it in the page handler can.

It also marks the dashboards as trusted in a signature store that lives only
in the server's memory (``NotebookNotary.db_file`` in ``voila.json``), so the
log does not warn that they are "not trusted": they carry no outputs, the
server runs them itself, and the user's own Jupyter trust database is left
alone.
"""

from __future__ import annotations

import re
from pathlib import Path
from typing import Any

import nbformat
import tornado.web
from jupyter_server.utils import url_path_join
from voila.app import Voila
from voila.tornado.handler import TornadoVoilaHandler

from ..vendor import PLOTLY_BASIC, js_version

#: the route of the static plotly.js, under the server's base URL
PLOTLY_ROUTE = "loadscope/static/"
PLOTLY_FILE = PLOTLY_BASIC.name


def plotly_url(base_url: str = "/") -> str:
    """Absolute path (under ``base_url``) the page loads plotly.js from; the
    version in the query makes it safe to cache for good.

    >>> plotly_url("/team/").startswith("/team/loadscope/static/plotly-basic.min.js?v=")
    True
    """
    return url_path_join(base_url, PLOTLY_ROUTE, PLOTLY_FILE) + f"?v={js_version(PLOTLY_BASIC)}"


class _PlotlyHandler(tornado.web.StaticFileHandler):
    """Serves the one plotly.js file; cached by the browser for a year
    (the URL carries plotly.js's version, so an upgrade gets a new URL)."""

    def get_cache_time(self, path: str, modified: Any, mime_type: str) -> int:
        return 365 * 24 * 3600

    def set_extra_headers(self, path: str) -> None:
        self.set_header("Cache-Control", "public, max-age=31536000, immutable")


class _PageHandler(TornadoVoilaHandler):
    """A dashboard page that also sets the ``_xsrf`` cookie its shutdown beacon needs."""

    async def prepare(self) -> None:
        pending = super().prepare()     # authenticates: the cookie depends on the user
        if pending is not None:
            await pending
        self.xsrf_token  # noqa: B018 - reading it sets the cookie


class DashboardServer(Voila):
    """Voila with the plotly route, the cookie-setting page handler and the
    dashboards signed as trusted."""

    def init_settings(self) -> dict:
        settings = super().init_settings()         # makes the contents manager
        notary = self.contents_manager.notary
        for notebook in sorted(Path(self.root_dir).glob("*.ipynb")):
            notary.sign(nbformat.read(notebook, as_version=nbformat.NO_CONVERT))
        return settings

    def init_handlers(self) -> list:
        handlers = []
        for spec in super().init_handlers():
            if len(spec) > 1 and spec[1] is TornadoVoilaHandler:
                spec = (spec[0], _PageHandler, *spec[2:])
            handlers.append(spec)
        route = url_path_join(self.server_url, PLOTLY_ROUTE, "(" + re.escape(PLOTLY_FILE) + ")")
        handlers.insert(0, (route, _PlotlyHandler, {"path": str(PLOTLY_BASIC.parent)}))
        return handlers
