"""Read the project's TOML config into a ``ProjectConfig`` in SI.

The format is the one agreed for shearline: every dimensional value is a string with
its unit, parsed by pint (``checks.units``); dimensionless code coefficients are plain
numbers. Unknown keys, missing required keys, wrong types, wrong dimensions, NaN and
out-of-range values are refused with a one-line ``ConfigError``
``<file>: <table.key> = <value>: <what is expected>``; nothing else escapes. Storey
names in ``[seismic.level_forces]`` and ``[loads.extra]`` are kept as given: the
pipeline checks them against the model.
"""

from __future__ import annotations

import math
import tomllib
from collections.abc import Mapping
from os import PathLike
from pathlib import Path
from typing import Any

from allocation.errors import ParameterError
from allocation.parameters import (
    AnalysisOptions,
    DeadLoads,
    DiaphragmMethod,
    Procedure,
    SeismicParameters,
    WallStiffness,
)
from checks import _config_read as rd
from checks._config_assemblies import parse_assemblies
from checks.errors import ConfigError
from checks.project import DesignBasis, DisplayUnits, ProjectConfig

__all__ = ["config_from_dict", "config_from_toml", "ct_si_from_us", "load_config"]

_TABLES = (
    "project",
    "levels",
    "seismic",
    "loads",
    "analysis",
    "shear_walls",
    "bcf",
    "assemblies",
)
_SEISMIC = (
    "procedure",
    "SDS",
    "SD1",
    "S1",
    "TL",
    "R",
    "Ie",
    "Cd",
    "omega0",
    "Ct",
    "x",
    "period",
    "rho",
    "level_forces",
)
_ANALYSIS = (
    "diaphragm",
    "accidental_eccentricity",
    "wall_stiffness",
    "line_tolerance",
    "angle_tolerance",
    "design_basis",
    "amplify_torsion",
)
_BCF_VERSIONS = ("2.1", "3.0")
_FT = 0.3048  # m per ft, exact by definition


def ct_si_from_us(Ct_us: float, x: float) -> float:  # noqa: N803
    """Period coefficient Ct for hn in metres from the tabulated value for hn in feet.

    ASCE 7-16 Table 12.8-2: Ta = Ct·hn^x with hn in ft equals Ct_SI·hn^x with hn in m
    when Ct_SI = Ct_US·(1 ft / 0.3048 m)^x = Ct_US / 0.3048^x.

    Args:
        Ct_us: Ct of Table 12.8-2 for hn in feet [-].
        x: Exponent x of Table 12.8-2 [-].

    Returns:
        Ct for hn in metres [-].
    """
    return float(Ct_us) / _FT ** float(x)


def _project(data: Mapping[str, Any], where: rd.Where) -> dict[str, Any]:
    w = where.child("project")
    table = rd.check_keys(
        data["project"], w, ("name", "display_units", "author"), required=("name",)
    )
    return {
        "name": rd.string(table, "name", w),
        "display_units": rd.choice(
            table, "display_units", w, DisplayUnits, default=DisplayUnits.IMPERIAL
        ),
        "author": rd.string(table, "author", w, default="shearline@example.com"),
    }


def _seismic(data: Mapping[str, Any], where: rd.Where, base: str) -> SeismicParameters:
    w = where.child("seismic")
    table = rd.check_keys(data["seismic"], w, _SEISMIC)
    procedure = rd.choice(table, "procedure", w, Procedure, default=Procedure.ELF)
    elf = procedure is Procedure.ELF
    forces = rd.named_quantities(table, "level_forces", w, "N")
    if elf and forces is not None:
        msg = (
            f'{w.at("level_forces")}: only with procedure = "given"; remove it or '
            "change procedure"
        )
        raise ConfigError(msg)
    if not elf and not forces:
        msg = (
            f'{w.at("level_forces")}: procedure = "given" needs a force per storey, '
            'e.g. "Level 2" = "120 kN"'
        )
        raise ConfigError(msg)
    need = rd.MISSING
    values = {
        "SDS": rd.number(table, "SDS", w),
        "SD1": rd.number(table, "SD1", w, default=need if elf else 0.0),
        "S1": rd.number(table, "S1", w, default=need if elf else 0.0),
        "TL": rd.quantity(
            table, "TL", w, "s", default=need if elf else 8.0, strict=True
        ),
    }
    for key in ("R", "Ie", "Cd", "omega0"):
        values[key] = rd.number(table, key, w, strict=True)
    x = rd.number(table, "x", w, default=0.75, strict=True)  # ASCE 7-16 Table 12.8-2
    ct_us = rd.number(table, "Ct", w, default=0.02, strict=True)  # "all other" systems
    rho = rd.number(table, "rho", w, default=None, minimum=1.0)
    return SeismicParameters(
        procedure=procedure,
        Ct=ct_si_from_us(ct_us, x),
        x=x,
        period=rd.quantity(table, "period", w, "s", default=None, strict=True),
        rho=rho,
        level_forces=forces or (),
        base_level=base,
        **values,
    )


def _loads(data: Mapping[str, Any], where: rd.Where) -> DeadLoads:
    w = where.child("loads")
    table = rd.check_keys(
        data["loads"],
        w,
        ("floor", "roof", "wall", "extra"),
        required=("floor", "roof", "wall"),
    )
    return DeadLoads(
        floor=rd.quantity(table, "floor", w, "Pa"),
        roof=rd.quantity(table, "roof", w, "Pa"),
        wall=rd.quantity(table, "wall", w, "Pa"),
        extra=rd.named_quantities(table, "extra", w, "N") or (),
    )


def _analysis(data: Mapping[str, Any], where: rd.Where) -> dict[str, Any]:
    w = where.child("analysis")
    table = rd.check_keys(rd.sub_table(data, "analysis", where), w, _ANALYSIS)
    ecc = rd.number(table, "accidental_eccentricity", w, default=0.05)
    if ecc >= 0.5:
        err = w.error(
            "accidental_eccentricity",
            table["accidental_eccentricity"],
            "expected a fraction of the plan dimension in [0, 0.5), e.g. 0.05",
        )
        raise err
    angle = rd.quantity(
        table, "angle_tolerance", w, "rad", default=math.radians(10.0), strict=True
    )
    if angle >= math.pi / 4:
        err = w.error(
            "angle_tolerance", table["angle_tolerance"], "must be less than 45 deg"
        )
        raise err
    return {
        "diaphragm": rd.choice(
            table, "diaphragm", w, DiaphragmMethod, default=DiaphragmMethod.ENVELOPE
        ),
        "accidental_eccentricity": ecc,
        "wall_stiffness": rd.choice(
            table, "wall_stiffness", w, WallStiffness, default=WallStiffness.LENGTH
        ),
        "line_tolerance": rd.quantity(
            table, "line_tolerance", w, "m", default=0.5, strict=True
        ),
        "angle_tolerance": angle,
        "amplify_torsion": rd.boolean(table, "amplify_torsion", w, default=True),
        "design_basis": rd.choice(
            table, "design_basis", w, DesignBasis, default=DesignBasis.ASD
        ),
    }


def _small_tables(data: Mapping[str, Any], where: rd.Where) -> dict[str, Any]:
    levels_w = where.child("levels")
    levels = rd.check_keys(
        rd.sub_table(data, "levels", where), levels_w, ("base", "diaphragms")
    )
    walls_w = where.child("shear_walls")
    walls = rd.check_keys(
        rd.sub_table(data, "shear_walls", where), walls_w, ("predefined_type",)
    )
    bcf_w = where.child("bcf")
    bcf = rd.check_keys(rd.sub_table(data, "bcf", where), bcf_w, ("version",))
    version = bcf.get("version", "2.1")
    if version not in _BCF_VERSIONS:
        err = bcf_w.error("version", version, 'expected "2.1" or "3.0"')
        raise err
    return {
        "base": rd.string(levels, "base", levels_w, default=""),
        "diaphragm_levels": rd.string_list(levels, "diaphragms", levels_w),
        "use_predefined_type": rd.boolean(
            walls, "predefined_type", walls_w, default=True
        ),
        "bcf_version": version,
    }


def _build(data: Mapping[str, Any], path: str) -> ProjectConfig:
    where = rd.Where(path)
    rd.check_keys(data, where, _TABLES, required=("project", "seismic", "loads"))
    project = _project(data, where)
    small = _small_tables(data, where)
    analysis = _analysis(data, where)
    basis = analysis.pop("design_basis")
    assemblies = parse_assemblies(data.get("assemblies", []), where, basis)
    return ProjectConfig(
        path=path,
        **project,
        seismic=_seismic(data, where, small["base"]),
        loads=_loads(data, where),
        analysis=AnalysisOptions(
            **analysis,
            assemblies=tuple(a.properties for a in assemblies),
            diaphragm_levels=small["diaphragm_levels"],
        ),
        design_basis=basis,
        assemblies=assemblies,
        use_predefined_type=small["use_predefined_type"],
        bcf_version=small["bcf_version"],
    )


def config_from_dict(
    data: Mapping[str, Any], *, path: str | PathLike[str]
) -> ProjectConfig:
    """Build the project config from an already-parsed TOML document.

    Common practice: a config is validated completely before any analysis runs.

    Args:
        data: The document, as ``tomllib`` returns it.
        path: Name of the file it came from, for messages.

    Returns:
        The config in SI.

    Raises:
        ConfigError: Anything malformed; one line naming the file and key.
    """
    name = str(path)
    try:
        return _build(data, name)
    except ParameterError as exc:
        msg = f"{name}: {exc}"
        raise ConfigError(msg) from exc


def config_from_toml(text: str, *, path: str | PathLike[str]) -> ProjectConfig:
    """Parse TOML text into the project config (see ``config_from_dict``).

    Common practice: TOML 1.0 via ``tomllib``.

    Args:
        text: The TOML document.
        path: Name of the file it came from, for messages.

    Returns:
        The config in SI.

    Raises:
        ConfigError: Not TOML (the message names the line) or anything malformed.
    """
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        msg = f"{path}: not valid TOML: {exc}"
        raise ConfigError(msg) from exc
    return config_from_dict(data, path=path)


def load_config(path: str | PathLike[str]) -> ProjectConfig:
    """Read and validate the project's TOML config file.

    Common practice: one TOML file per project; every quantity carries its unit.

    Args:
        path: The config file.

    Returns:
        The config in SI.

    Raises:
        ConfigError: The file is missing or unreadable, not UTF-8 TOML, or anything in
            it is malformed; one line naming the file and key.
    """
    file = Path(path)
    try:
        raw = file.read_bytes()
    except FileNotFoundError as exc:
        msg = f"{path}: no such config file; write one with 'shearline init'"
        raise ConfigError(msg) from exc
    except OSError as exc:
        msg = f"{path}: cannot read the config file ({exc.strerror or exc})"
        raise ConfigError(msg) from exc
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        msg = f"{path}: not UTF-8 text (byte {exc.start}); save the file as UTF-8"
        raise ConfigError(msg) from exc
    return config_from_toml(text, path=path)
