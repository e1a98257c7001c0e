"""Distribution of a line's force to its piers, by length or by stiffness.

Forces are signed along the line's direction (positive in +X for an X line); every
pier of a line takes a share of the same sign.
"""

from __future__ import annotations

import logging
import math
from collections.abc import Sequence
from enum import StrEnum

from allocation._columns import pier_lengths
from allocation.errors import ParameterError
from allocation.results import Pier, PierId

__all__ = ["InLineBasis", "choose_basis", "distribute_in_line"]

logger = logging.getLogger(__name__)


class InLineBasis(StrEnum):
    """What a line's force is shared in proportion to."""

    LENGTH = "length"  # same assembly along the line
    STIFFNESS = "stiffness"  # mixed assemblies: Pier.stiffness


def choose_basis(piers: Sequence[Pier]) -> InLineBasis:
    """Length for piers of one assembly; stiffness for mixed assemblies.

    Common practice (DESIGN.md item 9): walls of one assembly share in proportion to
    length; mixed assemblies share in proportion to stiffness. When mixed piers have no
    stiffness yet (0), length is used and a warning is logged.

    Args:
        piers: The piers of one line.

    Returns:
        The basis to pass to :func:`distribute_in_line`.
    """
    if len({p.assembly for p in piers}) <= 1:
        return InLineBasis.LENGTH
    if all(p.stiffness > 0.0 for p in piers):
        return InLineBasis.STIFFNESS
    ids = ", ".join(p.id for p in piers if p.stiffness <= 0.0)
    logger.warning("mixed assemblies without stiffness (%s): shared by length", ids)
    return InLineBasis.LENGTH


def distribute_in_line(
    line_force: float, piers: Sequence[Pier], *, by: str
) -> dict[PierId, float]:
    """Share a line's force among its piers in proportion to length or stiffness.

    Common practice (DESIGN.md item 9): F_i = F · w_i / Σw, with w the pier length
    (same assembly) or its in-plane stiffness (mixed assemblies). The rounding residue
    goes to the pier with the largest weight so the shares add up to ``line_force``.

    Args:
        line_force: Force of the line [N], signed along its direction.
        piers: The piers of the line.
        by: ``"length"`` or ``"stiffness"``.

    Returns:
        Force per pier id [N].

    Raises:
        ParameterError: Unknown ``by``, no piers, or a pier without positive weight.
    """
    try:
        basis = by if isinstance(by, InLineBasis) else InLineBasis(by)
    except ValueError:
        msg = f"within-line basis {by!r} is not one of 'length', 'stiffness'"
        raise ParameterError(msg) from None
    if not piers:
        msg = f"no piers to share a line force of {line_force} N"
        raise ParameterError(msg)
    if basis is InLineBasis.LENGTH:
        weights = pier_lengths(piers)  # Pier.length of each
    else:
        weights = [p.stiffness for p in piers]
    # all finite and > 0: a NaN or -inf fails the min() test or makes the sum NaN
    total = math.fsum(weights) if min(weights) > 0.0 else math.nan
    if not math.isfinite(total):
        for p, w in zip(piers, weights, strict=True):
            if not (math.isfinite(w) and w > 0.0):
                msg = (
                    f"pier {p.id}: {basis.value} {w} must be > 0 to share a line force"
                )
                raise ParameterError(msg)
    forces = {p.id: line_force * w / total for p, w in zip(piers, weights, strict=True)}
    big = piers[max(range(len(piers)), key=weights.__getitem__)].id
    forces[big] += line_force - math.fsum(forces.values())
    return {k: float(v) for k, v in forces.items()}
