"""The whole check in one call: IFC + config -> model, forces, findings, output files.

For notebooks::

    from checks.pipeline import check_model
    run = check_model("sample_models/demo_building.ifc", "sample_models/demo.toml")
    run.allocation.levels[0].story_force      # N
    [f.title for f in run.findings]

The CLI (``shearline check``) calls :func:`check_model` then :func:`write_outputs`.
"""

from __future__ import annotations

import logging
import os
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path

from allocation.errors import AllocationError
from allocation.results import Allocation
from checks.errors import ConfigError, OutputError
from checks.findings import Finding, Severity
from checks.project import DisplayUnits, ProjectConfig
from ifc_bridge.model import BuildingModel

__all__ = ["CheckRun", "check_model", "load_model", "write_outputs"]

log = logging.getLogger(__name__)

Progress = Callable[[str, int, int], None]


@dataclass(frozen=True, slots=True, kw_only=True)
class CheckRun:
    """Everything one check produced.

    Attributes:
        model: The structural model read from IFC.
        config: The project config.
        allocation: Forces per level, line and pier.
        checks: The rule results (findings, per-pier numbers, rho).
        requirement_findings: Failures of the model requirements (IDS).
        ifc: The open IFC file (``ifcopenshell.file``) the model was read from, to
            look elements up by GlobalId (``run.ifc.by_guid(guid)``); it is kept
            with the run, so freeing it (tens of milliseconds on a large model) is
            left to the run's end, which a command-line run skips.
    """

    model: BuildingModel
    config: ProjectConfig
    allocation: Allocation
    checks: object
    requirement_findings: tuple[Finding, ...] = ()
    ifc: object | None = None

    @property
    def findings(self) -> tuple[Finding, ...]:
        """All findings, errors first, then by id."""
        order = {Severity.ERROR: 0, Severity.WARNING: 1, Severity.INFO: 2}
        both = (*self.checks.findings, *self.requirement_findings)
        return tuple(sorted(both, key=lambda f: (order[f.severity], f.id)))

    @property
    def has_errors(self) -> bool:
        """True when any finding has error severity (``check`` exits with 1)."""
        return any(f.severity is Severity.ERROR for f in self.findings)


def _config(config: ProjectConfig | str | os.PathLike) -> ProjectConfig:
    if isinstance(config, ProjectConfig):
        return config
    from checks.config import load_config

    return load_config(config)


def _check_storey_names(model: BuildingModel, config: ProjectConfig) -> None:
    names = [lv.name for lv in model.levels]  # elevation order: a stable message
    keys = [
        ("seismic.level_forces", [n for n, _ in config.seismic.level_forces]),
        ("loads.extra", [n for n, _ in config.loads.extra]),
        ("levels.diaphragms", list(config.analysis.diaphragm_levels)),
        (
            "levels.base",
            [config.seismic.base_level] if config.seismic.base_level else [],
        ),
    ]
    for key, given in keys:
        for name in given:
            if name not in names:
                msg = (
                    f"{config.path}: {key}: storey {name!r} is not in {model.source}; "
                    f"its storeys are {', '.join(repr(n) for n in names)}"
                )
                raise ConfigError(msg)


def load_model(
    model_path: str | os.PathLike,
    config: ProjectConfig,
    progress: Progress | None = None,
    *,
    ifc: object | None = None,
    started: object | None = None,
) -> BuildingModel:
    """Read the IFC file with the config's shear-wall rules and diaphragm levels.

    ``ifc`` is the file already opened with :func:`ifc_bridge.open_file.open_ifc`
    (it is then not parsed again); ``started`` its geometry pass already begun
    (:func:`ifc_bridge.read_model.start_read`).
    """
    from ifc_bridge.errors import IfcContentError
    from ifc_bridge.open_file import open_ifc
    from ifc_bridge.read_model import read_model_file

    opened = ifc if ifc is not None else open_ifc(model_path)

    def read(
        storeys: tuple[str, ...], report: Progress | None, begun: object | None
    ) -> BuildingModel:
        return read_model_file(
            opened,
            str(model_path),
            rules=config.match_rules,
            use_predefined_type=config.use_predefined_type,
            diaphragm_storeys=storeys,
            progress=report,
            started=begun,
        )

    try:
        return read(config.analysis.diaphragm_levels, progress, started)
    except IfcContentError:
        if not config.analysis.diaphragm_levels:
            raise
        # name the config file and key when [levels].diaphragms names a lost storey
        _check_storey_names(read((), None, None), config)
        raise


def check_model(
    model_path: str | os.PathLike,
    config: ProjectConfig | str | os.PathLike,
    *,
    progress: Progress | None = None,
    timings: dict[str, float] | None = None,
) -> CheckRun:
    """Read, allocate and check one IFC model.

    The geometry pass starts in worker processes as soon as the file is open and
    its storeys and walls are found; the config and the analysis modules load
    meanwhile, so an unusable IFC file is reported before a config error. The IDS
    validation runs in another worker while the model is read and checked
    (:mod:`ifc_bridge.worker`).

    Args:
        model_path: The architect's IFC file.
        config: A :class:`ProjectConfig` or the path of its TOML file.
        progress: Optional ``progress(stage, done, total)`` callback.
        timings: When given, filled with the wall-clock seconds of each stage
            (``import``: the modules it loads on first use and the config,
            ``open``: the parse and the start of the geometry pass, ``read``,
            ``allocate``, ``check``, ``requirements``: the wait for the IDS worker).

    Returns:
        The model, forces and findings.

    Raises:
        IfcBridgeError: The IFC file cannot be used.
        ConfigError: The config is wrong or names a storey the model lacks.
        AllocationError: The forces cannot be computed.
    """
    clock = _Stopwatch(timings)
    from ifc_bridge.open_file import open_ifc, open_in_background, parsing

    # the parse runs in a thread, outside the interpreter lock, while the reader's
    # modules load (unless the caller began it already), then the later stages'
    # modules until the parse is done
    open_in_background(model_path)
    from ifc_bridge.gc_pause import collection_paused
    from ifc_bridge.read_model import start_read
    from ifc_bridge.worker import PARALLEL_MIN, can_fork, start_call

    _load_while(parsing, _LATER_MODULES)
    clock.lap("import")
    with collection_paused():
        ifc = open_ifc(model_path)
        # the IDS validation and the geometry pass need only the open file: they
        # run in workers while the config and the analysis modules load and the
        # walls' properties are read
        requirements = start_call(
            "requirements",
            _requirements,
            ifc,
            model_path,
            parallel=len(ifc.by_type("IfcWall")) >= PARALLEL_MIN and can_fork(),
            nice=19,  # behind the reader and the geometry workers: needed last
        )
        started = None
        try:
            started = start_read(ifc, str(model_path))
            _check_unique_guids(ifc, str(model_path))  # while the workers run
            clock.lap("open")
            from allocation.allocate import allocate
            from checks.rules.run_rules import run_checks

            cfg = _config(config)
            # what did not load during the parse loads now, beside the workers, not
            # during the checks and the writing
            _load_while(lambda: True, _LATER_MODULES)
            clock.lap("import")
            model = load_model(model_path, cfg, progress, ifc=ifc, started=started)
            _check_storey_names(model, cfg)
            clock.lap("read")
            try:
                allocation = allocate(model, cfg.seismic, cfg.loads, cfg.analysis)
            except AllocationError as exc:
                if model.source in str(exc):
                    raise
                msg = f"{model.source}: {exc}"
                raise AllocationError(msg) from exc
            clock.lap("allocate")
            checks = run_checks(model, allocation, cfg)
            clock.lap("check")
            found = tuple(requirements.result())
            clock.lap("requirements")
        finally:
            if started is not None:
                started.cancel()
            requirements.cancel()
    return CheckRun(
        model=model,
        config=cfg,
        allocation=allocation,
        checks=checks,
        requirement_findings=found,
        ifc=ifc,
    )


# The modules of the stages after the read (allocation, checks, the writers: pint
# units, the assembly library, bcf-client and xsdata). They load while the file parses
# (the parse leaves the interpreter free), the rest beside the workers; in steps of a
# few tens of milliseconds at most, as the parse's end is checked between them, except
# the config's (pint: 0.18 s of the 0.43 s on the benchmark machine), which go first.
_LATER_MODULES = (
    "checks.config",
    "allocation.allocate",
    "checks.rules.run_rules",
    "checks.capacity",
    "checks.report.html_report",
    "checks.report.csv_tables",
    "checks.report.results_json",
    "checks.report.bcf_topics",
    "bcf.v2.model",
    "bcf.v3.model",
    "xsdata.formats.dataclass.parsers",
    "xsdata.formats.dataclass.serializers",
    "checks.report._bcf_objects",
    "checks.report.findings_out",
)


def _load_while(busy: Callable[[], bool], names: tuple[str, ...]) -> None:
    """Import ``names`` in order while ``busy()`` holds (checked before each)."""
    import importlib

    for name in names:
        if not busy():
            return
        importlib.import_module(name)


class _Stopwatch:
    """Wall-clock seconds per stage into a caller's dict (nothing when it is None)."""

    def __init__(self, into: dict[str, float] | None) -> None:
        import time

        self._into, self._now = into, time.perf_counter
        self._last = self._now()

    def lap(self, stage: str) -> None:
        now = self._now()
        if self._into is not None:
            self._into[stage] = self._into.get(stage, 0.0) + now - self._last
        self._last = now


def _check_unique_guids(ifc, source: str) -> None:
    """Refuse a file in which two products share a GlobalId.

    ISO 16739 (IFC): ``IfcRoot.GlobalId`` is unique. Every result, finding and BCF
    viewpoint is keyed by it, so a duplicate would merge two walls' forces silently.

    Raises:
        IfcContentError: Names the GlobalId and the elements that share it.
    """
    from ifc_bridge.errors import IfcContentError

    products = ifc.by_type("IfcProduct")
    # IfcRoot's first attribute is GlobalId (ISO 16739); read by position, fast
    guids = [e.get_argument(0) for e in products]
    if len(set(guids)) == len(guids):
        return
    seen: dict[str, list] = {}
    for guid, e in zip(guids, products, strict=True):
        seen.setdefault(guid, []).append(e)
    for guid, elements in seen.items():
        if len(elements) > 1:
            who = ", ".join(f"#{e.id()} {e.is_a()} {e.Name or ''!r}" for e in elements)
            msg = (
                f"{source}: GlobalId {guid} is shared by {len(elements)} elements "
                f"({who}); give each its own GlobalId (re-export the model)"
            )
            raise IfcContentError(msg)


def _requirements(ifc, model_path: str | os.PathLike) -> list[Finding]:
    """The model checked against the IDS of :mod:`checks.requirements`."""
    from checks.requirements import requirement_findings

    return requirement_findings(ifc, source=str(model_path))


def write_outputs(
    run: CheckRun,
    out_dir: str | os.PathLike,
    *,
    previous: str | os.PathLike | None = None,
    annotate: bool = False,
    bcf_version: str | None = None,
    units: str | None = None,
) -> dict[str, Path]:
    """Write results.json, the CSVs, findings.json, findings.bcf, report.html.

    Args:
        run: The check run.
        out_dir: Output folder (created).
        previous: A previous ``findings.bcf`` (or its JSON) to carry the design team's
            replies forward: gone findings are closed, new ones added.
        annotate: Also write an annotated copy of the IFC (``<model>.shearline.ifc``).
        bcf_version: ``"2.1"`` or ``"3.0"``; default from the config.
        units: Display units of the CSVs and the report; default from the config.

    Returns:
        Output kind -> path written.

    Raises:
        OutputError: The folder or a file cannot be written.
    """
    from checks.outputs import write_all

    out = Path(out_dir)
    try:
        out.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        msg = f"{out}: cannot create the output folder: {exc.strerror}"
        raise OutputError(msg) from exc
    return write_all(
        run,
        out,
        previous=previous,
        annotate=annotate,
        bcf_version=bcf_version or run.config.bcf_version,
        system=DisplayUnits(units or run.config.display_units.value),
    )
