"""A finding about thousands of elements gets a light viewpoint; its text says so.

Common practice: BCF viewpoints select the elements a topic is about (BCF 2.1
visinfo.xsd ``Components/Selection``); one selecting thousands is slow to write and to
open, so the selection is capped and findings.json keeps the full list.
"""

from __future__ import annotations

import datetime as dt

from checks.findings import Finding, Severity
from checks.report.bcf_topics import MAX_SELECTED, topic_from_finding
from ifc_bridge.read_model import read_model
from tests.conftest import SAMPLE_MODELS


def _finding(guids: tuple[str, ...]) -> Finding:
    return Finding(
        rule="model_requirements",
        clause="buildingSMART IDS 1.0 shearline model requirements SL-04",
        severity=Severity.WARNING,
        level="",
        direction=None,
        guids=guids,
        title="Model requirement not met: Walls have a material",
        description="test",
        discriminator="SL-04",
    )


def test_selection_is_capped_and_the_description_says_so() -> None:
    model = read_model(SAMPLE_MODELS / "demo_building.ifc")
    walls = sorted({w.guid for w in model.walls})
    # invented GlobalId-like strings, more than the cap (unique, sorted)
    many = tuple(sorted({f"{g[:-2]}{k:02d}" for g in walls for k in range(40)}))
    assert len(many) > MAX_SELECTED
    now = dt.datetime(2026, 1, 1, tzinfo=dt.UTC)
    topic = topic_from_finding(_finding(many), model=model, author="a@b.c", now=now)
    (viewpoint,) = topic.viewpoints
    assert viewpoint.selected == many[:MAX_SELECTED]
    assert f"first {MAX_SELECTED} of the {len(many)} elements" in topic.description
    assert tuple(topic.finding.guids) == many  # the full list stays with the topic


def test_small_selection_is_whole() -> None:
    model = read_model(SAMPLE_MODELS / "demo_building.ifc")
    few = tuple(sorted({w.guid for w in model.walls}))[:5]
    now = dt.datetime(2026, 1, 1, tzinfo=dt.UTC)
    topic = topic_from_finding(_finding(few), model=model, author="a@b.c", now=now)
    assert topic.viewpoints[0].selected == few
    assert "selects the first" not in topic.description
