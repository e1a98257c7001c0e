"""Every output file of ``shearline check``, written from one :class:`CheckRun`.

``results.json`` (SI), ``walls.csv`` / ``lines.csv`` (display units), ``findings.json``
(BCF REST API field names), ``findings.bcf`` (BCF-XML), ``report.html``, and with
``annotate`` a copy of the IFC with our property sets.
"""

from __future__ import annotations

import os
from pathlib import Path

from checks.errors import OutputError
from checks.project import DisplayUnits

__all__ = ["annotation_values", "write_all"]


def annotation_values(run) -> tuple[dict[str, dict], dict[str, dict]]:
    """Per-wall and per-storey property values for the annotated IFC copy (SI).

    Args:
        run: A :class:`checks.pipeline.CheckRun`.

    Returns:
        ``(walls, storeys)``: GlobalId -> property name -> value.
    """
    alloc = run.allocation
    checks = getattr(run.checks, "pier_checks", {})
    walls: dict[str, dict] = {}
    for p in alloc.piers:
        env = alloc.envelope.get(p.id)
        c = checks.get(p.id)
        entry = walls.setdefault(p.guid, {
            "FlexibleShear_N": 0.0, "RigidShear_N": 0.0, "EnvelopeShear_N": 0.0,
            "GoverningCase": "", "Line": p.line, "Level": p.level,
            "Assembly": p.assembly, "Piers": 0,
        })
        entry["Piers"] += 1
        if env is not None:
            entry["FlexibleShear_N"] = max(entry["FlexibleShear_N"], env.flexible)
            entry["RigidShear_N"] = max(entry["RigidShear_N"], env.rigid)
            if env.envelope >= entry["EnvelopeShear_N"]:
                entry["EnvelopeShear_N"] = env.envelope
                entry["GoverningCase"] = f"{env.governing_method.value} {env.governing_case}"
        dcr = getattr(c, "dcr", None)
        if dcr is not None and dcr >= entry.get("MaxDCR", -1.0):
            entry["MaxDCR"] = dcr
            entry["UnitShearCapacity_N_per_m"] = getattr(c, "capacity", None)
            entry["UnitShear_N_per_m"] = getattr(c, "unit_shear", None)
    storeys = {
        lv.guid: {
            "SeismicWeight_N": lv.seismic_weight,
            "StoryForce_N": lv.story_force,
            "StoryShear_N": lv.story_shear,
            "DiaphragmForce_N": lv.diaphragm_force,
        }
        for lv in alloc.levels
    }
    return walls, storeys


def write_all(
    run,
    out: Path,
    *,
    previous: str | os.PathLike | None,
    annotate: bool,
    bcf_version: str,
    system: DisplayUnits,
) -> dict[str, Path]:
    """Write every output into ``out``; returns kind -> path.

    Raises:
        OutputError: A file cannot be written.
    """
    from checks.report.csv_tables import write_lines_csv, write_walls_csv
    from checks.report.findings_out import write_findings
    from checks.report.html_report import write_report
    from checks.report.results_json import write_results_json

    checks = getattr(run.checks, "pier_checks", {})
    written: dict[str, Path] = {}
    try:
        written["results"] = write_results_json(
            out / "results.json", run.allocation, source=str(run.model.source),
            pier_checks=checks,
        )
        written["walls"] = write_walls_csv(out / "walls.csv", run.allocation,
                                           pier_checks=checks, system=system)
        written["lines"] = write_lines_csv(out / "lines.csv", run.allocation, system=system)
        written.update(write_findings(run, out, previous=previous, version=bcf_version))
        written["report"] = write_report(out / "report.html", run, system=system)
    except OSError as exc:
        msg = f"{out}: cannot write outputs: {exc}"
        raise OutputError(msg) from exc
    if annotate:
        from ifc_bridge.write_ifc_copy import write_ifc_copy

        walls, storeys = annotation_values(run)
        src = Path(run.model.source)
        written["annotated_ifc"] = write_ifc_copy(
            src, out / f"{src.stem}.shearline.ifc", walls=walls, storeys=storeys
        )
    return written
