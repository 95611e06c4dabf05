"""Generated reference pages: each builds, and its numbers are the calculators' own."""

import pytest

from build import reference, team
from build.reference import conductors as conductor_page
from calc import api


@pytest.mark.parametrize("path", list(reference.pages()))
def test_every_reference_page_builds_for_both_regions(path):
    for region in ("na", "iec"):
        text = reference.pages()[path](team.parse({"region": region}))
        assert text.startswith("# ") and "nan" not in text.lower().split() and "inf" not in text.split()


@pytest.mark.parametrize("region, circuit, size, frequency, method", [
    ("na", "480 V three-phase", "10 AWG", 60, "table"),
    ("iec", "400 V three-phase", "4 mm²", 50, "physics")])
def test_quick_table_cell_is_the_max_length_calculator_result(region, circuit, size, frequency,
                                                              method):
    # The page uses the method the calculator starts from in the region (no method given here).
    assert conductor_page.quick_method(region) == method
    grid = conductor_page.longest_runs(region)[circuit]
    i = conductor_page.QUICK_SIZES[region].index(size)
    j = conductor_page.QUICK_CURRENTS_A.index(20.0)
    result = api.run("max-length", {
        "system": "3ph", "voltage": int(circuit[:3]), "current": 20, "size": size, "pf": 0.9,
        "max_drop_pct": 3, "conductor_temp_c": 75, "raceway": "pvc", "frequency_hz": frequency},
        region=region)
    assert result["ok"], result
    assert result["outputs"]["length"]["value"] == pytest.approx(grid[i, j], rel=1e-9)


def test_quick_tables_state_their_method():
    text = conductor_page.conductors_page(team.parse({"region": "na"}))
    assert "conductor data by the published tables" in text
    assert "conductor data by the physics" in text  # the IEC tables shown beside


def test_quick_table_120_v_12_awg_20_a_is_about_fifty_feet():
    # The trade's figure for a 20 A load on 12 AWG at 120 V and 3 % is "about 50 ft" (common
    # practice); from NEC Chapter 9 Table 8, 3.6 V / (2 × 20 A × 1.98 Ω/kft × 0.9) = 50.5 ft.
    grid = conductor_page.longest_runs("na")["120 V single-phase"]
    i = conductor_page.QUICK_SIZES["na"].index("12 AWG")
    j = conductor_page.QUICK_CURRENTS_A.index(20.0)
    assert grid[i, j] / 0.3048 == pytest.approx(50.5, rel=0.03)  # reactance and skin: ≤ 3 %
