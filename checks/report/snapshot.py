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
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray
from PIL import Image, ImageDraw, ImageFont

from checks.errors import BcfError
from ifc_bridge.model import BuildingModel

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


@dataclass(frozen=True, slots=True)
class _Walls:
    """A model's wall segments as arrays, in model order (built once per model).

    Attributes:
        guids: GlobalId per row.
        levels: Level name -> rows of the segments supporting it, ascending.
        ends: Plan start and end per row, columns x0, y0, x1, y1 [m].
        thickness: Thickness per row [m].
    """

    guids: list[str]
    levels: dict[str, NDArray[np.intp]]
    ends: NDArray[np.float64]
    thickness: NDArray[np.float64]


_WALLS: dict[int, tuple[BuildingModel, _Walls]] = {}


def _walls_of(model: BuildingModel) -> _Walls:
    """The wall arrays of a model, built on its first snapshot."""
    hit = _WALLS.get(id(model))
    if hit is not None and hit[0] is model:
        return hit[1]
    rows: dict[str, list[int]] = {}
    for i, w in enumerate(model.walls):
        rows.setdefault(w.level, []).append(i)
    walls = _Walls(
        guids=[w.guid for w in model.walls],
        levels={k: np.asarray(v, dtype=np.intp) for k, v in rows.items()},
        ends=np.array(
            [(*w.start, *w.end) for w in model.walls], dtype=np.float64
        ).reshape(-1, 4),
        thickness=np.array([w.thickness for w in model.walls], dtype=np.float64),
    )
    _WALLS.clear()  # keep only the latest model alive
    _WALLS[id(model)] = (model, walls)
    return walls


def _walls_to_draw(
    walls: _Walls, level: str, highlight: set[str]
) -> tuple[NDArray[np.intp], NDArray[np.intp]]:
    """(grey rows, highlighted rows) of the story supporting ``level``, drawing order."""
    n = len(walls.guids)
    story = walls.levels.get(level, np.empty(0, np.intp)) if level else np.arange(n)
    lit = np.fromiter((g in highlight for g in walls.guids), dtype=bool, count=n)
    grey, marked = story[~lit[story]], story[lit[story]]
    # a finding may name a wall of another story (a discontinuity): draw it too
    found = {walls.guids[i] for i in marked.tolist()}
    in_story = np.zeros(n, dtype=bool)
    in_story[story] = True
    others = [
        i
        for i in np.flatnonzero(lit & ~in_story).tolist()
        if walls.guids[i] not in found
    ]
    return grey, np.concatenate([marked, np.asarray(others, dtype=np.intp)])


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

    def px_array(
        self, x: NDArray[np.float64], y: NDArray[np.float64]
    ) -> tuple[list[float], list[float]]:
        """:meth:`px` of many points, the same arithmetic element by element."""
        return (
            (self.w / 2.0 + (x - self.cx) * self.scale).tolist(),
            (self.h / 2.0 - (y - self.cy) * self.scale).tolist(),
        )


def _bounds(
    model: BuildingModel, level: str, ends: NDArray[np.float64]
) -> tuple[float, float, float, float]:
    """Plan box of the level's diaphragms and the wall ends drawn (x0, y0, x1, y1)."""
    xs: list[float] = []
    ys: list[float] = []
    for d in model.diaphragms_of(level):
        x0, y0, x1, y1 = d.polygon.bounds
        xs += [x0, x1]
        ys += [y0, y1]
    if len(ends):
        xs += [float(ends[:, ::2].min()), float(ends[:, ::2].max())]
        ys += [float(ends[:, 1::2].min()), float(ends[:, 1::2].max())]
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
    walls: tuple[NDArray[np.float64], NDArray[np.float64]],
    rgb: tuple[int, int, int],
    min_px: int,
) -> None:
    """Each wall a line as thick as the wall (at least ``min_px``), in row order.

    ``walls`` is (ends x0, y0, x1, y1 [m], thickness [m]) of the rows to draw.
    """
    ends, thickness = walls
    x0, y0 = plan.px_array(ends[:, 0], ends[:, 1])
    x1, y1 = plan.px_array(ends[:, 2], ends[:, 3])
    # round() and rint both round half to even
    widths = np.maximum(np.rint(thickness * plan.scale), min_px).astype(np.int64)
    line = draw.line
    for ax, ay, bx, by, width in zip(x0, y0, x1, y1, widths.tolist(), strict=True):
        line([(ax, ay), (bx, by)], fill=rgb, width=width)


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
    walls = _walls_of(model)
    grey, marked = _walls_to_draw(walls, level, marked_ids)
    drawn = np.concatenate([grey, marked])
    plan = _Plan(_bounds(model, level, walls.ends[drawn]), size)
    image = Image.new("RGB", size, _BACKGROUND)
    draw = ImageDraw.Draw(image)
    _draw_diaphragms(draw, plan, model, level, marked_ids)
    for rows, rgb, min_px in ((grey, _WALL_RGB, 2), (marked, HIGHLIGHT_RGB, 6)):
        _draw_walls(draw, plan, (walls.ends[rows], walls.thickness[rows]), rgb, min_px)
    _draw_axes(draw, plan)
    _draw_scale_bar(draw, plan)
    out = io.BytesIO()
    image.save(out, format="PNG", optimize=False, compress_level=1)
    if len(_CACHE) > 4096 or (_CACHE and next(iter(_CACHE.values()))[0] is not model):
        _CACHE.clear()  # one model at a time; the BCF and the JSON share snapshots
    _CACHE[key] = (model, out.getvalue())
    return _CACHE[key][1]
