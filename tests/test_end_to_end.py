"""The demo building end to end: CLI, outputs, equilibrium, round trip with revision 2.

Reference values: the scenario's own authoring inputs (sample_models/scenario.json) for
counts and areas; statics for the force sums; the official BCF XSDs for the BCF files.
"""

from __future__ import annotations

import json
import zipfile
from pathlib import Path

import pytest

from checks.cli import main
from checks.pipeline import check_model
from ifc_bridge.model import Direction

DEMO = Path(__file__).resolve().parents[1] / "sample_models"
IFC = DEMO / "demo_building.ifc"
IFC_FT = DEMO / "demo_building_ft_ifc2x3.ifc"
IFC_REV2 = DEMO / "demo_building_rev2.ifc"
CONFIG = DEMO / "demo.toml"


@pytest.fixture(scope="module")
def run():
    return check_model(IFC, CONFIG)


@pytest.fixture(scope="module")
def out_dir(tmp_path_factory):
    out = tmp_path_factory.mktemp("demo-out")
    code = main(
        [
            "check",
            str(IFC),
            "--config",
            str(CONFIG),
            "--out",
            str(out),
            "--annotate",
            "-q",
        ]
    )
    assert code == 1  # the demo is designed to have error findings (overstressed wall)
    return out


def test_every_output_is_written(out_dir):
    names = {p.name for p in out_dir.iterdir()}
    assert {
        "results.json",
        "findings.json",
        "findings.bcf",
        "report.html",
        "walls.csv",
        "lines.csv",
        "demo_building.shearline.ifc",
    } <= names


def test_results_json_lists_every_shear_wall(out_dir, run):
    doc = json.loads((out_dir / "results.json").read_text())
    assert doc["schema"] == "shearline.results/1"
    listed = {w["guid"] for w in doc["walls"]}
    shear = {w.guid for w in run.model.shear_walls if w.level}
    assert shear <= listed  # every shear wall that supports a level appears
    for w in doc["walls"]:
        assert set(w["force"]) == {"flexible", "rigid", "envelope"}


@pytest.mark.parametrize("direction", [Direction.X, Direction.Y])
def test_story_shear_equals_sum_of_wall_forces(run, direction):  # statics: ΣV = Vx
    for lv in run.allocation.levels:
        flex = next(
            f
            for f in run.allocation.flexible
            if f.level == lv.level and f.direction is direction
        )
        assert sum(flex.pier_forces.values()) == pytest.approx(lv.story_shear, rel=1e-9)
        for r in run.allocation.rigid:
            if r.level == lv.level and r.case.direction is direction:
                along = sum(
                    v
                    for k, v in r.pier_forces.items()
                    if _pier(run, k).direction is direction
                )
                assert abs(along) == pytest.approx(lv.story_shear, rel=1e-9)


def _pier(run, pier_id):
    return next(p for p in run.allocation.piers if p.id == pier_id)


def test_story_forces_add_up_to_base_shear(run):  # ASCE 7-16 Eq. 12.8-13
    total = sum(lv.story_force for lv in run.allocation.levels)
    assert total == pytest.approx(run.allocation.seismic.V, rel=1e-9)


def test_feet_ifc2x3_copy_gives_the_same_forces(
    run,
):  # same building, other units/schema
    ft = check_model(IFC_FT, CONFIG)
    assert ft.model.schema == "IFC2X3"
    assert pytest.approx(run.allocation.seismic.V, rel=1e-6) == ft.allocation.seismic.V
    a = {k: e.envelope for k, e in run.allocation.envelope.items()}
    b = {k: e.envelope for k, e in ft.allocation.envelope.items()}
    assert a.keys() == b.keys()
    for k in a:
        assert b[k] == pytest.approx(a[k], rel=1e-6, abs=1e-3)
    assert {f.id for f in ft.findings} == {f.id for f in run.findings}


def test_checking_twice_gives_identical_findings(run):  # idempotence
    again = check_model(IFC, CONFIG)
    assert [(f.id, f.title, f.demand) for f in again.findings] == [
        (f.id, f.title, f.demand) for f in run.findings
    ]


def test_bcf_zip_has_one_topic_per_error_or_warning(out_dir, run):
    with zipfile.ZipFile(out_dir / "findings.bcf") as z:
        markups = [n for n in z.namelist() if n.endswith("/markup.bcf")]
    issues = [f for f in run.findings if f.severity.value != "info"]
    assert len(markups) == len(issues)
    doc = json.loads((out_dir / "findings.json").read_text())
    assert len(doc["topics"]) == len(run.findings)  # the JSON keeps info findings too


def test_bcf_validates_against_official_xsd(out_dir):
    from tests.checks.report._bcf_xsd import assert_bcf_valid

    assert_bcf_valid(out_dir / "findings.bcf")


def test_annotated_copy_validates_and_original_untouched(out_dir):
    import ifcopenshell
    import ifcopenshell.util.element
    import ifcopenshell.validate

    before = IFC.read_bytes()
    f = ifcopenshell.open(str(out_dir / "demo_building.shearline.ifc"))
    logger = ifcopenshell.validate.json_logger()
    ifcopenshell.validate.validate(f, logger)
    assert logger.statements == []
    psets = [
        ifcopenshell.util.element.get_pset(w, "Shearline_WallResults")
        for w in f.by_type("IfcWall")
    ]
    assert any(p and p.get("EnvelopeShear_N", 0) > 0 for p in psets)
    assert IFC.read_bytes() == before


def test_revision_two_round_trip(out_dir, tmp_path):
    out2 = tmp_path / "rev2"
    code = main(
        [
            "check",
            str(IFC_REV2),
            "--config",
            str(CONFIG),
            "--out",
            str(out2),
            "--previous",
            str(out_dir / "findings.bcf"),
            "-q",
        ]
    )
    assert code in (0, 1)
    from checks.report.bcf_read import read_topics

    first = read_topics(out_dir / "findings.bcf")
    second = read_topics(out2 / "findings.bcf")
    before = {t.guid for t in first.topics}
    statuses = {t.guid: t.status for t in second.topics}
    assert before <= statuses.keys()  # nothing the first run wrote is lost
    assert "Closed" in {statuses[g] for g in before}  # revision 2 fixes something


def test_demo_command_runs(tmp_path):
    assert main(["demo", "--out", str(tmp_path), "-q"]) == 0
    assert (tmp_path / "report.html").is_file()


def test_closed_topic_quotes_the_revised_numbers(out_dir, tmp_path):
    out2 = tmp_path / "rev2"
    main(
        [
            "check",
            str(IFC_REV2),
            "--config",
            str(CONFIG),
            "--out",
            str(out2),
            "--previous",
            str(out_dir / "findings.bcf"),
            "-q",
        ]
    )
    from checks.report.bcf_read import read_topics

    closed = [
        t
        for t in read_topics(out2 / "findings.bcf").topics
        if t.status == "Closed" and "over capacity" in t.title
    ]
    assert closed, "revision 2 lengthens the overstressed wall"  # sample_models/README
    assert "Now: wall 'L2-C1' DCR" in closed[0].comments[-1].text


def test_the_run_keeps_the_open_file_for_lookups_by_globalid(run):
    # ISO 16739 (IFC): IfcRoot.GlobalId identifies an element; every pier names its
    # IfcWall by it
    pier = run.allocation.piers[0]
    wall = run.ifc.by_guid(pier.guid)
    assert wall.is_a("IfcWall")
    assert wall.Name == pier.name
