"""Writing the outputs in forked workers gives the same files as writing them here.

Common practice: moving ``report.html`` and the findings files into worker processes
(``os.fork``, POSIX)
must change no byte of any output, a failed worker must leave the serial result, and
an output that cannot be written is one clear error with no half-written file left.
"""

from __future__ import annotations

import json
import os
from pathlib import Path

import pytest

from checks import outputs
from checks.errors import OutputError
from checks.project import DisplayUnits
from tests.checks.report._demo_run import demo_run

needs_fork = pytest.mark.skipif(not hasattr(os, "fork"), reason="os.fork is POSIX")
_SAME_BYTES = ("results.json", "walls.csv", "lines.csv", "report.html")


def _write(out: Path, *, parallel: bool) -> dict[str, Path]:
    out.mkdir(parents=True, exist_ok=True)
    return outputs.write_all(
        demo_run(),
        out,
        previous=None,
        annotate=False,
        bcf_version="2.1",
        system=DisplayUnits.IMPERIAL,
        parallel=parallel,
    )


def _undated_topics(path: Path) -> list:
    topics = json.loads(path.read_text(encoding="utf-8"))["topics"]
    for t in topics:  # the creation date is the clock's
        t["topic"].pop("creation_date")
    return topics


@needs_fork
def test_forked_report_gives_the_same_files(tmp_path, forked_calls):
    serial = _write(tmp_path / "serial", parallel=False)
    started = forked_calls
    forked = _write(tmp_path / "forked", parallel=True)
    assert started == ["report", "tables and findings"]  # really written by workers
    assert list(forked) == list(serial)  # same kinds, same order
    for name in _SAME_BYTES:
        assert (tmp_path / "forked" / name).read_bytes() == (
            tmp_path / "serial" / name
        ).read_bytes(), name
    assert _undated_topics(forked["findings"]) == _undated_topics(serial["findings"])
    assert forked["bcf"].is_file()
    assert sorted(p.name for p in (tmp_path / "forked").iterdir()) == sorted(
        p.name for p in (tmp_path / "serial").iterdir()
    )  # no .part file left behind


@needs_fork
def test_a_failed_tables_and_findings_worker_is_replaced_by_the_serial_write(
    tmp_path, monkeypatch
):
    parent, real = os.getpid(), outputs._write_rest

    def fails_in_the_worker(run, out, previous, version, system):
        if os.getpid() != parent:
            msg = "worker failure for the test"
            raise RuntimeError(msg)
        return real(run, out, previous, version, system)

    monkeypatch.setattr(outputs, "_write_rest", fails_in_the_worker)
    serial = _write(tmp_path / "serial", parallel=False)
    written = _write(tmp_path / "forked", parallel=True)
    assert list(written) == list(serial)
    assert _undated_topics(written["findings"]) == _undated_topics(serial["findings"])
    assert written["bcf"].stat().st_size > 0
    for name in ("results.json", "walls.csv", "lines.csv"):
        assert (tmp_path / "forked" / name).read_bytes() == (
            tmp_path / "serial" / name
        ).read_bytes(), name


@needs_fork
def test_a_failed_worker_leaves_the_serial_report(tmp_path, monkeypatch):
    parent, real = os.getpid(), outputs._write_report

    def fails_in_the_worker(path, run, system):
        if os.getpid() != parent:
            msg = "worker failure for the test"
            raise RuntimeError(msg)
        return real(path, run, system)

    monkeypatch.setattr(outputs, "_write_report", fails_in_the_worker)
    _write(tmp_path / "serial", parallel=False)
    written = _write(tmp_path / "forked", parallel=True)
    assert (
        written["report"].read_bytes()
        == (tmp_path / "serial" / "report.html").read_bytes()
    )


@pytest.mark.parametrize(
    "parallel", [False, pytest.param(True, marks=needs_fork)], ids=["here", "worker"]
)
def test_a_report_that_cannot_be_written_is_one_error(tmp_path, parallel):
    out = tmp_path / "out"
    (out / "report.html").mkdir(parents=True)  # a folder where the file should go
    with pytest.raises(OutputError) as err:
        _write(out, parallel=parallel)
    assert "\n" not in str(err.value)
    assert str(out) in str(err.value)
    assert not (out / "report.html.part").exists()
