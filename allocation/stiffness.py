"""In-plane stiffness of shear-wall piers for the rigid-diaphragm allocation.

Two bases, chosen by ``AnalysisOptions.wall_stiffness``:

* ``"length"``: stiffness numerically equal to the pier length in m (relative; common
  practice for light-frame walls of one assembly).
* ``"assembly"``: absolute stiffness [N/m] from the assembly's material model: the
  cantilever pier (concrete, masonry) or the SDPWS three-term deflection (wood
  structural panel).

Relative and absolute stiffness are never mixed within a level: when one pier of a
level lacks the inputs of its model, every pier of that level uses its length, and a
``STIFFNESS_FALLBACK`` condition names the piers and what is missing. Piers of
different levels never share an analysis, so levels may differ in basis.

SDPWS unit bookkeeping. In the US form of SDPWS 2015 Eq. 4.3-1,
``δ = 8vh³/(EAb) + vh/(1000·Ga) + h·Δa/b`` with v [plf], h and b [ft], E [psi],
A [in²], Ga [kips/in], Δa and δ [in]:

* bending of the chords, a cantilever ``P·h³/(3EI)`` with ``P = v·b`` and
  ``I = A·b²/2``, is ``2vh³/(3EAb)``; with v·h³/(E·A·b) in ft, the 12 in/ft makes
  2/3 × 12 = 8, so the SI form is ``2vh³/(3EAb)``;
* sheathing shear ``v·h/Ga``: v·h in lb over Ga in kips/in needs 1000 lb/kip; in SI
  (v [N/m], h [m], Ga [N/m]) it is ``v·h/Ga``;
* hold-down slip ``h·Δa/b`` is a rotation times a height, the same in any units.

Δa is a slip at a load level, not a linear spring, so δ is not proportional to v. The
stiffness used here is the secant ``k = v·b/δ(v)`` at the design unit shear the slip
was given for (``AssemblyProperties.design_unit_shear``), i.e. Δa is taken as
proportional to the load up to the design level.
"""

from __future__ import annotations

import logging
import math
from collections.abc import Sequence
from dataclasses import replace

from allocation._columns import pier_lengths
from allocation.errors import ParameterError
from allocation.parameters import (
    AnalysisOptions,
    AssemblyKind,
    AssemblyProperties,
    WallStiffness,
)
from allocation.results import Condition, ConditionKind, Pier

__all__ = [
    "assign_stiffness",
    "cantilever_pier_stiffness",
    "sdpws_deflection",
    "sdpws_stiffness",
    "stiffness_values",
]

logger = logging.getLogger(__name__)

_SHEAR_SHAPE_FACTOR = 1.2  # rectangular section, common practice


def _check_positive(**values: float) -> None:
    for name, v in values.items():
        if not (math.isfinite(v) and v > 0):
            msg = f"{name} = {v} must be a finite number > 0"
            raise ParameterError(msg)


def cantilever_pier_stiffness(
    *, height: float, length: float, thickness: float, E: float, G: float
) -> float:
    """In-plane stiffness of a solid rectangular pier fixed at the base, free on top.

    Common practice: flexure plus shear, ``k = 1/(h³/(3EI) + 1.2h/(AG))`` with
    ``I = t·L³/12`` and ``A = t·L`` (1.2 = shear shape factor of a rectangle).

    Args:
        height: Pier height h [m].
        length: In-plane length L [m].
        thickness: Thickness t [m].
        E: Elastic modulus [Pa].
        G: Shear modulus [Pa].

    Returns:
        Stiffness [N/m].

    Raises:
        ParameterError: An input is not a finite positive number.
    """
    _check_positive(height=height, length=length, thickness=thickness, E=E, G=G)
    inertia = thickness * length**3 / 12.0
    area = thickness * length
    flexibility = height**3 / (3.0 * E * inertia) + _SHEAR_SHAPE_FACTOR * height / (
        area * G
    )
    return float(1.0 / flexibility)


def sdpws_deflection(
    *, v: float, h: float, b: float, EA: float, Ga: float, slip: float
) -> float:
    """Top deflection of a wood structural panel shear wall, three-term equation.

    AWC SDPWS 2015 Eq. 4.3-1, in its SI-consistent form
    ``δ = 2vh³/(3EAb) + vh/Ga + h·Δa/b`` (see the module docstring for the units).

    Args:
        v: Unit shear at the top of the wall [N/m].
        h: Wall height [m].
        b: Wall length [m].
        EA: Axial stiffness of an end post (chord) [N].
        Ga: Apparent shear stiffness of the sheathing [N/m].
        slip: Hold-down deformation Δa at the unit shear ``v`` [m].

    Returns:
        δ [m].

    Raises:
        ParameterError: An input is out of its domain.
    """
    _check_positive(h=h, b=b, EA=EA, Ga=Ga)
    if not (math.isfinite(v) and v >= 0 and math.isfinite(slip) and slip >= 0):
        msg = f"v = {v} N/m and slip = {slip} m must be finite numbers >= 0"
        raise ParameterError(msg)
    bending = 2.0 * v * h**3 / (3.0 * EA * b)
    shear = v * h / Ga
    anchorage = h * slip / b
    return float(bending + shear + anchorage)


def sdpws_stiffness(
    *, h: float, b: float, EA: float, Ga: float, slip: float, v: float
) -> float:
    """Secant in-plane stiffness ``k = v·b/δ(v)`` of a wood structural panel wall.

    AWC SDPWS 2015 Eq. 4.3-1 for δ; common practice: the secant at the design level,
    the slip Δa taken as proportional to the load up to ``v``.

    Args:
        h: Wall height [m].
        b: Wall length [m].
        EA: Axial stiffness of an end post (chord) [N].
        Ga: Apparent shear stiffness of the sheathing [N/m].
        slip: Hold-down deformation Δa at the unit shear ``v`` [m].
        v: Design unit shear at which ``slip`` is given [N/m]; must be > 0 when
            ``slip`` > 0 (without slip the stiffness does not depend on it).

    Returns:
        Stiffness [N/m].

    Raises:
        ParameterError: An input is out of its domain.
    """
    if slip == 0:
        v = 1.0  # δ is then linear in v; any level gives the same secant
    _check_positive(v=v)
    delta = sdpws_deflection(v=v, h=h, b=b, EA=EA, Ga=Ga, slip=slip)
    return float(v * b / delta)


def _missing_inputs(pier: Pier, props: AssemblyProperties | None) -> str:
    """What the pier's assembly model lacks, or ``""`` when it can be evaluated."""
    if props is None:
        return (
            f"assembly '{pier.assembly}' is not defined"
            if pier.assembly
            else ("no assembly assigned")
        )
    if pier.height <= 0 or pier.length <= 0:
        return "pier height or length is not > 0"
    if props.kind in (AssemblyKind.CONCRETE, AssemblyKind.MASONRY):
        lacking = [n for n in ("E", "G") if getattr(props, n) is None]
        if pier.thickness <= 0:
            lacking.append("wall thickness")
    elif props.kind is AssemblyKind.WOOD_PANEL:
        names = ("Ga", "chord_EA", "hold_down_slip")
        lacking = [n for n in names if getattr(props, n) is None]
        if props.hold_down_slip and props.design_unit_shear is None:
            lacking.append("design_unit_shear")
    else:
        return f"assembly '{props.name}' ({props.kind.value}) has no stiffness model"
    if lacking:
        return f"assembly '{props.name}' lacks {', '.join(lacking)}"
    return ""


def _assembly_stiffness(pier: Pier, props: AssemblyProperties) -> float:
    """Absolute stiffness of a pier whose inputs ``_missing_inputs`` found complete."""
    if props.kind is AssemblyKind.WOOD_PANEL:
        return sdpws_stiffness(
            h=pier.height,
            b=pier.length,
            EA=props.chord_EA,
            Ga=props.Ga,
            slip=props.hold_down_slip,
            v=props.design_unit_shear if props.hold_down_slip else 1.0,
        )
    return cantilever_pier_stiffness(
        height=pier.height,
        length=pier.length,
        thickness=pier.thickness,
        E=props.E,
        G=props.G,
    )


def _assign_level(
    level: str, piers: Sequence[Pier], options: AnalysisOptions
) -> tuple[list[float], Condition | None]:
    """Stiffness of one level's piers on one basis, with the fallback condition."""
    props = [options.assembly(p.assembly) for p in piers]
    missing = [_missing_inputs(p, a) for p, a in zip(piers, props, strict=True)]
    lacking = [
        p for p, m in zip(piers, missing, strict=True) if p.direction is not None and m
    ]
    if not lacking:
        out = [
            0.0 if m else _assembly_stiffness(p, a)
            for p, a, m in zip(piers, props, missing, strict=True)
        ]
        return out, None
    reasons = sorted(
        {
            m
            for p, m in zip(piers, missing, strict=True)
            if p.direction is not None and m
        }
    )
    detail = (
        f"level {level}: wall stiffness from length for all its piers, because "
        f"{len(lacking)} pier(s) cannot use analysis.wall_stiffness = 'assembly': "
        f"{'; '.join(reasons)}"
    )
    logger.warning(detail)
    cond = Condition(
        kind=ConditionKind.STIFFNESS_FALLBACK,
        level=level,
        direction=None,
        guids=tuple(sorted({p.guid for p in lacking})),
        detail=detail,
        value=float(len(lacking)),
    )
    return [float(p.length) for p in piers], cond


def stiffness_values(
    piers: Sequence[Pier], options: AnalysisOptions
) -> tuple[list[float], tuple[Condition, ...]]:
    """The stiffness :func:`assign_stiffness` gives each pier, without new piers.

    Returns:
        One stiffness per pier, in the given order [m or N/m], and the conditions.
    """
    if options.wall_stiffness is WallStiffness.LENGTH:
        return pier_lengths(piers), ()  # [float(p.length) for p in piers]
    by_level: dict[str, list[int]] = {}
    for i, p in enumerate(piers):
        by_level.setdefault(p.level, []).append(i)
    done: dict[int, float] = {}
    conditions: list[Condition] = []
    for level, index in by_level.items():
        values, cond = _assign_level(level, [piers[i] for i in index], options)
        done.update(zip(index, values, strict=True))
        if cond is not None:
            conditions.append(cond)
    return [done[i] for i in range(len(piers))], tuple(conditions)


def assign_stiffness(
    piers: Sequence[Pier], options: AnalysisOptions
) -> tuple[tuple[Pier, ...], tuple[Condition, ...]]:
    """Set each pier's in-plane stiffness for the rigid-diaphragm allocation.

    Common practice: stiffness proportional to length for light-frame walls; the
    cantilever pier for concrete and masonry; AWC SDPWS 2015 Eq. 4.3-1 (secant at the
    design level) for wood structural panel walls.

    With ``wall_stiffness = "length"`` every pier gets ``stiffness = length``. With
    ``"assembly"`` each level is all-absolute [N/m] or, if any of its X/Y piers lacks
    inputs, all-length with a ``STIFFNESS_FALLBACK`` condition. A skewed pier
    (direction None) whose model is incomplete gets 0 and does not force a fallback.

    Args:
        piers: Piers of the building [m].
        options: Analysis options; ``wall_stiffness`` and ``assemblies`` are used.

    Returns:
        The piers in the given order with ``stiffness`` set [m or N/m], and the
        conditions (one per level that fell back to length).
    """
    values, conditions = stiffness_values(piers, options)
    return (
        tuple(replace(p, stiffness=k) for p, k in zip(piers, values, strict=True)),
        conditions,
    )
