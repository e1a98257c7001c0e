"""``walls.csv`` and ``lines.csv`` for spreadsheets, in display units.

Each column that carries a quantity names its unit in the header
(``envelope_force_kip``), so a spreadsheet never has to guess.
"""

from __future__ import annotations

import csv
from collections.abc import Mapping
from pathlib import Path
from typing import Any

from allocation.results import Allocation
from checks.project import DisplayUnits
from checks.units import to_display

__all__ = ["write_lines_csv", "write_walls_csv"]


def _unit_label(quantity: str, system: DisplayUnits) -> str:
    _, unit = to_display(1.0, quantity, system)
    return unit.replace("²", "2").replace("·", "").replace("/", "_per_")


def _disp(value: float | None, quantity: str, system: DisplayUnits) -> str:
    if value is None:
        return ""
    v, _ = to_display(value, quantity, system)
    return f"{v:.6g}"


def write_walls_csv(
    path: str | Path,
    allocation: Allocation,
    *,
    pier_checks: Mapping[str, Any],
    system: DisplayUnits,
) -> Path:
    """Write ``walls.csv``: one row per pier, forces per method, unit shear, ratio.

    Common practice: quantities in the display units named in each header.

    Args:
        path: Output file.
        allocation: The forces [N, m].
        pier_checks: Per pier id, an object with ``unit_shear`` and ``capacity`` [N/m]
            and ``dcr`` [-].
        system: Display units of the values.

    Returns:
        The path written.
    """
    f_u, l_u = _unit_label("force", system), _unit_label("length", system)
    v_u = _unit_label("force_per_length", system)
    header = [
        "guid",
        "name",
        "level",
        "storey",
        "direction",
        "line",
        "pier",
        "assembly",
        f"length_{l_u}",
        f"height_{l_u}",
        f"flexible_force_{f_u}",
        f"rigid_force_{f_u}",
        f"envelope_force_{f_u}",
        "governing_method",
        "governing_case",
        f"unit_shear_{v_u}",
        f"capacity_{v_u}",
        "dcr",
    ]
    path = Path(path)
    with path.open("w", newline="", encoding="utf-8") as fh:
        w = csv.writer(fh)
        w.writerow(header)
        for p in allocation.piers:
            env = allocation.envelope.get(p.id)
            c = pier_checks.get(p.id)
            dcr = getattr(c, "dcr", None)
            w.writerow(
                [
                    p.guid,
                    p.name,
                    p.level,
                    p.storey,
                    p.direction.value if p.direction else "",
                    p.line,
                    p.pier,
                    p.assembly,
                    _disp(p.length, "length", system),
                    _disp(p.height, "length", system),
                    _disp(env.flexible if env else None, "force", system),
                    _disp(env.rigid if env else None, "force", system),
                    _disp(env.envelope if env else None, "force", system),
                    env.governing_method.value if env else "",
                    env.governing_case if env else "",
                    _disp(getattr(c, "unit_shear", None), "force_per_length", system),
                    _disp(getattr(c, "capacity", None), "force_per_length", system),
                    "" if dcr is None else f"{dcr:.4f}",
                ]
            )
    return path


def write_lines_csv(
    path: str | Path, allocation: Allocation, *, system: DisplayUnits
) -> Path:
    """Write ``lines.csv``: one row per line, offset, wall and collector length, forces.

    Common practice: quantities in the display units named in each header.

    Args:
        path: Output file.
        allocation: The forces [N, m].
        system: Display units of the values.

    Returns:
        The path written.
    """
    f_u, l_u = _unit_label("force", system), _unit_label("length", system)
    header = [
        "id",
        "level",
        "direction",
        f"offset_{l_u}",
        f"wall_length_{l_u}",
        f"collector_length_{l_u}",
        f"flexible_force_{f_u}",
        f"rigid_force_{f_u}",
        f"envelope_force_{f_u}",
        "piers",
    ]
    path = Path(path)
    with path.open("w", newline="", encoding="utf-8") as fh:
        w = csv.writer(fh)
        w.writerow(header)
        for ln in allocation.lines:
            forces = allocation.line_envelope.get(ln.id, {})
            w.writerow(
                [
                    ln.id,
                    ln.level,
                    ln.direction.value,
                    _disp(ln.offset, "length", system),
                    _disp(ln.wall_length, "length", system),
                    _disp(ln.collector_length, "length", system),
                    _disp(forces.get("flexible"), "force", system),
                    _disp(forces.get("rigid"), "force", system),
                    _disp(forces.get("envelope"), "force", system),
                    len(ln.piers),
                ]
            )
    return path
