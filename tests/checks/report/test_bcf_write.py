"""BCF-XML writer: layout, official XSDs, bcf-client read-back, camera, determinism."""

from __future__ import annotations

import datetime as dt
import io
import math
import zipfile

import bcf.bcfxml
import pytest
from PIL import Image

from checks.errors import BcfError
from checks.findings import Severity, topic_guid
from checks.report.bcf_write import write_bcf
from tests.checks.report._bcf_xsd import assert_bcf_valid, bcf_xsd_errors
from tests.checks.report._tiny_model import (
    AUTHOR,
    NOW,
    diaphragm_finding,
    gid,
    tiny_model,
    wall_finding,
)

VERSIONS = ["2.1", "3.0"]


def _write(tmp_path, version, findings=None, **kw):
    path = tmp_path / f"out-{version}.bcf"
    findings = (
        [wall_finding("S"), diaphragm_finding()] if findings is None else findings
    )
    kw.setdefault("now", NOW)
    write_bcf(
        findings,
        path,
        model=tiny_model(),
        author=AUTHOR,
        version=version,
        ifc_filename="tiny.ifc",
        **kw,
    )
    return path


@pytest.mark.parametrize("version", VERSIONS)
def test_output_validates_against_the_official_xsds(
    tmp_path, version
):  # BCF-XML 2.1 / 3.0 XSDs
    assert_bcf_valid(_write(tmp_path, version))


def test_xsd_helper_rejects_a_broken_markup(tmp_path):  # the helper is not vacuous
    path = _write(tmp_path, "2.1")
    broken = tmp_path / "broken.bcf"
    with zipfile.ZipFile(path) as src, zipfile.ZipFile(broken, "w") as dst:
        for info in src.infolist():
            data = src.read(info)
            if info.filename.endswith("markup.bcf"):
                data = data.replace(b"<CreationAuthor>", b"<Author>").replace(
                    b"</CreationAuthor>", b"</Author>"
                )
            dst.writestr(info.filename, data)
    assert any("markup.bcf" in e for e in bcf_xsd_errors(broken))


@pytest.mark.parametrize("version", VERSIONS)
def test_zip_layout(tmp_path, version):
    f = wall_finding("S")
    folder = topic_guid(f.id)
    names = set(zipfile.ZipFile(_write(tmp_path, version, [f])).namelist())
    expected = {
        "bcf.version",
        "project.bcfp",
        f"{folder}/markup.bcf",
        f"{folder}/viewpoint.bcfv",
        f"{folder}/snapshot.png",
    }
    if version == "3.0":
        expected.add("extensions.xml")
    # BCF-XML 2.1 README: one viewpoint.bcfv + snapshot.png per topic
    # (the IfcOpenShell #7152 workaround)
    assert expected <= names
    assert {n for n in names if not n.endswith("/")} == expected


@pytest.mark.parametrize("version", VERSIONS)
def test_topic_fields_read_back_with_bcf_client(tmp_path, version):
    f = wall_finding("S")
    with bcf.bcfxml.load(_write(tmp_path, version, [f])) as b:
        assert b.version.version_id == version
        assert b.project.name == "Tiny box"
        ((folder, th),) = b.topics.items()
        t = th.topic
        assert folder == t.guid == topic_guid(f.id)
        assert (t.title, t.topic_type, t.topic_status, t.priority) == (
            f.title,
            "Error",
            "Open",
            "High",
        )
        labels = t.labels.label if version == "3.0" else t.labels
        assert labels == ["shearline", "unit_shear", "Level 2", "X"]
        assert t.creation_author == AUTHOR
        assert (
            t.creation_date.to_datetime() == NOW
        )  # UTC, not naive local time (bcf-client bug 4)
        assert "SDPWS 2015 §4.3" in t.description
        assert "5000 N/m" in t.description
        assert "3800 N/m" in t.description
        files = th.header.files.file if version == "3.0" else th.header.file
        assert [(x.filename, x.ifc_project) for x in files] == [
            ("tiny.ifc", gid("project"))
        ]
        (vh,) = th.viewpoints.values()
        assert vh.get_selected_guids() == [gid("Level 1/S")]
        image = Image.open(io.BytesIO(vh.snapshot))
        assert (image.format, image.size) == ("PNG", (800, 600))


def test_dates_are_written_with_a_utc_designator(
    tmp_path,
):  # BCF-XML 3.0 README "DateTime Format"
    path = _write(tmp_path, "2.1", [wall_finding("S")])
    with zipfile.ZipFile(path) as z:
        markup = next(z.read(n) for n in z.namelist() if n.endswith("markup.bcf"))
    assert b"<CreationDate>2024-05-01T12:00:00Z</CreationDate>" in markup


def test_naive_now_is_taken_as_utc(tmp_path):
    (tmp_path / "a").mkdir()
    (tmp_path / "b").mkdir()
    a = _write(tmp_path / "a", "2.1", now=NOW)
    b = _write(tmp_path / "b", "2.1", now=NOW.replace(tzinfo=None))
    assert a.read_bytes() == b.read_bytes()


@pytest.mark.parametrize("version", VERSIONS)
def test_same_inputs_give_the_same_bytes(tmp_path, version):
    (tmp_path / "a").mkdir()
    (tmp_path / "b").mkdir()
    assert (
        _write(tmp_path / "a", version).read_bytes()
        == _write(tmp_path / "b", version).read_bytes()
    )


def test_extensions_declare_what_the_topics_use(tmp_path):  # BCF-XML 3.0 extensions.xsd
    with bcf.bcfxml.load(_write(tmp_path, "3.0")) as b:
        ext = b.extensions
        assert {"Error", "Warning"} <= set(ext.topic_types.topic_type)
        assert {"Open", "Closed", "ReOpened"} <= set(ext.topic_statuses.topic_status)
        assert {"High", "Normal"} <= set(ext.priorities.priority)
        assert {"shearline", "unit_shear", "reentrant_corner", "Level 2", "X"} <= set(
            ext.topic_labels.topic_label
        )


@pytest.mark.parametrize(
    ("severity", "priority", "topic_type"),
    [
        (Severity.ERROR, "High", "Error"),
        (Severity.WARNING, "Normal", "Warning"),
        (Severity.INFO, "Low", "Info"),
    ],
)
def test_priority_and_type_follow_severity(tmp_path, severity, priority, topic_type):
    from dataclasses import replace

    f = replace(wall_finding("S"), severity=severity)
    with bcf.bcfxml.load(_write(tmp_path, "2.1", [f])) as b:
        (th,) = b.topics.values()
        assert (th.topic.priority, th.topic.topic_type) == (priority, topic_type)


def _camera(path):
    with bcf.bcfxml.load(path) as b:
        (th,) = b.topics.values()
        (vh,) = th.viewpoints.values()
        cam = vh.visualization_info.perspective_camera
        return (
            (cam.camera_view_point.x, cam.camera_view_point.y, cam.camera_view_point.z),
            (cam.camera_direction.x, cam.camera_direction.y, cam.camera_direction.z),
            (cam.camera_up_vector.x, cam.camera_up_vector.y, cam.camera_up_vector.z),
            cam.field_of_view,
        )


def _dot(a, b):
    return sum(x * y for x, y in zip(a, b, strict=True))


@pytest.mark.parametrize(
    ("finding", "lo", "hi"),
    [
        (
            wall_finding("S"),
            (-0.1, -0.1, 0.0),
            (10.1, 0.1, 3.0),
        ),  # the south wall, 0.2 m thick, 3 m high
        (
            diaphragm_finding(),
            (0.0, 0.0, 3.0),
            (10.0, 8.0, 3.0),
        ),  # the Level 2 slab outline
    ],
)
def test_camera_frames_the_elements(tmp_path, finding, lo, hi):
    eye, direction, up, fov = _camera(_write(tmp_path, "3.0", [finding]))
    centre = [(a + b) / 2 for a, b in zip(lo, hi, strict=True)]
    to_centre = [c - e for c, e in zip(centre, eye, strict=True)]
    dist = math.sqrt(_dot(to_centre, to_centre))
    # looks straight at the box centre: the ray from the eye along the direction hits it
    assert _dot(to_centre, direction) / dist == pytest.approx(1.0, abs=1e-9)
    # from above: BCF cameras are world metres, Z up (BCF-API 3.0 README §1.3)
    assert direction[2] < 0
    assert eye[2] > hi[2]
    # unit vectors, up perpendicular to direction (BCF-XML README: not parallel)
    assert _dot(direction, direction) == pytest.approx(1.0)
    assert _dot(up, up) == pytest.approx(1.0)
    assert _dot(up, direction) == pytest.approx(0.0, abs=1e-12)
    # the bounding sphere fits the vertical field of view: d >= r / sin(fov / 2)
    radius = math.dist(lo, hi) / 2
    assert dist >= radius / math.sin(math.radians(fov) / 2) - 1e-9


def test_unknown_version_is_an_error(tmp_path):
    with pytest.raises(BcfError, match=r"'2\.0' is not supported"):
        _write(tmp_path, "2.0")


def test_no_findings_gives_a_valid_empty_bcf(tmp_path):
    path = _write(tmp_path, "2.1", [])
    assert_bcf_valid(path)
    with bcf.bcfxml.load(path) as b:
        assert b.topics == {}


def test_naive_dates_are_not_local_time(tmp_path):
    path = _write(
        tmp_path, "3.0", [wall_finding("S")], now=dt.datetime(2024, 5, 1, 12, 0, 0)
    )
    with bcf.bcfxml.load(path) as b:
        (th,) = b.topics.values()
        assert th.topic.creation_date.to_datetime().utcoffset() == dt.timedelta(0)
