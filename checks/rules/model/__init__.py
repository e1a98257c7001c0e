"""Rules about the model's own data: import issues and shear walls with no assembly."""

from __future__ import annotations

from checks.rules.model.import_issues import check_import_issues
from checks.rules.model.unmatched_shear_walls import check_unmatched_shear_walls

__all__ = ["check_import_issues", "check_unmatched_shear_walls"]
