"""In-plane unit shear capacity of a wall segment, per the project's design basis.

Light-frame assemblies carry a unit shear capacity resolved by ``checks.config`` (the
user's value, or the nominal unit shear of SDPWS with its ASD or LRFD factor). Concrete
walls get theirs from ACI 318-19 §18.10.4 and the segment's geometry. Everything is SI:
lengths [m], stresses [Pa], unit shears [N/m].
"""

from __future__ import annotations

import logging
import math

from allocation.parameters import AssemblyKind
from checks.assembly_library import allowable_unit_shear
from checks.project import Assembly, ConcreteParams, DesignBasis
from checks.units import Q_

__all__ = [
    "ASD_SEISMIC_FACTOR",
    "PHI_SHEAR_SPECIAL_WALL",
    "alpha_c",
    "concrete_nominal_shear_stress",
    "wall_unit_capacity",
]

logger = logging.getLogger(__name__)

PHI_SHEAR_SPECIAL_WALL = 0.60  # ACI 318-19 §21.2.4.1, from memory
# Common practice: ASCE 7-16 §2.4.5 ASD combinations carry 0.7E where the strength
# combinations of §2.3.6 carry 1.0E, so a strength phi*Vn compares with an ASD seismic
# shear as 0.7*phi*Vn.
ASD_SEISMIC_FACTOR = 0.7
_VN_CAP_COEFF = 10.0  # ACI 318-19 §18.10.4.4: Vn <= 10 Acv sqrt(f'c) psi, from memory
_PSI = float(Q_(1.0, "psi").m_as("Pa"))


def alpha_c(hw_lw: float) -> float:
    """Coefficient αc of the wall shear strength.

    ACI 318-19 §18.10.4.1: αc = 3.0 for hw/ℓw ≤ 1.5, 2.0 for hw/ℓw ≥ 2.0, linear between
    (coefficients of √f'c in psi).

    Args:
        hw_lw: Wall (or segment) height over length hw/ℓw; for a segment the greater
            of the whole wall's and the segment's ratio [-].

    Returns:
        αc [-].
    """
    if hw_lw <= 1.5:
        return 3.0
    if hw_lw >= 2.0:
        return 2.0
    return 3.0 - 2.0 * (hw_lw - 1.5)


def concrete_nominal_shear_stress(params: ConcreteParams, hw_lw: float) -> float:
    """Nominal shear strength per unit area Vn/Acv of a structural wall.

    ACI 318-19 §18.10.4.1: Vn = Acv·(αc·λ·√f'c + ρt·fy), evaluated in psi (√f'c in psi)
    and converted with pint; capped at 10·√f'c psi per segment (ACI 318-19 §18.10.4.4,
    coefficient from memory).

    Args:
        params: f'c and fy [Pa], ρt and λ [-].
        hw_lw: Height over length hw/ℓw [-].

    Returns:
        Vn/Acv [Pa].
    """
    fc_psi = params.fc / _PSI
    fy_psi = params.fy / _PSI
    root = math.sqrt(fc_psi)
    vn_psi = alpha_c(hw_lw) * params.lambda_ * root + params.rho_t * fy_psi
    vn_psi = min(vn_psi, _VN_CAP_COEFF * root)
    return float(Q_(vn_psi, "psi").m_as("Pa"))


def _concrete_unit_capacity(
    params: ConcreteParams,
    *,
    length: float,
    height: float,
    thickness: float,
    basis: DesignBasis,
) -> float | None:
    geometry = (length, height, thickness)
    if not all(math.isfinite(g) and g > 0 for g in geometry):
        logger.debug("concrete wall without usable geometry %s: no capacity", geometry)
        return None
    # Vn = Acv * vn with Acv = length * thickness, so Vn / length = thickness * vn.
    design = (
        PHI_SHEAR_SPECIAL_WALL
        * thickness
        * concrete_nominal_shear_stress(params, height / length)
    )
    if DesignBasis(basis) is DesignBasis.ASD:
        return ASD_SEISMIC_FACTOR * design
    return design


def wall_unit_capacity(
    assembly: Assembly,
    *,
    length: float,
    height: float,
    thickness: float,
    basis: DesignBasis,
) -> float | None:
    """Allowable (ASD) or design (LRFD) in-plane unit shear of a wall segment.

    The user's ``unit_shear_capacity`` always wins. Otherwise a nominal unit shear vs
    gives vs/2.0 (ASD) or 0.8·vs (LRFD) by AWC SDPWS 2015 §4.3.3, and a concrete
    assembly gives φ·Vn/ℓw by ACI 318-19 §18.10.4.1 with φ = 0.60 (ACI 318-19
    §21.2.4.1, taken for every special structural wall as the flexural strength is not
    known here); for ASD, 0.7·φ·Vn/ℓw (common practice, see ``ASD_SEISMIC_FACTOR``).
    The SDPWS aspect-ratio factor is not applied here (the aspect-ratio rule does it).

    Args:
        assembly: The wall's assembly, as ``checks.config`` resolved it.
        length: Segment (pier) length ℓw [m].
        height: Height hw for the aspect ratio hw/ℓw [m].
        thickness: Wall thickness, giving Acv = ℓw·thickness for concrete [m].
        basis: Design basis of the check.

    Returns:
        Unit shear capacity [N/m], or None when none can be determined (no capacity
        given, or a concrete wall without a positive length, height and thickness).
    """
    if assembly.capacity_source == "user" and assembly.unit_shear_capacity is not None:
        return float(assembly.unit_shear_capacity)
    if assembly.nominal_unit_shear is not None:
        return allowable_unit_shear(assembly.nominal_unit_shear, basis)
    if assembly.kind is AssemblyKind.CONCRETE and assembly.concrete is not None:
        return _concrete_unit_capacity(
            assembly.concrete,
            length=length,
            height=height,
            thickness=thickness,
            basis=basis,
        )
    if assembly.unit_shear_capacity is not None:
        return float(assembly.unit_shear_capacity)
    return None
