"""Margins tables: the governing check of every rated component, per load
case and for the duty cycle, sorted by margin, in display units.

Every table and document here carries the caution (``loadscope.CAUTION``):
a margin is a preliminary-design figure, to be checked by a qualified
engineer under the local codes and standards.
"""

from __future__ import annotations

import math
from typing import Any

from .. import CAUTION
from ..kernel.ratingcheck import WATCH_BAND, RatingCheck, governing
from ..kernel.ratings import DUTY_CYCLE, DriveRatings
from .results import text_table
from .units import convert, label

#: Quantity kinds of a check that are shown as they are (no unit system).
_PLAIN = {"life": "h", "factor": "-", "ratio": "-"}

COLUMNS = ("case", "kind", "component", "at", "check", "value", "allowable", "unit", "margin", "status", "sizing",
           "method")


def _size(value: float, units: str, kind: str) -> str:
    return f"{_number(float(convert(value, units, kind)))} {label(units, kind)}"


def sizing(c: RatingCheck, units: str = "si") -> str:
    """The part's size beside the smallest size that meets the check, in
    display units: a shaft section's diameter and minimum diameter (the
    larger of the fatigue and yield ones, and which governs), a bearing's C
    or C0 and the rating that just reaches its target; "" for other checks.

    >>> from loadscope.kernel.ratingcheck import RatingCheck
    >>> c = RatingCheck("rated", "shaft section", "s at g", "fatigue factor", 2.0, 1.5, "factor", "min", "x",
    ...                 details={"diameter": 0.048, "d_min": 0.039, "d_min_fatigue": 0.039, "d_min_yield": 0.03})
    >>> sizing(c)
    'd 48 mm, d_min 39 mm (fatigue)'
    """
    d = c.details
    if "d_min" in d:
        if d["d_min"] <= 0.0:
            return f"d {_size(d['diameter'], units, 'length')}, unloaded"
        gov = "yield" if d["d_min_yield"] > d["d_min_fatigue"] else "fatigue"
        return f"d {_size(d['diameter'], units, 'length')}, d_min {_size(d['d_min'], units, 'length')} ({gov})"
    if "required_C0" in d:
        return f"C0 {_size(d['C0'], units, 'force')}, C0 needed {_size(d['required_C0'], units, 'force')}"
    if "required_C" in d and "C" in d:
        return f"C {_size(d['C'], units, 'force')}, C needed {_size(d['required_C'], units, 'force')}"
    return ""


def _unit(kind: str, units: str) -> str:
    return _PLAIN.get(kind) or label(units, kind)


def _show(value: float, kind: str, units: str) -> float:
    if kind in _PLAIN or not math.isfinite(value):
        return float(value)
    return float(convert(value, units, kind))


def check_row(c: RatingCheck, units: str = "si") -> dict[str, Any]:
    """One check as a plain row in display units: the columns of
    :data:`COLUMNS` (``at`` in the display length unit or None, ``margin`` a
    fraction: 0.25 is 25 % to spare, inf for an unloaded part)."""
    return {"case": c.case, "kind": c.kind, "component": c.component,
            "at": None if c.at is None else float(convert(c.at, units, "length")), "check": c.check,
            "value": _show(c.value, c.unit, units), "allowable": _show(c.allowable, c.unit, units),
            "unit": _unit(c.unit, units), "margin": c.margin, "status": c.status, "sizing": sizing(c, units),
            "method": c.method}


def case_names(ratings: DriveRatings) -> list[str]:
    """The names of the tables: each load case in order, then ``duty cycle``."""
    return [cr.case.name for cr in ratings.cases] + [DUTY_CYCLE]


def _checks(ratings: DriveRatings, case: str) -> tuple[RatingCheck, ...]:
    if case == DUTY_CYCLE:
        return ratings.duty
    for cr in ratings.cases:
        if cr.case.name == case:
            return cr.checks
    from ..errors import InputError
    raise InputError("case", f"no load case {case!r}", ", ".join(case_names(ratings)))


def margins_rows(ratings: DriveRatings, case: str, units: str = "si", every_check: bool = False) -> list[dict]:
    """Rows of one table (a case name or ``"duty cycle"``): the governing
    check of each component, or with ``every_check`` all checks, sorted by
    margin (smallest first)."""
    checks = _checks(ratings, case)
    chosen = sorted(checks, key=lambda c: (c.margin, c.kind, c.component)) if every_check else governing(checks)
    return [check_row(c, units) for c in chosen]


def margins_table(ratings: DriveRatings, case: str, units: str = "si", every_check: bool = False) -> Any:
    """The margins of one load case (or ``"duty cycle"``) as a pandas
    DataFrame, sorted by margin; the value, allowable and at columns carry
    their unit in the ``unit`` column and the header. ``df.attrs["caution"]``
    holds the caution."""
    import pandas as pd

    rows = margins_rows(ratings, case, units, every_check)
    df = pd.DataFrame(rows, columns=list(COLUMNS))
    df = df.rename(columns={"at": f"at [{label(units, 'length')}]"})
    df.attrs["caution"] = CAUTION
    df.attrs["case"] = case
    return df


def margins_tables(ratings: DriveRatings, units: str = "si", every_check: bool = False) -> dict[str, Any]:
    """One margins DataFrame per load case, then the duty cycle's (keys: the
    case names and ``"duty cycle"``)."""
    return {name: margins_table(ratings, name, units, every_check) for name in case_names(ratings)}


def _json_number(x: float) -> float | str:
    return x if math.isfinite(x) else ("inf" if x > 0 else "-inf")


def ratings_to_dict(ratings: DriveRatings, units: str = "si", loads: bool = False) -> dict[str, Any]:
    """The ratings as JSON-ready data: the caution, the watch band, the
    display units of ``at`` and of each case's power, torque and speed, each
    load case (its inputs and its margins; with ``loads`` also every load of
    the case, as :func:`~loadscope.report.result_to_dict` gives them) and the
    duty cycle. Infinite margins (unloaded parts) are written as the string
    ``"inf"``."""
    from .results import result_to_dict

    def rows(case: str) -> list[dict[str, Any]]:
        checks = {(c.kind, c.component, c.check): c for c in _checks(ratings, case)}
        out = []
        for r in margins_rows(ratings, case, units):
            row: dict[str, Any] = {k: (_json_number(v) if isinstance(v, float) else v) for k, v in r.items()}
            det = checks[(r["kind"], r["component"], r["check"])].details
            row["details_si"] = {k: _json_number(float(v)) for k, v in det.items()}
            out.append(row)
        return out

    cases = []
    for cr in ratings.cases:
        c = cr.case
        cases.append({"name": c.name, "share": c.share,
                      "power": None if c.power is None else float(convert(c.power, units, "power")),
                      "torque": None if c.torque is None else float(convert(c.torque, units, "moment")),
                      "speed": float(convert(cr.result.drive.speed, units, "speed")),
                      "margins": rows(c.name)})
        if loads:
            doc = result_to_dict(cr.result, units)
            cases[-1]["loads"] = {k: v for k, v in doc.items() if k not in ("format", "version", "caution")}
    shown = {"at": label(units, "length"), "power": label(units, "power"), "torque": label(units, "moment"),
             "speed": label(units, "speed")}
    return {"caution": CAUTION, "watch_band": WATCH_BAND, "units": shown,
            "details_si": "intermediate numbers in SI units (N, m, Pa, rad/s, rad; lives in h, or 10^6 rev for "
                          "L10 and Lnm)",
            "margin": "allowable/value - 1 for limits not to exceed, value/allowable - 1 for values to reach; "
                      "\"inf\" (margin, and the value of a factor or life) marks a part that carries no load",
            "cases": cases, "duty_cycle": {"name": DUTY_CYCLE, "margins": rows(DUTY_CYCLE)}}


def _number(v: float) -> str:
    """Four significant digits, grouped and without an exponent from 0.001
    up to 10 million (a life reads 21,290 h, not 2.129e+04 h)."""
    if v == 0.0:
        return "0"
    mag = math.floor(math.log10(abs(v)))
    if not -3 <= mag < 7:
        return f"{v:.4g}"
    text = f"{v:,.{max(0, 3 - mag)}f}"
    return text.rstrip("0").rstrip(".") if "." in text else text


def _cell(v: Any, col: str) -> str:
    # An infinite margin means the part carries no load here (a shaft end beyond the last element, a
    # section with no moment or torque): say so in words rather than print "inf".
    if v is None:
        return ""
    if col == "margin":
        return "unloaded" if math.isinf(v) else "> +999 %" if v > 9.99 else f"{v * 100:+.1f} %"
    if isinstance(v, float):
        return "no load" if math.isinf(v) else _number(v)
    return str(v)


def margins_text(ratings: DriveRatings, units: str = "si") -> str:
    """Plain-text margins tables, one per load case and one for the duty
    cycle, ending with the caution."""
    cols = ["kind", "component", "at", "check", "value", "allowable", "unit", "margin", "status", "sizing", "method"]
    heads = [f"at [{label(units, 'length')}]" if c == "at" else c for c in cols]
    parts = [f"Margins (pass / watch within {WATCH_BAND:.0%} of the limit / fail); governing check of each "
             "component, smallest margin first"]
    for cr in ratings.cases:
        c = cr.case
        sp = convert(cr.result.drive.speed, units, "speed")
        what = f"{c.share:.0%} of the time"
        if c.power is not None:
            what += f", power {_number(convert(c.power, units, 'power'))} {label(units, 'power')}"
        elif c.torque is not None:
            what += f", torque {_number(convert(c.torque, units, 'moment'))} {label(units, 'moment')}"
        what += f", input speed {_number(sp)} {label(units, 'speed')}"
        parts += ["", f"Load case {c.name!r} ({what})", _table(heads, margins_rows(ratings, c.name, units), cols)]
    parts += ["", "Duty cycle (bearing life by Palmgren-Miner over the cases; other parts at their worst case)",
              _table(heads, margins_rows(ratings, DUTY_CYCLE, units), cols)]
    parts += ["", "CAUTION: " + CAUTION]
    return "\n".join(parts) + "\n"


def _table(heads: list[str], rows: list[dict[str, Any]], cols: list[str]) -> str:
    if not rows:
        return "(nothing to rate: add bearing, material or fastener data)"
    right = {i for i, c in enumerate(cols) if c in ("at", "value", "allowable", "margin")}
    return text_table(heads, [[_cell(r[c], c) for c in cols] for r in rows], right)


CSV_FIELDS = ("group", "item", "quantity", "x", "y", "z", "value", "unit", "case", "kind", "allowable", "margin",
              "status", "method")


def loads_and_margins_csv(result: Any, ratings: DriveRatings, units: str = "si") -> str:
    """One CSV text: every load of ``result`` (as :func:`~loadscope.report.to_csv`
    writes them) followed by every governing check of every case and the duty
    cycle (group ``margin``, item the component, quantity the check), with
    the extra columns case, kind, allowable, margin, status, method; the
    last row (group ``caution``) carries the caution in its method column."""
    import csv
    import io

    from .results import rows as load_rows

    buf = io.StringIO()
    w = csv.DictWriter(buf, fieldnames=list(CSV_FIELDS), lineterminator="\n", restval="")
    w.writeheader()

    def fmt(v: Any) -> Any:
        if isinstance(v, float):
            return "inf" if math.isinf(v) else f"{v:.9g}"
        return "" if v is None else v

    for r in load_rows(result, units):
        w.writerow({k: fmt(v) for k, v in r.items()})
    for name in case_names(ratings):
        for r in margins_rows(ratings, name, units):
            w.writerow({k: fmt(v) for k, v in {
                "group": "margin", "item": r["component"], "quantity": r["check"], "value": r["value"],
                "unit": r["unit"], "case": r["case"], "kind": r["kind"], "allowable": r["allowable"],
                "margin": r["margin"], "status": r["status"], "method": r["method"]}.items()})
    w.writerow({"group": "caution", "unit": "-", "method": CAUTION})
    return buf.getvalue()
