"""The quick builders of findings and quantities against the standard library's, the
reference for what they promise (Python documentation, dataclasses: the generated
``__init__`` sets the fields in order and then calls ``__post_init__``; ``replace`` makes
a new instance with some fields changed): :func:`vcheck.findings.computed`, which builds
its Quantity without the generated ``__init__`` and remembers context pairs,
``Rule.finding``, which builds its Finding the same way, and
``vcheck.findings._finding_with``, the ``replace`` of a finding."""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest

from vcheck import findings
from vcheck.engine import Rule
from vcheck.findings import Finding, Measure, Quantity, Source, Status, computed


def _plain(value):
    number = float(value)
    return number if math.isfinite(number) else None


def reference_computed(name, value, unit="1", **context):
    """computed() as written before it remembered contexts: the generated __init__."""
    if isinstance(value, (list, tuple)) or hasattr(value, "__len__"):
        plain = tuple(_plain(v) for v in value)
    else:
        plain = _plain(value)
    pairs = sorted((key.replace("_", "-"), str(text)) for key, text in context.items()
                   if text is not None)
    return Quantity(name, plain, unit, tuple(pairs))


def _same(fast: Quantity, reference: Quantity) -> None:
    assert fast == reference
    assert hash(fast) == hash(reference)
    assert repr(fast) == repr(reference)
    assert fast.__dict__ == reference.__dict__
    assert list(fast.__dict__) == list(reference.__dict__)  # the field order
    assert type(fast.value) is type(reference.value)
    if isinstance(fast.value, tuple):
        assert [type(v) for v in fast.value] == [type(v) for v in reference.value]


VALUES = [0.5, -0.0, 1e300, math.inf, -math.inf, math.nan, 3, True, np.float64(2.5),
          np.float32(0.1), np.int64(7), np.float64(np.inf), (1.0, math.inf, 2),
          [0.25, np.float64(math.nan)], np.array([1.0, 2.0]), ()]

CONTEXTS = [{}, {"mode": "bounce"}, {"band": "1x running speed", "mode": "bounce"},
            {"load_shape": "sine", "mode": None}, {"detail": "weld", "bin": "ranges 1-2 MPa"},
            {"joint": 2}, {"joint": 2.0}, {"joint": True}, {"joint": "2"},
            {"order": np.float64(1.5)}, {"rows": [1, 2]}, {"z": "last", "a": "first"}]


@pytest.mark.parametrize("value", VALUES, ids=repr)
def test_computed_equals_the_dataclass_built_quantity(value):
    for context in CONTEXTS:
        for _ in range(2):  # the second call meets the remembered context
            _same(computed("natural frequency", value, "Hz", **context),
                  reference_computed("natural frequency", value, "Hz", **context))


def test_equal_contexts_of_other_types_keep_their_own_texts():
    # 2, 2.0 and True are equal keys of a dict but read "2", "2.0" and "True"
    texts = [computed("n", 1.0, joint=value).context for value in (2, 2.0, True, "2", 2)]
    assert texts == [(("joint", "2"),), (("joint", "2.0"),), (("joint", "True"),),
                     (("joint", "2"),), (("joint", "2"),)]


def test_a_str_subclass_equal_to_a_remembered_text_keeps_its_own_text():
    # a str-valued Enum member equals its value but prints as the member (Python 3.11)
    import enum

    class Kind(str, enum.Enum):
        PUMP = "pump"

    first = computed("n", 1.0, kind="pump").context
    second = computed("n", 1.0, kind=Kind.PUMP).context
    assert first == (("kind", "pump"),)
    assert second == (("kind", str(Kind.PUMP)),)


def test_the_remembered_contexts_stay_bounded():
    for number in range(findings._CONTEXTS_KEPT + 50):
        computed("n", 1.0, detail=f"detail {number}")
    assert 0 < len(findings._CONTEXTS) <= findings._CONTEXTS_KEPT
    assert computed("n", 1.0, detail="detail 3").context == (("detail", "detail 3"),)


class _Design:
    """The two things Rule.finding reads of a design."""

    class machine:
        tag = "P-101"

    def locate(self, path):
        return "pumps/p101.toml", 12 + len(path), 3


class _Rule(Rule):
    """A rule for the test."""

    id = "test-rule"
    title = "test"
    applies_to = "machine"
    sources = (Source("a handbook"), Source("a habit", "common practice"))


def test_rule_finding_equals_the_dataclass_built_finding():
    rule = _Rule()
    quantity = computed("damage", 0.25, detail="weld")
    arguments = dict(measured=Measure("damage", 0.25), limit=Measure("allowed", 1.0),
                     margin=0.75, assumptions=iter(["one", "two"]), advice=["do this"],
                     table=[["a", "b"], ("c", "d")], table_title="bins",
                     quantities=[quantity])
    for path, extra in ((("fatigue", 0, "detail"), arguments), ((), {}),
                        (("joint", 1), {"sources": [Source("other")]})):
        fast = rule.finding(_Design(), path, Status.WARN, "a message", **extra)
        extra = dict(extra, assumptions=["one", "two"]) if extra is arguments else extra
        reference = Finding(
            rule_id="test-rule", status=Status.WARN, message="a message",
            file="pumps/p101.toml", line=12 + len(path), column=3, target="P-101",
            key_path={3: "fatigue[1].detail", 0: "", 2: "joint[2]"}[len(path)],
            measured=extra.get("measured"), limit=extra.get("limit"),
            margin=extra.get("margin"), assumptions=tuple(extra.get("assumptions", ())),
            advice=tuple(extra.get("advice", ())),
            sources=tuple(extra.get("sources", _Rule.sources)),
            table=tuple(tuple(row) for row in extra.get("table", ())),
            table_title=extra.get("table_title", ""),
            quantities=tuple(extra.get("quantities", ())))
        assert fast == reference
        assert fast.fingerprint == reference.fingerprint != ""
        assert fast.__dict__ == reference.__dict__
        assert list(fast.__dict__) == list(reference.__dict__)
        assert repr(fast) == repr(reference)


def test_finding_with_equals_replace():
    rule = _Rule()
    original = rule.finding(_Design(), ("joint", 0), Status.FAIL, "slips",
                            assumptions=["dry"], quantities=[computed("slip safety", 0.9)])
    for changes in ({"policy": "site"}, {"line": 40, "column": 1}, {}):
        fast = findings._finding_with(original, **changes)
        reference = replace(original, **changes)
        assert fast == reference and fast is not original
        assert fast.__dict__ == reference.__dict__
        assert list(fast.__dict__) == list(reference.__dict__)
    assert original.policy == "default" and original.line == 14  # left as it was
    with pytest.raises(TypeError):
        findings._finding_with(original, colour="red")
    with pytest.raises(TypeError):
        replace(original, colour="red")
