"""Errors raised by ``checks`` when a run cannot go on.

Exception tree::

    CheckError
    ├── ConfigError (CheckError, ValueError)   the TOML config is unusable
    ├── BcfError (CheckError, ValueError)      a BCF zip or JSON cannot be read safely
    └── OutputError (CheckError, OSError)      an output cannot be written

Over capacity or against a rule is a ``Finding``, never an exception.
"""

from __future__ import annotations

__all__ = ["BcfError", "CheckError", "ConfigError", "OutputError"]


class CheckError(Exception):
    """Base of every error from ``checks``; the message is one line."""


class ConfigError(CheckError, ValueError):
    """The project config is missing, malformed, or a value is wrong."""


class BcfError(CheckError, ValueError):
    """A BCF file (or our JSON of it) is malformed or unsafe."""


class OutputError(CheckError, OSError):
    """An output file cannot be written."""
