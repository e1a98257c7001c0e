"""ASCE 7-16 Eq. 12.8-14 (Ax) and Table 12.3-1 torsional irregularity types 1a/1b.

Limits 1.2 and 1.4, and Ax = (δmax/1.2δavg)² with 1 <= Ax <= 3, as quoted at
https://www.buildcoreengineering.com/blog/torsional-irregularity-ax-factor
(LIBRARY-NOTES §5.1).
"""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from allocation.asce7_16 import s12_8_torsion
from allocation.errors import ParameterError


@pytest.mark.parametrize(
    ("delta_max", "delta_avg", "expected"),
    [
        (1.0, 1.0, 1.0),  # ASCE 7-16 Eq. 12.8-14: (1/1.2)² = 0.69 -> lower bound 1
        (1.2, 1.0, 1.0),  # ASCE 7-16 Eq. 12.8-14: exactly 1 at the 1a limit
        (1.5, 1.0, 1.5625),  # ASCE 7-16 Eq. 12.8-14: (1.5/1.2)² = 1.25²
        (0.03, 0.02, 1.5625),  # ASCE 7-16 Eq. 12.8-14: same ratio in m
        (2.5, 1.0, 3.0),  # ASCE 7-16 Eq. 12.8-14: (2.5/1.2)² = 4.34 -> upper bound 3
    ],
)
def test_Ax(delta_max, delta_avg, expected):
    assert s12_8_torsion.Ax(delta_max, delta_avg) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize(
    ("delta_max", "delta_avg", "expected"),
    [
        (1.0, 1.0, None),  # ASCE 7-16 Table 12.3-1: regular
        (1.2, 1.0, None),  # ASCE 7-16 Table 12.3-1: 1a needs more than 1.2
        (1.21, 1.0, "1a"),  # ASCE 7-16 Table 12.3-1: > 1.2 δavg
        (1.4, 1.0, "1a"),  # ASCE 7-16 Table 12.3-1: 1b needs more than 1.4
        (1.41, 1.0, "1b"),  # ASCE 7-16 Table 12.3-1: > 1.4 δavg
        (0.0, 1.0, None),  # ASCE 7-16 Table 12.3-1: no drift at the extreme
    ],
)
def test_torsional_irregularity_type(delta_max, delta_avg, expected):
    assert s12_8_torsion.torsional_irregularity_type(delta_max, delta_avg) == expected


@given(avg=st.floats(1e-4, 1.0), ratio=st.floats(1.0, 3.0), more=st.floats(0.0, 1.0))
def test_Ax_bounded_monotone_and_consistent(avg, ratio, more):
    Ax1 = s12_8_torsion.Ax(ratio * avg, avg)
    Ax2 = s12_8_torsion.Ax((ratio + more) * avg, avg)
    assert 1.0 <= Ax1 <= Ax2 <= 3.0  # ASCE 7-16 Eq. 12.8-14 bounds; monotone in δmax
    kind = s12_8_torsion.torsional_irregularity_type(ratio * avg, avg)
    if kind is None:  # not irregular (δmax <= 1.2 δavg): no amplification
        assert Ax1 == pytest.approx(1.0, rel=1e-9)
    if kind == "1b":  # δmax > 1.4 δavg: Ax >= (1.4/1.2)²
        assert Ax1 >= (1.4 / 1.2) ** 2 * (1 - 1e-9)


@pytest.mark.parametrize(
    ("args", "needle"),
    [((1.0, 0.0), "delta_avg = 0.0"), ((-1.0, 1.0), "delta_max = -1.0")],
)
def test_out_of_domain(args, needle):
    with pytest.raises(ParameterError, match=needle):
        s12_8_torsion.Ax(*args)
    with pytest.raises(ParameterError, match=needle):
        s12_8_torsion.torsional_irregularity_type(*args)
