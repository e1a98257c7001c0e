"""Load combination factors and the seismic design category."""

from __future__ import annotations

import pytest

from allocation.parameters import SeismicParameters
from checks.project import DesignBasis
from checks.rules.asce7_16.load_combinations import (
    combination_clause,
    counteracting_dead_factor,
    seismic_factor,
)
from checks.rules.asce7_16.seismic_design_category import seismic_design_category


def test_factors():
    assert seismic_factor(DesignBasis.ASD) == 0.7  # ASCE 7-16 §2.4.5 combinations 8, 10
    assert seismic_factor(DesignBasis.LRFD) == 1.0  # ASCE 7-16 §2.3.6 combinations 6, 7
    # ASCE 7-16 §2.4.5 combination 10: 0.6 − 0.14·SDS
    assert counteracting_dead_factor(DesignBasis.ASD, 1.0) == pytest.approx(0.46)
    # ASCE 7-16 §2.3.6 combination 7: 0.9 − 0.2·SDS
    assert counteracting_dead_factor(DesignBasis.LRFD, 1.0) == pytest.approx(0.7)
    assert combination_clause(DesignBasis.LRFD) == "ASCE 7-16 §2.3.6"


@pytest.mark.parametrize(
    ("SDS", "SD1", "S1", "Ie", "sdc"),
    [
        (0.10, 0.05, 0.04, 1.0, "A"),  # Tables 11.6-1/11.6-2 (from memory)
        (
            0.20,
            0.05,
            0.04,
            1.0,
            "B",
        ),  # ASCE 7-16 Table 11.6-1: 0.167 ≤ SDS < 0.33 (from memory)
        (0.20, 0.05, 0.04, 1.5, "C"),  # same, Risk Category IV (Ie = 1.5, Table 1.5-2)
        (
            0.40,
            0.10,
            0.08,
            1.0,
            "C",
        ),  # ASCE 7-16 Table 11.6-1: 0.33 ≤ SDS < 0.50 (from memory)
        (
            0.30,
            0.25,
            0.20,
            1.0,
            "D",
        ),  # ASCE 7-16 Table 11.6-2: SD1 ≥ 0.20 governs (from memory)
        (1.00, 0.60, 0.62, 1.0, "D"),  # the DESIGN.md example values
        (
            1.50,
            0.90,
            0.80,
            1.0,
            "E",
        ),  # ASCE 7-16 §11.6: S1 ≥ 0.75, RC I–III (from memory)
        (1.50, 0.90, 0.80, 1.5, "F"),  # ASCE 7-16 §11.6: S1 ≥ 0.75, RC IV (from memory)
    ],
)
def test_seismic_design_category(SDS, SD1, S1, Ie, sdc):
    got = seismic_design_category(SeismicParameters(SDS=SDS, SD1=SD1, S1=S1, Ie=Ie))
    assert got.sdc == sdc
    assert not got.assumed


def test_given_forces_assume_sdc_d():
    got = seismic_design_category(SeismicParameters())
    assert got.sdc == "D"
    assert got.assumed
