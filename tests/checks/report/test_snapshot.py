"""Plan snapshot PNGs: Pillow reopens them, size and marked elements as drawn."""

from __future__ import annotations

import io

import numpy as np
import pytest
from PIL import Image, ImageDraw

from checks.errors import BcfError
from checks.report import snapshot
from checks.report.snapshot import HIGHLIGHT_RGB, plan_snapshot_png
from tests.checks.report._demo_run import demo_run
from tests.checks.report._tiny_model import gid, tiny_model


def _open(png: bytes) -> Image.Image:
    image = Image.open(io.BytesIO(png))
    image.load()
    return image.convert("RGB")


def _mask(image: Image.Image, rgb: tuple[int, int, int]) -> np.ndarray:
    return np.all(np.asarray(image) == np.array(rgb, dtype=np.uint8), axis=-1)


def _count(image: Image.Image, rgb: tuple[int, int, int]) -> int:
    return int(_mask(image, rgb).sum())


def test_png_reopens_with_the_requested_size():
    png = plan_snapshot_png(
        tiny_model(), level="Level 2", highlight=[gid("Level 1/S")], size=(640, 480)
    )
    assert png.startswith(b"\x89PNG\r\n\x1a\n")  # PNG signature, ISO/IEC 15948 §5.2
    image = Image.open(io.BytesIO(png))
    assert (image.format, image.size) == ("PNG", (640, 480))


def test_highlighted_wall_is_drawn_in_the_strong_colour_at_the_south():
    image = _open(
        plan_snapshot_png(tiny_model(), level="Level 2", highlight=[gid("Level 1/S")])
    )
    rows, _cols = np.nonzero(_mask(image, HIGHLIGHT_RGB))
    assert rows.size > 1000  # a 10 m wall at ~60 px/m, >= 6 px wide
    # plan Y up: the south wall (y = 0 m) is in the bottom half of the image
    assert rows.min() > image.height / 2


def test_no_highlight_means_no_strong_colour():
    image = _open(plan_snapshot_png(tiny_model(), level="Level 2", highlight=[]))
    assert _count(image, HIGHLIGHT_RGB) == 0
    assert _count(image, snapshot._WALL_RGB) > 1000  # the four grey walls


def test_diaphragm_hole_is_left_open():
    model = tiny_model()
    size = (800, 600)
    image = _open(plan_snapshot_png(model, level="Level 2", highlight=[], size=size))
    plan = snapshot._Plan((0.0, 0.0, 10.0, 8.0), size)  # the box's plan bounds [m]
    hole = tuple(
        round(c) for c in plan.px(3.0, 3.0)
    )  # centre of the 2 m x 2 m stair hole
    slab = tuple(round(c) for c in plan.px(7.0, 5.0))
    assert image.getpixel(hole) == snapshot._BACKGROUND
    assert image.getpixel(slab) == snapshot._SLAB_FILL


def test_level_without_diaphragm_draws_walls_only():
    image = _open(
        plan_snapshot_png(tiny_model(), level="Roof", highlight=[gid("Level 2/E")])
    )
    assert _count(image, snapshot._SLAB_FILL) == 0
    assert _count(image, HIGHLIGHT_RGB) > 500
    assert _count(image, snapshot._WALL_RGB) > 500


def test_highlighted_slab_is_tinted():
    image = _open(
        plan_snapshot_png(tiny_model(), level="Level 2", highlight=[gid("slab2")])
    )
    assert _count(image, snapshot._SLAB_HIGHLIGHT_FILL) > 10_000


def test_same_inputs_give_the_same_bytes():
    a = plan_snapshot_png(tiny_model(), level="Level 2", highlight=[gid("Level 1/S")])
    b = plan_snapshot_png(tiny_model(), level="Level 2", highlight=[gid("Level 1/S")])
    assert a == b


@pytest.mark.parametrize(
    ("target", "expected"),
    [(1.3, 1.0), (2.0, 2.0), (4.9, 2.0), (7.0, 5.0), (13.0, 10.0)],
)
def test_scale_bar_length_is_a_1_2_5_step(
    target, expected
):  # common practice: 1-2-5 scale bars
    assert snapshot._nice_length(target) == pytest.approx(expected)


def test_unknown_level_is_an_error():
    with pytest.raises(BcfError, match="'Level 9'"):
        plan_snapshot_png(tiny_model(), level="Level 9", highlight=[])


def _reference_image(model, *, level, highlight, size=(800, 600)) -> Image.Image:
    """The plan drawn wall by wall from the segments, as the module docstring reads.

    The walls supporting the level (every wall for ``""``) in grey, then the marked
    ones of that story, then marked walls of other stories, in model order; the view
    fits the level's diaphragms and the walls drawn.
    """
    lit = set(highlight)
    story = [w for w in model.walls if w.level == level] if level else model.walls
    grey = [w for w in story if w.guid not in lit]
    marked = [w for w in story if w.guid in lit]
    found = {w.guid for w in marked}
    marked += [w for w in model.walls if w.guid in lit and w.guid not in found]
    xs, ys = [], []
    for d in model.diaphragms_of(level):
        x0, y0, x1, y1 = d.polygon.bounds
        xs += [x0, x1]
        ys += [y0, y1]
    for w in grey + marked:
        xs += [w.start[0], w.end[0]]
        ys += [w.start[1], w.end[1]]
    box = (min(xs), min(ys), max(xs), max(ys)) if xs else (-5.0, -5.0, 5.0, 5.0)
    plan = snapshot._Plan(box, size)
    image = Image.new("RGB", size, snapshot._BACKGROUND)
    draw = ImageDraw.Draw(image)
    snapshot._draw_diaphragms(draw, plan, model, level, lit)
    for walls, rgb, min_px in (
        (grey, snapshot._WALL_RGB, 2),
        (marked, HIGHLIGHT_RGB, 6),
    ):
        for w in walls:
            width = max(min_px, round(w.thickness * plan.scale))
            draw.line([plan.px(*w.start), plan.px(*w.end)], fill=rgb, width=width)
    snapshot._draw_axes(draw, plan)
    snapshot._draw_scale_bar(draw, plan)
    return image


def _demo_cases():
    model = demo_run().model
    walls = [w.guid for w in model.walls]
    slabs = [g for d in model.diaphragms for g in d.slab_guids]
    other_story = [w.guid for w in model.walls if w.level != model.levels[-1].name]
    guid_sets = [
        (),
        tuple(walls[:3]),
        tuple(walls[::4]),
        tuple(slabs[:1]),
        tuple(walls),
    ]
    guid_sets += [tuple(other_story[:2])]  # drawn on a level they do not support
    guid_sets += [f.guids for f in demo_run().findings]
    levels = ["", *(lv.name for lv in model.levels)]
    return [(level, guids) for level in levels for guids in dict.fromkeys(guid_sets)]


@pytest.mark.parametrize(("level", "guids"), _demo_cases())
def test_demo_snapshots_equal_the_plan_drawn_wall_by_wall(level, guids):
    model = demo_run().model
    got = _open(plan_snapshot_png(model, level=level, highlight=guids))
    want = _reference_image(model, level=level, highlight=guids)
    assert got.tobytes() == want.tobytes()  # same pixels; reference: per-wall drawing


def test_a_second_model_is_not_drawn_from_the_first_ones_arrays():
    model, revised = tiny_model(), tiny_model(south_wall_at_level_1=False)
    for m in (model, revised, model):
        got = _open(plan_snapshot_png(m, level="Level 2", highlight=[gid("Level 1/E")]))
        want = _reference_image(m, level="Level 2", highlight=[gid("Level 1/E")])
        assert got.tobytes() == want.tobytes()
