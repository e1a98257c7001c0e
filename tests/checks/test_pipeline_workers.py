"""A check with worker processes gives exactly the findings of a one-process check.

Common practice: moving the geometry pass and the IDS validation (buildingSMART IDS 1.0,
validated by ifctester) into forked workers must not change any number or finding.
"""

from __future__ import annotations

import os

import pytest

import ifc_bridge._geometry as geometry
from checks.pipeline import check_model
from ifc_bridge import worker
from tests.conftest import SAMPLE_MODELS

DEMO = SAMPLE_MODELS / "demo_building.ifc"
CONFIG = SAMPLE_MODELS / "demo.toml"


@pytest.mark.skipif(not hasattr(os, "fork"), reason="os.fork is POSIX only")
def test_workers_change_no_finding_and_no_force(monkeypatch, forked_calls) -> None:
    monkeypatch.setenv("SHEARLINE_WORKERS", "0")
    serial = check_model(DEMO, CONFIG)
    monkeypatch.delenv("SHEARLINE_WORKERS")
    monkeypatch.setattr(worker, "PARALLEL_MIN", 0)  # the demo is small: force them
    monkeypatch.setattr(geometry, "PARALLEL_MIN", 0)
    monkeypatch.setattr(worker, "usable_cpus", lambda: 2)
    monkeypatch.setattr(worker.sys, "platform", "linux")
    timings: dict[str, float] = {}
    forked = check_model(DEMO, CONFIG, timings=timings)
    # two geometry workers (two cores) and the IDS worker really forked
    assert sorted(forked_calls) == ["geometry", "geometry", "requirements"]
    assert forked.model == serial.model
    assert forked.requirement_findings == serial.requirement_findings
    assert forked.findings == serial.findings
    assert forked.allocation.piers == serial.allocation.piers
    assert set(timings) == {
        "import",
        "open",
        "read",
        "allocate",
        "check",
        "requirements",
    }
    assert all(t >= 0.0 for t in timings.values())


def test_every_module_loaded_during_the_parse_exists() -> None:
    import importlib

    from checks.pipeline import _LATER_MODULES

    for name in _LATER_MODULES:
        assert importlib.import_module(name).__name__ == name
