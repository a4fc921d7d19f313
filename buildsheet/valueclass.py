"""@valueclass: a frozen dataclass whose __eq__, __hash__ and __repr__ are one set of functions shared
by every such class, instead of three generated for each.

dataclasses compiles every method it generates (exec of its source text); a frozen dataclass gets
six (__init__, __repr__, __eq__, __setattr__, __delattr__, __hash__), and the value classes a build
imports cost it about 50 ms that way. `valueclass(cls)` is `dataclass(frozen=True)(cls)` with the
three shared methods, which behave as Python's generated ones: instances of the same class are
equal when their fields with compare=True are (compared as one tuple, in order), an instance of
another class gives NotImplemented; the hash is that of the tuple of the fields with compare=True
(or hash=True); the repr is `ClassName(field=value!r, ...)` over the fields with repr=True, '...'
where it would recurse. dataclasses.fields, replace and asdict work as on any dataclass.
"""

from __future__ import annotations

import dataclasses
import reprlib


def _eq(self, other):
    if other.__class__ is self.__class__:
        names = self.__valueclass_compare__
        return tuple([getattr(self, n) for n in names]) == tuple([getattr(other, n) for n in names])
    return NotImplemented


def _hash(self):
    return hash(tuple([getattr(self, n) for n in self.__valueclass_hash__]))


@reprlib.recursive_repr()
def _repr(self):
    return (self.__class__.__qualname__ + "("
            + ", ".join([f"{n}={getattr(self, n)!r}" for n in self.__valueclass_repr__]) + ")")


def valueclass(cls):
    """`dataclass(frozen=True)` with the shared __eq__, __hash__ and __repr__ (see the module)."""
    for name in ("__eq__", "__hash__", "__repr__"):
        if name in cls.__dict__:
            raise TypeError(f"{cls.__qualname__} defines {name}: use dataclass(frozen=True)")
    cls = dataclasses.dataclass(frozen=True, eq=False, repr=False)(cls)
    fields = dataclasses.fields(cls)
    cls.__valueclass_compare__ = tuple(f.name for f in fields if f.compare)
    cls.__valueclass_hash__ = tuple(f.name for f in fields if (f.compare if f.hash is None else f.hash))
    cls.__valueclass_repr__ = tuple(f.name for f in fields if f.repr)
    cls.__eq__ = _eq
    cls.__hash__ = _hash
    cls.__repr__ = _repr
    return cls
