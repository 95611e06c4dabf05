"""The shared test vectors (tests/vectors/*.json): read by the CPython and the Pyodide tests."""

import json
from pathlib import Path

VECTOR_DIR = Path(__file__).resolve().parent / "vectors"


def vector_files():
    return sorted(VECTOR_DIR.glob("*.json"))


def all_vectors():
    """[(calculator id, vector)] over every file, in a stable order."""
    cases = []
    for path in vector_files():
        data = json.loads(path.read_text(encoding="utf-8"))
        for vector in data["vectors"]:
            cases.append((data["calculator"], vector))
    return cases


def vector_id(case):
    calculator, vector = case
    return f"{calculator}: {vector['name']}"
