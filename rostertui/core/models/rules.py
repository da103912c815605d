"""One model per rule kind (rules.md), joined in a discriminated union on `kind`.

The union is the one list of rule kinds. Each model names its `family`: the
checker's evaluator of a kind is the function named like the kind (`-` as `_`) in
check/<family>.py, and the solver's encoder the function of that name in
solver/<family>.py (check/run.py and solver/model.py look them up;
tests/core/test_kinds.py checks every kind has both, and a hand-worked test).
"""

from __future__ import annotations

from datetime import date
from typing import Annotated, ClassVar, Literal, get_args

from pydantic import Field, PositiveInt, TypeAdapter, model_validator

from rostertui.core.models.common import HourResolution, Identifier, Strict, Weekday

MAX_WEIGHT = 1_000_000
MAX_HOURS = 366 * 24

Weight = Annotated[PositiveInt, Field(le=MAX_WEIGHT)]
Count = Annotated[int, Field(ge=0, le=366)]
Days = Annotated[int, Field(ge=1, le=366)]
Hours = Annotated[float, HourResolution, Field(ge=0, le=MAX_HOURS)]
# A shift selector: a unit's shift code or "@night" (checked against the unit on load).
Selector = Annotated[str, Field(min_length=1, max_length=32)]
Edges = Literal["open", "closed"]


class RuleBase(Strict):
    """Fields every rule has: identity, scope, hard/soft, source."""

    family: ClassVar[str]  # the module name of its evaluator and encoder (see above)

    id: Identifier
    people: list[Identifier] | None = None
    groups: list[Identifier] | None = None
    except_: list[Identifier] = Field(default_factory=list, alias="except")
    weight: Weight | None = None
    source: str | None = None
    note: str | None = None

    @property
    def hard(self) -> bool:
        return self.weight is None


class MinRest(RuleBase):
    kind: Literal["min-rest"]
    family: ClassVar[str] = "rest"
    hours: Annotated[float, Field(gt=0, le=168)]


class WeeklyRest(RuleBase):
    kind: Literal["weekly-rest"]
    family: ClassVar[str] = "rest"
    hours: Annotated[float, Field(gt=0, le=MAX_HOURS)]
    window_days: Annotated[int, Field(ge=1, le=366)] = 7
    align: Literal["monday", "period-start", "rolling"] = "monday"

    @model_validator(mode="after")
    def _fits_window(self) -> WeeklyRest:
        if self.hours > self.window_days * 24:
            raise ValueError(
                f"hours = {self.hours:g} cannot fit in a window of {self.window_days} days"
            )
        return self


class MaxConsecutiveDays(RuleBase):
    kind: Literal["max-consecutive-days"]
    family: ClassVar[str] = "stretches"
    days: Days


class MinConsecutiveDays(RuleBase):
    kind: Literal["min-consecutive-days"]
    family: ClassVar[str] = "stretches"
    days: Days
    edges: Edges = "open"


class MinConsecutiveOff(RuleBase):
    kind: Literal["min-consecutive-off"]
    family: ClassVar[str] = "stretches"
    days: Days
    edges: Edges = "open"


class MaxConsecutiveShift(RuleBase):
    kind: Literal["max-consecutive-shift"]
    family: ClassVar[str] = "stretches"
    shift: Selector
    count: Days


class ForbiddenSequence(RuleBase):
    kind: Literal["forbidden-sequence"]
    family: ClassVar[str] = "sequences"
    first: Selector
    then: Annotated[list[Selector], Field(min_length=1)]


class MaxShifts(RuleBase):
    kind: Literal["max-shifts"]
    family: ClassVar[str] = "counts"
    count: Count
    shift: Selector | None = None


class MinShifts(RuleBase):
    kind: Literal["min-shifts"]
    family: ClassVar[str] = "counts"
    count: Count
    shift: Selector | None = None


class HoursRule(RuleBase):
    kind: Literal["hours"]
    family: ClassVar[str] = "hours"
    min: Hours | None = None
    max: Hours | None = None
    target: Hours | None = None

    @model_validator(mode="after")
    def _consistent(self) -> HoursRule:
        if self.min is None and self.max is None and self.target is None:
            raise ValueError("an hours rule needs at least one of min, max, target")
        if self.min is not None and self.max is not None and self.min > self.max:
            raise ValueError(f"min = {self.min:g} is above max = {self.max:g}")
        if self.target is not None and self.weight is None:
            raise ValueError("target needs a weight: a target is a soft aim, never a hard rule")
        return self


class MaxAverageWeeklyHours(RuleBase):
    kind: Literal["max-average-weekly-hours"]
    family: ClassVar[str] = "hours"
    hours: Annotated[float, HourResolution, Field(gt=0, le=168)]
    weeks: Annotated[int, Field(ge=1, le=52)]


class MaxWeekends(RuleBase):
    kind: Literal["max-weekends"]
    family: ClassVar[str] = "weekends"
    count: Count


class CompleteWeekends(RuleBase):
    kind: Literal["complete-weekends"]
    family: ClassVar[str] = "weekends"


class NotAvailable(RuleBase):
    kind: Literal["not-available"]
    family: ClassVar[str] = "not_available"
    days: list[Weekday] | None = None
    dates: list[date] | None = None
    shift: Selector | None = None


BalanceMetric = Annotated[
    str, Field(pattern=r"^(shifts|hours|weekends|nights|shift:[A-Za-z0-9][A-Za-z0-9_.-]{0,31})$")
]


class Balance(RuleBase):
    kind: Literal["balance"]
    family: ClassVar[str] = "balance"
    metric: BalanceMetric

    @model_validator(mode="after")
    def _soft_only(self) -> Balance:
        if self.weight is None:
            raise ValueError("a balance rule is soft only: give it a weight")
        return self


Rule = Annotated[
    MinRest
    | WeeklyRest
    | MaxConsecutiveDays
    | MinConsecutiveDays
    | MinConsecutiveOff
    | MaxConsecutiveShift
    | ForbiddenSequence
    | MaxShifts
    | MinShifts
    | HoursRule
    | MaxAverageWeeklyHours
    | MaxWeekends
    | CompleteWeekends
    | NotAvailable
    | Balance,
    Field(discriminator="kind"),
]

# The union's members in its order, and their `kind`s (the order of messages).
RULE_MODELS: tuple[type[RuleBase], ...] = get_args(get_args(Rule)[0])


def kind_of(model: type[RuleBase]) -> str:
    """The `kind` a rule model's literal names."""
    kind: str = get_args(model.model_fields["kind"].annotation)[0]
    return kind


RULE_KINDS: tuple[str, ...] = tuple(kind_of(m) for m in RULE_MODELS)
RULE_FAMILY: dict[str, str] = {kind_of(m): m.family for m in RULE_MODELS}


def function_name(kind: str) -> str:
    """The name of a kind's evaluator and encoder in its family's modules."""
    return kind.replace("-", "_")

rule_adapter: TypeAdapter[Rule] = TypeAdapter(Rule)


def selectors_of(rule: RuleBase) -> list[tuple[str, str]]:
    """(key path inside the rule, selector) for every shift the rule names."""
    found: list[tuple[str, str]] = []
    for key in ("shift", "first"):
        value = getattr(rule, key, None)
        if value is not None:
            found.append((key, value))
    for i, value in enumerate(getattr(rule, "then", None) or []):
        found.append((f"then[{i}]", value))
    if isinstance(rule, Balance) and rule.metric.startswith("shift:"):
        found.append(("metric", rule.metric.removeprefix("shift:")))
    return found


class PresetFile(Strict):
    """A preset holds only [[rule]] entries."""

    rule: list[Rule] = Field(default_factory=list)
