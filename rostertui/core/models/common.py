"""Small types shared by every model: identifiers, clock times, weekdays."""

from __future__ import annotations

import math
import re
import unicodedata
from typing import Annotated, Literal

from pydantic import AfterValidator, BaseModel, BeforeValidator, ConfigDict

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


HOUR_DECIMALS = 2  # hour values are kept to 1/100 h (36 seconds); README "Hours"


def _to_hour_resolution(value: object) -> object:
    """Round a number of hours to 1/100 h before it is checked or used.

    rules.md sums hours exactly; 30.700000000000003 (a float printed in full)
    and 1e-300 would otherwise need a denominator no integer model can carry.
    Rounding here, at load, gives the checker and the solver the same value.
    Anything that is not a plain number is left for the type check to refuse.
    """
    if type(value) in (int, float) and math.isfinite(value):  # type: ignore[arg-type]
        return round(value, HOUR_DECIMALS) + 0.0  # type: ignore[call-overload]
    return value


HourResolution = BeforeValidator(_to_hour_resolution)


def _display_name(value: str) -> str:
    """A name shown on one line: grid rows, CSV cells, calendar titles, headers."""
    if not value.strip():
        raise ValueError("a name cannot be empty")
    for ch in value:
        if unicodedata.category(ch) in ("Cc", "Zl", "Zp"):
            raise ValueError(
                f"{value!r} holds a control character ({_char_name(ch)}); a name is one line "
                "of text (notes may span lines)"
            )
    return value


def _char_name(ch: str) -> str:
    known = {"\n": "a line break", "\r": "a carriage return", "\t": "a tab"}
    return known.get(ch, f"U+{ord(ch):04X}")


Identifier = Annotated[str, AfterValidator(_identifier)]
ClockTime = Annotated[str, AfterValidator(_clock)]
DisplayName = Annotated[str, AfterValidator(_display_name)]


def clock_minutes(value: str) -> int:
    """Minutes after midnight of a validated "HH:MM" string."""
    hours, minutes = value.split(":")
    return int(hours) * 60 + int(minutes)


class Strict(BaseModel):
    """Base of every file model: unknown keys are an error, never ignored."""

    model_config = ConfigDict(extra="forbid", populate_by_name=True, strict=True)
