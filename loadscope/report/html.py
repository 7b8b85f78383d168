"""The design-load report: one self-contained HTML file of a solved drive.

:func:`to_html` writes everything an engineer attaches to a design review
into one page that opens offline: the caution, the drive as entered (in
display units), every load (the tables of :func:`loadscope.report.tables`),
the force scene, the reaction bars and each shaft's diagrams as interactive
figures; when the ratings are given, the load cases with every bearing
reaction in each (and the reaction bars of all cases side by side) and the
margins tables; the methods and their published sources, a timestamp and
the loadscope version.

The page makes no network request: plotly.js comes from the installed
plotly package and is embedded once; the styles are a small inline sheet
with system fonts; there are no images or links outside the page. plotly is
imported only here (an optional extra: ``pip install 'loadscope[report]'``);
without it :func:`to_html` raises ``ImportError`` with that instruction.

Every number carries its unit in the column header or beside it; each table
cell also keeps the full-precision value in ``data-value`` so that a reader
(or a test) can recover it exactly.
"""

from __future__ import annotations

import html
import math
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass
from datetime import UTC, datetime
from typing import Any

import numpy as np

from .. import CAUTION, __version__
from ..kernel.model import Drive, Shaft
from ..kernel.solve import DriveResult
from ..viz import as_figure, force_scene, reaction_bars, shaft_diagrams
from ..viz.style import PALETTE, number
from .results import result_to_dict, tables
from .units import convert, label, system

#: What every report rests on: (topic, method, published source or basis).
LOAD_METHODS: tuple[tuple[str, str, str], ...] = (
    ("Tooth forces", "Tangential force from the transmitted torque at the pitch radius; radial and axial parts "
     "from the normal pressure angle and the helix angle; bevel gears at the mean cone radius",
     "Budynas & Nisbett, Shigley's Mechanical Engineering Design, 9th ed., Eqs. 13-36 (spur), 13-38 "
     "(straight bevel), 13-39 (helical); ISO 6336-1:2019, 6.1 (Ft = 2000 T / d)"),
    ("Torque flow", "Speeds from the tooth counts or pitch radii; power balance at every shaft with the mesh "
     "efficiencies; lost torque reacted by the housing", "statics of rigid bodies (common practice)"),
    ("Bearing reactions", "Each shaft a beam on simple supports; two supports in closed form, more by "
     "compatibility of deflections; axial load to the locating supports by their modes",
     "Euler-Bernoulli beam theory; checked against sympy's beam solver and PyNiteFEA in the test suite"),
    ("Shear, bending, torque, deflection", "Sampled on both sides of every station in two planes and the "
     "resultant; deflection by exact integration of M/EI over the stepped shaft (no shear deformation)",
     "Euler-Bernoulli beam theory"),
    ("Housing and bolts", "Resultant of all loads the drive hands to the housing about the bolt-group "
     "centroid; bolt shear and tension by the elastic method (or the tipping-edge variant)",
     "Shigley 9th ed., Sec. 8-12, Eqs. 8-55 to 8-57 (bolt groups in shear); Blodgett, Design of Welded "
     "Structures, 1966, Sec. 3.3 (tipping edge; common practice for foot-mounted machinery)"),
)

_STYLE = f"""
:root {{ --ink: {PALETTE['ink']}; --faint: {PALETTE['faint']}; --page: {PALETTE['page']};
  --plot: {PALETTE['plot']}; --grid: {PALETTE['grid']}; --accent: {PALETTE['reaction']};
  --warn: {PALETTE['applied']}; }}
* {{ box-sizing: border-box; }}
body {{ margin: 0 auto; max-width: 72rem; padding: 1.5rem 2rem 3rem; background: var(--page); color: var(--ink);
  font: 15px/1.45 "DejaVu Sans", Verdana, system-ui, sans-serif; }}
header {{ border-bottom: 3px solid var(--accent); margin-bottom: 1rem; }}
h1 {{ font-size: 1.6rem; margin: 0 0 .2rem; }}
h2 {{ font-size: 1.25rem; margin: 2rem 0 .6rem; padding-bottom: .2rem; border-bottom: 1px solid var(--grid); }}
h3 {{ font-size: 1.02rem; margin: 1.2rem 0 .4rem; }}
.meta {{ color: var(--faint); margin: 0 0 .6rem; }}
.caution {{ border: 2px solid var(--warn); border-left-width: .6rem; background: #FFF4EE; padding: .7rem 1rem;
  margin: 1rem 0; font-weight: 600; }}
nav ol {{ columns: 2; margin: .3rem 0; }}
table {{ border-collapse: collapse; margin: .3rem 0 1rem; font-variant-numeric: tabular-nums; }}
caption {{ text-align: left; color: var(--faint); padding-bottom: .2rem; }}
th, td {{ border-bottom: 1px solid var(--grid); padding: .22rem .6rem; text-align: right; vertical-align: top; }}
th {{ background: var(--plot); font-weight: 600; }}
th:first-child, td:first-child, td.text {{ text-align: left; }}
td[data-value] {{ white-space: nowrap; }}
tr.fail td {{ background: #FBE3DE; }} tr.watch td {{ background: #FDF3D8; }}
figure {{ margin: 1rem 0 2rem; }} figcaption {{ color: var(--faint); margin-top: .3rem; }}
dl.inputs {{ display: grid; grid-template-columns: max-content 1fr; gap: .15rem 1rem; }}
dl.inputs dt {{ color: var(--faint); }} dl.inputs dd {{ margin: 0; }}
footer {{ margin-top: 2.5rem; color: var(--faint); border-top: 1px solid var(--grid); padding-top: .6rem; }}
"""


def _plotly_js() -> str:
    try:
        from plotly.offline import get_plotlyjs
    except ImportError as exc:
        raise ImportError("the HTML report needs plotly: pip install 'loadscope[report]'") from exc
    return get_plotlyjs()


def _e(text: Any) -> str:
    return html.escape(str(text), quote=True)


@dataclass(frozen=True)
class _Shown:
    """A number shown in its own words (a margin in per cent), value kept exactly."""

    value: float
    text: str


def _cell(value: Any) -> str:
    """A table cell: numbers formatted for reading, the exact value kept in data-value."""
    if isinstance(value, _Shown):
        return f'<td data-value="{value.value!r}">{_e(value.text)}</td>'
    if isinstance(value, (float, int, np.floating, np.integer)) and not isinstance(value, bool):
        v = float(value)
        if not math.isfinite(v):
            return f'<td data-value="{v!r}">{"inf" if v > 0 else "-inf" if v < 0 else "n/a"}</td>'
        return f'<td data-value="{v!r}">{_e(number(v))}</td>'
    if value is None:
        return '<td class="text"></td>'
    return f'<td class="text">{_e(value)}</td>'


def _table(headers: Sequence[str], rows: Iterable[Sequence[Any]], caption: str = "", ident: str = "",
           row_classes: Sequence[str] | None = None) -> str:
    head = "".join(f'<th scope="col">{_e(h)}</th>' for h in headers)
    body = []
    for i, r in enumerate(rows):
        cls = f' class="{_e(row_classes[i])}"' if row_classes and row_classes[i] else ""
        body.append(f"<tr{cls}>" + "".join(_cell(c) for c in r) + "</tr>")
    cap = f"<caption>{_e(caption)}</caption>" if caption else ""
    idattr = f' id="{_e(ident)}"' if ident else ""
    return f"<table{idattr}>{cap}<thead><tr>{head}</tr></thead><tbody>{''.join(body)}</tbody></table>"


def _frame_table(df: Any, caption: str, ident: str) -> str:
    return _table([str(c) for c in df.columns], df.itertuples(index=False, name=None), caption, ident)


# --------------------------------------------------------------------------- inputs

def _u(units: str, kind: str) -> str:
    return label(units, kind)


def _c(value: float, units: str, kind: str) -> float:
    return float(convert(value, units, kind))


def _vec(v: Sequence[float], units: str, kind: str) -> str:
    return "(" + ", ".join(number(_c(c, units, kind)) for c in v) + f") {_u(units, kind)}"


def _port_text(port: Any, units: str) -> str:
    what = [f"shaft {port.shaft}, element {port.element}"]
    if port.power is not None:
        what.append(f"power {number(_c(port.power, units, 'power'))} {_u(units, 'power')}")
    if port.torque is not None:
        what.append(f"torque {number(_c(port.torque, units, 'moment'))} {_u(units, 'moment')}")
    if port.share != 1.0:
        what.append(f"share {number(port.share)}")
    return "; ".join(what)


def _shaft_inputs(s: Shaft, units: str) -> str:
    L, ang, F = _u(units, "length"), _u(units, "angle"), _u(units, "force")
    parts = [f'<h3 id="input-{_e(s.id)}">Shaft {_e(s.id)}</h3>',
             f'<dl class="inputs"><dt>origin</dt><dd>{_e(_vec(s.origin, units, "length"))}</dd>'
             f'<dt>axis</dt><dd>({", ".join(number(c) for c in s.axis)})</dd>'
             f'<dt>E, G</dt><dd>{number(_c(s.E, units, "stress"))}, {number(_c(s.G, units, "stress"))} '
             f'{_e(_u(units, "stress"))}</dd></dl>']
    parts.append(_table([f"length [{L}]", f"diameter [{L}]", f"bore [{L}]"],
                        [[_c(x.length, units, "length"), _c(x.diameter, units, "length"), _c(x.bore, units, "length")]
                         for x in s.sections], "sections, from the shaft origin along the axis"))
    parts.append(_table(["support", f"at [{L}]", "axial load taken"],
                        [[p.id, _c(p.at, units, "length"), p.axial] for p in s.supports], "supports"))
    if s.gears:
        parts.append(_table(
            ["gear", f"at [{L}]", "kind", f"pitch radius [{L}]", "teeth", f"pressure angle [{ang}]",
             f"helix angle [{ang}]", "hand", f"weight [{F}]"],
            [[g.id, _c(g.at, units, "length"), g.kind + (" (internal)" if g.internal else ""),
              _c(g.pitch_radius, units, "length"), g.teeth, _c(g.pressure_angle, units, "angle"),
              _c(g.helix_angle, units, "angle"), g.hand, _c(g.weight, units, "force")] for g in s.gears], "gears"))
    if s.pulleys:
        parts.append(_table(
            ["pulley", f"at [{L}]", f"pitch radius [{L}]", f"strand angles [{ang}]", "tension ratio", f"weight [{F}]"],
            [[p.id, _c(p.at, units, "length"), _c(p.pitch_radius, units, "length"),
              ", ".join(number(_c(a, units, "angle")) for a in p.strand_angles), p.tension_ratio,
              _c(p.weight, units, "force")] for p in s.pulleys], "pulleys and sprockets"))
    if s.couplings:
        parts.append(_table(["coupling", f"at [{L}]", f"weight [{F}]"],
                            [[c.id, _c(c.at, units, "length"), _c(c.weight, units, "force")] for c in s.couplings],
                            "couplings"))
    if s.loads:
        parts.append(_table(["load", f"at [{L}]", "force", "moment", "offset"],
                            [[p.id, _c(p.at, units, "length"), _vec(p.force, units, "force"),
                              _vec(p.moment, units, "moment"), _vec(p.offset, units, "length")] for p in s.loads],
                            "other loads (global components)"))
    return "\n".join(parts)


def _inputs(drive: Drive, units: str) -> str:
    sp = _u(units, "speed")
    out = ['<h2 id="inputs">Inputs</h2>',
           f'<dl class="inputs"><dt>drive</dt><dd>{_e(drive.name or "(unnamed)")}</dd>'
           f'<dt>input</dt><dd>{_e(_port_text(drive.input, units))}; speed {number(_c(drive.speed, units, "speed"))} '
           f'{_e(sp)}</dd>']
    for i, p in enumerate(drive.outputs):
        out.append(f"<dt>output {i + 1}</dt><dd>{_e(_port_text(p, units))}</dd>")
    out.append("</dl>")
    out += [_shaft_inputs(s, units) for s in drive.shafts]
    if drive.meshes:
        out += ['<h3 id="input-meshes">Meshes</h3>',
                _table(["mesh", "gears", "efficiency"], [[m.id, " / ".join(m.gears), m.efficiency]
                                                         for m in drive.meshes])]
    h = drive.housing
    if h is not None:
        out += ['<h3 id="input-housing">Housing</h3>',
                f'<dl class="inputs"><dt>mounting plane</dt><dd>through {_e(_vec(h.plane_point, units, "length"))}, '
                f'normal ({", ".join(number(c) for c in h.plane_normal)})</dd>'
                f'<dt>weight</dt><dd>{number(_c(h.weight, units, "force"))} {_e(_u(units, "force"))} at '
                f'{_e(_vec(h.center_of_mass, units, "length"))}</dd>'
                f'<dt>bolt method</dt><dd>{_e(h.bolt_method)}</dd></dl>',
                _table(["bolt", "position"], [[b.id, _vec(b.position, units, "length")] for b in h.bolts])]
    return "\n".join(out)


# --------------------------------------------------------------------------- loads and figures

def _loads(result: DriveResult, units: str) -> str:
    d = result_to_dict(result, units)
    t = tables(result, units)
    pw = d["units"]["power"]
    out = ['<h2 id="loads">Loads</h2>',
           f"<p>Power in {number(d['power_in'])} {_e(pw)}, out {number(d['power_out'])} {_e(pw)}. "
           "Reactions are the forces the supports exert on each shaft, in the global frame (x, y, z; y up); "
           "the housing receives their opposites.</p>",
           _frame_table(t["shafts"], "shafts: speed, torque, power and the largest bending moment and deflection",
                        "table-shafts"),
           _frame_table(t["reactions"], "bearing reactions", "table-reactions"),
           _frame_table(t["teeth"], "tooth forces at the pitch point", "table-teeth")]
    if "bolts" in t:
        h = d["housing"]
        out.append(f"<p>Load the drive hands to the housing, about the bolt-group centroid: force "
                   f"{_e(', '.join(number(c) for c in h['force']))} {_e(d['units']['force'])}, moment "
                   f"{_e(', '.join(number(c) for c in h['moment']))} {_e(d['units']['moment'])}.</p>")
        out.append(_frame_table(t["bolts"], "mounting bolts (tension positive)", "table-bolts"))
    out.append(f'<p>Largest relative equilibrium residual: <span id="max-residual">{result.max_residual:.2e}'
               "</span> (every balance of forces and moments is checked after the solve).</p>")
    return "\n".join(out)


def _figure(spec: dict[str, Any], ident: str, caption: str) -> str:
    import plotly.io as pio

    div = pio.to_html(as_figure(spec), full_html=False, include_plotlyjs=False, div_id=ident,
                      config={"displaylogo": False, "responsive": True})
    return f'<figure id="{_e(ident)}-figure">{div}<figcaption>{_e(caption)}</figcaption></figure>'


def _load_cases(ratings: Any, units: str) -> str:
    """The load cases of the ratings: what each is, and every bearing reaction in each."""
    f = label(units, "force")
    cases = [(cr.case, cr.result) for cr in ratings.cases]
    out = ['<h3 id="load-cases">Load cases</h3>',
           _table(["case", "share of time", f"input speed [{label(units, 'speed')}]",
                   f"power [{label(units, 'power')}]", f"torque [{label(units, 'moment')}]"],
                  [[c.name, c.share, _c(r.drive.speed, units, "speed"),
                    None if c.power is None else _c(c.power, units, "power"),
                    None if c.torque is None else _c(c.torque, units, "moment")] for c, r in cases],
                  "load cases (an empty power or torque keeps the drive's own)", "table-cases"),
           _table(["case", "shaft", "support", f"Rx [{f}]", f"Ry [{f}]", f"Rz [{f}]", f"radial [{f}]", f"axial [{f}]"],
                  [[c.name, sr.id, sid, *(_c(x, units, "force") for x in rg),
                    _c(float(np.hypot(rl[1], rl[2])), units, "force"), _c(float(rl[0]), units, "force")]
                   for c, r in cases for sr in r.shafts
                   for sid, rg, rl in zip(sr.solution.support_ids, sr.solution.reactions_global,
                                          sr.solution.reactions_local)],
                  "bearing reactions in each load case", "table-case-reactions")]
    return "\n".join(out)


def _figures(result: DriveResult, units: str, ratings: Any = None) -> str:
    cases = {cr.case.name: cr.result for cr in ratings.cases} if ratings is not None else None
    bars = "Radial and axial load of every bearing" + (", in each load case (one fill pattern per case)."
                                                        if cases else ".")
    out = ['<h2 id="figures">Figures</h2>',
           _figure(force_scene(result, units, show="both"), "fig-scene",
                   "The drive with its tooth forces and bearing reactions (drag to turn; click a legend entry to "
                   "show or hide it)."),
           _figure(reaction_bars(result, units, cases=cases), "fig-reactions", bars)]
    for s in result.shafts:
        out.append(_figure(shaft_diagrams(result, s.id, units), f"fig-shaft-{s.id}",
                           f"Shaft {s.id}: shear, bending, torque and deflection along the shaft, in both planes "
                           "and their resultant; bearings dashed, elements dotted."))
    return "\n".join(out)


# --------------------------------------------------------------------------- margins

MARGIN_COLUMNS = ("kind", "component", "at", "check", "value", "allowable", "unit", "margin", "status", "sizing",
                  "method")


def _margin(m: Any) -> _Shown | None:
    if m is None:
        return None
    m = float(m)
    text = "inf" if math.isinf(m) else "> +999 %" if m > 9.99 else f"{m * 100:+.1f} %"
    return _Shown(m, text)


def margins_section(margin_tables: Mapping[str, Sequence[Mapping[str, Any]]], units: str = "si") -> str:
    """The margins part of the report from plain rows: one table per load
    case (and the duty cycle), rows as :func:`loadscope.report.margins_rows`
    gives them (keys of ``MARGIN_COLUMNS``; ``margin`` a fraction, ``status``
    pass / watch / fail; ``sizing`` the part's size beside the smallest that
    meets the check, as the CLI prints it). Failing and watched rows are
    shaded."""
    out = ['<h2 id="margins">Margins</h2>',
           "<p>The governing check of each rated component, smallest margin first. Margin: allowable / value "
           "&minus; 1 for limits not to exceed, value / allowable &minus; 1 for values to reach.</p>"]
    length = label(units, "length")
    for name, rows in margin_tables.items():
        heads = [f"at [{length}]" if c == "at" else c for c in MARGIN_COLUMNS]
        body = [[_margin(r.get("margin")) if c == "margin" else r.get(c) for c in MARGIN_COLUMNS] for r in rows]
        classes = [str(r.get("status", "")) for r in rows]
        ident = "margins-" + "".join(ch if ch.isalnum() else "-" for ch in str(name))
        out.append(f"<h3>{_e(name)}</h3>")
        out.append(_table(heads, body, f"margins: {name}", ident, classes) if rows else
                   "<p>Nothing to rate: add bearing, material or fastener data.</p>")
    return "\n".join(out)


def _ratings_tables(ratings: Any, units: str) -> dict[str, list[dict[str, Any]]]:
    from . import margins  # the ratings layer of the report (loadscope.report.margins)

    return {name: margins.margins_rows(ratings, name, units) for name in margins.case_names(ratings)}


# --------------------------------------------------------------------------- page

def _methods(extra: Iterable[str], units: str) -> str:
    # A rating's method reads "method, source; details of this part": list each method once.
    rated = sorted({m.split(";")[0].strip() for m in extra if m})
    out = ['<h2 id="methods">Methods and sources</h2>',
           _table(["topic", "method", "source"], [list(r) for r in LOAD_METHODS], "how the loads are found")]
    if rated:
        out.append("<h3>Rating methods used in the margins</h3><p>Each method once; the margins tables give "
                   "every part's details and the source of its limit.</p><ul>"
                   + "".join(f"<li>{_e(m)}</li>" for m in rated) + "</ul>")
    out.append("<p>Display units: " + _e(", ".join(f"{k} {v[0]}" for k, v in system(units).items())) + ".</p>")
    return "\n".join(out)


def to_html(result: DriveResult, units: str = "si", ratings: Any = None) -> str:
    """The design-load report of a solved drive as one self-contained HTML page.

    Parameters
    ----------
    result : DriveResult
        The solved drive (:func:`loadscope.solve`).
    units : str
        ``"si"`` or ``"us"``: every value shown, with its unit beside it.
    ratings : DriveRatings, optional
        The ratings of the drive (per load case and duty cycle); when given
        the report adds its margins tables and the rating methods used.

    Returns
    -------
    str
        A complete HTML document (plotly.js embedded once, no network
        references), several MB because of the embedded plotly.js.

    Raises
    ------
    ImportError
        When plotly is not installed (``pip install 'loadscope[report]'``).
    InputError
        For an unknown unit system.
    """
    system(units)
    js = _plotly_js()
    name = result.drive.name or "drive"
    stamp = datetime.now(UTC).strftime("%Y-%m-%d %H:%M UTC")
    margin_tables = _ratings_tables(ratings, units) if ratings is not None else None
    methods_used = [r.get("method", "") for rows in (margin_tables or {}).values() for r in rows]
    toc = [("inputs", "Inputs"), ("loads", "Loads"), ("figures", "Figures")]
    if margin_tables is not None:
        toc[2:2] = [("load-cases", "Load cases")]
        toc.append(("margins", "Margins"))
    toc.append(("methods", "Methods and sources"))
    body = [
        f"<header><h1>Design loads: {_e(name)}</h1>",
        f'<p class="meta">Generated <time id="generated">{_e(stamp)}</time> by loadscope {_e(__version__)}; '
        f"units: {_e(units.upper())}.</p></header>",
        f'<p class="caution" id="caution" role="note"><strong>Caution.</strong> {_e(CAUTION)}</p>',
        "<nav><ol>" + "".join(f'<li><a href="#{a}">{_e(t)}</a></li>' for a, t in toc) + "</ol></nav>",
        "<main>", _inputs(result.drive, units), _loads(result, units),
        _load_cases(ratings, units) if ratings is not None else "", _figures(result, units, ratings),
        margins_section(margin_tables, units) if margin_tables is not None else "",
        _methods(methods_used, units), "</main>",
        f'<footer><p class="caution">{_e(CAUTION)}</p><p>loadscope {_e(__version__)}, {_e(stamp)}.</p></footer>',
    ]
    return ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            f"<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">"
            f"<meta name=\"generator\" content=\"loadscope {_e(__version__)}\">"
            f"<title>Design loads: {_e(name)}</title><style>{_STYLE}</style>"
            f'<script type="text/javascript">{js}</script></head>\n<body>\n' + "\n".join(body) + "\n</body></html>\n")
