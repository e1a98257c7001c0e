"""Wall pier stiffness: cantilever pier, SDPWS three-term deflection, basis choice."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from allocation.errors import ParameterError
from allocation.parameters import (
    AnalysisOptions,
    AssemblyKind,
    AssemblyProperties,
    WallStiffness,
)
from allocation.results import ConditionKind
from allocation.stiffness import (
    assign_stiffness,
    cantilever_pier_stiffness,
    sdpws_deflection,
    sdpws_stiffness,
)
from tests.allocation._piers import wall

# US customary to SI, exact by definition
FT, IN = 0.3048, 0.0254  # m
LBF = 4.4482216152605  # N
PLF, PSI, KIP_PER_IN = LBF / FT, LBF / IN**2, 1000.0 * LBF / IN  # N/m, Pa, N/m


@pytest.mark.parametrize(
    ("h", "L", "t", "E", "G", "expected"),
    [
        # I = 3.6 m⁴, A = 1.2 m²: 27/(3·25e9·3.6) + 1.2·3/(1.2·G) = 1.0e-10 + 2.88e-10
        (3.0, 6.0, 0.2, 25e9, 25e9 / 2.4, 1.0 / 3.88e-10),  # common practice
        # I = 0.5625 m⁴, A = 0.75 m²: 2.16e-8 (flexure) + 1.8e-9 (shear) m/N
        (9.0, 3.0, 0.25, 20e9, 8e9, 1.0 / 2.34e-8),  # common practice
    ],
)
def test_cantilever_pier_by_hand(h, L, t, E, G, expected):
    k = cantilever_pier_stiffness(height=h, length=L, thickness=t, E=E, G=G)
    assert k == pytest.approx(expected, rel=1e-12)  # hand arithmetic is exact here


def test_cantilever_pier_rejects_zero_thickness():
    with pytest.raises(ParameterError, match="thickness"):
        cantilever_pier_stiffness(height=3.0, length=2.0, thickness=0.0, E=1e9, G=1e9)


@given(h=st.floats(0.5, 20.0), dh=st.floats(0.01, 5.0), L=st.floats(0.5, 20.0))
def test_cantilever_pier_softens_with_height(h, dh, L):  # common practice: k ∝ 1/(h³+h)
    k1 = cantilever_pier_stiffness(height=h, length=L, thickness=0.2, E=25e9, G=10e9)
    k2 = cantilever_pier_stiffness(
        height=h + dh, length=L, thickness=0.2, E=25e9, G=10e9
    )
    assert k2 < k1


# 8 ft × 4 ft wall, v = 500 plf, 4x6 end posts (A = 19.25 in²), E = 1.6e6 psi,
# Ga = 14 kips/in, Δa = 0.15 in (invented inputs; the equation is the reference).
US = {"v": 500.0, "h": 8.0, "b": 4.0, "E": 1.6e6, "A": 19.25, "Ga": 14.0, "da": 0.15}


def _us_deflection_in(v, h, b, E, A, Ga, da):
    # from memory, AWC SDPWS 2015 Eq. 4.3-1 (v plf, h b ft, E psi, A in², Ga kips/in)
    return 8 * v * h**3 / (E * A * b) + v * h / (1000 * Ga) + h * da / b


def _si(u):
    return {
        "v": u["v"] * PLF,
        "h": u["h"] * FT,
        "b": u["b"] * FT,
        "EA": u["E"] * PSI * u["A"] * IN**2,
        "Ga": u["Ga"] * KIP_PER_IN,
        "slip": u["da"] * IN,
    }


def test_sdpws_three_term_equation_in_us_units():
    delta_in = _us_deflection_in(**US)
    assert delta_in == pytest.approx(0.602338, abs=1e-6)  # hand sum of the 3 terms
    delta = sdpws_deflection(**_si(US))
    assert delta / IN == pytest.approx(delta_in, rel=1e-12)  # same wall, SI inputs


@pytest.mark.parametrize("term", ["bending", "shear", "slip"])
def test_sdpws_each_term_converts(term):
    # isolate one term by making the other two vanish (huge EA / Ga, zero slip)
    u = dict(US)
    if term != "bending":
        u["E"] = 1e30
    if term != "shear":
        u["Ga"] = 1e30
    if term != "slip":
        u["da"] = 0.0
    delta = sdpws_deflection(**_si(u))
    assert delta / IN == pytest.approx(_us_deflection_in(**u), rel=1e-9)  # SDPWS 4.3-1


def test_sdpws_secant_stiffness():
    si = _si(US)
    k = sdpws_stiffness(
        h=si["h"], b=si["b"], EA=si["EA"], Ga=si["Ga"], slip=si["slip"], v=si["v"]
    )
    k_us = US["v"] * US["b"] / _us_deflection_in(**US)  # lb/in, SDPWS Eq. 4.3-1
    assert k / (LBF / IN) == pytest.approx(k_us, rel=1e-12)


@given(v=st.floats(1.0, 1e5))
def test_sdpws_without_slip_is_linear(v):  # δ ∝ v when Δa = 0 (SDPWS Eq. 4.3-1)
    si = _si(US)
    k = sdpws_stiffness(h=si["h"], b=si["b"], EA=si["EA"], Ga=si["Ga"], slip=0.0, v=v)
    k1 = sdpws_stiffness(
        h=si["h"], b=si["b"], EA=si["EA"], Ga=si["Ga"], slip=0.0, v=1.0
    )
    assert k == pytest.approx(k1, rel=1e-12)


def test_sdpws_slip_needs_design_unit_shear():
    with pytest.raises(ParameterError, match="v = 0"):
        sdpws_stiffness(h=2.4, b=1.2, EA=1e8, Ga=2e6, slip=0.004, v=0.0)


# ---- assign_stiffness ----------------------------------------------------------------

CONCRETE = AssemblyProperties(name="cw", kind=AssemblyKind.CONCRETE, E=25e9, G=10e9)
WSP = AssemblyProperties(
    name="sw",
    kind=AssemblyKind.WOOD_PANEL,
    Ga=2.5e6,
    chord_EA=2.0e8,
    hold_down_slip=0.003,
    design_unit_shear=7e3,
)


def _options(basis, *assemblies):
    return AnalysisOptions(wall_stiffness=basis, assemblies=assemblies)


def test_length_basis():
    piers = [
        wall("A", "X", 0, 0, length=3.0, assembly="cw"),
        wall("B", "Y", 5, 5, length=1.5),
    ]
    out, conditions = assign_stiffness(piers, _options(WallStiffness.LENGTH, CONCRETE))
    assert [p.stiffness for p in out] == [3.0, 1.5]  # common practice: k ∝ length
    assert conditions == ()


def test_assembly_basis_uses_each_model():
    piers = [
        wall("A", "X", 0, 0, length=6.0, height=3.0, assembly="cw"),
        wall("B", "Y", 5, 5, length=1.2, height=2.4, assembly="sw"),
    ]
    out, conditions = assign_stiffness(
        piers, _options(WallStiffness.ASSEMBLY, CONCRETE, WSP)
    )
    assert conditions == ()
    assert out[0].stiffness == pytest.approx(
        cantilever_pier_stiffness(
            height=3.0, length=6.0, thickness=0.2, E=25e9, G=10e9
        ),
        rel=1e-12,
    )
    assert out[1].stiffness == pytest.approx(
        sdpws_stiffness(h=2.4, b=1.2, EA=2.0e8, Ga=2.5e6, slip=0.003, v=7e3), rel=1e-12
    )


def test_missing_input_falls_back_to_length_for_the_whole_level():
    no_slip_level = AssemblyProperties(
        name="sw2",
        kind=AssemblyKind.WOOD_PANEL,
        Ga=2.5e6,
        chord_EA=2.0e8,
        hold_down_slip=0.003,
    )
    piers = [
        wall("A", "X", 0, 0, length=6.0, assembly="cw"),
        wall("B", "Y", 5, 5, length=1.2, assembly="sw2"),
        wall("C", "Y", 9, 5, length=2.0, assembly="cw", level="L2"),
    ]
    out, conditions = assign_stiffness(
        piers, _options(WallStiffness.ASSEMBLY, CONCRETE, no_slip_level)
    )
    assert [p.stiffness for p in out[:2]] == pytest.approx([6.0, 1.2])  # no mixing
    assert out[2].stiffness > 1e6  # another level keeps its absolute stiffness [N/m]
    assert len(conditions) == 1
    c = conditions[0]
    assert (c.kind, c.level, c.guids) == (
        ConditionKind.STIFFNESS_FALLBACK,
        "L1",
        ("B",),
    )
    assert "design_unit_shear" in c.detail


@pytest.mark.parametrize(
    ("assembly", "why"),
    [("", "no assembly"), ("nope", "'nope' is not defined"), ("gyp", "no stiffness")],
)
def test_fallback_reasons(assembly, why):
    gyp = AssemblyProperties(name="gyp", kind=AssemblyKind.GYPSUM)
    piers = [wall("A", "X", 0, 0, assembly=assembly)]
    out, conditions = assign_stiffness(piers, _options(WallStiffness.ASSEMBLY, gyp))
    assert out[0].stiffness == pytest.approx(2.0)
    assert why in conditions[0].detail


def test_skewed_pier_does_not_force_a_fallback():
    piers = [
        wall("A", "X", 0, 0, length=6.0, assembly="cw"),
        wall("S", None, 5, 5, length=2.0),
    ]
    out, conditions = assign_stiffness(
        piers, _options(WallStiffness.ASSEMBLY, CONCRETE)
    )
    assert conditions == ()
    assert out[0].stiffness > 1e6
    assert out[1].stiffness == 0.0  # not allocated (reported as skewed elsewhere)
