"""buildsheet.valueclass: a frozen dataclass with shared __eq__, __hash__ and __repr__ must behave as
the methods Python's dataclasses generates for dataclass(frozen=True).

Reference: the standard library's dataclasses (the same class declared with dataclass(frozen=True)).
"""

import dataclasses
from dataclasses import dataclass, field

import pytest

from buildsheet.valueclass import valueclass


def _pair():
    def body():
        return {"__annotations__": {"a": "float", "b": "str", "c": "tuple", "d": "dict", "e": "int"},
                "b": "x", "c": (), "d": field(default_factory=dict, compare=False, repr=False),
                "e": field(default=0, hash=False)}
    ref = dataclass(frozen=True)(type("Thing", (), body()))
    ours = valueclass(type("Thing", (), body()))
    return ref, ours


CASES = [((1.0,), {}), ((1.0, "y"), {}), ((1.0, "x", (1, 2)), {}), ((float("nan"),), {}),
         ((1.0, "x", (), {"k": 1}), {}), ((1.0,), {"e": 3}), ((2,), {})]


@pytest.mark.parametrize("args, kwargs", CASES)
def test_same_repr_equality_and_hash_as_dataclass(args, kwargs):
    ref, ours = _pair()
    r, o = ref(*args, **kwargs), ours(*args, **kwargs)
    assert repr(r) == repr(o)
    assert hash(r) == hash(o)
    for args2, kwargs2 in CASES:
        assert (r == ref(*args2, **kwargs2)) == (o == ours(*args2, **kwargs2))
        assert (r != ref(*args2, **kwargs2)) == (o != ours(*args2, **kwargs2))


def test_frozen_fields_and_other_classes():
    ref, ours = _pair()
    o = ours(1.0)
    with pytest.raises(dataclasses.FrozenInstanceError):
        o.a = 2.0
    with pytest.raises(dataclasses.FrozenInstanceError):
        del o.b
    assert o.__eq__(ref(1.0)) is NotImplemented and o != ref(1.0)
    assert [f.name for f in dataclasses.fields(o)] == ["a", "b", "c", "d", "e"]
    assert dataclasses.replace(o, b="z") == ours(1.0, "z")
    assert dataclasses.asdict(o) == dataclasses.asdict(ref(1.0))


def test_recursive_repr_as_dataclass():
    ref, ours = _pair()
    r, o = ref(1.0, "x", ([],)), ours(1.0, "x", ([],))
    r.c[0].append(r)
    o.c[0].append(o)
    assert repr(r) == repr(o)


def test_refuses_a_class_with_its_own_methods():
    with pytest.raises(TypeError):
        valueclass(type("Own", (), {"__annotations__": {"a": "int"}, "__repr__": lambda self: "own"}))


def _errors(make):
    try:
        make()
    except TypeError:
        return TypeError
    return None


@pytest.mark.parametrize("args, kwargs", CASES + [((), {}), ((1.0, "x", (), {}, 1, 2), {}),
                                                  ((1.0,), {"a": 2.0}), ((1.0,), {"f": 1}),
                                                  ((), {"a": 1.0, "e": 2}), ((), {"b": "y"})])
def test_init_takes_and_refuses_what_dataclass_does(args, kwargs):
    """The shared __init__ against the generated one: the same field values for every call the
    generated one takes (positions, keywords, defaults, a fresh default_factory value each time),
    TypeError for every call it refuses (too many, missing, repeated, unknown)."""
    ref, ours = _pair()
    expected = _errors(lambda: ref(*args, **dict(kwargs)))
    assert _errors(lambda: ours(*args, **dict(kwargs))) is expected
    if expected is None:
        r, o = ref(*args, **dict(kwargs)), ours(*args, **dict(kwargs))
        assert dataclasses.astuple(r) == dataclasses.astuple(o)
        if "d" not in kwargs and len(args) < 4:       # d from its default_factory: a new dict each
            assert ours(*args, **dict(kwargs)).d is not o.d


def test_post_init_runs_and_subclass_attributes_as_dataclass():
    seen = []

    def body():
        return {"__annotations__": {"a": "int"}, "__post_init__": lambda self: seen.append(self.a)}
    ours = valueclass(type("Checked", (), body()))
    ours(3)
    ours(a=4)
    assert seen == [3, 4]
    ref = dataclass(frozen=True)(type("Checked", (), body()))
    # a plain subclass may set attributes that are not fields, as with dataclass(frozen=True)
    for base in (ref, ours):
        sub = type("Sub", (base,), {})(5)
        sub.extra = 1
        with pytest.raises(dataclasses.FrozenInstanceError):
            sub.a = 6


def test_refuses_fields_it_does_not_handle():
    with pytest.raises(TypeError):
        valueclass(type("Late", (), {"__annotations__": {"a": "int"}, "a": field(default=0, init=False)}))
    with pytest.raises(TypeError):
        valueclass(type("Keyword", (), {"__annotations__": {"a": "int"}, "a": field(kw_only=True)}))
