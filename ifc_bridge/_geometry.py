"""Triangulated bodies of walls, slabs and openings in one geometry-iterator pass.

World coordinates, metres (ifcopenshell's iterator output is SI), Z up. Openings are
not subtracted from their hosts (``disable-opening-subtractions``): the readers take
the opening bodies separately, so opening intervals along a wall are exact.

Kernels are tried in order ``manifold`` (fastest, LIBRARY-NOTES §3.2), then
``opencascade``; an element that no kernel meshes is returned as missing, and the
readers fall back to the direct-attribute extractor (:mod:`ifc_bridge._direct`).
"""

from __future__ import annotations

import logging
from collections.abc import Callable, Sequence
from dataclasses import dataclass

import ifcopenshell
import ifcopenshell.geom
import numpy as np
import shapely
import shapely.affinity
from numpy.typing import NDArray
from shapely.geometry import MultiPolygon, Polygon

from ifc_bridge import worker
from ifc_bridge.worker import PARALLEL_MIN, can_fork

__all__ = [
    "KERNELS",
    "MAX_MESH_WORKERS",
    "Mesh",
    "mesh_elements",
    "mesh_footprint",
    "mesh_packed",
    "mesh_workers",
    "unpack_meshes",
]

_LOG = logging.getLogger(__name__)

KERNELS = ("manifold", "opencascade")

# More workers than this gain little: the pass is then bound by the merge and memory.
MAX_MESH_WORKERS = 4

Progress = Callable[[str, int, int], None]


@dataclass(frozen=True, slots=True, kw_only=True)
class Mesh:
    """A triangulated body in world coordinates.

    Attributes:
        verts: Vertex coordinates, shape (n, 3) [m].
        faces: Vertex indices of triangles, shape (m, 3) [-].
        kernel: Geometry library that produced it.
    """

    verts: NDArray[np.float64]
    faces: NDArray[np.int64]
    kernel: str

    @property
    def zmin(self) -> float:
        """Lowest z [m]."""
        return float(self.verts[:, 2].min())

    @property
    def zmax(self) -> float:
        """Highest z [m]."""
        return float(self.verts[:, 2].max())


def _settings() -> ifcopenshell.geom.settings:
    s = ifcopenshell.geom.settings()
    s.set("use-world-coords", True)
    s.set("disable-opening-subtractions", True)
    return s


def _valid(verts: NDArray[np.float64]) -> bool:
    return len(verts) > 0 and bool(np.isfinite(verts).all())


class _Batch:
    """Meshes gathered as raw kernel buffers, joined into flat arrays once at the end.

    A per-shape numpy array costs more than the kernel's own work on a small wall;
    the buffers are joined and checked in a few vectorised calls instead.
    """

    __slots__ = ("faces", "ids", "kernels", "seen", "verts")

    def __init__(self) -> None:
        self.ids: list[int] = []
        self.kernels: list[str] = []
        self.verts: list[bytes] = []
        self.faces: list[bytes] = []
        self.seen: set[int] = set()

    def add(self, key: int, verts: bytes, faces: bytes, kernel: str) -> None:
        if key in self.seen:
            return
        self.seen.add(key)
        self.ids.append(key)
        self.kernels.append(kernel)
        self.verts.append(verts)
        self.faces.append(faces)

    def packed(self) -> dict:
        """Flat arrays (pickle fast: no per-mesh objects); invalid bodies dropped."""
        nv = np.fromiter((len(b) // 24 for b in self.verts), np.int64, len(self.ids))
        nf = np.fromiter((len(b) // 12 for b in self.faces), np.int64, len(self.ids))
        verts = np.frombuffer(b"".join(self.verts), dtype=np.float64).reshape(-1, 3)
        faces = np.frombuffer(b"".join(self.faces), dtype=np.int32).reshape(-1, 3)
        owner = np.repeat(np.arange(len(nv)), nv)
        bad = np.bincount(owner[~np.isfinite(verts).all(axis=1)], minlength=len(nv))
        keep = (nv > 0) & (bad == 0)
        if not keep.all():
            vkeep = np.repeat(keep, nv)
            fkeep = np.repeat(keep, nf)
            verts, faces, nv, nf = verts[vkeep], faces[fkeep], nv[keep], nf[keep]
        kernels = [k for k, ok in zip(self.kernels, keep.tolist(), strict=True) if ok]
        return {
            "ids": np.asarray(self.ids, dtype=np.int64)[keep],
            "kernels": kernels,
            "nv": nv,
            "nf": nf,
            "verts": verts,
            "faces": faces,
        }


def _run_iterator(
    ifc: ifcopenshell.file,
    elements: Sequence[ifcopenshell.entity_instance],
    kernel: str,
    progress: Progress | None,
    batch: _Batch,
) -> None:
    it = ifcopenshell.geom.iterator(
        _settings(), ifc, 1, include=list(elements), geometry_library=kernel
    )
    total = len(elements)
    if not it.initialize():
        return
    done = 0
    while True:
        shape = it.get()
        geometry = shape.geometry
        # buffers are far faster than the tuple properties (ifcopenshell.util.shape)
        batch.add(shape.id, geometry.verts_buffer, geometry.faces_buffer, kernel)
        done += 1
        if progress is not None and done % 200 == 0:
            progress("geometry", done, total)
        if not it.next():
            break


def _mesh_one(element: ifcopenshell.entity_instance, kernel: str) -> Mesh | None:
    try:
        shape = ifcopenshell.geom.create_shape(
            _settings(), element, geometry_library=kernel
        )
    except Exception as exc:  # ifcopenshell raises bare Exception when a body fails
        _LOG.debug("%s: %s failed: %s", element.GlobalId, kernel, exc)
        return None
    geometry = getattr(shape, "geometry", shape)
    verts = np.frombuffer(geometry.verts_buffer, dtype=np.float64).reshape(-1, 3)
    faces = np.frombuffer(geometry.faces_buffer, dtype=np.int32).reshape(-1, 3)
    if not _valid(verts):
        return None
    return Mesh(verts=verts.copy(), faces=faces.astype(np.int64), kernel=kernel)


def mesh_packed(
    ifc: ifcopenshell.file,
    elements: Sequence[ifcopenshell.entity_instance],
    progress: Progress | None = None,
) -> dict:
    """:func:`mesh_elements` as flat arrays (what a worker sends back)."""
    batch = _Batch()
    for kernel in KERNELS:
        try:
            _run_iterator(ifc, elements, kernel, progress, batch)
        except Exception as exc:  # a kernel that fails the whole pass: try the next
            _LOG.warning("geometry kernel %s failed (%s); trying the next", kernel, exc)
            continue
        if batch.ids:
            break
    packed = batch.packed()
    have = set(packed["ids"].tolist())
    extra = _Batch()
    for element in elements:
        if element.id() in have:
            continue
        for kernel in KERNELS[1:]:
            mesh = _mesh_one(element, kernel)
            if mesh is not None:
                faces = mesh.faces.astype(np.int32)
                extra.add(element.id(), mesh.verts.tobytes(), faces.tobytes(), kernel)
                break
    if extra.ids:
        packed = _concat(packed, extra.packed())
    if progress is not None:
        progress("geometry", len(elements), len(elements))
    return packed


def _concat(a: dict, b: dict) -> dict:
    return {
        "ids": np.concatenate([a["ids"], b["ids"]]),
        "kernels": [*a["kernels"], *b["kernels"]],
        "nv": np.concatenate([a["nv"], b["nv"]]),
        "nf": np.concatenate([a["nf"], b["nf"]]),
        "verts": np.concatenate([a["verts"], b["verts"]]),
        "faces": np.concatenate([a["faces"], b["faces"]]),
    }


def unpack_meshes(data: dict) -> dict[int, Mesh]:
    """Meshes by entity id from :func:`mesh_packed`'s flat arrays."""
    if len(data["ids"]) == 0:
        return {}
    cuts_v = np.cumsum(data["nv"])[:-1]
    verts = np.split(np.array(data["verts"], dtype=np.float64), cuts_v)
    faces = np.split(data["faces"].astype(np.int64), np.cumsum(data["nf"])[:-1])
    return {
        int(i): Mesh(verts=v, faces=f, kernel=k)
        for i, v, f, k in zip(
            data["ids"].tolist(), verts, faces, data["kernels"], strict=True
        )
    }


def mesh_elements(
    ifc: ifcopenshell.file,
    elements: Sequence[ifcopenshell.entity_instance],
    *,
    progress: Progress | None = None,
) -> dict[int, Mesh]:
    """Mesh the elements, keyed by entity id; elements no kernel can mesh are absent.

    Common practice: one iterator pass with the fastest kernel, then the slower,
    more tolerant kernel element by element for what the first one missed.

    Args:
        ifc: The open file.
        elements: Walls, slabs, openings (and unfilled doors/windows) to mesh.
        progress: Optional ``(stage, done, total)`` callback.

    Returns:
        Meshes in world coordinates [m].
    """
    if not elements:
        return {}
    return unpack_meshes(mesh_packed(ifc, elements, progress))


def mesh_footprint(mesh: Mesh, *, up_only: bool) -> Polygon | MultiPolygon:
    """Plan projection of a mesh: union of its (up-facing) triangles.

    Common practice: the footprint of a slab is what is seen from above; the plan
    of a solid (an opening body) is the projection of all its non-vertical faces.
    Coordinates are shifted to a local origin during the union, so georeferenced
    models (1e6 m from the origin) keep their precision.

    Args:
        mesh: World-coordinate mesh [m].
        up_only: Keep only triangles whose normal points up.

    Returns:
        Plan polygon in world X-Y [m]; empty when no face qualifies.
    """
    origin = mesh.verts[0, :2].copy()
    v = mesh.verts - np.array([origin[0], origin[1], 0.0])
    tri = v[mesh.faces]
    normal = np.cross(tri[:, 1] - tri[:, 0], tri[:, 2] - tri[:, 0])
    norm = np.linalg.norm(normal, axis=1)
    ok = norm > 1e-12
    nz = np.zeros(len(tri))
    nz[ok] = normal[ok, 2] / norm[ok]
    keep = nz > 0.01 if up_only else np.abs(nz) > 0.01
    flat = tri[keep][:, :, :2]
    if len(flat) == 0:
        return Polygon()
    polys = shapely.polygons(flat)
    polys = polys[shapely.area(polys) > 1e-12]
    union = shapely.union_all(polys)
    return shapely.affinity.translate(union, float(origin[0]), float(origin[1]))


def mesh_workers(count: int) -> int:
    """How many geometry workers share ``count`` elements (0: mesh in this process).

    One per usable core, at most ``MAX_MESH_WORKERS``, each with ``PARALLEL_MIN``
    elements or more: on the 10,000-wall benchmark two workers on two cores mesh
    in 0.57 of the time of one (``benchmarks/``).
    """
    if count < PARALLEL_MIN or not can_fork():
        return 0
    return max(1, min(worker.usable_cpus(), MAX_MESH_WORKERS, count // max(PARALLEL_MIN, 1)))
