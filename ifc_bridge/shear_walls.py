"""Shear-wall recognition: which IFC walls resist lateral force, and with which assembly.

Defaults (documented in the README): a wall is a shear wall when its effective
PredefinedType (occurrence, else its type) is ``SHEAR``, or when an assembly ``match``
rule of the config matches it. Rules are tried in config order; the first match names
the wall's assembly. A ``SHEAR`` wall that no rule matches stays a shear wall with no
assembly (the checks report it: no capacity is ever assumed).

Patterns are case-insensitive shell-style globs (``"Shear Wall*"``); a pattern without
wildcards must match the whole value.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Iterable
from dataclasses import dataclass
from fnmatch import fnmatchcase

from ifc_bridge.model import WallSegment

__all__ = ["MatchRule", "match_assembly", "recognise_shear_walls"]


@dataclass(frozen=True, slots=True, kw_only=True)
class MatchRule:
    """How one ``[[assemblies]]`` entry finds its walls; every given key must match.

    Attributes:
        assembly: Assembly name the matched walls get.
        type_name: Glob on the IfcWallType name, or None.
        material: Glob on any of the wall's material names, or None.
        property_name: Flattened ``"Pset.Property"`` key, or None.
        property_value: Glob on that property's value (None: the property must exist).
        name: Glob on the wall's own Name, or None.
    """

    assembly: str
    type_name: str | None = None
    material: str | None = None
    property_name: str | None = None
    property_value: str | None = None
    name: str | None = None

    def __post_init__(self) -> None:
        keys = (self.type_name, self.material, self.property_name, self.name)
        if all(k is None for k in keys):
            msg = (
                f"assembly {self.assembly!r}: match needs at least one of "
                "type_name, material, property, name"
            )
            raise ValueError(msg)

    def matches(self, wall: WallSegment) -> bool:
        """True when every key given in the rule matches the wall."""
        if self.type_name is not None and not _glob(wall.type_name, self.type_name):
            return False
        if self.name is not None and not _glob(wall.name, self.name):
            return False
        if self.material is not None and not any(
            _glob(m, self.material) for m in wall.materials
        ):
            return False
        if self.property_name is not None:
            value = wall.property_value(self.property_name)
            if value is None:
                return False
            if self.property_value is not None and not _glob(
                value, self.property_value
            ):
                return False
        return True


def _glob(value: str, pattern: str) -> bool:
    return fnmatchcase(value.casefold(), pattern.casefold())


def match_assembly(wall: WallSegment, rules: Iterable[MatchRule]) -> str:
    """Name of the first assembly whose rule matches the wall, or ``""``."""
    for rule in rules:
        if rule.matches(wall):
            return rule.assembly
    return ""


def recognise_shear_walls(
    walls: Iterable[WallSegment],
    rules: Iterable[MatchRule] = (),
    *,
    use_predefined_type: bool = True,
) -> tuple[WallSegment, ...]:
    """Set ``is_shear_wall`` and ``assembly`` on every wall segment.

    Args:
        walls: Wall segments as read.
        rules: Assembly match rules in config order.
        use_predefined_type: Treat PredefinedType ``SHEAR`` as a shear wall.

    Returns:
        The segments, replaced with their recognition result, in the same order.
    """
    rules = tuple(rules)
    out = []
    for wall in walls:
        assembly = match_assembly(wall, rules)
        is_shear = bool(assembly) or (
            use_predefined_type and wall.predefined_type.upper() == "SHEAR"
        )
        out.append(dataclasses.replace(wall, is_shear_wall=is_shear, assembly=assembly))
    return tuple(out)
