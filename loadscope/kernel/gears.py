"""Tooth forces of spur, helical and straight bevel gears.

Magnitudes broadcast over numpy arrays, so a sweep is one call. The vector
form builds each force from the geometry at the pitch point (DESIGN.md): the
tangential part follows the gear's motion on the driven gear, the radial part
points to the gear's own axis (away from it for an internal gear), and the
axial part follows from the tooth normal (helix hand and angle, or the pitch
cone), never from a separate sign flag.

References
----------
.. [1] Budynas, R. G., Nisbett, J. K., Shigley's Mechanical Engineering
   Design, 9th ed., McGraw-Hill, 2011: Eq. 13-36 (spur), 13-38 (straight
   bevel), 13-39 (helical).
.. [2] ISO 6336-1:2019, clause 6.1: nominal tangential load Ft = 2000 T / d.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ..errors import InputError
from . import checks
from .vec import cross

FloatArray = NDArray[np.float64]


@dataclass(frozen=True)
class MeshForces:
    """Tooth-force magnitudes [N] (arrays broadcast from the inputs).

    ``total`` is the magnitude of the whole tooth force (the normal force for
    spur and helical gears, W = Wt / (cos(phi_n) cos(psi))).
    """

    tangential: FloatArray
    radial: FloatArray
    axial: FloatArray
    total: FloatArray


def _array(value: ArrayLike, name: str) -> FloatArray:
    a = np.asarray(value, dtype=float)
    if not np.all(np.isfinite(a)):
        raise InputError(name, "must be finite", "finite numbers")
    return a


def _check_range(a: FloatArray, lo: float, hi: float, name: str, unit: str, scale: float = 1.0) -> None:
    bad = (a < lo) | (a > hi)
    if np.any(bad):
        v = float(a[bad].flat[0]) * scale
        raise InputError(name, f"is out of range, got {v:.6g} {unit}", f"{lo * scale:g} to {hi * scale:g} {unit}")


def mesh_forces(torque: ArrayLike, pitch_radius: ArrayLike, pressure_angle: ArrayLike,
                helix_angle: ArrayLike = 0.0) -> MeshForces:
    r"""Tooth-force components of a spur or helical gear from its torque.

    .. math::
        W_t = T / r, \quad W_r = W_t \tan\phi_n / \cos\psi, \quad
        W_a = W_t \tan\psi, \quad W = W_t / (\cos\phi_n \cos\psi)

    Parameters
    ----------
    torque : array_like
        Torque on the gear [N*m]; its magnitude is used.
    pitch_radius : array_like
        Pitch radius r [m], > 0.
    pressure_angle : array_like
        Normal pressure angle phi_n [rad], 10 to 35 deg.
    helix_angle : array_like, optional
        Helix angle psi [rad], 0 (spur) to 45 deg.

    Returns
    -------
    MeshForces
        Magnitudes [N], broadcast over the inputs.

    Notes
    -----
    Implements [1]_ Eq. 13-39 (helical; Eq. 13-36 for psi = 0) with the
    tangential load of [2]_. The transverse pressure angle is
    tan(phi_t) = tan(phi_n) / cos(psi).

    Examples
    --------
    A 20 deg spur pinion, 100 N*m on a 50 mm pitch radius:

    >>> f = mesh_forces(100.0, 0.05, np.radians(20.0))
    >>> round(float(f.tangential), 3), round(float(f.radial), 3)
    (2000.0, 727.94)

    Broadcast over three helix angles:

    >>> mesh_forces(100.0, 0.05, np.radians(20.0), np.radians([0, 15, 30])).axial.round(1)
    array([   0. ,  535.9, 1154.7])
    """
    t = np.abs(_array(torque, "torque"))
    r = _array(pitch_radius, "pitch_radius")
    phi = _array(pressure_angle, "pressure_angle")
    psi = _array(helix_angle, "helix_angle")
    if np.any(r <= 0.0):
        raise InputError("pitch_radius", f"must be positive, got {float(r[r <= 0].flat[0]):.6g} m", "> 0 m")
    _check_range(phi, *checks.PRESSURE_ANGLE_RANGE, "pressure_angle", "deg", np.degrees(1.0))
    _check_range(psi, *checks.HELIX_ANGLE_RANGE, "helix_angle", "deg", np.degrees(1.0))
    # all four parts take the broadcast shape of all inputs (W_t alone ignores the angles)
    wt = np.broadcast_to(t / r, np.broadcast_shapes(t.shape, r.shape, phi.shape, psi.shape)).copy()
    cos_psi = np.cos(psi)
    radial = wt * np.tan(phi) / cos_psi
    axial = wt * np.tan(psi)
    total = wt / (np.cos(phi) * cos_psi)
    return MeshForces(tangential=wt, radial=radial, axial=axial, total=total)


def bevel_mesh_forces(torque: ArrayLike, mean_radius: ArrayLike, pressure_angle: ArrayLike,
                      cone_angle: ArrayLike) -> MeshForces:
    r"""Tooth-force components of a straight bevel gear at its mean radius.

    .. math::
        W_t = T / r_m, \quad W_r = W_t \tan\phi \cos\gamma, \quad
        W_a = W_t \tan\phi \sin\gamma, \quad W = W_t / \cos\phi

    Parameters
    ----------
    torque : array_like
        Torque on the gear [N*m]; its magnitude is used.
    mean_radius : array_like
        Pitch radius at the middle of the face r_m [m], > 0.
    pressure_angle : array_like
        Pressure angle phi [rad], 10 to 35 deg.
    cone_angle : array_like
        Pitch cone angle gamma [rad], 1 to 89 deg.

    Notes
    -----
    Implements [1]_ Eq. 13-38. The axial part pushes the gear away from the
    cone apex; the radial part points to the gear's axis.

    Examples
    --------
    >>> f = bevel_mesh_forces(100.0, 0.05, np.radians(20.0), np.radians(45.0))
    >>> round(float(f.radial), 3) == round(float(f.axial), 3)
    True
    """
    t = np.abs(_array(torque, "torque"))
    r = _array(mean_radius, "mean_radius")
    phi = _array(pressure_angle, "pressure_angle")
    gamma = _array(cone_angle, "cone_angle")
    if np.any(r <= 0.0):
        raise InputError("mean_radius", f"must be positive, got {float(r[r <= 0].flat[0]):.6g} m", "> 0 m")
    _check_range(phi, *checks.PRESSURE_ANGLE_RANGE, "pressure_angle", "deg", np.degrees(1.0))
    _check_range(gamma, np.radians(1.0), np.radians(89.0), "cone_angle", "deg", np.degrees(1.0))
    wt = np.broadcast_to(t / r, np.broadcast_shapes(t.shape, r.shape, phi.shape, gamma.shape)).copy()
    sep = wt * np.tan(phi)
    return MeshForces(tangential=wt, radial=sep * np.cos(gamma), axial=sep * np.sin(gamma),
                      total=wt / np.cos(phi))


def cylindrical_tooth_force(wt: float, axis: FloatArray, radial_out: FloatArray, motion_sign: float,
                            pressure_angle: float, helix_angle: float = 0.0, hand_sign: float = 0.0,
                            internal: bool = False) -> FloatArray:
    r"""The tooth force vector [N] on a spur or helical gear at its pitch point.

    With the gear axis a, the unit r from the axis out to the pitch point and
    t = a x r, the force on a gear whose tangential load acts along s*t is

    .. math::
        F = W_t\,[s\,t - s\,h \tan\psi\,a] - \kappa\,W_t \frac{\tan\phi_n}{\cos\psi}\,r

    where h = +1 for a right-hand and -1 for a left-hand helix (the tooth
    line runs along cos(psi) a + h sin(psi) t, so the thrust is perpendicular
    to it on the pitch surface) and kappa = +1 external, -1 internal (a ring
    gear is pushed away from its axis).

    Parameters
    ----------
    wt : float
        Tangential load W_t [N], >= 0.
    axis, radial_out : ndarray
        Unit vectors a and r (global).
    motion_sign : float
        s = +1 when the tangential load acts along t, -1 against it.
    pressure_angle, helix_angle : float
        Normal pressure angle and helix angle [rad].
    hand_sign : float
        h: +1 right hand, -1 left hand, 0 spur.
    internal : bool
        True for a ring gear.

    Examples
    --------
    A right-hand gear on +x, pitch point on +y, tangential load along +t:

    >>> f = cylindrical_tooth_force(1000.0, np.array([1., 0, 0]), np.array([0., 1, 0]), 1.0,
    ...                             np.radians(20), np.radians(30), 1.0)
    >>> f.round(1)
    array([-577.4, -420.3, 1000. ])
    """
    t = cross(axis, radial_out)
    kappa = -1.0 if internal else 1.0
    radial = wt * np.tan(pressure_angle) / np.cos(helix_angle)
    return (wt * motion_sign * t - wt * motion_sign * hand_sign * np.tan(helix_angle) * axis
            - kappa * radial * radial_out)


def bevel_tooth_force(wt: float, axis_from_apex: FloatArray, radial_out: FloatArray, motion_sign: float,
                      pressure_angle: float, cone_angle: float) -> FloatArray:
    r"""The tooth force vector [N] on a straight bevel gear at its mean pitch
    point.

    With a the axis unit pointing from the cone apex toward the gear, r the
    unit from the axis to the pitch point and t = a x r, the separating force
    W_t tan(phi) acts along the normal to the pitch-cone element in the axial
    plane, toward the gear's axis: n = sin(gamma) a - cos(gamma) r.

    .. math:: F = s\,W_t\,t + W_t \tan\phi\,(\sin\gamma\,a - \cos\gamma\,r)

    Examples
    --------
    >>> f = bevel_tooth_force(1000.0, np.array([1., 0, 0]), np.array([0., 1, 0]), 1.0,
    ...                       np.radians(20), np.radians(45))
    >>> f.round(1)
    array([ 257.4, -257.4, 1000. ])
    """
    t = cross(axis_from_apex, radial_out)
    sep = wt * np.tan(pressure_angle)
    return (motion_sign * wt * t
            + sep * (np.sin(cone_angle) * axis_from_apex - np.cos(cone_angle) * radial_out))
