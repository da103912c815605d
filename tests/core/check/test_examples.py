"""The 12 worked examples of ../shared/spec/examples: totals and by_kind match exactly."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from rostertui.core.check import check_roster
from rostertui.core.io.load import load_workspace

REPO = Path(__file__).resolve().parents[3]
EXAMPLES = REPO / ".." / "shared" / "spec" / "examples"
CASES = sorted(p.name for p in EXAMPLES.glob("case-*")) if EXAMPLES.is_dir() else ["absent"]


def _expected(case: str) -> tuple[Path, dict]:
    if not EXAMPLES.is_dir():
        pytest.skip(f"../shared/spec/examples not found: {EXAMPLES.resolve()}")
    folder = EXAMPLES / case
    return folder, json.loads((folder / "expected-check.json").read_text(encoding="utf-8"))


@pytest.mark.parametrize("case", CASES)
def test_totals_and_by_kind_match(case: str) -> None:
    folder, expected = _expected(case)
    got = check_roster(load_workspace(folder)).to_json()
    assert got["compliant"] == expected["compliant"]
    assert got["hard_violations"] == expected["hard_violations"]
    assert got["penalty"] == expected["penalty"]
    assert got["by_kind"] == expected["by_kind"]


@pytest.mark.parametrize("case", CASES)
def test_violations_match(case: str) -> None:
    """Messages and order are informative in the spec; this checker matches them all."""
    folder, expected = _expected(case)
    got = check_roster(load_workspace(folder)).to_json()
    assert list(got) == ["compliant", "hard_violations", "penalty", "by_kind", "violations"]
    assert got["violations"] == expected["violations"]
