"""Indented JSON text, byte for byte what ``json.dumps(obj, indent=2)`` writes, faster.

The standard library encodes indented JSON in pure Python through a chain of
generators, which dominates the writing of a large ``results.json``. This encoder
walks the same tree with one plain recursive function over a list of chunks, using the
same C string encoders and ``float.__repr__``, and it refuses what ``json.dumps(...,
allow_nan=False)`` refuses, with the same exception types.
"""

from __future__ import annotations

import json
import json.encoder
from collections.abc import Callable
from typing import Any

__all__ = ["dumps_indented"]

_ASCII: Callable[[str], str] = (
    json.encoder.c_encode_basestring_ascii or json.encoder.py_encode_basestring_ascii
)
_UNICODE: Callable[[str], str] = (
    json.encoder.c_encode_basestring or json.encoder.py_encode_basestring
)
_float_repr = float.__repr__
_int_repr = int.__repr__


def _float(value: float) -> str:
    if value - value == 0.0:  # finite (inf - inf and nan - nan are nan)
        return _float_repr(value)
    msg = f"Out of range float values are not JSON compliant: {value!r}"
    raise ValueError(msg)


class _Writer:
    """One document's chunks, with the text of each (key, depth) remembered."""

    __slots__ = ("enc", "flat", "keys", "newlines", "out", "step")

    def __init__(self, ensure_ascii: bool, step: str) -> None:
        self.enc = _ASCII if ensure_ascii else _UNICODE
        self.flat = json.JSONEncoder(
            ensure_ascii=ensure_ascii, allow_nan=False, separators=("\n", ": ")
        ).encode
        self.step = step
        self.out: list[str] = []
        self.keys: dict[tuple[str, int], tuple[str, str]] = {}
        self.newlines = ["\n"]

    def newline(self, depth: int) -> str:
        while len(self.newlines) <= depth:
            self.newlines.append(self.newlines[-1] + self.step)
        return self.newlines[depth]

    def key(self, key: Any, depth: int) -> tuple[str, str]:
        """(first, later) prefixes of a dict item at ``depth`` (depth of its value)."""
        hit = self.keys.get((key, depth)) if type(key) is str else None
        if hit is None:
            text = self.newline(depth) + self.enc(_key_text(key)) + ": "
            hit = (text, "," + text)
            if type(key) is str:
                self.keys[(key, depth)] = hit
        return hit

    def value(self, o: Any, depth: int) -> None:
        out, t = self.out, type(o)
        if t is str:
            out.append(self.enc(o))
        elif t is float:
            out.append(_float(o))
        elif t is int:
            out.append(_int_repr(o))
        elif o is None:
            out.append("null")
        elif o is True:
            out.append("true")
        elif o is False:
            out.append("false")
        elif t is dict:
            self.mapping(o, depth)
        elif t is list or t is tuple:
            self.sequence(o, depth)
        else:
            self.other(o, depth)

    def other(self, o: Any, depth: int) -> None:
        """Subclasses of the JSON types, in ``json.encoder``'s order of tests."""
        if isinstance(o, str):
            self.out.append(self.enc(o))
        elif isinstance(o, int):
            self.out.append(_int_repr(o))
        elif isinstance(o, float):
            self.out.append(_float(o))
        elif isinstance(o, list | tuple):
            self.sequence(o, depth)
        elif isinstance(o, dict):
            self.mapping(o, depth)
        else:
            msg = f"Object of type {o.__class__.__name__} is not JSON serializable"
            raise TypeError(msg)

    def mapping(self, o: dict, depth: int) -> None:
        if not o:
            self.out.append("{}")
            return
        self.out.append("{")
        inner = depth + 1
        first = True
        for k, v in o.items():
            head, later = self.key(k, inner)
            self.out.append(head if first else later)
            first = False
            self.value(v, inner)
        self.out.append(self.newline(depth) + "}")

    def sequence(self, o: list | tuple, depth: int) -> None:
        if not o:
            self.out.append("[]")
            return
        if len(o) >= _MIN_RECORDS and type(o[0]) is dict:
            text = _records(o, depth, self)
            if text is not None:
                self.out.append(text)
                return
        inner = depth + 1
        head = self.newline(inner)
        later = "," + head
        self.out.append("[" + head)
        first = True
        for v in o:
            if not first:
                self.out.append(later)
            first = False
            self.value(v, inner)
        self.out.append(self.newline(depth) + "]")


_MIN_RECORDS = 8  # lists this long of same-shaped dicts take the fast path
_SCALARS = (str, int, float, bool, type(None))


def _shape(record: dict) -> tuple | None:
    """Per key of a record: ``None`` (a scalar), the keys of a flat dict, or a length.

    None when the record holds anything deeper (a dict or list of containers).
    """
    slots = []
    for v in record.values():
        t = type(v)
        if t is dict:
            if not all(type(x) in _SCALARS for x in v.values()):
                return None
            slots.append(tuple(v))
        elif t is list or t is tuple:
            if not all(type(x) in _SCALARS for x in v):
                return None
            slots.append(len(v))
        else:
            slots.append(None)
    return tuple(slots)


def _template(record: dict, shape: tuple, depth: int, w: _Writer) -> str:
    """``%`` template of one record's text at ``depth``, one ``%s`` per scalar."""
    mark = "\0"  # never in an encoded key: json escapes NUL
    parts = ["{"]
    for i, (key, slot) in enumerate(zip(record, shape, strict=True)):
        head, later = w.key(key, depth + 1)
        parts.append(head if i == 0 else later)
        if slot is None:
            parts.append(mark)
        elif isinstance(slot, int):
            inner = w.newline(depth + 2)
            parts.append(
                "["
                + inner
                + ("," + inner).join([mark] * slot)
                + w.newline(depth + 1)
                + "]"
                if slot
                else "[]"
            )
        elif slot:
            parts.append("{")
            for j, k in enumerate(slot):
                h, lt = w.key(k, depth + 2)
                parts.append((h if j == 0 else lt) + mark)
            parts.append(w.newline(depth + 1) + "}")
        else:
            parts.append("{}")
    parts.append(w.newline(depth) + "}")
    return "".join(parts).replace("%", "%%").replace(mark, "%s")


def _width(shape: tuple) -> int:
    """Number of scalars in a record of that shape."""
    return sum(1 if s is None else s if isinstance(s, int) else len(s) for s in shape)


def _records(items: list | tuple, depth: int, w: _Writer) -> str | None:
    """A list of dicts of one shape, scalars encoded in one call to the C encoder.

    Returns None (the caller encodes item by item) when the dicts differ in shape or
    hold deeper containers.
    """
    first = items[0]
    shape = _shape(first)
    if shape is None or any(type(k) is not str for k in first):
        return None
    keys = tuple(first)
    nested = [(i, s) for i, s in enumerate(shape) if s is not None]
    flat: list = []
    for rec in items:
        if type(rec) is not dict or tuple(rec) != keys:
            return None
        values = list(rec.values())
        if not nested:
            flat += values
            continue
        at = 0
        for i, slot in nested:
            v = values[i]
            if isinstance(slot, int):
                if type(v) not in (list, tuple) or len(v) != slot:
                    return None
                flat += values[at:i]
                flat += v
            else:
                if type(v) is not dict or tuple(v) != slot:
                    return None
                flat += values[at:i]
                flat += v.values()
            at = i + 1
        flat += values[at:]
    n = _width(shape)
    if n * len(items) != len(flat):
        return None
    scalars = _column_texts(flat, n, w) or _texts(flat, w)
    if scalars is None:
        return None
    template = _template(first, shape, depth + 1, w)
    inner = w.newline(depth + 1)
    body = ("," + inner).join([template] * len(items)) % tuple(scalars)
    return "[" + inner + body + w.newline(depth) + "]"


def _texts(values: list, w: _Writer) -> list[str] | None:
    """JSON text of each scalar, in one call to the C encoder; None for a container.

    One scalar per line: an encoded scalar never holds a raw newline, and a container
    in a scalar's place shows as a line starting with [ or {, or a wrong count.
    """
    text = w.flat(values)[1:-1]
    texts = text.split("\n") if values else []
    if len(texts) != len(values) or _starts_container(text):
        return None
    return texts


_KEYED = {str, int, float}  # equal values of one of these types have equal text


def _column_texts(flat: list, n: int, w: _Writer) -> list[str] | None:
    """:func:`_texts` of records of ``n`` scalars, each repeated value encoded once.

    Column by column: a column of one type (str, int or float) whose values repeat
    is encoded once per distinct value, floats being most of the encoder's time. Zero
    floats are not shared (0.0 and -0.0 are equal but print apart). None for anything
    unusual (a container, a value JSON refuses): the caller then encodes in document
    order, so the same exception comes first.
    """
    out = [""] * len(flat)
    for j in range(n):
        column = flat[j::n]
        texts = None
        kinds = set(map(type, column))
        if len(kinds) == 1 and kinds <= _KEYED:
            distinct = list(set(column))
            if 2 * len(distinct) <= len(column) and not (
                float in kinds and 0.0 in distinct
            ):
                once = _safe_texts(distinct, w)
                if once is None:
                    return None
                lookup = dict(zip(distinct, once, strict=True))
                texts = [lookup[v] for v in column]
        texts = texts or _safe_texts(column, w)
        if texts is None:
            return None
        out[j::n] = texts
    return out


def _safe_texts(values: list, w: _Writer) -> list[str] | None:
    """:func:`_texts`, or None where the encoder refuses a value."""
    try:
        return _texts(values, w)
    except (ValueError, TypeError, OverflowError, RecursionError):
        return None


def _starts_container(text: str) -> bool:
    """True when a line of ``text`` starts with ``[`` or ``{`` (a container's text)."""
    return text.startswith(("[", "{")) or "\n[" in text or "\n{" in text


def _key_text(key: Any) -> str:
    """A dict key as ``json`` turns it into a string (str, float, int, bool, None)."""
    if isinstance(key, str):
        return key
    if isinstance(key, float):
        return _float(key)
    if key is True:
        return "true"
    if key is False:
        return "false"
    if key is None:
        return "null"
    if isinstance(key, int):
        return _int_repr(key)
    msg = f"keys must be str, int, float, bool or None, not {key.__class__.__name__}"
    raise TypeError(msg)


def dumps_indented(obj: Any, *, ensure_ascii: bool = True) -> str:
    """``json.dumps(obj, indent=2, ensure_ascii=ensure_ascii, allow_nan=False)``.

    Args:
        obj: Dicts, lists, tuples, strings, numbers, booleans and None.
        ensure_ascii: Escape every non-ASCII character (``\\uXXXX``), as ``json``.

    Returns:
        The JSON text, identical to the standard library's.

    Raises:
        ValueError: A float is NaN or infinite.
        TypeError: A value or a key of a type JSON cannot hold.
    """
    writer = _Writer(ensure_ascii, "  ")
    writer.value(obj, 0)
    return "".join(writer.out)
