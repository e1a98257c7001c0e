"""walls.csv and lines.csv: unit-bearing headers, values in display units.

Conversion factors are exact or from NIST SP 811 (2008), Appendix B.8, independent of
the project's pint registry.
"""

from __future__ import annotations

import csv
import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from checks.project import DisplayUnits
from checks.report.csv_tables import _shown, write_lines_csv, write_walls_csv
from checks.units import to_display
from tests.checks.report._demo_run import demo_run

KIP = 4448.2216152605  # N per kip, NIST SP 811 B.8 (1 lbf = 4.448 221 615 260 5 N)
FT = 0.3048  # m per ft, exact by definition (NIST SP 811 B.8)
PLF = KIP / 1000.0 / FT  # N/m per lbf/ft = 14.593902937 (NIST SP 811 B.8)

# (system, force factor, length factor, unit shear factor, header units) SI -> display
SYSTEMS = [
    (DisplayUnits.IMPERIAL, KIP, FT, PLF, ("kip", "ft", "plf")),
    (DisplayUnits.SI, 1000.0, 1.0, 1000.0, ("kN", "m", "kN_per_m")),  # SI prefixes
]


@pytest.fixture(scope="module")
def run():
    return demo_run()


def _read(path):
    with path.open(encoding="utf-8", newline="") as fh:
        return list(csv.DictReader(fh))


@pytest.mark.parametrize(("system", "f_n", "l_m", "v_npm", "units"), SYSTEMS)
def test_walls_csv(run, tmp_path, system, f_n, l_m, v_npm, units):
    fu, lu, vu = units
    checks = run.checks.pier_checks
    rows = _read(
        write_walls_csv(
            tmp_path / "walls.csv", run.allocation, pier_checks=checks, system=system
        )
    )
    assert len(rows) == len(run.allocation.piers)
    for col in (
        f"length_{lu}",
        f"height_{lu}",
        f"flexible_force_{fu}",
        f"rigid_force_{fu}",
        f"envelope_force_{fu}",
        f"unit_shear_{vu}",
        f"capacity_{vu}",
        "dcr",
    ):
        assert col in rows[0]
    for p, row in zip(run.allocation.piers, rows, strict=True):
        env, c = run.allocation.envelope[p.id], checks[p.id]
        assert row["guid"] == p.guid
        assert row["name"] == p.name
        assert float(row[f"length_{lu}"]) == pytest.approx(p.length / l_m, rel=1e-5)
        assert float(row[f"envelope_force_{fu}"]) == pytest.approx(
            env.envelope / f_n, rel=1e-5
        )
        assert float(row[f"rigid_force_{fu}"]) == pytest.approx(
            env.rigid / f_n, rel=1e-5
        )
        assert float(row[f"unit_shear_{vu}"]) == pytest.approx(
            c.unit_shear / v_npm, rel=1e-5
        )
        assert float(row[f"capacity_{vu}"]) == pytest.approx(
            c.capacity / v_npm, rel=1e-5
        )
        assert float(row["dcr"]) == pytest.approx(c.dcr, abs=5e-5)  # 4 decimals


@pytest.mark.parametrize(("system", "f_n", "l_m", "v_npm", "units"), SYSTEMS)
def test_lines_csv(run, tmp_path, system, f_n, l_m, v_npm, units):
    fu, lu, _ = units
    rows = _read(write_lines_csv(tmp_path / "lines.csv", run.allocation, system=system))
    assert [r["id"] for r in rows] == [ln.id for ln in run.allocation.lines]
    for ln, row in zip(run.allocation.lines, rows, strict=True):
        forces = run.allocation.line_envelope[ln.id]
        assert float(row[f"offset_{lu}"]) == pytest.approx(
            ln.offset / l_m, rel=1e-5, abs=1e-9
        )
        assert float(row[f"collector_length_{lu}"]) == pytest.approx(
            ln.collector_length / l_m, rel=1e-5, abs=1e-9
        )
        for method in ("flexible", "rigid", "envelope"):
            assert float(row[f"{method}_force_{fu}"]) == pytest.approx(
                forces[method] / f_n, rel=1e-5
            )
        assert int(row["piers"]) == len(ln.piers)


def test_markup_in_names_kept_verbatim(tmp_path):
    from tests.checks.report._demo_run import HOSTILE_NAMES, hostile_run

    r = hostile_run()
    rows = _read(
        write_walls_csv(
            tmp_path / "w.csv",
            r.allocation,
            pier_checks=r.checks.pier_checks,
            system=DisplayUnits.IMPERIAL,
        )
    )
    assert set(HOSTILE_NAMES) <= {row["name"] for row in rows}  # CSV is data, not HTML


# a few values, drawn again and again as a column's repeated lengths would be
_CELL = st.sampled_from(
    [0.0, -0.0, 1.0, 1, True, -2.5, 1e-300, 3.0, math.nan, math.inf, None]
) | st.floats(allow_nan=True)


@pytest.mark.parametrize("system", list(DisplayUnits))
@given(column=st.lists(_CELL, max_size=40))
def test_each_cell_reads_as_its_value_formatted_alone(system, column):
    # the column's remembered texts change nothing: -0 stays -0, nan stays nan
    factor, _ = to_display(1.0, "force", system)
    shown = _shown("force", system)
    for value in column:
        alone = "" if value is None else f"{float(value) * factor:.6g}"
        assert shown(value) == alone
