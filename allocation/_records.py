"""Building many frozen records quickly (private).

A frozen dataclass's generated ``__init__`` parses keywords and sets each field with
``object.__setattr__`` looked up by name on every call. A run builds tens of
thousands of piers, mass items, point loads and envelope entries, so that cost is a
good share of the run time. :func:`maker` gives a keyword function, and
:func:`records` a column-wise builder, that make the same records: instances of the
same class with the same slot values and nothing else, which ``==``, ``hash`` and
``repr`` cannot tell from those the class itself builds. Each field is stored through
its slot's own descriptor (what ``object.__setattr__`` finds and calls), skipping
that look-up.

Only for frozen slots dataclasses without ``__post_init__`` (nothing to check or
derive) whose fields are all ``init`` fields without ``default_factory``.
"""

from __future__ import annotations

import dataclasses
import types
from collections.abc import Callable, Sequence
from itertools import repeat
from typing import Any, TypeVar

__all__ = ["maker", "records"]

T = TypeVar("T")

_POSITIONAL: dict[type, Callable[..., Any]] = {}


def _fields(cls: type) -> tuple[dataclasses.Field, ...]:
    params = getattr(cls, "__dataclass_params__", None)
    fields = dataclasses.fields(cls) if params is not None else ()
    if (
        params is None
        or not params.frozen
        or "__slots__" not in cls.__dict__
        or hasattr(cls, "__post_init__")
        or not all(f.init for f in fields)
        or any(f.default_factory is not dataclasses.MISSING for f in fields)
    ):
        msg = (
            f"{cls.__name__}: maker() needs a frozen slots dataclass with no "
            "__post_init__ and no default_factory"
        )
        raise TypeError(msg)
    return fields


def _slot(cls: type, name: str) -> types.MemberDescriptorType | None:
    """The slot descriptor that stores field ``name`` of ``cls``, or None."""
    for klass in cls.__mro__:
        if name in klass.__dict__:
            found = klass.__dict__[name]
            return found if isinstance(found, types.MemberDescriptorType) else None
    return None


def _compile(cls: type, fields: tuple[dataclasses.Field, ...], *, keywords: bool):
    scope: dict[str, Any] = {"new": object.__new__, "put": object.__setattr__}
    scope["cls"] = cls
    params = []
    for f in fields:
        if keywords and f.default is not dataclasses.MISSING:
            scope[f"_default_{f.name}"] = f.default
            params.append(f"{f.name}=_default_{f.name}")
        else:
            params.append(f.name)
    head = (
        f"def make(*, {', '.join(params)}):"
        if keywords
        else (f"def make({', '.join(params)}):")
    )
    lines = [head, "    o = new(cls)"]
    for f in fields:
        slot = _slot(cls, f.name)
        if slot is None:
            lines.append(f"    put(o, {f.name!r}, {f.name})")
        else:  # the slot's own setter: what object.__setattr__ ends up calling
            scope[f"_set_{f.name}"] = slot.__set__
            lines.append(f"    _set_{f.name}(o, {f.name})")
    lines.append("    return o")
    exec("\n".join(lines), scope)  # source made of the field names only
    make = scope["make"]
    make.__qualname__ = make.__name__ = f"make_{cls.__name__}"
    make.__doc__ = (
        f"A {cls.__name__}, as {cls.__name__}(**fields) (allocation._records)."
    )
    return make


def maker(cls: type[T]) -> Callable[..., T]:
    """A function ``make(**fields)`` that gives what ``cls(**fields)`` gives.

    Keyword-only, with the class's defaults, so a call names every field it sets.

    Args:
        cls: A frozen slots dataclass without ``__post_init__`` and without
            ``default_factory`` fields.

    Returns:
        The constructor.

    Raises:
        TypeError: ``cls`` is not such a class.
    """
    return _compile(cls, _fields(cls), keywords=True)


def records(cls: type[T], /, **columns: Sequence[Any]) -> list[T]:
    """``[cls(**row) for row in rows]`` from the fields' columns, named.

    Args:
        cls: As for :func:`maker`.
        **columns: One sequence per field, all of the same length; a field left
            out takes its default in every record.

    Returns:
        The records, in column order.

    Raises:
        TypeError: ``cls`` is not such a class, a column names no field, or a field
            without a default has no column.
        ValueError: The columns differ in length.
    """
    fields = _fields(cls)
    make = _POSITIONAL.get(cls)
    if make is None:
        make = _POSITIONAL[cls] = _compile(cls, fields, keywords=False)
    unknown = set(columns) - {f.name for f in fields}
    if unknown:
        msg = f"{cls.__name__}: no field {', '.join(sorted(unknown))}"
        raise TypeError(msg)
    sizes = {len(c) for c in columns.values()}
    if len(sizes) > 1:
        msg = f"{cls.__name__}: columns of different lengths {sorted(sizes)}"
        raise ValueError(msg)
    n = sizes.pop() if sizes else 0
    cols = []
    for f in fields:
        if f.name in columns:
            cols.append(columns[f.name])
        elif f.default is not dataclasses.MISSING:
            cols.append(repeat(f.default, n))
        else:
            msg = f"{cls.__name__}: no column for field {f.name!r}"
            raise TypeError(msg)
    return list(map(make, *cols))
