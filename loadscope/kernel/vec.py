"""Small vector helpers; ``numpy.cross`` costs ~20 us a call in overhead,
which dominates a full solve of a small drive."""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike, NDArray


def cross(a: ArrayLike, b: ArrayLike) -> NDArray[np.float64]:
    """Cross product of 3-vectors along the last axis (broadcasting).

    >>> cross([1.0, 0.0, 0.0], [0.0, 1.0, 0.0])
    array([0., 0., 1.])
    """
    a = np.asarray(a, dtype=float)
    b = np.asarray(b, dtype=float)
    if a.ndim == 1 and b.ndim == 1:
        x0, x1, x2 = a.tolist()
        y0, y1, y2 = b.tolist()
        return np.array([x1 * y2 - x2 * y1, x2 * y0 - x0 * y2, x0 * y1 - x1 * y0])
    a0, a1, a2 = a[..., 0], a[..., 1], a[..., 2]
    b0, b1, b2 = b[..., 0], b[..., 1], b[..., 2]
    return np.stack([a1 * b2 - a2 * b1, a2 * b0 - a0 * b2, a0 * b1 - a1 * b0], axis=-1)
