"""Re-check a revised model against the previous BCF.

Close, keep open, re-open and add our topics; keep everyone else's content.
"""

from __future__ import annotations

import datetime as dt
import logging
import zipfile

import bcf.bcfxml
import pytest

from checks.findings import topic_guid
from checks.report.bcf_read import read_topics
from checks.report.bcf_topics import Comment, Topic, Topics
from checks.report.bcf_write import write_bcf
from checks.report.topics_json import topics_to_json
from checks.roundtrip import Action, apply_plan, merge_topics
from tests.checks.report._bcf_xsd import assert_bcf_valid
from tests.checks.report._foreign import (
    FOREIGN_TOPIC,
    REPLY,
    SKETCH,
    add_foreign_topic,
    add_loose_file,
    add_reply,
    new_guid,
)
from tests.checks.report._tiny_model import (
    ARCHITECT,
    AUTHOR,
    LATER,
    NOW,
    tiny_model,
    wall_finding,
)

RECHECK = dt.datetime(2024, 7, 1, 8, 0, 0, tzinfo=dt.UTC)
AGAIN = dt.datetime(2024, 8, 1, 8, 0, 0, tzinfo=dt.UTC)
VERSIONS = ["2.1", "3.0"]
S, E, N = wall_finding("S"), wall_finding("E"), wall_finding("N", storey="Level 2")
S_T, E_T, N_T = topic_guid(S.id), topic_guid(E.id), topic_guid(N.id)


# ---- the plan, on records ----------------------------------------------------


def _topic(guid, status, *, ours=True):
    labels = ("shearline", "unit_shear") if ours else ("architecture",)
    return Topic(
        guid=guid,
        title=guid,
        status=status,
        type="Error",
        labels=labels,
        creation_date=NOW,
        creation_author=AUTHOR,
    )


def _previous(*topics):
    return Topics(source="prev.bcf", source_kind="bcf", topics=topics)


def test_plan_closes_keeps_reopens_adds_and_leaves_foreign_topics():
    foreign = new_guid()
    previous = _previous(
        _topic(S_T, "Open"),  # its finding is gone
        _topic(E_T, "Closed"),  # the team closed it but it still holds
        _topic(topic_guid(wall_finding("W").id), "Open"),  # still holds, still open
        _topic(
            topic_guid(wall_finding("S", storey="Level 2").id), "Closed"
        ),  # gone, already closed
        _topic(foreign, "Open", ours=False),  # another author's topic
    )
    plan = merge_topics(
        previous,
        [E, wall_finding("W"), N],
        author=AUTHOR,
        now=RECHECK,
        ifc_filename="rev-b.ifc",
    )
    assert [c.topic_guid for c in plan.of_action(Action.CLOSE)] == [S_T]
    assert [c.topic_guid for c in plan.of_action(Action.REOPEN)] == [E_T]
    assert [c.topic_guid for c in plan.of_action(Action.KEEP_OPEN)] == [
        topic_guid(wall_finding("W").id)
    ]
    assert [f.id for f in plan.added] == [N.id]
    assert plan.untouched == (
        topic_guid(wall_finding("S", storey="Level 2").id),
        foreign,
    )
    close = plan.of_action(Action.CLOSE)[0]
    assert (close.new_status, close.comment.text) == (
        "Closed",
        "Re-check on rev-b.ifc: no longer found; closed by shearline.",
    )
    reopen = plan.of_action(Action.REOPEN)[0]
    assert reopen.new_status == "ReOpened"
    assert "re-opened by shearline" in reopen.comment.text
    assert "Demand 5000 N/m" in reopen.comment.text
    keep = plan.of_action(Action.KEEP_OPEN)[0]
    assert keep.new_status is None
    assert "still found" in keep.comment.text
    assert {c.comment.author for c in plan.changes} == {AUTHOR}
    assert {c.comment.date for c in plan.changes} == {RECHECK}


def test_plan_is_deterministic():
    previous = _previous(_topic(S_T, "Open"))
    a = merge_topics(previous, [E], author=AUTHOR, now=RECHECK)
    b = merge_topics(previous, [E], author=AUTHOR, now=RECHECK)
    assert a == b


def test_apply_plan_appends_and_never_edits():
    reply = Comment(guid=REPLY, date=LATER, author=ARCHITECT, text="Lengthened.")
    old = _topic(S_T, "Open")
    old = Topic(**{**{k: getattr(old, k) for k in old.__slots__}, "comments": (reply,)})
    previous = _previous(old)
    merged = apply_plan(
        previous,
        merge_topics(previous, [N], author=AUTHOR, now=RECHECK),
        model=tiny_model(),
    )
    s = merged.get(S_T)
    assert s.status == "Closed"
    assert (s.modified_date, s.modified_author) == (
        RECHECK,
        AUTHOR,
    )
    assert s.comments[0] == reply
    assert len(s.comments) == 2
    assert merged.get(N_T).status == "Open"


# ---- the round trip through files --------------------------------------------


def _first_run(tmp_path, version):
    """Run 1 on the original model, then the design team's edits with their own tool."""
    path = tmp_path / f"run1-{version}.bcf"
    write_bcf(
        [S, E],
        path,
        model=tiny_model(),
        author=AUTHOR,
        version=version,
        ifc_filename="tiny.ifc",
        now=NOW,
    )
    add_reply(path, path, S_T, "South wall lengthened in rev B.")
    add_reply(path, path, E_T, "Accepted as is.", new_status="Closed", guid=new_guid())
    add_foreign_topic(path)
    add_loose_file(path, f"{FOREIGN_TOPIC}/sketch.pdf")
    add_loose_file(
        path, f"{S_T}/markup-notes.txt", b"our own note kept by the team's tool\n"
    )
    return path


def _recheck(previous_path, out, version, now=RECHECK):
    revised = tiny_model(south_wall_at_level_1=False)  # S is gone; E still over; N new
    previous = read_topics(previous_path)
    write_bcf(
        [E, N],
        out,
        model=revised,
        author=AUTHOR,
        version=version,
        ifc_filename="tiny-rev-b.ifc",
        previous=previous,
        now=now,
    )
    return previous


@pytest.mark.parametrize("version", VERSIONS)
def test_recheck_updates_our_topics_and_keeps_everything_else(tmp_path, version):
    run1 = _first_run(tmp_path, version)
    out = tmp_path / f"run2-{version}.bcf"
    before = _recheck(run1, out, version)
    assert_bcf_valid(out)  # BCF-XML 2.1 / 3.0 XSDs
    after = read_topics(out)
    assert after.bcf_version == version
    s, e, n = after.get(S_T), after.get(E_T), after.get(N_T)
    assert s.status == "Closed"
    assert (
        s.comments[:-1] == before.get(S_T).comments
    )  # the architect's reply, unchanged
    assert (s.comments[-1].author, s.comments[-1].date) == (AUTHOR, RECHECK)
    assert (
        s.comments[-1].text
        == "Re-check on tiny-rev-b.ifc: no longer found; closed by shearline."
    )
    assert e.status == "ReOpened"
    assert "re-opened" in e.comments[-1].text
    assert e.comments[:-1] == before.get(E_T).comments
    assert (n.status, n.creation_date, n.viewpoints[0].file_name) == (
        "Open",
        RECHECK,
        "viewpoint.bcfv",
    )
    assert after.get(FOREIGN_TOPIC) == before.get(
        FOREIGN_TOPIC
    )  # markup bytes, comment, viewpoint, snapshot
    with zipfile.ZipFile(out) as z:
        assert z.read(f"{FOREIGN_TOPIC}/sketch.pdf") == SKETCH
        assert z.read(f"{S_T}/markup-notes.txt").startswith(b"our own note")
        assert z.read(f"{S_T}/snapshot.png") == zipfile.ZipFile(run1).read(
            f"{S_T}/snapshot.png"
        )


@pytest.mark.parametrize("version", VERSIONS)
def test_foreign_reply_survives_write_read_write(tmp_path, version):
    run1 = _first_run(tmp_path, version)
    run2, run3 = tmp_path / "run2.bcf", tmp_path / "run3.bcf"
    _recheck(run1, run2, version)
    _recheck(run2, run3, version, now=AGAIN)
    assert_bcf_valid(run3)
    final = read_topics(run3)
    reply = next(c for c in final.get(S_T).comments if c.guid == REPLY)
    assert (reply.author, reply.text, reply.date) == (
        ARCHITECT,
        "South wall lengthened in rev B.",
        LATER,
    )
    assert (
        len(final.get(S_T).comments) == 2
    )  # a closed topic whose finding stays gone is left alone
    assert final.get(E_T).status == "ReOpened"
    assert len(final.get(E_T).comments) == 3
    assert final.get(FOREIGN_TOPIC) == read_topics(run1).get(FOREIGN_TOPIC)
    with bcf.bcfxml.load(run3) as b:  # and bcf-client still reads it
        assert set(b.topics) == {S_T, E_T, N_T, FOREIGN_TOPIC}


@pytest.mark.parametrize("version", VERSIONS)
def test_recheck_output_is_deterministic(tmp_path, version):
    run1 = _first_run(tmp_path, version)
    a, b = tmp_path / "a.bcf", tmp_path / "b.bcf"
    _recheck(run1, a, version)
    _recheck(run1, b, version)
    assert a.read_bytes() == b.read_bytes()


def _edit_zip(src, dst, edit):
    with zipfile.ZipFile(src) as a, zipfile.ZipFile(dst, "w") as b:
        for info in a.infolist():
            item = edit(info.filename, a.read(info))
            if item is not None:
                b.writestr(*item)
    return dst


def test_misnamed_topic_folder_keeps_its_viewpoint(tmp_path):  # bcf-client bug 5 guard
    run1 = _first_run(tmp_path, "2.1")
    odd = _edit_zip(
        run1, tmp_path / "odd.bcf", lambda n, d: (n.replace(S_T, "misnamed-folder"), d)
    )
    out = tmp_path / "out.bcf"
    _recheck(odd, out, "2.1")
    assert_bcf_valid(out)
    s = read_topics(out).get(S_T)
    assert s.folder == S_T
    assert s.status == "Closed"
    assert s.viewpoints[0].snapshot is not None
    assert s.viewpoints[0].selected


def test_3_0_file_without_extensions_is_updated(tmp_path):  # bcf-client bug 7 guard
    run1 = _first_run(tmp_path, "3.0")
    bare = _edit_zip(
        run1,
        tmp_path / "bare.bcf",
        lambda n, d: None if n == "extensions.xml" else (n, d),
    )
    out = tmp_path / "out.bcf"
    _recheck(bare, out, "3.0")
    assert_bcf_valid(out)
    with bcf.bcfxml.load(out) as b:
        assert {"Closed", "ReOpened"} <= set(b.extensions.topic_statuses.topic_status)


def test_an_update_keeps_the_previous_version(tmp_path, caplog):
    run1 = _first_run(tmp_path, "2.1")
    out = tmp_path / "out.bcf"
    with caplog.at_level(logging.WARNING):
        _recheck(run1, out, "3.0")
    assert read_topics(out).bcf_version == "2.1"
    assert "keeps 2.1" in caplog.text


@pytest.mark.parametrize("version", VERSIONS)
def test_previous_json_gives_a_merged_bcf_and_json(tmp_path, version):
    prev_json = tmp_path / "run1.json"
    topics_to_json(
        [S, E], prev_json, model=tiny_model(), author=AUTHOR, version=version, now=NOW
    )
    previous = read_topics(prev_json)
    revised = tiny_model(south_wall_at_level_1=False)
    out_bcf, out_json = tmp_path / "run2.bcf", tmp_path / "run2.json"
    kw = {
        "model": revised,
        "author": AUTHOR,
        "version": version,
        "previous": previous,
        "now": RECHECK,
    }
    write_bcf([E, N], out_bcf, **kw)
    topics_to_json([E, N], out_json, **kw)
    assert_bcf_valid(out_bcf)
    for topics in (read_topics(out_bcf), read_topics(out_json)):
        assert [(t.guid, t.status) for t in topics.topics] == [
            (S_T, "Closed"),
            (E_T, "Open"),
            (N_T, "Open"),
        ]
        assert "still found" in topics.get(E_T).comments[-1].text
