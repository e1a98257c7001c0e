"""The forked worker gives the serial answer, and survives a worker that fails.

Common practice: work moved to another process must not change the result; a worker
that dies or raises is replaced by running the same function in the caller.
"""

from __future__ import annotations

import os

import numpy as np
import pytest

import ifc_bridge._geometry as geometry
import ifc_bridge._shape_pass as shape_pass
from ifc_bridge import worker
from ifc_bridge.open_file import open_ifc
from ifc_bridge.read_model import read_model
from tests.conftest import SAMPLE_MODELS, sample_path

needs_fork = pytest.mark.skipif(not hasattr(os, "fork"), reason="os.fork is POSIX only")
DEMO = SAMPLE_MODELS / "demo_building.ifc"


def _square(x: int) -> int:
    return x * x


def _pid_and(x: int) -> tuple[int, int]:
    return os.getpid(), x


def _dies_in_worker(parent: int) -> str:
    if os.getpid() != parent:
        os._exit(3)  # the worker dies without a word, as on a kernel crash
    return "ran here"


def _raises(x: int) -> int:
    msg = f"bad input {x}"
    raise ValueError(msg)


@needs_fork
def test_worker_runs_in_another_process_and_returns_its_value() -> None:
    pending = worker.start_call("test", _pid_and, 7, parallel=True)
    pid, value = pending.result()
    assert value == 7  # common practice: same result as the serial call
    assert pid != os.getpid()
    assert pending.result() == (pid, 7)  # asked again: the same, no second run


def test_serial_when_forbidden() -> None:
    pending = worker.start_call("test", _pid_and, 3, parallel=False)
    assert pending.pid == 0
    assert pending.result() == (os.getpid(), 3)


@needs_fork
def test_encode_and_decode_round_trip() -> None:
    pending = worker.start_call(
        "test", _square, 12, encode=str, decode=int, parallel=True
    )
    assert pending.result() == 144


@needs_fork
def test_a_worker_that_dies_is_replaced_by_the_serial_call(caplog) -> None:
    pending = worker.start_call("test", _dies_in_worker, os.getpid(), parallel=True)
    assert pending.result() == "ran here"
    assert "worker ended with status" in caplog.text


@needs_fork
def test_a_worker_that_raises_raises_the_same_error_here() -> None:
    pending = worker.start_call("test", _raises, 5, parallel=True)
    with pytest.raises(ValueError, match="bad input 5"):
        pending.result()


@needs_fork
def test_a_result_cut_short_is_replaced_by_the_serial_call(monkeypatch, caplog) -> None:
    real = worker._HEADER

    class _Overstated:  # the worker announces one byte more than it sends
        size = real.size
        unpack_from = staticmethod(real.unpack_from)

        @staticmethod
        def pack(n: int) -> bytes:
            return real.pack(n + 1)

    monkeypatch.setattr(worker, "_HEADER", _Overstated)
    pending = worker.start_call("test", _pid_and, 5, parallel=True)
    assert pending.result() == (os.getpid(), 5)  # common practice: the serial answer
    assert "worker ended with status" in caplog.text


@needs_fork
def test_a_worker_that_sent_its_result_is_reaped_without_waiting() -> None:
    import time

    pending = worker.start_call("test", _square, 9, parallel=True)
    pid = pending.pid
    assert pending.result() == 81
    deadline = time.monotonic() + 10.0
    while pid in worker._EXITING and time.monotonic() < deadline:
        time.sleep(0.01)
        worker._reap_exited()
    assert pid not in worker._EXITING
    with pytest.raises(ChildProcessError):
        os.waitpid(pid, 0)  # reaped: no zombie left


@needs_fork
def test_cancel_stops_the_worker() -> None:
    pending = worker.start_call("test", _square, 4, parallel=True)
    pid = pending.pid
    pending.cancel()
    assert pending.pid == 0
    with pytest.raises(ChildProcessError):
        os.waitpid(pid, 0)  # already reaped: no zombie left


def test_environment_switch_turns_workers_off(monkeypatch) -> None:
    monkeypatch.setenv("SHEARLINE_WORKERS", "0")
    assert worker.can_fork() is False
    assert worker.start_call("test", _square, 2).pid == 0


@needs_fork
def test_shapes_and_meshes_from_the_workers_equal_the_serial_pass(monkeypatch) -> None:
    ifc = open_ifc(DEMO)
    walls = ifc.by_type("IfcWall")
    slabs = ifc.by_type("IfcSlab")
    monkeypatch.setattr(shape_pass, "plain_solid", lambda body: None)  # mesh them all
    serial_shapes, serial = shape_pass.start_shapes(
        ifc, walls, slabs, 1.0, parallel=False
    ).result()
    monkeypatch.setattr(geometry, "PARALLEL_MIN", 1)
    monkeypatch.setattr(worker, "usable_cpus", lambda: 2)
    pending = shape_pass.start_shapes(ifc, walls, slabs, 1.0, parallel=True)
    forked_shapes, forked = pending.result()
    assert forked_shapes == serial_shapes
    assert forked.keys() == serial.keys() == {e.id() for e in (*walls, *slabs)}
    for key, mesh in serial.items():
        np.testing.assert_array_equal(forked[key].verts, mesh.verts)
        np.testing.assert_array_equal(forked[key].faces, mesh.faces)
        assert forked[key].kernel == mesh.kernel


@needs_fork
@pytest.mark.parametrize(
    "name",
    [
        "demo",
        "TallBuilding.ifc",  # BIM Whale 'Tall Building' sample, ifc_samples/README.md
        "Duplex_A_20110907.ifc",  # buildingSMART Duplex Apartment sample, README.md
    ],
)
def test_model_read_with_workers_equals_the_one_process_read(
    name: str, monkeypatch
) -> None:
    path = DEMO if name == "demo" else sample_path(name)
    monkeypatch.setenv("SHEARLINE_WORKERS", "0")
    serial = read_model(path)
    monkeypatch.delenv("SHEARLINE_WORKERS")
    monkeypatch.setattr(geometry, "PARALLEL_MIN", 0)
    monkeypatch.setattr(worker, "usable_cpus", lambda: 2)
    assert read_model(path) == serial
