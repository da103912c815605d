"""shifts.toml: shift types and cover (demand)."""

from __future__ import annotations

from datetime import date
from typing import Annotated

from pydantic import Field, field_validator, model_validator

from rostertui.core.models.common import (
    ClockTime,
    DisplayName,
    HourResolution,
    Identifier,
    Strict,
    Weekday,
    clock_minutes,
)

NIGHT_START = 23 * 60  # 23:00
NIGHT_END = 6 * 60  # 06:00
NIGHT_MIN_MINUTES = 3 * 60  # default night flag: at least 3 h between 23:00 and 06:00

Headcount = Annotated[int, Field(ge=0, le=100_000)]
CoverWeight = Annotated[int, Field(ge=0, le=1_000_000)]


class Shift(Strict):
    code: Identifier
    name: DisplayName
    start: ClockTime
    end: ClockTime
    paid_hours: Annotated[float, HourResolution, Field(ge=0, le=24)] | None = None
    night: bool | None = None
    requires: list[Identifier] = Field(default_factory=list)

    @field_validator("code")
    @classmethod
    def _not_off(cls, value: str) -> str:
        if value.lower() == "off":
            raise ValueError(
                f"{value!r} is reserved: a request's want = \"off\" and a CSV roster's "
                "\"off\" mean a day off; choose another code")
        return value

    @property
    def minutes(self) -> int:
        """Nominal clock duration; end <= start means the shift ends the next day."""
        length = clock_minutes(self.end) - clock_minutes(self.start)
        return length if length > 0 else length + 24 * 60

    @property
    def hours(self) -> float:
        """Paid hours (default: nominal clock duration)."""
        return self.paid_hours if self.paid_hours is not None else self.minutes / 60

    @property
    def is_night(self) -> bool:
        if self.night is not None:
            return self.night
        return night_minutes(clock_minutes(self.start), self.minutes) >= NIGHT_MIN_MINUTES


def night_minutes(start: int, length: int) -> int:
    """Minutes of [start, start+length) (minutes from a midnight) inside 23:00-06:00."""
    total = 0
    for day in range(0, 3):  # a shift spans at most two midnights from its start day
        lo = day * 1440 - 1440 + NIGHT_START  # 23:00 of the day before `day`
        hi = day * 1440 + NIGHT_END
        total += max(0, min(start + length, hi) - max(start, lo))
    return total


class Cover(Strict):
    shift: Identifier
    days: list[Weekday] | None = None
    dates: list[date] | None = None
    skill: Identifier | None = None
    min: Headcount | None = None
    max: Headcount | None = None
    ideal: Headcount | None = None
    under_weight: CoverWeight | None = None
    over_weight: CoverWeight = 0

    @model_validator(mode="after")
    def _consistent(self) -> Cover:
        if self.days is not None and self.dates is not None:
            raise ValueError("give either days or dates, not both")
        if self.ideal is not None and self.under_weight is None:
            raise ValueError("ideal needs under_weight (the penalty per person short)")
        if self.min is not None and self.max is not None and self.min > self.max:
            raise ValueError(f"min = {self.min} is above max = {self.max}")
        return self


class ShiftsFile(Strict):
    shift: list[Shift] = Field(default_factory=list)
    cover: list[Cover] = Field(default_factory=list)
