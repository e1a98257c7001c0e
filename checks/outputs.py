"""Every output file of ``shearline check``, written from one :class:`CheckRun`.

``results.json`` (SI), ``walls.csv`` / ``lines.csv`` (display units), ``findings.json``
(BCF REST API field names), ``findings.bcf`` (BCF-XML), ``report.html``, and with
``annotate`` a copy of the IFC with our property sets.
"""

from __future__ import annotations

import contextlib
import os
from pathlib import Path

from checks.errors import OutputError
from checks.project import DisplayUnits

__all__ = ["annotation_values", "write_all"]

# Fewer piers than this: write the report and findings in this process (a fork costs ~10 ms and
# the small report takes less).
_PARALLEL_PIERS = 500


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
        entry = walls.setdefault(
            p.guid,
            {
                "FlexibleShear_N": 0.0,
                "RigidShear_N": 0.0,
                "EnvelopeShear_N": 0.0,
                "GoverningCase": "",
                "Line": p.line,
                "Level": p.level,
                "Assembly": p.assembly,
                "Piers": 0,
            },
        )
        entry["Piers"] += 1
        if env is not None:
            entry["FlexibleShear_N"] = max(entry["FlexibleShear_N"], env.flexible)
            entry["RigidShear_N"] = max(entry["RigidShear_N"], env.rigid)
            if env.envelope >= entry["EnvelopeShear_N"]:
                entry["EnvelopeShear_N"] = env.envelope
                entry["GoverningCase"] = (
                    f"{env.governing_method.value} {env.governing_case}"
                )
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


def _report_beside(run, path: Path, *, system: DisplayUnits, parallel: bool):
    """Start writing ``report.html`` in a worker process (see :mod:`ifc_bridge.worker`).

    The worker writes a ``.part`` file beside ``path``; :func:`_report_done` renames it
    once complete, so a failed run never leaves half a report. Without a worker the
    report is written here when its result is asked for.
    """
    from ifc_bridge.worker import start_call

    part = path.with_name(path.name + ".part")
    return part, start_call(
        "report", _write_report, part, run, system, parallel=parallel
    )


def _write_report(path: Path, run, system: DisplayUnits) -> Path:
    from checks.report.html_report import write_report

    return write_report(path, run, system=system)


def _write_rest(
    run,
    out: Path,
    previous: str | os.PathLike | None,
    version: str,
    system: DisplayUnits,
) -> dict[str, Path]:
    """results.json, walls.csv, lines.csv, findings.json and findings.bcf."""
    from checks.report.csv_tables import write_lines_csv, write_walls_csv
    from checks.report.findings_out import write_findings
    from checks.report.results_json import write_results_json

    checks = getattr(run.checks, "pier_checks", {})
    written = {
        "results": write_results_json(
            out / "results.json",
            run.allocation,
            source=str(run.model.source),
            pier_checks=checks,
        ),
        "walls": write_walls_csv(
            out / "walls.csv", run.allocation, pier_checks=checks, system=system
        ),
        "lines": write_lines_csv(out / "lines.csv", run.allocation, system=system),
    }
    written.update(write_findings(run, out, previous=previous, version=version))
    return written


def _report_done(pending, part: Path, path: Path) -> Path:
    """Wait for the report (written here if the worker failed); move it in place."""
    pending.result()
    os.replace(part, path)
    return path


def write_all(
    run,
    out: Path,
    *,
    previous: str | os.PathLike | None,
    annotate: bool,
    bcf_version: str,
    system: DisplayUnits,
    parallel: bool | None = None,
) -> dict[str, Path]:
    """Write every output into ``out``; returns kind -> path.

    ``report.html``, the largest, is written in a forked worker, and the other files
    in a second one, behind it, on POSIX with two or more cores and a large enough
    model (``parallel`` forces or forbids it); this process only waits, so the two
    have the cores to themselves and no page of it is copied for its own writes. The
    files are the same either way.

    Raises:
        OutputError: A file cannot be written.
    """
    from ifc_bridge.gc_pause import collection_paused
    from ifc_bridge.worker import can_fork, start_call

    written: dict[str, Path] = {}
    report = out / "report.html"
    if parallel is None:
        parallel = len(run.allocation.piers) >= _PARALLEL_PIERS and can_fork()
    with collection_paused():
        part, pending = _report_beside(run, report, system=system, parallel=parallel)
        # a failed worker is replaced by the same call here, which raises the error
        # the user sees
        rest = start_call(
            "tables and findings", _write_rest, run, out, previous, bcf_version,
            system, parallel=parallel, nice=10,
        )
        try:
            written.update(rest.result())
            written["report"] = _report_done(pending, part, report)
        except OSError as exc:
            msg = f"{out}: cannot write outputs: {exc}"
            raise OutputError(msg) from exc
        finally:
            rest.cancel()
            pending.cancel()
            with contextlib.suppress(OSError):
                part.unlink(missing_ok=True)
    if annotate:
        from ifc_bridge.write_ifc_copy import write_ifc_copy

        walls, storeys = annotation_values(run)
        src = Path(run.model.source)
        written["annotated_ifc"] = write_ifc_copy(
            src, out / f"{src.stem}.shearline.ifc", walls=walls, storeys=storeys
        )
    return written
