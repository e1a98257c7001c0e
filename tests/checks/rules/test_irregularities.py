"""Horizontal irregularities, ASCE 7-16 Table 12.3-1 (rules.asce7_16.irregularities)."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st
from shapely import affinity
from shapely.geometry import Polygon, box

from checks.findings import Severity
from checks.rules.asce7_16.irregularities import (
    check_reentrant_corners,
    check_torsional_irregularity,
    reentrant_corners,
)
from ifc_bridge.model import BuildingModel, Diaphragm, Direction, Level

from ._build import allocation, config, rigid

# L-shape: 20 m × 20 m with a 10 m × 10 m notch at the top right; reflex vertex (10, 10)
L_SHAPE = Polygon([(0, 0), (20, 0), (20, 10), (10, 10), (10, 20), (0, 20)])


def test_l_shape_by_hand():
    (c,) = reentrant_corners(L_SHAPE)
    assert c.point == (10.0, 10.0)
    assert c.projection == (
        pytest.approx(10.0),
        pytest.approx(10.0),
    )  # 20 − 10 each way
    assert c.ratio == (
        pytest.approx(0.5),
        pytest.approx(0.5),
    )  # 10/20 > 0.15, Table 12.3-1 Type 2
    assert c.irregular


def test_shallow_notch_is_regular():
    # notch 10 m × 2 m: projection in y 2/20 = 10 % ≤ 15 %,
    # ASCE 7-16 Table 12.3-1 Type 2
    shape = Polygon([(0, 0), (20, 0), (20, 18), (10, 18), (10, 20), (0, 20)])
    (c,) = reentrant_corners(shape)
    assert c.ratio == (pytest.approx(0.5), pytest.approx(0.1))
    assert not c.irregular
    assert reentrant_corners(box(0, 0, 30, 10)) == []  # a rectangle has none


@given(
    angle=st.sampled_from([0, 90, 180, 270]),
    scale=st.floats(0.1, 50.0),
    mirror=st.booleans(),
)
def test_verdict_invariant_under_rotation_mirror_scale(angle, scale, mirror):
    # symmetry: the ratios are dimensionless and do not depend on orientation
    shape = affinity.scale(L_SHAPE, -scale if mirror else scale, scale, origin=(0, 0))
    shape = affinity.rotate(shape, angle, origin=(0, 0))
    (c,) = reentrant_corners(shape)
    assert sorted(c.ratio) == [pytest.approx(0.5), pytest.approx(0.5)]


def _model(poly, guids=("slab1",)):
    return BuildingModel(
        source="m.ifc",
        schema="IFC4",
        levels=(Level(name="Roof", guid="s1", elevation=3.0, index=1),),
        diaphragms=(
            Diaphragm(
                id="Roof/D1",
                level="Roof",
                polygon=poly,
                slab_guids=guids,
                kind="ROOF",
                elevation=3.0,
            ),
        ),
    )


def test_reentrant_finding_severity_by_sdc():
    found = check_reentrant_corners(_model(L_SHAPE), allocation(), config())  # SDC D
    assert [(f.severity, f.clause) for f in found] == [
        (Severity.WARNING, "ASCE 7-16 Table 12.3-1")
    ]
    low = check_reentrant_corners(
        _model(L_SHAPE), allocation(), config(SDS=0.2, SD1=0.05, S1=0.04)
    )  # SDC B
    assert [f.severity for f in low] == [Severity.INFO]


def test_large_opening_type_3():
    # 10 × 10 slab with a 8 × 8 hole: 64 % open > 50 %, ASCE 7-16 Table 12.3-1 Type 3
    poly = Polygon(box(0, 0, 10, 10).exterior, [box(1, 1, 9, 9).exterior])
    (f,) = check_reentrant_corners(_model(poly), allocation(), config())
    assert f.demand == pytest.approx(0.64)
    assert f.capacity == 0.5


@pytest.mark.parametrize(
    ("ratio", "S1", "expected"),
    [
        (1.15, 0.6, None),  # ≤ 1.2: regular, ASCE 7-16 Table 12.3-1 Type 1a
        (1.30, 0.6, Severity.WARNING),  # > 1.2: Type 1a
        (1.50, 0.6, Severity.WARNING),  # > 1.4: Type 1b in SDC D
        (
            1.50,
            0.8,
            Severity.ERROR,
        ),  # Type 1b in SDC E: not permitted, ASCE 7-16 §12.3.3.1
    ],
)
def test_torsional(ratio, S1, expected):
    alloc = allocation(
        rigid=[rigid("Roof", Direction.X, 1.0), rigid("Roof", Direction.X, ratio)]
    )
    found = check_torsional_irregularity(alloc, config(S1=S1))
    assert [f.severity for f in found] == ([expected] if expected else [])
    if expected:
        assert found[0].demand == pytest.approx(ratio)
        assert found[0].guids == ("storeyRoof",)
