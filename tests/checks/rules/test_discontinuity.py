"""Load-path findings from conditions (checks.rules.asce7_16.discontinuity)."""

from __future__ import annotations

import pytest
from shapely.geometry import box

from allocation.results import (
    Condition,
    ConditionKind,
    DiaphragmPiece,
    FlexibleResult,
    ResistanceLine,
)
from checks.findings import Severity
from checks.rules.asce7_16.discontinuity import cantilever_limits, check_discontinuity
from ifc_bridge.model import Direction

from ._build import allocation, config, level, pier

X = Direction.X


def _line(lid, lvl, y, extent=(0.0, 10.0)):
    return ResistanceLine(
        id=lid,
        level=lvl,
        direction=X,
        offset=y,
        piers=(),
        wall_extent=extent,
        wall_length=extent[1] - extent[0],
    )


def _upper(**kw):
    up = pier("up", start=(5.0, 5.0), end=(8.0, 5.0), level="Roof", storey="Level 2")
    cond = Condition(
        kind=ConditionKind.NON_STACKING_WALL,
        level="Level 2",
        direction=X,
        guids=("up",),
        detail="shear of W-up enters Level 2 as a point load",
        value=12e3,
    )
    levels = (level("Level 2", guid="s2"), level("Roof", guid="s3"))
    return allocation([up], levels=levels, conditions=[cond], **kw)


@pytest.mark.parametrize(
    ("lines", "title", "clause", "severity"),
    [
        # lines below at y = 0 and 10, none at y = 5: out-of-plane offset
        (
            [_line("L1-X-1", "Level 2", 0.0), _line("L1-X-2", "Level 2", 10.0)],
            "Out-of-plane offset (horizontal Type 4)",
            "ASCE 7-16 Table 12.3-1",
            Severity.WARNING,
        ),
        # a line at y = 5.2 (within 0.5 m), walls stop at x = 3: in-plane discontinuity
        (
            [_line("L1-X-1", "Level 2", 5.2, extent=(0.0, 3.0))],
            "In-plane discontinuity (vertical Type 4)",
            "ASCE 7-16 Table 12.3-2",
            Severity.WARNING,
        ),
        # nothing below in X
        ([], "Shear wall with no wall below", "ASCE 7-16 §12.1.3", Severity.ERROR),
    ],
)
def test_non_stacking_classification(lines, title, clause, severity):
    (f,) = check_discontinuity(_upper(lines=lines), config())
    assert (f.title, f.clause, f.severity) == (title, clause, severity)
    assert f.guids == ("up",)
    assert f.demand == 12e3


def test_load_path_errors_and_skewed_info():
    conds = [
        Condition(
            kind=ConditionKind.NO_LINE,
            level="Roof",
            direction=Direction.Y,
            guids=(),
            detail="no line of shear walls in Y at Roof",
        ),
        Condition(
            kind=ConditionKind.UNSUPPORTED_PIECE,
            level="Roof",
            direction=X,
            guids=("slab1",),
            detail="piece Roof/D1/X3 touches no line",
            ref="Roof/D1/X3",
        ),
        Condition(
            kind=ConditionKind.SKEWED_WALL,
            level="Roof",
            direction=None,
            guids=("sk",),
            detail="wall sk is 30 deg off X",
        ),
    ]
    # the rigid results repeat a condition: one finding only
    found = check_discontinuity(allocation(conditions=conds + conds[:1]), config())
    got = sorted((f.severity.value, f.clause, f.guids) for f in found)
    assert got == [
        ("error", "ASCE 7-16 §12.1.3", ("slab1",)),  # continuous load path
        (
            "error",
            "ASCE 7-16 §12.1.3",
            ("storeyRoof",),
        ),  # no line: pinned to the storey
        ("info", "ASCE 7-16 Table 12.3-1", ("sk",)),  # Type 5, nonparallel system
    ]


def test_cantilever_limits_by_hand():
    # piece 10 m wide (x) by 4 m deep (y) on one X line at y = 0: L' = 4 m, W = 10 m
    piece = DiaphragmPiece(
        id="Roof/D1/X1",
        diaphragm="Roof/D1",
        level="Roof",
        direction=X,
        polygon=box(0, 0, 10, 4),
        weight=1.0,
        force=1.0,
        centroid=(5.0, 2.0),
        supports=("L1-X-1",),
        shares=(("L1-X-1", 1.0),),
    )
    assert cantilever_limits(piece, 0.0) == (pytest.approx(4.0), pytest.approx(10.0))
    fr = FlexibleResult(
        level="Roof",
        direction=X,
        applied=1.0,
        pieces=(piece,),
        point_loads=(),
        line_forces={},
        pier_forces={},
    )
    cond = Condition(
        kind=ConditionKind.CANTILEVER_PIECE,
        level="Roof",
        direction=X,
        guids=("slab1",),
        detail="piece Roof/D1/X1 is cantilevered",
        ref="Roof/D1/X1",
    )
    alloc = allocation(
        lines=[_line("L1-X-1", "Roof", 0.0)], flexible=[fr], conditions=[cond]
    )
    (f,) = check_discontinuity(alloc, config())
    assert f.severity is Severity.WARNING
    assert f.clause == "AWC SDPWS-2015 §4.2.5.2"
    # open front, one story: limit min(25 ft = 7.62 m, 1.0·W = 10 m), from memory
    assert "is within the 7.62 m limit for an open front" in f.description


def test_cantilever_id_does_not_depend_on_the_piece_number():
    # the same cantilever renumbered (a piece added elsewhere) keeps its finding id
    def one(ref):
        piece = DiaphragmPiece(
            id=ref,
            diaphragm="Roof/D1",
            level="Roof",
            direction=X,
            polygon=box(0, 0, 10, 4),
            weight=1.0,
            force=1.0,
            centroid=(5.0, 2.0),
            supports=("L1-X-1",),
            shares=(("L1-X-1", 1.0),),
        )
        fr = FlexibleResult(
            level="Roof",
            direction=X,
            applied=1.0,
            pieces=(piece,),
            point_loads=(),
            line_forces={},
            pier_forces={},
        )
        cond = Condition(
            kind=ConditionKind.CANTILEVER_PIECE,
            level="Roof",
            direction=X,
            guids=("slab1",),
            detail="cantilevered",
            ref=ref,
        )
        alloc = allocation(
            lines=[_line("L1-X-1", "Roof", 0.0)], flexible=[fr], conditions=[cond]
        )
        return check_discontinuity(alloc, config())[0].id

    assert one("Roof/D1/X1") == one("Roof/D1/X3")


def test_condition_numbers_read_in_display_units():  # NIST SP 811: 1 lbf = 4.4482216152605 N
    from checks.project import DisplayUnits
    from checks.rules._support import in_display_units

    class Cfg:  # only display_units is read
        display_units = DisplayUnits.IMPERIAL

    text = in_display_units("its shear 4448.2216 N enters at (3.048, 6.096) m", Cfg())
    assert "1.00 kip" in text
    assert "(10.0 ft, 20.0 ft)" in text
    assert " N " not in text
    assert ") m" not in text
