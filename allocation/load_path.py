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
"""

from __future__ import annotations

from collections.abc import Iterator, Mapping, Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING

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

_TINY = 1e-9  # [-] relative force below which a direct line mass is round-off


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


def _share(force: float, of: float) -> float:
    return float(force / of) if of != 0.0 else 0.0


def _add_level(g: nx.DiGraph, r: FlexibleResult, piers: dict[PierId, Pier]) -> None:
    into = {lid: 0.0 for lid in r.line_forces}
    for piece in r.pieces:
        node = f"piece:{piece.id}"
        g.add_node(
            node,
            kind="piece",
            level=r.level,
            force=piece.force,
            supported=bool(piece.supports),
        )
        for lid, f in piece.shares:
            g.add_edge(node, f"line:{lid}", force=f, share=_share(f, piece.force))
            into[lid] += f
    for pl in r.point_loads:
        node = f"transfer:{pl.source_pier}"
        g.add_node(
            node,
            kind="transfer",
            level=r.level,
            force=pl.force,
            source_pier=pl.source_pier,
        )
        g.add_edge(f"pier:{pl.source_pier}", node, force=pl.force)
        for lid, f in pl.shares:
            g.add_edge(node, f"line:{lid}", force=f, share=_share(f, pl.force))
            into[lid] += f
    for lid, force in r.line_forces.items():
        g.add_node(f"line:{lid}", kind="line", level=r.level, force=force)
        direct = force - into[lid]
        if abs(direct) > _TINY * max(abs(r.applied), 1.0):
            g.add_node(f"mass:{lid}", kind="mass", level=r.level, force=direct)
            g.add_edge(f"mass:{lid}", f"line:{lid}", force=direct, share=1.0)
    for pid, f in r.pier_forces.items():
        p = piers.get(pid)
        if p is None:
            msg = f"pier {pid} of level {r.level!r} is not among the given piers"
            raise AllocationError(msg)
        g.add_node(f"pier:{pid}", kind="pier", level=r.level, force=f, guid=p.guid)
        line_force = r.line_forces[p.line]
        g.add_edge(
            f"line:{p.line}", f"pier:{pid}", force=f, share=_share(f, line_force)
        )


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
    import networkx as nx

    directions = {r.direction for r in flexible_results}
    if len(directions) > 1:
        msg = (
            f"load path: results of {sorted(directions)}; build one graph per direction"
        )
        raise AllocationError(msg)
    g = nx.DiGraph(direction=next(iter(directions), None))
    by_id = {p.id: p for p in piers}
    for r in flexible_results:
        _add_level(g, r, by_id)
    for node, data in g.nodes(data=True):
        if "kind" not in data:
            msg = f"load path: {node} is named by a transfer but has no result"
            raise AllocationError(msg)
    for a, _b, data in g.edges(data=True):
        if "share" not in data:  # pier -> transfer, once the pier's force is known
            data["share"] = _share(data["force"], g.nodes[a]["force"])
    return g


class LoadPathGraphs(Mapping[Direction, "nx.DiGraph"]):
    """:func:`build_load_path` of each direction, built when first asked for.

    Common practice (DESIGN.md item 10), as :func:`build_load_path`. The graphs
    explain the forces (the report's load-path column); nothing in the allocation
    or the checks reads them, so a run that does not ask never builds them.

    Args:
        flexible_results: Flexible results of both directions.
        piers: The piers (with ``line`` set) the results name.
    """

    __slots__ = ("_built", "_flexible", "_piers")

    def __init__(
        self, flexible_results: Sequence[FlexibleResult], piers: Sequence[Pier]
    ) -> None:
        self._flexible = tuple(flexible_results)
        self._piers = tuple(piers)
        self._built: dict[Direction, nx.DiGraph] = {}

    def __getitem__(self, direction: Direction) -> nx.DiGraph:
        try:
            d = Direction(direction)
        except ValueError:
            raise KeyError(direction) from None
        graph = self._built.get(d)
        if graph is None:
            graph = self._built[d] = build_load_path(
                [f for f in self._flexible if f.direction is d], self._piers
            )
        return graph

    def __iter__(self) -> Iterator[Direction]:
        return iter((Direction.X, Direction.Y))

    def __len__(self) -> int:
        return 2

    def __repr__(self) -> str:
        built = ", ".join(d.value for d in self._built) or "none"
        return f"LoadPathGraphs(X, Y; built: {built})"


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
    comp = _compose(graph, nx.topological_sort(graph.subgraph(nodes)))
    return _contributions(graph, comp[target])


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

    comp = _compose(graph, nx.topological_sort(graph))
    return {
        n.split(":", 1)[1]: _contributions(graph, comp[n])
        for n, data in graph.nodes(data=True)
        if data["kind"] == "pier"
    }


def _compose(
    graph: nx.DiGraph, order, by_level: bool = False
) -> dict[str, dict[str, float]]:
    """Node -> source -> force reaching it, over nodes in topological order.

    A source is the piece or mass node, or with ``by_level`` its level's name.
    """
    comp: dict[str, dict[str, float]] = {}
    for n in order:
        data = graph.nodes[n]
        if data["kind"] in ("piece", "mass"):
            comp[n] = {(data["level"] if by_level else n): float(data["force"])}
            continue
        acc: dict[str, float] = {}
        for p in graph.predecessors(n):
            s = graph.edges[p, n]["share"]
            for src, f in comp[p].items():
                acc[src] = acc.get(src, 0.0) + s * f
        comp[n] = acc
    return comp


def _contributions(graph: nx.DiGraph, flows: dict[str, float]) -> list[Contribution]:
    out = []
    for src, f in flows.items():
        data = graph.nodes[src]
        name = src.split(":", 1)[1] if data["kind"] == "piece" else src
        out.append(
            Contribution(
                level=data["level"],
                source=name,
                share=_share(f, data["force"]),
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

    comp = _compose(graph, nx.topological_sort(graph), by_level=True)
    return {
        n.split(":", 1)[1]: comp[n] for n in comp if graph.nodes[n]["kind"] == "pier"
    }
