"""Rigid-diaphragm allocation against OpenSeesPy (rigidDiaphragm + zeroLength springs).

OpenSees solves the same one-story problem by the stiffness method with a
rigid-diaphragm constraint, independently of the closed form in allocation/rigid.py.
Agreement is to 1e-6 of the story shear (both are exact up to round-off).
"""

from __future__ import annotations

import numpy as np
import pytest

from allocation.results import LoadCase, Pier
from allocation.rigid import allocate_rigid, rigid_cases
from ifc_bridge.model import Direction
from tests.allocation._opensees import solve_story
from tests.allocation._piers import wall


def _walls(piers: list[Pier]) -> list[tuple[str, str, float, float, float]]:
    return [(p.name, p.direction.value, *p.midpoint, p.stiffness) for p in piers]


def _reference_layout() -> list[Pier]:
    """LIBRARY-NOTES §4: Y walls k = 400/200/100 at x = 0/30/60, X walls 300/150 at
    y = 0/40 (kip/ft and ft in the notes; the problem is linear, units cancel)."""
    return [
        wall("A", "Y", 0.0, 20.0, 400.0),
        wall("B", "Y", 30.0, 20.0, 200.0),
        wall("C", "Y", 60.0, 20.0, 100.0),
        wall("D", "X", 30.0, 0.0, 300.0),
        wall("E", "X", 30.0, 40.0, 150.0),
    ]


REFERENCE = {  # LIBRARY-NOTES §4 closed form, reproduced by OpenSees (kip, 4 decimals)
    "A": 32.3699,
    "B": 37.8613,
    "C": 29.7688,
    "D": 14.4509,
    "E": -14.4509,
}


def test_reference_table():
    piers = _reference_layout()
    r = allocate_rigid(
        piers,
        level="L1",
        story_shear=100.0,
        center_of_mass=(35.0, 20.0),
        plan_extent=(0.0, 0.0, 60.0, 40.0),
        case=LoadCase(direction=Direction.Y, sign=1, ecc_sign=1),
        accidental_eccentricity=0.0,
    )
    xcr, ycr = r.center_of_rigidity
    torsional_stiffness = r.J
    assert xcr == pytest.approx(17.143, abs=1e-3)  # LIBRARY-NOTES §4
    assert ycr == pytest.approx(13.333, abs=1e-3)  # LIBRARY-NOTES §4
    assert torsional_stiffness == pytest.approx(494285.7, abs=0.1)  # LIBRARY-NOTES §4
    assert r.torsion == pytest.approx(1785.7, abs=0.1)  # LIBRARY-NOTES §4
    for p in piers:  # table printed to 4 decimals: half a unit of the last digit
        assert r.pier_forces[p.id] == pytest.approx(REFERENCE[p.name], abs=5e-5)
    ops_forces, _ = solve_story(_walls(piers), Fx=0.0, Fy=100.0, at=(35.0, 20.0))
    for p in piers:  # OpenSees: same problem, stiffness method
        assert r.pier_forces[p.id] == pytest.approx(ops_forces[p.name], abs=1e-9)


def _random_layout(seed: int) -> tuple[list[Pier], tuple[float, float], tuple]:
    """Seeded plan Lx × Ly, walls anywhere inside it: 1-5 in one direction, 2-5 in
    the other (torsionally stable; one wall per direction would be a mechanism)."""
    rng = np.random.default_rng(seed)
    Lx, Ly = rng.uniform(8.0, 40.0, size=2)
    piers = []
    for d in ("X", "Y"):
        low = 2 if (d == "X") == (seed % 2 == 0) else 1
        for i in range(int(rng.integers(low, 6))):
            x, y = rng.uniform(0.0, Lx), rng.uniform(0.0, Ly)
            k = float(rng.uniform(0.5, 5.0) * 1e7)  # N/m
            piers.append(
                wall(
                    f"{d}{i}",
                    d,
                    float(x),
                    float(y),
                    k,
                    length=float(rng.uniform(1.0, 6.0)),
                )
            )
    cm = (float(rng.uniform(0.2, 0.8) * Lx), float(rng.uniform(0.2, 0.8) * Ly))
    return piers, cm, (0.0, 0.0, float(Lx), float(Ly))


def _end_displacements(
    motion: tuple[float, float, float],
    at: tuple[float, float],
    direction: Direction,
    extent: tuple,
) -> list[float]:
    """Rigid-body displacement along the force at the two plan extremes."""
    ux, uy, rz = motion
    xmin, ymin, xmax, ymax = extent
    if direction is Direction.X:
        return [ux - rz * (y - at[1]) for y in (ymin, ymax)]
    return [uy + rz * (x - at[0]) for x in (xmin, xmax)]


@pytest.mark.parametrize("seed", range(6))
@pytest.mark.parametrize("direction", [Direction.X, Direction.Y])
def test_random_layouts_match_opensees(seed, direction):
    piers, cm, extent = _random_layout(seed)
    V, ecc = 250e3, 0.05  # N; ASCE 7-16 §12.8.4.2 5 %
    for case in rigid_cases(direction):
        r = allocate_rigid(
            piers,
            level="L1",
            story_shear=V,
            center_of_mass=cm,
            plan_extent=extent,
            case=case,
            accidental_eccentricity=ecc,
            Ax=1.7,
        )
        width = extent[3] if direction is Direction.X else extent[2]
        shift = case.ecc_sign * ecc * width * 1.7
        at = (
            (cm[0], cm[1] + shift)
            if direction is Direction.X
            else (cm[0] + shift, cm[1])
        )
        F = case.sign * V
        Fx, Fy = (F, 0.0) if direction is Direction.X else (0.0, F)
        forces, _ = solve_story(_walls(piers), Fx=Fx, Fy=Fy, at=at)
        for p in piers:  # independent solver, 1e-6 of V
            assert r.pier_forces[p.id] == pytest.approx(forces[p.name], abs=1e-6 * V)


@pytest.mark.parametrize("seed", range(6))
@pytest.mark.parametrize("direction", [Direction.X, Direction.Y])
def test_drift_ratio_matches_opensees(seed, direction):
    piers, cm, extent = _random_layout(seed)
    for ecc_sign in (1, -1):
        case = LoadCase(direction=direction, sign=1, ecc_sign=ecc_sign)
        r = allocate_rigid(
            piers,
            level="L1",
            story_shear=1e5,
            center_of_mass=cm,
            plan_extent=extent,
            case=case,
            accidental_eccentricity=0.05,
        )
        if direction is Direction.X:
            at, Fx, Fy = (cm[0], cm[1] + ecc_sign * 0.05 * extent[3]), 1e5, 0.0
        else:
            at, Fx, Fy = (cm[0] + ecc_sign * 0.05 * extent[2], cm[1]), 0.0, 1e5
        _, motion = solve_story(_walls(piers), Fx=Fx, Fy=Fy, at=at)
        u = _end_displacements(motion, at, direction, extent)
        avg = 0.5 * (u[0] + u[1])  # ASCE 7-16 Table 12.3-1: mean of the ends, signed
        if avg <= 0 or max(u) / avg > 100.0:
            assert r.drift_ratio_max == 100.0  # allocation.rigid.DRIFT_RATIO_LIMIT
        else:
            assert r.drift_ratio_max == pytest.approx(max(u) / avg, rel=1e-6)
