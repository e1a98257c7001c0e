"""The ``shearline`` command: inspect, init, check, demo, requirements.

Exit codes: 0 ran with no error-severity finding; 1 error-severity findings exist;
2 usage or input error (one line on stderr; the traceback only with ``--debug``).
"""

from __future__ import annotations

import os

# numpy's BLAS threads spin on the second core after each small product, which takes
# it from shearline's own worker processes; one BLAS thread is all a check needs.
# Set before numpy is first imported (a value the user set is kept).
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

import argparse
import logging
import sys
from collections.abc import Sequence
from pathlib import Path

__all__ = ["main", "run"]


def _errors() -> tuple[type[Exception], ...]:
    """The errors reported as one line (exit code 2); loaded when one is raised."""
    from allocation.errors import AllocationError
    from checks.errors import CheckError
    from ifc_bridge.errors import IfcBridgeError
    from ifc_bridge.model import ModelError

    return (IfcBridgeError, CheckError, AllocationError, ModelError)


def _inspect(args: argparse.Namespace) -> int:
    from checks.report import terminal

    return terminal.inspect(args.model, config=args.config, as_json=args.json)


def _init(args: argparse.Namespace) -> int:
    from checks.report import terminal

    return terminal.init(args.model, out=args.output, force=args.force)


def _check(args: argparse.Namespace) -> int:
    from ifc_bridge.gc_pause import collection_paused
    from ifc_bridge.open_file import open_in_background

    # the model parses in a thread while the rest of shearline loads; the cyclic
    # collector's passes over the modules being loaded free nothing
    open_in_background(args.model)
    with collection_paused():
        from checks.report import terminal

        return terminal.check(
            args.model, config=args.config, out=args.out, previous=args.previous,
            annotate=args.annotate, bcf_version=args.bcf_version, units=args.units,
            verbosity=args.verbosity,
        )


def _demo(args: argparse.Namespace) -> int:
    from importlib.resources import files

    from checks.report import terminal

    demo = Path(str(files("sample_models")))
    return terminal.check(
        demo / "demo_building.ifc", config=demo / "demo.toml", out=args.out,
        previous=None, annotate=True, bcf_version=None, units=args.units,
        verbosity=args.verbosity, demo=True,
    )


def _requirements(args: argparse.Namespace) -> int:
    from checks.report import terminal

    return terminal.requirements(args.output)


def _parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(
        prog="shearline",
        description="Seismic force allocation to shear walls from an IFC model, with "
        "code checks written back as BCF. An aid to a licensed engineer; local codes "
        "and the authority having jurisdiction govern.",
        epilog="Exit codes: 0 no error findings, 1 error findings, 2 bad input.",
    )
    p.add_argument("--debug", action="store_true", help="show tracebacks on errors")
    sub = p.add_subparsers(dest="command", required=True, metavar="COMMAND")

    s = sub.add_parser("inspect", help="list levels, diaphragms, shear walls, warnings")
    s.add_argument("model", type=Path, help="IFC file")
    s.add_argument("--config", type=Path, help="project TOML (assembly match rules)")
    s.add_argument("--json", action="store_true", help="print JSON instead of tables")
    s.set_defaults(func=_inspect)

    s = sub.add_parser("init", help="write a starter config from the model's wall types")
    s.add_argument("model", type=Path, help="IFC file")
    s.add_argument("-o", "--output", type=Path, default=Path("shearline.toml"))
    s.add_argument("--force", action="store_true", help="overwrite an existing file")
    s.set_defaults(func=_init)

    for name, helptext, func in (
        ("check", "allocate forces, check walls and diaphragms, write outputs", _check),
        ("demo", "run the check on the bundled demo building", _demo),
    ):
        s = sub.add_parser(name, help=helptext)
        if name == "check":
            s.add_argument("model", type=Path, help="IFC file")
            s.add_argument("--config", type=Path, required=True, help="project TOML")
            s.add_argument("--previous", type=Path,
                           help="previous findings.bcf (or findings.json) to re-check")
            s.add_argument("--annotate", action="store_true",
                           help="write an IFC copy with results as property sets")
            s.add_argument("--bcf-version", choices=("2.1", "3.0"))
        s.add_argument("--out", type=Path, default=Path("shearline-out"),
                       help="output folder (default: shearline-out)")
        s.add_argument("--units", choices=("imperial", "si"),
                       help="display units (default: from the config)")
        g = s.add_mutually_exclusive_group()
        g.add_argument("-q", "--quiet", dest="verbosity", action="store_const", const=0)
        g.add_argument("-v", "--verbose", dest="verbosity", action="store_const", const=2)
        s.set_defaults(func=func, verbosity=1)

    s = sub.add_parser("requirements", help="write the IDS of what the model must carry")
    s.add_argument("-o", "--output", type=Path, default=Path("shearline-requirements.ids"))
    s.set_defaults(func=_requirements)
    return p


def main(argv: Sequence[str] | None = None) -> int:
    """Run the command line; returns the exit code."""
    args = _parser().parse_args(argv)
    try:
        return args.func(args)
    except Exception as exc:
        if args.debug or not isinstance(exc, _errors()):
            raise
        print(f"shearline: error: {exc}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        print("shearline: interrupted", file=sys.stderr)
        return 2


def run() -> None:
    """Entry point of the installed ``shearline`` command: :func:`main`, then exit.

    Every output is written and closed when :func:`main` returns, so the process
    leaves without the interpreter's teardown (freeing a large parsed IFC file
    object by object took 0.5 s on the 10,000-wall benchmark).
    """
    code = main()
    sys.stdout.flush()
    sys.stderr.flush()
    logging.shutdown()
    os._exit(code)


if __name__ == "__main__":
    run()
