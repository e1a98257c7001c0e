"""Unit shear demand against capacity, per shear wall pier.

Demand: v = f·ρ·QE / L with QE the pier's governing (envelope) in-plane shear and f the
seismic load combination factor: 0.7 in ASD (ASCE 7-16 §2.4.5, combinations 8 and 10),
1.0 in LRFD (§2.3.6, combinations 6 and 7). Capacity: the assembly's allowable (ASD) or
design (LRFD) unit shear, times the SDPWS aspect ratio factor.

Severity policy: DCR > 1.0 → error; 0.95 < DCR ≤ 1.0 → warning (within rounding of
the capacity); otherwise no finding (the numbers go to ``results.json``). A pier with no
assembly, or an assembly with no capacity, → error: no capacity is ever assumed.
"""

from __future__ import annotations

import logging
from collections import defaultdict
from collections.abc import Mapping
from dataclasses import dataclass

from allocation._records import maker
from allocation.parameters import AssemblyKind
from allocation.results import Allocation, Pier, PierId
from checks.findings import Finding, Severity
from checks.project import Assembly, ProjectConfig
from checks.rules._support import allocated_piers, fmt
from checks.rules.asce7_16.load_combinations import combination_clause, seismic_factor
from checks.rules.asce7_16.overturning import HoldDown
from checks.rules.sdpws_2015.aspect_ratio import aspect_factor
from ifc_bridge.model import BuildingModel

__all__ = ["PierCheck", "check_unit_shear", "pier_capacity", "pier_checks"]

log = logging.getLogger(__name__)

RULE = "unit_shear"
WARNING_DCR = 0.95

_CAPACITY_CLAUSE = {
    AssemblyKind.WOOD_PANEL: "AWC SDPWS-2015 §4.3.3",
    AssemblyKind.GYPSUM: "AWC SDPWS-2015 §4.3.3",
    AssemblyKind.CONCRETE: "ACI 318-19 §18.10.4",
}


@dataclass(frozen=True, slots=True, kw_only=True)
class PierCheck:
    """The numbers of one pier for ``results.json``.

    Attributes:
        pier: Pier id.
        force: Governing in-plane shear QE, unfactored [N].
        unit_shear: Demand v = f·ρ·QE/L with the combination factor f [N/m].
        capacity: Unit shear capacity after the aspect factor [N/m], or None when
            none is assigned.
        dcr: unit_shear / capacity [-], or None (no capacity, or capacity 0).
        aspect_ratio: h/b [-].
        aspect_factor: SDPWS aspect ratio factor applied to the capacity [-]
            (0 beyond the limit).
        hold_down_tension: Net uplift at the pier's end [N], filled in by the
            overturning rule, or None.
    """

    pier: PierId
    force: float
    unit_shear: float
    capacity: float | None
    dcr: float | None
    aspect_ratio: float
    aspect_factor: float
    hold_down_tension: float | None = None


_pier_check = maker(PierCheck)  # PierCheck(...), faster for every pier


def _assembly_capacity(
    pier: Pier, assembly: Assembly, config: ProjectConfig
) -> float | None:
    return _base_capacity(
        assembly, config, length=pier.length, height=pier.height, t=pier.thickness
    )


def _base_capacity(
    assembly: Assembly, config: ProjectConfig, *, length: float, height: float, t: float
) -> float | None:
    try:
        from checks.capacity import wall_unit_capacity
    except ModuleNotFoundError as exc:
        if exc.name != "checks.capacity":
            raise
        return assembly.unit_shear_capacity
    value = wall_unit_capacity(
        assembly,
        length=length,
        height=height,
        thickness=t,
        basis=config.design_basis,
    )
    return None if value is None else float(value)


class _Capacities:
    """:func:`pier_capacity` of many piers: assemblies by name, values by geometry.

    The capacity of an assembly and its aspect factor depend only on the pier's
    length, height and thickness, so each distinct set is worked out once (a tower's
    typical floors repeat them).
    """

    __slots__ = ("_assemblies", "_found", "config")

    def __init__(self, config: ProjectConfig) -> None:
        self.config = config
        self._assemblies: dict[str, Assembly | None] = {}
        # (assembly, length, height, thickness) -> (capacity, aspect factor)
        self._found: dict[tuple, tuple[float | None, float]] = {}

    def assembly(self, name: str) -> Assembly | None:
        """``config.assembly(name)``, looked up once per name."""
        try:
            return self._assemblies[name]
        except KeyError:
            found = self._assemblies[name] = self.config.assembly(name)
            return found

    def of(self, pier: Pier, length: float) -> tuple[float | None, float]:
        """:func:`pier_capacity` of ``pier``, whose length is ``length`` [m]."""
        key = (pier.assembly, length, pier.height, pier.thickness)
        found = self._found.get(key)
        if found is None:
            found = self._found[key] = self._work_out(*key)
        return found

    def _work_out(
        self, name: str, length: float, height: float, t: float
    ) -> tuple[float | None, float]:
        assembly = self.assembly(name) if name else None
        if assembly is None:
            return None, 1.0
        factor = aspect_factor(assembly, height / length)  # Pier.aspect_ratio
        base = _base_capacity(assembly, self.config, length=length, height=height, t=t)
        if base is None:
            return None, factor
        return float(base) * factor, factor


def pier_capacity(pier: Pier, config: ProjectConfig) -> tuple[float | None, float]:
    """Unit shear capacity of a pier and the aspect factor in it.

    AWC SDPWS-2015 §4.3.3 (allowable = vs/2.0, design = 0.8·vs) and §4.3.4.2 (aspect
    ratio factor), through the assembly; ACI 318-19 §18.10.4 for concrete where
    ``checks.capacity`` provides it.

    Args:
        pier: The pier; length, height and thickness [m].
        config: Assemblies and design basis.

    Returns:
        (capacity [N/m] or None when none is assigned, aspect factor [-]).
    """
    return _Capacities(config).of(pier, pier.length)


_LAST_CAPACITIES: list[
    tuple[Allocation, ProjectConfig, dict[PierId, tuple[float | None, float]]]
] = []  # the last allocation's, with its config


def allocated_capacities(
    allocation: Allocation, config: ProjectConfig
) -> dict[PierId, tuple[float | None, float]]:
    """:func:`pier_capacity` of every allocated pier (those with a direction), by id.

    Worked out once per allocation and config (the unit-shear and redundancy rules
    both read them), at the lengths of :func:`allocated_piers`.
    """
    if _LAST_CAPACITIES:
        held, cfg, table = _LAST_CAPACITIES[0]
        if held is allocation and cfg is config:
            return table
    caps = _Capacities(config)
    piers, lengths, _ = allocated_piers(allocation)
    table = {p.id: caps.of(p, n) for p, n in zip(piers, lengths, strict=True)}
    _LAST_CAPACITIES[:] = [(allocation, config, table)]
    return table


def pier_checks(
    allocation: Allocation,
    config: ProjectConfig,
    *,
    rho: float | None = None,
    hold_downs: Mapping[PierId, HoldDown] | None = None,
) -> dict[PierId, PierCheck]:
    """Demand, capacity and ratio of every allocated pier.

    ASCE 7-16 §2.4.5 / §2.3.6 for the demand; capacity per :func:`pier_capacity`.

    Args:
        allocation: Piers and their envelope forces [N].
        config: Assemblies, design basis and ``seismic.rho``.
        rho: Redundancy factor [-]; default ``seismic.rho``, else 1.0.
        hold_downs: Overturning per pier (``tension`` [N]) from the overturning
            rule, for ``hold_down_tension``; None leaves it None.

    Returns:
        Per pier id (piers with a direction only; skewed walls are not allocated).
    """
    rho = _rho(config, rho)
    f = seismic_factor(config.design_basis)
    caps = allocated_capacities(allocation, config)
    holds = hold_downs or {}
    out: dict[PierId, PierCheck] = {}
    for pier, length, force in zip(*allocated_piers(allocation), strict=True):
        v = f * rho * force / length
        capacity, factor = caps[pier.id]
        dcr = v / capacity if capacity else None
        hold = holds.get(pier.id)
        out[pier.id] = _pier_check(
            pier=pier.id,
            force=force,
            unit_shear=float(v),
            capacity=capacity,
            dcr=None if dcr is None else float(dcr),
            aspect_ratio=float(pier.height / length),  # Pier.aspect_ratio
            aspect_factor=float(factor),
            hold_down_tension=None if hold is None else hold.tension,
        )
    return out


def _rho(config: ProjectConfig, rho: float | None) -> float:
    if rho is not None:
        return float(rho)
    return 1.0 if config.seismic.rho is None else float(config.seismic.rho)


def check_unit_shear(
    allocation: Allocation,
    config: ProjectConfig,
    *,
    model: BuildingModel | None = None,
    rho: float | None = None,
    checks: Mapping[PierId, PierCheck] | None = None,
) -> list[Finding]:
    """Findings for piers over (or near) capacity, or with no capacity at all.

    ASCE 7-16 §2.4.5 (ASD) or §2.3.6 (LRFD) for the demand; AWC SDPWS-2015 §4.3.3 or
    ACI 318-19 §18.10.4 for the capacity, by assembly kind.

    Args:
        allocation: Piers and forces.
        config: Assemblies, design basis.
        model: The model, to name a wall's IFC type in the "no capacity" finding.
        rho: Redundancy factor [-]; default ``seismic.rho``, else 1.0 (stated).
        checks: Precomputed :func:`pier_checks` with the same ``rho``, or None.

    Returns:
        The findings, unsorted.
    """
    if checks is None:
        checks = pier_checks(allocation, config, rho=rho)
    rho_note = _rho_note(config, rho)
    findings: list[Finding] = []
    missing: dict[tuple[str, str], list[Pier]] = defaultdict(list)
    for pier in allocation.piers:
        c = checks.get(pier.id)
        if c is None:
            continue
        if c.capacity is None:
            missing[(pier.guid, pier.level)].append(pier)
        elif c.dcr is not None and c.dcr > WARNING_DCR:
            findings.append(_ratio_finding(pier, c, config, rho_note))
    for piers in missing.values():
        findings.append(_missing_finding(piers, config, model))
    return findings


def _rho_note(config: ProjectConfig, rho: float | None) -> str:
    if rho is not None:
        return f"ρ = {rho:g}"
    if config.seismic.rho is not None:
        return f"ρ = {config.seismic.rho:g} (seismic.rho)"
    return "ρ = 1.0 assumed (seismic.rho not given)"


def _ratio_finding(
    pier: Pier, c: PierCheck, config: ProjectConfig, rho_note: str
) -> Finding:
    assembly = config.assembly(pier.assembly)
    kind = assembly.kind if assembly else AssemblyKind.OTHER
    over = c.dcr is not None and c.dcr > 1.0
    f = seismic_factor(config.design_basis)
    basis = config.design_basis.value
    d = pier.direction.value if pier.direction else "-"
    factor = f", aspect factor {c.aspect_factor:.3f}" if c.aspect_factor != 1.0 else ""
    text = (
        f"Pier {pier.pier} of wall {pier.name!r} ({pier.guid}) on line "
        f"{pier.line or '-'} "
        f"supporting {pier.level!r}: QE = {fmt(c.force, 'force', config)}, "
        f"v = {f:g}·ρ·QE/L = {fmt(c.unit_shear, 'force_per_length', config)} "
        f"over L = {fmt(pier.length, 'length', config)} ({basis}, "
        f"{combination_clause(config.design_basis)}; {rho_note}) against "
        f"{fmt(c.capacity or 0.0, 'force_per_length', config)} "
        f"({pier.assembly}{factor}): DCR = {c.dcr:.2f}. "
    )
    text += (
        "Add wall length on this line, or use a stronger assembly."
        if over
        else "Near capacity: confirm the assembly and the dead load assumptions."
    )
    return Finding(
        rule=RULE,
        clause=_CAPACITY_CLAUSE.get(kind, combination_clause(config.design_basis)),
        severity=Severity.ERROR if over else Severity.WARNING,
        level=pier.level,
        direction=pier.direction,
        guids=(pier.guid,),
        title=(
            f"Shear wall over capacity: DCR {c.dcr:.2f}"
            if over
            else f"Shear wall near capacity: DCR {c.dcr:.2f}"
        ),
        description=text,
        demand=c.unit_shear,
        capacity=c.capacity,
        unit="N/m",
        discriminator=f"{pier.level}|{d}|pier {pier.part}.{pier.pier}",
        location=pier.midpoint,
    )


def _type_name(guid: str, model: BuildingModel | None) -> str:
    if model is None:
        return ""
    for w in model.walls:
        if w.guid == guid:
            return w.type_name
    return ""


def _missing_finding(
    piers: list[Pier], config: ProjectConfig, model: BuildingModel | None
) -> Finding:
    pier = piers[0]
    type_name = _type_name(pier.guid, model)
    assembly = config.assembly(pier.assembly) if pier.assembly else None
    if assembly is None:
        what = f"type {type_name!r}" if type_name else f"wall name {pier.name!r}"
        fix = f"no capacity assigned: add an [[assemblies]] entry matching {what}"
    else:
        fix = (
            f"assembly {assembly.name!r} gives no unit shear capacity: set "
            "unit_shear_capacity, sheathing + fastener + edge_spacing, or "
            "nominal_unit_shear"
        )
    return Finding(
        rule=RULE,
        clause="",  # a data problem, not a provision
        severity=Severity.ERROR,
        level=pier.level,
        direction=pier.direction,
        guids=(pier.guid,),
        title="Shear wall with no capacity",
        description=(
            f"Wall {pier.name!r} ({pier.guid}) supporting {pier.level!r}, "
            f"{len(piers)} pier(s): {fix}. Its unit shear cannot be checked."
        ),
        discriminator=f"{pier.level}|no capacity",
        location=pier.midpoint,
    )
