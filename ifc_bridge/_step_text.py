"""Raw non-ASCII bytes in an IFC-SPF file, read as characters instead of dropped.

ISO 10303-21 §6.4.3.2: the characters of a STEP string are 7-bit; others are written
as ``\\X2\\`` (UCS-2, four hex digits each) or ``\\X4\\`` (eight hex digits each)
escapes ended by ``\\X0\\``. Some exporters write the raw bytes instead (UTF-8, or an
ISO 8859-1 code page), and ifcopenshell drops every such byte without a word: 'Süd'
is read as 'Sd'. Here the bytes are decoded (UTF-8 when they are valid UTF-8, else
ISO 8859-1, which maps every byte) and written back as the escapes, so the names read
are the ones the author typed; each entity whose text held them is reported.
"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass

from ifc_bridge.model import ImportIssue, IssueSeverity

__all__ = ["RawText", "escape_raw_text", "raw_text_issue"]

_RUN = re.compile(r"[^\x00-\x7f]+")
_RAW = re.compile(rb"[\x80-\xff]+")
_ENTITY = re.compile(rb"#(\d+)\s*=\s*([A-Za-z0-9_]+)")


@dataclass(frozen=True, slots=True, kw_only=True)
class RawText:
    """Raw non-ASCII characters found in one entity instance's text.

    Attributes:
        entity: Its STEP instance id (``#id``), or 0 when none precedes them.
        entity_type: Its type as written (``IFCWALL``), or ``""``.
        encoding: How the bytes were read: ``"UTF-8"`` or ``"ISO-8859-1"``.
        strings: The strings that held them, as read, in order (for the message).
    """

    entity: int
    entity_type: str
    encoding: str
    strings: tuple[str, ...]


def _quoted(data: bytes, start: int, end: int, most: int = 60) -> bytes:
    """The STEP string around bytes ``start:end`` (between its quotes, on its line),
    at most ``most`` bytes either side of them."""
    line = data.rfind(b"\n", 0, start) + 1
    left = data.rfind(b"'", max(line, start - most), start)
    right = data.find(b"'", end, end + most)
    lo = left + 1 if left >= 0 else max(line, start - most)
    hi = right if right >= 0 else min(len(data), end + most)
    return data[lo:hi]


def _escape(run: str) -> str:
    """ISO 10303-21 §6.4.3.2 escape of a run of non-ASCII characters."""
    out = []
    for ch in run:
        code = ord(ch)
        out.append(
            f"\\X2\\{code:04X}\\X0\\" if code <= 0xFFFF else f"\\X4\\{code:08X}\\X0\\"
        )
    return "".join(out)


def _owner(data: bytes, at: int) -> tuple[int, str]:
    """The instance whose text holds byte ``at``: the nearest line up from it that
    starts with ``#id=`` (an instance may run over several lines); (0, "") if none."""
    end = at
    while True:
        start = data.rfind(b"\n", 0, end) + 1
        m = _ENTITY.match(data, start)
        if m is not None:
            return int(m.group(1)), m.group(2).decode("ascii").upper()
        if start == 0:
            return 0, ""
        end = start - 1


def escape_raw_text(data: bytes) -> tuple[str, tuple[RawText, ...]]:
    """The file's text with raw non-ASCII characters escaped, and where they were.

    Args:
        data: The bytes of an IFC-SPF file that are not all ASCII.

    Returns:
        The text to parse (ASCII only), and one entry per entity instance whose
        text held raw characters, in file order.
    """
    try:
        text, encoding = data.decode("utf-8"), "UTF-8"
    except UnicodeDecodeError:
        text, encoding = data.decode("latin-1"), "ISO-8859-1"
    # the runs of raw bytes, each with the instance it is in
    found: dict[int, tuple[str, dict[str, None]]] = {}
    for m in _RAW.finditer(data):
        entity, kind = _owner(data, m.start())
        found.setdefault(entity, (kind, {}))[1].setdefault(
            _quoted(data, m.start(), m.end()).decode(encoding)
        )
    raw = tuple(
        RawText(
            entity=entity,
            entity_type=kind,
            encoding=encoding,
            strings=tuple(parts),
        )
        for entity, (kind, parts) in found.items()
    )
    return _RUN.sub(lambda m: _escape(m.group()), text), raw


def raw_text_issue(
    raw: Sequence[RawText], ifc, source: str, *, shown: int = 3
) -> ImportIssue | None:
    """One warning naming the instances whose text held raw non-ASCII bytes.

    ISO 10303-21 §6.4.3.2 (7-bit strings, ``\\X2\\`` escapes). The elements (IfcRoot
    instances) are listed by GlobalId so the author finds them in their own tool.

    Args:
        raw: What :func:`escape_raw_text` found in the file.
        ifc: The file parsed from the escaped text (``by_id`` of its instances).
        source: The file's path, for the message.
        shown: How many instances the message quotes.

    Returns:
        The issue, or None when nothing was found.
    """
    if not raw:
        return None
    guids: dict[str, None] = {}
    quoted = []
    for r in raw:
        where = "the header" if not r.entity else f"#{r.entity} {r.entity_type}"
        try:
            element = ifc.by_id(r.entity) if r.entity else None
        except RuntimeError:  # no such instance (the text was cut)
            element = None
        if element is not None and element.is_a("IfcRoot"):
            guid = element.get_argument(0)  # IfcRoot.GlobalId, ISO 16739
            guids.setdefault(guid)
            where += f" {guid}"
        if len(quoted) < shown:
            quoted.append(f"{where} " + ", ".join(repr(t) for t in r.strings))
    more = f" and {len(raw) - shown} more" if len(raw) > shown else ""
    return ImportIssue(
        code="raw_text",
        severity=IssueSeverity.WARNING,
        message=(
            f"{source}: raw non-ASCII bytes in the text of {len(raw)} instance(s), "
            f"read as {raw[0].encoding}: {'; '.join(quoted)}{more}; an IFC file's "
            "strings are 7-bit with \\X2\\ escapes (ISO 10303-21 §6.4.3.2): check "
            "these names and export the file again"
        ),
        guids=tuple(sorted(guids)),
    )
