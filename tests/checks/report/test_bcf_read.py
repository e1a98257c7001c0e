"""Reading BCF zips (ours and another tool's) and our JSON into plain topic records."""

from __future__ import annotations

import zipfile

import pytest

from checks.errors import BcfError
from checks.findings import topic_guid
from checks.report.bcf_read import read_topics
from checks.report.bcf_write import write_bcf
from checks.report.topics_json import topics_to_json
from tests.checks.report._foreign import (
    FOREIGN_COMMENT,
    FOREIGN_PNG,
    FOREIGN_TOPIC,
    REPLY,
    add_foreign_topic,
    add_reply,
)
from tests.checks.report._tiny_model import (
    ARCHITECT,
    AUTHOR,
    LATER,
    NOW,
    gid,
    tiny_model,
    wall_finding,
)

VERSIONS = ["2.1", "3.0"]


def _ours(tmp_path, version):
    path = tmp_path / f"ours-{version}.bcf"
    write_bcf(
        [wall_finding("S")],
        path,
        model=tiny_model(),
        author=AUTHOR,
        version=version,
        now=NOW,
    )
    return path


@pytest.mark.parametrize("version", VERSIONS)
def test_reads_our_topics(tmp_path, version):
    topics = read_topics(_ours(tmp_path, version))
    assert (topics.source_kind, topics.bcf_version, topics.project_name) == (
        "bcf",
        version,
        "Tiny box",
    )
    (t,) = topics.topics
    f = wall_finding("S")
    assert t.guid == t.folder == topic_guid(f.id)
    assert (t.title, t.status, t.type, t.priority) == (f.title, "Open", "Error", "High")
    assert t.labels == ("shearline", "unit_shear", "Level 2", "X")
    assert t.is_ours
    assert (t.creation_date, t.creation_author) == (NOW, AUTHOR)
    (vp,) = t.viewpoints
    assert vp.selected == (gid("Level 1/S"),)
    assert vp.camera is not None
    assert vp.camera.kind == "perspective"
    assert vp.camera.field_of_view == 60.0
    assert vp.snapshot.startswith(b"\x89PNG")
    assert vp.file_name == "viewpoint.bcfv"
    assert b"<Markup" in t.raw_markup


@pytest.mark.parametrize("version", VERSIONS)
def test_reads_another_tools_topics_and_replies(tmp_path, version):
    path = _ours(tmp_path, version)
    guid = topic_guid(wall_finding("S").id)
    add_reply(path, path, guid, "Wall lengthened in rev C.", new_status="Closed")
    add_foreign_topic(path)
    topics = read_topics(path)
    ours = topics.get(guid)
    assert ours.status == "Closed"
    assert (ours.modified_date, ours.modified_author) == (LATER, ARCHITECT)
    assert [(c.guid, c.author, c.text, c.date) for c in ours.comments] == [
        (REPLY, ARCHITECT, "Wall lengthened in rev C.", LATER)
    ]
    foreign = topics.get(FOREIGN_TOPIC)
    assert not foreign.is_ours
    assert (foreign.title, foreign.type, foreign.creation_author) == (
        "Stair moved",
        "Request",
        ARCHITECT,
    )
    (vp,) = foreign.viewpoints
    assert (vp.selected, vp.snapshot, vp.file_name) == (
        (gid("slab2"),),
        FOREIGN_PNG,
        "stair.bcfv",
    )
    (c,) = foreign.comments
    assert (c.guid, c.viewpoint_guid) == (FOREIGN_COMMENT, vp.guid)


def test_reads_our_json(tmp_path):
    path = tmp_path / "topics.json"
    topics_to_json(
        [wall_finding("S")], path, model=tiny_model(), author=AUTHOR, now=NOW
    )
    topics = read_topics(path)
    assert topics.source_kind == "json"
    assert topics.topics[0].finding.finding_id == wall_finding("S").id


def _rewrite(src, dst, edit):
    with zipfile.ZipFile(src) as a, zipfile.ZipFile(dst, "w") as b:
        for info in a.infolist():
            name, data = edit(info.filename, a.read(info))
            b.writestr(name, data)
    return dst


def test_markup_with_a_doctype_is_refused(tmp_path):
    def xxe(name, data):
        if name.endswith("markup.bcf"):
            data = data.replace(
                b"<Markup",
                b'<!DOCTYPE Markup [<!ENTITY x SYSTEM "file:///etc/passwd">]>\n<Markup',
                1,
            )
        return name, data

    bad = _rewrite(_ours(tmp_path, "2.1"), tmp_path / "xxe.bcf", xxe)
    with pytest.raises(BcfError, match=r"markup\.bcf: XML with a DOCTYPE"):
        read_topics(bad)


def test_zip_slip_in_a_bcf_is_refused(tmp_path):
    def slip(name, data):
        return ("../../evil.bcfv" if name.endswith("viewpoint.bcfv") else name), data

    bad = _rewrite(_ours(tmp_path, "2.1"), tmp_path / "slip.bcf", slip)
    with pytest.raises(BcfError, match="unsafe name"):
        read_topics(bad)


def test_missing_version_is_refused(tmp_path):
    bad = _rewrite(
        _ours(tmp_path, "2.1"),
        tmp_path / "nover.bcf",
        lambda n, d: (("x.txt" if n == "bcf.version" else n), d),
    )
    with pytest.raises(BcfError, match=r"no bcf\.version"):
        read_topics(bad)


def test_missing_file_is_a_one_line_error(tmp_path):
    with pytest.raises(BcfError, match="no such BCF file") as err:
        read_topics(tmp_path / "nope.bcf")
    assert "\n" not in str(err.value)


def test_bad_date_names_the_member(tmp_path):
    def bad_date(name, data):
        if name.endswith("markup.bcf"):
            data = data.replace(
                b"2024-05-01T12:00:00Z</CreationDate>", b"yesterday</CreationDate>"
            )
        return name, data

    bad = _rewrite(_ours(tmp_path, "3.0"), tmp_path / "date.bcf", bad_date)
    with pytest.raises(BcfError, match=r"markup\.bcf: date 'yesterday'"):
        read_topics(bad)
