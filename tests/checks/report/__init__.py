"""Tests of the checks.report writers and readers."""
