"""Flexible diaphragm: tributary pieces between lines, lever rule, point loads.

Reference values are hand calculations of simple beams (the lever rule, common
practice) and, for L- and T-shaped plans, an independent strip integration written in
this file: the plan is cut into 1 cm strips across the span; the mass of each strip is
integrated and given to the lines at the two ends of the span it sits in by the lever
rule. It agrees with the piece method to 1e-3 relative (both are exact for these
rectangular plans; the tolerance covers nothing but round-off).
"""

from __future__ import annotations

import itertools

import pytest
from shapely.geometry import Polygon, box

from allocation._pieces import Support
from allocation.errors import AllocationError
from allocation.flexible import allocate_flexible, lever_rule, transfer_point_loads
from allocation.results import ConditionKind, MassItem, StackedShear
from ifc_bridge.model import Direction
from tests.allocation._plans import (
    by_offset,
    diaphragm,
    lines_of,
    run_flexible,
    slab_load,
    wall_mass,
    x_wall,
    y_wall,
)

X, Y = Direction.X, Direction.Y


def _strip_reference(rects, masses, supports, *, direction, per_m=100):
    """Independent reference: force fraction per support offset, by strips.

    rects: the plan as disjoint (x0, y0, x1, y1) rectangles; masses: (rect, weight per
    area) items; supports: {offset: (a, b)} = a line at that perpendicular offset
    supporting the plan for along-coordinates a..b.
    """

    def uv(r):
        x0, y0, x1, y1 = r
        return (x0, x1, y0, y1) if direction is X else (y0, y1, x0, x1)

    shape, loads = [uv(r) for r in rects], [(uv(r), q) for r, q in masses]
    u_lo, u_hi = min(r[0] for r in shape), max(r[1] for r in shape)
    n = round((u_hi - u_lo) * per_m)
    du = (u_hi - u_lo) / n
    out, lost, total = dict.fromkeys(supports, 0.0), 0.0, 0.0
    for i in range(n):
        u = u_lo + (i + 0.5) * du
        spans = sorted((r[2], r[3]) for r in shape if r[0] < u < r[1])
        merged = []
        for a, b in spans:
            if merged and a <= merged[-1][1] + 1e-12:
                merged[-1][1] = max(merged[-1][1], b)
            else:
                merged.append([a, b])
        for a, b in merged:
            cuts = sorted(
                v
                for v, (s0, s1) in supports.items()
                if s0 <= u <= s1 and a - 1e-9 <= v <= b + 1e-9
            )
            ends = sorted({a, b, *cuts})
            for s0, s1 in itertools.pairwise(ends):
                m = mv = 0.0
                for (u0, u1, v0, v1), q in loads:
                    lo, hi = max(s0, v0), min(s1, v1)
                    if u0 < u < u1 and hi > lo:
                        m += q * (hi - lo) * du
                        mv += q * (hi - lo) * du * (lo + hi) / 2.0
                total += m
                lo_line = next((v for v in cuts if abs(v - s0) < 1e-9), None)
                hi_line = next((v for v in cuts if abs(v - s1) < 1e-9), None)
                if lo_line is not None and hi_line is not None:
                    up = m * (mv / m - s0) / (s1 - s0) if m else 0.0
                    out[lo_line] += m - up
                    out[hi_line] += up
                elif lo_line is not None or hi_line is not None:
                    out[lo_line if lo_line is not None else hi_line] += m
                else:
                    lost += m
    return {v: f / total for v, f in out.items()}, lost / total


def _forces_by_offset(lines, result):
    return {
        ln.offset: result.line_forces[ln.id]
        for ln in lines
        if ln.direction is result.direction
    }


BOX = [
    x_wall("S", 0.0, 0.0, 20.0),
    x_wall("N", 10.0, 0.0, 20.0),
    y_wall("W", 0.0, 0.0, 10.0),
    y_wall("E", 20.0, 0.0, 10.0),
]


def test_uniform_rectangle_between_two_lines_gives_half_to_each():
    lines, _, r = run_flexible(BOX, [diaphragm(box(0, 0, 20, 10))], Fx=1000.0)
    assert by_offset([ln for ln in lines if ln.direction is X], r.line_forces) == [
        pytest.approx(500.0),
        pytest.approx(500.0),
    ]  # common practice: half and half
    (piece,) = r.pieces
    assert (piece.id, piece.supports) == ("L1/D1/X1", ("L1-X-1", "L1-X-2"))
    assert piece.centroid == pytest.approx((10.0, 5.0))
    assert r.pier_forces == {
        "S|L1|0|0": pytest.approx(500.0),
        "N|L1|0|0": pytest.approx(500.0),
    }
    assert r.conditions == ()
    assert r.applied == 1000.0


def test_three_unequally_spaced_lines_take_their_tributary_widths():
    walls = [*BOX, x_wall("M", 4.0, 0.0, 20.0)]
    lines, _, r = run_flexible(walls, [diaphragm(box(0, 0, 20, 10))], Fx=1000.0)
    # Hand: spans 4 m and 6 m; tributary widths 2, 2 + 3, 3 m of 10 m.
    assert by_offset([ln for ln in lines if ln.direction is X], r.line_forces) == [
        pytest.approx(200.0),
        pytest.approx(500.0),
        pytest.approx(300.0),
    ]


def test_symmetric_hole_keeps_half_and_half():
    holed = Polygon(
        box(0, 0, 20, 10).exterior.coords, [box(8, 4, 12, 6).exterior.coords]
    )
    lines, _, r = run_flexible(BOX, [diaphragm(holed)], Fx=1000.0)
    assert by_offset([ln for ln in lines if ln.direction is X], r.line_forces) == [
        pytest.approx(500.0),
        pytest.approx(500.0),
    ]  # mirror symmetry about y = 5


def test_stair_opening_on_a_line_is_spanned_around_not_cantilevered():
    # L plan with a 2.6 x 5.2 m stair void whose edge lies on the Y line at x = 12.
    plan = Polygon(
        [(0, 0), (24, 0), (24, 22), (12, 22), (12, 12), (0, 12)],
        [[(9.4, 6.4), (12, 6.4), (12, 11.6), (9.4, 11.6)]],
    )
    walls = [
        y_wall("A", 0.0, 0.0, 12.0),
        y_wall("B", 12.0, 6.4, 22.0),
        y_wall("C", 24.0, 0.0, 22.0),
    ]
    lines, _, r = run_flexible(walls, [diaphragm(plan)], direction=Y, Fx=1000.0)
    assert r.conditions == ()
    # Hand, composite areas: west part 144 - 13.52 m², x̄ = (144·6 - 13.52·10.7)/130.48;
    # east part 12 x 22 m halves; Fx shared by area 130.48 / 394.48 and 264 / 394.48.
    a_w, a_e = 144.0 - 2.6 * 5.2, 12.0 * 22.0
    xbar = (144.0 * 6.0 - 2.6 * 5.2 * 10.7) / a_w
    f_w, f_e = 1000.0 * a_w / (a_w + a_e), 1000.0 * a_e / (a_w + a_e)
    assert by_offset(lines, r.line_forces) == [
        pytest.approx(f_w * (1 - xbar / 12.0)),
        pytest.approx(f_w * xbar / 12.0 + f_e / 2),
        pytest.approx(f_e / 2),
    ]  # lever rule


@pytest.mark.parametrize("dx", [-2e-15, 0.0, 2e-15])
def test_round_off_in_line_offset_does_not_move_it_off_a_slab_edge(dx):
    plan = Polygon([(0, 0), (24, 0), (24, 22), (12, 22), (12, 12), (0, 12)])
    walls = [
        y_wall("A", 0.0, 0.0, 12.0),
        y_wall("B", 12.0 + dx, 12.0, 22.0),
        y_wall("C", 24.0, 0.0, 22.0),
    ]
    lines, _, r = run_flexible(walls, [diaphragm(plan)], direction=Y, Fx=1000.0)
    assert lines[1].crossings == (("L1/D1", pytest.approx(22.0)),)
    # Hand: west 144 m² halves, east 264 m² halves, of 408 m².
    assert by_offset(lines, r.line_forces) == [
        pytest.approx(500.0 * 144 / 408),
        pytest.approx(500.0),
        pytest.approx(500.0 * 264 / 408),
    ]


def test_line_stopping_at_an_opening_supports_only_its_side():
    holed = Polygon(
        box(0, 0, 10, 10).exterior.coords, [box(4, 4, 6, 6).exterior.coords]
    )
    walls = [
        x_wall("S", 0.0, 0.0, 10.0),
        x_wall("M", 5.0, 0.0, 3.0),
        x_wall("N", 10.0, 0.0, 10.0),
    ]
    lines, _, r = run_flexible(walls, [diaphragm(holed)], Fx=960.0)
    # Hand, 96 m²: west strips 4 x 5 m halve (10 + 10, 10 + 10); the east part (56 m²,
    # centroid y = 5) spans y = 0 to 10: 28 / 28. Forces x 10 N/m².
    assert by_offset(lines, r.line_forces) == [
        pytest.approx(380.0),
        pytest.approx(200.0),
        pytest.approx(380.0),
    ]


ELL = Polygon([(0, 0), (10, 0), (10, 5), (5, 5), (5, 10), (0, 10)])
ELL_RECTS = [(0, 0, 10, 5), (0, 5, 5, 10)]


@pytest.mark.parametrize(
    ("walls", "direction", "supports", "cantilevers"),
    [
        (
            [x_wall("A", 0, 0, 10), x_wall("B", 10, 0, 5)],
            X,
            {0.0: (0, 10), 10.0: (0, 5)},
            1,
        ),
        (
            [x_wall("A", 0, 0, 10), x_wall("B", 10, 0, 5), x_wall("C", 5, 5, 10)],
            X,
            {0.0: (0, 10), 5.0: (0, 10), 10.0: (0, 5)},
            0,
        ),
        (
            [y_wall("A", 0, 0, 10), y_wall("B", 10, 0, 5)],
            Y,
            {0.0: (0, 10), 10.0: (0, 5)},
            1,
        ),
        (
            [y_wall("A", 0, 0, 10), y_wall("B", 10, 0, 5), y_wall("C", 5, 6, 9)],
            Y,
            {0.0: (0, 10), 5.0: (0, 10), 10.0: (0, 5)},
            0,
        ),
    ],
)
def test_l_shape_matches_strip_integration(walls, direction, supports, cantilevers):
    extra = MassItem(
        source="extra",
        ref="partitions",
        weight=500.0 * 12.0,
        location=(8.0, 1.5),
        polygon=box(6, 0, 10, 3),
    )
    lines, _, r = run_flexible(
        walls, [diaphragm(ELL)], direction=direction, extra=[extra]
    )
    ref, lost = _strip_reference(
        ELL_RECTS,
        [(rc, 1000.0) for rc in ELL_RECTS] + [((6, 0, 10, 3), 500.0)],
        supports,
        direction=direction,
    )
    got = _forces_by_offset(lines, r)
    assert lost == 0.0
    for v, share in ref.items():
        assert got[v] == pytest.approx(share * 1000.0, rel=1e-3)  # strip integration
    kinds = [c.kind for c in r.conditions]
    assert kinds.count(ConditionKind.CANTILEVER_PIECE) == cantilevers


T_SHAPE = Polygon([(0, 6), (4, 6), (4, 0), (8, 0), (8, 6), (12, 6), (12, 10), (0, 10)])
T_RECTS = [(0, 6, 12, 10), (4, 0, 8, 6)]


@pytest.mark.parametrize(
    ("walls", "direction", "supports", "by_hand"),
    [
        # Hand: stem column 4 x 10 m halves (20 / 20); wings 2 x 4 x 4 m to y = 10.
        (
            [x_wall("A", 0, 4, 8), x_wall("B", 10, 0, 12)],
            X,
            {0.0: (4, 8), 10.0: (0, 12)},
            {0.0: 20 / 72, 10.0: 52 / 72},
        ),
        # Hand: bar halves each side of x = 6 (12 + 12), stem all to x = 6 (24); of 72.
        (
            [y_wall("A", 0, 6, 10), y_wall("B", 12, 6, 10), y_wall("C", 6, 0, 6)],
            Y,
            {0.0: (6, 10), 6.0: (0, 10), 12.0: (6, 10)},
            {0.0: 12 / 72, 6.0: 48 / 72, 12.0: 12 / 72},
        ),
    ],
)
def test_t_shape_matches_strip_integration_and_hand(
    walls, direction, supports, by_hand
):
    lines, _, r = run_flexible(
        walls, [diaphragm(T_SHAPE)], direction=direction, Fx=7200.0
    )
    ref, _ = _strip_reference(
        T_RECTS, [(rc, 1.0) for rc in T_RECTS], supports, direction=direction
    )
    got = _forces_by_offset(lines, r)
    for v, share in ref.items():
        assert got[v] == pytest.approx(share * 7200.0, rel=1e-3)  # strip integration
        assert got[v] == pytest.approx(by_hand[v] * 7200.0, rel=1e-9)  # hand


def test_piece_touching_one_line_cantilevers_to_it():
    walls = [x_wall("S", 0.0, 0.0, 10.0), y_wall("W", 0.0, 0.0, 10.0)]
    _lines, _, r = run_flexible(walls, [diaphragm(box(0, 0, 10, 10))], Fx=800.0)
    assert r.line_forces == {"L1-X-1": pytest.approx(800.0)}  # common practice: all
    (c,) = r.conditions
    assert (c.kind, c.ref, c.value) == (
        ConditionKind.CANTILEVER_PIECE,
        "L1/D1/X1",
        pytest.approx(800.0),
    )
    assert c.guids == ("S", "S-L1-1")


def test_piece_touching_no_line_is_unsupported_and_not_allocated():
    west, east = diaphragm(box(0, 0, 10, 10), n=1), diaphragm(box(20, 0, 30, 10), n=2)
    walls = [x_wall("S", 0.0, 0.0, 10.0), x_wall("N", 10.0, 0.0, 10.0)]
    _, _, r = run_flexible(walls, [west, east], Fx=1000.0)
    assert sum(r.line_forces.values()) == pytest.approx(500.0)  # equal areas: half lost
    (c,) = [c for c in r.conditions if c.kind is ConditionKind.UNSUPPORTED_PIECE]
    assert (c.ref, c.value, c.guids) == ("L1/D2/X1", pytest.approx(500.0), ("S-L1-2",))


def test_wall_masses_on_line_go_to_it_and_inside_by_lever_rule():
    walls = [
        x_wall("S", -0.1, 0.0, 10.0),
        x_wall("N", 10.0, 0.0, 10.0),
        y_wall("W", 0.0, 0.0, 10.0),
        y_wall("P", 5.0, 1.0, 3.0),
    ]
    extra = [
        wall_mass("S", 20_000.0, (5.0, -0.1)),
        wall_mass("P", 10_000.0, (5.0, 2.0)),
    ]
    lines, _, r = run_flexible(
        walls, [diaphragm(box(0, 0, 10, 10))], Fx=13_000.0, extra=extra
    )
    # Hand, W = 100 + 20 + 10 kN, Fx/W = 0.1: slab 10 kN halves; wall S 2 kN straight to
    # its line; wall P 1 kN at y = 2 of a 10 m span: 0.8 / 0.2 (lever rule).
    assert by_offset([ln for ln in lines if ln.direction is X], r.line_forces) == [
        pytest.approx(5000.0 + 2000.0 + 800.0),
        pytest.approx(5000.0 + 200.0),
    ]


def test_point_load_from_non_stacking_wall_splits_by_lever_rule():
    walls = [
        x_wall("S", 0.0, 0.0, 10.0),
        x_wall("N", 10.0, 0.0, 10.0),
        y_wall("W", 0.0, 0.0, 10.0),
    ]
    lower, _ = lines_of(walls, [diaphragm(box(0, 0, 10, 10))])
    upper_walls = [
        x_wall("U", 3.0, 4.0, 6.0, level="L2", storey="L1"),
        x_wall("V", 10.0, 2.0, 8.0, level="L2", storey="L1"),
    ]
    _, upper = lines_of(
        upper_walls,
        [diaphragm(box(0, 0, 10, 10), level="L2")],
        level="L2",
        level_index=2,
    )
    forces = {"U|L2|0|0": 1000.0, "V|L2|0|0": 400.0}
    loads, conditions = transfer_point_loads(
        upper, forces, lower, level_below="L1", direction=X, tolerance=0.5
    )
    assert [(p.source_pier, p.location, p.force) for p in loads] == [
        ("U|L2|0|0", (5.0, 3.0), 1000.0)
    ]  # V stands on the line at y = 10
    assert [(c.kind, c.guids, c.level) for c in conditions] == [
        (ConditionKind.NON_STACKING_WALL, ("U",), "L1")
    ]
    _, _, r = run_flexible(
        walls, [diaphragm(box(0, 0, 10, 10))], Fx=0.0, point_loads=loads
    )
    # Hand: P = 1000 N at a = 3 m from y = 0, b = 7 m: R0 = P b / L = 700, R10 = 300 N.
    assert by_offset(lower[:2], r.line_forces) == [
        pytest.approx(700.0),
        pytest.approx(300.0),
    ]
    assert r.point_loads[0].shares == (
        ("L1-X-1", pytest.approx(700.0)),
        ("L1-X-2", pytest.approx(300.0)),
    )
    assert r.applied == 1000.0


def test_lever_rule_by_hand():

    s = (
        Support(line="a", v=0.0, segments=((0, 1),)),
        Support(line="b", v=8.0, segments=((0, 1),)),
    )
    assert lever_rule(800.0, 2.0, s) == (("a", 600.0), ("b", 200.0))  # F b/L, F a/L
    assert lever_rule(800.0, 10.0, s) == (("a", -200.0), ("b", 1000.0))  # overhang
    assert lever_rule(800.0, 2.0, s[:1]) == (("a", 800.0),)
    assert lever_rule(800.0, 2.0, ()) == ()


def test_given_force_on_weightless_level_is_spread_by_area():
    region = diaphragm(box(0, 0, 20, 10))
    lines, piers = lines_of(BOX, [region])
    load = slab_load([region], Fx=100.0, unit_weight=0.0)
    r = allocate_flexible(load, [region], lines, piers, direction=X)
    assert by_offset(lines[:2], r.line_forces) == [pytest.approx(50.0)] * 2  # symmetry
    assert r.pieces[0].weight == 0.0


def test_force_with_no_diaphragm_is_reported_not_allocated():
    lines, piers = lines_of(BOX, [])
    load = slab_load([], Fx=100.0)
    r = allocate_flexible(load, [], lines, piers, direction=X)
    assert set(r.line_forces.values()) == {0.0}
    (c,) = r.conditions
    assert (c.kind, c.value) == (ConditionKind.UNSUPPORTED_PIECE, 100.0)


def test_stacked_shear_columns_must_match():
    with pytest.raises(ValueError, match="columns of different lengths"):
        StackedShear(source_piers=("A|L2|0|0",), lines=(), forces=(1.0,), locations=())


def test_stacked_shear_on_a_line_of_another_level_is_an_error():
    walls = [x_wall("S", 0.0, 0.0, 10.0), x_wall("N", 10.0, 0.0, 10.0)]
    stacked = StackedShear(
        source_piers=("U|L2|0|0",),
        lines=("L9-X-1",),
        forces=(100.0,),
        locations=((5.0, 0.0),),
    )
    with pytest.raises(AllocationError, match="line L9-X-1 is not a line of level"):
        run_flexible(walls, [diaphragm(box(0, 0, 10, 10))], stacked=lambda _: stacked)
