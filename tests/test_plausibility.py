"""Every calculator judges whether its inputs and results are those of real equipment (issue 11,
item 9): one `plausibility` check, pass on ordinary equipment, warn (never fail) beyond it."""

import pytest

from calc import api
from calc.calculators._plausibility import CHECK_NAME, plausibility
from calc.spec import Result
from tests.vectors import all_vectors


def _plausibility_checks(result):
    return [c for c in result["checks"] if c["name"] == CHECK_NAME]


@pytest.mark.parametrize("region", ["na", "iec"])
@pytest.mark.parametrize("calculator_id", list(api.REGISTRY))
def test_defaults_are_ordinary_equipment(calculator_id, region):
    result = api.run(calculator_id, {}, region=region)
    assert result["ok"], result
    (check,) = _plausibility_checks(result)
    assert check["status"] == "pass", check["message"]


@pytest.mark.parametrize("case", [c for c in all_vectors() if "expect" in c[1]],
                         ids=lambda c: f"{c[0]}: {c[1]['name']}")
def test_every_result_carries_one_plausibility_check_never_a_fail(case):
    calculator_id, vector = case
    result = api.run(calculator_id, vector["inputs"])
    checks = _plausibility_checks(result)
    assert len(checks) == 1 and checks[0]["status"] in ("pass", "warn")
    if checks[0]["status"] == "warn":
        assert len(checks[0]["message"]) > 30  # says which value and why


def test_the_helper_passes_on_no_reasons_and_warns_with_every_reason():
    ordinary, odd = Result(), Result()
    plausibility(ordinary, [])
    plausibility(odd, ["a 2000 hp motor at 208 V draws 5.4 kA.", "", "5 r/min is not a motor speed"])
    assert ordinary.checks[0]["status"] == "pass"
    assert odd.checks[0]["status"] == "warn"
    assert "5.4 kA" in odd.checks[0]["message"] and "5 r/min" in odd.checks[0]["message"]
