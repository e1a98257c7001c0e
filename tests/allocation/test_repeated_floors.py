"""Typical floors: geometric steps reused from memory, and the vectorised placements.

The allocation remembers region splits, line crossings and point placements for
bit-identical geometry (a tower's typical floors). These tests check that a result
taken from memory is the fresh one with the current level's ids, and that the
vectorised placement of many points agrees with the one-point functions.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from shapely.geometry import Polygon

from allocation import _crossing, _loading, _memo, _pieces, _tributary
from allocation import lines as lines_module
from allocation._memo import Memo, wkb_of
from allocation._pieces import Support, split_region
from allocation._tributary import Slot, host, make_slots, on_line
from allocation.lines import find_lines, line_crossing
from allocation.piers import make_piers
from allocation.results import MassItem
from ifc_bridge.model import Direction
from tests.allocation._plans import OPTIONS, diaphragm, x_wall

FAST = settings(max_examples=40, derandomize=True, deadline=None)

# 20 m x 12 m slab with a 2 m x 2 m stair hole (invented test geometry)
SLAB = Polygon(
    [(0, 0), (20, 0), (20, 12), (0, 12)], [[(8, 5), (10, 5), (10, 7), (8, 7)]]
)


def _supports(prefix: str) -> list[Support]:
    return [
        Support(line=f"{prefix}-1", v=0.0, segments=((0.0, 20.0),)),
        Support(
            line=f"{prefix}-2",
            v=6.0,
            segments=((0.0, 8.0), (10.0, 20.0)),
            spans=((0.0, 20.0),),  # continues past the stair: not cut across
        ),
        Support(line=f"{prefix}-3", v=12.0, segments=((0.0, 20.0),)),
    ]


def _forget() -> None:
    _pieces._SPLITS.clear()
    _crossing._CROSSINGS.clear()
    _tributary._SPREADS.clear()
    _tributary._PLACES.clear()
    _tributary._LAYOUTS.clear()
    lines_module._LAYOUTS.clear()


def test_memo_keeps_the_most_recent_entries_and_computes_once():
    memo: Memo[int] = Memo(2)
    calls = []

    def compute(v: int):
        calls.append(v)
        return v * v

    assert [memo.get(k, lambda k=k: compute(k)) for k in (1, 2, 1, 3)] == [1, 4, 1, 9]
    assert calls == [1, 2, 3]  # 1 came from memory the second time
    assert len(memo) == 2
    memo.get(2, lambda: compute(2))  # 2 was the least recently used: evicted
    assert calls == [1, 2, 3, 2]


def test_geometry_bytes_are_written_once_and_forgotten_with_the_geometry():
    import gc

    slab = Polygon(SLAB.exterior, SLAB.interiors)
    first = wkb_of(slab)
    assert first == slab.wkb  # the bytes shapely writes
    assert wkb_of(slab) is first  # kept: not written again
    key = id(slab)
    del slab
    gc.collect()
    assert key not in _memo._WKB  # forgotten with its geometry
    other = Polygon([(0, 0), (1, 0), (1, 1)])
    assert wkb_of(other) == other.wkb  # a new object, whatever its id: its own bytes


def test_split_from_memory_carries_this_floors_line_ids():
    _forget()
    lower = split_region(SLAB, _supports("L2-X"))
    upper = split_region(SLAB, _supports("L3-X"))  # same geometry, next floor
    # common practice: the line at v = 6 splits the slab into two 6 m spans
    assert [round(p.local.area, 9) for p in lower] == [
        118.0,
        118.0,
    ]  # 20 x 6 less half the hole
    assert [[s.line for s in p.supports] for p in upper] == [
        ["L3-X-1", "L3-X-2"],
        ["L3-X-2", "L3-X-3"],
    ]
    _forget()
    fresh = split_region(SLAB, _supports("L3-X"))
    assert [p.local.wkb for p in fresh] == [p.local.wkb for p in upper]
    assert [p.supports for p in fresh] == [p.supports for p in upper]


def test_negative_zero_is_not_taken_for_zero():
    _forget()
    split_region(SLAB, _supports("A"))
    moved = [Support(line="B-1", v=-0.0, segments=((0.0, 20.0),)), *_supports("B")[1:]]
    split_region(SLAB, moved)
    assert len(_pieces._SPLITS) == 2  # -0.0 is a new key, not the entry for 0.0


def test_crossing_from_memory_names_this_floors_region():
    _forget()
    walls = [x_wall("A", 6.0, 2.0, 18.0)]
    piers, _ = make_piers(walls, OPTIONS)
    lines, _, _ = find_lines(
        piers, [diaphragm(SLAB)], level="L1", level_index=1, options=OPTIONS
    )
    first = line_crossing(lines[0], diaphragm(SLAB, level="L1"), tolerance=0.5)
    again = line_crossing(lines[0], diaphragm(SLAB, level="L2"), tolerance=0.5)
    # common practice: the chord runs the full slab width less the 2 m stair hole
    assert first.length == pytest.approx(18.0)
    assert (first.diaphragm, again.diaphragm) == ("L1/D1", "L2/D1")
    assert (again.segments, again.spans) == (first.segments, first.spans)


def _floor_slots(level: str, index: int) -> list[Slot]:
    walls = [x_wall("A", 0.0, 0.0, 20.0), x_wall("B", 6.0, 0.0, 8.0)]
    walls += [x_wall("C", 12.0, 4.0, 20.0)]
    walls = [
        x_wall(f"{w.guid}{level}", w.start[1], w.start[0], w.end[0], level=level)
        for w in walls
    ]
    piers, _ = make_piers(walls, OPTIONS)
    region = diaphragm(SLAB, level=level)
    lines, _, _ = find_lines(
        piers, [region], level=level, level_index=index, options=OPTIONS
    )
    return make_slots([region], list(lines), Direction.X, 0.5)


def _described(slots: list[Slot]) -> list[tuple]:
    return [
        (
            s.id,
            s.region.id,
            s.piece.local.wkb,
            s.plan.wkb,
            s.piece.supports,
            s.key,
            (s.weight, s.moment_u, s.moment_v),
        )
        for s in slots
    ]


def test_slots_from_memory_carry_this_floors_lines_and_region():
    _forget()
    _floor_slots("L2", 2)
    upper = _floor_slots("L3", 3)  # the same plan one floor up: laid out from memory
    assert [s.id for s in upper] == ["L3/D1/X1", "L3/D1/X2", "L3/D1/X3"]
    # by hand: line B (y = 6, x 0-8) is cut across where it ends, at x = 8
    assert [[x.line for x in s.piece.supports] for s in upper] == [
        ["L3-X-1", "L3-X-2"],
        ["L3-X-1", "L3-X-3"],
        ["L3-X-2", "L3-X-3"],
    ]
    assert [s.piece.local.area for s in upper] == pytest.approx([48.0, 140.0, 48.0])
    _forget()
    fresh = _floor_slots("L3", 3)
    assert _described(upper) == _described(fresh)


def _slots() -> list[Slot]:
    walls = [x_wall("A", 0.0, 0.0, 20.0), x_wall("B", 6.0, 0.0, 8.0)]
    walls.append(x_wall("C", 12.0, 4.0, 20.0))
    piers, _ = make_piers(walls, OPTIONS)
    region = diaphragm(SLAB)
    lines, _, _ = find_lines(
        piers, [region], level="L1", level_index=1, options=OPTIONS
    )
    return make_slots([region], list(lines), Direction.X, 0.5)


coordinate = st.one_of(
    st.sampled_from([-1.0, 0.0, 4.0, 6.0, 8.0, 9.0, 10.0, 12.0, 20.0, 21.0]),
    st.floats(min_value=-2.0, max_value=22.0, allow_nan=False),
)


@FAST
@given(st.lists(st.tuples(coordinate, coordinate), min_size=1, max_size=30))
def test_vectorised_placement_matches_the_one_point_functions(points):
    slots = _slots()
    u = np.array([p[0] for p in points], dtype=float)
    v = np.array([p[1] for p in points], dtype=float)
    placed = _tributary._place(u, v, slots)
    for (pu, pv), (j, k, qu, qv, _) in zip(points, placed, strict=True):
        line = on_line(pu, pv, slots)
        if line is not None:
            assert slots[j].piece.supports[k].line == line
            continue
        slot, hu, hv = host(pu, pv, slots)
        assert (slots[j].id, qu, qv) == (slot.id, hu, hv)  # bit-identical


def _one_at_a_time(items, slots, wall_lines):
    """The loading item by item with the one-point functions (the reference)."""
    direct: dict[str, float] = {}
    lost = 0.0
    for item in items:
        parts = (
            []
            if item.polygon is None
            else _tributary._spread(item.polygon, slots, Direction.X)
        )
        base = math.fsum(area for _, area, _ in parts)
        if base > 0.0:
            for slot, area, (u, v) in parts:
                slot.add(item.weight * area / base, u, v)
            continue
        line = (
            wall_lines.get((item.ref, item.pier_part))
            if item.source == "wall"
            else None
        )
        u, v = item.location
        line = line or on_line(u, v, slots)
        if line is not None:
            direct[line] = direct.get(line, 0.0) + item.weight
        elif slots:
            slot, hu, hv = host(u, v, slots)
            slot.add(item.weight, hu, hv)
        else:
            lost += item.weight
    return direct, lost


weight = st.floats(min_value=0.0, max_value=1e4, allow_nan=False)


@FAST
@given(st.lists(st.tuples(coordinate, coordinate, weight, st.booleans()), max_size=25))
def test_loading_by_arrays_and_from_memory_is_the_loading_item_by_item(points):
    region = diaphragm(SLAB)
    slab = MassItem(
        source="slab", ref=region.id, weight=240e3, location=(10.0, 6.0), polygon=SLAB
    )
    walls = [
        MassItem(source="wall", ref=f"W{n}", weight=w, location=(u, v))
        for n, (u, v, w, _) in enumerate(points)
    ]
    extra = MassItem(
        source="extra", ref=region.id, weight=5e3, location=(10.0, 6.0), polygon=SLAB
    )  # a spread item after the points (order matters)
    items = (slab, *walls[: len(walls) // 2], extra, *walls[len(walls) // 2 :])
    in_line = {(f"W{n}", 0): "L1-X-2" for n, (*_, yes) in enumerate(points) if yes}
    expected_slots = _slots()
    expected = _one_at_a_time(items, expected_slots, in_line)
    _loading._LOADS.clear()
    for _ in range(2):  # worked out, then from memory (a typical floor)
        slots = _slots()
        assert _loading.load_masses(items, slots, in_line, Direction.X) == expected
        assert [(s.weight, s.moment_u, s.moment_v) for s in slots] == [
            (s.weight, s.moment_u, s.moment_v) for s in expected_slots
        ]  # bit-identical sums, in item order
