"""Walls modelled twice (not a code provision; hand geometry, # common practice)."""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checks.rules.model.duplicate_walls import check_duplicate_walls, overlap_fraction
from ifc_bridge.model import BuildingModel, Level, WallSegment


def _wall(guid, start, end, storey="L1"):
    return WallSegment(
        guid=guid,
        name=guid,
        storey=storey,
        level="L2",
        base_elevation=0.0,
        top_elevation=3.0,
        start=start,
        end=end,
        thickness=0.15,
    )


def _model(*walls):
    levels = (
        Level(name="L1", guid="s1", elevation=0.0, index=0),
        Level(name="L2", guid="s2", elevation=3.0, index=1),
    )
    return BuildingModel(source="t.ifc", schema="IFC4", levels=levels, walls=walls)


@pytest.mark.parametrize(
    ("b_start", "b_end", "expected"),
    [
        ((0.0, 0.0), (6.0, 0.0), 1.0),  # same wall, common practice
        ((6.0, 0.0), (0.0, 0.0), 1.0),  # reversed direction
        ((3.0, 0.05), (9.0, 0.05), 0.5),  # half overlap, within the thickness
        ((0.0, 1.0), (6.0, 1.0), 0.0),  # parallel, 1 m apart: a different wall
        ((0.0, 0.0), (0.0, 6.0), 0.0),  # perpendicular
    ],
)
def test_overlap_fraction(b_start, b_end, expected):
    a = _wall("A", (0.0, 0.0), (6.0, 0.0))
    assert overlap_fraction(a, _wall("B", b_start, b_end)) == pytest.approx(expected)


def test_copy_is_reported_once_with_both_guids():
    found = check_duplicate_walls(
        _model(
            _wall("A", (0.0, 0.49), (6.0, 0.49)),
            _wall("B", (0.0, 0.51), (6.0, 0.51)),
            _wall("C", (0.0, 5.0), (6.0, 5.0)),
        )
    )
    assert [f.guids for f in found] == [("A", "B")]


def test_same_place_other_storey_is_not_a_duplicate():
    assert (
        check_duplicate_walls(
            _model(_wall("A", (0, 0), (6, 0)), _wall("B", (0, 0), (6, 0), storey="L2"))
        )
        == []
    )


def test_cells_found_with_arrays_give_the_findings_of_the_plain_grid(monkeypatch):
    # far from the origin, several storeys, copies a little off: the array grouping
    # (cells that can hold a pair) finds what the dictionary of every cell finds
    from checks.rules.model import duplicate_walls

    x0, y0 = -51234.6, 7777.5
    walls = []
    for storey in ("L1", "L2"):
        for i in range(6):
            walls.append(
                _wall(f"{storey}{i}", (x0, y0 + 2 * i), (x0 + 6, y0 + 2 * i), storey)
            )
        walls.append(
            _wall(f"{storey}c", (x0 + 0.7, y0 + 4.04), (x0 + 6.7, y0 + 4.04), storey)
        )
    walls.append(_wall("L1y", (x0 + 3, y0 - 3), (x0 + 3, y0 + 3), "L1"))
    model = _model(*walls)
    found = check_duplicate_walls(model)
    assert sorted(f.guids for f in found) == [("L12", "L1c"), ("L22", "L2c")]
    monkeypatch.setattr(duplicate_walls, "_CODABLE", 1.0)  # every cell, by dictionary
    assert check_duplicate_walls(model) == found


def _near_copies(bases, jitters) -> list[WallSegment]:
    """Walls and copies of them a little off: moved, longer, turned (invented)."""
    walls = []
    for n, ((x, y, length, angle), copies) in enumerate(
        zip(bases, jitters, strict=True)
    ):
        ux, uy = math.cos(angle), math.sin(angle)
        walls.append(_wall(f"W{n}", (x, y), (x + length * ux, y + length * uy)))
        for m, (dx, dy, dl, da) in enumerate(copies):
            cx, cy = math.cos(angle + da), math.sin(angle + da)
            end = (x + dx + (length + dl) * cx, y + dy + (length + dl) * cy)
            storey = "L1" if m % 3 else "L2"
            walls.append(_wall(f"W{n}c{m}", (x + dx, y + dy), end, storey))
    return walls


_BASE = st.tuples(
    st.floats(-30, 30),
    st.floats(-30, 30),
    st.floats(0.3, 8),
    st.sampled_from([0.0, math.pi / 2, 0.7, 3.0]),
)
# moves at the edge of half the thickness (0.075 m), lengths, turns at the edge of
# the 2 degree parallel tolerance
_COPY = st.tuples(
    st.sampled_from([0.0, 0.075, -0.075, 0.0750001, 1e-7, 0.3]),
    st.sampled_from([0.0, 0.075, -0.0749999, 2.0, 0.5]),
    st.sampled_from([0.0, -0.2, 3.0, 1e-9]),
    st.sampled_from([0.0, math.radians(2.0), -math.radians(2.0) - 1e-12, 0.01]),
)


@settings(max_examples=60, derandomize=True, deadline=None)
@given(st.lists(_BASE, min_size=1, max_size=8), st.data())
def test_array_pairs_give_the_findings_of_every_pair(bases, data):
    # common practice: the array pre-test only leaves out pairs the exact test
    # rejects, so the findings (and their order) are those of testing every pair
    from checks.rules.model import duplicate_walls

    jitters = [data.draw(st.lists(_COPY, max_size=3)) for _ in bases]
    model = _model(*_near_copies(bases, jitters))
    found = check_duplicate_walls(model)
    assert set(duplicate_walls._pairs(model.walls)) <= set(
        duplicate_walls._pairs_by_dict(model.walls)
    )
    with pytest.MonkeyPatch.context() as mp:
        mp.setattr(duplicate_walls, "_CODABLE", -1.0)  # every pair, by dictionary
        assert check_duplicate_walls(model) == found
