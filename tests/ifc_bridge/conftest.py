"""Fixtures of the IFC reader's tests: one run per schema (IfcOpenShell bootstrap)."""

from __future__ import annotations

import pytest


@pytest.fixture(params=["IFC2X3", "IFC4", "IFC4X3"])
def schema(request: pytest.FixtureRequest) -> str:
    """Each in-memory test runs once per schema the reader supports."""
    return request.param
