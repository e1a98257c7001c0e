"""Bad input through the command line: one clear line on stderr, exit 2, no traceback.

What is checked (STYLE.md §2.10, the project's exit-code contract): a model or config
that cannot be used gives exit code 2 and exactly one non-empty stderr line naming the
file (and the GlobalId or config key where one is at fault); a model with bad elements
still runs and reports each bad element as a finding naming its GlobalId. References
outside the project: ISO 10303-21 (the STEP file's header, trailer and \\X2\\ string
escapes), ISO 16739 (IFC: GlobalIds are unique), the agreed config format (every
quantity a string with a unit). Geometry cases compare the same invented box building
(12 m × 8 m, one storey, four SHEAR walls) under a rigid motion of the plan.
"""

from __future__ import annotations

import json
import math
import random
import zipfile
from pathlib import Path

import ifcopenshell.api
import pytest

from checks.cli import main
from tests.hardening._models import CONFIG_TOML, add_wall, ifc_box, write_config

pytestmark = pytest.mark.filterwarnings("ignore::DeprecationWarning")


# ----------------------------------------------------------------------------- helpers


def _cli(capsys, *argv: str) -> tuple[int, list[str]]:
    code = main(list(argv))
    err = capsys.readouterr().err
    return code, [line for line in err.splitlines() if line.strip()]


def _one_line(lines: list[str], *names: str) -> str:
    """The single stderr line; it names every one of ``names`` and is no traceback."""
    assert len(lines) == 1, lines
    line = lines[0]
    assert "Traceback" not in line
    for name in names:
        assert str(name) in line, (name, line)
    return line


@pytest.fixture
def cfg(tmp_path: Path) -> Path:
    return write_config(tmp_path / "project.toml")


@pytest.fixture
def good(tmp_path: Path) -> Path:
    return ifc_box().write(tmp_path / "box.ifc")


def _check(capsys, model: Path, cfg: Path, out: Path, *extra: str):
    return _cli(
        capsys,
        "check",
        str(model),
        "--config",
        str(cfg),
        "--out",
        str(out),
        "-q",
        *extra,
    )


def _results(out: Path) -> dict:
    return json.loads((out / "results.json").read_text(encoding="utf-8"))


def _topics(out: Path) -> list[dict]:
    return json.loads((out / "findings.json").read_text(encoding="utf-8"))["topics"]


def _selected(topic: dict) -> set[str]:
    return {
        c["ifc_guid"]
        for vp in topic["viewpoints"]
        for c in vp.get("components", {}).get("selection", [])
    }


# --------------------------------------------------------------------- unusable files


@pytest.mark.parametrize("command", ["check", "inspect", "init"])
def test_empty_file(capsys, tmp_path, cfg, command):
    path = tmp_path / "empty.ifc"
    path.write_bytes(b"")
    argv = {
        "check": [
            "check",
            str(path),
            "--config",
            str(cfg),
            "--out",
            str(tmp_path / "o"),
        ],
        "inspect": ["inspect", str(path)],
        "init": ["init", str(path), "-o", str(tmp_path / "new.toml")],
    }[command]
    code, err = _cli(capsys, *argv)
    assert code == 2
    _one_line(err, path, "ISO-10303-21")  # ISO 10303-21 §5: the file's first token


def test_missing_model_file(capsys, tmp_path, cfg):
    path = tmp_path / "nowhere.ifc"
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path, "not found")


def test_truncated_file(capsys, tmp_path, cfg, good):
    whole = good.read_bytes()
    path = tmp_path / "half.ifc"
    path.write_bytes(whole[: len(whole) // 2])  # a valid file cut in half
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path, "truncated")  # ISO 10303-21: ends with END-ISO-10303-21;


def test_garbled_file(capsys, tmp_path, cfg, good):
    data = bytearray(good.read_bytes())
    rng = random.Random(20240607)  # seeded: the same garbage every run
    mid = len(data) // 2
    data[mid : mid + 300] = bytes(rng.randrange(256) for _ in range(300))
    path = tmp_path / "garbled.ifc"
    path.write_bytes(bytes(data))
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path)


def test_unknown_schema_in_header(capsys, tmp_path, cfg, good):
    text = good.read_text()
    assert "FILE_SCHEMA(('IFC4'))" in text
    path = tmp_path / "ifc5.ifc"
    path.write_text(text.replace("FILE_SCHEMA(('IFC4'))", "FILE_SCHEMA(('IFC5'))"))
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path, "IFC5")


def test_debug_shows_the_traceback(tmp_path, cfg):
    path = tmp_path / "empty.ifc"
    path.write_bytes(b"")
    from ifc_bridge.errors import IfcFileError

    with pytest.raises(IfcFileError):
        main(
            [
                "--debug",
                "check",
                str(path),
                "--config",
                str(cfg),
                "--out",
                str(tmp_path / "o"),
            ]
        )


# ------------------------------------------------------------------ storeys and slabs


def test_no_storeys(capsys, tmp_path, cfg):
    box = ifc_box()
    for storey in list(box.storeys):
        ifcopenshell.api.run("root.remove_product", box.ifc, product=storey)
    path = box.write(tmp_path / "nostoreys.ifc")
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path, "IfcBuildingStorey")


def test_storey_without_elevation_and_placement(capsys, tmp_path, cfg):
    box = ifc_box()
    roof = box.storeys[1]
    roof.Elevation = None
    roof.ObjectPlacement = None
    path = box.write(tmp_path / "lost.ifc")
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path, roof.GlobalId, "Elevation")


def test_storey_with_placement_only_gives_the_same_forces(capsys, tmp_path, cfg, good):
    box = ifc_box()
    box.storeys[1].Elevation = None  # optional in IFC4; the placement z says 3 m
    path = box.write(tmp_path / "placed.ifc")
    assert _check(capsys, good, cfg, tmp_path / "a")[0] == 0
    assert _check(capsys, path, cfg, tmp_path / "b")[0] == 0
    a, b = _results(tmp_path / "a"), _results(tmp_path / "b")
    assert [lv["elevation"] for lv in b["levels"]] == [3.0]  # placement z [m]
    assert [w["force"] for w in b["walls"]] == [w["force"] for w in a["walls"]]


def test_no_slabs_is_bad_input(capsys, tmp_path, cfg):
    # Judgement: walls and storeys but no slab leave no diaphragm level to load, so
    # nothing can be allocated; an engineer wants to be told to model the slabs (or
    # to name the diaphragm levels), not a run with zero forces.
    path = ifc_box(slabs=False).write(tmp_path / "noslabs.ifc")
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path, "diaphragm", "[levels].diaphragms")
    assert not (tmp_path / "out").exists()  # nothing half-written


def test_diaphragm_level_named_without_slab(capsys, tmp_path):
    text = CONFIG_TOML.replace(
        "[seismic]", '[levels]\ndiaphragms = ["Roof"]\n\n[seismic]'
    )
    cfg = write_config(tmp_path / "named.toml", text)
    box = ifc_box(slabs=False)
    path = box.write(tmp_path / "noslabs.ifc")
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path, box.storeys[1].GlobalId, "seismic weight")


# ------------------------------------------------------------------- bad wall elements


def test_zero_length_wall_is_an_error_finding(capsys, tmp_path, cfg):
    box = ifc_box()
    zero = add_wall(
        box, box.storeys[0], (6.0, 4.0), (6.0, 4.0), base=0.0, height=2.8, name="Zero"
    )
    path = box.write(tmp_path / "zero.ifc")
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert (code, err) == (1, [])  # ran; an error-severity finding
    topics = [t for t in _topics(tmp_path / "out") if _selected(t) == {zero.GlobalId}]
    assert [t["topic"]["topic_type"] for t in topics] == ["Error"]
    assert zero.GlobalId in topics[0]["topic"]["description"]
    assert zero.GlobalId not in {w["guid"] for w in _results(tmp_path / "out")["walls"]}


def test_near_zero_length_shear_wall_is_reported(capsys, tmp_path, cfg):
    box = ifc_box()
    stub = add_wall(
        box, box.storeys[0], (6.0, 4.0), (6.001, 4.0), base=0.0, height=2.8, name="Stub"
    )  # 1 mm long, typed SHEAR
    path = box.write(tmp_path / "stub.ifc")
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert err == []
    assert code in (0, 1)
    topics = [t for t in _topics(tmp_path / "out") if _selected(t) == {stub.GlobalId}]
    assert topics, "no finding names the 1 mm shear wall"


def test_duplicate_walls_are_reported(capsys, tmp_path, cfg):
    box = ifc_box()
    south = box.walls[0]
    copy = add_wall(
        box,
        box.storeys[0],
        (0.0, 0.0),
        (12.0, 0.0),
        base=0.0,
        height=2.8,
        name="South copy",
    )  # same place, new GUID
    path = box.write(tmp_path / "dup.ifc")
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert err == []
    assert code in (0, 1)
    pair = {south.GlobalId, copy.GlobalId}
    topics = [
        t
        for t in _topics(tmp_path / "out")
        if copy.GlobalId in _selected(t) and _selected(t) <= pair
    ]
    assert topics, "no finding names the duplicated wall"


def test_duplicate_global_ids_are_refused(capsys, tmp_path, cfg):
    box = ifc_box()
    interior = add_wall(
        box,
        box.storeys[0],
        (0.0, 4.0),
        (12.0, 4.0),
        base=0.0,
        height=2.8,
        name="Interior",
    )
    box.same_guid.append((box.walls[0], interior))  # ISO 16739: GlobalId is unique
    path = box.write(tmp_path / "dupguid.ifc")
    code, err = _check(capsys, path, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, path, box.walls[0].GlobalId, "'South'", "'Interior'")


# ------------------------------------------------------------------- rigid motions


def _wall_forces(out: Path) -> dict[str, dict[str, float]]:
    return {w["name"]: w["force"] for w in _results(out)["walls"]}


def test_georeferenced_far_from_origin(capsys, tmp_path, cfg, good):
    # The same building 10^6 m from the origin (site coordinates in the placement):
    # forces are translation invariant (statics), to 1e-6 relative.
    far = ifc_box(origin=(1.0e6, -1.0e6)).write(tmp_path / "far.ifc")
    assert _check(capsys, good, cfg, tmp_path / "a")[0] == 0
    assert _check(capsys, far, cfg, tmp_path / "b")[0] == 0
    a, b = _wall_forces(tmp_path / "a"), _wall_forces(tmp_path / "b")
    assert a.keys() == b.keys() == {"South", "East", "North", "West"}
    for name, fa in a.items():
        for method, value in fa.items():
            assert b[name][method] == pytest.approx(value, rel=1e-6), (name, method)
    ra, rb = _results(tmp_path / "a"), _results(tmp_path / "b")
    assert rb["levels"][0]["story_force"] == pytest.approx(
        ra["levels"][0]["story_force"], rel=1e-9
    )
    ids = [sorted(t["topic"]["guid"] for t in _topics(tmp_path / o)) for o in "ab"]
    assert ids[0] == ids[1]  # same GlobalIds, same findings


def _skewed(capsys, tmp_path, cfg, good) -> tuple[int, dict, dict]:
    skew = ifc_box(angle=math.radians(0.5)).write(tmp_path / "skew.ifc")
    assert _check(capsys, good, cfg, tmp_path / "a")[0] == 0
    code, err = _check(capsys, skew, cfg, tmp_path / "b")
    assert err == []
    return code, _wall_forces(tmp_path / "a"), _wall_forces(tmp_path / "b")


# 0.5 deg is well inside the 10 deg angle tolerance: the walls stay on their lines, and
# the forces move by about the cosine of the angle (1 - 4e-5) plus a slightly larger
# accidental-eccentricity arm (plan extent grows by 12 m * sin 0.5 deg = 0.1 m):
# 1 % is generous (common practice: such walls are treated as parallel).


def test_walls_half_degree_off_axis_stay_in_lines(capsys, tmp_path, cfg, good):
    _, a, b = _skewed(capsys, tmp_path, cfg, good)
    walls = _results(tmp_path / "b")["walls"]
    assert len({w["line"] for w in walls}) == 4
    assert all(w["line"] for w in walls)
    for name, fa in a.items():
        assert b[name]["rigid"] == pytest.approx(fa["rigid"], rel=0.01), name
        assert b[name]["envelope"] == pytest.approx(fa["envelope"], rel=0.01), name


def test_walls_half_degree_off_axis_flexible_forces(capsys, tmp_path, cfg, good):
    code, a, b = _skewed(capsys, tmp_path, cfg, good)
    titles = [t["topic"]["title"] for t in _topics(tmp_path / "b")]
    assert not [t for t in titles if "diaphragm piece" in t], titles
    for name, fa in a.items():
        assert b[name]["flexible"] == pytest.approx(fa["flexible"], rel=0.01), name
    assert code == 0


# --------------------------------------------------------------------------- names

_NAMES = ("Wänd Süd Ø", "東の壁", "North \\ 'quoted'", "West 🧱")


def test_unicode_names_survive(capsys, tmp_path, cfg):
    path = ifc_box(names=_NAMES, storey_name="Erdgeschoß").write(tmp_path / "uni.ifc")
    text = path.read_text(encoding="ascii")  # ISO 10303-21 strings are 7-bit
    assert "W\\X2\\00E4\\X0\\nd" in text  # \X2\ escape, ISO 10303-21 §6.4.3.2
    assert "\\X4\\0001F9F1\\X0\\" in text  # \X4\ for a character beyond the BMP
    assert _check(capsys, path, cfg, tmp_path / "out")[0] == 0
    walls = _results(tmp_path / "out")["walls"]
    assert sorted(w["name"] for w in walls) == sorted(_NAMES)
    assert {w["storey"] for w in walls} == {"Erdgeschoß"}
    html = (tmp_path / "out" / "report.html").read_text(encoding="utf-8")
    for name in ("Wänd Süd Ø", "東の壁", "West 🧱"):
        assert name in html
    assert "North \\ &#x27;quoted&#x27;" in html or "North \\ &#39;quoted&#39;" in html


@pytest.mark.parametrize(
    ("name", "encoding", "read_as"),
    [("Süd", "latin-1", "ISO-8859-1"), ("Süd 東 🧱", "utf-8", "UTF-8")],
    ids=["iso-8859-1", "utf-8"],
)
def test_raw_non_ascii_bytes_in_a_name_are_read_and_reported(
    capsys, tmp_path, cfg, name, encoding, read_as
):
    # ISO 10303-21 §6.4.3.2: STEP strings are 7-bit; these exports break the rule.
    # ifcopenshell alone drops the bytes ('Süd' -> 'Sd') without a word.
    box = ifc_box()
    data = box.write(tmp_path / "box.ifc").read_bytes()
    assert b"'South'" in data
    path = tmp_path / f"{encoding}.ifc"
    path.write_bytes(data.replace(b"'South'", f"'{name}'".encode(encoding)))
    code, _ = _check(capsys, path, cfg, tmp_path / "out")
    assert code in (0, 1)
    names = {w["name"] for w in _results(tmp_path / "out")["walls"]}
    assert name in names  # read as the author typed it
    south = box.walls[0].GlobalId
    warned = [t for t in _topics(tmp_path / "out") if _selected(t) == {south}]
    assert len(warned) == 1, [t["topic"]["title"] for t in _topics(tmp_path / "out")]
    text = warned[0]["topic"]["description"]
    assert read_as in text
    assert "ISO 10303-21" in text
    assert str(path) in text


# --------------------------------------------------------------------------- config


@pytest.mark.parametrize(
    ("old", "new", "key"),
    [
        ('floor = "15 psf"', "floor = 15", "loads.floor"),  # bare number: no unit
        (
            'line_tolerance = "0.5 m"',
            'line_tolerance = "0.5"',
            "analysis.line_tolerance",
        ),
        ("SDS = 1.0", "SDS = nan", "seismic.SDS"),
        ("SDS = 1.0", "SDS = inf", "seismic.SDS"),
        ('floor = "15 psf"', 'floor = "nan psf"', "loads.floor"),
        ('floor = "15 psf"', 'floor = "-15 psf"', "loads.floor"),
        ("R = 6.5", "R = -6.5", "seismic.R"),
        ('TL = "8 s"', 'TL = "-8 s"', "seismic.TL"),
        (
            'unit_shear_capacity = "340 plf"',
            'unit_shear_capacity = "-340 plf"',
            "assemblies[0].unit_shear_capacity",
        ),
        (
            'unit_shear_capacity = "340 plf"',
            'unit_shear_capacity = "340 psf"',
            "assemblies[0].unit_shear_capacity",
        ),  # wrong dimension
    ],
)
def test_bad_config_values(capsys, tmp_path, good, old, new, key):
    assert old in CONFIG_TOML
    cfg = write_config(tmp_path / "bad.toml", CONFIG_TOML.replace(old, new))
    code, err = _check(capsys, good, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, cfg, key)
    assert not (tmp_path / "out").exists()


@pytest.mark.parametrize(
    ("table", "key"),
    [
        ('[levels]\nbase = "Basement"\n', "levels.base"),
        ('[levels]\ndiaphragms = ["Mezzanine"]\n', "levels.diaphragms"),
        ('[loads.extra]\n"Mezzanine" = "10 kip"\n', "loads.extra"),
    ],
)
def test_config_names_a_storey_the_model_lacks(capsys, tmp_path, good, table, key):
    text = CONFIG_TOML.replace("[seismic]", f"{table}\n[seismic]")
    cfg = write_config(tmp_path / "storey.toml", text)
    code, err = _check(capsys, good, cfg, tmp_path / "out")
    assert code == 2
    line = _one_line(err, cfg, key, good)
    assert "'Ground', 'Roof'" in line  # what the model does have, in elevation order


def test_given_level_force_for_a_storey_the_model_lacks(capsys, tmp_path, good):
    text = CONFIG_TOML.replace('procedure = "elf"', 'procedure = "given"') + (
        '\n[seismic.level_forces]\n"Level 7" = "100 kN"\n'
    )
    cfg = write_config(tmp_path / "given.toml", text)
    code, err = _check(capsys, good, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, cfg, "Level 7")


def test_missing_config_file(capsys, tmp_path, good):
    cfg = tmp_path / "nowhere.toml"
    code, err = _check(capsys, good, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, cfg)


def test_config_not_utf8(capsys, tmp_path, good):
    cfg = tmp_path / "latin1.toml"
    cfg.write_bytes(CONFIG_TOML.replace("Hardening box", "Bâtiment").encode("latin-1"))
    code, err = _check(capsys, good, cfg, tmp_path / "out")
    assert code == 2
    _one_line(err, cfg, "UTF-8")


# -------------------------------------------------------------------------- outputs


def test_output_folder_under_a_regular_file(capsys, tmp_path, cfg, good):
    blocker = tmp_path / "notes.txt"
    blocker.write_text("a file, not a folder\n")
    out = blocker / "results"
    code, err = _check(capsys, good, cfg, out)
    assert code == 2
    _one_line(err, out)


def test_output_folder_is_a_regular_file(capsys, tmp_path, cfg, good):
    out = tmp_path / "out.txt"
    out.write_text("a file\n")
    code, err = _check(capsys, good, cfg, out)
    assert code == 2
    _one_line(err, out)
    assert out.read_text() == "a file\n"  # untouched


def test_output_file_blocked_by_a_folder(capsys, tmp_path, cfg, good):
    out = tmp_path / "out"
    (out / "results.json").mkdir(parents=True)  # a folder where the file goes
    code, err = _check(capsys, good, cfg, out)
    assert code == 2
    _one_line(err, out)


# ------------------------------------------------------------------------ --previous


def test_previous_is_not_a_bcf(capsys, tmp_path, cfg, good):
    prev = tmp_path / "findings.bcf"
    prev.write_text("minutes of the coordination meeting\n")
    code, err = _check(capsys, good, cfg, tmp_path / "out", "--previous", str(prev))
    assert code == 2
    _one_line(err, prev, "zip")


def test_previous_is_the_ifc_file(capsys, tmp_path, cfg, good):
    code, err = _check(capsys, good, cfg, tmp_path / "out", "--previous", str(good))
    assert code == 2
    _one_line(err, good)


def test_previous_is_missing(capsys, tmp_path, cfg, good):
    prev = tmp_path / "gone.bcf"
    code, err = _check(capsys, good, cfg, tmp_path / "out", "--previous", str(prev))
    assert code == 2
    _one_line(err, prev)


def test_previous_is_broken_json(capsys, tmp_path, cfg, good):
    prev = tmp_path / "findings.json"
    prev.write_text('{"topics": [')
    code, err = _check(capsys, good, cfg, tmp_path / "out", "--previous", str(prev))
    assert code == 2
    _one_line(err, prev)


@pytest.mark.parametrize(
    "name", ["../../evil.txt", "/etc/evil", "a\\..\\..\\evil", "C:/evil"]
)
def test_previous_zip_slip(capsys, tmp_path, cfg, good, name):
    prev = tmp_path / "slip.bcf"
    with zipfile.ZipFile(prev, "w") as z:
        z.writestr("bcf.version", '<Version VersionId="2.1"/>')
        z.writestr(name, "overwrite me")
    code, err = _check(capsys, good, cfg, tmp_path / "out", "--previous", str(prev))
    assert code == 2
    _one_line(err, prev, repr(name))  # named as Python shows it
    assert not (tmp_path.parent / "evil.txt").exists()
