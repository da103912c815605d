"""The violations panel: every violation of the current roster, filtered and explained.

Hard ones first, then by date. Enter shows the violation's cell in the grid.
"""

from __future__ import annotations

from rich.text import Text
from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal
from textual.widgets import DataTable, Footer, Label, Select, Static

from rostertui.core.check import Violation
from rostertui.core.edit.session import Session
from rostertui.core.words import day as day_text
from rostertui.tui.host import host
from rostertui.tui.look import MUTED, theme_colour
from rostertui.tui.messages import GotoCell
from rostertui.tui.screens.panel import PanelScreen
from rostertui.tui.widgets.status import HARD_MARK, SOFT_MARK, SummaryBar, violation_line

ALL = "*"
KINDS = [("hard + soft", ALL), ("hard only", "hard"), ("soft only", "soft")]


def dates_text(v: Violation) -> str:
    if not v.dates:
        return "period"
    first, last = min(v.dates), max(v.dates)
    return day_text(first) if first == last else f"{day_text(first)}-{day_text(last)}"


def matches(v: Violation, kind: str, person: str, rule: str) -> bool:
    if kind == "hard" and not v.hard or kind == "soft" and v.hard:
        return False
    if person != ALL and v.person != person:
        return False
    return rule == ALL or v.rule == rule


class ViolationsScreen(PanelScreen):
    CSS_PATH = "violations.tcss"

    BINDINGS = [
        Binding("enter", "show_in_grid", "Show in grid"),
        Binding("h", "kind('hard')", "Hard"),
        Binding("s", "kind('soft')", "Soft"),
        Binding("a", "clear", "All"),
        Binding("p", "same_person", "This person"),
        Binding("r", "same_rule", "This rule"),
    ]

    def __init__(self) -> None:
        super().__init__()
        self.shown: list[Violation] = []

    @property
    def session(self) -> Session:
        return host(self.app).session

    def compose(self) -> ComposeResult:
        yield SummaryBar(id="summary")
        with Horizontal(id="filters"):
            yield Select(KINDS, value=ALL, allow_blank=False, id="kind")
            yield Select([("everyone", ALL)], value=ALL, allow_blank=False, id="person")
            yield Select([("all rules", ALL)], value=ALL, allow_blank=False, id="rule")
            yield Label("", id="count")
        yield DataTable(id="table", cursor_type="row", zebra_stripes=True)
        yield Static("", id="detail")
        yield Footer(compact=True, show_command_palette=False)

    def on_mount(self) -> None:
        table = self.query_one(DataTable)
        table.add_column("", key="mark", width=1)
        table.add_column("dates", key="dates", width=13)
        table.add_column("who", key="who", width=16)
        table.add_column("what", key="what")
        table.add_column("penalty", key="penalty", width=7)
        table.add_column("rule", key="rule")
        table.add_column("source", key="source")
        self.follow_revisions()
        self.watch(self.app, "theme", self._revised, init=False)  # the marks' colours
        self.reload()
        table.focus()

    # -- filling --------------------------------------------------------------------------
    def _filters(self) -> tuple[str, str, str]:
        return tuple(str(self.query_one(f"#{n}", Select).value)  # type: ignore[return-value]
                     for n in ("kind", "person", "rule"))

    def reload(self) -> None:
        session = self.session
        self.query_one(SummaryBar).show(session, "violations")
        rules = sorted({v.rule for v in session.check.violations})
        people = [(f"{p.name} ({p.id})", p.id) for p in session.ws.staff.person]
        with self.prevent(Select.Changed):
            for name, options in (("rule", [(r, r) for r in rules]), ("person", people)):
                select = self.query_one(f"#{name}", Select)
                current = select.value
                first = ("all rules" if name == "rule" else "everyone", ALL)
                select.set_options([first, *options])
                select.value = current if current in [v for _, v in options] else ALL
        self.fill()

    def fill(self) -> None:
        session = self.session
        kind, person, rule = self._filters()
        order = {pid: i for i, pid in enumerate(session.ws.person_ids)}
        found = [v for v in session.check.violations if matches(v, kind, person, rule)]
        found.sort(key=lambda v: (not v.hard, min(v.dates) if v.dates else session.ws.unit.end,
                                  order.get(v.person or "", -1)))
        self.shown = found
        table = self.query_one(DataTable)
        table.clear()
        names = session.ws.person_by_id
        hard_mark = Text(HARD_MARK, style=f"bold {theme_colour(self.app, 'text-error')}")
        soft_mark = Text(SOFT_MARK, style=theme_colour(self.app, "text-warning"))
        for i, v in enumerate(found):
            who = names[v.person].name if v.person in names else (
                f"cover {v.shift}" + (f"·{v.skill}" if v.skill else "") if v.kind == "cover"
                else "everyone")
            table.add_row(
                hard_mark if v.hard else soft_mark, dates_text(v), who, v.message,
                "hard" if v.hard else str(v.penalty), v.rule, v.source or "", key=str(i),
            )
        total = len(session.check.violations)
        hard = sum(1 for v in found if v.hard)
        self.query_one("#count", Label).update(
            f"{len(found)} of {total} shown\n{hard} hard, {len(found) - hard} soft")
        self._detail(0 if found else None)

    def _detail(self, index: int | None) -> None:
        detail = self.query_one("#detail", Static)
        if index is None or index >= len(self.shown):
            detail.update("No violation matches the filters." if self.session.check.violations
                          else "No violation at all: every rule, cover and request is met.")
            return
        v = self.shown[index]
        who = self.session.ws.person_by_id[v.person].name if v.person else ""
        head = violation_line(v, f"{who}: " if who else "")
        head = head.append_text(f"\n{dates_text(v)}, {v.units} unit{'s' if v.units != 1 else ''}"
                                f", kind {v.kind}", MUTED)
        detail.update(head)

    # -- events and actions -------------------------------------------------------------------
    @on(Select.Changed)
    def _filter_changed(self) -> None:
        self.fill()

    @on(DataTable.RowHighlighted)
    def _highlighted(self, event: DataTable.RowHighlighted) -> None:
        self._detail(event.cursor_row)

    @on(DataTable.RowSelected)
    def _selected(self, event: DataTable.RowSelected) -> None:
        self.action_show_in_grid()

    def _current(self) -> Violation | None:
        row = self.query_one(DataTable).cursor_row
        return self.shown[row] if 0 <= row < len(self.shown) else None

    def action_show_in_grid(self) -> None:
        v = self._current()
        if v is None:
            return
        unit = self.session.ws.unit
        days = [(d - unit.start).days for d in v.dates if unit.in_period(d)]
        cover = (v.shift, v.skill) if v.kind == "cover" and v.shift else None
        self.post_message(GotoCell(v.person, min(days) if days else None, cover))

    def action_kind(self, kind: str) -> None:
        select = self.query_one("#kind", Select)
        select.value = ALL if select.value == kind else kind

    def action_clear(self) -> None:
        for name in ("kind", "person", "rule"):
            self.query_one(f"#{name}", Select).value = ALL

    def action_same_person(self) -> None:
        v = self._current()
        select = self.query_one("#person", Select)
        if select.value != ALL:
            select.value = ALL
        elif v is not None and v.person is not None:
            select.value = v.person

    def action_same_rule(self) -> None:
        v = self._current()
        select = self.query_one("#rule", Select)
        if select.value != ALL:
            select.value = ALL
        elif v is not None:
            select.value = v.rule
