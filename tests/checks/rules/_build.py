"""Builders of small rule inputs, straight from the allocation and config records.

Invented layouts for the tests only; every expected number is computed by hand in the
test that uses it.
"""

from __future__ import annotations

from allocation.parameters import (
    AnalysisOptions,
    AssemblyKind,
    AssemblyProperties,
    DeadLoads,
    SeismicParameters,
)
from allocation.results import (
    Allocation,
    LevelLoad,
    LoadCase,
    Method,
    Pier,
    PierEnvelope,
    RigidResult,
    SeismicSummary,
)
from checks.project import Assembly, DesignBasis, DisplayUnits, ProjectConfig
from ifc_bridge.model import Direction
from ifc_bridge.shear_walls import MatchRule

PLF = 14.593903  # N/m per plf (1 lbf = 4.448222 N, 1 ft = 0.3048 m)
PSF = 47.880259  # Pa per psf


def assembly(
    name: str = "WSP",
    *,
    kind: AssemblyKind = AssemblyKind.WOOD_PANEL,
    capacity: float | None = 260 * PLF,
    blocked: bool = True,
    wall_dead_load: float | None = None,
) -> Assembly:
    return Assembly(
        name=name,
        kind=kind,
        match=MatchRule(assembly=name, type_name=f"{name}*"),
        properties=AssemblyProperties(
            name=name, kind=kind, wall_dead_load=wall_dead_load
        ),
        unit_shear_capacity=capacity,
        capacity_source="user" if capacity else "",
        blocked=blocked,
    )


def config(
    *,
    assemblies: tuple[Assembly, ...] = (),
    basis: DesignBasis = DesignBasis.ASD,
    SDS: float = 1.0,
    SD1: float = 0.6,
    S1: float = 0.6,
    rho: float | None = None,
    omega0: float = 3.0,
    wall: float = 10 * PSF,
) -> ProjectConfig:
    return ProjectConfig(
        path="test.toml",
        name="test",
        display_units=DisplayUnits.SI,
        seismic=SeismicParameters(
            SDS=SDS, SD1=SD1, S1=S1, R=6.5, Cd=4.0, omega0=omega0, rho=rho
        ),
        loads=DeadLoads(floor=15 * PSF, roof=20 * PSF, wall=wall),
        analysis=AnalysisOptions(assemblies=tuple(a.properties for a in assemblies)),
        design_basis=basis,
        assemblies=assemblies,
    )


def pier(
    guid: str,
    *,
    start: tuple[float, float],
    end: tuple[float, float],
    height: float = 2.5,
    level: str = "Roof",
    storey: str = "Ground",
    assembly: str = "WSP",
    line: str = "",
    index: int = 0,
) -> Pier:
    d = Direction.X if abs(end[0] - start[0]) >= abs(end[1] - start[1]) else Direction.Y
    length = ((end[0] - start[0]) ** 2 + (end[1] - start[1]) ** 2) ** 0.5
    return Pier(
        id=f"{guid}|{level}|0|{index}",
        guid=guid,
        name=f"W-{guid}",
        pier=index,
        part=0,
        level=level,
        storey=storey,
        direction=d,
        start=start,
        end=end,
        height=height,
        thickness=0.15,
        assembly=assembly,
        stiffness=length,
        line=line,
    )


def level(
    name: str = "Roof",
    *,
    guid: str = "storeyRoof",
    Fx: float = 100e3,
    Fpx: float = 100e3,
    Vx: float | None = None,
) -> LevelLoad:
    return LevelLoad(
        level=name,
        guid=guid,
        elevation=3.0,
        height=3.0,
        seismic_weight=Fx / 0.15,
        breakdown=(),
        story_force=Fx,
        story_shear=Fx if Vx is None else Vx,
        diaphragm_force=Fpx,
    )


def summary(V: float = 100e3) -> SeismicSummary:
    return SeismicSummary(
        procedure="elf",
        hn=3.0,
        Ta=0.2,
        T=0.2,
        Cu=1.4,
        Cs=0.15,
        Cs_governs="12.8-2",
        k=1.0,
        W=V / 0.15,
        V=V,
    )


def envelope(forces: dict[str, float]) -> dict[str, PierEnvelope]:
    return {
        pid: PierEnvelope(
            pier=pid,
            flexible=f,
            rigid=0.0,
            envelope=f,
            governing_method=Method.FLEXIBLE,
            governing_case="X",
        )
        for pid, f in forces.items()
    }


def rigid(
    level: str,
    direction: Direction,
    ratio: float,
    com: tuple[float, float] = (5.0, 5.0),
) -> RigidResult:
    return RigidResult(
        level=level,
        case=LoadCase(direction=direction, sign=1, ecc_sign=1),
        story_shear=100e3,
        center_of_mass=com,
        center_of_rigidity=com,
        eccentricity=0.0,
        accidental=0.5,
        Ax=1.0,
        torsion=0.0,
        J=1.0,
        pier_forces={},
        pier_direct={},
        drift_ratio_max=ratio,
    )


def allocation(
    piers=(),
    forces=None,
    *,
    levels=None,
    lines=(),
    flexible=(),
    rigid=(),
    conditions=(),
    V: float = 100e3,
) -> Allocation:
    return Allocation(
        seismic=summary(V),
        levels=tuple(levels or (level(),)),
        piers=tuple(piers),
        lines=tuple(lines),
        flexible=tuple(flexible),
        rigid=tuple(rigid),
        envelope=envelope(forces or {}),
        conditions=tuple(conditions),
    )
