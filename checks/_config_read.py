"""Typed readers for the TOML config: each names the file and key in its errors.

Every reader takes the table (a dict from ``tomllib``), the key and a ``Where`` giving
the file and the table's dotted name, and either returns a Python value in SI or
raises ``ConfigError`` with a one-line message
``<file>: <table.key> = <value>: <what is expected>``.
"""

from __future__ import annotations

import json
import math
import re
from collections.abc import Iterable, Mapping
from dataclasses import dataclass
from enum import StrEnum
from typing import Any, TypeVar

from checks.errors import ConfigError
from checks.units import parse_quantity, show_value

__all__ = [
    "MISSING",
    "Where",
    "boolean",
    "check_keys",
    "choice",
    "named_quantities",
    "number",
    "quantity",
    "string",
    "string_list",
    "sub_table",
]

E = TypeVar("E", bound=StrEnum)
_BARE_KEY = re.compile(r"[A-Za-z0-9_-]+")


class _Missing:
    def __repr__(self) -> str:
        return "MISSING"


MISSING: Any = _Missing()


@dataclass(frozen=True, slots=True)
class Where:
    """The file and dotted table name of the values being read (``""`` = top level)."""

    file: str
    table: str = ""

    def key(self, key: str) -> str:
        """Dotted name of a key in this table."""
        key = str(key)
        if not _BARE_KEY.fullmatch(key):
            key = json.dumps(key, ensure_ascii=False)
        return f"{self.table}.{key}" if self.table else key

    def at(self, key: str) -> str:
        """``"<file>: <table.key>"``."""
        return f"{self.file}: {self.key(key)}"

    def child(self, key: str) -> Where:
        """The sub-table ``key`` of this table."""
        return Where(self.file, self.key(key))

    def error(self, key: str, value: object, what: str) -> ConfigError:
        """``ConfigError('<file>: <table.key> = <value>: <what>')``."""
        return ConfigError(f"{self.at(key)} = {show_value(value)}: {what}")


def check_keys(
    data: object, where: Where, allowed: Iterable[str], required: Iterable[str] = ()
) -> Mapping[str, Any]:
    """Refuse a non-table, an unknown key, or a missing required key."""
    if not isinstance(data, Mapping):
        name = where.table or "the file"
        msg = f"{where.file}: {name} = {show_value(data)}: expected a table"
        raise ConfigError(msg)
    allowed = tuple(allowed)
    for key in data:
        if key not in allowed:
            table = f"[{where.table}]" if where.table else "the top level"
            msg = (
                f"{where.at(str(key))}: unknown key; allowed in {table}: "
                f"{', '.join(allowed)}"
            )
            raise ConfigError(msg)
    for key in required:
        if key not in data:
            table = f"[{where.table}]" if where.table else "the file"
            msg = f"{where.at(key)}: missing; it is required in {table}"
            raise ConfigError(msg)
    return data


def sub_table(data: Mapping[str, Any], key: str, where: Where) -> Mapping[str, Any]:
    """The sub-table ``key`` (empty when absent)."""
    value = data.get(key, {})
    if not isinstance(value, Mapping):
        raise where.error(key, value, "expected a table")
    return value


def _get(data: Mapping[str, Any], key: str, where: Where, default: Any) -> Any:
    if key in data:
        return data[key]
    if default is MISSING:
        table = f"[{where.table}]" if where.table else "the file"
        msg = f"{where.at(key)}: missing; it is required in {table}"
        raise ConfigError(msg)
    return default


def string(
    data: Mapping[str, Any], key: str, where: Where, *, default: Any = MISSING
) -> Any:
    """A non-empty string (or ``default`` when absent)."""
    value = _get(data, key, where, default)
    if key not in data:
        return value
    if not isinstance(value, str) or not value.strip():
        raise where.error(key, value, "expected a non-empty string")
    return value


def string_list(data: Mapping[str, Any], key: str, where: Where) -> tuple[str, ...]:
    """A list of distinct non-empty strings (empty when absent)."""
    value = data.get(key, [])
    if not isinstance(value, list) or not all(
        isinstance(v, str) and v.strip() for v in value
    ):
        raise where.error(key, value, "expected a list of non-empty strings")
    if len(set(value)) != len(value):
        raise where.error(key, value, "a name is listed twice")
    return tuple(value)


def boolean(
    data: Mapping[str, Any], key: str, where: Where, *, default: Any = MISSING
) -> Any:
    """``true`` or ``false``."""
    value = _get(data, key, where, default)
    if key in data and not isinstance(value, bool):
        raise where.error(key, value, "expected true or false")
    return value


def choice(
    data: Mapping[str, Any], key: str, where: Where, enum: type[E], *, default: Any
) -> Any:
    """A member of a ``StrEnum``, given by its value."""
    value = _get(data, key, where, default)
    if key not in data:
        return value
    options = [m.value for m in enum]
    if not isinstance(value, str) or value not in options:
        listed = ", ".join(repr(o) for o in options)
        raise where.error(key, value, f"expected one of {listed}")
    return enum(value)


def _check_sign(
    value: float,
    key: str,
    where: Where,
    shown: object,
    minimum: float | None,
    strict: bool,
) -> None:
    if minimum is None:
        return
    if value < minimum or (strict and value == minimum):
        relation = ">" if strict else ">="
        bound = "0" if minimum == 0 else f"{minimum:g}"
        raise where.error(key, shown, f"must be {relation} {bound}")


def number(
    data: Mapping[str, Any],
    key: str,
    where: Where,
    *,
    default: Any = MISSING,
    minimum: float | None = 0.0,
    strict: bool = False,
) -> Any:
    """A plain finite number (dimensionless code coefficient)."""
    value = _get(data, key, where, default)
    if key not in data:
        return value
    if isinstance(value, bool) or not isinstance(value, int | float):
        raise where.error(key, value, "expected a plain number (no unit)")
    try:
        result = float(value)
    except OverflowError:
        result = math.inf
    if not math.isfinite(result):
        raise where.error(key, value, "expected a finite number")
    _check_sign(result, key, where, value, minimum, strict)
    return result


def quantity(
    data: Mapping[str, Any],
    key: str,
    where: Where,
    units: str,
    *,
    default: Any = MISSING,
    minimum: float | None = 0.0,
    strict: bool = False,
) -> Any:
    """A quantity string with its unit, returned in ``units`` (SI)."""
    value = _get(data, key, where, default)
    if key not in data:
        return value
    result = parse_quantity(value, units, where=where.at(key))
    _check_sign(result, key, where, value, minimum, strict)
    return result


def named_quantities(
    data: Mapping[str, Any], key: str, where: Where, units: str
) -> tuple[tuple[str, float], ...] | None:
    """A table of ``name = quantity`` (None when absent), values >= 0, in order."""
    if key not in data:
        return None
    table = data[key]
    if not isinstance(table, Mapping):
        raise where.error(key, table, "expected a table of name = quantity")
    inner = where.child(key)
    out = []
    for name, _ in table.items():
        if not isinstance(name, str) or not name.strip():
            raise inner.error(str(name), name, "expected a non-empty storey name")
        out.append((name, quantity(table, name, inner, units)))
    return tuple(out)
