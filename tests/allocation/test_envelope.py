"""Envelope of flexible and rigid allocations, by hand (common practice: the larger)."""

from __future__ import annotations

from hypothesis import given
from hypothesis import strategies as st

from allocation.envelope import envelope, line_envelope
from allocation.parameters import DiaphragmMethod
from allocation.results import (
    FlexibleResult,
    LoadCase,
    Method,
    ResistanceLine,
    RigidResult,
)
from ifc_bridge.model import Direction

X, Y = Direction.X, Direction.Y


def _flex(direction, pier_forces, line_forces=None):
    return FlexibleResult(
        level="L1",
        direction=direction,
        applied=0.0,
        pieces=(),
        point_loads=(),
        line_forces=line_forces or {},
        pier_forces=pier_forces,
    )


def _rigid(direction, sign, ecc_sign, pier_forces):
    return RigidResult(
        level="L1",
        case=LoadCase(direction=direction, sign=sign, ecc_sign=ecc_sign),
        story_shear=0.0,
        center_of_mass=(0.0, 0.0),
        center_of_rigidity=(0.0, 0.0),
        eccentricity=0.0,
        accidental=0.0,
        Ax=1.0,
        torsion=0.0,
        J=1.0,
        pier_forces=pier_forces,
        pier_direct={},
    )


FLEX = [
    _flex(X, {"a": 100.0, "b": 200.0}, {"LX": 300.0}),
    _flex(Y, {"c": -50.0}, {"LY": -50.0}),
]
RIGID = [
    _rigid(X, 1, 1, {"a": 80.0, "b": 100.0, "c": 60.0}),
    _rigid(X, 1, -1, {"a": -120.0, "b": 150.0, "c": -20.0}),
    _rigid(Y, 1, 1, {"a": 30.0, "b": -10.0, "c": 40.0}),
]


def test_envelope_by_hand():
    env = envelope(FLEX, RIGID)
    a, b, c = env["a"], env["b"], env["c"]
    # a: flexible 100, rigid max |−120| (+X-e) → rigid governs
    assert (a.flexible, a.rigid, a.envelope) == (100.0, 120.0, 120.0)
    assert (a.governing_method, a.governing_case) == (Method.RIGID, "+X-e")
    # b: flexible 200 > rigid 150 → flexible, case label = direction
    assert (b.envelope, b.governing_method, b.governing_case) == (
        200.0,
        Method.FLEXIBLE,
        "X",
    )
    # c (a Y wall): torsion under the X force (60) beats its own Y cases (40, 50)
    assert (c.flexible, c.rigid, c.envelope) == (50.0, 60.0, 60.0)
    assert (c.governing_method, c.governing_case) == (Method.RIGID, "+X+e")


def test_single_method_governs_when_chosen():
    flex_only = envelope(FLEX, RIGID, method=DiaphragmMethod.FLEXIBLE)
    assert flex_only["a"].envelope == 100.0
    assert flex_only["a"].rigid == 120.0  # still recorded
    assert flex_only["a"].governing_method is Method.FLEXIBLE
    rigid_only = envelope(FLEX, RIGID, method=DiaphragmMethod.RIGID)
    assert (rigid_only["b"].envelope, rigid_only["b"].governing_case) == (150.0, "+X-e")


def test_tie_goes_to_flexible_and_missing_method_counts_zero():
    env = envelope([_flex(X, {"a": 10.0})], [_rigid(X, -1, 1, {"a": -10.0, "z": 5.0})])
    assert env["a"].governing_method is Method.FLEXIBLE
    assert (env["z"].flexible, env["z"].envelope, env["z"].governing_case) == (
        0.0,
        5.0,
        "-X+e",
    )


def test_line_envelope_by_hand():
    lines = [
        ResistanceLine(
            id="LX",
            level="L1",
            direction=X,
            offset=0.0,
            piers=("a", "b"),
            wall_extent=(0.0, 1.0),
            wall_length=1.0,
        ),
        ResistanceLine(
            id="LY",
            level="L1",
            direction=Y,
            offset=0.0,
            piers=("c",),
            wall_extent=(0.0, 1.0),
            wall_length=1.0,
        ),
    ]
    out = line_envelope(lines, FLEX, RIGID)
    # LX rigid: +X+e 80+100 = 180, +X-e −120+150 = 30, +Y+e 30−10 = 20 → 180
    assert out["LX"] == {"flexible": 300.0, "rigid": 180.0, "envelope": 300.0}
    assert out["LY"] == {"flexible": 50.0, "rigid": 60.0, "envelope": 60.0}
    rigid_only = line_envelope(lines, FLEX, RIGID, method=DiaphragmMethod.RIGID)
    assert rigid_only["LX"]["envelope"] == 180.0


_force = st.floats(-1e6, 1e6, allow_nan=False)


@given(
    flex=st.lists(_force, min_size=1, max_size=4),
    rigid=st.lists(_force, min_size=1, max_size=8),
)
def test_envelope_is_the_larger_magnitude(flex, rigid):
    fr = [_flex(X, {"p": f}) for f in flex]
    rr = [_rigid(X, 1, 1, {"p": r}) for r in rigid]
    e = envelope(fr, rr)["p"]
    assert e.flexible == max(abs(f) for f in flex)
    assert e.rigid == max(abs(r) for r in rigid)
    assert e.envelope == max(e.flexible, e.rigid)  # common practice: the larger
