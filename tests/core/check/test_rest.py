"""min-rest and weekly-rest in real elapsed time: history, windows of each align, DST
(rules.md, "Kinds" and "Decisions on the fine print")."""

from __future__ import annotations

from datetime import UTC, date, datetime

from rostertui.core.check.grid import Grid

from .helpers import SHIFTS, of_kind


def min_rest(hours: float, weight: int | None = None) -> str:
    w = f"weight = {weight}\n" if weight else ""
    return f'[[rule]]\nid = "daily-rest"\nkind = "min-rest"\nhours = {hours}\n{w}'


def weekly(hours: int, align: str, window_days: int = 7) -> str:
    return (
        f'[[rule]]\nid = "weekly"\nkind = "weekly-rest"\nhours = {hours}\n'
        f'window_days = {window_days}\nalign = "{align}"\n'
    )


def epoch_minutes(*args: int) -> int:
    return int(datetime(*args, tzinfo=UTC).timestamp()) // 60


# -- min-rest ----------------------------------------------------------------------------
def test_min_rest_message_units_and_penalty(check) -> None:
    r = check(rows={"a": "L E - -"}, rules=min_rest(11, weight=30))
    [v] = of_kind(r, "min-rest")
    assert (v.units, v.penalty, v.hard) == (1, 30, False)
    assert v.dates == (date(2027, 3, 1), date(2027, 3, 2))
    assert v.message == (
        "9 h 00 min rest between L (ends 22:00 on 1 Mar) and E (starts 07:00 on 2 Mar); "
        "needs 11 h"
    )


def test_rest_of_exactly_the_required_hours_passes(check) -> None:
    assert of_kind(check(rows={"a": "L D - -"}, rules=min_rest(11)), "min-rest") == []
    assert len(of_kind(check(rows={"a": "L D - -"}, rules=min_rest(11.5)), "min-rest")) == 1


def test_overlapping_shifts_give_negative_rest(check) -> None:
    shifts = SHIFTS + (
        '\n[[shift]]\ncode = "V"\nname = "Long night"\nstart = "22:00"\nend = "08:00"\n'
    )
    [v] = of_kind(check(rows={"a": "V E -"}, rules=min_rest(11), shifts=shifts), "min-rest")
    assert v.message.startswith("-1 h 00 min rest between V (ends 08:00 on 2 Mar)")


def test_min_rest_looks_at_last_history_day(check) -> None:
    r = check(rows={"a": "E - -"}, history={"a": "- L"}, rules=min_rest(11))
    [v] = of_kind(r, "min-rest")
    assert v.dates == (date(2027, 2, 28), date(2027, 3, 1))
    # pairs wholly inside history are not judged
    assert of_kind(check(rows={"a": "- - -"}, history={"a": "L E"}, rules=min_rest(11)),
                   "min-rest") == []


# -- weekly-rest windows -----------------------------------------------------------------
WORK_12 = "E E E E E E E E E E E E"  # Wed 3 Mar .. Sun 14 Mar 2027


def test_monday_windows_start_before_the_period_where_time_is_rest(check) -> None:
    r = check(rows={"a": WORK_12}, start="2027-03-03", rules=weekly(35, "monday"))
    # window 1-7 Mar: Mon 00:00 to Wed 07:00 is rest (55 h); window 8-14 Mar: 16 h at most
    [v] = of_kind(r, "weekly-rest")
    assert v.dates == (date(2027, 3, 8), date(2027, 3, 14))
    assert v.message == "longest rest 16 h 00 min in 8 Mar-14 Mar; needs 35 h"


def test_monday_windows_use_history_before_the_period(check) -> None:
    r = check(rows={"a": WORK_12}, start="2027-03-03", history={"a": "E E"},
              rules=weekly(35, "monday"))
    assert [v.dates[0] for v in of_kind(r, "weekly-rest")] == [date(2027, 3, 1), date(2027, 3, 8)]


def test_period_start_windows_checked_only_when_they_end_by_the_period_end(check) -> None:
    r = check(rows={"a": WORK_12}, start="2027-03-03", rules=weekly(35, "period-start"))
    # windows 3-9 Mar (checked) and 10-16 Mar (ends after 14 Mar: not checked)
    assert [v.dates for v in of_kind(r, "weekly-rest")] == [(date(2027, 3, 3), date(2027, 3, 9))]


def test_rolling_windows_start_on_every_period_day(check) -> None:
    r = check(rows={"a": WORK_12}, start="2027-03-03", rules=weekly(35, "rolling"))
    assert [v.dates[0].day for v in of_kind(r, "weekly-rest")] == [3, 4, 5, 6, 7, 8]


def test_only_the_rest_inside_the_window_counts(check) -> None:
    # off Sun 7 and Mon 8 Mar: 64 h of rest, but 33 h in week 1 and 31 h in week 2
    row = "E E E E E E - - E E E E E E"
    r = check(rows={"a": row}, rules=weekly(35, "monday"))
    assert [v.message for v in of_kind(r, "weekly-rest")] == [
        "longest rest 33 h 00 min in 1 Mar-7 Mar; needs 35 h",
        "longest rest 31 h 00 min in 8 Mar-14 Mar; needs 35 h",
    ]
    rolling = of_kind(check(rows={"a": row}, rules=weekly(35, "rolling")), "weekly-rest")
    assert [v.dates[0].day for v in rolling] == [1, 8]


# -- DST ---------------------------------------------------------------------------------
LISBON_SHIFTS = SHIFTS + (
    '\n[[shift]]\ncode = "X"\nname = "Long night"\nstart = "20:00"\nend = "08:00"\n'
    '\n[[shift]]\ncode = "Q"\nname = "Small hours"\nstart = "01:30"\nend = "05:00"\n'
    '\n[[shift]]\ncode = "Z"\nname = "Evening"\nstart = "19:00"\nend = "23:00"\n'
)


def test_night_across_spring_change_lasts_11_hours_and_rest_after_it(make_ws) -> None:
    ws = make_ws(rows={"a": "- X Z - - - -"}, start="2027-03-26", timezone="Europe/Lisbon",
                 shifts=LISBON_SHIFTS, rules=min_rest(11.5))
    spells, _ = Grid(ws, ws.roster).spells("a")
    night, evening = spells
    assert night.end - night.start == 11 * 60
    assert night.end == epoch_minutes(2027, 3, 28, 7, 0)  # 08:00 WEST
    assert evening.start - night.end == 11 * 60
    from rostertui.core.check import check_roster

    [v] = of_kind(check_roster(ws), "min-rest")
    assert v.message == (
        "11 h 00 min rest between X (ends 08:00 on 28 Mar) and Z (starts 19:00 on 28 Mar); "
        "needs 11.5 h"
    )


def test_rest_across_spring_change_is_an_hour_shorter(check) -> None:
    r = check(rows={"a": "- L E - - - -"}, start="2027-03-26", timezone="Europe/Lisbon",
              rules=min_rest(11))
    [v] = of_kind(r, "min-rest")
    assert v.message.startswith("8 h 00 min rest between L (ends 22:00 on 27 Mar)")


def test_night_across_autumn_change_lasts_13_hours(make_ws) -> None:
    ws = make_ws(rows={"a": "- X - -"}, start="2027-10-29", timezone="Europe/Lisbon",
                 shifts=LISBON_SHIFTS)
    [night] = Grid(ws, ws.roster).spells("a")[0]
    assert night.end - night.start == 13 * 60


def test_time_that_does_not_exist_reads_with_the_earlier_offset(make_ws) -> None:
    ws = make_ws(rows={"a": "- - Q -"}, start="2027-03-26", timezone="Europe/Lisbon",
                 shifts=LISBON_SHIFTS)
    [q] = Grid(ws, ws.roster).spells("a")[0]
    assert q.start == epoch_minutes(2027, 3, 28, 1, 30)  # 01:30 at +00:00 (WET)
    assert q.end == epoch_minutes(2027, 3, 28, 4, 0)  # 05:00 WEST


def test_weekly_window_across_spring_change_lasts_167_hours(check) -> None:
    r = check(rows={"a": "- - - - - - -"}, start="2027-03-22", timezone="Europe/Lisbon",
              rules=weekly(168, "monday"))
    [v] = of_kind(r, "weekly-rest")
    assert v.message == "longest rest 167 h 00 min in 22 Mar-28 Mar; needs 168 h"
    autumn = check(rows={"a": "- - - - - - -"}, start="2027-10-25", timezone="Europe/Lisbon",
                   rules=weekly(168, "monday"))
    assert of_kind(autumn, "weekly-rest") == []  # 169 h
