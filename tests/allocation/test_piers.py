"""Piers: shear walls split at openings into full-height pieces, X / Y / skewed."""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from allocation.parameters import AnalysisOptions
from allocation.piers import MIN_PIER_LENGTH, make_piers, wall_direction
from allocation.results import ConditionKind
from ifc_bridge.model import Direction
from tests.allocation._plans import OPTIONS, building, opening, segment


def test_wall_without_openings_is_one_pier():
    piers, conditions = make_piers([segment("W1", (0.0, 0.0), (4.0, 0.0))], OPTIONS)
    (p,) = piers
    assert conditions == ()
    assert p.id == "W1|L1|0|0"  # allocation/results.py id format
    assert (p.start, p.end, p.length) == ((0.0, 0.0), (4.0, 0.0), 4.0)
    assert (p.direction, p.height, p.stiffness, p.line) == (Direction.X, 3.0, 0.0, "")


def test_door_and_window_split_wall_into_three_piers():
    # Hand geometry: 6 m wall, door 1-2 m, window 4-5 m -> piers 0-1, 2-4, 5-6 m.
    wall = segment(
        "W1",
        (10.0, 3.0),
        (16.0, 3.0),
        openings=[
            opening("D1", 1.0, 2.0),
            opening("N1", 4.0, 5.0, bottom=0.9, top=2.1),
        ],
    )
    model = building([wall])
    piers, conditions = make_piers(model.shear_walls, OPTIONS)
    assert conditions == ()
    assert [p.pier for p in piers] == [0, 1, 2]
    assert [p.start for p in piers] == [(10.0, 3.0), (12.0, 3.0), (15.0, 3.0)]
    assert [p.end for p in piers] == [(11.0, 3.0), (14.0, 3.0), (16.0, 3.0)]
    assert [p.length for p in piers] == pytest.approx([1.0, 2.0, 1.0])  # hand geometry
    assert piers[1].aspect_ratio == pytest.approx(1.5)  # h/b = 3 / 2


def test_overlapping_openings_merge_and_reversed_wall_runs_from_start():
    # Hand geometry: wall (0, 6) to (0, 0); openings 1-3 and 2.5-4 m merge to 1-4.
    wall = segment(
        "W2",
        (0.0, 6.0),
        (0.0, 0.0),
        openings=[opening("O1", 1.0, 3.0), opening("O2", 2.5, 4.0)],
    )
    piers, _ = make_piers([wall], OPTIONS)
    assert [(p.start, p.end) for p in piers] == [
        ((0.0, 6.0), (0.0, 5.0)),
        ((0.0, 2.0), (0.0, 0.0)),
    ]
    assert all(p.direction is Direction.Y for p in piers)


def test_sliver_beside_opening_is_not_a_pier():
    # 0.03 m left of the opening is below MIN_PIER_LENGTH = 0.05 m (common practice).
    wall = segment("W3", (0.0, 0.0), (3.0, 0.0), openings=[opening("O1", 0.03, 1.0)])
    piers, conditions = make_piers([wall], OPTIONS)
    assert [(p.pier, p.start, p.end) for p in piers] == [(0, (1.0, 0.0), (3.0, 0.0))]
    assert conditions == ()


def test_opening_over_whole_wall_leaves_no_pier():
    wall = segment("W4", (0.0, 0.0), (2.0, 0.0), openings=[opening("O9", 0.0, 1.98)])
    piers, conditions = make_piers([wall], OPTIONS)
    assert piers == ()
    (c,) = conditions
    assert c.kind is ConditionKind.NO_PIER
    assert c.guids == ("O9", "W4")
    assert c.value == pytest.approx(2.0)


@pytest.mark.parametrize(
    ("degrees", "expected"),
    [
        (0.0, Direction.X),
        (9.9, Direction.X),
        (175.0, Direction.X),
        (90.0, Direction.Y),
        (81.0, Direction.Y),
        (30.0, None),
        (135.0, None),
    ],
)  # angle_tolerance 10 deg, DESIGN.md configuration default
def test_wall_direction(degrees, expected):
    assert wall_direction(math.radians(degrees), math.radians(10.0)) is expected


def test_skewed_wall_gives_condition_and_unallocated_piers():
    a = math.radians(30.0)
    wall = segment("SK", (0.0, 0.0), (4.0 * math.cos(a), 4.0 * math.sin(a)))
    piers, conditions = make_piers([wall], AnalysisOptions())
    assert [p.direction for p in piers] == [None]
    assert [c.kind for c in conditions] == [ConditionKind.SKEWED_WALL]
    assert conditions[0].guids == ("SK",)


def test_non_shear_walls_and_walls_under_no_level_are_skipped():
    walls = [
        segment("P1", (0.0, 0.0), (4.0, 0.0), shear=False),
        segment("PA", (0.0, 0.0), (4.0, 0.0), level=""),
    ]
    assert make_piers(walls, OPTIONS) == ((), ())


@settings(max_examples=60, derandomize=True, deadline=None)
@given(
    length=st.floats(1.0, 20.0),
    cuts=st.lists(st.tuples(st.floats(0.0, 1.0), st.floats(0.01, 0.3)), max_size=4),
)
def test_piers_cover_the_wall_less_its_openings(length, cuts):
    # Geometry: piers lie outside openings; piers + openings + slivers = length.
    ops = [
        opening(f"O{i}", s * length, min(length, s * length + w * length))
        for i, (s, w) in enumerate(cuts)
        if min(length, s * length + w * length) > s * length
    ]
    piers, _ = make_piers(
        [segment("W", (0.0, 0.0), (length, 0.0), openings=ops)], OPTIONS
    )
    for p in piers:
        for o in ops:
            assert p.end[0] <= o.start + 1e-9 or p.start[0] >= o.end - 1e-9
    covered = sorted((o.start, o.end) for o in ops)
    merged = []
    for a, b in covered:
        if merged and a <= merged[-1][1]:
            merged[-1][1] = max(merged[-1][1], b)
        else:
            merged.append([a, b])
    gaps = length - sum(b - a for a, b in merged)
    total = sum(p.length for p in piers)
    assert total <= gaps + 1e-9
    assert total >= gaps - (len(merged) + 1) * MIN_PIER_LENGTH - 1e-9
