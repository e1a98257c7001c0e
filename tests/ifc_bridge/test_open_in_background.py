"""A parse begun in a thread is the same parse, with the same errors, as a direct one."""

from __future__ import annotations

import os

import pytest

from ifc_bridge import open_file
from ifc_bridge.errors import IfcFileError
from ifc_bridge.open_file import open_ifc, open_in_background
from tests.ifc_bridge._build import add_storey, box_building


@pytest.fixture(autouse=True)
def _nothing_begun():
    yield
    begun, open_file._OPENING = open_file._OPENING, None
    if begun is not None:
        begun.thread.join()


def _census(ifc) -> list[tuple[int, str, str]]:
    return sorted((e.id(), e.is_a(), str(e.get_argument(0))) for e in ifc)


def test_background_parse_is_taken_by_open_ifc(tmp_path):
    path = box_building().write(tmp_path / "box.ifc")
    open_in_background(path)
    begun = open_file._OPENING
    assert begun is not None
    got = open_ifc(path)
    assert begun.value is got  # the thread's parse, not a second one
    assert open_file._OPENING is None  # handed over once
    assert _census(got) == _census(open_ifc(path))


def test_second_call_for_the_same_file_keeps_the_first_parse(tmp_path):
    path = box_building().write(tmp_path / "box.ifc")
    open_in_background(path)
    first = open_file._OPENING
    open_in_background(path)
    assert open_file._OPENING is first
    assert open_ifc(path) is first.value


def test_errors_come_from_open_ifc_with_the_direct_message(tmp_path):
    whole = box_building().write(tmp_path / "whole.ifc").read_bytes()
    path = tmp_path / "half.ifc"
    path.write_bytes(whole[: len(whole) // 2])
    with pytest.raises(IfcFileError) as direct:
        open_ifc(path)
    open_in_background(path)  # never raises
    with pytest.raises(IfcFileError) as later:
        open_ifc(path)
    assert str(later.value) == str(direct.value)
    assert "truncated" in str(later.value)


def test_missing_file_is_reported_by_open_ifc(tmp_path):
    path = tmp_path / "nope.ifc"
    open_in_background(path)
    assert open_file._OPENING is None
    with pytest.raises(IfcFileError, match="file not found"):
        open_ifc(path)


def test_a_file_changed_after_the_call_is_parsed_again(tmp_path):
    m = box_building()
    path = m.write(tmp_path / "box.ifc")
    open_in_background(path)
    begun = open_file._OPENING
    begun.thread.join()
    add_storey(m, "Penthouse", 6.0)
    m.write(path)
    st = path.stat()
    os.utime(path, ns=(st.st_atime_ns, st.st_mtime_ns + 1_000_000_000))
    got = open_ifc(path)
    assert got is not begun.value
    assert len(got.by_type("IfcBuildingStorey")) == 3


def test_another_file_is_not_served_the_begun_parse(tmp_path):
    a = box_building().write(tmp_path / "a.ifc")
    m = box_building()
    add_storey(m, "Penthouse", 6.0)
    b = m.write(tmp_path / "b.ifc")
    open_in_background(a)
    got = open_ifc(b)
    assert len(got.by_type("IfcBuildingStorey")) == 3
    assert open_file._OPENING is None
