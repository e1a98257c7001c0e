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

__all__ = ["Centreline", "centreline", "centrelines_along"]


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


def centrelines_along(
    plan_points: list[NDArray[np.float64]], directions: NDArray[np.float64]
) -> list[Centreline | None]:
    """Centrelines of many straight walls, each along its given direction, at once.

    Common practice: as :func:`centreline` with a direction; numpy over all walls
    together instead of one small array per wall.

    Args:
        plan_points: Per wall, its body vertices on plan, shape (n_i, 2) [m].
        directions: Per wall, its unit direction, shape (walls, 2) [-].

    Returns:
        Per wall, its centreline, or None when it has fewer than two points.
    """
    if not plan_points:
        return []
    counts = np.fromiter((len(p) for p in plan_points), dtype=np.int64)
    if (counts < 1).any():
        keep = [k for k, c in enumerate(counts) if c >= 2]
        sub = centrelines_along(
            [plan_points[k] for k in keep], np.asarray(directions)[keep]
        )
        out: list[Centreline | None] = [None] * len(plan_points)
        for k, line in zip(keep, sub, strict=True):
            out[k] = line
        return out
    starts = np.concatenate(([0], np.cumsum(counts)[:-1]))
    pts = np.concatenate([np.asarray(p, dtype=np.float64) for p in plan_points])
    origin = pts[starts]
    seg = np.repeat(np.arange(len(counts)), counts)
    local = pts - origin[seg]
    d = np.asarray(directions, dtype=np.float64)
    n = np.column_stack((-d[:, 1], d[:, 0]))
    s = local[:, 0] * d[seg, 0] + local[:, 1] * d[seg, 1]
    t = local[:, 0] * n[seg, 0] + local[:, 1] * n[seg, 1]
    smin, smax = np.minimum.reduceat(s, starts), np.maximum.reduceat(s, starts)
    tmin, tmax = np.minimum.reduceat(t, starts), np.maximum.reduceat(t, starts)
    tmid = (tmin + tmax) / 2.0
    a = origin + d * smin[:, None] + n * tmid[:, None]
    b = origin + d * smax[:, None] + n * tmid[:, None]
    thickness = (tmax - tmin).tolist()
    return [
        None if c < 2 else Centreline(start=(ax, ay), end=(bx, by), thickness=th)
        for c, (ax, ay), (bx, by), th in zip(
            counts.tolist(), a.tolist(), b.tolist(), thickness, strict=True
        )
    ]


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
    if direction is not None:
        return centrelines_along([pts], np.asarray([direction], dtype=np.float64))[0]
    origin = pts[0].copy()
    local = pts - origin
    d = _mrr_direction(local)
    if d is None:
        return None
    return centrelines_along([pts], d[None, :])[0]
