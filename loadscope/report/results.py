"""Turn a solved drive into what people read and keep: a JSON document,
CSV rows, pandas tables and a plain-text report."""

from __future__ import annotations

import csv
import io
import json
from typing import Any

import numpy as np

from .. import CAUTION
from ..errors import InputError
from ..kernel.solve import DriveResult
from .units import convert, label


def _v(x: Any, units: str, kind: str) -> Any:
    arr = convert(np.asarray(x, dtype=float), units, kind)
    return [float(c) for c in arr] if arr.ndim else float(arr)


def result_to_dict(result: DriveResult, units: str = "si") -> dict[str, Any]:
    """Every load of the drive as plain JSON-ready data in display units.

    Holds each shaft's speed, torque and power, every bearing reaction
    vector (global x, y, z; radial and axial parts), every tooth force vector
    at its pitch point, the housing load, each bolt's load and the
    equilibrium residuals (relative residuals are unitless).
    """
    kinds = ("force", "moment", "length", "speed", "power", "deflection", "slope")
    out: dict[str, Any] = {
        "format": "loadscope.result", "version": 1, "drive": result.drive.name,
        "caution": CAUTION,
        "units": {k: label(units, k) for k in kinds},
        "frame": "global x, y, z; y up; reactions are forces the supports exert on the shaft",
        "power_in": _v(result.train.power_in, units, "power"),
        "power_out": _v(result.train.power_out, units, "power"),
    }
    shafts = []
    for sr in result.shafts:
        sol = sr.solution
        reactions = []
        for sid, rl, rg in zip(sol.support_ids, sol.reactions_local, sol.reactions_global):
            reactions.append({"support": sid, "force": _v(rg, units, "force"),
                              "radial": _v(float(np.hypot(rl[1], rl[2])), units, "force"),
                              "axial": _v(float(rl[0]), units, "force")})
        d = sol.diagram
        i_m = int(np.argmax(d["M"]))
        i_v = int(np.argmax(d["deflection"]))
        shafts.append({
            "id": sr.id, "speed": _v(sr.speed, units, "speed"), "torque": _v(sr.torque, units, "moment"),
            "power": _v(sr.power, units, "power"), "reactions": reactions,
            "max_bending": {"at": _v(d["s"][i_m], units, "length"), "moment": _v(d["M"][i_m], units, "moment")},
            "max_deflection": {"at": _v(d["s"][i_v], units, "length"),
                               "deflection": _v(d["deflection"][i_v], units, "deflection")},
        })
    out["shafts"] = shafts
    meshes: dict[str, dict[str, Any]] = {}
    for fl in result.train.meshes:
        g = fl.geometry
        meshes[g.mesh_id] = {"id": g.mesh_id, "kind": g.kind, "pitch_point": _v(g.point, units, "length"),
                             "driver": g.gear[fl.driver].id, "power": _v(fl.power, units, "power"),
                             "loss_torque": _v(fl.loss_torque, units, "moment"), "teeth": []}
    for t in result.teeth:
        meshes[t.mesh]["teeth"].append({"gear": t.gear, "shaft": t.shaft, "role": t.role,
                                        "force": _v(t.force, units, "force"),
                                        "tangential": _v(t.tangential, units, "force"),
                                        "radial": _v(t.radial, units, "force"),
                                        "axial": _v(t.axial, units, "force")})
    out["meshes"] = list(meshes.values())
    h = result.housing
    if h is not None:
        out["housing"] = {
            "reference": _v(h.reference, units, "length"),
            "force": _v(h.force, units, "force"), "moment": _v(h.moment, units, "moment"),
            "bolts": [{"id": bid, "force": _v(f, units, "force"), "shear": _v(s, units, "force"),
                       "tension": _v(t, units, "force")}
                      for bid, f, s, t in zip(h.bolt_ids, h.bolts.force, h.bolts.shear, h.bolts.tension)],
        }
    out["residuals"] = {k: dict(v) for k, v in result.residuals.items()}
    out["max_residual"] = result.max_residual
    return out


def mesh_summary(result: DriveResult, mesh_id: str, units: str = "si") -> dict[str, Any]:
    """What a drive engineer reads off one gear pair, in display units.

    Keys: ``mesh``, ``kind``, ``gears`` and ``shafts`` (the two gears and
    the shafts that carry them, in the mesh's order), ``driver`` (the gear
    that gives power), ``rows``: ``[quantity, value, unit]`` lists of the
    transmitted (tangential) force W_t, the radial and axial tooth forces
    (one row each when both gears see the same, as in spur and helical
    pairs; one per gear in a bevel pair), the power through the mesh, the
    speed ratio n_driver / n_driven, the centre distance (or the shaft
    angle of a bevel pair), each gear's operating pitch diameter and the
    pitch-line speed v = |omega| r (at the mean cone radius of a bevel
    pair). Every number is the kernel's (``result.train``, ``result.teeth``).

    >>> from loadscope import solve
    >>> from loadscope.spec import demo_snapshot, drive_from_snapshot
    >>> s = mesh_summary(solve(drive_from_snapshot(demo_snapshot())), "stage1")
    >>> s["shafts"], s["driver"], [r[0] for r in s["rows"]][:3]
    (['input', 'intermediate'], 'p1', ['transmitted force W_t', 'radial force', 'axial force'])
    """
    flows = {fl.geometry.mesh_id: fl for fl in result.train.meshes}
    if mesh_id not in flows:
        raise InputError("mesh", f"no mesh {mesh_id!r} in this drive", ", ".join(flows) or "(no meshes)")
    fl = flows[mesh_id]
    g = fl.geometry
    drive = result.drive
    shafts = [drive.shafts[g.shaft[k]].id for k in (0, 1)]
    teeth = {t.gear: t for t in result.teeth if t.mesh == mesh_id}
    gears = [g.gear[0].id, g.gear[1].id]
    f, L = label(units, "force"), label(units, "length")
    rows: list[list[Any]] = [["transmitted force W_t", _v(fl.tangential, units, "force"), f]]
    for part in ("radial", "axial"):
        a, b = (getattr(teeth[gid], part) for gid in gears)
        if abs(a - b) <= 1e-9 * max(abs(a), abs(b), 1e-300):
            rows.append([f"{part} force", _v(a, units, "force"), f])
        else:
            rows += [[f"{part} force on {gid}", _v(v, units, "force"), f] for gid, v in zip(gears, (a, b))]
    w_drv = float(result.train.speed[g.shaft[fl.driver]])
    w_dvn = float(result.train.speed[g.shaft[1 - fl.driver]])
    rows.append(["power through the mesh", _v(fl.power, units, "power"), label(units, "power")])
    rows.append(["speed ratio n_driver / n_driven", abs(w_drv / w_dvn), "-"])
    axes = [np.asarray(drive.shafts[g.shaft[k]].axis, dtype=float) for k in (0, 1)]
    if g.kind == "bevel":
        angle = float(np.arccos(np.clip(abs(float(axes[0] @ axes[1])), 0.0, 1.0)))
        rows.append(["shaft angle", _v(angle, units, "angle"), label(units, "angle")])
    else:
        d = g.center[1] - g.center[0]
        rows.append(["centre distance", _v(float(np.linalg.norm(d - (d @ axes[0]) * axes[0])), units, "length"), L])
    rows += [[f"pitch diameter of {gid}", _v(2.0 * g.radius[k], units, "length"), L] for k, gid in enumerate(gears)]
    v = abs(float(result.train.speed[g.shaft[0]])) * g.radius[0]
    rows.append(["pitch-line speed", _v(v, units, "velocity"), label(units, "velocity")])
    return {"mesh": mesh_id, "kind": g.kind, "gears": gears, "shafts": shafts, "driver": gears[fl.driver],
            "rows": rows}


def to_json(result: DriveResult, units: str = "si", indent: int = 2) -> str:
    """The result document as JSON text."""
    return json.dumps(result_to_dict(result, units), indent=indent)


def rows(result: DriveResult, units: str = "si") -> list[dict[str, Any]]:
    """Flat rows (group, item, quantity, x, y, z, value, unit) of every load."""
    d = result_to_dict(result, units)
    u = d["units"]
    out: list[dict[str, Any]] = []

    def add(group: str, item: str, qty: str, value: Any, unit: str) -> None:
        row: dict[str, Any] = {"group": group, "item": item, "quantity": qty, "x": "", "y": "", "z": "",
                               "value": "", "unit": unit}
        if isinstance(value, list):
            row.update(x=value[0], y=value[1], z=value[2], value=float(np.linalg.norm(value)))
        else:
            row["value"] = value
        out.append(row)

    for s in d["shafts"]:
        add("shaft", s["id"], "speed", s["speed"], u["speed"])
        add("shaft", s["id"], "torque", s["torque"], u["moment"])
        add("shaft", s["id"], "power", s["power"], u["power"])
        for r in s["reactions"]:
            add("reaction", f"{s['id']}.{r['support']}", "force", r["force"], u["force"])
            add("reaction", f"{s['id']}.{r['support']}", "radial", r["radial"], u["force"])
            add("reaction", f"{s['id']}.{r['support']}", "axial", r["axial"], u["force"])
    for m in d["meshes"]:
        for t in m["teeth"]:
            item = f"{m['id']}.{t['gear']}"
            add("tooth", item, "force", t["force"], u["force"])
            for part in ("tangential", "radial", "axial"):
                add("tooth", item, part, t[part], u["force"])
    if "housing" in d:
        add("housing", "drive", "force", d["housing"]["force"], u["force"])
        add("housing", "drive", "moment", d["housing"]["moment"], u["moment"])
        for b in d["housing"]["bolts"]:
            add("bolt", b["id"], "force", b["force"], u["force"])
            add("bolt", b["id"], "shear", b["shear"], u["force"])
            add("bolt", b["id"], "tension", b["tension"], u["force"])
    for k, v in d["residuals"].items():
        add("residual", k, "force_rel", v["force_rel"], "1")
        add("residual", k, "moment_rel", v["moment_rel"], "1")
    return out


def to_csv(result: DriveResult, units: str = "si") -> str:
    """Every load as CSV text (one row per quantity)."""
    buf = io.StringIO()
    fields = ["group", "item", "quantity", "x", "y", "z", "value", "unit"]
    w = csv.DictWriter(buf, fieldnames=fields, lineterminator="\n")
    w.writeheader()
    for r in rows(result, units):
        w.writerow({k: (f"{r[k]:.9g}" if isinstance(r[k], float) else r[k]) for k in fields})
    return buf.getvalue()


def table_rows(result: DriveResult, units: str = "si") -> dict[str, tuple[list[str], list[list[Any]]]]:
    """The load tables as ``{name: (column names, rows of plain values)}``:
    ``shafts``, ``reactions``, ``teeth`` and, with a housing, ``bolts``
    (what :func:`tables` turns into DataFrames; cheap enough for a widget
    to call on every slider move)."""
    d = result_to_dict(result, units)
    u = d["units"]
    f, m = u["force"], u["moment"]
    out = {
        "shafts": (["shaft", f"speed [{u['speed']}]", f"torque [{m}]", f"power [{u['power']}]",
                    f"max bending [{m}]", f"max deflection [{u['deflection']}]"],
                   [[s["id"], s["speed"], s["torque"], s["power"], s["max_bending"]["moment"],
                     s["max_deflection"]["deflection"]] for s in d["shafts"]]),
        "reactions": (["shaft", "support", f"Rx [{f}]", f"Ry [{f}]", f"Rz [{f}]", f"radial [{f}]", f"axial [{f}]"],
                      [[s["id"], r["support"], *r["force"], r["radial"], r["axial"]]
                       for s in d["shafts"] for r in s["reactions"]]),
        "teeth": (["mesh", "gear", "role", f"Fx [{f}]", f"Fy [{f}]", f"Fz [{f}]", f"tangential [{f}]",
                   f"radial [{f}]", f"axial [{f}]"],
                  [[mm["id"], t["gear"], t["role"], *t["force"], t["tangential"], t["radial"], t["axial"]]
                   for mm in d["meshes"] for t in mm["teeth"]]),
    }
    if "housing" in d:
        out["bolts"] = (["bolt", f"Fx [{f}]", f"Fy [{f}]", f"Fz [{f}]", f"shear [{f}]", f"tension [{f}]"],
                        [[b["id"], *b["force"], b["shear"], b["tension"]] for b in d["housing"]["bolts"]])
    return out


def tables(result: DriveResult, units: str = "si") -> dict[str, Any]:
    """pandas DataFrames: ``shafts``, ``reactions``, ``teeth``, ``bolts``."""
    import pandas as pd

    return {name: pd.DataFrame(body, columns=cols) for name, (cols, body) in table_rows(result, units).items()}


def text_table(headers: list[str], body: list[list[str]], right: set[int]) -> str:
    """A plain-text table: each column padded to its widest cell (the columns
    whose index is in ``right`` aligned right), a dashed rule under the headers."""
    cells = [list(headers)] + [list(r) for r in body]
    widths = [max(len(r[i]) for r in cells) for i in range(len(headers))]
    lines = ["  ".join(c.rjust(w) if j in right else c.ljust(w) for j, (c, w) in enumerate(zip(r, widths))).rstrip()
             for r in cells]
    lines.insert(1, "  ".join("-" * w for w in widths))
    return "\n".join(lines)


def _fmt_table(headers: list[str], body: list[list[Any]]) -> str:
    cells = [[(f"{c + 0.0:,.4g}" if isinstance(c, float) else str(c)) for c in r] for r in body]
    return text_table(headers, cells, set(range(1, len(headers))))


def to_text(result: DriveResult, units: str = "si") -> str:
    """A plain-text load report for a terminal."""
    d = result_to_dict(result, units)
    u = d["units"]
    f, m = u["force"], u["moment"]
    parts = [f"loadscope - loads of drive {d['drive']!r}",
             f"power in {d['power_in']:.4g} {u['power']}, out {d['power_out']:.4g} {u['power']}",
             "", "Shafts"]
    parts.append(_fmt_table(["shaft", f"speed [{u['speed']}]", f"torque [{m}]", f"power [{u['power']}]",
                             f"max M [{m}]", f"max deflection [{u['deflection']}]"],
                            [[s["id"], s["speed"], s["torque"], s["power"], s["max_bending"]["moment"],
                              s["max_deflection"]["deflection"]] for s in d["shafts"]]))
    parts += ["", "Bearing reactions (force of the support on the shaft, global x, y, z)"]
    parts.append(_fmt_table(["shaft", "support", f"Rx [{f}]", f"Ry [{f}]", f"Rz [{f}]", f"radial [{f}]",
                             f"axial [{f}]"],
                            [[s["id"], r["support"], *r["force"], r["radial"], r["axial"]]
                             for s in d["shafts"] for r in s["reactions"]]))
    parts += ["", "Tooth forces (at the pitch point, global x, y, z)"]
    parts.append(_fmt_table(["mesh", "gear", "role", f"Fx [{f}]", f"Fy [{f}]", f"Fz [{f}]", f"tangential [{f}]",
                             f"radial [{f}]", f"axial [{f}]"],
                            [[mm["id"], t["gear"], t["role"], *t["force"], t["tangential"], t["radial"], t["axial"]]
                             for mm in d["meshes"] for t in mm["teeth"]]))
    if "housing" in d:
        hh = d["housing"]
        parts += ["", "Housing: load the drive hands over, about the bolt-group centroid",
                  f"force  [{f}]: " + ", ".join(f"{c:,.4g}" for c in hh["force"]),
                  f"moment [{m}]: " + ", ".join(f"{c:,.4g}" for c in hh["moment"]),
                  "", "Mounting bolts (tension positive)"]
        parts.append(_fmt_table(["bolt", f"Fx [{f}]", f"Fy [{f}]", f"Fz [{f}]", f"shear [{f}]", f"tension [{f}]"],
                                [[b["id"], *b["force"], b["shear"], b["tension"]] for b in hh["bolts"]]))
    parts += ["", f"Largest relative equilibrium residual: {d['max_residual']:.2e}", "", "CAUTION: " + CAUTION]
    return "\n".join(parts) + "\n"
