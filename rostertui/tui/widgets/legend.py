"""The grid's marks in words, for the help screen: painted with the grid's own styles.

The legend has the grid's component classes, styled by the same rules (grid.tcss),
so it always shows what the grid shows, in the current theme; it paints again when
the theme changes.
"""

from __future__ import annotations

from rich.style import Style
from rich.text import Text
from textual.widgets import Static

from rostertui.core.edit.session import Session
from rostertui.tui.look import theme_colour
from rostertui.tui.widgets.grid import RosterGrid
from rostertui.tui.widgets.palette import shift_colours

MARKS = (  # (what is shown, its styles in the grid, what it means)
    (" · ", ("off",), "off"),
    (" ~ ", ("leave", "leave-mark"), "leave (hard: no shift that day)"),
    ("*", ("req-ok",), "a request, granted (red: not granted)"),
    ("#", ("lock",), "a locked cell: a solve keeps it; edits need an unlock"),
    (" E ", ("changed",), "diff mode (ctrl+d): changed since the version compared with"),
    (" E ", ("mark",), "the cell marked for a swap (ctrl+x)"),
    (" E ", ("hard",), "a cell in a hard violation"),
    (" E ", ("soft",), "a cell in a soft violation (a penalty)"),
    ("Sa", ("header-weekend",), "weekend column"),
    ("Fr", ("header-holiday",), "holiday column"),
    ("✖ ▲", ("flag-hard",), "before a name: a whole-period violation (hours, weekends, "
                            "shift counts), hard or soft"),
    (" 2 ", ("cover-short",), "cover row: below min or above max (hard)"),
    (" 3 ", ("cover-under",), "cover row: away from the ideal (soft)"),
)


class GridLegend(Static):
    COMPONENT_CLASSES = RosterGrid.COMPONENT_CLASSES

    def __init__(self, session: Session, **kwargs) -> None:
        super().__init__(**kwargs)
        self.session = session

    def on_mount(self) -> None:
        self.update(self.legend())

    def notify_style_update(self) -> None:
        super().notify_style_update()
        if self.is_mounted:
            self.update(self.legend())

    def style_of(self, *names: str) -> Style:
        return Style.combine(self.get_component_rich_style(f"grid--{n}", partial=True)
                             for n in names)

    def legend(self) -> Text:
        ws = self.session.ws
        title = Style(color=theme_colour(self.app, "text-primary"), bold=True, underline=True)
        text = Text()
        text.append("In the grid\n", style=title)
        for code, tone in shift_colours(ws.shifts.shift).items():
            s = ws.shift_by_code[code]
            text.append(f" {code} ", style=self.style_of(tone))
            text.append(f" {s.name} {s.start}-{s.end}\n")
        for mark, names, meaning in MARKS:
            text.append(mark, style=self.style_of(*names))
            text.append(f"  {meaning}\n")
        text.append("\nRight of the days: hours, nights, weekends worked and requests granted "
                    "per person; the status lines under the grid explain the cell under the "
                    "cursor in words.", style=theme_colour(self.app, "foreground-muted"))
        return text
