"""Tests of checks/capacity.py: wall unit shear capacity per design basis.

Concrete: ACI 318-19 §18.10.4.1, Vn = Acv (αc λ √f'c + ρt fy) in psi, hand-computed
here in the US units of the code; φ = 0.60 of ACI 318-19 §21.2.4.1 and the cap
10 √f'c of §18.10.4.4 are from memory. Wood: AWC SDPWS 2015 §4.3.3.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from allocation.parameters import AssemblyKind, AssemblyProperties
from checks.capacity import alpha_c, concrete_nominal_shear_stress, wall_unit_capacity
from checks.project import Assembly, ConcreteParams, DesignBasis
from ifc_bridge.shear_walls import MatchRule

IN = 0.0254  # NIST SP 811 App. B, exact
FT = 0.3048  # NIST SP 811 App. B, exact
LBF = 4.4482216152605  # NIST SP 811 App. B, exact
PSI = LBF / IN**2
PLF = LBF / FT
ROOT_4000 = math.sqrt(4000.0)  # 63.246 psi


def concrete(fc_psi=4000.0, fy_psi=60000.0, rho_t=0.0025, lam=1.0) -> ConcreteParams:
    return ConcreteParams(fc=fc_psi * PSI, fy=fy_psi * PSI, rho_t=rho_t, lambda_=lam)


def assembly(**kw) -> Assembly:
    kind = kw.pop("kind", AssemblyKind.WOOD_PANEL)
    return Assembly(
        name="A",
        kind=kind,
        match=MatchRule(assembly="A", type_name="A"),
        properties=AssemblyProperties(name="A", kind=kind),
        **kw,
    )


@pytest.mark.parametrize(
    ("hw_lw", "expected"),
    [
        (0.5, 3.0),  # ACI 318-19 §18.10.4.1: hw/lw <= 1.5
        (1.5, 3.0),  # ACI 318-19 §18.10.4.1
        (1.75, 2.5),  # ACI 318-19 §18.10.4.1: linear between 1.5 and 2.0
        (2.0, 2.0),  # ACI 318-19 §18.10.4.1: hw/lw >= 2.0
        (4.0, 2.0),  # ACI 318-19 §18.10.4.1
    ],
)
def test_alpha_c(hw_lw, expected):
    assert alpha_c(hw_lw) == pytest.approx(expected)


@pytest.mark.parametrize(
    ("params", "hw_lw", "expected_psi"),
    [
        # ACI 318-19 §18.10.4.1: 3 x 63.246 + 0.0025 x 60000 = 339.74 psi
        (concrete(), 1.0, 3 * ROOT_4000 + 150.0),
        # ACI 318-19 §18.10.4.1: 2.5 x 63.246 + 150 = 308.11 psi
        (concrete(), 1.75, 2.5 * ROOT_4000 + 150.0),
        # ACI 318-19 §18.10.4.1: 2 x 63.246 + 150 = 276.49 psi
        (concrete(), 2.5, 2 * ROOT_4000 + 150.0),
        # ACI 318-19 §18.10.4.1 with λ = 0.75 (lightweight): 142.30 + 150 = 292.30 psi
        (concrete(lam=0.75), 1.0, 0.75 * 3 * ROOT_4000 + 150.0),
        # ACI 318-19 §18.10.4.4 cap 10 √f'c = 632.46 psi (from memory) < 789.7 psi
        (concrete(rho_t=0.01), 1.0, 10 * ROOT_4000),
    ],
)
def test_concrete_nominal_shear_stress(params, hw_lw, expected_psi):
    got = concrete_nominal_shear_stress(params, hw_lw)
    assert got == pytest.approx(expected_psi * PSI, rel=1e-12)


def test_hand_value_339_7_psi():
    # ACI 318-19 §18.10.4.1 worked by hand: f'c 4000 psi, ρt 0.0025, fy 60 ksi, hw/lw 1
    got_psi = concrete_nominal_shear_stress(concrete(), 1.0) / PSI
    assert got_psi == pytest.approx(339.7, abs=0.05)  # rounded to 0.1 psi


def test_si_form_of_alpha_c_agrees_with_psi_form():
    # ACI 318-19 (SI edition) writes αc as 0.25 and 0.17 for √f'c in MPa (from memory):
    # 3 √(psi) = 3 √(0.0068948 MPa) = 0.249 √MPa and 2 -> 0.166, so they agree to ~2 %
    fc_mpa = 4000 * PSI / 1e6
    c = concrete(rho_t=0.0)
    assert concrete_nominal_shear_stress(c, 1.0) / 1e6 == pytest.approx(
        0.25 * math.sqrt(fc_mpa), rel=1e-2
    )
    assert concrete_nominal_shear_stress(c, 3.0) / 1e6 == pytest.approx(
        0.17 * math.sqrt(fc_mpa), rel=2.5e-2
    )


@pytest.mark.parametrize(
    ("basis", "expected_plf"),
    [
        # ACI 318-19 §18.10.4.1, φ = 0.60 (§21.2.4.1, from memory): 0.6 x 8 in x 339.74
        # psi = 1630.7 lb/in = 19569 plf
        (DesignBasis.LRFD, 0.6 * 8 * (3 * ROOT_4000 + 150.0) * 12),
        # common practice: ASD = 0.7 x φVn (ASCE 7-16 §2.4.5 uses 0.7E): 13698 plf
        (DesignBasis.ASD, 0.7 * 0.6 * 8 * (3 * ROOT_4000 + 150.0) * 12),
    ],
)
def test_concrete_wall_unit_capacity(basis, expected_plf):
    a = assembly(kind=AssemblyKind.CONCRETE, concrete=concrete())
    got = wall_unit_capacity(
        a, length=10 * FT, height=10 * FT, thickness=8 * IN, basis=basis
    )
    assert got == pytest.approx(expected_plf * PLF, rel=1e-9)


def test_concrete_wall_unit_capacity_hand_numbers():
    a = assembly(kind=AssemblyKind.CONCRETE, concrete=concrete())
    got = wall_unit_capacity(
        a, length=3.0, height=3.0, thickness=8 * IN, basis=DesignBasis.LRFD
    )
    assert got / PLF == pytest.approx(19569, abs=1)  # hand: 0.6 x 8 x 339.74 x 12 plf


@pytest.mark.parametrize("thickness", [0.0, -0.2, math.nan])
def test_concrete_without_geometry_has_no_capacity(thickness):
    a = assembly(kind=AssemblyKind.CONCRETE, concrete=concrete())
    got = wall_unit_capacity(
        a, length=3.0, height=3.0, thickness=thickness, basis=DesignBasis.LRFD
    )
    assert got is None


@pytest.mark.parametrize("basis", list(DesignBasis))
def test_user_capacity_always_wins(basis):  # config spec: unit_shear_capacity wins
    a = assembly(
        unit_shear_capacity=260 * PLF,
        nominal_unit_shear=680 * PLF,
        capacity_source="user",
    )
    got = wall_unit_capacity(a, length=2.0, height=2.7, thickness=0.15, basis=basis)
    assert got == pytest.approx(260 * PLF)


def test_user_capacity_wins_for_concrete():
    a = assembly(
        kind=AssemblyKind.CONCRETE,
        concrete=concrete(),
        unit_shear_capacity=5000 * PLF,
        capacity_source="user",
    )
    got = wall_unit_capacity(
        a, length=3, height=3, thickness=0.2, basis=DesignBasis.ASD
    )
    assert got == pytest.approx(5000 * PLF)


@pytest.mark.parametrize(
    ("basis", "expected_plf"),
    [
        (DesignBasis.ASD, 340.0),  # SDPWS 2015 §4.3.3: 680 / 2.0, from memory
        (DesignBasis.LRFD, 544.0),  # SDPWS 2015 §4.3.3: 0.8 x 680, from memory
    ],
)
def test_nominal_unit_shear_per_basis(basis, expected_plf):
    a = assembly(nominal_unit_shear=680 * PLF, capacity_source="SDPWS 2015 Table 4.3A")
    got = wall_unit_capacity(a, length=2.0, height=2.7, thickness=0.15, basis=basis)
    assert got == pytest.approx(expected_plf * PLF)


def test_nothing_given_gives_none():
    a = assembly(kind=AssemblyKind.MASONRY)
    assert wall_unit_capacity(a, length=2, height=3, thickness=0.2, basis="ASD") is None


@settings(max_examples=100, derandomize=True)
@given(
    fc=st.floats(2500, 10000),
    rho=st.floats(0.0025, 0.02),
    hw_lw=st.floats(0.2, 5.0),
    scale=st.floats(0.5, 4.0),
    t=st.floats(0.1, 0.6),
)
def test_concrete_capacity_properties(fc, rho, hw_lw, scale, t):
    base = concrete(fc_psi=fc, rho_t=rho)
    v = concrete_nominal_shear_stress(base, hw_lw)
    # ACI 318-19 §18.10.4.1: more steel, stronger concrete, squatter wall -> not weaker
    assert (
        concrete_nominal_shear_stress(concrete(fc_psi=fc, rho_t=rho * 1.1), hw_lw) >= v
    )
    assert (
        concrete_nominal_shear_stress(concrete(fc_psi=fc * 1.1, rho_t=rho), hw_lw) >= v
    )
    assert concrete_nominal_shear_stress(base, hw_lw * 0.9) >= v
    assert v <= 10 * math.sqrt(fc) * PSI * (1 + 1e-12)  # ACI 318-19 §18.10.4.4 cap
    # per unit length the capacity depends on thickness and hw/lw only (Acv = lw t)
    a = assembly(kind=AssemblyKind.CONCRETE, concrete=base)
    one = wall_unit_capacity(
        a, length=3.0, height=3.0 * hw_lw, thickness=t, basis="LRFD"
    )
    scaled = wall_unit_capacity(
        a, length=3.0 * scale, height=3.0 * scale * hw_lw, thickness=t, basis="LRFD"
    )
    assert scaled == pytest.approx(one, rel=1e-9)
    double = wall_unit_capacity(
        a, length=3.0, height=3.0 * hw_lw, thickness=2 * t, basis="LRFD"
    )
    assert double == pytest.approx(2 * one, rel=1e-12)
