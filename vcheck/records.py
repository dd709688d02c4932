"""Records of vcheck's own working results, cheap to define.

``@dataclass`` writes the source of an ``__init__``, ``__repr__``, ``__eq__``, ``__hash__``,
``__setattr__`` and ``__delattr__`` for every class it decorates and compiles it when the
module is imported: about 1.3 ms a class, some 60 ms of a check of the bundled example.
A :class:`Record` subclass behaves as a frozen dataclass of the simple kind (fields from the
class annotations, in order, with their defaults; equality and hashing by value; a repr
naming the fields; assignment refused) through methods compiled once, in this module.
``class Name(Record, frozen=False)`` makes a record whose fields may be reassigned (it is
then unhashable, as a mutable dataclass with ``eq`` is).

What a plugin builds or is handed as the rule contract (findings, quantities, measures,
sources, amounts, the analysis' modes, bands and Analysis, results, the policy) stays a
dataclass: :func:`dataclasses.replace` and :func:`dataclasses.fields` work on those.
Records are for the numbers the rules, the analysis and the design readers keep for
themselves; a plugin may read their fields. A field default must be immutable (a number, a string, a
tuple, None); a field that needs a fresh dict or list is given one by the code that builds
the record.
"""

from __future__ import annotations

import sys
from dataclasses import FrozenInstanceError
from typing import ClassVar

__all__ = ["Record"]

_MISSING = object()

_MUTABLE_DEFAULTS = (list, dict, set, bytearray)

if sys.version_info >= (3, 11):
    from typing import dataclass_transform
else:  # pragma: no cover - Python 3.10
    def dataclass_transform(**_):
        return lambda cls: cls


def _is_class_variable(annotation) -> bool:
    if isinstance(annotation, str):  # under `from __future__ import annotations`
        return annotation.startswith(("ClassVar", "typing.ClassVar"))
    return annotation is ClassVar or getattr(annotation, "__origin__", None) is ClassVar


@dataclass_transform(frozen_default=True)
class Record:
    """Base of a read-only record: fields from the annotations, defaults from the class.

    ``Record`` subclasses may subclass each other (the fields of a base come first) and
    define methods and properties; ``__post_init__``, when defined, runs after the fields
    are set (it may set derived fields with ``object.__setattr__``).
    """

    __slots__ = ()
    _fields: tuple[str, ...] = ()
    _position: dict = {}
    _post_init = None
    _defaults: dict = {}
    _frozen: bool = True

    def __init_subclass__(cls, frozen: bool = True, **kwargs) -> None:
        super().__init_subclass__(**kwargs)
        fields = list(cls._fields)
        defaults = dict(cls._defaults)
        for name, annotation in cls.__dict__.get("__annotations__", {}).items():
            if _is_class_variable(annotation):
                continue
            if name.startswith("__") or name in ("_fields", "_position", "_defaults",
                                                 "_frozen", "_post_init"):
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
        cls._position = {name: at for at, name in enumerate(fields)}
        cls._defaults = defaults
        cls._frozen = frozen
        if not frozen:
            cls.__hash__ = None  # as a dataclass with eq and without frozen
        post_init = cls.__dict__.get("__post_init__")
        if post_init is not None:
            cls._post_init = post_init

    def __init__(self, *args, **kwargs) -> None:
        # object.__setattr__ field by field, never through self.__dict__: that keeps the
        # instance's values inline, which makes reading a field as quick as on a dataclass
        fields = self._fields
        given = len(args)
        if given > len(fields):
            raise TypeError(f"{type(self).__qualname__}() takes {len(fields)} arguments "
                            f"but {given} were given")
        setter = object.__setattr__
        for name, value in zip(fields, args):
            setter(self, name, value)
        if given < len(fields):  # the rest in field order, so every instance shares one layout
            used = 0
            defaults = self._defaults
            for name in fields[given:]:
                value = kwargs.get(name, _MISSING)
                if value is _MISSING:
                    value = defaults.get(name, _MISSING)
                    if value is _MISSING:
                        raise self._missing(given, kwargs)
                else:
                    used += 1
                setter(self, name, value)
            if used != len(kwargs):
                raise self._unexpected(given, kwargs)
        elif kwargs:
            raise self._unexpected(given, kwargs)
        if self._post_init is not None:
            self._post_init()

    def _missing(self, given: int, kwargs: dict) -> TypeError:
        missing = [name for name in self._fields[given:]
                   if name not in kwargs and name not in self._defaults]
        names = ", ".join(f"'{name}'" for name in missing)
        return TypeError(f"{type(self).__qualname__}() missing {len(missing)} required "
                         f"argument{'s' if len(missing) > 1 else ''}: {names}")

    def _unexpected(self, given: int, kwargs: dict) -> TypeError:
        for name in kwargs:
            at = self._position.get(name)
            if at is None:
                return TypeError(f"{type(self).__qualname__}() got an unexpected keyword "
                                 f"argument '{name}'")
            if at < given:
                return TypeError(f"{type(self).__qualname__}() got multiple values for "
                                 f"argument '{name}'")
        raise AssertionError("no wrong keyword argument")  # pragma: no cover

    def __setattr__(self, name: str, value) -> None:
        raise FrozenInstanceError(f"cannot assign to field '{name}'")

    def __delattr__(self, name: str) -> None:
        raise FrozenInstanceError(f"cannot delete field '{name}'")

    def _values(self) -> tuple:
        return tuple([getattr(self, name) for name in self._fields])

    def __eq__(self, other):
        if other.__class__ is self.__class__:
            return self._values() == other._values()
        return NotImplemented

    def __hash__(self) -> int:
        return hash(self._values())

    def __repr__(self) -> str:
        shown = ", ".join(f"{name}={getattr(self, name)!r}" for name in self._fields)
        return f"{type(self).__qualname__}({shown})"
