"""Defensive zip and XML reading: each attack is refused with a one-line BcfError."""

from __future__ import annotations

import stat
import zipfile

import pytest

from checks.errors import BcfError
from checks.safe_zip import ZipLimits, parse_xml, read_zip_members


def _zip(path, members, *, compression=zipfile.ZIP_DEFLATED):
    with zipfile.ZipFile(path, "w", compression) as z:
        for name, data in members.items():
            z.writestr(name, data)
    return path


def test_reads_a_plain_zip(tmp_path):
    path = _zip(
        tmp_path / "ok.bcf",
        {"bcf.version": b"<Version/>", "t/markup.bcf": b"<Markup/>"},
    )
    assert read_zip_members(path) == {
        "bcf.version": b"<Version/>",
        "t/markup.bcf": b"<Markup/>",
    }


def test_default_limits():  # the task's limits: 50 MB a member, 200 MB, ratio 100
    limits = ZipLimits()
    assert (limits.max_member_size, limits.max_total_size) == (50 * 2**20, 200 * 2**20)
    assert limits.max_ratio == 100.0


@pytest.mark.parametrize(
    "name",
    [
        "../evil.txt",
        "topic/../../evil.txt",
        "/etc/evil.txt",
        "C:/evil.txt",
        "c:evil.txt",
        "topic\\..\\evil.txt",
    ],
)
def test_zip_slip_names_are_refused(tmp_path, name):  # zip slip (Snyk, 2018)
    path = _zip(tmp_path / "slip.bcf", {"bcf.version": b"<Version/>", name: b"x"})
    with pytest.raises(BcfError, match="unsafe name") as err:
        read_zip_members(path)
    assert "\n" not in str(err.value)


def test_symlink_member_is_refused(tmp_path):
    path = tmp_path / "link.bcf"
    info = zipfile.ZipInfo("topic/markup.bcf")
    info.external_attr = (stat.S_IFLNK | 0o777) << 16
    with zipfile.ZipFile(path, "w") as z:
        z.writestr(info, "/etc/passwd")
    with pytest.raises(BcfError, match="symbolic link"):
        read_zip_members(path)


def test_too_many_members_is_refused(tmp_path):
    path = _zip(tmp_path / "many.bcf", {f"m{i}.txt": b"x" for i in range(6)})
    with pytest.raises(BcfError, match="6 members, over the 5 member limit"):
        read_zip_members(path, ZipLimits(max_members=5))


def test_oversized_member_is_refused(tmp_path):
    data = bytes(range(256)) * 8  # 2048 bytes, hardly compressible
    path = _zip(tmp_path / "big.bcf", {"big.bin": data})
    with pytest.raises(BcfError, match="2048 bytes uncompressed"):
        read_zip_members(path, ZipLimits(max_member_size=1000))


def test_oversized_total_is_refused(tmp_path):
    data = bytes(range(256)) * 4  # 1024 bytes each
    path = _zip(tmp_path / "total.bcf", {"a.bin": data, "b.bin": data})
    with pytest.raises(BcfError, match="2048 bytes uncompressed, over the 1500"):
        read_zip_members(path, ZipLimits(max_member_size=1024, max_total_size=1500))


def test_zip_bomb_ratio_is_refused(tmp_path):
    path = _zip(
        tmp_path / "bomb.bcf", {"zeros.bin": bytes(4 * 2**20)}
    )  # 4 MB of zeros, ~1000:1
    with pytest.raises(BcfError, match="compression ratio"):
        read_zip_members(path)


def test_duplicate_member_is_refused(tmp_path):
    path = tmp_path / "dup.bcf"
    with zipfile.ZipFile(path, "w") as z:
        z.writestr("a.txt", b"1")
        with pytest.warns(UserWarning, match="Duplicate name"):
            z.writestr("a.txt", b"2")
    with pytest.raises(BcfError, match="appears twice"):
        read_zip_members(path)


def test_not_a_zip_is_refused(tmp_path):
    path = tmp_path / "plain.bcf"
    path.write_text("hello")
    with pytest.raises(BcfError, match="not a readable zip"):
        read_zip_members(path)


_BILLION_LAUGHS = b"""<?xml version="1.0"?>
<!DOCTYPE lolz [<!ENTITY lol "lol">
<!ENTITY lol2 "&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;">]>
<Markup>&lol2;</Markup>"""
_XXE = b"""<?xml version="1.0"?>
<!DOCTYPE m [<!ENTITY xxe SYSTEM "file:///etc/passwd">]>
<Markup>&xxe;</Markup>"""
_PLAIN_DOCTYPE = b"""<?xml version="1.0"?><!DOCTYPE Markup SYSTEM "http://example.com/markup.dtd"><Markup/>"""


@pytest.mark.parametrize("doc", [_BILLION_LAUGHS, _XXE, _PLAIN_DOCTYPE])
def test_xml_with_doctype_is_refused(doc):  # OWASP XXE prevention: no DTDs at all
    with pytest.raises(BcfError, match="DOCTYPE") as err:
        parse_xml(doc, source="x.bcf: t/markup.bcf")
    assert str(err.value).startswith("x.bcf: t/markup.bcf:")


def test_malformed_xml_is_refused():
    with pytest.raises(BcfError, match="not well-formed"):
        parse_xml(b"<Markup><Topic></Markup>", source="x.bcf: t/markup.bcf")


def test_plain_xml_parses():
    root = parse_xml(b'<Markup><Topic Guid="g"/></Markup>', source="x")
    assert root.find("Topic").get("Guid") == "g"


def test_encrypted_member_is_a_one_line_error(tmp_path):
    path = _zip(tmp_path / "locked.bcf", {"bcf.version": b"<Version/>"})
    data = bytearray(path.read_bytes())
    # set the "encrypted" bit of the general purpose flags, APPNOTE.TXT §4.4.4,
    # in the local header (offset 6) and the central directory header (offset 8)
    central = data.index(b"PK\x01\x02")
    data[6] |= 0x1
    data[central + 8] |= 0x1
    path.write_bytes(bytes(data))
    with pytest.raises(BcfError, match="cannot be read"):
        read_zip_members(path)
