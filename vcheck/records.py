"""Records of vcheck's own working results, cheap to define.

``@dataclass`` writes the source of an ``__init__``, ``__repr__``, ``__eq__``, ``__hash__``,
``__setattr__`` and ``__delattr__`` for every class it decorates and compiles it when the
module is imported: about 1.3 ms a class, some 60 ms of a check of the bundled example.
A :class:`Record` subclass behaves as a frozen dataclass of the simple kind (fields from the
class annotations, in order, with their defaults; equality and hashing by value; a repr
naming the fields; assignment refused) through methods compiled once, in this module.
``class Name(Record, frozen=False)`` makes a record whose fields may be reassigned (it is
then unhashable, as a mutable dataclass with ``eq`` is).

What a rule or a writer of a plugin receives (findings, quantities, measures, sources, the
analysis bands, results, design values) stays a dataclass: :func:`dataclasses.replace` and
:func:`dataclasses.fields` work on those. Records are for the numbers rules and the
analysis keep for themselves. A field default must be immutable (a number, a string, a
tuple, None); a field that needs a fresh dict or list is given one by the code that builds
the record.
"""

from __future__ import annotations

import sys
from dataclasses import FrozenInstanceError

__all__ = ["Record"]

_MISSING = object()

_MUTABLE_DEFAULTS = (list, dict, set, bytearray)

if sys.version_info >= (3, 11):
    from typing import dataclass_transform
else:  # pragma: no cover - Python 3.10
    def dataclass_transform(**_):
        return lambda cls: cls


def _is_class_variable(annotation) -> bool:
    text = annotation if isinstance(annotation, str) else getattr(annotation, "__name__", "")
    return str(text).startswith(("ClassVar", "typing.ClassVar"))


@dataclass_transform(frozen_default=True)
class Record:
    """Base of a read-only record: fields from the annotations, defaults from the class.

    ``Record`` subclasses may subclass each other (the fields of a base come first) and
    define methods and properties; ``__post_init__``, when defined, runs after the fields
    are set (it may set derived fields with ``object.__setattr__``).
    """

    __slots__ = ()
    _fields: tuple[str, ...] = ()
    _field_set: frozenset = frozenset()
    _defaults: dict = {}
    _frozen: bool = True

    def __init_subclass__(cls, frozen: bool = True, **kwargs) -> None:
        super().__init_subclass__(**kwargs)
        fields = list(cls._fields)
        defaults = dict(cls._defaults)
        for name, annotation in cls.__dict__.get("__annotations__", {}).items():
            if _is_class_variable(annotation):
                continue
            if name.startswith("__") or name in ("_fields", "_field_set", "_defaults",
                                                 "_frozen"):
                raise TypeError(f"{cls.__qualname__}: '{name}' cannot be a field name")
            if name not in fields:
                fields.append(name)
            value = cls.__dict__.get(name, _MISSING)
            if value is not _MISSING:
                if isinstance(value, _MUTABLE_DEFAULTS):
                    raise ValueError(f"{cls.__qualname__}.{name}: mutable default "
                                     f"{type(value).__name__} is not allowed")
                defaults[name] = value
            elif defaults and name not in defaults:
                raise TypeError(f"{cls.__qualname__}: non-default argument '{name}' follows "
                                "default argument")
        if frozen is False and cls._frozen:
            cls.__setattr__ = object.__setattr__
            cls.__delattr__ = object.__delattr__
        if frozen is True and not cls._frozen:
            raise TypeError(f"{cls.__qualname__}: a frozen record cannot inherit from a "
                            "record whose fields may be reassigned")
        cls._fields = tuple(fields)
        cls._field_set = frozenset(fields)
        cls._defaults = defaults
        cls._frozen = frozen
        if not frozen:
            cls.__hash__ = None  # as a dataclass with eq and without frozen

    def __init__(self, *args, **kwargs) -> None:
        fields = self._fields
        if len(args) > len(fields):
            raise TypeError(f"{type(self).__qualname__}() takes {len(fields)} arguments "
                            f"but {len(args)} were given")
        values = self.__dict__
        values.update(zip(fields, args))
        if kwargs:
            known = self._field_set
            for name, value in kwargs.items():
                if name not in known:
                    raise TypeError(f"{type(self).__qualname__}() got an unexpected keyword "
                                    f"argument '{name}'")
                if name in values:
                    raise TypeError(f"{type(self).__qualname__}() got multiple values for "
                                    f"argument '{name}'")
                values[name] = value
        if len(values) < len(fields):
            defaults = self._defaults
            missing = [name for name in fields if name not in values
                       and name not in defaults]
            if missing:
                names = ", ".join(f"'{name}'" for name in missing)
                raise TypeError(f"{type(self).__qualname__}() missing {len(missing)} "
                                f"required argument{'s' if len(missing) > 1 else ''}: {names}")
            for name in fields:
                if name not in values:
                    values[name] = defaults[name]
        post_init = getattr(self, "__post_init__", None)
        if post_init is not None:
            post_init()

    def __setattr__(self, name: str, value) -> None:
        raise FrozenInstanceError(f"cannot assign to field '{name}'")

    def __delattr__(self, name: str) -> None:
        raise FrozenInstanceError(f"cannot delete field '{name}'")

    def _values(self) -> tuple:
        values = self.__dict__
        return tuple(values[name] for name in self._fields)

    def __eq__(self, other):
        if other.__class__ is self.__class__:
            return self._values() == other._values()
        return NotImplemented

    def __hash__(self) -> int:
        return hash(self._values())

    def __repr__(self) -> str:
        shown = ", ".join(f"{name}={self.__dict__[name]!r}" for name in self._fields)
        return f"{type(self).__qualname__}({shown})"

    def _replace(self, **changes):
        """A copy with ``changes`` to some fields (the record's :func:`dataclasses.replace`)."""
        values = {name: self.__dict__[name] for name in self._fields}
        unknown = set(changes) - self._field_set
        if unknown:
            raise TypeError(f"{type(self).__qualname__} has no field "
                            f"'{sorted(unknown)[0]}'")
        values.update(changes)
        return type(self)(**values)
