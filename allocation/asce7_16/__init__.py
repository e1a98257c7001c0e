"""ASCE 7-16 provisions that produce forces: ELF (§12.8), torsion, diaphragms (§12.10).

Modules are named by section; each function is one equation, named with the standard's
symbols. Rules that judge (irregularity findings, checks) live in ``checks.rules``.
"""

from __future__ import annotations

from allocation.asce7_16.s12_8_elf import (
    CS_FLOOR,
    GOVERNS_12_8_2,
    GOVERNS_12_8_3,
    GOVERNS_12_8_4,
    GOVERNS_12_8_5,
    GOVERNS_12_8_5_FLOOR,
    GOVERNS_12_8_6,
    TABLE_12_8_2,
    Cs_base,
    Cs_max,
    Cs_max_long,
    Cs_max_short,
    Cs_min,
    Cs_min_S1,
    Cu,
    Cvx,
    Fx,
    PeriodCoefficients,
    StructureType,
    Ta,
    V,
    Vx,
    k,
    period_used,
    seismic_response_coefficient,
)
from allocation.asce7_16.s12_8_torsion import (
    AX_MAX,
    AX_MIN,
    Ax,
    torsional_irregularity_type,
)
from allocation.asce7_16.s12_10_diaphragms import (
    GOVERNS_12_10_1,
    GOVERNS_12_10_2,
    GOVERNS_12_10_3,
    Fpx,
)

__all__ = [
    "AX_MAX",
    "AX_MIN",
    "CS_FLOOR",
    "GOVERNS_12_8_2",
    "GOVERNS_12_8_3",
    "GOVERNS_12_8_4",
    "GOVERNS_12_8_5",
    "GOVERNS_12_8_5_FLOOR",
    "GOVERNS_12_8_6",
    "GOVERNS_12_10_1",
    "GOVERNS_12_10_2",
    "GOVERNS_12_10_3",
    "TABLE_12_8_2",
    "Ax",
    "Cs_base",
    "Cs_max",
    "Cs_max_long",
    "Cs_max_short",
    "Cs_min",
    "Cs_min_S1",
    "Cu",
    "Cvx",
    "Fpx",
    "Fx",
    "PeriodCoefficients",
    "StructureType",
    "Ta",
    "V",
    "Vx",
    "k",
    "period_used",
    "seismic_response_coefficient",
    "torsional_irregularity_type",
]
