"""Front door of the IFC reader: one IFC file in, one :class:`BuildingModel` out.

Reads the storeys as levels, the floor and roof slabs as diaphragms and every
IfcWall as story-high wall segments, then recognises the shear walls. A wall whose
body is one plumb extrusion of a straight-edged profile is read from its attributes
(:mod:`ifc_bridge._plain_body`: the kernel's mesh of it has the same vertices); all
other geometry is meshed in one pass of ifcopenshell's geometry iterator (manifold
kernel, falling back to opencascade, then to the direct-attribute extractor), run in
worker processes. SI units: metres, world X-Y plan, Z up.
"""

from __future__ import annotations

import logging
import os
from collections.abc import Callable, Sequence
from dataclasses import dataclass

import ifcopenshell

from ifc_bridge._diaphragms import build_diaphragms, underside_reach
from ifc_bridge._relations import (
    OpeningMaps,
    Relations,
    build_relations,
    opening_maps,
)
from ifc_bridge._semantics import wall_semantics
from ifc_bridge._shape_pass import PendingShapes, start_shapes
from ifc_bridge._step_text import raw_text_issue
from ifc_bridge._unfilled import unfilled_inserts, unfilled_issues
from ifc_bridge.errors import IfcContentError
from ifc_bridge.gc_pause import collection_paused
from ifc_bridge.model import BuildingModel
from ifc_bridge.open_file import open_ifc, raw_text_of, schema_name
from ifc_bridge.read_levels import StoreyLevels, read_levels
from ifc_bridge.read_slabs import read_slab_plans
from ifc_bridge.read_walls import prepare_walls, read_walls
from ifc_bridge.shear_walls import MatchRule
from ifc_bridge.units import length_unit_scale

__all__ = ["StartedRead", "read_model", "read_model_file", "start_read"]

_LOG = logging.getLogger(__name__)

Progress = Callable[[str, int, int], None]


def _others(
    ifc: ifcopenshell.file,
    walls: Sequence[ifcopenshell.entity_instance],
    openings: OpeningMaps,
    inserts: Sequence[ifcopenshell.entity_instance],
) -> list:
    """What the kernel meshes besides walls: slabs, openings, unfilled inserts."""
    slabs = ifc.by_type("IfcSlab")
    roofs = ifc.by_type("IfcRoof")
    voids = []
    for host in (*walls, *slabs, *roofs):
        voids.extend(openings.voids.get(host.id(), ()))
    return [*slabs, *voids, *inserts]


def _project(ifc: ifcopenshell.file) -> tuple[str, str]:
    projects = ifc.by_type("IfcProject")
    if not projects:
        return "", ""
    return projects[0].Name or "", projects[0].GlobalId


@dataclass(frozen=True, slots=True, kw_only=True)
class StartedRead:
    """A read begun: units, storeys and relations known, the geometry pass running.

    Attributes:
        ifc: The open file.
        scale: Length unit scale [m per file unit].
        storeys: The storeys read as levels.
        walls: Every IfcWall, file order.
        relations: The file's relationship maps.
        inserts: Doors and windows that fill no opening.
        shapes: The geometry passes under way (:func:`start_shapes`): wall axes,
            plain wall bodies and the kernel's meshes of the rest.
    """

    ifc: ifcopenshell.file
    scale: float
    storeys: StoreyLevels
    walls: tuple[ifcopenshell.entity_instance, ...]
    relations: Relations
    inserts: tuple[ifcopenshell.entity_instance, ...]
    shapes: PendingShapes

    def cancel(self) -> None:
        """Stop the geometry workers (the read failed or is over)."""
        self.shapes.cancel()


def start_read(ifc: ifcopenshell.file, source: str) -> StartedRead:
    """Check what every read needs and start the geometry pass in workers.

    Common practice: the kernel pass needs only the open file, so a caller can start
    it first and load its config, modules and requirements meanwhile (then pass the
    result to :func:`read_model_file`).

    Args:
        ifc: The open file.
        source: Its path, for messages.

    Returns:
        The started read; call ``cancel()`` if it is not handed to
        :func:`read_model_file`.

    Raises:
        IfcContentError: No storeys, a storey without elevation, or no walls.
        UnitsError: The length unit cannot be converted.
    """
    scale = length_unit_scale(ifc, source)
    storeys = read_levels(ifc, source, scale=scale)
    walls = tuple(ifc.by_type("IfcWall"))
    if not walls:
        msg = f"{source}: has no IfcWall; model the walls as IfcWall (not proxies)"
        raise IfcContentError(msg)
    # the openings' maps are all the geometry pass needs: it starts before the
    # other relationships (containment, types, materials, properties) are read
    openings = opening_maps(ifc)
    inserts = tuple(unfilled_inserts(ifc, openings))
    shapes = start_shapes(ifc, walls, _others(ifc, walls, openings, inserts), scale)
    try:
        relations = build_relations(ifc, openings)
    except BaseException:
        shapes.cancel()
        raise
    return StartedRead(
        ifc=ifc,
        scale=scale,
        storeys=storeys,
        walls=walls,
        relations=relations,
        inserts=inserts,
        shapes=shapes,
    )


def read_model(
    path: str | os.PathLike[str],
    *,
    rules: Sequence[MatchRule] = (),
    use_predefined_type: bool = True,
    diaphragm_storeys: Sequence[str] = (),
    progress: Progress | None = None,
) -> BuildingModel:
    """Read an IFC file into the structural model.

    Common practice: levels from IfcBuildingStorey, diaphragms from FLOOR / ROOF /
    BASESLAB slabs, walls from IfcWall; shear walls by PredefinedType SHEAR or the
    config's assembly match rules
    (:func:`ifc_bridge.shear_walls.recognise_shear_walls`).

    Args:
        path: IFC-SPF file (IFC2X3, IFC4, IFC4X3).
        rules: Assembly match rules, in config order.
        use_predefined_type: Treat PredefinedType SHEAR as a shear wall.
        diaphragm_storeys: Storey names that are diaphragm levels; empty: every
            storey with a floor or roof slab.
        progress: Optional ``(stage, done, total)`` callback.

    Returns:
        The building model [SI: m].

    Raises:
        IfcFileError: The file is missing, not IFC-SPF, truncated or unparsable.
        IfcSchemaError: The schema is not IFC2X3, IFC4 or IFC4X3.
        IfcContentError: No storeys, no walls, a storey without elevation, or an
            unknown name in ``diaphragm_storeys``.
        UnitsError: The length unit cannot be converted.
    """
    with collection_paused():
        return read_model_file(
            open_ifc(path),
            str(path),
            rules=rules,
            use_predefined_type=use_predefined_type,
            diaphragm_storeys=diaphragm_storeys,
            progress=progress,
        )


def read_model_file(
    ifc: ifcopenshell.file,
    source: str,
    *,
    rules: Sequence[MatchRule] = (),
    use_predefined_type: bool = True,
    diaphragm_storeys: Sequence[str] = (),
    progress: Progress | None = None,
    started: StartedRead | None = None,
) -> BuildingModel:
    """:func:`read_model` of a file already opened with :func:`open_ifc`.

    Common practice: as :func:`read_model`; lets a caller that needs the open file
    for more (requirement checks, GlobalId checks) parse it once.

    Args:
        ifc: The open file.
        source: Its path, for messages and ``BuildingModel.source``.
        rules: Assembly match rules, in config order.
        use_predefined_type: Treat PredefinedType SHEAR as a shear wall.
        diaphragm_storeys: As :func:`read_model`.
        progress: Optional ``(stage, done, total)`` callback.
        started: The geometry pass already started on ``ifc`` by
            :func:`start_read` (it is used up); None: start it here.

    Returns:
        The building model [SI: m].

    Raises:
        IfcContentError: As :func:`read_model`.
        UnitsError: The length unit cannot be converted.
    """
    if progress is not None:
        progress("open", 1, 1)
    if started is not None and started.ifc is not ifc:
        started.cancel()  # begun on another file: of no use here
        started = None
    if started is None:
        started = start_read(ifc, source)
    scale, storeys, walls = started.scale, started.storeys, started.walls
    relations, inserts = started.relations, started.inserts
    cache: dict = {}
    try:
        # the walls' properties are read here while the workers run the geometry
        semantics = [wall_semantics(w, scale, relations) for w in walls]
        shapes, meshes = started.shapes.result()
    finally:
        started.cancel()
    prepared = prepare_walls(
        walls,
        scale=scale,
        cache=cache,
        relations=relations,
        shapes=shapes,
        semantics=semantics,
    )
    if progress is not None:
        progress("geometry", len(meshes), len(meshes))
    plans, slab_issues = read_slab_plans(
        ifc, source, scale=scale, levels=storeys, meshes=meshes, cache=cache
    )
    levels, diaphragms, dia_issues = build_diaphragms(
        plans, storeys.levels, diaphragm_storeys=diaphragm_storeys, path=source
    )
    if progress is not None:
        progress("slabs", len(plans), len(plans))
    read = read_walls(
        ifc,
        source,
        scale=scale,
        levels=levels,
        name_of=storeys.name_of,
        meshes=meshes,
        cache=cache,
        reach=underside_reach(diaphragms, plans, levels),
        relations=relations,
        prepared=prepared,
        rules=rules,
        use_predefined_type=use_predefined_type,
    )
    if progress is not None:
        progress("walls", len(walls), len(walls))
    insert_issues = unfilled_issues(
        inserts,
        read.plans,
        meshes=meshes,
        scale=scale,
        cache=cache,
        path=source,
    )
    segments = read.segments
    name, guid = _project(ifc)
    text_issue = raw_text_issue(raw_text_of(ifc), ifc, source)
    issues = (
        *((text_issue,) if text_issue is not None else ()),
        *storeys.issues,
        *slab_issues,
        *dia_issues,
        *read.issues,
        *insert_issues,
    )
    _LOG.info(
        "%s: %d levels, %d diaphragms, %d wall segments, %d issues",
        source,
        len(levels),
        len(diaphragms),
        len(segments),
        len(issues),
    )
    return BuildingModel(
        source=source,
        schema=schema_name(ifc),
        project_name=name,
        project_guid=guid,
        length_unit_scale=scale,
        levels=levels,
        diaphragms=diaphragms,
        walls=segments,
        ifc_wall_count=len(walls),
        issues=issues,
        storey_guids=tuple((lv.name, lv.guid) for lv in levels),
        wall_storeys=read.wall_storeys,
    )
