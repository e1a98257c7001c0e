"""Unusable files raise an IfcBridgeError subclass; one line naming the file."""

from __future__ import annotations

import re

import pytest

from ifc_bridge.errors import IfcContentError, IfcFileError, IfcSchemaError
from ifc_bridge.read_model import read_model
from tests.ifc_bridge._build import add_storey, box_building, new_model


def _check(exc: pytest.ExceptionInfo, path) -> None:
    text = str(exc.value)
    assert str(path) in text
    assert "\n" not in text


def test_missing_file(tmp_path):
    path = tmp_path / "nope.ifc"
    with pytest.raises(IfcFileError) as exc:
        read_model(path)
    _check(exc, path)


def test_text_file(tmp_path):
    path = tmp_path / "notes.ifc"
    path.write_text("this is not a model\n")
    with pytest.raises(IfcFileError, match="not an IFC-SPF file") as exc:
        read_model(path)
    _check(exc, path)


def test_truncated_file(tmp_path):
    whole = box_building().write(tmp_path / "whole.ifc").read_bytes()
    path = tmp_path / "half.ifc"
    path.write_bytes(whole[: len(whole) // 2])  # a valid file cut in half
    with pytest.raises(IfcFileError, match="truncated") as exc:
        read_model(path)
    _check(exc, path)


def test_garbled_data_section(tmp_path):
    whole = box_building().write(tmp_path / "whole.ifc").read_text()
    path = tmp_path / "garbled.ifc"
    path.write_text(whole.replace("DATA;", "DATA;\n#1=IFC(((((;\n@@@@\n", 1))
    with pytest.raises(IfcFileError) as exc:
        read_model(path)
    _check(exc, path)


def test_unknown_schema(tmp_path):
    whole = box_building().write(tmp_path / "whole.ifc").read_text()
    path = tmp_path / "ifc9.ifc"
    path.write_text(whole.replace("FILE_SCHEMA(('IFC4'))", "FILE_SCHEMA(('IFC9'))"))
    with pytest.raises(IfcSchemaError, match="IFC9") as exc:
        read_model(path)
    _check(exc, path)


def test_no_storeys(schema, tmp_path):
    path = new_model(schema).write(tmp_path / "empty.ifc")
    with pytest.raises(IfcContentError, match="IfcBuildingStorey") as exc:
        read_model(path)
    _check(exc, path)


def test_no_walls(schema, tmp_path):
    m = new_model(schema)
    add_storey(m, "Ground", 0.0)
    path = m.write(tmp_path / "nowalls.ifc")
    with pytest.raises(IfcContentError, match="has no IfcWall") as exc:
        read_model(path)
    _check(exc, path)


def test_storey_without_elevation_or_placement(schema, tmp_path):
    m = box_building(schema)
    lost = add_storey(m, "Lost", 9.0, set_elevation=False)
    lost.ObjectPlacement = None
    path = m.write(tmp_path / "lost.ifc")
    with pytest.raises(IfcContentError, match=re.escape(lost.GlobalId)) as exc:
        read_model(path)
    _check(exc, path)


def test_unknown_diaphragm_storey(tmp_path):
    path = box_building().write(tmp_path / "box.ifc")
    with pytest.raises(IfcContentError, match=r"'Mezzanine'.*'Ground', 'Roof'") as exc:
        read_model(path, diaphragm_storeys=["Mezzanine"])
    _check(exc, path)
