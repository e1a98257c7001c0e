"""The starter assembly library (``checks/data/assemblies.toml``) and its look-ups.

The library holds nominal seismic unit shears vs of common wood structural panel and
gypsum board shear walls (AWC SDPWS 2015 Tables 4.3A and 4.3C) and default inputs for
concrete walls. Every value in it was recalled from memory and is marked so; the user's
``unit_shear_capacity`` always wins. Values are returned in SI (N/m, m, Pa).
"""

from __future__ import annotations

import logging
import math
import re
import tomllib
from dataclasses import dataclass
from functools import cache
from importlib import resources
from typing import Any

from allocation.parameters import AssemblyKind
from checks.errors import ConfigError
from checks.project import ConcreteParams, DesignBasis
from checks.units import Q_

__all__ = [
    "LIBRARY_PATH",
    "LibraryEntry",
    "allowable_unit_shear",
    "concrete_defaults",
    "concrete_moduli",
    "find_entry",
    "library_entries",
    "nominal_unit_shear",
]

logger = logging.getLogger(__name__)

LIBRARY_PATH = "checks/data/assemblies.toml"
_IN = float(Q_(1.0, "inch").m_as("m"))
_PLF = float(Q_(1.0, "plf").m_as("N/m"))
_PSI = float(Q_(1.0, "psi").m_as("Pa"))
_SPACING_TOL = 1.0e-3  # [m]: spacings within 1 mm are the same tabulated spacing
_KINDS = {
    "wood_structural_panel": AssemblyKind.WOOD_PANEL,
    "gypsum_board": AssemblyKind.GYPSUM,
}


@dataclass(frozen=True, slots=True, kw_only=True)
class LibraryEntry:
    """One tabulated nominal unit shear.

    Attributes:
        kind: Assembly family.
        sheathing: Sheathing as the library spells it, e.g. ``"15/32 Structural I"``.
        fastener: Fastener, e.g. ``"10d common"``.
        blocked: Blocked panel edges.
        edge_spacing: Fastener spacing at panel edges [m].
        nominal_unit_shear: Nominal seismic unit shear vs [N/m].
        source: Table it comes from, e.g. ``"SDPWS 2015 Table 4.3A"``.
        verified: False while the value is recalled from memory.
    """

    kind: AssemblyKind
    sheathing: str
    fastener: str
    blocked: bool
    edge_spacing: float
    nominal_unit_shear: float
    source: str
    verified: bool

    @property
    def label(self) -> str:
        """Human-readable description, e.g. for ``Assembly.capacity_source``."""
        spacing_in = self.edge_spacing / _IN
        state = "blocked" if self.blocked else "unblocked"
        memory = "" if self.verified else ", from memory"
        return (
            f"{self.source}{memory}: {self.sheathing}, {self.fastener}, "
            f"{spacing_in:g} in edge spacing, {state}"
        )


def _norm(text: str) -> str:
    text = text.casefold().replace('"', " ").replace("″", " ")
    text = re.sub(r"(\d+/\d+)\s*(?:in\.?|inch(?:es)?)(?=\s|$)", r"\1", text)
    return " ".join(text.split())


@cache
def _library() -> dict[str, Any]:
    text = resources.files("checks").joinpath("data/assemblies.toml").read_text("utf-8")
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        msg = f"{LIBRARY_PATH}: not valid TOML ({exc})"
        raise ConfigError(msg) from exc


@cache
def library_entries() -> tuple[LibraryEntry, ...]:
    """Every tabulated nominal unit shear of the starter library, in file order.

    AWC SDPWS 2015 Table 4.3A and Table 4.3C (values from memory).

    Returns:
        One entry per (sheathing, fastener, blocking, edge spacing).
    """
    entries = []
    for family, kind in _KINDS.items():
        for row in _library().get(family, []):
            for spacing_in, vs_plf in zip(
                row["edge_spacing_in"], row["vs_plf"], strict=True
            ):
                entries.append(
                    LibraryEntry(
                        kind=kind,
                        sheathing=row["sheathing"],
                        fastener=row["fastener"],
                        blocked=bool(row["blocked"]),
                        edge_spacing=float(spacing_in) * _IN,
                        nominal_unit_shear=float(vs_plf) * _PLF,
                        source=row["source"],
                        verified=bool(row["verified"]),
                    )
                )
    return tuple(entries)


def _combos(entries: list[LibraryEntry]) -> str:
    seen = dict.fromkeys(
        f"{e.sheathing} + {e.fastener} ({'blocked' if e.blocked else 'unblocked'})"
        for e in entries
    )
    return "; ".join(seen)


def find_entry(
    sheathing: str,
    fastener: str,
    edge_spacing_m: float,
    *,
    blocked: bool = True,
    kind: AssemblyKind | None = None,
) -> LibraryEntry:
    """The library entry for a sheathing, fastener, edge spacing and blocking.

    AWC SDPWS 2015 Table 4.3A (wood structural panels) and Table 4.3C (gypsum board),
    values from memory. Names match case-insensitively; ``15/32 in`` equals ``15/32``.

    Args:
        sheathing: Sheathing, e.g. ``"15/32 Structural I"``.
        fastener: Fastener, e.g. ``"10d common"``.
        edge_spacing_m: Fastener spacing at panel edges [m]; matched within 1 mm.
        blocked: Blocked panel edges.
        kind: Restrict the search to one family, or None for all.

    Returns:
        The matching entry.

    Raises:
        ConfigError: No such combination; the message lists what the library has.
    """
    pool = [e for e in library_entries() if kind is None or e.kind is kind]
    same = [
        e
        for e in pool
        if _norm(e.sheathing) == _norm(sheathing)
        and _norm(e.fastener) == _norm(fastener)
        and e.blocked == blocked
    ]
    state = "blocked" if blocked else "unblocked"
    if not same:
        msg = (
            f"the starter library has no {state} {sheathing!r} with {fastener!r}; "
            f"it has: {_combos(pool)}; otherwise give unit_shear_capacity"
        )
        raise ConfigError(msg)
    for entry in same:
        if math.isclose(entry.edge_spacing, edge_spacing_m, abs_tol=_SPACING_TOL):
            return entry
    spacings = ", ".join(f"{e.edge_spacing / _IN:g}" for e in same)
    msg = (
        f"the starter library has {sheathing!r} with {fastener!r} at edge spacings "
        f"{spacings} in, not {edge_spacing_m / _IN:.3g} in; otherwise give "
        "unit_shear_capacity"
    )
    raise ConfigError(msg)


def nominal_unit_shear(
    sheathing: str, fastener: str, edge_spacing_m: float, *, blocked: bool = True
) -> float:
    """Nominal seismic unit shear vs of a tabulated wall assembly.

    AWC SDPWS 2015 Table 4.3A and Table 4.3C (values from memory).

    Args:
        sheathing: Sheathing, e.g. ``"15/32 Structural I"``.
        fastener: Fastener, e.g. ``"10d common"``.
        edge_spacing_m: Fastener spacing at panel edges [m].
        blocked: Blocked panel edges.

    Returns:
        vs [N/m].

    Raises:
        ConfigError: Unknown combination; the message lists what exists.
    """
    entry = find_entry(sheathing, fastener, edge_spacing_m, blocked=blocked)
    return entry.nominal_unit_shear


def allowable_unit_shear(vs: float, basis: DesignBasis) -> float:
    """ASD allowable or LRFD design unit shear from the nominal unit shear.

    AWC SDPWS 2015 §4.3.3: ASD = vs / 2.0 (ASD reduction factor), LRFD = 0.80 vs
    (resistance factor φD); factors from memory.

    Args:
        vs: Nominal seismic unit shear [N/m].
        basis: Design basis.

    Returns:
        Allowable (ASD) or design (LRFD) unit shear [N/m].
    """
    factors = _library()["factors"]
    if DesignBasis(basis) is DesignBasis.ASD:
        return float(vs) / float(factors["asd_reduction"])
    return float(factors["lrfd_phi"]) * float(vs)


def concrete_defaults() -> ConcreteParams:
    """Example concrete wall inputs of the starter library (for a starter config).

    Common practice: f'c = 4000 psi, Grade 60 bars; ρt = 0.0025 is the minimum of
    ACI 318-19 §18.10.2.1 (from memory).

    Returns:
        f'c, fy [Pa], ρt and λ [-].
    """
    row = _library()["concrete"]
    return ConcreteParams(
        fc=float(row["fc_psi"]) * _PSI,
        fy=float(row["fy_psi"]) * _PSI,
        rho_t=float(row["rho_t"]),
        lambda_=float(row["lambda"]),
    )


def concrete_moduli(fc: float) -> tuple[float, float]:
    """Elastic and shear moduli of normalweight concrete from f'c.

    ACI 318-19 §19.2.2.1(b): Ec = 57000·√f'c in psi (from memory). Common practice:
    G = 0.4·Ec.

    Args:
        fc: Specified compressive strength f'c [Pa].

    Returns:
        (Ec, G) [Pa].
    """
    row = _library()["concrete"]
    fc_psi = float(fc) / _PSI
    Ec = float(row["Ec_coefficient_psi"]) * math.sqrt(fc_psi) * _PSI  # noqa: N806
    return Ec, float(row["G_over_E"]) * Ec
