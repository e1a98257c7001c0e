"""The box a viewpoint frames, from the indexed model, equals the box by definition.

Common practice (the rule in ``checks.report._camera.element_box``): the corners of the
walls named by GlobalId (those under the finding's level when there are any) and the
outlines of the slabs named; else a box round the finding's plan point; else every wall
and diaphragm of the level; else of the model. The reference below scans the whole
model for every call, as the rule reads.
"""

from __future__ import annotations

import dataclasses
import itertools

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checks.report._camera import Box, element_box
from tests.checks.report._demo_run import demo_run
from tests.checks.report._tiny_model import tiny_model


def _corners(walls, level):
    on_level = [w for w in walls if w.level == level]
    pts = []
    for w in on_level or walls:
        h = w.thickness / 2.0
        for x, y in (w.start, w.end):
            for z in (w.base_elevation, w.top_elevation):
                pts += [(x - h, y - h, z), (x + h, y + h, z)]
    return pts


def _outline(d):
    x0, y0, x1, y1 = d.polygon.bounds
    return [(x0, y0, d.elevation), (x1, y1, d.elevation)]


def _box(pts):
    xs, ys, zs = zip(*pts, strict=True)
    return Box(lo=(min(xs), min(ys), min(zs)), hi=(max(xs), max(ys), max(zs)))


def reference_box(model, guids, *, level="", location=None):
    wanted = set(guids)
    pts = _corners([w for w in model.walls if w.guid in wanted], level)
    for d in model.diaphragms:
        if wanted & set(d.slab_guids):
            pts += _outline(d)
    if pts:
        return _box(pts)
    names = [lv.name for lv in model.levels]
    z = (
        model.levels[names.index(level)].elevation
        if level in names
        else (model.levels[0].elevation if model.levels else 0.0)
    )
    if location is not None:
        x, y = location
        return Box(lo=(x - 1.5, y - 1.5, z - 3.0), hi=(x + 1.5, y + 1.5, z))
    pts = _corners([w for w in model.walls if not level or w.level == level], level)
    for d in model.diaphragms:
        if not level or d.level == level:
            pts += _outline(d)
    if pts:
        return _box(pts)
    return Box(lo=(-1.5, -1.5, z - 3.0), hi=(1.5, 1.5, z))


def _cases(model):
    walls = sorted({w.guid for w in model.walls})
    slabs = sorted({g for d in model.diaphragms for g in d.slab_guids})
    levels = ["", *(lv.name for lv in model.levels), "no such level"]
    guid_sets = [
        (),
        ("no-such-guid",),
        *((g,) for g in walls[:6]),
        tuple(walls[::3]),
        tuple(reversed(walls[:4])),
        *((g,) for g in slabs[:3]),
        (walls[0], slabs[0]) if walls and slabs else (),
        # more GlobalIds than the index looks up one by one
        (*walls[::2], *slabs, *(f"not-in-the-model-{i}" for i in range(70))),
    ]
    yield from itertools.product(guid_sets, levels, (None, (3.0, -2.0)))


def test_boxes_of_every_kind_of_finding_on_the_demo():
    model = demo_run().model
    for guids, level, location in _cases(model):
        got = element_box(model, guids, level=level, location=location)
        assert got == reference_box(model, guids, level=level, location=location), (
            guids,
            level,
            location,
        )


def test_boxes_of_the_demo_findings():
    run = demo_run()
    for f in run.findings:
        kw = {"level": f.level, "location": f.location}
        assert element_box(run.model, f.guids, **kw) == reference_box(
            run.model, f.guids, **kw
        )


@pytest.mark.parametrize("shift", [5.0, -12.5])
def test_a_second_model_is_not_framed_from_the_first_ones_index(shift):
    model = demo_run().model
    moved = dataclasses.replace(
        model,
        walls=tuple(
            dataclasses.replace(
                w,
                start=(w.start[0] + shift, w.start[1]),
                end=(w.end[0] + shift, w.end[1]),
            )
            for w in model.walls
        ),
    )
    guid = model.walls[0].guid
    for m in (model, moved, model):
        assert element_box(m, [guid]) == reference_box(m, [guid])
        assert element_box(m, []) == reference_box(m, [])


_COORD = st.floats(-1e4, 1e4) | st.sampled_from([0.0, -0.0, 1.0, -1.0])
_WALL = st.tuples(
    _COORD,
    _COORD,
    st.sampled_from([(3.0, 0.0), (0.0, -2.5), (-1e-3, 1e-3), (7.5, 7.5)]),
    st.floats(1e-3, 2.0),
    st.floats(-50.0, 50.0),
)


@settings(max_examples=40, deadline=None)
@given(placed=st.lists(_WALL, min_size=8, max_size=8))
def test_boxes_of_walls_placed_anywhere(placed):
    model = tiny_model()
    walls = tuple(
        dataclasses.replace(
            w,
            start=(x, y),
            end=(x + dx, y + dy),
            thickness=t,
            base_elevation=z,
            top_elevation=z + 3.0,
        )
        for w, (x, y, (dx, dy), t, z) in zip(model.walls, placed, strict=True)
    )
    model = dataclasses.replace(model, walls=walls)
    for guids, level, location in _cases(model):
        got = element_box(model, guids, level=level, location=location)
        assert got == reference_box(model, guids, level=level, location=location)
