"""Rules of ASCE 7-16: load combinations, unit shear and overturning of shear walls,
diaphragm demands (§12.10), irregularities (Tables 12.3-1 and 12.3-2), load path
(§12.1.3) and redundancy (§12.3.4).
"""

from __future__ import annotations

from checks.rules.asce7_16.diaphragm import check_diaphragm, diaphragm_demands
from checks.rules.asce7_16.discontinuity import check_discontinuity
from checks.rules.asce7_16.irregularities import (
    check_irregularities,
    check_reentrant_corners,
    check_torsional_irregularity,
    reentrant_corners,
)
from checks.rules.asce7_16.overturning import check_overturning, hold_down_forces
from checks.rules.asce7_16.redundancy import check_redundancy, evaluate_redundancy
from checks.rules.asce7_16.seismic_design_category import seismic_design_category
from checks.rules.asce7_16.unit_shear import (
    check_unit_shear,
    pier_capacity,
    pier_checks,
)

__all__ = [
    "check_diaphragm",
    "check_discontinuity",
    "check_irregularities",
    "check_overturning",
    "check_redundancy",
    "check_reentrant_corners",
    "check_torsional_irregularity",
    "check_unit_shear",
    "diaphragm_demands",
    "evaluate_redundancy",
    "hold_down_forces",
    "pier_capacity",
    "pier_checks",
    "reentrant_corners",
    "seismic_design_category",
]
