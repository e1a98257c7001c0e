"""Raw non-ASCII bytes in an IFC-SPF file are read as the characters they encode.

Reference: ISO 10303-21 §6.4.3.2 (7-bit strings; ``\\X2\\`` UCS-2 and ``\\X4\\``
UCS-4 escapes), and ifcopenshell as the reader of the escaped text.
"""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st

from ifc_bridge._step_text import escape_raw_text, raw_text_issue
from ifc_bridge.model import IssueSeverity
from ifc_bridge.open_file import open_ifc, raw_text_of
from tests.ifc_bridge._build import box_building


def _with_name(tmp_path, name: str, encoding: str):
    m = box_building()
    wall = m.ifc.by_type("IfcWall")[0]
    wall.Name = "PLACEHOLDER"
    data = m.write(tmp_path / "box.ifc").read_bytes()
    path = tmp_path / f"raw-{encoding}.ifc"
    path.write_bytes(data.replace(b"'PLACEHOLDER'", f"'{name}'".encode(encoding)))
    return path, wall.GlobalId


def test_escapes_are_those_of_the_standard():
    # ISO 10303-21 §6.4.3.2: U+00FC is \X2\00FC\X0\; U+1F9F1 (beyond the BMP) \X4\
    text, raw = escape_raw_text("#1=IFCWALL('Süd 🧱');\n".encode())
    assert text == "#1=IFCWALL('S\\X2\\00FC\\X0\\d \\X4\\0001F9F1\\X0\\');\n"
    assert [(r.entity, r.entity_type, r.encoding, r.strings) for r in raw] == [
        (1, "IFCWALL", "UTF-8", ("Süd 🧱",))
    ]


def test_bytes_that_are_not_utf8_are_read_as_iso_8859_1():
    text, raw = escape_raw_text(b"DATA;\n#7=IFCSLAB('Gr\xfcn',\n'Stra\xdfe');\n")
    assert "Gr\\X2\\00FC\\X0\\n" in text
    assert "Stra\\X2\\00DF\\X0\\e" in text
    assert text.isascii()
    # an instance over two lines: the second line's bytes are still #7's
    assert [(r.entity, r.encoding, r.strings) for r in raw] == [
        (7, "ISO-8859-1", ("Grün", "Straße"))
    ]


def test_bytes_in_the_header_belong_to_no_instance():
    _, raw = escape_raw_text(b"HEADER;\nFILE_NAME('x','M\xfcller');\nENDSEC;\n")
    assert [(r.entity, r.entity_type) for r in raw] == [(0, "")]


def test_a_file_that_follows_the_standard_reports_nothing(tmp_path):
    path = box_building().write(tmp_path / "box.ifc")
    assert raw_text_of(open_ifc(path)) == ()


@settings(max_examples=25, deadline=None)
@given(
    name=st.text(
        st.characters(
            min_codepoint=0xA0, max_codepoint=0x2FFFF, exclude_categories=("Cs",)
        ),
        min_size=1,
        max_size=12,
    )
)
def test_a_raw_utf8_name_is_read_as_written(tmp_path_factory, name):
    path, guid = _with_name(tmp_path_factory.mktemp("utf8"), name, "utf-8")
    ifc = open_ifc(path)
    assert ifc.by_guid(guid).Name == name
    issue = raw_text_issue(raw_text_of(ifc), ifc, str(path))
    assert issue is not None
    assert issue.guids == (guid,)
    assert issue.severity is IssueSeverity.WARNING
    assert "UTF-8" in issue.message
    assert str(path) in issue.message


def test_a_raw_latin1_name_is_read_as_written(tmp_path):
    path, guid = _with_name(tmp_path, "Wand Süd Ø", "latin-1")
    ifc = open_ifc(path)
    assert ifc.by_guid(guid).Name == "Wand Süd Ø"
    issue = raw_text_issue(raw_text_of(ifc), ifc, str(path))
    assert issue is not None
    assert issue.guids == (guid,)
    assert "ISO-8859-1" in issue.message
    assert "'Wand Süd Ø'" in issue.message
