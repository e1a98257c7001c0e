"""Redundancy factor, ASCE 7-16 §12.3.4.2 (checks.rules.asce7_16.redundancy)."""

from __future__ import annotations

import pytest

from checks.findings import Severity
from checks.rules.asce7_16.redundancy import check_redundancy, evaluate_redundancy
from ifc_bridge.model import Direction

from ._build import allocation, assembly, config, pier, rigid

X, Y = Direction.X, Direction.Y


def _story(y_piers):
    """Roof story 10 m × 10 m: X walls 10 m at y = 0 and 10 (h/l = 0.3), Y piers."""
    xs = [
        pier("x1", start=(0.0, 0.0), end=(10.0, 0.0), height=3.0),
        pier("x2", start=(0.0, 10.0), end=(10.0, 10.0), height=3.0),
    ]
    return xs + y_piers


def test_sdc_c_is_one():
    # SDS = 0.4, SD1 = 0.1 → SDC C: ρ = 1.0, ASCE 7-16 §12.3.4.1
    r = evaluate_redundancy(allocation(_story([])), config(SDS=0.4, SD1=0.1, S1=0.08))
    assert (r.rho, r.sdc) == (1.0, "C")


def test_strength_loss_over_33_percent():
    # Y piers: 2.5 m (h/l = 1.2) at x = 0 and 4.0 m at x = 10: removing the first loses
    # 2.5/6.5 = 38 % > 33 % of the story strength, ASCE 7-16 §12.3.4.2 (a)
    ys = [
        pier("y1", start=(0.0, 0.0), end=(0.0, 2.5), height=3.0),
        pier("y2", start=(10.0, 0.0), end=(10.0, 4.0), height=3.0),
    ]
    alloc = allocation(_story(ys))
    r = evaluate_redundancy(alloc, config(assemblies=(assembly(),)))
    assert r.rho == 1.3
    assert r.governing_pier == ys[0].id
    assert r.strength_loss == pytest.approx(2.5 / 6.5)
    (f,) = check_redundancy(r, alloc, config())
    assert f.severity is Severity.WARNING
    assert f.guids == ("y1",)
    assert f.clause == "ASCE 7-16 §12.3.4.2"


def test_no_slender_pier_is_one():
    # every pier has h/l ≤ 1.0: nothing to remove, condition (a) holds
    ys = [
        pier("y1", start=(0.0, 0.0), end=(0.0, 4.0), height=3.0),
        pier("y2", start=(10.0, 0.0), end=(10.0, 4.0), height=3.0),
    ]
    r = evaluate_redundancy(allocation(_story(ys)), config(assemblies=(assembly(),)))
    assert r.rho == 1.0


def test_extreme_torsion_in_sdc_d():
    # a Type 1b story in SDC D: ρ = 1.3, ASCE 7-16 §12.3.4.2 (from memory)
    alloc = allocation(_story([]), rigid=[rigid("Roof", X, 1.45)])
    assert evaluate_redundancy(alloc, config()).rho == 1.3


def test_removal_creating_extreme_torsion():
    # X walls 10 m long at y = 4 and 6 (k = L = 10 each, J about the CR = 2·10·1² = 20).
    # Y piers: 2.5 m (h/l = 1.2) at x = 0, two 3 m (h/l = 1.0) at x = 10; removing the
    # first loses 2.5/8.5 = 29 % ≤ 33 %. Without it the CR is at x = 10; CM at x = 5
    # with 5 % of 10 m accidental: e = 5.5 m. Unit force: δ(10) = 1/6,
    # δ(0) = 1/6 + 5.5/20·10 =
    # 2.917; max/avg = 2.917/1.542 = 1.89 > 1.4, Type 1b (ASCE 7-16 Table 12.3-1), so
    # ρ = 1.3 by ASCE 7-16 §12.3.4.2 (a)
    pytest.importorskip("allocation.rigid")
    xs = [
        pier("x1", start=(0.0, 4.0), end=(10.0, 4.0), height=3.0),
        pier("x2", start=(0.0, 6.0), end=(10.0, 6.0), height=3.0),
    ]
    ys = [
        pier("y1", start=(0.0, 0.0), end=(0.0, 2.5), height=3.0),
        pier("y2", start=(10.0, 0.0), end=(10.0, 3.0), height=3.0),
        pier("y3", start=(10.0, 5.0), end=(10.0, 8.0), height=3.0),
    ]
    alloc = allocation(xs + ys, rigid=[rigid("Roof", Y, 1.1, com=(5.0, 5.0))])
    r = evaluate_redundancy(alloc, config(assemblies=(assembly(),)))
    assert r.rho == 1.3
    assert r.governing_pier == ys[0].id
    assert "torsional" in r.reason
    assert r.torsion_checked


def test_given_rho_below_evaluated_is_a_warning():
    ys = [
        pier("y1", start=(0.0, 0.0), end=(0.0, 2.5), height=3.0),
        pier("y2", start=(10.0, 0.0), end=(10.0, 4.0), height=3.0),
    ]
    alloc = allocation(_story(ys))
    cfg = config(assemblies=(assembly(),), rho=1.0)
    r = evaluate_redundancy(alloc, cfg)
    assert (r.rho, r.evaluated) == (1.0, 1.3)
    (f,) = check_redundancy(r, alloc, cfg)
    assert f.severity is Severity.WARNING
    assert "below the evaluated value" in f.description
