"""Rigid-diaphragm allocation of a story shear to its wall piers, with torsion.

Axes and signs: global plan X-Y [m], right-handed, Z up. A pier acts at its plan
mid-point and resists force along its own direction only: an X pier resists Fx and,
through its y-arm, torsion; a Y pier resists Fy and, through its x-arm, torsion. Pier
forces are signed along +X (X piers) or +Y (Y piers). Torsion is counter-clockwise
positive about the centre of rigidity (CR).

Closed form (common practice: direct plus torsional shear about the CR)::

    xcr = Σky·x/Σky      ycr = Σkx·y/Σkx
    J   = Σkx·(y − ycr)² + Σky·(x − xcr)²
    T   = Fy·(xp − xcr) − Fx·(yp − ycr)          θ = T/J
    V_i = kx_i·(Fx/Σkx − θ·(y_i − ycr)) + ky_i·(Fy/Σky + θ·(x_i − xcr))

The force acts at the centre of mass of the levels at and above, moved perpendicular
to the force by the accidental eccentricity ``ecc × plan dimension × Ax``
(ASCE 7-16 §12.8.4.2, §12.8.4.3), the sense given by ``LoadCase.ecc_sign``.
Displacements use the same stiffness units (relative or N/m); only their ratio is
reported: the max over average of the displacements, along the force, at the two plan
extremes of the diaphragm (ASCE 7-16 Table 12.3-1), always with Ax = 1.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from functools import cache
from itertools import repeat
from operator import attrgetter, is_

import numpy as np
from numpy.typing import NDArray

from allocation._columns import ends as end_points
from allocation._columns import flags, floats
from allocation._memo import float_bytes
from allocation._pier_forces import PierForces, PierIndex
from allocation._records import maker
from allocation._rigid_inputs import validate as _validate
from allocation.asce7_16 import s12_8_torsion
from allocation.errors import ParameterError
from allocation.results import Condition, ConditionKind, LoadCase, Pier, RigidResult
from ifc_bridge.model import Direction

__all__ = ["DRIFT_RATIO_LIMIT", "allocate_rigid", "allocate_rigid_story", "rigid_cases"]

DRIFT_RATIO_LIMIT = 100.0
"""Largest reported δmax/δavg [-]. Where the diaphragm's mid-point moves against the
force (δavg <= 0, the plan turns about a point inside it) or J = 0 under torsion the
ratio is unbounded and reported as this; Type 1b (> 1.4) and Ax = 3 (ratio >= 2.08)
are reached far below it."""

_rigid_result = maker(RigidResult)  # RigidResult(...), for every story and case
_IRREGULAR_RATIO = 1.2  # ASCE 7-16 Table 12.3-1, Type 1a
_STIFFNESS, _DIRECTION, _ID = (
    attrgetter("stiffness"),
    attrgetter("direction"),
    attrgetter("id"),
)
_REL_TOL = 1e-12  # zero test for J and arms, relative to the plan scale


@dataclass(frozen=True, slots=True, kw_only=True)
class _Rigidity:
    """Stiffness layout of one story: arrays over its X and Y piers."""

    piers: tuple[Pier, ...]
    index: PierIndex  # the piers' ids, the rows of the arrays; shared by the cases
    kx: NDArray[np.float64]  # stiffness of X piers, 0 for Y piers
    ky: NDArray[np.float64]
    x: NDArray[np.float64]  # mid-points [m]
    y: NDArray[np.float64]
    xcr: float  # centre of rigidity [m]
    ycr: float
    J: float  # torsional stiffness about the CR [stiffness·m²]
    scale: float  # plan length scale for zero tests [m]
    totals: tuple[float, float]  # Σkx, Σky
    torsionally_unstable: bool  # J is zero, relative to Σk and the plan scale

    def total(self, direction: Direction) -> float:
        return self.totals[0 if direction is Direction.X else 1]

    @property
    def guids(self) -> tuple[str, ...]:
        """GlobalIds of the story's walls, sorted (for conditions)."""
        return tuple(sorted({p.guid for p in self.piers}))


@cache  # the same four frozen cases for every story
def rigid_cases(direction: Direction) -> tuple[LoadCase, ...]:
    """The four rigid-diaphragm load cases of one direction: ±force × ±eccentricity.

    ASCE 7-16 §12.8.4.2: the centre of mass is displaced each way from its actual
    location; the force is applied in both senses.

    Args:
        direction: Direction of the force.

    Returns:
        Cases ``+D+e``, ``+D-e``, ``-D+e``, ``-D-e``.
    """
    return tuple(
        LoadCase(direction=direction, sign=s, ecc_sign=e)
        for s in (1, -1)
        for e in (1, -1)
    )


def _rigidity(
    piers: Sequence[Pier],
    *,
    level: str,
    center_of_mass: tuple[float, float],
    plan_extent: tuple[float, float, float, float],
) -> _Rigidity:
    """CR and J of the level's X and Y piers (no piers in a direction: CR at CM)."""
    active = tuple(p for p in piers if p.level == level and p.direction is not None)
    k = floats(map(_STIFFNESS, active), len(active))
    bad = ~(np.isfinite(k) & (k >= 0))
    if bad.any():
        p = active[int(np.flatnonzero(bad)[0])]
        msg = f"rigid allocation: pier {p.id}: stiffness {p.stiffness} must be >= 0"
        raise ParameterError(msg)
    is_x = flags(map(is_, map(_DIRECTION, active), repeat(Direction.X)), len(active))
    ends = end_points(active)
    x = (ends[:, 0, 0] + ends[:, 1, 0]) / 2.0  # Pier.midpoint
    y = (ends[:, 0, 1] + ends[:, 1, 1]) / 2.0
    kx, ky = np.where(is_x, k, 0.0), np.where(is_x, 0.0, k)
    kx_sum, ky_sum = kx.sum(), ky.sum()
    xcr = float(ky @ x / ky_sum) if ky_sum > 0 else float(center_of_mass[0])
    ycr = float(kx @ y / kx_sum) if kx_sum > 0 else float(center_of_mass[1])
    J = float(kx @ (y - ycr) ** 2 + ky @ (x - xcr) ** 2)
    xmin, ymin, xmax, ymax = plan_extent
    spread = [xmax - xmin, ymax - ymin, 1e-9]
    if active:
        spread += [float(np.ptp(x)), float(np.ptp(y))]
    scale = max(spread)
    k_all = float(kx_sum + ky_sum)
    return _Rigidity(
        piers=active,
        index=PierIndex(map(_ID, active)),
        kx=kx,
        ky=ky,
        x=x,
        y=y,
        xcr=xcr,
        ycr=ycr,
        J=J,
        scale=scale,
        totals=(float(kx_sum), float(ky_sum)),
        torsionally_unstable=_REL_TOL * k_all * scale**2 >= J,
    )


# Each story's rigidity, for its other direction: the allocation asks for every story
# in X, then for every story again in Y. Bounded; oldest first out.
_STORY_RIGIDITY: dict[tuple, tuple[tuple[Pier, ...], _Rigidity]] = {}
_KEEP_STORIES = 256


def _story_rigidity(
    piers: Sequence[Pier],
    level: str,
    center_of_mass: tuple[float, float],
    plan_extent: tuple[float, float, float, float],
) -> _Rigidity:
    """:func:`_rigidity`, reused for the story's other direction.

    The CR and J do not depend on the direction of the force: the allocation asks
    for the same piers (the very objects, in order; frozen) with the same centre of
    mass and extent in X and, after the other stories, in Y.
    """
    key = (level, float_bytes((*center_of_mass, *plan_extent)))  # exact: -0.0 too
    found = _STORY_RIGIDITY.get(key)
    if found is not None:
        held, rig = found
        if len(held) == len(piers) and all(map(is_, held, piers)):
            return rig
    rig = _rigidity(
        piers, level=level, center_of_mass=center_of_mass, plan_extent=plan_extent
    )
    _STORY_RIGIDITY.pop(key, None)
    _STORY_RIGIDITY[key] = (tuple(piers), rig)
    while len(_STORY_RIGIDITY) > _KEEP_STORIES:
        del _STORY_RIGIDITY[next(iter(_STORY_RIGIDITY))]
    return rig


def _drift_ratio(
    rig: _Rigidity,
    *,
    direction: Direction,
    load_offset: float,
    plan_extent: tuple[float, float, float, float],
) -> float:
    """δmax/δavg at the two plan extremes for a unit force at ``load_offset``.

    ASCE 7-16 Table 12.3-1 (Type 1a/1b) compares the larger end displacement with
    the average of the two ends. Displacements are signed along the force, so the
    average is that of the diaphragm's mid-point (signs kept, not zeroed); an
    unbounded ratio is reported as ``DRIFT_RATIO_LIMIT``.
    """
    k_sum = rig.total(direction)
    if k_sum == 0:
        return 1.0
    xmin, ymin, xmax, ymax = plan_extent
    if direction is Direction.X:
        e, ends, cr, sense = load_offset - rig.ycr, (ymin, ymax), rig.ycr, -1.0
    else:
        e, ends, cr, sense = load_offset - rig.xcr, (xmin, xmax), rig.xcr, 1.0
    if rig.torsionally_unstable:
        return 1.0 if abs(e) <= _REL_TOL * rig.scale else DRIFT_RATIO_LIMIT
    theta = sense * e / rig.J  # T = Fy·e or −Fx·e, unit force
    u = [1.0 / k_sum + sense * theta * (c - cr) for c in ends]
    avg = 0.5 * (u[0] + u[1])
    if avg * DRIFT_RATIO_LIMIT <= max(u):
        return DRIFT_RATIO_LIMIT
    return float(max(u) / avg)


def _theta(
    rig: _Rigidity, *, level: str, d: Direction, T: float, story_shear: float
) -> tuple[float, tuple[Condition, ...]]:
    """Rotation θ = T/J, or 0 with the condition that prevents it."""
    if rig.total(d) == 0:
        detail = (
            f"level {level}: no shear wall resists {d.value}; the rigid analysis "
            f"cannot carry the story shear {story_shear:.6g} N"
        )
        return 0.0, (
            Condition(
                kind=ConditionKind.NO_LINE,
                level=level,
                direction=d,
                guids=rig.guids,
                detail=detail,
                value=float(story_shear),
            ),
        )
    if rig.torsionally_unstable:
        detail = (
            f"level {level}: all shear walls act on one line; the rigid "
            f"diaphragm has no torsional stiffness for torsion {T:.6g} N·m "
            f"({d.value} force); direct shear only"
        )
        return 0.0, (
            Condition(
                kind=ConditionKind.TORSIONAL_INSTABILITY,
                level=level,
                direction=d,
                guids=rig.guids,
                detail=detail,
                value=abs(T),
            ),
        )
    return T / rig.J, ()


def allocate_rigid(
    piers: Sequence[Pier],
    *,
    level: str,
    story_shear: float,
    center_of_mass: tuple[float, float],
    plan_extent: tuple[float, float, float, float],
    case: LoadCase,
    accidental_eccentricity: float,
    Ax: float = 1.0,
) -> RigidResult:
    """Allocate one story shear to the piers of a rigid diaphragm, for one load case.

    ASCE 7-16 §12.8.4.1-§12.8.4.3 (inherent and accidental torsion, Ax).
    Common practice: direct shear kᵢ/Σk·V plus torsional shear kᵢ·dᵢ/J·T about the
    centre of rigidity, walls of both directions resisting torsion.

    Args:
        piers: Piers with ``stiffness`` set; only those of ``level`` with a direction
            are used, at their plan mid-points [m].
        level: Level whose diaphragm the story's piers support.
        story_shear: Story shear Vx, ASCE 7-16 Eq. 12.8-13, a magnitude [N].
        center_of_mass: Of the levels at and above (x, y) [m].
        plan_extent: (xmin, ymin, xmax, ymax) of the level's diaphragm [m].
        case: Direction, force sense and eccentricity sense.
        accidental_eccentricity: Fraction of the plan dimension perpendicular to the
            force, ASCE 7-16 §12.8.4.2 [-].
        Ax: Torsional amplification, ASCE 7-16 Eq. 12.8-14 [-].

    Returns:
        The signed pier forces [N] of both directions, the CR, J, the torsion [N·m],
        the drift ratio [-] and the conditions: ``NO_LINE`` when no pier resists the
        force direction (all forces 0, drift ratio 1.0: undefined),
        ``TORSIONAL_INSTABILITY`` when J = 0 (direct shear only; drift ratio
        ``DRIFT_RATIO_LIMIT`` unless the load passes through the CR).

    Raises:
        ParameterError: An input is out of its domain.
    """
    _validate(
        story_shear, center_of_mass, plan_extent, case, accidental_eccentricity, Ax
    )
    rig = _rigidity(
        piers, level=level, center_of_mass=center_of_mass, plan_extent=plan_extent
    )
    return _allocate(
        rig,
        level=level,
        story_shear=story_shear,
        center_of_mass=center_of_mass,
        plan_extent=plan_extent,
        case=case,
        accidental_eccentricity=accidental_eccentricity,
        Ax=Ax,
    )


def _allocate(
    rig: _Rigidity,
    *,
    level: str,
    story_shear: float,
    center_of_mass: tuple[float, float],
    plan_extent: tuple[float, float, float, float],
    case: LoadCase,
    accidental_eccentricity: float,
    Ax: float,
) -> RigidResult:
    """:func:`allocate_rigid` on a story's rigidity (inputs already validated)."""
    d, (xmin, ymin, xmax, ymax) = case.direction, plan_extent
    is_x = d is Direction.X
    width = (ymax - ymin) if is_x else (xmax - xmin)
    acc1 = case.ecc_sign * accidental_eccentricity * width
    cm, cr = (center_of_mass[1], rig.ycr) if is_x else (center_of_mass[0], rig.xcr)
    F = float(case.sign * story_shear)
    e = cm + Ax * acc1 - cr
    T = -F * e if is_x else F * e
    k_d, k_sum = (rig.kx if is_x else rig.ky), rig.total(d)
    direct = k_d / k_sum * F if k_sum > 0 else np.zeros_like(k_d)
    theta, conditions = _theta(rig, level=level, d=d, T=T, story_shear=story_shear)
    total = direct + theta * (rig.kx * -(rig.y - rig.ycr) + rig.ky * (rig.x - rig.xcr))
    return _rigid_result(
        level=level,
        case=case,
        story_shear=F,
        center_of_mass=(float(center_of_mass[0]), float(center_of_mass[1])),
        center_of_rigidity=(rig.xcr, rig.ycr),
        eccentricity=float(e),
        accidental=float(Ax * acc1),
        Ax=float(Ax),
        torsion=float(T),
        J=rig.J,
        pier_forces=PierForces(rig.index, total),
        pier_direct=PierForces(rig.index, direct),
        drift_ratio_max=_drift_ratio(
            rig, direction=d, load_offset=cm + acc1, plan_extent=plan_extent
        ),
        conditions=conditions,
    )


def allocate_rigid_story(
    piers: Sequence[Pier],
    *,
    level: str,
    story_shear: float,
    center_of_mass: tuple[float, float],
    plan_extent: tuple[float, float, float, float],
    direction: Direction,
    accidental_eccentricity: float,
    amplify_torsion: bool,
) -> tuple[RigidResult, ...]:
    """The four rigid-diaphragm cases of one story and direction, Ax where required.

    ASCE 7-16 §12.8.4.2 (±5 % eccentricity) and §12.8.4.3 (Ax, Eq. 12.8-14, where
    Type 1a or 1b torsional irregularity of Table 12.3-1 exists).

    Each case is first run with Ax = 1; when ``amplify_torsion`` and its drift ratio
    exceeds 1.2 it is run again with Ax from that ratio (per case: the two senses of
    the eccentricity give different ratios).

    Args:
        piers: Piers with ``stiffness`` set [m].
        level: Level whose diaphragm the story's piers support.
        story_shear: Story shear Vx, ASCE 7-16 Eq. 12.8-13 [N].
        center_of_mass: Of the levels at and above (x, y) [m].
        plan_extent: (xmin, ymin, xmax, ymax) of the level's diaphragm [m].
        direction: Direction of the force.
        accidental_eccentricity: Fraction of the plan dimension, §12.8.4.2 [-].
        amplify_torsion: Apply Ax (the caller decides, e.g. SDC C-F).

    Returns:
        Results of the cases of ``rigid_cases(direction)``, in that order.
    """
    out, rig = [], None  # the story's rigidity is the same in every case
    for case in rigid_cases(direction):
        given = (
            story_shear,
            center_of_mass,
            plan_extent,
            case,
            accidental_eccentricity,
        )
        _validate(*given, 1.0)
        if rig is None:
            rig = _story_rigidity(piers, level, center_of_mass, plan_extent)
        kwargs = {
            "level": level,
            "story_shear": story_shear,
            "center_of_mass": center_of_mass,
            "plan_extent": plan_extent,
            "case": case,
            "accidental_eccentricity": accidental_eccentricity,
        }
        result = _allocate(rig, **kwargs, Ax=1.0)
        if amplify_torsion and result.drift_ratio_max > _IRREGULAR_RATIO:
            Ax = s12_8_torsion.Ax(result.drift_ratio_max, 1.0)
            _validate(*given, Ax)
            result = _allocate(rig, **kwargs, Ax=Ax)
        out.append(result)
    return tuple(out)
