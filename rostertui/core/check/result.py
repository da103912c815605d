"""What the checker reports: one Violation per entry, a CheckResult for the roster.

The JSON shapes follow rules.md, "What the checker reports". Besides the
violations, a CheckResult carries what the checker worked out on the way, for
the statistics and the UI to read rather than compute again: the `Grid` it
checked and whether each request in the period is honoured.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from datetime import date
from typing import Any

from rostertui.core.check.grid import Grid
from rostertui.core.models.requests import Request
from rostertui.core.models.workspace import EffectiveRule


@dataclass(frozen=True)
class Violation:
    """One reported violation of a rule, a built-in constraint, cover or a request."""

    rule: str
    kind: str
    hard: bool
    person: str | None
    dates: tuple[date, ...]
    units: int
    penalty: int
    message: str
    source: str | None
    shift: str | None = None
    skill: str | None = None

    def to_json(self) -> dict[str, Any]:
        """The rules.md shape; "shift" and "skill" only for kind "cover"."""
        out: dict[str, Any] = {
            "rule": self.rule,
            "kind": self.kind,
            "hard": self.hard,
            "person": self.person,
            "dates": [d.isoformat() for d in self.dates],
            "units": self.units,
            "penalty": self.penalty,
            "message": self.message,
            "source": self.source,
        }
        if self.kind == "cover":
            out["shift"] = self.shift
            out["skill"] = self.skill
        return out


def violation(
    eff: EffectiveRule,
    person: str | None,
    dates: tuple[date, ...] | list[date],
    units: int,
    message: str,
) -> Violation:
    """A violation of a [[rule]]: penalty = units x weight when soft, 0 when hard."""
    rule = eff.rule
    weight = rule.weight
    return Violation(
        rule=rule.id,
        kind=rule.kind,
        hard=weight is None,
        person=person,
        dates=tuple(dates),
        units=units,
        penalty=0 if weight is None else units * weight,
        message=message,
        source=rule.source,
    )


@dataclass(frozen=True)
class RequestOutcome:
    """A request inside the period and the checker's verdict on it."""

    request: Request
    day: int  # index in the period
    code: str  # what the roster holds that day
    honoured: bool


@dataclass
class CheckResult:
    """Every violation of one roster, with the totals rules.md defines."""

    violations: list[Violation] = field(default_factory=list)
    requests: list[RequestOutcome] = field(default_factory=list)  # file order
    grid: Grid | None = field(default=None, compare=False, repr=False)  # the roster checked

    @property
    def hard_violations(self) -> int:
        """Hard violation entries (not units)."""
        return sum(1 for v in self.violations if v.hard)

    @property
    def compliant(self) -> bool:
        return self.hard_violations == 0

    @property
    def penalty(self) -> int:
        return sum(v.penalty for v in self.violations)

    @property
    def by_kind(self) -> dict[str, dict[str, int]]:
        """Units and penalty per kind, hard and soft together; only kinds with violations."""
        out: dict[str, dict[str, int]] = {}
        for v in self.violations:
            entry = out.setdefault(v.kind, {"units": 0, "penalty": 0})
            entry["units"] += v.units
            entry["penalty"] += v.penalty
        return out

    def to_json(self) -> dict[str, Any]:
        return {
            "compliant": self.compliant,
            "hard_violations": self.hard_violations,
            "penalty": self.penalty,
            "by_kind": self.by_kind,
            "violations": [v.to_json() for v in self.violations],
        }
