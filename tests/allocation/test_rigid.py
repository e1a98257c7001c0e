"""Rigid-diaphragm allocation: hand cases, conditions and statics properties.

Hand cases are statics of a rigid bar on springs (common practice); the same closed
form is checked against OpenSees in test_rigid_opensees.py.
"""

from __future__ import annotations

from dataclasses import replace

import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st

from allocation.errors import ParameterError
from allocation.results import ConditionKind, LoadCase, Pier
from allocation.rigid import (
    DRIFT_RATIO_LIMIT,
    allocate_rigid,
    allocate_rigid_story,
    rigid_cases,
)
from ifc_bridge.model import Direction
from tests.allocation._piers import wall

X, Y = Direction.X, Direction.Y


def _run(
    piers,
    case,
    *,
    V=1000.0,
    cm=(5.0, 5.0),
    extent=(0.0, 0.0, 10.0, 10.0),
    ecc=0.05,
    Ax=1.0,
):
    return allocate_rigid(
        piers,
        level="L1",
        story_shear=V,
        center_of_mass=cm,
        plan_extent=extent,
        case=case,
        accidental_eccentricity=ecc,
        Ax=Ax,
    )


def _case(direction, sign=1, ecc_sign=1):
    return LoadCase(direction=direction, sign=sign, ecc_sign=ecc_sign)


def test_rigid_cases_labels():
    labels = [c.label for c in rigid_cases(X)]  # ASCE 7-16 §12.8.4.2: ± force, ± e
    assert labels == ["+X+e", "+X-e", "-X+e", "-X-e"]


def test_two_walls_accidental_torsion_by_hand():
    # Y walls k at x = 0 and L = 10, CM at mid-plan; e = 0.05·L (ASCE 7-16 §12.8.4.2).
    # J = 2k(L/2)², T = 0.05·L·V, torsional share k·(L/2)·T/J = 0.05·V (common practice)
    piers = [wall("W", "Y", 0.0, 5.0, 7.0), wall("E", "Y", 10.0, 5.0, 7.0)]
    r = _run(piers, _case(Y))
    assert r.pier_forces["W|L1|0|0"] == pytest.approx(450.0, rel=1e-12)  # 0.45 V
    assert r.pier_forces["E|L1|0|0"] == pytest.approx(550.0, rel=1e-12)  # 0.55 V
    assert r.pier_direct["E|L1|0|0"] == pytest.approx(500.0, rel=1e-12)  # k/Σk·V
    assert r.accidental == pytest.approx(0.5)  # 0.05 × 10 m
    assert r.torsion == pytest.approx(500.0)  # V·e, CCW positive for +Y east of CR
    # ends displace 0.45 and 0.55 (V/k units); avg 0.5 → 1.1 (ASCE 7-16 Table 12.3-1)
    assert r.drift_ratio_max == pytest.approx(1.1, rel=1e-12)


def test_amplified_torsion_by_hand():
    # Y walls at x = 2.5 and 7.5 in a 10 m plan: J = 2k·2.5², ends move 0.3 and 0.7
    # (units V/k) → δmax/δavg = 1.4 (ASCE 7-16 Table 12.3-1, Type 1a),
    # Ax = (1.4/1.2)² = 1.36111 (ASCE 7-16 Eq. 12.8-14); e = 0.05·Ax·L = 0.680556 m;
    # torsional share k·2.5·V·e/J = V·e/5 (common practice).
    piers = [wall("W", "Y", 2.5, 5.0, 3.0), wall("E", "Y", 7.5, 5.0, 3.0)]
    results = allocate_rigid_story(
        piers,
        level="L1",
        story_shear=1000.0,
        center_of_mass=(5.0, 5.0),
        plan_extent=(0.0, 0.0, 10.0, 10.0),
        direction=Y,
        accidental_eccentricity=0.05,
        amplify_torsion=True,
    )
    assert [r.case.label for r in results] == ["+Y+e", "+Y-e", "-Y+e", "-Y-e"]
    first = results[0]
    assert first.drift_ratio_max == pytest.approx(1.4, rel=1e-12)  # with Ax = 1
    assert first.Ax == pytest.approx((1.4 / 1.2) ** 2, rel=1e-12)  # Eq. 12.8-14
    e = 0.05 * (1.4 / 1.2) ** 2 * 10.0
    assert first.accidental == pytest.approx(e, rel=1e-12)
    assert first.pier_forces["E|L1|0|0"] == pytest.approx(500.0 + 1000.0 * e / 5.0)
    assert first.pier_forces["W|L1|0|0"] == pytest.approx(500.0 - 1000.0 * e / 5.0)
    plain = allocate_rigid_story(
        piers,
        level="L1",
        story_shear=1000.0,
        center_of_mass=(5.0, 5.0),
        plan_extent=(0.0, 0.0, 10.0, 10.0),
        direction=Y,
        accidental_eccentricity=0.05,
        amplify_torsion=False,
    )
    assert all(r.Ax == 1.0 for r in plain)


def test_regular_story_keeps_ax_one():
    piers = [wall("W", "Y", 0.0, 5.0, 7.0), wall("E", "Y", 10.0, 5.0, 7.0)]
    results = allocate_rigid_story(
        piers,
        level="L1",
        story_shear=1000.0,
        center_of_mass=(5.0, 5.0),
        plan_extent=(0.0, 0.0, 10.0, 10.0),
        direction=Y,
        accidental_eccentricity=0.05,
        amplify_torsion=True,
    )
    assert all(r.Ax == 1.0 for r in results)  # ratio 1.1 <= 1.2, Table 12.3-1


def test_no_wall_in_force_direction():
    piers = [wall("W", "Y", 0.0, 5.0), wall("E", "Y", 10.0, 5.0)]
    r = _run(piers, _case(X))
    assert [c.kind for c in r.conditions] == [ConditionKind.NO_LINE]
    assert r.conditions[0].guids == ("E", "W")
    assert r.conditions[0].value == pytest.approx(1000.0)
    assert all(f == 0.0 for f in r.pier_forces.values())  # nothing can resist X


def test_walls_on_one_line_are_torsionally_unstable():
    piers = [wall("A", "X", 2.0, 4.0, 1.0), wall("B", "X", 8.0, 4.0, 3.0)]
    r = _run(piers, _case(X))
    assert [c.kind for c in r.conditions] == [ConditionKind.TORSIONAL_INSTABILITY]
    assert r.pier_forces["A|L1|0|0"] == pytest.approx(250.0)  # direct only, k/Σk·V
    assert r.pier_forces["B|L1|0|0"] == pytest.approx(750.0)
    assert r.drift_ratio_max == DRIFT_RATIO_LIMIT  # rotation unbounded under torsion


def test_one_wall_each_way_is_torsionally_unstable():
    piers = [wall("A", "X", 5.0, 0.0), wall("B", "Y", 0.0, 5.0)]
    r = _run(piers, _case(Y))  # J = 0: each wall passes through the CR
    assert [c.kind for c in r.conditions] == [ConditionKind.TORSIONAL_INSTABILITY]
    assert r.pier_forces["B|L1|0|0"] == pytest.approx(1000.0)
    assert r.pier_forces["A|L1|0|0"] == 0.0


def test_skewed_and_other_level_piers_are_ignored():
    piers = [
        wall("W", "Y", 0.0, 5.0),
        wall("E", "Y", 10.0, 5.0),
        wall("S", None, 5.0, 5.0),
        wall("U", "Y", 3.0, 5.0, level="L2"),
    ]
    r = _run(piers, _case(Y), ecc=0.0)
    assert set(r.pier_forces) == {"W|L1|0|0", "E|L1|0|0"}
    assert r.pier_forces["W|L1|0|0"] == pytest.approx(
        500.0
    )  # symmetric, common practice


def test_zero_shear_gives_zero_forces():
    piers = [wall("W", "Y", 0.0, 5.0), wall("E", "Y", 10.0, 5.0), wall("N", "X", 5, 10)]
    r = _run(piers, _case(Y), V=0.0)
    assert all(f == 0.0 for f in r.pier_forces.values())
    assert r.drift_ratio_max >= 1.0


@pytest.mark.parametrize(
    ("kwargs", "text"),
    [
        ({"V": -1.0}, "story_shear"),
        ({"extent": (10.0, 0.0, 0.0, 10.0)}, "plan_extent"),
        ({"ecc": 0.6}, "accidental_eccentricity"),
        ({"Ax": 3.5}, "Ax"),
        ({"cm": (float("nan"), 0.0)}, "center_of_mass"),
    ],
)
def test_bad_input_is_a_parameter_error(kwargs, text):
    piers = [wall("W", "Y", 0.0, 5.0), wall("E", "Y", 10.0, 5.0)]
    with pytest.raises(ParameterError, match=text):
        _run(piers, _case(Y), **kwargs)


def test_negative_stiffness_names_the_pier():
    with pytest.raises(ParameterError, match=r"pier W\|L1\|0\|0"):
        _run([wall("W", "Y", 0.0, 5.0, -1.0)], _case(Y))


# ---- properties (statics; common practice) -------------------------------------------

_coord = st.floats(0.0, 40.0, allow_nan=False)
_k = st.floats(0.1, 10.0, allow_nan=False)
_walls = st.lists(st.tuples(_coord, _coord, _k), min_size=1, max_size=5)


@st.composite
def layouts(draw):
    xs = draw(_walls)
    ys = draw(_walls)
    piers = [wall(f"x{i}", "X", x, y, k) for i, (x, y, k) in enumerate(xs)]
    piers += [wall(f"y{i}", "Y", x, y, k) for i, (x, y, k) in enumerate(ys)]
    cm = (draw(_coord), draw(_coord))
    return piers, cm


def _stable(piers: list[Pier], cm) -> bool:
    r = _run(piers, _case(X), cm=cm, extent=(0.0, 0.0, 40.0, 40.0))
    return 1e-6 * sum(p.stiffness for p in piers) < r.J


@settings(max_examples=60, deadline=None)
@given(layout=layouts(), V=st.floats(1.0, 1e7), direction=st.sampled_from([X, Y]))
def test_equilibrium_every_case(layout, V, direction):
    piers, cm = layout
    assume(_stable(piers, cm))
    extent = (0.0, 0.0, 40.0, 40.0)
    for case in rigid_cases(direction):
        r = _run(piers, case, V=V, cm=cm, extent=extent)
        F = case.sign * V
        along = sum(
            f for p in piers if p.direction is direction for f in [r.pier_forces[p.id]]
        )
        across = sum(
            f
            for p in piers
            if p.direction is not direction
            for f in [r.pier_forces[p.id]]
        )
        assert along == pytest.approx(F, rel=1e-9, abs=1e-9 * V)  # ΣF = V
        assert across == pytest.approx(0.0, abs=1e-9 * V)
        # moments about the origin equal the applied force's moment (statics)
        shift = case.ecc_sign * 0.05 * 40.0
        applied = -F * (cm[1] + shift) if direction is X else F * (cm[0] + shift)
        resisting = sum(
            (-p.midpoint[1] if p.direction is X else p.midpoint[0])
            * r.pier_forces[p.id]
            for p in piers
        )
        assert resisting == pytest.approx(applied, rel=1e-9, abs=1e-8 * V * 40.0)
        # and about the CR they balance T = V·e
        xcr, ycr = r.center_of_rigidity
        about_cr = sum(
            (-(p.midpoint[1] - ycr) if p.direction is X else p.midpoint[0] - xcr)
            * r.pier_forces[p.id]
            for p in piers
        )
        e = (cm[1] + shift - ycr) if direction is X else (cm[0] + shift - xcr)
        assert about_cr == pytest.approx(
            (-F if direction is X else F) * e, rel=1e-9, abs=1e-8 * V * 40.0
        )


def _moved(p: Pier, f) -> Pier:
    return replace(p, start=f(p.start), end=f(p.end))


@settings(max_examples=40, deadline=None)
@given(layout=layouts(), dx=st.floats(-1e3, 1e3), dy=st.floats(-1e3, 1e3))
def test_translation_changes_nothing(layout, dx, dy):
    piers, cm = layout
    assume(_stable(piers, cm))
    shifted = [_moved(p, lambda q: (q[0] + dx, q[1] + dy)) for p in piers]
    for case in (*rigid_cases(X), *rigid_cases(Y)):
        a = _run(piers, case, cm=cm, extent=(0.0, 0.0, 40.0, 40.0))
        b = _run(
            shifted,
            case,
            cm=(cm[0] + dx, cm[1] + dy),
            extent=(dx, dy, 40.0 + dx, 40.0 + dy),
        )
        for p in piers:
            assert b.pier_forces[p.id] == pytest.approx(a.pier_forces[p.id], abs=1e-6)


@settings(max_examples=40, deadline=None)
@given(layout=layouts())
def test_rotation_by_90_degrees_swaps_x_and_y(layout):
    piers, cm = layout
    assume(_stable(piers, cm))
    # (x, y) → (−y, x): X walls become Y walls (force +X → +Y), Y walls become X walls
    # with force reversed, and +e in y becomes −e in x.
    turned = [
        replace(_moved(p, lambda q: (-q[1], q[0])), direction=p.direction.other)
        for p in piers
    ]
    extent = (0.0, 0.0, 30.0, 40.0)
    extent_turned = (-40.0, 0.0, 0.0, 30.0)
    for case in rigid_cases(X):
        a = _run(piers, case, cm=cm, extent=extent)
        b = _run(
            turned,
            _case(Y, case.sign, -case.ecc_sign),
            cm=(-cm[1], cm[0]),
            extent=extent_turned,
        )
        assert b.drift_ratio_max == pytest.approx(a.drift_ratio_max, rel=1e-9)
        for p in piers:
            expected = a.pier_forces[p.id] * (1.0 if p.direction is X else -1.0)
            assert b.pier_forces[p.id] == pytest.approx(expected, rel=1e-9, abs=1e-9)


@settings(max_examples=40, deadline=None)
@given(walls=_walls, xwalls=_walls, V=st.floats(1.0, 1e6))
def test_symmetric_plan_without_eccentricity_loads_mirror_walls_equally(
    walls, xwalls, V
):
    # Y walls mirrored about x = 20, X walls mirrored too: CR on x = 20 = CM.
    piers = []
    for i, (x, y, k) in enumerate(walls):
        piers += [wall(f"L{i}", "Y", x, y, k), wall(f"R{i}", "Y", 40.0 - x, y, k)]
    for i, (x, y, k) in enumerate(xwalls):
        piers += [wall(f"a{i}", "X", x, y, k), wall(f"b{i}", "X", 40.0 - x, y, k)]
    r = _run(
        piers, _case(Y), V=V, cm=(20.0, 13.0), extent=(0.0, 0.0, 40.0, 40.0), ecc=0.0
    )
    for i in range(len(walls)):
        left, right = r.pier_forces[f"L{i}|L1|0|0"], r.pier_forces[f"R{i}|L1|0|0"]
        assert left == pytest.approx(right, rel=1e-9, abs=1e-9 * V)
    assert all(
        abs(r.pier_forces[p.id]) <= 1e-9 * V for p in piers if p.direction is X
    )  # no torsion, no X-wall force


def _story(piers, direction, level="L1"):
    return allocate_rigid_story(
        piers,
        level=level,
        story_shear=1000.0,
        center_of_mass=(5.0, 5.0),
        plan_extent=(0.0, 0.0, 10.0, 10.0),
        direction=direction,
        accidental_eccentricity=0.05,
        amplify_torsion=False,
    )


def test_story_rigidity_reused_only_for_the_same_piers():
    # the CR of the story serves its X and Y cases; a list changed in place (same
    # object, other piers) is worked out afresh. Statics as above (common practice).
    piers = [
        wall("W", "Y", 2.5, 5.0, 3.0),
        wall("E", "Y", 7.5, 5.0, 3.0),
        wall("S", "X", 5.0, 0.0, 4.0),
    ]
    y_first = _story(piers, Y)
    x_then = _story(piers, X)
    assert x_then[0].center_of_rigidity == y_first[0].center_of_rigidity == (5.0, 0.0)
    piers.append(wall("N", "X", 5.0, 10.0, 4.0))  # CR moves to y = 5
    moved = _story(piers, X)
    assert moved[0].center_of_rigidity == (5.0, 5.0)
    # +X+e: e = 0.05 * 10 = 0.5 m; J = 2 * 4 * 5**2 + 2 * 3 * 2.5**2 = 237.5;
    # N takes V/2 + V * e * k * d / J = 500 + 1000 * 0.5 * 4 * 5 / 237.5
    assert moved[0].pier_forces["N|L1|0|0"] == pytest.approx(500.0 + 10000.0 / 237.5)


def test_each_storys_rigidity_serves_its_other_direction_after_the_other_stories(
    monkeypatch,
):
    # The allocation asks for every story in X, then every story in Y; each story's
    # CR and J are worked out once. Statics (common practice): CR of two equal Y
    # walls at x = 2.5 and 7.5 is x = 5; of one X wall at y = 0, y = 0.
    import allocation.rigid as rigid

    made = []
    real = rigid._rigidity
    monkeypatch.setattr(
        rigid, "_rigidity", lambda *a, **k: made.append(k["level"]) or real(*a, **k)
    )
    stories = {
        lv: [
            wall("W", "Y", 2.5, 5.0, 3.0, level=lv),
            wall("E", "Y", 7.5, 5.0, 3.0, level=lv),
            wall("S", "X", 5.0, 0.0, 4.0, level=lv),
        ]
        for lv in ("L3", "L2", "L1")
    }

    x = {lv: _story(stories[lv], X, lv) for lv in stories}
    y = {lv: _story(stories[lv], Y, lv) for lv in stories}
    assert made == ["L3", "L2", "L1"]  # once per story, not once per direction
    for lv in stories:
        assert x[lv][0].center_of_rigidity == y[lv][0].center_of_rigidity == (5.0, 0.0)
