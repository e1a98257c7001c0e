"""Each rules package re-exports its public names in a sorted ``__all__``."""

from __future__ import annotations

import importlib

import pytest

PACKAGES = [
    "checks.rules",
    "checks.rules.asce7_16",
    "checks.rules.sdpws_2015",
    "checks.rules.model",
]


@pytest.mark.parametrize("name", PACKAGES)
def test_all_is_sorted_and_importable(name):  # common practice: a checked public API
    module = importlib.import_module(name)
    assert list(module.__all__) == sorted(module.__all__)
    missing = [n for n in module.__all__ if not hasattr(module, n)]
    assert missing == []
