"""The project's single pint registry: parsing config quantities, formatting outputs.

Everything inside shearline is coherent SI (m, N, Pa, rad, s); units exist only at the
edges. ``parse_quantity`` turns a config string such as ``"260 plf"`` into its SI
magnitude, and ``to_display`` / ``format_value`` turn an SI value into the units of the
project's ``display_units`` for the human-readable writers. Every conversion goes
through pint; this module adds the trade's units pint lacks (plf, klf, psf, ksf, pcf).
"""

from __future__ import annotations

import functools
import math
import re
from typing import Final

import pint

from checks.errors import ConfigError
from checks.project import DisplayUnits

__all__ = [
    "DISPLAY_QUANTITIES",
    "Q_",
    "format_value",
    "parse_quantity",
    "show_value",
    "to_display",
    "ureg",
]



def _registry() -> pint.UnitRegistry:
    """pint's default registry, its parsed definitions cached on disk when possible.

    Parsing pint's definitions file costs ~0.3 s at every start; pint's own cache
    (``cache_folder=":auto:"``, the user cache directory) brings that to ~0.05 s. A
    cache that cannot be written or read falls back to parsing.
    """
    try:
        return pint.UnitRegistry(cache_folder=":auto:")
    except Exception:
        return pint.UnitRegistry()


ureg: Final = _registry()
# pint 0.25 already defines kip (1000 lbf) and ksi; these are the ones it lacks.
ureg.define("plf = lbf / foot")
ureg.define("klf = kip / foot")
ureg.define("psf = lbf / foot ** 2")
ureg.define("ksf = kip / foot ** 2")
ureg.define("pcf = lbf / foot ** 3")
Q_: Final = ureg.Quantity

# Dimensionality -> (a/an name, examples) for error messages.
_DIMENSIONS: Final = {
    ureg.parse_units("N").dimensionality: ("a force", "'10 kip' or '45 kN'"),
    ureg.parse_units("N/m").dimensionality: (
        "a force per length",
        "'260 plf' or '3.8 kN/m'",
    ),
    ureg.parse_units("Pa").dimensionality: ("a pressure", "'15 psf' or '0.72 kPa'"),
    ureg.parse_units("m").dimensionality: ("a length", "'0.5 m' or '6 in'"),
    ureg.parse_units("m**2").dimensionality: (
        "an area",
        "'8.25 in**2' or '0.005 m**2'",
    ),
    ureg.parse_units("s").dimensionality: ("a time", "'8 s'"),
    ureg.parse_units("N*m").dimensionality: ("a moment", "'12 kip*ft' or '16 kN*m'"),
    ureg.parse_units("N/m**3").dimensionality: ("a unit weight", "'150 pcf'"),
    ureg.parse_units("kg").dimensionality: ("a mass", "'1000 kg'"),
}
_ANGLE_UNITS: Final = frozenset(
    {"radian", "degree", "arcminute", "arcsecond", "turn", "gradian"}
)
_NUMBER: Final = re.compile(
    r"\s*([+-]?(?:(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?|nan|inf(?:inity)?))(.*)",
    re.IGNORECASE | re.DOTALL,
)
# A power of a power (``m**2**9``) would let a config string make pint compute huge
# numbers; no unit of the trade needs one.
_POWER_CHAIN: Final = re.compile(r"(\*\*|\^)[^*/^]*(\*\*|\^)")
_MAX_TEXT: Final = 80
_ACCELERATION: Final = ureg.parse_units("m/s**2")

# Display units per quantity kind: (imperial, SI), each (pint unit, label).
DISPLAY_QUANTITIES: Final[dict[str, tuple[str, tuple[str, str], tuple[str, str]]]] = {
    "force": ("N", ("kip", "kip"), ("kN", "kN")),
    "weight": ("N", ("kip", "kip"), ("kN", "kN")),
    "length": ("m", ("ft", "ft"), ("m", "m")),
    "force_per_length": ("N/m", ("plf", "plf"), ("kN/m", "kN/m")),
    "pressure": ("Pa", ("psf", "psf"), ("kPa", "kPa")),
    "area": ("m**2", ("ft**2", "ft²"), ("m**2", "m²")),
    "moment": ("N*m", ("kip*ft", "kip·ft"), ("kN*m", "kN·m")),
}


def show_value(value: object, limit: int = 60) -> str:
    """A short one-line ``repr`` of a config value for error messages."""
    if isinstance(value, int) and not isinstance(value, bool) and abs(value) > 10**18:
        return "<a very large integer>"
    text = repr(value).replace("\n", " ")
    return text if len(text) <= limit else text[: limit - 3] + "..."


def _describe(units: pint.Unit) -> tuple[str, str]:
    dim = units.dimensionality
    if dim in _DIMENSIONS:
        return _DIMENSIONS[dim]
    items = list(Q_(1.0, units).unit_items())
    if not dim and len(items) == 1 and items[0][0] in _ANGLE_UNITS and items[0][1] == 1:
        return ("an angle", "'10 deg'")
    if not dim:
        return ("a plain ratio", "")
    return (f"of dimension {dim}", "")


def _parse_units(text: str, unit_text: str, *, where: str) -> pint.Unit:
    if _POWER_CHAIN.search(unit_text):
        msg = (
            f"{where} = {show_value(text)}: nested powers in the unit are not supported"
        )
        raise ConfigError(msg)
    try:
        return ureg.parse_units(unit_text.strip())
    except Exception as exc:  # pint raises many types (TokenError, AssertionError, ...)
        detail = show_value(str(exc), 70).strip("'\"")
        unit = show_value(unit_text.strip(), 30)
        msg = f"{where} = {show_value(text)}: cannot read the unit {unit}: {detail}"
        raise ConfigError(msg) from exc


def parse_quantity(
    text: str | float, expected_dimension_units: str, *, where: str
) -> float:
    """Parse a config quantity string and return its magnitude in the given SI units.

    Common practice: every dimensional config value carries its unit; a bare number is
    refused because its unit would be a guess.

    Args:
        text: The value as written in the config, e.g. ``"260 plf"``. A number (TOML
            int or float) is refused with a hint.
        expected_dimension_units: SI units of the result, e.g. ``"N/m"``, ``"Pa"``,
            ``"m"``, ``"rad"``, ``"s"``; they also fix the expected dimension.
        where: ``"<file>: <table.key>"`` for error messages.

    Returns:
        The magnitude in ``expected_dimension_units`` (a finite Python float).

    Raises:
        ConfigError: No unit, a unit of the wrong dimension, unreadable text, or a
            value that is not finite. The message is one line and names ``where``.
    """
    target = ureg.parse_units(expected_dimension_units)
    _, example = _describe(target)
    if isinstance(text, bool) or not isinstance(text, int | float | str):
        msg = f"{where} = {show_value(text)}: expected a quantity such as {example}"
        raise ConfigError(msg)
    if not isinstance(text, str):
        msg = f"{where} = {show_value(text)}: has no unit; write e.g. {example}"
        raise ConfigError(msg)
    if len(text) > _MAX_TEXT:
        msg = f"{where} = {show_value(text)}: too long for a quantity"
        raise ConfigError(msg)
    found = _NUMBER.fullmatch(text)
    if found is None:
        msg = (
            f"{where} = {show_value(text)}: cannot read it; write a number and a "
            f"unit, e.g. {example}"
        )
        raise ConfigError(msg)
    magnitude = float(found.group(1))
    if not math.isfinite(magnitude):
        msg = f"{where} = {show_value(text)}: not a finite number; write e.g. {example}"
        raise ConfigError(msg)
    unit_text = found.group(2)
    if not unit_text.strip():
        msg = f"{where} = {show_value(text)}: has no unit; write e.g. {example}"
        raise ConfigError(msg)
    units = _parse_units(text, unit_text, where=where)
    return _convert(magnitude, units, target, text=text, where=where)


def _convert(
    magnitude: float, units: pint.Unit, target: pint.Unit, *, text: str, where: str
) -> float:
    want, example = _describe(target)
    got, _ = _describe(units)
    is_angle_target = not target.dimensionality
    wrong_angle = is_angle_target and got != "an angle"
    if units.dimensionality != target.dimensionality or wrong_angle:
        mass_for_force = (units * _ACCELERATION).dimensionality == target.dimensionality
        hint = (
            " ('lb' is a mass: write 'lbf' or 'kip' for a force)"
            if mass_for_force
            else ""
        )
        msg = (
            f"{where} = {show_value(text)}: that is {got}, expected {want} such as "
            f"{example}{hint}"
        )
        raise ConfigError(msg)
    try:
        value = float(Q_(magnitude, units).m_as(target))
    except (pint.PintError, ArithmeticError, ValueError) as exc:
        msg = f"{where} = {show_value(text)}: cannot convert it to {target} ({exc})"
        raise ConfigError(msg.replace("\n", " ")) from exc
    if not math.isfinite(value):
        msg = (
            f"{where} = {show_value(text)}: not a finite quantity; write e.g. {example}"
        )
        raise ConfigError(msg)
    return value


def to_display(
    value_si: float, quantity: str, system: DisplayUnits
) -> tuple[float, str]:
    """Convert an SI value to the display units of a quantity kind.

    Common practice: imperial outputs in kip, ft, plf, psf; SI outputs in kN, m, kN/m,
    kPa.

    Args:
        value_si: Value in coherent SI (N, m, N/m, Pa, m², N·m).
        quantity: One of ``"force"``, ``"weight"``, ``"length"``,
            ``"force_per_length"``, ``"pressure"``, ``"area"``, ``"moment"``.
        system: The project's display units.

    Returns:
        The value in display units and the unit label, e.g. ``(260.0, "plf")``.

    Raises:
        ValueError: Unknown quantity kind.
    """
    try:
        factor, label = _display_unit(quantity, system)
    except TypeError:  # unhashable arguments: the checks below say what is wrong
        factor, label = _display_unit.__wrapped__(quantity, system)
    return float(value_si) * factor, label


@functools.lru_cache(maxsize=64)
def _display_unit(quantity: str, system: DisplayUnits) -> tuple[float, str]:
    """(SI-to-display multiplier, label) of a quantity kind; errors as ``to_display``."""
    if quantity not in DISPLAY_QUANTITIES:
        msg = f"unknown quantity kind {quantity!r}; one of {sorted(DISPLAY_QUANTITIES)}"
        raise ValueError(msg)
    si_units, imperial, si = DISPLAY_QUANTITIES[quantity]
    units, label = imperial if DisplayUnits(system) is DisplayUnits.IMPERIAL else si
    return _factor(si_units, units), label


@functools.lru_cache(maxsize=64)
def _factor(si_units: str, units: str) -> float:
    """Multiplier from an SI unit to a display unit, through pint (all are linear)."""
    return float(Q_(1.0, si_units).m_as(units))


def format_value(
    value_si: float, quantity: str, system: DisplayUnits, *, digits: int = 3
) -> str:
    """Format an SI value in display units, e.g. ``"260 plf"`` or ``"3.79 kN/m"``.

    Common practice: three significant figures, whole numbers kept whole.

    Args:
        value_si: Value in coherent SI (N, m, N/m, Pa, m², N·m).
        quantity: Quantity kind, as for ``to_display``.
        system: The project's display units.
        digits: Significant figures [-].

    Returns:
        The number and its unit label, separated by a space.
    """
    value, label = to_display(value_si, quantity, system)
    if (
        type(digits) is int
        and 1 <= digits <= 15
        and 10.0 ** (digits - 1) <= abs(value) < 1e300
    ):
        # From 10**(digits-1) up the rounded value has no decimals to keep: the text
        # the general path below gives, without its rounding and logarithm.
        return f"{value:.0f} {label}"
    if not math.isfinite(value):
        return f"{value} {label}"
    if value == 0:
        return f"0 {label}"
    rounded = float(f"{value:.{digits}g}")  # 9.9999999 -> 10.0 before counting digits
    if rounded == 0:
        return f"0 {label}"
    if not math.isfinite(rounded):  # within a rounding step of the largest float
        return f"{value:.{digits}g} {label}"
    decimals = min(12, max(0, digits - 1 - math.floor(math.log10(abs(rounded)))))
    text = f"{value:.{decimals}f}"
    if text.lstrip("-").strip("0.") == "":
        text = "0"
    return f"{text} {label}"
