"""Within a line: force shared by length (same assembly) or stiffness (mixed)."""

from __future__ import annotations

import dataclasses
import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from allocation.errors import ParameterError
from allocation.within_line import InLineBasis, choose_basis, distribute_in_line
from tests.allocation._plans import pier


def wall(name, x, *, length=2.0, k=0.0, assembly="A"):
    return pier(name, (x, 0.0), (x + length, 0.0), stiffness=k, assembly=assembly)


def test_by_length_is_proportional_to_length():
    piers = [
        wall("A", 0, length=1.0),
        wall("B", 5, length=2.0),
        wall("C", 9, length=3.0),
    ]
    out = distribute_in_line(600.0, piers, by="length")
    # common practice: F_i = F L_i / ΣL, DESIGN.md item 9 -> 100, 200, 300 N
    assert out == {
        "A|L1|0|0": pytest.approx(100.0),
        "B|L1|0|0": pytest.approx(200.0),
        "C|L1|0|0": pytest.approx(300.0),
    }


def test_by_stiffness_is_proportional_to_stiffness():
    piers = [wall("A", 0, k=1.0e6), wall("B", 5, k=3.0e6)]
    out = distribute_in_line(-400.0, piers, by="stiffness")
    assert out == {"A|L1|0|0": pytest.approx(-100.0), "B|L1|0|0": pytest.approx(-300.0)}


def test_basis_follows_assemblies():
    same = [wall("A", 0, assembly="WSP"), wall("B", 4, assembly="WSP")]
    mixed = [wall("A", 0, k=2.0, assembly="WSP"), wall("B", 4, k=9.0, assembly="CMU")]
    assert choose_basis(same) is InLineBasis.LENGTH
    assert choose_basis(mixed) is InLineBasis.STIFFNESS
    unset = [dataclasses.replace(p, stiffness=0.0) for p in mixed]
    assert choose_basis(unset) is InLineBasis.LENGTH


@pytest.mark.parametrize(
    ("piers", "by", "text"),
    [
        ([wall("A", 0)], "area", "not one of"),
        ([], "length", "no piers"),
        ([wall("A", 0, k=0.0)], "stiffness", "A|L1|0|0"),
    ],
)
def test_bad_input_is_a_one_line_parameter_error(piers, by, text):
    with pytest.raises(ParameterError, match=text):
        distribute_in_line(100.0, piers, by=by)


@settings(max_examples=80, derandomize=True, deadline=None)
@given(
    force=st.floats(-1e7, 1e7),
    lengths=st.lists(st.floats(0.1, 30.0), min_size=1, max_size=8),
)
def test_shares_add_up_to_line_force(force, lengths):  # statics: Σ F_i = F
    piers = [wall(f"P{i}", 40.0 * i, length=L) for i, L in enumerate(lengths)]
    out = distribute_in_line(force, piers, by="length")
    assert math.fsum(out.values()) == pytest.approx(force, rel=1e-14, abs=1e-9)
    for p in piers:
        assert out[p.id] == pytest.approx(
            force * p.length / sum(lengths), rel=1e-9, abs=1e-6
        )
