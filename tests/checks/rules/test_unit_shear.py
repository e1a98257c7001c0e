"""Unit shear demand / capacity per pier (checks.rules.asce7_16.unit_shear)."""

from __future__ import annotations

import dataclasses
import random

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checks.findings import Severity
from checks.project import DesignBasis
from checks.rules.asce7_16.unit_shear import (
    check_unit_shear,
    pier_capacity,
    pier_checks,
)
from ifc_bridge.model import BuildingModel, Level, WallSegment

from ._build import PLF, allocation, assembly, config, pier

CAP = 260 * PLF  # 260 plf = 3794.4 N/m, the user's allowable unit shear (demo value)


def _one(force: float, *, length: float = 2.0, height: float = 2.5, **cfg):
    p = pier("g1", start=(0.0, 0.0), end=(length, 0.0), height=height)
    return p, allocation([p], {p.id: force}), config(assemblies=(assembly(),), **cfg)


@pytest.mark.parametrize(
    ("basis", "rho", "expected"),
    [
        (
            DesignBasis.ASD,
            None,
            0.7 * 1.0 * 10e3 / 2.0,
        ),  # ASCE 7-16 §2.4.5: 0.7·ρ·QE, ρ = 1.0
        (
            DesignBasis.ASD,
            1.3,
            0.7 * 1.3 * 10e3 / 2.0,
        ),  # ASCE 7-16 §2.4.5 with ρ = 1.3 (§12.3.4.2)
        (DesignBasis.LRFD, None, 1.0 * 1.0 * 10e3 / 2.0),  # ASCE 7-16 §2.3.6: 1.0·ρ·QE
    ],
)
def test_unit_shear_demand(basis, rho, expected):
    p, alloc, cfg = _one(10e3, basis=basis, rho=rho)
    c = pier_checks(alloc, cfg)[p.id]
    assert c.unit_shear == pytest.approx(expected, rel=1e-12)  # v = f·ρ·QE/L, exact
    assert c.capacity == pytest.approx(
        CAP, rel=1e-12
    )  # h/b = 1.25 ≤ 2: no aspect factor
    assert c.dcr == pytest.approx(expected / CAP, rel=1e-12)


def test_aspect_factor_reduces_capacity():
    # h/b = 2.5/1.0 = 2.5: factor 1.25 − 0.125·2.5 = 0.9375,
    # AWC SDPWS-2015 §4.3.4.2 (from memory)
    p, alloc, cfg = _one(1e3, length=1.0)
    c = pier_checks(alloc, cfg)[p.id]
    assert c.aspect_factor == pytest.approx(0.9375, rel=1e-12)
    assert c.capacity == pytest.approx(0.9375 * CAP, rel=1e-12)
    assert pier_capacity(p, cfg) == (pytest.approx(0.9375 * CAP), pytest.approx(0.9375))


@pytest.mark.parametrize(
    ("force", "severity"),
    [
        (10.0e3, None),  # v = 3500 N/m, DCR 0.922: no finding
        (10.5e3, Severity.WARNING),  # v = 3675 N/m, DCR 0.969 > 0.95: near capacity
        (11.0e3, Severity.ERROR),  # v = 3850 N/m, DCR 1.015 > 1.0: over capacity
    ],
)
def test_dcr_severity(force, severity):
    _, alloc, cfg = _one(force)
    found = check_unit_shear(alloc, cfg)
    assert [f.severity for f in found] == ([severity] if severity else [])
    if severity:
        f = found[0]
        assert f.clause == "AWC SDPWS-2015 §4.3.3"
        assert f.demand == pytest.approx(0.7 * force / 2.0)  # ASCE 7-16 §2.4.5
        assert f.guids == ("g1",)
        assert "ρ = 1.0 assumed" in f.description


def test_no_assembly_is_an_error_naming_the_type():
    p = pier("g2", start=(0.0, 0.0), end=(3.0, 0.0), assembly="")
    wall = WallSegment(
        guid="g2",
        name="W-g2",
        storey="Ground",
        level="Roof",
        base_elevation=0.0,
        top_elevation=2.5,
        start=(0.0, 0.0),
        end=(3.0, 0.0),
        thickness=0.15,
        type_name="SW-X",
        is_shear_wall=True,
    )
    model = BuildingModel(
        source="m.ifc",
        schema="IFC4",
        levels=(Level(name="Ground", guid="s0", elevation=0.0, index=0),),
        walls=(wall,),
    )
    alloc = allocation([p], {p.id: 5e3})
    found = check_unit_shear(alloc, config(), model=model)
    assert len(found) == 1
    assert found[0].severity is Severity.ERROR
    assert "no capacity assigned: add an [[assemblies]] entry matching type 'SW-X'" in (
        found[0].description
    )
    c = pier_checks(alloc, config())[p.id]
    assert c.capacity is None  # never a silent zero
    assert c.dcr is None


def test_assembly_without_capacity_is_an_error():
    p = pier("g3", start=(0.0, 0.0), end=(3.0, 0.0))
    cfg = config(assemblies=(assembly(capacity=None),))
    found = check_unit_shear(allocation([p], {p.id: 5e3}), cfg)
    assert [f.severity for f in found] == [Severity.ERROR]
    assert "gives no unit shear capacity" in found[0].description


def test_pier_beyond_aspect_limit_has_zero_capacity_and_no_ratio():
    # h/b = 2.5/0.5 = 5 > 3.5, AWC SDPWS-2015 §4.3.4 (from memory): not counted
    p, alloc, cfg = _one(1e3, length=0.5)
    c = pier_checks(alloc, cfg)[p.id]
    assert c.aspect_factor == 0.0
    assert c.capacity == 0.0
    assert c.dcr is None
    assert check_unit_shear(alloc, cfg) == []  # the aspect ratio rule reports it


@settings(max_examples=40, deadline=None)
@given(force=st.floats(1e2, 1e6), length=st.floats(0.8, 20.0), seed=st.integers(0, 99))
def test_demand_equilibrium_and_order_independence(force, length, seed):
    # statics: v·L = f·ρ·QE; findings do not depend on the order of the piers
    piers = [
        pier(f"g{i}", start=(0.0, 3.0 * i), end=(length, 3.0 * i)) for i in range(4)
    ]
    forces = {p.id: force * (i + 1) for i, p in enumerate(piers)}
    cfg = config(assemblies=(assembly(),))
    checks = pier_checks(allocation(piers, forces), cfg)
    for p in piers:
        assert checks[p.id].unit_shear * p.length == pytest.approx(0.7 * forces[p.id])
    shuffled = piers[:]
    random.Random(seed).shuffle(shuffled)
    a = sorted(check_unit_shear(allocation(piers, forces), cfg), key=lambda f: f.id)
    b = sorted(check_unit_shear(allocation(shuffled, forces), cfg), key=lambda f: f.id)
    assert a == b


def test_precomputed_checks_and_hold_downs_give_the_same_results():
    # the run passes pier_checks (with hold-down tensions) on; the findings and the
    # numbers are those computed afresh (the same record, not a recomputation)
    from checks.rules.asce7_16.overturning import hold_down_forces

    piers = [
        pier(f"g{i}", start=(0.0, 3.0 * i), end=(0.5 + i, 3.0 * i)) for i in range(5)
    ]
    forces = {p.id: 3e3 * (i + 1) for i, p in enumerate(piers)}
    alloc, cfg = allocation(piers, forces), config(assemblies=(assembly(),))
    holds = hold_down_forces(alloc, cfg)
    plain = pier_checks(alloc, cfg)
    with_holds = pier_checks(alloc, cfg, hold_downs=holds)
    for pid, c in plain.items():
        assert with_holds[pid] == dataclasses.replace(
            c, hold_down_tension=holds[pid].tension
        )
    assert check_unit_shear(alloc, cfg, checks=with_holds) == check_unit_shear(
        alloc, cfg
    )
    assert pier_capacity(piers[0], cfg) == (plain[piers[0].id].capacity, 0.0)  # h/b 5


def test_allocated_piers_are_the_per_pier_lengths_and_forces():
    # common practice: a skewed pier is not allocated; a pier with no envelope entry
    # takes its largest result (pier_force); numbers read once per allocation
    from checks.rules._support import allocated_piers, pier_force

    piers = [
        pier("A", start=(0.0, 0.0), end=(3.0, 4.0 + 1e-9)),
        pier("B", start=(0.0, 2.0), end=(0.0, 9.5)),
        dataclasses.replace(
            pier("C", start=(1.0, 1.0), end=(2.0, 2.0)), direction=None
        ),
    ]
    alloc = allocation(piers, {piers[0].id: -1234.5})
    found = allocated_piers(alloc)
    assert found.piers == piers[:2]
    assert found.lengths == [p.length for p in piers[:2]]  # the same floats
    assert found.forces == [pier_force(alloc, p.id) for p in piers[:2]]
    assert found.forces[0] == 1234.5
    assert allocated_piers(alloc) is found
    other = allocation(piers, {piers[1].id: 10.0})
    assert allocated_piers(other).forces == [0.0, 10.0]


def test_allocated_capacities_are_each_piers_capacity_once_per_allocation():
    # SDPWS-2015 §4.3.3 / §4.3.4.2 through pier_capacity, pier by pier; the table is
    # worked out once per allocation and config
    from checks.rules.asce7_16.unit_shear import allocated_capacities

    piers = [
        pier("A", start=(0.0, 0.0), end=(1.0, 0.0), height=3.0),  # h/b 3: reduced
        pier("B", start=(0.0, 2.0), end=(0.0, 6.0)),
        pier("C", start=(5.0, 0.0), end=(9.0, 0.0), assembly="none"),
    ]
    cfg = config(assemblies=(assembly(),))
    alloc = allocation(piers, {p.id: 1000.0 for p in piers})
    table = allocated_capacities(alloc, cfg)
    assert table == {p.id: pier_capacity(p, cfg) for p in piers}
    assert table[piers[2].id] == (None, 1.0)  # no assembly of that name
    assert allocated_capacities(alloc, cfg) is table
    other = config(assemblies=(assembly(capacity=100 * PLF),))
    assert allocated_capacities(alloc, other)[piers[1].id][0] < table[piers[1].id][0]
