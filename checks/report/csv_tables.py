"""``walls.csv`` and ``lines.csv`` for spreadsheets, in display units.

Each column that carries a quantity names its unit in the header
(``envelope_force_kip``), so a spreadsheet never has to guess.
"""

from __future__ import annotations

import csv
from collections.abc import Callable, Mapping
from pathlib import Path
from typing import Any

from allocation.results import Allocation
from checks.project import DisplayUnits
from checks.units import to_display

__all__ = ["write_lines_csv", "write_walls_csv"]


def _unit_label(quantity: str, system: DisplayUnits) -> str:
    _, unit = to_display(1.0, quantity, system)
    return unit.replace("²", "2").replace("·", "").replace("/", "_per_")


def _shown(quantity: str, system: DisplayUnits) -> Callable[[float | None], str]:
    """SI value -> its text in display units (six significant figures), or ``""``.

    The display factor is looked up once per column (``to_display`` is linear), and
    the text of each value is formatted once: lengths and capacities repeat from wall
    to wall. Zeros (``-0`` and ``0`` are equal keys) and NaN are not remembered.
    """
    factor, _ = to_display(1.0, quantity, system)
    memo: dict[float, str] = {}

    def shown(value: float | None) -> str:
        if value is None:
            return ""
        text = memo.get(value)
        if text is None:
            text = f"{float(value) * factor:.6g}"
            if value and value == value:
                memo[value] = text
        return text

    return shown


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
    length, force = _shown("length", system), _shown("force", system)
    per_length = _shown("force_per_length", system)
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
                    length(p.length),
                    length(p.height),
                    force(env.flexible if env else None),
                    force(env.rigid if env else None),
                    force(env.envelope if env else None),
                    env.governing_method.value if env else "",
                    env.governing_case if env else "",
                    per_length(getattr(c, "unit_shear", None)),
                    per_length(getattr(c, "capacity", None)),
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
    length, force = _shown("length", system), _shown("force", system)
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
                    length(ln.offset),
                    length(ln.wall_length),
                    length(ln.collector_length),
                    force(forces.get("flexible")),
                    force(forces.get("rigid")),
                    force(forces.get("envelope")),
                    len(ln.piers),
                ]
            )
    return path
