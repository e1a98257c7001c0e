"""The terminal writer behind the CLI: tables, progress, and the subcommands' flow.

The CLI parses arguments and catches errors; this module runs each command and renders
its result with rich (stdout), so the CLI stays thin. Values are shown in the display
units of the config or ``--units``; files stay SI.
"""

from __future__ import annotations

import json
import math
import os
from collections import Counter
from pathlib import Path

from rich.console import Console
from rich.progress import BarColumn, Progress, TextColumn, TimeElapsedColumn
from rich.table import Table

from checks.errors import ConfigError, OutputError
from checks.findings import Severity
from checks.report.results_json import CAUTION

__all__ = ["check", "init", "inspect", "requirements"]

# The last check's run, kept after :func:`check` returns: the command exits right
# after it without the interpreter's teardown (:func:`checks.cli.run`), and freeing
# a large run's model, results and open IFC file object by object took 35-40 ms on
# the 10,000-wall benchmark. Each check replaces it.
_LAST_RUN: list = []


def _console() -> Console:
    return Console(highlight=False, soft_wrap=True)


def inspect(model: Path, *, config: Path | None, as_json: bool) -> int:
    """``shearline inspect``: print levels, diaphragms, walls per direction, warnings."""
    from checks.inspect_model import inspect_document
    from ifc_bridge.read_model import read_model

    rules, use_pt, storeys, tol = (), True, (), math.radians(10.0)
    if config is not None:
        from checks.config import load_config

        cfg = load_config(config)
        rules, use_pt = cfg.match_rules, cfg.use_predefined_type
        storeys, tol = cfg.analysis.diaphragm_levels, cfg.analysis.angle_tolerance
    m = read_model(model, rules=rules, use_predefined_type=use_pt, diaphragm_storeys=storeys)
    doc = inspect_document(m, angle_tolerance=tol)
    con = _console()
    if as_json:
        con.out(json.dumps(doc, indent=2), highlight=False)
        return 0
    t = Table(title=f"{Path(model).name} ({doc['schema']})")
    for col in ("level", "elevation m", "diaphragm m²", "slabs", "walls", "shear walls",
                "segments", "X / Y / skewed"):
        t.add_column(col, justify="left" if col == "level" else "right")
    for lv in doc["levels"]:
        d = lv["shear_walls_by_direction"]
        t.add_row(lv["name"], f"{lv['elevation']:.3f}", f"{lv['diaphragm_area']:.1f}",
                  str(lv["slab_count"]), str(lv["walls"]), str(lv["shear_walls"]),
                  str(lv["segments"]), f"{d['X']} / {d['Y']} / {d['skewed']}")
    con.print(t)
    for lv in doc["levels"]:
        for w in lv["shear_wall_list"]:
            con.print(f"  {lv['name']}: {w['guid']} {w['name']!r} type {w['type']!r} "
                      f"{w['direction']} {w['length']:.2f} m, {w['openings']} openings, "
                      f"assembly {w['assembly'] or '-'}", markup=False)
    for issue in doc["issues"]:
        con.print(f"{issue['severity']}: {issue['message']}", markup=False)
    return 0


def init(model: Path, *, out: Path, force: bool) -> int:
    """``shearline init``: write a starter config listing the model's wall types."""
    from checks.init_config import starter_config
    from ifc_bridge.read_model import read_model

    if out.exists() and not force:
        msg = f"{out}: already exists; use --force to overwrite or -o to pick another name"
        raise ConfigError(msg)
    m = read_model(model)
    types = Counter(w.type_name or "(no type)" for w in m.walls if w.part == 0)
    shear = {w.type_name or "(no type)" for w in m.walls if w.predefined_type == "SHEAR"}
    text = starter_config(
        project_name=m.project_name or Path(model).stem,
        wall_types=[(t, n, t in shear) for t, n in sorted(types.items())],
        storeys=[lv.name for lv in m.levels],
    )
    try:
        out.write_text(text, encoding="utf-8")
    except OSError as exc:
        msg = f"{out}: cannot write the starter config: {exc.strerror}"
        raise OutputError(msg) from exc
    _console().print(f"wrote {out} ({len(types)} wall types, {len(shear)} SHEAR)", markup=False)
    return 0


def requirements(out: Path) -> int:
    """``shearline requirements``: write the IDS file of what the checker needs."""
    from checks.requirements import write_requirements_ids

    write_requirements_ids(out)
    _console().print(f"wrote {out}", markup=False)
    return 0


def check(
    model: Path | str,
    *,
    config: Path | str,
    out: Path,
    previous: Path | None,
    annotate: bool,
    bcf_version: str | None,
    units: str | None,
    verbosity: int,
    demo: bool = False,
) -> int:
    """``shearline check`` (and ``demo``): run, write outputs, print the summary."""
    from checks.pipeline import check_model, write_outputs

    con = _console()
    quiet = verbosity == 0
    with Progress(TextColumn("{task.description}"), BarColumn(), TimeElapsedColumn(),
                  console=con, transient=True, disable=quiet) as bar:
        task = bar.add_task("reading IFC", total=None)

        def progress(stage: str, done: int, total: int) -> None:
            bar.update(task, description=stage, completed=done, total=total or None)

        run = check_model(model, config, progress=progress)
        _LAST_RUN[:] = [run]
        bar.update(task, description="writing outputs")
        written = write_outputs(run, out, previous=previous, annotate=annotate,
                                bcf_version=bcf_version, units=units)
    if not quiet:
        from checks.report.summary import render_summary

        con.print(render_summary(run, units=units or run.config.display_units.value,
                                 verbose=verbosity >= 2))
        for kind, path in written.items():
            con.print(f"  {kind}: {os.fspath(path)}", markup=False)
        con.print(f"[dim]{CAUTION}[/dim]")
    errors = sum(f.severity is Severity.ERROR for f in run.findings)
    if demo:
        return 0
    return 1 if errors else 0
