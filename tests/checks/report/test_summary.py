"""The terminal summary rendered by rich: worst ratio per level and direction, findings.

Expected values are computed from the run here, independently of ``worst_ratios``.
"""

from __future__ import annotations

from collections import Counter

import pytest
from rich.console import Console

from checks.findings import Severity
from checks.project import DisplayUnits
from checks.report.summary import render_summary, worst_ratios
from checks.units import format_value
from tests.checks.report._demo_run import HOSTILE_NAMES, demo_run, hostile_run


@pytest.fixture(scope="module")
def run():
    return demo_run()


def _render(run, units: str, *, verbose: bool = False) -> str:
    con = Console(record=True, width=200, color_system=None)
    con.print(render_summary(run, units=units, verbose=verbose))
    return con.export_text()


def _expected_worst(run) -> dict[tuple[str, str], tuple[float, str]]:
    out: dict[tuple[str, str], tuple[float, str]] = {}
    for p in run.allocation.piers:
        c = run.checks.pier_checks.get(p.id)
        if c is None or c.dcr is None or p.direction is None:
            continue
        key = (p.level, p.direction.value)
        out[key] = max(out.get(key, (-1.0, "")), (c.dcr, p.guid))
    return out


def test_worst_ratios_match_the_run(run):
    got, want = worst_ratios(run), _expected_worst(run)
    assert got.keys() == want.keys()
    piers = {(p.guid, p.level): p for p in run.allocation.piers}
    for (level, direction), (dcr, _) in want.items():
        got_dcr, got_guid = got[(level, direction)]
        assert got_dcr == dcr
        assert piers[(got_guid, level)].direction.value == direction


def test_summary_rows_show_worst_ratio_per_level_and_direction(run):
    text = _render(run, "imperial")
    want = _expected_worst(run)
    names = {p.guid: p.name for p in run.allocation.piers}
    rows = {
        ln.split("│")[1].strip(): ln for ln in text.splitlines() if ln.count("│") >= 8
    }
    for lv in run.allocation.levels:
        row = [c.strip() for c in rows[lv.level].split("│")[1:-1]]
        assert row[2] == format_value(lv.story_force, "force", DisplayUnits.IMPERIAL)
        assert row[4] == format_value(
            lv.diaphragm_force, "force", DisplayUnits.IMPERIAL
        )
        for cell, d in zip(row[5:7], ("X", "Y"), strict=True):
            dcr, guid = want[(lv.level, d)]
            assert cell == f"{dcr:.2f} {names[guid]}"


def test_summary_counts_findings_by_severity(run):
    text = _render(run, "si")
    counts = Counter(f.severity for f in run.findings)
    for sev in Severity:
        line = next(ln for ln in text.splitlines() if f"│ {sev.value} " in ln)
        assert line.split("│")[2].strip() == str(counts.get(sev, 0))
    assert sum(counts.values()) == len(run.findings)
    assert format_value(run.allocation.seismic.V, "force", DisplayUnits.SI) in text


def test_names_with_markup_are_shown_as_typed():
    r = hostile_run()
    text = _render(r, "imperial", verbose=True)
    assert '<i>Larkspur</i> & "Row"' in text
    worst = max(worst_ratios(r).values())
    assert f"{worst[0]:.2f} {HOSTILE_NAMES[1]}" in text  # brackets not read as markup
