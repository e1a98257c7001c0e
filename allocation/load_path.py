"""The load-path graph of the flexible allocation, and each wall's force traced back.

One ``networkx.DiGraph`` per direction. Nodes (attribute ``kind``):

* ``"piece:<piece id>"``: a diaphragm piece (``level``, ``force`` [N]);
* ``"mass:<line id>"``: tributary wall mass that goes straight to a line (``level``,
  ``force``);
* ``"line:<line id>"``: a line of resistance (``level``, ``force``);
* ``"pier:<pier id>"``: a pier (``level``, ``force``);
* ``"transfer:<pier id>"``: the shear of a pier entering the diaphragm below
  (``level`` receiving it, ``force``, ``piece`` it enters or ``""`` when it goes
  straight to a line).

Edges run with the force: piece → line, mass → line, line → pier, pier → transfer,
transfer → line (of the level below). Edge attributes: ``force`` [N], the force that
passes, and ``share`` [-], that force over the force of the edge's source node (0 when
the source carries none). Forces are positive in the +direction.

The nodes and edges are first recorded as plain dicts
(:mod:`allocation._load_path_record`); :class:`LoadPathGraphs` answers the report's
questions from that record, so networkx is imported only when a graph is asked for.
"""

from __future__ import annotations

from collections.abc import Iterator, Mapping, Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING

from allocation._load_path_record import (
    LoadPathRecord,
    compose,
    record_load_path,
    share,
    topological_order,
)
from allocation.errors import AllocationError
from allocation.results import FlexibleResult, Pier, PierId
from ifc_bridge.model import Direction

if TYPE_CHECKING:
    import networkx as nx

__all__ = [
    "Contribution",
    "LoadPathGraphs",
    "build_load_path",
    "explain_all",
    "explain_pier",
    "level_totals",
]


@dataclass(frozen=True, slots=True, kw_only=True)
class Contribution:
    """Where part of a pier's force comes from.

    Attributes:
        level: Level of the source.
        source: Piece id, or ``"mass:<line id>"`` for wall mass on the line.
        share: Fraction of the source's force that reaches the pier [-].
        force: Force it contributes to the pier [N].
    """

    level: str
    source: str
    share: float
    force: float


def build_load_path(
    flexible_results: Sequence[FlexibleResult], piers: Sequence[Pier]
) -> nx.DiGraph:
    """Build the flexible load path of one direction: piece → line → pier → below.

    Common practice (DESIGN.md item 10): the force of each wall is traceable to the
    diaphragm pieces of its own and the upper levels.

    Args:
        flexible_results: Flexible results of one direction (any level order).
        piers: The piers (with ``line`` set) the results name.

    Returns:
        The graph (``graph["direction"]`` is the direction); see the module docstring.

    Raises:
        AllocationError: Results of two directions, or a pier not in ``piers``.
    """
    return _digraph(record_load_path(flexible_results, piers))


def _digraph(record: LoadPathRecord) -> nx.DiGraph:
    """The record as a ``DiGraph``: same nodes, edges, attributes and orders."""
    import networkx as nx

    g = nx.DiGraph(direction=record.direction)
    g.add_nodes_from(record.nodes.items())  # the graph copies each attribute dict
    g.add_edges_from((u, v, data) for (u, v), data in record.edges.items())
    return g


class LoadPathGraphs(Mapping[Direction, "nx.DiGraph"]):
    """:func:`build_load_path` of each direction, built when first asked for.

    Common practice (DESIGN.md item 10), as :func:`build_load_path`. The graphs
    explain the forces (the report's load-path column); nothing in the allocation
    or the checks reads them, so a run that does not ask never builds them.
    :meth:`node_count`, :meth:`level_totals` and :meth:`explain_all` answer from the
    same nodes and edges held as plain dicts, without building a graph.

    Args:
        flexible_results: Flexible results of both directions.
        piers: The piers (with ``line`` set) the results name.
    """

    __slots__ = ("_built", "_flexible", "_piers", "_records")

    def __init__(
        self, flexible_results: Sequence[FlexibleResult], piers: Sequence[Pier]
    ) -> None:
        self._flexible = tuple(flexible_results)
        self._piers = tuple(piers)
        self._built: dict[Direction, nx.DiGraph] = {}
        self._records: dict[Direction, LoadPathRecord] = {}

    def __reduce__(self) -> tuple:
        """Pickle the inputs only; graphs and records are built again when asked."""
        return (type(self), (self._flexible, self._piers))

    def __setstate__(self, state: tuple) -> None:
        """Read a pickle written before ``__reduce__`` (slots state, no records)."""
        _, slots = state
        self.__init__(slots["_flexible"], slots["_piers"])

    def _record(self, direction: Direction) -> tuple[Direction, LoadPathRecord]:
        try:
            d = Direction(direction)
        except ValueError:
            raise KeyError(direction) from None
        record = self._records.get(d)
        if record is None:
            record = self._records[d] = record_load_path(
                [f for f in self._flexible if f.direction is d], self._piers
            )
        return d, record

    def __getitem__(self, direction: Direction) -> nx.DiGraph:
        d, record = self._record(direction)
        graph = self._built.get(d)
        if graph is None:
            graph = self._built[d] = _digraph(record)
        return graph

    def __iter__(self) -> Iterator[Direction]:
        return iter((Direction.X, Direction.Y))

    def __len__(self) -> int:
        return 2

    def __repr__(self) -> str:
        built = ", ".join(d.value for d in self._built) or "none"
        return f"LoadPathGraphs(X, Y; built: {built})"

    def node_count(self, direction: Direction) -> int:
        """``self[direction].number_of_nodes()``, without building the graph.

        Raises:
            KeyError: Not a direction.
        """
        return len(self._record(direction)[1].nodes)

    def level_totals(self, direction: Direction) -> dict[PierId, dict[str, float]]:
        """``level_totals(self[direction])``, equal float for float, without networkx.

        Common practice: as :func:`level_totals`.

        Raises:
            KeyError: Not a direction.
        """
        record = self._record(direction)[1]
        order = topological_order(record)
        if order is None:  # a cycle: networkx says so, as the graph functions do
            return level_totals(self[direction])
        nodes = record.nodes
        comp = compose(nodes, record.pred, order, by_level=True)
        return {
            n.split(":", 1)[1]: comp[n] for n in order if nodes[n]["kind"] == "pier"
        }

    def explain_all(self, direction: Direction) -> dict[PierId, list[Contribution]]:
        """``explain_all(self[direction])``, equal item for item, without networkx.

        Common practice: as :func:`explain_pier`.

        Raises:
            KeyError: Not a direction.
        """
        record = self._record(direction)[1]
        order = topological_order(record)
        if order is None:
            return explain_all(self[direction])
        nodes = record.nodes
        comp = compose(nodes, record.pred, order)
        return {
            n.split(":", 1)[1]: _contributions(nodes, comp[n])
            for n, data in nodes.items()
            if data["kind"] == "pier"
        }


def explain_pier(graph: nx.DiGraph, pier_id: PierId) -> list[Contribution]:
    """Trace a pier's force to the pieces and line masses it came from, all levels.

    Common practice: flows compose along the path; a node passes to each successor
    the edge's ``share`` of what reached it from each source.

    Args:
        graph: A graph from :func:`build_load_path`.
        pier_id: The pier.

    Returns:
        Contributions sorted by level then source; their forces add up to the
        pier's force [N].

    Raises:
        AllocationError: The pier is not in the graph.
    """
    import networkx as nx

    target = f"pier:{pier_id}"
    if target not in graph:
        msg = f"pier {pier_id} is not in the load-path graph"
        raise AllocationError(msg)
    nodes = nx.ancestors(graph, target) | {target}
    order = nx.topological_sort(graph.subgraph(nodes))
    comp = compose(graph.nodes, graph.pred, order)
    return _contributions(graph.nodes, comp[target])


def explain_all(graph: nx.DiGraph) -> dict[PierId, list[Contribution]]:
    """:func:`explain_pier` of every pier of the graph, in one topological pass.

    Common practice: as :func:`explain_pier` (each node's flows depend only on its
    ancestors, so one pass over the whole graph gives every pier the same numbers,
    bit for bit, as tracing it alone).

    Args:
        graph: A graph from :func:`build_load_path`.

    Returns:
        Pier id -> its contributions, as :func:`explain_pier` returns them.
    """
    import networkx as nx

    comp = compose(graph.nodes, graph.pred, nx.topological_sort(graph))
    return {
        n.split(":", 1)[1]: _contributions(graph.nodes, comp[n])
        for n, data in graph.nodes(data=True)
        if data["kind"] == "pier"
    }


def _contributions(
    nodes: Mapping[str, Mapping], flows: dict[str, float]
) -> list[Contribution]:
    out = []
    for src, f in flows.items():
        data = nodes[src]
        name = src.split(":", 1)[1] if data["kind"] == "piece" else src
        out.append(
            Contribution(
                level=data["level"],
                source=name,
                share=share(f, data["force"]),
                force=float(f),
            )
        )
    out.sort(key=lambda c: (c.level, c.source))
    return out


def level_totals(graph: nx.DiGraph) -> dict[PierId, dict[str, float]]:
    """For every pier, how much of its force comes from each level, in one pass.

    Common practice: the same flow composition as :func:`explain_pier`, summed per
    source level, for all piers at once (one topological pass over the graph, so it
    stays fast on tall buildings).

    Args:
        graph: A graph from :func:`build_load_path`.

    Returns:
        Pier id -> level name -> force [N]; each pier's values add up to its force.
    """
    import networkx as nx

    comp = compose(graph.nodes, graph.pred, nx.topological_sort(graph), by_level=True)
    return {
        n.split(":", 1)[1]: comp[n] for n in comp if graph.nodes[n]["kind"] == "pier"
    }
