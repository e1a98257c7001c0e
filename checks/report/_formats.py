"""Number formatting for the writers that print many values: memoised ``format_value``.

A large report prints a few hundred thousand values, but far fewer distinct ones (the
load path of a tall building repeats the same level forces pier after pier). Each
formatter here remembers the text of every value it has formatted, so the units and
rounding of :func:`checks.units.format_value` run once per distinct value and the text
is always exactly what ``format_value`` gives.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from html import escape

from checks.project import DisplayUnits
from checks.units import format_value

__all__ = ["Formats", "memo_escape", "memo_formatter"]


class _Memo(dict):
    """SI value -> its text; a miss asks :func:`checks.units.format_value`."""

    __slots__ = ("quantity", "system")

    def __init__(self, quantity: str, system: DisplayUnits) -> None:
        super().__init__()
        self.quantity = quantity
        self.system = system

    def __missing__(self, value: float) -> str:
        text = format_value(value, self.quantity, self.system)
        self[value] = text
        return text


class _EscapeMemo(dict):
    """Text -> ``html.escape(text)``."""

    __slots__ = ()

    def __missing__(self, text: str) -> str:
        out = self[text] = escape(text)
        return out


def memo_formatter(quantity: str, system: DisplayUnits) -> Callable[[float], str]:
    """A function formatting SI values like ``format_value``, remembering each text.

    Common practice: three significant figures, as :func:`checks.units.format_value`.

    Args:
        quantity: Quantity kind (``"force"``, ``"length"``, ...), as for ``to_display``.
        system: The project's display units.

    Returns:
        ``value_si -> text``; the same text ``format_value`` gives for that value.
    """
    format_value(0.0, quantity, system)  # an unknown quantity kind fails here, once
    return _Memo(quantity, DisplayUnits(system)).__getitem__


def memo_escape() -> Callable[[str], str]:
    """``html.escape``, remembering each text (model names repeat row after row)."""
    return _EscapeMemo().__getitem__


@dataclass(frozen=True, slots=True, kw_only=True)
class Formats:
    """The formatters one report needs, built once per report.

    Attributes:
        system: The display units.
        force: SI force [N] -> text.
        length: SI length [m] -> text.
        force_per_length: SI force per length [N/m] -> text.
        pressure: SI pressure [Pa] -> text.
        escape: ``html.escape``, memoised.
    """

    system: DisplayUnits
    force: Callable[[float], str]
    length: Callable[[float], str]
    force_per_length: Callable[[float], str]
    pressure: Callable[[float], str]
    escape: Callable[[str], str]

    @classmethod
    def of(cls, system: DisplayUnits) -> Formats:
        """Fresh formatters (empty memories) for ``system``."""
        return cls(
            system=DisplayUnits(system),
            force=memo_formatter("force", system),
            length=memo_formatter("length", system),
            force_per_length=memo_formatter("force_per_length", system),
            pressure=memo_formatter("pressure", system),
            escape=memo_escape(),
        )
