"""Shear walls the config gives no assembly: they cannot be checked.

Not a code provision (clause empty). Severity: error — no capacity is ever assumed.
Walls that became allocated piers are reported by the unit shear rule instead (with
their demand), so pass their GlobalIds as ``allocated``.
"""

from __future__ import annotations

from collections.abc import Collection

from checks.findings import Finding, Severity
from ifc_bridge.model import BuildingModel

__all__ = ["check_unmatched_shear_walls"]

RULE = "unmatched_shear_wall"


def check_unmatched_shear_walls(
    model: BuildingModel, *, allocated: Collection[str] = ()
) -> list[Finding]:
    """Error for each shear wall (by GlobalId) with no ``[[assemblies]]`` match.

    Common practice: every shear wall needs a declared assembly before its capacity can
    be checked.

    Args:
        model: The model, shear walls recognised.
        allocated: GlobalIds already reported by the unit shear rule.

    Returns:
        One finding per wall GlobalId, in model order.
    """
    out: dict[str, Finding] = {}
    skip = set(allocated)
    for w in model.shear_walls:
        if w.assembly or w.guid in skip or w.guid in out:
            continue
        what = f"type {w.type_name!r}" if w.type_name else f"wall name {w.name!r}"
        out[w.guid] = Finding(
            rule=RULE,
            clause="",
            severity=Severity.ERROR,
            level=w.level or w.storey,
            direction=None,
            guids=(w.guid,),
            title="Shear wall with no assembly",
            description=(
                f"Wall {w.name!r} ({w.guid}) on {w.storey!r} is a shear wall "
                f"(PredefinedType {w.predefined_type or '-'}) but no assembly matches "
                "it: "
                f"no capacity assigned: add an [[assemblies]] entry matching {what}."
            ),
            discriminator="no assembly",
            location=w.midpoint,
        )
    return list(out.values())
