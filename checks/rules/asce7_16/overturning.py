"""Overturning and hold-down tension at the ends of each shear wall pier.

Per pier, with QE its governing in-plane shear, h its height and L its length:

* overturning moment M = f·ρ·QE·h (f = 0.7 ASD, 1.0 LRFD);
* resisting moment Mr = kD·D·L/2 with kD = 0.6 − 0.14·SDS (ASD, ASCE 7-16 §2.4.5
  combination 10) or 0.9 − 0.2·SDS (LRFD, §2.3.6 combination 7);
* D = the pier's own wall weight (wall dead load × h × L). Conservatively nothing else:
  the tributary floor load on the wall is not in the model, so the uplift is an upper
  bound;
* hold-down tension T = (M − Mr)/L ≥ 0. Common practice: the moment arm is taken as
  L; the arm between hold-down centrelines is about L − 0.15 m, which gives a few per
  cent more on short piers.

Severity policy: one info finding per level with the largest tension; the per-pier
numbers go to ``results.json``.
"""

from __future__ import annotations

from dataclasses import dataclass

from allocation._records import maker
from allocation.results import Allocation, PierId
from checks.findings import Finding, Severity
from checks.project import ProjectConfig
from checks.rules._support import allocated_piers, fmt, level_guids
from checks.rules.asce7_16.load_combinations import (
    combination_clause,
    counteracting_dead_factor,
    seismic_factor,
)

__all__ = ["HoldDown", "check_overturning", "hold_down_forces"]

RULE = "overturning"


@dataclass(frozen=True, slots=True, kw_only=True)
class HoldDown:
    """Overturning of one pier.

    Attributes:
        pier: Pier id.
        overturning_moment: M = f·ρ·QE·h [N·m].
        dead_load: D on the pier (its own weight) [N].
        resisting_moment: kD·D·L/2 [N·m].
        arm: Moment arm between the end forces [m].
        tension: Net hold-down tension (M − Mr)/arm, ≥ 0 [N].
    """

    pier: PierId
    overturning_moment: float
    dead_load: float
    resisting_moment: float
    arm: float
    tension: float


_hold_down = maker(HoldDown)  # HoldDown(...), faster for every pier


def hold_down_forces(
    allocation: Allocation, config: ProjectConfig, *, rho: float | None = None
) -> dict[PierId, HoldDown]:
    """Hold-down tension of every allocated pier.

    ASCE 7-16 §2.4.5 combination 10 (ASD) or §2.3.6 combination 7 (LRFD).

    Args:
        allocation: Piers and their forces [N], heights and lengths [m].
        config: Design basis, SDS [g], wall dead loads [Pa].
        rho: Redundancy factor [-]; default ``seismic.rho``, else 1.0.

    Returns:
        Per pier id (piers with a direction only).
    """
    if rho is None:
        rho = 1.0 if config.seismic.rho is None else config.seismic.rho
    f = seismic_factor(config.design_basis)
    kD = counteracting_dead_factor(config.design_basis, config.seismic.SDS)
    out: dict[PierId, HoldDown] = {}
    units: dict[str, float] = {}  # wall dead load [Pa] per assembly name
    for pier, L, force in zip(*allocated_piers(allocation), strict=True):
        unit = units.get(pier.assembly)
        if unit is None:
            unit = units[pier.assembly] = _wall_load(pier.assembly, config)
        h = pier.height
        D = unit * h * L
        M = f * rho * force * h
        Mr = kD * D * L / 2.0
        out[pier.id] = _hold_down(
            pier=pier.id,
            overturning_moment=float(M),
            dead_load=float(D),
            resisting_moment=float(Mr),
            arm=float(L),
            tension=float(max(0.0, (M - Mr) / L)),
        )
    return out


def _wall_load(assembly_name: str, config: ProjectConfig) -> float:
    """Wall dead load of an assembly, else ``loads.wall`` [Pa]."""
    assembly = config.assembly(assembly_name) if assembly_name else None
    unit = config.loads.wall
    if assembly is not None and assembly.properties.wall_dead_load is not None:
        unit = assembly.properties.wall_dead_load
    return unit


def check_overturning(
    allocation: Allocation,
    config: ProjectConfig,
    *,
    hold_downs: dict[PierId, HoldDown] | None = None,
    rho: float | None = None,
) -> list[Finding]:
    """One info finding per level naming the pier with the largest hold-down tension.

    ASCE 7-16 §2.4.5 combination 10 (ASD) or §2.3.6 combination 7 (LRFD).

    Args:
        allocation: Piers and forces.
        config: Design basis and loads.
        hold_downs: Precomputed :func:`hold_down_forces`, or None to compute.
        rho: Redundancy factor [-], as for :func:`hold_down_forces`.

    Returns:
        Findings for levels where some pier has net uplift.
    """
    hd = (
        hold_downs
        if hold_downs is not None
        else hold_down_forces(allocation, config, rho=rho)
    )
    worst: dict[str, tuple[float, str]] = {}
    counts: dict[str, int] = {}  # piers with net uplift per level
    for pier in allocation.piers:
        h = hd.get(pier.id)
        if h is None or h.tension <= 0.0:
            continue
        counts[pier.level] = counts.get(pier.level, 0) + 1
        if pier.level not in worst or (h.tension, pier.id) > worst[pier.level]:
            worst[pier.level] = (h.tension, pier.id)
    by_id = {p.id: p for p in allocation.piers}
    kD = counteracting_dead_factor(config.design_basis, config.seismic.SDS)
    findings = []
    for level, (tension, pid) in sorted(worst.items()):
        pier, h = by_id[pid], hd[pid]
        count = counts[level]
        findings.append(
            Finding(
                rule=RULE,
                clause=combination_clause(config.design_basis),
                severity=Severity.INFO,
                level=level,
                direction=pier.direction,
                guids=level_guids(allocation, level) or (pier.guid,),
                title=f"Hold-downs: up to {fmt(tension, 'force', config)} uplift",
                description=(
                    f"{count} pier(s) supporting {level!r} have net uplift. Largest: "
                    "pier "
                    f"{pier.pier} of wall {pier.name!r} ({pier.guid}), M = "
                    f"{fmt(h.overturning_moment, 'moment', config)} against "
                    f"{kD:.3f}·D·L/2 = {fmt(h.resisting_moment, 'moment', config)} "
                    "with D = "
                    f"{fmt(h.dead_load, 'force', config)} (wall self weight only), "
                    f"T = (M − Mr)/L = {fmt(tension, 'force', config)}. Tributary "
                    "floor dead "
                    "load is not included, so the uplift is an upper bound."
                ),
                demand=tension,
                unit="N",
                discriminator=f"{level}|hold-down",
                location=pier.start,
            )
        )
    return findings
