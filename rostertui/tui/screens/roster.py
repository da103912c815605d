"""The roster screen: the grid, the status lines that explain the cursor, the footer."""

from __future__ import annotations

from textual import on
from textual.app import ComposeResult
from textual.screen import Screen
from textual.widgets import Footer

from rostertui.tui.state import EditRefused, Session
from rostertui.tui.widgets.grid import RosterGrid
from rostertui.tui.widgets.status import StatusLine, SummaryBar


class RosterScreen(Screen):
    CSS_PATH = "roster.tcss"

    def __init__(self) -> None:
        super().__init__()
        self.typed = ""
        self.note = ""

    @property
    def session(self) -> Session:
        return self.app.session  # type: ignore[attr-defined]

    def compose(self) -> ComposeResult:
        yield SummaryBar(id="summary")
        yield RosterGrid(self.session, id="grid")
        yield StatusLine(id="status")
        yield Footer(compact=True, show_command_palette=False)

    @property
    def grid(self) -> RosterGrid:
        return self.query_one(RosterGrid)

    def on_mount(self) -> None:
        self.watch(self.app, "revision", self._revised, init=False)
        self.grid.focus()
        self.query_one(SummaryBar).show(self.session, "roster")

    def on_resize(self) -> None:
        self.set_class(self.size.height >= 40, "-tall")  # more lines to explain the cursor
        self.call_after_refresh(self.update_status)

    def _revised(self) -> None:
        self.grid.show(self.session)
        self.query_one(SummaryBar).show(self.session, "roster")
        self.update_status()

    def update_status(self) -> None:
        grid = self.grid
        self.query_one(StatusLine).show(self.session, grid.view, grid.person, grid.cover_row,
                                        grid.day, self.typed, self.note)

    # -- from the grid ---------------------------------------------------------------------
    @on(RosterGrid.CursorMoved)
    def _moved(self) -> None:
        self.note = ""
        self.update_status()

    @on(RosterGrid.Typing)
    def _typing(self, event: RosterGrid.Typing) -> None:
        self.typed = event.text
        self.update_status()

    @on(RosterGrid.EditRequested)
    def _edit(self, event: RosterGrid.EditRequested) -> None:
        try:
            change = self.session.set_cell(event.person, event.day, event.text)
        except EditRefused as exc:
            self.note = f"not changed: {exc}"
            self.update_status()
            self.app.bell()
            return
        self.note = "" if change is not None else "unchanged: the cell already holds that"
        self.app.revised()  # type: ignore[attr-defined]
        if change is None:
            self.update_status()

    @on(RosterGrid.LockRequested)
    def _lock(self, event: RosterGrid.LockRequested) -> None:
        locked = self.session.toggle_lock(event.person, event.day)
        self.note = ("locked: a solve keeps this cell as it is" if locked
                     else "unlocked: a solve may change this cell")
        self.app.revised()  # type: ignore[attr-defined]

    def goto(self, person: str | None, day: int | None,
             cover: tuple[str, str | None] | None = None) -> None:
        """Move the cursor to a person's cell (or a cover row's) and show it."""
        grid = self.grid
        day = grid.day if day is None else day
        if person is not None:
            grid.goto(person, day)
        elif cover is not None:
            grid.goto_cover(*cover, day)
        grid.focus()
