"""Shift durations, paid hours and the default night flag (workspace-format.md)."""

from __future__ import annotations

import pytest

from rostertui.core.models.shifts import Shift


def shift(start: str, end: str, **extra: object) -> Shift:
    return Shift(code="X", name="x", start=start, end=end, **extra)


@pytest.mark.parametrize(
    ("start", "end", "minutes"),
    [("07:00", "15:00", 480), ("21:30", "07:30", 600), ("08:00", "08:00", 1440),
     ("23:00", "00:00", 60)],
)
def test_end_at_or_before_start_ends_the_next_day(start: str, end: str, minutes: int) -> None:
    assert shift(start, end).minutes == minutes


def test_paid_hours_default_to_the_clock_duration() -> None:
    assert shift("14:00", "22:00").hours == 8
    assert shift("14:00", "22:00", paid_hours=7.5).hours == 7.5


@pytest.mark.parametrize(
    ("start", "end", "night"),
    [
        ("21:30", "07:30", True),   # 7 h between 23:00 and 06:00
        ("14:00", "22:00", False),
        ("17:00", "23:00", False),
        ("20:00", "02:00", False),  # 3 h? no: 23:00-02:00 is exactly 3 h -> night
        ("03:00", "11:00", True),   # 03:00-06:00 = 3 h
        ("04:00", "12:00", False),  # 2 h
    ],
)
def test_default_night_flag_is_three_hours_between_23_and_6(start: str, end: str,
                                                           night: bool) -> None:
    expected = night if (start, end) != ("20:00", "02:00") else True
    assert shift(start, end).is_night is expected


def test_explicit_night_flag_wins() -> None:
    assert shift("21:30", "07:30", night=False).is_night is False
    assert shift("08:00", "16:00", night=True).is_night is True
