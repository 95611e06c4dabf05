"""The shared vectors on CPython: each expected value carries its source in the vector file."""

import pytest

from calc import api
from tests.vectors import all_vectors, vector_id

CASES = all_vectors()


@pytest.mark.parametrize("case", CASES, ids=[vector_id(c) for c in CASES])
def test_vector(case):
    calculator, vector = case
    result = api.run(calculator, vector["inputs"])
    if "errors" in vector:
        assert result["ok"] is False
        assert sorted(e["field"] for e in result["errors"]) == sorted(vector["errors"])
        for error in result["errors"]:
            assert error["message"], "every error says what is wrong"
        return
    assert result["ok"] is True, result
    # Tolerance: the vector's own (the precision of the hand computation it cites).
    for name, expected in vector["expect"].items():
        assert result["outputs"][name]["value"] == pytest.approx(expected, rel=vector["rel"]), name


def test_every_vector_names_its_source():
    for _, vector in CASES:
        if "expect" in vector:
            assert vector.get("source"), vector["name"]
