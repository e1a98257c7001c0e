"""Shear wall aspect ratio limits and factor (checks.rules.sdpws_2015.aspect_ratio)."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from allocation.parameters import AssemblyKind
from checks.findings import Severity
from checks.rules.sdpws_2015.aspect_ratio import (
    aspect_factor,
    aspect_ratio_limit,
    check_aspect_ratio,
)

from ._build import allocation, assembly, config, pier


@pytest.mark.parametrize(
    ("kind", "blocked", "limit"),
    [
        (
            AssemblyKind.WOOD_PANEL,
            True,
            3.5,
        ),  # AWC SDPWS-2015 §4.3.4, blocked WSP (from memory)
        (
            AssemblyKind.WOOD_PANEL,
            False,
            2.0,
        ),  # AWC SDPWS-2015 §4.3.4, unblocked (from memory)
        (
            AssemblyKind.GYPSUM,
            True,
            2.0,
        ),  # AWC SDPWS-2015 §4.3.4, gypsum board (from memory)
        (AssemblyKind.CONCRETE, True, None),  # no SDPWS limit for concrete
    ],
)
def test_limits(kind, blocked, limit):
    assert aspect_ratio_limit(assembly(kind=kind, blocked=blocked)) == limit


@pytest.mark.parametrize(
    ("ratio", "factor"),
    [
        (1.5, 1.0),  # h/bs ≤ 2: no reduction, AWC SDPWS-2015 §4.3.4.2 (from memory)
        (2.0, 1.0),  # 1.25 − 0.125·2.0 = 1.0, AWC SDPWS-2015 §4.3.4.2 (from memory)
        (3.0, 0.875),  # 1.25 − 0.125·3.0, AWC SDPWS-2015 §4.3.4.2 (from memory)
        (
            3.5,
            0.8125,
        ),  # 1.25 − 0.125·3.5 at the limit, AWC SDPWS-2015 §4.3.4.2 (from memory)
        (3.6, 0.0),  # beyond 3.5: not counted, AWC SDPWS-2015 §4.3.4 (from memory)
    ],
)
def test_factor(ratio, factor):
    assert aspect_factor(assembly(), ratio) == pytest.approx(factor, rel=1e-12)


def test_override_and_gypsum_has_no_factor():
    from dataclasses import replace

    a = replace(assembly(), aspect_ratio_limit=2.0)
    assert aspect_factor(a, 2.5) == 0.0
    assert aspect_factor(assembly(kind=AssemblyKind.GYPSUM), 1.9) == 1.0


def test_slender_pier_is_an_error():
    tall = pier("g1", start=(0.0, 0.0), end=(0.6, 0.0), height=2.5)  # h/b = 4.17 > 3.5
    ok = pier("g2", start=(0.0, 5.0), end=(1.0, 5.0), height=2.5)  # h/b = 2.5 ≤ 3.5
    found = check_aspect_ratio(allocation([tall, ok]), config(assemblies=(assembly(),)))
    assert len(found) == 1
    f = found[0]
    assert f.severity is Severity.ERROR
    assert f.guids == ("g1",)
    assert f.clause == "AWC SDPWS-2015 §4.3.4"
    assert f.demand == pytest.approx(2.5 / 0.6)
    assert f.capacity == 3.5


@given(ratio=st.floats(2.0, 3.5))
def test_factor_is_continuous_and_decreasing(ratio):
    # the factor falls linearly from 1.0 at h/bs = 2 to 0.8125 at 3.5
    f = aspect_factor(assembly(), ratio)
    assert 0.8125 - 1e-12 <= f <= 1.0 + 1e-12
    assert f == pytest.approx(1.0 - 0.125 * (ratio - 2.0), abs=1e-12)
