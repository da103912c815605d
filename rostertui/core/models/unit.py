"""unit.toml: the unit, its period and its rule set."""

from __future__ import annotations

from datetime import date, timedelta
from typing import cast
from zoneinfo import ZoneInfo, ZoneInfoNotFoundError

from pydantic import Field, field_validator

from rostertui.core.models.common import DisplayName, Strict, Weekday
from rostertui.core.models.rules import Rule


class RepairSettings(Strict):
    """`[repair]` in unit.toml (our extension): what one changed cell costs in a repair."""

    change_weight: int = Field(default=1000, ge=1)


class Unit(Strict):
    name: DisplayName
    timezone: str
    start: date
    days: int = Field(ge=1, le=366)
    weekend: list[Weekday] = Field(default_factory=lambda: cast(list[Weekday], ["sat", "sun"]))
    holidays: list[date] = Field(default_factory=list)
    include: list[str] = Field(default_factory=list)
    rule: list[Rule] = Field(default_factory=list)
    repair: RepairSettings = Field(default_factory=RepairSettings)

    @field_validator("timezone")
    @classmethod
    def _known_zone(cls, value: str) -> str:
        try:
            ZoneInfo(value)
        except (ZoneInfoNotFoundError, ValueError, OSError):  # OSError: a name too long
            raise ValueError(
                f"{value!r} is not a known IANA timezone (e.g. \"Europe/Lisbon\", \"UTC\")"
            ) from None
        return value

    @property
    def end(self) -> date:
        """The last day of the period."""
        return self.start + timedelta(days=self.days - 1)

    @property
    def dates(self) -> list[date]:
        return [self.start + timedelta(days=i) for i in range(self.days)]

    def in_period(self, day: date) -> bool:
        return self.start <= day <= self.end
