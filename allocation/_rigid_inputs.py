"""Checks on the inputs of a rigid-diaphragm allocation (private; see allocation.rigid).

Each message is one line naming the quantity and its value; a message is built only
when its check fails.
"""

from __future__ import annotations

import math

from allocation.errors import ParameterError
from allocation.results import LoadCase

__all__ = ["validate"]


def _require_finite(msg_name: str, *values: float) -> None:
    if not all(math.isfinite(v) for v in values):
        msg = f"rigid allocation: {msg_name} = {values} must be finite"
        raise ParameterError(msg)


def validate(
    story_shear: float,
    center_of_mass: tuple[float, float],
    plan_extent: tuple[float, float, float, float],
    case: LoadCase,
    accidental_eccentricity: float,
    Ax: float,
) -> None:
    """Raise unless the inputs of a rigid allocation case are in their domains.

    Raises:
        ParameterError: A value is not finite or out of its domain (named).
    """
    _require_finite("story_shear", story_shear)
    _require_finite("center_of_mass", *center_of_mass)
    _require_finite("plan_extent", *plan_extent)
    xmin, ymin, xmax, ymax = plan_extent
    checks = (
        (story_shear >= 0, lambda: f"story_shear = {story_shear} N must be >= 0"),
        (
            xmax >= xmin and ymax >= ymin,
            lambda: f"plan_extent = {plan_extent} must be (xmin, ymin, xmax, ymax)",
        ),
        (
            case.sign in (1, -1) and case.ecc_sign in (1, -1),
            lambda: f"load case {case} needs sign and ecc_sign of +1 or -1",
        ),
        (
            0 <= accidental_eccentricity < 0.5,
            lambda: (
                f"accidental_eccentricity = {accidental_eccentricity} must be in "
                "[0, 0.5)"
            ),
        ),
        (
            math.isfinite(Ax) and 1.0 <= Ax <= 3.0,
            lambda: f"Ax = {Ax} must be in [1, 3]",
        ),
    )
    for ok, text in checks:
        if not ok:
            msg = f"rigid allocation: {text()}"
            raise ParameterError(msg)
