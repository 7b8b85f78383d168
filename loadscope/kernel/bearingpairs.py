"""Paired angular-contact and tapered-roller bearings: induced axial forces
and the axial load on each bearing of a pair, by the catalogue method.

A radial load makes each bearing push the shaft axially by its induced
force, Fi = 0.5 Fr / Y for tapered rollers (Fi = 0.47 Fr / K in Timken's
form), Fi = R Fr for angular-contact ball bearings (R = 1.14 for a 40 deg
contact angle, catalogue practice). Each bearing carries at least its own
induced force, and the external thrust Ka goes to the bearing that faces it:
Fa_B = max(Fi_B, Fi_A + Ka), Fa_A = max(Fi_A, Fi_B - Ka). These two lines
are the whole of the catalogues' six-case table (cases 1a-1c, 2a-2c).
Every function broadcasts over numpy arrays; forces in [N]. Re-exported by
:mod:`loadscope.kernel.bearings`.

References
----------
.. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering
   Design, 9th ed., Sec. 11-9 (tapered roller bearings, induced load
   0.47 Fr / K).

Results are for preliminary design; they must be checked by a qualified
engineer, and local codes, standards and licensed practice govern.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ..errors import join_path
from . import arraychecks as ac

FloatArray = NDArray[np.float64]
Arrangement = Literal["X", "O", "face_to_face", "back_to_back"]


def tapered_roller_induced_load(radial: ArrayLike, y: ArrayLike, factor: float = 0.5, path: str = "") -> FloatArray:
    """Induced axial force of a tapered roller bearing under radial load.

    Fi = factor Fr / Y; factor = 0.5 with the catalogue Y (ISO-based
    catalogues), or 0.47 with Timken's thrust factor K in place of Y
    (Shigley 9th ed., Sec. 11-9; from memory).

    Parameters
    ----------
    radial : array_like
        Fr [N], >= 0.
    y : array_like
        Axial load factor Y (or K) of the bearing [-], > 0.
    factor : float
        0.5 (catalogue method) or 0.47 (Timken), 0 < factor <= 1.

    Examples
    --------
    >>> float(tapered_roller_induced_load(6000.0, 1.5))
    2000.0
    """
    fr = ac.non_negative(radial, join_path(path, "radial"), "N")
    yv = ac.positive(y, join_path(path, "y"))
    f = ac.within(factor, 0.0, 1.0, join_path(path, "factor"), lo_open=True)
    return ac.scalar_or_array(f * fr / yv)


def angular_contact_induced_load(radial: ArrayLike, ratio: ArrayLike = 1.14, path: str = "") -> FloatArray:
    """Induced axial force of an angular-contact ball bearing: Fi = R Fr.

    R = 1.14 is the catalogue value for 40 deg contact-angle bearings (equal
    to their e in ISO 281:2007 Table 3); give the bearing's own R otherwise.

    Parameters
    ----------
    radial : array_like
        Fr [N], >= 0.
    ratio : array_like
        R [-], > 0.

    Examples
    --------
    >>> float(angular_contact_induced_load(1000.0))
    1140.0
    """
    fr = ac.non_negative(radial, join_path(path, "radial"), "N")
    return ac.scalar_or_array(ac.positive(ratio, join_path(path, "ratio")) * fr)


@dataclass(frozen=True)
class PairAxialLoads:
    """Axial loads of a bearing pair; bearing 1 sits at the smaller axial
    position. ``axial`` [N] is what each bearing carries (>= its induced
    force); ``reaction`` [N] is the axial force each exerts on the shaft,
    signed along the shaft axis (reaction_1 + reaction_2 + thrust = 0);
    ``held`` is 1 or 2: the bearing left at its own induced force (the other
    takes that force plus the thrust)."""

    axial_1: FloatArray
    axial_2: FloatArray
    reaction_1: FloatArray
    reaction_2: FloatArray
    held: NDArray[np.float64] | float


_ARRANGEMENTS = {"X": (-1.0, 1.0), "face_to_face": (-1.0, 1.0), "O": (1.0, -1.0), "back_to_back": (1.0, -1.0)}


def paired_axial_loads(induced_1: ArrayLike, induced_2: ArrayLike, thrust: ArrayLike, arrangement: Arrangement,
                       path: str = "") -> PairAxialLoads:
    """Axial loads of two angular-contact or tapered-roller bearings that
    locate a shaft together (catalogue method; see the module docstring).

    In the O (back-to-back) arrangement the load lines meet the axis outside
    the span and each bearing stops the shaft moving toward the other; in the
    X (face-to-face) arrangement they meet inside it and each stops the shaft
    moving away from the other. The bearing that faces the thrust is B, the
    other A; Ka = |thrust|:

        Fa_B = max(Fi_B, Fi_A + Ka),   Fa_A = max(Fi_A, Fi_B - Ka)

    Parameters
    ----------
    induced_1, induced_2 : array_like
        Induced axial forces Fi [N] of bearings 1 and 2 (>= 0), e.g. from
        :func:`tapered_roller_induced_load`.
    thrust : array_like
        Net external axial force on the shaft [N], signed along the shaft
        axis (from a shaft solve: minus the sum of the axial reactions).
    arrangement : {"X", "O", "face_to_face", "back_to_back"}
    path : str
        Field-path prefix for error messages.

    Examples
    --------
    Back-to-back, Fi = 1000 N and 2000 N, 500 N of thrust toward +axis (taken
    by bearing 1 in O): bearing 1 carries 2500 N, bearing 2 its own 2000 N.

    >>> r = paired_axial_loads(1000.0, 2000.0, 500.0, "O")
    >>> float(r.axial_1), float(r.axial_2), int(r.held)
    (2500.0, 2000.0, 2)
    >>> float(r.reaction_1 + r.reaction_2)
    -500.0
    """
    a = ac.choice(arrangement, tuple(_ARRANGEMENTS), join_path(path, "arrangement"))
    d1, d2 = _ARRANGEMENTS[a]
    fi1 = ac.non_negative(induced_1, join_path(path, "induced_1"), "N")
    fi2 = ac.non_negative(induced_2, join_path(path, "induced_2"), "N")
    k = ac.finite(thrust, join_path(path, "thrust"), "N")
    fi1, fi2, k = np.broadcast_arrays(fi1, fi2, k)
    ka = np.abs(k)
    b_is_1 = np.sign(k) == d1        # bearing 1 faces the thrust
    fi_b = np.where(b_is_1, fi1, fi2)
    fi_a = np.where(b_is_1, fi2, fi1)
    fa_b = np.maximum(fi_b, fi_a + ka)
    fa_a = np.maximum(fi_a, fi_b - ka)
    fa1 = np.where(b_is_1, fa_b, fa_a)
    fa2 = np.where(b_is_1, fa_a, fa_b)
    a_held = fi_a + ka >= fi_b      # bearing A stays at its own induced force
    held = np.where(b_is_1 == a_held, 2, 1)
    return PairAxialLoads(axial_1=ac.scalar_or_array(fa1), axial_2=ac.scalar_or_array(fa2),
                          reaction_1=ac.scalar_or_array(-d1 * fa1), reaction_2=ac.scalar_or_array(-d2 * fa2),
                          held=ac.scalar_or_array(held))
