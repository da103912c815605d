"""Words for dates and quantities, the one home of their formatting: "4 Mar",
"Mon 4 Mar", "17 Apr-23 Apr", "9 h 00 min", "91.25 h", "07:30".

Locale-free (English names from the tables here, never strftime's %a/%b), so a
message reads the same on every machine. Used by the checker's messages, the
statistics, the exports, the CLI and the UI.
"""

from __future__ import annotations

from datetime import date
from fractions import Fraction

MONTHS = ("Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec")
WEEKDAY_NAMES = ("Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun")


def day(d: date) -> str:
    """ "4 Mar" (no leading zero, English month abbreviation, locale-free)."""
    return f"{d.day} {MONTHS[d.month - 1]}"


def weekday_day(d: date) -> str:
    """ "Mon 4 Mar"."""
    return f"{WEEKDAY_NAMES[d.weekday()]} {day(d)}"


def month(d: date) -> str:
    """ "Mar"."""
    return MONTHS[d.month - 1]


def month_number(text: str) -> int | None:
    """The month a typed name means by its first three letters ("mar", "March" -> 3)."""
    folded = text[:3].lower()
    return next((i + 1 for i, m in enumerate(MONTHS) if m.lower() == folded), None)


def span(first: date, last: date) -> str:
    """ "17 Apr-23 Apr"."""
    return f"{day(first)}-{day(last)}"


def duration(minutes: int) -> str:
    """ "9 h 00 min"; negative gaps (overlapping shifts) read "-0 h 30 min"."""
    sign = "-" if minutes < 0 else ""
    m = abs(minutes)
    return f"{sign}{m // 60} h {m % 60:02d} min"


def number(value: Fraction | float | int) -> str:
    """A quantity without needless decimals: 152, 91.25, 82.5 (at most 2 decimals)."""
    text = f"{float(value):.2f}"
    return text.rstrip("0").rstrip(".") if "." in text else text


def clock(minute_of_day: int) -> str:
    """ "07:30" from minutes after midnight."""
    return f"{minute_of_day // 60:02d}:{minute_of_day % 60:02d}"


def codes(selected: frozenset[str], order: list[str]) -> str:
    """Shift codes a selector names, in the unit's order, joined by "/" (e.g. "N")."""
    return "/".join(c for c in order if c in selected) or "/".join(sorted(selected))
