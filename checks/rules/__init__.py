"""Code-check rules: forces and model data in, findings pinned to GlobalIds out.

One rule family per module, grouped by the standard and edition it applies
(``asce7_16``, ``sdpws_2015``) or ``model`` for the model's own data; the front door is
:func:`checks.rules.run_rules.run_checks`. Rules never raise for an engineering result:
over capacity, irregular, or missing is a ``Finding``.
"""

from __future__ import annotations

from checks.rules.run_rules import CheckResult, run_checks, sort_findings

__all__ = ["CheckResult", "run_checks", "sort_findings"]
