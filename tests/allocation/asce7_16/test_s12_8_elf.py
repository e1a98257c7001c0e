"""ASCE 7-16 §12.8 equivalent lateral force equations.

Published reference values: three public permit calculations (Everett, WA building
records, quoted in LIBRARY-NOTES §5.1), in US units (hn in ft, Ct = 0.020 for "all
other structural systems", x = 0.75, TL = 6 s as printed on the pages). The pages print
Cs to two decimals, from a Ta rounded to two decimals, so Cs is checked to ±0.01 and
Eq. 12.8-4 to 3 %. R and Ie are not in the page excerpts: R = 6.5 (light-frame wood
walls with wood structural panels, Table 12.2-1, from memory) and Ie = 1.0 reproduce
every printed value. The pages print 0.00 for Eq. 12.8-6, i.e. S1 < 0.6 g.
"""

from __future__ import annotations

import math
import re

import pytest
from hypothesis import given
from hypothesis import strategies as st

from allocation.asce7_16 import s12_8_elf
from allocation.asce7_16.s12_8_elf import StructureType
from allocation.errors import ParameterError

EVERETT_1 = "https://lfportal.everettwa.gov/WebLink/0/doc/1926471/Page50.aspx"
EVERETT_2 = "https://lfportal.everettwa.gov/WebLink/0/doc/1333458/Page57.aspx"
EVERETT_3 = "https://lfportal.everettwa.gov/WebLink/0/doc/1944398/Page61.aspx"
FT = 0.3048  # m per ft, exact by definition

# (source, SDS, SD1, hn [ft], published Ta [s], Cs 12.8-2, Cs 12.8-3, Cs 12.8-4, Cs min)
PERMITS = [
    (EVERETT_1, 1.20, 0.60, 24.0, 0.22, 0.18, 0.43, 11.78, 0.05),
    (EVERETT_2, 0.90, 0.49, 25.0, 0.22, 0.14, 0.34, 9.09, 0.04),
    (EVERETT_3, 0.94, 0.59, 30.0, 0.25, 0.15, 0.36, 8.53, 0.04),
]
R_WSP, IE, TL_PNW = 6.5, 1.0, 6.0  # see module docstring


@pytest.mark.parametrize(
    (
        "source",
        "SDS",
        "SD1",
        "hn_ft",
        "Ta_pub",
        "Cs_pub",
        "max_pub",
        "long_pub",
        "min_pub",
    ),
    PERMITS,
)
def test_permit_calculations(
    source, SDS, SD1, hn_ft, Ta_pub, Cs_pub, max_pub, long_pub, min_pub
):
    Ta = s12_8_elf.Ta(0.02, hn_ft, 0.75)  # US-unit Ct with hn in ft, as on the page
    assert Ta == pytest.approx(Ta_pub, abs=0.01), source  # printed to 2 decimals
    assert s12_8_elf.Cs_base(SDS, R_WSP, IE) == pytest.approx(Cs_pub, abs=0.01), source
    Cs3 = s12_8_elf.Cs_max_short(SD1, Ta, R_WSP, IE)
    assert Cs3 == pytest.approx(max_pub, abs=0.01), source  # Eq. 12.8-3 as printed
    Cs4 = s12_8_elf.Cs_max_long(SD1, Ta, TL_PNW, R_WSP, IE)
    assert Cs4 == pytest.approx(long_pub, rel=0.03), source  # Eq. 12.8-4 as printed
    assert s12_8_elf.Cs_min(SDS, IE) == pytest.approx(min_pub, abs=0.01), source
    assert s12_8_elf.Cs_min_S1(0.5, R_WSP, IE) == 0.0, source  # page: 0.00, S1 < 0.6 g
    Cs, governs = s12_8_elf.seismic_response_coefficient(
        SDS, SD1, S1=0.5, T=Ta, TL=TL_PNW, R=R_WSP, Ie=IE
    )
    assert Cs == pytest.approx(Cs_pub, abs=0.01), source  # page: final Cs
    assert governs == "ASCE 7-16 Eq. 12.8-2", source  # page: V = Cs W with Eq. 12.8-2


def test_Ta_si_form_matches_us_form():
    # ASCE 7-16 Eq. 12.8-7; Everett page 1: hn = 24 ft, Ta = 0.22 s; SI Ct = 0.0488
    Ta_si = s12_8_elf.Ta(0.0488, 24.0 * FT, 0.75)
    assert Ta_si == pytest.approx(0.22, abs=0.01)  # EVERETT_1, printed to 2 decimals
    assert Ta_si == pytest.approx(
        s12_8_elf.Ta(0.02, 24.0, 0.75), rel=3e-3
    )  # Ct rounded


@pytest.mark.parametrize(
    ("structure", "Ct_us", "Ct_si", "x"),
    [
        (StructureType.STEEL_MOMENT_FRAME, 0.028, 0.0724, 0.8),  # from memory
        (StructureType.CONCRETE_MOMENT_FRAME, 0.016, 0.0466, 0.9),  # from memory
        (StructureType.STEEL_EBF_BRBF, 0.03, 0.0731, 0.75),  # from memory
        # US values: EVERETT_1 "Ct = 0.020 Table 12.8-2, x = 0.75"; SI: from memory
        (StructureType.ALL_OTHER, 0.02, 0.0488, 0.75),
    ],
)
def test_table_12_8_2(structure, Ct_us, Ct_si, x):
    row = s12_8_elf.TABLE_12_8_2[structure]  # ASCE 7-16 Table 12.8-2
    assert (row.Ct_us, row.Ct_si, row.x) == (Ct_us, Ct_si, x)
    # The SI form is the US form with hn converted: Ct_si = Ct_us / 0.3048^x, to the
    # table's 3 significant figures (unit conversion, exact arithmetic)
    assert row.Ct_si == pytest.approx(row.Ct_us / FT**row.x, rel=2e-3)


@pytest.mark.parametrize(
    ("SD1", "expected"),
    [
        (0.6, 1.4),  # ASCE 7-16 Table 12.8-1, SD1 >= 0.4; from memory
        (0.4, 1.4),  # ASCE 7-16 Table 12.8-1; from memory
        (0.3, 1.4),  # ASCE 7-16 Table 12.8-1; from memory
        (0.2, 1.5),  # ASCE 7-16 Table 12.8-1; from memory
        (0.15, 1.6),  # ASCE 7-16 Table 12.8-1; from memory
        (0.1, 1.7),  # ASCE 7-16 Table 12.8-1, SD1 <= 0.1; from memory
        (0.05, 1.7),  # ASCE 7-16 Table 12.8-1, SD1 <= 0.1; from memory
        (0.25, 1.45),  # ASCE 7-16 Table 12.8-1, linear interpolation; from memory
        (0.175, 1.55),  # ASCE 7-16 Table 12.8-1, linear interpolation; from memory
    ],
)
def test_Cu(SD1, expected):
    assert s12_8_elf.Cu(SD1) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize(
    ("Ta", "Cu", "T_computed", "expected"),
    [
        (0.2169, 1.4, None, 0.2169),  # ASCE 7-16 §12.8.2: no computed T -> Ta
        (0.2, 1.4, 0.5, 0.28),  # ASCE 7-16 §12.8.2: T <= Cu·Ta = 1.4 × 0.2
        (0.2, 1.4, 0.25, 0.25),  # ASCE 7-16 §12.8.2: computed T below Cu·Ta
    ],
)
def test_period_used(Ta, Cu, T_computed, expected):
    assert s12_8_elf.period_used(Ta, Cu, T_computed) == pytest.approx(
        expected, rel=1e-12
    )


@pytest.mark.parametrize(
    ("SDS", "R", "Ie", "expected"),
    [
        (1.0, 6.5, 1.0, 0.15385),  # ASCE 7-16 Eq. 12.8-2
        (1.0, 6.5, 1.5, 0.23077),  # ASCE 7-16 Eq. 12.8-2; Ie = 1.5, Table 1.5-2
        (1.2, 6.5, 1.0, 0.18462),  # ASCE 7-16 Eq. 12.8-2; EVERETT_1 prints 0.18
    ],
)
def test_Cs_base(SDS, R, Ie, expected):
    assert s12_8_elf.Cs_base(SDS, R, Ie) == pytest.approx(expected, rel=1e-4)


@pytest.mark.parametrize(
    ("SD1", "T", "TL", "R", "Ie", "expected"),
    [
        (0.6, 0.5, 8.0, 6.5, 1.0, 0.6 / (0.5 * 6.5)),  # ASCE 7-16 Eq. 12.8-3, T <= TL
        (0.6, 8.0, 8.0, 6.5, 1.0, 0.6 / (8.0 * 6.5)),  # ASCE 7-16 Eq. 12.8-3 at T = TL
        (0.6, 10.0, 8.0, 6.5, 1.0, 0.6 * 8 / (100 * 6.5)),  # ASCE 7-16 Eq. 12.8-4
    ],
)
def test_Cs_max(SD1, T, TL, R, Ie, expected):
    assert s12_8_elf.Cs_max(SD1, T, TL, R, Ie) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize(
    ("SDS", "Ie", "expected"),
    [
        (1.2, 1.0, 0.0528),  # ASCE 7-16 Eq. 12.8-5: 0.044 × 1.2; EVERETT_1 prints 0.05
        (1.0, 1.5, 0.066),  # ASCE 7-16 Eq. 12.8-5: 0.044 × 1.0 × 1.5
        (0.2, 1.0, 0.01),  # ASCE 7-16 Eq. 12.8-5: 0.0088 < 0.01 floor
    ],
)
def test_Cs_min(SDS, Ie, expected):
    assert s12_8_elf.Cs_min(SDS, Ie) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize(
    ("S1", "R", "Ie", "expected"),
    [
        (0.62, 6.5, 1.0, 0.5 * 0.62 / 6.5),  # ASCE 7-16 Eq. 12.8-6, S1 >= 0.6 g
        (0.6, 6.5, 1.0, 0.5 * 0.6 / 6.5),  # ASCE 7-16 Eq. 12.8-6 at S1 = 0.6 g
        (0.59, 6.5, 1.0, 0.0),  # ASCE 7-16 Eq. 12.8-6 does not apply, S1 < 0.6 g
    ],
)
def test_Cs_min_S1(S1, R, Ie, expected):
    assert s12_8_elf.Cs_min_S1(S1, R, Ie) == pytest.approx(expected, rel=1e-12)


@pytest.mark.parametrize(
    ("SDS", "SD1", "S1", "T", "TL", "R", "expected", "governs"),
    [
        # ASCE 7-16 Eq. 12.8-2: 1.0/6.5; cap 0.6/(0.3 × 6.5) = 0.308; min 0.044
        (1.0, 0.6, 0.5, 0.3, 8.0, 6.5, 1.0 / 6.5, "ASCE 7-16 Eq. 12.8-2"),
        # ASCE 7-16 Eq. 12.8-2 with S1 = 0.6 g: Eq. 12.8-6 gives 0.046 < 0.154
        (1.0, 0.6, 0.6, 0.3, 8.0, 6.5, 1.0 / 6.5, "ASCE 7-16 Eq. 12.8-2"),
        # ASCE 7-16 Eq. 12.8-3: 0.4/(1.0 × 6.5) = 0.0615 < 0.154, > 0.044
        (1.0, 0.4, 0.4, 1.0, 8.0, 6.5, 0.4 / 6.5, "ASCE 7-16 Eq. 12.8-3"),
        # ASCE 7-16 Eq. 12.8-4, T > TL: 0.4 × 4/(25 × 3) = 0.0213; min 0.0132
        (0.3, 0.4, 0.4, 5.0, 4.0, 3.0, 0.4 * 4.0 / 75.0, "ASCE 7-16 Eq. 12.8-4"),
        # ASCE 7-16 Eq. 12.8-5: cap 0.4/(3 × 8) = 0.0167 < 0.044 × 1.0
        (1.0, 0.4, 0.4, 3.0, 8.0, 8.0, 0.044, "ASCE 7-16 Eq. 12.8-5"),
        # ASCE 7-16 Eq. 12.8-6: 0.5 × 0.8/8 = 0.05 > 0.044 > cap 0.0375
        (1.0, 0.6, 0.8, 2.0, 8.0, 8.0, 0.05, "ASCE 7-16 Eq. 12.8-6"),
        # ASCE 7-16 Eq. 12.8-5, 0.01 floor: 0.044 × 0.2 = 0.0088; cap 0.0021
        (0.2, 0.05, 0.05, 3.0, 8.0, 8.0, 0.01, "ASCE 7-16 Eq. 12.8-5 (0.01 floor)"),
    ],
)
def test_seismic_response_coefficient_branches(
    SDS, SD1, S1, T, TL, R, expected, governs
):
    Cs, which = s12_8_elf.seismic_response_coefficient(
        SDS, SD1, S1=S1, T=T, TL=TL, R=R, Ie=1.0
    )
    assert Cs == pytest.approx(expected, rel=1e-12)
    assert which == governs


def test_V():
    # ASCE 7-16 Eq. 12.8-1: (1.2/6.5) × 1100 kip = 203.08 kip (the §5.1 Fpx example)
    assert s12_8_elf.V(1.2 / 6.5, 1100.0) == pytest.approx(203.0769, rel=1e-6)


@pytest.mark.parametrize(
    ("T", "expected"),
    [
        (0.2, 1.0),  # ASCE 7-16 §12.8.3: T <= 0.5 s
        (0.5, 1.0),  # ASCE 7-16 §12.8.3
        (1.5, 1.5),  # ASCE 7-16 §12.8.3: linear interpolation
        (2.5, 2.0),  # ASCE 7-16 §12.8.3: T >= 2.5 s
        (4.0, 2.0),  # ASCE 7-16 §12.8.3
    ],
)
def test_k(T, expected):
    assert s12_8_elf.k(T) == pytest.approx(expected, rel=1e-12)


@given(T1=st.floats(0.01, 10.0), dT=st.floats(0.0, 5.0))
def test_k_continuous_and_monotone(T1, dT):  # ASCE 7-16 §12.8.3: piecewise linear
    T2 = T1 + dT
    k1, k2 = s12_8_elf.k(T1), s12_8_elf.k(T2)
    assert 1.0 <= k1 <= k2 <= 2.0
    assert k2 - k1 <= 0.5 * dT + 1e-12  # slope 1/2 s⁻¹ at most: continuous


def test_Cvx_Fx_Vx_three_storeys():
    # Hand calculation, ASCE 7-16 Eq. 12.8-11/12/13: w = 400/400/300 kip bottom up at
    # h = 1, 2, 3 storey heights, k = 1: Σwh = 400 + 800 + 900 = 2100
    cvx = s12_8_elf.Cvx([400.0, 400.0, 300.0], [1.0, 2.0, 3.0], 1.0)
    assert cvx == pytest.approx([400 / 2100, 800 / 2100, 900 / 2100], rel=1e-12)
    V = 1100.0 * 1.2 / 6.5  # 203.08 kip, Eq. 12.8-1
    forces = [s12_8_elf.Fx(c, V) for c in cvx]
    assert forces == pytest.approx([38.68, 77.36, 87.03], abs=0.01)  # kip, Eq. 12.8-11
    assert s12_8_elf.Vx(forces) == pytest.approx(
        [203.08, 164.40, 87.03], abs=0.01
    )  # 12.8-13


def test_Cvx_k2():
    # ASCE 7-16 Eq. 12.8-12 with k = 2: w h² = 100 × 1, 100 × 4 -> 0.2, 0.8
    assert s12_8_elf.Cvx([100.0, 100.0], [1.0, 2.0], 2.0) == pytest.approx([0.2, 0.8])


levels_st = st.lists(
    st.tuples(st.floats(1.0, 1e7), st.floats(0.5, 100.0)), min_size=1, max_size=12
)


@given(levels=levels_st, k=st.floats(1.0, 2.0), V=st.floats(0.0, 1e8))
def test_distribution_sums_to_base_shear(levels, k, V):  # statics: ΣFx = V
    w = [a for a, _ in levels]
    h = [b for _, b in levels]
    C = s12_8_elf.Cvx(w, h, k)
    assert math.fsum(C) == pytest.approx(1.0, rel=1e-12)
    F = [s12_8_elf.Fx(c, V) for c in C]
    assert math.fsum(F) == pytest.approx(V, rel=1e-12, abs=1e-9)
    assert s12_8_elf.Vx(F)[0] == pytest.approx(V, rel=1e-12, abs=1e-9)


@pytest.mark.parametrize(
    ("call", "needle"),
    [
        (lambda: s12_8_elf.Cs_base(1.0, 0.0, 1.0), "R = 0.0"),
        (lambda: s12_8_elf.Cs_base(-0.1, 6.5, 1.0), "SDS = -0.1"),
        (lambda: s12_8_elf.Ta(0.0488, -3.0, 0.75), "hn = -3.0"),
        (lambda: s12_8_elf.Ta(0.0488, 3.0, 0.0), "x = 0.0"),
        (lambda: s12_8_elf.Cs_max(0.6, 0.0, 8.0, 6.5, 1.0), "T = 0.0"),
        (lambda: s12_8_elf.Cs_min(1.0, 0.0), "Ie = 0.0"),
        (lambda: s12_8_elf.Cu(-0.2), "SD1 = -0.2"),
        (lambda: s12_8_elf.k(float("nan")), "T = nan"),
        (lambda: s12_8_elf.V(0.1, -5.0), "W = -5.0"),
        (lambda: s12_8_elf.Cvx([1.0], [1.0, 2.0], 1.0), "1 weights and 2 heights"),
        (lambda: s12_8_elf.Cvx([1.0, 2.0], [0.0, 2.0], 1.0), "h[0] = 0.0"),
        (lambda: s12_8_elf.Cvx([0.0, 0.0], [1.0, 2.0], 1.0), "zero seismic weight"),
        (lambda: s12_8_elf.Fx(1.5, 10.0), "Cvx = 1.5"),
        (lambda: s12_8_elf.period_used(0.2, 1.4, -1.0), "T (computed period) = -1.0"),
    ],
)
def test_out_of_domain_inputs_name_the_value(call, needle):
    with pytest.raises(ParameterError, match=re.escape(needle)):
        call()


def test_package_exports_every_public_name():  # STYLE §2.8: re-exports with __all__
    import allocation.asce7_16 as pkg
    from allocation.asce7_16 import s12_8_2_period, s12_8_torsion, s12_10_diaphragms

    modules = (s12_8_2_period, s12_8_elf, s12_8_torsion, s12_10_diaphragms)
    public = {name for m in modules for name in m.__all__}
    assert set(pkg.__all__) == public
    assert len(pkg.__all__) == len(public)  # no duplicates
    assert all(getattr(pkg, name) is not None for name in pkg.__all__)
