"""The front door: config options, progress, model bookkeeping."""

from __future__ import annotations

import pytest

from ifc_bridge.model import IssueSeverity
from ifc_bridge.read_model import read_model
from tests.ifc_bridge._build import add_storey, box_building


def test_box_model_summary(schema, tmp_path):
    m = box_building(schema, "ft")
    model = read_model(m.write(tmp_path / "box.ifc"))
    assert model.schema == schema
    assert model.length_unit_scale == pytest.approx(
        0.3048
    )  # international foot, NIST SP 811 B.8
    assert [lv.elevation for lv in model.levels] == pytest.approx(
        [0.0, 3.0], abs=1e-6
    )  # authoring input
    assert model.ifc_wall_count == 4
    assert len(model.walls_supporting("Roof")) == 4
    assert [d.area for d in model.diaphragms] == pytest.approx(
        [60.0, 60.0]
    )  # 10 x 6 m, authoring input
    assert dict(model.storey_guids) == {lv.name: lv.guid for lv in model.levels}
    assert model.project_name == "Test project"
    assert not [i for i in model.issues if i.severity is IssueSeverity.ERROR]


def test_diaphragm_storeys_decide(tmp_path):
    m = box_building()
    add_storey(m, "Attic", 6.0)
    model = read_model(
        m.write(tmp_path / "box.ifc"), diaphragm_storeys=["Roof", "Attic"]
    )
    assert [lv.is_diaphragm_level for lv in model.levels] == [False, True, True]
    assert [d.level for d in model.diaphragms] == ["Roof"]
    (warn,) = [i for i in model.issues if i.code == "diaphragm_level_no_slab"]
    assert (warn.storey, warn.severity) == ("Attic", IssueSeverity.WARNING)


def test_progress_reports_each_stage(tmp_path):
    seen: list[tuple[str, int, int]] = []
    read_model(
        box_building().write(tmp_path / "box.ifc"), progress=lambda *a: seen.append(a)
    )
    stages = [s for s, _, _ in seen]
    assert stages[0] == "open"
    assert {"geometry", "slabs", "walls"} <= set(stages)
    assert all(done <= total for _, done, total in seen)


def test_predefined_type_switch(tmp_path):
    m = box_building()
    w1 = m.ifc.by_type("IfcWall")[0]
    w1.PredefinedType = "SHEAR"
    path = m.write(tmp_path / "shear.ifc")
    assert [w.is_shear_wall for w in read_model(path).walls].count(True) == 1
    assert not any(
        w.is_shear_wall for w in read_model(path, use_predefined_type=False).walls
    )
