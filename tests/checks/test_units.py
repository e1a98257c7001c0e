"""Tests of checks/units.py: config quantities to SI, SI to display units.

Reference values are the exact definitions of the international foot and pound
(NIST SP 811, 2008 edition, Appendix B): 1 ft = 0.3048 m, 1 in = 0.0254 m,
1 lbf = 0.45359237 kg x 9.80665 m/s² = 4.4482216152605 N, all exact; 1 kip = 1000 lbf
and 1 ksi = 1000 psi by definition.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checks.errors import ConfigError
from checks.project import DisplayUnits
from checks.units import (
    DISPLAY_QUANTITIES,
    Q_,
    format_value,
    parse_quantity,
    to_display,
    ureg,
)

FT = 0.3048  # NIST SP 811 App. B, exact
IN = 0.0254  # NIST SP 811 App. B, exact
LBF = 0.45359237 * 9.80665  # NIST SP 811 App. B, exact: 4.4482216152605 N
WHERE = "demo.toml: assemblies[0].unit_shear_capacity"


@pytest.mark.parametrize(
    ("text", "units", "expected"),
    [
        ("260 plf", "N/m", 260 * LBF / FT),  # NIST SP 811: plf = lbf/ft
        ("3.8 kN/m", "N/m", 3800.0),  # SI prefix k = 1e3
        ("2 klf", "N/m", 2000 * LBF / FT),  # klf = kip/ft, kip = 1000 lbf
        ("15 psf", "Pa", 15 * LBF / FT**2),  # NIST SP 811: psf = lbf/ft²
        ("0.72 kPa", "Pa", 720.0),  # SI prefix
        ("1.5 ksf", "Pa", 1500 * LBF / FT**2),  # ksf = kip/ft²
        ("4000 psi", "Pa", 4000 * LBF / IN**2),  # psi = lbf/in²
        ("60 ksi", "Pa", 60000 * LBF / IN**2),  # ksi = 1000 psi
        ("150 pcf", "N/m**3", 150 * LBF / FT**3),  # pcf = lbf/ft³
        ("10 kip", "N", 10000 * LBF),  # kip = 1000 lbf
        ("120 kN", "N", 120000.0),  # SI prefix
        ("6 in", "m", 6 * IN),  # NIST SP 811
        ("0.5m", "m", 0.5),  # no space needed
        ("8.25 in**2", "m**2", 8.25 * IN**2),  # NIST SP 811
        ("20 kip/in", "N/m", 20000 * LBF / IN),  # SDPWS Ga units
        ("10 deg", "rad", math.radians(10)),  # 1 deg = pi/180 rad
        ("8 s", "s", 8.0),  # SI
        ("1.6e6 psi", "Pa", 1.6e6 * LBF / IN**2),  # exponent notation
        ("-3 ft", "m", -3 * FT),  # the sign is the caller's to judge
    ],
)
def test_parse_quantity_converts_to_si(text, units, expected):
    assert parse_quantity(text, units, where=WHERE) == pytest.approx(
        expected, rel=1e-12
    )


def test_kip_and_ksi_are_pint_builtins_with_their_definitions():
    kip_in_lbf = 1000.0  # kip = 1000 lbf, by definition
    ksi_in_psi = 1000.0  # ksi = 1000 psi, by definition
    assert Q_(1, "kip").m_as("lbf") == pytest.approx(kip_in_lbf, rel=1e-15)
    assert Q_(1, "ksi").m_as("psi") == pytest.approx(ksi_in_psi, rel=1e-15)
    assert Q_(1, "plf").m_as("N/m") == pytest.approx(LBF / FT, rel=1e-15)  # NIST SP 811


def test_one_registry_for_the_project():  # pint docs: one registry per package
    assert Q_(1, "plf")._REGISTRY is ureg


@pytest.mark.parametrize(
    ("text", "units", "fragment"),
    [
        ("260", "N/m", "has no unit; write e.g. '260 plf'"),
        (260, "N/m", "has no unit; write e.g. '260 plf'"),
        (2.5, "Pa", "has no unit; write e.g. '15 psf'"),
        (
            "260 psf",
            "N/m",
            "that is a pressure, expected a force per length such as '260 plf' or "
            "'3.8 kN/m'",
        ),
        (
            "10 lb",
            "N",
            "a mass, expected a force such as '10 kip' or '45 kN' ('lb' is a mass",
        ),
        ("5 m", "rad", "that is a length, expected an angle"),
        ("260 lb/ft", "N/m", "('lb' is a mass: write 'lbf' or 'kip' for a force)"),
        (
            "15 lb/ft**2",
            "Pa",
            "expected a pressure such as '15 psf' or '0.72 kPa' ('lb'",
        ),
        ("10 %", "rad", "a plain ratio, expected an angle"),
        ("nan psf", "Pa", "not a finite number"),
        ("inf plf", "N/m", "not a finite number"),
        ("1e999 N", "N", "not a finite number"),
        ("lots of plf", "N/m", "cannot read it"),
        ("260 plff", "N/m", "cannot read the unit"),
        ("3 (m", "m", "cannot read the unit"),
        ("2 m**2**99", "m**2", "nested powers"),
        (True, "N", "expected a quantity such as"),
        (["260 plf"], "N/m", "expected a quantity such as"),
        ("9" * 100 + " N", "N", "too long"),
    ],
)
def test_parse_quantity_refuses_with_one_line_naming_the_key(text, units, fragment):
    with pytest.raises(ConfigError) as info:
        parse_quantity(text, units, where=WHERE)
    message = str(info.value)
    assert message.startswith(f"{WHERE} = ")
    assert fragment in message
    assert "\n" not in message


@pytest.mark.parametrize(
    ("value_si", "quantity", "system", "expected"),
    [
        (260 * LBF / FT, "force_per_length", DisplayUnits.IMPERIAL, "260 plf"),  # NIST
        (3794.4, "force_per_length", DisplayUnits.SI, "3.79 kN/m"),  # SI prefix
        (10000 * LBF, "force", DisplayUnits.IMPERIAL, "10.0 kip"),  # kip = 1000 lbf
        (10000 * LBF, "weight", DisplayUnits.SI, "44.5 kN"),  # 44.482 kN
        (15 * LBF / FT**2, "pressure", DisplayUnits.IMPERIAL, "15.0 psf"),  # NIST
        (718.2, "pressure", DisplayUnits.SI, "0.718 kPa"),  # SI prefix
        (10 * FT, "length", DisplayUnits.IMPERIAL, "10.0 ft"),  # NIST
        (1.0, "area", DisplayUnits.IMPERIAL, "10.8 ft²"),  # 1/0.3048² = 10.764
        (2.5, "area", DisplayUnits.SI, "2.50 m²"),
        (1000 * LBF * FT, "moment", DisplayUnits.IMPERIAL, "1.00 kip·ft"),  # NIST
        (12_500.0, "moment", DisplayUnits.SI, "12.5 kN·m"),
        (0.0, "force", DisplayUnits.SI, "0 kN"),
        (-2000.0, "force", DisplayUnits.SI, "-2.00 kN"),
    ],
)
def test_format_value(value_si, quantity, system, expected):
    assert format_value(value_si, quantity, system) == expected


def test_format_value_near_the_largest_float_gives_text_not_an_error():
    # IEEE 754 binary64: the largest finite value rounds to 1.80e308 at three
    # figures, which is past it (inf); the text stays finite and readable
    assert format_value(1.7976931348623157e308, "length", DisplayUnits.SI) == (
        "1.8e+308 m"
    )


def test_to_display_returns_python_float_and_label():
    value, label = to_display(4448.2216152605, "force", DisplayUnits.IMPERIAL)
    assert type(value) is float
    assert value == pytest.approx(1.0, rel=1e-12)  # 1 kip = 4448.2216 N, NIST SP 811
    assert label == "kip"


def test_to_display_refuses_unknown_quantity():
    with pytest.raises(ValueError, match="unknown quantity kind 'speed'"):
        to_display(1.0, "speed", DisplayUnits.SI)


@settings(max_examples=200, derandomize=True)
@given(
    value=st.floats(1e-3, 1e9),
    quantity=st.sampled_from(sorted(DISPLAY_QUANTITIES)),
    system=st.sampled_from(list(DisplayUnits)),
)
def test_display_then_parse_round_trips(value, quantity, system):
    # pint round trip: a displayed value read back as a config quantity is the SI value
    shown, label = to_display(value, quantity, system)
    si_units = DISPLAY_QUANTITIES[quantity][0]
    back = parse_quantity(f"{shown!r} {label}", si_units, where="x.toml: k")
    assert back == pytest.approx(value, rel=1e-12)


@settings(max_examples=300, derandomize=True)
@given(text=st.text(max_size=40))
def test_parse_quantity_raises_only_config_error(text):  # fuzz: any text
    try:
        value, message = parse_quantity(text, "N/m", where="fuzz.toml: k"), ""
    except ConfigError as exc:
        value, message = 0.0, str(exc)
    assert math.isfinite(value)
    assert "\n" not in message
