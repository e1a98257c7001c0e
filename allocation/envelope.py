"""Envelope of the flexible and rigid allocations, per pier and per line.

Magnitudes throughout: the governing force of a pier is the largest |force| over the
flexible results (one per level and direction; case label the direction, ``"X"``) and
over the rigid results (every case of both directions, since torsion from a force in
one direction loads the walls of the other; case label ``"+X+e"``). Where a diaphragm
is neither idealisation the larger of the two governs (common practice; AWC SDPWS 2015
allows this envelope in place of a semirigid analysis). With ``FLEXIBLE`` or ``RIGID``
only that method governs; the other's value is still recorded. A tie goes to the
flexible method.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence

from allocation.parameters import DiaphragmMethod
from allocation.results import (
    FlexibleResult,
    LineId,
    Method,
    PierEnvelope,
    PierId,
    ResistanceLine,
    RigidResult,
)

__all__ = ["envelope", "line_envelope"]

_Peak = tuple[float, str]  # (largest magnitude [N], case label)


def _peaks(items: Iterable[tuple[str, dict[str, float]]]) -> dict[str, _Peak]:
    """Largest |force| per key over labelled force maps; the first label wins ties."""
    out: dict[str, _Peak] = {}
    for label, forces in items:
        for key, force in forces.items():
            magnitude = abs(float(force))
            if key not in out or magnitude > out[key][0]:
                out[key] = (magnitude, label)
    return out


class _LineSums:
    """Signed sums of pier forces per line, visiting only the lines of given piers."""

    __slots__ = ("index", "members", "order")

    def __init__(self, members: dict[LineId, tuple[PierId, ...]]) -> None:
        self.members = members
        self.order = {lid: n for n, lid in enumerate(members)}
        self.index: dict[PierId, list[LineId]] = {}
        for lid, piers in members.items():
            for p in piers:
                self.index.setdefault(p, []).append(lid)

    def __call__(self, forces: dict[PierId, float]) -> dict[LineId, float]:
        """Each line with any pier in ``forces``: the sum over its piers, in order [N]."""
        hit = {lid for p in forces for lid in self.index.get(p, ())}
        return {
            lid: sum(forces[p] for p in self.members[lid] if p in forces)
            for lid in sorted(hit, key=self.order.__getitem__)
        }


def _govern(
    flexible: _Peak | None, rigid: _Peak | None, method: DiaphragmMethod
) -> tuple[float, Method, str]:
    """Envelope value, governing method and case of one pier or line."""
    f = flexible or (0.0, "")
    r = rigid or (0.0, "")
    if method is DiaphragmMethod.FLEXIBLE:
        use_rigid = False
    elif method is DiaphragmMethod.RIGID:
        use_rigid = True
    else:
        use_rigid = r[0] > f[0] or (flexible is None and rigid is not None)
    value, case = r if use_rigid else f
    return value, Method.RIGID if use_rigid else Method.FLEXIBLE, case


def envelope(
    flexible: Sequence[FlexibleResult],
    rigid: Sequence[RigidResult],
    *,
    method: DiaphragmMethod = DiaphragmMethod.ENVELOPE,
) -> dict[PierId, PierEnvelope]:
    """Governing force of every pier over the methods and load cases.

    Common practice: where a diaphragm is neither flexible nor rigid
    (ASCE 7-16 §12.3.1), design for the larger of the two idealisations.

    Args:
        flexible: Flexible results (any levels and directions) [N].
        rigid: Rigid results (any levels, directions and cases) [N].
        method: ``ENVELOPE`` takes the larger; ``FLEXIBLE``/``RIGID`` only that one.

    Returns:
        ``{pier id: PierEnvelope}`` for every pier in any result, magnitudes [N].
    """
    flex = _peaks((r.direction.value, r.pier_forces) for r in flexible)
    rig = _peaks((r.case.label, r.pier_forces) for r in rigid)
    out: dict[PierId, PierEnvelope] = {}
    for pier in sorted(flex.keys() | rig.keys()):
        value, governing, case = _govern(flex.get(pier), rig.get(pier), method)
        out[pier] = PierEnvelope(
            pier=pier,
            flexible=flex.get(pier, (0.0, ""))[0],
            rigid=rig.get(pier, (0.0, ""))[0],
            envelope=value,
            governing_method=governing,
            governing_case=case,
        )
    return out


def line_envelope(
    lines: Sequence[ResistanceLine],
    flexible: Sequence[FlexibleResult],
    rigid: Sequence[RigidResult],
    *,
    method: DiaphragmMethod = DiaphragmMethod.ENVELOPE,
) -> dict[LineId, dict[str, float]]:
    """Governing force of every line over the methods and load cases.

    Common practice, as :func:`envelope`. A line's rigid force in one case is the
    signed sum of its piers' forces; its rigid value is the largest magnitude over
    the cases. Its flexible value is the largest |line force| over flexible results.

    Args:
        lines: The lines, with their pier ids.
        flexible: Flexible results [N].
        rigid: Rigid results [N].
        method: ``ENVELOPE`` takes the larger; ``FLEXIBLE``/``RIGID`` only that one.

    Returns:
        ``{line id: {"flexible": N, "rigid": N, "envelope": N}}`` for each line,
        magnitudes [N]; a method with no result for a line gives 0.
    """
    flex = _peaks((r.direction.value, r.line_forces) for r in flexible)
    members = {line.id: line.piers for line in lines}
    sums = _LineSums(members)
    rig = _peaks((r.case.label, sums(r.pier_forces)) for r in rigid)
    out: dict[LineId, dict[str, float]] = {}
    for line in lines:
        value, _, _ = _govern(flex.get(line.id), rig.get(line.id), method)
        out[line.id] = {
            "flexible": flex.get(line.id, (0.0, ""))[0],
            "rigid": rig.get(line.id, (0.0, ""))[0],
            "envelope": value,
        }
    return out
