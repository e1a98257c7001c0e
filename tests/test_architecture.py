"""The dependency direction of DESIGN.md: ifc_bridge -> allocation -> checks."""

from __future__ import annotations

import ast
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]

FORBIDDEN = {
    "allocation": {"ifcopenshell", "pint", "bcf", "checks", "ifctester"},
    "ifc_bridge": {"allocation", "checks", "pint", "bcf"},
}


def _imports(path: Path) -> set[str]:
    tree = ast.parse(path.read_text(encoding="utf-8"))
    names: set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            names.update(a.name.split(".")[0] for a in node.names)
        elif isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            names.add(node.module.split(".")[0])
    return names


@pytest.mark.parametrize("package", sorted(FORBIDDEN))
def test_package_imports_only_downstream(package):  # DESIGN.md data flow
    bad = {
        str(p.relative_to(ROOT)): sorted(_imports(p) & FORBIDDEN[package])
        for p in (ROOT / package).rglob("*.py")
    }
    assert {k: v for k, v in bad.items() if v} == {}


def _fresh_python(code: str) -> str:
    """What ``code`` prints in a new interpreter started in the project root."""
    out = subprocess.run(
        [sys.executable, "-c", code],
        cwd=ROOT,
        capture_output=True,
        text=True,
        check=True,
    )
    return out.stdout


def test_model_and_allocation_import_without_ifcopenshell():  # STYLE.md §2.1
    code = (
        "import sys, ifc_bridge, ifc_bridge.model, allocation.results, "
        "allocation.parameters; print('ifcopenshell' in sys.modules)"
    )
    assert _fresh_python(code).strip() == "False"


def test_package_names_load_with_their_module():  # PEP 562 module __getattr__
    code = (
        "import sys, ifc_bridge, ifc_bridge.errors; "
        "print('shapely' in sys.modules, 'ifc_bridge.model' in sys.modules); "
        "from ifc_bridge import BuildingModel, IfcFileError; "
        "import ifc_bridge.model as m, ifc_bridge.errors as e; "
        "print(BuildingModel is m.BuildingModel, IfcFileError is e.IfcFileError)"
    )
    assert _fresh_python(code).split() == ["False", "False", "True", "True"]
    import ifc_bridge

    with pytest.raises(AttributeError, match="no attribute 'Nope'"):
        ifc_bridge.Nope  # noqa: B018
