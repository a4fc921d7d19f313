"""The physics of the antenna: numpy and math only (no scipy: physics/special.py), no I/O, no design keys.

One error policy: a refusal is ModelError (a ValueError) with a plain message and no file or key;
the solver, which knows the design, turns it into a DesignError naming the file.
"""


class ModelError(ValueError):
    """A value the physics cannot work with (a line with no impedance, no match, a wire through the
    ground): the model's refusal, not a fault of the program."""


def union1d(a, b):
    """The sorted distinct values of a and b, as numpy.union1d gives them for real numbers (NaN
    aside), without numpy.unique, whose first call imports numpy.ma (7 ms of a build's start)."""
    import numpy as np

    v = np.sort(np.concatenate((np.ravel(a), np.ravel(b))).astype(float, copy=False))
    if v.size == 0:
        return v
    keep = np.empty(v.shape, dtype=bool)
    keep[0] = True
    np.not_equal(v[1:], v[:-1], out=keep[1:])
    return v[keep]
