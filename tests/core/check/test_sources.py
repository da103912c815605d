"""Cases from outside sources; each test names its source.

- Directive 2003/88/EC (EU Working Time Directive), Art. 3: 11 consecutive hours of
  daily rest per 24-hour period; Art. 5: per 7-day period, 24 hours of uninterrupted
  rest plus the 11 hours of daily rest of Art. 3 (35 h).
- nidirect, "Calculating your working time" (UK average weekly working time over a
  17-week reference period, 48 h limit).
- CJEU, Case C-306/16, Maio Marques da Rosa v Varzim Sol (9 Nov 2017): the weekly rest
  may fall on any day of each 7-day period, so up to 12 consecutive working days are
  lawful when each period holds its rest.
"""

from __future__ import annotations

from .helpers import SHIFTS, of_kind

DAILY_REST = (
    '[[rule]]\nid = "daily-rest"\nkind = "min-rest"\nhours = 11\n'
    'source = "Directive 2003/88/EC, Art. 3"\n'
)
WEEKLY_REST = (
    '[[rule]]\nid = "weekly-rest"\nkind = "weekly-rest"\nhours = 35\nalign = "monday"\n'
    'source = "Directive 2003/88/EC, Art. 5"\n'
)


def test_directive_2003_88_art3_daily_rest_22_00_then_07_00_breaks_09_00_keeps(check) -> None:
    r = check(rows={"a": "L E - -"}, rules=DAILY_REST)
    [v] = of_kind(r, "min-rest")
    assert v.hard and v.source == "Directive 2003/88/EC, Art. 3"
    assert v.message == (
        "9 h 00 min rest between L (ends 22:00 on 1 Mar) and E (starts 07:00 on 2 Mar); "
        "needs 11 h"
    )
    assert of_kind(check(rows={"a": "L D - -"}, rules=DAILY_REST), "min-rest") == []


def test_directive_2003_88_art5_24h_straight_after_work_is_short_of_35h(check) -> None:
    # Sat L ends 22:00, Sun N starts 22:00: 24 h of rest, with no 11 h daily rest before it
    r = check(rows={"a": "L L L L L L N"}, rules=WEEKLY_REST + DAILY_REST)
    assert of_kind(r, "min-rest") == []
    [v] = of_kind(r, "weekly-rest")
    assert v.message == "longest rest 24 h 00 min in 1 Mar-7 Mar; needs 35 h"
    # Fri L ends 22:00, Sun D starts 09:00: 24 h + 11 h = 35 h, kept
    assert of_kind(check(rows={"a": "L L L L L - D"}, rules=WEEKLY_REST), "weekly-rest") == []


AVERAGE = (
    '[[rule]]\nid = "avg-48"\nkind = "max-average-weekly-hours"\nhours = 48\nweeks = 17\n'
    'source = "nidirect, Calculating your working time"\n'
)
# the last 4 of the 17 weeks: 40 h a week, 8 h Monday to Friday
FOUR_WEEKS = "E E E E E - - " * 4


def test_nidirect_calculating_working_time_800h_over_17_weeks_is_within_48(check) -> None:
    # 40 h/week for 17 weeks + 12 h overtime in each of the first 10 weeks = 800 h;
    # 800 / 17 = 47.06 h/week. The first 13 weeks are history: 13 x 40 + 10 x 12 = 640 h.
    r = check(rows={"a": FOUR_WEEKS}, hours_before={"a": 640}, rules=AVERAGE)
    assert of_kind(r, "max-average-weekly-hours") == []
    # one more hour of overtime per week on 17 weeks would be 817 h > 816 h: 1 h over
    r = check(rows={"a": FOUR_WEEKS}, hours_before={"a": 657}, rules=AVERAGE)
    [v] = of_kind(r, "max-average-weekly-hours")
    assert v.units == 1
    assert v.message == (
        "817 h over 17 weeks (657 h before the period + 160 h in it) = 48.06 h/week; "
        "at most 48 h/week"
    )


MID = SHIFTS + '\n[[shift]]\ncode = "M"\nname = "Mid"\nstart = "11:00"\nend = "13:00"\n'


def test_cjeu_c306_16_twelve_days_in_a_row_keep_weekly_rest_per_monday_period(check) -> None:
    # Mon 1 Mar off (rest 00:00 Mon - 11:00 Tue = 35 h); Tue 2 - Sat 13 Mar worked
    # (12 days); rest from 13:00 Sat to the end of Sun 14 Mar = 35 h.
    row = {"a": "- M M M M M M M M M M M M -"}
    max6 = '[[rule]]\nid = "max-run"\nkind = "max-consecutive-days"\ndays = 6\nweight = 1\n'
    r = check(rows=row, shifts=MID, rules=WEEKLY_REST + max6)
    assert of_kind(r, "weekly-rest") == []
    [run] = of_kind(r, "max-consecutive-days")
    assert run.message == "12 working days in a row; at most 6"
    # a rolling 7-day window would not allow it
    rolling = WEEKLY_REST.replace('"monday"', '"rolling"')
    assert of_kind(check(rows=row, shifts=MID, rules=rolling), "weekly-rest")
