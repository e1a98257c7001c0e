"""Seismic weight per level from slabs and walls (allocation.weights).

Reference values are hand calculations of ASCE 7-16 §12.7.2 (effective seismic weight)
with the common-practice take-off: slab area × dead load, plus half the height of the
walls below and above each level (a parapet's whole height to the level it stands on).
The building is the invented box of ``_box_building.py``: plan 20 m × 10 m, storeys
3 m, loads floor 700 Pa, roof 900 Pa, walls 500 Pa, assembly "CMU" 2000 Pa.
"""

from __future__ import annotations

import dataclasses
import math

import pytest
from hypothesis import given
from hypothesis import strategies as st
from shapely.geometry import box

from allocation.errors import ParameterError
from allocation.parameters import (
    AnalysisOptions,
    DeadLoads,
)
from allocation.weights import level_weights, wall_elevation_area, wall_unit_load
from ifc_bridge.model import BuildingModel, Opening
from tests.allocation import _box_building as bb

LOADS, OPTIONS = bb.LOADS, bb.OPTIONS


def by_source(level_load):
    return {
        (i.source, i.unit_load): (i.quantity, i.weight) for i in level_load.breakdown
    }


def test_box_building_hand_calculation():
    lv2, roof = level_weights(bb.box_building(), LOADS, OPTIONS)
    # Level 2 (hand calculation, ASCE 7-16 §12.7.2, common-practice tributary heights):
    #   floor 20 × 10 = 200 m² × 700 Pa                           = 140 000 N
    #   walls below, half of story 1 (h = 3 m, half = 1.5 m):
    #     S (20 × 3 − 2 × 2 door)/2 = 28, N 30, W 15 m² at 500 Pa  =  36 500 N
    #     E 10 × 1.5 = 15 m² at 2000 Pa (assembly CMU)             =  30 000 N
    #   walls above, half of story 2: 30 + 30 + 15 + 15 + 15 = 105 m² × 500 = 52 500 N
    #   extra                                                      =  10 000 N
    assert by_source(lv2) == {
        ("floor", 700.0): pytest.approx((200.0, 140_000.0)),
        ("walls below", 500.0): pytest.approx((73.0, 36_500.0)),
        ("walls below", 2000.0): pytest.approx((15.0, 30_000.0)),
        ("walls above", 500.0): pytest.approx((105.0, 52_500.0)),
        ("extra", 0.0): pytest.approx((0.0, 10_000.0)),
    }
    assert lv2.seismic_weight == pytest.approx(269_000.0, rel=1e-12)  # hand sum
    # Roof: 200 m² × 900 = 180 000; story 2 top halves 105 m² × 500 = 52 500;
    # parapet 20 m × 1 m whole, × 500 = 10 000 (common practice)
    assert by_source(roof) == {
        ("roof", 900.0): pytest.approx((200.0, 180_000.0)),
        ("walls below", 500.0): pytest.approx((105.0, 52_500.0)),
        ("walls above", 500.0): pytest.approx((20.0, 10_000.0)),
    }
    assert roof.seismic_weight == pytest.approx(242_500.0, rel=1e-12)  # hand sum
    assert (lv2.height, roof.height) == (3.0, 6.0)  # hx above the base (Ground, 0 m)
    assert (lv2.guid, roof.guid) == ("G-Level2", "G-Roof")


def test_box_building_masses_and_centroid():
    lv2, roof = level_weights(bb.box_building(), LOADS, OPTIONS)
    kinds = [(m.source, m.ref) for m in lv2.masses]
    assert kinds.count(("slab", "Level 2/D1")) == 1  # one slab item per diaphragm
    assert kinds.count(("extra", "Level 2/D1")) == 1  # extra spread over the diaphragm
    assert sorted(r for s, r in kinds if s == "wall") == sorted(
        ["W1S", "W1N", "W1W", "W1E", "W2S", "W2N", "W2W", "W2E", "W2P"]
    )
    east = next(m for m in lv2.masses if m.ref == "W1E")
    assert east.weight == pytest.approx(30_000.0)
    assert east.location == (20.0, 5.0)
    assert east.polygon is None  # a point item at the wall's mid-point
    # Hand calculation of the centre of mass (statics: Σw·x / Σw):
    #   x: 150 000 × 10 (slab + extra) + 14 000 × 10 + 15 000 × 10 + 30 000 × 20
    #      + 15 000 × 10 + 15 000 × 10 + 7 500 × 20 + 7 500 × 10 = 2 915 000
    #   y: 150 000 × 5 + 15 000 × 10 + 7 500 × 5 + 30 000 × 5 + 15 000 × 10
    #      + 7 500 × 5 × 3 = 1 350 000
    assert lv2.mass_centroid == pytest.approx(
        (2_915_000 / 269_000, 1_350_000 / 269_000)
    )
    # Roof: symmetric in x; y = (180 000 × 5 + 15 000 × 10 + 22 500 × 5 + 10 000 × 10)
    #       / 242 500
    assert roof.mass_centroid == pytest.approx((10.0, 1_262_500 / 242_500))


def test_seismic_base_excludes_weight_below():
    # ASCE 7-16 §12.7.2: W is the weight above the base; with the base at Level 2 only
    # the roof is a diaphragm level, and its weight is unchanged (hand sum 242 500 N)
    loads = DeadLoads(floor=700.0, roof=900.0, wall=500.0)
    (roof,) = level_weights(bb.box_building(), loads, OPTIONS, base_level="Level 2")
    assert roof.level == "Roof"
    assert roof.height == 3.0
    assert roof.seismic_weight == pytest.approx(242_500.0, rel=1e-12)


def test_level_without_diaphragm_lumps_to_nearest():
    # Common practice: weight on a level with no diaphragm goes to the nearest diaphragm
    # level. Only the roof is named; Level 2's slab and walls (269 000 − 10 000 extra)
    # join the roof: 259 000 + 242 500 = 501 500 N, nothing dropped
    options = dataclasses.replace(OPTIONS, diaphragm_levels=("Roof",))
    loads = dataclasses.replace(LOADS, extra=())
    (roof,) = level_weights(bb.box_building(), loads, options)
    assert roof.seismic_weight == pytest.approx(501_500.0, rel=1e-12)
    assert math.fsum(m.weight for m in roof.masses) == pytest.approx(501_500.0)


def test_wall_elevation_area_and_unit_load():
    door = Opening(guid="O1", start=1.0, end=2.0, bottom=0.0, top=2.1)
    off_end = Opening(guid="O2", start=3.5, end=5.0, bottom=1.0, top=4.0)  # clipped
    w = bb.wall("W", "Ground", "Level 2", 0.0, 3.0, (0.0, 0.0), (4.0, 0.0),
                openings=(door, off_end), assembly="CMU")  # fmt: skip
    # geometry: 4 × 3 − 1 × 2.1 − 0.5 × 2.0 = 8.9 m² (opening clipped to the wall)
    assert wall_elevation_area(w) == pytest.approx(8.9, rel=1e-12)
    assert wall_unit_load(w, LOADS, OPTIONS) == 2000.0  # assembly's own wall load
    assert wall_unit_load(w, LOADS, AnalysisOptions()) == 500.0  # loads.wall


def test_level_with_no_weight_names_its_guid():
    model = dataclasses.replace(bb.box_building(), walls=(), diaphragms=())
    with pytest.raises(
        ParameterError, match=r"level 'Level 2' \(GUID G-Level2\) has no"
    ):
        level_weights(model, dataclasses.replace(LOADS, extra=()), OPTIONS)


@pytest.mark.parametrize(
    ("loads", "options", "base", "needle"),
    [
        (LOADS, OPTIONS, "Attic", r"\[levels\].base = 'Attic' is not a level"),
        (LOADS, AnalysisOptions(diaphragm_levels=("Attic",)), "", "names 'Attic'"),
        (LOADS, AnalysisOptions(diaphragm_levels=("Ground",)), "", "at or below"),
        (DeadLoads(floor=1, roof=1, wall=1, extra=(("Attic", 5.0),)), OPTIONS, "",
         "loads.extra.Attic: no level"),
        (DeadLoads(floor=1, roof=1, wall=1, extra=(("Ground", 5.0),)), OPTIONS, "",
         "loads.extra.Ground: a level, but not a diaphragm level"),
        (LOADS, OPTIONS, "Roof", "no diaphragm level above the seismic base 'Roof'"),
    ],
)  # fmt: skip
def test_bad_names_are_one_line_errors(loads, options, base, needle):
    with pytest.raises(ParameterError, match=needle):
        level_weights(bb.box_building(), loads, options, base_level=base)


LOAD_ST = st.one_of(st.just(0.0), st.floats(1.0, 5e3))  # [Pa]; zero or a real load


@given(
    lx=st.floats(2.0, 60.0),
    ly=st.floats(2.0, 60.0),
    h1=st.floats(2.0, 6.0),
    h2=st.floats(2.0, 6.0),
    q=st.tuples(LOAD_ST, LOAD_ST, LOAD_ST),
    extra=st.one_of(st.just(0.0), st.floats(1.0, 1e6)),
    split=st.floats(0.2, 0.8),
)
def test_masses_add_up_to_seismic_weight(lx, ly, h1, h2, q, extra, split):
    # conservation: located masses and breakdown both add up to the level weight
    names = (("Ground", 0.0), ("Level 2", h1), ("Roof", h1 + h2))
    walls = (
        *bb.perimeter("A", "Ground", "Level 2", 0.0, h1, lx, ly),
        *bb.perimeter("B", "Level 2", "Roof", h1, h1 + h2, lx, ly),
        bb.wall("P", "Roof", "", h1 + h2, h1 + h2 + 1.0, (0.0, ly), (lx, ly)),
    )
    wings = (box(0, 0, split * lx, ly), box(split * lx + 0.5, 0, lx + 0.5, ly))
    model = BuildingModel(
        source="prop.ifc",
        schema="IFC4",
        levels=bb.levels(names),
        diaphragms=(
            bb.diaphragm("Level 2", h1, "FLOOR", wings[0], 1),
            bb.diaphragm("Level 2", h1, "FLOOR", wings[1], 2),
            bb.diaphragm("Roof", h1 + h2, "ROOF", box(0, 0, lx, ly)),
        ),
        walls=walls,
    )
    loads = DeadLoads(floor=q[0], roof=q[1], wall=q[2], extra=(("Level 2", extra),))
    if q[2] == 0.0 and ((q[0] == 0.0 and extra == 0.0) or q[1] == 0.0):
        with pytest.raises(ParameterError, match="has no seismic weight"):
            level_weights(model, loads, AnalysisOptions())  # a level weighs nothing
        return
    result = level_weights(model, loads, AnalysisOptions())
    for lv in result:
        total = math.fsum(m.weight for m in lv.masses)
        assert total == pytest.approx(lv.seismic_weight, rel=1e-12)
        assert math.fsum(i.weight for i in lv.breakdown) == lv.seismic_weight
    expected_roof = q[1] * lx * ly + q[2] * (lx + ly) * (h2 + lx / (lx + ly))
    assert result[1].seismic_weight == pytest.approx(expected_roof, rel=1e-9, abs=1e-9)
