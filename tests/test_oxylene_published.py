"""The published o-xylene cooled fixed-bed tube (Froment 1967; Van Welsenaere & Froment 1970).

Check values: hot-spot temperature T* and position z* against inlet o-xylene partial pressure
p0, from the reproduction of the published pseudo-homogeneous model in the project's reference
notes (shared/reference/runaway.md, section 2, LSODA rtol 1e-10; Radau and BDF agree to 1e-6 K).
Tolerance 0.1 K on T* (the reproduction is printed to 0.01 K; our constant-cp model is the
source's) and 0.005 m on z* (printed to 1 mm).
"""
import tomllib

import pytest

from simulator import load_case_dict, simulate

CASE = "froment1967_oxylene_packed_tube.toml"

# p0 [atm] -> (T* [K], z* [m]) from the reproduction of Froment (1967)
HOT_SPOTS = {0.011: (638.42, 0.400), 0.012: (640.54, 0.410), 0.013: (643.04, 0.423), 0.014: (646.09, 0.439),
             0.015: (650.01, 0.460), 0.016: (655.61, 0.492), 0.017: (665.86, 0.551), 0.0175: (679.12, 0.624)}


def _run(cases_dir, p0, limit=None):
    raw = tomllib.loads((cases_dir / CASE).read_text())
    raw["feed"]["mole_fractions"] = {"OX": p0, "AIR": 1.0 - p0}      # 1 atm total: y0 = p0 / 1 atm
    if limit:
        raw["design"]["temperature_limit"] = limit
    return simulate(load_case_dict(raw, str(cases_dir / CASE)))


@pytest.mark.published("froment1967", "published model and data; check values from an independent reproduction (not printed values), p0 = 0.011-0.0175 atm")
@pytest.mark.parametrize("p0", sorted(HOT_SPOTS))
def test_hot_spot_against_published_case(cases_dir, p0):
    T_star, z_star = HOT_SPOTS[p0]
    result = _run(cases_dir, p0)
    assert result.status == "completed"
    assert result.hot_spot["located_by"] == "event dT/dz = 0"
    assert result.hot_spot["temperature_K"] == pytest.approx(T_star, abs=0.1)
    assert result.hot_spot["position_m"] == pytest.approx(z_star, abs=0.005)


@pytest.mark.published("froment1967", "runaway between p0 = 0.0175 and 0.018 atm (independent reproduction; the source's figure shows it just above 0.018 atm, from memory)")
def test_hot_spot_jumps_between_0_0175_and_0_018_atm(cases_dir):
    below = _run(cases_dir, 0.0175, limit="2000 K").hot_spot["temperature_K"]
    above = _run(cases_dir, 0.018, limit="2000 K").hot_spot["temperature_K"]
    assert below < 690.0 and above > 1000.0      # reproduction: 679.12 K and 1078 K


def test_case_file_reproduces_the_base_point(cases_dir):
    result = simulate(load_case_dict(tomllib.loads((cases_dir / CASE).read_text()), str(cases_dir / CASE)))
    assert result.hot_spot["temperature_K"] == pytest.approx(650.01, abs=0.1)      # p0 = 0.015 atm
