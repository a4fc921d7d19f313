"""Gauss-Legendre nodes and weights on [-1, 1], read from the stored table gauss_legendre_table.py
(numpy.polynomial.legendre.leggauss's values, written by write_gauss_legendre_table(); working them
out at import, an eigenvalue problem per order, cost a build about 25 ms). The orders are those the
radiator's mutual impedance (radiator._GL) and the far-field integrals (pattern._gl01) use;
tests/test_quadrature.py checks the table against leggauss and the rule's exactness.
"""

from __future__ import annotations

import numpy as np

from buildsheet.physics import gauss_legendre_table

#: the orders stored
ORDERS = (16, 24, 32, 48, 96)


def gauss_legendre(n: int) -> tuple[np.ndarray, np.ndarray]:
    """Nodes x and weights w of the n-point Gauss-Legendre rule on [-1, 1], as
    numpy.polynomial.legendre.leggauss(n) gives them: stored for the orders in ORDERS, worked out by
    leggauss for any other (the finer rules the tests compare with)."""
    if n not in gauss_legendre_table.RULES:
        return np.polynomial.legendre.leggauss(n)
    x, w = gauss_legendre_table.RULES[n]
    return np.array(x), np.array(w)


def write_gauss_legendre_table(path=None) -> None:
    """Write physics/gauss_legendre_table.py from numpy.polynomial.legendre.leggauss (repr
    round-trips a float exactly)."""
    import pathlib

    lines = ['"""Gauss-Legendre rules on [-1, 1]: order -> (nodes, weights), as',
             "numpy.polynomial.legendre.leggauss gives them; written by",
             'quadrature.write_gauss_legendre_table() (do not edit; tests/test_quadrature.py checks them)."""',
             "", "RULES = {"]
    for n in ORDERS:
        x, w = np.polynomial.legendre.leggauss(n)
        lines.append(f"    {n}: (")
        for values in (x, w):
            lines.append("        (")
            lines += [f"            {v!r}," for v in values.tolist()]
            lines.append("        ),")
        lines.append("    ),")
    lines.append("}")
    path = pathlib.Path(__file__).with_name("gauss_legendre_table.py") if path is None else path
    pathlib.Path(path).write_text("\n".join(lines) + "\n")
