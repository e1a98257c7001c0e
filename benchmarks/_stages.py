"""Child process of the benchmark: one shearline check, timed by stage (JSON on stdout)."""

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
    from allocation.allocate import allocate
    from checks.config import load_config
    from checks.pipeline import CheckRun, load_model, write_outputs
    from checks.rules.run_rules import run_checks

    t_import = time.perf_counter()
    cfg = load_config(config)
    m = load_model(model, cfg)
    t_read = time.perf_counter()
    a = allocate(m, cfg.seismic, cfg.loads, cfg.analysis)
    t_alloc = time.perf_counter()
    c = run_checks(m, a, cfg)
    t_check = time.perf_counter()
    write_outputs(CheckRun(model=m, config=cfg, allocation=a, checks=c), out)
    t_write = time.perf_counter()
    json.dump(
        {
            "import": t_import - t0,
            "read": t_read - t_import,
            "allocate": t_alloc - t_read,
            "check": t_check - t_alloc,
            "write": t_write - t_check,
            "walls": len(m.walls),
            "piers": len(a.piers),
            "findings": len(c.findings),
            "maxrss_mb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
        },
        sys.stdout,
    )


if __name__ == "__main__":
    main(*sys.argv[1:4])
