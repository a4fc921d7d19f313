"""Physical constants of the model, as literals with their source, so that physics/ does not import
scipy.constants (about 0.1 s) for four numbers (a build imports no scipy module at all).
tests/test_constants.py checks the values against scipy.constants.
"""

#: speed of light in vacuum, m/s: exact (SI 2019, the definition of the metre)
C0 = 299_792_458.0
#: magnetic constant mu_0, H/m: CODATA 2022 (scipy.constants 1.17, `mu_0`)
mu_0 = 1.25663706127e-06
#: electric constant epsilon_0, F/m: CODATA 2022 (scipy.constants 1.17, `epsilon_0`)
epsilon_0 = 8.8541878188e-12
#: the international inch, m: exact (1959 agreement)
inch = 0.0254
