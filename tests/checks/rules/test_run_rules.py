"""The front door: every rule on a small building (checks.rules.run_rules)."""

from __future__ import annotations

import random

from hypothesis import given, settings
from hypothesis import strategies as st
from shapely.geometry import Polygon

from allocation.results import Condition, ConditionKind
from checks.findings import Severity
from checks.rules import run_checks
from ifc_bridge.model import BuildingModel, Diaphragm, Direction, Level

from ._build import allocation, assembly, config, pier, rigid

L_SHAPE = Polygon([(0, 0), (20, 0), (20, 10), (10, 10), (10, 20), (0, 20)])


def _inputs(order: list[int] | None = None):
    piers = [
        pier("a", start=(0.0, 0.0), end=(2.0, 0.0)),  # DCR 0.7·11 kN/2 m / 3794 = 1.01
        pier("b", start=(0.0, 20.0), end=(8.0, 20.0)),
        pier("c", start=(0.0, 0.0), end=(0.0, 0.6), assembly=""),  # no assembly
        pier("d", start=(20.0, 0.0), end=(20.0, 10.0)),
    ]
    forces = {
        "a|Roof|0|0": 11e3,
        "b|Roof|0|0": 20e3,
        "c|Roof|0|0": 1e3,
        "d|Roof|0|0": 30e3,
    }
    conds = [
        Condition(
            kind=ConditionKind.NO_LINE,
            level="Roof",
            direction=Direction.Y,
            guids=(),
            detail="no line in Y",
        )
    ]
    if order is not None:
        piers = [piers[i] for i in order]
    model = BuildingModel(
        source="m.ifc",
        schema="IFC4",
        levels=(
            Level(name="Ground", guid="s0", elevation=0.0, index=0),
            Level(name="Roof", guid="storeyRoof", elevation=3.0, index=1),
        ),
        diaphragms=(
            Diaphragm(
                id="Roof/D1",
                level="Roof",
                polygon=L_SHAPE,
                slab_guids=("slab1",),
                kind="ROOF",
                elevation=3.0,
            ),
        ),
    )
    alloc = allocation(
        piers, forces, rigid=[rigid("Roof", Direction.X, 1.3)], conditions=conds
    )
    return model, alloc, config(assemblies=(assembly(),))


def test_front_door():
    model, alloc, cfg = _inputs()
    result = run_checks(model, alloc, cfg)
    ids = [f.id for f in result.findings]
    assert len(set(ids)) == len(ids)
    order = [list(Severity).index(f.severity) for f in result.findings]
    assert order == sorted(order)  # errors first
    rules = {(f.rule, f.severity) for f in result.findings}
    assert ("unit_shear", Severity.ERROR) in rules  # DCR > 1 and no capacity for c
    assert ("discontinuity", Severity.ERROR) in rules  # no line in Y, ASCE 7-16 §12.1.3
    assert (
        "irregularities",
        Severity.WARNING,
    ) in rules  # 1a and the L-shape, Table 12.3-1
    assert ("redundancy", Severity.INFO) in rules or (
        "redundancy",
        Severity.WARNING,
    ) in rules
    assert result.pier_checks["a|Roof|0|0"].hold_down_tension is not None
    assert result.pier_checks["c|Roof|0|0"].capacity is None
    assert result.sdc == "D"
    assert result.rho in (1.0, 1.3)


@settings(max_examples=15, deadline=None)
@given(seed=st.integers(0, 10_000))
def test_same_findings_whatever_the_order(seed):
    # ids and the whole sorted list do not depend on the order of the piers
    order = list(range(4))
    random.Random(seed).shuffle(order)
    a = run_checks(*_inputs()).findings
    b = run_checks(*_inputs(order)).findings
    assert a == b
