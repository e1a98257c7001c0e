"""Redundancy factor ρ, ASCE 7-16 §12.3.4 (condition (a) of §12.3.4.2).

* SDC A–C: ρ = 1.0 (§12.3.4.1).
* SDC D–F: ρ = 1.0 when every story resisting more than 35 % of the base shear keeps,
  after the removal of any one shear wall pier with h/l > 1.0, at least 67 % of its
  strength in that direction (strength = Σ capacity × length of the story's piers in
  the direction; where a pier has no capacity, length alone is used) and no extreme
  torsional irregularity (Table 12.3-1 Type 1b, ratio > 1.4); else ρ = 1.3. SDC D with a
  Type 1b irregularity: ρ = 1.3 (§12.3.4.2).
* The torsion part re-runs the rigid story analysis (``allocation.rigid``) without the
  pier; where that module is absent the part is skipped and the finding says so.

A ``seismic.rho`` in the config is used as given; the evaluation is still reported,
and a given value below the evaluated one is a warning.

Severity policy: ρ = 1.0 info; ρ = 1.3 warning naming the governing pier; given ρ
below the evaluated value warning.
"""

from __future__ import annotations

import logging
from collections.abc import Mapping
from dataclasses import dataclass
from operator import attrgetter

from allocation._columns import pier_lengths
from allocation.errors import AllocationError
from allocation.results import Allocation, Pier, PierId
from checks.findings import Finding, Severity
from checks.project import ProjectConfig
from checks.rules._support import allocated_piers, level_guids
from checks.rules.asce7_16.seismic_design_category import seismic_design_category
from checks.rules.asce7_16.unit_shear import _Capacities, allocated_capacities
from ifc_bridge.model import BuildingModel, Direction

__all__ = ["Redundancy", "check_redundancy", "evaluate_redundancy"]

log = logging.getLogger(__name__)

_ID = attrgetter("id")

RULE = "redundancy"
CLAUSE = "ASCE 7-16 §12.3.4.2"
STORY_SHARE = 0.35  # ASCE 7-16 §12.3.4.2 (a)
STRENGTH_LOSS = 0.33  # ASCE 7-16 §12.3.4.2 (a), Table 12.3-3
EXTREME_TORSION = 1.4  # ASCE 7-16 Table 12.3-1 Type 1b


@dataclass(frozen=True, slots=True, kw_only=True)
class Redundancy:
    """The redundancy factor and why.

    Attributes:
        rho: ρ used by the checks (``seismic.rho`` when given, else ``evaluated``) [-].
        evaluated: ρ from the evaluation [-].
        sdc: Seismic design category used.
        reason: One line on what decided it.
        governing_pier: Pier whose removal failed the test, or ``""``.
        strength_loss: Largest story strength fraction lost by one removal [-].
        torsion_checked: False when the torsion part could not be run.
    """

    rho: float
    evaluated: float
    sdc: str
    reason: str
    governing_pier: PierId = ""
    strength_loss: float = 0.0
    torsion_checked: bool = True


def _plan_extent(model: BuildingModel | None, level: str, piers: list[Pier]):
    polys = [d.polygon for d in model.diaphragms_of(level)] if model is not None else []
    if polys:
        b = [p.bounds for p in polys]
        return (
            min(x[0] for x in b),
            min(x[1] for x in b),
            max(x[2] for x in b),
            max(x[3] for x in b),
        )
    xs = [c for p in piers for c in (p.start[0], p.end[0])]
    ys = [c for p in piers for c in (p.start[1], p.end[1])]
    return (min(xs), min(ys), max(xs), max(ys))


def _extreme_without(
    pier: Pier,
    story: list[Pier],
    allocation: Allocation,
    config: ProjectConfig,
    model: BuildingModel | None,
) -> bool | None:
    """True if removing ``pier`` makes the story extremely torsional; None: unknown."""
    try:
        from allocation.rigid import allocate_rigid_story
    except ImportError:
        return None
    ref = next(
        (
            r
            for r in allocation.rigid
            if r.level == pier.level and r.case.direction is pier.direction
        ),
        None,
    )
    lv = next((lv for lv in allocation.levels if lv.level == pier.level), None)
    if ref is None or lv is None:
        return None
    rest = [p for p in story if p.id != pier.id]
    try:
        results = allocate_rigid_story(
            rest,
            level=pier.level,
            story_shear=lv.story_shear,
            center_of_mass=ref.center_of_mass,
            plan_extent=_plan_extent(model, pier.level, story),
            direction=pier.direction,
            accidental_eccentricity=config.analysis.accidental_eccentricity,
            amplify_torsion=False,
        )
    except (AllocationError, ValueError, ZeroDivisionError):
        return True  # the story cannot resist torsion without it
    return any(r.drift_ratio_max > EXTREME_TORSION for r in results)


def _strengths(
    piers: list[Pier],
    config: ProjectConfig,
    capacities: Mapping[PierId, tuple[float | None, float]] | None = None,
    lengths: dict[PierId, float] | None = None,
) -> dict[PierId, float]:
    """Strength of each pier (capacity × length), or its length where any pier has
    no capacity; ``capacities`` and ``lengths`` as :func:`allocated_capacities` and
    ``Pier.length`` give them, when the caller has them."""
    if lengths is None:
        lengths = dict(zip(map(_ID, piers), pier_lengths(piers), strict=True))
    if capacities is None:
        found = _Capacities(config)
        caps = {p.id: found.of(p, lengths[p.id])[0] for p in piers}
    else:
        caps = {p.id: capacities[p.id][0] for p in piers}
    if any(c is None for c in caps.values()):
        return lengths
    return {p.id: caps[p.id] * lengths[p.id] for p in piers}


def evaluate_redundancy(
    allocation: Allocation, config: ProjectConfig, *, model: BuildingModel | None = None
) -> Redundancy:
    """Evaluate ρ by ASCE 7-16 §12.3.4.2 condition (a).

    ASCE 7-16 §12.3.4.1 and §12.3.4.2.

    Args:
        allocation: Levels with story shears [N], piers, rigid results.
        config: Seismic parameters (SDC, ``rho``), assemblies for the capacities.
        model: For the plan extent of the torsion re-analysis (optional).

    Returns:
        The factor with its reason.
    """
    given = config.seismic.rho
    sdc = seismic_design_category(config.seismic)

    def done(value: float, reason: str, **kw) -> Redundancy:
        return Redundancy(
            rho=float(given) if given is not None else value,
            evaluated=value,
            sdc=sdc.sdc,
            reason=reason,
            **kw,
        )

    if not sdc.at_least("D"):
        return done(1.0, f"SDC {sdc.sdc}: ρ = 1.0 (ASCE 7-16 §12.3.4.1)")
    if sdc.sdc == "D" and any(
        r.drift_ratio_max > EXTREME_TORSION for r in allocation.rigid
    ):
        return done(1.3, "SDC D with an extreme torsional irregularity (Type 1b)")
    V = allocation.seismic.V
    worst: tuple[float, PierId] = (0.0, "")
    torsion_checked = True
    stories: dict[str, list[Pier]] = {}
    for p in allocation.piers:
        if p.direction is not None:
            stories.setdefault(p.level, []).append(p)
    capacities = allocated_capacities(allocation, config)
    allocated = allocated_piers(allocation)
    length_of = dict(zip(map(_ID, allocated.piers), allocated.lengths, strict=True))
    for lv in allocation.levels:
        if V <= 0 or lv.story_shear <= STORY_SHARE * V:
            continue
        story = stories.get(lv.level, [])
        for d in (Direction.X, Direction.Y):
            own = [p for p in story if p.direction is d]
            lengths = {p.id: length_of[p.id] for p in own}  # Pier.length
            strength = _strengths(own, config, capacities, lengths)
            total = sum(strength.values())
            for p in own:
                if p.height / lengths[p.id] <= 1.0 or total <= 0:  # Pier.aspect_ratio
                    continue
                loss = strength[p.id] / total
                worst = max(worst, (loss, p.id))
                if loss > STRENGTH_LOSS:
                    return done(
                        1.3,
                        f"removing pier {p.pier} of wall {p.name!r} ({p.guid}) cuts "
                        "the story strength in "
                        f"{d.value} by {100 * loss:.0f} % (> 33 %)",
                        governing_pier=p.id,
                        strength_loss=loss,
                    )
                extreme = _extreme_without(p, story, allocation, config, model)
                if extreme is None:
                    torsion_checked = False
                elif extreme:
                    return done(
                        1.3,
                        f"removing pier {p.pier} of wall {p.name!r} ({p.guid}) creates "
                        "an extreme torsional "
                        "irregularity (Type 1b)",
                        governing_pier=p.id,
                        strength_loss=loss,
                    )
    note = "" if torsion_checked else "; the torsion part was not checked"
    return done(
        1.0,
        f"condition (a) holds: largest loss {100 * worst[0]:.0f} %{note}",
        governing_pier=worst[1],
        strength_loss=worst[0],
        torsion_checked=torsion_checked,
    )


def check_redundancy(
    redundancy: Redundancy, allocation: Allocation, config: ProjectConfig
) -> list[Finding]:
    """One building-wide finding stating ρ and why.

    ASCE 7-16 §12.3.4.2.

    Args:
        redundancy: From :func:`evaluate_redundancy`.
        allocation: For the governing pier's GlobalId.
        config: For ``seismic.rho``.

    Returns:
        A list with one finding.
    """
    pier = next(
        (p for p in allocation.piers if p.id == redundancy.governing_pier), None
    )
    guids = (pier.guid,) if pier is not None and redundancy.evaluated > 1.0 else ()
    if not guids and allocation.levels:
        guids = level_guids(allocation, allocation.levels[0].level)
    given = config.seismic.rho
    low = given is not None and given < redundancy.evaluated
    sev = Severity.WARNING if low or redundancy.rho > 1.0 else Severity.INFO
    text = f"SDC {redundancy.sdc}: evaluated ρ = {redundancy.evaluated:g}, "
    text += f"{redundancy.reason}."
    if given is not None:
        text += f" The config gives seismic.rho = {given:g}, which is used."
    if low:
        text += " It is below the evaluated value: remove seismic.rho or justify it."
    return [
        Finding(
            rule=RULE,
            clause=CLAUSE,
            severity=sev,
            level="",
            direction=None,
            guids=guids,
            title=f"Redundancy factor ρ = {redundancy.rho:g}",
            description=text,
            demand=redundancy.rho,
            unit="-",
            discriminator="building|rho",
            location=pier.midpoint
            if pier is not None and guids == (pier.guid,)
            else None,
        )
    ]
