"""Tests of physics/coax.py against CHECK_VALUES §6b and scikit-rf."""

import numpy as np
import pytest
import skrf
from scipy.constants import c as C0
from skrf.media import DefinedGammaZ0

from buildsheet.physics import ModelError
from buildsheet.physics.coax import matched_loss_db, through_coax, total_loss_db
from buildsheet.physics.lines import DB_PER_NEPER, Line, reflection, swr

F = 14.2e6
LENGTH = 30.48                               # 100 ft, CHECK_VALUES §6b set-up


def swr_at_input(rho_load: float, matched_db: float) -> float:
    """SWR at the input of LENGTH of a 50-ohm line whose matched loss at F is `matched_db`, loaded by
    the real impedance whose |rho| on 50 ohm is `rho_load`: the solver's path (through_coax, then
    lines.swr) on a real-z0 line (Line.nominal), where the table's formula is exact."""
    line = Line.nominal(50.0, 0.66, ((F, matched_db / LENGTH),))
    z_load = 50.0 * (1 + rho_load) / (1 - rho_load) if rho_load < 1 else np.inf
    return float(swr(through_coax(z_load, line, F, LENGTH), 50.0))


def handbook_swr_at_input(rho_load, matched_db):
    """CHECK_VALUES §6b [M formula]: |rho_in| = |rho_load|/a, a = 10^(A/10); SWR = (1 + |rho_in|)/
    (1 - |rho_in|)."""
    rho_in = rho_load / 10 ** (matched_db / 10)
    return (1 + rho_in) / (1 - rho_in)


# CHECK_VALUES §6b [M formula, C values]: handbook total-loss formula and SWR at the input; 1e-4 dB.
@pytest.mark.parametrize("matched, rho, total, swr_in", [
    (1.0, 0.5, 1.5039, 2.3177),
    (1.0, 1 / 3, 1.1959, 1.7203),
    (1.0, 2 / 3, 2.1235, 3.2513),
    (0.5, 0.5, 0.7880, 2.6077),
    (2.0, 0.5, 2.7941, 1.9217),
    (3.0, 9 / 11, 7.0077, 2.3902),
    (1.0, np.sqrt(0.2), 1.3833, None),        # 50 + j50 on 50 ohm
])
def test_total_loss_table(matched, rho, total, swr_in):
    assert total_loss_db(matched, rho) == pytest.approx(total, abs=1e-4)
    if swr_in is not None:
        assert swr_at_input(rho, matched) == pytest.approx(swr_in, abs=1e-4)


def test_matched_loss_and_limits():
    assert matched_loss_db(0.0328, 30.48) == pytest.approx(0.999744, rel=1e-12)
    assert total_loss_db(1.0, 0.0) == pytest.approx(1.0, rel=1e-12)   # matched load: no extra loss
    assert np.isinf(total_loss_db(1.0, 1.0))                           # all power lost in the line
    # an open end on a lossless line: |rho| at the input is 1 to the last bit or two of a double
    assert swr_at_input(1.0, 0.0) > 1e15
    assert swr_at_input(0.0, 3.0) == pytest.approx(1.0)
    rho = np.linspace(0, 0.95, 20)
    assert np.all(np.diff(total_loss_db(2.0, rho)) > 0)               # more mismatch, more loss


def test_rejects_impossible_reflection():
    with pytest.raises(ModelError):
        total_loss_db(1.0, 1.2)
    with pytest.raises(ModelError):
        total_loss_db(1.0, -0.1)


def skrf_loss_db(rho_load, alpha, vf=0.66, z0=50.0):
    """P_in/P_load in dB from scikit-rf S-parameters of a DefinedGammaZ0 line (CHECK_VALUES §6b)."""
    freq = skrf.Frequency(F / 1e6, F / 1e6, 1, unit="MHz")
    med = DefinedGammaZ0(frequency=freq, z0=z0, gamma=alpha + 2j * np.pi * F / (vf * C0))
    s = med.line(LENGTH, unit="m").s[0]
    rho_in = s[0, 0] + s[0, 1] * s[1, 0] * rho_load / (1 - s[1, 1] * rho_load)
    b2 = s[1, 0] / (1 - s[1, 1] * rho_load)                   # wave into the load for a1 = 1
    p_in = 1 - abs(rho_in) ** 2
    p_load = abs(b2) ** 2 * (1 - abs(rho_load) ** 2)
    return 10 * np.log10(p_in / p_load)


@pytest.mark.parametrize("z_load", [150.0, 100.0, 50 + 50j, 12 - 30j, 400 + 900j])
def test_total_loss_exact_for_real_z0_against_scikit_rf(z_load):
    alpha = (1.0 / LENGTH) / DB_PER_NEPER               # 1 dB per 30.48 m
    rho = reflection(z_load, 50.0)
    assert total_loss_db(1.0, abs(rho)) == pytest.approx(skrf_loss_db(rho, alpha), abs=1e-4)


@pytest.mark.parametrize("z_load", [150.0, 25.0, 50 + 50j, 8 + 60j, 2500.0])
@pytest.mark.parametrize("f", [3.6e6, 14.2e6, 146e6])
def test_swr_through_coax_equals_formula(z_load, f):
    # exact transformation on a real-z0 datasheet line (RG-58 handbook points, CHECK_VALUES §6c)
    coax = Line.nominal(50.0, 0.66, ((30e6, 2.47 / 30.48), (150e6, 5.63 / 30.48)))
    length = 23.0
    z_tx = through_coax(z_load, coax, f, length)
    matched = matched_loss_db(coax.gamma(f).real * DB_PER_NEPER, length)
    assert swr(z_tx, 50.0) == pytest.approx(handbook_swr_at_input(abs(reflection(z_load, 50.0)), matched),
                                            rel=1e-9)


def test_through_coax_vectorised_and_length_dependent():
    coax = Line.nominal(50.0, 0.66, ((30e6, 0.08),))
    f = np.array([14.0e6, 14.2e6, 14.35e6])
    z = through_coax(100.0, coax, f, 10.0)
    assert z.shape == (3,)
    # half-wave (electrical) of lossy line returns close to the load, not exactly (loss pulls to z0)
    half = np.pi / coax.gamma(14.2e6).imag
    z_half = through_coax(100.0, coax, 14.2e6, half)
    assert 50.0 < z_half.real < 100.0
    assert abs(z_half.imag) < 1e-6
