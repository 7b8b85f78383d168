"""``loadscope solve --format html``: the report written to a file or to
standard output, and a one-line error when plotly is missing."""

from __future__ import annotations

import sys

import pytest

from loadscope import CAUTION
from loadscope.cli import main


@pytest.fixture(scope="module")
def demo_file(tmp_path_factory):
    path = tmp_path_factory.mktemp("cli_html") / "d.json"
    assert main(["demo", "--write", str(path)]) == 0
    return path


def test_html_report_written_to_a_file(demo_file, tmp_path, capsys):
    out = tmp_path / "report.html"
    assert main(["solve", str(demo_file), "--format", "html", "--units", "us", "--out", str(out)]) == 0
    assert capsys.readouterr().err.strip() == f"wrote {out}"
    text = out.read_text(encoding="utf-8")
    assert text.startswith("<!DOCTYPE html>") and text.rstrip().endswith("</html>")
    assert CAUTION in text and "Rx [lbf]" in text
    # The CLI rates the drive: the margins of each load case and of the duty cycle are in the page.
    assert 'id="margins"' in text and 'id="margins-duty-cycle"' in text


def test_html_report_to_standard_output(demo_file, capsys):
    assert main(["solve", str(demo_file), "--format", "html"]) == 0
    out = capsys.readouterr().out
    assert out.startswith("<!DOCTYPE html>") and "Rx [N]" in out


def test_html_without_plotly_is_one_line_and_status_2(demo_file, tmp_path, monkeypatch, capsys):
    monkeypatch.setitem(sys.modules, "plotly.offline", None)
    out = tmp_path / "r.html"
    assert main(["solve", str(demo_file), "--format", "html", "--out", str(out)]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "pip install 'loadscope[report]'" in err and "Traceback" not in err
    assert not out.exists()
