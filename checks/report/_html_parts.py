"""Pieces of ``report.html``: element ids, the seismic summary, the load path of a pier.

Every string from the model or the config is escaped here or by the caller.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from html import escape

from allocation.asce7_16 import s12_8_elf
from allocation.load_path import LoadPathGraphs, explain_all, level_totals
from checks.project import DisplayUnits
from checks.report._formats import Formats
from checks.units import format_value

__all__ = ["LoadPaths", "html_id", "seismic_section"]


class _IdChars(dict):
    """Code point -> itself when a letter, digit or ``-`` (ASCII), else ``_<hex>_``."""

    __slots__ = ()

    def __missing__(self, code: int) -> str:
        char = chr(code)
        keep = char.isascii() and (char.isalnum() or char == "-")
        out = self[code] = char if keep else f"_{code:x}_"
        return out


_ID_CHARS = _IdChars()


def html_id(kind: str, *parts: str) -> str:
    """An HTML id safe in a URL fragment, unique per (kind, parts).

    Common practice: letters, digits and ``-`` stay, anything else becomes ``_<hex>_``.

    Args:
        kind: Prefix (``"wall"``, ``"pier"``, ``"level"``, ...).
        parts: Model strings that identify the element.

    Returns:
        The id.
    """
    return kind + "-" + "|".join(parts).translate(_ID_CHARS)


def _row(key: str, value: str) -> str:
    return f'<tr><th class="t">{key}</th><td>{value}</td></tr>'


def _cs_rows(run) -> list[str]:
    """Cs and its limits, ASCE 7-16 §12.8.1.1, with the one that governed marked."""
    s, p = run.allocation.seismic, run.config.seismic
    if s.procedure != "elf" or s.T <= 0:
        return [_row("Cs", f"{s.Cs:.4f} ({escape(s.Cs_governs)})")]
    long = s.T > p.TL
    rows = [
        ("Eq. 12.8-2", "SDS/(R/Ie)", s12_8_elf.Cs_base(p.SDS, p.R, p.Ie)),
        (
            "Eq. 12.8-4" if long else "Eq. 12.8-3",
            "upper limit " + ("SD1·TL/(T²·R/Ie)" if long else "SD1/(T·R/Ie)"),
            s12_8_elf.Cs_max(p.SD1, s.T, p.TL, p.R, p.Ie),
        ),
        (
            "Eq. 12.8-5",
            "lower limit 0.044·SDS·Ie ≥ 0.01",
            s12_8_elf.Cs_min(p.SDS, p.Ie),
        ),
    ]
    if p.S1 >= 0.6:
        rows.append(
            (
                "Eq. 12.8-6",
                "lower limit 0.5·S1/(R/Ie)",
                s12_8_elf.Cs_min_S1(p.S1, p.R, p.Ie),
            )
        )
    out = []
    for eq, what, value in rows:
        mark = " <b>governs</b>" if s.Cs_governs.startswith(f"ASCE 7-16 {eq}") else ""
        out.append(_row(f"Cs, {eq}", f"{value:.4f} <small>({what})</small>{mark}"))
    out.append(_row("Cs used", f"<b>{s.Cs:.4f}</b> ({escape(s.Cs_governs)})"))
    return out


def seismic_section(run, system: DisplayUnits) -> str:
    """The seismic summary: parameters, Cs and its limits, W, V, Fx and Fpx per level.

    ASCE 7-16 §12.8 and §12.10.1.1.

    Args:
        run: A :class:`checks.pipeline.CheckRun`.
        system: Display units.

    Returns:
        HTML text.
    """
    s, p = run.allocation.seismic, run.config.seismic
    f = lambda v: format_value(v, "force", system)  # noqa: E731
    rho = getattr(run.checks, "rho", None)
    rows = [
        _row(
            "Procedure",
            "equivalent lateral force (§12.8)"
            if s.procedure == "elf"
            else "level forces given in the config",
        ),
        _row("SDS / SD1 / S1", f"{p.SDS:g} g / {p.SD1:g} g / {p.S1:g} g"),
        _row("TL", f"{p.TL:g} s"),
        _row("R / Ie / Cd / Ω0", f"{p.R:g} / {p.Ie:g} / {p.Cd:g} / {p.omega0:g}"),
        _row("ρ (§12.3.4)", "-" if rho is None else f"{rho:g}"),
        _row("hn", format_value(s.hn, "length", system)),
        _row(
            "Ta (Eq. 12.8-7) / Cu / T used", f"{s.Ta:.3f} s / {s.Cu:.2f} / {s.T:.3f} s"
        ),
        _row("k (§12.8.3)", f"{s.k:.3f}"),
        *_cs_rows(run),
        _row("W (§12.7.2)", f(s.W)),
        _row("V = Cs·W (Eq. 12.8-1)", f"<b>{f(s.V)}</b>"),
    ]
    levels = "".join(
        f'<tr><td class="t"><a href="#{html_id("level", x.level)}">{escape(x.level)}</a></td>'
        f"<td>{format_value(x.height, 'length', system)}</td><td>{f(x.seismic_weight)}</td>"
        f"<td>{x.Cvx:.4f}</td><td>{f(x.story_force)}</td><td>{f(x.story_shear)}</td>"
        f"<td>{f(x.diaphragm_force)}</td></tr>"
        for x in reversed(run.allocation.levels)
    )
    return (
        '<section id="seismic"><h2>Seismic summary (ASCE 7-16 §12.8)</h2>'
        f'<div class="cols"><table class="params">{"".join(rows)}</table>'
        '<table class="levels"><thead><tr><th class="t">Level</th><th>hx</th><th>wx</th>'
        "<th>Cvx</th><th>Fx (Eq. 12.8-11)</th><th>Vx (Eq. 12.8-13)</th>"
        f"<th>Fpx (Eq. 12.10-1)</th></tr></thead><tbody>{levels}</tbody></table></div>"
        "<p><small>Fx and Vx act on the walls; Fpx, bounded by 0.2 and 0.4·SDS·Ie·wpx, "
        "is the diaphragm, chord and collector design force.</small></p></section>"
    )


def _source(src: str) -> str:
    if src.startswith("mass:"):
        return f"wall mass on line {escape(src[5:])}"
    return f"diaphragm piece {escape(src)}"


_DETAIL_NODES = 3000  # graphs larger than this show per-level totals only


@dataclass(frozen=True, slots=True)
class LoadPaths:
    """The load-path cells of one report: where each pier's flexible force comes from.

    Common practice (DESIGN.md item 10): the load path from
    :func:`allocation.load_path.level_totals`, computed once per graph (one pass for
    all piers) and, on graphs small enough to list every source,
    :func:`allocation.load_path.explain_all`. A :class:`LoadPathGraphs` answers both
    without building its networkx graphs; any other mapping of graphs is asked
    through the functions. Piers with equal flows (often those of one line) share
    the text of their per-level totals, formatted once.

    Attributes:
        graphs: ``Allocation.graphs`` (load-path graph per direction).
        fm: The report's formatters.
    """

    graphs: Mapping
    fm: Formats
    _totals: dict = field(default_factory=dict)
    _explained: dict = field(default_factory=dict)
    _heads: dict = field(default_factory=dict)

    def _totals_of(self, direction) -> dict | None:
        """Pier id -> level -> force of the direction's graph; None without a graph."""
        if direction in self._totals:
            return self._totals[direction]
        graphs, hit = self.graphs, None
        if isinstance(graphs, LoadPathGraphs):
            hit = graphs.level_totals(direction)
        elif (graph := graphs.get(direction)) is not None:
            hit = level_totals(graph)
        self._totals[direction] = hit
        return hit

    def _explained_of(self, direction) -> dict | None:
        """Pier id -> contributions, None when the graph is too large to list them."""
        if direction in self._explained:
            return self._explained[direction]
        graphs, hit = self.graphs, None
        if isinstance(graphs, LoadPathGraphs):
            if graphs.node_count(direction) <= _DETAIL_NODES:
                hit = graphs.explain_all(direction)
        elif graphs[direction].number_of_nodes() <= _DETAIL_NODES:
            hit = explain_all(graphs[direction])
        self._explained[direction] = hit
        return hit

    def cell(self, pier) -> str:
        """HTML text for the pier's table cell ("-" when it has no load path)."""
        direction = pier.direction
        totals = self._totals_of(direction) if direction is not None else None
        by_level = totals.get(pier.id) if totals is not None else None
        if not by_level:
            return "-"
        f, esc = self.fm.force, self.fm.escape
        key = tuple(by_level.items())  # piers of one line often carry equal flows
        head = self._heads.get(key)
        if head is None:
            head = self._heads[key] = "; ".join(
                [f"{esc(lv)} {f(v)}" for lv, v in sorted(key)]
            )
        explained = self._explained_of(direction)
        parts = explained.get(pier.id) if explained is not None else None
        if parts is None:
            return f"<span>{head}</span>"
        items = "".join(
            f"<li>{esc(c.level)}: {_source(c.source)}, share {c.share:.3f} → "
            f"{f(c.force)}</li>"
            for c in parts
        )
        return f"<details><summary>{head}</summary><ul>{items}</ul></details>"
