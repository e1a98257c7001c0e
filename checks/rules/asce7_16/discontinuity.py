"""Load-path findings from the allocation's engineering conditions.

* No line of resistance in a direction, no shear wall in a story, an unsupported
  diaphragm piece, no torsional stiffness: error (ASCE 7-16 §12.1.3, continuous load
  path).
* A shear wall of the story above that does not stand on a line below: out-of-plane
  offset (Table 12.3-1 Type 4) where the story below has lines in that direction but
  none at the wall's offset; in-plane discontinuity (Table 12.3-2 Type 4) where a line
  below is at the same offset but does not reach under the wall. Warning (§12.3.3.3:
  the supporting elements need Ω0). With no line below in that direction: error.
* A cantilevered diaphragm piece: warning (AWC SDPWS-2015 §4.2.5.2, from memory:
  cantilever L' ≤ 25 ft and ≤ 2/3 of the diaphragm width W; open-front L'/W ≤ 1.0 one
  story, 0.67 over one story — limits as in the SDPWS-2008 text and IBC 2305.2.5).
* A skewed shear wall: info (Table 12.3-1 Type 5, nonparallel system; it is not
  allocated).
* A shear wall under no diaphragm level: warning (§12.1.3: it receives no force).
"""

from __future__ import annotations

from collections.abc import Callable

from allocation.results import Allocation, Condition, ConditionKind, DiaphragmPiece
from checks.findings import Finding, Severity
from checks.project import ProjectConfig
from checks.rules._support import along, fmt, in_display_units, level_guids, perp
from ifc_bridge.model import BuildingModel

__all__ = ["cantilever_limits", "check_discontinuity"]

RULE = "discontinuity"
LOAD_PATH = "ASCE 7-16 §12.1.3"
CANTILEVER_MAX = 25 * 0.3048  # 25 ft [m], AWC SDPWS-2015 §4.2.5.2, from memory


def _base(c: Condition, allocation: Allocation, model: BuildingModel | None) -> dict:
    d = c.direction.value if c.direction else "-"
    return {
        "rule": RULE,
        "level": c.level,
        "direction": c.direction,
        "guids": c.guids or level_guids(allocation, c.level, model),
        # the condition's ref (a piece id) only tells apart conditions on one element
        "discriminator": f"{c.level}|{d}|{c.kind.value}"
        + (f"|{c.ref}" if c.ref else ""),
    }


def _simple(kind: ConditionKind, sev: Severity, clause: str, title: str):
    def make(c, allocation, config, model) -> Finding:
        return Finding(
            **_base(c, allocation, model),
            clause=clause,
            severity=sev,
            title=title,
            description=in_display_units(c.detail, config),
            demand=c.value,
        )

    return make


def _non_stacking(c: Condition, allocation, config: ProjectConfig, model) -> Finding:
    pier = next(
        (
            p
            for p in allocation.piers
            if p.guid in c.guids and (c.direction is None or p.direction is c.direction)
        ),
        None,
    )
    base = _base(c, allocation, model)
    if pier is None or pier.direction is None:
        return Finding(
            **base,
            clause="ASCE 7-16 §12.3.3.3",
            severity=Severity.WARNING,
            title="Shear wall does not stack",
            description=in_display_units(c.detail, config),
            demand=c.value,
        )
    d, ax, al = pier.direction, perp(pier.direction), along(pier.direction)
    below = [
        ln for ln in allocation.lines if ln.level == pier.storey and ln.direction is d
    ]
    tol = config.analysis.line_tolerance
    same = [ln for ln in below if abs(ln.offset - pier.midpoint[ax]) <= tol]
    if same:
        ln = same[0]
        clause, title = (
            "ASCE 7-16 Table 12.3-2",
            "In-plane discontinuity (vertical Type 4)",
        )
        text = (
            f"line {ln.id} below is in the wall's plane but its walls cover "
            f"{fmt(ln.wall_extent[0], 'length', config)} to "
            f"{fmt(ln.wall_extent[1], 'length', config)}, not the wall's "
            f"{fmt(min(pier.start[al], pier.end[al]), 'length', config)} to "
            f"{fmt(max(pier.start[al], pier.end[al]), 'length', config)}"
        )
        sev = Severity.WARNING
    elif below:
        near = min(below, key=lambda ln: abs(ln.offset - pier.midpoint[ax]))
        clause, title = (
            "ASCE 7-16 Table 12.3-1",
            "Out-of-plane offset (horizontal Type 4)",
        )
        text = (
            f"the nearest line below, {near.id}, is "
            f"{fmt(abs(near.offset - pier.midpoint[ax]), 'length', config)} out of its "
            "plane"
        )
        sev = Severity.WARNING
    else:
        clause, title = LOAD_PATH, "Shear wall with no wall below"
        text = f"the story below {pier.storey!r} has no line in {d.value}"
        sev = Severity.ERROR
    return Finding(
        **base,
        clause=clause,
        severity=sev,
        title=title,
        description=(
            f"Wall {pier.name!r} ({pier.guid}) on {pier.storey!r}: {text}; its "
            "shear enters the diaphragm below as a point load. Elements that "
            "support it need the overstrength factor (ASCE 7-16 §12.3.3.3). "
            f"{in_display_units(c.detail, config)}"
        ),
        demand=c.value,
        unit="N" if c.value is not None else "",
        location=pier.midpoint,
    )


def cantilever_limits(piece: DiaphragmPiece, line_offset: float) -> tuple[float, float]:
    """Cantilever length L' and width W of a piece on one line.

    AWC SDPWS-2015 §4.2.5.2 (definitions of L' and W; from memory).

    Args:
        piece: The cantilevered piece; plan outline [m].
        line_offset: Offset of its supporting line [m].

    Returns:
        (L' measured from the line perpendicular to it [m], W along it [m]).
    """
    ax = perp(piece.direction)
    b = piece.polygon.bounds
    Lc = max(abs(b[ax + 2] - line_offset), abs(line_offset - b[ax]))
    W = b[along(piece.direction) + 2] - b[along(piece.direction)]
    return float(Lc), float(W)


def _cantilever(
    c: Condition, allocation: Allocation, config: ProjectConfig, model
) -> Finding:
    piece = next(
        (
            p
            for fr in allocation.flexible
            if fr.level == c.level and fr.direction is c.direction
            for p in fr.pieces
            if p.id == c.ref
        ),
        None,
    )
    lines = {ln.id: ln for ln in allocation.lines}
    text = c.detail
    base = _base(c, allocation, model)
    if piece is not None and piece.supports and piece.supports[0] in lines:
        offset = lines[piece.supports[0]].offset
        Lc, W = cantilever_limits(piece, offset)
        # stable across revisions: the side of its line, not the piece's number
        side = "+" if piece.centroid[perp(piece.direction)] >= offset else "-"
        d = c.direction.value if c.direction else "-"
        base["discriminator"] = f"{c.level}|{d}|{c.kind.value}|{side}"
        only = (
            sum(
                1
                for ln in allocation.lines
                if ln.level == c.level and ln.direction is c.direction
            )
            == 1
        )
        stories = len(allocation.levels)
        limit = min(CANTILEVER_MAX, 2.0 / 3.0 * W)
        if only:
            limit = min(CANTILEVER_MAX, (1.0 if stories <= 1 else 0.67) * W)
        verdict = "exceeds" if Lc > limit else "is within"
        text = (
            f"{in_display_units(c.detail, config)}. L' = {fmt(Lc, 'length', config)}, W = "
            f"{fmt(W, 'length', config)}"
            f"; L' {verdict} the {fmt(limit, 'length', config)} limit"
            f"{' for an open front' if only else ''} of wood structural panel "
            "diaphragms (25 ft, and 2/3 W; open front 1.0 W one story, 0.67 W more)."
        )
    return Finding(
        **base,
        clause="AWC SDPWS-2015 §4.2.5.2",
        severity=Severity.WARNING,
        title="Cantilevered diaphragm piece",
        description=text,
        demand=c.value,
    )


_HANDLERS: dict[ConditionKind, Callable] = {
    ConditionKind.NO_LINE: _simple(
        ConditionKind.NO_LINE, Severity.ERROR, LOAD_PATH, "No line of resistance"
    ),
    ConditionKind.NO_SHEAR_WALLS: _simple(
        ConditionKind.NO_SHEAR_WALLS,
        Severity.ERROR,
        LOAD_PATH,
        "Story with no shear walls",
    ),
    ConditionKind.UNSUPPORTED_PIECE: _simple(
        ConditionKind.UNSUPPORTED_PIECE,
        Severity.ERROR,
        LOAD_PATH,
        "Unsupported diaphragm piece",
    ),
    ConditionKind.TORSIONAL_INSTABILITY: _simple(
        ConditionKind.TORSIONAL_INSTABILITY,
        Severity.ERROR,
        LOAD_PATH,
        "Story has no torsional resistance",
    ),
    ConditionKind.SKEWED_WALL: _simple(
        ConditionKind.SKEWED_WALL,
        Severity.INFO,
        "ASCE 7-16 Table 12.3-1",
        "Nonparallel shear wall (Type 5), not allocated",
    ),
    ConditionKind.WALL_OFF_DIAPHRAGM: _simple(
        ConditionKind.WALL_OFF_DIAPHRAGM,
        Severity.WARNING,
        LOAD_PATH,
        "Shear wall under no diaphragm",
    ),
    ConditionKind.NO_PIER: _simple(
        ConditionKind.NO_PIER,
        Severity.WARNING,
        "AWC SDPWS-2015 §4.3.5.1",
        "Shear wall with no full-height pier, not counted",
    ),
    ConditionKind.STIFFNESS_FALLBACK: _simple(
        ConditionKind.STIFFNESS_FALLBACK,
        Severity.INFO,
        "",
        "Wall stiffness taken in proportion to length",
    ),
    ConditionKind.NON_STACKING_WALL: _non_stacking,
    ConditionKind.CANTILEVER_PIECE: _cantilever,
}


def check_discontinuity(
    allocation: Allocation, config: ProjectConfig, *, model: BuildingModel | None = None
) -> list[Finding]:
    """One finding per distinct engineering condition of the allocation.

    ASCE 7-16 §12.1.3, Table 12.3-1 Types 4 and 5, Table 12.3-2 Type 4;
    AWC SDPWS-2015 §4.2.5.2.

    Args:
        allocation: Its ``conditions`` and those of each result.
        config: Line tolerance [m], display units.
        model: For storey GlobalIds where a condition names no element.

    Returns:
        Findings with distinct ids, in condition order.
    """
    conds = list(allocation.conditions)
    for r in (*allocation.flexible, *allocation.rigid):
        conds.extend(r.conditions)
    seen: dict[str, Finding] = {}
    for c in conds:
        handler = _HANDLERS.get(c.kind) or _simple(
            c.kind, Severity.WARNING, "", c.kind.value.replace("_", " ").capitalize()
        )  # a condition kind added later is still reported, never dropped
        f = handler(c, allocation, config, model)
        seen.setdefault(f.id, f)
    return list(seen.values())
