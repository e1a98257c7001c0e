"""The load-path record mirrors ``networkx.DiGraph``; its flows match the graph's.

Invariants only (no expected numbers): any sequence of ``add_node`` / ``add_edge``
calls leaves the record and a ``DiGraph`` given the same calls with the same nodes,
edges, attributes and orders; Kahn's order (A. B. Kahn, CACM 5(11), 1962) puts every
node after its predecessors and exists exactly when networkx finds no cycle; the flow
composition gives the same floats, bit for bit, in any topological order. Invented
node names and values.
"""

from __future__ import annotations

import networkx as nx
from hypothesis import given, settings
from hypothesis import strategies as st

from allocation._load_path_record import LoadPathRecord, compose, topological_order
from allocation.load_path import _digraph

FAST = settings(max_examples=80, derandomize=True, deadline=None)

_NAMES = st.sampled_from([f"n{i}" for i in range(7)])
_ATTRS = st.dictionaries(
    st.sampled_from(["kind", "force", "share", "level"]),
    st.integers(-3, 3),
    max_size=3,
)
_CALLS = st.lists(
    st.one_of(
        st.tuples(st.just("node"), _NAMES, _NAMES, _ATTRS),
        st.tuples(st.just("edge"), _NAMES, _NAMES, _ATTRS),
    ),
    max_size=30,
)


def _record() -> LoadPathRecord:
    return LoadPathRecord(direction=None, nodes={}, pred={}, edges={})


def _replay(calls, target) -> None:
    for call, u, v, attrs in calls:
        if call == "node":
            target.add_node(u, **attrs)
        else:
            target.add_edge(u, v, **attrs)


@FAST
@given(calls=_CALLS)
def test_record_is_the_digraph_the_same_calls_build(calls):
    record, graph = _record(), nx.DiGraph(direction=None)
    _replay(calls, record)
    _replay(calls, graph)
    rebuilt = _digraph(record)
    assert list(rebuilt.nodes(data=True)) == list(graph.nodes(data=True))
    assert list(rebuilt.edges(data=True)) == list(graph.edges(data=True))
    for n in graph:
        assert list(rebuilt.pred[n]) == list(graph.pred[n])  # summation order
        assert list(rebuilt.succ[n]) == list(graph.succ[n])
        assert list(record.pred[n]) == list(graph.pred[n])
    assert rebuilt.graph == graph.graph


@FAST
@given(edges=st.lists(st.tuples(_NAMES, _NAMES), max_size=25))
def test_kahn_order_exists_exactly_for_acyclic_graphs(edges):
    record, graph = _record(), nx.DiGraph()
    for u, v in edges:
        record.add_edge(u, v, share=1.0)
        graph.add_edge(u, v)
    order = topological_order(record)
    if not nx.is_directed_acyclic_graph(graph):
        assert order is None
        return
    assert order is not None
    assert sorted(order) == sorted(graph)
    at = {n: i for i, n in enumerate(order)}
    assert all(at[u] < at[v] for u, v in edges)


_FORCE = st.floats(-1e6, 1e6, allow_nan=False)


@FAST
@given(
    # an edge i -> j only with i < j: acyclic by construction
    edges=st.lists(
        st.tuples(st.integers(0, 7), st.integers(0, 7), _FORCE).filter(
            lambda e: e[0] < e[1]
        ),
        max_size=30,
    ),
    forces=st.lists(_FORCE, min_size=8, max_size=8),
    by_level=st.booleans(),
)
def test_flows_are_the_same_floats_in_any_topological_order(edges, forces, by_level):
    record = _record()
    for i in range(8):  # nodes without predecessors are sources
        kind = "piece" if i < 3 else ("mass" if i == 3 else "line")
        record.add_node(f"n{i}", kind=kind, level=f"L{i % 3}", force=forces[i])
    for i, j, share in edges:
        if j > 3:  # sources keep no predecessors
            record.add_edge(f"n{i}", f"n{j}", share=share / 1e6)
    kahn = topological_order(record)
    assert kahn is not None
    graph = _digraph(record)
    other = list(nx.lexicographical_topological_sort(graph, key=lambda n: -int(n[1:])))
    a = compose(record.nodes, record.pred, kahn, by_level=by_level)
    b = compose(graph.nodes, graph.pred, other, by_level=by_level)
    assert a.keys() == b.keys()
    for n in a:
        assert repr(sorted(a[n].items())) == repr(sorted(b[n].items()))  # bit for bit
