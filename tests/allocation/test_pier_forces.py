"""The rigid cases' pier-force maps over a shared index: a dict in all but storage."""

from __future__ import annotations

import pickle

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from allocation._pier_forces import PierForces, PierIndex
from allocation.envelope import envelope, line_envelope
from allocation.errors import AllocationError
from allocation.results import ResistanceLine
from allocation.rigid import rigid_cases
from ifc_bridge.model import Direction
from tests.allocation.test_envelope import _rigid

_ids = st.lists(st.text(min_size=1, max_size=6), min_size=0, max_size=12, unique=True)
_force = st.floats(-1e7, 1e7, allow_nan=False)


@given(ids=_ids, data=st.data())
def test_equals_the_dict_of_the_same_ids_and_array(ids, data):
    values = data.draw(st.lists(_force, min_size=len(ids), max_size=len(ids)))
    array = np.array(values, dtype=np.float64).reshape(len(ids))
    forces = PierForces(PierIndex(ids), array)
    expected = dict(zip(ids, array.tolist(), strict=True))
    assert forces == expected
    assert list(forces) == list(expected)  # order as the dict's
    assert forces.values() == list(expected.values())
    assert forces.items() == list(expected.items())
    assert all(forces[k] == v and type(forces[k]) is float for k, v in expected.items())
    assert pickle.loads(pickle.dumps(forces)) == expected


def test_reads_like_a_mapping_and_stays_read_only():
    index = PierIndex(["a", "b", "c"])
    forces = PierForces(index, np.array([1.0, -2.0, 3.5]))
    assert "b" in forces
    assert "z" not in forces
    assert forces.get("z", 0.0) == 0.0
    assert len(forces) == 3
    with pytest.raises(ValueError, match="read-only"):
        forces.array[0] = 5.0  # the case's forces cannot change under its readers
    other = PierForces(index, np.array([0.0, 0.0, 0.0]))
    assert other.index is forces.index  # the story's cases share one index


def test_bad_shapes_and_repeated_ids_are_clear_errors():
    with pytest.raises(AllocationError, match="given twice in one story: b"):
        PierIndex(["a", "b", "b"])
    with pytest.raises(AllocationError, match="2 piers for an array of shape"):
        PierForces(PierIndex(["a", "b"]), np.array([1.0, 2.0, 3.0]))


_CASES = [c for d in (Direction.X, Direction.Y) for c in rigid_cases(d)]


@given(
    n=st.integers(1, 7),
    data=st.data(),
)
def test_envelope_reads_the_arrays_as_it_reads_dicts(n, data):
    """Two stories of eight cases each: the same envelope from arrays and dicts."""
    stories = []
    for level in ("L1", "L2"):
        index = PierIndex(f"{level}|{k}" for k in range(n))
        rows = [
            np.array(data.draw(st.lists(_force, min_size=n, max_size=n)))
            for _ in _CASES
        ]
        stories.append((index, rows))
    as_arrays = [
        _rigid(c.direction, c.sign, c.ecc_sign, PierForces(index, row))
        for index, rows in stories
        for c, row in zip(_CASES, rows, strict=True)
    ]
    as_dicts = [
        _rigid(
            c.direction,
            c.sign,
            c.ecc_sign,
            dict(zip(index.ids, row.tolist(), strict=True)),
        )
        for index, rows in stories
        for c, row in zip(_CASES, rows, strict=True)
    ]
    assert envelope([], as_arrays) == envelope([], as_dicts)
    lines = [
        ResistanceLine(
            id=f"{level}-X-1",
            level=level,
            direction=Direction.X,
            offset=0.0,
            piers=index.ids[: max(1, n // 2)],
            wall_extent=(0.0, 1.0),
            wall_length=1.0,
        )
        for level, (index, _) in zip(("L1", "L2"), stories, strict=True)
    ]
    assert line_envelope(lines, [], as_arrays) == line_envelope(lines, [], as_dicts)
