"""@valueclass: a frozen dataclass whose __init__, __setattr__, __delattr__, __eq__, __hash__ and
__repr__ are one set of functions shared by every such class, instead of six generated for each.

dataclasses compiles every method it generates (exec of its source text); a frozen dataclass gets
these six, about 0.5 ms a class, and the value classes a build imports cost it about 30 ms that way.
`valueclass(cls)` is `dataclass(frozen=True)(cls)` with the shared methods, which behave as Python's
generated ones:
- __init__ takes the fields in order, by position or keyword, fills the defaults (a
  default_factory called for each instance), sets them as a frozen dataclass does
  (object.__setattr__) and calls __post_init__ where the class has one; a wrong call raises
  TypeError as the generated one would;
- assigning or deleting a field raises FrozenInstanceError;
- instances of the same class are equal when their fields with compare=True are (compared as one
  tuple, in order), an instance of another class gives NotImplemented;
- the hash is that of the tuple of the fields with compare=True (or hash=True);
- the repr is `ClassName(field=value!r, ...)` over the fields with repr=True, '...' where it would
  recurse.
dataclasses.fields, replace and asdict work as on any dataclass. A class with init=False,
keyword-only, InitVar or ClassVar fields is refused (none is declared here; use
dataclass(frozen=True) for one). The shared __init__ costs about 2 microseconds more per instance
than the generated one (some 3,000 instances in a build).
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


_MISSING = dataclasses.MISSING


def _init(self, *args, **kwargs):
    cls = self.__class__
    names, defaults, post_init = cls.__valueclass_init__
    if len(args) > len(names):
        raise TypeError(f"{cls.__qualname__}.__init__() takes {len(names) + 1} positional arguments "
                        f"but {len(args) + 1} were given")
    set_ = object.__setattr__
    for name, value in zip(names, args):
        if name in kwargs:
            raise TypeError(f"{cls.__qualname__}.__init__() got multiple values for argument '{name}'")
        set_(self, name, value)
    missing = []
    for name in names[len(args):]:
        if name in kwargs:
            set_(self, name, kwargs.pop(name))
        elif name in defaults:
            default, factory = defaults[name]
            set_(self, name, factory() if factory is not _MISSING else default)
        else:
            missing.append(name)
    if missing:
        raise TypeError(f"{cls.__qualname__}.__init__() missing {len(missing)} required argument"
                        f"{'s' if len(missing) > 1 else ''}: {', '.join(repr(n) for n in missing)}")
    if kwargs:
        raise TypeError(f"{cls.__qualname__}.__init__() got an unexpected keyword argument "
                        f"'{next(iter(kwargs))}'")
    if post_init:
        self.__post_init__()


def _setattr(self, name, value):
    if type(self) is self.__valueclass_class__ or name in self.__valueclass_fields__:
        raise dataclasses.FrozenInstanceError(f"cannot assign to field {name!r}")
    object.__setattr__(self, name, value)


def _delattr(self, name):
    if type(self) is self.__valueclass_class__ or name in self.__valueclass_fields__:
        raise dataclasses.FrozenInstanceError(f"cannot delete field {name!r}")
    object.__delattr__(self, name)


def valueclass(cls):
    """`dataclass(frozen=True)` with the shared __init__, __setattr__, __delattr__, __eq__,
    __hash__ and __repr__ (see the module)."""
    for name in ("__init__", "__setattr__", "__delattr__", "__eq__", "__hash__", "__repr__"):
        if name in cls.__dict__:
            raise TypeError(f"{cls.__qualname__} defines {name}: use dataclass(frozen=True)")
    cls = dataclasses.dataclass(init=False, eq=False, repr=False)(cls)
    fields = dataclasses.fields(cls)
    # __dataclass_fields__ holds InitVar and ClassVar pseudo-fields too, fields() the real ones only
    if any(not f.init or f.kw_only for f in fields) or len(cls.__dataclass_fields__) != len(fields):
        raise TypeError(f"{cls.__qualname__} has init=False, keyword-only, InitVar or ClassVar "
                        "fields: use dataclass(frozen=True)")
    cls.__valueclass_init__ = (tuple(f.name for f in fields),
                               {f.name: (f.default, f.default_factory) for f in fields
                                if f.default is not _MISSING or f.default_factory is not _MISSING},
                               hasattr(cls, "__post_init__"))
    cls.__valueclass_class__ = cls
    cls.__valueclass_fields__ = frozenset(f.name for f in fields)
    cls.__init__ = _init
    cls.__setattr__ = _setattr
    cls.__delattr__ = _delattr
    cls.__valueclass_compare__ = tuple(f.name for f in fields if f.compare)
    cls.__valueclass_hash__ = tuple(f.name for f in fields if (f.compare if f.hash is None else f.hash))
    cls.__valueclass_repr__ = tuple(f.name for f in fields if f.repr)
    cls.__eq__ = _eq
    cls.__hash__ = _hash
    cls.__repr__ = _repr
    return cls
