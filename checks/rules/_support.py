"""Small look-ups the rules share: forces per pier, level records, GUIDs of a line.

Axes: a line acting in X lies along X at a perpendicular offset y; a line acting in Y
lies along Y at offset x. ``perp(direction)`` is the index of the offset coordinate,
``along(direction)`` the index of the coordinate along the line.
"""

from __future__ import annotations

import re
from collections.abc import Iterable
from typing import NamedTuple

from allocation._columns import pier_lengths
from allocation.results import Allocation, LevelLoad, Pier, ResistanceLine
from checks.project import ProjectConfig
from checks.units import format_value
from ifc_bridge.model import BuildingModel, Direction, IfcGuid

__all__ = [
    "AllocatedPiers",
    "allocated_piers",
    "along",
    "fmt",
    "level_guids",
    "level_load",
    "line_guids",
    "perp",
    "pier_force",
    "piers_by_id",
    "slab_guids",
    "unique_sorted",
]


def perp(direction: Direction) -> int:
    """Index (0 = x, 1 = y) of the offset of a line acting in ``direction``."""
    return 1 if direction is Direction.X else 0


def along(direction: Direction) -> int:
    """Index (0 = x, 1 = y) of the coordinate along a line acting in ``direction``."""
    return 0 if direction is Direction.X else 1


def fmt(value: float, quantity: str, config: ProjectConfig) -> str:
    """An SI value in the project's display units (``"260 plf"``), for descriptions."""
    return format_value(value, quantity, config.display_units)


_SI_FORCE = re.compile(r"(-?\d+(?:\.\d+)?(?:e[+-]?\d+)?) N\b")
_SI_POINT = re.compile(r"\((-?\d+(?:\.\d+)?), (-?\d+(?:\.\d+)?)\) m\b")
_SI_LENGTH = re.compile(r"(-?\d+(?:\.\d+)?) m\b")


def in_display_units(text: str, config: ProjectConfig) -> str:
    """Rewrite the SI numbers of an allocation condition's text in display units.

    Conditions from ``allocation`` state forces as ``"17126 N"``, points as
    ``"(12.00, 3.50) m"`` and lengths as ``"2.00 m"``; findings read in the
    project's units.
    """
    text = _SI_FORCE.sub(lambda m: fmt(float(m.group(1)), "force", config), text)
    text = _SI_POINT.sub(
        lambda m: f"({fmt(float(m.group(1)), 'length', config)}, "
        f"{fmt(float(m.group(2)), 'length', config)})",
        text,
    )
    return _SI_LENGTH.sub(lambda m: fmt(float(m.group(1)), "length", config), text)


def piers_by_id(allocation: Allocation) -> dict[str, Pier]:
    """Piers keyed by their id."""
    return {p.id: p for p in allocation.piers}


def pier_force(allocation: Allocation, pier_id: str) -> float:
    """Governing in-plane shear of a pier, QE [N] (magnitude).

    Common practice: the envelope of the flexible and rigid results; where the
    allocation has no envelope entry, the largest magnitude over every result.
    """
    env = allocation.envelope.get(pier_id)
    if env is not None:
        return float(abs(env.envelope))
    forces = [
        abs(r.pier_forces[pier_id])
        for r in allocation.flexible
        if pier_id in r.pier_forces
    ]
    forces += [
        abs(r.pier_forces[pier_id])
        for r in allocation.rigid
        if pier_id in r.pier_forces
    ]
    return float(max(forces, default=0.0))


class AllocatedPiers(NamedTuple):
    """The piers with a direction, in allocation order, with their numbers."""

    piers: list[Pier]
    lengths: list[float]  # Pier.length [m]
    forces: list[float]  # pier_force [N]


_ALLOCATED: list[tuple[Allocation, AllocatedPiers]] = []  # the last allocation's


def allocated_piers(allocation: Allocation) -> AllocatedPiers:
    """The allocated piers (skewed ones left out), their lengths and governing forces.

    Worked out once per allocation (the unit-shear and overturning rules both
    read them); the same floats as ``Pier.length`` and :func:`pier_force`.
    """
    if _ALLOCATED and _ALLOCATED[0][0] is allocation:
        return _ALLOCATED[0][1]
    piers = [p for p in allocation.piers if p.direction is not None]
    env = allocation.envelope
    forces = []
    for p in piers:
        e = env.get(p.id)
        forces.append(
            float(abs(e.envelope)) if e is not None else pier_force(allocation, p.id)
        )
    found = AllocatedPiers(piers, pier_lengths(piers), forces)
    _ALLOCATED[:] = [(allocation, found)]
    return found


def level_load(allocation: Allocation, level: str) -> LevelLoad | None:
    """Load record of a diaphragm level, or None."""
    for lv in allocation.levels:
        if lv.level == level:
            return lv
    return None


def level_guids(
    allocation: Allocation, level: str, model: BuildingModel | None = None
) -> tuple[IfcGuid, ...]:
    """GlobalId of the level's IfcBuildingStorey as a 1-tuple (or ``()`` if unknown)."""
    lv = level_load(allocation, level)
    if lv is not None and lv.guid:
        return (lv.guid,)
    if model is not None:
        for name, guid in model.storey_guids:
            if name == level:
                return (guid,)
        for lvl in model.levels:
            if lvl.name == level:
                return (lvl.guid,)
    return ()


def line_guids(allocation: Allocation, line: ResistanceLine) -> tuple[IfcGuid, ...]:
    """Sorted GlobalIds of the walls of a line."""
    by_id = piers_by_id(allocation)
    return unique_sorted(by_id[p].guid for p in line.piers if p in by_id)


def unique_sorted(guids: Iterable[IfcGuid]) -> tuple[IfcGuid, ...]:
    """Sorted tuple of distinct, non-empty GlobalIds."""
    return tuple(sorted({g for g in guids if g}))


def slab_guids(
    model: BuildingModel | None, allocation: Allocation, level: str, diaphragm: str
) -> tuple[tuple[str, ...], str]:
    """GlobalIds a diaphragm finding is pinned to, and a discriminator suffix.

    The diaphragm's slabs when the model is given (stable across revisions), else the
    storey with the diaphragm id in the discriminator.
    """
    if model is not None:
        for d in model.diaphragms:
            if d.id == diaphragm and d.slab_guids:
                return d.slab_guids, ""
    return level_guids(allocation, level, model), f"|{diaphragm}"
