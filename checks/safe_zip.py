"""Open a zip (a BCF file) and parse its XML defensively.

A BCF zip comes from outside the engineer's office, so it is treated as hostile until
checked: member names that would escape a folder (zip slip), symbolic links, too many
members, oversized members and zip bombs (a huge compression ratio) are rejected before
anything is extracted, and the sizes are enforced again while reading, in case the
zip's directory lies. XML is parsed with lxml without DTDs, entities or network
access, and any document with a DOCTYPE is rejected. Every rejection is a one-line
:class:`checks.errors.BcfError` naming the file and the member.
"""

from __future__ import annotations

import logging
import re
import stat
import zipfile
import zlib
from dataclasses import dataclass
from pathlib import Path

from lxml import etree

from checks.errors import BcfError

__all__ = ["ZipLimits", "parse_xml", "read_zip_members"]

logger = logging.getLogger(__name__)

_MB = 1024 * 1024
_CHUNK = 64 * 1024
_DRIVE = re.compile(r"^[A-Za-z]:")
_XML_PARSER = etree.XMLParser(
    resolve_entities=False,
    no_network=True,
    load_dtd=False,
    dtd_validation=False,
    huge_tree=False,
    remove_comments=False,
)


@dataclass(frozen=True, slots=True, kw_only=True)
class ZipLimits:
    """What a zip may hold before it is refused.

    Common practice: limits well above any real BCF file (a few hundred topics with
    PNG snapshots) and far below what would exhaust memory.

    Attributes:
        max_members: Most members (files and folders) allowed [-].
        max_member_size: Largest uncompressed member [bytes].
        max_total_size: Largest total uncompressed size [bytes].
        max_ratio: Largest uncompressed/compressed size ratio of a member [-].
    """

    max_members: int = 10_000
    max_member_size: int = 50 * _MB
    max_total_size: int = 200 * _MB
    max_ratio: float = 100.0


def _check_name(path: Path, name: str) -> None:
    """Refuse a member name that could leave the extraction folder."""
    parts = name.split("/")
    bad = (
        not name
        or name.startswith("/")
        or "\\" in name
        or _DRIVE.match(name) is not None
        or ".." in parts
        or "\x00" in name
    )
    if bad:
        msg = (
            f"{path}: member {name!r} has an unsafe name "
            "(absolute, '..', drive or backslash); refusing the zip"
        )
        raise BcfError(msg)


def _check_info(path: Path, info: zipfile.ZipInfo, limits: ZipLimits) -> None:
    """Refuse a symbolic link, an oversized member or a zip bomb."""
    name = info.filename
    _check_name(path, name)
    mode = info.external_attr >> 16
    if stat.S_ISLNK(mode):
        msg = f"{path}: member {name!r} is a symbolic link; refusing the zip"
        raise BcfError(msg)
    if info.file_size > limits.max_member_size:
        msg = (
            f"{path}: member {name!r} is {info.file_size} bytes uncompressed, over the "
            f"{limits.max_member_size} byte limit"
        )
        raise BcfError(msg)
    ratio = info.file_size / max(info.compress_size, 1)
    if info.file_size > _CHUNK and ratio > limits.max_ratio:
        msg = (
            f"{path}: member {name!r} has compression ratio {ratio:.0f}, over "
            f"{limits.max_ratio:.0f} (a zip bomb?); refusing the zip"
        )
        raise BcfError(msg)


def _read_member(
    path: Path,
    archive: zipfile.ZipFile,
    info: zipfile.ZipInfo,
    budget: int,
    limits: ZipLimits,
) -> bytes:
    """Read one member; stop as soon as it grows past its declared size or budget."""
    limit = min(info.file_size, limits.max_member_size, budget)
    chunks: list[bytes] = []
    size = 0
    with archive.open(info) as stream:
        while chunk := stream.read(_CHUNK):
            size += len(chunk)
            if size > limit:
                msg = (
                    f"{path}: member {info.filename!r} inflates past its "
                    "declared size or "
                    f"the {limits.max_total_size} byte total limit; refusing the zip"
                )
                raise BcfError(msg)
            chunks.append(chunk)
    return b"".join(chunks)


def read_zip_members(
    path: str | Path, limits: ZipLimits | None = None
) -> dict[str, bytes]:
    """Check every member of a zip, then read all files into memory.

    Common practice: validate names, types and sizes from the central directory before
    extracting, and enforce the sizes again while inflating.

    Args:
        path: The zip file.
        limits: Limits to enforce; the defaults when None.

    Returns:
        Member name -> content, in archive order; folders are left out.

    Raises:
        BcfError: The file is not a readable zip or breaks one of the limits.
    """
    path = Path(path)
    limits = limits or ZipLimits()
    try:
        archive = zipfile.ZipFile(path)
    except (OSError, zipfile.BadZipFile) as exc:
        msg = f"{path}: not a readable zip file ({exc}); give a BCF (.bcf/.bcfzip) file"
        raise BcfError(msg) from exc
    with archive:
        infos = archive.infolist()
        if len(infos) > limits.max_members:
            msg = (
                f"{path}: {len(infos)} members, "
                f"over the {limits.max_members} member limit"
            )
            raise BcfError(msg)
        for info in infos:
            _check_info(path, info, limits)
        total = sum(info.file_size for info in infos)
        if total > limits.max_total_size:
            msg = (
                f"{path}: {total} bytes uncompressed, "
                f"over the {limits.max_total_size} byte limit"
            )
            raise BcfError(msg)
        members: dict[str, bytes] = {}
        budget = limits.max_total_size
        for info in infos:
            if info.is_dir():
                continue
            if info.filename in members:
                msg = (
                    f"{path}: member {info.filename!r} appears twice; refusing the zip"
                )
                raise BcfError(msg)
            try:
                data = _read_member(path, archive, info, budget, limits)
            except (
                zipfile.BadZipFile,
                OSError,
                EOFError,
                NotImplementedError,
                RuntimeError,
                zlib.error,  # a corrupt deflate stream
            ) as exc:
                msg = f"{path}: member {info.filename!r} cannot be read ({exc})"
                raise BcfError(msg) from exc
            budget -= len(data)
            members[info.filename] = data
    logger.debug("%s: %d members read safely", path, len(members))
    return members


def parse_xml(data: bytes, *, source: str) -> etree._Element:
    """Parse one XML document with no DTD, no entity expansion and no network.

    Common practice (OWASP XML External Entity prevention): refuse any DOCTYPE, so
    neither external entities nor entity expansion bombs can apply.

    Args:
        data: The document.
        source: ``"<file>: <member>"``, for the error message.

    Returns:
        The root element.

    Raises:
        BcfError: The document has a DOCTYPE or is not well-formed XML.
    """
    head = data[:4096].lstrip(b"\xef\xbb\xbf").lower()
    if b"<!doctype" in head or b"<!entity" in data.lower():
        msg = f"{source}: XML with a DOCTYPE or ENTITY declaration is refused"
        raise BcfError(msg)
    try:
        root = etree.fromstring(data, parser=_XML_PARSER)
    except etree.XMLSyntaxError as exc:
        msg = f"{source}: not well-formed XML ({exc})"
        raise BcfError(msg) from exc
    if root.getroottree().docinfo.doctype:
        msg = f"{source}: XML with a DOCTYPE is refused"
        raise BcfError(msg)
    return root
