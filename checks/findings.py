"""Findings: what the checks report about the model, pinned to IFC GlobalIds.

A finding's ``id`` is derived from its rule, the GlobalIds involved and a stable
discriminator (level, direction, pier), never from numbers or dates, so the same problem
keeps its id — and its BCF topic — across model revisions.
"""

from __future__ import annotations

import hashlib
import uuid
from dataclasses import dataclass
from enum import StrEnum

from ifc_bridge.model import Direction, IfcGuid

__all__ = ["Finding", "Severity", "stable_id", "topic_guid"]

# Namespace for BCF topic GUIDs derived from finding ids (uuid5); never change it.
_TOPIC_NAMESPACE = uuid.UUID("6b1d4a52-9a57-4f5e-8d0c-5f2e7c1b3a90")


class Severity(StrEnum):
    """Severity of a finding; ``ERROR`` makes ``shearline check`` exit with 1."""

    ERROR = "error"
    WARNING = "warning"
    INFO = "info"


def stable_id(rule: str, guids: tuple[IfcGuid, ...], discriminator: str = "") -> str:
    """A short id that depends only on the rule, the sorted GUIDs and a discriminator.

    Args:
        rule: Rule name, e.g. ``"unit_shear"``.
        guids: GlobalIds involved (order does not matter).
        discriminator: Stable qualifier (``"Level 2|X|pier 1"``), or ``""``.

    Returns:
        ``"<rule>-<12 hex digits>"``.
    """
    text = "\n".join([rule, *sorted(guids), discriminator])
    return f"{rule}-{hashlib.sha256(text.encode('utf-8')).hexdigest()[:12]}"


def topic_guid(finding_id: str) -> str:
    """BCF topic GUID (a UUID string) derived from a finding id."""
    return str(uuid.uuid5(_TOPIC_NAMESPACE, finding_id))


@dataclass(frozen=True, slots=True, kw_only=True)
class Finding:
    """One result of a check that the design team should see.

    Attributes:
        rule: Rule name (module name of the rule), e.g. ``"unit_shear"``.
        clause: Clause cited, ``"<standard> <edition> <Eq.|§|Table> <id>"``.
        severity: error / warning / info.
        level: Level name (``""`` for building-wide findings).
        direction: Direction, or None.
        guids: GlobalIds involved, sorted; what the BCF viewpoint selects.
        title: Short title in an engineer's words.
        description: What was found, the numbers and what to do.
        demand: Demand in SI ``unit``, or None.
        capacity: Capacity in SI ``unit``, or None.
        unit: SI unit of demand and capacity (``"N/m"``, ``"N"``, ``"-"``), or ``""``.
        discriminator: Stable qualifier that keeps ids unique (level, direction, pier).
        location: Plan point (x, y) [m] for the snapshot and camera, or None.
    """

    rule: str
    clause: str
    severity: Severity
    level: str
    direction: Direction | None
    guids: tuple[IfcGuid, ...]
    title: str
    description: str
    demand: float | None = None
    capacity: float | None = None
    unit: str = ""
    discriminator: str = ""
    location: tuple[float, float] | None = None

    def __post_init__(self) -> None:
        if tuple(sorted(self.guids)) != self.guids:
            object.__setattr__(self, "guids", tuple(sorted(self.guids)))

    @property
    def id(self) -> str:
        """Stable id from rule, GUIDs and discriminator."""
        return stable_id(self.rule, self.guids, self.discriminator)

    @property
    def ratio(self) -> float | None:
        """Demand / capacity [-], or None when either is missing or capacity is 0."""
        if self.demand is None or not self.capacity:
            return None
        return self.demand / self.capacity
