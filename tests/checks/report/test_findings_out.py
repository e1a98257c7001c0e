"""Topics built once for findings.bcf and findings.json equal topics built per file.

Property (the contract of ``checks.report.findings_out.fresh_topics``): handing one
build of each finding's topic to both writers changes nothing. The files equal, byte
for byte, what ``write_bcf`` and ``topics_to_json`` write when each builds its own
topics from the same findings and the same date; the topics equal what
``topics_from_findings`` gives for all findings and for the error and warning ones.
"""

from __future__ import annotations

import dataclasses
import zipfile
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from checks.findings import Severity
from checks.report import findings_out
from checks.report.bcf_topics import topics_from_findings
from checks.report.bcf_write import write_bcf
from checks.report.findings_out import fresh_topics, write_findings
from checks.report.topics_json import topics_to_json
from tests.checks.report._demo_run import demo_run
from tests.checks.report._tiny_model import NOW


def _members(path: Path) -> list[tuple[str, bytes]]:
    with zipfile.ZipFile(path) as z:
        return [(i.filename, z.read(i)) for i in z.infolist()]


@pytest.mark.parametrize("version", ["2.1", "3.0"])
def test_files_equal_those_of_separately_built_topics(tmp_path, monkeypatch, version):
    run = demo_run()
    monkeypatch.setattr(findings_out, "as_utc", lambda when: NOW)  # the run date
    once, apart = tmp_path / "once", tmp_path / "apart"
    once.mkdir()
    apart.mkdir()
    write_findings(run, once, previous=None, version=version)
    kw = {
        "model": run.model,
        "author": run.config.author,
        "version": version,
        "project_name": run.config.name,
        "ifc_filename": Path(run.model.source).name,
        "now": NOW,
    }
    issues = [f for f in run.findings if f.severity is not Severity.INFO]
    assert issues, "the demo has error or warning findings"
    write_bcf(issues, apart / "findings.bcf", **kw)
    topics_to_json(run.findings, apart / "findings.json", **kw)
    assert _members(once / "findings.bcf") == _members(apart / "findings.bcf")
    assert (once / "findings.bcf").read_bytes() == (apart / "findings.bcf").read_bytes()
    assert (once / "findings.json").read_text(encoding="utf-8") == (
        apart / "findings.json"
    ).read_text(encoding="utf-8")


def _with_repeats(findings, picks):
    """The findings, shuffled, with some repeated under another severity (same id)."""
    out = list(findings)
    for at, src, severity in picks:
        copy = dataclasses.replace(findings[src % len(findings)], severity=severity)
        out.insert(at % (len(out) + 1), copy)
    return out


@settings(
    max_examples=15,
    deadline=None,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large],
)
@given(
    order=st.permutations(range(len(demo_run().findings))),
    picks=st.lists(
        st.tuples(st.integers(0, 99), st.integers(0, 99), st.sampled_from(Severity)),
        max_size=4,
    ),
)
def test_fresh_topics_equal_topics_from_findings(order, picks):
    run = demo_run()
    base = run.findings
    findings = _with_repeats([base[i] for i in order], picks)
    kw = {"model": run.model, "author": run.config.author, "now": NOW}
    every, issues = fresh_topics(run, findings, now=NOW, version="3.0")
    assert every == topics_from_findings(
        findings, bcf_version="3.0", project_name=run.config.name, **kw
    )
    wanted = [f for f in findings if f.severity is not Severity.INFO]
    assert issues.topics == topics_from_findings(wanted, **kw).topics
    assert (issues.bcf_version, issues.project_name) == (
        every.bcf_version,
        every.project_name,
    )
