"""The run's column tables read what the records hold (invariants, no numbers).

``allocation._columns.ends`` serves a kept sequence's end points, and the rows of
records taken from it, as a fresh read of those records gives them, bit for bit;
``allocation._mass_table.MassTable`` reads, compares, hashes and pickles as the tuple
of its mass items, and the loading reads the same arrays from it as from that tuple.
Invented values only.
"""

from __future__ import annotations

import pickle

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from shapely.geometry import box

from allocation import _columns, _loading
from allocation._mass_table import MassTable
from allocation.results import MassItem, Pier
from ifc_bridge.model import Direction, WallSegment

FAST = settings(max_examples=40, derandomize=True, deadline=None)

coord = st.floats(-1e6, 1e6, allow_nan=False, allow_infinity=False)
ends = st.tuples(st.tuples(coord, coord), st.tuples(coord, coord)).filter(
    lambda se: abs(se[1][0] - se[0][0]) + abs(se[1][1] - se[0][1]) > 0.1  # a wall
)


def _wall(i: int, start, end) -> WallSegment:
    return WallSegment(
        guid=f"G{i}",
        name=f"W{i}",
        storey="L0",
        level="L1",
        start=start,
        end=end,
        thickness=0.2,
        base_elevation=0.0,
        top_elevation=3.0,
    )


def _fresh(items) -> np.ndarray:
    return np.array([(w.start, w.end) for w in items], dtype=np.float64).reshape(
        -1, 2, 2
    )


@FAST
@given(st.lists(ends, min_size=1, max_size=30), st.data())
def test_kept_table_and_its_subsets_read_as_fresh(rows, data):
    walls = tuple(_wall(i, s, e) for i, (s, e) in enumerate(rows))
    kept = _columns.ends(walls, keep=True)
    assert np.array_equal(kept, _fresh(walls))
    assert not kept.flags.writeable  # shared: callers cannot change it
    assert _columns.ends(walls) is kept
    picks = data.draw(st.lists(st.sampled_from(walls), max_size=40))
    subset = _columns.ends(picks)
    assert subset.shape == (len(picks), 2, 2)
    assert np.array_equal(subset, _fresh(picks))


def _pier(i: int, start, end) -> Pier:
    return Pier(
        id=f"G{i}|0|0",
        guid=f"G{i}",
        name=f"W{i}",
        pier=0,
        part=0,
        level="L1",
        storey="L0",
        direction=Direction.X,
        start=start,
        end=end,
        height=3.0,
        thickness=0.2,
    )


@FAST
@given(st.lists(ends, min_size=1, max_size=2 * _columns._FEW), st.data())
def test_pier_lengths_are_each_piers_length_few_or_many(rows, data):
    piers = tuple(_pier(i, s, e) for i, (s, e) in enumerate(rows))
    expect = [p.length for p in piers]  # Pier.length, the definition
    assert _columns.pier_lengths(piers) == expect  # fresh read, bit for bit
    _columns.ends(piers, keep=True)
    assert _columns.pier_lengths(piers) == expect  # from the kept table
    some = data.draw(st.lists(st.sampled_from(piers), min_size=1))
    assert _columns.pier_lengths(some) == [p.length for p in some]


def test_records_not_all_from_a_kept_table_are_read_afresh():
    walls = tuple(_wall(i, (float(i), 0.0), (float(i) + 2.0, 0.0)) for i in range(5))
    _columns.ends(walls, keep=True)
    stranger = _wall(9, (50.0, 1.0), (53.0, 1.0))  # an equal-looking, other object
    mixed = [walls[2], stranger, walls[0]]
    assert np.array_equal(_columns.ends(mixed), _fresh(mixed))
    twin = _wall(2, walls[2].start, walls[2].end)  # equal to walls[2], not it
    assert np.array_equal(_columns.ends([twin]), _fresh([twin]))


def test_only_a_few_tables_are_kept():
    for n in range(_columns._KEEP + 3):
        _columns.ends(
            tuple(_wall(k, (0.0, k), (1.0, k)) for k in range(n + 1)), keep=True
        )
    assert len(_columns._TABLES) == _columns._KEEP


def _items() -> list[MassItem]:
    slab = box(0.0, 0.0, 10.0, 6.0)
    return [
        MassItem(
            source="slab", ref="D1", weight=6.0e5, location=(5.0, 3.0), polygon=slab
        ),
        MassItem(
            source="wall", ref="W1", weight=1.25e4, location=(0.0, 3.0), pier_part=0
        ),
        MassItem(source="wall", ref="W2", weight=0.1 + 0.2, location=(10.0, 3.0)),
        MassItem(
            source="extra", ref="", weight=3.0e3, location=(5.0, 3.0), polygon=slab
        ),
    ]


def test_mass_table_reads_compares_and_pickles_as_its_items():
    items = _items()
    table = MassTable.of(items)
    assert len(table) == 4
    assert list(table) == items
    assert table == tuple(items)
    assert tuple(items) == table
    assert table == items
    assert hash(table) == hash(tuple(items))
    assert table[-1] == items[-1]
    assert table[1:3] == tuple(items[1:3])
    with pytest.raises(IndexError):
        table[4]
    assert pickle.loads(pickle.dumps(table)) == table
    joined = MassTable.join([MassTable.of(items[:1]), MassTable.of(items[1:])])
    assert joined == table
    assert not table.weight.flags.writeable
    assert not table.xy.flags.writeable


def test_loading_reads_the_same_arrays_from_a_table_as_from_its_items():
    items = _items()
    plain, columns = (
        _loading._make_arrays(tuple(items)),
        _loading._make_arrays(MassTable.of(items)),
    )
    assert plain.total == columns.total
    assert np.array_equal(plain.weight, columns.weight)
    assert np.array_equal(plain.xy, columns.xy)
    assert plain.spread == columns.spread
    assert plain.rows_of == columns.rows_of
    assert plain.signature == columns.signature
