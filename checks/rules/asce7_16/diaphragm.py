"""Diaphragm demands: unit shear at each line, chord forces and collector forces.

Diaphragm forces use Fpx (ASCE 7-16 §12.10.1.1): the flexible (tributary) share each
diaphragm piece delivers to a line is scaled by Fpx/Fx of its level; transfer forces
from non-stacking walls above are added unscaled. Shears of walls that stack on a line
below pass straight down and put no shear in the diaphragm.

* Unit shear at a line: the larger of the reactions delivered from either side of the
  line, over the line's crossing length of that diaphragm, times the combination factor
  (0.7 ASD, §2.4.5; ρ = 1.0 for Eq. 12.10-1 forces, §12.3.4.1).
* Chords (common practice, simple beam under uniform load): M = F·L/8 between two lines,
  M = F·L/2 for a cantilevered piece; chord force M/d with d = piece area / span (the
  mean depth along the force).
* Collectors: unit shear delivered along the line × the line's collector length, times
  Ω0 in SDC C–F (§12.10.2.1, item 2: Fpx forces with overstrength). SDC from
  :mod:`seismic_design_category`; D is assumed where no spectral values are given.

Demands are info (no diaphragm capacity in the config yet); aspect ratios: sdpws_2015.
"""

from __future__ import annotations

from collections import defaultdict
from dataclasses import dataclass

import shapely
from shapely.geometry import Point

from allocation._records import maker
from allocation.results import (
    Allocation,
    DiaphragmPiece,
    FlexibleResult,
    ResistanceLine,
)
from checks.findings import Finding, Severity
from checks.project import ProjectConfig
from checks.rules._support import (
    fmt,
    level_guids,
    level_load,
    perp,
    slab_guids,
)
from checks.rules.asce7_16.load_combinations import seismic_factor
from checks.rules.asce7_16.seismic_design_category import seismic_design_category
from ifc_bridge.model import BuildingModel, Direction

__all__ = [
    "Chord",
    "Collector",
    "DiaphragmDemands",
    "LineShear",
    "check_diaphragm",
    "diaphragm_demands",
]

RULE = "diaphragm"


@dataclass(frozen=True, slots=True, kw_only=True)
class LineShear:
    """Diaphragm unit shear where one diaphragm meets one line.

    Attributes:
        line: Line id.  diaphragm: Diaphragm id.  level: Level.  direction: Direction.
        reactions: Reactions from the two sides (−, +) of the line, Fpx-scaled [N].
        crossing: Crossing length of the line through the diaphragm [m].
        unit_shear: f·max(reactions)/crossing [N/m].
    """

    line: str
    diaphragm: str
    level: str
    direction: Direction
    reactions: tuple[float, float]
    crossing: float
    unit_shear: float


@dataclass(frozen=True, slots=True, kw_only=True)
class Chord:
    """Chord force of one diaphragm piece.

    Attributes:
        piece: Piece id.  diaphragm: Diaphragm id.  level: Level.  direction: Direction.
        span: Span between its lines, or cantilever length [m].
        depth: Mean depth along the force, area / span [m].
        moment: f·F·L/8 (or f·F·L/2 cantilevered) [N·m].
        force: moment / depth [N].
        cantilever: True for a piece on one line.
    """

    piece: str
    diaphragm: str
    level: str
    direction: Direction
    span: float
    depth: float
    moment: float
    force: float
    cantilever: bool = False

    @property
    def aspect_ratio(self) -> float:
        """Span / depth [-]."""
        return self.span / self.depth


@dataclass(frozen=True, slots=True, kw_only=True)
class Collector:
    """Collector force of one line.

    Attributes:
        line: Line id.  level: Level.  direction: Direction.
        length: Collector length (crossing not backed by walls) [m].
        unit_shear: f·(line reaction)/(total crossing) [N/m].
        omega0: Overstrength factor applied [-].
        force: omega0 · unit_shear · length [N].
    """

    line: str
    level: str
    direction: Direction
    length: float
    unit_shear: float
    omega0: float
    force: float


@dataclass(frozen=True, slots=True, kw_only=True)
class DiaphragmDemands:
    """Diaphragm demands of the building (SI)."""

    shears: tuple[LineShear, ...]
    chords: tuple[Chord, ...]
    collectors: tuple[Collector, ...]


# the records of every line, piece and collector, built faster
_line_shear, _chord_record, _collector = (
    maker(LineShear),
    maker(Chord),
    maker(Collector),
)


def _side(coord: float, offset: float) -> int:
    return 1 if coord >= offset else 0


def _reactions(
    fr: FlexibleResult, lines: dict[str, ResistanceLine], scale: float, tol: float
) -> dict[tuple[str, str], list[float]]:
    ax = perp(fr.direction)
    out: dict[tuple[str, str], list[float]] = defaultdict(lambda: [0.0, 0.0])
    for piece in fr.pieces:
        for line_id, share in piece.shares:
            if line_id in lines:
                side = _side(piece.centroid[ax], lines[line_id].offset)
                out[(line_id, piece.diaphragm)][side] += abs(share) * scale
    for pl in fr.point_loads:
        shares = [(lid, s) for lid, s in pl.shares if lid in lines]
        if (
            len(shares) == 1
            and abs(pl.location[ax] - lines[shares[0][0]].offset) <= tol
        ):
            continue  # stacks on the line below: no diaphragm shear
        host = next(
            (p.diaphragm for p in fr.pieces if p.polygon.covers(Point(pl.location))),
            None,
        )
        for lid, s in shares:
            dia = host or (lines[lid].crossings[0][0] if lines[lid].crossings else "")
            out[(lid, dia)][_side(pl.location[ax], lines[lid].offset)] += abs(s)
    return out


def _chord(
    piece: DiaphragmPiece,
    lines: dict[str, ResistanceLine],
    F: float,
    shape: tuple[float, tuple[float, float, float, float]],
) -> Chord | None:
    """The chord of one piece; ``shape`` is its polygon's (area, bounds)."""
    ax = perp(piece.direction)
    area, bounds = shape
    sup = [lines[s] for s in piece.supports if s in lines]
    if len(sup) == 2:
        span, cant = abs(sup[0].offset - sup[1].offset), False
    elif len(sup) == 1:
        lo, hi = bounds[ax], bounds[ax + 2]
        span, cant = max(abs(hi - sup[0].offset), abs(sup[0].offset - lo)), True
    else:
        return None
    if span <= 1e-9 or area <= 0.0:
        return None
    depth = float(area) / span
    M = F * span / (2.0 if cant else 8.0)
    return _chord_record(
        piece=piece.id,
        diaphragm=piece.diaphragm,
        level=piece.level,
        direction=piece.direction,
        span=float(span),
        depth=depth,
        moment=float(M),
        force=float(M / depth),
        cantilever=cant,
    )


def diaphragm_demands(
    allocation: Allocation, config: ProjectConfig
) -> DiaphragmDemands:
    """Unit shears, chord and collector forces of every diaphragm level and direction.

    ASCE 7-16 §12.10.1.1 (Fpx), §12.10.2.1 (collectors with Ω0 in SDC C–F).

    Args:
        allocation: Flexible results with their pieces, lines and level forces [N].
        config: Design basis, Ω0, SDS/SD1/S1 for the SDC, line tolerance [m].

    Returns:
        The demands, in the order of the allocation's results.
    """
    f = seismic_factor(config.design_basis)
    omega = (
        config.seismic.omega0
        if seismic_design_category(config.seismic).at_least("C")
        else 1.0
    )
    tol = config.analysis.line_tolerance
    shears, chords, collectors = [], [], []
    by_story: dict[tuple[str, Direction], dict[str, ResistanceLine]] = {}
    for ln in allocation.lines:
        by_story.setdefault((ln.level, ln.direction), {})[ln.id] = ln
    # every piece's area and bounds, read at once (Polygon.area, Polygon.bounds)
    polygons = [piece.polygon for fr in allocation.flexible for piece in fr.pieces]
    shapes = iter(
        zip(
            shapely.area(polygons).tolist(),
            map(tuple, shapely.bounds(polygons).tolist()),
            strict=True,
        )
    )
    for fr in allocation.flexible:
        lv = level_load(allocation, fr.level)
        scale = (
            lv.diaphragm_force / lv.story_force if lv and lv.story_force > 0 else 1.0
        )
        lines = by_story.get((fr.level, fr.direction), {})
        totals: dict[str, float] = defaultdict(float)
        for (lid, dia), (r0, r1) in sorted(_reactions(fr, lines, scale, tol).items()):
            ln = lines[lid]
            crossing = dict(ln.crossings).get(dia) or sum(c for _, c in ln.crossings)
            crossing = crossing or ln.wall_length
            totals[lid] += r0 + r1
            shears.append(
                _line_shear(
                    line=lid,
                    diaphragm=dia,
                    level=fr.level,
                    direction=fr.direction,
                    reactions=(r0, r1),
                    crossing=crossing,
                    unit_shear=f * max(r0, r1) / crossing,
                )
            )
        for lid, total in totals.items():
            ln = lines[lid]
            cross = sum(c for _, c in ln.crossings) or ln.wall_length
            if ln.collector_length > 1e-6 and total > 0.0:
                v = f * total / cross
                collectors.append(
                    _collector(
                        line=lid,
                        level=fr.level,
                        direction=fr.direction,
                        length=ln.collector_length,
                        unit_shear=v,
                        omega0=omega,
                        force=omega * v * ln.collector_length,
                    )
                )
        for piece in fr.pieces:
            ch = _chord(piece, lines, f * abs(piece.force) * scale, next(shapes))
            if ch is not None:
                chords.append(ch)
    return DiaphragmDemands(
        shears=tuple(shears), chords=tuple(chords), collectors=tuple(collectors)
    )


def _governing(records, value) -> dict[tuple, object]:
    best: dict[tuple, object] = {}
    for r in records:
        key = (r.level, r.direction, r.diaphragm)
        if key not in best or value(r) > value(best[key]):
            best[key] = r
    return best


def check_diaphragm(
    model: BuildingModel | None,
    allocation: Allocation,
    config: ProjectConfig,
    *,
    demands: DiaphragmDemands | None = None,
) -> list[Finding]:
    """Info findings with the governing diaphragm demands.

    ASCE 7-16 §12.10.1.1 (diaphragm forces), §12.10.2.1 (collectors).

    Args:
        model: The model, for the slabs' GlobalIds (None: the storey's GlobalId).
        allocation: The allocation.
        config: The project config.
        demands: Precomputed :func:`diaphragm_demands`, or None.

    Returns:
        Findings, unsorted: per level, direction and diaphragm the largest unit shear
        and chord force; per line with collectors its collector force.
    """
    dem = demands if demands is not None else diaphragm_demands(allocation, config)
    basis = config.design_basis.value
    out: list[Finding] = []
    shears = _governing(dem.shears, lambda s: (s.unit_shear, s.line))
    for (level, d, dia), s in sorted(shears.items()):
        guids, extra = slab_guids(model, allocation, level, dia)
        v = fmt(s.unit_shear, "force_per_length", config)
        out.append(
            Finding(
                rule=RULE,
                clause="ASCE 7-16 §12.10.1.1",
                severity=Severity.INFO,
                level=level,
                direction=d,
                guids=guids,
                title=f"Diaphragm unit shear {v}",
                description=(
                    f"Diaphragm {dia} of {level!r}, force in {d.value}: largest unit "
                    "shear "
                    f"at line {s.line}: {fmt(max(s.reactions), 'force', config)} "
                    f"(Fpx-scaled) over {fmt(s.crossing, 'length', config)} ({basis}) "
                    "= "
                    f"{v}. No diaphragm capacity is configured: check the sheathing "
                    "and "
                    "nailing for it."
                ),
                demand=s.unit_shear,
                unit="N/m",
                discriminator=f"{level}|{d.value}|shear{extra}",
            )
        )
    chords = _governing(dem.chords, lambda c: (c.force, c.piece))
    for (level, d, dia), c in sorted(chords.items()):
        guids, extra = slab_guids(model, allocation, level, dia)
        kind = "cantilever, F·L/2" if c.cantilever else "simple span, F·L/8"
        out.append(
            Finding(
                rule=RULE,
                clause="ASCE 7-16 §12.10.1.1",
                severity=Severity.INFO,
                level=level,
                direction=d,
                guids=guids,
                title=f"Diaphragm chord force {fmt(c.force, 'force', config)}",
                description=(
                    f"Diaphragm {dia} of {level!r}, force in {d.value}: largest chord "
                    "force "
                    f"in piece {c.piece} ({kind}): M = "
                    f"{fmt(c.moment, 'moment', config)} "
                    f"over a depth of {fmt(c.depth, 'length', config)} gives "
                    f"{fmt(c.force, 'force', config)} in the chords along the span."
                ),
                demand=c.force,
                unit="N",
                discriminator=f"{level}|{d.value}|chord{extra}",
            )
        )
    return out + _collector_findings(dem.collectors, allocation, config)


def _collector_findings(
    collectors: tuple[Collector, ...], allocation: Allocation, config: ProjectConfig
) -> list[Finding]:
    """One info finding per level and direction naming its largest collector force."""
    worst: dict[tuple, Collector] = {}
    count: dict[tuple, int] = {}
    for c in collectors:
        key = (c.level, c.direction)
        count[key] = count.get(key, 0) + 1
        if key not in worst or (c.force, c.line) > (worst[key].force, worst[key].line):
            worst[key] = c
    out = []
    for (level, d), c in sorted(worst.items()):
        omega = f"Ω0 ({c.omega0:g}, SDC C–F)" if c.omega0 != 1.0 else "1.0 (SDC A–B)"
        force = fmt(c.force, "force", config)
        out.append(
            Finding(
                rule=RULE,
                clause="ASCE 7-16 §12.10.2.1",
                severity=Severity.INFO,
                level=level,
                direction=d,
                guids=level_guids(allocation, level),
                title=f"Collector force up to {force}",
                description=(
                    f"{count[(level, d)]} line(s) of {level!r} in {d.value} have "
                    "collectors. "
                    f"Largest: line {c.line}, where {fmt(c.length, 'length', config)} "
                    "of the "
                    "crossing has no wall; the collectors take "
                    f"{fmt(c.unit_shear, 'force_per_length', config)} × length × "
                    f"{omega} "
                    f"= {force} (an upper bound at the wall ends)."
                ),
                demand=c.force,
                unit="N",
                discriminator=f"{level}|{d.value}|collector",
            )
        )
    return out
