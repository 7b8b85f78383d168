"""The 3D force scene of a solved drive, as plain plotly figure data.

Hardware is drawn from the drive (shafts as stepped surfaces of revolution,
gears and pulleys as pitch-circle discs with a ring, bearings as rings round
their seats, mounting bolts as markers); loads are arrows: every tooth force
with its tail at the mesh's pitch point, every bearing reaction (the force
the support exerts on the shaft) on its line of action through the seat
centre, its tail one bearing-ring radius out from the centre (so the shaft
does not hide it), and the strand pulls and point loads of pulleys and loads. Component weights
are not drawn (they are listed in the result tables).

Arrow length = |F| * scale, exactly; the head sits inside that length. With
``arrow_scale=None`` the largest arrow is ``SIZES["arrow_share"]`` of the
drive's size (the largest side of the box round the hardware); pass the
``layout["meta"]["arrow_scale"]`` of an earlier figure to keep arrows
comparable while a slider moves.

Trace order is fixed for a drive topology (same shafts, sections, elements,
supports, meshes, bolts); array lengths depend only on that topology too, so a
parameter change alters only the x/y/z (and i/j/k-free) arrays, hover texts,
``visible`` flags and a few layout entries (see
:func:`loadscope.viz.figure_update`). Trace order:

=====  ==========================================================
index  trace
=====  ==========================================================
0..n-1 one mesh3d per shaft, in drive order
n      gear and pulley discs (mesh3d)
n+1    gear and pulley pitch rings (lines)
n+2    bearing rings (lines)
n+3    mounting bolts (markers; empty when there is no housing)
n+4    tooth-force arrow shafts (lines), n+5 their heads (mesh3d)
n+6    reaction arrow shafts (lines),   n+7 their heads (mesh3d)
n+8    strand-pull and load arrows,      n+9 their heads (mesh3d)
=====  ==========================================================

Within an arrow trace, arrows follow ``result.teeth`` order, then shaft and
support order for reactions, then shaft and action order for other loads.
Each arrow is three line vertices (tail, tip, gap) and ``head_sides + 1``
head vertices.
"""

from __future__ import annotations

import math
from collections.abc import Collection, Iterable
from typing import Any

import numpy as np
from numpy.typing import NDArray

from .. import CAUTION
from ..errors import InputError
from ..kernel.model import Shaft
from ..kernel.solve import DriveResult
from ..report.units import convert, label, system
from .focus import kept as kept_shafts
from .focus import shaft_focus
from .style import PALETTE, SIZES, axis_3d, base_layout, caution_annotation, number

FloatArray = NDArray[np.float64]

SHOW_CHOICES = ("applied", "reactions", "both")


def _ring(center: FloatArray, e1: FloatArray, e2: FloatArray, radius: float, sides: int) -> FloatArray:
    """``sides`` points round a circle (not closed), shape (sides, 3)."""
    t = np.linspace(0.0, 2.0 * math.pi, sides, endpoint=False)
    return center + radius * (np.outer(np.cos(t), e1) + np.outer(np.sin(t), e2))


def _polylines(loops: list[FloatArray], closed: bool) -> tuple[list, list, list]:
    """x, y, z lists of several polylines separated by ``None`` gaps."""
    xs: list[Any] = []
    ys: list[Any] = []
    zs: list[Any] = []
    for pts in loops:
        p = np.vstack([pts, pts[:1]]) if closed else pts
        xs += p[:, 0].tolist() + [None]
        ys += p[:, 1].tolist() + [None]
        zs += p[:, 2].tolist() + [None]
    return xs, ys, zs


def _shaft_surface(shaft: Shaft, frame: FloatArray, sides: int) -> tuple[FloatArray, list[int], list[int], list[int]]:
    """Vertices [m] and triangles of a stepped shaft: its outer profile
    (0, 0) -> (0, r1) -> (b1, r1) -> (b1, r2) -> ... -> (L, 0) revolved."""
    prof_s = [0.0]
    prof_r = [0.0]
    start = 0.0
    for sec in shaft.sections:
        prof_s += [start, start + sec.length]
        prof_r += [sec.diameter / 2.0, sec.diameter / 2.0]
        start += sec.length
    prof_s.append(start)
    prof_r.append(0.0)
    s = np.asarray(prof_s)
    r = np.asarray(prof_r)
    t = np.linspace(0.0, 2.0 * math.pi, sides, endpoint=False)
    radial = np.outer(np.cos(t), frame[1]) + np.outer(np.sin(t), frame[2])          # (sides, 3)
    origin = np.asarray(shaft.origin, dtype=float)
    verts = (origin + s[:, None, None] * frame[0] + r[:, None, None] * radial[None]).reshape(-1, 3)
    p = np.arange(s.size - 1)[:, None]
    j = np.arange(sides)[None, :]
    a = p * sides + j
    b = p * sides + (j + 1) % sides
    c = a + sides
    d = b + sides
    i_idx = np.concatenate([a, a], axis=None).tolist()
    j_idx = np.concatenate([b, d], axis=None).tolist()
    k_idx = np.concatenate([d, c], axis=None).tolist()
    return verts, i_idx, j_idx, k_idx


def _seat_radius(shaft: Shaft, at: float) -> float:
    """Largest section radius touching axial position ``at`` [m]."""
    start = 0.0
    best = 0.0
    for sec in shaft.sections:
        if start - 1e-12 <= at <= start + sec.length + 1e-12:
            best = max(best, sec.diameter / 2.0)
        start += sec.length
    return best


def _perpendicular(d: FloatArray) -> tuple[FloatArray, FloatArray]:
    """Two unit vectors perpendicular to each row of unit vectors ``d``."""
    helper = np.where(np.abs(d[:, [0]]) < 0.9, np.array([[1.0, 0.0, 0.0]]), np.array([[0.0, 1.0, 0.0]]))
    u = np.cross(d, helper)
    u /= np.linalg.norm(u, axis=1, keepdims=True)
    return u, np.cross(d, u)


def _arrows(tails: FloatArray, vectors: FloatArray, head_len: float, texts: list[str]) -> tuple[dict, dict]:
    """Line and head-mesh data of arrows from ``tails`` along ``vectors``
    (display lengths, shape (n, 3)); tip = tail + vector exactly."""
    n = tails.shape[0]
    sides = int(SIZES["head_sides"])
    tips = tails + vectors
    xs: list[Any] = []
    ys: list[Any] = []
    zs: list[Any] = []
    line_text: list[str] = []
    for k in range(n):
        xs += [float(tails[k, 0]), float(tips[k, 0]), None]
        ys += [float(tails[k, 1]), float(tips[k, 1]), None]
        zs += [float(tails[k, 2]), float(tips[k, 2]), None]
        line_text += [texts[k], texts[k], ""]
    length = np.linalg.norm(vectors, axis=1) if n else np.zeros(0)
    safe = np.where(length > 0.0, length, 1.0)
    d = vectors / safe[:, None] if n else np.zeros((0, 3))
    d[length == 0.0] = (1.0, 0.0, 0.0)          # a zero arrow collapses to its tail; any direction does
    h = np.minimum(head_len, SIZES["head_max"] * length)
    u, w = _perpendicular(d) if n else (np.zeros((0, 3)), np.zeros((0, 3)))
    t = np.linspace(0.0, 2.0 * math.pi, sides, endpoint=False)
    rad = (SIZES["head_radius"] * h)[:, None, None]
    base = (tips - h[:, None] * d)[:, None, :] + rad * (np.cos(t)[None, :, None] * u[:, None, :]
                                                       + np.sin(t)[None, :, None] * w[:, None, :])
    verts = np.concatenate([tips[:, None, :], base], axis=1).reshape(-1, 3)
    off = (np.arange(n) * (sides + 1))[:, None]
    jj = np.arange(sides)[None, :]
    # sides of the cone (apex, b_j, b_j+1) and the base fan (b_0, b_j, b_j+1)
    fan = np.arange(1, sides - 1)[None, :]
    i_idx = np.concatenate([np.broadcast_to(off, (n, sides)), np.broadcast_to(off + 1, (n, sides - 2))], axis=1)
    j_idx = np.concatenate([off + 1 + jj, off + 1 + fan], axis=1)
    k_idx = np.concatenate([off + 1 + (jj + 1) % sides, off + 2 + fan], axis=1)
    head_text = [texts[k] for k in range(n) for _ in range(sides + 1)]
    line = {"x": xs, "y": ys, "z": zs, "hovertext": line_text}
    head = {"x": verts[:, 0].tolist(), "y": verts[:, 1].tolist(), "z": verts[:, 2].tolist(),
            "i": i_idx.reshape(-1).tolist(), "j": j_idx.reshape(-1).tolist(), "k": k_idx.reshape(-1).tolist(),
            "hovertext": head_text}
    return line, head


def _xyz(f: FloatArray, units: str) -> str:
    fu = label(units, "force")
    c = convert(f, units, "force")
    return f"x {number(c[0])}, y {number(c[1])}, z {number(c[2])} {fu}"


def _load_arrows(result: DriveResult, units: str,
                 kept: Collection[str]) -> dict[str, tuple[FloatArray, FloatArray, list[str]]]:
    """Tails [m], force vectors [N] and hover texts of each arrow group, of
    the shafts in ``kept``."""
    fu = label(units, "force")
    tails = []
    forces = []
    texts = []
    for t in result.teeth:
        if t.shaft not in kept:
            continue
        tails.append(t.point)
        forces.append(t.force)
        texts.append(f"{t.mesh} · {t.gear} ({t.role}, shaft {t.shaft})<br>"
                     f"tangential {number(convert(t.tangential, units, 'force'))} {fu}, "
                     f"radial {number(convert(t.radial, units, 'force'))} {fu}, "
                     f"axial {number(convert(t.axial, units, 'force'))} {fu}<br>"
                     f"|F| {number(convert(float(np.linalg.norm(t.force)), units, 'force'))} {fu}; "
                     f"{_xyz(t.force, units)}")
    groups = {"tooth": (np.asarray(tails).reshape(-1, 3), np.asarray(forces).reshape(-1, 3), texts)}
    tails, forces, texts = [], [], []
    for sr in kept_shafts(result, kept):
        sh = result.drive.shaft(sr.id)
        sol = sr.solution
        origin = np.asarray(sh.origin, dtype=float)
        for sp, rl, rg in zip(sh.supports, sol.reactions_local, sol.reactions_global):
            norm = float(np.linalg.norm(rg))
            # On the line of action through the seat centre, one bearing-ring radius out, so the
            # shaft does not hide the arrow.
            offset = SIZES["bearing_ring"] * _seat_radius(sh, sp.at) * (rg / norm if norm > 0 else 0.0)
            tails.append(origin + sp.at * sol.frame[0] + offset)
            forces.append(rg)
            texts.append(f"{sr.id} · bearing {sp.id} ({sp.axial})<br>"
                         f"radial {number(convert(float(np.hypot(rl[1], rl[2])), units, 'force'))} {fu}, "
                         f"axial {number(convert(abs(float(rl[0])), units, 'force'))} {fu}<br>"
                         f"|R| {number(convert(float(np.linalg.norm(rg)), units, 'force'))} {fu}; "
                         f"{_xyz(rg, units)}")
    groups["reaction"] = (np.asarray(tails).reshape(-1, 3), np.asarray(forces).reshape(-1, 3), texts)
    tails, forces, texts = [], [], []
    for sr in kept_shafts(result, kept):
        for a in sr.actions:
            if a.kind not in ("strand", "load"):
                continue
            tails.append(a.point)
            forces.append(a.force)
            what = "strand pull" if a.kind == "strand" else "applied load"
            texts.append(f"{sr.id} · {a.source} ({what})<br>"
                         f"|F| {number(convert(float(np.linalg.norm(a.force)), units, 'force'))} {fu}; "
                         f"{_xyz(a.force, units)}")
    groups["other"] = (np.asarray(tails).reshape(-1, 3), np.asarray(forces).reshape(-1, 3), texts)
    return groups


def _gear_geometry(result: DriveResult, kept: Collection[str]) -> list[tuple[str, FloatArray, FloatArray, float]]:
    """(hover text, centre [m], frame, radius [m]) of every gear and pulley
    of the shafts in ``kept``; meshed gears use the operating pitch radius,
    so the ring passes through the pitch point."""
    operating: dict[tuple[str, str], tuple[float, FloatArray]] = {}
    for fl in result.train.meshes:
        g = fl.geometry
        for k in (0, 1):
            sid = result.drive.shafts[g.shaft[k]].id
            operating[(sid, g.gear[k].id)] = (g.radius[k], g.center[k])
    out = []
    for sr in kept_shafts(result, kept):
        sh = result.drive.shaft(sr.id)
        frame = sr.solution.frame
        origin = np.asarray(sh.origin, dtype=float)
        for gr in sh.gears:
            r, c = operating.get((sh.id, gr.id), (gr.pitch_radius, origin + gr.at * frame[0]))
            teeth = f", {gr.teeth} teeth" if gr.teeth else ""
            out.append((f"{sh.id} · gear {gr.id} ({gr.kind}{teeth})", np.asarray(c, dtype=float), frame, r))
        for pu in sh.pulleys:
            out.append((f"{sh.id} · pulley {pu.id}", origin + pu.at * frame[0], frame, pu.pitch_radius))
    return out


def force_scene(result: DriveResult, units: str = "si", show: str = "applied",
                arrow_scale: float | None = None, shafts: Iterable[str] | None = None) -> dict[str, Any]:
    """The 3D scene of a solved drive with its force arrows.

    Parameters
    ----------
    result : DriveResult
        A solved drive.
    units : str
        ``"si"`` (mm, N) or ``"us"`` (in, lbf): coordinates, hover values and
        axis titles.
    show : str
        Which arrows start visible: ``"applied"`` (tooth forces, strand pulls
        and loads), ``"reactions"`` (bearing reactions) or ``"both"``. Hidden
        arrows stay in the figure as legend-only traces (one click shows
        them), so every choice has the same trace structure.
    arrow_scale : float or None
        Arrow length per force [m/N], independent of ``units``; ``None``
        scales the largest force to ``SIZES["arrow_share"]`` of the drive's
        size. The scale used is returned in ``layout["meta"]["arrow_scale"]``.
    shafts : iterable of str or None
        The shafts to draw (ids); ``None`` draws the whole drive. With a
        choice, only those shafts are drawn with their gears, pulleys and
        bearings, and only the arrows acting on them (every tooth force,
        reaction, strand pull and load on those shafts); the mounting bolts
        (the housing's) are left out. The automatic arrow scale and the
        drive's size then come from what is drawn. The trace order stays as
        below (the shaft traces are those of the chosen shafts).

    Returns
    -------
    dict
        ``{"data": [...], "layout": {...}}`` of plain lists, floats and
        strings (JSON-ready); see the module docstring for the trace order.

    Examples
    --------
    >>> from loadscope import solve
    >>> from loadscope.spec import demo_snapshot, drive_from_snapshot
    >>> spec = force_scene(solve(drive_from_snapshot(demo_snapshot())), show="both")
    >>> [t["name"] for t in spec["data"]][3:8]
    ['gears and pulleys', 'gears and pulleys', 'bearings', 'mounting bolts', 'tooth forces']
    >>> spec["layout"]["scene"]["camera"]["up"]
    {'x': 0.0, 'y': 1.0, 'z': 0.0}
    >>> pair = force_scene(solve(drive_from_snapshot(demo_snapshot())), shafts=["input", "intermediate"])
    >>> [t["hovertext"].split(":")[0] for t in pair["data"][:2]], pair["layout"]["meta"]["shafts"]
    (['shaft input', 'shaft intermediate'], ['input', 'intermediate'])
    """
    system(units)
    if show not in SHOW_CHOICES:
        raise InputError("show", f"unknown choice {show!r}", ", ".join(SHOW_CHOICES))
    if arrow_scale is not None and (isinstance(arrow_scale, bool) or not isinstance(arrow_scale, int | float)
                                    or not math.isfinite(arrow_scale) or arrow_scale <= 0.0):
        raise InputError("arrow_scale", f"must be a positive finite number or None, got {arrow_scale!r}",
                         "> 0 m/N, or None for automatic")
    focus = shaft_focus(result, shafts)
    lu = label(units, "length")
    fu = label(units, "force")

    def disp(points: FloatArray) -> FloatArray:
        return np.asarray(convert(np.asarray(points, dtype=float), units, "length"))

    data: list[dict[str, Any]] = []
    hardware: list[FloatArray] = []
    sides = int(SIZES["shaft_sides"])
    for n, sr in enumerate(kept_shafts(result, focus)):
        sh = result.drive.shaft(sr.id)
        verts, ii, jj, kk = _shaft_surface(sh, sr.solution.frame, sides)
        hardware.append(verts)
        dia = "/".join(number(convert(sec.diameter, units, "length")) for sec in sh.sections)
        v = disp(verts)
        data.append({"type": "mesh3d", "name": "shafts", "legendgroup": "shafts", "showlegend": n == 0,
                     "x": v[:, 0].tolist(), "y": v[:, 1].tolist(), "z": v[:, 2].tolist(), "i": ii, "j": jj, "k": kk,
                     "color": PALETTE["shaft"], "flatshading": True, "hoverinfo": "text",
                     "hovertext": f"shaft {sh.id}: length {number(convert(sh.length, units, 'length'))} {lu}, "
                                  f"section diameters {dia} {lu}",
                     "lighting": {"ambient": 0.55, "diffuse": 0.7, "specular": 0.15}})

    ring_sides = int(SIZES["ring_sides"])
    discs_v = []
    rings = []
    ring_text: list[str] = []
    for text, c, fr, r in _gear_geometry(result, focus):
        pts = _ring(c, fr[1], fr[2], r, ring_sides)
        discs_v.append(np.vstack([c[None, :], pts]))
        rings.append(pts)
        hardware.append(pts)
        ring_text += [f"{text}<br>pitch diameter {number(convert(2 * r, units, 'length'))} {lu}"] * (ring_sides + 2)
    dv = disp(np.vstack(discs_v)) if discs_v else np.zeros((0, 3))
    base = (np.arange(len(discs_v)) * (ring_sides + 1))[:, None]
    jr = np.arange(ring_sides)[None, :]
    data.append({"type": "mesh3d", "name": "gears and pulleys", "legendgroup": "gears", "showlegend": False,
                 "x": dv[:, 0].tolist(), "y": dv[:, 1].tolist(), "z": dv[:, 2].tolist(),
                 "i": np.broadcast_to(base, (len(discs_v), ring_sides)).reshape(-1).tolist(),
                 "j": (base + 1 + jr).reshape(-1).tolist(),
                 "k": (base + 1 + (jr + 1) % ring_sides).reshape(-1).tolist(),
                 "color": PALETTE["gear"], "opacity": SIZES["gear_opacity"], "hoverinfo": "skip",
                 "flatshading": True})
    xs, ys, zs = _polylines([disp(p) for p in rings], closed=True)
    data.append({"type": "scatter3d", "mode": "lines", "name": "gears and pulleys", "legendgroup": "gears",
                 "x": xs, "y": ys, "z": zs, "line": {"color": PALETTE["gear"], "width": SIZES["ring_width"]},
                 "hoverinfo": "text", "hovertext": ring_text})

    b_rings = []
    b_text: list[str] = []
    for sr in kept_shafts(result, focus):
        sh = result.drive.shaft(sr.id)
        fr = sr.solution.frame
        origin = np.asarray(sh.origin, dtype=float)
        for sp in sh.supports:
            pts = _ring(origin + sp.at * fr[0], fr[1], fr[2], SIZES["bearing_ring"] * _seat_radius(sh, sp.at),
                        ring_sides)
            b_rings.append(pts)
            hardware.append(pts)
            # The reaction's values live on its arrow: this text then changes only with the layout.
            b_text += [f"{sh.id} · bearing {sp.id} ({sp.axial}) at "
                       f"{number(convert(sp.at, units, 'length'))} {lu}"] * (ring_sides + 2)
    xs, ys, zs = _polylines([disp(p) for p in b_rings], closed=True)
    data.append({"type": "scatter3d", "mode": "lines", "name": "bearings", "legendgroup": "bearings",
                 "x": xs, "y": ys, "z": zs, "line": {"color": PALETTE["bearing"], "width": SIZES["bearing_width"]},
                 "hoverinfo": "text", "hovertext": b_text})

    h = result.housing
    # the bolts hold the housing, not the shafts: drawn with the whole drive only
    bolts = result.drive.housing.bolts if result.drive.housing is not None and shafts is None else ()
    bp = np.array([b.position for b in bolts], dtype=float).reshape(-1, 3)
    if bp.size:
        hardware.append(bp)
    bolt_text = []
    for k, b in enumerate(bolts):
        assert h is not None
        ten = float(h.bolts.tension[k])
        bolt_text.append(f"bolt {b.id}<br>{'tension' if ten >= 0 else 'compression'} "
                         f"{number(convert(abs(ten), units, 'force'))} {fu}, "
                         f"shear {number(convert(float(h.bolts.shear[k]), units, 'force'))} {fu}")
    bd = disp(bp)
    data.append({"type": "scatter3d", "mode": "markers", "name": "mounting bolts", "legendgroup": "bolts",
                 "showlegend": bool(bolts), "x": bd[:, 0].tolist(), "y": bd[:, 1].tolist(), "z": bd[:, 2].tolist(),
                 "marker": {"color": PALETTE["bolt"], "size": SIZES["bolt_marker"], "symbol": "diamond"},
                 "hoverinfo": "text", "hovertext": bolt_text})

    box = np.vstack(hardware)
    size_m = float((box.max(axis=0) - box.min(axis=0)).max())
    groups = _load_arrows(result, units, focus)
    f_max = max(float(np.linalg.norm(g[1], axis=1).max(initial=0.0)) for g in groups.values())
    scale = arrow_scale if arrow_scale is not None else (SIZES["arrow_share"] * size_m / f_max if f_max > 0 else 0.0)
    size = float(convert(size_m, units, "length"))
    head_len = SIZES["head_share"] * size
    visible = {"tooth": show in ("applied", "both"), "reaction": show in ("reactions", "both"),
               "other": show in ("applied", "both")}
    names = {"tooth": "tooth forces", "reaction": "bearing reactions", "other": "strand pulls and loads"}
    colours = {"tooth": PALETTE["applied"], "reaction": PALETTE["reaction"], "other": PALETTE["other_load"]}
    for key, (tails, forces, texts) in groups.items():
        line, head = _arrows(disp(tails), disp(forces * scale), head_len, texts)
        vis: bool | str = True if visible[key] else "legendonly"
        # a kind of load with no arrow in this view (the number depends on the topology only) keeps its trace
        # but leaves the legend
        data.append({"type": "scatter3d", "mode": "lines", "name": names[key], "legendgroup": key,
                     "showlegend": len(texts) > 0, "visible": vis, **line, "hoverinfo": "text",
                     "line": {"color": colours[key], "width": SIZES["arrow_width"]}})
        data.append({"type": "mesh3d", "name": names[key], "legendgroup": key, "showlegend": False,
                     "visible": vis, **head, "hoverinfo": "text", "color": colours[key], "flatshading": True})

    per_unit = 1.0 / float(convert(scale, units, "length") / convert(1.0, units, "force")) if scale > 0 else 0.0
    layout = base_layout(SIZES["scene_height"])
    layout.update({
        "title": {"text": f"Forces [{fu}] · {result.drive.name or 'drive'}"
                          + ("" if shafts is None else " · shafts " + ", ".join(focus)), "x": 0.01, "xanchor": "left"},
        "uirevision": "force_scene",
        "margin": {"l": 0, "r": 0, "t": 80, "b": 40},
        "legend": {**layout["legend"], "orientation": "h", "x": 0.0, "y": 1.0, "yanchor": "bottom"},
        "scene": {"xaxis": axis_3d(f"x [{lu}]"), "yaxis": axis_3d(f"y (up) [{lu}]"), "zaxis": axis_3d(f"z [{lu}]"),
                  "aspectmode": "data", "uirevision": "force_scene",
                  "camera": {"up": {"x": 0.0, "y": 1.0, "z": 0.0}, "eye": {"x": 1.1, "y": 0.75, "z": 1.45},
                             "center": {"x": 0.0, "y": 0.0, "z": 0.0}}},
        "annotations": [
            {"text": f"arrow length: 1 {lu} = {number(per_unit)} {fu}", "xref": "paper", "yref": "paper",
             "x": 1.0, "y": 0.0, "xanchor": "right", "yanchor": "bottom", "showarrow": False,
             "font": {"color": PALETTE["faint"]}},
            caution_annotation(),
        ],
        "meta": {"figure": "force_scene", "units": units, "show": show, "arrow_scale": scale,
                 "arrow_scale_unit": "m/N", "size": size,
                 "shafts": None if shafts is None else list(focus), "caution": CAUTION},
    })
    return {"data": data, "layout": layout}

