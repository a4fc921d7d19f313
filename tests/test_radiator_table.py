"""physics/resonance_table.py (the stored table of the dipole's resonance factor K) is what the
induced-EMF Newton root gives (radiator._resonance_factor_newton, itself checked against NEC-2 and
Balanis in test_radiator.py), node by node."""

import numpy as np

from buildsheet.physics import radiator


def test_stored_table_is_the_newton_root():
    computed = radiator._resonance_factor_newton(np.exp(radiator._LN_KA_TABLE))
    assert radiator._K_TABLE.shape == computed.shape == (2000,)
    # written by write_resonance_table() from the same function: the same to the last bits (a
    # different libm may round a sine differently; K itself is good to 1e-6 between nodes)
    np.testing.assert_allclose(radiator._K_TABLE, computed, rtol=1e-14, atol=0)


def test_written_table_reads_back_exactly(tmp_path):
    path = tmp_path / "table.py"
    radiator.write_resonance_table(path)
    namespace = {}
    exec(path.read_text(), namespace)
    assert np.array_equal(np.array(namespace["K"]),
                          radiator._resonance_factor_newton(np.exp(radiator._LN_KA_TABLE)))
