"""rostertui's own shift palette: the colour of a code says when the shift runs.

Early shifts (starting before 08:00) are warm (sunrise golds and ambers), day
shifts (before 13:00) green, evening shifts cool (teal to blue), nights violet.
Each family has several tones, handed out in shifts.toml order, so two early
shifts never share a colour. The code is
drawn in its colour on the grid's background; backgrounds are kept for state
(weekend, leave, violation, cursor), so the two never fight.

A tone is a name (`early-1`): the grid's component class `grid--early-1`, whose
colour the stylesheet (grid.tcss) takes from the theme.
"""

from __future__ import annotations

from rostertui.core.models.common import clock_minutes
from rostertui.core.models.shifts import Shift

MORNING = ("early-1", "early-2", "early-3", "early-4")
DAYTIME = ("day-1", "day-2", "day-3")
EVENING = ("evening-1", "evening-2", "evening-3")
NIGHT = ("night-1", "night-2", "night-3")
TONES = (*MORNING, *DAYTIME, *EVENING, *NIGHT)


def family(shift: Shift) -> tuple[str, ...]:
    if shift.is_night:
        return NIGHT
    start = clock_minutes(shift.start)
    if start < 8 * 60:
        return MORNING
    if start < 13 * 60:
        return DAYTIME
    return EVENING


def shift_colours(shifts: list[Shift]) -> dict[str, str]:
    """A tone per shift code: its family's next unused one."""
    used: dict[tuple[str, ...], int] = {}
    colours: dict[str, str] = {}
    for s in shifts:
        tones = family(s)
        k = used.get(tones, 0)
        colours[s.code] = tones[k % len(tones)]
        used[tones] = k + 1
    return colours
