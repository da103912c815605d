"""rostertui's own shift palette: the colour of a code says when the shift runs.

Early shifts (starting before 08:00) are warm (sunrise golds and ambers), day
shifts (before 13:00) green, evening shifts cool (teal to blue), nights violet.
Each family has several tones, handed out in shifts.toml order, so two early
shifts never share a colour. The code is
drawn in its colour on the grid's background; backgrounds are kept for state
(weekend, leave, violation, cursor), so the two never fight.
"""

from __future__ import annotations

from rostertui.core.models.common import clock_minutes
from rostertui.core.models.shifts import Shift

MORNING = ("#f4b942", "#ec8f4e", "#e6d36a", "#f29e9e")
DAYTIME = ("#8cc866", "#5fbf94", "#b5d15a")
EVENING = ("#45b5c9", "#6a94e0", "#4fd1c0")
NIGHT = ("#b08cf2", "#de7fd6", "#8f7ff0")


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
    """A colour per shift code: its family's next unused tone."""
    used: dict[tuple[str, ...], int] = {}
    colours: dict[str, str] = {}
    for s in shifts:
        tones = family(s)
        k = used.get(tones, 0)
        colours[s.code] = tones[k % len(tones)]
        used[tones] = k + 1
    return colours
