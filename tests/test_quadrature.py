"""physics/gauss_legendre_table.py (the stored Gauss-Legendre rules of the radiator's and the far
field's integrals) is what numpy.polynomial.legendre.leggauss gives, and each rule integrates
polynomials exactly to degree 2n - 1 (the defining property of the n-point Gauss-Legendre rule:
Abramowitz & Stegun 25.4.29; the integral of x^k over [-1, 1] is 2/(k + 1) for even k, 0 for odd)."""

import numpy as np
import pytest

from buildsheet.physics import quadrature


@pytest.mark.parametrize("n", quadrature.ORDERS)
def test_stored_rule_is_leggauss(n):
    x, w = quadrature.gauss_legendre(n)
    ref_x, ref_w = np.polynomial.legendre.leggauss(n)
    assert x.shape == w.shape == (n,)
    # written from leggauss: the same to the last bits (another LAPACK may round an eigenvalue
    # differently in the last place; the rule itself is good to 1e-15)
    np.testing.assert_allclose(x, ref_x, rtol=0, atol=1e-14)
    np.testing.assert_allclose(w, ref_w, rtol=1e-13, atol=0)


@pytest.mark.parametrize("n", quadrature.ORDERS)
def test_stored_rule_is_exact_to_degree_2n_minus_1(n):
    x, w = quadrature.gauss_legendre(n)
    for k in (0, 1, 2, 7, n, 2 * n - 2, 2 * n - 1):
        exact = 2.0 / (k + 1) if k % 2 == 0 else 0.0
        assert np.sum(w * x ** k) == pytest.approx(exact, abs=1e-13)


def test_other_orders_are_leggauss():
    x, w = quadrature.gauss_legendre(64)
    ref_x, ref_w = np.polynomial.legendre.leggauss(64)
    assert 64 not in quadrature.ORDERS
    assert np.array_equal(x, ref_x) and np.array_equal(w, ref_w)


def test_written_table_reads_back_exactly(tmp_path):
    path = tmp_path / "table.py"
    quadrature.write_gauss_legendre_table(path)
    namespace = {}
    exec(path.read_text(), namespace)
    for n in quadrature.ORDERS:
        x, w = (np.array(v) for v in namespace["RULES"][n])
        ref_x, ref_w = np.polynomial.legendre.leggauss(n)
        assert np.array_equal(x, ref_x) and np.array_equal(w, ref_w)
