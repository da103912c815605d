"""What the grid shows (pure): cover rows, violations by cell, words; text bars; the relay."""

from __future__ import annotations

import threading
from datetime import date

from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.run import SolveProgress
from rostertui.tui.messages import ProgressRelay, SolveProgressed
from rostertui.tui.state import Session
from rostertui.tui.view import GridView, cell_text, cover_text
from rostertui.tui.widgets.bars import BarColours, bar, hours_bar, range_bar


def test_cover_rows_join_entries_of_the_same_shift_and_skill(clinic_ws: Workspace) -> None:
    view = GridView.build(Session(clinic_ws))
    assert [c.label for c in view.cover] == ["E", "E·rn", "E·triage", "L", "L·rn", "N", "N·rn"]
    early = view.cover[0]
    monday, saturday = early.needs[0], early.needs[5]  # 15 Mar is a Monday
    assert (monday.min, monday.ideal, saturday.min, saturday.ideal) == (3, 4, 2, 3)
    assert view.cover[2].needs[5] is None  # triage is asked on weekdays only


def test_violations_land_on_cells_people_and_cover(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    s.set_cell("c13", 0, "E")  # on leave
    view = GridView.build(s)
    assert view.severity("c13", 0) == "hard" and view.severity("c13", 1) is None
    assert [v.rule for v in view.cell_violations["c13", 0]] == ["leave"]
    # nobody works: every person is below the hard hours band, for the whole period
    assert view.person_severity("c01") == "hard"
    assert "ft-hours-band" in {v.rule for v in view.person_violations["c01"]}
    e_row = 0
    assert view.cover[e_row].assigned[0] == 1
    assert view.cover_severity(e_row, 0) == "hard"  # 1 on E, at least 3
    assert "1 assigned; min 3, ideal 4" in cover_text(view, e_row, 0)


def test_a_stretch_violation_covers_every_day_of_the_stretch(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    for day in range(7, 14):  # seven early shifts in a row, 22-28 Mar; at most 6
        s.set_cell("c01", day, "E")
    view = GridView.build(s)
    stretch = [v for v in s.check.violations if v.rule == "max-days-in-row"]
    assert stretch and stretch[0].dates == (date(2027, 3, 22), date(2027, 3, 28))
    assert all(stretch[0] in view.cell_violations["c01", d] for d in range(7, 14))
    assert "max-days-in-row" not in {v.rule for v in view.cell_violations.get(("c01", 6), [])}


def test_the_cell_in_words(clinic_ws: Workspace) -> None:
    s = Session(clinic_ws)
    s.set_cell("c01", 5, "L")
    s.toggle_lock("c01", 5)
    text = cell_text(s, GridView.build(s), "c01", 5)
    assert text == ("Sat 20 Mar · Marta Quintela (rn, triage) · L Late 14:00-21:30 7 h · locked"
                    " · asks the day off (weight 5, daughter's birthday): NOT granted")


def test_bars_fill_to_scale_with_eighths() -> None:
    assert bar(5, 10, 10).plain == "█████     "
    assert bar(10, 10, 4).plain == "████"
    assert bar(1, 4, 2).plain == "▌ "
    assert bar(1, 16, 2).plain == "▏ "
    assert bar(0, 0, 3).plain == "   "


def test_hours_bar_marks_the_band_the_target_and_outside() -> None:
    colours = BarColours(ok="#00ff00", high="#ff0000")  # the panel passes the theme's
    inside = hours_bar(150, 120, 165, 160, 200, 20, colours)
    assert inside.plain.startswith("███████████████") and inside.plain[16] == "│"
    assert "#00ff00" in str(inside.spans[0].style)  # green inside the band
    below = hours_bar(60, 120, 165, None, 200, 20, colours)
    assert "#ff0000" in str(below.spans[0].style)  # red outside it


def test_range_bar_shows_min_mean_max() -> None:
    assert range_bar(2, 5, 8, 10, 11).plain == "  ├──●──┤  "


def test_the_relay_keeps_one_message_in_flight_whatever_the_flood() -> None:
    posted: list[SolveProgressed] = []
    relay = ProgressRelay(posted.append)

    def flood(k: int) -> None:
        for i in range(2000):
            relay(SolveProgress(elapsed=i / 1000, penalty=10_000 - i, bound=k))

    threads = [threading.Thread(target=flood, args=(k,)) for k in range(4)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    assert relay.received == 8000 and len(posted) == 1  # nobody took the first one yet
    latest = relay.take()
    assert latest is not None and latest.penalty == 10_000 - 1999
    relay(SolveProgress(9.0, 5, 0))
    assert len(posted) == 2 and posted[-1].progress.penalty == 5
    assert posted[0].can_replace(posted[1])


def test_form_text_becomes_typed_values_and_bad_text_is_left_for_the_loader() -> None:
    from rostertui.core.models.requests import Leave
    from rostertui.core.models.shifts import Cover
    from rostertui.tui.forms import build_item, field_text

    leave = build_item(Leave, {"person": "c01", "from_": "2027-03-20", "to": "",
                               "credit_hours": "7.5"})
    assert (leave.from_, leave.to, leave.credit_hours) == (date(2027, 3, 20), None, 7.5)
    assert field_text(leave, "from_") == "2027-03-20" and field_text(leave, "to") == ""
    cover = build_item(Cover, {"shift": "E", "days": "mon, tue sat", "min": "two"})
    assert cover.days == ["mon", "tue", "sat"] and cover.min == "two"


def test_shift_colours_follow_the_time_of_day() -> None:
    from rostertui.core.models.shifts import Shift
    from rostertui.tui.widgets.palette import DAYTIME, EVENING, MORNING, NIGHT, shift_colours

    shifts = [Shift(code=c, name=c, start=a, end=b) for c, a, b in (
        ("A", "05:00", "13:00"), ("B", "07:00", "17:00"), ("R", "09:00", "17:00"),
        ("C", "13:00", "21:00"), ("X", "21:00", "05:00"))]
    colours = shift_colours(shifts)
    assert colours == {"A": MORNING[0], "B": MORNING[1], "R": DAYTIME[0], "C": EVENING[0],
                       "X": NIGHT[0]}
