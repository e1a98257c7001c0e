"""A read-only map of forces per pier, kept as the array that computed them (private).

A story's rigid analysis gives every load case's pier forces as one float array over
the same piers. Each case's map shares the story's :class:`PierIndex` and holds its
own array; its Python floats are made on first read (``tolist``: the same floats
``dict(zip(ids, array.tolist()))`` holds). Readers that work on arrays (the envelope)
take :attr:`PierForces.array`, aligned with ``index.ids``, instead of reading back
every entry.
"""

from __future__ import annotations

from collections.abc import Iterable, Iterator, Mapping

import numpy as np
from numpy.typing import NDArray

from allocation.errors import AllocationError

__all__ = ["PierForces", "PierIndex"]


class PierIndex:
    """Pier ids in order and the row of each: the rows of a story's force arrays.

    Args:
        ids: Pier ids, each once.

    Raises:
        AllocationError: An id is given twice.
    """

    __slots__ = ("ids", "row")

    def __init__(self, ids: Iterable[str]) -> None:
        self.ids = tuple(ids)
        self.row = {pid: n for n, pid in enumerate(self.ids)}
        if len(self.row) != len(self.ids):
            twice = sorted({p for p in self.ids if self.ids.count(p) > 1})
            msg = f"pier ids given twice in one story: {', '.join(twice)}"
            raise AllocationError(msg)

    def __len__(self) -> int:
        return len(self.ids)


class PierForces(Mapping[str, float]):
    """``{pier id: force [N]}``, read-only, over an index shared by a story's cases.

    Equal to a dict with the same items (``Mapping`` equality); iteration follows
    ``index.ids``, as the dict built from those ids and the array would.

    Args:
        index: The piers, one per row of ``array`` (shared, not copied).
        array: The forces [N]; made read-only here.

    Raises:
        AllocationError: ``array`` does not have one value per pier.
    """

    __slots__ = ("_floats", "array", "index")

    def __init__(self, index: PierIndex, array: NDArray[np.float64]) -> None:
        if array.ndim != 1 or array.shape[0] != len(index.ids):
            msg = (
                f"pier forces: {len(index.ids)} piers for an array of shape "
                f"{array.shape}; give one force per pier"
            )
            raise AllocationError(msg)
        array.flags.writeable = False
        self.index = index
        self.array = array
        self._floats: list[float] | None = None

    def _values(self) -> list[float]:
        if self._floats is None:
            self._floats = self.array.tolist()
        return self._floats

    def __getitem__(self, key: str) -> float:
        return self._values()[self.index.row[key]]

    def __contains__(self, key: object) -> bool:
        return key in self.index.row

    def __iter__(self) -> Iterator[str]:
        return iter(self.index.ids)

    def __len__(self) -> int:
        return len(self.index.ids)

    def values(self) -> list[float]:  # type: ignore[override]
        """The forces in ``index.ids`` order [N] (a new list)."""
        return list(self._values())

    def items(self) -> list[tuple[str, float]]:  # type: ignore[override]
        """``(pier id, force [N])`` in ``index.ids`` order (a new list)."""
        return list(zip(self.index.ids, self._values(), strict=True))

    def __reduce__(self):
        return (PierForces, (self.index, self.array.copy()))

    def __repr__(self) -> str:
        return f"PierForces({dict(self.items())!r})"
