"""Cyclic garbage collection paused over a burst of allocation.

Reading a model, allocating forces and checking them build a few hundred thousand small
records (IFC entity wrappers, meshes, wall segments, piers, findings), nearly all of
them kept until the end of the run; the collector's passes over them while they are
being built free nothing (measured on the 10,000-wall benchmark: about a third of the
reader's time). Reference counting still frees everything as usual.

At the end of the block the objects made in it are moved straight to the oldest
generation (``gc.freeze()`` then ``gc.unfreeze()``), as they would be after surviving
two young collections, so the collector does not walk them twice more right after. A
process that has frozen objects itself (``gc.get_freeze_count() > 0``) is left as is.
Worker processes forked inside the block inherit the paused collector.
"""

from __future__ import annotations

import gc
from collections.abc import Iterator
from contextlib import contextmanager

__all__ = ["collection_paused"]


@contextmanager
def collection_paused() -> Iterator[None]:
    """Disable the cyclic collector inside the block; restore its state after."""
    if not gc.isenabled():
        yield
        return
    gc.disable()
    try:
        yield
    finally:
        if gc.get_freeze_count() == 0:
            gc.freeze()  # everything tracked, to the permanent generation
            gc.unfreeze()  # and back, into the oldest generation
        gc.enable()
