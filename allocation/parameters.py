"""Analysis inputs in coherent SI, as ``checks.config`` builds them from the TOML file.

No pint here: the config parser converts every quantity once. Code coefficients keep
their code form (``SDS`` in g, ``R`` dimensionless).
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from enum import StrEnum

from allocation.errors import ParameterError

__all__ = [
    "AnalysisOptions",
    "AssemblyKind",
    "AssemblyProperties",
    "DeadLoads",
    "DiaphragmMethod",
    "Procedure",
    "SeismicParameters",
    "WallStiffness",
]


class Procedure(StrEnum):
    """How level forces are obtained."""

    ELF = "elf"  # ASCE 7-16 §12.8
    GIVEN = "given"  # user-given force per storey


class DiaphragmMethod(StrEnum):
    """Diaphragm idealisation for the force allocation (ASCE 7-16 §12.3.1)."""

    FLEXIBLE = "flexible"
    RIGID = "rigid"
    ENVELOPE = "envelope"


class WallStiffness(StrEnum):
    """How relative wall stiffness is taken in the rigid analysis."""

    LENGTH = "length"  # proportional to length (light-frame common practice)
    ASSEMBLY = "assembly"  # from the assembly's material model


class AssemblyKind(StrEnum):
    """Family of a wall assembly; selects the stiffness model and the checks."""

    WOOD_PANEL = "wood_structural_panel"
    GYPSUM = "gypsum_board"
    CONCRETE = "concrete"
    MASONRY = "masonry"
    OTHER = "other"


def _require(ok: bool, msg: str) -> None:
    if not ok:
        raise ParameterError(msg)


@dataclass(frozen=True, slots=True, kw_only=True)
class SeismicParameters:
    """Seismic design parameters of ASCE 7-16 chapters 11 and 12.

    Attributes:
        procedure: ELF or given level forces.
        SDS: Design spectral acceleration at short periods, §11.4.5 [g].
        SD1: Design spectral acceleration at 1 s, §11.4.5 [g].
        S1: Mapped MCE_R spectral acceleration at 1 s, §11.4.2 [g].
        TL: Long-period transition period, §11.4.6 [s].
        R: Response modification coefficient, Table 12.2-1 [-].
        Ie: Importance factor, Table 1.5-2 [-].
        Cd: Deflection amplification factor, Table 12.2-1 [-].
        omega0: Overstrength factor, Table 12.2-1 [-].
        Ct: Period coefficient, Table 12.8-2, in the SI form when ``hn`` is in m [-].
        x: Period exponent, Table 12.8-2 [-].
        period: Computed fundamental period, or None to use Ta [s].
        rho: Redundancy factor, §12.3.4 [-]; None lets the checks evaluate it.
        level_forces: Given story forces ``(storey name, Fx [N])`` for ``GIVEN``.
        base_level: Name of the level taken as the seismic base, or ``""`` for the
            lowest level.
    """

    procedure: Procedure = Procedure.ELF
    SDS: float = 0.0
    SD1: float = 0.0
    S1: float = 0.0
    TL: float = 8.0
    R: float = 1.0
    Ie: float = 1.0
    Cd: float = 1.0
    omega0: float = 1.0
    Ct: float = 0.0488
    x: float = 0.75
    period: float | None = None
    rho: float | None = None
    level_forces: tuple[tuple[str, float], ...] = ()
    base_level: str = ""

    def __post_init__(self) -> None:
        for name in ("SDS", "SD1", "S1", "TL", "R", "Ie", "Cd", "omega0", "Ct", "x"):
            v = getattr(self, name)
            _require(math.isfinite(v), f"seismic.{name} = {v} is not a finite number")
        _require(
            self.SDS >= 0 and self.SD1 >= 0 and self.S1 >= 0,
            f"seismic: SDS, SD1, S1 must be >= 0 g (got {self.SDS}, {self.SD1}, {self.S1})",
        )
        _require(
            self.R > 0 and self.Ie > 0,
            f"seismic: R = {self.R} and Ie = {self.Ie} must be > 0",
        )
        _require(
            self.TL > 0 and self.Ct > 0 and self.x > 0,
            f"seismic: TL, Ct and x must be > 0 (got {self.TL}, {self.Ct}, {self.x})",
        )
        if self.period is not None:
            _require(
                math.isfinite(self.period) and self.period > 0,
                f"seismic.period = {self.period} s must be > 0",
            )
        for name, force in self.level_forces:
            _require(
                math.isfinite(force) and force >= 0,
                f"seismic.level_forces.{name} = {force} N must be >= 0",
            )


@dataclass(frozen=True, slots=True, kw_only=True)
class DeadLoads:
    """Dead loads for seismic weight and overturning resistance.

    Attributes:
        floor: Floor dead load per plan area [Pa].
        roof: Roof dead load per plan area [Pa].
        wall: Wall dead load per wall elevation area [Pa]; an assembly may override.
        extra: Extra seismic weight per level ``(storey name, weight [N])``
            (partitions, equipment, snow where §12.7.2 requires it).
    """

    floor: float
    roof: float
    wall: float
    extra: tuple[tuple[str, float], ...] = ()

    def __post_init__(self) -> None:
        for name in ("floor", "roof", "wall"):
            v = getattr(self, name)
            _require(math.isfinite(v) and v >= 0, f"loads.{name} = {v} Pa must be >= 0")
        for name, w in self.extra:
            _require(
                math.isfinite(w) and w >= 0, f"loads.extra.{name} = {w} N must be >= 0"
            )


@dataclass(frozen=True, slots=True, kw_only=True)
class AssemblyProperties:
    """What the allocation needs of a wall assembly (capacity lives in ``checks``).

    Attributes:
        name: The project's label, from ``[[assemblies]]``.
        kind: Family; selects the stiffness model.
        wall_dead_load: Dead load per wall elevation area, or None for ``loads.wall`` [Pa].
        E: Elastic modulus for the cantilever pier model (concrete, masonry) [Pa].
        G: Shear modulus for the cantilever pier model [Pa].
        Ga: Apparent shear stiffness of wood structural panel walls, SDPWS [N/m].
        chord_EA: Axial stiffness E·A of a chord (end post) for SDPWS flexure term [N].
        hold_down_slip: Hold-down deformation at design load, SDPWS Δa [m].
        design_unit_shear: Unit shear at which ``hold_down_slip`` occurs (the design
            level); the SDPWS wall stiffness is the secant stiffness there [N/m].
    """

    name: str
    kind: AssemblyKind = AssemblyKind.OTHER
    wall_dead_load: float | None = None
    E: float | None = None
    G: float | None = None
    Ga: float | None = None
    chord_EA: float | None = None
    hold_down_slip: float | None = None
    design_unit_shear: float | None = None


@dataclass(frozen=True, slots=True, kw_only=True)
class AnalysisOptions:
    """Options of the force allocation.

    Attributes:
        diaphragm: Which idealisation(s) to run; ``ENVELOPE`` runs both.
        accidental_eccentricity: Fraction of the plan dimension, §12.8.4.2 [-].
        wall_stiffness: Relative stiffness basis in the rigid analysis.
        line_tolerance: Perpendicular offset within which walls form one line [m].
        angle_tolerance: Angle within which a wall is parallel to X or Y [rad].
        assemblies: Assembly properties by name.
        diaphragm_levels: Names of levels that carry a diaphragm; empty = every
            level with slabs above the base.
        amplify_torsion: Apply Ax of §12.8.4.3 where torsionally irregular.
    """

    diaphragm: DiaphragmMethod = DiaphragmMethod.ENVELOPE
    accidental_eccentricity: float = 0.05
    wall_stiffness: WallStiffness = WallStiffness.LENGTH
    line_tolerance: float = 0.5
    angle_tolerance: float = math.radians(10.0)
    assemblies: tuple[AssemblyProperties, ...] = field(default=())
    diaphragm_levels: tuple[str, ...] = ()
    amplify_torsion: bool = True

    def __post_init__(self) -> None:
        e = self.accidental_eccentricity
        _require(
            math.isfinite(e) and 0 <= e < 0.5,
            f"analysis.accidental_eccentricity = {e} must be in [0, 0.5)",
        )
        _require(
            math.isfinite(self.line_tolerance) and self.line_tolerance > 0,
            f"analysis.line_tolerance = {self.line_tolerance} m must be > 0",
        )
        a = self.angle_tolerance
        _require(
            math.isfinite(a) and 0 < a < math.pi / 4,
            f"analysis.angle_tolerance = {math.degrees(a):.3g} deg must be in (0, 45)",
        )

    def assembly(self, name: str) -> AssemblyProperties | None:
        """Properties of the named assembly, or None."""
        for a in self.assemblies:
            if a.name == name:
                return a
        return None
