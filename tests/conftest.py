"""Shared test fixtures: the open IFC sample models and the demo scenario paths."""

from __future__ import annotations

from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
SAMPLE_MODELS = ROOT / "sample_models"
IFC_SAMPLES = (ROOT / ".." / "shared" / "ifc_samples").resolve()


@pytest.fixture
def ifc_samples() -> Path:
    """Folder of third-party IFC exports (../shared/ifc_samples); skip when absent."""
    if not IFC_SAMPLES.is_dir():
        pytest.skip(f"open IFC sample models not found at {IFC_SAMPLES}")
    return IFC_SAMPLES


def sample_path(name: str) -> Path:
    """Path of one sample model; skips the calling test when the folder is absent."""
    path = IFC_SAMPLES / name
    if not path.is_file():
        pytest.skip(f"open IFC sample model {name} not found in {IFC_SAMPLES}")
    return path


@pytest.fixture
def forked_calls(monkeypatch) -> list[str]:
    """Names of the worker calls (ifc_bridge.worker) that really forked in the test."""
    import ifc_bridge._shape_pass as shape_pass
    from ifc_bridge import worker

    started: list[str] = []
    real_start = worker.start_call

    def spy(name, *args, **kwargs):
        pending = real_start(name, *args, **kwargs)
        if pending.pid:
            started.append(name)
        return pending

    monkeypatch.setattr(worker, "start_call", spy)
    monkeypatch.setattr(shape_pass, "start_call", spy)  # imported by name there
    return started
