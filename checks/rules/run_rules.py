"""Front door of the code checks: model + forces + config -> findings and numbers.

Order: ρ (redundancy needs only capacities), then per-pier unit shear with that ρ,
hold-down tension, diaphragm demands, irregularities, load-path conditions and the
model's own data problems. Findings are sorted by severity (error, warning, info), then
id, so the same inputs always give the same list.
"""

from __future__ import annotations

from dataclasses import dataclass

from allocation.results import Allocation, PierId
from checks.findings import Finding, Severity
from checks.project import ProjectConfig
from checks.rules.asce7_16.diaphragm import (
    DiaphragmDemands,
    check_diaphragm,
    diaphragm_demands,
)
from checks.rules.asce7_16.discontinuity import check_discontinuity
from checks.rules.asce7_16.irregularities import check_irregularities
from checks.rules.asce7_16.overturning import (
    HoldDown,
    check_overturning,
    hold_down_forces,
)
from checks.rules.asce7_16.redundancy import (
    Redundancy,
    check_redundancy,
    evaluate_redundancy,
)
from checks.rules.asce7_16.seismic_design_category import seismic_design_category
from checks.rules.asce7_16.unit_shear import PierCheck, check_unit_shear, pier_checks
from checks.rules.model.duplicate_walls import check_duplicate_walls
from checks.rules.model.import_issues import check_import_issues
from checks.rules.model.unmatched_shear_walls import check_unmatched_shear_walls
from checks.rules.sdpws_2015.aspect_ratio import check_aspect_ratio
from checks.rules.sdpws_2015.diaphragm_aspect_ratio import check_diaphragm_aspect_ratio
from ifc_bridge.gc_pause import collection_paused
from ifc_bridge.model import BuildingModel

__all__ = ["CheckResult", "run_checks", "sort_findings"]

_ORDER = {s: i for i, s in enumerate(Severity)}


@dataclass(frozen=True, slots=True, kw_only=True)
class CheckResult:
    """Everything the rules produced.

    Attributes:
        findings: Sorted by severity then id; ids are distinct.
        pier_checks: Per pier: unit shear, capacity [N/m], DCR, aspect factor, hold-down
            tension [N].
        hold_down: Per pier overturning numbers [N·m, N].
        rho: Redundancy factor used [-].
        redundancy: How ρ was decided.
        sdc: Seismic design category used by the rules.
        diaphragm: Diaphragm unit shears, chord and collector forces.
    """

    findings: tuple[Finding, ...]
    pier_checks: dict[PierId, PierCheck]
    hold_down: dict[PierId, HoldDown]
    rho: float
    redundancy: Redundancy
    sdc: str
    diaphragm: DiaphragmDemands


def sort_findings(findings: list[Finding]) -> tuple[Finding, ...]:
    """Distinct findings (first of each id kept), errors first, then by id."""
    unique: dict[str, Finding] = {}
    for f in findings:
        unique.setdefault(f.id, f)
    return tuple(sorted(unique.values(), key=lambda f: (_ORDER[f.severity], f.id)))


def run_checks(
    model: BuildingModel, allocation: Allocation, config: ProjectConfig
) -> CheckResult:
    """Run every rule on one building.

    ASCE 7-16 chapters 2 and 12, AWC SDPWS-2015 chapter 4, through the rule modules.

    Args:
        model: The structural model read from IFC.
        allocation: Its forces.
        config: The project config (SI).

    Returns:
        Findings and the per-pier numbers for ``results.json``.
    """
    with collection_paused():
        return _run_checks(model, allocation, config)


def _run_checks(
    model: BuildingModel, allocation: Allocation, config: ProjectConfig
) -> CheckResult:
    redundancy = evaluate_redundancy(allocation, config, model=model)
    rho = redundancy.rho
    holds = hold_down_forces(allocation, config, rho=rho)
    checks = pier_checks(allocation, config, rho=rho, hold_downs=holds)
    demands = diaphragm_demands(allocation, config)
    findings: list[Finding] = []
    findings += check_unit_shear(
        allocation, config, model=model, rho=rho, checks=checks
    )
    findings += check_aspect_ratio(allocation, config)
    findings += check_overturning(allocation, config, hold_downs=holds)
    findings += check_diaphragm(model, allocation, config, demands=demands)
    findings += check_diaphragm_aspect_ratio(model, allocation, config, demands=demands)
    findings += check_irregularities(model, allocation, config)
    findings += check_discontinuity(allocation, config, model=model)
    findings += check_redundancy(redundancy, allocation, config)
    findings += check_duplicate_walls(model)
    findings += check_import_issues(model)
    findings += check_unmatched_shear_walls(
        model, allocated={p.guid for p in allocation.piers if p.direction is not None}
    )
    return CheckResult(
        findings=sort_findings(findings),
        pier_checks=checks,
        hold_down=holds,
        rho=rho,
        redundancy=redundancy,
        sdc=seismic_design_category(config.seismic).sdc,
        diaphragm=demands,
    )
