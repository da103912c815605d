"""Every rule kind of the union has all its parts, found from its name alone.

A kind's model (models/rules.py) names its family; the checker's evaluator is the
function named like the kind in check/<family>.py, the solver's encoder the one of
that name in solver/<family>.py; its checker tests are in
tests/core/check/test_<family>.py, and its hand-worked optimum in
tests/core/solver/test_rule_families.py (a test named test_<kind with _>_...).
"""

from __future__ import annotations

import importlib
import inspect
from pathlib import Path

import pytest

from rostertui.core.check import EVALUATORS
from rostertui.core.models.rules import (
    RULE_FAMILY,
    RULE_KINDS,
    RULE_MODELS,
    RuleBase,
    function_name,
    kind_of,
    rule_adapter,
)
from rostertui.core.solver.model import ENCODERS
from tests.core.solver import test_rule_families

TESTS = Path(__file__).resolve().parent


def test_the_kinds_are_the_unions_members_each_once() -> None:
    assert len(RULE_MODELS) == len(RULE_KINDS) == len(set(RULE_KINDS)) == 15
    assert all(issubclass(m, RuleBase) for m in RULE_MODELS)
    assert list(EVALUATORS) == list(ENCODERS) == list(RULE_KINDS)


@pytest.mark.parametrize("kind", RULE_KINDS)
def test_each_kind_has_a_model_an_evaluator_an_encoder_and_tests(kind: str) -> None:
    model = next(m for m in RULE_MODELS if kind_of(m) == kind)
    family, name = RULE_FAMILY[kind], function_name(kind)
    assert model.family == family and family.isidentifier()
    assert type(rule_adapter.validate_python(_minimal(kind))) is model

    checker = importlib.import_module(f"rostertui.core.check.{family}")
    evaluate = getattr(checker, name, None)
    assert callable(evaluate), f"{kind}: no {name}() in check/{family}.py"
    assert EVALUATORS[kind] is evaluate
    assert list(inspect.signature(evaluate).parameters) == ["ws", "eff", "grid"], kind

    solver = importlib.import_module(f"rostertui.core.solver.{family}")
    encode = getattr(solver, name, None)
    assert callable(encode), f"{kind}: no {name}() in solver/{family}.py"
    assert ENCODERS[kind] is encode
    assert list(inspect.signature(encode).parameters) == ["b", "eff", "shared"], kind

    checker_tests = TESTS / "check" / f"test_{family}.py"
    assert checker_tests.exists(), f"{kind}: no {checker_tests.relative_to(TESTS.parent)}"
    assert f'kind = "{kind}"' in checker_tests.read_text(encoding="utf-8"), kind

    hand_worked = [t for t in dir(test_rule_families) if t.startswith(f"test_{name}_")]
    assert hand_worked, f"{kind}: no test_{name}_... in tests/core/solver/test_rule_families.py"


def _minimal(kind: str) -> dict[str, object]:
    """The smallest valid rule of each kind."""
    extra: dict[str, dict[str, object]] = {
        "min-rest": {"hours": 11}, "weekly-rest": {"hours": 24},
        "max-consecutive-days": {"days": 5}, "min-consecutive-days": {"days": 2},
        "min-consecutive-off": {"days": 2}, "max-consecutive-shift": {"shift": "N", "count": 2},
        "forbidden-sequence": {"first": "N", "then": ["E"]}, "max-shifts": {"count": 3},
        "min-shifts": {"count": 1}, "hours": {"max": 40},
        "max-average-weekly-hours": {"hours": 48, "weeks": 17}, "max-weekends": {"count": 1},
        "complete-weekends": {}, "not-available": {}, "balance": {"metric": "shifts",
                                                                   "weight": 1},
    }
    return {"id": "r", "kind": kind, **extra[kind]}
