"""What the statistics report: `PersonStats`, `GroupStats` (with a `Summary` per
metric) and `RosterStats`, each with `to_json()`.

Exact quantities (hours, means) are `Fraction`s here and floats in JSON; counts
are ints in both.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from fractions import Fraction
from typing import Any

EVERYONE = "everyone"

Number = int | Fraction


def as_json_number(value: Number | None) -> int | float | None:
    """A count stays an int; an exact quantity (Fraction) becomes a float."""
    if value is None or isinstance(value, int):
        return value
    return float(value)


@dataclass(frozen=True)
class PersonStats:
    """One person's statistics over the period."""

    person: str
    name: str
    groups: tuple[str, ...]
    hours: Fraction  # paid hours of shifts + leave credit, exact
    paid_hours: Fraction
    leave_hours: Fraction
    hours_rule: str | None  # id of the hours rule the bounds come from
    hours_min: Fraction | None
    hours_max: Fraction | None
    hours_target: Fraction | None
    shifts: int
    by_shift: dict[str, int]  # every shift code of the unit, in shifts.toml order
    nights: int
    weekend_days: int
    weekends: int
    holidays: int
    requests_granted: int
    requests_denied: int
    longest_stretch: int

    @property
    def requests_asked(self) -> int:
        return self.requests_granted + self.requests_denied

    @property
    def hours_reference(self) -> Fraction | None:
        """The target, else the midpoint of min and max, else None."""
        if self.hours_target is not None:
            return self.hours_target
        if self.hours_min is not None and self.hours_max is not None:
            return (self.hours_min + self.hours_max) / 2
        return None

    @property
    def hours_deviation(self) -> Fraction | None:
        ref = self.hours_reference
        return None if ref is None else self.hours - ref

    def to_json(self) -> dict[str, Any]:
        return {
            "person": self.person,
            "name": self.name,
            "groups": list(self.groups),
            "hours": float(self.hours),
            "paid_hours": float(self.paid_hours),
            "leave_hours": float(self.leave_hours),
            "hours_rule": self.hours_rule,
            "hours_min": as_json_number(self.hours_min),
            "hours_max": as_json_number(self.hours_max),
            "hours_target": as_json_number(self.hours_target),
            "hours_deviation": as_json_number(self.hours_deviation),
            "shifts": self.shifts,
            "by_shift": dict(self.by_shift),
            "nights": self.nights,
            "weekend_days": self.weekend_days,
            "weekends": self.weekends,
            "holidays": self.holidays,
            "requests_asked": self.requests_asked,
            "requests_granted": self.requests_granted,
            "requests_denied": self.requests_denied,
            "longest_stretch": self.longest_stretch,
        }


@dataclass(frozen=True)
class Summary:
    """A metric over some people: how many, mean, min, max (None when nobody)."""

    count: int
    mean: Fraction | None
    low: Number | None
    high: Number | None

    @classmethod
    def of(cls, values: Sequence[Number]) -> Summary:
        if not values:
            return cls(0, None, None, None)
        return cls(len(values), Fraction(sum(values)) / len(values), min(values), max(values))

    @property
    def spread(self) -> Number | None:
        """Max minus min, as the `balance` rule measures it (unrounded)."""
        if self.low is None or self.high is None:
            return None
        return self.high - self.low

    def to_json(self) -> dict[str, Any]:
        return {
            "count": self.count,
            "mean": as_json_number(self.mean),
            "spread": as_json_number(self.spread),
            "min": as_json_number(self.low),
            "max": as_json_number(self.high),
        }


@dataclass(frozen=True)
class GroupStats:
    """Fairness within a group: nights, weekends worked and hours deviation."""

    group: str
    everyone: bool
    members: tuple[str, ...]
    nights: Summary
    weekends: Summary
    hours_deviation: Summary  # only members with a target or both bounds

    @property
    def people(self) -> int:
        return len(self.members)

    def to_json(self) -> dict[str, Any]:
        return {
            "group": self.group,
            "everyone": self.everyone,
            "people": self.people,
            "members": list(self.members),
            "nights": self.nights.to_json(),
            "weekends": self.weekends.to_json(),
            "hours_deviation": self.hours_deviation.to_json(),
        }


@dataclass(frozen=True)
class RosterStats:
    """Statistics of one roster (or of nobody working, when there is no roster)."""

    people: list[PersonStats]
    groups: list[GroupStats]
    has_roster: bool
    weekends_in_period: int
    holidays_in_period: int

    def person(self, pid: str) -> PersonStats:
        for p in self.people:
            if p.person == pid:
                return p
        raise KeyError(pid)

    @property
    def everyone(self) -> GroupStats:
        return next(g for g in self.groups if g.everyone)

    def group(self, code: str) -> GroupStats:
        """A staff group by code; `EVERYONE` is the whole staff unless a group has that code."""
        for g in self.groups:
            if g.group == code and not g.everyone:
                return g
        if code == EVERYONE:
            return self.everyone
        raise KeyError(code)

    def to_json(self) -> dict[str, Any]:
        return {
            "people": [p.to_json() for p in self.people],
            "groups": [g.to_json() for g in self.groups],
        }
