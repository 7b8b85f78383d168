"""Margins tables: one per load case and one for the duty cycle, sorted by
margin, in SI or US display units, with the caution.

Unit factors: NIST SP 811 Appendix B (1 in = 25.4 mm exactly)."""

from __future__ import annotations

import json
import math

import pytest

from loadscope import CAUTION, rate, report, spec


@pytest.fixture(scope="module")
def ratings():
    return rate(spec.drive_from_snapshot(spec.demo_snapshot()))


def test_one_table_per_case_and_the_duty_cycle(ratings):
    tables = report.margins_tables(ratings)
    assert list(tables) == ["rated", "part load", "jam", "duty cycle"]
    for name, df in tables.items():
        assert df.attrs["caution"] == CAUTION
        assert list(df["margin"]) == sorted(df["margin"])
        assert set(df["case"]) == {name}
        assert set(df["status"]) <= {"pass", "watch", "fail"}
        assert df["method"].str.len().min() > 10
        # the governing check only: each component once
        assert not df.duplicated(["kind", "component"]).any()
        assert {"bearing", "shaft section", "stiffness", "mesh", "bolt"} <= set(df["kind"])


def test_every_check_is_available_too(ratings):
    all_checks = report.margins_table(ratings, "rated", every_check=True)
    governing = report.margins_table(ratings, "rated")
    assert len(all_checks) > len(governing)
    assert len(all_checks) == len(ratings.case("rated").checks)


def test_us_units_convert_lengths_and_keep_lives_and_factors(ratings):
    si = report.margins_table(ratings, "rated", units="si").set_index(["kind", "component"])
    us = report.margins_table(ratings, "rated", units="us").set_index(["kind", "component"])
    assert "at [mm]" in si.columns and "at [in]" in us.columns
    row = ("stiffness", "output at g4")
    assert si.loc[row, "unit"] in ("mm", "mrad")
    b = ("bearing", "output/F")
    assert us.loc[b, "value"] == si.loc[b, "value"] and us.loc[b, "unit"] == "h"
    assert us.loc[b, "at [in]"] == pytest.approx(si.loc[b, "at [mm]"] / 25.4, rel=1e-12)
    assert us.loc[b, "margin"] == si.loc[b, "margin"]


def test_unknown_case_is_an_input_error(ratings):
    from loadscope import InputError
    with pytest.raises(InputError) as exc:
        report.margins_table(ratings, "overload")
    assert exc.value.path == "case" and "rated" in exc.value.accepted


def test_json_document_is_strict_json_with_the_caution(ratings):
    doc = report.ratings_to_dict(ratings)
    text = json.dumps(doc, allow_nan=False)      # infinite margins are written as "inf"
    back = json.loads(text)
    assert back["caution"] == CAUTION and back["watch_band"] == 0.1
    assert [c["name"] for c in back["cases"]] == ["rated", "part load", "jam"]
    assert math.fsum(c["share"] for c in back["cases"]) == pytest.approx(1.0)
    assert back["duty_cycle"]["margins"]
    for c in back["cases"]:
        margins = [m["margin"] for m in c["margins"]]
        finite = [m for m in margins if m != "inf"]
        assert finite == sorted(finite)


def test_text_has_a_table_per_case_the_duty_cycle_and_the_caution(ratings):
    text = report.margins_text(ratings)
    for name in ("'rated'", "'part load'", "'jam'"):
        assert f"Load case {name}" in text
    assert "Duty cycle" in text and text.rstrip().endswith(CAUTION)
    assert "ISO 281" in text and "DE-Goodman" in text and "ISO 898-1" in text
