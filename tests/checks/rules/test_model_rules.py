"""Model data rules: import issues and shear walls with no assembly."""

from __future__ import annotations

from checks.findings import Severity
from checks.rules.model import check_import_issues, check_unmatched_shear_walls
from ifc_bridge.model import (
    BuildingModel,
    ImportIssue,
    IssueSeverity,
    Level,
    WallSegment,
)


def _wall(guid, *, type_name="SW-X", assembly="", shear=True):
    return WallSegment(
        guid=guid,
        name=f"W-{guid}",
        storey="Ground",
        level="Roof",
        base_elevation=0.0,
        top_elevation=2.5,
        start=(0.0, 0.0),
        end=(3.0, 0.0),
        thickness=0.15,
        type_name=type_name,
        predefined_type="SHEAR",
        is_shear_wall=shear,
        assembly=assembly,
    )


def _model(walls=(), issues=()):
    return BuildingModel(
        source="m.ifc",
        schema="IFC4",
        levels=(Level(name="Ground", guid="s0", elevation=0.0, index=0),),
        walls=tuple(walls),
        issues=tuple(issues),
    )


def test_issues_map_severity_and_guids():  # common practice: report on the element
    issues = [
        ImportIssue(
            code="wall_no_geometry",
            severity=IssueSeverity.ERROR,
            message="m.ifc: wall A: no body; give it a representation",
            guids=("A",),
            storey="Ground",
        ),
        ImportIssue(
            code="slab_skipped",
            severity=IssueSeverity.WARNING,
            message="m.ifc: slab B: not in a storey",
            guids=("B",),
        ),
        ImportIssue(code="units", severity=IssueSeverity.INFO, message="m.ifc: feet"),
        # the same problem on A reported twice with another message: merged, worst kept
        ImportIssue(
            code="wall_no_geometry",
            severity=IssueSeverity.WARNING,
            message="m.ifc: wall A: axis missing",
            guids=("A",),
            storey="Ground",
        ),
    ]
    found = check_import_issues(_model(issues=issues))
    assert [(f.severity, f.guids) for f in found] == [
        (Severity.ERROR, ("A",)),
        (Severity.WARNING, ("B",)),
        (Severity.INFO, ()),
    ]
    assert "axis missing" in found[0].description
    assert "no body" in found[0].description
    assert len({f.id for f in found}) == 3


def test_unmatched_shear_walls():
    walls = [
        _wall("A"),
        _wall("A"),
        _wall("B", assembly="WSP"),
        _wall("C", shear=False),
        _wall("D", type_name=""),
    ]
    found = check_unmatched_shear_walls(_model(walls), allocated={"D"})
    assert [(f.severity, f.guids) for f in found] == [(Severity.ERROR, ("A",))]
    assert "add an [[assemblies]] entry matching type 'SW-X'" in found[0].description
