"""Errors raised by ``allocation`` when a force cannot be computed.

Exception tree::

    AllocationError
    └── ParameterError (AllocationError, ValueError)   a parameter out of its domain

Engineering conditions (a cantilevered or unsupported diaphragm piece, a direction with
no line) are not errors: they come back as ``Condition`` records in the results.
"""

from __future__ import annotations

__all__ = ["AllocationError", "ParameterError"]


class AllocationError(Exception):
    """Base of every error from ``allocation``; the message is one line."""


class ParameterError(AllocationError, ValueError):
    """A parameter is outside the domain of the equation that uses it."""
