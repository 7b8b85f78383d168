"""What a page's visitor can and cannot make the server do: no code of the
visitor's choosing runs in a kernel, no notebook source is served, and an
uploaded file is size-capped and read as JSON only."""

from __future__ import annotations

import json
import urllib.error
import urllib.request

import pytest
from dashboard_harness import Dashboard

from loadscope.widgets import MAX_UPLOAD

pytestmark = pytest.mark.browser

#: sends an execute_request and a kernel_info_request over a second websocket
#: to the page's own kernel (same origin, same cookies) and lists the replies
_PROBE = """async ({kid, path}) => {
  const ws = new WebSocket(`ws://${location.host}/api/kernels/${kid}/channels?session_id=probe`);
  await new Promise((ok, fail) => { ws.onopen = ok; ws.onerror = fail; });
  const got = [];
  ws.onmessage = (e) => {
    const m = JSON.parse(e.data);
    got.push({type: m.header.msg_type, parent: (m.parent_header || {}).msg_id || ''});
  };
  const send = (type, content, id) => ws.send(JSON.stringify({
    header: {msg_id: id, username: 'probe', session: 'probe', msg_type: type, version: '5.3',
             date: new Date().toISOString()},
    parent_header: {}, metadata: {}, content, channel: 'shell', buffers: []}));
  send('execute_request', {code: `open(${JSON.stringify(path)}, 'w').write('ran')`, silent: false,
       store_history: false, user_expressions: {}, allow_stdin: false, stop_on_error: true}, 'probe-exec');
  send('kernel_info_request', {}, 'probe-info');
  await new Promise((r) => setTimeout(r, 3000));
  ws.close();
  return got;
}"""


def _get(url: str) -> tuple[int, bytes]:
    try:
        with urllib.request.urlopen(url, timeout=30) as r:
            return r.status, r.read()
    except urllib.error.HTTPError as e:
        return e.code, e.read()


@pytest.fixture(scope="module")
def board(server, browser):
    """One gear-pair page shared by the page tests of this module."""
    context = browser.new_context(viewport={"width": 1200, "height": 900}, accept_downloads=True)
    page = Dashboard.open(context, server, "gear_pair")
    yield page
    page.close()
    context.close()


def test_execute_request_from_the_page_is_refused(board, tmp_path):
    target = tmp_path / "created-by-the-browser.txt"
    replies = board.page.evaluate(_PROBE, {"kid": board.kernel_id(), "path": str(target)})
    # the channel works: the kernel answered the harmless request ...
    assert {"type": "kernel_info_reply", "parent": "probe-info"} in replies
    # ... but never saw the execute request, and nothing was written
    assert not [m for m in replies if m["parent"] == "probe-exec"]
    board.page.wait_for_timeout(1000)
    assert not target.exists()


@pytest.mark.parametrize("path", [
    "voila/files/drive.ipynb",              # the raw file
    "api/contents/drive.ipynb",             # Jupyter's REST contents API
    "files/drive.ipynb",
    "api/kernels",                          # the list of kernels and the other REST APIs
    "api/sessions",
    "api/terminals",
    "voila/files/../loadscope/serving/voila.json",
])
def test_sources_and_rest_apis_are_not_served(server, path):
    status, body = _get(server.url + path)
    assert status in (403, 404, 405), (path, status)
    assert b"startup_snapshot" not in body


def test_contents_listing_carries_no_source(server):
    status, body = _get(server.url + "voila/api/contents/drive.ipynb?content=1")
    if status == 200:
        assert json.loads(body)["content"] is None
    assert b"startup_snapshot" not in body


def test_page_does_not_carry_the_notebook_source(board):
    html = board.page.content()
    assert "MeshExplorer" not in html and "startup_snapshot" not in html


def test_upload_is_capped_and_read_as_json_only(board, tmp_path):
    good = board.save_snapshot(tmp_path / "good.json").read_text()
    table, revs = board.table_text(), board.revs()

    big = tmp_path / "big.json"                          # a valid snapshot, padded past the cap
    snap = json.loads(good)
    snap["name"] = "x" * (MAX_UPLOAD + 1000)
    big.write_text(json.dumps(snap))
    board.open_snapshot(big)
    board.page.wait_for_function("() => document.querySelector('.loadscope-message').innerText.includes('bytes')",
                                 timeout=20_000)
    assert f"{MAX_UPLOAD}" in board.message().replace(",", "")

    literal = tmp_path / "literal.json"                  # a Python literal is not JSON: never evaluated
    literal.write_text(repr(json.loads(good)))
    board.open_snapshot(literal)
    board.page.wait_for_function("() => !document.querySelector('.loadscope-message').innerText.includes('bytes')",
                                 timeout=20_000)
    assert board.message().strip() != ""
    assert board.table_text() == table and board.revs() == revs
