"""The plan drawing: palette order in lightness, patterns, escaping, geometry in frame."""

from __future__ import annotations

import itertools
import re

import pytest
from hypothesis import given
from hypothesis import strategies as st
from lxml import etree
from shapely.geometry import Polygon

from checks.report.plan_svg import (
    BANDS,
    NO_RATIO,
    PlanLine,
    PlanWall,
    band_of,
    legend_svg,
    plan_svg,
    spread,
)

SVG = "{http://www.w3.org/2000/svg}"


def cie_lightness(hex_colour: str) -> float:
    """CIE 1976 L* of an sRGB colour (IEC 61966-2-1 transfer, CIE 15:2004 L*)."""
    rgb = [int(hex_colour[i : i + 2], 16) / 255.0 for i in (1, 3, 5)]
    lin = [c / 12.92 if c <= 0.04045 else ((c + 0.055) / 1.055) ** 2.4 for c in rgb]
    y = 0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2]  # IEC 61966-2-1 (D65)
    return 116.0 * y ** (1 / 3) - 16.0 if y > (6 / 29) ** 3 else y * (29 / 3) ** 3


def test_lightness_reference_values():
    assert cie_lightness("#ffffff") == pytest.approx(100.0, abs=1e-6)  # CIE 15:2004
    assert cie_lightness("#000000") == pytest.approx(0.0, abs=1e-6)  # CIE 15:2004
    assert cie_lightness("#777777") == pytest.approx(50.03, abs=0.05)  # from memory


def test_bands_fall_in_lightness_for_greyscale_print():
    lightness = [cie_lightness(b.colour) for b in BANDS]
    steps = [a - b for a, b in itertools.pairwise(lightness)]
    assert all(s >= 12.0 for s in steps), lightness  # common practice: ≥ ~10 L* apart
    assert lightness[0] < 95.0  # still visible on white paper


def test_every_band_has_its_own_pattern():
    dashes = [b.dash for b in (*BANDS, NO_RATIO)]
    assert len(set(dashes)) == len(dashes)


@pytest.mark.parametrize(
    ("dcr", "index"),
    [
        (0.0, 0),
        (0.4999, 0),
        (0.5, 1),
        (0.79, 1),
        (0.8, 2),
        (0.9999, 2),
        (1.0, 3),
        (1.19, 3),
        (1.2, 4),
        (7.0, 4),
    ],
)  # the report's own bands (common practice: 1.0 is the capacity)
def test_band_of(dcr, index):
    assert band_of(dcr) is BANDS[index]


def test_band_of_none_is_no_capacity():
    assert band_of(None) is NO_RATIO


@given(st.lists(st.floats(0.0, 500.0), min_size=1, max_size=25))
def test_spread_keeps_gap_and_bounds(wanted):
    wanted = sorted(wanted)
    lo, hi, gap = 0.0, 500.0, 15.0
    out = spread(wanted, lo, hi, gap)
    assert len(out) == len(wanted)
    if gap * (len(out) - 1) <= hi - lo:  # room for all of them
        assert all(b - a >= gap - 1e-9 for a, b in itertools.pairwise(out))
        assert lo - 1e-9 <= out[0]
        assert out[-1] <= hi + 1e-9


def test_spread_leaves_spaced_labels_alone():
    assert spread([10.0, 40.0, 90.0], 0.0, 100.0, 15.0) == [10.0, 40.0, 90.0]


def _sample_svg(label: str = "W <b>1</b>") -> etree._Element:
    slab = Polygon(
        [(0, 0), (20, 0), (20, 10), (0, 10)], [[(2, 2), (5, 2), (5, 5), (2, 5)]]
    )
    walls = [
        PlanWall(
            group="wall-a",
            row="pier-a",
            guid="G$a",
            label=label,
            tag="W1",
            start=(0.0, 0.0),
            end=(8.0, 0.0),
            dcr=0.3,
        ),
        PlanWall(
            group="wall-a",
            row="pier-a2",
            guid="G$a",
            label=label,
            tag="W1",
            start=(10.0, 0.0),
            end=(20.0, 0.0),
            dcr=1.4,
        ),
        PlanWall(
            group="wall-b",
            row="pier-b",
            guid="G$b",
            label="B",
            tag="W2",
            start=(0.0, 0.0),
            end=(0.0, 10.0),
            dcr=None,
        ),
    ]
    lines = [
        PlanLine(id="L2-X-1", direction="X", offset=0.0, force_label="12.3 kip"),
        PlanLine(id="L2-X-2", direction="X", offset=0.2, force_label="1.0 kip"),
        PlanLine(id="L2-Y-1", direction="Y", offset=0.0, force_label="4 kip"),
        PlanLine(id="<L>", direction="Y", offset=20.0, force_label="5 kip"),
    ]
    text = plan_svg(
        level="Level <2>",
        diaphragms=[("dia-1", slab)],
        walls=walls,
        lines=lines,
        centre_of_mass=(10.0, 5.0),
        centre_of_rigidity=(9.0, 4.0),
        scale_unit=("ft", 0.3048),
    )
    return etree.fromstring(text.encode())  # well-formed XML or this raises


def test_plan_is_escaped_xml():
    svg = _sample_svg()
    assert svg.findtext(f"{SVG}title") == "Plan of Level <2>"
    assert svg.xpath("//*[local-name()='b']") == []
    titles = [t.text for t in svg.iter(f"{SVG}title")]
    assert any("W <b>1</b>" in t for t in titles)
    assert "<L>" in "".join(svg.itertext())


def test_plan_has_one_group_per_wall_and_an_arrow_per_line():
    svg = _sample_svg()
    groups = svg.xpath("//*[local-name()='g'][@class='wall']")
    assert [g.get("id") for g in groups] == ["wall-a", "wall-b"]
    assert len(groups[0].xpath(".//*[@class='band']")) == 2  # two piers
    lines = svg.xpath("//*[local-name()='g'][@class='line']")
    assert len(lines) == 4
    for g in lines:
        assert len(g.xpath("./*[@class='arrow']")) == 1
    over = svg.xpath("//*[@class='over']")  # the ratio printed beside a wall over 1.0
    assert [t.text for t in over] == ["1.40"]


def test_close_line_labels_do_not_overlap():
    svg = _sample_svg()
    ys = sorted(
        float(t.get("y"))
        for t in svg.xpath(
            "//*[local-name()='g'][@class='line']/*[local-name()='text'][@y]"
        )
    )
    assert ys[1] - ys[0] >= 15.0 - 1e-6  # the lines are 0.2 m apart, labels are not


def test_everything_drawn_inside_the_frame():
    svg = _sample_svg()
    _, _, width, height = (float(v) for v in svg.get("viewBox").split())
    for el in svg.iter(f"{SVG}line", f"{SVG}circle", f"{SVG}rect"):
        for attr in ("x1", "x2", "cx", "x"):
            if el.get(attr) is not None:
                assert 0.0 <= float(el.get(attr)) <= width
        for attr in ("y1", "y2", "cy", "y"):
            if el.get(attr) is not None:
                assert 0.0 <= float(el.get(attr)) <= height
    for el in svg.iter(f"{SVG}path"):
        nums = [float(n) for n in re.findall(r"-?\d+(?:\.\d+)?", el.get("d"))]
        xs, ys = nums[0::2], nums[1::2]
        if "A" not in el.get("d"):
            assert all(0.0 <= x <= width for x in xs)
            assert all(0.0 <= y <= height for y in ys)


def test_legend_shows_every_band():
    legend = etree.fromstring(legend_svg().encode())
    labels = [t.text for t in legend.iter(f"{SVG}text")]
    assert labels == [b.label for b in (*BANDS, NO_RATIO)]
    strokes = [
        e.get("stroke-dasharray", "") for e in legend.xpath("//*[@class='band']")
    ]
    assert strokes == [b.dash for b in (*BANDS, NO_RATIO)]
