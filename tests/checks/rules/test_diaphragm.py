"""Diaphragm unit shear, chord and collector forces (rules.asce7_16.diaphragm)."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st
from shapely.geometry import box

from allocation.results import DiaphragmPiece, FlexibleResult, PointLoad, ResistanceLine
from checks.findings import Severity
from checks.rules.asce7_16.diaphragm import check_diaphragm, diaphragm_demands
from checks.rules.sdpws_2015.diaphragm_aspect_ratio import check_diaphragm_aspect_ratio
from ifc_bridge.model import BuildingModel, Diaphragm, Direction, Level

from ._build import allocation, config, level, pier

X = Direction.X


def _line(lid, y, *, piers, wall_length, collector, crossing=10.0, dia="Roof/D1"):
    return ResistanceLine(
        id=lid,
        level="Roof",
        direction=X,
        offset=y,
        piers=piers,
        wall_extent=(0.0, wall_length),
        wall_length=wall_length,
        crossings=((dia, crossing),),
        collector_length=collector,
    )


def _box_case(*, depth=10.0, span=6.0, point_loads=(), Fx=100e3, Fpx=120e3):
    """Rectangle depth (x) × span (y) between X lines at y = 0 and y = span."""
    p1 = pier("w1", start=(0.0, 0.0), end=(4.0, 0.0), line="L1-X-1")
    p2 = pier("w2", start=(0.0, span), end=(depth, span), line="L1-X-2")
    lines = (
        _line(
            "L1-X-1",
            0.0,
            piers=(p1.id,),
            wall_length=4.0,
            collector=depth - 4.0,
            crossing=depth,
        ),
        _line(
            "L1-X-2",
            span,
            piers=(p2.id,),
            wall_length=depth,
            collector=0.0,
            crossing=depth,
        ),
    )
    piece = DiaphragmPiece(
        id="Roof/D1/X1",
        diaphragm="Roof/D1",
        level="Roof",
        direction=X,
        polygon=box(0.0, 0.0, depth, span),
        weight=Fx / 0.15,
        force=Fx,
        centroid=(depth / 2, span / 2),
        supports=("L1-X-1", "L1-X-2"),
        shares=(("L1-X-1", Fx / 2), ("L1-X-2", Fx / 2)),
    )
    fr = FlexibleResult(
        level="Roof",
        direction=X,
        applied=Fx,
        pieces=(piece,),
        point_loads=tuple(point_loads),
        line_forces={},
        pier_forces={},
    )
    return allocation(
        [p1, p2], levels=(level(Fx=Fx, Fpx=Fpx),), lines=lines, flexible=(fr,)
    )


def test_unit_shear_chord_collector_by_hand():
    alloc = _box_case()
    dem = diaphragm_demands(alloc, config())
    shear = {s.line: s for s in dem.shears}
    # reaction = 50 kN × Fpx/Fx = 60 kN (ASCE 7-16 §12.10.1.1);
    # v = 0.7·60 kN / 10 m (ASCE 7-16 §2.4.5)
    assert shear["L1-X-1"].unit_shear == pytest.approx(0.7 * 60e3 / 10.0, rel=1e-12)
    assert shear["L1-X-2"].reactions == (
        pytest.approx(60e3),
        0.0,
    )  # piece is below line 2
    (chord,) = dem.chords
    # simple span, uniform load: M = 0.7·120 kN·6 m/8 = 63 kN·m, d = 60 m²/6 m = 10 m
    assert chord.moment == pytest.approx(
        0.7 * 120e3 * 6.0 / 8.0, rel=1e-12
    )  # common practice
    assert chord.force == pytest.approx(6300.0, rel=1e-12)  # M/d, common practice
    (coll,) = dem.collectors
    # SDC D (SDS = 1.0): Ω0 = 3.0 on 4200 N/m × 6 m of collector, ASCE 7-16 §12.10.2.1
    assert coll.omega0 == 3.0
    assert coll.force == pytest.approx(3.0 * 4200.0 * 6.0, rel=1e-12)


def test_no_overstrength_in_sdc_b():
    # SDS = 0.2, SD1 = 0.05 → SDC B (Table 11.6-1, from memory): no Ω0 (§12.10.2.1)
    dem = diaphragm_demands(_box_case(), config(SDS=0.2, SD1=0.05, S1=0.04))
    assert dem.collectors[0].omega0 == 1.0


def test_transfer_adds_and_stacking_does_not():
    transfer = PointLoad(
        level="Roof",
        direction=X,
        source_pier="up|a",
        location=(5.0, 3.0),
        force=10e3,
        shares=(("L1-X-1", 5e3), ("L1-X-2", 5e3)),
    )
    stacking = PointLoad(
        level="Roof",
        direction=X,
        source_pier="up|b",
        location=(2.0, 0.0),
        force=40e3,
        shares=(("L1-X-1", 40e3),),
    )
    dem = diaphragm_demands(_box_case(point_loads=(transfer, stacking)), config())
    s1 = next(s for s in dem.shears if s.line == "L1-X-1")
    # 60 kN of Fpx share plus 5 kN of transfer (unscaled); stacking adds nothing
    assert s1.reactions[1] == pytest.approx(65e3, rel=1e-12)
    assert s1.unit_shear == pytest.approx(0.7 * 65e3 / 10.0, rel=1e-12)


def _model(poly):
    return BuildingModel(
        source="m.ifc",
        schema="IFC4",
        levels=(Level(name="Roof", guid="s1", elevation=3.0, index=1),),
        diaphragms=(
            Diaphragm(
                id="Roof/D1",
                level="Roof",
                polygon=poly,
                slab_guids=("slab1",),
                kind="ROOF",
                elevation=3.0,
            ),
        ),
    )


def test_findings_are_info_pinned_to_the_slabs():
    found = check_diaphragm(_model(box(0, 0, 10, 6)), _box_case(), config())
    assert sorted(f.clause for f in found) == [
        "ASCE 7-16 §12.10.1.1",
        "ASCE 7-16 §12.10.1.1",
        "ASCE 7-16 §12.10.2.1",
    ]
    assert all(f.severity is Severity.INFO for f in found)
    assert len({f.id for f in found}) == len(found)
    shear = next(f for f in found if "shear" in f.discriminator)
    assert shear.guids == ("slab1",)
    assert shear.demand == pytest.approx(4200.0)
    collector = next(f for f in found if "collector" in f.discriminator)
    assert collector.guids == ("storeyRoof",)  # one per level and direction
    assert collector.demand == pytest.approx(3.0 * 4200.0 * 6.0)  # ASCE 7-16 §12.10.2.1


def test_slender_piece_is_a_warning():
    # span 10 m, mean depth 20 m²/10 m = 2 m: L/W = 5 > 4,
    # AWC SDPWS-2015 §4.2.4 (from memory)
    alloc = _box_case(depth=2.0, span=10.0)
    (f,) = check_diaphragm_aspect_ratio(_model(box(0, 0, 2, 10)), alloc, config())
    assert f.severity is Severity.WARNING
    assert f.clause == "AWC SDPWS-2015 §4.2.4"
    assert f.demand == pytest.approx(5.0)
    assert f.capacity == 4.0
    assert f.guids == ("slab1", "w1", "w2")
    assert check_diaphragm_aspect_ratio(None, _box_case(), config()) == []  # 6/10 = 0.6


@given(Fx=st.floats(1e3, 1e7), ratio=st.floats(1.0, 2.0))
def test_reactions_add_up_to_fpx(Fx, ratio):
    # statics: the two line reactions of a single piece add up to its Fpx-scaled force
    dem = diaphragm_demands(_box_case(Fx=Fx, Fpx=ratio * Fx), config())
    total = sum(sum(s.reactions) for s in dem.shears)
    assert total == pytest.approx(ratio * Fx, rel=1e-9)
