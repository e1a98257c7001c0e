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

from collections.abc import Iterable, Mapping, Sequence
from itertools import chain, repeat

import numpy as np

from allocation._columns import flags, floats
from allocation._pier_forces import PierForces
from allocation._records import records
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


def _peaks(items: Iterable[tuple[str, Mapping[str, float]]]) -> dict[str, _Peak]:
    """Largest |force| per key over labelled force maps; the first label wins ties."""
    out: dict[str, _Peak] = {}
    for label, forces in items:
        for key, force in forces.items():
            magnitude = abs(float(force))
            if key not in out or magnitude > out[key][0]:
                out[key] = (magnitude, label)
    return out


def _matrix(
    items: Sequence[tuple[str, Mapping[str, float]]], rows: list[int], width: int
) -> np.ndarray:
    """The maps' values of the given items (maps with one key sequence) as rows of a
    float matrix; a rigid story's maps give their arrays as they are."""
    maps = [items[n][1] for n in rows]
    if all(isinstance(f, PierForces) for f in maps):
        return np.stack([f.array for f in maps])  # each aligned with its index.ids
    values = chain.from_iterable(f.values() for f in maps)
    return np.fromiter(values, dtype=np.float64, count=len(rows) * width).reshape(
        len(rows), width
    )


def _key_groups(
    items: Sequence[tuple[str, Mapping[str, float]]],
) -> dict[tuple[str, ...], list[int]]:
    """Each key sequence of the items' maps, with the items that have it, in order
    (a rigid story's maps share their index's ids: not read key by key)."""
    groups: dict[tuple[str, ...], list[int]] = {}
    for n, (_, forces) in enumerate(items):
        keys = forces.index.ids if isinstance(forces, PierForces) else tuple(forces)
        groups.setdefault(keys, []).append(n)
    return groups


def _same_keys(
    items: Sequence[tuple[str, Mapping[str, float]]],
) -> list[tuple[tuple[str, ...], list[int]]] | None:
    """Items grouped by their maps' key sequence, or None when groups share keys."""
    groups = _key_groups(items)
    keys = [k for k in groups]
    if sum(len(k) for k in keys) != len({p for k in keys for p in k}):
        return None
    return list(groups.items())


def _peaks_by_rows(
    items: Sequence[tuple[str, Mapping[str, float]]],
) -> dict[str, _Peak]:
    """:func:`_peaks` of maps that come in groups with one key sequence (the rigid
    cases of a story): each group as a matrix, the first largest row per column."""
    groups = _same_keys(items)
    if groups is None:
        return _peaks(items)
    out: dict[str, _Peak] = {}
    for keys, rows in groups:
        m = np.abs(_matrix(items, rows, len(keys)))
        if np.isnan(m).any():  # comparisons with NaN: the loop's own rule
            out.update(_peaks([items[n] for n in rows]))
            continue
        best = np.argmax(m, axis=0)
        peak = m[best, np.arange(len(keys))].tolist()
        labels = [items[rows[b]][0] for b in best.tolist()]
        out.update(zip(keys, zip(peak, labels, strict=True), strict=True))
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

    def __call__(self, forces: Mapping[PierId, float]) -> dict[LineId, float]:
        """Each line with any pier in ``forces``: the sum over its piers, in order [N]."""
        hit = {lid for p in forces for lid in self.index.get(p, ())}
        return {
            lid: sum(forces[p] for p in self.members[lid] if p in forces)
            for lid in sorted(hit, key=self.order.__getitem__)
        }

    def many(
        self, items: Sequence[tuple[str, Mapping[PierId, float]]]
    ) -> list[tuple[str, dict[LineId, float]]]:
        """``(label, self(forces))`` of each item; maps with one key sequence (the
        rigid cases of a story) as a matrix, each line's piers added in order."""
        out: list[tuple[str, dict[LineId, float]] | None] = [None] * len(items)
        for keys, rows in _key_groups(items).items():
            col = {p: k for k, p in enumerate(keys)}
            hit = sorted(
                {lid for p in keys for lid in self.index.get(p, ())},
                key=self.order.__getitem__,
            )
            if not hit:
                for n in rows:
                    out[n] = (items[n][0], {})
                continue
            cols = [[col[p] for p in self.members[lid] if p in col] for lid in hit]
            # each line's piers as a row of column indices, padded with an added
            # column of zeros; a left-to-right running sum along each row, as sum()
            # gives (adding the trailing zeros, or starting from 0, only turns -0.0
            # into 0.0, and only the magnitude is used)
            width = len(keys)
            take = np.full((len(hit), max(map(len, cols))), width, dtype=np.intp)
            for i, c in enumerate(cols):
                take[i, : len(c)] = c
            m = np.zeros((len(rows), width + 1), dtype=np.float64)
            m[:, :width] = _matrix(items, rows, width)
            sums = np.cumsum(m[:, take], axis=2)[:, :, -1].tolist()
            for n, row in zip(rows, sums, strict=True):
                out[n] = (items[n][0], dict(zip(hit, row, strict=True)))
        return out  # type: ignore[return-value]


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
    flex = _peaks_by_rows([(r.direction.value, r.pier_forces) for r in flexible])
    rig = _peaks_by_rows([(r.case.label, r.pier_forces) for r in rigid])
    piers = sorted(flex.keys() | rig.keys())
    if not piers:
        return {}
    none = (0.0, "")
    f_value, f_case = zip(*map(flex.get, piers, repeat(none)), strict=True)
    r_value, r_case = zip(*map(rig.get, piers, repeat(none)), strict=True)
    fm, rm = floats(f_value, len(piers)), floats(r_value, len(piers))
    if method is DiaphragmMethod.FLEXIBLE:
        use_rigid = np.zeros(len(piers), dtype=bool)
    elif method is DiaphragmMethod.RIGID:
        use_rigid = np.ones(len(piers), dtype=bool)
    else:  # _govern, for every pier at once
        has_f = flags(map(flex.__contains__, piers), len(piers))
        has_r = flags(map(rig.__contains__, piers), len(piers))
        use_rigid = (rm > fm) | (~has_f & has_r)
    cases = np.where(
        use_rigid, np.array(r_case, dtype=object), np.array(f_case, dtype=object)
    )
    built = records(
        PierEnvelope,
        pier=piers,
        flexible=list(f_value),
        rigid=list(r_value),
        envelope=np.where(use_rigid, rm, fm).tolist(),
        governing_method=list(
            map((Method.FLEXIBLE, Method.RIGID).__getitem__, use_rigid.tolist())
        ),
        governing_case=cases.tolist(),
    )
    return dict(zip(piers, built, strict=True))


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
    rig = _peaks(sums.many([(r.case.label, r.pier_forces) for r in rigid]))
    out: dict[LineId, dict[str, float]] = {}
    for line in lines:
        value, _, _ = _govern(flex.get(line.id), rig.get(line.id), method)
        out[line.id] = {
            "flexible": flex.get(line.id, (0.0, ""))[0],
            "rigid": rig.get(line.id, (0.0, ""))[0],
            "envelope": value,
        }
    return out
