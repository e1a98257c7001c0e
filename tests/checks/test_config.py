"""Tests of checks/config.py: the agreed TOML format, parsed into SI records.

Unit conversions are checked against the exact definitions of NIST SP 811 (2008),
Appendix B; the period coefficient against ASCE 7-16 Table 12.8-2; capacities against
AWC SDPWS 2015 Table 4.3A and §4.3.3 (from memory).
"""

from __future__ import annotations

import copy
import math
import tomllib

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from allocation.errors import ParameterError
from allocation.parameters import AssemblyKind, DiaphragmMethod, Procedure
from checks import config as config_module
from checks.config import config_from_dict, config_from_toml, ct_si_from_us, load_config
from checks.errors import ConfigError
from checks.project import DesignBasis, DisplayUnits

FT = 0.3048  # NIST SP 811 App. B, exact
IN = 0.0254  # NIST SP 811 App. B, exact
LBF = 4.4482216152605  # NIST SP 811 App. B, exact
PSF = LBF / FT**2
PLF = LBF / FT
PSI = LBF / IN**2

FULL = """
[project]
name = "Juniper Court"
display_units = "si"
author = "engineer@example.com"

[levels]
base = "Level 1"
diaphragms = ["Level 2", "Level 3", "Roof"]

[seismic]
procedure = "elf"
SDS = 1.00
SD1 = 0.60
S1  = 0.62
TL  = "8 s"
R   = 6.5
Ie  = 1.0
Cd  = 4.0
omega0 = 3.0
Ct = 0.02
x  = 0.75
period = "0.35 s"
rho = 1.0

[loads]
floor = "15 psf"
roof  = "0.96 kPa"
wall  = "10 psf"

[loads.extra]
"Level 2" = "10 kip"
"Level 9" = "5 kN"

[analysis]
diaphragm = "rigid"
accidental_eccentricity = 0.05
wall_stiffness = "assembly"
line_tolerance = "0.5 m"
angle_tolerance = "10 deg"
design_basis = "ASD"
amplify_torsion = false

[shear_walls]
predefined_type = false

[bcf]
version = "3.0"

[[assemblies]]
name = "WSP-6"
kind = "wood_structural_panel"
match = { type_name = "SW-A*" }
sheathing = "15/32 Structural I"
fastener = "10d common"
edge_spacing = "6 in"
wall_dead_load = "12 psf"
aspect_ratio_limit = 3.5
blocked = true
Ga = "20 kip/in"
chord_E = "1.6e6 psi"
chord_area = "8.25 in**2"
hold_down_slip = "0.15 in"

[[assemblies]]
name = "USER"
kind = "wood_structural_panel"
match = { material = "*plywood*", name = "SW*" }
unit_shear_capacity = "260 plf"

[[assemblies]]
name = "NOMINAL"
kind = "gypsum_board"
match = { property = "Pset_WallCommon.LoadBearing", value = "True" }
nominal_unit_shear = "200 plf"

[[assemblies]]
name = "CW-8"
kind = "concrete"
match = { type_name = "CW-8" }
fc = "4000 psi"
fy = "60 ksi"
rho_t = 0.0025
E = "3600 ksi"
"""

MINIMAL = {
    "project": {"name": "Demo"},
    "seismic": {
        "SDS": 1.0,
        "SD1": 0.6,
        "S1": 0.62,
        "TL": "8 s",
        "R": 6.5,
        "Ie": 1.0,
        "Cd": 4.0,
        "omega0": 3.0,
    },
    "loads": {"floor": "15 psf", "roof": "20 psf", "wall": "10 psf"},
    "assemblies": [
        {
            "name": "WSP-6",
            "kind": "wood_structural_panel",
            "match": {"type_name": "SW-A*"},
            "unit_shear_capacity": "260 plf",
        }
    ],
}


def with_change(path: tuple, value: object = None, *, delete: bool = False) -> dict:
    """A copy of MINIMAL with one value replaced (or deleted) at a key path."""
    data = copy.deepcopy(MINIMAL)
    node = data
    for key in path[:-1]:
        node = node[key]
    if delete:
        del node[path[-1]]
    else:
        node[path[-1]] = value
    return data


def error_of(data: dict, path: str = "demo.toml") -> str:
    with pytest.raises(ConfigError) as info:
        config_from_dict(data, path=path)
    message = str(info.value)
    assert message.startswith(f"{path}: ")
    assert "\n" not in message
    return message


@pytest.fixture
def full(tmp_path):
    file = tmp_path / "juniper.toml"
    file.write_text(FULL, encoding="utf-8")
    return load_config(file)


def test_full_example_loads(full):
    assert full.name == "Juniper Court"
    assert full.display_units is DisplayUnits.SI
    assert full.author == "engineer@example.com"
    assert full.design_basis is DesignBasis.ASD
    assert full.bcf_version == "3.0"
    assert full.use_predefined_type is False
    assert full.analysis.diaphragm is DiaphragmMethod.RIGID
    assert full.analysis.amplify_torsion is False
    assert full.analysis.diaphragm_levels == ("Level 2", "Level 3", "Roof")
    assert full.seismic.base_level == "Level 1"
    assert full.seismic.procedure is Procedure.ELF
    assert full.seismic.period == 0.35
    assert full.seismic.TL == 8.0


def test_full_example_quantities_in_si(full):
    assert full.loads.floor == pytest.approx(15 * PSF, rel=1e-12)  # NIST SP 811
    assert full.loads.roof == pytest.approx(960.0, rel=1e-12)  # SI prefix
    # storey names are kept as given, even one the model may lack (checked later)
    assert full.loads.extra == (
        ("Level 2", pytest.approx(10000 * LBF)),  # kip = 1000 lbf
        ("Level 9", pytest.approx(5000.0)),
    )
    assert full.analysis.line_tolerance == 0.5
    ten_degrees = math.radians(10)  # pi/180 rad per degree
    assert full.analysis.angle_tolerance == pytest.approx(ten_degrees)


def test_full_example_assemblies(full):
    names = [a.name for a in full.assemblies]
    assert names == ["WSP-6", "USER", "NOMINAL", "CW-8"]
    wsp = full.assembly("WSP-6")
    vs = 680 * PLF  # SDPWS 2015 Table 4.3A, from memory
    allowable = 340 * PLF  # SDPWS 2015 §4.3.3: vs / 2.0 (ASD), from memory
    assert wsp.nominal_unit_shear == pytest.approx(vs)
    assert wsp.unit_shear_capacity == pytest.approx(allowable)
    assert "SDPWS 2015 Table 4.3A" in wsp.capacity_source
    assert "from memory" in wsp.capacity_source
    props = wsp.properties
    assert props.wall_dead_load == pytest.approx(12 * PSF)  # NIST SP 811
    assert props.Ga == pytest.approx(20000 * LBF / IN)  # NIST SP 811
    assert props.chord_EA == pytest.approx(1.6e6 * PSI * 8.25 * IN**2)  # E·A
    assert props.hold_down_slip == pytest.approx(0.15 * IN)
    assert props.design_unit_shear == wsp.unit_shear_capacity  # slip at design level
    assert wsp.aspect_ratio_limit == 3.5
    assert wsp.match.type_name == "SW-A*"

    user = full.assembly("USER")
    assert user.unit_shear_capacity == pytest.approx(260 * PLF)  # user value wins
    assert user.capacity_source == "user"
    assert (user.match.material, user.match.name) == ("*plywood*", "SW*")

    gyp = full.assembly("NOMINAL")
    assert gyp.kind is AssemblyKind.GYPSUM
    allowable = 100 * PLF  # SDPWS 2015 §4.3.3: 200 / 2.0, from memory
    assert gyp.unit_shear_capacity == pytest.approx(allowable)
    assert gyp.match.property_name == "Pset_WallCommon.LoadBearing"
    assert gyp.match.property_value == "True"

    cw = full.assembly("CW-8")
    assert cw.unit_shear_capacity is None  # depends on the pier
    assert cw.capacity_source == "ACI 318-19 §18.10.4"
    assert cw.concrete.fc == pytest.approx(4000 * PSI)
    assert cw.concrete.lambda_ == 1.0
    assert pytest.approx(3600e3 * PSI) == cw.properties.E
    # G not given: 0.4 Ec (common practice), Ec = 57000 sqrt(f'c) psi
    # (ACI 318-19 §19.2.2.1(b), from memory)
    assert pytest.approx(0.4 * 57000 * math.sqrt(4000) * PSI) == cw.properties.G
    assert [p.name for p in full.analysis.assemblies] == names


def test_lrfd_resolves_nominal_with_phi():
    data = with_change(("analysis",), {"design_basis": "LRFD"})
    data["assemblies"][0] = {
        "name": "N",
        "kind": "wood_structural_panel",
        "match": {"type_name": "A"},
        "nominal_unit_shear": "680 plf",
    }
    cfg = config_from_dict(data, path="demo.toml")
    design = 544 * PLF  # SDPWS 2015 §4.3.3: 0.8 x 680, from memory
    assert cfg.assemblies[0].unit_shear_capacity == pytest.approx(design)


def test_minimal_config_defaults():
    cfg = config_from_dict(MINIMAL, path="demo.toml")
    assert cfg.display_units is DisplayUnits.IMPERIAL
    assert cfg.author == "shearline@example.com"
    assert cfg.design_basis is DesignBasis.ASD
    assert cfg.bcf_version == "2.1"
    assert cfg.seismic.rho is None
    assert cfg.seismic.x == 0.75  # ASCE 7-16 Table 12.8-2, all other systems
    ct_si = 0.0488  # ASCE 7-16 Table 12.8-2, SI form, all other systems
    assert cfg.seismic.Ct == pytest.approx(ct_si, abs=5e-5)
    assert cfg.analysis.diaphragm is DiaphragmMethod.ENVELOPE


@pytest.mark.parametrize(
    ("Ct_us", "x", "Ct_si"),
    [
        (0.028, 0.8, 0.0724),  # ASCE 7-16 Table 12.8-2 steel MF, from memory
        (0.016, 0.9, 0.0466),  # ASCE 7-16 Table 12.8-2 concrete MF, from memory
        (0.03, 0.75, 0.0731),  # ASCE 7-16 Table 12.8-2 EBF / BRBF, from memory
        (0.02, 0.75, 0.0488),  # ASCE 7-16 Table 12.8-2 all other (LIBRARY-NOTES §5.1)
    ],
)
def test_ct_us_to_si_matches_table_12_8_2(Ct_us, x, Ct_si):
    # the table prints Ct_SI to 3 significant figures: half a unit in the 4th decimal
    assert ct_si_from_us(Ct_us, x) == pytest.approx(Ct_si, abs=5e-5)


@pytest.mark.parametrize(("hn_ft", "Ta"), [(24, 0.22), (25, 0.22), (30, 0.25)])
def test_si_ct_gives_the_published_periods(hn_ft, Ta):
    # permit calculations quoted in LIBRARY-NOTES §5.1 (Everett, WA): Ta printed to 0.01
    data = with_change(("seismic", "Ct"), 0.02)
    cfg = config_from_dict(data, path="demo.toml")
    Ta_si = cfg.seismic.Ct * (hn_ft * FT) ** cfg.seismic.x  # ASCE 7-16 Eq. 12.8-7
    assert Ta_si == pytest.approx(0.02 * hn_ft**0.75, rel=1e-12)  # same in ft form
    assert Ta_si == pytest.approx(Ta, abs=0.01)


def test_given_procedure():
    data = with_change(("seismic", "procedure"), "given")
    data["seismic"]["level_forces"] = {"Level 2": "120 kN", "Roof": "30 kip"}
    for key in ("SD1", "S1", "TL"):
        del data["seismic"][key]
    cfg = config_from_dict(data, path="demo.toml")
    assert cfg.seismic.procedure is Procedure.GIVEN
    assert cfg.seismic.level_forces == (
        ("Level 2", pytest.approx(120e3)),
        ("Roof", pytest.approx(30000 * LBF)),  # kip = 1000 lbf
    )


# ---- bad input: every message names the file and the key ---------------------------


@pytest.mark.parametrize(
    ("data", "fragments"),
    [
        (  # an assembly without a capacity
            with_change(("assemblies", 0, "unit_shear_capacity"), delete=True),
            [
                "assemblies[0]",
                "assembly 'WSP-6' has no capacity: give unit_shear_capacity, "
                "nominal_unit_shear, or sheathing/fastener/edge_spacing",
            ],
        ),
        (  # a capacity in the wrong units
            with_change(("assemblies", 0, "unit_shear_capacity"), "260 psf"),
            [
                "assemblies[0].unit_shear_capacity = '260 psf'",
                "is a pressure, expected a "
                "force per length such as '260 plf' or '3.8 kN/m'",
            ],
        ),
        (  # a negative value
            with_change(("loads", "floor"), "-15 psf"),
            ["loads.floor = '-15 psf': must be >= 0"],
        ),
        (
            with_change(("assemblies", 0, "unit_shear_capacity"), "-260 plf"),
            ["assemblies[0].unit_shear_capacity = '-260 plf': must be > 0"],
        ),
        (with_change(("seismic", "R"), -6.5), ["seismic.R = -6.5: must be > 0"]),
        (  # a value without units
            with_change(("loads", "floor"), 15),
            ["loads.floor = 15: has no unit; write e.g. '15 psf'"],
        ),
        (with_change(("loads", "roof"), "20"), ["loads.roof = '20': has no unit"]),
        (  # unknown keys, at every level
            with_change(("seismic", "SDS1"), 1.0),
            ["seismic.SDS1: unknown key; allowed in [seismic]: procedure, SDS"],
        ),
        (
            with_change(("seizmic",), {}),
            ["seizmic: unknown key; allowed in the top level"],
        ),
        (
            with_change(("assemblies", 0, "capacity"), "260 plf"),
            ["assemblies[0].capacity: unknown key", "unit_shear_capacity"],
        ),
        (
            with_change(("assemblies", 0, "match", "typename"), "X"),
            ["assemblies[0].match.typename: unknown key", "type_name, material"],
        ),
        (  # unknown enum value
            with_change(("analysis",), {"diaphragm": "semi"}),
            [
                "analysis.diaphragm = 'semi': expected one of 'flexible', 'rigid', "
                "'envelope'"
            ],
        ),
        (
            with_change(("assemblies", 0, "kind"), "steel"),
            ["assemblies[0].kind = 'steel': expected one of 'wood_structural_panel'"],
        ),
        (with_change(("bcf",), {"version": "2.0"}), ["bcf.version = '2.0'"]),
        (  # NaN
            with_change(("loads", "wall"), "nan psf"),
            ["loads.wall = 'nan psf': not a finite number"],
        ),
        (
            with_change(("seismic", "SDS"), math.nan),
            ["seismic.SDS = nan: expected a finite"],
        ),
        (  # missing required keys
            with_change(("project", "name"), delete=True),
            ["project.name: missing; it is required in [project]"],
        ),
        (with_change(("seismic", "R"), delete=True), ["seismic.R: missing"]),
        (with_change(("loads",), delete=True), ["loads: missing; it is required"]),
        (with_change(("seismic", "TL"), delete=True), ["seismic.TL: missing"]),
        (  # type errors
            with_change(("seismic", "SDS"), "1.0"),
            ["seismic.SDS = '1.0': expected a plain number (no unit)"],
        ),
        (
            with_change(("seismic", "Ie"), True),
            ["seismic.Ie = True: expected a plain number"],
        ),
        (
            with_change(("project", "name"), 5),
            ["project.name = 5: expected a non-empty"],
        ),
        (with_change(("project",), "Demo"), ["project = 'Demo': expected a table"]),
        (
            with_change(("shear_walls",), {"predefined_type": "yes"}),
            ["shear_walls.predefined_type = 'yes': expected true or false"],
        ),
        (
            with_change(("levels",), {"diaphragms": "Level 2"}),
            ["levels.diaphragms = 'Level 2': expected a list of non-empty strings"],
        ),
        (
            with_change(("levels",), {"diaphragms": ["Roof", "Roof"]}),
            ["levels.diaphragms", "listed twice"],
        ),
        (with_change(("assemblies",), {"name": "x"}), ["assemblies = {'name': 'x'}"]),
        (
            with_change(("assemblies", 0), "WSP"),
            ["assemblies[0] = 'WSP': expected a table"],
        ),
        (  # ranges
            with_change(("analysis",), {"angle_tolerance": "50 deg"}),
            ["analysis.angle_tolerance = '50 deg': must be less than 45 deg"],
        ),
        (
            with_change(("analysis",), {"accidental_eccentricity": 0.5}),
            ["analysis.accidental_eccentricity = 0.5: expected a fraction"],
        ),
        (with_change(("seismic", "rho"), 0.9), ["seismic.rho = 0.9: must be >= 1"]),
        (
            with_change(("seismic", "level_forces"), {"Level 2": "10 kN"}),
            ['seismic.level_forces: only with procedure = "given"'],
        ),
        (
            with_change(("seismic", "procedure"), "given"),
            ['seismic.level_forces: procedure = "given" needs a force per storey'],
        ),
    ],
)
def test_bad_input_names_file_and_key(data, fragments):
    message = error_of(data)
    for fragment in fragments:
        assert fragment in message


def test_given_forces_must_be_forces():
    data = with_change(("seismic", "procedure"), "given")
    data["seismic"]["level_forces"] = {"Level 2": "120 kN/m"}
    message = error_of(data)
    assert (
        "seismic.level_forces.\"Level 2\" = '120 kN/m': that is a force per length"
        in message
    )


def test_duplicate_assembly_names():
    data = copy.deepcopy(MINIMAL)
    data["assemblies"].append({**data["assemblies"][0], "name": "wsp-6"})
    message = error_of(data)
    assert (
        "assemblies[1].name = 'wsp-6': duplicate; assemblies[0] has the same name"
        in message
    )


@pytest.mark.parametrize(
    ("changes", "fragment"),
    [
        (
            {"fastener": "10d common"},
            "assemblies[0].sheathing: missing; sheathing, fastener",
        ),
        (
            {
                "sheathing": "15/32 Structural I",
                "fastener": "10d common",
                "edge_spacing": "6 in",
                "nominal_unit_shear": "680 plf",
            },
            "give either nominal_unit_shear or sheathing/fastener/edge_spacing",
        ),
        (
            {
                "sheathing": "15/32 Structural I",
                "fastener": "16d box",
                "edge_spacing": "6 in",
            },
            "assemblies[0] (WSP-6): the starter library has no blocked "
            "'15/32 Structural I'",
        ),
        (
            {
                "sheathing": "15/32 Structural I",
                "fastener": "10d common",
                "edge_spacing": "6 psf",
            },
            "assemblies[0].edge_spacing = '6 psf': that is a pressure, expected a "
            "length",
        ),
        (
            {"fc": "4000 psi"},
            "assemblies[0].fc: does not apply to kind = 'wood_structural_panel'",
        ),
        (
            {"chord_E": "1.6e6 psi"},
            "assemblies[0].chord_area: missing; chord_E and chord_area",
        ),
        ({"match": {"value": "True"}}, "assemblies[0].match.value: needs property ="),
        (
            {"match": {}},
            "assemblies[0].match: give at least one of type_name, material",
        ),
        (
            {"match": {"type_name": ""}},
            "assemblies[0].match.type_name = '': expected a non-empty",
        ),
        ({"name": "  "}, "assemblies[0].name = '  ': expected a non-empty string"),
        ({"blocked": 1}, "assemblies[0].blocked = 1: expected true or false"),
    ],
)
def test_bad_assembly(changes, fragment):
    data = copy.deepcopy(MINIMAL)
    data["assemblies"][0].update(changes)
    if "sheathing" in changes or "fastener" in changes:
        del data["assemblies"][0]["unit_shear_capacity"]
    assert fragment in error_of(data)


@pytest.mark.parametrize(
    ("assembly", "fragment"),
    [
        (
            {"fc": "4000 psi", "rho_t": 0.0025},
            "assemblies[0].fy: missing; fc, fy and rho_t",
        ),
        (
            {},
            "assembly 'CW' has no capacity: give unit_shear_capacity, or fc, fy and "
            "rho_t",
        ),
        (
            {"fc": "4000 psi", "fy": "60 ksi", "rho_t": 0.25},
            "assemblies[0].rho_t = 0.25: expected a ratio such as 0.0025",
        ),
        (
            {"fc": "4000 psi", "fy": "60 ksi", "rho_t": 0.0025, "lambda": 1.2},
            "assemblies[0].lambda = 1.2: must be <= 1.0",
        ),
        ({"Ga": "20 kip/in"}, "assemblies[0].Ga: does not apply to kind = 'concrete'"),
    ],
)
def test_bad_concrete_assembly(assembly, fragment):
    data = copy.deepcopy(MINIMAL)
    data["assemblies"] = [
        {"name": "CW", "kind": "concrete", "match": {"type_name": "CW"}, **assembly}
    ]
    assert fragment in error_of(data)


def test_not_toml_names_the_line(tmp_path):
    file = tmp_path / "broken.toml"
    file.write_text('[project]\nname = "Demo"\n[seismic\nSDS = 1.0\n', encoding="utf-8")
    with pytest.raises(ConfigError) as info:
        load_config(file)
    message = str(info.value)
    assert message.startswith(f"{file}: not valid TOML")
    assert "line 3" in message


def test_missing_file(tmp_path):
    file = tmp_path / "nope.toml"
    with pytest.raises(ConfigError, match=r"nope\.toml: no such config file"):
        load_config(file)


def test_directory_instead_of_file(tmp_path):
    with pytest.raises(ConfigError, match="cannot read the config file"):
        load_config(tmp_path)


def test_not_utf8(tmp_path):
    file = tmp_path / "latin1.toml"
    file.write_bytes(b'[project]\nname = "Caf\xe9"\n')
    with pytest.raises(ConfigError, match="not UTF-8 text"):
        load_config(file)


def test_parameter_error_becomes_config_error(monkeypatch):
    # allocation records validate in __post_init__; their ParameterError gets the file
    def refuse(**_):
        msg = "seismic: something out of its domain"
        raise ParameterError(msg)

    monkeypatch.setattr(config_module, "SeismicParameters", refuse)
    message = error_of(MINIMAL)
    assert message == "demo.toml: seismic: something out of its domain"


# ---- fuzzing: only ConfigError ever comes out ---------------------------------------

scalars = st.one_of(
    st.text(max_size=12),
    st.sampled_from(
        [
            "260 plf",
            "15 psf",
            "nan psf",
            "8 s",
            "10 deg",
            "0.5 m",
            "elf",
            "given",
            "-1 kN",
            "1e400 N",
            "3 (m",
            "ASD",
            "wood_structural_panel",
        ]
    ),
    st.integers(-(10**20), 10**20),
    st.floats(allow_nan=True, allow_infinity=True),
    st.booleans(),
    st.dates(),
)
values = st.recursive(
    scalars,
    lambda inner: (
        st.lists(inner, max_size=3)
        | st.dictionaries(st.text(max_size=8), inner, max_size=3)
    ),
    max_leaves=8,
)


def outcome(data) -> str | None:
    """The ConfigError message of loading ``data``, or None when it loads."""
    try:
        config_from_dict(data, path="fuzz.toml")
    except ConfigError as exc:
        return str(exc)
    return None


def _paths(node, prefix=()):
    yield prefix
    if isinstance(node, dict):
        for k, v in node.items():
            yield from _paths(v, (*prefix, k))
    elif isinstance(node, list):
        for i, v in enumerate(node):
            yield from _paths(v, (*prefix, i))


ALL_PATHS = [p for p in _paths(tomllib.loads(FULL)) if p]


def _mutate(data, path, value, delete):
    node = data
    for key in path[:-1]:
        node = node[key]
    if delete:
        del node[path[-1]]
    else:
        node[path[-1]] = value


@settings(
    max_examples=150,
    derandomize=True,
    deadline=None,
    suppress_health_check=[HealthCheck.too_slow],
)
@given(
    changes=st.lists(
        st.tuples(st.sampled_from(ALL_PATHS), values, st.booleans()),
        min_size=1,
        max_size=3,
    )
)
def test_fuzz_mutated_config_gives_only_config_error(changes):
    data = tomllib.loads(FULL)
    for path, value, delete in changes:
        try:
            _mutate(data, path, value, delete)
        except (KeyError, IndexError, TypeError):
            continue  # an earlier change removed or replaced the parent
    message = outcome(data)
    assert message is None or message.startswith("fuzz.toml: ")
    assert message is None or "\n" not in message


@settings(max_examples=50, derandomize=True, deadline=None)
@given(
    data=st.dictionaries(
        st.sampled_from(
            [
                "project",
                "seismic",
                "loads",
                "analysis",
                "levels",
                "bcf",
                "assemblies",
                "x",
            ]
        ),
        values,
    )
)
def test_fuzz_random_tables_give_only_config_error(data):
    with pytest.raises(ConfigError):
        config_from_dict(data, path="fuzz.toml")


@settings(max_examples=150, derandomize=True, deadline=None)
@given(
    text=st.text(alphabet=st.sampled_from(list("[]=\"#.\n abc1-+:,{}'")), max_size=60)
)
def test_fuzz_toml_text_gives_only_config_error(text):
    with pytest.raises(ConfigError):
        config_from_toml(text, path="fuzz.toml")
