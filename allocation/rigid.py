"""Rigid-diaphragm allocation of a story shear to its wall piers, with torsion.

Axes and signs: global plan X-Y [m], right-handed, Z up. A pier acts at its plan
mid-point and resists force along its own direction only: an X pier resists Fx and,
through its y-arm, torsion; a Y pier resists Fy and, through its x-arm, torsion. Pier
forces are signed along +X (X piers) or +Y (Y piers). Torsion is counter-clockwise
positive about the centre of rigidity (CR).

Closed form (common practice, e.g. any text on lateral force distribution in
diaphragms)::

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

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from allocation.errors import ParameterError
from allocation.results import Condition, ConditionKind, LoadCase, Pier, RigidResult
from ifc_bridge.model import Direction

__all__ = ["allocate_rigid", "allocate_rigid_story", "rigid_cases"]

_IRREGULAR_RATIO = 1.2  # ASCE 7-16 Table 12.3-1, Type 1a
_REL_TOL = 1e-12  # zero test for J and arms, relative to the plan scale


@dataclass(frozen=True, slots=True, kw_only=True)
class _Rigidity:
    """Stiffness layout of one story: arrays over its X and Y piers."""

    piers: tuple[Pier, ...]
    kx: NDArray[np.float64]  # stiffness of X piers, 0 for Y piers
    ky: NDArray[np.float64]
    x: NDArray[np.float64]  # mid-points [m]
    y: NDArray[np.float64]
    xcr: float
    ycr: float
    J: float
    scale: float  # plan length scale for zero tests [m]

    def total(self, direction: Direction) -> float:
        return float((self.kx if direction is Direction.X else self.ky).sum())

    @property
    def torsionally_unstable(self) -> bool:
        k_all = float(self.kx.sum() + self.ky.sum())
        return self.J <= _REL_TOL * k_all * self.scale**2


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


def _require_finite(msg_name: str, *values: float) -> None:
    if not all(math.isfinite(v) for v in values):
        msg = f"rigid allocation: {msg_name} = {values} must be finite"
        raise ParameterError(msg)


def _validate(
    story_shear: float,
    center_of_mass: tuple[float, float],
    plan_extent: tuple[float, float, float, float],
    case: LoadCase,
    accidental_eccentricity: float,
    Ax: float,
) -> None:
    _require_finite("story_shear", story_shear)
    _require_finite("center_of_mass", *center_of_mass)
    _require_finite("plan_extent", *plan_extent)
    xmin, ymin, xmax, ymax = plan_extent
    checks = (
        (story_shear >= 0, f"story_shear = {story_shear} N must be >= 0"),
        (xmax >= xmin and ymax >= ymin,
         f"plan_extent = {plan_extent} must be (xmin, ymin, xmax, ymax)"),
        (case.sign in (1, -1) and case.ecc_sign in (1, -1),
         f"load case {case} needs sign and ecc_sign of +1 or -1"),
        (0 <= accidental_eccentricity < 0.5,
         f"accidental_eccentricity = {accidental_eccentricity} must be in [0, 0.5)"),
        (math.isfinite(Ax) and 1.0 <= Ax <= 3.0, f"Ax = {Ax} must be in [1, 3]"),
    )
    for ok, text in checks:
        if not ok:
            msg = f"rigid allocation: {text}"
            raise ParameterError(msg)


def _rigidity(
    piers: Sequence[Pier],
    *,
    level: str,
    center_of_mass: tuple[float, float],
    plan_extent: tuple[float, float, float, float],
) -> _Rigidity:
    """CR and J of the level's X and Y piers; a missing direction puts the CR at the CM."""
    active = tuple(p for p in piers if p.level == level and p.direction is not None)
    for p in active:
        if not (math.isfinite(p.stiffness) and p.stiffness >= 0):
            msg = f"rigid allocation: pier {p.id}: stiffness = {p.stiffness} must be >= 0"
            raise ParameterError(msg)
    k = np.array([p.stiffness for p in active], dtype=np.float64)
    is_x = np.array([p.direction is Direction.X for p in active], dtype=bool)
    x = np.array([p.midpoint[0] for p in active], dtype=np.float64)
    y = np.array([p.midpoint[1] for p in active], dtype=np.float64)
    kx, ky = np.where(is_x, k, 0.0), np.where(is_x, 0.0, k)
    xcr = float(ky @ x / ky.sum()) if ky.sum() > 0 else float(center_of_mass[0])
    ycr = float(kx @ y / kx.sum()) if kx.sum() > 0 else float(center_of_mass[1])
    J = float(kx @ (y - ycr) ** 2 + ky @ (x - xcr) ** 2)
    xmin, ymin, xmax, ymax = plan_extent
    spread = [xmax - xmin, ymax - ymin, 1e-9]
    if active:
        spread += [float(np.ptp(x)), float(np.ptp(y))]
    return _Rigidity(piers=active, kx=kx, ky=ky, x=x, y=y, xcr=xcr, ycr=ycr, J=J,
                     scale=max(spread))


def _arm(rig: _Rigidity, direction: Direction) -> tuple[NDArray[np.float64], float]:
    """Signed torsional lever per pier (force per unit θ per unit k) and the CR term."""
    return (-(rig.y - rig.ycr), rig.ycr) if direction is Direction.X else (
        rig.x - rig.xcr, rig.xcr)


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
    average is that of the diaphragm's mid-point; where it is <= 0 (the plan turns
    about a point inside it) the ratio is ``inf``, an extreme irregularity.
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
        return 1.0 if abs(e) <= _REL_TOL * rig.scale else math.inf
    theta = sense * e / rig.J  # T = Fy·e or −Fx·e, unit force
    u = [1.0 / k_sum + sense * theta * (c - cr) for c in ends]
    avg = 0.5 * (u[0] + u[1])
    if avg <= _REL_TOL * abs(1.0 / k_sum):
        return math.inf
    return float(max(u) / avg)


def _condition(
    kind: ConditionKind, level: str, direction: Direction, rig: _Rigidity,
    detail: str, value: float,
) -> Condition:
    return Condition(
        kind=kind, level=level, direction=direction,
        guids=tuple(sorted({p.guid for p in rig.piers})), detail=detail, value=value,
    )


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
        force direction (all forces 0), ``TORSIONAL_INSTABILITY`` when J = 0 (direct
        shear only).

    Raises:
        ParameterError: An input is out of its domain.
    """
    _validate(story_shear, center_of_mass, plan_extent, case, accidental_eccentricity, Ax)
    d = case.direction
    rig = _rigidity(piers, level=level, center_of_mass=center_of_mass,
                    plan_extent=plan_extent)
    xmin, ymin, xmax, ymax = plan_extent
    width = (ymax - ymin) if d is Direction.X else (xmax - xmin)
    acc1 = case.ecc_sign * accidental_eccentricity * width
    cm = center_of_mass[1] if d is Direction.X else center_of_mass[0]
    arm, cr = _arm(rig, d)
    F = float(case.sign * story_shear)
    e = cm + Ax * acc1 - cr
    T = F * e * (-1.0 if d is Direction.X else 1.0)
    k_d = rig.kx if d is Direction.X else rig.ky
    k_sum = rig.total(d)
    conditions: list[Condition] = []
    direct = k_d / k_sum * F if k_sum > 0 else np.zeros_like(k_d)
    theta = 0.0
    if k_sum == 0:
        detail = (f"level {level}: no shear wall resists {d.value}; the rigid analysis "
                  f"cannot carry the story shear {story_shear:.6g} N")
        conditions.append(_condition(ConditionKind.NO_LINE, level, d, rig, detail,
                                     float(story_shear)))
    elif rig.torsionally_unstable:
        detail = (f"level {level}: all shear walls act on one line; the rigid "
                  f"diaphragm has no torsional stiffness for torsion {T:.6g} N·m "
                  f"({d.value} force); direct shear only")
        conditions.append(_condition(ConditionKind.TORSIONAL_INSTABILITY, level, d,
                                     rig, detail, abs(T)))
    else:
        theta = T / rig.J
    k_all = rig.kx + rig.ky
    x_arm, y_arm = rig.x - rig.xcr, -(rig.y - rig.ycr)
    torsional = theta * k_all * np.where(rig.kx > 0, y_arm, x_arm)
    total = direct + torsional
    ids = [p.id for p in rig.piers]
    del arm  # the lever of the force-direction piers is inside x_arm / y_arm
    return RigidResult(
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
        pier_forces={i: float(v) for i, v in zip(ids, total, strict=True)},
        pier_direct={i: float(v) for i, v in zip(ids, direct, strict=True)},
        drift_ratio_max=_drift_ratio(rig, direction=d, load_offset=cm + acc1,
                                     plan_extent=plan_extent),
        conditions=tuple(conditions),
    )
