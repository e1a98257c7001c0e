"""Diaphragm design force of a level, with its lower and upper bounds.

Forces and weights in N; SDS in g. Transfer forces (§12.10.1.1, last paragraph) are
added by the caller where walls above do not stack on walls below.
"""

from __future__ import annotations

import logging
import math

from allocation.errors import ParameterError

__all__ = ["GOVERNS_12_10_1", "GOVERNS_12_10_2", "GOVERNS_12_10_3", "Fpx"]

logger = logging.getLogger(__name__)

GOVERNS_12_10_1 = "ASCE 7-16 Eq. 12.10-1"
GOVERNS_12_10_2 = "ASCE 7-16 Eq. 12.10-2"
GOVERNS_12_10_3 = "ASCE 7-16 Eq. 12.10-3"


def _non_negative(name: str, value: float) -> None:
    if not (math.isfinite(value) and value >= 0.0):
        msg = f"{name} = {value} must be a finite number >= 0"
        raise ParameterError(msg)


def Fpx(
    F_above: float, w_above: float, wpx: float, SDS: float, Ie: float
) -> tuple[float, str]:
    """Diaphragm design force at level x.

    ASCE 7-16 Eq. 12.10-1, at least Eq. 12.10-2 (0.2·SDS·Ie·wpx) and at most
    Eq. 12.10-3 (0.4·SDS·Ie·wpx). With SDS = 0 both bounds are zero and carry no
    meaning, so they are not applied (Eq. 12.10-1 alone, with a log warning).

    Args:
        F_above: Sum of the level forces Fi at and above level x [N].
        w_above: Sum of the seismic weights wi at and above level x [N].
        wpx: Weight tributary to the diaphragm at level x [N].
        SDS: Design spectral response acceleration at short periods [g].
        Ie: Seismic importance factor [-].

    Returns:
        (Fpx [N], which equation governs: ``GOVERNS_12_10_1``, ``_2`` or ``_3``).

    Raises:
        ParameterError: A force or weight negative, w_above not positive, wpx larger
            than w_above, or Ie not positive.
    """
    _non_negative("F_above", F_above)
    _non_negative("wpx", wpx)
    _non_negative("SDS", SDS)
    if not (math.isfinite(w_above) and w_above > 0.0):
        msg = f"w_above = {w_above} N must be > 0 (seismic weight at and above level x)"
        raise ParameterError(msg)
    if wpx > w_above * (1.0 + 1e-12):
        msg = f"wpx = {wpx} N exceeds w_above = {w_above} N; wpx is part of w_above"
        raise ParameterError(msg)
    if not (math.isfinite(Ie) and Ie > 0.0):
        msg = f"Ie = {Ie} must be > 0"
        raise ParameterError(msg)
    value = F_above / w_above * wpx
    if SDS == 0.0:
        logger.warning("SDS = 0: Fpx bounds of Eq. 12.10-2/12.10-3 not applied")
        return float(value), GOVERNS_12_10_1
    lower = 0.2 * SDS * Ie * wpx
    upper = 0.4 * SDS * Ie * wpx
    if value < lower:
        return float(lower), GOVERNS_12_10_2
    if value > upper:
        return float(upper), GOVERNS_12_10_3
    return float(value), GOVERNS_12_10_1
