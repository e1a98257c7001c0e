"""Tests of checks/init_config.py: the starter config of ``shearline init``.

The reference is the project's own config loader and the TOML 1.0 reader of the
standard library (``tomllib``): the starter must load as written, and its commented
assembly blocks must load once un-commented and given a capacity.
"""

from __future__ import annotations

import re
import tomllib

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checks.config import config_from_toml, load_config
from checks.errors import ConfigError
from checks.init_config import UNTYPED, starter_config, toml_string
from ifc_bridge.model import WallSegment

WALL_TYPES = [
    ("SW-A", 12, True),
    ("Partition 100", 40, False),
    ("SW-B*", 3, True),
    (UNTYPED, 2, True),
]
STOREYS = ["Level 1", "Level 2", "Roof"]
MARKER = "# ---- Wall assemblies"


def uncomment_blocks(text: str, capacity: str = "260 plf") -> str:
    """Un-comment every assembly block the way the instructions say, with a capacity."""
    head, tail = text[: text.index(MARKER)], text[text.index(MARKER) :]
    tail = re.sub(r"(?m)^#(?=[\[\w\"])", "", tail)
    return head + tail.replace("___ plf", capacity)


def wall(type_name: str, name: str = "W") -> WallSegment:
    return WallSegment(
        guid="0" * 22,
        name=name,
        storey="Level 1",
        level="Level 2",
        base_elevation=0.0,
        top_elevation=3.0,
        start=(0.0, 0.0),
        end=(4.0, 0.0),
        thickness=0.15,
        type_name=type_name,
    )


def test_starter_loads_as_written(tmp_path):
    file = tmp_path / "shearline.toml"
    file.write_text(
        starter_config(
            project_name="Juniper Court", wall_types=WALL_TYPES, storeys=STOREYS
        ),
        encoding="utf-8",
    )
    cfg = load_config(file)
    assert cfg.name == "Juniper Court"
    assert cfg.assemblies == ()  # every block is commented out: no capacity is assumed
    assert cfg.seismic.Ct == pytest.approx(0.0488, abs=5e-5)  # ASCE 7-16 Table 12.8-2


def test_starter_lists_types_and_storeys():
    text = starter_config(project_name="P", wall_types=WALL_TYPES, storeys=STOREYS)
    assert '# Storeys in the model: "Level 1", "Level 2", "Roof"' in text
    assert '#   "SW-A": 12 walls, PredefinedType SHEAR' in text
    assert '#   "Partition 100": 40 walls\n' in text
    assert text.count("#[[assemblies]]") == 3  # one per SHEAR type
    assert 'Partition 100" }' not in text  # no block for a non-SHEAR type


def test_uncommented_blocks_load_and_match_their_type():
    text = starter_config(project_name="P", wall_types=WALL_TYPES, storeys=STOREYS)
    cfg = config_from_toml(uncomment_blocks(text), path="starter.toml")
    assert [a.name for a in cfg.assemblies] == ["SW-A", "SW-B*", "untyped"]
    assert cfg.assemblies[0].match.matches(wall("SW-A"))
    assert not cfg.assemblies[0].match.matches(wall("SW-AB"))
    # a literal '*' in a type name is escaped so the rule matches that type only
    assert cfg.assemblies[1].match.matches(wall("SW-B*"))
    assert not cfg.assemblies[1].match.matches(wall("SW-B2"))
    # walls without a type get a placeholder rule that matches nothing until edited
    assert not cfg.assemblies[2].match.matches(wall("", name="Wall 1"))


def test_placeholder_capacity_must_be_filled():
    text = starter_config(project_name="P", wall_types=WALL_TYPES, storeys=STOREYS)
    with pytest.raises(ConfigError) as info:
        config_from_toml(
            uncomment_blocks(text, capacity="___ plf"), path="starter.toml"
        )
    assert "starter.toml: assemblies[0].unit_shear_capacity = '___ plf'" in str(
        info.value
    )


def test_no_shear_types():
    text = starter_config(
        project_name="P", wall_types=[("Partition", 4, False)], storeys=[]
    )
    assert "No wall type has PredefinedType SHEAR" in text
    assert config_from_toml(text, path="s.toml").assemblies == ()


def test_duplicate_type_names_get_distinct_assembly_names():
    types = [("SW", 1, True), ("sw", 2, True)]
    text = starter_config(project_name="P", wall_types=types, storeys=[])
    cfg = config_from_toml(uncomment_blocks(text), path="s.toml")
    assert [a.name for a in cfg.assemblies] == ["SW", "sw (2)"]


@pytest.mark.parametrize(
    "text", ['a"b', "back\\slash", "tab\there", "nl\nx", "del\x7f", "é ü"]
)
def test_toml_string_round_trips(text):  # TOML 1.0 basic strings, read by tomllib
    assert tomllib.loads(f"k = {toml_string(text)}")["k"] == text


names = st.text(min_size=1, max_size=20).filter(lambda s: s.strip() and s != UNTYPED)


@settings(max_examples=60, derandomize=True, deadline=None)
@given(
    project=st.text(max_size=30),
    types=st.lists(st.tuples(names, st.integers(0, 500), st.booleans()), max_size=4),
    storeys=st.lists(st.text(max_size=15), max_size=4),
)
def test_any_names_give_a_loadable_starter(project, types, storeys):
    text = starter_config(project_name=project, wall_types=types, storeys=storeys)
    cfg = config_from_toml(text, path="s.toml")
    assert cfg.name == (project if project.strip() else "Untitled project")
    filled = config_from_toml(uncomment_blocks(text), path="s.toml")
    shear = [t for t, _, is_shear in types if is_shear]
    assert len(filled.assemblies) == len(shear)
    for assembly, type_name in zip(filled.assemblies, shear, strict=True):
        assert assembly.match.matches(wall(type_name))  # exactly its own type
        assert not assembly.match.matches(wall(type_name + "x"))
