"""The project configuration as the checks use it, in SI (built by ``checks.config``).

Plain frozen records; ``checks.config.load_config`` parses the TOML file into them with
pint, so nothing here knows about units.
"""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum

from allocation.parameters import (
    AnalysisOptions,
    AssemblyKind,
    AssemblyProperties,
    DeadLoads,
    SeismicParameters,
)
from ifc_bridge.shear_walls import MatchRule

__all__ = [
    "Assembly",
    "ConcreteParams",
    "DesignBasis",
    "DisplayUnits",
    "ProjectConfig",
]


class DesignBasis(StrEnum):
    """Design basis of the capacities and of the seismic load combinations."""

    ASD = "ASD"  # ASCE 7-16 §2.4.5: 0.7 rho QE
    LRFD = "LRFD"  # ASCE 7-16 §2.3.6: 1.0 rho QE


class DisplayUnits(StrEnum):
    """Units of the human-readable outputs; JSON files are always SI."""

    IMPERIAL = "imperial"
    SI = "si"


@dataclass(frozen=True, slots=True, kw_only=True)
class ConcreteParams:
    """Inputs of the ACI 318-19 §18.10.4 wall shear strength.

    Attributes:
        fc: Specified compressive strength f'c [Pa].
        fy: Yield strength of the horizontal reinforcement [Pa].
        rho_t: Horizontal (transverse) reinforcement ratio [-].
        lambda_: Lightweight concrete factor [-].
    """

    fc: float
    fy: float
    rho_t: float
    lambda_: float = 1.0


@dataclass(frozen=True, slots=True, kw_only=True)
class Assembly:
    """A wall assembly of the project: how to find its walls and what it resists.

    Attributes:
        name: The project's label.
        kind: Family (wood structural panel, gypsum, concrete, ...).
        match: The rule that finds its IFC walls.
        properties: What the allocation needs (dead load, stiffness inputs).
        unit_shear_capacity: Allowable (ASD) or design (LRFD) unit shear per the
            design basis, resolved from the user's value or the library [N/m];
            None for concrete (depends on the pier) or when nothing was given.
        nominal_unit_shear: Nominal seismic unit shear vs, SDPWS Table 4.3A [N/m],
            when known.
        capacity_source: Where the capacity came from (``"user"``, a table name
            marked from memory, ``"ACI 318-19 §18.10.4"``).
        concrete: Concrete inputs, for ``kind == CONCRETE``.
        blocked: Wood panels: blocked edges (aspect ratio limit 3.5 vs 2.0).
        aspect_ratio_limit: h/b limit override, or None for the code default.
    """

    name: str
    kind: AssemblyKind
    match: MatchRule
    properties: AssemblyProperties
    unit_shear_capacity: float | None = None
    nominal_unit_shear: float | None = None
    capacity_source: str = ""
    concrete: ConcreteParams | None = None
    blocked: bool = True
    aspect_ratio_limit: float | None = None


@dataclass(frozen=True, slots=True, kw_only=True)
class ProjectConfig:
    """Everything the TOML file says, in SI.

    Attributes:
        path: Path of the config file.
        name: Project name.
        display_units: Units of human-readable outputs.
        author: Author of BCF topics and comments.
        seismic: Seismic parameters.
        loads: Dead loads.
        analysis: Allocation options (assemblies' properties included).
        design_basis: ASD or LRFD.
        assemblies: Assemblies in config order.
        use_predefined_type: PredefinedType SHEAR marks a shear wall.
        bcf_version: ``"2.1"`` or ``"3.0"``.
    """

    path: str
    name: str
    display_units: DisplayUnits = DisplayUnits.IMPERIAL
    author: str = "shearline@example.com"
    seismic: SeismicParameters
    loads: DeadLoads
    analysis: AnalysisOptions
    design_basis: DesignBasis = DesignBasis.ASD
    assemblies: tuple[Assembly, ...] = ()
    use_predefined_type: bool = True
    bcf_version: str = "2.1"

    @property
    def match_rules(self) -> tuple[MatchRule, ...]:
        """Assembly match rules in config order."""
        return tuple(a.match for a in self.assemblies)

    def assembly(self, name: str) -> Assembly | None:
        """The named assembly, or None."""
        for a in self.assemblies:
            if a.name == name:
                return a
        return None
