"""Tests of physics/exposure.py: 47 CFR 1.1310 Table 1, OET Bulletin 65, ICNIRP 2020 (CHECK_VALUES §5)."""

import numpy as np
import pytest

from buildsheet.physics import ModelError
from buildsheet.physics.exposure import (average_power, compliance_distance, fcc_mpe,
                                         icnirp2020_reference, power_density,
                                         reactive_near_field_limit)

MW_CM2 = 10.0                       # W/m^2 per mW/cm^2
FT = 0.3048
G_DIPOLE = 10 ** (2.15 / 10)        # 2.15 dBi = 1.64059


# --- 47 CFR 1.1310 Table 1 ------------------------------------------------------------------------

@pytest.mark.parametrize("f, controlled_mw_cm2, general_mw_cm2", [
    (14.0e6, 4.5918, 0.91837),      # CHECK_VALUES §5a [C]
    (14.2e6, 4.4634, 0.89268),
    (14.35e6, 4.3706, 0.87412),
    (146e6, 1.0, 0.2),
    (1.0e6, 100.0, 100.0),          # Table 1 rows, f in MHz: 100 / 100
    (2.0e6, 100.0, 45.0),           # 100 / 180/f^2
    (5.0e6, 36.0, 7.2),             # 900/f^2 / 180/f^2
    (450e6, 1.5, 0.3),              # f/300 / f/1500
    (5.8e9, 5.0, 1.0),
])
def test_fcc_mpe_table(f, controlled_mw_cm2, general_mw_cm2):
    controlled, general = fcc_mpe(f)
    assert controlled == pytest.approx(controlled_mw_cm2 * MW_CM2, rel=1e-4)
    assert general == pytest.approx(general_mw_cm2 * MW_CM2, rel=1e-4)


def test_fcc_mpe_continuous_at_band_edges_and_vectorised():
    # Table 1 is continuous at 3, 30, 300 and 1500 MHz (1.34 MHz: 180/1.34^2 = 100.2, near-continuous)
    edges = np.array([3.0, 30.0, 300.0, 1500.0]) * 1e6
    below, above = fcc_mpe(edges * (1 - 1e-9)), fcc_mpe(edges * (1 + 1e-9))
    assert below[0] == pytest.approx(above[0], rel=1e-6)
    assert below[1][1:] == pytest.approx(above[1][1:], rel=1e-6)
    assert fcc_mpe(np.array([14e6, 146e6]))[1] == pytest.approx([9.1837, 2.0], rel=1e-4)


@pytest.mark.parametrize("f", [0.1e6, 200e9])
def test_fcc_mpe_out_of_table(f):
    with pytest.raises(ModelError, match="1.1310"):
        fcc_mpe(f)


# --- OET Bulletin 65 far field with the 2.56 ground-reflection factor ------------------------------

@pytest.mark.parametrize("p_avg, r_gen_142, r_ctl_142, r_gen_140", [
    (100.0, 1.935, 0.865, 1.908),    # CHECK_VALUES §5b worked example [C]: 100 W PEP, 2.15 dBi
    (50.0, 1.368, 0.612, 1.349),
    (20.0, 0.865, 0.387, 0.853),
    (10.0, 0.612, 0.274, 0.603),
])
def test_compliance_distance_worked_example(p_avg, r_gen_142, r_ctl_142, r_gen_140):
    eirp = p_avg * G_DIPOLE
    ctl_142, gen_142 = fcc_mpe(14.2e6)
    _, gen_140 = fcc_mpe(14.0e6)
    # printed to the millimetre: rel 1e-3 plus half a millimetre of rounding
    assert compliance_distance(eirp, gen_142) == pytest.approx(r_gen_142, rel=1e-3, abs=5e-4)
    assert compliance_distance(eirp, ctl_142) == pytest.approx(r_ctl_142, rel=1e-3, abs=5e-4)
    assert compliance_distance(eirp, gen_140) == pytest.approx(r_gen_140, rel=1e-3, abs=5e-4)
    # free space (no reflection) is the above / 1.6
    assert compliance_distance(eirp, gen_142, ground_reflection=False) == pytest.approx(
        r_gen_142 / 1.6, rel=1e-3, abs=5e-4)


@pytest.mark.parametrize("duty, r_gen, r_ctl", [(1.0, 7.494, 3.351), (0.2, 3.351, 1.499)])
def test_compliance_distance_1500_w(duty, r_gen, r_ctl):
    eirp = average_power(1500.0, duty, 1.0) * G_DIPOLE
    ctl, gen = fcc_mpe(14.2e6)
    assert compliance_distance(eirp, gen) == pytest.approx(r_gen, rel=1e-3)
    assert compliance_distance(eirp, ctl) == pytest.approx(r_ctl, rel=1e-3)


def test_power_density_at_3_m():
    # CHECK_VALUES §5b: 100 W average, G = 1.64, with reflection, 3 m: 0.37135 mW/cm^2
    assert power_density(100.0 * G_DIPOLE, 3.0) == pytest.approx(0.37135 * MW_CM2, rel=1e-4)
    assert power_density(100.0 * G_DIPOLE, 3.0, ground_reflection=False) == pytest.approx(
        0.37135 * MW_CM2 / 2.56, rel=1e-4)


def test_distance_and_density_are_inverse():
    eirp, s = np.array([10.0, 250.0, 4000.0]), 3.3
    assert power_density(eirp, compliance_distance(eirp, s)) == pytest.approx(s, rel=1e-12)


@pytest.mark.parametrize("p, ctl_calc, gen_calc, ctl_ocr, gen_ocr", [
    (150.0, 90.9, 203.3, 90, None),
    (500.0, 166.0, 371.1, 166, None),
    (1500.0, 287.4, 642.7, 287, 642),
])
def test_144_mhz_24_dbi_regression(p, ctl_calc, gen_calc, ctl_ocr, gen_ocr):
    # OET 65 Supplement B-style table, eight 17-element Yagis at 144 MHz, 24 dBi, EPA factor 2.56
    # (stored OCR text [S]; [C] values from the same formula), tolerance ±1 ft.
    eirp = p * 10 ** 2.4
    ctl, gen = fcc_mpe(144e6)
    r_ctl = compliance_distance(eirp, ctl) / FT
    r_gen = compliance_distance(eirp, gen) / FT
    assert r_ctl == pytest.approx(ctl_calc, abs=0.05)
    assert r_gen == pytest.approx(gen_calc, abs=0.05)
    assert r_ctl == pytest.approx(ctl_ocr, abs=1.0)
    if gen_ocr is not None:
        assert r_gen == pytest.approx(gen_ocr, abs=1.0)


def test_average_power_handbook_example():
    # 1500 W PEP SSB (20 % duty factor), 10 min on / 10 off / 10 on in 30 min -> 200 W
    # (amateur handbook practice quoted in stored texts, CHECK_VALUES §5b)
    assert average_power(1500.0, 0.2, 20 / 30) == pytest.approx(200.0, rel=1e-12)


@pytest.mark.parametrize("duty, on_air", [(1.2, 0.5), (0.4, -0.1)])
def test_average_power_rejects_fractions_outside_0_1(duty, on_air):
    with pytest.raises(ModelError):
        average_power(100.0, duty, on_air)


def test_bad_distance_and_limit_rejected():
    with pytest.raises(ModelError):
        power_density(100.0, 0.0)
    with pytest.raises(ModelError):
        compliance_distance(100.0, 0.0)


# --- ICNIRP 2020 ------------------------------------------------------------------------------------

@pytest.mark.parametrize("f, s_general", [(14.0e6, 5.9379), (14.2e6, 5.8211), (146e6, 2.0)])
def test_icnirp_general_public(f, s_general):
    # CHECK_VALUES §5c [C] from the Table 5 values there (from memory): E-equivalent S below 30 MHz
    _, general = icnirp2020_reference(f)
    assert general == pytest.approx(s_general, rel=1e-4)


def test_icnirp_distances():
    # CHECK_VALUES §5c: 100 W / 10 W average, 2.15 dBi, 14.2 MHz -> 2.396 m / 0.758 m
    _, general = icnirp2020_reference(14.2e6)
    assert compliance_distance(100.0 * G_DIPOLE, general) == pytest.approx(2.396, rel=1e-3)
    assert compliance_distance(10.0 * G_DIPOLE, general) == pytest.approx(0.758, rel=1e-3)


@pytest.mark.parametrize("f, ratio", [(146e6, 5.0), (900e6, 5.0), (10e9, 5.0),
                                      (14.2e6, (660 / 300) ** 2)])
def test_icnirp_occupational_to_general_ratio(f, ratio):
    # ICNIRP 2020 Table 5 (from memory): 5x in S where S is tabulated; (660/300)^2 = 4.84 from E below 30 MHz
    occupational, general = icnirp2020_reference(f)
    assert occupational / general == pytest.approx(ratio, rel=1e-12)


def test_icnirp_stricter_than_fcc_general_at_hf():
    # ICNIRP's 5.82 W/m^2 at 14.2 MHz is below the FCC's 8.93 (CHECK_VALUES §5a, §5c)
    assert icnirp2020_reference(14.2e6)[1] < fcc_mpe(14.2e6)[1]


def test_icnirp_out_of_range():
    with pytest.raises(ModelError, match="ICNIRP"):
        icnirp2020_reference(50e3)


def test_reactive_near_field_limit():
    # lambda/(2 pi) = 3.36 m at 14.2 MHz (CHECK_VALUES §5b caveat; Balanis field regions)
    assert reactive_near_field_limit(14.2e6) == pytest.approx(21.1121 / (2 * np.pi), rel=1e-5)
    assert reactive_near_field_limit(14.2e6) == pytest.approx(3.36, abs=0.005)
