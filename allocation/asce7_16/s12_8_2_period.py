"""Fundamental period: approximate period, its coefficients and the upper limit Cu.

Heights in m with the SI form of Ct (or in ft with the US form), periods in s, SD1 in g.
"""

from __future__ import annotations

import itertools
from collections.abc import Mapping
from dataclasses import dataclass
from enum import StrEnum
from types import MappingProxyType

from allocation.asce7_16._domain import non_negative as _non_negative
from allocation.asce7_16._domain import positive as _positive
from allocation.errors import ParameterError

__all__ = [
    "TABLE_12_8_2",
    "Cu",
    "PeriodCoefficients",
    "StructureType",
    "Ta",
    "period_used",
]


class StructureType(StrEnum):
    """Structure types of Table 12.8-2 (period coefficients)."""

    STEEL_MOMENT_FRAME = "steel_moment_frame"
    CONCRETE_MOMENT_FRAME = "concrete_moment_frame"
    STEEL_EBF_BRBF = "steel_eccentrically_or_buckling_restrained_braced_frame"
    ALL_OTHER = "all_other"


@dataclass(frozen=True, slots=True, kw_only=True)
class PeriodCoefficients:
    """Ct and x of Table 12.8-2.

    Attributes:
        Ct_us: Ct for hn in ft [-].
        Ct_si: Ct for hn in m [-].
        x: Exponent [-].
    """

    Ct_us: float
    Ct_si: float
    x: float


TABLE_12_8_2: Mapping[StructureType, PeriodCoefficients] = MappingProxyType(
    {
        # from memory, except ALL_OTHER (Ct = 0.02 US, x = 0.75: permit calculations
        # quoting Table 12.8-2, see LIBRARY-NOTES §5.1)
        StructureType.STEEL_MOMENT_FRAME: PeriodCoefficients(
            Ct_us=0.028, Ct_si=0.0724, x=0.8
        ),
        StructureType.CONCRETE_MOMENT_FRAME: PeriodCoefficients(
            Ct_us=0.016, Ct_si=0.0466, x=0.9
        ),
        StructureType.STEEL_EBF_BRBF: PeriodCoefficients(
            Ct_us=0.03, Ct_si=0.0731, x=0.75
        ),
        StructureType.ALL_OTHER: PeriodCoefficients(Ct_us=0.02, Ct_si=0.0488, x=0.75),
    }
)
"""ASCE 7-16 Table 12.8-2, period coefficients by structure type."""


def Ta(Ct: float, hn: float, x: float) -> float:
    """Approximate fundamental period.

    ASCE 7-16 Eq. 12.8-7.

    Args:
        Ct: Period coefficient, Table 12.8-2, in the form matching the unit of
            ``hn`` (the SI form for hn in m) [-].
        hn: Structural height above the base [m].
        x: Period exponent, Table 12.8-2 [-].

    Returns:
        Ta [s].

    Raises:
        ParameterError: Ct, hn or x is not positive.
    """
    _positive("Ct", Ct)
    _positive("hn", hn)
    _positive("x", x)
    return float(Ct * hn**x)


# (SD1 [g], Cu [-]) in increasing SD1; from memory
_TABLE_12_8_1: tuple[tuple[float, float], ...] = (
    (0.1, 1.7),
    (0.15, 1.6),
    (0.2, 1.5),
    (0.3, 1.4),
    (0.4, 1.4),
)


def Cu(SD1: float) -> float:
    """Coefficient for the upper limit on the calculated period.

    ASCE 7-16 Table 12.8-1. Values between the tabulated SD1 are interpolated
    linearly; below 0.1 g the value for 0.1 g applies, above 0.4 g that for 0.4 g.

    Args:
        SD1: Design spectral response acceleration at 1 s [g].

    Returns:
        Cu [-].

    Raises:
        ParameterError: SD1 is negative.
    """
    _non_negative("SD1", SD1)
    (lowest, c_low), (highest, c_high) = _TABLE_12_8_1[0], _TABLE_12_8_1[-1]
    if lowest >= SD1:
        return c_low
    if highest <= SD1:
        return c_high
    for (s0, c0), (s1, c1) in itertools.pairwise(_TABLE_12_8_1):
        if s0 <= SD1 <= s1:
            return float(c0 + (c1 - c0) * (SD1 - s0) / (s1 - s0))
    msg = f"SD1 = {SD1} g not covered by Table 12.8-1"  # unreachable by construction
    raise ParameterError(msg)


def period_used(Ta: float, Cu: float, T_computed: float | None) -> float:
    """Fundamental period used for the base shear.

    ASCE 7-16 §12.8.2: a computed period may be used but not above Cu·Ta; without a
    computed period, Ta is used.

    Args:
        Ta: Approximate period, Eq. 12.8-7 [s].
        Cu: Upper-limit coefficient, Table 12.8-1 [-].
        T_computed: Period from a substantiated analysis, or None [s].

    Returns:
        T [s].

    Raises:
        ParameterError: A period or Cu is not positive.
    """
    _positive("Ta", Ta)
    _positive("Cu", Cu)
    if T_computed is None:
        return float(Ta)
    _positive("T (computed period)", T_computed)
    return float(min(T_computed, Cu * Ta))
