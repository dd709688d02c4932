"""vcheck.records.Record against the standard library's frozen dataclass, the reference
implementation of the behaviour it promises (Python documentation, dataclasses: fields
from the annotations in order, defaults, equality and hashing by the tuple of fields,
a repr naming them, FrozenInstanceError on assignment)."""

from __future__ import annotations

import copy
import pickle
from dataclasses import FrozenInstanceError, dataclass, fields
from typing import ClassVar

import pytest

from vcheck.records import Record


class Band(Record):
    name: str
    low: float
    high: float = 2.0
    notes: tuple[str, ...] = ()
    scale: ClassVar[float] = 10.0  # a class variable, not a field

    @property
    def width(self) -> float:
        return self.high - self.low


@dataclass(frozen=True)
class BandReference:
    name: str
    low: float
    high: float = 2.0
    notes: tuple[str, ...] = ()
    scale: ClassVar[float] = 10.0


class Tagged(Band):
    tag: str = "t"


@dataclass(frozen=True)
class TaggedReference(BandReference):
    tag: str = "t"


class Working(Record, frozen=False):
    status: str
    ratio: float = 1.0


@dataclass
class WorkingReference:
    status: str
    ratio: float = 1.0


class Derived(Record):
    value: float
    twice: float = 0.0

    def __post_init__(self) -> None:
        object.__setattr__(self, "twice", 2 * self.value)


CASES = [(("a", 1.0), {}), (("a",), {"low": 1.0, "high": 3.0}),
         ((), {"name": "b", "low": 0.5, "notes": ("x",)}), (("c", 1.0, 4.0, ("y", "z")), {})]


def _shown(item) -> str:
    return repr(item).replace("Reference(", "(")


@pytest.mark.parametrize(("args", "kwargs"), CASES)
def test_fields_defaults_equality_hash_and_repr_match_a_frozen_dataclass(args, kwargs):
    record, reference = Band(*args, **kwargs), BandReference(*args, **kwargs)
    assert Band._fields == ("name", "low", "high", "notes")
    assert tuple(getattr(record, n) for n in Band._fields) == \
        tuple(getattr(reference, n) for n in Band._fields)
    assert _shown(record) == _shown(reference)
    assert hash(record) == hash(reference)  # both hash the tuple of fields
    assert record == Band(*args, **kwargs)
    assert record != Band("other", 9.0)
    assert record != reference  # another class is never equal, as for dataclasses
    assert record.width == reference.high - reference.low
    assert Band.scale == 10.0 and "scale" not in vars(record)


def test_a_subclass_takes_its_bases_fields_first_as_a_dataclass_does():
    record, reference = Tagged("a", 1.0, 2.0, (), "u"), TaggedReference("a", 1.0, 2.0, (), "u")
    assert Tagged._fields == ("name", "low", "high", "notes", "tag")
    assert _shown(record) == _shown(reference)
    assert Tagged("a", 1.0).tag == TaggedReference("a", 1.0).tag == "t"


def test_assignment_and_deletion_are_refused_with_the_dataclass_error():
    record, reference = Band("a", 1.0), BandReference("a", 1.0)
    for target in (record, reference):
        with pytest.raises(FrozenInstanceError, match="^cannot assign to field 'low'$"):
            target.low = 2.0
        with pytest.raises(FrozenInstanceError, match="^cannot delete field 'low'$"):
            del target.low
    assert record.low == 1.0


def test_a_record_whose_fields_may_be_reassigned_is_unhashable_as_a_mutable_dataclass():
    record, reference = Working("pass"), WorkingReference("pass")
    record.status = reference.status = "fail"
    assert (record.status, record.ratio) == (reference.status, reference.ratio)
    assert _shown(record) == _shown(reference)
    assert record == Working("fail", 1.0)
    for target in (record, reference):
        with pytest.raises(TypeError, match="unhashable type"):
            hash(target)


def test_post_init_runs_after_the_fields_are_set():
    assert Derived(1.5).twice == 3.0
    assert Derived(1.5) == Derived(1.5, 7.0)  # the derived field is recomputed


def test_wrong_arguments_are_refused_with_a_plain_message():
    with pytest.raises(TypeError, match=r"^Band\(\) takes 4 arguments but 5 were given$"):
        Band("a", 1.0, 2.0, (), "extra")
    with pytest.raises(TypeError, match=r"^Band\(\) got an unexpected keyword argument 'hi'$"):
        Band("a", 1.0, hi=3.0)
    with pytest.raises(TypeError, match=r"^Band\(\) got multiple values for argument 'low'$"):
        Band("a", 1.0, low=3.0)
    with pytest.raises(TypeError, match=r"^Band\(\) missing 2 required arguments: 'name', "
                                        r"'low'$"):
        Band(high=3.0)
    with pytest.raises(TypeError, match=r"^Band\(\) missing 1 required argument: 'low'$"):
        Band("a")


def test_a_class_that_a_dataclass_would_refuse_is_refused():
    mutable = {"__annotations__": {"items": "list"}, "items": []}
    with pytest.raises(ValueError, match="mutable default"):
        dataclass(frozen=True)(type("Reference", (), dict(mutable)))
    with pytest.raises(ValueError, match=r"\.Bad\.items: mutable default list is not "
                                         r"allowed$"):
        class Bad(Record):
            items: list = []  # noqa: RUF012 - the point of the test
    order = {"__annotations__": {"first": "int", "second": "int"}, "first": 1}
    with pytest.raises(TypeError, match="non-default argument 'second' follows default"):
        dataclass(frozen=True)(type("Reference", (), dict(order)))
    with pytest.raises(TypeError, match=r"\.Order: non-default argument 'second' follows "
                                        r"default argument$"):
        class Order(Record):
            first: int = 1
            second: int


def test_records_survive_pickle_and_copy():
    record = Tagged("a", 1.0, notes=("n",))
    for again in (pickle.loads(pickle.dumps(record)), copy.copy(record),
                  copy.deepcopy(record)):
        assert again == record and again is not record
        with pytest.raises(FrozenInstanceError):
            again.low = 0.0


def test_class_variables_are_not_fields_with_annotations_as_objects_or_as_text():
    # a module without `from __future__ import annotations` gives the objects themselves
    plain = type("Plain", (Record,), {"__annotations__": {"a": float, "k": ClassVar[int]},
                                      "k": 3})
    reference = dataclass(frozen=True)(type("Plain", (), {
        "__annotations__": {"a": float, "k": ClassVar[int]}, "k": 3}))
    assert plain._fields == ("a",) == tuple(f.name for f in fields(reference))
    assert plain(1.0).k == 3 and repr(plain(1.0)) == repr(reference(1.0))
