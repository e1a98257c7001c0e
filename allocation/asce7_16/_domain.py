"""Domain checks shared by the provision modules; messages name the value."""

from __future__ import annotations

import math

from allocation.errors import ParameterError


def positive(name: str, value: float) -> None:
    """Raise ParameterError unless ``value`` is finite and > 0."""
    if not (math.isfinite(value) and value > 0.0):
        msg = f"{name} = {value} must be a finite number > 0"
        raise ParameterError(msg)


def non_negative(name: str, value: float) -> None:
    """Raise ParameterError unless ``value`` is finite and >= 0."""
    if not (math.isfinite(value) and value >= 0.0):
        msg = f"{name} = {value} must be a finite number >= 0"
        raise ParameterError(msg)
