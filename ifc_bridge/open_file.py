"""Open an IFC-SPF file with ifcopenshell, with one-line errors for unusable files.

Checks done before and after ifcopenshell parses the file: the file exists, starts
with the ISO 10303-21 magic, declares a schema ifcopenshell knows, and ends with the
``END-ISO-10303-21;`` trailer (ifcopenshell opens a file cut in half without a word).
A header token ``IFC4X3`` (written by exporters before IFC 4.3 ADD2) is read as
``IFC4X3_ADD2``. Raw non-ASCII bytes in the text (not allowed by ISO 10303-21, and
dropped by ifcopenshell) are read as characters (:mod:`ifc_bridge._step_text`) and
reported by :func:`raw_text_of`.

ifcopenshell's parser releases the interpreter lock, so :func:`open_in_background`
can parse a file in a thread while the caller imports modules and reads its config;
:func:`open_ifc` of the same file then takes that parse (or its error) instead of
parsing again.
"""

from __future__ import annotations

import logging
import mmap
import os
import re
import threading
import weakref
from pathlib import Path

import ifcopenshell
import ifcopenshell.ifcopenshell_wrapper
import numpy as np

from ifc_bridge._step_text import RawText, escape_raw_text
from ifc_bridge.errors import IfcFileError, IfcSchemaError

__all__ = [
    "SUPPORTED_SCHEMAS",
    "open_ifc",
    "open_in_background",
    "parsing",
    "raw_text_of",
    "schema_name",
]

_LOG = logging.getLogger(__name__)

SUPPORTED_SCHEMAS = ("IFC2X3", "IFC4", "IFC4X3")
_MAGIC = b"ISO-10303-21;"
_TRAILER = b"END-ISO-10303-21;"
_SCHEMA_RE = re.compile(rb"FILE_SCHEMA\s*\(\s*\(\s*'([^']*)'", re.IGNORECASE)
_PRE_ADD2_RE = re.compile(
    rb"(FILE_SCHEMA\s*\(\s*\(\s*')IFC4X3('\s*\)\s*\))", re.IGNORECASE
)


def _header_schema(path: Path) -> str:
    with path.open("rb") as fh:
        head = fh.read(65536)
    if not head.lstrip().startswith(_MAGIC):
        kind = (
            "a zip archive (ifcZIP?)" if head.startswith(b"PK") else "not IFC-SPF text"
        )
        if head.lstrip().startswith(b"<"):
            kind = "XML (ifcXML?)"
        msg = (
            f"{path}: not an IFC-SPF file ({kind}, no 'ISO-10303-21;' header); "
            "export the model as IFC (.ifc, STEP physical file)"
        )
        raise IfcFileError(msg)
    match = _SCHEMA_RE.search(head)
    if match is None:
        msg = f"{path}: no FILE_SCHEMA in the header; the file is damaged, export again"
        raise IfcFileError(msg)
    return match.group(1).decode("ascii", "replace").upper()


def _check_trailer(path: Path) -> None:
    size = path.stat().st_size
    with path.open("rb") as fh:
        fh.seek(max(0, size - 4096))
        tail = fh.read()
    if _TRAILER not in tail:
        msg = (
            f"{path}: file is truncated (no 'END-ISO-10303-21;' at the end); "
            "copy or export the file again"
        )
        raise IfcFileError(msg)


def _has_raw_bytes(path: Path) -> bool:
    """True when the file holds a byte outside 7-bit ASCII (ISO 10303-21 §6.4.3.2).

    The file is mapped, not read into memory, and scanned by numpy outside the
    interpreter lock: a 10 MB model costs a few milliseconds and no heap.
    """
    with path.open("rb") as fh:
        if os.fstat(fh.fileno()).st_size == 0:
            return False
        with mmap.mmap(fh.fileno(), 0, access=mmap.ACCESS_READ) as mm:
            view = np.frombuffer(mm, dtype=np.uint8)
            found = bool(view.max() >= 0x80)
            del view  # the map closes only once no array looks at it
    return found


_STAMP_RE = re.compile(r"\[\d{4}-\d\d-\d\d [\d:]+\]\s*")


def _check_parse(ifc: ifcopenshell.file, path: Path) -> None:
    """Raise when ifcopenshell reported a syntax error or read no IfcProject."""
    log = ifcopenshell.ifcopenshell_wrapper.get_log()
    errors = [
        _STAMP_RE.sub("", line)
        for line in log.splitlines()
        if line.startswith("[error]")
    ]
    if any("[SYN" in e for e in errors) or not ifc.by_type("IfcProject"):
        first = errors[0] if errors else "no IfcProject"
        msg = (
            f"{path}: the IFC data is garbled ({first}; {len(errors)} parse errors); "
            "export the file again"
        )
        raise IfcFileError(msg)
    for e in errors:
        _LOG.warning("%s: %s", path, e)


def _schema_name(ifc: ifcopenshell.file) -> str:
    schema = ifc.schema.upper()
    return "IFC4X3" if schema.startswith("IFC4X3") else schema


class _Opening:
    """One file being parsed in a background thread: its result or its error."""

    __slots__ = ("error", "key", "thread", "value")

    def __init__(self, path: Path, key: tuple) -> None:
        self.key, self.value, self.error = key, None, None
        self.thread = threading.Thread(
            target=self._run, args=(path,), name="shearline-open", daemon=True
        )

    def _run(self, path: Path) -> None:
        try:
            self.value = _open(path)
        except BaseException as exc:  # handed to the caller of open_ifc
            self.error = exc

    def result(self) -> ifcopenshell.file:
        self.thread.join()
        if self.error is not None:
            raise self.error
        return self.value


_OPENING: _Opening | None = None


def _key(p: Path) -> tuple | None:
    """Identity of a file's current content: path, size, modification time."""
    try:
        st = p.stat()
    except OSError:
        return None
    return (str(p.resolve()), st.st_size, st.st_mtime_ns)


def open_in_background(path: str | os.PathLike[str]) -> None:
    """Start parsing ``path`` in a thread; :func:`open_ifc` of it takes the result.

    The parse runs outside the interpreter lock, so the caller's own work (imports,
    the config) goes on meanwhile. Never raises: an unusable file's error is raised
    by :func:`open_ifc`. A file changed on disk after this call is parsed again by
    :func:`open_ifc`. At most one file is kept: a call for another file replaces
    the first; a second call for the same file does nothing.
    """
    global _OPENING
    p = Path(path)
    key = _key(p)
    if key is None or (_OPENING is not None and _OPENING.key == key):
        return  # missing (open_ifc says so), or begun already
    # ifcopenshell registers its schemas on first use; do it here, not in two
    # threads at once
    ifcopenshell.ifcopenshell_wrapper.schema_by_name("IFC4")
    _OPENING = _Opening(p, key)
    _OPENING.thread.start()


def parsing() -> bool:
    """True while a parse begun by :func:`open_in_background` is still running."""
    begun = _OPENING
    return begun is not None and begun.thread.is_alive()


def open_ifc(path: str | os.PathLike[str]) -> ifcopenshell.file:
    """Open an IFC file for reading.

    Common practice: IFC-SPF (ISO 10303-21) files of schema IFC2X3, IFC4 or IFC4X3.

    Args:
        path: File to open.

    Returns:
        The parsed file (the one :func:`open_in_background` began, when it was
        begun on this file as it is now on disk).

    Raises:
        IfcFileError: Missing, unreadable, not IFC-SPF, truncated, garbled (a syntax
            error or no IfcProject) or unparsable.
        IfcSchemaError: The header names a schema other than IFC2X3, IFC4, IFC4X3.
    """
    global _OPENING
    p = Path(path)
    begun, _OPENING = _OPENING, None
    if begun is not None:
        if begun.key == _key(p):
            return begun.result()
        begun.thread.join()  # another file, or this one since changed: not used
    return _open(p)


def _open(p: Path) -> ifcopenshell.file:
    if not p.is_file():
        msg = f"{p}: file not found; check the path"
        raise IfcFileError(msg)
    try:
        declared = _header_schema(p)
        _check_trailer(p)
        # the whole text is read only when it must be changed before the parse
        data = p.read_bytes() if declared == "IFC4X3" or _has_raw_bytes(p) else None
    except OSError as exc:
        if isinstance(exc, IfcFileError):
            raise
        msg = (
            f"{p}: cannot read the file ({exc.strerror or exc}); check its permissions"
        )
        raise IfcFileError(msg) from exc
    if not declared.startswith(SUPPORTED_SCHEMAS):
        msg = (
            f"{p}: schema {declared!r} is not supported; export as one of "
            f"{', '.join(SUPPORTED_SCHEMAS)}"
        )
        raise IfcSchemaError(msg)
    raw: tuple[RawText, ...] = ()
    text = None  # the text to parse, when it is not the file as it is
    if data is not None and declared == "IFC4X3":
        _LOG.info("%s: header schema IFC4X3 read as IFC4X3_ADD2", p)
        data = _PRE_ADD2_RE.sub(rb"\1IFC4X3_ADD2\2", data, count=1)
        text = data.decode("latin-1")
    if data is not None and not data.isascii():
        text, raw = escape_raw_text(data)
        _LOG.warning("%s: raw non-ASCII bytes in %d instance(s), read as text", p, len(raw))
    del data
    ifcopenshell.ifcopenshell_wrapper.get_log()  # clears messages of earlier reads
    try:
        if text is not None:
            ifc = ifcopenshell.file.from_string(text)
        else:
            ifc = ifcopenshell.open(str(p))
    except ifcopenshell.SchemaError as exc:
        msg = (
            f"{p}: schema {declared!r} cannot be read ({exc}); export as IFC2X3 or IFC4"
        )
        raise IfcSchemaError(msg) from exc
    except Exception as exc:  # ifcopenshell raises bare Exception / ifcopenshell.Error
        msg = f"{p}: cannot parse the IFC file ({exc}); export it again"
        raise IfcFileError(msg) from exc
    _check_parse(ifc, p)
    if _schema_name(ifc) not in SUPPORTED_SCHEMAS:
        msg = f"{p}: schema {ifc.schema!r} is not supported; export as IFC2X3 or IFC4"
        raise IfcSchemaError(msg)
    if raw:
        _RAW_TEXT[ifc] = raw
    return ifc


# The raw non-ASCII characters found in each open file (kept while the file lives).
_RAW_TEXT: weakref.WeakKeyDictionary = weakref.WeakKeyDictionary()


def raw_text_of(ifc: ifcopenshell.file) -> tuple[RawText, ...]:
    """Where :func:`open_ifc` found raw non-ASCII bytes in the file (and read them).

    ISO 10303-21 §6.4.3.2: STEP strings are 7-bit, other characters escaped; see
    :mod:`ifc_bridge._step_text`.

    Args:
        ifc: A file from :func:`open_ifc`.

    Returns:
        One entry per entity instance whose text held them; empty for a file that
        follows the standard.
    """
    return _RAW_TEXT.get(ifc, ())


def schema_name(ifc: ifcopenshell.file) -> str:
    """Schema family of an open file: ``"IFC2X3"``, ``"IFC4"`` or ``"IFC4X3"``."""
    return _schema_name(ifc)
