"""Equivalent lateral force procedure: seismic response coefficient, base shear, forces.

One equation per function, named with the standard's symbols. The period provisions
(§12.8.2) live in :mod:`allocation.asce7_16.s12_8_2_period` and are re-exported here.
Units: heights in m (with the SI form of Ct), periods in s, forces and weights in N;
spectral values in g. Levels are ordered bottom up wherever a sequence is taken.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

from allocation.asce7_16._domain import non_negative as _non_negative
from allocation.asce7_16._domain import positive as _positive
from allocation.asce7_16.s12_8_2_period import (
    TABLE_12_8_2,
    Cu,
    PeriodCoefficients,
    StructureType,
    Ta,
    period_used,
)
from allocation.errors import ParameterError

__all__ = [
    "CS_FLOOR",
    "GOVERNS_12_8_2",
    "GOVERNS_12_8_3",
    "GOVERNS_12_8_4",
    "GOVERNS_12_8_5",
    "GOVERNS_12_8_5_FLOOR",
    "GOVERNS_12_8_6",
    "TABLE_12_8_2",
    "Cs_base",
    "Cs_max",
    "Cs_max_long",
    "Cs_max_short",
    "Cs_min",
    "Cs_min_S1",
    "Cu",
    "Cvx",
    "Fx",
    "PeriodCoefficients",
    "StructureType",
    "Ta",
    "V",
    "Vx",
    "k",
    "period_used",
    "seismic_response_coefficient",
]

CS_FLOOR = 0.01
"""Absolute minimum of Cs in Eq. 12.8-5 [-]."""

GOVERNS_12_8_2 = "ASCE 7-16 Eq. 12.8-2"
GOVERNS_12_8_3 = "ASCE 7-16 Eq. 12.8-3"
GOVERNS_12_8_4 = "ASCE 7-16 Eq. 12.8-4"
GOVERNS_12_8_5 = "ASCE 7-16 Eq. 12.8-5"
GOVERNS_12_8_5_FLOOR = "ASCE 7-16 Eq. 12.8-5 (0.01 floor)"
GOVERNS_12_8_6 = "ASCE 7-16 Eq. 12.8-6"


def Cs_base(SDS: float, R: float, Ie: float) -> float:
    """Seismic response coefficient, before the limits of Eq. 12.8-3 to 12.8-6.

    ASCE 7-16 Eq. 12.8-2.

    Args:
        SDS: Design spectral response acceleration at short periods [g].
        R: Response modification coefficient, Table 12.2-1 [-].
        Ie: Seismic importance factor, Table 1.5-2 [-].

    Returns:
        Cs [-].

    Raises:
        ParameterError: SDS negative, R or Ie not positive.
    """
    _non_negative("SDS", SDS)
    _positive("R", R)
    _positive("Ie", Ie)
    return float(SDS / (R / Ie))


def Cs_max_short(SD1: float, T: float, R: float, Ie: float) -> float:
    """Upper limit of Cs for T ≤ TL.

    ASCE 7-16 Eq. 12.8-3.

    Args:
        SD1: Design spectral response acceleration at 1 s [g].
        T: Fundamental period used [s].
        R: Response modification coefficient [-].
        Ie: Seismic importance factor [-].

    Returns:
        SD1/(T·R/Ie) [-].

    Raises:
        ParameterError: SD1 negative; T, R or Ie not positive.
    """
    _non_negative("SD1", SD1)
    _positive("T", T)
    _positive("R", R)
    _positive("Ie", Ie)
    return float(SD1 / (T * (R / Ie)))


def Cs_max_long(SD1: float, T: float, TL: float, R: float, Ie: float) -> float:
    """Upper limit of Cs for T > TL.

    ASCE 7-16 Eq. 12.8-4.

    Args:
        SD1: Design spectral response acceleration at 1 s [g].
        T: Fundamental period used [s].
        TL: Long-period transition period, §11.4.6 [s].
        R: Response modification coefficient [-].
        Ie: Seismic importance factor [-].

    Returns:
        SD1·TL/(T²·R/Ie) [-].

    Raises:
        ParameterError: SD1 negative; T, TL, R or Ie not positive.
    """
    _non_negative("SD1", SD1)
    _positive("T", T)
    _positive("TL", TL)
    _positive("R", R)
    _positive("Ie", Ie)
    return float(SD1 * TL / (T * T * (R / Ie)))


def Cs_max(SD1: float, T: float, TL: float, R: float, Ie: float) -> float:
    """Upper limit of Cs: Eq. 12.8-3 for T ≤ TL, Eq. 12.8-4 for T > TL.

    ASCE 7-16 Eq. 12.8-3 and Eq. 12.8-4.

    Args:
        SD1: Design spectral response acceleration at 1 s [g].
        T: Fundamental period used [s].
        TL: Long-period transition period [s].
        R: Response modification coefficient [-].
        Ie: Seismic importance factor [-].

    Returns:
        Cs need not exceed this [-].
    """
    _positive("TL", TL)
    if T <= TL:
        return Cs_max_short(SD1, T, R, Ie)
    return Cs_max_long(SD1, T, TL, R, Ie)


def Cs_min(SDS: float, Ie: float) -> float:
    """Lower limit of Cs, 0.044·SDS·Ie but not less than 0.01.

    ASCE 7-16 Eq. 12.8-5.

    Args:
        SDS: Design spectral response acceleration at short periods [g].
        Ie: Seismic importance factor [-].

    Returns:
        Cs shall not be less than this [-].

    Raises:
        ParameterError: SDS negative or Ie not positive.
    """
    _non_negative("SDS", SDS)
    _positive("Ie", Ie)
    return float(max(0.044 * SDS * Ie, CS_FLOOR))


def Cs_min_S1(S1: float, R: float, Ie: float) -> float:
    """Lower limit of Cs where S1 ≥ 0.6 g, 0.5·S1/(R/Ie).

    ASCE 7-16 Eq. 12.8-6.

    Args:
        S1: Mapped MCE_R spectral response acceleration at 1 s [g].
        R: Response modification coefficient [-].
        Ie: Seismic importance factor [-].

    Returns:
        The limit [-]; 0.0 where S1 < 0.6 g (the limit does not apply).

    Raises:
        ParameterError: S1 negative; R or Ie not positive.
    """
    _non_negative("S1", S1)
    _positive("R", R)
    _positive("Ie", Ie)
    if S1 < 0.6:
        return 0.0
    return float(0.5 * S1 / (R / Ie))


def seismic_response_coefficient(
    SDS: float,
    SD1: float,
    *,
    S1: float,
    T: float,
    TL: float,
    R: float,
    Ie: float,
) -> tuple[float, str]:
    """Seismic response coefficient with its upper and lower limits.

    ASCE 7-16 §12.8.1.1 (Eq. 12.8-2 to 12.8-6). The §11.4.8 exception for site-specific
    ground motion (1.5 × Eq. 12.8-3) is not applied here.

    Args:
        SDS: Design spectral response acceleration at short periods [g].
        SD1: Design spectral response acceleration at 1 s [g].
        S1: Mapped MCE_R spectral response acceleration at 1 s [g].
        T: Fundamental period used [s].
        TL: Long-period transition period [s].
        R: Response modification coefficient [-].
        Ie: Seismic importance factor [-].

    Returns:
        (Cs [-], which equation governs: one of the ``GOVERNS_*`` strings).
    """
    Cs = Cs_base(SDS, R, Ie)
    governs = GOVERNS_12_8_2
    upper = Cs_max(SD1, T, TL, R, Ie)
    if upper < Cs:
        Cs, governs = upper, (GOVERNS_12_8_3 if T <= TL else GOVERNS_12_8_4)
    lower_5 = Cs_min(SDS, Ie)
    lower_6 = Cs_min_S1(S1, R, Ie)
    if lower_6 > lower_5 and lower_6 > Cs:
        Cs, governs = lower_6, GOVERNS_12_8_6
    elif lower_5 > Cs:
        floor = 0.044 * SDS * Ie < CS_FLOOR
        Cs, governs = lower_5, (GOVERNS_12_8_5_FLOOR if floor else GOVERNS_12_8_5)
    return float(Cs), governs


def V(Cs: float, W: float) -> float:
    """Seismic base shear.

    ASCE 7-16 Eq. 12.8-1.

    Args:
        Cs: Seismic response coefficient [-].
        W: Effective seismic weight, §12.7.2 [N].

    Returns:
        V [N].

    Raises:
        ParameterError: Cs or W negative.
    """
    _non_negative("Cs", Cs)
    _non_negative("W", W)
    return float(Cs * W)


def k(T: float) -> float:
    """Distribution exponent for the vertical distribution of forces.

    ASCE 7-16 §12.8.3: 1 for T ≤ 0.5 s, 2 for T ≥ 2.5 s, linear between.

    Args:
        T: Fundamental period used [s].

    Returns:
        k [-].

    Raises:
        ParameterError: T is not positive.
    """
    _positive("T", T)
    if T <= 0.5:
        return 1.0
    if T >= 2.5:
        return 2.0
    return float(1.0 + (T - 0.5) / 2.0)


def Cvx(w: Sequence[float], h: Sequence[float], k: float) -> list[float]:
    """Vertical distribution factors of all levels.

    ASCE 7-16 Eq. 12.8-12: Cvx = wx·hx^k / Σ wi·hi^k.

    Args:
        w: Seismic weight of each level, bottom up [N].
        h: Height of each level above the base [m].
        k: Distribution exponent, §12.8.3 [-].

    Returns:
        Cvx of each level, same order [-]; they add up to 1.

    Raises:
        ParameterError: Lengths differ, no levels, a weight negative, a height not
            positive, or all weights zero.
    """
    if len(w) != len(h) or not w:
        msg = f"Cvx: {len(w)} weights and {len(h)} heights; need one of each per level"
        raise ParameterError(msg)
    for i, (wi, hi) in enumerate(zip(w, h, strict=True)):
        _non_negative(f"w[{i}]", wi)
        _positive(f"h[{i}]", hi)
    _positive("k", k)
    terms = [wi * hi**k for wi, hi in zip(w, h, strict=True)]
    total = math.fsum(terms)
    if total <= 0.0:
        msg = f"Cvx: sum of w·h^k = {total}; every level has zero seismic weight"
        raise ParameterError(msg)
    return [float(t / total) for t in terms]


def Fx(Cvx: float, V: float) -> float:
    """Lateral seismic force at a level.

    ASCE 7-16 Eq. 12.8-11.

    Args:
        Cvx: Vertical distribution factor, Eq. 12.8-12 [-].
        V: Base shear, Eq. 12.8-1 [N].

    Returns:
        Fx [N].

    Raises:
        ParameterError: Cvx outside [0, 1] or V negative.
    """
    if not (math.isfinite(Cvx) and 0.0 <= Cvx <= 1.0 + 1e-12):
        msg = f"Cvx = {Cvx} must be in [0, 1]"
        raise ParameterError(msg)
    _non_negative("V", V)
    return float(Cvx * V)


def Vx(F: Sequence[float]) -> list[float]:
    """Story shear of each story: the sum of the level forces at and above.

    ASCE 7-16 Eq. 12.8-13.

    Args:
        F: Level forces Fx, bottom up [N].

    Returns:
        Vx of each level, bottom up [N]; the first equals the base shear.
    """
    out: list[float] = []
    for i in range(len(F)):
        out.append(float(math.fsum(F[i:])))
    return out
