"""The indented JSON encoder writes exactly what ``json.dumps(indent=2)`` writes.

The reference is the Python standard library's ``json`` module (RFC 8259 text): every
document, the fast path for lists of same-shaped records included, must give the same
characters, and refuse the same values with the same exception types.
"""

from __future__ import annotations

import enum
import json
import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from checks.report._json_text import dumps_indented
from checks.report.results_json import results_document
from tests.checks.report._demo_run import demo_run

_TEXT = st.text(
    alphabet=st.characters(blacklist_categories=("Cs",)) | st.sampled_from('"\\%\0\n/'),
    max_size=12,
)
_SCALARS = (
    st.none()
    | st.booleans()
    | st.integers(-(10**20), 10**20)
    | st.floats(allow_nan=False, allow_infinity=False)
    | _TEXT
)
_JSON = st.recursive(
    _SCALARS,
    lambda inner: (
        st.lists(inner, max_size=5) | st.dictionaries(_TEXT, inner, max_size=5)
    ),
    max_leaves=40,
)


def _reference(obj, *, ensure_ascii: bool = True) -> str:
    return json.dumps(obj, indent=2, ensure_ascii=ensure_ascii, allow_nan=False)


@settings(max_examples=300)
@given(obj=_JSON, ensure_ascii=st.booleans())
def test_any_document_matches_the_standard_library(obj, ensure_ascii):
    # Python standard library json.dumps(indent=2) is the reference
    assert dumps_indented(obj, ensure_ascii=ensure_ascii) == _reference(
        obj, ensure_ascii=ensure_ascii
    )


def _record(draw_values) -> dict:
    return {
        "guid": draw_values[0],
        "n": draw_values[1],
        "xy": [draw_values[2], draw_values[3]],
        "force": {"a": draw_values[4], "b%s": draw_values[5]},
        "empty": [],
        "none": {},
    }


@settings(max_examples=200)
@given(
    rows=st.lists(st.lists(_SCALARS, min_size=6, max_size=6), min_size=8, max_size=20)
)
def test_lists_of_records_match_the_standard_library(rows):
    # the fast path (same-shaped dicts, one C encoder call); reference: json.dumps
    records = [_record(r) for r in rows]
    doc = {"walls": records, "deeper": {"walls": records}}
    assert dumps_indented(doc) == _reference(doc)


# few values, so that columns repeat: equal keys with different text (0.0 and -0.0,
# 1 and 1.0 and True) must keep their own text
_REPEATED = st.sampled_from(
    [0.0, -0.0, 1.0, 1, True, False, None, "a", "é", 2.5, -2.5, 10**20, 1e300]
)


@settings(max_examples=200)
@given(
    rows=st.lists(st.lists(_REPEATED, min_size=6, max_size=6), min_size=8, max_size=30),
    ensure_ascii=st.booleans(),
)
def test_records_of_repeated_values_match_the_standard_library(rows, ensure_ascii):
    # reference: json.dumps; the fast path encodes a repeated column value once
    records = [_record(r) for r in rows]
    assert dumps_indented(records, ensure_ascii=ensure_ascii) == _reference(
        records, ensure_ascii=ensure_ascii
    )


@pytest.mark.parametrize(
    ("bad", "error"),
    [
        ({0: {"n": math.nan}, 3: {"guid": object()}}, ValueError),
        ({0: {"guid": object()}, 3: {"n": math.nan}}, TypeError),
        ({5: {"xy": [math.inf, 1.0]}}, ValueError),
    ],
)
def test_the_first_refused_value_in_document_order_decides_the_error(bad, error):
    # as json.dumps: the value met first raises, whatever column it sits in
    rows = [_record(["g", 1, 0.5, 1.5, 2.0, 3.0]) for _ in range(10)]
    for at, change in bad.items():
        rows[at] = {**rows[at], **change}
    with pytest.raises(error):
        _reference(rows)
    with pytest.raises(error):
        dumps_indented(rows)


@pytest.mark.parametrize(
    "odd",
    [
        {"xy": [[1, 2], 3]},  # a container where the first record has a scalar
        {"xy": [1.0]},  # a shorter list
        {"force": {"a": 1.0}},  # other keys in a nested dict
        {"guid": [1]},  # a one-item list in a scalar's place
        {"guid": {}},  # an empty container in a scalar's place
        {"n": {"deep": [1, {"x": 2}]}},
    ],
)
def test_records_that_differ_in_shape_fall_back(odd):
    base = [_record(["g", 1, 0.5, 1.5, 2.0, 3.0]) for _ in range(10)]
    base[4] = {**base[4], **odd}
    assert dumps_indented(base) == _reference(base)  # reference: json.dumps


def test_subclasses_encode_as_their_base_type():
    class Kind(enum.StrEnum):
        PIER = "pier"

    class Count(enum.IntEnum):
        TWO = 2

    doc = [{"k": Kind.PIER, "c": Count.TWO, "t": (1, 2)} for _ in range(9)]
    doc.append({"k": Kind.PIER, "c": Count.TWO, "t": (Kind.PIER,)})
    assert dumps_indented(doc) == _reference(doc)  # reference: json.dumps


def test_non_string_keys_match_the_standard_library():
    doc = {1: "a", 2.5: "b", False: "c", None: "d"}
    assert dumps_indented(doc) == _reference(doc)  # reference: json.dumps


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf])
def test_non_finite_floats_are_refused(bad):
    # RFC 8259 §6: NaN and Infinity are not JSON numbers
    with pytest.raises(ValueError, match="not JSON compliant"):
        dumps_indented({"x": bad})
    rows = [{"x": 1.0} for _ in range(9)] + [{"x": bad}]
    with pytest.raises(ValueError, match="not JSON compliant"):
        dumps_indented(rows)


def test_unknown_types_are_refused():
    with pytest.raises(TypeError, match="not JSON serializable"):
        dumps_indented({"x": object()})
    rows = [{"x": 1.0} for _ in range(9)] + [{"x": {1, 2}}]
    with pytest.raises(TypeError, match="not JSON serializable"):
        dumps_indented(rows)
    with pytest.raises(TypeError, match="keys must be"):
        dumps_indented({(1, 2): 3})


def test_demo_results_document_matches_the_standard_library():
    run = demo_run()
    doc = results_document(
        run.allocation, source="demo.ifc", pier_checks=run.checks.pier_checks
    )
    assert dumps_indented(doc) == _reference(doc)  # reference: json.dumps
