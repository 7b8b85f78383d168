"""The self-contained HTML design-load report.

Checks: the page parses (every element closed in order), plotly.js is
embedded exactly once and nothing is fetched from the network, each shaft's
diagram is there, every bearing reaction in the page equals the kernel's
(each cell keeps its exact value in ``data-value``), the caution is shown
before the first table and again at the foot, the margins tables render
their rows, and a missing plotly gives a clear ImportError.
"""

from __future__ import annotations

import html
import re
import sys
from html.parser import HTMLParser

import numpy as np
import pytest

from loadscope import CAUTION, InputError, __version__, solve
from loadscope.report.html import margins_section, to_html
from loadscope.report.units import convert
from loadscope.spec import demo_snapshot, drive_from_snapshot

VOID = {"area", "base", "br", "col", "embed", "hr", "img", "input", "link", "meta", "source", "track", "wbr"}
URL_ATTRS = {"src", "href", "action", "data", "poster", "srcset", "formaction", "background", "cite"}


class Page(HTMLParser):
    """Elements in order, the script and style texts, and table cells by table id."""

    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.stack: list[str] = []
        self.errors: list[str] = []
        self.tags: list[tuple[str, dict[str, str | None]]] = []
        self.scripts: list[str] = []
        self.styles: list[str] = []
        self.text: list[str] = []
        self.tables: dict[str, list[list[tuple[str, str | None]]]] = {}
        self._table: str | None = None
        self._cell: tuple[str | None, list[str]] | None = None
        self._in: str | None = None

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        self.tags.append((tag, a))
        if tag not in VOID:
            self.stack.append(tag)
        if tag in ("script", "style"):
            self._in = tag
        if tag == "table":
            self._table = a.get("id") or f"anon{len(self.tables)}"
            self.tables[self._table] = []
        elif tag == "tr" and self._table:
            self.tables[self._table].append([])
        elif tag in ("td", "th") and self._table:
            self._cell = (a.get("data-value"), [])

    def handle_endtag(self, tag):
        if not self.stack or self.stack[-1] != tag:
            self.errors.append(f"</{tag}> closes {self.stack[-1] if self.stack else 'nothing'}")
            return
        self.stack.pop()
        if tag in ("script", "style"):
            self._in = None
        if tag in ("td", "th") and self._cell is not None and self._table:
            value, parts = self._cell
            self.tables[self._table][-1].append(("".join(parts), value))
            self._cell = None
        if tag == "table":
            self._table = None

    def handle_data(self, data):
        if self._in == "script":
            self.scripts.append(data)
        elif self._in == "style":
            self.styles.append(data)
        else:
            self.text.append(data)
            if self._cell is not None:
                self._cell[1].append(data)


def parse(text: str) -> Page:
    p = Page()
    p.feed(text)
    p.close()
    return p


@pytest.fixture(scope="module")
def result():
    return solve(drive_from_snapshot(demo_snapshot()))


@pytest.fixture(scope="module")
def page_text(result):
    return to_html(result)


@pytest.fixture(scope="module")
def page(page_text):
    return parse(page_text)


def test_page_parses_and_closes_every_element(page_text, page):
    assert page_text.startswith("<!DOCTYPE html>")
    assert page.errors == [] and page.stack == []
    assert [t for t, _ in page.tags[:3]] == ["html", "head", "meta"]


def test_plotly_js_embedded_once_and_nothing_fetched(page_text, page, result):
    from plotly.offline import get_plotlyjs

    head = get_plotlyjs()[:400]
    assert page_text.count(head) == 1
    # One figure for the scene, one for the reaction bars, one per shaft.
    assert page_text.count("Plotly.newPlot(") == 2 + len(result.shafts)
    for tag, attrs in page.tags:
        assert not (tag == "script" and attrs.get("src")), "no external script"
        assert tag not in ("link", "iframe", "img", "object", "embed", "base"), tag
        for key, value in attrs.items():
            if key in URL_ATTRS and value:
                assert value.startswith("#"), (tag, key, value)   # in-page anchors only
    styles = "".join(page.styles) + " ".join(a.get("style") or "" for _, a in page.tags)
    assert "url(" not in styles and "@import" not in styles and "@font-face" not in styles
    # The figure scripts (everything but the embedded library) name no URL either.
    own = [s for s in page.scripts if head not in s]
    assert own and not any(re.search(r"https?:|//[a-z]", s) for s in own)


def test_each_shaft_has_its_diagram(page_text, page, result):
    ids = {a.get("id") for _, a in page.tags}
    for s in result.shafts:
        assert f"fig-shaft-{s.id}" in ids
        i = page_text.index(f'id="fig-shaft-{s.id}"')
        call = page_text[i:page_text.index("</script>", i)]
        assert f"Shaft {s.id}: internal loads and deflection" in call
    assert {"fig-scene", "fig-reactions"} <= ids


@pytest.mark.parametrize("units", ["si", "us"])
def test_every_bearing_reaction_matches_the_kernel(result, units):
    page = parse(to_html(result, units))
    rows = page.tables["table-reactions"]
    heads = [h for h, _ in rows[0]]
    assert heads[:2] == ["shaft", "support"]
    body = rows[1:]
    expected = [(s.id, sid, rg, rl) for s in result.shafts
                for sid, rg, rl in zip(s.solution.support_ids, s.solution.reactions_global,
                                       s.solution.reactions_local)]
    assert len(body) == len(expected) == sum(len(s.supports) for s in result.drive.shafts)
    for row, (shaft, support, rg, rl) in zip(body, expected):
        assert (row[0][0], row[1][0]) == (shaft, support)
        got = np.array([float(v) for _, v in row[2:7]])
        want = convert(np.array([*rg, np.hypot(rl[1], rl[2]), rl[0]]), units, "force")
        np.testing.assert_allclose(got, want, rtol=1e-12, atol=1e-9)


def test_caution_timestamp_and_version(page_text, page):
    text = " ".join(page.text)
    assert text.count(CAUTION) >= 2
    caution_at = page_text.index('id="caution"')
    assert caution_at < page_text.index("<table")              # before any number
    assert f"loadscope {__version__}" in text
    assert re.search(r"Generated\s+\d{4}-\d\d-\d\d \d\d:\d\d UTC", text)
    assert "Methods and sources" in text and "Euler-Bernoulli" in text


def test_inputs_in_display_units(result):
    us = parse(to_html(result, "us"))
    tables = list(us.tables.values())
    heads = [h for t in tables for h, _ in t[0]]
    assert "diameter [in]" in heads and "pressure angle [deg]" in heads
    # The first section of the first shaft, in inches.
    sec = next(t for t in tables if t[0][1][0] == "diameter [in]")
    d0 = result.drive.shafts[0].sections[0].diameter
    assert float(sec[1][1][1]) == pytest.approx(d0 / 0.0254, rel=1e-12)


def test_margins_section_renders_rows():
    rows = [
        {"kind": "bearing", "component": "input.A", "at": 12.0, "check": "L10 life", "value": 900.0,
         "allowable": 20000.0, "unit": "h", "margin": -0.955, "status": "fail", "method": "ISO 281:2007"},
        {"kind": "bolt", "component": "B2", "at": None, "check": "proof", "value": 100.0, "allowable": 600.0,
         "unit": "MPa", "margin": float("inf"), "status": "pass", "method": "ISO 898-1"},
    ]
    text = margins_section({"rated": rows, "duty cycle": []})
    p = parse(text)
    assert p.errors == []
    t = p.tables["margins-rated"]
    assert [h for h, _ in t[0]][:3] == ["kind", "component", "at [mm]"]
    assert [c for c, _ in t[1]][7:9] == ["-95.5 %", "fail"] and t[2][7][0] == "inf"
    assert float(t[1][7][1]) == -0.955 and float(t[1][4][1]) == 900.0      # exact values kept
    assert 'class="fail"' in text and "Nothing to rate" in text


def test_ratings_render_when_given(result):
    from loadscope.kernel.ratings import rate
    from loadscope.report import case_names

    ratings = rate(result.drive)
    p = parse(to_html(result, ratings=ratings))
    for name in case_names(ratings):
        assert "margins-" + "".join(ch if ch.isalnum() else "-" for ch in name) in p.tables
    ids = {a.get("id") for _, a in p.tags}
    anchors = [a["href"][1:] for t, a in p.tags if t == "a"]
    assert "load-cases" in anchors and set(anchors) <= ids          # every contents entry lands somewhere
    # Every bearing reaction of every load case, equal to the kernel's for that case.
    rows = p.tables["table-case-reactions"][1:]
    expected = [(cr.case.name, sr.id, sid, rg) for cr in ratings.cases for sr in cr.result.shafts
                for sid, rg in zip(sr.solution.support_ids, sr.solution.reactions_global)]
    assert len(rows) == len(expected) and len(ratings.cases) >= 2
    for row, (case, shaft, support, rg) in zip(rows, expected):
        assert [c for c, _ in row[:3]] == [case, shaft, support]
        np.testing.assert_allclose([float(v) for _, v in row[3:6]], rg, rtol=1e-12, atol=1e-9)
    assert "Rating methods used in the margins" in " ".join(p.text)
    text = to_html(result, ratings=ratings)
    listed = [html.unescape(m) for m in re.findall(r"<li>([^<]*)</li>", text[text.index("Rating methods used"):])]
    assert listed and len(listed) == len(set(listed)) and not any(";" in m for m in listed)


def test_bad_units_and_missing_plotly(result, monkeypatch):
    with pytest.raises(InputError) as err:
        to_html(result, "imperial")
    assert err.value.path == "units"
    monkeypatch.setitem(sys.modules, "plotly.offline", None)
    with pytest.raises(ImportError, match=r"pip install 'loadscope\[report\]'"):
        to_html(result)


def test_without_housing_and_with_markup_in_names():
    import dataclasses

    snap = demo_snapshot()
    del snap["housing"]
    drive = dataclasses.replace(drive_from_snapshot(snap), name='<script>alert("x")</script> & co')
    text = to_html(solve(drive))
    p = parse(text)
    assert p.errors == [] and "table-bolts" not in p.tables and "table-reactions" in p.tables
    assert "<script>alert" not in text and "&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; co" in text


def test_margins_carry_the_sizing_the_cli_prints(tmp_path):
    """The report's sizing column holds, row by row, the sizing of the CLI's
    JSON margins (d, d_min; C, C needed; C0, C0 needed) in the same units."""
    import contextlib
    import io
    import json

    from loadscope.cli import main
    from loadscope.spec import dump_snapshot

    path = tmp_path / "demo.json"
    path.write_text(dump_snapshot(demo_snapshot()))
    out = io.StringIO()
    with contextlib.redirect_stdout(out):
        assert main(["solve", str(path), "--format", "json", "--units", "us"]) == 0
    assert main(["solve", str(path), "--format", "html", "--units", "us", "--out", str(tmp_path / "r.html")]) == 0
    cli = json.loads(out.getvalue())["ratings"]
    p = parse((tmp_path / "r.html").read_text())
    tables = {c["name"]: c["margins"] for c in cli["cases"]} | {"duty cycle": cli["duty_cycle"]["margins"]}
    for name, rows in tables.items():
        t = p.tables["margins-" + "".join(ch if ch.isalnum() else "-" for ch in name)]
        col = [h for h, _ in t[0]].index("sizing")
        assert [r[col][0] for r in t[1:]] == [r["sizing"] for r in rows], name
    assert any("d_min" in r["sizing"] and " in " in r["sizing"] for r in tables["duty cycle"])
    assert any("C needed" in r["sizing"] and "lbf" in r["sizing"] for r in tables["duty cycle"])
