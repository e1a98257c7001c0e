"""``results.json``: levels, lines and wall piers with their forces, in SI.

The layout is the one of DESIGN.md "Results file" (schema ``shearline.results/1``);
fields beyond it are additions other tools may ignore. Units: N, m, N/m, throughout.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from pathlib import Path
from typing import Any

from allocation.results import Allocation, Pier
from checks.report._json_text import dumps_indented

__all__ = ["CAUTION", "results_document", "write_results_json"]

CAUTION = (
    "An aid to a licensed engineer, who remains responsible for the design. Local codes "
    "and the authority having jurisdiction govern. Verify the input assumptions "
    "(seismic weight, wall assemblies, diaphragm classification)."
)


def _num(value: float | None) -> float | None:
    if value is None or not math.isfinite(value):
        return None
    return float(value)


def _wall_entry(pier: Pier, allocation: Allocation, checks: Mapping[str, Any]) -> dict:
    env = allocation.envelope.get(pier.id)
    check = checks.get(pier.id)
    force = {
        "flexible": _num(env.flexible) if env else 0.0,
        "rigid": _num(env.rigid) if env else 0.0,
        "envelope": _num(env.envelope) if env else 0.0,
    }
    return {
        "guid": pier.guid,
        "name": pier.name,
        "pier": pier.pier,
        "part": pier.part,
        "level": pier.level,
        "storey": pier.storey,
        "direction": pier.direction.value if pier.direction else None,
        "line": pier.line,
        "assembly": pier.assembly,
        "length": pier.length,
        "height": pier.height,
        "start": list(pier.start),
        "end": list(pier.end),
        "force": force,
        "governing_method": env.governing_method.value if env else None,
        "governing_case": env.governing_case if env else None,
        "unit_shear": _num(getattr(check, "unit_shear", None)),
        "capacity": _num(getattr(check, "capacity", None)),
        "dcr": _num(getattr(check, "dcr", None)),
        "hold_down_tension": _num(getattr(check, "hold_down_tension", None)),
    }


def results_document(
    allocation: Allocation,
    *,
    source: str,
    pier_checks: Mapping[str, Any] | None = None,
) -> dict:
    """The results as a JSON-ready dict.

    Args:
        allocation: Forces from :func:`allocation.allocate.allocate`.
        source: Path of the IFC file checked.
        pier_checks: Per pier id, an object with ``unit_shear`` [N/m], ``capacity``
            [N/m], ``dcr`` [-] (and optionally ``hold_down_tension`` [N]).

    Returns:
        The document, SI units.
    """
    checks = pier_checks or {}
    s = allocation.seismic
    return {
        "schema": "shearline.results/1",
        "units": {"force": "N", "length": "m", "unit_shear": "N/m", "weight": "N"},
        "source": source,
        "caution": CAUTION,
        "seismic": {
            "procedure": s.procedure,
            "hn": s.hn,
            "Ta": s.Ta,
            "T": s.T,
            "Cu": s.Cu,
            "Cs": s.Cs,
            "Cs_governs": s.Cs_governs,
            "k": s.k,
            "W": s.W,
            "V": s.V,
        },
        "levels": [
            {
                "name": lv.level,
                "guid": lv.guid,
                "elevation": lv.elevation,
                "height": lv.height,
                "seismic_weight": lv.seismic_weight,
                "story_force": lv.story_force,
                "story_shear": lv.story_shear,
                "diaphragm_force": lv.diaphragm_force,
                "Cvx": lv.Cvx,
                "weight_breakdown": [
                    {
                        "source": it.source,
                        "quantity": it.quantity,
                        "unit_load": it.unit_load,
                        "weight": it.weight,
                    }
                    for it in lv.breakdown
                ],
            }
            for lv in allocation.levels
        ],
        "lines": [
            {
                "id": ln.id,
                "level": ln.level,
                "direction": ln.direction.value,
                "offset": ln.offset,
                "wall_length": ln.wall_length,
                "collector_length": ln.collector_length,
                "crossings": [{"diaphragm": d, "length": c} for d, c in ln.crossings],
                "force": {
                    k: _num(v)
                    for k, v in allocation.line_envelope.get(
                        ln.id, {"flexible": 0.0, "rigid": 0.0, "envelope": 0.0}
                    ).items()
                },
            }
            for ln in allocation.lines
        ],
        "walls": [_wall_entry(p, allocation, checks) for p in allocation.piers],
    }


def write_results_json(
    path: str | Path,
    allocation: Allocation,
    *,
    source: str,
    pier_checks: Mapping[str, Any] | None = None,
) -> Path:
    """Write ``results.json``; returns the path written."""
    path = Path(path)
    doc = results_document(allocation, source=source, pier_checks=pier_checks)
    path.write_text(dumps_indented(doc) + "\n", encoding="utf-8")
    return path
