"""Redundancy factor, ASCE 7-16 §12.3.4.2 (checks.rules.asce7_16.redundancy)."""

from __future__ import annotations

import pytest

from checks.findings import Severity
from checks.rules.asce7_16.redundancy import check_redundancy, evaluate_redundancy
from ifc_bridge.model import Direction

from ._build import allocation, assembly, config, pier, rigid

X, Y = Direction.X, Direction.Y


def _story(y_piers):
    """Roof story, 10 m × 10 m: X walls 10 m long at y = 0 and 10 (h/l = 0.3), and Y piers."""
    xs = [pier("x1", start=(0.0, 0.0), end=(10.0, 0.0), height=3.0),
          pier("x2", start=(0.0, 10.0), end=(10.0, 10.0), height=3.0)]
    return xs + y_piers


def test_sdc_c_is_one():
    # SDS = 0.4, SD1 = 0.1 → SDC C: ρ = 1.0, ASCE 7-16 §12.3.4.1
    r = evaluate_redundancy(allocation(_story([])), config(SDS=0.4, SD1=0.1, S1=0.08))
    assert (r.rho, r.sdc) == (1.0, "C")


def test_strength_loss_over_33_percent():
    # Y piers: 2.5 m (h/l = 1.2) at x = 0 and 4.0 m at x = 10: removing the first loses
    # 2.5/6.5 = 38 % > 33 % of the story strength, ASCE 7-16 §12.3.4.2 (a)
    ys = [pier("y1", start=(0.0, 0.0), end=(0.0, 2.5), height=3.0),
          pier("y2", start=(10.0, 0.0), end=(10.0, 4.0), height=3.0)]
    alloc = allocation(_story(ys))
    r = evaluate_redundancy(alloc, config(assemblies=(assembly(),)))
    assert r.rho == 1.3 and r.governing_pier == ys[0].id
    assert r.strength_loss == pytest.approx(2.5 / 6.5)
    (f,) = check_redundancy(r, alloc, config())
    assert f.severity is Severity.WARNING and f.guids == ("y1",)
    assert f.clause == "ASCE 7-16 §12.3.4.2"


def test_no_slender_pier_is_one():
    # every pier has h/l ≤ 1.0: nothing to remove, condition (a) holds
    ys = [pier("y1", start=(0.0, 0.0), end=(0.0, 4.0), height=3.0),
          pier("y2", start=(10.0, 0.0), end=(10.0, 4.0), height=3.0)]
    r = evaluate_redundancy(allocation(_story(ys)), config(assemblies=(assembly(),)))
    assert r.rho == 1.0


def test_extreme_torsion_in_sdc_d():
    # a Type 1b story in SDC D: ρ = 1.3, ASCE 7-16 §12.3.4.2 (from memory)
    alloc = allocation(_story([]), rigid=[rigid("Roof", X, 1.45)])
    assert evaluate_redundancy(alloc, config()).rho == 1.3


def test_removal_creating_extreme_torsion():
    # Y piers: 2.5 m (h/l = 1.2) at x = 0, two 3 m piers (h/l = 1.0) at x = 10; loss
    # 2.5/8.5 = 29 % ≤ 33 %. Without the first, the CR is at x = 10, e = 5 + 0.5 m;
    # k = L: J = 2·10·5² = 500, θ = 5.5V/500, δ(0) = V/6 − 0.11V, δ(10) = V/6:
    # max/avg = 0.1667/0.1117 = 1.49 > 1.4, Type 1b (Table 12.3-1) → ρ = 1.3, §12.3.4.2 (a)
    pytest.importorskip("allocation.rigid")
    ys = [pier("y1", start=(0.0, 0.0), end=(0.0, 2.5), height=3.0),
          pier("y2", start=(10.0, 0.0), end=(10.0, 3.0), height=3.0),
          pier("y3", start=(10.0, 5.0), end=(10.0, 8.0), height=3.0)]
    alloc = allocation(_story(ys), rigid=[rigid("Roof", Y, 1.1, com=(5.0, 5.0))])
    r = evaluate_redundancy(alloc, config(assemblies=(assembly(),)))
    assert r.rho == 1.3 and r.governing_pier == ys[0].id
    assert "torsional" in r.reason


def test_given_rho_below_evaluated_is_a_warning():
    ys = [pier("y1", start=(0.0, 0.0), end=(0.0, 2.5), height=3.0),
          pier("y2", start=(10.0, 0.0), end=(10.0, 4.0), height=3.0)]
    alloc = allocation(_story(ys))
    cfg = config(assemblies=(assembly(),), rho=1.0)
    r = evaluate_redundancy(alloc, cfg)
    assert (r.rho, r.evaluated) == (1.0, 1.3)
    (f,) = check_redundancy(r, alloc, cfg)
    assert f.severity is Severity.WARNING and "below the evaluated value" in f.description
