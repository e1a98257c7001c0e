"""Child process of the benchmark: bare open, then open + one manifold geometry pass."""

from __future__ import annotations

import json
import resource
import sys
import time


def main(model: str, mode: str) -> None:
    t0 = time.perf_counter()
    import ifcopenshell
    import ifcopenshell.geom

    t1 = time.perf_counter()
    f = ifcopenshell.open(model)
    t2 = time.perf_counter()
    n = 0
    if mode == "floor":
        s = ifcopenshell.geom.settings()
        s.set("use-world-coords", True)
        s.set("disable-opening-subtractions", True)
        elements = f.by_type("IfcWall") + f.by_type("IfcSlab")
        it = ifcopenshell.geom.iterator(
            s, f, 1, include=elements, geometry_library="manifold"
        )
        if it.initialize():
            while True:
                it.get()
                n += 1
                if not it.next():
                    break
    t3 = time.perf_counter()
    json.dump(
        {
            "import": t1 - t0,
            "open": t2 - t1,
            "geometry": t3 - t2,
            "shapes": n,
            "maxrss_mb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
        },
        sys.stdout,
    )


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
