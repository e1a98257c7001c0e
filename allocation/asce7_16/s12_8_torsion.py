"""Torsional amplification and torsional irregularity from story drifts.

Drifts (or displacements) at the two plan extremes of a story, in the direction of the
force, computed with Ax = 1 and including accidental torsion; any consistent length
unit (m inside the project).
"""

from __future__ import annotations

import math

from allocation.errors import ParameterError

__all__ = ["AX_MAX", "AX_MIN", "Ax", "torsional_irregularity_type"]

AX_MIN = 1.0
"""Lower bound of Ax, Eq. 12.8-14 [-]."""
AX_MAX = 3.0
"""Upper bound of Ax, Eq. 12.8-14 [-]."""


def _check(delta_max: float, delta_avg: float) -> None:
    if not (math.isfinite(delta_avg) and delta_avg > 0.0):
        msg = f"delta_avg = {delta_avg} must be > 0 (average drift of the two ends)"
        raise ParameterError(msg)
    if not (math.isfinite(delta_max) and delta_max >= 0.0):
        msg = f"delta_max = {delta_max} must be >= 0 (largest drift at one end)"
        raise ParameterError(msg)


def Ax(delta_max: float, delta_avg: float) -> float:
    """Torsional amplification factor, (δmax/(1.2·δavg))², bounded to 1 ≤ Ax ≤ 3.

    ASCE 7-16 Eq. 12.8-14.

    Args:
        delta_max: Maximum displacement or drift at one end of the structure [m].
        delta_avg: Average of the displacements or drifts at the two ends [m].

    Returns:
        Ax [-].

    Raises:
        ParameterError: delta_avg not positive or delta_max negative.
    """
    _check(delta_max, delta_avg)
    value = (delta_max / (1.2 * delta_avg)) ** 2
    return float(min(max(value, AX_MIN), AX_MAX))


def torsional_irregularity_type(delta_max: float, delta_avg: float) -> str | None:
    """Horizontal structural irregularity type 1a or 1b, from the drift ratio.

    ASCE 7-16 Table 12.3-1: Type 1a where δmax > 1.2·δavg, Type 1b (extreme) where
    δmax > 1.4·δavg. Applies where diaphragms are not flexible (the caller decides).

    Args:
        delta_max: Maximum story drift at one end, with Ax = 1 [m].
        delta_avg: Average of the story drifts at the two ends [m].

    Returns:
        ``"1b"``, ``"1a"`` or None (torsionally regular).

    Raises:
        ParameterError: delta_avg not positive or delta_max negative.
    """
    _check(delta_max, delta_avg)
    if delta_max > 1.4 * delta_avg:
        return "1b"
    if delta_max > 1.2 * delta_avg:
        return "1a"
    return None
