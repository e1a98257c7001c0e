"""The ``[[assemblies]]`` of the TOML config: match rules, capacity, stiffness inputs.

Capacity comes one of these ways, and an assembly with none is an error: the user's
``unit_shear_capacity`` (it always wins); ``nominal_unit_shear`` vs; a starter-library
look-up by ``sheathing`` / ``fastener`` / ``edge_spacing`` (wood structural panels and
gypsum board); or, for concrete, ``fc`` / ``fy`` / ``rho_t`` (ACI 318-19 §18.10.4).
"""

from __future__ import annotations

import logging
from collections.abc import Mapping
from typing import Any

from allocation.parameters import AssemblyKind, AssemblyProperties
from checks import _config_read as rd
from checks.assembly_library import (
    allowable_unit_shear,
    concrete_moduli,
    find_entry,
)
from checks.errors import ConfigError
from checks.project import Assembly, ConcreteParams, DesignBasis
from ifc_bridge.shear_walls import MatchRule

__all__ = ["parse_assemblies"]

logger = logging.getLogger(__name__)

_COMMON = (
    "name",
    "kind",
    "match",
    "unit_shear_capacity",
    "wall_dead_load",
    "aspect_ratio_limit",
)
_LIBRARY = ("sheathing", "fastener", "edge_spacing")
_LIGHT_FRAME = (
    *_LIBRARY,
    "nominal_unit_shear",
    "blocked",
    "Ga",
    "chord_E",
    "chord_area",
    "hold_down_slip",
)
_CONCRETE = ("fc", "fy", "rho_t", "lambda")
_MODULI = ("E", "G")
_BY_KIND: dict[AssemblyKind, tuple[str, ...]] = {
    AssemblyKind.WOOD_PANEL: _LIGHT_FRAME,
    AssemblyKind.GYPSUM: _LIGHT_FRAME,
    AssemblyKind.CONCRETE: (*_CONCRETE, *_MODULI),
    AssemblyKind.MASONRY: _MODULI,
    AssemblyKind.OTHER: (*_MODULI, "Ga", "chord_E", "chord_area", "hold_down_slip"),
}
_ALL = tuple(dict.fromkeys((*_COMMON, *_LIGHT_FRAME, *_CONCRETE, *_MODULI)))
_WAYS = {
    AssemblyKind.WOOD_PANEL: "unit_shear_capacity, nominal_unit_shear, or "
    "sheathing/fastener/edge_spacing",
    AssemblyKind.GYPSUM: "unit_shear_capacity, nominal_unit_shear, or "
    "sheathing/fastener/edge_spacing",
    AssemblyKind.CONCRETE: "unit_shear_capacity, or fc, fy and rho_t",
}
_MATCH_KEYS = ("type_name", "material", "name", "property", "value")


def _match_rule(name: str, data: Mapping[str, Any], where: rd.Where) -> MatchRule:
    if "match" not in data:
        msg = (
            f'{where.at("match")}: missing; give e.g. match = {{ type_name = "SW-A*" }}'
        )
        raise ConfigError(msg)
    inner = where.child("match")
    table = rd.check_keys(data["match"], inner, _MATCH_KEYS)
    globs = {k: rd.string(table, k, inner, default=None) for k in _MATCH_KEYS}
    if globs["value"] is not None and globs["property"] is None:
        msg = (
            f'{inner.at("value")}: needs property = "Pset_Name.PropertyName" beside it'
        )
        raise ConfigError(msg)
    if all(globs[k] is None for k in ("type_name", "material", "name", "property")):
        msg = (
            f"{where.at('match')}: give at least one of type_name, material, name, "
            "property"
        )
        raise ConfigError(msg)
    return MatchRule(
        assembly=name,
        type_name=globs["type_name"],
        material=globs["material"],
        property_name=globs["property"],
        property_value=globs["value"],
        name=globs["name"],
    )


def _properties(
    name: str,
    kind: AssemblyKind,
    data: Mapping[str, Any],
    where: rd.Where,
    *,
    concrete: ConcreteParams | None,
    capacity: float | None,
) -> AssemblyProperties:
    """Allocation inputs; a hold-down slip is taken at the assembly's capacity."""

    def q(key: str, units: str, *, strict: bool = True) -> float | None:
        return rd.quantity(data, key, where, units, default=None, strict=strict)

    chord_e, chord_area = q("chord_E", "Pa"), q("chord_area", "m**2")
    if (chord_e is None) != (chord_area is None):
        missing = "chord_area" if chord_area is None else "chord_E"
        msg = f"{where.at(missing)}: missing; chord_E and chord_area go together"
        raise ConfigError(msg)
    e_mod, g_mod = q("E", "Pa"), q("G", "Pa")
    if concrete is not None and (e_mod is None or g_mod is None):
        # ACI 318-19 §19.2.2.1(b) and G = 0.4 Ec (common practice), from the library
        e_default, g_default = concrete_moduli(concrete.fc)
        e_mod = e_default if e_mod is None else e_mod
        g_mod = g_default if g_mod is None else g_mod
    slip = q("hold_down_slip", "m", strict=False)
    return AssemblyProperties(
        name=name,
        kind=kind,
        wall_dead_load=q("wall_dead_load", "Pa", strict=False),
        E=e_mod,
        G=g_mod,
        Ga=q("Ga", "N/m"),
        chord_EA=None if chord_e is None else chord_e * chord_area,
        hold_down_slip=slip,
        design_unit_shear=None if slip is None else capacity,
    )


def _concrete(data: Mapping[str, Any], where: rd.Where) -> ConcreteParams | None:
    given = [k for k in ("fc", "fy", "rho_t") if k in data]
    if not given and "lambda" not in data:
        return None
    for key in ("fc", "fy", "rho_t"):
        if key not in data:
            msg = f"{where.at(key)}: missing; fc, fy and rho_t go together"
            raise ConfigError(msg)
    rho_t = rd.number(data, "rho_t", where)
    if rho_t >= 0.1:
        err = where.error("rho_t", data["rho_t"], "expected a ratio such as 0.0025")
        raise err
    lam = rd.number(data, "lambda", where, default=1.0, strict=True)
    if lam > 1.0:
        err = where.error(
            "lambda", data["lambda"], "must be <= 1.0 (ACI 318-19 §19.2.4)"
        )
        raise err
    return ConcreteParams(
        fc=rd.quantity(data, "fc", where, "Pa", strict=True),
        fy=rd.quantity(data, "fy", where, "Pa", strict=True),
        rho_t=rho_t,
        lambda_=lam,
    )


def _capacity(
    name: str,
    kind: AssemblyKind,
    data: Mapping[str, Any],
    where: rd.Where,
    basis: DesignBasis,
) -> tuple[float | None, float | None, str]:
    """(unit_shear_capacity, nominal_unit_shear, capacity_source)."""
    library = [k for k in _LIBRARY if k in data]
    if library and len(library) < len(_LIBRARY):
        missing = next(k for k in _LIBRARY if k not in data)
        msg = (
            f"{where.at(missing)}: missing; sheathing, fastener and edge_spacing "
            "go together"
        )
        raise ConfigError(msg)
    if library and "nominal_unit_shear" in data:
        msg = (
            f"{where.at('nominal_unit_shear')}: give either nominal_unit_shear or "
            "sheathing/fastener/edge_spacing, not both"
        )
        raise ConfigError(msg)
    nominal, source = None, ""
    if "nominal_unit_shear" in data:
        nominal = rd.quantity(data, "nominal_unit_shear", where, "N/m", strict=True)
        source = "nominal_unit_shear (user), SDPWS 2015 §4.3.3"
    elif library:
        spacing = rd.quantity(data, "edge_spacing", where, "m", strict=True)
        blocked = rd.boolean(data, "blocked", where, default=True)
        try:
            entry = find_entry(
                rd.string(data, "sheathing", where),
                rd.string(data, "fastener", where),
                spacing,
                blocked=blocked,
                kind=kind,
            )
        except ConfigError as exc:
            msg = f"{where.file}: {where.table} ({name}): {exc}"
            raise ConfigError(msg) from exc
        nominal, source = entry.nominal_unit_shear, entry.label
    if "unit_shear_capacity" in data:
        user = rd.quantity(data, "unit_shear_capacity", where, "N/m", strict=True)
        if nominal is not None:
            logger.info("%s: unit_shear_capacity wins over %s", where.table, source)
        return user, nominal, "user"
    if nominal is not None:
        return allowable_unit_shear(nominal, basis), nominal, source
    return None, None, ""


def _check_kind_keys(
    kind: AssemblyKind, data: Mapping[str, Any], where: rd.Where
) -> None:
    allowed = (*_COMMON, *_BY_KIND[kind])
    for key in data:
        if key not in allowed:
            msg = (
                f"{where.at(key)}: does not apply to kind = {kind.value!r}; keys for "
                f"this kind: {', '.join(allowed)}"
            )
            raise ConfigError(msg)


def _assembly(data: object, where: rd.Where, basis: DesignBasis) -> Assembly:
    table = rd.check_keys(data, where, _ALL, required=("name", "kind"))
    name = rd.string(table, "name", where).strip()
    kind = rd.choice(table, "kind", where, AssemblyKind, default=rd.MISSING)
    _check_kind_keys(kind, table, where)
    match = _match_rule(name, table, where)
    concrete = _concrete(table, where) if kind is AssemblyKind.CONCRETE else None
    capacity, nominal, source = _capacity(name, kind, table, where, basis)
    if capacity is None and concrete is None:
        msg = (
            f"{where.file}: {where.table}: assembly {name!r} has no capacity: "
            f"give {_WAYS.get(kind, 'unit_shear_capacity')}"
        )
        raise ConfigError(msg)
    if concrete is not None and source != "user":
        source = "ACI 318-19 §18.10.4"
    return Assembly(
        name=name,
        kind=kind,
        match=match,
        properties=_properties(
            name, kind, table, where, concrete=concrete, capacity=capacity
        ),
        unit_shear_capacity=capacity,
        nominal_unit_shear=nominal,
        capacity_source=source,
        concrete=concrete,
        blocked=rd.boolean(table, "blocked", where, default=True),
        aspect_ratio_limit=rd.number(
            table, "aspect_ratio_limit", where, default=None, strict=True
        ),
    )


def parse_assemblies(
    value: object, where: rd.Where, basis: DesignBasis
) -> tuple[Assembly, ...]:
    """Parse the ``[[assemblies]]`` array of tables, in config order.

    Args:
        value: The ``assemblies`` value from the TOML document.
        where: The file (top-level ``Where``).
        basis: Design basis, to resolve nominal unit shears (SDPWS 2015 §4.3.3).

    Returns:
        The assemblies, names unique (case-insensitively).

    Raises:
        ConfigError: Any malformed entry; the message names the file and key.
    """
    if not isinstance(value, list):
        err = where.error("assemblies", value, "expected [[assemblies]] tables")
        raise err
    out: list[Assembly] = []
    seen: dict[str, int] = {}
    for i, data in enumerate(value):
        item = rd.Where(where.file, f"assemblies[{i}]")
        assembly = _assembly(data, item, basis)
        folded = assembly.name.casefold()
        if folded in seen:
            msg = (
                f"{item.at('name')} = {assembly.name!r}: duplicate; "
                f"assemblies[{seen[folded]}] has the same name"
            )
            raise ConfigError(msg)
        seen[folded] = i
        out.append(assembly)
    return tuple(out)
