"""Factors of the seismic load combinations on E and on the dead load D.

E = Eh ± Ev with Eh = ρ·QE and Ev = 0.2·SDS·D (ASCE 7-16 §12.4.2). The strength (LRFD)
combinations are ASCE 7-16 §2.3.6, the allowable stress (ASD) ones §2.4.5.
"""

from __future__ import annotations

from checks.project import DesignBasis

__all__ = ["combination_clause", "counteracting_dead_factor", "seismic_factor"]


def seismic_factor(basis: DesignBasis) -> float:
    """Factor on ρ·QE in the seismic load combinations.

    ASCE 7-16 §2.4.5 (ASD combinations 8 and 10: 0.7·ρ·QE); §2.3.6 (LRFD
    combinations 6 and 7: 1.0·ρ·QE).

    Args:
        basis: Design basis.

    Returns:
        0.7 for ASD, 1.0 for LRFD [-].
    """
    return 0.7 if basis is DesignBasis.ASD else 1.0


def counteracting_dead_factor(basis: DesignBasis, SDS: float) -> float:
    """Factor on D where dead load counteracts E (overturning, uplift).

    ASCE 7-16 §2.4.5 combination 10: (0.6 − 0.14·SDS)·D (ASD);
    §2.3.6 combination 7: (0.9 − 0.2·SDS)·D (LRFD). The SDS term is the vertical
    seismic load effect Ev = 0.2·SDS·D of §12.4.2.2 (× 0.7 in ASD).

    Args:
        basis: Design basis.
        SDS: Design spectral acceleration at short periods [g].

    Returns:
        The factor on D [-]; may be below zero for an SDS no site has.
    """
    if basis is DesignBasis.ASD:
        return 0.6 - 0.14 * SDS
    return 0.9 - 0.2 * SDS


def combination_clause(basis: DesignBasis) -> str:
    """Clause of the seismic load combinations for the design basis."""
    return "ASCE 7-16 §2.4.5" if basis is DesignBasis.ASD else "ASCE 7-16 §2.3.6"
