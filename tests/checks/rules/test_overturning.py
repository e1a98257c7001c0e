"""Hold-down tension from overturning (checks.rules.asce7_16.overturning)."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from checks.findings import Severity
from checks.project import DesignBasis
from checks.rules.asce7_16.overturning import check_overturning, hold_down_forces

from ._build import PSF, allocation, assembly, config, pier

# Pier 2.0 m long, 3.0 m high, QE = 20 kN, wall dead load 10 psf = 478.80 Pa, SDS = 1.0.
D = 10 * PSF * 3.0 * 2.0  # wall self weight = 2872.8 N


def _case(basis, **kw):
    p = pier("g1", start=(0.0, 0.0), end=(2.0, 0.0), height=3.0)
    return (
        p,
        allocation([p], {p.id: 20e3}),
        config(assemblies=(assembly(**kw),), basis=basis),
    )


def test_asd_combination_10():
    p, alloc, cfg = _case(DesignBasis.ASD)
    h = hold_down_forces(alloc, cfg)[p.id]
    assert h.dead_load == pytest.approx(D, rel=1e-12)
    assert h.overturning_moment == pytest.approx(
        0.7 * 20e3 * 3.0
    )  # 0.7·QE·h, ASCE 7-16 §2.4.5
    assert h.resisting_moment == pytest.approx(
        (0.6 - 0.14 * 1.0) * D * 2.0 / 2
    )  # comb. 10
    # T = (42000 − 0.46·2872.82·1.0)/2.0 = 20339.25 N, ASCE 7-16 §2.4.5 combination 10
    assert h.tension == pytest.approx(20339.25, rel=1e-6)


def test_lrfd_combination_7():
    p, alloc, cfg = _case(DesignBasis.LRFD)
    h = hold_down_forces(alloc, cfg)[p.id]
    # T = (60000 − 0.7·2872.8·1.0)/2.0 = 28994.5 N, ASCE 7-16 §2.3.6 combination 7
    assert h.tension == pytest.approx(28994.51, rel=1e-6)


def test_assembly_dead_load_wins_and_heavy_wall_has_no_uplift():
    # 2000 psf of wall: Mr = 0.46·(2000·47.88·6)·1 = 264 kN·m > 42 kN·m, no uplift
    p, alloc, cfg = _case(DesignBasis.ASD, wall_dead_load=2000 * PSF)
    h = hold_down_forces(alloc, cfg)[p.id]
    assert h.dead_load == pytest.approx(2000 * PSF * 6.0)
    assert h.tension == 0.0
    assert check_overturning(alloc, cfg) == []


def test_one_info_finding_per_level():
    p, alloc, cfg = _case(DesignBasis.ASD)
    q = pier("g2", start=(0.0, 5.0), end=(4.0, 5.0), height=3.0)
    alloc = allocation([p, q], {p.id: 20e3, q.id: 5e3})
    found = check_overturning(alloc, cfg)
    assert len(found) == 1
    f = found[0]
    assert f.severity is Severity.INFO
    assert f.clause == "ASCE 7-16 §2.4.5"
    assert f.demand == pytest.approx(20339.25, rel=1e-6)  # the larger of the two
    assert f.guids == ("storeyRoof",)


@given(
    force=st.floats(1e3, 1e6), length=st.floats(0.5, 12.0), height=st.floats(2.0, 4.0)
)
def test_moment_equilibrium(force, length, height):
    # statics about the compression end: T·L + Mr = M whenever there is uplift
    p = pier("g1", start=(0.0, 0.0), end=(length, 0.0), height=height)
    h = hold_down_forces(
        allocation([p], {p.id: force}), config(assemblies=(assembly(),))
    )[p.id]
    if h.tension > 0:
        assert h.tension * h.arm + h.resisting_moment == pytest.approx(
            h.overturning_moment
        )
    else:
        assert h.resisting_moment >= h.overturning_moment
