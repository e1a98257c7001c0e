"""Plan snapshot of a level for a BCF viewpoint, drawn with Pillow.

Plan view of global X-Y [m], +X to the right and +Y up (north up when the IFC's
project north is +Y). The level's diaphragm outlines (slab openings too) are drawn in
blue, every wall of the story below that supports the level in grey, and the finding's
walls in red, thicker. An axes marker (X, Y) and a scale bar sit in the corners.
"""

from __future__ import annotations

import io
import math
from collections.abc import Sequence

from PIL import Image, ImageDraw, ImageFont

from checks.errors import BcfError
from ifc_bridge.model import BuildingModel, WallSegment

__all__ = ["HIGHLIGHT_RGB", "plan_snapshot_png"]

HIGHLIGHT_RGB = (220, 30, 30)
_BACKGROUND = (255, 255, 255)
_WALL_RGB = (150, 150, 150)
_OUTLINE_RGB = (40, 90, 170)
_HOLE_RGB = (120, 150, 200)
_SLAB_FILL = (232, 238, 248)
_SLAB_HIGHLIGHT_FILL = (250, 220, 220)
_INK = (0, 0, 0)
_MARGIN = 60  # [px]
_NICE = (1.0, 2.0, 5.0)


def _font() -> ImageFont.ImageFont | ImageFont.FreeTypeFont:
    return ImageFont.load_default()


def _walls_to_draw(
    model: BuildingModel, level: str, highlight: set[str]
) -> tuple[list[WallSegment], list[WallSegment]]:
    """(grey walls, highlighted walls) of the story supporting ``level``."""
    story = list(model.walls_supporting(level)) if level else list(model.walls)
    grey = [w for w in story if w.guid not in highlight]
    marked = [w for w in story if w.guid in highlight]
    found = {w.guid for w in marked}
    # a finding may name a wall of another story (a discontinuity): draw it too
    marked += [w for w in model.walls if w.guid in highlight and w.guid not in found]
    return grey, marked


def _nice_length(target: float) -> float:
    """Largest 1-2-5 x 10^n length not above ``target`` [m]."""
    exp = math.floor(math.log10(target))
    best = 10.0**exp
    for m in _NICE:
        if m * 10.0**exp <= target:
            best = m * 10.0**exp
    return best


class _Plan:
    """World-to-pixel mapping that fits a plan box in the image, Y up."""

    def __init__(
        self, bounds: tuple[float, float, float, float], size: tuple[int, int]
    ) -> None:
        x0, y0, x1, y1 = bounds
        w, h = size
        span_x = max(x1 - x0, 1.0)
        span_y = max(y1 - y0, 1.0)
        self.scale = min(
            (w - 2 * _MARGIN) / span_x, (h - 2 * _MARGIN) / span_y
        )  # [px/m]
        self.cx = (x0 + x1) / 2.0
        self.cy = (y0 + y1) / 2.0
        self.w = w
        self.h = h

    def px(self, x: float, y: float) -> tuple[float, float]:
        return (
            self.w / 2.0 + (x - self.cx) * self.scale,
            self.h / 2.0 - (y - self.cy) * self.scale,
        )


def _bounds(
    model: BuildingModel, level: str, walls: Sequence[WallSegment]
) -> tuple[float, float, float, float]:
    xs: list[float] = []
    ys: list[float] = []
    for d in model.diaphragms_of(level):
        x0, y0, x1, y1 = d.polygon.bounds
        xs += [x0, x1]
        ys += [y0, y1]
    for w in walls:
        xs += [w.start[0], w.end[0]]
        ys += [w.start[1], w.end[1]]
    if not xs:
        return (-5.0, -5.0, 5.0, 5.0)
    return (min(xs), min(ys), max(xs), max(ys))


def _draw_diaphragms(
    draw: ImageDraw.ImageDraw,
    plan: _Plan,
    model: BuildingModel,
    level: str,
    highlight: set[str],
) -> None:
    for d in model.diaphragms_of(level):
        fill = _SLAB_HIGHLIGHT_FILL if highlight & set(d.slab_guids) else _SLAB_FILL
        outer = [plan.px(x, y) for x, y in d.polygon.exterior.coords]
        draw.polygon(outer, fill=fill, outline=_OUTLINE_RGB, width=2)
        for ring in d.polygon.interiors:
            hole = [plan.px(x, y) for x, y in ring.coords]
            draw.polygon(hole, fill=_BACKGROUND, outline=_HOLE_RGB, width=2)


def _draw_walls(
    draw: ImageDraw.ImageDraw,
    plan: _Plan,
    walls: Sequence[WallSegment],
    rgb: tuple[int, int, int],
    min_px: int,
) -> None:
    for w in walls:
        width = max(min_px, round(w.thickness * plan.scale))
        draw.line([plan.px(*w.start), plan.px(*w.end)], fill=rgb, width=width)


def _draw_axes(draw: ImageDraw.ImageDraw, plan: _Plan) -> None:
    """X and Y arrows in the top-left corner; Y is plan north."""
    ox, oy, arm = 15.0, 52.0, 35.0
    font = _font()
    draw.line([(ox, oy), (ox + arm, oy)], fill=_INK, width=2)
    draw.polygon(
        [(ox + arm + 6, oy), (ox + arm, oy - 4), (ox + arm, oy + 4)], fill=_INK
    )
    draw.text((ox + arm + 9, oy - 6), "X", fill=_INK, font=font)
    draw.line([(ox, oy), (ox, oy - arm)], fill=_INK, width=2)
    draw.polygon(
        [(ox, oy - arm - 6), (ox - 4, oy - arm), (ox + 4, oy - arm)], fill=_INK
    )
    draw.text((ox + 6, oy - arm - 12), "Y", fill=_INK, font=font)


def _draw_scale_bar(draw: ImageDraw.ImageDraw, plan: _Plan) -> None:
    """A 1-2-5 metre bar about a fifth of the image wide, bottom left."""
    length = _nice_length(plan.w / 5.0 / plan.scale)
    bar = length * plan.scale
    x0, y0 = 20.0, plan.h - 20.0
    draw.rectangle([x0, y0 - 6, x0 + bar, y0], outline=_INK, fill=_INK)
    draw.rectangle(
        [x0 + bar / 2.0, y0 - 6, x0 + bar, y0], outline=_INK, fill=_BACKGROUND
    )
    label = f"{length:g} m"
    draw.text((x0, y0 - 20), label, fill=_INK, font=_font())


_CACHE: dict[tuple, tuple[BuildingModel, bytes]] = {}


def plan_snapshot_png(
    model: BuildingModel,
    *,
    level: str,
    highlight: Sequence[str],
    size: tuple[int, int] = (800, 600),
) -> bytes:
    """Draw the plan of a level with the finding's elements marked, as PNG bytes.

    Common practice: a marked-up plan is how a lateral-system comment is shown to
    the architect; the BCF viewpoint's snapshot carries it.

    Args:
        model: The structural model.
        level: Level whose diaphragm and supporting walls are drawn; ``""`` draws
            every wall of the model (a building-wide finding).
        highlight: GlobalIds to mark (walls and slabs).
        size: Image width and height [px].

    Returns:
        The PNG file content.

    Raises:
        BcfError: ``level`` names no level of the model, or the size is too small.
    """
    if level and level not in {lv.name for lv in model.levels}:
        msg = (
            f"{model.source}: snapshot for level {level!r}, "
            "which the model does not have"
        )
        raise BcfError(msg)
    if min(size) <= 2 * _MARGIN:
        msg = (
            f"snapshot size {size} px is too small; "
            f"give at least {2 * _MARGIN + 1} px each way"
        )
        raise BcfError(msg)
    key = (id(model), level, tuple(sorted(set(highlight))), tuple(size))
    hit = _CACHE.get(key)
    if hit is not None and hit[0] is model:
        return hit[1]
    marked_ids = set(highlight)
    grey, marked = _walls_to_draw(model, level, marked_ids)
    plan = _Plan(_bounds(model, level, grey + marked), size)
    image = Image.new("RGB", size, _BACKGROUND)
    draw = ImageDraw.Draw(image)
    _draw_diaphragms(draw, plan, model, level, marked_ids)
    _draw_walls(draw, plan, grey, _WALL_RGB, 2)
    _draw_walls(draw, plan, marked, HIGHLIGHT_RGB, 6)
    _draw_axes(draw, plan)
    _draw_scale_bar(draw, plan)
    out = io.BytesIO()
    image.save(out, format="PNG", optimize=False, compress_level=1)
    if len(_CACHE) > 4096 or (_CACHE and next(iter(_CACHE.values()))[0] is not model):
        _CACHE.clear()  # one model at a time; the BCF and the JSON share snapshots
    _CACHE[key] = (model, out.getvalue())
    return _CACHE[key][1]
