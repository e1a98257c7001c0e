"""Validate a BCF-XML zip against the official buildingSMART XSDs.

The XSDs are read in place from ../shared/bcf_schemas.

Use ``assert_bcf_valid(path)`` from any test; it skips the calling test with a clear
reason when the schema folder is absent (the schemas are never copied into the project).
"""

from __future__ import annotations

import functools
import zipfile
from pathlib import Path

import pytest
from lxml import etree

ROOT = Path(__file__).resolve().parents[3]
BCF_SCHEMAS = (ROOT / ".." / "shared" / "bcf_schemas").resolve()

# member -> schema file, per BCF-XML 2.1 / 3.0 (buildingSMART/BCF-XML Schemas/)
_FIXED = {
    "bcf.version": "version.xsd",
    "project.bcfp": "project.xsd",
    "extensions.xml": "extensions.xsd",
    "documents.xml": "documents.xsd",
}
_BY_SUFFIX = {"markup.bcf": "markup.xsd", ".bcfv": "visinfo.xsd"}


def schemas_dir(version: str) -> Path:
    """Folder of one version's XSDs; skips the calling test when it is absent."""
    folder = BCF_SCHEMAS / version
    if not (folder / "markup.xsd").is_file():
        pytest.skip(f"official BCF {version} XSDs not found in {folder}")
    return folder


@functools.cache
def _schema(version: str, name: str) -> etree.XMLSchema:
    return etree.XMLSchema(etree.parse(str(schemas_dir(version) / name)))


def _schema_name(member: str, version: str) -> str | None:
    base = member.rsplit("/", 1)[-1]
    if member in _FIXED:
        if version != "3.0" and member in {"extensions.xml", "documents.xml"}:
            return None  # 2.1 has no such members
        return _FIXED[member]
    if base == "markup.bcf":
        return _BY_SUFFIX["markup.bcf"]
    if base.endswith(".bcfv"):
        return _BY_SUFFIX[".bcfv"]
    return None


def bcf_xsd_errors(path: str | Path) -> list[str]:
    """Every XSD violation in a BCF zip, as ``"<member>: <line>: <message>"``.

    Also checks that each topic folder's name is its Topic Guid (BCF-XML README).
    """
    errors: list[str] = []
    with zipfile.ZipFile(path) as z:
        names = [n for n in z.namelist() if not n.endswith("/")]
        version = etree.fromstring(z.read("bcf.version")).get("VersionId", "")
        if version not in {"2.1", "3.0"}:
            return [f"bcf.version: VersionId {version!r} is neither 2.1 nor 3.0"]
        if version == "3.0" and "extensions.xml" not in names:
            errors.append("extensions.xml: missing (required in BCF 3.0)")
        for name in names:
            xsd = _schema_name(name, version)
            if xsd is None:
                continue
            doc = etree.fromstring(z.read(name))
            schema = _schema(version, xsd)
            if not schema.validate(doc):
                errors += [f"{name}: {e.line}: {e.message}" for e in schema.error_log]
            if name.endswith("/markup.bcf"):
                guid = doc.find("Topic").get("Guid")
                if name.split("/")[0] != guid:
                    errors.append(f"{name}: folder is not the Topic Guid {guid}")
    return errors


def assert_bcf_valid(path: str | Path) -> None:
    """Assert that every XML member of a BCF zip validates against the official XSDs."""
    errors = bcf_xsd_errors(path)
    assert errors == [], "\n".join(errors)
