"""The report's fast helpers give exactly what the plain functions give.

References: :func:`checks.units.format_value` for numbers, ``html.escape`` (Python
standard library) for text, and the id rule "letters, digits and ``-`` stay, anything
else becomes ``_<hex>_``" written out as a regular expression.
"""

from __future__ import annotations

import html
import math
import re

import pytest
from hypothesis import given
from hypothesis import strategies as st

from checks.project import DisplayUnits
from checks.report._formats import Formats, memo_escape, memo_formatter
from checks.report._html_parts import html_id
from checks.units import DISPLAY_QUANTITIES, format_value

# magnitudes a model can hold: near the largest float (1.8e308) the rounding to three
# figures overflows in format_value itself (reported, left to checks.units)
_VALUES = (
    st.floats(-1e300, 1e300)
    | st.sampled_from([math.nan, math.inf, -math.inf, -0.0, 5e-324])
    | st.integers(-(10**9), 10**9)
)


@given(
    values=st.lists(_VALUES, max_size=30),
    quantity=st.sampled_from(sorted(DISPLAY_QUANTITIES)),
    system=st.sampled_from(list(DisplayUnits)),
)
def test_memo_formatter_is_format_value(values, quantity, system):
    fmt = memo_formatter(quantity, system)
    for v in [*values, *values]:  # the second pass reads the memory
        assert fmt(v) == format_value(v, quantity, system)  # checks.units


def test_memo_formatter_refuses_an_unknown_quantity_at_once():
    with pytest.raises(ValueError, match="unknown quantity kind"):
        memo_formatter("speed", DisplayUnits.SI)


def test_formats_of_a_system():
    fm = Formats.of(DisplayUnits.IMPERIAL)
    assert (
        fm.force(4448.2216152605) == "1.00 kip"
    )  # 1 kip = 4448.2216152605 N, NIST SP 811
    assert fm.length(0.3048) == "1.00 ft"  # 1 ft = 0.3048 m exactly, NIST SP 811
    assert fm.escape('<a href="x">&</a>') == html.escape('<a href="x">&</a>')


@given(text=st.text(max_size=20))
def test_memo_escape_is_html_escape(text):
    esc = memo_escape()
    assert esc(text) == esc(text) == html.escape(text)  # Python standard library


def _reference_id(kind: str, *parts: str) -> str:
    text = "|".join(parts)
    return (
        kind + "-" + re.sub(r"[^A-Za-z0-9-]", lambda m: f"_{ord(m.group()):x}_", text)
    )


@given(parts=st.lists(st.text(max_size=12), min_size=1, max_size=3))
def test_html_id_follows_the_rule(parts):
    assert html_id("pier", *parts) == _reference_id("pier", *parts)


def test_html_id_examples():
    assert html_id("wall", "2s3$BrU", "Level 2") == "wall-2s3_24_BrU_7c_Level_20_2"
    assert html_id("level", "Étage") == "level-_c9_tage"


def _figures_rule(value: float, label: str, digits: int) -> str:
    """``format_value``'s rule written out step by step, with no shortcut.

    Common practice: round to ``digits`` significant figures, then print as many
    decimals as those figures need (none once the value is 10**(digits-1) or more).
    """
    if not math.isfinite(value):
        return f"{value} {label}"
    if value == 0:
        return f"0 {label}"
    rounded = float(f"{value:.{digits}g}")
    if rounded == 0:
        return f"0 {label}"
    if not math.isfinite(rounded):
        return f"{value:.{digits}g} {label}"
    decimals = min(12, max(0, digits - 1 - math.floor(math.log10(abs(rounded)))))
    text = f"{value:.{decimals}f}"
    return f"{'0' if text.lstrip('-').strip('0.') == '' else text} {label}"


def _near_a_power_of_ten(k: int) -> st.SearchStrategy[float]:
    power = 10.0**k
    return st.sampled_from(
        [power, math.nextafter(power, 0.0), math.nextafter(power, math.inf)]
    ) | st.floats(0.999 * power, 1.001 * power)


# whole numbers take a shortcut in format_value from 10**(digits-1) up: around each
# power of ten, and anywhere else, the text is the one the full rule gives
_AROUND = st.integers(-3, 16).flatmap(_near_a_power_of_ten)


@given(
    value=_AROUND | _VALUES | _AROUND.map(lambda v: -v),
    digits=st.integers(1, 15),
)
def test_format_value_follows_the_figures_rule(value, digits):
    # metres shown in metres: the display value is the SI value itself (factor 1)
    got = format_value(value, "length", DisplayUnits.SI, digits=digits)
    assert got == _figures_rule(float(value), "m", digits)
