"""Text bars, shift colours and the progress relay."""

from __future__ import annotations

import threading

from rostertui.core.solver.outcome import SolveProgress
from rostertui.tui.messages import ProgressRelay, SolveProgressed
from rostertui.tui.widgets.bars import BarColours, bar, hours_bar, range_bar


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


def test_shift_colours_follow_the_time_of_day() -> None:
    from rostertui.core.models.shifts import Shift
    from rostertui.tui.widgets.palette import DAYTIME, EVENING, MORNING, NIGHT, shift_colours

    shifts = [Shift(code=c, name=c, start=a, end=b) for c, a, b in (
        ("A", "05:00", "13:00"), ("B", "07:00", "17:00"), ("R", "09:00", "17:00"),
        ("C", "13:00", "21:00"), ("X", "21:00", "05:00"))]
    colours = shift_colours(shifts)
    assert colours == {"A": MORNING[0], "B": MORNING[1], "R": DAYTIME[0], "C": EVENING[0],
                       "X": NIGHT[0]}
