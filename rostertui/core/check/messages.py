"""Formatting for violation messages: "4 Mar", "9 h 00 min", "91.25 h"."""

from __future__ import annotations

from datetime import date
from fractions import Fraction

MONTHS = ("Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec")


def day(d: date) -> str:
    """ "4 Mar" (no leading zero, English month abbreviation, locale-free)."""
    return f"{d.day} {MONTHS[d.month - 1]}"


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
