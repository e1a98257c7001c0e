"""Levels from IfcBuildingStorey: order, elevation, units, noise, duplicate names."""

from __future__ import annotations

import re

import pytest

from ifc_bridge.errors import IfcContentError
from ifc_bridge.open_file import open_ifc
from ifc_bridge.read_levels import clean_elevation, read_levels
from ifc_bridge.units import length_unit_scale
from tests.ifc_bridge._build import add_storey, new_model


def _levels(m, tmp_path):
    path = m.write(tmp_path / "levels.ifc")
    ifc = open_ifc(path)
    return read_levels(ifc, str(path), scale=length_unit_scale(ifc, str(path)))


@pytest.mark.parametrize(
    ("unit", "scale"),
    [
        ("m", 1.0),  # SI base unit
        ("mm", 0.001),  # SI prefix MILLI
        ("ft", 0.3048),  # international foot, exactly 0.3048 m (NIST SP 811 B.8)
        ("in", 0.0254),  # inch, exactly 0.0254 m (NIST SP 811 B.8)
    ],
)
def test_levels_sorted_and_scaled(schema, unit, scale, tmp_path):
    m = new_model(schema, unit)
    add_storey(m, "Roof", 6.0)
    add_storey(m, "Ground", 0.0)
    add_storey(m, "First", 3.0)
    path = m.write(tmp_path / "u.ifc")
    ifc = open_ifc(path)
    assert length_unit_scale(ifc, str(path)) == pytest.approx(
        scale, rel=1e-12
    )  # NIST SP 811
    got = read_levels(ifc, str(path), scale=scale)
    assert [lv.name for lv in got.levels] == [
        "Ground",
        "First",
        "Roof",
    ]  # authoring input
    assert [lv.elevation for lv in got.levels] == pytest.approx(
        [0.0, 3.0, 6.0], abs=1e-6
    )
    assert [lv.index for lv in got.levels] == [0, 1, 2]


def test_elevation_from_placement_when_missing(schema, tmp_path):
    m = new_model(schema, "mm")
    add_storey(m, "Ground", 0.0)
    add_storey(
        m, "Upper", 2.7, set_elevation=False
    )  # placement z only, authoring input
    got = _levels(m, tmp_path)
    assert got.levels[1].elevation == pytest.approx(2.7, abs=1e-6)


def test_storey_without_any_elevation_names_the_guid(schema, tmp_path):
    m = new_model(schema)
    add_storey(m, "Ground", 0.0)
    lost = add_storey(m, "Lost", 3.0, set_elevation=False)
    lost.ObjectPlacement = None
    with pytest.raises(IfcContentError, match=re.escape(lost.GlobalId)):
        _levels(m, tmp_path)


@pytest.mark.parametrize(
    ("raw", "expected"),
    [
        (-1.80478e-12, 0.0),  # PCERT sample's noise, ifc_samples/README.md
        (-3.4999999999999996, -3.5),  # IfcLCA 4x3 sample, ifc_samples/README.md
        (2.9999999999999996, 3.0),  # IfcLCA 4x3 sample, ifc_samples/README.md
    ],
)
def test_float_noise_is_rounded(raw, expected):
    assert clean_elevation(raw) == expected
    assert str(clean_elevation(-1e-9)) == "0.0"  # never -0.0 # common practice


def test_duplicate_names_are_made_unique(schema, tmp_path):
    m = new_model(schema)
    a = add_storey(m, "Level", 0.0)
    b = add_storey(m, "Level", 3.0)
    got = _levels(m, tmp_path)
    assert [lv.name for lv in got.levels] == [
        f"Level ({a.GlobalId})",
        f"Level ({b.GlobalId})",
    ]
    assert {i.code for i in got.issues} == {"storey_duplicate_name"}
    assert len(got.issues) == 2
