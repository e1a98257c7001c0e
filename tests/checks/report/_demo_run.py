"""The demo scenario checked once per test session, and a copy with crafted names.

The demo model and config are the project's own invented scenario (sample_models/).
"""

from __future__ import annotations

import dataclasses
import functools

from tests.conftest import SAMPLE_MODELS

HOSTILE_NAMES = ("<script>alert(1)</script>", "<b>x</b> & [bold]y[/bold]")


@functools.cache
def demo_run():
    """``check_model`` on the demo building (a few seconds, once per session)."""
    from checks.pipeline import check_model

    return check_model(SAMPLE_MODELS / "demo_building.ifc", SAMPLE_MODELS / "demo.toml")


@functools.cache
def hostile_run():
    """The demo with two shear walls (one the most loaded) and the project renamed.

    The walls are renamed in the model, then allocation and checks run again, so the
    names flow through every stage as they would from an IFC file.
    """
    from allocation.allocate import allocate
    from checks.pipeline import CheckRun
    from checks.rules.run_rules import run_checks

    base = demo_run()
    checks = base.checks.pier_checks
    worst = max(base.allocation.piers, key=lambda p: checks[p.id].dcr).guid
    first = min(p.guid for p in base.allocation.piers if p.guid != worst)
    guids = (first, worst)  # the second name shows in the summary's worst-ratio column
    rename = dict(zip(guids, HOSTILE_NAMES, strict=True))
    walls = tuple(
        dataclasses.replace(w, name=rename[w.guid]) if w.guid in rename else w
        for w in base.model.walls
    )
    model = dataclasses.replace(base.model, walls=walls)
    cfg = dataclasses.replace(base.config, name='<i>Larkspur</i> & "Row"')
    allocation = allocate(model, cfg.seismic, cfg.loads, cfg.analysis)
    checks = run_checks(model, allocation, cfg)
    return CheckRun(
        model=model,
        config=cfg,
        allocation=allocation,
        checks=checks,
        requirement_findings=base.requirement_findings,
    )
