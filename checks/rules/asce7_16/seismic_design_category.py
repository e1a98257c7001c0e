"""Seismic design category from SDS, SD1, S1 and the risk category implied by Ie.

ASCE 7-16 §11.6 with Tables 11.6-1 and 11.6-2 (thresholds from memory). The risk
category is taken from the importance factor of Table 1.5-2 (Ie = 1.0: I or II,
1.25: III, 1.5: IV), which is all the config says about it.
"""

from __future__ import annotations

from dataclasses import dataclass

from allocation.parameters import SeismicParameters

__all__ = ["SeismicDesignCategory", "seismic_design_category"]

_ORDER = "ABCDEF"
# (upper bound of the range, category for RC I-III, category for RC IV), from memory
_TABLE_11_6_1 = (
    (0.167, "A", "A"),
    (0.33, "B", "C"),
    (0.50, "C", "D"),
    (float("inf"), "D", "D"),
)
_TABLE_11_6_2 = (
    (0.067, "A", "A"),
    (0.133, "B", "C"),
    (0.20, "C", "D"),
    (float("inf"), "D", "D"),
)


@dataclass(frozen=True, slots=True, kw_only=True)
class SeismicDesignCategory:
    """The seismic design category used by the checks.

    Attributes:
        sdc: ``"A"`` to ``"F"``.
        risk_category: ``"II"``, ``"III"`` or ``"IV"`` (from Ie).
        assumed: True when SDS, SD1 and S1 are all zero (given level forces) and
            SDC D is assumed.
    """

    sdc: str
    risk_category: str
    assumed: bool = False

    def at_least(self, letter: str) -> bool:
        """True when the category is ``letter`` or more severe."""
        return _ORDER.index(self.sdc) >= _ORDER.index(letter)


def _lookup(table: tuple, value: float, rc_iv: bool) -> str:
    for bound, low, high in table:
        if value < bound:
            return high if rc_iv else low
    return "D"  # pragma: no cover - the last bound is infinite


def seismic_design_category(seismic: SeismicParameters) -> SeismicDesignCategory:
    """Seismic design category of the structure.

    ASCE 7-16 §11.6: the more severe of Table 11.6-1 (SDS) and Table 11.6-2 (SD1);
    E (RC I-III) or F (RC IV) where S1 ≥ 0.75 g. Where no spectral value is given
    (all zero, as with given level forces), SDC D is assumed and flagged.

    Args:
        seismic: Seismic parameters; SDS, SD1, S1 [g], Ie [-].

    Returns:
        The category, the risk category used and whether it was assumed.
    """
    rc = (
        "II"
        if seismic.Ie <= 1.0 + 1e-9
        else ("III" if seismic.Ie <= 1.25 + 1e-9 else "IV")
    )
    if seismic.SDS == 0.0 and seismic.SD1 == 0.0 and seismic.S1 == 0.0:
        return SeismicDesignCategory(sdc="D", risk_category=rc, assumed=True)
    rc_iv = rc == "IV"
    if seismic.S1 >= 0.75:
        return SeismicDesignCategory(sdc="F" if rc_iv else "E", risk_category=rc)
    a = _lookup(_TABLE_11_6_1, seismic.SDS, rc_iv)
    b = _lookup(_TABLE_11_6_2, seismic.SD1, rc_iv)
    return SeismicDesignCategory(sdc=max(a, b, key=_ORDER.index), risk_category=rc)
