"""Flexible diaphragm, properties: statics, mirror symmetry, translation, rotation.

Hypothesis plans: a W x H rectangle with X lines at y = 0, H and at random fractions of
H (walls over the middle half of the width), Y lines at x = 0 and W, a slab of 1 kPa, a
point wall mass and a distributed extra mass at random. Derandomised for repeatability.
"""

from __future__ import annotations

import itertools
import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from shapely.affinity import affine_transform
from shapely.geometry import box

from allocation.results import MassItem, PointLoad, StackedShear
from ifc_bridge.model import Direction
from tests.allocation._plans import (
    by_offset,
    diaphragm,
    run_flexible,
    segment,
    wall_mass,
)

X, Y = Direction.X, Direction.Y


def _plan(W, H, fracs, point, transform=lambda x, y: (x, y)):
    """W x H box, X lines at 0, H and H*fracs, Y lines at 0 and W, transformed."""

    def t(p):
        return transform(*p)

    def poly(g):
        (a, b), (c, d), (e, f) = t((0, 0)), t((1, 0)), t((0, 1))
        return affine_transform(g, [c - a, e - a, d - b, f - b, a, b])

    raw = [((0, 0), (W, 0)), ((0, H), (W, H)), ((0, 0), (0, H)), ((W, 0), (W, H))]
    raw += [((0.25 * W, f * H), (0.75 * W, f * H)) for f in fracs]
    walls = [segment(f"W{i}", t(s), t(e)) for i, (s, e) in enumerate(raw)]
    region = diaphragm(poly(box(0, 0, W, H)))
    px, py, pw = point
    extra = [
        wall_mass("M", pw, t((px * W, py * H))),
        MassItem(
            source="extra",
            ref="x",
            weight=3000.0,
            location=t((0.1, 0.1)),
            polygon=poly(box(0, 0, 0.5 * W, 0.3 * H)),
        ),
    ]
    return walls, region, extra


plans = st.tuples(
    st.floats(4.0, 30.0),
    st.floats(4.0, 30.0),
    st.lists(st.floats(0.1, 0.9), max_size=3, unique=True)
    .map(sorted)
    .filter(lambda fs: all(b - a > 0.1 for a, b in itertools.pairwise(fs))),
    st.tuples(st.floats(0.0, 1.0), st.floats(0.0, 1.0), st.floats(0.0, 5e4)),
)
FAST = settings(max_examples=25, derandomize=True, deadline=None)


def _stacked_on_every_x_line(S: float):
    """S [N] from a wall above standing on each X line of the level."""

    def make(lines):
        xs = [ln for ln in lines if ln.direction is X]
        return StackedShear(
            source_piers=tuple(f"S{n}|L2|0|0" for n in range(len(xs))),
            lines=tuple(ln.id for ln in xs),
            forces=(S,) * len(xs),
            locations=tuple((0.0, ln.offset) for ln in xs),
        )

    return make


@FAST
@given(
    plan=plans,
    Fx=st.floats(1.0, 1e6),
    P=st.floats(0.0, 1e5),
    S=st.floats(-1e5, 1e5),
)
def test_line_forces_add_up_to_level_force_and_transfers(plan, Fx, P, S):  # statics
    W, H, fracs, point = plan
    walls, region, extra = _plan(W, H, fracs, point)
    pl = PointLoad(
        level="L1",
        direction=X,
        source_pier="U|L2|0|0",
        location=(0.3 * W, 0.7 * H),
        force=P,
        shares=(),
    )
    _, _, r = run_flexible(
        walls,
        [region],
        Fx=Fx,
        extra=extra,
        point_loads=[pl],
        stacked=_stacked_on_every_x_line(S),
    )
    total = Fx + P + S * len(r.stacked)
    assert r.applied == pytest.approx(total, rel=1e-9, abs=1e-6)
    assert math.fsum(r.line_forces.values()) == pytest.approx(total, rel=1e-9, abs=1e-6)
    assert math.fsum(r.pier_forces.values()) == pytest.approx(total, rel=1e-9, abs=1e-6)
    alone = run_flexible(walls, [region], Fx=Fx, extra=extra, point_loads=[pl])[2]
    for lid, f in alone.line_forces.items():  # a stacked wall loads its line only
        assert r.line_forces[lid] == pytest.approx(f + S, rel=1e-9, abs=1e-6)
    assert sum(p.polygon.area for p in r.pieces) == pytest.approx(W * H, rel=1e-9)


@FAST
@given(plan=plans, Fx=st.floats(1.0, 1e6))
def test_symmetric_plan_gives_mirror_lines_equal_forces(plan, Fx):
    W, H, fracs, _ = plan
    sym = sorted({*fracs, *(1.0 - f for f in fracs)})
    if any(b - a < 0.05 for a, b in itertools.pairwise(sym)):
        sym = fracs = []
    walls, region, _ = _plan(W, H, sym, (0.5, 0.5, 0.0))
    lines, _, r = run_flexible(walls, [region], Fx=Fx)
    forces = by_offset([ln for ln in lines if ln.direction is X], r.line_forces)
    assert forces == pytest.approx(forces[::-1], rel=1e-9)  # mirror symmetry


@FAST
@given(plan=plans, dx=st.floats(-500.0, 500.0), dy=st.floats(-500.0, 500.0))
def test_translation_leaves_forces_unchanged(plan, dx, dy):
    W, H, fracs, point = plan
    for d in (X, Y):
        walls, region, extra = _plan(W, H, fracs, point)
        lines, _, base = run_flexible(walls, [region], extra=extra, direction=d)
        walls, region, extra = _plan(W, H, fracs, point, lambda x, y: (x + dx, y + dy))
        moved_lines, _, moved = run_flexible(walls, [region], extra=extra, direction=d)
        a = by_offset([ln for ln in lines if ln.direction is d], base.line_forces)
        b = by_offset(
            [ln for ln in moved_lines if ln.direction is d], moved.line_forces
        )
        assert b == pytest.approx(a, rel=1e-6, abs=1e-6)


@FAST
@given(plan=plans)
def test_rotating_plan_by_90_degrees_swaps_x_and_y(plan):
    W, H, fracs, point = plan
    walls, region, extra = _plan(W, H, fracs, point)
    lines, _, rx = run_flexible(walls, [region], extra=extra, direction=X)
    walls, region, extra = _plan(W, H, fracs, point, lambda x, y: (-y, x))
    rlines, _, ry = run_flexible(walls, [region], extra=extra, direction=Y)
    a = by_offset([ln for ln in lines if ln.direction is X], rx.line_forces)
    b = by_offset([ln for ln in rlines if ln.direction is Y], ry.line_forces)
    assert b[::-1] == pytest.approx(a, rel=1e-6, abs=1e-6)  # y = c maps to x = -c
