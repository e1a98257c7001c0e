"""Child process of the benchmark: one shearline check, timed by stage (JSON on stdout).

It runs the same code as ``shearline check`` (:func:`checks.pipeline.check_model` given
the config's path, as the command does, then :func:`checks.pipeline.write_outputs`),
with the pipeline's own stage timings. ``import`` counts the modules and the config
loaded before and during ``check_model`` (they load beside the geometry workers).
"""

from __future__ import annotations

import json
import resource
import sys
import time
from pathlib import Path

# run as a script from any directory: the project root must be importable
sys.path.insert(0, str(Path(__file__).resolve().parent.parent))


def main(model: str, config: str, out: str) -> None:
    t0 = time.perf_counter()
    from checks.pipeline import check_model, write_outputs

    t_import = time.perf_counter()
    stages: dict[str, float] = {}
    run = check_model(model, config, timings=stages)
    t_checked = time.perf_counter()
    write_outputs(run, out)
    t_write = time.perf_counter()
    own = resource.getrusage(resource.RUSAGE_SELF)
    workers = resource.getrusage(resource.RUSAGE_CHILDREN)
    json.dump(
        {
            "import": t_import - t0 + stages["import"],
            "read": stages["open"] + stages["read"],
            "allocate": stages["allocate"],
            "check": stages["check"] + stages["requirements"],
            "requirements_wait": stages["requirements"],
            "write": t_write - t_checked,
            "walls": len(run.model.walls),
            "piers": len(run.allocation.piers),
            "findings": len(run.findings),
            "maxrss_mb": own.ru_maxrss / 1024,
            "worker_maxrss_mb": workers.ru_maxrss / 1024,
            "cpu_s": own.ru_utime + own.ru_stime + workers.ru_utime + workers.ru_stime,
        },
        sys.stdout,
    )


if __name__ == "__main__":
    main(*sys.argv[1:4])
