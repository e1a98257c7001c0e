"""The allocation's fast paths give what the plain ones give (invariants, no numbers).

Records built by ``allocation._records.maker`` equal the class's own; the collector
pause restores the collector; the load-path mapping builds the graphs of
``build_load_path``; the array versions of the stacking test, the envelope peaks and
the line sums agree with the one-at-a-time code, bit for bit. Invented values only.
"""

from __future__ import annotations

import dataclasses
import gc
import math
import pickle
import sys

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from allocation import _records, _transfers, envelope
from allocation.load_path import LoadPathGraphs, build_load_path
from allocation.results import (
    MassItem,
    Pier,
    PierEnvelope,
    PointLoad,
    ResistanceLine,
)
from ifc_bridge import gc_pause as _gc
from ifc_bridge.model import Direction, Level, WallSegment

FAST = settings(max_examples=60, derandomize=True, deadline=None)


def _pier(**kw) -> Pier:
    base = {
        "id": "G|L1|0|0",
        "guid": "G",
        "name": "wall G",
        "pier": 0,
        "part": 0,
        "level": "L1",
        "storey": "L0",
        "direction": Direction.X,
        "start": (0.0, 1.0),
        "end": (4.0, 1.0),
        "height": 3.0,
        "thickness": 0.2,
    }
    return Pier(**{**base, **kw})


@pytest.mark.parametrize(
    ("cls", "fields"),
    [
        (MassItem, {"source": "wall", "ref": "G", "weight": 1.5, "location": (1, 2)}),
        (
            PointLoad,
            {
                "level": "L1",
                "direction": Direction.Y,
                "source_pier": "G|L2|0|0",
                "location": (0.0, -0.0),
                "force": -2.0,
                "shares": (("L1-Y-1", -2.0),),
            },
        ),
        (
            PierEnvelope,
            {
                "pier": "G|L1|0|0",
                "flexible": 1.0,
                "rigid": 2.0,
                "envelope": 2.0,
                "governing_method": "rigid",
                "governing_case": "+X+e",
            },
        ),
    ],
)
def test_maker_builds_the_record_the_class_builds(cls, fields):
    made, plain = _records.maker(cls)(**fields), cls(**fields)
    assert type(made) is cls
    assert made == plain
    assert hash(made) == hash(plain)
    assert repr(made) == repr(plain)


def test_maker_pier_keeps_the_defaults_and_stays_frozen():
    fields = {
        f: getattr(_pier(), f) for f in Pier.__slots__ if f not in ("stiffness", "line")
    }
    made = _records.maker(Pier)(**fields)
    assert made == _pier()
    assert (made.stiffness, made.line) == (0.0, "")
    with pytest.raises(AttributeError):
        made.line = "L1-X-1"  # frozen: FrozenInstanceError is an AttributeError


@dataclasses.dataclass(frozen=True, slots=True, kw_only=True)
class _Base:
    a: float
    b: str = "b"


@dataclasses.dataclass(frozen=True, slots=True, kw_only=True)
class _Derived(_Base):
    c: tuple[float, ...] = ()


def test_maker_sets_slots_of_a_base_class_too():
    made = _records.maker(_Derived)(a=-0.0, c=(1.0,))
    assert made == _Derived(a=-0.0, c=(1.0,))
    assert (type(made), repr(made)) == (_Derived, repr(_Derived(a=-0.0, c=(1.0,))))
    assert _records.records(_Derived, a=[1.0, 2.0]) == [
        _Derived(a=1.0),
        _Derived(a=2.0),
    ]


@pytest.mark.parametrize("cls", [Level, WallSegment, dict])
def test_maker_refuses_records_it_cannot_build_faithfully(cls):
    with pytest.raises(TypeError, match="maker"):
        _records.maker(
            cls
        )  # __post_init__ checks (Level, WallSegment), or no dataclass


def _fail_while_paused() -> None:
    with _gc.collection_paused():
        msg = "inside"
        raise ValueError(msg)


def test_collection_pause_restores_the_collector():
    assert gc.isenabled()
    with _gc.collection_paused():
        assert not gc.isenabled()
    assert gc.isenabled()
    with pytest.raises(ValueError, match="inside"):
        _fail_while_paused()
    assert gc.isenabled()
    gc.disable()
    try:
        with _gc.collection_paused():
            assert not gc.isenabled()
        assert not gc.isenabled()  # it was off before: left off
    finally:
        gc.enable()


def test_load_path_mapping_builds_each_graph_once_as_build_load_path():
    from tests.allocation.test_load_path import _two_levels

    results, piers = _two_levels()
    graphs = LoadPathGraphs(results, piers)
    assert list(graphs) == [Direction.X, Direction.Y]
    assert graphs.get(None) is None
    g, fresh = graphs[Direction.X], build_load_path(results, piers)
    assert graphs["X"] is g  # StrEnum keys: the string finds it too, built once
    assert list(g.nodes(data=True)) == list(fresh.nodes(data=True))
    assert list(g.edges(data=True)) == list(fresh.edges(data=True))
    assert graphs[Direction.Y].number_of_nodes() == 0  # no Y results


def _exact(totals: dict) -> str:
    """Pier -> level -> force as text that tells every float apart (``-0.0``, too)."""
    return repr(sorted((pid, sorted(by.items())) for pid, by in totals.items()))


def test_load_path_mapping_answers_as_the_graph_functions_without_networkx(
    monkeypatch,
):
    from allocation.load_path import explain_all, level_totals
    from tests.allocation.test_load_path import _two_levels

    results, piers = _two_levels()
    graphs = LoadPathGraphs(results, piers)
    monkeypatch.setitem(sys.modules, "networkx", None)  # importing it now fails
    answers = {
        d: (graphs.node_count(d), graphs.level_totals(d), graphs.explain_all(d))
        for d in Direction
    }
    assert repr(graphs).endswith("built: none)")
    monkeypatch.undo()
    for d, (count, totals, explained) in answers.items():
        g = build_load_path([r for r in results if r.direction is d], piers)
        assert count == g.number_of_nodes()
        assert _exact(totals) == _exact(level_totals(g))
        assert explained == explain_all(g)
        assert list(explained) == list(explain_all(g))
    assert answers[Direction.X][1]  # the X graph has piers to explain


def test_load_path_mapping_pickles_its_inputs_not_its_graphs():
    from tests.allocation.test_load_path import _two_levels

    results, piers = _two_levels()
    graphs = LoadPathGraphs(results, piers)
    built = graphs[Direction.X]
    back = pickle.loads(pickle.dumps(graphs))
    assert repr(back).endswith("built: none)")
    assert list(back[Direction.X].edges(data=True)) == list(built.edges(data=True))
    # a pickle made before ``__reduce__`` holds the slots; it still reads
    old = LoadPathGraphs.__new__(LoadPathGraphs)
    old.__setstate__(
        (None, {"_built": {}, "_flexible": tuple(results), "_piers": tuple(piers)})
    )
    assert list(old[Direction.X].nodes(data=True)) == list(built.nodes(data=True))


coordinate = st.one_of(
    st.sampled_from([-0.0, 0.0, 0.5, 1.0, 2.5, 3.0, 0.1 + 0.2]),
    st.floats(min_value=-1.0, max_value=6.0, allow_nan=False),
)


@FAST
@given(
    st.lists(st.tuples(coordinate, coordinate, coordinate, coordinate), max_size=8),
    st.lists(st.tuples(coordinate, coordinate, coordinate), max_size=5),
    st.sampled_from([0.5, 0.1, 0.1 + 0.2]),
)
def test_stacking_on_arrays_is_stands_on(ends, line_data, tol):
    piers = [
        _pier(id=f"p{n}", start=(x0, y0), end=(x1, y1))
        for n, (x0, y0, x1, y1) in enumerate(ends)
    ]
    lines = [
        ResistanceLine(
            id=f"L1-X-{n}",
            level="L1",
            direction=Direction.X,
            offset=off,
            piers=(),
            wall_extent=(min(a, b), max(a, b)),
            wall_length=1.0,
        )
        for n, (off, a, b) in enumerate(line_data)
    ]
    found = _transfers._first_under(piers, lines, Direction.X, tol)
    for p, line in zip(piers, found, strict=True):
        first = next(
            (ln for ln in lines if _transfers.stands_on(p, ln, tolerance=tol)), None
        )
        assert line is first


magnitude = st.one_of(st.sampled_from([0.0, -0.0, 1.0, -1.0, 2.5]), st.floats(-5, 5))


@FAST
@given(st.lists(st.lists(magnitude, min_size=3, max_size=3), min_size=1, max_size=6))
def test_envelope_peaks_by_rows_are_the_loop_peaks(rows):
    # two stories of three piers, the cases of each in turn (as rigid results come)
    items = []
    for n, values in enumerate(rows):
        story = "A" if n % 2 else "B"
        forces = {f"{story}{k}": v for k, v in enumerate(values)}
        items.append((f"case {n}", forces))
    assert envelope._peaks_by_rows(items) == envelope._peaks(items)
    members = {"LA": ("A0", "A2"), "LB": ("B1", "B0", "B2"), "LC": ("C0",)}
    sums = envelope._LineSums(members)
    for (label, fast), (_, forces) in zip(sums.many(items), items, strict=True):
        plain = sums(forces)
        assert list(fast) == list(plain)
        assert all(math.fabs(fast[k]) == math.fabs(plain[k]) for k in plain), label


def test_records_builds_each_row_as_the_class_does():
    rows = _records.records(
        MassItem,
        source=["wall", "slab"],
        ref=["G", "L1/D1"],
        weight=[1.0, -0.0],
        location=[(0.0, 1.0), (2.0, 3.0)],
    )
    assert rows == [
        MassItem(source="wall", ref="G", weight=1.0, location=(0.0, 1.0)),
        MassItem(source="slab", ref="L1/D1", weight=-0.0, location=(2.0, 3.0)),
    ]
    assert _records.records(MassItem, source=[], ref=[], weight=[], location=[]) == []
    with pytest.raises(ValueError, match="lengths"):
        _records.records(MassItem, source=["a"], ref=[], weight=[1.0], location=[()])
    with pytest.raises(TypeError, match="no column"):
        _records.records(MassItem, source=["a"], ref=["b"], weight=[1.0])
    with pytest.raises(TypeError, match="no field"):
        _records.records(MassItem, source=[], ref=[], weight=[], location=[], mass=[])


def test_columns_read_what_numpy_array_reads():
    import numpy as np

    from allocation import _columns

    pairs = [((0.0, -0.0), (1.5, 2)), ((3, 4.25), (-1e300, 5e-324))]
    assert _columns.segments(iter(pairs), 2).tobytes() == np.array(pairs).tobytes()
    pts = [(1, 2.5), (-0.0, 7)]
    assert _columns.points(pts, 2).tobytes() == np.array(pts, dtype=float).tobytes()
    with pytest.raises(ValueError, match="expected 2 rows"):
        _columns.points([(1.0, 2.0, 3.0), (4.0, 5.0, 6.0)], 2)
