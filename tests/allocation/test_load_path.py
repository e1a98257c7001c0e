"""Load-path graph: piece -> line -> pier -> piece below, and each wall's force traced.

Two levels of the same 10 x 10 m plan (invented). Roof L2: X lines at y = 0, 4, 10;
level L1: X lines at y = 0 (two 4 m piers) and 10. The roof wall at y = 4 stands on no
line below, so its shear enters the L1 diaphragm at (5, 4) as a point load; the roof
walls at y = 0 and 10 stand on the L1 lines and deliver straight to them.
Hand values (lever rule, common practice): roof Fx = 1000 N -> pieces 400 and 600 N
-> lines 200 / 500 / 300 N; the 500 N point load -> 300 N to y = 0 and 200 N to y = 10;
L1 Fx = 2000 N -> 1000 / 1000 N; line y = 0 of L1: 1000 + 200 + 300 = 1500 N, 750 N per
pier.
"""

from __future__ import annotations

import math

import networkx as nx
import pytest
from shapely.geometry import box

from allocation._transfers import split_transfers
from allocation.errors import AllocationError
from allocation.flexible import allocate_flexible
from allocation.load_path import build_load_path, explain_pier
from ifc_bridge.model import Direction
from tests.allocation._plans import diaphragm, lines_of, slab_load, wall_mass, x_wall

X = Direction.X


def _two_levels():
    roof = diaphragm(box(0, 0, 10, 10), level="L2")
    floor = diaphragm(box(0, 0, 10, 10), level="L1")
    up = {"level": "L2", "storey": "L1"}
    roof_lines, roof_piers = lines_of(
        [
            x_wall("R0", 0.0, 0.0, 10.0, **up),
            x_wall("RU", 4.0, 4.0, 6.0, **up),
            x_wall("R10", 10.0, 0.0, 10.0, **up),
        ],
        [roof],
        level="L2",
        level_index=2,
    )
    low_lines, low_piers = lines_of(
        [
            x_wall("G0a", 0.0, 0.0, 4.0),
            x_wall("G0b", 0.0, 6.0, 10.0),
            x_wall("G10", 10.0, 0.0, 10.0),
        ],
        [floor],
    )
    top = allocate_flexible(
        slab_load([roof], Fx=1000.0, level="L2"),
        [roof],
        roof_lines,
        roof_piers,
        direction=X,
    )
    moving, _, stacked = split_transfers(
        roof_piers,
        top.pier_forces,
        low_lines,
        level_below="L1",
        direction=X,
        tolerance=0.5,
    )
    extra = [wall_mass("G10", 500.0, (5.0, 10.0))]
    low = allocate_flexible(
        slab_load([floor], Fx=2000.0, extra=extra),
        [floor],
        low_lines,
        low_piers,
        direction=X,
        point_loads=moving,
        stacked=stacked,
    )
    return [top, low], roof_piers + low_piers


def test_two_level_forces_by_hand():
    (top, low), _ = _two_levels()
    assert top.line_forces == {
        "L2-X-1": pytest.approx(200.0),
        "L2-X-2": pytest.approx(500.0),
        "L2-X-3": pytest.approx(300.0),
    }  # lever rule by hand
    # W = 100 kN slab + 0.5 kN wall on line y = 10: Fx/W·slab = 1990.05 N halves.
    slab = 2000.0 * 100_000.0 / 100_500.0
    assert low.line_forces["L1-X-1"] == pytest.approx(slab / 2 + 200.0 + 300.0)
    assert low.line_forces["L1-X-2"] == pytest.approx(
        slab / 2 + 2000.0 - slab + 300.0 + 200.0
    )
    assert low.pier_forces["G0a|L1|0|0"] == pytest.approx(low.line_forces["L1-X-1"] / 2)


def test_stacked_walls_go_straight_to_their_lines():
    (top, low), _ = _two_levels()
    # the roof walls at y = 0 and 10 stand on the L1 lines: their whole shear (200 N,
    # 300 N by the lever rule, by hand) goes to those lines, not into the diaphragm
    assert low.stacked.source_piers == ("R0|L2|0|0", "R10|L2|0|0")
    assert low.stacked.lines == ("L1-X-1", "L1-X-2")
    assert low.stacked.forces == (
        top.pier_forces["R0|L2|0|0"],
        top.pier_forces["R10|L2|0|0"],
    )
    assert low.stacked.locations == ((5.0, 0.0), (5.0, 10.0))  # pier mid-points
    assert [pl.source_pier for pl in low.point_loads] == ["RU|L2|0|0"]  # moves
    # statics: everything from above is applied to the level
    assert low.applied == pytest.approx(2000.0 + 1000.0)
    assert math.fsum(low.line_forces.values()) == pytest.approx(low.applied)


def test_explain_pier_traces_force_to_pieces_of_both_levels():
    results, piers = _two_levels()
    g = build_load_path(results, piers)
    parts = explain_pier(g, "G0a|L1|0|0")
    slab = 2000.0 * 100_000.0 / 100_500.0
    # Hand: half of L1's piece share to y = 0; roof piece y 0-4 (400 N): 200 N stacked
    # + 200 N via the point load x 0.6, halved = 160 N; roof piece y 4-10 (600 N):
    # 300 N via the point load x 0.6, halved = 90 N.
    assert [(c.level, c.source) for c in parts] == [
        ("L1", "L1/D1/X1"),
        ("L2", "L2/D1/X1"),
        ("L2", "L2/D1/X2"),
    ]
    assert [c.force for c in parts] == [
        pytest.approx(slab / 4),
        pytest.approx(160.0),
        pytest.approx(90.0),
    ]
    assert [c.share for c in parts] == [
        pytest.approx(0.25),
        pytest.approx(0.4),
        pytest.approx(0.15),
    ]
    pier_force = results[1].pier_forces["G0a|L1|0|0"]
    assert math.fsum(c.force for c in parts) == pytest.approx(pier_force, rel=1e-12)


def test_every_pier_is_fully_explained_and_mass_node_feeds_its_line():
    results, piers = _two_levels()
    g = build_load_path(results, piers)
    for r in results:
        for pid, force in r.pier_forces.items():
            total = math.fsum(c.force for c in explain_pier(g, pid))
            assert total == pytest.approx(force, rel=1e-12, abs=1e-9)  # conservation
    assert g.edges["mass:L1-X-2", "line:L1-X-2"]["force"] == pytest.approx(
        2000.0 * 500.0 / 100_500.0
    )
    assert any(c.source == "mass:L1-X-2" for c in explain_pier(g, "G10|L1|0|0"))


def test_graph_shares_conserve_force_at_every_node():
    results, piers = _two_levels()
    g = build_load_path(results, piers)
    assert nx.is_directed_acyclic_graph(g)
    for n, data in g.nodes(data=True):
        out = list(g.out_edges(n, data=True))
        if out and data["force"]:
            assert math.fsum(e["share"] for _, _, e in out) == pytest.approx(1.0)
        inflow = [e["force"] for _, _, e in g.in_edges(n, data=True)]
        if inflow:
            assert math.fsum(inflow) == pytest.approx(data["force"], abs=1e-9)
    assert g.nodes["transfer:RU|L2|0|0"]["level"] == "L1"
    assert g.edges["pier:RU|L2|0|0", "transfer:RU|L2|0|0"]["share"] == pytest.approx(
        1.0
    )


def test_one_graph_per_direction():
    results, piers = _two_levels()
    other = allocate_flexible(
        slab_load([diaphragm(box(0, 0, 10, 10))], Fx=0.0),
        [diaphragm(box(0, 0, 10, 10))],
        [],
        [],
        direction=Direction.Y,
    )
    with pytest.raises(AllocationError, match="one graph per direction"):
        build_load_path([*results, other], piers)
    with pytest.raises(AllocationError, match="not in the load-path graph"):
        explain_pier(build_load_path(results, piers), "nobody|L1|0|0")


def test_level_totals_agree_with_explain_pier_on_the_demo():  # same flow, summed by level
    from allocation.allocate import allocate
    from allocation.load_path import explain_pier, level_totals
    from checks.config import load_config
    from checks.pipeline import load_model
    from tests.conftest import SAMPLE_MODELS

    cfg = load_config(SAMPLE_MODELS / "demo.toml")
    model = load_model(SAMPLE_MODELS / "demo_building.ifc", cfg)
    alloc = allocate(model, cfg.seismic, cfg.loads, cfg.analysis)
    for graph in alloc.graphs.values():
        totals = level_totals(graph)
        for pid, by_level in totals.items():
            expected: dict[str, float] = {}
            for c in explain_pier(graph, pid):
                expected[c.level] = expected.get(c.level, 0.0) + c.force
            assert by_level.keys() == expected.keys()
            for lv, f in expected.items():
                assert by_level[lv] == pytest.approx(f, rel=1e-9, abs=1e-9)


def test_explain_all_equals_explaining_each_pier_alone() -> None:
    # common practice: a node's flows depend only on its ancestors, so one pass over
    # the whole graph must give each pier exactly (bit for bit) its own trace
    from pathlib import Path

    from allocation.load_path import explain_all, level_totals
    from checks.pipeline import check_model

    demo = Path(__file__).resolve().parents[2] / "sample_models"
    run = check_model(demo / "demo_building.ifc", demo / "demo.toml")
    graphs = run.allocation.graphs
    for direction, graph in graphs.items():
        every = explain_all(graph)
        piers = [n.split(":", 1)[1] for n in graph if n.startswith("pier:")]
        assert sorted(every) == sorted(piers), direction
        for pier in piers:
            assert every[pier] == explain_pier(graph, pier)
        # the mapping's own answers (plain dicts, no graph) are the same, bit for bit
        assert graphs.explain_all(direction) == every
        totals, mine = level_totals(graph), graphs.level_totals(direction)
        assert totals.keys() == mine.keys()
        for pier, by_level in totals.items():
            assert repr(sorted(mine[pier].items())) == repr(sorted(by_level.items()))
