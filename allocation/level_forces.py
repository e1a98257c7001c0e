"""Level forces: ELF base shear and its vertical distribution, or user-given forces.

Weights and forces in N, heights above the seismic base in m, periods in s. Levels are
taken bottom up (sorted by height above the base).
"""

from __future__ import annotations

import dataclasses
import logging
import math
from collections.abc import Sequence

from allocation.asce7_16 import s12_8_elf, s12_10_diaphragms
from allocation.errors import ParameterError
from allocation.parameters import Procedure, SeismicParameters
from allocation.results import LevelLoad, SeismicSummary

__all__ = ["GOVERNS_GIVEN", "compute_level_forces"]

logger = logging.getLogger(__name__)

GOVERNS_GIVEN = "given level forces"
"""``SeismicSummary.Cs_governs`` when the level forces are given by the user."""


def _checked(levels: Sequence[LevelLoad]) -> list[LevelLoad]:
    if not levels:
        msg = "no diaphragm levels: nothing to distribute the seismic force to"
        raise ParameterError(msg)
    ordered = sorted(levels, key=lambda lv: lv.height)
    names = [lv.level for lv in ordered]
    if len(set(names)) != len(names):
        msg = f"duplicate level names among the diaphragm levels: {names}"
        raise ParameterError(msg)
    for lv in ordered:
        if not (math.isfinite(lv.height) and lv.height > 0.0):
            msg = (
                f"level {lv.level!r} (GUID {lv.guid}): height above the seismic base "
                f"{lv.height} m must be > 0; check [levels].base"
            )
            raise ParameterError(msg)
        if not (math.isfinite(lv.seismic_weight) and lv.seismic_weight > 0.0):
            msg = (
                f"level {lv.level!r} (GUID {lv.guid}): seismic weight "
                f"{lv.seismic_weight} N must be > 0"
            )
            raise ParameterError(msg)
    return ordered


def _given_forces(
    levels: Sequence[LevelLoad], seismic: SeismicParameters
) -> list[float]:
    """Story forces from ``seismic.level_forces``, in the order of ``levels``."""
    names = [lv.level for lv in levels]
    listed = ", ".join(repr(n) for n in names)
    given: dict[str, float] = {}
    for name, force in seismic.level_forces:
        if name not in names:
            msg = (
                f"seismic.level_forces.{name}: not a diaphragm level of the model; "
                f"levels: {listed}"
            )
            raise ParameterError(msg)
        if name in given:
            msg = f"seismic.level_forces.{name}: given more than once"
            raise ParameterError(msg)
        given[name] = force
    missing = [n for n in names if n not in given]
    if missing:
        msg = (
            "seismic.level_forces: no force given for "
            f"{', '.join(repr(n) for n in missing)}; give one for each of {listed}"
        )
        raise ParameterError(msg)
    return [float(given[n]) for n in names]


def compute_level_forces(
    levels: Sequence[LevelLoad], seismic: SeismicParameters
) -> tuple[SeismicSummary, tuple[LevelLoad, ...]]:
    """Base shear, story forces, story shears and diaphragm forces of every level.

    ASCE 7-16 §12.8 (ELF: Eq. 12.8-1 to 12.8-13) and §12.10.1.1 (Eq. 12.10-1 to
    12.10-3). With ``Procedure.GIVEN`` the story forces come from
    ``seismic.level_forces``; then V = ΣFx, Cs = V/W and Cvx = 0, while Ta, T and k
    are still computed for information.

    Args:
        levels: Diaphragm levels with their seismic weight [N] and height above the
            base [m] (from :func:`allocation.weights.level_weights`).
        seismic: Seismic parameters.

    Returns:
        (summary with hn [m], Ta and T [s], Cu, Cs, k [-], W and V [N]; the levels
        bottom up with ``story_force``, ``story_shear``, ``diaphragm_force`` [N] and
        ``Cvx`` [-] filled in).

    Raises:
        ParameterError: No levels, a level with no weight or height, or given forces
            that name an unknown level or miss a diaphragm level.
    """
    ordered = _checked(levels)
    w = [lv.seismic_weight for lv in ordered]
    h = [lv.height for lv in ordered]
    hn = max(h)
    Ta = s12_8_elf.Ta(seismic.Ct, hn, seismic.x)
    Cu = s12_8_elf.Cu(seismic.SD1)
    T = s12_8_elf.period_used(Ta, Cu, seismic.period)
    k = s12_8_elf.k(T)
    W = math.fsum(w)
    if seismic.procedure is Procedure.GIVEN:
        F = _given_forces(ordered, seismic)
        V = math.fsum(F)
        Cs, governs = V / W, GOVERNS_GIVEN
        C = [0.0] * len(ordered)
    else:
        Cs, governs = s12_8_elf.seismic_response_coefficient(
            seismic.SDS,
            seismic.SD1,
            S1=seismic.S1,
            T=T,
            TL=seismic.TL,
            R=seismic.R,
            Ie=seismic.Ie,
        )
        V = s12_8_elf.V(Cs, W)
        C = s12_8_elf.Cvx(w, h, k)
        F = [s12_8_elf.Fx(c, V) for c in C]
    shears = s12_8_elf.Vx(F)
    out = []
    for i, lv in enumerate(ordered):
        Fp, fp_governs = s12_10_diaphragms.Fpx(
            shears[i], math.fsum(w[i:]), w[i], seismic.SDS, seismic.Ie
        )
        logger.debug("level %r: Fpx = %.6g N (%s)", lv.level, Fp, fp_governs)
        out.append(
            dataclasses.replace(
                lv,
                story_force=F[i],
                story_shear=shears[i],
                diaphragm_force=Fp,
                Cvx=C[i],
            )
        )
    summary = SeismicSummary(
        procedure=seismic.procedure.value,
        hn=float(hn),
        Ta=Ta,
        T=T,
        Cu=Cu,
        Cs=float(Cs),
        Cs_governs=governs,
        k=k,
        W=float(W),
        V=float(V),
    )
    return summary, tuple(out)
