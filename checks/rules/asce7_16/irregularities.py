"""Horizontal structural irregularities of ASCE 7-16 Table 12.3-1.

* Type 1a / 1b, torsional: the rigid analysis's max/average displacement ratio at the
  plan extremes (accidental torsion included, Ax = 1) above 1.2 / 1.4. Applies only
  where diaphragms are rigid or semirigid, so only rigid results are used.
* Type 2, re-entrant corner: both plan projections beyond a re-entrant corner exceed
  15 % of the plan dimension in that direction. Geometry: each reflex vertex of a
  diaphragm's outline; the notch lies along the bisector of its two edges; the
  projections are the distances from the vertex to the bounding box on the notch side.
* Type 3, diaphragm discontinuity (openings part only): open area over 50 % of the
  gross enclosed diaphragm area.

Severity policy: 1a warning; 1b error in SDC E/F (not permitted, ASCE 7-16 §12.3.3.1),
warning otherwise; Types 2 and 3 warning in SDC D–F (where §12.3.3.4 and Table 12.6-1
act on them), info in SDC A–C.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from shapely.geometry import Polygon
from shapely.geometry.polygon import orient

from allocation.results import Allocation
from checks.findings import Finding, Severity
from checks.project import ProjectConfig
from checks.rules._support import fmt, level_guids
from checks.rules.asce7_16.seismic_design_category import seismic_design_category
from ifc_bridge.model import BuildingModel

__all__ = [
    "ReentrantCorner",
    "check_irregularities",
    "check_reentrant_corners",
    "check_torsional_irregularity",
    "reentrant_corners",
]

RULE = "irregularities"
CLAUSE = "ASCE 7-16 Table 12.3-1"
TYPE_1A, TYPE_1B = 1.2, 1.4  # ASCE 7-16 Table 12.3-1
REENTRANT = 0.15  # ASCE 7-16 Table 12.3-1 Type 2
OPENINGS = 0.5  # ASCE 7-16 Table 12.3-1 Type 3


@dataclass(frozen=True, slots=True, kw_only=True)
class ReentrantCorner:
    """A re-entrant corner of a plan outline.

    Attributes:
        point: The reflex vertex (x, y) [m].
        projection: Projections beyond the corner along x and y [m].
        ratio: Projections over the plan dimensions along x and y [-].
    """

    point: tuple[float, float]
    projection: tuple[float, float]
    ratio: tuple[float, float]

    @property
    def irregular(self) -> bool:
        """True when both ratios exceed 15 % (Table 12.3-1 Type 2)."""
        return min(self.ratio) > REENTRANT


def reentrant_corners(polygon: Polygon) -> list[ReentrantCorner]:
    """Re-entrant corners of a plan outline with their projections.

    ASCE 7-16 Table 12.3-1 Type 2 (definition of the projections).

    Args:
        polygon: Plan outline [m] (holes ignored).

    Returns:
        One record per reflex vertex of the exterior ring, in ring order.
    """
    shell = orient(Polygon(polygon.exterior).simplify(0.0), sign=1.0)
    pts = list(shell.exterior.coords)[:-1]
    x0, y0, x1, y1 = shell.bounds
    dims = (x1 - x0, y1 - y0)
    out = []
    n = len(pts)
    for i, v in enumerate(pts):
        p, q = pts[i - 1], pts[(i + 1) % n]
        cross = (v[0] - p[0]) * (q[1] - v[1]) - (v[1] - p[1]) * (q[0] - v[0])
        if cross >= -1e-12:
            continue  # convex or straight (counter-clockwise ring)
        e1 = _unit(p[0] - v[0], p[1] - v[1])
        e2 = _unit(q[0] - v[0], q[1] - v[1])
        d = (e1[0] + e2[0], e1[1] + e2[1])  # into the notch at a reflex vertex
        proj = tuple(
            (hi - c if s > 0 else c - lo) if abs(s) > 1e-9 else 0.0
            for s, c, lo, hi in ((d[0], v[0], x0, x1), (d[1], v[1], y0, y1))
        )
        ratio = tuple(
            pr / dm if dm > 0 else 0.0 for pr, dm in zip(proj, dims, strict=True)
        )
        out.append(
            ReentrantCorner(
                point=(float(v[0]), float(v[1])),
                projection=(float(proj[0]), float(proj[1])),
                ratio=(float(ratio[0]), float(ratio[1])),
            )
        )
    return out


def _unit(dx: float, dy: float) -> tuple[float, float]:
    n = math.hypot(dx, dy)
    return (dx / n, dy / n)


def check_torsional_irregularity(
    allocation: Allocation, config: ProjectConfig, *, model: BuildingModel | None = None
) -> list[Finding]:
    """Type 1a / 1b torsional irregularity per story and direction.

    ASCE 7-16 Table 12.3-1 Types 1a and 1b; §12.3.3.1 (1b not permitted in SDC E/F).

    Args:
        allocation: Rigid results with ``drift_ratio_max`` [-].
        config: Seismic parameters, for the SDC.
        model: The model, for the storey GlobalId when the allocation lacks it.

    Returns:
        One finding per level and direction that is irregular.
    """
    worst: dict[tuple, float] = {}
    for r in allocation.rigid:
        key = (r.level, r.case.direction)
        worst[key] = max(worst.get(key, 0.0), float(r.drift_ratio_max))
    high = seismic_design_category(config.seismic).at_least("E")
    out = []
    for (level, d), ratio in sorted(worst.items()):
        if ratio <= TYPE_1A:
            continue
        extreme = ratio > TYPE_1B
        sev = Severity.ERROR if extreme and high else Severity.WARNING
        kind = "1b (extreme torsional)" if extreme else "1a (torsional)"
        note = (
            " Not permitted in SDC E or F (ASCE 7-16 §12.3.3.1)."
            if extreme and high
            else " Accidental torsion is amplified by Ax (ASCE 7-16 §12.8.4.3)."
        )
        out.append(
            Finding(
                rule=RULE,
                clause=CLAUSE,
                severity=sev,
                level=level,
                direction=d,
                guids=level_guids(allocation, level, model),
                title=f"Torsional irregularity Type {kind.split()[0]}: {ratio:.2f}",
                description=(
                    f"Story below {level!r}, force in {d.value}: max/average "
                    "displacement at the "
                    f"plan extremes = {ratio:.2f} > "
                    f"{TYPE_1B if extreme else TYPE_1A:g}, "
                    f"Type {kind}.{note} Balance the wall stiffness about the centre "
                    "of mass."
                ),
                demand=ratio,
                capacity=TYPE_1B if extreme else TYPE_1A,
                unit="-",
                discriminator=f"{level}|{d.value}|torsion",
            )
        )
    return out


def check_reentrant_corners(
    model: BuildingModel, allocation: Allocation, config: ProjectConfig
) -> list[Finding]:
    """Type 2 re-entrant corners and Type 3 large openings, per diaphragm.

    ASCE 7-16 Table 12.3-1 Types 2 and 3.

    Args:
        model: Diaphragm outlines [m] with their slab GlobalIds.
        allocation: Unused except for storey GlobalIds.
        config: Seismic parameters, for the SDC.

    Returns:
        At most one finding per diaphragm and type (the governing corner).
    """
    sev = (
        Severity.WARNING
        if seismic_design_category(config.seismic).at_least("D")
        else Severity.INFO
    )
    out = []
    for dia in model.diaphragms:
        guids = dia.slab_guids or level_guids(allocation, dia.level, model)
        extra = "" if dia.slab_guids else f"|{dia.id}"
        bad = [c for c in reentrant_corners(dia.polygon) if c.irregular]
        if bad:
            c = max(bad, key=lambda c: (min(c.ratio), c.point))
            out.append(
                Finding(
                    rule=RULE,
                    clause=CLAUSE,
                    severity=sev,
                    level=dia.level,
                    direction=None,
                    guids=guids,
                    title="Re-entrant corner irregularity (Type 2)",
                    description=(
                        f"Diaphragm {dia.id} of {dia.level!r} has {len(bad)} "
                        "re-entrant "
                        "corner(s) with both projections over 15 % of the plan "
                        "dimension; at "
                        f"({fmt(c.point[0], 'length', config)}, "
                        f"{fmt(c.point[1], 'length', config)}) the projections are "
                        f"{100 * c.ratio[0]:.0f} % (x) and {100 * c.ratio[1]:.0f} % "
                        "(y). Detail "
                        "the corner collectors and chords for it."
                    ),
                    demand=min(c.ratio),
                    capacity=REENTRANT,
                    unit="-",
                    discriminator=f"{dia.level}|reentrant{extra}",
                    location=c.point,
                )
            )
        gross = Polygon(dia.polygon.exterior).area
        opening = gross - dia.polygon.area
        if gross > 0 and opening / gross > OPENINGS:
            out.append(
                Finding(
                    rule=RULE,
                    clause=CLAUSE,
                    severity=sev,
                    level=dia.level,
                    direction=None,
                    guids=guids,
                    title="Diaphragm discontinuity irregularity (Type 3)",
                    description=(
                        f"Diaphragm {dia.id} of {dia.level!r}: openings are "
                        f"{100 * opening / gross:.0f} % of its gross area (over 50 %)."
                    ),
                    demand=opening / gross,
                    capacity=OPENINGS,
                    unit="-",
                    discriminator=f"{dia.level}|openings{extra}",
                )
            )
    return out


def check_irregularities(
    model: BuildingModel | None, allocation: Allocation, config: ProjectConfig
) -> list[Finding]:
    """All horizontal irregularity findings (Types 1a, 1b, 2, 3).

    ASCE 7-16 Table 12.3-1.
    """
    out = check_torsional_irregularity(allocation, config, model=model)
    if model is not None:
        out += check_reentrant_corners(model, allocation, config)
    return out
