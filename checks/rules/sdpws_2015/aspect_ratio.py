"""Shear wall aspect ratio limits and the aspect ratio factor of wood structural panels.

AWC SDPWS-2015 §4.3.4 (Table 4.3.4 limits and the §4.3.4.2 factor, from memory):

* wood structural panels, blocked: h/bs ≤ 3.5; unblocked: h/bs ≤ 2.0;
* gypsum board: h/bs ≤ 2.0;
* for wood structural panels with 2.0 < h/bs ≤ 3.5 the unit shear capacity is
  multiplied by 1.25 − 0.125·h/bs;
* concrete, masonry and other assemblies: no limit from SDPWS.

An assembly's ``aspect_ratio_limit`` overrides the limit. A pier beyond its limit cannot
be counted as a shear wall pier: its factor is 0 and it gets an error finding.
"""

from __future__ import annotations

from allocation.parameters import AssemblyKind
from allocation.results import Allocation
from checks.findings import Finding, Severity
from checks.project import Assembly, ProjectConfig

__all__ = ["aspect_factor", "aspect_ratio_limit", "check_aspect_ratio"]

RULE = "aspect_ratio"
CLAUSE_LIMIT = "AWC SDPWS-2015 §4.3.4"
CLAUSE_FACTOR = "AWC SDPWS-2015 §4.3.4.2"


def aspect_ratio_limit(assembly: Assembly) -> float | None:
    """Largest permitted h/bs of a pier of the assembly.

    AWC SDPWS-2015 §4.3.4 (Table 4.3.4, from memory).

    Args:
        assembly: The wall assembly.

    Returns:
        The limit [-], or None where SDPWS sets none (concrete, masonry, other).
    """
    if assembly.aspect_ratio_limit is not None:
        return float(assembly.aspect_ratio_limit)
    if assembly.kind is AssemblyKind.WOOD_PANEL:
        return 3.5 if assembly.blocked else 2.0
    if assembly.kind is AssemblyKind.GYPSUM:
        return 2.0
    return None


def aspect_factor(assembly: Assembly, ratio: float) -> float:
    """Factor on the unit shear capacity for the pier's aspect ratio.

    AWC SDPWS-2015 §4.3.4.2 (from memory): 1.25 − 0.125·h/bs for wood structural
    panels with 2.0 < h/bs ≤ 3.5; 1.0 up to 2.0 and for other kinds within their limit;
    0.0 beyond the limit (the pier does not count).

    Args:
        assembly: The wall assembly.
        ratio: h/bs of the pier [-].

    Returns:
        The factor [-].
    """
    limit = aspect_ratio_limit(assembly)
    if limit is not None and ratio > limit + 1e-9:
        return 0.0
    if assembly.kind is AssemblyKind.WOOD_PANEL and ratio > 2.0:
        return float(min(1.0, 1.25 - 0.125 * ratio))
    return 1.0


def check_aspect_ratio(allocation: Allocation, config: ProjectConfig) -> list[Finding]:
    """Error for each shear wall pier taller than its assembly's h/bs limit.

    AWC SDPWS-2015 §4.3.4.

    Severity: error (the pier cannot be counted; its capacity is taken as zero).
    Piers without an assembly are left to the capacity rule.

    Args:
        allocation: Piers with their height and length [m].
        config: Assemblies by name.

    Returns:
        One finding per pier over the limit.
    """
    findings = []
    limits: dict[str, tuple[Assembly | None, float | None]] = {}
    for pier in allocation.piers:
        if not pier.assembly:
            continue
        if pier.assembly not in limits:
            found = config.assembly(pier.assembly)
            limits[pier.assembly] = (
                found,
                None if found is None else aspect_ratio_limit(found),
            )
        assembly, limit = limits[pier.assembly]
        if assembly is None or limit is None:
            continue
        ratio = pier.aspect_ratio
        if ratio <= limit + 1e-9:
            continue
        d = pier.direction.value if pier.direction else "-"
        findings.append(
            Finding(
                rule=RULE,
                clause=CLAUSE_LIMIT,
                severity=Severity.ERROR,
                level=pier.level,
                direction=pier.direction,
                guids=(pier.guid,),
                title=f"Shear wall pier too slender: h/b = {ratio:.2f} > {limit:.2f}",
                description=(
                    f"Pier {pier.pier} of wall {pier.name!r} ({pier.guid}) supporting "
                    f"{pier.level!r}: height {pier.height:.2f} m over length "
                    f"{pier.length:.2f} m "
                    f"gives h/b = {ratio:.2f}, above the {limit:.2f} limit for "
                    "assembly "
                    f"{assembly.name!r}; it is not counted as a shear wall pier "
                    "(capacity 0). "
                    "Lengthen the pier, or remove it from the shear wall assembly."
                ),
                demand=ratio,
                capacity=limit,
                unit="-",
                discriminator=f"{pier.level}|{d}|pier {pier.part}.{pier.pier}",
                location=pier.midpoint,
            )
        )
    return findings
