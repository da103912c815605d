"""The fairness panel: per person and per group, with text bar charts.

Hours are drawn against the contract (the band of the person's hours rule shaded,
its target or midpoint as `│`), nights and weekends against the most anyone has.
Groups show mean and spread (min to max) of nights, weekends and hours deviation.
"""

from __future__ import annotations

from fractions import Fraction

from rich.text import Text
from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.content import Content
from textual.widgets import DataTable, Footer, Static

from rostertui.core.edit.session import Session
from rostertui.core.stats import PersonStats
from rostertui.core.words import number
from rostertui.tui.host import host
from rostertui.tui.look import BAD, GOOD, MUTED, theme_colour
from rostertui.tui.messages import GotoCell
from rostertui.tui.screens.panel import PanelScreen
from rostertui.tui.widgets.bars import BarColours, bar, hours_bar, range_bar
from rostertui.tui.widgets.status import SummaryBar


def _signed(value: Fraction | int | None) -> str:
    if value is None:
        return "-"
    return ("+" if value > 0 else "") + number(value)


class FairnessScreen(PanelScreen):
    CSS_PATH = "fairness.tcss"

    BINDINGS = [
        Binding("enter", "show_in_grid", "Show in grid"),
    ]

    def __init__(self) -> None:
        super().__init__()
        self._width = 0

    @property
    def session(self) -> Session:
        return host(self.app).session

    def bar_colours(self) -> BarColours:
        """The theme's colours for the bars (DataTable cells are Rich text: resolved here)."""
        app = self.app
        return BarColours(ok=theme_colour(app, "success"), high=theme_colour(app, "error"),
                          plain=theme_colour(app, "secondary-lighten-2"),
                          band=theme_colour(app, "success-muted"),
                          track=theme_colour(app, "panel"),
                          mark=theme_colour(app, "foreground"))

    def compose(self) -> ComposeResult:
        yield SummaryBar(id="summary")
        yield Static("", id="legend")
        yield DataTable(id="people", cursor_type="row", zebra_stripes=True)
        yield DataTable(id="groups", cursor_type="row", zebra_stripes=True)
        yield Footer(compact=True, show_command_palette=False)

    def on_mount(self) -> None:
        self.follow_revisions()
        self.watch(self.app, "theme", self._revised, init=False)  # the bars' colours
        self.reload()
        self.query_one("#people", DataTable).focus()

    def on_resize(self) -> None:
        if self.size.width != self._width:
            self.reload()

    def bar_widths(self) -> tuple[int, int]:
        """Bars share what the fixed columns (and the table's cell padding) leave: the
        hours bar gets half, nights and weekends a quarter each; the group bars half each."""
        room = self.size.width - 60
        return max(8, min(48, room // 2)), max(4, min(30, room // 4))

    def group_bar_width(self) -> int:
        return max(6, min(40, (self.size.width - 62) // 2))

    def reload(self) -> None:
        self._width = self.size.width
        session = self.session
        self.query_one(SummaryBar).show(session, "fairness")
        wide, narrow = self.bar_widths()
        self.query_one("#legend", Static).update(Content.assemble(
            ("█", GOOD), " hours in the contract band ", ("▒", "$success-muted"), " (",
            ("█", BAD), " outside), ", ("│", "bold"), " target or mid-band · N nights · "
            "wkd weekends · req requests granted · run longest stretch · ± hours vs target"
        ).stylize_before(MUTED))
        colours = self.bar_colours()
        self._people(wide, narrow, colours)
        self._groups(self.group_bar_width(), colours)

    def _people(self, wh: int, w: int, colours: BarColours) -> None:
        stats = self.session.stats
        people = stats.people
        table = self.query_one("#people", DataTable)
        row = table.cursor_row
        table.clear(columns=True)
        for label, width in (("person", 16), ("hours", 6), ("vs contract", wh),
                             ("N", 3), ("", w), ("wkd", 3), ("", w),
                             ("req", 5), ("run", 3)):
            table.add_column(label, width=width)
        scale_h = max([float(p.hours) for p in people]
                      + [float(p.hours_max or 0) for p in people] + [1.0])
        scale_n = max([p.nights for p in people] + [1])
        scale_w = max([stats.weekends_in_period] + [p.weekends for p in people] + [1])
        for p in people:
            table.add_row(
                p.name, self._hours(p, colours), hours_bar(
                    p.hours, p.hours_min, p.hours_max, p.hours_reference, scale_h, wh, colours),
                str(p.nights), bar(p.nights, scale_n, w, colours=colours),
                str(p.weekends), bar(p.weekends, scale_w, w, theme_colour(self.app, "accent"),
                                     colours),
                f"{p.requests_granted}/{p.requests_asked}" if p.requests_asked else "-",
                str(p.longest_stretch), key=p.person,
            )
        if 0 <= row < len(people):
            table.move_cursor(row=row)

    @staticmethod
    def _hours(p: PersonStats, colours: BarColours) -> Text:
        outside = (p.hours_min is not None and p.hours < p.hours_min) or (
            p.hours_max is not None and p.hours > p.hours_max)
        return Text(number(p.hours), style=f"bold {colours.high}" if outside else "")

    def _groups(self, w: int, colours: BarColours) -> None:
        stats = self.session.stats
        table = self.query_one("#groups", DataTable)
        table.clear(columns=True)
        for label, width in (("group", 12), ("n", 3), ("N mean", 6), ("min ● max", w),
                             ("wkd", 5), ("min ● max", w), ("± hours", 8), ("spread", 6)):
            table.add_column(label, width=width)
        scale_n = max([p.nights for p in stats.people] + [1])
        scale_w = max([stats.weekends_in_period] + [1])
        for g in stats.groups:
            table.add_row(
                g.group, str(g.people),
                number(g.nights.mean) if g.nights.mean is not None else "-",
                range_bar(g.nights.low, g.nights.mean, g.nights.high, scale_n, w, colours),
                number(g.weekends.mean) if g.weekends.mean is not None else "-",
                range_bar(g.weekends.low, g.weekends.mean, g.weekends.high, scale_w, w,
                          colours),
                _signed(g.hours_deviation.mean),
                number(g.hours_deviation.spread) if g.hours_deviation.spread is not None
                else "-",
                key=g.group if not g.everyone else "*everyone",
            )

    @on(DataTable.RowSelected, "#people")
    def _chosen(self) -> None:
        self.action_show_in_grid()

    def action_show_in_grid(self) -> None:
        table = self.query_one("#people", DataTable)
        people = self.session.stats.people
        if 0 <= table.cursor_row < len(people):
            self.post_message(GotoCell(people[table.cursor_row].person, None))
