"""Level forces: ELF (ASCE 7-16 §12.8) and given forces, with Fpx (§12.10.1.1)."""

from __future__ import annotations

import dataclasses
import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from allocation.errors import ParameterError
from allocation.level_forces import GOVERNS_GIVEN, compute_level_forces
from allocation.parameters import Procedure, SeismicParameters
from allocation.results import LevelLoad
from allocation.weights import level_weights
from tests.allocation import _box_building as bb

KIP = 4448.2216152605  # N per kip (exact definition: 1000 lbf × 4.4482216152605 N)
FT = 0.3048  # m per ft, exact


def level(name: str, weight: float, height: float) -> LevelLoad:
    return LevelLoad(
        level=name,
        guid=f"G-{name}",
        elevation=height,
        height=height,
        seismic_weight=weight,
        breakdown=(),
    )


def three_storeys() -> list[LevelLoad]:
    # the LIBRARY-NOTES §5.1 example: w = 400/400/300 kip bottom up, 10 ft storeys
    return [
        level("Level 2", 400 * KIP, 10 * FT),
        level("Level 3", 400 * KIP, 20 * FT),
        level("Roof", 300 * KIP, 30 * FT),
    ]


ELF = SeismicParameters(SDS=1.2, SD1=0.6, S1=0.5, TL=6.0, R=6.5, Ie=1.0, Ct=0.0488)


def test_three_storey_example():
    """Hand calculation, ASCE 7-16 Eq. 12.8-1/2/3/7/11/12/13 and 12.10-1..3 (kip, ft).

    hn = 30 ft = 9.144 m: Ta = 0.0488 × 9.144^0.75 = 0.2566 s (Eq. 12.8-7), so k = 1;
    Cs = 1.2/6.5 = 0.1846 (Eq. 12.8-2; Eq. 12.8-3 gives 0.6/(0.2566 × 6.5) = 0.36);
    V = 0.1846 × 1100 = 203.08 kip; Fx = V × (400, 800, 900)/2100 = 38.7, 77.4, 87.0;
    Fpx = 96.0 (0.2 × 1.2 × 400, Eq. 12.10-2), 96.0 (Eq. 12.10-2), 87.0 (Eq. 12.10-1).
    """
    summary, out = compute_level_forces(three_storeys(), ELF)
    assert summary.hn == pytest.approx(30 * FT)
    assert summary.Ta == pytest.approx(0.2566, abs=5e-4)  # Eq. 12.8-7
    assert summary.Ta == summary.T  # §12.8.2, no computed period
    assert summary.Cu == 1.4  # Table 12.8-1, SD1 = 0.6 (from memory)
    assert summary.k == 1.0  # §12.8.3
    assert summary.Cs == pytest.approx(1.2 / 6.5, rel=1e-12)  # Eq. 12.8-2
    assert summary.Cs_governs == "ASCE 7-16 Eq. 12.8-2"
    assert pytest.approx(1100 * KIP, rel=1e-12) == summary.W
    assert pytest.approx(203.08, abs=0.01) == summary.V / KIP  # Eq. 12.8-1
    kip = [
        (lv.story_force / KIP, lv.story_shear / KIP, lv.diaphragm_force / KIP)
        for lv in out
    ]
    assert [f for f, _, _ in kip] == pytest.approx([38.7, 77.4, 87.0], abs=0.05)  # §5.1
    assert [v for _, v, _ in kip] == pytest.approx([203.08, 164.40, 87.03], abs=0.01)
    assert [p for _, _, p in kip] == pytest.approx([96.0, 96.0, 87.0], abs=0.05)  # §5.1
    assert [lv.Cvx for lv in out] == pytest.approx([4 / 21, 8 / 21, 9 / 21], rel=1e-12)


def test_computed_period_capped_and_k_interpolated():
    # ASCE 7-16 §12.8.2: T = min(2.0, Cu·Ta) = 1.4 × 0.2566 = 0.3592 s -> k = 1
    summary, _ = compute_level_forces(
        three_storeys(), dataclasses.replace(ELF, period=2.0)
    )
    assert pytest.approx(1.4 * summary.Ta, rel=1e-12) == summary.T
    assert summary.k == 1.0  # §12.8.3, T <= 0.5 s


def test_box_building_end_to_end():
    # weights from the model (hand values of test_weights.py: 269 000 N at 3 m,
    # 242 500 N at 6 m), then ASCE 7-16 Eq. 12.8-12 with k = 1 (hand calculation):
    # Σwh = 269 000 × 3 + 242 500 × 6 = 2 262 000; Cvx = 0.35676, 0.64324
    weights = level_weights(bb.box_building(), bb.LOADS, bb.OPTIONS)
    summary, out = compute_level_forces(weights, ELF)
    assert pytest.approx(511_500.0, rel=1e-12) == summary.W
    assert pytest.approx(511_500.0 * 1.2 / 6.5, rel=1e-12) == summary.V  # Eq. 12.8-2
    assert [lv.Cvx for lv in out] == pytest.approx(
        [807_000 / 2_262_000, 1_455_000 / 2_262_000], rel=1e-12
    )
    assert out[0].masses == weights[0].masses  # weights and masses carried through


def test_given_forces():
    given = (("Roof", 90_000.0), ("Level 2", 40_000.0), ("Level 3", 70_000.0))
    seismic = dataclasses.replace(ELF, procedure=Procedure.GIVEN, level_forces=given)
    summary, out = compute_level_forces(three_storeys(), seismic)
    assert [lv.story_force for lv in out] == [40_000.0, 70_000.0, 90_000.0]
    assert summary.V == 200_000.0  # V = ΣFx (given forces)
    assert summary.Cs == pytest.approx(200_000.0 / (1100 * KIP), rel=1e-12)  # V/W
    assert summary.Cs_governs == GOVERNS_GIVEN
    assert summary.procedure == "given"
    assert summary.Ta == pytest.approx(0.2566, abs=5e-4)  # still computed, Eq. 12.8-7
    assert [lv.Cvx for lv in out] == [0.0, 0.0, 0.0]
    assert [lv.story_shear for lv in out] == [200_000.0, 160_000.0, 90_000.0]  # 12.8-13
    # Roof Fpx, Eq. 12.10-1: 90 000 N; 0.2 × 1.2 × 300 kip = 320 kN floor governs
    assert out[2].diaphragm_force == pytest.approx(0.24 * 300 * KIP, rel=1e-12)


@pytest.mark.parametrize(
    ("forces", "needle"),
    [
        ((("Roof", 1.0), ("Level 2", 1.0)), "no force given for 'Level 3'"),
        ((("Roof", 1.0), ("Level 2", 1.0), ("Level 3", 1.0), ("Attic", 1.0)),
         "level_forces.Attic: not a diaphragm level of the model; levels: 'Level 2'"),
    ],
)  # fmt: skip
def test_given_forces_must_match_the_levels(forces, needle):
    seismic = dataclasses.replace(ELF, procedure=Procedure.GIVEN, level_forces=forces)
    with pytest.raises(ParameterError, match=needle):
        compute_level_forces(three_storeys(), seismic)


def test_bad_levels():
    with pytest.raises(ParameterError, match="no diaphragm levels"):
        compute_level_forces([], ELF)
    with pytest.raises(ParameterError, match=r"level 'L' \(GUID G-L\): height"):
        compute_level_forces([level("L", 1.0, 0.0)], ELF)


@given(
    levels=st.lists(
        st.tuples(st.floats(1e3, 1e7), st.floats(0.5, 10.0)), min_size=1, max_size=10
    ),
    SDS=st.floats(0.05, 2.5),
    ratio=st.floats(0.2, 1.0),
    period=st.one_of(st.none(), st.floats(0.05, 6.0)),
)
def test_equilibrium_and_bounds(levels, SDS, ratio, period):
    z = 0.0
    loads = []
    for i, (w, dz) in enumerate(levels):
        z += dz
        loads.append(level(f"L{i}", w, z))
    seismic = SeismicParameters(SDS=SDS, SD1=ratio * SDS, S1=0.7, R=5.0, period=period)
    summary, out = compute_level_forces(loads, seismic)
    F = math.fsum(lv.story_force for lv in out)
    assert pytest.approx(summary.V, rel=1e-12) == F  # statics: ΣFx = V
    assert out[0].story_shear == pytest.approx(summary.V, rel=1e-12)  # Eq. 12.8-13
    assert math.fsum(lv.Cvx for lv in out) == pytest.approx(1.0, rel=1e-12)
    for lv in out:  # Eq. 12.10-2 <= Fpx <= Eq. 12.10-3
        lo, hi = 0.2 * SDS * lv.seismic_weight, 0.4 * SDS * lv.seismic_weight
        assert lo * (1 - 1e-12) <= lv.diaphragm_force <= hi * (1 + 1e-12)
