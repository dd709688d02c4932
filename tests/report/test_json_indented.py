"""json_indented against the standard library's encoder, its reference.

The JSON, SARIF, GitLab and dynamics writers promise the text of
``json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False)``; json_indented writes
it faster, so every case here is compared with json.dumps itself (Python's ``json``
module, the reference implementation of RFC 8259 for this project), errors included.
"""

from __future__ import annotations

import enum
import json
import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from vcheck.report.common import CUT_MARKER, ECHO_LIMIT, bounded, json_indented


def _reference(data) -> str:
    return json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False)


def _bounded_reference(data):
    """The JSON report's former walk: strings through dicts and lists cut, tuples kept."""
    if isinstance(data, str):
        return bounded(data)
    if isinstance(data, dict):
        return {key: _bounded_reference(value) for key, value in data.items()}
    if isinstance(data, list):
        return [_bounded_reference(item) for item in data]
    return data


class _Kind(str, enum.Enum):
    A = "a"


class _Level(enum.IntEnum):
    ONE = 1


class _Ratio(float):
    pass


_LONG = "x" * (ECHO_LIMIT + 5)

CASES = [
    None, True, False, 0, -7, 10**30, 0.0, -0.0, 1e16, 5e-324, 0.1, 1 / 3, 1.5e300,
    "", "plain", "quote \" backslash \\ tab \t nl \n", "\x00\x1f\x7f\x9b\u200e\u2028 ü ∑ 𝄞",
    [], {}, (), [[]], {"a": {}}, {"a": []}, [{}], [1, [2, [3, [4]]]], (1, "two", 3.0),
    {"k": 1, "l": [1, 2.5, "s", None, True, False, {"m": ()}], "n": {"o": {"p": "q"}}},
    {"ü-key": "välue", "": ""},
    [_LONG, (_LONG, [_LONG]), {"cut": _LONG, "kept": (_LONG,)}],
    {"quantities": [{"name": "f", "value": [1.0, 2.0], "unit": "Hz", "context": {}}]},
    [_Kind.A, _Level.ONE, _Ratio(0.25)],
    {"margin": np.float64(0.1), "values": [np.float64(2.5), np.float64(-0.0)]},
    {3: "int key", 2.5: "float key", True: "bool key", None: "none key"},
    [1, {"deep": [[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[
        "bottom"]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]}],
]


@pytest.mark.parametrize("data", CASES, ids=range(len(CASES)))
def test_equals_json_dumps(data):
    assert json_indented(data) == _reference(data)


@pytest.mark.parametrize("data", CASES, ids=range(len(CASES)))
def test_bounded_equals_the_bounded_walk_then_json_dumps(data):
    assert json_indented(data, bound_strings=True) == _reference(_bounded_reference(data))


def test_bounding_cuts_through_dicts_and_lists_only():
    text = json_indented({"a": [_LONG], "b": (_LONG,)}, bound_strings=True)
    assert text.count(CUT_MARKER.format(count=5)) == 1
    assert text.count(_LONG) == 1


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf, [1.0, math.nan],
                                 {"a": np.float64(math.nan)}, [np.float64(math.inf)],
                                 {"a": {"b": -math.inf}}, [object()], {"a": {1, 2}}])
def test_refuses_what_json_dumps_refuses_with_its_message(bad):
    with pytest.raises((ValueError, TypeError)) as expected:
        _reference(bad)
    with pytest.raises(expected.type) as got:
        json_indented(bad)
    assert str(got.value) == str(expected.value)


def test_a_cycle_is_refused_as_json_dumps_refuses_it():
    loop: list = []
    loop.append(loop)
    with pytest.raises(ValueError, match="Circular reference detected"):
        json_indented(loop)


_leaves = (st.none() | st.booleans() | st.integers() | st.floats(allow_nan=False,
           allow_infinity=False) | st.text(max_size=8))
_data = st.recursive(
    _leaves,
    lambda inner: (st.lists(inner, max_size=4) | st.tuples(inner, inner)
                   | st.dictionaries(st.text(max_size=4), inner, max_size=4)),
    max_leaves=30)


@settings(max_examples=300, deadline=None)
@given(_data)
def test_equals_json_dumps_on_generated_data(data):
    assert json_indented(data) == _reference(data)
    assert json_indented(data, bound_strings=True) == _reference(_bounded_reference(data))
