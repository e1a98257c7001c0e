"""The load-path graph as plain dicts, and the flow composition over it (private).

:func:`record_load_path` builds, without networkx, exactly the nodes and edges (names,
attributes, insertion orders) that :func:`allocation.load_path.build_load_path` puts
in its ``networkx.DiGraph``: that function replays the record into one. The report
only needs the flows, so it composes them here and never imports networkx (its
import alone costs about 0.25 s). See :mod:`allocation.load_path` for the node kinds.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass

from allocation.errors import AllocationError
from allocation.results import FlexibleResult, Pier, PierId
from ifc_bridge.model import Direction

__all__ = [
    "LoadPathRecord",
    "compose",
    "record_load_path",
    "share",
    "topological_order",
]

_TINY = 1e-9  # [-] relative force below which a direct line mass is round-off


def share(force: float, of: float) -> float:
    """``force / of`` as a Python float, 0 when ``of`` is 0 [-]."""
    return float(force / of) if of != 0.0 else 0.0


@dataclass(frozen=True, slots=True, kw_only=True)
class LoadPathRecord:
    """The load-path graph of one direction as plain dicts (read-only once built).

    Attributes:
        direction: Direction of the results, or None when there are none.
        nodes: Node -> attributes, in the order the nodes first appear.
        pred: Node -> predecessor -> attributes of the edge (the same dict as in
            ``edges``), predecessors in the order their edges first appear.
        edges: ``(source, target)`` -> edge attributes (``force`` [N], ``share`` [-]),
            in the order the edges first appear.
    """

    direction: Direction | None
    nodes: dict[str, dict]
    pred: dict[str, dict[str, dict]]
    edges: dict[tuple[str, str], dict]

    def add_node(self, node: str, **attr: object) -> None:
        """Add a node, or update its attributes (as ``DiGraph.add_node``)."""
        data = self.nodes.get(node)
        if data is None:
            self.nodes[node] = attr
            self.pred[node] = {}
        else:
            data.update(attr)

    def add_edge(self, u: str, v: str, **attr: object) -> None:
        """Add an edge, or update its attributes (as ``DiGraph.add_edge``)."""
        for node in (u, v):
            if node not in self.nodes:
                self.nodes[node] = {}
                self.pred[node] = {}
        data = self.edges.get((u, v))
        if data is None:
            self.edges[u, v] = self.pred[v][u] = attr
        else:
            data.update(attr)


def _add_level(g: LoadPathRecord, r: FlexibleResult, piers: dict[PierId, Pier]) -> None:
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
            g.add_edge(node, f"line:{lid}", force=f, share=share(f, piece.force))
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
            g.add_edge(node, f"line:{lid}", force=f, share=share(f, pl.force))
            into[lid] += f
    stacked = r.stacked
    for pid, lid, f in zip(
        stacked.source_piers, stacked.lines, stacked.forces, strict=True
    ):
        node = f"transfer:{pid}"  # straight to the line it stands on
        g.add_node(node, kind="transfer", level=r.level, force=f, source_pier=pid)
        g.add_edge(f"pier:{pid}", node, force=f)
        g.add_edge(node, f"line:{lid}", force=f, share=share(f, f))
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
        g.add_edge(f"line:{p.line}", f"pier:{pid}", force=f, share=share(f, line_force))


def record_load_path(
    flexible_results: Sequence[FlexibleResult], piers: Sequence[Pier]
) -> LoadPathRecord:
    """The flexible load path of one direction: piece → line → pier → below.

    Common practice (DESIGN.md item 10), as :func:`allocation.load_path.build_load_path`.

    Args:
        flexible_results: Flexible results of one direction (any level order).
        piers: The piers (with ``line`` set) the results name.

    Returns:
        The record.

    Raises:
        AllocationError: Results of two directions, or a pier not in ``piers``.
    """
    directions = {r.direction for r in flexible_results}
    if len(directions) > 1:
        msg = (
            f"load path: results of {sorted(directions)}; build one graph per direction"
        )
        raise AllocationError(msg)
    g = LoadPathRecord(
        direction=next(iter(directions), None), nodes={}, pred={}, edges={}
    )
    by_id = {p.id: p for p in piers}
    for r in flexible_results:
        _add_level(g, r, by_id)
    for node, data in g.nodes.items():
        if "kind" not in data:
            msg = f"load path: {node} is named by a transfer but has no result"
            raise AllocationError(msg)
    for (a, _b), data in g.edges.items():
        if "share" not in data:  # pier -> transfer, once the pier's force is known
            data["share"] = share(data["force"], g.nodes[a]["force"])
    return g


def topological_order(g: LoadPathRecord) -> list[str] | None:
    """The nodes, each after all its predecessors (Kahn's algorithm); None on a cycle.

    Common practice: A. B. Kahn, "Topological sorting of large networks",
    Communications of the ACM 5(11), 1962.
    """
    waiting = {n: len(p) for n, p in g.pred.items()}
    succ: dict[str, list[str]] = {}
    for u, v in g.edges:
        succ.setdefault(u, []).append(v)
    order = [n for n, k in waiting.items() if k == 0]
    for n in order:  # the list grows as nodes become free
        for v in succ.get(n, ()):
            waiting[v] -= 1
            if waiting[v] == 0:
                order.append(v)
    return order if len(order) == len(waiting) else None


def compose(
    nodes: Mapping[str, Mapping],
    pred: Mapping[str, Mapping[str, Mapping]],
    order: Iterable[str],
    *,
    by_level: bool = False,
) -> dict[str, dict[str, float]]:
    """Node -> source -> force reaching it [N], over nodes in topological order.

    Common practice: flows compose along the path; a node passes to each successor
    the edge's ``share`` of what reached it from each source. A source is the piece
    or mass node, or with ``by_level`` its level's name. The sums run over the
    predecessors in their order, so any topological order gives the same floats.

    Args:
        nodes: Node -> attributes (``kind``, ``level``, ``force``): a record's
            ``nodes`` or a ``DiGraph``'s ``nodes``.
        pred: Node -> predecessor -> edge attributes (``share``): a record's
            ``pred`` or a ``DiGraph``'s ``pred``.
        order: Every node to compose, after all its predecessors.
        by_level: Key the sources by their level.

    Returns:
        The flows of each node of ``order``.
    """
    comp: dict[str, dict[str, float]] = {}
    for n in order:
        data = nodes[n]
        if data["kind"] in ("piece", "mass"):
            comp[n] = {(data["level"] if by_level else n): float(data["force"])}
            continue
        edges = iter(pred[n].items())
        first = next(edges, None)
        if first is None:
            comp[n] = {}
            continue
        s = first[1]["share"]
        # 0.0 + s * f: the sum from zero, as the loop below does (-0.0 becomes 0.0)
        acc = {src: 0.0 + s * f for src, f in comp[first[0]].items()}
        for p, edge in edges:
            s = edge["share"]
            for src, f in comp[p].items():
                acc[src] = acc.get(src, 0.0) + s * f
        comp[n] = acc
    return comp
