"""Bounded, deterministic fuzzing of the two readers of outside text: config and BCF.

Property (the error contract of STYLE.md §2.6): whatever the bytes, the config loader
raises only ``ConfigError`` and the BCF reader only ``BcfError``, each with a one-line
message naming the file; a document that is accepted gives a finished record. The seed
inputs are the hardening config (agreed format) and real ``findings.bcf`` zips (BCF
2.1 and 3.0) written by ``shearline check`` on the box building; hypothesis runs
derandomized with a fixed number of examples, so the same cases run every time.
"""

from __future__ import annotations

import copy
import io
import tomllib
import zipfile
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from checks.cli import main
from checks.config import config_from_dict, config_from_toml, load_config
from checks.errors import BcfError, ConfigError
from checks.project import ProjectConfig
from checks.report.bcf_read import read_topics
from tests.hardening._models import CONFIG_TOML, ifc_box, write_config

FUZZ = settings(
    max_examples=200,
    deadline=None,
    derandomize=True,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large],
)
SOURCE = "fuzz.toml"

# ------------------------------------------------------------------------- config

BASE = tomllib.loads(CONFIG_TOML)

_KEYS = sorted(
    {
        *BASE,
        *(k for v in BASE.values() if isinstance(v, dict) for k in v),
        *(k for a in BASE["assemblies"] for k in a),
        "levels",
        "base",
        "diaphragms",
        "level_forces",
        "extra",
        "period",
        "rho",
        "display_units",
        "author",
        "design_basis",
        "amplify_torsion",
        "wall_stiffness",
        "accidental_eccentricity",
        "shear_walls",
        "predefined_type",
        "bcf",
        "version",
        "sheathing",
        "fastener",
        "edge_spacing",
        "nominal_unit_shear",
        "fc",
        "fy",
        "rho_t",
        "lambda",
        "Ga",
        "chord_E",
        "chord_area",
        "hold_down_slip",
        "E",
        "G",
        "blocked",
        "aspect_ratio_limit",
        "wall_dead_load",
        "property",
        "value",
        "type_name",
        "material",
        "Level 2",
        "Roof",
        "",
    }
)
_UNITS = [
    "psf",
    "kPa",
    "plf",
    "N/m",
    "m",
    "ft",
    "in",
    "s",
    "deg",
    "kip",
    "kN",
    "psi",
    "ksi",
    "kip/in",
    "in**2",
    "g",
    "",
    "furlong",
    "m/s",
    "psf psf",
    "1/0",
]
_WORDS = [
    "elf",
    "given",
    "flexible",
    "rigid",
    "envelope",
    "length",
    "assembly",
    "ASD",
    "LRFD",
    "imperial",
    "si",
    "2.1",
    "3.0",
    "wood_structural_panel",
    "concrete",
    "15/32 Structural I",
    "10d common",
    "SW*",
    "nan",
    "inf",
    "-",
    "",
    "__import__",
]

_numbers = st.one_of(
    st.integers(-(10**20), 10**20),
    st.floats(allow_nan=True, allow_infinity=True),
    st.sampled_from([0, 1, -1, 0.0, -0.0, 1e308, -1e-320, float("nan")]),
)
_quantities = st.builds(
    lambda n, u: f"{n} {u}".strip(),
    st.one_of(st.floats(allow_nan=True, allow_infinity=True), st.integers(-999, 999)),
    st.sampled_from(_UNITS),
)
_scalars = st.one_of(
    _numbers, _quantities, st.booleans(), st.sampled_from(_WORDS), st.text(max_size=12)
)
_keys = st.one_of(st.sampled_from(_KEYS), st.text(max_size=8))
_values = st.recursive(
    _scalars,
    lambda inner: st.one_of(
        st.lists(inner, max_size=4), st.dictionaries(_keys, inner, max_size=4)
    ),
    max_leaves=12,
)


def _accepts_only_config_error(build) -> None:
    try:
        cfg = build()
    except ConfigError as exc:
        text = str(exc)
        assert "\n" not in text, text
        assert text.startswith(SOURCE) or SOURCE in text, text
    else:
        assert isinstance(cfg, ProjectConfig)


@FUZZ
@given(doc=st.dictionaries(_keys, _values, max_size=6))
def test_config_random_documents(doc):
    _accepts_only_config_error(lambda: config_from_dict(doc, path=SOURCE))


@st.composite
def _mutated(draw) -> dict:
    """The valid base config with a few keys replaced, added or deleted."""
    doc = copy.deepcopy(BASE)
    for _ in range(draw(st.integers(1, 4))):
        table = draw(st.sampled_from(sorted(doc) or [""]))
        where = doc.get(table)
        if table == "assemblies" and isinstance(where, list) and where:
            where = where[0]
        action = draw(st.sampled_from(["replace", "add", "delete", "table"]))
        if action == "table" or not isinstance(where, dict):
            doc[table] = draw(_values)
        elif action == "delete" and where:
            del where[draw(st.sampled_from(sorted(where)))]
        elif action == "replace" and where:
            where[draw(st.sampled_from(sorted(where)))] = draw(_values)
        else:
            where[draw(_keys)] = draw(_values)
    return doc


@FUZZ
@given(doc=_mutated())
def test_config_mutated_documents(doc):
    _accepts_only_config_error(lambda: config_from_dict(doc, path=SOURCE))


def _lines_mutated(lines: list[str], cuts: list[tuple[int, str]]) -> str:
    out = list(lines)
    for at, text in cuts:
        out[at % len(out)] = text
    return "\n".join(out)


@FUZZ
@given(
    text=st.one_of(
        st.text(max_size=200),
        st.builds(
            _lines_mutated,
            st.just(CONFIG_TOML.splitlines()),
            st.lists(st.tuples(st.integers(0, 200), st.text(max_size=30)), max_size=4),
        ),
    )
)
def test_config_random_text(text):
    _accepts_only_config_error(lambda: config_from_toml(text, path=SOURCE))


@pytest.fixture(scope="module")
def fuzz_dir(tmp_path_factory) -> Path:
    return tmp_path_factory.mktemp("fuzz")


@FUZZ
@given(data=st.binary(max_size=300))
def test_config_file_random_bytes(fuzz_dir, data):
    path = fuzz_dir / SOURCE
    path.write_bytes(CONFIG_TOML.encode()[: len(data)] + data)
    _accepts_only_config_error(lambda: load_config(path))


def test_config_seed_is_valid(fuzz_dir):  # the fuzzers start from an accepted file
    cfg = load_config(write_config(fuzz_dir / "seed.toml"))
    assert cfg.name == "Hardening box"
    assert cfg.loads.floor == pytest.approx(718.2, rel=1e-3)  # 15 psf = 718.2 Pa


# ---------------------------------------------------------------------------- BCF


@pytest.fixture(scope="module")
def bcf_seeds(tmp_path_factory) -> dict[str, bytes]:
    """Real findings.bcf files (2.1 and 3.0) of a check run on the box building."""
    root = tmp_path_factory.mktemp("bcf-seed")
    model = ifc_box().write(root / "box.ifc")
    cfg = write_config(root / "box.toml")
    seeds = {}
    for version in ("2.1", "3.0"):
        out = root / version
        code = main(
            [
                "check",
                str(model),
                "--config",
                str(cfg),
                "--out",
                str(out),
                "--bcf-version",
                version,
                "-q",
            ]
        )
        assert code == 0
        seeds[version] = (out / "findings.bcf").read_bytes()
        assert read_topics(out / "findings.bcf").topics  # the seed itself reads
    return seeds


def _members(data: bytes) -> list[tuple[str, bytes]]:
    with zipfile.ZipFile(io.BytesIO(data)) as z:
        return [(i.filename, z.read(i)) for i in z.infolist()]


def _zip(members: list[tuple[str, bytes]]) -> bytes:
    buf = io.BytesIO()
    with zipfile.ZipFile(buf, "w", zipfile.ZIP_DEFLATED) as z:
        for name, data in members:
            z.writestr(name, data)
    return buf.getvalue()


_ODD_NAMES = [
    "../evil",
    "/abs/markup.bcf",
    "a\\b",
    "C:/x",
    "x/../../y",
    "dir/",
    "só/markup.bcf",
    "x" * 300,
    "bcf.version",
    "a/b/markup.bcf",
    "nul\x00name",
    " /markup.bcf",
    "t/viewpoint.bcfv",
    "t/snapshot.png",
]
_names = st.text(min_size=1, max_size=20)
_XMLISH = st.one_of(
    st.binary(max_size=200),
    st.text(max_size=200).map(str.encode),
    st.sampled_from(
        [
            b"<Markup/>",
            b"<Markup><Topic/></Markup>",
            b'<Version VersionId="9"/>',
            b'<?xml version="1.0"?><!DOCTYPE x [<!ENTITY e "boom">]><Markup>&e;</Markup>',
            b'<Markup><Topic Guid="g"><Title>t</Title><CreationDate>yesterday'
            b"</CreationDate></Topic></Markup>",
            b"<VisualizationInfo><PerspectiveCamera><CameraViewPoint><X>nan</X>"
            b"</CameraViewPoint></PerspectiveCamera></VisualizationInfo>",
            b"\xef\xbb\xbf<",
            b"<a>" * 50,
        ]
    ),
)


@st.composite
def _mutated_zip(draw, seeds: dict[str, bytes]) -> bytes:
    data = seeds[draw(st.sampled_from(sorted(seeds)))]
    kind = draw(st.sampled_from(["flip", "drop", "add", "replace", "truncate"]))
    if kind == "flip":
        raw = bytearray(data)
        for at in draw(st.lists(st.integers(0, len(raw) - 1), min_size=1, max_size=8)):
            raw[at] ^= draw(st.integers(1, 255))
        return bytes(raw)
    if kind == "truncate":
        return data[: draw(st.integers(0, len(data) - 1))]
    members = _members(data)
    names = [n for n, _ in members]
    if kind == "drop":
        gone = set(draw(st.lists(st.sampled_from(names), min_size=1, max_size=4)))
        return _zip([(n, b) for n, b in members if n not in gone])
    if kind == "add":
        extra = draw(
            st.lists(
                st.tuples(st.one_of(st.sampled_from(_ODD_NAMES), _names), _XMLISH),
                min_size=1,
                max_size=3,
            )
        )
        return _zip([*members, *extra])
    xml = [n for n in names if n.endswith((".bcf", ".bcfv", ".version", ".bcfp"))]
    hit = set(draw(st.lists(st.sampled_from(xml), min_size=1, max_size=3)))
    return _zip([(n, draw(_XMLISH) if n in hit else b) for n, b in members])


def _read_only_bcf_error(path: Path) -> None:
    try:
        topics = read_topics(path)
    except BcfError as exc:
        text = str(exc)
        assert "\n" not in text, text
        assert str(path) in text, text
    else:
        assert all(t.guid for t in topics.topics)


@FUZZ
@given(data=st.data())
def test_bcf_mutated_zips(bcf_seeds, fuzz_dir, data):
    zipped = data.draw(_mutated_zip(bcf_seeds))
    path = fuzz_dir / "findings.bcf"
    path.write_bytes(zipped)
    _read_only_bcf_error(path)


@FUZZ
@given(
    raw=st.one_of(
        st.binary(max_size=400),
        st.builds(lambda m: _zip(m), st.lists(st.tuples(_names, _XMLISH), max_size=4)),
    )
)
def test_bcf_random_files(fuzz_dir, raw):
    path = fuzz_dir / "random.bcf"
    path.write_bytes(raw)
    _read_only_bcf_error(path)


def test_corrupt_deflate_stream_is_a_bcf_error(bcf_seeds, fuzz_dir):
    members = _members(bcf_seeds["2.1"])
    raw = bytearray(_zip(members))
    with zipfile.ZipFile(io.BytesIO(bytes(raw))) as z:
        info = max(z.infolist(), key=lambda i: i.compress_size)  # the snapshot PNG
    start = info.header_offset + 30 + len(info.filename.encode()) + len(info.extra)
    for at in range(start, start + 16):
        raw[at] ^= 0xFF  # damage the deflate block header; the CRC is never reached
    path = fuzz_dir / "corrupt.bcf"
    path.write_bytes(bytes(raw))
    with pytest.raises(BcfError, match="cannot be read"):
        read_topics(path)
