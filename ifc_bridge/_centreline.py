"""Plan centreline and thickness of a straight wall from its body's plan points.

The footprint's oriented bounding rectangle: along the Axis direction when there is
one, else the minimum rotated rectangle; long side = length, short side = thickness,
centreline = the rectangle's mid-line. Points are shifted to a local origin first,
so walls 1e6 m from the world origin keep their precision. World X-Y, metres.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import shapely
from numpy.typing import NDArray

__all__ = ["Centreline", "centreline"]


@dataclass(frozen=True, slots=True, kw_only=True)
class Centreline:
    """Centreline of a wall's plan rectangle.

    Attributes:
        start: Start point (x, y) [m].
        end: End point (x, y) [m].
        thickness: Rectangle width across the wall [m].
    """

    start: tuple[float, float]
    end: tuple[float, float]
    thickness: float

    @property
    def length(self) -> float:
        """Centreline length [m]."""
        return float(np.hypot(self.end[0] - self.start[0], self.end[1] - self.start[1]))

    @property
    def direction(self) -> NDArray[np.float64]:
        """Unit vector from start to end [-]."""
        d = np.subtract(self.end, self.start)
        return d / np.linalg.norm(d)


def _mrr_direction(local: NDArray[np.float64]) -> NDArray[np.float64] | None:
    rect = shapely.minimum_rotated_rectangle(shapely.multipoints(local))
    if rect.geom_type != "Polygon":
        coords = np.asarray(rect.coords) if hasattr(rect, "coords") else None
        if coords is None or len(coords) < 2:
            return None
        d = coords[-1] - coords[0]
    else:
        c = np.asarray(rect.exterior.coords)
        e1, e2 = c[1] - c[0], c[2] - c[1]
        d = e1 if np.linalg.norm(e1) >= np.linalg.norm(e2) else e2
    n = float(np.linalg.norm(d))
    if n <= 1e-12:
        return None
    d = d / n
    if d[0] < -1e-12 or (abs(d[0]) <= 1e-12 and d[1] < 0):
        d = -d  # deterministic: start at the smaller x (then the smaller y)
    return d


def centreline(
    plan_points: NDArray[np.float64], direction: tuple[float, float] | None = None
) -> Centreline | None:
    """Centreline of a straight wall from the plan projection of its body.

    Common practice: the mid-line of the oriented bounding rectangle of the footprint.

    Args:
        plan_points: Body vertices projected on plan, shape (n, 2) [m].
        direction: Wall direction from its Axis (unit vector) [-], or None.

    Returns:
        The centreline, or None when the points span no length.
    """
    pts = np.asarray(plan_points, dtype=np.float64)
    if len(pts) < 2:
        return None
    origin = pts[0].copy()
    local = pts - origin
    d = (
        np.asarray(direction, dtype=np.float64)
        if direction is not None
        else _mrr_direction(local)
    )
    if d is None:
        return None
    n = np.array([-d[1], d[0]])
    s, t = local @ d, local @ n
    smin, smax, tmin, tmax = s.min(), s.max(), t.min(), t.max()
    tmid = (tmin + tmax) / 2.0
    a = origin + d * smin + n * tmid
    b = origin + d * smax + n * tmid
    return Centreline(
        start=(float(a[0]), float(a[1])),
        end=(float(b[0]), float(b[1])),
        thickness=float(tmax - tmin),
    )
