"""Benchmark shearline against the practical floor of reading the same IFC geometry.

Run by hand, not in CI::

    python benchmarks/run_benchmark.py                      # default sizes
    python benchmarks/run_benchmark.py --sizes 5x50 40x250

For each size (storeys x walls per storey) it generates a synthetic building (cached in
``benchmarks/_generated/``), then times, each in a fresh process (best of ``--repeat``,
the four kinds of run interleaved so that a drift of the machine's speed hits all):

* ``open``: a bare ``ifcopenshell.open`` of the file;
* ``floor``: a process that opens the file and runs one pass of ifcopenshell's fastest
  geometry kernel (``geometry_library="manifold"``) over its walls and slabs;
* ``check``: ``shearline check`` end to end (the real command, ``python -m checks.cli
  check MODEL --config benchmark.toml --out DIR -q``), and, in a separate run of the
  same pipeline code, by stage (import, read, allocate, check, write).

It prints the ratios (check / floor), peak memory against the floor's (the main
process, and the largest worker process), the CPU seconds of all processes, the share
of allocation + checks in the total, and the scaling exponent of each time across
sizes (slope of log time against log walls). shearline runs its geometry pass and its
IDS validation in forked worker processes when the machine has two cores or more;
``SHEARLINE_WORKERS=0`` runs it in one process, for comparison. Targets: check within 1.5x of the floor on the
largest model, allocation and checks under 10 % of the total, near-linear growth.
"""

from __future__ import annotations

import argparse
import json
import math
import subprocess
import sys
import tempfile
import time
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
DEFAULT_SIZES = ("5x50", "10x100", "20x200", "40x250")


def _child(args: list[str]) -> tuple[float, dict]:
    t = time.perf_counter()
    out = subprocess.run(
        [sys.executable, *args], capture_output=True, text=True, cwd=ROOT, check=False
    )
    elapsed = time.perf_counter() - t
    if out.returncode not in (0, 1):
        msg = f"{' '.join(args)} failed ({out.returncode}): {out.stderr.strip()[-400:]}"
        raise SystemExit(msg)
    last = out.stdout.strip().splitlines()[-1:] or ["{}"]
    return elapsed, (json.loads(last[0]) if last[0].startswith("{") else {})


def _model(size: str) -> tuple[Path, int]:
    storeys, walls = (int(v) for v in size.lower().split("x"))
    path = HERE / "_generated" / f"building_{storeys}x{walls}.ifc"
    generator = HERE / "generate_building.py"
    # a model cached before the generator last changed is stale: make it again
    if not path.exists() or path.stat().st_mtime < generator.stat().st_mtime:
        path.parent.mkdir(exist_ok=True)
        sys.path.insert(0, str(HERE))
        from generate_building import generate

        t = time.perf_counter()
        generate(storeys, walls, path)
        print(f"generated {path.name} in {time.perf_counter() - t:.1f} s", flush=True)
    return path, storeys * walls


def _total(stages: dict) -> float:
    return sum(stages[k] for k in ("import", "read", "allocate", "check", "write"))


def _slope(xs: list[float], ys: list[float]) -> float:
    lx, ly = [math.log(x) for x in xs], [math.log(max(y, 1e-9)) for y in ys]
    mx, my = sum(lx) / len(lx), sum(ly) / len(ly)
    den = sum((a - mx) ** 2 for a in lx)
    return (
        sum((a - mx) * (b - my) for a, b in zip(lx, ly, strict=True)) / den
        if den
        else 0.0
    )


def main() -> None:
    """Run the benchmark and print the table."""
    p = argparse.ArgumentParser(description="shearline benchmark (run by hand)")
    p.add_argument("--sizes", nargs="+", default=list(DEFAULT_SIZES))
    p.add_argument("--repeat", type=int, default=2)
    a = p.parse_args()
    config = HERE / "benchmark.toml"
    rows = []
    for size in a.sizes:
        path, walls = _model(size)
        with tempfile.TemporaryDirectory() as out:
            check_args = [
                "-m",
                "checks.cli",
                "check",
                str(path),
                "--config",
                str(config),
                "--out",
                out,
                "-q",
            ]
            # interleaved, so that a drift of the machine's speed hits all alike
            runs: dict[str, list[tuple[float, dict]]] = {
                "open": [],
                "floor": [],
                "check": [],
                "stages": [],
            }
            for _ in range(a.repeat):
                runs["open"].append(
                    _child([str(HERE / "_floor.py"), str(path), "open"])
                )
                runs["floor"].append(
                    _child([str(HERE / "_floor.py"), str(path), "floor"])
                )
                runs["check"].append(_child(check_args))
                runs["stages"].append(
                    _child([str(HERE / "_stages.py"), str(path), str(config), out])
                )
        best = {k: min(v, key=lambda r: r[0]) for k, v in runs.items()}
        open_info = best["open"][1]
        t_floor, floor = best["floor"]
        t_check = best["check"][0]
        stages = best["stages"][1]
        rows.append(
            (
                size,
                walls,
                path.stat().st_size / 1e6,
                open_info,
                t_floor,
                floor,
                t_check,
                stages,
            )
        )
        share = (stages["allocate"] + stages["check"]) / _total(stages)
        print(
            f"{size:>7} {walls:>6} walls {path.stat().st_size / 1e6:6.1f} MB | open "
            f"{open_info['open']:.2f} s | floor {t_floor:.2f} s (geometry "
            f"{floor['geometry']:.2f}) | check {t_check:.2f} s = import {stages['import']:.2f}"
            f" + read {stages['read']:.2f} + allocate {stages['allocate']:.2f} + check "
            f"{stages['check']:.2f} + write {stages['write']:.2f} (stages "
            f"{_total(stages):.2f}, CPU {stages['cpu_s']:.1f} s) | ratio "
            f"{t_check / t_floor:.2f} | alloc+check {share:.1%} | peak "
            f"{stages['maxrss_mb']:.0f} MB (worker {stages['worker_maxrss_mb']:.0f}) vs "
            f"floor {floor['maxrss_mb']:.0f} MB "
            f"({stages['maxrss_mb'] / floor['maxrss_mb']:.2f}x)",
            flush=True,
        )
    if len(rows) > 1:
        w = [r[1] for r in rows]
        print(
            "scaling exponents (time ~ walls^k): open "
            f"{_slope(w, [r[3]['open'] for r in rows]):.2f}, floor "
            f"{_slope(w, [r[4] for r in rows]):.2f}, check {_slope(w, [r[6] for r in rows]):.2f}, "
            f"read {_slope(w, [r[7]['read'] for r in rows]):.2f}, allocate "
            f"{_slope(w, [r[7]['allocate'] for r in rows]):.2f}, check-stage "
            f"{_slope(w, [r[7]['check'] for r in rows]):.2f}"
        )
    last = rows[-1]
    ok = last[6] <= 1.5 * last[4]
    stages = last[7]
    share = (stages["allocate"] + stages["check"]) / _total(stages)
    print(
        f"largest model: check/floor = {last[6] / last[4]:.2f} (target <= 1.5): "
        f"{'met' if ok else 'missed'}; allocation + checks {share:.1%} of the stages "
        f"(target < 10 %): {'met' if share < 0.10 else 'missed'}"
    )


if __name__ == "__main__":
    main()
