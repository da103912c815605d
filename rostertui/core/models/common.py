"""Small types shared by every model: identifiers, clock times, weekdays."""

from __future__ import annotations

import re
from typing import Annotated, Literal

from pydantic import AfterValidator, BaseModel, ConfigDict

IDENTIFIER_RE = re.compile(r"[A-Za-z0-9][A-Za-z0-9_.-]{0,31}")
OFF = "-"
NIGHT_SELECTOR = "@night"

Weekday = Literal["mon", "tue", "wed", "thu", "fri", "sat", "sun"]
WEEKDAYS: tuple[str, ...] = ("mon", "tue", "wed", "thu", "fri", "sat", "sun")


def _identifier(value: str) -> str:
    if value == OFF:
        raise ValueError("'-' is reserved for a day off and cannot be used as a code or id")
    if not IDENTIFIER_RE.fullmatch(value):
        raise ValueError(
            f"{value!r} is not a valid identifier: 1 to 32 letters, digits, '_', '.' or '-', "
            "starting with a letter or digit"
        )
    return value


def _clock(value: str) -> str:
    m = re.fullmatch(r"([0-9][0-9]):([0-9][0-9])", value)
    if not m or int(m.group(1)) > 23 or int(m.group(2)) > 59:
        raise ValueError(f"{value!r} is not a clock time: expected \"HH:MM\" from 00:00 to 23:59")
    return value


Identifier = Annotated[str, AfterValidator(_identifier)]
ClockTime = Annotated[str, AfterValidator(_clock)]


def clock_minutes(value: str) -> int:
    """Minutes after midnight of a validated "HH:MM" string."""
    hours, minutes = value.split(":")
    return int(hours) * 60 + int(minutes)


class Strict(BaseModel):
    """Base of every file model: unknown keys are an error, never ignored."""

    model_config = ConfigDict(extra="forbid", populate_by_name=True)
