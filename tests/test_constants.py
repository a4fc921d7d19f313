"""physics/constants.py holds the model's physical constants as literals (so that a build does not
import scipy.constants); they must be the values scipy.constants gives (CODATA 2022 in scipy 1.17;
c and the inch are exact by definition)."""

import scipy.constants

from buildsheet.physics import constants


def test_constants_are_scipys_codata_values():
    assert constants.C0 == scipy.constants.c == 299_792_458.0     # exact (SI 2019)
    assert constants.mu_0 == scipy.constants.mu_0
    assert constants.epsilon_0 == scipy.constants.epsilon_0
    assert constants.inch == scipy.constants.inch == 0.0254        # exact (1959)
    # c^2 mu_0 epsilon_0 = 1 holds for the measured pair to their stated uncertainty (1.6e-10)
    assert abs(constants.C0 ** 2 * constants.mu_0 * constants.epsilon_0 - 1) < 1e-9
