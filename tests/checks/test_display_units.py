"""Display units against independent conversion factors, and results.json staying SI.

Factors: NIST SP 811 (2008) Appendix B.8, cross-checked with a fresh pint registry that
shares nothing with ``checks.units``.
"""

from __future__ import annotations

import json

import pint
import pytest

from checks.project import DisplayUnits
from checks.report.results_json import write_results_json
from checks.units import format_value, to_display

IMP, SI = DisplayUnits.IMPERIAL, DisplayUnits.SI
LBF = 0.45359237 * 9.80665  # N, exact: 1 lb = 0.453 592 37 kg, g_n (NIST SP 811 B.8)
KIP = 4448.2216152605  # N, NIST SP 811 B.8: 1 kip = 1000 lbf = 4.448 221 615 260 5 kN
PLF = 14.593902937  # N/m per lbf/ft, NIST SP 811 B.8 (14.593 90)
FT = 0.3048  # m, exact (NIST SP 811 B.8)
PSF = LBF / FT**2  # Pa per lbf/ft² = 47.880 259 0, NIST SP 811 B.8 (47.880 26)


@pytest.mark.parametrize(
    ("value_si", "quantity", "system", "expected", "unit"),
    [
        (KIP, "force", IMP, 1.0, "kip"),  # NIST SP 811 B.8
        (KIP, "weight", IMP, 1.0, "kip"),  # NIST SP 811 B.8
        (1000.0, "force", SI, 1.0, "kN"),  # SI prefix k = 10³
        (FT, "length", IMP, 1.0, "ft"),  # exact
        (3.0, "length", SI, 3.0, "m"),  # identity
        (260.0 * PLF, "force_per_length", IMP, 260.0, "plf"),  # NIST SP 811 B.8
        (3794.4147636, "force_per_length", SI, 3.7944147636, "kN/m"),  # SI prefix
        (15.0 * PSF, "pressure", IMP, 15.0, "psf"),  # NIST SP 811 B.8
        (720.0, "pressure", SI, 0.72, "kPa"),  # SI prefix
        (FT * FT, "area", IMP, 1.0, "ft²"),  # exact
        (KIP * FT, "moment", IMP, 1.0, "kip·ft"),  # NIST SP 811 B.8
        (1000.0, "moment", SI, 1.0, "kN·m"),  # SI prefix
    ],
)
def test_to_display(value_si, quantity, system, expected, unit):
    value, label = to_display(value_si, quantity, system)
    assert value == pytest.approx(expected, rel=1e-9)  # factors to 11+ digits
    assert label == unit


def test_factor_constants_are_consistent():
    assert pytest.approx(KIP, rel=1e-14) == LBF * 1000.0  # NIST SP 811 B.8
    assert pytest.approx(PLF, rel=1e-10) == KIP / 1000.0 / FT  # NIST SP 811 B.8
    assert pytest.approx(47.88026, rel=1e-6) == PSF  # NIST SP 811 B.8, 7 digits


def test_factors_agree_with_an_independent_pint_registry():
    u = pint.UnitRegistry()  # not the project's registry
    assert u.Quantity(1, "kip").m_as("N") == pytest.approx(KIP, rel=1e-12)  # pint
    assert u.Quantity(1, "lbf/ft").m_as("N/m") == pytest.approx(PLF, rel=1e-9)  # pint
    assert u.Quantity(1, "lbf/ft**2").m_as("Pa") == pytest.approx(PSF, rel=1e-9)  # pint
    for si, quantity, unit in (
        (12345.6, "force", "kip"),
        (987.0, "force_per_length", "lbf/ft"),
        (2100.0, "pressure", "lbf/ft**2"),
        (7.7, "length", "ft"),
    ):
        base = {
            "force": "N",
            "force_per_length": "N/m",
            "pressure": "Pa",
            "length": "m",
        }
        expected = u.Quantity(si, base[quantity]).m_as(unit)
        assert to_display(si, quantity, IMP)[0] == pytest.approx(expected, rel=1e-9)


@pytest.mark.parametrize(
    ("value_si", "quantity", "system", "text"),
    [
        (
            260.0 * PLF,
            "force_per_length",
            IMP,
            "260 plf",
        ),  # NIST SP 811 B.8; 3 sig. figs
        (3794.4147636, "force_per_length", SI, "3.79 kN/m"),  # 3 significant figures
        (47.5 * KIP, "force", IMP, "47.5 kip"),  # NIST SP 811 B.8
        (0.722 * KIP, "force", IMP, "0.722 kip"),  # NIST SP 811 B.8
        (30.0 * FT, "length", IMP, "30.0 ft"),  # exact
        (15.0 * PSF, "pressure", IMP, "15.0 psf"),  # NIST SP 811 B.8
        (0.0, "force", SI, "0 kN"),
        (123456.0, "force", SI, "123 kN"),  # whole number kept whole
    ],
)
def test_format_value(value_si, quantity, system, text):
    assert format_value(value_si, quantity, system) == text


def test_results_json_stays_si(tmp_path):
    from tests.checks.report._demo_run import demo_run

    run = demo_run()
    alloc, checks = run.allocation, run.checks.pier_checks
    path = write_results_json(
        tmp_path / "results.json", alloc, source="demo", pier_checks=checks
    )
    doc = json.loads(path.read_text(encoding="utf-8"))
    assert doc["units"]["force"] == "N"
    assert doc["units"]["length"] == "m"
    assert doc["seismic"]["V"] == alloc.seismic.V
    for lv, out in zip(alloc.levels, doc["levels"], strict=True):
        assert out["story_force"] == lv.story_force
        assert out["diaphragm_force"] == lv.diaphragm_force
    for p, out in zip(alloc.piers, doc["walls"], strict=True):
        env = alloc.envelope[p.id]
        assert out["guid"] == p.guid
        assert out["length"] == p.length
        assert out["force"] == {
            "flexible": env.flexible,
            "rigid": env.rigid,
            "envelope": env.envelope,
        }
        assert out["unit_shear"] == checks[p.id].unit_shear
        assert out["capacity"] == checks[p.id].capacity
