"""Aspect ratio (span / depth) of each diaphragm piece between two lines.

AWC SDPWS-2015 §4.2.4 (Table 4.2.4, from memory): wood structural panel diaphragms
L/W ≤ 4 blocked, 3 unblocked. The config does not yet say what a diaphragm is made of,
so the blocked limit is used and a piece over it is a warning, not an error.
Cantilevered pieces are judged by their own limits (``discontinuity``, SDPWS §4.2.5.2).
"""

from __future__ import annotations

from allocation.results import Allocation
from checks.findings import Finding, Severity
from checks.project import ProjectConfig
from checks.rules._support import fmt, slab_guids, unique_sorted
from checks.rules.asce7_16.diaphragm import (
    DiaphragmDemands,
    diaphragm_demands,
)
from ifc_bridge.model import BuildingModel

__all__ = ["ASPECT_LIMIT", "check_diaphragm_aspect_ratio"]

RULE = "diaphragm_aspect_ratio"
CLAUSE = "AWC SDPWS-2015 §4.2.4"
ASPECT_LIMIT = 4.0  # AWC SDPWS-2015 §4.2.4, blocked wood structural panels, from memory


def check_diaphragm_aspect_ratio(
    model: BuildingModel | None,
    allocation: Allocation,
    config: ProjectConfig,
    *,
    demands: DiaphragmDemands | None = None,
) -> list[Finding]:
    """Warning for each simply spanning piece with span / mean depth over 4.

    AWC SDPWS-2015 §4.2.4.

    Args:
        model: For the slabs' GlobalIds (None: the storey's).
        allocation: Pieces and lines.
        config: Display units.
        demands: Precomputed diaphragm demands (their chords carry span and depth).

    Returns:
        Findings, unsorted.
    """
    dem = demands if demands is not None else diaphragm_demands(allocation, config)
    lines = {ln.id: ln for ln in allocation.lines}
    supports = {p.id: p.supports for fr in allocation.flexible for p in fr.pieces}
    by_id = {p.id: p for p in allocation.piers}
    out = []
    for c in dem.chords:
        if c.cantilever or c.aspect_ratio <= ASPECT_LIMIT:
            continue
        guids, extra = slab_guids(model, allocation, c.level, c.diaphragm)
        walls = [
            by_id[p].guid
            for s in supports.get(c.piece, ())
            if s in lines
            for p in lines[s].piers
            if p in by_id
        ]
        out.append(
            Finding(
                rule=RULE,
                clause=CLAUSE,
                severity=Severity.WARNING,
                level=c.level,
                direction=c.direction,
                guids=unique_sorted([*guids, *walls]),
                title=f"Diaphragm span/depth {c.aspect_ratio:.1f} > {ASPECT_LIMIT:g}",
                description=(
                    f"Piece {c.piece} of {c.level!r} spans "
                    f"{fmt(c.span, 'length', config)} "
                    "between lines with a mean depth of "
                    f"{fmt(c.depth, 'length', config)}: "
                    f"L/W = {c.aspect_ratio:.2f}, above the {ASPECT_LIMIT:g}:1 limit "
                    "of "
                    "blocked wood structural panel diaphragms (3:1 unblocked). Add a "
                    "line of "
                    "shear walls, or confirm the diaphragm is not wood sheathed."
                ),
                demand=c.aspect_ratio,
                capacity=ASPECT_LIMIT,
                unit="-",
                discriminator=f"{c.level}|{c.direction.value}|aspect{extra}",
            )
        )
    return out
