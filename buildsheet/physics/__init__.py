"""The physics of the antenna: numpy/scipy only, no I/O, no design keys.

One error policy: a refusal is ModelError (a ValueError) with a plain message and no file or key;
the solver, which knows the design, turns it into a DesignError naming the file.
"""


class ModelError(ValueError):
    """A value the physics cannot work with (a line with no impedance, no match, a wire through the
    ground): the model's refusal, not a fault of the program."""
