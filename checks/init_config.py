"""The starter project config that ``shearline init`` writes from a model.

The text is TOML in the agreed format, commented for a first-time user: the model's
storeys and wall types are listed, and there is one commented-out ``[[assemblies]]``
block per wall type whose PredefinedType is SHEAR, with its capacity left as a
placeholder the user must fill. As written, the file loads with ``load_config`` (no
assembly is active), so ``shearline check`` runs and reports every shear wall as
having no capacity until the blocks are completed.
"""

from __future__ import annotations

from collections.abc import Sequence

from checks.assembly_library import concrete_defaults
from checks.units import Q_

__all__ = ["UNTYPED", "starter_config", "toml_string"]

UNTYPED = "(no type)"  # how the CLI names walls without an IfcWallType
_PLACEHOLDER = "___ plf"


def toml_string(text: str) -> str:
    """A TOML basic string (with quotes) holding ``text`` exactly.

    Common practice: TOML 1.0 basic strings escape ``"``, ``\\`` and control
    characters.

    Args:
        text: Any text.

    Returns:
        The quoted, escaped string.
    """
    out = []
    for ch in text:
        if ch in ('"', "\\"):
            out.append("\\" + ch)
        elif ord(ch) < 0x20 or ord(ch) == 0x7F:
            out.append(f"\\u{ord(ch):04X}")
        else:
            out.append(ch)
    return '"' + "".join(out) + '"'


def _comment_text(text: str) -> str:
    """Text safe inside a TOML comment (no control characters, one line)."""
    return "".join(" " if ord(c) < 0x20 or ord(c) == 0x7F else c for c in text)


def _literal_glob(text: str) -> str:
    """A shell-style glob matching exactly ``text`` (``*``, ``?``, ``[`` escaped)."""
    return "".join(f"[{c}]" if c in "*?[" else c for c in text)


def _header(project_name: str, storeys: Sequence[str]) -> list[str]:
    listed = ", ".join(toml_string(_comment_text(s)) for s in storeys) or "(none found)"
    return [
        f"# shearline project configuration for {_comment_text(project_name)}",
        "# Written by 'shearline init'. Every quantity is a string with its unit",
        '# ("15 psf", "0.72 kPa", "260 plf"); unknown keys are errors.',
        "# CAUTION: the results are an aid to a licensed engineer, who remains",
        "# responsible; local codes and the authority having jurisdiction govern.",
        "# The seismic and load values below are EXAMPLES: replace them with the",
        "# project's own before relying on any result.",
        "",
        "[project]",
        f"name = {toml_string(project_name)}",
        'display_units = "imperial"            # "imperial" or "si"',
        '#author = "engineer@example.com"      # author of BCF topics',
        "",
        f"# Storeys in the model: {listed}",
        "#[levels]",
        '#base = "Level 1"                 # seismic base; default: lowest storey',
        '#diaphragms = ["Level 2", "Roof"]  # default: storeys above base with slabs',
        "",
        "[seismic]",
        'procedure = "elf"        # "elf" (ASCE 7-16 §12.8) or "given" (see below)',
        "SDS = 1.00               # EXAMPLE: design spectral acc., short period [g]",
        "SD1 = 0.60               # EXAMPLE: design spectral acceleration at 1 s [g]",
        "S1 = 0.62                # EXAMPLE: mapped MCE_R acceleration at 1 s [g]",
        'TL = "8 s"               # EXAMPLE: long-period transition period',
        "R = 6.5                  # EXAMPLE: ASCE 7-16 Table 12.2-1",
        "Ie = 1.0                 # ASCE 7-16 Table 1.5-2",
        "Cd = 4.0                 # EXAMPLE: ASCE 7-16 Table 12.2-1",
        "omega0 = 3.0             # EXAMPLE: ASCE 7-16 Table 12.2-1",
        "Ct = 0.02                # ASCE 7-16 Table 12.8-2, hn in ft (all other)",
        "x = 0.75                 # ASCE 7-16 Table 12.8-2",
        '#period = "0.35 s"       # computed period, capped at Cu*Ta',
        "#rho = 1.0               # redundancy; omit to let the checks evaluate it",
        '#[seismic.level_forces]  # only with procedure = "given": storey = force',
        '#"Level 2" = "120 kN"',
        "",
        "[loads]",
        'floor = "15 psf"         # EXAMPLE: floor dead load',
        'roof = "20 psf"          # EXAMPLE: roof dead load',
        'wall = "10 psf"          # EXAMPLE: wall dead load per wall elevation area',
        "#[loads.extra]           # extra seismic weight per storey",
        '#"Level 2" = "10 kip"',
        "",
        "[analysis]",
        'diaphragm = "envelope"         # "flexible", "rigid" or "envelope"',
        "accidental_eccentricity = 0.05  # ASCE 7-16 §12.8.4.2",
        'wall_stiffness = "length"      # "length" or "assembly"',
        'line_tolerance = "0.5 m"       # walls within this offset form one line',
        'angle_tolerance = "10 deg"     # walls within this angle of X or Y',
        'design_basis = "ASD"           # "ASD" or "LRFD"',
        "amplify_torsion = true         # Ax of ASCE 7-16 §12.8.4.3",
        "",
        "[shear_walls]",
        "predefined_type = true         # PredefinedType SHEAR marks a shear wall",
        "",
        "[bcf]",
        'version = "2.1"                # "2.1" or "3.0"',
        "",
    ]


def _instructions(wall_types: Sequence[tuple[str, int, bool]]) -> list[str]:
    c = concrete_defaults()
    fc = Q_(c.fc, "Pa").m_as("psi")
    fy = Q_(c.fy, "Pa").m_as("ksi")
    lines = ["# ---- Wall assemblies " + "-" * 58, "# Wall types in the model:"]
    for name, count, is_shear in wall_types:
        mark = ", PredefinedType SHEAR" if is_shear else ""
        lines.append(f"#   {_comment_text(toml_string(name))}: {count} walls{mark}")
    if not wall_types:
        lines.append("#   (none found)")
    lines += [
        "# Below is one commented-out [[assemblies]] block per SHEAR wall type. To use",
        "# one, remove the single '#' at the start of its lines and give its capacity",
        "# in ONE of these ways (an assembly without a capacity is an error):",
        '#   unit_shear_capacity = "260 plf"',
        "#       allowable (ASD) or design (LRFD) unit shear; it always wins",
        '#   sheathing = "15/32 Structural I"',
        '#   fastener = "10d common"',
        '#   edge_spacing = "6 in"',
        "#       starter library, SDPWS 2015 Table 4.3A (values from memory: verify)",
        '#   nominal_unit_shear = "680 plf"',
        "#       vs; ASD = vs/2.0, LRFD = 0.8 vs (SDPWS 2015 §4.3.3)",
        f'#   kind = "concrete" with fc = "{fc:g} psi", fy = "{fy:g} ksi", '
        f"rho_t = {c.rho_t:g} (ACI 318-19 §18.10.4)",
        "# To make walls of another type shear walls, add a block that matches them.",
        "# A SHEAR wall that no block matches is reported as having no capacity.",
    ]
    return lines


def _block(type_name: str, count: int, name: str) -> list[str]:
    untyped = type_name in ("", UNTYPED)
    if untyped:
        match = '#match = { name = "___" }  # no wall type: a glob on name or material'
    else:
        match = f"#match = {{ type_name = {toml_string(_literal_glob(type_name))} }}"
    return [
        "",
        f"# Wall type {_comment_text(toml_string(type_name))}: {count} walls, "
        "PredefinedType SHEAR",
        "#[[assemblies]]",
        f"#name = {toml_string(name)}",
        '#kind = "wood_structural_panel"   # or gypsum_board, concrete, masonry, other',
        match,
        f'#unit_shear_capacity = "{_PLACEHOLDER}"  # fill in, or another way above',
    ]


def starter_config(
    *,
    project_name: str,
    wall_types: Sequence[tuple[str, int, bool]],
    storeys: Sequence[str],
) -> str:
    """TOML text of a commented starter config for a model.

    Common practice: a first config lists what the model holds and leaves every
    capacity to the engineer.

    Args:
        project_name: Project name for ``[project] name``.
        wall_types: ``(type name, number of walls, PredefinedType is SHEAR)`` per wall
            type, in the order to list them.
        storeys: Storey names, bottom to top.

    Returns:
        The TOML text; it loads with ``checks.config.load_config`` as written.
    """
    lines = _header(
        project_name if project_name.strip() else "Untitled project", storeys
    )
    lines += _instructions(wall_types)
    used: set[str] = set()
    for type_name, count, is_shear in wall_types:
        if not is_shear:
            continue
        base = (
            "untyped" if type_name in ("", UNTYPED) else type_name.strip() or "untyped"
        )
        name, n = base, 1
        while name.casefold() in used:
            n += 1
            name = f"{base} ({n})"
        used.add(name.casefold())
        lines += _block(type_name, count, name)
    if not any(is_shear for *_, is_shear in wall_types):
        lines.append(
            "# No wall type has PredefinedType SHEAR: add blocks for the shear walls."
        )
    return "\n".join(lines) + "\n"
