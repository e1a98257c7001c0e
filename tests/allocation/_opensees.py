"""OpenSeesPy as an independent solver for one story with a rigid diaphragm.

The ``openseespylinux`` wheel needs ``libblas.so.3`` and friends, which it bundles in
``openseespylinux/lib/`` but does not put on the loader path; preloading them with
``ctypes`` (dependencies first) makes ``import openseespy.opensees`` work. Tests call
:func:`opensees_or_skip`, which skips with the import error when that fails.

Model: a master node at the load point carries the story force (ux, uy, rz free);
each wall is a ``zeroLength`` spring of stiffness k along its direction between a
fixed base node and a top node at the wall's mid-point; ``rigidDiaphragm`` ties the
top nodes to the master in the plan (perpendicular direction Z).
"""

from __future__ import annotations

import ctypes
import importlib
import importlib.util
import os
from types import ModuleType

import pytest

_LIBS = (
    "libquadmath.so.0",
    "libgfortran.so.4",
    "libgomp.so.1",
    "libblas.so.3",
    "liblapack.so.3",
)  # order matters: each needs the ones before it

_cache: dict[str, ModuleType | str] = {}


def _load() -> ModuleType | str:
    """The ``openseespy.opensees`` module, or the reason it cannot be imported."""
    try:
        spec = importlib.util.find_spec("openseespylinux")
        if spec is not None and spec.origin is not None:
            libdir = os.path.join(os.path.dirname(spec.origin), "lib")
            for name in _LIBS:
                path = os.path.join(libdir, name)
                if os.path.isfile(path):
                    ctypes.CDLL(path, mode=ctypes.RTLD_GLOBAL)
        return importlib.import_module("openseespy.opensees")
    except Exception as exc:  # any import failure means: skip, with the reason
        return f"openseespy cannot be imported ({type(exc).__name__}: {exc})"


def opensees_or_skip() -> ModuleType:
    """The OpenSees module; skips the calling test when it cannot be imported."""
    if "ops" not in _cache:
        _cache["ops"] = _load()
    ops = _cache["ops"]
    if isinstance(ops, str):
        pytest.skip(ops)
    return ops


Wall = tuple[str, str, float, float, float]  # (name, "X"|"Y", x, y, k)


def solve_story(
    walls: list[Wall], *, Fx: float, Fy: float, at: tuple[float, float], h: float = 10.0
) -> tuple[dict[str, float], tuple[float, float, float]]:
    """Spring forces and the diaphragm motion for a force (Fx, Fy) applied at ``at``.

    Returns:
        Force per wall name, signed along +X / +Y, and (ux, uy, rz) of the master
        node at ``at`` (rz counter-clockwise).
    """
    ops = opensees_or_skip()
    ops.wipe()
    ops.model("basic", "-ndm", 3, "-ndf", 6)
    ops.node(1, at[0], at[1], h)
    ops.fix(1, 0, 0, 1, 1, 1, 0)
    tops = []
    for i, (_, d, xi, yi, k) in enumerate(walls):
        top, base = 100 + i, 100000 + i
        ops.node(top, xi, yi, h)
        ops.node(base, xi, yi, h)  # zeroLength needs coincident nodes
        ops.fix(top, 0, 0, 1, 1, 1, 0)
        ops.fix(base, 1, 1, 1, 1, 1, 1)
        ops.uniaxialMaterial("Elastic", 1 + i, k)
        ops.element(
            "zeroLength", 1 + i, base, top, "-mat", 1 + i, "-dir", 1 if d == "X" else 2
        )
        tops.append(top)
    ops.rigidDiaphragm(3, 1, *tops)
    ops.timeSeries("Linear", 1)
    ops.pattern("Plain", 1, 1)
    ops.load(1, Fx, Fy, 0.0, 0.0, 0.0, 0.0)
    ops.constraints("Transformation")
    ops.numberer("RCM")
    ops.system("UmfPack")
    ops.test("NormDispIncr", 1e-12, 10)
    ops.algorithm("Linear")
    ops.integrator("LoadControl", 1.0)
    ops.analysis("Static")
    if ops.analyze(1) != 0:
        pytest.fail("OpenSees static analysis did not converge")
    # element force at node j (the top), global components: index 6 = X, 7 = Y
    out = {
        name: float(ops.eleResponse(1 + i, "force")[6 if d == "X" else 7])
        for i, (name, d, *_rest) in enumerate(walls)
    }
    disp = ops.nodeDisp(1)
    ops.wipe()
    return out, (float(disp[0]), float(disp[1]), float(disp[5]))
