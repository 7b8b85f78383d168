"""The one exception family for anything the user wrote.

Modelled on a units library's error design: a base class mixed with the
builtin ``ValueError``, structured fields, and the message built from them so
that a test can assert both.
"""

from __future__ import annotations


class InputError(ValueError):
    """A value the user gave cannot be used.

    Parameters
    ----------
    path : str
        Where the offending value sits, e.g. ``"shafts[1].supports[0].at"``.
        Empty when the problem concerns the drive as a whole.
    problem : str
        What is wrong, in words an engineer uses.
    accepted : str
        The accepted range or form, e.g. ``"> 0 m"``. Empty when the problem
        is a mechanism rather than a value out of range.

    Examples
    --------
    >>> err = InputError("gears[0].pitch_radius", "must be positive, got -0.01 m", "> 0 m")
    >>> str(err)
    'gears[0].pitch_radius: must be positive, got -0.01 m (accepted: > 0 m)'
    >>> isinstance(err, ValueError)
    True
    """

    def __init__(self, path: str, problem: str, accepted: str = "") -> None:
        self.path = path
        self.problem = problem
        self.accepted = accepted
        super().__init__(self._message())

    def _message(self) -> str:
        text = f"{self.path}: {self.problem}" if self.path else self.problem
        if self.accepted:
            text += f" (accepted: {self.accepted})"
        return text

    def __reduce__(self):  # keep pickling (multiprocessing sweeps) working
        return (type(self), (self.path, self.problem, self.accepted))


class MechanismError(InputError):
    """The model cannot stand: a support arrangement or mesh graph that leaves
    the structure free to move, or that statics alone cannot resolve."""


def join_path(prefix: str, name: str) -> str:
    """Join field-path parts: ``join_path("shafts[0]", "supports[1]")``."""
    if not prefix:
        return name
    if name.startswith("["):
        return prefix + name
    return f"{prefix}.{name}"
