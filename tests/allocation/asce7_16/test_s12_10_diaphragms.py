"""ASCE 7-16 §12.10.1.1 diaphragm design force, Eq. 12.10-1 with its bounds."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from allocation.asce7_16 import s12_8_elf, s12_10_diaphragms
from allocation.errors import ParameterError

EQ_1 = "ASCE 7-16 Eq. 12.10-1"
EQ_2 = "ASCE 7-16 Eq. 12.10-2"
EQ_3 = "ASCE 7-16 Eq. 12.10-3"


def test_three_storey_example():
    """Hand calculation of the LIBRARY-NOTES §5.1 example (units: kip, as there).

    ASCE 7-16 Eq. 12.8-1/11/12 and 12.10-1..3. w = 400, 400, 300 kip bottom up at
    equal storey heights, SDS = 1.2, R = 6.5, Ie = 1, Ta <= 0.5 s so k = 1:
    V = 1100 × 1.2/6.5 = 203.08; Σwh = 400·1 + 400·2 + 300·3 = 2100;
    Fx = 203.08 × (400, 800, 900)/2100 = 38.68, 77.36, 87.03 kip.
    Roof: Fpx = 87.03/300 × 300 = 87.03, within 0.2·1.2·300 = 72 and 0.4·1.2·300 = 144.
    Level 3: 164.40/700 × 400 = 93.94 < 0.24 × 400 = 96.0 -> 96.0 (Eq. 12.10-2).
    Level 2: 203.08/1100 × 400 = 73.85 < 96.0 -> 96.0 (Eq. 12.10-2).
    """
    w = [400.0, 400.0, 300.0]
    V = s12_8_elf.V(s12_8_elf.Cs_base(1.2, 6.5, 1.0), sum(w))
    forces = [s12_8_elf.Fx(c, V) for c in s12_8_elf.Cvx(w, [1.0, 2.0, 3.0], 1.0)]
    assert forces == pytest.approx([38.7, 77.4, 87.0], abs=0.05)  # §5.1 example, kip
    shears = s12_8_elf.Vx(forces)
    results = [
        s12_10_diaphragms.Fpx(shears[i], sum(w[i:]), w[i], 1.2, 1.0) for i in range(3)
    ]
    assert [r[0] for r in results] == pytest.approx([96.0, 96.0, 87.0], abs=0.05)
    assert [r[1] for r in results] == [EQ_2, EQ_2, EQ_1]  # §5.1: floor governs at 2, 1


@pytest.mark.parametrize(
    ("F_above", "w_above", "wpx", "SDS", "Ie", "expected", "governs"),
    [
        (30.0, 100.0, 100.0, 1.0, 1.0, 30.0, EQ_1),  # Eq. 12.10-1: 0.3·100 in [20, 40]
        (10.0, 100.0, 100.0, 1.0, 1.0, 20.0, EQ_2),  # Eq. 12.10-2: 0.2·1.0·100
        (100.0, 100.0, 100.0, 1.0, 1.0, 40.0, EQ_3),  # Eq. 12.10-3: 0.4·1.0·100
        (100.0, 100.0, 50.0, 1.0, 1.5, 30.0, EQ_3),  # Eq. 12.10-3: 0.4·1.0·1.5·50
        (5.0, 100.0, 50.0, 0.0, 1.0, 2.5, EQ_1),  # SDS = 0: bounds not applied
    ],
)
def test_Fpx(F_above, w_above, wpx, SDS, Ie, expected, governs):
    value, which = s12_10_diaphragms.Fpx(F_above, w_above, wpx, SDS, Ie)
    assert value == pytest.approx(expected, rel=1e-12)
    assert which == governs


@given(
    ratio=st.floats(0.0, 2.0),
    w_above=st.floats(1.0, 1e8),
    share=st.floats(0.0, 1.0),
    SDS=st.floats(0.01, 2.5),
    Ie=st.sampled_from([1.0, 1.25, 1.5]),
)
def test_Fpx_within_bounds(
    ratio, w_above, share, SDS, Ie
):  # Eq. 12.10-2 <= Fpx <= 12.10-3
    wpx = share * w_above
    value, _ = s12_10_diaphragms.Fpx(ratio * w_above, w_above, wpx, SDS, Ie)
    assert (
        0.2 * SDS * Ie * wpx * (1 - 1e-12)
        <= value
        <= 0.4 * SDS * Ie * wpx * (1 + 1e-12)
    )


@pytest.mark.parametrize(
    ("args", "needle"),
    [
        ((-1.0, 100.0, 50.0, 1.0, 1.0), "F_above = -1.0"),
        ((1.0, 0.0, 0.0, 1.0, 1.0), "w_above = 0.0"),
        ((1.0, 100.0, 150.0, 1.0, 1.0), "wpx = 150.0"),
        ((1.0, 100.0, 50.0, 1.0, 0.0), "Ie = 0.0"),
    ],
)
def test_Fpx_out_of_domain(args, needle):
    with pytest.raises(ParameterError, match=needle):
        s12_10_diaphragms.Fpx(*args)
