"""report.html opened in a real headless Chromium: DOM, console, links, escaping, print.

The report is rendered once for the demo building with two walls and the project renamed
to markup; Chromium loads it once for the DOM (with its console log on stderr) and once
to print it to PDF. Skips when no Chromium is installed.
"""

from __future__ import annotations

import dataclasses
import re
import shutil
import subprocess
import sys
from collections import Counter
from pathlib import Path

import lxml.html
import pytest

from allocation.load_path import LoadPathGraphs, build_load_path, explain_pier
from checks.project import DisplayUnits
from checks.report import _html_parts
from checks.report._html_parts import html_id
from checks.report.html_report import render_report, wall_anchor, write_report
from checks.units import format_value
from ifc_bridge.model import Direction
from tests.checks.report._demo_run import HOSTILE_NAMES, hostile_run

_CHROMIUM = shutil.which("chromium") or shutil.which("chromium-browser")
needs_chromium = pytest.mark.skipif(
    _CHROMIUM is None, reason="headless Chromium not installed (looked for 'chromium')"
)
_FLAGS = (
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--enable-logging=stderr",
    "--v=0",
)


def _chromium(tmp: Path, *args: str) -> subprocess.CompletedProcess:
    cmd = [_CHROMIUM, *_FLAGS, f"--user-data-dir={tmp / 'profile'}", *args]
    return subprocess.run(cmd, capture_output=True, text=True, timeout=120, check=True)


@pytest.fixture(scope="module")
def run():
    return hostile_run()


@pytest.fixture(scope="module")
def report(run, tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("report")
    return write_report(out / "report.html", run, system=DisplayUnits.IMPERIAL)


@pytest.fixture(scope="module")
def browser(report):
    """(DOM as Chromium built it, Chromium's stderr log)."""
    if _CHROMIUM is None:
        pytest.skip("headless Chromium not installed (looked for 'chromium')")
    done = _chromium(report.parent, "--dump-dom", report.as_uri())
    return lxml.html.document_fromstring(done.stdout), done.stderr


@needs_chromium
def test_no_console_errors(browser):
    _, log = browser
    bad = [
        ln
        for ln in log.splitlines()
        if re.search(r"CONSOLE|Uncaught|Refused to|Failed to load", ln)
    ]
    assert bad == []


@needs_chromium
def test_one_plan_per_level(browser, run):
    dom, _ = browser
    plans = dom.xpath("//svg[contains(concat(' ', @class, ' '), ' plan ')]")
    assert len(plans) == len(run.allocation.levels)
    for lv in run.allocation.levels:  # each plan sits in its level's section
        section = dom.get_element_by_id(html_id("level", lv.level))
        assert len(section.xpath(".//svg[contains(@class, 'plan')]")) == 1


@needs_chromium
def test_every_wall_guid_and_mark_present(browser, run):
    dom, _ = browser
    text = dom.text_content()
    for p in run.allocation.piers:
        assert p.guid in text
        mark = dom.get_element_by_id(wall_anchor(p.guid, p.level))
        assert mark.get("data-guid") == p.guid
        dom.get_element_by_id(html_id("pier", p.id))  # the pier's table row


@needs_chromium
def test_markup_in_names_is_text(browser, run):
    dom, _ = browser
    assert dom.xpath("//script") == []
    assert dom.xpath("//body//b[normalize-space(.)='x']") == []
    assert dom.xpath("//i[normalize-space(.)='Larkspur']") == []
    cells = [
        td.text_content() for td in dom.xpath("//table[contains(@class,'walls')]//td")
    ]
    for name in HOSTILE_NAMES:
        assert any(name in c for c in cells), name
    assert '<i>Larkspur</i> & "Row"' in dom.findtext(".//h1")
    titles = [t.text_content() for t in dom.xpath("//*[local-name()='title']")]
    assert any(HOSTILE_NAMES[0] in t for t in titles)  # plan tooltip, as text


@needs_chromium
def test_every_internal_link_resolves(browser, run):
    dom, _ = browser
    ids = Counter(e.get("id") for e in dom.xpath("//*[@id]"))
    assert [i for i, n in ids.items() if n > 1] == []  # ids are unique
    hrefs = [a.get("href") for a in dom.xpath("//a[@href]")]
    assert hrefs
    assert all(h.startswith("#") for h in hrefs)  # no link leaves the page
    assert [h for h in hrefs if h[1:] not in ids] == []


@needs_chromium
def test_findings_link_to_their_walls(browser, run):
    dom, _ = browser
    walls = {(p.guid, p.level) for p in run.allocation.piers}
    linked = 0
    for fd in run.findings:
        li = dom.get_element_by_id(html_id("finding", fd.id))
        hrefs = {a.get("href")[1:] for a in li.xpath(".//a")}
        for g in fd.guids:
            if (g, fd.level) in walls:
                assert wall_anchor(g, fd.level) in hrefs
                linked += 1
    assert linked >= 1  # the demo's over-capacity wall at least


@needs_chromium
def test_wall_table_values(browser, run):
    dom, _ = browser
    checks = run.checks.pier_checks
    for p in run.allocation.piers:
        cells = [
            c.text_content().strip()
            for c in dom.get_element_by_id(html_id("pier", p.id)).xpath("./td")
        ]
        env = run.allocation.envelope[p.id]
        assert cells[6:9] == [
            format_value(v, "force", DisplayUnits.IMPERIAL)
            for v in (env.flexible, env.rigid, env.envelope)
        ]
        if p.id in checks:
            assert cells[12] == f"{checks[p.id].dcr:.2f}"


@needs_chromium
def test_load_path_lists_every_contribution(browser, run):
    dom, _ = browser
    graphs = run.allocation.graphs
    for p in run.allocation.piers[:10]:
        parts = explain_pier(graphs[p.direction], p.id)
        row = dom.get_element_by_id(html_id("pier", p.id))
        assert len(row.xpath(".//td[contains(@class,'lp')]//li")) == len(parts)


@pytest.mark.parametrize("detail_nodes", [3000, 0])  # every source listed, or totals
def test_load_path_cells_need_no_graph(run, monkeypatch, detail_nodes):
    # the lazy mapping answers from plain dicts: the same page as from built graphs
    monkeypatch.setattr(_html_parts, "_DETAIL_NODES", detail_nodes)
    alloc = run.allocation
    lazy = LoadPathGraphs(alloc.flexible, alloc.piers)
    built = {
        d: build_load_path([f for f in alloc.flexible if f.direction is d], alloc.piers)
        for d in Direction
    }

    def page(graphs) -> str:
        changed = dataclasses.replace(alloc, graphs=graphs)
        return render_report(
            dataclasses.replace(run, allocation=changed), system=DisplayUnits.IMPERIAL
        )

    expected = page(built)
    assert ("<details>" in expected) == (detail_nodes > 0)
    monkeypatch.setitem(sys.modules, "networkx", None)  # importing it now fails
    assert page(lazy) == expected
    assert repr(lazy).endswith("built: none)")


def test_self_contained(report):
    raw = report.read_text(encoding="utf-8")
    doc = lxml.html.document_fromstring(raw)
    assert doc.xpath("//script|//link|//iframe|//img[@src]|//object|//embed") == []
    for el in doc.xpath("//*[@href or @src]"):
        for attr in ("href", "src"):
            assert (el.get(attr) or "#").startswith("#")
    css = " ".join(doc.xpath("//style/text()"))
    assert "@import" not in css
    assert re.findall(r"url\((?!#)", css + raw) == []
    csp = doc.xpath("//meta[@http-equiv='Content-Security-Policy']/@content")
    assert csp
    assert "default-src 'none'" in csp[0]


def test_caution_and_both_systems(run):
    for system, unit in ((DisplayUnits.IMPERIAL, " kip"), (DisplayUnits.SI, " kN")):
        html = render_report(run, system=system)
        assert html.count("licensed engineer") == 2
        assert format_value(run.allocation.seismic.V, "force", system) in html
        assert unit in html


@needs_chromium
def test_prints_one_level_per_page(report, run):
    pdf = report.parent / "report.pdf"
    _chromium(
        report.parent,
        "--no-pdf-header-footer",
        f"--print-to-pdf={pdf}",
        report.as_uri(),
    )
    pages = len(re.findall(rb"/Type\s*/Page\b", pdf.read_bytes()))
    assert (
        pages >= len(run.allocation.levels) + 1
    )  # title + one page per level at least
